"""Each hard rule on its own: the planner keeps it (its constraints work), and its independent
check finds a hand-made violation, naming who broke it, where and what (``docs/rules.md``).

The violations are built by hand from the definitions: a team at home three rounds running
breaks "at most 2 home games in a row"; two games four days apart leave 3 rest days; etc."""

from __future__ import annotations

from dataclasses import replace
from datetime import date, timedelta

import pytest

from scheduler.config.model import CalendarSpec, FixedFixture, Rules, TeamDates, Venue
from scheduler.plan import plan_season
from scheduler.rules import RULES, check_rules
from scheduler.season import Fixture, Season

from .helpers import league

SATURDAYS = CalendarSpec(start=date(2027, 1, 2), end=date(2027, 6, 30), weekdays=(5,))
DAY = date(2027, 1, 16)

CASES = {
    "runs": Rules(max_home_run=2, max_away_run=2),
    "break_free_ends": Rules(no_breaks_first=1, no_breaks_last=1),
    "rest_days": Rules(min_rest_days=6),
    "separation": Rules(min_separation=3),
    "unavailable_days": Rules(unavailable=(TeamDates("Brook Farm", (DAY,)),)),
    "no_home_days": Rules(no_home_games=(TeamDates("Alder Vale", (DAY,)),)),
    "shared_grounds": Rules(shared_grounds=(("Alder Vale", "Brook Farm"),)),
    "fixed_games": Rules(fixed=(FixedFixture("Dunmere", "Alder Vale", round=2),)),
}


def _league_for(key: str):
    if key == "venue_capacity":
        small = Venue("Small Ground", courts=("Pitch",))
        big = Venue("Big Ground", courts=("Pitch 1", "Pitch 2", "Pitch 3"))
        homes = {"Alder Vale": "Small Ground", "Brook Farm": "Small Ground",
                 "Cobble Hill": "Big Ground", "Dunmere": "Big Ground", "Elm Quay": "Big Ground",
                 "Fernwick": "Big Ground"}
        return league(6, venues=(small, big), mode="venue", home_venues=homes,
                      calendar=SATURDAYS)
    legs = 2 if key == "separation" else 1
    scheme = "free" if key == "separation" else "mirrored"
    return league(6, legs=legs, scheme=scheme, rules=CASES[key], calendar=SATURDAYS)


def test_every_rule_has_a_case():
    assert {rule.key for rule in RULES} == {*CASES, "venue_capacity"}


@pytest.mark.parametrize("key", [rule.key for rule in RULES])
def test_the_planner_keeps_the_rule(key):
    lg = _league_for(key)
    result = plan_season(lg, time_limit=3)
    checks = {c.rule: c for c in check_rules(lg, result.season)}
    assert key in checks, "the rule is on for this league"
    assert checks[key].kept, checks[key].violations


def _season(rounds: list[list[tuple[str, str]]], names, days=None, venue=None) -> Season:
    days = days or [date(2027, 1, 2) + timedelta(weeks=r) for r in range(len(rounds))]
    fixtures = tuple(Fixture(r + 1, h, a, date=days[r], venue=venue(h) if venue else None)
                     for r, games in enumerate(rounds) for h, a in games)
    return Season("Test League", "2027", tuple(names), fixtures)


NAMES = ("Alder Vale", "Brook Farm", "Cobble Hill", "Dunmere")
# a 4-team single round robin, Alder Vale at home in all three rounds
ROUNDS = [[("Alder Vale", "Brook Farm"), ("Cobble Hill", "Dunmere")],
          [("Alder Vale", "Cobble Hill"), ("Dunmere", "Brook Farm")],
          [("Alder Vale", "Dunmere"), ("Brook Farm", "Cobble Hill")]]


def _violations(rules: Rules, season: Season, **kwargs):
    lg = league(4, rules=rules, **kwargs)
    (check,) = check_rules(lg, season)
    assert not check.kept
    return check.violations


def test_runs_violation_names_team_and_round():
    (v,) = _violations(Rules(max_home_run=2), _season(ROUNDS, NAMES))
    assert (v.team, v.round) == ("Alder Vale", 3)
    assert "3 home games in a row" in v.what


def test_break_at_the_start_is_found():
    found = _violations(Rules(no_breaks_first=1), _season(ROUNDS, NAMES))
    assert ("Alder Vale", 2) in {(v.team, v.round) for v in found}


def test_rest_days_counted_as_whole_days_between_games():
    days = [date(2027, 1, 2), date(2027, 1, 6), date(2027, 1, 20)]  # Saturday, Wednesday
    found = _violations(Rules(min_rest_days=4), _season(ROUNDS, NAMES, days))
    assert {v.round for v in found} == {2}
    assert all("3 rest days" in v.what for v in found)
    assert len(found) == 4  # every team plays in rounds 1 and 2


