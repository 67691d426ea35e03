"""Jupyter display of a sheet: an HTML table whose math cells hold LaTeX.

One table row per printed row: the label (wrapping text, the reference below it in small type)
and the math, already broken into lines by :mod:`calcpad.render.rows`, one ``\\( ... \\)`` per
line. JupyterLab typesets LaTeX inside HTML output with MathJax also in untrusted notebooks
(stored outputs), where MathML would be stripped; the table uses only markup its sanitiser keeps
(``width``/``align``/``valign`` attributes, no ``<style>``). The bundle also carries
``text/latex`` (one display block per row) for front ends without HTML and ``text/plain``.
"""

from __future__ import annotations

import html
from typing import Any

from calcpad.core.results import FigureResult, HeadingResult, SheetResult, TableResult, TextResult
from calcpad.render.latex import sheet_latex, status_latex, text_lead
from calcpad.render.layout import latex_lines
from calcpad.render.rows import MathRow, math_rows
from calcpad.render.text import sheet_text

__all__ = ["mimebundle", "rows_notebook_html", "sheet_notebook_html", "step_notebook_rows", "title_notebook_row"]

#: Share of the output width given to the label column.
LABEL_WIDTH = "25%"
_TEXT = 'class="tex2jax_ignore mathjax_ignore"'
_LEFT = "text-align: left; vertical-align: top"


def _e(text: str) -> str:
    return html.escape(text or "")


def _math_cell(row: MathRow) -> str:
    lines = latex_lines(row.lines)
    if row.status:
        lines[-1] += r" \quad " + status_latex(row.status)
    return "".join(f"<div>\\(\\displaystyle {_e(line)}\\)</div>" for line in lines)


def _row(row: MathRow) -> str:
    label = f"<b>{_e(row.label)}</b>" if row.strong and row.label else _e(row.label)
    ref = f"<br><small>[{_e(row.ref)}]</small>" if row.ref else ""
    return (
        f'<tr><td align="left" valign="top" style="{_LEFT}" {_TEXT}>{label}{ref}</td>'
        f'<td align="left" valign="top" style="{_LEFT}">{_math_cell(row)}</td></tr>'
    )


def _wide(content: str, text: bool = True) -> str:
    return f'<tr><td colspan="2" align="left" valign="top" style="{_LEFT}"{" " + _TEXT if text else ""}>{content}</td></tr>'


def _step(step: object, rows: Any = ...) -> str:
    rows = math_rows(step) if rows is ... else rows
    if rows is not None:
        return "".join(_row(r) for r in rows)
    if isinstance(step, HeadingResult):
        return _wide(f"<b>{_e(step.text)}</b>" if step.level == 1 else f"<i><b>{_e(step.text)}</b></i>")
    if isinstance(step, TextResult):
        return _wide(f"<i><b>{text_lead(step.kind)}:</b> {_e(step.text)}</i>")
    if isinstance(step, TableResult):
        head = "".join(f"<th>{_e(c)}</th>" for c in step.columns)
        body = "".join("<tr>" + "".join(f"<td>{_e(c)}</td>" for c in r) + "</tr>" for r in step.rows)
        note = f"<br><small>{_e(step.note)}</small>" if step.note else ""
        return _wide(f"<b>{_e(step.title)}</b><table><thead><tr>{head}</tr></thead><tbody>{body}</tbody></table>{note}")
    if isinstance(step, FigureResult):
        return _wide(f"<i>Figure: {_e(step.title)} (shown in the submittal)</i>")
    return ""


def title_notebook_row(title: str) -> str:
    """The sheet title as a table row."""
    return _wide(f"<b>{_e(title)}</b>")


def step_notebook_rows(step: object, rows: Any = ...) -> str:
    """The table rows (``<tr>``) of one step result; empty for a step that prints nothing.
    ``rows``: the step's ``math_rows(step)`` when the caller has them already."""
    return _step(step, rows)


def rows_notebook_html(rows: list[str]) -> str:
    """Table rows (from :func:`title_notebook_row`, :func:`step_notebook_rows`) as one sheet table."""
    cols = f'<colgroup><col width="{LABEL_WIDTH}"><col></colgroup>'
    return f'<table width="100%" class="calcpad-sheet">{cols}\n' + "\n".join(r for r in rows if r) + "\n</table>"


def sheet_notebook_html(result: SheetResult) -> str:
    """The sheet as one HTML table (label | math), math as LaTeX for MathJax."""
    return rows_notebook_html([title_notebook_row(result.title), *(_step(s) for s in result.steps)])


def mimebundle(result: SheetResult) -> dict[str, Any]:
    """The display bundle for one evaluated sheet."""
    return {"text/html": sheet_notebook_html(result), "text/latex": sheet_latex(result), "text/plain": sheet_text(result)}

