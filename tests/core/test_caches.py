"""Caches of the engine (unit text, unit symbols, formulas, sheet values, digest, printed names):
a cached answer is never stale — a changed input gives the new result — and refusals are
never cached (each bad text is refused again, naming the field of that call).

Expected values are unit facts (1 ft = 12 in, exact by definition) and the arithmetic of the
formulas themselves.
"""

from __future__ import annotations

import re

import pytest

from calcpad import Sheet
from calcpad.core.errors import CalcpadError, FormulaError, UnitInputError
from calcpad.core.formula import parse_formula
from calcpad.core.results import TableResult
from calcpad.core.units import parse_unit, unit_symbol, ureg
from calcpad.render.html import sheet_html_fragment


def test_unit_text_cache_gives_each_text_its_own_unit():
    assert parse_unit("kip*ft") == ureg.kip * ureg.ft
    assert parse_unit("kip*in") == ureg.kip * ureg.inch  # a different text after the first is read anew
    assert parse_unit("kip*ft") == ureg.kip * ureg.ft


def test_refused_unit_text_is_refused_every_time_with_its_own_field():
    for field in ("step 'M' unit", "given 'P'"):
        with pytest.raises(UnitInputError, match=field):
            parse_unit("kip**ft", field)


def test_unit_symbol_keeps_the_order_of_each_unit():
    assert unit_symbol(ureg.kip * ureg.ft) == "kip·ft"
    assert unit_symbol(ureg.ft * ureg.kip) == "ft·kip"  # equal units, printed in their own order
    assert unit_symbol(ureg.kip * ureg.ft, "ascii") == "kip*ft"


def test_formula_cache_returns_the_formula_of_the_text():
    a, b = parse_formula("P*L"), parse_formula("P*L/2")
    assert a.names == ("P", "L") and b.text == "P*L/2" and a is not b
    for _ in range(2):
        with pytest.raises(FormulaError):
            parse_formula("P*__import__")


def test_sheet_values_follow_changes_while_building_and_after_set():
    sh = Sheet("cache")
    sh.given("P", "100 lbf")
    sh.given("L", "2 ft")
    sh.step("M", "P*L", unit="lbf*in")
    assert sh["M"].magnitude == pytest.approx(2400.0)  # 100 lbf x 24 in
    first = sh.evaluate().digest
    sh.set(L="3 ft")
    assert sh["M"].magnitude == pytest.approx(3600.0)
    assert sh.evaluate().digest != first  # the digest follows the givens
    sh.step("M2", "2*M", unit="lbf*in")  # a step added after a read is in the order and evaluated
    assert "M2" in sh.order() and sh["M2"].magnitude == pytest.approx(7200.0)
    assert [c.name for c in sh.evaluate().steps if hasattr(c, "name")] == ["P", "L", "M", "M2"]


def test_unknown_name_is_still_refused_after_the_order_was_kept():
    sh = Sheet("cache")
    sh.given("P", "1 lbf")
    sh.order()
    sh.step("Q", "P*X")
    with pytest.raises(CalcpadError, match="unknown name 'X'"):
        sh.evaluate()


def test_printed_formula_keeps_each_authors_term_order():
    html = []
    for text in ("a*b", "b*a"):
        sh = Sheet("order")
        sh.given("a", "2 in")
        sh.given("b", "3 in")
        sh.step("c", text)
        html.append(sheet_html_fragment(sh.evaluate()).split("<mi>c</mi>", 1)[1])  # the step's own line
    assert html[0] != html[1]
    assert html[0].index("<mi>a</mi>") < html[0].index("<mi>b</mi>")
    assert html[1].index("<mi>b</mi>") < html[1].index("<mi>a</mi>")


def _cells(sheet: Sheet, rows: list[list[object]]) -> list[str]:
    sheet.table("t", rows, columns=[f"c{i}" for i in range(len(rows[0]))])
    return [s for s in sheet.evaluate().steps if isinstance(s, TableResult)][-1].rows[0]


