"""Fillet welds, AISC 360-16 J2.2b and J2.4 (with the base metal along them, J4.2), and stitch welds by shear flow.

Weld strength: R_n = F_nw·A_we with F_nw = 0.60·F_EXX·(1 + 0.50·sin^1.5 θ) (Eqs. J2-4, J2-5),
A_we = 0.707·w·L_e per weld (equal-leg fillet throat); φ = 0.75, Ω = 2.00 (Table J2.5).

Base metal along a fillet weld (optional, when ``base_t`` is given): the shear plane through the
base metal beside each weld is checked for shear yielding, R_n = 0.60·F_y·A_gv (Eq. J4-3,
φ = 1.00, Ω = 1.50) and shear rupture, R_n = 0.60·F_u·A_nv (Eq. J4-4, φ = 0.75, Ω = 2.00),
with A_gv = A_nv = n_bm·t·L_e (welded, no holes; L_e is the weld's effective length, which is
conservative for long end-loaded welds). Tension and block shear of the connected parts
(J4.1, J4.3) are not part of these checks.
"""

from __future__ import annotations

import math
from typing import Any

import pint

from calcpad.core.errors import InputError
from calcpad.core.names import is_valid_name
from calcpad.core.sheet import Sheet
from calcpad.core.units import parse_quantity
from calcpad.eng.checks._common import Calc, CheckInputError, check_length

__all__ = ["add_fillet_weld_check", "add_stitch_weld_check"]



#: Minimum fillet size by the thinner part joined (AISC 360-16 Table J2.4); w_u = 1/16 in.
MIN_FILLET_CASES = [
    ("t_p <= 4*w_u", "2*w_u", "t <= 1/4 in: 1/8 in"),
    ("t_p <= 8*w_u", "3*w_u", "1/4 < t <= 1/2 in: 3/16 in"),
    ("t_p <= 12*w_u", "4*w_u", "1/2 < t <= 3/4 in: 1/4 in"),
    (None, "5*w_u", "t > 3/4 in: 5/16 in"),
]
#: Maximum fillet size along an edge (AISC 360-16 J2.2b(b)).
MAX_FILLET_CASES = [("t_e < 4*w_u", "t_e", "edge thinner than 1/4 in: w <= t"), (None, "t_e - w_u", "edge 1/4 in or thicker: w <= t - 1/16 in")]

def _size_rules(calc: Calc) -> None:
    calc.given("w_u", "0.0625 in", "Fillet size increment (1/16 in)", "AISC 360-16 Table J2.4", dim="[length]")


def _positive(sh: Sheet, field: str, value: Any, dim: str, what: str) -> tuple[Any, pint.Quantity]:
    """Read ``value`` as a positive, finite quantity of dimension ``dim``.

    Returns what to hand to :meth:`Calc.given` (the quantity, or the name of a sheet value,
    which stays linked) and the current quantity.
    """
    linked = isinstance(value, str) and is_valid_name(value) and value in sh
    q = sh[value] if linked else parse_quantity(value, field, expected=dim)
    if linked:
        parse_quantity(q, field, expected=dim)
    mag = q.magnitude
    if not isinstance(mag, (int, float)) or not math.isfinite(float(mag)):
        raise CheckInputError(field, value, f"a single finite {what}")
    if mag <= 0:
        shown = f"{value} = {q:~}" if linked else value
        raise CheckInputError(field, shown, f"a positive {what}, not {'negative' if mag < 0 else 'zero'}")
    return (value if linked else q), q


