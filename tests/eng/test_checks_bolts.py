"""Bolts in bearing, AISC 360-16 J3, against AISC Manual 15th ed. tables (values from memory):

* Table 7-1, available shear strength per bolt, single shear: 3/4 in A325-N φr_n = 17.9 kips,
  r_n/Ω = 11.9 kips; 3/4 in A325-X 22.5 / 15.0 kips; 7/8 in A325-N 24.3 / 16.2 kips.
* Table 7-4, bearing strength at bolt holes per inch of thickness, 3 in spacing, F_u = 58 ksi,
  3/4 in bolt, standard holes: φr_n = 78.3 kips/in, r_n/Ω = 52.2 kips/in (bearing, 2.4 d t F_u).
* Table 7-5, same at an edge distance of 1-1/4 in: φr_n = 44.0 kips/in, r_n/Ω = 29.4 kips/in
  (tearout, 1.2 l_c t F_u with l_c = 1-1/4 - 13/16/2).
Tolerance: half a unit of the table's last digit plus the Manual's rounding of A_b to 3 figures
(7/8 in: 0.601 in^2 vs pi/4*0.875^2 = 0.6013 in^2), TABLE_ABS = 0.06.
"""

from __future__ import annotations

import pytest

from calcpad import Sheet
from calcpad.core.errors import CalcpadError
from calcpad.eng.checks import add_bolt_line_check

TABLE_ABS = 0.06


def _sheet(method, **kw):
    sh = Sheet("bolts", method=method)
    args = {"R": "1 kip", "d_b": "3/4 in", "n": 1, "t": "1 in", "F_u": "58 ksi", "s": "3 in", "L_e": "4 in"} | kw
    add_bolt_line_check(sh, **args)
    return sh


@pytest.mark.parametrize(
    ("d_b", "threads", "lrfd", "asd"),
    [("3/4 in", "N", 17.9, 11.9), ("3/4 in", "X", 22.5, 15.0), ("7/8 in", "N", 24.3, 16.2)],
)
def test_bolt_shear_manual_table_7_1(d_b, threads, lrfd, asd):
    assert _sheet("LRFD", d_b=d_b, threads=threads)["R_cv"].to("kip").magnitude == pytest.approx(lrfd, abs=TABLE_ABS)
    assert _sheet("ASD", d_b=d_b, threads=threads)["R_cv"].to("kip").magnitude == pytest.approx(asd, abs=TABLE_ABS)


def test_double_shear_doubles():
    one = _sheet("LRFD")["R_cv"].to("kip").magnitude
    assert _sheet("LRFD", shear_planes=2)["R_cv"].to("kip").magnitude == pytest.approx(2 * one, rel=1e-12)


@pytest.mark.parametrize(("method", "per_inch"), [("LRFD", 78.3), ("ASD", 52.2)])
def test_bearing_at_3_in_spacing_table_7_4(method, per_inch):
    # two bolts, 1 in thick part: R_nb = r_n1 + r_n2; the inner bolt is the Table 7-4 case
    sh = _sheet(method, n=2, L_e="4 in")
    factor = 0.75 if method == "LRFD" else 1 / 2.0
    assert factor * sh["r_n2"].to("kip").magnitude == pytest.approx(per_inch, abs=TABLE_ABS)


@pytest.mark.parametrize(("method", "per_inch"), [("LRFD", 44.0), ("ASD", 29.4)])
def test_tearout_at_1_25_in_edge_table_7_5(method, per_inch):
    sh = _sheet(method, L_e="1.25 in")
    factor = 0.75 if method == "LRFD" else 1 / 2.0
    assert factor * sh["r_n1"].to("kip").magnitude == pytest.approx(per_inch, abs=TABLE_ABS)
    assert sh["R_cb"].to("kip").magnitude == pytest.approx(per_inch, abs=TABLE_ABS)


def test_spacing_and_edge_rules():
    # AISC 360-16 J3.3: s >= 2-2/3 d; Table J3.4: 3/4 in bolt, 1 in minimum edge distance (from memory)
    sh = _sheet("ASD", n=2, s="1.75 in", L_e="0.875 in")
    res = {c.key: c for c in sh.evaluate().checks}
    assert res["ratio_bs"].status == "NG" and res["ratio_bs"].ratio == pytest.approx(2.0 / 1.75)
    assert res["ratio_be"].status == "NG" and res["ratio_be"].ratio == pytest.approx(1.0 / 0.875)


@pytest.mark.parametrize(
    ("kw", "field"),
    [({"n": 0}, "n"), ({"shear_planes": 3}, "shear_planes"), ({"grade": "A999"}, "grade / threads"),
     ({"d_b": "2 in"}, "d_b"), ({"R": "-3 kip"}, "R_r"), ({"s": "0 in"}, "s_b")],
)
def test_bad_input(kw, field):
    with pytest.raises(CalcpadError) as err:
        _sheet("ASD", **kw)
    assert err.value.field == field
