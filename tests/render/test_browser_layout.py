"""Browser measurement: at Letter width, no math line of the submittal is wider than its column.

Headless Chromium (Debian package at /usr/bin/chromium, driven by Playwright without downloading
a browser) lays out the example job's submittal.html with print media at the printable width of
a Letter page: 8.5 in less 0.75 in margins each side = 7 in = 672 CSS px (96 px/in), narrower
than Chromium's default print margins leave (about 740 px). Every ``<math>`` of a step must end
inside its ``.line`` column, and no ``.line`` may scroll sideways.
"""

from __future__ import annotations

from pathlib import Path

import pytest

CHROMIUM = Path("/usr/bin/chromium")
LETTER_CSS_PX = 816  # 8.5 in × 96 px/in
LETTER_PRINTABLE_PX = LETTER_CSS_PX - 2 * 72  # 0.75 in margins

pytestmark = pytest.mark.skipif(not CHROMIUM.exists(), reason="needs the system Chromium at /usr/bin/chromium")

MEASURE = """() => {
  const out = {rows: 0, lines: 0, over: [], fill: 0};
  for (const line of document.querySelectorAll('.step .line')) {
    out.rows += 1;
    const box = line.getBoundingClientRect();
    if (line.scrollWidth > line.clientWidth + 1) out.over.push({what: 'scroll', text: line.textContent.slice(0, 80)});
    for (const m of line.querySelectorAll('math')) {
      out.lines += 1;
      const r = m.getBoundingClientRect();
      const status = m.parentElement.querySelector('.status');
      const right = status ? status.getBoundingClientRect().right : r.right;
      out.fill = Math.max(out.fill, (right - box.left) / box.width);
      if (right > box.right + 1 || r.left < box.left - 1)
        out.over.push({what: 'math', by: Math.round(right - box.right), text: m.textContent.slice(0, 80)});
    }
  }
  return out;
}"""


def measure(html: Path, width: int) -> dict:
    """Lay out ``html`` at ``width`` CSS px with print media; return the overflow report."""
    playwright = pytest.importorskip("playwright.sync_api")
    with playwright.sync_playwright() as p:
        browser = p.chromium.launch(
            executable_path=str(CHROMIUM),
            args=["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update",
                  "--no-first-run", "--disable-dev-shm-usage"],
        )
        try:
            page = browser.new_page(viewport={"width": width, "height": 1056})
            page.emulate_media(media="print")
            page.goto(html.resolve().as_uri())
            return page.evaluate(MEASURE)
        finally:
            browser.close()


def test_no_math_line_wider_than_its_column_at_letter_width(example_run) -> None:
    _, _, out = example_run
    for width in (LETTER_CSS_PX, LETTER_PRINTABLE_PX):
        report = measure(out / "submittal.html", width)
        assert report["rows"] > 300 and report["lines"] >= report["rows"]  # the submittal was laid out
        assert report["over"] == [], f"{width} px: {len(report['over'])} of {report['lines']} math lines overflow: {report['over'][:5]}"



def test_the_measurement_sees_an_overflowing_line(tmp_path: Path) -> None:
    # the same page CSS with one unbroken 120-term line: the measurement must report it
    from calcpad.render.html import html_document

    long_math = "<mo>+</mo>".join(f"<mn>{i}.125</mn>" for i in range(120))
    body = f'<div class="step"><div class="desc">long</div><div class="line"><div class="mline"><math>{long_math}</math></div></div></div>'
    page = tmp_path / "long.html"
    page.write_text(html_document(body, "long"), encoding="utf-8")
    report = measure(page, LETTER_PRINTABLE_PX)
    assert report["rows"] == 1 and len(report["over"]) >= 1
