"""Governing cases of a large member table: which members' sheets a submittal prints.

A member table with more than :data:`PRINT_EACH` members is printed compactly: its members are
split into *cases* — the same ``[[calcs]]`` entry, template and title, the same text inputs (a
section size, a grade), the same governing check (sheet and check title) and the same status —
and each case prints the sheets of its *governing member*, the one with the highest governing
ratio (the first of equals, in run order). Every member's ratio is in the member table and the
results files. Failed calcs are never in a case.

The run's spool (:mod:`calcpad.runner.spool`) keeps sheet HTML only where it can be printed:
each member of a small table, and a member of a large table that governs its case so far
(:class:`CaseTracker`) — the submittal's choice (:func:`governing_member`) is always among them.
"""

from __future__ import annotations

import math
from typing import Any

__all__ = ["PRINT_EACH", "CaseTracker", "case_key", "entry_of", "governing_check", "governing_member", "governing_ratio", "printed_each"]

#: A member table with at most this many members prints every member's sheets.
PRINT_EACH = 50


def entry_of(calc: Any) -> str:
    """The job-file entry a calc came from (``calcs[2]`` for each row of that entry's table)."""
    return str(calc.location).split(".table row", 1)[0]


def printed_each(calc: Any) -> bool:
    """True when the calc's sheets are printed whatever its ratio: not from a member table, or
    within the first :data:`PRINT_EACH` rows of its table (so every member of a small table)."""
    return calc.table is None or calc.row is None or calc.row - 1 <= PRINT_EACH


def governing_check(checks: list[dict[str, Any]]) -> dict[str, Any] | None:
    """The check with the highest ratio (one without a ratio counts as the highest; the first of equals)."""
    return max(checks, key=lambda c: c["ratio"] if c["ratio"] is not None else math.inf) if checks else None


def governing_ratio(o: Any) -> float:
    """The outcome's governing ratio (``inf`` without one, ``-inf`` without checks)."""
    gov = governing_check(o.checks)
    if gov is None:
        return -math.inf
    return math.inf if gov["ratio"] is None else float(gov["ratio"])


def case_key(o: Any) -> tuple[Any, ...] | None:
    """What members of one case share (see the module docstring); None for a failed calc or one
    not from a member table."""
    calc = o.calc
    if o.error is not None or calc.table is None:
        return None
    params = calc.template.parameters
    texts = tuple(sorted((n, str(v)) for n, v in calc.inputs.items() if n in params and params[n].kind == "text"
                         and n not in ("member_mark", "calc_title", "calc_note")))
    return (calc.table, entry_of(calc), calc.template.name, calc.title, texts, _governing_place(o), o.status)


def _governing_place(o: Any) -> tuple[int, str] | None:
    """(sheet index, check title) of the governing check: sheet titles may carry the member mark."""
    places = [(k, c) for k, s in enumerate(o.sheets) for c in s.checks]
    gov = governing_check([c for _k, c in places])
    return next((k, c["title"]) for k, c in places if c is gov) if gov is not None else None


def governing_member(outcomes: list[Any]) -> Any:
    """The outcome with the highest governing ratio (the first of equals)."""
    best = outcomes[0]
    for o in outcomes[1:]:
        if governing_ratio(o) > governing_ratio(best):
            best = o
    return best


class CaseTracker:
    """Follows the run: :meth:`printable` says whether an outcome's sheets may be printed."""

    def __init__(self) -> None:
        self._best: dict[tuple[Any, ...], float] = {}

    def printable(self, o: Any) -> bool:
        """True for a calc printed whatever its ratio (:func:`printed_each`), a failed one, or one
        that governs its case so far (strictly higher ratio than every earlier member of it)."""
        key = case_key(o)
        if key is None or printed_each(o.calc):
            if key is not None:
                self._offer(key, o)
            return True
        return self._offer(key, o)

    def _offer(self, key: tuple[Any, ...], o: Any) -> bool:
        ratio = governing_ratio(o)
        if key in self._best and not ratio > self._best[key]:
            return False
        self._best[key] = ratio
        return True
