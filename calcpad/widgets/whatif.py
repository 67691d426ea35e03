"""The what-if panel: controls for a template's parameters (or a sheet's givens), the checks
recomputed on change, sensitivity, "what would it take", and export to a job file.

    panel = what_if(sh, template="leg_bending")      # controls from the parameters cell
    panel = what_if(sh, template="post_combined", bind={"P": "P_top"})  # parameter -> given
    panel.set("P", "120 lbf")                         # programmatic change (tests, scripts)
    panel.sensitivity()                               # elasticities of the ratios
    panel.what_would_it_take("L")                     # value of L with the governing check at 1.0
    panel.to_job(member="L1")                         # TOML [[calcs]] block

With ``template=`` every control follows the template's parameters cell: its label is the
description in words with the symbol, a value goes through the same parser, dimension check,
range and choices as a job file or ``calcpad run --set`` (an out-of-range value shows an inline
message and the last good result stays), a section is a dropdown of its catalog family, a grade
a dropdown of catalog grades of the same kind. A parameter that sets a given of the sheet (named in
``bind``) changes that given and evaluates incrementally; any other (section,
grade, a factor) re-runs the template's cells before its what-if cell.

Without ``template=`` there is one control per given (slider for ``min``/``max``, dropdown for
``choices``, else a number box in the given's unit), as before.

The sheet redraws in place: a sheet shown with :func:`calcpad.widgets.show` (and its summary
shown with :func:`calcpad.widgets.show_summary`) is re-printed only where steps changed, so one
check never shows two statuses; ``show="sheet"`` adds such a live copy inside the panel.

This is a face: it reads ``core``, ``eng``, ``render`` and the runner's template reader; nothing
below imports it. ipywidgets is imported inside functions only.
"""

from __future__ import annotations

import difflib
import html
import io
import re
from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass
from typing import Any

import pint

from calcpad.core.errors import CalcpadError, InputError, SheetError
from calcpad.core.names import name_text
from calcpad.core.results import CheckResult
from calcpad.core.sheet import Sheet
from calcpad.core.steps import Given
from calcpad.core.units import format_number, parse_quantity, unit_symbol
from calcpad.widgets import live
from calcpad.widgets.explore import Answer, Sensitivity, elasticities, lightest_passing, sensitivity_figure, value_for_limit
from calcpad.widgets.export import calc_block
from calcpad.widgets.summary import _NG_STYLE, summary_html, summary_rows, summary_text

__all__ = ["SHOW", "WhatIfPanel", "summary_html", "summary_rows", "summary_text", "what_if"]

#: What the panel shows below its controls.
SHOW = ("checks", "sheet")

_SLIDER_STEPS = 200
_LABEL_WIDTH = "24em"


def _widgets() -> Any:
    """ipywidgets, imported on first use (keeps ``import calcpad`` fast)."""
    try:
        import ipywidgets
    except ImportError:  # pragma: no cover - ipywidgets is a dependency of the notebook extra
        raise InputError("what-if panel: ipywidgets is not installed; install it with 'pip install ipywidgets'") from None
    return ipywidgets


def _label(description: str, symbol: str) -> str:
    desc = description.strip()
    if not desc:
        return symbol
    return f"{desc[0].upper()}{desc[1:]} ({symbol})"


def _catalog_family(value: Any) -> str | None:
    """The catalog family of a section designation (None when it is not one)."""
    if not isinstance(value, str):
        return None
    from calcpad.eng.sections.catalog import get_entry

    try:
        return get_entry(value).family
    except CalcpadError:
        return None


#: The entry a section dropdown offers for explicit dimensions when the template takes them.
CUSTOM = "custom"


def _offers_custom(description: str) -> bool:
    """A section parameter whose description offers ``custom`` (as leg_bending's "..., or custom
    for D_o and t") takes explicit dimensions from other parameters: its dropdown lists it."""
    return re.search(r"\bcustom\b", description, re.IGNORECASE) is not None


