"""Single-span beams: closed-form handbook cases and a superposition solver.

Two parts:

* :data:`CASES` / :func:`beam_case` / :func:`add_beam_case` — the classic closed-form cases
  (AISC Steel Construction Manual, 15th ed., Table 3-23 "Shears, moments and deflections"; the
  case numbers are quoted from memory), each formula kept as text for the sheet and as a Python
  function for numbers. Inputs may be plain numbers (consistent units) or pint quantities.
* :class:`Beam` — any number of point loads and (partial) uniform loads on a beam with pinned,
  roller and fixed supports anywhere along it, solved exactly by singularity functions (double
  integration of ``EI*y'' = M``) with the redundant reactions found from compatibility. Gives
  reactions, V, M, slope and deflection along the beam, and the maxima with their locations.

Sign conventions: loads act downward when positive; reactions are upward when positive; bending
moment is positive in sagging; deflection ``delta`` is positive downward.
"""

from __future__ import annotations

import math
import re
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field
from typing import Any

import numpy as np
import pint
from scipy.optimize import brentq

from calcpad.core.errors import InputError
from calcpad.core.units import format_number, parse_quantity
from calcpad.eng.analysis._values import to_float

__all__ = [
    "CASES",
    "Beam",
    "BeamCase",
    "BeamSolution",
    "CaseResult",
    "PointLoad",
    "UniformLoad",
    "add_beam_case",
    "add_beam_results",
    "beam_case",
]

TABLE = "AISC Manual 15th ed. Table 3-23"


def _max(a: Any, b: Any) -> Any:
    return max(a, b)


def _min(a: Any, b: Any) -> Any:
    return min(a, b)


def _sqrt(a: Any) -> Any:
    return a**0.5


@dataclass(frozen=True)
class CaseItem:
    """One result of a closed-form case: symbol, formula text, function, description, location."""

    name: str
    formula: str
    fn: Callable[[dict[str, Any]], Any]
    description: str
    needs_EI: bool = False


@dataclass(frozen=True)
class BeamCase:
    """A closed-form handbook case: inputs (name -> description) and ordered results."""

    key: str
    title: str
    ref: str
    inputs: dict[str, str]
    items: tuple[CaseItem, ...]
    check: Callable[[dict[str, Any]], None] | None = None


def _ab_check(v: dict[str, Any]) -> None:
    a, L = v["a"], v["L"]
    if not (0 < a < L):
        raise InputError(f"a: got {a!r}; expected a load position between 0 and L = {L!r}")


def _b_check(v: dict[str, Any]) -> None:
    b, L = v["b"], v["L"]
    if not (0 < b <= L):
        raise InputError(f"b: got {b!r}; expected a distance from the fixed end in (0, L = {L!r}]")


def _over_check(v: dict[str, Any]) -> None:
    a = v["a"]
    if not a > 0 * a:
        raise InputError(f"a: got {a!r}; expected an overhang length greater than zero")


I = CaseItem

