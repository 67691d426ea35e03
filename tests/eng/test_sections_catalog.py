"""Catalog sizes checked against published table values.

Expected values are written as the tables print them (strings), so the tolerance is half a unit
in the last printed digit plus a named allowance. The allowances date from when the catalog
computed its properties from idealised geometry; catalog rows now carry the published AISC
Shapes Database v16.0 values (compared row by row in tests/eng/test_sections_database.py), so
these recalled-table checks hold with room to spare:

* NOMINAL_PIPE_ALLOWANCE (0.1 %): the old pipe table uses the nominal walls exactly (compared
  with ``wall="nominal"``, which computes from the dimensions).
* DESIGN_WALL_ALLOWANCE (0.5 %): HSS tables with the design wall.
* ROLLED_ALLOWANCE (2.5 %): angles and channels.
* W_ALLOWANCE (1 %): W-shapes.
* WT_ALLOWANCE (3 %): kept from when WTs were cut from our W rows; the WT rows are now the
  published Table 1-8 values (tests/eng/test_sections_database.py compares every row).
* WT_ORACLE_REL_TOL (0.1 %): the drawn WT geometry (``CatalogEntry.geometry()``) against sectionproperties (mesh; fillets as polygons of
  WT_ORACLE_NR points), which agrees to about 0.003 % here, so the tolerance has ample margin.

Sources (beside each table below) are recalled from memory; a value we were unsure of was left out.
Z of HSS6.625x0.280 and HSS4.500x0.237 were recalled as 10.7 and 4.00 in^3; they disagree with the
closed form (10.55, 4.04) by more than the table rounding. They are kept below as strict xfails
(test_round_hss_z_recalled) and checked against the AISC Shapes Database copy shipped in aiscpy
(Z = 10.5 and 4.03 in^3, which agree with ours; test_round_hss_z_shapes_database), so the recalled
values look misremembered. More database comparisons: tests/eng/test_sections_database.py.
"""

from __future__ import annotations

import re

import pytest

from calcpad.core.errors import InputError
from calcpad.eng.sections import Tee, designations, find_sections, get_entry, get_section, section_table

NOMINAL_PIPE_ALLOWANCE = 1e-3
DESIGN_WALL_ALLOWANCE = 0.005
ROLLED_ALLOWANCE = 0.025
W_ALLOWANCE = 0.01
WT_ALLOWANCE = 0.03
WT_ORACLE_REL_TOL = 1e-3
WT_ORACLE_NR = 32


def _check(value: float, printed: str, allowance: float) -> None:
    decimals = len(printed.split(".")[1]) if "." in printed else 0
    expected = float(printed)
    tol = 0.5 * 10.0**-decimals + allowance * abs(expected)
    assert abs(value - expected) <= tol, f"calc {value:.5g} vs table {printed} (tol {tol:.3g})"


# AISC Manual of Steel Construction, ASD 9th ed. (1989), Part 1 "Pipe - dimensions and properties"
# (nominal wall, ASME B36.10 dimensions), from memory.
PIPE_9TH = {
    "Pipe 1/2 Std": {"A": "0.250", "Ix": "0.017", "Sx": "0.041", "rx": "0.261", "weight": "0.85"},
    "Pipe 3/4 Std": {"A": "0.333", "Ix": "0.037", "Sx": "0.071", "rx": "0.334", "weight": "1.13"},
    "Pipe 1 Std": {"A": "0.494", "Ix": "0.087", "Sx": "0.133", "rx": "0.421", "weight": "1.68"},
    "Pipe 1-1/4 Std": {"A": "0.669", "Ix": "0.195", "Sx": "0.235", "rx": "0.540", "weight": "2.27"},
    "Pipe 1-1/2 Std": {"A": "0.799", "Ix": "0.310", "Sx": "0.326", "rx": "0.623", "weight": "2.72"},
    "Pipe 2 Std": {"A": "1.07", "Ix": "0.666", "Sx": "0.561", "rx": "0.787", "weight": "3.65"},
    "Pipe 2-1/2 Std": {"A": "1.70", "Ix": "1.53", "Sx": "1.06", "rx": "0.947", "weight": "5.79"},
    "Pipe 3 Std": {"A": "2.23", "Ix": "3.02", "Sx": "1.72", "rx": "1.16", "weight": "7.58"},
    "Pipe 3-1/2 Std": {"A": "2.68", "Ix": "4.79", "Sx": "2.39", "rx": "1.34", "weight": "9.11"},
    "Pipe 4 Std": {"A": "3.17", "Ix": "7.23", "Sx": "3.21", "rx": "1.51", "weight": "10.79"},
    "Pipe 5 Std": {"A": "4.30", "Ix": "15.2", "Sx": "5.45", "rx": "1.88", "weight": "14.62"},
    "Pipe 6 Std": {"A": "5.58", "Ix": "28.1", "Sx": "8.50", "rx": "2.25", "weight": "18.97"},
    "Pipe 2 XS": {"A": "1.48", "Ix": "0.868", "Sx": "0.731", "rx": "0.766", "weight": "5.02"},
    "Pipe 3 XS": {"A": "3.02", "Ix": "3.89", "Sx": "2.23", "rx": "1.14", "weight": "10.25"},
    "Pipe 4 XS": {"A": "4.41", "Ix": "9.61", "Sx": "4.27", "rx": "1.48", "weight": "14.98"},
    "Pipe 6 XS": {"A": "8.40", "Ix": "40.5", "Sx": "12.2", "rx": "2.19", "weight": "28.57"},
    "Pipe 2 XXS": {"A": "2.66", "Ix": "1.31", "Sx": "1.10", "rx": "0.703", "weight": "9.03"},
    "Pipe 4 XXS": {"A": "8.10", "Ix": "15.3", "Sx": "6.79", "rx": "1.37", "weight": "27.54"},
}

