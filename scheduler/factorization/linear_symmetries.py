"""Automorphisms of the elementary abelian groups ``Z_p^d`` as matrices, and one cyclic group of
automorphisms per conjugacy class, for searches that prescribe a symmetry.

Why. A starter-type search may require its starter to be invariant under an automorphism ``A``
of the group ``H`` (then ``A`` is an automorphism of the one-factorization as well, and the
perfection test needs one union walk per orbit). For cyclic ``H`` every automorphism is a
multiplication by a unit, which :mod:`scheduler.factorization.twin_point_starters` already
offers as a *multiplier*; for ``H = Z_p^d`` the automorphisms form the much larger group
``GL(d, p)`` of invertible matrices, of which the ring units of ``Z_p × ... × Z_p`` or
``GF(p^d)`` are a small part (``(p - 1)^d`` diagonal matrices or ``p^d - 1`` field
multiplications).

Only the cyclic subgroup ``<A>`` matters (a starter invariant under ``A`` is invariant under
every power), and conjugate subgroups give isomorphic spaces: if ``S`` is invariant under ``A``
and misses ``m``, then ``P S`` is invariant under ``P A P^-1`` and misses ``P m``. So one
generator per conjugacy class of cyclic subgroups is searched, and the missing element's part in
``H`` (a non-zero vector fixed by ``A``, since the symmetry must fix the missing element) is taken
up to the normaliser of ``<A>``, which maps the fixed vectors of ``A`` onto themselves.

Codes. ``Z_p^d`` is numbered as :func:`scheduler.factorization.groups.product` and
:func:`~scheduler.factorization.groups.galois_field` number it: the code of the vector
``(x_0, ..., x_{d-1})`` is ``x_0 + x_1 p + ... + x_{d-1} p^(d-1)`` (both add digit by digit
modulo ``p``), and ``A`` maps the column vector ``x`` to ``A x``.

References
----------
The order ``|GL(d, q)| = (q^d - 1)(q^d - q) ... (q^d - q^(d-1))`` and the numbers of conjugacy
classes of ``GL(2, q)`` (``q^2 - 1``) and ``GL(3, q)`` (``q^3 - q``), which the tests compare
with the enumeration, are classical (e.g. I. G. Macdonald, "Numbers of conjugacy classes in some
finite classical groups", Bull. Austral. Math. Soc. 23 (1981) 23-48; from memory). Searching for
combinatorial designs with a prescribed automorphism group, one class of subgroups at a time:
E. Seah and D. R. Stinson, Math. Comp. 50 (1988) 607-618 (from memory). Results of the searches:
``docs/factorization-search.md``.

Examples
--------
>>> from scheduler.factorization.groups import product
>>> group = product(3, 3)
>>> swap = linear_permutation(group, ((0, 1), (1, 0)))  # (x, y) -> (y, x)
>>> [int(swap[c]) for c in (1, 3, 4)]  # (1,0) -> (0,1), (0,1) -> (1,0), (1,1) fixed
[3, 1, 4]
"""

from __future__ import annotations

import itertools
from dataclasses import dataclass

import numpy as np

from scheduler.errors import InputError
from scheduler.factorization.groups import AbelianGroup

Matrix = tuple[tuple[int, ...], ...]

_MAX_ELEMENTS = 20_000  # GL(3, 3) has 11232; GL(2, 5) 480; GL(2, 7) 2016


