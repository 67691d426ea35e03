"""Command line.

::

    calcpad run JOB.toml [--out DIR] [--print full|summary|calc:MARK] [--no-pdf] [--notebooks] [--json]
                         [--templates DIR] [--wait S] [--workers N | --scheduler ADDRESS]
    calcpad run NAME|LIBRARY/NAME.py --set name="value unit" ... [--member M1] [--out DIR] [--json]
    calcpad issue OUT --by "J. Smith, P.E." [--revision B]
    calcpad templates [--templates DIR]
    calcpad new JOB.toml [--template NAME ...] [--templates DIR]
    calcpad lab [FOLDER] [--dry-run]
    calcpad template new NAME [--dir DIR] [--title TITLE]
    calcpad template store NAME|NAME.py
    calcpad demo
    calcpad verify OUT [--revision R] [--rtol 1e-9]
    calcpad diff OLD NEW [--rtol 1e-6] [--html FILE]

Exit codes: 0 every check OK; 1 some check NG; 2 bad input or refused output folder (nothing
written), or a calc failed to run (the other calcs still run; the folder is written and marks
the failure); 3 cannot write (read-only, disk full, folder busy); 4 internal error (one line on
stderr, the traceback saved to a log file it names); 130 interrupted (nothing half-written).
"""

from __future__ import annotations

import argparse
import contextlib
import json
import math
import os
import runpy
import sys
import tempfile
import time
import traceback
from collections.abc import Callable
from pathlib import Path
from typing import Any, NoReturn

__all__ = ["console", "exit_with", "main"]

ROOT = Path(__file__).resolve().parent.parent
EXIT_OK, EXIT_NG, EXIT_BAD, EXIT_WRITE, EXIT_INTERNAL, EXIT_INTERRUPTED = 0, 1, 2, 3, 4, 130


def _write_atomic(path: Path, text: str) -> None:
    """Write ``text`` to ``path`` through a temporary sibling file (never half-written)."""
    from calcpad.runner.outfolder import new_file_mode

    path.parent.mkdir(parents=True, exist_ok=True)
    fd, tmp = tempfile.mkstemp(dir=path.parent, prefix=f".{path.name}.", suffix=".tmp")
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as fh:
            fh.write(text)
        os.chmod(tmp, new_file_mode())  # mkstemp's files are owner-only
        os.replace(tmp, path)
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise


def _demo(out_dir: Path) -> int:
    from calcpad.core.sheet import Sheet
    from calcpad.render.html import CAUTION, html_document, sheet_html_fragment
    from calcpad.render.text import sheet_text
    from calcpad.runner.outfolder import check_target

    target = check_target(out_dir, "demo")
    template = ROOT / "notebooks" / "leg_bending.py"
    scope = runpy.run_path(str(template), run_name="calcpad_template")
    sheets = [v for v in scope.values() if isinstance(v, Sheet)]
    body = f'<div class="caution">{CAUTION}</div>' + "".join(sheet_html_fragment(s.evaluate()) for s in sheets)
    html = html_document(body, "calcpad demo")
    folder = target.write(lambda d: (d / "leg_bending.html").write_text(html, encoding="utf-8"))
    for s in sheets:
        print(sheet_text(s.evaluate()))
    print(f"submittal written: {folder / 'leg_bending.html'}")
    return 0 if all(s.evaluate().ok for s in sheets) else 1


# ----------------------------------------------------------------------------- run


def _is_template(target: str) -> bool:
    return target.endswith((".py", ".ipynb")) or (not target.endswith(".toml") and not Path(target).exists())


