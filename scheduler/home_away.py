"""Breaks of home/away sequences: the project's one definition.

A *break* is two home games (or two away games) in consecutive games of a team, counted once, in
the second of the two rounds (D. de Werra, "Scheduling in sports", Annals of Discrete Mathematics
11 (1981) 381-395). Only games actually played count: a bye is skipped, so the games before and
after it are compared. The balancer, the carry-over search, the rules and the fairness figures
all count breaks with :func:`count_breaks`.
"""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np


def count_breaks(venue_sign: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Breaks per team and the ``(rounds, teams)`` mask of the rounds in which a break happens.

    Parameters
    ----------
    venue_sign : numpy.ndarray
        ``venue_sign[r, t]`` is +1 when team ``t`` plays at home in round ``r``, -1 away, 0 when
        it does not play (skipped).

    Returns
    -------
    per_team : numpy.ndarray
        Breaks of every team.
    mask : numpy.ndarray
        True where a team's game is the second of a break.

    Examples
    --------
    >>> per_team, _ = count_breaks(np.array([[1, -1], [0, 1], [1, -1]]))
    >>> per_team.tolist()
    [1, 0]
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


def venue_signs(games: Sequence[Sequence[tuple[int, int]]], teams: int) -> np.ndarray:
    """The ``(rounds, teams)`` venue-sign table of rounds given as ``(home, away)`` pairs.

    Parameters
    ----------
    games : sequence of sequence of tuple of int
        The rounds in playing order, each a sequence of games ``(home, away)`` of team indices.
    teams : int
        Number of teams (the width of the table).

    Returns
    -------
    numpy.ndarray
        An int8 table: +1 where the team plays at home in the round, -1 away, 0 no game; the
        input of :func:`count_breaks`.

    Examples
    --------
    >>> venue_signs([[(0, 1)], [(1, 0)]], 2).tolist()
    [[1, -1], [-1, 1]]
    """
    sign = np.zeros((len(games), teams), dtype=np.int8)
    for r, rnd in enumerate(games):
        for home, away in rnd:
            sign[r, home] = 1
            sign[r, away] = -1
    return sign


def total_breaks(games: Sequence[Sequence[tuple[int, int]]], teams: int) -> int:
    """Total breaks of a season given round by round as ``(home, away)`` pairs (byes skipped).

    Parameters
    ----------
    games : sequence of sequence of tuple of int
        The rounds in playing order, each a sequence of games ``(home, away)`` of team indices.
    teams : int
        Number of teams.

    Returns
    -------
    int
        The number of breaks of all teams together, counted as :func:`count_breaks` does.

    References
    ----------
    D. de Werra, "Scheduling in sports", Annals of Discrete Mathematics 11 (1981) 381-395.

    Examples
    --------
    >>> total_breaks([[(0, 1)], [(0, 1)], [(1, 0)]], 2)
    2
    """
    return int(count_breaks(venue_signs(games, teams))[0].sum())
