"""One-factorizations of ``K_{rk+1}`` with a prescribed automorphism of order ``k`` (``r``
cycles of length ``k`` and one fixed point), and a randomised search for perfect ones.

Space. Vertices are ``i k + x`` (block ``i < r``, ``x`` in ``Z_k``, ``k`` odd) and ``∞ = r k``;
the automorphism is ``σ: i k + x -> i k + (x + 1 mod k)``, ``σ(∞) = ∞``. In a one-factorization
invariant under ``σ`` the round through the edge ``{∞, i k}`` has an orbit of ``k`` distinct
rounds (``∞`` has one partner per round), so the rounds are ``B_i + a`` (``i < r``, ``a`` in
``Z_k``) for ``r`` *base rounds* ``B_i ∋ {∞, i k}``, and every ``σ``-orbit of edges lies in
exactly one base round. The orbits of edges inside block ``i`` are the difference classes
``±d`` (``d = 1..(k-1)/2``); between blocks ``i < j`` the classes ``y - x`` in ``Z_k`` of
``{i k + x, j k + y}``. Conversely any ``r`` perfect matchings ``B_i ∋ {∞, i k}`` that together
use every orbit once induce a one-factorization. Since ``σ`` is an automorphism,
``(B_i + a) ∪ (B_j + b) ≅ B_i ∪ (B_j + (b - a))``, so the factorization is perfect exactly when
``B_i ∪ (B_i + d)`` (``d = 1..(k-1)/2``) and ``B_i ∪ (B_j + d)`` (``i < j``, every ``d``) are
Hamiltonian cycles: ``r (k-1)/2 + k r (r-1)/2`` cycle walks. With ``r = 1`` this is exactly the
starter construction in ``Z_k`` (:mod:`scheduler.factorization.starters`).

Source of the method: searching for one-factorizations (perfect ones in particular) with a
prescribed automorphism group acting with few orbits is the approach of E. Seah and
D. R. Stinson ("On the enumeration of one-factorizations of complete graphs containing
prescribed automorphism groups", Math. Comp. 50 (1988) 607-618) and of their perfect
one-factorizations of K_36 (Discrete Math. 70 (1988)) and K_40 (Congr. Numer., c. 1989); all
from memory, unverified, and we do not know which group they prescribed. The search itself
(smallest free vertex of the least-filled base round first, random partner order, Luby
restarts) is this project's, as in :mod:`scheduler.factorization.search`.
"""

from __future__ import annotations

import time
from collections.abc import Iterator, Sequence
from dataclasses import dataclass

import numpy as np

from scheduler.errors import InputError
from scheduler.factorization.model import Factorization, normalise_round
from scheduler.factorization.search import run_node_limit, run_seed
from scheduler.progress import Progress

Pair = tuple[int, int]

SOURCE = (
    "one-factorization with a prescribed automorphism of order k (r cycles and a fixed point; "
    "method of E. Seah & D. R. Stinson 1988, from memory)"
)


def check_shape(r, k) -> tuple[int, int]:
    """``(r, k)`` as ints, or an :class:`~scheduler.errors.InputError` naming the bad one.

    Parameters
    ----------
    r, k
        The number of cycles and their length, as given.

    Returns
    -------
    tuple of (int, int)
        ``r`` and ``k``: positive, ``k`` odd and at least 3, ``r k + 1`` even and at most 1000.

    Examples
    --------
    >>> check_shape(3, 17)
    (3, 17)
    """
    for v, name in ((r, "r"), (k, "k")):
        if isinstance(v, bool) or not isinstance(v, int | np.integer) or v < 1:
            raise InputError(f"{name} must be a positive integer, got {v!r}", location=name)
    if k % 2 == 0 or k < 3:
        raise InputError(f"the cycle length k must be odd and at least 3, got {k}",
                         location="k")
    if (r * k + 1) % 2 or r * k + 1 > 1000:
        raise InputError(f"r k + 1 must be even and at most 1000, got {r * k + 1}",
                         location="r")
    return int(r), int(k)


