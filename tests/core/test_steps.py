"""Branch and selection steps (AISC 360-16 Eq. E3-2/E3-3 used as the branch example)."""

from __future__ import annotations

import math

import pytest

from calcpad import Sheet
from calcpad.render import sheet_latex, sheet_text


def buckling_sheet(KL_r: float) -> Sheet:
    sh = Sheet("Column")
    sh.given("E", "29000 ksi")
    sh.given("F_y", "46 ksi")
    sh.given("KL_r", KL_r, "Slenderness")
    sh.step("F_e", "pi**2*E/KL_r**2", "Elastic buckling stress", ref="AISC 360-16 Eq. E3-4")
    sh.step("lambda_lim", "4.71*sqrt(E/F_y)", "Slenderness limit")
    sh.branch(
        "F_cr",
        [("KL_r <= lambda_lim", "0.658**(F_y/F_e)*F_y", "Eq. E3-2"), (None, "0.877*F_e", "Eq. E3-3")],
        "Critical stress",
        ref="AISC 360-16 E3",
    )
    return sh


@pytest.mark.parametrize("KL_r, label", [(60.0, "Eq. E3-2"), (150.0, "Eq. E3-3")])
def test_branch_picks_equation_and_shows_the_test(KL_r, label):
    sh = buckling_sheet(KL_r)
    res = sh.evaluate()
    branch = next(s for s in res.steps if s.kind == "branch")
    assert branch.cases[branch.chosen].label == label
    # independent arithmetic of AISC 360-16 E3-2/E3-3/E3-4
    Fe = math.pi**2 * 29000 / KL_r**2
    expected = 0.658 ** (46 / Fe) * 46 if KL_r <= 4.71 * math.sqrt(29000 / 46) else 0.877 * Fe
    assert sh["F_cr"].to("ksi").magnitude == pytest.approx(expected, rel=1e-12)
    text = sheet_text(res)
    rel = "≤" if label == "Eq. E3-2" else ">"
    assert f"{rel} λ_lim = 118.3 → use {label}" in text  # 4.71·√(29,000/46) = 118.26
    assert label in sheet_latex(res)


def test_selection_names_governing_candidate():
    sh = Sheet("sel")
    sh.given("M_p", "12 kip*ft")
    sh.given("M_lb", "10.5 kip*ft")
    sh.select("M_n", "min", {"M_p": "yielding", "M_lb": "local buckling"}, "Nominal strength")
    res = sh.evaluate()
    sel = res.steps[-1]
    assert sel.candidates[sel.governing].label == "local buckling"
    assert sh["M_n"].to("kip*ft").magnitude == pytest.approx(10.5)
    assert "local buckling governs" in sheet_text(res)
    sh.set(M_lb="20 kip*ft")
    assert sh.evaluate().steps[-1].candidates[sh.evaluate().steps[-1].governing].label == "yielding"


def test_check_ratio_and_fs():
    sh = Sheet("chk")
    sh.given("f_b", "18 ksi")
    sh.given("F_b", "24 ksi")
    sh.check("Bending", "f_b", "F_b", show_fs=True)
    c = sh.summary()[0]
    assert c.ratio == pytest.approx(0.75) and c.status == "OK" and c.fs == pytest.approx(24 / 18)
    df = sh.summary_frame()
    assert list(df.columns) == ["check", "demand", "capacity", "ratio", "status", "reference"]
    assert df.iloc[0]["status"] == "OK"


def test_heading_note_reference_table_kept_in_order():
    sh = Sheet("misc")
    sh.heading("Loads")
    sh.note("Wind governs.")
    sh.assume("Base plate is rigid.")
    sh.reference("AISC 360-16")
    sh.table("Forces", [["A", 1.5], ["B", 2.25]], columns=["node", "force"])
    kinds = [s.kind for s in sh.evaluate().steps]
    assert kinds == ["heading", "note", "assumption", "reference", "table"]
    text = sheet_text(sh.evaluate())
    assert "Assumption: Base plate is rigid." in text and "2.250" in text


def test_steps_added_after_an_evaluation_are_ordered_and_read() -> None:
    """The sheet keeps its evaluation order while steps are appended (a template reads values as
    it builds); a step using a name defined later still sorts after it. Values by hand."""
    from calcpad import Sheet

    sh = Sheet("order")
    sh.given("a", "2 in")
    sh.step("b", "3*a", "b")
    assert sh["b"].to("in").magnitude == 6.0
    sh.step("c", "b + a", "c")  # uses names defined already: appended to the order
    assert sh["c"].to("in").magnitude == 8.0
    sh.step("d", "e*2", "d")  # uses a name defined after it
    sh.given("e", "5 in")
    assert sh["d"].to("in").magnitude == 10.0
    sh.evaluate()
    sh.set(a="1 in")
    assert sh["c"].to("in").magnitude == 4.0  # read without the result model
    res = sh.evaluate()
    assert sh.last_recomputed == ["a", "b", "c"]  # everything computed since the last result model
    assert [getattr(s, "name", None) for s in res.steps] == ["a", "b", "c", "d", "e"]
    sh.step("f", "g", "f")
    from calcpad.core.errors import SheetError

    with pytest.raises(SheetError, match="g"):
        sh.evaluate()  # an unknown name is still refused