def _base_metal_inputs(
    sh: Sheet, base_t: Any, base_Fy: Any, base_Fu: Any, base_material: Any, base_planes: int | None
) -> tuple[Any, Any, Any, str] | None:
    """Validate the base-metal inputs before anything is written; ``None`` when not asked for.

    Returns thickness, F_y and F_u (each a quantity or the name of a sheet value) and the
    material source text.
    """
    if base_t is None:
        extra = {"base_Fy": base_Fy, "base_Fu": base_Fu, "base_material": base_material, "base_planes": base_planes}
        given = [k for k, v in extra.items() if v is not None]
        if given:
            raise CheckInputError("base_t", None, f"the base metal thickness (e.g. '0.25 in') when {', '.join(given)} is given")
        return None
    if base_planes is not None and not (isinstance(base_planes, int) and not isinstance(base_planes, bool) and base_planes >= 1):
        raise CheckInputError("base_planes", base_planes, "a whole number of base-metal shear planes >= 1")
    t, _ = _positive(sh, "base_t", base_t, "[length]", "thickness")
    src = ""
    if base_material is not None:
        from calcpad.eng.materials import get_material  # same layer (eng); lazy as in _common.add_material

        try:
            m = base_material if hasattr(base_material, "Fy") else get_material(base_material)
        except InputError as exc:
            raise CheckInputError("base_material", base_material, f"a catalog material name ({exc})") from None
        src = m.name
        base_Fy = base_Fy if base_Fy is not None else f"{m.Fy!r} ksi"
        base_Fu = base_Fu if base_Fu is not None else f"{m.Fu!r} ksi"
    if base_Fy is None:
        raise CheckInputError("base_Fy", None, "the base metal yield stress such as '36 ksi', or base_material='A36'")
    if base_Fu is None:
        raise CheckInputError("base_Fu", None, "the base metal tensile strength such as '58 ksi', or base_material='A36'")
    fy, fy_q = _positive(sh, "base_Fy", base_Fy, "ksi", "stress")
    fu, fu_q = _positive(sh, "base_Fu", base_Fu, "ksi", "stress")
    if fu_q.to("ksi").magnitude < fy_q.to("ksi").magnitude:
        raise CheckInputError("base_Fu", base_Fu, f"a tensile strength at least the yield stress base_Fy = {fy_q:~}")
    return t, fy, fu, src


