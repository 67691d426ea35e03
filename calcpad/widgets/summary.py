"""The check summary of an evaluated sheet: plain rows, an HTML table and text.

The governing check is marked (highlighted row and "(governs)" in HTML, ``*`` in text); NG is
bold and red in HTML and spelled out in every form, so it is unmistakable without colour.
"""

from __future__ import annotations

import html
from typing import Any

from calcpad.core.results import SheetResult
from calcpad.core.units import format_number

__all__ = ["summary_html", "summary_rows", "summary_text"]

_GOVERNING_STYLE = "font-weight:bold;background:#fff3c4"
_NG_STYLE = "color:#b00020;font-weight:bold"


def _ratio_text(ratio: float) -> str:
    return format_number(ratio, 3)


def summary_rows(result: SheetResult) -> list[dict[str, Any]]:
    """The check summary as plain rows: check, ratio, FS, status, governing (bool)."""
    governing = result.governing
    return [
        {
            "check": c.title,
            "ratio": c.ratio,
            "fs": c.fs,
            "status": c.status,
            "governing": c is governing,
        }
        for c in result.checks
    ]


def _fs_text(c: dict[str, Any]) -> str:
    return "" if c["fs"] is None else format_number(c["fs"], 3)


def summary_html(result: SheetResult) -> str:
    """The check summary as an HTML table, the governing check highlighted."""
    rows = summary_rows(result)
    if not rows:
        return "<p><em>This sheet has no checks.</em></p>"
    has_fs = any(r["fs"] is not None for r in rows)
    head = "<th>check</th><th>ratio</th>" + ("<th>FS</th>" if has_fs else "") + "<th>status</th>"
    body = []
    for r in rows:
        style = f' style="{_GOVERNING_STYLE}"' if r["governing"] else ""
        status = html.escape(r["status"]) if r["status"] != "NG" else f'<span style="{_NG_STYLE}">NG</span>'
        title = html.escape(r["check"]) + (" (governs)" if r["governing"] else "")
        cells = f"<td>{title}</td><td>{_ratio_text(r['ratio'])}</td>"
        cells += f"<td>{_fs_text(r)}</td>" if has_fs else ""
        body.append(f"<tr{style}>{cells}<td>{status}</td></tr>")
    return f'<table class="calcpad-whatif"><thead><tr>{head}</tr></thead><tbody>{"".join(body)}</tbody></table>'


def summary_text(result: SheetResult) -> str:
    """The check summary as plain text, the governing check marked with ``*``."""
    rows = summary_rows(result)
    if not rows:
        return "This sheet has no checks."
    lines = []
    for r in rows:
        fs = f"  FS = {_fs_text(r)}" if r["fs"] is not None else ""
        mark = "*" if r["governing"] else " "
        lines.append(f"{mark} {r['check']}: ratio = {_ratio_text(r['ratio'])}{fs}  {r['status']}")
    return "\n".join(lines)
