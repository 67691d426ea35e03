"""Jupyter display of a sheet: a mimebundle that leads with ``text/latex``.

JupyterLab strips MathML from notebooks opened untrusted (stored outputs), while MathJax
always renders ``text/latex``; so the notebook shows LaTeX and the exported submittal uses
MathML. ``text/plain`` carries the terminal form for consoles and diffs.
"""

from __future__ import annotations

from typing import Any

from calcpad.core.results import SheetResult
from calcpad.render.latex import sheet_latex
from calcpad.render.text import sheet_text

__all__ = ["mimebundle"]


def mimebundle(result: SheetResult) -> dict[str, Any]:
    """The display bundle for one evaluated sheet."""
    return {"text/latex": sheet_latex(result), "text/plain": sheet_text(result)}
