"""Printing the submittal to PDF with headless Chromium (system package ``chromium``).

:func:`write_pdf` prints a finished ``submittal.html``; when the page has a table of contents it
prints twice (the first print gives the page of each heading, see :mod:`calcpad.report.toc`)
and rewrites the HTML with the numbers filled in. Both files are replaced atomically (temporary
file, then rename). A missing Chromium is not an error: the result says how to get the PDF.

The PDF is tagged (Chromium writes its structure tree: headings, tables, cells, for screen
readers), except a submittal of more than :data:`TAGGED_ROWS_MAX` table rows: there the
structure tree is most of the file and of Chromium's time, and grows faster than the page count
(a 10,000-member table: 96 pages, 20.6 MB and 162 s per print tagged, 1.4 MB and 46 s untagged,
measured one after the other on the shared 2-core machine); the message says so and the HTML
submittal is the accessible copy. A first print that only finds the contents' pages is untagged
(tagging does not move anything on the page).
"""

from __future__ import annotations

import os
import shutil
import stat
import subprocess
import tempfile
from dataclasses import dataclass, field
from pathlib import Path

from calcpad.report.toc import fill_pages, find_pages, page_texts, toc_targets

__all__ = ["CHROMIUM_ENV", "INSTALL_HINT", "TAGGED_ROWS_MAX", "PdfResult", "find_chromium", "print_pdf", "write_pdf"]

CHROMIUM_ENV = "CALCPAD_CHROMIUM"
INSTALL_HINT = (
    "install Chromium (Debian/Ubuntu: apt-get install chromium) and run again, "
    "or open submittal.html in a browser and print it to PDF"
)
_FLAGS = (
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--no-pdf-header-footer",
    "--generate-pdf-document-outline",
)
#: Above this many table rows (``<tr``) in the submittal the PDF is printed without tags.
TAGGED_ROWS_MAX = 3_000


class PdfError(RuntimeError):
    """Chromium ran but produced no PDF."""


@dataclass
class PdfResult:
    """What :func:`write_pdf` did: ``written`` with ``pages``, or a ``message`` saying why not."""

    written: bool
    message: str
    pages: int = 0
    unnumbered: list[str] = field(default_factory=list)  # contents entries whose page was not found


def find_chromium() -> str | None:
    """Path of the Chromium to use: ``$CALCPAD_CHROMIUM`` if set (even if missing), else on PATH."""
    if CHROMIUM_ENV in os.environ:
        path = os.environ[CHROMIUM_ENV]
        return path if path and os.access(path, os.X_OK) else None
    for name in ("chromium", "chromium-browser"):
        found = shutil.which(name)
        if found:
            return found
    return None


def print_pdf(chromium: str, html_path: Path, pdf_path: Path, timeout: float = 300, *, tagged: bool = True) -> None:
    """Print ``html_path`` to ``pdf_path`` with headless Chromium (raises PdfError on failure);
    ``tagged=False``: without the structure tree."""
    with tempfile.TemporaryDirectory(prefix="calcpad-chromium-") as profile:
        flags = _FLAGS if tagged else (*_FLAGS, "--disable-pdf-tagging")
        cmd = [chromium, *flags, f"--user-data-dir={profile}", f"--print-to-pdf={pdf_path}", html_path.resolve().as_uri()]
        try:
            proc = subprocess.run(cmd, capture_output=True, text=True, timeout=timeout, check=False)
        except subprocess.TimeoutExpired:
            raise PdfError(f"Chromium did not finish within {timeout:.0f} s") from None
        except OSError as exc:
            raise PdfError(f"cannot start Chromium ({exc})") from None
    if not pdf_path.exists() or pdf_path.stat().st_size == 0:
        tail = " ".join((proc.stderr or "").strip().splitlines()[-2:])
        raise PdfError(f"Chromium exited with code {proc.returncode} and wrote no PDF ({tail})")


def _replace_text(path: Path, text: str) -> None:
    """Replace ``path``'s text atomically, keeping its permissions (``mkstemp`` makes a file only
    its owner can read: a submittal on a shared drive must stay readable by the reviewers)."""
    mode = stat.S_IMODE(path.stat().st_mode)
    fd, tmp = tempfile.mkstemp(dir=path.parent, prefix=f".{path.name}.", suffix=".tmp")
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as fh:
            fh.write(text)
        os.chmod(tmp, mode)
        os.replace(tmp, path)
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise


def write_pdf(html_path: str | Path, pdf_path: str | Path, *, chromium: str | None = None, timeout: float = 300) -> PdfResult:
    """Print ``html_path`` to ``pdf_path`` (contents numbered; the HTML gets the numbers too).

    Never raises for a missing or failing Chromium: the result's ``message`` says what happened
    and how to get the PDF. Nothing is left half-written.
    """
    html_path, pdf_path = Path(html_path), Path(pdf_path)
    chromium = chromium or find_chromium()
    if chromium is None:
        where = os.environ.get(CHROMIUM_ENV) or "PATH"
        return PdfResult(False, f"{pdf_path.name} not written: Chromium not found ({where}); {INSTALL_HINT}")
    fd, tmp_name = tempfile.mkstemp(dir=pdf_path.parent, prefix=f".{pdf_path.name}.", suffix=".tmp")
    os.close(fd)
    tmp = Path(tmp_name)
    try:
        page_html = html_path.read_text(encoding="utf-8")
        targets = toc_targets(page_html)
        rows = page_html.count("<tr")
        tagged = rows <= TAGGED_ROWS_MAX
        pages: dict[str, int] = {}
        for attempt in range(3):  # numbers settle after one extra print (fixed-width column)
            draft = tagged and bool(targets) and attempt == 0  # only finds the pages: untagged is faster
            tmp.unlink(missing_ok=True)
            print_pdf(chromium, html_path, tmp, timeout, tagged=tagged and not draft)
            texts = page_texts(tmp)
            found = find_pages(texts, targets)
            if found == pages or attempt == 2:
                if draft:  # no heading found in the draft: print the tagged copy
                    tmp.unlink(missing_ok=True)
                    print_pdf(chromium, html_path, tmp, timeout)
                break
            pages = found
            page_html = fill_pages(page_html, pages)
            _replace_text(html_path, page_html)
        os.replace(tmp, pdf_path)
    except PdfError as exc:
        tmp.unlink(missing_ok=True)
        return PdfResult(False, f"{pdf_path.name} not written: {exc}; {INSTALL_HINT}")
    except BaseException:
        tmp.unlink(missing_ok=True)
        raise
    missing = [text for ref, text in targets if ref not in pages]
    msg = f"{pdf_path.name} written ({len(texts)} pages)"
    if not tagged:
        msg += (f"; without accessibility tags ({rows:,} table rows: a tagged PDF of this size takes minutes to print; "
                "submittal.html is the accessible copy)")
    if missing:
        msg += f"; contents without a page number (heading not found in the PDF text): {', '.join(missing)}"
    if found != pages:
        msg += "; contents page numbers did not settle after three prints: check them"
    return PdfResult(True, msg, len(texts), missing)
