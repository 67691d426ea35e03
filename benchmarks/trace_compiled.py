"""Print what a compiled sheet does: the numpy calls of each step, with the time of each call.

The compiled sheet is closures, not generated source, so this records the calls instead: the
module's ``np`` is swapped for a recorder while the bench leg chain (``bench_core.leg_sheet``)
runs once. ``--blocks`` runs a whole call in blocks (as large calls do) and lists the calls of
the second block; without it the plan runs once over all cases (the pre-blocks behaviour, also
what calls smaller than a block do). ``--before`` traces ``compiled.py`` of ``bench_core.BEFORE``
(its operators written as ``x * y`` on arrays are not numpy-module calls and are not listed).

Run: ``.venv/bin/python benchmarks/trace_compiled.py [--cases 1000000] [--two] [--blocks] [--before]``
(``--two``: only P and L vary, the rest stay scalars).
"""

from __future__ import annotations

import argparse
import importlib.util
import subprocess
import sys
import tempfile
import time
import types
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(ROOT / "benchmarks"))

from bench_core import BEFORE, leg_sheet  # noqa: E402

RECORDED = ("where", "copyto")


def describe(a: object) -> str:
    if isinstance(a, np.ndarray):
        return f"array{a.shape}" if a.ndim else f"{float(a):.6g}"
    return f"{float(a):.6g}" if isinstance(a, (float, int, np.floating)) else type(a).__name__


class Recorder(types.ModuleType):
    """numpy with every ufunc (and where/copyto) call recorded: text and seconds."""

    def __init__(self) -> None:
        super().__init__("np")
        self.log: list[tuple[str, float]] = []

    def __getattr__(self, name: str):
        real = getattr(np, name)
        if not (isinstance(real, np.ufunc) or name in RECORDED):
            return real

        def call(*args, **kw):
            t0 = time.perf_counter()
            res = real(*args, **kw)
            dt = time.perf_counter() - t0
            out = kw.get("out")
            where = ""
            if out is not None:
                same = [i for i, a in enumerate(args) if a is out]
                if same:
                    where = f"  -> into argument {same[0] + 1}"
                else:
                    where = "  -> into its output rows" if out.base is not None else "  -> into a pooled buffer"
            self.log.append((f"{name}({', '.join(describe(a) for a in args)}){where}", dt))
            return res

        return call


def load(before: bool):
    if not before:
        from calcpad.core import compiled

        return compiled
    src = subprocess.run(["git", "show", f"{BEFORE}:calcpad/core/compiled.py"], cwd=ROOT, capture_output=True, text=True, check=True).stdout
    path = Path(tempfile.mkdtemp(prefix="calcpad-trace-")) / "compiled_before.py"
    path.write_text(src)
    spec = importlib.util.spec_from_file_location("compiled_before", path)
    mod = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(mod)
    return mod


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--cases", type=int, default=1_000_000)
    ap.add_argument("--two", action="store_true", help="only P and L vary")
    ap.add_argument("--blocks", action="store_true", help="a whole call in blocks; the first block's calls")
    ap.add_argument("--before", action="store_true", help=f"trace compiled.py of commit {BEFORE}")
    args = ap.parse_args()
    mod = load(args.before)
    rec = Recorder()
    mod.np = rec
    for table in ("_UFUNCS", "_COMPARE"):
        for key, fn in getattr(mod, table).items():
            getattr(mod, table)[key] = getattr(rec, fn.__name__)
    f = mod.CompiledSheet(leg_sheet())
    rng = np.random.default_rng(1)
    n = args.cases
    ins = {"P": rng.uniform(50, 500, n), "L": rng.uniform(24, 120, n)}
    if not args.two:
        ins.update(D_o=rng.uniform(1.5, 4.5, n), t=rng.uniform(0.1, 0.3, n), F_y=rng.uniform(30, 50, n))
    steps = [name for name, _fn in f._plan]
    if args.blocks:
        if not hasattr(mod, "BLOCK_CASES"):
            raise SystemExit("the traced compiled.py has no blocks")
        per_step: dict[str, list[tuple[str, float]]] = {}
        seen: set[str] = set()
        real_fails = f._fails

        def fails(name, v, env):  # called right after each step: cut the log there (second block kept)
            if name in seen and name not in per_step:
                per_step[name] = list(rec.log)
            seen.add(name)
            rec.log.clear()
            return real_fails(name, v, env)

        f._fails = fails
        f(**ins)
        print(f"second block ({mod.BLOCK_CASES:,} cases; the first one touches fresh memory) of a call over {n:,} cases:")
    else:
        env = f._inputs(ins)
        per_step = {}
        with np.errstate(all="ignore"):
            for name, fn in f._plan:
                rec.log.clear()
                v = fn(env)
                env[name] = v[0] if isinstance(v, tuple) else v
                per_step[name] = list(rec.log)
        print(f"one pass over {n:,} cases:")
    for name in steps:
        print(f"{name}:")
        for line, dt in per_step.get(name, []):
            print(f"    {line:72s} {dt * 1e3:7.3f} ms")


if __name__ == "__main__":
    main()
