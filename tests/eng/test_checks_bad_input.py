"""Bad input to the checks: clear CalcpadError subclasses naming field, value and expectation."""

from __future__ import annotations

import warnings

import pytest

from calcpad import Sheet
from calcpad.core.errors import CalcpadError, InputError, NotCoveredError
from calcpad.eng.checks import (
    CheckInputError,
    CheckWarning,
    add_compression_check,
    add_fillet_weld_check,
    add_flexure_check,
    add_stitch_weld_check,
    add_stress_check,
    add_tension_check,
    check_member,
)
from calcpad.eng.sections import get_section

HSS = get_section("HSS4x4x1/4")


@pytest.mark.parametrize("length", ["0 ft", "-3 ft"])
def test_unbraced_length_not_positive(length):
    with pytest.raises(CheckInputError) as err:
        add_compression_check(Sheet("x"), HSS, P="1 kip", L=length, F_y="46 ksi")
    assert err.value.field == "L" and "positive" in str(err.value)
    assert isinstance(err.value, InputError)


@pytest.mark.parametrize("k", [0.3, 3.0])
def test_k_outside_range_warns_and_notes(k):
    sh = Sheet("k")
    with pytest.warns(CheckWarning, match="outside the usual range 0.5 to 2.5"):
        add_compression_check(sh, HSS, P="1 kip", L="5 ft", K=k, F_y="46 ksi")
    notes = [r.text for r in sh.evaluate().steps if getattr(r, "kind", "") == "note"]
    assert any("K = " in n for n in notes)


def test_k_in_range_no_warning():
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        add_compression_check(Sheet("k"), HSS, P="1 kip", L="5 ft", K=2.1, F_y="46 ksi")


def test_negative_compression_explains_sign():
    with pytest.raises(CheckInputError, match="add_tension_check"):
        add_compression_check(Sheet("x"), HSS, P="-5 kip", L="5 ft", F_y="46 ksi")


def test_negative_tension_explains_sign():
    with pytest.raises(CheckInputError, match="add_compression_check"):
        add_tension_check(Sheet("x"), HSS, T="-5 kip", F_y="46 ksi", F_u="62 ksi")


def test_angle_compression_needs_the_connected_leg():
    # An angle is covered only as AISC 360-16 E5 describes it (end-connected through one leg).
    sh = Sheet("x")
    with pytest.raises(NotCoveredError, match="not covered by this check") as err:
        add_compression_check(sh, get_section("L3x3x1/4"), P="1 kip", L="5 ft", F_y="36 ksi")
    assert err.value.field == "connected_leg"
    assert isinstance(err.value, CalcpadError)
    assert sh.steps == []  # nothing half-written on the sheet


def test_angle_compression_thin_legs_not_covered():
    # AISC 360-16 E4: single angles with b/t > 0.71*sqrt(E/Fy) need flexural-torsional buckling (from memory).
    with pytest.raises(NotCoveredError, match="E4") as err:
        thin = {"kind": "angle", "d": "4 in", "b": "4 in", "t": "0.1875 in", "A": "1.46 in^2", "rx": "1.26 in", "ry": "1.26 in",
                "r_min": "0.79 in"}  # b/t = 21.3
        add_compression_check(Sheet("x"), thin, P="1 kip", L="5 ft", F_y="36 ksi", connected_leg="long")
    assert err.value.field == "b/t"


def test_angle_compression_leg_ratio_limit():
    # AISC 360-16 E5(5): leg ratio below 1.7 (from memory); a 6 x 3 angle has 2.0.
    angle = {"kind": "angle", "d": "6 in", "b": "3 in", "t": "0.5 in", "A": "4.3 in^2"}
    with pytest.raises(NotCoveredError, match=r"1\.7"):
        add_compression_check(Sheet("x"), angle, P="1 kip", L="5 ft", F_y="36 ksi", connected_leg="long")


