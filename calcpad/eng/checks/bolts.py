"""Bolts in a bearing-type connection, AISC 360-16 J3: shear of the bolts (J3.6), bearing and
tearout at the holes (J3.10), minimum spacing (J3.3) and edge distance (Table J3.4).

One line of ``n`` bolts in standard holes along the load (a brace or strap end, a splice): the
end bolt tears out towards the edge, the others towards the next hole. Slip-critical
connections (J3.8), combined tension and shear (J3.7) and block shear (J4.3) are not part of
this check.
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.core.units import parse_quantity
from calcpad.eng.checks._common import Calc, CheckInputError, check_length

__all__ = ["BOLT_GRADES", "add_bolt_line_check"]

#: Nominal shear stress F_nv (ksi) by grade and threads, AISC 360-16 Table J3.2 (from memory).
BOLT_GRADES: dict[tuple[str, str], float] = {
    ("A307", "N"): 27.0,
    ("A325", "N"): 54.0,
    ("A325", "X"): 68.0,
    ("A490", "N"): 68.0,
    ("A490", "X"): 84.0,
}

#: Minimum edge distance by bolt diameter (in -> in), AISC 360-16 Table J3.4 (from memory).
_MIN_EDGE = {0.5: 0.75, 0.625: 0.875, 0.75: 1.0, 0.875: 1.125, 1.0: 1.25, 1.125: 1.5, 1.25: 1.625}


def add_bolt_line_check(
    sh: Sheet,
    *,
    R: Any,
    d_b: Any,
    n: int,
    t: Any,
    F_u: Any,
    s: Any = "3 in",
    L_e: Any = "1.5 in",
    grade: str = "A325",
    threads: str = "N",
    shear_planes: int = 1,
    suffix: str = "",
) -> list[str]:
    """Add bolt shear, bearing/tearout, spacing and edge-distance checks for one line of bolts.

    Args:
        sh: Sheet to write on.
        R: Required strength of the connection (force along the line of bolts, ≥ 0).
        d_b: Nominal bolt diameter (1/2 in to 1-1/4 in).
        n: Number of bolts in the line (≥ 1).
        t: Thickness of the connected part checked for bearing (the thinner ply, or the sum of
            plies bearing in the same direction).
        F_u: Tensile strength of that part.
        s: Bolt spacing, centre to centre, along the load.
        L_e: Edge distance from the end bolt's centre to the edge, along the load.
        grade: ``"A307"``, ``"A325"`` or ``"A490"`` (Group A/B per ASTM F3125).
        threads: ``"N"`` (threads included in the shear plane) or ``"X"`` (excluded).
        shear_planes: 1 (single shear) or 2 (double shear).
        suffix: Name suffix.

    Returns:
        Keys of the checks added.
    """
    if not (isinstance(n, int) and not isinstance(n, bool) and n >= 1):
        raise CheckInputError("n", n, "a whole number of bolts >= 1")
    if not (isinstance(shear_planes, int) and not isinstance(shear_planes, bool) and shear_planes in (1, 2)):
        raise CheckInputError("shear_planes", shear_planes, "1 (single shear) or 2 (double shear)")
    key = (str(grade).upper().replace(" ", ""), str(threads).upper())
    if key not in BOLT_GRADES:
        raise CheckInputError("grade / threads", (grade, threads), "one of " + ", ".join(f"{g}-{th}" for g, th in BOLT_GRADES))
    calc = Calc(sh, suffix)
    db = sh[d_b] if isinstance(d_b, str) and d_b in sh else parse_quantity(d_b, "d_b", expected="[length]")
    d_in = float(db.to("in").magnitude)
    if not 0.5 - 1e-9 <= d_in <= 1.25 + 1e-9:
        raise CheckInputError("d_b", d_b, "a bolt diameter from 1/2 in to 1-1/4 in (AISC 360-16 Table J3.4)")
    sh.heading(f"Bolts, one line of {n}{f' [{suffix}]' if suffix else ''}", 2)
    calc.given("d_b", d_b, "Nominal bolt diameter", dim="[length]")
    calc.given("R_r", R, "Required strength of the connection", dim="lbf", allow_zero=True,
               sign_hint="enter the magnitude of the force the bolts carry")
    calc.given("n_b", n, "Number of bolts in the line", dim="")
    calc.given("n_s", shear_planes, "Shear planes per bolt", dim="")
    calc.given("t_p", t, "Thickness of the part in bearing", dim="[length]")
    calc.given("F_up", F_u, "Tensile strength of the part in bearing", dim="ksi")
    check_length(calc, "s_b", s, "Bolt spacing along the load")
    check_length(calc, "L_e", L_e, "Edge distance of the end bolt along the load")
    calc.given("F_nv", f"{BOLT_GRADES[key]!r} ksi", f"Nominal shear stress, {key[0]}-{key[1]}", "AISC 360-16 Table J3.2", dim="ksi")
    calc.step("A_b", "pi/4*d_b**2", "Nominal bolt area", unit="in^2", ref="AISC 360-16 J3.6")
    calc.given("d_hx", "0.0625 in" if d_in < 1.0 - 1e-9 else "0.125 in", "Standard hole oversize (1/16 in below 1 in bolts, else 1/8 in)",
               "AISC 360-16 Table J3.3", dim="[length]")
    calc.step("d_h", "d_b + d_hx", "Standard hole diameter", unit="in", ref="AISC 360-16 Table J3.3")
    keys = []
    calc.step("R_nv", "n_b*n_s*F_nv*A_b", "Nominal shear strength of the bolts", unit="kip", ref="AISC 360-16 Eq. J3-1")
    calc.available_with("R_cv", "R_nv", 0.75, 2.00, "AISC 360-16 J3.6", "bv", "Available bolt shear strength", unit="kip")
    keys.append(calc.check("Bolt shear", "R_r", "R_cv", key="ratio_bv", ref="AISC 360-16 J3.6"))
    calc.step("l_c1", "L_e - d_h/2", "Clear distance, end bolt to the edge", unit="in", ref="AISC 360-16 J3.10")
    calc.step("l_c2", "s_b - d_h", "Clear distance between holes", unit="in", ref="AISC 360-16 J3.10")
    calc.step("r_n1", "min(1.2*l_c1*t_p*F_up, 2.4*d_b*t_p*F_up)", "Bearing/tearout, end bolt", unit="kip",
              ref="AISC 360-16 Eqs. J3-6a, J3-6c")
    calc.step("r_n2", "min(1.2*l_c2*t_p*F_up, 2.4*d_b*t_p*F_up)", "Bearing/tearout, each other bolt", unit="kip",
              ref="AISC 360-16 Eqs. J3-6a, J3-6c")
    calc.step("R_nb", "r_n1 + (n_b - 1)*r_n2", "Nominal bearing/tearout strength of the line", unit="kip", ref="AISC 360-16 J3.10")
    calc.available_with("R_cb", "R_nb", 0.75, 2.00, "AISC 360-16 J3.10", "bb", "Available bearing/tearout strength", unit="kip")
    keys.append(calc.check("Bearing and tearout at the holes", "R_r", "R_cb", key="ratio_bb", ref="AISC 360-16 J3.10"))
    if n > 1:
        calc.step("s_min", "8/3*d_b", "Minimum spacing, 2-2/3 d (3d preferred)", unit="in", ref="AISC 360-16 J3.3")
        keys.append(calc.check("Bolt spacing at least 2-2/3 d", "s_min", "s_b", key="ratio_bs", ref="AISC 360-16 J3.3"))
    edge = min((v for k, v in _MIN_EDGE.items() if k >= d_in - 1e-9), default=1.25 * d_in)
    calc.given("L_emin", f"{edge!r} in", "Minimum edge distance", "AISC 360-16 Table J3.4", dim="[length]")
    keys.append(calc.check("Edge distance at least the minimum", "L_emin", "L_e", key="ratio_be", ref="AISC 360-16 Table J3.4"))
    sh.note("Bearing uses 2.4 d t F_u (deformation at the holes at service load is a design consideration, J3.10(a)(1)); "
            "block shear (J4.3) and the connected members are checked separately.")
    return keys
