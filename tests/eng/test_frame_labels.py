"""Names on the frame model drawing, measured as drawn (matplotlib's own text extents in pixels).

A knee-braced portal of our own (posts split at the brace points, the beam split at the brace
tops): the short members meet at the knees, where names used to sit on top of one another and
on the braces. What is checked is the picture a reader gets, not the placement rule.
"""

from __future__ import annotations

import itertools

import numpy as np

from calcpad.eng.analysis.diagrams import draw_frame
from calcpad.eng.analysis.frame import Frame


def _knee_braced_portal() -> Frame:
    fr = Frame("lbf", "in")
    for n, x, y in (("A", 0, 0), ("P1", 0, 90), ("T1", 0, 120), ("Q1", 30, 120), ("M", 72, 120),
                    ("Q2", 114, 120), ("T2", 144, 120), ("P2", 144, 90), ("B", 144, 0)):
        fr.node(n, x, y)
    props = {"E": "29000 ksi", "A": "2 in^2", "I": "3 in^4"}
    for name, i, j in (("Post 1 low", "A", "P1"), ("Post 1 up", "P1", "T1"), ("Beam end L", "T1", "Q1"),
                       ("Beam mid L", "Q1", "M"), ("Beam mid R", "M", "Q2"), ("Beam end R", "Q2", "T2"),
                       ("Post 2 up", "T2", "P2"), ("Post 2 low", "P2", "B")):
        fr.member(name, i, j, **props)
    fr.member("Brace 1", "P1", "Q1", release_start=True, release_end=True, **props)
    fr.member("Brace 2", "Q2", "P2", release_start=True, release_end=True, **props)
    fr.support("A", "fixed")
    fr.support("B", "fixed")
    fr.node_load("W", "T1", Fx=500)
    return fr


def _names(fig, frame: Frame) -> dict[str, object]:
    ax = fig.axes[0]
    fig.canvas.draw()
    renderer = fig.canvas.get_renderer()
    wanted = set(frame.members) | set(frame.nodes)
    return {t.get_text(): t.get_window_extent(renderer) for t in ax.texts if t.get_text() in wanted}


def _crosses(box, p: np.ndarray, q: np.ndarray, n: int = 200) -> bool:
    """True when the segment p-q (pixels) passes through the box."""
    pts = p + np.linspace(0, 1, n)[:, None] * (q - p)
    return bool(np.any((pts[:, 0] > box.x0) & (pts[:, 0] < box.x1) & (pts[:, 1] > box.y0) & (pts[:, 1] < box.y1)))


def test_no_two_names_overlap_and_the_brace_names_are_clear_of_other_members() -> None:
    frame = _knee_braced_portal()
    fig = draw_frame(frame, case="W")
    boxes = _names(fig, frame)
    assert set(boxes) == set(frame.members) | set(frame.nodes)  # every name drawn once
    for (a, ba), (b, bb) in itertools.combinations(boxes.items(), 2):
        assert not ba.overlaps(bb), f"{a!r} and {b!r} overlap"
    to_px = fig.axes[0].transData.transform
    for name in ("Brace 1", "Brace 2", "Post 1 up", "Post 2 up", "Post 1 low", "Beam mid L"):
        for m in frame.members.values():
            if m.name != name:
                p, q = to_px(np.asarray(frame.nodes[m.i], float)), to_px(np.asarray(frame.nodes[m.j], float))
                assert not _crosses(boxes[name], p, q), f"member {m.name!r} runs through the name {name!r}"


def test_a_node_name_goes_to_a_corner_no_member_runs_through() -> None:
    frame = _knee_braced_portal()
    fig = draw_frame(frame, case="W")
    boxes = _names(fig, frame)
    to_px = fig.axes[0].transData.transform
    for n in ("P1", "P2", "A", "B", "T1", "T2"):  # P1, P2: a post and a brace leave the node upward
        for m in frame.members.values():
            p, q = to_px(np.asarray(frame.nodes[m.i], float)), to_px(np.asarray(frame.nodes[m.j], float))
            assert not _crosses(boxes[n], p, q), f"member {m.name!r} runs through node name {n!r}"
