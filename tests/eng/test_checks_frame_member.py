"""Member checks fed by the frame solver.

Oracle: statics of a fixed-base cantilever post (common practice): axial force = the vertical
load, base moment = H*L, shear = H. The governing case must be the one whose forces, checked
directly with check_member, give the highest ratio.
"""

from __future__ import annotations

import pytest

from calcpad import Sheet
from calcpad.core.errors import CalcpadError
from calcpad.eng.analysis.frame import Frame
from calcpad.eng.checks import check_frame_member, check_member, frame_member_forces
from calcpad.eng.sections import get_section

HSS = get_section("HSS4x4x1/4")
H_KIP, D_KIP, L_IN = 0.8, 5.0, 120.0


def _post(uplift: bool = False):
    fr = Frame("kip", "in")
    fr.node("A", 0, 0)
    fr.node("B", 0, L_IN)
    fr.member("AB", "A", "B", E="29000 ksi", A="3.37 in^2", I="7.80 in^4")
    fr.support("A", "fixed")
    fr.node_load("D", "B", Fy=f"{D_KIP if uplift else -D_KIP} kip")
    fr.node_load("W", "B", Fx=f"{H_KIP} kip")
    fr.node_load("none", "B")
    fr.combination("D+W", {"D": 1.0, "W": 1.0})
    fr.combination("D+0.6W", {"D": 1.0, "W": 0.6})
    return fr.solve()


def test_forces_match_cantilever_statics():
    f = frame_member_forces(_post(), "AB", "D+W")
    assert f.P.to("kip").magnitude == pytest.approx(D_KIP, rel=1e-9)  # compression +
    assert abs(f.M.to("kip*in").magnitude) == pytest.approx(H_KIP * L_IN, rel=1e-9)
    assert abs(f.V.to("kip").magnitude) == pytest.approx(H_KIP, rel=1e-9)
    assert f.x_M.to("in").magnitude == pytest.approx(0.0, abs=1e-9)  # at the fixed base


def test_governing_case_is_the_highest_direct_ratio():
    sh = Sheet("post", method="ASD")
    out = check_frame_member(sh, _post(), "AB", HSS, L="10 ft", K=2.1, F_y="50 ksi")
    direct = {}
    for case, (p, h) in {"D": (D_KIP, 0.0), "W": (0.0, H_KIP), "D+W": (D_KIP, H_KIP), "D+0.6W": (D_KIP, 0.6 * H_KIP)}.items():
        s = Sheet("direct", method="ASD")
        r = check_member(s, HSS, L="10 ft", K=2.1, F_y="50 ksi", P=f"{p} kip", M_x=f"{h * L_IN} kip*in", V=f"{h} kip")
        direct[case] = r.governing_ratio
    assert max(direct, key=direct.get) == "D+W"
    assert out.governing_ratio == pytest.approx(direct["D+W"], rel=1e-9)
    assert sh["P_fr"].to("kip").magnitude == pytest.approx(D_KIP)


def test_uplift_gives_a_tension_check():
    sh = Sheet("post", method="LRFD")
    out = check_frame_member(sh, _post(uplift=True), "AB", HSS, L="10 ft", F_y="50 ksi", F_u="62 ksi", cases=["D+W"])
    assert "tension" in out.keys and "compression" not in out.keys
    assert sh["P_fr"].to("kip").magnitude == pytest.approx(-D_KIP)


def test_a_case_without_force_is_listed_not_checked():
    sh = Sheet("post")
    out = check_frame_member(sh, _post(), "AB", HSS, L="10 ft", F_y="50 ksi", cases=["none", "W"])
    assert out.governing == "flexure x"
    with pytest.raises(CalcpadError, match="carries force"):
        check_frame_member(Sheet("x"), _post(), "AB", HSS, L="10 ft", F_y="50 ksi", cases=["none"])


@pytest.mark.parametrize(("kwargs", "field"), [({"P": "1 kip"}, "P"), ({"cases": []}, "cases")])
def test_bad_options_are_refused(kwargs, field):
    with pytest.raises(CalcpadError) as err:
        check_frame_member(Sheet("x"), _post(), "AB", HSS, L="10 ft", F_y="50 ksi", **kwargs)
    assert err.value.field == field


def test_unknown_member_names_the_choices():
    with pytest.raises(CalcpadError, match="AB"):
        check_frame_member(Sheet("x"), _post(), "CD", HSS, L="10 ft", F_y="50 ksi")


