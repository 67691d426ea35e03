"""Job settings of the submittal: paper, print mode, revision log (validated with locations)."""

from __future__ import annotations

from pathlib import Path

import pytest

from calcpad.runner.job import JobError, check_print_mark, load_job, parse_job, print_mode
from tests.runner.conftest import EXAMPLE, JOB_HEAD, tiny_calc

REVS = '\n[[job.revisions]]\nrev = "0"\ndate = 2025-01-01\ndescription = "Issued for review"\nby = "E. N."\n'


def problems(text: str) -> list[tuple[str, str]]:
    with pytest.raises(JobError) as info:
        parse_job(text, "job.toml")
    return info.value.problems


def test_example_job_settings() -> None:
    info = load_job(EXAMPLE).info
    assert (info.paper, info.print) == ("letter", "full")
    assert info.revisions[-1]["rev"] == info.revision == "A"
    assert info.as_dict()["revisions"] == info.revisions  # plain data for record.json


def test_defaults_without_settings(tiny_env: Path) -> None:
    info = parse_job(JOB_HEAD + tiny_calc()).info
    assert (info.paper, info.print, info.revisions) == ("letter", "full", [])


def test_paper_and_print_accepted(tiny_env: Path) -> None:
    head = JOB_HEAD.replace('units = "US"', 'units = "US"\npaper = "a4"\nprint = "calc:M1"')
    info = parse_job(head + REVS + tiny_calc()).info
    assert (info.paper, info.print) == ("a4", "calc:M1")
    assert info.revisions == [{"rev": "0", "date": "2025-01-01", "description": "Issued for review", "by": "E. N."}]


@pytest.mark.parametrize(
    ("setting", "where", "words"),
    [
        ('paper = "A3"', "job.paper", "'A3'; expected 'letter' or 'a4'"),
        ('print = "everything"', "job.print", "'everything'; expected 'full', 'summary' or 'calc:MARK'"),
        ('print = "calc:Z9"', "job.print", "no member 'Z9' in the job"),
    ],
)
def test_bad_setting_named(tiny_env: Path, setting: str, where: str, words: str) -> None:
    head = JOB_HEAD.replace('units = "US"', f'units = "US"\n{setting}')
    found = problems(head + tiny_calc())
    assert [loc for loc, _ in found] == [where]
    assert words in found[0][1]


def test_revision_log_problems(tiny_env: Path) -> None:
    bad = (
        '\n[[job.revisions]]\nrev = "P1"\ndate = 2024-12-01\nwho = "x"\n'  # no description, unknown key
        '\n[[job.revisions]]\nrev = "P1"\ndate = 2024-12-20\ndescription = "again"\n'
    )
    found = problems(JOB_HEAD + bad + tiny_calc())
    assert ("job.revisions[1]", "missing 'description' (text)") in found
    assert any(loc == "job.revisions[1].who" and "unknown key" in msg for loc, msg in found)
    assert ("job.revisions", "revision 'P1' is listed more than once") in found
    assert any(loc == "job.revisions" and "current revision '0'" in msg for loc, msg in found)


def test_current_revision_must_be_logged(tiny_env: Path) -> None:
    found = dict(problems(JOB_HEAD + REVS.replace('rev = "0"', 'rev = "B"') + tiny_calc()))
    assert "current revision '0'" in found["job.revisions"]


def test_print_mode_parse_and_cli_mark(tiny_env: Path) -> None:
    assert print_mode("summary") == ("summary", "")
    assert print_mode("calc: L1") == ("calc", "L1")
    assert print_mode("calc:") is None and print_mode("sheets") is None
    job = parse_job(JOB_HEAD + tiny_calc("M1") + tiny_calc("M2"))
    check_print_mark(job, "calc:M2", "--print")
    with pytest.raises(JobError) as info:
        check_print_mark(job, "calc:M3", "--print")
    assert info.value.problems[0][0] == "--print" and "marks: M1, M2" in info.value.problems[0][1]
