"""``[job] shop_sections``: a job that names the shop's own table runs with it, records its digest,
prints the note where a shop section is used and verifies; a bad table stops the run (exit 2).

The shop row is an invented size with the dimensions of the AISC Manual (15th ed., Table 1-7)
L2-1/2x2-1/2x1/4: A = 1.19 in^2, 4.1 lb/ft (from memory). Digests are computed here with hashlib.
"""

from __future__ import annotations

import dataclasses
import hashlib
import json
from pathlib import Path

import pytest

from calcpad.cli import main
from calcpad.runner.job import JobError, load_job

from .conftest import JOB_HEAD

SHOP = """# source: Kestrel Yard Fabricators stock angles (invented for the tests)
designation,family,d [in],b [in],t [in],A [in^2],weight [lb/ft]
L2-1/2x2-1/2x1/4 KYF,angle,2.5,2.5,1/4,1.19,4.1
"""

BRACE = """
[[calcs]]
template = "angle_brace"
member = "KB9"
[calcs.inputs]
method = "ASD"
brace = "L2-1/2x2-1/2x1/4 KYF"
grade = "A36"
connected_leg = "long"
P_c = "1.9 kip"
P_t = "1.9 kip"
L = "3.5 ft"
weld_size = "3/16 in"
weld_length = "2 in"
F_EXX = "70 ksi"
gusset_t = "3/8 in"
gusset_grade = "A36"
"""


def _job(tmp_path: Path, shop: str = SHOP) -> Path:
    (tmp_path / "kyf_sections.csv").write_text(shop, encoding="utf-8")
    job = tmp_path / "job.toml"
    job.write_text(JOB_HEAD + 'shop_sections = "kyf_sections.csv"\n' + BRACE, encoding="utf-8")
    return job


def test_job_runs_with_the_shop_table_records_its_digest_and_verifies(tmp_path: Path) -> None:
    job = _job(tmp_path)
    out = tmp_path / "out"
    assert main(["run", str(job), "--out", str(out), "--no-pdf"]) in (0, 1)
    rev = out / "rev-0"
    record = json.loads((rev / "record.json").read_text(encoding="utf-8"))
    block = record["shop_sections"]
    assert block["file"] == "kyf_sections.csv"
    assert block["sha256"] == hashlib.sha256(SHOP.encode("utf-8")).hexdigest()
    assert block["rows"] == 1 and block["text"] == SHOP
    html = (rev / "submittal.html").read_text(encoding="utf-8")
    assert "Section L2-1/2x2-1/2x1/4 KYF: from shop table kyf_sections.csv, row 3 (sha256 " + block["sha256"][:12] in html
    assert main(["verify", str(out)]) == 0


def test_verify_refuses_an_edited_shop_table_text(tmp_path: Path) -> None:
    job = _job(tmp_path)
    out = tmp_path / "out"
    main(["run", str(job), "--out", str(out), "--no-pdf"])
    rec_path = out / "rev-0" / "record.json"
    rec = json.loads(rec_path.read_text(encoding="utf-8"))
    rec["shop_sections"]["text"] = rec["shop_sections"]["text"].replace("1.19", "1.20")
    edited = tmp_path / "edited.json"
    edited.write_text(json.dumps(rec), encoding="utf-8")
    assert main(["verify", str(edited)]) != 0


def test_a_bad_shop_table_is_a_job_problem_listing_every_row(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    bad = SHOP.replace("2.5,2.5,1/4", "2.5,2.5,-1/4") + "L2-1/2x2-1/2x1/4 KYF,angle,2.5,2.5,1/4,1.19,4.1\nL3 KYF,angle,3,x,1/4,1.44,4.9\n"
    job = _job(tmp_path, bad)
    with pytest.raises(JobError) as exc:
        load_job(job)
    locs = [loc for loc, _ in exc.value.problems]
    assert locs == [f"job.shop_sections (kyf_sections.csv): row {n}" for n in (3, 4, 5)]
    out = tmp_path / "out"
    assert main(["run", str(job), "--out", str(out), "--no-pdf"]) == 2
    err = capsys.readouterr().err
    assert "row 3" in err and "t: '-1/4' is negative" in err and "repeats row 3" in err and "row 5" in err and "'x' is not a number" in err
    assert not out.exists()


def test_a_missing_shop_table_file_is_a_job_problem(tmp_path: Path) -> None:
    job = tmp_path / "job.toml"
    job.write_text(JOB_HEAD + 'shop_sections = "nowhere.csv"\n' + BRACE, encoding="utf-8")
    with pytest.raises(JobError, match=r"job.shop_sections \(nowhere.csv\): cannot read"):
        load_job(job)


def test_the_output_folder_may_not_hold_the_shop_table(tmp_path: Path) -> None:
    data = tmp_path / "data"
    data.mkdir()
    (data / "kyf_sections.csv").write_text(SHOP, encoding="utf-8")
    job = tmp_path / "job.toml"
    job.write_text(JOB_HEAD + 'shop_sections = "data/kyf_sections.csv"\n' + BRACE, encoding="utf-8")
    assert main(["run", str(job), "--out", str(data), "--no-pdf"]) == 2
    assert sorted(p.name for p in data.iterdir()) == ["kyf_sections.csv"]


def test_diff_names_a_changed_shop_table(tmp_path: Path) -> None:
    from calcpad.runner.diff import diff_records

    job = _job(tmp_path)
    main(["run", str(job), "--out", str(tmp_path / "a"), "--no-pdf"])
    (tmp_path / "kyf_sections.csv").write_text(SHOP.replace("1.19,4.1", "1.18,4.0"), encoding="utf-8")
    main(["run", str(job), "--out", str(tmp_path / "b"), "--no-pdf"])
    old = json.loads((tmp_path / "a" / "rev-0" / "record.json").read_text(encoding="utf-8"))
    new = json.loads((tmp_path / "b" / "rev-0" / "record.json").read_text(encoding="utf-8"))
    d = diff_records(old, new)
    assert [c.item for c in d.data] == ["shop table kyf_sections.csv"]


def test_a_job_without_shop_sections_ignores_a_table_named_in_the_environment(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    from calcpad.eng.sections.shop import ENV_PATH, ENV_SHA256
    from calcpad.runner.execute import run_job

    (tmp_path / "stray.csv").write_text(SHOP, encoding="utf-8")
    monkeypatch.setenv(ENV_PATH, str(tmp_path / "stray.csv"))
    monkeypatch.setenv(ENV_SHA256, hashlib.sha256(SHOP.encode("utf-8")).hexdigest())
    job = tmp_path / "job.toml"
    job.write_text(JOB_HEAD + BRACE, encoding="utf-8")
    with pytest.raises(JobError) as err:  # the job is read without the stray table: the name is unknown
        load_job(job)
    assert "'L2-1/2x2-1/2x1/4 KYF' is not in the catalog" in str(err.value)
    # and a calc that reaches the kernel anyway (its inputs changed after reading) does not see it either
    job.write_text(JOB_HEAD + BRACE.replace("L2-1/2x2-1/2x1/4 KYF", "L2-1/2x2-1/2x1/4"), encoding="utf-8")
    loaded = load_job(job)
    calc = loaded.calcs[0]
    loaded.calcs[0] = dataclasses.replace(calc, inputs={**calc.inputs, "brace": "L2-1/2x2-1/2x1/4 KYF"})
    (outcome,) = run_job(loaded)
    assert outcome.error is not None and "is not in the catalog" in outcome.error["message"]