def add_fillet_weld_check(
    sh: Sheet,
    *,
    R: Any,
    w: Any,
    L: Any,
    t_p: Any,
    t_e: Any = None,
    F_EXX: Any = "70 ksi",
    theta: Any = "0 degree",
    n: int = 1,
    end_loaded: bool = False,
    base_t: Any = None,
    base_Fy: Any = None,
    base_Fu: Any = None,
    base_material: Any = None,
    base_planes: int | None = None,
    suffix: str = "",
) -> list[str]:
    """Add fillet weld strength, minimum/maximum size and minimum length checks.

    With ``base_t`` the base metal along the weld is checked too (AISC 360-16 J4.2 shear
    yielding and shear rupture, see the module docstring).

    Args:
        sh: Sheet to write on.
        R: Required strength of the weld group (force, ≥ 0).
        w: Fillet leg size.
        L: Length of each weld (> 0).
        t_p: Thinner of the parts joined (for the Table J2.4 minimum size).
        t_e: Thickness of the material along whose edge the weld runs (J2.2b maximum size);
            default ``t_p``.
        F_EXX: Filler metal classification strength (70 ksi for E70XX).
        theta: Angle between the line of action of the load and the weld axis, 0..90 degree.
        n: Number of equal welds sharing ``R`` (e.g. 2 for both sides).
        end_loaded: Apply the J2.2b reduction β for long end-loaded welds (Eq. J2-1).
        base_t: Thickness of the base metal the shear plane beside the weld runs through
            (> 0); when given, base-metal shear yielding and rupture are checked.
        base_Fy: Yield stress of that base metal (or from ``base_material``).
        base_Fu: Tensile strength of that base metal (or from ``base_material``), ≥ ``base_Fy``.
        base_material: Material or catalog name (e.g. ``"A36"``) giving ``base_Fy``/``base_Fu``.
        base_planes: Number of base-metal shear planes carrying ``R``; default ``n`` (one per
            weld). Use 1 for welds on both faces of one plate along the same line.
        suffix: Name suffix.

    Returns:
        Keys of the checks added (``ratio_gv`` and ``ratio_nv`` for the base metal when checked).
    """
    if not (isinstance(n, int) and not isinstance(n, bool) and n >= 1):
        raise CheckInputError("n", n, "a whole number of welds >= 1")
    base = _base_metal_inputs(sh, base_t, base_Fy, base_Fu, base_material, base_planes)
    calc = Calc(sh, suffix)
    sh.heading(f"Fillet weld{f' [{suffix}]' if suffix else ''}", 2)
    calc.given("R_r", R, "Required strength of the weld group", dim="lbf", allow_zero=True,
               sign_hint="enter the magnitude of the force the welds carry")
    calc.given("w", w, "Fillet weld leg size", dim="[length]")
    check_length(calc, "L_w", L, "Length of each weld")
    calc.given("t_p", t_p, "Thinner part joined", dim="[length]")
    calc.given("t_e", t_e if t_e is not None else t_p, "Thickness of the edge the weld runs along", dim="[length]")
    calc.given("F_EXX", F_EXX, "Filler metal classification strength", "AWS A5.1 E70XX: 70 ksi", dim="ksi")
    th = calc.given("theta", theta, "Load angle to the weld axis", "AISC 360-16 J2.4", dim="degree", allow_zero=True)
    if not 0 <= th.to("degree").magnitude <= 90:
        raise CheckInputError("theta", theta, "an angle from 0 degree (longitudinal) to 90 degree (transverse)")
    calc.given("n_w", n, "Number of welds sharing the load", dim="")
    _size_rules(calc)
    keys = []
    calc.branch(
        "w_min",
        MIN_FILLET_CASES,
        "Minimum fillet size",
        unit="in",
        ref="AISC 360-16 Table J2.4",
    )
    calc.branch(
        "w_max",
        MAX_FILLET_CASES,
        "Maximum fillet size along an edge",
        unit="in",
        ref="AISC 360-16 J2.2b(b)",
    )
    calc.step("L_min", "4*w", "Minimum weld length", unit="in", ref="AISC 360-16 J2.2b(c)")
    if end_loaded:
        calc.branch(
            "L_e",
            [("L_w <= 100*w", "L_w", "L <= 100w: beta = 1.0"),
             ("L_w <= 300*w", "(1.2 - 0.002*L_w/w)*L_w", "100w < L <= 300w: beta, Eq. J2-1"),
             (None, "180*w", "L > 300w: L_e = 180w")],
            "Effective length of an end-loaded weld",
            unit="in",
            ref="AISC 360-16 J2.2b(d)",
        )
    else:
        calc.step("L_e", "L_w", "Effective length (not end-loaded)", unit="in", ref="AISC 360-16 J2.2b")
    calc.step("F_nw", "0.60*F_EXX*(1 + 0.5*sin(theta)**1.5)", "Nominal weld stress, directional method", unit="ksi",
              ref="AISC 360-16 Eq. J2-5")
    calc.step("A_we", "n_w*0.707*w*L_e", "Effective throat area of the welds", unit="in^2", ref="AISC 360-16 J2.2a")
    calc.step("R_n", "F_nw*A_we", "Nominal weld strength", unit="kip", ref="AISC 360-16 Eq. J2-4")
    calc.available("R_c", "R_n", "weld", "w", "Available weld strength", unit="kip")
    keys.append(calc.check("Fillet weld strength", "R_r", "R_c", key="ratio_w", ref="AISC 360-16 J2.4"))
    keys.append(calc.check("Fillet size at least the minimum", "w_min", "w", key="ratio_wmin", ref="AISC 360-16 Table J2.4"))
    keys.append(calc.check("Fillet size at most the maximum", "w", "w_max", key="ratio_wmax", ref="AISC 360-16 J2.2b(b)"))
    keys.append(calc.check("Weld length at least 4w", "L_min", "L_w", key="ratio_Lw", ref="AISC 360-16 J2.2b(c)"))
    if base is None:
        sh.note("Base metal at the weld (AISC 360-16 J4) is checked separately.")
    else:
        keys += _add_base_metal(calc, *base, base_planes)
        sh.note("Base metal along the weld checked for shear yielding (AISC 360-16 Eq. J4-3) and shear rupture "
                "(Eq. J4-4) on the shear planes beside the welds; tension and block shear of the connected parts "
                "(J4.1, J4.3) are checked separately.")
    return keys