def _grade_kind(name: str) -> str:
    low = name.lower()
    return "aluminum" if "alumin" in low or low.startswith(("6061", "6063")) else "stainless" if "stainless" in low else "steel"


def _grade_choices(value: Any) -> list[str] | None:
    """Catalog grades of the same kind as ``value`` (A500 round/shaped listed once: the template
    picks the form from the section). None when ``value`` is not a catalog grade."""
    if not isinstance(value, str):
        return None
    from calcpad.eng.materials import get_material, material_names

    try:
        get_material(value)
    except CalcpadError:
        try:
            get_material(value, shape="shaped")
        except CalcpadError:
            return None
    kind = _grade_kind(value) if _grade_kind(value) != "steel" else "steel"
    names: list[str] = []
    for n in material_names():
        base = n.replace(" (round)", "").replace(" (square/rectangular)", "")
        if _grade_kind(base) == kind and base not in names:
            names.append(base)
    return [value, *[n for n in names if n != value]]


@dataclass
class _Input:
    """One control: what it sets and how its value is shown."""

    name: str  # parameter name (template mode) or given name
    label: str
    kind: str  # "quantity" | "number" | "text" | "choice" | "section" | "grade"
    unit: pint.Unit | None
    given: str | None  # the sheet given it sets directly (None: re-run the template)
    options: list[str] | None = None
    lower: pint.Quantity | None = None
    upper: pint.Quantity | None = None
    widget: Any = None


