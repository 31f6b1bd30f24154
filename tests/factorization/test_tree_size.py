"""Knuth's tree-size estimates of the starter searches (``scheduler.factorization.tree_size``).

Outside checks: the estimator is unbiased (D. E. Knuth, "Estimating the efficiency of backtrack
programs", Math. Comp. 29 (1975) 121-136; from memory), so its starter counts must agree with
OEIS A006204 (starters in ``Z_{2k+1}``: 3, 9, 25, 133, 631, 3857 for 7..17; verified on oeis.org,
see tests/factorization/test_starters.py) within a few standard errors. The node estimates are
compared with the node counts of complete searches by the search functions, and the counts of
perfect starters with the plain enumerators.
"""

from __future__ import annotations

import numpy as np
import pytest

from scheduler.errors import InputError
from scheduler.factorization.groups import cyclic, product
from scheduler.factorization.nonabelian_starters import (
    enumerate_group_starters,
    is_perfect_group_starter,
    search_perfect_group_starter,
    semidirect,
)
from scheduler.factorization.orbit_factorizations import (
    enumerate_orbit_bases,
    is_perfect_orbit_base,
    search_perfect_orbit_factorization,
)
from scheduler.factorization.search import search_perfect_starter
from scheduler.factorization.starters import enumerate_starters, is_perfect_starter
from scheduler.factorization.tree_size import (
    TreeSizeEstimate,
    estimate_group_starter_search,
    estimate_orbit_search,
    estimate_starter_search,
    estimate_twin_search,
)
from scheduler.factorization.tree_size import _summary as summarise_probes
from scheduler.factorization.twin_point_starters import (
    enumerate_twin_starters,
    is_perfect_twin_starter,
    search_perfect_twin_starter,
)

A006204 = {7: 3, 9: 9, 11: 25, 13: 133, 15: 631, 17: 3857}
SIGMAS = 4.5  # every comparison below: |estimate - exact| <= 4.5 standard errors
COMPLETE = 10**12  # node limit of a complete search


def close(estimate: float, error: float, exact: float) -> bool:
    return abs(estimate - exact) <= SIGMAS * error + 1e-9 * max(1.0, exact)


@pytest.mark.parametrize("m", sorted(A006204))
def test_counts_every_starter_of_a_cyclic_group_as_oeis_a006204(m):
    estimate = estimate_starter_search(cyclic(m), probes=20_000, perfect_only=False)
    assert estimate.whole > 0
    assert close(estimate.starters, estimate.starters_error, A006204[m])


def test_counts_the_perfect_starters_as_the_enumeration():
    for m in (9, 11, 13):
        exact = sum(is_perfect_starter(cyclic(m), s) for s in enumerate_starters(cyclic(m)))
        estimate = estimate_starter_search(cyclic(m), probes=20_000)
        assert close(estimate.starters, estimate.starters_error, exact), (m, estimate, exact)


@pytest.mark.parametrize("m, multiplier", [(39, 16), (51, 4), (27, 10), (35, 6)])
def test_node_estimate_meets_the_complete_search(m, multiplier):
    result = search_perfect_starter(cyclic(m), multiplier=multiplier, exhaustive=True,
                                    base_nodes=COMPLETE, budget=60)
    assert result.exhausted and result.runs == 1
    estimate = estimate_starter_search(cyclic(m), multiplier=multiplier, probes=5_000)
    assert close(estimate.nodes, estimate.nodes_error, result.nodes), (estimate, result.nodes)
    assert estimate.starters == 0.0  # the space holds no perfect starter


def test_group_starters_estimate_against_enumeration_and_complete_search():
    group = semidirect(7, 3)
    every = list(enumerate_group_starters(group))
    estimate = estimate_group_starter_search(group, probes=20_000, perfect_only=False)
    assert close(estimate.starters, estimate.starters_error, len(every))
    perfect = sum(is_perfect_group_starter(group, s) for s in every)
    estimate = estimate_group_starter_search(group, probes=20_000)
    assert close(estimate.starters, estimate.starters_error, perfect)
    group = semidirect(11, 5)
    result = search_perfect_group_starter(group, automorphism=(1, 1), exhaustive=True,
                                          base_nodes=COMPLETE, budget=60)
    assert result.exhausted
    estimate = estimate_group_starter_search(group, automorphism=(1, 1), probes=5_000)
    assert close(estimate.nodes, estimate.nodes_error, result.nodes)


@pytest.mark.parametrize("base, missing, merged", [
    ("Z_13", 3, True), ("Z_3 x Z_3", 7, False), ("Z_9", 7, True), ("Z_7", 2, True),
])
def test_twin_node_estimate_meets_the_complete_search(base, missing, merged):
    result = search_perfect_twin_starter(base, missing, merged=merged, exhaustive=True,
                                         base_nodes=COMPLETE, budget=60)
    assert result.exhausted and result.runs == 1
    estimate = estimate_twin_search(base, missing, merged=merged, probes=5_000)
    assert close(estimate.nodes, estimate.nodes_error, result.nodes), (estimate, result.nodes)
    assert estimate.starters == 0.0


