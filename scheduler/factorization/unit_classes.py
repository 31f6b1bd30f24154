"""Starters of ``Z_m`` up to multiplication by units: which subtrees settle a space.

Multiplying every element of a starter ``S`` of ``Z_m`` by a unit ``v`` gives a starter ``vS``
(the pairs still cover every non-zero element once, and the differences ``v(b - a)`` every
class ``{d, -d}`` once), and ``x -> v x`` (with infinity fixed) maps the one-factor ``F_g`` of
``S`` onto the one-factor ``F_{vg}`` of ``vS``: the two one-factorizations are isomorphic, so
``vS`` is perfect exactly when ``S`` is. Units commute, so ``vS`` is invariant under a
multiplier ``u`` whenever ``S`` is. This is the classical multiplier equivalence of starters
(J. H. Dinitz and D. R. Stinson, "Room squares and related designs", in *Contemporary Design
Theory*, Wiley 1992, from memory).

A search that settles a space therefore needs one starter of each class ``{vS}``. Give every
pair ``{a, b}`` of two units its *ratio class* ``min(r, 1/r)`` with ``r = b / a`` (both read as
integers ``1 .. m - 1``); multiplying by a unit keeps it. When more than half of the non-zero
elements are units (``2 phi(m) > m - 1``), every starter has a pair of two units (fewer
non-units than units can be matched with units), so let ``c`` be the least ratio class among
the starter's unit pairs and ``{a, b}`` a pair with ``b = c a``: then ``a^{-1} S`` pairs 1 with
``c`` and has no unit pair of ratio class below ``c``. Hence the starters searched below the
first choice "1 paired with ``y``" can be restricted to

* partners ``y`` that are units with ``y <= 1/y`` (:func:`unit_class_partners`; the other
  partners, non-units and ``y > 1/y``, hold no class that is not also met elsewhere), and
* starters whose pairs of two units all have ratio class at least ``y``
  (:func:`allowed_pairs`, the mask the search kernels take).

The starters left are fewer than a whole subtree's by a large factor (measured in
``docs/factorization-search.md``), and the perfect ones among them meet every class of perfect
starters: a perfect starter of the space exists exactly when one of these searches finds one.

Examples
--------
>>> unit_class_partners(7)
[2, 3, 6]
>>> ratio_class(5, 7)  # 5 = 1/3 modulo 7
3
>>> mask = allowed_pairs(7, 3)  # classes below 3 (the pairs {a, 2a} and {a, 4a}) are out
>>> bool(mask[1, 2]), bool(mask[1, 3])
(False, True)

References
----------
``docs/factorization-search.md`` ("Settling up to units"); B. D. McKay, "Isomorph-free
exhaustive generation", J. Algorithms 26 (1998), for the general idea of searching one
representative per class (from memory).
"""

from __future__ import annotations

from collections.abc import Sequence
from math import gcd

import numpy as np

from scheduler.errors import InputError
from scheduler.factorization.groups import AbelianGroup, cyclic


def ratio_class(r: int, m: int) -> int:
    """The class ``min(r, 1/r)`` of a unit ratio ``r`` modulo ``m`` (as integers ``1..m-1``).

    Parameters
    ----------
    r : int
        A unit of ``Z_m``.
    m : int
        The modulus.

    Returns
    -------
    int
        The smaller of ``r`` and its inverse.

    Raises
    ------
    InputError
        When ``r`` is not a unit modulo ``m``.

    Examples
    --------
    >>> ratio_class(3, 55), ratio_class(37, 55)
    (3, 3)
    """
    if gcd(r, m) != 1:
        raise InputError(f"{r} is not a unit modulo {m}", location="ratio")
    r %= m
    return min(r, pow(r, -1, m))


