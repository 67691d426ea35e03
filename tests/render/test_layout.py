"""Line breaking and text escaping of the printers (exact strings).

The expected strings are written by hand from the layout rules in ``calcpad/render/layout.py``:
break before "=" first, inside a part before its top-level operators, continuation lines
indented with ``\\qquad`` (LaTeX) or as a ``cont`` line (MathML); text shown exactly as typed.
"""

from __future__ import annotations

from calcpad import Sheet
from calcpad.core.results import FormulaResult
from calcpad.render.html import sheet_html_fragment
from calcpad.render.latex import sheet_latex
from calcpad.render.layout import Piece, break_lines, latex_lines, tex_text
from calcpad.render.notebook import sheet_notebook_html
from calcpad.render.rows import math_rows


def _long_sum_sheet() -> Sheet:
    sh = Sheet("long")
    sh.given("a", "12.25 in")
    sh.given("b", "3.5 in")
    sh.step("I_c", "a**4/12 + a*b**3/12 + a*b*(a - b)**2 + b*a**3", "Composite moment of inertia", unit="in^4")
    return sh


def test_long_formula_breaks_at_top_level_plus_with_every_piece() -> None:
    res = _long_sum_sheet().evaluate()
    step = next(s for s in res.steps if isinstance(s, FormulaResult))
    (row,) = math_rows(step, budget=40)
    lines = latex_lines(row.lines)
    # sum of 4 terms: a²·... (12.25^4/12 = 1,876.6; 12.25·3.5³/12 = 43.8; 42.875·8.75² = 3,282.6;
    # 3.5·12.25³ = 6,433.9; total 11,637 by hand) -> 11,640 at 4 figures
    assert lines == [
        r"I_{c} = \frac{a^{4}}{12} + \frac{a \cdot b^{3}}{12} + a \cdot b \cdot \left(a - b\right)^{2}",
        r"\qquad + b \cdot a^{3}",
        r"\qquad = \frac{\left(12.25\ \mathrm{in}\right)^{4}}{12}",
        r"\qquad + \frac{12.25\ \mathrm{in} \times \left(3.5\ \mathrm{in}\right)^{3}}{12} + 12.25\ \mathrm{in}",
        r"\qquad \times 3.5\ \mathrm{in} \times \left(12.25\ \mathrm{in} - 3.5\ \mathrm{in}\right)^{2}",
        r"\qquad + 3.5\ \mathrm{in} \times \left(12.25\ \mathrm{in}\right)^{3} = 11{,}640\ \mathrm{in}^{4}",
    ]


def test_same_breaks_in_mathml_submittal() -> None:
    frag = sheet_html_fragment(_long_sum_sheet().evaluate())
    row = frag.split('<div class="desc">Composite moment of inertia</div>')[1].split('<div class="step')[0]
    # at the default budget: the symbolic form, then the substituted form on continuation lines
    assert row.count('<div class="mline">') == 1
    assert row.count('<div class="mline cont">') >= 2
    for piece in ("12.25", "3.5", "11,640"):
        assert f"<mn>{piece}</mn>" in row


def test_a_part_that_fits_goes_whole_to_the_next_line() -> None:
    def p(op: str, w: float, t: str) -> Piece:
        return Piece(op, t, t, w)

    lines = break_lines([[p("", 2, "M")], [p("=", 20, "A")], [p("=", 30, "B")], [p("=", 10, "C")]], budget=40)
    assert [[x.latex for x in line] for line in lines] == [["M", "A"], ["B"], ["C"]]
    # a part wider than any line starts its own line and breaks before its operators
    lines = break_lines([[p("", 2, "M")], [p("=", 5, "S")], [p("=", 20, "x"), p("+", 20, "y"), p("+", 20, "z")]], budget=40)
    assert [[x.latex for x in line] for line in lines] == [["M", "S"], ["x"], ["y"], ["z"]]
    assert latex_lines(lines) == ["M = S", r"\qquad = x", r"\qquad + y", r"\qquad + z"]


def test_min_breaks_after_its_commas() -> None:
    sh = Sheet("block")
    sh.given("F_u", "58 ksi")
    sh.given("A_nv", "1.125 in^2")
    sh.given("A_nt", "0.3125 in^2")
    sh.given("A_gv", "1.5 in^2")
    sh.given("F_y", "36 ksi")
    sh.step("R_n", "min(0.6*F_u*A_nv + F_u*A_nt, 0.6*F_y*A_gv + F_u*A_nt)", "Block shear", unit="kip")
    (row,) = math_rows(sh.evaluate().steps[-1], budget=45)
    lines = latex_lines(row.lines)
    # 0.6·58·1.125 + 58·0.3125 = 57.28; 0.6·36·1.5 + 58·0.3125 = 50.53 (by hand): the second governs
    assert lines == [
        r"R_{n} = \min(0.6 \cdot F_{u} \cdot A_{nv} + F_{u} \cdot A_{nt},",
        r"\qquad 0.6 \cdot F_{y} \cdot A_{gv} + F_{u} \cdot A_{nt})",
        r"\qquad = \min(0.6 \times 58\ \mathrm{ksi} \times 1.125\ \mathrm{in}^{2}",
        r"\qquad + 58\ \mathrm{ksi} \times 0.3125\ \mathrm{in}^{2},",
        r"\qquad 0.6 \times 36\ \mathrm{ksi} \times 1.5\ \mathrm{in}^{2} + 58\ \mathrm{ksi} \times 0.3125\ \mathrm{in}^{2})",
        r"\qquad = 50.53\ \mathrm{kip}",
    ]


