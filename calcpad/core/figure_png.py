"""PNG of a figure, drawn once per distinct drawing.

A drawing function that knows what it drew (its inputs) marks the figure it returns with
:func:`mark_content`; :func:`figure_png` then saves each distinct drawing once and hands out the
same bytes for the next figure with the same mark (a job often draws the same frame for members
that are alike). The mark holds only while the figure is as it was drawn: any change to the
figure or its artists afterwards (matplotlib marks the figure *stale*) drops it, and the figure is
saved as usual. The mark also carries matplotlib's settings (``rcParams``) when it was made.

The pixels are those ``savefig`` draws; the PNG is written with Pillow (matplotlib's own PNG
writer), as RGB when the drawing is opaque. Duck-typed on matplotlib's ``Figure`` (``savefig``,
``stale_callback``): this module imports no drawing library.
"""

from __future__ import annotations

import gc
import io
import threading
from collections.abc import Callable, Iterator
from contextlib import contextmanager
from typing import Any

from calcpad.core.content_key import content_key

__all__ = ["figure_png", "mark_content", "matplotlib_settings", "png_once"]

#: Figure attribute holding the content mark (dropped when the figure changes).
KEY_ATTR = "_calcpad_content_key"
#: zlib level of the PNGs (:func:`_encode`): a third less time than matplotlib's 6, files as large
#: as matplotlib's RGBA ones.
COMPRESS_LEVEL = 3
#: Distinct drawings kept, the oldest dropped first (a PNG is some 30-60 kB).
LIMIT = 64
_PNG: dict[tuple[str, int], bytes] = {}
#: The settings read when :func:`png_once` began, held while it builds the figure (per thread);
#: held, they also say that the figure being built is saved at once under png_once's key.
_HELD = threading.local()


def matplotlib_settings() -> str:
    """matplotlib's version and settings (``rcParams``) as text: a drawing depends on them.
    While :func:`png_once` builds a figure, the text it read before (the drawing functions it
    calls do not change the settings; reading them costs about a millisecond each time)."""
    held = getattr(_HELD, "settings", None)
    if held is not None:
        return held
    import matplotlib as mpl  # loaded already when there is a figure, and about to be used otherwise

    return f"{mpl.__version__}|{sorted(mpl.rcParams.items())!r}"


@contextmanager
def _settings_held(settings: str) -> Iterator[None]:
    before = getattr(_HELD, "settings", None)
    _HELD.settings = settings
    try:
        yield
    finally:
        _HELD.settings = before


def _digest(content: tuple[Any, ...], settings: str | None = None) -> str | None:
    return content_key(content, settings or matplotlib_settings())


def mark_content(fig: Any, *content: Any) -> Any:
    """Mark ``fig`` as the drawing of ``content`` (what decides the drawing: names, numbers,
    arrays, models; see :func:`calcpad.core.content_key.content_key`) and return it. The mark is
    dropped as soon as the figure or anything in it changes. Inside :func:`png_once` (which keeps
    the PNG under its own key and saves the figure at once) the figure is returned unmarked."""
    if getattr(_HELD, "settings", None) is not None:
        return fig
    digest = _digest(content)
    if digest is None:  # no exact description: saved every time
        return fig
    previous = getattr(fig, "stale_callback", None)

    def changed(artist: Any, value: Any) -> None:
        if value and hasattr(fig, KEY_ATTR):
            delattr(fig, KEY_ATTR)
        if previous is not None:
            previous(artist, value)

    fig.stale_callback = changed
    setattr(fig, KEY_ATTR, digest)
    return fig


def _keep(key: tuple[str, int], png: bytes) -> None:
    _PNG[key] = png
    while len(_PNG) > LIMIT:
        _PNG.pop(next(iter(_PNG)), None)  # the oldest (first kept)


def _kept(key: tuple[str, int]) -> bytes | None:
    return _PNG.get(key)


