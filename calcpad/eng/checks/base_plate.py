"""Column base plates on concrete: bearing (AISC 360-16 J8) and plate thickness, for axial
compression alone or with a moment, by the method of AISC Design Guide 1, 2nd ed. (2006),
Sections 3.1, 3.3 and 4.3 (from memory).

* Axial only: cantilever lengths m, n (and λn' for W-shapes), t_min = l·sqrt(2 P/(φ F_y B N)).
* With a moment, the bearing stress is uniform over a length Y. Small eccentricity
  (e <= e_crit = N/2 - P/(2 q_max)): Y = N - 2e, no anchor tension. Large eccentricity: q = q_max,
  Y from moment equilibrium about the anchor rods, anchor tension T = q_max·Y - P; the plate is
  also checked for bending from T on the tension side.

The small/large case is a branch evaluated with the values when the rods are given, so a
what-if change of P or M that crosses e_crit follows (P = 0 is a pure moment, large case); a
plate too short for the bearing to balance the moment shows as an NG bearing check, and so does
an axial load larger than the bearing up to the rod line can carry, P > q_max (f + N/2): the
rods then lie inside the bearing and take no tension (statics; Design Guide 1 assumes the
bearing block ends before the rods, which fails there: its T = q_max Y - P would be negative).

Plate bending is written with the available yield stress F_ya = φF_y or F_y/Ω, so the Guide's
constants appear unfolded: 1.5 m·sqrt(f_p/F_y) is m·sqrt(2 f_p/(0.9 F_y)) (LRFD), 2.11 is
sqrt(4/0.9); in ASD they become 1.83 and 2.58. The check writes the demand as the plate thickness needed and the capacity as the thickness
provided. Anchor rod steel in tension is checked (J3.6 with F_nt = 0.75 F_u); concrete
breakout, pullout and side-face blowout (ACI 318 Chapter 17) are in
:mod:`calcpad.eng.checks.anchorage` (give it ``N_ua="T_a"`` of this check).
"""

from __future__ import annotations

from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.eng.checks._common import Calc, CheckInputError, CheckNotCoveredError, add_material, check_length
from calcpad.eng.checks._section import resolve_section

__all__ = ["add_base_plate_check"]

_PHI_C, _OMEGA_C = 0.65, 2.31  # AISC 360-16 J8
_PHI_B, _OMEGA_B = 0.90, 1.67  # plate bending, AISC Design Guide 1


