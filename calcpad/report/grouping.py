"""Typical members: calcs that would print the same sheets word for word are printed once.

Two calcs form one group when they use the same template with the same inputs and the same
title (the member mark aside), both ran, and their sheets give the same numbers (results and
checks): the last condition guards against a template that uses the mark for more than a label.
"""

from __future__ import annotations

import hashlib
import json
from dataclasses import dataclass

from calcpad.runner.execute import CalcOutcome

__all__ = ["CalcGroup", "group_calcs", "marks_text", "numbers_text"]


@dataclass
class CalcGroup:
    """One printed calc: the outcome that is printed and every calc it stands for."""

    outcomes: list[CalcOutcome]

    @property
    def first(self) -> CalcOutcome:
        """The calc whose sheets are printed."""
        return self.outcomes[0]

    @property
    def marks(self) -> list[str]:
        """Member marks covered, in run order."""
        return [o.calc.member for o in self.outcomes]

    @property
    def numbers(self) -> list[int]:
        """Calc numbers (1-based, as in the record) covered."""
        return [o.calc.number for o in self.outcomes]

    @property
    def typical(self) -> bool:
        """True when the printed sheets stand for more than one member."""
        return len(self.outcomes) > 1

    @property
    def title(self) -> str:
        """The job's calc title, else the template's."""
        return self.first.calc.title or self.first.calc.template.title

    @property
    def anchor(self) -> str:
        """HTML id of the group's section."""
        return f"calc-{self.first.calc.number}"


def _fingerprint(o: CalcOutcome) -> str | None:
    """A digest of what a calc printed: template, title, inputs and the numbers of each sheet
    (:attr:`~calcpad.runner.execute.SheetItem.numbers`); None for a calc that failed (never grouped)."""
    if o.error is not None:
        return None
    key = {"template": o.calc.template.name, "title": o.calc.title, "inputs": o.calc.inputs, "sheets": [s.numbers for s in o.sheets]}
    return hashlib.sha256(json.dumps(key, sort_keys=True, default=str).encode("utf-8")).hexdigest()


def group_calcs(outcomes: list[CalcOutcome]) -> list[CalcGroup]:
    """Group identical calcs, in the order each group's first calc ran."""
    groups: list[CalcGroup] = []
    by_key: dict[str, CalcGroup] = {}
    for o in outcomes:
        key = _fingerprint(o)
        if key is not None and key in by_key:
            by_key[key].outcomes.append(o)
            continue
        group = CalcGroup([o])
        groups.append(group)
        if key is not None:
            by_key[key] = group
    return groups


def numbers_text(numbers: list[int]) -> str:
    """``"Calc 4"``, ``"Calcs 2, 4"`` or ``"Calcs 2–4, 7"`` (three or more in a row as a range)."""
    if len(numbers) == 1:
        return f"Calc {numbers[0]}"
    runs: list[list[int]] = []
    for n in numbers:
        if runs and n == runs[-1][-1] + 1:
            runs[-1].append(n)
        else:
            runs.append([n])
    parts = []
    for run in runs:
        parts.extend([f"{run[0]}–{run[-1]}"] if len(run) >= 3 else [str(n) for n in run])
    return "Calcs " + ", ".join(parts)


def marks_text(marks: list[str], limit: int) -> str:
    """The marks joined; past ``limit`` the first ``limit`` and "and N more"."""
    if len(marks) <= limit:
        return ", ".join(marks)
    return f"{', '.join(marks[:limit])} and {len(marks) - limit:,} more"
