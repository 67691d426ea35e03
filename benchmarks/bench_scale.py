"""Scale-out on Dask: a 2-worker local cluster vs serial, side by side in one run.

1. A batch of generated leg calcs with full rendering (record, HTML, text per sheet).
2. A large generated sweep (lateral load x leg length x pipe size; 200 M cases by default) with the
   envelope, no table.
3. Design search over the whole pipe family for many members (cases = members x sizes per second).

Then the machine's ideal for the batch and the sweep: the same work split between ``--workers``
independent serial processes started together (no Dask) against one process doing all of it,
each warmed up first; the cluster's ratio is printed as a share of that ideal (on a shared machine
whose cores are busy with other work, two processes may not be faster than one).

Run: ``.venv/bin/python benchmarks/bench_scale.py [--calcs 2000] [--sweep 200000000] [--members 1000]
[--no-search] [--no-ideal] [--only sweep] [--repeat 5] [--trace]`` (2-core shared machine, other work
running: read the ratios, not the absolutes; goal >= 1.6x; ``--repeat`` alternates serial and
cluster runs and prints the range). Each cluster run starts a fresh cluster; every process timed
(this one, each worker, each process of the ideal) is warmed up the same way first: calcpad
imported, the leg template built, a 3 x 3 x 3 sweep run (start-up and warm-up timed apart, not
counted in the ratios); everything after that — the workers' first chunks included — is counted;
the serial sweep forgets its plans first, as fresh workers have none. Workers, and the processes
of the ideal, run with ``MALLOC_TOP_PAD_`` (see ``scale.cluster_client``); this process runs as
started (export it to compare like with like). ``--trace`` prints where a cluster run's time went,
from Dask's task stream, and the CPU seconds each process got (less than the wall time: the
machine's other work had the cores).
"""

from __future__ import annotations

import argparse
import json
import math
import os
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from calcpad.runner.build import SheetBuilder  # noqa: E402
from calcpad.runner.execute import run_job  # noqa: E402
from calcpad.runner.job import Calc, Job, JobInfo  # noqa: E402
from calcpad.runner.scale import MALLOC_TOP_PAD, cluster_client, run_calcs_on_cluster, search_on_cluster  # noqa: E402
from calcpad.runner.search import candidates, search  # noqa: E402
from calcpad.runner.sweep import steps, sweep  # noqa: E402
from calcpad.runner.template import find_template, load_template  # noqa: E402


def _job(n: int) -> Job:
    tpl = load_template(find_template("leg_bending"))
    base = {k: p.default for k, p in tpl.parameters.items() if k not in ("member_mark", "calc_title")}
    calcs = [Calc(i + 1, f"gen[{i + 1}]", tpl, f"L{i + 1}", {**base, "P": f"{40 + (i * 7) % 300} lbf", "L": f"{18 + (i * 5) % 70} in"})
             for i in range(n)]
    return Job(JobInfo("B-1", "benchmark"), calcs)


def _members(n: int) -> list[tuple[str, dict]]:
    tpl = load_template(find_template("leg_bending"))
    base = {k: p.default for k, p in tpl.parameters.items() if k not in ("member_mark", "calc_title")}
    return [(f"M{i}", {**base, "P": f"{30 + (i * 13) % 900} lbf", "L": f"{12 + (i * 7) % 150} in", "N": f"{(i * 11) % 400} lbf"}) for i in range(n)]


def _warm() -> None:
    """The warm-up of every process timed here (this one, each worker, each process of the
    ideal): import the engine, build the leg template, and sweep a 3 x 3 x 3 grid."""
    tpl = load_template(find_template("leg_bending"))
    SheetBuilder(tpl).sheets({k: p.default for k, p in tpl.parameters.items()})
    sweep(tpl, {}, {k: v[:3] for k, v in _sweep_axes(1000).items()}, envelope="L", table=False)


#: A child process for the machine's ideal: imports and warms up, says "ready", waits for "go",
#: runs its part of the work serially and prints the seconds. argv: kind, n, part, parts.
IDEAL_CHILD = r"""
import sys, time
sys.path.insert(0, sys.argv[5])
sys.path.insert(0, sys.argv[5] + "/benchmarks")
import bench_scale as b
kind, n, part, parts = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), int(sys.argv[4])
work = b.ideal_part(kind, n, part, parts)
b._warm()
work(warm=True)
print("ready", flush=True)
sys.stdin.readline()
t = time.perf_counter()
work(warm=False)
print(time.perf_counter() - t, flush=True)
"""


def _sweep_axes(cases: int, p_part: int = 0, parts: int = 1) -> dict[str, list[str]]:
    """The benchmark sweep's axes (lateral load x leg length x pipe size); ``p_part`` of ``parts``
    takes that share of the load axis (the ideal's split of the work)."""
    sizes = ["Pipe 1 Std", "Pipe 1-1/2 Std", "Pipe 2 Std", "Pipe 2-1/2 Std", "Pipe 3 Std"]
    side = max(2, int(math.sqrt(cases / len(sizes))))
    loads = steps("20 lbf", "900 lbf", side)
    a, b = p_part * len(loads) // parts, (p_part + 1) * len(loads) // parts
    return {"leg": sizes, "P": loads[a:b], "L": steps("6 in", "160 in", side)}


