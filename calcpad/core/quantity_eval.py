"""Evaluate a parsed formula on pint quantities, node by node, with clear dimension errors.

Walking the sympy tree ourselves (instead of lambdify) lets an error name the two terms whose
dimensions disagree, e.g. "cannot add P (a force) and L (a length)".
"""

from __future__ import annotations

import math
from collections.abc import Mapping

import numpy as np
import pint
import sympy as sp

from calcpad.core.errors import DimensionError, NonFiniteError, SheetError
from calcpad.core.quick_eval import learn, quick
from calcpad.core.units import Q_, format_number, kind_of, unit_symbol, ureg

__all__ = ["describe_inputs", "evaluate_condition", "evaluate_expr", "is_finite", "non_finite_error"]

_DIMLESS = ureg.dimensionless


def _label(node: sp.Basic) -> str:
    text = str(node)
    return text if len(text) <= 40 else text[:37] + "..."


def _dimensionless_float(q: pint.Quantity, node: sp.Basic, what: str, step: str) -> float:
    if isinstance(q, pint.Quantity):
        if q.dimensionality == _DIMLESS.dimensionality:
            return float(q.to(_DIMLESS).magnitude)
        raise DimensionError(
            f"step {step!r}: {what} {_label(node)} must be dimensionless, but it is a {kind_of(q.dimensionality)} ({q.units:~})"
        )
    return float(q)


def is_finite(value: object) -> bool:
    """True when every number in ``value`` (a quantity, float or array) is finite."""
    mag = value.magnitude if isinstance(value, pint.Quantity) else value
    try:
        return bool(np.all(np.isfinite(mag)))
    except TypeError:  # not numeric
        return True


def describe_inputs(env: Mapping[str, pint.Quantity]) -> str:
    """``"P = 1,000 lbf, L = 84 in"``: the values a step used, for messages."""
    parts = []
    for name, q in env.items():
        mag = q.magnitude if isinstance(q, pint.Quantity) else q
        unit = unit_symbol(q.units) if isinstance(q, pint.Quantity) else ""
        parts.append(f"{name} = {format_number(float(mag), 4)} {unit}".rstrip())
    return ", ".join(parts) if parts else "no inputs"


def non_finite_error(step: str, value: object, env: Mapping[str, pint.Quantity], what: str = "the result") -> NonFiniteError:
    """The error for a step whose value is NaN or infinite, naming the step and its inputs."""
    mag = np.asarray(value.magnitude if isinstance(value, pint.Quantity) else value, dtype=float)
    undefined = bool(np.any(np.isnan(mag)))
    kind = "undefined (NaN)" if undefined else "infinite (overflow or division by zero)"
    inputs = f"; inputs: {describe_inputs(env)}. Check these inputs" if env else ". Check the inputs"
    hint = " (asin and acos need a value from -1 to 1, sqrt and fractional powers a value >= 0)" if undefined else ""
    return NonFiniteError(f"step {step!r}: {what} is not a finite number, it is {kind}{inputs}{hint}")


def evaluate_expr(expr: sp.Basic, env: Mapping[str, pint.Quantity], step: str = "?") -> pint.Quantity:
    """Evaluate ``expr`` with the quantities in ``env``; result is a finite pint quantity.

    Raises:
        NonFiniteError: The result is NaN or infinite (names the step and the inputs).
        DimensionError, SheetError: Dimensions disagree, division by zero, log of a value <= 0.
    """
    value = _quiet_eval(expr, env, step)
    if not is_finite(value):
        raise non_finite_error(step, value, env)
    return value


def _quiet_eval(expr: sp.Basic, env: Mapping[str, pint.Quantity], step: str) -> pint.Quantity:
    """Evaluate without numpy warnings; NaN and infinity are checked by the caller. A formula met
    before with inputs in the same units is worked in plain floats (:mod:`calcpad.core.quick_eval`:
    the same numbers, checked against pint once); other numbers go through pint."""
    value = quick(expr, env)
    if value is not None:
        return value
    try:
        with np.errstate(all="ignore"):
            value = _as_q(_eval(expr, env, step))
    except OverflowError:
        raise NonFiniteError(f"step {step!r}: a value is too large to represent (overflow); inputs: {describe_inputs(env)}") from None
    learn(expr, env, value)
    return value


def _as_q(v: object) -> pint.Quantity:
    return v if isinstance(v, pint.Quantity) else Q_(v, _DIMLESS)


