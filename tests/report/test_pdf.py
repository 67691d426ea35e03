"""The printed submittal, read back from the PDF (system Chromium, headless; pypdfium2 reads it).

The contents' page numbers are checked against the PDF outline Chromium writes from the
headings (its own record of where each heading landed) and against the page text.
"""

from __future__ import annotations

import json
import os
import re
import shutil
import subprocess
from pathlib import Path
from typing import Any

import pytest

from calcpad.cli import main
from calcpad.report.toc import normalise, page_texts
from calcpad.runner.recordfile import find_record
from tests.runner.conftest import EXAMPLE, JOB_HEAD, ROOT, tiny_calc

CHROMIUM = "/usr/bin/chromium"
needs_chromium = pytest.mark.skipif(not os.path.exists(CHROMIUM), reason=f"{CHROMIUM} is absent (Debian package `chromium`; .ci/run installs it)")
ARTIFACTS = ROOT / "build" / "test-artifacts"
# The interim single-page submittal (main c376468) printed by the same headless Chromium with the
# same flags: 51 Letter pages for the example job (measured 2026-12-03, before this layout; also 51
# with its overflow fixed and the body at 10 pt as here).
PAGES_BEFORE = 51
# ... for the 49 checks the example job had then. The engineering issue added anchorage, second-order
# effects, wind in both directions and on the diagonal, and the repair's weld rules (105 checks now),
# so the page count is compared per check: 79 pages for 105 checks (measured 2026-12-03) vs 51 for 49.
# Its second round made the canopy one frame (reaction, member-force and per-combination tables) and
# added the stand-base and post-base sheets: pages without checks of their own, 113 pages for 116
# checks (measured 2026-12-03). The bound is now: no more pages per check than the interim layout.
CHECKS_BEFORE = 49


@pytest.fixture(scope="module")
def printed(tmp_path_factory: pytest.TempPathFactory) -> dict[str, Any]:
    if not os.path.exists(CHROMIUM):
        pytest.skip(f"{CHROMIUM} is absent")
    out = tmp_path_factory.mktemp("example") / "out"
    assert main(["run", str(EXAMPLE), "--out", str(out)]) == 0
    out = find_record(out).parent  # the revision folder
    pdf = out / "submittal.pdf"
    import pypdfium2 as pdfium

    doc = pdfium.PdfDocument(str(pdf))
    marks = [b for b in doc.get_toc() if b.get_dest() is not None]
    outline = [(b.get_title(), b.get_dest().get_index()) for b in marks]
    heading_tops = [(b.get_title(), b.get_dest().get_index() + 1, b.get_dest().get_view()[1][1]) for b in marks]
    sizes = [doc[i].get_size() for i in range(len(doc))]
    doc.close()
    return {
        "out": out,
        "texts": page_texts(pdf),
        "outline": outline,
        "heading_tops": heading_tops,
        "sizes": sizes,
        "html": (out / "submittal.html").read_text(encoding="utf-8"),
        "record": json.loads((out / "record.json").read_text()),
    }


@needs_chromium
def test_every_page_carries_job_revision_and_page_n_of_n(printed: dict[str, Any]) -> None:
    texts = printed["texts"]
    n = len(texts)
    for i, text in enumerate(texts, start=1):
        assert "Job HRM-2417" in text, i
        assert "Rev A · 2025-03-14" in text, i
        assert f"page {i} of {n}" in text, i
        assert "Rooftop condenser stand CS-2" in text, i
        digest = printed["record"].get("record_digest", "")[:12]
        assert (f"record {digest}" if digest else "record (no digest)") in text, i
    assert all((round(w), round(h)) == (612, 792) for w, h in printed["sizes"])  # Letter, 8.5 x 11 in at 72 pt/in
    first_calc = next(i for i, t in enumerate(texts) if "Calc 1 · member CS-2" in t)
    for i, text in enumerate(texts[first_calc:], start=first_calc + 1):
        assert re.search(r"Calcs? [\d, –]+ · (member \S+|typical for \d+ members)", text), i  # calc and marks in the band


@needs_chromium
def test_no_heading_stranded_at_a_page_bottom(printed: dict[str, Any]) -> None:
    # Chromium's outline gives each heading's top (pt from the page bottom). The body ends at the
    # 0.5 in bottom margin (36 pt); a heading with its first row needs about 40 pt above that.
    low = [(title, page, round(top)) for title, page, top in printed["heading_tops"] if top < 36 + 40]
    assert not low, low


