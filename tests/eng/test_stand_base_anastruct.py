"""wind_rooftop_stand, stand-base sheet: the governing corner-rod forces against anastruct (2D
frame library, dev dependency, used as an oracle) and a hand superposition.

The two frame lines (x: span = unit length, y: span = unit width) are modelled in anastruct
from the sheet's geometry and section values, the unit as a stiff block moment-connected to the
rails ("rigid block": anastruct's single end releases are not used, see test_frame_anastruct.py).
The loads on one frame line (unit weight, wind, uplift and F_p per frame line) are read from the
stand sheet as inputs (their own tests cover ASCE 7-16 Ch. 29 and 13). The strength combinations
are typed from ASCE 7-16 Sec. 2.3.1 and 2.3.6 (E_v = 0.2 S_DS D in the dead-load factor, S_DS =
0.5): 1.4D, 1.2D, 1.2D ± W, 0.9D ± W, 1.3D ± E, 0.8D ± E. Directions: wind in x, in y and 75 % of
both (ASCE 7-16 Fig. 27.4-8 case 3); seismic in x, in y, 100 %/30 % both ways (12.5.3.1(a)) and
0.707 each way. Corner rod of four rods in a square at ±f: N_t/4 + (|M_x| + |M_y|)/(4 f)
(elastic rod group, statics).
"""

from __future__ import annotations

import math

import pytest

from calcpad.widgets.session import TemplateSession

anastruct = pytest.importorskip("anastruct")
SystemElements = anastruct.SystemElements

WIND = [(1.0, 0.0), (0.0, 1.0), (0.75, 0.75)]
SEISMIC = [(1.0, 0.0), (0.0, 1.0), (1.0, 0.3), (0.3, 1.0), (math.sqrt(0.5), math.sqrt(0.5))]
LRFD_W = [{"D": 1.4}, {"D": 1.2}, {"D": 1.2, "W": 1.0}, {"D": 1.2, "W": -1.0}, {"D": 0.9, "W": 1.0}, {"D": 0.9, "W": -1.0}]
LRFD_E = [{"D": 1.3, "E": 1.0}, {"D": 1.3, "E": -1.0}, {"D": 0.8, "E": 1.0}, {"D": 0.8, "E": -1.0}]


def _v(sh, name, unit):
    return sh[name].to(unit).magnitude


def _frame(sh, span: float, F_h: float) -> dict[str, dict[str, tuple[float, float]]]:
    """Base (uplift N_t, moment M) of both legs per load case D, Wh, Wv, E (lbf, lbf*in)."""
    H, e = _v(sh, "H", "in"), _v(sh, "e_w", "in")
    E = _v(sh, "E_s", "psi")
    A, I = _v(sh, "A_g", "in^2"), _v(sh, "I_l", "in^4")
    loads = {"D": (0.0, -_v(sh, "W_f", "lbf")), "Wh": (F_h, 0.0), "Wv": (0.0, _v(sh, "F_vf", "lbf")), "E": (_v(sh, "F_pf", "lbf"), 0.0)}
    out = {}
    for case, (fx, fy) in loads.items():
        ss = SystemElements(mesh=20)
        ss.add_element([[0, 0], [0, H]], EA=E * A, EI=E * I)
        ss.add_element([[span, 0], [span, H]], EA=E * A, EI=E * I)
        ss.add_element([[0, H], [span, H]], EA=E * A, EI=E * I)
        ss.add_element([[0, H], [span / 2, H + e]], EA=E * 100.0, EI=E * 1000.0)
        ss.add_element([[span, H], [span / 2, H + e]], EA=E * 100.0, EI=E * 1000.0)
        a, d, u = ss.find_node_id([0, 0]), ss.find_node_id([span, 0]), ss.find_node_id([span / 2, H + e])
        ss.add_support_fixed(a)
        ss.add_support_fixed(d)
        ss.point_load(u, Fx=fx, Fy=fy)
        ss.solve()
        res = {}
        for leg, node in (("windward", a), ("leeward", d)):
            r = ss.get_node_results_system(node)
            res[leg] = (r["Fy"], r["Tz"])  # anastruct: opposite sign to the reaction; uplift N_t = +Fy
        out[case] = res
    return out


@pytest.fixture(scope="module")
def sheets():
    session = TemplateSession("wind_rooftop_stand")
    return session.build({**session.values, "attachment": "rigid block", "S_DS": 0.5})


def test_corner_rod_forces_match_anastruct(sheets) -> None:
    sh, base = sheets[0], sheets[1]
    fx = _frame(sh, _v(sh, "L_u", "in"), _v(sh, "F_hf", "lbf"))
    fy = _frame(sh, _v(sh, "B_u", "in"), _v(sh, "F_hfy", "lbf"))
    f = 2.75  # in, the template's default rod_f

    def corner(comb, lateral, kx, ky, leg):
        fD, fL = comb.get("D", 0.0), comb.get(lateral, 0.0)
        h = "Wh" if lateral == "W" else "E"
        vert = fx["Wv"][leg] if lateral == "W" else (0.0, 0.0)
        N = fD * fx["D"][leg][0] + fL * (vert[0] + kx * fx[h][leg][0] + ky * fy[h][leg][0])
        Mx = fD * fx["D"][leg][1] + fL * (vert[1] + kx * fx[h][leg][1])
        My = fD * fy["D"][leg][1] + fL * ky * fy[h][leg][1]
        return N / 4 + (abs(Mx) + abs(My)) / (4 * f)

    wind = max(corner(c, "W", kx, ky, leg) for c in LRFD_W for kx, ky in (WIND if "W" in c else [(0.0, 0.0)])
               for leg in ("windward", "leeward"))
    seismic = max(corner(c, "E", kx, ky, leg) for c in LRFD_E for kx, ky in SEISMIC for leg in ("windward", "leeward"))
    assert base["T_1_w"].to("lbf").magnitude == pytest.approx(wind, rel=2e-3)
    assert base["T_1_e"].to("lbf").magnitude == pytest.approx(seismic, rel=2e-3)
