"""Fillet and stitch welds, AISC 360-16 J2.

Sources:
* AISC Manual 15th ed. Part 8, Eqs. 8-2a/8-2b: E70 fillet weld, longitudinal load,
  φ·r_n = 1.392 kip/in and r_n/Ω = 0.928 kip/in per sixteenth of an inch of leg (from memory).
* AISC 360-16 Eq. J2-5: transverse load factor 1 + 0.50 sin^1.5(90°) = 1.5.
* AISC 360-16 Table J2.4 minimum sizes 1/8, 3/16, 1/4, 5/16 in (from memory); J2.2b maximum
  size t or t - 1/16 in; minimum length 4w; intermittent segments at least 4w and 1-1/2 in.
* AISC 360-16 J4.2: base metal shear yielding R_n = 0.60·F_y·A_gv (Eq. J4-3, φ = 1.00,
  Ω = 1.50) and shear rupture R_n = 0.60·F_u·A_nv (Eq. J4-4, φ = 0.75, Ω = 2.00).
* AISC Manual 15th ed. Part 9: minimum base metal thickness to match the rupture strength of
  E70 fillets, t_min = 3.09·D/F_u for a weld on one face and 6.19·D/F_u for welds on both faces
  of the same plate (D in sixteenths of an inch; from memory).
* ASTM A36: F_y = 36 ksi, F_u = 58 ksi (from memory).
"""

from __future__ import annotations

import math

import pytest

from calcpad import Sheet
from calcpad.core.errors import CalcpadError
from calcpad.eng.checks import CheckInputError, add_fillet_weld_check, add_stitch_weld_check

TABLE_REL = 0.001  # Part 8 constants printed to 4 significant figures


@pytest.mark.parametrize(("method", "per_sixteenth"), [("LRFD", 1.392), ("ASD", 0.928)])
def test_manual_part8_per_sixteenth(method, per_sixteenth):
    sh = Sheet("weld", method=method)
    add_fillet_weld_check(sh, R="10 kip", w="0.25 in", L="10 in", t_p="0.5 in")
    assert sh["R_c"].to("kip").magnitude == pytest.approx(per_sixteenth * 4 * 10, rel=TABLE_REL)


def test_transverse_factor_1_5():
    a, b = Sheet("w0"), Sheet("w90")
    add_fillet_weld_check(a, R="10 kip", w="0.25 in", L="10 in", t_p="0.5 in", theta="0 degree")
    add_fillet_weld_check(b, R="10 kip", w="0.25 in", L="10 in", t_p="0.5 in", theta="90 degree")
    assert b["R_c"].to("kip").magnitude / a["R_c"].to("kip").magnitude == pytest.approx(1.5, rel=1e-12)


@pytest.mark.parametrize(("t", "wmin"), [("0.1875 in", 0.125), ("0.25 in", 0.125), ("0.375 in", 0.1875),
                                        ("0.625 in", 0.25), ("1.0 in", 0.3125)])
def test_table_j2_4_minimum_size(t, wmin):
    sh = Sheet("wmin")
    add_fillet_weld_check(sh, R="1 kip", w="0.3125 in", L="4 in", t_p=t, t_e="1 in")
    assert sh["w_min"].to("in").magnitude == pytest.approx(wmin, rel=1e-12)


@pytest.mark.parametrize(("t", "wmax"), [("0.1875 in", 0.1875), ("0.5 in", 0.4375)])
def test_j2_2b_maximum_size(t, wmax):
    sh = Sheet("wmax")
    add_fillet_weld_check(sh, R="1 kip", w="0.125 in", L="4 in", t_p=t)
    assert sh["w_max"].to("in").magnitude == pytest.approx(wmax, rel=1e-12)


def test_oversize_weld_is_ng():
    sh = Sheet("ng")
    add_fillet_weld_check(sh, R="1 kip", w="0.25 in", L="4 in", t_p="0.1875 in")
    status = {c.key: c.status for c in sh.summary()}
    assert status["ratio_wmax"] == "NG"


