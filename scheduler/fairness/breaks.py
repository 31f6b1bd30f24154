"""Breaks, home/away counts and the home-count gap.

A *break* is two home games (or two away games) in consecutive games of a team; it is counted
once, in the second of the two rounds (de Werra 1981; Brouwer, Post & Woeginger, JCTA 115 (2008)
1065-1068). Bye convention (:data:`~scheduler.fairness.model.BYE_CONVENTION`): only games
actually played count, so a bye is skipped and the games before and after it are compared.

Lower bounds on the total come from :mod:`scheduler.leg_schemes` (one definition shared with the
balancer; derivations and an exhaustive check in ``docs/leg-schemes.md``): n - 2 for an even
single round robin and 0 for an odd one (D. de Werra, "Scheduling in sports", Annals of Discrete
Mathematics 11 (1981) 381-395); (n-2)(2L-1) for L mirrored legs (3n - 6 for two); n(L-1) for an
odd mirrored season; 2n French and 2n - 4 English/inverted with two legs; L(n-2) otherwise.
Breaks themselves are counted by :func:`scheduler.home_away.count_breaks`.

The home-count gap after a round is the largest difference between two teams' numbers of home
games played so far (ranking-balancedness: Goossens & Spieksma, J. Scheduling 15 (2012)
641-651).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from scheduler.home_away import count_breaks
from scheduler.leg_schemes import break_lower_bound

__all__ = ["BreakFigures", "break_figures", "breaks_lower_bound", "count_breaks", "home_gap",
           "longest_runs"]


@dataclass(frozen=True)
class BreakFigures:
    """Break and home/away figures of a season (see :func:`break_figures`).

    Parameters
    ----------
    per_team
        Breaks of each team (int array, one entry per team in table order).
    break_mask
        ``break_mask[r, t]`` is true when team ``t`` has a break in round ``r`` (0-based; a
        break is counted in the second of its two games).
    home
        Home games of each team.
    away
        Away games of each team.
    gap_max
        Largest difference between two teams' home counts after any round.
    gap_round
        The first round (1-based) after which ``gap_max`` is reached (0 without rounds).
    home_run
        Longest run of consecutive home games of each team (byes skipped).
    away_run
        Longest run of consecutive away games of each team (byes skipped).
    """

    per_team: np.ndarray
    break_mask: np.ndarray
    home: np.ndarray
    away: np.ndarray
    gap_max: int
    gap_round: int
    home_run: np.ndarray
    away_run: np.ndarray


def home_gap(venue_sign: np.ndarray) -> tuple[int, int]:
    """Largest difference between two teams' home counts after any round, and the first round
    (1-based) after which it is reached.

    Parameters
    ----------
    venue_sign
        ``venue_sign[r, t]``: +1 home, -1 away, 0 no game.

    Returns
    -------
    tuple of (int, int)
        The largest gap and its first round; ``(0, 0)`` when there are no rounds.

    References
    ----------
    D. Goossens and F. Spieksma, "The carryover effect does not influence football results",
    J. Scheduling 15 (2012) 641-651 (ranking-balancedness, from memory); ``docs/fairness.md``.

    Examples
    --------
    >>> import numpy as np
    >>> home_gap(np.array([[1, -1], [1, -1], [-1, 1]]))
    (2, 2)
    """
    if venue_sign.size == 0:
        return 0, 0
    cum = np.cumsum(venue_sign == 1, axis=0, dtype=np.int64)
    gaps = cum.max(axis=1) - cum.min(axis=1)
    r = int(np.argmax(gaps))
    return int(gaps[r]), r + 1


def longest_runs(venue_sign: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Longest run of consecutive home games and of away games per team (byes skipped, as for
    breaks). Limits on such runs are a classic constraint, e.g. at most 3 in the traveling
    tournament problem (Easton, Nemhauser & Trick, CP 2001, LNCS 2239).

    Parameters
    ----------
    venue_sign
        ``venue_sign[r, t]``: +1 home, -1 away, 0 no game.

    Returns
    -------
    tuple of numpy.ndarray
        (longest home run, longest away run) per team; 0 for a team without such games.

    Examples
    --------
    >>> import numpy as np
    >>> home, away = longest_runs(np.array([[1, -1], [0, 1], [1, -1]]))
    >>> home.tolist(), away.tolist()
    ([2, 1], [0, 1])
    """
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
    """Breaks per team, where they fall, home/away counts, home-count gap and longest runs.

    Parameters
    ----------
    venue_sign
        ``venue_sign[r, t]``: +1 home, -1 away, 0 no game (as in
        :class:`~scheduler.fairness.table.SeasonTable`).

    Returns
    -------
    BreakFigures
        The figures, byes skipped as the module docstring says.

    References
    ----------
    D. de Werra, "Scheduling in sports", Annals of Discrete Mathematics 11 (1981) 381-395;
    ``docs/fairness.md``.
    """
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
    under ``scheme`` (byes skipped), with the argument it rests on
    (:func:`scheduler.leg_schemes.break_lower_bound`, derived in ``docs/leg-schemes.md``).

    Parameters
    ----------
    n
        Number of teams (2 or more).
    legs
        Number of single round robins (1 or more).
    scheme
        The leg scheme: ``"single"``, ``"mirrored"``, ``"french"``, ``"english"``,
        ``"inverted"`` or ``"free"``.

    Returns
    -------
    tuple of (int, str)
        The bound and the argument it rests on, in words.

    References
    ----------
    D. de Werra, "Scheduling in sports", Annals of Discrete Mathematics 11 (1981) 381-395;
    ``docs/leg-schemes.md``.

    Examples
    --------
    >>> breaks_lower_bound(6, 1, "single")[0], breaks_lower_bound(6, 2, "mirrored")[0]
    (4, 12)
    """
    bound = break_lower_bound(n, legs, scheme)
    return bound.value, bound.reason