def _run(args: argparse.Namespace) -> int:
    from rich.console import Console

    from calcpad.core.errors import CalcpadError
    from calcpad.runner.job import check_print_mark, load_job, single_template_job
    from calcpad.runner.outfolder import check_target

    err = Console(stderr=True)
    out = Console()
    protect: list[Path] = []
    if _is_template(args.target):
        job = single_template_job(args.target, args.set or [], member=args.member or "-", templates=args.templates)
        out_dir = Path(args.out) if args.out else None
    else:
        job = load_job(args.target, templates=args.templates)
        out_dir = Path(args.out) if args.out else Path("build") / Path(args.target).stem
        if args.set:  # a what-if on the job: only the changed calcs run, printed; nothing written without --out
            job = job_what_if(job, args.set)
            out_dir = Path(args.out) if args.out else None
        protect.append(Path(args.target))
    protect += [c.template.path for c in job.calcs]
    if job.shop_path:
        protect.append(Path(job.shop_path))  # the shop table is an input too
    if job.tables and not _is_template(args.target):
        folder_of_job = Path(args.target).parent
        protect += [Path(name) if Path(name).is_absolute() else folder_of_job / name for name in job.tables]
    target = check_target(out_dir, job.info.revision, protect) if out_dir is not None else None  # refusals before anything runs
    if target is not None and job.tables:
        from calcpad.runner.members import results_stems

        results_stems(list(job.tables))  # two tables that would write the same results files: refused now
    if args.print is not None:
        check_print_mark(job, args.print, "--print")
    mode = "kernel" if args.notebooks else "inprocess"
    if (args.workers or args.scheduler) and args.notebooks:
        raise CalcpadError("--notebooks runs every calc in one local kernel; leave out --workers/--scheduler to keep notebooks")
    spool_cm: Any = contextlib.nullcontext(None)
    if target is not None:  # records and sheets of finished calcs wait in a spool file, not in memory
        from calcpad.runner.spool import RunSpool

        spool_cm = RunSpool()
    with spool_cm as spool:  # the spool lives until the outputs are written
        return _run_and_write(args, job, target, mode, spool, err, out)


def _run_and_write(args: argparse.Namespace, job: Any, target: Any, mode: str, spool: Any, err: Any, out: Any) -> int:
    """Run the job's calcs (each kept in ``spool`` as it finishes, when there is one), write the
    output folder ``target`` and print the summary; returns the exit code."""
    from calcpad.runner.outfolder import write_outputs
    from calcpad.runner.record import job_record, record_chunks

    start = time.perf_counter()
    failures: list[str] = []
    client_cm = contextlib.nullcontext(None)
    if args.workers or args.scheduler:
        from calcpad.runner.scale import cluster_client

        client_cm = cluster_client(args.workers, args.scheduler)
    with contextlib.ExitStack() as stack:
        client = stack.enter_context(client_cm)
        searched = [c for c in job.calcs if c.design is not None]
        if searched:
            from calcpad.runner.scale import progress_bar
            from calcpad.runner.search import resolve_designs

            with progress_bar(len(searched), "design search (members)") as advance:
                resolve_designs(job, client, advance)
        outcomes = _run_calcs(job, mode, client, err, failures, bar_on=not args.json and err.is_terminal,  # none in logs, pipes, JSON
                              text=target is None, keep=spool.keep if spool is not None else None)  # hand calcs: only without an output folder
    seconds = time.perf_counter() - start
    record = job_record(job, outcomes, mode, seconds)
    pdf = None
    folder = None
    if target is not None:
        from calcpad.report import write_submittal

        def submittal(d: Path) -> None:
            nonlocal pdf
            pdf = write_submittal(d, job, outcomes, record, print_mode=args.print, pdf=not args.no_pdf)

        with err.status("printing submittal.pdf", spinner="line") if not args.no_pdf and err.is_terminal else contextlib.nullcontext():
            folder = write_outputs(target, record, submittal, outcomes=outcomes if args.notebooks else (), wait=args.wait,
                                   files=_table_files(job, outcomes))
    if args.json:
        for chunk in record_chunks(record):  # streamed: the calcs may be in the spool
            sys.stdout.write(chunk)
        sys.stdout.flush()
    else:
        _print_summary(out, job, outcomes, record)
        if folder is None:
            for o in outcomes:
                for s in o.sheets:
                    _print_sheet_text(out, s)
    if folder is not None:
        err.print(f"submittal written: {folder / 'submittal.html'}", highlight=False, soft_wrap=True)
        if pdf is not None:
            err.print(f"{'PDF' if pdf.written else 'no PDF'}: {pdf.message}", highlight=False, soft_wrap=True, markup=False)
    summ = record["summary"]
    if summ["errors"]:
        return EXIT_BAD
    return EXIT_NG if summ["ng"] else EXIT_OK


def _table_files(job: Any, outcomes: list[Any]) -> dict[str, bytes]:
    """Each member table's results (every check ratio, governing check) as CSV and Excel."""
    from calcpad.runner.members import results_files

    return results_files(list(job.tables), outcomes, job.info.date)


