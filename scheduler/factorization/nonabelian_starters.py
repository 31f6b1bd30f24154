"""Starters in non-abelian groups of odd order ``pq`` (``Z_p ⋊ Z_q``) and the 1-rotational
one-factorizations of ``K_{pq+1}`` they induce; randomised search for perfect ones.

Groups. For primes (or any moduli) ``p``, ``q`` and a unit ``r`` of ``Z_p`` with ``r^q = 1``
the semidirect product ``Z_p ⋊_r Z_q`` has elements ``(a, b)`` (code ``a + p b``) and product
``(a1, b1)(a2, b2) = (a1 + r^b1 a2, b1 + b2)``; ``r = 1`` is the abelian ``Z_p × Z_q``. For
``q | p - 1`` and ``r`` of order ``q`` it is non-abelian, e.g. the groups of order 21, 39, 55
(standard; e.g. D. S. Dummit and R. M. Foote, *Abstract Algebra*, 3rd ed., Wiley 2004, §5.5).

Starters. A *starter* in a group ``G`` of odd order ``m`` is a set ``S`` of ``(m-1)/2`` pairs
``{x, y}`` partitioning ``G \\ {e}`` whose quotients ``x y^-1`` and ``y x^-1`` cover
``G \\ {e}`` exactly once. On the vertices ``G ∪ {∞}`` the rounds
``F_g = {∞, g} ∪ {{x g, y g} : {x, y} ∈ S}`` (right translates) form a one-factorization of
``K_{m+1}``: the right-translation orbit of an edge ``{x, y}`` is the set of edges with quotient
``x y^-1`` or its inverse, and it has ``m`` edges because ``G`` has no involution. Right
translation by ``h`` maps ``F_g`` to ``F_{gh}``, so ``F_a ∪ F_b ≅ F_e ∪ F_{b a^-1}``, and
``F_e ∪ F_{g^-1} ≅ F_g ∪ F_e``: the factorization is perfect exactly when ``F_e ∪ F_g`` is a
Hamiltonian cycle for one ``g`` of each pair ``{g, g^-1}``, as for abelian starters. This is
the 1-rotational construction over an arbitrary group (M. Buratti, "Abelian 1-factorizations
of the complete graph", European J. Combin. 22 (2001) 291-295, and A. Bonisoli, D. Labbate,
"One-factorizations of complete graphs with vertex-regular automorphism groups", J. Combin.
Des. 10 (2002) 1-16; both from memory, unverified) specialised to odd order. A group
automorphism ``φ`` with ``S φ = S`` maps ``F_g`` to ``F_{φ(g)}``, so only one ``g`` per orbit of
``<g -> g^-1, φ>`` needs checking (the multiplier device of
:mod:`scheduler.factorization.search`, with ``φ`` an inner or outer automorphism).

The search is the odd-starter kernel (``_search_kernel.py``), which only uses the product and
inverse tables and so works for any group.

Results of this project's searches (``benchmarks/find_structured.py``, computed): a perfect
starter in ``Z_13 ⋊_3 Z_3`` (a P1F of ``K_40``, shipped in the catalogue) after 3.9e8 nodes
with seed 0; no perfect starter of ``Z_13 ⋊_3 Z_3`` is invariant under an automorphism of order
2, 3, 4, 6, 12 or 13 (each space exhausted); for ``Z_11 ⋊_3 Z_5`` (``K_56``) the spaces with an
automorphism of order 5, 10 or 11 are empty, and 1.6e9 nodes of the plain space and 1.0e9 of
the order-2 space (automorphism ``(10, 0)``) found nothing.
"""

from __future__ import annotations

import math
import time
from collections.abc import Iterator, Sequence
from dataclasses import dataclass, field

import numpy as np

from scheduler.errors import InputError
from scheduler.factorization.model import Factorization, normalise_round
from scheduler.factorization.search import (
    element_orbits,
    forced_partners,
    run_node_limit,
    run_seed,
)
from scheduler.progress import Progress

