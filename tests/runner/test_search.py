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
from calcpad.runner.build import SheetBuilder, given_map
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


def test_an_axis_in_other_units_than_the_parameters_is_swept_on_the_grid() -> None:
    """Leg lengths in feet sweep as lengths in inches do (1 ft = 12 in exactly: NIST SP 811, 2008,
    Appendix B); before, a value in feet was moved in inches while mapping the axis, so L became a
    build axis and an envelope over it was refused."""
    tpl = load_template(find_template("leg_bending"))
    common = {"leg": ["Pipe 1 Std", "Pipe 2 Std"], "P": ["80 lbf", "200 lbf"]}
    feet = sweep(tpl, {"N": "100 lbf"}, {**common, "L": steps("1 ft", "5 ft", 5)}, envelope="L")
    inches = sweep(tpl, {"N": "100 lbf"}, {**common, "L": steps("12 in", "60 in", 5)}, envelope="L")
    assert list(feet.table["pass"]) == list(inches.table["pass"]) and 0 < feet.passed < feet.cases
    np.testing.assert_allclose(feet.table["governing ratio"], inches.table["governing ratio"], rtol=1e-12)
    assert feet.envelope.equals(inches.envelope)
    builder = SheetBuilder(tpl)
    defaults = {n: p.default for n, p in tpl.parameters.items()}
    assert given_map(builder, {**defaults, "L": "4 ft", "P": "2 kN"}, ["L", "P"]) == {"L": ["L"], "P": ["P"]}


def test_grid_too_large_for_a_table_is_refused_and_chunked_without_one() -> None:
    tpl = load_template(find_template("leg_bending"))
    axes = {"P": steps("10 lbf", "400 lbf", 1500), "L": steps("10 in", "90 in", 1500)}
    with pytest.raises(SweepTooLargeError, match="2,250,000 cases would make a table"):
        sweep(tpl, {}, axes)
    res = sweep(tpl, {}, axes, table=False, envelope="L", chunk_cases=500_000)
    assert res.table is None and res.cases == 2_250_000 and 0 < res.passed < res.cases
    with pytest.raises(SweepTooLargeError, match="at most"):
        sweep(tpl, {}, {"P": steps("10 lbf", "400 lbf", 200_000), "L": steps("10 in", "90 in", 100_000)}, table=False)


def test_search_with_grades_matches_brute_force() -> None:
    # Candidates are (size, grade) by weight per foot, grades in the order given; the oracle tries
    # them in that order with ordinary runs.
    tpl = load_template(find_template("post_combined"))
    base = _defaults(tpl)
    sizes, grades = ["HSS3x3x3/16", "HSS3x3x1/4", "HSS4x4x3/16"], ["A500 Gr B", "A500 Gr C"]
    members = [("C1", {**base, "P": "2.0 kip", "H": "0.45 kip", "L": "8 ft"}), ("C2", {**base, "P": "1.0 kip", "H": "0.25 kip", "L": "6 ft"})]
    found = search(tpl, members, {"parameter": "post", "family": "hss_square", "grades": grades, "grade_parameter": "grade"}, sizes=sizes)
    table = section_table("hss_square")
    weight = dict(zip(table["designation"], table["weight"], strict=True))
    order = [(s, g) for s in sorted(sizes, key=lambda s: weight[s]) for g in grades]
    for (_mark, inputs), r in zip(members, found, strict=True):
        expected = None
        for s, g in order:
            o = run_calc_inprocess(Calc(1, "t", tpl, "M", {**inputs, "post": s, "grade": g}))
            checks = [c for sh in o.sheets for c in sh["record"]["checks"]]
            if o.error is None and checks and all(status_ok(c["status"]) for c in checks):
                expected = (s, g)
                break
        assert (r.chosen.designation, r.chosen.grade) == expected if r.chosen else expected is None


def test_design_in_a_job_is_recorded_printed_and_verified(tmp_path) -> None:
    from calcpad.cli import main

    (tmp_path / "legs.csv").write_text("mark,P [lbf],N [lbf],L [in],leg\nD1,120,115,30,Pipe 2 Std\nD2,900,0,120,Pipe 1 Std\n", encoding="utf-8")
    (tmp_path / "job.toml").write_text(
        '[job]\nnumber = "T-8"\ntitle = "Design search (invented)"\nclient = "Ferncliff Fabricators (fictional)"\nsite = "Yard 2"\n'
        'engineer = "E. Example"\nrevision = "A"\ndate = 2025-03-14\n\n[[calcs]]\ntemplate = "leg_bending"\ntable = "legs.csv"\n'
        '[calcs.design]\nfamily = "pipe"\n[calcs.inputs]\nD_o = "1.900 in"\nt = "0.145 in"\nF_y = "35 ksi"\nFS_req = 1.67\n', encoding="utf-8")
    out = tmp_path / "out"
    rc = main(["run", str(tmp_path / "job.toml"), "--out", str(out), "--no-pdf"])
    import json

    rec = json.loads((out / "rev-A" / "record.json").read_text())
    d1, d2 = rec["calcs"]
    tpl = load_template(find_template("leg_bending"))
    pipes = list(section_table("pipe")["designation"])
    inputs = {**_defaults(tpl), "P": "120 lbf", "N": "115 lbf", "L": "30 in"}
    assert d1["design"]["chosen"]["designation"] == _brute(tpl, inputs, "leg", pipes, "pipe")
    assert d1["inputs"]["leg"]["value"] == d1["design"]["chosen"]["designation"]  # the sheet is run with it
    assert d1["status"] == "OK" and d1["design"]["runner_up"]["weight_plf"] >= d1["design"]["chosen"]["weight_plf"]
    if d2["design"]["chosen"] is None:  # nothing passes: keeps its own size, its calc says NG
        assert d2["inputs"]["leg"]["value"] == "Pipe 1 Std" and d2["status"] == "NG" and rc == 1
    assert "Size (lightest passing)" in (out / "rev-A" / "submittal.html").read_text()
    assert main(["verify", str(out)]) == 0
