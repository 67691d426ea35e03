"""A sheet shown step by step, so a change re-prints and redraws only the rows that changed.

    show(sh)          # in a template's sheet cell: one display per step, kept for updates
    show_summary(sh)  # the check summary, kept for updates
    refresh(sh)       # after sh.set(...): re-print the changed steps and redraw them in place

A :class:`SheetView` caches each step's printed form (LaTeX for the notebook, text for consoles).
After an evaluation, a step whose result object is the one printed last time is not printed again
(the sheet keeps the result objects of steps it did not recompute, see ``Sheet.last_recomputed``);
the others are printed and compared with the cache, and only those whose printed form differs
are redrawn. In a notebook each step is one output with an IPython ``display_id`` ("slot"), so
the sheet above a what-if panel redraws in place and a check never shows two statuses. When a
rebuild changes the number of steps (another section), the last slot holds the extra steps and
slots left over are emptied.

Outside IPython (command line, in-process runs) :func:`show` and :func:`show_summary` do nothing.
This module imports IPython only when it displays; it never imports ipywidgets.
"""

from __future__ import annotations

import contextlib
import itertools
from collections.abc import Iterator
from dataclasses import dataclass, field
from typing import Any

from calcpad.core.results import CheckResult, HeadingResult, SheetResult
from calcpad.core.sheet import Sheet

__all__ = ["SheetView", "quiet", "refresh", "show", "show_summary", "step_bundle", "summary_bundle", "transfer", "view_for"]

_EMPTY: dict[str, str] = {"text/plain": ""}
_ids = itertools.count(1)


def _title_row(title: str) -> str:
    from calcpad.render.latex import _text  # the printer's own escaping

    return rf"\textbf{{{_text(title)}}}"


def _latex_rows(rows: list[tuple[str, str, str]]) -> str:
    """Rows ``(description, math, reference)`` as one display block, laid out like the sheet."""
    out = []
    for desc, math, ref in rows:
        lead = desc if desc.startswith("\\") or not desc else rf"\text{{{desc}}}"
        tail = rf"{{\scriptsize \text{{[{ref}]}}}}" if ref else ""
        out.append(f"{lead} & {math} & {tail}")
    return "$$\n\\begin{array}{lll}\n" + " \\\\\n".join(out) + "\n\\end{array}\n$$"


def step_bundle(step: Any) -> dict[str, str]:
    """The notebook display of one step result: ``text/latex`` (MathJax) and ``text/plain``."""
    from calcpad.render.latex import step_latex  # lazy: printers load sympy printing
    from calcpad.render.text import step_text

    rows = step_latex(step)
    lines = step_text(step)
    if not rows and not lines:
        return dict(_EMPTY)
    bundle = {"text/plain": "\n".join(lines)}
    if rows:
        bundle["text/latex"] = _latex_rows(rows)
    return bundle


def summary_bundle(result: SheetResult) -> dict[str, str]:
    """The check summary (HTML table and text) of an evaluated sheet."""
    from calcpad.widgets.summary import summary_html, summary_text

    return {"text/html": summary_html(result), "text/plain": summary_text(result)}


@dataclass
class SheetView:
    """Printed steps of one sheet, re-printed only where a step changed.

    Attributes:
        sheet: The sheet shown (may be swapped for a rebuilt one with :meth:`rebind`).
        printed: Number of step printings done so far (for tests and benchmarks).
    """

    sheet: Sheet
    printed: int = 0
    _steps: list[Any] = field(default_factory=list)
    _bundles: list[dict[str, str]] = field(default_factory=list)

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
        changed: list[int] = []
        for i, step in enumerate(items):
            if i < len(self._steps):
                old = self._steps[i]
                if old is step or (not hasattr(step, "name") and not isinstance(step, CheckResult) and old == step):
                    self._steps[i] = step
                    continue
            bundle = self._print(step)
            if i < len(self._bundles):
                self._steps[i] = step
                if bundle != self._bundles[i]:
                    self._bundles[i] = bundle
                    changed.append(i)
            else:
                self._steps.append(step)
                self._bundles.append(bundle)
                changed.append(i)
        if len(self._steps) > len(items):
            changed.extend(range(len(items), len(self._steps)))
            del self._steps[len(items) :]
            del self._bundles[len(items) :]
        return changed

    def _print(self, step: Any) -> dict[str, str]:
        self.printed += 1
        if isinstance(step, HeadingResult) and step.level == 0:  # the sheet title
            return {"text/latex": _latex_rows([(_title_row(step.text), "", "")]), "text/plain": step.text}
        return step_bundle(step)


# ----------------------------------------------------------------------------- notebook slots


@dataclass
class _Live:
    view: SheetView
    ids: list[str]
    summary_ids: list[str] = field(default_factory=list)


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
    if _QUIET[0]:
        return None
    try:
        from IPython import get_ipython
    except ImportError:  # pragma: no cover - IPython comes with the notebook extra
        return None
    return get_ipython()


def _slot_bundles(bundles: list[dict[str, str]], slots: int) -> list[dict[str, str]]:
    """Fit ``bundles`` into ``slots`` displays: the last slot takes any extra steps."""
    if len(bundles) <= slots:
        return bundles + [dict(_EMPTY)] * (slots - len(bundles))
    head, tail = bundles[: slots - 1], bundles[slots - 1 :]
    merged: dict[str, str] = {"text/plain": "\n".join(b.get("text/plain", "") for b in tail)}
    latex = [b["text/latex"] for b in tail if "text/latex" in b]
    if latex:
        merged["text/latex"] = "\n".join(latex)
    return [*head, merged]


def _live_for(sheet: Sheet) -> _Live | None:
    live = _LIVE.get(id(sheet))
    return live if live is not None and live.view.sheet is sheet else None


def view_for(sheet: Sheet) -> SheetView | None:
    """The view of ``sheet`` shown live in the notebook (None when it is not)."""
    live = _live_for(sheet)
    return live.view if live is not None else None


def show(sheet: Sheet) -> SheetView | None:
    """Display ``sheet`` in a notebook as one output per step, kept so :func:`refresh` can
    redraw changed steps in place. Does nothing outside IPython. Returns the view (or None)."""
    if _shell() is None:
        return None
    from IPython.display import display

    view = SheetView(sheet)
    ids = []
    for bundle in view.bundles():
        ident = f"calcpad-{next(_ids)}"
        display(bundle, raw=True, display_id=ident)
        ids.append(ident)
    _LIVE[id(sheet)] = _Live(view, ids)
    return view


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
        bundles = live.view.bundles()
        slots = _slot_bundles(bundles, len(live.ids))
        last = len(live.ids) - 1
        todo = sorted({min(i, last) for i in changed})
        for i in todo:
            update_display(slots[i], raw=True, display_id=live.ids[i])
    if live.summary_ids:
        bundle = summary_bundle(sheet.evaluate())
        for ident in live.summary_ids:
            update_display(bundle, raw=True, display_id=ident)
    return changed
