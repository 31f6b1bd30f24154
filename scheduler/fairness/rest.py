"""Rest days between a team's consecutive games.

A game's day is ``Fixture.date``, else the (local) date of ``Fixture.start``. The rest before a
game is the number of whole days without a game since the team's previous game: games on
consecutive days give 0, a weekly rhythm gives 6 (the usual count of "days of rest", common
practice; the rest-mismatch literature, e.g. Atan & Cavdaroglu 2018, counts days between
games in the same way, from memory). Two games of one team on the same day give -1 and are
kept, so the figures show them.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from scheduler.fairness.table import SeasonTable
from scheduler.season import Season


@dataclass(frozen=True)
class RestFigures:
    per_team: tuple[tuple[int, ...], ...]
    league_min: int | None
    league_mean: float | None


def _day(f) -> int | None:
    if f.date is not None:
        return f.date.toordinal()
    if f.start is not None:
        return f.start.date().toordinal()
    return None


def rest_figures(season: Season, table: SeasonTable) -> RestFigures:
    fixtures = season.fixtures
    days = np.fromiter(
        ((d if (d := _day(fixtures[i])) is not None else -1) for i in table.fixture.tolist()),
        dtype=np.int64,
        count=len(table.fixture),
    )
    n = table.n
    dated = days >= 0
    if not dated.any():
        return RestFigures(tuple(() for _ in range(n)), None, None)
    team = np.concatenate([table.home[dated], table.away[dated]])
    day = np.concatenate([days[dated], days[dated]])
    order = np.lexsort((day, team))
    team, day = team[order], day[order]
    same = team[1:] == team[:-1]
    gaps = day[1:] - day[:-1] - 1
    owner = team[1:][same]
    values = gaps[same]
    bounds = np.searchsorted(owner, np.arange(n + 1))
    per_team = tuple(tuple(values[bounds[t] : bounds[t + 1]].tolist()) for t in range(n))
    if len(values) == 0:
        return RestFigures(per_team, None, None)
    return RestFigures(per_team, int(values.min()), float(round(values.mean(), 4)))
