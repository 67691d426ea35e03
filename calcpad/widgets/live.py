"""A sheet shown step by step, so a change re-prints and redraws only the rows that changed.

    show(sh)          # in a template's sheet cell: one display per step, kept for updates
    show_summary(sh)  # the check summary, kept for updates
    refresh(sh)       # after sh.set(...): re-print the changed steps and redraw them in place

A :class:`SheetView` caches each step's printed form (HTML rows with LaTeX math, display blocks, text).
After an evaluation, a step whose result object is the one printed last time is not printed again
(the sheet keeps the result objects of steps it did not recompute, see ``Sheet.last_recomputed``);
the others are printed and compared with the cache, and only those whose printed form differs
are redrawn. In a notebook the sheet is shown as a few outputs ("slots", one per heading's
section, at most :data:`MAX_SLOTS` because JupyterLab folds a cell's outputs past 50), each with
an IPython ``display_id``; a slot is re-sent only when one of its steps printed differently, so
the sheet above a what-if panel redraws in place and a check never shows two statuses. When a
rebuild changes the steps (another section), they are grouped again into the same slots.

Outside IPython (command line, in-process runs) :func:`show` and :func:`show_summary` do nothing.
This module imports IPython only when it displays; it never imports ipywidgets.
"""

from __future__ import annotations

import contextlib
import dataclasses
import itertools
import os
from collections.abc import Iterator
from dataclasses import dataclass, field
from typing import Any

import pint
import sympy as sp

from calcpad.core.results import CheckResult, HeadingResult, SheetResult
from calcpad.core.sheet import Sheet

__all__ = ["SheetView", "print_key", "quiet", "refresh", "show", "show_summary", "step_bundle", "summary_bundle", "transfer", "view_for"]

_EMPTY: dict[str, str] = {"text/plain": ""}
#: Most outputs one sheet display uses (JupyterLab shows 50 per cell before folding).
MAX_SLOTS = 40
_ids = itertools.count(1)

#: A printed step: (HTML table rows, LaTeX display blocks, plain text).
Printed = tuple[str, str, str]


def _printed(step: Any) -> Printed:
    """One step result printed by the notebook printers (the same rows the whole sheet shows)."""
    from calcpad.render.latex import step_blocks, title_block  # lazy: printers load sympy printing
    from calcpad.render.notebook import step_notebook_rows, title_notebook_row
    from calcpad.render.rows import math_rows
    from calcpad.render.text import step_text

    if isinstance(step, HeadingResult) and step.level == 0:  # the sheet title
        return title_notebook_row(step.text), title_block(step.text), step.text
    rows = math_rows(step)  # laid out once for both the HTML table and the LaTeX blocks
    return step_notebook_rows(step, rows), step_blocks(step, rows), "\n".join(step_text(step))


def _bundle(printed: list[Printed]) -> dict[str, str]:
    """Printed steps as one display: an HTML sheet table, LaTeX blocks and plain text."""
    from calcpad.render.notebook import rows_notebook_html

    html = [h for h, _, _ in printed if h]
    latex = "\n".join(x for _, x, _ in printed if x)
    plain = "\n".join(p for _, _, p in printed if p)
    if not html and not latex:
        return {"text/plain": plain} if plain else dict(_EMPTY)
    return {"text/html": rows_notebook_html(html), "text/latex": latex, "text/plain": plain}


def step_bundle(step: Any) -> dict[str, str]:
    """The notebook display of one step result: ``text/html``, ``text/latex`` and ``text/plain``."""
    return _bundle([_printed(step)])


def summary_bundle(result: SheetResult) -> dict[str, str]:
    """The check summary (HTML table and text) of an evaluated sheet."""
    from calcpad.widgets.summary import summary_html, summary_text

    return {"text/html": summary_html(result), "text/plain": summary_text(result)}


def print_key(value: Any) -> Any:
    """A hashable fingerprint of everything a printer reads from a step result: two results
    with equal keys print the same. Quantities count by magnitude *and* unit in their order
    (``1 in`` and ``25.4 mm`` are equal quantities but print differently); formulas by their
    sympy tree (structural equality: the same text gives the same tree)."""
    if isinstance(value, (str, int, float, bool, bytes, type(None), sp.Basic)):
        return value
    if isinstance(value, pint.Quantity):
        mag = value._magnitude  # the attributes themselves: .units builds a new Unit on every call
        return ("Q", mag if isinstance(mag, (int, float)) else repr(mag), tuple(value._units.items()))
    if isinstance(value, dict):
        return tuple((k, print_key(v)) for k, v in value.items())
    if isinstance(value, (list, tuple)):
        return tuple(print_key(v) for v in value)
    names = _FIELDS.get(type(value))
    if names is None and dataclasses.is_dataclass(value):
        names = _FIELDS[type(value)] = tuple(f.name for f in dataclasses.fields(value))
    if names is not None:
        return (type(value).__name__, *(print_key(getattr(value, n)) for n in names))
    return ("id", id(value))  # unknown: never equal to another object's key


