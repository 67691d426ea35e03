"""The submittal as one self-contained HTML document laid out for print (see :mod:`.styles`).

Order: cover (job, status, cautions, sign-off and seal space, revision log, software and run),
contents (page numbers filled in by :func:`calcpad.report.pdf.write_pdf`), design criteria,
summary of checks (every member), checks by printed calc, then the calcs — identical calcs
printed once as "typical for ..." (:mod:`.grouping`), a large member table once per governing
case (:mod:`.compact`). Print modes: ``full``; ``summary`` (the
governing sheet of each calc only); ``calc:MARK`` (that member's calc only).
"""

from __future__ import annotations

import html
from collections.abc import Iterator
from dataclasses import dataclass
from typing import Any

from calcpad.core.errors import InputError
from calcpad.core.results import status_ok
from calcpad.render.html import CAUTION, CSS
from calcpad.report.compact import COLUMN_ROWS, COMPACT_CSS, SHORT_MARKS, CaseGroup, print_groups
from calcpad.report.grouping import CalcGroup, marks_text, numbers_text
from calcpad.report.styles import band_css, page_css
from calcpad.report.toc import TOC_END
from calcpad.runner.cases import governing_check
from calcpad.runner.execute import CalcOutcome, rerun_calc
from calcpad.runner.job import Job, print_mode
from calcpad.runner.members import results_stems

__all__ = ["CAUTIONS", "submittal_chunks", "submittal_html"]

CAUTIONS = (
    CAUTION,
    "Check the edition of each standard the jurisdiction has adopted against the codes and editions listed here.",
    "Catalog and material values are carried with their sources; verify them against mill certificates and current published tables.",
)


def _e(text: Any) -> str:
    return html.escape("" if text is None else str(text))


@dataclass
class _Entry:
    """One line of the contents."""

    ref: str
    text: str  # as printed in the heading (searched for in the PDF)
    sub: bool = False


@dataclass
class _Context:
    job: Job
    record: dict[str, Any]
    groups: list[CalcGroup]
    printed: list[CalcGroup]
    mode: tuple[str, str]
    toc: list[_Entry]


def _run_date(record: dict[str, Any]) -> str:
    created = str(record.get("run", {}).get("created", ""))
    return created.replace("T", " ").replace("+00:00", " UTC")


def _digest_short(record: dict[str, Any]) -> str:
    return str(record.get("record_digest", ""))[:12]


#: Marks a calc heading names before "and N more" (the typical box under it lists them all).
HEADING_MARKS = 6


def _heading_text(g: CalcGroup) -> str:
    if isinstance(g, CaseGroup):
        return f"{g.label} · {g.title} — governing member {g.first.calc.member} of {len(g.outcomes):,}"
    who = f"typical for {marks_text(g.marks, HEADING_MARKS)}" if g.typical else f"member {g.marks[0]}"
    return f"{numbers_text(g.numbers)} · {g.title} — {who}"


def _status_mark(status: str) -> str:
    if status == "NG":
        return '<span class="mark-ng">NG</span>'
    if status == "ERROR":
        return '<span class="mark-error">FAILED</span>'
    return _e(status)


def _ratio(value: Any) -> str:
    return "—" if value is None else f"{value:.3f}"


# ----------------------------------------------------------------------------- cover


def _status_line(record: dict[str, Any], groups: list[CalcGroup]) -> str:
    s = record["summary"]
    members = sum(len(g.outcomes) for g in groups)
    text = f"{s['calcs']} calcs for {members} members, {s['checks']} checks: {s['ok']} OK, {s['ng']} NG"
    if s["errors"]:
        return f'<div class="status-line bad">INCOMPLETE: {s["errors"]} calc(s) failed to run (marked FAILED in the summary). {_e(text)}.</div>'
    if s["ng"]:
        return f'<div class="status-line bad">{s["ng"]} check(s) NG (boxed in the summary). {_e(text)}.</div>'
    return f'<div class="status-line">{_e(text)}.</div>'


