"""Base plate of a stand leg under uplift with biaxial moment: anchor rod forces and the plate
on the tension side.

Four anchor rods in a square pattern at ``±f`` from the plate centre on both axes. With axial
tension ``N_t`` (uplift, tension +; compression enters as a negative tension) and moments
``M_x``, ``M_y`` about the plate axes, the plate is taken as rigid and carried by the rods alone
(no bearing on the concrete: conservative for the rod forces whenever the leg is in tension,
and an approximation when the leg is in compression). Elastic rod group: the corner rod
carries

    T_1 = N_t/4 + (|M_x| + |M_y|)/(4 f)      (Σy² = 4 f² per axis)

which is the largest rod force for any direction of the moment; at 45° it is √2 M/(4 f).

The plate bends as a cantilever from the leg to the corner rod along the diagonal,
x_r = √2 f - D/2 (D: the leg's outside diameter or, for a square leg, its width), over an
effective width b_eff = 2 x_r (45° spread from the rod, common practice), so with the
available yield stress F_ya = φF_y (0.90) or F_y/Ω (1.67), as in AISC Design Guide 1, 2nd ed.,
Eq. 3.4.7 (from memory):

    t_req = sqrt(4 T_1 x_r/(F_ya b_eff))

Anchorage to the concrete is checked by :func:`calcpad.eng.checks.anchorage.add_anchorage_check`
(give it the group tension ``n_rods*T_r``: every rod at the corner rod's force). Compression
with moment on the same plate (bearing) is :func:`calcpad.eng.checks.base_plate.add_base_plate_check`.
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, add_material, check_length

__all__ = ["add_leg_base_uplift_check"]

_PHI_B, _OMEGA_B = 0.90, 1.67  # plate bending, AISC Design Guide 1


def add_leg_base_uplift_check(
    sh: Sheet,
    *,
    N_t: Any,
    M_x: Any,
    M_y: Any,
    f: Any,
    t_p: Any,
    D_leg: Any,
    material: Any = None,
    F_y: Any = None,
    suffix: str = "",
) -> list[str]:
    """Add the corner rod force and the plate thickness on the tension side of a four-rod leg base.

    Args:
        sh: Sheet to write on.
        N_t: Axial tension in the leg (uplift +; a compression is a negative value).
        M_x, M_y: Moments at the base about the two plate axes (signs do not matter).
        f: Plate centre to each rod line (square pattern 2f x 2f).
        t_p: Plate thickness provided.
        D_leg: Leg outside diameter (or width) at the plate.
        material / F_y: Plate steel.
        suffix: Name suffix.

    Returns:
        Keys of the checks added.
    """
    calc = Calc(sh, suffix)
    sh.heading(f"Leg base plate under uplift and moment{f' [{suffix}]' if suffix else ''}", 2)
    add_material(calc, material, F_y, need_e=False)
    calc.given("N_t", N_t, "Axial tension in the leg (uplift +, compression -)", dim="lbf", allow_negative=True, allow_zero=True)
    calc.given("M_bx", M_x, "Base moment about the plate's x-axis", dim="lbf*in", allow_negative=True, allow_zero=True)
    calc.given("M_by", M_y, "Base moment about the plate's y-axis", dim="lbf*in", allow_negative=True, allow_zero=True)
    check_length(calc, "f_r", f, "Plate centre to each rod line (four rods, square pattern)")
    check_length(calc, "t_p", t_p, "Plate thickness provided")
    check_length(calc, "D_l", D_leg, "Leg outside diameter (or width)")
    calc.step("T_1", "N_t/4 + (abs(M_bx) + abs(M_by))/(4*f_r)", "Force in the corner rod (rigid plate on four rods, no bearing)",
              unit="kip", ref="elastic rod group, common practice")
    calc.branch("T_r", [("T_1 > 0*T_1", "T_1", "the corner rod is in tension"), (None, "0*T_1", "no rod in tension")],
                "Rod tension", unit="kip", ref="elastic rod group, common practice")
    calc.step("x_r", "sqrt(2)*f_r - D_l/2", "Leg face to the corner rod along the diagonal", unit="in",
              ref="AISC Design Guide 1, 3.4 (from memory)")
    if calc.value("x_r", "in") <= 0:
        raise CheckInputError("f", f, "anchor rods outside the leg (sqrt(2) f > D/2)")
    calc.step("b_eff", "2*x_r", "Effective plate width at the leg (45° spread from the rod)", unit="in", ref="common practice")
    calc.available_with("F_ya", "F_y", _PHI_B, _OMEGA_B, "AISC Design Guide 1, 3.1", "p", "Plate yield stress for bending", unit="ksi")
    calc.step("t_req", "sqrt(4*T_r*x_r/(F_ya*b_eff))", "Plate thickness required on the tension side", unit="in",
              ref="AISC Design Guide 1, Eq. 3.4.7 form (from memory)")
    return [calc.check("Base plate thickness, uplift side", "t_req", "t_p", key="ratio_tpu", ref="AISC Design Guide 1, 3.4")]
