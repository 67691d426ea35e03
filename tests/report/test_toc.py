"""Contents numbering from page texts, and CSS strings built from job text."""

from __future__ import annotations

from calcpad.report.styles import css_string
from calcpad.report.toc import TOC_END, fill_pages, find_pages, normalise, toc_targets

HTML = (
    '<span class="toc-page" data-ref="a" data-find="Design criteria"></span>'
    '<span class="toc-page" data-ref="b" data-find="Calc 2 · Legs &amp; posts"></span>'
    '<span class="toc-page" data-ref="a" data-find="Design criteria"></span>'
)


def test_targets_first_of_each_ref_in_order() -> None:
    assert toc_targets(HTML) == [("a", "Design criteria"), ("b", "Calc 2 · Legs & posts")]


def test_fill_writes_every_slot_and_refills() -> None:
    once = fill_pages(HTML, {"a": 3, "b": 12})
    assert once.count(">3</span>") == 2 and once.count(">12</span>") == 1
    assert fill_pages(once, {"a": 4, "b": 12}).count(">4</span>") == 2


def test_pages_found_after_the_contents_only() -> None:
    texts = [
        "Cover",
        f"Contents\nDesign criteria .... \nCalc 2 · Legs & posts ....\n{TOC_END}\nDesign\ncriteria\ncodes",
        "page 3 summary mentions Calc 2 · Legs",
        "Calc 2 ·  Legs &\nposts\nsheet",
    ]
    assert find_pages(texts, toc_targets(HTML)) == {"a": 2, "b": 4}


def test_missing_heading_left_out() -> None:
    assert find_pages([f"{TOC_END}", "nothing"], [("x", "Absent heading")]) == {}


def test_normalise_ligature_case_space_and_line_end_hyphen() -> None:
    assert normalise("Eﬃcient  Fillet\nWeld") == normalise("efficient filletweld")
    assert normalise("member CS\ufffe\r\n2") == normalise("member CS-2")  # PDFium: hyphen at a line end


def test_css_string_cannot_escape_its_rule() -> None:
    s = css_string('Job "7" \\ </style><b>\nnext')
    assert s.startswith('"') and s.endswith('"')
    inner = s[1:-1]
    assert '"' not in inner and "<" not in inner and ">" not in inner
    assert "\\A " in inner and "\\22 " in inner and "\\5c " in inner
