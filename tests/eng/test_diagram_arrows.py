"""Arrows of the frame drawings (``analysis._arrows``) against matplotlib's own ``FancyArrowPatch``
with its ``arc3`` connection: the picture must be the one matplotlib draws."""

from __future__ import annotations

import io

import numpy as np
import pytest
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.figure import Figure
from matplotlib.patches import FancyArrowPatch
from PIL import Image

from calcpad.eng.analysis._arrows import arrow_row, straight

STYLE = {"arrowstyle": "-|>", "mutation_scale": 8, "color": "#b03a2e", "lw": 0.8}
#: A distributed load's seven arrows on a sloped member, and one shorter than both shrinks.
ENDS = [((x - 1.5, 0.3 * x + 2.0), (x, 0.3 * x)) for x in np.linspace(0.5, 9.5, 7).tolist()] + [((5.0, 9.0), (5.0, 9.02))]


def _picture(add) -> np.ndarray:
    fig = Figure(figsize=(3, 2.4))
    FigureCanvasAgg(fig)
    ax = fig.add_axes((0.05, 0.05, 0.9, 0.9))
    ax.set_xlim(-2, 11)
    ax.set_ylim(-1, 10)
    add(ax)
    buf = io.BytesIO()
    fig.savefig(buf, format="png", dpi=110)
    return np.asarray(Image.open(buf).convert("RGBA")).astype(int)


def _patches(connection=None):
    def add(ax):
        for tail, tip in ENDS:
            ax.add_artist(FancyArrowPatch(tail, tip, **STYLE, **({"connectionstyle": connection} if connection else {})))
    return add


def test_one_row_of_arrows_draws_the_pixels_of_one_patch_each():
    row = _picture(lambda ax: ax.add_artist(arrow_row(ENDS, **STYLE)))
    assert np.array_equal(row, _picture(_patches(straight())))


@pytest.mark.parametrize("shrink", [0.0, 2.0, 6.0])
def test_the_straight_connection_is_matplotlibs_arc3_within_its_own_tolerance(shrink):
    """arc3 finds the shrunk ends by bisection to 0.01 pixel; exact ends move antialiased edge
    pixels by a few levels of 255 at most (matplotlib 3.11: 2), nothing else."""
    def patches(connection):
        def add(ax):
            for tail, tip in ENDS:
                ax.add_artist(FancyArrowPatch(tail, tip, shrinkA=shrink, shrinkB=shrink, connectionstyle=connection, **STYLE))
        return add

    mine, theirs = _picture(patches(straight())), _picture(patches("arc3"))
    assert np.abs(mine - theirs).max() <= 4  # measured 2; ends 1 point off: 209
    assert (theirs[..., :3] < 250).any(axis=2).sum() > 200  # the arrows are there to compare
