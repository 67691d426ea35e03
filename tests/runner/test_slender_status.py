"""A check "OK, above recommended slenderness" passes (exit 0) and is counted in the summary.

KL/r of the post: 2.1 × 360 in / r (HSS4x4x1/4, r ≈ 1.52 in) ≈ 497 > 200 (AISC 360-16 E2 User Note)."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from calcpad.cli import main
from calcpad.core.results import OK_SLENDER
from tests.runner.conftest import ROOT


def test_slender_post_passes_with_its_own_status(tmp_path: Path, monkeypatch: pytest.MonkeyPatch,
                                                 capsys: pytest.CaptureFixture[str]) -> None:
    monkeypatch.chdir(ROOT)
    out = tmp_path / "o"
    code = main(["run", "post_combined", "--set", "L=30 ft", "--set", "H=0.05 kip", "--set", "P=0.3 kip", "--out", str(out), "--no-pdf"])
    assert code == 0
    record = json.loads((out / "rev-draft" / "record.json").read_text())
    statuses = [ch["status"] for c in record["calcs"] for ch in c["checks"]]
    assert statuses.count(OK_SLENDER) == 1
    assert record["summary"]["slender"] == 1 and record["summary"]["ng"] == 0 and record["summary"]["status"] == "OK"
    assert "above recommended slenderness" in capsys.readouterr().out