def ideal_part(kind: str, n: int, part: int, parts: int):
    """The work of one process of the ideal: part ``part`` of ``parts`` of the batch (its calcs)
    or of the sweep (its share of the load axis), as a callable ``work(warm)``."""
    tpl = load_template(find_template("leg_bending"))
    if kind == "batch":
        job = _job(n)
        a, b = part * n // parts, (part + 1) * n // parts
        mine = Job(job.info, job.calcs[a:b])
        return lambda warm: run_job(Job(job.info, job.calcs[:2]) if warm else mine)
    axes = _sweep_axes(n, part, parts)
    small = {k: v[:3] for k, v in axes.items()}
    return lambda warm: sweep(tpl, {}, small if warm else axes, envelope="L", table=False, chunk_cases=1_000_000)


def ideal(kind: str, n: int, parts: int) -> tuple[float, float]:
    """What the machine gives: (seconds of one process doing all the work, wall seconds of
    ``parts`` independent processes doing a share each at the same time), each process warmed
    up before the clock starts."""

    def run(k: int) -> float:
        env = dict(os.environ, MALLOC_TOP_PAD_=os.environ.get("MALLOC_TOP_PAD_", str(MALLOC_TOP_PAD)))  # as a worker's
        procs = [subprocess.Popen([sys.executable, "-c", IDEAL_CHILD, kind, str(n), str(i), str(k), str(ROOT)],
                                  stdin=subprocess.PIPE, stdout=subprocess.PIPE, text=True, env=env) for i in range(k)]
        try:
            for p in procs:
                if p.stdout.readline().strip() != "ready":
                    raise SystemExit(f"ideal child ({kind}) failed to start")
            t = time.perf_counter()
            for p in procs:
                p.stdin.write("go\n")
                p.stdin.flush()
            for p in procs:
                json.loads(p.stdout.readline())
            return time.perf_counter() - t
        finally:
            for p in procs:
                p.wait()

    return run(1), run(parts)


def print_ideal(calcs: int, cases: int, workers: int, ratios: dict[str, float]) -> None:
    """The machine's ideal beside the cluster's (median) ratios: ``workers`` independent serial
    processes on a share of the work each vs one process on all of it (no Dask; each warmed up)."""
    print(f"ideal on this machine: {workers} independent serial processes (a share each) vs 1 process (all), no Dask:")
    for kind, ratio in ratios.items():
        one, many = ideal(kind, calcs if kind == "batch" else cases, workers)
        print(f"  {kind:6s} 1 process {one:7.2f} s, {workers} processes {many:7.2f} s: ideal {one / many:5.2f}x; "
              f"dask {ratio:5.2f}x = {ratio / (one / many):4.0%} of the ideal")


def trace_line(stream: list[dict], t0: float, t1: float) -> str:
    """Where a cluster run's wall time went, from Dask's task stream: client work before the
    first task started, each worker's busy time and task count, the tail after the last task
    ended (collecting and merging on the client)."""
    spans: dict[str, list[tuple[float, float]]] = {}
    for r in stream:
        for s in r["startstops"]:
            if s["action"] == "compute":
                spans.setdefault(r["worker"], []).append((s["start"], s["stop"]))
    if not spans:
        return "    (no tasks)"
    first = min(a for v in spans.values() for a, _b in v)
    last = max(b for v in spans.values() for _a, b in v)
    busy = ", ".join(f"{len(v)} tasks busy {sum(b - a for a, b in v):.2f} s (first task {sorted(v)[0][1] - sorted(v)[0][0]:.2f} s)"
                     for v in spans.values())
    return f"    wall {t1 - t0:.2f} s: client before the first task {first - t0:.2f} s; workers: {busy}; tail after the last task {t1 - last:.2f} s"