def test_end_loaded_beta_eq_j2_1():
    # L = 150 w: beta = 1.2 - 0.002*150 = 0.9 (AISC 360-16 Eq. J2-1).
    sh = Sheet("beta")
    add_fillet_weld_check(sh, R="1 kip", w="0.25 in", L="37.5 in", t_p="0.5 in", end_loaded=True)
    assert sh["L_e"].to("in").magnitude == pytest.approx(0.9 * 37.5, rel=1e-12)


def test_stitch_weld_shear_flow_by_hand():
    # q = V Q / I; capacity n * (r_n/Omega) * L_seg / s with r_n/Omega = 0.928 kip/in per sixteenth (Part 8).
    sh = Sheet("stitch")
    add_stitch_weld_check(sh, V="6 kip", Q="4 in^3", I="50 in^4", w="0.1875 in", L_seg="2 in", s="6 in", n=2)
    assert sh["q"].to("kip/in").magnitude == pytest.approx(6 * 4 / 50, rel=1e-12)
    assert sh["q_c"].to("kip/in").magnitude == pytest.approx(2 * 0.928 * 3 * 2 / 6, rel=TABLE_REL)
    assert sh["L_segmin"].to("in").magnitude == pytest.approx(1.5, rel=1e-12)


# ------------------------------------------------------------ base metal along the weld (J4.2)

def _kip(sh, name):
    return sh[name].to("kip").magnitude


def _notes(sh):
    return [r.text for r in sh.evaluate().steps if getattr(r, "kind", "") == "note"]


@pytest.mark.parametrize(("method", "phi_y", "omega_y", "phi_r", "omega_r"),
                         [("LRFD", 1.00, None, 0.75, None), ("ASD", None, 1.50, None, 2.00)])
def test_base_metal_eq_j4_3_j4_4_by_hand(method, phi_y, omega_y, phi_r, omega_r):
    # AISC 360-16 Eq. J4-3/J4-4 with A_gv = A_nv = n*t*L (welded, no holes).
    n, t, L, Fy, Fu, R = 2, 0.375, 8.0, 36.0, 58.0, 20.0
    sh = Sheet("bm", method=method)
    keys = add_fillet_weld_check(sh, R=f"{R} kip", w="0.25 in", L=f"{L} in", t_p="0.375 in", n=n,
                                 base_t=f"{t} in", base_Fy=f"{Fy} ksi", base_Fu=f"{Fu} ksi")
    assert "ratio_gv" in keys and "ratio_nv" in keys
    A = n * t * L
    yield_n, rupture_n = 0.60 * Fy * A, 0.60 * Fu * A
    yield_c = yield_n * phi_y if phi_y else yield_n / omega_y
    rupture_c = rupture_n * phi_r if phi_r else rupture_n / omega_r
    assert sh["A_gv"].to("in^2").magnitude == pytest.approx(A, rel=1e-12)
    assert sh["A_nv"].to("in^2").magnitude == pytest.approx(A, rel=1e-12)
    assert _kip(sh, "R_n_gv") == pytest.approx(yield_n, rel=1e-12)
    assert _kip(sh, "R_n_nv") == pytest.approx(rupture_n, rel=1e-12)
    assert _kip(sh, "R_c_gv") == pytest.approx(yield_c, rel=1e-12)
    assert _kip(sh, "R_c_nv") == pytest.approx(rupture_c, rel=1e-12)
    ratios = {c.key: c.ratio for c in sh.summary()}
    assert ratios["ratio_gv"] == pytest.approx(R / yield_c, rel=1e-9)
    assert ratios["ratio_nv"] == pytest.approx(R / rupture_c, rel=1e-9)
    refs = {c.key: c.ref for c in sh.summary()}
    assert "J4-3" in refs["ratio_gv"] and "J4-4" in refs["ratio_nv"]