@needs_chromium
def test_contents_page_numbers_match_the_printed_headings(printed: dict[str, Any]) -> None:
    entries = re.findall(r'<span class="toc-title">([^<]*)</span><span class="toc-fill"></span><span class="toc-page" data-ref="[^"]+" data-find="[^"]*">(\d*)</span>', printed["html"])
    assert len(entries) >= 10
    outline: dict[str, list[int]] = {}
    for title, index in printed["outline"]:
        outline.setdefault(normalise(title), []).append(index + 1)
    texts = [normalise(t) for t in printed["texts"]]
    for raw_title, page in entries:
        title = raw_title.replace("&amp;", "&")
        assert page, f"no page number for {title!r}"
        page_no = int(page)
        assert page_no in outline[normalise(title)], (title, page_no, outline[normalise(title)])
        assert normalise(title) in texts[page_no - 1]


@needs_chromium
def test_page_count_falls_and_calc_titles_on_their_pages(printed: dict[str, Any]) -> None:
    pages, checks = len(printed["texts"]), printed["record"]["summary"]["checks"]
    assert pages / checks < PAGES_BEFORE / CHECKS_BEFORE, f"{pages} pages for {checks} checks now, {PAGES_BEFORE} for {CHECKS_BEFORE} before"
    joined = "\n".join(printed["texts"])
    assert "typical for L1, L3, L4" in joined and "typical for SP1, SP2, SP3" in joined
    for mark in ("CS-2", "L1", "L2", "L3", "L4", "SP1", "SP2", "SP3", "CF-1", "KB1", "KB2"):
        assert re.search(rf"\b\d+ {re.escape(mark)} ", "".join(printed["texts"][1:5])), mark  # summary rows


@needs_chromium
def test_three_pages_rendered_to_png(printed: dict[str, Any]) -> None:
    if shutil.which("pdftoppm") is None:
        pytest.skip("pdftoppm is absent (Debian package poppler-utils)")
    ARTIFACTS.mkdir(parents=True, exist_ok=True)
    pages = len(printed["texts"])
    for page in (1, 2, pages):
        stem = ARTIFACTS / f"example-page-{page:02d}"
        subprocess.run(["pdftoppm", "-r", "60", "-png", "-singlefile", "-f", str(page), "-l", str(page), str(printed["out"] / "submittal.pdf"), str(stem)], check=True)
        png = stem.with_suffix(".png")
        assert png.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n" and png.stat().st_size > 5000


def _label_width(pdf: Path, label: str = "Engineer of record") -> float:
    """Printed width (pt) of a cover label: the same CSS gives the same width unless the page was shrunk."""
    import pypdfium2 as pdfium

    doc = pdfium.PdfDocument(str(pdf))
    text = doc[0].get_textpage()
    start, count = text.search(label).get_next()
    width = text.get_charbox(start + count - 1)[2] - text.get_charbox(start)[0]
    doc.close()
    return width


@needs_chromium
def test_pages_are_not_shrunk_to_fit(printed: dict[str, Any], tmp_path: Path, tiny_env: Path) -> None:
    # Chromium scales every page down when one element is wider than the page (it did: a long
    # module path in a reference column shrank the whole example to 95.6 %).
    job = tmp_path / "small.toml"
    job.write_text(JOB_HEAD + tiny_calc("M1"))
    assert main(["run", str(job), "--out", str(tmp_path / "out")]) == 0
    assert _label_width(printed["out"] / "submittal.pdf") == pytest.approx(_label_width(find_record(tmp_path / "out").parent / "submittal.pdf"), rel=0.002)


@needs_chromium
def test_a4_job_prints_a4(tmp_path: Path, tiny_env: Path) -> None:
    job = tmp_path / "a4.toml"
    job.write_text(JOB_HEAD.replace('units = "US"', 'units = "US"\npaper = "a4"') + tiny_calc("M1") + tiny_calc("M2"))
    out = tmp_path / "out"
    assert main(["run", str(job), "--out", str(out)]) == 0
    out = find_record(out).parent
    import pypdfium2 as pdfium

    doc = pdfium.PdfDocument(str(out / "submittal.pdf"))
    w, h = doc[0].get_size()
    doc.close()
    assert (round(w), round(h)) == (595, 842)  # ISO 216 A4, 210 x 297 mm at 72 pt/in
    texts = page_texts(out / "submittal.pdf")
    assert all(f"page {i} of {len(texts)}" in t for i, t in enumerate(texts, start=1))


