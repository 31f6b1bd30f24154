"""Carry-over effects (K. G. Russell, "Balancing carry-over effects in round robin
tournaments", Biometrika 67 (1980) 127-131).

With ``opp(t, r)`` the opponent of team ``t`` in round ``r`` of a single round robin with
rounds ``1..m``, the carry-over matrix is

    c_ij = #{(t, r) : opp(t, r) = i and opp(t, r + 1) = j},   r = 1..m, round m + 1 = round 1,

i.e. the last round wraps cyclically to the first (Russell's convention, kept by the later
literature; only with it can the balanced value be reached). Then sum c_ij = n(n-1) and the
carry-over effects value is ``COE = sum c_ij^2``, with

* lower bound n(n-1) (every off-diagonal c_ij = 1; reached for n a power of two, Russell 1980);
* upper bound (n-1)(n^2-6n+12), the value of the circle method, which has maximum carry-over
  (Lambrechts, Ficker, Goossens & Spieksma, Mathematical Programming 172 (2018) 277-302; the
  closed form was computed for the project notes and is re-checked in the tests, n = 4..20).

What is computed here (see :data:`CONVENTION`): each leg is treated as its own single round
robin over its rounds in season order. The headline value is leg 1's. An odd league gets a bye
vertex (labelled ``"bye"``, as the engine's dummy team): a team sitting out "meets" the bye, and
the bye meets the team sitting out, so the leg is a single round robin of n + 1 and the bounds
are those of n + 1. A team with no opponent in a round (an invalid season) contributes no
term for the two transitions touching that round.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from scheduler.carry_over import carry_over_matrix, carry_over_value
from scheduler.fairness.legs import partner_rows
from scheduler.fairness.table import SeasonTable

CONVENTION = (
    "Russell 1980: c_ij = #{(t,r): opp(t,r)=i, opp(t,r+1)=j}, computed over the rounds of "
    "leg 1 as one single round robin, its last round wrapping cyclically to its first; later "
    "legs are computed the same way on their own (carry_over_per_leg); an odd league adds a "
    "bye vertex 'bye' (the team sitting out meets it), so n counts the bye in the bounds"
)


@dataclass(frozen=True)
class CarryOverFigures:
    """Carry-over figures of a season (see :func:`carry_over_figures`).

    Parameters
    ----------
    labels
        Row and column labels of ``matrix``: the teams in table order, then ``"bye"`` for an
        odd league.
    matrix
        Russell's carry-over matrix of leg 1 (``c[i, j]``: how often a team meets ``j`` right
        after ``i``, the last round wrapping to the first).
    value
        The carry-over effects value of leg 1, the sum of the squared entries; ``None`` when
        it cannot be computed (no complete leg).
    lower
        Russell's lower bound ``n (n - 1)`` (``n`` counts the bye), or ``None``.
    upper
        The circle method's value ``(n - 1)(n^2 - 6n + 12)``, the largest possible, or ``None``.
    per_leg
        The value of each leg computed on its own (``None`` where not computable).

    References
    ----------
    K. G. Russell, Biometrika 67 (1980) 127-131; ``docs/carry-over.md``.
    """

    labels: tuple[str, ...]
    matrix: np.ndarray
    value: int | None
    lower: int | None
    upper: int | None
    per_leg: tuple[int | None, ...]


def coe_bounds(n: int) -> tuple[int, int]:
    """Russell's lower bound n(n-1) and the circle method's maximum (n-1)(n^2-6n+12).

    Parameters
    ----------
    n
        Number of teams of the single round robin, even (an odd league counts its bye).

    Returns
    -------
    tuple of (int, int)
        (lower bound, upper bound) of the carry-over effects value.

    References
    ----------
    K. G. Russell, Biometrika 67 (1980) 127-131; R. Lambrechts, A. Ficker, D. Goossens and
    F. Spieksma, Mathematical Programming 172 (2018) 277-302; ``docs/carry-over.md``.

    Examples
    --------
    >>> coe_bounds(4), coe_bounds(6)
    ((12, 12), (30, 60))
    """
    return n * (n - 1), (n - 1) * (n * n - 6 * n + 12)


def carry_over_figures(table: SeasonTable, round_leg: np.ndarray, legs: int) -> CarryOverFigures:
    """Carry-over matrix and value of leg 1 (and of every later leg on its own), with the bounds.

    Parameters
    ----------
    table
        The indexed season.
    round_leg
        The leg of each round (:func:`scheduler.fairness.legs.detect_legs`).
    legs
        The number of legs.

    Returns
    -------
    CarryOverFigures
        Labels, matrix, values and bounds.

    References
    ----------
    K. G. Russell, Biometrika 67 (1980) 127-131; ``docs/carry-over.md``.
    """
    rows, big_n = partner_rows(table)
    labels = table.names + (("bye",) if big_n != table.n else ())
    per_leg: list[int | None] = []
    first_matrix = np.zeros((big_n, big_n), dtype=np.int64)
    for leg in range(1, max(legs, 1) + 1):
        chosen = np.flatnonzero(round_leg == leg)
        if len(chosen) == 0:
            per_leg.append(None)
            continue
        matrix = carry_over_matrix(rows[chosen])
        if leg == 1:
            first_matrix = matrix
        per_leg.append(carry_over_value(matrix))
    value = per_leg[0] if per_leg else None
    # The bounds are stated for leagues of at least 4 (with the bye vertex).
    lower, upper = coe_bounds(big_n) if big_n >= 4 else (None, None)
    return CarryOverFigures(labels, first_matrix, value, lower, upper, tuple(per_leg))
