"""Anchorage to concrete, ACI 318-19 Chapter 17 (cast-in anchors), equations from memory.

Oracles:
* The standard's equations written out here in plain floats (lb, in, psi): 17.6.1.2 (N_sa),
  R17.6.1.2 (A_se), 17.7.1.2b and 17.7.1.2.1 (V_sa on a grout pad), 17.6.2 (breakout in
  tension, Eqs. 17.6.2.1b, 17.6.2.1.4, 17.6.2.2.1, 17.6.2.2.3, 17.6.2.4.1), 17.6.3 (pullout),
  17.6.4 (side-face blowout), 17.7.2 (breakout in shear), 17.7.3 (pryout), 17.8 (interaction),
  Table 17.5.3 (φ), 17.10.5.4 (0.75 with earthquake).
* Projected areas A_Nc and A_Vc by an independent polygon computation with shapely (the union
  of each anchor's 3h_ef square, or 3c_a1 × 1.5c_a1 rectangle on the side face, clipped to
  the concrete), not by the min/max formulas the check writes.
* ASME B1.1 UNC threads and ASME B18.2.2 heavy hex nut width 1.5d + 1/8 in (from memory).
"""

from __future__ import annotations

import math

import pytest
from shapely.geometry import box
from shapely.ops import unary_union

from calcpad import Sheet
from calcpad.core.errors import CalcpadError
from calcpad.eng.checks import CheckInputError, CheckNotCoveredError
from calcpad.eng.checks.anchorage import add_anchorage_check

REL = 1e-6


def _grid(n_x, n_y, s_x, s_y):
    """Anchor coordinates: x from 0 (the c_x1 side) toward the shear, y from 0."""
    return [(i * s_x, j * s_y) for i in range(n_x) for j in range(n_y)]


def _area_tension(anchors, h, concrete):
    """A_Nc: union of 3h x 3h squares around the anchors, clipped to the concrete (shapely)."""
    squares = [box(x - 1.5 * h, y - 1.5 * h, x + 1.5 * h, y + 1.5 * h) for x, y in anchors]
    return unary_union(squares).intersection(concrete).area


def _area_shear(ys, c1, h_a, y_lo, y_hi):
    """A_Vc on the side face: union of 3c_a1 wide x 1.5c_a1 deep rectangles, clipped to the face."""
    rects = [box(y - 1.5 * c1, 0.0, y + 1.5 * c1, 1.5 * c1) for y in ys]
    return unary_union(rects).intersection(box(y_lo, 0.0, y_hi, h_a)).area


