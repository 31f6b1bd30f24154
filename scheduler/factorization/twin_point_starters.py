"""Even starters over ``G = Z_2 × H`` (``H`` abelian of odd order) and the one-factorizations
of ``K_{|G|+2}`` they induce with the two points at infinity *kept* or *swapped*; randomised
search for perfect ones.

Group. ``G = Z_2 × H`` on the codes ``c = 2 h + b`` (``h`` a code of ``H``, ``b`` the ``Z_2``
part, the *parity* of ``c``); ``t = 1`` (``h = 0``, ``b = 1``) is its only involution. For
``H = Z_k`` this is ``Z_{2k}`` (Chinese remainder theorem) with a different numbering.

Even starter. A set ``S`` of ``|G|/2 - 1`` pairs that partition ``G \\ {0, m}`` (``m`` the
*missing* element, ``m`` not ``0`` or ``t``) whose differences ``±(x - y)`` cover ``G \\ {0, t}``
exactly once (B. A. Anderson, "A class of starter induced 1-factorizations", Graphs and
Combinatorics, Springer LNM 406 (1974) 180-185; J. H. Dinitz, "Starters", Handbook of
Combinatorial Designs, 2nd ed., 2007, §VI.55; both from memory, unverified). On the vertices
``G ∪ {∞1, ∞2}`` (``∞1 = |G|``, ``∞2 = |G| + 1``) take ``E = {∞1 ∞2} ∪ {{x, x + t}}`` and, for
each ``g`` in ``G``,

* kept points (the classical even-starter factorization, the cyclic case of which is
  :mod:`scheduler.factorization.even_starters`): ``F_g = {∞1, g} ∪ {∞2, m + g} ∪ (S + g)``;
* swapped points: the same when ``g`` is even, but ``F_g = {∞2, g} ∪ {∞1, m + g} ∪ (S + g)``
  when ``g`` is odd. This needs ``m`` even.

Why the swapped version is a one-factorization (computed here; we know no publication of it,
so it is this project's variant): the translation ``τ_c: x -> x + c`` that also exchanges
``∞1, ∞2`` when ``c`` is odd maps ``F_g`` to ``F_{g+c}`` (parity is additive) and fixes ``E``,
so ``G`` acts on the rounds with orbits ``{E}`` and ``{F_g}``. ``∞1`` meets ``g`` in ``F_g``
for even ``g`` and ``m + g`` in ``F_g`` for odd ``g``: all of ``G`` exactly once when ``m`` is
even; likewise ``∞2``. An edge ``{x, y}`` of ``G`` with ``y - x ≠ t`` lies in ``S + g`` for
exactly one ``g`` (the differences of ``S`` cover each class ``±d`` once and the ``G``-orbit of
one such edge is the whole class); the ``t``-class is ``E``.

Perfection. In both versions ``τ_c`` maps the pair ``{F_a, F_b}`` to ``{F_0, F_{b-a}}`` and
``{F_a, E}`` to ``{F_0, E}``; ``{F_0, F_g}`` and ``{F_0, F_{-g}}`` are images of each other. A
*multiplier* ``μ: (b, h) -> (b, u h)`` (``u`` a unit of ``H``'s ring) with ``u m = m`` and
``S μ = S`` maps ``F_g`` to ``F_{μ g}``. So the factorization is perfect exactly when
``F_0 ∪ E`` and ``F_0 ∪ F_g`` are Hamiltonian cycles for one ``g`` in each orbit of
``<g -> -g, μ>`` on ``G \\ {0}``: at most ``|G|/2 + 1`` cycle walks. Missing elements in one
orbit of the units of ``H`` give isomorphic spaces, so only orbit representatives are tried.

Two facts computed here (proofs; the tests confirm them on small groups):

* *Parity.* Mixed-parity pairs have odd differences and there are ``(k - 1) / 2`` odd classes
  (``k = |H|``), so counting the even elements left to same-parity pairs shows that an even
  starter exists only with ``m`` odd when ``k ≡ 1 (mod 4)`` and only with ``m`` even when
  ``k ≡ 3 (mod 4)``. So ``K_52`` (``k = 25``) has no swapped version at all.
* *The swapped version is never perfect.* ``τ_t`` is a fixed-point-free involution exchanging
  ``F_0`` and ``F_t``, so it preserves the cycle ``F_0 ∪ F_t`` if that is Hamiltonian; a
  half-turn of a cycle of length ``2k + 2`` (``k`` odd) or a reflection without fixed vertices
  keeps the two alternating edge classes, so it cannot exchange them. It stays here as a valid
  (non-perfect) construction; the searches use the kept version.

* *One path.* Read every pair of ``F_0`` in ``H`` (``{(b, x), (c, y)} -> x y``, ``∞1 0``,
  ``∞2 m_H``): each element of ``H`` other than ``0`` and ``m_H`` gets degree 2, so the result
  is a path from ``∞1`` to ``∞2`` plus cycles. ``τ_t`` maps ``F_0`` onto ``F_t`` and fixes the
  two points at infinity, so ``F_0 ∪ F_t`` is the double cover of that picture: Hamiltonian
  exactly when the picture is one path through all of ``H``. ``F_0 ∪ E`` walks the same picture
  (each edge of ``E`` joins the two elements over one point of ``H``), so it is Hamiltonian under
  the same condition. Two of the ``|G|/2 + 1`` walks are therefore one test.

Symmetries. Besides the ring's multipliers, a space may prescribe any automorphism of ``H``
given as a matrix on its cyclic factors (:mod:`scheduler.factorization.linear_symmetries`;
``GL(d, p)`` when ``H = Z_p^d``); since ``|Z_2|`` and ``|H|`` are coprime these
``(b, h) -> (b, A h)`` are all the automorphisms of ``G``. Symmetric spaces are small enough
to search to exhaustion (``exhaustive=True``).

Flip symmetries (computed here; we know no publication of them). Let ``α`` be an automorphism
of ``G`` with ``α m = -m`` and ``φ(x) = α x + m``, and let ``φ`` also exchange ``∞1`` and
``∞2``. If ``φ(S) = S`` (that is ``α S = S - m``), then ``φ(F_g) = F_{α g}``:
``{∞1, g} -> {∞2, α g + m}``, ``{∞2, m + g} -> {∞1, α g}`` and ``S + g -> S + α g``; and
``φ(E) = E`` since ``α t = t``. So ``φ`` is an automorphism of the factorization fixing
``F_0``, and the walks are again needed for one ``g`` per orbit of ``<g -> -g, α>``. As
``φ^2(x) = α^2 x``, a flip whose ``α`` is not an involution contains the symmetry ``α^2``,
which fixes ``m``; only involutions ``α`` give new spaces (:func:`flip_symmetry_spaces`).

Merged class (:func:`is_merged_starter`): every element of ``H`` lies in at most one pair of
equal parity and one of mixed parity; then each kind, read in ``H``, is a starter of ``H`` or a
translate of one, and the even starter is two starters of ``H`` merged. The published
perfect one-factorization of ``K_56`` is of this kind (an even starter of ``Z_54`` from two
starters of ``Z_27`` merged by A. J. Wolfe's method; read in a summary of D. A. Pike's paper,
docs/factorization-search.md). The kernel keeps to the class on request.

Why this space (docs/factorization-search.md; the attributions from memory): the perfect
one-factorizations of ``K_52`` and
``K_56`` were found by computer searches over one-factorizations with a prescribed automorphism
group; a group of order ``n - 2`` acting regularly on all but two points is the even-starter
analogue of the starter construction (a group of order ``n - 1`` with one fixed point), and the
swapped version is the same group acting transitively on the two extra points. The search
(smallest free element first, random partner order per seed, Luby restarts) is the project's
own, as in :mod:`scheduler.factorization.search`.
"""

