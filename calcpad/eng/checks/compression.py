"""Compression members, AISC 360-16 Chapter E: E3 flexural buckling, E4 torsional and
flexural-torsional buckling (I-shapes, tees), E5 single angles and E7 slender elements.

Available strength ``P_c`` (φ_c·P_n for LRFD, P_n/Ω_c for ASD) is written under that name
(plus the suffix) so an interaction check can use it. The elastic buckling stress comes from
:mod:`calcpad.eng.checks.buckling`.
"""

from __future__ import annotations

import math
from typing import Any

from calcpad.core.results import NOT_COVERED, OK_SLENDER
from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckNotCoveredError, add_material, add_props, check_k, check_length
from calcpad.eng.checks._section import Sec, resolve_section
from calcpad.eng.checks.buckling import validate_angle_e5, write_e3_transition, write_elastic_buckling
from calcpad.eng.checks.classify import write_elements

__all__ = ["add_compression_check"]

#: AISC 360-16 Table E7.1 imperfection factors (c_1, c_2) by case.
E7_FACTORS = {"a": (0.18, 1.31), "b": (0.20, 1.38), "c": (0.22, 1.49)}


def add_compression_check(
    sh: Sheet,
    section: Any,
    *,
    P: Any,
    L: Any,
    K: Any = 1.0,
    L_y: Any = None,
    K_y: Any = None,
    L_z: Any = None,
    K_z: Any = None,
    kind: str | None = None,
    material: Any = None,
    F_y: Any = None,
    E: Any = None,
    G: Any = None,
    r: Any = None,
    connected_leg: str | None = None,
    truss: str = "planar",
    suffix: str = "",
) -> str:
    """Add the compressive strength check of a member (AISC 360-16 E3, E4, E5, E7).

    Args:
        sh: Sheet to write on.
        section: Shape or property mapping: round/rect HSS, I-shape, tee, solid bars, or a
            single angle end-connected through one leg (E5).
        P: Required compressive strength P_r (≥ 0; a tension force belongs in
            :func:`add_tension_check`), value with unit or the name of a sheet value.
        L: Unbraced length (> 0), about x (and about y and for twisting unless given).
        K: Effective length factor about x (0.5..2.5 usual; outside gives a caution).
        L_y, K_y: Unbraced length and factor for buckling about y (default ``L``, ``K``).
        L_z, K_z: Length and factor for twisting, E4 (default ``L_y``, ``K_y``).
        material / F_y / E / G: Material or values (G for E4, default 11,200 ksi).
        r: Radius of gyration to use (a single axis; default: each axis of the section).
        connected_leg: Single angles: ``"long"`` or ``"short"``, the leg the end connections
            load (E5); ``K`` does not apply to E5.
        truss: Single angles: ``"planar"`` (individual members and planar truss webs, E5(a))
            or ``"space"`` (box and space truss webs, E5(b)).
        suffix: Name suffix for a second member on the same sheet.

    Returns:
        Key of the check. The available strength is ``P_c`` (+ suffix).
    """
    calc = Calc(sh, suffix)
    sec = resolve_section(section, kind)
    validate_angle_e5(sec, connected_leg, truss)
    sh.heading(f"Compression, {sec.label}{f' [{suffix}]' if suffix else ''}", 2)
    add_material(calc, material, F_y, E, G=G, need_g=sec.kind in ("i_shape", "tee", "channel") and r is None)
    calc.given("P_r", P, "Required compressive strength", dim="lbf",
               sign_hint="compression is entered as a positive force; check tension with add_tension_check", allow_zero=True)
    check_length(calc, "L", L, "Unbraced length")
    if sec.kind != "angle":
        check_k(calc, K)
    add_props(calc, sec, {"A_g": "A"}, "compression check")

    fy = calc.value("F_y", "ksi")
    e = calc.value("E", "ksi")
    slender_web = False
    if sec.kind == "i_shape":
        kc = min(max(4.0 / math.sqrt(sec.need("h_tw", "E7")), 0.35), 0.76)
        flange_limit = min(0.56 * math.sqrt(e / fy), 0.64 * math.sqrt(kc * e / fy))  # Table B4.1a cases 1 and 2
        if sec.need("bf_2tf", "E7") > flange_limit:
            raise CheckNotCoveredError("flange bf/2tf", round(sec.need("bf_2tf", "E7"), 2),
                                       f"I-shape flanges nonslender in compression (<= {flange_limit:.1f}, Table B4.1a cases 1/2); "
                                       "slender flanges are not covered")
        slender_web = sec.need("h_tw", "E7") > 1.49 * math.sqrt(e / fy)
    if sec.kind == "round_hss" and sec.need("D_t", "E7") > 0.45 * e / fy:
        raise CheckNotCoveredError("D/t", round(sec.need("D_t", "E7"), 2), f"round HSS with D/t <= 0.45E/Fy = {0.45 * e / fy:.1f} "
                                   "(AISC 360-16 E7.2(c)); beyond that the Specification does not apply")
    write_elements(calc, sec, "compression")

    by_stress = write_elastic_buckling(calc, sec, L_y=L_y, K_y=K_y, L_z=L_z, K_z=K_z, r=r, connected_leg=connected_leg, truss=truss)
    if by_stress:
        limit = "F_y/F_e <= 2.25"
    else:
        write_e3_transition(calc)
        limit = "KL_r <= KL_r_lim"
    calc.branch(
        "F_cr",
        [(limit, "0.658**(F_y/F_e)*F_y", "inelastic buckling, Eq. E3-2"),
         (None, "0.877*F_e", "elastic buckling, Eq. E3-3")],
        "Critical stress",
        unit="ksi",
        ref="AISC 360-16 E3",
    )
    if sec.kind == "rect_hss":
        calc.prop("t", sec.need("t", "E7"), "in", "Design wall thickness", sec)
        _effective_widths(calc, [("f", "lambda_f*t", "flange walls"), ("w", "lambda_w*t", "web walls")], "b")
        calc.step("A_eff", "A_g - 2*(b_f - b_ef)*t - 2*(b_w - b_ew)*t", "Effective area", unit="in^2", ref="AISC 360-16 E7")
        calc.step("P_n", "F_cr*A_eff", "Nominal compressive strength", unit="kip", ref="AISC 360-16 Eq. E7-1")
    elif sec.kind == "round_hss":
        calc.branch(
            "A_eff",
            [("lambda_D <= lambda_rcD", "A_g", "nonslender wall"),
             (None, "(0.038*E/(F_y*lambda_D) + 2/3)*A_g", "slender wall, E7.2(c)")],
            "Effective area",
            unit="in^2",
            ref="AISC 360-16 E7.2(c)",
        )
        calc.step("P_n", "F_cr*A_eff", "Nominal compressive strength", unit="kip", ref="AISC 360-16 Eq. E7-1")
    elif sec.kind in ("tee", "angle", "channel"):
        _open_shape_e7(calc, sec)
        calc.step("P_n", "F_cr*A_eff", "Nominal compressive strength", unit="kip", ref="AISC 360-16 Eq. E7-1")
    elif slender_web:
        calc.prop("t_w", sec.need("tw", "E7"), "in", "Web thickness", sec)
        _effective_widths(calc, [("w", "lambda_w*t_w", "web (h)")], "a")
        calc.step("A_eff", "A_g - (b_w - b_ew)*t_w", "Effective area (slender web)", unit="in^2", ref="AISC 360-16 E7")
        calc.step("P_n", "F_cr*A_eff", "Nominal compressive strength", unit="kip", ref="AISC 360-16 Eq. E7-1")
    else:
        calc.step("P_n", "F_cr*A_g", "Nominal compressive strength", unit="kip", ref="AISC 360-16 Eq. E3-1")
    calc.available("P_c", "P_n", "compression", "c", "Available compressive strength", unit="kip")
    # E2 user note: KL/r preferably <= 200 (a status, not NG); E5's L_c/r <= 200 is a limit of the equations (not covered)
    flag = ("KL_r", 200.0, NOT_COVERED if sec.kind == "angle" else OK_SLENDER)
    return calc.check("Axial compression", "P_r", "P_c", key="ratio_c", ref="AISC 360-16 E1", flags=[flag])


