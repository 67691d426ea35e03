"""A large member table: the run prints HTML only for the sheets a submittal can print, yet writes
the same record as a run that prints every sheet (the unoptimised path); the submittal prints one
calc per governing case, worked for the member with the highest ratio, and every member in a
compact table. The oracle is the plain run (every sheet printed, nothing spooled)."""

from __future__ import annotations

import re
from pathlib import Path
from typing import Any

import pytest

from calcpad.report.compact import COLUMN_ROWS, COMPACT_CSS
from calcpad.report.layout import submittal_html
from calcpad.runner.cases import PRINT_EACH
from calcpad.runner.execute import run_job
from calcpad.runner.job import load_job
from calcpad.runner.record import job_record, record_text
from calcpad.runner.spool import RunSpool

SIZES = ["Pipe 1 Std", "Pipe 1-1/2 Std", "Pipe 2 Std"]


def _job(folder: Path, n: int) -> Any:
    rows = ["mark,P [lbf],N [lbf],L [in],leg"]
    rows += [f"M{i + 1},{30 + (i * 13) % 900},{(i * 11) % 400},{12 + (i * 7) % 150},{SIZES[i % 3]}" for i in range(n)]
    (folder / "members.csv").write_text("\n".join(rows) + "\n", encoding="utf-8")
    (folder / "job.toml").write_text(
        '[job]\nnumber = "T-15"\ntitle = "Generated member table"\nclient = "c"\nsite = "s"\nengineer = "e"\n'
        'revision = "0"\ndate = 2026-01-01\n\n[[calcs]]\ntemplate = "leg_bending"\ntable = "members.csv"\ntitle = "Posts"\n'
        '[calcs.inputs]\nD_o = "2.875 in"\nt = "0.203 in"\nF_y = "35 ksi"\nFS_req = 1.67\n', encoding="utf-8")
    return load_job(folder / "job.toml")


def _governing(o: Any) -> tuple[int, dict[str, Any]]:
    """(sheet index, check) with the highest ratio, from the sheet records of the plain run."""
    places = [(k, c) for k, s in enumerate(o.sheets) for c in s["record"]["checks"]]
    return max(places, key=lambda p: p[1]["ratio"])  # max keeps the first of equals


def _expected_cases(plain: list[Any]) -> dict[tuple[Any, ...], list[Any]]:
    cases: dict[tuple[Any, ...], list[Any]] = {}
    for o in plain:
        k, check = _governing(o)
        cases.setdefault((o.calc.inputs["leg"], k, check["title"], o.status), []).append(o)
    return cases


@pytest.fixture(scope="module")
def large(tmp_path_factory: pytest.TempPathFactory) -> Any:
    job = _job(tmp_path_factory.mktemp("large"), PRINT_EACH + 25)
    plain = run_job(job)  # every sheet printed and held: the unoptimised path
    spool = RunSpool()
    spooled = run_job(job, progress=spool.keep)
    yield job, plain, spooled
    spool.close()


def test_record_is_the_same_as_printing_every_sheet(large: Any) -> None:
    job, plain, spooled = large
    held = job_record(job, plain, "inprocess", 0.0)
    rec = job_record(job, spooled, "inprocess", 0.0)
    rec["run"] = held["run"]
    assert record_text(rec) == record_text(held)  # byte for byte
    kept = [o for o in spooled if all(s.has_html for s in o.sheets)]
    assert spooled[:PRINT_EACH] == kept[:PRINT_EACH]  # the first rows are kept whatever their ratio
    assert len(kept) < len(spooled)  # later members that govern nothing so far: their HTML is never made
    by_mark = {p.calc.member: p for p in plain}
    for o in kept:  # the HTML kept is the HTML the plain run printed
        assert [s["html"] for s in o.sheets] == [s["html"] for s in by_mark[o.calc.member].sheets]


def test_submittal_prints_one_calc_per_governing_case(large: Any) -> None:
    job, plain, spooled = large
    page = submittal_html(job, spooled, job_record(job, spooled, "inprocess", 0.0))
    cases = _expected_cases(plain)
    sections = re.findall(r'<section class="calc" id="calc-(\d+)"', page)
    assert len(sections) == len(cases) < len(plain)
    by_mark = {p.calc.member: p for p in plain}
    for members in cases.values():
        worst = max(members, key=lambda o: _governing(o)[1]["ratio"])
        heading = f"governing member {worst.calc.member} of {len(members):,}"
        assert heading in page
        section = page.split(f'id="calc-{worst.calc.number}"', 1)[1].split('<section class="calc"', 1)[0]
        assert all(s["html"] in section for s in by_mark[worst.calc.member].sheets)
        assert ", ".join(o.calc.member for o in members) in section  # the members it stands for
    for o in plain:  # every member in the compact table with its governing ratio
        assert re.search(rf"<tr[^>]*><td>{o.calc.member}</td><td class=\"num\">{o.calc.row}</td><td class=\"num\">"
                         rf"{_governing(o)[1]['ratio']:.3f}</td>", page)


def test_compact_table_is_one_table_per_column_each_with_its_header(large: Any) -> None:
    job, plain, spooled = large
    page = submittal_html(job, spooled, job_record(job, spooled, "inprocess", 0.0))
    block = page.split('<div class="members-compact">', 1)[1].split("</div>", 1)[0]
    tables = re.findall(r"<table><thead>(.*?)</thead><tbody>(.*?)</tbody></table>", block)
    assert "".join(f"<table><thead>{h}</thead><tbody>{b}</tbody></table>" for h, b in tables) == block  # nothing else
    counts = [b.count("<tr") for _h, b in tables]
    assert counts == [COLUMN_ROWS] * (len(plain) // COLUMN_ROWS) + ([len(plain) % COLUMN_ROWS] if len(plain) % COLUMN_ROWS else [])
    assert all(h.startswith("<tr><th>Member</th><th>Row</th>") for h, _b in tables)
    assert "break-inside: avoid" in COMPACT_CSS.split(".members-compact table", 1)[1].split("}", 1)[0]


def test_one_member_printed_on_request_is_worked_again(large: Any) -> None:
    job, plain, spooled = large
    lost = next(o for o in spooled if not all(s.has_html for s in o.sheets))
    page = submittal_html(job, spooled, job_record(job, spooled, "inprocess", 0.0), mode=f"calc:{lost.calc.member}")
    original = next(p for p in plain if p.calc.member == lost.calc.member)
    assert all(s["html"] in page for s in original.sheets)
    assert len(re.findall(r'<section class="calc"', page)) == 1


def test_a_small_table_prints_every_member(tmp_path: Path) -> None:
    job = _job(tmp_path, 6)
    with RunSpool() as spool:
        outcomes = run_job(job, progress=spool.keep)
        assert all(s.has_html for o in outcomes for s in o.sheets)
        page = submittal_html(job, outcomes, job_record(job, outcomes, "inprocess", 0.0))
    assert len(re.findall(r'<section class="calc"', page)) == 6 and "governing member" not in page
