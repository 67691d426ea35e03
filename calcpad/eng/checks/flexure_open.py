"""Flexure of open singly symmetric and unsymmetric shapes, AISC 360-16 F9 (tees) and F10
(single angles).

Covered: tees bent in their plane of symmetry (about x, flange at the top) with the stem in
tension or in compression; equal-leg single angles bent about a geometric axis with no axial
compression, or any single angle about a principal axis (w major, LTB by Eq. F10-4 with β_w;
z minor). Unequal-leg angles about a geometric axis (resolve the moment onto w and z) and tees
about y are not covered.
"""

from __future__ import annotations

from calcpad.eng.checks._common import Calc
from calcpad.eng.checks._section import Sec
from calcpad.eng.checks.classify import write_elements

__all__ = ["write_angle_flexure", "write_tee_flexure"]


def write_tee_flexure(calc: Calc, sec: Sec, braced_len: bool, stem: str | None) -> None:
    """Tee in its plane of symmetry: yielding, LTB, flange and stem local buckling (F9).

    Bending about x (the caller has checked that, and ``stem``: None, "tension", "compression").
    """
    if stem is None:
        stem = "compression"
        calc.sh.assume("Tee stem taken in flexural compression (the lower strength of F9); give stem='tension' when the "
                       "flange is the compressed side.")
    write_elements(calc, sec, "flexure", "x")
    calc.prop("S_xc", sec.need("Sx_top", "F9"), "in**3", "Elastic section modulus to the flange", sec)
    calc.prop("S_xs", sec.need("Sx_bot", "F9"), "in**3", "Elastic section modulus to the stem tip", sec)
    calc.prop("Z", sec.need("Zx", "F9"), "in**3", "Plastic section modulus about x", sec)
    calc.step("S", "min(S_xc, S_xs)", "Least elastic section modulus about x", unit="in^3")
    calc.step("M_y", "F_y*S", "Yield moment", unit="kip*ft", ref="AISC 360-16 Eq. F9-3")
    tension = stem == "tension"
    if tension:
        calc.step("M_p", "min(F_y*Z, 1.6*M_y)", "Plastic moment, stem in tension", unit="kip*ft", ref="AISC 360-16 Eq. F9-2")
    else:
        calc.step("M_p", "M_y", "Yielding limit, stem in compression", unit="kip*ft", ref="AISC 360-16 Eq. F9-4")
    cands = {"M_p": "yielding (F9.1)"}
    if braced_len:
        calc.prop("d", sec.need("d", "F9"), "in", "Depth of the tee", sec)
        calc.prop("r_y", sec.need("ry", "F9"), "in", "Radius of gyration about y", sec)
        calc.prop("I_y", sec.need("Iy", "F9"), "in**4", "Moment of inertia about y", sec)
        calc.prop("J", sec.need("J", "F9"), "in**4", "Torsional constant", sec, shared=True)
        sign = "" if tension else "-"
        calc.step("B", f"{sign}2.3*d/L_b*sqrt(I_y/J)", "LTB parameter B", ref=f"AISC 360-16 Eq. {'F9-11' if tension else 'F9-13'}")
        calc.step("M_cr", "1.95*E/L_b*sqrt(I_y*J)*(B + sqrt(1 + B**2))", "Elastic LTB moment", unit="kip*ft", ref="AISC 360-16 Eq. F9-10")
        if tension:
            calc.step("L_p", "1.76*r_y*sqrt(E/F_y)", "Limiting length, yielding", unit="ft", ref="AISC 360-16 Eq. F9-8")
            calc.step("L_r", "1.95*E/F_y*sqrt(I_y*J)/S_xc*sqrt(2.36*F_y/E*d*S_xc/J + 1)", "Limiting length, inelastic LTB", unit="ft",
                      ref="AISC 360-16 Eq. F9-9")
            calc.branch(
                "M_n_LTB",
                [("L_b <= L_p", "M_p", "L_b <= L_p, no lateral-torsional buckling"),
                 ("L_b <= L_r", "M_p - (M_p - M_y)*(L_b - L_p)/(L_r - L_p)", "inelastic LTB, Eq. F9-6"),
                 (None, "M_cr", "elastic LTB, Eq. F9-7")],
                "Lateral-torsional buckling, stem in tension",
                unit="kip*ft",
                ref="AISC 360-16 F9.2(a)",
            )
        else:
            calc.step("M_n_LTB", "min(M_cr, M_y)", "Lateral-torsional buckling, stem in compression", unit="kip*ft",
                      ref="AISC 360-16 Eq. F9-12")
        cands["M_n_LTB"] = "lateral-torsional buckling (F9.2)"
    else:
        calc.sh.note("Compression side continuously braced: lateral-torsional buckling (F9.2) does not apply.")
    if tension:
        calc.branch(
            "M_n_FLB",
            [("lambda_f <= lambda_pf", "M_p", "compact flange, no flange local buckling"),
             ("lambda_f <= lambda_rf", "min(M_p - (M_p - 0.7*F_y*S_xc)*(lambda_f - lambda_pf)/(lambda_rf - lambda_pf), 1.6*M_y)",
              "noncompact flange, Eq. F9-14"),
             (None, "0.7*E*S_xc/lambda_f**2", "slender flange, Eq. F9-15")],
            "Flange local buckling",
            unit="kip*ft",
            ref="AISC 360-16 F9.3",
        )
        cands["M_n_FLB"] = "flange local buckling (F9.3)"
    else:
        calc.branch(
            "F_cr_s",
            [("lambda_s <= lambda_ps", "F_y", "Eq. F9-17"),
             ("lambda_s <= lambda_rs", "(1.43 - 0.515*lambda_s*sqrt(F_y/E))*F_y", "Eq. F9-18"),
             (None, "1.52*E/lambda_s**2", "Eq. F9-19")],
            "Critical stress of the stem",
            unit="ksi",
            ref="AISC 360-16 F9.4",
        )
        calc.step("M_n_SLB", "F_cr_s*S_xs", "Local buckling of the stem in flexural compression", unit="kip*ft", ref="AISC 360-16 Eq. F9-16")
        cands["M_n_SLB"] = "stem local buckling (F9.4)"
    calc.select("M_n", "min", cands, "Nominal flexural strength", unit="kip*ft")


