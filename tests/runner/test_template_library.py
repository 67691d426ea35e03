"""Templates are code: a job names one from the library folders and never points at a file."""

from __future__ import annotations

import json
import os
from pathlib import Path

import pytest

from calcpad.cli import main
from calcpad.runner.template import TemplateError, find_template, library_template, list_templates

from .conftest import JOB_HEAD

EVIL = '''\
# %% [markdown]
# # Looks like a template

# %% tags=["parameters"]
P = "100 lbf"  # load; 0 < P <= 1 kip

# %%
from pathlib import Path
Path({marker!r}).write_text("code from outside the library ran")
'''


def _evil(folder: Path, marker: Path, name: str = "evil") -> Path:
    folder.mkdir(parents=True, exist_ok=True)
    path = folder / f"{name}.py"
    path.write_text(EVIL.format(marker=str(marker)))
    return path


def _evil_ipynb(folder: Path, marker: Path) -> Path:
    folder.mkdir(parents=True, exist_ok=True)
    nb = {
        "cells": [
            {"cell_type": "markdown", "metadata": {}, "source": "# Looks like a template"},
            {"cell_type": "code", "metadata": {"tags": ["parameters"]}, "source": 'P = "100 lbf"  # load; 0 < P <= 1 kip', "outputs": [], "execution_count": None},
            {"cell_type": "code", "metadata": {}, "source": f"open({str(marker)!r}, 'w').write('ran')", "outputs": [], "execution_count": None},
        ],
        "metadata": {},
        "nbformat": 4,
        "nbformat_minor": 5,
    }
    path = folder / "evil_nb.ipynb"
    path.write_text(json.dumps(nb))
    return path


def _job(template: str) -> str:
    return JOB_HEAD + f'\n[[calcs]]\ntemplate = {json.dumps(template)}\nmember = "M1"\n[calcs.inputs]\nP = "100 lbf"\n'


@pytest.fixture
def outside(tmp_path: Path, tiny_env: Path, monkeypatch: pytest.MonkeyPatch) -> dict[str, Path]:
    """A library (tiny_env) plus code outside it: a job folder with a template beside the job,
    a folder elsewhere, an .ipynb, a library entry that is a link to the outside."""
    marker = tmp_path / "MARKER"
    job_dir = tmp_path / "job"
    beside = _evil(job_dir, marker)
    far = _evil(tmp_path / "elsewhere" / "pkg", marker)
    nb = _evil_ipynb(tmp_path / "elsewhere", marker)
    os.symlink(far, tiny_env / "linked.py")
    monkeypatch.chdir(job_dir)
    return {"marker": marker, "job_dir": job_dir, "beside": beside, "far": far, "nb": nb}


@pytest.mark.parametrize(
    ("template", "message"),
    [
        ("evil.py", "write the name without the file suffix"),
        ("./evil.py", "not a path"),
        ("../elsewhere/pkg/evil", "not a path"),
        ("FAR", "not a path"),  # absolute path
        ("NB", "not a path"),  # absolute path to an .ipynb
        ("..", "not a path"),
        ("evil", "unknown template 'evil'"),  # beside the job, but not in the library
        ("linked", "resolves outside its template folder"),
        ("sub\\evil", "not a path"),
        ("", "expected a template name"),
    ],
)
def test_job_pointing_outside_library_refused(outside: dict[str, Path], capsys: pytest.CaptureFixture[str], template: str, message: str) -> None:
    template = {"FAR": str(outside["far"]), "NB": str(outside["nb"])}.get(template, template)
    job = outside["job_dir"] / "job.toml"
    job.write_text(_job(template))
    assert main(["run", str(job), "--out", str(outside["job_dir"].parent / "out")]) == 2
    err = capsys.readouterr().err
    assert "calcs[1].template" in err and message in err and "Traceback" not in err
    assert not outside["marker"].exists()
    assert not (outside["job_dir"].parent / "out").exists()


def test_command_line_template_path_outside_library_refused(outside: dict[str, Path], capsys: pytest.CaptureFixture[str]) -> None:
    for target in (str(outside["beside"]), "evil.py", str(outside["nb"]), "../elsewhere/pkg/evil.py"):
        assert main(["run", target, "--set", "P=50 lbf"]) == 2, target
        err = capsys.readouterr().err
        assert "Traceback" not in err and ("not in a template folder" in err or "without the file suffix" in err), err
    assert not outside["marker"].exists()


def test_registered_folder_is_trusted(outside: dict[str, Path]) -> None:
    """The same file runs once its folder is registered with --templates (code you trust)."""
    job = outside["job_dir"] / "job.toml"
    job.write_text(_job("evil"))
    out = outside["job_dir"].parent / "out"
    assert main(["run", str(job), "--templates", str(outside["job_dir"]), "--out", str(out)]) == 0
    assert outside["marker"].read_text() == "code from outside the library ran"


def test_library_listing_and_lookup(outside: dict[str, Path], tiny_env: Path) -> None:
    found = list_templates()
    assert found["tiny"] == tiny_env / "tiny.py" and "leg_bending" in found
    assert "linked" not in found and "evil" not in found
    assert find_template("evil", [outside["job_dir"]]) == outside["beside"]
    assert library_template(tiny_env / "tiny.py") == tiny_env / "tiny.py"
    with pytest.raises(TemplateError, match="not in a template folder"):
        library_template(outside["far"])
    with pytest.raises(TemplateError, match="resolves outside"):
        find_template("linked")