class WhatIfPanel:
    """Controls for a sheet's inputs and the checks recomputed on every change.

    Attributes:
        sheet: The sheet shown (the same object; a template re-run replaces it by the new sheet).
        controls: Control widget by input name (parameter name with ``template=``).
        last_error: Message of the last rejected value, ``None`` after a good one.
        session: The template session (``template=``), else None.
    """

    def __init__(
        self,
        sheet: Sheet,
        names: Sequence[str] | None = None,
        show: str = "checks",
        template: Any = None,
        bind: Mapping[str, str] | Sequence[str] | None = None,
        values: Mapping[str, Any] | None = None,
    ) -> None:
        if not isinstance(sheet, Sheet):
            raise InputError(f"what-if panel: sheet is a {type(sheet).__name__}; expected a calcpad Sheet")
        if show not in SHOW:
            raise InputError(f"what-if panel: show={show!r}; expected 'checks' or 'sheet'")
        self.sheet = sheet
        self.show = show
        self.last_error: str | None = None
        self.session = None
        self._compiled: Any = None
        self._quiet = False
        self.answer: Answer | None = None
        if template is not None:
            from calcpad.widgets.session import TemplateSession

            self.session = TemplateSession(template, values)
            pairs = dict(bind) if isinstance(bind, Mapping) else {str(n): str(n) for n in bind or ()}
            self._inputs = self._template_inputs(names, pairs)
        else:
            self._inputs = self._given_inputs(names)
        self._start = {n: self._current(n) for n in self._inputs}
        self._view = live.SheetView(sheet)
        self._build_widgets()
        try:
            self.sheet.evaluate()
        except CalcpadError as exc:
            self._fail(str(exc))
        else:
            self._refresh()

    # ------------------------------------------------------------------ inputs

    def _givens(self) -> dict[str, Given]:
        return {g.name: g for g in self.sheet.givens()}

    def _given_inputs(self, names: Sequence[str] | None) -> dict[str, _Input]:
        givens = self._givens()
        picked = list(givens) if names is None else [str(n) for n in names]
        for name in picked:
            if name not in givens:
                close = difflib.get_close_matches(name, list(givens), n=3, cutoff=0.5)
                hint = f"; did you mean {', '.join(repr(c) for c in close)}?" if close else ""
                raise SheetError(f"what-if panel: {name!r} is not a given of sheet {self.sheet.title!r}{hint}")
        out = {}
        for name in picked:
            g = givens[name]
            choices = [str(c) for c in g.control.get("choices", [])] or None
            out[name] = _Input(name, _label(g.description, name_text(name)), "choice" if choices else "quantity", g.value.units, name,
                               choices, g.control.get("min"), g.control.get("max"))
        return out

    def _template_inputs(self, names: Sequence[str] | None, bind: dict[str, str]) -> dict[str, _Input]:
        assert self.session is not None
        params = self.session.parameters
        picked = list(params) if names is None else [str(n) for n in names]
        for name in picked:
            if name not in params:
                raise SheetError(f"what-if panel: {name!r} is not a parameter of template {self.session.template.name!r}{self.session.template.suggest(name)}")
        givens = self._givens()
        qs = self.session.quantities()
        for p, g in bind.items():
            if p not in params or g not in givens:
                raise SheetError(f"what-if panel: bind {p!r} -> {g!r}: expected a parameter of the template and a given of the sheet")
            q, gv = qs.get(p), givens[g].value
            same = q is not None and q.dimensionality == gv.dimensionality and abs(float((q - gv).to_base_units().magnitude)) <= 1e-9 * max(
                abs(float(gv.to_base_units().magnitude)), 1e-300)
            if not same:
                raise SheetError(f"what-if panel: bind {p!r} -> {g!r}: the parameter ({self.session.values[p]!r}) and the given ({gv:~}) differ")
        out = {}
        for name in picked:
            p = params[name]
            given = bind.get(name)
            label = _label(p.description, name_text(name))
            value = self.session.values[name]
            if p.kind == "text":
                family = _catalog_family(value)
                grades = None if family else _grade_choices(value)
                if p.choices:
                    out[name] = _Input(name, label, "choice", None, None, list(p.choices))
                elif family:
                    from calcpad.eng.sections.catalog import designations

                    extra = [CUSTOM] if _offers_custom(p.description) else []
                    out[name] = _Input(name, label, "section", None, None, [*extra, *designations(family)])
                elif grades:
                    out[name] = _Input(name, label, "grade", None, None, grades)
                else:
                    out[name] = _Input(name, label, "text", None, None)
                continue
            q = qs[name]
            lo = p.lower.value if p.lower is not None and p.lower.ref is None else None
            hi = p.upper.value if p.upper is not None and p.upper.ref is None else None
            kind = "number" if p.kind == "number" else "quantity"
            if p.choices:
                out[name] = _Input(name, label, "choice", q.units, given, list(p.choices))
            else:
                out[name] = _Input(name, label, kind, q.units, given, None, lo, hi)
        return out

    def _current(self, name: str) -> Any:
        if self.session is not None:
            return self.session.values[name]
        return self._givens()[name].value

    def _magnitude(self, inp: _Input, value: Any) -> float:
        if isinstance(value, pint.Quantity):
            return float(value.to(inp.unit).magnitude)
        if isinstance(value, (int, float)):
            return float(value)
        return float(parse_quantity(value, inp.name).to(inp.unit).magnitude)

    # ------------------------------------------------------------------ widgets

    def _build_widgets(self) -> None:
        w = _widgets()
        rows = []
        self.controls: dict[str, Any] = {}
        for name, inp in self._inputs.items():
            ctrl = self._make_control(w, inp)
            inp.widget = ctrl
            self.controls[name] = ctrl
            unit = unit_symbol(inp.unit) if inp.unit is not None and inp.kind in ("quantity",) else ""
            label = w.HTML(value=html.escape(inp.label), layout=w.Layout(width=_LABEL_WIDTH))
            rows.append(w.HBox([label, ctrl, w.Label(unit)]))
            ctrl.observe(self._on_change(name), names="value")
        self._message = w.HTML(value="")
        self._out = w.Output()
        self._sheet_box = w.VBox([])
        self._sheet_outs: list[Any] = []
        self._extra = w.Output()
        numeric = [n for n, i in self._inputs.items() if i.given is not None or i.kind == "section"]
        self._goal_pick = w.Dropdown(options=[(self._inputs[n].label, n) for n in numeric], description="Input", layout=w.Layout(width="32em"))
        goal = w.Button(description="What would it take?", tooltip="value of the input at which the governing check reaches 1.0",
                        layout=w.Layout(width="13em"))
        sens = w.Button(description="Sensitivity", tooltip="elasticity of each check ratio to each numeric input")
        export = w.Button(description="Export job block", tooltip="the current values as a job-file [[calcs]] block")
        goal.on_click(lambda _b: self._show_answer(self._goal_pick.value))
        sens.on_click(lambda _b: self._show_sensitivity())
        export.on_click(lambda _b: self._show_export())
        tools = w.HBox([self._goal_pick, goal, sens, export]) if numeric else w.HBox([sens, export])
        title = w.HTML(value=f"<b>What-if: {html.escape(self.sheet.title)}</b>")
        self.container = w.VBox([title, w.VBox(rows), self._message, self._out, tools, self._extra, self._sheet_box])

    def _make_control(self, w: Any, inp: _Input) -> Any:
        value = self._current(inp.name)
        tip = inp.label
        if inp.options is not None:
            options = list(inp.options)
            current = self._option_for(inp, value)
            if current is None:
                current = str(value) if not isinstance(value, pint.Quantity) else f"{value.magnitude:g} {unit_symbol(value.units, 'ascii')}".strip()
                options = [current, *options]
            return w.Dropdown(options=options, value=current, tooltip=tip)
        if inp.kind == "text":
            return w.Text(value=str(value), tooltip=tip, continuous_update=False)
        mag = self._magnitude(inp, value)
        if inp.lower is not None and inp.upper is not None:
            lo_m, hi_m = float(inp.lower.to(inp.unit).magnitude), float(inp.upper.to(inp.unit).magnitude)
            lo_m, hi_m = min(lo_m, mag), max(hi_m, mag)  # never clamp the sheet's own value
            step = (hi_m - lo_m) / _SLIDER_STEPS if hi_m > lo_m else 1.0
            return w.FloatSlider(value=mag, min=lo_m, max=hi_m, step=step, readout_format=".4g", continuous_update=False, tooltip=tip)
        return w.FloatText(value=mag, tooltip=tip, continuous_update=False)

    @staticmethod
    def _option_for(inp: _Input, value: Any) -> str | None:
        if inp.unit is None:  # text options
            return str(value) if str(value) in inp.options else None
        q = value if isinstance(value, pint.Quantity) else parse_quantity(value, inp.name)
        for opt in inp.options or []:
            try:
                o = parse_quantity(opt, "choice")
                if o.dimensionality == q.dimensionality and abs(float((o - q).to(q.units).magnitude)) <= 1e-12 * max(1.0, abs(float(q.magnitude))):
                    return opt
            except (CalcpadError, pint.PintError):
                continue
        return None

    def _on_change(self, name: str) -> Callable[[dict[str, Any]], None]:
        def handler(change: dict[str, Any]) -> None:
            if not self._quiet:
                self.set(name, change["new"])

        return handler

    def _show_in_control(self, name: str) -> None:
        inp = self._inputs[name]
        ctrl = inp.widget
        value = self._current(name)
        self._quiet = True
        try:
            if inp.options is not None:
                match = self._option_for(inp, value)
                if match is None:
                    match = str(value) if not isinstance(value, pint.Quantity) else f"{value.to(inp.unit).magnitude:g} {unit_symbol(inp.unit, 'ascii')}".strip()
                    ctrl.options = [match, *[str(o) for o in ctrl.options]]
                ctrl.value = match
            elif inp.kind == "text":
                ctrl.value = str(value)
            else:
                mag = self._magnitude(inp, value)
                if hasattr(ctrl, "min") and hasattr(ctrl, "max"):
                    ctrl.min, ctrl.max = min(ctrl.min, mag), max(ctrl.max, mag)
                ctrl.value = mag
        finally:
            self._quiet = False

    # ------------------------------------------------------------------ changing

    def _resolve(self, name: str) -> str | None:
        if name in self._inputs:
            return name
        for n, inp in self._inputs.items():  # a bound given's own name also works
            if inp.given == name:
                return n
        return None

    def _value_text(self, inp: _Input, value: Any) -> Any:
        """A control's raw value (a number in the control's unit) as the text a job would carry."""
        if isinstance(value, bool):
            raise InputError(f"what-if control {inp.name!r}: got {value!r}; expected a number in {unit_symbol(inp.unit, 'ascii') or 'no unit'}")
        if isinstance(value, (int, float)) and inp.unit is not None and inp.kind == "quantity":
            return f"{float(value)!r} {unit_symbol(inp.unit, 'ascii')}".strip()
        return value

    def set(self, name: str, value: str | pint.Quantity | float) -> bool:
        """Change an input (``"120 lbf"``, a quantity, or a number in the control's unit).

        Checks it like a job value, applies it, evaluates and refreshes the displays. Returns
        True when the value was taken; on a bad value the message goes to :attr:`last_error`
        and the panel, and the sheet, the displays and the control keep their last good values.
        """
        key = self._resolve(str(name))
        if key is None:
            close = difflib.get_close_matches(str(name), list(self._inputs), n=3, cutoff=0.5)
            hint = f"; did you mean {', '.join(repr(c) for c in close)}?" if close else ""
            self._fail(f"what-if panel: {name!r} has no control{hint}")
            return False
        inp = self._inputs[key]
        try:
            if self.session is not None:
                ok = self._set_parameter(inp, value)
            else:
                ok = self._set_given(inp, value)
        except CalcpadError as exc:
            self._show_in_control(key)
            self._fail(str(exc))
            return False
        if not ok:
            return False
        self._show_in_control(key)
        self.last_error = None
        self._message.value = ""
        self._refresh()
        return True

    def _set_given(self, inp: _Input, value: Any) -> bool:
        field = f"what-if control {inp.name!r}"
        g = self._givens()[inp.name]
        value = self._value_text(inp, value)
        q = value if isinstance(value, pint.Quantity) else parse_quantity(value, field)
        if q.dimensionality != g.value.dimensionality:
            unit = unit_symbol(inp.unit, "ascii")
            raise InputError(f"{field}: {value!r} does not have the dimension of {inp.name} ({unit or 'no unit'}); expected a value like '{g.value.magnitude:g} {unit}'")
        for key, bound in (("min", inp.lower), ("max", inp.upper)):
            if bound is not None and (q < bound if key == "min" else q > bound):
                side = "below" if key == "min" else "above"
                raise InputError(f"{field}: {q:~g} is {side} the {key} {bound:~g} of this given")
        self._apply_given(inp.name, q)
        return True

    def _apply_given(self, given: str, q: pint.Quantity) -> None:
        previous = self._givens()[given].value
        try:
            self.sheet.set(**{given: q})
            self.sheet.evaluate()
        except CalcpadError:
            self.sheet.set(**{given: previous})
            try:
                self.sheet.evaluate()
            except CalcpadError:  # the previous state was already bad (panel made on a failing sheet)
                pass
            raise

    def _set_parameter(self, inp: _Input, value: Any) -> bool:
        assert self.session is not None
        coerced = self.session.check(inp.name, self._value_text(inp, value))
        if inp.given is not None:
            self._apply_given(inp.given, parse_quantity(coerced, inp.name))
        else:
            new = self._pick(self.session.build({**self.session.values, inp.name: coerced}))
            new.evaluate()
            live.transfer(self.sheet, new)
            self.sheet = new
            self._view.rebind(new)
            self._compiled = None
        self.session.values[inp.name] = coerced
        return True

    def _pick(self, sheets: list[Sheet]) -> Sheet:
        if not sheets:
            raise InputError(f"template {self.session.template.name!r} made no sheet")  # type: ignore[union-attr]
        for s in sheets:
            if s.title == self.sheet.title:
                return s
        mine = {g.name for g in self.sheet.givens()}
        return max(sheets, key=lambda s: len(mine & {g.name for g in s.givens()}))

    def reset(self) -> None:
        """Put every input back to the value it had when the panel was made."""
        for name, value in self._start.items():
            if self._current(name) != value:
                self.set(name, value)

    def _fail(self, message: str) -> None:
        self.last_error = message
        self._message.value = f'<div style="{_NG_STYLE}">Not applied: {html.escape(message)}</div>'

    # ------------------------------------------------------------------ display

    def _refresh(self) -> None:
        result = self.sheet.evaluate()
        self._out.outputs = (
            {"output_type": "display_data", "data": {"text/html": summary_html(result), "text/plain": summary_text(result)}, "metadata": {}},
        )
        changed = live.refresh(self.sheet)
        if self.show == "sheet":
            view = live.view_for(self.sheet)  # printed once for both copies when the sheet is shown live
            if view is None:
                view = self._view
                changed = view.update()
            self._redraw_sheet(view, changed)

    def _redraw_sheet(self, view: live.SheetView, changed: list[int]) -> None:
        """Redraw the panel's copy of the sheet: only outputs of steps whose print changed."""
        bundles = view.bundles()
        w = _widgets()
        if len(self._sheet_outs) != len(bundles):
            while len(self._sheet_outs) < len(bundles):
                self._sheet_outs.append(w.Output())
            del self._sheet_outs[len(bundles) :]
            self._sheet_box.children = tuple(self._sheet_outs)
        for i, out in enumerate(self._sheet_outs):
            if i in changed or not out.outputs or out.outputs[0]["data"] is not bundles[i]:
                out.outputs = ({"output_type": "display_data", "data": bundles[i], "metadata": {}},)

    @property
    def checks(self) -> list[CheckResult]:
        """The checks of the sheet at its current (last good) values."""
        return self.sheet.summary()

    @property
    def ratios(self) -> dict[str, float]:
        """Check ratio by check title, at the current values."""
        return {c.title: c.ratio for c in self.sheet.summary()}

    # ------------------------------------------------------------------ questions

    def compiled(self) -> Any:
        """The compiled sheet (made once per sheet structure)."""
        if self._compiled is None or self._compiled[0] is not self.sheet:
            self._compiled = (self.sheet, self.sheet.compile())
        return self._compiled[1]

    def sensitivity(self, names: Sequence[str] | None = None) -> Sensitivity:
        """Elasticities of every check ratio to the numeric inputs (default: every control that
        sets a given; without a template every given)."""
        if names is None:
            givens = [i.given for i in self._inputs.values() if i.given is not None and i.kind != "choice"]
        else:
            givens = [self._inputs[k].given or k if (k := self._resolve(n)) else n for n in names]
        return elasticities(self.sheet, givens, compiled=self.compiled())

    def what_would_it_take(self, name: str) -> Answer:
        """For a numeric input, the value at which the governing check reaches 1.0 (searched over
        the stated range); for a section, the lightest catalog size of its family passing every check."""
        key = self._resolve(name)
        if key is None:
            raise InputError(f"what would it take: {name!r} has no control")
        inp = self._inputs[key]
        if inp.kind == "section" and self.session is not None:
            family = next((f for o in inp.options or [] if o != CUSTOM and (f := _catalog_family(o))), None)
            return lightest_passing(self.session, key, self._pick, family=family)
        if inp.given is None:
            return Answer("none", f"{inp.label}: not a given of the sheet; try values in the control")
        lower, upper, lo_inc, hi_inc = inp.lower, inp.upper, True, True
        if self.session is not None:
            p = self.session.parameters[key]
            qs = self.session.quantities()
            lower = p.lower.resolve(qs) if p.lower is not None else None
            upper = p.upper.resolve(qs) if p.upper is not None else None
            lo_inc = p.lower.inclusive if p.lower is not None else True
            hi_inc = p.upper.inclusive if p.upper is not None else True
        answer = value_for_limit(self.sheet, inp.given, lower, upper, compiled=self.compiled(), lower_inclusive=lo_inc, upper_inclusive=hi_inc)
        answer.message = f"{inp.label}: {answer.message}"
        return answer

    def to_job(self, member: str = "M1", title: str = "") -> str:
        """The current values as a job-file ``[[calcs]]`` block (TOML text; needs ``template=``)."""
        if self.session is None:
            raise InputError("what-if panel: export needs the panel made with template=NAME")
        values = {n: v for n, v in self.session.values.items() if n in self.session.parameters}
        descriptions = {n: p.description for n, p in self.session.parameters.items()}
        return calc_block(self.session.template.name, values, member=member, title=title, descriptions=descriptions)

    def _show_sensitivity(self) -> None:
        sens = self.sensitivity()
        labels = {i.given: i.label for i in self._inputs.values() if i.given}
        fig = sensitivity_figure(sens, labels=labels)
        buf = io.BytesIO()
        fig.savefig(buf, format="png", dpi=90, bbox_inches="tight")
        import base64

        png = base64.b64encode(buf.getvalue()).decode()
        self._extra.outputs = ({"output_type": "display_data", "data": {"image/png": png, "text/plain": _sens_text(sens)}, "metadata": {}},)

    def _show_answer(self, name: str) -> None:
        try:
            self.answer = self.what_would_it_take(name)
            text = self.answer.message
        except CalcpadError as exc:
            text = str(exc)
        self._extra.outputs = ({"output_type": "display_data", "data": {"text/plain": text, "text/html": f"<p>{html.escape(text)}</p>"}, "metadata": {}},)

    def _show_export(self) -> None:
        try:
            text = self.to_job()
        except CalcpadError as exc:
            text = str(exc)
        self._extra.outputs = ({"output_type": "display_data", "data": {"text/plain": text, "text/html": f"<pre>{html.escape(text)}</pre>"}, "metadata": {}},)

    def _repr_mimebundle_(self, include: Any = None, exclude: Any = None) -> Any:
        return self.container._repr_mimebundle_(include=include, exclude=exclude)

    def _ipython_display_(self) -> None:
        from IPython.display import display

        display(self.container)

    def __repr__(self) -> str:
        return f"<WhatIfPanel {self.sheet.title!r}: {len(self.controls)} controls>"


