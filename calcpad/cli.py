"""Command line.

::

    calcpad run JOB.toml [--out DIR] [--notebooks] [--json]
    calcpad run TEMPLATE.py|.ipynb|NAME --set name="value unit" ... [--member M1] [--out DIR] [--json]
    calcpad templates
    calcpad new JOB.toml [--template NAME ...]
    calcpad lab [FOLDER] [--dry-run]
    calcpad template new NAME [--dir DIR] [--title TITLE]
    calcpad template store NAME|NAME.py
    calcpad demo

Exit codes: 0 every check OK, 1 some check NG, 2 bad input (nothing written) or a calc failed
to run (the other calcs still run; the folder is written and marks the failure).
"""

from __future__ import annotations

import argparse
import json
import os
import runpy
import sys
import tempfile
import time
from pathlib import Path
from typing import Any

from calcpad.core.errors import CalcpadError

__all__ = ["main"]

ROOT = Path(__file__).resolve().parent.parent
EXIT_OK, EXIT_NG, EXIT_BAD = 0, 1, 2


def _write_atomic(path: Path, text: str) -> None:
    path.parent.mkdir(parents=True, exist_ok=True)
    fd, tmp = tempfile.mkstemp(dir=path.parent, suffix=".tmp")
    with os.fdopen(fd, "w", encoding="utf-8") as fh:
        fh.write(text)
    os.replace(tmp, path)


def _demo(out_dir: Path) -> int:
    from calcpad.core.sheet import Sheet
    from calcpad.render.html import CAUTION, html_document, sheet_html_fragment
    from calcpad.render.text import sheet_text

    template = ROOT / "notebooks" / "leg_bending.py"
    scope = runpy.run_path(str(template), run_name="calcpad_template")
    sheets = [v for v in scope.values() if isinstance(v, Sheet)]
    body = f'<div class="caution">{CAUTION}</div>' + "".join(sheet_html_fragment(s.evaluate()) for s in sheets)
    target = out_dir / "leg_bending.html"
    _write_atomic(target, html_document(body, "calcpad demo"))
    for s in sheets:
        print(sheet_text(s.evaluate()))
    print(f"submittal written: {target}")
    return 0 if all(s.evaluate().ok for s in sheets) else 1


# ----------------------------------------------------------------------------- run


def _is_template(target: str) -> bool:
    return target.endswith((".py", ".ipynb")) or (not target.endswith(".toml") and not Path(target).exists())


def _run(args: argparse.Namespace) -> int:
    from rich.console import Console
    from rich.markup import escape
    from rich.progress import BarColumn, MofNCompleteColumn, Progress, TextColumn, TimeElapsedColumn

    from calcpad.runner.execute import run_job
    from calcpad.runner.job import load_job, single_template_job
    from calcpad.runner.record import job_record, write_outputs

    err = Console(stderr=True)
    out = Console()
    if _is_template(args.target):
        job = single_template_job(args.target, args.set or [], member=args.member or "-")
        out_dir = Path(args.out) if args.out else None
    else:
        job = load_job(args.target)
        out_dir = Path(args.out) if args.out else Path("build") / Path(args.target).stem
        if args.set:  # a what-if on the job: only the changed calcs run, printed; nothing written without --out
            job = job_what_if(job, args.set)
            out_dir = Path(args.out) if args.out else None
    mode = "kernel" if args.notebooks else "inprocess"
    start = time.perf_counter()
    failures: list[str] = []

    with Progress(
        TextColumn("[progress.description]{task.description}"),
        BarColumn(),
        MofNCompleteColumn(),
        TimeElapsedColumn(),
        console=err,
        transient=True,
        disable=args.json and not err.is_terminal,
    ) as bar:
        task = bar.add_task("starting kernel" if mode == "kernel" else "running calcs", total=len(job.calcs))

        def tick(o: Any) -> None:
            bar.update(task, advance=1, description=f"{o.calc.template.name} {o.calc.member}")
            if o.error is not None:
                msg = f"calc {o.calc.number} ({o.calc.location}, member {o.calc.member}): template {o.calc.template.name!r}, cell {o.error['cell']}: {o.error['message']}"
                failures.append(msg)
                bar.console.print(f"[bold]FAILED[/bold] {escape(msg)}", markup=True, highlight=False, soft_wrap=True)

        outcomes = run_job(job, mode=mode, progress=tick)
    seconds = time.perf_counter() - start
    record = job_record(job, outcomes, mode, seconds)
    if out_dir is not None:
        write_outputs(out_dir, job, outcomes, record, notebooks=args.notebooks)
    if args.json:
        print(json.dumps(record, indent=1, ensure_ascii=False, allow_nan=False))
    else:
        _print_summary(out, job, outcomes, record)
        if out_dir is None:
            for o in outcomes:
                for s in o.sheets:
                    _print_sheet_text(out, s)
    if out_dir is not None:
        err.print(f"submittal written: {out_dir / 'submittal.html'}", highlight=False, soft_wrap=True)
    summ = record["summary"]
    if summ["errors"]:
        return EXIT_BAD
    return EXIT_NG if summ["ng"] else EXIT_OK


