"""Frame results, drawings and deflection checks in a sheet."""

from __future__ import annotations

import numpy as np
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


def _portal() -> Frame:
    # a pinned-base portal with a knee-braced beam load (invented numbers): moments on posts and beam
    fr = Frame("kip", "in")
    for name, x, y in (("A", 0, 0), ("B", 0, 90), ("C", 144, 90), ("D", 144, 0)):
        fr.node(name, x, y)
    for name, i, j in (("post L", "A", "B"), ("beam", "B", "C"), ("post R", "D", "C")):
        fr.member(name, i, j, E=E, A=A, I=I)
    fr.support("A", "fixed")
    fr.support("D", "fixed")
    fr.member_load("W", "beam", -0.01)
    fr.node_load("W", "B", Fx=0.6)
    return fr


def test_diagram_values_stand_clear_of_the_members() -> None:
    # every value printed on an M diagram lies off every member line (the line once ran through a digit)
    from matplotlib.transforms import Bbox

    res = _portal().solve()
    fig = draw_frame_diagram(res, "W", "M")
    fig.canvas.draw()
    renderer = fig.canvas.get_renderer()
    ax = fig.axes[0]
    labels = [t for t in ax.texts if t.get_text()]
    assert len(labels) >= 4
    lines = [ax.transData.transform(np.array([res.frame.nodes[m.i], res.frame.nodes[m.j]])) for m in res.frame.members.values()]
    for t in labels:
        box = t.get_window_extent(renderer).shrunk(0.9, 0.9)
        for (x1, y1), (x2, y2) in lines:
            pts = np.linspace([x1, y1], [x2, y2], 400)
            inside = (pts[:, 0] > box.x0) & (pts[:, 0] < box.x1) & (pts[:, 1] > box.y0) & (pts[:, 1] < box.y1)
            assert not inside.any(), (t.get_text(), Bbox.from_extents(box.x0, box.y0, box.x1, box.y1))