def _revision_log(c: _Context) -> str:
    info = c.job.info
    rows = c.job.info.revisions or [{"rev": info.revision, "date": info.date, "description": "(no revision log in the job file)", "by": ""}]
    body = "".join(
        f"<tr><td>{_e(r['rev'])}</td><td>{_e(r['date'])}</td><td>{_e(r['description'])}</td><td>{_e(r['by'])}</td></tr>" for r in rows
    )
    return f'<h2>Revision log</h2><table class="list"><thead><tr><th>Rev</th><th>Date</th><th>Description</th><th>By</th></tr></thead><tbody>{body}</tbody></table>'


def _cover(c: _Context) -> str:
    info, record = c.job.info, c.record
    facts = [
        ("Job number", info.number),
        ("Client", info.client),
        ("Site", info.site),
        ("Engineer of record", info.engineer),
        ("Checked by", info.checker or "(not yet checked)"),
        ("Revision", info.revision),
        ("Date issued", info.date),
        ("Codes and editions", "; ".join(info.codes) or "(none given in the job file)"),
        ("Units", {"US": "US customary", "SI": "SI"}.get(info.units, info.units)),
    ]
    mode = {"full": "full (every sheet)", "summary": "summary (governing sheet of each calc)"}.get(c.mode[0], f"one calc (member {c.mode[1]})")
    facts.append(("Printed", mode))
    rows = "".join(f"<tr><th>{_e(k)}</th><td>{_e(v)}</td></tr>" for k, v in facts)
    cautions = "".join(f"<p>{_e(t)}</p>" for t in CAUTIONS)
    people = (("Prepared by", info.engineer), ("Checked by", info.checker), ("Approved by", ""))
    sign = (
        '<div class="signoff"><table>'
        + "".join(
            f'<tr><td class="who"><small>{_e(role)}</small><br>{_e(name) or "&nbsp;"}</td>'
            '<td class="line"><small>Signature</small></td><td class="line date"><small>Date</small></td></tr>'
            for role, name in people
        )
        + '</table><div class="seal">Seal and signature<br>of the engineer of record</div></div>'
    )
    v = record.get("versions", {})
    libs = ", ".join(f"{k} {v[k]}" for k in ("python", "pint", "sympy", "numpy") if k in v)
    digest = record.get("record_digest", "")
    software = (
        f'<p class="software">Produced by calcpad {_e(v.get("calcpad", "?"))} ({_e(libs)}), run {_e(_run_date(record))}'
        f" from job file <code>{_e(c.job.source)}</code>."
        + (f" Record digest <code>{_e(digest)}</code> (record.json)." if digest else "")
        + "</p>"
    )
    return (
        f'<section class="cover"><h1>{_e(info.title)}</h1><p class="lead">Structural calculations · {_e(info.number)}</p>'
        f'<table class="facts">{rows}</table>{_status_line(record, c.groups)}'
        f'<div class="cautions"><p><b>CAUTION</b></p>{cautions}</div>{sign}{_revision_log(c)}{software}</section>'
    )


# ----------------------------------------------------------------------------- contents, criteria, summary


def _contents(c: _Context) -> str:
    lines = []
    for entry in c.toc:
        cls = "toc-entry sub" if entry.sub else "toc-entry"
        lines.append(
            f'<a class="{cls}" href="#{entry.ref}"><span class="toc-title">{_e(entry.text)}</span><span class="toc-fill"></span>'
            f'<span class="toc-page" data-ref="{entry.ref}" data-find="{_e(entry.text)}"></span></a>'
        )
    return f'<section class="contents"><h2>Contents</h2>{"".join(lines)}<p class="toc-end">{_e(TOC_END)}</p></section>'


def _h2(ref: str, text: str) -> str:
    return f'<h2 id="{ref}">{_e(text)}</h2>'


def _tables_printed(c: _Context) -> list[str]:
    """The job's member tables with a member among the printed calcs, in job order."""
    used = {o.calc.table for g in c.printed for o in g.outcomes}
    return [name for name in c.job.tables if name in used]


