"""Self-contained HTML with MathML: no JavaScript, no network, one file a reviewer can open.

:func:`sheet_html_fragment` prints one sheet as a ``<section>``; :func:`html_document` wraps
fragments in a page with its own CSS (print-ready: steps never split across pages).
"""

from __future__ import annotations

import base64
import html

from calcpad.core.names import name_mathml
from calcpad.core.results import (
    BranchResult,
    CheckResult,
    FigureResult,
    FormulaResult,
    GivenResult,
    HeadingResult,
    SelectResult,
    SheetResult,
    TableResult,
    TextResult,
)
from calcpad.core.units import format_number
from calcpad.render.expressions import quantity_mathml, substituted_mathml, symbolic_mathml

__all__ = ["CAUTION", "CSS", "html_document", "sheet_html_fragment"]

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
.step { display: grid; grid-template-columns: 14em minmax(0, 1fr) 11em; gap: .2em 1em; padding: .25em 0; break-inside: avoid; border-bottom: 1px dotted #ccc; }
.desc { color: #333; }
.ref { color: #555; font-size: .88em; text-align: right; }
.line { overflow-wrap: anywhere; min-width: 0; overflow-x: auto; overflow-y: hidden; } .line math { max-width: 100%; } .cont { display: inline-block; margin-left: .25em; }
.check { background: #f6f6f6; }
.status { font-weight: bold; padding: 0 .4em; border: 1px solid #333; border-radius: 2px; }
.status.NG { background: #111; color: #fff; }
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


def _row(desc: str, math: str, ref: str, extra: str = "") -> str:
    return f'<div class="step{extra}"><div class="desc">{desc}</div><div class="line">{math}</div><div class="ref">{ref}</div></div>'


def _formula_ml(f: FormulaResult) -> str:
    sym = symbolic_mathml(f.expr)
    if f.expr.is_Number:  # a value written into the formula
        return _m(f"{name_mathml(f.name)}<mo>=</mo>{sym}")
    sub = substituted_mathml(f.expr, f.values, f.sigs, f.sig)
    res = quantity_mathml(f.value, f.sig)
    parts = [name_mathml(f.name), sym]
    if sub != sym and sub.replace("<mrow>", "").replace("</mrow>", "") != res.replace("<mrow>", "").replace("</mrow>", ""):
        parts.append(sub)
    parts.append(res)
    # one <math> per part so a long line wraps between "= ..." parts (MathML does not line-break)
    head = _m(f"{parts[0]}<mo>=</mo>{parts[1]}")
    return head + "".join(f'<span class="cont">{_m("<mo>=</mo>" + p)}</span>' for p in parts[2:])


_REL = {"<": "&lt;", "<=": "&#x2264;", ">": "&gt;", ">=": "&#x2265;"}
_FLIP = {"<": ">=", "<=": ">", ">": "<=", ">=": "<"}


def _side(expr: object, value: object) -> str:
    if getattr(expr, "is_Number", False):
        return symbolic_mathml(expr)
    return f"{symbolic_mathml(expr)}<mo>=</mo>{quantity_mathml(value)}"


def _branch(b: BranchResult) -> str:
    out = []
    cond = b.cases[b.tested].condition
    label = b.cases[b.chosen].label
    if cond is not None and b.condition_sides is not None and hasattr(cond, "rel_op"):
        lhs, rhs = b.condition_sides
        op = cond.rel_op if b.condition_held else _FLIP[cond.rel_op]
        test = f"{_side(cond.lhs, lhs)}<mo>{_REL[op]}</mo>{_side(cond.rhs, rhs)}"
        out.append(_row(_e(b.description), _m(test) + f" &#x21D2; use {_e(label)}", _e(b.ref)))
        out.append(_row("", _formula_ml(b.formula), _e(label)))
    else:
        out.append(_row(_e(b.description), _formula_ml(b.formula), _e(label or b.ref)))
    return "".join(out)


def _select(s: SelectResult) -> str:
    names = "<mo>,</mo>".join(name_mathml(c.name) for c in s.candidates)
    vals = "<mo>,</mo>".join(quantity_mathml(c.value, s.sig) for c in s.candidates)
    gov = s.candidates[s.governing]
    ml = (
        f"{name_mathml(s.name)}<mo>=</mo><mi>{s.mode}</mi><mrow><mo>(</mo>{names}<mo>)</mo></mrow><mo>=</mo>"
        f"<mi>{s.mode}</mi><mrow><mo>(</mo>{vals}<mo>)</mo></mrow><mo>=</mo>{quantity_mathml(s.value, s.sig)}"
    )
    return _row(_e(s.description), _m(ml) + f" &#8212; {_e(gov.label)} governs", _e(s.ref))


def _check(c: CheckResult) -> str:
    d, cap = name_mathml(c.demand_name), name_mathml(c.capacity_name)
    dq, cq = quantity_mathml(c.demand, c.sig), quantity_mathml(c.capacity, c.sig)
    status = f'<span class="status {c.status}">{c.status}</span>'
    if c.required_fs is not None:
        rel = "&#x2265;" if c.ok else "&lt;"
        ml = (
            f'<mi mathvariant="italic">FS</mi><mo>=</mo><mfrac>{cap}{d}</mfrac><mo>=</mo><mfrac>{cq}{dq}</mfrac>'
            f"<mo>=</mo><mn>{format_number(c.fs, c.sig)}</mn><mo>{rel}</mo><mn>{format_number(c.required_fs, 3)}</mn>"
        )
        return _row(f"<b>{_e(c.title)}</b>", _m(ml) + " " + status, _e(c.ref), " check")
    rel = "&#x2264;" if c.ok else "&gt;"
    ml = (
        f"<mfrac>{d}{cap}</mfrac><mo>=</mo><mfrac>{dq}{cq}</mfrac><mo>=</mo><mn>{format_number(c.ratio, 3)}</mn>"
        f"<mo>{rel}</mo><mn>{format_number(c.limit, 3)}</mn>"
    )
    out = _row(f"<b>{_e(c.title)}</b>", _m(ml) + " " + status, _e(c.ref), " check")
    if c.show_fs and c.fs is not None:
        fs = f'<mi mathvariant="italic">FS</mi><mo>=</mo><mfrac>{cap}{d}</mfrac><mo>=</mo><mn>{format_number(c.fs, c.sig)}</mn>'
        out += _row("", _m(fs), "", " check")
    return out


def _table(t: TableResult) -> str:
    head = "".join(f"<th>{_e(c)}</th>" for c in t.columns)
    body = "".join("<tr>" + "".join(f"<td>{_e(c)}</td>" for c in row) + "</tr>" for row in t.rows)
    note = f'<div class="note">{_e(t.note)}</div>' if t.note else ""
    return f'<h3>{_e(t.title)}</h3><table class="grid"><thead><tr>{head}</tr></thead><tbody>{body}</tbody></table>{note}'


def _step(step: object) -> str:
    if isinstance(step, GivenResult):
        ml = f"{name_mathml(step.name)}<mo>=</mo>{quantity_mathml(step.value, step.sig)}"
        return _row(_e(step.description), _m(ml), _e(step.source))
    if isinstance(step, FormulaResult):
        return _row(_e(step.description), _formula_ml(step), _e(step.ref))
    if isinstance(step, BranchResult):
        return _branch(step)
    if isinstance(step, SelectResult):
        return _select(step)
    if isinstance(step, CheckResult):
        return _check(step)
    if isinstance(step, HeadingResult):
        return f"<h{step.level + 1}>{_e(step.text)}</h{step.level + 1}>"
    if isinstance(step, TextResult):
        lead = {"assumption": "Assumption", "reference": "Reference"}.get(step.kind, "Note")
        return f'<div class="note"><b>{lead}:</b> {_e(step.text)}</div>'
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
