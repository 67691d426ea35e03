"""Eccentrically loaded weld groups, elastic method.

Oracles:
* Independent numerics: each weld line cut into many pieces; centroid, polar moment and the
  force vector per unit length (direct share plus M×r/I_p) at every piece, largest magnitude
  (the elastic method itself, common practice), compared with the closed forms the check writes.
* A single vertical weld: f = sqrt((P/L)^2 + (6 P e / L^2)^2) (common practice).
* Line strength 0.60 F_EXX 0.707 w with φ = 0.75 / Ω = 2.00: AISC 360-16 Eq. J2-4, Table J2.5;
  E70, per sixteenth of an inch of leg: φr_n = 1.392 kips/in, r_n/Ω = 0.928 kips/in (AISC Manual
  15th ed. Part 8, Eqs. 8-2a/8-2b, from memory).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from calcpad import Sheet
from calcpad.core.errors import CalcpadError
from calcpad.eng.checks import add_weld_group_check

REL = 1e-9


def _lines(shape: str, d: float, b: float) -> list[tuple[tuple[float, float], tuple[float, float]]]:
    if shape == "line":
        return [((0, 0), (0, d))]
    if shape == "two_lines":
        return [((0, 0), (0, d)), ((b, 0), (b, d))]
    if shape == "box":
        return [((0, 0), (0, d)), ((b, 0), (b, d)), ((0, 0), (b, 0)), ((0, d), (b, d))]
    return [((0, 0), (0, d)), ((0, 0), (b, 0)), ((0, d), (b, d))]  # "c": web at x = 0, returns towards +x


def _numeric(shape: str, d: float, b: float, P: float, e: float, H: float = 0.0, n: int = 4000) -> float:
    pts, ds = [], []
    for (x1, y1), (x2, y2) in _lines(shape, d, b):
        t = (np.arange(n) + 0.5) / n
        seg = math.hypot(x2 - x1, y2 - y1)
        pts.append(np.column_stack([x1 + (x2 - x1) * t, y1 + (y2 - y1) * t]))
        ds.append(np.full(n, seg / n))
    p, w = np.vstack(pts), np.concatenate(ds)
    L = w.sum()
    c = (p * w[:, None]).sum(axis=0) / L
    r = p - c
    ip = (w * (r**2).sum(axis=1)).sum()
    xload = c[0] + e  # load to the right of the centroid, acting down
    M = -P * (xload - c[0])  # clockwise
    fx = H / L - M * r[:, 1] / ip
    fy = -P / L + M * r[:, 0] / ip
    ends = np.vstack([np.array(a) for seg in _lines(shape, d, b) for a in seg]) - c  # check the corners too
    fx_e = H / L - M * ends[:, 1] / ip
    fy_e = -P / L + M * ends[:, 0] / ip
    return float(max(np.hypot(fx, fy).max(), np.hypot(fx_e, fy_e).max()))


@pytest.mark.parametrize(("shape", "b"), [("two_lines", 4.0), ("box", 4.0), ("c", 3.0), ("box", 8.0)])
def test_closed_forms_match_the_numeric_elastic_method(shape, b):
    sh = Sheet("wg", method="ASD")
    add_weld_group_check(sh, shape=shape, d="6 in", b=f"{b} in", P="4 kip", e="5 in", w="1/4 in")
    assert sh["f_r"].to("kip/in").magnitude == pytest.approx(_numeric(shape, 6.0, b, 4.0, 5.0), rel=2e-3)


def test_single_line_closed_form():
    sh = Sheet("wg")
    add_weld_group_check(sh, shape="line", d="6 in", P="4 kip", e="5 in", w="1/4 in", H="1 kip")
    L, P, e, H = 6.0, 4.0, 5.0, 1.0
    expected = math.hypot(H / L + 6 * P * e / L**2, P / L)
    assert sh["f_r"].to("kip/in").magnitude == pytest.approx(expected, rel=REL)


@pytest.mark.parametrize(("method", "per_sixteenth"), [("LRFD", 1.392), ("ASD", 0.928)])
def test_line_strength_manual_part_8(method, per_sixteenth):
    sh = Sheet("wg", method=method)
    add_weld_group_check(sh, shape="line", d="6 in", P="1 kip", e="0 in", w="1/4 in")
    assert sh["r_c"].to("kip/in").magnitude == pytest.approx(4 * per_sixteenth, rel=0.001)


@pytest.mark.parametrize(
    ("kw", "field"),
    [({"shape": "ring"}, "shape"), ({"shape": "line", "b": "2 in"}, "b"), ({"shape": "box"}, "b"),
     ({"shape": "line", "d": "-6 in"}, "d"), ({"shape": "line", "e": "-1 in"}, "e"), ({"shape": "line", "w": "0 in"}, "w")],
)
def test_bad_input(kw, field):
    args = {"d": "6 in", "P": "4 kip", "e": "5 in", "w": "1/4 in"} | kw
    with pytest.raises(CalcpadError) as err:
        add_weld_group_check(Sheet("x"), **args)
    assert err.value.field == field
