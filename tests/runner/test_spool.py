"""The run spool: a job whose calcs wait in a spool file writes the same record and submittal,
byte for byte, as one held in memory; the streamed record text is record_layout's, which json
reads back as the same record."""

from __future__ import annotations

import copy
import hashlib
import json
from pathlib import Path
from typing import Any

import pytest

from calcpad.report.layout import submittal_chunks, submittal_html
from calcpad.runner.execute import CalcOutcome, run_job
from calcpad.runner.job import parse_job
from calcpad.runner.record import SpooledCalcs, job_record, record_chunks, record_digest, record_layout, record_text, seal
from calcpad.runner.spool import RunSpool, SpooledSheet

from .conftest import JOB_HEAD, tiny_calc


def _job() -> Any:
    text = JOB_HEAD + tiny_calc("M1") + tiny_calc("M2") + tiny_calc("M3", P='"300 lbf"') + tiny_calc("F1", mode='"fail"')
    return parse_job(text)


def _spooled(job: Any, spool: RunSpool) -> list[CalcOutcome]:
    return run_job(job, progress=spool.keep)


def test_spooled_record_equals_the_record_held_in_memory(tiny_env: Path) -> None:
    job = _job()
    held = job_record(job, run_job(job), "inprocess", 0.0)
    with RunSpool() as spool:
        outcomes = _spooled(job, spool)
        assert all(isinstance(s, SpooledSheet) and "record" not in s and "html" not in s for o in outcomes for s in o.sheets)
        rec = job_record(job, outcomes, "inprocess", 0.0)
        assert isinstance(rec["calcs"], SpooledCalcs) and len(rec["calcs"]) == 4
        assert rec["record_digest"] == held["record_digest"]
        assert rec["summary"] == held["summary"] and rec["templates"] == held["templates"]
        assert list(rec["calcs"]) == held["calcs"]
        rec["run"] = held["run"]
        # the streamed file text is record_layout of the whole record held in memory, and json reads it back
        assert record_text(rec) == record_layout(held) + "\n"
        assert json.loads(record_text(rec)) == held
        # and the digest is over the canonical JSON, whether calcs are spooled or not
        body = {k: v for k, v in held.items() if k not in ("run", "record_digest")}
        canonical = json.dumps(body, sort_keys=True, separators=(",", ":"), ensure_ascii=False, allow_nan=False)
        assert record_digest(rec) == hashlib.sha256(canonical.encode("utf-8")).hexdigest()
        # a sheet's record and HTML read back as collected
        plain = run_job(job)
        assert [s["record"] for o in outcomes for s in o.sheets] == [s["record"] for o in plain for s in o.sheets]
        assert [s["html"] for o in outcomes for s in o.sheets] == [s["html"] for o in plain for s in o.sheets]


def test_spooled_submittal_is_the_same_page(tiny_env: Path) -> None:
    job = _job()
    plain = run_job(job)
    with RunSpool() as spool:
        outcomes = _spooled(job, spool)
        rec = job_record(job, outcomes, "inprocess", 0.0)
        chunks = list(submittal_chunks(job, outcomes, rec))
    assert len(chunks) > 10  # streamed in pieces: the calcs' sheets one at a time
    held = job_record(job, plain, "inprocess", 0.0)
    held["run"] = rec["run"]
    assert "".join(chunks) == submittal_html(job, plain, held)


def test_record_chunks_equal_the_layout_for_any_record() -> None:
    record = {"format": "x", "calcs": [], "nested": {"a": [1, {"b": "é\nq"}], "c": {}}, "list": [[], {}, "t"], "n": None}
    assert "".join(record_chunks(record)) == record_layout(record) + "\n"
    assert json.loads(record_layout(record)) == record
    assert "".join(record_chunks({})) == "{}\n"
    sealed = seal(copy.deepcopy(record))
    assert sealed["record_digest"] == hashlib.sha256(
        json.dumps(record, sort_keys=True, separators=(",", ":"), ensure_ascii=False).encode("utf-8")).hexdigest()


def test_layout_keeps_the_top_levels_indented_and_each_step_on_one_line() -> None:
    """Down to a calc entry the text is json.dumps(indent=1)'s; below, a step, a check and a table
    row are each one line of compact JSON (separators ", " and ": "); a sheet record holding
    tables of steps is opened, and so is a long list of texts."""
    step = {"value": 2.5, "unit": "in", "description": "Leg height"}
    check = {"title": "Shear", "demand": {"value": 1.0, "unit": "kip"}, "ratio": 0.5, "status": "OK"}
    notes = ["The leg is a cantilever fixed at its base and loaded sideways at its top.", "x" * 100]
    sheet = {"title": "S", "meta": {"member": "M1"}, "inputs": {"H": step}, "checks": [check], "assumptions": notes, "tags": ["a", "b"]}
    entry = {"number": 1, "results": {"S": {"H": step}}, "checks": [check], "sheets": [sheet], "table": {"name": "t.csv", "row": 2}}
    record = {"format": "x", "job": {"codes": ["AISC 360-16"], "rows": [["M1", "260"]]}, "calcs": [entry]}
    text = record_layout(record)
    assert json.loads(text) == record
    head = json.dumps({"format": "x", "job": {"codes": ["AISC 360-16"]}}, indent=1)  # the top levels as before
    assert text.startswith(head[: head.index('"AISC 360-16"')])
    lines = text.splitlines()
    one_line = json.dumps(step, separators=(", ", ": "))
    assert lines.count(f'     "H": {one_line}') == 1 and lines.count(f'      "H": {one_line}') == 1  # results and sheet inputs
    assert lines.count("    " + json.dumps(check, separators=(", ", ": "))) == 1  # the calc's check
    assert lines.count("      " + json.dumps(check, separators=(", ", ": "))) == 1  # the sheet's check
    assert '     "meta": {"member": "M1"},' in lines and '     "tags": ["a", "b"]' in lines
    assert '   "table": {"name": "t.csv", "row": 2}' in lines
    assert "      " + json.dumps(notes[0]) + "," in lines  # long assumptions: one per line
    assert lines.count('   ["M1", "260"]') == 1  # a table row
    assert max(map(len, lines)) < 160