# AISC Steel Construction Manual, 15th ed., Tables 1-11 (rectangular HSS), 1-12 (square HSS) and
# 1-13 (round HSS), design wall 0.93 x nominal, from memory.
HSS_15TH = {
    "HSS4x4x1/4": {
        "A": "3.37",
        "Ix": "7.80",
        "Sx": "3.90",
        "rx": "1.52",
        "Zx": "4.69",
        "J": "12.8",
        "C": "6.56",
        "weight": "12.21",
        "b/t": "14.2",
    },
    "HSS4x4x3/16": {"A": "2.58", "Ix": "6.21", "Sx": "3.10", "rx": "1.55", "Zx": "3.67", "weight": "9.42"},
    "HSS6x6x1/4": {"A": "5.24", "Ix": "28.6", "Sx": "9.54", "rx": "2.34", "Zx": "11.2", "weight": "19.02"},
    "HSS4x4x1/2": {"A": "6.02", "Ix": "11.9", "Sx": "5.97", "rx": "1.41", "Zx": "7.70", "weight": "21.63"},
    "HSS6x4x1/4": {
        "A": "4.30",
        "Ix": "20.9",
        "Sx": "6.96",
        "rx": "2.20",
        "Zx": "8.53",
        "Iy": "11.1",
        "Sy": "5.56",
        "ry": "1.61",
        "Zy": "6.45",
        "weight": "15.62",
    },
    "HSS8x4x1/4": {"A": "5.24", "Ix": "42.5", "Sx": "10.6", "rx": "2.85", "Iy": "14.4", "Sy": "7.21", "ry": "1.66"},
    "HSS6.625x0.280": {"A": "5.22", "Ix": "26.4", "Sx": "7.99", "rx": "2.25", "D/t": "25.4"},
    "HSS4.500x0.237": {"A": "2.96", "Ix": "6.79", "Sx": "3.02", "rx": "1.51"},
    "HSS2.375x0.154": {"A": "1.00", "Ix": "0.627", "Sx": "0.528", "rx": "0.791", "Zx": "0.713"},
}

# AISC Steel Construction Manual, 15th ed., Table 1-7 (angles), from memory. x-axis values with
# the long leg vertical; yc = y-bar from the back of the horizontal leg; r_min = r_z.
ANGLES_15TH = {
    "L3x3x1/4": {"A": "1.44", "Ix": "1.24", "Sx": "0.577", "rx": "0.930", "yc": "0.842", "r_min": "0.590"},
    "L4x4x1/4": {"A": "1.93", "Ix": "3.00", "Sx": "1.03", "rx": "1.25", "yc": "1.08", "r_min": "0.795"},
    "L4x4x3/8": {"A": "2.86", "Ix": "4.32", "Sx": "1.50", "rx": "1.23", "yc": "1.13", "r_min": "0.781"},
    "L4x4x1/2": {"A": "3.75", "Ix": "5.52", "Sx": "1.96", "rx": "1.21", "yc": "1.18", "r_min": "0.776"},
    "L2x2x1/4": {"A": "0.938", "Ix": "0.346", "Sx": "0.244", "rx": "0.605", "yc": "0.586", "r_min": "0.391"},
    "L3x2x1/4": {
        "A": "1.19",
        "Ix": "1.09",
        "Sx": "0.542",
        "rx": "0.953",
        "yc": "0.993",
        "Iy": "0.392",
        "Sy": "0.260",
        "ry": "0.574",
        "xc": "0.493",
        "r_min": "0.427",
    },
    "L6x6x1/2": {"A": "5.77", "Ix": "19.9", "Sx": "4.59", "rx": "1.86", "yc": "1.67"},
}

