"""Flexure, AISC 360-16 Chapter F: F2/F3 (I-shapes, major axis; F2 for compact channels), F4
(doubly symmetric I-shapes with noncompact webs, :mod:`calcpad.eng.checks.flexure_f4`),
F6 (I-shapes and channels, minor axis),
F7 (rectangular HSS), F8 (round HSS), F9 (tees) and F10 (equal-leg angles) via
:mod:`calcpad.eng.checks.flexure_open`, F11 (solid rectangles and rounds).

Available strength ``M_c`` (φ_b·M_n or M_n/Ω_b) is written under that name (plus suffix).
Cases outside these raise :class:`CheckNotCoveredError`.
"""

from __future__ import annotations

import math
from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, CheckNotCoveredError, add_material
from calcpad.eng.checks._section import Sec, resolve_section
from calcpad.eng.checks.classify import write_elements
from calcpad.eng.checks.flexure_f4 import write_f4
from calcpad.eng.checks.flexure_open import write_angle_flexure, write_tee_flexure

__all__ = ["add_flexure_check"]

_MP_NOTE = "Plastic moment"


def add_flexure_check(
    sh: Sheet,
    section: Any,
    *,
    M: Any,
    axis: str = "x",
    L_b: Any = None,
    C_b: Any = 1.0,
    kind: str | None = None,
    material: Any = None,
    F_y: Any = None,
    E: Any = None,
    stem: str | None = None,
    toe: str | None = None,
    restraint: str = "none",
    suffix: str = "",
) -> str:
    """Add the flexural strength check of a member about one axis.

    Args:
        sh: Sheet to write on.
        section: Shape or property mapping.
        M: Required flexural strength M_r (its sign is the bending direction; magnitude used).
        axis: ``"x"`` (major for W, depth direction for HSS) or ``"y"``; for equal-leg angles
            also ``"w"`` (major principal axis) or ``"z"`` (minor principal axis, F10).
        L_b: Unbraced length of the compression flange (> 0); ``None`` = continuously braced
            (lateral-torsional buckling does not apply).
        C_b: Lateral-torsional buckling modification factor (1.0 is conservative), F1.
        material / F_y / E: Material or values.
        stem: Tees: ``"tension"`` (flange compressed) or ``"compression"``; default the
            latter (lower strength), stated on the sheet.
        toe: Equal-leg angles: ``"compression"`` or ``"tension"`` for the toe of the leg
            perpendicular to the bending axis (about ``"z"``: the toes against the heel);
            default compression, stated on the sheet. About ``"w"`` one toe is always compressed.
        restraint: Equal-leg angles with ``L_b``: ``"none"`` or ``"at max moment"``
            (F10.2(ii)(b)); leave ``L_b`` out for continuous restraint.
        suffix: Name suffix.

    Returns:
        Key of the check. The available strength is ``M_c`` (+ suffix); about y the step names
        carry ``_y`` (``M_c_y``).
    """
    if axis not in ("x", "y", "w", "z"):
        raise CheckInputError("axis", axis, "'x' or 'y' (or 'w'/'z', the principal axes of an equal-leg angle)")
    calc = Calc(sh, suffix, "" if axis == "x" else axis)
    sec = resolve_section(section, kind)
    if axis in ("w", "z") and sec.kind != "angle":
        raise CheckInputError("axis", axis, "'x' or 'y': principal axes 'w'/'z' are for single angles")
    _check_open_options(sec, stem, toe, restraint, axis)
    if sec.kind == "tee" and axis != "x":
        raise CheckNotCoveredError("axis", axis, "tees bent in their plane of symmetry (axis='x', AISC 360-16 F9); bending about y is not covered")
    if sec.kind == "angle" and axis in ("x", "y") and not math.isclose(sec.need("d", "F10"), sec.need("b", "F10"), rel_tol=1e-9):
        raise CheckNotCoveredError("section", sec.label, "equal-leg angles about a geometric axis; an unequal-leg angle bends about "
                                   "its principal axes (AISC 360-16 F10.2(iii)): resolve the moment and use axis='w' and axis='z'")
    sh.heading(f"Flexure about {axis}, {sec.label}{f' [{suffix}]' if suffix else ''}", 2)
    add_material(calc, material, F_y, E)
    calc.given("M_r", M, "Required flexural strength", dim="lbf*in", allow_negative=True)
    if L_b is not None:
        calc.given("L_b", L_b, "Unbraced length of the compression flange", dim="[length]", shared=True,
                   sign_hint="a length measured along the member, > 0")
        cb = calc.given("C_b", C_b, "Lateral-torsional buckling modification factor", "AISC 360-16 F1", dim="", shared=True)
        if not 1.0 <= float(cb.magnitude) <= 3.0:
            raise CheckInputError("C_b", C_b, "a factor from 1.0 to 3.0 (AISC 360-16 Eq. F1-1 gives at most 3.0)")
    fy, e = calc.value("F_y", "ksi"), calc.value("E", "ksi")
    if sec.kind == "tee":
        write_tee_flexure(calc, sec, L_b is not None, stem)
    elif sec.kind == "angle":
        write_angle_flexure(calc, sec, axis, L_b is not None, toe, restraint)
    else:
        {"i_shape": _i_shape, "channel": _i_shape, "rect_hss": _rect_hss, "round_hss": _round_hss, "rect_bar": _bar, "round_bar": _bar}[sec.kind](
            calc, sec, axis, L_b is not None, fy, e
        )
    calc.available("M_c", "M_n", "flexure", "b", "Available flexural strength", unit="kip*ft")
    return calc.check(f"Flexure about {axis}", "M_r", "M_c", key="ratio_b", ref="AISC 360-16 F1")


