"""Rolled I-shapes and tees with sloped inner flange faces (S and ST).

American Standard beams (S) are rolled with the inner flange faces on a slope of 2 in 12
(16.67 %, AISC Manual Table 1-3 dimension sketch, from memory); the tabulated ``t_f`` is the
flange thickness halfway along the outstand. The outline here has that slope, a root fillet
``r1`` between web and flange and a toe radius ``r2`` at each flange toe, and A, I, S, r and Z are
integrated over it (:class:`~calcpad.eng.sections.rolled._OutlineProps`). ``r1`` is the
caller's to give (not known for a shop size, default 0); ``r2`` defaults to ``r1/2`` (at most the
flange thickness at the toe). The AISC Shapes Database v16.0 S and ST values are those of one root
fillet per rolling (S24 and S20 about 0.6 in, S18 and S15 0.5, S12 0.38 to 0.48, S10 0.41, S8 0.37,
S6 0.315, S5 0.31, S4 0.29, S3 0.25; measured from the tables' J, ``tests/eng/test_sections_computed.py``)
with r2 = r1/2: with them every S and ST row's J, A, I_x, S_x, Z_x is within 1 % but a few of
the smallest; I_y comes out 0.2 % to 1.4 % above and Z_y down to -1.5 %.

J: each tapered outstand as (1/3)∫t³dx less 0.105 t_toe⁴ at its free toe, the web
(d - 2 t_web) t_w³/3, plus alpha D⁴ per web-flange junction (:func:`sloped_junction`). The El
Darwish and Johnston junction (:func:`~calcpad.eng.sections.rolled.tee_junction`, fitted for parallel
flanges) came out -5.6 % to +10 % of the finite-element J (sectionproperties) of 56 S outlines,
so for a sloped flange D is the diameter of the circle inscribed at the junction and alpha has the
El Darwish and Johnston form with our own coefficients, fitted by least squares (relative error) to
the finite-element J of 112 outlines: the 28 S-shapes of the AISC Shapes Database v16.0 at two
root radii (r2 = r1/2), at a third radius with r2 = 0.3 r1, and the 28 ST tees; all within -0.5 %
to +0.3 % of the finite-element J (``tests/eng/test_sections_rolled.py`` re-checks held-out
outlines). The fit covers the 2:12 slope (another non-zero slope uses it untested), r1/t_web 0.35
to 1.0 and t_w/t_web 0.44 to 1.0; without a fillet (r1 = 0) J comes out 2 % to 3.5 % below the
finite-element J (conservative). A parallel flange (slope 0) uses the El Darwish and Johnston junction.
"""

from __future__ import annotations

import math

import numpy as np

from calcpad.core.errors import InputError
from calcpad.eng.sections._polygons import N_QUARTER
from calcpad.eng.sections.props import SectionProps, length_in
from calcpad.eng.sections.rolled import _fan, _OutlineProps, _round_corners, tee_junction
from calcpad.eng.sections.shapes import IShape, Tee

__all__ = ["S_FLANGE_SLOPE", "SlopedIShape", "SlopedTee", "sloped_junction"]

#: Inner flange face slope of S-shapes: 2 in 12 (16.67 %).
S_FLANGE_SLOPE = 2.0 / 12.0
#: alpha = c0 + c1 tw/t + c2 r/t + c3 r tw/t² + c4 (tw/t)² of a sloped-flange junction (t at the web
#: face): our least-squares fit to sectionproperties' finite-element J, see the module docstring.
_SLOPED_ALPHA = (-0.0199, 0.3734, 0.0729, -0.0961, -0.1606)


def sloped_junction(t_web: float, tw: float, r: float, slope: float) -> tuple[float, float]:
    """(alpha, D) of a web-to-flange junction with an inner flange face on ``slope``, flange
    thickness ``t_web`` at the web face and root fillet ``r``; the junction adds alpha D⁴ to J.

    D is the diameter of the circle on the web axis that touches the outer flange face and both
    fillets: with the fillet centre at (tw/2 + r, t_web - slope r + r sqrt(1 + slope²)) from the
    web axis and the outer face, D = (x_c² + y_c² - r²)/(y_c + r) (the El Darwish and Johnston D
    when slope = 0, for which their alpha is returned)."""
    if slope == 0.0:
        return tee_junction(t_web, tw, r)
    xc = tw / 2.0 + r
    yc = t_web - slope * r + r * math.sqrt(1.0 + slope * slope)
    dia = (xc * xc + yc * yc - r * r) / (yc + r)
    c0, c1, c2, c3, c4 = _SLOPED_ALPHA
    q, p = tw / t_web, r / t_web
    return c0 + c1 * q + c2 * p + c3 * p * q + c4 * q * q, dia


def _outstand_j(out: float, t0: float, t1: float) -> float:
    """(1/3)∫t³dx over an outstand of length ``out`` tapering from ``t0`` to ``t1``, less 0.105 t1⁴."""
    strip = out * (t0**4 - t1**4) / (4.0 * (t0 - t1)) if t0 > t1 else out * t0**3
    return strip / 3.0 - 0.105 * t1**4


