"""Design search and sweeps on the compiled sheet against a brute-force scalar loop.

Oracle: the ordinary runner (``run_calc_inprocess``: the template run, every sheet evaluated with
pint quantities, statuses as printed) over the same sizes, one by one in order of weight per
foot, first size with every check OK. The compiled path is not used by the oracle.
"""

from __future__ import annotations

import numpy as np
import pytest

from calcpad.core.results import status_ok
from calcpad.eng.sections.catalog import section_table
from calcpad.runner.execute import run_calc_inprocess
from calcpad.runner.job import Calc
from calcpad.runner.search import search
from calcpad.runner.sweep import SweepTooLargeError, steps, sweep
from calcpad.runner.template import find_template, load_template

PIPES = ["Pipe 1 Std", "Pipe 1 XS", "Pipe 1-1/4 Std", "Pipe 1-1/2 Std", "Pipe 1-1/4 XS", "Pipe 1-1/2 XS", "Pipe 2 Std", "Pipe 2 XS"]
HSS = ["HSS3x3x3/16", "HSS3x3x1/4", "HSS3-1/2x3-1/2x1/4", "HSS4x4x3/16", "HSS4x4x1/4", "HSS5x5x1/4"]


def _brute(tpl, inputs: dict, param: str, sizes: list[str], family: str) -> str | None:
    table = section_table(family)
    weight = dict(zip(table["designation"], table["weight"], strict=True))
    for d in sorted(sizes, key=lambda s: weight[s]):
        o = run_calc_inprocess(Calc(1, "t", tpl, "M", {**inputs, param: d}))
        checks = [c for s in o.sheets for c in s["record"]["checks"]]
        if o.error is None and checks and all(status_ok(c["status"]) for c in checks):
            return d
    return None


def _defaults(tpl) -> dict:
    return {n: p.default for n, p in tpl.parameters.items() if n not in ("member_mark", "calc_title")}


def test_leg_search_matches_brute_force() -> None:
    tpl = load_template(find_template("leg_bending"))
    base = _defaults(tpl)
    members = [(f"M{i}", {**base, "P": f"{p} lbf", "L": f"{L} in", "N": f"{n} lbf"})
               for i, (p, L, n) in enumerate([(60, 24, 0), (120, 30, 115), (150, 42, 300), (260, 60, 40), (500, 90, 0), (900, 120, 0)])]
    found = search(tpl, members, {"parameter": "leg", "family": "pipe"}, sizes=PIPES)
    assert [r.method for r in found] == ["compiled"] * len(members)
    picked = [r.chosen.designation if r.chosen else None for r in found]
    expected = [_brute(tpl, inputs, "leg", PIPES, "pipe") for _m, inputs in members]
    assert picked == expected
    assert None in picked and picked[0] is not None  # the grid reaches both ends
    for r in found:
        if r.chosen is not None:
            assert r.governing_check == "Combined stress vs yield" and 0 < r.governing_ratio <= 1.0


def test_post_search_matches_brute_force() -> None:
    tpl = load_template(find_template("post_combined"))
    base = _defaults(tpl)
    members = [(f"C{i}", {**base, "P": f"{p} kip", "H": f"{h} kip", "L": f"{L} ft"})
               for i, (p, h, L) in enumerate([(2.4, 0.35, 10), (6.5, 0.45, 11), (12.0, 0.9, 14), (1.0, 0.2, 6)])]
    found = search(tpl, members, {"parameter": "post", "family": "hss_square"}, sizes=HSS)
    picked = [r.chosen.designation if r.chosen else None for r in found]
    assert picked == [_brute(tpl, inputs, "post", HSS, "hss_square") for _m, inputs in members]
    for r in found:  # the runner-up is heavier than the chosen size and passes too
        if r.chosen is not None and r.runner_up is not None:
            assert r.runner_up.weight >= r.chosen.weight


def test_sweep_table_matches_scalar_runs_and_envelope() -> None:
    tpl = load_template(find_template("leg_bending"))
    res = sweep(tpl, {"N": "100 lbf"}, {"leg": ["Pipe 1 Std", "Pipe 2 Std"], "P": ["80 lbf", "200 lbf"], "L": steps("12 in", "60 in", 5)},
                envelope="L", chunk_cases=3)
    assert res.cases == 20 and len(res.table) == 20
    for _i, row in res.table.iloc[::3].iterrows():  # scalar oracle: the ordinary run of that case
        o = run_calc_inprocess(Calc(1, "t", tpl, "M", {**_defaults(tpl), "N": "100 lbf", "leg": row["leg"], "P": row["P"], "L": row["L"]}))
        checks = [c for s in o.sheets for c in s["record"]["checks"]]
        assert bool(row["pass"]) == all(status_ok(c["status"]) for c in checks)
        assert row["governing ratio"] == pytest.approx(max(c["ratio"] for c in checks), rel=1e-9)
    for _i, row in res.envelope.iterrows():
        part = res.table[(res.table["leg"] == row["leg"]) & (res.table["P"] == row["P"]) & res.table["pass"]]
        longest = max((float(v.split()[0]) for v in part["L"]), default=np.nan)
        assert (np.isnan(longest) and np.isnan(row["max L [in]"])) or longest == row["max L [in]"]


def test_grid_too_large_for_a_table_is_refused_and_chunked_without_one() -> None:
    tpl = load_template(find_template("leg_bending"))
    axes = {"P": steps("10 lbf", "400 lbf", 1500), "L": steps("10 in", "90 in", 1500)}
    with pytest.raises(SweepTooLargeError, match="2,250,000 cases would make a table"):
        sweep(tpl, {}, axes)
    res = sweep(tpl, {}, axes, table=False, envelope="L", chunk_cases=500_000)
    assert res.table is None and res.cases == 2_250_000 and 0 < res.passed < res.cases
    with pytest.raises(SweepTooLargeError, match="at most"):
        sweep(tpl, {}, {"P": steps("10 lbf", "400 lbf", 200_000), "L": steps("10 in", "90 in", 100_000)}, table=False)
