"""The job record (JSON): what was run, on what, with what result — sealed by one digest.

Record format ``"calcpad-job-record/2"``::

    {"format": "calcpad-job-record/2",
     "job": {number, title, client, site, engineer, checker, revision, date, codes, units},
     "job_file": {"source": path as given (or the template of a --set run),
                  "library": extra template library folders the job was read with (--templates),
                  "text": the job file text exactly as read (null for a --set run),
                  "sha256": digest of that text (null for a --set run),
                  "tables": [{"name", "sha256", "header", "rows"}] member tables as read (cells as text;
                            only when the job has a table)},
     "versions": {"calcpad", "python", "pint", "sympy", "numpy"},
     "templates": [{"name", "file", "sha256"}],      # every template the calcs used
     "data": {"eng/sections/data/aisc_pipe.csv": sha256, ..., "eng/data/materials.toml": sha256},
     "shop_sections": {"file", "sha256", "rows", "source", "text"},   # only when [job] shop_sections is set
     "summary": {"calcs", "checks", "ok", "ng", "errors", "status", "slender"},
     "calcs": [{"number", "location", "template", "template_title", "template_file",
                "template_sha256", "member", "title",
                "inputs": {name: {"typed", "value", "unit"}}, "input_digest", "status", "error",
                "results": {sheet title: {name: {"value", "unit"}}},
                "checks": [{"sheet", "name", "demand", "capacity", "ratio", "status", "ref"}],
                "sheets": [calcpad-record/1 of each sheet],
                "table": {"name", "row"} (a member-table row), "design": {...} (a design search:
                parameter, family, grades, chosen, governing_check/ratio, runner_up, candidates, method)}],
     "record_digest": sha256 (hex) of the canonical JSON of everything above,
     "run": {"mode", "seconds", "created"}}

- ``inputs``: ``typed`` is the value as written (the TOML value, or the ``--set`` text; null for
  a template default a ``--set`` run did not give), ``value``/``unit`` as parsed: a float and
  its unit for quantities, ``unit = ""`` for plain numbers, the text itself and ``unit = null``
  for texts (an exposure category ``"C"`` stays ``"C"``).
- Digests are SHA-256 in hex. ``sha256`` of a template is over its source file's bytes (the
  ``.py`` or ``.ipynb`` that ran). ``data`` digests every data file shipped with calcpad
  (section catalogs and materials): a catalog lookup reads the whole catalog, so all of them
  count as used. ``shop_sections`` is the shop's own table the job named: the file name as
  written in the job, the SHA-256 of its bytes, its row count, its ``# source:`` line and its
  text (so ``calcpad verify`` re-runs with exactly the rows that ran).
- ``record_digest`` (:func:`record_digest`) is over ``json.dumps(sort_keys=True,
  separators=(",", ":"), ensure_ascii=False)`` of the record without ``run`` and without
  ``record_digest`` itself: a hand edit of any other field breaks it. Its first 12 hex digits
  (:func:`short_digest`) are printed on every submittal page. Whoever adds a field after
  :func:`job_record` must call :func:`seal` again (or put it under ``run``).

Everything except ``run`` depends only on the job, the templates, the data and the installed
versions, so in-process and kernel runs give the same record apart from ``run``.
``calcpad verify`` (``runner/verify.py``) re-runs a record; ``calcpad diff`` (``runner/diff.py``)
compares two.

Writing it (with the submittal) into an output folder is :mod:`calcpad.runner.outfolder`; the
file's text is :func:`~calcpad.runner.recordtext.record_layout` of the record (streamed by
:func:`record_chunks`): indented down to each calc entry, then one line per step, check and row.
"""

from __future__ import annotations

import datetime as dt
import functools
import hashlib
import json
import math
import platform
from collections.abc import Iterator, Sequence
from importlib import metadata
from pathlib import Path
from typing import Any, overload

from calcpad.core.results import OK_SLENDER, status_ok
from calcpad.runner.execute import CalcOutcome
from calcpad.runner.job import Job, input_record
from calcpad.runner.recordtext import key_text, record_layout

