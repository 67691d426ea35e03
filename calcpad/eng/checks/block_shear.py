"""Block shear rupture, AISC 360-16 J4.3 (Eq. J4-5), for a connected element: shear planes
along the bolt lines or welds and a tension plane across their ends.

R_n = 0.60 F_u A_nv + U_bs F_u A_nt <= 0.60 F_y A_gv + U_bs F_u A_nt, φ = 0.75, Ω = 2.00;
U_bs = 1 for uniform tension stress (0.5 where it is not uniform, e.g. several rows of bolts
with the load off their centre).
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError

__all__ = ["add_block_shear_check"]


def add_block_shear_check(
    sh: Sheet,
    *,
    R: Any,
    A_gv: Any,
    A_nt: Any,
    F_y: Any,
    F_u: Any,
    A_nv: Any = None,
    U_bs: float = 1.0,
    suffix: str = "",
) -> str:
    """Add the block shear check of a connected element.

    Args:
        sh: Sheet to write on.
        R: Required strength through the connection (magnitude used).
        A_gv: Gross area in shear (all shear planes).
        A_nt: Net area in tension.
        F_y, F_u: Yield and tensile strength of the element (values or sheet names).
        A_nv: Net area in shear (default A_gv: welded, no holes).
        U_bs: 1.0 (uniform tension stress) or 0.5 (non-uniform), AISC 360-16 J4.3.
        suffix: Name suffix.

    Returns:
        Key of the check.
    """
    if U_bs not in (1.0, 0.5) or isinstance(U_bs, bool):
        raise CheckInputError("U_bs", U_bs, "1.0 (uniform tension stress) or 0.5 (non-uniform), AISC 360-16 J4.3")
    calc = Calc(sh, suffix)
    sh.heading(f"Block shear{f' [{suffix}]' if suffix else ''}", 2)
    calc.given("R_r", R, "Required strength through the connection", dim="lbf", allow_negative=True, allow_zero=True)
    calc.given("A_gv", A_gv, "Gross area in shear", dim="in**2")
    if A_nv is not None:
        anv = calc.given("A_nv", A_nv, "Net area in shear", dim="in**2")
        if float(anv.to("in**2").magnitude) > float(sh[calc.name("A_gv")].to("in**2").magnitude) * (1 + 1e-9):
            raise CheckInputError("A_nv", A_nv, "a net shear area no larger than the gross shear area")
    else:
        calc.step("A_nv", "A_gv", "Net area in shear (welded, no holes)", unit="in^2", ref="AISC 360-16 J4.3")
    calc.given("A_nt", A_nt, "Net area in tension", dim="in**2")
    calc.given("F_ybs", F_y, "Yield stress of the element", dim="ksi")
    calc.given("F_ubs", F_u, "Tensile strength of the element", dim="ksi")
    calc.given("U_bs", U_bs, "Tension stress distribution factor", "AISC 360-16 J4.3", dim="")
    calc.step("R_nbs", "min(0.60*F_ubs*A_nv + U_bs*F_ubs*A_nt, 0.60*F_ybs*A_gv + U_bs*F_ubs*A_nt)", "Nominal block shear strength",
              unit="kip", ref="AISC 360-16 Eq. J4-5")
    calc.available_with("R_cbs", "R_nbs", 0.75, 2.00, "AISC 360-16 J4.3", "bs", "Available block shear strength", unit="kip")
    return calc.check("Block shear rupture", "R_r", "R_cbs", key="ratio_bs_r", ref="AISC 360-16 J4.3")