def _toc(c: _Context) -> list[_Entry]:
    """Every line of the contents, in document order (worked out before anything is printed, so
    the contents can precede the sections and the sections can be streamed)."""
    toc = [_Entry("criteria", "Design criteria"), _Entry("summary", "Summary of checks")]
    toc += [_Entry(f"table-{k}", f"Member table {name}") for k, name in enumerate(_tables_printed(c), start=1)]
    toc.append(_Entry("checks", "Every check"))
    for g in c.printed:
        toc.append(_Entry(g.anchor, _heading_text(g)))
        sheets, _note = _sheets_to_print(g, c.mode[0])
        if len(sheets) > 1:
            toc += [_Entry(f"{g.anchor}-s{k}", s.title, sub=True) for k, s in enumerate(sheets, start=1)]
    return toc


def _criteria(c: _Context) -> str:
    info = c.job.info
    methods = sorted({s.method for g in c.groups for s in g.first.sheets if s.method})
    templates: dict[str, tuple[str, list[str]]] = {}
    for g in c.groups:
        t = g.first.calc.template
        templates.setdefault(t.name, (t.title, []))[1].extend(g.marks)
    rows = "".join(f"<tr><td><code>{_e(n)}</code></td><td>{_e(t)}</td><td>{_e(marks_text(m, SHORT_MARKS))}</td></tr>" for n, (t, m) in templates.items())
    typical = [g for g in c.groups if g.typical]
    typ = (
        "<p>Members with the same template, title and inputs are printed once as typical: "
        + "; ".join(f"{_e(', '.join(g.marks))} ({_e(g.title)})" for g in typical)
        + ". The summary lists every member.</p>"
        if typical
        else ""
    )
    basis = "".join(f"<li>{_e(b)}</li>" for b in info.basis)
    assumed: dict[str, dict[str, None]] = {}  # each assumption once, with the members whose sheets state it
    for g in c.groups:
        for s in g.first.sheets:
            for text in s.assumptions:
                assumed.setdefault(text, {}).update(dict.fromkeys(g.marks))
    assumptions = "".join(f"<li>{_e(t)} <i>({_e(marks_text(list(m), SHORT_MARKS))})</i></li>" for t, m in assumed.items())
    return (
        _h2("criteria", "Design criteria")
        + (f'<h3>Design basis</h3><ul class="basis">{basis}</ul>' if basis else "")
        + (f'<h3>Model assumptions (stated on each calc)</h3><ul class="basis">{assumptions}</ul>' if assumptions else "")
        + f'<table class="facts"><tr><th>Codes and editions</th><td>{_e("; ".join(info.codes) or "(none given)")}</td></tr>'
        + f"<tr><th>Design method</th><td>{_e(', '.join(methods) or '(as stated on each sheet)')}</td></tr>"
        + f"<tr><th>Display units</th><td>{_e(info.units)}</td></tr></table>"
        + f'<table class="list"><thead><tr><th>Template</th><th>What it checks</th><th>Members</th></tr></thead><tbody>{rows}</tbody></table>'
        + typ
    )


def _summary(c: _Context) -> Iterator[str]:
    head = "<tr><th>Calc</th><th>Member</th><th>Calc title</th><th>Governing check</th><th>Ratio</th><th>Status</th><th>Page</th></tr>"
    yield _h2("summary", "Summary of checks") + f'<table class="list"><thead>{head}</thead><tbody>'
    for g in c.printed:
        for o in [g.first] if isinstance(g, CaseGroup) else g.outcomes:  # a case: its governing member
            gov = governing_check(o.checks)
            cls = ' class="ng"' if o.status != "OK" else ""
            if o.error is not None:
                check = f"calc failed to run (cell {o.error.get('cell')})"
            else:
                check = gov["name"] if gov else "(no checks)"
            member = f"{o.calc.member} (governs {g.label}: {len(g.outcomes):,} members)" if isinstance(g, CaseGroup) else o.calc.member
            yield (
                f'<tr{cls}><td class="num">{o.calc.number}</td><td>{_e(member)}</td><td>{_e(g.title)}</td>'
                f'<td>{_e(check)}</td><td class="num">{_ratio(gov["ratio"] if gov else None)}</td>'
                f'<td class="st">{_status_mark(o.status)}</td><td class="num"><span class="toc-page" data-ref="{g.anchor}" data-find="{_e(_heading_text(g))}"></span></td></tr>'
            )
    yield "</tbody></table>"