__all__ = [
    "JOB_RECORD_FORMAT",
    "SpooledCalcs",
    "calc_record",
    "calc_results_and_checks",
    "data_digests",
    "data_files",
    "file_digest",
    "job_record",
    "job_summary",
    "package_versions",
    "record_chunks",
    "record_digest",
    "record_layout",
    "record_text",
    "seal",
    "shop_sections_record",
    "short_digest",
    "template_digest",
    "template_list",
]

JOB_RECORD_FORMAT = "calcpad-job-record/2"
#: The calcpad package folder; data files are named relative to it.
PACKAGE_DIR = Path(__file__).resolve().parent.parent
#: Shipped data files (section catalogs, materials), as globs under :data:`PACKAGE_DIR`.
DATA_GLOBS = ("eng/sections/data/*.csv", "eng/data/*.toml")
#: Keys left out of :func:`record_digest`.
UNSEALED_KEYS = ("run", "record_digest")


def package_versions() -> dict[str, str]:
    """Versions of calcpad, Python and the numeric libraries that produced the results."""
    out = {"python": platform.python_version()}
    for pkg in ("calcpad", "pint", "sympy", "numpy"):
        try:
            out[pkg] = metadata.version(pkg)
        except metadata.PackageNotFoundError:  # pragma: no cover - always installed
            out[pkg] = "unknown"
    return out


def file_digest(path: Path) -> str:
    """SHA-256 (hex) of a file's bytes."""
    return hashlib.sha256(Path(path).read_bytes()).hexdigest()


def data_files() -> dict[str, Path]:
    """Shipped data files by their name relative to the package (``eng/data/materials.toml``)."""
    out: dict[str, Path] = {}
    for pattern in DATA_GLOBS:
        for f in sorted(PACKAGE_DIR.glob(pattern)):
            out[f.relative_to(PACKAGE_DIR).as_posix()] = f
    return out


def data_digests() -> dict[str, str]:
    """SHA-256 of every shipped data file (see :func:`data_files`)."""
    return {name: file_digest(f) for name, f in data_files().items()}


class SpooledCalcs(Sequence[dict[str, Any]]):
    """The record's ``calcs`` when a run kept them in a spool (:mod:`calcpad.runner.spool`): each
    entry is read back when asked (``calcs[i]``, iteration), and :func:`record_chunks` and
    :func:`record_digest` stream their stored JSON, so a large job never holds every entry.
    ``entries`` are objects with ``pretty()`` (the entry as :func:`record_layout` prints it
    two levels deep in the record) and ``canonical()`` (sorted keys, no spaces)."""

    def __init__(self, entries: list[Any]) -> None:
        self.entries = entries

    def __len__(self) -> int:
        return len(self.entries)

    @overload
    def __getitem__(self, i: int) -> dict[str, Any]: ...
    @overload
    def __getitem__(self, i: slice) -> list[dict[str, Any]]: ...
    def __getitem__(self, i: int | slice) -> dict[str, Any] | list[dict[str, Any]]:
        if isinstance(i, slice):
            return [json.loads(e.pretty()) for e in self.entries[i]]
        return json.loads(self.entries[i].pretty())

    def __eq__(self, other: object) -> bool:
        return list(self) == other if isinstance(other, (list, SpooledCalcs)) else NotImplemented

    __hash__ = None  # type: ignore[assignment]


def _canonical_chunks(record: dict[str, Any]) -> Iterator[str]:
    """``json.dumps(body, sort_keys=True, separators=(",", ":"), ensure_ascii=False)`` of the
    record without the unsealed keys, in pieces (spooled calcs one entry at a time)."""
    body = sorted((k, v) for k, v in record.items() if k not in UNSEALED_KEYS)
    yield "{"
    for i, (key, value) in enumerate(body):
        yield ("," if i else "") + json.dumps(key, ensure_ascii=False) + ":"
        if isinstance(value, SpooledCalcs):
            yield "["
            for j, entry in enumerate(value.entries):
                yield ("," if j else "") + entry.canonical()
            yield "]"
        else:
            yield json.dumps(value, sort_keys=True, separators=(",", ":"), ensure_ascii=False, allow_nan=False)
    yield "}"