CASES: dict[str, BeamCase] = {
    "simple_uniform": BeamCase(
        "simple_uniform", "Simple beam, uniformly distributed load", f"{TABLE} case 1",
        {"w": "Uniform load", "L": "Span"},
        (
            I("R_1", "w*L/2", lambda v: v["w"] * v["L"] / 2, "Reaction at each support"),
            I("V_max", "w*L/2", lambda v: v["w"] * v["L"] / 2, "Maximum shear (at supports)"),
            I("M_max", "w*L**2/8", lambda v: v["w"] * v["L"] ** 2 / 8, "Maximum moment (at midspan)"),
            I("x_M", "L/2", lambda v: v["L"] / 2, "Location of maximum moment"),
            I("delta_max", "5*w*L**4/(384*E*I)", lambda v: 5 * v["w"] * v["L"] ** 4 / (384 * v["E"] * v["I"]),
              "Maximum deflection (at midspan)", True),
        ),
    ),
    "simple_center_point": BeamCase(
        "simple_center_point", "Simple beam, concentrated load at center", f"{TABLE} case 7",
        {"P": "Concentrated load", "L": "Span"},
        (
            I("R_1", "P/2", lambda v: v["P"] / 2, "Reaction at each support"),
            I("V_max", "P/2", lambda v: v["P"] / 2, "Maximum shear"),
            I("M_max", "P*L/4", lambda v: v["P"] * v["L"] / 4, "Maximum moment (under the load)"),
            I("x_M", "L/2", lambda v: v["L"] / 2, "Location of maximum moment"),
            I("delta_max", "P*L**3/(48*E*I)", lambda v: v["P"] * v["L"] ** 3 / (48 * v["E"] * v["I"]),
              "Maximum deflection (at midspan)", True),
        ),
    ),
    "simple_point": BeamCase(
        "simple_point", "Simple beam, concentrated load at any point", f"{TABLE} case 8",
        {"P": "Concentrated load", "L": "Span", "a": "Distance of load from left support"},
        (
            I("b", "L - a", lambda v: v["L"] - v["a"], "Distance of load from right support"),
            I("R_1", "P*b/L", lambda v: v["P"] * v["b"] / v["L"], "Left reaction"),
            I("R_2", "P*a/L", lambda v: v["P"] * v["a"] / v["L"], "Right reaction"),
            I("V_max", "P*max(a, b)/L", lambda v: v["P"] * _max(v["a"], v["b"]) / v["L"], "Maximum shear"),
            I("M_max", "P*a*b/L", lambda v: v["P"] * v["a"] * v["b"] / v["L"], "Maximum moment (under the load)"),
            I("a_m", "max(a, b)", lambda v: _max(v["a"], v["b"]), "Longer segment"),
            I("b_m", "min(a, b)", lambda v: _min(v["a"], v["b"]), "Shorter segment"),
            I("delta_max", "P*a_m*b_m*(a_m + 2*b_m)*sqrt(3*a_m*(a_m + 2*b_m))/(27*E*I*L)",
              lambda v: v["P"] * v["a_m"] * v["b_m"] * (v["a_m"] + 2 * v["b_m"])
              * _sqrt(3 * v["a_m"] * (v["a_m"] + 2 * v["b_m"])) / (27 * v["E"] * v["I"] * v["L"]),
              "Maximum deflection", True),
            I("x_delta", "sqrt(a_m*(a_m + 2*b_m)/3)", lambda v: _sqrt(v["a_m"] * (v["a_m"] + 2 * v["b_m"]) / 3),
              "Location of maximum deflection from the support farther from the load", True),
        ),
        _ab_check,
    ),
    "fixed_uniform": BeamCase(
        "fixed_uniform", "Beam fixed at both ends, uniformly distributed load", f"{TABLE} case 15",
        {"w": "Uniform load", "L": "Span"},
        (
            I("R_1", "w*L/2", lambda v: v["w"] * v["L"] / 2, "Reaction at each end"),
            I("V_max", "w*L/2", lambda v: v["w"] * v["L"] / 2, "Maximum shear (at ends)"),
            I("M_max", "w*L**2/12", lambda v: v["w"] * v["L"] ** 2 / 12, "Maximum moment (hogging, at ends)"),
            I("M_mid", "w*L**2/24", lambda v: v["w"] * v["L"] ** 2 / 24, "Moment at midspan (sagging)"),
            I("delta_max", "w*L**4/(384*E*I)", lambda v: v["w"] * v["L"] ** 4 / (384 * v["E"] * v["I"]),
              "Maximum deflection (at midspan)", True),
        ),
    ),
    "propped_uniform": BeamCase(
        "propped_uniform", "Beam fixed at one end, supported at other, uniformly distributed load",
        f"{TABLE} case 12",
        {"w": "Uniform load", "L": "Span"},
        (
            I("R_1", "3*w*L/8", lambda v: 3 * v["w"] * v["L"] / 8, "Reaction at supported end"),
            I("R_2", "5*w*L/8", lambda v: 5 * v["w"] * v["L"] / 8, "Reaction at fixed end"),
            I("V_max", "5*w*L/8", lambda v: 5 * v["w"] * v["L"] / 8, "Maximum shear (at fixed end)"),
            I("M_max", "w*L**2/8", lambda v: v["w"] * v["L"] ** 2 / 8, "Maximum moment (hogging, at fixed end)"),
            I("M_pos", "9*w*L**2/128", lambda v: 9 * v["w"] * v["L"] ** 2 / 128, "Maximum sagging moment"),
            I("x_M", "3*L/8", lambda v: 3 * v["L"] / 8, "Location of sagging maximum from supported end"),
            # exact coefficient (39 + 55*sqrt(33))/65536 = 1/184.6; the table rounds it to 1/185
            I("delta_max", "w*L**4/(184.6*E*I)", lambda v: v["w"] * v["L"] ** 4 / (184.6 * v["E"] * v["I"]),
              "Maximum deflection", True),
            I("x_delta", "0.4215*L", lambda v: 0.4215 * v["L"], "Location of maximum deflection from supported end"),
        ),
    ),
    "cantilever_uniform": BeamCase(
        "cantilever_uniform", "Cantilever beam, uniformly distributed load", f"{TABLE} case 19",
        {"w": "Uniform load", "L": "Length"},
        (
            I("R_1", "w*L", lambda v: v["w"] * v["L"], "Reaction at fixed end"),
            I("V_max", "w*L", lambda v: v["w"] * v["L"], "Maximum shear (at fixed end)"),
            I("M_max", "w*L**2/2", lambda v: v["w"] * v["L"] ** 2 / 2, "Maximum moment (at fixed end)"),
            I("delta_max", "w*L**4/(8*E*I)", lambda v: v["w"] * v["L"] ** 4 / (8 * v["E"] * v["I"]),
              "Maximum deflection (at free end)", True),
        ),
    ),
    "cantilever_point": BeamCase(
        "cantilever_point", "Cantilever beam, concentrated load at any point", f"{TABLE} case 21",
        {"P": "Concentrated load", "L": "Length", "b": "Distance of load from fixed end"},
        (
            I("R_1", "P", lambda v: v["P"], "Reaction at fixed end"),
            I("V_max", "P", lambda v: v["P"], "Maximum shear"),
            I("M_max", "P*b", lambda v: v["P"] * v["b"], "Maximum moment (at fixed end)"),
            I("delta_max", "P*b**2*(3*L - b)/(6*E*I)", lambda v: v["P"] * v["b"] ** 2 * (3 * v["L"] - v["b"]) / (6 * v["E"] * v["I"]),
              "Maximum deflection (at free end)", True),
            I("delta_P", "P*b**3/(3*E*I)", lambda v: v["P"] * v["b"] ** 3 / (3 * v["E"] * v["I"]),
              "Deflection under the load", True),
        ),
        _b_check,
    ),
    "cantilever_end_point": BeamCase(
        "cantilever_end_point", "Cantilever beam, concentrated load at free end", f"{TABLE} case 22",
        {"P": "Concentrated load", "L": "Length"},
        (
            I("R_1", "P", lambda v: v["P"], "Reaction at fixed end"),
            I("V_max", "P", lambda v: v["P"], "Maximum shear"),
            I("M_max", "P*L", lambda v: v["P"] * v["L"], "Maximum moment (at fixed end)"),
            I("delta_max", "P*L**3/(3*E*I)", lambda v: v["P"] * v["L"] ** 3 / (3 * v["E"] * v["I"]),
              "Maximum deflection (at free end)", True),
        ),
    ),
    "overhang_uniform": BeamCase(
        "overhang_uniform", "Beam overhanging one support, uniformly distributed load", f"{TABLE} case 24",
        {"w": "Uniform load", "L": "Span between supports", "a": "Overhang length"},
        (
            I("R_1", "w*(L**2 - a**2)/(2*L)", lambda v: v["w"] * (v["L"] ** 2 - v["a"] ** 2) / (2 * v["L"]), "Reaction at end support"),
            I("R_2", "w*(L + a)**2/(2*L)", lambda v: v["w"] * (v["L"] + v["a"]) ** 2 / (2 * v["L"]), "Reaction at overhang support"),
            I("V_max", "w*(L**2 + a**2)/(2*L)", lambda v: v["w"] * (v["L"] ** 2 + v["a"] ** 2) / (2 * v["L"]),
              "Maximum shear (span side of overhang support)"),
            I("M_pos", "w*(L + a)**2*(L - a)**2/(8*L**2)",
              lambda v: v["w"] * (v["L"] + v["a"]) ** 2 * (v["L"] - v["a"]) ** 2 / (8 * v["L"] ** 2), "Maximum sagging moment in span"),
            I("x_M", "L/2*(1 - a**2/L**2)", lambda v: v["L"] / 2 * (1 - v["a"] ** 2 / v["L"] ** 2),
              "Location of sagging maximum from end support"),
            I("M_neg", "w*a**2/2", lambda v: v["w"] * v["a"] ** 2 / 2, "Hogging moment at overhang support"),
            I("M_max", "max(M_pos, M_neg)", lambda v: _max(v["M_pos"], v["M_neg"]), "Maximum moment magnitude"),
            I("delta_tip", "w*a*(4*a**2*L - L**3 + 3*a**3)/(24*E*I)",
              lambda v: v["w"] * v["a"] * (4 * v["a"] ** 2 * v["L"] - v["L"] ** 3 + 3 * v["a"] ** 3) / (24 * v["E"] * v["I"]),
              "Deflection at free end of overhang (negative = upward)", True),
        ),
        _over_check,
    ),
    "overhang_end_point": BeamCase(
        "overhang_end_point", "Beam overhanging one support, concentrated load at end of overhang", f"{TABLE} case 26",
        {"P": "Concentrated load", "L": "Span between supports", "a": "Overhang length"},
        (
            I("R_1", "P*a/L", lambda v: v["P"] * v["a"] / v["L"], "Reaction at end support (acts downward)"),
            I("R_2", "P*(L + a)/L", lambda v: v["P"] * (v["L"] + v["a"]) / v["L"], "Reaction at overhang support"),
            I("V_max", "P", lambda v: v["P"], "Maximum shear (overhang)"),
            I("M_max", "P*a", lambda v: v["P"] * v["a"], "Maximum moment (hogging, at overhang support)"),
            I("delta_tip", "P*a**2*(L + a)/(3*E*I)", lambda v: v["P"] * v["a"] ** 2 * (v["L"] + v["a"]) / (3 * v["E"] * v["I"]),
              "Deflection at free end of overhang", True),
            I("delta_up", "P*a*L**2/(9*sqrt(3)*E*I)", lambda v: v["P"] * v["a"] * v["L"] ** 2 / (9 * math.sqrt(3) * v["E"] * v["I"]),
              "Maximum upward deflection between supports", True),
            I("x_delta", "L/sqrt(3)", lambda v: v["L"] / math.sqrt(3), "Location of upward maximum from end support", True),
        ),
        _over_check,
    ),
}
del I


