"""Symmetries that fix two rounds: which symmetric search spaces are empty before any search.

**Lemma.** Let ``F`` be a perfect one-factorization of ``K_n`` and ``φ`` a permutation of the
vertices that maps rounds onto rounds and keeps two different rounds ``F_a`` and ``F_b``. If
``φ`` fixes a vertex, ``φ`` is the identity.

*Proof.* Let ``X`` be the set of vertices ``φ`` fixes. If ``x`` is in ``X`` and ``{x, y}`` is an
edge of ``F_a``, then ``{x, φ(y)}`` is an edge of ``φ(F_a) = F_a``, and ``x`` has one partner
in a matching, so ``φ(y) = y``: ``X`` is closed under the partners of ``F_a``, and likewise of
``F_b``. ``F_a ∪ F_b`` is one cycle through all ``n`` vertices whose edges alternate between the
two rounds, so a non-empty ``X`` contains the whole cycle, every vertex. ∎

**Consequence for starters.** A starter ``S`` of a group ``G`` of odd order induces the rounds
``F_g`` (``F_0`` = the pairs of ``S`` and ``{∞, 0}``, ``F_g`` its translate by ``g``). An
automorphism ``α`` of ``G`` with ``α(S) = S``, extended by ``α(∞) = ∞``, maps ``F_g`` onto
``F_α(g)`` and fixes ``∞``. If ``α`` fixes an element ``g ≠ 0``, it keeps the two rounds ``F_0``
and ``F_g``, and the lemma says: the factorization is not perfect unless ``α`` is the identity.
So **a perfect starter can only be invariant under automorphisms that fix no element but 0**,
and, being invariant under their powers too, only under those whose powers other than the
identity fix none either (for a multiplier ``x -> u x`` of ``Z_m``: ``u^j - 1`` must be a unit
for every power ``u^j != 1``). The same holds for even
starters over ``Z_2 × H`` with a symmetry that fixes both points at infinity and the missing
element ``m ≠ 0`` (the rounds ``F_0`` and ``F_m`` are kept).

This settles, with no search, every symmetric space in which the symmetry fixes a non-zero
element: the order-2 multiplier spaces of ``Z_51`` (u = 16, 35) and ``Z_55`` (u = 21, 34),
every automorphism space of ``Z_11 ⋊ Z_5`` and every even-starter space whose symmetry keeps
the missing element (docs/factorization-search.md, "Symmetries that fix two rounds", where the
complete searches of these spaces are recorded as checks of the kernels against the lemma).

Examples
--------
>>> from scheduler.factorization.groups import cyclic
>>> fixed_elements(cyclic(55).multiplier(21))  # 21 x = x for the multiples of 11
[11, 22, 33, 44]
>>> fixed_point_free_multipliers(cyclic(55)), fixed_point_free_multipliers(cyclic(51))
([54], [50])

References
----------
The lemma and its proof are this project's (docs/factorization-search.md); the fact that a
multiplier ``u`` of a starter-induced perfect one-factorization needs ``u - 1`` to be a unit
may well be in the literature on starters (J. H. Dinitz and D. R. Stinson, "Room squares and
related designs", 1992), which we could not check.
"""

from __future__ import annotations

import numpy as np

from scheduler.factorization.groups import AbelianGroup


def fixed_elements(automorphism: np.ndarray) -> list[int]:
    """The elements other than the identity (code 0) that a group automorphism fixes.

    Parameters
    ----------
    automorphism : numpy.ndarray
        The automorphism as a permutation of the element codes (``perm[x]`` the image of
        ``x``), as ``AbelianGroup.multiplier`` or ``SemidirectGroup.automorphism`` give it.

    Returns
    -------
    list of int
        The codes ``x != 0`` with ``perm[x] == x``, increasing; by the module's lemma a
        non-identity automorphism with any such element keeps no perfect starter.

    Examples
    --------
    >>> import numpy as np
    >>> fixed_elements(np.array([0, 2, 1]))  # x -> 2x in Z_3
    []
    """
    perm = np.asarray(automorphism)
    return [int(x) for x in np.flatnonzero(perm == np.arange(len(perm))) if x != 0]


def keeps_no_perfect_starter(automorphism: np.ndarray) -> bool:
    """True when the lemma rules out every perfect starter invariant under ``automorphism``:
    a power of it other than the identity fixes an element other than 0 (a starter invariant
    under an automorphism is invariant under its powers).

    Parameters
    ----------
    automorphism : numpy.ndarray
        The automorphism as a permutation of the element codes.

    Returns
    -------
    bool
        Whether the space of starters invariant under it is empty of perfect ones a priori.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> keeps_no_perfect_starter(cyclic(51).multiplier(16)), keeps_no_perfect_starter(
    ...     cyclic(51).multiplier(50))
    (True, False)
    >>> keeps_no_perfect_starter(cyclic(49).multiplier(3))  # 3^6 - 1 is a multiple of 7
    True
    """
    perm = np.asarray(automorphism)
    identity = np.arange(len(perm))
    power = perm
    while not bool((power == identity).all()):
        if fixed_elements(power):
            return True
        power = perm[power]
    return False


def fixed_point_free_multipliers(group: AbelianGroup) -> list[int]:
    """The units ``u != 1`` of ``group``'s ring such that no power of the multiplier
    ``x -> u x`` other than the identity fixes an element but 0: the only multipliers a perfect
    starter of ``group`` can be invariant under.

    Parameters
    ----------
    group : AbelianGroup
        An abelian group of odd order.

    Returns
    -------
    list of int
        The units' codes, increasing.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> fixed_point_free_multipliers(cyclic(7))
    [2, 3, 4, 5, 6]
    >>> fixed_point_free_multipliers(cyclic(15))  # 14 = -1; 2, 7, 8, 13 square to 4 = 1 + 3
    [14]
    """
    identity = np.arange(group.order)
    out = []
    for u in group.units():
        perm = group.multiplier(u)
        if not bool((perm == identity).all()) and not keeps_no_perfect_starter(perm):
            out.append(u)
    return out
