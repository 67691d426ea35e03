"""A sheet compiled once into plain numpy: sweeps, design searches and widgets run on this.

At compile time every quantity is resolved to SI base units: each given gets a scale factor
from its own unit to base, and each result a factor from base to its display unit. Each step
becomes a numpy closure built from the already-whitelisted formula tree, with the unit factors
folded into one coefficient per product and scalars combined before arrays are touched, so a
chain of steps runs as a short chain of array operations with no pint and no sympy at call time.
Branches become ``numpy.where``; selections ``numpy.minimum``/``maximum``.

A call returns a :class:`CompiledResult`: the arrays by name plus a per-case validity mask.
A case is invalid exactly where the scalar path would raise for a number: a step value or check
ratio that is NaN or infinite, or a check capacity that is not greater than zero. The values of
an invalid case are NaN (so a ratio never reads OK), and the result says which step failed
first for each case and with which inputs (:meth:`CompiledResult.reason`).
"""

from __future__ import annotations

import math
import threading
from collections.abc import Callable
from typing import TYPE_CHECKING, Any

import numpy as np
import pint
import sympy as sp

from calcpad.core.errors import NonFiniteError, SheetError
from calcpad.core.steps import Branch, Check, FormulaStep, Given, Select
from calcpad.core.units import Q_, format_number, unit_symbol

if TYPE_CHECKING:
    from calcpad.core.sheet import Sheet

__all__ = ["CompiledResult", "CompiledSheet"]


def _base_factor(q: pint.Quantity) -> float:
    """Factor that turns a magnitude in ``q``'s unit into SI base magnitude."""
    return float(Q_(1.0, q.units).to_base_units().magnitude)


Fn = Callable[[dict[str, Any]], Any]
#: A compiled part: returns its value and whether that value is an array this call made (and so
#: may be overwritten in place by the next operation) — never an input or another step's array.
Part = Callable[[dict[str, Any]], tuple[Any, bool]]

_UFUNCS: dict[type, Any] = {
    sp.sin: np.sin, sp.cos: np.cos, sp.tan: np.tan, sp.asin: np.arcsin, sp.acos: np.arccos,
    sp.atan: np.arctan, sp.exp: np.exp, sp.Abs: np.abs,
}
_COMPARE = {"<": np.less, "<=": np.less_equal, ">": np.greater, ">=": np.greater_equal}
#: Integer powers written out as products (x**4 = (x*x)**2: two passes where np.power takes a
#: general pow per element).
_EXPAND_UP_TO = 4
#: Cases per block on large calls: the intermediate arrays of a block (8 bytes a case) stay in
#: the processor's cache; only the steps returned are written to whole-size arrays.
BLOCK_CASES = 65_536
#: Keys of the block buffer pool and of the step's output slice in the evaluation environment
#: (no name can hold a NUL).
_POOL = "\0pool"
_TARGET = "\0target"
#: Key of the record of conditions decided close to their boundary (:meth:`CompiledSheet.ratios_near`).
_NEAR = "\0near"


class _Pool:
    """Float arrays of a block's shapes, handed out and taken back while the blocks of a call run,
    so each block reuses the memory (and cache lines) of the one before rather than asking the
    allocator, whose fresh pages cost more than the arithmetic. One per thread (Dask workers may
    run threads), kept between calls and bounded."""

    MAX_BUFFERS = 32

    def __init__(self) -> None:
        self.free: dict[tuple[int, ...], list[np.ndarray]] = {}
        self.count = 0

    def take(self, shape: tuple[int, ...]) -> np.ndarray:
        stack = self.free.get(shape)
        if stack:
            self.count -= 1
            return stack.pop()
        return np.empty(shape)

    def keep_rows(self, rows: set[int]) -> None:
        """Drop the buffers whose first dimension is none of ``rows`` (another call's blocks)."""
        self.free = {s: v for s, v in self.free.items() if s and s[0] in rows}
        self.count = sum(len(v) for v in self.free.values())

    def give(self, a: Any) -> None:
        if self.count < self.MAX_BUFFERS and a.base is None and a.dtype == np.float64:  # never a view (an output)
            self.free.setdefault(a.shape, []).append(a)
            self.count += 1


