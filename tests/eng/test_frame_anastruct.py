"""2D frame solver vs anastruct (reference library, dev dependency only, used as an oracle).

Both models are linear, Euler-Bernoulli, with axial deformation (EA finite), hinges as zero
rotational springs at member ends. anastruct reports node results as the forces and
displacements with the opposite sign to ours, so its values are negated before comparing.
Members that carry point loads are split at the load in the anastruct model (exact for both).

Tolerance: 1e-6 relative, with an absolute floor of 1e-6 times the largest value of the same
kind in the model. The floor is needed because anastruct's distributed loads carry an error of
about 5e-7 relative (its fixed-fixed beam under uniform load gives M = 0.9999995*wL^2/12, where
the closed form and this solver give wL^2/12); with node loads only the two agree to ~1e-12.

Single member-end moment releases are not compared here: anastruct 1.7.0's zero-spring hinges
gave results that break compatibility in a frame where three members meet at the released end
(checked by hand with an independent duplicate-rotation model), so releases are tested against
closed-form statics in test_frame.py and here only as two-force members (anastruct truss
elements).
"""

from __future__ import annotations

from typing import Any

import numpy as np
import pytest

from calcpad.eng.analysis.frame import Frame

anastruct = pytest.importorskip("anastruct")
SystemElements = anastruct.SystemElements

E, A, I = 200e6, 6.0e-3, 4.0e-5  # kN/m^2, m^2, m^4 (steel-like; invented section)


def _ours(spec: dict[str, Any]) -> Frame:
    fr = Frame("kN", "m")
    for n, (x, y) in spec["nodes"].items():
        fr.node(n, x, y)
    for name, i, j, ri, rj in spec["members"]:
        fr.member(name, i, j, E=E, A=A, I=spec.get("I", {}).get(name, I), release_start=ri, release_end=rj)
    for n, k in spec["supports"].items():
        fr.support(n, k)
    for n, fx, fy, mz in spec.get("node_loads", []):
        fr.node_load("C", n, fx, fy, mz)
    for m, w, d in spec.get("udl", []):
        fr.member_load("C", m, w, d)
    for m, p, a, d in spec.get("points", []):
        fr.member_point_load("C", m, p, a, d)
    return fr


def _theirs(spec: dict[str, Any]) -> tuple[SystemElements, dict[str, list[int]]]:
    ss = SystemElements(EA=E * A, EI=E * I, mesh=400)
    nodes = spec["nodes"]
    subs: dict[str, list[int]] = {}
    for name, i, j, ri, rj in spec["members"]:
        p0, p1 = np.array(nodes[i], float), np.array(nodes[j], float)
        L = float(np.hypot(*(p1 - p0)))
        ei = E * spec.get("I", {}).get(name, I)
        if ri and rj:  # released at both ends, no member loads: a two-force member (truss element)
            subs[name] = [ss.add_truss_element([list(p0), list(p1)], EA=E * A)]
            continue
        assert not (ri or rj), "single end releases are tested against closed forms (test_frame.py)"
        cuts = sorted({a for m, _, a, _ in spec.get("points", []) if m == name} - {0.0, L})
        stations = [0.0, *cuts, L]
        ids = []
        for k in range(len(stations) - 1):
            q0 = p0 + (p1 - p0) * stations[k] / L
            q1 = p0 + (p1 - p0) * stations[k + 1] / L
            ids.append(ss.add_element([list(q0), list(q1)], EA=E * A, EI=ei))
        subs[name] = ids
    nid = {n: ss.find_node_id(list(map(float, xy))) for n, xy in nodes.items()}
    for n, k in spec["supports"].items():
        {"fixed": ss.add_support_fixed, "pinned": ss.add_support_hinged}.get(
            k, lambda i: ss.add_support_roll(i, direction="x")
        )(nid[n])
    for n, fx, fy, mz in spec.get("node_loads", []):
        if fx or fy:
            ss.point_load(nid[n], Fx=fx, Fy=fy)
        if mz:
            ss.moment_load(nid[n], Ty=mz)
    for m, w, d in spec.get("udl", []):
        ss.q_load(q=w, element_id=subs[m], direction={"y": "y", "x": "x", "local_y": "element"}[d])
    for m, p, a, d in spec.get("points", []):
        name, i, j, *_ = next(t for t in spec["members"] if t[0] == m)
        p0, p1 = np.array(nodes[i], float), np.array(nodes[j], float)
        L = float(np.hypot(*(p1 - p0)))
        at = p0 + (p1 - p0) * a / L
        k = ss.find_node_id(list(at))
        ss.point_load(k, Fx=p if d == "x" else 0.0, Fy=p if d == "y" else 0.0)
    ss.solve()
    return ss, subs


