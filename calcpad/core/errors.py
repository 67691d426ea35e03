"""Errors calcpad raises for bad input. Each message names the field or step, the value and
what was expected, so faces (CLI, widgets, runner) can show it without a traceback."""

from __future__ import annotations

__all__ = [
    "CalcpadError",
    "DimensionError",
    "FormulaError",
    "InputError",
    "NonFiniteError",
    "NotCoveredError",
    "ProblemListError",
    "SheetError",
    "UnitInputError",
]


class CalcpadError(Exception):
    """Base of every error calcpad raises on purpose (bad input, not a bug)."""


class InputError(CalcpadError, ValueError):
    """A value given to an engineering function is out of range or inconsistent."""


class ProblemListError(InputError):
    """Bad input with every problem found listed; ``problems`` holds ``(location, message)`` pairs.

    Subclasses set ``heading``: a format with ``{source}`` and ``{count}`` ("3 problems").
    """

    heading = "{source}: {count}"

    def __init__(self, source: str, problems: list[tuple[str, str]]) -> None:
        self.source = source
        self.problems = problems
        count = f"{len(problems)} problem{'s' if len(problems) != 1 else ''}"
        lines = [self.heading.format(source=source, count=count)]
        lines += [f"  {loc}: {msg}" if loc else f"  {msg}" for loc, msg in problems]
        super().__init__("\n".join(lines))


class UnitInputError(InputError):
    """A value-with-unit or unit string could not be read, or has the wrong dimension."""


class FormulaError(CalcpadError, ValueError):
    """A formula string is not allowed or cannot be parsed."""


class SheetError(CalcpadError):
    """A sheet is inconsistent: unknown name, duplicate name, dependency cycle, ..."""


class NonFiniteError(SheetError):
    """A step's result is not a finite number (NaN or infinite); the message names the step and its inputs."""


class DimensionError(SheetError):
    """A step combines quantities whose dimensions do not agree."""


class NotCoveredError(CalcpadError):
    """The requested shape / limit-state combination is not covered by a check."""
