"""A start for the timetable model: simulated annealing on round order and venues.

For a factorization other than the circle schedule (where de Werra's canonical orientation is
known to be optimal) CP-SAT benefits from a good first solution. Minimising breaks for a fixed
timetable is a MAX-CUT problem (Elf, Jünger & Rinaldi 2003, Oper. Res. Letters 31:343-349, from
memory), which local search handles well. The moves are: swap the venue of one game; swap two
rounds of leg 1 (later legs follow the scheme). Acceptance follows the Metropolis rule with a
geometric cooling schedule (Kirkpatrick, Gelatt & Vecchi 1983, Science 220:671-680); a venue
swap is evaluated incrementally (only the two teams' neighbouring games change). The random
generator is seeded and the number of moves is fixed, so the result is deterministic. The hard
rules are left to the CP-SAT model, which repairs the start where it breaks one.
"""

from __future__ import annotations

import math
import random
from collections.abc import Sequence

from scheduler.factorization.model import Round
from scheduler.home_away import total_breaks


def anneal(
    rounds: Sequence[Sequence[tuple[int, int]]],
    n: int,
    maps: Sequence[Sequence[int]],
    bye: int | None,
    *,
    seed: int = 0,
    moves: int = 60000,
    start: tuple[Sequence[int], dict[tuple[int, int], bool]] | None = None,
) -> tuple[list[int], dict[tuple[int, int], bool], int]:
    """Return (leg-1 order, a-is-home for every game (a, b), breaks) with few breaks.

    Parameters
    ----------
    rounds
        The rounds of the factorization, each a list of games ``(a, b)`` over vertices
        ``0 .. n - 1``.
    n
        Number of vertices (teams, plus the bye vertex of an odd league).
    maps
        ``maps[l][q]`` is the leg-1 position copied by leg ``l`` at position ``q`` (venues
        swapped on odd legs), as in :func:`scheduler.leg_schemes.leg_maps`.
    bye
        The bye vertex of an odd league (its games are not played), or ``None``.
    seed
        Seed of the random moves.
    moves
        Number of moves tried (fixed, so the result is deterministic).
    start
        A first solution (leg-1 order, a-is-home per game) to improve, or ``None`` for a
        greedy alternating start.

    Returns
    -------
    tuple
        (leg-1 round order as factorization round indexes, ``{(a, b): a is home in leg 1}``
        for every game, total breaks over all legs with byes skipped).

    References
    ----------
    S. Kirkpatrick, C. D. Gelatt and M. P. Vecchi, "Optimization by simulated annealing",
    Science 220 (1983) 671-680; ``docs/fairness.md``.

    Examples
    --------
    >>> from scheduler.factorization import circle_factorization
    >>> rounds = circle_factorization(6).rounds
    >>> order, home, breaks = anneal(rounds, 6, [list(range(5))], None, moves=2000)
    >>> breaks, breaks == breaks_of(rounds, home, [order], None)
    (4, True)
    """
    R = len(rounds)
    rng = random.Random(seed)
    partner = [[-1] * n for _ in range(R)]
    for k, games in enumerate(rounds):
        for a, b in games:
            partner[k][a], partner[k][b] = b, a
    # home[k][v]: v at home in round k (leg 1); start: alternate greedily in round order
    home = [[False] * n for _ in range(R)]
    last: dict[int, bool] = {}
    for k in range(R):
        for a, b in rounds[k]:
            a_home = not last.get(a, rng.random() < 0.5)
            home[k][a], home[k][b] = a_home, not a_home
            last[a], last[b] = a_home, not a_home
    order = list(range(R))
    if start is not None:
        order = list(start[0])
        for k in range(R):
            for a, b in rounds[k]:
                if (a, b) in start[1]:
                    home[k][a], home[k][b] = start[1][(a, b)], not start[1][(a, b)]
    L = len(maps)
    verts = [v for v in range(n) if v != bye]

    def seq_rounds(order_):
        out = []
        for leg in range(L):
            flip = leg % 2 == 1
            for q in range(R):
                out.append((order_[maps[leg][q]], flip))
        return out

    def vbreaks(v, seq):
        prev = None
        total = 0
        for k, flip in seq:
            if partner[k][v] == bye:
                continue
            h = home[k][v] != flip
            if prev is h:
                total += 1
            prev = h
        return total

    def index(seq):
        """Per vertex: its played season positions, and where each round sits among them."""
        played = {}
        where = {}
        for v in verts:
            pl = [s for s, (k, _f) in enumerate(seq) if partner[k][v] != bye]
            w: list[list[int]] = [[] for _ in range(R)]
            for i, s in enumerate(pl):
                w[seq[s][0]].append(i)
            played[v], where[v] = pl, w
        return played, where

    def flip_delta(v, k, seq, played, where):
        """Change of v's breaks when its venue in round k (every leg) is swapped."""
        hits = where[v][k]
        pl = played[v]
        top = len(pl) - 1
        touched = set(hits)
        d = 0
        for i in sorted({j for h in hits for j in (h - 1, h) if 0 <= j < top}):
            k1, f1 = seq[pl[i]]
            k2, f2 = seq[pl[i + 1]]
            x = home[k1][v] != f1
            y = home[k2][v] != f2
            d += ((x != (i in touched)) == (y != ((i + 1) in touched))) - (x == y)
        return d

    seq = seq_rounds(order)
    played, where = index(seq)
    cur = sum(vbreaks(v, seq) for v in verts)
    best = (cur, list(order), [row[:] for row in home])
    t0, t1 = 0.6, 0.1
    flippable = [(k, a, b) for k in range(R) for a, b in rounds[k] if bye not in (a, b)]
    temp = t0
    cool = (t1 / t0) ** (1.0 / max(1, moves - 1))
    for _step in range(moves):
        temp *= cool
        if R > 2 and rng.random() < 0.08:
            i, j = rng.sample(range(R), 2)
            order[i], order[j] = order[j], order[i]
            new_seq = seq_rounds(order)
            delta = sum(vbreaks(v, new_seq) for v in verts) - cur
            if delta <= 0 or rng.random() < math.exp(-delta / temp):
                seq, cur = new_seq, cur + delta
                played, where = index(seq)
            else:
                order[i], order[j] = order[j], order[i]
        else:
            k, a, b = flippable[rng.randrange(len(flippable))]
            delta = flip_delta(a, k, seq, played, where) + flip_delta(b, k, seq, played, where)
            if delta <= 0 or rng.random() < math.exp(-delta / temp):
                home[k][a], home[k][b] = home[k][b], home[k][a]
                cur += delta
        if cur < best[0]:
            best = (cur, list(order), [row[:] for row in home])
    value, order, home = best
    orientation = {(a, b): home[k][a] for k in range(R) for a, b in rounds[k]
                   if bye not in (a, b)}
    return order, orientation, value