def test_several_members_the_worst_is_written():
    # Two free-standing posts, the second with half the lateral load: statics says the first governs.
    fr = Frame("kip", "in")
    for a, b, x in (("A", "B", 0.0), ("C", "D", 60.0)):
        fr.node(a, x, 0)
        fr.node(b, x, L_IN)
        fr.member(a + b, a, b, E="29000 ksi", A="3.37 in^2", I="7.80 in^4")
        fr.support(a, "fixed")
    fr.node_load("W", "B", Fx=f"{H_KIP} kip")
    fr.node_load("W", "D", Fx=f"{H_KIP / 2} kip")
    sh = Sheet("posts")
    out = check_frame_member(sh, fr.solve(), ["CD", "AB"], HSS, L="10 ft", F_y="50 ksi")
    assert abs(sh["M_fr"].to("kip*in").magnitude) == pytest.approx(H_KIP * L_IN, rel=1e-9)
    assert out.governing == "flexure x"
    assert any("Member AB" in getattr(s, "text", "") for s in sh.steps)


def test_sway_amplifier_multiplies_p_and_m_of_every_case():
    """AISC 360-16 Eqs. A-8-1, A-8-2 with all forces treated as lateral-translation effects:
    M_r = B2·H·L, P_r = B2·P (statics of the cantilever)."""
    sh = Sheet("post", method="ASD")
    sh.given("B2", 1.25)
    check_frame_member(sh, _post(), "AB", HSS, L="120 in", K=2.1, cases=["D+W"], B2="B2", F_y="50 ksi")
    assert abs(sh["M_fr2"].to("kip*in").magnitude) == pytest.approx(1.25 * H_KIP * L_IN, rel=1e-9)
    assert sh["P_fr2"].to("kip").magnitude == pytest.approx(1.25 * D_KIP, rel=1e-9)
    with pytest.raises(CalcpadError, match="B2"):
        check_frame_member(Sheet("x"), _post(), "AB", HSS, L="120 in", B2=0.9, F_y="50 ksi")


def test_every_case_row_matches_its_own_direct_check():
    # The per-case checks reuse one scratch sheet per pattern of force signs (values set, not
    # rebuilt): each row must still equal check_member run on a fresh sheet with that case's
    # forces (the governing-case oracle above, for every case), so no case shows another's result.
    fr = Frame("kip", "in")
    fr.node("A", 0, 0)
    fr.node("B", 0, L_IN)
    fr.member("AB", "A", "B", E="29000 ksi", A="3.37 in^2", I="7.80 in^4")
    fr.support("A", "fixed")
    fr.node_load("D", "B", Fy=f"{-D_KIP} kip")
    fr.node_load("W", "B", Fx=f"{H_KIP} kip", Fy=f"{2.5 * D_KIP} kip")  # wind with uplift: some cases in tension
    factors = {"C1": (1.0, 0.3), "C2": (1.0, 0.6), "C3": (1.0, 1.0), "C4": (0.6, 0.6), "C5": (0.6, 1.0), "C6": (0.9, 1.6), "C7": (1.2, 0.5)}
    for name, (d, w) in factors.items():
        fr.combination(name, {"D": d, "W": w})
    res = fr.solve()
    sh = Sheet("post", method="ASD")
    check_frame_member(sh, res, "AB", HSS, L="10 ft", K=2.1, F_y="50 ksi", F_u="62 ksi", cases=list(factors))
    table = next(s for s in sh.evaluate().steps if getattr(s, "title", "").startswith("Governing ratio per case"))
    signs = set()
    for row in table.rows:
        f = frame_member_forces(res, "AB", row[1])
        signs.add(f.P.magnitude > 0)
        direct = check_member(Sheet("direct", method="ASD"), HSS, L="10 ft", K=2.1, F_y="50 ksi", F_u="62 ksi", P=f.P, M_x=f.M, V=f.V,
                              table=False)
        assert (row[5], row[6]) == (f"{direct.governing_ratio:.3f}", direct.governing), row[1]
    assert signs == {True, False}  # both compression and tension cases were checked
    assert len({row[5] for row in table.rows}) == len(factors)  # every case its own ratio


def _table_ratios(sh: Sheet) -> dict[str, str]:
    table = next(s for s in sh.evaluate().steps if getattr(s, "title", "").startswith("Governing ratio per case"))
    return {row[1]: row[5] for row in table.rows}