@pytest.mark.parametrize("name", ["R_c_gv", "R_c_nv"])
def test_base_metal_lrfd_over_asd_is_1_5(name):
    # AISC 360-16 J4.2: phi*Omega = 1.00*1.50 (Eq. J4-3) = 0.75*2.00 (Eq. J4-4) = 1.5.
    out = {}
    for method in ("LRFD", "ASD"):
        sh = Sheet("bm", method=method)
        add_fillet_weld_check(sh, R="5 kip", w="0.25 in", L="6 in", t_p="0.25 in", base_t="0.25 in", base_material="A36")
        out[method] = _kip(sh, name)
    assert out["LRFD"] / out["ASD"] == pytest.approx(1.5, rel=1e-12)


def _weld_vs_rupture(t, *, n=1, planes=None, w=0.3125, Fu=58.0):
    sh = Sheet("gov", method="LRFD")
    add_fillet_weld_check(sh, R="10 kip", w=f"{w} in", L="6 in", t_p=f"{t} in", t_e="1 in", n=n,
                          base_t=f"{t} in", base_Fy="36 ksi", base_Fu=f"{Fu} ksi", base_planes=planes)
    return _kip(sh, "R_c"), _kip(sh, "R_c_nv"), sh


@pytest.mark.parametrize("factor", [0.6, 0.9])
def test_thin_plate_base_metal_rupture_governs(factor):
    # Common practice: with equal phi (0.75) for weld and base-metal rupture, the base metal
    # governs when t < 0.707*w*F_nw/(0.6*F_u) per weld and shear plane.
    w, Fu, F_nw = 0.3125, 58.0, 0.60 * 70.0
    t_crit = 0.707 * w * F_nw / (0.6 * Fu)
    weld, rupture, sh = _weld_vs_rupture(factor * t_crit, w=w, Fu=Fu)
    assert rupture < weld
    assert rupture / weld == pytest.approx(factor, rel=1e-9)
    ratios = {c.key: c.ratio for c in sh.summary()}
    assert ratios["ratio_nv"] > ratios["ratio_w"]


def test_thick_plate_weld_governs_over_base_metal_rupture():
    w, Fu, F_nw = 0.3125, 58.0, 0.60 * 70.0
    t_crit = 0.707 * w * F_nw / (0.6 * Fu)
    weld, rupture, _ = _weld_vs_rupture(1.5 * t_crit, w=w, Fu=Fu)
    assert rupture > weld


@pytest.mark.parametrize(("n", "planes", "coef"), [(1, None, 3.09), (2, 1, 6.19)])
def test_manual_part9_minimum_thickness(n, planes, coef):
    # AISC Manual 15th ed. Part 9 (from memory): at t = 3.09 D/F_u (one weld) or 6.19 D/F_u (welds on
    # both faces of one plate: n = 2 welds, one shear plane) base-metal rupture equals the weld strength.
    D, Fu = 5, 58.0
    t = coef * D / Fu
    weld, rupture, _ = _weld_vs_rupture(t, n=n, planes=planes, w=D / 16, Fu=Fu)
    assert rupture / weld == pytest.approx(1.0, rel=0.002)  # Part 9 coefficients given to 3 figures


def test_base_metal_note_replaces_separately_note():
    plain, with_bm = Sheet("a"), Sheet("b")
    add_fillet_weld_check(plain, R="5 kip", w="0.25 in", L="6 in", t_p="0.25 in")
    add_fillet_weld_check(with_bm, R="5 kip", w="0.25 in", L="6 in", t_p="0.25 in", base_t="0.25 in", base_material="A36")
    assert any("checked separately" in n and "J4" in n for n in _notes(plain))
    assert "ratio_nv" not in {c.key for c in plain.summary()}
    notes = _notes(with_bm)
    assert not any(n.startswith("Base metal at the weld") for n in notes)
    assert any("J4-3" in n and "J4-4" in n for n in notes)


