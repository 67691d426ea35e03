"""Rolled shapes with fillets and toe radii (calcpad/eng/sections/rolled.py) against two oracles.

1. sectionproperties (finite-element section library, dev dependency) builds the same rolled
   geometry with its own library functions (``angle_section`` with root and toe radii,
   ``tapered_flange_channel`` with root and flange-toe radii and the flange angle, ``i_section``
   with the root radius). Area, centroid, moments of inertia, principal axes and plastic moduli
   of our outline must agree to GEOMETRY_REL_TOL; J (our El Darwish and Johnston approximation,
   not a property of the outline in closed form; for channels the outline's own J by finite
   differences) is compared with the oracle's warping analysis within the band each family shows
   (J_BANDS, measured and pinned here).
2. The AISC Shapes Database in the registry package ``aiscpy`` (GPL-3.0, read with sqlite3, never
   at run time; v14 column layout, edition not confirmed in the package): a sample of every
   family (every SAMPLE_STEP-th row) with the dimensions of the row and our default radii
   (W: r = k_des - tf; C: r1 = half the flange thickness at the web face, r2 = three quarters of
   the flange thickness at the toe; L: the radii of the AISC series, inferred from the v16.0
   table; the C defaults are the simple fractions that brought the most rows within 1 % when we
   scanned the whole family and the L radii were fitted to the v16.0 values, so this sample is
   not independent of those choices). A, I, S, r and Z must agree within 1 % plus half a unit of the
   table's third figure. Rows where our model does not reach 1 % are strict xfails naming the
   measured deviation, so an improvement shows as XPASS. J against the tables (v16.0, every
   family) is in ``tests/eng/test_sections_computed.py``; here our closed-form J is compared with
   the finite-element J of the same outline (item 1) within J_BANDS.
"""

from __future__ import annotations

import importlib.resources
import math
import sqlite3

import numpy as np
import pytest

from calcpad.core.errors import InputError
from calcpad.eng.sections.rolled import RolledAngle, RolledChannel, RolledIShape, rectangle_j, tee_junction
from calcpad.eng.sections.rolled_sloped import SlopedIShape, SlopedTee, sloped_junction

sp_lib = pytest.importorskip("sectionproperties.pre.library")
sp_analysis = pytest.importorskip("sectionproperties.analysis")
aiscpy = pytest.importorskip("aiscpy", reason="dev dependency aiscpy (AISC Shapes Database) not installed")

GEOMETRY_REL_TOL = 2e-4  # both integrate polygons of the same arcs (64 and 32 segments per quarter)
TABLE_REL_TOL = 0.01
SAMPLE_STEP = {"W": 9, "C": 3, "L": 5}


def _analyse(geom):
    geom.create_mesh(mesh_sizes=[geom.calculate_area() / 400.0])
    sec = sp_analysis.Section(geom)
    sec.calculate_geometric_properties()
    sec.calculate_plastic_properties()
    sec.calculate_warping_properties()
    return sec


