"""Self-contained HTML with MathML: no JavaScript, no network, one file a reviewer can open.

:func:`sheet_html_fragment` prints one sheet as a ``<section>``; :func:`html_document` wraps
fragments in a page with its own CSS (print-ready: steps never split across pages).
"""

from __future__ import annotations

import base64
import html
from typing import Any

import numpy as np

from calcpad.core.results import BranchResult, FigureResult, FormulaResult, GivenResult, HeadingResult, SheetResult, TableResult, TextResult
from calcpad.render.latex import text_lead
from calcpad.render.layout import mathml_lines
from calcpad.render.rows import MathRow, math_rows

__all__ = ["CAUTION", "CSS", "html_document", "sheet_html_fragment", "status_html"]

CAUTION = (
    "These calculations are for review by a qualified, licensed engineer. Local building codes and "
    "the authority having jurisdiction govern. Software output does not replace engineering judgement."
)

CSS = """
body { font-family: "DejaVu Sans", "Helvetica", sans-serif; font-size: 10.5pt; color: #111; margin: 2em auto; max-width: 60em; }
math { font-family: "Latin Modern Math", "DejaVu Math TeX Gyre", "STIX Two Math", serif; font-size: 1.08em; }
h1 { font-size: 1.35em; border-bottom: 2px solid #333; padding-bottom: .2em; }
h2 { font-size: 1.15em; margin-top: 1.2em; border-bottom: 1px solid #999; }
h3 { font-size: 1.0em; margin: 1em 0 .3em; }
.step { display: grid; grid-template-columns: 13em minmax(0, 1fr); gap: .2em 1em; padding: .25em 0; break-inside: avoid; border-bottom: 1px dotted #ccc; }
.desc { color: #333; overflow-wrap: anywhere; min-width: 0; }
.ref { display: block; color: #555; font-size: .85em; margin-top: .1em; }
.line { min-width: 0; } .mline { white-space: nowrap; } .mline.cont { padding-left: 2em; }
.check { background: #f6f6f6; }
.status { font-weight: bold; padding: 0 .4em; margin-left: .6em; border: 1.5px solid #111; border-radius: 2px; }
.status.NG { border-width: 3px; outline: 1.5px solid #111; outline-offset: 1px; }
.note { font-style: italic; color: #333; padding: .2em 0; break-inside: avoid; }
table.grid { border-collapse: collapse; margin: .4em 0; break-inside: avoid; }
table.grid th, table.grid td { border: 1px solid #999; padding: .15em .5em; text-align: right; }
table.grid th { background: #eee; }
table.grid td:first-child, table.grid th:first-child { text-align: left; }
figure { break-inside: avoid; margin: .6em 0; } figure img { max-width: 100%; }
.caution { border: 1.5px solid #333; padding: .5em .8em; margin: 1em 0; font-size: .95em; }
@media print { body { margin: 0; max-width: none; } }
"""


def _m(markup: str) -> str:
    return f'<math display="inline">{markup}</math>'


def _e(text: str) -> str:
    return html.escape(text or "")


def status_html(status: str) -> str:
    """The verdict as a framed word (NG with a heavy double frame, visible without colour)."""
    return f'<span class="status {status}">{status}</span>'


def _row_html(row: MathRow) -> str:
    label = f"<b>{_e(row.label)}</b>" if row.strong and row.label else _e(row.label)
    ref = f'<span class="ref">[{_e(row.ref)}]</span>' if row.ref else ""
    lines = mathml_lines(row.lines)
    out = []
    for i, ml in enumerate(lines):
        tail = status_html(row.status) if row.status and i == len(lines) - 1 else ""
        out.append(f'<div class="mline{" cont" if i else ""}">{_m(ml)}{tail}</div>')
    extra = " check" if row.check else ""
    return f'<div class="step{extra}"><div class="desc">{label}{ref}</div><div class="line">{"".join(out)}</div></div>'


def _table(t: TableResult) -> str:
    head = "".join(f"<th>{_e(c)}</th>" for c in t.columns)
    body = "".join("<tr>" + "".join(f"<td>{_e(c)}</td>" for c in row) + "</tr>" for row in t.rows)
    note = f'<div class="note">{_e(t.note)}</div>' if t.note else ""
    return f'<h3>{_e(t.title)}</h3><table class="grid"><thead><tr>{head}</tr></thead><tbody>{body}</tbody></table>{note}'