FRAMES: dict[str, dict[str, Any]] = {
    "portal_fixed_lateral_gravity": {
        "nodes": {"A": (0, 0), "B": (0, 4), "C": (6, 4), "D": (6, 0)},
        "members": [("c1", "A", "B", False, False), ("bm", "B", "C", False, False), ("c2", "D", "C", False, False)],
        "supports": {"A": "fixed", "D": "fixed"},
        "node_loads": [("B", 12.0, 0.0, 0.0)],
        "udl": [("bm", -8.0, "y")],
    },
    "portal_pinned_base_lateral": {
        "nodes": {"A": (0, 0), "B": (0, 3.5), "C": (5, 3.5), "D": (5, 0)},
        "members": [("c1", "A", "B", False, False), ("bm", "B", "C", False, False), ("c2", "D", "C", False, False)],
        "supports": {"A": "pinned", "D": "pinned"},
        "node_loads": [("B", 9.0, 0.0, 0.0), ("C", 0.0, -20.0, 0.0)],
        "I": {"bm": 8.0e-5},
    },
    "gable_fixed_inclined_load": {
        "nodes": {"A": (0, 0), "B": (0, 4), "C": (5, 5.5), "D": (10, 4), "E": (10, 0)},
        "members": [
            ("c1", "A", "B", False, False), ("r1", "B", "C", False, False),
            ("r2", "C", "D", False, False), ("c2", "E", "D", False, False),
        ],
        "supports": {"A": "fixed", "E": "fixed"},
        "udl": [("r1", -4.0, "local_y"), ("r2", -4.0, "y"), ("c1", 2.5, "x")],  # "y": per member length
    },
    "two_bay_point_loads": {
        "nodes": {"A": (0, 0), "B": (0, 3), "C": (4, 3), "D": (4, 0), "E": (9, 3), "F": (9, 0)},
        "members": [
            ("c1", "A", "B", False, False), ("b1", "B", "C", False, False), ("c2", "D", "C", False, False),
            ("b2", "C", "E", False, False), ("c3", "F", "E", False, False),
        ],
        "supports": {"A": "fixed", "D": "pinned", "F": "fixed"},
        "points": [("b1", -15.0, 1.5, "y"), ("b2", -10.0, 3.0, "y"), ("c3", 4.0, 1.0, "x")],
        "node_loads": [("E", -6.0, 0.0, 0.0)],
    },
    "braced_stand_with_moment": {
        "nodes": {"A": (0, 0), "B": (0, 1.2), "C": (1.5, 1.2), "D": (1.5, 0)},
        "members": [
            ("l1", "A", "B", False, False), ("top", "B", "C", False, False), ("l2", "D", "C", False, False),
            ("br", "A", "C", True, True),
        ],
        "supports": {"A": "pinned", "D": "pinned"},
        "node_loads": [("B", 3.0, -5.0, 0.0), ("C", 0.0, -5.0, 2.0)],
    },
    "continuous_beam_roller": {
        "nodes": {"A": (0, 0), "B": (5, 0), "C": (11, 0)},
        "members": [("s1", "A", "B", False, False), ("s2", "B", "C", False, False)],
        "supports": {"A": "pinned", "B": "roller", "C": "roller"},
        "udl": [("s1", -6.0, "y"), ("s2", -3.0, "y")],
        "points": [("s2", -12.0, 2.0, "y")],
    },
}


@pytest.mark.parametrize("key", list(FRAMES))
def test_frame_vs_anastruct(key: str) -> None:
    spec = FRAMES[key]
    res = _ours(spec).solve()
    ss, subs = _theirs(spec)
    scale_f = max(abs(res.R).max(), 1.0)
    scale_u = max(abs(res.U[0::3]).max(), abs(res.U[1::3]).max(), 1e-12)
    scale_m = max(max(abs(res.diagram(m[0], "C", n=3).M).max() for m in spec["members"]), 1.0)
    for n, xy in spec["nodes"].items():
        r = ss.get_node_results_system(ss.find_node_id(list(map(float, xy))))
        ux, uy, rz = (q.magnitude for q in res.displacement(n, "C"))
        assert ux == pytest.approx(-r["ux"], rel=1e-6, abs=1e-6 * scale_u), (n, "ux")
        assert uy == pytest.approx(-r["uy"], rel=1e-6, abs=1e-6 * scale_u), (n, "uy")
        if n in spec["supports"]:
            Rx, Ry, Mz = (q.magnitude for q in res.reaction(n, "C"))
            assert Rx == pytest.approx(-r["Fx"], rel=1e-6, abs=1e-6 * scale_f), (n, "Rx")
            assert Ry == pytest.approx(-r["Fy"], rel=1e-6, abs=1e-6 * scale_f), (n, "Ry")
            assert Mz == pytest.approx(-r["Tz"], rel=1e-6, abs=1e-6 * scale_f), (n, "Mz")
        elif not any(n in (m[1], m[2]) and (m[3] or m[4]) for m in spec["members"]):
            scale_r = max(abs(res.U[2::3]).max(), 1e-12)
            assert rz == pytest.approx(-r["phi_z"], rel=1e-6, abs=1e-6 * scale_r), (n, "rz")
    # member end moments and axial forces (magnitudes; anastruct's internal sign conventions differ)
    for name, *_ in spec["members"]:
        dg = res.diagram(name, "C", n=3)
        first = ss.get_element_results(subs[name][0], verbose=True)
        last = ss.get_element_results(subs[name][-1], verbose=True)
        if "M" not in first:  # truss element: no moment, compare the axial force only
            assert abs(dg.M).max() <= 1e-9 * scale_m
            assert abs(dg.N[0]) == pytest.approx(abs(first["Nmax"]), rel=1e-6, abs=1e-6 * scale_f), (name, "N")
            continue
        assert abs(dg.M[0]) == pytest.approx(abs(first["M"][0]), rel=1e-6, abs=1e-6 * scale_m), (name, "M start")
        assert abs(dg.M[-1]) == pytest.approx(abs(last["M"][-1]), rel=1e-6, abs=1e-6 * scale_m), (name, "M end")
        assert abs(dg.N[0]) == pytest.approx(abs(first["Nmax"]), rel=1e-6, abs=1e-6 * scale_f), (name, "N")