def _member_table_row(o: CalcOutcome, g: CalcGroup, design: bool) -> str:
    gov = governing_check(o.checks)
    res = (o.calc.design or {}).get("result")
    chosen = (res or {}).get("chosen") or {}
    runner = (res or {}).get("runner_up") or {}
    size = " ".join(x for x in (chosen.get("designation"), chosen.get("grade")) if x) if res else ""
    alt = " ".join(x for x in (runner.get("designation"), runner.get("grade")) if x) if res else ""
    if res is not None and not chosen:
        size = "none passes"
    cls = ' class="ng"' if o.status != "OK" else ""
    gsheet = gov["sheet"] if gov else ""
    return (
        f'<tr{cls}><td>{_e(o.calc.member)}</td><td class="num">{o.calc.row}</td>'
        + (f"<td>{_e(size)}</td><td>{_e(alt)}</td>" if res is not None else ("<td></td><td></td>" if design else ""))
        + f'<td>{_e(gov["name"] if gov else "(no checks)")}</td><td class="num">{_ratio(gov["ratio"] if gov else None)}</td>'
        f'<td class="st">{_status_mark(o.status)}</td><td>{_e(gsheet)}</td>'
        f'<td class="num"><span class="toc-page" data-ref="{g.anchor}" data-find="{_e(_heading_text(g))}"></span></td></tr>'
    )


def _case_note(g: CaseGroup) -> str:
    gov = g.check
    marks = ", ".join(o.calc.member for o in g.outcomes)
    return (
        f'<div class="typical">{_e(g.label)} of member table {_e(g.table)}: {len(g.outcomes):,} members whose governing check is '
        f'{_e(gov["name"] if gov else "(none)")} (status {_e(g.first.status)}). The sheets below are worked for '
        f'{_e(g.first.calc.member)}, the member of the case with the highest ratio ({_ratio(gov["ratio"] if gov else None)}); '
        f'the member table gives every member\'s ratio. Members: <span class="case-members">{_e(marks)}</span></div>'
    )


def _case_cell(g: CalcGroup) -> str:
    return g.label if isinstance(g, CaseGroup) else f"calc {g.first.calc.number}"


def _compact_member_table(members: list[tuple[CalcOutcome, CalcGroup]], design: bool) -> Iterator[str]:
    """The cases of a large table (one line each, with the page of its sheets), then every member
    on a few lines per inch: row, ratio, status and case (the governing check is the case's)."""
    cases = list({id(g): g for _o, g in members}.values())
    head = ("<tr><th>Case</th><th>Governing check</th><th>Inputs in words</th><th>Status</th><th>Members</th>"
            "<th>Printed member</th><th>Ratio</th><th>Page</th></tr>")
    yield f'<table class="list"><thead>{head}</thead><tbody>'
    for g in cases:
        o = g.first
        gov = governing_check(o.checks)
        params = o.calc.template.parameters
        words = ", ".join(f"{n} = {v}" for n, v in o.calc.inputs.items() if n in params and params[n].kind == "text" and n != "member_mark")
        check = gov["name"] if gov else f"calc failed to run (cell {o.error.get('cell')})" if o.error else "(no checks)"
        cls = ' class="ng"' if o.status != "OK" else ""
        yield (f'<tr{cls}><td>{_e(_case_cell(g))}</td><td>{_e(check)}</td><td>{_e(words)}</td><td class="st">{_status_mark(o.status)}</td>'
               f'<td class="num">{len(g.outcomes):,}</td><td>{_e(o.calc.member)}</td><td class="num">{_ratio(gov["ratio"] if gov else None)}</td>'
               f'<td class="num"><span class="toc-page" data-ref="{g.anchor}" data-find="{_e(_heading_text(g))}"></span></td></tr>')
    yield "</tbody></table>"
    head = "<tr><th>Member</th><th>Row</th>" + ("<th>Size</th>" if design else "") + "<th>Ratio</th><th>Status</th><th>Case</th></tr>"
    yield '<div class="members-compact">'
    for k, (o, g) in enumerate(sorted(members, key=lambda m: m[0].calc.number)):
        if k % COLUMN_ROWS == 0:
            yield ("</tbody></table>" if k else "") + f"<table><thead>{head}</thead><tbody>"
        gov = governing_check(o.checks)
        chosen = ((o.calc.design or {}).get("result") or {}).get("chosen") or {}
        size = f"<td>{_e(chosen.get('designation', ''))}</td>" if design else ""
        cls = ' class="ng"' if o.status != "OK" else ""
        yield (f'<tr{cls}><td>{_e(o.calc.member)}</td><td class="num">{o.calc.row}</td>{size}<td class="num">{_ratio(gov["ratio"] if gov else None)}</td>'
               f"<td>{_status_mark(o.status)}</td><td>{_e(_case_cell(g))}</td></tr>")
    yield ("</tbody></table>" if members else "") + "</div>"


