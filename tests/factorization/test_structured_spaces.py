"""Search spaces beyond cyclic starters: even starters (two fixed points), starters in
non-abelian groups ``Z_p ⋊ Z_q``, and factorizations with a prescribed ``Z_k`` (``r`` cycles and
a fixed point).

Outside checks: OEIS A006204 (starters in ``Z_{2k+1}``: 9 in ``Z_9``, 25 in ``Z_11``, 133 in
``Z_13``, 631 in ``Z_15``), which both generalisations must reproduce in their abelian /
one-cycle special case; the perfect-starter counts of docs/one-factorizations.md §3 (computed, and
re-derived by ``test_starters``): 0 in ``Z_9``, 3 in ``Z_11``, 1 in ``Z_13``, 8 in ``Z_15``;
networkx for matchings and Hamiltonian unions; the project's independent verifier
(``verify_rounds``) for every factorization. The exhaustive Python enumerators and the numba
kernels are compared with each other on small orders.
"""

from __future__ import annotations

import networkx as nx
import numpy as np
import pytest

from scheduler.errors import InputError
from scheduler.factorization import even_starters as ev
from scheduler.factorization import nonabelian_starters as na
from scheduler.factorization import orbit_factorizations as orb
from scheduler.factorization.catalogue import (
    catalogue_orders,
    structured_entries,
    structured_factorization,
)
from scheduler.factorization.policy import factorize
from scheduler.factorization.verify import verify_rounds

A006204 = {9: 9, 11: 25, 13: 133, 15: 631}
PERFECT_STARTERS = {9: 0, 11: 3, 13: 1, 15: 8}


def _nx_perfect(n: int, rounds) -> bool:
    """Perfect one-factorization of K_n, checked with networkx only."""
    graphs = []
    for rnd in rounds:
        g = nx.Graph()
        g.add_nodes_from(range(n))
        g.add_edges_from(rnd)
        if not nx.is_perfect_matching(nx.complete_graph(n), set(map(tuple, rnd))):
            return False
        graphs.append(g)
    all_edges = [tuple(sorted(e)) for rnd in rounds for e in rnd]
    if len(all_edges) != n * (n - 1) // 2 or len(set(all_edges)) != len(all_edges):
        return False
    for i in range(len(graphs)):
        for j in range(i + 1, len(graphs)):
            u = nx.compose(graphs[i], graphs[j])
            if not (nx.is_connected(u) and all(d == 2 for _, d in u.degree())):
                return False
    return True


# ---------------------------------------------------------------- even starters


@pytest.mark.parametrize("M", [4, 6, 8, 10, 12, 14])
def test_even_enumeration_agrees_with_kernel_and_verifier(M):
    perfect_by_missing: dict[int, int] = {}
    total = 0
    for s in ev.enumerate_even_starters(M):
        total += 1
        assert ev.is_even_starter(M, s)
        rounds = ev.even_starter_rounds(M, s)
        cert = verify_rounds(M + 2, rounds)
        assert cert.valid
        assert cert.perfect == ev.is_perfect_even_starter(M, s)
        if cert.perfect:
            m = ev.missing_element(M, s)
            perfect_by_missing[m] = perfect_by_missing.get(m, 0) + 1
    assert total > 0
    for m in range(1, M):
        res = ev.search_perfect_even_starter(M, missing=[m], shuffle=False,
                                             base_nodes=10**9, max_run_nodes=10**9)
        assert res.found == (m in perfect_by_missing)
        assert res.exhausted == (m not in perfect_by_missing)
    # a unit u maps starters missing m to starters missing u m: counts are constant on orbits
    for m, c in perfect_by_missing.items():
        for u in range(1, M, 2):
            if np.gcd(u, M) == 1:
                assert perfect_by_missing.get(u * m % M) == c
    assert M // 2 not in perfect_by_missing


def test_even_starter_factorization_networkx():
    res = ev.search_perfect_even_starter(14, seed=3, budget=10)
    assert res.found
    f = ev.even_starter_factorization(14, res.starter)
    assert f.n == 16 and f.certificate().perfect
    assert _nx_perfect(16, f.rounds)


def test_even_search_finds_k24_and_is_reproducible():
    a = ev.search_perfect_even_starter(22, seed=1, budget=30)
    b = ev.search_perfect_even_starter(22, seed=1, budget=30)
    assert a.found and (a.starter, a.runs, a.nodes) == (b.starter, b.runs, b.nodes)
    assert verify_rounds(24, ev.even_starter_rounds(22, a.starter)).perfect