def _eval(node: sp.Basic, env: Mapping[str, pint.Quantity], step: str) -> pint.Quantity:
    if isinstance(node, sp.Symbol):
        try:
            return env[node.name]
        except KeyError:
            raise SheetError(f"step {step!r}: no value for {node.name!r}") from None
    if node is sp.pi:
        return Q_(math.pi, _DIMLESS)
    if isinstance(node, sp.Number):
        return Q_(float(node), _DIMLESS)
    if isinstance(node, sp.Add):
        terms = node.args
        total = _eval(terms[0], env, step)
        for term in terms[1:]:
            value = _eval(term, env, step)
            try:
                total = total + value
            except pint.DimensionalityError:
                raise DimensionError(
                    f"step {step!r}: cannot add {_label(terms[0])} (a {kind_of(_as_q(total).dimensionality)}) "
                    f"and {_label(term)} (a {kind_of(_as_q(value).dimensionality)})"
                ) from None
        return total
    if isinstance(node, sp.Mul):
        out = Q_(1.0, _DIMLESS)
        for arg in node.args:
            out = out * _eval(arg, env, step)
        return out
    if isinstance(node, sp.Pow):
        base = _eval(node.args[0], env, step)
        exp_node = node.args[1]
        exponent = _dimensionless_float(_eval(exp_node, env, step), exp_node, "the exponent", step)
        if float(exponent).is_integer():
            exponent = int(exponent)
        try:
            if isinstance(base, pint.Quantity) and np.any(np.asarray(base.magnitude) < 0) and not isinstance(exponent, int):
                raise DimensionError(f"step {step!r}: {_label(node)} takes a fractional power of a negative value")
            return base**exponent
        except ZeroDivisionError:
            raise SheetError(f"step {step!r}: division by zero in {_label(node)}") from None
    if isinstance(node, (sp.Min, sp.Max)):
        values = [_eval(a, env, step) for a in node.args]
        first = _as_q(values[0])
        try:
            mags = [_as_q(v).to(first.units).magnitude for v in values]
        except pint.DimensionalityError:
            raise DimensionError(f"step {step!r}: {type(node).__name__.lower()}() of values with different dimensions") from None
        pick = np.minimum if isinstance(node, sp.Min) else np.maximum
        out = mags[0]
        for m in mags[1:]:
            out = pick(out, m)
        return Q_(out, first.units)
    if isinstance(node, sp.Abs):
        return abs(_eval(node.args[0], env, step))
    if isinstance(node, (sp.sin, sp.cos, sp.tan)):
        arg = _as_q(_eval(node.args[0], env, step))
        if arg.dimensionality != _DIMLESS.dimensionality:
            raise DimensionError(f"step {step!r}: {type(node).__name__}() needs an angle, got a {kind_of(arg.dimensionality)}")
        func = {sp.sin: np.sin, sp.cos: np.cos, sp.tan: np.tan}[type(node)]
        return Q_(func(arg.to("radian").magnitude), _DIMLESS)
    if isinstance(node, (sp.asin, sp.acos, sp.atan)):
        x = _dimensionless_float(_eval(node.args[0], env, step), node.args[0], "the argument", step)
        func = {sp.asin: np.arcsin, sp.acos: np.arccos, sp.atan: np.arctan}[type(node)]
        return Q_(func(x), "radian")
    if isinstance(node, (sp.log, sp.exp)):
        x = _dimensionless_float(_eval(node.args[0], env, step), node.args[0], "the argument", step)
        if isinstance(node, sp.exp):
            return Q_(math.exp(x), _DIMLESS)
        if x <= 0:
            raise SheetError(f"step {step!r}: log of a value <= 0 ({x:g})")
        if len(node.args) == 2:
            return Q_(math.log(x) / math.log(float(node.args[1])), _DIMLESS)
        return Q_(math.log(x), _DIMLESS)
    raise SheetError(f"step {step!r}: cannot evaluate {type(node).__name__} in {_label(node)}")


def evaluate_condition(
    cond: sp.Basic, env: Mapping[str, pint.Quantity], step: str = "?"
) -> tuple[bool, tuple[pint.Quantity, pint.Quantity] | None]:
    """Evaluate a branch condition; also return (lhs, rhs) of a single comparison for display."""
    if isinstance(cond, (sp.And, sp.Or)):
        results = [evaluate_condition(a, env, step)[0] for a in cond.args]
        return (all(results) if isinstance(cond, sp.And) else any(results)), None
    if isinstance(cond, sp.Not):
        return (not evaluate_condition(cond.args[0], env, step)[0]), None
    if isinstance(cond, sp.core.relational.Relational):
        lhs = _quiet_eval(cond.lhs, env, step)
        rhs = _quiet_eval(cond.rhs, env, step)
        for side, value in (("the left side of the condition", lhs), ("the right side of the condition", rhs)):
            if not is_finite(value):
                raise non_finite_error(step, value, env, side)
        try:
            right = rhs.to(lhs.units).magnitude
        except pint.DimensionalityError:
            raise DimensionError(
                f"step {step!r}: cannot compare {_label(cond.lhs)} (a {kind_of(lhs.dimensionality)}) "
                f"with {_label(cond.rhs)} (a {kind_of(rhs.dimensionality)})"
            ) from None
        left = lhs.magnitude
        op = cond.rel_op
        held = {"<": left < right, "<=": left <= right, ">": left > right, ">=": left >= right}[op]
        return bool(held), (lhs, rhs)
    raise SheetError(f"step {step!r}: a branch condition must be a comparison, got {_label(cond)}")
