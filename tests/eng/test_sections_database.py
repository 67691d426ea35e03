"""Catalog shapes against the AISC Shapes Database shipped in the registry package ``aiscpy``.

Source: ``shapes_AISC.db`` (SQLite) inside aiscpy 0.1.5 (GPL-3.0; a dev/test dependency read
with sqlite3 only, never at run time). Its edition is not stated in the package; the column
layout (``Qs(36)`` for angles, ``Qs(50)`` for tees, one ``Sz`` and no w-axis properties for
angles) is that of the v14 database (AISC Manual 14th ed.), so it is cited as "AISC Shapes
Database (v14 layout, edition not confirmed)". Values are compared as printed there (3
significant figures): tolerance half a unit of the third figure plus the named allowance of
tests/eng/test_sections_catalog.py for what our closed-form model does differently.

Findings (measured on this branch, recorded as strict xfails so a fix shows up as XPASS):
* J of open shapes is below the database by 5-19 % (thin-wall sum(b t^3/3), fillets neglected):
  W -4.9..-17.3 %, C/MC -9.7..-19.2 %, L -0.0..-13.9 %, WT -5.4..-17.7 %. Lower J is on the safe
  side for F2/F9 lateral-torsional buckling and E4 torsional buckling; it is a catalog modelling
  issue (the catalog rework is a later issue). test_open_shape_j_not_above_database pins the sign.
* Z of some light angles exceeds the rolled-shape allowance (legs as rectangles): up to +3.4 %
  (L4x4x1/4 Z_x, L5x3x1/4 Z_y); L3x2-1/2x5/16 A is -2.9 %; channel I_y is +2.6..+3.9 % (C3, C5)
  and +8.4..+10.0 % (MC6, flange slope modelled as 0).
"""

from __future__ import annotations

import importlib.resources
import math
import sqlite3

import pytest

from calcpad.eng.checks._section import resolve_section
from calcpad.eng.sections import designations, get_section

aiscpy = pytest.importorskip("aiscpy", reason="dev dependency aiscpy (AISC Shapes Database) not installed")

DESIGN_WALL_ALLOWANCE = 0.005  # HSS: design wall 0.93 t rounded to 3 decimals in the database
ROLLED_ALLOWANCE = 0.025  # angles and channels without fillets
W_ALLOWANCE = 0.01  # W with the k_des fillet modelled
WT_ALLOWANCE = 0.03  # WT cut from our W rows


def _db() -> sqlite3.Connection:
    return sqlite3.connect(str(importlib.resources.files("aiscpy") / "shapes_AISC.db"))


TABLES = {"hss_rect": "HSS_shapes_AISC", "hss_square": "HSS_shapes_AISC", "hss_round": "HSS-Pipe_shapes_AISC",
          "w": "W-M-S-HP_shapes_AISC", "channel": "C-MC_shapes_AISC", "angle": "L_shapes_AISC", "wt": "WT-MT-ST_shapes_AISC"}


def _rows(family: str) -> dict[str, dict[str, float]]:
    """Database rows of the catalog designations of ``family`` (those the database has)."""
    out = {}
    with _db() as con:
        for name in designations(family):
            cur = con.execute(f'select * from "{TABLES[family]}" where upper(Shape) = ?', (name.upper(),))
            row = cur.fetchone()
            if row is not None:
                out[name] = dict(zip([d[0] for d in cur.description], row, strict=True))
    return out


def _close(ours: float, printed: float, allowance: float) -> bool:
    tol = 0.5 * 10.0 ** (math.floor(math.log10(abs(printed))) - 2) + allowance * abs(printed)
    return abs(ours - printed) <= tol


def _mismatches(family: str, pairs: dict[str, str], allowance: float) -> list[str]:
    """``pairs``: our property name -> database column. Returns the disagreements as text."""
    bad = []
    rows = _rows(family)
    assert rows, f"no {family} designation found in the database"
    for name, row in rows.items():
        p = get_section(name).props
        for ours, col in pairs.items():
            val = row.get(col)
            if val in (None, "", 0):
                continue
            got = getattr(p, ours)
            if not _close(got, float(val), allowance):
                bad.append(f"{name} {ours}: {got:.4g} vs {float(val):g} ({(got / float(val) - 1) * 100:+.1f} %)")
    return bad


