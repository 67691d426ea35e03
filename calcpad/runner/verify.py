"""Verify a job record: is it intact, and do today's templates and data reproduce it?

:func:`verify_record` answers four questions about a record read back from disk:

1. *record intact*: its ``record_digest`` equals the digest recomputed over its content, and its
   job file text matches the job file digest (a hand edit of any field shows here);
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
import time
from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from calcpad.core.errors import CalcpadError
from calcpad.runner.diff import RecordDiff, diff_records, diff_table
from calcpad.runner.record import record_digest

__all__ = ["DEFAULT_RTOL", "VerifyReport", "rerun_record", "verify_record", "verify_renderables"]

DEFAULT_RTOL = 1e-9


@dataclass
class VerifyReport:
    """What :func:`verify_record` found."""

    stored_digest: str
    computed_digest: str
    rtol: float
    problems: list[str] = field(default_factory=list)  # integrity problems found without re-running
    rerun_error: str | None = None  # the job could not be rebuilt from the record
    diff: RecordDiff | None = None  # recorded → now
    path: Path | None = None

    @property
    def record_intact(self) -> bool:
        """The stored digest matches the content and the job text matches its digest."""
        return self.stored_digest == self.computed_digest and not self.problems

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
        job = parse_job(text, str(jf.get("source") or "job text in the record"), library)
    else:
        calcs = record.get("calcs") or []
        if len(calcs) != 1 or not isinstance(jf.get("source"), str):
            raise CalcpadError("the record holds no job text and is not a one-template --set run; cannot rebuild its calcs")
        c = calcs[0]
        inputs = c.get("inputs") if isinstance(c.get("inputs"), dict) else {}
        sets = [f"{n}={i['typed']}" for n, i in inputs.items() if isinstance(i, dict) and i.get("typed") is not None]
        job = single_template_job(jf["source"], sets, member=str(c.get("member", "-")), templates=library)
    start = time.perf_counter()
    outcomes = run_job(job, mode="inprocess")
    return job_record(job, outcomes, "inprocess", time.perf_counter() - start)


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
    try:
        new = rerun_record(record, templates)
    except CalcpadError as exc:
        report.rerun_error = str(exc)
        return report
    report.diff = diff_records(record, new, rtol, old_label="recorded", new_label="now")
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
    t.add_row("record intact", yes(report.record_intact), "; ".join(detail))
    if report.rerun_error is not None:
        t.add_row("re-run", yes(False), f"cannot rebuild the calcs: {report.rerun_error}")
    if d is not None:
        t.add_row("templates unchanged", yes(report.templates_unchanged), f"{len(d.templates)} changed" if d.templates else "")
        t.add_row("data unchanged", yes(report.data_unchanged), f"{len(d.data)} changed" if d.data else "")
        n = len(d.added) + len(d.removed) + len(d.inputs) + len(d.flips) + len(d.results)
        t.add_row("results reproduced", yes(report.results_reproduced), f"rtol {report.rtol:g}" + (f"; {n} difference{'s' if n != 1 else ''}" if n else ""))
    out: list[Any] = [heading, t]
    if d is not None and d.rows():
        out.append(diff_table(d, title="Differences (recorded → now)"))
    elif d is not None and d.versions:
        out.append("versions: " + "; ".join(f"{c.item} {c.old} → {c.new}" for c in d.versions))
    return out
