"""The randomised perfect-starter search, checked against the exhaustive enumerator.

Reference values: the 8 perfect starters of Z_15 and the absence of any in Z_9 and Z_3 x Z_3
are [computed] in docs/one-factorizations.md §3 and re-derived by ``count_starters``
(test_starters);
every result here is re-checked by the independent verifier.
"""

from __future__ import annotations

import pytest

from scheduler.errors import InputError
from scheduler.factorization.groups import cyclic, galois_field, product
from scheduler.factorization.search import (
    luby,
    multiplier_orbits,
    orbit_representatives,
    search_perfect_starter,
)
from scheduler.factorization.starters import (
    enumerate_starters,
    is_perfect_starter,
    starter_factorization,
)


def test_finds_a_z15_perfect_starter_among_the_enumerated_ones():
    g = cyclic(15)
    perfect = {s for s in enumerate_starters(g) if is_perfect_starter(g, s)}
    assert len(perfect) == 8
    for seed in range(5):
        res = search_perfect_starter(g, seed=seed, budget=5)
        assert res.found and res.starter in perfect


@pytest.mark.parametrize("group", [cyclic(27), galois_field(27), product(3, 9)])
def test_order_27_gives_a_perfect_k28(group):
    res = search_perfect_starter(group, seed=1, budget=30)
    assert res.found
    assert starter_factorization(group, res.starter).certificate().perfect


def test_exhausts_when_no_perfect_starter_exists():
    """Z_9 and Z_3 x Z_3 have no perfect starter (count_starters: 0)."""
    for g in (cyclic(9), product(3, 3)):
        res = search_perfect_starter(g, seed=0, budget=5)
        assert not res.found and res.exhausted


def test_deterministic_for_a_seed():
    g = cyclic(21)
    a = search_perfect_starter(g, seed=7, budget=10)
    b = search_perfect_starter(g, seed=7, budget=10)
    assert a.found and a.starter == b.starter and a.nodes == b.nodes and a.runs == b.runs


def test_multiplier_invariant_result():
    """With multiplier u the starter found satisfies S u = S (K_50 from GF(49), order-3 u)."""
    f = galois_field(49)
    u = next(x for x in f.units() if f.element_order_mul(x) == 3)
    res = search_perfect_starter(f, seed=0, budget=20, multiplier=u)
    assert res.found
    pairs = {frozenset(p) for p in res.starter}
    assert {frozenset(int(f.mul[u, x]) for x in p) for p in pairs} == pairs
    assert starter_factorization(f, res.starter).certificate().perfect


def test_progress_and_work_limit():
    calls = []
    res = search_perfect_starter(cyclic(45), seed=0, budget=30, max_nodes=50_000,
                                 progress=lambda msg, frac: calls.append((frac, msg)))
    assert res.nodes <= 50_000 + 1
    assert calls and all(0.0 <= frac <= 1.0 for frac, _ in calls)


def test_orbits_partition_the_nonzero_elements():
    g = cyclic(63)
    orbits = multiplier_orbits(g, 4)
    assert sum(size for _, size in orbits) == 62
    assert orbit_representatives(g, 1) == list(range(1, 32))


def test_luby_sequence():
    """M. Luby, A. Sinclair, D. Zuckerman, IPL 47 (1993): 1 1 2 1 1 2 4 1 1 2 1 1 2 4 8."""
    assert [luby(i) for i in range(1, 16)] == [1, 1, 2, 1, 1, 2, 4, 1, 1, 2, 1, 1, 2, 4, 8]


@pytest.mark.parametrize(("kwargs", "where"), [({"seed": 1.5}, "seed"), ({"budget": 0}, "budget")])
def test_bad_arguments(kwargs, where):
    with pytest.raises(InputError) as err:
        search_perfect_starter(cyclic(15), **kwargs)
    assert err.value.location == where


def test_exhaustive_runs_settle_spaces_larger_than_the_cap():
    # Z_15 holds 8 perfect starters, Z_9 none (docs/one-factorizations.md §3). With a cap of 50
    # nodes per run the capped restarts can never settle Z_9 (its search tree is larger), while
    # the exhaustive runs (doubling limits, no cap) do, and find Z_15's among the enumerated ones.
    capped = search_perfect_starter(cyclic(9), base_nodes=10, max_run_nodes=50, max_nodes=20_000)
    assert not capped.exhausted and not capped.found
    settled = search_perfect_starter(cyclic(9), base_nodes=10, max_run_nodes=50, exhaustive=True)
    assert settled.exhausted and not settled.found and settled.runs > 1
    g = cyclic(15)
    perfect = {s for s in enumerate_starters(g) if is_perfect_starter(g, s)}
    found = search_perfect_starter(g, base_nodes=10, max_run_nodes=50, exhaustive=True)
    assert found.found and found.starter in perfect