_FIELDS: dict[type, tuple[str, ...]] = {}


def _ident(step: Any, seen: dict[Any, int]) -> Any:
    """Which step a result belongs to across evaluations and rebuilds: a named step by its name, a
    check by its key, anything else (headings, notes, tables, figures) by its content and count."""
    if isinstance(step, CheckResult):
        base: Any = ("check", step.key)
    elif getattr(step, "name", None) is not None:
        base = ("name", step.name)
    else:
        base = ("content", print_key(step))
    seen[base] = seen.get(base, 0) + 1
    return base, seen[base]


@dataclass
class _Entry:
    step: Any
    key: Any  # print_key(step), computed when first needed (None: not yet)
    printed: Printed
    bundle: dict[str, str]


@dataclass(repr=False)
class SheetView:
    """Printed steps of one sheet, re-printed only where a step changed.

    A step is printed again only when its result object is new *and* prints differently from
    the last time (:func:`print_key`): after an incremental evaluation the sheet keeps the
    result objects of steps it did not recompute; after a rebuild (another section, a grade)
    every object is new, and only the rows whose printed content differs are printed, matched by
    step name, so rows that move (a step added before them) are not printed again either.

    Attributes:
        sheet: The sheet shown (may be swapped for a rebuilt one with :meth:`rebind`).
        printed: Number of step printings done so far (for tests and benchmarks).
    """

    sheet: Sheet
    printed: int = 0
    _steps: list[Any] = field(default_factory=list)
    _bundles: list[dict[str, str]] = field(default_factory=list)
    _printed: list[Printed] = field(default_factory=list)
    _entries: dict[Any, _Entry] = field(default_factory=dict)

    def __repr__(self) -> str:
        return f"<SheetView of {self.sheet.title!r}: {len(self._steps)} rows, {self.printed} printed>"

    def bundles(self) -> list[dict[str, str]]:
        """One bundle per step (the sheet title first), printing what is not cached yet."""
        self.update()
        return list(self._bundles)

    def rebind(self, sheet: Sheet) -> None:
        """Show another sheet (a rebuild); the next :meth:`update` redraws only what differs."""
        self.sheet = sheet

    def update(self) -> list[int]:
        """Evaluate the sheet and re-print changed steps; returns the positions whose display changed."""
        result = self.sheet.evaluate()
        items: list[Any] = [HeadingResult(result.title, 0), *result.steps]
        seen: dict[Any, int] = {}
        entries: dict[Any, _Entry] = {}
        steps, bundles, printed = [], [], []
        for step in items:
            ident = _ident(step, seen)
            entry = self._entries.get(ident)
            if entry is not None and entry.step is not step:
                key = print_key(step)
                if entry.key is None:
                    entry.key = print_key(entry.step)
                entry = _Entry(step, key, entry.printed, entry.bundle) if entry.key == key else None
            if entry is None:
                self.printed += 1
                out = _printed(step)
                entry = _Entry(step, None, out, _bundle([out]))
            entries[ident] = entry
            steps.append(step)
            bundles.append(entry.bundle)
            printed.append(entry.printed)
        old = self._bundles
        changed = [i for i, b in enumerate(bundles) if i >= len(old) or (b is not old[i] and b != old[i])]
        changed += range(len(bundles), len(old))
        self._entries, self._steps, self._bundles, self._printed = entries, steps, bundles, printed
        return changed

    def groups(self, slots: int) -> list[tuple[int, int]]:
        """Step ranges ``[start, end)``, one per heading's section, merged to at most ``slots``
        (padded with empty ranges to exactly ``slots``)."""
        starts = [0] + [i for i, s in enumerate(self._steps) if i > 0 and isinstance(s, HeadingResult) and s.level == 1]
        ranges = [(a, b) for a, b in zip(starts, [*starts[1:], len(self._steps)], strict=True)]
        while len(ranges) > slots:  # merge the adjacent pair with the fewest steps
            k = min(range(len(ranges) - 1), key=lambda j: ranges[j + 1][1] - ranges[j][0])
            ranges[k : k + 2] = [(ranges[k][0], ranges[k + 1][1])]
        end = ranges[-1][1] if ranges else 0
        return ranges + [(end, end)] * (slots - len(ranges))

    def group_bundle(self, start: int, end: int) -> dict[str, str]:
        """One display for steps ``start`` to ``end`` (their rows in one sheet table)."""
        return _bundle(self._printed[start:end])


