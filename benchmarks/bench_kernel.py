"""Kernel mode vs in-process on the same calcs, now and before (one notebook per calc), in one run.

The example job's calcs repeated to ``--calcs`` run in-process and in kernel mode in the same
interpreter (the in-process run first warms imports and caches; the kernel's first calc, which
imports the engine in the kernel, is left out of the per-calc figure and the start of the
kernel is printed apart). "before" is the same child run on commit ``BEFORE`` (the runner that
executed one nbclient notebook per calc with ``%reset`` between calcs), taken with
``git archive``. Within a child in-process and kernel runs alternate (``--inner`` pairs), and
rounds alternate the two codes; the best of each is kept.

Run: ``.venv/bin/python benchmarks/bench_kernel.py [--calcs 24] [--rounds 1] [--inner 2]``
(2-core shared machine: read the ratios, not the absolutes).
"""

from __future__ import annotations

import argparse
import json
import subprocess
import sys
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
BEFORE = "8ca7137"  # main before kernel mode ran one request per calc

CHILD = r"""
import dataclasses, json, sys, time
root, n = sys.argv[1], int(sys.argv[2])
sys.path.insert(0, root)
from calcpad.runner.execute import run_job
from calcpad.runner.job import load_job

job = load_job(root + "/examples/harbor_ridge_condenser_stand.toml")
calcs = []
while len(calcs) < n:
    for c in job.calcs:
        calcs.append(dataclasses.replace(c, number=len(calcs) + 1, member=f"{c.member}-{len(calcs)}"))
job = dataclasses.replace(job, calcs=calcs[:n])
run_job(job)  # warm: imports, template reads and first-use caches
best = None
for _ in range(int(sys.argv[3])):  # in-process and kernel alternate, the best of each is kept
    t = time.perf_counter(); a = run_job(job); t_in = time.perf_counter() - t
    t = time.perf_counter(); b = run_job(job, mode="kernel"); t_k = time.perf_counter() - t
    same = [[s["record"] for s in o.sheets] for o in a] == [[s["record"] for s in o.sheets] for o in b]
    errors = sum(o.error is not None for o in a + b)
    r = {"calcs": n, "inprocess": t_in, "kernel": t_k, "per_in": sum(o.seconds for o in a[1:]) / (n - 1),
         "per_k": sum(o.seconds for o in b[1:]) / (n - 1), "start": t_k - sum(o.seconds for o in b), "same": same, "errors": errors}
    if best is None:
        best = r
    else:
        best = {**r, **{k: min(best[k], r[k]) for k in ("inprocess", "kernel", "per_in", "per_k", "start")},
                "same": best["same"] and same, "errors": best["errors"] + errors}
print(json.dumps(best))
"""


def measure(root: Path, n: int, inner: int) -> dict:
    proc = subprocess.run([sys.executable, "-c", CHILD, str(root), str(n), str(inner)], capture_output=True, text=True, cwd=root)
    if proc.returncode != 0:
        raise SystemExit(f"benchmark child failed ({root}):\n{proc.stderr[-2000:]}")
    res = json.loads(proc.stdout.strip().splitlines()[-1])
    if res["errors"]:
        raise SystemExit(f"{res['errors']} calcs failed in {root}")
    return res


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--calcs", type=int, default=24, help="calcs (the example job's mix repeated)")
    ap.add_argument("--rounds", type=int, default=1, help="alternating rounds of the two codes (best kept)")
    ap.add_argument("--inner", type=int, default=2, help="in-process/kernel pairs within each child (best kept)")
    args = ap.parse_args()
    with tempfile.TemporaryDirectory(prefix="calcpad-kernel-before-") as tmp:
        archive = subprocess.run(["git", "archive", BEFORE, "calcpad", "notebooks", "examples"], cwd=ROOT, capture_output=True, check=True)
        subprocess.run(["tar", "-x", "-C", tmp], input=archive.stdout, check=True)
        runs: dict[str, list[dict]] = {"before": [], "now": []}
        for _ in range(args.rounds):
            runs["before"].append(measure(Path(tmp), args.calcs, args.inner))
            runs["now"].append(measure(ROOT, args.calcs, args.inner))
    print(f"example job mix, {args.calcs} calcs; per calc = mean over calcs 2..n (the first imports the engine in the kernel)")
    print(f"{'code':8s} {'in-process':>14s} {'kernel':>14s} {'kernel/in-process':>18s} {'whole run ratio':>16s} {'kernel start':>13s}  same records")
    for name, rs in runs.items():
        r = min(rs, key=lambda x: x["per_k"])
        print(f"{name:8s} {r['per_in'] * 1e3:11.1f} ms {r['per_k'] * 1e3:11.1f} ms {r['per_k'] / r['per_in']:17.2f}x "
              f"{r['kernel'] / r['inprocess']:15.2f}x {r['start']:11.1f} s  {r['same']}")
    b, n = (min(rs, key=lambda x: x["per_k"]) for rs in (runs["before"], runs["now"]))
    print(f"kernel per calc now/before = {n['per_k'] / b['per_k']:.2f}")


if __name__ == "__main__":
    main()
