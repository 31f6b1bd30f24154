"""Mixing figures against networkx (a general-purpose graph library) and against theorems.

* Perfect pair: the union of the two rounds' games is one Hamiltonian cycle, i.e. the union
  multigraph is connected and 2-regular on all N vertices (definition: Kotzig 1964; Wallis,
  One-Factorizations, 1997, ch. 16). The cycle count of each pair is the number of connected
  components of the union multigraph.
* GK_n (the circle construction) is perfect exactly when n - 1 is prime (Wallis 1997, ch. 16,
  as stated in scheduler/factorization/circle.py).
* An odd league adds a bye vertex (the team sitting out meets it).
"""

from __future__ import annotations

import itertools
import random

import networkx as nx
import pytest

from scheduler.fairness import compute_fairness
from tests.fairness.constructions import (
    canonical_rounds,
    double_round_robin,
    gf_rounds,
    odd_from_even,
    season_of,
)


def _nx_union(rounds_a, rounds_b, vertices):
    g = nx.MultiGraph()
    g.add_nodes_from(vertices)
    g.add_edges_from(rounds_a)
    g.add_edges_from(rounds_b)
    return g


def _nx_figures(rounds, n, odd=False):
    """(perfect pairs, pairs, component matrix) from networkx; bye vertex 0 for odd leagues."""
    vertices = list(range(0 if odd else 1, n + 1))
    games = []
    for rnd in rounds:
        edges = [(h, a) for h, a in rnd]
        if odd:
            playing = {t for e in edges for t in e}
            edges += [(t, 0) for t in range(1, n + 1) if t not in playing]
        games.append(edges)
    r = len(games)
    matrix = [[0] * r for _ in range(r)]
    perfect = 0
    for i, j in itertools.combinations(range(r), 2):
        g = _nx_union(games[i], games[j], vertices)
        comps = nx.number_connected_components(g)
        matrix[i][j] = matrix[j][i] = comps
        two_regular = all(d == 2 for _, d in g.degree())
        if nx.is_connected(g) and two_regular:
            perfect += 1
    return perfect, r * (r - 1) // 2, matrix


def _shuffled(rounds, n, seed):
    rng = random.Random(seed)
    perm = list(range(1, n + 1))
    rng.shuffle(perm)
    order = list(range(len(rounds)))
    rng.shuffle(order)
    return [[(perm[h - 1], perm[a - 1]) for h, a in rounds[i]] for i in order]


CASES = [
    ("canonical", 6), ("canonical", 8), ("canonical", 10), ("canonical", 12), ("canonical", 16),
    ("gf", 8), ("gf", 16), ("shuffled", 10), ("shuffled", 14),
]


@pytest.mark.parametrize("kind,n", CASES)
def test_mixing_matches_networkx(kind, n):
    if kind == "gf":
        rounds = gf_rounds(n)
    elif kind == "shuffled":
        rounds = _shuffled(canonical_rounds(n), n, seed=n)
    else:
        rounds = canonical_rounds(n)
    report = compute_fairness(season_of(rounds, n))
    perfect, pairs, matrix = _nx_figures(rounds, n)
    assert (report.perfect_pairs, report.pairs) == (perfect, pairs)
    assert [list(row) for row in report.mixing_matrix] == matrix
    assert report.perfect == (perfect == pairs)
    assert report.imperfect_total == pairs - perfect
    for p in report.imperfect_pairs:
        i, j = report.mixing_rounds.index(p.first), report.mixing_rounds.index(p.second)
        lengths = sorted(int(x) for x in p.label.split("+"))
        assert len(lengths) == matrix[i][j] > 1
        assert sum(lengths) == n


@pytest.mark.parametrize("n", [4, 6, 8, 10, 12, 14, 16, 18, 20])
def test_circle_perfect_exactly_when_n_minus_1_prime(n):
    """Wallis 1997 ch. 16: GK_n is perfect iff n-1 is prime."""
    report = compute_fairness(season_of(canonical_rounds(n), n))
    prime = all((n - 1) % p for p in range(2, n - 1))
    assert report.perfect == prime


@pytest.mark.parametrize("n", [5, 7, 9])
def test_odd_league_mixing_with_bye_vertex(n):
    rounds = _shuffled(odd_from_even(canonical_rounds(n + 1), dummy=n + 1), n, seed=1)
    report = compute_fairness(season_of(rounds, n))
    perfect, pairs, matrix = _nx_figures(rounds, n, odd=True)
    assert (report.perfect_pairs, report.pairs) == (perfect, pairs)
    assert [list(row) for row in report.mixing_matrix] == matrix
    assert report.pairs == n * (n - 1) // 2  # C(N-1, 2) with N = n + 1


def test_double_round_robin_uses_the_distinct_pairings():
    """Leg 2 repeats leg 1's pairings: the n-1 distinct pairings are those of leg 1."""
    n = 8
    rounds = double_round_robin(canonical_rounds(n), "inverted")
    report = compute_fairness(season_of(rounds, n, legs=2, scheme="inverted"))
    assert report.mixing_rounds == tuple(range(1, n))
    assert report.pairs == 21 and report.perfect  # 7 is prime
    assert report.mixing_valid


def test_invalid_rounds_are_reported_not_counted():
    """A round in which a team sits out in an even league is not a complete pairing."""
    rounds = canonical_rounds(6)
    rounds[2] = rounds[2][1:]
    report = compute_fairness(season_of(rounds, 6))
    assert not report.mixing_valid
    assert report.mixing_problems
    assert report.mixing_matrix == ()


def test_double_round_robin_with_new_pairings_in_leg_2_measures_leg_1():
    """Leg 2 built from a different factorization (Russell's GF(8) schedule, venues swapped):
    the 14 distinct pairings are not one factorization, so leg 1 alone is measured."""
    n = 8
    leg1 = canonical_rounds(n)
    leg2 = [[(a, h) for h, a in rnd] for rnd in gf_rounds(n)]
    report = compute_fairness(season_of(leg1 + leg2, n, legs=2, scheme="free"))
    assert report.mixing_rounds == tuple(range(1, n))
    assert report.mixing_valid and report.perfect and report.pairs == 21
    assert "leg 1 alone" in report.mixing_note