def _member_tables(c: _Context) -> Iterator[str]:
    """One table per member table of the job: each member's row, size (chosen by a design search
    where there is one), governing check and the page of its sheet."""
    try:
        stems = results_stems(list(c.job.tables))
    except InputError:  # refused before a run writes anything; a page made directly still prints
        stems = {}
    for k, name in enumerate(_tables_printed(c), start=1):
        members = [(o, g) for g in c.printed for o in g.outcomes if o.calc.table == name]
        design = any((o.calc.design or {}).get("result") is not None for o, _g in members)
        head = ("<tr><th>Member</th><th>Row</th>" + ("<th>Size (lightest passing)</th><th>Runner-up</th>" if design else "")
                + "<th>Governing check</th><th>Ratio</th><th>Status</th><th>Governing sheet</th><th>Page</th></tr>")
        note = (f'<p>Every check ratio of every member: {_e(stems.get(name, "results"))}.csv and .xlsx beside this submittal.'
                + (" Sizes chosen by a design search: the lightest catalog size by weight per foot with every check OK; "
                   "each member's sheet is printed with that size." if design else "") + "</p>")
        if any(isinstance(g, CaseGroup) for _o, g in members):
            yield _h2(f"table-{k}", f"Member table {name}") + note + (
                f"<p>{len(members):,} members, printed once per governing case: the members of a case share the "
                "template, the inputs in words (such as the section), the governing check and the status; each case "
                "prints the sheets of its member with the highest ratio.</p>")
            yield from _compact_member_table(members, design)
            continue
        yield _h2(f"table-{k}", f"Member table {name}") + note + f'<table class="list"><thead>{head}</thead><tbody>'
        for o, g in members:
            yield _member_table_row(o, g, design)
        yield "</tbody></table>"


def _members_cell(g: CalcGroup) -> str:
    if isinstance(g, CaseGroup):
        return f"{g.label}: {g.first.calc.member} (governing of {len(g.outcomes):,})"
    return ", ".join(g.marks)


def _all_checks(c: _Context) -> Iterator[str]:
    head = "<tr><th>Members</th><th>Check</th><th>Ratio</th><th>Status</th><th>Reference</th></tr>"
    yield _h2("checks", "Every check") + f'<table class="list"><thead>{head}</thead><tbody>'
    for g in c.printed:
        for ch in g.first.checks:
            cls = ' class="ng"' if not status_ok(ch["status"]) else ""
            yield (
                f"<tr{cls}><td>{_e(_members_cell(g))}</td><td>{_e(ch['name'])}</td><td class=\"num\">{_ratio(ch['ratio'])}</td>"
                f"<td class=\"st\">{_status_mark(ch['status'])}</td><td>{_e(ch['ref'])}</td></tr>"
            )
    yield "</tbody></table>"


# ----------------------------------------------------------------------------- calcs


def _sheets_to_print(g: CalcGroup, mode: str) -> tuple[list[dict[str, Any]], str]:
    sheets = g.first.sheets
    if mode != "summary" or len(sheets) <= 1:
        return sheets, ""
    gov = governing_check(g.first.checks)
    chosen = next((s for s in sheets if gov and s.title == gov["sheet"]), sheets[0])
    note = f"Summary print: the governing sheet only ({chosen.title}; 1 of {len(sheets)} sheets). The full submittal prints every sheet."
    return [chosen], note


