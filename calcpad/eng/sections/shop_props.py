"""Section properties a shop table may state for a row, and the values they are checked against.

A shop that has the mill's or its own published properties for a size writes them in extra
columns (unit in the header, as the dimensions): the checks then use them instead of the values
computed from the row's dimensions. Each stated value is cross-checked against the computed
one: within :data:`PROPERTY_TOLERANCE` (5 %), for positions (x̄, ȳ, e_o, x_o, y_o, x_p, y_p)
within 5 % or :data:`POSITION_TOLERANCE_IN` (0.02 in), whichever is larger, since a short
distance printed to three figures can differ by more than 5 % from its exact value; ``J`` of
open shapes within :data:`OPEN_J_TOLERANCE` (30 %, see there).

The computed values (``reference``) are the computed section's own (A, I, S, Z, r, J, C, I_z,
r_z, centroid, plastic neutral axis of the rolled outline; round HSS ``C = J/(D/2)``, the rule
of the tabulated C) and, for the torsional properties
the outline does not give, the thin-walled formulas (each named below; lengths to the mid-lines
of the plates):

* angle ``C_w = t³ (b'³ + d'³) / 36``, b' = b - t/2, d' = d - t/2 (AISC 360-16 Commentary E4);
  shear centre at the meeting of the leg mid-lines: ``x_o = x̄ - t/2``, ``y_o = ȳ - t/2``;
* channel shear centre from the web mid-line ``3 b'² t_f / (6 b' t_f + h' t_w)`` and
  ``C_w = t_f b'³ h'² / 12 · (3 b' t_f + 2 h' t_w) / (6 b' t_f + h' t_w)``, b' = b_f - t_w/2,
  h' = d - t_f (AISC Design Guide 9, from memory); ``e_o`` from the back of the web,
  ``x_o = x̄ + e_o``;
* W-shape ``C_w = I_y h_o² / 4``, h_o = d - t_f (AISC 360-16 F2 user note);
* ``r̄_o² = x_o² + y_o² + (I_x + I_y)/A`` (Eq. E4-9), ``H = 1 - (x_o² + y_o²)/r̄_o²`` (Eq. E4-8).
"""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Mapping
from typing import Any

from calcpad.eng.sections._polygons import plastic_modulus
from calcpad.eng.sections.props import EXTRA_DESCRIPTIONS, UNITS, PublishedProps, SectionProps

__all__ = [
    "FAMILY_PROPERTIES",
    "OPEN_J_TOLERANCE",
    "POSITION_TOLERANCE_IN",
    "PROPERTY_COLUMNS",
    "PROPERTY_TOLERANCE",
    "mismatch",
    "reference",
    "stated_props",
]

#: Stated property vs the value computed from the dimensions (relative).
PROPERTY_TOLERANCE = 0.05
#: Smallest allowed difference for positions (in).
POSITION_TOLERANCE_IN = 0.02
#: Stated J of an open shape (angle, channel, W) vs the computed one (relative): wider, because
#: the computed J of the rolled outline differs from the AISC Shapes Database v16.0 J by up to
#: +18 % (light angles) and +29 % (MC3x7.1) over the catalog rows; the band still catches a
#: J in the wrong unit or off by a digit.
OPEN_J_TOLERANCE = 0.30
POSITIONS = ("x_bar", "y_bar", "e_o", "x_o", "y_o", "x_pna", "y_pna")

_BASIC = {"Ix": "moment of inertia about x", "Iy": "moment of inertia about y", "Sx": "elastic section modulus about x",
          "Sy": "elastic section modulus about y", "Zx": "plastic section modulus about x",
          "Zy": "plastic section modulus about y", "rx": "radius of gyration about x", "ry": "radius of gyration about y",
          "Iz": "least principal moment of inertia I_z", "rz": "least radius of gyration r_z", "J": "torsional constant J",
          "C": "HSS torsional constant C"}
_UNIT = {**UNITS, "Iz": "in**4", "rz": "in"}

#: Column -> (dimension, unit, description) of the property columns a shop table may carry.
PROPERTY_COLUMNS: dict[str, tuple[str, str, str]] = {
    name: ("" if not _UNIT[name] else _dim, _UNIT[name], desc)
    for name, desc in {**_BASIC, **{k: v for k, v in EXTRA_DESCRIPTIONS.items() if k != "Qs"}}.items()
    for _dim in [{"in": "[length]", "in**3": "[length]**3", "in**4": "[length]**4", "in**6": "[length]**6"}.get(_UNIT[name], "")]
}