def record_digest(record: dict[str, Any]) -> str:
    """SHA-256 (hex) over the canonical JSON of ``record`` without ``run`` and ``record_digest``."""
    h = hashlib.sha256()
    for chunk in _canonical_chunks(record):
        h.update(chunk.encode("utf-8"))
    return h.hexdigest()


def record_chunks(record: dict[str, Any]) -> Iterator[str]:
    """The record file's text in pieces: exactly ``record_layout(record) + "\\n"``
    (:func:`record_layout`), with spooled calcs streamed one at a time."""
    if not record:
        yield "{}\n"
        return
    for i, (key, value) in enumerate(record.items()):
        yield ("{\n " if i == 0 else ",\n ") + key_text(key) + ": "
        if isinstance(value, SpooledCalcs):
            if not value.entries:
                yield "[]"
                continue
            for j, entry in enumerate(value.entries):
                yield ("[\n  " if j == 0 else ",\n  ") + entry.pretty()
            yield "\n ]"
        else:
            yield record_layout(value, 1)
    yield "\n}\n"


def record_text(record: dict[str, Any]) -> str:
    """The record file's text (see :func:`record_chunks`)."""
    return "".join(record_chunks(record))


def short_digest(record_or_digest: dict[str, Any] | str) -> str:
    """The first 12 hex digits of a record's digest (what a submittal page prints)."""
    digest = record_or_digest if isinstance(record_or_digest, str) else record_or_digest["record_digest"]
    return digest[:12]


def seal(record: dict[str, Any]) -> dict[str, Any]:
    """Set ``record["record_digest"]`` (kept just before ``run``) and return the record."""
    run = record.pop("run", None)
    record.pop("record_digest", None)
    record["record_digest"] = record_digest(record)
    if run is not None:
        record["run"] = run
    return record


def _json_safe(value: Any) -> Any:
    """A TOML value as JSON: dates as ISO text, non-finite floats as text."""
    if isinstance(value, dict):
        return {str(k): _json_safe(v) for k, v in value.items()}
    if isinstance(value, list):
        return [_json_safe(v) for v in value]
    if isinstance(value, float) and not math.isfinite(value):
        return repr(value)
    if isinstance(value, (dt.date, dt.time)):
        return value.isoformat()
    return value


def calc_results_and_checks(sheets: list[dict[str, Any]]) -> tuple[dict[str, Any], list[dict[str, Any]]]:
    """A calc's ``results`` and ``checks`` as derived from its sheet records."""
    results: dict[str, Any] = {}
    checks: list[dict[str, Any]] = []
    for rec in sheets:
        results[rec["title"]] = rec["results"]
        for ch in rec["checks"]:
            checks.append(
                {
                    "sheet": rec["title"],
                    "name": ch["title"],
                    "demand": ch["demand"],
                    "capacity": ch["capacity"],
                    "ratio": ch["ratio"],
                    "status": ch["status"],
                    "ref": ch["ref"],
                }
            )
    return results, checks


def job_summary(calcs: Sequence[dict[str, Any]]) -> dict[str, Any]:
    """The record's ``summary`` as derived from its calc records."""
    checks = [ch for c in calcs for ch in c["checks"]]
    errors = sum(1 for c in calcs if c["status"] == "ERROR")
    ng = sum(1 for ch in checks if not status_ok(ch["status"]))  # "OK, above recommended slenderness" passes
    status = "ERROR" if errors else ("NG" if ng else "OK")
    slender = sum(1 for ch in checks if ch["status"] == OK_SLENDER)  # among the OK ones
    return {"calcs": len(calcs), "checks": len(checks), "ok": len(checks) - ng, "ng": ng, "errors": errors, "status": status, "slender": slender}


def template_list(calcs: Sequence[dict[str, Any]]) -> list[dict[str, str]]:
    """The record's ``templates`` as derived from its calc records (first use order, no repeats)."""
    templates: list[dict[str, str]] = []
    for c in calcs:
        entry = {"name": c["template"], "file": c["template_file"], "sha256": c["template_sha256"]}
        if entry not in templates:
            templates.append(entry)
    return templates


