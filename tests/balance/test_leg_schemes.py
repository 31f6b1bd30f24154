"""The leg-scheme module against an exhaustive search (``docs/leg-schemes.md``).

For 3 to 6 teams every single round robin is enumerated up to relabelling the teams: the one
one-factorization of K_4 and of K_6 (unique up to isomorphism: W. D. Wallis,
*One-Factorizations*, Kluwer 1997, from memory; checked below by counting the labelled ones,
1 for K_4 and 6 = 720/120 for K_6), every order of its rounds and every choice of venues. Each
leg scheme then extends leg 1 to 2 or 3 legs with :func:`scheduler.leg_schemes.leg_maps` and
:func:`~scheduler.leg_schemes.flipped`; breaks are counted from the definition (two home or two
away games in a row, byes skipped). The least total found must equal
:func:`~scheduler.leg_schemes.break_lower_bound` where the docs prove the bound tight, and be at
least the bound everywhere.
"""

from __future__ import annotations

import itertools

import numpy as np
import pytest

from scheduler.leg_schemes import (
    FIXED_SCHEMES,
    break_lower_bound,
    flipped,
    least_separation,
    leg_maps,
    separations,
    sigma,
)


def _all_factorizations(n: int) -> list[tuple[tuple[tuple[int, int], ...], ...]]:
    """Every labelled one-factorization of K_n (plain backtracking over perfect matchings)."""
    edges = [(a, b) for a in range(n) for b in range(a + 1, n)]

    def matchings(free: tuple[int, ...], used: frozenset) -> list[tuple[tuple[int, int], ...]]:
        if not free:
            return [()]
        a, rest = free[0], free[1:]
        out = []
        for b in rest:
            if (a, b) in used:
                continue
            left = tuple(x for x in rest if x != b)
            out += [((a, b), *m) for m in matchings(left, used)]
        return out

    found = []

    def extend(rounds, used):
        if len(used) == len(edges):
            found.append(tuple(rounds))
            return
        # the round holding the smallest unused edge comes next (each factorization once)
        first = next(e for e in edges if e not in used)
        for m in matchings(tuple(range(n)), used):
            if first in m:
                extend([*rounds, m], used | set(m))

    extend([], frozenset())
    return found


def test_factorization_counts_from_the_definition():
    """K_4 has 1 labelled one-factorization, K_6 has 6 (6!/|Aut| = 720/120; OEIS A000438 gives
    the isomorphism classes 1, 1, 1, 6, 396 for n = 2..10 and A000438's companion of labelled
    counts 1, 1, 6, 6240 for n = 2, 4, 6, 8, from memory)."""
    assert len(_all_factorizations(4)) == 1
    assert len(_all_factorizations(6)) == 6


def _least_breaks(teams: int, legs: int) -> dict[str, int]:
    """Least total breaks per scheme over every timetable of ``teams`` teams in ``legs`` legs."""
    n = teams + teams % 2
    bye = n - 1 if teams % 2 else None
    base = _all_factorizations(n)[0]
    games = [g for rnd in base for g in rnd if bye not in g]
    rounds = n - 1
    choices = np.arange(1 << (len(games) - 1), dtype=np.int64)  # game 0 fixed: global flip
    bits = ((choices[:, None] >> np.arange(len(games) - 1)) & 1).astype(np.int8)
    bits = np.concatenate([np.zeros((len(choices), 1), dtype=np.int8), bits], axis=1)
    round_of = {g: r for r, rnd in enumerate(base) for g in rnd}
    best: dict[str, int] = {}
    for order in itertools.permutations(range(rounds)):
        position = {r: p for p, r in enumerate(order)}
        venue = np.zeros((len(choices), rounds, teams), dtype=np.int8)  # 0 = bye
        for g, (a, b) in enumerate(games):
            p = position[round_of[(a, b)]]
            venue[:, p, a] = np.where(bits[:, g], -1, 1)
            venue[:, p, b] = np.where(bits[:, g], 1, -1)
        for scheme in FIXED_SCHEMES:
            maps = leg_maps(scheme, legs, rounds)
            season = np.concatenate(
                [(-1 if flipped(leg) else 1) * venue[:, list(maps[leg])] for leg in range(legs)],
                axis=1)
            total = np.zeros(len(choices), dtype=np.int64)
            for t in range(teams):
                seq = season[:, :, t]
                seq = seq[:, seq[0] != 0] if bye is not None else seq  # byes sit in fixed places
                total += (seq[:, 1:] == seq[:, :-1]).sum(axis=1)
            best[scheme] = min(best.get(scheme, 10**9), int(total.min()))
    return best


@pytest.mark.slow
@pytest.mark.parametrize(("teams", "legs"), [(3, 2), (3, 3), (4, 1), (4, 2), (4, 3), (5, 2),
                                             (5, 3), (6, 2), (6, 3)])
def test_break_bounds_against_exhaustive_search(teams, legs):
    best = _least_breaks(teams, legs)
    for scheme in FIXED_SCHEMES:
        bound = break_lower_bound(teams, legs, scheme if legs > 1 else "single").value
        assert bound <= best[scheme], (scheme, bound, best[scheme])
        tight = (scheme == "mirrored" or legs <= 2) if teams % 2 == 0 else scheme == "mirrored"
        if tight:
            assert bound == best[scheme], (scheme, bound, best[scheme])


def test_mirrored_three_legs_bound_is_the_derived_one():
    """(n-2)(2L-1), not L(n-2): 6 teams, 3 legs -> 20 (docs/leg-schemes.md, section 3)."""
    assert break_lower_bound(6, 3, "mirrored").value == 20
    assert break_lower_bound(6, 3, "free").value == 12


def test_index_maps_from_the_definitions():
    """Goossens & Spieksma 2012 (from memory): French leg 2 = rounds 2..R, 1; English R, 1..R-1."""
    r = 5
    assert leg_maps("french", 2, r)[1] == (1, 2, 3, 4, 0)
    assert leg_maps("english", 2, r)[1] == (4, 0, 1, 2, 3)
    assert leg_maps("inverted", 2, r)[1] == (4, 3, 2, 1, 0)
    for scheme in FIXED_SCHEMES:
        maps = leg_maps(scheme, 4, r)
        assert all(sorted(m) == list(range(r)) for m in maps)
        # leg l+1 follows leg l by sigma
        step = sigma(scheme, r)
        for a, b in itertools.pairwise(maps):
            assert b == tuple(a[step[s]] for s in range(r))


def test_separations_from_the_definition():
    """Rounds strictly between consecutive meetings, counted on an explicit season."""
    r = 7
    for scheme in FIXED_SCHEMES:
        for legs in (2, 3):
            maps = leg_maps(scheme, legs, r)
            season = [p for m in maps for p in m]  # leg-1 position played in each season round
            expect = []
            for p in range(r):
                when = [s for s, q in enumerate(season) if q == p]
                expect.append(min(y - x - 1 for x, y in itertools.pairwise(when)))
            assert separations(scheme, legs, r) == tuple(expect)
            assert least_separation(scheme, legs, r) == min(expect)
