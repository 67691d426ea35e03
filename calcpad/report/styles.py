"""The submittal's page CSS: paper, the title band on every page, cover, contents and tables.

Our own layout. Every page carries a title band at the top (job number and project on the left,
the section on the page in the middle, revision, date and "page n of N" on the right) and a
footer line (record digest, software, the caution in short). The middle cell changes per section
through CSS named pages: each printed calc gets ``@page g<N>`` with its own text.
"""

from __future__ import annotations

__all__ = ["PAPER_SIZES", "band_css", "css_string", "page_css"]

PAPER_SIZES = {"letter": "letter", "a4": "A4"}

_BOX = "font-family: 'DejaVu Sans', sans-serif; font-size: 7.5pt; line-height: 1.3; color: #111;"

_STATIC = """
body { max-width: 60em; }
@media print { body { max-width: none; margin: 0; } }
h1, h2, h3, h4, h5 { break-after: avoid-page; break-inside: avoid; }
tr, .tb-row, .toc-entry { break-inside: avoid; }
thead { display: table-header-group; }
.cover { page: cover; }
.contents { page: contents; }
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
.signoff { display: grid; grid-template-columns: minmax(0, 1fr) 2.4in; gap: 0 1.2em; margin: .8em 0; break-inside: avoid; }
.signoff table { border-collapse: collapse; width: 100%; }
.signoff th { text-align: left; font-weight: normal; color: #444; padding: .2em 0; }
.signoff td { padding: 1.6em .4em .1em 0; border-bottom: .75pt solid #111; vertical-align: bottom; }
.signoff td.name { border-bottom: none; padding-right: 1em; }
.seal { border: 1pt dashed #111; height: 2.4in; display: flex; align-items: flex-end; justify-content: center; font-size: .8em; color: #444; padding-bottom: .4em; box-sizing: border-box; }
table.list { border-collapse: collapse; width: 100%; margin: .4em 0 1em; font-size: .92em; }
table.list th, table.list td { border: .5pt solid #888; padding: .15em .45em; text-align: left; vertical-align: top; }
table.list th { background: #eee; font-weight: bold; }
table.list td.num { text-align: right; white-space: nowrap; }
table.list tr.ng td { border-top: 1.5pt solid #111; border-bottom: 1.5pt solid #111; font-weight: bold; }
.mark-ng { border: 1.5pt solid #111; padding: 0 .3em; font-weight: bold; }
.mark-error { border: 1.5pt dashed #111; padding: 0 .3em; font-weight: bold; }
.software { font-size: .85em; color: #333; margin-top: .8em; }
.software code { font-size: .95em; }
.contents h2 { margin-top: 0; }
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


def band_css(name: str, section: str, detail: str) -> str:
    """``@page name`` whose middle band cell reads ``section`` over ``detail``."""
    content = css_string(section) + (' "\\A " ' + css_string(detail) if detail else "")
    return f"@page {name} {{ @top-center {{ content: {content}; }} }}\n"


def page_css(paper: str, left: tuple[str, str], right: tuple[str, str], footer: tuple[str, str]) -> str:
    """The ``@page`` rules shared by every page, then the static layout CSS.

    ``left``: job number, project title; ``right``: revision, date; ``footer``: left and right
    footer text. The page counter is added to the right cell.
    """
    size = PAPER_SIZES[paper]
    band = "border-bottom: 1.2pt solid #111; vertical-align: bottom; padding-bottom: 5pt;"
    foot = "border-top: .5pt solid #777; vertical-align: top; padding-top: 4pt;"
    return f"""
@page {{
  size: {size};
  margin: 0.95in 0.6in 0.62in 0.6in;
  @top-left {{ content: {css_string(left[0])} "\\A " {css_string(left[1])}; white-space: pre-wrap; width: 36%; text-align: left; {_BOX} {band} }}
  @top-center {{ content: ""; white-space: pre-wrap; width: 40%; text-align: left; {_BOX} {band} }}
  @top-right {{ content: {css_string(right[0])} "\\A " {css_string(right[1])} "\\A page " counter(page) " of " counter(pages);
               white-space: pre-wrap; width: 24%; text-align: right; {_BOX} {band} }}
  @bottom-left {{ content: {css_string(footer[0])}; width: 50%; text-align: left; {_BOX} font-size: 6.5pt; {foot} }}
  @bottom-right {{ content: {css_string(footer[1])}; width: 50%; text-align: right; {_BOX} font-size: 6.5pt; {foot} }}
}}
{_STATIC}"""