def _calc_section(c: _Context, g: CalcGroup, index: int) -> Iterator[str]:
    o = g.first
    heading = _heading_text(g)
    parts = [f'<section class="calc" id="{g.anchor}" style="page: g{index}"><h2>{_e(heading)}</h2>']
    parts.append(f'<p class="calc-meta">Template <code>{_e(o.calc.template.name)}</code> ({_e(o.calc.template.title)}) · status {_status_mark(o.status)}</p>')
    if isinstance(g, CaseGroup):
        parts.append(_case_note(g))
    if g.typical:
        parts.append(
            f'<div class="typical">Typical: members {_e(", ".join(g.marks))} ({_e(numbers_text(g.numbers).lower())}) have the same template and '
            f"the same inputs and give the same results; the sheets below, worked for {_e(g.marks[0])}, stand for each of them.</div>"
        )
    if o.error is not None:
        parts.append(f'<div class="calc-error">Template {_e(o.calc.template.name)}, cell {_e(o.error.get("cell"))}: {_e(o.error["message"])}</div>')
    sheets, note = _sheets_to_print(g, c.mode[0])
    if note:
        parts.append(f'<p class="calc-meta">{_e(note)}</p>')
    yield "".join(parts)
    again = None
    for s in sheets:
        if s.has_html:
            yield s["html"]  # read back from the spool one sheet at a time when the run kept one
            continue
        again = again or rerun_calc(c.job, o.calc)  # a member whose HTML the run did not keep (calc:MARK)
        yield again.sheets[next(k for k, t in enumerate(o.sheets) if t is s)]["html"]
    yield "</section>"


def _band(g: CalcGroup) -> tuple[str, str]:
    """The band's calc title and its one detail line (the heading on the page names the marks)."""
    if isinstance(g, CaseGroup):
        return g.title, f"{g.label} · governing member {g.first.calc.member} of {len(g.outcomes):,}"
    who = f"typical for {len(g.marks)} members" if g.typical else f"member {g.marks[0]}"
    return g.title, f"{numbers_text(g.numbers)} · {who}"


# ----------------------------------------------------------------------------- document


def submittal_chunks(job: Job, outcomes: list[CalcOutcome], record: dict[str, Any], mode: str | None = None) -> Iterator[str]:
    """The submittal page for ``outcomes`` in pieces, in document order (print ``mode``: the job's
    setting when None). Each calc's sheets are read when their section is reached, so a writer
    that streams the pieces to a file never holds the whole page."""
    parsed = print_mode(mode or job.info.print) or ("full", "")
    groups = print_groups(outcomes, compact=parsed[0] != "calc")  # calc:MARK prints that member, whatever its ratio
    printed = [g for g in groups if parsed[0] != "calc" or parsed[1] in g.marks]
    c = _Context(job, record, groups, printed, parsed, [])
    c.toc = _toc(c)
    info = job.info
    digest = _digest_short(record)
    version = record.get("versions", {}).get("calcpad", "?")
    footer = (
        f"record {digest or '(no digest)'} · calcpad {version} · run {_run_date(record)[:10]}",
        "For review by a qualified, licensed engineer. Local codes and the authority having jurisdiction govern.",
    )
    css = page_css(info.paper, (f"Job {info.number}", info.title), f"Rev {info.revision or '—'} · {info.date or 'undated'}", footer)
    css += band_css("cover", "Cover and sign-off", "", info.paper)
    css += band_css("front", "Contents, design criteria and summary", "", info.paper)
    title = f"{info.number} {info.title}"
    yield f'<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8"><title>{_e(title)}</title><style>{CSS}{css}{COMPACT_CSS}'
    for i, g in enumerate(printed, start=1):
        yield band_css(f"g{i}", *_band(g), info.paper)
    yield "</style></head>\n<body>\n"
    yield _cover(c)
    yield _contents(c)
    yield '<section class="front">' + _criteria(c)
    yield from _summary(c)
    yield from _member_tables(c)
    yield from _all_checks(c)
    yield "</section>"
    for i, g in enumerate(printed, start=1):
        yield from _calc_section(c, g, i)
    yield "\n</body></html>\n"


def submittal_html(job: Job, outcomes: list[CalcOutcome], record: dict[str, Any], mode: str | None = None) -> str:
    """The submittal page for ``outcomes`` as one text (see :func:`submittal_chunks`)."""
    return "".join(submittal_chunks(job, outcomes, record, mode))
