"""Closed-form section shapes: tubes, pipe, bars, angles, channels, I-shapes and tees.

Every shape works in its own frame: x to the right, y up, origin at the lower-left corner of
its bounding box. Dimensions are given as floats in inches, pint quantities or strings such as
``"1.900 in"``; they are checked and stored as inches. ``shape.props`` holds the properties
(:class:`~calcpad.eng.sections.props.SectionProps`), ``shape.moments()`` the exact area integrals
used by built-up sections, ``shape.regions()`` the outline (polygons with holes) and
``shape.convex_pieces()`` a split of the outline into convex polygons (overlap tests).

Approximations (also listed in ``props.notes``):

* Rolled angles are modelled as two rectangles (root fillet and toe rounding neglected) and
  channels with their sloped flanges but no fillets. Area and moments of inertia then fall
  within about 3 % of the AISC Manual tables; see the tolerances in
  ``tests/eng/test_sections_catalog.py``.
* I-shapes and tees take an optional root fillet radius ``r`` (``k_des - tf``), modelled exactly.
* ``J`` is closed form for round sections, Bredt's thin-wall formula on the rounded mid-line
  for rectangular tubes, Roark's formula for solid rectangles, and ``sum(b*t**3/3)`` of the
  modelled rectangles for open shapes (fillets ignored, so it is low for rolled shapes).
"""

from __future__ import annotations

import math
from functools import cached_property

import numpy as np

from calcpad.core.errors import InputError
from calcpad.eng.sections._moments import _SPANDREL, Moments, disc, rect, spandrel
from calcpad.eng.sections._polygons import N_QUARTER, Region, arc, plastic_modulus, ring_moments
from calcpad.eng.sections.props import STEEL_DENSITY_PCF, SectionProps, length_in

__all__ = [
    "Angle",
    "Channel",
    "IShape",
    "RectBar",
    "RectTube",
    "RoundBar",
    "RoundTube",
    "Shape",
    "Tee",
]

_HALF_PI = math.pi / 2.0
# distance of a spandrel's centroid from its corner, per unit radius
_SPANDREL_K = _SPANDREL.Qx / _SPANDREL.A


def _ccw(poly: np.ndarray) -> np.ndarray:
    x, y = poly[:, 0], poly[:, 1]
    area2 = float(np.sum(x * np.roll(y, -1) - np.roll(x, -1) * y))
    return poly if area2 >= 0 else poly[::-1]


def _box(x0: float, y0: float, w: float, h: float) -> np.ndarray:
    return np.array([[x0, y0], [x0 + w, y0], [x0 + w, y0 + h], [x0, y0 + h]], dtype=float)


def _fan(corner: tuple[float, float], pts: np.ndarray) -> list[np.ndarray]:
    """Triangles from a corner point to consecutive points of an arc (a fillet's convex pieces)."""
    c = np.array(corner, dtype=float)
    return [_ccw(np.array([c, pts[i], pts[i + 1]])) for i in range(len(pts) - 1)]


def _strip(outer: np.ndarray, inner: np.ndarray) -> list[np.ndarray]:
    """Convex quads between matched points of an outer and inner closed contour."""
    n = len(outer)
    out = []
    for i in range(n):
        j = (i + 1) % n
        out.append(np.array([outer[i], outer[j], inner[j], inner[i]]))  # CCW: both contours are CCW
    return out


def _rounded_rect(x0: float, y0: float, w: float, h: float, r: float, n: int) -> np.ndarray:
    """CCW ring of a rectangle with corners rounded to radius r (r = 0: sharp, one point each)."""
    corners = [
        (x0 + w - r, y0 + r, -_HALF_PI, 0.0),
        (x0 + w - r, y0 + h - r, 0.0, _HALF_PI),
        (x0 + r, y0 + h - r, _HALF_PI, math.pi),
        (x0 + r, y0 + r, math.pi, 1.5 * math.pi),
    ]
    pts = [arc(cx, cy, r, a0, a1, n) for cx, cy, a0, a1 in corners]
    return np.vstack(pts)


def _seg_abs_moment(a: float, b: float, c: float) -> float:
    """Integral of |y - c| over y from a to b (a < b)."""
    if c <= a:
        return ((b - c) ** 2 - (a - c) ** 2) / 2.0
    if c >= b:
        return ((c - a) ** 2 - (c - b) ** 2) / 2.0
    return ((c - a) ** 2 + (b - c) ** 2) / 2.0


