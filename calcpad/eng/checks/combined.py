"""Combined axial force and flexure, AISC 360-16 H1.1 (Eqs. H1-1a and H1-1b)."""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError

__all__ = ["add_interaction_check"]


def add_interaction_check(
    sh: Sheet,
    *,
    P_r: Any,
    P_c: Any,
    M_rx: Any = None,
    M_cx: Any = None,
    M_ry: Any = None,
    M_cy: Any = None,
    suffix: str = "",
) -> str:
    """Add the H1-1 interaction of axial force and bending (doubly and singly symmetric members).

    Each argument is a value with unit or the name of a sheet value (e.g. ``P_c="P_c"`` written
    by :func:`add_compression_check`). Required strengths are used as magnitudes. At least one
    axis of bending is needed; the ratio is checked against 1.0.

    Returns:
        Key of the check.
    """
    calc = Calc(sh, suffix)
    sh.heading(f"Combined axial force and flexure{f' [{suffix}]' if suffix else ''}", 2)
    calc.given("P_r", P_r, "Required axial strength", dim="lbf", allow_negative=True, allow_zero=True)
    calc.given("P_c", P_c, "Available axial strength", dim="lbf")
    terms = []
    for ax, mr, mc in (("x", M_rx, M_cx), ("y", M_ry, M_cy)):
        if mr is None and mc is None:
            continue
        if mr is None or mc is None:
            raise CheckInputError(f"M_r{ax} / M_c{ax}", (mr, mc), f"both the required and the available strength about {ax}")
        calc.given(f"M_r{ax}", mr, f"Required flexural strength about {ax}", dim="lbf*in", allow_negative=True, allow_zero=True)
        calc.given(f"M_c{ax}", mc, f"Available flexural strength about {ax}", dim="lbf*in")
        terms.append(f"abs(M_r{ax})/M_c{ax}")
    if not terms:
        raise CheckInputError("M_rx / M_ry", None, "at least one bending moment with its available strength")
    m = " + ".join(terms)
    calc.step("p_ratio", "abs(P_r)/P_c", "Axial strength ratio", ref="AISC 360-16 H1.1")
    calc.branch(
        "U_H1",
        [("p_ratio >= 0.2", f"p_ratio + 8/9*({m})", "P_r/P_c >= 0.2, Eq. H1-1a"),
         (None, f"p_ratio/2 + ({m})", "P_r/P_c < 0.2, Eq. H1-1b")],
        "Interaction ratio",
        ref="AISC 360-16 H1.1",
    )
    calc.given("U_lim", 1.0, "Interaction limit", "AISC 360-16 H1.1", dim="")
    return calc.check("Axial + flexure interaction", "U_H1", "U_lim", key="ratio_H1", ref="AISC 360-16 Eqs. H1-1a, H1-1b")
