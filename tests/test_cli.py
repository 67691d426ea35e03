"""The command line, run in-process through main()."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest

from calcpad.cli import main
from calcpad.runner.job import load_job
from calcpad.runner.record import JOB_RECORD_FORMAT
from tests.runner.conftest import EXAMPLE, JOB_HEAD, ROOT, TINY_TEMPLATE, tiny_calc


@pytest.fixture
def tiny_env(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    d = tmp_path / "templates"
    d.mkdir()
    (d / "tiny.py").write_text(TINY_TEMPLATE, encoding="utf-8")
    monkeypatch.setenv("CALCPAD_TEMPLATES", str(d))
    return d


def test_run_example_job_writes_submittal(tmp_path: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    monkeypatch.chdir(ROOT)
    out = tmp_path / "demo"
    assert main(["run", "examples/harbor_ridge_condenser_stand.toml", "--out", str(out), "--no-pdf"]) == 0  # PDF: tests/report
    assert sorted(p.name for p in out.iterdir()) == [".calcpad-lock", ".calcpad-manifest.json", "rev-A"]
    out = out / "rev-A"  # the example job is revision A
    # the screen posts come from a member table: its results beside the submittal
    assert sorted(p.name for p in out.iterdir()) == ["record.json", "results-harbor_ridge_screen_posts.csv",
                                                     "results-harbor_ridge_screen_posts.xlsx", "submittal.html"]
    record = json.loads((out / "record.json").read_text())
    assert record["format"] == JOB_RECORD_FORMAT and record["summary"]["status"] == "OK"
    assert len(record["calcs"]) >= 8
    html = (out / "submittal.html").read_text()
    for text in ("HRM-2417", "Northgate Cold Storage Co.", "R. Lindqvist, P.E.", "AISC 360-16", "CAUTION", "Contents", "Summary of checks"):
        assert text in html
    assert "<script" not in html
    assert html.count('<section class="calc"') == 6  # one per [[calcs]] table: members of a table share inputs (typical)
    assert f"submittal written: {out / 'submittal.html'}" in capsys.readouterr().err


def test_bad_job_exits_2_and_writes_nothing(tmp_path: Path, tiny_env: Path, capsys: pytest.CaptureFixture[str]) -> None:
    job = tmp_path / "bad.toml"
    job.write_text(JOB_HEAD + tiny_calc(L='"84 lbf"') + tiny_calc("M1"))
    out = tmp_path / "out"
    assert main(["run", str(job), "--out", str(out)]) == 2
    err = capsys.readouterr().err
    assert "calcs[1].inputs.L" in err and "calcs[2].member" in err and "Traceback" not in err
    assert not out.exists()


def test_malformed_toml_exit_2(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    job = tmp_path / "bad.toml"
    job.write_text("[job\n")
    assert main(["run", str(job), "--out", str(tmp_path / "o")]) == 2
    assert "line 1, column 5" in capsys.readouterr().err


def test_ng_exits_1(tmp_path: Path, tiny_env: Path) -> None:
    assert main(["run", "tiny", "--set", "P=300 lbf", "--out", str(tmp_path / "o"), "--no-pdf"]) == 1
    assert json.loads((tmp_path / "o" / "rev-draft" / "record.json").read_text())["summary"]["ng"] == 1


def test_template_run_json(tiny_env: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["run", str(tiny_env / "tiny.py"), "--set", "L=12 in", "--json"]) == 0
    record = json.loads(capsys.readouterr().out)
    assert record["calcs"][0]["inputs"]["L"] == {"typed": "12 in", "value": 12.0, "unit": "in"}
    assert record["calcs"][0]["inputs"]["P"] == {"typed": None, "value": 100.0, "unit": "lbf"}  # template default


def test_template_run_bad_set(tiny_env: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["run", "tiny", "--set", "Q=1 in"]) == 2
    assert "unknown parameter 'Q'" in capsys.readouterr().err


def test_failing_cell_reported_other_calcs_run(tmp_path: Path, tiny_env: Path, capsys: pytest.CaptureFixture[str]) -> None:
    job = tmp_path / "job.toml"
    job.write_text(JOB_HEAD + tiny_calc("A1", mode='"fail"') + tiny_calc("A2"))
    out = tmp_path / "out"
    assert main(["run", str(job), "--out", str(out), "--no-pdf"]) == 2
    captured = capsys.readouterr()
    assert "template 'tiny', cell 4: ValueError: requested failure" in captured.err
    out = out / "rev-0"
    record = json.loads((out / "record.json").read_text())
    assert [c["status"] for c in record["calcs"]] == ["ERROR", "OK"]
    assert "INCOMPLETE" in (out / "submittal.html").read_text()


def test_notebooks_flag_keeps_executed_notebooks(tmp_path: Path, tiny_env: Path) -> None:
    out = tmp_path / "out"
    assert main(["run", "tiny", "--member", "B7", "--out", str(out), "--notebooks", "--no-pdf"]) == 0
    out = out / "rev-draft"
    (nb,) = (out / "notebooks").iterdir()
    assert nb.name == "01_tiny_B7.ipynb"
    cells = json.loads(nb.read_text())["cells"]
    assert all(c["execution_count"] for c in cells if c["cell_type"] == "code")  # the tiny template has no what-if cell
    assert json.loads((out / "record.json").read_text())["run"]["mode"] == "kernel"


def test_templates_lists_parameters(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["templates"]) == 0
    out = capsys.readouterr().out
    assert "leg_bending" in out and "FS_req" in out and "6 in to 30 ft" in out


def test_new_writes_valid_job_and_refuses_overwrite(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    path = tmp_path / "job.toml"
    assert main(["new", str(path), "--template", "leg_bending", "--template", "wind_rooftop_stand"]) == 0
    job = load_job(path)
    assert [c.template.name for c in job.calcs] == ["leg_bending", "wind_rooftop_stand"]
    before = path.read_text()
    assert main(["new", str(path)]) == 2
    assert "not overwriting" in capsys.readouterr().err
    assert path.read_text() == before


def test_demo_still_runs(tmp_path: Path) -> None:
    assert main(["demo", "--out", str(tmp_path)]) == 0
    assert (tmp_path / "rev-demo" / "leg_bending.html").exists()


def test_cli_start_does_not_import_notebook_tooling() -> None:
    code = "import sys, calcpad.cli, calcpad.runner.execute, calcpad.runner.record; print(sorted(m for m in ('nbclient', 'nbformat', 'papermill') if m in sys.modules))"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True, cwd=ROOT).stdout
    assert out.strip() == "[]"


def test_example_exists_and_is_invented() -> None:
    text = EXAMPLE.read_text().lower()
    assert "harbor ridge mechanical" in text and "solar" not in text