@pytest.mark.parametrize("family", ["hss_square", "hss_rect"])
def test_rect_hss_properties_and_torsion_constant(family):
    pairs = {"A": "A", "Ix": "Ix", "Iy": "Iy", "Zx": "Zx", "Zy": "Zy", "J": "J"}
    assert _mismatches(family, pairs, DESIGN_WALL_ALLOWANCE) == []


def test_round_hss_properties_and_torsion_constant():
    assert _mismatches("hss_round", {"A": "A", "Ix": "I", "Zx": "Z", "J": "J"}, DESIGN_WALL_ALLOWANCE) == []


def test_w_shape_properties():
    assert _mismatches("w", {"A": "A", "Ix": "Ix", "Iy": "Iy", "Zx": "Zx", "Zy": "Zy"}, W_ALLOWANCE) == []


def test_channel_properties():
    assert _mismatches("channel", {"A": "A", "Ix": "Ix", "Zx": "Zx"}, ROLLED_ALLOWANCE) == []


@pytest.mark.xfail(strict=True, reason="finding: channel Iy above the database by +2.6..+3.9 % (C3, C5) and +8.4..+10.0 % "
                   "(MC6, flange slope modelled as 0), beyond the 2.5 % rolled allowance")
def test_channel_minor_axis_inertia():
    assert _mismatches("channel", {"Iy": "Iy"}, ROLLED_ALLOWANCE) == []


def test_channel_warping_constant_and_shear_centre():
    # database Cw and x(bar) + eo (centroid to shear centre) against what the checks read (thin-wall, AISC Design Guide 9)
    bad = []
    for name, row in _rows("channel").items():
        v = resolve_section(get_section(name), None).values
        if not _close(v["Cw"], float(row["Cw"]), ROLLED_ALLOWANCE):
            bad.append(f"{name} Cw {v['Cw']:.4g} vs {row['Cw']}")
        if not _close(v["x_o"], float(row["x(bar)"]) + float(row["eo"]), ROLLED_ALLOWANCE):
            bad.append(f"{name} x_o {v['x_o']:.4g} vs {float(row['x(bar)']) + float(row['eo']):.4g}")
    assert bad == []


@pytest.mark.xfail(strict=True, reason="finding: angles modelled without fillets; Z above the database by up to +3.4 % "
                   "(L4x4x1/4 Zx 1.883 vs 1.82, L5x3x1/4 Zy 1.086 vs 1.05), beyond the 2.5 % rolled allowance")
def test_angle_plastic_moduli():
    assert _mismatches("angle", {"Zx": "Zx", "Zy": "Zy"}, ROLLED_ALLOWANCE) == []


def test_angle_inertias():
    assert _mismatches("angle", {"Ix": "Ix", "Iy": "Iy"}, ROLLED_ALLOWANCE) == []


@pytest.mark.xfail(strict=True, reason="finding: L3x2-1/2x5/16 area 1.621 vs 1.67 in^2 (-2.9 %, fillets neglected), beyond the "
                   "2.5 % rolled allowance; every other angle area is within it")
def test_angle_areas():
    assert _mismatches("angle", {"A": "A"}, ROLLED_ALLOWANCE) == []


@pytest.mark.parametrize(
    ("family", "allowance", "measured"),
    [("w", W_ALLOWANCE, "-4.9..-17.3 %"), ("channel", ROLLED_ALLOWANCE, "-9.7..-19.2 %"), ("angle", ROLLED_ALLOWANCE, "-0.0..-13.9 %"),
     ("wt", WT_ALLOWANCE, "-5.4..-17.7 %")],
)
@pytest.mark.xfail(strict=True, reason="finding: J of open shapes is the thin-wall sum(b t^3/3) without fillets, below the "
                   "database (measured per family in the parameters); catalog rework issue")
def test_open_shape_torsion_constant_matches_database(family, allowance, measured):
    assert _mismatches(family, {"J": "J"}, allowance) == [], measured


@pytest.mark.parametrize("family", ["w", "channel", "angle", "wt"])
def test_open_shape_j_not_above_database(family):
    # the direction of the finding above: ours is never above the published J (the safe side for LTB and E4),
    # and not below it by more than 20 %
    for name, row in _rows(family).items():
        ours, pub = get_section(name).props.J, float(row["J"])
        assert 0.80 * pub <= ours <= pub * (1 + 0.005), f"{name}: J {ours:.4g} vs {pub:g}"