@dataclass(frozen=True)
class LinearSymmetry:
    """One conjugacy class of non-trivial cyclic subgroups of ``GL(d, p)`` that fix a non-zero
    vector, or (order 2) negate one.

    Parameters
    ----------
    matrix : Matrix
        A generator ``A`` of one subgroup of the class (rows of integers modulo ``p``).
    order : int
        The order of ``A``.
    conjugates : int
        How many subgroups the class holds.
    fixed : int
        The number of non-zero vectors fixed by ``A``.
    missing_parts : tuple of int
        Codes of the fixed non-zero vectors, one per orbit of the normaliser of ``<A>`` (the
        choices of the missing element's part in ``H`` that give different spaces).
    negated_parts : tuple of int, optional
        For an involution: codes of the non-zero vectors ``h`` with ``A h = -h``, one per orbit
        of the normaliser (its centraliser); empty for other orders.
    """

    matrix: Matrix
    order: int
    conjugates: int
    fixed: int
    missing_parts: tuple[int, ...]
    negated_parts: tuple[int, ...] = ()


def elementary_shape(group: AbelianGroup) -> tuple[int, int]:
    """``(p, d)`` when ``group`` is ``Z_p^d`` numbered digit by digit (a product of equal prime
    moduli or a Galois field), else an error.

    Parameters
    ----------
    group : AbelianGroup
        The group.

    Returns
    -------
    tuple of (int, int)
        The prime ``p`` and the dimension ``d``.

    Raises
    ------
    InputError
        For a group that is not elementary abelian with the digit numbering.

    Examples
    --------
    >>> from scheduler.factorization.groups import group_from_name
    >>> elementary_shape(group_from_name("Z_3 x Z_3 x Z_3"))
    (3, 3)
    >>> elementary_shape(group_from_name("GF(25)"))
    (5, 2)
    """
    moduli = group.moduli
    p = moduli[0]
    if len(set(moduli)) != 1 or any(p % q == 0 for q in range(2, int(p ** 0.5) + 1)):
        raise InputError(f"{group.name} is not an elementary abelian group Z_p^d; its "
                         f"automorphisms are not matrices here", location="group")
    return p, len(moduli)


