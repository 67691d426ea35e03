"""Elastic buckling stress F_e of a compression member, AISC 360-16 E3, E4 and E5.

Writes the slenderness and elastic buckling steps a compression check needs and returns how
the critical stress branch should be conditioned:

* flexural buckling about the least radius (round sections, square HSS, a given ``r``): E3-4;
* flexural buckling about x and y with their own effective lengths (I-shapes, rectangular
  HSS, tees, bars): the larger slenderness governs, E3-4;
* torsional buckling of doubly symmetric I-shapes (E4-2) and flexural-torsional buckling of
  tees (E4-3, symmetric about y) and channels (symmetric about x) with ``L_cz``;
* single angles end-connected through one leg: effective slenderness E5-1..E5-4.
"""

from __future__ import annotations

from typing import Any

from calcpad.eng.checks._common import Calc, CheckInputError, CheckNotCoveredError, warn
from calcpad.eng.checks._section import Sec

__all__ = ["E5_CASES", "validate_angle_e5", "write_e3_transition", "write_elastic_buckling"]

#: Single-angle E5 cases: truss kind -> (limit, (a1, b1), (a2, b2), short-leg add, floor on L/r_z).
E5_CASES: dict[str, tuple[float, tuple[float, float], tuple[float, float], float, float, str]] = {
    "planar": (80.0, (72.0, 0.75), (32.0, 1.25), 4.0, 0.95, "E5(a)"),
    "space": (75.0, (60.0, 0.8), (45.0, 1.0), 6.0, 0.82, "E5(b)"),
}


def write_elastic_buckling(
    calc: Calc,
    sec: Sec,
    *,
    L_y: Any = None,
    K_y: Any = None,
    L_z: Any = None,
    K_z: Any = None,
    r: Any = None,
    connected_leg: str | None = None,
    truss: str = "planar",
) -> bool:
    """Write KL/r and F_e steps; return True when E3-2 is conditioned on F_y/F_e (E4, E5).

    ``L`` and ``K`` (about x, or the only axis) must already be on the sheet.
    """
    if sec.kind == "angle":
        _angle_e5(calc, sec, connected_leg, truss)
        return True
    two_axes = r is None and sec.kind not in ("round_hss", "round_bar") and (
        sec.kind in ("i_shape", "tee", "channel") or L_y is not None or K_y is not None
        or abs(sec.need("rx", "E3") - sec.need("ry", "E3")) > 1e-9 * sec.need("rx", "E3")
    )
    if r is not None:
        calc.given("r", r, "Radius of gyration (governing axis)", dim="[length]")
    if not two_axes:
        if r is None:
            calc.prop("r", sec.need("r_min", "compression check"), "in", "Least radius of gyration", sec)
        calc.step("KL_r", "K*L/r", "Slenderness ratio", ref="AISC 360-16 E2")
    else:
        _two_axes(calc, sec, L_y, K_y)
    kl_r = calc.value("KL_r")
    if kl_r > 200:
        warn(calc.sh, f"KL/r = {kl_r:.0f} exceeds 200, the preferred limit of AISC 360-16 E2 (User Note); the check's status "
             "says so")
    if sec.kind == "i_shape" and r is None:
        calc.step("F_e_fb", "pi**2*E/KL_r**2", "Elastic flexural buckling stress", unit="ksi", ref="AISC 360-16 Eq. E3-4")
        _lz(calc, L_z, K_z)
        d, tf = sec.need("d", "E4"), sec.need("tf", "E4")
        calc.prop("J", sec.need("J", "E4"), "in**4", "Torsional constant", sec, shared=True)
        calc.prop("h_o", d - tf, "in", "Distance between flange centroids, d - tf", sec, shared=True)
        if sec.get("Cw") is not None:
            calc.prop("C_w", sec.need("Cw", "E4"), "in**6", "Warping constant, as tabulated", sec, shared=True)
        else:
            calc.step_once("C_w", "I_y*h_o**2/4", "Warping constant, doubly symmetric I", unit="in^6", ref="AISC 360-16 E4 User Note")
        calc.step("F_e_tb", "(pi**2*E*C_w/(K_z*L_z)**2 + G*J)/(I_x + I_y)", "Elastic torsional buckling stress", unit="ksi",
                  ref="AISC 360-16 Eq. E4-2")
        calc.select("F_e", "min", {"F_e_fb": "flexural buckling (E3-4)", "F_e_tb": "torsional buckling (E4-2)"},
                    "Elastic buckling stress", unit="ksi", ref="AISC 360-16 E3, E4")
        return True
    if sec.kind in ("tee", "channel") and r is None:
        _singly_symmetric_e4(calc, sec, L_z, K_z)
        return True
    calc.step("F_e", "pi**2*E/KL_r**2", "Elastic buckling stress", unit="ksi", ref="AISC 360-16 Eq. E3-4")
    return False


