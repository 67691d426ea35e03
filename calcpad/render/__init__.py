"""Printers over the result model: LaTeX, MathML/HTML, plain text, Markdown and the JSON record.

Printers read :class:`calcpad.core.results.SheetResult` and never recompute.
"""

from __future__ import annotations

from calcpad.render.html import html_document, sheet_html_fragment
from calcpad.render.latex import sheet_latex
from calcpad.render.record import sheet_record
from calcpad.render.text import sheet_markdown, sheet_text

__all__ = ["html_document", "sheet_html_fragment", "sheet_latex", "sheet_markdown", "sheet_record", "sheet_text"]
