"""Many perfect one-factorizations of one order, up to isomorphism where cheap.

The break minimum of a single round robin depends on the one-factorization (not on the team
labels), so the break-aware choice (:mod:`scheduler.balance.perfect_breaks`) needs many of
them. :func:`perfect_family` gathers, for ``K_n``:

* the closed constructions when they are perfect: the circle GK_n (``n - 1`` prime; Kotzig
  1964) and Anderson's GA_n (``n / 2`` prime; B. A. Anderson, J. Combin. Theory B 14 (1973));
* the shipped catalogue entries (:mod:`scheduler.factorization.catalogue`);
* every perfect starter of every group of order ``n - 1`` listed by
  :func:`~scheduler.factorization.groups.groups_of_order` (exhaustive enumeration,
  :func:`~scheduler.factorization.starters.enumerate_starters`, up to order
  :data:`EXHAUSTIVE_MAX_ORDER`), one per multiplier orbit: a multiplier ``x -> u x`` maps the
  starter ``S`` to ``uS`` and the factorization it induces to an isomorphic one (the map fixes
  ``∞`` and sends ``F_g`` to ``F_{ug}``);
* above that order, perfect starters found by the seeded starter search
  (:func:`~scheduler.factorization.search.search_perfect_starter`), several seeds and
  multipliers;
* perfect even starters in ``Z_{n-2}`` (:mod:`scheduler.factorization.even_starters`;
  B. A. Anderson 1974, from memory): all of them up to ``n - 2 =``
  :data:`EVEN_EXHAUSTIVE_MAX`, else found by the seeded search;
* perfect one-factorizations with a prescribed automorphism of order ``k`` with ``r`` cycles and
  a fixed point, ``n - 1 = r k`` (:mod:`scheduler.factorization.orbit_factorizations`; the
  method of E. Seah & D. R. Stinson 1988, from memory), found by the seeded search.

Every search runs under a node limit (no clock), so the family depends only on ``n`` and the
seed.

Isomorphic duplicates are removed exactly by :func:`canonical_form` up to ``n =``
:data:`CANONICAL_MAX_N`, above by an invariant (:func:`triple_profile`): the cycle types of
``p_k ∘ p_j ∘ p_i`` over all ordered triples of rounds (``p_r`` the partner map of round ``r``).
Different profiles prove non-isomorphism; equal profiles are merged, which may merge two
non-isomorphic factorizations (a cheap filter, not a proof). (Chord lengths along the cycle
``F_i ∪ F_j`` were tried first and do not separate the perfect one-factorizations of K_16.)

:func:`canonical_form` (numba, imported lazily): every labelling that walks the Hamiltonian
cycle ``F_i ∪ F_j`` from a vertex ``v`` (first along ``F_i``) numbers the vertices ``0..n-1``;
the lexicographically least relabelled partner table over all ``(n-1)(n-2)n`` choices is a
canonical form (two perfect one-factorizations are isomorphic exactly when their forms are
equal), and the number of choices reaching it is the order of the automorphism group (the
group acts freely on the choices). Derived here; the same device as the "fix one pair of
factors to a standard Hamiltonian cycle" used in exhaustive enumerations of perfect
one-factorizations (J. H. Dinitz & P. Garnick, J. Combin. Des. 4 (1996), from memory).
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from scheduler.errors import InputError
from scheduler.factorization.anderson import anderson_factorization
from scheduler.factorization.catalogue import (
    catalogue_entries,
    entry_factorization,
    structured_entries,
    structured_factorization,
)
from scheduler.factorization.circle import circle_factorization
from scheduler.factorization.groups import AbelianGroup, groups_of_order
from scheduler.factorization.model import Factorization
from scheduler.factorization.starters import (
    enumerate_starters,
    is_perfect_starter,
    starter_factorization,
)
from scheduler.factorization.verify import partner_table, verify_rounds

EXHAUSTIVE_MAX_ORDER = 19
"""Groups up to this order have all their starters enumerated (Z_19: 25 905, OEIS A006204)."""

EVEN_EXHAUSTIVE_MAX = 16
"""Even starters of ``Z_M`` are enumerated exhaustively up to this ``M``."""

CANONICAL_MAX_N = 20
"""Up to this order duplicates are removed by the exact canonical form."""

SEARCH_NODES = 400_000
"""Node limit of one seeded search (starters, even starters, orbit factorizations)."""


def _is_prime(k: int) -> bool:
    return k >= 2 and all(k % d for d in range(2, math.isqrt(k) + 1))


def triple_profile(rounds: Sequence[Sequence[tuple[int, int]]], n: int) -> tuple[int, ...]:
    """Isomorphism invariant (module docstring): the sorted cycle types of ``p_k ∘ p_j ∘ p_i``
    over all ordered triples of distinct rounds (``p_r`` the partner map of round ``r``;
    relabelling conjugates every product, which keeps its cycle type).

    Parameters
    ----------
    rounds
        The rounds of a one-factorization of ``K_n`` (games of vertices ``0..n-1``).
    n
        The even order.

    Returns
    -------
    tuple of int
        The cycle types, flattened in sorted order.

    Raises
    ------
    InputError
        When a round is not a perfect matching of ``0..n-1``.
    """
    partners = partner_table(n, rounds).astype(np.int64)
    R = partners.shape[0]
    types = []
    for i in range(R):
        for j in range(R):
            if j == i:
                continue
            pji = partners[j][partners[i]]
            for k in range(R):
                if k in (i, j):
                    continue
                perm = partners[k][pji].tolist()
                seen = [False] * n
                lengths = []
                for v in range(n):
                    if seen[v]:
                        continue
                    length = 0
                    while not seen[v]:
                        seen[v] = True
                        v = perm[v]
                        length += 1
                    lengths.append(length)
                types.append(tuple(sorted(lengths)))
    flat: list[int] = []
    for t in sorted(types):
        flat.extend((*t, 0))
    return tuple(flat)


def isomorphism_key(rounds: Sequence[Sequence[tuple[int, int]]], n: int) -> bytes | tuple[int, ...]:
    """Exact canonical form up to ``n =`` :data:`CANONICAL_MAX_N`, else :func:`triple_profile`.

    Parameters
    ----------
    rounds
        The rounds of a one-factorization of ``K_n`` (games of vertices ``0..n-1``).
    n
        The even order.

    Returns
    -------
    bytes or tuple of int
        Equal for isomorphic factorizations; for ``n <=`` :data:`CANONICAL_MAX_N` equal only for
        them.
    """
    if n <= CANONICAL_MAX_N:
        return canonical_form(rounds, n)[0]
    return triple_profile(rounds, n)


def _canon_kernel():
    import numba as nb

    @nb.njit(cache=True)
    def canon(partners):
        R, n = partners.shape
        best = np.full((R, n), n, dtype=np.int64)
        have = False
        ties = 0
        lab = np.empty(n, dtype=np.int64)
        inv = np.empty(n, dtype=np.int64)
        row_of = np.empty(R, dtype=np.int64)
        cand = np.empty((R, n), dtype=np.int64)
        for i in range(R):
            for j in range(R):
                if i == j:
                    continue
                for v0 in range(n):
                    v = v0
                    q = 0
                    while True:
                        lab[v] = q
                        inv[q] = v
                        w = partners[i, v]
                        lab[w] = q + 1
                        inv[q + 1] = w
                        q += 2
                        v = partners[j, w]
                        if v == v0:
                            break
                    if q != n:
                        continue
                    for f in range(R):
                        row_of[lab[partners[f, v0]] - 1] = f
                    # compare row by row, building only as far as needed
                    state = 0 if have else -1  # -1 smaller, 0 equal so far, 1 larger
                    for L in range(R):
                        f = row_of[L]
                        for u in range(n):
                            cand[L, u] = lab[partners[f, inv[u]]]
                        if state == 0:
                            for u in range(n):
                                if cand[L, u] != best[L, u]:
                                    state = -1 if cand[L, u] < best[L, u] else 1
                                    break
                            if state == 1:
                                break
                    if state == 1:
                        continue
                    if state == 0:
                        ties += 1
                        continue
                    best[:, :] = cand
                    have = True
                    ties = 1
        return best, ties

    return canon


_CANON = None


def canonical_form(rounds: Sequence[Sequence[tuple[int, int]]], n: int) -> tuple[bytes, int]:
    """Canonical form and automorphism-group order of a perfect one-factorization of ``K_n``.

    Parameters
    ----------
    rounds
        The ``n - 1`` rounds (games of vertices ``0..n-1``).
    n
        Even order.

    Returns
    -------
    tuple
        ``(form, automorphisms)``: equal forms exactly for isomorphic factorizations.

    Raises
    ------
    InputError
        When the rounds are not perfect matchings, or the factorization is not perfect.

    References
    ----------
    Module docstring (derived here).

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> canonical_form(circle_rounds(6), 6)[1]
    120
    """
    global _CANON
    partners = partner_table(n, rounds).astype(np.int64)
    if partners.shape[0] != n - 1:
        raise InputError(f"K_{n} needs {n - 1} rounds", location="rounds")
    if not verify_rounds(n, rounds).perfect:
        raise InputError("the canonical form needs a perfect one-factorization",
                         location="rounds")
    if _CANON is None:
        _CANON = _canon_kernel()
    best, ties = _CANON(partners)
    if ties == 0 or int(best.max()) >= n:
        raise InputError("the canonical form needs a perfect one-factorization",
                         location="rounds")
    return best.astype(np.int8).tobytes(), int(ties)


@dataclass(frozen=True)
class FamilyMember:
    """One perfect one-factorization of the family, with where it came from and its invariant
    or canonical form (``key``).

    Parameters
    ----------
    factorization : Factorization
        A perfect one-factorization of ``K_n``.
    origin : str
        The construction or search that gave it, in words.
    key : bytes or tuple of int
        Its canonical form (exact isomorphism class) up to :data:`CANONICAL_MAX_N`, above that
        its invariant (:func:`triple_profile`); two members never share a key.
    """

    factorization: Factorization
    origin: str
    key: bytes | tuple[int, ...]


def _starter_members(group: AbelianGroup, exhaustive: bool, seed: int, tries: int):
    """Perfect starters of ``group``: one per multiplier orbit (exhaustive), else found by the
    seeded search with ``tries`` (seed, multiplier) combinations."""
    out = []
    if exhaustive:
        units = group.units()
        seen: set[tuple] = set()
        for starter in enumerate_starters(group):
            key = tuple(sorted(tuple(sorted(p)) for p in starter))
            if key in seen or not is_perfect_starter(group, starter):
                continue
            for u in units:
                image = tuple(sorted(tuple(sorted((int(group.mul[u, a]), int(group.mul[u, b]))))
                                     for a, b in starter))
                seen.add(image)
            out.append((starter, f"perfect starter in {group.name} (exhaustive, "
                                 f"one per multiplier orbit)"))
        return out
    from scheduler.factorization.search import search_perfect_starter

    units = [u for u in group.units() if u not in (1, int(group.neg[1]))]
    multipliers = [1, *units]
    found: set[tuple] = set()
    for k in range(tries):
        mult = multipliers[k % len(multipliers)] if k else 1
        try:
            res = search_perfect_starter(group, seed=seed + k, multiplier=mult, budget=600.0,
                                         max_nodes=SEARCH_NODES)
        except InputError:
            continue
        if res.starter is None:
            continue
        key = tuple(sorted(res.starter))
        if key in found:
            continue
        found.add(key)
        out.append((res.starter, f"perfect starter in {group.name} (search, seed {seed + k}, "
                                 f"multiplier {mult})"))
    return out


def _even_members(M: int, seed: int, tries: int):
    from scheduler.factorization.even_starters import (
        enumerate_even_starters,
        even_starter_factorization,
        is_perfect_even_starter,
        search_perfect_even_starter,
    )

    out = []
    if M <= EVEN_EXHAUSTIVE_MAX:
        for starter in enumerate_even_starters(M):
            if is_perfect_even_starter(M, starter):
                out.append((even_starter_factorization(M, starter),
                            f"perfect even starter in Z_{M} (exhaustive)"))
        return out
    seen: set[tuple] = set()
    for k in range(tries):
        res = search_perfect_even_starter(M, seed=seed + k, budget=600.0, max_nodes=SEARCH_NODES)
        if res.starter is None or tuple(res.starter) in seen:
            continue
        seen.add(tuple(res.starter))
        out.append((even_starter_factorization(M, res.starter),
                    f"perfect even starter in Z_{M} (search, seed {seed + k})"))
    return out


def _orbit_members(n: int, seed: int, tries: int):
    from scheduler.factorization.orbit_factorizations import (
        orbit_factorization,
        search_perfect_orbit_factorization,
    )

    out = []
    m = n - 1
    for k in range(3, m, 2):
        if m % k or m // k < 2:
            continue
        r = m // k
        seen: set[tuple] = set()
        for t in range(tries):
            res = search_perfect_orbit_factorization(r, k, seed=seed + t, budget=600.0,
                                                     max_nodes=SEARCH_NODES)
            if res.base is None or res.base in seen:
                if res.exhausted:
                    break
                continue
            seen.add(res.base)
            out.append((orbit_factorization(r, k, res.base),
                        f"perfect, automorphism of order {k} with {r} cycles (search, seed "
                        f"{seed + t})"))
    return out


def perfect_family(n: int, *, seed: int = 0, search_tries: int = 12,
                   limit: int = 64) -> tuple[FamilyMember, ...]:
    """Perfect one-factorizations of ``K_n`` from every source of the module docstring,
    isomorphic duplicates removed (:func:`isomorphism_key`), at most ``limit`` of them.

    Parameters
    ----------
    n
        Even order, at least 4.
    seed
        Seed of the starter searches (orders above :data:`EXHAUSTIVE_MAX_ORDER` + 1).
    search_tries
        (seed, multiplier) combinations tried per group by the search.
    limit
        Largest number of members returned (first found first).

    Returns
    -------
    tuple of FamilyMember
        Each verified perfect by :func:`~scheduler.factorization.verify.verify_rounds`.

    Raises
    ------
    InputError
        For an odd or too small ``n``.

    References
    ----------
    Module docstring.

    Examples
    --------
    >>> [m.origin.split(" (")[0] for m in perfect_family(12)]
    ['circle GK_12', 'perfect starter in Z_11', 'perfect even starter in Z_10']
    """
    if isinstance(n, bool) or not isinstance(n, int) or n < 4 or n % 2:
        raise InputError(f"a perfect family needs an even n >= 4, got {n!r}", location="n")
    m = n - 1
    raw: list[tuple[Factorization, str]] = []
    if _is_prime(m):
        raw.append((circle_factorization(n), f"circle GK_{n}"))
    if _is_prime(n // 2) and n >= 6:
        raw.append((anderson_factorization(n), f"Anderson GA_{n}"))
    for entry in catalogue_entries():
        if entry.n == n:
            raw.append((entry_factorization(entry), f"catalogue {entry.group}"))
    for structured in structured_entries():
        if structured.n == n:
            raw.append((structured_factorization(structured), f"catalogue {structured.kind}"))
    for group in groups_of_order(m):
        exhaustive = m <= EXHAUSTIVE_MAX_ORDER
        for starter, origin in _starter_members(group, exhaustive, seed, search_tries):
            raw.append((starter_factorization(group, starter), origin))
    if n >= 8:
        raw += _even_members(n - 2, seed, search_tries)
        raw += _orbit_members(n, seed, search_tries)
    members: list[FamilyMember] = []
    keys: set[bytes | tuple[int, ...]] = set()
    for fact, origin in raw:
        cert = verify_rounds(n, fact.rounds)
        if not cert.perfect:
            continue
        key = isomorphism_key(fact.rounds, n)
        if key in keys:
            continue
        keys.add(key)
        members.append(FamilyMember(fact, origin, key))
        if len(members) >= limit:
            break
    return tuple(members)