# AISC Steel Construction Manual, 15th ed., Table 1-5 (C shapes), from memory; xc = x-bar.
CHANNELS_15TH = {
    "C6x8.2": {"A": "2.39", "Ix": "13.1", "Sx": "4.35", "rx": "2.34", "Iy": "0.687", "ry": "0.536", "xc": "0.512"},
    "C8x11.5": {"A": "3.37", "Ix": "32.5", "Sx": "8.14", "rx": "3.11", "Iy": "1.31", "ry": "0.623", "xc": "0.571"},
    "C10x15.3": {"A": "4.48", "Ix": "67.3", "Sx": "13.5", "rx": "3.87", "Iy": "2.27", "ry": "0.711", "xc": "0.634"},
    "C12x20.7": {"A": "6.08", "Ix": "129", "Sx": "21.5", "rx": "4.61", "Iy": "3.86", "ry": "0.797", "xc": "0.698"},
    "C4x5.4": {"A": "1.58", "Ix": "3.85", "Sx": "1.93", "rx": "1.56", "Iy": "0.319", "ry": "0.449", "xc": "0.457"},
    "C3x4.1": {"A": "1.20", "Ix": "1.65", "Sx": "1.10", "rx": "1.17", "xc": "0.436"},
    "C5x6.7": {"A": "1.97", "Ix": "7.48", "Sx": "2.99", "rx": "1.95"},
}

# AISC Steel Construction Manual, 15th ed., Table 1-1 (W-shapes), from memory.
W_15TH = {
    "W8x31": {"A": "9.13", "Ix": "110", "Sx": "27.5", "rx": "3.47", "Zx": "30.4", "Iy": "37.1", "Sy": "9.27", "ry": "2.02", "Zy": "14.1"},
    "W6x15": {"A": "4.43", "Ix": "29.1", "Sx": "9.72", "rx": "2.56", "Iy": "9.32", "ry": "1.45", "Zx": "10.8"},
    "W12x26": {"A": "7.65", "Ix": "204", "Sx": "33.4", "rx": "5.17", "Zx": "37.2", "Iy": "17.3", "ry": "1.51"},
    "W10x12": {"A": "3.54", "Ix": "53.8", "Sx": "10.9", "Zx": "12.6", "Iy": "2.18"},
    "W8x10": {"A": "2.96", "Ix": "30.8", "Sx": "7.81", "Zx": "8.87", "Iy": "2.09"},
}


def _cases(table):
    return [(name, prop, printed) for name, d in table.items() for prop, printed in d.items()]


@pytest.mark.parametrize(("name", "prop", "printed"), _cases(PIPE_9TH))
def test_pipe_nominal_wall_against_aisc_9th(name, prop, printed):
    _check(get_section(name, wall="nominal").props.value(prop), printed, NOMINAL_PIPE_ALLOWANCE)


@pytest.mark.parametrize(("name", "prop", "printed"), _cases(HSS_15TH))
def test_hss_design_wall_against_aisc_15th(name, prop, printed):
    _check(get_section(name).props.value(prop), printed, DESIGN_WALL_ALLOWANCE)


@pytest.mark.parametrize(("name", "prop", "printed"), _cases(ANGLES_15TH))
def test_angles_against_aisc_15th(name, prop, printed):
    _check(get_section(name).props.value(prop), printed, ROLLED_ALLOWANCE)


@pytest.mark.parametrize(("name", "prop", "printed"), _cases(CHANNELS_15TH))
def test_channels_against_aisc_15th(name, prop, printed):
    _check(get_section(name).props.value(prop), printed, ROLLED_ALLOWANCE)


@pytest.mark.parametrize(("name", "prop", "printed"), _cases(W_15TH))
def test_w_shapes_against_aisc_15th(name, prop, printed):
    _check(get_section(name).props.value(prop), printed, W_ALLOWANCE)