def _value_key(q: Any) -> tuple[Any, ...] | None:
    """A quantity as it prints: the exact magnitude (``repr``: 1 and 1.0, 0.0 and -0.0 differ) and
    its units; None for anything else (an array, a plain object), which is never cached."""
    m = getattr(q, "magnitude", None)
    if type(m) not in (float, int, np.float64):  # a numpy float's repr is exact too (and differs from float's)
        return None
    return (repr(m), q._units)  # the units' container (``q.units`` builds a Unit object each time)


def _row_key(step: object) -> tuple[Any, ...] | None:
    """What a given's or a formula's printed rows depend on, or None (not cached)."""
    if isinstance(step, GivenResult):
        v = _value_key(step.value)
        return None if v is None else ("g", step.name, v, step.description, step.source, step.sig)
    if isinstance(step, FormulaResult):
        vals = []
        for k, q in step.values.items():
            vk = _value_key(q)
            if vk is None:
                return None
            vals.append((k, vk))
        v = _value_key(step.value)
        if v is None:
            return None
        return ("f", id(step.expr), step.name, tuple(vals), v, step.description, step.ref, step.sig,
                tuple(step.sigs.items()), step.quiet)
    if isinstance(step, BranchResult):
        f = _row_key(step.formula)
        sides = () if step.condition_sides is None else tuple(_value_key(q) for q in step.condition_sides)
        if f is None or None in sides:
            return None
        return ("b", f, id(step.cases[step.tested].condition), step.cases[step.chosen].label, step.description, step.ref,
                step.words, step.condition_held, sides)
    return None


def _alive(step: object) -> tuple[object, ...]:
    """The objects whose ids are in the step's row key (kept alive with the row, so an id is never reused)."""
    if isinstance(step, FormulaResult):
        return (step.expr,)
    if isinstance(step, BranchResult):
        return (step.formula.expr, step.cases[step.tested].condition)
    return ()


#: Printed rows of givens, formulas and branches by what they depend on: the calcs of one template
#: print many identical rows (constants, section and material values, repeated members). Bounded.
_ROWS: dict[tuple[Any, ...], tuple[tuple[object, ...], str]] = {}
_ROWS_MAX = 5_000


def _step(step: object) -> str:
    key = _row_key(step)
    if key is not None:
        hit = _ROWS.get(key)
        if hit is not None and all(a is b for a, b in zip(hit[0], _alive(step), strict=True)):
            return hit[1]
    out = _step_uncached(step)
    if key is not None:
        if len(_ROWS) >= _ROWS_MAX:
            _ROWS.clear()
        _ROWS[key] = (_alive(step), out)  # keeps the expressions (and their ids) alive
    return out


def _step_uncached(step: object) -> str:
    rows = math_rows(step)
    if rows is not None:
        return "".join(_row_html(r) for r in rows)
    if isinstance(step, HeadingResult):
        return f"<h{step.level + 1}>{_e(step.text)}</h{step.level + 1}>"
    if isinstance(step, TextResult):
        return f'<div class="note"><b>{text_lead(step.kind)}:</b> {_e(step.text)}</div>'
    if isinstance(step, TableResult):
        return _table(step)
    if isinstance(step, FigureResult):
        data = base64.b64encode(step.png).decode()
        cap = _e(step.caption or step.title)
        return f'<figure><img alt="{_e(step.title)}" src="data:image/png;base64,{data}"/><figcaption>{cap}</figcaption></figure>'
    return ""


def sheet_html_fragment(result: SheetResult, heading_level: int = 1) -> str:
    """One sheet as an HTML ``<section>`` with MathML steps."""
    parts = [f'<section class="sheet"><h{heading_level}>{_e(result.title)}</h{heading_level}>']
    parts.extend(_step(s) for s in result.steps)
    parts.append("</section>")
    return "\n".join(parts)


def html_document(body: str, title: str, extra_css: str = "") -> str:
    """Wrap body HTML in a self-contained page (inline CSS, no scripts)."""
    return (
        '<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8">'
        f"<title>{_e(title)}</title><style>{CSS}{extra_css}</style></head>\n<body>\n{body}\n</body></html>\n"
    )
