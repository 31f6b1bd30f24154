"""The season report page (scheduler.export.report): self-contained, escaped, well-formed SVG,
kept rules first and apart from the measured figures, figures taken from the FairnessReport and
matching published bounds, every sentence true for the data shown."""

from __future__ import annotations

import re
import xml.etree.ElementTree as ET
from html.parser import HTMLParser

import pytest

from scheduler.export.report import TEXT_LIMIT, render_report
from scheduler.fairness import compute_fairness
from tests.export.samples import FORMULA, TRICKY, make_season

SCRIPTY = "<script>alert(1)</script>"
TEAMS = ("Ashford Rovers", TRICKY, FORMULA, "Dunmore Town", SCRIPTY, "Fenwick Albion",
         "Glenrothes", "Hallam")  # fmt: skip


@pytest.fixture(scope="module")
def season():
    return make_season(TEAMS)


@pytest.fixture(scope="module")
def fairness(season):
    return compute_fairness(season)


@pytest.fixture(scope="module")
def page(season, fairness):
    return render_report(season, fairness)


class _Collector(HTMLParser):
    def __init__(self):
        super().__init__()
        self.tags: list[str] = []
        self.attrs: list[tuple[str, str, str | None]] = []

    def handle_starttag(self, tag, attrs):
        self.tags.append(tag)
        self.attrs += [(tag, k, v) for k, v in attrs]


def test_self_contained_no_scripts(page):
    # Parsed by the standard library's HTML parser: no script, no external resource.
    c = _Collector()
    c.feed(page)
    assert "script" not in c.tags and "link" not in c.tags and "img" not in c.tags
    for tag, key, value in c.attrs:
        assert key != "src", tag
        if key == "href":
            assert value.startswith("#"), value
        assert not key.startswith("on"), (tag, key)
    assert "@import" not in page
    assert re.findall(r"url\(([^)]*)\)", page) == [
        u for u in re.findall(r"url\(([^)]*)\)", page) if u.startswith("#")
    ]


def test_user_text_is_escaped(page):
    # Jinja2 autoescape and markupsafe in the SVG code: the team name shows as text.
    assert SCRIPTY not in page
    assert "&lt;script&gt;alert(1)&lt;/script&gt;" in page
    assert "Saints, &#34;Old&#34;; Boys" in page or "Saints, &quot;Old&quot;; Boys" in page


def test_every_svg_is_well_formed_xml(page):
    svgs = re.findall(r"<svg\b.*?</svg>", page, flags=re.S)
    assert len(svgs) >= 5  # gauge, grid, carry-over, mixing, slot/court/venue bars
    for svg in svgs:
        root = ET.fromstring(svg)  # an independent XML parser
        assert root.tag.endswith("svg")
        assert root.find("{http://www.w3.org/2000/svg}title") is not None


def test_rules_first_then_measured_figures(page):
    sections = ("rules", "figures", "grid", "carry", "mixing", "places")
    order = [page.index(f'id="{s}"') for s in sections]
    assert order == sorted(order)
    assert "Guarantees" not in page
    rules = page[page.index('id="rules"') : page.index('id="figures"')]
    # Measured figures (breaks, carry-over) are not listed among the kept rules.
    assert "Breaks" not in rules and "Carry-over" not in rules


def test_carry_over_bounds_match_the_literature(page, fairness):
    # Russell (1980): lower bound n(n-1) = 56 for n = 8; Lambrechts et al. (2018): the circle
    # method gives the maximum, (n-1)(n^2-6n+12) = 196 for n = 8 (check values of
    # docs/fairness.md §2). Our sample is a circle-method schedule.
    assert fairness.carry_over_lower_bound == 56
    assert fairness.carry_over_upper_bound == 196
    assert fairness.carry_over_value == 196
    card = page[page.index("<h3>Carry-over</h3>") :]
    card = card[: card.index("</article>")]
    assert "lower bound 56, worst possible 196" in card
    # 196 is the maximum (Lambrechts et al. 2018): the card must not call it merely "above".
    assert "the worst possible" in card and "above the lower bound" not in card
    assert "Measured over: leg 1" in card
    assert "Russell" in card and "Lambrechts" in card


