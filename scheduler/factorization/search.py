"""Randomised backtracking search for perfect starters, with restarts and a time budget.

The search space is the set of starters of an abelian group ``G`` of odd order ``m``
(see :mod:`scheduler.factorization.starters`), optionally restricted to starters invariant
under a multiplier ``x -> u x`` (``S u = S``); such starters shrink the search space and,
since multiplication by ``u`` maps ``F_g`` to ``F_{ug}``, only one ``g`` per orbit of
``<-1, u>`` needs a cycle check. Multiplier-invariant starters are a classical search device
for starters and Room squares (J. H. Dinitz and D. R. Stinson, "Room squares and related
designs", *Contemporary Design Theory*, Wiley 1992; docs/one-factorizations.md §5 describes
restricted searches in structured spaces).

The element paired next is always the smallest unpaired one; its partners are tried in a
random order fixed by the seed. Each partial starter keeps the partial unions ``F_0 ∪ F_g`` as
path systems, and a pair is refused as soon as it closes a cycle shorter than ``m + 1``
(numba kernel in ``_search_kernel.py``, imported only when a search actually runs).

Restarts follow the Luby sequence (M. Luby, A. Sinclair, D. Zuckerman, "Optimal speedup of Las
Vegas algorithms", Inform. Process. Lett. 47 (1993)) times a base node count. Given a seed the
sequence of runs is fixed, so the starter found (if found within the budget) is the same on
every machine; only whether the budget suffices depends on the machine.
"""

from __future__ import annotations

import time
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from scheduler.errors import InputError
from scheduler.factorization.groups import AbelianGroup, group_from_name
from scheduler.factorization.starters import is_perfect_starter
from scheduler.factorization.unit_classes import subtree_pair_mask
from scheduler.progress import Progress


@dataclass(frozen=True)
class StarterSearchResult:
    """Outcome of :func:`search_perfect_starter`.

    ``starter`` is ``None`` when nothing was found; ``exhausted`` is true when one run explored
    the whole (multiplier-invariant) space without finding a perfect starter, which proves
    there is none of that kind.

    Parameters
    ----------
    group : str
        The name of the group searched.
    multiplier : int
        The unit the starter had to be invariant under (1: none).
    seed : int
        The search's seed.
    starter : tuple of (int, int) or None
        The perfect starter found; None when none was found.
    runs : int
        Restarts made.
    nodes : int
        Search nodes visited in all runs (the machine-independent measure of work).
    seconds : float
        Wall time spent.
    exhausted : bool
        True when one run explored the whole space without a perfect starter: a proof that the
        space has none.

    Examples
    --------
    >>> result = StarterSearchResult("Z_7", 1, 0, ((1, 6), (2, 5), (3, 4)), 1, 9, 0.0, False)
    >>> result.found
    True
    """

    group: str
    multiplier: int
    seed: int
    starter: tuple[tuple[int, int], ...] | None
    runs: int
    nodes: int
    seconds: float
    exhausted: bool

    @property
    def found(self) -> bool:
        """True when a perfect starter was found."""
        return self.starter is not None


def luby(i: int) -> int:
    """The ``i``-th term (from 1) of the Luby restart sequence 1, 1, 2, 1, 1, 2, 4, ...

    Parameters
    ----------
    i : int
        The position, 1 or more.

    Returns
    -------
    int
        The term: the node limit of restart ``i`` is this times the base limit.

    References
    ----------
    M. Luby, A. Sinclair and D. Zuckerman, "Optimal speedup of Las Vegas algorithms",
    Information Processing Letters 47 (1993) 173-180.

    Examples
    --------
    >>> [luby(i) for i in range(1, 16)]
    [1, 1, 2, 1, 1, 2, 4, 1, 1, 2, 1, 1, 2, 4, 8]
    """
    k = 1
    while (1 << k) - 1 < i:
        k += 1
    while True:
        if i == (1 << k) - 1:
            return 1 << (k - 1)
        i -= (1 << (k - 1)) - 1
        k = 1
        while (1 << k) - 1 < i:
            k += 1


