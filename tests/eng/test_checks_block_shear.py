"""Block shear rupture, AISC 360-16 Eq. J4-5 (from memory), by hand: both sides of the min are
reached, φ = 0.75 / Ω = 2.00, and U_bs = 0.5 halves the tension term."""

from __future__ import annotations

import pytest

from calcpad import Sheet
from calcpad.core.errors import CalcpadError
from calcpad.eng.checks import add_block_shear_check

REL = 1e-9


def _bs(method="LRFD", **kw):
    sh = Sheet("block shear", method=method)
    args = {"R": "20 kip", "A_gv": "2.25 in^2", "A_nt": "0.9375 in^2", "F_y": "36 ksi", "F_u": "58 ksi"} | kw
    add_block_shear_check(sh, **args)
    return sh


def _j4_5(agv, anv, ant, fy, fu, ubs):
    return min(0.60 * fu * anv + ubs * fu * ant, 0.60 * fy * agv + ubs * fu * ant)


@pytest.mark.parametrize(("kw", "side"), [({}, "yield"), ({"A_nv": "1.2 in^2"}, "rupture")])
def test_eq_j4_5(kw, side):
    sh = _bs(**kw)
    anv = 1.2 if kw else 2.25
    expected = _j4_5(2.25, anv, 0.9375, 36.0, 58.0, 1.0)
    shear_yield = 0.60 * 36.0 * 2.25 + 58.0 * 0.9375
    assert (expected == pytest.approx(shear_yield)) == (side == "yield")
    assert sh["R_nbs"].to("kip").magnitude == pytest.approx(expected, rel=REL)
    assert sh["R_cbs"].to("kip").magnitude == pytest.approx(0.75 * expected, rel=REL)


def test_asd_and_non_uniform_tension():
    sh = _bs("ASD", U_bs=0.5)
    assert sh["R_cbs"].to("kip").magnitude == pytest.approx(_j4_5(2.25, 2.25, 0.9375, 36.0, 58.0, 0.5) / 2.0, rel=REL)


@pytest.mark.parametrize(("kw", "field"), [({"U_bs": 0.7}, "U_bs"), ({"A_nv": "3 in^2"}, "A_nv"), ({"A_gv": "-1 in^2"}, "A_gv"),
                                           ({"F_u": "58 in"}, "F_ubs")])
def test_bad_input(kw, field):
    with pytest.raises(CalcpadError) as err:
        _bs(**kw)
    assert field in str(getattr(err.value, "field", err.value))
