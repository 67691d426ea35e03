"""Core engine benchmark: ratios measured side by side in one run (2-core shared machine).

1. Compiled sheet vs hand-written numpy for the same leg chain, every input varying, at 1e6 and
   1e7 cases (goal >= 0.9x hand throughput), and with two inputs varying at 1e6. The sides run
   interleaved (A B C D, then D C B A, ... for ``--rounds`` rounds); each round gives one ratio
   per pair and the median ratio is printed with its spread (quartiles, min-max), so a burst of
   load from other work hits one round, not one side.

   What each side computes (same inputs, same formulas):

   - compiled (now): ``CompiledSheet.__call__`` from display-unit inputs (lbf, in, ksi): all 7
     step arrays in their display units (M, D_i, I, c, sigma_b, FS, the check ratio
     ``|sigma_b|*1.67/F_y``) plus the per-case validity mask (every step finite, capacity > 0).
   - compiled (before): the same call on ``calcpad/core/compiled.py`` of commit ``BEFORE``
     (loaded from ``git show`` into a temporary module), same outputs.
   - hand numpy: the chain as an engineer writes it in numpy (``x**4``), inputs already in SI
     base units (its best case: no unit factors), returning 5 arrays (M, I, sigma, FS, ratio;
     D_i and c are made as temporaries but not returned), no abs, no validity check.
   - hand numpy, tuned: the same 5 outputs written by a numpy expert (``x*x`` squared, in-place
     operations, fewest temporaries).
   - hand numpy, same work: the plain hand chain also returning D_i and c, taking ``abs`` in the
     ratio and checking every output finite (``np.isfinite(v).all()``): what the compiled call
     does, written by hand.
   - ratios only (what sweeps and design searches call): ``CompiledSheet.ratios`` (every step
     still evaluated and checked finite, only the check ratio returned) vs the hand chain
     returning only ``1.67*sigma/F_y``.

   Times are taken both as CPU time of this process (``time.process_time``: what the code costs,
   hardly moved by other work on the shared cores) and as wall time (``perf_counter``); the
   ratio lines use CPU time, the wall-time median ratio is printed beside them.

2. Design search over the whole pipe family (every size) for ``--members`` leg members
   (template leg_bending, loads and lengths varying): cases (members x sizes) per second, with
   the time split into the compiled evaluation of every case (``CompiledSheet.ratios``) and the
   ordinary build that re-checks each member's chosen size and runner-up (``search._scalar_ok``).
3. Compiled sheet vs per-case sympy substitution (goal >= 1000x faster per case).
4. Start-up in fresh interpreters: the first sheet with a value (``from calcpad import Sheet``,
   one given parsed: the engine, sympy, pint and calcpad's registry loaded) vs the floor of its
   two big dependencies (``import sympy, pint`` and one ``pint.UnitRegistry()``; goal <= 1.2x);
   ``import calcpad`` alone is printed as it is (lazy: it loads none of them).

Run: ``.venv/bin/python benchmarks/bench_core.py [--rounds 15] [--big-rounds 7] [--members 1000]
[--only-compiled] [--skip-search] [--skip-import]``
"""

from __future__ import annotations

import argparse
import importlib.util
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import numpy as np
import sympy as sp

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from calcpad import Sheet  # noqa: E402

N = 1_000_000
BEFORE = "8ca7137"  # compiled.py before the issue-15 generator work
LBF, INCH, KSI = 4.4482216152605, 0.0254, 6894757.293168361


def leg_sheet() -> Sheet:
    sh = Sheet("bench leg")
    sh.given("P", "250 lbf")
    sh.given("L", "84 in")
    sh.given("D_o", "2.375 in")
    sh.given("t", "0.154 in")
    sh.given("F_y", "35 ksi")
    sh.step("M", "P*L")
    sh.step("D_i", "D_o - 2*t")
    sh.step("I", "pi/64*(D_o**4 - D_i**4)")
    sh.step("c", "D_o/2")
    sh.step("sigma_b", "M*c/I")
    sh.step("FS", "F_y/sigma_b")
    sh.check("yield", "sigma_b", "F_y", required_fs=1.67)
    return sh


def hand_numpy(P, L, D_o, t, F_y):  # the same chain written by hand, SI base units
    M = P * L
    D_i = D_o - 2 * t
    I = np.pi / 64 * (D_o**4 - D_i**4)
    c = D_o / 2
    sigma = M * c / I
    return {"M": M, "I": I, "sigma_b": sigma, "FS": F_y / sigma, "ratio": 1.67 * sigma / F_y}