def breaks_of(fact_rounds: Sequence[Round], home_first: dict[tuple[int, int], bool],
              orders: Sequence[Sequence[int]], bye: int | None) -> int:
    """Total breaks (byes skipped) when leg ``l`` plays the rounds ``orders[l]`` and every game
    ``(a, b)`` has ``a`` at home in leg 1 iff ``home_first[(a, b)]`` (odd legs swap); counted by
    :func:`scheduler.home_away.total_breaks`.

    Parameters
    ----------
    fact_rounds
        The rounds of the factorization, each a list of games ``(a, b)``.
    home_first
        ``{(a, b): a is at home in leg 1}`` for every game as written in ``fact_rounds``.
    orders
        For each leg, the factorization rounds it plays, in order.
    bye
        The bye vertex of an odd league, or ``None``.

    Returns
    -------
    int
        Total breaks over the season.
    """
    games = []
    vertices = 0
    for leg, order in enumerate(orders):
        swapped = leg % 2 == 1
        for k in order:
            played = []
            for a, b in fact_rounds[k]:
                vertices = max(vertices, a + 1, b + 1)
                if bye in (a, b):
                    continue
                played.append((a, b) if home_first[(a, b)] != swapped else (b, a))
            games.append(played)
    return total_breaks(games, vertices)
