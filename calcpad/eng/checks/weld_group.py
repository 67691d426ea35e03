"""Eccentrically loaded fillet weld group by the elastic method (welds treated as lines):
a bracket or tab welded to a post with a vertical load P at an eccentricity e from the weld
group's centroid, and an optional horizontal load H through the centroid.

    f = sqrt((H/L + M*c_y/I_p)^2 + (P/L + M*c_x/I_p)^2),   M = P*e

taken at the corner of the group farthest from its centroid in each direction (the elastic
method of steel design textbooks, common practice). It is conservative against the
instantaneous-centre method of AISC 360-16 J2.4(b) / Manual Part 8 tables, which are not used
here. The line strength is φ·0.60·F_EXX·0.707·w (Eq. J2-4 with θ = 0, no directional increase).

Shapes (lines, dimensions to the weld lines): ``"line"`` (one vertical weld, length d),
``"two_lines"`` (two vertical welds d long, b apart), ``"box"`` (b wide, d deep, all round),
``"c"`` (vertical weld d with horizontal returns b at top and bottom, open towards the load).
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, check_length

__all__ = ["WELD_GROUP_SHAPES", "add_weld_group_check"]

#: Shape -> (L, x̄ from the left line, I_x, I_y, c_x, c_y) as formulas in d and b (lines).
WELD_GROUP_SHAPES: dict[str, tuple[str, str, str, str, str, str]] = {
    "line": ("d", "0*d", "d**3/12", "0*d**3", "0*d", "d/2"),
    "two_lines": ("2*d", "b/2", "2*d**3/12", "2*d*(b/2)**2", "b/2", "d/2"),
    "box": ("2*b + 2*d", "b/2", "2*d**3/12 + 2*b*(d/2)**2", "2*b**3/12 + 2*d*(b/2)**2", "b/2", "d/2"),
    "c": ("d + 2*b", "b**2/(2*b + d)", "d**3/12 + 2*b*(d/2)**2", "2*b**3/12 + 2*b*(b/2 - x_bar)**2 + d*x_bar**2",
          "max(b - x_bar, x_bar)", "d/2"),
}


def add_weld_group_check(
    sh: Sheet,
    *,
    shape: str,
    d: Any,
    P: Any,
    e: Any,
    w: Any,
    b: Any = None,
    H: Any = "0 kip",
    F_EXX: Any = "70 ksi",
    suffix: str = "",
) -> str:
    """Add the elastic-method check of an eccentrically loaded weld group.

    Args:
        sh: Sheet to write on.
        shape: ``"line"``, ``"two_lines"``, ``"box"`` or ``"c"`` (see the module docstring).
        d: Depth of the group (vertical weld length), > 0.
        P: Vertical load (magnitude used).
        e: Eccentricity of P from the weld group's centroid (horizontal), ≥ 0.
        w: Fillet weld leg size.
        b: Width of the group (spacing of the lines or length of the returns); not for ``"line"``.
        H: Horizontal load through the centroid (magnitude used).
        F_EXX: Filler metal classification strength.
        suffix: Name suffix.

    Returns:
        Key of the check.
    """
    if not isinstance(shape, str) or shape not in WELD_GROUP_SHAPES:
        raise CheckInputError("shape", shape, "one of " + ", ".join(repr(k) for k in WELD_GROUP_SHAPES))
    if (shape == "line") != (b is None):
        raise CheckInputError("b", b, "no width for a single line" if shape == "line" else f"the group width for shape {shape!r}")
    calc = Calc(sh, suffix)
    sh.heading(f"Weld group, elastic method ({shape.replace('_', ' ')}){f' [{suffix}]' if suffix else ''}", 2)
    check_length(calc, "d", d, "Depth of the weld group (vertical welds)")
    if b is not None:
        check_length(calc, "b", b, "Width of the weld group")
    calc.given("P_r", P, "Vertical load on the group", dim="lbf", allow_negative=True, allow_zero=True)
    calc.given("e", e, "Eccentricity of P from the group's centroid", dim="[length]", allow_zero=True)
    calc.given("H_r", H, "Horizontal load through the centroid", dim="lbf", allow_negative=True, allow_zero=True)
    calc.given("w", w, "Fillet weld leg size", dim="[length]")
    calc.given("F_EXX", F_EXX, "Filler metal classification strength", "AWS A5.1 E70XX: 70 ksi", dim="ksi")
    L, xbar, ix, iy, cx, cy = WELD_GROUP_SHAPES[shape]
    ref = "elastic method, weld as a line (common practice)"
    calc.step("L_w", L, "Total weld length", unit="in", ref=ref)
    if shape == "c":
        calc.step("x_bar", xbar, "Centroid from the vertical weld", unit="in", ref=ref)
    calc.step("I_xw", ix, "Moment of inertia of the lines about x (per unit throat)", unit="in^3", ref=ref)
    calc.step("I_yw", iy, "Moment of inertia of the lines about y (per unit throat)", unit="in^3", ref=ref)
    calc.step("I_pw", "I_xw + I_yw", "Polar moment of inertia of the lines", unit="in^3", ref=ref)
    calc.step("c_x", cx, "Horizontal distance, centroid to the critical corner", unit="in")
    calc.step("c_y", cy, "Vertical distance, centroid to the critical corner", unit="in")
    calc.step("M_w", "abs(P_r)*e", "Moment on the group about its centroid", unit="kip*in")
    calc.step("f_h", "abs(H_r)/L_w + M_w*c_y/I_pw", "Horizontal force per unit length at the corner", unit="kip/in", ref=ref)
    calc.step("f_v", "abs(P_r)/L_w + M_w*c_x/I_pw", "Vertical force per unit length at the corner", unit="kip/in", ref=ref)
    calc.step("f_r", "sqrt(f_h**2 + f_v**2)", "Resultant force per unit length", unit="kip/in", ref=ref)
    calc.step("r_n", "0.60*F_EXX*0.707*w", "Nominal strength per unit length of weld", unit="kip/in", ref="AISC 360-16 Eqs. J2-4, J2-5 (theta = 0)")
    calc.available("r_c", "r_n", "weld", "w", "Available strength per unit length", unit="kip/in")
    return calc.check("Weld group (elastic method)", "f_r", "r_c", key="ratio_wg", ref="AISC 360-16 J2.4")
