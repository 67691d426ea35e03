"""Beam cases vs AISC Steel Construction Manual 15th ed. Table 3-23 (case numbers and formulas
from memory), and the singularity-function solver vs the same closed forms."""

from __future__ import annotations

import math

import pytest

from calcpad.core.errors import InputError
from calcpad.core.units import Q_
from calcpad.eng.analysis.beams import CASES, Beam, PointLoad, UniformLoad, beam_case

E, I = 29000.0, 100.0  # ksi, in^4 (A36/A992 E = 29,000 ksi, common practice)


def test_case1_simple_uniform_quantities() -> None:
    # Table 3-23 case 1: M = wL^2/8, Δ = 5wL^4/(384EI); w = 0.5 klf, L = 20 ft:
    # M = 0.5*20^2/8 = 25 kip-ft; R = 5 kip
    r = beam_case("simple_uniform", w="0.5 kip/ft", L="20 ft", E="29000 ksi", I="100 in^4")
    assert r["M_max"].to("kip*ft").magnitude == pytest.approx(25.0)
    assert r["R_1"].to("kip").magnitude == pytest.approx(5.0)
    # Δ = 5*(0.5/12)*240^4/(384*29000*100) = 0.6207 in
    assert r["delta_max"].to("in").magnitude == pytest.approx(5 * (0.5 / 12) * 240**4 / (384 * 29000 * 100), rel=1e-9)
    assert r["delta_max"].to("in").magnitude == pytest.approx(0.6207, abs=1e-4)


def test_case7_and_case22_values() -> None:
    # Table 3-23 case 7: M = PL/4, Δ = PL^3/(48EI); case 22: M = PL, Δ = PL^3/(3EI)
    r7 = beam_case("simple_center_point", P=10.0, L=120.0, E=E, I=I)
    assert r7["M_max"] == pytest.approx(300.0)
    assert r7["delta_max"] == pytest.approx(10 * 120**3 / (48 * E * I))
    r22 = beam_case("cantilever_end_point", P=1.0, L=60.0, E=E, I=I)
    assert r22["M_max"] == pytest.approx(60.0)
    assert r22["delta_max"] == pytest.approx(60**3 / (3 * E * I))


def test_propped_coefficient_table_185() -> None:
    # Table 3-23 case 12 prints Δmax = wl^4/(185EI) at x = 0.4215 l: ours uses 184.6 (exact 1/184.6)
    r = beam_case("propped_uniform", w=0.1, L=240.0, E=E, I=I)
    assert r["delta_max"] == pytest.approx(0.1 * 240**4 / (185 * E * I), rel=3e-3)


CLOSED = [
    ("simple_uniform", dict(w=0.1, L=240.0), [(0, "pin"), (240, "roller")], [UniformLoad(0.1)], 240.0),
    ("simple_center_point", dict(P=4.0, L=240.0), [(0, "pin"), (240, "roller")], [PointLoad(4.0, 120)], 240.0),
    ("simple_point", dict(P=5.0, L=240.0, a=60.0), [(0, "pin"), (240, "roller")], [PointLoad(5, 60)], 240.0),
    ("simple_point", dict(P=5.0, L=240.0, a=170.0), [(0, "pin"), (240, "roller")], [PointLoad(5, 170)], 240.0),
    ("fixed_uniform", dict(w=0.1, L=240.0), [(0, "fixed"), (240, "fixed")], [UniformLoad(0.1)], 240.0),
    ("propped_uniform", dict(w=0.1, L=240.0), [(0, "pin"), (240, "fixed")], [UniformLoad(0.1)], 240.0),
    ("cantilever_uniform", dict(w=0.05, L=96.0), [(0, "fixed")], [UniformLoad(0.05)], 96.0),
    ("cantilever_point", dict(P=2.0, L=96.0, b=40.0), [(0, "fixed")], [PointLoad(2.0, 40)], 96.0),
    ("cantilever_end_point", dict(P=2.0, L=96.0), [(0, "fixed")], [PointLoad(2.0, 96)], 96.0),
    ("overhang_uniform", dict(w=0.1, L=200.0, a=60.0), [(0, "pin"), (200, "roller")], [UniformLoad(0.1)], 260.0),
    ("overhang_end_point", dict(P=2.0, L=200.0, a=60.0), [(0, "pin"), (200, "roller")], [PointLoad(2, 260)], 260.0),
]


@pytest.mark.parametrize("key,inputs,supports,loads,length", CLOSED, ids=[c[0] + str(i) for i, c in enumerate(CLOSED)])
def test_solver_matches_table_3_23(key: str, inputs: dict, supports: list, loads: list, length: float) -> None:
    """Independent check: double integration by singularity functions vs the table formulas."""
    case = beam_case(key, E=E, I=I, **inputs).values
    sol = Beam(length, supports, loads, E=E, I=I).solve()
    assert sol.M_abs == pytest.approx(float(case["M_max"]), rel=1e-9)
    assert abs(sol.V_max) == pytest.approx(float(case["V_max"]), rel=1e-9)
    assert abs(sol.reactions[0][1]) == pytest.approx(float(case["R_1"]), rel=1e-9)
    if "R_2" in case:
        assert sol.reactions[-1][1] == pytest.approx(float(case["R_2"]), rel=1e-9)
    if "delta_max" in case:
        tol = 2e-4 if key == "propped_uniform" else 1e-9  # 184.6 is rounded
        assert sol.delta_max == pytest.approx(float(case["delta_max"]), rel=tol)
    if "x_delta" in case and key == "simple_point":
        a, b = inputs["a"], inputs["L"] - inputs["a"]
        x = float(case["x_delta"]) if a >= b else inputs["L"] - float(case["x_delta"])
        assert sol.x_delta_max == pytest.approx(x, rel=1e-6)
    if "delta_tip" in case:
        assert sol.delta[-1] == pytest.approx(float(case["delta_tip"]), rel=1e-9)
    if "delta_up" in case:
        assert -min(sol.delta) == pytest.approx(float(case["delta_up"]), rel=1e-5)  # grid minimum
    if "M_pos" in case:
        assert sol.M_max == pytest.approx(float(case["M_pos"]), rel=1e-9)
        assert sol.x_M_max == pytest.approx(float(case["x_M"]), rel=1e-9)


