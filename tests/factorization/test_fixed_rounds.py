"""The fixed-round lemma (``scheduler.factorization.fixed_rounds``): a symmetry of a perfect
one-factorization that keeps two rounds and fixes a vertex is the identity.

Outside checks: the starters of the plain enumerations (Z_7 to Z_17: all starters against OEIS
A006204 and the perfect ones against docs/one-factorizations.md in test_starters) are tested
symmetry by symmetry, perfection read by networkx (each union of two rounds connected); the
catalogue's starter found with a multiplier must obey the lemma; and the
complete searches recorded in docs/factorization-search.md (Z_55 with u = 21 and 34, Z_51 with
u = 16 and 35, Z_11 ⋊ Z_5 with (10, 0), all empty) and in test_structured_spaces (Z_13 ⋊ Z_3)
are spaces the lemma rules out.
"""

from __future__ import annotations

from math import gcd

import networkx as nx
import numpy as np
import pytest

from scheduler.factorization import nonabelian_starters as na
from scheduler.factorization.catalogue import catalogue_entries
from scheduler.factorization.fixed_rounds import (
    fixed_elements,
    fixed_point_free_multipliers,
    keeps_no_perfect_starter,
)
from scheduler.factorization.groups import cyclic
from scheduler.factorization.starters import enumerate_starters, is_perfect_starter


def invariant(starter, perm):
    pairs = {frozenset(p) for p in starter}
    return all(frozenset((int(perm[a]), int(perm[b]))) in pairs for a, b in starter)


def connected_unions(starter, m):
    def factor(g):
        return [(m, g)] + [((a + g) % m, (b + g) % m) for a, b in starter]

    return all(nx.is_connected(nx.MultiGraph(factor(0) + factor(g))) for g in range(1, m))


@pytest.mark.parametrize("m", [7, 9, 11, 13, 15, 17])
def test_perfect_cyclic_starters_have_only_fixed_point_free_multipliers(m):
    group = cyclic(m)
    free = set(fixed_point_free_multipliers(group))
    ruled_out_but_inhabited = 0
    for starter in enumerate_starters(group):
        perfect = is_perfect_starter(group, starter)
        if perfect:
            assert connected_unions(starter, m)
        for u in group.units():
            if u == 1 or not invariant(starter, group.multiplier(u)):
                continue
            if perfect:
                assert u in free, (m, starter, u)
                assert not keeps_no_perfect_starter(group.multiplier(u))
            elif keeps_no_perfect_starter(group.multiplier(u)):
                ruled_out_but_inhabited += 1
    # for composite m the lemma is not vacuous: ruled-out spaces hold starters, no perfect one
    # (for prime m every multiplier is fixed-point free)
    assert (ruled_out_but_inhabited > 0) == (m in (9, 15))


def test_fixed_point_free_multipliers_of_the_open_orders():
    # u - 1 must be a unit for u and for each of its non-trivial powers
    assert fixed_point_free_multipliers(cyclic(51)) == [50]
    assert fixed_point_free_multipliers(cyclic(55)) == [54]
    for m, u in [(51, 16), (51, 35), (55, 21), (55, 34)]:
        perm = cyclic(m).multiplier(u)
        assert keeps_no_perfect_starter(perm)
        assert fixed_elements(perm) == [g for g in range(1, m) if (u - 1) * g % m == 0]
    assert fixed_elements(cyclic(55).multiplier(21)) == [11, 22, 33, 44]
    assert fixed_point_free_multipliers(cyclic(7)) == [2, 3, 4, 5, 6]
    # Z_49, u = 3 fixes no non-zero element, but u^6 (of order 7) fixes the multiples of 7
    assert not fixed_elements(cyclic(49).multiplier(3))
    assert keeps_no_perfect_starter(cyclic(49).multiplier(3))


def test_the_catalogue_starter_with_a_multiplier_obeys_the_lemma():
    entries = [e for e in catalogue_entries() if e.multiplier != 1]
    assert entries, "the catalogue has a starter found with a multiplier (Z_49, u = 18)"
    for entry in entries:
        m = entry.n - 1
        assert gcd(entry.multiplier - 1, m) == 1
        assert entry.multiplier in fixed_point_free_multipliers(cyclic(m))


@pytest.mark.parametrize(("p", "q"), [(11, 5), (13, 3), (7, 3)])
def test_every_automorphism_of_these_nonabelian_groups_fixes_an_element(p, q):
    """So every symmetric space of their starters is empty; for Z_13 ⋊ Z_3 the complete
    searches of test_structured_spaces (automorphisms of order 13, 12, 6, 4, 3: all exhausted,
    none perfect) agree, and for Z_11 ⋊ Z_5 the recorded settle of (10, 0)."""
    group = na.semidirect(p, q)
    identity = np.arange(p * q)
    count = 0
    for s in range(1, p):
        for c in range(p):
            perm = group.automorphism(s, c)
            if (perm == identity).all():
                continue
            count += 1
            assert fixed_elements(perm), (s, c)  # the automorphism itself fixes an element
            assert keeps_no_perfect_starter(perm)
    assert count == p * (p - 1) - 1
