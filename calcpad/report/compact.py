"""Large member tables in the submittal: one printed calc per governing case.

A member table with more than :data:`calcpad.runner.cases.PRINT_EACH` members would print
thousands of sheets. Its members are grouped into cases instead (:func:`calcpad.runner.cases.case_key`:
same entry, template, title, text inputs such as the section, governing check and status); each
case prints the sheets of its governing member (highest ratio) with the list of the members it
stands for, and the member table prints every member compactly (ratio, status, case). Other
calcs are grouped as before (:func:`calcpad.report.grouping.group_calcs`).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from calcpad.report.grouping import CalcGroup, group_calcs
from calcpad.runner.cases import case_key, entry_of, governing_check, governing_member, printed_each
from calcpad.runner.execute import CalcOutcome

__all__ = ["COLUMN_ROWS", "COMPACT_CSS", "SHORT_MARKS", "CaseGroup", "print_groups"]

#: Print CSS of the compact member table (three columns of small rows) and a case's member list.
COMPACT_CSS = (
    ".members-compact { column-count: 3; column-gap: 1.4em; font-size: 7pt; line-height: 1.2; margin: .4em 0 1em; }"
    ".members-compact table { border-collapse: collapse; width: 100%; break-inside: avoid; }"
    ".members-compact th, .members-compact td { border-bottom: .4pt solid #999; padding: 0 .3em; text-align: left; white-space: nowrap; }"
    ".members-compact td.num { text-align: right; }"
    ".members-compact tr.ng td { font-weight: bold; }"
    ".case-members { display: block; font-size: 7pt; line-height: 1.25; margin-top: .3em; }"
)

#: Rows of the compact member table per column: one table each, kept whole (``break-inside:
#: avoid``) so every column starts with its header. A column holds 76 such rows on Letter, more on
#: A4. One table of all members, split by Chromium across columns and pages, took 41 s to print for
#: 10,000 members against 27 s as tables of 70 rows (untagged, measured one after the other; 100
#: pages instead of 96).
COLUMN_ROWS = 70

#: Member lists longer than this are shortened where they are repeated (criteria, every check).
SHORT_MARKS = 12


@dataclass
class CaseGroup(CalcGroup):
    """A case of a large member table: every member in it (run order) and the governing one."""

    number: int = 0  # 1-based over the document's cases
    governing: CalcOutcome | None = field(default=None)

    @property
    def first(self) -> CalcOutcome:
        """The governing member, whose sheets are printed."""
        return self.governing or self.outcomes[0]

    @property
    def typical(self) -> bool:
        """A case is not a typical group (its members have different inputs)."""
        return False

    @property
    def table(self) -> str:
        """The member table it comes from."""
        return str(self.first.calc.table)

    @property
    def check(self) -> dict[str, Any] | None:
        """The governing check of the governing member."""
        return governing_check(self.first.checks)

    @property
    def label(self) -> str:
        """``Case 3``."""
        return f"Case {self.number}"


def print_groups(outcomes: list[CalcOutcome], compact: bool = True) -> list[CalcGroup]:
    """The printed calcs in run order (of each group's first member): a case per governing case of
    a large member table (``compact``), identical calcs grouped as typical, the rest one each."""
    large = {(o.calc.table, entry_of(o.calc)) for o in outcomes if compact and not printed_each(o.calc)}
    cases: dict[tuple[Any, ...], CaseGroup] = {}
    groups: list[CalcGroup] = []
    rest: list[CalcOutcome] = []
    for o in outcomes:
        if (o.calc.table, entry_of(o.calc)) not in large:
            rest.append(o)
            continue
        key = case_key(o)
        if key is None:  # failed: printed alone
            groups.append(CalcGroup([o]))
        elif key in cases:
            cases[key].outcomes.append(o)
        else:
            cases[key] = CaseGroup([o])
            groups.append(cases[key])
    groups += group_calcs(rest)
    groups.sort(key=lambda g: g.outcomes[0].calc.number)
    number = 0
    for g in groups:
        if isinstance(g, CaseGroup):
            number += 1
            g.number = number
            g.governing = governing_member(g.outcomes)
    return groups
