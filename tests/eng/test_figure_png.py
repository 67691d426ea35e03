"""Figures saved once per distinct drawing (``core.figure_png``, ``diagrams.drawing_png``): the bytes
are always those matplotlib writes for the figure as it is now — a changed frame, a figure changed
after it was drawn, or other matplotlib settings never get a PNG kept from before.

The reference is matplotlib's own ``savefig`` on a figure built afresh (no cache involved).
"""

from __future__ import annotations

import io

import matplotlib
import pytest

from calcpad import Sheet
from calcpad.core import figure_png
from calcpad.core.errors import InputError
from calcpad.eng.analysis.diagrams import draw_frame, draw_frame_diagram, drawing_png, plot_member
from calcpad.eng.analysis.frame import Frame


def _saved(fig, dpi: int = 110) -> bytes:
    buf = io.BytesIO()
    fig.savefig(buf, format="png", dpi=dpi, metadata={"Software": None})
    return buf.getvalue()


def _portal(push: float = 1.0):
    fr = Frame("kip", "in")
    for n, x, y in (("A", 0, 0), ("B", 0, 120), ("C", 144, 120), ("D", 144, 0)):
        fr.node(n, x, y)
    for name, i, j in (("c1", "A", "B"), ("bm", "B", "C"), ("c2", "D", "C")):
        fr.member(name, i, j, E="29000 ksi", A="5 in^2", I="50 in^4")
    fr.support("A", "fixed")
    fr.support("D", "fixed")
    fr.node_load("W", "B", Fx=push)
    return fr, fr.solve()


@pytest.fixture(autouse=True)
def _empty_cache():
    figure_png._PNG.clear()
    yield
    figure_png._PNG.clear()


def test_drawing_png_is_what_matplotlib_saves_for_the_figure():
    fr, res = _portal()
    first = drawing_png(draw_frame, fr, res, "W")
    assert first == _saved(draw_frame(fr, res, "W"))
    assert drawing_png(draw_frame, fr, res, "W") == first  # the second time from the kept PNG
    assert drawing_png(draw_frame_diagram, res, "W", "M") == _saved(draw_frame_diagram(res, "W", "M"))
    assert drawing_png(plot_member, res, "c1", "W", ("N", "M")) == _saved(plot_member(res, "c1", "W", ("N", "M")))


def test_a_changed_frame_is_drawn_anew():
    _fr, res = _portal(1.0)
    before = drawing_png(draw_frame_diagram, res, "W", "M")
    _fr2, res2 = _portal(2.5)  # another load: other moment labels
    after = drawing_png(draw_frame_diagram, res2, "W", "M")
    assert after != before
    assert after == _saved(draw_frame_diagram(res2, "W", "M"))


def test_a_figure_changed_after_drawing_is_saved_as_it_is_now():
    fr, res = _portal()
    sh = Sheet("t")
    sh.figure("model", draw_frame(fr, res, "W"))  # keeps the PNG of this drawing
    fig = draw_frame(fr, res, "W")  # the same drawing, then changed by the author
    fig.axes[0].set_title("Portal P-1, wind")
    sh.figure("model, titled", fig)
    pngs = [s.png for s in sh.evaluate().figures]
    fresh = draw_frame(fr, res, "W")
    fresh.axes[0].set_title("Portal P-1, wind")
    assert pngs[1] == _saved(fresh) and pngs[1] != pngs[0]


def test_other_matplotlib_settings_are_drawn_anew():
    fr, res = _portal()
    plain = drawing_png(draw_frame, fr, res, "W")
    with matplotlib.rc_context({"axes.facecolor": "#ffe0e0"}):
        tinted = drawing_png(draw_frame, fr, res, "W")
        assert tinted == _saved(draw_frame(fr, res, "W"))
    assert tinted != plain


def test_drawing_png_refuses_a_function_it_cannot_key():
    with pytest.raises(InputError, match="draw"):
        drawing_png(print, 1)


def test_sections_png_is_the_drawing_of_these_sections():
    from calcpad.eng.sections import RoundTube
    from calcpad.eng.sections.plot import draw_sections, sections_png

    thin, thick = RoundTube("2.375 in", "0.143 in", name="leg"), RoundTube("2.375 in", "0.200 in", name="leg")
    first = sections_png([thin], ["Before"], dpi=100)
    assert first == _saved(draw_sections([thin], ["Before"]), dpi=100)
    assert sections_png([thin], ["Before"], dpi=100) == first
    other = sections_png([thick], ["Before"], dpi=100)  # same name, another wall: drawn anew
    assert other != first and other == _saved(draw_sections([thick], ["Before"]), dpi=100)


def test_the_cycle_collector_is_held_off_only_while_a_figure_is_drawn():
    """Python's ``gc`` is paused around building and saving a drawing and is on again after,
    also when the drawing fails; the PNG is still matplotlib's own."""
    import gc

    seen = []

    def build():
        seen.append(gc.isenabled())
        return draw_frame(_portal(1.5)[0])

    assert gc.isenabled()
    png = figure_png.png_once(("a drawing of the test",), build, 110)
    assert seen == [False] and gc.isenabled()
    assert png == _saved(draw_frame(_portal(1.5)[0]))

    def fails():
        raise InputError("no drawing")

    with pytest.raises(InputError):
        figure_png.png_once(("another drawing",), fails, 110)
    assert gc.isenabled()