def _run_calcs(job: Any, mode: str, client: Any, err: Any, failures: list[str], *, bar_on: bool, text: bool,
               keep: Callable[[Any], None] | None = None) -> list[Any]:
    """Every calc of the job, serially or on the Dask ``client``, with a progress bar (``bar_on``);
    ``text``: make each sheet's plain-text hand calc (printed when there is no output folder);
    ``keep``: called with each outcome as it finishes (the run's spool)."""
    from rich.markup import escape

    from calcpad.runner.execute import run_job
    from calcpad.runner.progress import RunProgress

    label = "starting kernel" if mode == "kernel" else "running calcs on the cluster" if client is not None else "running calcs"
    bar = RunProgress(len(job.calcs), console=err, enabled=bar_on, label=label)

    def tick(o: Any) -> None:
        if keep is not None:
            keep(o)
        bar.advance(f"{o.calc.template.name} {o.calc.member}")
        if o.error is not None:
            msg = f"calc {o.calc.number} ({o.calc.location}, member {o.calc.member}): template {o.calc.template.name!r}, cell {o.error['cell']}: {o.error['message']}"
            failures.append(msg)
            bar.console.print(f"[bold]FAILED[/bold] {escape(msg)}", markup=True, highlight=False, soft_wrap=True)

    try:
        if client is None:
            return run_job(job, mode=mode, progress=tick, text=text)
        from calcpad.runner.scale import run_calcs_on_cluster

        return run_calcs_on_cluster(job, client, progress=tick, text=text)
    finally:
        bar.close()


#: At most this many check rows in the terminal summary; a larger job lists its calcs that are not
#: OK (failed first, then NG by ratio) up to it, and says where every check is.
SUMMARY_ROWS = 200


def _print_summary(out: Any, job: Any, outcomes: list[Any], record: dict[str, Any]) -> None:
    from rich.table import Table

    from calcpad.core.results import status_ok

    t = Table(title=f"{job.info.number} {job.info.title}", title_justify="left")
    for col in ("Calc", "Member", "Template", "Check", "Ratio", "Status"):
        t.add_column(col, justify="right" if col in ("Calc", "Ratio") else "left")
    rows = sum(max(1, len(o.checks)) for o in outcomes)
    shown = outcomes
    if rows > SUMMARY_ROWS:  # a large job: its calcs that are not OK, worst first
        def worst(o: Any) -> tuple[int, float]:
            ratios = [c["ratio"] for c in o.checks if c["ratio"] is not None]
            return (0 if o.error is not None else 1, -max(ratios, default=0.0))

        shown = sorted((o for o in outcomes if o.status != "OK"), key=worst)
    listed = calcs_listed = 0
    for o in shown:
        if listed >= SUMMARY_ROWS:
            break
        calcs_listed += 1
        if o.error is not None:
            t.add_row(str(o.calc.number), o.calc.member, o.calc.template.name, f"cell {o.error['cell']}: {o.error['message']}", "—", "ERROR")
            listed += 1
        for ch in o.checks:
            if shown is not outcomes and status_ok(ch["status"]):
                continue
            t.add_row(str(o.calc.number), o.calc.member, o.calc.template.name, ch["name"], f"{ch['ratio']:.3f}", ch["status"])
            listed += 1
    if listed:
        out.print(t)
    if shown is not outcomes:
        left = len(shown) - calcs_listed
        not_ok = f"the calcs that are not OK ({listed} rows" + (f"; {left} more calcs not OK not listed" if left > 0 else "") + ")"
        out.print(f"{rows} check rows: listed {not_ok if listed else 'none (every calc is OK)'}; "
                  "every check is in record.json, the submittal and the results tables.", highlight=False)
    s = record["summary"]
    slender = f" ({s['slender']} above recommended slenderness)" if s.get("slender") else ""
    out.print(f"{s['calcs']} calcs, {s['checks']} checks: {s['ok']} OK{slender}, {s['ng']} NG, {s['errors']} failed — {s['status']}",
              highlight=False)


def _print_sheet_text(out: Any, sheet: dict[str, Any]) -> None:
    """The hand calc of one sheet (formula = substituted values = result, OK/NG)."""
    out.print("", highlight=False)
    out.print(sheet["text"], highlight=False, markup=False, soft_wrap=True)


