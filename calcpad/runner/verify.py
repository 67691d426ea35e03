"""Verify a job record: is it intact, and do today's templates and data reproduce it?

:func:`verify_record` answers four questions about a record read back from disk:

1. *record intact*: its ``record_digest`` equals the digest recomputed over its content, its
   job file text matches the job file digest, the fields derived from others agree (each calc's
   ``results``/``checks`` with its sheets, ``summary`` with the calcs, ``templates`` with the
   calcs) and the title block and calc titles agree with the job text; a hand edit of any field
   breaks the digest, and these comparisons name the field where they can;
2. *templates unchanged*: each template the calcs used has the same source digest now;
3. *data unchanged*: every shipped catalog and material file has the same digest now;
4. *results reproduced*: the calcs re-run in-process from the record's own job text (or, for a
   ``--set`` run, its template and typed values) give the same inputs, the same calcs, the same
   check statuses and every sheet value within a relative tolerance (default 1e-9).

Differences are found by :func:`calcpad.runner.diff.diff_records` (recorded → now), so each is
listed by calc, sheet and step with the recorded and the new value. The digest is a seal against
accidental or hand edits, not a signature: someone who rewrites a record can recompute it.
"""

from __future__ import annotations

import hashlib
import json
import time
from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from calcpad.core.errors import CalcpadError
from calcpad.core.results import status_ok
from calcpad.runner.diff import Change, RecordDiff, diff_records, diff_table
from calcpad.runner.record import calc_results_and_checks, job_summary, record_digest, template_list

__all__ = ["DEFAULT_RTOL", "VerifyReport", "rerun_record", "verify_record", "verify_renderables"]

DEFAULT_RTOL = 1e-9


@dataclass
class VerifyReport:
    """What :func:`verify_record` found."""

    stored_digest: str
    computed_digest: str
    rtol: float
    problems: list[str] = field(default_factory=list)  # integrity problems found without re-running
    fields: list[Change] = field(default_factory=list)  # record fields that disagree with the rest or the re-run
    rerun_error: str | None = None  # the job could not be rebuilt from the record
    diff: RecordDiff | None = None  # recorded → now
    path: Path | None = None

    @property
    def record_intact(self) -> bool:
        """The stored digest matches the content and the job text matches its digest."""
        return self.stored_digest == self.computed_digest and not self.problems and not self.fields

    @property
    def templates_unchanged(self) -> bool:
        """Every template the calcs used has its recorded digest."""
        return self.diff is not None and not self.diff.templates

    @property
    def data_unchanged(self) -> bool:
        """Every shipped data file has its recorded digest."""
        return self.diff is not None and not self.diff.data

    @property
    def results_reproduced(self) -> bool:
        """The re-run gave the same calcs, inputs, statuses and values (within ``rtol``)."""
        d = self.diff
        return self.rerun_error is None and d is not None and not (d.added or d.removed or d.inputs or d.flips or d.results)

    @property
    def ok(self) -> bool:
        """All four answers are yes."""
        return self.record_intact and self.templates_unchanged and self.data_unchanged and self.results_reproduced


def rerun_record(record: dict[str, Any], templates: Sequence[str | Path] = ()) -> dict[str, Any]:
    """Re-run the record's calcs in-process with the installed templates; the new record.

    ``templates``: extra library folders (``--templates``), searched before the ones the record names.

    Raises CalcpadError when the job cannot be rebuilt (template gone, job text no longer valid).
    """
    from calcpad.runner.execute import run_job
    from calcpad.runner.job import parse_job, single_template_job
    from calcpad.runner.record import job_record

    jf = record.get("job_file") or {}
    recorded = jf.get("library") if isinstance(jf.get("library"), list) else []
    library = [*templates, *(d for d in recorded if isinstance(d, str) and Path(d).is_dir())]
    text = jf.get("text")
    if isinstance(text, str):
        tables = {t.get("name"): t for t in jf.get("tables") or [] if isinstance(t, dict)}
        job = parse_job(text, str(jf.get("source") or "job text in the record"), library, tables=tables,
                        shop_table=recorded_shop_table(record))
    else:
        calcs = record.get("calcs") or []
        if len(calcs) != 1 or not isinstance(jf.get("source"), str):
            raise CalcpadError("the record holds no job text and is not a one-template --set run; cannot rebuild its calcs")
        c = calcs[0]
        inputs = c.get("inputs") if isinstance(c.get("inputs"), dict) else {}
        sets = [f"{n}={i['typed']}" for n, i in inputs.items() if isinstance(i, dict) and i.get("typed") is not None]
        job = single_template_job(jf["source"], sets, member=str(c.get("member", "-")), templates=library)
    from calcpad.runner.search import resolve_designs
    from calcpad.runner.spool import RunSpool

    start = time.perf_counter()
    resolve_designs(job)
    spool = RunSpool(html=False)  # the calcs' records wait there (memory flat); closed with the record's last reference
    outcomes = run_job(job, mode="inprocess", progress=spool.keep, html=False)
    return job_record(job, outcomes, "inprocess", time.perf_counter() - start)