_BENDING = ("Ix", "Iy", "Sx", "Sy", "Zx", "Zy", "rx", "ry", "J")
#: Property columns each shop family may state (others are refused: no computed value to check them by).
FAMILY_PROPERTIES: dict[str, tuple[str, ...]] = {
    "angle": (*_BENDING, "Iz", "rz", "Cw", "x_bar", "y_bar", "x_o", "y_o", "r_o_bar", "H_flex", "x_pna", "y_pna"),
    "channel": (*_BENDING, "Cw", "x_bar", "e_o", "x_o", "r_o_bar", "H_flex", "x_pna"),
    "w": (*_BENDING, "Cw"),
    "hss_rect": (*_BENDING, "C"),
    "hss_round": (*_BENDING, "C"),
    "flat_bar": _BENDING,
}


def _channel_shear_centre(v: Mapping[str, float]) -> float:
    """Shear centre from the web mid-line (thin-walled channel)."""
    b1, h1 = v["bf"] - v["tw"] / 2.0, v["d"] - v["tf"]
    return 3.0 * b1**2 * v["tf"] / (6.0 * b1 * v["tf"] + h1 * v["tw"])


def reference(family: str, name: str, shape: Any, v: Mapping[str, float]) -> float:
    """The value of property ``name`` computed from the row's dimensions ``v`` and its shape."""
    p: SectionProps = shape.props
    if name == "Iz":
        return p.I_min
    if name == "rz":
        return p.r_min
    if name == "C" and family == "hss_round":
        return 2.0 * p.J / v["od"]  # the tabulated C of round HSS is J/(D/2)
    if name in _BASIC:
        return p.value(name)
    if name == "x_bar":
        return p.xc
    if name == "y_bar":
        return p.yc
    if name in ("x_pna", "y_pna"):
        return plastic_modulus([shape._outline(32)], "y" if name == "x_pna" else "x")[1]
    if family == "angle":
        t = v["t"]
        xo, yo = p.xc - t / 2.0, p.yc - t / 2.0
        if name == "Cw":
            return t**3 * ((shape.b - t / 2.0) ** 3 + (shape.d - t / 2.0) ** 3) / 36.0
    elif family == "channel":
        eo = _channel_shear_centre(v) - v["tw"] / 2.0
        xo, yo = p.xc + eo, 0.0
        if name == "e_o":
            return eo
        if name == "Cw":
            b1, h1, tf, tw = v["bf"] - v["tw"] / 2.0, v["d"] - v["tf"], v["tf"], v["tw"]
            return tf * b1**3 * h1**2 / 12.0 * (3.0 * b1 * tf + 2.0 * h1 * tw) / (6.0 * b1 * tf + h1 * tw)
    elif family == "w" and name == "Cw":
        return p.Iy * (v["d"] - v["tf"]) ** 2 / 4.0
    else:
        raise KeyError(name)
    if name == "x_o":
        return xo
    if name == "y_o":
        return yo
    ro2 = xo**2 + yo**2 + (p.Ix + p.Iy) / p.A
    if name == "r_o_bar":
        return math.sqrt(ro2)
    if name == "H_flex":
        return 1.0 - (xo**2 + yo**2) / ro2
    raise KeyError(name)


def mismatch(name: str, stated: float, computed: float, family: str = "") -> str | None:
    """The problem text when ``stated`` lies outside the tolerance of ``computed``, else None."""
    diff = stated - computed
    rel = OPEN_J_TOLERANCE if name == "J" and family in ("angle", "channel", "w") else PROPERTY_TOLERANCE
    allowed = rel * abs(computed)
    if name in POSITIONS:
        allowed = max(allowed, POSITION_TOLERANCE_IN)
    if abs(diff) <= allowed:
        return None
    unit = PROPERTY_COLUMNS[name][1].replace("**", "^")
    pct = diff / computed * 100.0 if computed else math.inf
    rule = f"±{rel * 100:g} %" + (f" or {POSITION_TOLERANCE_IN:g} in" if name in POSITIONS else "")
    return (f"{name} = {stated:.4g}{' ' + unit if unit else ''} differs from the value computed from the dimensions, "
            f"{computed:.4g}{' ' + unit if unit else ''}, by {pct:+.1f} % (allowed {rule})")


_DERIVED = ("Sx", "Sy", "rx", "ry", "Iz", "rz")  # PublishedProps reads these from ``published``


def stated_props(computed: SectionProps, stated: Mapping[str, float], source: str) -> PublishedProps:
    """The computed properties with the stated ones in their place (a PublishedProps, so the
    derived moduli and radii return the stated numbers)."""
    base = {f.name: getattr(computed, f.name) for f in dataclasses.fields(SectionProps)}
    base["notes"] = [*computed.notes, f"stated in {source}: {', '.join(stated)}; the rest computed from the dimensions"]
    for name, value in stated.items():
        if name not in _DERIVED:
            base[name] = value
    if "x_bar" in stated:
        base["xc"] = stated["x_bar"]
    if "y_bar" in stated:
        base["yc"] = stated["y_bar"]
    return PublishedProps(**base, published={k: v for k, v in stated.items() if k in _DERIVED}, source=source)