def run_node_limit(run: int, base_nodes: int, max_run_nodes: int, exhaustive: bool = False
                   ) -> int:
    """The node limit of run ``run`` (from 1) of a restarted search.

    Randomised restarts follow the Luby sequence times ``base_nodes``, each run capped at
    ``max_run_nodes`` (:func:`luby`). A capped run can only prove a space empty when the whole
    search tree fits under the cap, so a search meant to settle a space (``exhaustive``) doubles
    the limit from ``base_nodes`` without a cap instead: the total work is then at most about
    twice that of one complete search.

    Parameters
    ----------
    run : int
        The run's number, 1 or more.
    base_nodes : int
        The limit of the first run.
    max_run_nodes : int
        The cap of the randomised runs (not used when ``exhaustive``).
    exhaustive : bool, optional
        Doubling limits without a cap.

    Returns
    -------
    int
        The node limit.

    Examples
    --------
    >>> [run_node_limit(r, 10, 40) for r in range(1, 8)]
    [10, 10, 20, 10, 10, 20, 40]
    >>> [run_node_limit(r, 10, 40, exhaustive=True) for r in range(1, 6)]
    [10, 20, 40, 80, 160]
    """
    if exhaustive:
        return base_nodes * 2 ** (run - 1)
    return min(max_run_nodes, base_nodes * luby(run))


def multiplier_orbits(group: AbelianGroup, multiplier: int = 1) -> list[tuple[int, int]]:
    """``(representative, size)`` for each orbit of ``<x -> -x, x -> u x>`` on ``G \\ {0}``
    (the representative is the smallest code in the orbit).

    Parameters
    ----------
    group : AbelianGroup
        The group.
    multiplier : int, optional
        A unit ``u`` (1: the orbits are the pairs ``{g, -g}``).

    Returns
    -------
    list of tuple of (int, int)
        One ``(representative, size)`` per orbit, by increasing representative.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> multiplier_orbits(cyclic(7)), multiplier_orbits(cyclic(7), 2)
    ([(1, 2), (2, 2), (3, 2)], [(1, 6)])
    """
    m = group.order
    mulu = group.multiplier(multiplier) if multiplier != 1 % m else np.arange(m)
    return element_orbits(group.neg, mulu)


def element_orbits(inverse: np.ndarray, perm: np.ndarray) -> list[tuple[int, int]]:
    """``(smallest code, size)`` of each orbit of the group generated by the two permutations
    ``inverse`` (x -> -x) and ``perm`` on the non-identity codes ``1..m-1``.

    Parameters
    ----------
    inverse : numpy.ndarray
        The inverse table ``x -> -x`` of a group of order ``m``.
    perm : numpy.ndarray
        A permutation of the codes that fixes 0 (a multiplier).

    Returns
    -------
    list of tuple of (int, int)
        One ``(smallest code, size)`` per orbit, by increasing code.
    """
    m = len(inverse)
    seen = np.zeros(m, dtype=bool)
    out = []
    for g in range(1, m):
        if seen[g]:
            continue
        stack = [g]
        seen[g] = True
        count = 0
        while stack:
            x = stack.pop()
            count += 1
            for y in (int(inverse[x]), int(perm[x])):
                if not seen[y]:
                    seen[y] = True
                    stack.append(y)
        out.append((g, count))
    return out


def orbit_representatives(group: AbelianGroup, multiplier: int = 1) -> list[int]:
    """One element (the smallest code) of each orbit of ``<x -> -x, x -> u x>`` on ``G \\ {0}``.

    Parameters
    ----------
    group : AbelianGroup
        The group.
    multiplier : int, optional
        A unit ``u`` (1: the orbits are the pairs ``{g, -g}``).

    Returns
    -------
    list of int
        The representatives, increasing.
    """
    return [g for g, _ in multiplier_orbits(group, multiplier)]


