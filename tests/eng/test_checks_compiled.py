"""The compiled (vectorised numpy) sheet gives the same ratios as the scalar evaluation for the
member checks: torsion with its H3.2 'and' conditions, tees (E4-3, F9), channels (E4, F2 with c),
E5 angles, principal-axis angle flexure (F10-4 with β_w) and base plates (Design Guide 1).
Oracle: the scalar pint evaluation of the same sheet (an independent code path)."""

from __future__ import annotations

import warnings

import numpy as np
import pytest

from calcpad import Q_, Sheet
from calcpad.eng.checks import CheckWarning, add_base_plate_check, add_compression_check, add_flexure_check, check_member
from calcpad.eng.sections import Angle, get_section


def _hss():
    sh = Sheet("hss", method="LRFD")
    sh.given("P", "5 kip")
    check_member(sh, get_section("HSS4x4x1/4"), F_y="50 ksi", L="8 ft", P="P", M_x="3 kip*ft", V="1 kip", T="2 kip*ft")
    return sh, "P", "kip"


def _tee():
    sh = Sheet("tee")
    sh.given("P", "5 kip")
    check_member(sh, get_section("WT4x9"), F_y="50 ksi", L="6 ft", P="P", M_x="1 kip*ft", stem="tension")
    return sh, "P", "kip"


def _channel():
    sh = Sheet("channel")
    sh.given("P", "5 kip")
    check_member(sh, get_section("C6x8.2"), F_y="36 ksi", L="6 ft", P="P", M_x="1 kip*ft")
    return sh, "P", "kip"


def _angle_e5():
    sh = Sheet("angle")
    sh.given("L", "5 ft")
    add_compression_check(sh, get_section("L3x2x3/16"), P="3 kip", L="L", F_y="36 ksi", connected_leg="short")
    return sh, "L", "ft"


def _angle_w():
    sh = Sheet("angle w")
    sh.given("L_b", "8 ft")
    add_flexure_check(sh, Angle(6, 4, 0.5), M="3 kip*ft", axis="w", L_b="L_b", F_y="36 ksi")
    return sh, "L_b", "ft"


def _base_plate():
    sh = Sheet("base plate")
    sh.given("M", "100 kip*in")
    add_base_plate_check(sh, get_section("HSS4x4x1/4"), P="10 kip", M="M", B="10 in", N="10 in", t_p="0.75 in", f_c="3 ksi",
                         f="3.75 in", d_rod="0.75 in", F_y="36 ksi")
    return sh, "M", "kip*in"


@pytest.mark.parametrize("build", [_hss, _tee, _channel, _angle_e5, _angle_w, _base_plate], ids=lambda f: f.__name__)
def test_compiled_ratios_equal_scalar_ratios(build):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", CheckWarning)
        sh, name, unit = build()
        f = sh.compile()
        values = [float(x) for x in np.array([0.5, 1.0, 2.0]) * float(sh[name].to(unit).magnitude)]
        out = f(**{name: Q_(np.array(values), unit)})
        for i, v in enumerate(values):
            sh.set(**{name: f"{v!r} {unit}"})
            for c in sh.evaluate().checks:
                assert np.broadcast_to(out[c.key], (3,))[i] == pytest.approx(c.ratio, rel=1e-9), c.key