def _effective_widths(calc: Calc, elements: list[tuple[str, str, str]], case: str, tag: str = "") -> None:
    """Flat width, F_el and effective width b_e of each element (E7-2, E7-3, E7-5).

    ``tag`` names the Table E7.1 factors (``c_1`` + tag) when two cases share a sheet.
    """
    c1, c2 = E7_FACTORS[case]
    calc.given(f"c_1{tag}", c1, "Effective width imperfection factor", f"AISC 360-16 Table E7.1 case ({case})", dim="")
    calc.given(f"c_2{tag}", c2, "Effective width imperfection factor", f"AISC 360-16 Table E7.1 case ({case})", dim="")
    for code, width, what in elements:
        calc.step(f"b_{code}", width, f"Width, {what}", unit="in")
        calc.step(f"F_el{code}", f"(c_2{tag}*lambda_rc{code}/lambda_{code})**2*F_y", f"Elastic local buckling stress, {what}", unit="ksi",
                  ref="AISC 360-16 Eq. E7-5")
        calc.branch(
            f"b_e{code}",
            [(f"lambda_{code} <= lambda_rc{code}*sqrt(F_y/F_cr)", f"b_{code}", "fully effective, Eq. E7-2"),
             (None, f"b_{code}*(1 - c_1{tag}*sqrt(F_el{code}/F_cr))*sqrt(F_el{code}/F_cr)", "effective width, Eq. E7-3")],
            f"Effective width, {what}",
            unit="in",
            ref="AISC 360-16 E7.1",
        )