@pytest.mark.parametrize(
    ("call", "field"),
    [
        (lambda sh: add_compression_check(sh, HSS, P="1 kip", L="5 ft"), "F_y"),
        (lambda sh: add_compression_check(sh, HSS, P="1 kip", L="5 lbf", F_y="46 ksi"), "L"),
        (lambda sh: add_compression_check(sh, {"A": "1 in^2"}, P="1 kip", L="5 ft", F_y="46 ksi"), "kind"),
        (lambda sh: add_compression_check(sh, {"A": "1 in^2", "bogus": 3}, kind="rect_bar", P="1 kip", L="5 ft", F_y="46 ksi"), "section['bogus']"),
        (lambda sh: add_flexure_check(sh, HSS, M="1 kip*ft", F_y="46 ksi", axis="z"), "axis"),
        (lambda sh: add_flexure_check(sh, HSS, M="1 kip*ft", F_y="46 ksi", L_b="5 ft", C_b=4.0), "C_b"),
        (lambda sh: add_stress_check(sh, HSS, F_y="46 ksi", M="1 kip*ft", required_fs=0.8), "required_fs"),
        (lambda sh: add_stress_check(sh, HSS, F_y="46 ksi"), "P, M, V, T"),
        (lambda sh: add_tension_check(sh, HSS, T="1 kip", F_y="46 ksi", F_u="62 ksi", U=1.2), "U"),
        (lambda sh: add_tension_check(sh, HSS, T="1 kip", F_y="46 ksi", F_u="62 ksi", A_n="9 in^2"), "A_n"),
        (lambda sh: add_fillet_weld_check(sh, R="1 kip", w="0.25 in", L="4 in", t_p="0.5 in", theta="120 degree"), "theta"),
        (lambda sh: add_fillet_weld_check(sh, R="1 kip", w="0.25 in", L="4 in", t_p="0.5 in", n=0), "n"),
        (lambda sh: add_stitch_weld_check(sh, V="1 kip", Q="1 in^3", I="10 in^4", w="0.1875 in", L_seg="3 in", s="2 in"), "s"),
        (lambda sh: add_compression_check(sh, HSS, P="1 kip", L="5 ft", F_y="46 ksi", suffix="a b"), "suffix"),
        (lambda sh: check_member(sh, HSS, L="5 ft", F_y="46 ksi"), "P, M_x, M_y, V"),
    ],
)
def test_bad_inputs_name_the_field(call, field):
    with pytest.raises(InputError) as err:
        call(Sheet("bad"))
    msg = str(err.value)
    assert msg.startswith(field) or getattr(err.value, "field", None) == field
    assert "expected" in msg


def test_same_name_different_value_needs_suffix():
    sh = Sheet("dup")
    add_compression_check(sh, HSS, P="1 kip", L="5 ft", F_y="46 ksi")
    with pytest.raises(CheckInputError, match="suffix"):
        add_compression_check(sh, get_section("HSS6x6x1/4"), P="1 kip", L="5 ft", F_y="46 ksi")


def test_linked_negative_value_is_rejected_with_sign_hint():
    sh = Sheet("link")
    sh.given("P_u", "-4 kip", "Axial force from analysis")
    with pytest.raises(CheckInputError, match="add_tension_check") as err:
        add_compression_check(sh, HSS, P="P_u", L="5 ft", F_y="46 ksi")
    assert err.value.field == "P_r"


def test_unsupported_shape_class_not_covered():
    # A built-up section has no single AISC 360 shape family: its kind must be named (or it is refused).
    from calcpad.eng.sections.builtup import BuiltUp

    bu = BuiltUp("two tubes").add(get_section("HSS4x4x1/4")).add(get_section("HSS4x4x1/4"), at=("4 in", "0 in"))
    with pytest.raises(NotCoveredError, match="not covered by this check"):
        add_compression_check(Sheet("x"), bu, P="1 kip", L="5 ft", F_y="36 ksi")
