"""Figures saved once per distinct drawing (``core.figure_png``, ``diagrams.drawing_png``): the picture
is always the one matplotlib draws for the figure as it is now — a changed frame, a figure changed
after it was drawn, or other matplotlib settings never get a PNG kept from before.

The reference is matplotlib's own ``savefig`` PNG of a figure built afresh (no cache involved),
compared pixel by pixel: ``figure_png`` writes an opaque drawing's pixels as RGB, matplotlib as RGBA.
"""

from __future__ import annotations

import io
import struct

import matplotlib
import pytest
from PIL import Image

from calcpad import Sheet
from calcpad.core import figure_png
from calcpad.core.errors import InputError
from calcpad.eng.analysis.diagrams import draw_frame, draw_frame_diagram, drawing_png, plot_member
from calcpad.eng.analysis.frame import Frame


def _saved(fig, dpi: int = 110) -> bytes:
    buf = io.BytesIO()
    fig.savefig(buf, format="png", dpi=dpi, metadata={"Software": None})
    return buf.getvalue()


def _pixels(png: bytes) -> tuple[tuple[int, int], bytes]:
    """Size and RGBA pixels of a PNG (the picture, whatever the colour type of the file)."""
    image = Image.open(io.BytesIO(png))
    return image.size, image.convert("RGBA").tobytes()


def _same_picture(png: bytes, reference: bytes) -> bool:
    return _pixels(png) == _pixels(reference)


def _chunks(png: bytes) -> list[str]:
    """The chunk types of a PNG file, in order (PNG specification, section 5.3)."""
    out, at = [], 8
    while at < len(png):
        length, kind = struct.unpack(">I4s", png[at:at + 8])
        out.append(kind.decode("ascii"))
        at += 12 + length
    return out


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
    assert _same_picture(first, _saved(draw_frame(fr, res, "W")))
    assert drawing_png(draw_frame, fr, res, "W") == first  # the second time from the kept PNG
    assert _same_picture(drawing_png(draw_frame_diagram, res, "W", "M"), _saved(draw_frame_diagram(res, "W", "M")))
    assert _same_picture(drawing_png(plot_member, res, "c1", "W", ("N", "M")), _saved(plot_member(res, "c1", "W", ("N", "M"))))


def test_a_changed_frame_is_drawn_anew():
    _fr, res = _portal(1.0)
    before = drawing_png(draw_frame_diagram, res, "W", "M")
    _fr2, res2 = _portal(2.5)  # another load: other moment labels
    after = drawing_png(draw_frame_diagram, res2, "W", "M")
    assert after != before
    assert _same_picture(after, _saved(draw_frame_diagram(res2, "W", "M")))


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
    assert _same_picture(pngs[1], _saved(fresh)) and pngs[1] != pngs[0]


def test_other_matplotlib_settings_are_drawn_anew():
    fr, res = _portal()
    plain = drawing_png(draw_frame, fr, res, "W")
    with matplotlib.rc_context({"axes.facecolor": "#ffe0e0"}):
        tinted = drawing_png(draw_frame, fr, res, "W")
        assert _same_picture(tinted, _saved(draw_frame(fr, res, "W")))
    assert tinted != plain


def test_drawing_png_refuses_a_function_it_cannot_key():
    with pytest.raises(InputError, match="draw"):
        drawing_png(print, 1)


def test_sections_png_is_the_drawing_of_these_sections():
    from calcpad.eng.sections import RoundTube
    from calcpad.eng.sections.plot import draw_sections, sections_png

    thin, thick = RoundTube("2.375 in", "0.143 in", name="leg"), RoundTube("2.375 in", "0.200 in", name="leg")
    first = sections_png([thin], ["Before"], dpi=100)
    assert _same_picture(first, _saved(draw_sections([thin], ["Before"]), dpi=100))
    assert sections_png([thin], ["Before"], dpi=100) == first
    other = sections_png([thick], ["Before"], dpi=100)  # same name, another wall: drawn anew
    assert other != first and _same_picture(other, _saved(draw_sections([thick], ["Before"]), dpi=100))
    pair = sections_png([thin, thick], ["Before", "After"], dpi=100)  # two sections: another kept figure
    assert _same_picture(pair, _saved(draw_sections([thin, thick], ["Before", "After"]), dpi=100))
    again = sections_png([thick, thin], None, dpi=100)  # that figure emptied and drawn again
    assert again != pair and _same_picture(again, _saved(draw_sections([thick, thin]), dpi=100))


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
    assert _same_picture(png, _saved(draw_frame(_portal(1.5)[0])))

    def fails():
        raise InputError("no drawing")

    with pytest.raises(InputError):
        figure_png.png_once(("another drawing",), fails, 110)
    assert gc.isenabled()


def test_a_png_is_the_same_bytes_on_a_rerun_without_dates_or_text():
    """No time or text chunk (PNG specification, 11.3.4/11.3.6), so a rerun writes the same file;
    an opaque drawing is written as RGB (colour type 2), the resolution as matplotlib states it."""
    fr, res = _portal(1.2)
    first = figure_png.figure_png(draw_frame(fr, res, "W"), 110)
    figure_png._PNG.clear()
    assert figure_png.figure_png(draw_frame(fr, res, "W"), 110) == first
    chunks = _chunks(first)
    assert chunks[0] == "IHDR" and chunks[-1] == "IEND" and set(chunks) == {"IHDR", "pHYs", "IDAT", "IEND"}
    assert Image.open(io.BytesIO(first)).mode == "RGB"
    assert Image.open(io.BytesIO(first)).info["dpi"] == pytest.approx((110, 110), abs=0.01)


