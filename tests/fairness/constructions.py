"""Schedules built in the tests, independently of the project's engine, plus plain-Python
reference computations of the figures (deliberately loop-by-loop, no numpy).

* :func:`canonical_rounds`: the circle method with de Werra's home/away rule, exactly as the
  project notes (docs/fairness.md §1, "Canonical schedule") describe it; de Werra,
  "Scheduling in sports", Annals of Discrete Mathematics 11 (1981) 381-395.
* :func:`gf_rounds`: Russell's balanced construction over GF(2^k): round r pairs x with
  x + alpha^r (K. G. Russell, Biometrika 67 (1980) 127-131; as written out in the notes).
* :func:`double_round_robin`: leg 2 of a DRR under the mirrored / French / English / inverted
  index maps (Goossens & Spieksma, J. Scheduling 15 (2012) 641-651, as recorded in the notes).
"""

from __future__ import annotations

import itertools

from scheduler.season import Fixture, Season

Game = tuple[int, int]  # (home, away), teams numbered 1..n


def canonical_rounds(n: int) -> list[list[Game]]:
    """de Werra's canonical SRR for even n: team n fixed, 1..n-1 on a circle (mod n-1)."""
    assert n % 2 == 0
    m = n - 1

    def c(x: int) -> int:
        return (x - 1) % m + 1

    rounds = []
    for k in range(1, n):
        games = [(n, k) if k % 2 == 1 else (k, n)]
        for i in range(1, n // 2):
            a, b = c(k + i), c(k - i)
            games.append((a, b) if i % 2 == 1 else (b, a))
        rounds.append(games)
    return rounds


_PRIMITIVE = {2: 0b111, 3: 0b1011, 4: 0b10011, 5: 0b100101}
"""Primitive polynomials over GF(2): x^2+x+1, x^3+x+1, x^4+x+1, x^5+x^2+1 (standard tables,
e.g. Lidl & Niederreiter, Finite Fields, 1997)."""


def gf_rounds(n: int) -> list[list[Game]]:
    """Russell's balanced SRR on the n = 2^k elements of GF(2^k), teams numbered 1..n."""
    k = n.bit_length() - 1
    assert 1 << k == n
    poly = _PRIMITIVE[k]
    power = 1
    rounds = []
    for _ in range(n - 1):
        games = [(x + 1, (x ^ power) + 1) for x in range(n) if x < x ^ power]
        rounds.append(games)
        power <<= 1
        if power & n:
            power ^= poly
    return rounds


def sigma(scheme: str, m: int) -> list[int]:
    """Leg-1 round (0-based) copied into leg-2 position s = 0..m-1."""
    s = list(range(m))
    return {
        "mirrored": s,
        "french": [(x + 1) % m for x in s],
        "english": [(x - 1) % m for x in s],
        "inverted": [m - 1 - x for x in s],
    }[scheme]


def double_round_robin(rounds: list[list[Game]], scheme: str) -> list[list[Game]]:
    """Leg 1 followed by leg 2 (the leg-1 rounds in the scheme's order, venues swapped)."""
    leg2 = [[(a, h) for h, a in rounds[i]] for i in sigma(scheme, len(rounds))]
    return [list(r) for r in rounds] + leg2


def name(t: int) -> str:
    return f"Club {t:02d}"


def season_of(rounds: list[list[Game]], n: int, *, legs: int = 1, scheme: str = "mirrored",
              names=None) -> Season:
    """A Season whose round r + 1 holds ``rounds[r]``; teams 1..n (a team missing from a round
    of an odd league gets a bye)."""
    names = names or [name(t) for t in range(1, n + 1)]
    per_leg = len(rounds) // legs
    fixtures = []
    byes = {}
    for r, games in enumerate(rounds):
        playing = set()
        for h, a in games:
            fixtures.append(
                Fixture(round=r + 1, home=names[h - 1], away=names[a - 1], leg=r // per_leg + 1)
            )
            playing.update((h, a))
        idle = [names[t - 1] for t in range(1, n + 1) if t not in playing]
        if idle:
            byes[r + 1] = tuple(idle)
    return Season("Test League", "2031", tuple(names), tuple(fixtures), byes=byes, legs=legs,
                  scheme=scheme)


def odd_from_even(rounds: list[list[Game]], dummy: int) -> list[list[Game]]:
    """Drop the games of ``dummy`` (its opponent has a bye), renumbering the teams above it."""
    def ren(t: int) -> int:
        return t - 1 if t > dummy else t

    return [[(ren(h), ren(a)) for h, a in games if dummy not in (h, a)] for games in rounds]


# ----------------------------------------------------------------- plain-Python references


def ref_breaks(rounds: list[list[Game]], n: int) -> list[int]:
    """Breaks per team (teams 1..n), byes skipped: compare consecutive games played."""
    out = []
    for t in range(1, n + 1):
        seq = []
        for games in rounds:
            for h, a in games:
                if t == h:
                    seq.append("H")
                elif t == a:
                    seq.append("A")
        out.append(sum(1 for x, y in itertools.pairwise(seq) if x == y))
    return out


def ref_carry_over(rounds: list[list[Game]], n: int) -> list[list[int]]:
    """Russell's cyclic carry-over matrix (teams 1..n -> indices 0..n-1), loop by loop."""
    opp = []
    for games in rounds:
        row = {}
        for h, a in games:
            row[h] = a
            row[a] = h
        opp.append(row)
    c = [[0] * n for _ in range(n)]
    m = len(rounds)
    for t in range(1, n + 1):
        for r in range(m):
            i = opp[r].get(t)
            j = opp[(r + 1) % m].get(t)
            if i is not None and j is not None:
                c[i - 1][j - 1] += 1
    return c