def _add_base_metal(calc: Calc, t: Any, fy: Any, fu: Any, src: str, planes: int | None) -> list[str]:
    """Write the J4.2 shear yielding / rupture steps and checks of the base metal along the weld."""
    calc.sh.heading(f"Base metal along the weld{f' [{calc.suffix}]' if calc.suffix else ''}", 2)
    calc.given("t_bm", t, "Base metal thickness through the shear plane beside the weld", dim="[length]")
    calc.given("F_y_bm", fy, "Base metal specified minimum yield stress", src, dim="ksi")
    calc.given("F_u_bm", fu, "Base metal specified minimum tensile strength", src, dim="ksi")
    if planes is None:
        calc.step("A_gv", "n_w*t_bm*L_e", "Gross shear area of the base metal (one plane per weld)", unit="in^2",
                  ref="AISC 360-16 J4.2")
    else:
        calc.given("n_bm", planes, "Number of base-metal shear planes", dim="")
        calc.step("A_gv", "n_bm*t_bm*L_e", "Gross shear area of the base metal", unit="in^2", ref="AISC 360-16 J4.2")
    calc.step("A_nv", "A_gv", "Net shear area (welded, no holes)", unit="in^2", ref="AISC 360-16 J4.2")
    calc.step("R_n_gv", "0.60*F_y_bm*A_gv", "Nominal strength, base metal shear yielding", unit="kip",
              ref="AISC 360-16 Eq. J4-3")
    calc.available_with("R_c_gv", "R_n_gv", 1.00, 1.50, "AISC 360-16 J4.2(a)", "gv", "Available strength, base metal shear yielding",
                        unit="kip")
    calc.step("R_n_nv", "0.60*F_u_bm*A_nv", "Nominal strength, base metal shear rupture", unit="kip",
              ref="AISC 360-16 Eq. J4-4")
    calc.available_with("R_c_nv", "R_n_nv", 0.75, 2.00, "AISC 360-16 J4.2(b)", "nv", "Available strength, base metal shear rupture",
                        unit="kip")
    return [
        calc.check("Base metal shear yielding at the weld", "R_r", "R_c_gv", key="ratio_gv", ref="AISC 360-16 Eq. J4-3"),
        calc.check("Base metal shear rupture at the weld", "R_r", "R_c_nv", key="ratio_nv", ref="AISC 360-16 Eq. J4-4"),
    ]


