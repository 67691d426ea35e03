"""The three-part hand-calc display for a tube cantilever leg in bending.

Check values are worked by hand below with plain float arithmetic (not through calcpad):
M = P·L, I = π/64·(D_o⁴ − D_i⁴), c = D_o/2, σ = M·c/I, FS = F_y/σ — all common practice.
Tube: 1.900 in OD, 0.145 in wall (NPS 1-1/2 Sch 40 nominal dimensions, ASME B36.10M, from memory).
A36 F_y = 36 ksi (ASTM A36, common practice).
"""

from __future__ import annotations

import math

import pytest

from calcpad import Sheet
from calcpad.render import sheet_html_fragment, sheet_latex, sheet_markdown, sheet_record, sheet_text

REL = 1e-9


def leg_sheet(P: str = "60 lbf") -> Sheet:
    sh = Sheet("Leg L1 - bending at base")
    sh.given("P", P, "Lateral load at top of leg")
    sh.given("L", "48 in", "Leg length, base to load")
    sh.given("D_o", "1.900 in", "Outside diameter")
    sh.given("t", "0.145 in", "Wall thickness")
    sh.given("F_y", "36 ksi", "Yield stress", source="ASTM A36")
    sh.step("M", "P*L", "Base moment", ref="statics")
    sh.step("D_i", "D_o - 2*t", "Inside diameter")
    sh.step("I", "pi/64*(D_o**4 - D_i**4)", "Moment of inertia", unit="in^4")
    sh.step("c", "D_o/2", "Extreme fibre distance")
    sh.step("sigma_b", "M*c/I", "Bending stress", unit="psi")
    sh.step("FS", "F_y/sigma_b", "Factor of safety against yield")
    sh.check("Bending stress vs yield", demand="sigma_b", capacity="F_y", required_fs=1.67)
    return sh


def hand_values(P: float = 60.0) -> dict[str, float]:
    L, Do, t, Fy = 48.0, 1.900, 0.145, 36000.0
    Di = Do - 2 * t
    I = math.pi / 64 * (Do**4 - Di**4)
    c = Do / 2
    M = P * L
    sigma = M * c / I
    return {"M_lbf_in": M, "I": I, "c": c, "sigma": sigma, "FS": Fy / sigma}


def test_numbers_match_hand_calc():
    sh = leg_sheet()
    hv = hand_values()
    assert sh["M"].to("lbf*in").magnitude == pytest.approx(hv["M_lbf_in"], rel=REL)
    assert sh["I"].to("in**4").magnitude == pytest.approx(hv["I"], rel=REL)
    assert sh["I"].to("in**4").magnitude == pytest.approx(0.3099, abs=5e-5)  # by hand: π/64·(13.0321 − 6.7190)
    assert sh["c"].to("in").magnitude == pytest.approx(0.95, rel=REL)
    assert sh["sigma_b"].to("psi").magnitude == pytest.approx(hv["sigma"], rel=REL)
    assert sh["FS"].magnitude == pytest.approx(hv["FS"], rel=REL)
    check = sh.summary()[0]
    assert check.fs == pytest.approx(hv["FS"], rel=1e-9)
    assert check.status == ("OK" if hv["FS"] >= 1.67 else "NG")


def test_three_part_line_in_latex():
    latex = sheet_latex(leg_sheet().evaluate())
    # symbolic = substituted = result, in the author's order
    assert r"M = P \cdot L = 60\ \mathrm{lbf} \times 48\ \mathrm{in} = 2{,}880\ \mathrm{lbf} \cdot \mathrm{in}" in latex
    # too long for one line: the substituted form continues on an indented line after "="
    assert (
        r"I = \frac{\pi}{64} \cdot \left(D_{o}^{4} - D_{i}^{4}\right) \\ \qquad = \frac{\pi}{64} \times "
        r"\left(\left(1.900\ \mathrm{in}\right)^{4} - \left(1.610\ \mathrm{in}\right)^{4}\right) \\ \qquad = 0.3099\ \mathrm{in}^{4}"
    ) in latex
    assert r"\sigma_{b} = \frac{M \cdot c}{I}" in latex
    assert r"\mathit{FS} = \frac{F_{y}}{\sigma_{b}}" in latex


def test_formula_order_preserved():
    sh = Sheet("order")
    sh.given("w", "10 plf")
    sh.given("L", "10 ft")
    sh.step("M", "w*L**2/8")
    sh.given("b", "2 in")
    sh.given("a", "3 in")
    sh.step("s", "b + a")
    latex = sheet_latex(sh.evaluate())
    assert r"\frac{w \cdot L^{2}}{8}" in latex  # canonical order would print L^{2} w
    assert "s = b + a" in latex  # canonical order would print a + b


def test_text_markdown_html_record_agree():
    res = leg_sheet().evaluate()
    text = sheet_text(res)
    assert "M = P·L = 60 lbf × 48 in = 2,880 lbf·in" in text
    md = sheet_markdown(res)
    assert "$$" in md and "Base moment" in md
    frag = sheet_html_fragment(res)
    assert "<script" not in frag and "<math" in frag and "mfenced" not in frag
    rec = sheet_record(res)
    assert rec["format"] == "calcpad-record/1"
    assert rec["inputs"]["P"] == {"value": 60.0, "unit": "lbf", "description": "Lateral load at top of leg"}
    assert rec["results"]["sigma_b"]["unit"] == "psi"
    assert rec["checks"][0]["status"] in ("OK", "NG")
    assert len(rec["digest"]) == 64


