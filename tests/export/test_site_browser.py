"""The season site in a real headless Chromium (Debian's chromium, found on PATH), via Playwright.

Every page loads with no console error and asks for nothing but itself; every link, followed in
the browser, reaches a file that exists; printed on A4 (ISO 216: 210 mm wide, minus the page's
12 mm margins = 186 mm printable, 96 CSS px per inch), no table is wider than the printable
width, so no column is cut. Skipped like the report's browser test when Chromium is missing and
CI is not set.
"""

from __future__ import annotations

import os
from dataclasses import replace
from urllib.parse import unquote, urlparse

import pytest

from scheduler.export.bundle import write_season_outputs
from scheduler.fairness import compute_fairness
from tests.export.samples import FORMULA, TRICKY, make_season
from tests.export.test_report_browser import ARGS, CHROMIUM, _browser_or_skip

PRINTABLE_PX = (210 - 2 * 12) / 25.4 * 96  # A4 width minus margins, in CSS pixels

WIDEST = """() => {
  const out = {doc: document.documentElement.scrollWidth, tables: []};
  for (const t of document.querySelectorAll('table')) {
    out.tables.push(Math.max(t.scrollWidth, t.getBoundingClientRect().width));
  }
  return out;
}"""


@pytest.mark.browser
def test_site_pages_render_link_and_print_on_a4(tmp_path):
    sync_playwright = _browser_or_skip()
    long_name = "Marlwick and District Saturday Football Club Under-Fourteen Girls A"
    base = make_season(("Ashford Rovers", TRICKY, FORMULA, long_name, "Elmstead"), legs=1)
    venue = next(f.venue for f in base.fixtures if f.venue)
    season = replace(
        base,
        venue_addresses={venue: "Unit 14, The Old Tannery Industrial Estate, Long Lane, Ashford"},
    )
    out = tmp_path / "season"
    write_season_outputs(season, compute_fairness(season), out)
    pages = sorted((out / "site").rglob("*.html"))
    assert len(pages) == len(season.teams) + 1
    errors, failed, requests = [], [], []
    with sync_playwright() as p:
        browser = p.chromium.launch(executable_path=CHROMIUM, args=ARGS)
        try:
            page = browser.new_page(viewport={"width": 1000, "height": 800})
            page.on("console", lambda m: errors.append(m.text) if m.type == "error" else None)
            page.on("pageerror", lambda e: errors.append(str(e)))
            page.on("requestfailed", lambda r: failed.append(r.url))
            page.on("request", lambda r: requests.append(r.url))
            for path in pages:
                page.goto(path.as_uri(), wait_until="load")
                assert page.locator("h1").count() == 1
                # Links as the browser resolves them (absolute file URLs) reach real files.
                hrefs = page.eval_on_selector_all("a[href]", "els => els.map(e => e.href)")
                assert hrefs
                for href in hrefs:
                    assert href.startswith("file://"), href
                    assert os.path.isfile(unquote(urlparse(href).path)), href
                # Print on A4: the print stylesheet, at the printable width.
                page.emulate_media(media="print")
                page.set_viewport_size({"width": int(PRINTABLE_PX), "height": 1000})
                widths = page.evaluate(WIDEST)
                assert widths["tables"], path
                assert max(widths["tables"]) <= PRINTABLE_PX + 0.5, (path.name, widths)
                assert widths["doc"] <= PRINTABLE_PX + 0.5, (path.name, widths)
                assert page.pdf(format="A4").startswith(b"%PDF")
                page.emulate_media(media="screen")
                page.set_viewport_size({"width": 1000, "height": 800})
        finally:
            browser.close()
    assert errors == [] and failed == []
    # Self-contained: the browser asked for the pages themselves and nothing else.
    assert sorted(set(requests)) == sorted(path.as_uri() for path in pages)
