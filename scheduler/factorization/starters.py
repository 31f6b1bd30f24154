"""Starters in abelian groups of odd order and the one-factorizations they induce.

A *starter* in an additive abelian group ``G`` of odd order ``m`` is a set of ``(m-1)/2`` pairs
``{x_i, y_i}`` partitioning ``G \\ {0}`` whose differences ``±(x_i - y_i)`` cover ``G \\ {0}``
exactly once. On the vertices ``G ∪ {∞}`` (``∞`` is vertex ``m``) the rounds
``F_g = {∞, g} ∪ (S + g)`` for ``g`` in ``G`` form a one-factorization of ``K_{m+1}``.
Translation by ``a`` maps ``F_b`` to ``F_{a+b}``, so ``F_a ∪ F_b`` is isomorphic to
``F_0 ∪ F_{b-a}`` and the factorization is perfect exactly when ``F_0 ∪ F_g`` is a Hamiltonian
cycle for one ``g`` from each pair ``{g, -g}``: only ``(m-1)/2`` cycle walks (a *perfect
starter*). For any starter the number of perfect pairs is ``m`` times the number of good ``g``
with ``g`` in a set of representatives of ``{g, -g}``.

References: R. C. Mullin and E. Nemeth, "An existence theorem for Room squares", Canad. Math.
Bull. 12 (1969) (starters); J. H. Dinitz and D. R. Stinson, "Room squares and related designs",
in *Contemporary Design Theory*, Wiley 1992 (starter-induced one-factorizations); OEIS A006204
(number of starters in ``Z_{2k+1}``).
"""

from __future__ import annotations

from collections.abc import Iterator, Sequence

import numpy as np

from scheduler.errors import InputError
from scheduler.factorization.groups import AbelianGroup
from scheduler.factorization.model import Factorization, normalise_round

Pair = tuple[int, int]

SOURCE = (
    "starter-induced one-factorization (R. C. Mullin & E. Nemeth 1969; "
    "J. H. Dinitz & D. R. Stinson, Contemporary Design Theory, 1992)"
)


def _pairs(starter: Sequence[Sequence[int]]) -> list[Pair]:
    out = []
    for pair in starter:
        a, b = (int(v) for v in pair)
        out.append((min(a, b), max(a, b)))
    return sorted(out)


def is_starter(group: AbelianGroup, starter: Sequence[Sequence[int]]) -> bool:
    """Do the pairs partition ``G \\ {0}`` with every difference ``±(x - y)`` exactly once?

    Parameters
    ----------
    group
        The abelian group of odd order.
    starter
        The pairs ``(x, y)`` of group codes.

    Returns
    -------
    bool
        False also for input that is not a list of pairs.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> is_starter(cyclic(7), [(1, 6), (2, 5), (3, 4)])
    True
    """
    m = group.order
    try:
        pairs = _pairs(starter)
    except (TypeError, ValueError):
        return False
    if len(pairs) != (m - 1) // 2:
        return False
    elements = [v for pair in pairs for v in pair]
    if any(v <= 0 or v >= m for v in elements) or len(set(elements)) != m - 1:
        return False
    diffs = set()
    for a, b in pairs:
        diffs.add(int(group.add[a, group.neg[b]]))
        diffs.add(int(group.add[b, group.neg[a]]))
    return len(diffs) == m - 1 and 0 not in diffs


def _require_starter(group: AbelianGroup, starter) -> list[Pair]:
    if not is_starter(group, starter):
        raise InputError(f"not a starter in {group.name}: {starter!r}", location="starter")
    return _pairs(starter)


def starter_partner(group: AbelianGroup, starter: Sequence[Sequence[int]]) -> np.ndarray:
    """Partner map of ``F_0`` on ``0..m`` (``∞ = m`` is paired with ``0``).

    Parameters
    ----------
    group
        The abelian group of odd order ``m``.
    starter
        The pairs ``(x, y)`` of group codes.

    Returns
    -------
    numpy.ndarray
        ``partner[v]`` for ``v`` in ``0..m``.
    """
    m = group.order
    p0 = np.empty(m + 1, dtype=np.int64)
    p0[m], p0[0] = 0, m
    for a, b in _pairs(starter):
        p0[a], p0[b] = b, a
    return p0


