"""The sheet: an ordered list of steps, evaluated by dependency into a result model.

    sh = Sheet("Leg L1 bending")
    sh.given("P", "250 lbf", "Lateral load at top of leg")
    sh.given("L", "84 in", "Leg length")
    sh.step("M", "P*L", "Base moment", ref="statics")
    sh.evaluate()

Names are resolved wherever they are defined in the sheet (display order is the author's).
Changing a given with :meth:`Sheet.set` and evaluating again recomputes only the steps
downstream of it.
"""

from __future__ import annotations

import difflib
import hashlib
import importlib
import math
import os
import re
from collections.abc import Iterable, Mapping, Sequence
from typing import Any

import numpy as np
import pint
import sympy as sp

from calcpad.core.errors import CalcpadError, DimensionError, FormulaError, NonFiniteError, SheetError
from calcpad.core.figure_png import figure_png
from calcpad.core.formula import CONSTANTS, RESERVED_NAMES, Formula, formula_from_sympy, parse_condition, parse_formula
from calcpad.core.names import is_valid_name
from calcpad.core.quantity_eval import evaluate_condition, evaluate_expr, is_finite, non_finite_error
from calcpad.core.registry import base_factor, conversion_factor, copy_quantity
from calcpad.core.results import (
    EXISTING_NG,
    EXISTING_OK,
    NG,
    NOT_COVERED,
    OK,
    BranchCase,
    BranchResult,
    CheckResult,
    FigureResult,
    FormulaResult,
    GivenResult,
    HeadingResult,
    SelectCandidate,
    SelectResult,
    SheetResult,
    TableResult,
    TextResult,
)
from calcpad.core.steps import Branch, Case, Check, Figure, FormulaStep, Given, Heading, Select, Step, Table, Text
from calcpad.core.units import Q_, DisplayPrefs, format_number, parse_quantity, parse_unit, unit_symbol

__all__ = ["DISPLAY_HOOK", "Sheet", "calc_heading", "status_mark"]

#: Where notebook display comes from. The engine does not import printers; this dotted path is
#: loaded the first time a sheet is shown in Jupyter (dependency inversion, not a sideways import).
DISPLAY_HOOK = "calcpad.render.notebook:mimebundle"

_METHODS = ("ASD", "LRFD")

#: Environment variable naming the display system for sheets created without ``system=``.
#: The runner sets it from a job's ``units`` so the same template prints US or SI.
SYSTEM_ENV = "CALCPAD_UNITS"


def _to_formula(text_or_expr: str | sp.Basic, condition: bool = False) -> Formula:
    if isinstance(text_or_expr, str):
        return parse_condition(text_or_expr) if condition else parse_formula(text_or_expr)
    return formula_from_sympy(text_or_expr)


def _slug(text: str) -> str:
    slug = re.sub(r"[^A-Za-z0-9]+", "_", text).strip("_").lower()
    return slug or "check"


_TYPED_NUMBER = re.compile(r"^\s*[-+]?(\d[\d,]*)\.(\d*0)(?![\d/])")


def typed_sig(value: object) -> int | None:
    """Significant figures of a typed value whose decimals end in zero (``"1.900 in"`` → 4), so
    it prints as typed; None when printing "as entered" already shows it (``"0.145 in"``)."""
    if not isinstance(value, str):
        return None
    m = _TYPED_NUMBER.match(value)
    if not m:
        return None
    digits = (m.group(1).replace(",", "") + m.group(2)).lstrip("0")
    return len(digits) or None


def status_mark(status: str) -> str:
    """A check status for tables: ``OK``, or ``[NG]`` framed so it is unmistakable without colour."""
    return f"[{status}]" if status == NG else status


def calc_heading(what: str, title: str = "", mark: str = "", part: str = "") -> str:
    """A sheet title from the job: ``"L1 - Stand legs: bending at base, existing section"``.

    ``title`` is the job's calc title (``what``, the template's own words, when empty), ``mark``
    the member mark and ``part`` names one of several sheets of a calc. Templates call this
    with their ``calc_title`` and ``member_mark`` parameters, which the runner fills, so no
    template carries a mark or a project's words.
    """
    head = (title or what).strip()
    if part:
        head = f"{head}, {part}"
    return f"{mark.strip()} - {head}" if mark and mark.strip() else head


#: A formula's value and its shown value by the formula (identity), the exact values it reads
#: (magnitude ``repr`` and units in order), the unit asked and the display preferences: the
#: calcs of a template evaluate many formulas on the same values. Bounded.
_VALUES: dict[tuple[Any, ...], tuple[Any, pint.Quantity, pint.Quantity]] = {}
_VALUES_MAX = 5_000
_EXACT = (float, int, np.float64)


