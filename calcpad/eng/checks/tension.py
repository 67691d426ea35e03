"""Tension members, AISC 360-16 Chapter D: yielding (D2-1) and rupture (D2-2), A_e = U·A_n (D3-1).

Available strength ``T_c`` (the smaller of the two) is written under that name (plus suffix).
"""

from __future__ import annotations

from typing import Any

from calcpad.core.results import OK_SLENDER
from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, add_material, check_length
from calcpad.eng.checks._section import resolve_section

__all__ = ["add_tension_check"]


def add_tension_check(
    sh: Sheet,
    section: Any = None,
    *,
    T: Any,
    A_g: Any = None,
    A_n: Any = None,
    U: Any = 1.0,
    L: Any = None,
    kind: str | None = None,
    material: Any = None,
    F_y: Any = None,
    F_u: Any = None,
    suffix: str = "",
) -> str:
    """Add tensile yielding and rupture checks.

    Args:
        sh: Sheet to write on.
        section: Shape or mapping giving A_g (or give ``A_g``).
        T: Required tensile strength (≥ 0; compression belongs in add_compression_check).
        A_g: Gross area (overrides the section's).
        A_n: Net area at the connection (default A_g: no holes), ≤ A_g.
        U: Shear lag factor, 0 < U ≤ 1 (AISC 360-16 Table D3.1).
        L: Member length (with a section): L/r is written and above 300 (D1 user note) the check's
            status is "OK, above recommended slenderness" (not for rods and hangers).
        material / F_y / F_u: Material or values.
        suffix: Name suffix.

    Returns:
        Key of the check. The available strength is ``T_c`` (+ suffix).
    """
    calc = Calc(sh, suffix)
    sec = resolve_section(section, kind) if section is not None else None
    sh.heading(f"Tension{f', {sec.label}' if sec else ''}{f' [{suffix}]' if suffix else ''}", 2)
    add_material(calc, material, F_y, None, F_u, need_fu=True, need_e=False)
    calc.given("T_r", T, "Required tensile strength", dim="lbf", allow_zero=True,
               sign_hint="tension is entered as a positive force; check compression with add_compression_check")
    if A_g is not None:
        ag = calc.given("A_g", A_g, "Gross area", dim="in**2")
    elif sec is not None:
        calc.prop("A_g", sec.need("A", "tension check"), "in**2", "Gross area", sec)
        ag = sh[calc.name("A_g")]
    else:
        raise CheckInputError("A_g", None, "a gross area or a section")
    if A_n is not None:
        an = calc.given("A_n", A_n, "Net area", "AISC 360-16 B4.3b", dim="in**2")
        if an.to("in**2").magnitude > ag.to("in**2").magnitude * (1 + 1e-9):
            raise CheckInputError("A_n", A_n, f"a net area no larger than the gross area {ag:~}")
    else:
        calc.step("A_n", "A_g", "Net area (no holes)", unit="in^2", ref="AISC 360-16 B4.3b")
    u = calc.given("U", U, "Shear lag factor", "AISC 360-16 Table D3.1", dim="")
    if not 0 < float(u.magnitude) <= 1.0:
        raise CheckInputError("U", U, "a shear lag factor with 0 < U <= 1 (AISC 360-16 Table D3.1)")
    calc.step("A_e", "U*A_n", "Effective net area", unit="in^2", ref="AISC 360-16 Eq. D3-1")
    calc.step("T_ny", "F_y*A_g", "Nominal strength, tensile yielding", unit="kip", ref="AISC 360-16 Eq. D2-1")
    calc.step("T_nr", "F_u*A_e", "Nominal strength, tensile rupture", unit="kip", ref="AISC 360-16 Eq. D2-2")
    calc.available("T_cy", "T_ny", "tension_yield", "ty", "Available strength, yielding", unit="kip")
    calc.available("T_cr", "T_nr", "tension_rupture", "tr", "Available strength, rupture", unit="kip")
    calc.select("T_c", "min", {"T_cy": "yielding (D2-1)", "T_cr": "rupture (D2-2)"}, "Available tensile strength", unit="kip")
    flags = []
    if L is not None:
        if sec is None:
            raise CheckInputError("L", L, "a section with it (L/r needs the least radius of gyration), or no L")
        check_length(calc, "L", L, "Member length")
        calc.prop("r", sec.need("r_min", "tension slenderness"), "in", "Least radius of gyration", sec)
        calc.step("Lr_D1", "L/r", "Slenderness ratio L/r (preferably <= 300; not for rods or hangers)", ref="AISC 360-16 D1 User Note")
        flags.append(("Lr_D1", 300.0, OK_SLENDER))
    return calc.check("Axial tension", "T_r", "T_c", key="ratio_t", ref="AISC 360-16 D2", flags=flags)
