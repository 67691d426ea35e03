"""Frame results, drawings and deflection checks in a sheet."""

from __future__ import annotations

import pytest

from calcpad.core.errors import InputError
from calcpad.core.units import Q_
from calcpad.eng.analysis import serviceability as sv
from calcpad.eng.analysis.beams import Beam, PointLoad, UniformLoad
from calcpad.eng.analysis.diagrams import draw_frame, draw_frame_diagram, plot_beam, plot_member
from calcpad.eng.analysis.frame import Frame, add_frame_results

sheet = pytest.importorskip("calcpad.core.sheet")

E, A, I = 29000.0, 2.0, 3.0  # ksi, in^2, in^4 (invented)


def _cantilever(L: float = 48.0, P: float = 0.2) -> Frame:
    fr = Frame("kip", "in")
    fr.node("base", 0, 0)
    fr.node("top", 0, L)
    fr.member("leg", "base", "top", E=E, A=A, I=I)
    fr.support("base", "fixed")
    fr.node_load("W", "top", Fx=P)
    fr.node_load("D", "top", Fy=-0.5)
    fr.combination("D+0.6W", {"D": 1.0, "W": 0.6})
    return fr


def test_frame_results_in_sheet() -> None:
    res = _cantilever().solve()
    sh = sheet.Sheet("Leg", system="US")
    add_frame_results(sh, res, ["W", "D+0.6W"], figure_case="D+0.6W")
    kinds = [type(s).__name__ for s in sh.steps]
    assert kinds.count("Table") == 2 and kinds.count("Figure") == 2
    tables = [s for s in sh.steps if type(s).__name__ == "Table"]
    assert len(tables[0].rows) == 2  # one support x two cases
    sh.evaluate()


def test_leg_sway_check_h_over_100() -> None:
    # cantilever leg sway PL^3/(3EI) (AISC Manual 15th ed. Table 3-23 case 22, from memory) vs H/100
    L, P = 48.0, 0.2
    res = _cantilever(L, P).solve()
    ux = res.displacement("top", "W")[0]
    assert ux.magnitude == pytest.approx(P * L**3 / (3 * E * I), rel=1e-9)
    sh = sheet.Sheet("Sway", system="US")
    sv.add_result_given(sh, "Delta_top", ux, "Top sway under W")
    sh.given("H", Q_(L, "in"), "Leg height")
    sv.add_deflection_check(sh, "Delta_top", "H", "H/100")
    sh.evaluate()
    chk = sh.summary()[0]
    assert chk.ratio == pytest.approx(ux.magnitude / (L / 100), rel=1e-3)  # given rounded to 4 figures
    assert chk.ok == (ux.magnitude <= L / 100)


def test_deflection_limits() -> None:
    assert sv.limit_ratio("L/360")[0] == 360.0
    assert sv.limit_ratio("L/500") == (500.0, "user-chosen limit")
    assert sv.limit_ratio(600)[0] == 600.0
    assert sv.deflection_ratio("0.5 in", "10 ft", "L/240") == pytest.approx(1.0)
    with pytest.raises(InputError, match="deflection limit"):
        sv.limit_ratio("span over 3")
    with pytest.raises(InputError, match="deflection limit"):
        sv.limit_ratio(-3)


def test_deflection_check_with_values() -> None:
    sh = sheet.Sheet("Beam", system="US")
    sv.add_deflection_check(sh, Q_(0.9, "in"), "20 ft", "L/360", suffix="_b")
    sh.evaluate()
    chk = sh.summary()[0]
    assert chk.ratio == pytest.approx(0.9 / (240 / 360))
    assert not chk.ok


def test_drawings_are_figures() -> None:
    fr = _cantilever()
    res = fr.solve()
    for fig in (
        draw_frame(fr, res, "D+0.6W"),
        draw_frame(fr),
        draw_frame_diagram(res, "W", "V"),
        plot_member(res, "leg", "W"),
        plot_beam(Beam(100.0, [(0, "pin"), (80, "roller")], [UniformLoad(0.01), PointLoad(0.5, 100)], E=E, I=I).solve()),
    ):
        assert fig.axes and hasattr(fig, "savefig")
    with pytest.raises(InputError, match="case"):
        draw_frame(fr, None, "S")
    with pytest.raises(InputError, match="quantity"):
        draw_frame_diagram(res, "W", "T")
