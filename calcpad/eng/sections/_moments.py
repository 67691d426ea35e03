"""Additive area moments about a fixed origin, and the closed-form primitives shapes are built from.

A :class:`Moments` holds the raw integrals of a plane region about the origin of its frame:
``A = ∫dA``, ``Qx = ∫y dA``, ``Qy = ∫x dA``, ``Ixx = ∫y² dA``, ``Iyy = ∫x² dA``, ``Ixy = ∫xy dA``.
Raw integrals add and subtract (holes are subtracted), and move exactly under translation,
rotation and mirroring, so shapes and built-up sections are sums of primitives without
any approximation. Plain floats; lengths in inches by convention of the callers.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

__all__ = ["Central", "Moments", "disc", "rect", "spandrel"]


@dataclass(frozen=True)
class Central:
    """Properties about the centroid, axes parallel to the frame axes."""

    A: float
    xc: float
    yc: float
    Ix: float
    Iy: float
    Ixy: float

    def principal(self) -> tuple[float, float, float]:
        """Return ``(I_max, I_min, theta)``; theta (rad, CCW from x) is the direction of I_max."""
        avg = 0.5 * (self.Ix + self.Iy)
        half = 0.5 * (self.Ix - self.Iy)
        rad = math.hypot(half, self.Ixy)
        theta = 0.5 * math.atan2(-2.0 * self.Ixy, self.Ix - self.Iy)
        return avg + rad, avg - rad, theta


@dataclass(frozen=True)
class Moments:
    """Raw area integrals about the frame origin (see module docstring)."""

    A: float = 0.0
    Qx: float = 0.0
    Qy: float = 0.0
    Ixx: float = 0.0
    Iyy: float = 0.0
    Ixy: float = 0.0

    def __add__(self, o: Moments) -> Moments:
        return Moments(self.A + o.A, self.Qx + o.Qx, self.Qy + o.Qy, self.Ixx + o.Ixx, self.Iyy + o.Iyy, self.Ixy + o.Ixy)

    def __sub__(self, o: Moments) -> Moments:
        return Moments(self.A - o.A, self.Qx - o.Qx, self.Qy - o.Qy, self.Ixx - o.Ixx, self.Iyy - o.Iyy, self.Ixy - o.Ixy)

    def __mul__(self, k: float) -> Moments:
        return Moments(self.A * k, self.Qx * k, self.Qy * k, self.Ixx * k, self.Iyy * k, self.Ixy * k)

    __rmul__ = __mul__

    def translate(self, dx: float, dy: float) -> Moments:
        """Moments of the same region moved by ``(dx, dy)``."""
        A, Qx, Qy = self.A, self.Qx, self.Qy
        return Moments(
            A,
            Qx + dy * A,
            Qy + dx * A,
            self.Ixx + 2.0 * dy * Qx + dy * dy * A,
            self.Iyy + 2.0 * dx * Qy + dx * dx * A,
            self.Ixy + dx * Qx + dy * Qy + dx * dy * A,
        )

    def rotate(self, theta: float) -> Moments:
        """Moments of the region rotated CCW by ``theta`` radians about the origin."""
        c, s = math.cos(theta), math.sin(theta)
        return Moments(
            self.A,
            s * self.Qy + c * self.Qx,
            c * self.Qy - s * self.Qx,
            s * s * self.Iyy + 2.0 * c * s * self.Ixy + c * c * self.Ixx,
            c * c * self.Iyy - 2.0 * c * s * self.Ixy + s * s * self.Ixx,
            c * s * self.Iyy + (c * c - s * s) * self.Ixy - c * s * self.Ixx,
        )

    def mirror_x(self) -> Moments:
        """Moments of the region mirrored about the y axis (x -> -x)."""
        return Moments(self.A, self.Qx, -self.Qy, self.Ixx, self.Iyy, -self.Ixy)

    def central(self) -> Central:
        """Centroid and moments of inertia about centroidal axes (parallel-axis theorem)."""
        A = self.A
        if A <= 0.0:
            raise ValueError("region has no positive area")
        xc, yc = self.Qy / A, self.Qx / A
        ix, iy, ixy = self.Ixx - A * yc * yc, self.Iyy - A * xc * xc, self.Ixy - A * xc * yc
        if abs(ixy) < 1e-12 * (abs(ix) + abs(iy)):
            ixy = 0.0  # round-off of a symmetric section
        return Central(A, xc, yc, ix, iy, ixy)


def rect(x0: float, y0: float, w: float, h: float) -> Moments:
    """Rectangle with lower-left corner ``(x0, y0)``, width ``w`` and height ``h``."""
    A = w * h
    xc, yc = x0 + w / 2.0, y0 + h / 2.0
    return Moments(A, A * yc, A * xc, w * h**3 / 12.0 + A * yc * yc, h * w**3 / 12.0 + A * xc * xc, A * xc * yc)


def disc(xc: float, yc: float, r: float) -> Moments:
    """Full circular disc of radius ``r`` centred at ``(xc, yc)``."""
    A = math.pi * r * r
    i0 = math.pi * r**4 / 4.0
    return Moments(A, A * yc, A * xc, i0 + A * yc * yc, i0 + A * xc * xc, A * xc * yc)


def _spandrel_unit() -> Moments:
    # Region of the unit square [0,1]^2 outside the quarter disc of radius 1 centred at (1, 1):
    # the material a fillet of radius 1 adds in a corner at the origin (or a rounded corner removes).
    square = rect(0.0, 0.0, 1.0, 1.0)
    q_area = math.pi / 4.0
    cq = 1.0 - 4.0 / (3.0 * math.pi)  # centroid of the quarter disc (both coordinates)
    # quarter disc about its own circle centre: Ixx = Iyy = pi/16, Ixy = +1/8 (both coords negative)
    i_c = math.pi / 16.0
    ixy_c = 1.0 / 8.0
    # shift from circle centre (1,1) to origin: use centroid as intermediate
    d = 1.0 - cq  # distance centroid -> centre along each axis
    i_g = i_c - q_area * d * d
    ixy_g = ixy_c - q_area * d * d
    quarter = Moments(q_area, q_area * cq, q_area * cq, i_g + q_area * cq * cq, i_g + q_area * cq * cq, ixy_g + q_area * cq * cq)
    return square - quarter


_SPANDREL = _spandrel_unit()


def spandrel(x: float, y: float, r: float, sx: int = 1, sy: int = 1) -> Moments:
    """Corner spandrel (square r x r less a quarter disc) with its corner at ``(x, y)``.

    ``sx``/``sy`` (+1 or -1) give the directions the square extends from the corner. Add it for a
    fillet in a re-entrant corner; subtract it to round a convex corner of radius ``r``.
    """
    u = _SPANDREL
    m = Moments(u.A * r**2, u.Qx * r**3 * sy, u.Qy * r**3 * sx, u.Ixx * r**4, u.Iyy * r**4, u.Ixy * r**4 * sx * sy)
    return m.translate(x, y)
