"""The verifier against a general-purpose reference (networkx) and on corrupted inputs.

Reference: the union of two perfect matchings is Hamiltonian exactly when the union graph is
connected (it is 2-regular); cycle lengths are the sizes of its connected components
(networkx ``is_connected`` / ``connected_components``, A. Hagberg, D. Schult, P. Swart 2008).
"""

from __future__ import annotations

import random

import networkx as nx
import numpy as np
import pytest

from scheduler.errors import InputError
from scheduler.factorization.circle import circle_factorization
from scheduler.factorization.verify import hamiltonian_pair_matrix, verify_rounds


def _nx_union(a, b) -> nx.MultiGraph:
    g = nx.MultiGraph()
    g.add_edges_from(a)
    g.add_edges_from(b)
    return g


def _nx_reference(n, rounds):
    """(perfect pair count, {(i, j): sorted cycle lengths}) computed with networkx."""
    perfect = 0
    cycles = {}
    for i in range(len(rounds)):
        for j in range(i + 1, len(rounds)):
            g = _nx_union(rounds[i], rounds[j])
            assert all(d == 2 for _, d in g.degree())
            if g.number_of_nodes() == n and nx.is_connected(g):
                perfect += 1
            else:
                cycles[(i, j)] = tuple(sorted(len(c) for c in nx.connected_components(g)))
    return perfect, cycles


def _kempe_swap(rounds, i, j, v):
    """Swap rounds i and j along the alternating cycle through v (keeps a one-factorization)."""
    pi = {a: b for a, b in rounds[i]} | {b: a for a, b in rounds[i]}
    pj = {a: b for a, b in rounds[j]} | {b: a for a, b in rounds[j]}
    cyc_i, cyc_j = set(), set()
    x = v
    while True:
        y = pi[x]
        cyc_i.add(frozenset((x, y)))
        z = pj[y]
        cyc_j.add(frozenset((y, z)))
        x = z
        if x == v:
            break
    new_i = [e for e in rounds[i] if frozenset(e) not in cyc_i] + [tuple(sorted(e)) for e in cyc_j]
    new_j = [e for e in rounds[j] if frozenset(e) not in cyc_j] + [tuple(sorted(e)) for e in cyc_i]
    rounds[i], rounds[j] = sorted(new_i), sorted(new_j)


def _random_factorization(n, rng):
    perm = list(range(n))
    rng.shuffle(perm)
    rounds = [list(r) for r in circle_factorization(n).relabel(perm).rounds]
    for _ in range(3 * n):
        i, j = rng.sample(range(n - 1), 2)
        _kempe_swap(rounds, i, j, rng.randrange(n))
    rng.shuffle(rounds)
    return rounds


@pytest.mark.parametrize("n", [4, 6, 8, 10, 12, 16, 20, 28])
def test_agrees_with_networkx_on_random_factorizations(n):
    rng = random.Random(n)
    for _ in range(3):
        rounds = _random_factorization(n, rng)
        cert = verify_rounds(n, rounds, max_listed=10**6)
        assert cert.valid, cert.problems
        perfect, cycles = _nx_reference(n, rounds)
        assert cert.perfect_pairs == perfect
        assert cert.pairs == (n - 1) * (n - 2) // 2
        assert cert.imperfect_total == len(cycles)
        assert {(p.first, p.second): p.cycles for p in cert.imperfect} == cycles
        matrix = hamiltonian_pair_matrix(n, rounds)
        assert matrix.shape == (n - 1, n - 1)
        assert int(np.triu(matrix, 1).sum()) == perfect
        assert (matrix == matrix.T).all() and not matrix.diagonal().any()


def test_listing_is_capped_but_counting_is_not():
    f = circle_factorization(16)
    cert = verify_rounds(16, f.rounds, max_listed=3)
    _, cycles = _nx_reference(16, [list(r) for r in f.rounds])
    assert len(cert.imperfect) == 3
    assert cert.imperfect_total == len(cycles) == 105 - 60
    assert cert.imperfect[0].label == "+".join(str(c) for c in cycles[(0, 3)])