def _in_base(q: pint.Quantity) -> Any:
    """``q.to_base_units().magnitude``, by the units' factor (the same number: pint multiplies by it)."""
    try:
        f = base_factor(q._units)
    except ValueError:  # an offset unit
        return q.to_base_units().magnitude
    return q._magnitude if f is None else q._magnitude * f


def _in_unit(q: pint.Quantity, unit: pint.Unit) -> Any:
    """``q.to(unit).magnitude`` by the units' factor (a table column converts every cell)."""
    try:
        f = conversion_factor(q._units, unit._units)
    except ValueError:
        return q.to(unit).magnitude
    return q._magnitude if f is None else q._magnitude * f


_NO_UNITS = Q_(1.0, "")._units

#: Text of a value's units as ``str(q.units)`` prints it, by the units in order (digests).
_UNIT_TEXT: dict[tuple[Any, ...], str] = {}


def _unit_text(q: pint.Quantity) -> str:
    key = tuple(q._units.items())
    text = _UNIT_TEXT.get(key)
    if text is None:
        text = str(q.units)
        if len(_UNIT_TEXT) < 4096:
            _UNIT_TEXT[key] = text
    return text


def _own(q: pint.Quantity) -> pint.Quantity:
    """A copy of a Quantity the caller handed in: changing theirs later (``ito``) leaves the sheet's."""
    return copy_quantity(q)


def _value_key(expr: Any, env: Mapping[str, pint.Quantity], unit: Any, prefs: DisplayPrefs) -> tuple[Any, ...] | None:
    """Key of :data:`_VALUES`, or None when a value is not a plain number with units."""
    vals = []
    for n, q in env.items():
        m = q.magnitude
        if type(m) not in _EXACT:
            return None
        vals.append((n, repr(m), tuple(q._units.items())))
    return (id(expr), tuple(vals), unit, prefs.system, prefs.sig, tuple(prefs.overrides.items()))


#: Table cell texts of quantities (see ``Sheet._cell``), bounded.
_CELLS: dict[tuple[Any, ...], str] = {}
_CELLS_MAX = 5_000


def _column_scale(rows: list[list[Any]], j: int) -> float:
    """Largest magnitude of the numeric cells in column ``j`` (0 when none)."""
    mags = []
    for row in rows:
        v = row[j] if j < len(row) else None
        if isinstance(v, pint.Quantity):
            mags.append(abs(float(v.magnitude)))
        elif isinstance(v, float):
            mags.append(abs(v))
    return max(mags, default=0.0)


def _fixed(x: float, decimals: int | None, sig: int) -> str:
    """``x`` with a column's fixed decimals (thousands separated; never "-0"), or with ``sig``
    significant figures when the column has no fixed rule."""
    if decimals is None or not math.isfinite(x):
        return format_number(x, sig)
    text = f"{x:,.{decimals}f}"
    if text.startswith("-"):  # the minus sign format_number prints, and never "-0"
        text = "−" + text[1:] if text.strip("-0.,") else text[1:]
    return text


