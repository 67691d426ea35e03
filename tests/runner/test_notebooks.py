"""Stored notebooks: executed, in step with their .py source, and guarded by nbval."""

from __future__ import annotations

import json
import shutil
import subprocess
import sys
from pathlib import Path

import jupytext
import pytest

from .conftest import ROOT

NOTEBOOKS = sorted((ROOT / "notebooks").glob("*.ipynb"))
NBVAL = [
    "-m", "pytest", "-q", "--nbval", "--nbval-current-env", "-p", "no:randomly", "-p", "no:cacheprovider",
    "--nbval-sanitize-with", str(ROOT / "notebooks" / "nbval-sanitize.cfg"),
]


@pytest.mark.parametrize("path", NOTEBOOKS, ids=lambda p: p.stem)
def test_notebook_is_stored_executed(path: Path) -> None:
    nb = json.loads(path.read_text(encoding="utf-8"))
    code = [c for c in nb["cells"] if c["cell_type"] == "code"]
    assert code and all(isinstance(c.get("execution_count"), int) for c in code)


@pytest.mark.parametrize("path", NOTEBOOKS, ids=lambda p: p.stem)
def test_notebook_is_stored_without_run_noise(path: Path) -> None:
    # calcpad.runner.store numbers cell ids and drops execution timestamps, so re-storing is quiet in diffs
    cells = json.loads(path.read_text(encoding="utf-8"))["cells"]
    assert [c["id"] for c in cells] == [f"cell-{i:02d}" for i in range(len(cells))]
    assert not any("execution" in c.get("metadata", {}) for c in cells)
    views = [o["data"]["application/vnd.jupyter.widget-view+json"] for c in cells for o in c.get("outputs", [])
             if "application/vnd.jupyter.widget-view+json" in o.get("data", {})]
    assert all(v["model_id"].endswith("-widget") for v in views)


@pytest.mark.parametrize("path", NOTEBOOKS, ids=lambda p: p.stem)
def test_notebook_matches_py_source(path: Path) -> None:
    source = path.with_suffix(".py")
    assert source.exists(), f"{path.name} has no .py source"
    stored = json.loads(path.read_text(encoding="utf-8"))["cells"]
    cells = jupytext.read(source).cells  # jupytext: the reader store.py builds notebooks with
    assert [(c["cell_type"], "".join(c["source"])) for c in stored] == [(c.cell_type, c.source) for c in cells]


def _nbval(path: Path) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, *NBVAL, str(path)], cwd=path.parent, capture_output=True, text=True, timeout=600)


def test_nbval_fails_when_a_stored_value_changes(tmp_path: Path) -> None:
    original = ROOT / "notebooks" / "leg_bending.ipynb"
    good = tmp_path / "good" / "leg_bending.ipynb"
    bad = tmp_path / "bad" / "leg_bending.ipynb"
    for p in (good, bad):
        p.parent.mkdir()
        shutil.copy(original, p)
    nb = json.loads(bad.read_text(encoding="utf-8"))
    params = next(c for c in nb["cells"] if "parameters" in c["metadata"].get("tags", []))
    text = "".join(params["source"])
    assert 'P = "85 lbf"' in text
    params["source"] = text.replace('P = "85 lbf"', 'P = "95 lbf"')
    bad.write_text(json.dumps(nb, indent=1), encoding="utf-8")
    assert _nbval(good).returncode == 0, "control: the unchanged copy must pass"
    result = _nbval(bad)
    assert result.returncode != 0
    assert "failed" in result.stdout
