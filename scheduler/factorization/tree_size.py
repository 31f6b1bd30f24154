"""How big is a starter search? Knuth's random-probe estimate of its backtracking tree.

Why. A restricted search space (starters invariant under a multiplier or an automorphism) is
settled only by one complete depth-first search, and a plain space is only ever sampled. Before
spending an hour of machine time on a space, or when recording what a search that found nothing
covered, one wants the size of the tree: the number of nodes a complete search visits, and how
many starters of the kind sought the space holds.

How. D. E. Knuth's estimator walks one random path from the root of the search tree: at each
partial starter it tries every partner the search would try (``c`` of them, each one a node of
the search), keeps the ``f`` that the search accepts, and goes on with one of them chosen
uniformly. With ``w`` the product of the ``f`` met above a partial starter, the sum of ``w c``
over the path is an unbiased estimate of the nodes of a complete search, and ``w`` at the end
of a path that reaches a whole starter (0 when the path dies) an unbiased estimate of the number
of starters the search accepts (perfect and invariant ones, or every invariant starter with
``perfect_only=False``). The mean over many probes, with its standard error, is reported; the
distribution is heavy-tailed, so the error is itself rough and small counts of rare leaves are
estimated poorly. The probes walk exactly the trees of the searches of starters
(:func:`scheduler.factorization.search.search_perfect_starter`), of starters in non-abelian
groups, of even starters over ``Z_2 × H`` and of one-factorizations with a prescribed ``Z_k``
(the same steps as the search kernels, the same order of elements: the smallest free element is
paired next), so the node estimates are in the unit the searches report; the tests compare them
with complete searches and the starter counts with OEIS A006204. A ``subtree`` (forced first
partners) gives the estimate of one of the subtrees a settling search is split into.

References
----------
D. E. Knuth, "Estimating the efficiency of backtrack programs", Math. Comp. 29 (1975) 121-136
(from memory). Results for the spaces of K_52 and K_56: ``docs/factorization-search.md``.

Examples
--------
The first call compiles the probe kernel (numba), so the example is not run as a test:

>>> from scheduler.factorization.groups import cyclic
>>> estimate = estimate_starter_search(cyclic(13), probes=20_000, perfect_only=False)
... # doctest: +SKIP
>>> abs(estimate.starters - 133) < 4 * estimate.starters_error  # OEIS A006204 # doctest: +SKIP
True
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from scheduler.errors import InputError
from scheduler.factorization.groups import AbelianGroup
from scheduler.factorization.linear_symmetries import Matrix
from scheduler.factorization.nonabelian_starters import SemidirectGroup, group_kernel_arrays
from scheduler.factorization.orbit_factorizations import check_shape, kernel_tables, orbit_table
from scheduler.factorization.search import forced_partners, kernel_arrays, pair_mask, run_seed
from scheduler.factorization.twin_point_starters import space_name, twin_kernel_arrays

_PROBE_SALT = 97_531


@dataclass(frozen=True)
class TreeSizeEstimate:
    """Knuth's estimate of a starter search (:func:`estimate_starter_search`).

    Parameters
    ----------
    space : str
        The space probed, e.g. ``"Z_51, multiplier 16"``.
    probes : int
        Random paths walked.
    nodes : float
        Estimated nodes of one complete search (what an exhaustive run would report).
    nodes_error : float
        Standard error of ``nodes`` (rough: the estimator is heavy-tailed).
    starters : float
        Estimated number of starters the search accepts (perfect ones unless counted all).
    starters_error : float
        Standard error of ``starters``.
    whole : int
        Probes that reached a whole starter.

    Examples
    --------
    >>> TreeSizeEstimate("Z_7", 10, 9.0, 0.0, 2.0, 0.5, 4).relative_error
    0.0
    """

    space: str
    probes: int
    nodes: float
    nodes_error: float
    starters: float
    starters_error: float
    whole: int

    @property
    def relative_error(self) -> float:
        """``nodes_error / nodes`` (0 for an empty tree)."""
        return self.nodes_error / self.nodes if self.nodes else 0.0


def _check(probes: int, seed: int) -> None:
    if isinstance(probes, bool) or not isinstance(probes, int) or probes < 1:
        raise InputError(f"the number of probes must be a positive integer, got {probes!r}",
                         location="probes")
    if isinstance(seed, bool) or not isinstance(seed, int):
        raise InputError(f"the seed must be an integer, got {seed!r}", location="seed")


def _summary(space: str, nodes: np.ndarray, leaves: np.ndarray) -> TreeSizeEstimate:
    """Means and standard errors of the probes' node and leaf estimates."""
    probes = len(nodes)
    root = math.sqrt(probes)

    def mean_and_error(values: np.ndarray) -> tuple[float, float]:
        # scaled by the largest value, so that trees of 1e200 nodes and more do not overflow
        scale = float(values.max()) if probes else 0.0
        if not scale > 0 or not math.isfinite(scale):
            return float(values.mean()), math.inf if scale == math.inf else 0.0
        scaled = values / scale
        error = float(scaled.std(ddof=1)) / root if probes > 1 else 0.0
        return float(scaled.mean()) * scale, error * scale

    node_mean, node_error = mean_and_error(nodes)
    leaf_mean, leaf_error = mean_and_error(leaves)
    return TreeSizeEstimate(space, probes, node_mean, node_error, leaf_mean, leaf_error,
                            int(np.count_nonzero(leaves)))


