"""The job record (format 2) and ``calcpad verify``: intact, templates, data, results reproduced."""

from __future__ import annotations

import copy
import hashlib
import json
import os
import shutil
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest

from calcpad.cli import main
from calcpad.runner import record as record_mod
from calcpad.runner.job import input_record
from calcpad.runner.record import JOB_RECORD_FORMAT, record_digest, short_digest
from calcpad.runner.recordfile import RecordError, find_record, load_record, read_record
from calcpad.runner.verify import verify_record

from .conftest import JOB_HEAD, tiny_calc
from .records import ROOT, copy_template, job_text, run_text, tube_ratio, write_record

PACKAGE = ROOT / "calcpad"


@pytest.fixture(scope="module")
def base(tmp_path_factory: pytest.TempPathFactory) -> Iterator[dict[str, Any]]:
    """One run of a small job with a user template folder holding a copy of leg_bending."""
    root = tmp_path_factory.mktemp("verify")
    tpl_dir = root / "templates"
    copy_template("leg_bending", tpl_dir)
    text = job_text({"P1": "120 lbf", "P2": "120 lbf"}, wind=False)
    with pytest.MonkeyPatch.context() as mp:
        mp.setenv("CALCPAD_TEMPLATES", str(tpl_dir))
        record = run_text(text)
        out = write_record(record, root / "out")
        yield {"root": root, "text": text, "record": record, "out": out, "templates": tpl_dir}


def _edited(base: dict[str, Any], tmp_path: Path, edit: Any) -> Path:
    rec = json.loads((base["out"] / "record.json").read_text())
    edit(rec)
    return write_record(rec, tmp_path / "edited")


def _leg(rec: dict[str, Any], mark: str) -> dict[str, Any]:
    return next(c for c in rec["calcs"] if c["member"] == mark)


# ----------------------------------------------------------------------------- record content


def test_record_holds_job_text_inputs_templates_and_data(base: dict[str, Any]) -> None:
    rec = base["record"]
    assert rec["format"] == JOB_RECORD_FORMAT == "calcpad-job-record/2"
    assert rec["job_file"]["text"] == base["text"]  # exactly as typed, comments included
    assert rec["job_file"]["sha256"] == hashlib.sha256(base["text"].encode()).hexdigest()
    leg = _leg(rec, "P1")
    assert leg["inputs"]["P"] == {"typed": "120 lbf", "value": 120.0, "unit": "lbf"}
    assert leg["inputs"]["FS_req"] == {"typed": 1.67, "value": 1.67, "unit": ""}  # a TOML number stays a number
    # each template: sha256 of its source file's bytes (here the user's copy)
    expected = {"leg_bending": hashlib.sha256((base["templates"] / "leg_bending.py").read_bytes()).hexdigest()}
    assert {t["name"]: t["sha256"] for t in rec["templates"]} == expected
    assert leg["template_sha256"] == expected["leg_bending"] and leg["template_file"] == "leg_bending.py"
    # every shipped catalog and material file, by its bytes
    files = [*sorted((PACKAGE / "eng" / "sections" / "data").glob("*.csv")), PACKAGE / "eng" / "data" / "materials.toml"]
    assert rec["data"] == {f.relative_to(PACKAGE).as_posix(): hashlib.sha256(f.read_bytes()).hexdigest() for f in files}
    assert "eng/sections/data/aisc_pipe.csv" in rec["data"] and "eng/data/materials.toml" in rec["data"]
    assert rec["versions"]["calcpad"]


def test_record_digest_is_sha256_of_canonical_json_without_run(base: dict[str, Any]) -> None:
    rec = base["record"]
    body = {k: v for k, v in rec.items() if k not in ("run", "record_digest")}
    canonical = json.dumps(body, sort_keys=True, separators=(",", ":"), ensure_ascii=False).encode("utf-8")
    assert rec["record_digest"] == hashlib.sha256(canonical).hexdigest() == record_digest(rec)
    assert short_digest(rec) == rec["record_digest"][:12] and len(short_digest(rec)) == 12
    # the digest survives the trip through the written file
    assert record_digest(json.loads((base["out"] / "record.json").read_text())) == rec["record_digest"]
    moved = dict(rec, run={"mode": "kernel", "seconds": 99.0, "created": "2030-01-01T00:00:00+00:00"})
    assert record_digest(moved) == rec["record_digest"]  # run facts are outside the seal


