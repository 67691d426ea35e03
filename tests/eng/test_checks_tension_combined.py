"""Tension (AISC 360-16 D2) and combined force interaction (H1-1a/H1-1b).

Sources:
* AISC Design Examples v15.0, Example D.1 (W8x21, A992, A_g = 6.16 in^2): tensile yielding
  φ_t·P_n = 277 kips, P_n/Ω_t = 184 kips, from memory.
* Rupture and interaction values: independent arithmetic of Eqs. D2-2, D3-1, H1-1a, H1-1b.
"""

from __future__ import annotations

import pytest

from calcpad import Sheet
from calcpad.eng.checks import add_interaction_check, add_tension_check
from calcpad.eng.sections import get_section

TABLE_REL = 0.005


@pytest.mark.parametrize(("method", "expected"), [("LRFD", 277.0), ("ASD", 184.0)])
def test_design_example_d1_yielding(method, expected):
    sh = Sheet("D.1", method=method)
    add_tension_check(sh, T="100 kip", A_g="6.16 in^2", F_y="50 ksi", F_u="65 ksi")
    assert sh["T_cy"].to("kip").magnitude == pytest.approx(expected, rel=TABLE_REL)


def test_rupture_governs_by_hand():
    sh = Sheet("rupture", method="LRFD")
    add_tension_check(sh, get_section("L4x4x1/4"), T="20 kip", A_n="1.6 in^2", U=0.8, material="ASTM A36")
    ae = 0.8 * 1.6
    assert sh["A_e"].to("in^2").magnitude == pytest.approx(ae, rel=1e-12)
    assert sh["T_cr"].to("kip").magnitude == pytest.approx(0.75 * 58 * ae, rel=1e-12)  # A36 Fu = 58 ksi, common practice
    assert sh["T_c"].to("kip").magnitude == pytest.approx(min(0.75 * 58 * ae, 0.9 * 36 * get_section("L4x4x1/4").props.A), rel=1e-9)


@pytest.mark.parametrize(("pr", "eq"), [(60.0, "a"), (10.0, "b")])
def test_interaction_h1_by_hand(pr, eq):
    pc, mrx, mcx, mry, mcy = 100.0, 20.0, 80.0, 5.0, 40.0
    sh = Sheet("H1")
    add_interaction_check(sh, P_r=f"{pr} kip", P_c=f"{pc} kip", M_rx=f"{mrx} kip*ft", M_cx=f"{mcx} kip*ft",
                          M_ry=f"{mry} kip*ft", M_cy=f"{mcy} kip*ft")
    m = mrx / mcx + mry / mcy
    expected = pr / pc + 8 / 9 * m if eq == "a" else pr / (2 * pc) + m
    assert sh["U_H1"].magnitude == pytest.approx(expected, rel=1e-12)
    assert sh.summary()[0].ratio == pytest.approx(expected, rel=1e-12)