@contextmanager
def _collector_paused() -> Iterator[None]:
    """Python's cycle collector held off while a figure is built and drawn. A drawing makes tens
    of thousands of objects in reference cycles that live until it is saved: collections during
    it find nothing to free, yet move them into the oldest generation, whose growth sets off full
    collections over every object of the process. Held off, the figure is garbage by the next
    collection, which frees it young (the collector's time in a job of frame calcs drops by
    about three quarters)."""
    if not gc.isenabled():
        yield
        return
    gc.disable()
    try:
        yield
    finally:
        gc.enable()


def png_once(content: tuple[Any, ...], build: Callable[[], Any], dpi: int) -> bytes:
    """The PNG at ``dpi`` of the figure ``build()`` returns, which draws ``content`` (as for
    :func:`mark_content`); ``build`` is called only when this content has not been drawn before."""
    settings = matplotlib_settings()
    digest = _digest(content, settings)
    png = _kept((digest, dpi)) if digest is not None else None
    if png is not None:
        return png
    with _collector_paused(), _settings_held(settings):
        png = figure_png(build(), dpi)
    if digest is not None:
        _keep((digest, dpi), png)
    return png


def figure_png(fig: Any, dpi: int) -> bytes:
    """The PNG of ``fig`` at ``dpi``, at the figure's own size and layout, without date or text
    chunks (reruns give the same bytes); a marked figure is saved once per distinct drawing."""
    key = getattr(fig, KEY_ATTR, None)
    png = _kept((key, dpi)) if key is not None else None
    if png is not None:
        return png
    buf = io.BytesIO()
    with _collector_paused():
        fig.savefig(buf, format="rgba", dpi=dpi)  # the pixels matplotlib's PNG would hold
    png = _encode(buf.getvalue(), fig, dpi) or _matplotlib_png(fig, dpi)
    if key is not None:
        _keep((key, dpi), png)
    return png


def _encode(rgba: bytes, fig: Any, dpi: int) -> bytes | None:
    """PNG of the raw pixels ``savefig`` drew for ``fig`` at ``dpi``, with the resolution chunk
    matplotlib writes and no text chunks. An opaque drawing (every figure with a background) is
    written as RGB, the same picture as matplotlib's RGBA file, at zlib level 3 (matplotlib: 6).
    On the example job's six drawings: RGBA at 6 (matplotlib's file) 10.1 ms and 36 KiB a drawing,
    RGB at 6 8.7 ms and 33 KiB, RGB at 3 6.5 ms and 37 KiB (1 and 2 no faster, and larger).
    ``None`` when the pixels are not those of the figure's size."""
    from PIL import Image  # matplotlib's own PNG writer

    size = _pixel_size(len(rgba) // 4, fig.get_figwidth() * dpi, fig.get_figheight() * dpi)
    if size is None or len(rgba) % 4:
        return None
    width, height = size
    image = Image.frombuffer("RGBA", (width, height), rgba, "raw", "RGBA", 0, 1)
    if image.getchannel("A").getextrema() == (255, 255):
        image = image.convert("RGB")
    out = io.BytesIO()
    image.save(out, format="png", dpi=(dpi, dpi), compress_level=COMPRESS_LEVEL)
    return out.getvalue()


def _pixel_size(pixels: int, width: float, height: float) -> tuple[int, int] | None:
    """Width and height in pixels of a drawing of ``pixels`` pixels at about ``width`` x ``height``:
    matplotlib truncates its own product of inches and dpi, which can land either side of a whole
    number (8.2 in x 110 dpi: 902 pixels, 8.2 * 110 = 901.99...). ``None`` unless one pair fits."""
    sizes = {(w, h) for w in {int(width), round(width)} for h in {int(height), round(height)} if w * h == pixels}
    return sizes.pop() if len(sizes) == 1 else None


def _matplotlib_png(fig: Any, dpi: int) -> bytes:
    buf = io.BytesIO()
    with _collector_paused():
        fig.savefig(buf, format="png", dpi=dpi, metadata={"Software": None})
    return buf.getvalue()
