"""The job record (JSON) and writing a run's output folder atomically.

Record format ``"calcpad-job-record/1"``::

    {"format", "job": {number, title, client, site, engineer, checker, revision, date, codes, units},
     "versions": {"calcpad", "python", "pint", "sympy", "numpy"},
     "summary": {"calcs", "checks", "ok", "ng", "errors", "status", "slender"},
     "calcs": [{"number", "location", "template", "template_title", "member", "title",
                "inputs": {name: {"value", "unit"}}, "input_digest", "status", "error",
                "results": {sheet title: {name: {"value", "unit"}}},
                "checks": [{"sheet", "name", "demand", "capacity", "ratio", "status", "ref"}],
                "sheets": [calcpad-record/1 of each sheet]}],
     "run": {"mode", "seconds", "created"}}

Everything except ``run`` depends only on the job and the installed versions, so in-process and
kernel runs give the same record apart from ``run``.

The output folder (``submittal.html``, ``record.json``, optionally ``notebooks/*.ipynb``) is
built in a temporary sibling folder and renamed into place: a reader never sees it half-written.
"""

from __future__ import annotations

import datetime as dt
import json
import os
import platform
import shutil
import tempfile
from collections.abc import Callable
from importlib import metadata
from pathlib import Path
from typing import Any

from calcpad.core.results import OK_SLENDER, status_ok
from calcpad.runner.execute import CalcOutcome
from calcpad.runner.job import Job, input_record

__all__ = ["JOB_RECORD_FORMAT", "job_record", "package_versions", "write_atomic_dir", "write_outputs"]

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
    ng = sum(1 for ch in checks if not status_ok(ch["status"]))  # "OK, above recommended slenderness" passes
    status = "ERROR" if errors else ("NG" if ng else "OK")
    slender = sum(1 for ch in checks if ch["status"] == OK_SLENDER)  # among the OK ones
    return {
        "format": JOB_RECORD_FORMAT,
        "job": job.info.as_dict(),
        "versions": package_versions(),
        "summary": {"calcs": len(calcs), "checks": len(checks), "ok": len(checks) - ng, "ng": ng, "errors": errors, "status": status,
                    "slender": slender},
        "calcs": calcs,
        "run": {"mode": mode, "seconds": round(seconds, 3), "created": dt.datetime.now(dt.UTC).isoformat(timespec="seconds")},
    }


def write_atomic_dir(out_dir: Path, fill: Callable[[Path], None]) -> Path:
    """Let ``fill`` write into a temporary sibling folder, then rename it to ``out_dir``.

    An existing ``out_dir`` is replaced only after the new folder is complete. If ``fill``
    raises, nothing is left behind and ``out_dir`` is unchanged.
    """
    out_dir = Path(out_dir)
    parent = out_dir.resolve().parent
    parent.mkdir(parents=True, exist_ok=True)
    tmp = Path(tempfile.mkdtemp(prefix=f".{out_dir.name}.", suffix=".tmp", dir=parent))
    try:
        mask = os.umask(0)
        os.umask(mask)
        os.chmod(tmp, 0o777 & ~mask)  # mkdtemp makes 0700; give the folder normal permissions
        fill(tmp)
        old = None
        if out_dir.exists():
            old = Path(tempfile.mkdtemp(prefix=f".{out_dir.name}.", suffix=".old", dir=parent))
            os.replace(out_dir, old / "prev")
        os.replace(tmp, out_dir)
        if old is not None:
            shutil.rmtree(old, ignore_errors=True)
    except BaseException:
        shutil.rmtree(tmp, ignore_errors=True)
        raise
    return out_dir


def _notebook_name(o: CalcOutcome) -> str:
    mark = "".join(ch if ch.isalnum() or ch in "-_" else "_" for ch in o.calc.member)
    return f"{o.calc.number:02d}_{o.calc.template.name}_{mark}.ipynb"


def write_outputs(out_dir: Path, job: Job, outcomes: list[CalcOutcome], record: dict[str, Any], notebooks: bool = False) -> Path:
    """Write ``submittal.html``, ``record.json`` and (kernel runs) ``notebooks/*.ipynb`` atomically."""
    from calcpad.runner.submittal import submittal_html

    html = submittal_html(job, outcomes, record)
    text = json.dumps(record, indent=1, ensure_ascii=False, allow_nan=False) + "\n"

    def fill(tmp: Path) -> None:
        (tmp / "submittal.html").write_text(html, encoding="utf-8")
        (tmp / "record.json").write_text(text, encoding="utf-8")
        if notebooks:
            import nbformat  # lazy: kernel path only

            nb_dir = tmp / "notebooks"
            nb_dir.mkdir()
            for o in outcomes:
                if o.notebook is not None:
                    nbformat.write(o.notebook, str(nb_dir / _notebook_name(o)))

    return write_atomic_dir(out_dir, fill)