def test_even_bad_input():
    with pytest.raises(InputError):
        ev.even_starter_rounds(10, [(1, 2)])
    with pytest.raises(InputError):
        ev.search_perfect_even_starter(9)
    assert not ev.is_even_starter(6, [(1, 4), (2, 3)])  # difference 3 = h is not allowed


# ---------------------------------------------------------------- non-abelian groups


def test_semidirect_is_a_nonabelian_group():
    g = na.semidirect(13, 3)
    mul, inv = g.mul, g.inv
    assoc = mul[mul[:, :, None], np.arange(39)[None, None, :]]  # (x y) z
    assoc2 = mul[np.arange(39)[:, None, None], mul[None, :, :]]  # x (y z)
    assert np.array_equal(assoc, assoc2)
    assert np.array_equal(mul[np.arange(39), inv], np.zeros(39))
    assert np.array_equal(mul[0], np.arange(39))
    assert not np.array_equal(mul, mul.T)
    for s, c in [(1, 1), (2, 0), (3, 0), (12, 0)]:
        assert na.is_automorphism(g, g.automorphism(s, c))


def _element_order(g, x):
    k, y = 1, x
    while y != 0:
        y, k = int(g.mul[y, x]), k + 1
    return k


@pytest.mark.parametrize(("p", "q"), [(7, 3), (11, 5), (13, 3)])
def test_the_searched_maps_are_every_automorphism(p, q):
    """Every automorphism of Z_p ⋊ Z_q, found by trying every image of the two generators, is
    one of the p (p - 1) maps (s, c) the searches take: |Aut| = p (p - 1), the order of the
    affine group AGL(1, p) (the automorphism group of these Frobenius groups; from memory).
    docs/factorization-search.md relies on it to say that every symmetry of Z_11 ⋊ Z_5 was
    searched."""
    g = na.semidirect(p, q)
    n = g.order
    a = next(x for x in range(n) if _element_order(g, x) == p)
    b = next(x for x in range(n) if _element_order(g, x) == q)

    def word(i, j, ga, gb):  # ga^i gb^j
        y = 0
        for _ in range(i):
            y = int(g.mul[y, ga])
        for _ in range(j):
            y = int(g.mul[y, gb])
        return y

    words = {word(i, j, a, b): (i, j) for i in range(p) for j in range(q)}
    assert len(words) == n
    found = set()
    for image_a in (x for x in range(n) if _element_order(g, x) == p):
        for image_b in (x for x in range(n) if _element_order(g, x) == q):
            perm = np.array([word(*words[x], image_a, image_b) for x in range(n)])
            if len(set(perm.tolist())) == n and na.is_automorphism(g, perm):
                found.add(tuple(perm.tolist()))
    searched = {tuple(int(v) for v in g.automorphism(s, c))
                for s in range(1, p) for c in range(p)}
    assert len(found) == p * (p - 1)
    assert found == searched


@pytest.mark.parametrize(("p", "q"), [(3, 3), (11, 1), (13, 1), (3, 5), (5, 3)])
def test_abelian_case_matches_oeis(p, q):
    """With r = 1 the group is abelian: Z_3 x Z_3 has 9 starters, none perfect (notes §3);
    Z_3 x Z_5 = Z_15 has 631 (A006204), 8 perfect."""
    g = na.semidirect(p, q, 1)
    starters = list(na.enumerate_group_starters(g))
    perfect = [s for s in starters if na.is_perfect_group_starter(g, s)]
    assert len(starters) == A006204.get(p * q, 9)
    assert len(perfect) == PERFECT_STARTERS.get(p * q, 0)
    for s in perfect[:2]:
        assert verify_rounds(p * q + 1, na.group_starter_rounds(g, s)).perfect


def test_group_search_and_factorization():
    g = na.semidirect(5, 3, 1)
    res = na.search_perfect_group_starter(g, seed=0, budget=10)
    assert res.found
    f = na.group_starter_factorization(g, res.starter)
    assert _nx_perfect(16, f.rounds)


