"""The season site (scheduler.export.site): index plus one page per team, made from the Season.

Parsed with the standard library's HTML parser (an independent reader): every link is relative
and resolves to a file of the season folder, user text is escaped, the sides are named as the
league names them and venue addresses appear.
"""

from __future__ import annotations

from dataclasses import replace
from html.parser import HTMLParser
from pathlib import PurePosixPath

import pytest

from scheduler.export.bundle import team_feed_names
from scheduler.export.site import site_files, site_paths
from scheduler.fairness import compute_fairness
from scheduler.fairness.names import figure_name
from tests.export.samples import FORMULA, TRICKY, make_season

SCRIPTY = "<script>alert(1)</script>"
TEAMS = ("Ashford Rovers", TRICKY, FORMULA, SCRIPTY, "Elmstead")


class Links(HTMLParser):
    def __init__(self):
        super().__init__()
        self.hrefs: list[str] = []
        self.tags: list[str] = []
        self.text: list[str] = []

    def handle_starttag(self, tag, attrs):
        self.tags.append(tag)
        self.hrefs += [v for k, v in attrs if k in ("href", "src") and v is not None]

    def handle_data(self, data):
        self.text.append(data)


def parse(html: bytes) -> Links:
    parser = Links()
    parser.feed(html.decode("utf-8"))
    return parser


@pytest.fixture(scope="module")
def season():
    base = make_season(TEAMS, legs=1)
    venue = next(f.venue for f in base.fixtures if f.venue)
    return replace(
        base,
        home_meaning="side",
        side_labels=("White", "Black"),
        venue_addresses={venue: "3 Mill Row, Ashford"},
    )


@pytest.fixture(scope="module")
def files(season):
    return site_files(season, compute_fairness(season))


def folder_files(season, files) -> set[str]:
    feeds = {f"calendars/{n}" for n in team_feed_names(season).values()}
    return set(files) | feeds | {"calendars/league.ics"}


def test_one_page_per_team_and_an_index(season, files):
    assert list(files) == site_paths(season, team_feed_names(season))
    assert len(files) == len(season.teams) + 1
    assert "site/index.html" in files


def test_every_link_is_relative_and_resolves(season, files):
    existing = folder_files(season, files)
    for path, html in files.items():
        page = parse(html)
        assert "script" not in page.tags and "img" not in page.tags
        for href in page.hrefs:
            assert "://" not in href and not href.startswith("/"), href
            target = PurePosixPath(path).parent / href
            parts: list[str] = []
            for part in target.parts:
                if part == "..":
                    parts.pop()
                elif part != ".":
                    parts.append(part)
            assert "/".join(parts) in existing, (path, href)


def test_team_page_lists_its_games_with_sides_address_and_subscribe_link(season, files):
    feeds = team_feed_names(season)
    for team in season.teams:
        stem = feeds[team][:-4]
        page = parse(files[f"site/teams/{stem}.html"])
        text = "".join(page.text)
        assert f"../../calendars/{feeds[team]}" in page.hrefs
        games = season.fixtures_of(team)
        sides = [t for t in page.text if t in ("White", "Black")]
        assert sorted(sides) == sorted("White" if f.home == team else "Black" for f in games)
        byes = sum(1 for teams in season.byes.values() if team in teams)
        assert text.count("bye: no game this round") == byes
    assert any("3 Mill Row, Ashford" in "".join(parse(h).text) for h in files.values())


def test_user_text_is_escaped(files):
    index = files["site/index.html"].decode("utf-8")
    assert SCRIPTY not in index and "&lt;script&gt;" in index
    assert SCRIPTY in "".join(parse(files["site/index.html"]).text)


def test_index_names_figures_as_every_output(files):
    text = "".join(parse(files["site/index.html"]).text)
    assert figure_name("breaks_total") in text and figure_name("carry_over_value") in text


def test_deterministic(season, files):
    assert site_files(season, compute_fairness(season)) == files