# ----------------------------------------------------------------------------- notebook slots


@dataclass
class _Live:
    view: SheetView
    ids: list[str]
    summary_ids: list[str] = field(default_factory=list)
    groups: list[tuple[int, int]] = field(default_factory=list)
    sent: list[dict[str, str]] = field(default_factory=list)


_LIVE: dict[int, _Live] = {}
_QUIET = [0]


@contextlib.contextmanager
def quiet() -> Iterator[None]:
    """Inside this block :func:`show` and :func:`show_summary` display nothing (a panel's rebuild)."""
    _QUIET[0] += 1
    try:
        yield
    finally:
        _QUIET[0] -= 1


def _shell() -> Any:
    if _QUIET[0] or os.environ.get("CALCPAD_NO_DISPLAY"):  # runner.build.NO_DISPLAY_ENV: sheets built for a search or sweep
        return None
    try:
        from IPython import get_ipython
    except ImportError:  # pragma: no cover - IPython comes with the notebook extra
        return None
    return get_ipython()


def _live_for(sheet: Sheet) -> _Live | None:
    live = _LIVE.get(id(sheet))
    return live if live is not None and live.view.sheet is sheet else None


def view_for(sheet: Sheet) -> SheetView | None:
    """The view of ``sheet`` shown live in the notebook (None when it is not)."""
    live = _live_for(sheet)
    return live.view if live is not None else None


def show(sheet: Sheet) -> None:
    """Display ``sheet`` in a notebook, one output per section, kept so :func:`refresh` can
    redraw changed steps in place. Does nothing outside IPython. Returns nothing, so a cell
    ending with ``show(sh)`` prints no value (:func:`view_for` gives the view)."""
    if _shell() is None:
        return
    from IPython.display import display

    view = SheetView(sheet)
    view.update()
    groups = view.groups(MAX_SLOTS)
    groups = [g for g in groups if g[1] > g[0]]
    live = _Live(view, [], groups=groups)
    for start, end in groups:
        ident = f"calcpad-{next(_ids)}"
        bundle = view.group_bundle(start, end)
        display(bundle, raw=True, display_id=ident)
        live.ids.append(ident)
        live.sent.append(bundle)
    old = _LIVE.get(id(sheet))
    if old is not None:
        live.summary_ids = old.summary_ids
    _LIVE[id(sheet)] = live


def show_summary(sheet: Sheet) -> None:
    """Display the check summary of ``sheet``, kept so :func:`refresh` redraws it in place."""
    if _shell() is None:
        return
    from IPython.display import display

    ident = f"calcpad-summary-{next(_ids)}"
    display(summary_bundle(sheet.evaluate()), raw=True, display_id=ident)
    live = _LIVE.setdefault(id(sheet), _Live(SheetView(sheet), []))
    live.summary_ids.append(ident)


def transfer(old: Sheet, new: Sheet) -> None:
    """A rebuilt sheet takes over the displays of ``old`` (the next refresh redraws what differs)."""
    live = _LIVE.pop(id(old), None)
    if live is not None:
        live.view.rebind(new)
        _LIVE[id(new)] = live


def refresh(sheet: Sheet) -> list[int]:
    """Redraw in place the displayed steps of ``sheet`` that changed, and its summaries.

    Returns the step positions redrawn (empty when the sheet is not displayed live).
    """
    live = _live_for(sheet)
    if live is None:
        return []
    changed = live.view.update()
    if _shell() is None:
        return changed
    from IPython.display import update_display

    if changed and live.ids:
        view = live.view
        if live.groups[-1][1] != len(view._steps):  # a rebuild changed the steps: group them again
            live.groups = view.groups(len(live.ids))
            todo = range(len(live.ids))
        else:
            todo = [k for k, (a, b) in enumerate(live.groups) if any(a <= i < b for i in changed)]
        for k in todo:
            bundle = view.group_bundle(*live.groups[k])
            if bundle != live.sent[k]:
                update_display(bundle, raw=True, display_id=live.ids[k])
                live.sent[k] = bundle
    if live.summary_ids:
        bundle = summary_bundle(sheet.evaluate())
        for ident in live.summary_ids:
            update_display(bundle, raw=True, display_id=ident)
    return changed
