"""Russell's balanced-carry-over single round robin for ``n`` a power of two.

Label the ``n = 2^k`` teams with the elements of the field ``GF(2^k)`` (codes ``0..n-1``, the
bits of a code being the coefficients of a polynomial over ``GF(2)``) and let ``α`` be a
primitive element. Round ``r = 0..n-2`` pairs ``{x, x + α^r}`` for every ``x`` (``+`` is the
bitwise exclusive or). Every non-zero difference ``α^r`` occurs in exactly one round, so this is
a one-factorization of ``K_n``, and the rounds must be played in this order: team ``t`` meets
``i = t + α^r`` and then ``t + α^(r+1) = i + α^r (1 + α)``, so ``i`` passes a carry-over to
``j`` exactly when ``j - i = α^r (1 + α)``; as ``r`` runs over all ``n - 1`` rounds (cyclically)
that difference takes every non-zero value once, so every off-diagonal entry of the carry-over
matrix is 1 and the carry-over effects value is ``n(n-1)``, the least possible.

Reference: K. G. Russell, "Balancing carry-over effects in round robin tournaments",
Biometrika 67 (1980) 127-131 (the balanced schedules for ``n`` a power of two; that this is his
exact form is from memory; the argument above is re-derived and the value is re-checked by the
tests with the independent carry-over count of :mod:`scheduler.fairness.carryover`).
Finite-field arithmetic: R. Lidl & H. Niederreiter, *Finite Fields*, Cambridge University Press
1997, ch. 2.
"""

from __future__ import annotations

import itertools

from scheduler.errors import InputError
from scheduler.factorization.model import Factorization, normalise_round

SOURCE = ("K. G. Russell, Biometrika 67 (1980) 127-131: balanced carry-over effects for n a "
          "power of two (field GF(2^k), round r pairs x with x + a^r)")

MAX_N = 1024


def _degree(n: int) -> int:
    if isinstance(n, bool) or not isinstance(n, int) or n < 4 or n > MAX_N or n & (n - 1):
        raise InputError(f"Russell's schedule needs a power of two 4 <= n <= {MAX_N}, got {n!r}",
                         location="n")
    return n.bit_length() - 1


def _times_x(value: int, k: int, poly: int) -> int:
    """Multiply by ``x`` in ``GF(2)[x] / (x^k + poly)`` (``poly`` the lower coefficients)."""
    value <<= 1
    if value >> k:
        value ^= (1 << k) | poly
    return value


def primitive_powers(n: int) -> tuple[int, tuple[int, ...]]:
    """``(poly, powers)``: the lexicographically first ``poly`` (lower coefficients of a monic
    polynomial of degree ``k``, ``n = 2^k``) for which ``x`` is primitive, and the codes of
    ``α^0, ..., α^(n-2)`` with ``α = x``.

    Parameters
    ----------
    n : int
        A power of two, ``4 <= n <= 1024``.

    Returns
    -------
    poly : int
        The bits of the polynomial's lower coefficients (``x^k`` left out).
    powers : tuple of int
        The codes of ``α^0 .. α^(n-2)``, all non-zero codes once each.

    Raises
    ------
    InputError
        When ``n`` is not such a power of two.

    References
    ----------
    R. Lidl and H. Niederreiter, *Finite Fields*, Cambridge University Press 1997, ch. 2.

    Examples
    --------
    >>> primitive_powers(8)  # x^3 + x^2 + 1
    (5, (1, 2, 4, 5, 7, 3, 6))
    """
    k = _degree(n)
    for bits in itertools.product((0, 1), repeat=k):
        poly = sum(b << t for t, b in enumerate(bits))
        if not poly & 1:
            continue
        powers = [1]
        seen = {1}
        ok = True
        for _ in range(n - 2):
            nxt = _times_x(powers[-1], k, poly)
            if nxt in seen:
                ok = False
                break
            seen.add(nxt)
            powers.append(nxt)
        if ok and len(seen) == n - 1:
            return poly, tuple(powers)
    raise AssertionError(f"no primitive polynomial of degree {k}")  # pragma: no cover


def russell_rounds(n: int) -> tuple[tuple[tuple[int, int], ...], ...]:
    """The rounds in their playing order ``r = 0..n-2`` (module docstring).

    Parameters
    ----------
    n : int
        A power of two, ``4 <= n <= 1024``.

    Returns
    -------
    tuple of Round
        The ``n - 1`` rounds, in the order that gives every off-diagonal carry-over 1.

    Raises
    ------
    InputError
        When ``n`` is not such a power of two.

    References
    ----------
    K. G. Russell, Biometrika 67 (1980) 127-131; ``docs/carry-over.md``.

    Examples
    --------
    >>> russell_rounds(4)
    (((0, 1), (2, 3)), ((0, 2), (1, 3)), ((0, 3), (1, 2)))
    """
    _poly, powers = primitive_powers(n)
    rounds = []
    for power in powers:
        games = {(min(x, x ^ power), max(x, x ^ power)) for x in range(n)}
        rounds.append(normalise_round(games))
    return tuple(rounds)


def russell_factorization(n: int) -> Factorization:
    """Russell's balanced-carry-over single round robin of ``n = 2^k`` teams.

    Parameters
    ----------
    n
        A power of two, ``4 <= n <= 1024``.

    Returns
    -------
    Factorization
        Rounds in playing order; carry-over effects value ``n(n-1)`` in that order.

    Raises
    ------
    InputError
        When ``n`` is not a power of two in range.

    References
    ----------
    K. G. Russell, Biometrika 67 (1980) 127-131.

    Examples
    --------
    >>> len(russell_factorization(8).rounds)
    7
    """
    poly, _ = primitive_powers(n)
    return Factorization(n, russell_rounds(n), f"Russell GF({n}) balanced carry-over", SOURCE,
                         {"construction": "russell", "polynomial_low_bits": poly,
                          "keep_order": True})
