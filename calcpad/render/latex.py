"""LaTeX printer for a sheet result (MathJax in Jupyter, Markdown).

Every math row comes from :mod:`calcpad.render.rows` (shared with the MathML printer), already
broken into lines that fit the width budget. :func:`sheet_latex` prints one display block per
row (a block never pushes another row sideways); :func:`row_math_latex` gives a row's math alone,
which the notebook's HTML layout places beside its wrapped label.
"""

from __future__ import annotations

from typing import Any

from calcpad.core.results import FigureResult, HeadingResult, SheetResult, TableResult, TextResult
from calcpad.render.layout import latex_lines, tex_text
from calcpad.render.rows import MathRow, math_rows

__all__ = ["TEXT_LEADS", "row_math_latex", "sheet_latex", "status_latex", "step_blocks", "step_latex", "text_lead", "title_block"]

#: How a note, assumption or reference line starts.
TEXT_LEADS = {"assumption": "Assumption", "reference": "Reference", "note": "Note"}


def text_lead(kind: str) -> str:
    """"Assumption", "Reference" or "Note"."""
    return TEXT_LEADS.get(kind, "Note")


def status_latex(status: str) -> str:
    """OK in bold; NG bold in a box, so it stands out without colour."""
    return r"\boxed{\textbf{NG}}" if status == "NG" else rf"\textbf{{{status}}}"


def row_math_latex(row: MathRow) -> str:
    """The row's math: one line, or an ``array`` of lines (continuations indented); a check's
    verdict follows the last line."""
    lines = latex_lines(row.lines)
    if row.status:
        lines[-1] += r" \quad " + status_latex(row.status)
    if len(lines) == 1:
        return lines[0]
    return r"\begin{array}{l} " + r" \\ ".join(lines) + r" \end{array}"


def step_latex(step: object, rows: Any = ...) -> list[tuple[str, str, str]]:
    """Rows ``(label, math, reference)`` of one step; label and reference as LaTeX text.
    ``rows``: the step's ``math_rows(step)`` when the caller has them already."""
    rows = math_rows(step) if rows is ... else rows
    if rows is not None:
        out = []
        for r in rows:
            label = tex_text(r.label)
            out.append((rf"\mathbf{{{label}}}" if r.strong and label else label, row_math_latex(r), tex_text(r.ref)))
        return out
    if isinstance(step, HeadingResult):
        return [(rf"\mathbf{{{tex_text(step.text)}}}", "", "")]
    if isinstance(step, TextResult):
        return [(tex_text(f"{text_lead(step.kind)}: {step.text}"), "", "")]
    if isinstance(step, TableResult):
        cols = " & ".join(tex_text(c) for c in step.columns)
        body = r" \\ ".join(" & ".join(tex_text(c) for c in row) for row in step.rows)
        table = rf"\begin{{array}}{{{'l' * len(step.columns)}}} {cols} \\ \hline {body} \end{{array}}"
        return [(rf"\mathbf{{{tex_text(step.title)}}}", table, tex_text(step.note))]
    if isinstance(step, FigureResult):
        return [(tex_text(f"Figure: {step.title}"), tex_text("(shown in the submittal)"), "")]
    return []


def _block(label: str, math: str, ref: str) -> str:
    lines = [x for x in (label, math) if x]
    if ref:
        lines.append(r"{\scriptsize [" + ref + "]}")
    body = lines[0] if len(lines) == 1 else r"\begin{array}{l} " + r" \\ ".join(lines) + r" \end{array}"
    return f"$$\n{body}\n$$"


def title_block(title: str) -> str:
    """The sheet title as a display block."""
    return f"$$\n\\mathbf{{{tex_text(title)}}}\n$$"


def step_blocks(step: object, rows: Any = ...) -> str:
    """One step result as display blocks (one per row); empty for a step that prints nothing."""
    return "\n".join(_block(label, math, ref) for label, math, ref in step_latex(step, rows))


def sheet_latex(result: SheetResult) -> str:
    """The sheet as display math, one block per row: label, math lines, reference below."""
    return "\n".join(b for b in [title_block(result.title), *(step_blocks(s) for s in result.steps)] if b)
