"""Typical members, the summary and the print modes, read from the submittal HTML (no browser)."""

from __future__ import annotations

import copy
import csv
import re
import tomllib
from pathlib import Path
from typing import Any

import pytest

from calcpad.report.grouping import group_calcs
from calcpad.report.layout import submittal_html
from calcpad.runner.execute import run_job
from calcpad.runner.job import load_job, parse_job
from calcpad.runner.record import job_record
from tests.runner.conftest import EXAMPLE, JOB_HEAD, tiny_calc

_ROW = re.compile(r'<tr(?: class="ng")?><td class="num">(\d+)</td><td>([^<]+)</td>')


@pytest.fixture(scope="module")
def example() -> tuple[Any, list[Any], dict[str, Any]]:
    job = load_job(EXAMPLE)
    outcomes = run_job(job)
    return job, outcomes, job_record(job, outcomes, "inprocess", 0.0)


def _job_tables() -> list[list[str]]:
    """Member marks of each [[calcs]] table of the example job file (one table = one set of inputs)."""
    raw = tomllib.loads(EXAMPLE.read_text())
    return [c.get("members") or ([c["member"]] if "member" in c else _table_marks(c["table"])) for c in raw["calcs"]]


def _table_marks(name: str) -> list[str]:
    """Marks of a member table beside the example job (read with the csv module)."""
    with open(EXAMPLE.parent / name, newline="", encoding="utf-8") as fh:
        return [row["mark"] for row in csv.DictReader(fh)]


def test_example_groups_are_the_job_tables(example: tuple[Any, list[Any], dict[str, Any]]) -> None:
    _job, outcomes, _record = example
    groups = group_calcs(outcomes)
    assert [g.marks for g in groups] == _job_tables()
    assert ["L3", "L4"] == groups[1].marks[1:] and ["SP2", "SP3"] == groups[3].marks[1:]


def test_typical_printed_once_and_every_mark_summarised(example: tuple[Any, list[Any], dict[str, Any]]) -> None:
    job, outcomes, record = example
    page = submittal_html(job, outcomes, record)
    assert page.count('<section class="calc"') == len(_job_tables())
    for marks in _job_tables():
        if len(marks) > 1:
            assert f"typical for {', '.join(marks)}</h2>" in page
    summary = page[page.index('id="summary"') : page.index('id="checks"')]
    assert [m for _, m in _ROW.findall(summary)] == [c.member for c in job.calcs]
    assert "<script" not in page


def test_summary_mode_prints_the_governing_sheet(example: tuple[Any, list[Any], dict[str, Any]]) -> None:
    job, outcomes, record = example
    page = submittal_html(job, outcomes, record, "summary")
    sections = page.split('<section class="calc"')[1:]
    for section, g in zip(sections, group_calcs(outcomes), strict=True):
        assert section.count('<section class="sheet">') == 1
        worst = max(record["calcs"][g.numbers[0] - 1]["checks"], key=lambda c: c["ratio"])
        assert f"<h3>{worst['sheet']}</h3>" in section, g.marks
    assert "summary (governing sheet of each calc)" in page


def test_calc_mode_prints_one_calc(example: tuple[Any, list[Any], dict[str, Any]]) -> None:
    job, outcomes, record = example
    page = submittal_html(job, outcomes, record, "calc:SP2")
    assert page.count('<section class="calc"') == 1
    assert "typical for SP1, SP2, SP3</h2>" in page
    summary = page[page.index('id="summary"') : page.index('id="checks"')]
    assert [m for _, m in _ROW.findall(summary)] == ["SP1", "SP2", "SP3"]


def test_different_inputs_or_failures_never_grouped(tiny_env: Path) -> None:
    text = JOB_HEAD + tiny_calc("M1") + tiny_calc("M2") + tiny_calc("M3", P='"200 lbf"')
    text += tiny_calc("F1", mode='"fail"') + tiny_calc("F2", mode='"fail"')
    job = parse_job(text)
    outcomes = run_job(job)
    record = job_record(job, outcomes, "inprocess", 0.0)
    assert [g.marks for g in group_calcs(outcomes)] == [["M1", "M2"], ["M3"], ["F1"], ["F2"]]
    page = submittal_html(job, outcomes, record)
    assert "typical for M1, M2</h2>" in page and page.count('class="mark-error">FAILED') >= 2


def test_same_inputs_different_numbers_not_grouped(tiny_env: Path) -> None:
    job = parse_job(JOB_HEAD + tiny_calc("M1") + tiny_calc("M2"))
    outcomes = run_job(job)
    changed = copy.deepcopy(outcomes[1].sheets)
    changed[-1]["record"]["checks"][0]["ratio"] += 0.01  # a template that used the mark for more than a label
    outcomes[1].sheets = changed
    assert [g.marks for g in group_calcs(outcomes)] == [["M1"], ["M2"]]


def test_title_band_text_is_escaped(tiny_env: Path) -> None:
    head = JOB_HEAD.replace('title = "Test job"', 'title = "Stand \\"A\\" </style><script>x</script>"')
    job = parse_job(head + tiny_calc())
    outcomes = run_job(job)
    page = submittal_html(job, outcomes, job_record(job, outcomes, "inprocess", 0.0))
    assert "<script" not in page and page.count("</style>") == 1
