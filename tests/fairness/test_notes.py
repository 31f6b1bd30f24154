"""Notes on silent effects (scheduler.fairness.notes), against outside facts.

Clock changes: the European Union's summer-time rule (Directive 2000/84/EC, art. 2 and 3:
summer time begins at 01:00 UTC on the last Sunday of March and ends at 01:00 UTC on the last
Sunday of October; verified) gives the dates and hours independently of zoneinfo; the
expected dates are computed here from that rule with the calendar module.
"""

from __future__ import annotations

import calendar
import json
from dataclasses import replace
from datetime import UTC, date, datetime, time, timedelta
from zoneinfo import ZoneInfo

import pytest

from scheduler.config import load_league
from scheduler.fairness.notes import clock_change, silent_effect_notes, silent_effects
from scheduler.season import Fixture, Season

LONDON = ZoneInfo("Europe/London")


def last_sunday(year: int, month: int) -> date:
    """The last Sunday of a month, from the calendar module (not from zoneinfo)."""
    days = calendar.monthrange(year, month)[1]
    last = date(year, month, days)
    return last - timedelta(days=(last.weekday() - 6) % 7)


LEAGUE = """
[league]
name = "Test Valley League"
season = "2031"
timezone = "Europe/London"
solve_seconds = 2

[calendar]
start = 2031-03-09
end = 2031-06-29
weekdays = ["sun"]
kickoff = "01:30"

[[venues]]
name = "Ashford Rec"
address = "3 Mill Row, Ashford"

[[venues]]
name = "Brook Park"

[[teams]]
name = "Ashford"
home_venue = "Ashford Rec"

[[teams]]
name = "Brookvale"
home_venue = "Brook Park"

[[teams]]
name = "Cedar Hill"
home_venue = "Ashford Rec"

[[teams]]
name = "Dunmore"
home_venue = "Brook Park"

[[rules.unavailable]]
team = "Cedar Hill"
dates = [2031-03-23]

[[rules.no_home_games]]
team = "Dunmore"
dates = [2031-05-11]
"""


@pytest.fixture(scope="module")
def league(tmp_path_factory):
    path = tmp_path_factory.mktemp("notes") / "league.toml"
    path.write_text(LEAGUE, encoding="utf-8")
    return load_league(path)


def hand_season(days: list[date], clock: time = time(1, 30)) -> Season:
    rounds = [[("Ashford", "Brookvale"), ("Cedar Hill", "Dunmore")],
              [("Dunmore", "Ashford"), ("Brookvale", "Cedar Hill")],
              [("Ashford", "Cedar Hill"), ("Dunmore", "Brookvale")]]  # fmt: skip
    fixtures = []
    for number, (day, games) in enumerate(zip(days, rounds, strict=True), start=1):
        start = datetime.combine(day, clock).replace(tzinfo=LONDON)
        start = start.astimezone(UTC).astimezone(LONDON)
        for home, away in games:
            fixtures.append(Fixture(number, home, away, date=day, start=start))
    return Season("Test Valley League", "2031", ("Ashford", "Brookvale", "Cedar Hill", "Dunmore"),
                  tuple(fixtures), timezone="Europe/London")  # fmt: skip


def test_clock_change_matches_the_eu_rule():
    for year in (2027, 2031, 2035):
        spring, autumn = last_sunday(year, 3), last_sunday(year, 10)
        # 01:00 UTC is 01:00 GMT in London: 01:00-01:59 local does not exist in spring ...
        kind, at = clock_change(spring, time(1, 30), LONDON)
        assert kind == "skipped" and at.strftime("%H:%M") == "02:30"
        assert at.utcoffset() == timedelta(hours=1)
        # ... and 01:00-01:59 local happens twice in autumn (01:00 UTC = 02:00 BST -> 01:00 GMT).
        kind, at = clock_change(autumn, time(1, 30), LONDON)
        assert kind == "repeated" and at.utcoffset() == timedelta(hours=1)
        for day in (spring - timedelta(days=7), autumn + timedelta(days=7)):
            assert clock_change(day, time(1, 30), LONDON) is None
        assert clock_change(spring, time(2, 30), LONDON) is None


def test_every_kind_of_silent_effect(league):
    spring = last_sunday(2031, 3)  # 2031-03-30, from the EU rule
    season = hand_season([date(2031, 3, 16), spring, date(2031, 4, 6)])
    effects = silent_effects(league, season)
    kinds = {e.kind: e for e in effects}
    assert set(kinds) == {"clock-change", "empty-day", "no-effect", "early-end"}
    empty = kinds["empty-day"]
    assert empty.day == date(2031, 3, 23) and "Cedar Hill is unavailable" in empty.text
    moved = kinds["clock-change"]
    assert moved.day == spring and "01:30" in moved.text and "02:30" in moved.text
    assert "clocks go forward" in moved.text
    gone = kinds["no-effect"]
    assert gone.day == date(2031, 5, 11) and "after the season's last game" in gone.text
    early = kinds["early-end"]
    weeks = (date(2031, 6, 29) - date(2031, 4, 6)).days // 7
    assert f"{weeks} weeks before" in early.text
    assert [e.day for e in effects] == sorted(e.day for e in effects)
    assert silent_effect_notes(league, season) == tuple(e.text for e in effects)


def test_a_season_without_surprises_has_no_notes(league):
    quiet = replace(league, calendar=replace(league.calendar, end=date(2031, 4, 6),
                                             kickoff=time(15, 0)),
                    rules=replace(league.rules, unavailable=(), no_home_games=()))  # fmt: skip
    season = hand_season([date(2031, 3, 16), date(2031, 3, 23), date(2031, 3, 30)], time(15))
    assert silent_effects(quiet, season) == ()


def test_no_dates_no_notes(league):
    season = hand_season([date(2031, 3, 16), date(2031, 3, 23), date(2031, 3, 30)])
    bare = replace(season, fixtures=tuple(replace(f, date=None, start=None)
                                          for f in season.fixtures))  # fmt: skip
    assert silent_effects(league, bare) == ()


def test_planned_season_carries_the_notes_to_json_and_report(league):
    from scheduler.export.report import render_report
    from scheduler.export.season_json import dumps_season
    from scheduler.fairness import compute_fairness
    from scheduler.plan import plan_season

    result = plan_season(league)
    season = result.season
    assert season.venue_addresses == {"Ashford Rec": "3 Mill Row, Ashford"}
    expected = silent_effect_notes(league, season)
    assert any("Cedar Hill is unavailable" in n for n in expected)
    assert all(n in season.notes and n in result.notes for n in expected)
    data = json.loads(dumps_season(season, compute_fairness(season)))
    assert all(n in data["notes"] for n in expected)
    page = render_report(season, compute_fairness(season))
    assert "Cedar Hill is unavailable" in page


def test_open_ended_calendar_finds_the_empty_day(league):
    open_end = replace(league, calendar=replace(league.calendar, end=None))
    season = hand_season([date(2031, 3, 16), last_sunday(2031, 3), date(2031, 4, 6)])
    kinds = [e.kind for e in silent_effects(open_end, season)]
    assert "empty-day" in kinds and "early-end" not in kinds
