"""Rest days between a team's consecutive games.

A game's day is ``Fixture.date``, else the (local) date of ``Fixture.start``. The rest before a
game is the number of whole days without a game since the team's previous game: games on
consecutive days give 0, a weekly rhythm gives 6 (the usual count of "days of rest", common
practice; the rest-mismatch literature, e.g. Atan & Cavdaroglu 2018, counts days between
games in the same way, from memory). Two games of one team on the same day (a tournament day
with several rounds) give 0: there is no whole day of rest between them.

A *rest mismatch* is a game in which one team has had fewer rest days than its opponent (both
having played before); the literature on time-relaxed schedules tries to avoid them (e.g. Atan &
Cavdaroglu 2018, Computers & Operations Research, from memory).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from scheduler.fairness.table import SeasonTable
from scheduler.season import Season


@dataclass(frozen=True)
class RestFigures:
    """Rest days of a season (see :func:`rest_figures`).

    Parameters
    ----------
    per_team
        For each team, the days without a game between its consecutive games (a game on the
        next day is 0 rest days).
    league_min, league_mean
        Least and mean over the league; ``None`` when the fixtures carry no dates.
    mismatches
        Games in which both teams played before and their rest days differ (``None``
        without dates).
    less_rest
        Per team: games in which it had fewer rest days than its opponent.
    """

    per_team: tuple[tuple[int, ...], ...]
    league_min: int | None
    league_mean: float | None
    mismatches: int | None
    """Games in which both teams played before and their rest days differ."""
    less_rest: tuple[int, ...]
    """Per team: games in which it had fewer rest days than its opponent."""


def _day(f) -> int | None:
    if f.date is not None:
        return f.date.toordinal()
    if f.start is not None:
        return f.start.date().toordinal()
    return None


def rest_figures(season: Season, table: SeasonTable) -> RestFigures:
    """Rest days before every game of every team, and the rest mismatches.

    Parameters
    ----------
    season
        The season (dates of the games).
    table
        Its index.

    Returns
    -------
    RestFigures
        Per-team rest days, the league's minimum and mean, and the mismatches.

    References
    ----------
    ``docs/fairness.md`` (rest days, common practice).
    """
    fixtures = season.fixtures
    days = np.fromiter(
        ((d if (d := _day(fixtures[i])) is not None else -1) for i in table.fixture.tolist()),
        dtype=np.int64,
        count=len(table.fixture),
    )
    n = table.n
    dated = np.flatnonzero(days >= 0)
    if not len(dated):
        return RestFigures(tuple(() for _ in range(n)), None, None, None, (0,) * n)
    count = len(dated)
    team = np.concatenate([table.home[dated], table.away[dated]])
    day = np.concatenate([days[dated], days[dated]])
    game = np.concatenate([np.arange(count), np.arange(count)])
    side = np.concatenate([np.zeros(count, dtype=np.int64), np.ones(count, dtype=np.int64)])
    order = np.lexsort((game, day, team))
    team, day, game, side = team[order], day[order], game[order], side[order]
    same = team[1:] == team[:-1]
    gaps = np.maximum(day[1:] - day[:-1] - 1, 0)
    owner = team[1:][same]
    values = gaps[same]
    bounds = np.searchsorted(owner, np.arange(n + 1))
    per_team = tuple(tuple(values[bounds[t] : bounds[t + 1]].tolist()) for t in range(n))
    if len(values) == 0:
        return RestFigures(per_team, None, None, 0, (0,) * n)
    # Rest before each game, per side (-1 = no earlier game): mismatches.
    none = np.iinfo(np.int64).min
    before = np.full((count, 2), none, dtype=np.int64)
    idx = np.flatnonzero(same) + 1
    before[game[idx], side[idx]] = gaps[same]
    both = (before[:, 0] != none) & (before[:, 1] != none)
    mismatch = both & (before[:, 0] != before[:, 1])
    home_less = mismatch & (before[:, 0] < before[:, 1])
    away_less = mismatch & (before[:, 1] < before[:, 0])
    worse = np.bincount(table.home[dated][home_less], minlength=n)
    worse += np.bincount(table.away[dated][away_less], minlength=n)
    return RestFigures(
        per_team,
        int(values.min()),
        float(round(values.mean(), 4)),
        int(mismatch.sum()),
        tuple(int(x) for x in worse.tolist()),
    )
