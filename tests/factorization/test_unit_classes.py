"""Settling cyclic starter spaces up to multiplication by units
(``scheduler.factorization.unit_classes`` and the ``up_to_units`` option of the searches).

Outside reference: multiplying a starter of ``Z_m`` by a unit gives a starter inducing an
isomorphic one-factorization (the multiplier equivalence of starters; J. H. Dinitz and
D. R. Stinson, "Room squares and related designs", Wiley 1992, from memory); the test checks it
on every starter of ``Z_13`` with networkx counting the components of each union of two
one-factors. The searches up to units are checked against a plain enumeration of the perfect
starters grouped into classes by hand (in this file), and against the complete subtree searches.
"""

from __future__ import annotations

from math import gcd

import networkx as nx
import numpy as np
import pytest

from scheduler.errors import InputError
from scheduler.factorization.groups import cyclic, product
from scheduler.factorization.search import (
    root_subtrees,
    search_perfect_starter,
    settle_subtree_task,
)
from scheduler.factorization.starters import enumerate_starters, is_perfect_starter
from scheduler.factorization.tree_size import estimate_starter_search
from scheduler.factorization.unit_classes import (
    allowed_pairs,
    ratio_class,
    subtree_pair_mask,
    unit_class_partners,
    unit_class_subtrees,
)

COMPLETE = 2**40


def units(m):
    return [x for x in range(1, m) if gcd(x, m) == 1]


def scaled(starter, v, m):
    return tuple(sorted(tuple(sorted((a * v % m, b * v % m))) for a, b in starter))


def least_class(starter, m):
    """The least ratio class over the pairs of two units, computed directly."""
    return min(min(b * pow(a, -1, m) % m, a * pow(b, -1, m) % m)
               for a, b in starter if gcd(a, m) == 1 and gcd(b, m) == 1)


def hamiltonian_unions(starter, m):
    """Perfection read by networkx: every union F_0 + F_g is one cycle through m + 1 points."""
    def factor(g):
        return [(m, g)] + [((a + g) % m, (b + g) % m) for a, b in starter]

    for g in range(1, m):
        union = nx.MultiGraph(factor(0) + factor(g))
        if nx.number_connected_components(union) != 1:
            return False
    return True


def test_partners_are_the_units_not_above_their_inverse():
    assert unit_class_partners(7) == [2, 3, 6]  # 2*4 = 3*5 = 6*6 = 1 (mod 7)
    assert unit_class_partners(9) == [2, 4, 8]  # 2*5 = 4*7 = 8*8 = 1 (mod 9)
    partners = unit_class_partners(55)
    assert all(y <= pow(y, -1, 55) and gcd(y, 55) == 1 for y in partners)
    # 40 units: 1 and the self-inverse 21, 34, 54 alone, the other 36 in 18 inverse pairs
    assert len(partners) == 3 + 18 and {21, 34, 54} <= set(partners)
    assert unit_class_subtrees(9) == [(2,), (4,), (8,)]
    assert ratio_class(37, 55) == 3 and ratio_class(3, 55) == 3


@pytest.mark.parametrize("bad", [8, 1, True, 105, "55"])
def test_orders_where_the_argument_does_not_hold_are_refused(bad):
    # 105 = 3 * 5 * 7 has 48 units against 56 non-zero non-units
    with pytest.raises(InputError) as err:
        unit_class_partners(bad)
    assert err.value.location == "order"


def test_mask_is_invariant_under_every_multiplier():
    m = 55
    mask = allowed_pairs(m, 21)
    for v in units(m):
        perm = np.array([x * v % m for x in range(m)])
        assert (mask[np.ix_(perm, perm)] == mask).all()
    assert not mask[1, 2] and not mask[2, 1] and mask[1, 21] and mask[5, 7]


def test_mask_needs_a_cyclic_group_and_a_unit_class_subtree():
    with pytest.raises(InputError) as err:
        subtree_pair_mask(product(3, 3), (2,))
    assert err.value.location == "group"
    with pytest.raises(InputError) as err:
        subtree_pair_mask(cyclic(13), (10,))  # 10 = 1/4 mod 13: class 4, met in subtree 4
    assert err.value.location == "subtree"
    with pytest.raises(InputError):
        search_perfect_starter(cyclic(13), subtree=(), up_to_units=True)


def test_scaling_by_a_unit_keeps_starters_and_perfection():
    m = 13
    group = cyclic(m)
    for starter in enumerate_starters(group):
        perfect = hamiltonian_unions(starter, m)
        assert perfect == is_perfect_starter(group, starter)
        for v in (2, 5, 12):
            image = scaled(starter, v, m)
            assert is_perfect_starter(group, image) == perfect


@pytest.mark.parametrize("m, multiplier", [(11, 1), (13, 1), (15, 1), (9, 1), (13, 3), (15, 4)])
def test_exactly_the_least_classes_of_perfect_starters_are_found(m, multiplier):
    group = cyclic(m)
    perfect = [s for s in enumerate_starters(group) if is_perfect_starter(group, s)
               and scaled(s, multiplier, m) == tuple(sorted(s))]
    expected = {least_class(s, m) for s in perfect}
    for (y,) in unit_class_subtrees(m):
        r = settle_subtree_task(f"Z_{m}", multiplier, (y,), up_to_units=True)
        assert r["up_to_units"] and r["exhausted"] == (r["starter"] is None)
        assert (r["starter"] is not None) == (y in expected), (m, multiplier, y)
        if r["starter"] is not None:
            starter = tuple(tuple(p) for p in r["starter"])
            assert is_perfect_starter(group, starter) and least_class(starter, m) == y
            assert (1, y) in starter or (y, 1) in starter


@pytest.mark.parametrize("m, multiplier", [(39, 16), (27, 10), (51, 4)])
def test_up_to_units_settles_what_the_whole_tree_settles_with_fewer_nodes(m, multiplier):
    plain = [settle_subtree_task(f"Z_{m}", multiplier, t) for t in root_subtrees(m)]
    classes = [settle_subtree_task(f"Z_{m}", multiplier, t, up_to_units=True)
               for t in unit_class_subtrees(m)]
    assert all(r["exhausted"] for r in plain + classes)
    assert sum(r["nodes"] for r in classes) < sum(r["nodes"] for r in plain)


def test_a_space_with_perfect_starters_is_found_up_to_units():
    # Z_19: 19 is prime, so the patterned starter {x, -x} is perfect (GK_20), among others
    found = [search_perfect_starter(cyclic(19), subtree=t, up_to_units=True, exhaustive=True,
                                    base_nodes=COMPLETE).found for t in unit_class_subtrees(19)]
    assert any(found)


def test_estimate_up_to_units_meets_the_complete_search():
    exact = settle_subtree_task("Z_39", 16, (2,), up_to_units=True)["nodes"]
    estimate = estimate_starter_search(cyclic(39), multiplier=16, probes=3_000, subtree=(2,),
                                       up_to_units=True)
    assert abs(estimate.nodes - exact) <= 4.5 * estimate.nodes_error + 1e-9 * exact
    assert estimate.space == "Z_39, multiplier 16, up to units, subtree 2"