def job_what_if(job: Any, sets: list[str]) -> Any:
    """``job`` with ``MARK.NAME="VALUE"`` changes applied, keeping only the calcs they change.

    Each value is checked like a job value (kind, dimension, stated range with the calc's other
    values). Raises JobError listing every problem.
    """
    from dataclasses import replace

    from calcpad.core.errors import CalcpadError
    from calcpad.core.units import parse_quantity
    from calcpad.runner.job import JobError, section_problem

    problems: list[tuple[str, str]] = []
    changed: dict[int, Any] = {}
    for item in sets:
        target, eq, value = item.partition("=")
        mark, dot, name = target.strip().rpartition(".")
        if not eq or not dot or not mark or not name:
            problems.append(("--set", f"{item!r}; expected MARK.NAME=\"VALUE\" on a job run, e.g. L1.P=\"120 lbf\""))
            continue
        calcs = [c for c in job.calcs if c.member == mark]
        if not calcs:
            marks = sorted({c.member for c in job.calcs})
            problems.append((f"--set {target}", f"no calc for member {mark!r} (members: {', '.join(marks)})"))
            continue
        hits = [c for c in calcs if name in c.template.parameters]
        if len(hits) != 1:
            why = "is not a parameter of" if not hits else "is a parameter of several calcs of"
            problems.append((f"--set {target}", f"{name!r} {why} member {mark!r} ({', '.join(c.template.name for c in calcs)}){calcs[0].template.suggest(name)}"))
            continue
        calc = changed.get(hits[0].number, hits[0])
        param = calc.template.parameters[name]
        where = f"--set {target}"
        try:
            coerced = param.coerce(value.strip(), where)
            qs = {}
            for n, v in {**calc.inputs, name: coerced}.items():
                if calc.template.parameters[n].kind != "text":
                    qs[n] = parse_quantity(v, n)
            param.check_range(coerced, qs, where)
            unknown = section_problem(calc.template, name, coerced, job.shop_table)
            if unknown is not None:
                problems.append((where, unknown))
                continue
        except CalcpadError as exc:
            problems.append((where, str(exc).removeprefix(f"{where}: ")))
            continue
        changed[calc.number] = replace(calc, inputs={**calc.inputs, name: coerced})
    if problems:
        raise JobError(job.source, problems)
    calcs = [replace(c, number=i) for i, c in enumerate(sorted(changed.values(), key=lambda c: c.number), start=1)]
    return replace(job, calcs=calcs, text=None)  # the job text no longer reproduces these inputs


# ----------------------------------------------------------------------------- templates, new


def _templates(extra: list[str]) -> int:
    from rich.console import Console
    from rich.table import Table

    from calcpad.core.errors import CalcpadError
    from calcpad.runner.template import list_templates, load_template

    out = Console()
    found = list_templates(extra)
    if not found:
        out.print("no templates found")
        return EXIT_OK
    for name, path in found.items():
        try:
            tpl = load_template(path)
        except CalcpadError as exc:
            out.print(f"[bold]{name}[/bold]: cannot read ({exc})")
            continue
        t = Table(title=f"{name} — {tpl.title}", title_justify="left", caption=str(path), caption_justify="left")
        for col in ("Parameter", "Default", "Allowed", "Description"):
            t.add_column(col)
        for p in tpl.parameters.values():
            allowed = ", ".join(p.choices) if p.choices else (p.range_text or "")
            if p.note:
                allowed += " (not enforced)"
            t.add_row(p.name, str(p.default), allowed, p.description)
        out.print(t)
    return EXIT_OK


def _toml_str(v: Any) -> str:
    return json.dumps(v, ensure_ascii=False) if isinstance(v, str) else repr(v)


def starter_job(templates: list[str], extra: list[str] | None = None) -> str:
    """Text of a starter job file with every parameter of each template at its default."""
    from calcpad.runner.job import CONTEXT_PARAMETERS
    from calcpad.runner.template import find_template, load_template

    lines = [
        "# calcpad job file. Every value is data: nothing here is executed.",
        "# Run: calcpad run THIS.toml --out build/THIS   (see `calcpad templates`)",
        "",
        "[job]",
        'number = "J-0001"',
        'title = "Job title"',
        'client = "Client name"',
        'site = "Site address"',
        'engineer = "Engineer of record"',
        'checker = ""',
        'revision = "A"',
        "date = 2025-01-01",
        'codes = ["AISC 360-16", "ASCE 7-16"]',
        'units = "US"',
        '# shop_sections = "shop_sections.csv"   # optional: the shop\'s own sections, checked row by row (README)',
    ]
    for name in templates:
        tpl = load_template(find_template(name, extra or []))
        lines += ["", "[[calcs]]", f"template = {_toml_str(tpl.name)}", 'member = "M1"', "[calcs.inputs]"]
        for p in tpl.parameters.values():
            if p.name in CONTEXT_PARAMETERS:
                continue
            comment = "; ".join(x for x in (p.description, p.range_text) if x)
            lines.append(f"{p.name} = {_toml_str(p.default)}" + (f"  # {comment}" if comment else ""))
    return "\n".join(lines) + "\n"