def _check_open_options(sec: Sec, stem: str | None, toe: str | None, restraint: str, axis: str = "x") -> None:
    """Validate the tee / angle options before anything is written."""
    if sec.kind == "angle" and axis == "w":
        if toe is not None and toe not in ("long", "short"):
            raise CheckInputError("toe", toe, "'long' or 'short': the leg whose toe is in compression (bending about w)")
        if restraint != "none":
            raise CheckInputError("restraint", restraint, "'none' about w (leave L_b out for continuous restraint)")
        return
    if stem is not None and (sec.kind != "tee" or stem not in ("tension", "compression")):
        expected = "'tension' (flange in compression) or 'compression' (stem tip in compression)" if sec.kind == "tee" else \
            "nothing: it applies to tees only"
        raise CheckInputError("stem", stem, expected)
    if toe is not None and (sec.kind != "angle" or toe not in ("compression", "tension")):
        expected = "'compression' or 'tension' (the toe of the leg perpendicular to the bending axis)" if sec.kind == "angle" else \
            "nothing: it applies to single angles only"
        raise CheckInputError("toe", toe, expected)
    if restraint != "none" and (sec.kind != "angle" or restraint != "at max moment"):
        expected = "'none' or 'at max moment' (leave L_b out for continuous restraint)" if sec.kind == "angle" else \
            "nothing: it applies to single angles only"
        raise CheckInputError("restraint", restraint, expected)


def _zs(calc: Calc, sec: Sec, axis: str) -> None:
    calc.prop("Z", sec.need(f"Z{axis}", "flexure"), "in**3", f"Plastic section modulus about {axis}", sec)
    calc.prop("S", sec.need(f"S{axis}", "flexure"), "in**3", f"Elastic section modulus about {axis}", sec)