def write_e3_transition(calc: Calc) -> str:
    """Write the slenderness where E3 changes from inelastic (E3-2) to elastic (E3-3) buckling,
    4.71*sqrt(E/F_y) (``E`` and ``F_y`` must be on the sheet); returns its sheet name."""
    return calc.step("KL_r_lim", "4.71*sqrt(E/F_y)", "Slenderness at the change from inelastic to elastic buckling",
                     ref="AISC 360-16 E3(a)")


def _two_axes(calc: Calc, sec: Sec, L_y: Any, K_y: Any) -> None:
    """Slenderness about x (L, K) and y (L_y, K_y, default L, K); the larger governs."""
    calc.given("L_y", L_y if L_y is not None else calc.name("L"), "Unbraced length for buckling about y", dim="[length]",
               sign_hint="a length measured along the member, > 0")
    ky = calc.given("K_y", K_y if K_y is not None else calc.name("K"), "Effective length factor about y", dim="")
    if K_y is not None and not 0.5 <= float(ky.magnitude) <= 2.5:
        warn(calc.sh, f"K_y = {float(ky.magnitude):g} is outside the usual range 0.5 to 2.5 (Commentary Table C-A-7.1)")
    calc.prop("r_x", sec.need("rx", "E3"), "in", "Radius of gyration about x", sec)
    calc.prop("r_y", sec.need("ry", "E3"), "in", "Radius of gyration about y", sec)
    calc.prop("I_x", sec.need("Ix", "E4"), "in**4", "Moment of inertia about x", sec, shared=True)
    calc.prop("I_y", sec.need("Iy", "E4"), "in**4", "Moment of inertia about y", sec, shared=True)
    calc.step("KL_rx", "K*L/r_x", "Slenderness about x", ref="AISC 360-16 E2")
    calc.step("KL_ry", "K_y*L_y/r_y", "Slenderness about y", ref="AISC 360-16 E2")
    calc.select("KL_r", "max", {"KL_rx": "about x", "KL_ry": "about y"}, "Governing slenderness ratio", ref="AISC 360-16 E2")


def _lz(calc: Calc, L_z: Any, K_z: Any) -> None:
    """Torsional unbraced length and factor (default: those about y)."""
    calc.given("L_z", L_z if L_z is not None else calc.name("L_y"), "Unbraced length for twisting", dim="[length]",
               sign_hint="a length measured along the member, > 0")
    calc.given("K_z", K_z if K_z is not None else calc.name("K_y"), "Effective length factor for twisting", dim="")


def _singly_symmetric_e4(calc: Calc, sec: Sec, L_z: Any, K_z: Any) -> None:
    """Flexural buckling about the other axis and flexural-torsional buckling about the axis of
    symmetry (y for tees, x for channels), Eq. E4-3 with the axes named accordingly."""
    _lz(calc, L_z, K_z)
    tee = sec.kind == "tee"
    sym, other, off = ("y", "x", "y_o") if tee else ("x", "y", "x_o")
    calc.prop("J", sec.need("J", "E4"), "in**4", "Torsional constant", sec, shared=True)
    where = "flange mid-thickness" if tee else "behind the web"
    calc.prop(off, sec.need(off, "E4"), "in", f"Centroid to shear centre ({where})", sec)
    calc.step(f"F_e{other}", f"pi**2*E/KL_r{other}**2", f"Elastic flexural buckling stress about {other}", unit="ksi",
              ref=f"AISC 360-16 Eq. {'E4-5' if other == 'x' else 'E4-6'}")
    calc.step(f"F_e{sym}", f"pi**2*E/KL_r{sym}**2", f"Elastic flexural buckling stress about {sym}", unit="ksi",
              ref=f"AISC 360-16 Eq. {'E4-5' if sym == 'x' else 'E4-6'}")
    calc.step("r_o", f"sqrt({off}**2 + (I_x + I_y)/A_g)", "Polar radius of gyration about the shear centre", unit="in",
              ref="AISC 360-16 Eq. E4-9")
    if tee:
        calc.step("F_ez", "G*J/(A_g*r_o**2)", "Elastic torsional buckling stress (C_w omitted for tees)", unit="ksi",
                  ref="AISC 360-16 Eq. E4-7 and User Note")
    else:
        calc.prop("C_w", sec.need("Cw", "E4"), "in**6", "Warping constant", sec, shared=True)
        calc.step("F_ez", "(pi**2*E*C_w/(K_z*L_z)**2 + G*J)/(A_g*r_o**2)", "Elastic torsional buckling stress", unit="ksi",
                  ref="AISC 360-16 Eq. E4-7")
    calc.step("H", f"1 - {off}**2/r_o**2", "Flexural constant", ref="AISC 360-16 Eq. E4-8")
    fs = f"F_e{sym}"
    calc.step("F_e_ftb", f"({fs} + F_ez)/(2*H)*(1 - sqrt(1 - 4*{fs}*F_ez*H/({fs} + F_ez)**2))",
              "Elastic flexural-torsional buckling stress", unit="ksi", ref="AISC 360-16 Eq. E4-3")
    calc.select("F_e", "min", {f"F_e{other}": f"flexural buckling about {other}", "F_e_ftb": "flexural-torsional buckling (E4-3)"},
                "Elastic buckling stress", unit="ksi", ref="AISC 360-16 E4")


