"""Build a template's sheets in this process without printing them (for design searches and sweeps).

The runner's ``execute`` runs every cell and prints each sheet (HTML, text, record); a design
search or a sweep only needs the :class:`~calcpad.core.sheet.Sheet` objects, built many times
with different values. :class:`SheetBuilder` compiles the template's code cells once (those
after the parameters cell and before the first what-if cell) and runs them in a fresh namespace
per call with the values as data, exactly as the runner does.
"""

from __future__ import annotations

import contextlib
import io
import os
import sys
import warnings
from collections.abc import Mapping
from typing import Any

from calcpad.core.errors import CalcpadError, InputError
from calcpad.core.sheet import Sheet
from calcpad.runner.execute import sheets_bound
from calcpad.runner.job import CONTEXT_PARAMETERS
from calcpad.runner.nodisplay import NO_DISPLAY_ENV, no_display
from calcpad.runner.template import Template

__all__ = ["NO_DISPLAY_ENV", "SheetBuildError", "SheetBuilder", "given_map", "sheet_signature"]


class SheetBuildError(InputError):
    """A template could not build its sheets with the given values (names the cell and the message)."""


class SheetBuilder:
    """A template's code cells compiled once; :meth:`sheets` runs them with a set of values."""

    def __init__(self, template: Template) -> None:
        self.template = template
        self._code: list[tuple[int, Any]] = []
        for cell in template.code_cells:
            if cell.index == template.parameters_cell:
                continue
            if "what_if(" in cell.source:  # the what-if panel and what follows it are not part of the calc
                break
            self._code.append((cell.index, compile(cell.source, f"<template {template.name} cell {cell.index}>", "exec")))

    def sheets(self, values: Mapping[str, Any]) -> list[Sheet]:
        """The sheets the template makes with ``values`` (parameter name → value as in a job).

        Raises :class:`SheetBuildError` naming the template, the cell and the message.
        """
        ns: dict[str, Any] = {"__name__": "__main__", "__builtins__": __builtins__}
        ns.update({n: v for n, v in values.items() if n in self.template.parameters})
        for n in CONTEXT_PARAMETERS:
            if n in self.template.parameters:
                ns.setdefault(n, "")
        os.environ.setdefault("MPLBACKEND", "Agg")
        sink = io.StringIO()
        with no_display():  # in a notebook, show(sh) would display every sheet built
            self._run(ns, sink)
        plt = sys.modules.get("matplotlib.pyplot")
        if plt is not None:
            plt.close("all")
        return sheets_bound(ns)

    def _run(self, ns: dict[str, Any], sink: io.StringIO) -> None:
        with contextlib.redirect_stdout(sink), contextlib.redirect_stderr(sink), warnings.catch_warnings():
            warnings.simplefilter("ignore")
            for index, code in self._code:
                try:
                    exec(code, ns)  # template code (trusted); the values are data in `ns`
                except CalcpadError as exc:
                    raise SheetBuildError(f"template {self.template.name!r} cell {index}: {exc}") from None
                except Exception as exc:
                    raise SheetBuildError(f"template {self.template.name!r} cell {index}: {type(exc).__name__}: {exc}") from None


def sheet_signature(sheet: Sheet) -> tuple[Any, ...]:
    """The structure of a sheet without its given values: two sheets with the same signature
    compile to the same numpy chain, so one compiled sheet evaluates both with their givens."""
    out: list[Any] = []
    for step in sheet.steps:
        kind = type(step).__name__
        if kind == "Given":
            out.append((kind, step.name, str(step.value.units)))
        elif kind == "FormulaStep":
            out.append((kind, step.name, step.formula.text, str(step.unit)))
        elif kind == "Branch":
            out.append((kind, step.name, tuple((c.condition.text if c.condition else None, c.formula.text) for c in step.cases)))
        elif kind == "Select":
            out.append((kind, step.name, step.mode, tuple(step.candidates)))
        elif kind == "Check":
            out.append((kind, step.key, step.demand, step.capacity, step.required_fs, step.limit, step.flags))
    return tuple(out)


def _given_values(sheets: list[Sheet]) -> list[dict[str, float]]:
    """Per sheet: each given's value in SI base units."""
    return [{g.name: float(g.value.to_base_units().magnitude) for g in s.givens()} for s in sheets]


def _close(a: float, b: float) -> bool:
    return a == b or abs(a - b) <= 1e-9 * max(abs(a), abs(b))


def given_map(builder: SheetBuilder, values: Mapping[str, Any], names: list[str]) -> dict[str, list[str | None] | None]:
    """For each quantity parameter in ``names``: the given each sheet takes it as, found by
    building the sheets again with the parameter moved (x1.37, else x0.73) and seeing which
    givens move with it. ``None`` for a parameter that changes anything else (a step, a check
    setting, a given by another amount): it cannot be swept on the compiled sheet, and sheets
    must be built for each of its values. A list entry is ``None`` for a sheet that does not use it.
    """
    from calcpad.core.units import Q_, parse_quantity

    base = builder.sheets(values)
    base_sig = [sheet_signature(s) for s in base]
    base_vals = _given_values(base)
    out: dict[str, list[str | None] | None] = {}
    for name in names:
        p = builder.template.parameters[name]
        if p.kind != "quantity":
            out[name] = None
            continue
        q = parse_quantity(values[name], name)
        found: list[str | None] | None = None
        for factor in (1.37, 0.73):
            moved = Q_(float(q.magnitude) * factor, q.units) if q.magnitude != 0 else Q_(1.0, q.units)
            # in the value's own units (``4 ft`` moves to ``5.48 ft``); the parameter's unit only
            # for a plain number, which the parameter reads in its unit
            unit = p.unit if (p.unit and q.unitless) else str(q.units)
            text = f"{float(moved.magnitude)!r} {unit}"
            try:
                sheets = builder.sheets({**values, name: text})
            except SheetBuildError:
                continue
            if [sheet_signature(s) for s in sheets] != base_sig:
                break
            qb, qm = float(q.to_base_units().magnitude), float(parse_quantity(text, name).to_base_units().magnitude)
            found = []
            for before, after in zip(base_vals, _given_values(sheets), strict=True):
                changed = [g for g in before if not _close(before[g], after[g])]
                if len(changed) > 1 or (changed and not (_close(before[changed[0]], qb) and _close(after[changed[0]], qm))):
                    found = None
                    break
                found.append(changed[0] if changed else None)
            break
        out[name] = found
    return out