def _rects_plastic(rects: list[tuple[float, float, float, float]], axis: str) -> float:
    """Plastic modulus of non-overlapping axis-aligned rectangles ``(x0, y0, w, h)`` (exact)."""
    if axis == "y":
        rects = [(y0, x0, h, w) for x0, y0, w, h in rects]
    total = sum(w * h for _, _, w, h in rects)

    def below(c: float) -> float:
        return sum(w * min(max(c - y0, 0.0), h) for _, y0, w, h in rects)

    # area below is piecewise linear in c: walk the breakpoints, then interpolate
    cuts = sorted({y0 for _, y0, _, _ in rects} | {y0 + h for _, y0, _, h in rects})
    prev_c, prev_a = cuts[0], 0.0
    cp = cuts[-1]
    for c in cuts[1:]:
        a = below(c)
        if a >= total / 2.0:
            cp = prev_c + (total / 2.0 - prev_a) * (c - prev_c) / (a - prev_a)
            break
        prev_c, prev_a = c, a
    return sum(w * _seg_abs_moment(y0, y0 + h, cp) for _, y0, w, h in rects)


def _check_less(name: str, value: float, limit: float, what: str) -> None:
    if not value < limit:
        raise InputError(f"{name}: {value:g} in; expected less than {limit:g} in ({what})")


class Shape:
    """Base of all shapes (see module docstring)."""

    kind = "shape"

    def __init__(self, name: str | None, density_pcf: float = STEEL_DENSITY_PCF) -> None:
        self.name = name or self._default_name()
        if not (isinstance(density_pcf, (int, float)) and density_pcf > 0 and math.isfinite(density_pcf)):
            raise InputError(f"density_pcf: {density_pcf!r}; expected a positive number (lb/ft^3)")
        self.density_pcf = float(density_pcf)

    # subclasses provide these
    width: float
    depth: float

    def _default_name(self) -> str:
        return self.kind

    def moments(self) -> Moments:
        """Exact area integrals of the section about the local origin."""
        raise NotImplementedError

    def regions(self, n_quarter: int = N_QUARTER) -> list[Region]:
        """Outline as polygons with holes, curves drawn with ``n_quarter`` segments per 90 deg."""
        raise NotImplementedError

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Non-overlapping convex CCW polygons whose union is the outline."""
        raise NotImplementedError

    def rings(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """All outline rings, outer CCW and holes CW."""
        return [r for reg in self.regions(n_quarter) for r in reg.rings()]

    def _weight_area(self) -> float:
        return self.moments().A

    def _numeric_z(self, axis: str) -> float:
        return plastic_modulus(self.rings(), axis)[0]

    def _props(self) -> SectionProps:
        raise NotImplementedError

    @cached_property
    def props(self) -> SectionProps:
        """Section properties (computed once)."""
        return self._props()

    def _base_props(self, Zx: float, Zy: float, J: float, **kw: object) -> SectionProps:
        c = self.moments().central()
        return SectionProps(
            name=self.name,
            kind=self.kind,
            A=c.A,
            xc=c.xc,
            yc=c.yc,
            width=self.width,
            depth=self.depth,
            Ix=c.Ix,
            Iy=c.Iy,
            Ixy=c.Ixy,
            Zx=Zx,
            Zy=Zy,
            J=J,
            weight=self._weight_area() * self.density_pcf / 144.0,
            **kw,  # type: ignore[arg-type]
        )

    def __repr__(self) -> str:
        return f"<{type(self).__name__} {self.name}>"


# --------------------------------------------------------------------------- round


class RoundTube(Shape):
    """Round tube or pipe of outside diameter ``D`` and (design) wall ``t``.

    Args:
        D: Outside diameter.
        t: Wall thickness used for properties (the design wall for ERW HSS/pipe).
        t_nominal: Nominal wall for the weight per foot (defaults to ``t``).
        name: Label, e.g. ``"Pipe 2 Std"``.
    """

    kind = "round tube"

    def __init__(self, D: object, t: object, *, t_nominal: object | None = None, name: str | None = None,
                 density_pcf: float = STEEL_DENSITY_PCF) -> None:
        self.D = length_in(D, "D (outside diameter)")
        self.t = length_in(t, "t (wall thickness)")
        _check_less("t (wall thickness)", self.t, self.D / 2.0, "half the outside diameter, so that D_i > 0")
        self.t_nominal = self.t if t_nominal is None else length_in(t_nominal, "t_nominal (nominal wall)")
        _check_less("t_nominal (nominal wall)", self.t_nominal, self.D / 2.0, "half the outside diameter")
        self.width = self.depth = self.D
        super().__init__(name, density_pcf)

    @classmethod
    def from_diameters(cls, D_o: object, D_i: object, **kw: object) -> RoundTube:
        """Tube from outside and inside diameters."""
        do = length_in(D_o, "D_o (outside diameter)")
        di = length_in(D_i, "D_i (inside diameter)")
        if di >= do:
            raise InputError(f"D_i (inside diameter): {di:g} in; expected less than D_o = {do:g} in")
        return cls(do, (do - di) / 2.0, **kw)  # type: ignore[arg-type]

    def _default_name(self) -> str:
        return f"Tube {self.D:g} x {self.t:g}"

    @property
    def D_i(self) -> float:
        """Inside diameter."""
        return self.D - 2.0 * self.t

    def moments(self) -> Moments:
        """Exact area integrals about the local origin."""
        R = self.D / 2.0
        return disc(R, R, R) - disc(R, R, R - self.t)

    def _weight_area(self) -> float:
        return math.pi * (self.D - self.t_nominal) * self.t_nominal

    def regions(self, n_quarter: int = N_QUARTER) -> list[Region]:
        """Outline as polygons with holes."""
        R = self.D / 2.0
        outer = arc(R, R, R, 0.0, 2 * math.pi, 4 * n_quarter)[:-1]
        inner = arc(R, R, R - self.t, 0.0, 2 * math.pi, 4 * n_quarter)[:-1]
        return [Region(outer, [inner[::-1]])]

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Non-overlapping convex pieces of the outline."""
        reg = self.regions(n_quarter)[0]
        return _strip(reg.outer, reg.holes[0][::-1])

    def _props(self) -> SectionProps:
        D, Di, t = self.D, self.D_i, self.t
        I = math.pi / 64.0 * (D**4 - Di**4)
        return self._base_props(
            Zx=(D**3 - Di**3) / 6.0,
            Zy=(D**3 - Di**3) / 6.0,
            J=2.0 * I,
            C=2.0 * (2.0 * I) / D,
            ratios={"D/t": D / t},
            notes=["J = 2*I (exact); C = 2*J/D, the elastic value the AISC Manual tables list (the H3.1 User "
                   "Note's pi*(D - t)**2*t/2 is 1-10 % larger)"],
        )


