"""Page numbers for the table of contents, found in the printed PDF.

Chromium has no ``target-counter()``, so the contents are numbered in two passes: the layout
writes each entry's page as an empty ``<span class="toc-page" data-ref=ID data-find=TEXT>``; after
a first print, :func:`find_pages` reads the PDF's text (pypdfium2) and finds the page where each
heading's text first appears after the contents; :func:`fill_pages` writes the numbers in.
Text is compared without white space, case-folded and NFKC-normalised (ligatures, line breaks,
hyphens at a line end).
"""

from __future__ import annotations

import html
import re
import unicodedata
from pathlib import Path

__all__ = ["TOC_END", "fill_pages", "find_pages", "normalise", "page_texts", "toc_targets"]

TOC_END = "Page numbers are those of submittal.pdf."
_SPAN = re.compile(r'<span class="toc-page" data-ref="([^"]+)" data-find="([^"]*)">([^<]*)</span>')


def normalise(text: str) -> str:
    """Text for matching: NFKC, case-folded, no white space.

    PDFium reports a hyphen at a line end as U+FFFE: it is put back as "-".
    """
    text = text.replace("\ufffe", "-").replace("\u00ad", "")
    return "".join(unicodedata.normalize("NFKC", text).casefold().split())


def toc_targets(page_html: str) -> list[tuple[str, str]]:
    """``(ref, heading text)`` of every page-number slot, first occurrence of each ref, in document order."""
    out: dict[str, str] = {}
    for ref, find, _ in _SPAN.findall(page_html):
        out.setdefault(ref, html.unescape(find))
    return list(out.items())


def fill_pages(page_html: str, pages: dict[str, int]) -> str:
    """The page with each entry's number written in (entries not in ``pages`` left empty)."""

    def put(m: re.Match[str]) -> str:
        n = pages.get(m.group(1))
        return f'<span class="toc-page" data-ref="{m.group(1)}" data-find="{m.group(2)}">{"" if n is None else n}</span>'

    return _SPAN.sub(put, page_html)


def page_texts(pdf_path: str | Path) -> list[str]:
    """Extracted text of each page (pypdfium2: PDFium reads Chromium's large pages fast)."""
    import pypdfium2 as pdfium

    doc = pdfium.PdfDocument(str(pdf_path))
    try:
        out = []
        for page in doc:
            text = page.get_textpage()
            out.append(text.get_text_range())
            text.close()
            page.close()
        return out
    finally:
        doc.close()


def find_pages(texts: list[str], targets: list[tuple[str, str]]) -> dict[str, int]:
    """1-based page of each target heading, searched in order after the contents pages.

    The contents end at :data:`TOC_END` (what follows it on that page counts); each heading is
    looked for from the page of the one before it onwards (headings come in document order). Targets not found are
    left out of the result.
    """
    norm = [normalise(t) for t in texts]
    end = normalise(TOC_END)
    start = 0
    for i, t in enumerate(norm):
        if end in t:  # the contents end here: search only what follows them
            norm[i] = t.split(end, 1)[1]
            start = i
            break
    found: dict[str, int] = {}
    for ref, text in targets:
        key = normalise(text)
        for i in range(start, len(norm)):
            if key and key in norm[i]:
                found[ref] = i + 1
                start = i
                break
    return found