def write_angle_flexure(calc: Calc, sec: Sec, axis: str, braced_len: bool, toe: str | None, restraint: str) -> None:
    """Equal-leg single angle about a geometric axis: yielding, LTB, leg local buckling (F10).

    The caller has checked equal legs, ``toe`` (None, "compression", "tension") and ``restraint``.
    """
    if axis in ("w", "z"):
        _angle_principal(calc, sec, axis, braced_len, toe)
        return
    b, t = sec.need("b", "F10"), sec.need("t", "F10")
    if toe is None:
        toe = "compression"
        calc.sh.assume("Toe of the leg perpendicular to the bending axis taken in compression (lower strength); give "
                       "toe='tension' when it is the tension side.")
    write_elements(calc, sec, "flexure", axis)
    free = braced_len and restraint == "none"
    s_toe, s_heel = ("Sx_top", "Sx_bot") if axis == "x" else ("Sy_right", "Sy_left")
    s_c = s_toe if toe == "compression" else s_heel
    calc.prop("S_g", min(sec.need(s_toe, "F10"), sec.need(s_heel, "F10")), "in**3", f"Geometric section modulus about {axis} (least)",
              sec.label)
    calc.prop("S_c0", sec.need(s_c, "F10"), "in**3", "Geometric section modulus to the compressed toe", sec)
    calc.given("k_S", 0.80 if free else 1.0, "Factor on the geometric section modulus",
               "AISC 360-16 F10.2(ii)(a): 0.80 without lateral-torsional restraint" if free else "AISC 360-16 F10.1, F10.2(ii)(b)", dim="")
    calc.step("M_y", "k_S*F_y*S_g", "Yield moment about the geometric axis", unit="kip*ft", ref="AISC 360-16 F10.1, F10.2(ii)")
    calc.step("M_p", "1.5*M_y", "Yielding", unit="kip*ft", ref="AISC 360-16 Eq. F10-1")
    cands = {"M_p": "yielding (F10.1)"}
    if braced_len:
        calc.prop("b", b, "in", "Leg width", sec)
        calc.prop("t", t, "in", "Leg thickness", sec, shared=True)
        calc.given("k_r", 1.0 if free else 1.25, "Factor on M_cr for restraint at the point of maximum moment",
                   "AISC 360-16 F10.2(ii)(b)" if not free else "AISC 360-16 F10.2(ii)(a)", dim="")
        sign, eq = ("-", "F10-5a") if toe == "compression" else ("+", "F10-5b")
        calc.step("M_cr", f"k_r*0.58*E*b**4*t*C_b/L_b**2*(sqrt(1 + 0.88*(L_b*t/b**2)**2) {sign} 1)",
                  f"Elastic LTB moment, toe in {toe}", unit="kip*ft", ref=f"AISC 360-16 Eq. {eq}")
        _f10_ltb(calc, cands)
    else:
        calc.sh.note("Continuous lateral-torsional restraint: F10.2 does not apply; M_y uses the full geometric section modulus.")
    calc.step("S_c", "k_S*S_c0", "Section modulus to the toe in compression", unit="in^3", ref="AISC 360-16 F10.3")
    _f10_llb(calc, "S_c", cands)
    calc.select("M_n", "min", cands, "Nominal flexural strength", unit="kip*ft")


