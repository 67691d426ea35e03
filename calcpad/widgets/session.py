"""A template's parameters with their current values, checked and re-run in this process.

The what-if panel keeps one :class:`TemplateSession`: every value goes through the same
checks as a job file or ``calcpad run --set`` (``Parameter.coerce`` for kind and dimension,
``Parameter.check_range`` for the stated range, other parameters' current values resolving
bounds such as ``D_o/2``). A change that only moves a given of the sheet is applied to the sheet
directly; any other change (a section, a grade, a factor the template turns into several
steps) re-runs the template's code cells *before its what-if cell* with the new values (the
parameters cell is not run: the values go into the namespace as data, as in the runner).
"""

from __future__ import annotations

import contextlib
import io
import os
import sys
import warnings
from collections.abc import Mapping
from pathlib import Path
from typing import Any

import pint

from calcpad.core.errors import CalcpadError, InputError
from calcpad.core.sheet import Sheet
from calcpad.core.units import parse_quantity
from calcpad.runner.job import CONTEXT_PARAMETERS
from calcpad.runner.template import Parameter, Template, find_template, is_what_if_cell, load_template
from calcpad.widgets import live

__all__ = ["CONTEXT_NAMES", "TemplateSession", "is_what_if_cell"]

#: Parameters filled in by the runner, not by the engineer (no control, not exported).
CONTEXT_NAMES = CONTEXT_PARAMETERS


def _user_values(names: list[str]) -> dict[str, Any]:
    """Current parameter values in the running notebook (papermill may have injected them)."""
    try:
        from IPython import get_ipython
    except ImportError:  # pragma: no cover
        return {}
    shell = get_ipython()
    if shell is None:
        return {}
    ns = shell.user_ns
    return {n: ns[n] for n in names if isinstance(ns.get(n), (str, int, float)) and not isinstance(ns.get(n), bool)}


class TemplateSession:
    """A template, its parameters and their current values (as they go into the template).

    Args:
        template: A template name, a path, or a loaded :class:`Template`.
        values: Current values (a mapping that may hold other names too, e.g. a template's
            ``globals()``, so job values injected by the runner are seen); default the running
            notebook's values of the parameters (in IPython), else the template's defaults.
    """

    def __init__(self, template: str | Path | Template, values: Mapping[str, Any] | None = None) -> None:
        self.template = template if isinstance(template, Template) else load_template(find_template(str(template)))
        self._parsed: dict[tuple[str, Any], pint.Quantity] = {}
        self.parameters: dict[str, Parameter] = {n: p for n, p in self.template.parameters.items() if n not in CONTEXT_NAMES}
        self.values: dict[str, str | float] = {n: p.default for n, p in self.template.parameters.items()}
        given = dict(values) if values is not None else _user_values(list(self.template.parameters))
        for name, value in given.items():
            if name in self.template.parameters and name not in CONTEXT_NAMES and isinstance(value, (str, int, float)):
                self.values[name] = self.check(name, value, given)
        self.runs = 0

    def quantities(self, values: Mapping[str, Any] | None = None) -> dict[str, pint.Quantity]:
        """Numeric parameter values as quantities (for bounds that name another parameter)."""
        vals = self.values if values is None else values
        out = {}
        for n, p in self.template.parameters.items():
            if p.kind != "text" and n in vals:
                key = (n, vals[n])
                if key not in self._parsed:  # values repeat: parse each once
                    with contextlib.suppress(CalcpadError):
                        self._parsed[key] = parse_quantity(vals[n], n)
                if key in self._parsed:
                    out[n] = self._parsed[key]
        return out

    def check(self, name: str, value: Any, others: Mapping[str, Any] | None = None) -> str | float:
        """``value`` as it goes into the template, checked like a job value. Raises InputError."""
        p = self.template.parameters.get(name)
        if p is None:
            raise InputError(f"{name!r} is not a parameter of template {self.template.name!r}{self.template.suggest(name)}")
        where = f"{p.description or name} ({name})"
        if isinstance(value, pint.Quantity):
            unit = p.unit
            value = f"{float(value.to(unit).magnitude) if unit else float(value.magnitude)!r} {unit}".strip()
        coerced = p.coerce(value, where)
        merged = {**self.values, **(others or {}), name: coerced}
        p.check_range(coerced, self.quantities(merged), where)
        return coerced

    def _compiled_cells(self) -> list[tuple[int, Any]]:
        """Code cells after the parameters cell and before the what-if cell, compiled once."""
        return self.template.body()

    def build(self, values: Mapping[str, Any] | None = None) -> list[Sheet]:
        """Run the template's code cells before its what-if cell; the sheets made, in order.

        Raises InputError with the template, cell and message when a cell fails.
        """
        tpl = self.template
        ns: dict[str, Any] = {"__name__": "__main__", "__builtins__": __builtins__}
        ns.update(self.values if values is None else values)
        os.environ.setdefault("MPLBACKEND", "Agg")
        self.runs += 1
        sink = io.StringIO()
        with contextlib.redirect_stdout(sink), contextlib.redirect_stderr(sink), warnings.catch_warnings(), live.quiet():
            warnings.simplefilter("ignore")  # a what-if run's warnings would pile up under the panel
            for index, code in self._compiled_cells():
                try:
                    exec(code, ns)  # template code (trusted); the values are data in `ns`
                except CalcpadError as exc:
                    raise InputError(str(exc)) from None
                except Exception as exc:
                    raise InputError(f"template {tpl.name!r} cell {index}: {type(exc).__name__}: {exc}") from None
                finally:
                    plt = sys.modules.get("matplotlib.pyplot")
                    if plt is not None:
                        plt.close("all")
        sheets: list[Sheet] = []
        for value in ns.values():
            found = [value] if isinstance(value, Sheet) else [v for v in value if isinstance(v, Sheet)] if isinstance(value, (list, tuple)) else []
            sheets += [s for s in found if all(s is not t for t in sheets)]
        return sheets