@dataclass
class CaseResult:
    """Numbers of one closed-form case: ``values[name]`` in the same kind as the inputs."""

    case: BeamCase
    values: dict[str, Any]

    def __getitem__(self, name: str) -> Any:
        return self.values[name]


def _case(key: str) -> BeamCase:
    if key not in CASES:
        raise InputError(f"beam case: got {key!r}; expected one of {sorted(CASES)}")
    return CASES[key]


def _read_inputs(case: BeamCase, inputs: dict[str, Any]) -> dict[str, Any]:
    missing = [k for k in case.inputs if k not in inputs]
    if missing:
        raise InputError(f"{case.key}: missing {missing}; expected inputs {list(case.inputs)} (and E, I for deflection)")
    extra = [k for k in inputs if k not in case.inputs and k not in ("E", "I")]
    if extra:
        raise InputError(f"{case.key}: unknown inputs {extra}; expected {list(case.inputs)} and optionally E, I")
    vals: dict[str, Any] = {}
    for k, v in inputs.items():
        if v is None:
            continue
        if isinstance(v, str):
            v = parse_quantity(v, k)
        if isinstance(v, bool) or not isinstance(v, (int, float, pint.Quantity)):
            raise InputError(f"{k}: got {v!r}; expected a number or a value with a unit")
        mag = v.magnitude if isinstance(v, pint.Quantity) else v
        if not math.isfinite(float(mag)):
            raise InputError(f"{k}: got {v!r}; expected a finite value")
        if k in ("L", "E", "I") and float(mag) <= 0:
            raise InputError(f"{k}: got {v!r}; expected a value greater than zero")
        vals[k] = v
    kinds = {isinstance(v, pint.Quantity) for v in vals.values()}
    if len(kinds) > 1:
        raise InputError(f"{case.key}: inputs mix plain numbers and values with units; expected all of one kind")
    if case.check:
        case.check(vals)
    return vals


