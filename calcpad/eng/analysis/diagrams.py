"""Drawings for analysis results: the frame model (members, supports, releases, loads), internal
force diagrams on the frame, and shear / moment / deflection plots for one beam or member.

matplotlib is imported lazily and only through its object-oriented API (``Figure`` with the Agg
canvas): no pyplot state and no backend switching, so the figures work in scripts, tests and
notebooks alike and can go straight into ``Sheet.figure``.
"""

from __future__ import annotations

import functools
from collections.abc import Callable
from typing import TYPE_CHECKING, Any

import numpy as np

from calcpad.core.errors import InputError
from calcpad.core.figure_png import figure_png, mark_content, png_once
from calcpad.core.units import format_number
from calcpad.eng.analysis._arrows import arrow_row, straight
from calcpad.eng.figure_reuse import layout, on_shared_renderer, reusing

if TYPE_CHECKING:  # pragma: no cover
    from matplotlib.figure import Figure

    from calcpad.eng.analysis.beams import BeamSolution
    from calcpad.eng.analysis.frame import Frame, FrameResult

__all__ = ["draw_frame", "draw_frame_diagram", "drawing_png", "plot_beam", "plot_member", "png_bytes"]

_LOAD = "#b03a2e"
_MEMBER = "#1f3b57"
_DEFL = "#2e86c1"


def _figure(w: float = 7.0, h: float = 5.0, rows: int = 1) -> Figure:
    """A figure with fixed margins (in inches, so they hold at any size): room for the title, tick
    labels, axis labels and a legend below the axes. A fixed layout draws once when saved; a
    tight bounding box or a layout engine costs a second pass."""
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    fig = Figure(figsize=(w, h))
    FigureCanvasAgg(fig)
    fig.subplots_adjust(left=0.85 / w, right=1 - 0.2 / w, bottom=0.75 / h, top=1 - 0.4 / h,
                        hspace=0.35 if rows > 1 else 0.2)
    return fig


def png_bytes(fig: Figure, dpi: int = 100) -> bytes:
    """PNG of a figure (for ``IPython.display.Image`` or files); no date metadata, so reruns match.
    A drawing of this module is saved once per distinct content (:mod:`calcpad.core.figure_png`)."""
    return figure_png(fig, dpi)


def _model(frame: Frame) -> tuple[Any, ...]:
    """Everything of the frame model a drawing can show."""
    return (frame.fu, frame.lu, frame.nodes, frame.members, frame.supports, frame.cases, frame.combos)


def _solution(result: FrameResult) -> tuple[Any, ...]:
    """Everything of a solved frame a drawing reads: the model and the solution's arrays."""
    return (_model(result.frame), result.names, result.U, result.R, result._factors, result._elem, result.end_forces_local)


def _extent(frame: Frame) -> float:
    xy = np.array(list(frame.nodes.values()), dtype=float)
    span = np.ptp(xy, axis=0).max() if len(xy) > 1 else 1.0
    return float(span if span > 0 else 1.0)


def _support(ax: Any, x: float, y: float, kind: tuple[bool, bool, bool], s: float) -> None:
    from matplotlib.patches import Circle, Polygon, Rectangle

    hx, hy, hr = kind
    if hx and hy and hr:  # fixed: a hatched block
        ax.add_patch(Rectangle((x - s, y - 0.6 * s), 2 * s, 0.6 * s, fill=False, hatch="////", ec="k", lw=1))
        return
    if hy:
        tri = Polygon([[x, y], [x - 0.7 * s, y - s], [x + 0.7 * s, y - s]], closed=True, fill=False, ec="k", lw=1.2)
        ax.add_patch(tri)
        if not hx:  # roller on a horizontal surface
            ax.add_patch(Circle((x, y - 1.2 * s), 0.2 * s, fill=False, ec="k"))
            ax.plot([x - s, x + s], [y - 1.45 * s, y - 1.45 * s], "k-", lw=1)
        else:
            ax.plot([x - s, x + s], [y - s, y - s], "k-", lw=1)
        return
    if hx:  # holds x only: a triangle on its side
        tri = Polygon([[x, y], [x - s, y - 0.7 * s], [x - s, y + 0.7 * s]], closed=True, fill=False, ec="k", lw=1.2)
        ax.add_patch(tri)
        ax.add_patch(Circle((x - 1.2 * s, y), 0.2 * s, fill=False, ec="k"))


