"""Matrix symmetries of ``Z_p^d`` (:mod:`scheduler.factorization.linear_symmetries`) and the
even-starter spaces they prescribe (:mod:`scheduler.factorization.twin_point_starters`).

Outside checks: the orders of ``GL(2, p)`` are OEIS A000252 (invertible 2 × 2 matrices mod n:
a(2) = 6, a(3) = 48, a(5) = 480, a(7) = 2016; verified on oeis.org) and the order of
``GL(3, 3)`` is the classical formula ``(q^3 - 1)(q^3 - q)(q^3 - q^2)`` = 11232; the numbers of
conjugacy classes of elements, ``q^2 - 1`` for ``GL(2, q)`` and ``q^3 - q`` for ``GL(3, q)``,
are classical (I. G. Macdonald, Bull. Austral. Math. Soc. 23 (1981); from memory) and are
counted here by brute force over the enumerated group. The invariant even starters of the
plain-Python enumerator are compared with a filter of the full enumeration, and the kernel's
exhaustive verdicts with the enumeration.
"""

from __future__ import annotations

import numpy as np
import pytest

from scheduler.errors import InputError
from scheduler.factorization import twin_point_starters as tw
from scheduler.factorization.groups import group_from_name
from scheduler.factorization.linear_symmetries import (
    automorphism_matrices,
    linear_permutation,
    linear_symmetry_classes,
)


@pytest.mark.parametrize("p, d, order", [(2, 2, 6), (3, 2, 48), (5, 2, 480), (7, 2, 2016),
                                         (3, 3, 11232)])
def test_general_linear_group_order(p, d, order):
    mats = automorphism_matrices((p,) * d)
    assert len(mats) == order
    dets = np.round(np.linalg.det(mats)).astype(np.int64) % p
    assert (dets != 0).all()  # every matrix listed is invertible


@pytest.mark.parametrize("moduli, order", [((25,), 20), ((27,), 18), ((3, 5), 8),
                                           ((3, 9), 108)])
def test_automorphism_group_orders(moduli, order):
    # cyclic groups: the units, Euler's totient (OEIS A000010); Z_p x Z_p^2: p^3 (p - 1)^2
    # (C. J. Hillar and D. L. Rhea, Amer. Math. Monthly 114 (2007) 917-923, from memory; by
    # hand: [[a, b], [p c, d]] with a and d units)
    mats = automorphism_matrices(moduli)
    assert len(mats) == order
    group = group_from_name(" x ".join(f"Z_{n}" for n in moduli))
    perms = {linear_permutation(group, tuple(map(tuple, m))).tobytes() for m in mats}
    assert len(perms) == order  # distinct automorphisms


def test_cyclic_matrix_spaces_are_the_multiplier_spaces():
    # for cyclic H every automorphism is a unit, so the matrix spaces are the multiplier spaces:
    # the same missing elements, each with the same cyclic subgroups of units
    for base in ("Z_25", "Z_27"):
        k = int(base[2:])

        def subgroup(u: int, k: int = k) -> frozenset[int]:
            return frozenset(pow(u, j, k) for j in range(1, 2 * k))

        by_matrix = {(m, subgroup(matrix[0][0]))
                     for m, matrix in (tw.parse_space(name)[2:4]
                                       for name in tw.linear_symmetry_spaces(base))}
        by_unit = {(m, subgroup(u)) for m in tw.missing_representatives(base)
                   for size, u in tw.multiplier_choices(base, m) if size > 1}
        assert by_matrix == by_unit and by_unit


def _element_classes(p: int, d: int) -> int:
    mats = automorphism_matrices((p,) * d)
    weights = p ** np.arange(d * d)
    keys = (mats.reshape(len(mats), -1) * weights).sum(1)
    index = {int(k): i for i, k in enumerate(keys)}
    inverses = np.array([np.round(np.linalg.inv(m) * np.linalg.det(m)).astype(np.int64)
                         * pow(round(float(np.linalg.det(m))) % p, -1, p) % p for m in mats])
    seen = np.zeros(len(mats), dtype=bool)
    classes = 0
    for i in range(len(mats)):
        if seen[i]:
            continue
        classes += 1
        conj = np.einsum("nij,jk,nkl->nil", mats, mats[i], inverses) % p
        for key in (conj.reshape(len(mats), -1) * weights).sum(1):
            seen[index[int(key)]] = True
    return classes


