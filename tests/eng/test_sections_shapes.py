"""Single shapes: closed forms checked against sectionproperties (oracle), and input validation.

The oracle (finite-element section library, dev dependency) builds each shape from its own
geometry functions; curves are polygons there (ORACLE_N points per circle, ORACLE_NR per corner),
so closed forms are expected within ORACLE_REL_TOL = 0.5 %. Torsion constants: the
thin-wall/Bredt formulas are expected within TORSION_REL_TOL of the oracle's warping analysis.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from calcpad.core.errors import InputError
from calcpad.core.units import Q_
from calcpad.eng.sections import Angle, Channel, IShape, RectBar, RectTube, RoundBar, RoundTube, Tee

sp_lib = pytest.importorskip("sectionproperties.pre.library")
sp_geometry = pytest.importorskip("sectionproperties.pre.geometry")
sp_analysis = pytest.importorskip("sectionproperties.analysis")

ORACLE_REL_TOL = 0.005
TORSION_REL_TOL = 0.03
ORACLE_N = 256
ORACLE_NR = 64


def _analyse(geom, warping=False):
    geom.create_mesh(mesh_sizes=[geom.calculate_area() / 300.0])
    sec = sp_analysis.Section(geom)
    sec.calculate_geometric_properties()
    sec.calculate_plastic_properties()
    if warping:
        sec.calculate_warping_properties()
    return sec


def _bbox(geom):
    x0, _x1, y0, _y1 = geom.calculate_extents()
    return x0, y0


CASES = {
    "round_tube": (RoundTube(4.5, 0.3), lambda: sp_lib.circular_hollow_section(d=4.5, t=0.3, n=ORACLE_N)),
    "round_bar": (RoundBar(1.25), lambda: sp_lib.circular_section(d=1.25, n=ORACLE_N)),
    "rect_tube": (RectTube(6.0, 3.0, 0.3), lambda: sp_lib.rectangular_hollow_section(d=6.0, b=3.0, t=0.3, r_out=0.6, n_r=ORACLE_NR)),
    "rect_tube_r0": (RectTube(5.0, 3.0, 0.25, r_out=0.0),
                     lambda: sp_lib.rectangular_hollow_section(d=5.0, b=3.0, t=0.25, r_out=0.0, n_r=2)),
    "flat_bar": (RectBar(0.5, 4.0), lambda: sp_lib.rectangular_section(d=0.5, b=4.0)),
    "angle_unequal": (Angle(5.0, 3.0, 0.375), lambda: sp_lib.angle_section(d=5.0, b=3.0, t=0.375, r_r=0.0, r_t=0.0, n_r=2)),
    "channel_parallel": (Channel(6.0, 2.5, 0.375, 0.31), lambda: sp_lib.channel_section(d=6.0, b=2.5, t_f=0.375, t_w=0.31, r=0.0, n_r=2)),
    "i_with_fillets": (IShape(8.0, 8.0, 0.435, 0.285, 0.394),
                       lambda: sp_lib.i_section(d=8.0, b=8.0, t_f=0.435, t_w=0.285, r=0.394, n_r=ORACLE_NR)),
    "tee_with_fillets": (Tee(4.0, 6.0, 0.4, 0.3, 0.3), lambda: sp_lib.tee_section(d=4.0, b=6.0, t_f=0.4, t_w=0.3, r=0.3, n_r=ORACLE_NR)),
}


@pytest.mark.parametrize("key", list(CASES))
def test_shape_matches_sectionproperties(key):
    shape, make = CASES[key]
    geom = make()
    sec = _analyse(geom)
    p = shape.props
    x0, y0 = _bbox(geom)
    cx, cy = sec.get_c()
    ixx, iyy, ixy = sec.get_ic()
    sxx, syy = sec.get_s()
    zxx_top, zxx_bot, zyy_right, zyy_left = sec.get_z()
    pairs = [(p.A, sec.get_area(), p.A), (p.xc, cx - x0, p.width), (p.yc, cy - y0, p.depth), (p.Ix, ixx, p.Ix),
             (p.Iy, iyy, p.Iy), (p.Ixy, ixy, max(p.Ix, p.Iy)), (p.Zx, sxx, p.Zx), (p.Zy, syy, p.Zy),
             (p.Sx_top, zxx_top, p.Sx_top), (p.Sx_bot, zxx_bot, p.Sx_bot), (p.Sy_left, zyy_left, p.Sy_left),
             (p.Sy_right, zyy_right, p.Sy_right)]
    for mine, oracle, scale in pairs:
        assert abs(mine - oracle) <= ORACLE_REL_TOL * abs(scale), (key, mine, oracle)


def test_angle_principal_axes_match_sectionproperties():
    shape = Angle(4.0, 3.0, 0.25)
    sec = _analyse(sp_lib.angle_section(d=4.0, b=3.0, t=0.25, r_r=0.0, r_t=0.0, n_r=2))
    i11, i22 = sec.get_ip()
    assert shape.props.I_max == pytest.approx(i11, rel=ORACLE_REL_TOL)
    assert shape.props.I_min == pytest.approx(i22, rel=ORACLE_REL_TOL)
    phi = sec.get_phi()  # degrees, major principal axis from x
    assert math.tan(math.radians(shape.props.theta_p)) == pytest.approx(math.tan(math.radians(phi)), rel=ORACLE_REL_TOL)


def test_sloped_channel_matches_sectionproperties_polygon():
    # American Standard channel with 1:6 flange slope; oracle integrates the same outline on a mesh
    shape = Channel(6.0, 1.92, 0.343, 0.2, slope=1 / 6)
    ring = shape.regions()[0].outer
    n = len(ring)
    geom = sp_geometry.Geometry.from_points(
        points=[tuple(map(float, p)) for p in ring], facets=[(i, (i + 1) % n) for i in range(n)],
        control_points=[(0.1, 3.0)],
    )
    sec = _analyse(geom)
    ixx, iyy, _ = sec.get_ic()
    _, syy = sec.get_s()
    assert shape.props.Ix == pytest.approx(ixx, rel=ORACLE_REL_TOL)
    assert shape.props.Iy == pytest.approx(iyy, rel=ORACLE_REL_TOL)
    assert shape.props.Zy == pytest.approx(syy, rel=ORACLE_REL_TOL)
    assert shape.props.xc == pytest.approx(sec.get_c()[0], rel=ORACLE_REL_TOL)


@pytest.mark.parametrize("key", ["round_tube", "rect_tube"])
def test_closed_section_torsion_constant(key):
    shape, make = CASES[key]
    sec = _analyse(make(), warping=True)
    assert shape.props.J == pytest.approx(sec.get_j(), rel=TORSION_REL_TOL)


def test_convex_pieces_cover_outline_area():
    for shape, _ in CASES.values():
        pieces = shape.convex_pieces()
        area = sum(abs(0.5 * np.sum(p[:, 0] * np.roll(p[:, 1], -1) - np.roll(p[:, 0], -1) * p[:, 1])) for p in pieces)
        outline = sum(0.5 * np.sum(r[:, 0] * np.roll(r[:, 1], -1) - np.roll(r[:, 0], -1) * r[:, 1]) for r in shape.rings())
        assert area == pytest.approx(outline, rel=1e-9)


def test_quantities_use_shared_registry():
    p = RoundTube("60.3 mm", "3.91 mm").props
    q = p.quantity("Ix")
    assert q.units == Q_(1, "in**4").units
    assert p.quantity("D/t").dimensionless
    d = p.as_dict(quantities=True)
    assert d["A"].to("mm**2").magnitude == pytest.approx(math.pi / 4 * (60.3**2 - (60.3 - 2 * 3.91) ** 2), rel=1e-9)


def test_round_tube_from_diameters():
    t = RoundTube.from_diameters("1.900 in", "1.610 in")
    assert t.t == pytest.approx(0.145)
    with pytest.raises(InputError, match="D_i"):
        RoundTube.from_diameters(1.9, 1.9)


# --------------------------------------------------------------------------- bad input

BAD = [
    (lambda: RoundTube(0, 0.1), "D (outside diameter)", "zero"),
    (lambda: RoundTube(-2, 0.1), "D (outside diameter)", "negative"),
    (lambda: RoundTube(2, 1.0), "t (wall thickness)", "half the outside diameter"),
    (lambda: RoundTube(2, 0.1, t_nominal=1.5), "t_nominal", "half"),
    (lambda: RoundTube("2 ksi", 0.1), "D (outside diameter)", "length"),
    (lambda: RoundTube("two inches", 0.1), "D (outside diameter)", ""),
    (lambda: RoundTube(float("inf"), 0.1), "D (outside diameter)", "finite"),
    (lambda: RoundTube(True, 0.1), "D (outside diameter)", "length"),
    (lambda: RoundBar(0), "D (diameter)", "zero"),
    (lambda: RectTube(4, 4, 2.0), "t (wall thickness)", "half the smaller"),
    (lambda: RectTube(4, 2, 1.2), "t (wall thickness)", "half the smaller"),
    (lambda: RectTube(4, 4, 0.25, r_out=2.5), "r_out", "at most half"),
    (lambda: RectTube(4, -4, 0.25), "B (outside width)", "negative"),
    (lambda: RectBar(0, 3), "H (depth)", "zero"),
    (lambda: Angle(3, 3, 3), "t (thickness)", "shorter leg"),
    (lambda: Angle(3, 0, 0.25), "b (horizontal leg)", "zero"),
    (lambda: Channel(6, 2, 3.1, 0.2), "tf (flange thickness)", "half the depth"),
    (lambda: Channel(6, 2, 0.3, 2.5), "tw (web thickness)", "flange width"),
    (lambda: Channel(6, 2, 0.1, 0.2, slope=0.5), "slope", "toe"),
    (lambda: Channel(6, 2, 0.3, 0.2, slope=-1), "slope", "from 0"),
    (lambda: IShape(8, 8, 0.4, 0.3, r=4.0), "r (fillet radius)", "fit"),
    (lambda: IShape(8, 8, 4.5, 0.3), "tf (flange thickness)", "half the depth"),
    (lambda: Tee(4, 6, 0.4, 6.5), "tw (stem thickness)", "flange width"),
    (lambda: Tee(4, 6, 4.0, 0.3), "tf (flange thickness)", "depth"),
    (lambda: RoundTube(2, 0.1, density_pcf=-1), "density_pcf", "positive"),
]


@pytest.mark.parametrize(("make", "field", "words"), BAD)
def test_bad_dimensions_raise_input_error(make, field, words):
    with pytest.raises(InputError) as info:
        make()
    msg = str(info.value)
    assert field in msg and words in msg
