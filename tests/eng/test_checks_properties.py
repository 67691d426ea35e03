"""Property tests (hypothesis) of the AISC 360-16 checks.

* Available strength never increases with length (E3: F_cr falls as KL/r grows; F2: M_n falls as
  L_b grows) — a property of the Specification's equations.
* Ratio grows linearly with the load (ratio = demand/capacity).
* φ·Ω relation: for the same nominal strength, available LRFD / available ASD = φ·Ω, which is
  0.90 x 1.67 (E1, F1, G1), 0.75 x 2.00 (J2, D2 rupture) and 1.00 x 1.50 (G2.1(a)) — AISC 360-16 B3.
"""

from __future__ import annotations

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from calcpad import Sheet
from calcpad.eng.checks import add_compression_check, add_fillet_weld_check, add_flexure_check, add_shear_check
from calcpad.eng.sections import get_section

W18X50 = {"A": "14.7 in^2", "Sx": "88.9 in^3", "Zx": "101 in^3", "Iy": "40.1 in^4", "ry": "1.65 in", "J": "1.24 in^4",
          "d": "18.0 in", "bf": "7.50 in", "tf": "0.570 in", "tw": "0.355 in", "h_tw": 45.2, "bf_2tf": 6.57}

SETTINGS = settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
HSS = get_section("HSS4x4x1/4")


@pytest.fixture(scope="module")
def col_sheet():
    sh = Sheet("col", method="LRFD")
    add_compression_check(sh, HSS, P="10 kip", L="5 ft", F_y="46 ksi")
    return sh


@pytest.fixture(scope="module")
def beam_sheet():
    sh = Sheet("beam", method="ASD")
    add_flexure_check(sh, W18X50, kind="i_shape", M="50 kip*ft", L_b="5 ft", F_y="50 ksi")
    return sh


@SETTINGS
@given(st.floats(1.0, 25.0), st.floats(0.1, 5.0))
def test_compression_capacity_never_increases_with_length(col_sheet, l1, dl):
    col_sheet.set(L=f"{l1} ft")
    a = col_sheet["P_c"].to("kip").magnitude
    col_sheet.set(L=f"{l1 + dl} ft")
    b = col_sheet["P_c"].to("kip").magnitude
    assert b <= a * (1 + 1e-12)


@SETTINGS
@given(st.floats(1.0, 40.0), st.floats(0.1, 10.0))
def test_flexure_capacity_never_increases_with_unbraced_length(beam_sheet, l1, dl):
    beam_sheet.set(L_b=f"{l1} ft")
    a = beam_sheet["M_c"].to("kip*ft").magnitude
    beam_sheet.set(L_b=f"{l1 + dl} ft")
    b = beam_sheet["M_c"].to("kip*ft").magnitude
    assert b <= a * (1 + 1e-12)


@SETTINGS
@given(st.floats(0.5, 500.0), st.floats(1.01, 4.0))
def test_ratio_monotone_in_load(col_sheet, p, k):
    col_sheet.set(L="8 ft", P_r=f"{p} kip")
    r1 = col_sheet.summary()[0].ratio
    col_sheet.set(P_r=f"{p * k} kip")
    r2 = col_sheet.summary()[0].ratio
    assert r2 > r1
    assert r2 / r1 == pytest.approx(k, rel=1e-9)


def _both(build):
    out = []
    for m in ("ASD", "LRFD"):
        sh = Sheet("m", method=m)
        build(sh)
        out.append(sh)
    return out


@pytest.mark.parametrize(
    ("build", "name", "phi_omega"),
    [
        (lambda sh: add_compression_check(sh, HSS, P="1 kip", L="9 ft", F_y="46 ksi"), "P_c", 0.90 * 1.67),
        (lambda sh: add_flexure_check(sh, HSS, M="1 kip*ft", F_y="46 ksi"), "M_c", 0.90 * 1.67),
        (lambda sh: add_shear_check(sh, HSS, V="1 kip", F_y="46 ksi"), "V_c", 0.90 * 1.67),
        (lambda sh: add_shear_check(sh, W18X50, kind="i_shape", V="1 kip", F_y="50 ksi"), "V_c", 1.00 * 1.50),
        (lambda sh: add_fillet_weld_check(sh, R="1 kip", w="0.25 in", L="4 in", t_p="0.5 in"), "R_c", 0.75 * 2.00),
    ],
)
def test_lrfd_over_asd_is_phi_times_omega(build, name, phi_omega):
    asd, lrfd = _both(build)
    assert lrfd[name].magnitude / asd[name].to(lrfd[name].units).magnitude == pytest.approx(phi_omega, rel=1e-12)