def beam_case(key: str, **inputs: Any) -> CaseResult:
    """Evaluate closed-form case ``key`` (see :data:`CASES`).

    Inputs are the case's symbols (``w``/``P``, ``L``, ``a``/``b``) and optionally ``E`` and ``I``
    for deflections; all plain numbers in consistent units, or all quantities/strings with units.

    Example:
        ``beam_case("simple_uniform", w="0.5 klf", L="20 ft")["M_max"]`` -> 25 kip·ft.
    """
    case = _case(key)
    v = _read_inputs(case, inputs)
    has_ei = "E" in v and "I" in v
    out: dict[str, Any] = {}
    for item in case.items:
        if item.needs_EI and not has_ei:
            continue
        v[item.name] = item.fn(v)
        out[item.name] = v[item.name]
    return CaseResult(case, out)


_TOKEN = re.compile(r"\b([A-Za-z][A-Za-z0-9_]*)\b")


def add_beam_case(sh: Any, key: str, *, suffix: str = "", units: dict[str, str] | None = None, **inputs: Any) -> list[str]:
    """Add closed-form case ``key`` to sheet ``sh`` as givens and formula steps, each with the
    handbook case number as reference. Returns the names of the steps added.

    Args:
        sh: The sheet.
        key: Case name from :data:`CASES`.
        suffix: Appended to every name, so the same case can appear twice in one sheet.
        units: Optional display unit per result name, e.g. ``{"M_max": "kip*ft"}``.
        **inputs: Values with units for the case inputs and optionally ``E`` and ``I``.
    """
    case = _case(key)
    v = _read_inputs(case, inputs)
    has_ei = "E" in v and "I" in v
    names = set(case.inputs) | {"E", "I"} | {it.name for it in case.items}
    desc = dict(case.inputs, E="Modulus of elasticity", I="Moment of inertia")

    def ren(text: str) -> str:
        return _TOKEN.sub(lambda m: m.group(1) + suffix if m.group(1) in names else m.group(1), text)

    for k in v:
        sh.given(k + suffix, inputs[k], desc[k])
    added = []
    for item in case.items:
        if item.needs_EI and not has_ei:
            continue
        unit = (units or {}).get(item.name)
        sh.step(item.name + suffix, ren(item.formula), item.description, unit=unit, ref=case.ref)
        added.append(item.name + suffix)
    return added


