"""Command line: ``calcpad demo`` (more commands arrive with the runner)."""

from __future__ import annotations

import argparse
import os
import runpy
import sys
import tempfile
from pathlib import Path

from calcpad.core.errors import CalcpadError

__all__ = ["main"]

ROOT = Path(__file__).resolve().parent.parent


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


def main(argv: list[str] | None = None) -> int:
    """Entry point of the ``calcpad`` console script."""
    parser = argparse.ArgumentParser(prog="calcpad", description="Traceable engineering calc sheets and submittals.")
    sub = parser.add_subparsers(dest="command", required=True)
    demo = sub.add_parser("demo", help="render the first template to build/demo")
    demo.add_argument("--out", default="build/demo", help="output folder (default build/demo)")
    args = parser.parse_args(argv)
    try:
        if args.command == "demo":
            return _demo(Path(args.out))
    except CalcpadError as exc:
        print(f"calcpad: {exc}", file=sys.stderr)
        return 2
    return 2  # pragma: no cover


if __name__ == "__main__":
    raise SystemExit(main())
