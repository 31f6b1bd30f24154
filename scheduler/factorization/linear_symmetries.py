"""Automorphisms of small abelian groups ``Z_{n_1} × ... × Z_{n_k}`` as matrices, and one
cyclic group of automorphisms per conjugacy class, for searches that prescribe a symmetry.

Why. A starter-type search may require its starter to be invariant under an automorphism ``A``
of the group ``H`` (then ``A`` is an automorphism of the one-factorization as well, and the
perfection test needs one union walk per orbit). For cyclic ``H`` every automorphism is a
multiplication by a unit, which :mod:`scheduler.factorization.twin_point_starters` already
offers as a *multiplier*; for ``H = Z_p^d`` the automorphisms form the much larger group
``GL(d, p)`` of invertible matrices, of which the ring units of ``Z_p × ... × Z_p`` or
``GF(p^d)`` are a small part (``(p - 1)^d`` diagonal matrices or ``p^d - 1`` field
multiplications); for ``Z_3 × Z_9`` the 108 automorphisms include shears such as
``(x, y) -> (x + y, y)`` that no ring unit gives. An automorphism maps the generator ``e_j`` of
the ``j``-th factor to ``sum_i A_ij e_i``, which is well defined exactly when ``n_i`` divides
``A_ij n_j``.

Only the cyclic subgroup ``<A>`` matters (a starter invariant under ``A`` is invariant under
every power), and conjugate subgroups give isomorphic spaces: if ``S`` is invariant under ``A``
and misses ``m``, then ``P S`` is invariant under ``P A P^-1`` and misses ``P m``. So one
generator per conjugacy class of cyclic subgroups is searched, and the missing element's part in
``H`` (a non-zero vector fixed by ``A``, since the symmetry must fix the missing element) is taken
up to the normaliser of ``<A>``, which maps the fixed vectors of ``A`` onto themselves.

Codes. Groups are numbered as :mod:`scheduler.factorization.groups` numbers them: the code of
``(x_1, ..., x_k)`` is ``x_1 + x_2 n_1 + x_3 n_1 n_2 + ...`` (first factor least significant;
a Galois field's additive group is numbered like ``Z_p^d``), and ``A`` maps the column ``x`` to
``A x`` with row ``i`` read modulo ``n_i``.

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
    """One conjugacy class of non-trivial cyclic subgroups of the automorphism group of ``H``
    (``GL(d, p)`` for ``Z_p^d``) that fix a non-zero element, or (order 2) negate one.

    Parameters
    ----------
    matrix : Matrix
        A generator ``A`` of one subgroup of the class (row ``i`` modulo ``n_i``).
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


def _places(moduli: tuple[int, ...]) -> np.ndarray:
    """The place value of each digit of a code (first modulus least significant)."""
    return np.cumprod((1, *moduli[:-1])).astype(np.int64)