def _add_straight(ax: Any, Arrow: Any, tail: tuple[float, float], tip: tuple[float, float], **props: Any) -> None:
    """``ax.add_patch(Arrow(tail, tip, **props))`` for a straight arrow, its two ends widening the
    data limits. ``add_patch`` widens them by the arrow's outline as drawn in the axes' limits of
    the moment (the shaft shrunk by 2 points: hundredths of a pixel in the final view) and draws
    the arrow twice for it."""
    arrow = ax.add_artist(Arrow(tail, tip, **props))
    arrow._set_in_autoscale(True)  # as add_patch: counted when the limits are recomputed
    ax.update_datalim([tail, tip])


def _add_polygon(ax: Any, xy: np.ndarray, **props: Any) -> None:
    """``ax.fill(x, y, **props)`` for one closed polygon of straight edges, whose corners are its
    data limits (``ax.fill`` searches every edge for curve extrema: a tenth of a diagram's time)."""
    from matplotlib.patches import Polygon

    poly = Polygon(xy, facecolor=props.get("color"), fill=True, closed=True)
    poly.set(**props)  # as ax.fill: "color" sets the edge too
    ax.add_artist(poly)
    poly._set_in_autoscale(True)
    ax.update_datalim(xy)


def draw_frame(
    frame: Frame,
    result: FrameResult | None = None,
    case: str | None = None,
    *,
    show_loads: bool = True,
    deflection_scale: float | None = None,
    title: str | None = None,
) -> Figure:
    """Draw the frame model: members, node names, supports, end releases (open circles), the
    loads of ``case`` and, with ``result``, the deflected shape (magnified automatically to
    about 8 % of the frame size unless ``deflection_scale`` is given)."""
    from matplotlib.collections import LineCollection
    from matplotlib.patches import FancyArrowPatch

    fig, (ax,) = layout("draw_frame", 7.0, 5.0, 1, _figure)
    ext = _extent(frame)
    s = 0.03 * ext
    # one artist for all members, one for all releases, one for all nodes (an artist each was
    # a third of the time it took to set up a frame drawing); each member still its own path
    ax.add_collection(LineCollection([(frame.nodes[m.i], frame.nodes[m.j]) for m in frame.members.values()],
                                     colors=_MEMBER, linewidths=2.5, capstyle="round", zorder=2))
    releases: list[tuple[float, float]] = []
    for m in frame.members.values():
        (x1, y1), (x2, y2) = frame.nodes[m.i], frame.nodes[m.j]
        L = np.hypot(x2 - x1, y2 - y1)
        ux, uy = (x2 - x1) / L, (y2 - y1) / L
        releases += [(px + sgn * ux * 0.6 * s, py + sgn * uy * 0.6 * s)
                     for flag, (px, py), sgn in ((m.release_i, (x1, y1), 1), (m.release_j, (x2, y2), -1)) if flag]
    if releases:
        ax.plot(*zip(*releases, strict=True), "o", mfc="white", mec=_MEMBER, ms=7, zorder=4)
    if frame.nodes:
        ax.plot(*zip(*frame.nodes.values(), strict=True), "s", color="k", ms=3, zorder=3)
    for n, (x, y) in frame.nodes.items():
        if n in frame.supports:
            _support(ax, x, y, frame.supports[n], s)
    if show_loads and case is not None:
        if case in frame.cases:
            cases = {case: 1.0}
        elif case in frame.combos:
            cases = frame.combos[case]
        else:
            raise InputError(f"case {case!r} not found; expected one of {list(frame.cases) + list(frame.combos)}")
        _draw_loads(ax, frame, cases, s, functools.partial(FancyArrowPatch, connectionstyle=straight()))
    if result is not None and case is not None:
        dmax = 0.0
        dgs = [result.diagram(m, case, n=31) for m in frame.members]
        for dg in dgs:
            x0 = np.array([frame.nodes[frame.members[dg.member].i]]).T
            c, sn = result.direction(dg.member)
            base = x0 + np.vstack([c * dg.x, sn * dg.x])
            dmax = max(dmax, float(np.abs(np.vstack([dg.xg, dg.yg]) - base).max()))
        scale = deflection_scale if deflection_scale is not None else (0.08 * ext / dmax if dmax > 0 else 1.0)
        shapes = []
        for dg in dgs:
            m = frame.members[dg.member]
            x0, y0 = frame.nodes[m.i]
            c, sn = result.direction(dg.member)
            bx, by = x0 + c * dg.x, y0 + sn * dg.x
            shapes.append(np.column_stack([bx + scale * (dg.xg - bx), by + scale * (dg.yg - by)]))
        ax.add_collection(LineCollection(shapes, colors=_DEFL, linewidths=1.2, linestyles="--", capstyle="butt",
                                         joinstyle="round", zorder=1))
        ax.plot([], [], "--", color=_DEFL, label=f"deflected shape x{_num(scale)}")
        fig.legend(loc="lower right", fontsize=8, frameon=False)  # below the axes: no search for a spot
    ax.set_aspect("equal", adjustable="datalim")
    ax.margins(0.15)
    _draw_names(ax, frame, s)
    ax.set_xlabel(f"x [{frame.lu}]")
    ax.set_ylabel(f"y [{frame.lu}]")
    ax.set_title(title or ("Frame model" + (f" - {case}" if case else "")), fontsize=10)
    ax.grid(alpha=0.2)
    return mark_content(fig, *_draw_frame_content(frame, result, case, show_loads=show_loads,
                                                  deflection_scale=deflection_scale, title=title))


