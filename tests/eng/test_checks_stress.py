"""Yield-based stress checks (common practice elastic formulas), checked by hand arithmetic.

Tube: NPS 1-1/2 Sch 40, 1.900 in OD x 0.145 in wall (ASME B36.10M, from memory); I = π/64·(D_o⁴−D_i⁴),
σ = M·c/I, P/A, τ_max = 2V/A (thin-wall round tube), τ = V·Q/(I·b), τ_t = T·r/J, von Mises
σ_vm = √(σ²+3τ²), shear yield F_y/√3 — all common practice. A36 F_y = 36 ksi (common practice).
"""

from __future__ import annotations

import math

import pytest

from calcpad import Sheet
from calcpad.eng.checks import add_stress_check
from calcpad.eng.sections import RoundTube, get_section

REL = 1e-9


def test_tube_bending_axial_shear_torsion_by_hand():
    Do, t = 1.900, 0.145
    Di = Do - 2 * t
    A = math.pi / 4 * (Do**2 - Di**2)
    I = math.pi / 64 * (Do**4 - Di**4)
    J = 2 * I
    P, M, V, T = 1.2, 3.5, 0.4, 0.8  # kip, kip*in, kip, kip*in
    sh = Sheet("stress")
    keys = add_stress_check(sh, RoundTube(Do, t), F_y="36 ksi", P=f"{P} kip", M=f"{M} kip*in", V=f"{V} kip",
                            T=f"{T} kip*in", required_fs=1.67)
    sigma = P / A + M * (Do / 2) / I
    tau = 2 * V / A + T * (Do / 2) / J
    vm = math.sqrt(sigma**2 + 3 * tau**2)
    assert sh["sigma"].to("ksi").magnitude == pytest.approx(sigma, rel=1e-6)  # J of the tube from the sections package
    assert sh["tau"].to("ksi").magnitude == pytest.approx(tau, rel=1e-6)
    assert sh["sigma_vm"].to("ksi").magnitude == pytest.approx(vm, rel=1e-6)
    checks = {c.key: c for c in sh.summary()}
    assert checks[keys[0]].fs == pytest.approx(36 / sigma, rel=1e-6)
    assert checks[keys[1]].fs == pytest.approx(36 / math.sqrt(3) / tau, rel=1e-6)
    assert checks[keys[2]].fs == pytest.approx(36 / vm, rel=1e-6)


def test_required_fs_governs_status():
    # FS = F_y/sigma = 36/20 = 1.8: OK against 1.67, NG against 2.0.
    for req, status in ((1.67, "OK"), (2.0, "NG")):
        sh = Sheet("fs")
        add_stress_check(sh, F_y="36 ksi", M="20 kip*in", I="1 in^4", c="1 in", required_fs=req)
        c = sh.summary()[0]
        assert c.fs == pytest.approx(1.8, rel=REL)
        assert c.status == status


def test_general_shear_vq_it_rect_hss_by_hand():
    sec = get_section("HSS6x6x1/4")
    H, B, t = sec.H, sec.B, sec.t
    Q = B * H**2 / 8 - (B - 2 * t) * (H - 2 * t) ** 2 / 8  # square-corner half-section, common practice
    sh = Sheet("vq")
    add_stress_check(sh, sec, F_y="46 ksi", V="10 kip")
    assert sh["tau"].to("ksi").magnitude == pytest.approx(10 * Q / (sec.props.Ix * 2 * t), rel=1e-9)


def test_plain_values_without_section():
    sh = Sheet("plain")
    add_stress_check(sh, F_y="50 ksi", P="-20 kip", A="4 in^2")
    assert sh["sigma"].to("ksi").magnitude == pytest.approx(5.0, rel=REL)  # magnitude of P/A


def test_section_props_record_accepted_with_kind():
    # A SectionProps record (here of a tube) with kind= gives the same stress as the shape itself.
    tube = RoundTube(2.375, 0.154)
    a, b = Sheet("a"), Sheet("b")
    add_stress_check(a, tube, F_y="35 ksi", M="5 kip*in")
    add_stress_check(b, tube.props, kind="round_hss", F_y="35 ksi", M="5 kip*in", c="1.1875 in")
    assert b["sigma"].to("ksi").magnitude == pytest.approx(a["sigma"].to("ksi").magnitude, rel=1e-12)
