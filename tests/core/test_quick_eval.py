"""Formula values in plain floats (calcpad.core.quick_eval) against pint's own evaluation.

Oracle: pint 0.25 (a general-purpose units library from PyPI), walking the same sympy tree
node by node (``quantity_eval._eval``): a plan must give exactly its value, type and units, on
inputs other than those it was made from. Where the numbers need pint's handling (a fractional
power of a negative value, a division by zero, an overflow), the message is pint's path's.
"""

from __future__ import annotations

import math
import random

import numpy as np
import pytest

from calcpad.core import quick_eval
from calcpad.core.errors import DimensionError, NonFiniteError, SheetError
from calcpad.core.formula import parse_formula
from calcpad.core.quantity_eval import _eval, evaluate_expr
from calcpad.core.registry import Q_, base_factor, conversion_factor, copy_quantity


@pytest.fixture(autouse=True)
def _no_plans() -> None:
    quick_eval._PLANS.clear()  # sympy hands out one object per expression: each test learns its own


CASES = [
    # formula, {name: unit}
    ("P*L", {"P": "lbf", "L": "in"}),
    ("M*c/I", {"M": "kip*ft", "c": "in", "I": "in**4"}),
    ("pi/64*(D_o**4 - D_i**4)", {"D_o": "in", "D_i": "mm"}),  # a term converted before it is added
    ("sqrt(E*I/A)/L", {"E": "ksi", "I": "in**4", "A": "in**2", "L": "ft"}),
    ("a + b - c", {"a": "ft", "b": "in", "c": "m"}),
    ("min(a, b, c)", {"a": "ft", "b": "in", "c": "mm"}),
    ("max(a, b)", {"a": "kip", "b": "lbf"}),
    ("abs(M_1 - M_2)", {"M_1": "kip*in", "M_2": "lbf*ft"}),
    ("sin(theta)*P + cos(theta)*Q", {"theta": "degree", "P": "lbf", "Q": "kip"}),
    ("atan(h/b)", {"h": "in", "b": "ft"}),
    ("log(x/y) + exp(z/w)", {"x": "psi", "y": "ksi", "z": "in", "w": "ft"}),
    ("1/(1 - P/P_e)", {"P": "kip", "P_e": "lbf"}),
    ("(a/b)**(1/3)", {"a": "in**3", "b": "ft**3"}),
]


def _env(units: dict[str, str], rng: random.Random) -> dict[str, object]:
    return {n: Q_(rng.uniform(0.5, 50.0), u) for n, u in units.items()}


@pytest.mark.parametrize(("text", "units"), CASES)
def test_a_plan_gives_exactly_what_pint_gives_on_new_numbers(text: str, units: dict[str, str]) -> None:
    expr = parse_formula(text).expr
    rng = random.Random(20261204)
    first = _env(units, rng)
    quick_eval.learn(expr, first, _eval(expr, first, "s"))
    used = 0
    for _ in range(25):
        env = _env(units, rng)
        oracle = _eval(expr, env, "s")  # pint, node by node
        got = quick_eval.quick(expr, env)
        if got is None:  # numbers pint must handle itself (e.g. 1 - P/P_e near 0 is still finite: never here)
            continue
        used += 1
        assert type(got.magnitude) is type(oracle.magnitude)
        assert got.magnitude == oracle.magnitude  # the same float, bit for bit
        assert got._units == oracle._units
    assert used == 25


def test_an_expression_met_in_environments_of_other_orders_reads_its_own_inputs() -> None:
    # one Symbol object serves every formula that names it; the order of the inputs differs
    expr = parse_formula("P").expr
    a = {"P": Q_(3.0, "lbf"), "Q": Q_(7.0, "lbf")}
    b = {"Q": Q_(7.0, "lbf"), "P": Q_(3.0, "lbf")}
    quick_eval.learn(expr, a, _eval(expr, a, "s"))
    quick_eval.learn(expr, b, _eval(expr, b, "s"))
    assert quick_eval.quick(expr, {"P": Q_(4.0, "lbf"), "Q": Q_(9.0, "lbf")}).magnitude == 4.0
    assert quick_eval.quick(expr, {"Q": Q_(9.0, "lbf"), "P": Q_(4.0, "lbf")}).magnitude == 4.0


