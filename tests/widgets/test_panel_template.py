"""The what-if panel built from a template's parameters cell: ranges, rollback, redraw in place,
sensitivity, "what would it take" and export.

Hand arithmetic for the leg template (plain floats, never through calcpad; common practice):
default leg Pipe 1-1/2 Std, D_o = 1.900 in, t_nom = 0.145 in (ASME B36.10M, NPS 1-1/2 Std wall);
design wall t = 0.93·t_nom (AISC 360-16 B4.2), D_i = D_o − 2t, I = π/64·(D_o⁴ − D_i⁴),
M_1 = P·L. With no axial load (N = 0, the template's default) B2 = 1 (AISC 360-16 Appendix 8,
Eq. A-8-6 with P_story = 0), so M_r2 = M_1, σ = M_1·(D_o/2)/I and ratio = FS_req·σ/F_y: the
ratio is proportional to P, to L and to 1/F_y (elasticities 1, 1, −1 exactly).
"""

from __future__ import annotations

import html
import math

import pytest

from calcpad.core.sheet import Sheet
from calcpad.runner.execute import run_calc_inprocess
from calcpad.runner.job import parse_job
from calcpad.widgets import live, what_if
from calcpad.widgets.session import TemplateSession

POST_BIND = {"P": "P_top", "H": "H_top", "L": "L_post"}
LEG_BIND = ["P", "L", "F_y"]  # D_o, t and the leg re-run the template (the section feeds B2)


LEG_CHECK = "chk_combined_stress_vs_yield"  # the leg's own check (the B1/B2 stability checks come first)


def leg_ratio(P: float = 85.0, L: float = 42.0, D_o: float = 1.9, t: float = 0.145, F_y: float = 35_000.0, FS: float = 1.67) -> float:
    """Hand ratio of the leg template with N = 0, in lbf, in, psi; t is the nominal wall
    (see module docstring: design wall 0.93 t per AISC 360-16 B4.2, B2 = 1)."""
    D_i = D_o - 2 * (0.93 * t)
    inertia = math.pi / 64 * (D_o**4 - D_i**4)
    return FS * (P * L * D_o / 2 / inertia) / F_y


def leg_check(panel):
    """The panel's "Combined stress vs yield" result."""
    return next(c for c in panel.sheet.summary() if c.key == LEG_CHECK)


def leg_panel(**kw):
    sh = TemplateSession("leg_bending").build()[0]
    return what_if(sh, template="leg_bending", bind=LEG_BIND, **kw)


def post_panel(**kw):
    sh = TemplateSession("post_combined").build()[0]
    return what_if(sh, template="post_combined", bind=POST_BIND, **kw)


def gov_ratio(panel) -> float:
    return max(c.ratio / c.limit for c in panel.sheet.summary())


# ----------------------------------------------------------------------------- ranges, rollback


@pytest.mark.parametrize(
    ("name", "value", "stated"),
    [("P", "0 lbf", "0 < P <= 20 kip"), ("P", "-50 lbf", "0 < P <= 20 kip"), ("t", "1.2 in", "0 < t < D_o/2"), ("L", "40 ft", "6 in to 30 ft")],
)
def test_values_outside_the_stated_range_are_refused_inline(name: str, value: str, stated: str) -> None:
    panel = leg_panel()
    assert panel.set("P", "120 lbf") is True
    good = leg_check(panel).ratio
    assert panel.set(name, value) is False
    assert stated in panel.last_error and repr(value) in panel.last_error
    assert "Not applied" in panel._message.value and html.escape(stated) in panel._message.value
    assert leg_check(panel).ratio == pytest.approx(leg_ratio(P=120.0), rel=1e-9)
    assert leg_check(panel).ratio == good
    assert "OK" in panel._out.outputs[0]["data"]["text/plain"]  # the last good result stays shown


def test_the_panel_refuses_what_the_cli_refuses() -> None:
    """Same parser and range as a job file: the job loader's message for the same value."""
    from calcpad.core.errors import InputError
    from calcpad.runner.job import single_template_job

    panel = leg_panel()
    assert panel.set("t", "1.2 in") is False
    with pytest.raises(InputError, match=r"0 < t < D_o/2"):
        single_template_job("leg_bending", ['t=1.2 in'])


