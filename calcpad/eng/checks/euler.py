"""Elastic (Euler) buckling load of a section about one axis, as a named step.

``P_e = π² E I / (K L)²`` — the load F_e·A_g of AISC 360-16 Eq. E3-4 and the form of P_e1 in
Appendix 8 (Eq. A-8-5, there with the reduced stiffness EI*). A step of its own where a calc
needs it (a brace stiffness argument, an amplification by hand, a comparison with an analysis).
"""

from __future__ import annotations

import math
from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, add_material, check_length, warn
from calcpad.eng.checks._section import resolve_section

__all__ = ["EULER_AXES", "add_euler_load"]

#: Axis -> (suffix of the sheet names, section property, description).
EULER_AXES: dict[str, tuple[str, str, str]] = {
    "x": ("x", "Ix", "about x"),
    "y": ("y", "Iy", "about y"),
    "min": ("min", "", "about the minor principal axis"),
}


def add_euler_load(
    sh: Sheet,
    section: Any,
    *,
    L: Any,
    K: Any = 1.0,
    axis: str = "x",
    kind: str | None = None,
    material: Any = None,
    E: Any = None,
    suffix: str = "",
) -> str:
    """Add ``P_e_<axis> = pi**2*E*I/(K*L)**2`` with its inputs; returns the step's sheet name.

    Args:
        sh: Sheet to write on.
        section: Shape or property mapping (``kind=`` for a mapping).
        L: Unbraced length for buckling about the axis (> 0).
        K: Effective length factor (0.5..2.5 usual; outside gives a caution).
        axis: ``"x"``, ``"y"`` or ``"min"`` (minor principal axis: ``I_z`` of an angle, else the
            smaller of I_x and I_y).
        material / E: a material (for E) or E itself (default 29,000 ksi).
        suffix: Name suffix for a second member on the same sheet.
    """
    if not isinstance(axis, str) or axis not in EULER_AXES:
        raise CheckInputError("axis", axis, f"one of {', '.join(repr(a) for a in EULER_AXES)}")
    sec = resolve_section(section, kind)
    tag, prop, words = EULER_AXES[axis]
    calc = Calc(sh, suffix)
    if material is not None:
        add_material(calc, material, E=E)
    else:
        calc.given("E", "29000 ksi" if E is None else E, "Modulus of elasticity", "AISC 360-16 (E = 29,000 ksi)", dim="ksi", shared=True)
    check_length(calc, f"L_{tag}", L, f"Unbraced length for buckling {words}")
    kq = calc.given(f"K_{tag}", K, f"Effective length factor {words}", "AISC 360-16 Appendix 7 / Commentary Table C-A-7.1", dim="")
    if not 0.5 <= float(kq.magnitude) <= 2.5:
        warn(sh, f"K = {float(kq.magnitude):g} is outside the usual range 0.5 to 2.5 (Commentary Table C-A-7.1)")
    if prop:
        calc.prop(f"I_{tag}", sec.need(prop, "Euler buckling load"), "in**4", f"Moment of inertia {words}", sec.label, shared=True)
    else:
        i_min = sec.get("Iz")
        if i_min is None:
            i_min = sec.need("A", "Euler buckling load") * sec.need("r_min", "Euler buckling load") ** 2
        if not math.isfinite(i_min) or i_min <= 0:
            raise CheckInputError("section", sec.label, "a positive least moment of inertia")
        calc.prop("I_min", i_min, "in**4", "Moment of inertia about the minor principal axis", sec.label, shared=True)
    return calc.step(f"P_e_{tag}", f"pi**2*E*I_{tag}/(K_{tag}*L_{tag})**2", f"Elastic (Euler) buckling load {words}", unit="kip",
                     ref="AISC 360-16 Eq. E3-4 (F_e A_g), Eq. A-8-5 form")