# --------------------------------------------------------------------------- superposition solver


@dataclass(frozen=True)
class PointLoad:
    """Concentrated load ``P`` (downward positive) at ``x`` from the left end."""

    P: Any
    x: Any


@dataclass(frozen=True)
class UniformLoad:
    """Uniform load ``w`` (downward positive) from ``x1`` to ``x2`` (default: whole beam)."""

    w: Any
    x1: Any = 0.0
    x2: Any = None


_SUPPORTS = ("pin", "roller", "fixed")


@dataclass
class BeamSolution:
    """Results of :meth:`Beam.solve` (floats in the beam's force and length units).

    Arrays along ``x``: shear ``V``, moment ``M`` (sagging +), slope ``theta`` and deflection
    ``delta`` (downward +; only when E and I were given). ``reactions`` lists
    ``(x, R, M)`` per support: upward force and, for a fixed support, the support moment
    (the internal moment in the beam at that support, sagging +).
    """

    x: np.ndarray
    V: np.ndarray
    M: np.ndarray
    theta: np.ndarray | None
    delta: np.ndarray | None
    reactions: list[tuple[float, float, float]]
    M_max: float
    x_M_max: float
    M_min: float
    x_M_min: float
    V_max: float
    x_V_max: float
    delta_max: float | None
    x_delta_max: float | None
    units: dict[str, str] = field(default_factory=dict)

    @property
    def M_abs(self) -> float:
        """Largest moment magnitude."""
        return max(abs(self.M_max), abs(self.M_min))


