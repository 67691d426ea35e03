"""Materials catalog against the standards' minimum specified values.

Sources (from memory): ASTM A36/A36M; ASTM A53/A53M Gr B; ASTM A500/A500M-18 Gr B and Gr C
(round vs shaped differ); ASTM A1085/A1085M; ASTM A572/A572M Gr 50; ASTM A992/A992M, as tabulated
in AISC Steel Construction Manual 15th ed. Tables 2-3 and 2-4; E = 29,000 ksi and G = 11,200 ksi
per AISC 360-16 (Symbols / Chapter E); ASTM A240 Type 304 annealed; Aluminum Design Manual 2020
Table A.3.4 for 6061-T6 and 6063-T6.
"""

from __future__ import annotations

import pytest

from calcpad.core.errors import InputError
from calcpad.eng.materials import define_material, get_material, hss_material, material_names, register_material
from calcpad.eng.sections import get_section

PUBLISHED = [
    ("A36", 36, 58),            # ASTM A36/A36M
    ("A53 Gr B", 35, 60),        # ASTM A53/A53M Grade B
    ("A500 Gr B round", 42, 58),  # ASTM A500/A500M-18 Grade B, round
    ("A500 Gr B shaped", 46, 58),  # ASTM A500/A500M-18 Grade B, shaped
    ("A500 Gr C round", 46, 62),  # ASTM A500/A500M-18 Grade C, round
    ("A500 Gr C shaped", 50, 62),  # ASTM A500/A500M-18 Grade C, shaped
    ("A1085", 50, 65),           # ASTM A1085/A1085M
    ("A572 Gr 50", 50, 65),      # ASTM A572/A572M Grade 50
    ("A992", 50, 65),            # ASTM A992/A992M
    ("304", 30, 75),             # ASTM A240 Type 304, annealed
    ("6061-T6", 35, 38),         # Aluminum Design Manual 2020, Table A.3.4
    ("6063-T6", 25, 30),         # Aluminum Design Manual 2020, Table A.3.4
]


@pytest.mark.parametrize(("name", "fy", "fu"), PUBLISHED)
def test_published_strengths(name, fy, fu):
    m = get_material(name)
    assert m.Fy == fy and m.Fu == fu
    assert m.source


@pytest.mark.parametrize("name", ["A36", "A992", "A500 Gr C shaped", "A572 Gr 50"])
def test_structural_steel_moduli(name):
    m = get_material(name)
    assert m.E == 29000 and m.G == 11200  # AISC 360-16: E = 29,000 ksi, G = 11,200 ksi
    assert m.density == 490  # common practice, 490 lb/ft^3


def test_aluminum_welded_and_modulus():
    m = get_material("aluminium 6061 T6")
    assert m.E == 10100  # ADM 2020: E = 10,100 ksi
    assert m.Fy_welded == 15 and m.Fu_welded == 24  # ADM 2020 Table A.3.4 (welded)


@pytest.mark.parametrize("text", ["a36", "ASTM A36", " A36 steel ", "A500 Grade C rectangular HSS", "a500c shaped", "ss304", "S30400"])
def test_forgiving_names(text):
    assert get_material(text).name


def test_a500_needs_round_or_shaped():
    with pytest.raises(InputError, match="fits several"):
        get_material("A500 Gr B")
    assert get_material("A500 Gr C", shape="round").Fy == 46
    assert hss_material("A500 Gr C", get_section("HSS4x4x1/4")).Fy == 50
    assert hss_material("A500 Gr C", get_section("HSS4.500x0.237")).Fy == 46


@pytest.mark.parametrize("bad", ["A37", "unobtanium", "", None])
def test_unknown_material(bad):
    with pytest.raises(InputError, match="material"):
        get_material(bad)


def test_did_you_mean():
    with pytest.raises(InputError, match=r"did you mean.*A36"):
        get_material("A63")


def test_quantities():
    m = get_material("A36")
    assert m.quantity("Fy").to("MPa").magnitude == pytest.approx(248.2, rel=1e-3)  # 36 ksi = 248.2 MPa
    assert m.as_dict(quantities=True)["density"].to("kg/m**3").magnitude == pytest.approx(7849, rel=1e-3)
    with pytest.raises(InputError, match="Fy_welded"):
        m.quantity("Fy_welded")


def test_user_material_same_form():
    m = define_material("Harbor alloy 55", "55 ksi", 70, E="200 GPa", density="7850 kg/m^3", source="mill cert 1234")
    assert m.Fy == 55 and m.Fu == 70
    assert m.E == pytest.approx(29007.5, rel=1e-4)  # 200 GPa in ksi
    assert m.G == pytest.approx(m.E / 2.6)  # E/(2(1+nu)), nu = 0.3
    assert m.density == pytest.approx(490.06, rel=1e-3)
    get_material("A36")  # the name index is made before the registration ...
    register_material(m, aliases=("HA55",))
    assert get_material("ha55") == get_material("Harbor alloy 55")  # ... and finds the new material after it
    assert "Harbor alloy 55" in material_names()
    register_material(define_material("Harbor alloy 55", "60 ksi", 75, source="mill cert 1235"), aliases=("HA55",))
    assert get_material("HA55").Fy == 60  # a redefinition replaces the old values


@pytest.mark.parametrize(
    ("kwargs", "field"),
    [
        ({"name": "", "Fy": 36, "Fu": 58}, "material name"),
        ({"name": "x", "Fy": -36, "Fu": 58}, "Fy"),
        ({"name": "x", "Fy": "36 in", "Fu": 58}, "Fy"),
        ({"name": "x", "Fy": 60, "Fu": 58}, "Fu"),
        ({"name": "x", "Fy": 36, "Fu": 58, "nu": 0.7}, "nu"),
        ({"name": "x", "Fy": 36, "Fu": 58, "density": "3 ft"}, "density"),
        ({"name": "x", "Fy": 36, "Fu": 58, "density": -1}, "density"),
    ],
)
def test_define_material_bad_input(kwargs, field):
    with pytest.raises(InputError, match=field):
        define_material(**kwargs)