def _aci(*, d, h_ef, fc, cx1, cx2, cy1, cy2, h_a, n_x, n_y, s_x, s_y, rows, N, V, cracked=True, fya=36.0, futa=58.0,
         hooked=False, e_h=None, cond="B", grout=True, seismic=False, omega=1.0, lam=1.0):
    """ACI 318-19 Chapter 17 by hand (lb, in, psi). Returns a dict of values (kip where a force)."""
    tpi = {0.5: 13, 0.625: 11, 0.75: 10, 0.875: 9, 1.0: 8, 1.25: 7}[d]  # ASME B1.1
    Ase = math.pi / 4 * (d - 0.9743 / tpi) ** 2  # R17.6.1.2
    futa_e = min(futa, 1.9 * fya, 125.0)  # 17.6.1.2
    Nsa = Ase * futa_e  # kip
    Vsa = (0.8 if grout else 1.0) * 0.6 * Ase * futa_e  # 17.7.1.2b, 17.7.1.2.1
    phi_cb = 0.75 if cond == "A" else 0.70  # Table 17.5.3(b)
    k_s = 0.75 if seismic else 1.0  # 17.10.5.4
    N = N * (omega if seismic else 1.0)
    V = V * (omega if seismic else 1.0)
    # tension anchors: the first `rows` rows from the c_x1 edge
    t_anchors = _grid(rows, n_y, s_x, s_y)
    x_far = (n_x - 1) * s_x
    concrete = box(-cx1, -cy1, x_far + cx2, (n_y - 1) * s_y + cy2)
    edges_t = [cx1, cx2 + (n_x - rows) * s_x, cy1, cy2]
    near = [c for c in edges_t if c < 1.5 * h_ef]
    h = h_ef
    if len(near) >= 3:  # 17.6.2.1.2
        s_max = max((rows - 1) * s_x, (n_y - 1) * s_y)
        h = min(h_ef, max(max(near) / 1.5, s_max / 3))
    A_Nco = 9 * h**2
    A_Nc = _area_tension(t_anchors, h, concrete)
    cmin = min(edges_t)
    psi_ed = 1.0 if cmin >= 1.5 * h else 0.7 + 0.3 * cmin / (1.5 * h)
    psi_c = 1.0 if cracked else 1.25
    if not hooked and 11 <= h <= 25:
        Nb = 16 * lam * math.sqrt(fc) * h ** (5 / 3) / 1000  # Eq. 17.6.2.2.3
    else:
        Nb = 24 * lam * math.sqrt(fc) * h**1.5 / 1000  # Eq. 17.6.2.2.1
    Ncbg = A_Nc / A_Nco * psi_ed * psi_c * Nb
    n_t = rows * n_y
    if hooked:
        Np = 0.9 * fc * min(e_h, 4.5 * d) * d / 1000  # Eq. 17.6.3.2.2b
        A_brg = None
    else:
        F = 1.5 * d + 0.125  # heavy hex nut (ASME B18.2.2)
        A_brg = math.sqrt(3) / 2 * F**2 - math.pi / 4 * d**2
        Np = 8 * A_brg * fc / 1000  # Eq. 17.6.3.2.2a
    Npn = (1.0 if cracked else 1.4) * Np
    # shear breakout from the front row, full shear (c_a1 = c_x2)
    c1 = cx2
    if max(cy1, cy2) < 1.5 * c1 and h_a < 1.5 * c1:  # 17.7.2.1.2: narrow, thin member
        c1 = min(c1, max(max(cy1, cy2) / 1.5, h_a / 1.5, (n_y - 1) * s_y / 3))
    A_Vco = 4.5 * c1**2
    A_Vc = _area_shear([j * s_y for j in range(n_y)], c1, h_a, -cy1, (n_y - 1) * s_y + cy2)
    ca2 = min(cy1, cy2)
    psi_edV = 1.0 if ca2 >= 1.5 * c1 else 0.7 + 0.3 * ca2 / (1.5 * c1)
    psi_cV = 1.0 if cracked else 1.4
    psi_hV = max(math.sqrt(1.5 * c1 / h_a), 1.0)
    le = min(h_ef, 8 * d)
    Vb = min(7 * (le / d) ** 0.2 * math.sqrt(d) * lam * math.sqrt(fc) * c1**1.5, 9 * lam * math.sqrt(fc) * c1**1.5) / 1000
    Vcbg = A_Vc / A_Vco * psi_edV * psi_cV * psi_hV * Vb
    # pryout: the whole group
    all_a = _grid(n_x, n_y, s_x, s_y)
    A_Ncp = _area_tension(all_a, h, concrete)
    cminp = min(cx1, cx2, cy1, cy2)
    psi_edp = 1.0 if cminp >= 1.5 * h else 0.7 + 0.3 * cminp / (1.5 * h)
    Ncpg = A_Ncp / A_Nco * psi_edp * psi_c * Nb
    Vcpg = (1.0 if h_ef < 2.5 else 2.0) * Ncpg
    ratios = {
        "Nsa": N / n_t / (0.75 * Nsa),
        "Ncb": N / (k_s * phi_cb * Ncbg),
        "Np": N / n_t / (k_s * 0.70 * Npn),
        "Vsa": V / n_y / (0.65 * Vsa),
        "Vcb": V / (phi_cb * Vcbg),
        "Vcp": V / (0.70 * Vcpg),
    }
    return {"A_se": Ase, "N_sa": Nsa, "V_sa": Vsa, "h": h, "A_Nc": A_Nc, "A_Nco": A_Nco, "N_b": Nb, "N_cbg": Ncbg, "N_pn": Npn,
            "A_brg": A_brg, "A_Vc": A_Vc, "V_b": Vb, "V_cbg": Vcbg, "N_cpg": Ncpg, "V_cpg": Vcpg, "ratios": ratios}


def _interaction(uN, uV):
    """ACI 318-19 17.8: full strength when the other ratio <= 0.2, else (uN + uV)/1.2."""
    if uV <= 0.2:
        return uN
    if uN <= 0.2:
        return uV
    return (uN + uV) / 1.2


