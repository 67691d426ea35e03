"""Leg base plate under uplift with biaxial moment (calcpad.eng.checks.leg_base).

Sources: the elastic bolt group of a rigid plate (F_i = N/n + M_x y_i/Σy² + M_y x_i/Σx², common
practice, e.g. AISC Manual Part 7 elastic method, from memory), computed here independently with
numpy over the four rod positions; plate bending by the cantilever of AISC Design Guide 1, 2nd
ed., Eq. 3.4.7 form t = sqrt(4 T x/(φ F_y b)) with a 45° effective width b = 2x (common
practice), φ = 0.90, Ω = 1.67 (from memory).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from calcpad import Sheet
from calcpad.eng.checks import CheckInputError, add_leg_base_uplift_check


def _rod_forces(N, Mx, My, f):
    xy = np.array([[f, f], [f, -f], [-f, f], [-f, -f]])
    return N / 4 + Mx * xy[:, 1] / (xy[:, 1] ** 2).sum() + My * xy[:, 0] / (xy[:, 0] ** 2).sum()


@pytest.mark.parametrize("N, Mx, My", [(400.0, 1500.0, -2000.0), (-600.0, 3000.0, 0.0), (0.0, -1000.0, -1000.0)])
def test_corner_rod_force_is_the_largest_of_the_elastic_group(N, Mx, My) -> None:
    sh = Sheet("base", method="LRFD")
    add_leg_base_uplift_check(sh, N_t=f"{N} lbf", M_x=f"{Mx} lbf*in", M_y=f"{My} lbf*in", f="2.75 in", t_p="0.5 in",
                              D_leg="2.375 in", F_y="36 ksi")
    expected = _rod_forces(N, Mx, My, 2.75).max()
    assert sh["T_1"].to("lbf").magnitude == pytest.approx(expected, rel=1e-9)
    x = math.sqrt(2) * 2.75 - 2.375 / 2
    T = max(expected, 0.0) / 1000
    assert sh["t_req"].to("in").magnitude == pytest.approx(math.sqrt(4 * T * x / (0.9 * 36 * 2 * x)), rel=1e-9)


def test_moment_at_45_degrees_loads_the_corner_rod_by_root_two() -> None:
    M = 2000.0
    sh = Sheet("base", method="ASD")
    add_leg_base_uplift_check(sh, N_t="0 lbf", M_x=f"{M / math.sqrt(2)} lbf*in", M_y=f"{M / math.sqrt(2)} lbf*in", f="3 in",
                              t_p="0.375 in", D_leg="2.375 in", F_y="36 ksi")
    assert sh["T_1"].to("lbf").magnitude == pytest.approx(math.sqrt(2) * M / (4 * 3), rel=1e-9)
    x = math.sqrt(2) * 3 - 2.375 / 2
    assert sh["t_req"].to("in").magnitude == pytest.approx(math.sqrt(4 * sh["T_1"].to("kip").magnitude * x / (36 / 1.67 * 2 * x)))


def test_compression_without_moment_leaves_no_rod_tension() -> None:
    sh = Sheet("base", method="LRFD")
    add_leg_base_uplift_check(sh, N_t="-500 lbf", M_x="0 lbf*in", M_y="0 lbf*in", f="2.75 in", t_p="0.5 in", D_leg="2.375 in",
                              F_y="36 ksi")
    assert sh["T_r"].to("lbf").magnitude == 0.0 and sh["t_req"].to("in").magnitude == 0.0


def test_rods_inside_the_leg_are_refused() -> None:
    with pytest.raises(CheckInputError, match="f"):
        add_leg_base_uplift_check(Sheet("b"), N_t="1 kip", M_x="0 lbf*in", M_y="0 lbf*in", f="0.75 in", t_p="0.5 in",
                                  D_leg="2.375 in", F_y="36 ksi")