def test_base_material_from_catalog_matches_values():
    # ASTM A36: F_y = 36 ksi, F_u = 58 ksi (from memory).
    a, b = Sheet("a"), Sheet("b")
    add_fillet_weld_check(a, R="5 kip", w="0.25 in", L="6 in", t_p="0.25 in", base_t="0.25 in", base_material="A36")
    add_fillet_weld_check(b, R="5 kip", w="0.25 in", L="6 in", t_p="0.25 in", base_t="0.25 in", base_Fy="36 ksi", base_Fu="58 ksi")
    for name in ("R_c_gv", "R_c_nv"):
        assert _kip(a, name) == pytest.approx(_kip(b, name), rel=1e-12)


def test_base_thickness_linked_to_sheet_value_stays_live():
    sh = Sheet("link", method="LRFD")
    sh.given("t_pl", "0.25 in", "Plate thickness")
    add_fillet_weld_check(sh, R="5 kip", w="0.25 in", L="6 in", t_p="t_pl", base_t="t_pl", base_material="A36")
    before = _kip(sh, "R_c_nv")
    sh.set(t_pl="0.5 in")
    assert _kip(sh, "R_c_nv") == pytest.approx(2 * before, rel=1e-12)


def test_base_metal_with_suffix():
    sh = Sheet("sfx")
    keys = add_fillet_weld_check(sh, R="5 kip", w="0.25 in", L="6 in", t_p="0.25 in", base_t="0.25 in",
                                 base_material="A36", suffix="2")
    assert {"ratio_gv_2", "ratio_nv_2"} <= set(keys)
    assert "F_u_bm_2" in sh


@pytest.mark.parametrize(
    ("kwargs", "field", "words"),
    [
        ({"base_t": "-0.25 in", "base_material": "A36"}, "base_t", "positive"),
        ({"base_t": "0 in", "base_material": "A36"}, "base_t", "positive"),
        ({"base_t": "0.25 in", "base_Fy": "36 ksi"}, "base_Fu", "tensile strength"),
        ({"base_t": "0.25 in", "base_Fu": "58 ksi"}, "base_Fy", "yield stress"),
        ({"base_Fu": "58 ksi"}, "base_t", "thickness"),
        ({"base_material": "A36"}, "base_t", "thickness"),
        ({"base_t": "0.25 in", "base_material": "A3x"}, "base_material", "catalog"),
        ({"base_t": "0.25 in", "base_Fy": "58 ksi", "base_Fu": "36 ksi"}, "base_Fu", "at least the yield"),
        ({"base_t": "0.25 in", "base_Fy": "-36 ksi", "base_Fu": "58 ksi"}, "base_Fy", "positive"),
        ({"base_t": "0.25 in", "base_material": "A36", "base_planes": 0}, "base_planes", "whole number"),
    ],
)
def test_base_metal_bad_input_names_field(kwargs, field, words):
    sh = Sheet("bad")
    with pytest.raises(CheckInputError) as err:
        add_fillet_weld_check(sh, R="5 kip", w="0.25 in", L="6 in", t_p="0.25 in", **kwargs)
    assert err.value.field == field
    assert "expected" in str(err.value) and words in str(err.value)
    assert sh.order() == []  # rejected before anything is written


def test_base_thickness_wrong_unit_names_field():
    with pytest.raises(CalcpadError, match=r"^base_t"):
        add_fillet_weld_check(Sheet("u"), R="5 kip", w="0.25 in", L="6 in", t_p="0.25 in", base_t="0.25 kip",
                              base_material="A36")


# ----------------------------------------------------------------- stitch welds of a repair (issue 12)
def _stitch(w="3/16 in", s="12 in", method="ASD", **kw):
    sh = Sheet("stitch", method=method)
    add_stitch_weld_check(sh, V="0.95 kip", Q="1.2 in^3", I="6.0 in^4", w=w, L_seg="2 in", s=s, n=2, **kw)
    return sh, {c.key: c for c in sh.evaluate().checks}


