"""Runner speed: in-process vs kernel execution of the example job; calcs/s for a 200-calc job.

Run: ``.venv/bin/python benchmarks/bench_runner.py`` (2-core shared machine: read ratios, not absolutes).
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from calcpad.runner.execute import run_job  # noqa: E402
from calcpad.runner.job import load_job, parse_job  # noqa: E402

EXAMPLE = ROOT / "examples" / "harbor_ridge_condenser_stand.toml"


def _time(fn, repeat: int) -> float:
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t)
    return statistics.median(times)


def generated_job(n: int) -> str:
    """A job of ``n`` leg_bending calcs with loads varying per member."""
    head = (
        '[job]\nnumber = "B-200"\ntitle = "Generated"\nclient = "c"\nsite = "s"\nengineer = "e"\n'
        'revision = "0"\ndate = 2025-01-01\n'
    )
    calcs = []
    for i in range(n):
        calcs.append(
            f'[[calcs]]\ntemplate = "leg_bending"\nmember = "L{i + 1}"\n[calcs.inputs]\n'
            f'P = "{60 + i} lbf"\nL = "42 in"\nD_o = "1.900 in"\nt = "0.145 in"\nF_y = "35 ksi"\nFS_req = 1.67\n'
        )
    return head + "\n".join(calcs)


def main() -> None:
    job = load_job(EXAMPLE)
    run_job(job)  # warm imports (sympy, pint, templates' modules)
    t_in = _time(lambda: run_job(job, mode="inprocess"), 3)
    t_k = _time(lambda: run_job(job, mode="kernel"), 2)
    n = len(job.calcs)
    print(f"example job ({n} calcs): in-process {t_in:.2f} s, kernel {t_k:.2f} s (one shared kernel), kernel/in-process = {t_k / t_in:.1f}x")
    t = time.perf_counter()
    big = parse_job(generated_job(200), "generated.toml")
    t_val = time.perf_counter() - t
    t_big = _time(lambda: run_job(big), 1)
    print(f"generated job (200 leg_bending calcs): validate {t_val:.2f} s, run {t_big:.2f} s in-process = {200 / t_big:.0f} calcs/s")


if __name__ == "__main__":
    main()