def test_breaks_and_mixing_cards_show_report_figures(page, fairness):
    card = page[page.index("<h3>Breaks</h3>") :]
    card = card[: card.index("</article>")]
    assert f">{fairness.breaks_total}<" in card
    assert f"lower bound {fairness.breaks_lower_bound}" in card
    # de Werra (1981): a mirrored double round robin of n even teams has at least 3n-6 breaks.
    assert fairness.breaks_lower_bound == 3 * 8 - 6
    mixing = page[page.index("<h3>Mixing</h3>") :]
    mixing = mixing[: mixing.index("</article>")]
    # K_8 from the circle method is perfect (n-1 = 7 prime; Kotzig 1964 / Wallis 1997).
    assert f"{fairness.perfect_pairs} of {fairness.pairs}" in mixing and fairness.perfect
    assert fairness.pairs == 7 * 6 // 2


def test_rest_caution_present(page):
    assert "can put players at risk" in page
    assert "governing body" in page and "local regulations" in page and "precedence" in page


def test_grid_letters_match_patterns(page, fairness):
    grid = page[page.index('id="grid"') : page.index('id="carry"')]
    letters = re.findall(r'class="cell" fill="[^"]+">([HABX])</text>', grid)
    assert letters.count("H") == sum(fairness.home_counts)
    assert letters.count("A") == sum(fairness.away_counts)
    assert "".join(letters) == "".join(t.pattern for t in fairness.team_figures)


def test_byes_shown_for_odd_league():
    odd = make_season(("North", "South", "East", "West", "Centre"))
    html = render_report(odd, compute_fairness(odd))
    grid = html[html.index('id="grid"') : html.index('id="carry"')]
    assert len(re.findall(r">B</text>", grid)) == sum(len(v) for v in odd.byes.values())
    assert "Bye: " in html


def test_deterministic(season, fairness, page):
    assert render_report(make_season(TEAMS), compute_fairness(make_season(TEAMS))) == page


def test_large_league_page_stays_small():
    big = make_season(tuple(f"Club {i:02d}" for i in range(TEXT_LIMIT + 12)))
    html = render_report(big, compute_fairness(big))
    assert len(html.encode()) < 1_500_000
    carry = html[html.index('id="carry"') : html.index('id="mixing"')]
    assert "<text" not in carry.split("</title>", 1)[1]  # no per-cell text beyond the limit
    cells = re.sub(r"<defs>.*?</defs>", "", carry, flags=re.S)
    assert "<rect" not in cells  # cells merged into one path per colour
    assert cells.count("<path") <= 64


# --------------------------------------------------------------------------- true sentences


def _text(html: str) -> str:
    """The page's visible words (styles and tags left out), for sentence checks."""
    html = re.sub(r"<style>.*?</style>", " ", html, flags=re.S)
    return re.sub(r"\s+", " ", re.sub(r"<[^>]+>", " ", html))


def test_no_internal_paths_keys_or_raw_formulas(page):
    text = _text(page)
    for leak in ("carry_over_per_leg", ".py", "c_ij", "opp(t", "#{", "GK_", "Z_", "n(n-1)"):
        assert leak not in text, leak


def test_audit_of_an_outside_schedule_speaks_of_this_schedule(tmp_path):
    # A schedule written elsewhere (plain CSV, no plan revision), read by the audit.
    from scheduler.audit import audit_file
    from scheduler.export.csv_out import fixtures_csv

    source = make_season(("Ashford Rovers", "Brookvale", "Cedar Hill", "Dunmore Town"))
    path = tmp_path / "ext.csv"
    path.write_text(fixtures_csv(source), encoding="utf-8", newline="")
    result = audit_file(path)
    html = render_report(result.season, result.fairness)
    text = _text(html)
    assert "this schedule" in text
    for wrong in ("this plan", "planner", "seed", "bookkeeping", "Season report"):
        assert wrong not in text, wrong
    title = re.search(r"<h1[^>]*>(.*?)</h1>", html, flags=re.S).group(1).strip()
    assert title == "ext" and "·" not in title
    assert "Schedule report" in text


