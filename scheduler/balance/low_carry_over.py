"""Single round robins with a low carry-over effects value, so that the planner never takes the
worst one without knowing.

Carry-over (K. G. Russell, Biometrika 67 (1980) 127-131): ``c[i][j]`` counts the teams that meet
``i`` in some round and ``j`` in the next, the last round followed by the first; the value is
``COE = Σ c[i][j]²`` with ``n(n-1) <= COE <= (n-1)(n² - 6n + 12)`` for ``n`` even, the upper
value being the circle method's (Lambrechts, Ficker, Goossens & Spieksma, Math. Programming 172
(2018) 277-302; the closed form is re-checked in ``tests/fairness``).

Search (:func:`search_low_carry_over`): simulated annealing (Kirkpatrick, Gelatt & Vecchi,
Science 220 (1983) 671-680) over

* the round order (swap two rounds, move one round elsewhere), and, when allowed,
* the one-factorization itself by *Kempe moves*: in the union of two rounds (a set of even
  cycles) swap the games of one cycle between the two rounds; the result is again a
  one-factorization (a move used for one-factorizations since Dinitz & Stinson's hill climbing,
  SIAM J. Alg. Disc. Meth. 8 (1987), from memory; tabu searches for carry-over also change
  the schedule this way: D. Kidd, ORiON 26 (2010), from memory).

A perfect one-factorization keeps its mixing only under order moves, so
:func:`search_low_carry_over` with ``change_pairings=False`` keeps the factorization. The number
of moves is fixed (``moves``), the generator seeded: the result is deterministic. For ``n`` a
power of two :func:`best_low_carry_over` starts from Russell's balanced schedule
(:mod:`scheduler.factorization.russell`), which is optimal.
"""

from __future__ import annotations

import math
import random
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from scheduler.carry_over import carry_over_of_rounds, partner_table
from scheduler.errors import InputError
from scheduler.factorization.circle import circle_rounds
from scheduler.factorization.model import normalise_round


@dataclass(frozen=True)
class CarryOverResult:
    """A single round robin and its carry-over effects value.

    Parameters
    ----------
    rounds
        The rounds in playing order (games of vertices).
    value
        Its carry-over effects value (Russell 1980).
    lower, upper
        Russell's lower bound ``n(n-1)`` and the circle method's value, the maximum.
    method
        How the schedule was made.
    """

    rounds: tuple[tuple[tuple[int, int], ...], ...]
    value: int
    lower: int
    upper: int
    method: str

    @property
    def position(self) -> float:
        """Where the value sits between the bounds: 0 at the lower bound, 1 at the upper."""
        return (self.value - self.lower) / max(1, self.upper - self.lower)


def carry_over_bounds(n: int) -> tuple[int, int]:
    """Russell's lower bound and the circle method's value, the maximum (Lambrechts et al. 2018).

    Parameters
    ----------
    n
        Even number of teams (a bye counted as a team).

    Returns
    -------
    tuple of int
        ``(n(n-1), (n-1)(n² - 6n + 12))``.

    Examples
    --------
    >>> carry_over_bounds(16)
    (240, 2580)
    """
    return n * (n - 1), (n - 1) * (n * n - 6 * n + 12)


def carry_over_value(rounds: Sequence[Sequence[tuple[int, int]]], n: int) -> int:
    """Russell's value of the rounds in the given order (cyclic), by the project's one
    carry-over count (:func:`scheduler.carry_over.carry_over_of_rounds`).

    Parameters
    ----------
    rounds
        The rounds in playing order.
    n
        Number of vertices.

    Returns
    -------
    int
        The carry-over effects value.
    """
    return carry_over_of_rounds(rounds, n)


class _State:
    """Partner table in playing order with the carry-over counts kept up to date."""

    def __init__(self, table: np.ndarray) -> None:
        self.table = table.copy()
        self.R, self.n = table.shape
        nxt = np.roll(self.table, -1, axis=0)
        self.counts = np.bincount((self.table * self.n + nxt).ravel(),
                                  minlength=self.n * self.n).astype(np.int64)
        self.value = int((self.counts ** 2).sum())

    def _transition(self, q: int, sign: int) -> None:
        a = self.table[q]
        b = self.table[(q + 1) % self.R]
        keys = a * self.n + b
        c = self.counts
        for key in keys.tolist():
            old = c[key]
            c[key] = old + sign
            self.value += 2 * sign * old + 1
        return None

    def replace(self, positions: Sequence[int], rows: Sequence[np.ndarray]) -> None:
        """Put ``rows`` at ``positions``, updating the counts of the touched transitions."""
        touched = sorted({(p + d) % self.R for p in positions for d in (-1, 0)})
        for q in touched:
            self._transition(q, -1)
        for p, row in zip(positions, rows, strict=True):
            self.table[p] = row
        for q in touched:
            self._transition(q, +1)


def _kempe_rows(pi: np.ndarray, pj: np.ndarray, start: int) -> tuple[np.ndarray, np.ndarray]:
    """Swap between two rounds the games of the cycle of their union through ``start``."""
    a, b = pi.copy(), pj.copy()
    v = start
    cycle = []
    while True:
        w = int(pi[v])
        cycle.append((v, w))
        u = int(pj[w])
        cycle.append((w, u))
        v = u
        if v == start:
            break
    for k, (x, y) in enumerate(cycle):
        if k % 2 == 0:  # a game of round i moves to round j
            b[x], b[y] = y, x
        else:
            a[x], a[y] = y, x
    return a, b


