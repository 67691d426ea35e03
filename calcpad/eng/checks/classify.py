"""Section classification, AISC 360-16 Table B4.1a (compression) and B4.1b (flexure).

Each element gets its width-to-thickness ratio λ, its limits λ_p / λ_r as steps, and a branch
naming its class. The class value is a code: 1 = compact (flexure) or nonslender (compression),
2 = noncompact, 3 = slender; the branch label says which.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, add_material
from calcpad.eng.checks._section import Sec, resolve_section

__all__ = ["ELEMENTS", "Element", "add_classification", "elements_for"]


@dataclass(frozen=True)
class Element:
    """One element row of Table B4.1: ratio property, limits as multiples, case numbers."""

    code: str  # name code: "f" flange/wall, "w" web, "D" round wall, "l" angle leg, "s" tee stem
    prop: str  # section property holding λ
    what: str  # description
    rc: tuple[float, str]  # B4.1a λ_r: (coefficient, "sqrt" for k*sqrt(E/Fy) or "lin" for k*E/Fy)
    case_a: int
    p: tuple[float, str]  # B4.1b λ_p
    r: tuple[float, str]  # B4.1b λ_r
    case_b: int


#: Table B4.1a / B4.1b rows used here (AISC 360-16).
ELEMENTS: dict[str, tuple[Element, ...]] = {
    "round_hss": (Element("D", "D_t", "round HSS wall, D/t", (0.11, "lin"), 9, (0.07, "lin"), (0.31, "lin"), 20),),
    "rect_hss": (
        Element("f", "b_t", "HSS flange wall, b/t", (1.40, "sqrt"), 6, (1.12, "sqrt"), (1.40, "sqrt"), 17),
        Element("w", "h_t", "HSS web wall, h/t", (1.40, "sqrt"), 6, (2.42, "sqrt"), (5.70, "sqrt"), 19),
    ),
    "i_shape": (
        Element("f", "bf_2tf", "flange of rolled I-shape, bf/(2tf)", (0.56, "sqrt"), 1, (0.38, "sqrt"), (1.0, "sqrt"), 10),
        Element("w", "h_tw", "web of doubly symmetric I-shape, h/tw", (1.49, "sqrt"), 5, (3.76, "sqrt"), (5.70, "sqrt"), 15),
    ),
    "angle": (Element("l", "b_t", "leg of single angle, b/t", (0.45, "sqrt"), 3, (0.54, "sqrt"), (0.91, "sqrt"), 12),),
    "channel": (
        Element("f", "bf_tf", "flange of channel, bf/tf", (0.56, "sqrt"), 1, (0.38, "sqrt"), (1.0, "sqrt"), 10),
        Element("w", "h_tw", "web of channel, h/tw", (1.49, "sqrt"), 5, (3.76, "sqrt"), (5.70, "sqrt"), 15),
    ),
    "tee": (
        Element("f", "bf_2tf", "flange of tee, bf/(2tf)", (0.56, "sqrt"), 1, (0.38, "sqrt"), (1.0, "sqrt"), 10),
        Element("s", "d_tw", "stem of tee, d/tw", (0.75, "sqrt"), 4, (0.84, "sqrt"), (1.52, "sqrt"), 14),
    ),
}


def _limit(k: float, form: str) -> str:
    return f"{k:g}*sqrt(E/F_y)" if form == "sqrt" else f"{k:g}*E/F_y"


def elements_for(sec: Sec, axis: str = "x") -> tuple[Element, ...]:
    """Elements of a section for bending about ``axis`` (rect HSS swaps flange/web about y)."""
    els = ELEMENTS.get(sec.kind, ())
    if sec.kind == "rect_hss" and axis == "y":
        f, w = els
        return (Element("f", "h_t", "HSS flange wall (bending about y), h/t", f.rc, f.case_a, f.p, f.r, f.case_b),
                Element("w", "b_t", "HSS web wall (bending about y), b/t", w.rc, w.case_a, w.p, w.r, w.case_b))
    return els


def write_elements(calc: Calc, sec: Sec, mode: str, axis: str = "x") -> dict[str, str]:
    """Write λ, limits and class branch of each element; return code -> class step name."""
    out: dict[str, str] = {}
    sh = calc.sh
    els = elements_for(sec, axis)
    if not els:
        sh.note(f"{sec.label}: solid section, no local buckling of elements (Table B4.1 does not apply).")
        return out
    for el in els:
        lam = f"lambda_{el.code}"
        calc.prop(lam, sec.need(el.prop, "classification"), "", f"Width-to-thickness ratio, {el.what}", sec)
        if mode == "compression":
            lr = f"lambda_rc{el.code}"
            calc.step(lr, _limit(*el.rc), f"Slender limit, {el.what}", ref=f"AISC 360-16 Table B4.1a case {el.case_a}")
            out[el.code] = calc.branch(
                f"class_c{el.code}",
                [(f"{lam} <= {lr}", "1", "nonslender"), (None, "3", "slender")],
                f"Class in compression, {el.what}",
                ref="AISC 360-16 B4.1a",
                words=True,
            )
        else:
            lp, lr = f"lambda_p{el.code}", f"lambda_r{el.code}"
            calc.step(lp, _limit(*el.p), f"Compact limit, {el.what}", ref=f"AISC 360-16 Table B4.1b case {el.case_b}")
            calc.step(lr, _limit(*el.r), f"Noncompact limit, {el.what}", ref=f"AISC 360-16 Table B4.1b case {el.case_b}")
            out[el.code] = calc.branch(
                f"class_{el.code}",
                [(f"{lam} <= {lp}", "1", "compact"), (f"{lam} <= {lr}", "2", "noncompact"), (None, "3", "slender")],
                f"Class in flexure, {el.what}",
                ref="AISC 360-16 B4.1b",
                words=True,
            )
    return out


def add_classification(
    sh: Sheet,
    section: Any,
    *,
    kind: str | None = None,
    material: Any = None,
    F_y: Any = None,
    E: Any = None,
    mode: str = "flexure",
    axis: str = "x",
    suffix: str = "",
) -> dict[str, str]:
    """Classify the elements of a section per AISC 360-16 Table B4.1a or B4.1b.

    Args:
        sh: Sheet to write on.
        section: Shape or property mapping (round_hss, rect_hss, i_shape, angle, tee; bars have none).
        material / F_y / E: Material or values.
        mode: ``"compression"`` (B4.1a) or ``"flexure"`` (B4.1b).
        axis: Bending axis for flexure (rect HSS flanges are the walls parallel to the axis).
        suffix: Name suffix.

    Returns:
        Element code (``"f"``, ``"w"``, ``"D"``, ``"l"`` or ``"s"``) -> name of its class step.
    """
    if mode not in ("compression", "flexure"):
        raise CheckInputError("mode", mode, "'compression' or 'flexure'")
    if axis not in ("x", "y"):
        raise CheckInputError("axis", axis, "'x' or 'y'")
    calc = Calc(sh, suffix)
    sec = resolve_section(section, kind)
    add_material(calc, material, F_y, E)
    sh.heading(f"Classification, {sec.label}, {'Table B4.1a' if mode == 'compression' else 'Table B4.1b'}", 2)
    return write_elements(calc, sec, mode, axis)