BASE = {"d": 0.75, "h_ef": 12.0, "fc": 3000.0, "cx1": 6.0, "cx2": 6.0, "cy1": 6.0, "cy2": 6.0, "h_a": 30.0, "n_x": 2, "n_y": 2,
        "s_x": 7.5, "s_y": 7.5, "rows": 1, "N": 8.0, "V": 2.0}


def _sheet(method="LRFD", **kw):
    p = BASE | kw
    sh = Sheet("anchors", method=method)
    extra = {k: p[k] for k in ("anchor", "e_h", "cracked", "seismic", "Omega_0", "seismic_tension", "stretch_length", "load_factor",
                               "condition", "grout_pad") if k in p}
    keys = add_anchorage_check(
        sh, d_a=f"{p['d']} in", h_ef=f"{p['h_ef']} in", f_c=f"{p['fc']} psi", c_x1=f"{p['cx1']} in", c_x2=f"{p['cx2']} in",
        c_y1=f"{p['cy1']} in", c_y2=f"{p['cy2']} in", h_a=f"{p['h_a']} in", N_ua=f"{p['N']} kip", V_ua=f"{p['V']} kip",
        n_x=p["n_x"], n_y=p["n_y"], s_x=f"{p['s_x']} in", s_y=f"{p['s_y']} in", tension_rows=p["rows"], **extra)
    return sh, keys


def _hand(**kw):
    p = BASE | kw
    args = {k: p[k] for k in ("d", "h_ef", "fc", "cx1", "cx2", "cy1", "cy2", "h_a", "n_x", "n_y", "s_x", "s_y", "rows", "N", "V")}
    for k in ("cracked", "hooked", "e_h", "seismic", "omega"):
        if k in p:
            args[k] = p[k]
    return _aci(**args)


def _kip(sh, name):
    return sh[name].to("kip").magnitude


def _check_all(sh, ref):
    assert sh["A_se"].to("in^2").magnitude == pytest.approx(ref["A_se"], rel=REL)
    assert _kip(sh, "N_sa") == pytest.approx(ref["N_sa"], rel=REL)
    assert _kip(sh, "V_sa") == pytest.approx(ref["V_sa"], rel=REL)
    assert sh["h_efc"].to("in").magnitude == pytest.approx(ref["h"], rel=REL)
    assert sh["A_Nc"].to("in^2").magnitude == pytest.approx(ref["A_Nc"], rel=REL)  # shapely
    assert _kip(sh, "N_b") == pytest.approx(ref["N_b"], rel=REL)
    assert _kip(sh, "N_cbg") == pytest.approx(ref["N_cbg"], rel=REL)
    assert _kip(sh, "N_pn") == pytest.approx(ref["N_pn"], rel=REL)
    assert sh["A_Vc"].to("in^2").magnitude == pytest.approx(ref["A_Vc"], rel=REL)  # shapely
    assert _kip(sh, "V_b") == pytest.approx(ref["V_b"], rel=REL)
    assert _kip(sh, "V_cbg") == pytest.approx(ref["V_cbg"], rel=REL)
    assert _kip(sh, "N_cpg") == pytest.approx(ref["N_cpg"], rel=REL)
    assert _kip(sh, "V_cpg") == pytest.approx(ref["V_cpg"], rel=REL)
    res = {c.key: c.ratio for c in sh.evaluate().checks}
    r = ref["ratios"]
    for key, ours in (("ratio_Nsa", "Nsa"), ("ratio_Ncb", "Ncb"), ("ratio_Np", "Np"), ("ratio_Vsa", "Vsa"), ("ratio_Vcb", "Vcb"),
                      ("ratio_Vcp", "Vcp")):
        assert res[key] == pytest.approx(r[ours], rel=REL), key
    uN = max(r["Nsa"], r["Ncb"], r["Np"], res.get("ratio_Nsb", 0.0))
    uV = max(r["Vsa"], r["Vcb"], r["Vcp"])
    assert res["ratio_NV"] == pytest.approx(_interaction(uN, uV), rel=REL)  # ACI 318-19 17.8
    return res


def test_base_plate_pattern_on_a_pier_lrfd():
    """2 x 2 rods, tension on one row, a 19.5 in square pier: three edges within 1.5 h_ef (17.6.2.1.2)."""
    sh, _ = _sheet()
    ref = _hand()
    assert ref["h"] == pytest.approx(13.5 / 1.5)  # c_a,max = 6 + 7.5 = 13.5 in < 18 in -> h_ef' = 9 in
    _check_all(sh, ref)