def test_at_least_25_sizes_checked():
    sizes = {*PIPE_9TH, *HSS_15TH, *ANGLES_15TH, *CHANNELS_15TH}
    assert len(sizes) >= 25


@pytest.mark.parametrize(
    "name",
    [
        n
        for n in (
            "C3x4.1",
            "C4x5.4",
            "C5x6.7",
            "C6x8.2",
            "C6x10.5",
            "C6x13",
            "C7x9.8",
            "C8x11.5",
            "C8x13.75",
            "C10x15.3",
            "C12x20.7",
            "W4x13",
            "W6x9",
            "W6x15",
            "W8x10",
            "W8x18",
            "W8x31",
            "W10x12",
            "W12x26",
        )
    ],
)
def test_rolled_weight_matches_designation(name):
    # The number after the x in a C or W designation is the nominal weight in lb/ft (ASTM A6 /
    # AISC Manual naming, common practice). Fillets are not modelled in channels: allow 2.5 %.
    nominal = float(re.split("x", name, flags=re.I)[1])
    assert get_section(name).props.weight == pytest.approx(nominal, rel=ROLLED_ALLOWANCE)


# --------------------------------------------------------------------------- WT cut from W

# Each WT is the W cut at mid-depth: WT{nominal depth/2}x{weight/2} (AISC Manual naming, common practice).
WT_FROM_W = {
    "W8x18": "WT4x9", "W12x26": "WT6x13", "W8x31": "WT4x15.5", "W6x15": "WT3x7.5", "W10x12": "WT5x6",
    "W4x13": "WT2x6.5", "W6x9": "WT3x4.5", "W8x10": "WT4x5",
}

# AISC Steel Construction Manual, 15th ed., Table 1-8 (WT-shapes), from memory. y-bar is measured
# from the outside of the flange (our yc is measured from the stem tip, so y-bar = d - yc).
WT_15TH = {"WT4x9": {"A": "2.63", "Ix": "3.41", "ybar": "0.834"}}


def _wt_value(shape, prop):
    return shape.d - shape.props.yc if prop == "ybar" else shape.props.value(prop)


def test_wt_family_is_its_own_table():
    assert set(WT_FROM_W.values()) <= set(designations("WT"))
    assert set(designations("wt")) == {n for n in designations() if n.startswith("WT")}
    assert not any(n.startswith("WT") for n in designations("w"))
    assert "AISC Shapes Database v16.0" in get_entry("WT4x9").source


@pytest.mark.parametrize(("w_name", "wt_name"), list(WT_FROM_W.items()))
def test_wt_row_is_half_the_w_row(w_name, wt_name):
    # AISC Manual Table 1-8 WTs are the Table 1-1 Ws cut at mid-depth (common practice): the tabulated
    # bf, tf, tw are the W's, and d, A, Iy, Zy are halves to the printed 3 figures.
    w, wt = get_section(w_name), get_section(wt_name)
    assert isinstance(wt, Tee) and wt.name == wt_name
    assert (wt.bf, wt.tf, wt.tw) == (w.bf, w.tf, w.tw)
    for got, half in ((wt.d, w.d / 2), (wt.props.A, w.props.A / 2), (wt.props.Iy, w.props.Iy / 2), (wt.props.Zy, w.props.Zy / 2)):
        assert got == pytest.approx(half, rel=0.006)


@pytest.mark.parametrize("name", list(WT_FROM_W.values()))
def test_wt_weight_matches_designation(name):
    # The number after the x is the nominal weight in lb/ft (common practice); half the W, so the W
    # allowance of test_rolled_weight_matches_designation holds.
    nominal = float(name.split("x")[1])
    assert get_section(name).props.weight == pytest.approx(nominal, rel=ROLLED_ALLOWANCE)


@pytest.mark.parametrize(("name", "prop", "printed"), _cases(WT_15TH))
def test_wt_against_aisc_15th_table_1_8(name, prop, printed):
    _check(_wt_value(get_section(name), prop), printed, WT_ALLOWANCE)


