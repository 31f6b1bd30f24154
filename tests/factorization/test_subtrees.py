"""Settling a search space as independent subtree tasks (``root_subtrees``, the ``subtree``
option of the starter searches, ``settle_subtree_task``, ``settle_group_subtree_task``).

The subtrees below the first choice partition the search tree, so their complete searches must
add up exactly to the node count of one complete search of the whole space, and exactly the
subtrees that hold a perfect starter must report one. Outside reference: the patterned starter
{x, -x} of Z_13 induces the circle factorization GK_14, perfect because 13 is prime (Kotzig's
GK_n; docs/one-factorizations.md, from memory), so the subtree of partner 12 must hold one.
"""

from __future__ import annotations

import pytest

from scheduler.errors import InputError
from scheduler.factorization.groups import cyclic
from scheduler.factorization.nonabelian_starters import (
    search_perfect_group_starter,
    semidirect,
    settle_group_subtree_task,
)
from scheduler.factorization.search import (
    forced_partners,
    root_subtrees,
    search_perfect_starter,
    settle_subtree_task,
)
from scheduler.factorization.starters import enumerate_starters, is_perfect_starter

COMPLETE = 2**40


@pytest.mark.parametrize("m, multiplier", [(39, 16), (51, 4), (27, 10)])
def test_subtrees_add_up_to_one_complete_search(m, multiplier):
    whole = search_perfect_starter(cyclic(m), multiplier=multiplier, exhaustive=True,
                                   base_nodes=COMPLETE, budget=60)
    assert whole.exhausted
    parts = [settle_subtree_task(f"Z_{m}", multiplier, t) for t in root_subtrees(m)]
    assert all(p["exhausted"] and p["starter"] is None for p in parts)
    assert sum(p["nodes"] for p in parts) == whole.nodes


def test_group_subtrees_add_up_to_one_complete_search():
    group = semidirect(11, 5)
    whole = search_perfect_group_starter(group, automorphism=(1, 1), exhaustive=True,
                                         base_nodes=COMPLETE, budget=60)
    parts = [settle_group_subtree_task(11, 5, group.r, (1, 1), t) for t in root_subtrees(55)]
    assert whole.exhausted and all(p["exhausted"] for p in parts)
    assert sum(p["nodes"] for p in parts) == whole.nodes
    assert parts[0]["group"] == group.name and parts[0]["automorphism"] == [1, 1]


def test_exactly_the_subtrees_with_a_perfect_starter_report_one():
    group = cyclic(13)
    perfect = [s for s in enumerate_starters(group) if is_perfect_starter(group, s)]
    partners_of_one = {next(b if a == 1 else a for a, b in s if 1 in (a, b)) for s in perfect}
    assert 12 in partners_of_one  # the patterned starter {x, -x}
    for t in root_subtrees(13):
        r = settle_subtree_task("Z_13", 1, t)
        assert (r["starter"] is not None) == (t[0] in partners_of_one)
        assert r["exhausted"] == (t[0] not in partners_of_one)
        if r["starter"] is not None:
            starter = tuple(tuple(p) for p in r["starter"])
            assert is_perfect_starter(group, starter) and (1, t[0]) in starter


def test_root_subtrees_and_forced_partners():
    assert root_subtrees(5) == [(2,), (3,), (4,)]
    assert forced_partners((), 7).shape == (0,)
    for bad in ((0,), (7,), (True,), ("3",), (2.0,)):
        with pytest.raises(InputError) as err:
            forced_partners(bad, 7)
        assert err.value.location == "subtree"
    with pytest.raises(InputError):
        search_perfect_starter(cyclic(7), subtree=(9,))
