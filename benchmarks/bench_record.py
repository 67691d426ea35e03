"""The record file's text: the time to print a calc's record entry, the layout before issue 15
(``json.dumps(indent=1)``, pure Python) against :func:`calcpad.runner.record.record_layout`
(each step, check and row one line by json's C encoder), side by side in one run.

The entries are real: a generated member table (leg_bending, one row per member, loads, lengths
and pipe sizes varying, as ``bench_memory.py`` makes it) is run in-process and each calc's entry
built as :meth:`calcpad.runner.spool.RunSpool.keep` builds it. Both encodings run on the same
entries, alternating, several rounds; the best round of each (CPU time) is kept (2-core shared machine:
read the ratio, goal >= 3). A second line does the same for the whole record's text, and each
entry's new text is checked to read back (``json.loads``) as the old one does.

Run: ``.venv/bin/python benchmarks/bench_record.py [--members 200] [--rounds 7]``
"""

from __future__ import annotations

import argparse
import json
import sys
import tempfile
import time
from collections.abc import Callable
from pathlib import Path
from typing import Any

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from calcpad.runner.execute import run_job  # noqa: E402
from calcpad.runner.job import load_job  # noqa: E402
from calcpad.runner.record import calc_record, job_record, record_layout, record_text, template_digest  # noqa: E402

SIZES = ["Pipe 1 Std", "Pipe 1-1/2 Std", "Pipe 2 Std", "Pipe 2-1/2 Std", "Pipe 3 Std"]


def old_entry(entry: dict[str, Any]) -> str:
    """A calc entry's text as the spool printed it before (two levels deep in the record)."""
    return json.dumps(entry, indent=1, ensure_ascii=False, allow_nan=False).replace("\n", "\n  ")


def old_record(record: dict[str, Any]) -> str:
    """The record file's text before."""
    return json.dumps(record, indent=1, ensure_ascii=False, allow_nan=False) + "\n"


def member_job(folder: Path, n: int) -> Path:
    """A leg_bending member-table job of ``n`` members (the table of bench_memory.py)."""
    rows = ["mark,P [lbf],N [lbf],L [in],leg"]
    rows += [f"M{i + 1},{30 + (i * 13) % 900},{(i * 11) % 400},{12 + (i * 7) % 150},{SIZES[i % 5]}" for i in range(n)]
    (folder / "members.csv").write_text("\n".join(rows) + "\n", encoding="utf-8")
    job = folder / "job.toml"
    job.write_text(
        '[job]\nnumber = "B-2"\ntitle = "Generated member table"\nclient = "c"\nsite = "s"\nengineer = "e"\n'
        'revision = "0"\ndate = 2026-01-01\n\n[[calcs]]\ntemplate = "leg_bending"\ntable = "members.csv"\n'
        'title = "Posts"\n[calcs.inputs]\nD_o = "2.875 in"\nt = "0.203 in"\nF_y = "35 ksi"\nFS_req = 1.67\n', encoding="utf-8")
    return job


def best_of(rounds: int, funcs: dict[str, Callable[[], object]]) -> dict[str, float]:
    """Best CPU time (s) of each function over ``rounds``, the functions alternating in each round."""
    best = dict.fromkeys(funcs, float("inf"))
    for _ in range(rounds):
        for name, f in funcs.items():
            t = time.process_time()
            f()
            best[name] = min(best[name], time.process_time() - t)
    return best


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--members", type=int, default=200, help="rows of the generated member table")
    ap.add_argument("--rounds", type=int, default=7, help="alternating rounds (best kept)")
    args = ap.parse_args()
    with tempfile.TemporaryDirectory(prefix="calcpad-bench-record-") as tmp:
        job = load_job(member_job(Path(tmp), args.members))
        outcomes = run_job(job, html=False)
    sha = template_digest(outcomes[0].calc.template.path)
    entries = [calc_record(o, sha) for o in outcomes]
    for e in entries:  # same data: the new text reads back as the old one
        if json.loads(record_layout(e, 2)) != json.loads(old_entry(e)):
            raise SystemExit(f"calc {e['number']}: the new text does not read back as the old one")
    size_old = sum(len(old_entry(e)) for e in entries) / len(entries)
    size_new = sum(len(record_layout(e, 2)) for e in entries) / len(entries)
    t = best_of(args.rounds, {"old": lambda: [old_entry(e) for e in entries], "new": lambda: [record_layout(e, 2) for e in entries],
                              "floor": lambda: [json.dumps(e, ensure_ascii=False, separators=(", ", ": ")) for e in entries]})
    n = len(entries)
    print(f"entry text ({n} leg_bending entries, {size_old / 1e3:.1f} -> {size_new / 1e3:.1f} kB each): "
          f"json.dumps(indent=1) {t['old'] / n * 1e6:7.1f} us, record_layout {t['new'] / n * 1e6:7.1f} us per entry, "
          f"{t['old'] / t['new']:.1f}x faster (goal >= 3x); the C encoder alone on one line {t['floor'] / n * 1e6:.1f} us "
          f"(bound {t['old'] / t['floor']:.1f}x)", flush=True)
    record = job_record(job, outcomes, "inprocess", 0.0)
    if json.loads(record_text(record)) != json.loads(old_record(record)):
        raise SystemExit("the record's new text does not read back as the old one")
    t = best_of(args.rounds, {"old": lambda: old_record(record), "new": lambda: record_text(record)})
    print(f"record text ({n} calcs, {len(old_record(record)) / 1e6:.2f} -> {len(record_text(record)) / 1e6:.2f} MB): "
          f"json.dumps(indent=1) {t['old'] * 1e3:7.1f} ms, record_text {t['new'] * 1e3:7.1f} ms, {t['old'] / t['new']:.1f}x faster",
          flush=True)


if __name__ == "__main__":
    main()
