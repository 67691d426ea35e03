"""Job files: schema validation, every problem with its location, nothing executed."""

from __future__ import annotations

from pathlib import Path

import pytest

from calcpad.runner.job import JobError, load_job, parse_job

from .conftest import EXAMPLE, JOB_HEAD, tiny_calc


def problems(text: str) -> list[tuple[str, str]]:
    with pytest.raises(JobError) as info:
        parse_job(text, "job.toml")
    return info.value.problems


def test_example_job_is_valid() -> None:
    job = load_job(EXAMPLE)
    assert job.info.number == "HRM-2417" and job.info.date == "2025-03-14"
    assert len(job.calcs) >= 8
    assert [c.number for c in job.calcs] == list(range(1, len(job.calcs) + 1))
    marks = [(c.template.name, c.member) for c in job.calcs]
    assert len(set(marks)) == len(marks)


def test_members_expand(tiny_env: Path) -> None:
    job = parse_job(JOB_HEAD + tiny_calc('["A1", "A2"]', key="members"))
    assert [c.member for c in job.calcs] == ["A1", "A2"]
    assert job.calcs[0].inputs == {"P": "100 lbf", "L": "10 in", "mode": "ok"}


def test_malformed_toml_reports_line_and_column() -> None:
    (loc, msg), = problems('[job]\nnumber = "1"\ntitle = \n')
    assert loc == "line 3, column 9"  # tomllib's own position
    assert "not valid TOML" in msg


def test_unknown_template_with_suggestion(tiny_env: Path) -> None:
    text = JOB_HEAD + tiny_calc().replace('template = "tiny"', 'template = "tinny"')
    (loc, msg), = problems(text)
    assert loc == "calcs[1].template" and "did you mean 'tiny'" in msg


def test_unknown_and_missing_parameters(tiny_env: Path) -> None:
    text = JOB_HEAD + '\n[[calcs]]\ntemplate = "tiny"\nmember = "M1"\n[calcs.inputs]\nP = "100 lbf"\nLL = "10 in"\n'
    got = dict(problems(text))
    assert "did you mean 'L'" in got["calcs[1].inputs.LL"]
    assert "missing parameters 'L', 'mode'" in got["calcs[1].inputs"]


def test_wrong_dimension_and_range(tiny_env: Path) -> None:
    got = dict(problems(JOB_HEAD + tiny_calc(L='"84 lbf"') + tiny_calc("M2", P='"2 kip"')))
    assert "expected a length" in got["calcs[1].inputs.L"]
    assert "outside the stated range '0 < P <= 1 kip'" in got["calcs[2].inputs.P"]


def test_value_table_form(tiny_env: Path) -> None:
    job = parse_job(JOB_HEAD + tiny_calc(L="{ value = 12, unit = \"in\" }"))
    assert job.calcs[0].inputs["L"] == "12 in"


def test_duplicate_member_marks(tiny_env: Path) -> None:
    got = dict(problems(JOB_HEAD + tiny_calc("A1") + tiny_calc('["A2", "A1"]', key="members")))
    assert "duplicate member mark 'A1'" in got["calcs[2].members[2]"]


def test_all_problems_at_once(tiny_env: Path) -> None:
    text = JOB_HEAD.replace('engineer = "Engineer"\n', "colour = 3\n") + tiny_calc(L='"84 lbf"') + tiny_calc("M2", P='"x y z"')
    locs = [loc for loc, _ in problems(text)]
    assert locs == ["job.colour", "job", "calcs[1].inputs.L", "calcs[2].inputs.P"]


def test_job_values_are_never_executed(tiny_env: Path, tmp_path: Path) -> None:
    marker = tmp_path / "ran"
    payload = f'__import__("os").system("touch {marker}")'
    got = dict(problems(JOB_HEAD + tiny_calc(P=f"'{payload}'", mode=f"'{payload}'")))
    assert "calcs[1].inputs.P" in got and "calcs[1].inputs.mode" in got
    assert not marker.exists()


def test_a_calc_note_is_kept_and_printed_by_templates_that_declare_it(tiny_env: Path) -> None:
    calc = tiny_calc().replace('member = "M1"\n', 'member = "M1"\nnote = "Replacement leg, owner\'s records"\n')
    job = parse_job(JOB_HEAD + calc)
    assert job.calcs[0].note == "Replacement leg, owner's records"
    assert problems(JOB_HEAD + tiny_calc().replace('member = "M1"\n', 'member = "M1"\nnote = 3\n')) == [("calcs[1].note", "3; expected a text")]


def test_example_job_notes_reach_the_sheets() -> None:
    from calcpad.runner.execute import run_calc_inprocess

    job = load_job(EXAMPLE)
    leg = next(c for c in job.calcs if c.member == "L2")
    assert "HSS3x3x3/16" in leg.note
    outcome = run_calc_inprocess(leg)
    assert outcome.error is None
    fragment = "HSS3x3x3/16 fitted after an earlier impact"
    assert sum(fragment in sheet["html"] for sheet in outcome.sheets) == 2  # both sheets (existing and reinforced)
