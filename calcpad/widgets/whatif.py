"""The what-if panel: one control per given of a sheet, and the checks recomputed on change.

    panel = what_if(sh)            # one control per given
    panel                           # shown in a notebook
    panel.set("P", "120 lbf")       # programmatic change (tests, scripts)

A control is a slider when the given's ``control`` has ``min`` and ``max``, a dropdown when it
has ``choices``, else a number box in the given's own unit. Each change sets the given, evaluates
the sheet incrementally and refreshes the check summary (check, ratio, FS, OK/NG; the governing
check highlighted) and, with ``show="sheet"``, the whole sheet. A value the sheet cannot take
(wrong unit, out of the control's range, a step that cannot be evaluated) shows its message in
the panel, is kept in :attr:`WhatIfPanel.last_error`, and leaves the sheet at its last good values.

This is a face: it reads ``core`` and ``render``; nothing below imports it. ipywidgets is imported
inside functions only.
"""

from __future__ import annotations

import difflib
import html
from collections.abc import Sequence
from typing import Any

import pint

from calcpad.core.errors import CalcpadError, InputError, SheetError
from calcpad.core.results import CheckResult, SheetResult
from calcpad.core.sheet import Sheet
from calcpad.core.steps import Given
from calcpad.core.units import Q_, format_number, parse_quantity, unit_symbol

__all__ = ["SHOW", "WhatIfPanel", "what_if"]

#: What the panel shows below its controls.
SHOW = ("checks", "sheet")

_SLIDER_STEPS = 200
_GOVERNING_STYLE = "font-weight:bold;background:#fff3c4"
_NG_STYLE = "color:#b00020;font-weight:bold"


def _widgets() -> Any:
    """ipywidgets, imported on first use (keeps ``import calcpad`` fast)."""
    try:
        import ipywidgets
    except ImportError:  # pragma: no cover - ipywidgets is a dependency of the notebook extra
        raise InputError("what-if panel: ipywidgets is not installed; install it with 'pip install ipywidgets'") from None
    return ipywidgets


def _ratio_text(ratio: float) -> str:
    return format_number(ratio, 3)


def summary_rows(result: SheetResult) -> list[dict[str, Any]]:
    """The check summary as plain rows: check, ratio, FS, status, governing (bool)."""
    governing = result.governing
    return [
        {
            "check": c.title,
            "ratio": c.ratio,
            "fs": c.fs,
            "status": c.status,
            "governing": c is governing,
        }
        for c in result.checks
    ]


def _fs_text(c: dict[str, Any]) -> str:
    return "" if c["fs"] is None else format_number(c["fs"], 3)


def summary_html(result: SheetResult) -> str:
    """The check summary as an HTML table, the governing check highlighted."""
    rows = summary_rows(result)
    if not rows:
        return "<p><em>This sheet has no checks.</em></p>"
    has_fs = any(r["fs"] is not None for r in rows)
    head = "<th>check</th><th>ratio</th>" + ("<th>FS</th>" if has_fs else "") + "<th>status</th>"
    body = []
    for r in rows:
        style = f' style="{_GOVERNING_STYLE}"' if r["governing"] else ""
        status = html.escape(r["status"]) if r["status"] != "NG" else f'<span style="{_NG_STYLE}">NG</span>'
        title = html.escape(r["check"]) + (" (governs)" if r["governing"] else "")
        cells = f"<td>{title}</td><td>{_ratio_text(r['ratio'])}</td>"
        cells += f"<td>{_fs_text(r)}</td>" if has_fs else ""
        body.append(f"<tr{style}>{cells}<td>{status}</td></tr>")
    return f'<table class="calcpad-whatif"><thead><tr>{head}</tr></thead><tbody>{"".join(body)}</tbody></table>'


def summary_text(result: SheetResult) -> str:
    """The check summary as plain text, the governing check marked with ``*``."""
    rows = summary_rows(result)
    if not rows:
        return "This sheet has no checks."
    lines = []
    for r in rows:
        fs = f"  FS = {_fs_text(r)}" if r["fs"] is not None else ""
        mark = "*" if r["governing"] else " "
        lines.append(f"{mark} {r['check']}: ratio = {_ratio_text(r['ratio'])}{fs}  {r['status']}")
    return "\n".join(lines)