def validate_angle_e5(sec: Sec, connected_leg: str | None, truss: str) -> None:
    """Raise before anything is written when a single angle is outside what E5 covers."""
    if sec.kind != "angle":
        if connected_leg is not None:
            raise CheckInputError("connected_leg", connected_leg, "nothing: it applies to single angles only")
        return
    if connected_leg not in ("long", "short"):
        raise CheckNotCoveredError(
            "connected_leg", connected_leg,
            "'long' or 'short' for a single angle end-connected through one leg (AISC 360-16 E5); angles loaded "
            "otherwise need E4 and Chapter H and are not covered by this check",
        )
    if not isinstance(truss, str) or truss not in E5_CASES:
        raise CheckInputError("truss", truss, "'planar' (individual members, planar truss webs, E5(a)) or 'space' (box or space truss webs, E5(b))")
    d, b = sec.need("d", "E5"), sec.need("b", "E5")
    if max(d, b) / min(d, b) >= 1.7:
        raise CheckNotCoveredError("section", sec.label, f"single angles with a leg ratio below 1.7 (this one: {max(d, b) / min(d, b):.2f}; "
                                   "AISC 360-16 E5(5)); others need Chapter H for the eccentric load")


def _angle_e5(calc: Calc, sec: Sec, connected_leg: str | None, truss: str) -> None:
    """Single angle loaded through one leg: effective slenderness of E5 and F_e from it."""
    validate_angle_e5(sec, connected_leg, truss)
    limit, (a1, b1), (a2, b2), add, floor, clause = E5_CASES[truss]
    d, b = sec.need("d", "E5"), sec.need("b", "E5")
    long_leg, short_leg = max(d, b), min(d, b)
    fy, e = calc.value("F_y", "ksi"), calc.value("E", "ksi")
    if long_leg / sec.need("t", "E5") > 0.71 * (e / fy) ** 0.5:
        raise CheckNotCoveredError("b/t", round(long_leg / sec.need("t", "E5"), 2),
                                   f"b/t <= 0.71*sqrt(E/Fy) = {0.71 * (e / fy) ** 0.5:.1f}: thinner angles need flexural-torsional "
                                   "buckling (AISC 360-16 E4), which this check does not cover")
    # the axis parallel to the connected leg: the long leg is vertical (along y) in the shapes
    along_y = (connected_leg == "long") == (d >= b)
    calc.prop("r_a", sec.need("ry" if along_y else "rx", "E5"), "in", "Radius of gyration about the geometric axis parallel to the connected leg",
              sec.label)
    calc.prop("r_z", sec.need("r_min", "E5"), "in", "Least radius of gyration (principal axis z)", sec)
    calc.step("L_ra", "L/r_a", "Slenderness about the axis parallel to the connected leg", ref=f"AISC 360-16 {clause}")
    calc.branch(
        "KL_r0",
        [(f"L_ra <= {limit:g}", f"{a1:g} + {b1:g}*L_ra", f"L/r_a <= {limit:g}, Eq. E5-{1 if truss == 'planar' else 3}"),
         (None, f"{a2:g} + {b2:g}*L_ra", f"L/r_a > {limit:g}, Eq. E5-{2 if truss == 'planar' else 4}")],
        "Effective slenderness ratio",
        ref=f"AISC 360-16 {clause}(1)",
    )
    if connected_leg == "short" and long_leg > short_leg:
        calc.prop("b_lg", long_leg, "in", "Long leg", sec)
        calc.prop("b_sh", short_leg, "in", "Short leg", sec)
        calc.step("KL_r", f"max(KL_r0 + {add:g}*((b_lg/b_sh)**2 - 1), {floor:g}*L/r_z)",
                  "Effective slenderness, unequal legs connected through the shorter leg", ref=f"AISC 360-16 {clause}(2)")
    else:
        calc.step("KL_r", "KL_r0", "Effective slenderness ratio L_c/r", ref=f"AISC 360-16 {clause}(1)")
    kl_r = calc.value("KL_r")
    if kl_r > 200:
        raise CheckNotCoveredError("L_c/r", round(kl_r, 1), "an effective slenderness L_c/r <= 200, the limit of the E5 "
                                   "equations (AISC 360-16 Eqs. E5-2, E5-4); a longer single angle needs Chapter H")
    calc.step("F_e", "pi**2*E/KL_r**2", "Elastic buckling stress", unit="ksi", ref="AISC 360-16 Eq. E3-4")
    calc.sh.note("E5 applies to an angle loaded at its ends through the same one leg, welded or with at least two bolts, "
                 "without transverse load between its ends; the eccentricity is then accounted for by L_c/r.")

