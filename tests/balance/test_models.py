"""The balancer's building blocks against published facts.

- The canonical schedule (circle method with de Werra's orientation, docs/leg-schemes.md; de Werra
  1981, Annals of Discrete Math. 11:381-395): n-2 breaks, exactly two teams without a break,
  every other team with exactly one, (n-2)/2 or n/2 home games per team.
- The annealing start never exceeds the Post & Woeginger bound: every timetable admits a
  home/away assignment with at most n(n-2)/4 breaks (Discrete Optimization 3 (2006) 165-173),
  and never goes below de Werra's n-2.
- Several rounds on one match day: increasing kick-off times, one game per team at a time.
"""

from __future__ import annotations

import itertools
from datetime import date, time

import pytest

from scheduler import leg_schemes
from scheduler.balance.anneal import anneal, breaks_of
from scheduler.balance.starting_point import canonical_hint
from scheduler.config.model import CalendarSpec, Rules, Venue
from scheduler.errors import InfeasibleError
from scheduler.factorization import factorize
from scheduler.factorization.circle import circle_rounds
from scheduler.plan import plan_season

from .helpers import league
from .rule_checker import check_season


@pytest.mark.parametrize("n", [4, 6, 8, 10, 12, 14, 16, 18, 20])
def test_canonical_schedule_check_values(n):
    order, home = canonical_hint(n)
    rounds = circle_rounds(n)
    assert sorted(order) == list(range(n - 1))
    assert breaks_of(rounds, home, [order], None) == n - 2
    # mirrored double round robin: 3n-6 (docs/leg-schemes.md check values)
    assert breaks_of(rounds, home, [order, order], None) == 3 * n - 6
    per_team = []
    homes = []
    for v in range(n):
        seq = []
        for k in order:
            a, b = next(g for g in rounds[k] if v in g)
            seq.append(home[(a, b)] == (v == a))
        per_team.append(sum(x == y for x, y in itertools.pairwise(seq)))
        homes.append(sum(seq))
    assert sorted(per_team) == [0, 0] + [1] * (n - 2)
    assert set(homes) <= {(n - 2) // 2, n // 2}


@pytest.mark.parametrize("n", [10, 12, 16])
def test_annealing_start_within_known_bounds(n):
    fact = factorize(n, seed=0, budget=2.0)
    maps = leg_schemes.leg_maps("mirrored", 1, n - 1)
    order, home, value = anneal(fact.rounds, n, maps, None, seed=0, moves=40_000)
    assert value == breaks_of(fact.rounds, home, [order], None)
    assert n - 2 <= value <= n * (n - 2) // 4
    assert anneal(fact.rounds, n, maps, None, seed=0, moves=40_000) == (order, home, value)


def test_several_rounds_a_day_take_increasing_kick_offs():
    hall = Venue("Lantern Room", courts=("Table 1", "Table 2", "Table 3"),
                 slots=(time(9, 30), time(11, 0), time(13, 30)))
    days = (date(2027, 5, 15), date(2027, 5, 16))
    lg = league(6, venues=(hall,), calendar=CalendarSpec(start=days[0], dates=days,
                                                         rounds_per_day=3))
    season = plan_season(lg, time_limit=3).season
    assert check_season(lg, season) == []
    by_round = {}
    for f in season.fixtures:
        by_round.setdefault(f.round, set()).add(f.start)
    rs = sorted(by_round)
    # the rounds of one day take disjoint, increasing bands of kick-off times
    for r1, r2 in itertools.pairwise(rs):
        if min(by_round[r1]).date() == min(by_round[r2]).date():
            assert max(by_round[r1]) < min(by_round[r2])
    assert {s.date() for r in rs[:3] for s in by_round[r]} == {days[0]}
    assert {s.date() for r in rs[3:] for s in by_round[r]} == {days[1]}


def test_min_rest_days_with_several_rounds_a_day_is_named():
    days = (date(2027, 5, 15), date(2027, 5, 16))
    lg = league(6, calendar=CalendarSpec(start=days[0], dates=days, rounds_per_day=3),
                rules=Rules(min_rest_days=1))
    with pytest.raises(InfeasibleError) as info:
        plan_season(lg, time_limit=2)
    assert info.value.conflicts == ["min_rest_days = 1 (with 3 rounds on each match day)"]


def test_too_few_places_is_explained():
    hall = Venue("Small Hall", courts=("Court A", "Court B"))
    with pytest.raises(InfeasibleError) as info:
        plan_season(league(8, venues=(hall,)), time_limit=2)
    assert "2 places (courts × time slots) at the venues" in info.value.conflicts
