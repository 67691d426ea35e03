"""Step definitions: what an author adds to a sheet, before evaluation.

A sheet is data: an ordered list of these. Each kind knows which names it defines and which
names it depends on; :mod:`calcpad.core.sheet` orders evaluation by those dependencies.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import pint

from calcpad.core.formula import Formula

__all__ = ["Branch", "Case", "Check", "Figure", "FormulaStep", "Given", "Heading", "Select", "Step", "Table", "Text"]


@dataclass
class Given:
    """An input value with its unit.

    ``control`` holds what a widget needs: ``{"min": q, "max": q}`` or ``{"choices": [...]}``.
    """

    name: str
    value: pint.Quantity
    description: str = ""
    source: str = ""
    sig: int | None = None
    control: dict = field(default_factory=dict)

    @property
    def defines(self) -> str:
        return self.name

    @property
    def depends(self) -> tuple[str, ...]:
        return ()


@dataclass
class FormulaStep:
    """``name = formula``, shown in ``unit`` (or the sheet's preference for its kind). A
    ``quiet`` step is an internal intermediate: printers leave it out while its value is zero."""

    name: str
    formula: Formula
    description: str = ""
    unit: pint.Unit | None = None  # read by parse_unit from the text the author wrote
    ref: str = ""
    sig: int | None = None
    quiet: bool = False

    @property
    def defines(self) -> str:
        return self.name

    @property
    def depends(self) -> tuple[str, ...]:
        return self.formula.names


@dataclass
class Case:
    """A branch case: ``condition`` None means "otherwise"."""

    condition: Formula | None
    formula: Formula
    label: str


@dataclass
class Branch:
    """Pick the first case whose condition holds. With ``words`` the value is an internal
    marker (e.g. a class number): printers show the chosen case's label, not the value."""

    name: str
    cases: list[Case]
    description: str = ""
    unit: pint.Unit | None = None  # read by parse_unit from the text the author wrote
    ref: str = ""
    sig: int | None = None
    words: bool = False

    @property
    def defines(self) -> str:
        return self.name

    @property
    def depends(self) -> tuple[str, ...]:
        names: list[str] = []
        for case in self.cases:
            for part in ((case.condition.names if case.condition else ()), case.formula.names):
                names.extend(n for n in part if n not in names)
        return tuple(names)


@dataclass
class Select:
    """min or max of named candidates; shows which one governs."""

    name: str
    mode: str
    candidates: dict[str, str]
    description: str = ""
    unit: pint.Unit | None = None  # read by parse_unit from the text the author wrote
    ref: str = ""
    sig: int | None = None

    @property
    def defines(self) -> str:
        return self.name

    @property
    def depends(self) -> tuple[str, ...]:
        return tuple(self.candidates)


@dataclass
class Check:
    """Demand vs capacity. ``required_fs`` turns it into an FS check (OK when FS ≥ required).

    ``flags`` are ``(name, above, status)``: when the value of ``name`` exceeds ``above`` the
    check takes that status (``results.OK_SLENDER`` for an OK check above a recommended limit,
    ``results.NOT_COVERED`` when an equation is used outside its validity, whatever the ratio).
    ``existing`` marks a check of a condition before a repair: reported with its verdict
    (``results.EXISTING_OK`` / ``EXISTING_NG``) but not making the calc NG.
    """

    key: str
    title: str
    demand: str
    capacity: str
    ref: str = ""
    required_fs: float | None = None
    show_fs: bool = False
    limit: float = 1.0
    sig: int | None = None
    flags: tuple[tuple[str, float, str], ...] = ()
    existing: bool = False

    @property
    def defines(self) -> str:
        return self.key

    @property
    def depends(self) -> tuple[str, ...]:
        return (self.demand, self.capacity, *(f[0] for f in self.flags))


@dataclass
class Heading:
    """A heading line."""

    text: str
    level: int = 1
    defines = None
    depends: tuple[str, ...] = ()


@dataclass
class Text:
    """A note, assumption or reference (``kind``)."""

    text: str
    kind: str = "note"
    defines = None
    depends: tuple[str, ...] = ()


@dataclass
class Table:
    """A table of preformatted cells."""

    title: str
    columns: list[str]
    rows: list[list[str]]
    note: str = ""
    defines = None
    depends: tuple[str, ...] = ()


@dataclass
class Figure:
    """A figure as PNG bytes."""

    title: str
    png: bytes
    caption: str = ""
    defines = None
    depends: tuple[str, ...] = ()


Step = Given | FormulaStep | Branch | Select | Check | Heading | Text | Table | Figure
