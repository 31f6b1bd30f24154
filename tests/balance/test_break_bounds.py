"""Lower bounds on breaks over every round order and home/away (scheduler.balance.break_bounds).

Checks against what the module did not compute itself:
- brute force inside the test: every round order (itertools) and every home/away, through the
  colouring view of ``docs/perfect-breaks.md`` (a break is a team whose colour changes between
  consecutive positions; the plain Hamming distance over every colouring, without the
  min(d, n - d) shortcut the module uses), for n = 6 and 8;
- the window values against the same brute force over every colouring of the rounds of the
  window (a min-plus product of plain distance matrices, not the module's cycle programme);
- the exact programme :func:`scheduler.balance.perfect_breaks.exact_min_breaks` (Held & Karp,
  J. SIAM 10 (1962) 196-210) for n = 8..14, and the stored exact 16-team values of
  ``docs/perfect-breaks.md`` (computed by that programme);
- de Werra's n - 2 (Annals of Discrete Math. 11 (1981) 381-395) reached by the circle
  schedule: the bound never exceeds it there.
"""

from __future__ import annotations

import itertools
import random
from fractions import Fraction

import numpy as np
import pytest

from scheduler.balance.break_bounds import (
    best_home_away,
    break_lower_bound,
    degree_lower_bound,
    is_perfect,
    polish_order,
    window_lower_bound,
    window_sum,
    window_tables,
)
from scheduler.balance.perfect_breaks import exact_min_breaks
from scheduler.errors import InputError
from scheduler.factorization.anderson import anderson_rounds
from scheduler.factorization.circle import circle_rounds


def _random_factorization(n, seed):
    """GK_n with its teams relabelled and its rounds shuffled (not perfect for n = 10)."""
    rng = random.Random(seed)
    perm = list(range(n))
    rng.shuffle(perm)
    rounds = [tuple(sorted(tuple(sorted((perm[a], perm[b]))) for a, b in r))
              for r in circle_rounds(n)]
    rng.shuffle(rounds)
    return rounds


def _colourings(games, n):
    """Every colouring (vertex bit mask) in which each game joins two colours."""
    out = []
    for bits in range(1 << len(games)):
        mask = 0
        for i, (a, b) in enumerate(games):
            mask |= 1 << (a if (bits >> i) & 1 else b)
        out.append(mask)
    return out


def _distances(rounds, n):
    """``dist[r][s]``: plain Hamming distances between every colouring of r and of s."""
    cols = [np.array(_colourings(g, n), dtype=np.int64) for g in rounds]
    pop = np.vectorize(lambda x: bin(int(x)).count("1"))
    return [[pop(cols[r][:, None] ^ cols[s][None, :]) for s in range(len(rounds))]
            for r in range(len(rounds))]


def _chain_min(dist, seq):
    """Fewest breaks along the rounds ``seq`` in this order, every colouring free."""
    value = np.zeros(dist[seq[0]][seq[0]].shape[0], dtype=np.int64)
    for prev, cur in itertools.pairwise(seq):
        value = (value[:, None] + dist[prev][cur]).min(axis=0)
    return int(value.min())


def _brute_force_min_breaks(rounds, n):
    dist = _distances(rounds, n)
    R = len(rounds)
    return min(_chain_min(dist, order) for order in itertools.permutations(range(R))
               if order[0] < order[-1])


@pytest.mark.parametrize("n,seed", [(6, 0), (8, 1), (8, 2)])
def test_window_values_match_brute_force(n, seed):
    rounds = _random_factorization(n, seed) if seed else circle_rounds(n)
    tables = window_tables(rounds, n)
    dist = _distances(rounds, n)
    R = n - 1
    assert tables.triples is not None
    for window in itertools.permutations(range(R), 3):
        assert tables.pairs[window] == _chain_min(dist, window)
    for four in itertools.permutations(range(R), 4):
        assert tables.triples[four] == _chain_min(dist, four)


@pytest.mark.parametrize("n,seed", [(6, 0), (8, 3)])
def test_four_step_windows_match_brute_force(n, seed):
    rounds = _random_factorization(n, seed) if seed else circle_rounds(n)
    tables = window_tables(rounds, n, quads=True)
    dist = _distances(rounds, n)
    assert tables.quads is not None
    five = list(itertools.permutations(range(n - 1), 5))
    for window in five[::3] if n == 8 else five:
        assert tables.quads[window] == _chain_min(dist, window)


@pytest.mark.parametrize("n,seed", [(6, 0), (6, 3), (8, 0), (8, 4)])
def test_bounds_below_brute_force(n, seed):
    rounds = _random_factorization(n, seed) if seed else circle_rounds(n)
    least = _brute_force_min_breaks(rounds, n)
    assert least == exact_min_breaks(rounds, n).breaks
    tables = window_tables(rounds, n, quads=True)
    for got in (degree_lower_bound(rounds, n, tables=tables),
                window_lower_bound(rounds, n, window=2, tables=tables, iterations=60),
                window_lower_bound(rounds, n, window=3, tables=tables, iterations=60),
                window_lower_bound(rounds, n, window=4, tables=tables, iterations=60)):
        assert n - 2 <= got.bound <= least
        assert got.relaxation <= least