def _new(path: Path, templates: list[str], extra: list[str]) -> int:
    if path.exists():
        print(f"calcpad: {path} already exists; not overwriting it (choose another name)", file=sys.stderr)
        return EXIT_BAD
    text = starter_job(templates or ["leg_bending"], extra)
    try:
        with open(path, "x", encoding="utf-8") as fh:
            fh.write(text)
    except FileExistsError:
        print(f"calcpad: {path} already exists; not overwriting it", file=sys.stderr)
        return EXIT_BAD
    print(f"starter job written: {path}")
    return EXIT_OK


# ----------------------------------------------------------------------------- issue


def _issue(args: argparse.Namespace) -> int:
    from calcpad.runner.outfolder import issue_revision, revision_folder

    info = issue_revision(args.out, args.by, args.revision, wait=args.wait)
    folder = Path(args.out) / revision_folder(info["revision"])
    print(f"revision {info['revision']} issued by {info['by']} on {info['date']}: {folder} is sealed read-only")
    return EXIT_OK


# ----------------------------------------------------------------------------- verify, diff


def _rtol(text: str) -> float:
    try:
        value = float(text)
    except ValueError:
        value = float("nan")
    if not (0.0 <= value < 1.0):
        raise argparse.ArgumentTypeError(f"{text!r}; expected a relative tolerance such as 1e-6 (0 up to 1)")
    return value


def _verify(args: argparse.Namespace) -> int:
    """``calcpad verify OUT``: exit 0 when intact and reproduced, 1 on any difference."""
    from rich.console import Console

    from calcpad.runner.recordfile import load_record
    from calcpad.runner.verify import verify_record, verify_renderables

    path, record = load_record(args.out, args.revision)
    report = verify_record(record, rtol=args.rtol, path=path, templates=args.templates)
    out = Console()
    for part in verify_renderables(report):
        out.print(part, highlight=False)
    out.print("verified: intact and reproduced" if report.ok else "[bold red]NOT verified[/bold red]: see the differences above", highlight=False)
    return EXIT_OK if report.ok else EXIT_NG


def _diff(args: argparse.Namespace) -> int:
    """``calcpad diff OLD NEW``: exit 0 when nothing changed, 1 when something did."""
    from rich.console import Console

    from calcpad.runner.diff import diff_html, diff_records, diff_table, no_changes_text
    from calcpad.runner.record import record_digest
    from calcpad.runner.recordfile import load_record

    (old_path, old), (new_path, new) = load_record(args.old), load_record(args.new)
    out = Console()
    for path, rec in ((old_path, old), (new_path, new)):
        try:
            intact = record_digest(rec) == rec.get("record_digest")
        except (TypeError, ValueError):
            intact = False
        if not intact:
            out.print(f"warning: {path} does not match its record_digest (edited after it was written)", highlight=False, soft_wrap=True)
    diff = diff_records(old, new, rtol=args.rtol)
    heading = f"Changes from {old_path} (rev. {diff.old_label}) to {new_path} (rev. {diff.new_label})"
    if diff.changed:
        out.print(diff_table(diff, title=heading), highlight=False)
        n = len(diff.rows())
        out.print(f"{n} change{'s' if n != 1 else ''}; results compared to a relative tolerance of {diff.rtol:g}", highlight=False)
    else:  # a sentence, not a table with no rows
        out.print(heading, highlight=False, soft_wrap=True)
        out.print(f"{no_changes_text(diff)} Results compared to a relative tolerance of {diff.rtol:g}.", highlight=False, soft_wrap=True)
        if diff.versions:
            out.print("versions: " + "; ".join(f"{c.item} {c.old} → {c.new}" for c in diff.versions), highlight=False, soft_wrap=True)
    if args.html:
        from calcpad.core.errors import CalcpadError

        target = Path(args.html)
        if target.exists() and not target.read_text(encoding="utf-8", errors="replace").startswith(_DIFF_MARK):
            raise CalcpadError(f"--html {args.html}: the file exists and was not written by calcpad diff; choose another name")
        _write_atomic(target, f"{_DIFF_MARK}\n{diff_html(diff)}\n")
        print(f"changes written: {target}", file=sys.stderr)
    return EXIT_NG if diff.changed else EXIT_OK