def test_a_see_through_figure_keeps_its_alpha():
    from matplotlib.figure import Figure

    fig = Figure(figsize=(2, 1.5))
    fig.patch.set_alpha(0.0)  # no background: the PNG must say which pixels are empty
    fig.add_subplot(1, 1, 1).plot([0, 1], [0, 1])
    png = figure_png.figure_png(fig, 80)
    assert Image.open(io.BytesIO(png)).mode == "RGBA"
    assert _same_picture(png, _saved(fig, dpi=80))
    assert Image.open(io.BytesIO(png)).getchannel("A").getextrema()[0] == 0


def _braced(load: float = 0.8):
    """Another frame than the portal: a braced bay with a distributed load and a node moment."""
    fr = Frame("kip", "in")
    for n, x, y in (("A", 0, 0), ("B", 0, 96), ("C", 180, 96), ("D", 180, 0)):
        fr.node(n, x, y)
    for name, i, j in (("c1", "A", "B"), ("bm", "B", "C"), ("c2", "D", "C"), ("br", "A", "C")):
        fr.member(name, i, j, E="29000 ksi", A="4 in^2", I="30 in^4")
    fr.support("A", "pinned")
    fr.support("D", "pinned")
    fr.member_load("G", "bm", -load / 100)
    fr.member_point_load("G", "c1", load, 48, "x")
    fr.node_load("G", "C", Mz=load * 10)
    return fr, fr.solve()


def test_a_kept_figure_drawn_again_is_the_picture_of_a_new_figure():
    """drawing_png reuses one figure per kind of drawing (``calcpad.eng.figure_reuse``): emptied, it must
    draw exactly what a new figure shows — also after a drawing that failed half-way."""
    from calcpad.eng import figure_reuse as _skeleton

    _skeleton._FIGURES.clear()
    fr, res = _portal(1.0)
    fr2, res2 = _braced()
    drawing_png(draw_frame, fr, res, "W")
    drawing_png(draw_frame_diagram, res, "W", "M")
    drawing_png(plot_member, res, "c1", "W", ("N", "V", "M"))
    kept = {k[0]: v[0] for k, v in _skeleton._FIGURES.items()}
    with pytest.raises(InputError, match="case"):
        drawing_png(draw_frame, fr2, res2, "no such case")  # fails after the members are drawn
    assert _same_picture(drawing_png(draw_frame, fr2, res2, "G"), _saved(draw_frame(fr2, res2, "G")))
    assert _same_picture(drawing_png(draw_frame_diagram, res2, "G", "V"), _saved(draw_frame_diagram(res2, "G", "V")))
    assert _same_picture(drawing_png(plot_member, res2, "br", "G", ("N", "V", "M")),
                         _saved(plot_member(res2, "br", "G", ("N", "V", "M"))))
    assert {k[0]: v[0] for k, v in _skeleton._FIGURES.items()} == kept  # the same figures, reused
    assert _same_picture(drawing_png(draw_frame, fr, res, "W", title="Portal"), _saved(draw_frame(fr, res, "W", title="Portal")))


def test_a_kept_figure_is_not_reused_under_other_settings():
    from calcpad.eng import figure_reuse as _skeleton

    fr, res = _portal(1.1)
    drawing_png(draw_frame_diagram, res, "W", "M")
    with matplotlib.rc_context({"xtick.color": "#aa0000", "grid.linestyle": "--"}):
        other = drawing_png(draw_frame_diagram, res, "W", "N")
        assert _same_picture(other, _saved(draw_frame_diagram(res, "W", "N")))
    kept = [v[0] for v in _skeleton._FIGURES.values()]
    assert not any(draw_frame(fr, res, "W") is fig for fig in kept)  # a figure handed out is always new


@pytest.mark.parametrize(("size", "dpi"), [((8.2, 1.22), 110), ((8.28, 2.5), 100), ((7.042, 4.515), 200), ((3.0, 2.0), 80)])
def test_a_figure_whose_inches_times_dpi_miss_a_whole_number_is_written_whole(size, dpi):
    """8.2 in x 110 dpi is 901.99... in floating point; matplotlib's canvas has 902 pixels. The
    PNG must have matplotlib's size and pixels (and be written by figure_png, as RGB)."""
    from matplotlib.figure import Figure

    fig = Figure(figsize=size)
    fig.add_subplot(1, 1, 1).plot([0, 1], [1, 0])
    png = figure_png.figure_png(fig, dpi)
    assert _same_picture(png, _saved(fig, dpi=dpi))
    assert Image.open(io.BytesIO(png)).mode == "RGB"


def test_text_drawn_with_kept_glyph_layouts_is_matplotlibs_text():
    """The shared renderer keeps each text's glyph layout (``figure_reuse._renderer_class``): a
    text drawn again, at another place or angle, and math text must look as matplotlib draws them."""
    from matplotlib.figure import Figure

    from calcpad.eng import figure_reuse

    def figure(shift: float) -> Figure:
        fig = Figure(figsize=(3.0, 2.0))
        ax = fig.add_axes((0.15, 0.15, 0.8, 0.8))
        for i, text in enumerate(["B1 mid L", "1,330 lbf", "−11,500", "8 kip·in", "B1 mid L"]):
            ax.text(0.05 + shift, 0.1 + 0.17 * i, text, fontsize=7 + i, rotation=30 * (i == 2))
        ax.set_title(r"$M_{max}$ = 40,300 lbf·in", fontsize=9)
        return fig

    for shift in (0.0, 0.013, 0.2):  # the second and third time from kept layouts
        fig = figure_reuse.on_shared_renderer(figure(shift))
        assert _same_picture(figure_png.figure_png(fig, 110), _saved(figure(shift)))
    assert figure_reuse._LAYOUTS  # the layouts were kept