def test_scratch_sheets_kept_between_calls_give_each_call_its_own_ratios():
    """A second call on the same section re-evaluates kept scratch sheets (or repeats the kept
    answer for the same forces): every case's ratio is the direct check_member ratio of that call's
    forces; a changed yield stress is not served from a sheet or answer kept for another (nothing
    kept is ever stale)."""
    from calcpad.eng.checks import frame_member

    frame_member._KEPT.clear()
    frame_member._ANSWERS.clear()
    check_frame_member(Sheet("first", method="ASD"), _post(), "AB", HSS, L="10 ft", K=2.1, F_y="50 ksi")
    assert frame_member._KEPT  # the sign patterns of this member are kept
    for fy in ("50 ksi", "46 ksi"):
        sh = Sheet("second", method="ASD")
        check_frame_member(sh, _post(), "AB", HSS, L="10 ft", K=2.1, F_y=fy)
        for case, (p, h) in {"D": (D_KIP, 0.0), "W": (0.0, H_KIP), "D+W": (D_KIP, H_KIP)}.items():
            s = Sheet("direct", method="ASD")
            r = check_member(s, HSS, L="10 ft", K=2.1, F_y=fy, P=f"{p} kip", M_x=f"{h * L_IN} kip*in", V=f"{h} kip")
            assert _table_ratios(sh)[case] == f"{r.governing_ratio:.3f}", (fy, case)


def _direct(P, M, V):
    r = check_member(Sheet("direct", method="ASD"), HSS, L="10 ft", K=2.1, F_y="50 ksi", P=P, M_x=M, V=V, table=False)
    return r.governing, r.governing_ratio


def test_many_cases_of_one_sign_pattern_on_the_compiled_sheet_match_direct_checks():
    """Cases of one force-sign pattern are evaluated at once on the compiled scratch sheet. Each
    answer must be the direct check_member one (limit state, ratio to 3 decimals); where the
    compiled numbers sit on a decision (P_r/P_c = 0.2, the switch between AISC 360-16 Eqs. H1-1a
    and H1-1b, or a ratio at a rounding of its 3 decimals) the scalar sheet answers."""
    from calcpad import Q_
    from calcpad.core.compiled import CompiledSheet
    from calcpad.eng.checks import frame_member

    frame_member._KEPT.clear()
    frame_member._ANSWERS.clear()
    s = Sheet("direct", method="ASD")
    check_member(s, HSS, L="10 ft", K=2.1, F_y="50 ksi", P="5 kip", M_x="96 kip*in", V="0.8 kip", table=False)
    p_c, m_c = s["P_c"].to("kip").magnitude, s["M_c"].to("kip*in").magnitude
    at_h1 = (Q_(0.2 * p_c, "kip"), Q_(0.5 * m_c, "kip*in"), Q_(0.4, "kip"))  # P_r/P_c = 0.2 (to the last digit)
    cases = [at_h1] + [(Q_(p, "kip"), Q_(m, "kip*in"), Q_(0.3, "kip")) for p, m in
                       ((1.0, 20.0), (2.0, 35.0), (4.0, 50.0), (5.0, 96.0), (6.5, 80.0), (3.3, 12.0), (7.0, 5.0))]
    scratches = frame_member._Scratches(Sheet("post", method="ASD"), HSS, "10 ft", {"K": 2.1, "F_y": "50 ksi"})
    answers = scratches.check_all(cases)
    assert isinstance(scratches.sheets[(1, 1, 1)].compiled, CompiledSheet)  # the compiled sheet was used
    for (P, M, V), (name, ratio) in zip(cases, answers, strict=True):
        d_name, d_ratio = _direct(P, M, V)
        assert (name, f"{ratio:.3f}") == (d_name, f"{d_ratio:.3f}"), (P, M)
        assert ratio == pytest.approx(d_ratio, rel=1e-12)
    compiled = scratches.sheets[(1, 1, 1)].compiled
    out = scratches.sheets[(1, 1, 1)].out
    name, ratio = _direct(*cases[4])
    assert name == "interaction"  # H1-1a: every ratio in proportion to P and M
    scale = (round(ratio, 3) + 0.0005) / ratio  # the governing ratio moved onto x.xxx5
    on_rounding = (cases[4][0] * scale, cases[4][1] * scale, cases[4][2])
    trusted = scratches._trusted(compiled, out, [at_h1, cases[1], on_rounding])
    assert trusted[0] is None and trusted[2] is None  # on a decision: left to the scalar sheet
    assert trusted[1] is not None and trusted[1][0] == _direct(*cases[1])[0]