def test_a_post_without_lateral_load_is_now_accepted() -> None:
    # post_combined states H as "0 to 20 kip" and its base plate and anchorage now take a post
    # with no tension side, so H = 0 (once refused when the plate step could not be evaluated)
    # is in range and evaluates: the panel applies it.
    panel = post_panel()
    assert panel.set("H", "0 kip") is True and panel.last_error is None
    assert panel.controls["H"].value == 0.0
    assert panel.ratios["Flexure about x"] == 0.0  # no lateral load, no base moment


def test_a_value_the_template_refuses_rolls_back() -> None:
    # re-run: rod_f is inside "1 in to 18 in", but the plate check refuses rods inside the wall
    panel = post_panel()
    before = dict(panel.ratios)
    assert panel.set("rod_f", "1 in") is False
    assert panel.last_error and "f > d/2 - t/2" in panel.last_error
    assert "Not applied" in panel._message.value
    assert panel.ratios == before
    assert panel.controls["rod_f"].value == pytest.approx(3.75)


def test_a_value_the_sheet_cannot_evaluate_rolls_back() -> None:
    """A given changed in place (the path of a bound parameter) that makes a step fail: a brace's
    rise h = sqrt(L^2 - x^2) with its run x longer than the brace. x = 80 in is inside the given's
    stated range, so only the evaluation can refuse it."""
    sh = Sheet("Inclined brace")
    sh.given("F", "2 kip", "Horizontal force")
    sh.given("L_br", "60 in", "Brace length")
    sh.given("x", "36 in", "Horizontal run", min="1 in", max="100 in")
    sh.step("h", "sqrt(L_br**2 - x**2)", "Rise", unit="in")
    sh.step("P_br", "F*L_br/x", "Brace force", unit="kip")
    sh.given("P_a", "10 kip", "Allowable brace force")
    sh.check("Brace force", demand="P_br", capacity="P_a")
    panel = what_if(sh, ["x"])
    before = dict(panel.ratios)
    assert before["Brace force"] == pytest.approx(2 * 60 / 36 / 10, rel=1e-12)  # by hand
    assert panel.set("x", "80 in") is False
    assert panel.last_error and "'h'" in panel.last_error
    assert "Not applied" in panel._message.value
    assert panel.ratios == before and panel.sheet["x"].to("in").magnitude == 36.0
    assert panel.controls["x"].value == pytest.approx(36.0)
    assert panel.set("x", "48 in") is True and panel.sheet["h"].to("in").magnitude == pytest.approx(36.0, rel=1e-12)  # 3-4-5


def test_every_axial_load_in_the_post_range_evaluates() -> None:
    """P is stated "0 to 200 kip". At 200 kip the plate's bearing up to the rod line,
    q_max (f + N/2) = (0.85·3 ksi/2.31)·10 in·8.75 in = 96.6 kip (AISC 360-16 J8, ASD), is
    exceeded, so the bearing check is NG, at least P/(q_max·N) = 1.81 by vertical equilibrium
    over the 10 in plate (statics), and the rod tension is not negative. This was once an error
    (square root of a negative rod tension in the tension-side plate step)."""
    panel = post_panel()
    for value in ("0 kip", "50 kip", "100 kip", "150 kip", "200 kip"):
        assert panel.set("P", value) is True, panel.last_error
    q_max = 0.85 * 3 / 2.31 * 10
    bearing = next(c for c in panel.sheet.summary() if c.key == "ratio_fp_plate")
    assert bearing.status == "NG" and bearing.ratio >= 200 / (q_max * 10)
    assert panel.sheet["T_a_plate"].to("kip").magnitude >= 0.0 and math.isfinite(panel.sheet["t_req_plate"].to("in").magnitude)


def test_labels_are_words_with_the_symbol_and_units_follow_the_parameter() -> None:
    panel = leg_panel()
    assert panel._inputs["P"].label == "Lateral load at the top of the leg, service level (ASD) (P)"
    assert panel._inputs["D_o"].label.endswith("(D_o)")
    slider = panel.controls["L"]
    assert type(slider).__name__ == "FloatSlider" and slider.value == 42.0  # in, the default's unit
    assert slider.max == pytest.approx(360.0)  # 30 ft in inches (the stated range)


