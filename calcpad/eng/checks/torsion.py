"""Torsion of HSS, AISC 360-16 H3.1, and combined torsion, shear, flexure and axial force, H3.2.

Round HSS (Eqs. H3-1, H3-2a/b) and rectangular HSS (Eqs. H3-3..H3-5) with the torsional
constant C of the H3.1 User Note. Open sections in torsion (warping, AISC Design Guide 9) are
not covered. The available torsional strength is written as ``T_c_tor`` (+ suffix); the required one
as ``T_r_tor`` (``T_r``/``T_c`` belong to the tension check).
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, CheckNotCoveredError, add_material, check_length
from calcpad.eng.checks._section import resolve_section

__all__ = ["add_torsion_check", "add_torsion_interaction_check"]

_PHI_T, _OMEGA_T = 0.90, 1.67  # AISC 360-16 H3.1


def add_torsion_check(
    sh: Sheet,
    section: Any,
    *,
    T: Any,
    L: Any = None,
    kind: str | None = None,
    material: Any = None,
    F_y: Any = None,
    E: Any = None,
    suffix: str = "",
) -> str:
    """Add the torsional strength check of a round or rectangular HSS (AISC 360-16 H3.1).

    Args:
        sh: Sheet to write on.
        section: Round or rectangular HSS (shape or property mapping).
        T: Required torsional strength T_r (magnitude used).
        L: Round HSS: member length for Eq. H3-2a; without it only Eq. H3-2b is used
            (conservative).
        material / F_y / E: Material or values.
        suffix: Name suffix.

    Returns:
        Key of the check. The available strength is ``T_c_tor`` (+ suffix).
    """
    if L is not None:
        Calc(sh, suffix)  # suffix and sheet checked before anything is written
    sec = resolve_section(section, kind)
    if sec.kind not in ("round_hss", "rect_hss"):
        raise CheckNotCoveredError("section", f"{sec.kind} ({sec.label})", "round or rectangular HSS (AISC 360-16 H3.1); open "
                                   "sections in torsion (warping) are not covered")
    calc = Calc(sh, suffix)
    sh.heading(f"Torsion, {sec.label}{f' [{suffix}]' if suffix else ''}", 2)
    add_material(calc, material, F_y, E)
    calc.given("T_r_tor", T, "Required torsional strength", dim="lbf*in", allow_negative=True, allow_zero=True)
    calc.prop("t", sec.need("t", "H3"), "in", "Design wall thickness", sec, shared=True)
    if sec.kind == "round_hss":
        calc.prop("D", sec.need("D", "H3"), "in", "Outside diameter", sec)
        calc.prop("D_t", sec.need("D_t", "H3"), "", "Diameter-to-thickness ratio", sec)
        _torsional_constant(calc, sec, "pi*(D - t)**2*t/2")
        cands = {}
        if L is not None:
            check_length(calc, "L_T", L, "Member length")
            calc.step("F_cr_Ta", "1.23*E/(sqrt(L_T/D)*D_t**(5/4))", "Torsional buckling stress, length-dependent", unit="ksi",
                      ref="AISC 360-16 Eq. H3-2a")
            cands["F_cr_Ta"] = "Eq. H3-2a"
        else:
            sh.note("Member length not given: only Eq. H3-2b is used for torsional buckling (conservative).")
        calc.step("F_cr_Tb", "0.60*E/D_t**(3/2)", "Torsional buckling stress", unit="ksi", ref="AISC 360-16 Eq. H3-2b")
        cands["F_cr_Tb"] = "Eq. H3-2b"
        if len(cands) == 2:
            calc.select("F_cr_Tm", "max", cands, "Torsional buckling stress, larger of H3-2a and H3-2b", unit="ksi", ref="AISC 360-16 H3.1(a)")
        else:
            calc.step("F_cr_Tm", "F_cr_Tb", "Torsional buckling stress", unit="ksi")
        calc.step("F_cr_T", "min(F_cr_Tm, 0.6*F_y)", "Critical stress (at most 0.6 F_y)", unit="ksi", ref="AISC 360-16 H3.1(a)")
    else:
        h, b = sec.need("H", "H3"), sec.need("B", "H3")
        calc.prop("H", h, "in", "Overall height", sec)
        calc.prop("B", b, "in", "Overall width", sec)
        calc.prop("h_t", max(sec.need("h_t", "H3"), sec.need("b_t", "H3")), "", "Flat width-to-thickness ratio, longer side",
                  sec.label)
        _torsional_constant(calc, sec, "2*(B - t)*(H - t)*t - 4.5*(4 - pi)*t**3")
        calc.branch(
            "F_cr_T",
            [("h_t <= 2.45*sqrt(E/F_y)", "0.6*F_y", "Eq. H3-3"),
             ("h_t <= 3.07*sqrt(E/F_y)", "0.6*F_y*2.45*sqrt(E/F_y)/h_t", "Eq. H3-4"),
             (None, "0.458*pi**2*E/h_t**2", "Eq. H3-5")],
            "Critical stress",
            unit="ksi",
            ref="AISC 360-16 H3.1(b)",
        )
    calc.step("T_n_tor", "F_cr_T*C_T", "Nominal torsional strength", unit="kip*ft", ref="AISC 360-16 Eq. H3-1")
    calc.available_with("T_c_tor", "T_n_tor", _PHI_T, _OMEGA_T, "AISC 360-16 H3.1", "tor", "Available torsional strength", unit="kip*ft")
    return calc.check("Torsion", "T_r_tor", "T_c_tor", key="ratio_T", ref="AISC 360-16 H3.1")


def _torsional_constant(calc: Calc, sec: Any, formula: str) -> None:
    """C_T: the HSS torsional constant the section carries (catalog shapes: as tabulated; computed
    round tubes: 2J/D as the tables compute it), else the H3.1 User Note formula."""
    tabulated = sec.get("C")
    if tabulated is not None:
        calc.prop("C_T", tabulated, "in**3", "HSS torsional constant", sec)
    else:
        calc.step("C_T", formula, "Torsional constant", unit="in^3", ref="AISC 360-16 H3.1 User Note")


def add_torsion_interaction_check(
    sh: Sheet,
    *,
    T_r: Any,
    T_c: Any,
    P_r: Any = None,
    P_c: Any = None,
    M_r: Any = None,
    M_c: Any = None,
    V_r: Any = None,
    V_c: Any = None,
    suffix: str = "",
) -> str:
    """Add the HSS interaction of torsion, shear, flexure and axial force (AISC 360-16 H3.2).

    When T_r <= 0.2 T_c torsion is neglected and the H1-1a/H1-1b form is used (H3.2);
    otherwise Eq. H3-6: (P_r/P_c + M_r/M_c) + (V_r/V_c + T_r/T_c)^2 <= 1.0. Each argument is a
    value with unit or a sheet name; pairs left out count as zero.

    Returns:
        Key of the check.
    """
    pairs = {"P": (P_r, P_c, "lbf", "axial"), "M": (M_r, M_c, "lbf*in", "flexural"), "V": (V_r, V_c, "lbf", "shear")}
    for key, (req, avail, _dim, what) in pairs.items():
        if (req is None) != (avail is None):
            raise CheckInputError(f"{key}_r / {key}_c", (req, avail), f"both the required and the available {what} strength (or neither)")
    calc = Calc(sh, suffix)
    sh.heading(f"Combined torsion, shear, flexure and axial force{f' [{suffix}]' if suffix else ''}", 2)
    calc.given("T_r_tor", T_r, "Required torsional strength", dim="lbf*in", allow_negative=True, allow_zero=True)
    calc.given("T_c_tor", T_c, "Available torsional strength", dim="lbf*in")
    terms: dict[str, str] = {}
    for key, (req, avail, dim, what) in pairs.items():
        if req is None:
            terms[key] = "0"
            continue
        calc.given(f"{key}_r", req, f"Required {what} strength", dim=dim, allow_negative=True, allow_zero=True)
        calc.given(f"{key}_c", avail, f"Available {what} strength", dim=dim)
        terms[key] = f"abs({key}_r)/{key}_c"
    calc.step("u_T", "abs(T_r_tor)/T_c_tor", "Torsion ratio", ref="AISC 360-16 H3.2")
    calc.step("u_P", terms["P"], "Axial ratio")
    calc.step("u_M", terms["M"], "Flexure ratio")
    calc.step("u_V", terms["V"], "Shear ratio")
    calc.branch(
        "U_H3",
        [("u_T <= 0.2 and u_P >= 0.2", "u_P + 8/9*u_M", "T_r <= 0.2 T_c: torsion neglected, Eq. H1-1a"),
         ("u_T <= 0.2", "u_P/2 + u_M", "T_r <= 0.2 T_c: torsion neglected, Eq. H1-1b"),
         (None, "(u_P + u_M) + (u_V + u_T)**2", "T_r > 0.2 T_c, Eq. H3-6")],
        "Interaction ratio",
        ref="AISC 360-16 H3.2",
    )
    calc.given("U_lim", 1.0, "Interaction limit", "AISC 360-16 H3.2", dim="")
    return calc.check("Torsion + shear + flexure + axial interaction", "U_H3", "U_lim", key="ratio_H3", ref="AISC 360-16 Eq. H3-6")
