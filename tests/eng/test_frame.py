"""2D frame solver vs closed forms (AISC Manual 15th ed. Table 3-23, case numbers from memory;
statics of three-hinged frames, common practice) and bad-input handling."""

from __future__ import annotations

import numpy as np
import pytest

from calcpad.core.errors import InputError
from calcpad.core.units import Q_
from calcpad.eng.analysis.frame import Frame

E, A, I = 29000.0, 5.0, 50.0  # ksi, in^2, in^4 (invented section; E common practice)


def _beam(L: float, left: str, right: str, n_mid: bool = False) -> Frame:
    fr = Frame("kip", "in")
    fr.node("A", 0, 0)
    fr.node("B", L, 0)
    fr.member("AB", "A", "B", E=E, A=A, I=I)
    if left:
        fr.support("A", left)
    if right:
        fr.support("B", right)
    return fr


def test_simple_beam_uniform_table_case_1() -> None:
    L, w = 240.0, 0.1
    fr = _beam(L, "pinned", "roller")
    fr.member_load("D", "AB", -w)
    res = fr.solve()
    assert res.reaction("A", "D")[1].magnitude == pytest.approx(w * L / 2)  # case 1: R = wL/2
    dg = res.diagram("AB", "D", n=41)
    mid = int(np.argmin(abs(dg.x - L / 2)))
    assert dg.M[mid] == pytest.approx(w * L**2 / 8)  # case 1: M = wL^2/8
    assert -dg.v[mid] == pytest.approx(5 * w * L**4 / (384 * E * I), rel=1e-9)  # case 1: Δ = 5wL^4/384EI
    assert -dg.delta_rel[mid] == pytest.approx(5 * w * L**4 / (384 * E * I), rel=1e-9)
    assert dg.V[0] == pytest.approx(w * L / 2)


def test_cantilever_end_point_table_case_22() -> None:
    L, P = 96.0, 2.0
    fr = _beam(L, "fixed", "")
    fr.node_load("L", "B", Fy=-P)
    res = fr.solve()
    _, uy, rz = res.displacement("B", "L")
    assert -uy.magnitude == pytest.approx(P * L**3 / (3 * E * I), rel=1e-12)  # case 22
    assert -rz.magnitude == pytest.approx(P * L**2 / (2 * E * I), rel=1e-12)  # slope PL^2/2EI (common practice)
    assert res.reaction("A", "L")[2].to("kip*in").magnitude == pytest.approx(P * L)  # M = PL


def test_fixed_fixed_uniform_table_case_15() -> None:
    L, w = 200.0, 0.08
    fr = _beam(L, "fixed", "fixed")
    fr.member_load("D", "AB", -w)
    res = fr.solve()
    dg = res.diagram("AB", "D", n=21)
    assert dg.M[0] == pytest.approx(-w * L**2 / 12)  # case 15: hogging wL^2/12 at ends
    assert dg.M[10] == pytest.approx(w * L**2 / 24)  # wL^2/24 at midspan
    assert -dg.v[10] == pytest.approx(w * L**4 / (384 * E * I), rel=1e-9)  # wL^4/384EI


def test_propped_uniform_table_case_12() -> None:
    L, w = 180.0, 0.05
    fr = _beam(L, "roller", "fixed")
    fr.member_load("D", "AB", -w)
    res = fr.solve()
    assert res.reaction("A", "D")[1].magnitude == pytest.approx(3 * w * L / 8)  # case 12
    assert abs(res.reaction("B", "D")[2].magnitude) == pytest.approx(w * L**2 / 8)
    env = res.envelope("AB", "delta_rel", n=2001)
    assert abs(env[0].magnitude) == pytest.approx(w * L**4 / (184.6 * E * I), rel=5e-4)  # table: 1/185
    assert env[2].magnitude == pytest.approx(0.4215 * L, abs=0.1)  # from the supported end


def test_simple_beam_member_point_load_table_case_8() -> None:
    L, P, a = 240.0, 5.0, 60.0
    b = L - a
    fr = _beam(L, "pinned", "roller")
    fr.member_point_load("L", "AB", -P, a)
    res = fr.solve()
    assert res.reaction("A", "L")[1].magnitude == pytest.approx(P * b / L)  # case 8: R1 = Pb/L
    dg = res.diagram("AB", "L", n=481)
    k = int(np.argmin(abs(dg.x - a)))
    assert dg.M[k] == pytest.approx(P * a * b / L)  # M = Pab/L
    assert -dg.v[k] == pytest.approx(P * a**2 * b**2 / (3 * E * I * L), rel=1e-9)  # Δa = Pa^2b^2/3EIL
    dmax = P * a * b * (b + 2 * a) * np.sqrt(3 * b * (b + 2 * a)) / (27 * E * I * L)  # case 8, b > a
    assert -dg.v.min() == pytest.approx(dmax, rel=1e-5)


