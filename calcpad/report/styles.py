"""The submittal's page CSS: paper, the title band on every page, cover, contents and tables.

Our own layout. Every page carries a title band at the top (job number and project on the left,
the section on the page in the middle, revision, date and "page n of N" on the right) and a
footer line (record digest, software, the caution in short). The middle cell changes per section
through CSS named pages: each printed calc gets ``@page g<N>`` with its own text.
"""

from __future__ import annotations

from calcpad.report.band import box_widths, fit_lines

__all__ = ["PAPER_SIZES", "band_css", "css_string", "page_css"]

PAPER_SIZES = {"letter": "letter", "a4": "A4"}

_BOX = "font-family: 'DejaVu Sans', sans-serif; font-size: 7.5pt; line-height: 1.3; color: #111;"

_STATIC = """
body { max-width: 60em; font-size: 10pt; }
@media print { body { max-width: none; margin: 0; } }
h1, h2, h3, h4, h5 { break-after: avoid-page; break-inside: avoid; }
tr, .tb-row, .toc-entry { break-inside: avoid; }
thead { display: table-header-group; }
.cover { page: cover; }
.contents { page: front; }
.front { page: front; }
.cover h1 { font-size: 1.6em; border-bottom: 3px double #111; margin: 0 0 .2em; }
.cover .lead { font-size: 1.05em; margin: 0 0 .8em; color: #333; }
table.facts { border-collapse: collapse; width: 100%; margin: .3em 0 .8em; }
table.facts th { text-align: left; font-weight: normal; color: #444; width: 11em; padding: .18em .6em .18em 0; vertical-align: top; }
table.facts td { padding: .18em 0; border-bottom: .5pt solid #bbb; }
.status-line { border: 1.5pt solid #111; padding: .35em .7em; margin: .6em 0; font-weight: bold; }
.status-line.bad { border-width: 3pt; }
.cautions { border-left: 4pt solid #111; padding: .3em .8em; margin: .8em 0; }
.cautions p { margin: .2em 0; }
.signoff { display: grid; grid-template-columns: minmax(0, 1fr) 2.1in; gap: 0 1.2em; margin: .8em 0; break-inside: avoid; }
.signoff table { border-collapse: separate; border-spacing: .9em 0; width: 100%; margin-left: -.9em; }
.signoff td { vertical-align: top; height: .62in; padding: .1em 0; }
.signoff td.who { width: 38%; }
.signoff td.line { border-bottom: .75pt solid #111; }
.signoff td.date { width: 22%; }
.signoff small { color: #555; font-size: .78em; }
.seal { border: 1pt dashed #111; height: 2.1in; display: flex; align-items: flex-end; justify-content: center; text-align: center; font-size: .8em; color: #444; padding: .4em; box-sizing: border-box; }
table.list { border-collapse: collapse; width: 100%; margin: .4em 0 1em; font-size: .92em; }
table.list th, table.list td { border: .5pt solid #888; padding: .15em .45em; text-align: left; vertical-align: top; }
table.list th { background: #eee; font-weight: bold; }
table.list td.num, table.list td.st { text-align: right; white-space: nowrap; }
table.list td.st { text-align: left; }
table.list tr.ng td { border-top: 1.5pt solid #111; border-bottom: 1.5pt solid #111; font-weight: bold; }
.mark-ng { border: 1.5pt solid #111; padding: 0 .3em; font-weight: bold; }
.mark-error { border: 1.5pt dashed #111; padding: 0 .3em; font-weight: bold; }
.software { font-size: .85em; color: #333; margin-top: .8em; }
.software code { font-size: .95em; }
.contents h2, .front > h2:first-child { margin-top: 0; }
.contents { margin-bottom: 1.5em; }
.toc-entry { display: flex; align-items: baseline; margin: .22em 0; color: #111; text-decoration: none; }
.toc-entry.sub { margin-left: 1.6em; font-size: .92em; }
.toc-title { flex: 0 1 auto; }
.toc-fill { flex: 1 1 auto; border-bottom: .75pt dotted #666; margin: 0 .3em; min-width: 1em; }
.toc-page { flex: 0 0 2.6em; text-align: right; }
.toc-end { font-size: .85em; color: #444; margin-top: 1em; }
section.calc { break-before: page; }
section.calc > h2 { font-size: 1.2em; border-bottom: 2px solid #111; margin-top: 0; }
.calc-meta { font-size: .88em; color: #333; margin: 0 0 .6em; }
.typical { border: 1pt solid #111; padding: .25em .6em; margin: .3em 0 .7em; font-size: .92em; break-inside: avoid; }
.calc-error { border: 2pt solid #111; padding: .5em; font-family: monospace; white-space: pre-wrap; }
/* a long unbroken word (a module path in a reference) must not widen the page: Chromium would
   shrink every page to fit it */
section.sheet .desc, section.sheet .ref { overflow-wrap: anywhere; min-width: 0; }
section.sheet table.grid:has(th:nth-child(7)) { font-size: .86em; }
section.sheet table.grid:has(th:nth-child(10)) { font-size: .78em; }
section.sheet table.grid:has(th:nth-child(7)) th, section.sheet table.grid:has(th:nth-child(7)) td { padding: .12em .3em; }
section.sheet > h3 { font-size: 1.05em; background: #eee; padding: .15em .4em; border-left: 3pt solid #111; }
"""


