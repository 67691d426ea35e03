"""Catalog families, AISC metric designations, section properties the checks need, lazy loading.

Metric names: the two in issue 14 (``HSS102x102x6.4``, ``W200x46.1``) and others recalled
from the AISC Manual / ASTM A6/A6M metric designations, from memory (each marked). The soft
conversion they follow (1 in = 25.4 mm exactly; 1 lb/ft = 1.48816 kg/m, NIST SP 811) is used
for the round-trip test over every row.
"""

from __future__ import annotations

import math

import pytest

from calcpad.core.errors import InputError
from calcpad.eng.sections import FAMILIES, BuiltUp, designations, find_sections, get_entry, get_section, section_table
from calcpad.eng.sections.catalog import _family_entries, _read
from calcpad.eng.sections.props import PublishedProps

KG_PER_M_PER_LB_PER_FT = 0.45359237 / 0.3048  # NIST SP 811: 1 lb = 0.45359237 kg, 1 ft = 0.3048 m

METRIC = [
    ("HSS102x102x6.4", "HSS4x4x1/4"),  # issue 14
    ("W200x46.1", "W8x31"),  # issue 14
    ("W310x38.7", "W12x26"),  # from memory
    ("W250x32.7", "W10x22"),  # from memory
    ("W360x32.9", "W14x22"),  # from memory
    ("C150x12.2", "C6x8.2"),  # from memory
    ("L76x76x6.4", "L3x3x1/4"),  # from memory
    ("L102x76x9.5", "L4x3x3/8"),  # from memory
    ("HSS152.4x101.6x6.4", "HSS6x4x1/4"),  # soft conversion written to 0.1 mm
    ("HSS152x102x6.4", "HSS6x4x1/4"),  # from memory
    ("HSS168.3x6.4", "HSS6.625x0.250"),  # from memory
    ("WT100x13.4", "WT4x9"),  # from memory
    ("2L76x76x6.4x9.5", "2L3x3x1/4x3/8"),  # soft conversion of the 3/8 in spacing
]


@pytest.mark.parametrize(("metric", "us"), METRIC)
def test_metric_designation_resolves_to_the_same_row_and_prints_as_typed(metric, us):
    assert get_entry(metric) is get_entry(us)
    shape = get_section(metric)
    assert shape.name == metric and shape.props.name == metric
    ref = get_section(us).props
    assert (shape.props.A, shape.props.Ix, shape.props.Zx, shape.props.J) == (ref.A, ref.Ix, ref.Zx, ref.J)


def test_metric_designation_with_spaces_and_case_keeps_what_was_typed():
    shape = get_section("  hss 102 x 102 x 6.4 ")
    assert shape.name == "hss 102 x 102 x 6.4"
    assert get_entry("hss 102 x 102 x 6.4").designation == "HSS4x4x1/4"


@pytest.mark.parametrize("bad", ["W200x90", "HSS102x102x5.0", "L76x76x7.0", "W1500x100"])
def test_unknown_metric_designation_is_a_clear_error(bad):
    with pytest.raises(InputError) as err:
        get_section(bad)
    assert repr(bad) in str(err.value) and "not in the catalog" in str(err.value)


@pytest.mark.parametrize("family", ["w", "m", "s", "hp", "wt", "mt", "st", "channel"])
def test_every_rolled_row_round_trips_through_its_soft_metric_name(family):
    # depth: nominal inches x 25.4 to the mm; mass: lb/ft x 1.48816 to 0.1 kg/m (the AISC soft conversion)
    for e in _family_entries(family):
        depth, weight = e.key[-2], e.key[-1]
        prefix = e.designation.split(str(f"{depth:g}"))[0]
        metric = f"{prefix}{round(depth * 25.4)}x{weight * KG_PER_M_PER_LB_PER_FT:.1f}"
        assert get_entry(metric) is e, metric


@pytest.mark.parametrize("family", ["hss_square", "hss_rect", "hss_round", "angle", "double_angle"])
def test_every_hss_and_angle_row_round_trips_through_its_soft_metric_name(family):
    for e in _family_entries(family):
        if family == "hss_round":
            od, t = e.key
            metric = f"HSS{od * 25.4:.1f}x{t * 25.4:.1f}"
        elif family in ("hss_square", "hss_rect"):
            h, b, t = e.key
            metric = f"HSS{round(h * 25.4)}x{round(b * 25.4)}x{t * 25.4:.1f}"
        elif family == "angle":
            d, b, t = e.key
            metric = f"L{round(d * 25.4)}x{round(b * 25.4)}x{t * 25.4:.1f}"
        else:
            d, b, t, s, legs = e.key
            metric = f"2L{round(d * 25.4)}x{round(b * 25.4)}x{t * 25.4:.1f}x{s * 25.4:.1f}" + {0.0: "", 1.0: "LLBB", 2.0: "SLBB"}[legs]
        assert get_entry(metric) is e, metric


# --------------------------------------------------------------------------- families


