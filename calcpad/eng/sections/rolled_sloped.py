"""Rolled I-shapes and tees with sloped inner flange faces (S, ST and the older M/MT rollings).

American Standard beams (S) are rolled with the inner flange faces on a slope of 2 in 12
(16.67 %, AISC Manual Table 1-3 dimension sketch, from memory); the tabulated ``t_f`` is the
flange thickness halfway along the outstand. The outline here has that slope, a root fillet
``r1`` between web and flange and a toe radius ``r2`` at each flange toe, and A, I, S, r and Z are
integrated over it (:class:`~calcpad.eng.sections.rolled._OutlineProps`). ``r1`` is the
caller's to give (``k_des`` less the flange thickness at the web face for an AISC row; not known
for a shop size, default 0); ``r2`` defaults to ``r1/2`` (at most the flange thickness at the
toe). With those radii the 28 S-shapes of the AISC Shapes Database v16.0 come within 1 % on A,
I_x, S_x, Z_x, r_x, r_y for all rows, I_y for 27 and Z_y for 25 (worst -1.8 %); among the rules we
scanned (r2 = 0, t_toe/2, 0.75 t_toe, t_toe, r1/2, 0.6 r1) r1/2 brought the most within 1 %.

J is a lower bound: each tapered outstand as (1/3)∫t³dx less 0.105 t_toe⁴ at its free toe, the
web (d - 2 t_web) t_w³/3, and no junction term. Adding the El Darwish and Johnston junction term
(:func:`~calcpad.eng.sections.rolled.tee_junction`) with r1 = k_des - t_web landed at -4.9 % to
+13.9 % of the tabulated J of the 28 S-shapes (AISC Shapes Database v16.0), above the table for
most, so it is not used; the lower bound is 18 % to 32 % below the table (conservative for
lateral-torsional and torsional buckling). ``J_upper`` gives the value with the junction term.
"""

from __future__ import annotations

import numpy as np

from calcpad.core.errors import InputError
from calcpad.eng.sections._polygons import N_QUARTER
from calcpad.eng.sections.props import SectionProps, length_in
from calcpad.eng.sections.rolled import _fan, _OutlineProps, _round_corners, tee_junction
from calcpad.eng.sections.shapes import IShape, Tee

__all__ = ["S_FLANGE_SLOPE", "SlopedIShape", "SlopedTee"]

#: Inner flange face slope of S-shapes: 2 in 12 (16.67 %).
S_FLANGE_SLOPE = 2.0 / 12.0


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
                       "about 1 % (Z_y of S3x5.7 -1.4 %); J is a lower bound, 18 % to 32 % below the table (conservative)")

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

    def _j_lower(self) -> float:
        return 4.0 * _outstand_j(self.out, self.t_web, self.t_toe) + (self.d - 2.0 * self.t_web) * self.tw**3 / 3.0

    @property
    def J_upper(self) -> float:
        """J with the El Darwish and Johnston junction terms added (not used: above the tables)."""
        alpha, dia = tee_junction(self.t_web, self.tw, self.r1)
        return self._j_lower() + 2.0 * alpha * dia**4

    def _props(self) -> SectionProps:
        d, bf, tf, tw = self.d, self.bf, self.tf, self.tw
        zx, zy = self._outline_z()
        return self._base_props(
            Zx=zx, Zy=zy, J=self._j_lower(),
            ratios={"bf/2tf": bf / (2.0 * tf), "h/tw": (d - 2.0 * (self.t_web + self.r1)) / tw},
            notes=[f"rolled outline: flange slope {self.slope:g}, root fillets r1 = {self.r1:g} in, toe radii "
                   f"r2 = {self.r2:g} in", "h = d - 2*(flange thickness at the web + r1)",
                   "J (lower bound, conservative; 18-32 % below the AISC tables for S-shapes): tapered outstands "
                   "(1/3)*integral(t**3 dx) - 0.105*t_toe**4, web (d - 2 t_web) tw**3/3, fillet junctions neglected"],
        )


class SlopedTee(_OutlineProps, _Sloped, Tee):
    """Tee cut from a sloped-flange I-shape (ST): flange up, stem down; radii as :class:`SlopedIShape`."""

    table_agreement = ("computed sloped-flange tee properties: ST-shapes of the AISC Shapes Database v16.0 within "
                       "1 % to 4 % (I_x, S_x of the smallest above the table); J is a lower bound, 18 % to 34 % "
                       "below the table (conservative)")

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

    def _j_lower(self) -> float:
        return 2.0 * _outstand_j(self.out, self.t_web, self.t_toe) + (self.d - self.t_web) * self.tw**3 / 3.0 - 0.105 * self.tw**4

    @property
    def J_upper(self) -> float:
        """J with the El Darwish and Johnston junction term added (not used: above the tables)."""
        alpha, dia = tee_junction(self.t_web, self.tw, self.r1)
        return self._j_lower() + alpha * dia**4

    def _props(self) -> SectionProps:
        d, bf, tf, tw = self.d, self.bf, self.tf, self.tw
        zx, zy = self._outline_z()
        return self._base_props(
            Zx=zx, Zy=zy, J=self._j_lower(),
            ratios={"bf/2tf": bf / (2.0 * tf), "d/tw": d / tw},
            notes=[f"rolled outline: flange slope {self.slope:g}, root fillets r1 = {self.r1:g} in, toe radii "
                   f"r2 = {self.r2:g} in",
                   "J (lower bound, conservative; 18-34 % below the AISC tables for ST-shapes): tapered outstands "
                   "(1/3)*integral(t**3 dx) - 0.105*t_toe**4, stem (d - t_web) tw**3/3 - 0.105 tw**4, fillet junction neglected"],
        )
