"""The interim submittal: one self-contained HTML page for the whole job.

Title block, the caution, a table of contents of calcs, a summary of every check, then every
sheet in run order. (A dedicated submittal issue will replace this page's layout.)
"""

from __future__ import annotations

import html
from typing import Any

from calcpad.render.html import CAUTION, html_document
from calcpad.runner.execute import CalcOutcome
from calcpad.runner.job import Job

__all__ = ["submittal_html"]

_CSS = """
table.block { border-collapse: collapse; margin: .5em 0 1em; width: 100%; }
table.block th { text-align: left; width: 9em; background: #eee; }
table.block th, table.block td { border: 1px solid #999; padding: .2em .5em; }
.caution.prominent { font-size: 1.05em; font-weight: bold; border-width: 3px; }
.banner { border: 3px solid #000; background: #111; color: #fff; padding: .5em .8em; font-weight: bold; }
.calc { break-before: page; }
.error { border: 2px solid #000; padding: .5em; font-family: monospace; white-space: pre-wrap; }
ul.toc { list-style: none; padding-left: 1em; } ul.toc li { margin: .15em 0; }
"""


def _e(text: Any) -> str:
    return html.escape("" if text is None else str(text))


def _anchor(o: CalcOutcome) -> str:
    return f"calc-{o.calc.number}"


def _calc_heading(o: CalcOutcome) -> str:
    title = o.calc.title or o.calc.template.title
    return f"{o.calc.number}. {o.calc.member} — {title}"


def submittal_html(job: Job, outcomes: list[CalcOutcome], record: dict[str, Any]) -> str:
    """Build the submittal page."""
    info = job.info
    parts = [f"<h1>{_e(info.title)}</h1>"]
    rows = [
        ("Job number", info.number),
        ("Client", info.client),
        ("Site", info.site),
        ("Engineer", info.engineer),
        ("Checker", info.checker or "(not yet checked)"),
        ("Revision", info.revision),
        ("Date", info.date),
        ("Codes", ", ".join(info.codes)),
        ("Units", info.units),
    ]
    parts.append('<table class="block">' + "".join(f"<tr><th>{_e(k)}</th><td>{_e(v)}</td></tr>" for k, v in rows) + "</table>")
    parts.append(f'<div class="caution prominent">CAUTION — {_e(CAUTION)}</div>')
    summ = record["summary"]
    if summ["errors"]:
        parts.append(f'<div class="banner">INCOMPLETE: {summ["errors"]} calc(s) failed to run; see below.</div>')
    elif summ["ng"]:
        parts.append(f'<div class="banner">{summ["ng"]} check(s) NG.</div>')
    parts.append("<h2>Contents</h2><ul class=\"toc\">")
    for o in outcomes:
        parts.append(f'<li><a href="#{_anchor(o)}">{_e(_calc_heading(o))}</a> — {_e(o.status)}</li>')
    parts.append("</ul>")
    parts.append('<h2>Summary of checks</h2><table class="grid"><tr><th>Calc</th><th>Member</th><th>Check</th><th>Ratio</th><th>Status</th></tr>')
    for o, c in zip(outcomes, record["calcs"], strict=True):
        if o.error is not None:
            parts.append(f"<tr><td>{o.calc.number}</td><td>{_e(o.calc.member)}</td><td>(calc failed to run)</td><td>—</td><td>ERROR</td></tr>")
        for ch in c["checks"]:
            status = _e(ch["status"])
            parts.append(
                f"<tr><td>{o.calc.number}</td><td>{_e(o.calc.member)}</td><td>{_e(ch['name'])}</td>"
                f'<td>{ch["ratio"]:.3f}</td><td><span class="status {status}">{status}</span></td></tr>'
            )
    parts.append("</table>")
    for o in outcomes:
        parts.append(f'<section class="calc" id="{_anchor(o)}"><h2>{_e(_calc_heading(o))}</h2>')
        parts.append(f"<p>Template <code>{_e(o.calc.template.name)}</code>; input digest <code>{_e(o.calc.input_digest[:16])}</code></p>")
        if o.error is not None:
            cell = o.error.get("cell")
            parts.append(f'<div class="error">Template {_e(o.calc.template.name)}, cell {_e(cell)}: {_e(o.error["message"])}</div>')
        parts.extend(s["html"] for s in o.sheets)
        parts.append("</section>")
    return html_document("\n".join(parts), f"{info.number} {info.title}", extra_css=_CSS)