def _halo() -> list[Any]:
    """A white outline around a label's letters: a member, a load arrow or the deflected shape
    drawn under it no longer runs through them."""
    from matplotlib import patheffects

    return [patheffects.withStroke(linewidth=2.5, foreground="white")]


#: Where a member's name may go: (fraction of its length, side, distance from the member in
#: drawing units ``s``), the usual spot first (mid-length, below a beam and inside a post, away
#: from the loads drawn on the other side).
_LABEL_SPOTS = tuple((frac, side, off) for off in (1.3, 2.6) for frac, side in
                     ((0.5, 1), (0.5, -1), (0.3, 1), (0.7, 1), (0.3, -1), (0.7, -1)))


def _draw_names(ax: Any, frame: Frame, s: float) -> None:
    """Node and member names (:func:`_label_spots`), sized against the view the drawing ends up
    with: the limits are settled first (everything else is drawn; names do not move them)."""
    ax.autoscale_view()
    ax.apply_aspect()
    x0, x1 = ax.get_xlim()
    width_pt = ax.get_position().width * ax.figure.get_figwidth() * 72
    node_spots, member_spots = _label_spots(frame, s, abs(x1 - x0) / width_pt)
    halo = _halo()
    for name, (x, y, ha) in member_spots.items():
        # under the members (zorder 2), over the deflected shape and the grid: a name that has to
        # sit on a member still shows the member whole
        ax.text(x, y, name, fontsize=8, color=_MEMBER, ha=ha, va="center", path_effects=halo, zorder=1.5)
    for n, (x, y) in frame.nodes.items():
        qx, qy = node_spots[n]
        ax.text(x + qx * 0.6 * s, y + qy * 0.6 * s, n, fontsize=9, fontweight="bold", path_effects=halo, zorder=5,
                ha="left" if qx > 0 else "right", va="bottom" if qy > 0 else "top")