def hand_numpy_tuned(P, L, D_o, t, F_y):  # the same chain as a numpy expert writes it: x*x*x*x, in-place operations
    M = P * L
    D_i = D_o - 2 * t
    d2, i2 = D_o * D_o, D_i * D_i
    d2 *= d2
    i2 *= i2
    d2 -= i2
    d2 *= np.pi / 64
    sigma = M * D_o
    sigma /= 2 * d2
    FS = F_y / sigma
    ratio = sigma * 1.67
    ratio /= F_y
    return {"M": M, "I": d2, "sigma_b": sigma, "FS": FS, "ratio": ratio}


def hand_numpy_ratio(P, L, D_o, t, F_y):  # the chain by hand, only the check ratio kept
    M = P * L
    D_i = D_o - 2 * t
    I = np.pi / 64 * (D_o**4 - D_i**4)
    c = D_o / 2
    sigma = M * c / I
    return 1.67 * sigma / F_y


def hand_numpy_same_work(P, L, D_o, t, F_y):  # what the compiled call does, by hand: 7 outputs, abs, finite check
    M = P * L
    D_i = D_o - 2 * t
    I = np.pi / 64 * (D_o**4 - D_i**4)
    c = D_o / 2
    sigma = M * c / I
    out = {"M": M, "D_i": D_i, "I": I, "c": c, "sigma_b": sigma, "FS": F_y / sigma, "ratio": 1.67 * np.abs(sigma) / F_y}
    valid = all(np.isfinite(v).all() for v in out.values()) and bool((F_y > 0).all())
    return out, valid


def compiled_before(sheet: Sheet, tmp: Path):
    """``CompiledSheet`` of commit ``BEFORE`` for ``sheet`` (its compiled.py as a temporary module)."""
    src = subprocess.run(["git", "show", f"{BEFORE}:calcpad/core/compiled.py"], cwd=ROOT, capture_output=True, text=True, check=True).stdout
    path = tmp / "compiled_before.py"
    path.write_text(src)
    spec = importlib.util.spec_from_file_location("compiled_before", path)
    mod = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(mod)
    return mod.CompiledSheet(sheet)


WALL: dict[str, list[float]] = {}  # wall seconds of the last interleaved() run, per side


def agreement(f, ins: dict[str, np.ndarray], si: tuple[np.ndarray, ...]) -> float:
    """Largest relative difference between the compiled outputs (display units, taken to SI base
    with pint) and the hand chain's: the two sides compute the same numbers."""
    from calcpad.core.units import Q_

    out, hand = f(**ins), hand_numpy(*si)
    worst = 0.0
    for name, key in (("M", "M"), ("I", "I"), ("sigma_b", "sigma_b"), ("FS", "FS"), ("chk_yield", "ratio")):
        k = float(Q_(1.0, f.units[name]).to_base_units().magnitude) if f.units[name] else 1.0
        worst = max(worst, float(np.max(np.abs(out[name] * k / hand[key] - 1.0))))
    return worst


def interleaved(sides: dict[str, object], rounds: int) -> dict[str, list[float]]:
    """CPU seconds per side per round (wall seconds in ``WALL``); the order alternates (forward,
    then backward) every round. The result of each call is dropped before the next one runs."""
    times: dict[str, list[float]] = {k: [] for k in sides}
    WALL.clear()
    WALL.update({k: [] for k in sides})
    names = list(sides)
    for r in range(rounds):
        for name in names if r % 2 == 0 else names[::-1]:
            w0, c0 = time.perf_counter(), time.process_time()
            sides[name]()
            c1, w1 = time.process_time(), time.perf_counter()
            times[name].append(c1 - c0)
            WALL[name].append(w1 - w0)
    return times


def ratio_line(label: str, num: str, den: str, times: dict[str, list[float]]) -> str:
    """Median of the per-round CPU-time ratios num/den (den's throughput relative to num's), its
    spread, and the median wall-time ratio."""
    r = np.asarray(times[num]) / np.asarray(times[den])
    q1, med, q3 = np.percentile(r, [25, 50, 75])
    wall = float(np.median(np.asarray(WALL[num]) / np.asarray(WALL[den])))
    return (f"  {label:44s} median {med:5.2f}  quartiles {q1:.2f}-{q3:.2f}  min-max {r.min():.2f}-{r.max():.2f}"
            f"  (wall time: median {wall:.2f})")