Pair = tuple[int, int]

SOURCE = (
    "1-rotational starter-induced one-factorization over a group of odd order "
    "(M. Buratti 2001; A. Bonisoli & D. Labbate 2002; from memory)"
)


@dataclass(frozen=True, eq=False)
class SemidirectGroup:
    """``Z_p ⋊_r Z_q`` on the codes ``a + p b`` (identity ``0``) with numpy tables
    ``mul[x, y]`` (the product ``x y``) and ``inv[x]``.

    Make it with :func:`semidirect`, which checks ``r`` and builds the tables.

    Parameters
    ----------
    p : int
        The odd modulus of the normal subgroup ``Z_p``.
    q : int
        The odd modulus of ``Z_q``.
    r : int
        A unit of ``Z_p`` with ``r^q = 1``: ``(0, 1)`` acts on ``Z_p`` as multiplication by ``r``.
    mul : numpy.ndarray
        ``(pq, pq)`` product table.
    inv : numpy.ndarray
        ``(pq,)`` table of inverses.

    References
    ----------
    D. S. Dummit and R. M. Foote, *Abstract Algebra*, 3rd ed., Wiley 2004, §5.5.

    Examples
    --------
    >>> group = semidirect(7, 3)
    >>> group.name, group.order
    ('Z_7 x|2 Z_3', 21)
    >>> int(group.mul[1, 7]), int(group.mul[7, 1])  # not abelian
    (8, 9)
    """

    p: int
    q: int
    r: int
    mul: np.ndarray = field(repr=False)
    inv: np.ndarray = field(repr=False)

    @property
    def order(self) -> int:
        """The number of elements ``p q``."""
        return self.p * self.q

    @property
    def name(self) -> str:
        """The readable name ``"Z_p x|r Z_q"``."""
        return f"Z_{self.p} x|{self.r} Z_{self.q}"

    def automorphism(self, s: int, c: int) -> np.ndarray:
        """The automorphism ``x -> h^-1 σ_s(x) h`` with ``σ_s(a, b) = (s a, b)`` (``s`` a unit
        of ``Z_p``; it commutes with the action of ``r``) and ``h = (c, 0)``, as a permutation
        array (checked to be an automorphism). ``(1, 0)`` is the identity; ``(1, 1)`` has order
        ``p``; ``(s, 0)`` has the multiplicative order of ``s``.

        Parameters
        ----------
        s : int
            A unit of ``Z_p``.
        c : int
            The first coordinate of the conjugating element ``h = (c, 0)``.

        Returns
        -------
        numpy.ndarray
            ``perm[x]`` is the image of ``x``.

        Raises
        ------
        InputError
            When ``(s, c)`` does not give an automorphism.

        Examples
        --------
        >>> group = semidirect(7, 3)
        >>> is_automorphism(group, group.automorphism(1, 1))
        True
        """
        p = self.p
        perm = np.empty(self.order, dtype=np.int64)
        h = c % p
        hinv = int(self.inv[h])
        for x in range(self.order):
            a, b = x % p, x // p
            y = ((s * a) % p) + p * b
            perm[x] = self.mul[self.mul[hinv, y], h]
        if not is_automorphism(self, perm):
            raise InputError(f"({s}, {c}) does not give an automorphism of {self.name}",
                             location="automorphism")
        return perm


