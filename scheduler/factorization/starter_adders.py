"""Starter-adders, the Room squares they make, and why they add no perfect one-factorizations.

An *adder* for a starter ``S = {{x_i, y_i}}`` in an abelian group ``G`` of odd order ``m`` is a
choice of ``(m-1)/2`` distinct non-zero elements ``a_i``, one per pair, such that the translated
pairs ``{x_i + a_i, y_i + a_i}`` again partition ``G \\ {0}``. A starter with an adder gives a
*Room square* of side ``m`` on the symbols ``G ∪ {∞}``: rows and columns are indexed by ``G``,
cell ``(g, g)`` holds ``{∞, g}`` and cell ``(g, g - a_i)`` holds ``{x_i + g, y_i + g}``. Every
cell holds at most one pair, every pair of symbols lies in exactly one cell, and every row and
every column holds every symbol exactly once. This is the classical starter-adder method of
R. C. Mullin and E. Nemeth (1969) for Room squares (J. H. Dinitz and D. R. Stinson, "Room
squares and related designs", in *Contemporary Design Theory*, Wiley 1992; from memory).

Why the method cannot help the search for perfect one-factorizations (derived here; the proof
is three lines): the rows of the Room square are the rounds ``F_g = {∞, g} ∪ (S + g)`` induced
by ``S``; column ``c`` holds ``{∞, c}`` and the pairs ``{x_i + a_i + c, y_i + a_i + c}``, so the
columns are the rounds induced by ``S' = S + A = {{x_i + a_i, y_i + a_i}}``. ``S'`` partitions
``G \\ {0}`` (the adder's condition) and each of its pairs has the difference of the pair it
came from, so ``S'`` is itself a starter. Both one-factorizations of a starter-adder Room square
are therefore starter-induced: a starter space holds every perfect one-factorization that a
starter-adder space could give. Conversely, two starters ``S`` and ``S'`` are *orthogonal*
(their pairs, matched by difference, differ by distinct non-zero translations) exactly when
those translations are an adder for ``S`` (:func:`orthogonal_adder`).

The module builds and checks adders, enumerates them for small groups and builds the Room
square, so that the statements above are tested (``tests/factorization/test_starter_adders.py``)
and recorded in ``docs/factorization-search.md`` ("Starter-adders").

References
----------
R. C. Mullin and E. Nemeth, "An existence theorem for Room squares", Canad. Math. Bull. 12
(1969) 493-497 (from memory). R. C. Mullin and W. D. Wallis, "The existence of Room squares",
Aequationes Math. 13 (1975) 1-7: a Room square of side ``r`` exists exactly for odd ``r`` other
than 3 and 5 (the statement verified in J. H. Dinitz and G. S. Warrington, "The spectra of
certain classes of Room frames: the last cases", Electron. J. Combin. 17 (2010) #R74,
introduction).
"""

from __future__ import annotations

from collections.abc import Iterator, Sequence

from scheduler.errors import InputError
from scheduler.factorization.groups import AbelianGroup
from scheduler.factorization.starters import is_starter

Pair = tuple[int, int]
Cell = tuple[int, int] | None


def _starter_pairs(group: AbelianGroup, starter: Sequence[Sequence[int]]) -> list[Pair]:
    if not is_starter(group, starter):
        raise InputError(f"not a starter in {group.name}: {starter!r}", location="starter")
    return [(int(a), int(b)) for a, b in starter]


def _translated(group: AbelianGroup, pairs: Sequence[Pair], adder: Sequence[int]) -> list[Pair]:
    return [(int(group.add[x, a]), int(group.add[y, a]))
            for (x, y), a in zip(pairs, adder, strict=True)]


def is_adder(group: AbelianGroup, starter: Sequence[Sequence[int]],
             adder: Sequence[int]) -> bool:
    """Is ``adder`` (one element per pair of ``starter``, in its order) an adder?

    Parameters
    ----------
    group : AbelianGroup
        The abelian group of odd order ``m``.
    starter : sequence of pairs
        A starter of ``group``, pairs in the order ``adder`` follows.
    adder : sequence of int
        ``a_i`` for the ``i``-th pair.

    Returns
    -------
    bool
        True when the ``a_i`` are distinct and non-zero and the pairs ``{x_i + a_i, y_i + a_i}``
        partition ``G \\ {0}``.

    Raises
    ------
    InputError
        When ``starter`` is not a starter of ``group``.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> is_adder(cyclic(7), [(1, 3), (2, 6), (4, 5)], [3, 6, 5])
    True
    >>> is_adder(cyclic(7), [(1, 3), (2, 6), (4, 5)], [1, 2, 3])
    False
    """
    pairs = _starter_pairs(group, starter)
    m = group.order
    try:
        values = [int(a) for a in adder]
    except (TypeError, ValueError):
        return False
    if len(values) != len(pairs) or len(set(values)) != len(values):
        return False
    if any(a <= 0 or a >= m for a in values):
        return False
    covered = [v for pair in _translated(group, pairs, values) for v in pair]
    return 0 not in covered and len(set(covered)) == m - 1


def _require_adder(group: AbelianGroup, starter: Sequence[Sequence[int]],
                   adder: Sequence[int]) -> tuple[list[Pair], list[int]]:
    if not is_adder(group, starter, adder):
        raise InputError(f"not an adder for {starter!r} in {group.name}: {adder!r}",
                         location="adder")
    return _starter_pairs(group, starter), [int(a) for a in adder]