def search_low_carry_over(rounds: Sequence[Sequence[tuple[int, int]]], n: int, *,
                          seed: int = 0, moves: int = 20_000, change_pairings: bool = True,
                          method: str = "") -> CarryOverResult:
    """Lower the carry-over effects value of a single round robin (module docstring).

    Parameters
    ----------
    rounds
        The ``n - 1`` rounds in a starting order.
    n
        Even number of vertices.
    seed
        Seed of the annealing.
    moves
        Number of moves tried (the work budget; no clock).
    change_pairings
        Allow Kempe moves (the factorization may change); ``False`` keeps it and only reorders.
    method
        Label of the starting schedule, kept in the result.

    Returns
    -------
    CarryOverResult
        The best schedule met, its value and the bounds.

    Raises
    ------
    InputError
        When ``n`` is odd or the rounds are not ``n - 1`` perfect matchings.

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> int(search_low_carry_over(circle_rounds(8), 8, moves=2000).value) < 196
    True

    References
    ----------
    K. G. Russell, Biometrika 67 (1980); Kirkpatrick, Gelatt & Vecchi, Science 220 (1983).
    """
    if n % 2 or n < 4 or len(rounds) != n - 1:
        raise InputError(f"a single round robin of K_{n} needs an even n >= 4 and n - 1 rounds",
                         location="rounds")
    state = _State(partner_table(rounds, n))
    rng = random.Random(seed)
    lower, upper = carry_over_bounds(n)
    best_value, best_table = state.value, state.table.copy()
    R = state.R
    t0, t1 = max(2.0, 0.02 * lower), 0.5
    for step in range(moves):
        if best_value == lower:
            break
        temp = t0 * (t1 / t0) ** (step / max(1, moves))
        before = state.value
        kind = rng.random()
        undo: tuple[tuple[int, ...], tuple[np.ndarray, ...]]
        if change_pairings and kind < 0.5:
            i, j = rng.sample(range(R), 2)
            old = (state.table[i].copy(), state.table[j].copy())
            new = _kempe_rows(state.table[i], state.table[j], rng.randrange(n))
            state.replace((i, j), new)
            undo = ((i, j), old)
        elif kind < 0.75 or R < 3:
            i, j = rng.sample(range(R), 2)
            old = (state.table[i].copy(), state.table[j].copy())
            state.replace((i, j), (old[1], old[0]))
            undo = ((i, j), old)
        else:
            i, j = sorted(rng.sample(range(R), 2))
            positions = list(range(i, j + 1))
            old_rows = [state.table[p].copy() for p in positions]
            rotated = old_rows[1:] + old_rows[:1] if rng.random() < 0.5 else \
                old_rows[-1:] + old_rows[:-1]
            state.replace(positions, rotated)
            undo = (tuple(positions), tuple(old_rows))
        delta = state.value - before
        if delta <= 0 or rng.random() < math.exp(-delta / temp):
            if state.value < best_value:
                best_value, best_table = state.value, state.table.copy()
        else:
            state.replace(undo[0], undo[1])
    out_rounds = tuple(
        normalise_round((v, int(row[v])) for v in range(n) if v < int(row[v]))
        for row in best_table
    )
    return CarryOverResult(out_rounds, best_value, lower, upper, method)


def best_low_carry_over(n: int, *, seed: int = 0, moves: int = 20_000,
                        start: Sequence[Sequence[tuple[int, int]]] | None = None,
                        change_pairings: bool = True) -> CarryOverResult:
    """A low-carry-over single round robin of ``n`` (even) vertices.

    ``n`` a power of two: Russell's balanced schedule (value ``n(n-1)``, optimal). Otherwise
    :func:`search_low_carry_over` from ``start`` (default: the circle method, the worst), with
    Kempe moves unless ``change_pairings`` is false.

    Parameters
    ----------
    n
        Even number of vertices (an odd league adds its bye vertex first).
    seed, moves, change_pairings
        As for :func:`search_low_carry_over`.
    start
        Starting rounds in order (for instance a perfect factorization, with
        ``change_pairings=False`` to keep it perfect).

    Returns
    -------
    CarryOverResult

    Raises
    ------
    InputError
        For an odd ``n`` or ``n < 4``.

    Examples
    --------
    >>> best_low_carry_over(16).value
    240

    References
    ----------
    K. G. Russell, Biometrika 67 (1980) 127-131.
    """
    if isinstance(n, bool) or not isinstance(n, int) or n < 4 or n % 2:
        raise InputError(f"low carry-over needs an even n >= 4, got {n!r}", location="n")
    if start is None and n & (n - 1) == 0:
        from scheduler.factorization.russell import russell_rounds

        balanced = russell_rounds(n)
        lower, upper = carry_over_bounds(n)
        return CarryOverResult(balanced, carry_over_value(balanced, n), lower, upper,
                               f"Russell GF({n})")
    rounds: Sequence[Sequence[tuple[int, int]]] = (
        tuple(start) if start is not None else circle_rounds(n))
    label = "given start" if start is not None else f"circle GK_{n}"
    how = "order and Kempe" if change_pairings else "order"
    return search_low_carry_over(rounds, n, seed=seed, moves=moves,
                                 change_pairings=change_pairings,
                                 method=f"{label}, {how} annealing, seed {seed}, {moves} moves")