ORACLE_CASES = {
    "angle_unequal": (RolledAngle(4.0, 3.0, 0.375, 0.25, 0.125),
                      lambda: sp_lib.angle_section(d=4.0, b=3.0, t=0.375, r_r=0.25, r_t=0.125, n_r=32)),
    "angle_equal_thin": (RolledAngle(3.0, 3.0, 0.1875, 0.3, 0.1875),
                         lambda: sp_lib.angle_section(d=3.0, b=3.0, t=0.1875, r_r=0.3, r_t=0.1875, n_r=32)),
    "channel_sloped": (RolledChannel(6.0, 1.92, 0.343, 0.2, slope=1 / 6, r1=0.2, r2=0.1),
                       lambda: sp_lib.tapered_flange_channel(d=6.0, b=1.92, t_f=0.343, t_w=0.2, r_r=0.2, r_f=0.1,
                                                             alpha=math.degrees(math.atan(1 / 6)), n_r=32)),
    "w_fillet": (RolledIShape(8.14, 5.25, 0.33, 0.23, 0.3), lambda: sp_lib.i_section(d=8.14, b=5.25, t_f=0.33, t_w=0.23, r=0.3, n_r=32)),
    # M and HP with the fillet radius of their series (tests/eng/test_sections_computed.py, SERIES_FILLET)
    "m_fillet": (RolledIShape(12.0, 3.07, 0.225, 0.177, 0.24), lambda: sp_lib.i_section(d=12.0, b=3.07, t_f=0.225, t_w=0.177, r=0.24, n_r=32)),
    "m4_fillet": (RolledIShape(4.0, 2.25, 0.17, 0.115, 0.31), lambda: sp_lib.i_section(d=4.0, b=2.25, t_f=0.17, t_w=0.115, r=0.31, n_r=32)),
    "hp_fillet": (RolledIShape(8.02, 8.16, 0.445, 0.445, 0.4), lambda: sp_lib.i_section(d=8.02, b=8.16, t_f=0.445, t_w=0.445, r=0.4, n_r=32)),
    "s_sloped": (SlopedIShape(10.0, 4.944, 0.491, 0.594, 0.5, 0.25), lambda: _s_section()),
    "st_sloped": (SlopedTee(5.0, 4.944, 0.491, 0.594, 0.5, 0.25), lambda: _s_section().split_section((0, 5), (1, 5))[0][0]),
}


def _s_section():
    """sectionproperties' tapered-flange I (t_f at mid-outstand, like ours), 2:12 slope."""
    return sp_lib.tapered_flange_i_section(d=10.0, b=4.944, t_f=0.491, t_w=0.594, r_r=0.5, r_f=0.25,
                                           alpha=math.degrees(math.atan(2 / 12)), n_r=32)

#: Our J / the oracle's J, as measured on this branch (low and high end of each family's band).
J_BANDS = {"angle_unequal": (0.995, 1.01), "angle_equal_thin": (1.005, 1.02), "channel_sloped": (0.998, 1.002), "w_fillet": (0.99, 1.01),
           "m_fillet": (0.99, 1.01), "m4_fillet": (1.02, 1.05), "hp_fillet": (0.99, 1.01), "s_sloped": (0.99, 1.01), "st_sloped": (0.99, 1.01)}


@pytest.fixture(scope="module")
def oracle():
    return {k: _analyse(make()) for k, (_, make) in ORACLE_CASES.items()}


@pytest.mark.parametrize("key", list(ORACLE_CASES))
def test_rolled_outline_matches_sectionproperties(key, oracle):
    shape, _ = ORACLE_CASES[key]
    sec = oracle[key]
    p = shape.props
    x0, _x1, y0, _y1 = sec.geometry.calculate_extents()
    cx, cy = sec.get_c()
    ixx, iyy, ixy = sec.get_ic()
    sxx, syy = sec.get_s()
    pairs = {"A": (p.A, sec.get_area()), "xc": (p.xc, cx - x0), "yc": (p.yc, cy - y0), "Ix": (p.Ix, ixx), "Iy": (p.Iy, iyy),
             "Zx": (p.Zx, sxx), "Zy": (p.Zy, syy)}
    for name, (ours, theirs) in pairs.items():
        assert ours == pytest.approx(theirs, rel=GEOMETRY_REL_TOL), name
    assert p.Ixy == pytest.approx(ixy, rel=GEOMETRY_REL_TOL, abs=GEOMETRY_REL_TOL * ixx)
    if shape.kind == "angle":
        i11, i22 = sec.get_ip()
        assert p.I_max == pytest.approx(i11, rel=GEOMETRY_REL_TOL)
        assert p.I_min == pytest.approx(i22, rel=GEOMETRY_REL_TOL)


