"""A sheet compiled once into plain numpy: sweeps, design searches and widgets run on this.

At compile time every quantity is resolved to SI base units: each given gets a scale factor
from its own unit to base, and each result a factor from base to its display unit. Each step
becomes one ``lambdify``-ed numpy function of the steps it uses, so a chain of steps runs as a
chain of array operations with no pint and no sympy at call time. Branches become
``numpy.where``; selections ``numpy.minimum``/``maximum``; check ratios plain divisions.
"""

from __future__ import annotations

import functools
from collections.abc import Callable
from typing import TYPE_CHECKING, Any

import numpy as np
import pint
import sympy as sp

from calcpad.core.errors import SheetError
from calcpad.core.steps import Branch, Check, FormulaStep, Given, Select
from calcpad.core.units import Q_

if TYPE_CHECKING:
    from calcpad.core.sheet import Sheet

__all__ = ["CompiledSheet"]


def _min(*args: Any) -> Any:
    return functools.reduce(np.minimum, args)


def _max(*args: Any) -> Any:
    return functools.reduce(np.maximum, args)


_MODULES = [{"Min": _min, "Max": _max}, "numpy"]


def _base_factor(q: pint.Quantity) -> float:
    """Factor that turns a magnitude in ``q``'s unit into SI base magnitude."""
    return float(Q_(1.0, q.units).to_base_units().magnitude)


def _lambdify(names: tuple[str, ...], expr: sp.Basic) -> Callable[..., Any]:
    symbols = [sp.Symbol(n) for n in names]
    return sp.lambdify(symbols, expr, modules=_MODULES)


class CompiledSheet:
    """Vectorised form of a sheet.

    Call with arrays (or scalars) for any givens, as plain numbers in each given's own unit or
    as pint quantities; givens not passed keep the sheet's value. Returns a dict of arrays for
    every step (in its display unit, see :attr:`units`) and every check ratio (by check key).
    """

    def __init__(self, sheet: Sheet) -> None:
        result = sheet.evaluate()  # fixes display units and validates the sheet
        self.title = sheet.title
        self.units: dict[str, str] = {}
        self.given_units: dict[str, pint.Unit] = {}
        self._given_scale: dict[str, float] = {}
        self._defaults: dict[str, float] = {}
        self._plan: list[tuple[str, Callable[[dict[str, Any]], Any]]] = []
        shown = {s.name: s.value for s in result.steps if hasattr(s, "name") and hasattr(s, "value")}
        for name in sheet.order():
            step = sheet._defs[name]
            if isinstance(step, Given):
                self.given_units[name] = step.value.units
                self._given_scale[name] = _base_factor(step.value)
                self._defaults[name] = float(step.value.magnitude) * self._given_scale[name]
                self.units[name] = str(step.value.units)
                continue
            if isinstance(step, Check):
                self._plan.append((name, self._check_fn(step)))
                self.units[name] = ""
                continue
            out_unit = shown[name].units
            to_display = 1.0 / _base_factor(Q_(1.0, out_unit))
            self.units[name] = str(out_unit)
            if isinstance(step, FormulaStep):
                fn = self._formula_fn(step.formula.names, step.formula.expr)
            elif isinstance(step, Branch):
                fn = self._branch_fn(step)
            elif isinstance(step, Select):
                fn = self._select_fn(step)
            else:  # pragma: no cover - every defining step kind is handled above
                raise SheetError(f"cannot compile {type(step).__name__}")
            self._plan.append((name, fn))
            self._display_scale = getattr(self, "_display_scale", {})
            self._display_scale[name] = to_display
        self._display_scale = getattr(self, "_display_scale", {})
        self._checks = {s.key for s in result.checks}

    @staticmethod
    def _formula_fn(names: tuple[str, ...], expr: sp.Basic) -> Callable[[dict[str, Any]], Any]:
        f = _lambdify(names, expr)
        return lambda env: f(*(env[n] for n in names))

    def _branch_fn(self, step: Branch) -> Callable[[dict[str, Any]], Any]:
        parts = []
        for case in step.cases:
            value = self._formula_fn(case.formula.names, case.formula.expr)
            cond = self._formula_fn(case.condition.names, case.condition.expr) if case.condition else None
            parts.append((cond, value))

        def run(env: dict[str, Any]) -> Any:
            with np.errstate(all="ignore"):
                out = parts[-1][1](env)
                for cond, value in reversed(parts[:-1]):
                    out = np.where(cond(env), value(env), out)
            return out

        return run

    @staticmethod
    def _select_fn(step: Select) -> Callable[[dict[str, Any]], Any]:
        names = list(step.candidates)
        pick = _min if step.mode == "min" else _max
        return lambda env: pick(*(env[n] for n in names))

    @staticmethod
    def _check_fn(step: Check) -> Callable[[dict[str, Any]], Any]:
        req = step.required_fs

        def run(env: dict[str, Any]) -> Any:
            ratio = np.abs(env[step.demand]) / env[step.capacity]
            return ratio * req if req is not None else ratio

        return run

    def _inputs(self, values: dict[str, Any]) -> dict[str, Any]:
        env: dict[str, Any] = dict(self._defaults)
        for name, v in values.items():
            if name not in self._given_scale:
                raise SheetError(f"compiled sheet {self.title!r}: {name!r} is not a given")
            if isinstance(v, pint.Quantity):
                v = v.to(self.given_units[name]).magnitude
            env[name] = np.asarray(v, dtype=float) * self._given_scale[name]
        return env

    def __call__(self, **values: Any) -> dict[str, Any]:
        """Evaluate for arrays of givens; returns every step and check ratio."""
        env = self._inputs(values)
        for name, fn in self._plan:
            env[name] = fn(env)
        out: dict[str, Any] = {}
        for name, value in env.items():
            if name in self._display_scale:
                out[name] = value * self._display_scale[name]
            elif name in self._given_scale:
                out[name] = value / self._given_scale[name]
            else:
                out[name] = value
        return out

    def ratios(self, **values: Any) -> dict[str, Any]:
        """Only the check ratios, by check key."""
        res = self(**values)
        return {k: res[k] for k in self._checks}