def test_table_cell_texts_are_kept_per_value_units_and_display_preferences():
    from calcpad.core.units import Q_

    us = _cells(Sheet("a"), [[Q_(12.0, "in"), Q_(2.0, "kip*ft"), Q_(2.0, "ft*kip")]])
    assert _cells(Sheet("b"), [[Q_(12.0, "in"), Q_(2.0, "kip*ft"), Q_(2.0, "ft*kip")]]) == us  # from the store
    si = _cells(Sheet("c", system="SI"), [[Q_(12.0, "in"), Q_(2.0, "kip*ft"), Q_(2.0, "ft*kip")]])
    assert si[0] == "304.8 mm" and us[0] == "12.00 in"  # 12 in = 304.8 mm exactly
    assert si[1] == si[2] and si[1] != us[1]
    three = _cells(Sheet("d", sig=3), [[Q_(12.0, "in"), Q_(2.0, "kip*ft"), Q_(2.0, "ft*kip")]])
    assert three[0] == "12.0 in"
    # round-off noise beside a large value prints as zero; the same tiny value alone prints as it is
    noisy = _cells(Sheet("e"), [[Q_(1e-13, "kip"), Q_(1e-13, "kip")], [Q_(100.0, "kip"), Q_(1e-13, "kip")]])
    alone = _cells(Sheet("f"), [[Q_(1e-13, "kip")]])
    assert noisy[0].startswith("0") and noisy[1] == alone[0] and not alone[0].startswith("0 ")


def test_formula_values_are_kept_per_exact_inputs_unit_and_preferences():
    def moment(w: str, span: str, unit: str | None = "kip*ft", system: str = "US") -> float:
        sh = Sheet("beam", system=system)
        sh.given("w", w)
        sh.given("L", span)
        sh.step("M", "w*L**2/8", unit=unit)
        return sh["M"]

    first = moment("2 kip/ft", "10 ft")
    assert first.magnitude == 25.0 and first.units == ureg.kip * ureg.ft  # 2 x 10^2 / 8 kip-ft
    assert moment("2 kip/ft", "10 ft").magnitude == 25.0  # from the store, the same number
    assert moment("2 kip/ft", "10.000001 ft").magnitude != 25.0  # inputs differ in the 7th figure
    assert moment("2 kip/ft", "120 in").to("kip*ft").magnitude == pytest.approx(25.0, rel=1e-12)  # 120 in = 10 ft
    inch = moment("2 kip/ft", "10 ft", unit="kip*in")
    assert inch.magnitude == 300.0 and inch.units == ureg.kip * ureg.inch  # 25 kip-ft = 300 kip-in
    si = moment("2 kip/ft", "10 ft", unit=None, system="SI")
    assert si.to("kN*m").magnitude == pytest.approx(25.0 * 1.3558179483314, rel=1e-9)  # 1 kip-ft = 1.35582 kN-m
    assert si.units != ureg.kip * ureg.ft


def test_each_sheet_keeps_its_own_values_when_a_caller_changes_one_in_place():
    """pint's ``ito`` changes a Quantity in place; a value read from one sheet, or handed to it,
    must not change what another sheet (or the same one) prints. 1 kip-ft = 12 kip-in (unit fact)."""

    def beam() -> Sheet:
        sh = Sheet("beam")
        sh.given("w", "2 kip/ft")
        sh.given("L", "10 ft")
        sh.step("M", "w*L**2/8", unit="kip*ft")
        return sh

    a, b = beam(), beam()  # b's M comes from the value store that a's filled
    a["M"].ito("kip*in")
    m = a["M"]
    m.ito("kip*in")
    assert m.magnitude == 300.0  # the caller's copy changed
    assert a["M"].units == ureg.kip * ureg.ft and a["M"].magnitude == 25.0
    assert b["M"].units == ureg.kip * ureg.ft and b["M"].magnitude == 25.0
    html = sheet_html_fragment(b.evaluate())
    assert "<mn>25.00</mn>" in html and "300" not in html

    span = ureg.Quantity(10.0, "ft")
    c = Sheet("given by object")
    c.given("L", span)
    c.set(L=span)
    span.ito("inch")
    assert c["L"].units == ureg.ft and c["L"].magnitude == 10.0


def test_value_text_cache_hands_out_copies_and_never_keeps_a_refusal():
    from calcpad.core.units import parse_quantity

    first = parse_quantity("84 in", "given 'L'")
    first.ito("ft")  # 84 in = 7 ft (unit fact)
    assert first.magnitude == 7
    again = parse_quantity("84 in", "given 'H'")
    assert again.magnitude == 84 and again.units == ureg.inch
    for field in ("given 'L'", "calcs[2].inputs.L"):
        with pytest.raises(UnitInputError, match=re.escape(field)):
            parse_quantity("84 inn", field)
