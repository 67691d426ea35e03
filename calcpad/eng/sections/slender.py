"""Q_s, the reduction factor for slender unstiffened elements, as a property of a section.

Q_s is defined in AISC 360-10 Section E7.1 (Eqs. E7-4 to E7-15). AISC 360-16 replaced the Q_s
method in Chapter E by effective widths (Eqs. E7-2, E7-3), which is what
:mod:`calcpad.eng.checks.compression` uses; it does not read Q_s. Q_s is kept here because the
AISC Manual tables up to the 14th edition tabulate it (angles at F_y = 36 ksi, tees at 50 ksi,
double angles) and a reviewer compares against them; it depends on F_y and E, so it is a function
of the section and the material, not a stored number. Dimensionless.

Which element governs (the smallest Q_s of the section's unstiffened elements):

* single angle: the longer leg, b/t with b the full leg (E7-10 to E7-12);
* double angles with a gap: each leg as a single angle (E7-10 to E7-12); in continuous contact
  (``contact=True``): the outstanding legs as rolled outstands (E7-4 to E7-6), as the tables do;
* tee: flange outstand b_f/(2 t_f) (E7-4 to E7-6) and stem d/t_w (E7-13 to E7-15);
* rolled I-shape: flange outstand b_f/(2 t_f); channel: b_f/t_f (E7-4 to E7-6);
* tubes, pipe, bars: no unstiffened elements, Q_s = 1.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

from calcpad.core.errors import InputError
from calcpad.core.units import Q_

__all__ = ["ELEMENTS", "QsResult", "add_qs_steps", "element_qs", "section_qs"]

_REF = "AISC 360-10 E7.1"

#: Element kind -> (limit for Q_s = 1, limit of the inelastic range, a, b, c) in units of sqrt(E/F_y):
#: Q_s = 1 for λ <= lim1·√(E/F_y); a - b·λ·√(F_y/E) up to lim2·√(E/F_y); c·E/(F_y λ²) beyond.
ELEMENTS: dict[str, tuple[float, float, float, float, float, str]] = {
    "rolled outstand": (0.56, 1.03, 1.415, 0.74, 0.69, "Eqs. E7-4 to E7-6"),
    "single angle leg": (0.45, 0.91, 1.34, 0.76, 0.53, "Eqs. E7-10 to E7-12"),
    "tee stem": (0.75, 1.03, 1.908, 1.22, 0.69, "Eqs. E7-13 to E7-15"),
}


def element_qs(element: str, ratio: float, Fy: float, E: float = 29000.0) -> float:
    """Q_s of one unstiffened element of width-to-thickness ``ratio`` (AISC 360-10 E7.1); F_y, E in ksi."""
    if element not in ELEMENTS:
        raise InputError(f"element: {element!r}; expected one of {', '.join(ELEMENTS)}")
    for name, v in (("ratio", ratio), ("Fy", Fy), ("E", E)):
        if not (isinstance(v, (int, float)) and math.isfinite(v) and v > 0):
            raise InputError(f"{name}: {v!r}; expected a positive number")
    lim1, lim2, a, b, c, _ = ELEMENTS[element]
    root = math.sqrt(E / Fy)
    if ratio <= lim1 * root:
        return 1.0
    if ratio <= lim2 * root:
        return a - b * ratio / root
    return c * E / (Fy * ratio**2)


@dataclass(frozen=True)
class QsResult:
    """Q_s of a section with the element that governs it."""

    value: float
    element: str
    ratio: float
    ratio_label: str


def _elements(shape: Any, contact: bool = False) -> list[tuple[str, float, str]]:
    """(element kind, width-to-thickness ratio, ratio label) of the section's unstiffened elements."""
    kind = getattr(shape, "kind", "")
    if kind == "angle":
        return [("single angle leg", max(shape.d, shape.b) / shape.t, "b/t (longer leg)")]
    if kind == "tee":
        return [("rolled outstand", shape.bf / (2.0 * shape.tf), "b_f/(2 t_f)"), ("tee stem", shape.d / shape.tw, "d/t_w")]
    if kind == "I-shape":
        return [("rolled outstand", shape.bf / (2.0 * shape.tf), "b_f/(2 t_f)")]
    if kind == "channel":
        return [("rolled outstand", shape.bf / shape.tf, "b_f/t_f")]
    members = getattr(shape, "members", None)
    if members:
        out = []
        for m in members:
            if contact and getattr(m.shape, "kind", "") == "angle":
                out.append(("rolled outstand", m.shape.b / m.shape.t, "b/t (outstanding leg, angles in contact)"))
            else:
                out += _elements(m.shape)
        return out
    if kind in ("rectangular tube", "round tube", "round bar", "rectangular bar"):
        return []
    raise InputError(f"section: {getattr(shape, 'name', shape)!r} ({kind or type(shape).__name__}); Q_s is defined for "
                     "angles, double angles, tees, I-shapes, channels, tubes and bars")