def test_section_and_grade_controls_are_catalog_choices_of_the_family() -> None:
    from calcpad.eng.sections.catalog import designations

    panel = post_panel()
    post = panel.controls["post"]
    assert type(post).__name__ == "Dropdown" and post.value == "HSS4x4x1/4"
    assert set(post.options) == set(designations("hss_square"))
    grades = list(panel.controls["grade"].options)
    assert "A500 Gr C" == grades[0] and "ASTM A36" in grades
    assert not any("Aluminum" in g or "Stainless" in g for g in grades)
    assert panel.set("post", "HSS5x5x1/4") is True
    assert "HSS5x5x1/4" in panel.sheet.title
    assert panel.set("post", "HSS4x4x9") is False and "HSS5x5x1/4" in panel.sheet.title


# ----------------------------------------------------------------------------- redraw in place


def test_only_the_changed_rows_are_reprinted() -> None:
    panel = leg_panel(show="sheet")
    view = panel._view
    printed = view.printed
    outs_before = [o.outputs for o in panel._sheet_outs]
    assert panel.set("P", "300 lbf") is True
    steps = [getattr(s, "name", getattr(s, "key", None)) for s in panel.sheet.evaluate().steps]
    changed = {i for i, o in enumerate(panel._sheet_outs) if o.outputs is not outs_before[i]}
    # P feeds M_1 = P*L, M_r2 = B1*M_nt + B2*M_1, sigma_b = N_ax/A + M_r2*c/I and the check;
    # nothing else (B1, B2 and their stability checks depend on N_ax, L and the section, not on P;
    # the title is position 0)
    assert {steps[i - 1] for i in changed} == {"P", "M_1", "M_r2", "sigma_b", LEG_CHECK}
    assert view.printed - printed == 5
    sheet_row = panel._sheet_outs[1 + steps.index(LEG_CHECK)].outputs[0]["data"]["text/plain"]
    summary = panel._out.outputs[0]["data"]["text/plain"]
    summary_row = next(line for line in summary.splitlines() if "Combined stress vs yield" in line)
    assert "NG" in sheet_row and "NG" in summary_row  # one check, one status (ratio 1.95 > 1 by hand)
    assert leg_check(panel).ratio == pytest.approx(leg_ratio(P=300.0), rel=1e-9) and leg_ratio(P=300.0) > 1.0


def test_live_display_is_updated_in_place(monkeypatch: pytest.MonkeyPatch) -> None:
    """With an IPython shell, the sheet shown by show() (one output per section) gets
    update_display only for the sections whose steps changed, and the summary is redrawn."""
    import IPython.display as ipd

    shown: list[tuple[str, str]] = []
    updated: list[tuple[str, str]] = []
    sh = TemplateSession("leg_bending").build()[0]
    monkeypatch.setattr(live, "_shell", lambda: None if live._QUIET[0] else object())
    monkeypatch.setattr(ipd, "display", lambda b, raw, display_id: shown.append((display_id, b.get("text/plain", ""))))
    monkeypatch.setattr(ipd, "update_display", lambda b, raw, display_id: updated.append((display_id, b.get("text/plain", ""))))
    live.show(sh)
    live.show_summary(sh)
    headings = [s for s in sh.steps if type(s).__name__ == "Heading" and s.level == 1]  # a level-2 heading stays in its section
    assert len(shown) == 1 + len(headings) + 1  # title, one per section, the summary
    section_ids = {text.split("\n")[1]: did for did, text in shown[1:-1]}  # section heading line -> display id
    panel = what_if(sh, template="leg_bending", bind=LEG_BIND)
    updated.clear()
    assert panel.set("P", "300 lbf") is True
    sections = [u for u in updated if "summary" not in u[0]]
    # P is in "Inputs"; M_1 and M_r2 in "Demand" (with its second-order subsection); sigma_b and
    # the check in "Check"; "Section properties" is untouched
    assert {did for did, _ in sections} == {section_ids["INPUTS"], section_ids["DEMAND"], section_ids["CHECK"]}
    assert any("P = 300 lbf" in text for _, text in sections)
    assert not any("SECTION PROPERTIES" in text or "Outside diameter" in text for _, text in sections)
    summary = [u[1] for u in updated if "summary" in u[0]]
    assert summary and "NG" in summary[-1]


def test_sections_are_merged_to_fit_the_slots() -> None:
    sh = TemplateSession("post_combined").build()[0]
    view = live.SheetView(sh)
    view.update()
    for slots in (3, 40):
        groups = view.groups(slots)
        assert len(groups) == slots
        covered = [i for a, b in groups for i in range(a, b)]
        assert covered == list(range(len(sh.steps) + 1))  # every step once, in order (title first)