def import_times(stmts: list[str], rounds: int = 7) -> list[float]:
    """Fresh-interpreter import times, interleaved so machine noise hits both alike; best of rounds."""
    best_times = [float("inf")] * len(stmts)
    for _ in range(rounds):
        for i, stmt in enumerate(stmts):
            code = f"import time\nt = time.perf_counter()\n{stmt}\nprint(time.perf_counter() - t)"
            out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
            best_times[i] = min(best_times[i], float(out.stdout.strip()))
    return best_times


def compiled_section(rounds: int, big_rounds: int) -> float:
    """Part 1; returns the compiled time per case at 1e6 (two inputs varying) for part 2."""
    rng = np.random.default_rng(1)
    sheet = leg_sheet()
    f = sheet.compile()
    with tempfile.TemporaryDirectory(prefix="calcpad-compiled-before-") as tmp:
        f_old = compiled_before(sheet, Path(tmp))
    print(f"compiled sheet vs hand numpy (median of {rounds} interleaved rounds at 1e6, {big_rounds} at 1e7; "
          "ratio = hand time / compiled time, i.e. compiled throughput relative to hand):")
    P, L = rng.uniform(50, 500, N), rng.uniform(24, 120, N)
    args = (P * LBF, L * INCH, 2.375 * INCH, 0.154 * INCH, 35 * KSI)  # hand numpy gets SI inputs (its best case)
    t = interleaved({"now": lambda: f(P=P, L=L), "before": lambda: f_old(P=P, L=L), "hand": lambda: hand_numpy(*args)}, rounds)
    print(f"two inputs varying (P, L), 1e6 cases (M cases/s, CPU-time medians): compiled now {N / np.median(t['now']) / 1e6:.1f}, "
          f"before {N / np.median(t['before']) / 1e6:.1f}, hand {N / np.median(t['hand']) / 1e6:.1f}")
    print(ratio_line("compiled now vs hand (goal >= 0.7)", "hand", "now", t))
    print(ratio_line("compiled before vs hand", "hand", "before", t))
    per_case = float(np.median(t["now"])) / N
    for n in (N, 10 * N):  # every input varying: each one's unit factor is in play
        ins = {"P": rng.uniform(50, 500, n), "L": rng.uniform(24, 120, n), "D_o": rng.uniform(1.5, 4.5, n),
               "t": rng.uniform(0.1, 0.3, n), "F_y": rng.uniform(30, 50, n)}
        si = (ins["P"] * LBF, ins["L"] * INCH, ins["D_o"] * INCH, ins["t"] * INCH, ins["F_y"] * KSI)
        sides = {"now": lambda ins=ins: f(**ins), "before": lambda ins=ins: f_old(**ins), "hand": lambda si=si: hand_numpy(*si),
                 "tuned": lambda si=si: hand_numpy_tuned(*si), "same": lambda si=si: hand_numpy_same_work(*si),
                 "now_ratios": lambda ins=ins: f.ratios(**ins), "before_ratios": lambda ins=ins: f_old.ratios(**ins),
                 "hand_ratio": lambda si=si: hand_numpy_ratio(*si)}
        if n == N:
            print(f"  same numbers: largest relative difference compiled vs hand numpy over M, I, sigma_b, FS, ratio = {agreement(f, ins, si):.1e}")
        t = interleaved(sides, rounds if n == N else big_rounds)
        speeds = ", ".join(f"{k} {n / np.median(v) / 1e6:.1f}" for k, v in t.items())
        print(f"all five inputs varying, {n:.0e} cases (M cases/s, CPU-time medians): {speeds}")
        print(ratio_line("compiled now vs hand numpy (goal >= 0.9)", "hand", "now", t))
        print(ratio_line("compiled before vs hand numpy", "hand", "before", t))
        print(ratio_line("compiled now vs hand numpy, tuned", "tuned", "now", t))
        print(ratio_line("compiled now vs hand numpy, same work", "same", "now", t))
        print(ratio_line("compiled now vs compiled before", "before", "now", t))
        print(ratio_line("ratios only: now vs hand (ratio only)", "hand_ratio", "now_ratios", t))
        print(ratio_line("ratios only: before vs hand (ratio only)", "hand_ratio", "before_ratios", t))
    return per_case


