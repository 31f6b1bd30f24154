"""Every hard rule holds in the planned season, checked by this suite's own rule checker
(tests/balance/rule_checker.py, plain code on the fixtures; the rules as defined in
scheduler/config/model.py). Where a rule forces a visible choice, the test checks that too."""

from __future__ import annotations

import itertools
from datetime import date
from pathlib import Path

import pytest

from scheduler.config.model import CalendarSpec, FixedFixture, Rules, TeamDates
from scheduler.plan import plan_season

from .helpers import league
from .rule_checker import check_season, count_breaks

SPRING = CalendarSpec(start=date(2027, 1, 2), end=date(2027, 7, 31), weekdays=(5,))


def _ok(lg, **kw):
    result = plan_season(lg, time_limit=kw.pop("time_limit", 4))
    problems = check_season(lg, result.season)
    assert problems == [], problems
    return result.season


def test_unavailable_even_league_skips_the_date():
    # even league: every team plays every round, so the date hosts no round at all
    blocked = date(2027, 1, 9)
    lg = league(6, calendar=SPRING,
                rules=Rules(unavailable=(TeamDates("Cobble Hill", (blocked,)),)))
    season = _ok(lg)
    assert blocked not in {f.date for f in season.fixtures}
    assert min(f.date for f in season.fixtures) == date(2027, 1, 2)


def test_unavailable_odd_league_uses_the_bye():
    # odd league: the date may host the round in which that team has its bye
    days = (date(2027, 1, 2), date(2027, 1, 9), date(2027, 1, 16), date(2027, 1, 23),
            date(2027, 1, 30))
    lg = league(5, calendar=CalendarSpec(start=days[0], dates=days),
                rules=Rules(unavailable=(TeamDates("Brook Farm", (days[2],)),)))
    season = _ok(lg)
    r = next(f.round for f in season.fixtures if f.date == days[2])
    assert season.byes[r] == ("Brook Farm",)


def test_no_home_games_and_shared_ground():
    lg = league(8, legs=2, calendar=SPRING, rules=Rules(
        no_home_games=(TeamDates("Alder Vale", (date(2027, 1, 2), date(2027, 1, 9))),),
        shared_grounds=(("Dunmere", "Elm Quay"), ("Fernwick", "Gorse Bank"))))
    _ok(lg)


def test_fixed_fixtures_by_round_and_by_date():
    lg = league(8, calendar=SPRING, rules=Rules(fixed=(
        FixedFixture("Harbour Town", "Alder Vale", round=1),
        FixedFixture("Brook Farm", "Cobble Hill", round=4),
        FixedFixture("Dunmere", "Elm Quay", date=date(2027, 2, 6)),
        FixedFixture("Gorse Bank", "Fernwick", round=7, any_venue=True))))
    season = _ok(lg)
    f1 = next(f for f in season.fixtures if f.round == 1 and "Alder Vale" in f.teams)
    assert (f1.home, f1.away) == ("Harbour Town", "Alder Vale")


@pytest.mark.parametrize("teams,legs", [(8, 2), (7, 2), (6, 1)])
def test_home_and_away_runs(teams, legs):
    lg = league(teams, legs=legs, rules=Rules(max_home_run=2, max_away_run=2))
    _ok(lg)


def test_runs_of_one_force_alternation_in_an_odd_league():
    # an odd league can be break-free (de Werra 1981), so runs of 1 are possible
    lg = league(7, rules=Rules(max_home_run=1, max_away_run=1))
    assert count_breaks(_ok(lg)) == 0


@pytest.mark.parametrize("first,last", [(3, 0), (0, 3), (1, 1)])
def test_no_breaks_first_and_last(first, last):
    # (the pairs of rounds are those of the chosen one-factorization: e.g. with GK_8 no team
    # can go three rounds break-free at the start, found infeasible by the model)
    lg = league(10, legs=2, rules=Rules(no_breaks_first=first, no_breaks_last=last))
    _ok(lg, time_limit=6)


def test_min_rest_days_chooses_days_apart():
    # Wednesdays and Saturdays are offered; three rest days force a week between rounds
    cal = CalendarSpec(start=date(2027, 1, 2), end=date(2027, 4, 30), weekdays=(2, 5))
    lg = league(6, calendar=cal, rules=Rules(min_rest_days=3))
    season = _ok(lg)
    days = sorted({f.date for f in season.fixtures})
    assert all((b - a).days - 1 >= 3 for a, b in itertools.pairwise(days))


def test_min_separation_with_free_scheme():
    lg = league(6, legs=2, scheme="free", rules=Rules(min_separation=4))
    _ok(lg)


def test_separation_is_fixed_by_mirrored_scheme():
    # docs/leg-schemes.md: mirrored keeps every pair exactly n-2 rounds apart
    lg = league(6, legs=2, scheme="mirrored", rules=Rules(min_separation=4))
    season = _ok(lg)
    rounds = {}
    for f in season.fixtures:
        rounds.setdefault(f.pair, []).append(f.round)
    assert {b - a - 1 for a, b in map(sorted, rounds.values())} == {4}


SAMPLES = Path(__file__).resolve().parents[2] / "sample_leagues"


@pytest.mark.parametrize("name", ["evening_hall", "county_double", "club_day"])
def test_sample_leagues(name):
    from scheduler.config import load_league

    path = SAMPLES / f"{name}.toml"
    if not path.exists():
        pytest.skip("sample league not written yet")
    lg = load_league(path)
    result = plan_season(lg, time_limit=min(lg.solve_seconds, 6))
    assert check_season(lg, result.season) == []
    assert result.season.revision and len(result.season.revision) == 12


def test_fixed_fixture_with_round_and_date():
    # both given: that round, played on that date (so earlier days are skipped)
    lg = league(6, calendar=SPRING, rules=Rules(fixed=(
        FixedFixture("Alder Vale", "Brook Farm", round=2, date=date(2027, 1, 23)),)))
    season = _ok(lg)
    f = next(f for f in season.fixtures if f.round == 2 and "Alder Vale" in f.teams)
    assert (f.home, f.away, f.date) == ("Alder Vale", "Brook Farm", date(2027, 1, 23))
