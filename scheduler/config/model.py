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
    """A team of the league.

    Parameters
    ----------
    name : str
        The team's name, unique in the league (compared without case and spacing).
    code : str
        A short name for tables: up to 8 letters or digits, made from the name when the league
        file gives none.
    home_venue : str or None, optional
        The name of the venue it hosts its home games at; None when "home" means a side
        (``Format.home_meaning == "side"``).

    Examples
    --------
    >>> Team("Quillbury Town", "QUI", home_venue="Quillbury Park").home_venue
    'Quillbury Park'
    """

    name: str
    code: str
    home_venue: str | None = None


@dataclass(frozen=True, slots=True)
class Venue:
    """A ground or hall. ``courts`` are its courts/fields/tables, ``slots`` its kick-off times.

    Parameters
    ----------
    name : str
        The venue's name, unique in the league.
    courts : tuple of str, optional
        Its courts, pitches or tables; games at the same time need different ones.
    slots : tuple of datetime.time, optional
        Its kick-off times; empty to use the league's ``calendar.kickoff``.
    address : str or None, optional
        Postal address, shown in calendar entries and on the season site.
    latitude, longitude : float or None, optional
        Position in decimal degrees (north and east positive); both or neither.

    Examples
    --------
    >>> from datetime import time
    >>> hall = Venue("Harrowfen Fields", courts=("North Pitch", "South Pitch"),
    ...              slots=(time(10, 30), time(14, 30)))
    >>> hall.capacity
    4
    >>> Venue("Wenlow Lane").capacity
    1
    """

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
    """How often pairs meet and what "home" means.

    Parameters
    ----------
    legs : int, optional
        How many times every pair meets (1 = single round robin, 2 = home and away).
    scheme : {"mirrored", "french", "english", "inverted", "free"}, optional
        How each later leg repeats the pairings of the leg before, venues swapped
        (``scheduler.leg_schemes``, ``docs/leg-schemes.md``).
    home_meaning : {"venue", "side"}, optional
        ``"venue"``: the home team hosts at its home venue; ``"side"``: "home" names a side or
        colour and games are spread over shared venues.
    side_labels : tuple of (str, str), optional
        Names of the home and the away side in schedules.

    Examples
    --------
    >>> Format(legs=2, home_meaning="side", side_labels=("Light", "Dark")).grid_labels
    ('Light', 'Dark')
    >>> Format().grid_labels
    ('H', 'A')
    """

    legs: int = 1
    scheme: Scheme = "mirrored"
    home_meaning: HomeMeaning = "venue"
    side_labels: tuple[str, str] = ("Home", "Away")

    @property
    def grid_labels(self) -> tuple[str, str]:
        """Labels of the home and the away side in grids: the side names when "home" is a side
        or colour, else ``("H", "A")``.
        """
        return self.side_labels if self.home_meaning == "side" else ("H", "A")


@dataclass(frozen=True, slots=True)
class TeamDates:
    """Dates that concern one team (the days it cannot play, or cannot play at home).

    Parameters
    ----------
    team : str
        The team's name.
    dates : tuple of datetime.date
        The dates.

    Examples
    --------
    >>> from datetime import date
    >>> TeamDates("Wenlow Swifts", (date(2027, 11, 13),)).dates[0].isoformat()
    '2027-11-13'
    """

    team: str
    dates: tuple[date, ...]


@dataclass(frozen=True, slots=True)
class FixedFixture:
    """This game in that round or on that date. ``home`` is at home unless ``any_venue``.

    Parameters
    ----------
    home : str
        The team that hosts (or, with ``any_venue``, one of the two teams).
    away : str
        The other team.
    round : int or None, optional
        The round the game must be in, 1-based; None when a date is given.
    date : datetime.date or None, optional
        The day the game must be on; None when a round is given. Exactly one of ``round`` and
        ``date`` is set in a validated league.
    any_venue : bool, optional
        Let the planner choose which of the two teams is at home.

    Examples
    --------
    >>> FixedFixture("Quillbury Town", "Oakrill Wanderers", round=1).any_venue
    False
    """

    home: str
    away: str
    round: int | None = None
    date: date | None = None
    any_venue: bool = False