class Sheet:
    """An ordered calc sheet of givens, steps, branches, selections and checks.

    Args:
        title: Sheet title, shown as its first heading.
        system: Display unit system, ``"US"`` or ``"SI"``; default from the ``CALCPAD_UNITS``
            environment variable (set by the runner from the job), else ``"US"``.
        sig: Significant figures for results (per-step ``sig=`` overrides).
        method: ``"ASD"`` or ``"LRFD"``; engineering checks read it to pick Ω or φ.
        display: Per-kind display units, e.g. ``{"moment": "kip*ft"}``.
        meta: Free title-block data (member mark, template, ...), carried into the record.
    """

    def __init__(
        self,
        title: str,
        system: str | None = None,
        sig: int = 4,
        method: str = "ASD",
        display: Mapping[str, str] | None = None,
        meta: Mapping[str, str] | None = None,
    ) -> None:
        if method not in _METHODS:
            raise SheetError(f"sheet {title!r}: method {method!r}; expected 'ASD' or 'LRFD'")
        self.title = title
        if system is None:
            system = os.environ.get(SYSTEM_ENV, "US") or "US"
        self.prefs = DisplayPrefs(system=system, sig=sig, overrides=dict(display or {}))
        self.method = method
        self.meta: dict[str, str] = dict(meta or {})
        self._steps: list[Step] = []
        self._defs: dict[str, Step] = {}
        self._dirty: set[str] = set()
        self._values: dict[str, pint.Quantity] = {}
        self._shown: dict[str, pint.Quantity] = {}
        self._results: dict[str, Any] = {}
        self._result: SheetResult | None = None
        self._order: list[str] | None = None  # evaluation order, until a step is added
        self._digest: str | None = None  # digest of the givens, until one changes
        self._pending: list[str] = []  # computed since the last result model
        self.last_recomputed: list[str] = []

    # ------------------------------------------------------------------ building

    @property
    def system(self) -> str:
        """Display unit system ("US" or "SI")."""
        return self.prefs.system

    @property
    def steps(self) -> list[Step]:
        """The step definitions, in author order (read-only view)."""
        return list(self._steps)

    def _add(self, step: Step) -> None:
        name = step.defines
        if name is not None:
            if not is_valid_name(name):
                raise SheetError(
                    f"sheet {self.title!r}: {name!r} is not a valid name (letters, digits and single underscores; starts with a letter)"
                )
            if name in RESERVED_NAMES:
                what = "the constant" if name in CONSTANTS else "the function"
                raise SheetError(
                    f"sheet {self.title!r}: {name!r} is {what} {name!r} in formulas, so it cannot name a given or step; "
                    f"choose another name such as '{name}_1'"
                )
            if name in self._defs:
                raise SheetError(f"sheet {self.title!r}: {name!r} is defined twice; every name in a sheet is unique")
        # a step using only names defined already goes last in a valid order (nothing before it can use
        # its name: a valid order has no unknown names); anything else re-sorts at the next evaluation
        if self._order is not None and all(d in self._defs for d in step.depends):
            if name is not None:
                self._order.append(name)
        else:
            self._order = None
        if name is not None:
            self._defs[name] = step
            self._dirty.add(name)
            if isinstance(step, Given):
                self._digest = None
        self._steps.append(step)
        self._result = None

    def _formula(self, name: str, text: str | sp.Basic, condition: bool = False) -> Formula:
        try:
            return _to_formula(text, condition)
        except FormulaError as exc:
            raise FormulaError(f"step {name!r}: {exc}") from None

    def _unit(self, name: str, unit: str | None) -> pint.Unit | None:
        if unit is None:
            return None
        try:
            return parse_unit(unit, f"step {name!r} unit")
        except CalcpadError as exc:
            raise SheetError(str(exc)) from None

    def given(
        self,
        name: str,
        value: str | pint.Quantity | float,
        description: str = "",
        source: str = "",
        *,
        sig: int | None = None,
        min: str | pint.Quantity | float | None = None,  # noqa: A002 - reads naturally at call sites
        max: str | pint.Quantity | float | None = None,  # noqa: A002
        choices: Sequence[str] | None = None,
    ) -> None:
        """Add an input value with its unit (``"84 in"``, ``Q_(84, "in")`` or a plain number).

        ``min``/``max``/``choices`` describe the allowed range a what-if control offers.
        """
        q = _own(parse_quantity(value, f"given {name!r}"))
        control: dict[str, Any] = {}
        for key, bound in (("min", min), ("max", max)):
            if bound is not None:
                b = parse_quantity(bound, f"given {name!r} {key}")
                if b.dimensionality != q.dimensionality:
                    raise SheetError(f"given {name!r}: {key} {bound!r} does not have the dimension of {value!r}")
                control[key] = b
        if choices:
            control["choices"] = list(choices)
        if sig is None:
            # typed text prints as typed (trailing zeros kept); a value the template computed
            # prints to the sheet's figures without padding zeros
            sig = typed_sig(value) if isinstance(value, str) else -self.prefs.sig
        self._add(Given(name, q, description, source, sig, control))

    def step(
        self,
        name: str,
        formula: str | sp.Basic,
        description: str = "",
        *,
        unit: str | None = None,
        ref: str = "",
        sig: int | None = None,
        quiet: bool = False,
    ) -> None:
        """Add ``name = formula`` (a formula string or a sympy expression). ``quiet=True`` marks
        an internal intermediate that the printers leave out while its value is zero (e.g. the
        ineffective area of a flange that is fully effective)."""
        self._add(FormulaStep(name, self._formula(name, formula), description, self._unit(name, unit), ref, sig, quiet))

    def branch(
        self,
        name: str,
        cases: Sequence[tuple[str | sp.Basic | None, str | sp.Basic, str]],
        description: str = "",
        *,
        unit: str | None = None,
        ref: str = "",
        sig: int | None = None,
        words: bool = False,
    ) -> None:
        """Add a step whose formula is picked by the first condition that holds.

        ``cases`` is a list of ``(condition, formula, label)``; a ``None`` condition is
        "otherwise" and must come last. The label names the governing equation. ``words=True``
        marks the value as an internal marker (a class number): the sheet prints the chosen
        label ("compact") instead of the value.
        """
        if not cases:
            raise SheetError(f"branch {name!r}: needs at least one case")
        built = []
        for i, (cond, formula, label) in enumerate(cases):
            if cond is None and i != len(cases) - 1:
                raise SheetError(f"branch {name!r}: the 'otherwise' case (condition None) must be last")
            built.append(
                Case(
                    self._formula(name, cond, condition=True) if cond is not None else None,
                    self._formula(name, formula),
                    str(label),
                )
            )
        self._add(Branch(name, built, description, self._unit(name, unit), ref, sig, words))

    def select(
        self,
        name: str,
        mode: str,
        candidates: Mapping[str, str] | Sequence[str],
        description: str = "",
        *,
        unit: str | None = None,
        ref: str = "",
        sig: int | None = None,
    ) -> None:
        """Add ``name = min(...)`` or ``max(...)`` of named steps, showing which governs.

        ``candidates`` maps step names to labels (e.g. ``{"M_p": "yielding (F7-1)"}``).
        """
        if mode not in ("min", "max"):
            raise SheetError(f"selection {name!r}: mode {mode!r}; expected 'min' or 'max'")
        cands = dict(candidates) if isinstance(candidates, Mapping) else {c: c for c in candidates}
        if not cands:
            raise SheetError(f"selection {name!r}: needs at least one candidate")
        self._add(Select(name, mode, cands, description, self._unit(name, unit), ref, sig))

    def check(
        self,
        title: str,
        demand: str,
        capacity: str,
        *,
        ref: str = "",
        required_fs: float | None = None,
        show_fs: bool | None = None,
        limit: float = 1.0,
        key: str | None = None,
        sig: int | None = None,
        flags: Sequence[tuple[str, float, str]] = (),
        existing: bool = False,
    ) -> str:
        """Add a check of ``demand`` against ``capacity`` (names of givens or steps).

        ratio = demand / capacity, OK when ratio ≤ ``limit``. With ``required_fs`` the check is a
        factor-of-safety check: FS = capacity / demand, OK when FS ≥ required_fs, and
        ratio = required_fs / FS. ``flags`` are ``(name, above, status)``: the check takes
        ``status`` when the value of ``name`` exceeds ``above`` (``NOT_COVERED`` always, any other
        status only in place of OK). ``existing=True`` marks a check of an existing condition
        before a repair (status ``EXISTING_OK``/``EXISTING_NG``, never making the calc NG).
        Returns the check's key.
        """
        if required_fs is not None and not required_fs > 0:
            raise SheetError(f"check {title!r}: required_fs {required_fs!r}; expected a number > 0")
        if not limit > 0:
            raise SheetError(f"check {title!r}: limit {limit!r}; expected a number > 0")
        k = key or "chk_" + _slug(title)
        base, n = k, 2
        while k in self._defs:
            k, n = f"{base}_{n}", n + 1
        fs_line = (required_fs is not None) if show_fs is None else show_fs
        for flag in flags:
            if not (len(flag) == 3 and isinstance(flag[0], str) and isinstance(flag[2], str)):
                raise SheetError(f"check {title!r}: flag {flag!r}; expected (name, above, status)")
        built = tuple((str(n), float(above), str(status)) for n, above, status in flags)
        self._add(Check(k, title, demand, capacity, ref, required_fs, fs_line, float(limit), sig, built, bool(existing)))
        return k

    def heading(self, text: str, level: int = 1) -> None:
        """Add a heading (level 1 or 2)."""
        self._add(Heading(text, 1 if level <= 1 else 2))

    def note(self, text: str) -> None:
        """Add a note."""
        self._add(Text(text, "note"))

    def assume(self, text: str) -> None:
        """Add an assumption (listed as such in the submittal)."""
        self._add(Text(text, "assumption"))

    def reference(self, text: str) -> None:
        """Add a reference line (standard, table, drawing)."""
        self._add(Text(text, "reference"))

    def table(self, title: str, data: Any, columns: Sequence[str] | None = None, note: str = "") -> None:
        """Add a table from a DataFrame or rows; quantities and floats are formatted here."""
        if hasattr(data, "columns") and hasattr(data, "itertuples"):
            cols = [str(c) for c in data.columns]
            raw_rows: Iterable[Sequence[Any]] = [list(r) for r in data.itertuples(index=False)]
        else:
            if columns is None:
                raise SheetError(f"table {title!r}: give columns= with a list of rows")
            cols = [str(c) for c in columns]
            raw_rows = data
        raw_rows = [list(r) for r in raw_rows]
        formats = [self._column_format(raw_rows, j) for j in range(len(cols))]
        rows = [[self._cell(v, *formats[j]) if j < len(formats) else self._cell(v) for j, v in enumerate(row)] for row in raw_rows]
        for i, row in enumerate(rows):
            if len(row) != len(cols):
                raise SheetError(f"table {title!r}: row {i + 1} has {len(row)} cells; expected {len(cols)}")
        self._add(Table(title, cols, rows, note))

    def _column_format(self, rows: list[list[Any]], j: int) -> tuple[float, Any, int | None]:
        """(largest magnitude, display unit, decimals) of table column ``j``.

        One column prints with one rule: its numbers (floats, or quantities of one kind, shown
        in the unit its largest value takes) get the decimals that give the largest one the
        sheet's significant figures, so ``1,606`` and ``0.07276`` do not stand in one column
        as ``1,606`` and ``0.07276`` but as ``1,606`` and ``0``. Columns of mixed kinds, or
        whose largest value needs powers of ten, keep the per-cell figures (decimals None).
        """
        cells = [row[j] for row in rows if j < len(row) and isinstance(row[j], (pint.Quantity, float))]
        if not cells:
            return 0.0, None, None
        unit = None
        if all(isinstance(v, pint.Quantity) for v in cells):
            dims = {v.dimensionality for v in cells}
            if len(dims) != 1:
                return _column_scale(rows, j), None, None
            unit = self.prefs.unit_for(max(cells, key=lambda v: abs(float(_in_base(v)))))
            mags = [abs(float(_in_unit(v, unit))) for v in cells]
        elif any(isinstance(v, pint.Quantity) for v in cells):
            return _column_scale(rows, j), None, None
        else:
            mags = [abs(float(v)) for v in cells]
        finite = [m for m in mags if math.isfinite(m)]
        top = max(finite, default=0.0)
        sig = self.prefs.sig
        if top == 0.0 or sig <= 0 or top >= 1e9 or top < 1e-4:
            return _column_scale(rows, j), unit, None
        exponent = math.floor(math.log10(float(format_number(top, sig).replace(",", ""))))
        return top, unit, max(sig - 1 - exponent, 0)

    def _cell(self, v: Any, scale: float = 0.0, unit: Any = None, decimals: int | None = None) -> str:
        """A table cell's text; a quantity's text is kept by its exact magnitude, units, the
        column's unit and decimals and the sheet's display preferences (tables of frame results
        repeat many values)."""
        if isinstance(v, pint.Quantity) and type(v.magnitude) in _EXACT:
            noise = scale > 0 and abs(float(v.magnitude)) < 1e-9 * scale
            key = (repr(v.magnitude), tuple(v._units.items()), noise, str(unit), decimals, self.prefs.system,
                   self.prefs.sig, tuple(self.prefs.overrides.items()))
            text = _CELLS.get(key)
            if text is None:
                text = self._cell_text(v, scale, unit, decimals)
                if len(_CELLS) >= _CELLS_MAX:
                    _CELLS.clear()
                _CELLS[key] = text
            return text
        return self._cell_text(v, scale, unit, decimals)

    def _cell_text(self, v: Any, scale: float = 0.0, unit: Any = None, decimals: int | None = None) -> str:
        if isinstance(v, (pint.Quantity, float)) and scale > 0:
            mag = float(v.to(unit).magnitude) if isinstance(v, pint.Quantity) and unit is not None else (
                float(v.magnitude) if isinstance(v, pint.Quantity) else v)
            if abs(mag) < 1e-9 * scale:  # round-off noise from an analysis, e.g. 1.8e-16
                v = v * 0.0
        if isinstance(v, pint.Quantity):
            unit = unit if unit is not None else self.prefs.unit_for(v)
            return f"{_fixed(float(v.to(unit).magnitude), decimals, self.prefs.sig)} {unit_symbol(unit)}".strip()
        if isinstance(v, float):
            return _fixed(v, decimals, self.prefs.sig)
        return str(v)

    def figure(self, title: str, fig: Any, caption: str = "") -> None:
        """Add a figure (a matplotlib figure or PNG bytes). A figure is saved at its own size and
        layout (no tight bounding box, which costs a second drawing): give it fixed margins or a
        layout engine so nothing is clipped. A figure marked with what it draws
        (:func:`calcpad.core.figure_png.mark_content`) is saved once per distinct drawing."""
        if isinstance(fig, (bytes, bytearray)):
            png = bytes(fig)
        elif hasattr(fig, "savefig"):
            png = figure_png(fig, 110)
        else:
            raise SheetError(f"figure {title!r}: expected a matplotlib figure or PNG bytes, got {type(fig).__name__}")
        self._add(Figure(title, png, caption))

    # ------------------------------------------------------------------ changing

    def givens(self) -> list[Given]:
        """The given definitions, in author order."""
        return [s for s in self._steps if isinstance(s, Given)]

    def set(self, **values: str | pint.Quantity | float) -> None:
        """Change givens by name (``sh.set(P="300 lbf")``); the next evaluation updates downstream."""
        for name, value in values.items():
            step = self._defs.get(name)
            if not isinstance(step, Given):
                raise SheetError(f"sheet {self.title!r}: {name!r} is not a given{self._did_you_mean(name, given_only=True)}")
            q = _own(parse_quantity(value, f"given {name!r}"))
            if q.dimensionality != step.value.dimensionality:
                raise SheetError(
                    f"given {name!r}: {value!r} does not have the dimension of its default {step.value:~}; "
                    f"expected a value like '{step.value.magnitude:g} {unit_symbol(step.value.units, 'ascii')}'"
                )
            step.value = q
            self._dirty.add(name)
            self._result = None
            self._digest = None

    def _did_you_mean(self, name: str, given_only: bool = False) -> str:
        pool = [n for n, s in self._defs.items() if not given_only or isinstance(s, Given)]
        close = difflib.get_close_matches(name, pool, n=3, cutoff=0.5)
        return f"; did you mean {', '.join(repr(c) for c in close)}?" if close else ""

    # ------------------------------------------------------------------ evaluation

    def order(self) -> list[str]:
        """Names in evaluation order (dependencies first). Raises SheetError on cycles/unknowns."""
        if self._order is None:
            self._order = self._find_order()
        return list(self._order)

    def _find_order(self) -> list[str]:
        for step in self._steps:
            for dep in step.depends:
                if dep not in self._defs:
                    who = step.defines or getattr(step, "title", "?")
                    raise SheetError(f"step {who!r}: unknown name {dep!r}{self._did_you_mean(dep)}")
        order: list[str] = []
        state: dict[str, int] = {}

        def visit(name: str, chain: list[str]) -> None:
            mark = state.get(name, 0)
            if mark == 2:
                return
            if mark == 1:
                cycle = chain[chain.index(name) :] + [name]
                raise SheetError("dependency cycle between steps: " + " -> ".join(cycle))
            state[name] = 1
            for dep in self._defs[name].depends:
                visit(dep, chain + [name])
            state[name] = 2
            order.append(name)

        for name in self._defs:
            visit(name, [])
        return order

    def evaluate(self) -> SheetResult:
        """Evaluate (incrementally) and return the result model."""
        if self._result is not None and not self._dirty:
            return self._result
        self._compute()
        self.last_recomputed, self._pending = self._pending, []
        self._result = self._assemble()
        return self._result

    def _compute(self) -> None:
        """Evaluate the steps that changed, without assembling the result model (reading values
        while a template builds a sheet needs only the values). :attr:`last_recomputed` lists
        every step computed since the previous result model."""
        if not self._dirty:
            return
        if self._order is None:
            self._order = self.order()
        recomputed: set[str] = set()
        for name in self._order:
            step = self._defs[name]
            if name in self._dirty or name not in self._results or any(d in recomputed for d in step.depends):
                self._results[name] = self._evaluate_step(step)
                recomputed.add(name)
        self._dirty.clear()
        done = set(self._pending)
        self._pending += [n for n in self._order if n in recomputed and n not in done]

    def _sig(self, step: Any) -> int:
        if getattr(step, "sig", None):
            return step.sig
        # givens show as entered (no padding zeros) unless a sig is set on them
        return 0 if isinstance(step, Given) else self.prefs.sig

    def _show(self, name: str, value: pint.Quantity, unit: pint.Unit | None) -> pint.Quantity:
        try:
            shown = value.to(self.prefs.shown_unit(value, unit))
        except pint.DimensionalityError:
            asked = unit_symbol(unit, "ascii") if unit is not None else "?"
            raise DimensionError(
                f"step {name!r}: the result is a {value.dimensionality} quantity ({value.units:~}); it cannot be shown in {asked!r}"
            ) from None
        if not is_finite(shown):  # a finite value can overflow when converted (1e300 m**4 in mm**4)
            raise non_finite_error(name, shown, {}, f"the result in {unit_symbol(shown.units, 'ascii')}")
        self._values[name] = value
        self._shown[name] = shown
        return shown

    def _env(self, names: Iterable[str]) -> dict[str, pint.Quantity]:
        return {n: self._shown[n] for n in names}

    def _formula_result(self, name: str, step: Any, formula: Formula) -> FormulaResult:
        env = self._env(formula.names)
        key = _value_key(formula.expr, env, step.unit, self.prefs)
        hit = _VALUES.get(key) if key is not None else None
        if hit is not None and hit[0] is formula.expr:
            # copies: a Quantity is mutable (``ito``), and each sheet's values are its own
            value, shown = copy_quantity(hit[1]), copy_quantity(hit[2])
            self._values[name], self._shown[name] = value, shown
        else:
            value = evaluate_expr(formula.expr, env, name)
            shown = self._show(name, value, step.unit)
            if key is not None:
                if len(_VALUES) >= _VALUES_MAX:
                    _VALUES.clear()
                # keeps the expression (and its id) alive; stores copies so no sheet shares them
                _VALUES[key] = (formula.expr, copy_quantity(value), copy_quantity(shown))
        sigs = {n: self._sig(self._defs[n]) for n in formula.names}
        return FormulaResult(name, formula.expr, env, shown, step.description, step.ref, self._sig(step), sigs, getattr(step, "quiet", False))

    def _evaluate_step(self, step: Step) -> Any:
        if isinstance(step, Given):
            value = step.value
            self._values[step.name] = value
            shown = value
            if not value._units:  # no unit at all (pint's "dimensionless"): a plain number
                shown = Q_(float(value.magnitude), _NO_UNITS)  # as Q_(x, ""), without reading "" each time
            self._shown[step.name] = shown
            return GivenResult(step.name, shown, step.description, step.source, self._sig(step))
        if isinstance(step, FormulaStep):
            return self._formula_result(step.name, step, step.formula)
        if isinstance(step, Branch):
            return self._evaluate_branch(step)
        if isinstance(step, Select):
            return self._evaluate_select(step)
        if isinstance(step, Check):
            return self._evaluate_check(step)
        raise SheetError(f"cannot evaluate {type(step).__name__}")  # pragma: no cover

    def _evaluate_branch(self, step: Branch) -> BranchResult:
        cases = [BranchCase(c.condition.expr if c.condition else None, c.formula.expr, c.label) for c in step.cases]
        tested, held, sides, cond_env = 0, False, None, {}
        chosen = len(step.cases) - 1
        for i, case in enumerate(step.cases):
            if case.condition is None:
                break
            cond_env = self._env(case.condition.names)
            held, raw = evaluate_condition(case.condition.expr, cond_env, step.name)
            tested = i
            if raw is not None:
                lhs, rhs = raw
                if not isinstance(case.condition.expr.lhs, sp.Symbol):  # a name keeps its own unit
                    lhs = lhs.to(self.prefs.unit_for(lhs))
                sides = (lhs, rhs.to(lhs.units))
            if held:
                chosen = i
                break
        formula = self._formula_result(step.name, step, step.cases[chosen].formula)
        return BranchResult(step.name, cases, chosen, cond_env, sides, held, formula, step.description, step.ref, tested, step.words)

    def _evaluate_select(self, step: Select) -> SelectResult:
        cands = []
        first = self._values[next(iter(step.candidates))]
        for name, label in step.candidates.items():
            v = self._values[name]
            if v.dimensionality != first.dimensionality:
                raise DimensionError(f"selection {step.name!r}: candidate {name!r} is not the same kind of quantity as the others")
            cands.append((name, label, v))
        mags = [float(v.to(first.units).magnitude) for _, _, v in cands]
        pick = mags.index(min(mags) if step.mode == "min" else max(mags))
        shown = self._show(step.name, cands[pick][2], step.unit)
        shown_unit = shown.units
        candidates = [SelectCandidate(n, lab, self._shown[n].to(shown_unit)) for n, lab, _ in cands]
        return SelectResult(step.name, step.mode, candidates, pick, shown, step.description, step.ref, self._sig(step))

    def _evaluate_check(self, step: Check) -> CheckResult:
        demand, capacity = self._shown[step.demand], self._shown[step.capacity]
        if demand.dimensionality != capacity.dimensionality:
            raise DimensionError(
                f"check {step.title!r}: demand {step.demand!r} ({demand.units:~}) and capacity {step.capacity!r} "
                f"({capacity.units:~}) are different kinds of quantity"
            )
        demand = demand.to(capacity.units)  # one unit per kind inside a ratio: the capacity's
        cap = float(capacity.magnitude)
        dem = abs(float(demand.magnitude))
        for role, nm, v in (("demand", step.demand, dem), ("capacity", step.capacity, cap)):
            if not math.isfinite(v):  # never OK (nor FS = ∞) on a NaN
                raise NonFiniteError(f"check {step.title!r}: {role} {nm!r} is not a finite number ({v}); check the inputs of {nm!r}")
        if not cap > 0:
            raise SheetError(f"check {step.title!r}: capacity {step.capacity!r} = {capacity:~} must be greater than zero")
        ratio = dem / cap
        fs = cap / dem if dem > 0 else float("inf")
        if step.required_fs is not None:
            ratio = step.required_fs / fs if dem > 0 else 0.0
        status = OK if ratio <= step.limit else NG
        for name, above, flagged in step.flags:
            if float(self._values[name].to("").magnitude) > above and (flagged == NOT_COVERED or status == OK):
                status = flagged
                if flagged == NOT_COVERED:
                    break
        if step.existing and status != NOT_COVERED:
            status = EXISTING_NG if status == NG else EXISTING_OK
        self._values[step.key] = Q_(ratio, "")
        self._shown[step.key] = Q_(ratio, "")
        return CheckResult(
            step.key,
            step.title,
            step.demand,
            step.capacity,
            demand,
            capacity,
            ratio,
            status,
            fs if (step.show_fs or step.required_fs is not None) else None,
            step.required_fs,
            step.show_fs,
            step.limit,
            step.ref,
            self._sig(step),
        )

    def _assemble(self) -> SheetResult:
        out: list[Any] = []
        for step in self._steps:
            if step.defines is not None:
                out.append(self._results[step.defines])
            elif isinstance(step, Heading):
                out.append(HeadingResult(step.text, step.level))
            elif isinstance(step, Text):
                out.append(TextResult(step.text, step.kind))
            elif isinstance(step, Table):
                out.append(TableResult(step.title, step.columns, step.rows, step.note))
            elif isinstance(step, Figure):
                out.append(FigureResult(step.title, step.png, step.caption))
        return SheetResult(self.title, out, self.system, self.method, self.digest(), dict(self.meta))

    def digest(self) -> str:
        """SHA-256 over every given (name, magnitude, unit) — identifies the inputs of a run."""
        if self._digest is None:
            h = hashlib.sha256()
            for g in self.givens():
                h.update(f"{g.name}={g.value.magnitude!r} {_unit_text(g.value)}\n".encode())
            self._digest = h.hexdigest()
        return self._digest

    # ------------------------------------------------------------------ reading

    def __getitem__(self, name: str) -> pint.Quantity:
        self._compute()
        if name not in self._shown:
            raise KeyError(f"{name!r} is not a name in sheet {self.title!r}{self._did_you_mean(name)}")
        return copy_quantity(self._shown[name])  # the caller may change it (``ito``); the sheet's stays

    def __contains__(self, name: str) -> bool:
        return name in self._defs

    def summary(self) -> list[CheckResult]:
        """All checks of the evaluated sheet."""
        return self.evaluate().checks

    def summary_frame(self) -> Any:
        """Checks as a pandas DataFrame (name, demand, capacity, ratio, status).

        ratio = demand / capacity in every row: the demand's magnitude, in the capacity's unit;
        a factor-of-safety check lists the allowable value (capacity / required FS). An NG
        status is printed ``[NG]``, framed, so it stands out without colour.
        """
        import pandas as pd  # lazy: pandas is slow to import

        rows = []
        for c in self.summary():
            unit = unit_symbol(c.capacity.units)
            capacity = float(c.capacity.magnitude) / (c.required_fs or 1.0)
            rows.append(
                {
                    "check": c.title,
                    "demand": f"{format_number(abs(float(c.demand.magnitude)), c.sig)} {unit}".strip(),
                    "capacity": f"{format_number(capacity, c.sig)} {unit}".strip(),
                    "ratio": round(c.ratio, 3),
                    "status": status_mark(c.status),
                    "reference": c.ref,
                }
            )
        return pd.DataFrame(rows, columns=["check", "demand", "capacity", "ratio", "status", "reference"])

    def compile(self) -> Any:
        """Compile into a vectorised numpy function (see :mod:`calcpad.core.compiled`)."""
        from calcpad.core.compiled import CompiledSheet

        return CompiledSheet(self)

    def _repr_mimebundle_(self, include: Any = None, exclude: Any = None) -> dict[str, Any]:
        module, _, attr = DISPLAY_HOOK.partition(":")
        return getattr(importlib.import_module(module), attr)(self.evaluate())

    def __repr__(self) -> str:
        return f"<Sheet {self.title!r}: {len(self._steps)} steps>"