def _open_shape_e7(calc: Calc, sec: Sec) -> None:
    """Effective area of a tee, single angle or channel (Table E7.1 cases (c) and (a))."""
    if sec.kind == "channel":
        calc.prop("t_f", sec.need("tf", "E7"), "in", "Flange thickness", sec)
        calc.prop("t_w", sec.need("tw", "E7"), "in", "Web thickness", sec)
        _effective_widths(calc, [("f", "lambda_f*t_f", "flanges")], "c", "f")
        _effective_widths(calc, [("w", "lambda_w*t_w", "web (h)")], "a", "w")
        calc.step("A_eff", "A_g - 2*(b_f - b_ef)*t_f - (b_w - b_ew)*t_w", "Effective area", unit="in^2", ref="AISC 360-16 E7")
        return
    if sec.kind == "tee":
        calc.prop("t_f", sec.need("tf", "E7"), "in", "Flange thickness", sec)
        calc.prop("t_w", sec.need("tw", "E7"), "in", "Stem thickness", sec)
        _effective_widths(calc, [("f", "lambda_f*t_f", "flange outstand (bf/2)"), ("s", "lambda_s*t_w", "stem")], "c")
        calc.step("A_eff", "A_g - 2*(b_f - b_ef)*t_f - (b_s - b_es)*t_w", "Effective area", unit="in^2", ref="AISC 360-16 E7")
        return
    d, b, t = sec.need("d", "E7"), sec.need("b", "E7"), sec.need("t", "E7")
    calc.prop("t", t, "in", "Leg thickness", sec, shared=True)
    if math.isclose(d, b, rel_tol=1e-9):
        _effective_widths(calc, [("l", "lambda_l*t", "each leg")], "c")
        calc.step("A_eff", "A_g - 2*(b_l - b_el)*t", "Effective area", unit="in^2", ref="AISC 360-16 E7")
        return
    calc.prop("lambda_l2", min(d, b) / t, "", "Width-to-thickness ratio, short leg", sec)
    calc.step("lambda_rcl2", "lambda_rcl", "Slender limit, short leg", ref="AISC 360-16 Table B4.1a case 3")
    _effective_widths(calc, [("l", "lambda_l*t", "long leg"), ("l2", "lambda_l2*t", "short leg")], "c")
    calc.step("A_eff", "A_g - (b_l - b_el)*t - (b_l2 - b_el2)*t", "Effective area", unit="in^2", ref="AISC 360-16 E7")