_THREAD = threading.local()


def _thread_pool() -> _Pool:
    pool = getattr(_THREAD, "pool", None)
    if pool is None:
        pool = _THREAD.pool = _Pool()
    return pool


def _shape_of(args: tuple[Any, ...]) -> tuple[int, ...]:
    shape: tuple[int, ...] = ()
    for a in args:
        s = a.shape if type(a) is np.ndarray else np.shape(a)
        if s != shape:
            shape = s if not shape else np.broadcast_shapes(shape, s)
    return shape


def _new(env: dict[str, Any], op: Any, *args: Any) -> tuple[Any, bool]:
    """``op(*args)`` into a new float array (from the block pool when blocks are running)."""
    pool = env.get(_POOL)
    if pool is not None and all(type(a) is not np.ndarray or a.dtype == np.float64 for a in args):
        shape = _shape_of(args)
        if shape:
            target = env[_TARGET]
            if target is not None and target.shape == shape:  # the step's first array: its output slice
                buf, env[_TARGET] = target, None
            else:
                buf = pool.take(shape)
            op(*args, out=buf)
            return buf, True
    res = op(*args)
    return res, isinstance(res, np.ndarray)


def _drop(env: dict[str, Any], v: Any, own: bool) -> None:
    """``v`` (this call's own array) is no longer needed: back to the block pool, if any."""
    if own:
        pool = env.get(_POOL)
        if pool is not None:
            pool.give(v)


def _fits(out: Any, v: Any) -> bool:
    """True when ``out op v`` can be written into ``out`` (a float array at least as large)."""
    if not isinstance(out, np.ndarray) or out.dtype.kind != "f":
        return False
    shape = v.shape if type(v) is np.ndarray else np.shape(v)
    return shape == out.shape or not shape or np.broadcast_shapes(out.shape, shape) == out.shape


def _apply(env: dict[str, Any], op: Any, out: Any, own: bool, v: Any, vown: bool = False) -> tuple[Any, bool]:
    """``op(out, v)``, written into whichever operand is this call's own array and can hold the
    result (``out`` first), else into a new array. An own operand not written into is dropped."""
    if own and _fits(out, v):
        op(out, v, out=out)
        _drop(env, v, vown and v is not out)
        return out, True
    if vown and _fits(v, out):
        op(out, v, out=v)
        return v, True
    res = _new(env, op, out, v)
    _drop(env, out, own)
    _drop(env, v, vown)
    return res


def _unary(op: Any, arg: Part) -> Part:
    def run(env: dict[str, Any]) -> tuple[Any, bool]:
        v, own = arg(env)
        if own and isinstance(v, np.ndarray) and v.dtype.kind == "f":
            op(v, out=v)
            return v, True
        if isinstance(v, np.ndarray) and v.dtype.kind == "f":
            return _new(env, op, v)
        res = op(v)
        return res, isinstance(res, np.ndarray)

    return run


def _fold(parts: list[Part], op: Any) -> Part:
    """Combine the values of ``parts`` left to right with a binary numpy ufunc."""

    def run(env: dict[str, Any]) -> tuple[Any, bool]:
        out, own = parts[0](env)
        for f in parts[1:]:
            out, own = _apply(env, op, out, own, *f(env))
        return out, own

    return run


def _sum(terms: list[tuple[bool, Part]]) -> Part:
    """Σ ±term: subtracted terms are subtracted (no negated copy); the first array made is reused."""

    def run(env: dict[str, Any]) -> tuple[Any, bool]:
        neg, f = terms[0]
        out, own = f(env)
        if neg:  # a leading minus (rare): negate the first term
            out, own = _unary(np.negative, lambda _env: (out, own))(env)
        for neg, f in terms[1:]:
            out, own = _apply(env, np.subtract if neg else np.add, out, own, *f(env))
        return out, own

    return run