@dataclass(frozen=True)
class Rules:
    """Hard rules. ``None`` or an empty tuple means the rule is not used.

    Each rule is described, with its constraints and its check, in ``docs/rules.md``.

    Parameters
    ----------
    unavailable : tuple of TeamDates, optional
        Days a team cannot play at all.
    no_home_games : tuple of TeamDates, optional
        Days a team may play, but not at home.
    shared_grounds : tuple of tuple of str, optional
        Groups of teams of which at most one is at home on a match day.
    fixed : tuple of FixedFixture, optional
        Games fixed to a round or a date.
    max_home_run, max_away_run : int or None, optional
        At most this many home (away) games in a row; None: no limit.
    no_breaks_first, no_breaks_last : int, optional
        No team has a break (two home or two away games in a row) in this many rounds at the
        start (end) of the season; 0: the rule is off.
    min_rest_days : int or None, optional
        At least this many days without a game between two games of a team; None: off.
    min_separation : int or None, optional
        At least this many rounds between two meetings of a pair (two legs or more); None: off.

    Examples
    --------
    >>> rules = Rules(max_home_run=2, max_away_run=2, no_breaks_first=1)
    >>> rules.min_rest_days is None and rules.fixed == ()
    True
    """

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
    """Weights (>= 0) of the soft goals; larger means more important.

    A weight 0 means the planner does not care about the goal.

    Parameters
    ----------
    mixing : int, optional
        Every team meets the league in a well-mixed order (pairs of rounds that mix
        perfectly; ``docs/one-factorizations.md``).
    breaks : int, optional
        Few home-home or away-away runs.
    venue_balance : int, optional
        Teams play about equally often at each court of a shared venue.
    slot_balance : int, optional
        Teams get about equally many early and late kick-offs.
    carry_over : int, optional
        Low carry-over effects value (``docs/carry-over.md``).

    Examples
    --------
    >>> Priorities(breaks=5).breaks > Priorities().mixing
    True
    """

    mixing: int = 4
    breaks: int = 3
    venue_balance: int = 2
    slot_balance: int = 2
    carry_over: int = 1


@dataclass(frozen=True)
class League:
    """A validated league file: what ``load_league`` and ``parse_league`` return.

    Parameters
    ----------
    name : str
        The league's name, printed on every output.
    season : str
        Which season (any text, for example ``"2027-28"``).
    timezone : str
        The IANA time zone of the kick-off times.
    teams : tuple of Team
        The teams, in the file's order (the order of every table).
    venues : tuple of Venue
        The venues.
    format : Format, optional
        Legs, scheme and the meaning of "home".
    calendar : CalendarSpec, optional
        The match days and kick-off.
    rules : Rules, optional
        The hard rules.
    priorities : Priorities, optional
        Weights of the soft goals.
    seed : int, optional
        The planner's seed (0 or more): the same file and seed give the same schedule.
    solve_seconds : float, optional
        How long the planner may search, in seconds (the file's ``time_limit_seconds``).
    source : str or None, optional
        The file the league was read from, for messages; None for data built in code.

    Examples
    --------
    >>> league = League(
    ...     name="Marlwick Cup", season="2027", timezone="Europe/London",
    ...     teams=(Team("Ferncombe", "FER", "Rec"), Team("Marlwick", "MAR", "Rec")),
    ...     venues=(Venue("Rec"),))
    >>> league.team_names
    ('Ferncombe', 'Marlwick')
    >>> league.team("Marlwick").code
    'MAR'
    >>> league.shared_ground_groups  # one pitch, one slot: never both at home
    (('Ferncombe', 'Marlwick'),)
    """

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
        """The team names, in the league file's order."""
        return tuple(t.name for t in self.teams)

    def team(self, name: str) -> Team:
        """The team of that name.

        Parameters
        ----------
        name : str
            The exact team name.

        Returns
        -------
        Team
            The team.

        Raises
        ------
        KeyError
            For a name that is not a team of the league.
        """
        for t in self.teams:
            if t.name == name:
                return t
        raise KeyError(name)

    def venue(self, name: str) -> Venue:
        """The venue of that name.

        Parameters
        ----------
        name : str
            The exact venue name.

        Returns
        -------
        Venue
            The venue.

        Raises
        ------
        KeyError
            For a name that is not a venue of the league.
        """
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