@pytest.mark.parametrize("p, d, classes", [(3, 2, 8), (5, 2, 24), (3, 3, 24)])
def test_conjugacy_class_counts(p, d, classes):
    assert _element_classes(p, d) == classes


@pytest.mark.parametrize("base", ["Z_3 x Z_3", "Z_5 x Z_5", "Z_3 x Z_3 x Z_3"])
def test_subgroup_classes_are_consistent(base):
    group = group_from_name(base)
    p, d = group.moduli[0], len(group.moduli)
    classes = linear_symmetry_classes(group)
    assert [c.order for c in classes] == sorted((c.order for c in classes), reverse=True)
    for c in classes:
        perm = linear_permutation(group, c.matrix)
        fixed = [x for x in range(1, group.order) if perm[x] == x]
        assert len(fixed) == c.fixed and set(c.missing_parts) <= set(fixed)
        # an automorphism of the group, of the stated order
        assert (perm[group.add] == group.add[perm[:, None], perm[None, :]]).all()
        power, k = perm.copy(), 1
        while not (power == np.arange(group.order)).all():
            power, k = perm[power], k + 1
        assert k == c.order
        # a fixed space of dimension f has p^f - 1 non-zero vectors
        assert c.fixed + 1 in {p ** f for f in range(d)}
        negated = [x for x in range(1, group.order) if perm[x] == group.neg[x]]
        assert set(c.negated_parts) <= set(negated) and bool(c.negated_parts) == (
            c.order == 2 and bool(negated))
        assert c.missing_parts or c.negated_parts
    # the classes found in Z_5 x Z_5: unipotent (order 5), diag(1, 2) (order 4), diag(1, -1),
    if base == "Z_5 x Z_5":
        # and -1 (order 2, central), which negates every vector
        assert [(c.order, c.conjugates) for c in classes] == [(5, 6), (4, 30), (2, 30), (2, 1)]


def test_codes_follow_the_digit_numbering():
    group = group_from_name("GF(25)")  # the field's additive group is numbered like Z_5 x Z_5
    assert group.moduli == (5, 5)
    perm = linear_permutation(group, ((1, 1), (0, 1)))  # (x, y) -> (x + y, y)
    assert int(perm[5]) == 6  # (0, 1) -> (1, 1)
    assert int(perm[1]) == 1  # (1, 0) fixed


def test_bad_matrices_and_groups():
    group = group_from_name("Z_5 x Z_5")
    with pytest.raises(InputError):
        linear_permutation(group, ((1, 2), (2, 4)))  # singular mod 5
    with pytest.raises(InputError):
        linear_permutation(group, ((1, 0, 0), (0, 1, 0), (0, 0, 1)))
    with pytest.raises(InputError):
        linear_permutation(group, "no matrix")  # type: ignore[arg-type]
    with pytest.raises(InputError):  # (x, y) -> (x, x + y) is no map of Z_3 x Z_9
        linear_permutation(group_from_name("Z_3 x Z_9"), ((1, 0), (1, 1)))
    with pytest.raises(InputError):
        tw.search_perfect_twin_starter("Z_5 x Z_5", 13, multiplier=9, matrix=((0, 1), (1, 0)))
    with pytest.raises(InputError):  # the swap moves (1, 0), so it cannot fix m = (1, (1, 0))
        tw.search_perfect_twin_starter("Z_5 x Z_5", 3, matrix=((0, 1), (1, 0)))
    with pytest.raises(InputError):
        tw.parse_space("Z_2 x Z_5 x Z_5 | kept | m=13 | A=[[0,1],[1,x]]")
    with pytest.raises(InputError):
        tw.parse_space("Z_2 x Z_5 x Z_5 | kept | m=13 | A=[0,1]")


