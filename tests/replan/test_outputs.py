"""What a re-plan writes, read back by libraries the project did not write (pandas reads
``changes.csv`` as RFC 4180 CSV; the standard json module reads the revision history)."""

from __future__ import annotations

import io
import json
import tomllib
from datetime import date

import pandas as pd
import pytest

from scheduler.config import parse_league
from scheduler.errors import ConfigError
from scheduler.export.season_json import dumps_season, loads_season
from scheduler.season import Fixture, Revision, Season
from tests.replan.conftest import LEAGUE
from tests.replan.test_scenarios import fixtures, replan_and_check, round_games


def test_changes_csv_and_revisions_read_back(season_dir, tmp_path):
    game = round_games(fixtures(season_dir), 3)[0]
    body = (f'[[postponed]]\nhome = "{game["home"]}"\naway = "{game["away"]}"\n'
            '[[withdrawn]]\nteam = "Saltings Albion"\npolicy = "keep_played"\n')
    replan_and_check(season_dir, tmp_path, body)
    text = (season_dir / "changes.csv").read_bytes().decode("utf-8")
    games, _, teams = text.partition("\r\n\r\n")
    table = pd.read_csv(io.StringIO(games), dtype=str, keep_default_na=False)
    per_team = pd.read_csv(io.StringIO(teams))
    assert list(table.columns[:5]) == ["change", "round", "leg", "home", "away"]
    cancelled = table[table["change"] == "cancelled"]
    assert (cancelled["new_date"] == "").all() and len(cancelled) > 0
    moved = table[table["change"] != "cancelled"]
    assert (moved["new_date"] > "2031-03-22").all()
    # every team count equals the rows that name the team
    for team, count in zip(per_team["team"], per_team["changed_games"], strict=True):
        assert count == ((table["home"] == team) | (table["away"] == team)).sum()
    data = json.loads((season_dir / "season.json").read_text(encoding="utf-8"))
    assert [r["changed"] for r in data["revisions"]] == [0, len(table)]
    # changes.csv belongs to the folder's unit: listed (with its hash) in the manifest, so the
    # next re-plan does not take it for a file of the user's
    manifest = json.loads((season_dir / ".season-manifest.json").read_text(encoding="utf-8"))
    listed = json.dumps(manifest)
    assert "changes.csv" in listed
    # the report lists every changed game, read back with the standard HTML parser
    from html.parser import HTMLParser

    class Rows(HTMLParser):
        def __init__(self) -> None:
            super().__init__()
            self.inside, self.rows = False, 0

        def handle_starttag(self, tag, attrs):
            if tag == "table" and ("class", "changes") in attrs:
                self.inside = True
            elif tag == "tr" and self.inside:
                self.rows += 1

        def handle_endtag(self, tag):
            if tag == "table":
                self.inside = False

    parser = Rows()
    parser.feed((season_dir / "report.html").read_text(encoding="utf-8"))
    assert parser.rows == len(table) + 1  # the header row and one row per changed game


def test_revision_history_round_trips():
    season = Season(league="L", season_id="S", teams=("A", "B"),
                    fixtures=(Fixture(round=1, home="A", away="B", date=date(2031, 3, 1)),),
                    revision="b", revisions=(Revision("a"), Revision("b", date(2031, 3, 1), 2,
                                                                      "re-planned")))
    text = dumps_season(season)
    assert loads_season(text) == season
    plain = Season(league="L", season_id="S", teams=("A", "B"), fixtures=season.fixtures)
    assert "revisions" not in json.loads(dumps_season(plain))  # older files stay as they were


def test_reserve_dates_outside_the_season_are_refused():
    data = tomllib.loads(LEAGUE.read_text(encoding="utf-8"))
    data["calendar"]["reserve_dates"] = ["2032-01-10"]
    with pytest.raises(ConfigError) as info:
        parse_league(data)
    assert "calendar.reserve_dates[0]: 2032-01-10 is outside the season" in str(info.value)