@pytest.mark.parametrize("key", list(ORACLE_CASES))
def test_rolled_torsion_constant_within_its_band(key, oracle):
    shape, _ = ORACLE_CASES[key]
    low, high = J_BANDS[key]
    ratio = shape.props.J / oracle[key].get_j()
    assert low <= ratio <= high, f"J ratio {ratio:.3f} outside the measured band {low}..{high}"


#: Sloped-flange outlines outside the set the junction coefficients were fitted to (the S and ST rows
#: of the AISC tables, r1/t_web 0.35 to 1.0, t_w/t_web 0.44 to 1.0): a shop's own proportions, a thick
#: web, a large fillet, a small tee, a thin web, and sharp corners (no fillet, outside the fitted
#: range: our J / finite-element J measured 0.965 to 0.98, conservative), each with its band.
HELD_OUT_SLOPED = {
    "i_14x6": (SlopedIShape(14.0, 6.0, 0.7, 0.45, 0.4, 0.15), 0.99, 1.01),
    "tee_7x6": (SlopedTee(7.0, 6.0, 0.7, 0.45, 0.4, 0.15), 0.99, 1.01),
    "i_thick_web": (SlopedIShape(8.0, 4.5, 0.45, 0.5, 0.3, 0.1), 0.99, 1.01),
    "i_large_fillet": (SlopedIShape(16.0, 7.0, 0.8, 0.4, 0.7, 0.3), 0.99, 1.01),
    "tee_3x3": (SlopedTee(3.0, 3.0, 0.3, 0.25, 0.2, 0.1), 0.99, 1.01),
    "i_thin_web": (SlopedIShape(12.0, 6.0, 0.5, 0.15, 0.2, 0.1), 0.99, 1.015),
    "i_no_fillet": (SlopedIShape(10.0, 4.944, 0.491, 0.594, 0.0, 0.0), 0.96, 0.99),
    "tee_no_fillet": (SlopedTee(6.0, 5.0, 0.544, 0.35, 0.0, 0.0), 0.96, 0.99),
}


@pytest.mark.parametrize("key", list(HELD_OUT_SLOPED))
def test_sloped_flange_j_against_the_finite_element_j_of_held_out_outlines(key):
    # sectionproperties' warping analysis of our own outline polygon (the outline itself is checked
    # against the library's tapered_flange_i_section above)
    from sectionproperties.pre.geometry import Geometry
    from shapely.geometry import Polygon

    shape, low, high = HELD_OUT_SLOPED[key]
    ratio = shape.props.J / _analyse(Geometry(Polygon(shape._outline(16)))).get_j()
    assert low <= ratio <= high, f"J ratio {ratio:.4f} outside {low}..{high}"


def test_sloped_junction_of_a_parallel_flange_is_el_darwish_and_johnston():
    assert sloped_junction(0.5, 0.3, 0.4, 0.0) == tee_junction(0.5, 0.3, 0.4)
    # D: the circle on the web axis touching the outer flange face is tangent to the root fillet,
    # whose centre lies r from the web face and r from the sloped inner face (t_web at the web face)
    t_web, tw, r, slope = 0.5, 0.3, 0.4, 2 / 12
    dia = sloped_junction(t_web, tw, r, slope)[1]
    xc = tw / 2 + r
    yc = t_web - slope * r + r * math.hypot(1.0, slope)
    assert math.hypot(xc, yc - dia / 2) == pytest.approx(dia / 2 + r)


def test_outline_torsion_solver_against_exact_solutions():
    # Saint-Venant J of a rectangle b x t: b t^3 (1/3 - (64/pi^5)(t/b) sum tanh(n pi b/2t)/n^5, n odd)
    # (Timoshenko & Goodier, Theory of Elasticity, torsion of a rectangle; from memory); of an
    # equilateral triangle of side a: sqrt(3) a^4 / 80 (same source)
    from calcpad.eng.sections._torsion import torsion_constant

    for b, t, rel in ((10.0, 1.0, 5e-4), (3.0, 1.0, 1e-3), (1.0, 1.0, 5e-3)):  # error grows as b/t falls to 1
        series = sum(math.tanh(n * math.pi * b / (2 * t)) / n**5 for n in range(1, 40, 2))
        exact = b * t**3 * (1 / 3 - 64 / math.pi**5 * (t / b) * series)
        ring = np.array([[0, 0], [b, 0], [b, t], [0, t]], dtype=float)
        assert torsion_constant(ring, t) == pytest.approx(exact, rel=rel)
    a = 2.0
    tri = np.array([[0, 0], [a, 0], [a / 2, a * math.sqrt(3) / 2]])
    assert torsion_constant(tri, a / 2) == pytest.approx(math.sqrt(3) * a**4 / 80, rel=2e-3)


