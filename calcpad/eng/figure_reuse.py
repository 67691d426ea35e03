"""matplotlib objects kept between drawings that are saved as soon as they are drawn (the frame
drawings of ``analysis.diagrams.drawing_png``, the section outlines of ``sections.plot.sections_png``).

- One Agg renderer per size, resolution and thread (:func:`on_shared_renderer`): matplotlib keeps
  text measurements per renderer, so labels measured for one drawing are not measured again for
  the next, and no new pixel buffer is made. The renderer also keeps the glyph layout of each
  text it drew (FreeType shaping, about 0.13 ms a text: a tenth of a frame drawing; tick labels,
  names and axis labels come back drawing after drawing) and draws the glyphs as matplotlib does.
- One figure per kind of drawing, size and thread (:func:`layout`, inside :func:`reusing`): the
  next drawing of that kind gets the figure back with its axes emptied (every artist removed,
  data limits reset) but their ticks, spines and layout kept, as long as matplotlib's settings
  (``rcParams``) are those it was made with. A fresh figure makes some twenty
  ``Tick`` objects (five artists each) and its axes anew: about a fifth of a frame drawing. A kind
  of drawing sets the same axes properties every time (aspect, margins, grid, label positions),
  so what it draws on the emptied figure is what it draws on a new one.

Only for figures saved and dropped before the next drawing of their kind in the thread: the
renderer's buffer and the kept figure hold the last drawing.
"""

from __future__ import annotations

import functools
import threading
from collections.abc import Callable, Iterator
from contextlib import contextmanager
from typing import Any

from calcpad.core.figure_png import KEY_ATTR, matplotlib_settings

__all__ = ["layout", "on_shared_renderer", "reusing"]

#: Agg renderers shared by the figures drawn and saved at once, by size, resolution and thread.
_RENDERERS: dict[tuple[float, float, float, int], Any] = {}
_RENDERERS_MAX = 8
#: Figures kept for reuse by (kind, width, height, rows, columns, thread): the figure, its axes, the
#: figure's own ``stale_callback`` (``mark_content`` chains one onto it for each drawing) and
#: matplotlib's settings when it was made (the axes took colours, fonts and ticks from them).
_FIGURES: dict[tuple[str, float, float, int, int, int], tuple[Any, list[Any], Any, str]] = {}
_FIGURES_MAX = 8
_STATE = threading.local()


#: Glyph layouts by (font, size, dpi, text, hinting, features and language), the oldest dropped first.
_LAYOUTS: dict[tuple[Any, ...], list[Any]] = {}
_LAYOUTS_MAX = 4096


@functools.cache
def _renderer_class() -> type:
    """``RendererAgg`` drawing plain text with kept glyph layouts: the steps of matplotlib's own
    ``RendererAgg.draw_text`` (3.11) with the result of ``FT2Font._layout`` kept. matplotlib's
    renderer unchanged when those private steps are not there (another matplotlib)."""
    from matplotlib.backends import backend_agg
    from matplotlib.backends.backend_agg import RendererAgg
    from matplotlib.ft2font import FT2Font
    from matplotlib.text import Text

    hinting = getattr(backend_agg, "get_hinting_flag", None)
    steps = [getattr(RendererAgg, "_prepare_font", None), getattr(RendererAgg, "_draw_text_glyphs_and_boxes", None),
             getattr(FT2Font, "_layout", None), getattr(Text, "get_fontfeatures", None), getattr(Text, "get_language", None)]
    if hinting is None or not all(callable(step) for step in steps):
        return RendererAgg

    class LayoutKeepingRenderer(RendererAgg):
        def draw_text(self, gc: Any, x: float, y: float, s: str, prop: Any, angle: float, ismath: Any = False,
                      mtext: Any = None) -> None:
            if ismath:
                return super().draw_text(gc, x, y, s, prop, angle, ismath, mtext)
            font = self._prepare_font(prop)
            features = mtext.get_fontfeatures() if mtext is not None else None
            language = mtext.get_language() if mtext is not None else None
            size, flags = prop.get_size_in_points(), hinting()
            key = (font, size, self.dpi, s, flags, repr(features), repr(language))
            items = _LAYOUTS.get(key)
            if items is None:
                items = font._layout(s, flags=flags, features=features, language=language)
                while len(_LAYOUTS) >= _LAYOUTS_MAX:
                    _LAYOUTS.pop(next(iter(_LAYOUTS)), None)
                _LAYOUTS[key] = items
            self._draw_text_glyphs_and_boxes(
                gc, x, y, angle, ((item.ft_object, size, item.glyph_index, 0, 1, item.x, item.y) for item in items), [])
            return None

    return LayoutKeepingRenderer