@pytest.mark.parametrize("base, missing", [("Z_7", 2), ("Z_9", 3), ("Z_9", 7)])
def test_twin_perfect_counts_as_the_enumeration(base, missing):
    exact = sum(is_perfect_twin_starter(base, s) for s in enumerate_twin_starters(base, missing))
    estimate = estimate_twin_search(base, missing, probes=20_000)
    assert exact > 0 and estimate.whole > 0
    assert close(estimate.starters, estimate.starters_error, exact), (estimate, exact)


def test_same_seed_same_estimate_and_other_seed_other_paths():
    group = product(3, 5)
    first = estimate_starter_search(group, probes=300, seed=4)
    assert first == estimate_starter_search(group, probes=300, seed=4)
    assert first != estimate_starter_search(group, probes=300, seed=5)
    assert first.space == "Z_3 x Z_5" and first.probes == 300


def test_relative_error():
    assert TreeSizeEstimate("Z_3", 5, 0.0, 0.0, 0.0, 0.0, 0).relative_error == 0.0
    assert TreeSizeEstimate("Z_3", 5, 200.0, 10.0, 0.0, 0.0, 0).relative_error == 0.05


@pytest.mark.parametrize("kwargs, where", [
    ({"probes": 0}, "probes"), ({"probes": True}, "probes"), ({"probes": 2.5}, "probes"),
    ({"seed": "1"}, "seed"), ({"seed": False}, "seed"),
])
def test_bad_arguments(kwargs, where):
    with pytest.raises(InputError) as err:
        estimate_starter_search(cyclic(7), **kwargs)
    assert err.value.location == where
    with pytest.raises(InputError):
        estimate_twin_search("Z_7", 2, **kwargs)


def test_twin_space_must_be_well_posed():
    with pytest.raises(InputError) as err:
        estimate_twin_search("Z_7", 3)  # K_16 needs an even missing element
    assert err.value.location == "missing"


def test_subtree_estimates_meet_the_subtree_searches_and_add_up():
    from scheduler.factorization.search import root_subtrees, settle_subtree_task

    group = cyclic(39)
    whole = estimate_starter_search(group, multiplier=16, probes=5_000)
    total = error2 = 0.0
    for t in root_subtrees(39):
        part = estimate_starter_search(group, multiplier=16, probes=2_000, subtree=t)
        exact = settle_subtree_task("Z_39", 16, t)["nodes"]
        assert close(part.nodes, part.nodes_error, exact), (t, part, exact)
        total += part.nodes
        error2 += part.nodes_error**2
    assert abs(total - whole.nodes) <= SIGMAS * (error2 + whole.nodes_error**2) ** 0.5
    assert part.space == "Z_39, multiplier 16, subtree 38"
    group5 = semidirect(11, 5)
    part = estimate_group_starter_search(group5, automorphism=(1, 1), probes=2_000, subtree=(7,))
    exact = search_perfect_group_starter(group5, automorphism=(1, 1), subtree=(7,),
                                         exhaustive=True, base_nodes=COMPLETE, budget=60).nodes
    assert close(part.nodes, part.nodes_error, exact)


@pytest.mark.parametrize("r, k", [(1, 9), (3, 3)])
def test_orbit_estimate_matches_a_complete_orbit_search(r, k):
    """Both spaces are empty (Z_9 has no perfect starter; no Z_3-invariant base system of K_10
    with three cycles is perfect, by enumeration), so the search's one run is complete."""
    assert not any(is_perfect_orbit_base(r, k, b) for b in enumerate_orbit_bases(r, k))
    complete = search_perfect_orbit_factorization(r, k, budget=60, base_nodes=COMPLETE,
                                                  max_run_nodes=COMPLETE)
    assert complete.exhausted and complete.runs == 1
    estimate = estimate_orbit_search(r, k, probes=20_000)
    assert close(estimate.nodes, estimate.nodes_error, complete.nodes), (estimate, complete)
    assert estimate.starters == 0


def test_orbit_estimate_with_one_cycle_counts_the_perfect_starters():
    """With one cycle the orbit space is the starter space: the three perfect starters of Z_11
    (enumeration), and the same tree as the starter search's."""
    exact = sum(is_perfect_starter(cyclic(11), s) for s in enumerate_starters(cyclic(11)))
    assert exact == 3
    estimate = estimate_orbit_search(1, 11, probes=20_000)
    assert close(estimate.starters, estimate.starters_error, exact), estimate
    starter_tree = estimate_starter_search(cyclic(11), probes=20_000)
    assert close(estimate.nodes, estimate.nodes_error + starter_tree.nodes_error,
                 starter_tree.nodes)
    with pytest.raises(InputError):
        estimate_orbit_search(3, 4)
    with pytest.raises(InputError):
        estimate_orbit_search(3, 5, probes=0)


def test_summary_of_trees_beyond_1e300_nodes_does_not_overflow():
    """The orbit spaces of K_52 with 17 cycles reach 1e302 nodes (docs/factorization-search.md);
    mean and standard error are computed scaled."""
    estimate = summarise_probes("huge", np.array([1e300, 3e300, 2e300, 2e300]), np.zeros(4))
    assert estimate.nodes == pytest.approx(2e300)
    assert estimate.nodes_error == pytest.approx(np.std([1.0, 3.0, 2.0, 2.0], ddof=1) / 2 * 1e300)
    assert estimate.starters == 0.0 and estimate.starters_error == 0.0