def test_nonabelian_order_39_invariant_spaces_are_empty():
    """Computed (this module's search): no perfect starter of Z_13 ⋊ Z_3 is invariant under an
    automorphism of order 13, 12, 6, 4 or 3 (each space is exhausted in well under a second).
    A found starter would contradict this, so the test also guards the kernel's pruning."""
    g = na.semidirect(13, 3)
    for auto in [(1, 1), (2, 0), (4, 0), (5, 0), (3, 0)]:
        res = na.search_perfect_group_starter(g, automorphism=auto, budget=30,
                                              max_run_nodes=10**8, base_nodes=10**8)
        assert res.exhausted and not res.found


def test_group_bad_input():
    with pytest.raises(InputError):
        na.semidirect(5, 3)  # 3 does not divide 5 - 1
    with pytest.raises(InputError):
        na.group_starter_rounds(na.semidirect(7, 3), [(1, 2)])


# ---------------------------------------------------------------- prescribed Z_k


@pytest.mark.parametrize("k", [9, 11, 13, 15])
def test_one_cycle_is_the_starter_construction(k):
    bases = list(orb.enumerate_orbit_bases(1, k))
    assert len(bases) == A006204[k]
    perfect = [b for b in bases if orb.is_perfect_orbit_base(1, k, b)]
    assert len(perfect) == PERFECT_STARTERS[k]
    res = orb.search_perfect_orbit_factorization(1, k, budget=10, base_nodes=10**8,
                                                 max_run_nodes=10**8)
    assert res.found == bool(perfect) and res.exhausted == (not perfect)


def test_k10_with_three_cycles_enumeration_agrees_with_kernel():
    bases = list(orb.enumerate_orbit_bases(3, 3))
    assert bases
    for b in bases[:50]:
        assert verify_rounds(10, orb.orbit_rounds(3, 3, b)).valid
    any_perfect = any(orb.is_perfect_orbit_base(3, 3, b) for b in bases)
    res = orb.search_perfect_orbit_factorization(3, 3, budget=10, base_nodes=10**8,
                                                 max_run_nodes=10**8)
    assert res.exhausted == (not any_perfect) and res.found == any_perfect


def test_orbit_search_finds_k16():
    res = orb.search_perfect_orbit_factorization(3, 5, seed=0, budget=20)
    assert res.found
    f = orb.orbit_factorization(3, 5, res.base)
    assert f.certificate().perfect and _nx_perfect(16, f.rounds)


def test_orbit_bad_input():
    with pytest.raises(InputError):
        orb.orbit_table(2, 4)
    with pytest.raises(InputError):
        orb.orbit_rounds(3, 5, [[(0, 15)]])


# ---------------------------------------------------------------- shipped structured entries

STRUCTURED = structured_entries()


def test_k40_is_served_by_a_structured_entry():
    """K_40 has a perfect one-factorization (E. Seah & D. R. Stinson, Congr. Numer. c. 1989,
    from memory); the catalogue's is a starter in Z_13 ⋊ Z_3 found by this project's search."""
    assert 40 in {e.n for e in STRUCTURED} and 40 in catalogue_orders()
    for teams in (40, 39):
        f = factorize(teams)
        assert f.n == 40 and "Z_13 x|3 Z_3" in f.method and "catalogue" in f.method
        assert verify_rounds(40, f.rounds).perfect


@pytest.mark.parametrize("entry", STRUCTURED, ids=[f"K_{e.n}-{e.kind}" for e in STRUCTURED])
def test_structured_entry_is_perfect(entry):
    f = structured_factorization(entry)
    assert f.n == entry.n
    cert = verify_rounds(f.n, f.rounds)
    assert cert.valid and cert.perfect and cert.perfect_pairs == (f.n - 1) * (f.n - 2) // 2
    assert _nx_perfect(f.n, f.rounds)
    assert f"seed {entry.seed}" in f.source
    if entry.kind == "group_starter":
        g = na.semidirect(*entry.group)
        assert not np.array_equal(g.mul, g.mul.T)  # genuinely non-abelian
        assert na.is_perfect_group_starter(g, entry.starter)


def test_group_search_exhaustive_mode_settles_with_tiny_runs():
    # the spaces of the test above, settled again from runs of 10 nodes doubling without a cap
    g = na.semidirect(13, 3)
    for auto in [(2, 0), (3, 0)]:
        res = na.search_perfect_group_starter(g, automorphism=auto, budget=60, base_nodes=10,
                                              max_run_nodes=10, exhaustive=True)
        assert res.exhausted and not res.found
