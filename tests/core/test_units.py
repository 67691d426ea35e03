"""Unit parsing and conversion.

Conversion factors from NIST Special Publication 811 (2008 ed.), Appendix B.8/B.9
("Factors for units listed alphabetically / by kind of quantity"), from memory. The inch,
foot, pound (mass) and mph factors are exact by definition.
"""

from __future__ import annotations

import pytest

from calcpad.core.errors import UnitInputError
from calcpad.core.units import Q_, format_number, parse_quantity

NIST_SP811 = [
    ("1 in", "m", 0.0254),  # exact
    ("1 ft", "m", 0.3048),  # exact
    ("1 lbf", "N", 4.448222),
    ("1 kip", "N", 4448.222),
    ("1 psi", "Pa", 6894.757),
    ("1 ksi", "MPa", 6.894757),
    ("1 psf", "Pa", 47.88026),
    ("1 lbf*ft", "N*m", 1.355818),
    ("1 lbf*in", "N*m", 0.1129848),
    ("1 pound", "kg", 0.45359237),  # exact; a bare "lb" is read as pound-force (loads)
    ("1 mph", "m/s", 0.44704),  # exact
    ("1 in**4", "mm**4", 416231.4),
    ("1 plf", "N/m", 14.59390),
    ("1 pcf", "kg/m**3", 16.01846),
]


@pytest.mark.parametrize("text, unit, factor", NIST_SP811)
def test_conversion_factors_match_nist_sp811(text, unit, factor):
    assert parse_quantity(text).to(unit).magnitude == pytest.approx(factor, rel=1e-6)  # SP 811 prints 7 significant figures


@pytest.mark.parametrize(
    "text, value, unit",
    [
        ("84 in", 84, "in"),
        ("1.5 kip", 1.5, "kip"),
        ("36 ksi", 36, "ksi"),
        ("2.5 kN*m", 2.5, "kN*m"),
        ("12 psf", 12, "psf"),
        ("1-1/2 in", 1.5, "in"),
        ("3/4 in", 0.75, "in"),
        ("5'-6\"", 66, "in"),
        ("7'", 84, "in"),
        ("250 lb", 250, "lbf"),
        ("1.75 kip-ft", 1.75, "kip*ft"),
        ("2.1 in²", 2.1, "in**2"),
        ("0.85", 0.85, ""),
    ],
)
def test_engineer_forms(text, value, unit):
    q = parse_quantity(text)
    assert q.to(unit).magnitude == pytest.approx(value)


@pytest.mark.parametrize(
    "text",
    [
        "84 furlongz",
        "",
        "abc",
        "3 in in in +",
        "__import__('os')",
        "1 in; rm -rf /",
        "exec(1)",
        "1e999 in",
        "1 in ** (2**100000)",
        "2**99999 in",
    ],
)
def test_malformed_unit_strings_are_clear_errors(text):
    with pytest.raises(UnitInputError) as err:
        parse_quantity(text, "L")
    assert "L" in str(err.value)


def test_wrong_dimension_named():
    with pytest.raises(UnitInputError, match=r"L: '84 lbf' is a force; expected a length"):
        parse_quantity("84 lbf", "L", expected="in")


def test_format_number():
    assert format_number(21000) == "21,000"
    assert format_number(1.75) == "1.750"
    assert format_number(0.09375) == "0.09375"
    assert format_number(-1234.5) == "−1,235"
    assert format_number(0.5, 3) == "0.500"
    assert format_number(1.9, 0) == "1.9"
    assert Q_(1, "in").to("mm").magnitude == pytest.approx(25.4)


def test_unit_symbols_keep_the_authors_order_and_style_after_caching() -> None:
    # the symbol cache is keyed by the ordered (unit, power) pairs: kip·ft and ft·kip are equal
    # units to pint but print in the order written (common practice: moments in kip·ft)
    from calcpad.core.units import unit_symbol, ureg

    for _ in range(2):  # second round from the cache
        assert unit_symbol(ureg.kip * ureg.ft) == "kip·ft"
        assert unit_symbol(ureg.ft * ureg.kip) == "ft·kip"
        assert unit_symbol(ureg.kip * ureg.ft, "latex") == r"\mathrm{kip} \cdot \mathrm{ft}"
        assert unit_symbol("lbf/in**2", "ascii") == "lbf/in^2"
