"""Fillet welds, AISC 360-16 J2.2b and J2.4, and stitch (intermittent) welds by shear flow.

Weld strength: R_n = F_nw·A_we with F_nw = 0.60·F_EXX·(1 + 0.50·sin^1.5 θ) (Eqs. J2-4, J2-5),
A_we = 0.707·w·L_e per weld (equal-leg fillet throat); φ = 0.75, Ω = 2.00 (Table J2.5).
Base-metal strength at the weld (J4) is not part of these checks.
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, check_length

__all__ = ["add_fillet_weld_check", "add_stitch_weld_check"]


def _size_rules(calc: Calc) -> None:
    calc.given("w_u", "0.0625 in", "Fillet size increment (1/16 in)", "AISC 360-16 Table J2.4", dim="[length]")


def add_fillet_weld_check(
    sh: Sheet,
    *,
    R: Any,
    w: Any,
    L: Any,
    t_p: Any,
    t_e: Any = None,
    F_EXX: Any = "70 ksi",
    theta: Any = "0 degree",
    n: int = 1,
    end_loaded: bool = False,
    suffix: str = "",
) -> list[str]:
    """Add fillet weld strength, minimum/maximum size and minimum length checks.

    Args:
        sh: Sheet to write on.
        R: Required strength of the weld group (force, ≥ 0).
        w: Fillet leg size.
        L: Length of each weld (> 0).
        t_p: Thinner of the parts joined (for the Table J2.4 minimum size).
        t_e: Thickness of the material along whose edge the weld runs (J2.2b maximum size);
            default ``t_p``.
        F_EXX: Filler metal classification strength (70 ksi for E70XX).
        theta: Angle between the line of action of the load and the weld axis, 0..90 degree.
        n: Number of equal welds sharing ``R`` (e.g. 2 for both sides).
        end_loaded: Apply the J2.2b reduction β for long end-loaded welds (Eq. J2-1).
        suffix: Name suffix.

    Returns:
        Keys of the checks added.
    """
    if not (isinstance(n, int) and not isinstance(n, bool) and n >= 1):
        raise CheckInputError("n", n, "a whole number of welds >= 1")
    calc = Calc(sh, suffix)
    sh.heading(f"Fillet weld{f' [{suffix}]' if suffix else ''}", 2)
    calc.given("R_r", R, "Required strength of the weld group", dim="lbf", allow_zero=True,
               sign_hint="enter the magnitude of the force the welds carry")
    calc.given("w", w, "Fillet weld leg size", dim="[length]")
    check_length(calc, "L_w", L, "Length of each weld")
    calc.given("t_p", t_p, "Thinner part joined", dim="[length]")
    calc.given("t_e", t_e if t_e is not None else t_p, "Thickness of the edge the weld runs along", dim="[length]")
    calc.given("F_EXX", F_EXX, "Filler metal classification strength", "AWS A5.1 E70XX: 70 ksi", dim="ksi")
    th = calc.given("theta", theta, "Load angle to the weld axis", "AISC 360-16 J2.4", dim="degree", allow_zero=True)
    if not 0 <= th.to("degree").magnitude <= 90:
        raise CheckInputError("theta", theta, "an angle from 0 degree (longitudinal) to 90 degree (transverse)")
    calc.given("n_w", n, "Number of welds sharing the load", dim="")
    _size_rules(calc)
    keys = []
    calc.branch(
        "w_min",
        [("t_p <= 4*w_u", "2*w_u", "t <= 1/4 in: 1/8 in"),
         ("t_p <= 8*w_u", "3*w_u", "1/4 < t <= 1/2 in: 3/16 in"),
         ("t_p <= 12*w_u", "4*w_u", "1/2 < t <= 3/4 in: 1/4 in"),
         (None, "5*w_u", "t > 3/4 in: 5/16 in")],
        "Minimum fillet size",
        unit="in",
        ref="AISC 360-16 Table J2.4",
    )
    calc.branch(
        "w_max",
        [("t_e < 4*w_u", "t_e", "edge thinner than 1/4 in: w <= t"), (None, "t_e - w_u", "edge 1/4 in or thicker: w <= t - 1/16 in")],
        "Maximum fillet size along an edge",
        unit="in",
        ref="AISC 360-16 J2.2b(b)",
    )
    calc.step("L_min", "4*w", "Minimum weld length", unit="in", ref="AISC 360-16 J2.2b(c)")
    if end_loaded:
        calc.branch(
            "L_e",
            [("L_w <= 100*w", "L_w", "L <= 100w: beta = 1.0"),
             ("L_w <= 300*w", "(1.2 - 0.002*L_w/w)*L_w", "100w < L <= 300w: beta, Eq. J2-1"),
             (None, "180*w", "L > 300w: L_e = 180w")],
            "Effective length of an end-loaded weld",
            unit="in",
            ref="AISC 360-16 J2.2b(d)",
        )
    else:
        calc.step("L_e", "L_w", "Effective length (not end-loaded)", unit="in", ref="AISC 360-16 J2.2b")
    calc.step("F_nw", "0.60*F_EXX*(1 + 0.5*sin(theta)**1.5)", "Nominal weld stress, directional method", unit="ksi",
              ref="AISC 360-16 Eq. J2-5")
    calc.step("A_we", "n_w*0.707*w*L_e", "Effective throat area of the welds", unit="in^2", ref="AISC 360-16 J2.2a")
    calc.step("R_n", "F_nw*A_we", "Nominal weld strength", unit="kip", ref="AISC 360-16 Eq. J2-4")
    calc.available("R_c", "R_n", "weld", "w", "Available weld strength", unit="kip")
    keys.append(calc.check("Fillet weld strength", "R_r", "R_c", key="ratio_w", ref="AISC 360-16 J2.4"))
    keys.append(calc.check("Fillet size at least the minimum", "w_min", "w", key="ratio_wmin", ref="AISC 360-16 Table J2.4"))
    keys.append(calc.check("Fillet size at most the maximum", "w", "w_max", key="ratio_wmax", ref="AISC 360-16 J2.2b(b)"))
    keys.append(calc.check("Weld length at least 4w", "L_min", "L_w", key="ratio_Lw", ref="AISC 360-16 J2.2b(c)"))
    sh.note("Base metal at the weld (AISC 360-16 J4) is checked separately.")
    return keys


def add_stitch_weld_check(
    sh: Sheet,
    *,
    V: Any,
    Q: Any,
    I: Any,
    w: Any,
    L_seg: Any,
    s: Any,
    n: int = 2,
    F_EXX: Any = "70 ksi",
    suffix: str = "",
) -> list[str]:
    """Add a stitch-weld check for a reinforcing member welded alongside an existing one.

    The shear flow at the interface q = V·Q/I (Q of the added part about the neutral axis of
    the combined section, I of the combined section) is carried by ``n`` lines of intermittent
    fillet welds, segments ``L_seg`` long at pitch ``s`` (centre to centre).

    Returns:
        Keys of the checks added (strength and minimum segment length).
    """
    if not (isinstance(n, int) and not isinstance(n, bool) and n >= 1):
        raise CheckInputError("n", n, "a whole number of weld lines >= 1")
    calc = Calc(sh, suffix)
    sh.heading(f"Stitch welds by shear flow{f' [{suffix}]' if suffix else ''}", 2)
    calc.given("V_r", V, "Required shear at the section", dim="lbf", allow_negative=True, allow_zero=True)
    calc.given("Q_a", Q, "First moment of the added part about the neutral axis", dim="in**3")
    calc.given("I_c", I, "Moment of inertia of the combined section", dim="in**4")
    calc.given("w", w, "Fillet weld leg size", dim="[length]")
    lseg = check_length(calc, "L_seg", L_seg, "Length of each weld segment")
    pitch = check_length(calc, "s", s, "Pitch of the segments (centre to centre)")
    if pitch.to("in").magnitude < lseg.to("in").magnitude:
        raise CheckInputError("s", s, f"a pitch at least the segment length L_seg = {lseg:~} (use a continuous weld otherwise)")
    calc.given("n_l", n, "Number of weld lines", dim="")
    calc.given("F_EXX", F_EXX, "Filler metal classification strength", "AWS A5.1 E70XX: 70 ksi", dim="ksi")
    calc.given("L_abs", "1.5 in", "Absolute minimum segment length", "AISC 360-16 J2.2b(e)", dim="[length]")
    calc.step("q", "abs(V_r)*Q_a/I_c", "Shear flow at the interface", unit="kip/in", ref="q = V*Q/I, common practice")
    calc.step("F_nw", "0.60*F_EXX", "Nominal weld stress (longitudinal, theta = 0)", unit="ksi", ref="AISC 360-16 Eq. J2-5")
    calc.step("r_n", "0.707*w*F_nw", "Nominal strength per unit length of one weld line", unit="kip/in", ref="AISC 360-16 Eq. J2-4")
    calc.available("r_c", "r_n", "weld", "w", "Available strength per unit length", unit="kip/in")
    calc.step("q_c", "n_l*r_c*L_seg/s", "Available shear flow of the stitch pattern", unit="kip/in")
    keys = [calc.check("Stitch welds: shear flow", "q", "q_c", key="ratio_q", ref="AISC 360-16 J2.4")]
    calc.step("L_segmin", "max(4*w, L_abs)", "Minimum segment length", unit="in", ref="AISC 360-16 J2.2b(e)")
    keys.append(calc.check("Stitch segment length", "L_segmin", "L_seg", key="ratio_Lseg", ref="AISC 360-16 J2.2b(e)"))
    sh.note("Maximum stitch spacing rules for built-up compression members (AISC 360-16 E6) are checked separately.")
    return keys
