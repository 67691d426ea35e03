"""Straight arrows for matplotlib drawings, cheaper than one ``FancyArrowPatch`` each.

- :func:`straight`: a connection for ``FancyArrowPatch`` that shrinks the ends of a straight
  arrow exactly. matplotlib's ``arc3`` shrinks each end (``shrinkA``/``shrinkB`` points) by a
  bisection search along a Bézier curve; for a straight line the cut point is known, and the
  search was about a sixth of a frame drawing's time. The path is the one ``arc3`` gives (a
  quadratic Bézier with the middle control point halfway), its ends within matplotlib's own
  tolerance of the bisection (0.01 pixel).
- :func:`arrow_row`: several arrows of one style as one artist (the seven arrows of a
  distributed load), each drawn as ``FancyArrowPatch`` draws it, in order, with one graphics
  context: the same pixels as seven patches drawn one after the other.
"""

from __future__ import annotations

import functools
import math
from typing import Any

__all__ = ["arrow_row", "straight"]


@functools.cache
def straight() -> Any:
    """The shared straight connection (a ``ConnectionStyle.Arc3`` with ``rad=0``)."""
    from matplotlib.patches import ConnectionStyle
    from matplotlib.path import Path

    class Straight(ConnectionStyle.Arc3):
        def __call__(self, posA: Any, posB: Any, shrinkA: float = 2.0, shrinkB: float = 2.0,
                     patchA: Any = None, patchB: Any = None) -> Path:
            if patchA is not None or patchB is not None:  # clipped at patches: matplotlib's own way
                return super().__call__(posA, posB, shrinkA, shrinkB, patchA, patchB)
            (x1, y1), (x2, y2) = posA, posB
            length = math.hypot(x2 - x1, y2 - y1)
            if length > 0:
                ux, uy = (x2 - x1) / length, (y2 - y1) / length
                if shrinkA and length > shrinkA:  # as arc3: no cut when the end lies within the shrink
                    x1, y1, length = x1 + ux * shrinkA, y1 + uy * shrinkA, length - shrinkA
                if shrinkB and length > shrinkB:
                    x2, y2 = x2 - ux * shrinkB, y2 - uy * shrinkB
            return Path([(x1, y1), ((x1 + x2) / 2, (y1 + y2) / 2), (x2, y2)], [Path.MOVETO, Path.CURVE3, Path.CURVE3])

    return Straight()


@functools.cache
def _arrow_row_class() -> type:
    from matplotlib.patches import FancyArrowPatch
    from matplotlib.transforms import IdentityTransform

    class ArrowRow(FancyArrowPatch):
        """Arrows of one style from ``ends`` (tail, tip pairs in data coordinates)."""

        def __init__(self, ends: list[tuple[tuple[float, float], tuple[float, float]]], **props: Any) -> None:
            super().__init__(*ends[0], connectionstyle=straight(), **props)
            self._ends = list(ends)

        def draw(self, renderer: Any) -> None:  # FancyArrowPatch.draw, once per arrow, one context
            if not self.get_visible():
                return
            self._dpi_cor = renderer.points_to_pixels(1.0)
            paths = []
            for tail, tip in self._ends:  # as set_positions, without marking the figure changed
                self._posA_posB = [tail, tip]
                path, fillable = self._get_path_in_displaycoord()
                if not isinstance(fillable, (list, tuple)):
                    path, fillable = [path], [fillable]
                face = self._facecolor if self._facecolor[3] else None
                paths += [(p, IdentityTransform(), face if f else None) for p, f in zip(path, fillable, strict=True)]
            self._posA_posB = list(self._ends[0])
            self._draw_paths_with_artist_properties(renderer, paths)
            self.stale = False

    return ArrowRow


def arrow_row(ends: list[tuple[tuple[float, float], tuple[float, float]]], **props: Any) -> Any:
    """One artist drawing a straight ``FancyArrowPatch(tail, tip, **props)`` for each pair of
    ``ends``, in order (add it with ``ax.add_artist`` and widen the data limits by the ends)."""
    return _arrow_row_class()(ends, **props)
