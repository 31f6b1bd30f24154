"""Starter-adders and their Room squares (``scheduler.factorization.starter_adders``).

Outside checks: R. C. Mullin and W. D. Wallis (1975) proved that a Room square of side r exists
exactly for odd r other than 3 and 5 (statement verified in the introduction of J. H. Dinitz and
G. S. Warrington, Electron. J. Combin. 17 (2010) #R74), so no starter of Z_3 or Z_5 has an
adder; every Room square built here is read back by networkx (each row and each column a
perfect matching of K_{m+1}, the cells together every edge exactly once); the strong-starter
adder a_i = -(x_i + y_i) is the classical one (J. H. Dinitz and D. R. Stinson, "Room squares
and related designs", 1992; from memory). The starters themselves are the enumerations whose
counts test_starters checks against OEIS A006204.
"""

from __future__ import annotations

import networkx as nx
import pytest

from scheduler.errors import InputError
from scheduler.factorization.groups import cyclic, product
from scheduler.factorization.starter_adders import (
    adder_translate,
    enumerate_adders,
    is_adder,
    orthogonal_adder,
    room_square,
)
from scheduler.factorization.starters import (
    enumerate_starters,
    is_perfect_starter,
    is_starter,
    starter_rounds,
)
from scheduler.factorization.verify import verify_rounds


def read_back_room_square(square, m):
    """networkx's reading: rows and columns perfect matchings, every edge exactly once."""
    complete = nx.complete_graph(m + 1)
    cells = [pair for row in square for pair in row if pair is not None]
    assert len(cells) == complete.number_of_edges()
    assert {frozenset(p) for p in cells} == {frozenset(e) for e in complete.edges}
    lines = list(square) + [tuple(row[c] for row in square) for c in range(m)]
    for line in lines:
        matching = {tuple(p) for p in line if p is not None}
        assert nx.is_perfect_matching(complete, matching)


@pytest.mark.parametrize("m", [3, 5])
def test_no_adder_where_no_room_square_exists(m):
    group = cyclic(m)
    starters = list(enumerate_starters(group))
    assert len(starters) == 1
    assert not any(True for s in starters for _ in enumerate_adders(group, s))


@pytest.mark.parametrize(("group", "has_adders"),
                         [(cyclic(7), True), (cyclic(9), True), (cyclic(11), True),
                          (product(3, 3), False)],
                         ids=["Z_7", "Z_9", "Z_11", "Z_3 x Z_3"])
def test_every_adder_makes_a_room_square_whose_columns_a_starter_induces(group, has_adders):
    m = group.order
    squares = 0
    for starter in enumerate_starters(group):
        for adder in enumerate_adders(group, starter):
            assert is_adder(group, starter, adder)
            square = room_square(group, starter, adder)
            read_back_room_square(square, m)
            columns = [tuple(square[g][c] for g in range(m) if square[g][c] is not None)
                       for c in range(m)]
            other = adder_translate(group, starter, adder)
            assert is_starter(group, other)
            induced = starter_rounds(group, other)
            assert ({frozenset(map(frozenset, col)) for col in columns}
                    == {frozenset(map(frozenset, r)) for r in induced})
            # so the columns are perfect exactly when the starter S + A is (independent verifier)
            assert (verify_rounds(m + 1, columns).perfect
                    == is_perfect_starter(group, other))
            assert orthogonal_adder(group, starter, other) == tuple(adder)
            squares += 1
    # Room squares of side 7, 9, 11 exist (Mullin and Wallis), and Z_7, Z_9, Z_11 hold one; no
    # starter of Z_3 x Z_3 has an adder (computed here by exhaustion, not a published count)
    assert (squares > 0) == has_adders


@pytest.mark.parametrize("m", [7, 11, 13])
def test_a_strong_starter_has_the_adder_minus_its_sums(m):
    group = cyclic(m)
    strong = 0
    for starter in enumerate_starters(group):
        sums = [(x + y) % m for x, y in starter]
        if 0 in sums or len(set(sums)) != len(sums):
            continue
        strong += 1
        adder = [(-s) % m for s in sums]
        assert is_adder(group, starter, adder)
        assert ({frozenset(p) for p in adder_translate(group, starter, adder)}
                == {frozenset(((-x) % m, (-y) % m)) for x, y in starter})
    assert strong > 0


def test_z9_has_no_strong_starter():
    """Computed; it agrees with the list of exceptions we remember (Z_3, Z_5, Z_9; from memory)."""
    assert all(len({(x + y) % 9 for x, y in s} - {0}) < 4 for s in enumerate_starters(cyclic(9)))


def test_rejects_what_is_not_an_adder_or_a_starter():
    group = cyclic(7)
    starter = [(1, 3), (2, 6), (4, 5)]
    assert not is_adder(group, starter, [3, 6])            # one per pair
    assert not is_adder(group, starter, [0, 6, 5])         # non-zero
    assert not is_adder(group, starter, [3, 3, 5])         # distinct
    assert not is_adder(group, starter, [1, 2, 3])         # translates overlap
    assert not is_adder(group, starter, ["x", 6, 5])
    with pytest.raises(InputError):
        is_adder(group, [(1, 2), (3, 4), (5, 6)], [1, 2, 3])
    with pytest.raises(InputError):
        room_square(group, starter, [1, 2, 3])
    with pytest.raises(InputError):
        adder_translate(group, starter, [1, 2, 3])