def test_h_ef_reduction_uses_only_the_edges_within_1_5_h_ef():
    """One edge far away: c_a,max is the largest of the *influencing* edges (ACI 318-19 17.6.2.1.2)."""
    sh, _ = _sheet(cx2=40.0, rows=2, n_x=2)
    ref = _hand(cx2=40.0, rows=2, n_x=2)
    assert ref["h"] == pytest.approx(max(6.0 / 1.5, 7.5 / 3))
    _check_all(sh, ref)


def test_far_from_edges_uncracked_deep_headed_uses_eq_17_6_2_2_3():
    kw = {"cx1": 40.0, "cx2": 40.0, "cy1": 40.0, "cy2": 40.0, "h_a": 48.0, "n_x": 1, "n_y": 1, "rows": 1, "h_ef": 15.0, "cracked": False,
          "d": 1.0}
    sh, _ = _sheet(**kw)
    ref = _hand(**kw)
    assert ref["A_Nc"] == pytest.approx(ref["A_Nco"])
    assert ref["N_b"] == pytest.approx(16 * math.sqrt(3000) * 15 ** (5 / 3) / 1000)
    _check_all(sh, ref)


def test_hooked_anchor_pullout_and_no_blowout():
    kw = {"anchor": "cast-in hooked", "e_h": "3 in", "hooked": True}
    sh, keys = _sheet(**kw)
    ref = _hand(hooked=True, e_h=3.0)
    assert ref["N_pn"] == pytest.approx(0.9 * 3000 * 3.0 * 0.75 / 1000)  # Eq. 17.6.3.2.2b
    _check_all(sh, ref)
    assert not any("Nsb" in k for k in keys)


def test_hook_longer_than_4_5_d_is_limited():
    sh, _ = _sheet(anchor="cast-in hooked", e_h="6 in")
    assert _kip(sh, "N_p") == pytest.approx(0.9 * 3000 * 4.5 * 0.75 * 0.75 / 1000)


def test_side_face_blowout_near_an_edge():
    """c_a1 = 3 in < 0.4 h_ef = 4.8 in (ACI 318-19 17.6.4.1, 17.6.4.1.1, 17.6.4.2)."""
    kw = {"cy1": 3.0, "cy2": 30.0, "cx1": 20.0, "cx2": 20.0, "rows": 2, "n_x": 2, "n_y": 2, "h_a": 36.0}
    sh, keys = _sheet(**kw)
    ref = _hand(**kw)
    res = _check_all(sh, ref)
    c1, c2 = 3.0, 20.0  # nearest edge; orthogonal edge c_a2 = min(c_x1, c_x2) = 20 in >= 3 c_a1
    Nsb = 160 * c1 * math.sqrt(ref["A_brg"]) * math.sqrt(3000) / 1000 * (1 + min(max(c2 / c1, 1), 3)) / 4
    s = 7.5  # the two rows along the y edge
    Nsbg = (1 + s / (6 * c1)) * Nsb  # Eq. 17.6.4.2, s < 6 c_a1
    assert _kip(sh, "N_sbg") == pytest.approx(Nsbg, rel=REL)
    assert res["ratio_Nsb"] == pytest.approx(2 * 8.0 / 4 / (0.70 * Nsbg), rel=REL)
    assert "ratio_Nsb" in keys


def test_side_face_blowout_corner_factor():
    """c_a2 < 3 c_a1: × (1 + c_a2/c_a1)/4 (ACI 318-19 17.6.4.1.1); one anchor."""
    kw = {"cy1": 3.0, "cy2": 30.0, "cx1": 6.0, "cx2": 30.0, "n_x": 1, "n_y": 1, "rows": 1, "h_a": 36.0}
    sh, _ = _sheet(**kw)
    ref = _hand(**kw)
    Nsb = 160 * 3.0 * math.sqrt(ref["A_brg"]) * math.sqrt(3000) / 1000 * (1 + 6.0 / 3.0) / 4
    assert _kip(sh, "N_sbg") == pytest.approx(Nsb, rel=REL)
    _check_all(sh, ref)


def test_asd_sheet_multiplies_by_the_stated_load_factor():
    sh, _ = _sheet("ASD", load_factor=1.6)
    ref = _hand(N=8.0 * 1.6, V=2.0 * 1.6)
    _check_all(sh, ref)


