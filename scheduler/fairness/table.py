"""The season as numpy arrays: the one place that reads fixtures for the fairness figures.

Teams are numbered in the order of ``Season.teams``; a name that appears only in fixtures (an
unknown team, reported by :mod:`scheduler.fairness.validity`) is appended in order of first
appearance so the figures can still be measured. Rounds are the season's 1-based round
numbers; row ``r`` of a round table is round ``r + 1``. Fixtures with a round number below 1
are left out of the tables (validity reports them).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from scheduler.errors import InputError
from scheduler.season import Season

MAX_ROUNDS = 100_000
"""Largest round number measured (a guard against a mistyped round such as 20250301)."""


@dataclass(frozen=True)
class SeasonTable:
    """Per-fixture index arrays and per-round tables of one season.

    Parameters
    ----------
    names
        The teams in index order: ``Season.teams`` first, then names found only in fixtures.
    known
        How many of ``names`` come from ``Season.teams``.
    rounds
        Number of rounds (the largest round number, or of a round with byes).
    fixture
        For each used fixture, its index in ``Season.fixtures`` (fixtures with a round below
        1 are left out).
    home, away
        Team index of each used fixture's home and away side.
    round
        0-based round of each used fixture (round number minus 1).
    leg
        The leg written on each used fixture.
    venue_sign
        ``venue_sign[r, t]``: +1 when team ``t`` is at home in round ``r + 1``, -1 away, 0
        when it does not play (nor when it plays itself).
    plays
        ``plays[r, t]``: the games of team ``t`` in round ``r + 1``.
    opponent
        ``opponent[r, t]``: the (first) opponent of team ``t`` in round ``r + 1``, or -1.

    See Also
    --------
    build_table
    """

    names: tuple[str, ...]
    known: int
    rounds: int
    fixture: np.ndarray
    home: np.ndarray
    away: np.ndarray
    round: np.ndarray
    leg: np.ndarray
    venue_sign: np.ndarray
    plays: np.ndarray
    opponent: np.ndarray

    @property
    def n(self) -> int:
        """Number of teams indexed, unknown names included."""
        return len(self.names)


def build_table(season: Season) -> SeasonTable:
    """Index the fixtures of ``season`` (one pass in Python, the rest vectorised).

    Parameters
    ----------
    season
        Any season, valid or not.

    Returns
    -------
    SeasonTable
        The index arrays and round tables.

    Raises
    ------
    InputError
        A round number above :data:`MAX_ROUNDS` (a mistyped round), located at its fixture.

    Examples
    --------
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm", "Oak"),
    ...                 (Fixture(1, "Ash", "Elm"), Fixture(2, "Oak", "Ash")))
    >>> table = build_table(season)
    >>> table.n, table.rounds, table.venue_sign.tolist()
    (3, 2, [[1, -1, 0], [-1, 0, 1]])
    """
    index: dict[str, int] = {}
    for name in season.teams:
        index.setdefault(name, len(index))
    known = len(index)
    fixtures = season.fixtures
    for f in fixtures:
        for name in (f.home, f.away):
            if name not in index:
                index[name] = len(index)
    names = tuple(index)
    n = len(names)

    home = np.fromiter((index[f.home] for f in fixtures), dtype=np.int64, count=len(fixtures))
    away = np.fromiter((index[f.away] for f in fixtures), dtype=np.int64, count=len(fixtures))
    rnd = np.fromiter((f.round for f in fixtures), dtype=np.int64, count=len(fixtures))
    leg = np.fromiter((f.leg for f in fixtures), dtype=np.int64, count=len(fixtures))
    keep = np.flatnonzero(rnd >= 1)
    home, away, rnd, leg = home[keep], away[keep], rnd[keep] - 1, leg[keep]
    rounds = int(rnd.max()) + 1 if len(rnd) else 0
    rounds = max(rounds, max((r for r in season.byes if r >= 1), default=0))
    if rounds > MAX_ROUNDS:
        where = int(np.argmax(rnd)) if len(rnd) and rnd.max() + 1 == rounds else None
        at = f"fixture {int(keep[where]) + 1}" if where is not None else "byes"
        raise InputError(
            f"round {rounds} is not a plausible round number (at most {MAX_ROUNDS})", location=at
        )

    sign = np.zeros((rounds, n), dtype=np.int8)
    plays = np.zeros((rounds, n), dtype=np.int32)
    opponent = np.full((rounds, n), -1, dtype=np.int64)
    if len(rnd):
        np.add.at(plays, (rnd, home), 1)
        np.add.at(plays, (rnd, away), 1)
        # Write in reverse so that the first fixture of a team in a round wins.
        rev = slice(None, None, -1)
        sign[rnd[rev], home[rev]] = 1
        sign[rnd[rev], away[rev]] = -1
        opponent[rnd[rev], home[rev]] = away[rev]
        opponent[rnd[rev], away[rev]] = home[rev]
        # A team that plays itself has no usable venue or opponent in that round.
        selfgame = home == away
        if selfgame.any():
            sign[rnd[selfgame], home[selfgame]] = 0
            opponent[rnd[selfgame], home[selfgame]] = -1
    return SeasonTable(
        names=names,
        known=known,
        rounds=rounds,
        fixture=keep,
        home=home,
        away=away,
        round=rnd,
        leg=leg,
        venue_sign=sign,
        plays=plays,
        opponent=opponent,
    )
