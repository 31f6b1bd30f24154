"""Round order and home/away with few breaks for a fixed one-factorization.

*Reformulation* (first-schedule-then-break, Elf, Jünger & Rinaldi 2003, Oper. Res. Letters
31:343-349, from memory; the colouring view below is derived here). Let ``s_q(v)`` be 1 when
vertex ``v`` is at home at position ``q`` of a single round robin and ``t_q = s_q xor (q mod 2)``.
Vertex ``v`` has a break at ``q`` (same venue at ``q - 1`` and ``q``) exactly when
``t_{q-1}(v) != t_q(v)``. Every ``t_q`` is a 2-colouring of the vertices in which each game of
the round at ``q`` joins two colours, and any such sequence of colourings is a home/away
assignment. So the fewest breaks for a fixed order is a shortest path through layers of
``2^(n/2)`` colourings, the cost of a step being the Hamming distance:

- exact for a fixed order by dynamic programming over the layers when ``n <= 16``;
- for larger ``n`` over *candidate* colourings: a step without breaks between the rounds ``r``
  and ``s`` needs a colouring that is proper for both, i.e. a bipartition of the union of the
  two matchings (for a perfect one-factorization one Hamiltonian cycle, so exactly two). The
  candidates of round ``r`` are those bipartitions for every other round ``s``; a round between
  two candidate rounds may also take its best response to both neighbours (computed game by
  game). This gives an upper bound for the order and an assignment reaching it.
- for larger ``n`` also a *beam* path (beam search, Lowerre 1976, from memory): each round
  keeps the best few colourings reached so far, extended by every best response to them (all
  of them when at most four games are monochromatic) and by the candidates. Good paths have
  long runs of 2-break steps through colourings that are not candidates (observed on the
  16-team catalogue factorization, where the exact path is known), which the beam follows.

Parity (derived here): when the union of two consecutive rounds is one Hamiltonian cycle, the
number of breaks between them is even (go round the cycle multiplying the colour products of its
edges), so a perfect one-factorization reaches ``n - 2`` only with steps of 0 and 2 breaks, as
the circle schedule on ``n - 1`` prime does.

Odd leagues (a bye vertex, byes skipped) use the exact path with every team's colour flipped
after its bye (:meth:`BreakPaths.flips`), so only ``n <= 16``.

*Order search*: simulated annealing (Kirkpatrick, Gelatt & Vecchi 1983, Science 220:671-680)
over the leg-1 order with swap, segment-reversal and insertion moves, each order scored by the
path value above. The generator is seeded and the number of evaluations is fixed by the work
budget (no clock), so the result is deterministic.
"""

from __future__ import annotations

import math
import random
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

EXACT_HALF = 8
"""Exact layer DP up to ``n / 2 = 8`` (256 colourings per round)."""

CALL_WORK = 20_000
"""Work units charged for the Python side of one evaluation (move, call, acceptance)."""

BEAM_WIDTH = 48
"""Colourings kept per round by the beam path."""

MAX_N = 62
"""Colourings are bit masks in an int64."""


def _kernel():
    """The numba kernels, imported on first use (only the search pays numba's import)."""
    from scheduler.balance import _order_kernel

    return _order_kernel


@dataclass(frozen=True)
class OrderResult:
    """A leg-1 round order, the venue of every game and its breaks in the single round robin.

    Parameters
    ----------
    order
        Factorization round indexes in playing order.
    home
        ``{(a, b): a is at home}`` for every game ``(a, b)`` as the factorization writes it
        (games with the bye vertex left out).
    breaks
        Breaks of the single round robin in that order with that assignment (byes skipped).
    """

    order: tuple[int, ...]
    home: dict[tuple[int, int], bool]
    breaks: int