def _power(inner: Part, k: int) -> Part:
    """``inner ** k`` for a whole k ≥ 1: written out as products up to ``_EXPAND_UP_TO``."""
    if k == 1:
        return inner

    def run(env: dict[str, Any]) -> tuple[Any, bool]:
        v, own = inner(env)
        if type(v) is not np.ndarray or v.ndim == 0 or k > _EXPAND_UP_TO:
            res = v**k
            return res, isinstance(res, np.ndarray)
        if own and k != 3:  # x**3 needs x after squaring it
            sq = np.multiply(v, v, out=v)
        else:
            sq = _new(env, np.multiply, v, v)[0]
        if k == 3:
            np.multiply(sq, v, out=sq)
            _drop(env, v, own)
        elif k == 4:
            np.multiply(sq, sq, out=sq)
        return sq, True

    return run


def _product(coef: float, num: list[Part], den: list[Part]) -> Part:
    """coef · Πnum / Πden: scalars multiplied first, the first array made is reused for the rest,
    and the coefficient is applied once at the end (or not at all when it is 1)."""

    def run(env: dict[str, Any]) -> tuple[Any, bool]:
        scal, arrs = coef, []
        for f in num:
            v, own = f(env)
            if type(v) is not np.ndarray or v.ndim == 0:
                scal = scal * v
            else:
                arrs.append((v, own, False))
        for f in den:
            v, own = f(env)
            if type(v) is not np.ndarray or v.ndim == 0:
                scal = scal / v
            else:
                arrs.append((v, own, True))
        if not arrs:
            return scal, False
        out, own, inv = arrs[0]
        if inv:
            if own:
                np.divide(scal, out, out=out)
            else:
                out, own = _new(env, np.divide, scal, out)
            scal = 1.0
        for v, vown, inv in arrs[1:]:
            out, own = _apply(env, np.divide if inv else np.multiply, out, own, v, vown)
        if scal != 1.0:
            out, own = _apply(env, np.multiply, out, own, scal)
        return out, own

    return run


def compile_expr(expr: sp.Basic, scale: dict[str, float]) -> Fn:
    """Compile a parsed formula into a numpy closure over display-unit values.

    Unit factors of every name (display unit → SI base) are folded into one coefficient per
    product, and a sum takes the coefficient its terms share outside it (terms in one unit need
    no scaling at all; the factor merges with the step's own factor back to its display unit), so
    no separate conversion passes run. Subtracted terms are subtracted, whole powers up to 4 are
    products, and each step allocates one array and works in it. Written by hand rather than with
    ``lambdify`` so constants and scalars are combined before any array is touched.
    """
    part = _compile(expr, scale)
    return lambda env: part(env)[0]


def compile_part(expr: sp.Basic, scale: dict[str, float]) -> Part:
    """As :func:`compile_expr`, returning the value and whether it is an array this call made."""
    return _compile(expr, scale)


