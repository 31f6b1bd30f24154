"""The events file and the league's reserve dates."""

from __future__ import annotations

from datetime import date, time
from pathlib import Path

import pytest

from scheduler.calendar import match_days
from scheduler.config import load_league
from scheduler.config.events import load_events, parse_events
from scheduler.errors import ConfigError
from tests.replan.conftest import LEAGUE

ROOT = Path(__file__).resolve().parents[2]


def base(**extra):
    return {"league": "Fenmarsh Test League", "season": "2031", "played_through":
            date(2031, 3, 22), **extra}


def problems(data) -> list[str]:
    with pytest.raises(ConfigError) as info:
        parse_events(data, load_league(LEAGUE))
    return info.value.problems


def test_every_kind_becomes_a_frozen_value():
    events = parse_events(base(
        postponed=[{"home": "Old Sluice", "away": "Marram Athletic", "date": "2031-03-15"}],
        unavailable=[{"team": "Old Sluice", "dates": ["2031-04-05..2031-04-07"]}],
        closed=[{"venue": "Gull Lane", "courts": ["East"], "dates": ["2031-04-12"]}],
        withdrawn=[{"team": "Saltings Albion", "policy": "keep_played"}],
        moved=[{"home": "Reedway Swifts", "away": "Old Sluice", "from": "2031-04-12",
                "date": "2031-04-16", "start": "19:30"}],
    ), load_league(LEAGUE))
    assert events.postponed[0].date == date(2031, 3, 15)
    # a range "a..b" includes both ends (templates/league.toml, excluded)
    assert events.unavailable[0].dates == (date(2031, 4, 5), date(2031, 4, 6), date(2031, 4, 7))
    assert events.closed[0].courts == ("East",)
    assert events.withdrawn_teams() == frozenset({"Saltings Albion"})
    assert events.moved[0].start == time(19, 30)
    assert events.moved[0].planned_date == date(2031, 4, 12)
    with pytest.raises(AttributeError):
        events.played_through = date(2031, 1, 1)  # type: ignore[misc]


def test_located_problems_with_suggestions():
    found = problems(base(
        postponed=[{"home": "Old Sluise", "away": "Marram Athletic"}],
        closed=[{"venue": "Gull Lane", "courts": ["Eats"], "dates": ["2031-04-12"]}],
        withdrawn=[{"team": "Old Sluice", "policy": "keep"}],
    ))
    assert "postponed[0].home: 'Old Sluise' is not a team; did you mean 'Old Sluice'?" in found
    assert "closed[0].courts[0]: 'Eats' is not a court of Gull Lane; did you mean 'East'?" in found
    assert any(p.startswith("withdrawn[0].policy: 'keep' is not a policy") for p in found)


def test_dates_outside_the_season_and_history():
    found = problems(base(
        played_through=date(2030, 12, 1),
        unavailable=[{"team": "Old Sluice", "dates": ["2032-01-01"]}],
        moved=[{"home": "Old Sluice", "away": "Marram Athletic", "date": "2030-11-01",
                "start": "14:00"}],
    ))
    assert any(p.startswith("played_through: 2030-12-01 is outside the season") for p in found)
    assert any(p.startswith("unavailable[0].dates: 2032-01-01 is outside") for p in found)
    assert any(p.startswith("moved[0].date: 2030-11-01 is outside") for p in found)


def test_unknown_option_and_missing_played_through():
    data = base(postponed=[{"home": "Old Sluice", "away": "Marram Athletic", "when": 1}])
    del data["played_through"]
    found = problems(data)
    assert "played_through: required option is missing" in found
    assert any(p.startswith("postponed[0].when: unknown option") for p in found)


def test_sample_events_file_loads():
    league = load_league(ROOT / "sample_leagues" / "county_double.toml")
    events = load_events(ROOT / "sample_leagues" / "county_double.events.toml", league)
    assert (events.league, events.season) == (league.name, league.season)
    assert len(events.postponed) == 3
    assert len(events.closed[0].dates) == 15  # 2027-10-23..2027-11-06, both ends included


def test_reserve_dates_are_not_match_days_of_the_first_plan():
    league = load_league(LEAGUE)
    days = match_days(league)
    assert league.calendar.reserve_dates == (date(2031, 5, 24), date(2031, 5, 31))
    assert not set(days) & set(league.calendar.reserve_dates)
    # every other Saturday of the season is a match day (2031-03-01 is a Saturday)
    saturdays = {date(2031, 3, 1).fromordinal(date(2031, 3, 1).toordinal() + 7 * k)
                 for k in range(18)}
    assert set(days) == saturdays - set(league.calendar.reserve_dates)


def test_yaml_events_file(tmp_path):
    """The events file may be YAML, read with the league file's YAML rules (YAML 1.2 core
    booleans; dates as ISO text)."""
    path = tmp_path / "events.yaml"
    path.write_text(
        "league: Fenmarsh Test League\nseason: 2031\nplayed_through: 2031-03-22\n"
        "withdrawn:\n  - team: Old Sluice\n    policy: keep_played\n"
        "closed:\n  - venue: Reedway\n    dates: ['2031-04-05..2031-04-06']\n",
        encoding="utf-8")
    events = load_events(path, load_league(LEAGUE))
    assert events.season == "2031" and events.withdrawn[0].policy == "keep_played"
    assert events.closed[0].dates == (date(2031, 4, 5), date(2031, 4, 6))