def recorded_shop_table(record: dict[str, Any]) -> Any:
    """The shop table held in the record (validated again from its text), or None.

    Raises CalcpadError when the text no longer matches its digest or no longer validates.
    """
    block = record.get("shop_sections")
    if block is None:
        return None
    from calcpad.eng.sections.shop import read_shop_table

    text = block.get("text") if isinstance(block, dict) else None
    if not isinstance(text, str):
        raise CalcpadError("the record's shop_sections block holds no table text; cannot rebuild its sections")
    if hashlib.sha256(text.encode("utf-8")).hexdigest() != block.get("sha256"):
        raise CalcpadError("the shop table text in the record does not match its recorded digest (shop_sections.sha256)")
    return read_shop_table(text, str(block.get("file") or "shop table in the record"))


_SUMMARY_FIELDS = ("template", "template_file", "template_sha256")
_RERUN_CALC_FIELDS = ("number", "location", "title", "template_title", "template_file", "member", "template")


def _text(value: Any) -> str:
    text = json.dumps(value, ensure_ascii=False, sort_keys=True) if not isinstance(value, str) else value
    return text if len(text) <= 60 else text[:57] + "..."


def _leaf_diffs(a: Any, b: Any, path: str = "") -> list[tuple[str, Any, Any]]:
    """``(path, a_leaf, b_leaf)`` wherever two JSON values differ (exactly)."""
    if isinstance(a, dict) and isinstance(b, dict):
        out = []
        for k in [*a, *(k for k in b if k not in a)]:
            out += _leaf_diffs(a.get(k), b.get(k), f"{path} › {k}" if path else str(k))
        return out
    if isinstance(a, list) and isinstance(b, list) and len(a) == len(b):
        return [d for i, (x, y) in enumerate(zip(a, b, strict=True)) for d in _leaf_diffs(x, y, f"{path}[{i}]")]
    return [] if a == b else [(path, a, b)]


def _derived_fields(record: dict[str, Any]) -> list[Change]:
    """Fields of ``record`` that disagree with what the rest of the record implies."""
    out: list[Change] = []
    calcs = record.get("calcs") or []
    from_sheets = []  # the calcs as their sheets say they are
    for i, c in enumerate(calcs):
        label = f"{c.get('member', '?')} ({c.get('template', '?')})"
        try:
            results, checks = calc_results_and_checks(c["sheets"])
        except (KeyError, TypeError):
            out.append(Change(label, f"calcs[{i + 1}].sheets", "malformed", "a list of sheet records"))
            continue
        status = "ERROR" if c.get("error") is not None else "NG" if any(not status_ok(ch["status"]) for ch in checks) else "OK"
        # what the summary and template list are derived from (not the sheets: one calc held at a time)
        from_sheets.append({**{k: c.get(k) for k in _SUMMARY_FIELDS}, "checks": [{"status": ch["status"]} for ch in checks], "status": status})
        for key, derived in (("results", results), ("checks", checks), ("status", status)):
            for path, stored, now in _leaf_diffs(c.get(key), derived, key):
                out.append(Change(label, path, _text(stored), _text(now), "from its own sheets"))
    for key, derive in (("summary", job_summary), ("templates", template_list)):
        try:
            derived = derive(from_sheets)
        except (KeyError, TypeError):
            out.append(Change("", key, "cannot be derived", "calcs are malformed"))
            continue
        for path, stored, now in _leaf_diffs(record.get(key), derived, key):
            out.append(Change("", path, _text(stored), _text(now), "from the calcs"))
    return out