def _leaves(obj: Any, path: tuple[Any, ...] = ()) -> Iterator[tuple[Any, ...]]:
    if isinstance(obj, dict):
        for k, v in obj.items():
            yield from _leaves(v, (*path, k))
    elif isinstance(obj, list):
        for i, v in enumerate(obj):
            yield from _leaves(v, (*path, i))
    else:
        yield path


def _changed(value: Any) -> Any:
    if isinstance(value, bool):
        return not value
    if isinstance(value, (int, float)):
        return value * 1.0001 + 1e-9 if isinstance(value, float) else value + 1
    if isinstance(value, str):
        return value + " "
    return 0  # None


def test_record_digest_catches_a_hand_edit_of_any_field(base: dict[str, Any]) -> None:
    rec = base["record"]
    sealed = {k: v for k, v in rec.items() if k != "run"}
    paths = [p for p in _leaves(sealed) if p[0] != "record_digest"]
    assert len(paths) > 200  # every leaf: job text, inputs, digests, sheets, checks ...
    for path in paths:
        edited = copy.deepcopy(sealed)
        node = edited
        for key in path[:-1]:
            node = node[key]
        node[path[-1]] = _changed(node[path[-1]])
        assert record_digest(edited) != rec["record_digest"], path


def test_text_inputs_are_stored_as_text_and_verify(tmp_path: Path) -> None:
    rec = run_text(job_text({}, wind=True))
    (wind,) = rec["calcs"]
    assert wind["inputs"]["exposure"] == {"typed": "C", "value": "C", "unit": None}  # a category, not 1 coulomb
    assert wind["inputs"]["K_leg"] == {"typed": "2.0", "value": 2.0, "unit": ""}
    assert wind["inputs"]["S_DS"] == {"typed": 0.42, "value": 0.42, "unit": ""}
    assert rec["templates"][0]["sha256"] == hashlib.sha256((ROOT / "notebooks" / "wind_rooftop_stand.py").read_bytes()).hexdigest()
    assert main(["verify", str(write_record(rec, tmp_path / "out"))]) == 0


def test_input_record_keeps_texts_as_texts() -> None:
    assert input_record("C", "text") == {"value": "C", "unit": None}
    assert input_record("A500 Gr C", "text") == {"value": "A500 Gr C", "unit": None}
    assert input_record("12 in", "quantity") == {"value": 12.0, "unit": "in"}
    assert input_record(1.67, "number") == {"value": 1.67, "unit": ""}


# ----------------------------------------------------------------------------- verify


def test_verify_passes_on_untouched_output(base: dict[str, Any], capsys: pytest.CaptureFixture[str]) -> None:
    report = verify_record(base["record"])
    assert report.ok and report.diff is not None and not report.diff.rows()
    assert main(["verify", str(base["out"])]) == 0
    assert main(["verify", str(base["out"] / "record.json")]) == 0
    assert "verified" in capsys.readouterr().out