def test_ng_when_load_grows_and_incremental_update():
    sh = leg_sheet()
    sh.evaluate()
    sh.set(P="400 lbf")
    res = sh.evaluate()
    assert res.checks[0].status == "NG"
    # D_i, I and c do not depend on P: they were reused
    assert "I" not in sh.last_recomputed and "D_i" not in sh.last_recomputed
    assert sh.last_recomputed[:2] == ["P", "M"]
    assert sh["sigma_b"].to("psi").magnitude == pytest.approx(hand_values(400.0)["sigma"], rel=REL)


def test_si_display():
    sh = Sheet("SI", system="SI")
    sh.given("P", "1.2 kN")
    sh.given("L", "1.5 m")
    sh.step("M", "P*L")
    assert str(sh["M"].units) == "kilonewton * meter"
    assert sh["M"].magnitude == pytest.approx(1.8)


def test_products_print_flat_as_written():
    sh = Sheet("flat")
    for name, value in (("c_q", "0.00256 psf/mph**2"), ("K_z", 0.97), ("K_d", 0.85), ("V", "115 mph"), ("D_o", "2 in")):
        sh.given(name, value)
    sh.step("q_z", "c_q*K_z*K_d*V**2")
    sh.step("S", "D_o**3/(D_o/2)")
    sh.step("G", "0.85")
    text = sheet_text(sh.evaluate())
    assert "q_z = c_q·K_z·K_d·V^2 = 0.00256 psf/mph² × 0.97 × 0.85 × (115 mph)^2 = " in text
    assert "S = D_o^3/(D_o/2) = " in text
    assert "G = 0.85\n" in text  # a number written into a formula is not repeated
    latex = sheet_latex(sh.evaluate())
    assert r"\frac{D_{o}^{3}}{\frac{D_{o}}{2}}" in latex


def test_nested_product_bracketed_in_text():
    sh = Sheet("nested")
    sh.given("M", "3570 lbf*in")
    sh.given("D_o", "1.9 in")
    sh.given("I", "0.3099 in**4")
    sh.step("sigma_b", "M*(D_o/2)/I", unit="ksi")
    assert "σ_b = M·(D_o/2)/I = 3,570 lbf·in × (1.9 in/2)/0.3099 in⁴ = 10.94 ksi" in sheet_text(sh.evaluate())


def test_notebook_latex_split_into_blocks_mathjax_accepts():
    """MathJax 3 refuses one TeX expression past its ~5 KB buffer ("internal buffer size
    exceeded", seen in JupyterLab 4); a long sheet must print as several blocks."""
    sh = leg_sheet()
    for i in range(60):
        sh.step(f"x_{i}", "M*c/I + P/(D_o*t)", unit="psi")
    latex = sheet_latex(sh.evaluate())
    blocks = latex.split("$$\n\\begin{array}")
    assert len(blocks) > 3
    assert all(len(b) < 5000 for b in blocks)


def test_us_step_units_yield_to_an_si_sheet():
    # A template written with unit="ksi" shows MPa on an SI sheet (and ksi on a US one); values agree
    # (1 ksi = 6.894757 MPa, NIST SP 811 Appendix B.8).
    for system, unit in (("SI", "megapascal"), ("US", "kip_per_square_inch")):
        sh = Sheet("units", system=system)
        sh.given("P", "10 kip")
        sh.given("A", "2 in^2")
        sh.step("f", "P/A", unit="ksi")
        assert str(sh["f"].units) == unit
        assert sh["f"].to("MPa").magnitude == pytest.approx(5 * 6.894757, rel=1e-6)


def test_wrong_dimension_step_unit_still_fails_on_an_si_sheet():
    from calcpad.core.errors import DimensionError

    sh = Sheet("units", system="SI")
    sh.given("L", "2 m")
    sh.step("x", "L*2", unit="ksi")
    with pytest.raises(DimensionError, match="cannot be shown in 'ksi'"):
        sh.evaluate()


def test_min_and_max_keep_the_order_written():
    # sympy's Min/Max sort their arguments; a hand calc reads in the order the engineer wrote.
    from calcpad.render.expressions import symbolic_latex, symbolic_mathml, symbolic_text

    sh = Sheet("order")
    sh.given("z_a", "10 ft")
    sh.given("h_s", "28 ft")
    sh.step("r", "min(z_a/h_s, 1)")
    sh.step("m", "max(1, z_a/h_s)")
    res = sh.evaluate()
    steps = {s.name: s for s in res.steps if getattr(s, "name", "") in ("r", "m")}
    r_expr = steps["r"].formula.expr if hasattr(steps["r"], "formula") else steps["r"].expr
    assert symbolic_text(r_expr).startswith("min(z_a/h_s, 1")
    assert symbolic_latex(r_expr).index("z_{a}") < symbolic_latex(r_expr).index("1")
    assert symbolic_mathml(r_expr).index("z") < symbolic_mathml(r_expr).rindex("<mn>1</mn>")
    assert sh["r"].magnitude == pytest.approx(10 / 28)
    assert sh["m"].magnitude == pytest.approx(1.0)


def test_overflow_is_a_sheet_error():
    # found by the fuzz tests: 144**144 overflows a float
    from calcpad.core.errors import SheetError

    sh = Sheet("big")
    sh.given("x", 144.0)
    sh.step("y", "x**x")
    with pytest.raises(SheetError, match="overflow"):
        sh.evaluate()