_DIFF_MARK = "<!-- calcpad diff -->"


# ----------------------------------------------------------------------------- lab, template new/store


def _with_template_dir(folder: Path) -> None:
    """Put ``folder`` first in the template search path (for this process and kernels it starts)."""
    from calcpad.runner.template import ENV_VAR

    rest = [p for p in os.environ.get(ENV_VAR, "").split(os.pathsep) if p]
    os.environ[ENV_VAR] = os.pathsep.join([str(folder.resolve()), *rest])


def _lab(folder: Path, dry_run: bool) -> int:
    """Open JupyterLab on the template library with the project's kernel."""
    import shutil
    import subprocess

    from calcpad.runner.kernel import KERNEL

    if not folder.is_dir():
        print(f"calcpad: {folder} is not a folder; expected the template library (default notebooks/)", file=sys.stderr)
        return EXIT_BAD
    cmd = [sys.executable, "-m", "jupyterlab", str(folder)]
    if dry_run:
        print(" ".join(cmd))
        return EXIT_OK
    from jupyter_client.kernelspec import KernelSpecManager

    if KERNEL not in KernelSpecManager().find_kernel_specs():
        print(f"calcpad: the {KERNEL!r} kernel is not installed; run 'make venv' or "
              f"'{sys.executable} -m ipykernel install --sys-prefix --name {KERNEL}'", file=sys.stderr)
        return EXIT_BAD
    if shutil.which("jupyter") is None and not (Path(sys.executable).parent / "jupyter").exists():
        print("calcpad: JupyterLab is not installed; install the notebook extra: pip install -e '.[notebook]'", file=sys.stderr)
        return EXIT_BAD
    _with_template_dir(folder)
    return subprocess.call(cmd)


def _template_new(name: str, folder: Path, title: str) -> int:
    from calcpad.runner.scaffold import new_template

    path = new_template(name, folder, title)
    print(f"template written: {path}\nedit it, then store it: calcpad template store {path}")
    return EXIT_OK


def _template_store(target: str) -> int:
    from calcpad.runner.store import refresh_notebook
    from calcpad.runner.template import find_template, load_template

    path = find_template(target) if not Path(target).exists() else Path(target)
    if path.suffix != ".py":
        print(f"calcpad: {path} is not a .py template source; store pairs NAME.py with NAME.ipynb", file=sys.stderr)
        return EXIT_BAD
    load_template(path)  # the parameters cell must read (clear message before a kernel starts)
    _with_template_dir(path.parent)
    try:
        target_nb = refresh_notebook(path)
    except Exception as exc:  # a failing cell: nbclient's error names the cell and the exception
        print(f"calcpad: storing {path} failed, nothing written:\n{exc}", file=sys.stderr)
        return EXIT_BAD
    print(f"stored: {target_nb}")
    return EXIT_OK


# ----------------------------------------------------------------------------- main


