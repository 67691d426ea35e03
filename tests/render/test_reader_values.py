"""Reader-facing values on small sheets: as typed, to the sheet's figures, in words, one unit."""

from __future__ import annotations

import pytest

from calcpad import Sheet, calc_heading
from calcpad.core.sheet import typed_sig
from calcpad.core.units import format_number
from calcpad.eng.materials import ROUND_TUBE_GRADES, grade_label
from calcpad.render.html import sheet_html_fragment
from calcpad.render.record import sheet_record
from calcpad.render.text import sheet_text


@pytest.mark.parametrize(
    ("typed", "sig"),
    [("1.900 in", 4), ("0.150 in", 3), ("2.0", 2), ("1,200.0 lbf", 5), ("0.145 in", None), ("35 ksi", None), ("3/16 in", None)],
)
def test_typed_significant_figures(typed: str, sig: int | None) -> None:
    assert typed_sig(typed) == sig


def test_typed_zeros_kept_and_computed_givens_to_the_sheets_figures() -> None:
    sh = Sheet("figs")
    sh.given("D_o", "1.900 in", "Outside diameter")
    sh.given("t", 0.93 * 0.1875, "Design wall (a value the template computed)")
    sh.given("n", 2, "Weld lines")
    text = sheet_text(sh.evaluate())
    assert "D_o = 1.900 in" in text
    assert "t = 0.1744\n" in text or "t = 0.1744 " in text  # 0.174375 to 4 figures
    assert "n = 2\n" in text or "n = 2 " in text  # no padding zeros
    assert format_number(0.174375, -4) == "0.1744" and format_number(2.0, -4) == "2"


def test_ratio_in_one_unit_and_record_gives_the_ratio() -> None:
    # 1,012.11 lbf·in against 1.248 kip·ft: both in kip·ft; 1,012.11/12,000 = 0.08434 kip·ft
    sh = Sheet("units")
    sh.given("M", "1012.11 lbf*in")
    sh.given("M_a", "1.248 kip*ft")
    sh.check("Moment", "M", "M_a")
    res = sh.evaluate()
    html = sheet_html_fragment(res)
    assert '<mn>0.08434</mn><mspace width="0.25em"/><mi mathvariant="normal">kip</mi>' in html
    assert "lbf" not in html.split('class="step check"')[1]
    rec = sheet_record(res)["checks"][0]
    assert rec["demand"]["unit"] == rec["capacity"]["unit"] == "kip*ft"
    assert rec["ratio"] == pytest.approx(1012.11 / 12 / 1248, rel=1e-12)
    assert rec["ratio"] == pytest.approx(rec["demand"]["value"] / rec["capacity"]["value"], rel=1e-12)


def test_fs_check_records_the_allowable_as_capacity() -> None:
    # sigma = 11.04 ksi against F_y = 35 ksi with FS 1.67: allowable 20.96 ksi, ratio 0.5268
    sh = Sheet("fs")
    sh.given("sigma", "11.04 ksi")
    sh.given("F_y", "35 ksi")
    sh.check("Yield", "sigma", "F_y", required_fs=1.67)
    rec = sheet_record(sh.evaluate())["checks"][0]
    assert rec["capacity"]["value"] == pytest.approx(35 / 1.67)
    assert rec["nominal_capacity"]["value"] == pytest.approx(35)
    assert rec["ratio"] == pytest.approx(11.04 * 1.67 / 35) == pytest.approx(rec["demand"]["value"] / rec["capacity"]["value"])


def test_negative_demand_magnitude_with_the_sign_explained() -> None:
    sh = Sheet("sign")
    sh.given("V", "-84.20 lbf")
    sh.given("V_a", "6.314 kip")
    sh.check("Shear", "V", "V_a")
    res = sh.evaluate()
    text = sheet_text(res)
    assert "|V|/V_a = 0.08420 kip/6.314 kip = 0.0133" in text
    assert "demand V = −0.08420 kip acts in the negative direction; its magnitude is checked" in text
    assert sheet_record(res)["checks"][0]["demand"]["value"] == pytest.approx(0.0842)


def test_governs_only_when_strictly_smaller() -> None:
    sh = Sheet("gov")
    sh.given("M_p", "2.083 kip*ft")
    sh.given("M_LB", "2.083 kip*ft")
    sh.given("M_LTB", "3 kip*ft")
    sh.select("M_n", "min", {"M_p": "yielding (F8-1)", "M_LB": "local buckling (F8.2)", "M_LTB": "LTB"})
    text = sheet_text(sh.evaluate())
    assert "yielding (F8-1) and local buckling (F8.2) give the same value" in text
    assert "governs" not in text
    sh.set(M_LB="2 kip*ft")
    assert "local buckling (F8.2) governs" in sheet_text(sh.evaluate())


def test_class_markers_in_words_and_quiet_zero_steps_hidden() -> None:
    sh = Sheet("words")
    sh.given("lambda_w", 14.2)
    sh.given("lambda_pw", 58.3)
    sh.branch("class_w", [("lambda_w <= lambda_pw", "1", "compact web"), (None, "2", "noncompact web")], "Web class", words=True)
    sh.given("b", "3.303 in")
    sh.given("b_e", "3.303 in")
    sh.given("t", "0.2325 in")
    sh.step("A_x", "(b - b_e)*t", "Ineffective flange area", unit="in^2", quiet=True)
    res = sh.evaluate()
    text = sheet_text(res)
    assert "Web class: λ_w = 14.20 ≤ λ_pw = 58.30 → compact web" in text
    assert "class_w" not in text and "Ineffective flange area" not in text
    html = sheet_html_fragment(res)
    assert "<mtext>compact</mtext><mspace width=\"0.3em\"/><mtext>web</mtext>" in html and "Ineffective flange area" not in html
    assert sheet_record(res)["results"]["A_x"]["value"] == 0.0  # the record keeps it
    sh.set(b_e="3.0 in")
    assert "Ineffective flange area" in sheet_text(sh.evaluate())


def test_kl_over_r_in_every_printer() -> None:
    sh = Sheet("kl")
    sh.given("K", 2.1)
    sh.given("L", "120 in")
    sh.given("r", "1.52 in")
    sh.step("KL_r", "K*L/r", "Slenderness")
    res = sh.evaluate()
    assert "KL/r = K·L/r" in sheet_text(res)
    assert '<mrow><mi mathvariant="italic">KL</mi><mo>/</mo><mi>r</mi></mrow>' in sheet_html_fragment(res)


def test_grade_labels_from_the_catalog() -> None:
    # materials.toml (ASTM A53/A53M Gr B 35 ksi; ASTM A500/A500M-18 round Gr C 46 ksi)
    assert grade_label("35 ksi", ROUND_TUBE_GRADES) == "ASTM A53 Gr. B"
    assert grade_label("240 MPa", ROUND_TUBE_GRADES) == "ASTM A53 Gr. B"  # 34.8 ksi, the SI grade value
    assert grade_label("46 ksi", ROUND_TUBE_GRADES) == "ASTM A500 Gr. C (round)"
    assert grade_label("41 ksi", ROUND_TUBE_GRADES) == "as given"


def test_calc_heading() -> None:
    assert calc_heading("Leg bending", "Stand CS-1 legs: bending at base", "L3") == "L3 - Stand CS-1 legs: bending at base"
    assert calc_heading("Leg bending", "", "") == "Leg bending"
    assert calc_heading("Repair", "Leg repair", "L2", "existing section") == "L2 - Leg repair, existing section"