def _compile(expr: sp.Basic, scale: dict[str, float]) -> Part:

    def term(e: sp.Basic) -> tuple[float, list[Part], list[Part]]:
        if isinstance(e, sp.Symbol):
            name = e.name
            return scale.get(name, 1.0), [lambda env: (env[name], False)], []
        if e is sp.pi:
            return float(np.pi), [], []
        if isinstance(e, sp.Number):
            return float(e), [], []
        if isinstance(e, sp.Mul):
            coef, num, den = 1.0, [], []
            for arg in e.args:
                c, n, d = term(arg)
                coef, num, den = coef * c, num + n, den + d
            return coef, num, den
        if isinstance(e, sp.Pow) and e.args[1].is_Integer and e.args[1] != 0:
            k = int(e.args[1])
            c, n, d = term(e.args[0])
            if not (n or d):
                return c**k, [], []
            powered = _power(_product(1.0, n, d), abs(k))
            return (c**k, [], [powered]) if k < 0 else (c**k, [powered], [])
        if isinstance(e, sp.Add):
            parts = [term(a) for a in e.args]
            common = next((abs(c) for c, n, d in parts if c != 0 and (n or d)), 1.0)
            terms = []
            for c, n, d in parts:
                if not (n or d):
                    terms.append((c < 0, _const(abs(c) / common)))
                else:
                    terms.append((c < 0, _product(abs(c) / common, n, d)))
            return common, [_sum(terms)], []
        return 1.0, [build(e)], []

    def build(e: sp.Basic) -> Part:
        if isinstance(e, (sp.Symbol, sp.Number, sp.Mul, sp.Add)) or e is sp.pi or (isinstance(e, sp.Pow) and e.args[1].is_Integer):
            coef, num, den = term(e)
            return _product(coef, num, den)
        if isinstance(e, sp.Pow):
            base, exp = build(e.args[0]), build(e.args[1])
            if e.args[1] == sp.Rational(1, 2):
                return _unary(np.sqrt, base)
            return _binary(np.power, base, exp)
        if isinstance(e, (sp.Min, sp.Max)):
            return _fold([build(a) for a in e.args], np.minimum if isinstance(e, sp.Min) else np.maximum)
        if type(e) in _UFUNCS:
            return _unary(_UFUNCS[type(e)], build(e.args[0]))
        if isinstance(e, sp.log):
            arg = build(e.args[0])
            if len(e.args) == 2:
                div = float(np.log(float(e.args[1])))
                return _binary(np.divide, _unary(np.log, arg), _const(div))
            return _unary(np.log, arg)
        if isinstance(e, sp.core.relational.Relational):
            return _relation(build(e.lhs), build(e.rhs), _COMPARE[e.rel_op])
        if isinstance(e, (sp.And, sp.Or)):
            return _fold([build(a) for a in e.args], np.logical_and if isinstance(e, sp.And) else np.logical_or)
        if isinstance(e, sp.Not):
            arg = build(e.args[0])
            return lambda env: _fresh(np.logical_not(arg(env)[0]))
        raise SheetError(f"cannot compile {type(e).__name__} in {e}")

    return build(expr)


class _Near:
    """The cases in which a condition's sides lie within ``rel`` (relative to the larger side) of
    each other: there another rounding of the same numbers may decide the other way."""

    def __init__(self, rel: float) -> None:
        self.rel = rel
        self.masks: list[Any] = []

    def note(self, a: Any, b: Any) -> None:
        self.masks.append(np.abs(np.subtract(a, b)) <= self.rel * np.maximum(np.abs(a), np.abs(b)))

    def mask(self, shape: tuple[int, ...]) -> np.ndarray:
        out = np.zeros(shape, dtype=bool)
        for m in self.masks:
            out |= np.broadcast_to(m, shape)
        return out


def _relation(lhs: Part, rhs: Part, cmp: Any) -> Part:
    """A comparison (a boolean array), noted in the near-boundary record when one is kept."""

    def run(env: dict[str, Any]) -> tuple[Any, bool]:
        a, b = lhs(env)[0], rhs(env)[0]
        near = env.get(_NEAR)
        if near is not None:
            near.note(a, b)
        return _fresh(cmp(a, b))

    return run


def _binary(op: Any, lhs: Part, rhs: Part) -> Part:
    """``op(lhs, rhs)`` for a float ufunc, into whichever operand is this call's own array."""

    def run(env: dict[str, Any]) -> tuple[Any, bool]:
        a, aown = lhs(env)
        return _apply(env, op, a, aown, *rhs(env))

    return run


def _all_finite(v: Any) -> bool:
    """True when every value is finite. A sum is NaN or infinite when any term is, so a finite sum
    proves it in one reduction; otherwise (or on overflow) the values are looked at one by one.
    Called with floating-point errors silenced (overflow of the sum is expected)."""
    if type(v) is not np.ndarray:
        return math.isfinite(float(v))
    return math.isfinite(float(v.sum())) or bool(np.isfinite(v).all())


def _const(value: float) -> Part:
    return lambda _env: (value, False)


