"""Fitting text into the title band's boxes before Chromium lays it out.

A page-margin box cannot grow: a long project or calc title that wraps to more lines than the
band holds runs over the page body. So each box's text is broken into lines here, at most the
lines the box holds, the last cut with "…" when the text is longer. Widths are the advances of
DejaVu Sans (the band's font; the copy matplotlib ships) at the band's size, measured with
matplotlib's FreeType binding; a small safety factor covers the renderer's rounding. The box
widths follow :func:`calcpad.report.styles.page_css` (page margins, 30/40/30 % split, padding).
"""

from __future__ import annotations

from functools import lru_cache
from typing import Any

__all__ = ["BAND_PT", "ELLIPSIS", "box_widths", "fit_lines", "text_width"]

#: Font size of the band text (pt), as in ``styles._BOX``.
BAND_PT = 7.5
ELLIPSIS = "…"
#: Width of the page body (pt): the paper's width less the 0.55 in side margins of ``@page``.
_BODY_PT = {"letter": 8.5 * 72 - 2 * 0.55 * 72, "a4": 210 / 25.4 * 72 - 2 * 0.55 * 72}
#: Share of the body each box takes and what its width loses to ``calc(... - 14pt)``.
_SHARE = {"left": 0.30, "center": 0.40, "right": 0.30}
_INSET_PT = 14.0
#: Lines measured here must fit in this share of the box (Chromium's rounding and hinting).
SAFETY = 0.95


@lru_cache(maxsize=1)
def _font() -> Any:
    from matplotlib import font_manager, ft2font

    path = font_manager.findfont(font_manager.FontProperties(family="DejaVu Sans"), fallback_to_default=True)
    return ft2font.FT2Font(path)


@lru_cache(maxsize=4096)
def text_width(text: str, size: float = BAND_PT) -> float:
    """Advance width of ``text`` in DejaVu Sans at ``size`` pt, in pt (kerning applied)."""
    if not text:
        return 0.0
    from matplotlib import ft2font

    font = _font()
    font.set_size(size, 72)  # 72 dpi: one pixel is one point
    font.set_text(text, 0.0, flags=ft2font.LoadFlags.NO_HINTING)
    return font.get_width_height()[0] / 64.0  # 26.6 fixed point


def box_widths(paper: str) -> dict[str, float]:
    """Usable text width (pt) of the band's left, center and right boxes on ``paper``."""
    body = _BODY_PT[paper]
    return {box: (share * body - _INSET_PT) * SAFETY for box, share in _SHARE.items()}


def _cut(text: str, width: float, size: float) -> str:
    """``text`` cut to fit ``width`` with an ellipsis (whole words when they allow it)."""
    if text_width(text, size) <= width:
        return text
    words = text.split(" ")
    while len(words) > 1 and text_width(" ".join(words) + ELLIPSIS, size) > width:
        words.pop()
    cut = " ".join(words)
    while cut and text_width(cut + ELLIPSIS, size) > width:
        cut = cut[:-1]
    return cut.rstrip(" ,;·—-") + ELLIPSIS


def _split_word(word: str, width: float, size: float) -> list[str]:
    """A word wider than a line, in pieces that each fit."""
    pieces, piece = [], ""
    for ch in word:
        if piece and text_width(piece + ch, size) > width:
            pieces.append(piece)
            piece = ""
        piece += ch
    return [*pieces, piece] if piece else pieces


def fit_lines(text: str, width: float, max_lines: int, size: float = BAND_PT) -> list[str]:
    """``text`` broken at spaces into lines no wider than ``width`` pt, at most ``max_lines``;
    when more would be needed the last line ends in "…". A word wider than a line is split."""
    words = [p for w in " ".join(text.split()).split(" ") if w for p in _split_word(w, width, size)]
    lines: list[str] = []
    line = ""
    for i, word in enumerate(words):
        joined = f"{line} {word}" if line else word
        if not line or text_width(joined, size) <= width:
            line = joined
            continue
        lines.append(line)
        if len(lines) == max_lines:
            rest = " ".join(words[i:])
            lines[-1] = _cut(f"{lines[-1]} {rest}", width, size)
            return lines
        line = word
    if line:
        lines.append(line)
    return lines
