"""CLI what-ifs on a job (--set MARK.NAME=...), hand-calc printing, and authoring commands
(calcpad lab, calcpad template new/store).

Hand check of the leg (plain floats, never through calcpad): Pipe 1-1/2 Std, D_o = 1.900 in,
t_nom = 0.145 in (ASME B36.10M, NPS 1-1/2 Std wall); design wall t = 0.93·t_nom (AISC 360-16
B4.2); D_i = D_o − 2t, A = π/4·(D_o² − D_i²), I = π/64·(D_o⁴ − D_i⁴) = 0.2929 in⁴; M_1 = P·L;
σ = N/A + B2·M_1·(D_o/2)/I (common practice). B2 of the fixed-free leg by AISC 360-16
Appendix 8: B2 = 1/(1 − α·P_story/P_e,story) (Eq. A-8-6), α = 1.6 for ASD, P_e,story = R_M·H·L/Δ_H
(Eq. A-8-7) with R_M = 0.85 (Eq. A-8-8, the leg is the whole sway system) and Δ_H = H·L³/(3EI)
(cantilever, elastic beam theory), E = 29,000 ksi. For member L1 of the example job (L = 30 in,
N = 115 lbf) with P = 140 lbf: P_e,story = 24.07 kip, B2 = 1.0077, σ = 0.154 + 13.73 = 13.88 ksi.
"""

from __future__ import annotations

import json
import math
import re
import subprocess
import sys
from pathlib import Path

import pytest

from calcpad.cli import main
from tests.runner.conftest import EXAMPLE, ROOT


