"""The report opened in a real headless Chromium (Debian's chromium, found on PATH), via Playwright:
it loads with no console error and no failed request, asks for nothing but itself, and its
screenshot is not blank. Skipped only when Chromium is missing and CI is not set; under CI a
missing browser is a failure (the CI script installs Debian's chromium package)."""

from __future__ import annotations

import base64
import os
import shutil
from pathlib import Path

import pytest

from scheduler.export.report import render_report
from scheduler.fairness import compute_fairness
from tests.export.samples import FORMULA, TRICKY, make_season

CHROMIUM = os.environ.get("CHROMIUM") or shutil.which("chromium") or "chromium"
ARGS = [
    "--no-sandbox", "--disable-gpu", "--disable-background-networking",
    "--disable-component-update", "--disable-sync", "--no-first-run", "--disable-quic",
]  # fmt: skip

# Decode the PNG inside the browser (a canvas), so no image library is needed here.
PIXEL_STATS = """async (src) => {
  const img = new Image();
  img.src = src;
  await img.decode();
  const c = document.createElement('canvas');
  c.width = img.width; c.height = img.height;
  const g = c.getContext('2d');
  g.drawImage(img, 0, 0);
  const d = g.getImageData(0, 0, c.width, c.height).data;
  const bg = [d[0], d[1], d[2]];
  const colours = new Set();
  let differ = 0;
  for (let i = 0; i < d.length; i += 4) {
    if (d[i] !== bg[0] || d[i + 1] !== bg[1] || d[i + 2] !== bg[2]) differ++;
    if (colours.size < 5000) colours.add((d[i] << 16) | (d[i + 1] << 8) | d[i + 2]);
  }
  return {width: c.width, height: c.height, differ: differ, colours: colours.size};
}"""


def _browser_or_skip():
    missing = not (Path(CHROMIUM).is_file() and os.access(CHROMIUM, os.X_OK))
    try:
        from playwright.sync_api import sync_playwright
    except ImportError:
        missing = True
        sync_playwright = None
    if missing:
        if os.environ.get("CI", "").strip().lower() not in ("", "0", "false", "no"):
            pytest.fail(f"CI is set but no Chromium at {CHROMIUM} (or no playwright)")
        pytest.skip(f"no Chromium at {CHROMIUM}")
    return sync_playwright


@pytest.mark.browser
def test_report_renders_in_chromium(tmp_path):
    sync_playwright = _browser_or_skip()
    season = make_season(
        ("Ashford Rovers", TRICKY, FORMULA, "Dunmore Town", "Elmstead", "Fenwick Albion")
    )
    path = tmp_path / "report.html"
    path.write_text(render_report(season, compute_fairness(season)), encoding="utf-8")
    url = path.as_uri()
    errors, failed, requests = [], [], []
    with sync_playwright() as p:
        browser = p.chromium.launch(executable_path=CHROMIUM, args=ARGS)
        try:
            page = browser.new_page(viewport={"width": 1200, "height": 900})
            page.on("console", lambda m: errors.append(m.text) if m.type == "error" else None)
            page.on("pageerror", lambda e: errors.append(str(e)))
            page.on("requestfailed", lambda r: failed.append(r.url))
            page.on("request", lambda r: requests.append(r.url))
            page.goto(url, wait_until="load")
            assert page.title().startswith("Season report")
            assert page.locator("svg.chart").count() >= 5
            shot = page.screenshot(full_page=False)
            if os.environ.get("REPORT_SCREENSHOT"):
                Path(os.environ["REPORT_SCREENSHOT"]).write_bytes(shot)
            viewer = browser.new_page()
            stats = viewer.evaluate(
                PIXEL_STATS, "data:image/png;base64," + base64.b64encode(shot).decode()
            )
            print_pdf = page.pdf(format="A4")  # the print stylesheet renders too
        finally:
            browser.close()
    assert errors == [] and failed == []
    assert requests == [url]  # self-contained: nothing but the page itself was requested
    assert stats["width"] == 1200 and stats["height"] == 900
    assert stats["differ"] > 0.05 * 1200 * 900  # not blank
    assert stats["colours"] > 50  # text, cards and colour bands are drawn
    assert print_pdf.startswith(b"%PDF")
