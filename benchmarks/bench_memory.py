"""A member-table job as `calcpad run` runs it: time and peak memory against the number of members.

A generated member table (leg_bending, one row per member, loads and lengths varying) is run by
the CLI into an output folder (record, submittal HTML without PDF, results CSV and Excel) in a
fresh interpreter per size; each line prints the wall time, the process's peak RSS
(``ru_maxrss``) and its phases. The last line prints the slope of peak memory against members
between the smallest and the largest size (goal: near 0 KiB per member, memory flat) and the
time of the largest size (issue 15 goal: 10,000 members in under a minute).

Run: ``.venv/bin/python benchmarks/bench_memory.py [--sizes 300,1000]`` (the issue's sizes:
``--sizes 1000,3000,10000``; 2-core shared machine, other work running: read the slope and the
ratios rather than the absolute times).
"""

from __future__ import annotations

import argparse
import json
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent

#: Runs in a fresh interpreter; prints one JSON line.
CHILD = r"""
import contextlib, io, json, resource, sys, tempfile, time
from pathlib import Path
root, n = sys.argv[1], int(sys.argv[2])
sys.path.insert(0, root)
from calcpad.cli import main

def files(folder, n, tag):
    rows = ["mark,P [lbf],N [lbf],L [in],leg"]
    sizes = ["Pipe 1 Std", "Pipe 1-1/2 Std", "Pipe 2 Std", "Pipe 2-1/2 Std", "Pipe 3 Std"]
    rows += [f"M{i + 1},{30 + (i * 13) % 900},{(i * 11) % 400},{12 + (i * 7) % 150},{sizes[i % 5]}" for i in range(n)]
    (folder / f"members{tag}.csv").write_text("\n".join(rows) + "\n", encoding="utf-8")
    (folder / f"job{tag}.toml").write_text(
        '[job]\nnumber = "B-2"\ntitle = "Generated member table"\nclient = "c"\nsite = "s"\nengineer = "e"\n'
        'revision = "0"\ndate = 2026-01-01\n\n[[calcs]]\ntemplate = "leg_bending"\n'
        f'table = "members{tag}.csv"\ntitle = "Posts"\n[calcs.inputs]\nD_o = "2.875 in"\nt = "0.203 in"\n'
        'F_y = "35 ksi"\nFS_req = 1.67\n', encoding="utf-8")
    return folder / f"job{tag}.toml"

with tempfile.TemporaryDirectory(prefix="calcpad-bench-mem-") as tmp:
    tmp = Path(tmp)
    warm = files(tmp, 5, "w")  # imports, template read and first-use caches
    with contextlib.redirect_stdout(io.StringIO()), contextlib.redirect_stderr(io.StringIO()):
        main(["run", str(warm), "--out", str(tmp / "warm"), "--no-pdf"])
    rss0 = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    job = files(tmp, n, "")
    t = time.perf_counter()
    sink = io.StringIO()
    with contextlib.redirect_stdout(sink), contextlib.redirect_stderr(io.StringIO()):
        rc = main(["run", str(job), "--out", str(tmp / "out"), "--no-pdf"])
    dt = time.perf_counter() - t
    out = tmp / "out" / "rev-0"
    sizes = {p.name: p.stat().st_size for p in out.iterdir()}
    print(json.dumps({"seconds": dt, "rc": rc, "rss_mib": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
                      "rss0_mib": rss0 / 1024, "files": sizes}))
"""


def measure(n: int, root: Path = ROOT) -> dict:
    proc = subprocess.run([sys.executable, "-c", CHILD, str(root), str(n)], capture_output=True, text=True, cwd=root)
    if proc.returncode != 0:
        raise SystemExit(f"benchmark child failed ({n} members):\n{proc.stderr[-3000:]}")
    res = json.loads(proc.stdout.strip().splitlines()[-1])
    if res["rc"] not in (0, 1):
        raise SystemExit(f"calcpad run returned {res['rc']} for {n} members")
    return res


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--sizes", default="300,1000", help="comma-separated member counts (issue 15: 1000,3000,10000)")
    ap.add_argument("--root", type=Path, default=ROOT, help="the calcpad tree to measure (e.g. an older commit unpacked with git archive)")
    args = ap.parse_args()
    sizes = sorted({int(s) for s in args.sizes.split(",") if s.strip()})
    results = {}
    for n in sizes:
        r = measure(n, args.root)
        results[n] = r
        mb = sum(r["files"].values()) / 1e6
        print(f"{n:6d} members: {r['seconds']:6.1f} s ({r['seconds'] / n * 1e3:5.1f} ms/member), peak RSS {r['rss_mib']:6.0f} MiB "
              f"(after warm-up {r['rss0_mib']:.0f} MiB), output {mb:.1f} MB", flush=True)
    if len(sizes) > 1:
        a, b = sizes[0], sizes[-1]
        slope = (results[b]["rss_mib"] - results[a]["rss_mib"]) * 1024 / (b - a)
        print(f"peak memory slope between {a} and {b} members: {slope:.1f} KiB per member (goal: near 0, flat); "
              f"{b} members in {results[b]['seconds']:.1f} s" + (" (goal < 60 s)" if b >= 10_000 else ""))


if __name__ == "__main__":
    main()