def kernel_arrays(
    group: AbelianGroup, multiplier: int = 1
) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """``(add, neg, mulu, reps, weights)`` as int32 arrays for the numba kernel; ``weights[t]``
    is the number of classes ``{g, -g}`` in the orbit of ``reps[t]``.

    Parameters
    ----------
    group
        The abelian group searched.
    multiplier
        The unit ``u`` whose orbits (with ``x -> -x``) are searched together.

    Returns
    -------
    tuple of numpy.ndarray
        ``add`` and ``neg`` (the group tables), ``mulu`` (multiplication by ``u``), ``reps`` and
        ``weights`` (one entry per orbit).
    """
    m = group.order
    mulu = group.multiplier(multiplier) if multiplier != 1 % m else np.arange(m)
    orbits = multiplier_orbits(group, multiplier)
    return (
        np.ascontiguousarray(group.add, dtype=np.int32),
        np.ascontiguousarray(group.neg, dtype=np.int32),
        np.ascontiguousarray(mulu, dtype=np.int32),
        np.array([g for g, _ in orbits], dtype=np.int32),
        np.array([size // 2 for _, size in orbits], dtype=np.int32),
    )


def run_seed(seed: int, run: int, salt: int = 12_345) -> int:
    """The numba generator's seed for restart ``run`` of a search seeded ``seed``; each search
    space has its own ``salt`` so that their runs do not share random streams.

    Parameters
    ----------
    seed : int
        The search's seed.
    run : int
        The restart's number.
    salt : int, optional
        The search space's own constant.

    Returns
    -------
    int
        A seed in ``0 .. 2^31 - 2``.
    """
    return (seed * 1_000_003 + run * 7_919 + salt) % (2**31 - 1)


def forced_partners(subtree: Sequence[int], order: int) -> np.ndarray:
    """The partners forced on the first elements paired, as the kernels' int32 array.

    Parameters
    ----------
    subtree : sequence of int
        The partners, in the order of the choices (an empty sequence: the whole space).
    order : int
        The order of the group searched.

    Returns
    -------
    numpy.ndarray
        The partners as int32.

    Raises
    ------
    InputError
        For a partner that is not a non-identity element of the group.

    Examples
    --------
    >>> forced_partners((3, 5), 7).tolist()
    [3, 5]
    """
    partners = list(subtree)
    for y in partners:
        if isinstance(y, bool) or not isinstance(y, (int, np.integer)) or not 0 < y < order:
            raise InputError(f"a forced partner must be an element code 1..{order - 1}, "
                             f"got {y!r}", location="subtree")
    return np.array(partners, dtype=np.int32)


def pair_mask(group: AbelianGroup, subtree: Sequence[int], up_to_units: bool) -> np.ndarray:
    """The kernels' mask of the pairs a search may use: every pair, or up to units those of
    :func:`~scheduler.factorization.unit_classes.subtree_pair_mask`.

    Parameters
    ----------
    group : AbelianGroup
        The group searched.
    subtree : sequence of int
        The forced partners.
    up_to_units : bool
        Whether the search is up to multiplication by units.

    Returns
    -------
    numpy.ndarray
        Boolean ``(m, m)`` mask.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> bool(pair_mask(cyclic(7), (), False).all())
    True
    """
    if up_to_units:
        return subtree_pair_mask(group, subtree)
    return np.ones((group.order, group.order), dtype=np.bool_)


def root_subtrees(order: int) -> list[tuple[int]]:
    """The subtrees below the first choice of a starter search in a group of odd ``order``:
    element 1 (paired first) with each partner ``y = 2 .. order - 1``. Searched one by one
    (``subtree=(y,)``), they cover the whole space, so a space is settled by many independent
    tasks, and the node counts of their complete searches add up to that of one complete
    search.

    Parameters
    ----------
    order : int
        The order of the group.

    Returns
    -------
    list of tuple of int
        One one-element subtree per partner.

    Examples
    --------
    >>> root_subtrees(7)
    [(2,), (3,), (4,), (5,), (6,)]
    """
    return [(y,) for y in range(2, order)]


def settle_subtree_task(group: str, multiplier: int, subtree: Sequence[int],
                        up_to_units: bool = False) -> dict:
    """One task of a settling search split by :func:`root_subtrees`: the complete search of the
    subtree of multiplier-invariant starters of the abelian group named ``group``. A plain
    top-level function with plain arguments and a JSON-ready result, so that a process pool or
    a distributed engine can map it.

    Parameters
    ----------
    group : str
        The group's name (:func:`~scheduler.factorization.groups.group_from_name`).
    multiplier : int
        The unit the starters are invariant under.
    subtree : sequence of int
        The forced partners.
    up_to_units : bool, optional
        Search the subtree up to multiplication by units
        (:mod:`~scheduler.factorization.unit_classes`; the tasks are then those of
        :func:`~scheduler.factorization.unit_classes.unit_class_subtrees`).

    Returns
    -------
    dict
        ``group``, ``multiplier``, ``subtree``, ``up_to_units``, ``exhausted``, ``nodes``,
        ``seconds`` and ``starter`` (the perfect starter found, or None).
    """
    result = search_perfect_starter(group_from_name(group), multiplier=multiplier,
                                    subtree=tuple(subtree), up_to_units=up_to_units,
                                    exhaustive=True, base_nodes=2**62, budget=1.0)
    return {"group": group, "multiplier": multiplier, "subtree": list(subtree),
            "up_to_units": up_to_units, "exhausted": result.exhausted, "nodes": result.nodes,
            "seconds": round(result.seconds, 3),
            "starter": [list(p) for p in result.starter] if result.starter else None}


def search_perfect_starter(
    group: AbelianGroup,
    *,
    seed: int = 0,
    budget: float = 10.0,
    multiplier: int = 1,
    base_nodes: int = 20_000,
    max_run_nodes: int = 5_000_000,
    max_nodes: int | None = None,
    exhaustive: bool = False,
    subtree: Sequence[int] = (),
    up_to_units: bool = False,
    progress: Progress | None = None,
) -> StarterSearchResult:
    """Search ``group`` for a perfect starter (invariant under ``x -> multiplier * x``).

    ``budget`` is in seconds of wall time (checked between runs; one run is at most
    ``max_run_nodes`` nodes). ``progress(message, fraction)`` is called after each run with the
    fraction of the budget used. ``max_nodes`` (if given) also stops the search after that
    many nodes in total: a work limit, unlike the clock, gives the same outcome on every
    machine. Every starter returned has been re-checked with
    :func:`~scheduler.factorization.starters.is_perfect_starter`.

    Parameters
    ----------
    group
        The abelian group of odd order searched.
    seed
        Seed of the restarts.
    budget
        Seconds of wall time.
    multiplier
        The unit ``u`` the starter must be invariant under.
    base_nodes, max_run_nodes
        Nodes of the first run and the most of any run (Luby restarts).
    max_nodes
        Optional total work limit.
    exhaustive
        Run limits doubling without a cap (:func:`run_node_limit`): the way to settle a space,
        a multiplier space for instance.
    subtree
        Partners forced on the first elements paired (the search pairs the smallest free
        element next): only the subtree below these choices is searched, and ``exhausted``
        then says that subtree holds no perfect starter (:func:`settle_subtree_task`).
    up_to_units
        Search only the starters of the subtree that represent their class under
        multiplication by units (cyclic groups; ``subtree`` one of
        :func:`~scheduler.factorization.unit_classes.unit_class_subtrees`): ``exhausted`` then
        says that no class met in this subtree has a perfect starter.
    progress
        Called as ``progress(message, fraction)`` after each run.

    Returns
    -------
    StarterSearchResult
        The starter found (or ``None``) and the record of the search.

    Raises
    ------
    InputError
        For a seed that is not an integer or a budget that is not positive.

    References
    ----------
    ``docs/factorization-search.md``; M. Luby, A. Sinclair and D. Zuckerman, "Optimal speedup of
    Las Vegas algorithms", 1993 (the restart sequence, from memory).

    Examples
    --------
    The first call compiles the search kernel (numba), which takes seconds, so the example is
    not run as a test:

    >>> from scheduler.factorization.groups import cyclic
    >>> result = search_perfect_starter(cyclic(13), seed=0, max_nodes=100_000)  # doctest: +SKIP
    >>> result.found, result.starter  # doctest: +SKIP
    (True, ((1, 12), (2, 11), (3, 10), (4, 9), (5, 8), (6, 7)))
    """
    if isinstance(seed, bool) or not isinstance(seed, int):
        raise InputError(f"the seed must be an integer, got {seed!r}", location="seed")
    if not budget > 0:
        raise InputError(f"the time budget must be positive, got {budget!r}", location="budget")
    from scheduler.factorization._search_kernel import search_kernel  # numba: lazily

    m = group.order
    start = time.perf_counter()
    add, neg, mulu, reps, weights = kernel_arrays(group, multiplier)
    forced = forced_partners(subtree, m)
    allowed = pair_mask(group, subtree, up_to_units)
    out = np.zeros(((m - 1) // 2, 2), dtype=np.int32)
    runs = nodes = 0
    while True:
        runs += 1
        limit = run_node_limit(runs, base_nodes, max_run_nodes, exhaustive)
        if max_nodes is not None:
            limit = max(1, min(limit, max_nodes - nodes))
        status, used, _ = search_kernel(
            m, add, neg, mulu, reps, weights, 0, run_seed(seed, runs), limit, out, forced,
            allowed,
        )
        nodes += int(used)
        elapsed = time.perf_counter() - start
        if status == 1:
            starter = tuple(sorted((int(min(a, b)), int(max(a, b))) for a, b in out))
            if not is_perfect_starter(group, starter):  # pragma: no cover - kernel bug guard
                raise AssertionError(f"search kernel returned a non-perfect starter {starter}")
            if progress:
                progress(f"perfect starter found in {group.name} after {runs} runs", 1.0)
            return StarterSearchResult(
                group.name, multiplier, seed, starter, runs, nodes, elapsed, False
            )
        if status == -1:
            if progress:
                progress(f"no perfect starter of this kind in {group.name}", 1.0)
            return StarterSearchResult(group.name, multiplier, seed, None, runs, nodes, elapsed,
                                       True)
        if progress:
            message = f"searching {group.name}: {runs} runs, {nodes} nodes"
            progress(message, min(1.0, elapsed / budget))
        if elapsed >= budget or (max_nodes is not None and nodes >= max_nodes):
            return StarterSearchResult(group.name, multiplier, seed, None, runs, nodes, elapsed,
                                       False)