def semidirect(p: int, q: int, r: int | None = None) -> SemidirectGroup:
    """``Z_p ⋊_r Z_q``; by default ``r`` is the smallest unit of multiplicative order ``q``
    modulo ``p`` (so the group is non-abelian when ``q | p - 1``, ``q > 1``).

    Parameters
    ----------
    p, q : int
        Odd positive moduli.
    r : int or None, optional
        A unit of ``Z_p`` with ``r^q = 1 (mod p)``; None: the smallest of multiplicative order
        ``q``.

    Returns
    -------
    SemidirectGroup
        The group with its product and inverse tables.

    Raises
    ------
    InputError
        For an even or non-positive modulus, or no suitable ``r``.
    """
    for v, name in ((p, "p"), (q, "q")):
        if isinstance(v, bool) or not isinstance(v, int) or v < 1 or v % 2 == 0:
            raise InputError(f"{name} must be an odd positive integer, got {v!r}",
                             location="group")
    if r is None:
        r = next((u for u in range(2, p) if math.gcd(u, p) == 1 and _order(u, p) == q), None)
        if r is None:
            raise InputError(f"no unit of order {q} modulo {p}", location="group")
    if math.gcd(r, p) != 1 or pow(r, q, p) != 1 % p:
        raise InputError(f"r = {r} must be a unit with r^{q} = 1 modulo {p}", location="group")
    m = p * q
    codes = np.arange(m)
    a, b = codes % p, codes // p
    rpow = np.array([pow(r, k, p) for k in range(q)], dtype=np.int64)
    mul = ((a[:, None] + rpow[b][:, None] * a[None, :]) % p) + p * ((b[:, None] + b[None, :]) % q)
    inv = np.argmax(mul == 0, axis=1)  # the unique y with x y = e
    return SemidirectGroup(p, q, r, mul.astype(np.int64), inv.astype(np.int64))


def _order(u: int, p: int) -> int:
    k, x = 1, u % p
    while x != 1 % p:
        x = (x * u) % p
        k += 1
    return k


def is_automorphism(group: SemidirectGroup, perm: np.ndarray) -> bool:
    """Is ``perm`` a bijection with ``perm[x y] = perm[x] perm[y]``?

    Parameters
    ----------
    group : SemidirectGroup
        The group.
    perm : numpy.ndarray
        A candidate map of the codes.

    Returns
    -------
    bool
        True for an automorphism.
    """
    perm = np.asarray(perm)
    if sorted(perm.tolist()) != list(range(group.order)):
        return False
    return bool(np.array_equal(perm[group.mul], group.mul[perm[:, None], perm[None, :]]))


def _pairs(starter: Sequence[Sequence[int]]) -> list[Pair]:
    out = []
    for pair in starter:
        x, y = (int(v) for v in pair)
        out.append((min(x, y), max(x, y)))
    return sorted(out)


def is_group_starter(group: SemidirectGroup, starter: Sequence[Sequence[int]]) -> bool:
    """Do the pairs partition ``G \\ {e}`` with every quotient ``x y^-1`` exactly once?

    Parameters
    ----------
    group
        The group ``Z_p ⋊_r Z_q`` of odd order ``m``.
    starter
        The pairs ``(x, y)`` of group codes.

    Returns
    -------
    bool
        False also for input that is not a list of pairs.
    """
    m = group.order
    try:
        pairs = _pairs(starter)
    except (TypeError, ValueError):
        return False
    elements = [v for pr in pairs for v in pr]
    if len(pairs) != (m - 1) // 2 or any(v <= 0 or v >= m for v in elements):
        return False
    if len(set(elements)) != m - 1:
        return False
    quotients = set()
    for x, y in pairs:
        quotients.add(int(group.mul[x, group.inv[y]]))
        quotients.add(int(group.mul[y, group.inv[x]]))
    return len(quotients) == m - 1 and 0 not in quotients


def _require(group: SemidirectGroup, starter) -> list[Pair]:
    if not is_group_starter(group, starter):
        raise InputError(f"not a starter in {group.name}: {starter!r}", location="starter")
    return _pairs(starter)