class Beam:
    """A straight beam with supports and loads, solved exactly by singularity functions.

    Args:
        L: Length (quantity, string or number in ``length_unit``).
        supports: ``[(x, kind), ...]`` with kind ``"pin"``, ``"roller"`` or ``"fixed"``.
        loads: :class:`PointLoad` / :class:`UniformLoad` items.
        E, I: Modulus and moment of inertia (optional; needed for deflection).
        force_unit, length_unit: Units of plain numbers and of the results.
    """

    def __init__(
        self,
        L: Any,
        supports: Sequence[tuple[Any, str]],
        loads: Sequence[PointLoad | UniformLoad],
        *,
        E: Any = None,
        I: Any = None,
        force_unit: str = "kip",
        length_unit: str = "in",
    ) -> None:
        fu, lu = force_unit, length_unit
        self.units = {"force": fu, "length": lu, "moment": f"{fu}*{lu}"}
        self.L = to_float(L, lu, "L")
        if self.L <= 0:
            raise InputError(f"L: got {L!r}; expected a length greater than zero")
        if not supports:
            raise InputError("supports: none given; expected e.g. [(0, 'pin'), (L, 'roller')]")
        self.supports: list[tuple[float, str]] = []
        for i, sup in enumerate(supports):
            try:
                xs, kind = sup
            except (TypeError, ValueError):
                raise InputError(f"supports[{i}]: got {sup!r}; expected (x, 'pin'|'roller'|'fixed')") from None
            xf = to_float(xs, lu, f"supports[{i}] x")
            if not 0 <= xf <= self.L * (1 + 1e-12):
                raise InputError(f"supports[{i}] x: got {xs!r}; expected a position from 0 to L")
            if kind not in _SUPPORTS:
                raise InputError(f"supports[{i}] kind: got {kind!r}; expected one of {_SUPPORTS}")
            self.supports.append((min(xf, self.L), kind))
        self.points: list[tuple[float, float]] = []
        self.udls: list[tuple[float, float, float]] = []
        for i, ld in enumerate(loads):
            if isinstance(ld, PointLoad):
                xp = to_float(ld.x, lu, f"loads[{i}] x")
                if not 0 <= xp <= self.L:
                    raise InputError(f"loads[{i}] x: got {ld.x!r}; expected a position from 0 to L")
                self.points.append((to_float(ld.P, fu, f"loads[{i}] P"), xp))
            elif isinstance(ld, UniformLoad):
                w = to_float(ld.w, f"{fu}/{lu}", f"loads[{i}] w")
                x1 = to_float(ld.x1, lu, f"loads[{i}] x1")
                x2 = self.L if ld.x2 is None else to_float(ld.x2, lu, f"loads[{i}] x2")
                if not 0 <= x1 < x2 <= self.L:
                    raise InputError(f"loads[{i}]: got x1={ld.x1!r}, x2={ld.x2!r}; expected 0 <= x1 < x2 <= L")
                self.udls.append((w, x1, x2))
            else:
                raise InputError(f"loads[{i}]: got {ld!r}; expected PointLoad or UniformLoad")
        self.EI: float | None = None
        if E is not None and I is not None:
            e = to_float(E, f"{fu}/{lu}**2", "E")
            i_ = to_float(I, f"{lu}**4", "I")
            if e <= 0 or i_ <= 0:
                raise InputError(f"E, I: got {E!r}, {I!r}; expected values greater than zero")
            self.EI = e * i_

    # columns of the basis: one per unknown (reactions, support couples, C1, C2)
    def _unknowns(self) -> list[tuple[str, float]]:
        u = [("R", x) for x, _ in self.supports]
        u += [("C", x) for x, k in self.supports if k == "fixed"]
        return [*u, ("C1", 0.0), ("C2", 0.0)]

    @staticmethod
    def _step(t: np.ndarray, right: bool) -> np.ndarray:
        return (t >= 0).astype(float) if right else (t > 0).astype(float)

    def _basis(self, x: np.ndarray, right: bool = True) -> tuple[np.ndarray, np.ndarray]:
        """Return (unknown part [n_unknown, 4, nx], load part [4, nx]) of (V, M, EI*theta, EI*y)."""
        unk = self._unknowns()
        B = np.zeros((len(unk), 4, x.size))
        for j, (kind, s) in enumerate(unk):
            t = x - s
            H = self._step(t, right)
            if kind == "R":
                B[j] = [H, t * H, t**2 / 2 * H, t**3 / 6 * H]
            elif kind == "C":
                B[j] = [0 * H, H, t * H, t**2 / 2 * H]
            elif kind == "C1":
                B[j] = [0 * x, 0 * x, 1 + 0 * x, x]
            else:
                B[j] = [0 * x, 0 * x, 0 * x, 1 + 0 * x]
        F = np.zeros((4, x.size))
        for P, s in self.points:
            t = x - s
            H = self._step(t, right)
            F -= P * np.array([H, t * H, t**2 / 2 * H, t**3 / 6 * H])
        for w, a, b in self.udls:
            for sign, s in ((1.0, a), (-1.0, b)):
                t = x - s
                H = self._step(t, right) if s < self.L or sign > 0 else 0 * t
                F -= sign * w * np.array([t * H, t**2 / 2 * H, t**3 / 6 * H, t**4 / 24 * H])
        return B, F

    def _key_points(self) -> np.ndarray:
        pts = {0.0, self.L}
        pts |= {x for x, _ in self.supports}
        pts |= {x for _, x in self.points}
        for _, a, b in self.udls:
            pts |= {a, b}
        return np.array(sorted(pts))

    def solve(self, n: int = 801) -> BeamSolution:
        """Solve for reactions and the V, M, slope and deflection along the beam.

        Raises:
            InputError: The supports cannot carry the loads (a mechanism, e.g. one pin only).
        """
        rows: list[np.ndarray] = []
        rhs: list[float] = []
        end = np.array([self.L])
        B, F = self._basis(end, right=True)
        rows += [B[:, 0, 0], B[:, 1, 0]]
        rhs += [-F[0, 0], -F[1, 0]]
        xs = np.array([x for x, _ in self.supports])
        B, F = self._basis(xs, right=True)
        for i in range(len(xs)):
            rows.append(B[:, 3, i])
            rhs.append(-F[3, i])
        for i, (_x, k) in enumerate(self.supports):
            if k == "fixed":
                rows.append(B[:, 2, i])
                rhs.append(-F[2, i])
        A = np.array(rows)
        b = np.array(rhs)
        scale = np.maximum(np.abs(A).max(axis=1), 1e-300)
        A, b = A / scale[:, None], b / scale
        cscale = np.maximum(np.abs(A).max(axis=0), 1e-300)
        sv = np.linalg.svd(A / cscale[None, :], compute_uv=False) if A.shape[0] == A.shape[1] else np.zeros(1)
        if A.shape[0] != A.shape[1] or sv[-1] <= 1e-10 * sv[0]:
            raise InputError(
                f"supports: {self.supports!r} cannot hold the beam (it is a mechanism or has coincident "
                "supports); expected e.g. a fixed support, or two pin/roller supports at different points"
            )
        sol = np.linalg.solve(A, b)
        grid = np.union1d(np.linspace(0.0, self.L, n), self._key_points())
        B, F = self._basis(grid, right=True)
        V, M, EIt, EIy = np.einsum("j,jkn->kn", sol, B) + F
        # left limits at key points (shear jumps)
        kp = self._key_points()
        Bl, Fl = self._basis(kp, right=False)
        VMl = np.einsum("j,jkn->kn", sol, Bl) + Fl
        Vl, Ml = VMl[0], VMl[1]
        V[-1], M[-1] = Vl[-1], Ml[-1]  # show the beam end, not past it
        # exact sagging/hogging extremes: V is linear between grid points
        xc, Mc = list(grid) + list(kp), list(M) + list(Ml)
        for i in range(grid.size - 1):
            v0, v1 = V[i], V[i + 1]
            if v0 * v1 < 0:
                xr = grid[i] + (grid[i + 1] - grid[i]) * v0 / (v0 - v1)
                Bx, Fx = self._basis(np.array([xr]))
                xc.append(xr)
                Mc.append(float((np.einsum("j,jkn->kn", sol, Bx) + Fx)[1, 0]))
        Mc_arr, xc_arr = np.array(Mc), np.array(xc)
        imax, imin = int(np.argmax(Mc_arr)), int(np.argmin(Mc_arr))
        Vall = np.concatenate([V[grid < self.L], Vl[kp > 0]])
        xall = np.concatenate([grid[grid < self.L], kp[kp > 0]])
        iv = int(np.argmax(np.abs(Vall)))
        reactions = []
        ci = 0
        for i, (x, kind) in enumerate(self.supports):
            mom = 0.0
            if kind == "fixed":
                Bs, Fs = self._basis(np.array([x]), right=x < self.L)
                mom = float((np.einsum("j,jkn->kn", sol, Bs) + Fs)[1, 0])
                ci += 1
            reactions.append((x, float(sol[i]), mom))
        theta = delta = None
        dmax = xd = None
        if self.EI is not None:
            theta = EIt / self.EI
            delta = -EIy / self.EI

            def slope(xq: float) -> float:
                Bq, Fq = self._basis(np.array([xq]))
                return float((np.einsum("j,jkn->kn", sol, Bq) + Fq)[2, 0])

            def defl(xq: float) -> float:
                Bq, Fq = self._basis(np.array([xq]))
                return float(-(np.einsum("j,jkn->kn", sol, Bq) + Fq)[3, 0] / self.EI)

            cand_x, cand_d = list(grid), list(delta)
            for i in range(grid.size - 1):
                if EIt[i] * EIt[i + 1] < 0:
                    xr = brentq(slope, grid[i], grid[i + 1], xtol=1e-14 * self.L)
                    cand_x.append(xr)
                    cand_d.append(defl(xr))
            j = int(np.argmax(np.abs(cand_d)))
            dmax, xd = float(cand_d[j]), float(cand_x[j])
        return BeamSolution(
            x=grid, V=V, M=M, theta=theta, delta=delta, reactions=reactions,
            M_max=float(Mc_arr[imax]), x_M_max=float(xc_arr[imax]),
            M_min=float(Mc_arr[imin]), x_M_min=float(xc_arr[imin]),
            V_max=float(Vall[iv]), x_V_max=float(xall[iv]),
            delta_max=dmax, x_delta_max=xd, units=dict(self.units),
        )