def search_section(n_members: int) -> None:
    """Part 2: design search throughput, serial, with the compiled and re-check parts timed apart."""
    from calcpad.core.compiled import CompiledSheet
    from calcpad.runner import search as search_mod
    from calcpad.runner.template import find_template, load_template

    tpl = load_template(find_template("leg_bending"))
    base = {k: p.default for k, p in tpl.parameters.items() if k not in ("member_mark", "calc_title")}
    members = [(f"M{i}", {**base, "P": f"{30 + (i * 13) % 900} lbf", "L": f"{12 + (i * 7) % 150} in", "N": f"{(i * 11) % 400} lbf"})
               for i in range(n_members)]
    settings = {"parameter": "leg", "family": "pipe"}
    n_sizes = len(search_mod.candidates("pipe"))
    spent = {"compiled": 0.0, "recheck": 0.0}

    def timed(key, fn):
        def run(*a, **k):
            t0 = time.process_time()
            try:
                return fn(*a, **k)
            finally:
                spent[key] += time.process_time() - t0
        return run

    search_mod.search(tpl, members[:3], settings)  # warm-up: template, catalog, compiled code paths
    ratios, scalar_ok = CompiledSheet.ratios, search_mod._scalar_ok
    CompiledSheet.ratios = timed("compiled", ratios)
    search_mod._scalar_ok = timed("recheck", scalar_ok)
    try:
        w0, c0 = time.perf_counter(), time.process_time()
        found = search_mod.search(tpl, members, settings)
        cpu, wall = time.process_time() - c0, time.perf_counter() - w0
    finally:
        CompiledSheet.ratios, search_mod._scalar_ok = ratios, scalar_ok
    cases = n_members * n_sizes
    chosen = sum(r.chosen is not None for r in found)
    print(f"design search, {n_members} members x {n_sizes} pipe sizes = {cases:,} cases (serial; {chosen} members found a size):")
    print(f"  {cases / cpu:,.0f} cases/s CPU time ({cpu:.2f} s), {cases / wall:,.0f} cases/s wall time ({wall:.2f} s)")
    print(f"  of which compiled evaluation of every case: {spent['compiled']:.3f} s CPU ({cases / max(spent['compiled'], 1e-9):,.0f} cases/s); "
          f"ordinary build re-checking chosen size and runner-up ({2 * n_members} builds at most): {spent['recheck']:.2f} s CPU")


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--rounds", type=int, default=15, help="interleaved rounds at 1e6 cases")
    ap.add_argument("--big-rounds", type=int, default=7, help="interleaved rounds at 1e7 cases")
    ap.add_argument("--skip-import", action="store_true", help="skip part 3 (import times)")
    ap.add_argument("--only-compiled", action="store_true", help="part 1 only")
    ap.add_argument("--skip-search", action="store_true", help="skip part 2 (design search)")
    ap.add_argument("--members", type=int, default=1000, help="members in the design search")
    args = ap.parse_args()
    per_case_compiled = compiled_section(args.rounds, args.big_rounds)
    if args.only_compiled:
        return
    if not args.skip_search:
        search_section(args.members)
    rng = np.random.default_rng(2)
    P, L = rng.uniform(50, 500, 200), rng.uniform(24, 120, 200)
    syms = {n: sp.Symbol(n) for n in ("P", "L", "D_o", "t", "F_y")}
    chain = syms["F_y"] / ((syms["P"] * syms["L"]) * (syms["D_o"] / 2) / (sp.pi / 64 * (syms["D_o"] ** 4 - (syms["D_o"] - 2 * syms["t"]) ** 4)))
    cases = 200
    t0 = time.perf_counter()
    for i in range(cases):
        chain.subs({syms["P"]: float(P[i]), syms["L"]: float(L[i]), syms["D_o"]: 2.375, syms["t"]: 0.154, syms["F_y"]: 35000.0}).evalf()
    per_case_sympy = (time.perf_counter() - t0) / cases
    print(f"per-case sympy subs : {per_case_sympy * 1e6:10.1f} µs/case")
    print(f"compiled            : {per_case_compiled * 1e6:10.4f} µs/case")
    print(f"ratio sympy/compiled = {per_case_sympy / per_case_compiled:,.0f}x   (goal >= 1000x)")

    if args.skip_import:
        return
    first_sheet = "from calcpad import Sheet; Sheet('t').given('P', '1 kip')"
    floor = "import sympy, pint; pint.UnitRegistry()"
    t_lazy, t_calcpad, t_base = import_times(["import calcpad", first_sheet, floor])
    print(f"import calcpad (lazy)          : {t_lazy:.3f} s")
    print(f"first sheet with a given       : {t_calcpad:.3f} s")
    print(f"import sympy, pint + registry  : {t_base:.3f} s")
    print(f"ratio first sheet / dependency floor = {t_calcpad / t_base:.2f}   (goal <= 1.2)")


if __name__ == "__main__":
    main()
