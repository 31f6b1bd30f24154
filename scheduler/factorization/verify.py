"""Independent verifier of one-factorizations of K_n; trusts no construction.

:func:`verify_rounds` checks, from the rounds alone, that

* every round is a perfect matching of the vertices ``0..n-1`` (each vertex in exactly one game,
  no game of a vertex with itself, only vertices in range);
* there are ``n - 1`` rounds and every pair of vertices meets in exactly one of them;

and then counts the *perfect pairs*: pairs of rounds whose union is one Hamiltonian cycle
(definition of a perfect one-factorization: A. Kotzig 1964; W. D. Wallis, *One-Factorizations*,
Kluwer 1997, ch. 16).

How the count is made. For rounds ``i`` and ``j`` let ``p_i``, ``p_j`` be the partner maps
(involutions without fixed points). The union of the two matchings is a disjoint union of even
cycles; the cycle through vertex 0 of length ``2L`` is visited two steps at a time by
``q = p_j ∘ p_i``, so the orbit of 0 under ``q`` has exactly ``L`` elements. Hence the union is
a Hamiltonian cycle exactly when that orbit has ``n/2`` elements. The walk is vectorised with
numpy over blocks of pairs of rounds at once (pairs whose walk has closed are dropped as soon as
it closes), so no numba compile is involved and a factorization of ``K_1000`` (about 500 000 pairs
of rounds) takes a few seconds.

Byes. A league with an odd number of teams uses ``n = teams + 1`` and vertex ``n - 1`` is the bye.
Two rounds are then "perfect" when their real games form one Hamiltonian path on the real teams.
That is the same as the full union (with the two bye edges) being a Hamiltonian cycle: deleting
the bye vertex from a Hamiltonian cycle leaves a Hamiltonian path through all real teams, and
conversely the two bye edges join the ends of such a path (the teams that sat out) into a cycle.
So the same count applies with and without a bye.

Rounds and vertices in messages are numbered from 0, as in
:class:`~scheduler.factorization.model.Factorization`.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from dataclasses import dataclass
from typing import Any

import numpy as np

from scheduler.errors import InputError

MAX_PROBLEMS = 30
"""How many problems are spelled out; the rest are summarised in one line."""

_BLOCK = 1 << 16
"""Pairs of rounds walked together in one numpy block."""


@dataclass(frozen=True, slots=True)
class ImperfectPair:
    """Two rounds whose union is not one Hamiltonian cycle; ``cycles`` are its cycle lengths.

    Parameters
    ----------
    first, second : int
        The two rounds, 0-based, ``first < second``.
    cycles : tuple of int
        The lengths of the cycles their union splits into, sorted; they sum to ``n``.

    Examples
    --------
    >>> ImperfectPair(0, 3, (4, 6)).label
    '4+6'
    """

    first: int
    second: int
    cycles: tuple[int, ...]

    @property
    def label(self) -> str:
        """Cycle lengths joined with ``+``, e.g. ``"4+6"``."""
        return "+".join(str(c) for c in self.cycles)


@dataclass(frozen=True)
class Certificate:
    """What the independent verifier established about a factorization.

    ``valid`` means: every round is a perfect matching of K_n and every pair of vertices meets in
    exactly one round. ``perfect_pairs`` counts pairs of rounds whose union is a Hamiltonian
    cycle, out of ``pairs`` = C(n-1, 2). ``imperfect`` lists (some of) the other pairs with their
    cycle lengths; ``imperfect_total`` is their full number.

    Parameters
    ----------
    n : int
        The order.
    valid : bool
        Whether the rounds form a one-factorization of ``K_n``.
    perfect_pairs : int
        Pairs of rounds whose union is a Hamiltonian cycle.
    pairs : int
        All pairs of rounds, ``C(n-1, 2)``.
    problems : tuple of str, optional
        Why the rounds are not valid (empty when valid).
    imperfect : tuple of ImperfectPair, optional
        Some of the other pairs, with their cycle lengths.
    imperfect_total : int, optional
        How many pairs are not perfect.

    References
    ----------
    ``docs/one-factorizations.md``.

    Examples
    --------
    >>> from scheduler.factorization import circle_factorization
    >>> cert = circle_factorization(10).certificate(max_listed=1)
    >>> cert.valid, cert.perfect, cert.perfect_pairs, cert.pairs, cert.imperfect_total
    (True, False, 27, 36, 9)
    >>> cert.imperfect[0]
    ImperfectPair(first=0, second=3, cycles=(4, 6))
    """

    n: int
    valid: bool
    perfect_pairs: int
    pairs: int
    problems: tuple[str, ...] = ()
    imperfect: tuple[ImperfectPair, ...] = ()
    imperfect_total: int = 0

    @property
    def perfect(self) -> bool:
        """True when the factorization is valid and every pair of rounds is a Hamiltonian cycle."""
        return self.valid and self.perfect_pairs == self.pairs


class _Problems:
    """Collects human-readable problems, spelling out at most ``MAX_PROBLEMS``."""

    def __init__(self) -> None:
        self.items: list[str] = []
        self.extra = 0

    def add(self, text: str) -> None:
        if len(self.items) < MAX_PROBLEMS:
            self.items.append(text)
        else:
            self.extra += 1

    def __bool__(self) -> bool:
        return bool(self.items)

    def result(self) -> tuple[str, ...]:
        if self.extra:
            return (*self.items, f"... and {self.extra} more problems")
        return tuple(self.items)


def _as_game_array(games) -> np.ndarray | None:
    """The games of one round as an ``(k, 2)`` int64 array, or ``None`` when malformed."""
    try:
        arr = np.asarray(games)
    except (ValueError, TypeError):
        return None
    if arr.size == 0:
        return np.zeros((0, 2), dtype=np.int64)
    if arr.ndim != 2 or arr.shape[1] != 2:
        return None
    if arr.dtype.kind in "iu":
        return arr.astype(np.int64)
    if arr.dtype.kind == "O":
        # Mixed Python objects: accept only genuine integers (not bools, floats, strings).
        flat = arr.ravel()
        if all(isinstance(v, int | np.integer) and not isinstance(v, bool) for v in flat):
            return arr.astype(np.int64)
    return None


def _check_round(r: int, games, n: int, problems: _Problems) -> np.ndarray | None:
    """Check one round; return its ``(n/2, 2)`` games when it is a perfect matching."""
    arr = _as_game_array(games)
    if arr is None:
        problems.add(f"round {r}: every game must be a pair of integer vertices")
        return None
    ok = True
    lo, hi = arr.min(initial=0), arr.max(initial=0)
    if lo < 0 or hi >= n:
        bad = sorted({int(v) for v in arr.ravel() if v < 0 or v >= n})
        problems.add(f"round {r}: vertices {bad[:5]} are outside 0..{n - 1}")
        return None
    selfgames = np.flatnonzero(arr[:, 0] == arr[:, 1])
    for g in selfgames[:3]:
        problems.add(f"round {r}: game ({arr[g, 0]}, {arr[g, 1]}) pairs a vertex with itself")
        ok = False
    counts = np.bincount(arr.ravel(), minlength=n)
    twice = np.flatnonzero(counts > 1)
    missing = np.flatnonzero(counts == 0)
    if len(twice):
        problems.add(f"round {r}: vertices {twice[:5].tolist()} play more than once")
        ok = False
    if len(missing):
        problems.add(f"round {r}: vertices {missing[:5].tolist()} do not play")
        ok = False
    return arr if ok else None


def _partner_table(n: int, matchings: Sequence[np.ndarray]) -> np.ndarray:
    """``table[r, v]`` = partner of ``v`` in round ``r`` (rounds given as game arrays)."""
    table = np.empty((len(matchings), n), dtype=np.int32 if n < 2**31 else np.int64)
    for r, arr in enumerate(matchings):
        table[r, arr[:, 0]] = arr[:, 1]
        table[r, arr[:, 1]] = arr[:, 0]
    return table


def half_cycle_lengths(partners: np.ndarray, first: np.ndarray, second: np.ndarray) -> np.ndarray:
    """For each pair ``(first[k], second[k])`` of rounds, half the length of the cycle through 0.

    ``partners`` is an ``(R, n)`` table of partner maps (every row a fixed-point-free
    involution). The union of rounds ``i`` and ``j`` is Hamiltonian exactly when the value is
    ``n / 2``. Vectorised orbit walk of vertex 0 under ``p_j ∘ p_i`` (see module docstring).

    Parameters
    ----------
    partners : numpy.ndarray
        The ``(R, n)`` partner table.
    first, second : numpy.ndarray
        Round indices of the pairs to measure, of equal length.

    Returns
    -------
    numpy.ndarray
        The int64 values, one per pair: half the length of the cycle of the union through vertex 0.

    Examples
    --------
    >>> from scheduler.factorization import circle_factorization
    >>> table = partner_table(10, circle_factorization(10).rounds)
    >>> half_cycle_lengths(table, np.array([0, 0]), np.array([1, 3])).tolist()
    [5, 2]
    """
    n = partners.shape[1]
    flat = np.ascontiguousarray(partners).ravel()
    idx_dtype: type[np.signedinteger[Any]] = np.int32 if flat.size < 2**31 else np.int64
    out = np.zeros(len(first), dtype=np.int64)
    half = n // 2
    for start in range(0, len(first), _BLOCK):
        stop = min(start + _BLOCK, len(first))
        pos = np.arange(start, stop)
        bi = first[start:stop].astype(idx_dtype) * idx_dtype(n)
        bj = second[start:stop].astype(idx_dtype) * idx_dtype(n)
        x = np.zeros(stop - start, dtype=idx_dtype)
        for step in range(1, half + 1):
            x = np.take(flat, bj + np.take(flat, bi + x))
            hit = x == 0
            if hit.any():
                out[pos[hit]] = step
                keep = ~hit
                if not keep.any():
                    break
                pos, bi, bj, x = pos[keep], bi[keep], bj[keep], x[keep]
    return out


def union_cycle_lengths(partners: np.ndarray, i: int, j: int) -> tuple[int, ...]:
    """Sorted cycle lengths of the union of rounds ``i`` and ``j`` (partner-table form).

    Parameters
    ----------
    partners : numpy.ndarray
        The ``(R, n)`` partner table.
    i, j : int
        The two rounds, 0-based.

    Returns
    -------
    tuple of int
        The cycle lengths, sorted; ``(n,)`` exactly when the two rounds mix perfectly.

    Examples
    --------
    >>> from scheduler.factorization import circle_factorization
    >>> table = partner_table(10, circle_factorization(10).rounds)
    >>> union_cycle_lengths(table, 0, 1), union_cycle_lengths(table, 0, 3)
    ((10,), (4, 6))
    """
    pi = partners[i].tolist()
    pj = partners[j].tolist()
    n = len(pi)
    seen = [False] * n
    lengths = []
    for v0 in range(n):
        if seen[v0]:
            continue
        length = 0
        v = v0
        while True:
            seen[v] = True
            w = pi[v]
            seen[w] = True
            length += 2
            v = pj[w]
            if v == v0:
                break
        lengths.append(length)
    return tuple(sorted(lengths))


def _upper_pairs(r: int) -> tuple[np.ndarray, np.ndarray]:
    first, second = np.triu_indices(r, k=1)
    return first, second


def verify_rounds(n: int, rounds: Iterable, *, max_listed: int = 50) -> Certificate:
    """Check that ``rounds`` form a one-factorization of ``K_n`` and count its perfect pairs.

    ``rounds`` is a sequence of rounds, each a sequence of games ``(a, b)`` on ``0..n-1``.
    Never raises for a bad factorization: every defect is reported in ``problems`` (readable
    sentences) and ``valid`` is then false. When every round is a perfect matching the pairs of
    rounds are also examined (even if the whole is not a valid factorization); ``pairs`` is the
    number of pairs of rounds examined (``C(n-1, 2)`` for a valid factorization).
    ``imperfect`` lists the first ``max_listed`` imperfect pairs (in order of ``(first, second)``)
    with their sorted cycle lengths; ``imperfect_total`` counts all of them.

    Parameters
    ----------
    n
        The even order of the complete graph (vertices ``0..n-1``).
    rounds
        The rounds, each an iterable of games ``(a, b)``.
    max_listed
        How many imperfect pairs are listed in the certificate.

    Returns
    -------
    Certificate
        Validity, the perfect pairs out of the pairs examined, the problems found and the
        imperfect pairs with their cycle lengths.

    References
    ----------
    A. Kotzig 1964 (perfect one-factorizations); W. D. Wallis, *One-Factorizations*, Kluwer
    1997, ch. 16; ``docs/one-factorizations.md``.

    Examples
    --------
    The circle factorization GK_6 is perfect (5 is prime); GK_10 is not (9 is not):

    >>> from scheduler.factorization import circle_factorization, verify_rounds
    >>> verify_rounds(6, circle_factorization(6).rounds)
    Certificate(n=6, valid=True, perfect_pairs=10, pairs=10, problems=(), imperfect=(), \
imperfect_total=0)
    >>> gk10 = verify_rounds(10, circle_factorization(10).rounds)
    >>> gk10.valid, gk10.perfect_pairs, gk10.pairs, gk10.imperfect[0].label
    (True, 27, 36, '4+6')

    A defect is reported, not raised:

    >>> verify_rounds(4, [[(0, 1), (2, 3)], [(0, 2), (1, 3)], [(0, 1), (2, 3)]]).problems[-1]
    'vertices 1 and 2 never meet'
    """
    problems = _Problems()
    if isinstance(n, bool) or not isinstance(n, int | np.integer):
        problems.add(f"the order n must be an integer, got {n!r}")
        return Certificate(n=0, valid=False, perfect_pairs=0, pairs=0, problems=problems.result())
    n = int(n)
    if n < 2 or n % 2:
        problems.add(f"the order n must be even and at least 2, got {n}")
        return Certificate(n=n, valid=False, perfect_pairs=0, pairs=0, problems=problems.result())
    try:
        rounds = list(rounds)
    except TypeError:
        problems.add("the rounds must be a sequence of rounds")
        return Certificate(n=n, valid=False, perfect_pairs=0, pairs=0, problems=problems.result())

    if len(rounds) != n - 1:
        problems.add(f"K_{n} needs {n - 1} rounds, got {len(rounds)}")
    matchings: list[np.ndarray] = []
    all_perfect = True
    for r, games in enumerate(rounds):
        arr = _check_round(r, games, n, problems)
        if arr is None:
            all_perfect = False
        else:
            matchings.append(arr)

    if all_perfect and matchings:
        edges = np.concatenate(matchings)
        lo = np.minimum(edges[:, 0], edges[:, 1])
        hi = np.maximum(edges[:, 0], edges[:, 1])
        key = lo * n + hi
        if n * n <= 1 << 26:
            mult = np.bincount(key, minlength=n * n).reshape(n, n)
            iu = np.triu_indices(n, k=1)
            counts = mult[iu]
            pair_a, pair_b = iu
        else:
            uniq, cnt = np.unique(key, return_counts=True)
            full = np.zeros(n * (n - 1) // 2, dtype=np.int64)
            ua, ub = uniq // n, uniq % n
            # index of pair (a, b), a < b, in row-major upper-triangle order
            full[ua * (2 * n - ua - 1) // 2 + (ub - ua - 1)] = cnt
            counts = full
            pair_a, pair_b = np.triu_indices(n, k=1)
        round_of = np.repeat(np.arange(len(matchings)), n // 2)
        for k in np.flatnonzero(counts > 1)[:MAX_PROBLEMS]:
            a, b = int(pair_a[k]), int(pair_b[k])
            where = sorted(int(x) for x in round_of[key == a * n + b])
            problems.add(f"vertices {a} and {b} meet in more than one round: rounds {where}")
        for k in np.flatnonzero(counts == 0)[:MAX_PROBLEMS]:
            problems.add(f"vertices {int(pair_a[k])} and {int(pair_b[k])} never meet")

    if not all_perfect or len(matchings) < 2:
        return Certificate(
            n=n, valid=not problems, perfect_pairs=0, pairs=0, problems=problems.result()
        )

    partners = _partner_table(n, matchings)
    first, second = _upper_pairs(len(matchings))
    halves = half_cycle_lengths(partners, first, second)
    good = halves == n // 2
    bad = np.flatnonzero(~good)
    listed = tuple(
        ImperfectPair(int(first[k]), int(second[k]),
                      union_cycle_lengths(partners, int(first[k]), int(second[k])))
        for k in bad[: max(0, max_listed)]
    )
    return Certificate(
        n=n,
        valid=not problems,
        perfect_pairs=int(good.sum()),
        pairs=len(first),
        problems=problems.result(),
        imperfect=listed,
        imperfect_total=len(bad),
    )


def partner_table(n: int, rounds: Iterable) -> np.ndarray:
    """``(R, n)`` array of partners; raises :class:`InputError` unless every round is a perfect
    matching of ``0..n-1``.

    Parameters
    ----------
    n : int
        The even order.
    rounds : iterable
        The rounds, each a sequence of games ``(a, b)`` on ``0..n-1``.

    Returns
    -------
    numpy.ndarray
        ``partners[r, v]``: the vertex ``v`` meets in round ``r``.

    Raises
    ------
    InputError
        When a round is not a perfect matching of ``0..n-1`` (all such rounds are named).

    Examples
    --------
    >>> partner_table(4, [((0, 1), (2, 3))]).tolist()
    [[1, 0, 3, 2]]
    """
    problems = _Problems()
    matchings = []
    for r, games in enumerate(rounds):
        arr = _check_round(r, games, n, problems)
        if arr is not None:
            matchings.append(arr)
    if problems:
        raise InputError("; ".join(problems.result()), location="rounds")
    return _partner_table(n, matchings)


def hamiltonian_pair_matrix(n: int, rounds: Iterable) -> np.ndarray:
    """``(R, R)`` boolean matrix: ``[i, j]`` is true when rounds ``i`` and ``j`` (``i != j``)
    together form one Hamiltonian cycle (with a bye: one Hamiltonian path on the real teams).

    The diagonal is false. Raises :class:`InputError` unless every round is a perfect matching.

    Parameters
    ----------
    n
        The even order.
    rounds
        The rounds, each a sequence of games ``(a, b)`` on ``0..n-1``.

    Returns
    -------
    numpy.ndarray
        The ``(R, R)`` boolean matrix.

    Raises
    ------
    InputError
        When a round is not a perfect matching of ``0..n-1``.

    Examples
    --------
    >>> from scheduler.factorization import circle_factorization
    >>> hamiltonian_pair_matrix(4, circle_factorization(4).rounds).astype(int).tolist()
    [[0, 1, 1], [1, 0, 1], [1, 1, 0]]
    """
    if isinstance(n, bool) or not isinstance(n, int | np.integer) or n < 2 or n % 2:
        raise InputError(f"the order n must be an even integer >= 2, got {n!r}", location="n")
    partners = partner_table(int(n), rounds)
    r = partners.shape[0]
    first, second = _upper_pairs(r)
    good = half_cycle_lengths(partners, first, second) == n // 2
    matrix = np.zeros((r, r), dtype=bool)
    matrix[first, second] = good
    matrix[second, first] = good
    return matrix
