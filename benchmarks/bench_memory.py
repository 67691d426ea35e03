"""Member-table jobs as calcpad runs them: time and peak memory against the number of members.

A generated member table (leg_bending, one row per member, loads and lengths varying) is run in a
fresh interpreter per size and kind of work (``--what``):

- ``run``: ``calcpad run`` into an output folder (record, submittal HTML without PDF, results CSV and Excel);
- ``verify``: ``calcpad verify`` of such a folder (made first, in another process);
- ``table``: ``runner.members.run_table`` (the results frame, nothing written);
- ``notebooks``: ``calcpad run --notebooks`` (in a kernel; its peak is the kernel's, a child process).

Each line prints the wall and CPU time, the process's peak RSS (``ru_maxrss``; the children's for
``notebooks``) and the output size. The last line per kind prints the slope of peak memory against
members between the smallest and the largest size (goal: near 0 KiB per member, memory flat) and
the time of the largest size (issue 15 goal: 10,000 members in under a minute).

Run: ``.venv/bin/python benchmarks/bench_memory.py [--sizes 300,1000] [--what run,verify,table,notebooks]``
(the issue's sizes: ``--sizes 1000,3000,10000``; 2-core shared machine, other work running: read
the slope, the CPU times and the ratios rather than the absolute wall times).
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

what = sys.argv[3]

def quiet(args):
    with contextlib.redirect_stdout(io.StringIO()), contextlib.redirect_stderr(io.StringIO()):
        return main(args)

def run_table(job):
    from calcpad.runner.members import run_table as table
    return table("leg_bending", job.parent / job.name.replace("job", "members").replace(".toml", ".csv"),
                 {"D_o": "2.875 in", "t": "0.203 in", "F_y": "35 ksi", "FS_req": 1.67})

with tempfile.TemporaryDirectory(prefix="calcpad-bench-mem-") as tmp:
    tmp = Path(tmp)
    warm, job = files(tmp, 5, "w"), files(tmp, n, "")
    if what == "verify":  # the folder to verify is made by another process: only verify's memory counts here
        import subprocess
        for j, o in ((warm, "warm"), (job, "out")):
            subprocess.run([sys.executable, "-c", "import sys; sys.path.insert(0, sys.argv[1]); from calcpad.cli import main; "
                            "sys.exit(main(sys.argv[2:]))", root, "run", str(j), "--out", str(tmp / o), "--no-pdf"],
                           capture_output=True, check=False)
    # warm-up: imports, template read and first-use caches
    if what == "table":
        run_table(warm)
    elif what == "verify":
        quiet(["verify", str(tmp / "warm")])
    else:
        quiet(["run", str(warm), "--out", str(tmp / "warm"), "--no-pdf"] + (["--notebooks"] if what == "notebooks" else []))
    rss0 = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    t, c = time.perf_counter(), time.process_time()
    if what == "table":
        rc = 0 if len(run_table(job)) == n else 2
    elif what == "verify":
        rc = quiet(["verify", str(tmp / "out")])
    else:
        rc = quiet(["run", str(job), "--out", str(tmp / "out"), "--no-pdf"] + (["--notebooks"] if what == "notebooks" else []))
    dt, cpu = time.perf_counter() - t, time.process_time() - c
    out = tmp / "out" / "rev-0"
    sizes = {p.name: p.stat().st_size for p in out.iterdir() if p.is_file()} if out.is_dir() else {}
    who = resource.RUSAGE_CHILDREN if what == "notebooks" else resource.RUSAGE_SELF
    print(json.dumps({"seconds": dt, "cpu": cpu, "rc": rc, "rss_mib": resource.getrusage(who).ru_maxrss / 1024,
                      "self_mib": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
                      "rss0_mib": rss0 / 1024, "files": sizes}))
"""


def measure(n: int, what: str = "run", root: Path = ROOT) -> dict:
    proc = subprocess.run([sys.executable, "-c", CHILD, str(root), str(n), what], capture_output=True, text=True, cwd=root)
    if proc.returncode != 0:
        raise SystemExit(f"benchmark child failed ({what}, {n} members):\n{proc.stderr[-3000:]}")
    res = json.loads(proc.stdout.strip().splitlines()[-1])
    if res["rc"] not in (0, 1):
        raise SystemExit(f"{what} returned {res['rc']} for {n} members")
    return res


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--sizes", default="300,1000", help="comma-separated member counts (issue 15: 1000,3000,10000)")
    ap.add_argument("--what", default="run", help="comma-separated: run, verify, table, notebooks")
    ap.add_argument("--root", type=Path, default=ROOT, help="the calcpad tree to measure (e.g. an older commit unpacked with git archive)")
    args = ap.parse_args()
    sizes = sorted({int(s) for s in args.sizes.split(",") if s.strip()})
    for what in [w.strip() for w in args.what.split(",") if w.strip()]:
        results = {}
        for n in sizes:
            r = measure(n, what, args.root)
            results[n] = r
            mb = sum(r["files"].values()) / 1e6
            peak = "kernel peak RSS" if what == "notebooks" else "peak RSS"
            extra = f", runner {r['self_mib']:.0f} MiB" if what == "notebooks" else f" (after warm-up {r['rss0_mib']:.0f} MiB)"
            print(f"{what:9s} {n:6d} members: {r['seconds']:6.1f} s wall, {r['cpu']:6.1f} s CPU ({r['cpu'] / n * 1e3:5.1f} ms/member), "
                  f"{peak} {r['rss_mib']:6.0f} MiB{extra}, output {mb:.1f} MB", flush=True)
        if len(sizes) > 1:
            a, b = sizes[0], sizes[-1]
            slope = (results[b]["rss_mib"] - results[a]["rss_mib"]) * 1024 / (b - a)
            print(f"{what:9s} peak memory slope between {a} and {b} members: {slope:.1f} KiB per member (goal: near 0, flat); "
                  f"{b} members in {results[b]['seconds']:.1f} s" + (" (goal < 60 s)" if b >= 10_000 else ""), flush=True)


if __name__ == "__main__":
    main()
