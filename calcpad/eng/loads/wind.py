"""Wind loads on other structures and rooftop equipment, ASCE 7-16 chapters 26 and 29.

Numeric functions take values with units (pint quantities or strings such as ``"115 mph"``) or
plain numbers in the US units named in each docstring, and return pint quantities. The sheet-step
builders (:func:`add_velocity_pressure`, :func:`add_wind_force`) add the same calculation to a
sheet with every factor given with its table or equation reference.

Where ASCE 7-22 differs (only the differences we are sure of are noted):

* ASCE 7-22 moves the directionality factor ``K_d`` out of the velocity-pressure equation
  (26.10-1) and into the wind force/pressure equations. The product ``q*K_d`` is unchanged, so the
  force is the same; only the bookkeeping differs. Here ``K_d`` stays in ``q_z`` as in 7-16.
* ASCE 7-22 revised the terrain exposure constants (``alpha``, ``z_g``) and the ``K_z``
  expression (recalled, values not verified here). Nothing of 7-22 is built in: to work to it,
  pass ``alpha=`` and ``z_g=`` and check ``K_z`` against the 7-22 table yourself.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

import pint

from calcpad.core.errors import InputError
from calcpad.core.units import Q_
from calcpad.eng.analysis._values import require_positive, to_float

__all__ = [
    "DIRECTIONALITY",
    "EXPOSURE_CONSTANTS",
    "G_RIGID",
    "WindForce",
    "add_velocity_pressure",
    "add_wind_force",
    "cf_open_frame",
    "exposure_constants",
    "gcr_lateral",
    "gcr_uplift",
    "k_d",
    "k_e",
    "k_z",
    "open_structure_wind",
    "velocity_pressure",
    "velocity_pressure_si",
    "wind_force",
]

STD = "ASCE 7-16"

#: Terrain exposure constants, ASCE 7-16 Table 26.11-1 (from memory): exposure -> (alpha, z_g in ft).
EXPOSURE_CONSTANTS: dict[str, tuple[float, float]] = {
    "B": (7.0, 1200.0),
    "C": (9.5, 900.0),
    "D": (11.5, 700.0),
}

#: Wind directionality factor K_d, ASCE 7-16 Table 26.6-1 (from memory).
DIRECTIONALITY: dict[str, float] = {
    "building": 0.85,  # MWFRS and components and cladding
    "arched roof": 0.85,
    "chimney square": 0.90,
    "chimney hexagonal": 0.95,
    "chimney round": 0.95,
    "solid freestanding wall": 0.85,
    "rooftop equipment": 0.85,
    "solid sign": 0.85,
    "open sign": 0.85,
    "open frame": 0.85,  # single-plane open frames
    "trussed tower triangular/square/rectangular": 0.85,
    "trussed tower other": 0.95,
}

#: Gust-effect factor for a rigid structure, ASCE 7-16 Sec. 26.11.1.
G_RIGID = 0.85

_Z_MIN_FT = 15.0  # Table 26.10-1 note: K_z at 15 ft is used below 15 ft
_C_US = 0.00256  # psf/mph^2, Eq. 26.10-1
_C_SI = 0.613  # Pa/(m/s)^2, Eq. 26.10-1.SI


def exposure_constants(exposure: str) -> tuple[float, float]:
    """Return ``(alpha, z_g_ft)`` for exposure ``"B"``, ``"C"`` or ``"D"`` (ASCE 7-16 Table 26.11-1).

    Raises:
        InputError: The exposure is not B, C or D.
    """
    key = exposure.strip().upper() if isinstance(exposure, str) else exposure
    if key not in EXPOSURE_CONSTANTS:
        raise InputError(f"exposure: got {exposure!r}; expected 'B', 'C' or 'D' (ASCE 7-16 Sec. 26.7.3)")
    return EXPOSURE_CONSTANTS[key]


def k_z(z: Any, exposure: str = "C", *, alpha: float | None = None, z_g: Any = None) -> float:
    """Velocity pressure exposure coefficient ``K_z`` (ASCE 7-16 Table 26.10-1, note 1 power law).

    ``K_z = 2.01*(z/z_g)**(2/alpha)`` for 15 ft <= z <= z_g and ``K_z = 2.01*(15/z_g)**(2/alpha)``
    below 15 ft.

    Args:
        z: Height above ground (quantity, string, or number in ft).
        exposure: ``"B"``, ``"C"`` or ``"D"``.
        alpha: Override of the exposure constant alpha.
        z_g: Override of the gradient height (quantity, string or ft).

    Raises:
        InputError: Bad exposure, negative height or height above ``z_g``.
    """
    a0, zg0 = exposure_constants(exposure)
    a = a0 if alpha is None else float(alpha)
    zg = zg0 if z_g is None else to_float(z_g, "ft", "z_g")
    require_positive(a, "alpha", alpha)
    require_positive(zg, "z_g", z_g)
    zf = to_float(z, "ft", "z (height above ground)")
    require_positive(zf, "z (height above ground)", z, allow_zero=True)
    if zf > zg:
        raise InputError(f"z (height above ground): got {z!r}; expected at most the gradient height z_g = {zg:g} ft")
    return 2.01 * (max(zf, _Z_MIN_FT) / zg) ** (2.0 / a)


def k_d(structure: str) -> float:
    """Directionality factor ``K_d`` by structure type (ASCE 7-16 Table 26.6-1).

    Raises:
        InputError: Unknown structure type (the message lists the known ones).
    """
    if structure not in DIRECTIONALITY:
        known = ", ".join(repr(k) for k in DIRECTIONALITY)
        raise InputError(f"structure type: got {structure!r}; expected one of {known}")
    return DIRECTIONALITY[structure]


def k_e(ground_elevation: Any) -> float:
    """Ground elevation factor ``K_e = exp(-0.0000362*z_e)`` with ``z_e`` in ft (ASCE 7-16 Table 26.9-1).

    Table 26.9-1 note 2 permits ``K_e = 1.0`` in all cases (conservative at altitude).
    """
    ze = to_float(ground_elevation, "ft", "ground elevation")
    return math.exp(-0.0000362 * ze)


def _speed(V: Any, unit: str) -> float:
    v = to_float(V, unit, "V (basic wind speed)")
    require_positive(v, "V (basic wind speed)", V)
    return v


def _factor(x: Any, name: str) -> float:
    if isinstance(x, bool) or not isinstance(x, (int, float)):
        raise InputError(f"{name}: got {x!r}; expected a plain number")
    require_positive(float(x), name, x)
    return float(x)


def velocity_pressure(V: Any, K_z: float, K_zt: float = 1.0, K_d: float = 0.85, K_e: float = 1.0) -> pint.Quantity:
    """Velocity pressure ``q_z = 0.00256*K_z*K_zt*K_d*K_e*V**2`` in psf (ASCE 7-16 Eq. 26.10-1).

    Args:
        V: Basic wind speed (quantity, string, or number in mph).
        K_z, K_zt, K_d, K_e: Exposure, topographic, directionality and ground-elevation factors.
    """
    v = _speed(V, "mph")
    k = _factor(K_z, "K_z") * _factor(K_zt, "K_zt") * _factor(K_d, "K_d") * _factor(K_e, "K_e")
    return Q_(_C_US * k * v * v, "psf")


def velocity_pressure_si(V: Any, K_z: float, K_zt: float = 1.0, K_d: float = 0.85, K_e: float = 1.0) -> pint.Quantity:
    """SI form ``q_z = 0.613*K_z*K_zt*K_d*K_e*V**2`` in Pa, V in m/s (ASCE 7-16 Eq. 26.10-1.SI)."""
    v = _speed(V, "m/s")
    k = _factor(K_z, "K_z") * _factor(K_zt, "K_zt") * _factor(K_d, "K_d") * _factor(K_e, "K_e")
    return Q_(_C_SI * k * v * v, "Pa")


def _ramp(ratio: float, high: float) -> float:
    """Linear from ``high`` at ratio <= 0.1 to 1.0 at ratio >= 1.0."""
    if ratio <= 0.1:
        return high
    if ratio >= 1.0:
        return 1.0
    return high + (1.0 - high) * (ratio - 0.1) / 0.9


def gcr_lateral(A_f: Any, B: Any, h: Any) -> float:
    """``(GC_r)`` for the lateral force on rooftop equipment (ASCE 7-16 Sec. 29.4.1).

    1.9 when the vertical projected area ``A_f`` <= 0.1*B*h, reduced linearly to 1.0 as ``A_f``
    reaches ``B*h`` (B = building width normal to the wind, h = mean roof height).
    """
    af = require_positive(to_float(A_f, "ft**2", "A_f"), "A_f", A_f)
    bh = require_positive(to_float(B, "ft", "B"), "B", B) * require_positive(to_float(h, "ft", "h"), "h", h)
    return _ramp(af / bh, 1.9)


def gcr_uplift(A_r: Any, B: Any, L: Any) -> float:
    """``(GC_r)`` for the vertical uplift on rooftop equipment (ASCE 7-16 Sec. 29.4.1).

    1.5 when the horizontal projected area ``A_r`` <= 0.1*B*L, reduced linearly to 1.0 at ``B*L``.
    """
    ar = require_positive(to_float(A_r, "ft**2", "A_r"), "A_r", A_r)
    bl = require_positive(to_float(B, "ft", "B"), "B", B) * require_positive(to_float(L, "ft", "L"), "L", L)
    return _ramp(ar / bl, 1.5)


_CF_OPEN = {  # solidity upper bound -> (flat-sided, round D*sqrt(qz)<=2.5, round >2.5)
    0.1: (2.0, 1.2, 0.8),
    0.3: (1.8, 1.3, 0.9),
    0.7: (1.6, 1.5, 1.1),
}


def cf_open_frame(solidity: float, members: str = "flat", D: Any = None, q_z: Any = None) -> float:
    """Force coefficient ``C_f`` for open signs and single-plane open frames.

    ASCE 7-16 Fig. 29.4-2 (figure number and values from memory; verify against the standard).

    Args:
        solidity: Ratio of solid area to gross area, 0 < solidity <= 0.7.
        members: ``"flat"`` (flat-sided members) or ``"round"``.
        D: Diameter of round members (ft or quantity), needed for ``"round"``.
        q_z: Velocity pressure (psf or quantity), needed for ``"round"``.
    """
    eps = float(solidity)
    if not 0 < eps <= 0.7:
        raise InputError(
            f"solidity: got {solidity!r}; expected 0 < solidity <= 0.7 (above 0.7 treat as a solid sign, Sec. 29.3)"
        )
    row = next(v for k, v in _CF_OPEN.items() if eps < k or k == 0.7)
    if members == "flat":
        return row[0]
    if members != "round":
        raise InputError(f"members: got {members!r}; expected 'flat' or 'round'")
    if D is None or q_z is None:
        raise InputError("D and q_z: both are needed for round members; expected e.g. D='2.375 in', q_z='25 psf'")
    d = to_float(D, "ft", "D")
    q = to_float(q_z, "psf", "q_z")
    return row[1] if d * math.sqrt(max(q, 0.0)) <= 2.5 else row[2]


def wind_force(q_z: Any, G: float, C_f: float, A_f: Any) -> pint.Quantity:
    """Design wind force ``F = q_z*G*C_f*A_f`` (ASCE 7-16 Eq. 29.4-1; with ``G*C_f -> (GC_r)`` and
    ``q_h``, Eq. 29.4-2 for rooftop equipment: pass ``G=1`` and ``C_f=GC_r``)."""
    q = to_float(q_z, "psf", "q_z")
    af = require_positive(to_float(A_f, "ft**2", "A_f"), "A_f", A_f)
    return Q_(q * _factor(G, "G") * _factor(C_f, "C_f") * af, "lbf")


@dataclass(frozen=True)
class WindForce:
    """Result of :func:`open_structure_wind`: every factor used and the force."""

    K_z: float
    K_zt: float
    K_d: float
    K_e: float
    q_z: pint.Quantity
    G: float
    C_f: float
    A_f: pint.Quantity
    F: pint.Quantity
    refs: dict[str, str]


def open_structure_wind(
    V: Any,
    z: Any,
    exposure: str,
    A_f: Any,
    *,
    C_f: float | None = None,
    kind: str = "rooftop",
    GC_r: float | None = None,
    B: Any = None,
    h: Any = None,
    K_zt: float = 1.0,
    K_d: float | None = None,
    K_e: float = 1.0,
    G: float = G_RIGID,
) -> WindForce:
    """Lateral wind force on an open frame, solid sign or rooftop equipment, every factor overridable.

    Args:
        V: Basic wind speed. z: height for ``q_z`` (mean roof height ``h`` for rooftop equipment).
        exposure: ``"B"``, ``"C"`` or ``"D"``. A_f: projected area normal to the wind.
        C_f: Force coefficient (``kind="other"``).
        kind: ``"other"`` (Eq. 29.4-1, F = q_z*G*C_f*A_f) or ``"rooftop"`` (Eq. 29.4-2, F = q_h*GC_r*A_f).
        GC_r: Override of the rooftop coefficient; if None it is found from ``B`` and ``h``
            (Sec. 29.4.1), or taken as 1.9 when those are not given (upper value).
        K_zt, K_d, K_e, G: Factors (defaults: flat site, Table 26.6-1 value, K_e = 1, rigid G).
    """
    kz = k_z(z, exposure)
    kd = DIRECTIONALITY["rooftop equipment" if kind == "rooftop" else "open frame"] if K_d is None else K_d
    q = velocity_pressure(V, kz, K_zt, kd, K_e)
    af = Q_(to_float(A_f, "ft**2", "A_f"), "ft**2")
    refs = {
        "K_z": f"{STD} Table 26.10-1",
        "K_zt": f"{STD} Sec. 26.8.2",
        "K_d": f"{STD} Table 26.6-1",
        "K_e": f"{STD} Table 26.9-1",
        "q_z": f"{STD} Eq. 26.10-1",
    }
    if kind == "rooftop":
        if GC_r is None:
            gcr = gcr_lateral(af, B, h) if B is not None and h is not None else 1.9
        else:
            gcr = _factor(GC_r, "GC_r")
        F = wind_force(q, 1.0, gcr, af)
        refs.update({"GC_r": f"{STD} Sec. 29.4.1", "F": f"{STD} Eq. 29.4-2"})
        return WindForce(kz, K_zt, kd, K_e, q, 1.0, gcr, af, F, refs)
    if kind != "other":
        raise InputError(f"kind: got {kind!r}; expected 'rooftop' or 'other'")
    if C_f is None:
        raise InputError("C_f: missing; expected the force coefficient (e.g. from ASCE 7-16 Fig. 29.4-1 or 29.4-2)")
    F = wind_force(q, G, C_f, af)
    refs.update({"G": f"{STD} Sec. 26.11.1", "C_f": f"{STD} Fig. 29.4-1/29.4-2", "F": f"{STD} Eq. 29.4-1"})
    return WindForce(kz, K_zt, kd, K_e, q, G, float(C_f), af, F, refs)


# --------------------------------------------------------------------------- sheet steps


@dataclass(frozen=True)
class WindSteps:
    """Names of the steps a wind builder added to a sheet."""

    q: str
    F: str | None = None


def add_velocity_pressure(
    sh: Any,
    V: Any,
    z: Any,
    exposure: str,
    *,
    K_zt: float = 1.0,
    K_d: float | None = None,
    structure: str = "rooftop equipment",
    K_e: float = 1.0,
    suffix: str = "",
) -> WindSteps:
    """Add ``K_z`` and ``q_z`` (ASCE 7-16 Table 26.10-1, Eq. 26.10-1) to sheet ``sh``.

    Givens: ``V``, ``z``, exposure constants ``alpha`` and ``z_g`` (Table 26.11-1), the 15 ft
    minimum height, ``K_zt``, ``K_d`` (Table 26.6-1), ``K_e`` (Table 26.9-1) and the constant
    0.00256 psf/mph² of Eq. 26.10-1. Steps: ``K_z`` (branch on the 15 ft minimum) and ``q_z``.
    """
    s = suffix
    alpha, zg = exposure_constants(exposure)
    v = _speed(V, "mph")
    zf = to_float(z, "ft", "z (height above ground)")
    require_positive(zf, "z (height above ground)", z, allow_zero=True)
    kd = k_d(structure) if K_d is None else _factor(K_d, "K_d")
    _factor(K_zt, "K_zt")
    _factor(K_e, "K_e")
    ex = exposure.strip().upper()
    sh.given(f"V{s}", V if not isinstance(V, (int, float)) else Q_(v, "mph"), "Basic wind speed", source=f"{STD} Fig. 26.5-1")
    sh.given(f"z{s}", z if not isinstance(z, (int, float)) else Q_(zf, "ft"), "Height above ground")
    sh.given(f"alpha{s}", alpha, f"Exposure {ex} constant", source=f"{STD} Table 26.11-1")
    sh.given(f"z_g{s}", Q_(zg, "ft"), f"Exposure {ex} gradient height", source=f"{STD} Table 26.11-1")
    sh.given(f"z_min{s}", Q_(_Z_MIN_FT, "ft"), "Lowest height for K_z", source=f"{STD} Table 26.10-1")
    sh.given(f"K_zt{s}", float(K_zt), "Topographic factor", source=f"{STD} Sec. 26.8.2")
    sh.given(f"K_d{s}", kd, f"Directionality factor ({structure})", source=f"{STD} Table 26.6-1")
    sh.given(f"K_e{s}", float(K_e), "Ground elevation factor", source=f"{STD} Table 26.9-1")
    sh.given(f"c_q{s}", Q_(_C_US, "psf/mph**2"), "Velocity pressure constant", source=f"{STD} Eq. 26.10-1")
    sh.branch(
        f"K_z{s}",
        [
            (f"z{s} < z_min{s}", f"2.01*(z_min{s}/z_g{s})**(2/alpha{s})", f"{STD} Table 26.10-1 note"),
            (None, f"2.01*(z{s}/z_g{s})**(2/alpha{s})", f"{STD} Table 26.10-1 note"),
        ],
        "Velocity pressure exposure coefficient",
        ref=f"{STD} Table 26.10-1",
    )
    sh.step(
        f"q_z{s}",
        f"c_q{s}*K_z{s}*K_zt{s}*K_d{s}*K_e{s}*V{s}**2",
        "Velocity pressure",
        unit="psf",
        ref=f"{STD} Eq. 26.10-1",
    )
    return WindSteps(q=f"q_z{s}")


def add_wind_force(
    sh: Any,
    q_name: str,
    A_f: Any,
    *,
    kind: str = "rooftop",
    C_f: float | None = None,
    G: float = G_RIGID,
    GC_r: float | None = None,
    B: Any = None,
    h: Any = None,
    suffix: str = "",
) -> WindSteps:
    """Add the design wind force ``F`` to sheet ``sh`` using the velocity-pressure step ``q_name``.

    ``kind="rooftop"``: ``F = q_h*GC_r*A_f`` (ASCE 7-16 Eq. 29.4-2, ``GC_r`` from Sec. 29.4.1 or
    given). ``kind="other"``: ``F = q_z*G*C_f*A_f`` (Eq. 29.4-1) for open frames and solid signs.
    """
    s = suffix
    if kind not in ("rooftop", "other"):
        raise InputError(f"kind: got {kind!r}; expected 'rooftop' or 'other'")
    if kind == "other" and C_f is None:
        raise InputError("C_f: missing; expected the force coefficient (e.g. from ASCE 7-16 Fig. 29.4-1 or 29.4-2)")
    af = require_positive(to_float(A_f, "ft**2", "A_f"), "A_f", A_f)
    sh.given(f"A_f{s}", A_f if not isinstance(A_f, (int, float)) else Q_(af, "ft**2"), "Projected area normal to wind")
    if kind == "rooftop":
        if GC_r is not None:
            sh.given(f"GC_r{s}", _factor(GC_r, "GC_r"), "Rooftop force coefficient (given)", source=f"{STD} Sec. 29.4.1")
        elif B is not None and h is not None:
            bq = Q_(to_float(B, "ft", "B"), "ft")
            hq = Q_(to_float(h, "ft", "h"), "ft")
            sh.given(f"B_bldg{s}", bq, "Building width normal to wind")
            sh.given(f"h_bldg{s}", hq, "Mean roof height")
            sh.step(f"r_A{s}", f"A_f{s}/(B_bldg{s}*h_bldg{s})", "Area ratio A_f/(B*h)", ref=f"{STD} Sec. 29.4.1")
            sh.branch(
                f"GC_r{s}",
                [
                    (f"r_A{s} <= 0.1", "1.9", f"{STD} Sec. 29.4.1"),
                    (f"r_A{s} >= 1.0", "1.0", f"{STD} Sec. 29.4.1"),
                    (None, f"1.9 - 0.9*(r_A{s} - 0.1)/0.9", f"{STD} Sec. 29.4.1 (linear)"),
                ],
                "Rooftop force coefficient",
                ref=f"{STD} Sec. 29.4.1",
            )
        else:
            sh.given(f"GC_r{s}", 1.9, "Rooftop force coefficient (upper value)", source=f"{STD} Sec. 29.4.1")
        sh.step(f"F_h{s}", f"{q_name}*GC_r{s}*A_f{s}", "Lateral wind force", unit="lbf", ref=f"{STD} Eq. 29.4-2")
        return WindSteps(q=q_name, F=f"F_h{s}")
    sh.given(f"G{s}", _factor(G, "G"), "Gust-effect factor (rigid)", source=f"{STD} Sec. 26.11.1")
    sh.given(f"C_f{s}", _factor(C_f, "C_f"), "Force coefficient", source=f"{STD} Fig. 29.4-1/29.4-2")
    sh.step(f"F_w{s}", f"{q_name}*G{s}*C_f{s}*A_f{s}", "Design wind force", unit="lbf", ref=f"{STD} Eq. 29.4-1")
    return WindSteps(q=q_name, F=f"F_w{s}")