@pytest.mark.parametrize(("r_over_t", "rel"), [(0.0, 0.01), (0.5, 0.005), (1.0, 0.005), (2.0, 0.005)])
def test_angle_j_matches_the_finite_element_j_over_the_fillet_range(r_over_t, rel):
    # sectionproperties' warping analysis of the same outline (sharp toes) as the oracle; the
    # AISC angles span r1/t = 0.3 to 2 (r1 = k_des - t), where ours is within 0.2 % (measured on
    # this branch); with no fillet at all it is 0.6 % low.
    d, b, t = 4.0, 3.0, 0.3125
    ours = RolledAngle(d, b, t, r_over_t * t, 0.0).props.J
    sec = _analyse(sp_lib.angle_section(d=d, b=b, t=t, r_r=r_over_t * t, r_t=0.0, n_r=32))
    assert ours == pytest.approx(sec.get_j(), rel=rel)


def test_rectangle_j_against_the_thick_plate_series():
    # Timoshenko & Goodier, Theory of Elasticity, torsion of a rectangle: k1 = 0.229 at b/t = 3
    # and 0.263 at b/t = 6 (J = k1 b t^3; table values from memory)
    assert rectangle_j(3.0, 1.0) / 3.0 == pytest.approx(0.263, rel=0.01)
    assert rectangle_j(6.0, 1.0) / 6.0 == pytest.approx(0.299, rel=0.01)


# --------------------------------------------------------------------------- AISC Shapes Database


def _db_rows(table: str, types: tuple[str, ...]) -> list[dict]:
    con = sqlite3.connect(str(importlib.resources.files("aiscpy") / "shapes_AISC.db"))
    try:
        cur = con.execute(f'select * from "{table}"')
        cols = [d[0] for d in cur.description]
        return [dict(zip(cols, r, strict=True)) for r in cur if r[0] in types]
    finally:
        con.close()


def _sample(table: str, types: tuple[str, ...], fam: str) -> list[dict]:
    rows = _db_rows(table, types)
    return rows[:: SAMPLE_STEP[fam]]


def _close(ours: float, printed: float) -> bool:
    half_unit = 0.5 * 10.0 ** (math.floor(math.log10(abs(printed))) - 2)
    return abs(ours - printed) <= half_unit + TABLE_REL_TOL * abs(printed)


def _deviations(p, row: dict, pairs: dict[str, str]) -> list[str]:
    bad = []
    for ours, col in pairs.items():
        v = row.get(col)
        if v in (None, "", 0):
            continue
        got = getattr(p, ours)
        if not _close(got, float(v)):
            bad.append(f"{ours} {got:.4g} vs {float(v):g} ({(got / float(v) - 1) * 100:+.1f} %)")
    return bad


GEOM_PAIRS = {"A": "A", "Ix": "Ix", "Iy": "Iy", "Sx": "Sx", "Sy": "Sy", "Zx": "Zx", "Zy": "Zy", "rx": "rx", "ry": "ry"}
ANGLE_PAIRS = {**GEOM_PAIRS, "I_min": "Iz", "r_min": "rz"}

W_SAMPLE = _sample("W-M-S-HP_shapes_AISC", ("W",), "W")
C_SAMPLE = _sample("C-MC_shapes_AISC", ("C",), "C")
L_SAMPLE = _sample("L_shapes_AISC", ("L",), "L")

