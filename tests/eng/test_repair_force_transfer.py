"""reinforce_bent_leg: force transfer between the added angle and the leg for the worst load
direction, and the AISC 360-16 E6 end-connection checks.

Oracle: an independent raster integration written here with numpy from the section dimensions
(HSS3x3x3/16 with the AISC 360-16 B4.2 design wall 0.93 t and outer corner radius 2 t, common
practice; L3x3x1/4 legs as rectangles, wrapped round the top-right corner). For each direction of
the moment vector the bending stress of the composite section (sigma = M (x sin - ...) by the
generalized flexure formula, Timoshenko & Gere, Mechanics of Materials, from memory) is
integrated over the angle; the largest force per unit moment over 0..180 degrees is k_Q, and the
shear flow is V k_Q (q = dF/dz). Values typed below are the job's; nothing is taken from calcpad.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from calcpad.widgets.session import TemplateSession

JOB = {"P": "500 lbf", "L": "30 in", "leg": "HSS3x3x3/16", "leg_grade": "A500 Gr C", "added": "L3x3x1/4", "added_grade": "A36",
       "weld_size": "3/16 in", "weld_length": "2 in", "weld_pitch": "5 in", "F_EXX": "70 ksi", "N": "115 lbf", "e0": "3/16 in",
       "end_weld": "3.5 in"}


def _raster(h: float = 0.004) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """Cell centres of the leg (mask) and the angle (mask) on a grid of pitch h (inches)."""
    t = 0.93 * 0.1875
    B = 3.0
    ta = 0.25
    xs = np.arange(h / 2, B + ta, h)
    X, Y = np.meshgrid(xs, xs)

    def rounded_square(x, y, size, r):
        cx = np.clip(x, r, size - r)
        cy = np.clip(y, r, size - r)
        inside = (x >= 0) & (x <= size) & (y >= 0) & (y <= size)
        return inside & ((x - cx) ** 2 + (y - cy) ** 2 <= r**2)

    outer = rounded_square(X, Y, B, 2 * t)
    inner = rounded_square(X - t, Y - t, B - 2 * t, t)
    leg = outer & ~inner
    angle = ((Y >= B) & (Y <= B + ta) & (X >= B + ta - 3.0) & (X <= B + ta)) | \
            ((X >= B) & (X <= B + ta) & (Y >= B + ta - 3.0) & (Y <= B))
    return X, Y, leg, angle


def _k_Q_oracle() -> float:
    X, Y, leg, angle = _raster()
    both = leg | angle
    dA = 0.004**2
    A = both.sum() * dA
    xb, yb = (X[both].sum() * dA) / A, (Y[both].sum() * dA) / A
    x, y = X - xb, Y - yb
    Ix, Iy, Ixy = (y[both] ** 2).sum() * dA, (x[both] ** 2).sum() * dA, (x[both] * y[both]).sum() * dA
    best = 0.0
    for th in np.radians(np.arange(0.0, 180.0, 0.25)):
        Mx, My = math.cos(th), math.sin(th)  # unit moment vector
        # generalized flexure formula with sigma = (a y + b x): solve I-matrix for the plane
        a, b = np.linalg.solve([[Ix, Ixy], [Ixy, Iy]], [Mx, -My])
        sigma = a * y[angle] + b * x[angle]
        best = max(best, abs(sigma.sum() * dA))
    return best


@pytest.fixture(scope="module")
def after():
    return _reinforced(JOB)


def _reinforced(values):
    session = TemplateSession("reinforce_bent_leg")
    sheets = session.build({**session.values, **values})
    return next(s for s in sheets if "reinforced" in s.title)


def test_force_per_unit_moment_is_the_worst_direction(after) -> None:
    k = after["k_Q"].to("1/in").magnitude
    # 2 %: the sheet uses the angle's tabulated properties (AISC Shapes Database v16.0, fillet and
    # toe radii included); the raster draws its legs as plain rectangles (1.1 % apart when measured)
    assert k == pytest.approx(_k_Q_oracle(), rel=0.02)
    # the worst direction exceeds the load parallel to a face (Q about x only), the case the old calc used
    Ax = after["Q_ax"].to("in^3").magnitude
    assert k > 1.3 * Ax / after["I_x"].to("in^4").magnitude


def test_shear_flow_and_end_force_use_it(after) -> None:
    k = _k_Q_oracle()
    M = 500 * 30 + 115 * 0.1875  # lbf in: P L + N e0 (the template's base moment, statics)
    # 2 %: tabulated angle properties on the sheet vs rectangular legs in the raster (see above)
    assert after["F_end"].to("lbf").magnitude == pytest.approx(M * k, rel=0.02)
    assert after["q"].to("lbf/in").magnitude == pytest.approx(500 * k, rel=0.02)


def test_E6_end_weld_and_stitch_slenderness(after) -> None:
    checks = {c.title: c for c in after.summary()}
    end = checks["End weld length, built-up member bearing on the base plate"]
    # AISC 360-16 E6.2(a): weld length not less than the maximum width of the member: 3 in + 1/4 in
    assert end.demand.to("in").magnitude == pytest.approx(3.25)
    assert end.ratio == pytest.approx(3.25 / 3.5)
    slender = checks["Added member slenderness between stitches"]
    # E6.1: a/r_i <= 0.75 KL/r; r_z of L3x3x1/4 (legs as rectangles) by hand: I_min = I - |I_xy| about the centroid
    A = 2 * 3 * 0.25 - 0.25**2
    xc = (3 * 0.25 * 1.5 + (3 - 0.25) * 0.25 * 0.125) / A
    I = 0.25 * 3**3 / 3 + (3 - 0.25) * 0.25**3 / 3 - A * xc**2
    Ixy = (3 * 0.25 * 1.5 * 0.125 + (3 - 0.25) * 0.25 * 0.125 * (0.25 + 2.75 / 2)) - A * xc * xc
    r_z = math.sqrt((I - abs(Ixy)) / A)
    # the sheet uses the tabulated r_z = 0.585 in of L3x3x1/4 (AISC Manual, 15th ed., Table 1-7,
    # from memory); legs as rectangles give about 1.3 % more
    assert slender.demand.magnitude == pytest.approx(5.0 / 0.585, rel=1e-3)
    assert slender.demand.magnitude == pytest.approx(5.0 / r_z, rel=0.02)


def test_short_end_weld_fails_E6(after) -> None:
    sh = _reinforced({**JOB, "end_weld": "3 in"})
    assert {c.title: c.status for c in sh.summary()}["End weld length, built-up member bearing on the base plate"] == "NG"