def _digits(moduli: tuple[int, ...]) -> np.ndarray:
    """``(m, k)``: the digits of every code, first modulus least significant."""
    codes = np.arange(int(np.prod(moduli)))
    places = _places(moduli)
    return np.stack([(codes // places[i]) % n for i, n in enumerate(moduli)], axis=1)


def _images(moduli: tuple[int, ...], mats: np.ndarray) -> np.ndarray:
    """``(N, m)``: the code of ``A x`` for every matrix ``A`` of ``mats`` and every code ``x``
    (row ``i`` of the product read modulo ``moduli[i]``)."""
    mod = np.array(moduli, dtype=np.int64)
    image = np.einsum("nij,vj->nvi", mats, _digits(moduli)) % mod
    return (image * _places(moduli)).sum(axis=2)


def _well_defined(moduli: tuple[int, ...], matrix: np.ndarray) -> bool:
    """Is ``x -> A x`` well defined on ``Z_{n_1} × ... × Z_{n_k}``: ``n_i | A_ij n_j``?"""
    return all((int(matrix[i, j]) * nj) % ni == 0
               for i, ni in enumerate(moduli) for j, nj in enumerate(moduli))


def linear_permutation(group: AbelianGroup, matrix: Matrix) -> np.ndarray:
    """The automorphism ``x -> A x`` of ``group = Z_{n_1} × ... × Z_{n_k}`` as a permutation of
    its codes (``(A x)_i = sum_j A_ij x_j`` modulo ``n_i``).

    Parameters
    ----------
    group : AbelianGroup
        The group, numbered digit by digit (:mod:`scheduler.factorization.groups`).
    matrix : Matrix
        A ``k × k`` matrix of integers; it must give a well-defined bijection
        (``n_i`` divides ``A_ij n_j``; for ``Z_p^d`` any invertible matrix modulo ``p``).

    Returns
    -------
    numpy.ndarray
        ``perm[c]`` is the code of ``A x`` for the element ``x`` of code ``c``.

    Raises
    ------
    InputError
        For a matrix of the wrong shape, one that is not well defined or a singular one.
    """
    moduli = tuple(int(n) for n in group.moduli)
    k = len(moduli)
    try:
        A = np.array(matrix, dtype=np.int64)
    except (TypeError, ValueError):
        raise InputError(f"the matrix must be {k} rows of {k} integers, got {matrix!r}",
                         location="matrix") from None
    if A.shape != (k, k):
        raise InputError(f"the matrix must be {k} rows of {k} integers, got {matrix!r}",
                         location="matrix")
    if not _well_defined(moduli, A):
        raise InputError(f"the matrix {matrix!r} is not a map of {group.name}",
                         location="matrix")
    perm = _images(moduli, A[None])[0].astype(np.int64)
    if len(set(perm.tolist())) != group.order:
        raise InputError(f"the matrix {matrix!r} is singular on {group.name}",
                         location="matrix")
    return perm


def automorphism_matrices(moduli: tuple[int, ...]) -> np.ndarray:
    """Every automorphism of ``Z_{n_1} × ... × Z_{n_k}`` as a matrix (entry ``A_ij`` reduced
    modulo ``n_i``), an array of shape ``(N, k, k)``.

    Parameters
    ----------
    moduli : tuple of int
        The orders ``n_i`` of the cyclic factors (small groups only: the candidate matrices are
        listed).

    Returns
    -------
    numpy.ndarray
        The matrices in lexicographic order of their entries.

    Examples
    --------
    >>> len(automorphism_matrices((25,))), len(automorphism_matrices((3, 9)))
    (20, 108)
    >>> len(automorphism_matrices((5, 5)))  # GL(2, 5)
    480
    """
    moduli = tuple(int(n) for n in moduli)
    k = len(moduli)
    choices = [[a for a in range(moduli[i]) if (a * moduli[j]) % moduli[i] == 0]
               for i in range(k) for j in range(k)]
    if np.prod([len(c) for c in choices], dtype=float) > 50 * _MAX_ELEMENTS:
        raise InputError(f"the automorphisms of Z_{moduli} are too many to list here",
                         location="group")
    mats = np.array(list(itertools.product(*choices)), dtype=np.int64).reshape(-1, k, k)
    order = int(np.prod(moduli))
    codes = _images(moduli, mats)
    bijective = np.array([len(np.unique(row)) == order for row in codes])
    return mats[bijective]


def linear_symmetry_classes(group: AbelianGroup) -> list[LinearSymmetry]:
    """One :class:`LinearSymmetry` per conjugacy class of non-trivial cyclic subgroups of the
    automorphism group of ``group`` (``GL(d, p)`` for ``Z_p^d``) that fix a non-zero element or
    (order 2) negate one, largest order first.

    Parameters
    ----------
    group : AbelianGroup
        A small abelian group (its automorphisms are listed, :func:`automorphism_matrices`).

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
    mats = automorphism_matrices(tuple(int(n) for n in group.moduli))
    perms = _images(tuple(int(n) for n in group.moduli), mats).astype(np.int64)
    m = group.order
    index = {perm.tobytes(): i for i, perm in enumerate(perms)}
    identity = index[np.arange(m, dtype=np.int64).tobytes()]
    inverses = np.argsort(perms, axis=1)

    def subgroup(i: int) -> frozenset[int]:
        out, power = [identity], perms[i]
        while (j := index[power.tobytes()]) != identity:
            out.append(j)
            power = perms[i][power]
        return frozenset(out)

    subgroups = [subgroup(i) for i in range(len(perms))]
    seen: set[frozenset[int]] = set()
    classes = []
    for i in range(len(perms)):
        if i == identity or subgroups[i] in seen:
            continue
        # P A P^-1 for every automorphism P, as permutations: x -> P(A(P^-1 x))
        conjugate = np.take_along_axis(perms, perms[i][inverses], axis=1)
        positions = [index[c.tobytes()] for c in conjugate]
        orbit = {subgroups[j] for j in positions}
        seen |= orbit
        fixed = [c for c in range(1, m) if perms[i][c] == c]
        negated = ([c for c in range(1, m) if perms[i][c] == group.neg[c]]
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
