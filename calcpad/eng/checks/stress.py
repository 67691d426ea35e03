"""Yield-based stress checks: P/A, M·c/I, shear, torsion, von Mises, FS against yield.

Elastic stresses compared with the yield stress and a required factor of safety (common
practice for light frames, and the way to check materials or shapes outside AISC 360).
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, CheckNotCoveredError, add_material
from calcpad.eng.checks._section import resolve_section

__all__ = ["SHEAR_FORMS", "add_stress_check"]

#: Shear stress forms: name -> (formula, description, reference).
SHEAR_FORMS: dict[str, tuple[str, str, str]] = {
    "general": ("V*Q/(I*b)", "Shear stress at the neutral axis, tau = V*Q/(I*b)", "elastic shear flow, common practice"),
    "round_tube": ("2*V/A", "Peak shear stress, thin-wall round tube", "thin-wall tube tau_max = 2V/A, common practice"),
    "round_bar": ("4*V/(3*A)", "Peak shear stress, solid round", "tau_max = 4V/(3A), common practice"),
    "rect_bar": ("3*V/(2*A)", "Peak shear stress, solid rectangle", "tau_max = 3V/(2A), common practice"),
}

_DEFAULT_SHEAR = {"round_hss": "round_tube", "round_bar": "round_bar", "rect_bar": "rect_bar", "rect_hss": "general", "i_shape": "general"}


def _shear_props(kind: str, v: dict[str, float], axis: str) -> tuple[float, float]:
    """First moment Q of half the section about the neutral axis and the width b cut there."""
    if kind == "rect_hss":
        H, B, t = (v["H"], v["B"], v["t"]) if axis == "x" else (v["B"], v["H"], v["t"])
        return B * H**2 / 8 - (B - 2 * t) * (H - 2 * t) ** 2 / 8, 2 * t
    if kind == "i_shape" and axis == "x":
        d, bf, tf, tw = v["d"], v["bf"], v["tf"], v["tw"]
        return bf * tf * (d - tf) / 2 + tw * (d / 2 - tf) ** 2 / 2, tw
    raise CheckNotCoveredError("shear", f"{kind} about {axis}", "give Q= and b= (or shear='round_tube' etc.)")


def add_stress_check(
    sh: Sheet,
    section: Any = None,
    *,
    kind: str | None = None,
    material: Any = None,
    F_y: Any = None,
    P: Any = None,
    M: Any = None,
    V: Any = None,
    T: Any = None,
    A: Any = None,
    I: Any = None,
    c: Any = None,
    Q: Any = None,
    b: Any = None,
    J: Any = None,
    r_o: Any = None,
    shear: str | None = None,
    axis: str = "x",
    required_fs: float = 1.67,
    suffix: str = "",
) -> list[str]:
    """Add elastic stress checks against yield with a required factor of safety.

    Normal stress σ = |P/A| + |M·c/I| (worst fibre), shear τ from V (``shear`` form) plus
    torsion τ_t = T·r_o/J (round) or T/(2·A_0·t) (rect HSS, Bredt), von Mises
    σ_vm = √(σ² + 3τ²) with peak σ and peak τ taken together (conservative). Shear yield is
    F_y/√3 (von Mises). Section values come from ``section`` unless given directly.

    Args:
        sh: Sheet to write on.
        section: Shape from :mod:`calcpad.eng.sections` or a property mapping (``kind=``).
        material / F_y: Material (or catalog name) or the yield stress.
        P, M, V, T: Axial force (sign ignored: magnitude used), moment, shear, torque; at least one.
        A, I, c, Q, b, J, r_o: Section values overriding those of ``section``.
        shear: ``"general"`` (V·Q/(I·b)), ``"round_tube"``, ``"round_bar"``, ``"rect_bar"``.
        axis: Bending axis ``"x"`` or ``"y"`` of the section.
        required_fs: Required factor of safety against yield (1.0 to 5.0 usual).
        suffix: Name suffix for a second member on the same sheet.

    Returns:
        Keys of the checks added.
    """
    calc = Calc(sh, suffix)
    if axis not in ("x", "y"):
        raise CheckInputError("axis", axis, "'x' or 'y'")
    if not (isinstance(required_fs, (int, float)) and required_fs >= 1.0):
        raise CheckInputError("required_fs", required_fs, "a factor of safety >= 1.0")
    if all(x is None for x in (P, M, V, T)):
        raise CheckInputError("P, M, V, T", None, "at least one load effect")
    sec = resolve_section(section, kind) if section is not None else None
    v = sec.values if sec else {}
    label = sec.label if sec else "given"
    add_material(calc, material, F_y, need_e=False)
    keys: list[str] = []
    sh.heading(f"Elastic stresses vs yield{f' [{suffix}]' if suffix else ''}", 2)

    def prop(base: str, given: Any, fallback: float | None, unit: str, desc: str) -> None:
        if given is not None:
            calc.given(base, given, desc, dim=unit)
        elif fallback is not None:
            calc.prop(base, fallback, unit, desc, label)
        else:
            raise CheckInputError(base, None, f"{desc.lower()} ({unit}); give it or a section")

    ax = axis
    normal = []
    if P is not None:
        calc.given("P", P, "Axial force (magnitude)", dim="lbf", allow_negative=True)
        prop("A", A, v.get("A"), "in**2", "Gross area")
        calc.step("sigma_a", "abs(P)/A", "Axial stress", unit="ksi", ref="sigma = P/A, common practice")
        normal.append("sigma_a")
    if M is not None:
        calc.given("M", M, "Bending moment (magnitude)", dim="lbf*in", allow_negative=True)
        prop("I", I, v.get(f"I{ax}"), "in**4", f"Moment of inertia about {ax}")
        c_default = None
        if sec is not None:
            depth = {"round_hss": "D", "round_bar": "D", "rect_hss": "H" if ax == "x" else "B", "rect_bar": "H" if ax == "x" else "B",
                     "i_shape": "d" if ax == "x" else "bf"}.get(sec.kind)
            if depth and depth in v:
                c_default = v[depth] / 2
            elif f"S{ax}" in v:
                c_default = v[f"I{ax}"] / v[f"S{ax}"]
        prop("c", c, c_default, "in", "Distance from neutral axis to extreme fibre")
        calc.step("sigma_b", "abs(M)*c/I", "Bending stress", unit="ksi", ref="sigma = M*c/I, common practice")
        normal.append("sigma_b")
    if normal:
        if len(normal) == 2:
            calc.step("sigma", "sigma_a + sigma_b", "Combined normal stress, worst fibre", unit="ksi", ref="superposition, common practice")
        else:
            calc.step("sigma", normal[0], "Normal stress", unit="ksi")
        keys.append(calc.check("Normal stress vs yield", "sigma", "F_y", key="FS_sigma", required_fs=required_fs, ref="yield-based, common practice"))

    shears = []
    if V is not None:
        calc.given("V", V, "Shear force (magnitude)", dim="lbf", allow_negative=True)
        form = shear or ("general" if Q is not None else _DEFAULT_SHEAR.get(sec.kind if sec else "", "general"))
        if form not in SHEAR_FORMS:
            raise CheckInputError("shear", form, f"one of {', '.join(SHEAR_FORMS)}")
        formula, desc, ref = SHEAR_FORMS[form]
        if form == "general":
            q_def, b_def = (None, None)
            if (Q is None or b is None) and sec is not None:
                q_def, b_def = _shear_props(sec.kind, v, ax)
            if not calc.has("I"):
                prop("I", I, v.get(f"I{ax}"), "in**4", f"Moment of inertia about {ax}")
            prop("Q", Q, q_def, "in**3", "First moment of area above the neutral axis")
            prop("b", b, b_def, "in", "Width of the cut at the neutral axis")
        elif not calc.has("A"):
            prop("A", A, v.get("A"), "in**2", "Gross area")
        calc.step("tau_v", formula.replace("V", "abs(V)", 1), desc, unit="ksi", ref=ref)
        shears.append("tau_v")
    if T is not None:
        calc.given("T", T, "Torque (magnitude)", dim="lbf*in", allow_negative=True)
        k = sec.kind if sec else ("round_hss" if J is not None else "")
        if k in ("round_hss", "round_bar"):
            prop("J", J, v.get("J"), "in**4", "Polar moment of inertia / torsional constant")
            prop("r_o", r_o, v.get("D", 0) / 2 or None, "in", "Outside radius")
            calc.step("tau_t", "abs(T)*r_o/J", "Torsional shear stress", unit="ksi", ref="tau = T*r/J, common practice")
        elif k == "rect_hss":
            calc.prop("A_0", (v["B"] - v["t"]) * (v["H"] - v["t"]), "in**2", "Area enclosed by the wall mid-line", label)
            calc.prop("t_w", v["t"], "in", "Wall thickness", label)
            calc.step("tau_t", "abs(T)/(2*A_0*t_w)", "Torsional shear stress (Bredt)", unit="ksi", ref="thin-wall closed section, common practice")
        else:
            raise CheckNotCoveredError("T (torsion)", k or "given properties", "torsion is checked for round and rectangular tubes and round bars")
        shears.append("tau_t")
    if shears:
        calc.step("tau", " + ".join(shears), "Shear stress (peaks added, conservative)", unit="ksi")
        calc.step("tau_y", "F_y/sqrt(3)", "Shear yield stress (von Mises)", unit="ksi", ref="distortion-energy criterion, common practice")
        keys.append(calc.check("Shear stress vs shear yield", "tau", "tau_y", key="FS_tau", required_fs=required_fs, ref="yield-based, common practice"))
    if normal and shears:
        calc.step("sigma_vm", "sqrt(sigma**2 + 3*tau**2)", "von Mises stress (peaks combined, conservative)", unit="ksi",
                  ref="distortion-energy criterion, common practice")
        keys.append(calc.check("von Mises stress vs yield", "sigma_vm", "F_y", key="FS_vm", required_fs=required_fs, ref="yield-based, common practice"))
    return keys