def cold_sweep(run):
    """``run()`` with this process's sweep plans and parsed axes forgotten: each cluster run has
    fresh workers that build them, so the serial run builds them too (a later run would
    otherwise reuse the first one's)."""
    from calcpad.runner import sweep as sweep_module

    sweep_module._PLANS.clear()
    sweep_module._COLUMNS.clear()
    return run()


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--calcs", type=int, default=2000)
    ap.add_argument("--sweep", type=int, default=200_000_000,
                    help="sweep cases (about); a 20 M sweep takes under a second serially, too short for a cluster's fixed costs")
    ap.add_argument("--members", type=int, default=1000)
    ap.add_argument("--workers", type=int, default=2)
    ap.add_argument("--only", action="append", choices=["batch", "sweep", "search"], help="run only these workloads (repeatable)")
    ap.add_argument("--repeat", type=int, default=1, help="serial then cluster, this many times per workload (ranges printed)")
    ap.add_argument("--trace", action="store_true", help="print where each cluster run's time went (Dask task stream)")
    ap.add_argument("--no-ideal", action="store_true", help="skip the machine's ideal (independent serial processes)")
    ap.add_argument("--no-search", action="store_true", help="skip the design search workload")
    args = ap.parse_args()
    pad_here = os.environ.get("MALLOC_TOP_PAD_", "unset")  # as this process started (Dask's nanny sets it later)
    only = args.only or ["batch", "sweep", *([] if args.no_search else ["search"])]
    tpl = load_template(find_template("leg_bending"))
    axes = _sweep_axes(args.sweep)
    job = _job(args.calcs)
    members = _members(args.members)
    settings = {"parameter": "leg", "family": "pipe"}
    n_sizes = len(candidates("pipe"))
    startup: list[float] = []
    _warm()

    def on_cluster(fn):
        """(seconds, result) of fn(client) on a fresh cluster whose workers are warmed up as this
        process (start-up and warm-up not counted; printed apart)."""
        from distributed import get_task_stream

        t = time.perf_counter()
        with cluster_client(workers=args.workers) as client:
            client.run(_warm)
            startup.append(time.perf_counter() - t)
            with get_task_stream(client) as stream:
                cpu = client.run(time.process_time), time.process_time()
                t0, t = time.time(), time.perf_counter()
                out = fn(client)
                seconds, t1 = time.perf_counter() - t, time.time()
                cpu = {w: c - cpu[0][w] for w, c in client.run(time.process_time).items()}, time.process_time() - cpu[1]
            if args.trace:
                print(trace_line(stream.data, t0, t1))
                print(f"    CPU seconds: workers {', '.join(f'{c:.2f}' for c in cpu[0].values())}; this process (client and "
                      f"scheduler) {cpu[1]:.2f}; serial run {serial_cpu[-1]:.2f} (less CPU than wall: other work had the cores)")
            return seconds, out

    serial_cpu: list[float] = []

    def serial(fn):
        t, c = time.perf_counter(), time.process_time()
        out = fn()
        serial_cpu.append(time.process_time() - c)
        return time.perf_counter() - t, out

    workloads = {
        "batch": (f"batch: {args.calcs} leg calcs, full rendering", lambda: run_job(job), lambda c: run_calcs_on_cluster(job, c),
                  lambda a, b: [o.sheets for o in a] == [o.sheets for o in b]),
        "sweep": (f"sweep: {math.prod(len(v) for v in axes.values()):,} cases, envelope",
                  lambda: cold_sweep(lambda: sweep(tpl, {}, axes, envelope="L", table=False, chunk_cases=1_000_000)),
                  lambda c: sweep(tpl, {}, axes, envelope="L", table=False, client=c, chunk_cases=1_000_000),
                  lambda a, b: a.passed == b.passed and a.envelope.equals(b.envelope)),
        "search": (f"search: {args.members} members x {n_sizes} pipe sizes", lambda: search(tpl, members, settings),
                   lambda c: search_on_cluster(c, tpl, members, settings), lambda a, b: a == b),
    }
    rows = []
    ratios: dict[str, list[float]] = {}
    for name in [w for w in workloads if w in only]:
        label, run_serial, run_dask, same = workloads[name]
        for _rep in range(args.repeat):  # serial then on the cluster, one right after the other (the machine is shared)
            t_serial, a = serial(run_serial)
            t_dask, b = on_cluster(run_dask)
            ratios.setdefault(name, []).append(t_serial / t_dask)
            rows.append((label, t_serial, t_dask, same(a, b)))
            if name == "search":
                cases = args.members * n_sizes
                print(f"design search throughput: serial {cases / t_serial:,.0f} cases/s ({args.members / t_serial:.0f} members/s), "
                      f"dask {cases / t_dask:,.0f} cases/s (each chosen size and runner-up re-checked by an ordinary build)")
    print(f"cluster start-up and warm-up ({args.workers} workers, a fresh cluster per run): up to {max(startup):.1f} s (not counted below); "
          f"MALLOC_TOP_PAD_ here: {pad_here}, on the workers: {MALLOC_TOP_PAD}")
    print(f"{'workload':44s} {'serial s':>9s} {'dask s':>9s} {'speed-up':>9s}  identical")
    for label, t_serial, t_dask, ok in rows:
        print(f"{label:44s} {t_serial:9.2f} {t_dask:9.2f} {t_serial / t_dask:8.2f}x  {ok}")
    if args.repeat > 1:
        for name, r in ratios.items():
            print(f"{name}: speed-up {min(r):.2f}x-{max(r):.2f}x over {len(r)} runs (median {statistics.median(r):.2f}x)")
    if not args.no_ideal:
        print_ideal(args.calcs, args.sweep, args.workers, {k: statistics.median(v) for k, v in ratios.items() if k != "search"})


if __name__ == "__main__":
    main()
