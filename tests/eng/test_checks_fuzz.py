"""Bad input never escapes as anything but a CalcpadError (a message naming the field).

Hypothesis feeds each check junk in one field at a time (text, numbers, wrong units, negative and
zero values, None, containers). The check either works or raises CalcpadError; a TypeError,
AttributeError, KeyError, ValueError or pint error escaping is a defect.
"""

from __future__ import annotations

import warnings

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from calcpad import Sheet
from calcpad.core.errors import CalcpadError
from calcpad.eng.checks import (
    CheckWarning,
    add_anchorage_check,
    add_base_plate_check,
    add_block_shear_check,
    add_bolt_line_check,
    add_compression_check,
    add_euler_load,
    add_fillet_weld_check,
    add_flexure_check,
    add_leg_base_uplift_check,
    add_second_order,
    add_torsion_check,
    add_weld_group_check,
    check_member,
)
from calcpad.eng.sections import get_section

JUNK = st.one_of(
    st.none(),
    st.booleans(),
    st.integers(min_value=-10**6, max_value=10**6),
    st.floats(allow_nan=True, allow_infinity=True),
    st.text(max_size=12),
    st.sampled_from(["-3 kip", "0 in", "5 ksi", "12 ft", "1e400 in", "3 kip*ft", "abc", "1/0 in", "2 in^2", "nan in",
                     "5 lbf/in", "__import__('os')", "1-1/2", "' OR 1", "10 degree"]),
    st.lists(st.integers(), max_size=3),
    st.dictionaries(st.text(max_size=3), st.integers(), max_size=2),
)
SETTINGS = settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])

HSS = get_section("HSS4x4x1/4")
WT = get_section("WT4x9")
L3 = get_section("L3x3x1/4")

CASES = {
    "compression": (lambda **k: add_compression_check(Sheet("f"), HSS, **k), {"P": "5 kip", "L": "8 ft", "K": 1.0, "F_y": "50 ksi"}),
    "angle compression": (lambda **k: add_compression_check(Sheet("f"), L3, **k),
                          {"P": "5 kip", "L": "4 ft", "F_y": "36 ksi", "connected_leg": "long"}),
    "tee flexure": (lambda **k: add_flexure_check(Sheet("f"), WT, **k), {"M": "2 kip*ft", "L_b": "4 ft", "F_y": "50 ksi", "stem": "tension"}),
    "torsion": (lambda **k: add_torsion_check(Sheet("f"), HSS, **k), {"T": "1 kip*ft", "F_y": "50 ksi"}),
    "weld": (lambda **k: add_fillet_weld_check(Sheet("f"), **k), {"R": "5 kip", "w": "3/16 in", "L": "3 in", "t_p": "1/4 in",
                                                                   "base_t": "3/8 in", "base_material": "A36"}),
    "bolts": (lambda **k: add_bolt_line_check(Sheet("f"), **k), {"R": "5 kip", "d_b": "3/4 in", "n": 2, "t": "3/8 in", "F_u": "58 ksi"}),
    "base plate": (lambda **k: add_base_plate_check(Sheet("f"), HSS, **k), {"P": "10 kip", "M": "100 kip*in", "B": "10 in", "N": "10 in",
                                                                             "t_p": "3/4 in", "f_c": "3 ksi", "f": "3.75 in",
                                                                             "d_rod": "3/4 in", "F_y": "36 ksi"}),
    "weld group": (lambda **k: add_weld_group_check(Sheet("f"), **k), {"shape": "c", "d": "6 in", "b": "3 in", "P": "4 kip", "e": "5 in",
                                                                        "w": "1/4 in"}),
    "angle principal": (lambda **k: add_flexure_check(Sheet("f"), L3, **k), {"M": "1 kip*ft", "axis": "w", "L_b": "4 ft", "F_y": "36 ksi"}),
    "block shear": (lambda **k: add_block_shear_check(Sheet("f"), **k), {"R": "20 kip", "A_gv": "2.25 in^2", "A_nt": "0.94 in^2",
                                                                          "F_y": "36 ksi", "F_u": "58 ksi", "U_bs": 1.0}),
    "anchorage": (lambda **k: add_anchorage_check(Sheet("f", method="LRFD"), **k),
                  {"d_a": "3/4 in", "h_ef": "12 in", "f_c": "3000 psi", "c_x1": "6 in", "c_x2": "6 in", "c_y1": "6 in", "c_y2": "6 in",
                   "h_a": "30 in", "N_ua": "8 kip", "V_ua": "2 kip", "n_x": 2, "n_y": 2, "s_x": "7.5 in", "s_y": "7.5 in",
                   "tension_rows": 1, "anchor": "cast-in headed", "grade": "F1554 Gr 36", "condition": "B"}),
    "second order": (lambda **k: add_second_order(Sheet("f"), HSS, **k), {"P_nt": "5 kip", "M_lt": "3 kip*ft", "L": "10 ft",
                                                                           "sway": "cantilever", "K1": 1.0, "stiffness": "nominal"}),
    "leg base uplift": (lambda **k: add_leg_base_uplift_check(Sheet("f", method="LRFD"), **k),
                        {"N_t": "400 lbf", "M_x": "1.5 kip*in", "M_y": "-2 kip*in", "f": "2.75 in", "t_p": "1/2 in",
                         "D_leg": "2.375 in", "F_y": "36 ksi"}),
    "euler": (lambda **k: add_euler_load(Sheet("f"), L3, **k), {"L": "6 ft", "K": 1.0, "axis": "min", "E": "29000 ksi"}),
    "member": (lambda **k: check_member(Sheet("f"), HSS, **k), {"L": "8 ft", "P": "5 kip", "M_x": "3 kip*ft", "V": "1 kip", "F_y": "50 ksi"}),
}


def test_every_case_runs_with_its_good_inputs():
    for call, good in CASES.values():
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", CheckWarning)
            call(**good)


@pytest.mark.parametrize("case", list(CASES))
@SETTINGS
@given(data=st.data())
def test_junk_in_one_field_is_a_calcpad_error(case, data):
    call, good = CASES[case]
    field = data.draw(st.sampled_from(sorted(good)))
    junk = data.draw(JUNK)
    args = dict(good) | {field: junk}
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", CheckWarning)
        try:
            call(**args)
        except CalcpadError as err:
            assert str(err)  # a message, naming something


@SETTINGS
@given(value=JUNK, formula=st.one_of(st.text(max_size=20), st.sampled_from(["x/0", "x**x", "sqrt(-x)", "min()", "x +", "x*1e400",
                                                                             "log(0*x)", "x if x else 1", "[x]", "x.real"])))
def test_sheet_given_and_step_junk_is_a_calcpad_error(value, formula):
    sh = Sheet("junk")
    try:
        sh.given("x", value)
        sh.step("y", formula)
        sh.evaluate()
    except CalcpadError as err:
        assert str(err)