def test_superposition_two_loads() -> None:
    # simple beam: case 1 + case 8 (Table 3-23); reactions and midspan deflection add
    L, w, P, a = 240.0, 0.05, 3.0, 80.0
    sol = Beam(L, [(0, "pin"), (L, "roller")], [UniformLoad(w), PointLoad(P, a)], E=E, I=I).solve()
    b = L - a
    assert sol.reactions[0][1] == pytest.approx(w * L / 2 + P * b / L)
    # deflection at midspan of a point load at a (x = L/2 > a): P*a*(L-x)*(2Lx - x^2 - a^2)/(6EIL) (Roark, from memory)
    x = L / 2
    mid = 5 * w * L**4 / (384 * E * I) + P * a * (L - x) * (2 * L * x - x**2 - a**2) / (6 * E * I * L)
    i = int(abs(sol.x - x).argmin())
    assert sol.delta[i] == pytest.approx(mid, rel=1e-9)


def test_partial_uniform_load_statics() -> None:
    # uniform load on the left half of a simple beam: R1 = 3wL/8, R2 = wL/8 (statics, common practice)
    sol = Beam(200.0, [(0, "pin"), (200, "roller")], [UniformLoad(0.1, 0, 100)]).solve()
    assert sol.reactions[0][1] == pytest.approx(0.1 * 200 * 3 / 8)
    assert sol.reactions[1][1] == pytest.approx(0.1 * 200 / 8)
    assert sol.delta is None


def test_beam_with_units() -> None:
    sol = Beam("20 ft", [(0, "pin"), ("20 ft", "roller")], [UniformLoad("0.5 kip/ft")], E="29000 ksi", I="100 in^4").solve()
    assert sol.M_max == pytest.approx(25.0 * 12)  # kip*in
    assert sol.delta_max == pytest.approx(0.6207, abs=1e-4)


def test_sheet_builder_matches_numeric() -> None:
    sheet = pytest.importorskip("calcpad.core.sheet")
    for key, inputs, *_ in CLOSED:
        sh = sheet.Sheet(key)
        given = {k: Q_(v, "kip" if k == "P" else "kip/in" if k == "w" else "in") for k, v in inputs.items()}
        names = __import__("calcpad.eng.analysis.beams", fromlist=["add_beam_case"]).add_beam_case(
            sh, key, suffix="_1", E=Q_(E, "ksi"), I=Q_(I, "in**4"), **given
        )
        sh.evaluate()
        num = beam_case(key, E=Q_(E, "ksi"), I=Q_(I, "in**4"), **given).values
        for n in names:
            base = n[: -len("_1")]
            got, want = sh[n], num[base]
            assert got.to(want.units).magnitude == pytest.approx(want.magnitude, rel=1e-9), (key, n)
        assert any(CASES[key].ref in s.ref for s in sh.steps if hasattr(s, "ref") and s.ref)


def test_bad_inputs() -> None:
    with pytest.raises(InputError, match="beam case"):
        beam_case("simple_triangle", w=1, L=2)
    with pytest.raises(InputError, match="a: got"):
        beam_case("simple_point", P=1.0, L=10.0, a=12.0)
    with pytest.raises(InputError, match="L: got"):
        beam_case("simple_uniform", w=1.0, L=-3.0)
    with pytest.raises(InputError, match="mix"):
        beam_case("simple_uniform", w="1 kip/ft", L=3.0)
    with pytest.raises(InputError, match="supports"):
        Beam(100.0, [(0, "pin")], [PointLoad(1, 50)]).solve()
    with pytest.raises(InputError, match="kind"):
        Beam(100.0, [(0, "hinge")], [PointLoad(1, 50)])
    with pytest.raises(InputError, match="x: got"):
        Beam(100.0, [(0, "fixed")], [PointLoad(1, 150)])
    assert math.isfinite(Beam(100.0, [(0, "fixed")], [PointLoad(1, 50)]).solve().M_min)


def test_beam_results_in_sheet() -> None:
    sheet = pytest.importorskip("calcpad.core.sheet")
    from calcpad.eng.analysis.beams import add_beam_results

    sol = Beam(240.0, [(0, "pin"), (240, "roller")], [UniformLoad(0.1)], E=E, I=I).solve()
    sh = sheet.Sheet("Beam")
    names = add_beam_results(sh, sol, suffix="_1")
    sh.evaluate()
    # AISC Manual 15th ed. Table 3-23 case 1: wL^2/8 = 720 kip*in, 5wL^4/(384EI)
    assert sh["M_max_1"].to("kip*in").magnitude == pytest.approx(720.0)
    assert sh["delta_max_1"].to("in").magnitude == pytest.approx(5 * 0.1 * 240**4 / (384 * E * I))
    assert names == ["M_max_1", "V_max_1", "delta_max_1"]
