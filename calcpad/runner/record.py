"""The job record (JSON) of a run.

Record format ``"calcpad-job-record/1"``::

    {"format", "job": {number, title, client, site, engineer, checker, revision, date, codes, units},
     "versions": {"calcpad", "python", "pint", "sympy", "numpy"},
     "summary": {"calcs", "checks", "ok", "ng", "errors", "status"},
     "calcs": [{"number", "location", "template", "template_title", "member", "title",
                "inputs": {name: {"value", "unit"}}, "input_digest", "status", "error",
                "results": {sheet title: {name: {"value", "unit"}}},
                "checks": [{"sheet", "name", "demand", "capacity", "ratio", "status", "ref"}],
                "sheets": [calcpad-record/1 of each sheet]}],
     "run": {"mode", "seconds", "created"}}

Everything except ``run`` depends only on the job and the installed versions, so in-process and
kernel runs give the same record apart from ``run``.

Writing it (with the submittal) into an output folder is :mod:`calcpad.runner.outfolder`.
"""

from __future__ import annotations

import datetime as dt
import platform
from importlib import metadata
from typing import Any

from calcpad.runner.execute import CalcOutcome
from calcpad.runner.job import Job, input_record

__all__ = ["JOB_RECORD_FORMAT", "job_record", "package_versions"]

JOB_RECORD_FORMAT = "calcpad-job-record/1"


def package_versions() -> dict[str, str]:
    """Versions of calcpad, Python and the numeric libraries that produced the results."""
    out = {"python": platform.python_version()}
    for pkg in ("calcpad", "pint", "sympy", "numpy"):
        try:
            out[pkg] = metadata.version(pkg)
        except metadata.PackageNotFoundError:  # pragma: no cover - always installed
            out[pkg] = "unknown"
    return out


def _calc_record(o: CalcOutcome) -> dict[str, Any]:
    c = o.calc
    results: dict[str, Any] = {}
    checks: list[dict[str, Any]] = []
    for s in o.sheets:
        rec = s["record"]
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
    return {
        "number": c.number,
        "location": c.location,
        "template": c.template.name,
        "template_title": c.template.title,
        "member": c.member,
        "title": c.title,
        "inputs": {n: input_record(v) for n, v in c.inputs.items()},
        "input_digest": c.input_digest,
        "status": o.status,
        "error": o.error,
        "results": results,
        "checks": checks,
        "sheets": [s["record"] for s in o.sheets],
    }


def job_record(job: Job, outcomes: list[CalcOutcome], mode: str, seconds: float) -> dict[str, Any]:
    """Build the job record dictionary."""
    calcs = [_calc_record(o) for o in outcomes]
    checks = [ch for c in calcs for ch in c["checks"]]
    errors = sum(1 for c in calcs if c["status"] == "ERROR")
    ng = sum(1 for ch in checks if ch["status"] != "OK")
    status = "ERROR" if errors else ("NG" if ng else "OK")
    return {
        "format": JOB_RECORD_FORMAT,
        "job": job.info.as_dict(),
        "versions": package_versions(),
        "summary": {"calcs": len(calcs), "checks": len(checks), "ok": len(checks) - ng, "ng": ng, "errors": errors, "status": status},
        "calcs": calcs,
        "run": {"mode": mode, "seconds": round(seconds, 3), "created": dt.datetime.now(dt.UTC).isoformat(timespec="seconds")},
    }
