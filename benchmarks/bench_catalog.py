"""Catalog load benchmark: ratios measured side by side in fresh interpreters (2-core shared machine).

1. First lookup of one designation (reads only its family's file) vs listing every designation
   (reads all 16 files, about 2,400 rows), both after ``import calcpad.eng.sections``
   (goal: the first lookup costs at most a fifth of the full load).
2. Repeated lookups once cached vs the first lookup (goal: at least 50x faster each).
Run: .venv/bin/python benchmarks/bench_catalog.py
"""

from __future__ import annotations

import statistics
import subprocess
import sys

_PROBE = r"""
import sys, time
import calcpad.eng.sections as s
what = sys.argv[1]
t = time.perf_counter()
if what == "one":
    s.get_section("W8x31")
elif what == "all":
    s.designations()
elif what == "again":
    s.get_section("W8x31")
    t = time.perf_counter()
    for _ in range(100):
        s.get_section("W8x31")
    print((time.perf_counter() - t) / 100)
    raise SystemExit
print(time.perf_counter() - t)
"""


def _time(what: str, runs: int = 5) -> float:
    out = [float(subprocess.run([sys.executable, "-c", _PROBE, what], capture_output=True, text=True, check=True).stdout)
           for _ in range(runs)]
    return statistics.median(out)


def main() -> None:
    """Print the measured times and ratios."""
    one, full, again = _time("one"), _time("all"), _time("again")
    print(f"first lookup (one family): {one * 1e3:.1f} ms; every designation (all families): {full * 1e3:.1f} ms; "
          f"ratio {one / full:.2f} (goal <= 0.20)")
    print(f"cached lookup: {again * 1e6:.0f} us; first / cached = {one / again:.0f}x (goal >= 50x)")


if __name__ == "__main__":
    main()