def add_stitch_weld_check(
    sh: Sheet,
    *,
    V: Any,
    Q: Any = None,
    I: Any = None,
    w: Any,
    L_seg: Any,
    s: Any,
    n: int = 2,
    F_EXX: Any = "70 ksi",
    t_p: Any = None,
    t_e: Any = None,
    base: Any = (),
    compression: Any = None,
    Q_over_I: Any = None,
    suffix: str = "",
) -> list[str]:
    """Add a stitch-weld check for a reinforcing member welded alongside an existing one.

    The shear flow at the interface q = V·Q/I (Q of the added part about the neutral axis of
    the combined section, I of the combined section) is carried by ``n`` lines of intermittent
    fillet welds, segments ``L_seg`` long at pitch ``s`` (centre to centre). Instead of ``Q``
    and ``I``, ``Q_over_I`` may give the factor k_Q (1/length) with q = V·k_Q, e.g. the largest
    over all load directions of an unsymmetric section.

    Optional (each adds its checks):
        t_p: Thinner part joined: minimum fillet size, AISC 360-16 Table J2.4.
        t_e: Thickness of the material along whose edge the welds run (e.g. the angle's leg):
            maximum fillet size, J2.2b(b).
        base: Base metal of each member along the welds, a sequence of mappings
            ``{"label", "t", "F_y", "F_u"}``: shear yielding (Eq. J4-3) and rupture (Eq. J4-4)
            of one plane of thickness t per weld line, per unit length of the stitch pattern.
        compression: For a built-up compression member, ``{"t", "F_y", "E"}`` of the thinner
            outside component welded along its edges: E6.2 maximum pitch
            min(0.75 t sqrt(E/F_y), 12 in) (clear spacing taken as the pitch, conservative).

    Returns:
        Keys of the checks added.
    """
    if not (isinstance(n, int) and not isinstance(n, bool) and n >= 1):
        raise CheckInputError("n", n, "a whole number of weld lines >= 1")
    if not isinstance(base, (list, tuple)) or not all(isinstance(b, dict) and {"label", "t", "F_y", "F_u"} <= set(b) for b in base):
        raise CheckInputError("base", base, "a list of {'label', 't', 'F_y', 'F_u'} mappings, one per member along the weld")
    if compression is not None and not (isinstance(compression, dict) and {"t", "F_y"} <= set(compression)):
        raise CheckInputError("compression", compression, "None, or {'t', 'F_y'[, 'E']} of the thinner outside component")
    if (Q_over_I is None) == (Q is None or I is None) or (Q_over_I is not None and (Q is not None or I is not None)):
        raise CheckInputError("Q, I / Q_over_I", (Q, I, Q_over_I), "either Q and I, or Q_over_I alone")
    calc = Calc(sh, suffix)
    sh.heading(f"Stitch welds by shear flow{f' [{suffix}]' if suffix else ''}", 2)
    calc.given("V_r", V, "Required shear at the section", dim="lbf", allow_negative=True, allow_zero=True)
    if Q_over_I is None:
        calc.given("Q_a", Q, "First moment of the added part about the neutral axis", dim="in**3")
        calc.given("I_c", I, "Moment of inertia of the combined section", dim="in**4")
        calc.step("q", "abs(V_r)*Q_a/I_c", "Shear flow at the interface", unit="kip/in", ref="q = V*Q/I, common practice")
    else:
        calc.given("k_Qc", Q_over_I, "Shear flow per unit shear, k_Q = q/V", dim="1/in")
        calc.step("q", "abs(V_r)*k_Qc", "Shear flow at the interface", unit="kip/in", ref="q = V*k_Q, common practice")
    calc.given("w", w, "Fillet weld leg size", dim="[length]")
    lseg = check_length(calc, "L_seg", L_seg, "Length of each weld segment")
    pitch = check_length(calc, "s", s, "Pitch of the segments (centre to centre)")
    if pitch.to("in").magnitude < lseg.to("in").magnitude:
        raise CheckInputError("s", s, f"a pitch at least the segment length L_seg = {lseg:~} (use a continuous weld otherwise)")
    calc.given("n_l", n, "Number of weld lines", dim="")
    calc.given("F_EXX", F_EXX, "Filler metal classification strength", "AWS A5.1 E70XX: 70 ksi", dim="ksi")
    calc.given("L_abs", "1.5 in", "Absolute minimum segment length", "AISC 360-16 J2.2b(e)", dim="[length]")
    calc.step("F_nw", "0.60*F_EXX", "Nominal weld stress (longitudinal, theta = 0)", unit="ksi", ref="AISC 360-16 Eq. J2-5")
    calc.step("r_n", "0.707*w*F_nw", "Nominal strength per unit length of one weld line", unit="kip/in", ref="AISC 360-16 Eq. J2-4")
    calc.available("r_c", "r_n", "weld", "w", "Available strength per unit length", unit="kip/in")
    calc.step("q_c", "n_l*r_c*L_seg/s", "Available shear flow of the stitch pattern", unit="kip/in")
    keys = [calc.check("Stitch welds: shear flow", "q", "q_c", key="ratio_q", ref="AISC 360-16 J2.4")]
    calc.step("L_segmin", "max(4*w, L_abs)", "Minimum segment length", unit="in", ref="AISC 360-16 J2.2b(e)")
    keys.append(calc.check("Stitch segment length", "L_segmin", "L_seg", key="ratio_Lseg", ref="AISC 360-16 J2.2b(e)"))
    if t_p is not None or t_e is not None:
        _size_rules(calc)
    if t_p is not None:
        calc.given("t_p", t_p, "Thinner part joined", dim="[length]")
        calc.branch("w_min", MIN_FILLET_CASES,
                    "Minimum fillet size", unit="in", ref="AISC 360-16 Table J2.4")
        keys.append(calc.check("Stitch fillet size at least the minimum", "w_min", "w", key="ratio_wmin", ref="AISC 360-16 Table J2.4"))
    if t_e is not None:
        calc.given("t_e", t_e, "Thickness of the edge the welds run along", dim="[length]")
        calc.branch("w_max", MAX_FILLET_CASES,
                    "Maximum fillet size along an edge", unit="in", ref="AISC 360-16 J2.2b(b)")
        keys.append(calc.check("Stitch fillet size at most the maximum", "w", "w_max", key="ratio_wmax", ref="AISC 360-16 J2.2b(b)"))
    for i, b in enumerate(base, start=1):
        keys += _stitch_base_metal(calc, i, b)
    if compression is not None:
        calc.given("t_o", compression["t"], "Thinner outside component of the built-up compression member", dim="[length]")
        calc.given("F_y_o", compression["F_y"], "Its yield stress", dim="ksi")
        calc.given("E_o", compression.get("E", "29000 ksi"), "Modulus of elasticity", dim="ksi")
        calc.given("s_12", "12 in", "Absolute maximum pitch", "AISC 360-16 E6.2(b)", dim="[length]")
        calc.step("s_max", "min(0.75*t_o*sqrt(E_o/F_y_o), s_12)", "Maximum pitch of intermittent welds along the edges of an outside "
                  "component", unit="in", ref="AISC 360-16 E6.2(b)")
        keys.append(calc.check("Stitch pitch, built-up compression member", "s", "s_max", key="ratio_smax",
                               ref="AISC 360-16 E6.2(b)"))
    else:
        sh.note("Maximum stitch spacing rules for built-up compression members (AISC 360-16 E6) do not apply (no axial "
                "compression given) or are checked separately.")
    return keys


