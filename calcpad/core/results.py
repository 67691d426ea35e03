"""The result model: plain dataclasses every printer, the JSON record and the widgets read.

Evaluating a sheet produces a :class:`SheetResult` whose ``steps`` are in the author's order.
Printers never recompute: everything they show is here (symbolic form, the values substituted
into it, the result with its display unit, branch and selection outcomes, check outcomes).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import pint
import sympy as sp

__all__ = [
    "EXISTING_NG",
    "EXISTING_OK",
    "NG",
    "NOT_COVERED",
    "OK",
    "OK_SLENDER",
    "BranchCase",
    "BranchResult",
    "CheckResult",
    "FigureResult",
    "FormulaResult",
    "GivenResult",
    "HeadingResult",
    "SelectCandidate",
    "SelectResult",
    "SheetResult",
    "StepResult",
    "TableResult",
    "TextResult",
    "status_ok",
]

OK = "OK"
NG = "NG"
#: An OK check on a member above a recommended slenderness limit (AISC 360-16 E2, D1 user notes).
OK_SLENDER = "OK, above recommended slenderness"
#: An equation used outside its validity: no verdict (counts as not OK).
NOT_COVERED = "not covered"


#: Checks of an existing condition before a repair: reported, not governing (the repaired checks govern).
EXISTING_OK = "OK (existing condition)"
EXISTING_NG = "NG (existing condition; the repaired checks govern)"


def status_ok(status: str) -> bool:
    """True for the statuses that do not make a calc NG (OK, OK above a recommended slenderness,
    and the before-repair checks of an existing condition)."""
    return status in (OK, OK_SLENDER, EXISTING_OK, EXISTING_NG)


@dataclass
class GivenResult:
    """An input value with its unit, as shown on the sheet."""

    name: str
    value: pint.Quantity
    description: str = ""
    source: str = ""
    sig: int = 4
    kind: str = "given"


@dataclass
class FormulaResult:
    """``name = symbolic = substituted = value``; ``values`` maps each used name to the
    quantity substituted for it (already in that name's display unit)."""

    name: str
    expr: sp.Basic
    values: dict[str, pint.Quantity]
    value: pint.Quantity
    description: str = ""
    ref: str = ""
    sig: int = 4
    sigs: dict[str, int] = field(default_factory=dict)
    quiet: bool = False
    kind: str = "formula"

    @property
    def hidden(self) -> bool:
        """True for a quiet step whose value is zero: printers leave it out (the record keeps it)."""
        return self.quiet and float(self.value.magnitude) == 0.0


@dataclass
class BranchCase:
    """One case of a branch: its condition (None = otherwise), formula and label."""

    condition: sp.Basic | None
    expr: sp.Basic
    label: str


@dataclass
class BranchResult:
    """A branch picks one case by the first condition that holds; the chosen case is a formula.

    ``tested`` is the case whose condition is shown with its numbers (the chosen case, or the
    last case with a condition when "otherwise" was taken); ``condition_held`` says whether it held.
    """

    name: str
    cases: list[BranchCase]
    chosen: int
    condition_values: dict[str, pint.Quantity]
    condition_sides: tuple[pint.Quantity, pint.Quantity] | None
    condition_held: bool
    formula: FormulaResult
    description: str = ""
    ref: str = ""
    tested: int = 0
    words: bool = False
    kind: str = "branch"

    @property
    def value(self) -> pint.Quantity:
        """The result of the governing case."""
        return self.formula.value


@dataclass
class SelectCandidate:
    """A candidate of a selection step."""

    name: str
    label: str
    value: pint.Quantity


@dataclass
class SelectResult:
    """min/max of several candidates; ``governing`` is the index of the one that governs."""

    name: str
    mode: str
    candidates: list[SelectCandidate]
    governing: int
    value: pint.Quantity
    description: str = ""
    ref: str = ""
    sig: int = 4
    kind: str = "select"


@dataclass
class CheckResult:
    """Demand vs capacity: ratio = demand / capacity (× required FS when one is set).

    ``fs`` is capacity / demand, shown for yield-based checks (``show_fs``).
    """

    key: str
    title: str
    demand_name: str
    capacity_name: str
    demand: pint.Quantity
    capacity: pint.Quantity
    ratio: float
    status: str
    fs: float | None = None
    required_fs: float | None = None
    show_fs: bool = False
    limit: float = 1.0
    ref: str = ""
    sig: int = 4
    kind: str = "check"

    @property
    def ok(self) -> bool:
        """True when the check passes."""
        return status_ok(self.status)


@dataclass
class HeadingResult:
    """A heading (level 1 or 2)."""

    text: str
    level: int = 1
    kind: str = "heading"


@dataclass
class TextResult:
    """A note, an assumption or a reference line (``kind`` says which)."""

    text: str
    kind: str = "note"


@dataclass
class TableResult:
    """A table of values (e.g. frame analysis results); cells are preformatted strings."""

    title: str
    columns: list[str]
    rows: list[list[str]]
    note: str = ""
    kind: str = "table"


@dataclass
class FigureResult:
    """A figure stored as PNG bytes with a caption."""

    title: str
    png: bytes
    caption: str = ""
    kind: str = "figure"


StepResult = (
    GivenResult | FormulaResult | BranchResult | SelectResult | CheckResult | HeadingResult | TextResult | TableResult | FigureResult
)


@dataclass
class SheetResult:
    """A whole evaluated sheet."""

    title: str
    steps: list[Any]
    system: str = "US"
    method: str = "ASD"
    digest: str = ""
    meta: dict[str, str] = field(default_factory=dict)

    @property
    def checks(self) -> list[CheckResult]:
        """All checks, in sheet order."""
        return [s for s in self.steps if isinstance(s, CheckResult)]

    @property
    def figures(self) -> list[FigureResult]:
        """All figures (rendered once, when added), in sheet order."""
        return [s for s in self.steps if isinstance(s, FigureResult)]

    @property
    def assumptions(self) -> list[str]:
        """The model assumptions the template declared (``Sheet.assume``), in sheet order."""
        return [s.text for s in self.steps if isinstance(s, TextResult) and s.kind == "assumption"]

    @property
    def ok(self) -> bool:
        """True when every check is OK."""
        return all(c.ok for c in self.checks)

    @property
    def governing(self) -> CheckResult | None:
        """The check with the highest ratio."""
        checks = self.checks
        return max(checks, key=lambda c: c.ratio) if checks else None

    def value(self, name: str) -> pint.Quantity:
        """The evaluated value of a given or step by name."""
        for s in self.steps:
            if getattr(s, "name", None) == name:
                return s.value
        raise KeyError(name)