class RoundBar(Shape):
    """Solid round bar of diameter ``D``."""

    kind = "round bar"

    def __init__(self, D: object, *, name: str | None = None, density_pcf: float = STEEL_DENSITY_PCF) -> None:
        self.D = length_in(D, "D (diameter)")
        self.width = self.depth = self.D
        super().__init__(name, density_pcf)

    def _default_name(self) -> str:
        return f"Round bar {self.D:g}"

    def moments(self) -> Moments:
        """Exact area integrals about the local origin."""
        R = self.D / 2.0
        return disc(R, R, R)

    def regions(self, n_quarter: int = N_QUARTER) -> list[Region]:
        """Outline as polygons with holes."""
        R = self.D / 2.0
        return [Region(arc(R, R, R, 0.0, 2 * math.pi, 4 * n_quarter)[:-1])]

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Non-overlapping convex pieces of the outline."""
        return [self.regions(n_quarter)[0].outer]

    def _props(self) -> SectionProps:
        D = self.D
        return self._base_props(Zx=D**3 / 6.0, Zy=D**3 / 6.0, J=math.pi * D**4 / 32.0, notes=["J = pi*D**4/32 (exact)"])


# --------------------------------------------------------------------------- rectangular


def _rounded_rect_moments(x0: float, y0: float, w: float, h: float, r: float) -> Moments:
    m = rect(x0, y0, w, h)
    if r > 0.0:
        m = m - spandrel(x0, y0, r, 1, 1) - spandrel(x0 + w, y0, r, -1, 1)
        m = m - spandrel(x0, y0 + h, r, 1, -1) - spandrel(x0 + w, y0 + h, r, -1, -1)
    return m


def _rounded_rect_half_q(w: float, h: float, r: float) -> float:
    """First moment of the half of a centred rounded rectangle above its x axis."""
    q = w * (h / 2.0) ** 2 / 2.0
    if r > 0.0:
        a_s = _SPANDREL.A * r * r
        q -= 2.0 * a_s * (h / 2.0 - _SPANDREL_K * r)
    return q


class RectTube(Shape):
    """Rectangular or square tube (HSS), depth ``H`` (along y) by width ``B`` (along x).

    Args:
        H: Outside depth (the first number of ``HSS6x4x1/4``).
        B: Outside width.
        t: Design wall thickness.
        r_out: Outside corner radius; default ``2*t`` as the AISC Manual tables assume.
        t_nominal: Nominal wall for the weight per foot (defaults to ``t``).
    """

    kind = "rectangular tube"

    def __init__(self, H: object, B: object, t: object, *, r_out: object | None = None, t_nominal: object | None = None,
                 name: str | None = None, density_pcf: float = STEEL_DENSITY_PCF) -> None:
        self.H = length_in(H, "H (outside depth)")
        self.B = length_in(B, "B (outside width)")
        self.t = length_in(t, "t (wall thickness)")
        _check_less("t (wall thickness)", self.t, min(self.B, self.H) / 2.0, "half the smaller outside dimension")
        self.r_out = 2.0 * self.t if r_out is None else length_in(r_out, "r_out (outside corner radius)", allow_zero=True)
        if self.r_out > min(self.B, self.H) / 2.0:
            raise InputError(
                f"r_out (outside corner radius): {self.r_out:g} in; expected at most half the smaller "
                f"outside dimension, {min(self.B, self.H) / 2.0:g} in"
            )
        self.t_nominal = self.t if t_nominal is None else length_in(t_nominal, "t_nominal (nominal wall)")
        _check_less("t_nominal (nominal wall)", self.t_nominal, min(self.B, self.H) / 2.0, "half the smaller outside dimension")
        self.width, self.depth = self.B, self.H
        super().__init__(name, density_pcf)

    def _default_name(self) -> str:
        return f"Tube {self.H:g} x {self.B:g} x {self.t:g}"

    @property
    def r_in(self) -> float:
        """Inside corner radius (outside radius less the wall, not below 0)."""
        return max(self.r_out - self.t, 0.0)

    def moments(self) -> Moments:
        """Exact area integrals about the local origin."""
        t = self.t
        return _rounded_rect_moments(0.0, 0.0, self.B, self.H, self.r_out) - _rounded_rect_moments(
            t, t, self.B - 2 * t, self.H - 2 * t, self.r_in
        )

    def _weight_area(self) -> float:
        tn = self.t_nominal
        ro = 2.0 * tn if self.r_out == 2.0 * self.t else self.r_out
        return _rounded_rect_moments(0, 0, self.B, self.H, ro).A - _rounded_rect_moments(
            tn, tn, self.B - 2 * tn, self.H - 2 * tn, max(ro - tn, 0.0)
        ).A

    def _contours(self, n_quarter: int) -> tuple[np.ndarray, np.ndarray]:
        t = self.t
        outer = _rounded_rect(0.0, 0.0, self.B, self.H, self.r_out, n_quarter)
        inner = _rounded_rect(t, t, self.B - 2 * t, self.H - 2 * t, self.r_in, n_quarter)
        return outer, inner

    def regions(self, n_quarter: int = N_QUARTER) -> list[Region]:
        """Outline as polygons with holes."""
        outer, inner = self._contours(n_quarter)
        return [Region(_dedupe(outer), [_dedupe(inner)[::-1]])]

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Non-overlapping convex pieces of the outline."""
        outer, inner = self._contours(n_quarter)
        return [p for p in _strip(outer, inner) if abs(_area(p)) > 0.0]

    def _props(self) -> SectionProps:
        B, H, t, ro, ri = self.B, self.H, self.t, self.r_out, self.r_in
        zx = 2.0 * (_rounded_rect_half_q(B, H, ro) - _rounded_rect_half_q(B - 2 * t, H - 2 * t, ri))
        zy = 2.0 * (_rounded_rect_half_q(H, B, ro) - _rounded_rect_half_q(H - 2 * t, B - 2 * t, ri))
        rm = max(ro - t / 2.0, 0.0)
        a_p = (B - t) * (H - t) - (4.0 - math.pi) * rm * rm
        p = 2.0 * (B - t) + 2.0 * (H - t) - (8.0 - 2.0 * math.pi) * rm
        return self._base_props(
            Zx=zx,
            Zy=zy,
            J=4.0 * a_p * a_p * t / p,
            C=2.0 * (B - t) * (H - t) * t - 4.5 * (4.0 - math.pi) * t**3,
            ratios={"b/t": (B - 3.0 * t) / t, "h/t": (H - 3.0 * t) / t},
            notes=[
                f"outside corner radius {ro:g} in, inside {ri:g} in",
                "b = B - 3t, h = H - 3t per AISC 360-16 B4.1b(d)",
                "J: Bredt thin-wall formula 4*Ap**2*t/p on the rounded mid-line",
                "C = 2(B-t)(H-t)t - 4.5(4-pi)t**3 per AISC 360-16 H3.1",
            ],
        )