# ----------------------------------------------------------------------------- sensitivity


def test_sensitivity_matches_finite_differences_of_scalar_evaluation() -> None:
    panel = post_panel()
    sens = panel.sensitivity()
    sh = panel.sheet
    h = 1e-3
    for name in ("P_top", "H_top", "L_post"):
        x0 = sh[name]
        for sign, store in ((1, "up"), (-1, "down")):
            sh.set(**{name: x0 * (1 + sign * h)})
            r = {c.key: c.ratio for c in sh.summary()}
            if store == "up":
                up = r
            else:
                down = r
        sh.set(**{name: x0})
        for key, row in sens.table.items():
            if up[key] > 0 and down[key] > 0:
                fd = (math.log(up[key]) - math.log(down[key])) / (math.log1p(h) - math.log1p(-h))
                assert row[name] == pytest.approx(fd, rel=1e-4, abs=1e-6), (key, name)


def test_sensitivity_of_the_leg_is_one_for_p_and_l_and_minus_one_for_fy() -> None:
    panel = leg_panel()
    row = panel.sensitivity().table[LEG_CHECK]
    assert row["P"] == pytest.approx(1.0, rel=1e-7)
    assert row["L"] == pytest.approx(1.0, rel=1e-7)
    assert row["F_y"] == pytest.approx(-1.0, rel=1e-7)
    gov = panel.sensitivity().of_governing()
    mags = [abs(v) for _, v in gov]
    # the bound inputs only: D_o, t and the leg re-run the template and are not differentiated
    assert mags == sorted(mags, reverse=True) and {n for n, _ in gov} == set(LEG_BIND)


def test_sensitivity_figure_is_a_sorted_bar_chart() -> None:
    from calcpad.widgets.explore import sensitivity_figure

    panel = leg_panel()
    fig = sensitivity_figure(panel.sensitivity())
    bars = fig.axes[0].patches
    widths = [b.get_width() for b in bars]
    # one bar per bound input (P, L, F_y); elasticities 1, 1, -1 in closed form
    assert sorted(widths) == pytest.approx([-1.0, 1.0, 1.0], rel=1e-7)
    # sorting by magnitude, where the magnitudes differ: the post's governing check
    post = post_panel()
    sens = post.sensitivity()
    bars = sensitivity_figure(sens).axes[0].patches
    widths = [abs(b.get_width()) for b in bars]
    row = sens.table[sens.governing]
    assert widths == sorted(widths) and len(bars) == sum(v is not None for v in row.values()) >= 3
    assert len({round(w, 6) for w in widths}) > 1


# ----------------------------------------------------------------------------- what would it take


def bisect(f, a: float, b: float, tol: float = 1e-10) -> float:
    fa = f(a)
    for _ in range(200):
        m = (a + b) / 2
        fm = f(m)
        if (fm > 0) == (fa > 0):
            a, fa = m, fm
        else:
            b = m
        if b - a < tol * max(1.0, abs(b)):
            break
    return (a + b) / 2


def test_what_would_it_take_matches_a_scalar_bisection() -> None:
    panel = leg_panel()
    ans = panel.what_would_it_take("P")
    assert ans.status == "value"
    p_lim = bisect(lambda P: leg_ratio(P=P) - 1.0, 1e-6, 20_000.0)
    assert ans.value.to("lbf").magnitude == pytest.approx(p_lim, rel=1e-8)
    ans_l = panel.what_would_it_take("L")
    assert ans_l.value.to("in").magnitude == pytest.approx(bisect(lambda L: leg_ratio(L=L) - 1.0, 6.0, 360.0), rel=1e-8)


def test_what_would_it_take_on_the_post_uses_the_governing_check() -> None:
    panel = post_panel()
    ans = panel.what_would_it_take("H")
    sh = panel.sheet

    def gov(H_kip: float) -> float:
        sh.set(H_top=f"{H_kip!r} kip")
        return max(c.ratio / c.limit for c in sh.summary()) - 1.0

    assert gov(0.45) < 0 < gov(1.0)  # bracket checked by scalar evaluation
    h_lim = bisect(gov, 0.45, 1.0, tol=1e-9)
    sh.set(H_top="0.45 kip")
    assert ans.value.to("kip").magnitude == pytest.approx(h_lim, rel=1e-6)