def difference_representatives(group: AbelianGroup) -> list[int]:
    """One element from each pair ``{g, -g}``, ``g != 0`` (the smaller code).

    Parameters
    ----------
    group : AbelianGroup
        The abelian group of odd order ``m``.

    Returns
    -------
    list of int
        The ``(m - 1) / 2`` representatives, increasing.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> difference_representatives(cyclic(7))
    [1, 2, 3]
    """
    return [g for g in range(1, group.order) if g < int(group.neg[g])]


def _union_is_hamiltonian(group: AbelianGroup, p0: np.ndarray, g: int) -> bool:
    """Is ``F_0 ∪ F_g`` one Hamiltonian cycle? (walk from ``∞``)."""
    m = group.order
    neg_g = int(group.neg[g])

    def pg(v: int) -> int:
        # partner in F_g = F_0 + g
        if v == m:
            return g
        w = int(p0[group.add[v, neg_g]])
        return m if w == m else int(group.add[w, g])

    v, length = m, 0
    while True:
        v = pg(int(p0[v]))
        length += 2
        if v == m:
            return length == m + 1


def good_differences(group: AbelianGroup, starter: Sequence[Sequence[int]]) -> list[int]:
    """Representatives ``g`` (of ``{g, -g}``) with ``F_0 ∪ F_g`` Hamiltonian.

    Parameters
    ----------
    group
        The abelian group of odd order.
    starter
        The pairs ``(x, y)`` of group codes.

    Returns
    -------
    list of int
        The good representatives, in the order of :func:`difference_representatives`.

    Raises
    ------
    InputError
        When ``starter`` is not a starter of ``group``.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> good_differences(cyclic(7), [(1, 6), (2, 5), (3, 4)])
    [1, 2, 3]
    >>> good_differences(cyclic(7), [(1, 3), (2, 6), (4, 5)])
    []
    """
    pairs = _require_starter(group, starter)
    p0 = starter_partner(group, pairs)
    return [g for g in difference_representatives(group) if _union_is_hamiltonian(group, p0, g)]


def is_perfect_starter(group: AbelianGroup, starter: Sequence[Sequence[int]]) -> bool:
    """Is ``starter`` a starter whose induced one-factorization is perfect?

    Parameters
    ----------
    group
        The abelian group of odd order.
    starter
        The pairs ``(x, y)`` of group codes.

    Returns
    -------
    bool
        False also for anything that is not a starter.

    References
    ----------
    ``docs/one-factorizations.md``; J. H. Dinitz and D. R. Stinson, "Room squares and related
    designs", in *Contemporary Design Theory*, Wiley 1992 (starters; from memory).

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> is_perfect_starter(cyclic(7), [(1, 6), (2, 5), (3, 4)])  # the patterned starter
    True
    >>> is_perfect_starter(cyclic(7), [(1, 3), (2, 6), (4, 5)])
    False
    """
    if not is_starter(group, starter):
        return False
    p0 = starter_partner(group, starter)
    return all(_union_is_hamiltonian(group, p0, g) for g in difference_representatives(group))


def starter_rounds(group: AbelianGroup,
                   starter: Sequence[Sequence[int]]) -> tuple[tuple[Pair, ...], ...]:
    """The rounds ``F_0, ..., F_{m-1}`` (round ``g`` is ``F_g``, group codes, ``∞ = m``).

    Parameters
    ----------
    group
        The abelian group of odd order ``m``.
    starter
        The pairs ``(x, y)`` of group codes.

    Returns
    -------
    tuple of rounds
        ``m`` rounds of games ``(a, b)`` on ``0..m``.

    Raises
    ------
    InputError
        When ``starter`` is not a starter of ``group``.
    """
    pairs = _require_starter(group, starter)
    m = group.order
    rounds = []
    for g in range(m):
        games = [(m, g)] + [(int(group.add[a, g]), int(group.add[b, g])) for a, b in pairs]
        rounds.append(normalise_round(games))
    return tuple(rounds)


