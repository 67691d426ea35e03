"""The shop's own section table (calcpad/eng/sections/shop.py): validation, lookup and the sheet note.

Reference values: AISC Steel Construction Manual, 15th ed., Table 1-7 (angles), L3x3x1/4:
A = 1.44 in^2, 4.9 lb/ft; Table 1-5 (channels), C6x8.2: A = 2.39 in^2, d = 6.00 in,
bf = 1.92 in, tf = 0.343 in, tw = 0.200 in (from memory). The shop sizes are invented rows with
the dimensions of those published sections, so their stated area and weight are the Manual's.
Digests are computed here with hashlib over the bytes written.
"""

from __future__ import annotations

import hashlib

import pytest

from calcpad.core.sheet import Sheet
from calcpad.eng.checks import add_compression_check
from calcpad.eng.sections import get_section
from calcpad.eng.sections.rolled import RolledAngle, RolledChannel
from calcpad.eng.sections.shop import (
    ENV_PATH,
    ENV_SHA256,
    ShopTableError,
    active_shop_table,
    load_shop_table,
    read_shop_table,
    shop_table_in_use,
    use_shop_table,
)

HEADER = "designation,family,d [in],b [in],t [in],bf [in],tf [in],tw [in],slope,A [in^2],weight [lb/ft]"
GOOD = f"""# source: Kestrel Yard Fabricators stock list, checked 2026-11-02 (invented for the tests)
{HEADER}
L3x3x1/4 KYF,angle,3,3,1/4,,,,,1.44,4.9
C6x8.2 KYF,channel,6.00,,,1.92,0.343,0.200,1/6,2.39,8.2
"""


@pytest.fixture(autouse=True)
def _no_table(monkeypatch):
    previous = use_shop_table(None)
    monkeypatch.delenv(ENV_PATH, raising=False)
    monkeypatch.delenv(ENV_SHA256, raising=False)
    yield
    use_shop_table(previous)


def _problems(text: str) -> list[tuple[str, str]]:
    with pytest.raises(ShopTableError) as exc:
        read_shop_table(text, "shop.csv")
    assert "nothing loaded" in str(exc.value)
    return exc.value.problems


def test_good_table_reads_rows_with_their_line_numbers_and_digest(tmp_path):
    f = tmp_path / "shop.csv"
    f.write_bytes(GOOD.encode("utf-8"))
    table = load_shop_table(f)
    assert table.sha256 == hashlib.sha256(GOOD.encode("utf-8")).hexdigest()
    assert [(r.designation, r.row) for r in table.rows] == [("L3x3x1/4 KYF", 3), ("C6x8.2 KYF", 4)]
    assert table.source_note.startswith("Kestrel Yard Fabricators")
    angle = table.get("l3X3x1/4  kyf").shape()
    assert isinstance(angle, RolledAngle)
    assert angle.props.A == pytest.approx(1.44, rel=0.02)  # Manual Table 1-7
    chan = table.get("C6x8.2 KYF").shape()
    assert isinstance(chan, RolledChannel)
    assert chan.props.A == pytest.approx(2.39, rel=0.02)  # Manual Table 1-5
    assert chan.props.weight == pytest.approx(8.2, rel=0.02)


def test_empty_spreadsheet_rows_are_skipped_and_rows_keep_their_line_numbers():
    table = read_shop_table(GOOD.replace("\nC6x8.2", "\n,,,,,,,,,,\nC6x8.2"))
    assert [r.row for r in table.rows] == [3, 5]


def test_cells_with_their_own_unit_are_converted():
    text = GOOD.replace("L3x3x1/4 KYF,angle,3,3,1/4,", "L3x3x1/4 KYF,angle,76.2 mm,3,6.35 mm,")
    table = read_shop_table(text)
    assert table.get("L3x3x1/4 KYF").values["t"] == pytest.approx(0.25)


def test_missing_column_is_reported_on_each_row_that_needs_it():
    text = GOOD.replace(",t [in]", "").replace("3,3,1/4,", "3,3,").replace("6.00,,,1.92", "6.00,,1.92")
    problems = _problems(text)
    assert ("row 3", "family 'angle' needs column 't', which the header lacks (add 't [in]')") in problems
    assert [loc for loc, _ in problems] == ["row 3"]


def test_missing_area_column_is_reported_at_the_header_row():
    text = GOOD.replace(",A [in^2]", "")
    problems = _problems(text)
    assert any(loc == "row 2" and "missing column 'A'" in msg for loc, msg in problems)


def test_negative_thickness_is_reported_with_its_row():
    problems = _problems(GOOD.replace("0.343", "-0.343"))
    assert problems == [("row 4", "tf: '-0.343' is negative; expected a positive thickness")]


def test_non_numeric_cell_is_reported_with_its_row():
    problems = _problems(GOOD.replace("3,3,1/4", "3,three,1/4"))
    assert len(problems) == 1
    loc, msg = problems[0]
    assert loc == "row 3" and msg.startswith("b: 'three' is not a number")


def test_duplicate_designation_is_reported_with_both_rows():
    text = GOOD + "l3X3X1/4  kyf,angle,3,3,1/4,,,,,1.44,4.9\n"
    problems = _problems(text)
    assert problems == [("row 5", "designation 'l3X3X1/4  kyf' repeats row 3")]


