"""Member check runner: limit states chosen from the forces, governing ratio named.

Expected ratios are the individual checks' own ratios (computed by the single-check functions,
themselves tested against AISC tables in the other test files) and H1-1a by hand.
"""

from __future__ import annotations

import pytest

from calcpad import Sheet
from calcpad.core.results import TableResult
from calcpad.eng.checks import check_member
from calcpad.eng.sections import get_section


def test_compression_flexure_shear_interaction():
    sh = Sheet("post", method="LRFD")
    out = check_member(sh, get_section("HSS6x6x1/4"), F_y="50 ksi", L="12 ft", P="40 kip", M_x="10 kip*ft", V="3 kip")
    assert set(out.keys) == {"compression", "flexure x", "shear", "interaction"}
    checks = {c.key: c for c in sh.summary()}
    pc, mc = sh["P_c"].to("kip").magnitude, sh["M_c"].to("kip*ft").magnitude
    u = 40 / pc + 8 / 9 * 10 / mc if 40 / pc >= 0.2 else 40 / (2 * pc) + 10 / mc
    assert checks[out.keys["interaction"]].ratio == pytest.approx(u, rel=1e-12)
    assert out.governing == max(out.keys, key=lambda k: checks[out.keys[k]].ratio)
    assert sh[out.max_name].magnitude == pytest.approx(out.governing_ratio, rel=1e-12)
    tables = [r for r in sh.evaluate().steps if isinstance(r, TableResult)]
    assert len(tables) == 1 and len(tables[0].rows) == 4


def test_negative_axial_is_tension():
    sh = Sheet("hanger")
    out = check_member(sh, get_section("HSS4x4x1/4"), material="ASTM A500 Gr. C (square/rectangular)", L="6 ft", P="-30 kip",
                       M_x="2 kip*ft")
    assert "tension" in out.keys and "compression" not in out.keys
    assert sh["T_r"].to("kip").magnitude == pytest.approx(30.0)


def test_governing_line_stays_live_under_set():
    sh = Sheet("live")
    out = check_member(sh, get_section("HSS4x4x1/4"), F_y="46 ksi", L="8 ft", P="5 kip", M_x="1 kip*ft")
    before = sh[out.max_name].magnitude
    sh.set(M_r="6 kip*ft")
    assert sh[out.max_name].magnitude > before


def test_two_members_need_suffixes():
    sh = Sheet("two")
    check_member(sh, get_section("HSS4x4x1/4"), F_y="46 ksi", L="8 ft", P="5 kip", suffix="A")
    out = check_member(sh, get_section("HSS6x6x1/4"), F_y="46 ksi", L="8 ft", P="5 kip", suffix="B")
    assert sh["P_c_B"].to("kip").magnitude > sh["P_c_A"].to("kip").magnitude
    assert out.keys["compression"] == "ratio_c_B"


@pytest.mark.parametrize(
    ("designation", "extra"),
    [("W8x31", {"M_y": "1 kip*ft"}), ("C6x8.2", {"M_y": "0.1 kip*ft"}), ("WT4x9", {"stem": "tension"}),
     ("HSS6x4x1/4", {"M_y": "1 kip*ft", "T": "1 kip*ft"}), ("HSS6.625x0.280", {"T": "1 kip*ft"}), ("Pipe 2 Std", {}),
     ("W8x31", {"P": "-10 kip", "F_u": "65 ksi", "M_y": "1 kip*ft"})],
)
@pytest.mark.parametrize("suffix", ["", "m2"])
def test_every_family_with_every_force_on_one_sheet(designation, extra, suffix):
    # The limit states of one member share a sheet: no name may be written twice with another meaning
    # (found: C_w of a W-shape is needed by both E4-2 and F2, and is now written once).
    import warnings

    from calcpad.eng.checks import CheckWarning, check_member
    from calcpad.eng.sections import get_section

    args = {"P": "10 kip", "M_x": "3 kip*ft", "V": "1 kip", "L": "10 ft", "F_y": "50 ksi", "F_u": "65 ksi"} | extra
    sh = Sheet("all forces", method="LRFD")
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", CheckWarning)
        out = check_member(sh, get_section(designation), suffix=suffix, **args)
    ratios = {c.key: c.ratio for c in sh.evaluate().checks}
    assert set(out.keys.values()) <= set(ratios)
    assert out.governing_ratio == pytest.approx(max(ratios[k] for k in out.keys.values()))


def test_named_axial_force_at_zero_keeps_compression_and_interaction_live():
    """A sheet built with P = 0 (a named value) still carries compression and H1 so sh.set can raise
    P; at P = 0, H1-1b gives M_r/M_c (AISC 360-16 Eq. H1-1b)."""
    sh = Sheet("post", method="ASD")
    sh.given("P_top", "0 kip")
    out = check_member(sh, get_section("HSS4x4x1/4"), F_y="50 ksi", L="11 ft", K=2.1, P="P_top", M_x="5 kip*ft", V="0.45 kip")
    assert {"compression", "interaction"} <= set(out.keys)
    checks = {c.key: c for c in sh.summary()}
    assert checks[out.keys["interaction"]].ratio == pytest.approx(5 / sh["M_c"].to("kip*ft").magnitude, rel=1e-12)
    sh.set(P_top="6 kip")
    checks = {c.key: c for c in sh.summary()}
    pc, mc = sh["P_c"].to("kip").magnitude, sh["M_c"].to("kip*ft").magnitude
    u = 6 / pc + 8 / 9 * 5 / mc if 6 / pc >= 0.2 else 6 / (2 * pc) + 5 / mc
    assert checks[out.keys["interaction"]].ratio == pytest.approx(u, rel=1e-12)