def _label_spots(frame: Frame, s: float, per_pt: float) -> tuple[dict[str, tuple[int, int]], dict[str, tuple[float, float, str]]]:
    """Where the names go. Each node's name, ``node -> (qx, qy)``: the corner beside the node
    (right-above first) whose box no member runs through. Each member's name, ``name -> (x, y,
    ha)`` (``va`` centre): of the spots of :data:`_LABEL_SPOTS` beside the member, the first that
    keeps its letters clear of the other members and of the names placed before it, else the one
    that comes closest.

    ``per_pt``: data units per typographic point in the drawing's view; text sizes are estimated
    from it (DejaVu Sans: about 0.62 em per character). Short members meeting at a knee brace put
    their names where there is room instead of on top of one another."""
    char_w, line_h = 8 * 0.62 * per_pt, 8 * 1.25 * per_pt
    # members as points sampled along their length
    t = np.linspace(0.0, 1.0, 25)[:, None]
    segs = {m.name: np.asarray(frame.nodes[m.i], float) + t * (np.asarray(frame.nodes[m.j], float) - np.asarray(frame.nodes[m.i], float))
            for m in frame.members.values()}
    every = np.vstack([*segs.values(), np.empty((0, 2))])
    placed: list[tuple[float, float, float, float]] = []
    nodes: dict[str, tuple[int, int]] = {}
    for n, (x, y) in frame.nodes.items():
        w, h = len(n) * char_w * 1.25, line_h * 1.1  # 9 pt bold
        best_node: tuple[float, tuple[int, int], tuple[float, float, float, float]] | None = None
        for qx, qy in ((1, 1), (-1, 1), (1, -1), (-1, -1)):
            x0, y0 = x + qx * 0.6 * s, y + qy * 0.6 * s
            box = (min(x0, x0 + qx * w), min(y0, y0 + qy * h), max(x0, x0 + qx * w), max(y0, y0 + qy * h))
            gap = _box_gap(box, every)
            if best_node is None or gap > best_node[0]:
                best_node = (gap, (qx, qy), box)
            if gap >= 0.3 * s:
                break
        assert best_node is not None
        nodes[n] = best_node[1]
        placed.append(best_node[2])
    clear = 0.6 * s  # enough room around a name
    members: dict[str, tuple[float, float, str]] = {}
    for m in frame.members.values():
        (x1, y1), (x2, y2) = frame.nodes[m.i], frame.nodes[m.j]
        L = np.hypot(x2 - x1, y2 - y1) or 1.0
        ux, uy = (x2 - x1) / L, (y2 - y1) / L
        others = np.vstack([p for n, p in segs.items() if n != m.name] or [np.empty((0, 2))])
        w = len(m.name) * char_w
        best: tuple[float, tuple[float, float, str], tuple[float, float, float, float]] | None = None
        for frac, side, off in _LABEL_SPOTS:
            ox, oy = side * uy * off * s, -side * ux * off * s
            x, y = x1 + frac * (x2 - x1) + ox, y1 + frac * (y2 - y1) + oy
            ha = "left" if ox > 0.5 * abs(oy) else "right" if ox < -0.5 * abs(oy) else "center"
            x0 = x if ha == "left" else x - w if ha == "right" else x - w / 2
            box = (x0, y - line_h / 2, x0 + w, y + line_h / 2)
            gap = min(_box_gap(box, others), *(_boxes_gap(box, b) for b in placed), np.inf)
            if best is None or gap > best[0]:
                best = (gap, (x, y, ha), box)
            if gap >= clear:
                break
        assert best is not None
        members[m.name] = best[1]
        placed.append(best[2])
    return nodes, members


def _box_gap(box: tuple[float, float, float, float], points: np.ndarray) -> float:
    """Distance from a box to the nearest of ``points`` (0 when one is inside; inf for none)."""
    if not len(points):
        return float("inf")
    dx = np.maximum(np.maximum(box[0] - points[:, 0], points[:, 0] - box[2]), 0.0)
    dy = np.maximum(np.maximum(box[1] - points[:, 1], points[:, 1] - box[3]), 0.0)
    return float(np.hypot(dx, dy).min())


def _boxes_gap(a: tuple[float, float, float, float], b: tuple[float, float, float, float]) -> float:
    """Distance between two boxes (0 when they overlap)."""
    dx = max(b[0] - a[2], a[0] - b[2], 0.0)
    dy = max(b[1] - a[3], a[1] - b[3], 0.0)
    return float(np.hypot(dx, dy))


def _draw_frame_content(frame: Frame, result: FrameResult | None = None, case: str | None = None, *, show_loads: bool = True,
                        deflection_scale: float | None = None, title: str | None = None) -> tuple[Any, ...]:
    return ("draw_frame", _model(frame), None if result is None else _solution(result), case, show_loads, deflection_scale,
            title)


def _num(x: float, figures: int = 3) -> str:
    """A label value: up to ``figures`` significant figures, thousands separated, no powers of
    ten below 1e9 (``1,330``, not ``1.33e+03``)."""
    return format_number(float(x), -figures)


def _direction(d: str) -> str:
    return {"x": "global x", "y": "global y", "local_x": "along the member", "local_y": "across the member"}[d]


def _member_list(names: list[str]) -> str:
    return ", ".join(names) if len(names) <= 3 else f"{names[0]} … {names[-1]} ({len(names)} members)"


