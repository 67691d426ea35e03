"""Questions after a calc: which input moves the ratios most, and how far can an input go.

- :func:`elasticities`: for the current design, d ln(ratio) / d ln(x) of every check (and of the
  governing one) to each numeric given, by central differences on the compiled sheet, all
  perturbed designs in one vectorised call.
- :func:`value_for_limit`: the value of one given at which the governing check reaches its
  limit, by a grid over the stated range (vectorised, to bracket the crossing nearest the
  current value) and :func:`scipy.optimize.brentq` inside the bracket.
- :func:`lightest_passing`: the lightest catalog size of a section parameter's family with
  every check OK (each size re-runs the template).

The functions read the sheet; none changes it.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field
from typing import TYPE_CHECKING, Any

import numpy as np
import pint

from calcpad.core.errors import CalcpadError, InputError
from calcpad.core.names import name_text
from calcpad.core.sheet import Sheet
from calcpad.core.units import Q_, format_number, unit_symbol

if TYPE_CHECKING:
    from calcpad.widgets.session import TemplateSession

__all__ = ["Answer", "Sensitivity", "elasticities", "lightest_passing", "sensitivity_figure", "value_for_limit"]

#: Relative step of the central differences (ln(1 ± h)).
REL_STEP = 1e-4
#: Points of the bracketing grid over a stated range.
GRID = 257


def _given_values(sheet: Sheet) -> dict[str, float]:
    return {g.name: float(g.value.magnitude) for g in sheet.givens()}


@dataclass
class Sensitivity:
    """Elasticities d ln(ratio)/d ln(x): ``table[check_key][input] `` (None where undefined)."""

    inputs: list[str]
    titles: dict[str, str]  # check key -> title
    ratios: dict[str, float]  # check key -> ratio at the current design
    table: dict[str, dict[str, float | None]]
    governing: str | None

    def of_governing(self) -> list[tuple[str, float]]:
        """(input, elasticity) of the governing check, largest magnitude first."""
        if self.governing is None:
            return []
        row = self.table[self.governing]
        pairs = [(n, v) for n, v in row.items() if v is not None]
        return sorted(pairs, key=lambda p: -abs(p[1]))


def elasticities(sheet: Sheet, names: Sequence[str] | None = None, compiled: Any = None, rel_step: float = REL_STEP) -> Sensitivity:
    """Elasticity of every check ratio to each numeric given (default: every given).

    One call of the compiled sheet evaluates the current design and, for each input x, the
    designs with x·(1+h) and x·(1−h); elasticity = (ln r₊ − ln r₋) / (ln(1+h) − ln(1−h)).
    Inputs that are zero, and ratios that are zero, have no elasticity (None).
    """
    comp = compiled if compiled is not None else sheet.compile()
    base = _given_values(sheet)
    inputs = [n for n in (names if names is not None else list(base)) if n in base]
    for n in names or []:
        if n not in base:
            raise InputError(f"sensitivity: {n!r} is not a given of sheet {sheet.title!r}")
    columns = 1 + 2 * len(inputs)
    arrays = {n: np.full(columns, v) for n, v in base.items()}
    for j, n in enumerate(inputs):
        arrays[n][1 + 2 * j] = base[n] * (1 + rel_step)
        arrays[n][2 + 2 * j] = base[n] * (1 - rel_step)
    ratios = comp.ratios(**arrays)
    result = sheet.evaluate()
    titles = {c.key: c.title for c in result.checks}
    denom = math.log1p(rel_step) - math.log1p(-rel_step)
    table: dict[str, dict[str, float | None]] = {}
    now: dict[str, float] = {}
    for key, r in ratios.items():
        r = np.broadcast_to(np.asarray(r, dtype=float), (columns,))
        now[key] = float(r[0])
        row: dict[str, float | None] = {}
        for j, n in enumerate(inputs):
            up, down = r[1 + 2 * j], r[2 + 2 * j]
            ok = base[n] != 0 and up > 0 and down > 0 and np.isfinite(up) and np.isfinite(down)
            row[n] = float((np.log(up) - np.log(down)) / denom) if ok else None
        table[key] = row
    gov = result.governing
    return Sensitivity(inputs, titles, now, table, gov.key if gov is not None else None)


def sensitivity_figure(sens: Sensitivity, check: str | None = None, labels: dict[str, str] | None = None) -> Any:
    """A horizontal bar chart of one check's elasticities (the governing one by default), sorted."""
    from matplotlib.figure import Figure  # no pyplot: the figure is not registered globally

    key = check or sens.governing
    fig = Figure(figsize=(6.0, 0.35 * max(len(sens.inputs), 3) + 1.0))
    ax = fig.add_subplot()
    if key is None:
        ax.text(0.5, 0.5, "no checks", ha="center")
        return fig
    pairs = sorted(((n, v) for n, v in sens.table[key].items() if v is not None), key=lambda p: abs(p[1]))
    names = [(labels or {}).get(n, name_text(n)) for n, _ in pairs]
    values = [v for _, v in pairs]
    ax.barh(names, values, color=["#4a6fa5" if v >= 0 else "#c06030" for v in values])
    ax.axvline(0.0, color="black", linewidth=0.8)
    ax.set_xlabel("elasticity d ln(ratio) / d ln(input): % change of the ratio per 1 % of the input")
    ax.set_title(f"{sens.titles[key]} (ratio {format_number(sens.ratios[key], 3)})", fontsize=10)
    fig.tight_layout()
    return fig


@dataclass
class Answer:
    """Result of a "what would it take" question."""

    status: str  # "value" | "passes" (over the whole range) | "fails" (nothing in range passes) | "none"
    message: str
    value: pint.Quantity | None = None
    designation: str | None = None
    ratio: float | None = None
    tried: list[str] = field(default_factory=list)