#: Sample rows our default radii do not bring within 1 % (measured on this branch; the AISC values of
#: light angles and small channels are not reproduced by one radius rule: see the report).
KNOWN_MISSES: dict[str, str] = {
    "C3X6": "Iy 0.3049 vs 0.3 (+1.6 %); Sy 0.2663 vs 0.263 (+1.2 %)",
    "C3X3.5": "Iy 0.1718 vs 0.169 (+1.7 %); Sy 0.1852 vs 0.182 (+1.7 %); Zx 1.219 vs 1.24 (-1.7 %)",
    "W24X104": "Iy 262.4 vs 259 (+1.3 %)",
    "W10X100": "Iy 204.3 vs 207 (-1.3 %)",
    "L4X4X1/4": "Ix 2.952 vs 3 (-1.6 %); Iy 2.952 vs 3 (-1.6 %); Sx 1.011 vs 1.03 (-1.9 %); Sy 1.011 vs 1.03 (-1.9 %); Zx 1.844 vs 1.82 (+1.3 %); Zy 1.844 vs 1.82 (+1.3 %)",
    "L4X3X5/8": "A 3.973 vs 3.89 (+2.1 %)",
    "L3X2-1/2X3/16": "Ix 0.8867 vs 0.899 (-1.4 %); Zy 0.5428 vs 0.536 (+1.3 %)",
    "L2-1/2X2-1/2X3/16": "Ix 0.5263 vs 0.535 (-1.6 %); Iy 0.5263 vs 0.535 (-1.6 %); Sx 0.2895 vs 0.295 (-1.9 %); Sy 0.2895 vs 0.295 (-1.9 %); I_min 0.2145 vs 0.21 (+2.1 %); r_min 0.489 vs 0.482 (+1.4 %)",
}


def _param(rows: list[dict]) -> list:
    return [pytest.param(r, id=r["Shape"], marks=pytest.mark.xfail(strict=True, reason=KNOWN_MISSES[r["Shape"]]))
            if r["Shape"] in KNOWN_MISSES else pytest.param(r, id=r["Shape"]) for r in rows]


@pytest.mark.parametrize("row", _param(W_SAMPLE))
def test_w_sample_matches_the_table(row):
    d, bf, tf, tw, k = (float(row[c]) for c in ("d", "bf", "tf", "tw", "k(des)"))
    p = RolledIShape(d, bf, tf, tw, max(k - tf, 0.0)).props
    assert not _deviations(p, row, GEOM_PAIRS)


@pytest.mark.parametrize("row", _param(C_SAMPLE))
def test_c_sample_matches_the_table(row):
    d, bf, tf, tw = (float(row[c]) for c in ("d", "bf", "tf", "tw"))
    p = RolledChannel(d, bf, tf, tw, slope=1 / 6).props
    assert not _deviations(p, row, {**GEOM_PAIRS, "xc": "x(bar)"})


@pytest.mark.parametrize("row", _param(L_SAMPLE))
def test_angle_sample_matches_the_table(row):
    d, b, t = (float(row[c]) for c in ("d", "b", "t"))
    p = RolledAngle(d, b, t).props
    assert not _deviations(p, row, {**ANGLE_PAIRS, "yc": "y(bar)", "xc": "x(bar)"})


def test_samples_cover_every_family():
    assert len(W_SAMPLE) >= 20 and len(C_SAMPLE) >= 10 and len(L_SAMPLE) >= 20


# --------------------------------------------------------------------------- input checks


def test_radii_that_do_not_fit_are_refused():
    with pytest.raises(InputError, match="r2"):
        RolledAngle(3.0, 3.0, 0.25, 0.2, 0.3)
    with pytest.raises(InputError, match="r1"):
        RolledAngle(2.0, 1.0, 0.25, 0.8, 0.1)
    with pytest.raises(InputError, match="r2"):
        RolledChannel(6.0, 1.92, 0.343, 0.2, slope=1 / 6, r2=0.5)
    with pytest.raises(InputError, match="negative"):
        RolledAngle(3.0, 3.0, 0.25, -0.1)