def test_missing_chromium_still_writes_html(tmp_path: Path, tiny_env: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    monkeypatch.setenv("CALCPAD_CHROMIUM", str(tmp_path / "no-such-chromium"))
    out = tmp_path / "out"
    assert main(["run", "tiny", "--out", str(out)]) == 0
    assert sorted(p.name for p in (out / "rev-draft").iterdir()) == ["record.json", "submittal.html"]
    err = capsys.readouterr().err
    assert "submittal.pdf not written: Chromium not found" in err and "apt-get install chromium" in err


def test_no_pdf_option(tmp_path: Path, tiny_env: Path, capsys: pytest.CaptureFixture[str]) -> None:
    out = tmp_path / "out"
    assert main(["run", "tiny", "--out", str(out), "--no-pdf"]) == 0
    assert sorted(p.name for p in (out / "rev-draft").iterdir()) == ["record.json", "submittal.html"]
    assert "PDF" not in capsys.readouterr().err


def test_bad_print_option_exits_2_and_writes_nothing(tmp_path: Path, tiny_env: Path, capsys: pytest.CaptureFixture[str]) -> None:
    job = tmp_path / "job.toml"
    job.write_text(JOB_HEAD + tiny_calc("M1"))
    out = tmp_path / "out"
    assert main(["run", str(job), "--out", str(out), "--print", "calc:Q7"]) == 2
    assert "--print: 'calc:Q7': no member 'Q7'" in capsys.readouterr().err
    assert not out.exists()


def test_failing_chromium_leaves_no_pdf_and_says_why(tmp_path: Path, tiny_env: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    monkeypatch.setenv("CALCPAD_CHROMIUM", "/bin/false")  # starts, prints nothing, exits 1
    out = tmp_path / "out"
    assert main(["run", "tiny", "--out", str(out)]) == 0
    assert sorted(p.name for p in (out / "rev-draft").iterdir()) == ["record.json", "submittal.html"]  # no temporary file left either
    assert "submittal.pdf not written: Chromium exited with code 1 and wrote no PDF" in capsys.readouterr().err


@needs_chromium
def test_the_example_submittal_is_a_tagged_pdf(printed: dict[str, Any]) -> None:
    # a structure tree (headings, tables) for screen readers: PDF 1.7 (ISO 32000-1) 14.7, /StructTreeRoot
    assert b"/StructTreeRoot" in (printed["out"] / "submittal.pdf").read_bytes()


@needs_chromium
def test_a_submittal_of_very_many_rows_prints_untagged_and_says_so(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    from calcpad.report import pdf as pdf_module

    rows = "".join(f"<tr><td>M{i}</td><td>0.{i:03d}</td></tr>" for i in range(40))
    html = tmp_path / "submittal.html"
    html.write_text(f"<!doctype html><html><body><h1>Members</h1><table>{rows}</table></body></html>", encoding="utf-8")
    tagged = pdf_module.write_pdf(html, tmp_path / "tagged.pdf", chromium=CHROMIUM)
    assert tagged.written and "without accessibility tags" not in tagged.message
    assert b"/StructTreeRoot" in (tmp_path / "tagged.pdf").read_bytes()
    monkeypatch.setattr(pdf_module, "TAGGED_ROWS_MAX", 39)  # 40 rows: one too many
    untagged = pdf_module.write_pdf(html, tmp_path / "untagged.pdf", chromium=CHROMIUM)
    assert untagged.written and "without accessibility tags (40 table rows" in untagged.message
    assert b"/StructTreeRoot" not in (tmp_path / "untagged.pdf").read_bytes()
    assert page_texts(tmp_path / "untagged.pdf") == page_texts(tmp_path / "tagged.pdf")  # the same pages


@needs_chromium
def test_the_submittal_keeps_its_permissions_when_page_numbers_are_filled(printed: dict[str, Any]) -> None:
    # the HTML is rewritten with the contents' pages after the first print: it must stay as
    # readable as the files written beside it (record.json), not owner-only as a temporary file is
    html, rec = printed["out"] / "submittal.html", printed["out"] / "record.json"
    assert 'class="toc-page"' in printed["html"]  # the page was rewritten with numbers
    assert oct(html.stat().st_mode & 0o777) == oct(rec.stat().st_mode & 0o777)