def _area(p: np.ndarray) -> float:
    x, y = p[:, 0], p[:, 1]
    return 0.5 * float(np.sum(x * np.roll(y, -1) - np.roll(x, -1) * y))


def _dedupe(ring: np.ndarray) -> np.ndarray:
    keep = np.ones(len(ring), dtype=bool)
    d = np.linalg.norm(ring - np.roll(ring, -1, axis=0), axis=1)
    keep[d < 1e-12] = False
    return ring[keep]


class RectBar(Shape):
    """Solid rectangle or flat bar, depth ``H`` (along y) by width ``B`` (along x)."""

    kind = "rectangular bar"

    def __init__(self, H: object, B: object, *, name: str | None = None, density_pcf: float = STEEL_DENSITY_PCF) -> None:
        self.H = length_in(H, "H (depth)")
        self.B = length_in(B, "B (width)")
        self.width, self.depth = self.B, self.H
        super().__init__(name, density_pcf)

    def _default_name(self) -> str:
        return f"Bar {self.H:g} x {self.B:g}"

    def moments(self) -> Moments:
        """Exact area integrals about the local origin."""
        return rect(0.0, 0.0, self.B, self.H)

    def regions(self, n_quarter: int = N_QUARTER) -> list[Region]:
        """Outline as polygons with holes."""
        return [Region(_box(0.0, 0.0, self.B, self.H))]

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Non-overlapping convex pieces of the outline."""
        return [_box(0.0, 0.0, self.B, self.H)]

    def _props(self) -> SectionProps:
        B, H = self.B, self.H
        a, b = max(B, H), min(B, H)
        J = a * b**3 * (1.0 / 3.0 - 0.21 * (b / a) * (1.0 - b**4 / (12.0 * a**4)))
        return self._base_props(
            Zx=B * H * H / 4.0,
            Zy=H * B * B / 4.0,
            J=J,
            ratios={"b/t": a / b},
            notes=["J = a*b**3*(1/3 - 0.21*(b/a)*(1 - b**4/(12*a**4))) (Roark, common practice)"],
        )


# --------------------------------------------------------------------------- open shapes


class Angle(Shape):
    """Equal or unequal leg angle: vertical leg ``d``, horizontal leg ``b``, thickness ``t``.

    The heel is at the origin, the vertical leg runs up the y axis and the horizontal leg along x
    (so ``L4x3x1/4`` is ``Angle(4, 3, 0.25)`` with the long leg vertical, as the AISC tables give
    x-axis values). Fillet and toe radii are not modelled (see module docstring).
    """

    kind = "angle"

    def __init__(self, d: object, b: object, t: object, *, name: str | None = None, density_pcf: float = STEEL_DENSITY_PCF) -> None:
        self.d = length_in(d, "d (vertical leg)")
        self.b = length_in(b, "b (horizontal leg)")
        self.t = length_in(t, "t (thickness)")
        _check_less("t (thickness)", self.t, min(self.b, self.d), "the shorter leg")
        self.width, self.depth = self.b, self.d
        super().__init__(name, density_pcf)

    def _default_name(self) -> str:
        return f"Angle {self.d:g} x {self.b:g} x {self.t:g}"

    def moments(self) -> Moments:
        """Exact area integrals about the local origin."""
        return rect(0.0, 0.0, self.b, self.t) + rect(0.0, self.t, self.t, self.d - self.t)

    def regions(self, n_quarter: int = N_QUARTER) -> list[Region]:
        """Outline as polygons with holes."""
        b, d, t = self.b, self.d, self.t
        return [Region(np.array([[0, 0], [b, 0], [b, t], [t, t], [t, d], [0, d]], dtype=float))]

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Non-overlapping convex pieces of the outline."""
        return [_box(0.0, 0.0, self.b, self.t), _box(0.0, self.t, self.t, self.d - self.t)]

    def _props(self) -> SectionProps:
        b, d, t = self.b, self.d, self.t
        rects = [(0.0, 0.0, b, t), (0.0, t, t, d - t)]
        return self._base_props(
            Zx=_rects_plastic(rects, "x"),
            Zy=_rects_plastic(rects, "y"),
            J=(b + d - t) * t**3 / 3.0,
            ratios={"b/t": b / t, "d/t": d / t},
            notes=["legs modelled as rectangles: fillet and toe radii neglected", "J = (b + d - t)*t**3/3 (thin-wall)",
                   "principal axes: I_max, I_min (= I_z), r_min (= r_z), theta_p"],
        )