def test_numbers_that_need_pint_get_pints_messages_after_a_plan_exists() -> None:
    root = parse_formula("sqrt(x)*L").expr
    ok = {"x": Q_(4.0, ""), "L": Q_(2.0, "in")}
    assert evaluate_expr(root, ok, "s").magnitude == 4.0
    assert evaluate_expr(root, {"x": Q_(9.0, ""), "L": Q_(1.0, "in")}, "s").magnitude == 3.0  # from the plan
    with pytest.raises(DimensionError, match="fractional power of a negative value"):
        evaluate_expr(root, {"x": Q_(-4.0, ""), "L": Q_(2.0, "in")}, "s")
    div = parse_formula("P/A").expr
    evaluate_expr(div, {"P": Q_(1.0, "lbf"), "A": Q_(2.0, "in**2")}, "s")
    with pytest.raises(SheetError, match="division by zero"):
        evaluate_expr(div, {"P": Q_(1.0, "lbf"), "A": Q_(0.0, "in**2")}, "s")
    big = parse_formula("a*b").expr
    evaluate_expr(big, {"a": Q_(2.0, "in"), "b": Q_(3.0, "in")}, "s")
    with pytest.raises(NonFiniteError, match="not a finite number"):
        evaluate_expr(big, {"a": Q_(1e300, "in"), "b": Q_(1e300, "in")}, "s")
    log = parse_formula("log(x)").expr
    evaluate_expr(log, {"x": Q_(2.0, "")}, "s")
    with pytest.raises(SheetError, match="log of a value <= 0"):
        evaluate_expr(log, {"x": Q_(-1.0, "")}, "s")


def test_offset_units_and_variable_exponents_stay_with_pint() -> None:
    temp = parse_formula("T*k").expr
    env = {"T": Q_(70.0, "degF"), "k": Q_(2.0, "")}
    quick_eval.learn(temp, env, _eval(temp, env, "s"))
    assert quick_eval.quick(temp, env) is None
    power = parse_formula("L**n").expr
    env = {"L": Q_(2.0, "in"), "n": Q_(2.0, "")}
    quick_eval.learn(power, env, _eval(power, env, "s"))
    assert quick_eval.quick(power, env) is None  # the result's units depend on n


def test_a_plan_that_would_differ_from_pint_is_never_used() -> None:
    expr = parse_formula("a*b").expr
    env = {"a": Q_(2.0, "in"), "b": Q_(3.0, "in")}
    wrong = Q_(6.000000000000001, "in**2")  # not what a*b gives: the plan is refused
    quick_eval.learn(expr, env, wrong)
    assert quick_eval.quick(expr, env) is None


def test_copy_quantity_is_a_copy_a_change_in_place_leaves_alone() -> None:
    q = Q_(12.0, "in")
    c = copy_quantity(q)
    c.ito("ft")
    assert (q.magnitude, str(q.units)) == (12.0, "inch")
    assert math.isclose(c.magnitude, 1.0)
    arr = Q_(np.array([1.0, 2.0]), "in")
    d = copy_quantity(arr)
    d.magnitude[0] = 5.0
    assert arr.magnitude[0] == 1.0
    assert type(c) is type(q)


def test_a_plain_number_to_a_computed_power_is_planned_like_pint() -> None:
    # AISC 360-16 Eq. E3-2 shape: 0.658^(F_y/F_e) F_y
    expr = parse_formula("0.658**(F_y/F_e)*F_y").expr
    rng = random.Random(7)
    first = {"F_y": Q_(50.0, "ksi"), "F_e": Q_(80.0, "ksi")}
    quick_eval.learn(expr, first, _eval(expr, first, "s"))
    for _ in range(20):
        env = {"F_y": Q_(rng.uniform(30, 70), "ksi"), "F_e": Q_(rng.uniform(10, 900), "psi" if rng.random() < 0.5 else "ksi")}
        oracle = _eval(expr, env, "s")
        got = quick_eval.quick(expr, env)
        if env["F_e"].units == first["F_e"].units:
            assert got is not None and got.magnitude == oracle.magnitude and got._units == oracle._units
        else:
            assert got is None  # other units: another plan, learnt when pint has evaluated it once


@pytest.mark.parametrize(("src", "dst"), [("kip*ft", "lbf*in"), ("in**4", "mm**4"), ("psf", "kPa"), ("ksi", "ksi"),
                                          ("inch/foot", ""), ("degree", "radian"), ("kip/in", "N/m")])
def test_conversion_factor_converts_as_pint_does(src: str, dst: str) -> None:
    rng = random.Random(11)
    for _ in range(20):
        q = Q_(rng.uniform(-1e4, 1e4), src)
        target = Q_(1.0, dst)
        f = conversion_factor(q._units, target._units)
        assert (q.magnitude if f is None else q.magnitude * f) == q.to(target.units).magnitude  # pint, bit for bit
        b = base_factor(q._units)
        assert (q.magnitude if b is None else q.magnitude * b) == q.to_base_units().magnitude


def test_offset_units_have_no_conversion_factor() -> None:
    with pytest.raises(ValueError, match="offset unit"):
        conversion_factor(Q_(1.0, "degF")._units, Q_(1.0, "degC")._units)