def test_series_channel_recognises_a_weight_of_a_catalog_series():
    from calcpad.eng.sections.channel_series import channel_series, series_channel

    # a shop's own weight of the C6 series: same d, t_f and outstand b_f - t_w (1.723 in), other web
    own = series_channel(6.0, 1.723 + 0.25, 0.343, 0.25, name="shop C6x9.2")
    assert own.slope == pytest.approx(1 / 6) and own.name == "shop C6x9.2"
    assert channel_series(6.0, 1.92, 0.343, 0.2).label == "C6"  # C6x8.2 of the table
    assert channel_series(8.0, 1.87, 0.311, 0.179).label == "MC8x8.5"
    assert channel_series(6.0, 2.5, 0.375, 0.31).label == "MC6x12"
    assert channel_series(6.0, 2.5, 0.40, 0.31) is None  # another flange thickness: another rolling
    with pytest.raises(InputError, match="no C or MC series"):
        series_channel(7.5, 2.0, 0.4, 0.25)
    with pytest.raises(InputError, match="tw"):
        series_channel(6.0, 1.92, 0.343, "thin")


@pytest.mark.parametrize("key", list(ORACLE_CASES))
def test_convex_pieces_tile_the_rolled_outline(key):
    from calcpad.eng.sections._polygons import N_QUARTER, ring_moments

    shape, _ = ORACLE_CASES[key]
    pieces = shape.convex_pieces()
    area = sum(abs(ring_moments(p).A) for p in pieces)
    outline = ring_moments(shape.regions(N_QUARTER)[0].outer).A
    assert area == pytest.approx(outline, rel=1e-9)
    for p in pieces:  # convex and counter-clockwise: every turn is a left turn (or straight)
        e = np.roll(p, -1, axis=0) - p
        e_next = np.roll(e, -1, axis=0)
        assert (e[:, 0] * e_next[:, 1] - e[:, 1] * e_next[:, 0] >= -1e-12).all()


def test_a_rolled_angle_in_a_built_up_section():
    from calcpad.eng.sections import BuiltUp, get_section

    tube = get_section("HSS3x3x3/16")
    angle = RolledAngle(3.0, 3.0, 0.25)
    bu = BuiltUp("leg + rolled angle").add(tube, label="leg").add(angle, at=(3.25, 3.25), rotate=180, label="angle")
    assert bu.props.A == pytest.approx(tube.props.A + angle.props.A, rel=1e-12)


def test_angle_radii_come_from_the_series_the_rule_or_the_caller():
    from calcpad.eng.sections.angle_series import SERIES_RADII, series_radii

    assert len(SERIES_RADII) == 25 and series_radii(3.0, 4.0) == series_radii(4.0, 3.0) is not None
    assert series_radii(5.0, 2.0) is None
    l4 = RolledAngle(4.0, 4.0, 0.25)
    assert l4.radii_source == "series" and (l4.r1, l4.r2, l4.r_j) == SERIES_RADII[(4.0, 4.0)]
    assert l4.table_agreement == RolledAngle.series_agreement
    thin = RolledAngle(4.0, 4.0, 0.1875)  # thinner than the series' toe radius: r2 = t
    assert thin.radii_source == "series" and thin.r2 == pytest.approx(0.1875)
    other = RolledAngle(5.0, 2.0, 0.25)
    assert other.radii_source == "rule" and (other.r1, other.r2, other.r_j) == (0.125, 0.0625, 0.125)
    assert other.table_agreement == RolledAngle.table_agreement
    given = RolledAngle(4.0, 4.0, 0.25, 0.3, 0.1)
    assert given.radii_source == "given" and given.r_j == 0.3
    assert any("AISC angle series" in n for n in l4.props.notes)
