"""Shear, AISC 360-16 Chapter G: G2 (I-shape and channel webs), G3 (single angles and tees),
G4 (rectangular HSS), G5 (round HSS).

Available strength ``V_c`` (φ_v·V_n or V_n/Ω_v) is written under that name (plus suffix).
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, CheckNotCoveredError, add_material, check_length
from calcpad.eng.checks._section import Sec, resolve_section

__all__ = ["add_shear_check"]


def add_shear_check(
    sh: Sheet,
    section: Any,
    *,
    V: Any,
    axis: str = "x",
    L_v: Any = None,
    kind: str | None = None,
    material: Any = None,
    F_y: Any = None,
    E: Any = None,
    suffix: str = "",
) -> str:
    """Add the shear strength check (shear along the depth for ``axis="x"``).

    Args:
        sh: Sheet to write on.
        section: I-shape (G2, major axis), single angle or tee (G3, the leg or stem along the
            shear), rectangular HSS (G4) or round HSS (G5).
        V: Required shear strength V_r (magnitude used).
        axis: Bending axis the shear goes with (``"x"``: shear parallel to the depth).
        L_v: Round HSS only: distance from maximum to zero shear (> 0); without it the
            length-independent Eq. G5-2b alone is used (conservative).
        material / F_y / E: Material or values.
        suffix: Name suffix.

    Returns:
        Key of the check. The available strength is ``V_c`` (+ suffix).
    """
    if axis not in ("x", "y"):
        raise CheckInputError("axis", axis, "'x' or 'y'")
    calc = Calc(sh, suffix)
    sec = resolve_section(section, kind)
    sh.heading(f"Shear, {sec.label}{f' [{suffix}]' if suffix else ''}", 2)
    add_material(calc, material, F_y, E)
    calc.given("V_r", V, "Required shear strength", dim="lbf", allow_negative=True)
    phi, omega = 0.90, 1.67
    if sec.kind == "i_shape" and axis == "x":
        _web(calc, sec)
        calc.branch(
            "C_v1",
            [("h_tw <= 2.24*sqrt(E/F_y)", "1.0", "rolled I-shape web, G2.1(a)"),
             ("h_tw <= 1.10*sqrt(k_v*E/F_y)", "1.0", "Eq. G2-3"),
             (None, "1.10*sqrt(k_v*E/F_y)/h_tw", "Eq. G2-4")],
            "Web shear strength coefficient",
            ref="AISC 360-16 G2.1",
        )
        calc.step("V_n", "0.6*F_y*A_w*C_v1", "Nominal shear strength", unit="kip", ref="AISC 360-16 Eq. G2-1")
        if calc.lrfd:
            calc.branch("phi_v", [("h_tw <= 2.24*sqrt(E/F_y)", "1.00", "G2.1(a)"), (None, "0.90", "G1")],
                        "Resistance factor (shear)", ref="AISC 360-16 G1, G2.1(a)")
            calc.step("V_c", "phi_v*V_n", "Available shear strength, LRFD", unit="kip", ref="AISC 360-16 G1")
        else:
            calc.branch("Omega_v", [("h_tw <= 2.24*sqrt(E/F_y)", "1.50", "G2.1(a)"), (None, "1.67", "G1")],
                        "Safety factor (shear)", ref="AISC 360-16 G1, G2.1(a)")
            calc.step("V_c", "V_n/Omega_v", "Available shear strength, ASD", unit="kip", ref="AISC 360-16 G1")
        return calc.check("Shear", "V_r", "V_c", key="ratio_v", ref="AISC 360-16 G1")
    if sec.kind == "channel" and axis == "x":
        _web(calc, sec)
        calc.branch(
            "C_v1",
            [("h_tw <= 1.10*sqrt(k_v*E/F_y)", "1.0", "Eq. G2-3"),
             (None, "1.10*sqrt(k_v*E/F_y)/h_tw", "Eq. G2-4")],
            "Web shear strength coefficient (G2.1(a) is for I-shapes only)",
            ref="AISC 360-16 G2.1(b)",
        )
        calc.step("V_n", "0.6*F_y*A_w*C_v1", "Nominal shear strength", unit="kip", ref="AISC 360-16 Eq. G2-1")
    elif sec.kind == "rect_hss":
        calc.prop("t", sec.need("t", "G4"), "in", "Design wall thickness", sec)
        calc.prop("h_t", sec.need("h_t" if axis == "x" else "b_t", "G4"), "", "Web slenderness h/t", sec)
        calc.step("h", "h_t*t", "Web flat height", unit="in", ref="AISC 360-16 G4")
        calc.step("A_w", "2*h*t", "Shear area (two webs)", unit="in^2", ref="AISC 360-16 G4")
        calc.given("k_v", 5.0, "Web plate shear buckling coefficient", "AISC 360-16 G4", dim="")
        calc.branch(
            "C_v2",
            [("h_t <= 1.10*sqrt(k_v*E/F_y)", "1.0", "Eq. G2-9"),
             ("h_t <= 1.37*sqrt(k_v*E/F_y)", "1.10*sqrt(k_v*E/F_y)/h_t", "Eq. G2-10"),
             (None, "1.51*k_v*E/(h_t**2*F_y)", "Eq. G2-11")],
            "Web shear buckling coefficient",
            ref="AISC 360-16 G2.2",
        )
        calc.step("V_n", "0.6*F_y*A_w*C_v2", "Nominal shear strength", unit="kip", ref="AISC 360-16 Eq. G4-1")
    elif sec.kind == "angle" or (sec.kind == "tee" and axis == "x"):
        if sec.kind == "tee":
            calc.prop("b", sec.need("d", "G3"), "in", "Depth of the stem (tee depth)", sec)
            calc.prop("t", sec.need("tw", "G3"), "in", "Stem thickness", sec)
        else:
            calc.prop("b", sec.need("d" if axis == "x" else "b", "G3"), "in", "Width of the leg resisting the shear", sec)
            calc.prop("t", sec.need("t", "G3"), "in", "Leg thickness", sec, shared=True)
        calc.given("k_v", 1.2, "Shear buckling coefficient", "AISC 360-16 G3", dim="")
        calc.step("b_t", "b/t", "Width-to-thickness ratio for shear", ref="AISC 360-16 G3")
        calc.branch(
            "C_v2",
            [("b_t <= 1.10*sqrt(k_v*E/F_y)", "1.0", "Eq. G2-9"),
             ("b_t <= 1.37*sqrt(k_v*E/F_y)", "1.10*sqrt(k_v*E/F_y)/b_t", "Eq. G2-10"),
             (None, "1.51*k_v*E/(b_t**2*F_y)", "Eq. G2-11")],
            "Shear strength coefficient",
            ref="AISC 360-16 G2.2",
        )
        calc.step("V_n", "0.6*F_y*b*t*C_v2", "Nominal shear strength", unit="kip", ref="AISC 360-16 Eq. G3-1")
    elif sec.kind == "round_hss":
        calc.prop("A_g", sec.need("A", "G5"), "in**2", "Gross area", sec)
        calc.prop("D", sec.need("D", "G5"), "in", "Outside diameter", sec)
        calc.prop("D_t", sec.need("D_t", "G5"), "", "Diameter-to-thickness ratio", sec)
        cands = {}
        if L_v is not None:
            check_length(calc, "L_v", L_v, "Distance from maximum to zero shear")
            calc.step("F_cr_a", "1.60*E/(sqrt(L_v/D)*D_t**(5/4))", "Shear buckling stress, length-dependent", unit="ksi", ref="AISC 360-16 Eq. G5-2a")
            cands["F_cr_a"] = "Eq. G5-2a"
        else:
            sh.note("L_v not given: only Eq. G5-2b is used for shear buckling (conservative).")
        calc.step("F_cr_b", "0.78*E/D_t**(3/2)", "Shear buckling stress", unit="ksi", ref="AISC 360-16 Eq. G5-2b")
        cands["F_cr_b"] = "Eq. G5-2b"
        if len(cands) == 2:
            calc.select("F_cr_m", "max", cands, "Shear buckling stress, larger of G5-2a and G5-2b", unit="ksi", ref="AISC 360-16 G5")
        else:
            calc.step("F_cr_m", "F_cr_b", "Shear buckling stress", unit="ksi")
        calc.step("F_cr_v", "min(F_cr_m, 0.6*F_y)", "Critical shear stress (at most 0.6 F_y)", unit="ksi", ref="AISC 360-16 G5")
        calc.step("V_n", "F_cr_v*A_g/2", "Nominal shear strength", unit="kip", ref="AISC 360-16 Eq. G5-1")
    else:
        raise CheckNotCoveredError("section", f"{sec.kind} ({sec.label}) about {axis}",
                                   "shear is covered for I-shapes, channels and tees about x (G2, G3), single angles (G3), rectangular HSS (G4) "
                                   "and round HSS (G5); "
                                   "use add_stress_check for others")
    calc.available_with("V_c", "V_n", phi, omega, "AISC 360-16 G1", "v", "Available shear strength", unit="kip")
    return calc.check("Shear", "V_r", "V_c", key="ratio_v", ref="AISC 360-16 G1")


def _web(calc: Calc, sec: Sec) -> None:
    """Web area d*t_w, h/tw and k_v of an I-shape or channel web, AISC 360-16 G2.1."""
    calc.prop("d", sec.need("d", "G2"), "in", "Overall depth", sec)
    calc.prop("t_w", sec.need("tw", "G2"), "in", "Web thickness", sec)
    calc.prop("h_tw", sec.need("h_tw", "G2"), "", "Web slenderness h/tw", sec)
    calc.step("A_w", "d*t_w", "Area of web", unit="in^2", ref="AISC 360-16 G2.1")
    calc.given("k_v", 5.34, "Web plate shear buckling coefficient (no stiffeners)", "AISC 360-16 G2.1(b)(2)", dim="")