def _probe(space: str, m: int, add: np.ndarray, neg: np.ndarray, mulu: np.ndarray,
           reps: np.ndarray, weights: np.ndarray, probes: int, seed: int,
           perfect_only: bool, subtree: Sequence[int],
           allowed: np.ndarray | None = None) -> TreeSizeEstimate:
    from scheduler.factorization._search_kernel import probe_kernel  # numba: lazily

    forced = forced_partners(subtree, m)
    if len(forced):
        space += ", subtree " + " ".join(str(int(y)) for y in forced)
    nodes = np.zeros(probes, dtype=np.float64)
    leaves = np.zeros(probes, dtype=np.float64)
    max_bad = 0 if perfect_only else int(weights.sum())
    if allowed is None:
        allowed = np.ones((m, m), dtype=np.bool_)
    probe_kernel(m, add, neg, mulu, reps, weights, max_bad, run_seed(seed, 0, _PROBE_SALT),
                 probes, nodes, leaves, forced, allowed)
    return _summary(space, nodes, leaves)


def estimate_starter_search(group: AbelianGroup, *, multiplier: int = 1, probes: int = 10_000,
                            seed: int = 0, perfect_only: bool = True,
                            subtree: Sequence[int] = (),
                            up_to_units: bool = False) -> TreeSizeEstimate:
    """Estimate the tree of :func:`~scheduler.factorization.search.search_perfect_starter` in
    ``group`` (starters invariant under ``x -> multiplier * x``) by Knuth's random probes.

    Parameters
    ----------
    group : AbelianGroup
        The abelian group of odd order searched.
    multiplier : int, optional
        The unit the starters must be invariant under (1: plain starters).
    probes : int, optional
        Random root-to-leaf paths; the error falls as one over their square root.
    seed : int, optional
        Seed of the paths (the same seed gives the same estimate).
    perfect_only : bool, optional
        Refuse a partial starter as soon as a union closes a short cycle, as the search does
        (True); False accepts every invariant starter, so that ``starters`` counts them all.
    subtree : sequence of int, optional
        Partners forced on the first elements paired: the estimate of that subtree
        (:func:`~scheduler.factorization.search.root_subtrees`).
    up_to_units : bool, optional
        The subtree searched up to multiplication by units, as the search does with the same
        option (:mod:`~scheduler.factorization.unit_classes`).

    Returns
    -------
    TreeSizeEstimate
        Estimated nodes of a complete search and starters accepted, with standard errors.

    Raises
    ------
    InputError
        For a number of probes that is not a positive integer, a seed that is not an integer or
        a forced partner that is not an element.

    References
    ----------
    D. E. Knuth, Math. Comp. 29 (1975) 121-136 (from memory).

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> round(estimate_starter_search(cyclic(7), probes=20_000, perfect_only=False).starters)
    ... # doctest: +SKIP
    3
    """
    _check(probes, seed)
    add, neg, mulu, reps, weights = kernel_arrays(group, multiplier)
    space = group.name if multiplier == 1 else f"{group.name}, multiplier {multiplier}"
    if up_to_units:
        space += ", up to units"
    return _probe(space, group.order, add, neg, mulu, reps, weights, probes, seed, perfect_only,
                  subtree, pair_mask(group, subtree, up_to_units))


