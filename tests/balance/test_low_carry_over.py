"""The low carry-over search against the published bounds and check values.

Sources: K. G. Russell, Biometrika 67 (1980) 127-131 (lower bound n(n-1), reached for n a power
of two); Lambrechts, Ficker, Goossens & Spieksma, Math. Programming 172 (2018) 277-302 (the
circle method has the maximum, (n-1)(n^2-6n+12)); every single round robin of 6 teams has value
60 (K_6 has one one-factorization up to isomorphism, W. D. Wallis, *One-Factorizations*, 1997,
and all its round orders give 60: computed in the project notes and re-checked here by brute
force over the 5! orders). Best known values n = 10: 108, n = 12: 176 (Miyashiro & Matsui 2006;
Guedes & Ribeiro 2011; from memory) are only printed by ``benchmarks/bench_frontier.py``.
The value is re-counted by the fairness layer's independent count.
"""

from __future__ import annotations

import itertools

import numpy as np
import pytest

from scheduler.balance.low_carry_over import (
    best_low_carry_over,
    carry_over_bounds,
    carry_over_value,
    search_low_carry_over,
)
from scheduler.factorization.circle import circle_rounds
from scheduler.factorization.model import Factorization
from scheduler.factorization.verify import verify_rounds
from scheduler.fairness import carryover as fair


def _fair_value(rounds, n):
    fact = Factorization(n, tuple(rounds), "test", "test")
    return fair.carry_over_value(fair.carry_over_matrix(np.array(fact.partner_table())))


@pytest.mark.parametrize("n", [4, 6, 8, 10, 12, 14, 16])
def test_bounds_and_circle_value(n):
    lower, upper = carry_over_bounds(n)
    assert (lower, upper) == fair.coe_bounds(n)
    assert carry_over_value(circle_rounds(n), n) == upper == _fair_value(circle_rounds(n), n)


def test_every_six_team_order_gives_60():
    rounds = circle_rounds(6)
    values = {carry_over_value([rounds[k] for k in p], 6) for p in itertools.permutations(range(5))}
    assert values == {60}
    assert search_low_carry_over(rounds, 6, seed=1, moves=300).value == 60


@pytest.mark.parametrize("n", [10, 12])
def test_search_leaves_the_circle_maximum_far_behind(n):
    lower, upper = carry_over_bounds(n)
    got = search_low_carry_over(circle_rounds(n), n, seed=3, moves=4000)
    assert verify_rounds(n, got.rounds).valid
    assert got.value == carry_over_value(got.rounds, n) == _fair_value(got.rounds, n)
    assert lower <= got.value < lower + (upper - lower) // 4
    assert 0 <= got.position < 0.25


def test_order_only_keeps_the_factorization():
    n = 12
    rounds = circle_rounds(n)
    got = search_low_carry_over(rounds, n, seed=0, moves=2000, change_pairings=False)
    assert sorted(got.rounds) == sorted(rounds)
    assert got.value < carry_over_value(rounds, n)


def test_powers_of_two_use_russell_and_search_is_deterministic():
    assert best_low_carry_over(8).value == 56
    a = best_low_carry_over(10, seed=5, moves=1500)
    b = best_low_carry_over(10, seed=5, moves=1500)
    assert a == b
