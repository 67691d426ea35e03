"""``calcpad diff``: exactly the seeded changes between two records, and nothing else."""

from __future__ import annotations

import os
import stat
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest

from calcpad.cli import main
from calcpad.runner.diff import Change, RecordDiff, diff_html, diff_records, diff_table

from .records import copy_template, job_text, run_text, tube_ratio, write_record


@pytest.fixture(scope="module")
def revisions(tmp_path_factory: pytest.TempPathFactory) -> Iterator[dict[str, Any]]:
    """Rev. A: posts P1, P2 at 120 lbf, P4 at 90 lbf; rev. B: P1 at 300 lbf, P2 dropped, P3 added."""
    root = tmp_path_factory.mktemp("diff")
    tpl_dir = root / "templates"
    tpl = copy_template("leg_bending", tpl_dir)
    with pytest.MonkeyPatch.context() as mp:
        mp.setenv("CALCPAD_TEMPLATES", str(tpl_dir))
        a = run_text(job_text({"P1": "120 lbf", "P2": "120 lbf", "P4": "90 lbf"}, wind=False))
        b = run_text(job_text({"P1": "300 lbf", "P3": "120 lbf", "P4": "90 lbf"}, wind=False, revision="B"))
        # rev. C: the same job as A, run after a comment was added to the template
        tpl.write_text(tpl.read_text().replace("# %%\nfrom calcpad import Sheet", "# %%\n# reviewed\nfrom calcpad import Sheet", 1))
        stamp = tpl.stat().st_mtime + 10
        os.utime(tpl, (stamp, stamp))
        c = run_text(job_text({"P1": "120 lbf", "P2": "120 lbf", "P4": "90 lbf"}, wind=False, revision="C"))
    yield {"a": a, "b": b, "c": c, "root": root}


def _rows(d: RecordDiff) -> set[tuple[str, str, str]]:
    return {(kind, ch.calc, ch.item) for kind, ch in d.rows()}


def test_diff_reports_exactly_the_seeded_changes(revisions: dict[str, Any]) -> None:
    d = diff_records(revisions["a"], revisions["b"])
    sheet = "P1 - Leg bending at base"
    assert _rows(d) == {
        ("added", "P3 (leg_bending)", "Leg in bending: cantilever tube, yield-based check"),
        ("removed", "P2 (leg_bending)", "Leg in bending: cantilever tube, yield-based check"),
        ("inputs", "P1 (leg_bending)", "P"),
        ("flips", "P1 (leg_bending)", f"{sheet} › Combined stress vs yield"),
        ("results", "P1 (leg_bending)", f"{sheet} › M_1"),
        ("results", "P1 (leg_bending)", f"{sheet} › M_r2"),  # M_r2 = B2 M_1 (AISC 360-16 App. 8), B2 = 1 without axial load
        ("results", "P1 (leg_bending)", f"{sheet} › sigma_b"),
        ("results", "P1 (leg_bending)", f"{sheet} › Combined stress vs yield (ratio)"),
    }
    assert (d.old_label, d.new_label) == ("A", "B") and d.changed and not d.versions
    (inp,) = d.inputs
    assert (inp.old, inp.new) == ("120 lbf", "300 lbf")
    # hand calc (common practice): M = P L, sigma = M c / I, ratio = FS sigma / F_y
    M0, s0, r0 = tube_ratio(120.0)
    M1, s1, r1 = tube_ratio(300.0)
    assert r0 < 1.0 < r1  # the seeded load was chosen to flip the check
    (flip,) = d.flips
    assert flip.old.startswith("OK (") and flip.new.startswith("NG (")
    moved = {ch.item.split(" › ")[-1]: ch for ch in d.results}
    assert (moved["M_1"].old, moved["M_1"].new) == (f"{M0:g} lbf*in", f"{M1:g} lbf*in")
    assert moved["M_1"].note == "+150.000%"
    ratio = moved["Combined stress vs yield (ratio)"]
    assert (float(ratio.old), float(ratio.new)) == pytest.approx((r0, r1), rel=1e-5)
    assert (float(moved["sigma_b"].old.split()[0]), float(moved["sigma_b"].new.split()[0])) == pytest.approx((s0, s1), rel=1e-5)