@pytest.mark.parametrize(("family", "sample", "at_least"), [
    ("w", "W8x31", 280), ("m", "M6x4.4", 15), ("s", "S8x18.4", 25), ("hp", "HP10x42", 20), ("channel", "MC6x12", 70),
    ("wt", "WT4x9", 280), ("mt", "MT6x5.9", 13), ("st", "ST6x25", 25), ("angle", "L3x3x1/4", 130),
    ("double_angle", "2L3x3x1/4x3/4", 600), ("hss_square", "HSS4x4x1/4", 120), ("hss_rect", "HSS6x4x1/4", 390),
    ("hss_round", "HSS4.000x0.250", 180), ("pipe", "Pipe 2 XXS", 50), ("flat_bar", "FB3x1/4", 50), ("emt", "EMT 1", 10),
])
def test_every_family_is_complete_and_listed(family, sample, at_least):
    names = designations(family)
    assert len(names) >= at_least and sample in names
    assert get_entry(sample).family == family
    published = family not in ("flat_bar", "emt")
    assert isinstance(get_section(sample).props, PublishedProps) == published
    assert set(FAMILIES) >= {family}


def test_double_angle_spacings_change_only_the_y_axis_properties():
    # AISC Manual Table 1-15 lists each pair at s = 0, 3/8 and 3/4 in: the x-axis values and area are the same
    rows = [get_section(f"2L3x3x1/4{s}").props for s in ("", "x3/8", "x3/4")]
    assert len({(p.A, p.Ix, p.Sx, p.y_bar) for p in rows}) == 1
    assert rows[0].Iy < rows[1].Iy < rows[2].Iy and rows[0].r_o_bar < rows[2].r_o_bar
    pair = get_section("2L3x3x1/4x3/8")
    assert isinstance(pair, BuiltUp)
    # drawn in the frame of the published values: x̄ at mid-width (2 b + s)/2, ȳ within the fillet effect
    assert pair.bbox == pytest.approx((0.0, 0.0, 6.375, 3.0))
    assert pair.centroid[0] == pytest.approx(pair.props.xc) and pair.centroid[1] == pytest.approx(pair.props.yc, rel=0.03)
    # J is not tabulated for double angles: twice the single angle's (two separate angles)
    assert rows[0].J == pytest.approx(2 * get_section("L3x3x1/4").props.J)


def test_unequal_double_angle_legs_back_to_back():
    llbb, slbb = get_section("2L4x3x1/4LLBB").props, get_section("2L4x3x1/4SLBB").props
    assert llbb.depth == 4.0 and slbb.depth == 3.0  # the back-to-back legs are vertical
    assert llbb.Ix > slbb.Ix
    assert get_entry("2L3x4x1/4").designation == "2L4x3x1/4LLBB"  # LLBB unless SLBB is said


def test_section_properties_the_checks_need_have_names_and_units():
    c = get_section("C6x8.2").props
    assert c.quantity("Cw").units == c.quantity("Ix").units ** 1.5
    assert str(c.quantity("x_o").units) == "inch" and c.value("H_flex") < 1
    assert c.x_o == pytest.approx(c.x_bar + c.e_o)
    tee = get_section("WT4x9")
    assert tee.props.y_o == pytest.approx(tee.props.y_bar - tee.tf / 2)
    angle = get_section("L4x3x3/8").props
    # E4-9: r̄_o² = x_o² + y_o² + (I_x + I_y)/A with the tabulated values, to the printed 3 figures
    r_o = math.sqrt(angle.x_o**2 + angle.y_o**2 + (angle.Ix + angle.Iy) / angle.A)
    assert r_o == pytest.approx(angle.r_o_bar, rel=0.005)
    with pytest.raises(InputError, match="not defined"):
        get_section("W8x31").props.value("e_o")
    table = section_table("channel")
    assert {"Cw", "x_o", "r_o_bar", "H_flex", "x_pna"} <= set(table.columns)
    assert len(find_sections("channel", min={"Cw": "10 in^6"})) > 0


def test_nominal_wall_gives_computed_properties():
    design, nominal = get_section("HSS4x4x1/4"), get_section("HSS4x4x1/4", wall="nominal")
    assert isinstance(design.props, PublishedProps) and not isinstance(nominal.props, PublishedProps)
    assert nominal.props.A > design.props.A


def test_geometry_of_a_catalog_row_is_the_drawn_outline():
    entry = get_entry("L4x4x1/4")
    drawn = entry.geometry()
    assert not isinstance(drawn.props, PublishedProps)
    assert drawn.props.A == pytest.approx(entry.props().A, rel=0.03)  # legs as rectangles vs the table


def test_a_lookup_reads_only_its_own_family_file():
    _read.cache_clear()
    _family_entries.cache_clear()
    from calcpad.eng.sections import catalog

    catalog._by_norm_family.cache_clear()
    get_entry("W8x31")
    assert _read.cache_info().currsize == 1
    get_entry("HSS102x102x6.4")
    assert _read.cache_info().currsize == 2
    designations()
    assert _read.cache_info().currsize == 16