def group_starter_rounds(group: SemidirectGroup,
                         starter: Sequence[Sequence[int]]) -> tuple[tuple[Pair, ...], ...]:
    """Rounds ``F_g`` for ``g = 0..m-1`` on ``0..m`` (``∞ = m``).

    Parameters
    ----------
    group
        The group ``Z_p ⋊_r Z_q`` of odd order ``m``.
    starter
        The pairs ``(x, y)`` of group codes.

    Returns
    -------
    tuple of rounds
        ``m`` rounds of games on ``0..m``.

    Raises
    ------
    InputError
        When ``starter`` is not a starter of ``group``.
    """
    pairs = _require(group, starter)
    m = group.order
    mul = group.mul
    return tuple(
        normalise_round([(m, g)] + [(int(mul[x, g]), int(mul[y, g])) for x, y in pairs])
        for g in range(m)
    )


def _partners(group: SemidirectGroup, pairs: list[Pair], g: int) -> list[int]:
    m = group.order
    p = [0] * (m + 1)
    p[m], p[g] = g, m
    for x, y in pairs:
        a, b = int(group.mul[x, g]), int(group.mul[y, g])
        p[a], p[b] = b, a
    return p


def is_perfect_group_starter(group: SemidirectGroup, starter: Sequence[Sequence[int]]) -> bool:
    """Is ``starter`` a starter of ``group`` whose induced one-factorization is perfect?
    (Walks ``F_e ∪ F_g`` for one ``g`` of each pair ``{g, g^-1}``.)

    Parameters
    ----------
    group
        The group ``Z_p ⋊_r Z_q`` of odd order ``m``.
    starter
        The pairs ``(x, y)`` of group codes.

    Returns
    -------
    bool
        False also for anything that is not a starter.
    """
    if not is_group_starter(group, starter):
        return False
    pairs = _pairs(starter)
    m = group.order
    p0 = _partners(group, pairs, 0)
    for g in range(1, m):
        if int(group.inv[g]) < g:
            continue
        pg = _partners(group, pairs, g)
        v, length = 0, 0
        while True:
            v = pg[p0[v]]
            length += 2
            if v == 0:
                break
        if length != m + 1:
            return False
    return True


def group_starter_factorization(group: SemidirectGroup, starter: Sequence[Sequence[int]], *,
                                method: str | None = None,
                                source: str | None = None,
                                details: dict | None = None) -> Factorization:
    """The one-factorization of ``K_{m+1}`` induced by a starter of ``group``.

    Parameters
    ----------
    group
        The group ``Z_p ⋊_r Z_q`` of odd order ``m``.
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
    """
    pairs = _require(group, starter)
    info = {"construction": "group starter", "group": group.name, "p": group.p, "q": group.q,
            "r": group.r, "starter": [list(pr) for pr in pairs]}
    info.update(details or {})
    return Factorization(group.order + 1, group_starter_rounds(group, pairs),
                         method or f"starter in {group.name}", source or SOURCE, info)


def enumerate_group_starters(group: SemidirectGroup) -> Iterator[tuple[Pair, ...]]:
    """Every starter of ``group`` (exhaustive backtracking; small orders only).

    Parameters
    ----------
    group : SemidirectGroup
        The group of odd order.

    Yields
    ------
    tuple of Pair
        Each starter once, its pairs sorted.
    """
    m = group.order
    mul = group.mul.tolist()
    inv = group.inv.tolist()
    used = [False] * m
    used[0] = True
    qused = [False] * m
    chosen: list[Pair] = []

    def rec() -> Iterator[tuple[Pair, ...]]:
        x = next((v for v in range(1, m) if not used[v]), None)
        if x is None:
            yield tuple(chosen)
            return
        used[x] = True
        for y in range(x + 1, m):
            d1 = mul[x][inv[y]]
            d2 = inv[d1]
            if used[y] or qused[d1] or qused[d2]:
                continue
            used[y] = qused[d1] = qused[d2] = True
            chosen.append((x, y))
            yield from rec()
            chosen.pop()
            used[y] = qused[d1] = qused[d2] = False
        used[x] = False

    yield from rec()


