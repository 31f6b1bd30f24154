"""Leg schemes of a multi-leg round robin and the break lower bounds that hold for them.

Leg 1 is a single round robin (SRR) of ``R = n - 1`` rounds. Every later leg repeats the pairings
of the previous leg with the venues swapped, in the order given by the scheme. With ``σ(s)`` the
previous-leg position copied into position ``s`` (0-based):

- mirrored ``σ(s) = s``; French ``σ(s) = s + 1 (mod R)`` (leg 2 = rounds 2..R, 1);
  English ``σ(s) = s - 1 (mod R)`` (leg 2 = rounds R, 1..R-1); inverted ``σ(s) = R - 1 - s``;
  free: the solver chooses each leg's order.

More than two legs alternate the venues leg by leg and repeat the scheme, so leg ``l`` (0-based)
copies leg-1 position ``σ^l(s)`` with the venues swapped when ``l`` is odd.

Sources: Goossens & Spieksma, "Soccer schedules in Europe: an overview", J. Scheduling 15 (2012)
641-651 (the schemes); project notes fairness.md §4 (index maps and break bounds).
"""

from __future__ import annotations

from dataclasses import dataclass

FIXED_SCHEMES = ("mirrored", "french", "english", "inverted")


def sigma(scheme: str, rounds: int) -> tuple[int, ...]:
    """``σ`` of a fixed scheme: leg-2 position ``s`` copies leg-1 position ``σ[s]``."""
    r = rounds
    if scheme == "mirrored":
        return tuple(range(r))
    if scheme == "french":
        return tuple((s + 1) % r for s in range(r))
    if scheme == "english":
        return tuple((s - 1) % r for s in range(r))
    if scheme == "inverted":
        return tuple(r - 1 - s for s in range(r))
    raise ValueError(f"no fixed order for scheme {scheme!r}")


def leg_maps(scheme: str, legs: int, rounds: int) -> tuple[tuple[int, ...], ...] | None:
    """For a fixed scheme: ``maps[l][s]`` = the leg-1 position that leg ``l`` position ``s`` copies.

    ``None`` for the free scheme (each leg has its own order).
    """
    if scheme == "free" and legs > 1:
        return None
    if scheme == "free":
        return (tuple(range(rounds)),)
    step = sigma(scheme, rounds)
    maps = [tuple(range(rounds))]
    for _ in range(1, legs):
        prev = maps[-1]
        maps.append(tuple(prev[step[s]] for s in range(rounds)))
    return tuple(maps)


def flipped(leg: int) -> bool:
    """Legs alternate venues: leg ``l`` (0-based) swaps the venues of leg 1 when ``l`` is odd."""
    return leg % 2 == 1


def separations(scheme: str, legs: int, rounds: int) -> tuple[int, ...]:
    """Fixed scheme: for every leg-1 position, the fewest rounds strictly between two consecutive
    meetings of the pair that plays there (fairness.md §4 table). Empty for one leg."""
    maps = leg_maps(scheme, legs, rounds)
    if maps is None or legs < 2:
        return ()
    where = [{p: s for s, p in enumerate(m)} for m in maps]
    out = []
    for p in range(rounds):
        seps = [rounds + where[i + 1][p] - where[i][p] - 1 for i in range(legs - 1)]
        out.append(min(seps))
    return tuple(out)


@dataclass(frozen=True)
class BreakBound:
    """A lower bound on total breaks and the theorem it rests on."""

    value: int
    reason: str


def leg_break_bound(n: int, odd: bool) -> int:
    """Breaks inside one SRR leg: at least ``n - 2`` for an even league (de Werra 1981, Annals of
    Discrete Math. 11:381-395: only HAHA... and AHAH... are break-free, and two teams with the same
    pattern never meet); 0 for an odd league (a break-free SRR exists)."""
    return 0 if odd else n - 2


def total_break_bound(n: int, teams: int, scheme: str, legs: int) -> BreakBound:
    """The best proven lower bound on the season's total breaks (byes skipped).

    ``n`` is the even order of the factorization, ``teams`` the number of teams.

    - even, every leg: ``n - 2`` per leg (de Werra 1981).
    - even, mirrored: a team with ``B`` leg-1 breaks has ``L·B + (L-1)·[B odd]`` breaks, because
      an odd-length leg with ``B`` odd ends on the venue opposite to its start, so every junction
      is a break; with at most two teams at ``B = 0`` that is ``(n-2)(2L-1)``, i.e. ``3n - 6`` for
      two legs (de Werra 1981; proof in fairness.md §4).
    - even, French, two legs: every team has at least 2 breaks, so ``2n`` (derived in fairness.md
      §4: per team ``2B - [v1=v2] + [v_R=v1] + [v_R≠v2]``, re-checked for B = 0, 1, 2, 3+).
    - odd, mirrored: each team plays an even number of games per leg, so a break-free leg ends on
      the opposite venue and leg 2 opens with a break: at least ``teams`` (fairness.md §1).
    """
    odd = teams % 2 == 1
    if odd:
        if scheme == "mirrored" and legs >= 2:
            return BreakBound(
                teams * (legs - 1),
                "odd league, mirrored: every team breaks at each leg junction (derived: a "
                "leg has an even number of games per team; checked by exhaustive search)",
            )
        return BreakBound(0, "odd league: a break-free single round robin exists (de Werra 1981)")
    per_leg = (n - 2) * legs
    if legs == 1:
        return BreakBound(n - 2, "de Werra 1981: a single round robin has at least n-2 breaks")
    if scheme == "mirrored":
        return BreakBound(
            (n - 2) * (2 * legs - 1),
            "de Werra 1981: a mirrored double round robin has at least 3n-6 breaks",
        )
    if scheme == "french" and legs == 2:
        return BreakBound(
            2 * n,
            "French scheme: every team has at least 2 breaks (derived from de Werra's argument; "
            "checked by exhaustive search)",
        )
    return BreakBound(per_leg, "de Werra 1981: every leg has at least n-2 breaks")