def test_axial_shortening() -> None:
    # column under axial load: delta = PL/EA (common practice)
    fr = Frame("kip", "in")
    fr.node("A", 0, 0)
    fr.node("B", 0, 120)
    fr.member("col", "A", "B", E=E, A=A, I=I)
    fr.support("A", "fixed")
    fr.node_load("D", "B", Fy=-10)
    res = fr.solve()
    assert -res.displacement("B", "D")[1].magnitude == pytest.approx(10 * 120 / (E * A), rel=1e-12)
    assert res.diagram("col", "D").N[0] == pytest.approx(-10.0)  # compression negative


def _three_hinged(h: float, L: float) -> Frame:
    fr = Frame("kip", "ft")
    for n, x, y in (("A", 0, 0), ("B", 0, h), ("C", L / 2, h), ("D", L, h), ("E", L, 0)):
        fr.node(n, x, y)
    kw = {"E": Q_(E, "ksi"), "A": Q_(A, "in**2"), "I": Q_(I, "in**4")}
    fr.member("c1", "A", "B", **kw)
    fr.member("b1", "B", "C", release_end=True, **kw)
    fr.member("b2", "C", "D", **kw)
    fr.member("c2", "E", "D", **kw)
    fr.support("A", "pinned")
    fr.support("E", "pinned")
    return fr


def test_three_hinged_frame_statics() -> None:
    # three-hinged portal, uniform load w on the beam: V = wL/2, H = wL^2/(8h) (statics, common practice)
    h, L, w = 12.0, 30.0, 0.4
    fr = _three_hinged(h, L)
    fr.member_load("D", "b1", -w)
    fr.member_load("D", "b2", -w)
    # lateral load P at the top: H_A = H_E = P/2, V_E = -V_A = P*h/L (statics, common practice)
    fr.node_load("W", "B", Fx=6.0)
    fr.combination("D+W", {"D": 1.0, "W": 1.0})
    res = fr.solve()
    rx, ry, mz = (q.magnitude for q in res.reaction("A", "D"))
    assert ry == pytest.approx(w * L / 2)
    assert rx == pytest.approx(w * L**2 / (8 * h))
    assert mz == 0.0
    rx, ry, _ = (q.magnitude for q in res.reaction("E", "W"))
    assert rx == pytest.approx(-3.0)
    assert ry == pytest.approx(6.0 * h / L)
    # the hinge carries no moment
    assert abs(res.diagram("b1", "D").M[-1]) < 1e-9
    # combination = sum of cases
    both = np.array([q.magnitude for q in res.reaction("A", "D+W")])
    parts = np.array([q.magnitude for q in res.reaction("A", "D")]) + np.array([q.magnitude for q in res.reaction("A", "W")])
    assert both == pytest.approx(parts)


def test_gerber_hinge_node_load() -> None:
    # fixed at A, hinge at B (end of AB), BC to a roller: a load at B goes to the cantilever AB only
    fr = Frame("kN", "m")
    fr.node("A", 0, 0)
    fr.node("B", 3, 0)
    fr.node("C", 6, 0)
    fr.member("AB", "A", "B", E=200e6, A=0.01, I=1e-4, release_end=True)
    fr.member("BC", "B", "C", E=200e6, A=0.01, I=1e-4)
    fr.support("A", "fixed")
    fr.support("C", "roller")
    fr.node_load("P", "B", Fy=-10)
    res = fr.solve()
    assert res.reaction("A", "P")[1].magnitude == pytest.approx(10.0)
    assert res.reaction("A", "P")[2].magnitude == pytest.approx(30.0)
    assert abs(res.reaction("C", "P")[1].magnitude) < 1e-9


def test_many_cases_one_factorisation_and_tables() -> None:
    fr = _beam(120.0, "fixed", "")
    for k in range(5):
        fr.node_load(f"P{k}", "B", Fy=-(k + 1.0))
    res = fr.solve()
    tips = [-res.displacement("B", f"P{k}")[1].magnitude for k in range(5)]
    assert tips == pytest.approx([(k + 1.0) * 120.0**3 / (3 * E * I) for k in range(5)])
    tab = res.reactions_frame()
    assert len(tab) == 5 and "Mz [kip·in]" in tab.columns
    assert len(res.member_forces_frame()) == 5
    assert len(res.displacements_frame(["P0"])) == 2


# ---------------------------------------------------------------- unstable frames and bad input


def test_mechanism_no_x_support() -> None:
    fr = _beam(100.0, "roller", "roller")
    fr.node_load("D", "A", Fy=-1)
    with pytest.raises(InputError, match=r"no support holds the frame in x.*A \(x\)"):
        fr.solve()