def test_whole_range_passes_or_nothing_passes() -> None:
    sh = Sheet("Leg")
    sh.given("P", "85 lbf", "Load", min="500 lbf", max="1000 lbf")
    sh.given("L", "42 in", "Length")
    sh.given("S", "0.3 in^3", "Section modulus")
    sh.given("F_y", "35 ksi", "Yield", min="30 ksi", max="60 ksi")
    sh.step("sigma", "P*L/S", "Stress", unit="ksi")
    sh.check("Stress", demand="sigma", capacity="F_y")
    panel = what_if(sh)
    assert panel.what_would_it_take("F_y").status == "passes"  # 85·42/0.3 = 11.9 ksi < 30 ksi
    assert "whole range" in panel.what_would_it_take("F_y").message
    panel.set("F_y", "35 ksi")
    assert panel.what_would_it_take("P").status == "fails"  # 500·42/0.3 = 70 ksi > 35 ksi
    assert "nothing in range passes" in panel.what_would_it_take("P").message


def test_lightest_section_passes_and_every_lighter_one_fails() -> None:
    from calcpad.core.errors import CalcpadError

    panel = post_panel()
    ans = panel.what_would_it_take("post")
    assert ans.status == "value" and ans.designation == ans.tried[-1]
    session = panel.session
    for d in ans.tried:
        try:
            sheet = session.build({**session.values, "post": d})[0]
            ok = sheet.evaluate().ok
        except CalcpadError:
            ok = False
        assert ok is (d == ans.designation), d
    from calcpad.eng.sections.catalog import section_table

    table = section_table("hss_square").set_index("designation")["weight"]
    assert list(table[ans.tried]) == sorted(table[ans.tried])


# ----------------------------------------------------------------------------- export


JOB_HEAD = """\
[job]
number = "KB-0107"
title = "Loading dock canopy"
client = "Kestrel Bay Fabrication"
site = "Northfield"
engineer = "A. Engineer"
checker = ""
revision = "A"
date = 2026-12-03
codes = ["AISC 360-16"]
units = "US"

"""


@pytest.mark.parametrize("which", ["leg", "post"])
def test_exported_block_runs_through_the_job_loader_and_reproduces_the_ratios(which: str) -> None:
    if which == "leg":
        panel = leg_panel()
        assert panel.set("P", "140 lbf") is True
        assert panel.set("leg", "custom") is True  # D_o and t apply to a custom leg only
        assert panel.set("t", "0.2 in") is True
        assert leg_check(panel).ratio == pytest.approx(leg_ratio(P=140.0, t=0.2), rel=1e-9)
    else:
        panel = post_panel()
        panel.set("post", "HSS5x5x3/16")
        panel.set("H", "0.7 kip")
        panel.set("plate_t", "1 in")
    text = panel.to_job(member="C3")
    job = parse_job(JOB_HEAD + text, "exported.toml")
    outcome = run_calc_inprocess(job.calcs[0])
    assert outcome.error is None
    recs = [s["record"] for s in outcome.sheets]
    rec = next(r for r in recs if r["title"].removeprefix("C3 - ") == panel.sheet.title)  # the job run names the member
    got = {c["title"]: c["ratio"] for c in rec["checks"]}
    assert got.keys() == panel.ratios.keys()
    for title, ratio in panel.ratios.items():
        assert got[title] == pytest.approx(ratio, rel=1e-12)


def test_bind_refuses_a_given_that_the_parameter_does_not_set() -> None:
    from calcpad.core.errors import SheetError

    sh = TemplateSession("leg_bending").build()[0]
    with pytest.raises(SheetError, match=r"bind 'P' -> 'L'.*differ"):
        what_if(sh, template="leg_bending", bind={"P": "L"})


def test_an_unbound_parameter_re_runs_the_template() -> None:
    panel = leg_panel()
    runs = panel.session.runs
    assert panel.set("FS_req", 2.0) is True  # FS_req goes into the check, not into a given
    assert panel.session.runs == runs + 1
    assert leg_check(panel).ratio == pytest.approx(leg_ratio(FS=2.0), rel=1e-9)