def test_stitch_weld_on_a_quarter_inch_angle_edge_is_limited_to_3_16():
    """AISC 360-16 J2.2b(b): along an edge 1/4 in or thicker, w <= t - 1/16 in (1/4 in leg: 3/16 in)."""
    _, ok = _stitch("3/16 in", t_e="1/4 in", t_p="3/16 in")
    _, ng = _stitch("5/16 in", t_e="1/4 in", t_p="3/16 in")
    assert ok["ratio_wmax"].ok and ok["ratio_wmax"].ratio == pytest.approx(1.0)
    assert not ng["ratio_wmax"].ok and ng["ratio_wmax"].ratio == pytest.approx((5 / 16) / (3 / 16))
    assert ok["ratio_wmin"].ratio == pytest.approx(0.125 / 0.1875)  # Table J2.4: t <= 1/4 in -> 1/8 in


def test_stitch_base_metal_of_both_members_j4_2():
    """Per weld line and unit length: 0.60 F_y t / 1.50 (J4-3) and 0.60 F_u t / 2.00 (J4-4), ASD."""
    base = [{"label": "leg", "t": "0.174 in", "F_y": "50 ksi", "F_u": "62 ksi"},
            {"label": "angle", "t": "0.25 in", "F_y": "36 ksi", "F_u": "58 ksi"}]
    _, res = _stitch(base=base)
    q = 0.95 * 1.2 / 6.0
    for i, (t, fy, fu) in enumerate([(0.174, 50, 62), (0.25, 36, 58)], start=1):
        per = min(0.6 * fy * t / 1.5, 0.6 * fu * t / 2.0)
        assert res[f"ratio_bm{i}"].ratio == pytest.approx(q / (2 * per * 2 / 12), rel=1e-9)
    weld = 2 * 0.707 * 0.1875 * 0.6 * 70 / 2.0 * 2 / 12  # J2-4, J2-5 with Ω = 2.00
    assert res["ratio_q"].ratio == pytest.approx(q / weld, rel=1e-9)


def test_stitch_pitch_of_a_built_up_compression_member_e6_2():
    """E6.2(b): pitch <= 0.75 t sqrt(E/F_y) <= 12 in; 1/4 in A36 angle: 5.32 in."""
    limit = 0.75 * 0.25 * math.sqrt(29000 / 36)
    _, res = _stitch(s="12 in", compression={"t": "0.25 in", "F_y": "36 ksi"})
    assert res["ratio_smax"].ratio == pytest.approx(12 / limit, rel=1e-9)
    assert not res["ratio_smax"].ok
    _, res = _stitch(s="5 in", compression={"t": "0.25 in", "F_y": "36 ksi"})
    assert res["ratio_smax"].ok


def test_stitch_shear_flow_from_a_given_q_over_i() -> None:
    # q = V k_Q with k_Q = Q/I given directly (the worst-direction factor of an unsymmetric section);
    # q = 6 kip x 0.08 /in = 0.48 kip/in, by hand; pattern 2 x 0.707 x 3/16 x 42 ksi / 2 x 2/6 (AISC 360-16 Eq. J2-4, J2-5)
    sh = Sheet("k_Q", method="ASD")
    add_stitch_weld_check(sh, V="6 kip", Q_over_I="0.08 in^-1", w="0.1875 in", L_seg="2 in", s="6 in", n=2)
    assert sh["q"].to("kip/in").magnitude == pytest.approx(0.48)
    assert sh["q_c"].to("kip/in").magnitude == pytest.approx(2 * 0.707 * 0.1875 * 42 / 2 * 2 / 6)
    for bad in ({"Q": "4 in^3", "I": "50 in^4", "Q_over_I": "0.08 1/in"}, {"Q": "4 in^3"}, {}):
        with pytest.raises(CheckInputError):
            add_stitch_weld_check(Sheet("bad"), V="6 kip", w="0.1875 in", L_seg="2 in", s="6 in", **bad)