class _Sloped:
    """Flange geometry shared by the sloped I-shape and tee."""

    bf: float
    tf: float
    tw: float
    d: float

    def _init_slope(self, slope: object, r1: object, r2: object | None) -> None:
        if not (isinstance(slope, (int, float)) and not isinstance(slope, bool) and 0.0 <= slope < 1.0):
            raise InputError(f"slope (inner flange face): {slope!r}; expected a number from 0 up to 1 (e.g. 2/12)")
        self.slope = float(slope)
        self.out = (self.bf - self.tw) / 2.0
        self.t_web = self.tf + self.slope * self.out / 2.0
        self.t_toe = self.tf - self.slope * self.out / 2.0
        if self.t_toe <= 0.0:
            raise InputError(f"slope (inner flange face): {slope!r}; expected a slope that leaves a positive flange "
                             f"thickness at the toe (tf = {self.tf:g} in, outstand {self.out:g} in)")
        self.r1 = length_in(r1, "r1 (root fillet radius)", allow_zero=True)
        self.r2 = min(self.r1 / 2.0, self.t_toe) if r2 is None else length_in(r2, "r2 (toe radius)", allow_zero=True)
        if self.r2 > self.t_toe:
            raise InputError(f"r2 (toe radius): {self.r2:g} in; expected at most the flange thickness at the toe, "
                             f"{self.t_toe:g} in")


