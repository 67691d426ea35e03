"""Drawing speed: the example job's drawings with this code and a baseline commit's, side by side.

Each code, in its own interpreter, runs the example job once and records every drawing it asks
for (``drawing_png`` of the frame drawings and member plots, ``sections_png``), then draws and
saves each of them again ``--passes`` times with the content cache emptied before every drawing
(what a calc with loads of its own costs: ``png_once`` keys the content, builds the figure,
draws it and encodes the PNG). Baseline and
current code alternate ``--rounds`` times so machine noise hits both alike; the best pass of all
rounds is kept. CPU time of the process (steadier than wall time on a shared machine) per drawing,
per kind of drawing and in total, and the ratio now/baseline.

``--save DIR`` writes every drawing of both codes as ``DIR/{old,new}/NN_kind.png`` for a look
side by side.

Run: ``.venv/bin/python benchmarks/bench_figures.py [--baseline 3528bdb] [--rounds 3] [--passes 5]``
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
BASELINE = "3528bdb"  # main before the drawing speed work (issue 15, figures)

#: Runs in a fresh interpreter with ``sys.path[0]`` = the code to measure; prints one JSON line.
CHILD = r"""
import json, sys, time
root, passes, save = sys.argv[1], int(sys.argv[2]), sys.argv[3]
sys.path.insert(0, root)
from calcpad.core import figure_png
from calcpad.eng.analysis import diagrams
from calcpad.eng.sections import plot
from calcpad.runner.execute import run_job
from calcpad.runner.job import load_job

seen = []
def recorder(kind, original):
    def png_once(content, build, dpi):
        seen.append((kind if kind != "frame" else content[0], content, build, dpi))
        return original(content, build, dpi)
    return png_once
diagrams.png_once = recorder("frame", diagrams.png_once)
plot.png_once = recorder("draw_sections", plot.png_once)
out = run_job(load_job(root + "/examples/harbor_ridge_condenser_stand.toml"))
assert not any(o.error for o in out), [o.error for o in out if o.error]

def draw(content, build, dpi):
    figure_png._PNG.clear()  # no kept PNG: every drawing is built, drawn and encoded
    return figure_png.png_once(content, build, dpi)

if save:
    from pathlib import Path
    folder = Path(save); folder.mkdir(parents=True, exist_ok=True)
    for i, (kind, content, build, dpi) in enumerate(seen):
        (folder / f"{i:02d}_{kind}.png").write_bytes(draw(content, build, dpi))
best, kinds, sizes = None, {}, {}
for _ in range(passes):
    per = {}
    for kind, content, build, dpi in seen:
        c = time.process_time()
        png = draw(content, build, dpi)
        per.setdefault(kind, []).append(time.process_time() - c)
        sizes.setdefault(kind, []).append(len(png))
    total = sum(sum(v) for v in per.values())
    if best is None or total < best:
        best, kinds = total, {k: sum(v) / len(v) for k, v in per.items()}
counts = {}
for kind, *_ in seen:
    counts[kind] = counts.get(kind, 0) + 1
print(json.dumps({"drawings": len(seen), "cpu": best, "kinds": kinds, "counts": counts,
                  "bytes": {k: sum(v) // len(v) for k, v in sizes.items()}}))
"""


def measure(root: Path, passes: int, save: str = "") -> dict:
    proc = subprocess.run([sys.executable, "-c", CHILD, str(root), str(passes), save], capture_output=True, text=True, cwd=root)
    if proc.returncode != 0:
        raise SystemExit(f"benchmark child failed ({root}):\n{proc.stderr[-2000:]}")
    return json.loads(proc.stdout.strip().splitlines()[-1])


def baseline_tree(commit: str, tmp: Path) -> Path:
    """The baseline commit's calcpad, templates and examples, unpacked into ``tmp``."""
    archive = subprocess.run(["git", "archive", commit, "calcpad", "notebooks", "examples"], cwd=ROOT, capture_output=True, check=True)
    subprocess.run(["tar", "-x", "-C", str(tmp)], input=archive.stdout, check=True)
    return tmp


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--baseline", default=BASELINE, help="commit to compare with")
    ap.add_argument("--rounds", type=int, default=3, help="alternating rounds (best kept)")
    ap.add_argument("--passes", type=int, default=5, help="passes over the drawings per round (best kept)")
    ap.add_argument("--save", default="", help="folder to write both codes' drawings into (old/, new/)")
    args = ap.parse_args()
    with tempfile.TemporaryDirectory(prefix="calcpad-figures-") as tmp:
        base = baseline_tree(args.baseline, Path(tmp))
        olds, news = [], []
        for r in range(args.rounds):
            first = args.save and r == 0
            olds.append(measure(base, args.passes, str(Path(args.save, "old").resolve()) if first else ""))
            news.append(measure(ROOT, args.passes, str(Path(args.save, "new").resolve()) if first else ""))
    old, new = min(olds, key=lambda r: r["cpu"]), min(news, key=lambda r: r["cpu"])
    n = new["drawings"]
    print(f"example job's drawings ({n}: {', '.join(f'{c} {k}' for k, c in new['counts'].items())}), "
          f"CPU ms per drawing, best of {args.rounds} rounds x {args.passes} passes:")
    for kind in new["kinds"]:
        o, w = old["kinds"][kind] * 1e3, new["kinds"][kind] * 1e3
        print(f"  {kind:20s} baseline {o:6.1f} ms, now {w:6.1f} ms, ratio {w / o:.2f}; "
              f"PNG {old['bytes'][kind] / 1024:.0f} -> {new['bytes'][kind] / 1024:.0f} KiB")
    o, w = old["cpu"] / old["drawings"] * 1e3, new["cpu"] / n * 1e3
    print(f"  {'all':20s} baseline {o:6.1f} ms, now {w:6.1f} ms, ratio {w / o:.2f}")


if __name__ == "__main__":
    main()