def _draw_loads(ax: Any, frame: Frame, factors: dict[str, float], s: float, Arrow: Any) -> None:
    L0 = 4 * s
    nodal: dict[str, np.ndarray] = {}
    labels: dict[tuple[float, float, str], list[str]] = {}
    spread: dict[tuple[str, str, str], list[str]] = {}  # (case, w, direction) -> members
    for cn, f in factors.items():
        case = frame.cases[cn]
        for n, fx, fy, mz in case.node:
            nodal[n] = nodal.get(n, np.zeros(3)) + f * np.array([fx, fy, mz])
        for mname, w, d in case.udl:
            m = frame.members[mname]
            (x1, y1), (x2, y2) = frame.nodes[m.i], frame.nodes[m.j]
            L = np.hypot(x2 - x1, y2 - y1)
            c, sn = (x2 - x1) / L, (y2 - y1) / L
            dx, dy = {"x": (1.0, 0.0), "y": (0.0, 1.0), "local_x": (c, sn), "local_y": (-sn, c)}[d]
            sign = np.sign(w * f) or 1.0
            t = np.linspace(0.05, 0.95, 7)
            px, py = x1 + t * (x2 - x1), y1 + t * (y2 - y1)
            tails = np.column_stack([px - sign * dx * L0 * 0.6, py - sign * dy * L0 * 0.6])
            tips = np.column_stack([px, py])
            ends = [(tuple(a), tuple(b)) for a, b in zip(tails.tolist(), tips.tolist(), strict=True)]
            row = ax.add_artist(arrow_row(ends, arrowstyle="-|>", mutation_scale=8, color=_LOAD, lw=0.8))
            row._set_in_autoscale(True)  # as add_patch
            ax.update_datalim(np.vstack([tails, tips]))
            spread.setdefault((cn, _num(w), d), []).append(mname)
        for mname, P, a, d in case.point:
            m = frame.members[mname]
            (x1, y1), (x2, y2) = frame.nodes[m.i], frame.nodes[m.j]
            L = np.hypot(x2 - x1, y2 - y1)
            c, sn = (x2 - x1) / L, (y2 - y1) / L
            dx, dy = {"x": (1.0, 0.0), "y": (0.0, 1.0), "local_x": (c, sn), "local_y": (-sn, c)}[d]
            sign = np.sign(P * f) or 1.0
            px, py = x1 + c * a, y1 + sn * a
            _add_straight(ax, Arrow, (px - sign * dx * L0, py - sign * dy * L0), (px, py), arrowstyle="-|>",
                          mutation_scale=12, color=_LOAD, lw=1.5)
            at = (px - sign * dx * L0 * 1.1, py - sign * dy * L0 * 1.1)
            labels.setdefault((round(at[0], 6), round(at[1], 6), "left"), []).append(f"{cn}: {_num(P)}")
    for (tx, ty, ha), lines in labels.items():  # loads of several cases at one place share one stacked label
        ax.text(tx, ty, "\n".join(lines), fontsize=7, color=_LOAD, ha=ha)
    if spread:  # distributed loads are listed in a corner box, not beside arrows that crowd a beam
        lines = [f"{cn}: w = {w} {frame.fu}/{frame.lu} ({_direction(d)}) on {_member_list(ms)}" for (cn, w, d), ms in spread.items()]
        ax.text(0.01, 0.01, "\n".join(lines), transform=ax.transAxes, fontsize=7, color=_LOAD, ha="left", va="bottom",
                bbox={"facecolor": "white", "edgecolor": "none", "alpha": 0.85, "pad": 2})
    for n, (fx, fy, mz) in nodal.items():
        x, y = frame.nodes[n]
        mag = np.hypot(fx, fy)
        if mag > 0:
            ux, uy = fx / mag, fy / mag
            _add_straight(ax, Arrow, (x - ux * L0, y - uy * L0), (x, y), arrowstyle="-|>", mutation_scale=14,
                          color=_LOAD, lw=1.8)
            # beyond the tail, aligned away from the arrow (centred on it, the shaft ran through the text)
            ax.text(x - ux * L0 * 1.1, y - uy * L0 * 1.1, f"{_num(mag)} {frame.fu}", fontsize=8, color=_LOAD,
                    ha="right" if ux > 0.5 else "left" if ux < -0.5 else "center",
                    va="top" if uy > 0.5 else "bottom" if uy < -0.5 else "center")
        if mz:
            ax.add_patch(Arrow((x + 1.5 * s, y - 1.0 * s), (x + 1.5 * s, y + 1.0 * s),
                               connectionstyle=f"arc3,rad={0.8 if mz > 0 else -0.8}", arrowstyle="-|>",
                               mutation_scale=10, color=_LOAD, lw=1.2))
            ax.text(x + 2.6 * s, y, f"{_num(mz)} {frame.fu}·{frame.lu}", fontsize=7, color=_LOAD)