def _i_shape(calc: Calc, sec: Sec, axis: str, braced_len: bool, fy: float, e: float) -> None:
    """I-shapes (F2, F3, F6) and channels (F2 when compact, F6)."""
    channel = sec.kind == "channel"
    noncompact_web = axis == "x" and sec.need("h_tw", "F2") > 3.76 * math.sqrt(e / fy)
    if noncompact_web and (channel or sec.need("h_tw", "F4") > 5.70 * math.sqrt(e / fy)):
        raise CheckNotCoveredError("web h/tw", round(sec.need("h_tw", "F2"), 2), "I-shapes with compact or noncompact webs (F2-F4) "
                                   "and channels with compact webs; slender webs (AISC 360-16 F5) are not covered")
    if axis == "x" and channel and sec.need("bf_tf", "F2") > 0.38 * math.sqrt(e / fy):
        raise CheckNotCoveredError("flange bf/tf", round(sec.need("bf_tf", "F2"), 2), "channels with compact flanges (AISC 360-16 F2; "
                                   "F3 covers I-shapes only)")
    _zs(calc, sec, axis)
    write_elements(calc, sec, "flexure", "x")
    if axis == "y":
        calc.step("M_p", "min(F_y*Z, 1.6*F_y*S)", _MP_NOTE + " (minor axis)", unit="kip*ft", ref="AISC 360-16 Eq. F6-1")
        calc.branch(
            "M_n_FLB",
            [("lambda_f <= lambda_pf", "M_p", "compact flanges, no flange local buckling"),
             ("lambda_f <= lambda_rf", "M_p - (M_p - 0.7*F_y*S)*(lambda_f - lambda_pf)/(lambda_rf - lambda_pf)", "noncompact flanges, Eq. F6-2"),
             (None, "0.69*E/lambda_f**2*S", "slender flanges, Eqs. F6-3, F6-4")],
            "Flange local buckling",
            unit="kip*ft",
            ref="AISC 360-16 F6.2",
        )
        calc.select("M_n", "min", {"M_p": "yielding (F6-1)", "M_n_FLB": "flange local buckling (F6.2)"}, "Nominal flexural strength", unit="kip*ft")
        return
    if noncompact_web:
        write_f4(calc, sec, braced_len)
        return
    calc.step("M_p", "F_y*Z", _MP_NOTE, unit="kip*ft", ref="AISC 360-16 Eq. F2-1")
    if channel:
        cands = {"M_p": "yielding (F2-1)"}
        calc.sh.note("Compact channel flanges: flange local buckling does not limit the strength (AISC 360-16 F2).")
        if braced_len:
            _ltb_f2(calc, sec, channel=True)
            cands["M_n_LTB"] = "lateral-torsional buckling (F2.2)"
        else:
            calc.sh.note("Compression flange continuously braced: lateral-torsional buckling (F2.2) does not apply.")
        calc.select("M_n", "min", cands, "Nominal flexural strength", unit="kip*ft")
        return
    calc.branch(
        "M_n_FLB",
        [("lambda_f <= lambda_pf", "M_p", "compact flanges, no flange local buckling"),
         ("lambda_f <= lambda_rf", "M_p - (M_p - 0.7*F_y*S)*(lambda_f - lambda_pf)/(lambda_rf - lambda_pf)", "noncompact flanges, Eq. F3-1"),
         (None, "0.9*E*min(max(4/sqrt(lambda_w), 0.35), 0.76)*S/lambda_f**2", "slender flanges, Eq. F3-2 (k_c = 4/sqrt(h/tw), 0.35..0.76)")],
        "Flange local buckling",
        unit="kip*ft",
        ref="AISC 360-16 F3.2",
    )
    cands = {"M_p": "yielding (F2-1)", "M_n_FLB": "flange local buckling (F3)"}
    if braced_len:
        _ltb_f2(calc, sec, channel=False)
        cands["M_n_LTB"] = "lateral-torsional buckling (F2.2)"
    else:
        calc.sh.note("Compression flange continuously braced: lateral-torsional buckling (F2.2) does not apply.")
    calc.select("M_n", "min", cands, "Nominal flexural strength", unit="kip*ft")


def _ltb_f2(calc: Calc, sec: Sec, *, channel: bool) -> None:
    """Lateral-torsional buckling of F2.2: c = 1 for I-shapes, Eq. F2-8b for channels."""
    d, tf = sec.need("d", "F2"), sec.need("tf", "F2")
    calc.prop("r_y", sec.need("ry", "F2"), "in", "Radius of gyration about y", sec)
    calc.prop("I_y", sec.need("Iy", "F2"), "in**4", "Moment of inertia about y", sec)
    calc.prop("J", sec.need("J", "F2"), "in**4", "Torsional constant", sec)
    calc.prop("h_o", d - tf, "in", "Distance between flange centroids, d - tf", sec)
    if channel:
        calc.prop("C_w", sec.need("Cw", "F2"), "in**6", "Warping constant", sec, shared=True)
        calc.step("c", "h_o/2*sqrt(I_y/C_w)", "Factor c for channels", ref="AISC 360-16 Eq. F2-8b")
        jc, note = "J*c", ""
    elif sec.get("Cw") is not None:
        calc.prop("C_w", sec.need("Cw", "F2"), "in**6", "Warping constant", sec, shared=True)
        jc, note = "J", " (c = 1)"
    else:
        calc.step_once("C_w", "I_y*h_o**2/4", "Warping constant, doubly symmetric I", unit="in^6", ref="AISC 360-16 F2 User Note")
        jc, note = "J", " (c = 1)"
    calc.step("r_ts", "sqrt(sqrt(I_y*C_w)/S)", "Effective radius of gyration", unit="in", ref="AISC 360-16 Eq. F2-7")
    calc.step("L_p", "1.76*r_y*sqrt(E/F_y)", "Limiting length, yielding", unit="ft", ref="AISC 360-16 Eq. F2-5")
    calc.step("L_r", f"1.95*r_ts*E/(0.7*F_y)*sqrt({jc}/(S*h_o) + sqrt(({jc}/(S*h_o))**2 + 6.76*(0.7*F_y/E)**2))",
              f"Limiting length, inelastic LTB{note}", unit="ft", ref="AISC 360-16 Eq. F2-6")
    calc.step("F_cr_LTB", f"C_b*pi**2*E/(L_b/r_ts)**2*sqrt(1 + 0.078*{jc}/(S*h_o)*(L_b/r_ts)**2)", f"Elastic LTB stress{note}",
              unit="ksi", ref="AISC 360-16 Eq. F2-4")
    calc.branch(
        "M_n_LTB",
        [("L_b <= L_p", "M_p", "L_b <= L_p, no lateral-torsional buckling"),
         ("L_b <= L_r", "min(C_b*(M_p - (M_p - 0.7*F_y*S)*(L_b - L_p)/(L_r - L_p)), M_p)", "inelastic LTB, Eq. F2-2"),
         (None, "min(F_cr_LTB*S, M_p)", "elastic LTB, Eq. F2-3")],
        "Lateral-torsional buckling",
        unit="kip*ft",
        ref="AISC 360-16 F2.2",
    )


