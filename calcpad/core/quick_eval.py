"""A formula's value by plain float arithmetic, for a formula seen before with inputs in the same units.

:mod:`calcpad.core.quantity_eval` walks the sympy tree with pint quantities: every node makes a
Quantity and combines unit containers, which is most of a sheet's time when each member of a
large table brings new numbers. The units of a result do not depend on the numbers, only on the
formula and the inputs' units, so once per (formula, input units, magnitude types) this module
records the result's units and a function of the input magnitudes that repeats pint's arithmetic
operation by operation: the same products in the same order, the same conversion factor where
pint converts a term before adding it (``value * factor``, as pint's ``convert`` does), the same
functions. A plan is trusted only after it gave exactly pint's answer (value, type and units) on
the inputs that made it, and it covers only what is plain arithmetic: multiplicative units
(no offset, delta or logarithmic units), scalar Python/numpy float or int magnitudes and
constant exponents. Anything that depends on the numbers — a fractional power of a negative
value, a log of a value <= 0, a division by zero, an overflow, a result that is not finite — is
handed back to pint, whose messages name the step and the inputs.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Mapping
from typing import Any

import numpy as np
import pint
import sympy as sp

from calcpad.core.registry import Q_, ureg

__all__ = ["learn", "quick"]

_Plan = tuple[Callable[[tuple[Any, ...]], Any], Any]  # (magnitudes -> magnitude, result units container)
_NONE = ureg.UnitsContainer()
_RADIAN = ureg.Unit("radian")._units
_SCALARS = (float, int, np.float64)

#: (id(expr), input units and magnitude types) -> (expr, plan or None); None: pint always.
_PLANS: dict[tuple[Any, ...], tuple[sp.Basic, _Plan | None]] = {}
_PLANS_MAX = 5_000


class _UnplannableError(Exception):
    """The formula needs pint (a variable exponent, an offset unit, mixed dimensions, ...)."""


class _FallbackError(Exception):
    """These numbers need pint's own handling (its error message or its special case)."""


def _key(expr: sp.Basic, env: Mapping[str, Any]) -> tuple[Any, ...] | None:
    parts: list[Any] = [id(expr)]
    for name, q in env.items():  # names too: one expression (a Symbol, say) is met in environments of other orders
        if not isinstance(q, pint.Quantity):
            return None
        mag = q._magnitude
        if type(mag) not in _SCALARS:
            return None
        parts += (name, q._units, type(mag))
    return tuple(parts)


def quick(expr: sp.Basic, env: Mapping[str, pint.Quantity]) -> pint.Quantity | None:
    """``expr``'s value from a plan learnt before, or None (then pint evaluates, then :func:`learn`)."""
    key = _key(expr, env)
    if key is None:
        return None
    hit = _PLANS.get(key)
    if hit is None or hit[0] is not expr or hit[1] is None:
        return None
    fn, units = hit[1]
    try:
        with np.errstate(all="ignore"):
            mag = fn(tuple(q._magnitude for q in env.values()))
    except (_FallbackError, ArithmeticError, ValueError):
        return None
    if not math.isfinite(mag):
        return None  # pint's path names the step and its inputs
    return Q_(mag, units)


def learn(expr: sp.Basic, env: Mapping[str, pint.Quantity], value: pint.Quantity) -> None:
    """Make a plan for ``expr`` with inputs in ``env``'s units, given pint's ``value`` for ``env``:
    kept only when it reproduces ``value`` exactly; otherwise pint keeps evaluating this formula."""
    key = _key(expr, env)
    if key is None or (key in _PLANS and _PLANS[key][0] is expr):
        return
    plan: _Plan | None
    try:
        index = {name: i for i, name in enumerate(env)}
        units = {name: q._units for name, q in env.items()}
        for q in env.values():
            if q._get_non_multiplicative_units() or q._get_delta_units() or getattr(q, "_is_logarithmic", False):
                raise _UnplannableError
        fn, out_units = _build(expr, index, units)
        with np.errstate(all="ignore"):
            mag = fn(tuple(q._magnitude for q in env.values()))
        same = (type(mag) is type(value._magnitude) and out_units == value._units
                and (mag == value._magnitude or (mag != mag and value._magnitude != value._magnitude)))
        plan = (fn, out_units) if same else None
    except Exception:  # a plan is only a shortcut: anything unexpected leaves the formula to pint
        plan = None
    if len(_PLANS) >= _PLANS_MAX:
        _PLANS.clear()
    _PLANS[key] = (expr, plan)


def _factor(src: Any, dst: Any) -> float | None:
    """pint's conversion factor from ``src`` to ``dst`` units (None: the same units, no conversion)."""
    if src == dst:
        return None
    if ureg.get_dimensionality(src) != ureg.get_dimensionality(dst):
        raise _UnplannableError
    return ureg.convert(1.0, src, dst)  # pint converts as value * factor


