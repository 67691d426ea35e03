"""Slenderness statuses: AISC 360-16 E2 User Note (KL/r preferably <= 200) and D1 User Note
(L/r preferably <= 300) give "OK, above recommended slenderness"; the E5 equations are limited to
L_c/r <= 200 (Eqs. E5-2, E5-4, from memory): beyond it the check is "not covered" (refused when
the sheet is built, flagged when a value changes later)."""

from __future__ import annotations

import warnings

import pytest

from calcpad import Sheet
from calcpad.core.results import NG, NOT_COVERED, OK, OK_SLENDER
from calcpad.eng.checks import CheckNotCoveredError, CheckWarning, add_compression_check, add_tension_check, check_member
from calcpad.eng.sections import get_section

HSS = get_section("HSS2x2x1/8")
R_MIN = HSS.props.r_min if hasattr(HSS.props, "r_min") else min(HSS.props.rx, HSS.props.ry)


def _status(sh, key):
    return next(c for c in sh.evaluate().checks if c.key == key).status


@pytest.mark.parametrize(("feet", "expected"), [(5, OK), (20, OK_SLENDER)])
def test_compression_above_200(feet, expected):
    assert (feet * 12 / R_MIN > 200) == (expected == OK_SLENDER)  # KL/r by hand, K = 1
    sh = Sheet("c", method="ASD")
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", CheckWarning)
        add_compression_check(sh, HSS, P="0.5 kip", L=f"{feet} ft", F_y="46 ksi")
    assert _status(sh, "ratio_c") == expected


def test_slender_and_overloaded_is_ng():
    sh = Sheet("c", method="ASD")
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", CheckWarning)
        add_compression_check(sh, HSS, P="20 kip", L="20 ft", F_y="46 ksi")
    assert _status(sh, "ratio_c") == NG


@pytest.mark.parametrize(("feet", "expected"), [(5, OK), (30, OK_SLENDER)])
def test_tension_above_300(feet, expected):
    assert (feet * 12 / R_MIN > 300) == (expected == OK_SLENDER)
    sh = Sheet("t", method="ASD")
    add_tension_check(sh, HSS, T="2 kip", L=f"{feet} ft", F_y="46 ksi", F_u="62 ksi")
    assert _status(sh, "ratio_t") == expected


def test_member_runner_passes_length_to_tension():
    sh = Sheet("m", method="ASD")
    check_member(sh, HSS, L="30 ft", P="-2 kip", F_y="46 ksi", F_u="62 ksi")
    assert _status(sh, "ratio_t") == OK_SLENDER


def test_e5_beyond_its_limit_is_not_covered():
    angle = get_section("L2x2x1/4")
    r_a = angle.props.ry  # geometric axis parallel to the connected leg (equal legs)
    sh = Sheet("a", method="ASD")
    sh.given("L_b", "3 ft")
    add_compression_check(sh, angle, P="1 kip", L="L_b", F_y="36 ksi", connected_leg="long")
    assert _status(sh, "ratio_c") == OK
    feet = 12.0
    assert 32 + 1.25 * feet * 12 / r_a > 200  # Eq. E5-2
    sh.set(L_b=f"{feet} ft")
    assert _status(sh, "ratio_c") == NOT_COVERED
    with pytest.raises(CheckNotCoveredError, match="E5"):
        add_compression_check(Sheet("b"), angle, P="1 kip", L=f"{feet} ft", F_y="36 ksi", connected_leg="long")