def unit_class_partners(m: int) -> list[int]:
    """The partners ``y`` of element 1 whose subtrees, restricted by :func:`allowed_pairs`,
    together hold a starter of every class under multiplication by units: the units
    ``y = 2 .. m - 1`` with ``y <= 1/y``.

    Parameters
    ----------
    m : int
        The odd order of the cyclic group.

    Returns
    -------
    list of int
        The partners, increasing.

    Raises
    ------
    InputError
        When ``m`` is not odd and at least 3, or when the non-zero non-units of ``Z_m`` are at
        least as many as its units (then a starter need not have a pair of two units, and the
        argument of the module does not hold).

    Examples
    --------
    >>> unit_class_partners(55)[:8]
    [2, 3, 4, 6, 7, 9, 12, 13]
    """
    if isinstance(m, bool) or not isinstance(m, int) or m < 3 or m % 2 == 0:
        raise InputError(f"the order must be an odd integer >= 3, got {m!r}", location="order")
    units = cyclic(m).units()
    if 2 * len(units) <= m - 1:
        raise InputError(f"Z_{m} has {len(units)} units and {m - 1 - len(units)} non-zero "
                         "non-units, so a starter need not pair two units; search it by "
                         "plain subtrees", location="order")
    return [y for y in units if y > 1 and y <= pow(y, -1, m)]


def allowed_pairs(m: int, floor: int) -> np.ndarray:
    """The pairs a search below "1 paired with ``floor``" may use: ``allowed[x, y]`` is False
    when ``x`` and ``y`` are both units and the ratio class of ``y / x`` is below ``floor``.

    The mask is invariant under every multiplier (a multiplier keeps ratios), as the search
    kernels require.

    Parameters
    ----------
    m : int
        The odd order of the cyclic group.
    floor : int
        The least ratio class allowed: the partner of element 1 in the subtree searched.

    Returns
    -------
    numpy.ndarray
        Boolean ``(m, m)`` mask.

    Examples
    --------
    >>> mask = allowed_pairs(55, 21)
    >>> bool(mask[1, 21]), bool(mask[1, 2]), bool(mask[5, 10])  # 5, 10 are not units
    (True, False, True)
    """
    allowed = np.ones((m, m), dtype=np.bool_)
    units = cyclic(m).units()
    low = [r for r in units if r != 1 and ratio_class(r, m) < floor]
    for x in units:
        for r in low:
            allowed[x, r * x % m] = False
    return allowed


def unit_class_subtrees(m: int) -> list[tuple[int]]:
    """The subtrees that settle a space of starters of ``Z_m`` up to units: element 1 paired
    with each partner of :func:`unit_class_partners` (searched with ``up_to_units``).

    Parameters
    ----------
    m : int
        The odd order of the cyclic group.

    Returns
    -------
    list of tuple of int
        One one-element subtree per partner.

    Examples
    --------
    >>> unit_class_subtrees(9)
    [(2,), (4,), (8,)]
    """
    return [(y,) for y in unit_class_partners(m)]


def subtree_pair_mask(group: AbelianGroup, subtree: Sequence[int]) -> np.ndarray:
    """The pair mask of a search of ``subtree`` up to units (:func:`allowed_pairs` with the
    partner of element 1 as floor), after checking that the search is one of those of
    :func:`unit_class_subtrees`.

    Parameters
    ----------
    group : AbelianGroup
        The group searched; it must be cyclic (its codes are then the residues).
    subtree : sequence of int
        The forced partners; the first must be one of :func:`unit_class_partners`.

    Returns
    -------
    numpy.ndarray
        Boolean ``(m, m)`` mask.

    Raises
    ------
    InputError
        For a group that is not cyclic or a subtree that is not one of the unit classes.

    Examples
    --------
    >>> from scheduler.factorization.groups import cyclic
    >>> int(subtree_pair_mask(cyclic(7), (3,)).sum())  # 49 less 12 ordered pairs of class 2
    37
    """
    m = group.order
    if group.kind != "cyclic":
        raise InputError(f"a search up to units needs a cyclic group, got {group.name}",
                         location="group")
    partners = unit_class_partners(m)
    if not subtree or subtree[0] not in partners:
        raise InputError(f"a search of {group.name} up to units starts with element 1 paired "
                         f"with one of {partners}, got subtree {list(subtree)}",
                         location="subtree")
    return allowed_pairs(m, int(subtree[0]))