def _print_summary(out: Any, job: Any, outcomes: list[Any], record: dict[str, Any]) -> None:
    from rich.table import Table

    t = Table(title=f"{job.info.number} {job.info.title}", title_justify="left")
    for col in ("Calc", "Member", "Template", "Check", "Ratio", "Status"):
        t.add_column(col, justify="right" if col in ("Calc", "Ratio") else "left")
    for o, c in zip(outcomes, record["calcs"], strict=True):
        if o.error is not None:
            t.add_row(str(o.calc.number), o.calc.member, o.calc.template.name, f"cell {o.error['cell']}: {o.error['message']}", "—", "ERROR")
        for ch in c["checks"]:
            t.add_row(str(o.calc.number), o.calc.member, o.calc.template.name, ch["name"], f"{ch['ratio']:.3f}", ch["status"])
    out.print(t)
    s = record["summary"]
    out.print(f"{s['calcs']} calcs, {s['checks']} checks: {s['ok']} OK, {s['ng']} NG, {s['errors']} failed — {s['status']}", highlight=False)


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

    from calcpad.core.units import parse_quantity
    from calcpad.runner.job import Job, JobError

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
        except CalcpadError as exc:
            problems.append((where, str(exc).removeprefix(f"{where}: ")))
            continue
        changed[calc.number] = replace(calc, inputs={**calc.inputs, name: coerced})
    if problems:
        raise JobError(job.source, problems)
    calcs = [replace(c, number=i) for i, c in enumerate(sorted(changed.values(), key=lambda c: c.number), start=1)]
    return Job(job.info, calcs, job.source)


# ----------------------------------------------------------------------------- templates, new


def _templates() -> int:
    from rich.console import Console
    from rich.table import Table

    from calcpad.runner.template import list_templates, load_template

    out = Console()
    found = list_templates()
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


def starter_job(templates: list[str]) -> str:
    """Text of a starter job file with every parameter of each template at its default."""
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
    ]
    for name in templates:
        tpl = load_template(find_template(name))
        lines += ["", "[[calcs]]", f"template = {_toml_str(tpl.name)}", 'member = "M1"', "[calcs.inputs]"]
        for p in tpl.parameters.values():
            if p.name == "member_mark":
                continue
            comment = "; ".join(x for x in (p.description, p.range_text) if x)
            lines.append(f"{p.name} = {_toml_str(p.default)}" + (f"  # {comment}" if comment else ""))
    return "\n".join(lines) + "\n"


def _new(path: Path, templates: list[str]) -> int:
    if path.exists():
        print(f"calcpad: {path} already exists; not overwriting it (choose another name)", file=sys.stderr)
        return EXIT_BAD
    text = starter_job(templates or ["leg_bending"])
    try:
        with open(path, "x", encoding="utf-8") as fh:
            fh.write(text)
    except FileExistsError:
        print(f"calcpad: {path} already exists; not overwriting it", file=sys.stderr)
        return EXIT_BAD
    print(f"starter job written: {path}")
    return EXIT_OK


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

    from calcpad.runner.store import KERNEL

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
    run = sub.add_parser("run", help="run a job file (or one template with --set) and write the submittal")
    run.add_argument("target", help="JOB.toml, or a template (NAME, NAME.py, NAME.ipynb)")
    run.add_argument("--out", help="output folder (job default: build/JOBNAME; template default: print only)")
    run.add_argument("--notebooks", action="store_true", help="run in a Jupyter kernel and keep executed notebooks in OUT/notebooks")
    run.add_argument("--json", action="store_true", help="print the job record as JSON on stdout")
    run.add_argument("--set", action="append", metavar='NAME="VALUE UNIT"',
                     help='set a parameter (repeatable): NAME="..." on a template run, MARK.NAME="..." on a job run '
                          "(only the changed calcs run and print; nothing is written unless --out is given)")
    run.add_argument("--member", help="template run: member mark (default '-')")
    sub.add_parser("templates", help="list templates and their parameters")
    new = sub.add_parser("new", help="write a starter job file (never overwrites)")
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
    return parser


def main(argv: list[str] | None = None) -> int:
    """Entry point of the ``calcpad`` console script."""
    args = _parser().parse_args(argv)
    try:
        if args.command == "run":
            return _run(args)
        if args.command == "templates":
            return _templates()
        if args.command == "new":
            return _new(Path(args.path), args.template)
        if args.command == "demo":
            return _demo(Path(args.out))
        if args.command == "lab":
            return _lab(Path(args.folder), args.dry_run)
        if args.command == "template":
            if args.template_command == "new":
                return _template_new(args.name, Path(args.dir), args.title)
            return _template_store(args.target)
    except CalcpadError as exc:
        print(f"calcpad: {exc}", file=sys.stderr)
        return EXIT_BAD
    return EXIT_BAD  # pragma: no cover


if __name__ == "__main__":
    raise SystemExit(main())
