"""Section classification, AISC 360-16 Table B4.1a / B4.1b.

Sources: the limits of Table B4.1a cases 1, 3, 5, 6, 9 and B4.1b cases 10, 12, 15, 17, 19, 20
(AISC 360-16, from memory), computed by hand here; W14x90 flange is noncompact for flexure at
Fy = 50 ksi (AISC Manual 15th ed. Table 1-1 footnote, from memory).
"""

from __future__ import annotations

import math

import pytest

from calcpad import Sheet
from calcpad.eng.checks import add_classification
from calcpad.eng.sections import RoundTube, get_section

E = 29000.0


def test_w14x90_flange_noncompact_flexure_nonslender_compression():
    w = {"d": "14.0 in", "bf": "14.5 in", "tf": "0.710 in", "tw": "0.440 in", "h_tw": 25.9, "bf_2tf": 10.2}
    sh = Sheet("cls")
    add_classification(sh, w, kind="i_shape", F_y="50 ksi", mode="flexure")
    assert sh["lambda_pf"].magnitude == pytest.approx(0.38 * math.sqrt(E / 50), rel=1e-12)
    assert sh["lambda_rf"].magnitude == pytest.approx(1.0 * math.sqrt(E / 50), rel=1e-12)
    assert sh["class_f"].magnitude == 2
    assert sh["class_w"].magnitude == 1
    sh2 = Sheet("cls")
    add_classification(sh2, w, kind="i_shape", F_y="50 ksi", mode="compression")
    assert sh2["lambda_rcf"].magnitude == pytest.approx(0.56 * math.sqrt(E / 50), rel=1e-12)
    assert sh2["lambda_rcw"].magnitude == pytest.approx(1.49 * math.sqrt(E / 50), rel=1e-12)
    assert sh2["class_cf"].magnitude == 1


@pytest.mark.parametrize(("dt", "expected"), [(20.0, 1), (100.0, 2), (300.0, 3)])
def test_round_hss_flexure_classes(dt, expected):
    # Table B4.1b case 20: lambda_p = 0.07 E/Fy = 48.3, lambda_r = 0.31 E/Fy = 214 at Fy = 42 ksi.
    sh = Sheet("cls")
    add_classification(sh, RoundTube(dt * 0.1, 0.1), F_y="42 ksi")
    assert sh["lambda_pD"].magnitude == pytest.approx(0.07 * E / 42, rel=1e-12)
    assert sh["lambda_rD"].magnitude == pytest.approx(0.31 * E / 42, rel=1e-12)
    assert sh["class_D"].magnitude == expected


def test_rect_hss_limits_and_axis_swap():
    sec = get_section("HSS8x4x1/4")
    sh = Sheet("cls")
    add_classification(sh, sec, F_y="50 ksi", axis="x")
    assert sh["lambda_pf"].magnitude == pytest.approx(1.12 * math.sqrt(E / 50), rel=1e-12)
    assert sh["lambda_pw"].magnitude == pytest.approx(2.42 * math.sqrt(E / 50), rel=1e-12)
    assert sh["lambda_rw"].magnitude == pytest.approx(5.70 * math.sqrt(E / 50), rel=1e-12)
    assert sh["lambda_f"].magnitude == pytest.approx(sec.props.ratios["b/t"], rel=1e-9)
    sh_y = Sheet("cls")
    add_classification(sh_y, sec, F_y="50 ksi", axis="y")
    assert sh_y["lambda_f"].magnitude == pytest.approx(sec.props.ratios["h/t"], rel=1e-9)


def test_angle_leg_limits():
    sh = Sheet("cls")
    add_classification(sh, get_section("L4x4x1/4"), F_y="36 ksi", mode="compression")
    assert sh["lambda_rcl"].magnitude == pytest.approx(0.45 * math.sqrt(E / 36), rel=1e-12)
    assert sh["class_cl"].magnitude == 3  # b/t = 16 > 12.8
