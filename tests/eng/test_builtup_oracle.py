"""Built-up sections checked against sectionproperties (finite-element section library, dev dependency).

The oracle builds each member from its own geometry library (circular/rectangular hollow
sections, angles, channels, rectangles), placed the same way, and computes area, centroid,
moments of inertia, elastic moduli to the extreme fibres and plastic moduli on a mesh.
Curves are polygons on both sides (oracle: ORACLE_N points per circle), so agreement is
expected within ORACLE_REL_TOL = 0.5 %.
"""

from __future__ import annotations

import functools
import math
import warnings

import pytest

from calcpad.core.errors import InputError
from calcpad.eng.sections import Angle, Channel, RectBar, RectTube, RoundTube, get_section
from calcpad.eng.sections.builtup import BuiltUp, OverlapWarning, compare_sections

sp_lib = pytest.importorskip("sectionproperties.pre.library")
sp_analysis = pytest.importorskip("sectionproperties.analysis")

ORACLE_REL_TOL = 0.005
ORACLE_N = 256  # points per circle in the oracle geometry
ORACLE_NR = 64  # points per rounded corner in the oracle geometry


def _sp_geometry(shape):
    """Oracle geometry of a shape in its local frame (origin = lower-left of its bounding box)."""
    if isinstance(shape, RoundTube):
        g = sp_lib.circular_hollow_section(d=shape.D, t=shape.t, n=ORACLE_N)
        return g.shift_section(x_offset=shape.D / 2, y_offset=shape.D / 2)
    if isinstance(shape, RectTube):
        return sp_lib.rectangular_hollow_section(d=shape.H, b=shape.B, t=shape.t, r_out=shape.r_out, n_r=ORACLE_NR)
    if isinstance(shape, Angle):
        return sp_lib.angle_section(d=shape.d, b=shape.b, t=shape.t, r_r=0.0, r_t=0.0, n_r=2)
    if isinstance(shape, Channel):
        assert shape.slope == 0.0
        return sp_lib.channel_section(d=shape.d, b=shape.bf, t_f=shape.tf, t_w=shape.tw, r=0.0, n_r=2)
    if isinstance(shape, RectBar):
        return sp_lib.rectangular_section(d=shape.H, b=shape.B)
    raise AssertionError(type(shape))


def _oracle(placements, elements=400):
    """placements: list of (shape, (x, y), rotate_deg, mirror) with anchor at the shape's local origin."""
    geom = None
    for shape, (x, y), rot, mirror in placements:
        g = _sp_geometry(shape)
        if mirror:
            g = g.mirror_section(axis="y", mirror_point=(0.0, 0.0))
        if rot:
            g = g.rotate_section(angle=rot, rot_point=(0.0, 0.0))
        g = g.shift_section(x_offset=x, y_offset=y)
        geom = g if geom is None else geom + g
    area = sum(p.calculate_area() for p in (geom.geoms if hasattr(geom, "geoms") else [geom]))
    geom.create_mesh(mesh_sizes=[area / elements])
    sec = sp_analysis.Section(geom)
    sec.calculate_geometric_properties()
    sec.calculate_plastic_properties()
    return sec


@functools.cache
def _oracle_for(key):
    return _oracle(ARRANGEMENTS[key])


def _builtup(placements, name="test"):
    bu = BuiltUp(name)
    for i, (shape, at, rot, mirror) in enumerate(placements):
        bu.add(shape, at=at, rotate=rot, mirror=mirror, label=f"m{i}")
    return bu


def _close(a, b, scale):
    assert abs(a - b) <= ORACLE_REL_TOL * abs(scale), (a, b)


ARRANGEMENTS = {
    # asymmetric: square tube with an equal angle welded on one side (heel down, at the tube's right face)
    "tube_plus_angle": [(get_section("HSS3x3x1/4"), (0.0, 0.0), 0.0, False),
                        (get_section("L2x2x1/4"), (3.0, 0.0), 0.0, False)],
    # sister tube: two round pipes side by side, touching
    "sister_tubes": [(get_section("Pipe 1-1/2 Std"), (0.0, 0.0), 0.0, False),
                     (get_section("HSS1.900x0.145"), (1.9, 0.0), 0.0, False)],
    # parallel-flange channel with a plate across its flange tips (closing it), plate wider than the channel
    "channel_plus_plate": [(Channel(6.0, 2.03, 0.343, 0.314), (0.0, 0.0), 0.0, False),
                           (RectBar(7.0, 0.25), (2.03, -0.5), 0.0, False)],
    # tube with two angles, one each side (the left one mirrored): symmetric about the tube axis
    "tube_two_angles": [(get_section("HSS4x4x1/4"), (0.0, 0.0), 0.0, False),
                        (get_section("L3x3x1/4"), (4.0, 0.5), 0.0, False),
                        (get_section("L3x3x1/4"), (0.0, 0.5), 0.0, True)],
    # asymmetric and rotated: round tube resting on an unequal angle turned 90 degrees (long leg flat)
    "tube_rotated_angle": [(RoundTube(3.5, 0.2), (0.0, 0.25), 0.0, False),
                           (Angle(3.0, 2.0, 0.25), (4.0, 0.0), 90.0, False)],
    # asymmetric: angle wrapped round one corner of a square tube (rotated 180 degrees)
    "tube_corner_angle": [(get_section("HSS4x4x1/4"), (0.0, 0.0), 0.0, False),
                          (get_section("L3x3x1/4"), (4.25, 4.25), 180.0, False)],
    # rectangular tube on its side stacked on a flat bar offset to one side
    "rect_tube_on_bar": [(get_section("HSS6x4x1/4"), (0.0, 0.5), 0.0, False),
                         (get_section("FB3x1/2"), (2.0, 0.0), 0.0, False)],
}