def test_diff_of_a_record_with_itself_is_empty(revisions: dict[str, Any]) -> None:
    d = diff_records(revisions["a"], revisions["a"])
    assert not d.changed and d.rows() == []


def test_diff_finds_a_changed_template_only(revisions: dict[str, Any]) -> None:
    d = diff_records(revisions["a"], revisions["c"])
    assert [(k, ch.item) for k, ch in d.rows()] == [("templates", "leg_bending")]
    a_sha = next(t["sha256"] for t in revisions["a"]["templates"] if t["name"] == "leg_bending")
    assert d.templates[0].old == a_sha[:12] and d.templates[0].new != d.templates[0].old


def test_diff_finds_changed_data(revisions: dict[str, Any]) -> None:
    new = dict(revisions["a"], data={**revisions["a"]["data"], "eng/data/materials.toml": "f" * 64})
    d = diff_records(revisions["a"], new)
    assert [(k, ch.item, ch.new) for k, ch in d.rows()] == [("data", "eng/data/materials.toml", "f" * 12)]


def test_diff_tolerance(revisions: dict[str, Any]) -> None:
    import copy

    new = copy.deepcopy(revisions["a"])
    calc = next(c for c in new["calcs"] if c["member"] == "P1")
    calc["sheets"][0]["results"]["M_1"]["value"] *= 1 + 1e-8
    assert not diff_records(revisions["a"], new).changed  # default rtol 1e-6
    assert [ch.item for ch in diff_records(revisions["a"], new, rtol=1e-9).results] == ["P1 - Leg bending at base › M_1"]


def test_diff_compares_values_across_units(revisions: dict[str, Any]) -> None:
    import copy

    new = copy.deepcopy(revisions["a"])
    res = next(c for c in new["calcs"] if c["member"] == "P1")["sheets"][0]["results"]["M_1"]
    res.update(value=res["value"] / 12.0, unit="lbf*ft")  # the same moment in another unit
    assert not diff_records(revisions["a"], new).results


def test_cli_diff_exit_codes_and_html(revisions: dict[str, Any], tmp_path: Path, capsys: pytest.CaptureFixture[str], monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.setenv("COLUMNS", "300")  # one table row per line
    a = write_record(revisions["a"], tmp_path / "a")
    b = write_record(revisions["b"], tmp_path / "b")
    assert main(["diff", str(a), str(a)]) == 0
    out = capsys.readouterr().out  # a sentence, not an empty table
    assert "No changes in inputs, results, check status, calcs, templates or data since revision A." in out
    assert "┏" not in out and "What" not in out
    html = tmp_path / "changes.html"
    assert main(["diff", str(a), str(b / "record.json"), "--html", str(html)]) == 1
    out = capsys.readouterr().out
    assert "calc added" in out and "status flipped" in out and "P3 (leg_bending)" in out
    assert "8 changes; results compared to a relative tolerance of" in out and "No changes" not in out
    text = html.read_text()
    assert "Changes since revision A" in text and text.count("<tr>") == 1 + 8
    mask = os.umask(0)
    os.umask(mask)
    assert stat.S_IMODE(html.stat().st_mode) == 0o666 & ~mask  # as readable as any new file, not owner-only
    assert main(["diff", str(a), str(b), "--html", str(html)]) == 1  # our own file may be replaced
    foreign = tmp_path / "notes.html"
    foreign.write_text("my notes")
    assert main(["diff", str(a), str(b), "--html", str(foreign)]) == 2
    assert foreign.read_text() == "my notes"
    assert "was not written by calcpad diff" in capsys.readouterr().err


def test_cli_diff_bad_input(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    (tmp_path / "x.json").write_text("{")
    assert main(["diff", str(tmp_path / "x.json"), str(tmp_path / "missing")]) == 2
    err = capsys.readouterr().err
    assert "not valid JSON" in err and "Traceback" not in err


def test_diff_html_escapes_and_says_no_changes() -> None:
    d = RecordDiff("A", "B", 1e-6, inputs=[Change("<b>M1</b>", "P & Q", "1 <in>", "2", "")])
    html = diff_html(d)
    assert "<b>M1</b>" not in html and "&lt;b&gt;M1&lt;/b&gt;" in html and "P &amp; Q" in html
    assert "No changes" in diff_html(RecordDiff("A", "B", 1e-6))
    assert diff_table(d).row_count == 1
