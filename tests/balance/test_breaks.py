"""Fewest breaks: the planner reaches the proven lower bounds.

Sources: D. de Werra, "Scheduling in sports", Annals of Discrete Math. 11 (1981) 381-395:
a single round robin (SRR) of n teams (n even) has at least n-2 breaks, reached by the canonical
schedule; a mirrored double round robin has at least 3n-6 (de Werra's bound, proof re-derived in
docs/leg-schemes.md). French 2n, English and inverted 2n-4: derived in docs/leg-schemes.md
(2n-4 = two legs of n-2 each; checked exhaustively in tests/balance/test_leg_schemes.py), not found
stated in a published source. Odd n: a break-free SRR exists (de Werra 1981), with the bye on
the circle's fixed vertex.
Breaks are counted twice: by this suite's own rule checker and by scheduler.fairness.
"""

from __future__ import annotations

import pytest

from scheduler.config.model import Priorities
from scheduler.fairness import compute_fairness
from scheduler.plan import plan_season

from .helpers import league
from .rule_checker import check_season, count_breaks

BREAKS_FIRST = Priorities(mixing=1, breaks=5, venue_balance=0, slot_balance=0, carry_over=0)


def _plan(teams, legs=1, scheme="mirrored", time_limit=4.0):
    lg = league(teams, legs=legs, scheme=scheme, priorities=BREAKS_FIRST)
    result = plan_season(lg, time_limit=time_limit)
    assert check_season(lg, result.season) == []
    return result


@pytest.mark.parametrize("n", [4, 6, 8, 10, 12])
def test_srr_even_has_exactly_n_minus_2_breaks(n):
    # de Werra 1981: lower bound n-2, reached by the canonical circle schedule.
    result = _plan(n)
    assert count_breaks(result.season) == n - 2
    assert compute_fairness(result.season).breaks_total == n - 2


@pytest.mark.parametrize("n", [4, 6, 8, 10, 12])
def test_mirrored_drr_has_3n_minus_6_breaks(n):
    # de Werra 1981 (3n-6 for mirrored double round robins).
    result = _plan(n, legs=2, scheme="mirrored")
    assert count_breaks(result.season) == 3 * n - 6


@pytest.mark.parametrize("n", [4, 6, 8, 10])
def test_french_drr_has_2n_breaks(n):
    # docs/leg-schemes.md, derived: every team has at least 2 breaks under the French scheme.
    result = _plan(n, legs=2, scheme="french")
    assert count_breaks(result.season) == 2 * n


@pytest.mark.parametrize("n", [4, 6, 8, 10, 12])
def test_inverted_drr_has_2n_minus_4_breaks(n):
    # docs/leg-schemes.md, derived (two SRR legs of n-2 each; the junction repeats one game with
    # swapped venues, so it is never a break).
    result = _plan(n, legs=2, scheme="inverted")
    assert count_breaks(result.season) == 2 * n - 4


@pytest.mark.parametrize("n", [4, 6, 8, 10, 12])
def test_english_drr_has_2n_minus_4_breaks(n):
    # docs/leg-schemes.md, derived (2n-4 = two legs of n-2) and computed for n = 4, 6, 8; reached
    # here by the canonical schedule with its round order rotated by one.
    result = _plan(n, legs=2, scheme="english")
    assert count_breaks(result.season) == 2 * n - 4


@pytest.mark.parametrize("n", [4, 6, 8, 10, 12])
def test_free_drr_reaches_2n_minus_4(n):
    # any two-leg DRR needs n-2 breaks per leg (de Werra 1981); the free scheme reaches 2n-4.
    result = _plan(n, legs=2, scheme="free")
    assert count_breaks(result.season) == 2 * n - 4


@pytest.mark.parametrize("n", [5, 7, 9])
def test_srr_odd_has_no_breaks(n):
    # de Werra 1981: for an odd number of teams a break-free SRR exists.
    result = _plan(n)
    assert count_breaks(result.season) == 0
    assert len(result.season.byes) == n  # every round has one bye
    assert sorted(t for b in result.season.byes.values() for t in b) == sorted(result.season.teams)


@pytest.mark.parametrize("n", [5, 7])
def test_mirrored_odd_has_n_breaks(n):
    # docs/leg-schemes.md (proved there): with byes skipped every team breaks at the leg junction,
    # so a mirrored DRR of an odd league has at least n breaks; n is reached.
    result = _plan(n, legs=2)
    assert count_breaks(result.season) == n


def test_breaks_above_bound_are_never_reported_below_it():
    # Post & Woeginger 2006 (Discrete Optimization 3:165-173): an optimal home/away assignment of
    # any timetable has at most n(n-2)/4 breaks; together with de Werra, n-2 <= breaks <= n(n-2)/4.
    for n in (6, 8, 10):
        breaks = count_breaks(_plan(n).season)
        assert n - 2 <= breaks <= n * (n - 2) // 4