def _parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(prog="calcpad", description="Traceable engineering calc sheets and submittals.")
    sub = parser.add_subparsers(dest="command", required=True)
    library = argparse.ArgumentParser(add_help=False)
    library.add_argument(
        "--templates", action="append", default=[], metavar="DIR",
        help="a template folder to use besides notebooks/ (repeatable); templates are code: register only code you trust",
    )
    waiting = argparse.ArgumentParser(add_help=False)
    waiting.add_argument("--wait", type=_wait_seconds, default=30.0, metavar="SECONDS", help="wait this long for another run writing the same folder (default 30)")
    run = sub.add_parser("run", parents=[library, waiting], help="run a job file (or one template with --set) and write the submittal")
    run.add_argument("target", help="JOB.toml, or a template (NAME, or a NAME.py/.ipynb file in a template folder)")
    run.add_argument("--out", help="output folder; each revision goes to OUT/rev-<revision> (job default: build/JOBNAME; template default: print only)")
    run.add_argument("--notebooks", action="store_true", help="run in a Jupyter kernel and keep executed notebooks in OUT/rev-*/notebooks")
    run.add_argument("--json", action="store_true", help="print the job record as JSON on stdout")
    run.add_argument("--set", action="append", metavar='NAME="VALUE UNIT"',
                     help='set a parameter (repeatable): NAME="..." on a template run, MARK.NAME="..." on a job run '
                          "(only the changed calcs run and print; nothing is written unless --out is given)")
    run.add_argument("--print", metavar="full|summary|calc:MARK", help="what the submittal prints (default: the job's `print`, else full)")
    run.add_argument("--no-pdf", action="store_true", help="write submittal.html only (no Chromium run)")
    run.add_argument("--member", help="template run: member mark (default '-')")
    run.add_argument("--workers", type=_worker_count, metavar="N", help="run the calcs (and design searches) on a local Dask cluster of N worker processes")
    run.add_argument("--scheduler", metavar="ADDRESS", help="run on an existing Dask cluster, e.g. tcp://10.0.0.5:8786 (its workers need calcpad and the templates)")
    issue = sub.add_parser("issue", parents=[waiting], help="mark a revision in an output folder as issued and seal it read-only")
    issue.add_argument("out", help="the output folder of a run (--out)")
    issue.add_argument("--by", required=True, help="who issues it (name, title)")
    issue.add_argument("--revision", help="revision to issue (default: the latest written)")
    sub.add_parser("templates", parents=[library], help="list templates and their parameters")
    new = sub.add_parser("new", parents=[library], help="write a starter job file (never overwrites)")
    new.add_argument("path", help="JOB.toml to create")
    new.add_argument("--template", action="append", default=[], help="template to include (repeatable; default leg_bending)")
    lab = sub.add_parser("lab", help="open JupyterLab on the template library with the calcpad kernel")
    lab.add_argument("folder", nargs="?", default=str(ROOT / "notebooks"), help="template folder (default: the repository's notebooks/)")
    lab.add_argument("--dry-run", action="store_true", help="print the command instead of running it")
    tpl = sub.add_parser("template", help="start a template of your own, or store one (execute and pair .py/.ipynb)")
    tsub = tpl.add_subparsers(dest="template_command", required=True)
    tnew = tsub.add_parser("new", help="write NAME.py: parameters with ranges, a sheet, a summary, a what-if cell (never overwrites)")
    tnew.add_argument("name", help="template name (lower case, digits, _)")
    tnew.add_argument("--dir", default="notebooks", help="folder to write it in (default notebooks/)")
    tnew.add_argument("--title", default="", help="title of the calc")
    tstore = tsub.add_parser("store", help="execute NAME.py and write the paired NAME.ipynb (nbval then covers it)")
    tstore.add_argument("target", help="template name or NAME.py")
    demo = sub.add_parser("demo", help="render the first template to build/demo")
    demo.add_argument("--out", default="build/demo", help="output folder (default build/demo)")
    verify = sub.add_parser("verify", parents=[library], help="check a record is intact and re-run its calcs to reproduce it")
    verify.add_argument("out", help="output folder (or its record.json)")
    verify.add_argument("--revision", help="revision sub-folder to verify (default: the newest)")
    verify.add_argument("--rtol", type=_rtol, default=1e-9, help="relative tolerance on values (default 1e-9)")
    diff = sub.add_parser("diff", help="list what changed between two runs (folders or record.json files)")
    diff.add_argument("old", help="older output folder or record.json")
    diff.add_argument("new", help="newer output folder or record.json")
    diff.add_argument("--rtol", type=_rtol, default=1e-6, help="relative tolerance on values (default 1e-6)")
    diff.add_argument("--html", metavar="FILE", help="also write the changes as an HTML fragment for a submittal")
    return parser


def _worker_count(text: str) -> int:
    try:
        value = int(text)
    except ValueError:
        value = 0
    if not 1 <= value <= 256:
        raise argparse.ArgumentTypeError(f"{text!r}; expected a number of worker processes from 1 to 256")
    return value


def _wait_seconds(text: str) -> float:
    try:
        value = float(text)
    except ValueError:
        value = math.nan
    if not math.isfinite(value) or value < 0:
        raise argparse.ArgumentTypeError(f"{text!r}; expected seconds, a number from 0 up")
    return value


