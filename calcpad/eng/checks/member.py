"""Member check runner: every applicable AISC 360-16 limit state for given forces, one table.

    keys = check_member(sh, get_section("HSS4x4x1/4"), material="A500 Gr C shaped",
                        L="10 ft", P="12 kip", M_x="4 kip*ft", V="1.5 kip")

Writes compression (P > 0, or a sheet name whose value is 0) or tension (P < 0), flexure about x and y, shear, the H1-1
interaction, a selection naming the governing ratio (live under ``sh.set``) and a summary table
of ratios (a snapshot at build time).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from calcpad.core.sheet import Sheet
from calcpad.core.units import parse_quantity
from calcpad.eng.checks._common import Calc, CheckInputError, CheckNotCoveredError
from calcpad.eng.checks._section import resolve_section
from calcpad.eng.checks.combined import add_interaction_check
from calcpad.eng.checks.compression import add_compression_check
from calcpad.eng.checks.flexure import add_flexure_check
from calcpad.eng.checks.shear import add_shear_check
from calcpad.eng.checks.tension import add_tension_check
from calcpad.eng.checks.torsion import add_torsion_check, add_torsion_interaction_check

__all__ = ["MemberChecks", "check_member"]


def _pair(sh: Sheet, value: Any, required: str, available: str) -> tuple[str | None, str | None]:
    """Sheet names of a required strength and its available strength, or (None, None) when absent."""
    return (None, None) if value is None else (_link(sh, value, required), available)


@dataclass
class MemberChecks:
    """What :func:`check_member` wrote: check keys by limit state and the governing one."""

    keys: dict[str, str] = field(default_factory=dict)
    governing: str = ""
    governing_ratio: float = 0.0
    max_name: str = ""


def _num(sh: Sheet, value: Any, name: str, dim: str) -> float | None:
    if value is None:
        return None
    if isinstance(value, str) and value in sh:
        q = sh[value]
    else:
        q = parse_quantity(value, name, expected=dim)
    return float(q.to_base_units().magnitude)


def _link(sh: Sheet, value: Any, default: str) -> str:
    """The sheet name a check used for ``value``: the value itself when it names a sheet value."""
    return value if isinstance(value, str) and value in sh else default


def check_member(
    sh: Sheet,
    section: Any,
    *,
    L: Any,
    P: Any = None,
    M_x: Any = None,
    M_y: Any = None,
    V: Any = None,
    T: Any = None,
    K: Any = 1.0,
    L_y: Any = None,
    K_y: Any = None,
    L_z: Any = None,
    K_z: Any = None,
    L_b: Any = None,
    C_b: Any = 1.0,
    L_v: Any = None,
    A_n: Any = None,
    U: Any = 1.0,
    kind: str | None = None,
    material: Any = None,
    F_y: Any = None,
    F_u: Any = None,
    E: Any = None,
    G: Any = None,
    connected_leg: str | None = None,
    truss: str = "planar",
    stem: str | None = None,
    toe: str | None = None,
    restraint: str = "none",
    suffix: str = "",
    table: bool = True,
) -> MemberChecks:
    """Run all applicable limit states of one member and summarise the ratios.

    Args:
        sh: Sheet to write on.
        section: Shape or property mapping.
        L: Member length between braces for axial buckling (> 0).
        P: Axial force: **positive = compression, negative = tension** (or a sheet name).
        M_x, M_y: Bending moments about x and y (magnitudes used).
        V: Shear along the depth (with M_x).
        T: Torsion (round and rectangular HSS, H3.1); adds the H3.2 interaction.
        K: Effective length factor (about x; about y and for twisting unless given).
        L_y, K_y, L_z, K_z: Buckling about y and twisting (see :func:`add_compression_check`).
        L_b: Unbraced length for lateral-torsional buckling (default ``L``).
        C_b: LTB modification factor.
        L_v: Round HSS shear length (G5).
        A_n, U: Net area and shear lag factor for tension.
        material / F_y / F_u / E / G: Material or values.
        connected_leg, truss: Single angles in compression (E5).
        stem: Tees in flexure, stem in ``"tension"`` or ``"compression"`` (F9).
        toe, restraint: Equal-leg angles in flexure (F10).
        suffix: Name suffix for a second member on the sheet.
        table: Add the summary table (a snapshot of the ratios at build time).

    Returns:
        The check keys per limit state and the governing one.
    """
    if all(x is None for x in (P, M_x, M_y, V, T)):
        raise CheckInputError("P, M_x, M_y, V, T", None, "at least one force or moment for the member")
    sec = resolve_section(section, kind)
    if sec.kind == "angle" and P is not None and (M_x is not None or M_y is not None):
        raise CheckNotCoveredError("section", f"single angle {sec.label}", "single angles under axial force and bending: "
                                   "they are unsymmetric, so AISC 360-16 H2 applies (and E5 excludes transverse load); "
                                   "check axial force or bending alone, or use add_stress_check")
    if T is not None and sec.kind not in ("round_hss", "rect_hss"):
        raise CheckNotCoveredError("T", T, "torsion of round or rectangular HSS (AISC 360-16 H3); open sections in torsion are not covered")
    out = MemberChecks()
    mat = {"material": material, "F_y": F_y, "E": E}
    p = _num(sh, P, "P", "lbf")
    axial_c = axial_r = None
    s = f"_{suffix}" if suffix else ""
    live_zero = p == 0 and isinstance(P, str) and P in sh  # a named force at 0 stays live (sh.set, what-if): compression path
    if p is not None and (p > 0 or live_zero):
        out.keys["compression"] = add_compression_check(sh, sec, P=P, L=L, K=K, L_y=L_y, K_y=K_y, L_z=L_z, K_z=K_z, G=G,
                                                        connected_leg=connected_leg, truss=truss, suffix=suffix, **mat)
        axial_r, axial_c = _link(sh, P, f"P_r{s}"), f"P_c{s}"
    elif p is not None and p < 0:
        t_val = sh[P] * -1 if isinstance(P, str) and P in sh else -parse_quantity(P, "P", expected="lbf")
        out.keys["tension"] = add_tension_check(sh, sec, T=t_val, A_n=A_n, U=U, L=L, material=material, F_y=F_y, F_u=F_u,
                                                suffix=suffix)
        axial_r, axial_c = f"T_r{s}", f"T_c{s}"
    lb = L_b if L_b is not None else L
    open_opts: dict[str, Any] = {k: v for k, v in (("stem", stem), ("toe", toe)) if v is not None}
    if restraint != "none":
        open_opts["restraint"] = restraint
    if M_x is not None:
        out.keys["flexure x"] = add_flexure_check(sh, sec, M=M_x, axis="x", L_b=lb, C_b=C_b, suffix=suffix, **open_opts, **mat)
    if M_y is not None:
        out.keys["flexure y"] = add_flexure_check(sh, sec, M=M_y, axis="y", L_b=lb, C_b=C_b, suffix=suffix, **open_opts, **mat)
    if V is not None:
        out.keys["shear"] = add_shear_check(sh, sec, V=V, L_v=L_v, suffix=suffix, **mat)
    mx, my, vv = _pair(sh, M_x, f"M_r{s}", f"M_c{s}"), _pair(sh, M_y, f"M_r_y{s}", f"M_c_y{s}"), _pair(sh, V, f"V_r{s}", f"V_c{s}")
    if axial_c is not None and (M_x is not None or M_y is not None):
        out.keys["interaction"] = add_interaction_check(
            sh,
            P_r=axial_r,
            P_c=axial_c,
            M_rx=mx[0],
            M_cx=mx[1],
            M_ry=my[0],
            M_cy=my[1],
            suffix=suffix,
        )
    if T is not None:
        out.keys["torsion"] = add_torsion_check(sh, sec, T=T, L=L, suffix=suffix, **mat)
        if M_y is None and any(x is not None for x in (axial_c, M_x, V)):
            out.keys["torsion interaction"] = add_torsion_interaction_check(
                sh,
                T_r=_link(sh, T, f"T_r_tor{s}"),
                T_c=f"T_c_tor{s}",
                P_r=axial_r,
                P_c=axial_c,
                M_r=mx[0],
                M_c=mx[1],
                V_r=vv[0],
                V_c=vv[1],
                suffix=suffix,
            )
        elif M_y is not None:
            sh.note("Torsion with biaxial bending: H3.2 (Eq. H3-6) is written for one axis of bending; check the interaction "
                    "separately.")
    if not out.keys:
        raise CheckInputError("P", P, "a non-zero axial force, or a moment or shear to check")
    calc = Calc(sh, suffix)
    out.max_name = calc.name("ratio_max")
    labels = {k: name for name, k in out.keys.items()}
    sh.heading(f"Member summary, {sec.label}{f' [{suffix}]' if suffix else ''}", 2)
    sh.select(out.max_name, "max", labels, "Governing ratio (demand / capacity)")
    result = sh.evaluate()
    checks = {c.key: c for c in result.checks}
    rows = []
    for name, key in out.keys.items():
        c = checks[key]
        rows.append([name, c.demand, c.capacity.to(c.demand.units), f"{c.ratio:.3f}", c.status, c.ref])
    gov = max(out.keys.items(), key=lambda kv: checks[kv[1]].ratio)
    out.governing, out.governing_ratio = gov[0], checks[gov[1]].ratio
    if table:
        sh.table(
            f"Limit states{f' [{suffix}]' if suffix else ''}",
            rows,
            columns=["limit state", "demand", "available", "ratio", "status", "reference"],
            note=f"Governing: {out.governing} (ratio {out.governing_ratio:.3f}); {sh.method}. "
            "Table values as built; the governing-ratio line above stays current.",
        )
    return out
