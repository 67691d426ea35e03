"""Seismic design force on a nonstructural component, ASCE 7-16 Sec. 13.3.1 (Eqs. 13.3-1 to
13.3-3) and the vertical force of Sec. 13.3.1.2.

Rooftop equipment and its stand are nonstructural components: the horizontal force F_p acts at
the component's centre of mass, with the redundancy factor ρ = 1.0. The component amplification
a_p and response modification R_p come from ASCE 7-16 Table 13.5-1 or 13.6-1 (for example
air-handling and air-conditioning units built of sheet metal framing: a_p = 2.5, R_p = 6.0, from
memory: confirm against the table for the job). S_DS comes from the site (ASCE 7-16 Sec. 11.4.5).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from calcpad.core.errors import InputError
from calcpad.core.sheet import Sheet
from calcpad.core.units import parse_quantity

__all__ = ["ComponentSeismic", "add_component_seismic"]


@dataclass(frozen=True)
class ComponentSeismic:
    """Sheet names written by :func:`add_component_seismic`."""

    F_p: str
    F_v: str


def _number(value: Any, field: str, low: float, high: float, what: str) -> float:
    try:
        x = float(value)
    except (TypeError, ValueError):
        raise InputError(f"{field}: got {value!r}; expected {what}, a number from {low:g} to {high:g}") from None
    if not low <= x <= high:
        raise InputError(f"{field}: got {value!r}; expected {what}, a number from {low:g} to {high:g}")
    return x


def add_component_seismic(
    sh: Sheet,
    *,
    S_DS: Any,
    W_p: Any,
    a_p: Any,
    R_p: Any,
    I_p: Any = 1.0,
    z: Any,
    h: Any,
    suffix: str = "",
) -> ComponentSeismic:
    """Write the horizontal and vertical seismic design forces of a component.

    Args:
        sh: Sheet to write on.
        S_DS: Design spectral response acceleration at short periods (0 to 3).
        W_p: Component operating weight (a force).
        a_p: Component amplification factor (1.0 to 2.5, Table 13.5-1 / 13.6-1).
        R_p: Component response modification factor (1.0 to 12, same tables).
        I_p: Component importance factor, 1.0 or 1.5 (Sec. 13.1.3).
        z: Height in the structure of the point of attachment (0 at or below the base).
        h: Average roof height of the structure above the base (> 0).
        suffix: Name suffix for a second component on the sheet.

    Returns:
        The names of F_p and F_v on the sheet.
    """
    s = f"_{suffix}" if suffix else ""
    sds = _number(S_DS, "S_DS", 0.0, 3.0, "the design spectral acceleration S_DS (ASCE 7-16 Sec. 11.4.5)")
    ap = _number(a_p, "a_p", 1.0, 2.5, "the component amplification factor a_p (ASCE 7-16 Table 13.5-1/13.6-1)")
    rp = _number(R_p, "R_p", 1.0, 12.0, "the component response modification factor R_p (ASCE 7-16 Table 13.5-1/13.6-1)")
    ip = _number(I_p, "I_p", 1.0, 1.5, "the component importance factor I_p (1.0 or 1.5, ASCE 7-16 Sec. 13.1.3)")
    wp = parse_quantity(W_p, "W_p", expected="lbf")
    zq = parse_quantity(z, "z", expected="[length]")
    hq = parse_quantity(h, "h", expected="[length]")
    if float(wp.magnitude) <= 0:
        raise InputError(f"W_p: got {W_p!r}; expected the component's operating weight, > 0")
    if float(hq.magnitude) <= 0:
        raise InputError(f"h: got {h!r}; expected the average roof height, > 0")
    if float(zq.magnitude) < 0:
        raise InputError(f"z: got {z!r}; expected a height of 0 or more (0 at or below the base)")
    tab = "ASCE 7-16 Table 13.5-1 / 13.6-1"
    sh.heading(f"Seismic force on the component (ASCE 7-16 Chapter 13){f' [{suffix}]' if suffix else ''}", 2)
    sh.given(f"S_DS{s}", sds, "Design spectral response acceleration, short periods", source="site, ASCE 7-16 Sec. 11.4.5")
    sh.given(f"W_p{s}", wp, "Component operating weight")
    sh.given(f"a_p{s}", ap, "Component amplification factor", source=tab)
    sh.given(f"R_p{s}", rp, "Component response modification factor", source=tab)
    sh.given(f"I_p{s}", ip, "Component importance factor", source="ASCE 7-16 Sec. 13.1.3")
    sh.given(f"z_a{s}", zq, "Height of the point of attachment above the base")
    sh.given(f"h_s{s}", hq, "Average roof height of the structure")
    sh.step(f"r_z{s}", f"min(z_a{s}/h_s{s}, 1)", "Height ratio z/h (need not exceed 1.0)", ref="ASCE 7-16 Sec. 13.3.1")
    sh.step(f"F_p1{s}", f"0.4*a_p{s}*S_DS{s}*W_p{s}/(R_p{s}/I_p{s})*(1 + 2*r_z{s})", "Seismic design force",
            unit="lbf", ref="ASCE 7-16 Eq. 13.3-1")
    sh.step(f"F_pmax{s}", f"1.6*S_DS{s}*I_p{s}*W_p{s}", "Upper limit", unit="lbf", ref="ASCE 7-16 Eq. 13.3-2")
    sh.step(f"F_pmin{s}", f"0.3*S_DS{s}*I_p{s}*W_p{s}", "Lower limit", unit="lbf", ref="ASCE 7-16 Eq. 13.3-3")
    sh.step(f"F_p{s}", f"min(max(F_p1{s}, F_pmin{s}), F_pmax{s})", "Horizontal seismic design force (E_h, rho = 1.0)",
            unit="lbf", ref="ASCE 7-16 Sec. 13.3.1")
    sh.step(f"F_pv{s}", f"0.2*S_DS{s}*W_p{s}", "Vertical seismic force (E_v, acting up or down)", unit="lbf",
            ref="ASCE 7-16 Sec. 13.3.1.2")
    return ComponentSeismic(f"F_p{s}", f"F_pv{s}")