def test_job_set_runs_only_the_changed_calc_and_prints_its_hand_calc(capsys: pytest.CaptureFixture[str], tmp_path: Path,
                                                                      monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.chdir(tmp_path)
    rc = main(["run", str(EXAMPLE), "--set", "L1.P=140 lbf"])
    out = capsys.readouterr().out
    assert rc == 0
    D_o, t, L, P, N, E = 1.9, 0.93 * 0.145, 30.0, 140.0, 115.0, 29_000_000.0  # in, lbf, psi
    D_i = D_o - 2 * t
    area = math.pi / 4 * (D_o**2 - D_i**2)
    inertia = math.pi / 64 * (D_o**4 - D_i**4)
    p_e_story = 0.85 * 3 * E * inertia / L**2  # R_M·H·L/Δ_H with Δ_H = H·L³/(3EI)
    b2 = 1 / (1 - 1.6 * N / p_e_story)
    sigma = N / area + b2 * P * L * (D_o / 2) / inertia
    assert f"{sigma / 1000:.2f} ksi" in out  # 13.88 ksi by hand
    assert "P = 140 lbf" in out and "1 calcs" in out
    assert "L3 - " not in out and "member L3" not in out  # only the changed calc (its note names the other legs)
    assert not (tmp_path / "build").exists()  # a what-if writes nothing without --out


def test_job_set_ng_exits_1(capsys: pytest.CaptureFixture[str], tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.chdir(tmp_path)
    assert main(["run", str(EXAMPLE), "--set", "L1.P=900 lbf"]) == 1
    assert "NG" in capsys.readouterr().out


@pytest.mark.parametrize(
    ("item", "expected"),
    [
        ("L1.P=-50 lbf", "outside the stated range"),
        ("L1.t=1.2 in", "0 < t < D_o/2"),
        ("ZZ.P=1 lbf", "no calc for member 'ZZ'"),
        ("L1.Q=1 lbf", "'Q' is not a parameter"),
        ("P=1 lbf", "expected MARK.NAME"),
        ("L1.P=3 ft", "expected a force"),
    ],
)
def test_job_set_bad_input_exits_2_with_a_message(item: str, expected: str, capsys: pytest.CaptureFixture[str], tmp_path: Path,
                                                  monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.chdir(tmp_path)
    assert main(["run", str(EXAMPLE), "--set", item]) == 2
    err = capsys.readouterr().err
    assert expected in err and "Traceback" not in err
    assert not (tmp_path / "build").exists()


def test_template_set_prints_the_hand_calc_not_bare_values(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["run", "leg_bending", "--set", "P=140 lbf", "--set", "L=30 in"]) == 0
    out = capsys.readouterr().out
    assert "Base moment, first order: M_1 = P·L = 140 lbf × 30 in" in out
    D_i = 1.9 - 2 * 0.93 * 0.145  # design wall, AISC 360-16 B4.2 (module docstring)
    sigma = 140 * 30 * 0.95 / (math.pi / 64 * (1.9**4 - D_i**4))  # N = 0 by default, so B2 = 1
    assert f"{sigma / 1000:.2f} ksi" in out  # 13.62 ksi by hand
    assert "FS = " in out and "OK" in out
    d_i_lines = [line for line in out.splitlines() if "D_i = " in line and "Inside diameter" in line]
    assert d_i_lines and all("D_o - (2·t)" in line and f"{D_i:.3f} in" in line for line in d_i_lines)
    assert not re.search(r"^\s*D_i = [0-9.]+ in\s*$", out, re.M)  # no bare "name = value" lines


# ----------------------------------------------------------------------------- authoring


def test_template_new_writes_a_template_that_reads_and_runs(tmp_path: Path, monkeypatch: pytest.MonkeyPatch,
                                                            capsys: pytest.CaptureFixture[str]) -> None:
    from calcpad.runner.template import load_template

    assert main(["template", "new", "bracket_bending", "--dir", str(tmp_path)]) == 0
    path = tmp_path / "bracket_bending.py"
    tpl = load_template(path)
    p = tpl.parameters["P"]
    assert p.lower is not None and p.upper is not None and not p.note  # every range reads
    assert all(not q.note for q in tpl.parameters.values())
    assert any("what_if(" in c.source for c in tpl.code_cells)
    monkeypatch.setenv("CALCPAD_TEMPLATES", str(tmp_path))
    capsys.readouterr()
    # 250 lbf × 18 in / (2 in × (3 in)² / 6) = 1.5 ksi; FS = 36/1.5 = 24 (hand, common practice)
    assert main(["run", "bracket_bending"]) == 0
    out = capsys.readouterr().out
    assert "1.500 ksi" in out and "24.00" in out


def test_template_new_never_overwrites_and_checks_the_name(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    target = tmp_path / "mine.py"
    target.write_text("# not calcpad's\n", encoding="utf-8")
    assert main(["template", "new", "mine", "--dir", str(tmp_path)]) == 2
    assert target.read_text(encoding="utf-8") == "# not calcpad's\n"
    assert "not overwriting" in capsys.readouterr().err
    assert main(["template", "new", "Bad-Name", "--dir", str(tmp_path)]) == 2
    assert "lower-case" in capsys.readouterr().err


def test_template_store_pairs_py_and_ipynb_and_nbval_passes(tmp_path: Path) -> None:
    assert main(["template", "new", "bracket_bending", "--dir", str(tmp_path)]) == 0
    assert main(["template", "store", str(tmp_path / "bracket_bending.py")]) == 0
    nb = json.loads((tmp_path / "bracket_bending.ipynb").read_text(encoding="utf-8"))
    assert nb["metadata"]["kernelspec"]["name"] == "calcpad"
    assert [c["id"] for c in nb["cells"]] == [f"cell-{i:02d}" for i in range(len(nb["cells"]))]
    assert all(isinstance(c.get("execution_count"), int) for c in nb["cells"] if c["cell_type"] == "code")
    out = subprocess.run(
        [sys.executable, "-m", "pytest", "-q", "--nbval", "--nbval-current-env", "-p", "no:randomly", "-p", "no:cacheprovider",
         "--nbval-sanitize-with", str(ROOT / "notebooks" / "nbval-sanitize.cfg"), str(tmp_path / "bracket_bending.ipynb")],
        cwd=tmp_path, capture_output=True, text=True, timeout=600, env={**__import__("os").environ, "CALCPAD_TEMPLATES": str(tmp_path)},
    )
    assert out.returncode == 0, out.stdout[-2000:]


def test_stored_templates_ask_for_the_calcpad_kernel() -> None:
    for path in sorted((ROOT / "notebooks").glob("*.ipynb")):
        nb = json.loads(path.read_text(encoding="utf-8"))
        assert nb["metadata"]["kernelspec"]["name"] == "calcpad", path.name


def test_lab_dry_run_names_jupyterlab_on_the_library(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["lab", "--dry-run"]) == 0
    out = capsys.readouterr().out
    assert "-m jupyterlab" in out and out.strip().endswith("notebooks")
    assert main(["lab", "/no/such/folder"]) == 2