class SlopedIShape(_OutlineProps, _Sloped, IShape):
    """Rolled I-shape with sloped inner flange faces, root fillets ``r1`` and toe radii ``r2``.

    ``tf`` is the flange thickness halfway along the outstand; ``slope`` defaults to the 2:12 of
    S-shapes. Frame as :class:`~calcpad.eng.sections.shapes.IShape`.
    """

    table_agreement = ("computed sloped-flange I-shape properties: S-shapes of the AISC Shapes Database v16.0 within "
                       "about 1 % given the rolling's root fillet (I_y up to 1.2 % above, Z_y of S4 and S3 up to 1.5 % "
                       "below); J within 1 %")

    def __init__(self, d: object, bf: object, tf: object, tw: object, r1: object = 0.0, r2: object | None = None, *,
                 slope: float = S_FLANGE_SLOPE, name: str | None = None, **kw: object) -> None:
        super().__init__(d, bf, tf, tw, 0.0, name=name, **kw)  # type: ignore[arg-type]
        self._init_slope(slope, r1, r2)
        self.r = self.r1
        if 2.0 * self.t_web >= self.d:
            raise InputError(f"tf (flange thickness): {self.tf:g} in; the sloped flanges meet (d = {self.d:g} in)")
        self._outline(4)  # raises when a radius does not fit on its edges

    def _default_name(self) -> str:
        return f"Sloped-flange I {self.d:g} x {self.bf:g}"

    def _ring(self) -> list[tuple[float, float]]:
        d, bf, tw, t0, t1 = self.d, self.bf, self.tw, self.t_web, self.t_toe
        x0, x1 = (bf - tw) / 2.0, (bf + tw) / 2.0
        return [(0, 0), (bf, 0), (bf, t1), (x1, t0), (x1, d - t0), (bf, d - t1), (bf, d), (0, d), (0, d - t1),
                (x0, d - t0), (x0, t0), (0, t1)]

    def _outline(self, n_quarter: int) -> np.ndarray:
        r1, r2 = self.r1, self.r2
        return _round_corners(self._ring(), [0, 0, r2, r1, r1, r2, 0, 0, r2, r1, r1, r2], n_quarter)

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Flanges with rounded toes, the web, and each root fillet as a fan of triangles."""
        d, bf, tw, t0, t1, r1, r2 = self.d, self.bf, self.tw, self.t_web, self.t_toe, self.r1, self.r2
        x0, x1 = (bf - tw) / 2.0, (bf + tw) / 2.0
        bot = _round_corners([(0, 0), (bf, 0), (bf, t1), (x1, t0), (x0, t0), (0, t1)], [0, 0, r2, 0, 0, r2], n_quarter)
        top = _round_corners([(0, d - t1), (x0, d - t0), (x1, d - t0), (bf, d - t1), (bf, d), (0, d)],
                             [r2, 0, 0, r2, 0, 0], n_quarter)
        pieces = [bot, top, np.array([[x0, t0], [x1, t0], [x1, d - t0], [x0, d - t0]], dtype=float)]
        if r1 > 0.0:
            mid = d / 2.0
            for corner, a, b in (((x1, t0), (bf, t1), (x1, mid)), ((x1, d - t0), (x1, mid), (bf, d - t1)),
                                 ((x0, d - t0), (0, d - t1), (x0, mid)), ((x0, t0), (x0, mid), (0, t1))):
                fil = _round_corners([a, corner, b], [0.0, r1, 0.0], n_quarter)
                pieces += _fan(np.array(corner, dtype=float), fil[1:-1])
        return pieces

    def _j(self) -> float:
        alpha, dia = sloped_junction(self.t_web, self.tw, self.r1, self.slope)
        strips = 4.0 * _outstand_j(self.out, self.t_web, self.t_toe) + (self.d - 2.0 * self.t_web) * self.tw**3 / 3.0
        return strips + 2.0 * alpha * dia**4

    def _props(self) -> SectionProps:
        d, bf, tf, tw = self.d, self.bf, self.tf, self.tw
        zx, zy = self._outline_z()
        return self._base_props(
            Zx=zx, Zy=zy, J=self._j(),
            ratios={"bf/2tf": bf / (2.0 * tf), "h/tw": (d - 2.0 * (self.t_web + self.r1)) / tw},
            notes=[f"rolled outline: flange slope {self.slope:g}, root fillets r1 = {self.r1:g} in, toe radii "
                   f"r2 = {self.r2:g} in", "h = d - 2*(flange thickness at the web + r1)",
                   "J: tapered outstands (1/3)*integral(t**3 dx) - 0.105*t_toe**4, web (d - 2 t_web) tw**3/3, plus "
                   "2 alpha D**4 for the junctions (D inscribed at the junction; alpha fitted to finite-element J)"],
        )


class SlopedTee(_OutlineProps, _Sloped, Tee):
    """Tee cut from a sloped-flange I-shape (ST): flange up, stem down; radii as :class:`SlopedIShape`."""

    table_agreement = ("computed sloped-flange tee properties: ST-shapes of the AISC Shapes Database v16.0 within "
                       "about 1 % given the rolling's root fillet, but I_x, S_x of ST2.5 and smaller up to 4 % above "
                       "the table (unconservative); J within 1 %")

    def __init__(self, d: object, bf: object, tf: object, tw: object, r1: object = 0.0, r2: object | None = None, *,
                 slope: float = S_FLANGE_SLOPE, name: str | None = None, **kw: object) -> None:
        super().__init__(d, bf, tf, tw, 0.0, name=name, **kw)  # type: ignore[arg-type]
        self._init_slope(slope, r1, r2)
        self.r = self.r1
        if self.t_web + self.r1 >= self.d:
            raise InputError(f"r1 (root fillet radius): {self.r1:g} in; expected the flange and fillet to fit in d = {self.d:g} in")
        self._outline(4)

    def _default_name(self) -> str:
        return f"Sloped-flange tee {self.d:g} x {self.bf:g}"

    def _ring(self) -> list[tuple[float, float]]:
        d, bf, tw, t0, t1 = self.d, self.bf, self.tw, self.t_web, self.t_toe
        x0, x1 = (bf - tw) / 2.0, (bf + tw) / 2.0
        return [(x0, 0), (x1, 0), (x1, d - t0), (bf, d - t1), (bf, d), (0, d), (0, d - t1), (x0, d - t0)]

    def _outline(self, n_quarter: int) -> np.ndarray:
        r1, r2 = self.r1, self.r2
        return _round_corners(self._ring(), [0, 0, r1, r2, 0, 0, r2, r1], n_quarter)

    def convex_pieces(self, n_quarter: int = N_QUARTER) -> list[np.ndarray]:
        """Flange with rounded toes, the stem, and each root fillet as a fan of triangles."""
        d, bf, tw, t0, t1, r1, r2 = self.d, self.bf, self.tw, self.t_web, self.t_toe, self.r1, self.r2
        x0, x1 = (bf - tw) / 2.0, (bf + tw) / 2.0
        top = _round_corners([(0, d - t1), (x0, d - t0), (x1, d - t0), (bf, d - t1), (bf, d), (0, d)],
                             [r2, 0, 0, r2, 0, 0], n_quarter)
        pieces = [top, np.array([[x0, 0], [x1, 0], [x1, d - t0], [x0, d - t0]], dtype=float)]
        if r1 > 0.0:
            for corner, a, b in (((x1, d - t0), (x1, 0.0), (bf, d - t1)), ((x0, d - t0), (0, d - t1), (x0, 0.0))):
                fil = _round_corners([a, corner, b], [0.0, r1, 0.0], n_quarter)
                pieces += _fan(np.array(corner, dtype=float), fil[1:-1])
        return pieces

    def _j(self) -> float:
        alpha, dia = sloped_junction(self.t_web, self.tw, self.r1, self.slope)
        strips = (2.0 * _outstand_j(self.out, self.t_web, self.t_toe) + (self.d - self.t_web) * self.tw**3 / 3.0
                  - 0.105 * self.tw**4)
        return strips + alpha * dia**4

    def _props(self) -> SectionProps:
        d, bf, tf, tw = self.d, self.bf, self.tf, self.tw
        zx, zy = self._outline_z()
        return self._base_props(
            Zx=zx, Zy=zy, J=self._j(),
            ratios={"bf/2tf": bf / (2.0 * tf), "d/tw": d / tw},
            notes=[f"rolled outline: flange slope {self.slope:g}, root fillets r1 = {self.r1:g} in, toe radii "
                   f"r2 = {self.r2:g} in",
                   "J: tapered outstands (1/3)*integral(t**3 dx) - 0.105*t_toe**4, stem (d - t_web) tw**3/3 - 0.105 tw**4, "
                   "plus alpha D**4 for the junction (D inscribed at the junction; alpha fitted to finite-element J)"],
        )