def test_layout_of_texts_holding_brackets_and_odd_values() -> None:
    """Texts that look like JSON structure ("}, {", '}, "', brackets) keep each record on its own
    line; non-text keys, tuples and empty records print as json.dumps reads them."""
    tricky = ['a}, {"b', 'ends in }, ', "Shear [x]", "{", "]"]
    steps = {f"s{i}": {"value": float(i), "unit": "in", "description": t} for i, t in enumerate(tricky)}
    checks = [{"title": t, "demand": {"value": 1.0, "unit": "kip"}, "ratio": 0.5} for t in tricky]
    table = [{"note": t} for t in tricky] + [{}]
    record = {"calcs": [{"results": {"S": steps}, "checks": checks, "table": table, "odd": {1: {True: (1, 2)}, None: {"x": [1]}}}]}
    text = record_layout(record)
    assert json.loads(text) == json.loads(json.dumps(record))
    lines = text.splitlines()
    for name, step in steps.items():  # one line per step, exactly the step as json reads it
        line = next(line for line in lines if line.startswith(f'     "{name}": '))
        assert json.loads("{" + line.rstrip(",") + "}") == {name: step}
    for records in (checks, table):
        found = [json.loads(line.strip().rstrip(",")) for line in lines if line.startswith("    {")]
        assert all(r in found for r in records)
    assert "".join(record_chunks(record)) == text + "\n"


def test_non_finite_values_are_refused_in_the_stream() -> None:
    with pytest.raises(ValueError):
        record_text({"x": float("nan")})


def test_spool_file_has_no_name_and_closes(tiny_env: Path) -> None:
    job = _job()
    spool = RunSpool()
    outcomes = _spooled(job, spool)
    assert not Path(str(spool._file.name)).exists()  # an anonymous file: nothing left on disk by a kill
    spool.close()
    with pytest.raises(ValueError):
        outcomes[0].sheets[0]["html"]  # the spool is gone with the run


def test_outcome_status_and_checks_from_the_summary(tiny_env: Path) -> None:
    job = _job()
    plain = run_job(job)
    with RunSpool() as spool:
        outcomes = _spooled(job, spool)
        # M3: 300 lbf x 10 in = 3000 lbf in > 2000 lbf in allowed: NG (hand arithmetic)
        assert [o.status for o in outcomes] == [o.status for o in plain] == ["OK", "OK", "NG", "ERROR"]
        assert [o.checks for o in outcomes] == [o.checks for o in plain]
        # M = P L = 100 lbf x 10 in = 1000 lbf in against 2000 lbf in: ratio 0.5 (hand arithmetic)
        assert outcomes[0].checks == [{"sheet": "First bound later", "name": "Moment", "ratio": pytest.approx(0.5), "status": "OK", "ref": ""}]
        assert [s.numbers for o in outcomes for s in o.sheets] == [s.numbers for o in plain for s in o.sheets]


def test_cli_run_with_many_rows_lists_only_what_is_not_ok(tiny_env: Path, tmp_path: Path, monkeypatch: pytest.MonkeyPatch,
                                                       capsys: pytest.CaptureFixture[str]) -> None:
    import calcpad.cli as cli

    job = tmp_path / "job.toml"
    job.write_text(JOB_HEAD + tiny_calc("M1") + tiny_calc("M2") + tiny_calc("M3", P='"300 lbf"'), encoding="utf-8")
    monkeypatch.setattr(cli, "SUMMARY_ROWS", 2)  # three check rows: more than the terminal summary lists
    assert cli.main(["run", str(job), "--out", str(tmp_path / "out"), "--no-pdf"]) == 1
    out = capsys.readouterr().out
    assert "M3" in out and "M1" not in out and "M2" not in out
    assert "3 check rows: listed the calcs that are not OK (1 rows)" in out
    record = json.loads(next((tmp_path / "out").glob("rev-*/record.json")).read_text(encoding="utf-8"))
    assert [c["member"] for c in record["calcs"]] == ["M1", "M2", "M3"]  # the record keeps every calc


def test_kernel_notebooks_wait_in_the_spool_as_their_file_text(tiny_env: Path, tmp_path: Path) -> None:
    """A --notebooks run's executed notebooks go to the spool as they finish; the files written
    are what nbformat.write writes for the notebooks held in memory."""
    import nbformat

    from calcpad.runner.outfolder import check_target, write_outputs
    from calcpad.runner.spool import SpooledNotebook

    job = _job()
    held: list[Any] = []
    with RunSpool() as spool:
        def keep(o: CalcOutcome) -> None:
            held.append(copy.deepcopy(o.notebook))
            spool.keep(o)

        outcomes = run_job(job, mode="kernel", progress=keep)
        assert all(isinstance(o.notebook, SpooledNotebook) for o in outcomes)
        rec = job_record(job, outcomes, "kernel", 0.0)
        folder = write_outputs(check_target(tmp_path / "out", "0", []), rec, lambda d: None, outcomes=outcomes)
    files = sorted((folder / "notebooks").iterdir())
    assert len(files) == len(outcomes) == len(held)
    for nb in held:
        expected = tmp_path / "expected.ipynb"
        nbformat.write(nb, str(expected))
        assert expected.read_bytes() in [f.read_bytes() for f in files]