def template_digest(path: Path) -> str:
    """SHA-256 of a template file's bytes ("unreadable" when it was removed or cannot be read
    since it ran: verify reports it)."""
    try:
        return file_digest(path)
    except OSError:
        return "unreadable"


@functools.lru_cache(maxsize=4096)
def _input_record(kind: str | None, _type: type, value: str | float) -> dict[str, Any]:
    """:func:`~calcpad.runner.job.input_record`, once per distinct input (a member table repeats its
    shared inputs on every row); keyed by type too (``True == 1``). Callers copy the dict."""
    return input_record(value, kind)


def calc_record(o: CalcOutcome, template_sha: str) -> dict[str, Any]:
    """The record's entry for one calc (``template_sha``: :func:`template_digest` of its template)."""
    c = o.calc
    results, checks = calc_results_and_checks([s["record"] for s in o.sheets])
    params = c.template.parameters
    inputs = {
        n: {"typed": _json_safe(c.typed.get(n)), **_input_record(params[n].kind if n in params else None, type(v), v)}
        for n, v in c.inputs.items()
    }
    return {
        "number": c.number,
        "location": c.location,
        "template": c.template.name,
        "template_title": c.template.title,
        "template_file": c.template.path.name,
        "template_sha256": template_sha,
        "member": c.member,
        "title": c.title,
        "inputs": inputs,
        "input_digest": c.input_digest,
        "status": o.status,
        "error": o.error,
        "results": results,
        "checks": checks,
        "sheets": [s["record"] for s in o.sheets],
        **({"table": {"name": c.table, "row": c.row}} if c.table is not None else {}),
        **({"design": c.design["result"]} if c.design and "result" in c.design else {}),
    }


def _job_file(job: Job) -> dict[str, Any]:
    return {
        "source": job.source,
        "library": list(job.library),
        "text": job.text,
        "sha256": hashlib.sha256(job.text.encode("utf-8")).hexdigest() if job.text is not None else None,
        **({"tables": [t.as_record() for t in job.tables.values()]} if job.tables else {}),
    }


def shop_sections_record(job: Job) -> dict[str, Any]:
    """The record's ``shop_sections`` block of a job that names a shop table."""
    t = job.shop_table
    assert t is not None
    return {"file": job.shop_file, "sha256": t.sha256, "rows": len(t.rows), "source": t.source_note, "text": t.text}


def job_record(job: Job, outcomes: list[CalcOutcome], mode: str, seconds: float) -> dict[str, Any]:
    """Build the job record dictionary, sealed with its ``record_digest``."""
    template_shas: dict[Path, str] = {}

    def sha(o: CalcOutcome) -> str:
        path = o.calc.template.path
        if path not in template_shas:
            template_shas[path] = template_digest(path)
        return template_shas[path]

    calcs: list[dict[str, Any]] | SpooledCalcs
    if outcomes and all(o.spooled is not None for o in outcomes):  # a run that kept its calcs in a spool
        calcs = SpooledCalcs([o.spooled for o in outcomes])
        light = [{"status": o.status, "checks": o.checks, "template": o.calc.template.name, "template_file": o.calc.template.path.name,
                  "template_sha256": o.spooled.template_sha256} for o in outcomes]
    else:
        calcs = [json.loads(o.spooled.pretty()) if o.spooled is not None else calc_record(o, sha(o)) for o in outcomes]
        light = calcs
    record = {
        "format": JOB_RECORD_FORMAT,
        "job": job.info.as_dict(),
        "job_file": _job_file(job),
        "versions": package_versions(),
        "templates": template_list(light),
        "data": data_digests(),
        **({"shop_sections": shop_sections_record(job)} if job.shop_table is not None else {}),
        "summary": job_summary(light),
        "calcs": calcs,
        "run": {"mode": mode, "seconds": round(seconds, 3), "created": dt.datetime.now(dt.UTC).isoformat(timespec="seconds")},
    }
    return seal(record)

