"""Even starters in the cyclic group ``Z_M`` (``M`` even) and their one-factorizations of
``K_{M+2}`` with two fixed points; randomised search for perfect ones.

Definition. Let ``h = M / 2`` (the element of order 2). An *even starter* is a set ``S`` of
``h - 1`` pairs ``{x_i, y_i}`` of ``Z_M`` that partition ``Z_M \\ {0, m}`` for one element
``m != 0`` (the *missing* element) and whose differences ``±(x_i - y_i)`` cover
``Z_M \\ {0, h}`` exactly once. On the vertices ``Z_M ∪ {∞1, ∞2}`` (``∞1 = M``, ``∞2 = M + 1``)
the rounds

* ``F_g = {∞1, g} ∪ {∞2, m + g} ∪ (S + g)`` for ``g`` in ``Z_M``, and
* ``E = {∞1, ∞2} ∪ {{x, x + h} : 0 <= x < h}``

form a one-factorization of ``K_{M+2}`` (every difference class ``±d``, ``d != h``, has ``M``
edges, covered once by the translates of its pair; the ``h`` edges of difference ``h`` are in
``E``). Translation is an automorphism fixing ``∞1``, ``∞2`` and ``E``, so ``F_a ∪ F_b`` is
isomorphic to ``F_0 ∪ F_{b-a}`` and ``F_a ∪ E`` to ``F_0 ∪ E``: the factorization is perfect
exactly when ``F_0 ∪ F_g`` is a Hamiltonian cycle for ``g = 1..h`` and ``F_0 ∪ E`` is one
(``h + 1`` cycle walks; a *perfect even starter*). A unit ``u`` of ``Z_M`` maps an even starter
missing ``m`` to one missing ``u m`` with an isomorphic factorization, so the search only tries
``m`` = a divisor of ``M`` (one per orbit of the units); ``m = h`` never works since then
``0, ∞1, ∞2, h`` close a 4-cycle in ``F_0 ∪ E``.

References (from memory, unverified): B. A. Anderson, "A class of starter induced
1-factorizations", *Graphs and Combinatorics* (Proc. Capital Conf. 1973), Springer LNM 406
(1974), 180-185 (even starters and the 1-factorizations they induce);
J. H. Dinitz, "Starters", in *Handbook of Combinatorial Designs*, 2nd ed., C. J. Colbourn and
J. H. Dinitz (eds.), Chapman & Hall/CRC 2007, §VI.55. Restarts: M. Luby, A. Sinclair,
D. Zuckerman, Inform. Process. Lett. 47 (1993), as in :mod:`scheduler.factorization.search`.
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
    "even-starter-induced one-factorization with two fixed points (B. A. Anderson 1974; "
    "J. H. Dinitz, Handbook of Combinatorial Designs 2007, from memory)"
)

MAX_ORDER = 1000


def _check_order(M) -> int:
    if isinstance(M, bool) or not isinstance(M, int | np.integer) or M < 4 or M % 2:
        raise InputError(f"an even starter needs an even group order >= 4, got {M!r}",
                         location="group")
    if M > MAX_ORDER:
        raise InputError(f"group order {M} is above the supported {MAX_ORDER}",
                         location="group")
    return int(M)


def _pairs(starter: Sequence[Sequence[int]]) -> list[Pair]:
    out = []
    for pair in starter:
        a, b = (int(v) for v in pair)
        out.append((min(a, b), max(a, b)))
    return sorted(out)


def is_even_starter(M: int, starter: Sequence[Sequence[int]]) -> bool:
    """Is ``starter`` an even starter of ``Z_M`` (definition in the module docstring)?

    Parameters
    ----------
    M : int
        The even order of the cyclic group ``Z_M`` (the factorization is of ``K_{M+2}``).
    starter : sequence of pairs of int
        The pairs of elements of ``Z_M``.

    Returns
    -------
    bool
        False also for anything that is not a sequence of pairs.

    Raises
    ------
    InputError
        For an order ``M`` that is not even and in range.

    Examples
    --------
    >>> is_even_starter(6, [(1, 3), (4, 5)]), is_even_starter(6, [(1, 2), (3, 4)])
    (True, False)
    """
    M = _check_order(M)
    h = M // 2
    try:
        pairs = _pairs(starter)
    except (TypeError, ValueError):
        return False
    if len(pairs) != h - 1:
        return False
    elements = [v for p in pairs for v in p]
    if any(v <= 0 or v >= M for v in elements) or len(set(elements)) != M - 2:
        return False
    diffs = set()
    for a, b in pairs:
        diffs.add((a - b) % M)
        diffs.add((b - a) % M)
    return len(diffs) == M - 2 and 0 not in diffs and h not in diffs


def _require(M: int, starter) -> tuple[int, list[Pair]]:
    M = _check_order(M)
    if not is_even_starter(M, starter):
        raise InputError(f"not an even starter in Z_{M}: {starter!r}", location="starter")
    return M, _pairs(starter)


def missing_element(M: int, starter: Sequence[Sequence[int]]) -> int:
    """The non-zero element of ``Z_M`` that no pair of the even starter covers.

    Parameters
    ----------
    M
        The even order of ``Z_M``.
    starter
        The ``M/2 - 1`` pairs ``(x, y)`` of ``Z_M``.

    Returns
    -------
    int
        The missing element ``m``.

    Raises
    ------
    InputError
        When ``starter`` is not an even starter of ``Z_M``.
    """
    M, pairs = _require(M, starter)
    covered = {v for p in pairs for v in p}
    return next(x for x in range(1, M) if x not in covered)


def even_starter_rounds(M: int, starter: Sequence[Sequence[int]]) -> tuple[tuple[Pair, ...], ...]:
    """Rounds ``F_0, ..., F_{M-1}, E`` on ``0..M+1`` (``∞1 = M``, ``∞2 = M + 1``).

    Parameters
    ----------
    M
        The even order of ``Z_M``.
    starter
        The ``M/2 - 1`` pairs ``(x, y)`` of ``Z_M``.

    Returns
    -------
    tuple of rounds
        ``M + 1`` rounds of games on ``0..M+1``.

    Raises
    ------
    InputError
        When ``starter`` is not an even starter of ``Z_M``.
    """
    M, pairs = _require(M, starter)
    h = M // 2
    m = missing_element(M, pairs)
    rounds = []
    for g in range(M):
        games = [(M, g), (M + 1, (m + g) % M)]
        games += [((a + g) % M, (b + g) % M) for a, b in pairs]
        rounds.append(normalise_round(games))
    rounds.append(normalise_round([(M, M + 1)] + [(x, x + h) for x in range(h)]))
    return tuple(rounds)


def even_starter_factorization(
    M: int, starter: Sequence[Sequence[int]], *, method: str | None = None,
    source: str | None = None,
    details: dict | None = None,
) -> Factorization:
    """The one-factorization of ``K_{M+2}`` induced by an even starter of ``Z_M``.

    Parameters
    ----------
    M
        The even order of ``Z_M``.
    starter
        The ``M/2 - 1`` pairs ``(x, y)`` of ``Z_M``.
    method, source
        Override the factorization's description and citation.
    details
        Extra entries for the factorization's ``details``.

    Returns
    -------
    Factorization
        The one-factorization of ``K_{M+2}``.

    Raises
    ------
    InputError
        When ``starter`` is not an even starter of ``Z_M``.
    """
    M, pairs = _require(M, starter)
    info = {
        "construction": "even starter",
        "group": f"Z_{M}",
        "missing": missing_element(M, pairs),
        "starter": [list(p) for p in pairs],
    }
    info.update(details or {})
    return Factorization(M + 2, even_starter_rounds(M, pairs),
                         method or f"even starter in Z_{M}", source or SOURCE, info)


def _is_hamiltonian(p: list[int], q: list[int]) -> bool:
    """Is the union of the matchings with partner lists ``p`` and ``q`` one cycle?"""
    n = len(p)
    v, length = 0, 0
    while True:
        v = q[p[v]]
        length += 2
        if v == 0:
            return length == n


def _partners(M: int, pairs: list[Pair], g: int, m: int) -> list[int]:
    p = [0] * (M + 2)
    p[M], p[g % M] = g % M, M
    p[M + 1], p[(m + g) % M] = (m + g) % M, M + 1
    for a, b in pairs:
        a, b = (a + g) % M, (b + g) % M
        p[a], p[b] = b, a
    return p


def good_even_differences(M: int, starter: Sequence[Sequence[int]]) -> list[int]:
    """The ``g`` in ``1..h`` with ``F_0 ∪ F_g`` Hamiltonian, and ``h + 1`` standing for ``E``
    when ``F_0 ∪ E`` is Hamiltonian.

    Parameters
    ----------
    M
        The even order of ``Z_M``.
    starter
        The ``M/2 - 1`` pairs ``(x, y)`` of ``Z_M``.

    Returns
    -------
    list of int
        The good ``g`` in increasing order.

    Raises
    ------
    InputError
        When ``starter`` is not an even starter of ``Z_M``.
    """
    M, pairs = _require(M, starter)
    h = M // 2
    m = missing_element(M, pairs)
    p0 = _partners(M, pairs, 0, m)
    good = [g for g in range(1, h + 1) if _is_hamiltonian(p0, _partners(M, pairs, g, m))]
    e = [0] * (M + 2)
    e[M], e[M + 1] = M + 1, M
    for x in range(h):
        e[x], e[x + h] = x + h, x
    if _is_hamiltonian(p0, e):
        good.append(h + 1)
    return good


def is_perfect_even_starter(M: int, starter: Sequence[Sequence[int]]) -> bool:
    """Is ``starter`` an even starter whose induced one-factorization is perfect?

    Parameters
    ----------
    M
        The even order of ``Z_M``.
    starter
        The ``M/2 - 1`` pairs ``(x, y)`` of ``Z_M``.

    Returns
    -------
    bool
        False also for anything that is not an even starter.
    """
    if not is_even_starter(M, starter):
        return False
    return len(good_even_differences(M, starter)) == M // 2 + 1


def enumerate_even_starters(M: int) -> Iterator[tuple[Pair, ...]]:
    """Every even starter of ``Z_M`` (exhaustive; feasible up to ``M`` about 16), each once:
    for each missing element in increasing order, the smallest free element is paired next.

    Parameters
    ----------
    M : int
        The even order of the cyclic group ``Z_M`` (the factorization is of ``K_{M+2}``).

    Yields
    ------
    tuple of Pair
        Each even starter once.

    Examples
    --------
    >>> list(enumerate_even_starters(6))[:2]
    [((1, 3), (4, 5)), ((1, 5), (3, 4))]
    """
    M = _check_order(M)
    h = M // 2
    used = [False] * M
    dused = [False] * M
    dused[0] = dused[h] = True
    chosen: list[Pair] = []

    def rec() -> Iterator[tuple[Pair, ...]]:
        x = next((v for v in range(1, M) if not used[v]), None)
        if x is None:
            yield tuple(chosen)
            return
        used[x] = True
        for y in range(x + 1, M):
            d = (y - x) % M
            if used[y] or dused[d]:
                continue
            used[y] = dused[d] = dused[M - d] = True
            chosen.append((x, y))
            yield from rec()
            chosen.pop()
            used[y] = dused[d] = dused[M - d] = False
        used[x] = False

    used[0] = True
    for m in range(1, M):
        used[m] = True
        yield from rec()
        used[m] = False


def missing_representatives(M: int) -> list[int]:
    """Missing elements worth trying: the divisors ``d`` of ``M`` with ``d < M``, ``d != M/2``
    (one per orbit of the unit group on ``Z_M``, the orbit of ``x`` being fixed by
    ``gcd(x, M)``).

    Parameters
    ----------
    M : int
        The even order of the cyclic group ``Z_M`` (the factorization is of ``K_{M+2}``).

    Returns
    -------
    list of int
        The divisors, increasing.

    Examples
    --------
    >>> missing_representatives(12)
    [1, 2, 3, 4]
    """
    M = _check_order(M)
    return [d for d in range(1, M) if M % d == 0 and d != M // 2]


@dataclass(frozen=True)
class EvenStarterSearchResult:
    """Outcome of :func:`search_perfect_even_starter`; ``exhausted`` means every tried missing
    element had its whole space explored without success (no perfect even starter exists with
    those missing elements).

    Parameters
    ----------
    group : str
        The group's name, ``"Z_M"``.
    seed : int
        The search's seed.
    starter : tuple of Pair or None
        The perfect even starter found; None when none was found.
    missing : int or None
        Its missing element; None when none was found.
    runs : int
        Restarts made.
    nodes : int
        Search nodes visited in all runs.
    seconds : float
        Wall time spent.
    exhausted : bool
        True when every missing element tried had its whole space explored.
    """

    group: str
    seed: int
    starter: tuple[Pair, ...] | None
    missing: int | None
    runs: int
    nodes: int
    seconds: float
    exhausted: bool

    @property
    def found(self) -> bool:
        """True when a perfect even starter was found."""
        return self.starter is not None


_EVEN_SALT = 54_321


def search_perfect_even_starter(
    M: int,
    *,
    seed: int = 0,
    budget: float = 10.0,
    missing: Sequence[int] | None = None,
    base_nodes: int = 20_000,
    max_run_nodes: int = 5_000_000,
    max_nodes: int | None = None,
    shuffle: bool = True,
    progress: Progress | None = None,
) -> EvenStarterSearchResult:
    """Search ``Z_M`` for a perfect even starter.

    Run ``r`` (from 1) uses the missing element ``missing[(r - 1) % len(missing)]`` (default
    :func:`missing_representatives`) and at most ``base_nodes * luby(r)`` nodes (capped by
    ``max_run_nodes``); ``budget`` is wall seconds checked between runs, ``max_nodes`` an
    optional total work limit. With ``shuffle=False`` (and node limits large enough) the runs
    are plain exhaustive searches, one per missing element. Every starter returned has been
    re-checked with :func:`is_perfect_even_starter`.

    Parameters
    ----------
    M : int
        The even order of the cyclic group ``Z_M`` (the factorization is of ``K_{M+2}``).
    seed : int, optional
        The seed of the restarts.
    budget : float, optional
        Seconds of wall time, checked between runs.
    missing : sequence of int or None, optional
        The missing elements to try, in turn; None: :func:`missing_representatives`.
    base_nodes : int, optional
        Nodes of the first run; run ``r`` gets ``base_nodes * luby(r)``.
    max_run_nodes : int, optional
        The most nodes of any run.
    max_nodes : int or None, optional
        A total work limit (the same outcome on every machine); None: only the clock.
    shuffle : bool, optional
        Random partner order; False for plain exhaustive runs.
    progress : callable or None, optional
        Called as ``progress(message, fraction)`` after each run.

    Returns
    -------
    EvenStarterSearchResult
        The starter found (or None) and the record of the search.

    Raises
    ------
    InputError
        For a bad order, seed, budget or missing element.

    References
    ----------
    ``docs/factorization-search.md``; B. A. Anderson 1974 (see the module docstring).
    """
    M = _check_order(M)
    if isinstance(seed, bool) or not isinstance(seed, int):
        raise InputError(f"the seed must be an integer, got {seed!r}", location="seed")
    if not budget > 0:
        raise InputError(f"the time budget must be positive, got {budget!r}", location="budget")
    mis_list = list(missing) if missing is not None else missing_representatives(M)
    if not mis_list or any(not 0 < int(v) < M for v in mis_list):
        raise InputError(f"missing elements must lie in 1..{M - 1}, got {mis_list!r}",
                         location="missing")
    from scheduler.factorization._even_kernel import even_search_kernel  # numba: lazily

    start = time.perf_counter()
    out = np.zeros((M // 2 - 1, 2), dtype=np.int32)
    alive = {int(v) for v in mis_list}
    runs = nodes = 0
    while True:
        runs += 1
        mis = int(mis_list[(runs - 1) % len(mis_list)])
        elapsed = time.perf_counter() - start
        if mis not in alive:
            if not alive:
                return EvenStarterSearchResult(f"Z_{M}", seed, None, None, runs - 1, nodes,
                                               elapsed, True)
            continue
        limit = run_node_limit(runs, base_nodes, max_run_nodes)
        if max_nodes is not None:
            limit = max(1, min(limit, max_nodes - nodes))
        status, used = even_search_kernel(
            M, mis, run_seed(seed, runs, _EVEN_SALT), shuffle, limit, out
        )
        nodes += int(used)
        elapsed = time.perf_counter() - start
        if status == 1:
            starter = tuple(sorted((int(min(a, b)), int(max(a, b))) for a, b in out))
            if not is_perfect_even_starter(M, starter):  # pragma: no cover - kernel bug guard
                raise AssertionError(f"even kernel returned a non-perfect starter {starter}")
            if progress:
                progress(f"perfect even starter found in Z_{M} after {runs} runs", 1.0)
            return EvenStarterSearchResult(f"Z_{M}", seed, starter, mis, runs, nodes, elapsed,
                                           False)
        if status == -1:
            alive.discard(mis)
            if not alive:
                if progress:
                    progress(f"no perfect even starter in Z_{M}", 1.0)
                return EvenStarterSearchResult(f"Z_{M}", seed, None, None, runs, nodes,
                                               elapsed, True)
        if progress:
            progress(f"searching Z_{M}: {runs} runs, {nodes} nodes", min(1.0, elapsed / budget))
        if elapsed >= budget or (max_nodes is not None and nodes >= max_nodes):
            return EvenStarterSearchResult(f"Z_{M}", seed, None, None, runs, nodes, elapsed,
                                           False)