@pytest.mark.parametrize("key", list(ARRANGEMENTS))
def test_builtup_matches_sectionproperties(key):
    placements = ARRANGEMENTS[key]
    p = _builtup(placements).props
    bu = _builtup(placements)
    sec = _oracle_for(key)
    cx, cy = sec.get_c()
    ixx, iyy, ixy = sec.get_ic()
    zxx_top, zxx_bot, zyy_right, zyy_left = sec.get_z()
    sxx, syy = sec.get_s()
    _close(p.A, sec.get_area(), p.A)
    x0, y0, x1, y1 = bu.bbox
    _close(bu.centroid[0], cx, x1 - x0)
    _close(bu.centroid[1], cy, y1 - y0)
    _close(p.Ix, ixx, p.Ix)
    _close(p.Iy, iyy, p.Iy)
    _close(p.Ixy, ixy, max(p.Ix, p.Iy))
    _close(p.Sx_top, zxx_top, p.Sx_top)
    _close(p.Sx_bot, zxx_bot, p.Sx_bot)
    _close(p.Sy_left, zyy_left, p.Sy_left)
    _close(p.Sy_right, zyy_right, p.Sy_right)
    _close(p.Zx, sxx, p.Zx)
    _close(p.Zy, syy, p.Zy)


def test_asymmetric_case_really_is_asymmetric():
    p = _builtup(ARRANGEMENTS["tube_plus_angle"]).props
    assert abs(p.Ixy) > 0.1 and p.Sx_top != pytest.approx(p.Sx_bot, rel=0.05)


def test_parallel_axis_table_sums_to_composite():
    bu = _builtup(ARRANGEMENTS["tube_two_angles"])
    df = bu.table()
    total = df.iloc[-1]
    assert total["member"] == "sum"
    assert total["I_x"] == pytest.approx(bu.props.Ix, rel=1e-12)
    assert total["I_y"] == pytest.approx(bu.props.Iy, rel=1e-12)
    assert total["A*y"] / total["A"] == pytest.approx(bu.centroid[1], rel=1e-12)


def test_overlap_is_rejected_by_default():
    bu = BuiltUp("overlap").add(get_section("HSS4x4x1/4"), label="tube")
    with pytest.raises(InputError, match="overlaps 'tube'"):
        bu.add(get_section("L2x2x1/4"), at=(3.0, 0.0), label="angle")  # 1 in inside the tube wall
    assert len(bu.members) == 1


def test_overlap_warns_when_asked_and_counts_area_twice():
    bu = BuiltUp("overlap", on_overlap="warn").add(RectBar(2.0, 2.0), label="a")
    with pytest.warns(OverlapWarning):
        bu.add(RectBar(2.0, 2.0), at=(1.0, 0.0), label="b")  # half overlapping: 2 in^2 shared
    assert bu.overlaps[0][2] == pytest.approx(2.0, rel=1e-9)
    assert bu.props.A == pytest.approx(8.0, rel=1e-12)


def test_touching_members_are_accepted():
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        bu = _builtup(ARRANGEMENTS["sister_tubes"])
    assert len(bu.members) == 2 and not bu.overlaps


def test_bad_placement_inputs():
    bu = BuiltUp("x").add(RectBar(1, 1), label="a")
    with pytest.raises(InputError, match="label"):
        bu.add(RectBar(1, 1), at=(5, 0), label="a")
    with pytest.raises(InputError, match="anchor"):
        bu.add(RectBar(1, 1), at=(5, 0), anchor="middle")
    with pytest.raises(InputError, match="at"):
        bu.add(RectBar(1, 1), at=(5,))
    with pytest.raises(InputError, match="rotate"):
        bu.add(RectBar(1, 1), at=(5, 0), rotate=float("nan"))
    with pytest.raises(InputError, match="shape"):
        bu.add("HSS4x4x1/4")
    with pytest.raises(InputError, match="on_overlap"):
        BuiltUp("y", on_overlap="ignore")
    with pytest.raises(InputError, match="no members"):
        _ = BuiltUp("empty").props