def test_unavailable_and_no_home_days():
    season = _season(ROUNDS, NAMES)
    day = season.fixtures[2].date  # round 2
    (v,) = _violations(Rules(unavailable=(TeamDates("Dunmere", (day,)),)), season)
    assert (v.team, v.round, v.date) == ("Dunmere", 2, day)
    (v,) = _violations(Rules(no_home_games=(TeamDates("Alder Vale", (day,)),)), season)
    assert (v.team, v.round) == ("Alder Vale", 2)


def test_shared_ground_and_fixed_game():
    season = _season(ROUNDS, NAMES)
    (v,) = _violations(Rules(shared_grounds=(("Alder Vale", "Cobble Hill"),)), season)
    assert (v.team, v.round) == ("Alder Vale, Cobble Hill", 1)
    (v,) = _violations(Rules(fixed=(FixedFixture("Brook Farm", "Alder Vale", round=1),)),
                       season)
    assert v.team == "Brook Farm, Alder Vale" and v.round == 1


def test_separation_counts_rounds_strictly_between():
    swapped = [[(a, h) for h, a in r] for r in ROUNDS]
    rounds = [*ROUNDS, swapped[2], swapped[0], swapped[1]]
    found = _violations(Rules(min_separation=1), _season(rounds, NAMES), legs=2, scheme="free")
    assert {v.team for v in found} == {"Alder Vale, Dunmere", "Brook Farm, Cobble Hill"}
    assert all(v.round == 4 for v in found)


def test_venue_capacity():
    small = Venue("Small Ground", courts=("Pitch",))
    lg = league(4, venues=(small,), mode="venue",
                home_venues={name: "Small Ground" for name in NAMES})
    season = _season(ROUNDS, NAMES, venue=lambda home: "Small Ground")
    checks = {c.rule: c for c in check_rules(lg, season)}
    assert not checks["venue_capacity"].kept
    assert checks["venue_capacity"].violations[0].team == "Small Ground"


def test_rules_that_are_off_are_not_listed():
    lg = league(4, rules=Rules(min_rest_days=0, min_separation=0, no_breaks_first=0))
    assert check_rules(lg, _season(ROUNDS, NAMES)) == ()
    lg = replace(lg, rules=Rules(max_home_run=3))
    assert [c.rule for c in check_rules(lg, _season(ROUNDS, NAMES))] == ["runs"]


# A re-planned game keeps its round number but not its date (docs/replanning.md), so the checks
# read a team's games in date order. Here round 1 was postponed to after round 3.
POSTPONED_DAYS = [date(2027, 1, 30), date(2027, 1, 9), date(2027, 1, 16)]


def test_runs_are_read_in_date_order():
    # Alder Vale: home, away, home in round order, but rounds 2, 3, 1 by date: away, home, home
    rounds = [[("Alder Vale", "Brook Farm"), ("Cobble Hill", "Dunmere")],
              [("Cobble Hill", "Alder Vale"), ("Dunmere", "Brook Farm")],
              [("Alder Vale", "Dunmere"), ("Brook Farm", "Cobble Hill")]]
    in_round_order = _violations(Rules(max_home_run=1), _season(rounds, NAMES))
    assert "Alder Vale" not in {v.team for v in in_round_order}
    found = _violations(Rules(max_home_run=1), _season(rounds, NAMES, POSTPONED_DAYS))
    assert ("Alder Vale", 1) in {(v.team, v.round) for v in found}
    assert all("2 home games in a row" in v.what for v in found)


def test_separation_of_a_replanned_season_counts_match_days():
    from scheduler.season import Revision

    swapped = [[(a, h) for h, a in r] for r in ROUNDS]
    rounds = [*ROUNDS, swapped[0], swapped[1], swapped[2]]  # every pair 2 rounds apart
    days = [date(2027, 1, 2) + timedelta(weeks=r) for r in range(6)]
    days[0] = days[3] + timedelta(days=3)  # round 1 re-played between rounds 4 and 5
    rules = Rules(min_separation=2)
    first_plan = _season(rounds, NAMES, days)
    lg = league(4, rules=rules, legs=2, scheme="free")
    (check,) = check_rules(lg, first_plan)
    assert check.kept  # a first plan is judged in rounds, as it was planned
    replanned = replace(first_plan, revisions=(Revision("a" * 12), Revision(
        "b" * 12, played_through=date(2027, 1, 1), changed=1)))
    found = _violations(rules, replanned, legs=2, scheme="free")
    # the re-played round-1 games now sit on the match day right after round 4's meeting
    assert {v.team for v in found} == {"Alder Vale, Brook Farm", "Cobble Hill, Dunmere"}
    assert all("0 match days apart" in v.what for v in found)