class WhatIfPanel:
    """Controls for a sheet's givens and the checks recomputed on every change.

    Attributes:
        sheet: The sheet the panel changes (the same object, not a copy).
        controls: Control widget by given name.
        last_error: Message of the last rejected value, ``None`` after a good one.
    """

    def __init__(self, sheet: Sheet, names: Sequence[str] | None = None, show: str = "checks") -> None:
        if not isinstance(sheet, Sheet):
            raise InputError(f"what-if panel: sheet is a {type(sheet).__name__}; expected a calcpad Sheet")
        if show not in SHOW:
            raise InputError(f"what-if panel: show={show!r}; expected 'checks' or 'sheet'")
        givens = {g.name: g for g in sheet.givens()}
        picked = list(givens) if names is None else [str(n) for n in names]
        for name in picked:
            if name not in givens:
                close = difflib.get_close_matches(name, list(givens), n=3, cutoff=0.5)
                hint = f"; did you mean {', '.join(repr(c) for c in close)}?" if close else ""
                raise SheetError(f"what-if panel: {name!r} is not a given of sheet {sheet.title!r}{hint}")
        self.sheet = sheet
        self.show = show
        self.last_error: str | None = None
        self._givens: dict[str, Given] = {n: givens[n] for n in picked}
        self._units: dict[str, pint.Unit] = {n: g.value.units for n, g in self._givens.items()}
        self._good: dict[str, pint.Quantity] = {n: g.value for n, g in self._givens.items()}
        self._start = dict(self._good)
        self._quiet = False  # True while the panel itself moves a control

        w = _widgets()
        self.controls: dict[str, Any] = {n: self._make_control(w, g) for n, g in self._givens.items()}
        rows = []
        for name, ctrl in self.controls.items():
            unit = unit_symbol(self._units[name])
            rows.append(w.HBox([ctrl, w.Label(unit)]) if unit else ctrl)
            ctrl.observe(self._on_change(name), names="value")
        self._message = w.HTML(value="")
        self._out = w.Output()
        title = w.HTML(value=f"<b>What-if: {html.escape(sheet.title)}</b>")
        self.container = w.VBox([title, w.VBox(rows), self._message, self._out])
        try:
            self.sheet.evaluate()
        except CalcpadError as exc:
            self._fail(str(exc))
        else:
            self._refresh()

    # ------------------------------------------------------------------ controls

    def _make_control(self, w: Any, g: Given) -> Any:
        unit = self._units[g.name]
        value = float(g.value.magnitude)
        desc = g.name
        style = {"description_width": "initial"}
        tip = g.description or g.name
        if g.control.get("choices"):
            options = [str(c) for c in g.control["choices"]]
            current = self._matching_choice(options, g.value)
            if current is None:
                current = f"{g.value.magnitude:g} {unit_symbol(unit, 'ascii')}".strip()
                options = [current, *options]
            return w.Dropdown(options=options, value=current, description=desc, tooltip=tip, style=style)
        lo, hi = g.control.get("min"), g.control.get("max")
        if lo is not None and hi is not None:
            lo_m, hi_m = float(lo.to(unit).magnitude), float(hi.to(unit).magnitude)
            lo_m, hi_m = min(lo_m, value), max(hi_m, value)  # never clamp the sheet's own value
            step = (hi_m - lo_m) / _SLIDER_STEPS if hi_m > lo_m else 1.0
            return w.FloatSlider(
                value=value,
                min=lo_m,
                max=hi_m,
                step=step,
                readout_format=".4g",
                continuous_update=False,
                description=desc,
                tooltip=tip,
                style=style,
            )
        return w.FloatText(value=value, description=desc, tooltip=tip, style=style)

    @staticmethod
    def _matching_choice(options: list[str], value: pint.Quantity) -> str | None:
        for opt in options:
            try:
                q = parse_quantity(opt, "choice")
                if q.dimensionality == value.dimensionality and abs(float((q - value).to(value.units).magnitude)) <= 1e-12 * max(
                    1.0, abs(float(value.magnitude))
                ):
                    return opt
            except (CalcpadError, pint.PintError):
                continue
        return None

    def _on_change(self, name: str) -> Any:
        def handler(change: dict[str, Any]) -> None:
            if not self._quiet:
                self.set(name, change["new"])

        return handler

    def _show_in_control(self, name: str, q: pint.Quantity) -> None:
        ctrl = self.controls[name]
        self._quiet = True
        try:
            if hasattr(ctrl, "options"):
                match = self._matching_choice([str(o) for o in ctrl.options], q)
                if match is None:
                    match = f"{q.to(self._units[name]).magnitude:g} {unit_symbol(self._units[name], 'ascii')}".strip()
                    ctrl.options = [match, *[str(o) for o in ctrl.options]]
                ctrl.value = match
            else:
                mag = float(q.to(self._units[name]).magnitude)
                if hasattr(ctrl, "min") and hasattr(ctrl, "max"):
                    ctrl.min, ctrl.max = min(ctrl.min, mag), max(ctrl.max, mag)
                ctrl.value = mag
        finally:
            self._quiet = False

    # ------------------------------------------------------------------ changing

    def _quantity(self, name: str, value: Any) -> pint.Quantity:
        field = f"what-if control {name!r}"
        if isinstance(value, bool):
            raise InputError(f"{field}: got {value!r}; expected a number in {unit_symbol(self._units[name], 'ascii') or 'no unit'}")
        if isinstance(value, (int, float)):  # a number box: the given's own unit (finite only)
            return Q_(parse_quantity(value, field).magnitude, self._units[name])
        q = parse_quantity(value, field)
        g = self._givens[name]
        if q.dimensionality != g.value.dimensionality:
            unit = unit_symbol(self._units[name], "ascii")
            raise InputError(
                f"{field}: {value!r} does not have the dimension of {name} ({unit or 'no unit'}); expected a value like '{self._good[name].magnitude:g} {unit}'"
            )
        return q

    def _check_range(self, name: str, q: pint.Quantity) -> None:
        control = self._givens[name].control
        for key, bad in (("min", lambda b: q < b), ("max", lambda b: q > b)):
            bound = control.get(key)
            if bound is not None and bad(bound):
                side = "below" if key == "min" else "above"
                raise InputError(f"what-if control {name!r}: {q:~g} is {side} the {key} {bound:~g} of this given")

    def set(self, name: str, value: str | pint.Quantity | float) -> bool:
        """Change a given (``"120 lbf"``, a quantity, or a number in the control's unit).

        Evaluates the sheet and refreshes the panel. Returns True when the value was taken; on a
        bad value the message goes to :attr:`last_error` and the panel, and the sheet and the
        control keep their last good values.
        """
        if name not in self.controls:
            close = difflib.get_close_matches(str(name), list(self.controls), n=3, cutoff=0.5)
            hint = f"; did you mean {', '.join(repr(c) for c in close)}?" if close else ""
            self._fail(f"what-if panel: {name!r} has no control{hint}")
            return False
        previous = self._good[name]
        try:
            q = self._quantity(name, value)
            self._check_range(name, q)
            self.sheet.set(**{name: q})
            self.sheet.evaluate()
        except CalcpadError as exc:
            self._rollback(name, previous)
            self._show_in_control(name, previous)
            self._fail(str(exc))
            return False
        self._good[name] = q
        self._show_in_control(name, q)
        self.last_error = None
        self._message.value = ""
        self._refresh()
        return True

    def reset(self) -> None:
        """Put every controlled given back to the value it had when the panel was made."""
        for name, q in self._start.items():
            if self._good[name] is not q:
                self.set(name, q)

    def _rollback(self, name: str, previous: pint.Quantity) -> None:
        if self._givens[name].value is previous:
            return
        self.sheet.set(**{name: previous})
        try:
            self.sheet.evaluate()
        except CalcpadError:  # the previous state was already bad (panel made on a failing sheet)
            pass

    def _fail(self, message: str) -> None:
        self.last_error = message
        self._message.value = f'<div style="{_NG_STYLE}">Not applied: {html.escape(message)}</div>'

    # ------------------------------------------------------------------ display

    def _refresh(self) -> None:
        result = self.sheet.evaluate()
        outputs: list[dict[str, Any]] = [
            {
                "output_type": "display_data",
                "data": {"text/html": summary_html(result), "text/plain": summary_text(result)},
                "metadata": {},
            }
        ]
        if self.show == "sheet":
            from calcpad.render.notebook import mimebundle  # lazy: printers load sympy printing

            outputs.append({"output_type": "display_data", "data": mimebundle(result), "metadata": {}})
        self._out.outputs = tuple(outputs)

    @property
    def checks(self) -> list[CheckResult]:
        """The checks of the sheet at its current (last good) values."""
        return self.sheet.summary()

    def _repr_mimebundle_(self, include: Any = None, exclude: Any = None) -> Any:
        return self.container._repr_mimebundle_(include=include, exclude=exclude)

    def _ipython_display_(self) -> None:
        from IPython.display import display

        display(self.container)

    def __repr__(self) -> str:
        return f"<WhatIfPanel {self.sheet.title!r}: {len(self.controls)} controls>"


def what_if(sheet: Sheet, names: Sequence[str] | None = None, show: str = "checks") -> WhatIfPanel:
    """Make a what-if panel for ``sheet``: one control per given (or per name in ``names``).

    Args:
        sheet: The sheet to change; the panel sets its givens and evaluates it.
        names: Givens to make controls for, in this order; default every given.
        show: ``"checks"`` for the check summary, ``"sheet"`` to show the whole sheet as well.

    Raises:
        SheetError: A name is not a given of the sheet.
        InputError: ``show`` is not one of ``"checks"``, ``"sheet"``.
    """
    return WhatIfPanel(sheet, names=names, show=show)
