"""Starters, their induced factorizations and the groups they live in.

Sources: OEIS A006204 (number of starters in Z_(2k+1)): 1, 1, 3, 9, 25, 133, 631, 3857, 25905
for Z_3 .. Z_19. Perfect-starter counts (Z_7: 1, Z_9: 0, Z_3 x Z_3: 0, Z_11: 3, Z_13: 1,
Z_15: 8, Z_17: 17) are [computed] values of docs/one-factorizations.md §3, re-derived here by the
exhaustive enumerator. Translation invariance of a starter-induced factorization (perfect pairs
= m * number of good difference classes) is checked against the independent verifier. Finite
field facts: R. Lidl and H. Niederreiter, *Finite Fields* (1997): GF(q)* is cyclic of order
q - 1 with phi(q - 1) generators; multiplication distributes over addition.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from scheduler.errors import InputError
from scheduler.factorization.circle import circle_factorization
from scheduler.factorization.groups import (
    cyclic,
    galois_field,
    group_from_name,
    groups_of_order,
    product,
)
from scheduler.factorization.starters import (
    count_starters,
    enumerate_starters,
    good_differences,
    is_perfect_starter,
    is_starter,
    starter_factorization,
)

A006204 = {3: 1, 5: 1, 7: 3, 9: 9, 11: 25, 13: 133, 15: 631, 17: 3857, 19: 25905}


@pytest.mark.parametrize("m", [3, 5, 7, 9, 11, 13, 15, 17])
def test_starter_counts_match_oeis_a006204(m):
    assert sum(1 for _ in enumerate_starters(cyclic(m))) == A006204[m]


@pytest.mark.parametrize(
    ("group", "starters", "perfect"),
    [("Z_7", 3, 1), ("Z_9", 9, 0), ("Z_3 x Z_3", 9, 0), ("Z_11", 25, 3), ("Z_13", 133, 1),
     ("Z_15", 631, 8), ("Z_17", 3857, 17)],
)
def test_perfect_starter_counts_from_notes(group, starters, perfect):
    assert count_starters(group_from_name(group)) == (starters, perfect)


def test_enumerated_starters_are_starters_and_distinct():
    g = cyclic(13)
    found = list(enumerate_starters(g))
    assert len(set(found)) == len(found)
    assert all(is_starter(g, s) for s in found)


def test_perfect_pairs_equal_m_times_good_classes():
    """Translation invariance (notes §3) against the verifier, on every starter of Z_13."""
    g = cyclic(13)
    for s in enumerate_starters(g):
        f = starter_factorization(g, s)
        cert = f.certificate()
        assert cert.valid
        assert cert.perfect_pairs == 13 * len(good_differences(g, s))
        assert cert.perfect == is_perfect_starter(g, s)


def test_notes_example_starter_in_z15():
    s = [(1, 3), (2, 11), (4, 5), (6, 13), (7, 10), (8, 12), (9, 14)]
    assert is_perfect_starter(cyclic(15), s)
    assert starter_factorization(cyclic(15), s).certificate().perfect


def test_patterned_starter_gives_gk():
    """The patterned starter {x, -x} induces GK_n (notes §2.1)."""
    m = 15
    s = [(x, m - x) for x in range(1, (m + 1) // 2)]
    f = starter_factorization(cyclic(m), s)
    assert set(f.rounds) == set(circle_factorization(m + 1).rounds)


@pytest.mark.parametrize(
    "bad",
    [
        [(1, 2), (3, 4)],                      # too few pairs
        [(1, 2), (3, 4), (5, 6)],              # difference 1 twice
        [(1, 2), (2, 4), (5, 6)],              # element twice
        [(0, 1), (2, 4), (3, 6)],              # contains 0
        [(1, 7), (2, 4), (3, 6)],              # out of range
        [("a", 1), (2, 4), (3, 6)],            # not integers
    ],
)
def test_not_starters(bad):
    g = cyclic(7)
    assert not is_starter(g, bad)
    assert not is_perfect_starter(g, bad)
    with pytest.raises(InputError):
        starter_factorization(g, bad)


@pytest.mark.parametrize("q", [9, 25, 27, 49, 81, 125])
def test_galois_field_axioms(q):
    """Lidl & Niederreiter: a field whose multiplicative group is cyclic of order q - 1."""
    f = galois_field(q)
    rng = np.random.default_rng(q)
    a, b, c = rng.integers(0, q, (3, 300))
    assert (f.mul[a, f.add[b, c]] == f.add[f.mul[a, b], f.mul[a, c]]).all()
    assert (f.mul[a, f.mul[b, c]] == f.mul[f.mul[a, b], c]).all()
    assert (f.add[a, f.neg[a]] == 0).all()
    assert len(f.units()) == q - 1
    generators = [u for u in f.units() if f.element_order_mul(u) == q - 1]
    phi = sum(1 for k in range(1, q) if math.gcd(k, q - 1) == 1)
    assert len(generators) == phi


def test_group_names_round_trip_and_orders():
    for g in [cyclic(15), product(3, 5), product(3, 3, 3), galois_field(27)]:
        h = group_from_name(g.name)
        assert h.name == g.name and h.order == g.order
        assert (h.add == g.add).all() and (h.mul == g.mul).all()
    assert [g.name for g in groups_of_order(27)] == ["Z_27", "GF(27)", "Z_3 x Z_9"]
    assert product(3, 5).label(7) == "(1,2)"


@pytest.mark.parametrize("bad", ["Z_", "Q_5", "GF(15)", "Z_4"])
def test_bad_group_names(bad):
    with pytest.raises(InputError):
        group_from_name(bad)


def test_cyclic_group_tables_are_addition_mod_m():
    g = cyclic(9)
    x = np.arange(9)
    assert (g.add == (x[:, None] + x[None, :]) % 9).all()
    assert (g.neg == (-x) % 9).all()