def test_length_strings_for_placement():
    a = BuiltUp("a").add(RectBar(1, 1)).add(RectBar(1, 1), at=("25.4 mm", "-1 in"))
    assert a.members[1].x == pytest.approx(1.0) and a.members[1].y == pytest.approx(-1.0)


def test_centroid_anchor_and_rotation_keep_tube_properties():
    # a round tube is unchanged by rotation about its centroid (common practice: polar symmetry)
    t = get_section("Pipe 2 Std")
    bu = BuiltUp("r").add(t, at=(0.0, 0.0), anchor="centroid", rotate=37.0)
    assert bu.centroid[0] == pytest.approx(0.0, abs=1e-12)
    assert bu.props.Ix == pytest.approx(t.props.Ix, rel=1e-12)
    assert bu.props.Ixy == pytest.approx(0.0, abs=1e-12)


def test_compare_before_after():
    leg = get_section("HSS3x3x1/4")
    after = _builtup(ARRANGEMENTS["tube_plus_angle"])
    df = compare_sections(leg, after)
    row = df.set_index("property")
    assert row.loc["A", "before"] == pytest.approx(leg.props.A)
    assert row.loc["A", "after"] == pytest.approx(leg.props.A + get_section("L2x2x1/4").props.A)
    assert row.loc["Iy", "after/before"] > 1.5
    assert math.isfinite(row.loc["Zx", "after/before"])


@pytest.mark.parametrize("key", ["tube_plus_angle", "tube_corner_angle"])
def test_unsymmetric_bending_stress_matches_sectionproperties(key):
    # sigma = M*(I_y*y - I_xy*x)/(I_x*I_y - I_xy**2) at the critical fibre (common practice),
    # against the oracle's stress field for a moment about the centroidal x axis
    placements = ARRANGEMENTS[key]
    bu = _builtup(placements)
    p = bu.props
    x, y = bu.critical_fibre("x")
    moment = 1000.0
    mine = moment * (p.Iy * y - p.Ixy * x) / (p.Ix * p.Iy - p.Ixy**2)
    sec = _oracle(placements, elements=60)  # bending stress is linear: exact on a coarse mesh
    sec.calculate_warping_properties()
    stress = sec.calculate_stress(mxx=moment)
    oracle = max(abs(v) for mat in stress.get_stress() for v in mat["sig_zz_mxx"])
    assert abs(mine) == pytest.approx(oracle, rel=ORACLE_REL_TOL)


def test_critical_fibre_per_member_and_bad_inputs():
    bu = _builtup(ARRANGEMENTS["tube_corner_angle"])
    p = bu.props
    # whole-section critical point is the farthest from the neutral axis of the unsymmetric formula
    x, y = bu.critical_fibre("x")
    xa, ya = bu.critical_fibre("x", member="m1")
    f_all = abs(p.Iy * y - p.Ixy * x)
    f_angle = abs(p.Iy * ya - p.Ixy * xa)
    assert f_all >= f_angle > 0
    with pytest.raises(InputError, match="member"):
        bu.critical_fibre("x", member="nope")
    with pytest.raises(InputError, match="axis"):
        bu.critical_fibre("z")


def test_drawing_has_one_panel_per_section():
    from calcpad.eng.sections import draw_sections

    fig = draw_sections([get_section("HSS3x3x1/4"), _builtup(ARRANGEMENTS["tube_plus_angle"])], ["before", "after"])
    assert len(fig.axes) == 2
    assert [a.get_title() for a in fig.axes] == ["before", "after"]


def test_worst_direction_of_a_square_tube_is_the_diagonal():
    """Square HSS alone: the diagonal moment (θ = 45°) stresses the rounded corner most; geometry:
    max(x + y) on the outline = 2(b/2 - r_out) + r_out·sqrt(2), σ/M = max(x + y)/(sqrt(2)·I)
    (elastic bending about a principal axis at 45°, I the same about every axis of a square)."""
    tube = get_section("HSS3x3x3/16")
    b = BuiltUp("tube")
    b.add(tube, label="tube")
    theta, x, y, per_m = b.worst_direction()
    assert x == pytest.approx(y)  # on the diagonal
    I = b.moments().central().Ix
    reach = 2 * (tube.width / 2 - tube.r_out) + tube.r_out * math.sqrt(2)
    assert theta == 45.0
    assert per_m == pytest.approx(reach / (math.sqrt(2) * I), rel=2e-3)
    _, _, _, per_m0 = b.worst_direction(angles=(0.0,))
    assert per_m0 == pytest.approx((tube.width / 2) / I, rel=1e-9)
    assert per_m / per_m0 == pytest.approx(1.318, abs=0.01)  # +32 % on the diagonal
