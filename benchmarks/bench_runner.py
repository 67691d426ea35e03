"""Runner speed: this code against the baseline commit, side by side in one run.

1. The example job's mix (its calcs repeated to about 100, in-process, records and HTML
   collected as `calcpad run` does): ms per calc now and at the baseline, and the ratio
   (goal <= 0.1). Each code runs its own example job (today's has heavier templates: frame
   analyses, the canopy frame), so a second line runs the same calcs in both: the baseline's
   example job without wind_rooftop_stand (whose parameters changed since). The example mix
   repeats the example job's calcs (and the warm-up ran them), so a third line runs it with the
   loads scaled a little on each repetition: what content caches cannot serve.
2. A large generated job (leg_bending, one calc per member, loads varying): time and peak
   memory now for 1,000 and 10,000 calcs, the baseline for 1,000 (goal: 10,000 in under a
   minute, memory flat in the number of members: the growth per calc printed).
3. Kernel mode vs in-process on the example job (now only).

The baseline is the code of commit ``BASELINE`` (the runner before the speed work), taken with
``git archive`` into a temporary folder and run in its own interpreter, alternating with the
current code so machine noise hits both alike; the best of the rounds is kept, for wall time and
for the process's CPU time (the steadier of the two on a shared machine). Each measurement
runs in a fresh interpreter (peak memory is that process's ``ru_maxrss``).

Run: ``.venv/bin/python benchmarks/bench_runner.py [--rounds 2] [--big 10000] [--no-kernel]``
(2-core shared machine: read ratios, not absolutes).
"""

from __future__ import annotations

import argparse
import json
import subprocess
import sys
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
BASELINE = "0944982"  # main before the runner speed work (issue 15, parts 5 and 6)

#: Runs in a fresh interpreter with ``sys.path[0]`` = the code to measure; prints one JSON line.
CHILD = r"""
import dataclasses, json, resource, sys, time
root, what, n = sys.argv[1], sys.argv[2], int(sys.argv[3])
sys.path.insert(0, root)
from calcpad.runner.execute import run_job
from calcpad.runner.job import load_job, parse_job

def mix(n, job=None, distinct=False):
    job = job or load_job(root + "/examples/harbor_ridge_condenser_stand.toml")
    calcs, k = [], 0
    while len(calcs) < n:
        k += 1
        for c in job.calcs:
            inputs = {a: scaled(v, 1 + 0.01 * k) for a, v in c.inputs.items()} if distinct else c.inputs
            calcs.append(dataclasses.replace(c, number=len(calcs) + 1, member=f"{c.member}-{len(calcs)}", inputs=inputs))
    return dataclasses.replace(job, calcs=calcs[:n])

import re
LOAD = re.compile(r"^\s*([0-9]*\.?[0-9]+)\s*(lbf|kip|lbf/ft|kip/ft|psf|mph)\s*$")
def scaled(v, f):
    # a load, pressure or wind speed written as text, times f (other inputs as they are)
    m = LOAD.match(v) if isinstance(v, str) else None
    return f"{float(m.group(1)) * f:.6g} {m.group(2)}" if m else v

def generated(n):
    head = ('[job]\nnumber = "B-1"\ntitle = "Generated"\nclient = "c"\nsite = "s"\nengineer = "e"\n'
            'revision = "0"\ndate = 2025-01-01\n')
    calcs = [f'[[calcs]]\ntemplate = "leg_bending"\nmember = "L{i + 1}"\n[calcs.inputs]\nP = "{60 + i % 400} lbf"\n'
             f'N = "{100 + i % 50} lbf"\nL = "{30 + i % 30} in"\nleg = "Pipe 1-1/2 Std"\nD_o = "1.900 in"\nt = "0.145 in"\n'
             f'F_y = "35 ksi"\nFS_req = 1.67\n' for i in range(n)]
    return parse_job(head + "\n".join(calcs), "generated.toml")

warm = load_job(root + "/examples/harbor_ridge_condenser_stand.toml")
run_job(warm)  # imports, template reads and first-use caches, for both codes alike
def common(n):
    import re
    src = open(sys.argv[4], encoding="utf-8").read()
    head, *blocks = re.split(r"(?m)^(?=\[\[calcs\]\])", src)
    keep = [b for b in blocks if 'template = "wind_rooftop_stand"' not in b]
    return mix(n, parse_job(head + "".join(keep), "baseline-example.toml"))

job = (mix(n) if what == "mix" else mix(n, distinct=True) if what == "distinct" else common(n) if what == "common"
       else generated(n) if what == "big" else warm)
mode = "kernel" if what == "kernel" else "inprocess"
rss0 = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
t, c = time.perf_counter(), time.process_time()
out = run_job(job, mode=mode)
dt, cpu = time.perf_counter() - t, time.process_time() - c
errors = sum(o.error is not None for o in out)
print(json.dumps({"seconds": dt, "cpu": cpu, "calcs": len(out), "errors": errors,
                  "rss_mib": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024, "rss0_mib": rss0 / 1024}))
"""