def test_the_leg_dropdown_offers_custom_dimensions() -> None:
    """leg_bending's leg parameter says "... or custom for D_o and t": the dropdown lists
    "custom", and choosing it in the control makes the sheet use D_o and t (hand ratio, module
    docstring) while the catalog sizes stay listed."""
    from calcpad.eng.sections.catalog import designations

    panel = leg_panel()
    leg = panel.controls["leg"]
    assert "custom" in leg.options and set(designations("pipe")) <= set(leg.options)
    assert panel.set("D_o", "2.375 in") is True and panel.set("t", "0.154 in") is True  # used by a custom leg only
    assert leg_check(panel).ratio == pytest.approx(leg_ratio(), rel=1e-9)  # still Pipe 1-1/2 Std
    leg.value = "custom"  # as a user picks it
    assert panel.last_error is None and panel.session.values["leg"] == "custom"
    assert leg_check(panel).ratio == pytest.approx(leg_ratio(D_o=2.375, t=0.154), rel=1e-9)
    ans = panel.what_would_it_take("leg")  # the family is the dropdown's, though the value is custom
    assert ans.status == "value" and ans.designation in designations("pipe")
    post = post_panel()
    assert "custom" not in post.controls["post"].options  # post_combined takes catalog sections only


def test_a_section_change_redraws_only_rows_that_print_differently(monkeypatch: pytest.MonkeyPatch) -> None:
    """A section re-runs the template; the new sheet goes through the same in-place path: rows
    that print as before (the loads, the base moment) are neither printed again nor redrawn, and
    what is shown equals a print of the new sheet from scratch."""
    import IPython.display as ipd

    updated: list[str] = []
    monkeypatch.setattr(live, "_shell", lambda: None if live._QUIET[0] else object())
    monkeypatch.setattr(ipd, "display", lambda b, raw, display_id: None)
    monkeypatch.setattr(ipd, "update_display", lambda b, raw, display_id: updated.append(display_id))
    sh = TemplateSession("post_combined").build()[0]
    live.show(sh)
    view = live.view_for(sh)
    live.show_summary(sh)
    panel = what_if(sh, template="post_combined", bind=POST_BIND, show="sheet")
    names = [getattr(s, "name", getattr(s, "key", None)) for s in sh.evaluate().steps]
    before = {n: view._bundles[1 + i] for i, n in enumerate(names) if n}
    printed, n_steps = view.printed, len(names)
    updated.clear()
    assert panel.set("post", "HSS5x5x1/4") is True and "HSS5x5x1/4" in panel.sheet.title
    assert live.view_for(panel.sheet) is view  # the display moved to the new sheet
    new_names = [getattr(s, "name", getattr(s, "key", None)) for s in panel.sheet.evaluate().steps]
    after = {n: view._bundles[1 + i] for i, n in enumerate(new_names) if n}
    for same in ("P_top", "H_top", "L_post", "M_base", "V_base"):  # independent of the section
        assert after[same] is before[same], same
    assert after["A"] is not before["A"]  # the section's area changed (HSS4x4x1/4 -> HSS5x5x1/4)
    assert 0 < view.printed - printed < n_steps
    fresh = live.SheetView(panel.sheet)
    assert fresh.bundles() == view.bundles()  # what is shown is what a full print gives
    assert [o.outputs[0]["data"] for o in panel._sheet_outs] == fresh.bundles()  # the panel's copy too
    assert updated  # sections with changed rows were redrawn in place


def test_print_key_tells_apart_what_prints_differently() -> None:
    from calcpad.core.units import Q_

    assert live.print_key(Q_(1.0, "in")) == live.print_key(Q_(1.0, "in"))
    assert live.print_key(Q_(1.0, "in")) != live.print_key(Q_(25.4, "mm"))  # equal lengths, printed differently
    assert live.print_key(Q_(2.0, "kip*ft")) != live.print_key(Q_(2.0, "ft*kip"))  # unit order prints
    assert live.print_key(Q_(2.0, "in")) != live.print_key(Q_(2.0000001, "in"))


def test_anchor_rods_must_sit_on_the_plate() -> None:
    """post_combined states rod_f as "1 in <= rod_f < plate_N/2" (rods on the 10 in plate, common
    practice); the bound follows the plate's current length."""
    panel = post_panel()
    assert panel.set("rod_f", "6 in") is False and "plate_N/2" in panel.last_error
    assert panel.set("plate_N", "14 in") is True
    assert panel.set("rod_f", "6 in") is True and panel.sheet["f_a_plate"].to("in").magnitude == 6.0