@functools.cache
def _shared_renderer_canvas() -> type:
    """An Agg canvas class that draws with a renderer shared by the figures of one size and
    resolution (in one thread)."""
    from matplotlib.backends.backend_agg import FigureCanvasAgg, RendererAgg

    class SharedRendererCanvas(FigureCanvasAgg):
        def get_renderer(self) -> RendererAgg:
            w, h = self.figure.bbox.size
            key = (w, h, self.figure.dpi, threading.get_ident())
            renderer = _RENDERERS.get(key)
            if renderer is None:
                while len(_RENDERERS) >= _RENDERERS_MAX:
                    _RENDERERS.pop(next(iter(_RENDERERS)), None)
                renderer = _RENDERERS[key] = _renderer_class()(w, h, self.figure.dpi)
            self.renderer, self._lastKey = renderer, key[:3]
            return renderer

    return SharedRendererCanvas


def on_shared_renderer(fig: Any) -> Any:
    """``fig``, drawn from now on with a shared renderer."""
    if not isinstance(fig.canvas, _shared_renderer_canvas()):
        _shared_renderer_canvas()(fig)
    return fig


@contextmanager
def reusing() -> Iterator[None]:
    """Within: :func:`layout` hands out kept figures (for a drawing saved before the next one)."""
    before = getattr(_STATE, "on", False)
    _STATE.on = True
    try:
        yield
    finally:
        _STATE.on = before


def layout(kind: str, w: float, h: float, rows: int, make: Callable[[], Any], cols: int = 1) -> tuple[Any, list[Any]]:
    """A figure from ``make()`` with a grid of ``rows`` x ``cols`` axes, and the axes row by row.
    Inside :func:`reusing`, the figure kept for ``kind`` at this size, emptied, when there is one."""
    if not getattr(_STATE, "on", False):
        fig = make()
        return fig, [fig.add_subplot(rows, cols, i + 1) for i in range(rows * cols)]
    key, settings = (kind, w, h, rows, cols, threading.get_ident()), matplotlib_settings()
    kept = _FIGURES.get(key)
    if kept is not None and kept[3] == settings:
        fig, axes, callback, _ = kept
        _empty(fig, axes, callback)
        return fig, axes
    fig = on_shared_renderer(make())
    axes = [fig.add_subplot(rows, cols, i + 1) for i in range(rows * cols)]
    _ticks_once_per_draw(fig, axes)
    _FIGURES.pop(key, None)
    while len(_FIGURES) >= _FIGURES_MAX:
        _FIGURES.pop(next(iter(_FIGURES)), None)
    _FIGURES[key] = (fig, axes, fig.stale_callback, settings)
    return fig, axes


def _ticks_once_per_draw(fig: Any, axes: list[Any]) -> None:
    """Each axis of ``fig`` works out its ticks once per view while the figure is drawn. matplotlib
    asks an axis for the ticks to draw about six times in a draw (the title's place, the axis
    label's, the spines', the axis itself), each time running the locator and the formatter over
    the same view; the view is settled (aspect applied) before the axes are drawn."""
    draw = fig.draw

    def drawn_with_tick_memo(renderer: Any) -> Any:
        _STATE.ticks = {}
        try:
            return draw(renderer)
        finally:
            _STATE.ticks = None

    fig.draw = drawn_with_tick_memo
    for axis in (a for ax in axes for a in (ax.xaxis, ax.yaxis)):
        if callable(getattr(axis, "_update_ticks", None)):  # matplotlib's private step (3.x)
            axis._update_ticks = _tick_memo(axis, axis._update_ticks)


def _tick_memo(axis: Any, update: Callable[[], list[Any]]) -> Callable[[], list[Any]]:
    def update_ticks() -> list[Any]:
        memo = getattr(_STATE, "ticks", None)
        if memo is None:  # not within a draw of the figure
            return update()
        key = (id(axis), *axis.get_view_interval(), id(axis.get_major_locator()), id(axis.get_major_formatter()),
               id(axis.get_minor_locator()), id(axis.get_minor_formatter()))
        if key not in memo:
            memo[key] = update()
        return list(memo[key])

    return update_ticks


def _empty(fig: Any, axes: list[Any], callback: Any) -> None:
    """Remove what a drawing put on ``fig`` (also one that failed half-way): figure legends, every
    artist of the axes and their legends; data limits back to none and view limits to 0-1, as on
    new axes."""
    for legend in list(fig.legends):
        legend.remove()
    for ax in axes:
        for artist in [*ax.lines, *ax.patches, *ax.texts, *ax.collections, *ax.images, *ax.artists, *ax.tables]:
            artist.remove()
        if ax.get_legend() is not None:
            ax.get_legend().remove()
        ax.relim()  # no artists left: the data limits are null and ignored, as on new axes
        # the view of new axes: a patch added before the drawing is autoscaled takes its data
        # limits from its outline in the view of the moment (arrow heads are sized in points)
        ax.set_xlim(0.0, 1.0, auto=None)
        ax.set_ylim(0.0, 1.0, auto=None)
    fig.stale_callback = callback
    if hasattr(fig, KEY_ATTR):
        delattr(fig, KEY_ATTR)