def _stitch_base_metal(calc: Calc, i: int, b: dict) -> list[str]:
    """J4.2 shear yielding and rupture of one member's base metal beside each weld line, per unit length."""
    label = str(b["label"])
    calc.given(f"t_bm{i}", b["t"], f"Base metal thickness beside the welds, {label}", dim="[length]")
    calc.given(f"F_y_bm{i}", b["F_y"], f"Yield stress, {label}", dim="ksi")
    calc.given(f"F_u_bm{i}", b["F_u"], f"Tensile strength, {label}", dim="ksi")
    calc.step(f"r_ngv{i}", f"0.60*F_y_bm{i}*t_bm{i}", f"Base metal shear yielding per unit length, {label}", unit="kip/in",
              ref="AISC 360-16 Eq. J4-3")
    calc.available_with(f"r_cgv{i}", f"r_ngv{i}", 1.00, 1.50, "AISC 360-16 J4.2(a)", "gv", "Available base metal shear yielding",
                        unit="kip/in")
    calc.step(f"r_nnv{i}", f"0.60*F_u_bm{i}*t_bm{i}", f"Base metal shear rupture per unit length, {label}", unit="kip/in",
              ref="AISC 360-16 Eq. J4-4")
    calc.available_with(f"r_cnv{i}", f"r_nnv{i}", 0.75, 2.00, "AISC 360-16 J4.2(b)", "nv", "Available base metal shear rupture",
                        unit="kip/in")
    calc.step(f"q_bm{i}", f"n_l*min(r_cgv{i}, r_cnv{i})*L_seg/s", f"Available shear flow of the base metal, {label}", unit="kip/in",
              ref="AISC 360-16 J4.2")
    return [calc.check(f"Stitch welds: base metal of {label}", "q", f"q_bm{i}", key=f"ratio_bm{i}", ref="AISC 360-16 J4.2")]