class BreakPaths:
    """The colouring layers of one factorization and the path evaluator for round orders.

    Parameters
    ----------
    rounds
        The rounds of the factorization, each a list of games ``(a, b)`` over ``0 .. n - 1``.
    n
        Number of vertices, even and at most :data:`MAX_N`.
    bye
        The bye vertex of an odd league (exact path only, so ``n <= 16``), or ``None``.

    Raises
    ------
    ValueError
        An odd or too large ``n``, or a bye vertex with ``n > 16`` (the caller's mistake; the
        planner never asks for these).

    References
    ----------
    M. Elf, M. Jünger and G. Rinaldi, Operations Research Letters 31 (2003) 343-349 (from
    memory); ``docs/perfect-breaks.md``.
    """

    def __init__(
        self, rounds: Sequence[Sequence[tuple[int, int]]], n: int, bye: int | None = None
    ) -> None:
        if n % 2 or n > MAX_N:
            raise ValueError(f"colouring masks need an even n <= {MAX_N}, got {n}")
        if bye is not None and n // 2 > EXACT_HALF:
            raise ValueError(f"a bye vertex needs the exact path (n <= {2 * EXACT_HALF})")
        self.n = n
        self.bye = bye
        self.keep = ~(1 << bye) if bye is not None else -1
        self.bye_of = [0] * len(rounds)
        if bye is not None:
            for k, games in enumerate(rounds):
                for a, b in games:
                    if bye in (a, b):
                        self.bye_of[k] = a if b == bye else b
        self.round_count = len(rounds)
        self.rounds = [list(r) for r in rounds]
        half = n // 2
        self.first_vertex = np.array([[a for a, _ in r] for r in self.rounds], dtype=np.int64)
        self.second_vertex = np.array([[b for _, b in r] for r in self.rounds], dtype=np.int64)
        self.exact = half <= EXACT_HALF
        full = (1 << n) - 1
        cand = np.zeros((self.round_count, 2 * (self.round_count - 1)), dtype=np.int64)
        for r in range(self.round_count):
            row = []
            for s in range(self.round_count):
                if s != r:
                    m = self._bipartition(r, s)
                    row += [m, full ^ m]
            cand[r] = row
        self.cand = cand
        if self.exact:
            S = 1 << half
            masks = np.zeros((self.round_count, S), dtype=np.int64)
            for r in range(self.round_count):
                for x in range(S):
                    t = 0
                    for i in range(half):
                        t |= 1 << int(
                            self.first_vertex[r, i] if (x >> i) & 1 else self.second_vertex[r, i]
                        )
                    masks[r, x] = t
            self.layers = masks
        else:
            self.layers = cand
        self.width = BEAM_WIDTH
        cap = self.width * 16 + cand.shape[1]
        self._beam_masks = np.zeros((self.round_count, cap), dtype=np.int64)
        self._beam_values = np.zeros((self.round_count, cap), dtype=np.int64)
        self._beam_parents = np.zeros((self.round_count, cap), dtype=np.int64)
        self._beam_sizes = np.zeros(self.round_count, dtype=np.int64)
        S = self.layers.shape[1]
        self._back = np.zeros((self.round_count, S), dtype=np.int64)
        self._path_values = np.zeros((self.round_count, S), dtype=np.int64)
        self._kind = np.zeros((self.round_count, S), dtype=np.int64)

    @property
    def work(self) -> int:
        """Work units of one evaluation (inner-loop steps), for budgeting without a clock."""
        S = self.layers.shape[1]
        kernel = (
            self.round_count * S * S // 4 if self.exact else self.round_count * S * S * (self.n + 4)
        )
        return kernel + CALL_WORK

    def _bipartition(self, r: int, s: int) -> int:
        """A 2-colouring proper for rounds r and s (one colour class per cycle, as a mask)."""
        adj: dict[int, list[int]] = {v: [] for v in range(self.n)}
        for a, b in self.rounds[r] + self.rounds[s]:
            adj[a].append(b)
            adj[b].append(a)
        colour: dict[int, int] = {}
        for root in range(self.n):
            if root in colour:
                continue
            colour[root] = 1
            stack = [root]
            while stack:
                u = stack.pop()
                for w in adj[u]:
                    if w not in colour:
                        colour[w] = 1 - colour[u]
                        stack.append(w)
        return sum(1 << v for v in range(self.n) if colour[v])

    @property
    def beam_work(self) -> int:
        """Work units of one :meth:`beam` evaluation."""
        S = self.cand.shape[1]
        return self.round_count * self.width * (20 * self.n + 2 * S + 60) + CALL_WORK

    def _beam_path(self, order: Sequence[int]) -> tuple[int, int]:
        """The beam kernel on ``order``: (value, index of the best last state)."""
        return _kernel()._beam_path(
            self.cand,
            np.asarray(order, dtype=np.int64),
            self.first_vertex,
            self.second_vertex,
            self.width,
            self._beam_masks,
            self._beam_values,
            self._beam_parents,
            self._beam_sizes,
        )

    def beam(self, order: Sequence[int]) -> int:
        """Value of the beam path for ``order`` (an upper bound).

        Parameters
        ----------
        order
            Factorization round indexes in playing order.

        Returns
        -------
        int
            Breaks of the beam path: at least the fewest breaks of this order.
        """
        return int(self._beam_path(order)[0])

    def beam_colourings(self, order: Sequence[int]) -> tuple[int, list[int]]:
        """(value, colouring at every position) of the beam path for ``order``.

        Parameters
        ----------
        order
            Factorization round indexes in playing order.

        Returns
        -------
        tuple of (int, list of int)
            Breaks of the beam path and its colouring mask ``t_q`` at every position.
        """
        value, j = self._beam_path(order)
        t = [0] * self.round_count
        for q in range(self.round_count - 1, -1, -1):
            t[q] = int(self._beam_masks[q, j])
            j = int(self._beam_parents[q, j])
        return int(value), t

    def flips(self, order: Sequence[int]) -> np.ndarray:
        """Bye convention (byes skipped): vertex ``v`` with its bye at position ``p`` has a break
        across it when ``t_{p-1}(v) == t_{p+1}(v)``; flipping ``v``'s colour after ``p`` turns
        that into an ordinary step, the colour at ``p`` being free (its game is with the bye
        vertex, whose own colour is not counted).

        Parameters
        ----------
        order
            Factorization round indexes in playing order.

        Returns
        -------
        numpy.ndarray
            At every position, the mask of vertices whose bye came before it (all zero
            without a bye vertex).
        """
        out = np.zeros(len(order), dtype=np.int64)
        acc = 0
        for q, k in enumerate(order):
            out[q] = acc
            if self.bye is not None:
                acc |= 1 << self.bye_of[k]
        return out

    def value(self, order: Sequence[int]) -> int:
        """Breaks of the best path for ``order``: exact for ``n <= 16``, else the candidate
        path's (an upper bound).

        Parameters
        ----------
        order
            Factorization round indexes in playing order.

        Returns
        -------
        int
            The number of breaks.
        """
        o = np.asarray(order, dtype=np.int64)
        if self.exact:
            return int(_kernel()._exact_value(self.layers, o, self.flips(order), self.keep))
        return int(
            _kernel()._candidate_path(
                self.layers,
                o,
                self.first_vertex,
                self.second_vertex,
                self._path_values,
                self._back,
                self._kind,
            )[0]
        )

    def colourings(self, order: Sequence[int]) -> tuple[int, list[int]]:
        """(value, the colouring mask at every position) of the best path for ``order``.

        Parameters
        ----------
        order
            Factorization round indexes in playing order.

        Returns
        -------
        tuple of (int, list of int)
            Breaks of the path (as :meth:`value`) and its colouring mask at every position.
        """
        o = np.asarray(order, dtype=np.int64)
        R = self.round_count
        t = [0] * R
        if self.exact:
            value, y = _kernel()._exact_path(
                self.layers, o, self.flips(order), self.keep, self._back
            )
            for q in range(R - 1, -1, -1):
                t[q] = int(self.layers[o[q], y])
                if q:
                    y = int(self._back[q, y])
            return int(value), t
        value, y = _kernel()._candidate_path(
            self.layers,
            o,
            self.first_vertex,
            self.second_vertex,
            self._path_values,
            self._back,
            self._kind,
        )
        q = R - 1
        while q >= 0:
            t[q] = int(self.layers[o[q], y])
            if q == 0:
                break
            kind, x = int(self._kind[q, y]), int(self._back[q, y])
            if kind == 1:
                q, y = q - 1, x
            else:
                u = int(self.layers[o[q - 2], x])
                t[q - 1] = int(
                    _kernel()._free(u, t[q], self.first_vertex, self.second_vertex, int(o[q - 1]))[
                        1
                    ]
                )
                q, y = q - 2, x
        return int(value), t

    def assignment(self, order: Sequence[int]) -> OrderResult:
        """The home/away assignment of the best path for ``order`` (for ``n > 16`` the better
        of the candidate path and the beam path).

        Parameters
        ----------
        order
            Factorization round indexes in playing order.

        Returns
        -------
        OrderResult
            The order, the venue of every game and the breaks.
        """
        value, t = self.colourings(order)
        if not self.exact:
            bv, bt = self.beam_colourings(order)
            if bv < value:
                value, t = bv, bt
        home: dict[tuple[int, int], bool] = {}
        for q, k in enumerate(order):
            s = t[q] if q % 2 == 0 else ~t[q]
            for a, b in self.rounds[k]:
                if self.bye not in (a, b):
                    home[(a, b)] = bool((s >> a) & 1)
        return OrderResult(tuple(int(k) for k in order), home, value)