def _nx_is_one_factorization(n, rounds) -> bool:
    """networkx reference: every round a perfect matching of K_n, all games distinct and
    together the edge set of K_n."""
    complete = nx.complete_graph(n)
    if not all(nx.is_perfect_matching(complete, {tuple(g) for g in r}) for r in rounds):
        return False
    games = nx.Graph()
    games.add_edges_from(g for r in rounds for g in r)
    total = sum(len(r) for r in rounds)
    return total == games.number_of_edges() and nx.utils.graphs_equal(games, complete)


def test_networkx_reference_agrees_on_validity():
    good = [list(r) for r in circle_factorization(10).rounds]
    dup = [list(r) for r in good]
    dup[1] = dup[2]
    broken = [list(r) for r in good]
    broken[4] = [(0, 1), (1, 2), (3, 4), (5, 6), (7, 8)]
    for rounds, expected in [(good, True), (dup, False), (broken, False)]:
        assert _nx_is_one_factorization(10, rounds) is expected
        assert verify_rounds(10, rounds).valid is expected


def test_pair_matrix_rejects_non_matchings():
    with pytest.raises(InputError):
        hamiltonian_pair_matrix(4, [[(0, 1), (1, 2)], [(0, 2), (1, 3)], [(0, 3), (1, 2)]])
    with pytest.raises(InputError):
        hamiltonian_pair_matrix(5, [])


def test_duplicated_pair_is_reported():
    rounds = [list(r) for r in circle_factorization(8).rounds]
    rounds[1] = rounds[2]
    cert = verify_rounds(8, rounds)
    assert not cert.valid and not cert.perfect
    assert any("more than one round" in p for p in cert.problems)
    assert any("never meet" in p for p in cert.problems)


def test_non_matching_round_is_reported():
    rounds = [list(r) for r in circle_factorization(8).rounds]
    rounds[3] = [(0, 1), (1, 2), (3, 4), (5, 6)]
    cert = verify_rounds(8, rounds)
    assert not cert.valid
    assert "round 3: vertices [1] play more than once" in cert.problems
    assert "round 3: vertices [7] do not play" in cert.problems


@pytest.mark.parametrize(
    ("n", "rounds", "fragment"),
    [
        (7, [], "even"),
        (True, [], "integer"),
        (4, [[(0, 1), (2, 3)]], "needs 3 rounds"),
        (4, [[(0, 1), (2, 3)], [(0, 2), (1, 3)], [(0, 3), (1, 1)]], "with itself"),
        (4, [[(0, 1), (2, 3)], [(0, 2), (1, 3)], [(0, 3), (1, 4)]], "outside 0..3"),
        (4, [[(0, 1), (2, 3)], [(0, 2), (1, 3)], [(0, 3), (1, 2.0)]], "integer vertices"),
        (4, [[(0, 1), (2, 3)], [(0, 2), (1, 3)], "ab"], "integer vertices"),
    ],
)
def test_malformed_input_gives_readable_problems(n, rounds, fragment):
    cert = verify_rounds(n, rounds)
    assert not cert.valid
    assert any(fragment in p for p in cert.problems), cert.problems


def test_bye_reading_matches_hamiltonian_path_on_real_teams():
    """With a bye vertex, a perfect pair is a Hamiltonian path on the real teams (networkx)."""
    n = 12
    rng = random.Random(5)
    rounds = _random_factorization(n, rng)
    cert = verify_rounds(n, rounds)
    bye = n - 1
    paths = 0
    for i in range(n - 1):
        for j in range(i + 1, n - 1):
            g = nx.Graph()
            g.add_nodes_from(range(n - 1))
            g.add_edges_from(e for e in rounds[i] + rounds[j] if bye not in e)
            if nx.is_connected(g) and nx.is_tree(g) and max(d for _, d in g.degree()) <= 2:
                paths += 1
    assert cert.perfect_pairs == paths