def section_qs(shape: Any, Fy: float, E: float = 29000.0, *, contact: bool = False) -> QsResult:
    """Q_s of a section (the smallest over its unstiffened elements, 1 when it has none); F_y, E in ksi.

    ``contact`` (built-ups of angles): the angles are in continuous contact along their ``d`` legs
    (double angles with no gap); their outstanding ``b`` legs then count as rolled outstands
    (E7-4 to E7-6) and the legs back to back as stiffened. Otherwise (the default, and the lower
    Q_s) every leg is checked as a single angle leg (E7-10 to E7-12), as for separated angles.
    """
    results = [QsResult(element_qs(el, ratio, Fy, E), el, ratio, label) for el, ratio, label in _elements(shape, contact)]
    if not results:
        return QsResult(1.0, "none (no unstiffened elements)", 0.0, "")
    return min(results, key=lambda r: r.value)


def add_qs_steps(sheet: Any, shape: Any, Fy: Any, E: Any = 29000.0, suffix: str = "", *, contact: bool = False) -> str:
    """Add the ratio of the governing element and a Q_s step (the E7.1 equations as a branch).

    ``Fy``/``E`` are ksi floats or stress quantities. Returns the name of the Q_s step.
    """
    fy = float(Q_(Fy, "ksi").magnitude) if isinstance(Fy, (int, float)) else float(Fy.to("ksi").magnitude)
    e = float(Q_(E, "ksi").magnitude) if isinstance(E, (int, float)) else float(E.to("ksi").magnitude)
    res = section_qs(shape, fy, e, contact=contact)
    s = f"_{suffix}" if suffix and not suffix.startswith("_") else suffix
    name = f"Q_s{s}"
    if not res.ratio_label:
        sheet.given(name, Q_(1.0, ""), "Slender unstiffened element factor Q_s (no unstiffened elements)",
                    source=f"{_REF}: tubes and bars have stiffened elements only")
        return name
    lim1, lim2, a, b, c, eqs = ELEMENTS[res.element]
    lam, fy_n, e_n = f"lambda_Qs{s}", f"F_y_Qs{s}", f"E_Qs{s}"
    sheet.given(fy_n, Q_(fy, "ksi"), "Specified minimum yield stress")
    sheet.given(e_n, Q_(e, "ksi"), "Modulus of elasticity of steel")
    sheet.given(lam, Q_(res.ratio, ""), f"Width-to-thickness ratio {res.ratio_label}, {res.element} (governs Q_s)",
                source=getattr(shape, "name", ""))
    root = f"sqrt({e_n}/{fy_n})"
    sheet.branch(
        name,
        [(f"{lam} <= {lim1}*{root}", "1", f"not slender, {eqs.split(' to ')[0].replace('Eqs.', 'Eq.')}"),
         (f"{lam} <= {lim2}*{root}", f"{a} - {b}*{lam}*sqrt({fy_n}/{e_n})", "inelastic range"),
         (None, f"{c}*{e_n}/({fy_n}*{lam}**2)", "elastic range")],
        f"Slender unstiffened element factor Q_s ({res.element})",
        unit="",
        ref=f"{_REF} {eqs}",
    )
    return name