def test_side_leagues_use_their_labels_in_legend_grid_and_tables(fairness):
    from dataclasses import replace

    season = replace(make_season(TEAMS), home_meaning="side", side_labels=("White", "Black"))
    html = render_report(season, compute_fairness(season))
    grid = html[html.index('id="grid"') : html.index('id="carry"')]
    assert "the row&#39;s team plays White" in grid or "the row's team plays White" in grid
    assert "plays at home" not in grid
    letters = re.findall(r'class="cell" fill="[^"]+">([^<]+)</text>', grid)
    # White and Black start with W and B; the bye mark gives way so B means only Black.
    assert set(letters) <= {"W", "B", "–", "X"}
    assert letters.count("W") == sum(fairness.home_counts)
    fixtures = html[html.index('id="fixtures"') :]
    assert "<th>White</th><th>Black</th>" in fixtures


def test_courts_card_claims_only_what_holds():
    # One team plays all its games on the same court (3+ times, BTD not applicable):
    # no "balanced", no "at most twice", no green tone.
    from dataclasses import replace

    season = make_season(TEAMS, legs=1)
    first = season.teams[0]
    fixtures = tuple(
        replace(f, court="Court B") if first in (f.home, f.away) else replace(f, court="Court A")
        for f in season.fixtures
    )
    season = replace(season, fixtures=fixtures)
    fr = compute_fairness(season)
    assert max(count for _, count in fr.team(first).courts) >= 3
    html = render_report(season, fr)
    start = html.index("<h3>Courts and kick-off times</h3>")
    card = html[html.rindex("<article", 0, start) : html.index("</article>", start)]
    assert 'class="card good' not in card
    assert "at most twice" not in card and "balanced" not in card
    assert "most games of one team on one court" in card


def test_count_ramp_is_our_own_colour(page):
    # The dark end must not be the end of a widely used open sequential palette
    # (for example #08306B, the end of a common nine-class blue scheme; from memory).
    from scheduler.export.report import RAMP_DARK, ramp

    assert ramp(1, 1) == RAMP_DARK and RAMP_DARK.upper() != "#08306B"
    assert "#08306B" not in page.upper()


def test_options_weighed_are_listed_and_drawn():
    """A planned season's options appear as a table and as points of a chart; the chart's SVG
    is well-formed XML (read back with the standard library's parser)."""
    from dataclasses import replace

    from scheduler.export.report import options_chart
    from scheduler.season import PlanOptionFigures

    season = make_season()
    options = (
        PlanOptionFigures("best mixing", 10, 10, 6, 4, 60, False, True),
        PlanOptionFigures("fewest breaks", 6, 10, 4, 4, 60, True, True),
        PlanOptionFigures("another", 6, 10, 8, 4, 60, False, False),
    )
    chart = options_chart(options)
    root = ET.fromstring(str(chart))
    # one titled mark per option in each of the two panels (breaks, carry-over), the title
    # naming the option (tests/export/test_options_chart.py checks where the marks are)
    svg = "{http://www.w3.org/2000/svg}"
    for panel in (g for g in root.iter(f"{svg}g") if g.get("data-figure")):
        marks = [g for g in panel.iter(f"{svg}g") if g.get("data-option")]
        titles = sorted((int(g.get("data-option")), g.find(f"{svg}title").text) for g in marks)
        assert [number for number, _ in titles] == [1, 2, 3]
        assert all(f"({o.label}" in words for (_, words), o in zip(titles, options, strict=True))
    page = render_report(replace(season, options=options), compute_fairness(season))
    assert 'id="options"' in page and "fewest breaks" in page and "not beaten" in page
    assert options_chart(options[:1]) is None  # one option is no choice: no chart