def test_mechanism_sway_names_nodes_and_releases() -> None:
    fr = Frame("kip", "in")
    for n, x, y in (("A", 0, 0), ("B", 0, 100), ("C", 100, 100), ("D", 100, 0)):
        fr.node(n, x, y)
    fr.member("c1", "A", "B", E=E, A=A, I=I)
    fr.member("bm", "B", "C", E=E, A=A, I=I, release_start=True, release_end=True)
    fr.member("c2", "D", "C", E=E, A=A, I=I)
    fr.support("A", "pinned")
    fr.support("D", "pinned")
    fr.node_load("W", "B", Fx=1)
    with pytest.raises(InputError, match=r"unstable.*B \(x\).*C \(x\).*releases involved: bm at B, bm at C"):
        fr.solve()


def test_mechanism_rotation_about_single_pin() -> None:
    fr = _beam(100.0, "pinned", "")
    fr.node_load("D", "B", Fy=-1)
    with pytest.raises(InputError, match="rotating"):
        fr.solve()


def test_zero_length_member() -> None:
    fr = Frame()
    fr.node("A", 0, 0)
    fr.node("B", "0 m", "0 mm")
    with pytest.raises(InputError, match="same point"):
        fr.member("AB", "A", "B", E=1, A=1, I=1)


def test_load_on_missing_node_and_member() -> None:
    fr = _beam(100.0, "fixed", "")
    with pytest.raises(InputError, match=r"node 'Z' not found.*\['A', 'B'\]"):
        fr.node_load("D", "Z", Fy=-1)
    with pytest.raises(InputError, match="member 'XY' not found"):
        fr.member_load("D", "XY", -1)
    with pytest.raises(InputError, match="direction"):
        fr.member_load("D", "AB", -1, direction="z")
    with pytest.raises(InputError, match="a: got"):
        fr.member_point_load("D", "AB", -1, 150)


def test_other_bad_input() -> None:
    fr = _beam(100.0, "fixed", "")
    with pytest.raises(InputError, match="kind 'hinge'"):
        fr.support("B", "hinge")
    with pytest.raises(InputError, match="E: got -5"):
        fr.member("X", "A", "B", E=-5, A=1, I=1)
    with pytest.raises(InputError, match=r"stress|E"):
        fr.member("Y", "A", "B", E="10 in", A=1, I=1)
    with pytest.raises(InputError, match="no loads"):
        fr.solve()
    fr.node_load("D", "B", Fy=-1)
    fr.combination("C1", {"D": 1.2, "L": 1.6})
    with pytest.raises(InputError, match="load case 'L' not found"):
        fr.solve()


def test_moment_on_fully_released_node() -> None:
    fr = Frame()
    fr.node("A", 0, 0)
    fr.node("B", 1, 1)
    fr.node("C", 2, 0)
    fr.member("AB", "A", "B", E=1e8, A=1e-3, I=1e-5, release_end=True)
    fr.member("BC", "B", "C", E=1e8, A=1e-3, I=1e-5, release_start=True)
    fr.support("A", "pinned")
    fr.support("C", "pinned")
    fr.node_load("D", "B", Fy=-1)
    res = fr.solve()  # a three-pin arch: fine without a moment
    assert res.reaction("A", "D")[1].magnitude == pytest.approx(0.5)
    fr.node_load("M", "B", Mz=1.0)
    with pytest.raises(InputError, match="moment is applied"):
        fr.solve()


def test_combination_diagram_is_sum_of_case_diagrams() -> None:
    # linear superposition (common practice): N, V, M and displacements of D + 0.6W
    fr = _three_hinged(10.0, 24.0)
    fr.member_load("D", "b1", -0.2)
    fr.member_point_load("D", "b2", -1.5, "4 ft")
    fr.member_load("W", "c1", 0.1, direction="x")
    fr.combination("D+0.6W", {"D": 1.0, "W": 0.6})
    res = fr.solve()
    for m in ("c1", "b1", "b2", "c2"):
        d, w, c = (res.diagram(m, k, n=11) for k in ("D", "W", "D+0.6W"))
        kc, kd = np.isin(c.x, w.x), np.isin(d.x, w.x)  # common stations (point loads add some)
        for q in ("N", "V", "M", "v", "u"):
            got, want = getattr(c, q)[kc], getattr(d, q)[kd] + 0.6 * getattr(w, q)
            assert np.allclose(got, want, rtol=1e-12, atol=1e-12), (m, q)
    # equilibrium of the whole frame for W: sum of reactions = -(0.1 klf * 10 ft)
    rx = sum(res.reaction(n, "W")[0].magnitude for n in ("A", "E"))
    assert rx == pytest.approx(-1.0)