def add_base_plate_check(
    sh: Sheet,
    column: Any,
    *,
    P: Any,
    B: Any,
    N: Any,
    t_p: Any,
    f_c: Any,
    M: Any = None,
    A2_A1: Any = 1.0,
    f: Any = None,
    n_rods: int = 2,
    d_rod: Any = None,
    F_u_rod: Any = "58 ksi",
    material: Any = None,
    F_y: Any = None,
    suffix: str = "",
) -> list[str]:
    """Add the base plate checks for a column.

    Args:
        sh: Sheet to write on.
        column: The column's section (W-shape, rectangular or round HSS / pipe).
        P: Required axial compression (> 0; uplift is not covered here).
        B, N: Plate width and length (N along the moment direction), each larger than the column.
        t_p: Plate thickness provided.
        f_c: Concrete compressive strength f'c.
        M: Required moment about the plate's B axis (magnitude used); None or 0 for axial only.
        A2_A1: Ratio of the concentric supporting concrete area to the plate area (1 to 4).
        f: Distance from the plate centre to the anchor rods on the tension side (with M).
        n_rods, d_rod, F_u_rod: Anchor rods on the tension side, their diameter and tensile
            strength (ASTM F1554 Gr 36: 58 ksi), for the rod tension check when there is any.
        material / F_y: Plate steel.
        suffix: Name suffix.

    Returns:
        Keys of the checks added.
    """
    sec = resolve_section(column, None)
    if sec.kind not in ("i_shape", "rect_hss", "round_hss"):
        raise CheckNotCoveredError("column", f"{sec.kind} ({sec.label})", "a W-shape, rectangular HSS or round HSS/pipe column")
    if not (isinstance(n_rods, int) and not isinstance(n_rods, bool) and n_rods >= 1):
        raise CheckInputError("n_rods", n_rods, "a whole number of anchor rods on the tension side >= 1")
    calc = Calc(sh, suffix)
    sh.heading(f"Base plate, {sec.label}{f' [{suffix}]' if suffix else ''}", 2)
    add_material(calc, material, F_y, need_e=False)
    calc.given("P_r", P, "Required axial compression", dim="lbf", allow_zero=True,
               sign_hint="compression is entered as a positive force; uplift on a base plate is not covered here")
    check_length(calc, "B_p", B, "Plate width")
    check_length(calc, "N_p", N, "Plate length (along the moment)")
    check_length(calc, "t_p", t_p, "Plate thickness provided")
    calc.given("f_c", f_c, "Concrete compressive strength f'c", dim="ksi")
    ratio = calc.given("A2_A1", A2_A1, "Supporting concrete area / plate area, A_2/A_1", "AISC 360-16 J8", dim="")
    if not 1.0 <= float(ratio.magnitude) <= 4.0 + 1e-12:
        raise CheckInputError("A2_A1", A2_A1, "a ratio from 1 to 4 (sqrt(A_2/A_1) <= 2, AISC 360-16 J8)")
    calc.step("A_1", "B_p*N_p", "Plate area", unit="in^2")
    calc.step("f_pmax", "min(0.85*f_c*sqrt(A2_A1), 1.7*f_c)", "Nominal bearing stress", unit="ksi", ref="AISC 360-16 Eq. J8-2")
    calc.available_with("f_pa", "f_pmax", _PHI_C, _OMEGA_C, "AISC 360-16 J8", "c", "Available bearing stress", unit="ksi")
    calc.step("q_max", "f_pa*B_p", "Available bearing force per unit length", unit="kip/in", ref="AISC Design Guide 1, 3.3")
    calc.available_with("F_ya", "F_y", _PHI_B, _OMEGA_B, "AISC Design Guide 1, 3.1", "p", "Plate yield stress for bending", unit="ksi")
    _footprint(calc, sec)  # after A_1 and f_pa: its formulas name them
    keys: list[str] = []
    moment = False
    if M is not None:  # a moment named on the sheet stays live (sh.set, what-if), so it takes the moment path even at 0
        m_r = calc.given("M_r", M, "Required moment", dim="lbf*in", allow_negative=True, allow_zero=True)
        moment = (isinstance(M, str) and M in sh) or float(m_r.to("kip*in").magnitude) != 0.0
    if not moment:
        calc.step("f_p", "P_r/A_1", "Bearing stress", unit="ksi", ref="AISC Design Guide 1, 3.1")
        keys.append(calc.check("Concrete bearing", "f_p", "f_pa", key="ratio_fp", ref="AISC 360-16 J8"))
        calc.step("t_req", "l_c*sqrt(2*P_r/(F_ya*B_p*N_p))", "Plate thickness required", unit="in", ref="AISC Design Guide 1, Eq. 3.3.13")
    else:
        _moment_case(calc, f, n_rods, d_rod, F_u_rod, keys)
    keys.append(calc.check("Base plate thickness", "t_req", "t_p", key="ratio_tp", ref="AISC Design Guide 1"))
    sh.note("Anchorage in the concrete (breakout, pullout, side-face blowout; ACI 318 Chapter 17), the welds of the column "
            "to the plate and shear transfer at the base are checked separately.")
    return keys


def _footprint(calc: Calc, sec: Any) -> None:
    """Cantilever lengths m, n (and λn' for a W-shape) and the governing l."""
    if sec.kind == "round_hss":
        calc.prop("d_c", sec.need("D", "base plate"), "in", "Column outside diameter", sec)
        calc.prop("t_c", sec.need("t", "base plate"), "in", "Column wall thickness", sec)
        calc.step("m", "(N_p - 0.8*d_c)/2", "Cantilever length along N", unit="in", ref="AISC Design Guide 1, 4.3")
        calc.step("n", "(B_p - 0.8*d_c)/2", "Cantilever length along B", unit="in", ref="AISC Design Guide 1, 4.3")
        calc.step("l_c", "max(m, n)", "Governing cantilever length", unit="in")
        return
    if sec.kind == "rect_hss":
        calc.prop("d_c", sec.need("H", "base plate"), "in", "Column depth (along N)", sec)
        calc.prop("b_c", sec.need("B", "base plate"), "in", "Column width (along B)", sec)
        calc.prop("t_c", sec.need("t", "base plate"), "in", "Column wall thickness", sec)
        calc.step("m", "(N_p - 0.95*d_c)/2", "Cantilever length along N", unit="in", ref="AISC Design Guide 1, 4.3")
        calc.step("n", "(B_p - 0.95*b_c)/2", "Cantilever length along B", unit="in", ref="AISC Design Guide 1, 4.3")
        calc.step("l_c", "max(m, n)", "Governing cantilever length", unit="in")
        return
    calc.prop("d_c", sec.need("d", "base plate"), "in", "Column depth (along N)", sec)
    calc.prop("b_f", sec.need("bf", "base plate"), "in", "Column flange width (along B)", sec)
    calc.prop("t_c", sec.need("tf", "base plate"), "in", "Column flange thickness", sec)
    calc.step("m", "(N_p - 0.95*d_c)/2", "Cantilever length along N", unit="in", ref="AISC Design Guide 1, Eq. 3.1.5")
    calc.step("n", "(B_p - 0.8*b_f)/2", "Cantilever length along B", unit="in", ref="AISC Design Guide 1, Eq. 3.1.6")
    calc.step("X_c", "4*d_c*b_f/(d_c + b_f)**2*P_r/(A_1*f_pa)", "Factor X", ref="AISC Design Guide 1, Eq. 3.1.4")
    calc.step("lambda_c", "min(2*sqrt(X_c)/(1 + sqrt(1 - min(X_c, 1))), 1)", "Factor λ (at most 1)", ref="AISC Design Guide 1, Eq. 3.1.3")
    calc.step("n_p", "sqrt(d_c*b_f)/4", "Yield-line cantilever n'", unit="in", ref="AISC Design Guide 1, Eq. 3.1.7")
    calc.step("l_c", "max(m, n, lambda_c*n_p)", "Governing cantilever length", unit="in", ref="AISC Design Guide 1, 3.1")