def test_tex_text_escapes_every_special_character() -> None:
    assert tex_text("a\\b") == r"\text{a} \backslash \text{b}"
    assert tex_text("radius^4") == r"\text{radius} \unicode{x5E} \text{4}"
    assert tex_text("approx ~5") == r"\text{approx } \unicode{x7E} \text{5}"
    assert tex_text("S_x") == r"\text{S} \_ \text{x}"
    assert tex_text("{x}") == r"\{ \text{x} \}"
    assert tex_text("A & B") == r"\text{A } \& \text{ B}"
    assert tex_text("5 %") == r"\text{5 } \%"
    assert tex_text("#4 bar") == r"\# \text{4 bar}"
    assert tex_text("$5") == r"\$ \text{5}"
    assert tex_text("x < y") == r"\text{x < y}"


def test_label_with_specials_in_each_printer() -> None:
    label = "Load \\ ^ ~ _ { } & % # < $"
    sh = Sheet("esc")
    sh.given("P", "250 lbf", label)
    res = sh.evaluate()
    latex = sheet_latex(res)
    assert (
        r"\text{Load } \backslash \text{ } \unicode{x5E} \text{ } \unicode{x7E} \text{ } \_ \text{ } \{ \text{ } \} "
        r"\text{ } \& \text{ } \% \text{ } \# \text{ < } \$"
    ) in latex
    assert r"\^" not in latex and r"\~" not in latex  # no text accents
    html = sheet_html_fragment(res)
    assert '<div class="desc">Load \\ ^ ~ _ { } &amp; % # &lt; $' in html
    nb = sheet_notebook_html(res)
    assert 'class="tex2jax_ignore mathjax_ignore">Load \\ ^ ~ _ { } &amp; % # &lt; $' in nb


def test_ng_is_boxed_and_framed() -> None:
    sh = Sheet("ng")
    sh.given("f", "30 ksi")
    sh.given("F", "20 ksi")
    sh.check("Stress", "f", "F")
    res = sh.evaluate()
    assert r"\boxed{\textbf{NG}}" in sheet_latex(res)
    assert '<span class="status NG">NG</span>' in sheet_html_fragment(res)
    assert sh.summary_frame().iloc[0]["status"] == "[NG]"


def test_notebook_rows_are_table_rows_with_latex_math() -> None:
    res = _long_sum_sheet().evaluate()
    nb = sheet_notebook_html(res)
    assert nb.startswith('<table width="100%"') and "<math" not in nb
    row = nb.split("Composite moment of inertia")[1].split("</tr>")[0]
    assert row.count("<div>\\(\\displaystyle ") >= 3  # one line per <div>


def test_a_wide_fraction_is_written_on_one_level_and_breaks_on_each_side() -> None:
    sh = Sheet("unsym")
    for name, value in (("M", "15 kip*in"), ("I_y", "4.381 in^4"), ("y_p", "-1.892 in"), ("I_xy", "-0.06683 in^4"),
                        ("x_p", "-1.543 in"), ("I_x", "4.381 in^4")):
        sh.given(name, value)
    sh.step("sigma_b", "abs(M*(I_y*y_p - I_xy*x_p)/(I_x*I_y - I_xy**2))", "Bending stress", unit="ksi")
    (row,) = math_rows(sh.evaluate().steps[-1], budget=52)
    # |M (I_y y_p - I_xy x_p) / (I_x I_y - I_xy^2)| = 15 × |4.381 × (-1.892) - 0.06683 × 1.543| / (19.193 - 0.004466)
    # = 15 × 8.392 / 19.19 = 6.560 ksi (by hand)
    assert latex_lines(row.lines)[1:] == [
        r"\qquad = |(15\ \mathrm{kip} \cdot \mathrm{in} \times (4.381\ \mathrm{in}^{4} \times \left(-1.892\ \mathrm{in}\right)",
        r"\qquad - \left(-0.06683\ \mathrm{in}^{4}\right) \times \left(-1.543\ \mathrm{in}\right)))",
        r"\qquad / \left(4.381\ \mathrm{in}^{4} \times 4.381\ \mathrm{in}^{4} - \left(-0.06683\ \mathrm{in}^{4}\right)^{2}\right)|",
        r"\qquad = 6.560\ \mathrm{ksi}",
    ]
