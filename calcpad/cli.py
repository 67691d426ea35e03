"""Command line.

::

    calcpad run JOB.toml [--out DIR] [--notebooks] [--json]
    calcpad run TEMPLATE.py|.ipynb|NAME --set name="value unit" ... [--member M1] [--out DIR] [--json]
    calcpad templates
    calcpad new JOB.toml [--template NAME ...]
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
        if args.set:
            raise CalcpadError("--set applies to a template run (calcpad run TEMPLATE.py --set ...); put job values in the job file")
        job = load_job(args.target)
        out_dir = Path(args.out) if args.out else Path("build") / Path(args.target).stem
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
                    _print_sheet_text(out, s["record"])
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
    slender = f" ({s['slender']} above recommended slenderness)" if s.get("slender") else ""
    out.print(f"{s['calcs']} calcs, {s['checks']} checks: {s['ok']} OK{slender}, {s['ng']} NG, {s['errors']} failed — {s['status']}",
              highlight=False)


def _print_sheet_text(out: Any, rec: dict[str, Any]) -> None:
    out.print(f"\n{rec['title']}", style="bold", highlight=False)
    for name, r in rec["results"].items():
        out.print(f"  {name} = {r['value']:.4g} {r['unit']}", highlight=False)


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


# ----------------------------------------------------------------------------- main


def _parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(prog="calcpad", description="Traceable engineering calc sheets and submittals.")
    sub = parser.add_subparsers(dest="command", required=True)
    run = sub.add_parser("run", help="run a job file (or one template with --set) and write the submittal")
    run.add_argument("target", help="JOB.toml, or a template (NAME, NAME.py, NAME.ipynb)")
    run.add_argument("--out", help="output folder (job default: build/JOBNAME; template default: print only)")
    run.add_argument("--notebooks", action="store_true", help="run in a Jupyter kernel and keep executed notebooks in OUT/notebooks")
    run.add_argument("--json", action="store_true", help="print the job record as JSON on stdout")
    run.add_argument("--set", action="append", metavar='NAME="VALUE UNIT"', help="template run: set a parameter (repeatable)")
    run.add_argument("--member", help="template run: member mark (default '-')")
    sub.add_parser("templates", help="list templates and their parameters")
    new = sub.add_parser("new", help="write a starter job file (never overwrites)")
    new.add_argument("path", help="JOB.toml to create")
    new.add_argument("--template", action="append", default=[], help="template to include (repeatable; default leg_bending)")
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
    except CalcpadError as exc:
        print(f"calcpad: {exc}", file=sys.stderr)
        return EXIT_BAD
    return EXIT_BAD  # pragma: no cover


if __name__ == "__main__":
    raise SystemExit(main())
