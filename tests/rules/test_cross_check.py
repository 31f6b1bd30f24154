"""The rules' own checks (``scheduler.rules``) against a from-the-definition computation.

``tests/rules/reference.py`` reads every hard rule literally (naive loops over the fixtures,
written apart from ``scheduler.rules``). Random seasons (the circle method's pairings, random
venues, random match days, sometimes two legs in a random order) under random rules must get
the same verdict from both: the same rules broken, by the same teams, pairs or venues.
"""

from __future__ import annotations

import random
from datetime import date, timedelta

import pytest

from scheduler.config.model import (
    CalendarSpec,
    FixedFixture,
    Format,
    League,
    Rules,
    Team,
    TeamDates,
    Venue,
)
from scheduler.factorization.circle import circle_rounds
from scheduler.rules import RULES, check_rules
from scheduler.season import Fixture, Season

from .reference import broken

TOWNS = ("Alder Vale", "Brook Farm", "Cobble Hill", "Dunmere", "Elm Quay", "Fernwick",
         "Gorse Bank", "Harbour Town")


def _random_case(seed: int) -> tuple[League, Season]:
    rng = random.Random(seed)
    n = rng.choice([4, 6, 8])
    legs = rng.choice([1, 2])
    names = TOWNS[:n]
    grounds = (Venue("North Ground", courts=("A",)), Venue("South Park", courts=("A", "B")))
    teams = tuple(Team(name, name[:3].upper(), grounds[i % 2].name) for i, name in
                  enumerate(names))
    rounds = list(circle_rounds(n))
    rng.shuffle(rounds)
    games = []
    for leg in range(legs):
        order = list(range(n - 1)) if leg == 0 else rng.sample(range(n - 1), n - 1)
        for k in order:
            games.append([(b, a) if leg else (a, b) for a, b in rounds[k]])
    # random venues in leg 1 (later legs swap), random gaps between match days
    flip = {frozenset(g): rng.random() < 0.5 for rnd in games[: n - 1] for g in rnd}
    day = date(2027, 1, 2)
    fixtures = []
    days = []
    for r, rnd in enumerate(games, start=1):
        day += timedelta(days=rng.choice([1, 3, 7, 7, 14]))
        days.append(day)
        for a, b in rnd:
            home, away = (b, a) if flip[frozenset((a, b))] else (a, b)
            fixtures.append(Fixture(r, names[home], names[away], leg=(r - 1) // (n - 1) + 1,
                                    venue=teams[home].home_venue, date=day))
    pick = rng.sample(names, 3)
    rules = Rules(
        unavailable=(TeamDates(pick[0], tuple(rng.sample(days, 2))),),
        no_home_games=(TeamDates(pick[1], tuple(rng.sample(days, 2))),),
        shared_grounds=((pick[0], pick[2]),) if rng.random() < 0.7 else (),
        fixed=(FixedFixture(fixtures[0].home, fixtures[0].away, round=rng.choice([1, 2]),
                            any_venue=rng.random() < 0.5),),
        max_home_run=rng.choice([None, 1, 2, 3]),
        max_away_run=rng.choice([None, 1, 2, 3]),
        no_breaks_first=rng.choice([0, 1, 2]),
        no_breaks_last=rng.choice([0, 1, 2]),
        min_rest_days=rng.choice([None, 1, 3, 6]),
        min_separation=rng.choice([None, 1, 3]) if legs > 1 else None,
    )
    league = League("Cross League", "2027", "Europe/London", teams, grounds,
                    format=Format(legs=legs, home_meaning="venue"),
                    calendar=CalendarSpec(start=date(2027, 1, 2)), rules=rules)
    season = Season("Cross League", "2027", names, tuple(fixtures), legs=legs)
    return league, season


@pytest.mark.parametrize("seed", range(60))
def test_rule_checks_agree_with_the_definitions(seed):
    league, season = _random_case(seed)
    expected = broken(league, season)
    checks = {c.rule: c for c in check_rules(league, season)}
    for rule in RULES:
        want = expected.get(rule.key, set())
        if rule.key not in checks:
            assert not want, (rule.key, want)
            continue
        got = {v.team for v in checks[rule.key].violations}
        assert got == want, (rule.key, got, want)
        assert checks[rule.key].kept == (not want)


def test_the_random_cases_break_and_keep_every_rule_somewhere():
    """The cross-check is not vacuous: over the cases each rule is both kept and broken."""
    kept, broke = set(), set()
    for seed in range(60):
        for check in check_rules(*_random_case(seed)):
            (kept if check.kept else broke).add(check.rule)
    every = {rule.key for rule in RULES}
    assert broke == every
    assert every - {"unavailable_days"} <= kept
