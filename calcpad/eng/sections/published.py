"""Published section properties of a catalog row, as a :class:`~calcpad.eng.sections.props.PublishedProps`.

The AISC tables give the properties about the shape's own axes with the same orientation our
shapes use (:mod:`calcpad.eng.sections.shapes`): W/M/S/HP and HSS symmetric; channels with the
back of the web on the left (``x̄``, ``e_o``, ``x_p`` from it); tees flange up (``ȳ``, ``y_p``
from the outside of the flange); single angles with the long leg vertical and the heel at the
origin (``x̄``, ``ȳ`` from the backs of the legs); double angles with the back-to-back legs
vertical and the other legs at the bottom (``ȳ`` from their backs).

What is not tabulated and how it is filled (each named in ``notes``):

* ``x_o``/``y_o`` (centroid to shear centre): channel ``x̄ + e_o``; tee ``ȳ - t_f/2``; angle
  ``x̄ - t/2``, ``ȳ - t/2``; double angle ``ȳ - t/2``; 0 for doubly symmetric shapes.
* angle ``I_xy`` from the tabulated ``I_x``, ``I_y``, ``I_z`` (negative with the heel at the
  origin): ``I_xy = -sqrt(((I_x + I_y)/2 - I_z)^2 - ((I_x - I_y)/2)^2)``.
* double-angle ``J`` (not tabulated): twice the single angle's tabulated ``J`` when given.
* width-to-thickness ratios from the tabulated dimensions with the AISC 360-16 Table B4.1
  definitions (rolled: ``h = d - 2 k_des``; HSS: flat = outside - 3 t_des; channel ``b = b_f``).
"""

from __future__ import annotations

import math
from collections.abc import Mapping

from calcpad.eng.sections.props import PublishedProps

__all__ = ["published_props"]

#: Family -> the ``kind`` of the shape class that draws it (:mod:`calcpad.eng.sections.shapes`).
_SHAPE_KIND = {"w": "I-shape", "m": "I-shape", "s": "I-shape", "hp": "I-shape", "channel": "channel", "wt": "tee",
               "mt": "tee", "st": "tee", "angle": "angle", "double_angle": "built-up", "hss_rect": "rectangular tube",
               "hss_square": "rectangular tube", "hss_round": "round tube", "pipe": "round tube"}

#: Tabulated values the derived properties of PublishedProps read.
_PUBLISHED_KEYS = ("Sx", "Sy", "rx", "ry", "Iz", "rz")


def _get(d: Mapping[str, float | None], name: str) -> float | None:
    v = d.get(name)
    return None if v is None or (isinstance(v, float) and math.isnan(v)) else float(v)