def _fresh(value: Any) -> tuple[Any, bool]:
    """A value a numpy call just made (an array is this call's own)."""
    return value, isinstance(value, np.ndarray)


class CompiledResult(dict[str, Any]):
    """Every given, step and check ratio by name (display units), with a per-case validity mask.

    Attributes:
        valid: Boolean array over the cases (the broadcast shape of the inputs; ``()`` for one
            case): True where every step value and check ratio is finite and every check
            capacity is greater than zero. Values of invalid cases are NaN. Read-only (a
            broadcast view when every case is valid).
    """

    def __init__(
        self, values: dict[str, Any], valid: np.ndarray, failures: list[tuple[str, np.ndarray]], sheet: CompiledSheet,
        raw: dict[str, Any] | Callable[[], dict[str, Any]],
    ) -> None:
        super().__init__(values)
        self.valid = valid
        self._failures = failures  # (step, cases where it is the first to fail), in evaluation order
        self._sheet = sheet
        self._raw = raw  # the values as computed, before invalid cases were set to NaN (or how to get them)

    def _raw_values(self) -> dict[str, Any]:
        """Every given and step as computed (invalid cases not yet NaN), for failure messages."""
        if callable(self._raw):
            self._raw = self._raw()
        return self._raw

    @property
    def all_valid(self) -> bool:
        """True when every case is valid."""
        return bool(np.all(self.valid))

    @property
    def invalid_step(self) -> np.ndarray:
        """Object array over the cases: the name of the first step that failed, ``""`` where valid."""
        out = np.full(self.valid.shape, "", dtype=object)
        for name, mask in self._failures:
            out[mask] = name
        return out

    @property
    def invalid_reason(self) -> np.ndarray:
        """Object array over the cases: why the case is invalid (step and inputs), ``""`` where valid."""
        out = np.full(self.valid.shape, "", dtype=object)
        for _name, mask in self._failures:
            for idx in zip(*np.nonzero(mask), strict=True) if mask.ndim else [()]:
                out[idx] = self.reason(idx)
        return out

    def reason(self, case: int | tuple[int, ...] = ()) -> str:
        """Why ``case`` is invalid (``""`` when it is valid): the step, its value and its inputs."""
        if self.valid.ndim == 0:
            idx: tuple[int, ...] = ()
        elif isinstance(case, (int, np.integer)):
            idx = tuple(int(i) for i in np.unravel_index(int(case), self.valid.shape))
        else:
            idx = tuple(int(i) for i in case)
        if self.valid[idx]:
            return ""
        label = f"case {idx[0] if len(idx) == 1 else idx}: " if idx else ""
        for name, mask in self._failures:
            if mask[idx]:
                return label + self._sheet.describe_failure(name, self._raw_values(), self.valid.shape, idx)
        return label + "invalid"  # pragma: no cover - every invalid case has a first failing step

    def reasons(self, limit: int = 10) -> list[str]:
        """Reasons for the first ``limit`` invalid cases, in case order."""
        bad = np.argwhere(~np.atleast_1d(self.valid))[:limit]
        return [self.reason(tuple(int(i) for i in b) if self.valid.ndim else ()) for b in bad]

    def require_valid(self) -> CompiledResult:
        """Return self, or raise :class:`NonFiniteError` listing the first invalid cases."""
        if self.all_valid:
            return self
        count = int(np.count_nonzero(~self.valid))
        raise NonFiniteError(f"compiled sheet {self._sheet.title!r}: {count} case(s) without a finite result: " + "; ".join(self.reasons(3)))