def _utilisation(comp: Any, sheet: Sheet) -> Callable[[str, Any], np.ndarray]:
    """Largest ratio/limit over the checks, for arrays of one given (the others as they are)."""
    base = _given_values(sheet)
    limits = {c.key: c.limit for c in sheet.evaluate().checks}

    def run(name: str, x: Any) -> np.ndarray:
        values = dict(base)
        values[name] = np.asarray(x, dtype=float)
        ratios = comp.ratios(**values)
        stacked = [np.asarray(r, dtype=float) / limits[k] for k, r in ratios.items()]
        with np.errstate(invalid="ignore"):
            return np.max(np.broadcast_arrays(*stacked), axis=0) if stacked else np.zeros_like(values[name])

    return run


def value_for_limit(
    sheet: Sheet,
    name: str,
    lower: pint.Quantity | None,
    upper: pint.Quantity | None,
    compiled: Any = None,
    lower_inclusive: bool = True,
    upper_inclusive: bool = True,
) -> Answer:
    """The value of given ``name`` in [lower, upper] at which the governing check reaches its limit.

    A missing bound is taken as 1/100 (lower) or 100× (upper) of the current value, and said so.
    Among several crossings the one nearest the current value is returned.
    """
    from scipy.optimize import brentq

    g = next((g for g in sheet.givens() if g.name == name), None)
    if g is None:
        raise InputError(f"what would it take: {name!r} is not a given of sheet {sheet.title!r}")
    unit = g.value.units
    sym = unit_symbol(unit)
    x0 = float(g.value.magnitude)
    notes = []
    lo = float(lower.to(unit).magnitude) if lower is not None else None
    hi = float(upper.to(unit).magnitude) if upper is not None else None
    if lo is None:
        lo = x0 / 100 if x0 > 0 else x0 * 100
        notes.append("no lower bound stated")
    if hi is None:
        hi = x0 * 100 if x0 > 0 else x0 / 100
        notes.append("no upper bound stated")
    span = hi - lo
    if not span > 0:
        return Answer("none", f"{name_text(name)}: the stated range is empty")
    eps = span * 1e-9
    a, b = (lo if lower_inclusive else lo + eps), (hi if upper_inclusive else hi - eps)
    comp = compiled if compiled is not None else sheet.compile()
    u = _utilisation(comp, sheet)
    grid = np.geomspace(a, b, GRID) if a > 0 and b / a > 50 else np.linspace(a, b, GRID)
    vals = u(name, grid) - 1.0
    finite = np.isfinite(vals)
    where = f"{format_number(a, 4)} to {format_number(b, 4)} {sym}".strip() + (f" ({', '.join(notes)})" if notes else "")
    if not finite.any():
        return Answer("none", f"{name_text(name)}: the checks cannot be evaluated over {where}")
    if np.all(vals[finite] <= 0):
        return Answer("passes", f"{name_text(name)}: every check passes over the whole range {where}")
    if np.all(vals[finite] > 0):
        return Answer("fails", f"{name_text(name)}: nothing in range passes ({where})")
    idx = np.flatnonzero(finite[:-1] & finite[1:] & (np.sign(vals[:-1]) != np.sign(vals[1:])))
    if idx.size == 0:
        return Answer("none", f"{name_text(name)}: no crossing of the limit found over {where}")
    mids = (grid[idx] + grid[idx + 1]) / 2
    k = int(idx[np.argmin(np.abs(mids - x0))])

    def f(x: float) -> float:
        return float(u(name, np.asarray([x]))[0] - 1.0)

    root = brentq(f, float(grid[k]), float(grid[k + 1]), xtol=1e-12 * max(abs(b), 1.0), rtol=1e-12)
    q = Q_(root, unit)
    side = "largest" if vals[k] <= 0 else "smallest"
    return Answer("value", f"{name_text(name)} = {format_number(root, 4)} {sym}".rstrip() + f": the {side} value with the governing check at its limit", q)


def _weight_order(designations: list[str], family: str) -> list[str]:
    from calcpad.eng.sections.catalog import section_table

    table = section_table(family)
    weight = dict(zip(table["designation"], table["weight"], strict=True))
    return sorted(designations, key=lambda d: (weight.get(d, math.inf), d))


def lightest_passing(session: TemplateSession, name: str, pick: Callable[[list[Sheet]], Sheet], limit: int | None = None,
                     family: str | None = None) -> Answer:
    """The lightest size of the section parameter ``name``'s family with every check OK.

    Sizes are tried in order of weight per foot; each re-runs the template with the panel's
    other current values (``pick`` chooses the sheet of interest from those the template makes).
    Sizes the checks do not cover (or that fail to build) are skipped. ``family``: the catalog
    family to search (default: the current value's, which must then be a catalog section).
    """
    from calcpad.eng.sections.catalog import designations, get_entry

    current = str(session.values[name])
    if family is None:
        try:
            family = get_entry(current).family
        except InputError:
            raise InputError(f"what would it take: {name!r} = {current!r} is not a catalog section") from None
    tried: list[str] = []
    for d in _weight_order(designations(family), family)[:limit]:
        tried.append(d)
        values = {**session.values, name: d}
        try:
            sheet = pick(session.build(values))
            result = sheet.evaluate()
        except CalcpadError:
            continue
        if result.checks and result.ok:
            gov = result.governing
            ratio = gov.ratio if gov is not None else None
            return Answer("value", f"{d}: the lightest {family.replace('_', ' ')} size with every check OK (governing ratio {format_number(ratio or 0.0, 3)})", designation=d, ratio=ratio, tried=tried)
    return Answer("fails", f"no {family.replace('_', ' ')} size in the catalog passes every check", tried=tried)
