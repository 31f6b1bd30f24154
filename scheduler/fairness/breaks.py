"""Breaks, home/away counts and the home-count gap.

A *break* is two home games (or two away games) in consecutive games of a team; it is counted
once, in the second of the two rounds (de Werra 1981; Brouwer, Post & Woeginger, JCTA 115 (2008)
1065-1068). Bye convention (:data:`~scheduler.fairness.model.BYE_CONVENTION`): only games
actually played count, so a bye is skipped and the games before and after it are compared.

Lower bounds on the total (n teams, n even unless said):

* single round robin: n - 2, and 0 for odd n (D. de Werra, "Scheduling in sports", Annals of
  Discrete Mathematics 11 (1981) 381-395): at most two teams can have the break-free patterns
  HAHA... and AHAH..., and two teams with the same break-free pattern could never meet;
* mirrored double round robin: 3n - 6 (de Werra 1981: leg 2 repeats leg 1's n-2 breaks, and each
  team with exactly one leg-1 break gets one more at the junction); odd n with byes skipped: n
  (every team plays an even number of games per leg, so a break-free leg ends on the other
  venue and the mirrored leg opens with a break);
* French scheme: 2n; English and inverted schemes: 2n - 4 (derived in the project notes,
  ``fairness.md`` section 4, and re-checked by exhaustive search in ``tests/fairness``);
* any other multi-leg season whose legs are single round robins: legs x (n - 2), de Werra's
  bound applied to each leg (breaks at the junctions only add).

The home-count gap after a round is the largest difference between two teams' numbers of home
games played so far (ranking-balancedness: Goossens & Spieksma, J. Scheduling 15 (2012)
641-651).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np


@dataclass(frozen=True)
class BreakFigures:
    per_team: np.ndarray
    break_mask: np.ndarray
    home: np.ndarray
    away: np.ndarray
    gap_max: int
    gap_round: int
    home_run: np.ndarray
    away_run: np.ndarray


def count_breaks(venue_sign: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Breaks per team and the ``(rounds, teams)`` mask of rounds in which a break happens.

    ``venue_sign[r, t]`` is +1 home, -1 away, 0 no game (skipped: the bye convention).
    """
    rounds, n = venue_sign.shape
    if rounds == 0:
        return np.zeros(n, dtype=np.int64), np.zeros((0, n), dtype=bool)
    played = venue_sign != 0
    idx = np.where(played, np.arange(rounds)[:, None], -1)
    last = np.maximum.accumulate(idx, axis=0)
    # prev[r, t] = the last round before r in which t played, or -1.
    prev = np.full_like(last, -1)
    prev[1:] = last[:-1]
    has_prev = played & (prev >= 0)
    prev_sign = np.take_along_axis(venue_sign, np.maximum(prev, 0), axis=0)
    mask = has_prev & (prev_sign == venue_sign)
    return mask.sum(axis=0).astype(np.int64), mask


def home_gap(venue_sign: np.ndarray) -> tuple[int, int]:
    """Largest difference between two teams' home counts after any round, and the first round
    (1-based) after which it is reached (0 when there are no rounds)."""
    if venue_sign.size == 0:
        return 0, 0
    cum = np.cumsum(venue_sign == 1, axis=0, dtype=np.int64)
    gaps = cum.max(axis=1) - cum.min(axis=1)
    r = int(np.argmax(gaps))
    return int(gaps[r]), r + 1


def longest_runs(venue_sign: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Longest run of consecutive home games and of away games per team (byes skipped, as for
    breaks). Limits on such runs are a classic constraint, e.g. at most 3 in the traveling
    tournament problem (Easton, Nemhauser & Trick, CP 2001, LNCS 2239)."""
    n = venue_sign.shape[1]
    home = np.zeros(n, dtype=np.int64)
    away = np.zeros(n, dtype=np.int64)
    for t in range(n):
        seq = venue_sign[:, t]
        seq = seq[seq != 0]
        if not len(seq):
            continue
        cut = np.flatnonzero(seq[1:] != seq[:-1]) + 1
        starts = np.concatenate([[0], cut])
        lengths = np.diff(np.append(starts, len(seq)))
        kinds = seq[starts]
        if (kinds == 1).any():
            home[t] = lengths[kinds == 1].max()
        if (kinds == -1).any():
            away[t] = lengths[kinds == -1].max()
    return home, away


def break_figures(venue_sign: np.ndarray) -> BreakFigures:
    per_team, mask = count_breaks(venue_sign)
    gap, gap_round = home_gap(venue_sign)
    home_run, away_run = longest_runs(venue_sign)
    return BreakFigures(
        per_team=per_team,
        break_mask=mask,
        home=(venue_sign == 1).sum(axis=0).astype(np.int64),
        away=(venue_sign == -1).sum(axis=0).astype(np.int64),
        gap_max=gap,
        gap_round=gap_round,
        home_run=home_run,
        away_run=away_run,
    )


def breaks_lower_bound(n: int, legs: int, scheme: str) -> tuple[int, str]:
    """Least total number of breaks of a season of ``n`` teams in ``legs`` single round robins
    under ``scheme`` (byes skipped), with the source of the bound."""
    if n < 2 or legs < 1:
        return 0, "no games"
    even = n % 2 == 0
    if legs == 1:
        if even:
            return n - 2, "de Werra 1981 (Ann. Discrete Math. 11): n-2 for a single round robin"
        return 0, "de Werra 1981 (Ann. Discrete Math. 11): 0 for an odd single round robin"
    if legs == 2 and scheme == "mirrored":
        if even:
            return 3 * n - 6, "de Werra 1981 (Ann. Discrete Math. 11): 3n-6 for a mirrored double"
        return n, "odd mirrored double, byes skipped: n (derived; checked by exhaustive search)"
    if legs == 2 and even and scheme == "french":
        return 2 * n, "French double: 2n (derived; checked by exhaustive search)"
    if legs == 2 and even and scheme in ("english", "inverted"):
        return 2 * n - 4, f"{scheme} double: 2n-4 (derived; checked by exhaustive search)"
    if even:
        return legs * (n - 2), f"de Werra 1981 applied to each of the {legs} legs: legs x (n-2)"
    return 0, "odd n: de Werra 1981 gives 0 per leg"