def _angle_principal(calc: Calc, sec: Sec, axis: str, braced_len: bool, toe: str | None) -> None:
    """Single angle about a principal axis: yielding, LTB about w (Eq. F10-4 with β_w), leg local
    buckling at a compressed toe."""
    write_elements(calc, sec, "flexure", "x")
    major = axis == "w"
    equal = abs(sec.need("d", "F10") - sec.need("b", "F10")) <= 1e-9 * sec.need("d", "F10")
    sign = 1.0
    if major and equal:
        calc.prop("S_p", sec.need("Sw_toe", "F10"), "in**3", "Section modulus about w (to the toes)", sec)
        calc.sh.note("Bending about the major principal axis w: one toe is in compression.")
        s_c = "S_p"
    elif major:
        if toe is None:
            toe = "long"
            calc.sh.assume("Long leg's toe taken in compression (bending about w; beta_w negative, the lower strength); give "
                           "toe='short' when the short leg's toe is the compressed one.")
        sign = 1.0 if toe == "short" else -1.0
        calc.prop("S_wl", sec.need("Sw_long", "F10"), "in**3", "Section modulus about w to the long leg's toe", sec)
        calc.prop("S_ws", sec.need("Sw_short", "F10"), "in**3", "Section modulus about w to the short leg's toe", sec)
        calc.step("S_p", "min(S_wl, S_ws)", "Least section modulus about w", unit="in^3")
        s_c = "S_ws" if toe == "short" else "S_wl"
    else:
        if toe is None:
            toe = "compression"
            calc.sh.assume("Toes taken in compression (bending about z; the lower strength); give toe='tension' when the heel "
                           "is the compression side.")
        calc.prop("S_zt", sec.need("Sz_toe", "F10"), "in**3", "Section modulus about z to the toes", sec)
        calc.prop("S_zh", sec.need("Sz_heel", "F10"), "in**3", "Section modulus about z to the heel", sec)
        calc.step("S_p", "min(S_zt, S_zh)", "Least section modulus about z", unit="in^3")
        s_c = "S_zt" if toe == "compression" else ""
    calc.step("M_y", "F_y*S_p", f"Yield moment about {axis}", unit="kip*ft", ref="AISC 360-16 F10.1")
    calc.step("M_p", "1.5*M_y", "Yielding", unit="kip*ft", ref="AISC 360-16 Eq. F10-1")
    cands = {"M_p": "yielding (F10.1)"}
    if major and braced_len:
        calc.prop("A", sec.need("A", "F10"), "in**2", "Gross area", sec, shared=True)
        calc.prop("r_z", sec.need("r_min", "F10"), "in", "Radius of gyration about z", sec)
        calc.prop("t", sec.need("t", "F10"), "in", "Leg thickness", sec, shared=True)
        bw = float(sign * sec.need("beta_w", "F10")) if not equal else 0.0
        calc.given("beta_w", f"{bw!r} in", "Section property for single angles (0 for equal legs; + short leg, - long leg in "
                   "compression)", "AISC 360-16 F10.2(i); integral over the legs", dim="[length]", allow_zero=True, allow_negative=True,
                   sig=4)
        calc.step("M_cr", "9*E*A*r_z*t*C_b/(8*L_b)*(sqrt(1 + (4.4*beta_w*r_z/(L_b*t))**2) + 4.4*beta_w*r_z/(L_b*t))",
                  "Elastic LTB moment about the major principal axis", unit="kip*ft", ref="AISC 360-16 Eq. F10-4")
        _f10_ltb(calc, cands)
    elif major:
        calc.sh.note("Continuous lateral-torsional restraint: F10.2 does not apply.")
    else:
        calc.sh.note("Bending about the minor principal axis z: lateral-torsional buckling does not apply (F10.2).")
    if s_c:
        _f10_llb(calc, s_c, cands)
    else:
        calc.sh.note("Toes in tension: leg local buckling (F10.3) does not apply.")
    calc.select("M_n", "min", cands, "Nominal flexural strength", unit="kip*ft")


def _f10_ltb(calc: Calc, cands: dict[str, str]) -> None:
    """M_n from M_y and M_cr, AISC 360-16 Eqs. F10-2 and F10-3."""
    calc.branch(
        "M_n_LTB",
        [("M_y/M_cr <= 1", "min((1.92 - 1.17*sqrt(M_y/M_cr))*M_y, 1.5*M_y)", "M_y/M_cr <= 1, Eq. F10-2"),
         (None, "(0.92 - 0.17*M_cr/M_y)*M_cr", "M_y/M_cr > 1, Eq. F10-3")],
        "Lateral-torsional buckling",
        unit="kip*ft",
        ref="AISC 360-16 F10.2",
    )
    cands["M_n_LTB"] = "lateral-torsional buckling (F10.2)"


def _f10_llb(calc: Calc, s_c: str, cands: dict[str, str]) -> None:
    """Leg local buckling with the section modulus ``s_c`` to the compressed toe, F10.3."""
    calc.branch(
        "M_n_LLB",
        [("lambda_l <= lambda_pl", "M_p", "compact legs, no leg local buckling"),
         ("lambda_l <= lambda_rl", f"F_y*{s_c}*(2.43 - 1.72*lambda_l*sqrt(F_y/E))", "noncompact legs, Eq. F10-6"),
         (None, f"0.71*E/lambda_l**2*{s_c}", "slender legs, Eqs. F10-7, F10-8")],
        "Leg local buckling (toe in compression)",
        unit="kip*ft",
        ref="AISC 360-16 F10.3",
    )
    cands["M_n_LLB"] = "leg local buckling (F10.3)"