def _rerun_fields(record: dict[str, Any], new: dict[str, Any]) -> list[Change]:
    """Title block and calc fields that disagree with the re-run of the record's job text."""
    out = [Change("", path, _text(a), _text(b), "from the job text") for path, a, b in _leaf_diffs(record.get("job"), new.get("job"), "job")]
    olds = {(c.get("template"), c.get("member")): {k: c.get(k) for k in _RERUN_CALC_FIELDS} for c in record.get("calcs") or []}
    for c in new.get("calcs") or []:
        old = olds.get((c.get("template"), c.get("member")))
        if old is None:
            continue
        label = f"{c.get('member')} ({c.get('template')})"
        for key in _RERUN_CALC_FIELDS:
            if old.get(key) != c.get(key):
                out.append(Change(label, key, _text(old.get(key)), _text(c.get(key)), "from the job text"))
    return out


def verify_record(record: dict[str, Any], rtol: float = DEFAULT_RTOL, path: Path | None = None, templates: Sequence[str | Path] = ()) -> VerifyReport:
    """Check a record read back from disk (see the module docstring)."""
    stored = record.get("record_digest")
    try:
        computed = record_digest(record)
    except (TypeError, ValueError) as exc:  # a hand-edited record may hold NaN or odd types
        computed = f"cannot be computed ({exc})"
    report = VerifyReport(str(stored), computed, rtol, path=path)
    jf = record.get("job_file") or {}
    text, sha = jf.get("text"), jf.get("sha256")
    if isinstance(text, str) and hashlib.sha256(text.encode("utf-8")).hexdigest() != sha:
        report.problems.append("the job file text does not match its recorded digest (job_file.sha256)")
    shop = record.get("shop_sections")
    if isinstance(shop, dict) and isinstance(shop.get("text"), str) and hashlib.sha256(shop["text"].encode("utf-8")).hexdigest() != shop.get("sha256"):
        report.problems.append("the shop table text does not match its recorded digest (shop_sections.sha256)")
    report.fields = _derived_fields(record)
    try:
        new = rerun_record(record, templates)
    except CalcpadError as exc:
        report.rerun_error = str(exc)
        return report
    report.diff = diff_records(record, new, rtol, old_label="recorded", new_label="now")
    report.fields += _rerun_fields(record, new)
    return report


def verify_renderables(report: VerifyReport) -> list[Any]:
    """Rich renderables for the terminal: the four answers, then the list of differences."""
    from rich.table import Table

    def yes(flag: bool) -> str:
        return "[green]yes[/green]" if flag else "[bold red]NO[/bold red]"

    d = report.diff
    heading = f"verify {report.path or 'record'} — record digest {report.stored_digest[:12]}"
    t = Table(show_header=False)
    t.add_column("Question")
    t.add_column("Answer")
    t.add_column("Detail", overflow="fold")
    detail = list(report.problems)
    if report.stored_digest != report.computed_digest:
        detail.insert(0, f"stored digest {report.stored_digest[:12]}, content gives {report.computed_digest[:12]}: the record was edited")
    if report.fields:
        detail.append(f"{len(report.fields)} field{'s' if len(report.fields) != 1 else ''} disagree (listed below)")
    t.add_row("record intact", yes(report.record_intact), "; ".join(detail))
    if report.rerun_error is not None:
        t.add_row("re-run", yes(False), f"cannot rebuild the calcs: {report.rerun_error}")
    if d is not None:
        t.add_row("templates unchanged", yes(report.templates_unchanged), f"{len(d.templates)} changed" if d.templates else "")
        t.add_row("data unchanged", yes(report.data_unchanged), f"{len(d.data)} changed" if d.data else "")
        n = len(d.added) + len(d.removed) + len(d.inputs) + len(d.flips) + len(d.results)
        t.add_row("results reproduced", yes(report.results_reproduced), f"rtol {report.rtol:g}" + (f"; {n} difference{'s' if n != 1 else ''}" if n else ""))
    out: list[Any] = [heading, t]
    if report.fields:
        ft = Table(title="Record fields that disagree", title_justify="left")
        for col in ("Calc", "Field", "Recorded", "Expected", "Expected from"):
            ft.add_column(col, overflow="fold")
        for c in report.fields:
            ft.add_row(c.calc, c.item, c.old, c.new, c.note)
        out.append(ft)
    if d is not None and d.rows():
        out.append(diff_table(d, title="Differences (recorded → now)"))
    elif d is not None and d.versions:
        out.append("versions: " + "; ".join(f"{c.item} {c.old} → {c.new}" for c in d.versions))
    return out
