"""Printed rows are kept by what they depend on (render/html.py): a repeated row prints from the
store, and a row whose values or units differ is printed anew. The moments are hand arithmetic
(M = w L^2 / 8 for a simply supported beam under a uniform load, common practice)."""

from __future__ import annotations

from calcpad import Sheet
from calcpad.render import html as html_mod
from calcpad.render.html import sheet_html_fragment


def _beam(w: str, span: str = "10 ft") -> str:
    sh = Sheet("Beam")
    sh.given("w", w, "Uniform load")
    sh.given("L", span, "Span")
    sh.step("M", "w*L**2/8", "Midspan moment", unit="kip*ft")
    return sheet_html_fragment(sh.evaluate())


def _moment_row(frag: str) -> str:
    return frag.split('<div class="desc">Midspan moment</div>')[1].split('<div class="step')[0]


def test_repeated_rows_print_alike_and_changed_values_print_anew() -> None:
    html_mod._ROWS.clear()
    first = _beam("2 kip/ft")
    assert html_mod._ROWS  # the rows were stored
    assert _beam("2 kip/ft") == first  # from the store: the same text as printed the first time
    row = _moment_row(first)
    assert "<mn>25.00</mn>" in row  # 2 x 10^2 / 8 = 25 kip-ft
    other = _moment_row(_beam("3 kip/ft"))
    assert "<mn>37.50</mn>" in other and "<mn>25.00</mn>" not in other  # 3 x 10^2 / 8 = 37.5 kip-ft
    assert "<mn>3</mn>" in other or "<mn>3.000</mn>" in other


def test_other_values_with_the_same_result_print_their_own_values() -> None:
    html_mod._ROWS.clear()
    a = _moment_row(_beam("2 kip/ft", "10 ft"))
    b = _moment_row(_beam("8 kip/ft", "5 ft"))  # 8 x 5^2 / 8 = 25 kip-ft, as 2 x 10^2 / 8
    assert "<mn>25.00</mn>" in a and "<mn>25.00</mn>" in b
    assert "<mn>10</mn>" in a or "<mn>10.00</mn>" in a
    assert "<mn>5</mn>" in b or "<mn>5.000</mn>" in b
    assert a != b


def test_same_number_other_unit_is_not_taken_from_the_store() -> None:
    html_mod._ROWS.clear()
    kip = _beam("2 kip/ft")
    lbf = _beam("2 lbf/ft")
    assert "<mn>25.00</mn>" in _moment_row(kip)
    assert "<mn>0.02500</mn>" in _moment_row(lbf)  # 2 lbf/ft x 100 ft^2 / 8 = 25 lbf-ft = 0.025 kip-ft
    assert 'mathvariant="normal">lbf' in lbf.split('<div class="desc">Uniform load</div>')[1].split("</div></div>")[0]


def test_store_is_bounded(monkeypatch) -> None:
    html_mod._ROWS.clear()
    monkeypatch.setattr(html_mod, "_ROWS_MAX", 3)
    for w in ("1 kip/ft", "2 kip/ft", "3 kip/ft", "4 kip/ft"):
        _beam(w)
        assert len(html_mod._ROWS) <= 3
    assert "<mn>50.00</mn>" in _moment_row(_beam("4 kip/ft"))  # 4 x 100 / 8


def _slender(kl_r: float) -> str:
    """A column-curve branch (AISC 360-16 E3: F_cr = 0.658^(F_y/F_e) F_y when F_y/F_e <= 2.25,
    else 0.877 F_e), as printed."""
    sh = Sheet("Column")
    sh.given("F_y", "50 ksi", "Yield stress")
    sh.given("E", "29000 ksi", "Modulus")
    sh.given("KL_r", kl_r, "Slenderness")
    sh.step("F_e", "pi**2*E/KL_r**2", "Elastic buckling stress", unit="ksi")
    sh.branch("F_cr", [("F_y/F_e <= 2.25", "0.658**(F_y/F_e)*F_y", "E3-2"), (None, "0.877*F_e", "E3-3")],
              "Critical stress", unit="ksi")
    frag = sheet_html_fragment(sh.evaluate())
    return frag.split('<div class="desc">Critical stress</div>')[1]


def test_branch_rows_repeat_from_the_store_and_other_cases_print_anew() -> None:
    html_mod._ROWS.clear()
    inelastic = _slender(50.0)  # F_e = pi^2 x 29000 / 50^2 = 114.5 ksi; 50/114.5 = 0.437 <= 2.25: E3-2
    assert "E3-2" in inelastic and "E3-3" not in inelastic
    assert _slender(50.0) == inelastic  # from the store
    elastic = _slender(150.0)  # F_e = 12.72 ksi; 50/12.72 = 3.93 > 2.25: E3-3, 0.877 x 12.72 = 11.16 ksi
    assert "E3-3" in elastic and "<mn>11.16</mn>" in elastic
    other = _slender(60.0)  # F_e = 79.51 ksi, the same case with other numbers
    assert "E3-2" in other and other != inelastic and "<mn>79.51</mn>" in other