def adder_translate(group: AbelianGroup, starter: Sequence[Sequence[int]],
                    adder: Sequence[int]) -> tuple[Pair, ...]:
    """The starter ``S + A`` whose rounds are the columns of the Room square.

    Parameters
    ----------
    group : AbelianGroup
        The abelian group of odd order.
    starter : sequence of pairs
        A starter of ``group``.
    adder : sequence of int
        An adder for it (:func:`is_adder`).

    Returns
    -------
    tuple of Pair
        The pairs ``(x_i + a_i, y_i + a_i)`` in the starter's order; a starter of ``group``.

    Raises
    ------
    InputError
        When ``adder`` is not an adder for ``starter``.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> adder_translate(cyclic(7), [(1, 3), (2, 6), (4, 5)], [3, 6, 5])
    ((4, 6), (1, 5), (2, 3))
    """
    pairs, values = _require_adder(group, starter, adder)
    return tuple(_translated(group, pairs, values))


def room_square(group: AbelianGroup, starter: Sequence[Sequence[int]],
                adder: Sequence[int]) -> tuple[tuple[Cell, ...], ...]:
    """The Room square of side ``m`` made by a starter and an adder.

    Parameters
    ----------
    group : AbelianGroup
        The abelian group of odd order ``m``.
    starter : sequence of pairs
        A starter of ``group``.
    adder : sequence of int
        An adder for it.

    Returns
    -------
    tuple of tuple
        ``square[row][column]``: ``None`` for an empty cell, else the pair ``(a, b)`` of symbols
        (group codes, ``∞ = m``). Row ``g`` holds the round ``F_g`` of ``starter``.

    Raises
    ------
    InputError
        When ``adder`` is not an adder for ``starter``.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> square = room_square(cyclic(7), [(1, 3), (2, 6), (4, 5)], [3, 6, 5])
    >>> square[0]
    ((7, 0), (2, 6), (4, 5), None, (1, 3), None, None)
    """
    pairs, values = _require_adder(group, starter, adder)
    m = group.order
    cells: list[list[Cell]] = [[None] * m for _ in range(m)]
    for g in range(m):
        cells[g][g] = (m, g)
        for (x, y), a in zip(pairs, values, strict=True):
            column = int(group.add[g, group.neg[a]])
            cells[g][column] = (int(group.add[x, g]), int(group.add[y, g]))
    return tuple(tuple(row) for row in cells)


def enumerate_adders(group: AbelianGroup,
                     starter: Sequence[Sequence[int]]) -> Iterator[tuple[int, ...]]:
    """Every adder for ``starter`` (exhaustive backtracking; small groups only).

    Parameters
    ----------
    group : AbelianGroup
        The abelian group of odd order.
    starter : sequence of pairs
        A starter of ``group``.

    Yields
    ------
    tuple of int
        Each adder, one element per pair in the starter's order.

    Raises
    ------
    InputError
        When ``starter`` is not a starter of ``group``.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> list(enumerate_adders(cyclic(7), [(1, 3), (2, 6), (4, 5)]))
    [(3, 6, 5), (5, 3, 6)]
    """
    pairs = _starter_pairs(group, starter)
    m = group.order
    add = group.add.tolist()
    used_value = [False] * m
    covered = [False] * m
    covered[0] = True
    chosen: list[int] = []

    def rec(i: int) -> Iterator[tuple[int, ...]]:
        if i == len(pairs):
            yield tuple(chosen)
            return
        x, y = pairs[i]
        for a in range(1, m):
            if used_value[a]:
                continue
            u, v = add[x][a], add[y][a]
            if covered[u] or covered[v]:
                continue
            used_value[a] = covered[u] = covered[v] = True
            chosen.append(a)
            yield from rec(i + 1)
            chosen.pop()
            used_value[a] = covered[u] = covered[v] = False

    yield from rec(0)


def orthogonal_adder(group: AbelianGroup, starter: Sequence[Sequence[int]],
                     other: Sequence[Sequence[int]]) -> tuple[int, ...] | None:
    """The adder that carries ``starter`` onto ``other``, if the two starters are orthogonal.

    The pair of ``other`` with the same difference class as the pair ``{x, y}`` of ``starter``
    is ``{x + a, y + a}`` for exactly one ``a`` (the group has odd order, so ``x - y ≠ y - x``);
    the starters are orthogonal when these ``a`` are distinct and non-zero, and then they form
    an adder for ``starter`` with ``starter + adder = other``.

    Parameters
    ----------
    group : AbelianGroup
        The abelian group of odd order.
    starter, other : sequence of pairs
        Two starters of ``group``.

    Returns
    -------
    tuple of int or None
        The adder in the order of ``starter``'s pairs, or ``None`` when the starters are not
        orthogonal.

    Raises
    ------
    InputError
        When either is not a starter of ``group``.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> starter = [(1, 3), (2, 6), (4, 5)]
    >>> orthogonal_adder(cyclic(7), starter, [(4, 6), (1, 5), (2, 3)])
    (3, 6, 5)
    >>> orthogonal_adder(cyclic(7), starter, starter) is None  # every translation is 0
    True
    """
    pairs = _starter_pairs(group, starter)
    by_difference = {}
    for u, v in _starter_pairs(group, other):
        by_difference[int(group.add[u, group.neg[v]])] = (u, v)
        by_difference[int(group.add[v, group.neg[u]])] = (v, u)
    adder = []
    for x, y in pairs:
        u, _ = by_difference[int(group.add[x, group.neg[y]])]
        adder.append(int(group.add[u, group.neg[x]]))
    return tuple(adder) if is_adder(group, pairs, adder) else None
