"""Reading a section for the checks: a catalog/closed-form shape, a SectionProps, or a mapping.

The checks need a shape *kind* (which AISC 360-16 rules apply) and named properties. A shape
from :mod:`calcpad.eng.sections` gives both; a mapping of property names to values with units
(``{"A": "4.21 in^2", "I": "17.5 in^4", ...}``) needs ``kind=``.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass, field
from typing import Any

from calcpad.core.units import parse_quantity
from calcpad.eng.checks._common import CheckInputError, CheckNotCoveredError

__all__ = ["KINDS", "PROPS", "Sec", "channel_warping", "resolve_section"]

#: Shape kinds the checks know.
KINDS: dict[str, str] = {
    "round_hss": "round HSS / pipe",
    "rect_hss": "rectangular or square HSS",
    "i_shape": "doubly symmetric I-shape (W)",
    "angle": "single angle",
    "tee": "tee (WT or cut I-shape)",
    "channel": "channel (C, MC)",
    "rect_bar": "solid rectangular bar",
    "round_bar": "solid round bar",
}

#: Property name -> (unit, description).
PROPS: dict[str, tuple[str, str]] = {
    "A": ("in**2", "Gross area"),
    "Ix": ("in**4", "Moment of inertia about x"),
    "Iy": ("in**4", "Moment of inertia about y"),
    "Sx": ("in**3", "Elastic section modulus about x"),
    "Sy": ("in**3", "Elastic section modulus about y"),
    "Zx": ("in**3", "Plastic section modulus about x"),
    "Zy": ("in**3", "Plastic section modulus about y"),
    "rx": ("in", "Radius of gyration about x"),
    "ry": ("in", "Radius of gyration about y"),
    "r_min": ("in", "Least radius of gyration"),
    "J": ("in**4", "Torsional constant"),
    "D": ("in", "Outside diameter"),
    "t": ("in", "Design wall / leg thickness"),
    "H": ("in", "Overall depth (along y)"),
    "B": ("in", "Overall width (along x)"),
    "d": ("in", "Overall depth"),
    "bf": ("in", "Flange width"),
    "tf": ("in", "Flange thickness"),
    "tw": ("in", "Web thickness"),
    "b": ("in", "Leg width"),
    "D_t": ("", "Diameter-to-thickness ratio"),
    "b_t": ("", "Width-to-thickness ratio of the flange / wall"),
    "h_t": ("", "Width-to-thickness ratio of the web / wall"),
    "bf_2tf": ("", "Flange width-to-thickness ratio bf/(2 tf)"),
    "h_tw": ("", "Web height-to-thickness ratio h/tw"),
    "d_tw": ("", "Stem depth-to-thickness ratio d/tw"),
    "Sx_top": ("in**3", "Elastic section modulus about x to the top fibre"),
    "Sx_bot": ("in**3", "Elastic section modulus about x to the bottom fibre"),
    "Sy_left": ("in**3", "Elastic section modulus about y to the left fibre"),
    "Sy_right": ("in**3", "Elastic section modulus about y to the right fibre"),
    "y_o": ("in", "Distance from the centroid to the shear centre along y"),
    "x_o": ("in", "Distance from the centroid to the shear centre along x"),
    "Cw": ("in**6", "Warping constant"),
    "bf_tf": ("", "Flange width-to-thickness ratio bf/tf"),
    "Iw": ("in**4", "Moment of inertia about the major principal axis w"),
    "Iz": ("in**4", "Moment of inertia about the minor principal axis z"),
    "Sw_toe": ("in**3", "Section modulus about w to the toes"),
    "Sw_long": ("in**3", "Section modulus about w to the long leg's toe"),
    "Sw_short": ("in**3", "Section modulus about w to the short leg's toe"),
    "beta_w": ("in", "Single-angle section property beta_w (magnitude)"),
    "Sz_toe": ("in**3", "Section modulus about z to the toes"),
    "Sz_heel": ("in**3", "Section modulus about z to the heel"),
    "C": ("in**3", "HSS torsional constant"),
    "r_o_bar": ("in", "Polar radius of gyration about the shear centre"),
    "H_flex": ("", "Flexural constant H"),
    "x_bar": ("in", "Centroid from the back of the web / vertical leg"),
    "y_bar": ("in", "Centroid from the outside of the flange / back of the horizontal leg"),
    "e_o": ("in", "Shear centre from the back of the web (channel)"),
    "x_pna": ("in", "Plastic neutral axis for bending about y"),
    "y_pna": ("in", "Plastic neutral axis for bending about x"),
    "Qs": ("", "Slender-element reduction factor Q_s as tabulated"),
}

#: Optional section properties read from the shape's props when it has them.
_SECTION_EXTRAS = ("Cw", "x_o", "y_o", "C", "r_o_bar", "H_flex", "x_bar", "y_bar", "e_o", "x_pna", "y_pna", "Qs")

_CLASS_KIND = {
    "RoundTube": "round_hss",
    "RectTube": "rect_hss",
    "IShape": "i_shape",
    "Angle": "angle",
    "RectBar": "rect_bar",
    "RoundBar": "round_bar",
    "Tee": "tee",
    "Channel": "channel",
    "RolledAngle": "angle",
    "RolledChannel": "channel",
    "RolledIShape": "i_shape",
    "RolledTee": "tee",
    "SlopedIShape": "i_shape",
    "SlopedTee": "tee",
}


@dataclass
class Sec:
    """A section as the checks read it: kind, label, float properties in inch units."""

    kind: str
    label: str
    values: dict[str, float]
    source: str = ""
    notes: list[str] = field(default_factory=list)
    #: The published table the properties come from (catalog shapes), else "".
    cite: str = ""
    #: How a computed section's properties compare with the published tables (the shape's
    #: ``table_agreement``), printed once per sheet; "" for catalog sections.
    caveat: str = ""

    def get(self, name: str) -> float | None:
        """Property in inch units, or None."""
        return self.values.get(name)

    def need(self, name: str, check: str) -> float:
        """Property in inch units; a clear error when missing."""
        v = self.values.get(name)
        if v is None:
            unit, desc = PROPS.get(name, ("", name))
            raise CheckInputError(f"section[{name!r}]", None, f"{desc.lower()} ({unit or 'ratio'}) for the {check}")
        return v


def channel_warping(d: float, bf: float, tf: float, tw: float, xc: float, Ix: float | None = None) -> tuple[float, float]:
    """Warping constant C_w and centroid-to-shear-centre distance x_o of a channel (thin-wall).

    With b' = bf - tw/2 and h = d - tf (centre lines): e_o = 3 tf b'^2/(6 b' tf + h tw) from the
    web centre line, C_w = tf b'^3 h^2/12 (3 b' tf + 2 h tw)/(6 b' tf + h tw) (thin-walled
    open-section theory, e.g. AISC Design Guide 9, from memory); ``xc`` is the centroid from
    the back of the web. That C_w is h^2 tf b'^3/6 - e^2 I_x with the thin-wall I_x and
    e = b'^2 h^2 tf/(4 I_x); given the section's own ``Ix`` (fillets and all), C_w takes that I_x
    in both places, which reproduces C_w of 70 of the 72 C and MC rows of the AISC Shapes
    Database v16.0 within 1 % (the thin-wall I_x: 44 of 72; ``tests/eng/test_sections_computed.py``),
    while the table's e_o is the thin-wall one above.
    """
    b1, h = bf - tw / 2.0, d - tf
    eo = 3.0 * tf * b1**2 / (6.0 * b1 * tf + h * tw)
    if Ix is None:
        cw = tf * b1**3 * h**2 / 12.0 * (3.0 * b1 * tf + 2.0 * h * tw) / (6.0 * b1 * tf + h * tw)
    else:
        e_ix = b1**2 * h**2 * tf / (4.0 * Ix)
        cw = h**2 * tf * b1**3 / 6.0 - e_ix**2 * Ix
    return cw, eo + (xc - tw / 2.0)


def _angle_principal(d: float, b: float, t: float, p: Any) -> dict[str, float]:
    """Principal-axis moduli of an angle: about w (major) to the toes, about z (minor) to the
    toes and to the heel. Corners are measured from the centroid across each axis."""
    theta = math.radians(p.theta_p)
    toes = [(0.0, d), (t, d), (b, 0.0), (b, t)]
    heel = [(0.0, 0.0)]

    def dist(pts: list[tuple[float, float]], phi: float) -> float:
        return max(abs(-(x - p.xc) * math.sin(phi) + (y - p.yc) * math.cos(phi)) for x, y in pts)

    long_toe, short_toe = (toes[:2], toes[2:]) if d >= b else (toes[2:], toes[:2])
    return {"Iw": p.I_max, "Iz": p.I_min, "Sw_toe": p.I_max / dist(toes, theta),
            "Sw_long": p.I_max / dist(long_toe, theta), "Sw_short": p.I_max / dist(short_toe, theta),
            "Sz_toe": p.I_min / dist(toes, theta + math.pi / 2), "Sz_heel": p.I_min / dist(heel, theta + math.pi / 2),
            "beta_w": _beta_w(d, b, t, p, theta)}


def _beta_w(d: float, b: float, t: float, p: Any, theta: float) -> float:
    """|β_w| = |(1/I_w) ∫ z (w² + z²) dA - 2 z_o| of an angle (legs as rectangles, shear centre at
    the meeting of the leg centre lines); the integrand is cubic, so 2-point Gauss per direction
    is exact. AISC 360-16 F10.2(i) User Note (from memory)."""
    import numpy as np

    g, wts = np.polynomial.legendre.leggauss(2)
    c, s_ = math.cos(theta), math.sin(theta)
    total = 0.0
    for x0, y0, bx, by in ((0.0, 0.0, b, t), (0.0, t, t, d - t)):
        for gi, wi in zip(g, wts, strict=True):
            for gj, wj in zip(g, wts, strict=True):
                x = x0 + bx * (gi + 1) / 2 - p.xc
                y = y0 + by * (gj + 1) / 2 - p.yc
                w, z = x * c + y * s_, -x * s_ + y * c
                total += wi * wj * bx * by / 4 * z * (w * w + z * z)
    xs, ys = t / 2 - p.xc, t / 2 - p.yc
    z0 = -xs * s_ + ys * c
    return float(abs(total / p.I_max - 2.0 * z0))


def _from_shape(shape: Any) -> Sec:
    kind = _CLASS_KIND.get(type(shape).__name__)
    if kind is None:
        raise CheckNotCoveredError("section", type(shape).__name__, f"the checks cover {', '.join(KINDS.values())}")
    p = shape.props
    v: dict[str, float] = {
        "A": p.A, "Ix": p.Ix, "Iy": p.Iy, "Sx": p.Sx, "Sy": p.Sy, "Zx": p.Zx, "Zy": p.Zy,
        "rx": p.rx, "ry": p.ry, "r_min": p.r_min, "J": p.J,
    }
    # properties the section carries (catalog shapes: as tabulated) are used as they are
    v.update({k: float(x) for k in _SECTION_EXTRAS if (x := getattr(p, k, None)) is not None})
    if kind == "round_hss":
        v.update(D=shape.D, t=shape.t, D_t=shape.D / shape.t)
    elif kind == "rect_hss":
        v.update(H=shape.H, B=shape.B, t=shape.t, b_t=p.ratios["b/t"], h_t=p.ratios["h/t"])
    elif kind == "i_shape":
        v.update(d=shape.d, bf=shape.bf, tf=shape.tf, tw=shape.tw, bf_2tf=shape.bf / (2 * shape.tf), h_tw=p.ratios["h/tw"])
    elif kind == "angle":
        v.update(d=shape.d, b=shape.b, t=shape.t, b_t=max(shape.d, shape.b) / shape.t)
        v.update(Sx_top=p.Ix / p.c_top, Sx_bot=p.Ix / p.c_bot, Sy_left=p.Iy / p.c_left, Sy_right=p.Iy / p.c_right)
        v.update(_angle_principal(shape.d, shape.b, shape.t, p))
    elif kind == "channel":
        v.update(d=shape.d, bf=shape.bf, tf=shape.tf, tw=shape.tw, bf_tf=shape.bf / shape.tf, h_tw=p.ratios["h/tw"])
        if "Cw" not in v or "x_o" not in v:
            cw, xo = channel_warping(shape.d, shape.bf, shape.tf, shape.tw, p.xc, p.Ix)
            v.setdefault("Cw", cw)
            v.setdefault("x_o", xo)
    elif kind == "tee":
        v.update(d=shape.d, bf=shape.bf, tf=shape.tf, tw=shape.tw, bf_2tf=shape.bf / (2 * shape.tf), d_tw=shape.d / shape.tw,
                 Sx_top=p.Ix / p.c_top, Sx_bot=p.Ix / p.c_bot)
        v.setdefault("y_o", p.c_top - shape.tf / 2)
    elif kind == "rect_bar":
        v.update(H=shape.H, B=shape.B)
    elif kind == "round_bar":
        v.update(D=shape.D)
    notes = list(getattr(p, "notes", []))
    cite = getattr(p, "source", "")
    caveat = "" if cite else str(getattr(shape, "table_agreement", ""))
    return Sec(kind, shape.name, v, cite or "section properties computed by calcpad.eng.sections", notes, cite, caveat)


def resolve_section(section: Any, kind: str | None = None) -> Sec:
    """Read ``section`` (shape object, SectionProps-like, or mapping) into a :class:`Sec`.

    Raises:
        CheckInputError: unknown kind, a property that is not a positive value of the right unit.
        CheckNotCoveredError: a shape type the checks do not cover.
    """
    if isinstance(section, Sec):
        return section
    if section is not None and hasattr(section, "props") and hasattr(section, "moments"):
        sec = _from_shape(section)
        if kind is not None and kind != sec.kind:
            raise CheckInputError("kind", kind, f"{sec.kind!r} for a {type(section).__name__} (or leave kind out)")
        return sec
    if hasattr(section, "as_dict") and hasattr(section, "Ix") and hasattr(section, "ratios"):
        # a SectionProps record (e.g. of a built-up section): its kind must be named
        if not isinstance(kind, str) or kind not in KINDS:
            raise CheckInputError("kind", kind, f"one of {', '.join(KINDS)} for a SectionProps record")
        values = {k: float(v) for k, v in section.as_dict().items() if k in PROPS}
        _derive(kind, values)
        return Sec(kind, str(getattr(section, "name", KINDS[kind])), values, "section properties record")
    if isinstance(section, Mapping):
        k = kind or section.get("kind")
        if not isinstance(k, str) or k not in KINDS:
            raise CheckInputError("kind", k, f"one of {', '.join(KINDS)} for a section given as a mapping")
        values: dict[str, float] = {}
        for name, raw in section.items():
            if name in ("kind", "name"):
                continue
            if name not in PROPS:
                raise CheckInputError(f"section[{name!r}]", raw, f"one of the property names {', '.join(PROPS)}")
            unit, desc = PROPS[name]
            q = parse_quantity(raw, f"section[{name!r}]", expected=unit or None)
            if unit == "" and not q.dimensionless:
                raise CheckInputError(f"section[{name!r}]", raw, "a plain number (ratio)")
            x = float(q.to(unit).magnitude) if unit else float(q.magnitude)
            if not (math.isfinite(x) and x > 0):
                raise CheckInputError(f"section[{name!r}]", raw, f"a positive {desc.lower()}")
            values[name] = x
        _derive(k, values)
        return Sec(k, str(section.get("name", KINDS[k])), values, "section properties as given")
    raise CheckInputError("section", type(section).__name__, "a shape from calcpad.eng.sections or a mapping of properties with kind=")


def _derive(kind: str, v: dict[str, float]) -> None:
    """Fill ratios and radii a mapping leaves out, where they follow directly."""
    if "rx" not in v and "Ix" in v and "A" in v:
        v["rx"] = math.sqrt(v["Ix"] / v["A"])
    if "ry" not in v and "Iy" in v and "A" in v:
        v["ry"] = math.sqrt(v["Iy"] / v["A"])
    if "r_min" not in v:
        rs = [v[k] for k in ("rx", "ry") if k in v]
        if rs and kind != "angle":
            v["r_min"] = min(rs)
    if kind == "round_hss" and "D_t" not in v and "D" in v and "t" in v:
        v["D_t"] = v["D"] / v["t"]
    if kind in ("i_shape", "tee") and "bf_2tf" not in v and "bf" in v and "tf" in v:
        v["bf_2tf"] = v["bf"] / (2 * v["tf"])
    if kind == "channel" and "bf_tf" not in v and "bf" in v and "tf" in v:
        v["bf_tf"] = v["bf"] / v["tf"]
    if kind == "tee" and "d_tw" not in v and "d" in v and "tw" in v:
        v["d_tw"] = v["d"] / v["tw"]
    if kind == "angle" and "b_t" not in v and "t" in v and ("d" in v or "b" in v):
        v["b_t"] = max(v.get("d", 0.0), v.get("b", 0.0)) / v["t"]