def estimate_group_starter_search(group: SemidirectGroup, *,
                                  automorphism: tuple[int, int] = (1, 0), probes: int = 10_000,
                                  seed: int = 0, perfect_only: bool = True,
                                  subtree: Sequence[int] = ()) -> TreeSizeEstimate:
    """Estimate the tree of
    :func:`~scheduler.factorization.nonabelian_starters.search_perfect_group_starter` (starters
    of the non-abelian ``group`` invariant under ``group.automorphism(*automorphism)``).

    Parameters
    ----------
    group : SemidirectGroup
        The group searched.
    automorphism : tuple of (int, int), optional
        ``(s, c)`` of :meth:`SemidirectGroup.automorphism`; ``(1, 0)`` is the identity.
    probes : int, optional
        Random root-to-leaf paths.
    seed : int, optional
        Seed of the paths.
    perfect_only : bool, optional
        As in :func:`estimate_starter_search`.
    subtree : sequence of int, optional
        As in :func:`estimate_starter_search`.

    Returns
    -------
    TreeSizeEstimate
        Estimated nodes of a complete search and starters accepted, with standard errors.

    Raises
    ------
    InputError
        For a bad number of probes, seed or automorphism.

    References
    ----------
    D. E. Knuth, Math. Comp. 29 (1975) 121-136 (from memory).
    """
    _check(probes, seed)
    add, neg, mulu, reps, weights = group_kernel_arrays(group, automorphism)
    space = group.name if tuple(automorphism) == (1, 0) else (
        f"{group.name}, automorphism {tuple(automorphism)}")
    return _probe(space, group.order, add, neg, mulu, reps, weights, probes, seed, perfect_only,
                  subtree)


def estimate_twin_search(base: str, missing: int, *, multiplier: int = 1,
                         matrix: Matrix | None = None, flip: bool = False, merged: bool = False,
                         probes: int = 10_000, seed: int = 0) -> TreeSizeEstimate:
    """Estimate the tree of
    :func:`~scheduler.factorization.twin_point_starters.search_perfect_twin_starter` (perfect
    even starters over ``Z_2 × H`` missing ``missing``, the points at infinity kept).

    Parameters
    ----------
    base : str
        The name of ``H``.
    missing : int
        The missing element's code.
    multiplier, matrix, flip, merged
        The space, as in
        :func:`~scheduler.factorization.twin_point_starters.search_perfect_twin_starter`.
    probes : int, optional
        Random root-to-leaf paths.
    seed : int, optional
        Seed of the paths.

    Returns
    -------
    TreeSizeEstimate
        Estimated nodes of a complete search and perfect even starters of the space.

    Raises
    ------
    InputError
        For a bad number of probes or seed, or a space that is not well posed.

    References
    ----------
    D. E. Knuth, Math. Comp. 29 (1975) 121-136 (from memory).
    """
    _check(probes, seed)
    G, symmetry, reps = twin_kernel_arrays(base, missing, multiplier=multiplier, matrix=matrix,
                                           flip=flip)
    from scheduler.factorization._twin_kernel import twin_probe_kernel  # numba: lazily

    nodes = np.zeros(probes, dtype=np.float64)
    leaves = np.zeros(probes, dtype=np.float64)
    space = space_name(base, swapped=False, missing=int(missing), multiplier=multiplier,
                       merged=merged, matrix=matrix, flip=flip)
    if not twin_probe_kernel(G.order, G.add, G.neg, symmetry, G.par, 1, int(missing), False,
                             bool(merged), reps, run_seed(seed, 0, _PROBE_SALT), probes, nodes,
                             leaves):
        return TreeSizeEstimate(space, probes, 0.0, 0.0, 0.0, 0.0, 0)
    return _summary(space, nodes, leaves)


def estimate_orbit_search(r: int, k: int, *, probes: int = 10_000,
                          seed: int = 0) -> TreeSizeEstimate:
    """Estimate the tree of
    :func:`~scheduler.factorization.orbit_factorizations.search_perfect_orbit_factorization`
    (perfect one-factorizations of ``K_{rk+1}`` invariant under an automorphism of order ``k``
    with ``r`` cycles and a fixed point).

    Parameters
    ----------
    r : int
        The number of cycles of the automorphism.
    k : int
        Their odd length.
    probes : int, optional
        Random root-to-leaf paths.
    seed : int, optional
        Seed of the paths.

    Returns
    -------
    TreeSizeEstimate
        Estimated nodes of a complete search and perfect base systems (``starters``) of the
        space.

    Raises
    ------
    InputError
        For a bad number of probes, seed, ``r`` or ``k``.

    References
    ----------
    D. E. Knuth, Math. Comp. 29 (1975) 121-136 (from memory).
    """
    _check(probes, seed)
    from scheduler.factorization._orbit_kernel import orbit_probe_kernel  # numba: lazily

    r, k = check_shape(r, k)
    orb, n_orb = orbit_table(r, k)
    ent_sys, ent_shift, n_ent, T = kernel_tables(r, k)
    nodes = np.zeros(probes, dtype=np.float64)
    leaves = np.zeros(probes, dtype=np.float64)
    orbit_probe_kernel(r, k, orb, n_orb, ent_sys, ent_shift, n_ent, T,
                       run_seed(seed, 0, _PROBE_SALT), probes, nodes, leaves)
    return _summary(f"Z_{k}-invariant, {r} cycles and a fixed point", nodes, leaves)