def starter_factorization(
    group: AbelianGroup,
    starter: Sequence[Sequence[int]],
    *,
    method: str | None = None,
    source: str | None = None,
    details: dict | None = None,
) -> Factorization:
    """The one-factorization of ``K_{m+1}`` induced by ``starter`` in ``group``.

    Parameters
    ----------
    group
        The abelian group of odd order ``m``.
    starter
        The pairs ``(x, y)`` of group codes.
    method, source
        Override the factorization's description and citation.
    details
        Extra entries for the factorization's ``details``.

    Returns
    -------
    Factorization
        The one-factorization of ``K_{m+1}``.

    Raises
    ------
    InputError
        When ``starter`` is not a starter of ``group``.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> gk8 = starter_factorization(cyclic(7), [(1, 6), (2, 5), (3, 4)])
    >>> gk8.n, gk8.rounds[0], gk8.certificate().perfect
    (8, ((0, 7), (1, 6), (2, 5), (3, 4)), True)
    """
    pairs = _require_starter(group, starter)
    info = {"construction": "starter", "group": group.name, "starter": [list(p) for p in pairs]}
    info.update(details or {})
    return Factorization(
        group.order + 1,
        starter_rounds(group, pairs),
        method or f"starter in {group.name}",
        source or SOURCE,
        info,
    )


def enumerate_starters(group: AbelianGroup) -> Iterator[tuple[Pair, ...]]:
    """Every starter of ``group`` (exhaustive backtracking; feasible up to order about 21).

    The smallest unpaired element is always paired next, so each starter is produced once.

    Parameters
    ----------
    group
        The abelian group of odd order.

    Yields
    ------
    tuple of Pair
        Each starter, its pairs sorted.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> list(enumerate_starters(cyclic(7)))
    [((1, 3), (2, 6), (4, 5)), ((1, 5), (2, 3), (4, 6)), ((1, 6), (2, 5), (3, 4))]
    """
    m = group.order
    add = group.add.tolist()
    neg = group.neg.tolist()
    # difference class of (x, y): the smaller code of {x - y, y - x}
    dclass = [[min(add[x][neg[y]], add[y][neg[x]]) for y in range(m)] for x in range(m)]
    used = [False] * m
    used[0] = True
    dused = [False] * m
    chosen: list[Pair] = []

    def rec(start: int) -> Iterator[tuple[Pair, ...]]:
        x = start
        while x < m and used[x]:
            x += 1
        if x == m:
            yield tuple(chosen)
            return
        used[x] = True
        row = dclass[x]
        for y in range(x + 1, m):
            if used[y]:
                continue
            d = row[y]
            if dused[d]:
                continue
            used[y] = True
            dused[d] = True
            chosen.append((x, y))
            yield from rec(x + 1)
            chosen.pop()
            dused[d] = False
            used[y] = False
        used[x] = False

    yield from rec(1)


def count_starters(group: AbelianGroup) -> tuple[int, int]:
    """``(starters, perfect starters)`` of ``group`` by exhaustive enumeration.

    Parameters
    ----------
    group
        The abelian group of odd order.

    Returns
    -------
    tuple of (int, int)
        The number of starters and of perfect starters.

    References
    ----------
    OEIS A006204 (number of starters in ``Z_m``).

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> count_starters(cyclic(7)), count_starters(cyclic(11))
    ((3, 1), (25, 3))
    """
    total = perfect = 0
    reps = difference_representatives(group)
    for s in enumerate_starters(group):
        total += 1
        p0 = starter_partner(group, s)
        if all(_union_is_hamiltonian(group, p0, g) for g in reps):
            perfect += 1
    return total, perfect