def _rect_hss(calc: Calc, sec: Sec, axis: str, braced_len: bool, fy: float, e: float) -> None:
    web = "h_t" if axis == "x" else "b_t"
    if sec.need(web, "F7") > 5.70 * math.sqrt(e / fy):
        raise CheckNotCoveredError("web h/t", round(sec.need(web, "F7"), 2), "rectangular HSS with slender webs "
                                   "(AISC 360-16 F7.3(c)) are not covered")
    _zs(calc, sec, axis)
    write_elements(calc, sec, "flexure", axis)
    depth = sec.need("H" if axis == "x" else "B", "F7")
    calc.prop("A", sec.need("A", "F7"), "in**2", "Gross area", sec, shared=True)
    calc.prop("I", sec.need(f"I{axis}", "F7"), "in**4", f"Moment of inertia about {axis}", sec)
    calc.prop("t", sec.need("t", "F7"), "in", "Design wall thickness", sec, shared=True)
    calc.prop("h_b", depth, "in", "Outside depth perpendicular to the axis", sec)
    calc.step("M_p", "F_y*Z", _MP_NOTE, unit="kip*ft", ref="AISC 360-16 Eq. F7-1")
    calc.step("b", "lambda_f*t", "Flat width of the compression flange", unit="in")
    calc.step("b_e", "min(1.92*t*sqrt(E/F_y)*(1 - 0.38/lambda_f*sqrt(E/F_y)), b)",
              "Effective width of the compression flange (used if slender)", unit="in", ref="AISC 360-16 Eq. F7-4")
    calc.step("A_x", "(b - b_e)*t", "Ineffective flange area", unit="in^2", quiet=True)
    calc.step("y_s", "A_x*(h_b - t)/2/(A - A_x)", "Shift of the neutral axis towards the tension flange", unit="in", quiet=True)
    calc.step("I_e", "I - A_x*((h_b - t)/2)**2 - (A - A_x)*y_s**2", "Moment of inertia of the effective section", unit="in^4")
    calc.step("S_e", "I_e/(h_b/2 + y_s)", "Effective section modulus (tension fibre, least)", unit="in^3", ref="AISC 360-16 F7.2(c)")
    calc.branch(
        "M_n_FLB",
        [("lambda_f <= lambda_pf", "M_p", "compact flanges, no flange local buckling"),
         ("lambda_f <= lambda_rf", "min(M_p - (M_p - F_y*S)*(3.57*lambda_f*sqrt(F_y/E) - 4.0), M_p)", "noncompact flanges, Eq. F7-2"),
         (None, "F_y*S_e", "slender flanges, Eq. F7-3")],
        "Flange local buckling",
        unit="kip*ft",
        ref="AISC 360-16 F7.2",
    )
    calc.branch(
        "M_n_WLB",
        [("lambda_w <= lambda_pw", "M_p", "compact webs, no web local buckling"),
         (None, "min(M_p - (M_p - F_y*S)*(0.305*lambda_w*sqrt(F_y/E) - 0.738), M_p)", "noncompact webs, Eq. F7-5")],
        "Web local buckling",
        unit="kip*ft",
        ref="AISC 360-16 F7.3",
    )
    cands = {"M_p": "yielding (F7-1)", "M_n_FLB": "flange local buckling (F7.2)", "M_n_WLB": "web local buckling (F7.3)"}
    other = sec.need("B" if axis == "x" else "H", "F7")
    if braced_len and depth > other:
        calc.prop("r_y", sec.need("ry" if axis == "x" else "rx", "F7"), "in", "Radius of gyration about the minor axis", sec)
        calc.prop("J", sec.need("J", "F7"), "in**4", "Torsional constant", sec, shared=True)
        calc.step("L_p", "0.13*E*r_y*sqrt(J*A)/M_p", "Limiting length, yielding", unit="ft", ref="AISC 360-16 Eq. F7-12")
        calc.step("L_r", "2*E*r_y*sqrt(J*A)/(0.7*F_y*S)", "Limiting length, inelastic LTB", unit="ft", ref="AISC 360-16 Eq. F7-13")
        calc.branch(
            "M_n_LTB",
            [("L_b <= L_p", "M_p", "L_b <= L_p, no lateral-torsional buckling"),
             ("L_b <= L_r", "min(C_b*(M_p - (M_p - 0.7*F_y*S)*(L_b - L_p)/(L_r - L_p)), M_p)", "inelastic LTB, Eq. F7-10"),
             (None, "min(2*E*C_b*sqrt(J*A)/(L_b/r_y), M_p)", "elastic LTB, Eq. F7-11")],
            "Lateral-torsional buckling",
            unit="kip*ft",
            ref="AISC 360-16 F7.4",
        )
        cands["M_n_LTB"] = "lateral-torsional buckling (F7.4)"
    calc.select("M_n", "min", cands, "Nominal flexural strength", unit="kip*ft")


