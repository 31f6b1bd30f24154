"""Courts and time slots: balanced tournament designs.

Source: Schellenberg, van Rees & Vanstone, "The existence of balanced tournament designs",
Ars Combinatoria 3 (1977) 303-318: a BTD(k) (2k teams, k courts, 2k-1 rounds, every team on
every court at most twice) exists for every k except k = 2 (re-proved in Bauman 2001, MMath
thesis, Waterloo). The counts below are made from the fixtures by plain code.
"""

from __future__ import annotations

from collections import Counter
from datetime import time

import pytest

from scheduler.config.model import Priorities, Venue
from scheduler.fairness import compute_fairness
from scheduler.plan import plan_season

from .helpers import league
from .rule_checker import check_season

COURTS_FIRST = Priorities(mixing=1, breaks=1, venue_balance=5, slot_balance=3, carry_over=0)


def _court_use(season):
    use = Counter()
    for f in season.fixtures:
        use[(f.home, f.court)] += 1
        use[(f.away, f.court)] += 1
    return use


@pytest.mark.parametrize("k", [3, 4, 5])
def test_btd_each_team_uses_each_court_at_most_twice(k):
    hall = Venue("Riverside Hall", courts=tuple(f"Court {c}" for c in "ABCDE"[:k]))
    lg = league(2 * k, venues=(hall,), priorities=COURTS_FIRST)
    result = plan_season(lg, time_limit=4)
    assert check_season(lg, result.season) == []
    use = _court_use(result.season)
    assert max(use.values()) == 2
    # since k^2 < k(2k-1) < 2k^2, every team uses every court once or twice
    assert all(use[(t, c)] in (1, 2) for t in lg.team_names for c in hall.courts)
    report = compute_fairness(result.season)
    assert report.court_spread_max is None or report.court_spread_max <= 1


def test_btd2_does_not_exist_best_is_three():
    # k = 2 is the theorem's exception: 4 teams on 2 courts; some team must use a court 3 times,
    # and the model reports that best possible value.
    hall = Venue("Riverside Hall", courts=("Court A", "Court B"))
    lg = league(4, venues=(hall,), priorities=COURTS_FIRST)
    result = plan_season(lg, time_limit=4)
    assert max(_court_use(result.season).values()) == 3


def test_time_slots_as_even_as_possible():
    # 8 teams, 2 courts x 2 slots: each team plays 7 games over 2 slots -> at most 4 in one slot
    # (ceil(7/2)); and over 2 courts -> at most 4 on one court.
    hall = Venue("Riverside Hall", courts=("Court A", "Court B"), slots=(time(19, 0), time(20, 30)))
    lg = league(8, venues=(hall,), priorities=COURTS_FIRST)
    result = plan_season(lg, time_limit=4)
    assert check_season(lg, result.season) == []
    slots = Counter()
    for f in result.season.fixtures:
        slots[(f.home, f.slot)] += 1
        slots[(f.away, f.slot)] += 1
    assert max(slots.values()) == 4
    assert max(_court_use(result.season).values()) == 4
    assert {f.slot for f in result.season.fixtures} == {"19:00", "20:30"}


def test_venue_mode_plays_at_home_venue_with_capacity():
    # two clubs share a one-pitch ground: never both at home on a day (shared_ground_groups).
    venues = tuple(Venue(f"Ground {i}") for i in range(5))
    homes = {"Alder Vale": "Ground 0", "Brook Farm": "Ground 0", "Cobble Hill": "Ground 1",
             "Dunmere": "Ground 2", "Elm Quay": "Ground 3", "Fernwick": "Ground 4"}
    lg = league(6, legs=2, venues=venues, mode="venue", home_venues=homes)
    assert ("Alder Vale", "Brook Farm") in lg.shared_ground_groups
    result = plan_season(lg, time_limit=4)
    assert check_season(lg, result.season) == []
    for f in result.season.fixtures:
        assert f.venue == homes[f.home]


def test_venue_mode_shared_two_court_ground_and_odd_league():
    # capacity 2 (two pitches): both clubs may be at home on the same day, on different pitches;
    # three clubs there with capacity 2 must never all be at home together.
    venues = (Venue("Twin Fields", courts=("Pitch 1", "Pitch 2")), Venue("Ground B"),
              Venue("Ground C"), Venue("Ground D"))
    homes = {"Alder Vale": "Twin Fields", "Brook Farm": "Twin Fields", "Cobble Hill": "Twin Fields",
             "Dunmere": "Ground B", "Elm Quay": "Ground C", "Fernwick": "Ground D",
             "Gorse Bank": "Ground D"}
    lg = league(7, legs=2, venues=venues, mode="venue", home_venues=homes)
    result = plan_season(lg, time_limit=4)
    assert check_season(lg, result.season) == []
    per_day = Counter((f.date, f.venue) for f in result.season.fixtures)
    assert per_day and max(n for (d, v), n in per_day.items() if v == "Twin Fields") <= 2
    assert max(n for (d, v), n in per_day.items() if v == "Ground D") <= 1