def _moment_case(calc: Calc, f: Any, n_rods: int, d_rod: Any, F_u_rod: Any, keys: list[str]) -> None:
    """Uniform bearing over Y; small or large eccentricity (Design Guide 1, 3.3 and 3.4).

    With the rods given, the case is a branch evaluated with the values (any P >= 0 and M work,
    also under ``sh.set`` and in a what-if panel). Without them only a small moment can be
    checked, and the case is fixed when the sheet is built.
    """
    calc.step("e_crit", "N_p/2 - P_r/(2*q_max)", "Critical eccentricity", unit="in", ref="AISC Design Guide 1, Eq. 3.3.7")
    if f is None or d_rod is None:
        P = calc.value("P_r", "kip")
        if P <= 0 or abs(calc.value("M_r", "kip*in")) / P > calc.value("e_crit", "in"):
            raise CheckInputError("f / d_rod", (f, d_rod), "the anchor rod distance f and rod diameter d_rod: the moment puts the "
                                  "rods in tension")
        calc.step("e", "abs(M_r)/P_r", "Eccentricity", unit="in", ref="AISC Design Guide 1, 3.3")
        calc.step("Y", "N_p - 2*e", "Bearing length (small moment)", unit="in", ref="AISC Design Guide 1, Eq. 3.3.4")
        calc.step("q", "P_r/Y", "Bearing force per unit length", unit="kip/in", ref="AISC Design Guide 1, 3.3.1")
        keys.append(calc.check("Concrete bearing (small moment)", "q", "q_max", key="ratio_fp", ref="AISC 360-16 J8"))
        calc.step("f_p", "q/B_p", "Bearing stress", unit="ksi")
        _bearing_side(calc, "t_req", "Plate thickness required (bearing side)", "AISC Design Guide 1, 3.3.2")
        calc.sh.note("Small eccentricity (e <= e_crit): the anchor rods carry no tension. No anchor rods were given, so a "
                     "change that makes the moment large needs the rods (f, d_rod) and a rebuilt sheet.")
        return
    calc.given("f_a", f, "Plate centre to the anchor rods (tension side)", dim="[length]")
    if calc.value("f_a", "in") >= calc.value("N_p", "in") / 2:
        raise CheckInputError("f", f, f"anchor rods on the plate: f < N/2 = {calc.value('N_p', 'in') / 2:g} in (half the plate length N)")
    calc.step("k_Y", "f_a + N_p/2", "f + N/2", unit="in")
    calc.step("Y_disc", "k_Y**2 - 2*(abs(M_r) + P_r*f_a)/q_max", "Discriminant, (f + N/2)^2 - 2P(e + f)/q_max (>= 0 when the "
              "bearing can balance the moment)", unit="in^2", ref="AISC Design Guide 1, Eq. 3.4.4")
    # The rods take tension once the eccentricity passes e_lim. Design Guide 1: e_lim = e_crit, the
    # bearing block q_max Y = P + T ending before the rod line (P <= q_max (f + N/2), so T >= 0). A
    # larger P puts the rods inside the bearing (statics): no rod tension while the resultant stays
    # on the plate (e < N/2, uniform bearing over N - 2e at q > q_max: NG); beyond, the block reaches
    # the rod line, Y = f + N/2, at the q that balances the moment about the rods (Y_disc < 0: NG).
    rods = "P_r <= q_max*k_Y"
    calc.branch("e_lim", [(rods, "e_crit", "the bearing block ends before the rod line: rods in tension once e >= e_crit"),
                          (None, "N_p/2", "P_r > q_max (f + N/2): the rods lie inside the bearing; tension once e >= N/2")],
                "Eccentricity at which the anchor rods take tension", unit="in", ref="AISC Design Guide 1, 3.3 and 3.4; statics")
    small = "abs(M_r) < P_r*e_lim"  # P = 0 (pure moment) is large; at e = e_crit both cases give Y = P/q_max
    small_label, large_label = "e = M/P < e_lim: no rod tension", "e >= e_lim: rods in tension"
    calc.branch("Y", [(small, "N_p - 2*abs(M_r)/P_r", small_label + ", Eq. 3.3.4"),
                      (None, "k_Y*(1 - sqrt(max(Y_disc/k_Y**2, 0)))", large_label + ", Eq. 3.4.3")],
                "Bearing length", unit="in", ref="AISC Design Guide 1, 3.3 and 3.4")
    calc.branch("q", [(small, "P_r/Y", small_label), (None, "2*(abs(M_r) + P_r*f_a)/k_Y**2", large_label +
                       ": least bearing force per length that balances the moment about the rods (Y = f + N/2)")],
                "Bearing force per unit length needed", unit="kip/in", ref="AISC Design Guide 1, 3.3.1 and Eq. 3.4.4")
    keys.append(calc.check("Concrete bearing", "q", "q_max", key="ratio_fp", ref="AISC 360-16 J8"))
    beyond = "P_r > q_max (f + N/2): bearing up to the rod line at q (NG)"
    calc.branch("T_a", [(small, "0*P_r", small_label), (rods, "q_max*Y - P_r", large_label + ", Eq. 3.4.2"),
                        (None, "q*Y - P_r", beyond)],
                "Anchor rod tension (all rods on the tension side)", unit="kip", ref="AISC Design Guide 1, 3.3 and 3.4")
    calc.branch("f_p", [(small, "q/B_p", small_label), (rods, "q_max/B_p", large_label + ": at the available limit"),
                        (None, "q/B_p", beyond)],
                "Bearing stress", unit="ksi", ref="AISC Design Guide 1, 3.3 and 3.4")
    _bearing_side(calc, "t_b", "Plate thickness, bearing side", "AISC Design Guide 1, 3.3.2 and 3.4")
    calc.step("x_t", "f_a - d_c/2 + t_c/2", "Rod line to the middle of the column's tension flange or wall", unit="in",
              ref="AISC Design Guide 1, 3.4")
    if calc.value("x_t", "in") <= 0:
        raise CheckInputError("f", f, "anchor rods outside the column's tension flange or wall (f > d/2 - t/2)")
    calc.step("t_t", "sqrt(4*T_a*x_t/(B_p*F_ya))", "Plate thickness, tension side (0 without rod tension)", unit="in",
              ref="AISC Design Guide 1, Eq. 3.4.7")
    calc.step("t_req", "max(t_b, t_t)", "Plate thickness required", unit="in")
    calc.given("n_r", n_rods, "Anchor rods on the tension side", dim="")
    calc.given("d_r", d_rod, "Anchor rod diameter", dim="[length]")
    calc.given("F_ur", F_u_rod, "Anchor rod tensile strength", "ASTM F1554 Gr 36: 58 ksi", dim="ksi")
    calc.step("R_nt", "n_r*0.75*F_ur*pi/4*d_r**2", "Nominal tensile strength of the rods (F_nt = 0.75 F_u)", unit="kip",
              ref="AISC 360-16 Eq. J3-1, Table J3.2")
    calc.available_with("R_ct", "R_nt", 0.75, 2.00, "AISC 360-16 J3.6", "rt", "Available rod tensile strength", unit="kip")
    keys.append(calc.check("Anchor rod tension (steel)", "T_a", "R_ct", key="ratio_rt", ref="AISC 360-16 J3.6"))


def _bearing_side(calc: Calc, base: str, description: str, ref: str) -> None:
    """Plate bending from uniform bearing f_p over Y: cantilever m (Y >= m) or partial (Y < m)."""
    calc.branch(
        base,
        [("Y >= m", "m*sqrt(2*f_p/F_ya)", "Y >= m, Eq. 3.3.14"),
         (None, "sqrt(4*f_p*Y*(m - Y/2)/F_ya)", "Y < m, Eq. 3.3.15")],
        description,
        unit="in",
        ref=ref,
    )