def draw_frame_diagram(
    result: FrameResult,
    case: str,
    quantity: str = "M",
    *,
    scale: float | None = None,
    members: list[str] | None = None,
) -> Figure:
    """Draw ``N``, ``V`` or ``M`` of ``case`` on the frame, offset normal to each member (moment
    on the tension side: positive M drawn on the member's local -y side). ``members`` limits the
    diagram to some members (the others are drawn plain)."""
    from matplotlib.collections import LineCollection

    if quantity not in ("N", "V", "M"):
        raise InputError(f"quantity: got {quantity!r}; expected 'N', 'V' or 'M'")
    frame = result.frame
    chosen = list(frame.members) if members is None else list(members)
    for m in chosen:
        if m not in frame.members:
            raise InputError(f"members: {m!r} not found; expected some of {list(frame.members)}")
    fig, (ax,) = layout("draw_frame_diagram", 7.0, 5.0, 1, _figure)
    ext = _extent(frame)
    for m in frame.members.values():
        if m.name not in chosen:
            (x1, y1), (x2, y2) = frame.nodes[m.i], frame.nodes[m.j]
            ax.plot([x1, x2], [y1, y2], "-", color="0.6", lw=1.5)
    dgs = [result.diagram(m, case, n=41) for m in chosen]
    vmax = max(float(np.abs(getattr(dg, quantity)).max()) for dg in dgs)
    k = scale if scale is not None else (0.12 * ext / vmax if vmax > 0 else 1.0)
    unit = result.units["moment"] if quantity == "M" else result.units["force"]
    sgn = -1.0 if quantity == "M" else 1.0
    paths: list[np.ndarray] = []  # each member's axis, then its diagram's outline: one artist, a path each
    for dg in dgs:
        m = frame.members[dg.member]
        (x1, y1) = frame.nodes[m.i]
        c, sn = result.direction(dg.member)
        bx, by = x1 + c * dg.x, y1 + sn * dg.x
        val = getattr(dg, quantity)
        ox, oy = bx + sgn * k * val * (-sn), by + sgn * k * val * c
        paths += [np.column_stack([bx, by]), np.column_stack([ox, oy])]
        _add_polygon(ax, np.column_stack([np.r_[bx, ox[::-1]], np.r_[by, oy[::-1]]]), color=_LOAD, alpha=0.25, lw=0)
        for idx in sorted({0, len(val) - 1, int(np.argmax(np.abs(val)))}):
            if abs(val[idx]) > 1e-9 * max(vmax, 1e-300):
                _value_label(ax, f"{_num(val[idx])}", (ox[idx], oy[idx]), (ox[idx] - bx[idx], oy[idx] - by[idx]))
    ax.add_collection(LineCollection(paths, colors=[_MEMBER, _LOAD] * len(dgs), linewidths=[2, 1] * len(dgs),
                                     capstyle="projecting", joinstyle="round", zorder=2))
    ax.set_aspect("equal", adjustable="datalim")
    ax.margins(0.15)
    ax.set_title(f"{quantity} [{unit}] - {case}", fontsize=10)
    ax.grid(alpha=0.2)
    return mark_content(fig, *_draw_frame_diagram_content(result, case, quantity, scale=scale, members=members))


def _value_label(ax: Any, text: str, at: tuple[float, float], away: tuple[float, float]) -> None:
    """A diagram value beside its point, on the side away from the member (``away``: from the
    member's axis to the point), so the member line and the fill never run through the digits."""
    dx, dy = float(away[0]), float(away[1])
    norm = float(np.hypot(dx, dy)) or 1.0
    across = abs(dx) >= abs(dy)  # the diagram stands beside a post: the label beside it
    ax.annotate(text, at, xytext=(3 * dx / norm, 3 * dy / norm), textcoords="offset points", fontsize=7, color=_LOAD,
                ha=("left" if dx > 0 else "right") if across else "center",
                va="center" if across else ("bottom" if dy > 0 else "top"))


def _draw_frame_diagram_content(result: FrameResult, case: str, quantity: str = "M", *, scale: float | None = None,
                                members: list[str] | None = None) -> tuple[Any, ...]:
    return ("draw_frame_diagram", _solution(result), case, quantity, scale, None if members is None else list(members))


