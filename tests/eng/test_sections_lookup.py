"""Catalog lookup (forgiving input, "did you mean"), listing, search and the design-wall rule."""

from __future__ import annotations

import pytest

from calcpad.core.errors import InputError
from calcpad.eng.sections import FAMILIES, designations, find_sections, get_entry, get_section, section_table
from calcpad.eng.sections.catalog import ERW_DESIGN_WALL_FACTOR


@pytest.mark.parametrize(
    ("text", "canonical"),
    [
        ("Pipe 1-1/2 Std", "Pipe 1-1/2 Std"),
        ("pipe 1.5 std", "Pipe 1-1/2 Std"),
        ("PIPE 2 sch 80", "Pipe 2 XS"),
        ("pipe 2 Sch. 40", "Pipe 2 Std"),
        ("2 xxs pipe", "Pipe 2 XXS"),
        ("HSS4x4x1/4", "HSS4x4x1/4"),
        ("HSS 4 x 4 x 0.25", "HSS4x4x1/4"),
        ("hss6X4x.25", "HSS6x4x1/4"),
        ("HSS 3-1/2 x 3-1/2 x 1/4", "HSS3-1/2x3-1/2x1/4"),
        ("HSS6.625x0.280", "HSS6.625x0.280"),
        ("hss 6.625 x .28", "HSS6.625x0.280"),
        ("L3x3x1/4", "L3x3x1/4"),
        ("l 3 x 3 x 0.25", "L3x3x1/4"),
        ("L2x3x1/4", "L3x2x1/4"),
        ("C6x8.2", "C6x8.2"),
        ("c 6 × 8.2", "C6x8.2"),
        ("MC6x12", "MC6x12"),
        ("w 8 x 31", "W8x31"),
        ("EMT 1-1/4", "EMT 1-1/4"),
        ("emt 1.25", "EMT 1-1/4"),
        ("1-1/4 EMT", "EMT 1-1/4"),
        ("FB3x1/4", "FB3x1/4"),
        ("fb 1/4 x 3", "FB3x1/4"),
    ],
)
def test_forgiving_lookup(text, canonical):
    assert get_section(text).name == canonical


def test_flat_bar_outside_stock_list_is_built():
    s = get_section("PL 1/2 x 7")
    assert s.name == "FB7x1/2" and s.props.A == pytest.approx(3.5)


@pytest.mark.parametrize(
    ("text", "suggestion"),
    [("HSS4x4x0.3", "HSS4x4x5/16"), ("Pipe 7 Std", "Pipe 6 Std"), ("W8x32", "W8x31"), ("C6x8.3", "C6x8.2"),
     ("pipe 2", "Pipe 2 Std"), ("HSS4x4x1/4x2", "HSS4x4x1/4"), ("Pipe 2 Stnd", "Pipe 2 Std")],
)
def test_unknown_designation_suggests(text, suggestion):
    with pytest.raises(InputError) as info:
        get_section(text)
    msg = str(info.value)
    assert "section designation" in msg and repr(text) in msg and "did you mean" in msg and suggestion in msg


@pytest.mark.parametrize("bad", ["", "   ", "xyz", None, 12])
def test_garbage_designation_is_input_error(bad):
    with pytest.raises(InputError, match="section designation"):
        get_section(bad)


def test_wall_option():
    design = get_section("HSS4x4x1/4")
    nominal = get_section("HSS4x4x1/4", wall="nominal")
    # AISC 360-16 B4.2: design wall 0.93 x nominal, tabulated to 3 decimals (AISC Shapes Database v16.0: 0.233 in)
    assert design.t == pytest.approx(ERW_DESIGN_WALL_FACTOR * 0.25, abs=6e-4)
    assert design.t == 0.233
    assert nominal.t == pytest.approx(0.25)
    # weight from the nominal wall in both: the table's 12.21 lb/ft and ours computed from 1/4 in
    assert design.props.weight == pytest.approx(nominal.props.weight, rel=0.01)
    assert get_section("EMT 1").t == pytest.approx(0.057)  # EMT: nominal wall always
    with pytest.raises(InputError, match="wall"):
        get_section("HSS4x4x1/4", wall="thick")


def test_entry_carries_source():
    e = get_entry("Pipe 2 Std")
    assert "AISC Shapes Database v16.0" in e.source and e.published
    assert "C80.3" in get_entry("EMT 2").source and not get_entry("EMT 2").published
    assert "AISC Shapes Database v16.0" in get_entry("HSS4x4x1/4").source
    assert get_section("HSS4x4x1/4").props.source == e.source


def test_families_listed():
    for fam in FAMILIES:
        assert designations(fam), fam
    assert "HSS6x4x1/4" in designations("hss_rect") and "HSS6x4x1/4" not in designations("hss_square")
    assert set(designations("hss")) == set(designations("hss_square")) | set(designations("hss_rect"))
    with pytest.raises(InputError, match="did you mean 'hss_square'"):
        designations("hss_sqare")


def test_find_sorted_by_weight_with_limits():
    df = find_sections("hss_square", min={"Ix": "5 in^4"}, max={"b/t": 30})
    assert len(df) > 5
    assert (df["Ix"] >= 5.0).all() and (df["b/t"] <= 30).all()
    assert list(df["weight"]) == sorted(df["weight"])
    lightest = df.iloc[0]
    # nothing lighter in the family satisfies the limits
    table = section_table("hss_square")
    lighter = table[(table["weight"] < lightest["weight"]) & (table["Ix"] >= 5.0) & (table["b/t"] <= 30)]
    assert lighter.empty
    mm = find_sections("pipe", min={"Sx": "20000 mm^3"})
    assert (mm["Sx"] >= 20000 / 25.4**3 - 1e-12).all()


def test_find_bad_inputs():
    with pytest.raises(InputError, match="property 'Q'"):
        find_sections("angle", min={"Q": 1})
    with pytest.raises(InputError, match="sort_by"):
        find_sections("angle", sort_by="price")
    with pytest.raises(InputError, match="limit on Ix"):
        find_sections("angle", min={"Ix": "3 ksi"})
