"""LaTeX printer for a sheet result: one ``array`` row per step, for MathJax in Jupyter.

Row layout: description | symbolic = substituted = result | reference.
"""

from __future__ import annotations

from calcpad.core.names import name_latex
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
from calcpad.render.expressions import quantity_latex, substituted_latex, symbolic_latex

__all__ = ["REL_LATEX", "formula_line_latex", "sheet_latex", "step_latex"]

REL_LATEX = {"<": "<", "<=": r"\le", ">": ">", ">=": r"\ge"}


def _text(s: str) -> str:
    """Escape plain text for ``\\text{}``."""
    repl = {
        "\\": r"\backslash ",
        "{": r"\{",
        "}": r"\}",
        "$": r"\$",
        "&": r"\&",
        "#": r"\#",
        "%": r"\%",
        "_": r"\_",
        "^": r"\^{}",
        "~": r"\~{}",
    }
    return "".join(repl.get(ch, ch) for ch in s)


def formula_line_latex(f: FormulaResult) -> str:
    """``M = P \\cdot L = 250\\ lbf \\times 84\\ in = 1.750\\ kip \\cdot ft``."""
    sym = symbolic_latex(f.expr)
    if f.expr.is_Number:  # a value written into the formula
        return f"{name_latex(f.name)} = {sym}"
    parts = [name_latex(f.name), sym]
    sub = substituted_latex(f.expr, f.values, f.sigs, f.sig)
    result = quantity_latex(f.value, f.sig)
    if sub not in (sym, result):
        parts.append(sub)
    parts.append(result)
    return " = ".join(parts)


def _condition_latex(b: BranchResult) -> str:
    cond = b.cases[b.tested].condition
    if cond is None or b.condition_sides is None or not hasattr(cond, "rel_op"):
        return ""
    lhs, rhs = b.condition_sides
    rel = REL_LATEX[cond.rel_op]
    if not b.condition_held:  # show the test as it came out
        rel = {r"\le": ">", "<": r"\ge", r"\ge": "<", ">": r"\le"}[rel]
    return rf"{_side(cond.lhs, lhs)} \; {rel} \; {_side(cond.rhs, rhs)}"


def _side(expr: object, value: object) -> str:
    if getattr(expr, "is_Number", False):
        return symbolic_latex(expr)
    return f"{symbolic_latex(expr)} = {quantity_latex(value)}"


def step_latex(step: object) -> list[tuple[str, str, str]]:
    """Rows ``(description, math, reference)`` for one step result."""
    if isinstance(step, GivenResult):
        src = step.source
        return [(_text(step.description), f"{name_latex(step.name)} = {quantity_latex(step.value, step.sig)}", _text(src))]
    if isinstance(step, FormulaResult):
        return [(_text(step.description), formula_line_latex(step), _text(step.ref))]
    if isinstance(step, BranchResult):
        rows = []
        cond = _condition_latex(step)
        label = step.cases[step.chosen].label
        if cond:
            rows.append((_text(step.description), cond + r" \;\Rightarrow\; \text{" + _text(label) + "}", _text(step.ref)))
            rows.append(("", formula_line_latex(step.formula), _text(label)))
        else:
            rows.append((_text(step.description), formula_line_latex(step.formula), _text(label or step.ref)))
        return rows
    if isinstance(step, SelectResult):
        names = ", ".join(name_latex(c.name) for c in step.candidates)
        vals = ", ".join(quantity_latex(c.value, step.sig) for c in step.candidates)
        gov = step.candidates[step.governing]
        math = (
            rf"{name_latex(step.name)} = \{step.mode}\left({names}\right) = \{step.mode}\left({vals}\right) = "
            rf"{quantity_latex(step.value, step.sig)} \;\; \text{{({_text(gov.label)} governs)}}"
        )
        return [(_text(step.description), math, _text(step.ref))]
    if isinstance(step, CheckResult):
        return check_rows_latex(step)
    if isinstance(step, HeadingResult):
        return [(rf"\textbf{{{_text(step.text)}}}", "", "")]
    if isinstance(step, TextResult):
        lead = {"assumption": "Assumption: ", "reference": "Reference: "}.get(step.kind, "Note: ")
        return [(rf"\textit{{{_text(lead + step.text)}}}", "", "")]
    if isinstance(step, TableResult):
        cols = " & ".join(rf"\text{{{_text(c)}}}" for c in step.columns)
        body = r" \\ ".join(" & ".join(rf"\text{{{_text(c)}}}" for c in row) for row in step.rows)
        table = rf"\begin{{array}}{{{'l' * len(step.columns)}}} {cols} \\ \hline {body} \end{{array}}"
        return [(rf"\textbf{{{_text(step.title)}}}", table, _text(step.note))]
    if isinstance(step, FigureResult):
        return [(rf"\text{{Figure: {_text(step.title)}}}", r"\text{(shown in the submittal)}", "")]
    return []