def measure(root: Path, what: str, n: int, extra: str = "") -> dict[str, float]:
    env_python = sys.executable
    proc = subprocess.run([env_python, "-c", CHILD, str(root), what, str(n), extra], capture_output=True, text=True, cwd=root)
    if proc.returncode != 0:
        raise SystemExit(f"benchmark child failed ({root}, {what}):\n{proc.stderr[-2000:]}")
    res = json.loads(proc.stdout.strip().splitlines()[-1])
    if res["errors"]:
        raise SystemExit(f"{res['errors']} calcs failed in {root} ({what})")
    return res


def baseline_tree(tmp: Path) -> Path:
    """The baseline commit's calcpad, templates and examples, unpacked into ``tmp``."""
    archive = subprocess.run(["git", "archive", BASELINE, "calcpad", "notebooks", "examples"], cwd=ROOT, capture_output=True, check=True)
    subprocess.run(["tar", "-x", "-C", str(tmp)], input=archive.stdout, check=True)
    return tmp


def per_calc(runs: list[dict[str, float]], key: str) -> float:
    """Best of the rounds, ms per calc: ``seconds`` (wall) or ``cpu`` (this process's CPU time,
    less disturbed by other work on a shared machine)."""
    r = min(runs, key=lambda r: r[key])
    return r[key] / r["calcs"] * 1e3


def side_by_side(base: Path, what: str, n: int, rounds: int, job: str | None = None) -> tuple[int, str]:
    """Baseline and today's code run alternately ``rounds`` times on the same work: the calcs
    run and the per-calc wall and CPU times of both with their ratios (best of the rounds)."""
    b_runs, n_runs = [], []
    for _ in range(rounds):
        b_runs.append(measure(base, what, n, job or ""))
        n_runs.append(measure(ROOT, what, n, job or ""))
    per_b, per_n = per_calc(b_runs, "seconds"), per_calc(n_runs, "seconds")
    cpu_b, cpu_n = per_calc(b_runs, "cpu"), per_calc(n_runs, "cpu")
    return n_runs[0]["calcs"], (f"baseline {per_b:.1f} ms/calc, now {per_n:.1f} ms/calc, ratio now/baseline = {per_n / per_b:.2f}; "
                                f"CPU time {cpu_b:.1f} vs {cpu_n:.1f} ms/calc, ratio {cpu_n / cpu_b:.2f}")


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--rounds", type=int, default=2, help="alternating rounds per measurement (best kept)")
    ap.add_argument("--mix", type=int, default=104, help="calcs in the example-mix job")
    ap.add_argument("--big", type=int, default=10_000, help="calcs in the large generated job")
    ap.add_argument("--small", type=int, default=500, help="calcs in the generated job measured against the baseline (0: skip)")
    ap.add_argument("--no-kernel", action="store_true", help="skip the kernel-mode line")
    args = ap.parse_args()
    with tempfile.TemporaryDirectory(prefix="calcpad-baseline-") as tmp:
        base = baseline_tree(Path(tmp))
        calcs, text = side_by_side(base, "mix", args.mix, args.rounds)
        print(f"example mix, {calcs} calcs in-process: {text}   "
              "(goal <= 0.1; each code runs its own example job, and today's has heavier templates)")
        _, text = side_by_side(base, "distinct", args.mix, args.rounds)
        print(f"example mix with distinct loads (the k-th repetition's loads, pressures and wind speed x (1 + k/100): no "
              f"calc repeats the warm-up's or another's numbers, so caches of content serve only what really repeats): {text}")
        old_job = Path(tmp) / "baseline-example.toml"  # the same calcs for both codes
        old_job.write_bytes((base / "examples" / "harbor_ridge_condenser_stand.toml").read_bytes())
        calcs, text = side_by_side(base, "common", args.mix, args.rounds, str(old_job))
        print(f"same calcs, {calcs} in-process (the baseline's example job without wind_rooftop_stand, whose "
              f"parameters changed): {text}")
        small = args.small
        if small > 0:
            b1 = measure(base, "big", small)
            n1 = measure(ROOT, "big", small)
            print(f"generated job, {small} calcs: baseline {b1['seconds']:.1f} s, peak {b1['rss_mib']:.0f} MiB; "
                  f"now {n1['seconds']:.1f} s, peak {n1['rss_mib']:.0f} MiB; time ratio now/baseline = {n1['seconds'] / b1['seconds']:.2f}")
    if small > 0 and args.big > small:
        nb = measure(ROOT, "big", args.big)
        growth = (nb["rss_mib"] - n1["rss_mib"]) / (args.big - small) * 1024
        print(f"generated job, {args.big} calcs now: {nb['seconds']:.1f} s (goal < 60 s), peak {nb['rss_mib']:.0f} MiB; "
              f"growth {growth:.0f} KiB per calc between {small} and {args.big} calcs (the kept records and HTML)")
    if not args.no_kernel:
        k = measure(ROOT, "kernel", 0)
        i = measure(ROOT, "example", 0)
        print(f"example job ({i['calcs']} calcs): in-process {i['seconds']:.2f} s, kernel {k['seconds']:.2f} s, "
              f"kernel/in-process = {k['seconds'] / i['seconds']:.1f}x")


if __name__ == "__main__":
    main()
