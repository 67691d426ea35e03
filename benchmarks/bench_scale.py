"""Scale-out on Dask: a 2-worker local cluster vs serial, side by side in one run.

1. A batch of generated leg calcs with full rendering (record, HTML, text per sheet).
2. A large generated sweep (lateral load x leg length x pipe size) with the envelope, no table.
3. Design search over the whole pipe family for many members (cases = members x sizes per second).

Run: ``.venv/bin/python benchmarks/bench_scale.py [--calcs 2000] [--sweep 20000000] [--members 1000]``
(2-core shared machine, other work running: read the ratios, not the absolutes; goal >= 1.6x).
The cluster start-up is timed apart and not counted in the ratios.
"""

from __future__ import annotations

import argparse
import math
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from calcpad.runner.build import SheetBuilder  # noqa: E402
from calcpad.runner.execute import run_job  # noqa: E402
from calcpad.runner.job import Calc, Job, JobInfo  # noqa: E402
from calcpad.runner.scale import cluster_client, run_calcs_on_cluster, search_on_cluster  # noqa: E402
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
    """Worker warm-up: import the engine and build the leg template once."""
    tpl = load_template(find_template("leg_bending"))
    SheetBuilder(tpl).sheets({k: p.default for k, p in tpl.parameters.items()})


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--calcs", type=int, default=2000)
    ap.add_argument("--sweep", type=int, default=20_000_000, help="sweep cases (about)")
    ap.add_argument("--members", type=int, default=1000)
    ap.add_argument("--workers", type=int, default=2)
    args = ap.parse_args()
    tpl = load_template(find_template("leg_bending"))
    sizes = ["Pipe 1 Std", "Pipe 1-1/2 Std", "Pipe 2 Std", "Pipe 2-1/2 Std", "Pipe 3 Std"]
    side = max(2, int(math.sqrt(args.sweep / len(sizes))))
    axes = {"leg": sizes, "P": steps("20 lbf", "900 lbf", side), "L": steps("6 in", "160 in", side)}
    job = _job(args.calcs)
    members = _members(args.members)
    settings = {"parameter": "leg", "family": "pipe"}
    n_sizes = len(candidates("pipe"))

    def on_cluster(fn):
        """(seconds, result) of fn(client) on a fresh cluster whose workers have imported calcpad and
        built the leg template once (start-up and warm-up not counted; printed apart)."""
        t = time.perf_counter()
        with cluster_client(workers=args.workers) as client:
            client.run(_warm)
            startup.append(time.perf_counter() - t)
            t = time.perf_counter()
            out = fn(client)
            return time.perf_counter() - t, out

    def serial(fn):
        t = time.perf_counter()
        out = fn()
        return time.perf_counter() - t, out

    startup: list[float] = []
    # each workload serial then on the cluster, one right after the other (the machine is shared)
    t_batch_serial, serial_batch = serial(lambda: run_job(job))
    t_batch_dask, dask_batch = on_cluster(lambda c: run_calcs_on_cluster(job, c))
    t_sweep_serial, s1 = serial(lambda: sweep(tpl, {}, axes, envelope="L", table=False))
    t_sweep_dask, s2 = on_cluster(lambda c: sweep(tpl, {}, axes, envelope="L", table=False, client=c, chunk_cases=1_000_000))
    t_search_serial, r1 = serial(lambda: search(tpl, members, settings))
    t_search_dask, r2 = on_cluster(lambda c: search_on_cluster(c, tpl, members, settings))
    t_start = max(startup)
    same_batch = [o.sheets for o in serial_batch] == [o.sheets for o in dask_batch]
    same_sweep = s1.passed == s2.passed and s1.envelope.equals(s2.envelope)
    same_search = r1 == r2
    print(f"cluster start-up and warm-up ({args.workers} workers, a fresh cluster per workload): up to {t_start:.1f} s (not counted below)")
    print(f"{'workload':44s} {'serial s':>9s} {'dask s':>9s} {'speed-up':>9s}  identical")
    print(f"{f'batch: {args.calcs} leg calcs, full rendering':44s} {t_batch_serial:9.1f} {t_batch_dask:9.1f} {t_batch_serial / t_batch_dask:8.2f}x  {same_batch}")
    print(f"{f'sweep: {s1.cases:,} cases, envelope':44s} {t_sweep_serial:9.1f} {t_sweep_dask:9.1f} {t_sweep_serial / t_sweep_dask:8.2f}x  {same_sweep}")
    print(f"{f'search: {args.members} members x {n_sizes} pipe sizes':44s} {t_search_serial:9.1f} {t_search_dask:9.1f} {t_search_serial / t_search_dask:8.2f}x  {same_search}")
    cases = args.members * n_sizes
    print(f"design search throughput: serial {cases / t_search_serial:,.0f} cases/s ({args.members / t_search_serial:.0f} members/s), "
          f"dask {cases / t_search_dask:,.0f} cases/s (each chosen size and runner-up re-checked by an ordinary build)")


if __name__ == "__main__":
    main()