def check_rows_latex(c: CheckResult) -> list[tuple[str, str, str]]:
    """Rows for a check: ratio line, FS line when asked, and the verdict."""
    d, cap = name_latex(c.demand_name), name_latex(c.capacity_name)
    dq, cq = quantity_latex(c.demand, c.sig), quantity_latex(c.capacity, c.sig)
    verdict = r"\textbf{OK}" if c.ok else r"\textbf{NG}"
    rows = []
    if c.required_fs is not None:
        rel = r"\ge" if c.ok else "<"
        math = rf"\mathit{{FS}} = \frac{{{cap}}}{{{d}}} = \frac{{{cq}}}{{{dq}}} = {format_number(c.fs, c.sig, 'latex')} \; {rel} \; {format_number(c.required_fs, 3, 'latex')} \;\; {verdict}"
        rows.append((rf"\textbf{{{_text(c.title)}}}", math, _text(c.ref)))
        return rows
    rel = r"\le" if c.ok else ">"
    math = rf"\frac{{{d}}}{{{cap}}} = \frac{{{dq}}}{{{cq}}} = {format_number(c.ratio, 3, 'latex')} \; {rel} \; {format_number(c.limit, 3, 'latex')} \;\; {verdict}"
    rows.append((rf"\textbf{{{_text(c.title)}}}", math, _text(c.ref)))
    if c.show_fs and c.fs is not None:
        rows.append(("", rf"\mathit{{FS}} = \frac{{{cap}}}{{{d}}} = {format_number(c.fs, c.sig, 'latex')}", ""))
    return rows


#: Characters per display block. MathJax refuses one expression past its internal buffer
#: (about 5 KB after macro expansion), so a sheet prints as several ``array`` blocks.
BLOCK_CHARS = 2500


def _row_latex(desc: str, math: str, ref: str) -> str:
    lead = desc if desc.startswith("\\") or not desc else rf"\text{{{desc}}}"
    tail = rf"{{\scriptsize \text{{[{ref}]}}}}" if ref else ""  # small, so long clause text fits
    return f"{lead} & {math} & {tail}"


def sheet_latex(result: SheetResult) -> str:
    """The sheet as display-math ``array`` blocks: a new block at each heading and whenever a
    block would pass :data:`BLOCK_CHARS` (MathJax renders each block in JupyterLab)."""
    blocks: list[list[str]] = [[_row_latex(rf"\textbf{{{_text(result.title)}}}", "", "")]]
    size = 0
    for step in result.steps:
        rows = [_row_latex(*r) for r in step_latex(step)]
        length = sum(len(r) for r in rows)
        if size > 0 and (isinstance(step, HeadingResult) or size + length > BLOCK_CHARS):
            blocks.append([])
            size = 0
        blocks[-1].extend(rows)
        size += length
    return "\n".join("$$\n\\begin{array}{lll}\n" + " \\\\\n".join(b) + "\n\\end{array}\n$$" for b in blocks if b)