def _check_library(args: argparse.Namespace) -> None:
    from calcpad.core.errors import CalcpadError

    for d in getattr(args, "templates", []):
        if not Path(d).is_dir():
            raise CalcpadError(f"--templates {d}: not a folder; give a folder of template notebooks")


def _dispatch(args: argparse.Namespace) -> int:
    _check_library(args)
    if args.command == "run":
        return _run(args)
    if args.command == "issue":
        return _issue(args)
    if args.command == "templates":
        return _templates(args.templates)
    if args.command == "new":
        return _new(Path(args.path), args.template, args.templates)
    if args.command == "demo":
        return _demo(Path(args.out))
    if args.command == "verify":
        return _verify(args)
    if args.command == "diff":
        return _diff(args)
    if args.command == "lab":
        return _lab(Path(args.folder), args.dry_run)
    if args.command == "template":
        if args.template_command == "new":
            return _template_new(args.name, Path(args.dir), args.title)
        return _template_store(args.target)
    return EXIT_BAD  # pragma: no cover


def _save_traceback() -> str:
    """Write the current exception's traceback to a new log file in the temp folder; its path."""
    fd, path = tempfile.mkstemp(prefix="calcpad-error-", suffix=".log")
    with os.fdopen(fd, "w", encoding="utf-8") as fh:
        fh.write(f"calcpad {' '.join(sys.argv[1:])}\n\n")
        fh.write(traceback.format_exc())
    return path


def _caused_by_interrupt(exc: BaseException) -> bool:
    """True when a KeyboardInterrupt is in ``exc``'s chain (Python wraps some, e.g. in class creation)."""
    seen: set[int] = set()
    cur: BaseException | None = exc
    while cur is not None and id(cur) not in seen:
        if isinstance(cur, KeyboardInterrupt):
            return True
        seen.add(id(cur))
        cur = cur.__cause__ or cur.__context__
    return False


def _internal_error(exc: Exception) -> int:
    head = f"calcpad: internal error ({type(exc).__name__}: {str(exc).splitlines()[0] if str(exc) else ''})"
    try:
        log = _save_traceback()
    except OSError:
        print(f"{head}; the details could not be saved. Please report it.", file=sys.stderr)
    else:
        print(f"{head}; details saved to {log}. Please report it with that file.", file=sys.stderr)
    return EXIT_INTERNAL


def main(argv: list[str] | None = None) -> int:
    """Entry point of the ``calcpad`` console script; returns the exit code (see module doc).

    Everything heavy (sympy, pint, the runner) is imported in here, so Ctrl-C while calcpad
    starts is reported like any other interruption.
    """
    try:
        from calcpad.core.errors import CalcpadError

        try:
            return _dispatch(_parser().parse_args(argv))
        except CalcpadError as exc:
            print(f"calcpad: {exc}", file=sys.stderr)
            return int(getattr(exc, "exit_code", EXIT_BAD))
        except OSError as exc:
            where = exc.filename if exc.filename is not None else "a file"
            print(f"calcpad: cannot read or write {where}: {exc.strerror or exc}", file=sys.stderr)
            return EXIT_WRITE
    except KeyboardInterrupt:
        print("calcpad: interrupted", file=sys.stderr)
        return EXIT_INTERRUPTED
    except Exception as exc:
        if _caused_by_interrupt(exc):
            print("calcpad: interrupted", file=sys.stderr)
            return EXIT_INTERRUPTED
        return _internal_error(exc)


def exit_with(code: int) -> NoReturn:
    """End the process with ``code``. After an interruption it ends at once (``os._exit``,
    streams flushed): every file and lock was settled while the interrupt unwound, and skipping
    the interpreter's shutdown keeps a library the interrupt left mid-call from aborting the
    process on the way out ("Fatal Python error ... finalizing", exit code -6 instead of 130: 4 of
    20 runs of ``tests/runner/test_kill.py::test_ctrl_c_at_random_points``, 4 interrupts each)."""
    if code == EXIT_INTERRUPTED:
        for stream in (sys.stdout, sys.stderr):
            with contextlib.suppress(Exception):
                stream.flush()
        os._exit(code)
    sys.exit(code)


def console() -> NoReturn:
    """The ``calcpad`` console script: :func:`main`, then :func:`exit_with` its code."""
    exit_with(main())


if __name__ == "__main__":
    console()