def _three_panels(kind: str, x: np.ndarray, rows: list[tuple[str, np.ndarray, str]], title: str, xlabel: str) -> Figure:
    n = len(rows)
    fig, axes = layout(kind, 7.0, 2.1 * n, n, functools.partial(_figure, 7.0, 2.1 * n, rows=n))
    for ax, (lab, y, unit) in zip(axes, rows, strict=True):
        ax.plot(x, y, color=_MEMBER, lw=1.5)
        ax.fill_between(x, 0, y, color=_MEMBER, alpha=0.15)
        ax.axhline(0, color="k", lw=0.6)
        i = int(np.argmax(np.abs(y)))
        ax.plot(x[i], y[i], "o", color=_LOAD, ms=4)
        ax.annotate(f"{_num(y[i], 4)} {unit}\n@ {_num(x[i], 4)}", (x[i], y[i]), fontsize=7, color=_LOAD,
                    xytext=(4, 4), textcoords="offset points")
        ax.set_ylabel(f"{lab} [{unit}]", fontsize=8)
        ax.grid(alpha=0.2)
    axes[0].set_title(title, fontsize=10)
    axes[-1].set_xlabel(xlabel)
    return fig


def plot_beam(sol: BeamSolution, title: str = "Beam") -> Figure:
    """Shear, moment and (when available) deflection along a :class:`BeamSolution`."""
    u = sol.units
    rows = [("V", sol.V, u.get("force", "")), ("M", sol.M, u.get("moment", ""))]
    if sol.delta is not None:
        rows.append(("deflection (down +)", sol.delta, u.get("length", "")))
    fig = _three_panels("plot_beam", sol.x, rows, title, f"x [{u.get('length', '')}]")
    return mark_content(fig, "plot_beam", sol.x, rows, title, u)


def plot_member(result: FrameResult, member: str, case: str, quantities: tuple[str, ...] = ("N", "V", "M", "delta_rel")) -> Figure:
    """Diagrams along one frame member (``N``, ``V``, ``M``, ``v`` or ``delta_rel``)."""
    dg = result.diagram(member, case, n=81)
    units = {"N": result.units["force"], "V": result.units["force"], "M": result.units["moment"],
             "v": result.units["length"], "delta_rel": result.units["length"], "u": result.units["length"]}
    rows = []
    for q in quantities:
        if q not in units:
            raise InputError(f"quantities: {q!r}; expected some of {list(units)}")
        rows.append((q, getattr(dg, q), units[q]))
    fig = _three_panels("plot_member", dg.x, rows, f"Member {member} - {case}", f"x from start node [{result.units['length']}]")
    return mark_content(fig, *_plot_member_content(result, member, case, quantities))


def _plot_member_content(result: FrameResult, member: str, case: str,
                         quantities: tuple[str, ...] = ("N", "V", "M", "delta_rel")) -> tuple[Any, ...]:
    return ("plot_member", _solution(result), member, case, tuple(quantities))


_CONTENT: dict[Callable[..., Figure], Callable[..., tuple[Any, ...]]] = {
    draw_frame: _draw_frame_content, draw_frame_diagram: _draw_frame_diagram_content, plot_member: _plot_member_content}


def drawing_png(draw: Callable[..., Figure], *args: Any, dpi: int = 110, **kwargs: Any) -> bytes:
    """PNG of ``draw(*args, **kwargs)`` (``draw_frame``, ``draw_frame_diagram`` or ``plot_member``) at
    ``dpi`` (110: as ``Sheet.figure`` saves a figure), drawn only when the same drawing was not made
    before in this process (the inputs decide), on a figure and renderer kept from the last drawing
    of its kind (:mod:`calcpad.eng.figure_reuse`). For ``Sheet.figure``: the same picture as
    passing the figure, without building it again for a frame drawn before."""
    if draw not in _CONTENT:
        raise InputError(f"draw: got {getattr(draw, '__name__', draw)!r}; expected one of {[f.__name__ for f in _CONTENT]}")

    def build() -> Figure:
        with reusing():  # saved before the next drawing: a kept figure of this kind will do
            return on_shared_renderer(draw(*args, **kwargs))

    return png_once(_CONTENT[draw](*args, **kwargs), build, dpi)