from __future__ import annotations

import json
import time
from collections.abc import Iterator, Sequence
from dataclasses import dataclass
from functools import cache

import numpy as np

from scheduler.errors import InputError
from scheduler.factorization.groups import AbelianGroup, group_from_name
from scheduler.factorization.linear_symmetries import (
    Matrix,
    linear_permutation,
    linear_symmetry_classes,
)
from scheduler.factorization.model import Factorization, normalise_round
from scheduler.factorization.search import element_orbits, run_node_limit, run_seed
from scheduler.progress import Progress

Pair = tuple[int, int]

SOURCE = (
    "even starter over Z_2 x H with two points at infinity, kept (B. A. Anderson 1974, from "
    "memory) or swapped by the odd translations (this project's variant, "
    "docs/factorization-search.md)"
)

MAX_ORDER = 1000
"""Largest ``|G| = 2 |H|`` accepted."""


@dataclass(frozen=True, eq=False)
class TwinGroup:
    """``G = Z_2 × H`` on the codes ``2 h + b`` with numpy tables ``add``, ``neg``, the parity
    ``par`` (``b``) and the base group ``base`` (``H``).

    Made (and cached) by :func:`twin_group` from the name of ``H``.

    Parameters
    ----------
    base : AbelianGroup
        ``H``, abelian of odd order.
    add : numpy.ndarray
        ``(2|H|, 2|H|)`` addition table of ``G``.
    neg : numpy.ndarray
        ``(2|H|,)`` table of negatives.
    par : numpy.ndarray
        ``(2|H|,)`` parity ``b`` of every code.

    Examples
    --------
    >>> group = twin_group("Z_5")
    >>> group.name, group.order, group.label(3)
    ('Z_2 x Z_5', 10, '1|1')
    """

    base: AbelianGroup
    add: np.ndarray
    neg: np.ndarray
    par: np.ndarray

    @property
    def order(self) -> int:
        """The number of elements ``2 |H|``."""
        return 2 * self.base.order

    @property
    def name(self) -> str:
        """The readable name ``"Z_2 x <H>"``."""
        return f"Z_2 x {self.base.name}"

    def multiplier(self, u: int) -> np.ndarray:
        """``(b, h) -> (b, u h)`` as a permutation of the codes (``u`` a unit of ``H``).

        Parameters
        ----------
        u : int
            A unit of ``H``'s ring.

        Returns
        -------
        numpy.ndarray
            ``perm[c]`` is the image of code ``c``.

        Raises
        ------
        InputError
            When ``u`` is not a unit.
        """
        return self.lift(self.base.multiplier(u))

    def lift(self, perm: np.ndarray) -> np.ndarray:
        """``(b, h) -> (b, perm[h])`` for a permutation ``perm`` of ``H``'s codes, as a
        permutation of the codes of ``G``.

        Parameters
        ----------
        perm : numpy.ndarray
            A permutation of ``0..|H|-1`` (an automorphism of ``H``).

        Returns
        -------
        numpy.ndarray
            ``out[c]`` is the image of code ``c``.
        """
        codes = np.arange(self.order)
        return (2 * np.asarray(perm)[codes // 2] + codes % 2).astype(np.int64)

    def label(self, c: int) -> str:
        """The element of code ``c`` as ``"<parity>|<label in H>"``.

        Parameters
        ----------
        c : int
            A code of ``G``.

        Returns
        -------
        str
            The label.
        """
        return f"{c % 2}|{self.base.label(c // 2)}"


@cache
def twin_group(base: str) -> TwinGroup:
    """``Z_2 × H`` for ``H`` given by its name (``"Z_25"``, ``"Z_5 x Z_5"``, ``"GF(25)"``)."""
    if not isinstance(base, str):
        raise InputError(f"the base group must be given by its name, got {base!r}",
                         location="group")
    group = group_from_name(base)
    if 2 * group.order > MAX_ORDER or group.order < 3:
        raise InputError(f"|Z_2 x {base}| must lie in 6..{MAX_ORDER}", location="group")
    k = group.order
    codes = np.arange(2 * k)
    h, b = codes // 2, codes % 2
    add = 2 * group.add[h[:, None], h[None, :]] + (b[:, None] ^ b[None, :])
    neg = 2 * group.neg[h] + b
    return TwinGroup(group, add.astype(np.int64), neg.astype(np.int64), b.astype(np.int64))


def _symmetry(G: TwinGroup, multiplier: int = 1, matrix: Matrix | None = None,
              flip_missing: int | None = None) -> np.ndarray:
    """The symmetry ``α: (b, h) -> (b, u h)`` or ``(b, h) -> (b, A h)`` as a permutation of the
    codes of ``G`` (the identity when neither is given); with ``flip_missing = m`` the flip
    ``x -> α x + m``."""
    if matrix is not None:
        if multiplier != 1:
            raise InputError("give a multiplier or a matrix, not both", location="matrix")
        alpha = G.lift(linear_permutation(G.base, matrix))
    else:
        alpha = G.multiplier(multiplier) if multiplier != 1 else np.arange(G.order)
    if flip_missing is None:
        return alpha
    return G.add[alpha, flip_missing].astype(np.int64)


def _matrix_tuple(matrix: Matrix | None) -> Matrix | None:
    """``matrix`` as a tuple of tuples of plain ints (hashable, comparable), or None."""
    return None if matrix is None else tuple(tuple(int(v) for v in row) for row in matrix)


def _pairs(starter: Sequence[Sequence[int]]) -> list[Pair]:
    out = []
    for pair in starter:
        a, b = (int(v) for v in pair)
        out.append((min(a, b), max(a, b)))
    return sorted(out)


def is_twin_starter(base: str, starter: Sequence[Sequence[int]], *, swapped: bool = False) -> bool:
    """Is ``starter`` an even starter of ``Z_2 × H`` (with an even missing element when
    ``swapped``)?

    Parameters
    ----------
    base
        Name of the odd-order abelian group ``H`` (as :func:`twin_group` reads it).
    starter
        The pairs ``(x, y)`` of codes of ``Z_2 × H``.
    swapped
        Whether the two points at infinity swap on the odd translates.

    Returns
    -------
    bool
        False also for input that is not a list of pairs.
    """
    G = twin_group(base)
    M = G.order
    try:
        pairs = _pairs(starter)
    except (TypeError, ValueError):
        return False
    if len(pairs) != M // 2 - 1:
        return False
    elements = [v for p in pairs for v in p]
    if any(v <= 0 or v >= M for v in elements) or len(set(elements)) != M - 2:
        return False
    missing = next(x for x in range(1, M) if x not in set(elements))
    if missing == 1 or (swapped and G.par[missing]):
        return False
    diffs = set()
    for a, b in pairs:
        diffs.add(int(G.add[a, G.neg[b]]))
        diffs.add(int(G.add[b, G.neg[a]]))
    return len(diffs) == M - 2 and 0 not in diffs and 1 not in diffs


def _require(base: str, starter, swapped: bool) -> tuple[TwinGroup, list[Pair], int]:
    if not is_twin_starter(base, starter, swapped=swapped):
        kind = "an even starter with an even missing element" if swapped else "an even starter"
        raise InputError(f"not {kind} of Z_2 x {base}: {starter!r}", location="starter")
    G = twin_group(base)
    pairs = _pairs(starter)
    covered = {v for p in pairs for v in p}
    missing = next(x for x in range(1, G.order) if x not in covered)
    return G, pairs, missing


def twin_rounds(base: str, starter: Sequence[Sequence[int]], *,
                swapped: bool = False) -> tuple[tuple[Pair, ...], ...]:
    """Rounds ``F_0, ..., F_{|G|-1}, E`` on ``0..|G|+1`` (``∞1 = |G|``, ``∞2 = |G| + 1``).

    Parameters
    ----------
    base
        Name of the odd-order abelian group ``H`` (as :func:`twin_group` reads it).
    starter
        The pairs ``(x, y)`` of codes of ``Z_2 × H``.
    swapped
        Whether the two points at infinity swap on the odd translates.

    Returns
    -------
    tuple of rounds
        ``|G| + 1`` rounds of games on ``0..|G|+1``.

    Raises
    ------
    InputError
        When ``starter`` is not an even starter of ``Z_2 × H`` (of the kind ``swapped`` needs).
    """
    G, pairs, m = _require(base, starter, swapped)
    M = G.order
    rounds = []
    for g in range(M):
        first, second = (M + 1, M) if swapped and G.par[g] else (M, M + 1)
        games = [(first, g), (second, int(G.add[m, g]))]
        games += [(int(G.add[a, g]), int(G.add[b, g])) for a, b in pairs]
        rounds.append(normalise_round(games))
    rounds.append(normalise_round([(M, M + 1)] + [(x, x + 1) for x in range(0, M, 2)]))
    return tuple(rounds)


def twin_factorization(base: str, starter: Sequence[Sequence[int]], *, swapped: bool = False,
                       method: str | None = None, source: str | None = None,
                       details: dict | None = None) -> Factorization:
    """The one-factorization of ``K_{2|H|+2}`` induced by an even starter of ``Z_2 × H``.

    Parameters
    ----------
    base
        Name of the odd-order abelian group ``H`` (as :func:`twin_group` reads it).
    starter
        The pairs ``(x, y)`` of codes of ``Z_2 × H``.
    swapped
        Whether the two points at infinity swap on the odd translates.
    method, source
        Override the factorization's description and citation.
    details
        Extra entries for the factorization's ``details``.

    Returns
    -------
    Factorization
        The one-factorization of ``K_{2|H|+2}``.

    Raises
    ------
    InputError
        When ``starter`` is not an even starter of ``Z_2 × H`` (of the kind ``swapped`` needs).
    """
    G, pairs, m = _require(base, starter, swapped)
    info = {"construction": "even starter over Z_2 x H", "group": G.name, "base": base,
            "swapped": swapped, "missing": m, "starter": [list(p) for p in pairs]}
    info.update(details or {})
    kind = "swapped" if swapped else "kept"
    return Factorization(G.order + 2, twin_rounds(base, pairs, swapped=swapped),
                         method or f"even starter in {G.name} (points at infinity {kind})",
                         source or SOURCE, info)


def check_representatives(base: str, multiplier: int = 1, matrix: Matrix | None = None
                          ) -> list[int]:
    """One ``g`` (the smallest code) per orbit of ``<g -> -g, μ>`` on ``G \\ {0}``.

    Parameters
    ----------
    base : str
        The name of ``H``, an abelian group of odd order (as
        :func:`~scheduler.factorization.groups.group_from_name` reads it).
    multiplier : int, optional
        A unit ``u`` of ``H``'s ring; the starter must be invariant under ``(b, h) -> (b, u h)``
        (1: no multiplier).
    matrix : tuple of tuple of int or None, optional
        An automorphism ``A`` of ``H`` as a matrix on its cyclic factors; the starter must be
        invariant under ``(b, h) -> (b, A h)``
        (:mod:`scheduler.factorization.linear_symmetries`; not together with a multiplier).

    Returns
    -------
    list of int
        The representatives, increasing: the ``g`` for which ``F_0 ∪ F_g`` is walked.

    Examples
    --------
    >>> check_representatives("Z_5")
    [1, 2, 3, 4, 5]
    """
    G = twin_group(base)
    perm = _symmetry(G, multiplier, matrix)
    return [g for g, _ in element_orbits(G.neg, perm)]


def missing_parity(k: int) -> int:
    """The parity of the missing element of every even starter of ``Z_2 × H`` with ``|H| = k``:
    1 (odd) when ``k ≡ 1 (mod 4)``, 0 (even) when ``k ≡ 3 (mod 4)`` (the parity rule of the
    module docstring).

    Parameters
    ----------
    k : int
        The odd order of ``H``.

    Returns
    -------
    int
        0 or 1.

    Examples
    --------
    >>> missing_parity(25), missing_parity(27)
    (1, 0)
    """
    return 1 if k % 4 == 1 else 0


def linear_symmetry_spaces(base: str, *, merged: bool = False) -> list[str]:
    """The space names (:func:`space_name`) of the even starters of ``Z_2 × H`` invariant under
    an automorphism of ``H`` given as a matrix: one per conjugacy class of cyclic subgroups of
    the automorphism group (``GL(d, p)`` when ``H = Z_p^d``) that fix a non-zero element and
    per choice of the missing element's part in ``H`` up to the normaliser
    (:func:`~scheduler.factorization.linear_symmetries.linear_symmetry_classes`), the missing
    element of the parity that admits even starters. Conjugate choices give isomorphic spaces,
    so these cover every such symmetry.

    Parameters
    ----------
    base : str
        The name of ``H`` (small: its automorphisms are listed; a Galois field's additive group
        is numbered as the product of its prime factors, so both names give the same spaces).
    merged : bool, optional
        Name the merged class instead of all even starters.

    Returns
    -------
    list of str
        Largest symmetry order first.

    Examples
    --------
    >>> for name in linear_symmetry_spaces("Z_3 x Z_3"):
    ...     print(name)
    Z_2 x Z_3 x Z_3 | kept | m=9 | A=[[0,1],[2,2]]
    Z_2 x Z_3 x Z_3 | kept | m=9 | A=[[0,1],[1,0]]
    """
    G = twin_group(base)
    parity = missing_parity(G.base.order)
    return [space_name(base, swapped=False, missing=2 * part + parity, matrix=c.matrix,
                       merged=merged)
            for c in linear_symmetry_classes(G.base) for part in c.missing_parts]


def flip_symmetry_spaces(base: str, *, merged: bool = False) -> list[str]:
    """The space names (:func:`space_name`) of the even starters of ``Z_2 × H`` invariant under
    a flip ``x -> α x + m`` with ``α`` an involution of ``H`` negating ``m``'s part in ``H``:
    one ``α`` per conjugacy class of involutions in the automorphism group of ``H`` and ``m``
    up to its centraliser
    (:func:`~scheduler.factorization.linear_symmetries.linear_symmetry_classes`). A flip whose
    ``α`` is not an involution has the non-trivial square ``x -> α^2 x`` fixing ``m``, so its
    space lies inside one of :func:`linear_symmetry_spaces`.

    Parameters
    ----------
    base : str
        The name of ``H``, an abelian group of odd order (small: its automorphisms are listed).
    merged : bool, optional
        Name the merged class instead of all even starters.

    Returns
    -------
    list of str
        The names, ``+m`` marking the flip.

    Examples
    --------
    >>> for name in flip_symmetry_spaces("Z_3 x Z_3"):
    ...     print(name)
    Z_2 x Z_3 x Z_3 | kept | m=11 | A=[[0,1],[1,0]]+m
    Z_2 x Z_3 x Z_3 | kept | m=3 | A=[[2,0],[0,2]]+m
    """
    G = twin_group(base)
    parity = missing_parity(G.base.order)
    return [space_name(base, swapped=False, missing=2 * part + parity, matrix=c.matrix,
                       flip=True, merged=merged)
            for c in linear_symmetry_classes(G.base) if c.order == 2 for part in c.negated_parts]


def missing_representatives(base: str, *, swapped: bool = False, multiplier: int = 1
                            ) -> list[int]:
    """Missing elements worth trying: one per orbit of the units of ``H`` (acting on the
    ``H`` part), not ``0`` or ``t``, of the parity that admits even starters (odd when
    ``|H| ≡ 1 (mod 4)``, even otherwise), fixed by the multiplier.

    Parameters
    ----------
    base : str
        The name of ``H``, an abelian group of odd order (as
        :func:`~scheduler.factorization.groups.group_from_name` reads it).
    swapped : bool, optional
        For the swapped points, which need an even missing element.
    multiplier : int, optional
        A unit ``u`` of ``H``'s ring; the starter must be invariant under ``(b, h) -> (b, u h)``
        (1: no multiplier).

    Returns
    -------
    list of int
        The codes, increasing (empty when the parity rule leaves none).

    Examples
    --------
    >>> missing_representatives("Z_5"), missing_representatives("Z_3")
    ([3], [2])
    """
    G = twin_group(base)
    units = G.base.units()
    seen: set[int] = set()
    out = []
    fixed = G.multiplier(multiplier) if multiplier != 1 else np.arange(G.order)
    parity = missing_parity(G.base.order)
    for c in range(2, G.order):
        if c in seen or (swapped and G.par[c]) or G.par[c] != parity:
            continue
        orbit = {int(G.multiplier(u)[c]) for u in units}
        seen |= orbit
        rep = next((x for x in sorted(orbit) if fixed[x] == x), None)
        if rep is not None:
            out.append(rep)
    return out


def enumerate_twin_starters(base: str, missing: int, multiplier: int = 1,
                            matrix: Matrix | None = None, flip: bool = False
                            ) -> Iterator[tuple[Pair, ...]]:
    """Every even starter of ``Z_2 × H`` missing ``missing`` and invariant under the multiplier
    (exhaustive, plain Python; tiny groups only).

    Parameters
    ----------
    base : str
        The name of ``H``, an abelian group of odd order (as
        :func:`~scheduler.factorization.groups.group_from_name` reads it).
    missing : int
        The missing element's code.
    multiplier : int, optional
        A unit ``u`` of ``H``'s ring; the starter must be invariant under ``(b, h) -> (b, u h)``
        (1: no multiplier).
    matrix : tuple of tuple of int or None, optional
        An automorphism ``A`` of ``H`` as a matrix on its cyclic factors; the starter must be
        invariant under ``(b, h) -> (b, A h)``
        (:mod:`scheduler.factorization.linear_symmetries`; not together with a multiplier).
    flip : bool, optional
        The symmetry also translates by the missing element: ``x -> α x + m`` (``α`` the
        multiplier or matrix, which must then negate ``m``), exchanging the two points at
        infinity (module docstring, "Flip symmetries").

    Yields
    ------
    tuple of Pair
        Each even starter once, its pairs sorted.

    Examples
    --------
    >>> list(enumerate_twin_starters("Z_3", 2))
    [((1, 4), (3, 5)), ((1, 5), (3, 4))]
    """
    G = twin_group(base)
    M = G.order
    mu = _symmetry(G, multiplier, matrix, missing if flip else None)
    used = [False] * M
    dused = [False] * M
    used[0] = used[missing] = True
    dused[0] = dused[1] = True
    chosen: list[Pair] = []

    def orbit(x: int, y: int) -> list[Pair] | None:
        out: list[Pair] = []
        a, b = x, y
        while True:
            out.append((a, b))
            a, b = int(mu[a]), int(mu[b])
            if {a, b} == {x, y}:
                return out
            if len(out) > M:  # pragma: no cover - a permutation cycles back
                return None

    def rec() -> Iterator[tuple[Pair, ...]]:
        x = next((v for v in range(1, M) if not used[v]), None)
        if x is None:
            yield tuple(sorted((min(a, b), max(a, b)) for a, b in chosen))
            return
        for y in range(1, M):
            if y == x or used[y]:
                continue
            pairs = orbit(x, y) or []
            marked: list[tuple[int, int, int]] = []
            good = True
            for a, b in pairs:
                d = int(G.add[a, G.neg[b]])
                if a == b or used[a] or used[b] or dused[d] or dused[int(G.neg[d])]:
                    good = False
                    break
                used[a] = used[b] = dused[d] = dused[int(G.neg[d])] = True
                marked.append((a, b, d))
            if good:
                chosen.extend(pairs)
                yield from rec()
                del chosen[len(chosen) - len(pairs):]
            for a, b, d in marked:
                used[a] = used[b] = dused[d] = dused[int(G.neg[d])] = False

    yield from rec()


@dataclass(frozen=True)
class TwinSearchResult:
    """Outcome of :func:`search_perfect_twin_starter`; ``exhausted``: no perfect even starter
    with this missing element, multiplier and kind of points exists.

    Parameters
    ----------
    base : str
        The name of ``H``.
    swapped : bool
        True for the swapped points.
    missing : int
        The missing element's code.
    multiplier : int
        The unit the starter had to be invariant under (1: none).
    seed : int
        The search's seed.
    starter : tuple of Pair or None
        The perfect even starter found; None when none was found.
    runs : int
        Restarts made.
    nodes : int
        Search nodes visited in all runs.
    seconds : float
        Wall time spent.
    exhausted : bool
        True when a run explored the whole space without success.
    merged : bool, optional
        True when the search kept to the merged class (:func:`is_merged_starter`).
    matrix : tuple of tuple of int or None, optional
        The matrix the starter had to be invariant under (None: none).
    flip : bool, optional
        True when the symmetry also translated by the missing element.
    """

    base: str
    swapped: bool
    missing: int
    multiplier: int
    seed: int
    starter: tuple[Pair, ...] | None
    runs: int
    nodes: int
    seconds: float
    exhausted: bool
    merged: bool = False
    matrix: Matrix | None = None
    flip: bool = False

    @property
    def found(self) -> bool:
        """True when a perfect even starter was found."""
        return self.starter is not None


_TWIN_SALT = 24_680


def twin_kernel_arrays(base: str, missing: int, *, swapped: bool = False, multiplier: int = 1,
                       matrix: Matrix | None = None, flip: bool = False
                       ) -> tuple[TwinGroup, np.ndarray, np.ndarray]:
    """The group, the symmetry permutation the kernel follows pairs under, and the
    representatives of the union walks, for one space of :func:`search_perfect_twin_starter`
    (which documents the arguments), after checking that the space is well posed.

    Parameters
    ----------
    base : str
        The name of ``H``.
    missing : int
        The missing element's code.
    swapped, multiplier, matrix, flip
        As in :func:`search_perfect_twin_starter`.

    Returns
    -------
    tuple
        ``(G, symmetry, reps)``: the :class:`TwinGroup`, the symmetry as an int64 permutation
        (with the flip's translation when ``flip``) and the walk representatives as int64.

    Raises
    ------
    InputError
        For a missing element, multiplier, matrix or flip that the space does not allow.
    """
    G = twin_group(base)
    M = G.order
    mu = _symmetry(G, multiplier, matrix)
    parity = missing_parity(G.base.order)
    image = int(mu[missing]) if 1 < int(missing) < M else -1
    if (not 1 < int(missing) < M or G.par[int(missing)] != parity
            or (swapped and G.par[int(missing)])
            or image != (int(G.neg[missing]) if flip else int(missing))):
        raise InputError(f"missing element {missing!r} is not allowed here (not 0 or t, of the "
                         f"parity that admits even starters, even when the points are swapped, "
                         f"fixed by the multiplier, or negated by it for a flip)",
                         location="missing")
    if flip and (swapped or (matrix is None and multiplier == 1)):
        raise InputError("a flip needs a multiplier or a matrix and the points kept",
                         location="flip")
    # the kernel follows pairs under the whole symmetry; the walks need only its linear part
    symmetry = _symmetry(G, multiplier, matrix, int(missing)) if flip else mu
    reps = np.array(check_representatives(base, multiplier, matrix), dtype=np.int64)
    return G, symmetry.astype(np.int64), reps


def search_perfect_twin_starter(
    base: str,
    missing: int,
    *,
    swapped: bool = False,
    multiplier: int = 1,
    matrix: Matrix | None = None,
    flip: bool = False,
    merged: bool = False,
    seed: int = 0,
    budget: float = 10.0,
    base_nodes: int = 20_000,
    max_run_nodes: int = 5_000_000,
    max_nodes: int | None = None,
    shuffle: bool = True,
    exhaustive: bool = False,
    progress: Progress | None = None,
) -> TwinSearchResult:
    """Search ``Z_2 × H`` for a perfect even starter missing ``missing``.

    Runs follow the Luby sequence times ``base_nodes`` (capped by ``max_run_nodes``); ``budget``
    is wall seconds checked between runs and ``max_nodes`` an optional total work limit (the
    outcome then depends only on the arguments, not on the machine). With ``shuffle=False`` and
    large limits a run is a plain exhaustive search. With ``exhaustive=True`` the runs are plain
    depth-first searches in a fixed order whose node limits double from ``base_nodes`` without
    a cap, so that a space of any size is settled once the budget allows (at most twice the
    nodes of one complete search); capped restarts (the default) can never exhaust a space
    whose search tree has more than ``max_run_nodes`` nodes. Every starter returned has been
    re-checked by walking the induced factorization's unions (:func:`is_perfect_twin_starter`).

    Parameters
    ----------
    base : str
        The name of ``H``, an abelian group of odd order (as
        :func:`~scheduler.factorization.groups.group_from_name` reads it).
    missing : int
        The missing element's code (:func:`missing_representatives`).
    swapped : bool, optional
        Search the swapped version (never perfect; kept for tests of the argument).
    multiplier : int, optional
        A unit ``u`` of ``H``'s ring; the starter must be invariant under ``(b, h) -> (b, u h)``
        (1: no multiplier).
    matrix : tuple of tuple of int or None, optional
        An automorphism ``A`` of ``H`` as a matrix on its cyclic factors; the starter must be
        invariant under ``(b, h) -> (b, A h)``
        (:mod:`scheduler.factorization.linear_symmetries`; not together with a multiplier).
    flip : bool, optional
        The symmetry also translates by the missing element: ``x -> α x + m`` (``α`` the
        multiplier or matrix, which must then negate ``m``), exchanging the two points at
        infinity (module docstring, "Flip symmetries").
    merged : bool, optional
        Keep to the merged class (:func:`is_merged_starter`), the class of the published finds
        at 52 and 56 points.
    seed : int, optional
        The seed of the restarts.
    budget : float, optional
        Seconds of wall time, checked between runs.
    base_nodes : int, optional
        Nodes of the first run; run ``r`` gets ``base_nodes * luby(r)``.
    max_run_nodes : int, optional
        The most nodes of any run.
    max_nodes : int or None, optional
        A total work limit; None: only the clock.
    shuffle : bool, optional
        Random partner order; False for plain exhaustive runs.
    exhaustive : bool, optional
        Plain depth-first runs with doubling node limits (``shuffle`` and ``max_run_nodes`` are
        then not used): the way to prove a space empty.
    progress : callable or None, optional
        Called as ``progress(message, fraction)`` after each run.

    Returns
    -------
    TwinSearchResult
        The starter found (or None) and the record of the search.

    Raises
    ------
    InputError
        For a bad seed, budget, missing element or multiplier.

    References
    ----------
    ``docs/factorization-search.md``.
    """
    if isinstance(seed, bool) or not isinstance(seed, int):
        raise InputError(f"the seed must be an integer, got {seed!r}", location="seed")
    if not budget > 0:
        raise InputError(f"the time budget must be positive, got {budget!r}", location="budget")
    G, symmetry, reps = twin_kernel_arrays(base, missing, swapped=swapped, multiplier=multiplier,
                                           matrix=matrix, flip=flip)
    M = G.order
    from scheduler.factorization._twin_kernel import twin_search_kernel  # numba: lazily

    out = np.zeros((M // 2 - 1, 2), dtype=np.int64)
    start = time.perf_counter()
    runs = nodes = 0
    while True:
        runs += 1
        limit = run_node_limit(runs, base_nodes, max_run_nodes, exhaustive)
        if max_nodes is not None:
            limit = max(1, min(limit, max_nodes - nodes))
        status, used = twin_search_kernel(
            M, G.add, G.neg, symmetry, G.par, 1, int(missing), swapped,
            bool(merged), reps,
            run_seed(seed, runs, _TWIN_SALT), shuffle and not exhaustive, limit, out)
        nodes += int(used)
        elapsed = time.perf_counter() - start

        def result(starter, exhausted: bool, runs: int = runs, nodes: int = nodes,
                   elapsed: float = elapsed) -> TwinSearchResult:
            return TwinSearchResult(
                starter=starter, exhausted=exhausted, base=base, swapped=swapped,
                missing=int(missing), multiplier=multiplier, seed=seed, runs=runs,
                nodes=nodes, seconds=elapsed, merged=bool(merged), matrix=_matrix_tuple(matrix),
                flip=bool(flip))

        if status == 1:
            starter = tuple(sorted((int(min(a, b)), int(max(a, b))) for a, b in out))
            if not is_perfect_twin_starter(base, starter, swapped=swapped) or (
                    merged and not is_merged_starter(base, starter)):  # pragma: no cover
                raise AssertionError(f"twin kernel returned a wrong starter {starter}")
            return result(starter, exhausted=False)
        if status == -1:
            return result(None, exhausted=True)
        if progress:
            progress(f"searching {G.name}: {runs} runs, {nodes} nodes",
                     min(1.0, elapsed / budget))
        if elapsed >= budget or (max_nodes is not None and nodes >= max_nodes):
            return result(None, exhausted=False)


def _hamiltonian(p: list[int], q: list[int]) -> bool:
    n = len(p)
    v, length = 0, 0
    while True:
        v = q[p[v]]
        length += 2
        if v == 0:
            return length == n


def is_perfect_twin_starter(base: str, starter: Sequence[Sequence[int]], *,
                            swapped: bool = False) -> bool:
    """Is the induced factorization perfect? (``|G|/2 + 1`` union walks, by the argument of the
    module docstring; the test suite compares this with the independent verifier.)

    Parameters
    ----------
    base
        Name of the odd-order abelian group ``H`` (as :func:`twin_group` reads it).
    starter
        The pairs ``(x, y)`` of codes of ``Z_2 × H``.
    swapped
        Whether the two points at infinity swap on the odd translates.

    Returns
    -------
    bool
        False also for anything that is not such an even starter.
    """
    if not is_twin_starter(base, starter, swapped=swapped):
        return False
    rounds = twin_rounds(base, starter, swapped=swapped)
    n = len(rounds) + 1

    def partners(rnd) -> list[int]:
        p = [0] * n
        for a, b in rnd:
            p[a], p[b] = b, a
        return p

    p0 = partners(rounds[0])
    if not _hamiltonian(p0, partners(rounds[-1])):
        return False
    return all(_hamiltonian(p0, partners(rounds[g])) for g in check_representatives(base))


def is_merged_starter(base: str, starter: Sequence[Sequence[int]]) -> bool:
    """Is ``starter`` an even starter of the *merged class*: does every element ``h`` of ``H``
    lie in at most one pair of equal parity and at most one pair of mixed parity?

    Then the pairs of equal parity, read in ``H``, form a starter of ``H`` or a translate of one,
    and so do the mixed pairs: the even starter is two starters of ``H`` merged, the
    construction of the published perfect one-factorizations of ``K_52`` and ``K_56``
    (docs/factorization-search.md).

    Parameters
    ----------
    base : str
        Name of the odd-order abelian group ``H`` (as :func:`twin_group` reads it).
    starter : sequence of pairs
        The pairs ``(x, y)`` of codes of ``Z_2 × H``.

    Returns
    -------
    bool
        False also for anything that is not an even starter (kept points).

    Examples
    --------
    >>> is_merged_starter("Z_5", [(1, 5), (2, 9), (4, 7), (6, 8)])
    True
    """
    if not is_twin_starter(base, starter):
        return False
    seen: set[tuple[int, bool]] = set()
    for a, b in _pairs(starter):
        mixed = (a - b) % 2 == 1
        for h in (a // 2, b // 2):
            if (h, mixed) in seen:
                return False
            seen.add((h, mixed))
    return True


def multiplier_choices(base: str, missing: int) -> list[tuple[int, int]]:
    """``(order, u)``: one generator ``u`` per cyclic subgroup of the units of ``H`` whose
    multipliers fix ``missing``, largest subgroups first (``(1, 1)``, no multiplier, last).

    Parameters
    ----------
    base : str
        The name of ``H``, an abelian group of odd order (as
        :func:`~scheduler.factorization.groups.group_from_name` reads it).
    missing : int
        The missing element's code; a multiplier must fix it.

    Returns
    -------
    list of tuple of (int, int)
        ``(order of the subgroup, generator u)``, largest first, ``(1, 1)`` last.

    Examples
    --------
    >>> multiplier_choices("Z_5", 3)
    [(1, 1)]
    """
    G = twin_group(base)
    seen: set[frozenset[int]] = set()
    out = []
    for u in G.base.units():
        if int(G.multiplier(u)[missing]) != missing:
            continue
        sub, x = set(), u
        while True:
            sub.add(x)
            x = int(G.base.mul[x, u])
            if x == u:
                break
        if frozenset(sub) not in seen:
            seen.add(frozenset(sub))
            out.append((len(sub), u))
    out.sort(key=lambda t: (-t[0], t[1]))
    return out


def search_task(order: int, space: str, seed: int, budget: float) -> dict:
    """One independent restart, for a process pool or a distributed engine (picklable, plain
    arguments and result): search the space named ``space`` (:func:`parse_space`) for a
    perfect one-factorization of ``K_order`` for ``budget`` seconds with ``seed``. Returns a
    JSON-ready dict (``found``, ``starter``, ``nodes``, ``seconds``, ``exhausted``, ...).
    A space with a multiplier or a matrix is searched exhaustively (plain depth-first runs
    with doubling node limits), the others by capped random restarts.

    Parameters
    ----------
    order : int
        The order ``n`` of ``K_n``; must be ``2 |H| + 2`` of the space.
    space : str
        The space's name (:func:`space_name`).
    seed : int
        The restart's seed.
    budget : float
        Seconds of wall time.

    Returns
    -------
    dict
        ``order``, ``space``, ``seed``, ``found``, ``exhausted``, ``runs``, ``nodes``,
        ``seconds`` and ``starter`` (a list of pairs, or None).

    Raises
    ------
    InputError
        For an unknown space or one of another order.
    """
    base, swapped, missing, symmetry, merged, flip = parse_space(space)
    G = twin_group(base)
    if G.order + 2 != order:
        raise InputError(f"space {space!r} gives K_{G.order + 2}, not K_{order}",
                         location="space")
    matrix = symmetry if isinstance(symmetry, tuple) else None
    multiplier = symmetry if isinstance(symmetry, int) else 1
    res = search_perfect_twin_starter(base, missing, swapped=swapped, multiplier=multiplier,
                                      matrix=matrix, flip=flip, merged=merged, seed=seed,
                                      budget=budget,
                                      exhaustive=matrix is not None or multiplier != 1)
    return {"order": order, "space": space, "seed": seed, "found": res.found,
            "exhausted": res.exhausted, "runs": res.runs, "nodes": res.nodes,
            "seconds": round(res.seconds, 3),
            "starter": [list(p) for p in res.starter] if res.starter else None}


def space_name(base: str, *, swapped: bool, missing: int, multiplier: int = 1,
               matrix: Matrix | None = None, flip: bool = False, merged: bool = False) -> str:
    """``"Z_2 x <H> | <kind> | m=<m> | u=<u>"`` (or ``A=<rows>`` for a matrix; ``+m`` after it
    for a flip), read back by :func:`parse_space`; the kind is ``kept``, ``swapped`` or
    ``merged`` (kept points, merged class).

    Parameters
    ----------
    base : str
        The name of ``H``, an abelian group of odd order (as
        :func:`~scheduler.factorization.groups.group_from_name` reads it).
    swapped : bool
        True for the swapped points.
    missing : int
        The missing element's code.
    multiplier : int, optional
        A unit ``u`` of ``H``'s ring; the starter must be invariant under ``(b, h) -> (b, u h)``
        (1: no multiplier).
    matrix : tuple of tuple of int or None, optional
        An automorphism ``A`` of ``H`` as a matrix on its cyclic factors; the starter must be
        invariant under ``(b, h) -> (b, A h)``
        (:mod:`scheduler.factorization.linear_symmetries`; not together with a multiplier).
    flip : bool, optional
        The symmetry also translates by the missing element: ``x -> α x + m`` (``α`` the
        multiplier or matrix, which must then negate ``m``), exchanging the two points at
        infinity (module docstring, "Flip symmetries").
    merged : bool, optional
        The merged class (:func:`is_merged_starter`; kept points only).

    Returns
    -------
    str
        The space's name.

    Raises
    ------
    InputError
        For a merged class with swapped points.

    Examples
    --------
    >>> space_name("Z_25", swapped=False, missing=3, multiplier=7)
    'Z_2 x Z_25 | kept | m=3 | u=7'
    >>> space_name("Z_5 x Z_5", swapped=False, missing=13, matrix=((0, 1), (1, 0)), merged=True)
    'Z_2 x Z_5 x Z_5 | merged | m=13 | A=[[0,1],[1,0]]'
    """
    if merged and swapped:
        raise InputError("the merged class is searched with the points kept", location="space")
    kind = "swapped" if swapped else "merged" if merged else "kept"
    plus = "+m" if flip else ""
    if matrix is not None:
        rows = ",".join("[" + ",".join(str(int(v)) for v in row) + "]" for row in matrix)
        return f"Z_2 x {base} | {kind} | m={missing} | A=[{rows}]{plus}"
    return f"Z_2 x {base} | {kind} | m={missing} | u={multiplier}{plus}"


def parse_space(space: str) -> tuple[str, bool, int, int | Matrix, bool, bool]:
    """``(base, swapped, missing, symmetry, merged, flip)`` from a :func:`space_name` string;
    the symmetry is the multiplier ``u`` (an int, 1 for none) or the matrix (a tuple of rows).

    Parameters
    ----------
    space : str
        A name made by :func:`space_name`.

    Returns
    -------
    tuple of (str, bool, int, int or Matrix, bool, bool)
        ``(base, swapped, missing, symmetry, merged, flip)``.

    Raises
    ------
    InputError
        For text that is not such a name.

    Examples
    --------
    >>> parse_space("Z_2 x Z_25 | kept | m=3 | u=7")
    ('Z_25', False, 3, 7, False, False)
    >>> parse_space("Z_2 x Z_27 | merged | m=2 | u=1")
    ('Z_27', False, 2, 1, True, False)
    >>> parse_space("Z_2 x Z_5 x Z_5 | merged | m=13 | A=[[0,1],[1,0]]")
    ('Z_5 x Z_5', False, 13, ((0, 1), (1, 0)), True, False)
    >>> parse_space("Z_2 x Z_5 x Z_5 | kept | m=11 | A=[[1,0],[0,4]]+m")[3:]
    (((1, 0), (0, 4)), False, True)
    """
    try:
        group, kind, mis, sym = (part.strip() for part in space.split("|"))
        if not group.startswith("Z_2 x ") or kind not in ("kept", "swapped", "merged"):
            raise ValueError(space)
        symmetry: int | Matrix
        flip = sym.endswith("+m")
        sym = sym.removesuffix("+m")
        if sym.startswith("A="):
            rows = json.loads(sym.removeprefix("A="))
            if not isinstance(rows, list) or not all(
                    isinstance(row, list) and all(isinstance(v, int) for v in row)
                    for row in rows):
                raise ValueError(space)
            symmetry = tuple(tuple(row) for row in rows)
        else:
            symmetry = int(sym.removeprefix("u="))
        return (group[len("Z_2 x "):], kind == "swapped", int(mis.removeprefix("m=")),
                symmetry, kind == "merged", flip)
    except ValueError:
        raise InputError(f"unknown search space {space!r}", location="space") from None