class Channel(Shape):
    """Channel: depth ``d``, flange width ``bf``, average flange thickness ``tf``, web ``tw``.

    The back of the web is on the y axis and the flanges point to +x. ``slope`` is the slope of
    the inner flange faces (rise/run): 1/6 for American Standard (C) channels, 0 for parallel
    flanges. ``tf`` is the thickness at the middle of the flange outstand, as the AISC tables
    give it. Web-to-flange fillets are not modelled (see module docstring).
    """

    kind = "channel"

    def __init__(self, d: object, bf: object, tf: object, tw: object, *, slope: float = 0.0, name: str | None = None,
                 density_pcf: float = STEEL_DENSITY_PCF) -> None:
        self.d = length_in(d, "d (depth)")
        self.bf = length_in(bf, "bf (flange width)")
        self.tf = length_in(tf, "tf (flange thickness)")
        self.tw = length_in(tw, "tw (web thickness)")
        if not (isinstance(slope, (int, float)) and 0.0 <= slope < 1.0):
            raise InputError(f"slope (inner flange face): {slope!r}; expected a number from 0 up to 1 (e.g. 1/6)")
        self.slope = float(slope)
        _check_less("tw (web thickness)", self.tw, self.bf, "the flange width")
        half_out = (self.bf - self.tw) / 2.0
        self.t_web = self.tf + self.slope * half_out  # flange thickness at the web face
        self.t_toe = self.tf - self.slope * half_out  # flange thickness at the toe
        _check_less("tf (flange thickness)", self.t_web, self.d / 2.0, "half the depth, at the web face")
        if self.t_toe <= 0.0:
            raise InputError(f"slope (inner flange face): {slope!r}; expected a slope that leaves a positive "
                             f"flange thickness at the toe (tf = {self.tf:g} in)")
        self.width, self.depth = self.bf, self.d
        super().__init__(name, density_pcf)

    def _default_name(self) -> str:
        return f"Channel {self.d:g} x {self.bf:g}"

    def _ring(self) -> np.ndarray:
        d, bf, tw, t0, t1 = self.d, self.bf, self.tw, self.t_web, self.t_toe
        pts = [[0, 0], [bf, 0], [bf, t1], [tw, t0], [tw, d - t0], [bf, d - t1], [bf, d], [0, d]]
        return np.array(pts, dtype=float)

    def moments(self) -> Moments:
        """Exact area integrals about the local origin."""
        return ring_moments(self._ring())  # exact: the outline is straight-edged

    def regions(self, n_quarter: int = N_QUARTER) -> list[Region]:
        """Outline as polygons with holes."""
        return [Region(self._ring())]

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Non-overlapping convex pieces of the outline."""
        d, bf, tw, t0, t1 = self.d, self.bf, self.tw, self.t_web, self.t_toe
        bot = np.array([[0, 0], [bf, 0], [bf, t1], [tw, t0], [0, t0]], dtype=float)
        top = np.array([[0, d - t0], [tw, d - t0], [bf, d - t1], [bf, d], [0, d]], dtype=float)
        return [_ccw(bot), _ccw(top), _box(0, t0, tw, d - 2 * t0)]

    def _props(self) -> SectionProps:
        d, bf, tf, tw = self.d, self.bf, self.tf, self.tw
        return self._base_props(
            Zx=self._numeric_z("x"),
            Zy=self._numeric_z("y"),
            J=(2.0 * bf * tf**3 + (d - 2.0 * tf) * tw**3) / 3.0,
            ratios={"b/t": bf / tf, "h/tw": (d - 2.0 * self.t_web) / tw},
            notes=[f"flange inner-face slope {self.slope:g} modelled; fillets neglected",
                   "h taken as d - 2*(flange thickness at the web face)", "J = sum(b*t**3/3) (thin-wall)"],
        )


class IShape(Shape):
    """Doubly symmetric I-shape (W, S, HP, welded): ``d``, ``bf``, ``tf``, ``tw``, fillet radius ``r``.

    ``r`` is the web-to-flange fillet radius (``k_des - tf`` for rolled W-shapes; 0 for welded).
    """

    kind = "I-shape"

    def __init__(self, d: object, bf: object, tf: object, tw: object, r: object = 0.0, *, name: str | None = None,
                 density_pcf: float = STEEL_DENSITY_PCF) -> None:
        self.d = length_in(d, "d (depth)")
        self.bf = length_in(bf, "bf (flange width)")
        self.tf = length_in(tf, "tf (flange thickness)")
        self.tw = length_in(tw, "tw (web thickness)")
        self.r = length_in(r, "r (fillet radius)", allow_zero=True)
        _check_less("tf (flange thickness)", self.tf, self.d / 2.0, "half the depth")
        _check_less("tw (web thickness)", self.tw, self.bf, "the flange width")
        if 2.0 * (self.tf + self.r) > self.d or self.tw + 2.0 * self.r > self.bf:
            raise InputError(f"r (fillet radius): {self.r:g} in; expected fillets that fit between the flanges and "
                             "within the flange width")
        self.width, self.depth = self.bf, self.d
        super().__init__(name, density_pcf)

    def _default_name(self) -> str:
        return f"I {self.d:g} x {self.bf:g}"

    def _xw(self) -> tuple[float, float]:
        return self.bf / 2.0 - self.tw / 2.0, self.bf / 2.0 + self.tw / 2.0

    def moments(self) -> Moments:
        """Exact area integrals about the local origin."""
        d, bf, tf, tw, r = self.d, self.bf, self.tf, self.tw, self.r
        x0, x1 = self._xw()
        m = rect(0, 0, bf, tf) + rect(0, d - tf, bf, tf) + rect(x0, tf, tw, d - 2 * tf)
        if r > 0:
            m = m + spandrel(x0, tf, r, -1, 1) + spandrel(x1, tf, r, 1, 1)
            m = m + spandrel(x0, d - tf, r, -1, -1) + spandrel(x1, d - tf, r, 1, -1)
        return m

    def regions(self, n_quarter: int = N_QUARTER) -> list[Region]:
        """Outline as polygons with holes."""
        d, bf, tf, r = self.d, self.bf, self.tf, self.r
        x0, x1 = self._xw()
        n = n_quarter
        pts: list[np.ndarray] = [np.array([[0, 0], [bf, 0], [bf, tf]], dtype=float)]
        if r > 0:
            pts.append(arc(x1 + r, tf + r, r, -_HALF_PI, -math.pi, n))
            pts.append(arc(x1 + r, d - tf - r, r, math.pi, _HALF_PI, n))
        else:
            pts.append(np.array([[x1, tf], [x1, d - tf]]))
        pts.append(np.array([[bf, d - tf], [bf, d], [0, d], [0, d - tf]], dtype=float))
        if r > 0:
            pts.append(arc(x0 - r, d - tf - r, r, _HALF_PI, 0.0, n))
            pts.append(arc(x0 - r, tf + r, r, 0.0, -_HALF_PI, n))
        else:
            pts.append(np.array([[x0, d - tf], [x0, tf]]))
        pts.append(np.array([[0, tf]], dtype=float))
        return [Region(_dedupe(np.vstack(pts)))]

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Non-overlapping convex pieces of the outline."""
        d, bf, tf, tw, r = self.d, self.bf, self.tf, self.tw, self.r
        x0, x1 = self._xw()
        out = [_box(0, 0, bf, tf), _box(0, d - tf, bf, tf), _box(x0, tf, tw, d - 2 * tf)]
        if r > 0:
            n = n_quarter
            out += _fan((x1, tf), arc(x1 + r, tf + r, r, -_HALF_PI, -math.pi, n))
            out += _fan((x1, d - tf), arc(x1 + r, d - tf - r, r, math.pi, _HALF_PI, n))
            out += _fan((x0, d - tf), arc(x0 - r, d - tf - r, r, _HALF_PI, 0.0, n))
            out += _fan((x0, tf), arc(x0 - r, tf + r, r, 0.0, -_HALF_PI, n))
        return out

    def _props(self) -> SectionProps:
        d, bf, tf, tw, r = self.d, self.bf, self.tf, self.tw, self.r
        h2 = d / 2.0
        # first moments of the top half (about x) and right half (about y), centroid at the middle
        qx = bf * tf * (h2 - tf / 2.0) + tw * (h2 - tf) ** 2 / 2.0
        qy = 2.0 * tf * (bf / 2.0) ** 2 / 2.0 + (d - 2 * tf) * (tw / 2.0) ** 2 / 2.0
        if r > 0:
            a_s = _SPANDREL.A * r * r
            k = _SPANDREL_K * r
            qx += 2.0 * a_s * (h2 - tf - k)
            qy += 2.0 * a_s * (tw / 2.0 + k)
        return self._base_props(
            Zx=2.0 * qx,
            Zy=2.0 * qy,
            J=(2.0 * bf * tf**3 + (d - tf) * tw**3) / 3.0,
            ratios={"bf/2tf": bf / (2.0 * tf), "h/tw": (d - 2.0 * (tf + r)) / tw},
            notes=[f"fillet radius r = {r:g} in modelled", "h = d - 2*(tf + r)",
                   "J = (2*bf*tf**3 + (d - tf)*tw**3)/3 (thin-wall, fillets ignored)"],
        )


