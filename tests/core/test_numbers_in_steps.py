"""Numbers in steps: a result that is not a finite number is an error naming the step and its inputs
(scalar path) or an invalid case with its reason (compiled path); checks never read OK on NaN;
names of formula constants/functions are refused; deep formulas give a clear message.

The expected outcomes follow from real arithmetic (IEEE 754 doubles): asin is defined on [-1, 1],
a square root needs a value >= 0, 1e308 * 10 exceeds the largest double (about 1.8e308).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calcpad import Sheet
from calcpad.core.errors import CalcpadError, FormulaError, NonFiniteError, SheetError
from calcpad.core.formula import FUNCTIONS, MAX_DEPTH, parse_formula
from calcpad.core.units import Q_

NON_FINITE = [
    # (formula, value of x, kind named in the message)
    ("asin(x)", "2", "undefined"),
    ("acos(x)", "-1.5", "undefined"),
    ("x*1e308*10", "1", "infinite"),
    ("P*L", "1", "infinite"),  # 1e308 lbf x 10 in
]


def one_step(formula: str, x: str) -> Sheet:
    sh = Sheet("t")
    sh.given("x", x)
    sh.given("P", "1e308 lbf")
    sh.given("L", "10 in")
    sh.step("y", formula)
    return sh


@pytest.mark.parametrize("formula, x, kind", NON_FINITE)
def test_scalar_non_finite_step_is_an_error_naming_step_and_inputs(formula, x, kind):
    sh = one_step(formula, x)
    with pytest.raises(NonFiniteError) as err:
        sh.evaluate()
    msg = str(err.value)
    assert msg.startswith("step 'y': ") and kind in msg
    used = parse_formula(formula).names
    for name in used:  # every input the step used is named with its value
        assert f"{name} = " in msg


@pytest.mark.parametrize("formula, x", [("0*x/(0*x)", "1"), ("sqrt(x)", "-4"), ("log(x)", "-1"), ("1/(x - 2)", "2")])
def test_scalar_undefined_forms_are_errors(formula, x):
    with pytest.raises(SheetError, match="step 'y'"):
        one_step(formula, x).evaluate()


NON_FINITE_COMPILED = [("asin(x)", 2.0), ("acos(x)", -1.5), ("x*1e307*10", 100.0), ("sqrt(x)", -4.0), ("log(x)", -1.0), ("1/(x - 2)", 2.0),
                       ("(x - 1)/(x - 1)", 1.0)]


@pytest.mark.parametrize("formula, x", NON_FINITE_COMPILED)
def test_compiled_marks_the_case_invalid_with_its_reason(formula, x):
    f = one_step(formula, "0.5").compile()
    out = f(x=np.array([0.5, x, 0.25]))
    assert out.valid.tolist() == [True, False, True]
    assert out.invalid_step.tolist() == ["", "y", ""]
    assert math.isnan(out["y"][1])  # no number stands for an invalid case
    reason = out.reason(1)
    assert reason.startswith("case 1: step 'y' is not a finite number") and "x = " in reason
    assert out.reason(0) == "" and out.invalid_reason.tolist()[0] == ""
    with pytest.raises(NonFiniteError, match="1 case"):
        out.require_valid()
    assert f(x=0.5).require_valid().all_valid
    one = f(x=x)  # a single case: reason() needs no index
    assert not one.all_valid and one.reason().startswith("step 'y'") and one.reason(0) == one.reason()


def leg(demand_formula: str = "P*L") -> Sheet:
    sh = Sheet("leg")
    sh.given("P", "100 lbf")
    sh.given("L", "40 in")
    sh.given("x", 0.5)
    sh.given("S", "0.3 in^3")
    sh.given("F_y", "35 ksi")
    sh.step("M", demand_formula)
    sh.step("sigma", "M/S")
    sh.check("yield", "sigma", "F_y", required_fs=1.67)
    return sh


def test_a_nan_demand_never_reads_ok():
    sh = leg("P*L*asin(x)/asin(x)")
    sh.set(x=2.0)
    with pytest.raises(NonFiniteError, match="step 'M'"):  # scalar: an error, not "FS = ∞ OK"
        sh.evaluate()
    f = leg("P*L*asin(x)/asin(x)").compile()
    ratios = f.ratios(x=np.array([0.5, 2.0]))
    (key,) = ratios.keys()
    assert ratios.valid.tolist() == [True, False]
    assert not ratios[key][1] <= 1.0  # NaN: no comparison reads OK
    # 100 lbf x 40 in / 0.3 in^3 = 13,333 psi; FS = 35,000/13,333 = 2.625; ratio = 1.67/2.625 (hand)
    assert ratios[key][0] == pytest.approx(1.67 / (35000 / (100 * 40 / 0.3)), rel=1e-12)


def test_check_capacity_not_positive_is_invalid_in_both_paths():
    sh = leg()
    sh.set(F_y="0 ksi")
    with pytest.raises(SheetError, match="greater than zero"):
        sh.evaluate()
    out = leg().compile()(F_y=np.array([35.0, 0.0, -1.0]))
    assert out.valid.tolist() == [True, False, False]
    assert "not greater than zero" in out.reason(1)


@settings(max_examples=200, deadline=None)
@given(st.floats(min_value=-3, max_value=3, allow_nan=False) | st.sampled_from([0.0, 1.0, -1.0, 2.0]))
def test_scalar_raises_exactly_where_compiled_is_invalid(x):
    """Real arithmetic decides: asin needs |x| <= 1, sqrt and log need x >= 0 / > 0, 1/(x-2) needs x != 2."""
    sh = Sheet("domain")
    sh.given("x", 0.5)
    sh.step("a", "asin(x)")
    sh.step("b", "sqrt(x)")
    sh.step("c", "log(x)")
    sh.step("d", "1/(x - 2)")
    f = sh.compile()
    out = f(x=np.array([x]))
    defined = abs(x) <= 1 and x > 0
    sh.set(x=x)
    try:
        sh.evaluate()
        scalar_ok = True
    except CalcpadError:
        scalar_ok = False
    assert scalar_ok == defined == bool(out.valid[0])


def test_compiled_grid_reasons_name_cases():
    sh = Sheet("grid")
    sh.given("x", 0.5)
    sh.given("k", 1.0)
    sh.step("a", "k*asin(x)")
    f = sh.compile()
    out = f(x=np.array([[0.5], [2.0]]), k=np.array([1.0, 3.0]))
    assert out.valid.shape == (2, 2) and out.valid.tolist() == [[True, True], [False, False]]
    assert out.reasons() == [out.reason((1, 0)), out.reason((1, 1))]
    assert out.reason((1, 1)).startswith("case (1, 1): step 'a'")


def test_condition_that_is_not_finite_is_an_error():
    sh = Sheet("b")
    sh.given("x", 3.0)
    sh.branch("y", [("x*1e308*10 > 1", "x", "first"), (None, "2*x", "otherwise")])
    with pytest.raises(NonFiniteError, match="condition"):
        sh.evaluate()


def test_non_finite_given_is_refused():
    with pytest.raises(CalcpadError, match="finite"):
        Sheet("g").given("P", Q_(math.inf, "lbf"))


@pytest.mark.parametrize("name", ["pi", *FUNCTIONS])
def test_names_of_constants_and_functions_are_refused(name):
    sh = Sheet("names")
    with pytest.raises(SheetError, match=f"'{name}' is the (constant|function)"):
        sh.given(name, "1 in")
    with pytest.raises(SheetError, match="cannot name a given or step"):
        sh.step(name, "2")


def test_e_is_an_ordinary_name_never_eulers_number():
    # e is eccentricity in AISC Design Guide 1; formulas have no constant e (exp(1) is Euler's number)
    sh = Sheet("e")
    sh.given("e", "2 in")
    sh.given("P", "3 kip")
    sh.step("M", "P*e")
    assert sh["M"].to("kip*inch").magnitude == pytest.approx(6.0)
    sh2 = Sheet("no e")
    sh2.given("P", "3 kip")
    sh2.step("M", "P*e")
    with pytest.raises(SheetError, match="unknown name 'e'"):
        sh2.evaluate()


@pytest.mark.parametrize(
    "text",
    [
        "-" * 1990 + "x",
        "+".join(["x"] * (MAX_DEPTH + 5)),
        "sqrt(" * (MAX_DEPTH + 1) + "x" + ")" * (MAX_DEPTH + 1),
        "(" * 500 + "x" + ")" * 500,
        "x*(x+" * 60 + "x" + ")" * 60,
    ],
)
def test_deep_formulas_give_a_clear_message(text):
    with pytest.raises(FormulaError, match=r"split it into steps|too many nested parentheses"):
        parse_formula(text)


def test_formula_at_the_depth_limit_evaluates_and_prints():
    from calcpad.render.html import sheet_html_fragment
    from calcpad.render.latex import sheet_latex
    from calcpad.render.text import sheet_text

    text = "x*(x+" * (MAX_DEPTH // 2) + "x" + ")" * (MAX_DEPTH // 2)
    sh = Sheet("deep")
    sh.given("x", 1.0)
    sh.step("y", text)
    res = sh.evaluate()
    assert sh["y"].magnitude == pytest.approx(MAX_DEPTH // 2 + 1)  # x = 1: each level adds one
    assert sheet_html_fragment(res) and sheet_latex(res) and sheet_text(res)
    assert sh.compile()(x=np.array([1.0]))["y"][0] == pytest.approx(MAX_DEPTH // 2 + 1)