def shift(v: int, s: int, r: int, k: int) -> int:
    """``σ^s(v)``.

    Parameters
    ----------
    v : int
        A vertex, ``0 <= v <= r k``.
    s : int
        The power of ``σ``.
    r : int
        The number of cycles of the automorphism.
    k : int
        Their odd length; ``r k + 1`` is the even order.

    Returns
    -------
    int
        The image of ``v``: ``∞ = r k`` is fixed, other vertices move ``s`` steps in their block.

    Examples
    --------
    >>> shift(4, 1, 2, 3), shift(6, 1, 2, 3)  # block 1 is 3..5; vertex 6 is the fixed point
    (5, 6)
    """
    return v if v == r * k else (v // k) * k + (v % k + s) % k


def orbit_table(r: int, k: int) -> tuple[np.ndarray, int]:
    """``(orb, count)``: ``orb[u, v]`` numbers the ``σ``-orbit of the edge ``{u, v}``
    (``u != v`` below ``r k``); the ``∞``-orbits are not numbered.

    Parameters
    ----------
    r : int
        The number of cycles of the automorphism.
    k : int
        Their odd length; ``r k + 1`` is the even order.

    Returns
    -------
    orb : numpy.ndarray
        ``(r k, r k)`` int32 table of orbit numbers, -1 on the diagonal.
    count : int
        The number of orbits numbered.

    Raises
    ------
    InputError
        When ``r k + 1`` is not even or too large.
    """
    r, k = check_shape(r, k)
    rk = r * k
    orb = np.full((rk, rk), -1, dtype=np.int32)
    ids: dict[tuple[int, int, int], int] = {}
    for u in range(rk):
        for v in range(rk):
            if u == v:
                continue
            (i, x), (j, y) = divmod(u, k), divmod(v, k)
            if i == j:
                d = (y - x) % k
                key = (i, i, min(d, k - d))
            elif i < j:
                key = (i, j, (y - x) % k)
            else:
                key = (j, i, (x - y) % k)
            orb[u, v] = ids.setdefault(key, len(ids))
    return orb, len(ids)


def union_systems(r: int, k: int) -> list[tuple[int, int, int]]:
    """The unions to check, as ``(i, j, d)`` for ``B_i ∪ (B_j + d)``.

    Parameters
    ----------
    r : int
        The number of cycles of the automorphism.
    k : int
        Their odd length; ``r k + 1`` is the even order.

    Returns
    -------
    list of tuple of (int, int, int)
        ``(i, i, d)`` for ``d = 1..(k-1)/2``, then ``(i, j, d)`` for ``i < j`` and every ``d``.

    Examples
    --------
    >>> union_systems(2, 3)
    [(0, 0, 1), (1, 1, 1), (0, 1, 0), (0, 1, 1), (0, 1, 2)]
    """
    out = [(i, i, d) for i in range(r) for d in range(1, (k - 1) // 2 + 1)]
    out += [(i, j, d) for i in range(r) for j in range(i + 1, r) for d in range(k)]
    return out


def kernel_tables(r: int, k: int) -> tuple[np.ndarray, np.ndarray, np.ndarray, int]:
    """``(ent_sys, ent_shift, n_ent, T)`` for the numba kernel.

    Parameters
    ----------
    r, k
        Number of blocks and their odd length.

    Returns
    -------
    tuple
        ``ent_sys`` and ``ent_shift`` (``r × width`` int32: the unions each base round enters and
        its shift there), ``n_ent`` (int32, entries per base round) and ``T`` (number of unions).
    """
    systems = union_systems(r, k)
    entries: list[list[tuple[int, int]]] = [[] for _ in range(r)]
    for t, (i, j, d) in enumerate(systems):
        entries[i].append((t, 0))
        entries[j].append((t, d))
    width = max(len(e) for e in entries)
    ent_sys = np.zeros((r, width), dtype=np.int32)
    ent_shift = np.zeros((r, width), dtype=np.int32)
    for f, ents in enumerate(entries):
        for e, (t, s) in enumerate(ents):
            ent_sys[f, e], ent_shift[f, e] = t, s
    n_ent = np.array([len(e) for e in entries], dtype=np.int32)
    return ent_sys, ent_shift, n_ent, len(systems)


def _base_pairs(base) -> list[list[Pair]]:
    return [sorted((min(int(a), int(b)), max(int(a), int(b))) for a, b in rnd) for rnd in base]


def is_orbit_base(r: int, k: int, base: Sequence[Sequence[Sequence[int]]]) -> bool:
    """Are ``base`` (``r`` lists of pairs) base rounds of a ``σ``-invariant one-factorization?

    Parameters
    ----------
    r, k
        Number of blocks and their odd length (``n = r k + 1``).
    base
        The ``r`` base rounds, each a list of pairs ``(a, b)``.

    Returns
    -------
    bool
        False also for input that is not a list of lists of pairs.
    """
    r, k = check_shape(r, k)
    try:
        rounds = _base_pairs(base)
    except (TypeError, ValueError):
        return False
    n, inf = r * k + 1, r * k
    if len(rounds) != r:
        return False
    orb, count = orbit_table(r, k)
    seen = set()
    for f, rnd in enumerate(rounds):
        verts = [v for p in rnd for v in p]
        if sorted(verts) != list(range(n)) or (f * k, inf) not in rnd:
            return False
        for a, b in rnd:
            if b == inf:
                continue
            if a == b or orb[a, b] in seen:
                return False
            seen.add(int(orb[a, b]))
    return len(seen) == count


def _require(r: int, k: int, base) -> list[list[Pair]]:
    if not is_orbit_base(r, k, base):
        raise InputError(f"not base rounds of a Z_{k}-invariant one-factorization of "
                         f"K_{r * k + 1}", location="base")
    return _base_pairs(base)


def orbit_rounds(r: int, k: int,
                 base: Sequence[Sequence[Sequence[int]]]) -> tuple[tuple[Pair, ...], ...]:
    """All ``r k`` rounds ``B_i + a`` in the order ``i`` then ``a``.

    Parameters
    ----------
    r, k
        Number of blocks and their odd length (``n = r k + 1``).
    base
        The ``r`` base rounds, each a list of pairs ``(a, b)``.

    Returns
    -------
    tuple of rounds
        ``r k`` rounds of games on ``0..r k``.

    Raises
    ------
    InputError
        When ``base`` are not base rounds of a ``σ``-invariant one-factorization.
    """
    rounds = _require(r, k, base)
    return tuple(
        normalise_round([(shift(a, s, r, k), shift(b, s, r, k)) for a, b in rounds[i]])
        for i in range(r) for s in range(k)
    )


def is_perfect_orbit_base(r: int, k: int, base: Sequence[Sequence[Sequence[int]]]) -> bool:
    """Is every union ``B_i ∪ (B_j + d)`` of :func:`union_systems` Hamiltonian?

    Parameters
    ----------
    r, k
        Number of blocks and their odd length (``n = r k + 1``).
    base
        The ``r`` base rounds, each a list of pairs ``(a, b)``.

    Returns
    -------
    bool
        False also for anything that is not a base.
    """
    if not is_orbit_base(r, k, base):
        return False
    rounds = _base_pairs(base)
    n = r * k + 1

    def partners(i: int, s: int) -> list[int]:
        p = [0] * n
        for a, b in rounds[i]:
            a, b = shift(a, s, r, k), shift(b, s, r, k)
            p[a], p[b] = b, a
        return p

    for i, j, d in union_systems(r, k):
        p, q = partners(i, 0), partners(j, d)
        v, length = 0, 0
        while True:
            v = q[p[v]]
            length += 2
            if v == 0:
                break
        if length != n:
            return False
    return True


def orbit_factorization(r: int, k: int, base: Sequence[Sequence[Sequence[int]]], *,
                        method: str | None = None,
                        source: str | None = None, details: dict | None = None
                        ) -> Factorization:
    """The one-factorization of ``K_{rk+1}`` with base rounds ``base``.

    Parameters
    ----------
    r, k
        Number of blocks and their odd length (``n = r k + 1``).
    base
        The ``r`` base rounds, each a list of pairs ``(a, b)``.
    method, source
        Override the factorization's description and citation.
    details
        Extra entries for the factorization's ``details``.

    Returns
    -------
    Factorization
        The one-factorization of ``K_{rk+1}``.

    Raises
    ------
    InputError
        When ``base`` are not base rounds of a ``σ``-invariant one-factorization.
    """
    rounds = _require(r, k, base)
    info = {"construction": "prescribed automorphism", "r": r, "k": k,
            "base": [[list(p) for p in rnd] for rnd in rounds]}
    info.update(details or {})
    return Factorization(r * k + 1, orbit_rounds(r, k, rounds),
                         method or f"Z_{k}-invariant ({r} cycles and a fixed point)",
                         source or SOURCE, info)


def enumerate_orbit_bases(r: int, k: int) -> Iterator[tuple[tuple[Pair, ...], ...]]:
    """Every admissible ``base`` (exhaustive; tiny orders only, e.g. ``K_10`` with ``k = 3``).

    Parameters
    ----------
    r : int
        The number of cycles of the automorphism.
    k : int
        Their odd length; ``r k + 1`` is the even order.

    Yields
    ------
    tuple of tuple of Pair
        The ``r`` base rounds ``B_i``, each a sorted perfect matching containing ``{i k, ∞}``.
    """
    r, k = check_shape(r, k)
    orb, _ = orbit_table(r, k)
    inf = r * k
    partner = [[-1] * (inf + 1) for _ in range(r)]
    for f in range(r):
        partner[f][inf], partner[f][f * k] = f * k, inf
    used: set[int] = set()

    def rec() -> Iterator[tuple[tuple[Pair, ...], ...]]:
        f = next((g for g in range(r) if -1 in partner[g]), None)
        if f is None:
            yield tuple(
                tuple(sorted((min(v, w), max(v, w)) for v, w in enumerate(partner[g]) if v < w))
                for g in range(r))
            return
        x = partner[f].index(-1)
        for y in range(x + 1, inf):
            o = int(orb[x, y])
            if partner[f][y] >= 0 or o in used:
                continue
            partner[f][x], partner[f][y] = y, x
            used.add(o)
            yield from rec()
            used.discard(o)
            partner[f][x] = partner[f][y] = -1

    yield from rec()


@dataclass(frozen=True)
class OrbitSearchResult:
    """Outcome of :func:`search_perfect_orbit_factorization` (``exhausted``: no perfect
    one-factorization of this kind exists).

    Parameters
    ----------
    r : int
        The number of cycles of the automorphism.
    k : int
        Their odd length; ``r k + 1`` is the even order.
    seed : int
        The search's seed.
    base : tuple of tuple of Pair or None
        The base rounds of the perfect factorization found; None when none was found.
    runs : int
        Restarts made.
    nodes : int
        Search nodes visited in all runs.
    seconds : float
        Wall time spent.
    exhausted : bool
        True when a run explored the whole space without success.
    """

    r: int
    k: int
    seed: int
    base: tuple[tuple[Pair, ...], ...] | None
    runs: int
    nodes: int
    seconds: float
    exhausted: bool

    @property
    def found(self) -> bool:
        """True when a perfect factorization was found."""
        return self.base is not None


_ORBIT_SALT = 13_579


def search_perfect_orbit_factorization(
    r: int, k: int, *, seed: int = 0, budget: float = 10.0, base_nodes: int = 20_000,
    max_run_nodes: int = 5_000_000, max_nodes: int | None = None,
    progress: Progress | None = None,
) -> OrbitSearchResult:
    """Search for a perfect ``σ``-invariant one-factorization of ``K_{rk+1}``.

    Luby restarts as in :func:`scheduler.factorization.search.search_perfect_starter`;
    ``budget`` is wall seconds checked between runs and ``max_nodes`` an optional work limit.
    Every result has been re-checked with :func:`is_perfect_orbit_base`.

    Parameters
    ----------
    r : int
        The number of cycles of the automorphism.
    k : int
        Their odd length; ``r k + 1`` is the even order.
    seed : int, optional
        The seed of the restarts.
    budget : float, optional
        Seconds of wall time, checked between runs.
    base_nodes : int, optional
        Nodes of the first run; run ``r`` gets ``base_nodes * luby(r)``.
    max_run_nodes : int, optional
        The most nodes of any run.
    max_nodes : int or None, optional
        A total work limit (the same outcome on every machine); None: only the clock.
    progress : callable or None, optional
        Called as ``progress(message, fraction)`` after each run.

    Returns
    -------
    OrbitSearchResult
        The base rounds found (or None) and the record of the search.

    Raises
    ------
    InputError
        For bad ``r``, ``k``, seed or budget.

    References
    ----------
    ``docs/factorization-search.md``; E. Seah and D. R. Stinson 1988 (see the module docstring).
    """
    r, k = check_shape(r, k)
    if isinstance(seed, bool) or not isinstance(seed, int):
        raise InputError(f"the seed must be an integer, got {seed!r}", location="seed")
    if not budget > 0:
        raise InputError(f"the time budget must be positive, got {budget!r}", location="budget")
    from scheduler.factorization._orbit_kernel import orbit_search_kernel  # numba: lazily

    orb, n_orb = orbit_table(r, k)
    ent_sys, ent_shift, n_ent, T = kernel_tables(r, k)
    out = np.zeros((r, r * k + 1), dtype=np.int32)
    start = time.perf_counter()
    runs = nodes = 0
    while True:
        runs += 1
        limit = run_node_limit(runs, base_nodes, max_run_nodes)
        if max_nodes is not None:
            limit = max(1, min(limit, max_nodes - nodes))
        status, used = orbit_search_kernel(r, k, orb, n_orb, ent_sys, ent_shift, n_ent, T,
                                           run_seed(seed, runs, _ORBIT_SALT), limit, out)
        nodes += int(used)
        elapsed = time.perf_counter() - start
        if status == 1:
            base = tuple(
                tuple((v, int(out[f, v])) for v in range(r * k + 1) if v < out[f, v])
                for f in range(r))
            if not is_perfect_orbit_base(r, k, base):  # pragma: no cover - kernel bug guard
                raise AssertionError(f"orbit kernel returned a non-perfect base {base}")
            return OrbitSearchResult(r, k, seed, base, runs, nodes, elapsed, False)
        if status == -1:
            return OrbitSearchResult(r, k, seed, None, runs, nodes, elapsed, True)
        if progress:
            progress(f"searching Z_{k} x {r}: {runs} runs, {nodes} nodes",
                     min(1.0, elapsed / budget))
        if elapsed >= budget or (max_nodes is not None and nodes >= max_nodes):
            return OrbitSearchResult(r, k, seed, None, runs, nodes, elapsed, False)