class Tee(Shape):
    """Tee: depth ``d``, flange ``bf`` x ``tf`` at the top, stem ``tw`` down, fillet radius ``r``."""

    kind = "tee"

    def __init__(self, d: object, bf: object, tf: object, tw: object, r: object = 0.0, *, name: str | None = None,
                 density_pcf: float = STEEL_DENSITY_PCF) -> None:
        self.d = length_in(d, "d (depth)")
        self.bf = length_in(bf, "bf (flange width)")
        self.tf = length_in(tf, "tf (flange thickness)")
        self.tw = length_in(tw, "tw (stem thickness)")
        self.r = length_in(r, "r (fillet radius)", allow_zero=True)
        _check_less("tf (flange thickness)", self.tf, self.d, "the depth")
        _check_less("tw (stem thickness)", self.tw, self.bf, "the flange width")
        if self.tf + self.r > self.d or self.tw + 2.0 * self.r > self.bf:
            raise InputError(f"r (fillet radius): {self.r:g} in; expected fillets that fit on the stem and flange")
        self.width, self.depth = self.bf, self.d
        super().__init__(name, density_pcf)

    def _default_name(self) -> str:
        return f"Tee {self.d:g} x {self.bf:g}"

    def _xw(self) -> tuple[float, float]:
        return self.bf / 2.0 - self.tw / 2.0, self.bf / 2.0 + self.tw / 2.0

    def moments(self) -> Moments:
        """Exact area integrals about the local origin."""
        d, bf, tf, tw, r = self.d, self.bf, self.tf, self.tw, self.r
        x0, x1 = self._xw()
        m = rect(0, d - tf, bf, tf) + rect(x0, 0, tw, d - tf)
        if r > 0:
            m = m + spandrel(x0, d - tf, r, -1, -1) + spandrel(x1, d - tf, r, 1, -1)
        return m

    def regions(self, n_quarter: int = N_QUARTER) -> list[Region]:
        """Outline as polygons with holes."""
        d, bf, tf, r = self.d, self.bf, self.tf, self.r
        x0, x1 = self._xw()
        pts: list[np.ndarray] = [np.array([[x0, 0], [x1, 0]], dtype=float)]
        if r > 0:
            pts.append(arc(x1 + r, d - tf - r, r, math.pi, _HALF_PI, n_quarter))
        else:
            pts.append(np.array([[x1, d - tf]]))
        pts.append(np.array([[bf, d - tf], [bf, d], [0, d], [0, d - tf]], dtype=float))
        if r > 0:
            pts.append(arc(x0 - r, d - tf - r, r, _HALF_PI, 0.0, n_quarter))
        else:
            pts.append(np.array([[x0, d - tf]]))
        return [Region(_dedupe(np.vstack(pts)))]

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Non-overlapping convex pieces of the outline."""
        d, bf, tf, tw, r = self.d, self.bf, self.tf, self.tw, self.r
        x0, x1 = self._xw()
        out = [_box(0, d - tf, bf, tf), _box(x0, 0, tw, d - tf)]
        if r > 0:
            out += _fan((x1, d - tf), arc(x1 + r, d - tf - r, r, math.pi, _HALF_PI, n_quarter))
            out += _fan((x0, d - tf), arc(x0 - r, d - tf - r, r, _HALF_PI, 0.0, n_quarter))
        return out

    def _props(self) -> SectionProps:
        d, bf, tf, tw, r = self.d, self.bf, self.tf, self.tw, self.r
        qy = tf * (bf / 2.0) ** 2 / 2.0 + (d - tf) * (tw / 2.0) ** 2 / 2.0
        if r > 0:
            qy += _SPANDREL.A * r * r * (tw / 2.0 + _SPANDREL_K * r)
        return self._base_props(
            Zx=self._numeric_z("x"),
            Zy=2.0 * qy,
            J=(bf * tf**3 + (d - tf) * tw**3) / 3.0,
            ratios={"bf/2tf": bf / (2.0 * tf), "d/tw": d / tw},
            notes=["Zx from the plastic neutral axis of the outline", "J = sum(b*t**3/3) (thin-wall)"],
        )
