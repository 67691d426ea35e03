"""Second-order effects by the approximate analysis of AISC 360-16 Appendix 8 (Chapter C).

    P_r, M_r = add_second_order(sh, post, material="A500 Gr C", P_nt="P_top", M_lt="M_base",
                                L="L_post", sway="cantilever")

writes, with their equation numbers:

* α = 1.0 (LRFD) or 1.6 (ASD) (App. 8.2);
* B1 = C_m / (1 - α P_r/P_e1) >= 1 with P_e1 = π² EI*/(K1 L)² (Eqs. A-8-3, A-8-5) and
  C_m = 0.6 - 0.4 M1/M2 (A-8-4) or 1.0 with transverse load between the ends;
* B2 = 1 / (1 - α P_story/P_e,story) >= 1 with P_e,story = R_M H L/Δ_H (A-8-6, A-8-7) and
  R_M = 1 - 0.15 P_mf/P_story (A-8-8);
* M_r = B1 M_nt + B2 M_lt, P_r = P_nt + B2 P_lt (A-8-1, A-8-2).

The story stiffness H L/Δ_H comes from a first-order analysis with the stiffness of the design
method (nominal EI for the effective length method, EI* = 0.8 τ_b EI for the direct analysis
method); ``sway="cantilever"`` writes Δ_H = H L³/(3 E I) for a fixed-free post with a reference
lateral load, ``sway="given"`` takes ``HL_Delta`` (H L/Δ_H) from an analysis. When α P_story
reaches P_e,story the story is unstable: B2 takes a value of 100 and the stability check
written with it is NG.
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, add_material, add_props
from calcpad.eng.checks._section import resolve_section

__all__ = ["add_second_order"]

_REF = "AISC 360-16 Appendix 8"


def add_second_order(
    sh: Sheet,
    section: Any = None,
    *,
    P_nt: Any,
    L: Any,
    M_nt: Any = None,
    M_lt: Any = None,
    P_lt: Any = "0 kip",
    sway: str = "cantilever",
    HL_Delta: Any = None,
    P_story: Any = None,
    P_mf: Any = None,
    K1: Any = 1.0,
    C_m: Any = None,
    M1_M2: Any = None,
    stiffness: str = "nominal",
    axis: str = "x",
    material: Any = None,
    E: Any = None,
    suffix: str = "",
) -> tuple[str | None, str | None]:
    """Add the App. 8 amplifiers and the second-order required strengths of a member.

    Args:
        sh: Sheet to write on.
        section: The member's section (for I); not needed with ``sway="given"`` and no B1 term.
        P_nt, P_lt: Axial compression with no lateral translation / from lateral translation
            (values or sheet names, >= 0).
        M_nt, M_lt: First-order moments with no lateral translation / from lateral translation
            (None is 0; with both None only the amplifiers B_1, B_2 are written).
        L: Member (story) height.
        sway: ``"cantilever"`` (fixed-free post, Δ_H = H L³/(3EI)) or ``"given"`` (``HL_Delta``).
        HL_Delta: H L/Δ_H of the story from a first-order analysis (``sway="given"``).
        P_story: Total vertical load on the story (default P_nt + P_lt: a single post).
        P_mf: Vertical load in the columns of the moment frames (default P_story: every column
            takes part in the sway resistance, R_M = 0.85).
        K1: Effective length factor in the plane of bending for B1 (1.0 unless analysis shows less).
        C_m: Given C_m (1.0 with transverse load between the ends); else from ``M1_M2``.
        M1_M2: Ratio of the smaller to the larger end moment (positive in reverse curvature).
        stiffness: ``"nominal"`` (effective length method) or ``"reduced"`` (direct analysis
            method, EI* = 0.8 EI with τ_b = 1: valid while α P_r <= 0.5 P_ns, AISC 360-16 C2.3).
        axis: ``"x"`` or ``"y"`` (which moment of inertia).
        material / E: Steel (E only).
        suffix: Name suffix.

    Returns:
        Sheet names of the second-order axial force and moment (P_r2, M_r2), or (None, None)
        when no moment was given (the amplifiers are ``B_1``, ``B_2`` plus suffix).
    """
    if sway not in ("cantilever", "given"):
        raise CheckInputError("sway", sway, "'cantilever' (fixed-free post) or 'given' (H L/Δ_H from an analysis)")
    if stiffness not in ("nominal", "reduced"):
        raise CheckInputError("stiffness", stiffness, "'nominal' (effective length method) or 'reduced' (direct analysis method)")
    if axis not in ("x", "y"):
        raise CheckInputError("axis", axis, "'x' or 'y'")
    if sway == "given" and HL_Delta is None:
        raise CheckInputError("HL_Delta", None, "H L/Δ_H of the story from a first-order analysis (sway='given')")
    if C_m is not None and M1_M2 is not None:
        raise CheckInputError("C_m / M1_M2", (C_m, M1_M2), "one of them: C_m directly, or M1/M2 to compute it (Eq. A-8-4)")
    calc = Calc(sh, suffix)
    sh.heading(f"Second-order effects, AISC 360-16 Appendix 8{f' [{suffix}]' if suffix else ''}", 2)
    calc.given("alpha_s", 1.0 if calc.lrfd else 1.6, f"α for {sh.method}", f"{_REF}.2", dim="")
    for base, value, text in (("P_nt", P_nt, "Axial compression, no lateral translation"),
                              ("P_lt", P_lt, "Axial compression from lateral translation")):
        calc.given(base, value, text, dim="lbf", allow_zero=True, sign_hint="compression as a positive force")
    moments = not (M_nt is None and M_lt is None)
    for base, value, text in (("M_nt", M_nt, "First-order moment, no lateral translation"),
                              ("M_lt", M_lt, "First-order moment from lateral translation")):
        if moments:
            calc.given(base, "0 kip*ft" if value is None else value, text, dim="lbf*in", allow_zero=True, allow_negative=True)
    calc.given("L_s", L, "Story height", dim="[length]")
    if material is not None:
        add_material(calc, material, E=E)
    else:
        calc.given("E", "29000 ksi" if E is None else E, "Modulus of elasticity", "AISC 360-16 (E = 29,000 ksi)", dim="ksi",
                   shared=True)
    if section is None:
        raise CheckInputError("section", None, "the member's section (its moment of inertia for P_e1 and the sway stiffness)")
    add_props(calc, resolve_section(section, None), {f"I_{axis}": "Ix" if axis == "x" else "Iy"}, "second-order analysis")
    ei = f"I_{axis}"
    if stiffness == "reduced":
        calc.step("EI_s", f"0.8*E*{ei}", "Flexural stiffness EI* = 0.8 τ_b EI (τ_b = 1)", unit="kip*in^2", ref="AISC 360-16 C2.3")
    else:
        calc.step("EI_s", f"E*{ei}", "Flexural stiffness EI* (effective length method: nominal EI)", unit="kip*in^2",
                  ref=f"{_REF}.2.1")
    # ------------------------------------------------------------------ B1
    calc.given("K_1", K1, "Effective length factor in the plane of bending, no lateral translation", f"{_REF}.2.1", dim="")
    calc.step("P_e1", "pi**2*EI_s/(K_1*L_s)**2", "Elastic critical buckling strength, no lateral translation", unit="kip",
              ref=f"{_REF}, Eq. A-8-5")
    if M1_M2 is not None:
        r = calc.given("M1_M2", M1_M2, "End moment ratio M1/M2 (positive in reverse curvature)", dim="", allow_negative=True,
                       allow_zero=True)
        if not -1.0 <= float(r.magnitude) <= 1.0:
            raise CheckInputError("M1_M2", M1_M2, "a ratio from -1 to 1 (the smaller end moment over the larger)")
        calc.step("C_m", "0.6 - 0.4*M1_M2", "Equivalent uniform moment factor (no transverse load between the ends)",
                  ref=f"{_REF}, Eq. A-8-4")
    else:
        calc.given("C_m", 1.0 if C_m is None else C_m, "Equivalent uniform moment factor (1.0: transverse load between the ends, "
                   "conservative)", f"{_REF}.2.1(b)", dim="")
    calc.step("P_r1", "P_nt + P_lt", "Axial force for B1 (first-order estimate)", unit="kip", ref=f"{_REF}.2.1")
    calc.branch("B_1", [("alpha_s*P_r1 < P_e1", "max(C_m/(1 - alpha_s*P_r1/P_e1), 1)", "Eq. A-8-3"),
                        (None, "100", "unstable: α P_r >= P_e1 (see the check below)")],
                "Multiplier for P-δ effects", ref=f"{_REF}, Eq. A-8-3")
    calc.step("aP_r1", "alpha_s*P_r1", "α P_r", unit="kip")
    calc.check("Member stability for B1, α P_r < P_e1", "aP_r1", "P_e1", key="ratio_Pe1", ref=f"{_REF}, Eq. A-8-3")
    # ------------------------------------------------------------------ B2
    if P_story is None:
        calc.step("P_story", "P_nt + P_lt", "Total vertical load on the story (this post)", unit="kip", ref=f"{_REF}.2.2")
    else:
        calc.given("P_story", P_story, "Total vertical load on the story", dim="lbf")
    if P_mf is None:
        calc.given("R_M", 0.85, "P-δ reduction of the story stiffness: every column in the sway system (P_mf = P_story)",
                   f"{_REF}, Eq. A-8-8", dim="")
    else:
        calc.given("P_mf", P_mf, "Vertical load in the columns of the moment frames", dim="lbf", allow_zero=True)
        calc.step("R_M", "1 - 0.15*P_mf/P_story", "P-δ reduction of the story stiffness", ref=f"{_REF}, Eq. A-8-8")
    if sway == "cantilever":
        calc.given("H_ref", "1 kip", "Reference lateral load for the first-order stiffness (a linear analysis: any value)", dim="lbf")
        calc.step("Delta_H", "H_ref*L_s**3/(3*EI_s)", "First-order drift of the fixed-free post under H_ref", unit="in",
                  ref="cantilever, elastic beam theory")
        calc.step("HL_Delta", "H_ref*L_s/Delta_H", "Story stiffness term H L/Δ_H", unit="kip", ref=f"{_REF}, Eq. A-8-7")
    else:
        calc.given("HL_Delta", HL_Delta, "Story stiffness term H L/Δ_H (first-order analysis)", dim="lbf")
    calc.step("P_estory", "R_M*HL_Delta", "Elastic critical buckling strength of the story", unit="kip", ref=f"{_REF}, Eq. A-8-7")
    calc.branch("B_2", [("alpha_s*P_story < P_estory", "max(1/(1 - alpha_s*P_story/P_estory), 1)", "Eq. A-8-6"),
                        (None, "100", "unstable: α P_story >= P_e,story (see the check below)")],
                "Multiplier for P-Δ effects", ref=f"{_REF}, Eq. A-8-6")
    calc.step("aP_story", "alpha_s*P_story", "α P_story", unit="kip")
    calc.check("Story stability for B2, α P_story < P_e,story", "aP_story", "P_estory", key="ratio_Pes", ref=f"{_REF}, Eq. A-8-6")
    if not moments:
        return None, None
    p_r = calc.step("P_r2", "P_nt + B_2*P_lt", "Required axial strength, second order", unit="kip", ref=f"{_REF}, Eq. A-8-2")
    m_r = calc.step("M_r2", "B_1*M_nt + B_2*M_lt", "Required flexural strength, second order", unit="kip*ft", ref=f"{_REF}, Eq. A-8-1")
    return p_r, m_r