def _sens_text(sens: Sensitivity) -> str:
    if sens.governing is None:
        return "no checks"
    lines = [f"{sens.titles[sens.governing]} (governs), elasticity of the ratio:"]
    lines += [f"  {name_text(n)}: {format_number(v, 3)}" for n, v in sens.of_governing()]
    return "\n".join(lines)


def what_if(
    sheet: Sheet,
    names: Sequence[str] | None = None,
    show: str = "checks",
    template: Any = None,
    bind: Mapping[str, str] | Sequence[str] | None = None,
    values: Mapping[str, Any] | None = None,
) -> WhatIfPanel:
    """Make a what-if panel for ``sheet``.

    Args:
        sheet: The sheet to change; the panel sets its givens (or re-runs the template) and evaluates it.
        names: Inputs to make controls for, in this order: template parameters with ``template=``,
            else givens; default all.
        show: ``"checks"`` for the check summary, ``"sheet"`` to add a live copy of the sheet.
        template: The template the sheet comes from (name or path): controls, ranges, choices and
            the value parser follow its parameters cell.
        bind: Parameters that only set one given of the sheet: ``{"P": "P_top"}``, or a list of
            names for givens named like their parameter. These change the given directly (and
            have sensitivity and "what would it take"); every other parameter re-runs the
            template. Bind only a parameter the template uses for nothing but that given.
        values: The template's current values (default: the notebook's, else the defaults).

    Raises:
        SheetError: A name is not a given/parameter, or ``bind`` names an unknown one.
        InputError: ``show`` is not one of ``"checks"``, ``"sheet"``.
    """
    return WhatIfPanel(sheet, names=names, show=show, template=template, bind=bind, values=values)