class CompiledSheet:
    """Vectorised form of a sheet.

    Call with arrays (or scalars) for any givens, as plain numbers in each given's own unit or
    as pint quantities; givens not passed keep the sheet's value. Returns a dict of arrays for
    every step (in its display unit, see :attr:`units`) and every check ratio (by check key).
    Each step is a numpy closure over the display-unit values of what it uses, with the unit
    factors folded in, so there are no separate conversion passes.
    """

    def __init__(self, sheet: Sheet) -> None:
        result = sheet.evaluate()  # fixes display units and validates the sheet
        self.title = sheet.title
        self.units: dict[str, str] = {}
        self.given_units: dict[str, pint.Unit] = {}
        self._defaults: dict[str, Any] = {}
        self._plan: list[tuple[str, Part]] = []
        self._checks: list[str] = [c.key for c in result.checks]
        self._reads: dict[str, tuple[str, ...]] = {}  # step -> names it uses (for failure messages)
        self._capacity: dict[str, str] = {}  # check key -> capacity name
        self._titles: dict[str, str] = {}  # check key -> title
        shown = {s.name: s.value for s in result.steps if hasattr(s, "name") and hasattr(s, "value")}
        scale: dict[str, float] = {}  # display-unit value -> SI base value
        for name in sheet.order():
            step = sheet._defs[name]
            if isinstance(step, Given):
                self.given_units[name] = step.value.units
                scale[name] = _base_factor(step.value)
                self._defaults[name] = float(step.value.magnitude)
                self.units[name] = str(step.value.units)
                continue
            self._reads[name] = tuple(step.depends)
            if isinstance(step, Check):
                d, c = step.demand, step.capacity
                self._capacity[name], self._titles[name] = c, step.title
                ratio_expr = sp.Mul(sp.Abs(sp.Symbol(d)), sp.Pow(sp.Symbol(c), -1), sp.Float(step.required_fs or 1.0), evaluate=False)
                self._plan.append((name, compile_part(ratio_expr, {d: 1.0, c: scale[c] / scale[d]})))
                self.units[name] = ""
                scale[name] = 1.0
                continue
            out_unit = shown[name].units
            k_out = _base_factor(Q_(1.0, out_unit))
            inv_out = sp.Pow(sp.Float(k_out), -1, evaluate=False)
            self.units[name] = str(out_unit)
            if isinstance(step, FormulaStep):
                fn = compile_part(sp.Mul(step.formula.expr, inv_out, evaluate=False), scale)
            elif isinstance(step, Branch):
                fn = self._branch(step, scale, inv_out)
            elif isinstance(step, Select):
                func = sp.Min if step.mode == "min" else sp.Max
                syms = [sp.Symbol(n) for n in step.candidates]
                expr = syms[0] if len(syms) == 1 else func(*syms, evaluate=False)
                fn = compile_part(sp.Mul(expr, inv_out, evaluate=False), scale)
            else:  # pragma: no cover - every defining step kind is handled above
                raise SheetError(f"cannot compile {type(step).__name__}")
            self._plan.append((name, fn))
            scale[name] = k_out

    @staticmethod
    def _branch(step: Branch, scale: dict[str, float], inv_out: sp.Basic) -> Part:
        parts = []
        for case in step.cases:
            value = compile_part(sp.Mul(case.formula.expr, inv_out, evaluate=False), scale)
            cond = compile_part(case.condition.expr, scale) if case.condition else None
            parts.append((cond, value))

        def run(env: dict[str, Any]) -> tuple[Any, bool]:
            out, own = parts[-1][1](env)
            for cond, value in reversed(parts[:-1]):  # an earlier case overrides a later one where it holds
                c, _cown = cond(env)  # type: ignore[misc]
                v, vown = value(env)
                if own and np.shape(out) == _shape_of((c, v, out)):
                    np.copyto(out, v, where=c)  # numpy.where(c, v, out), written into out
                    _drop(env, v, vown)
                else:
                    res = np.where(c, v, out)
                    _drop(env, out, own)
                    _drop(env, v, vown)
                    out, own = res, isinstance(res, np.ndarray)
            return out, own

        return run

    def _inputs(self, values: dict[str, Any]) -> dict[str, Any]:
        env: dict[str, Any] = dict(self._defaults)
        for name, v in values.items():
            if name not in self.given_units:
                raise SheetError(f"compiled sheet {self.title!r}: {name!r} is not a given")
            if isinstance(v, pint.Quantity):
                v = v.to(self.given_units[name]).magnitude
            env[name] = np.asarray(v, dtype=float)
        return env

    def __call__(self, **values: Any) -> CompiledResult:
        """Evaluate for arrays of givens; returns every given, step and check ratio with the
        per-case validity mask (see :class:`CompiledResult`)."""
        return self._evaluate(values, None)

    def ratios(self, **values: Any) -> CompiledResult:
        """Only the check ratios, by check key (with the same validity mask). The other steps are
        still evaluated (a case is valid only when every step is finite) but, on large calls, kept
        only block by block, never as whole arrays."""
        return self._evaluate(values, set(self._checks))

    def ratios_near(self, rel: float, /, **values: Any) -> tuple[CompiledResult, np.ndarray]:
        """As :meth:`ratios` (evaluated in one pass: for a modest number of cases), with a boolean
        array over the cases: True where a branch condition's two sides are within ``rel`` of
        each other (relative to the larger), where a scalar evaluation of the same numbers,
        rounded otherwise, might take the other branch."""
        near = _Near(rel)
        res = self._evaluate(values, set(self._checks), near)
        return res, near.mask(res.valid.shape)

    def _varying(self, env: dict[str, Any], shape: tuple[int, ...]) -> set[str]:
        """Givens and steps whose values vary along the first axis of ``shape`` (cut into blocks)."""
        varying = {n for n, v in env.items() if np.ndim(v) == len(shape) and np.shape(v)[0] == shape[0]}
        for name, _fn in self._plan:
            if any(r in varying for r in self._reads[name]):
                varying.add(name)
        return varying

    def _evaluate(self, values: dict[str, Any], keep: set[str] | None, near: _Near | None = None) -> CompiledResult:
        """Evaluate the plan; ``keep``: the step names returned (None: every step); ``near``: a
        record of conditions decided close to their boundary (the call is then not cut into blocks).

        Steps that do not vary along the first axis of the cases are evaluated once; the others
        in blocks of about :data:`BLOCK_CASES` cases (rows of the first axis), so the
        intermediate arrays stay in the processor cache and only the returned steps are written to
        whole-size arrays. Each step is checked block by block (one reduction while every value
        is finite); a block with a failure marks its cases in a per-step mask.
        """
        env = self._inputs(values)
        shape = np.broadcast_shapes(*(np.shape(v) for v in env.values()))
        rows = shape[0] if shape else 1
        per_row = math.prod(shape[1:]) if shape else 1
        step_rows = max(1, BLOCK_CASES // max(per_row, 1))
        blocked = self._varying(env, shape) if shape and rows > step_rows and near is None else set()
        if near is not None:
            env[_NEAR] = near
        fails: dict[str, Any] = {}  # step -> cases where it is not finite (or its capacity not > 0)
        with np.errstate(all="ignore"):
            for name, fn in self._plan:  # everything that is not cut into blocks (all of it for small calls)
                if name in blocked:
                    continue
                v = fn(env)[0]
                env[name] = v
                bad_here = self._fails(name, v, env)
                if bad_here is not None:
                    fails[name] = bad_here
            if blocked:
                self._blocks(env, shape, step_rows, blocked, keep, fails)
        env.pop(_NEAR, None)
        raw = dict(env)
        if keep is not None:
            env = {k: env[k] for k in self._checks}
        if not fails:  # every case valid: a read-only view, not an array of a byte per case
            return CompiledResult(env, np.broadcast_to(np.True_, shape), [], self, raw)
        bad = np.zeros(shape, dtype=bool)
        failures: list[tuple[str, np.ndarray]] = []
        for name, _fn in self._plan:  # first failing step per case, in evaluation order
            if name in fails:
                new = np.broadcast_to(fails[name], shape) & ~bad
                if np.any(new):
                    failures.append((name, new))
                    bad = bad | new
        for name in env:  # invalid cases carry no numbers: NaN in every step after the givens
            if name in self._reads:
                env[name] = np.where(bad, np.nan, env[name])
        if blocked and keep is not None:  # messages need every step's value: evaluated again when asked
            return CompiledResult(env, ~bad, failures, self, lambda: self._evaluate(values, None)._raw_values())
        return CompiledResult(env, ~bad, failures, self, raw)

    def _fails(self, name: str, v: Any, env: dict[str, Any]) -> Any:
        """None when every value of step ``name`` is finite (and its capacity > 0), else the mask
        of the cases where it is not."""
        cap = self._capacity.get(name)
        if _all_finite(v) and (cap is None or float(np.min(env[cap])) > 0):
            return None  # the common case: one reduction per step, no mask array made
        out = ~np.isfinite(v)
        if cap is not None:
            out = out | ~(np.asarray(env[cap]) > 0)
        return out if np.any(out) else None

    def _blocks(self, env: dict[str, Any], shape: tuple[int, ...], step_rows: int, blocked: set[str], keep: set[str] | None,
                fails: dict[str, Any]) -> None:
        """Evaluate the ``blocked`` steps ``step_rows`` rows at a time; the kept ones are written
        into whole-size arrays in ``env``, failures into whole-size masks in ``fails``."""
        plan = [(name, fn) for name, fn in self._plan if name in blocked]
        cut = [n for n in env if n in blocked]  # the givens cut into blocks
        last_use = {}  # step -> index in plan of the last step that reads it (its buffer is free after)
        for i, (name, _fn) in enumerate(plan):
            last_use[name] = i
            for r in self._reads[name]:
                if r in last_use:
                    last_use[r] = i
        free_after: list[list[str]] = [[] for _ in plan]
        for name, i in last_use.items():
            free_after[i].append(name)
        out: dict[str, np.ndarray] = {}
        pool = _thread_pool()
        pool.keep_rows({step_rows, shape[0] % step_rows or step_rows})
        block = dict(env)
        block[_POOL] = pool
        block[_TARGET] = None
        for start in range(0, shape[0], step_rows):
            rows = slice(start, min(start + step_rows, shape[0]))
            for n in cut:
                block[n] = env[n][rows]
            made = {}  # this block's own step arrays: back to the pool after their last reader
            for i, (name, fn) in enumerate(plan):
                target = block[_TARGET] = out[name][rows] if name in out else None
                v, own = fn(block)
                block[name] = v
                if own:
                    made[name] = v
                if keep is None or name in keep:
                    if name not in out:
                        vshape = np.broadcast_shapes(np.shape(v), (rows.stop - rows.start,) + (1,) * (len(shape) - 1))
                        out[name] = np.empty((shape[0], *vshape[1:]), dtype=np.result_type(v, float))
                    if v is not target:  # (most steps are computed straight into their output rows)
                        out[name][rows] = v
                bad_here = self._fails(name, v, block)
                if bad_here is not None:
                    if name not in fails:
                        fails[name] = np.zeros(shape, dtype=bool)
                    fails[name][rows] |= bad_here
                for done in free_after[i]:
                    if done in made:
                        pool.give(made.pop(done))
        env.update(out)

    def describe_failure(self, name: str, env: dict[str, Any], shape: tuple[int, ...], idx: tuple[int, ...]) -> str:
        """Message for the step ``name`` failing in case ``idx``: its value and its inputs' values."""

        def at(n: str) -> float:
            return float(np.broadcast_to(env[n], shape)[idx])

        def value(n: str) -> str:
            v = at(n)
            unit = unit_symbol(self.units[n]) if self.units.get(n) else ""
            return f"{n} = {'NaN' if math.isnan(v) else format_number(v, 4)} {unit}".rstrip()

        inputs = ", ".join(value(n) for n in self._reads.get(name, ()))
        if name in self._capacity:
            cap = self._capacity[name]
            v = at(cap)
            if math.isfinite(v) and not v > 0:
                return f"check {self._titles[name]!r}: capacity {value(cap)} is not greater than zero"
            return f"check {self._titles[name]!r}: the ratio is not a finite number; {inputs}"
        return f"step {name!r} is not a finite number ({value(name).split(' = ', 1)[1]}); inputs: {inputs or 'none'}"
