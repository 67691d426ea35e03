"""Torsion of HSS and the H3.2 interaction, AISC 360-16 H3.

Oracles: independent arithmetic of AISC 360-16 Eqs. H3-1, H3-2a/b, H3-3..H3-5, H3-6 and the
torsional constants: rectangular by the H3.1 User Note (2(B - t)(H - t)t - 4.5(4 - pi)t^3); round
by the elastic C = 2J/D with J = pi/32 (D^4 - D_i^4) (common practice), the rule of the AISC
Shapes Database v16.0 round HSS table (HSS4.000x0.250: J 9.82 in^4, C 4.91 in^3 = 2*9.82/4). The
H3.1 User Note's thin-wall pi*(D - t)^2*t/2 (Bredt-Batho, C = 2*A_0*t) is larger, so not used.
"""

from __future__ import annotations

import math

import pytest

from calcpad import Sheet
from calcpad.core.errors import CalcpadError, NotCoveredError
from calcpad.eng.checks import add_torsion_check, add_torsion_interaction_check, check_member
from calcpad.eng.sections import RectTube, RoundTube, get_section

E = 29000.0
REL = 1e-9


def _chosen(sh: Sheet, name: str) -> str:
    """Label of the case a branch took."""
    b = next(s for s in sh.evaluate().steps if getattr(s, "name", "") == name)
    return b.cases[b.chosen].label


def _kipin(sh: Sheet, name: str) -> float:
    return float(sh[name].to("kip*in").magnitude)


@pytest.mark.parametrize(("D", "t", "length_in"), [(6.625, 0.26, 96.0), (10.0, 0.10, 600.0), (20.0, 0.12, 60.0)])
def test_round_hss_h3_1(D, t, length_in):
    tube = RoundTube(D, t)
    sh = Sheet("round", method="LRFD")
    add_torsion_check(sh, tube, T="1 kip*ft", L=f"{length_in} in", F_y="42 ksi")
    c = 2 * (math.pi / 32 * (D**4 - (D - 2 * t) ** 4)) / D  # C = 2J/D, as the AISC v16 table computes it
    assert c < math.pi * (D - t) ** 2 * t / 2  # the User Note's thin-wall value is the larger one
    dt = D / t
    fa = 1.23 * E / (math.sqrt(length_in / D) * dt**1.25)  # Eq. H3-2a
    fb = 0.60 * E / dt**1.5  # Eq. H3-2b
    fcr = min(max(fa, fb), 0.6 * 42.0)
    assert _kipin(sh, "T_n_tor") == pytest.approx(fcr * c, rel=REL)
    assert _kipin(sh, "T_c_tor") == pytest.approx(0.9 * fcr * c, rel=REL)


@pytest.mark.parametrize(("H", "B", "t"), [(4.0, 4.0, 0.25), (8.0, 4.0, 0.12), (16.0, 4.0, 0.08)])
def test_rect_hss_h3_1_branches(H, B, t):
    tube = RectTube(H, B, t)
    sh = Sheet("rect", method="ASD")
    add_torsion_check(sh, tube, T="1 kip*ft", F_y="50 ksi")
    ht = max(tube.props.ratios["h/t"], tube.props.ratios["b/t"])
    root = math.sqrt(E / 50.0)
    if ht <= 2.45 * root:
        fcr = 0.6 * 50.0  # Eq. H3-3
    elif ht <= 3.07 * root:
        fcr = 0.6 * 50.0 * 2.45 * root / ht  # Eq. H3-4
    else:
        fcr = 0.458 * math.pi**2 * E / ht**2  # Eq. H3-5
    c = 2 * (B - t) * (H - t) * t - 4.5 * (4 - math.pi) * t**3
    assert _kipin(sh, "T_n_tor") == pytest.approx(fcr * c, rel=REL)
    assert _kipin(sh, "T_c_tor") == pytest.approx(fcr * c / 1.67, rel=REL)


def test_rect_branches_are_all_reached():
    seen = set()
    for H, B, t in [(4.0, 4.0, 0.25), (8.0, 4.0, 0.12), (16.0, 4.0, 0.08)]:
        sh = Sheet("b")
        add_torsion_check(sh, RectTube(H, B, t), T="1 kip*ft", F_y="50 ksi")
        seen.add(_chosen(sh, "F_cr_T"))
    assert len(seen) == 3


@pytest.mark.parametrize(("T", "P", "expected_form"), [("0.5 kip*ft", "30 kip", "H1-1a"), ("0.5 kip*ft", "2 kip", "H1-1b"),
                                                       ("6 kip*ft", "10 kip", "H3-6")])
def test_h3_2_interaction_forms(T, P, expected_form):
    sh = Sheet("i", method="LRFD")
    add_torsion_interaction_check(sh, T_r=T, T_c="10 kip*ft", P_r=P, P_c="80 kip", M_r="4 kip*ft", M_c="20 kip*ft",
                                  V_r="3 kip", V_c="40 kip")
    t, p, m, v = float(T.split()[0]) / 10, float(P.split()[0]) / 80, 4 / 20, 3 / 40
    if t <= 0.2:
        u = p + 8 / 9 * m if p >= 0.2 else p / 2 + m  # H3.2: torsion neglected, H1-1a / H1-1b
    else:
        u = (p + m) + (v + t) ** 2  # Eq. H3-6
    assert sh["U_H3"].magnitude == pytest.approx(u, rel=REL)
    assert expected_form in _chosen(sh, "U_H3")


def test_member_runner_adds_torsion_for_hss():
    sh = Sheet("m", method="ASD")
    out = check_member(sh, get_section("HSS4x4x1/4"), F_y="50 ksi", L="8 ft", P="5 kip", M_x="3 kip*ft", V="1 kip", T="4 kip*ft")
    assert {"torsion", "torsion interaction"} <= set(out.keys)
    u = (sh["u_P"] + sh["u_M"]) + (sh["u_V"] + sh["u_T"]) ** 2
    assert sh["u_T"].magnitude > 0.2
    assert sh["U_H3"].magnitude == pytest.approx(float(u.magnitude), rel=REL)


def test_torsion_of_open_sections_not_covered():
    with pytest.raises(NotCoveredError, match="open sections"):
        add_torsion_check(Sheet("x"), get_section("W8x18"), T="1 kip*ft", F_y="50 ksi")
    with pytest.raises(NotCoveredError) as err:
        check_member(Sheet("x"), get_section("L3x3x1/4"), F_y="36 ksi", L="4 ft", T="1 kip*ft")
    assert err.value.field == "T"


def test_half_given_pair_is_an_input_error_before_writing():
    sh = Sheet("x")
    with pytest.raises(CalcpadError) as err:
        add_torsion_interaction_check(sh, T_r="1 kip*ft", T_c="5 kip*ft", M_r="2 kip*ft")
    assert err.value.field == "M_r / M_c"
    assert sh.steps == []


def test_tension_and_torsion_share_a_sheet():
    # T_r / T_c belong to the tension check; torsion writes T_r_tor / T_c_tor.
    sh = Sheet("m")
    out = check_member(sh, get_section("HSS4x4x1/4"), F_y="50 ksi", F_u="62 ksi", L="8 ft", P="-5 kip", M_x="2 kip*ft",
                       T="3 kip*ft")
    assert {"tension", "torsion", "torsion interaction"} <= set(out.keys)
    assert sh["T_r"].to("kip").magnitude == pytest.approx(5.0)
    assert sh["T_r_tor"].to("kip*ft").magnitude == pytest.approx(3.0)