@pytest.mark.parametrize("n,seed", [(8, 5), (10, 6), (10, 7), (12, 8)])
def test_every_penalty_gives_a_valid_bound(n, seed):
    # the Lagrangian bound holds for any penalties, not only the optimised ones
    rounds = _random_factorization(n, seed)
    exact = exact_min_breaks(rounds, n)
    tables = window_tables(rounds, n)
    got = window_lower_bound(rounds, n, tables=tables, iterations=80, target=exact.breaks)
    assert got.relaxation <= exact.breaks and got.bound <= exact.breaks
    if n <= 10:
        four = window_lower_bound(rounds, n, window=4, iterations=40, start=got.penalties)
        assert four.relaxation <= exact.breaks
    # the three-step windows along the optimal schedule itself: L * breaks >= sum of windows
    assert window_sum(tables, exact.order) <= 3 * exact.breaks


@pytest.mark.parametrize("name,rounds,n,exact", [
    ("GA_10", anderson_rounds(10), 10, 10),   # docs/perfect-breaks.md table
    ("GK_12", circle_rounds(12), 12, 10),     # de Werra's n - 2
    ("GK_14", circle_rounds(14), 14, 12),     # de Werra's n - 2
    ("GA_14", anderson_rounds(14), 14, 16),   # docs/perfect-breaks.md (exact programme)
])
def test_perfect_factorizations_below_exact_values(name, rounds, n, exact):
    assert is_perfect(rounds, n)
    got = break_lower_bound(rounds, n, iterations=120, target=exact)
    assert n - 2 <= got.bound <= exact and got.bound % 2 == 0, name


def test_sixteen_team_stored_schedule():
    # the stored 16-team schedule is exact (20 breaks, docs/perfect-breaks.md): the bound on its
    # factorization may not exceed it; the three-step windows already beat n - 2 = 14 on the
    # catalogue's Z_15 starter (exact 22, same page)
    from scheduler.balance.perfect_breaks import stored_best_perfect
    from scheduler.factorization.catalogue import catalogue_factorization

    best = stored_best_perfect(16)
    assert best is not None
    got = break_lower_bound(best.factorization.rounds, 16, iterations=150, target=best.breaks)
    assert 14 <= got.bound <= best.breaks == 20
    z15 = catalogue_factorization(16)
    assert z15 is not None
    strong = window_lower_bound(z15.rounds, 16, iterations=150, target=22)
    assert 14 < strong.bound <= 22
    # the penalties returned are a certificate: the walk with them alone gives the same value
    again = window_lower_bound(z15.rounds, 16, iterations=0, start=strong.penalties)
    assert again.relaxation == strong.relaxation
    assert isinstance(again.relaxation, Fraction)


def test_perfect_check_and_errors():
    assert is_perfect(circle_rounds(12), 12) and not is_perfect(circle_rounds(10), 10)
    with pytest.raises(InputError):
        window_tables(circle_rounds(8)[:-1], 8)
    with pytest.raises(InputError):
        window_lower_bound(circle_rounds(8), 8, window=5)
    with pytest.raises(InputError):
        window_tables(circle_rounds(8), 9)


@pytest.mark.parametrize("n,seed", [(8, 9), (10, 10), (12, 11)])
def test_best_home_away_for_a_fixed_order(n, seed):
    # against the balancer's exact layer programme over full colourings (no min(d, n - d)
    # shortcut) and the plain break counter of the balancer
    from scheduler.balance.anneal import breaks_of
    from scheduler.balance.orders import BreakPaths

    rounds = _random_factorization(n, seed)
    order = random.Random(seed).sample(range(n - 1), n - 1)
    got = best_home_away(rounds, n, order)
    assert got.breaks == BreakPaths(rounds, n).value(order)
    assert breaks_of(rounds, got.home, [list(got.order)], None) == got.breaks
    assert got.breaks >= window_lower_bound(rounds, n, iterations=30).relaxation
    with pytest.raises(InputError):
        best_home_away(rounds, n, order[:-1])


@pytest.mark.parametrize("n,seed", [(8, 12), (10, 13)])
def test_polish_order_never_worse_and_exact(n, seed):
    # the polished schedule is re-counted by the balancer's plain counter and lies between the
    # exact optimum over every order (Held-Karp) and the exact value of the starting order
    from scheduler.balance.anneal import breaks_of
    from scheduler.balance.orders import BreakPaths

    rounds = _random_factorization(n, seed)
    start = random.Random(seed).sample(range(n - 1), n - 1)
    got = polish_order(rounds, n, start, longest_segment=4, max_passes=3)
    assert breaks_of(rounds, got.home, [list(got.order)], None) == got.breaks
    assert got.breaks == BreakPaths(rounds, n).value(list(got.order))
    assert exact_min_breaks(rounds, n).breaks <= got.breaks <= best_home_away(rounds, n,
                                                                                start).breaks
    with pytest.raises(InputError):
        polish_order(rounds, n, start, longest_segment=1)
