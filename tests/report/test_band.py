"""The title band holds any job's text: long titles are broken and cut to the band's boxes.

Widths are checked against Pillow's FreeType text layout of the same font file (an independent
reader of the font); the printed band is read back from the PDF with poppler's ``pdftotext
-bbox`` (each word's box in pt), on Letter and A4, for a job whose project and calc titles are
far longer than the band holds. Before this file the centre box wrapped a long calc title to
five lines and ran over the page body (seen in the printed PDF).
"""

from __future__ import annotations

import html
import re
import shutil
import subprocess
from pathlib import Path

import pytest

from calcpad.report.band import BAND_PT, ELLIPSIS, _font, box_widths, fit_lines, text_width
from calcpad.report.grouping import marks_text, numbers_text
from calcpad.report.layout import HEADING_MARKS
from tests.report.test_pdf import needs_chromium
from tests.runner.conftest import JOB_HEAD, tiny_calc

LONG_PROJECT = (
    "Kestrel Yard Fabricators north-east mezzanine extension, equipment platform, access stair, "
    "guard rails and the condenser stands on the upper roof of building 7"
)
LONG_CALC = (
    "Post and base plate of the rooftop condenser stand at grid line C/4 with the welded repair "
    "of the bent leg, its anchor rods to the existing slab and the new kicker braces"
)
BODY_TOP_PT = 0.85 * 72  # the page's top margin (styles.page_css): the body starts here


def test_text_width_agrees_with_pillow_reading_the_same_font() -> None:
    from PIL import ImageFont

    font = ImageFont.truetype(_font().fname, size=100)  # 100 px at 72 dpi: widths in pt x 100 / size
    for text in ("Job HRM-2417", "Rooftop condenser stand CS-2", "Calcs 2–4, 7 · typical for 3 members", "WWWW iiii"):
        expected = font.getlength(text) * BAND_PT / 100
        assert text_width(text) == pytest.approx(expected, rel=0.02), text


def test_lines_fit_the_box_and_keep_the_words_in_order() -> None:
    width = box_widths("letter")["center"]
    lines = fit_lines(LONG_CALC, width, 2)
    assert len(lines) == 2 and lines[-1].endswith(ELLIPSIS)
    assert all(text_width(line) <= width for line in lines)
    shown = " ".join(lines)[: -len(ELLIPSIS)].rstrip()
    assert LONG_CALC.startswith(shown) and len(shown) > 60
    assert fit_lines("Calc 3 · member P1", width, 1) == ["Calc 3 · member P1"]  # short text as it is
    assert fit_lines("", width, 2) == []


def test_a_word_wider_than_the_box_is_split() -> None:
    word = "A" * 80
    lines = fit_lines(word, 100.0, 3)
    assert all(text_width(line) <= 100.0 for line in lines) and lines[-1].endswith(ELLIPSIS)
    assert "".join(lines[:-1]) == word[: sum(len(x) for x in lines[:-1])]


def test_box_widths_follow_the_paper() -> None:
    letter, a4 = box_widths("letter"), box_widths("a4")
    # Letter 8.5 in = 612 pt, A4 210 mm = 595.3 pt (paper sizes, ISO 216 / ANSI); both less 2 x 0.55 in
    assert letter["center"] / 0.95 == pytest.approx(0.40 * (612 - 79.2) - 14)
    assert a4["center"] / 0.95 == pytest.approx(0.40 * (595.276 - 79.2) - 14, rel=1e-4)


def test_calc_numbers_print_runs_as_ranges() -> None:
    assert numbers_text([4]) == "Calc 4"
    assert numbers_text([2, 3]) == "Calcs 2, 3"
    assert numbers_text([1, 2, 3, 5, 7, 8, 9, 10]) == "Calcs 1–3, 5, 7–10"


def test_a_heading_names_a_few_marks_and_counts_the_rest() -> None:
    marks = [f"P{i}" for i in range(1, 11)]
    assert marks_text(marks[:HEADING_MARKS], HEADING_MARKS) == ", ".join(marks[:HEADING_MARKS])
    assert marks_text(marks, HEADING_MARKS) == f"{', '.join(marks[:HEADING_MARKS])} and {10 - HEADING_MARKS} more"


def _words(pdf: Path) -> list[list[tuple[str, float, float, float, float]]]:
    """Each page's words with their boxes (xMin, yMin, xMax, yMax in pt from the top left)."""
    out = subprocess.run(["pdftotext", "-bbox", str(pdf), "-"], check=True, capture_output=True, text=True).stdout
    pages = []
    for page in out.split("<page ")[1:]:
        words = re.findall(r'<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)</word>', page)
        pages.append([(html.unescape(w), float(a), float(b), float(c), float(d)) for a, b, c, d, w in words])
    return pages


@needs_chromium
@pytest.mark.skipif(shutil.which("pdftotext") is None, reason="pdftotext is absent (Debian package poppler-utils)")
@pytest.mark.parametrize("paper", ["letter", "a4"])
def test_long_titles_stay_inside_the_printed_band(paper: str, tiny_env: Path, tmp_path: Path) -> None:
    from calcpad.cli import main
    from calcpad.runner.recordfile import find_record

    head = JOB_HEAD.replace('title = "Test job"', f'title = "{LONG_PROJECT}"') + f'paper = "{paper}"\n'
    calcs = "".join(tiny_calc(f"M{i}").replace('template = "tiny"\n', f'template = "tiny"\ntitle = "{LONG_CALC}"\n') for i in range(1, 9))
    job = tmp_path / "job.toml"
    job.write_text(head + calcs, encoding="utf-8")
    out = tmp_path / "out"
    assert main(["run", str(job), "--out", str(out)]) == 0
    pages = _words(find_record(out).parent / "submittal.pdf")
    assert len(pages) >= 3
    widths = box_widths(paper)
    for number, words in enumerate(pages, start=1):
        band = [w for w in words if w[2] < BODY_TOP_PT]
        assert band, number
        assert all(w[4] <= BODY_TOP_PT for w in band), (number, [w for w in band if w[4] > BODY_TOP_PT])
        # every band line is one the fitter made, no extra wrap by Chromium: left 1 + 2 lines,
        # centre at most 3, right 1 + the page counter; each word inside its box
        left, body = 0.55 * 72, (612 if paper == "letter" else 595.276) - 2 * 0.55 * 72
        edges = (left, left + 0.3 * body, left + 0.7 * body, left + body)
        for box, limit in enumerate((3, 3, 2)):
            inside = [w for w in band if edges[box] <= w[1] < edges[box + 1]]
            assert all(w[3] <= edges[box + 1] for w in inside), (number, box, inside)
            rows = {round(w[2]) for w in inside}
            assert 1 <= len(rows) <= limit, (number, box, sorted(rows))
    calc_band = " ".join(w[0] for w in pages[-1] if w[2] < BODY_TOP_PT)
    assert "Calcs 1–8 · typical for 8 members" in calc_band
    assert ELLIPSIS in calc_band and "Post and base plate" in calc_band and "Kestrel Yard" in calc_band
    assert widths["center"] < 200