def _move(order: list[int], rng: random.Random) -> list[int]:
    """One neighbour: swap two rounds, reverse a segment or move one round elsewhere."""
    p = list(order)
    i, j = sorted(rng.sample(range(len(p)), 2))
    kind = rng.random()
    if kind < 1 / 3:
        p[i], p[j] = p[j], p[i]
    elif kind < 2 / 3:
        p[i : j + 1] = p[i : j + 1][::-1]
    elif rng.random() < 0.5:
        p.insert(j, p.pop(i))
    else:
        p.insert(i, p.pop(j))
    return p


def _anneal(score, order: list[int], evals: int, rng: random.Random, t0: float, t1: float):
    cur = score(order)
    best, best_order = cur, list(order)
    for step in range(evals):
        temp = t0 * (t1 / t0) ** (step / evals)
        cand = _move(order, rng)
        v = score(cand)
        if v <= cur or rng.random() < math.exp(-(v - cur) / temp):
            order, cur = cand, v
            if cur < best:
                best, best_order = cur, list(order)
    return best, best_order


def search_order(
    rounds: Sequence[Sequence[tuple[int, int]]],
    n: int,
    *,
    seed: int = 0,
    work: float = 2e9,
    start: Sequence[int] | None = None,
    bye: int | None = None,
) -> OrderResult:
    """Simulated annealing over the leg-1 round order, each order scored by its break path
    (module docstring); returns the best order with its home/away assignment.

    Orders are scored by the exact path for ``n <= 16``, else by the beam path
    (:meth:`BreakPaths.beam`). ``work`` is the budget in inner-loop steps
    (:attr:`BreakPaths.work`, :attr:`BreakPaths.beam_work`); the number of evaluations follows
    from it (at least 50), independent of the machine.

    Parameters
    ----------
    rounds
        The rounds of the factorization, each a list of games ``(a, b)`` over ``0 .. n - 1``.
    n
        Number of vertices, even.
    seed
        Seed of the annealing moves.
    work
        Budget in inner-loop steps (no clock, so the result is deterministic).
    start
        A first order (factorization round indexes), or ``None`` for ``0 .. R - 1``.
    bye
        The bye vertex of an odd league, or ``None``.

    Returns
    -------
    OrderResult
        The best order found, with its home/away assignment and breaks.

    References
    ----------
    S. Kirkpatrick, C. D. Gelatt and M. P. Vecchi, Science 220 (1983) 671-680;
    ``docs/perfect-breaks.md``.
    """
    paths = BreakPaths(rounds, n, bye)
    R = paths.round_count
    order = list(start) if start is not None else list(range(R))
    if R < 3:
        return paths.assignment(order)
    rng = random.Random(seed)
    if not paths.exact:
        evals = max(50, int(work / max(1, paths.beam_work)))
        _, order = _anneal(paths.beam, order, evals, rng, 4.0, 0.4)
    else:
        evals = max(50, int(work / max(1, paths.work)))
        _, order = _anneal(paths.value, order, evals, rng, 2.0, 0.2)
    return paths.assignment(order)