def published_props(name: str, family: str, d: Mapping[str, float | None], source: str, kind: str | None = None,
                    J_single: float | None = None) -> PublishedProps:
    """PublishedProps of one catalog row ``d`` (our column names, floats; None when blank)."""
    kind = kind or _SHAPE_KIND[family]
    notes = [f"published properties: {source}"]
    extra: dict[str, float | None] = {k: _get(d, k) for k in ("Cw", "x_bar", "y_bar", "e_o", "r_o_bar", "H_flex",
                                                             "x_pna", "y_pna", "Qs")}
    Ixy = 0.0
    A, Ix, Zx, J = float(d["A"]), float(d["Ix"]), float(d["Zx"]), _get(d, "J")  # type: ignore[arg-type]
    if family in ("hss_round", "pipe"):
        od, t = float(d["OD"]), float(d["t_des"])  # type: ignore[arg-type]
        width = depth = od
        xc = yc = od / 2.0
        Iy, Zy = Ix, Zx
        ratios = {"D/t": od / t}
        extra.update(x_o=0.0, y_o=0.0)
    elif family in ("hss_rect", "hss_square"):
        depth, width, t = float(d["Ht"]), float(d["B"]), float(d["t_des"])  # type: ignore[arg-type]
        xc, yc = width / 2.0, depth / 2.0
        Iy, Zy = float(d["Iy"]), float(d["Zy"])  # type: ignore[arg-type]
        ratios = {"b/t": (width - 3.0 * t) / t, "h/t": (depth - 3.0 * t) / t}
        extra.update(x_o=0.0, y_o=0.0)
    elif family in ("w", "m", "s", "hp"):
        depth, width = float(d["d"]), float(d["bf"])  # type: ignore[arg-type]
        tf, tw, k = float(d["tf"]), float(d["tw"]), float(d["k_des"])  # type: ignore[arg-type]
        xc, yc = width / 2.0, depth / 2.0
        Iy, Zy = float(d["Iy"]), float(d["Zy"])  # type: ignore[arg-type]
        ratios = {"bf/2tf": width / (2.0 * tf), "h/tw": (depth - 2.0 * k) / tw}
        extra.update(x_o=0.0, y_o=0.0)
    elif family == "channel":
        depth, width = float(d["d"]), float(d["bf"])  # type: ignore[arg-type]
        tf, tw, k = float(d["tf"]), float(d["tw"]), float(d["k_des"])  # type: ignore[arg-type]
        xbar, eo = float(d["x_bar"]), float(d["e_o"])  # type: ignore[arg-type]
        xc, yc = xbar, depth / 2.0
        Iy, Zy = float(d["Iy"]), float(d["Zy"])  # type: ignore[arg-type]
        ratios = {"b/t": width / tf, "h/tw": (depth - 2.0 * k) / tw}
        extra.update(x_o=xbar + eo, y_o=0.0)
        notes.append("x_o = x̄ + e_o (shear centre beyond the back of the web)")
    elif family in ("wt", "mt", "st"):
        depth, width = float(d["d"]), float(d["bf"])  # type: ignore[arg-type]
        tf, tw = float(d["tf"]), float(d["tw"])  # type: ignore[arg-type]
        ybar = float(d["y_bar"])  # type: ignore[arg-type]
        xc, yc = width / 2.0, depth - ybar
        Iy, Zy = float(d["Iy"]), float(d["Zy"])  # type: ignore[arg-type]
        ratios = {"bf/2tf": width / (2.0 * tf), "d/tw": depth / tw}
        extra.update(x_o=0.0, y_o=ybar - tf / 2.0)
        notes.append("y_o = ȳ - t_f/2 (shear centre at the flange mid-thickness)")
    elif family == "angle":
        depth, width, t = float(d["d"]), float(d["b"]), float(d["t"])  # type: ignore[arg-type]
        xbar, ybar = float(d["x_bar"]), float(d["y_bar"])  # type: ignore[arg-type]
        xc, yc = xbar, ybar
        Iy, Zy, Iz = float(d["Iy"]), float(d["Zy"]), float(d["Iz"])  # type: ignore[arg-type]
        Ixy = -math.sqrt(max(((Ix + Iy) / 2.0 - Iz) ** 2 - ((Ix - Iy) / 2.0) ** 2, 0.0))
        ratios = {"b/t": width / t, "d/t": depth / t}
        extra.update(x_o=xbar - t / 2.0, y_o=ybar - t / 2.0)
        notes.append("x_o = x̄ - t/2, y_o = ȳ - t/2 (shear centre at the meeting of the leg mid-lines); "
                     "I_xy from the tabulated I_x, I_y, I_z")
    elif family == "double_angle":
        t, s = float(d["t"]), float(d["s"])  # type: ignore[arg-type]
        vert, horiz = _double_angle_legs(d)
        depth, width = vert, 2.0 * horiz + s
        ybar = float(d["y_bar"])  # type: ignore[arg-type]
        xc, yc = width / 2.0, ybar
        Iy, Zy = float(d["Iy"]), float(d["Zy"])  # type: ignore[arg-type]
        ratios = {"b/t": horiz / t, "d/t": vert / t}
        extra.update(x_o=0.0, y_o=ybar - t / 2.0)
        if J is None and J_single is not None:
            J = 2.0 * J_single
            notes.append("J = 2 x the single angle's tabulated J (not tabulated for double angles)")
        notes.append("y_o = ȳ - t/2")
    else:
        raise KeyError(family)
    published = {k: float(v) for k in _PUBLISHED_KEYS if (v := _get(d, k)) is not None}
    return PublishedProps(
        name=name, kind=kind, A=A, xc=xc, yc=yc, width=width, depth=depth, Ix=Ix, Iy=Iy, Ixy=Ixy, Zx=Zx, Zy=Zy,
        J=J if J is not None else float("nan"), weight=float(d["weight"]),  # type: ignore[arg-type]
        C=_get(d, "C"), ratios=ratios, notes=notes, published=published, source=source, **extra,  # type: ignore[arg-type]
    )


def _double_angle_legs(d: Mapping[str, float | None]) -> tuple[float, float]:
    """(vertical back-to-back leg, horizontal outstanding leg) of a double-angle row: the table's
    ``d`` is the back-to-back leg (the long one for LLBB, the short one for SLBB)."""
    return float(d["d"]), float(d["b"])  # type: ignore[arg-type]
