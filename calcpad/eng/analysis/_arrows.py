"""A straight arrow connection for matplotlib's ``FancyArrowPatch`` that shrinks its ends exactly.

matplotlib's ``arc3`` connection shrinks each end of a straight arrow (``shrinkA``/``shrinkB``
points) by a bisection search along a Bézier curve; for a straight line the cut point is known,
and the search was about a sixth of a frame drawing's time. The path is the one ``arc3`` gives
(a quadratic Bézier with the middle control point halfway), its ends within matplotlib's own
tolerance of the bisection (0.01 pixel).
"""

from __future__ import annotations

import functools
import math
from typing import Any

__all__ = ["straight"]


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