def test_every_problem_is_listed_at_once_and_nothing_is_loaded(tmp_path):
    text = GOOD.replace("0.343", "-0.343").replace("3,3,1/4", "3,three,1/4") + "L3x3x1/4 KYF,angle,3,3,1/4,,,,,1.44,4.9\n"
    problems = _problems(text)
    assert sorted({loc for loc, _ in problems}) == ["row 3", "row 4", "row 5"]
    assert active_shop_table() is None
    with pytest.raises(Exception, match="not in the catalog"):
        get_section("C6x8.2 KYF")


def test_catalog_names_cannot_be_shop_rows():
    problems = _problems(GOOD.replace("L3x3x1/4 KYF", "L3x3x1/4"))
    assert len(problems) == 1 and problems[0][0] == "row 3" and "names the catalog section 'L3x3x1/4'" in problems[0][1]


def test_area_and_weight_must_agree_with_the_dimensions():
    problems = _problems(GOOD.replace("1.44,4.9", "1.60,5.9"))
    assert [loc for loc, _ in problems] == ["row 3", "row 3"]
    assert "A = 1.6 in^2 differs" in problems[0][1] and "(allowed ±2 %)" in problems[0][1]
    assert "weight = 5.9 lb/ft differs" in problems[1][1]


def test_header_units_are_checked():
    problems = _problems(GOOD.replace("A [in^2]", "A [in]"))
    assert problems == [("row 2, column 10", "unit [in] of 'A' is not an area unit; expected e.g. [in^2]")]
    problems = _problems(GOOD.replace("t [in]", "t"))
    assert problems[0][0] == "row 2, column 5" and "has no unit" in problems[0][1]


def test_unknown_family_and_unused_cells_are_refused():
    problems = _problems(GOOD.replace(",angle,", ",angel,"))
    assert problems == [("row 3", "family 'angel'; did you mean 'angle'? (expected one of angle, channel, w, hss_rect, hss_round, "
                                  "flat_bar)")]
    problems = _problems(GOOD.replace("3,3,1/4,,,,", "3,3,1/4,,,0.2,"))
    assert problems[0][0] == "row 3" and "tw = '0.2' is not used for family 'angle'" in problems[0][1]


def test_lookup_in_use_and_the_note_on_the_sheet():
    table = read_shop_table(GOOD, "kyf_sections.csv")
    with shop_table_in_use(table):
        shape = get_section("L3x3x1/4 KYF")
        sh = Sheet("Brace")
        add_compression_check(sh, shape, P="2 kip", L="4 ft", material="ASTM A36", connected_leg="long")
        notes = [s.text for s in sh.steps if getattr(s, "kind", None) == "note" and "shop table" in s.text]
        assert notes == [f"Section L3x3x1/4 KYF: from shop table kyf_sections.csv, row 3 (sha256 {table.sha256[:12]}); the "
                         "shop's own data, not a published table: computed from the row's dimensions."]
        assert get_section("L3x3x1/4").name == "L3x3x1/4"  # the catalog is still there
    with pytest.raises(Exception, match="not in the catalog"):
        get_section("L3x3x1/4 KYF")


def test_a_kernel_reads_the_table_named_by_the_environment_and_checks_its_digest(tmp_path, monkeypatch):
    f = tmp_path / "shop.csv"
    f.write_text(GOOD, encoding="utf-8")
    monkeypatch.setenv(ENV_PATH, str(f))
    monkeypatch.setenv(ENV_SHA256, hashlib.sha256(f.read_bytes()).hexdigest())
    assert get_section("C6x8.2 KYF").name == "C6x8.2 KYF"
    monkeypatch.setenv(ENV_SHA256, "0" * 64)
    with pytest.raises(ShopTableError, match="changed since the job was read"):
        get_section("C6x8.2 KYF")


def test_a_shop_channel_of_a_catalog_series_takes_the_series_outline():
    # C6x8.2's dimensions (AISC Shapes Database v16.0: d 6.00, bf 1.92, tf 0.343, tw 0.200; A 2.39 in^2,
    # J 0.0736 in^4, I_y 0.687 in^4): a row that gives no slope is modelled as the C6 series (1:6 flanges,
    # its radii), so its J and I_y land on the table's; a row that states a slope keeps it
    rows = f"""# source: Kestrel Yard Fabricators stock list (invented for the tests)
{HEADER}
C6 KYF plain,channel,6.00,,,1.92,0.343,0.200,,2.39,8.2
C6 KYF flat,channel,6.00,,,1.92,0.343,0.200,0,2.39,8.2
"""
    table = read_shop_table(rows, "kyf_channels.csv")
    with shop_table_in_use(table):
        plain, flat = get_section("C6 KYF plain"), get_section("C6 KYF flat")
        assert plain.slope == pytest.approx(1 / 6) and flat.slope == 0.0
        assert plain.props.J == pytest.approx(0.0736, rel=0.01)
        assert plain.props.Iy == pytest.approx(0.687, rel=0.01)
        assert abs(flat.props.Iy / 0.687 - 1) > 0.02  # parallel flanges put more steel at the toes
