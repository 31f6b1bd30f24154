"""Perfect one-factorization families, canonical forms and the stored enumeration.

Outside checks:

* the independent verifier (:func:`scheduler.factorization.verify.verify_rounds`) on every
  factorization produced or stored;
* automorphism-group orders by brute force over all 8! relabellings against those the
  canonical form reports;
* K_6, K_8 and K_10 each have exactly one perfect one-factorization up to isomorphism (K_6 and
  K_8: W. D. Wallis, *One-Factorizations*, Kluwer 1997; K_10: only GA_10, as the 396 classes of
  OEIS A000474 contain one perfect one; from memory), K_12 has five (J. H. Dinitz, D. K. Garnick
  & B. D. McKay, J. Combin. Des. 2 (1994); from memory): the stored enumeration must agree;
* GK_14 and GA_14 are not isomorphic (B. A. Anderson, J. Combin. Theory B 14 (1973); from
  memory): their canonical forms and invariants must differ;
* the stored break minima are re-computed by an independent Held-Karp programme over full
  colourings (``tests/balance/test_orders.py``) for n <= 10 and by the exact programme for 12,
  and every stored schedule is re-counted.
"""

from __future__ import annotations

import itertools
import json
from importlib import resources

import pytest

from scheduler.balance.anneal import breaks_of
from scheduler.balance.orders import BreakPaths
from scheduler.balance.perfect_breaks import exact_min_breaks
from scheduler.errors import InputError
from scheduler.factorization.anderson import anderson_rounds
from scheduler.factorization.circle import circle_rounds
from scheduler.factorization.groups import cyclic
from scheduler.factorization.perfect_family import (
    canonical_form,
    perfect_family,
    triple_profile,
)
from scheduler.factorization.starters import enumerate_starters, is_perfect_starter, starter_rounds
from scheduler.factorization.verify import verify_rounds
from tests.balance.test_orders import _held_karp_min_breaks


def _stored():
    text = resources.files("scheduler.factorization").joinpath(
        "data/perfect_small.json").read_text(encoding="utf-8")
    return json.loads(text)


def _tuple_rounds(rounds):
    return tuple(tuple((int(a), int(b)) for a, b in r) for r in rounds)


def _brute_automorphisms(n, rounds):
    """Vertex permutations mapping the set of rounds onto itself, by trying all n! of them."""
    target = {frozenset(frozenset(g) for g in r) for r in rounds}
    count = 0
    for perm in itertools.permutations(range(n)):
        image = {frozenset(frozenset((perm[a], perm[b])) for a, b in r) for r in rounds}
        count += image == target
    return count


def test_canonical_form_counts_automorphisms_by_brute_force():
    n = 8
    rounds = circle_rounds(n)
    form, aut = canonical_form(rounds, n)
    assert aut == _brute_automorphisms(n, rounds)
    relabel = [5, 2, 7, 0, 3, 6, 1, 4]
    moved = [[(relabel[a], relabel[b]) for a, b in r] for r in rounds][::-1]
    assert canonical_form(moved, n)[0] == form


def test_canonical_form_separates_gk14_and_ga14_and_refuses_imperfect():
    gk, ga = circle_rounds(14), anderson_rounds(14)
    assert canonical_form(gk, 14)[0] != canonical_form(ga, 14)[0]
    assert triple_profile(gk, 14) != triple_profile(ga, 14)
    with pytest.raises(InputError):
        canonical_form(circle_rounds(16), 16)  # 15 is not prime: GK_16 is not perfect


def test_perfect_starters_of_z7_give_the_single_class_of_k8():
    group = cyclic(7)
    forms = {canonical_form(starter_rounds(group, s), 8)[0]
             for s in enumerate_starters(group) if is_perfect_starter(group, s)}
    assert forms == {canonical_form(circle_rounds(8), 8)[0]}


def test_family_members_are_perfect_and_pairwise_non_isomorphic():
    members = perfect_family(12)
    assert {m.origin.split(" (")[0] for m in members} >= {"circle GK_12",
                                                          "perfect starter in Z_11"}
    forms = set()
    for m in members:
        assert verify_rounds(12, m.factorization.rounds).perfect
        forms.add(canonical_form(m.factorization.rounds, 12)[0])
    assert len(forms) == len(members)
    with pytest.raises(InputError):
        perfect_family(7)


def test_stored_enumeration_is_verified_and_counts_agree():
    data = _stored()
    expected = {4: 1, 6: 1, 8: 1, 10: 1, 12: 5}
    seen = {}
    for item in data["orders"]:
        n = item["n"]
        forms = set()
        orbit_total = 0
        for cls in item["classes"]:
            rounds = _tuple_rounds(cls["rounds"])
            assert verify_rounds(n, rounds).perfect
            form, aut = canonical_form(rounds, n)
            assert aut == cls["automorphisms"]
            forms.add(form)
            orbit_total += n * (n - 1) * (n - 2) // aut
        assert len(forms) == len(item["classes"])
        # orbit counting: each class contributes n(n-1)(n-2)/|Aut| labelled completions
        assert orbit_total == item["completions"]
        seen[n] = len(forms)
    assert seen == expected


def test_stored_break_minima():
    for item in _stored()["orders"]:
        n = item["n"]
        for cls in item["classes"]:
            rounds = _tuple_rounds(cls["rounds"])
            order = cls["order"]
            home = {}
            for a, b in cls["home_first"]:
                home[(min(a, b), max(a, b))] = a < b
            assert breaks_of(rounds, home, [order], None) == cls["min_breaks"]
            if n <= 10:
                masks = BreakPaths(rounds, n).layers
                assert _held_karp_min_breaks(masks) == cls["min_breaks"]
            else:
                assert exact_min_breaks(rounds, n).breaks == cls["min_breaks"]
            assert cls["min_breaks"] >= n - 2  # de Werra 1981