def add_beam_results(sh: Any, sol: BeamSolution, *, suffix: str = "", title: str = "Beam analysis",
                     figure: bool = True) -> list[str]:
    """Put a :class:`BeamSolution` into sheet ``sh``: a reactions table, the V/M/deflection
    figure and givens ``M_max``, ``V_max`` (and ``delta_max``) with their locations as source.
    Returns the names of the givens added."""
    from calcpad.core.units import Q_

    u = sol.units
    sh.heading(title, level=2)
    rows = [[Q_(x, u["length"]), Q_(R, u["force"]), Q_(M, u["moment"])] for x, R, M in sol.reactions]
    sh.table("Support reactions (up +; support moment as internal moment, sagging +)", rows,
             columns=["x", "R", "M"])
    if figure:
        from calcpad.eng.analysis.diagrams import plot_beam

        sh.figure("Shear, moment and deflection", plot_beam(sol, title))
    m_val, m_x = (sol.M_max, sol.x_M_max) if abs(sol.M_max) >= abs(sol.M_min) else (sol.M_min, sol.x_M_min)
    lu = u["length"]
    added = [f"M_max{suffix}", f"V_max{suffix}"]
    sh.given(added[0], Q_(abs(m_val), u["moment"]), "Maximum moment magnitude",
             source=f"beam analysis, x = {format_number(m_x, -4)} {lu}")
    sh.given(added[1], Q_(abs(sol.V_max), u["force"]), "Maximum shear magnitude",
             source=f"beam analysis, x = {format_number(sol.x_V_max, -4)} {lu}")
    if sol.delta_max is not None:
        added.append(f"delta_max{suffix}")
        sh.given(added[2], Q_(abs(sol.delta_max), lu), "Maximum deflection magnitude",
                 source=f"beam analysis, x = {format_number(sol.x_delta_max, -4)} {lu}")
    return added