@pytest.mark.parametrize("name", sorted(WT_FROM_W.values()))
def test_wt_against_sectionproperties(name):
    sp_lib = pytest.importorskip("sectionproperties.pre.library")
    sp_analysis = pytest.importorskip("sectionproperties.analysis")
    wt = get_entry(name).geometry()  # the drawn tee with computed properties
    p = wt.props
    # sectionproperties' tee: top-left corner at (0, d), flange on top, stem down to y = 0 -- our local frame.
    geom = sp_lib.tee_section(d=wt.d, b=wt.bf, t_f=wt.tf, t_w=wt.tw, r=wt.r, n_r=WT_ORACLE_NR)
    geom.create_mesh(mesh_sizes=[p.A / 400])
    sec = sp_analysis.Section(geom)
    sec.calculate_geometric_properties()
    sec.calculate_plastic_properties()
    cx, cy = sec.get_c()
    ixx, iyy, _ = sec.get_ic()
    zxx_top, zxx_bot, _, _ = sec.get_z()
    sxx, syy = sec.get_s()
    ours = {"A": p.A, "xc": p.xc, "yc": p.yc, "Ix": p.Ix, "Iy": p.Iy, "Sx_top": p.Sx_top, "Sx_bot": p.Sx_bot,
            "Zx": p.Zx, "Zy": p.Zy}
    oracle = {"A": sec.get_area(), "xc": cx, "yc": cy, "Ix": ixx, "Iy": iyy, "Sx_top": zxx_top, "Sx_bot": zxx_bot,
              "Zx": sxx, "Zy": syy}
    for k, v in ours.items():
        assert v == pytest.approx(oracle[k], rel=WT_ORACLE_REL_TOL), k
    # J is not compared: ours is the thin-wall sum of b*t**3/3, the oracle solves the warping problem.


@pytest.mark.parametrize(("text", "canonical", "kind"),
                         [("WT4x9", "WT4x9", Tee), ("wt 4 x 9", "WT4x9", Tee), ("WT 4 × 15.5", "WT4x15.5", Tee),
                          ("WT2x6.5", "WT2x6.5", Tee), ("W4x13", "W4x13", None), ("w 8 x 18", "W8x18", None)])
def test_wt_and_w_parse_apart(text, canonical, kind):
    s = get_section(text)
    assert s.name == canonical
    assert isinstance(s, Tee) if kind else not isinstance(s, Tee)


def test_wt_table_and_search():
    table = section_table("WT")
    assert set(table["designation"]) == set(designations("wt")) and len(table) > 250
    row = table[table["designation"] == "WT4x9"].iloc[0]
    assert row["A"] == pytest.approx(get_section("W8x18").props.A / 2, rel=0.006)
    found = find_sections("wt", min={"Ix": "3 in^4"})
    assert len(found) > 0 and (found["Ix"] >= 3.0).all()
    assert list(found["weight"]) == sorted(found["weight"])


@pytest.mark.parametrize(("text", "suggestion"), [("WT4x10", "WT4x9"), ("WT 6 x 12", "WT6x13"), ("WT4x15", "WT4x15.5")])
def test_unknown_wt_suggests(text, suggestion):
    with pytest.raises(InputError) as info:
        get_section(text)
    msg = str(info.value)
    assert "section designation" in msg and repr(text) in msg and "did you mean" in msg and suggestion in msg


# AISC Manual 15th ed. Table 1-13, recalled from memory: Z of two round HSS (design wall).
RECALLED_ROUND_Z = {"HSS6.625x0.280": "10.7", "HSS4.500x0.237": "4.00"}


@pytest.mark.xfail(strict=True, reason="recalled Z disagrees with ours by more than the table rounding: HSS6.625x0.280 "
                   "10.55 vs 10.7 (-1.4 %), HSS4.500x0.237 4.04 vs 4.00 (+1.0 %); the Shapes Database gives 10.5 and 4.03, "
                   "so the recalled values are the likely error (see test_round_hss_z_shapes_database)")
@pytest.mark.parametrize("name", sorted(RECALLED_ROUND_Z))
def test_round_hss_z_recalled(name):
    _check(get_section(name).props.Zx, RECALLED_ROUND_Z[name], DESIGN_WALL_ALLOWANCE)


@pytest.mark.parametrize(("name", "printed"), [("HSS6.625x0.280", "10.5"), ("HSS4.500x0.237", "4.03")])
def test_round_hss_z_shapes_database(name, printed):
    # AISC Shapes Database as shipped in aiscpy 0.1.5 (shapes_AISC.db; edition not confirmed, v14 column layout),
    # table HSS-Pipe, column Z; values typed here as printed there
    _check(get_section(name).props.Zx, printed, DESIGN_WALL_ALLOWANCE)
