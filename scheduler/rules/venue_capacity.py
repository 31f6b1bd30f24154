"""Venue capacity: a venue hosts at most as many games on a match day as it has courts times
time slots (``Venue.capacity``), when home means a venue."""

from __future__ import annotations

from collections import Counter
from dataclasses import dataclass
from typing import TYPE_CHECKING

from scheduler.config.model import League
from scheduler.rules.base import HardRule, TimetableView, Violation, plural
from scheduler.rules.shared_grounds import home_days_at_most

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Season


def capacity_groups(league: League) -> list[tuple[str, int, list[int]]]:
    """``(venue, capacity, team indices)`` of the venues whose capacity a match day could
    exceed (more home teams times rounds a day than the venue has room for).

    Parameters
    ----------
    league : League
        The league; only a league where home means a venue has such groups.

    Returns
    -------
    list of tuple of (str, int, list of int)
        ``(venue, capacity, team indices)``; capacity is games per match day
        (:attr:`scheduler.config.model.Venue.capacity`), the indices in ``league.teams`` order.
    """
    if league.format.home_meaning != "venue":
        return []
    per_day = max(1, league.calendar.rounds_per_day)
    by_venue: dict[str, list[int]] = {}
    for i, t in enumerate(league.teams):
        if t.home_venue:
            by_venue.setdefault(t.home_venue, []).append(i)
    out = []
    for venue, members in by_venue.items():
        cap = league.venue(venue).capacity
        if len(members) * per_day > cap:
            out.append((venue, cap, members))
    return out


@dataclass(frozen=True)
class VenueCapacity(HardRule):
    key = "venue_capacity"
    title = "games a venue can host on a match day"
    config_fields = ("venues.courts", "venues.slots", "teams.home_venue", "format.home_meaning")

    def is_on(self, league: League) -> bool:
        return bool(capacity_groups(league))

    def statement(self, league: League) -> str:
        return "; ".join(f"{venue} hosts at most {plural(cap, 'game')} on a match day"
                         for venue, cap, _ in capacity_groups(league))

    def named_teams(self, league: League) -> set[str]:
        return {league.teams[i].name for _, _, members in capacity_groups(league)
                for i in members}

    def add_constraints(self, model: TimetableView) -> None:
        for venue, cap, members in model.home_venue_groups():
            literal = model.switch(f"{venue} can host at most {cap} game{'s' if cap != 1 else ''}"
                                   " on a match day")
            home_days_at_most(model, members, cap, literal, per_team=False)

    def check(self, league: League, season: Season) -> tuple[Violation, ...]:
        out = []
        for venue, cap, members in capacity_groups(league):
            names = {league.teams[i].name for i in members}
            per_day = Counter(f.date if f.date is not None else f.round
                              for f in season.fixtures if f.home in names)
            for day, count in sorted(per_day.items(), key=lambda item: str(item[0])):
                if count > cap:
                    first = min((f for f in season.fixtures if f.home in names
                                 and (f.date if f.date is not None else f.round) == day),
                                key=lambda f: f.round)
                    out.append(Violation(venue, first.round, first.date,
                                         f"{count} games at {venue} on one match day "
                                         f"(room for {cap})"))
        return tuple(out)