def _round_hss(calc: Calc, sec: Sec, axis: str, _braced: bool, fy: float, e: float) -> None:
    d_t = sec.need("D_t", "F8")
    if d_t > 0.45 * e / fy:
        raise CheckNotCoveredError("D/t", round(d_t, 2), f"round HSS with D/t <= 0.45E/Fy = {0.45 * e / fy:.1f} (AISC 360-16 F8)")
    _zs(calc, sec, axis)
    write_elements(calc, sec, "flexure", axis)
    calc.step("M_p", "F_y*Z", _MP_NOTE, unit="kip*ft", ref="AISC 360-16 Eq. F8-1")
    calc.step("F_cr_LB", "0.33*E/lambda_D", "Local buckling stress (used if slender)", unit="ksi", ref="AISC 360-16 Eq. F8-4")
    calc.branch(
        "M_n_LB",
        [("lambda_D <= lambda_pD", "M_p", "compact wall, no local buckling"),
         ("lambda_D <= lambda_rD", "(0.021*E/lambda_D + F_y)*S", "noncompact wall, Eq. F8-2"),
         (None, "F_cr_LB*S", "slender wall, Eq. F8-3")],
        "Local buckling",
        unit="kip*ft",
        ref="AISC 360-16 F8.2",
    )
    calc.select("M_n", "min", {"M_p": "yielding (F8-1)", "M_n_LB": "local buckling (F8.2)"}, "Nominal flexural strength", unit="kip*ft")


def _bar(calc: Calc, sec: Sec, axis: str, braced_len: bool, _fy: float, _e: float) -> None:
    _zs(calc, sec, axis)
    calc.step("M_p", "min(F_y*Z, 1.6*F_y*S)", "Yielding", unit="kip*ft", ref="AISC 360-16 Eq. F11-1")
    cands = {"M_p": "yielding (F11-1)"}
    if sec.kind == "rect_bar" and braced_len:
        d, t = (sec.need("H", "F11"), sec.need("B", "F11")) if axis == "x" else (sec.need("B", "F11"), sec.need("H", "F11"))
        if d > t:
            calc.prop("d", d, "in", "Depth of the bar (in the plane of bending)", sec)
            calc.prop("t", t, "in", "Width of the bar (perpendicular to the plane of bending)", sec)
            calc.step("M_y", "F_y*S", "Yield moment", unit="kip*ft")
            calc.step("lambda_b", "L_b*d/t**2", "LTB slenderness of the bar", ref="AISC 360-16 F11.2")
            calc.branch(
                "M_n_LTB",
                [("lambda_b <= 0.08*E/F_y", "M_p", "L_b*d/t^2 <= 0.08E/Fy, no lateral-torsional buckling"),
                 ("lambda_b <= 1.9*E/F_y", "min(C_b*(1.52 - 0.274*lambda_b*F_y/E)*M_y, M_p)", "inelastic LTB, Eq. F11-2"),
                 (None, "min(1.9*E*C_b/lambda_b*S, M_p)", "elastic LTB, Eqs. F11-3, F11-4")],
                "Lateral-torsional buckling",
                unit="kip*ft",
                ref="AISC 360-16 F11.2",
            )
            cands["M_n_LTB"] = "lateral-torsional buckling (F11.2)"
    calc.select("M_n", "min", cands, "Nominal flexural strength", unit="kip*ft")
