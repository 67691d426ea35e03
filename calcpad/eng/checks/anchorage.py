"""Anchorage to concrete: cast-in headed or hooked anchor rods, ACI 318-19 Chapter 17.

One rectangular group of ``n_x`` × ``n_y`` anchors (spacings ``s_x``, ``s_y``) with edge
distances measured from the outermost anchors: ``c_x1`` behind the group, ``c_x2`` in the
direction of the shear, ``c_y1`` and ``c_y2`` at the sides. Tension ``N_ua`` is shared
equally by the ``tension_rows`` rows nearest the ``c_x1`` edge (all rows by default, a base
plate's tension side otherwise); shear ``V_ua`` acts toward the ``c_x2`` edge.

Limit states (strength design; on an ASD sheet the forces are multiplied by the stated
``load_factor`` first):

* steel in tension (17.6.1) and shear (17.7.1, 0.8 with a grout pad);
* concrete breakout in tension (17.6.2) from projected areas A_Nc/A_Nco with ψ_ed,N, ψ_c,N,
  ψ_cp,N and N_b (k_c = 24 for cast-in anchors, Eq. 17.6.2.2.3 for 11 in <= h_ef <= 25 in with
  headed anchors), h_ef reduced per 17.6.2.1.2 near three or more edges;
* pullout (17.6.3: 8 A_brg f'c headed, 0.9 f'c e_h d_a hooked), side-face blowout (17.6.4,
  headed anchors with c_a1 < 0.4 h_ef);
* concrete breakout in shear (17.7.2) from the row nearest the edge carrying all the shear
  (anchors in oversized holes, ACI 318-19 Fig. R17.7.2.1b, from memory), pryout (17.7.3);
* tension-shear interaction (17.8);
* with ``seismic=True`` (SDC C to F, components per ASCE 7-16 13.4): 17.10.5.4 (0.75 on the
  concrete-governed tension strengths), shear with Ω_0 (17.10.6.3(c)), tension with Ω_0
  (17.10.5.3(d)) or ductile steel (17.10.5.3(a): stretch length >= 8 d_a and the steel weaker
  than the concrete). Ω_0 multiplies the whole force given (the standard amplifies the
  earthquake part only): conservative, so give the earthquake combination's forces. The 20 %
  exemptions of 17.10.5.1 / 17.10.6.1 are not taken.

Not covered (raise :class:`CheckNotCoveredError`): post-installed mechanical anchors (their
strengths come from product qualification data, ACI 355.2), adhesive anchors (bond, 17.6.5),
anchor reinforcement (17.5.2.1), h_ef > 25 in. Geometry cases (which edge is nearest, narrow
members, side-face blowout applicable) are decided when the sheet is built; load cases
(interaction) are branches evaluated with the values.
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, CheckNotCoveredError, as_float, warn

__all__ = ["ANCHOR_GRADES", "UNC_THREADS_PER_INCH", "add_anchorage_check"]

#: ASTM F1554 grades: (f_ya, f_uta) in ksi (ASTM F1554-18, from memory); all are ductile steel
#: elements in the sense of ACI 318-19 Chapter 2 (elongation >= 14 %, reduction of area >= 30 %).
ANCHOR_GRADES: dict[str, tuple[float, float]] = {
    "F1554 Gr 36": (36.0, 58.0),
    "F1554 Gr 55": (55.0, 75.0),
    "F1554 Gr 105": (105.0, 125.0),
}

#: Unified coarse threads per inch by nominal diameter in inches (ASME B1.1, from memory).
UNC_THREADS_PER_INCH: dict[float, float] = {
    0.5: 13, 0.625: 11, 0.75: 10, 0.875: 9, 1.0: 8, 1.125: 7, 1.25: 7, 1.375: 6, 1.5: 6,
    1.75: 5, 2.0: 4.5, 2.25: 4.5, 2.5: 4, 2.75: 4, 3.0: 4,
}

_REF = "ACI 318-19"
_COVERED = ("cast-in headed", "cast-in hooked")


def add_anchorage_check(
    sh: Sheet,
    *,
    d_a: Any,
    h_ef: Any,
    f_c: Any,
    c_x1: Any,
    c_x2: Any,
    c_y1: Any,
    c_y2: Any,
    h_a: Any,
    N_ua: Any = 0,
    V_ua: Any = 0,
    n_x: int = 2,
    n_y: int = 2,
    s_x: Any = None,
    s_y: Any = None,
    tension_rows: int | None = None,
    anchor: str = "cast-in headed",
    e_h: Any = None,
    A_brg: Any = None,
    grade: str = "F1554 Gr 36",
    cracked: bool = True,
    lambda_a: float = 1.0,
    condition: str = "B",
    grout_pad: bool = True,
    load_factor: Any = None,
    seismic: bool = False,
    Omega_0: Any = None,
    seismic_tension: str = "overstrength",
    stretch_length: Any = None,
    anchor_reinforcement: bool = False,
    suffix: str = "",
) -> list[str]:
    """Add the ACI 318-19 Chapter 17 checks of a group of cast-in anchors.

    Args:
        sh: Sheet to write on.
        d_a: Anchor diameter (UNC sizes 1/2 in to 3 in).
        h_ef: Effective embedment depth (head or hook bearing surface to the concrete surface).
        f_c: Concrete compressive strength f'c (2500 psi to 10,000 psi, 17.3.1).
        c_x1, c_x2, c_y1, c_y2: Edge distances from the outermost anchors (see module doc).
        h_a: Thickness of the concrete member.
        N_ua, V_ua: Tension on the group and shear toward the ``c_x2`` edge (values or sheet
            names; factored on an LRFD sheet, combined service loads on an ASD sheet).
        n_x, n_y, s_x, s_y: Anchors per row across / along the shear and their spacings.
        tension_rows: Rows (counted from the ``c_x1`` edge) sharing the tension; default all.
        anchor: ``"cast-in headed"`` (heavy hex head or nut) or ``"cast-in hooked"`` (L- or
            J-bolt, hook length ``e_h``); anything else raises CheckNotCoveredError.
        e_h: Inside hook length of a hooked anchor (3 d_a to 4.5 d_a, 17.6.3.2.2).
        A_brg: Net bearing area of the head; default a heavy hex nut (ASME B18.2.2).
        grade: ASTM F1554 grade (see :data:`ANCHOR_GRADES`).
        cracked: Concrete cracked at service loads (ψ_c,N = ψ_c,V = ψ_c,P = 1.0), else uncracked.
        lambda_a: Lightweight concrete factor λ_a (1.0 normalweight, 17.2.4).
        condition: ``"A"`` (supplementary reinforcement) or ``"B"`` (none), Table 17.5.3.
        grout_pad: Base plate on a grout pad (17.7.1.2.1: 0.8 V_sa).
        load_factor: ASD sheets: factor from the combined service loads to strength-level
            loads (required there; e.g. 1.6, or 1/0.6 for wind-governed loads).
        seismic: Earthquake forces in the combination, SDC C to F (17.10, ASCE 7-16 13.4).
        Omega_0: Overstrength factor Ω_0p of the component (ASCE 7-16 Table 13.5-1/13.6-1).
        seismic_tension: ``"overstrength"`` (17.10.5.3(d)) or ``"ductile"`` (17.10.5.3(a)).
        stretch_length: Stretch length of the anchor for ``seismic_tension="ductile"``.
        anchor_reinforcement: True raises CheckNotCoveredError (17.5.2.1 is not implemented).
        suffix: Name suffix.

    Returns:
        Keys of the checks added.
    """
    for field, value in (("anchor", anchor), ("grade", grade), ("condition", condition), ("seismic_tension", seismic_tension)):
        if not isinstance(value, str):
            raise CheckInputError(field, value, "a text (see the docstring for the choices)")
    if anchor not in _COVERED:
        raise CheckNotCoveredError("anchor", anchor, f"cast-in anchors only ({', '.join(_COVERED)}); post-installed mechanical "
                                   "anchors need the product's qualification data (ACI 355.2) and adhesive anchors its bond "
                                   "strength (ACI 355.4, 17.6.5)")
    if anchor_reinforcement:
        raise CheckNotCoveredError("anchor_reinforcement", True, "anchor reinforcement (ACI 318-19 17.5.2.1) is not implemented; "
                                   "check without it (conservative) or design the reinforcement separately")
    if grade not in ANCHOR_GRADES:
        raise CheckInputError("grade", grade, f"one of {', '.join(ANCHOR_GRADES)}")
    if condition not in ("A", "B"):
        raise CheckInputError("condition", condition, "'A' (supplementary reinforcement) or 'B' (none), ACI 318-19 17.5.3")
    if seismic_tension not in ("overstrength", "ductile"):
        raise CheckInputError("seismic_tension", seismic_tension, "'overstrength' (17.10.5.3(d)) or 'ductile' (17.10.5.3(a))")
    for field, n in (("n_x", n_x), ("n_y", n_y)):
        if not (isinstance(n, int) and not isinstance(n, bool) and 1 <= n <= 10):
            raise CheckInputError(field, n, "a whole number of anchors from 1 to 10")
    rows = n_x if tension_rows is None else tension_rows
    if not (isinstance(rows, int) and not isinstance(rows, bool) and 1 <= rows <= n_x):
        raise CheckInputError("tension_rows", tension_rows, f"a whole number of rows from 1 to n_x = {n_x}")
    if not isinstance(lambda_a, (int, float)) or not 0.45 <= float(lambda_a) <= 1.0:
        raise CheckInputError("lambda_a", lambda_a, "a lightweight factor from 0.45 to 1.0 (ACI 318-19 17.2.4)")
    hooked = anchor == "cast-in hooked"
    lrfd = sh.method == "LRFD"
    if not lrfd and load_factor is None:
        raise CheckInputError("load_factor", None, "on an ASD sheet, the factor from the combined service loads to strength-level "
                              "loads (ACI 318 is strength design), e.g. 1.6")
    if seismic and Omega_0 is None:
        raise CheckInputError("Omega_0", None, "the component's overstrength factor Ω_0p (ASCE 7-16 Table 13.5-1 or 13.6-1) "
                              "when seismic=True")
    if seismic and seismic_tension == "ductile" and stretch_length is None:
        raise CheckInputError("stretch_length", None, "the anchor's stretch length (>= 8 d_a, ACI 318-19 17.10.5.3(a))")

    calc = Calc(sh, suffix)
    sh.heading(f"Anchorage to concrete, {anchor} anchors{f' [{suffix}]' if suffix else ''}", 2)
    _givens(calc, d_a, h_ef, f_c, h_a, c_x1, c_x2, c_y1, c_y2, n_x, n_y, s_x, s_y, rows, grade, lambda_a, hooked, e_h, A_brg)
    _forces(calc, N_ua, V_ua, load_factor, seismic, Omega_0, seismic_tension)
    keys: list[str] = []
    conc = "k_seis*" if seismic else ""
    phi_conc = 0.75 if condition == "A" else 0.70
    cond_ref = f"{_REF} Table 17.5.3(b), Condition {condition}"

    # ---------------------------------------------------------------- steel, 17.6.1 / 17.7.1
    calc.step("A_se", "pi/4*(d_a - 0.9743/n_thr)**2", "Effective cross-sectional area of the anchor", unit="in^2",
              ref=f"{_REF} R17.6.1.2")
    calc.step("f_uta_e", "min(f_uta, 1.9*f_ya, f_uta_max)", "Tensile strength used", unit="ksi", ref=f"{_REF} 17.6.1.2")
    calc.step("N_sa", "A_se*f_uta_e", "Steel strength of one anchor in tension", unit="kip", ref=f"{_REF} Eq. 17.6.1.2")
    calc.given("phi_sN", 0.75, "Strength reduction factor, ductile steel in tension", f"{_REF} Table 17.5.3(a)", dim="")
    calc.step("N_sa_d", "phi_sN*N_sa", "Design steel strength in tension, φN_sa", unit="kip")
    keys.append(calc.check("Anchor steel in tension", "N_ua1", "N_sa_d", key="ratio_Nsa", ref=f"{_REF} 17.6.1"))
    if grout_pad:
        calc.step("V_sa", "0.8*0.6*A_se*f_uta_e", "Steel strength of one anchor in shear, on a grout pad", unit="kip",
                  ref=f"{_REF} Eq. 17.7.1.2b, 17.7.1.2.1")
    else:
        calc.step("V_sa", "0.6*A_se*f_uta_e", "Steel strength of one anchor in shear", unit="kip", ref=f"{_REF} Eq. 17.7.1.2b")
    calc.given("phi_sV", 0.65, "Strength reduction factor, ductile steel in shear", f"{_REF} Table 17.5.3(a)", dim="")
    calc.step("V_sa_d", "phi_sV*V_sa", "Design steel strength in shear, φV_sa", unit="kip")
    keys.append(calc.check("Anchor steel in shear", "V_ua1", "V_sa_d", key="ratio_Vsa", ref=f"{_REF} 17.7.1"))

    # ---------------------------------------------------------------- breakout in tension, 17.6.2
    calc.given("phi_cb", phi_conc, "Strength reduction factor, concrete breakout and side-face blowout", cond_ref, dim="")
    _effective_depth(calc, rows)
    calc.step("A_Nco", "9*h_efc**2", "Projected area of one anchor far from edges", unit="in^2", ref=f"{_REF} Eq. 17.6.2.1.4")
    _projected_area(calc, "A_Nc", "c_x1", "c_N2", "n_xt", "Projected failure area of the tension anchors")
    calc.step("c_amin", "min(c_x1, c_N2, c_y1, c_y2)", "Smallest edge distance of the tension anchors", unit="in")
    _psi_ed(calc, "psi_edN", "c_amin", "1.5*h_efc", f"{_REF} Eqs. 17.6.2.4.1a, 17.6.2.4.1b")
    calc.given("psi_cN", 1.0 if cracked else 1.25, "Cracking factor ψ_c,N (" + ("cracked" if cracked else "uncracked, cast-in") + ")",
               f"{_REF} 17.6.2.5.1", dim="")
    calc.given("psi_cpN", 1.0, "Splitting factor ψ_cp,N (cast-in anchors)", f"{_REF} 17.6.2.6", dim="")
    calc.given("k_cN", "24 lbf/(psi**0.5*in**1.5)", "Coefficient for cast-in anchors (with f'c in psi, h_ef in in)",
               f"{_REF} 17.6.2.2.1")
    if hooked:
        calc.step("N_b", "k_cN*lambda_a*sqrt(f_c)*h_efc**1.5", "Basic breakout strength of one anchor in tension", unit="kip",
                  ref=f"{_REF} Eq. 17.6.2.2.1")
    else:
        calc.given("k_c16", "16 lbf/(psi**0.5*in**1.5)", "Coefficient for 11 in <= h_ef <= 25 in", f"{_REF} Eq. 17.6.2.2.3")
        calc.given("h_1", "1 in", "Unit length for the exponent 5/3 of Eq. 17.6.2.2.3 (h_ef in in)", f"{_REF} 17.6.2.2.3")
        calc.branch("N_b", [("h_efc < 11*h_1", "k_cN*lambda_a*sqrt(f_c)*h_efc**1.5", "Eq. 17.6.2.2.1"),
                            (None, "k_c16*lambda_a*sqrt(f_c)*h_efc**1.5*(h_efc/h_1)**(1/6)", "Eq. 17.6.2.2.3, 16 λ_a √f'c h_ef^(5/3)")],
                    "Basic breakout strength of one anchor in tension", unit="kip", ref=f"{_REF} 17.6.2.2")
    calc.step("N_cbg", "A_Nc/A_Nco*psi_edN*psi_cN*psi_cpN*N_b", "Breakout strength of the tension anchors (ψ_ec,N = 1, "
              "tension shared equally)", unit="kip", ref=f"{_REF} Eq. 17.6.2.1b")
    calc.step("N_cbg_d", f"{conc}phi_cb*N_cbg", "Design breakout strength in tension, φN_cbg", unit="kip",
              ref=f"{_REF} 17.10.5.4" if seismic else "")
    keys.append(calc.check("Concrete breakout in tension", "N_uag", "N_cbg_d", key="ratio_Ncb", ref=f"{_REF} 17.6.2"))

    # ---------------------------------------------------------------- pullout, 17.6.3
    calc.given("phi_p", 0.70, "Strength reduction factor, pullout and pryout (Condition B applies)", f"{_REF} Table 17.5.3(c)",
               dim="")
    calc.given("psi_cP", 1.0 if cracked else 1.4, "Cracking factor ψ_c,P", f"{_REF} 17.6.3.3.1", dim="")
    if hooked:
        calc.step("e_hu", "min(e_h, 4.5*d_a)", "Hook length used (3 d_a <= e_h <= 4.5 d_a)", unit="in", ref=f"{_REF} 17.6.3.2.2")
        calc.step("N_p", "0.9*f_c*e_hu*d_a", "Pullout strength of a hooked anchor", unit="kip", ref=f"{_REF} Eq. 17.6.3.2.2b")
    else:
        calc.step("N_p", "8*A_brg*f_c", "Pullout strength of a headed anchor", unit="kip", ref=f"{_REF} Eq. 17.6.3.2.2a")
    calc.step("N_pn", "psi_cP*N_p", "Nominal pullout strength of one anchor", unit="kip", ref=f"{_REF} Eq. 17.6.3.1")
    calc.step("N_pn_d", f"{conc}phi_p*N_pn", "Design pullout strength, φN_pn", unit="kip", ref=f"{_REF} 17.10.5.4" if seismic else "")
    keys.append(calc.check("Pullout", "N_ua1", "N_pn_d", key="ratio_Np", ref=f"{_REF} 17.6.3"))
    tension_names = ["ratio_Nsa", "ratio_Ncb", "ratio_Np"]

    # ---------------------------------------------------------------- side-face blowout, 17.6.4
    if not hooked and _blowout(calc, n_y, rows, conc, seismic):
        keys.append(calc.check("Side-face blowout", "N_uae", "N_sb_d", key="ratio_Nsb", ref=f"{_REF} 17.6.4"))
        tension_names.append("ratio_Nsb")

    # ---------------------------------------------------------------- breakout in shear, 17.7.2
    _shear_breakout(calc)
    calc.step("V_cbg_d", "phi_cb*V_cbg", "Design breakout strength in shear, φV_cbg", unit="kip")
    keys.append(calc.check("Concrete breakout in shear", "V_uag", "V_cbg_d", key="ratio_Vcb", ref=f"{_REF} 17.7.2"))

    # ---------------------------------------------------------------- pryout, 17.7.3
    if rows == n_x:
        calc.step("N_cpg", "N_cbg", "Breakout strength of the whole group in tension", unit="kip", ref=f"{_REF} 17.7.3.1")
    else:
        _projected_area(calc, "A_Ncp", "c_x1", "c_x2", "n_xa", "Projected failure area of all the anchors")
        calc.step("c_aminp", "min(c_x1, c_x2, c_y1, c_y2)", "Smallest edge distance of the group", unit="in")
        _psi_ed(calc, "psi_edNp", "c_aminp", "1.5*h_efc", f"{_REF} Eqs. 17.6.2.4.1a, 17.6.2.4.1b")
        calc.step("N_cpg", "A_Ncp/A_Nco*psi_edNp*psi_cN*psi_cpN*N_b", "Breakout strength of the whole group in tension",
                  unit="kip", ref=f"{_REF} 17.7.3.1, Eq. 17.6.2.1b")
    calc.given("h_25", "2.5 in", "Embedment limit for k_cp", f"{_REF} 17.7.3.1", dim="[length]")
    calc.branch("k_cp", [("h_ef < h_25", "1", "h_ef < 2.5 in"), (None, "2", "h_ef >= 2.5 in")], "Pryout coefficient",
                ref=f"{_REF} 17.7.3.1")
    calc.step("V_cpg", "k_cp*N_cpg", "Pryout strength of the group", unit="kip", ref=f"{_REF} Eq. 17.7.3.1b")
    calc.step("V_cpg_d", "phi_p*V_cpg", "Design pryout strength, φV_cpg", unit="kip")
    keys.append(calc.check("Pryout", "V_ua", "V_cpg_d", key="ratio_Vcp", ref=f"{_REF} 17.7.3"))

    # ---------------------------------------------------------------- seismic ductility, 17.10.5.3(a)
    if seismic and seismic_tension == "ductile":
        keys.extend(_ductile(calc, stretch_length))

    # ---------------------------------------------------------------- interaction, 17.8
    calc.select("U_N", "max", {k: k for k in tension_names}, "Governing tension ratio N_ua/φN_n", ref=f"{_REF} 17.5.2")
    calc.select("U_V", "max", {k: k for k in ("ratio_Vsa", "ratio_Vcb", "ratio_Vcp")}, "Governing shear ratio V_ua/φV_n",
                ref=f"{_REF} 17.5.2")
    calc.branch("U_NV", [("U_V <= 0.2", "U_N", "V_ua <= 0.2 φV_n: full tension strength, 17.8.1"),
                         ("U_N <= 0.2", "U_V", "N_ua <= 0.2 φN_n: full shear strength, 17.8.2"),
                         (None, "U_N + U_V", "Eq. 17.8.3")], "Tension-shear interaction", ref=f"{_REF} 17.8")
    calc.branch("U_limNV", [("U_V <= 0.2", "1", "17.8.1"), ("U_N <= 0.2", "1", "17.8.2"), (None, "1.2", "Eq. 17.8.3")],
                "Interaction limit", ref=f"{_REF} 17.8")
    keys.append(calc.check("Anchor tension-shear interaction", "U_NV", "U_limNV", key="ratio_NV", ref=f"{_REF} 17.8"))
    sh.note("Anchorage: cast-in anchors, no anchor reinforcement (Condition " + condition + "); tension shared equally by the "
            "tension anchors (ψ_ec,N = 1); shear breakout from the row nearest the edge carrying all the shear (oversized "
            "holes); shear parallel to an edge and eccentric shear are not checked. Post-installed and adhesive anchors are "
            "not covered (product data needed).")
    return keys


def _givens(calc: Calc, d_a: Any, h_ef: Any, f_c: Any, h_a: Any, c_x1: Any, c_x2: Any, c_y1: Any, c_y2: Any, n_x: int, n_y: int,
            s_x: Any, s_y: Any, rows: int, grade: str, lambda_a: float, hooked: bool, e_h: Any, A_brg: Any) -> None:
    d = calc.given("d_a", d_a, "Anchor diameter", dim="[length]")
    d_in = round(as_float(d, "in"), 4)
    threads = next((t for k, t in UNC_THREADS_PER_INCH.items() if abs(k - d_in) < 1e-3), None)
    if threads is None:
        raise CheckInputError("d_a", d_a, "a UNC anchor rod size: " + ", ".join(f"{k:g}" for k in UNC_THREADS_PER_INCH) + " in")
    calc.given("n_thr", f"{threads:g} in^-1", "Threads per inch (UNC)", "ASME B1.1 (from memory)")
    f_ya, f_uta = ANCHOR_GRADES[grade]
    calc.given("f_ya", f"{f_ya:g} ksi", "Anchor yield strength", f"ASTM {grade}", dim="ksi")
    calc.given("f_uta", f"{f_uta:g} ksi", "Anchor tensile strength", f"ASTM {grade}", dim="ksi")
    calc.given("f_uta_max", "125 ksi", "Upper limit on f_uta", f"{_REF} 17.6.1.2", dim="ksi")
    h = calc.given("h_ef", h_ef, "Effective embedment depth", dim="[length]")
    if as_float(h, "in") > 25.0:
        raise CheckNotCoveredError("h_ef", f"{as_float(h, 'in'):g} in", "h_ef up to 25 in (ACI 318-19 17.6.2.2.3 and "
                                   "17.1.3); deeper anchors are outside the breakout equations")
    fc = calc.given("f_c", f_c, "Concrete compressive strength f'c", dim="psi")
    if not 2500.0 - 1e-9 <= as_float(fc, "psi") <= 10000.0 + 1e-9:
        raise CheckInputError("f_c", f_c, "f'c from 2500 psi to 10,000 psi for cast-in anchors (ACI 318-19 17.3.1)")
    calc.given("lambda_a", float(lambda_a), "Lightweight concrete factor λ_a", f"{_REF} 17.2.4", dim="")
    calc.given("h_a", h_a, "Thickness of the concrete member", dim="[length]")
    for base, value, text in (("c_x1", c_x1, "Edge distance behind the group (tension side)"),
                              ("c_x2", c_x2, "Edge distance in the direction of the shear"),
                              ("c_y1", c_y1, "Edge distance at one side"), ("c_y2", c_y2, "Edge distance at the other side")):
        calc.given(base, value, text, dim="[length]")
    calc.given("n_xa", n_x, "Rows of anchors (across the shear direction)", dim="")
    calc.given("n_xt", rows, "Rows carrying tension", dim="")
    calc.given("n_y", n_y, "Anchors per row", dim="")
    for base, value, n, text in (("s_x", s_x, n_x, "Spacing of the rows"), ("s_y", s_y, n_y, "Spacing of the anchors in a row")):
        if n > 1:
            s = calc.given(base, value, text, dim="[length]")
            if as_float(s, "in") < 4 * d_in - 1e-9:
                warn(calc.sh, f"{base} = {s:~} is less than 4 d_a, the least spacing of cast-in anchors (ACI 318-19 17.9.2)")
        else:
            calc.given(base, "0 in" if value is None else value, text + " (one only)", dim="[length]", allow_zero=True)
    if as_float(h, "in") > 0 and as_float(calc.sh[calc.name("h_a")], "in") <= as_float(h, "in"):
        raise CheckInputError("h_a", h_a, f"a member thicker than the embedment h_ef = {h:~}")
    if hooked:
        if e_h is None:
            raise CheckInputError("e_h", None, "the hook length of a hooked anchor (3 d_a to 4.5 d_a)")
        eh = calc.given("e_h", e_h, "Inside hook length", dim="[length]")
        if as_float(eh, "in") < 3 * d_in - 1e-9:
            raise CheckNotCoveredError("e_h", f"{eh:~}", "a hook length of at least 3 d_a (ACI 318-19 17.6.3.2.2)")
    if A_brg is not None:
        calc.given("A_brg", A_brg, "Net bearing area of the head", dim="[area]")
    elif not hooked:
        calc.given("F_hex", f"{1.5 * d_in + 0.125:g} in", "Heavy hex nut, width across flats (1.5 d + 1/8 in)",
                   "ASME B18.2.2 (from memory)", dim="[length]")
        calc.step("A_brg", "sqrt(3)/2*F_hex**2 - pi/4*d_a**2", "Net bearing area of the nut (hexagon less the rod)", unit="in^2")


def _forces(calc: Calc, N_ua: Any, V_ua: Any, load_factor: Any, seismic: bool, Omega_0: Any, seismic_tension: str) -> None:
    """Strength-level forces on the group and per anchor (with the ASD conversion and Ω_0)."""
    tag = "" if calc.lrfd else "_s"
    calc.given("N_in" + tag, N_ua, "Tension on the group" + ("" if calc.lrfd else " (ASD)"), dim="lbf", allow_zero=True,
               sign_hint="tension as a positive force")
    calc.given("V_in" + tag, V_ua, "Shear on the group" + ("" if calc.lrfd else " (ASD)"), dim="lbf", allow_zero=True,
               allow_negative=True)
    n_expr, v_expr = "N_in" + tag, "abs(V_in" + tag + ")"
    if not calc.lrfd:
        calc.given("alpha_LF", load_factor, "Factor from ASD combined loads to strength-level loads", "stated by the engineer", dim="")
        n_expr, v_expr = f"alpha_LF*{n_expr}", f"alpha_LF*{v_expr}"
    if seismic:
        calc.given("Omega_0", Omega_0, "Overstrength factor of the component Ω_0p", "ASCE 7-16 13.4, Table 13.5-1/13.6-1", dim="")
        calc.given("k_seis", 0.75, "Factor on concrete-governed tension strengths, earthquake", f"{_REF} 17.10.5.4", dim="")
        v_expr = f"Omega_0*{v_expr}"
        if seismic_tension == "overstrength":
            n_expr = f"Omega_0*{n_expr}"
    calc.step("N_ua", n_expr, "Tension on the group, strength level" + (" with Ω_0 (17.10.5.3(d))" if seismic and
              seismic_tension == "overstrength" else ""), unit="kip", ref=_REF + (" 17.10.5.3" if seismic else " 5.3"))
    calc.step("V_ua", v_expr, "Shear on the group, strength level" + (" with Ω_0 (17.10.6.3(c))" if seismic else ""), unit="kip",
              ref=_REF + (" 17.10.6.3" if seismic else " 5.3"))
    calc.step("N_ua1", "N_ua/(n_xt*n_y)", "Tension on one anchor (shared equally)", unit="kip")
    calc.step("N_uag", "N_ua", "Tension on the tension anchors", unit="kip")
    calc.step("V_ua1", "V_ua/n_y", "Shear on one anchor of the row nearest the edge (oversized holes)", unit="kip",
              ref=f"{_REF} R17.7.2.1")
    calc.step("V_uag", "V_ua", "Shear on the row nearest the edge", unit="kip", ref=f"{_REF} R17.7.2.1")


def _effective_depth(calc: Calc, rows: int) -> None:
    """h_ef, reduced per 17.6.2.1.2 when three or more edges are closer than 1.5 h_ef."""
    h = calc.value("h_ef", "in")
    edges = [calc.value("c_x1", "in"), calc.value("c_x2", "in") + (calc.value("n_xa") - rows) * calc.value("s_x", "in"),
             calc.value("c_y1", "in"), calc.value("c_y2", "in")]
    if rows < calc.value("n_xa"):
        calc.step("c_N2", "c_x2 + (n_xa - n_xt)*s_x", "Edge distance beyond the tension rows", unit="in")
    else:
        calc.step("c_N2", "c_x2", "Edge distance beyond the tension rows", unit="in")
    near = [n for n, c in zip(("c_x1", "c_N2", "c_y1", "c_y2"), edges, strict=True) if c < 1.5 * h]
    if len(near) >= 3:  # c_a,max is the largest of the edges within 1.5 h_ef
        calc.step("h_efc", f"min(h_ef, max(max({', '.join(near)})/1.5, max((n_xt - 1)*s_x, (n_y - 1)*s_y)/3))",
                  "Embedment used: three or more edges closer than 1.5 h_ef", unit="in", ref=f"{_REF} 17.6.2.1.2")
    else:
        calc.step("h_efc", "h_ef", "Embedment used (fewer than three edges within 1.5 h_ef)", unit="in", ref=f"{_REF} 17.6.2.1.2")


def _projected_area(calc: Calc, base: str, c_back: str, c_front: str, rows: str, description: str) -> None:
    """A_Nc of a rectangular group: each side extends to the edge or 1.5 h_ef, at most n·A_Nco."""
    calc.step(base, f"min((min({c_back}, 1.5*h_efc) + ({rows} - 1)*s_x + min({c_front}, 1.5*h_efc))*"
                    f"(min(c_y1, 1.5*h_efc) + (n_y - 1)*s_y + min(c_y2, 1.5*h_efc)), {rows}*n_y*A_Nco)",
              description, unit="in^2", ref=f"{_REF} 17.6.2.1.1, Fig. R17.6.2.1.1")


def _psi_ed(calc: Calc, base: str, c_min: str, reach: str, ref: str) -> None:
    calc.branch(base, [(f"{c_min} >= {reach}", "1", "c_a,min >= 1.5 h_ef" if "h_efc" in reach else "c_a2 >= 1.5 c_a1"),
                       (None, f"0.7 + 0.3*{c_min}/({reach})", "reduced near an edge")],
                "Edge effect factor", ref=ref)


def _blowout(calc: Calc, n_y: int, rows: int, conc: str, seismic: bool) -> bool:
    """Side-face blowout of headed anchors when the nearest edge is closer than 0.4 h_ef."""
    h = calc.value("h_ef", "in")
    x_back = calc.value("c_x1", "in")
    x_front = calc.value("c_N2", "in")
    y_min = min(calc.value("c_y1", "in"), calc.value("c_y2", "in"))
    c_near = min(x_back, x_front, y_min)
    if c_near >= 0.4 * h:
        calc.sh.note(f"Side-face blowout (ACI 318-19 17.6.4) does not apply: nearest edge of the tension anchors "
                     f"{c_near:.3g} in >= 0.4 h_ef = {0.4 * h:.3g} in.")
        return False
    if y_min <= min(x_back, x_front):  # nearest edge is a side: the anchors along it are one per tension row
        calc.step("c_a1s", "min(c_y1, c_y2)", "Distance to the nearest edge", unit="in", ref=f"{_REF} 17.6.4.1")
        calc.step("c_a2s", "min(c_x1, c_N2)", "Distance to the orthogonal edge", unit="in", ref=f"{_REF} 17.6.4.1")
        n_edge, s_edge = rows, "(n_xt - 1)*s_x"
    else:
        near = "c_x1" if x_back <= x_front else "c_N2"
        calc.step("c_a1s", near, "Distance to the nearest edge", unit="in", ref=f"{_REF} 17.6.4.1")
        calc.step("c_a2s", "min(c_y1, c_y2)", "Distance to the orthogonal edge", unit="in", ref=f"{_REF} 17.6.4.1")
        n_edge, s_edge = n_y, "(n_y - 1)*s_y"
    calc.given("k_sb", "160 lbf/(psi**0.5*in**2)", "Coefficient of Eq. 17.6.4.1 (c_a1, √A_brg in in, f'c in psi)",
               f"{_REF} Eq. 17.6.4.1", dim="lbf/(psi**0.5*in**2)")
    calc.step("N_sb", "(1 + min(max(c_a2s/c_a1s, 1), 3))/4*k_sb*c_a1s*sqrt(A_brg)*lambda_a*sqrt(f_c)",
              "Side-face blowout strength of one anchor (× (1 + c_a2/c_a1)/4 with 1 <= c_a2/c_a1 <= 3)", unit="kip",
              ref=f"{_REF} Eq. 17.6.4.1, 17.6.4.1.1")
    calc.given("n_e", n_edge, "Tension anchors along the nearest edge", dim="")
    if n_edge > 1:
        calc.step("s_e", s_edge, "Distance between the outer anchors along the edge", unit="in")
        calc.step("N_sbg", "min(1 + s_e/(6*c_a1s), n_e)*N_sb", "Side-face blowout strength of the anchors along the edge "
                  "(s < 6 c_a1; n·N_sb at most)", unit="kip", ref=f"{_REF} Eq. 17.6.4.2")
    else:
        calc.step("N_sbg", "N_sb", "Side-face blowout strength (one anchor along the edge)", unit="kip", ref=f"{_REF} 17.6.4.1")
    calc.step("N_sb_d", f"{conc}phi_cb*N_sbg", "Design side-face blowout strength", unit="kip",
              ref=f"{_REF} 17.10.5.4" if seismic else "")
    calc.step("N_uae", "n_e*N_ua1", "Tension on the anchors along the nearest edge", unit="kip")
    return True


def _shear_breakout(calc: Calc) -> None:
    """V_cbg of the row nearest the c_x2 edge (17.7.2), c_a1 reduced per 17.7.2.1.2 in narrow members."""
    c1 = calc.value("c_x2", "in")
    narrow = (max(calc.value("c_y1", "in"), calc.value("c_y2", "in")) < 1.5 * c1 and calc.value("h_a", "in") < 1.5 * c1)
    if narrow:
        calc.step("c_a1", "min(c_x2, max(max(c_y1, c_y2)/1.5, h_a/1.5, (n_y - 1)*s_y/3))",
                  "Edge distance used: narrow, thin member", unit="in", ref=f"{_REF} 17.7.2.1.2")
    else:
        calc.step("c_a1", "c_x2", "Edge distance in the direction of the shear", unit="in", ref=f"{_REF} 17.7.2.1")
    calc.step("A_Vco", "4.5*c_a1**2", "Projected area of one anchor in a deep member far from side edges", unit="in^2",
              ref=f"{_REF} Eq. 17.7.2.1.3")
    calc.step("A_Vc", "min((min(c_y1, 1.5*c_a1) + (n_y - 1)*s_y + min(c_y2, 1.5*c_a1))*min(1.5*c_a1, h_a), n_y*A_Vco)",
              "Projected failure area of the row on the side face", unit="in^2", ref=f"{_REF} 17.7.2.1.1, Fig. R17.7.2.1b")
    calc.step("c_a2", "min(c_y1, c_y2)", "Distance to the nearest side edge", unit="in")
    _psi_ed(calc, "psi_edV", "c_a2", "1.5*c_a1", f"{_REF} Eqs. 17.7.2.4.1a, 17.7.2.4.1b")
    calc.given("psi_cV", 1.0 if calc.value("psi_cN") == 1.0 else 1.4, "Cracking factor ψ_c,V (no edge reinforcement)",
               f"{_REF} 17.7.2.5.1", dim="")
    calc.step("psi_hV", "max(sqrt(1.5*c_a1/h_a), 1)", "Member thickness factor", ref=f"{_REF} Eq. 17.7.2.6.1")
    calc.step("l_e", "min(h_ef, 8*d_a)", "Load-bearing length of the anchor in shear", unit="in", ref=f"{_REF} 17.7.2.2.1")
    calc.given("k_v7", "7 lbf/(psi**0.5*in**2)", "Coefficient of Eq. 17.7.2.2.1a (in, psi)", f"{_REF} Eq. 17.7.2.2.1a",
               dim="lbf/(psi**0.5*in**2)")
    calc.given("k_v9", "9 lbf/(psi**0.5*in**1.5)", "Coefficient of Eq. 17.7.2.2.1b (in, psi)", f"{_REF} Eq. 17.7.2.2.1b",
               dim="lbf/(psi**0.5*in**1.5)")
    calc.step("V_b1", "k_v7*(l_e/d_a)**0.2*sqrt(d_a)*lambda_a*sqrt(f_c)*c_a1**1.5", "Basic shear breakout, Eq. 17.7.2.2.1a",
              unit="kip", ref=f"{_REF} Eq. 17.7.2.2.1a")
    calc.step("V_b2", "k_v9*lambda_a*sqrt(f_c)*c_a1**1.5", "Basic shear breakout, Eq. 17.7.2.2.1b", unit="kip",
              ref=f"{_REF} Eq. 17.7.2.2.1b")
    calc.select("V_b", "min", {"V_b1": "Eq. 17.7.2.2.1a", "V_b2": "Eq. 17.7.2.2.1b"}, "Basic breakout strength in shear",
                unit="kip", ref=f"{_REF} 17.7.2.2.1")
    calc.step("V_cbg", "A_Vc/A_Vco*psi_edV*psi_cV*psi_hV*V_b", "Breakout strength in shear (ψ_ec,V = 1)", unit="kip",
              ref=f"{_REF} Eq. 17.7.2.1b")


def _ductile(calc: Calc, stretch_length: Any) -> list[str]:
    """17.10.5.3(a): the anchor steel yields before the concrete; stretch length >= 8 d_a."""
    calc.given("l_st", stretch_length, "Stretch length of the anchor", dim="[length]")
    calc.step("l_st_min", "8*d_a", "Least stretch length", unit="in", ref=f"{_REF} 17.10.5.3(a)")
    keys = [calc.check("Ductile anchor: stretch length", "l_st_min", "l_st", key="ratio_lst", ref=f"{_REF} 17.10.5.3(a)")]
    conc = ["N_cbg/(n_xt*n_y)", "N_pn"] + (["N_sbg/n_e"] if calc.has("N_sbg") else [])
    calc.step("N_c1", f"k_seis*min({', '.join(conc)})", "Concrete-governed strength per tension anchor, × 0.75", unit="kip",
              ref=f"{_REF} 17.10.5.3(a), 17.10.5.4")
    keys.append(calc.check("Ductile anchor: steel weaker than concrete", "N_sa", "N_c1", key="ratio_duct",
                           ref=f"{_REF} 17.10.5.3(a)"))
    return keys
