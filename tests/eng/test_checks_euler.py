"""Euler buckling load (calcpad/eng/checks/euler.py) and the E3 transition step of the compression check.

Oracles: the lowest eigenvalue of a pinned-pinned column, EI w'''' + P w'' = 0, found with
scipy.linalg.eigh on a central-difference model (independent of the closed form), and the text of
AISC 360-16 E3: inelastic buckling (Eq. E3-2) when L_c/r <= 4.71 sqrt(E/F_y), 113.4 for F_y = 50 ksi
and 133.7 for F_y = 36 ksi (E = 29,000 ksi; values by hand).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import scipy.linalg

from calcpad import Sheet
from calcpad.eng.checks import CheckInputError, add_compression_check, add_euler_load
from calcpad.eng.sections import get_section

SECTION = {"A": "3.37 in^2", "Ix": "7.80 in^4", "Iy": "3.20 in^4", "rx": "1.52 in", "ry": "0.975 in"}


def _fd_euler(EI: float, L: float, n: int = 400) -> float:
    """Lowest P of -EI w'' = P w, w(0) = w(L) = 0 (pinned column), by central differences."""
    h = L / n
    main = np.full(n - 1, 2.0) / h**2
    off = np.full(n - 2, -1.0) / h**2
    lam = scipy.linalg.eigh_tridiagonal(main, off, select="i", select_range=(0, 0), eigvals_only=True)[0]
    return EI * lam


@pytest.mark.parametrize(("axis", "I", "K"), [("x", 7.80, 1.0), ("y", 3.20, 2.0)])
def test_euler_load_matches_the_column_eigenvalue(axis, I, K):
    sh = Sheet("Euler")
    name = add_euler_load(sh, SECTION, kind="rect_hss", L="10 ft", K=K, axis=axis)
    got = float(sh[name].to("kip").magnitude)
    expected = _fd_euler(29000.0 * I, K * 120.0)  # kip, in
    assert got == pytest.approx(expected, rel=1e-4)


def test_euler_about_the_minor_principal_axis_of_an_angle_uses_I_z():
    angle = get_section("L3x3x1/4")
    sh = Sheet("Euler angle")
    name = add_euler_load(sh, angle, L="4 ft", axis="min", material="ASTM A36")
    I_z = angle.props.I_min
    assert float(sh[name].to("kip").magnitude) == pytest.approx(math.pi**2 * 29000.0 * I_z / 48.0**2, rel=1e-9)
    with pytest.raises(CheckInputError, match="axis"):
        add_euler_load(Sheet("x"), angle, L="4 ft", axis="w")


@pytest.mark.parametrize(("F_y", "limit", "L"), [("50 ksi", 113.4, "12 ft"), ("50 ksi", 113.4, "15 ft"), ("36 ksi", 133.7, "12 ft")])
def test_e3_transition_is_a_named_step_that_chooses_the_branch(F_y, limit, L):
    sh = Sheet("Column")
    add_compression_check(sh, get_section("HSS4x4x1/4"), P="5 kip", L=L, K=1.0, F_y=F_y)
    assert float(sh["KL_r_lim"].magnitude) == pytest.approx(limit, abs=0.05)
    kl_r = float(sh["KL_r"].magnitude)
    result = sh.evaluate()
    branch = next(s for s in result.steps if getattr(s, "name", None) == "F_cr")
    assert "KL_r_lim" in str(branch.cases[0].condition)
    assert ("E3-2" in branch.cases[branch.chosen].label) == (kl_r <= limit)