def group_kernel_arrays(
    group: SemidirectGroup, automorphism: tuple[int, int] = (1, 0)
) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """``(mul, inv, perm, reps, weights)`` as int32 arrays for the starter search kernel: the
    group's tables, the automorphism as a permutation, and one representative (the smallest
    code) per orbit of ``<g -> g^-1, automorphism>`` on ``G \\ {e}`` with the number of classes
    ``{g, g^-1}`` in it.

    Parameters
    ----------
    group : SemidirectGroup
        The group searched.
    automorphism : tuple of (int, int), optional
        ``(s, c)`` of :meth:`SemidirectGroup.automorphism`.

    Returns
    -------
    tuple of numpy.ndarray
        The five kernel arrays.

    Raises
    ------
    InputError
        For an automorphism that the group does not have.
    """
    perm = group.automorphism(*automorphism)
    orbits = element_orbits(group.inv, perm)
    return (
        np.ascontiguousarray(group.mul, dtype=np.int32),
        np.ascontiguousarray(group.inv, dtype=np.int32),
        np.ascontiguousarray(perm, dtype=np.int32),
        np.array([g for g, _ in orbits], dtype=np.int32),
        np.array([size // 2 for _, size in orbits], dtype=np.int32),
    )


@dataclass(frozen=True)
class GroupStarterSearchResult:
    """Outcome of :func:`search_perfect_group_starter` (``exhausted``: the whole space of
    ``automorphism``-invariant starters was explored without success).

    Parameters
    ----------
    group : str
        The group's name.
    automorphism : tuple of (int, int)
        The ``(s, c)`` of the automorphism the starter had to be invariant under.
    seed : int
        The search's seed.
    starter : tuple of Pair or None
        The perfect starter found; None when none was found.
    runs : int
        Restarts made.
    nodes : int
        Search nodes visited in all runs.
    seconds : float
        Wall time spent.
    exhausted : bool
        True when a run explored the whole space without success.
    """

    group: str
    automorphism: tuple[int, int]
    seed: int
    starter: tuple[Pair, ...] | None
    runs: int
    nodes: int
    seconds: float
    exhausted: bool

    @property
    def found(self) -> bool:
        """True when a perfect starter was found."""
        return self.starter is not None


_GROUP_SALT = 24_680


def search_perfect_group_starter(
    group: SemidirectGroup,
    *,
    seed: int = 0,
    budget: float = 10.0,
    automorphism: tuple[int, int] = (1, 0),
    base_nodes: int = 20_000,
    max_run_nodes: int = 5_000_000,
    max_nodes: int | None = None,
    exhaustive: bool = False,
    subtree: Sequence[int] = (),
    progress: Progress | None = None,
) -> GroupStarterSearchResult:
    """Search ``group`` for a perfect starter invariant under ``group.automorphism(*automorphism)``
    (``(1, 0)``: the identity, plain starters). Luby restarts as in
    :func:`scheduler.factorization.search.search_perfect_starter`; every starter returned is
    re-checked with :func:`is_perfect_group_starter`.

    Parameters
    ----------
    group : SemidirectGroup
        The group searched.
    seed : int, optional
        The seed of the restarts.
    budget : float, optional
        Seconds of wall time, checked between runs.
    automorphism : tuple of (int, int), optional
        ``(s, c)`` of :meth:`SemidirectGroup.automorphism`.
    base_nodes : int, optional
        Nodes of the first run; run ``r`` gets ``base_nodes * luby(r)``.
    max_run_nodes : int, optional
        The most nodes of any run.
    max_nodes : int or None, optional
        A total work limit (the same outcome on every machine); None: only the clock.
    exhaustive : bool, optional
        Run limits doubling without a cap
        (:func:`~scheduler.factorization.search.run_node_limit`): the way to settle a space.
    subtree : sequence of int, optional
        Partners forced on the first elements paired: only that subtree is searched
        (:func:`~scheduler.factorization.search.root_subtrees`, :func:`settle_group_subtree_task`).
    progress : callable or None, optional
        Called as ``progress(message, fraction)`` after each run.

    Returns
    -------
    GroupStarterSearchResult
        The starter found (or None) and the record of the search.

    Raises
    ------
    InputError
        For a bad seed, budget or automorphism.

    References
    ----------
    ``docs/factorization-search.md``.
    """
    if isinstance(seed, bool) or not isinstance(seed, int):
        raise InputError(f"the seed must be an integer, got {seed!r}", location="seed")
    if not budget > 0:
        raise InputError(f"the time budget must be positive, got {budget!r}", location="budget")
    from scheduler.factorization._search_kernel import search_kernel  # numba: lazily

    m = group.order
    automorphism_pair = (automorphism[0], automorphism[1])
    add, neg, mulu, reps, weights = group_kernel_arrays(group, automorphism_pair)
    forced = forced_partners(subtree, m)
    every_pair = np.ones((m, m), dtype=np.bool_)
    out = np.zeros(((m - 1) // 2, 2), dtype=np.int32)
    start = time.perf_counter()
    runs = nodes = 0
    while True:
        runs += 1
        limit = run_node_limit(runs, base_nodes, max_run_nodes, exhaustive)
        if max_nodes is not None:
            limit = max(1, min(limit, max_nodes - nodes))
        status, used, _ = search_kernel(m, add, neg, mulu, reps, weights, 0,
                                        run_seed(seed, runs, _GROUP_SALT), limit, out, forced,
                                        every_pair)
        nodes += int(used)
        elapsed = time.perf_counter() - start
        if status == 1:
            starter = tuple(sorted((int(min(a, b)), int(max(a, b))) for a, b in out))
            if not is_perfect_group_starter(group, starter):  # pragma: no cover - kernel guard
                raise AssertionError(f"search kernel returned a non-perfect starter {starter}")
            return GroupStarterSearchResult(group.name, automorphism_pair, seed, starter, runs,
                                            nodes, elapsed, False)
        if status == -1:
            return GroupStarterSearchResult(group.name, automorphism_pair, seed, None, runs,
                                            nodes, elapsed, True)
        if progress:
            progress(f"searching {group.name}: {runs} runs, {nodes} nodes",
                     min(1.0, elapsed / budget))
        if elapsed >= budget or (max_nodes is not None and nodes >= max_nodes):
            return GroupStarterSearchResult(group.name, automorphism_pair, seed, None, runs,
                                            nodes, elapsed, False)


def settle_group_subtree_task(p: int, q: int, r: int, automorphism: tuple[int, int],
                              subtree: Sequence[int]) -> dict:
    """One task of a settling search of ``Z_p ⋊_r Z_q`` split by
    :func:`~scheduler.factorization.search.root_subtrees`: the complete search of the subtree
    of starters invariant under ``automorphism``. A plain top-level function with plain
    arguments and a JSON-ready result, for a process pool or a distributed engine.

    Parameters
    ----------
    p, q, r : int
        The group (:func:`semidirect`).
    automorphism : tuple of (int, int)
        ``(s, c)`` of :meth:`SemidirectGroup.automorphism`.
    subtree : sequence of int
        The forced partners.

    Returns
    -------
    dict
        ``group``, ``automorphism``, ``subtree``, ``exhausted``, ``nodes``, ``seconds`` and
        ``starter`` (the perfect starter found, or None).
    """
    result = search_perfect_group_starter(semidirect(p, q, r),
                                          automorphism=(automorphism[0], automorphism[1]),
                                          subtree=tuple(subtree), exhaustive=True,
                                          base_nodes=2**62, budget=1.0)
    return {"group": result.group, "automorphism": list(result.automorphism),
            "subtree": list(subtree), "exhausted": result.exhausted, "nodes": result.nodes,
            "seconds": round(result.seconds, 3),
            "starter": [list(x) for x in result.starter] if result.starter else None}
