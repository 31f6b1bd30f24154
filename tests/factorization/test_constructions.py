"""The two prime families: Kotzig's GK_n and Anderson's GA_2p, checked by the verifier.

Sources: A. Kotzig, "Hamilton graphs and Hamilton circuits", Smolenice 1963 (1964), and
W. D. Wallis, *One-Factorizations*, Kluwer 1997, ch. 16: GK_n is perfect exactly when n - 1 is
prime, and F_i ∪ F_j is Hamiltonian iff gcd(j - i, n - 1) = 1 (x -> 2i - x then x -> 2j - x is
translation by 2(j - i)). B. A. Anderson, J. Combin. Theory Ser. B 14 (1973): GA_2p is perfect
for p prime. Non-perfection of GA_18, GA_30 and the composite counts are [computed] values of
docs/one-factorizations.md §2.2, re-derived here.
"""

from __future__ import annotations

import itertools
import math
import random
from collections import Counter

import networkx as nx
import numpy as np
import pytest

from scheduler.factorization.anderson import anderson_factorization
from scheduler.factorization.circle import circle_factorization
from scheduler.factorization.verify import hamiltonian_pair_matrix, verify_rounds


def _is_prime(k: int) -> bool:
    return k >= 2 and all(k % d for d in range(2, math.isqrt(k) + 1))


def _phi(k: int) -> int:
    return sum(1 for a in range(1, k + 1) if math.gcd(a, k) == 1)


@pytest.mark.parametrize("n", range(4, 61, 2))
def test_gk_perfect_exactly_when_n_minus_1_prime(n):
    """Kotzig 1964; Wallis 1997 ch. 16."""
    cert = circle_factorization(n).certificate()
    assert cert.valid
    assert cert.perfect == _is_prime(n - 1)
    # perfect pairs = m * phi(m) / 2 (pairs i < j with gcd(j - i, m) = 1, notes §2.1)
    m = n - 1
    assert cert.perfect_pairs == m * _phi(m) // 2


@pytest.mark.parametrize("n", range(4, 41, 2))
def test_gk_pair_hamiltonian_iff_gcd_one(n):
    """F_i ∪ F_j Hamiltonian iff gcd(j - i, n - 1) = 1 (Wallis 1997, ch. 16)."""
    matrix = hamiltonian_pair_matrix(n, circle_factorization(n).rounds)
    m = n - 1
    expected = np.array([[i != j and math.gcd(j - i, m) == 1 for j in range(m)] for i in range(m)])
    assert (matrix == expected).all()


@pytest.mark.parametrize(
    ("n", "perfect", "pairs"),
    # docs/one-factorizations.md §2.1 table [computed]; also equal to m * phi(m) / 2
    [(16, 60, 105), (28, 243, 351), (36, 420, 595), (50, 1029, 1176), (64, 1134, 1953),
     (66, 1560, 2080), (70, 1518, 2346), (78, 2310, 2926)],
)
def test_gk_counts_from_notes_table(n, perfect, pairs):
    m = n - 1
    assert perfect == m * _phi(m) // 2  # the table agrees with the formula
    cert = circle_factorization(n).certificate()
    assert (cert.perfect_pairs, cert.pairs) == (perfect, pairs)


@pytest.mark.parametrize("p", [3, 5, 7, 11, 13, 17, 19, 23])
def test_ga_perfect_for_odd_primes(p):
    """Anderson 1973: GA_2p is a perfect one-factorization for p an odd prime."""
    f = anderson_factorization(2 * p)
    cert = f.certificate()
    assert cert.valid and cert.perfect
    assert len(f.rounds) == 2 * p - 1


@pytest.mark.parametrize(
    ("p", "perfect", "pairs"),
    # docs/one-factorizations.md §2.2 [computed]
    [(9, 102, 136), (15, 232, 406), (21, 492, 820), (35, 1656, 2346)],
)
def test_ga_composite_p_is_valid_but_not_perfect(p, perfect, pairs):
    cert = anderson_factorization(2 * p).certificate()
    assert cert.valid and not cert.perfect
    assert (cert.perfect_pairs, cert.pairs) == (perfect, pairs)


def test_ga_labelling_matches_the_definition():
    """G_b contains x_b y_b; H_a = {x_i y_(i+a)} (docs/one-factorizations.md §2.2)."""
    p = 7
    f = anderson_factorization(2 * p)
    for b in range(p):
        assert (b, p + b) in f.rounds[b]
    for a in range(1, p):
        assert set(f.rounds[p - 1 + a]) == {(i, p + (i + a) % p) for i in range(p)}


def _triangle_profile(f):
    """Multiset over triples of rounds of the number of triangles in their union: invariant
    under relabelling vertices and reordering rounds (counted with networkx)."""
    counts = Counter()
    for a, b, c in itertools.combinations(f.rounds, 3):
        g = nx.Graph()
        g.add_edges_from(a + b + c)
        counts[sum(nx.triangles(g).values()) // 3] += 1
    return counts


def test_ga14_and_gk14_are_not_isomorphic():
    """Both perfect, yet not isomorphic (docs/one-factorizations.md §2.2 [computed] with another
    invariant; re-derived here with the triangle profile)."""
    ga = anderson_factorization(14)
    gk = circle_factorization(14)
    assert ga.certificate().perfect and gk.certificate().perfect
    assert _triangle_profile(ga) != _triangle_profile(gk)
    # the invariant really is one: a random relabelling and reordering keeps it
    rng = random.Random(1)
    perm = list(range(14))
    rng.shuffle(perm)
    order = list(range(13))
    rng.shuffle(order)
    assert _triangle_profile(gk.relabel(perm).reorder(order)) == _triangle_profile(gk)


def test_invalid_orders_rejected():
    with pytest.raises(ValueError):
        anderson_factorization(12)
    with pytest.raises(ValueError):
        circle_factorization(7)


def test_k2_single_round():
    cert = verify_rounds(2, circle_factorization(2).rounds)
    assert cert.valid and cert.perfect and cert.pairs == 0
