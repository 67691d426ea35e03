"""canopy_frame template: the knee-braced frame's forces against anastruct (2D frame library,
dev dependency, used as an oracle).

The anastruct model is written here from the job's geometry and loads: posts HSS4x4x1/4 and beam
W8x18 (A, I typed from the AISC Shapes Database v15.0 as recalled: HSS4x4x1/4 A = 3.37 in²,
I = 7.80 in⁴; W8x18 A = 5.26 in², I = 61.9 in⁴; L2x2x1/4 A = 0.944 in²; from memory), E =
29,000 ksi, knee braces as truss elements (anastruct: tension +, checked on a two-bar truss
below), the beam moment-connected to the posts (single end releases are compared against closed
forms in test_frame.py, see test_frame_anastruct.py). The ASD combinations are ASCE 7-16
Sec. 2.4.1 (1, 2, 4, 5, 6a, 7) typed here. Section properties of the template come from the
calcpad catalogs, so the comparison tolerance is 1.5 % (catalog vs recalled properties).
"""

from __future__ import annotations

import pytest

from calcpad.widgets.session import TemplateSession

anastruct = pytest.importorskip("anastruct")
SystemElements = anastruct.SystemElements

E = 29.0e6  # psi
H, S, AV, AH = 120.0, 144.0, 24.0, 30.0  # in
POST, BEAM, BRACE = (3.37, 7.80), (5.26, 61.9), 0.944
W_D, P_DT, P_L, P_LT, H_W, W_WU = 10.0, 1000.0, 800.0, 400.0, 600.0, 5.0  # lbf/in, lbf
ASD = [{"D": 1.0}, {"D": 1.0, "L": 1.0}, {"D": 1.0, "L": 0.75}, {"D": 1.0, "W": 0.6}, {"D": 1.0, "W": -0.6},
       {"D": 1.0, "L": 0.75, "W": 0.45}, {"D": 1.0, "L": 0.75, "W": -0.45}, {"D": 0.6, "W": 0.6}, {"D": 0.6, "W": -0.6}]


def _solve(case: str) -> dict[str, float]:
    ss = SystemElements(mesh=50)
    pa, pi = POST[0] * E, POST[1] * E
    ba, bi = BEAM[0] * E, BEAM[1] * E
    lower_l = ss.add_element([[0, 0], [0, H - AV]], EA=pa, EI=pi)
    ss.add_element([[0, H - AV], [0, H]], EA=pa, EI=pi)
    lower_r = ss.add_element([[S, 0], [S, H - AV]], EA=pa, EI=pi)
    ss.add_element([[S, H - AV], [S, H]], EA=pa, EI=pi)
    beam = [ss.add_element([[x0, H], [x1, H]], EA=ba, EI=bi) for x0, x1 in ((0, AH), (AH, S / 2), (S / 2, S - AH), (S - AH, S))]
    kb_l = ss.add_truss_element([[0, H - AV], [AH, H]], EA=BRACE * E)
    kb_r = ss.add_truss_element([[S, H - AV], [S - AH, H]], EA=BRACE * E)
    nid = {k: ss.find_node_id(xy) for k, xy in {"A": [0, 0], "B": [S, 0], "T1": [0, H], "T2": [S, H], "M": [S / 2, H]}.items()}
    ss.add_support_fixed(nid["A"])
    ss.add_support_fixed(nid["B"])
    if case == "D":
        ss.q_load(q=-W_D, element_id=beam, direction="y")
        for n in ("T1", "T2"):
            ss.point_load(nid[n], Fy=-P_DT)
    elif case == "L":
        ss.point_load(nid["M"], Fy=-P_L)
        for n in ("T1", "T2"):
            ss.point_load(nid[n], Fy=-P_LT)
    elif case == "W":
        ss.q_load(q=W_WU, element_id=beam, direction="y")
        ss.point_load(nid["T1"], Fx=H_W)
    else:  # Hs: 0.5 kip at each post top
        for n in ("T1", "T2"):
            ss.point_load(nid[n], Fx=500.0)
    ss.solve()
    _ = lower_l, lower_r
    out = {"kb_l": ss.get_element_results(kb_l)["N"] or ss.get_element_results(kb_l)["Nmin"],
           "kb_r": ss.get_element_results(kb_r)["N"] or ss.get_element_results(kb_r)["Nmin"],
           "ux_T1": -ss.get_node_results_system(nid["T1"])["ux"]}
    for n in ("A", "B"):
        out[f"M_{n}"] = ss.get_node_results_system(nid[n])["Tz"]
    return out


def test_anastruct_truss_sign_is_tension_positive() -> None:
    # two bars at 45 degrees under 10 down at the apex: each in compression 10/(2 sin 45) = 7.071 (statics)
    ss = SystemElements()
    a = ss.add_truss_element([[0, 0], [1, 1]], EA=1000)
    ss.add_truss_element([[1, 1], [2, 0]], EA=1000)
    ss.add_support_hinged(1)
    ss.add_support_hinged(3)
    ss.point_load(2, Fy=-10)
    ss.solve()
    assert ss.get_element_results(a)["Nmin"] == pytest.approx(-7.0710678)


@pytest.fixture(scope="module")
def sheets():
    session = TemplateSession("canopy_frame")
    return session.build({**session.values, "beam_to_post": "moment", "w_D": "120 lbf/ft", "P_Dtop": "1.0 kip", "P_L": "0.8 kip",
                          "P_Ltop": "0.4 kip", "H_W": "0.6 kip", "w_Wup": "60 lbf/ft", "kb_v": "2 ft", "kb_h": "2.5 ft"})


def test_brace_force_base_moment_and_story_drift_match_anastruct(sheets) -> None:
    frame, base = sheets[0], sheets[1]
    r = {c: _solve(c) for c in ("D", "L", "W", "Hs")}

    def comb(key, f):
        return sum(k * r[c][key] for c, k in f.items())

    compression = max(-comb(b, f) for b in ("kb_l", "kb_r") for f in ASD)
    tension = max(comb(b, f) for b in ("kb_l", "kb_r") for f in ASD)
    base_m = max(abs(comb(f"M_{n}", f)) for n in ("A", "B") for f in ASD)
    assert frame["P_kbc"].to("lbf").magnitude == pytest.approx(compression, rel=0.015)
    assert frame["P_kbt"].to("lbf").magnitude == pytest.approx(tension, rel=0.015)
    assert base["M_1"].to("lbf*in").magnitude == pytest.approx(base_m, rel=0.015)
    assert frame["Delta_Hs"].to("in").magnitude == pytest.approx(abs(r["Hs"]["ux_T1"]), rel=0.015)