def test_verify_lists_an_altered_input(base: dict[str, Any], tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    out = _edited(base, tmp_path, lambda r: _leg(r, "P2")["inputs"]["P"].update(value=150.0))
    assert main(["verify", str(out)]) == 1
    text = capsys.readouterr().out
    assert "record intact" in text and "NO" in text
    report = verify_record(read_record(out / "record.json"))
    assert not report.record_intact and report.templates_unchanged and report.data_unchanged
    d = report.diff
    assert d is not None
    assert [(c.calc, c.item, c.old, c.new) for c in d.inputs] == [("P2 (leg_bending)", "P", "150 lbf", "120 lbf")]
    assert not (d.results or d.flips or d.added or d.removed)


def test_verify_lists_an_altered_result(base: dict[str, Any], tmp_path: Path) -> None:
    def edit(r: dict[str, Any]) -> None:
        _leg(r, "P1")["sheets"][0]["results"]["M_1"]["value"] = 3700.0

    report = verify_record(read_record(_edited(base, tmp_path, edit) / "record.json"))
    assert not report.record_intact and not report.results_reproduced
    M, _, _ = tube_ratio(120.0)  # 3600 lbf*in by statics
    assert [(c.calc, c.item, c.old, c.new) for c in report.diff.results] == [
        ("P1 (leg_bending)", "P1 - Leg bending at base › M_1", "3700 lbf*in", f"{M:g} lbf*in")
    ]


def _set(path: tuple[Any, ...], value: Any) -> Any:
    def edit(rec: dict[str, Any]) -> None:
        node: Any = rec
        for key in path[:-1]:
            node = next(c for c in node if c["member"] == key[1:]) if isinstance(key, str) and key.startswith("@") else node[key]
        node[path[-1]] = value

    return edit


@pytest.mark.parametrize(
    ("path", "value", "expected"),
    [
        (("job", "engineer"), "B. Someone", ("", "job › engineer", "B. Someone", "A. Engineer")),
        (("summary", "ng"), 1, ("", "summary › ng", "1", "0")),
        (("templates", 0, "file"), "other.py", ("", "templates[0] › file", "other.py", "leg_bending.py")),
        (("calcs", "@P1", "title"), "Renamed", ("P1 (leg_bending)", "title", "Renamed", "")),
        (("calcs", "@P2", "checks", 0, "status"), "NG", ("P2 (leg_bending)", "checks[0] › status", "NG", "OK")),
        (("calcs", "@P2", "status"), "NG", ("P2 (leg_bending)", "status", "NG", "OK")),
        (("calcs", "@P1", "results", "P1 - Leg bending at base", "M_1", "value"), 3599.0, ("P1 (leg_bending)", "results › P1 - Leg bending at base › M_1 › value", "3599.0", "3600.0")),
    ],
)
def test_verify_names_a_hand_edited_field(base: dict[str, Any], tmp_path: Path, path: tuple[Any, ...], value: Any, expected: tuple[str, str, str, str]) -> None:
    report = verify_record(read_record(_edited(base, tmp_path, _set(path, value)) / "record.json"))
    assert not report.record_intact and report.stored_digest != report.computed_digest
    assert [(c.calc, c.item, c.old, c.new) for c in report.fields] == [expected]
    assert report.results_reproduced  # the sheets themselves were not touched


def test_verify_finds_an_edited_template(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    tpl_dir = tmp_path / "templates"
    tpl = copy_template("leg_bending", tpl_dir)
    monkeypatch.setenv("CALCPAD_TEMPLATES", str(tpl_dir))
    out = write_record(run_text(job_text({"P1": "120 lbf"}, wind=False)), tmp_path / "out")
    assert main(["verify", str(out)]) == 0
    before = hashlib.sha256(tpl.read_bytes()).hexdigest()
    source = tpl.read_text()
    assert source.count('"P*L"') == 1
    tpl.write_text(source.replace('"P*L"', '"P*L/2"'))
    stamp = tpl.stat().st_mtime + 10
    os.utime(tpl, (stamp, stamp))  # a new mtime, whatever the file system's resolution
    after = hashlib.sha256(tpl.read_bytes()).hexdigest()
    report = verify_record(read_record(out / "record.json"))
    assert report.record_intact and report.data_unchanged
    assert not report.templates_unchanged and not report.results_reproduced
    d = report.diff
    assert [(c.item, c.old, c.new) for c in d.templates] == [("leg_bending", before[:12], after[:12])]
    M, sigma, ratio = tube_ratio(120.0)
    moved = {c.item.split(" › ")[-1]: (c.old, c.new) for c in d.results}
    assert moved["M_1"] == (f"{M:g} lbf*in", f"{M / 2:g} lbf*in")  # the moment halves
    assert moved["sigma_b"][1] == f"{sigma / 2:.6g} ksi"
    assert set(moved) == {"M_1", "M_r2", "sigma_b", "Combined stress vs yield (ratio)"}  # M_r2 = B2 M_1, B2 = 1 without axial load
    old_ratio, new_ratio = moved["Combined stress vs yield (ratio)"]
    assert (float(old_ratio), float(new_ratio)) == pytest.approx((ratio, ratio / 2), rel=1e-5)
    assert main(["verify", str(out)]) == 1


def _data_copy(tmp_path: Path) -> Path:
    pkg = tmp_path / "pkg"
    shutil.copytree(PACKAGE / "eng" / "sections" / "data", pkg / "eng" / "sections" / "data")
    shutil.copytree(PACKAGE / "eng" / "data", pkg / "eng" / "data")
    return pkg


@pytest.mark.parametrize("name", ["eng/sections/data/aisc_pipe.csv", "eng/data/materials.toml"])
def test_verify_finds_changed_data(base: dict[str, Any], tmp_path: Path, monkeypatch: pytest.MonkeyPatch, name: str) -> None:
    pkg = _data_copy(tmp_path)
    monkeypatch.setattr(record_mod, "PACKAGE_DIR", pkg)  # the package data itself is never edited
    assert verify_record(base["record"]).ok
    target = pkg / name
    target.write_bytes(target.read_bytes() + b"\n")
    report = verify_record(base["record"])
    assert report.record_intact and report.templates_unchanged and not report.data_unchanged
    assert [(c.item, c.old) for c in report.diff.data] == [(name, base["record"]["data"][name][:12])]
    assert report.diff.data[0].new == hashlib.sha256(target.read_bytes()).hexdigest()[:12]


def test_verify_finds_a_removed_data_file(base: dict[str, Any], tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    pkg = _data_copy(tmp_path)
    (pkg / "eng" / "sections" / "data" / "emt.csv").unlink()
    monkeypatch.setattr(record_mod, "PACKAGE_DIR", pkg)
    report = verify_record(base["record"])
    assert [(c.item, c.new, c.note) for c in report.diff.data] == [("eng/sections/data/emt.csv", "—", "removed")]


def test_verify_rtol(base: dict[str, Any], tmp_path: Path) -> None:
    def edit(r: dict[str, Any]) -> None:
        res = _leg(r, "P1")["sheets"][0]["results"]["M_1"]
        res["value"] *= 1 + 1e-7

    path = _edited(base, tmp_path, edit) / "record.json"
    assert len(verify_record(read_record(path), rtol=1e-9).diff.results) == 1
    assert not verify_record(read_record(path), rtol=1e-6).diff.results


# ----------------------------------------------------------------------------- finding records, bad input


def test_verify_picks_the_newest_revision_or_the_named_one(base: dict[str, Any], tmp_path: Path) -> None:
    out = tmp_path / "out"
    a = write_record(base["record"], out / "rev-A")
    rec_b = copy.deepcopy(base["record"])
    rec_b["job"]["revision"] = "B"
    b = write_record(rec_b, out / "rev-B")
    os.utime(a / "record.json", (1_000_000, 1_000_000))
    assert find_record(out) == b / "record.json"
    assert find_record(out, "A") == a / "record.json"
    assert find_record(out, "rev-B") == b / "record.json"
    with pytest.raises(RecordError, match="no record of revision 'C'"):
        find_record(out, "C")
    assert main(["verify", str(out), "--revision", "A"]) == 0


@pytest.mark.parametrize(
    ("content", "message"),
    [
        (None, "no such file or folder"),
        ("{not json", "not valid JSON"),
        ('{"format": "calcpad-job-record/1", "calcs": []}', "older calcpad"),
        ('{"format": "something else"}', "expected 'calcpad-job-record/2'"),
        ('{"format": "calcpad-job-record/2", "calcs": 3}', "damaged record"),
        ("[1, 2]", "expected a JSON object"),
    ],
)
def test_verify_bad_input_exits_2_with_a_message(tmp_path: Path, capsys: pytest.CaptureFixture[str], content: str | None, message: str) -> None:
    target = tmp_path / "record.json"
    if content is not None:
        target.write_text(content)
    assert main(["verify", str(target)]) == 2
    err = capsys.readouterr().err
    assert message in err and "Traceback" not in err


def test_verify_empty_folder_and_bad_rtol(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["verify", str(tmp_path)]) == 2
    assert "no record.json" in capsys.readouterr().err
    with pytest.raises(SystemExit) as exc:
        main(["verify", str(tmp_path), "--rtol", "nan"])
    assert exc.value.code == 2
    assert "relative tolerance" in capsys.readouterr().err


def test_verify_when_the_template_is_gone(tmp_path: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    tpl_dir = tmp_path / "templates"
    copy_template("leg_bending", tpl_dir).rename(tpl_dir / "dock_post.py")
    monkeypatch.setenv("CALCPAD_TEMPLATES", str(tpl_dir))
    out = write_record(run_text(job_text({"P1": "120 lbf"}, wind=False).replace("leg_bending", "dock_post")), tmp_path / "out")
    (tpl_dir / "dock_post.py").unlink()
    report = verify_record(read_record(out / "record.json"))
    assert report.record_intact and not report.ok
    assert report.rerun_error is not None and "unknown template 'dock_post'" in report.rerun_error
    assert main(["verify", str(out)]) == 1
    assert "cannot rebuild the calcs" in capsys.readouterr().out


def test_verify_outputs_of_calcpad_run(tmp_path: Path, tiny_env: Path, capsys: pytest.CaptureFixture[str]) -> None:
    """End to end through ``calcpad run``: a job file and a one-template --set run."""
    job = tmp_path / "job.toml"
    job.write_text(JOB_HEAD + tiny_calc("A1") + tiny_calc("A2", P='"300 lbf"'))
    assert main(["run", str(job), "--out", str(tmp_path / "job_out")]) == 1  # A2: 3000 > 2000 lbf*in, NG
    assert main(["run", "tiny", "--set", "L=12 in", "--member", "B7", "--out", str(tmp_path / "set_out")]) == 0
    capsys.readouterr()
    assert main(["verify", str(tmp_path / "job_out")]) == 0
    assert main(["verify", str(tmp_path / "set_out")]) == 0
    path, rec = load_record(tmp_path / "set_out")
    assert rec["job_file"]["text"] is None and rec["calcs"][0]["inputs"]["L"]["typed"] == "12 in"
    rec = json.loads(path.read_text(encoding="utf-8"))  # load_record leaves the calcs in the file (read-only)
    rec["calcs"][0]["inputs"]["L"]["typed"] = "11 in"  # a hand edit of what was typed
    path.write_text(json.dumps(rec))
    assert main(["verify", str(path)]) == 1
    assert "NOT verified" in capsys.readouterr().out


def test_a_record_file_is_read_with_its_calcs_left_in_the_file(tmp_path: Path, tiny_env: Path) -> None:
    """read_record leaves the calcs of a record laid out as calcpad writes it in the file; what is
    read equals json.load of the file, the digest and the text are the same; any other layout of
    the same JSON is read whole; a damaged entry is a RecordError."""
    from calcpad.runner.record import SpooledCalcs, record_digest, record_text

    job = tmp_path / "job.toml"
    job.write_text(JOB_HEAD + tiny_calc("A1") + tiny_calc("A2", P='"300 lbf"') + tiny_calc("A3", mode='"fail"'))
    main(["run", str(job), "--out", str(tmp_path / "out"), "--no-pdf"])
    path = find_record(tmp_path / "out")
    whole = json.loads(path.read_text(encoding="utf-8"))
    rec = read_record(path)
    assert isinstance(rec["calcs"], SpooledCalcs) and list(rec["calcs"]) == whole["calcs"]
    assert {k: v for k, v in rec.items() if k != "calcs"} == {k: v for k, v in whole.items() if k != "calcs"}
    assert record_text(rec) == path.read_text(encoding="utf-8") and record_digest(rec) == whole["record_digest"]
    assert verify_record(rec).ok
    compact = tmp_path / "compact.json"
    compact.write_text(json.dumps(whole), encoding="utf-8")
    assert read_record(compact) == whole and isinstance(read_record(compact)["calcs"], list)
    damaged = tmp_path / "damaged.json"
    damaged.write_text(path.read_text(encoding="utf-8").replace('"member": "A2"', '"member": A2"', 1), encoding="utf-8")
    with pytest.raises(RecordError, match="not valid JSON"):
        read_record(damaged)
