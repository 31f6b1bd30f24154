"""Round order and home/away with few breaks for a fixed one-factorization (even leagues).

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

Parity (derived here): when the union of two consecutive rounds is one Hamiltonian cycle, the
number of breaks between them is even (go round the cycle multiplying the colour products of its
edges), so a perfect one-factorization reaches ``n - 2`` only with steps of 0 and 2 breaks, as
the circle schedule on ``n - 1`` prime does.

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

import numba as nb
import numpy as np

EXACT_HALF = 8
"""Exact layer DP up to ``n / 2 = 8`` (256 colourings per round)."""

MAX_N = 62
"""Colourings are bit masks in an int64."""


@dataclass(frozen=True)
class OrderResult:
    """A leg-1 round order, the venue of every game (``(a, b) -> a is at home``) and its breaks
    in the single round robin."""

    order: tuple[int, ...]
    home: dict[tuple[int, int], bool]
    breaks: int


@nb.njit(cache=True)
def _popcount(x: int) -> int:
    c = 0
    while x:
        x &= x - 1
        c += 1
    return c


@nb.njit(cache=True)
def _exact_value(masks, order):
    """Value of :func:`_exact_path` without the back pointers (a plain min, which vectorises)."""
    R, S = masks.shape
    f = np.zeros(S, np.int64)
    g = np.empty(S, np.int64)
    for q in range(1, R):
        a = masks[order[q - 1]]
        b = masks[order[q]]
        for y in range(S):
            best = 1 << 40
            by = b[y]
            for x in range(S):
                v = f[x] + _popcount(a[x] ^ by)
                best = min(best, v)
            g[y] = best
        f[:] = g
    return f.min()


@nb.njit(cache=True)
def _exact_path(masks, order, back):
    """Shortest path through the colouring layers ``masks[order[q]]``; ``back[q, y]`` gets the
    best predecessor of state ``y`` at position ``q``. Returns (value, last state)."""
    R, S = masks.shape
    f = np.zeros(S, np.int64)
    g = np.empty(S, np.int64)
    for q in range(1, R):
        a = masks[order[q - 1]]
        b = masks[order[q]]
        for y in range(S):
            best = 1 << 40
            arg = 0
            by = b[y]
            for x in range(S):
                v = f[x] + _popcount(a[x] ^ by)
                if v < best:
                    best = v
                    arg = x
            g[y] = best
            back[q, y] = arg
        f[:] = g
    last = 0
    for y in range(S):
        if f[y] < f[last]:
            last = y
    return f[last], last


@nb.njit(cache=True)
def _free(u, w, ea, eb, r):
    """Best colouring of round ``r`` between the colourings ``u`` and ``w``: (cost, mask)."""
    c = 0
    mask = 0
    for i in range(ea.shape[1]):
        a = ea[r, i]
        b = eb[r, i]
        ua = (u >> a) & 1
        wa = (w >> a) & 1
        ub = (u >> b) & 1
        wb = (w >> b) & 1
        c1 = (ua != 1) + (wa != 1) + (ub != 0) + (wb != 0)
        c2 = (ua != 0) + (wa != 0) + (ub != 1) + (wb != 1)
        if c1 <= c2:
            c += c1
            mask |= 1 << a
        else:
            c += c2
            mask |= 1 << b
    return c, mask


@nb.njit(cache=True)
def _candidate_path(cand, order, ea, eb, F, back, kind):
    """Shortest path over candidate colourings, a single free round allowed between two
    candidate rounds. ``kind[q, y]`` is 1 (from ``q - 1``) or 2 (from ``q - 2`` through a free
    round); ``back[q, y]`` the predecessor state. Returns (value, last state)."""
    R, S = cand.shape
    INF = 1 << 40
    for y in range(S):
        F[0, y] = 0
    for q in range(1, R):
        b = cand[order[q]]
        a = cand[order[q - 1]]
        for y in range(S):
            best = INF
            arg = 0
            kd = 1
            for x in range(S):
                v = F[q - 1, x] + _popcount(a[x] ^ b[y])
                if v < best:
                    best = v
                    arg = x
            if q >= 2:
                a2 = cand[order[q - 2]]
                for x in range(S):
                    if F[q - 2, x] >= best:
                        continue
                    c, _m = _free(a2[x], b[y], ea, eb, order[q - 1])
                    v = F[q - 2, x] + c
                    if v < best:
                        best = v
                        arg = x
                        kd = 2
            F[q, y] = best
            back[q, y] = arg
            kind[q, y] = kd
    last = 0
    for y in range(S):
        if F[R - 1, y] < F[R - 1, last]:
            last = y
    return F[R - 1, last], last


@nb.njit(cache=True)
def _local_path(cand, order, ea, eb):
    """The candidate path restricted to each round's bipartitions with its two neighbours in
    the order (both colours): 4 states per round, a quick proxy for the order search."""
    R = order.shape[0]
    INF = 1 << 40
    st = np.zeros((R, 4), np.int64)
    for q in range(R):
        r = order[q]
        for side in range(2):
            nb_q = q - 1 if side == 0 else q + 1
            if nb_q < 0 or nb_q >= R:
                nb_q = q + 1 if side == 0 else q - 1
            s = order[nb_q]
            j = 2 * (s if s < r else s - 1)
            st[q, 2 * side] = cand[r, j]
            st[q, 2 * side + 1] = cand[r, j + 1]
    F = np.full((R, 4), INF, np.int64)
    for y in range(4):
        F[0, y] = 0
    for q in range(1, R):
        for y in range(4):
            best = INF
            for x in range(4):
                v = F[q - 1, x] + _popcount(st[q - 1, x] ^ st[q, y])
                if v < best:
                    best = v
            if q >= 2:
                for x in range(4):
                    if F[q - 2, x] >= best:
                        continue
                    c, _m = _free(st[q - 2, x], st[q, y], ea, eb, order[q - 1])
                    v = F[q - 2, x] + c
                    if v < best:
                        best = v
            F[q, y] = best
    best = INF
    for y in range(4):
        if F[R - 1, y] < best:
            best = F[R - 1, y]
    return best


class BreakPaths:
    """The colouring layers of one factorization and the path evaluator for round orders."""

    def __init__(self, rounds: Sequence[Sequence[tuple[int, int]]], n: int) -> None:
        if n % 2 or n > MAX_N:
            raise ValueError(f"colouring masks need an even n <= {MAX_N}, got {n}")
        self.n = n
        self.R = len(rounds)
        self.rounds = [list(r) for r in rounds]
        half = n // 2
        self.ea = np.array([[a for a, _ in r] for r in self.rounds], dtype=np.int64)
        self.eb = np.array([[b for _, b in r] for r in self.rounds], dtype=np.int64)
        self.exact = half <= EXACT_HALF
        if self.exact:
            S = 1 << half
            masks = np.zeros((self.R, S), dtype=np.int64)
            for r in range(self.R):
                for x in range(S):
                    t = 0
                    for i in range(half):
                        t |= 1 << int(self.ea[r, i] if (x >> i) & 1 else self.eb[r, i])
                    masks[r, x] = t
            self.layers = masks
        else:
            full = (1 << n) - 1
            cand = np.zeros((self.R, 2 * (self.R - 1)), dtype=np.int64)
            for r in range(self.R):
                row = []
                for s in range(self.R):
                    if s != r:
                        m = self._bipartition(r, s)
                        row += [m, full ^ m]
                cand[r] = row
            self.layers = cand
        S = self.layers.shape[1]
        self._back = np.zeros((self.R, S), dtype=np.int64)
        self._F = np.zeros((self.R, S), dtype=np.int64)
        self._kind = np.zeros((self.R, S), dtype=np.int64)

    @property
    def work(self) -> int:
        """Work units of one evaluation (inner-loop steps), for budgeting without a clock."""
        S = self.layers.shape[1]
        return self.R * S * S // 4 if self.exact else self.R * S * S * (self.n + 4)

    @property
    def quick_work(self) -> int:
        """Work units of one :meth:`quick` evaluation."""
        return self.R * 16 * (self.n + 4) if not self.exact else self.work

    def quick(self, order: Sequence[int]) -> int:
        """A fast upper bound for ``order`` (the exact value when ``n <= 16``)."""
        if self.exact:
            return self.value(order)
        return int(_local_path(self.layers, np.asarray(order, dtype=np.int64), self.ea, self.eb))

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

    def value(self, order: Sequence[int]) -> int:
        o = np.asarray(order, dtype=np.int64)
        if self.exact:
            return int(_exact_value(self.layers, o))
        return int(_candidate_path(self.layers, o, self.ea, self.eb, self._F, self._back,
                                   self._kind)[0])

    def colourings(self, order: Sequence[int]) -> tuple[int, list[int]]:
        """(value, the colouring mask at every position) of the best path for ``order``."""
        o = np.asarray(order, dtype=np.int64)
        R = self.R
        t = [0] * R
        if self.exact:
            value, y = _exact_path(self.layers, o, self._back)
            for q in range(R - 1, -1, -1):
                t[q] = int(self.layers[o[q], y])
                if q:
                    y = int(self._back[q, y])
            return int(value), t
        value, y = _candidate_path(self.layers, o, self.ea, self.eb, self._F, self._back,
                                   self._kind)
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
                t[q - 1] = int(_free(u, t[q], self.ea, self.eb, int(o[q - 1]))[1])
                q, y = q - 2, x
        return int(value), t

    def assignment(self, order: Sequence[int]) -> OrderResult:
        """The home/away assignment of the best path for ``order``."""
        value, t = self.colourings(order)
        home: dict[tuple[int, int], bool] = {}
        for q, k in enumerate(order):
            s = t[q] if q % 2 == 0 else ~t[q]
            for a, b in self.rounds[k]:
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
        p[i:j + 1] = p[i:j + 1][::-1]
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


def search_order(rounds: Sequence[Sequence[tuple[int, int]]], n: int, *, seed: int = 0,
                 work: float = 2e9, start: Sequence[int] | None = None) -> OrderResult:
    """Simulated annealing over the leg-1 round order, each order scored by its break path
    (module docstring); returns the best order with its home/away assignment.

    For ``n > 16`` a first phase scores orders with the quick 4-state proxy
    (:meth:`BreakPaths.quick`), a second phase refines with the candidate path. ``work`` is the
    budget in inner-loop steps (:attr:`BreakPaths.work`), split evenly between the phases; the
    number of evaluations follows from it (at least 50 per phase), independent of the machine.
    """
    paths = BreakPaths(rounds, n)
    R = paths.R
    order = list(start) if start is not None else list(range(R))
    if R < 3:
        return paths.assignment(order)
    rng = random.Random(seed)
    if not paths.exact:
        evals = max(50, int(0.5 * work / max(1, paths.quick_work)))
        _, order = _anneal(paths.quick, order, evals, rng, 3.0, 0.3)
        evals = max(50, int(0.5 * work / max(1, paths.work)))
        _, order = _anneal(paths.value, order, evals, rng, 0.6, 0.1)
    else:
        evals = max(50, int(work / max(1, paths.work)))
        _, order = _anneal(paths.value, order, evals, rng, 2.0, 0.2)
    return paths.assignment(order)