def _build(node: sp.Basic, index: dict[str, int], units: dict[str, Any]) -> tuple[Callable[[tuple[Any, ...]], Any], Any]:
    """The magnitude function and the units container of ``node``, mirroring ``quantity_eval._eval``."""
    if isinstance(node, sp.Symbol):
        if node.name not in index:
            raise _UnplannableError
        i = index[node.name]
        return (lambda m: m[i]), units[node.name]
    if node is sp.pi:
        return (lambda _m: math.pi), _NONE
    if isinstance(node, sp.Number):
        c = float(node)
        return (lambda _m: c), _NONE
    if isinstance(node, sp.Add):
        first, total = _build(node.args[0], index, units)
        terms = []
        for arg in node.args[1:]:
            fn, u = _build(arg, index, units)
            terms.append((fn, _factor(u, total)))
        return _sum(first, terms), total
    if isinstance(node, sp.Mul):
        parts = [_build(a, index, units) for a in node.args]
        out = _NONE
        for _, u in parts:
            out = out * u
        return _product([fn for fn, _ in parts]), out
    if isinstance(node, sp.Pow):
        base, u = _build(node.args[0], index, units)
        efn, eu = _build(node.args[1], index, units)
        factor = _dimensionless(eu)
        if node.args[1].free_symbols:
            if u:
                raise _UnplannableError  # the result's units would depend on the exponent's value
            return _variable_power(base, efn, factor), _NONE  # a plain number to a computed power
        # a constant exponent (1/3 may arrive unevaluated)
        e = float(efn(()) if factor is None else efn(()) * factor)
        exponent: float | int = int(e) if e.is_integer() else e
        if exponent == 1:
            return base, u
        if exponent == 0:
            return _power(base, 0), _NONE
        return _power(base, exponent), u**exponent
    if isinstance(node, (sp.Min, sp.Max)):
        parts = [_build(a, index, units) for a in node.args]
        first_units = parts[0][1]
        pick = np.minimum if isinstance(node, sp.Min) else np.maximum
        return _extreme([(fn, _factor(u, first_units)) for fn, u in parts], pick), first_units
    if isinstance(node, sp.Abs):
        fn, u = _build(node.args[0], index, units)
        return (lambda m: abs(fn(m))), u
    if isinstance(node, (sp.sin, sp.cos, sp.tan)):
        fn, u = _build(node.args[0], index, units)
        if ureg.get_dimensionality(u):
            raise _UnplannableError
        func = {sp.sin: np.sin, sp.cos: np.cos, sp.tan: np.tan}[type(node)]
        to_rad = _factor(u, _RADIAN)
        return _unary(fn, to_rad, func), _NONE
    if isinstance(node, (sp.asin, sp.acos, sp.atan)):
        fn, u = _build(node.args[0], index, units)
        func = {sp.asin: np.arcsin, sp.acos: np.arccos, sp.atan: np.arctan}[type(node)]
        return _unary(fn, _dimensionless(u), lambda x: func(float(x))), _RADIAN
    if isinstance(node, (sp.log, sp.exp)):
        fn, u = _build(node.args[0], index, units)
        factor = _dimensionless(u)
        if isinstance(node, sp.exp):
            return _unary(fn, factor, lambda x: math.exp(float(x))), _NONE
        base = math.log(float(node.args[1])) if len(node.args) == 2 else None
        return _logarithm(fn, factor, base), _NONE
    raise _UnplannableError


def _dimensionless(u: Any) -> float | None:
    """The factor ``_dimensionless_float`` applies (``q.to(dimensionless)``)."""
    if ureg.get_dimensionality(u):
        raise _UnplannableError
    return _factor(u, _NONE)


def _sum(first: Callable, terms: list[tuple[Callable, float | None]]) -> Callable:
    def f(m: tuple[Any, ...]) -> Any:
        total = first(m)
        for fn, factor in terms:
            total = total + (fn(m) if factor is None else fn(m) * factor)
        return total
    return f


def _product(fns: list[Callable]) -> Callable:
    def f(m: tuple[Any, ...]) -> Any:
        out = 1.0
        for fn in fns:
            out = out * fn(m)
        return out
    return f


def _power(base: Callable, exponent: float | int) -> Callable:
    fractional = not isinstance(exponent, int)

    def f(m: tuple[Any, ...]) -> Any:
        b = base(m)
        if fractional and b < 0:
            raise _FallbackError  # pint's path refuses it with the step's name
        return b**exponent
    return f


def _variable_power(base: Callable, exponent: Callable, factor: float | None) -> Callable:
    def f(m: tuple[Any, ...]) -> Any:
        b = base(m)
        x = exponent(m)
        e = float(x if factor is None else x * factor)  # as quantity_eval's _dimensionless_float
        n: float | int = int(e) if e.is_integer() else e
        if not isinstance(n, int) and b < 0:
            raise _FallbackError
        return b if n == 1 else b**n
    return f


def _extreme(parts: list[tuple[Callable, float | None]], pick: Callable) -> Callable:
    def f(m: tuple[Any, ...]) -> Any:
        # as quantity_eval: every value in the first one's units (``to`` keeps a value in its own units)
        mags = [fn(m) if factor is None else fn(m) * factor for fn, factor in parts]
        out = mags[0]
        for x in mags[1:]:
            out = pick(out, x)
        return out
    return f


def _unary(fn: Callable, factor: float | None, func: Callable) -> Callable:
    def f(m: tuple[Any, ...]) -> Any:
        x = fn(m)
        return func(x if factor is None else x * factor)
    return f


def _logarithm(fn: Callable, factor: float | None, base: float | None) -> Callable:
    def f(m: tuple[Any, ...]) -> Any:
        x = fn(m)
        x = float(x if factor is None else x * factor)
        if x <= 0:
            raise _FallbackError
        return math.log(x) if base is None else math.log(x) / base
    return f