def css_string(text: str) -> str:
    """``text`` as a CSS string literal (safe inside a ``<style>`` element)."""
    out = []
    for ch in text:
        if ch in '"\\' or ch == "<" or ch == ">" or ch == "&" or ord(ch) < 32:
            out.append(f"\\{ord(ch):x} " if ch != "\n" else "\\A ")
        else:
            out.append(ch)
    return '"' + "".join(out) + '"'


def _lines_css(lines: list[str]) -> str:
    """CSS ``content`` for lines shown one under another."""
    return ' "\\A " '.join(css_string(line) for line in lines) or '""'


def band_css(name: str, section: str, detail: str, paper: str = "letter") -> str:
    """``@page name`` whose middle band cell reads ``section`` (at most two lines) over
    ``detail`` (one line); longer text is cut with "…" so the band never runs over the page."""
    width = box_widths(paper)["center"]
    lines = fit_lines(section, width, 2 if detail else 3) + (fit_lines(detail, width, 1) if detail else [])
    return f"@page {name} {{ @top-center {{ content: {_lines_css(lines)}; }} }}\n"


def page_css(paper: str, left: tuple[str, str], right: str, footer: tuple[str, str]) -> str:
    """The ``@page`` rules shared by every page, then the static layout CSS.

    ``left``: job number (one line), project title (two lines); ``right``: revision and date on
    one line (the page counter goes under it); ``footer``: left and right footer text. Band text
    longer than its box holds is cut with "…" (:mod:`calcpad.report.band`).
    """
    size = PAPER_SIZES[paper]
    widths = box_widths(paper)
    left_lines = fit_lines(left[0], widths["left"], 1) + fit_lines(left[1], widths["left"], 2)
    right_line = fit_lines(right, widths["right"], 1)
    cell = "white-space: pre-wrap; vertical-align: middle; margin: .25in 0 .1in 0; padding: 0 9pt 0 5pt; border: .75pt solid #111;"
    foot = "vertical-align: top; padding-top: 3pt; margin-bottom: .2in;"
    return f"""
@page {{
  size: {size};
  margin: 0.85in 0.55in 0.5in 0.55in;
  @top-left {{ content: {_lines_css(left_lines)}; width: calc(30% - 14pt); text-align: left; {_BOX} {cell} border-width: .75pt 0 1.5pt .75pt; }}
  @top-center {{ content: ""; width: calc(40% - 14pt); text-align: left; {_BOX} {cell} border-width: .75pt 0 1.5pt .75pt; }}
  @top-right {{ content: {_lines_css(right_line)} "\\A page " counter(page) " of " counter(pages);
               width: calc(30% - 14pt); text-align: right; {_BOX} {cell} border-width: .75pt .75pt 1.5pt .75pt; }}
  @bottom-left {{ content: {css_string(footer[0])}; width: 50%; text-align: left; {_BOX} font-size: 6.5pt; {foot} }}
  @bottom-right {{ content: {css_string(footer[1])}; width: 50%; text-align: right; {_BOX} font-size: 6.5pt; {foot} }}
}}
{_STATIC}"""