def test_matrix_spaces_of_z3_squared():
    # every invariant even starter the enumerator gives is one of the full enumeration that
    # the matrix maps onto itself, and the other way round; at Z_2 x Z_3 x Z_3 there are none
    # (as with the ring's order-2 multipliers, tested against the enumeration elsewhere)
    base = "Z_3 x Z_3"
    G = tw.twin_group(base)
    for name in tw.linear_symmetry_spaces(base):
        _, _, m, matrix, _, _ = tw.parse_space(name)
        assert isinstance(matrix, tuple)
        perm = linear_permutation(G.base, matrix)
        mu = 2 * perm[np.arange(G.order) // 2] + np.arange(G.order) % 2
        assert mu[m] == m
        everything = set(tw.enumerate_twin_starters(base, m))
        expected = {s for s in everything
                    if tuple(sorted((min(mu[a], mu[b]), max(mu[a], mu[b])) for a, b in s)) == s}
        assert set(tw.enumerate_twin_starters(base, m, matrix=matrix)) == expected
        out = tw.search_task(20, name, 0, 30.0)
        assert out["exhausted"] and not out["found"]


def test_conjugate_symmetries_give_spaces_of_one_size():
    # If S is invariant under A and misses m, then P S is invariant under P A P^-1 and misses
    # P m, so conjugate choices hold equally many even starters. The three unipotent
    # symmetries below (order 5, all conjugate in GL(2, 5)) each fix their own line, and the
    # missing element lies on it.
    base = "Z_5 x Z_5"
    counts = set()
    for matrix, part in [(((0, 1), (4, 2)), 6), (((1, 1), (0, 1)), 1), (((1, 0), (1, 1)), 5)]:
        starters = list(tw.enumerate_twin_starters(base, 2 * part + 1, matrix=matrix))
        assert all(tw.is_twin_starter(base, s) for s in starters[::997])
        assert len(set(starters)) == len(starters)
        counts.add(len(starters))
    assert counts == {60000}


@pytest.mark.parametrize("base, found", [("Z_5", True), ("Z_7", True), ("Z_3 x Z_3", False)])
def test_exhaustive_mode_settles_plain_spaces(base, found):
    # K_12 and K_16 have perfect even starters in these spaces, K_20 over Z_3 x Z_3 none
    # (docs/factorization-search.md, "Small orders"); tiny first runs make the limits double.
    outcomes = [tw.search_perfect_twin_starter(base, m, exhaustive=True, base_nodes=8)
                for m in tw.missing_representatives(base)]
    assert any(r.found for r in outcomes) == found
    for r in outcomes:
        assert r.found != r.exhausted
        if r.found:
            assert tw.is_perfect_twin_starter(base, r.starter)
    assert max(r.runs for r in outcomes) > 1


def test_matrix_space_names_round_trip():
    matrix = ((0, 0, 1), (0, 1, 0), (1, 0, 0))
    name = tw.space_name("Z_3 x Z_3 x Z_3", swapped=False, missing=6, matrix=matrix,
                         merged=True)
    assert tw.parse_space(name) == ("Z_3 x Z_3 x Z_3", False, 6, matrix, True, False)
    spaces = tw.linear_symmetry_spaces("Z_3 x Z_3 x Z_3")
    assert len(spaces) == 9 and all(" | m=" in s and "A=[[" in s for s in spaces)
    assert len(tw.linear_symmetry_spaces("Z_5 x Z_5", merged=True)) == 3


def _flip(G, alpha, m):
    """``x -> α x + m`` on the codes of ``G`` (``alpha`` a permutation of ``G``'s codes)."""
    return G.add[alpha, m]


@pytest.mark.parametrize("base", ["Z_5", "Z_9", "Z_3 x Z_3", "Z_5 x Z_5"])
def test_flip_maps_rounds_onto_rounds(base):
    # The identity behind the flip spaces (module docstring of twin_point_starters): if a set S
    # of pairs satisfies φ(S) = S for φ(x) = α x + m with α m = -m, then φ, exchanging the two
    # points at infinity, maps F_g = {∞1 g} ∪ {∞2 m+g} ∪ (S + g) onto F_{α g}. It uses nothing
    # of the starter property, so random φ-invariant sets of disjoint pairs test it.
    G = tw.twin_group(base)
    M = G.order
    rng = np.random.default_rng(7)
    for name in tw.flip_symmetry_spaces(base):
        _, _, m, symmetry, _, flip = tw.parse_space(name)
        assert flip
        alpha = tw._symmetry(G, **({"matrix": symmetry} if isinstance(symmetry, tuple)
                                   else {"multiplier": symmetry}))
        assert alpha[m] == G.neg[m]
        phi = _flip(G, alpha, m)
        assert phi[0] == m and phi[m] == 0 and (phi[phi] == np.arange(M)).all()
        free = set(range(1, M)) - {m}
        pairs = set()
        for x in rng.permutation(sorted(free)):
            y = int(rng.choice(sorted(free))) if free else None
            if x not in free or y is None or y == x or not {int(phi[x]), int(phi[y])} <= free:
                continue
            if {int(phi[x]), int(phi[y])} & {x, y} and {int(phi[x]), int(phi[y])} != {x, y}:
                continue
            for a, b in {(x, y), (int(phi[x]), int(phi[y]))}:
                pairs.add((min(a, b), max(a, b)))
                free -= {a, b}
        assert pairs and {tuple(sorted((int(phi[a]), int(phi[b])))) for a, b in pairs} == pairs
        for g in range(M):
            moved = {frozenset(M + 1 - (v - M) if v >= M else int(phi[v]) for v in edge)
                     for edge in _round(G, m, pairs, g)}
            assert moved == _round(G, m, pairs, int(alpha[g]))


def _round(G, m, pairs, g):
    """``F_g = {∞1 g} ∪ {∞2 m+g} ∪ (pairs + g)`` as a set of edges (``∞1 = |G|``,
    ``∞2 = |G| + 1``)."""
    M = G.order
    edges = {(M, g), (M + 1, int(G.add[m, g]))}
    edges |= {(int(G.add[a, g]), int(G.add[b, g])) for a, b in pairs}
    return {frozenset(e) for e in edges}


@pytest.mark.parametrize("base", ["Z_5", "Z_7", "Z_9", "Z_3 x Z_3", "Z_11"])
def test_flip_spaces_kernel_agrees_with_enumeration(base):
    for name in tw.flip_symmetry_spaces(base):
        _, _, m, symmetry, _, _ = tw.parse_space(name)
        kw = {"matrix": symmetry} if isinstance(symmetry, tuple) else {"multiplier": symmetry}
        starters = list(tw.enumerate_twin_starters(base, m, flip=True, **kw))
        perfect = [s for s in starters if tw.is_perfect_twin_starter(base, s)]
        res = tw.search_perfect_twin_starter(base, m, flip=True, exhaustive=True, **kw)
        assert res.found == bool(perfect) and res.exhausted == (not perfect)
        assert res.flip


def test_flip_spaces_and_bad_flips():
    assert tw.flip_symmetry_spaces("Z_25") == ["Z_2 x Z_25 | kept | m=3 | A=[[24]]+m",
                                               "Z_2 x Z_25 | kept | m=11 | A=[[24]]+m"]
    name = tw.flip_symmetry_spaces("Z_5 x Z_5")[0]
    base, swapped, m, matrix, merged, flip = tw.parse_space(name)
    assert tw.space_name(base, swapped=swapped, missing=m, matrix=matrix, merged=merged,
                         flip=flip) == name
    with pytest.raises(InputError):  # the flip's α must negate m, not fix it
        tw.search_perfect_twin_starter("Z_5 x Z_5", 13, matrix=((0, 1), (1, 0)), flip=True)
    with pytest.raises(InputError):  # a flip needs a symmetry
        tw.search_perfect_twin_starter("Z_25", 3, flip=True)
