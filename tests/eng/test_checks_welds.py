"""Fillet and stitch welds, AISC 360-16 J2.

Sources:
* AISC Manual 15th ed. Part 8, Eqs. 8-2a/8-2b: E70 fillet weld, longitudinal load,
  φ·r_n = 1.392 kip/in and r_n/Ω = 0.928 kip/in per sixteenth of an inch of leg (from memory).
* AISC 360-16 Eq. J2-5: transverse load factor 1 + 0.50 sin^1.5(90°) = 1.5.
* AISC 360-16 Table J2.4 minimum sizes 1/8, 3/16, 1/4, 5/16 in (from memory); J2.2b maximum
  size t or t - 1/16 in; minimum length 4w; intermittent segments at least 4w and 1-1/2 in.
"""

from __future__ import annotations

import pytest

from calcpad import Sheet
from calcpad.eng.checks import add_fillet_weld_check, add_stitch_weld_check

TABLE_REL = 0.001  # Part 8 constants printed to 4 significant figures


@pytest.mark.parametrize(("method", "per_sixteenth"), [("LRFD", 1.392), ("ASD", 0.928)])
def test_manual_part8_per_sixteenth(method, per_sixteenth):
    sh = Sheet("weld", method=method)
    add_fillet_weld_check(sh, R="10 kip", w="0.25 in", L="10 in", t_p="0.5 in")
    assert sh["R_c"].to("kip").magnitude == pytest.approx(per_sixteenth * 4 * 10, rel=TABLE_REL)


def test_transverse_factor_1_5():
    a, b = Sheet("w0"), Sheet("w90")
    add_fillet_weld_check(a, R="10 kip", w="0.25 in", L="10 in", t_p="0.5 in", theta="0 degree")
    add_fillet_weld_check(b, R="10 kip", w="0.25 in", L="10 in", t_p="0.5 in", theta="90 degree")
    assert b["R_c"].to("kip").magnitude / a["R_c"].to("kip").magnitude == pytest.approx(1.5, rel=1e-12)


@pytest.mark.parametrize(("t", "wmin"), [("0.1875 in", 0.125), ("0.25 in", 0.125), ("0.375 in", 0.1875),
                                        ("0.625 in", 0.25), ("1.0 in", 0.3125)])
def test_table_j2_4_minimum_size(t, wmin):
    sh = Sheet("wmin")
    add_fillet_weld_check(sh, R="1 kip", w="0.3125 in", L="4 in", t_p=t, t_e="1 in")
    assert sh["w_min"].to("in").magnitude == pytest.approx(wmin, rel=1e-12)


@pytest.mark.parametrize(("t", "wmax"), [("0.1875 in", 0.1875), ("0.5 in", 0.4375)])
def test_j2_2b_maximum_size(t, wmax):
    sh = Sheet("wmax")
    add_fillet_weld_check(sh, R="1 kip", w="0.125 in", L="4 in", t_p=t)
    assert sh["w_max"].to("in").magnitude == pytest.approx(wmax, rel=1e-12)


def test_oversize_weld_is_ng():
    sh = Sheet("ng")
    add_fillet_weld_check(sh, R="1 kip", w="0.25 in", L="4 in", t_p="0.1875 in")
    status = {c.key: c.status for c in sh.summary()}
    assert status["ratio_wmax"] == "NG"


def test_end_loaded_beta_eq_j2_1():
    # L = 150 w: beta = 1.2 - 0.002*150 = 0.9 (AISC 360-16 Eq. J2-1).
    sh = Sheet("beta")
    add_fillet_weld_check(sh, R="1 kip", w="0.25 in", L="37.5 in", t_p="0.5 in", end_loaded=True)
    assert sh["L_e"].to("in").magnitude == pytest.approx(0.9 * 37.5, rel=1e-12)


def test_stitch_weld_shear_flow_by_hand():
    # q = V Q / I; capacity n * (r_n/Omega) * L_seg / s with r_n/Omega = 0.928 kip/in per sixteenth (Part 8).
    sh = Sheet("stitch")
    add_stitch_weld_check(sh, V="6 kip", Q="4 in^3", I="50 in^4", w="0.1875 in", L_seg="2 in", s="6 in", n=2)
    assert sh["q"].to("kip/in").magnitude == pytest.approx(6 * 4 / 50, rel=1e-12)
    assert sh["q_c"].to("kip/in").magnitude == pytest.approx(2 * 0.928 * 3 * 2 / 6, rel=TABLE_REL)
    assert sh["L_segmin"].to("in").magnitude == pytest.approx(1.5, rel=1e-12)
