"""Typed, frozen league configuration: what ``scheduler.config.load_league`` returns.

These objects are already validated: names refer to real teams and venues, dates fall inside the
season, numbers are in range. The balancer and the calendar read them and nothing else.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from datetime import date, time
from typing import Literal

# The calendar section's type belongs to the calendar (which reads it); re-exported here so the
# whole league configuration is importable from one module.
from scheduler.calendar.spec import CalendarSpec

__all__ = [
    "CalendarSpec",
    "FixedFixture",
    "Format",
    "HomeMeaning",
    "League",
    "Priorities",
    "Rules",
    "Scheme",
    "Team",
    "TeamDates",
    "Venue",
]

Scheme = Literal["mirrored", "french", "english", "inverted", "free"]
"""How a later leg repeats the pairings of leg 1 (venues swapped); see ``scheduler.leg_schemes``.
"""

HomeMeaning = Literal["venue", "side"]
"""``venue``: the home team hosts at its home venue. ``side``: "home" is a side or colour and the
games are spread over the league's shared venues, courts and time slots."""


@dataclass(frozen=True, slots=True)
class Team:
    name: str
    code: str
    home_venue: str | None = None


@dataclass(frozen=True, slots=True)
class Venue:
    """A ground or hall. ``courts`` are its courts/fields/tables, ``slots`` its kick-off times."""

    name: str
    courts: tuple[str, ...] = ("Main",)
    slots: tuple[time, ...] = ()
    address: str | None = None
    latitude: float | None = None
    longitude: float | None = None

    @property
    def capacity(self) -> int:
        """Games it can host on one match day (courts times time slots, at least one slot)."""
        return len(self.courts) * max(1, len(self.slots))


@dataclass(frozen=True, slots=True)
class Format:
    legs: int = 1
    scheme: Scheme = "mirrored"
    home_meaning: HomeMeaning = "venue"
    side_labels: tuple[str, str] = ("Home", "Away")

    @property
    def grid_labels(self) -> tuple[str, str]:
        """Labels of the home and the away side in grids: the side names when "home" is a side
        or colour, else ``("H", "A")``."""
        return self.side_labels if self.home_meaning == "side" else ("H", "A")


@dataclass(frozen=True, slots=True)
class TeamDates:
    team: str
    dates: tuple[date, ...]


@dataclass(frozen=True, slots=True)
class FixedFixture:
    """This game in that round or on that date. ``home`` is at home unless ``any_venue``."""

    home: str
    away: str
    round: int | None = None
    date: date | None = None
    any_venue: bool = False


@dataclass(frozen=True)
class Rules:
    """Hard rules. ``None`` or an empty tuple means the rule is not used."""

    unavailable: tuple[TeamDates, ...] = ()
    no_home_games: tuple[TeamDates, ...] = ()
    shared_grounds: tuple[tuple[str, ...], ...] = ()
    fixed: tuple[FixedFixture, ...] = ()
    max_home_run: int | None = None
    max_away_run: int | None = None
    no_breaks_first: int = 0
    no_breaks_last: int = 0
    min_rest_days: int | None = None
    min_separation: int | None = None


@dataclass(frozen=True, slots=True)
class Priorities:
    """Weights (>= 0) of the soft goals; larger means more important."""

    mixing: int = 4
    breaks: int = 3
    venue_balance: int = 2
    slot_balance: int = 2
    carry_over: int = 1


@dataclass(frozen=True)
class League:
    name: str
    season: str
    timezone: str
    teams: tuple[Team, ...]
    venues: tuple[Venue, ...]
    format: Format = field(default_factory=Format)
    calendar: CalendarSpec = field(default_factory=lambda: CalendarSpec(start=date(2000, 1, 1)))
    rules: Rules = field(default_factory=Rules)
    priorities: Priorities = field(default_factory=Priorities)
    seed: int = 0
    solve_seconds: float = 10.0  # the league file's time_limit_seconds (old name: solve_seconds)
    source: str | None = None

    @property
    def team_names(self) -> tuple[str, ...]:
        return tuple(t.name for t in self.teams)

    def team(self, name: str) -> Team:
        for t in self.teams:
            if t.name == name:
                return t
        raise KeyError(name)

    def venue(self, name: str) -> Venue:
        for v in self.venues:
            if v.name == name:
                return v
        raise KeyError(name)

    @property
    def shared_ground_groups(self) -> tuple[tuple[str, ...], ...]:
        """Groups of teams that may never all be at home on the same match day.

        "Never all at home" means at most one of the group is at home on a match day. The groups
        are the explicit ``rules.shared_grounds`` plus, when home means a venue, every set of two
        or more teams with the same home venue that hosts one game a day (capacity 1).
        """
        groups = list(self.rules.shared_grounds)
        if self.format.home_meaning == "venue":
            by_venue: dict[str, list[str]] = {}
            for t in self.teams:
                if t.home_venue:
                    by_venue.setdefault(t.home_venue, []).append(t.name)
            for venue_name, names in by_venue.items():
                if len(names) >= 2 and self.venue(venue_name).capacity == 1:
                    group = tuple(names)
                    if group not in groups:
                        groups.append(group)
        return tuple(groups)