def test_asd_without_a_load_factor_is_refused():
    with pytest.raises(CheckInputError, match="load_factor"):
        _sheet("ASD")


def test_seismic_overstrength_and_0_75_on_concrete_tension():
    sh, _ = _sheet(seismic=True, Omega_0=2.0)
    ref = _hand(seismic=True, omega=2.0)
    _check_all(sh, ref)


def test_seismic_ductile_option():
    """17.10.5.3(a): tension not amplified; steel must be weaker than 0.75 × concrete; stretch >= 8 d_a."""
    sh, _ = _sheet(seismic=True, Omega_0=2.5, seismic_tension="ductile", stretch_length="8 in")
    res = {c.key: c.ratio for c in sh.evaluate().checks}
    ref = _hand()
    assert res["ratio_lst"] == pytest.approx(8 * 0.75 / 8.0)
    conc = 0.75 * min(ref["N_cbg"] / 2, ref["N_pn"])
    assert res["ratio_duct"] == pytest.approx(ref["N_sa"] / conc, rel=REL)
    assert sh["V_ua"].to("kip").magnitude == pytest.approx(2.5 * 2.0)
    assert sh["N_ua"].to("kip").magnitude == pytest.approx(8.0)


@pytest.mark.parametrize(("N", "V", "case"), [(8.0, 0.5, 0), (0.5, 2.0, 1), (8.0, 2.0, 2)])
def test_interaction_reaches_each_case(N, V, case):
    sh, _ = _sheet(N=N, V=V)
    _check_all(sh, _hand(N=N, V=V))
    chosen = next(s for s in sh.evaluate().steps if getattr(s, "name", "") == "U_NV").chosen
    assert chosen == case


def test_loads_change_live_through_set():
    sh = Sheet("live", method="LRFD")
    sh.given("T", "8 kip")
    sh.given("H", "2 kip")
    add_anchorage_check(sh, d_a="0.75 in", h_ef="12 in", f_c="3000 psi", c_x1="6 in", c_x2="6 in", c_y1="6 in", c_y2="6 in",
                        h_a="30 in", N_ua="T", V_ua="H", s_x="7.5 in", s_y="7.5 in", tension_rows=1)
    sh.set(T="0.5 kip")
    res = {c.key: c.ratio for c in sh.evaluate().checks}
    ref = _hand(N=0.5)
    assert res["ratio_Ncb"] == pytest.approx(ref["ratios"]["Ncb"], rel=REL)
    assert res["ratio_NV"] == pytest.approx(_interaction(max(ref["ratios"][k] for k in ("Nsa", "Ncb", "Np")),
                                                         max(ref["ratios"][k] for k in ("Vsa", "Vcb", "Vcp"))), rel=REL)


@pytest.mark.parametrize(("kw", "err", "field"), [
    ({"anchor": "post-installed expansion"}, CheckNotCoveredError, "anchor"),
    ({"anchor": "adhesive"}, CheckNotCoveredError, "anchor"),
    ({"anchor_reinforcement": True}, CheckNotCoveredError, "anchor_reinforcement"),
    ({"h_ef": "26 in"}, CheckNotCoveredError, "h_ef"),
    ({"d_a": "0.8 in"}, CheckInputError, "d_a"),
    ({"f_c": "2000 psi"}, CheckInputError, "f_c"),
    ({"h_a": "10 in"}, CheckInputError, "h_a"),
    ({"tension_rows": 3}, CheckInputError, "tension_rows"),
    ({"seismic": True}, CheckInputError, "Omega_0"),
    ({"anchor": "cast-in hooked", "e_h": "1 in"}, CheckNotCoveredError, "e_h"),
    ({"grade": "A307"}, CheckInputError, "grade"),
])
def test_refusals_name_the_field(kw, err, field):
    sh = Sheet("bad", method="LRFD")
    args = {"d_a": "0.75 in", "h_ef": "12 in", "f_c": "3000 psi", "c_x1": "6 in", "c_x2": "6 in", "c_y1": "6 in", "c_y2": "6 in",
            "h_a": "30 in", "N_ua": "8 kip", "V_ua": "2 kip", "s_x": "7.5 in", "s_y": "7.5 in", "tension_rows": 1} | kw
    with pytest.raises(err) as info:
        add_anchorage_check(sh, **args)
    assert isinstance(info.value, CalcpadError)
    assert field in str(info.value)
    assert "not covered" in str(info.value) or err is CheckInputError
