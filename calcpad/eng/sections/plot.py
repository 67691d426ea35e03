"""Drawings of section outlines (matplotlib figures for sheets and notebooks)."""

from __future__ import annotations

import functools
from collections.abc import Sequence
from typing import Any

import numpy as np

from calcpad.core.figure_png import mark_content, png_once
from calcpad.eng.figure_reuse import layout, on_shared_renderer, reusing

__all__ = ["draw_sections", "sections_png"]

_FILLS = ["#9fb7cf", "#e0b27a", "#a9cf9f", "#cf9fb7", "#c9c39b"]


def _members(section: Any) -> list[tuple[str, list[Any]]]:
    if hasattr(section, "members"):
        return [(m.label, m.regions()) for m in section.members]
    return [(section.name, section.regions())]


def _figure(w: float, h: float) -> Any:
    """A figure with fixed margins (inches): the axis labels and the legend below each drawing; a
    layout engine would cost a second pass over the drawing each time it is saved."""
    from matplotlib.figure import Figure

    fig = Figure(figsize=(w, h))
    fig.subplots_adjust(left=0.6 / w, right=1 - 0.15 / w, bottom=1.05 / h, top=1 - 0.35 / h, wspace=0.3)
    return fig


def draw_sections(sections: Sequence[Any], titles: Sequence[str] | None = None, *, size: float = 3.2) -> Any:
    """Side-by-side drawings of shapes or built-up sections, each with its centroid marked.

    Returns a matplotlib ``Figure`` (for ``sheet.figure(...)`` or display); uses the ``Agg``
    canvas, so no display is needed.
    """
    from matplotlib.patches import PathPatch
    from matplotlib.path import Path

    w, h = size * len(sections), size + 0.4
    fig, axes = layout("draw_sections", w, h, 1, functools.partial(_figure, w, h), cols=len(sections))
    for k, (ax, sec) in enumerate(zip(axes, sections, strict=True)):
        for i, (label, regions) in enumerate(_members(sec)):
            verts: list[np.ndarray] = []
            codes: list[int] = []
            for reg in regions:
                for ring in reg.rings():
                    closed = np.vstack([ring, ring[:1]])
                    verts.append(closed)
                    codes += [Path.MOVETO] + [Path.LINETO] * (len(ring) - 1) + [Path.CLOSEPOLY]
            path = Path(np.vstack(verts), codes)
            ax.add_patch(PathPatch(path, facecolor=_FILLS[i % len(_FILLS)], edgecolor="#333333", lw=0.8, label=label))
        c = sec.moments().central()
        ax.plot([c.xc], [c.yc], marker="+", color="#b00020", ms=10, mew=1.5)
        ax.set_aspect("equal")
        ax.autoscale_view()
        ax.margins(0.08)
        ax.set_xlabel("x (in)")
        ax.set_ylabel("y (in)")
        ax.set_title(titles[k] if titles else getattr(sec, "name", ""), fontsize=9)
        ax.legend(fontsize=7, loc="upper center", bbox_to_anchor=(0.5, -0.22), frameon=False, ncol=2)
    return mark_content(fig, "draw_sections", list(sections), None if titles is None else list(titles), size)


def sections_png(sections: Sequence[Any], titles: Sequence[str] | None = None, *, size: float = 3.2, dpi: int = 100) -> bytes:
    """PNG of :func:`draw_sections` at ``dpi`` (for the notebook and ``Sheet.figure`` alike), drawn only
    when the same sections were not drawn before in this process (their exact content decides),
    on a figure kept from the last drawing of as many sections (:mod:`calcpad.eng.figure_reuse`)."""
    content = ("draw_sections", list(sections), None if titles is None else list(titles), size)

    def build() -> Any:
        with reusing():  # saved before the next drawing: a kept figure of this layout will do
            return on_shared_renderer(draw_sections(sections, titles, size=size))

    return png_once(content, build, dpi)