def _digits(p: int, d: int) -> np.ndarray:
    codes = np.arange(p ** d)
    return np.stack([(codes // p ** i) % p for i in range(d)], axis=1)


def linear_permutation(group: AbelianGroup, matrix: Matrix) -> np.ndarray:
    """The automorphism ``x -> A x`` of ``group = Z_p^d`` as a permutation of its codes.

    Parameters
    ----------
    group : AbelianGroup
        An elementary abelian group (:func:`elementary_shape`).
    matrix : Matrix
        A ``d × d`` matrix of integers, read modulo ``p``; it must be invertible.

    Returns
    -------
    numpy.ndarray
        ``perm[c]`` is the code of ``A x`` for the vector ``x`` of code ``c``.

    Raises
    ------
    InputError
        For a matrix of the wrong shape or a singular one.
    """
    p, d = elementary_shape(group)
    try:
        A = np.array(matrix, dtype=np.int64) % p
    except (TypeError, ValueError):
        raise InputError(f"the matrix must be {d} rows of {d} integers, got {matrix!r}",
                         location="matrix") from None
    if A.shape != (d, d):
        raise InputError(f"the matrix must be {d} rows of {d} integers, got {matrix!r}",
                         location="matrix")
    image = (_digits(p, d) @ A.T) % p
    perm = (image * p ** np.arange(d)).sum(axis=1).astype(np.int64)
    if len(set(perm.tolist())) != p ** d:
        raise InputError(f"the matrix {matrix!r} is singular modulo {p}", location="matrix")
    return perm


def general_linear_group(p: int, d: int) -> np.ndarray:
    """Every invertible ``d × d`` matrix over ``Z_p``, as an array of shape ``(N, d, d)``.

    Parameters
    ----------
    p : int
        A prime.
    d : int
        The dimension (``p^(d^2)`` candidates are tried, so small cases only).

    Returns
    -------
    numpy.ndarray
        The matrices in lexicographic order of their entries.

    Examples
    --------
    >>> len(general_linear_group(2, 2)), len(general_linear_group(5, 2))
    (6, 480)
    """
    if p ** (d * d) > 50 * _MAX_ELEMENTS:
        raise InputError(f"GL({d}, {p}) is too large to list here", location="group")
    mats = np.array(list(itertools.product(range(p), repeat=d * d)),
                    dtype=np.int64).reshape(-1, d, d)
    # the images of the basis vectors span Z_p^d exactly when all p^d vectors are distinct
    images = np.einsum("nij,vj->nvi", mats, _digits(p, d)) % p
    codes = (images * p ** np.arange(d)).sum(axis=2)
    invertible = np.array([len(np.unique(row)) == p ** d for row in codes])
    return mats[invertible]


def linear_symmetry_classes(group: AbelianGroup) -> list[LinearSymmetry]:
    """One :class:`LinearSymmetry` per conjugacy class of non-trivial cyclic subgroups of the
    automorphism group ``GL(d, p)`` of ``group = Z_p^d`` that fix a non-zero vector or (order 2)
    negate one, largest order first.

    Parameters
    ----------
    group : AbelianGroup
        An elementary abelian group (:func:`elementary_shape`).

    Returns
    -------
    list of LinearSymmetry
        Sorted by decreasing order, then by the generator's entries.

    Examples
    --------
    >>> from scheduler.factorization.groups import group_from_name
    >>> [(c.order, c.conjugates, c.missing_parts, c.negated_parts) for c in
    ...  linear_symmetry_classes(group_from_name("Z_3 x Z_3"))]
    [(3, 4, (4,), ()), (2, 12, (4,), (5,)), (2, 1, (), (1,))]
    """
    p, d = elementary_shape(group)
    mats = general_linear_group(p, d)
    weights = p ** np.arange(d * d)
    index = {int(k): i for i, k in enumerate((mats.reshape(len(mats), -1) * weights).sum(1))}

    def position(m: np.ndarray) -> int:
        return index[int((m.reshape(-1) % p * weights).sum())]

    identity = position(np.eye(d, dtype=np.int64))
    perms = np.array([linear_permutation(group, tuple(map(tuple, m))) for m in mats])
    inverse = np.empty(len(mats), dtype=np.int64)
    for i, perm in enumerate(perms):
        inv = np.empty_like(perm)
        inv[perm] = np.arange(len(perm))
        # the inverse matrix: its columns are the preimages of the basis vectors
        columns = [_digits(p, d)[inv[p ** j]] for j in range(d)]
        inverse[i] = position(np.stack(columns, axis=1))

    def subgroup(i: int) -> frozenset[int]:
        out, power = [identity], mats[i]
        while (j := position(power)) != identity:
            out.append(j)
            power = (power @ mats[i]) % p
        return frozenset(out)

    subgroups = [subgroup(i) for i in range(len(mats))]
    seen: set[frozenset[int]] = set()
    classes = []
    for i in range(len(mats)):
        if i == identity or subgroups[i] in seen:
            continue
        conjugate = np.einsum("nij,jk,nkl->nil", mats, mats[i], mats[inverse]) % p
        positions = [position(c) for c in conjugate]
        orbit = {subgroups[j] for j in positions}
        seen |= orbit
        fixed = [c for c in range(1, p ** d) if perms[i][c] == c]
        negated = ([c for c in range(1, p ** d) if perms[i][c] == group.neg[c]]
                   if len(subgroups[i]) == 2 else [])
        if not fixed and not negated:
            continue
        normaliser = [n for n, j in enumerate(positions) if j in subgroups[i]]

        def representatives(vectors: list[int], normaliser: list[int] = normaliser) -> tuple:
            left, parts = set(vectors), []
            while left:
                c = min(left)
                left -= {int(perms[n][c]) for n in normaliser}
                parts.append(c)
            return tuple(parts)

        classes.append(LinearSymmetry(tuple(tuple(int(v) for v in row) for row in mats[i]),
                                      len(subgroups[i]), len(orbit), len(fixed),
                                      representatives(fixed), representatives(negated)))
    classes.sort(key=lambda c: (-c.order, c.matrix))
    return classes
