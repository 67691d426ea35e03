"""Compression members, AISC 360-16 Chapter E: flexural buckling E3, slender HSS walls E7.

Available strength ``P_c`` (φ_c·P_n for LRFD, P_n/Ω_c for ASD) is written under that name
(plus the suffix) so an interaction check can use it.
"""

from __future__ import annotations

import math
from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckNotCoveredError, add_material, add_props, check_k, check_length, warn
from calcpad.eng.checks._section import resolve_section
from calcpad.eng.checks.classify import write_elements

__all__ = ["add_compression_check"]


def add_compression_check(
    sh: Sheet,
    section: Any,
    *,
    P: Any,
    L: Any,
    K: Any = 1.0,
    kind: str | None = None,
    material: Any = None,
    F_y: Any = None,
    E: Any = None,
    r: Any = None,
    suffix: str = "",
) -> str:
    """Add the compressive strength check of a member (flexural buckling, E3 and E7).

    Args:
        sh: Sheet to write on.
        section: Shape or property mapping (round/rect HSS, I-shape, solid bars; angles are
            not covered: E4/E5).
        P: Required compressive strength P_r (≥ 0; a tension force belongs in
            :func:`add_tension_check`), value with unit or the name of a sheet value.
        L: Unbraced length (> 0).
        K: Effective length factor (0.5..2.5 usual; outside gives a caution).
        material / F_y / E: Material or values.
        r: Radius of gyration to use (default: least radius of the section).
        suffix: Name suffix for a second member on the same sheet.

    Returns:
        Key of the check. The available strength is ``P_c`` (+ suffix).
    """
    calc = Calc(sh, suffix)
    sec = resolve_section(section, kind)
    if sec.kind == "angle":
        raise CheckNotCoveredError("section", f"single angle {sec.label}", "angles in compression need E4/E5 (flexural-torsional, "
                                   "single-angle effective slenderness); use a yield-based stress check or another tool")
    sh.heading(f"Compression, {sec.label}{f' [{suffix}]' if suffix else ''}", 2)
    add_material(calc, material, F_y, E)
    calc.given("P_r", P, "Required compressive strength", dim="lbf",
               sign_hint="compression is entered as a positive force; check tension with add_tension_check", allow_zero=True)
    check_length(calc, "L", L, "Unbraced length")
    check_k(calc, K)
    add_props(calc, sec, {"A_g": "A"}, "compression check")
    if r is not None:
        calc.given("r", r, "Radius of gyration (governing axis)", dim="[length]")
    else:
        calc.prop("r", sec.need("r_min", "compression check"), "in", "Least radius of gyration", sec.label)

    fy = calc.value("F_y", "ksi")
    e = calc.value("E", "ksi")
    if sec.kind == "i_shape":
        if sec.need("bf_2tf", "E7") > 0.56 * math.sqrt(e / fy) or sec.need("h_tw", "E7") > 1.49 * math.sqrt(e / fy):
            raise CheckNotCoveredError("section", sec.label, "I-shapes with slender elements in compression (E7.1/E7.2 for "
                                       "rolled I-shapes) are not covered; choose a section with nonslender elements")
    if sec.kind == "round_hss" and sec.need("D_t", "E7") > 0.45 * e / fy:
        raise CheckNotCoveredError("D/t", round(sec.need("D_t", "E7"), 2), f"round HSS with D/t <= 0.45E/Fy = {0.45 * e / fy:.1f} "
                                   "(AISC 360-16 E7.2(c)); beyond that the Specification does not apply")
    if sec.kind in ("round_hss", "rect_hss", "i_shape"):
        write_elements(calc, sec, "compression")

    calc.step("KL_r", "K*L/r", "Slenderness ratio", ref="AISC 360-16 E2")
    kl_r = calc.value("KL_r")
    if kl_r > 200:
        warn(sh, f"KL/r = {kl_r:.0f} exceeds 200, the preferred limit of AISC 360-16 E2 (User Note)")
    calc.step("F_e", "pi**2*E/KL_r**2", "Elastic buckling stress", unit="ksi", ref="AISC 360-16 Eq. E3-4")
    calc.branch(
        "F_cr",
        [("KL_r <= 4.71*sqrt(E/F_y)", "0.658**(F_y/F_e)*F_y", "inelastic buckling, Eq. E3-2"),
         (None, "0.877*F_e", "elastic buckling, Eq. E3-3")],
        "Critical stress",
        unit="ksi",
        ref="AISC 360-16 E3",
    )
    if sec.kind == "rect_hss":
        calc.prop("t", sec.need("t", "E7"), "in", "Design wall thickness", sec.label)
        calc.given("c_1", 0.20, "Effective width imperfection factor", "AISC 360-16 Table E7.1 case (b)", dim="")
        calc.given("c_2", 1.38, "Effective width imperfection factor", "AISC 360-16 Table E7.1 case (b)", dim="")
        for code, what in (("f", "flange walls"), ("w", "web walls")):
            calc.step(f"b_{code}", f"lambda_{code}*t", f"Flat width, {what}")
            calc.step(f"F_el{code}", f"(c_2*lambda_rc{code}/lambda_{code})**2*F_y", f"Elastic local buckling stress, {what}", unit="ksi",
                      ref="AISC 360-16 Eq. E7-5")
            calc.branch(
                f"b_e{code}",
                [(f"lambda_{code} <= lambda_rc{code}*sqrt(F_y/F_cr)", f"b_{code}", "fully effective, Eq. E7-2"),
                 (None, f"b_{code}*(1 - c_1*sqrt(F_el{code}/F_cr))*sqrt(F_el{code}/F_cr)", "effective width, Eq. E7-3")],
                f"Effective width, {what}",
                unit="in",
                ref="AISC 360-16 E7.1",
            )
        calc.step("A_e", "A_g - 2*(b_f - b_ef)*t - 2*(b_w - b_ew)*t", "Effective area", unit="in^2", ref="AISC 360-16 E7")
        calc.step("P_n", "F_cr*A_e", "Nominal compressive strength", unit="kip", ref="AISC 360-16 Eq. E7-1")
    elif sec.kind == "round_hss":
        calc.branch(
            "A_e",
            [("lambda_D <= lambda_rcD", "A_g", "nonslender wall"),
             (None, "(0.038*E/(F_y*lambda_D) + 2/3)*A_g", "slender wall, E7.2(c)")],
            "Effective area",
            unit="in^2",
            ref="AISC 360-16 E7.2(c)",
        )
        calc.step("P_n", "F_cr*A_e", "Nominal compressive strength", unit="kip", ref="AISC 360-16 Eq. E7-1")
    else:
        calc.step("P_n", "F_cr*A_g", "Nominal compressive strength", unit="kip", ref="AISC 360-16 Eq. E3-1")
    calc.available("P_c", "P_n", "compression", "c", "Available compressive strength", unit="kip")
    return calc.check("Axial compression", "P_r", "P_c", key="ratio_c", ref="AISC 360-16 E1")
