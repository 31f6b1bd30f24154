"""The season value: the one object every exporter, the report and the audit take.

A :class:`Season` is plain data: who plays whom, in which round and leg, where, in which slot and
when. It carries no solver state. Fairness figures are always recomputed from it
(``scheduler.fairness``), never taken from the engine's bookkeeping.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from datetime import date, datetime


@dataclass(frozen=True, slots=True)
class Fixture:
    """One game.

    Parameters
    ----------
    round : int
        The round, 1-based over the whole season (leg 2 continues the numbering of leg 1).
    home : str
        The home team's name; where "home" means a side or colour (one shared venue), the
        first-named side.
    away : str
        The away team's name.
    leg : int, optional
        The leg (1-based) the game belongs to.
    venue : str or None, optional
        The venue's name; None when not known (a schedule without places).
    court : str or None, optional
        The court or field inside the venue, when the venue has several.
    slot : str or None, optional
        The time-slot label, for example ``"19:30"``.
    date : datetime.date or None, optional
        The day of the game; None before the calendar step or when not known.
    start : datetime.datetime or None, optional
        The kick-off, timezone-aware; None when only the day is known.

    Examples
    --------
    >>> game = Fixture(round=1, home="Ashby Rovers", away="Brookfield", court="Court 2",
    ...                slot="19:30")
    >>> game.teams
    ('Ashby Rovers', 'Brookfield')
    >>> game.place_label
    'Court 2 · 19:30'
    >>> game.pair == Fixture(round=9, home="Brookfield", away="Ashby Rovers").pair
    True
    """

    round: int
    home: str
    away: str
    leg: int = 1
    venue: str | None = None
    court: str | None = None
    slot: str | None = None
    date: date | None = None
    start: datetime | None = None

    @property
    def teams(self) -> tuple[str, str]:
        """The two teams, home first."""
        return (self.home, self.away)

    @property
    def pair(self) -> frozenset[str]:
        """The two teams without order: the same for both meetings of a pair."""
        return frozenset((self.home, self.away))

    @property
    def place_label(self) -> str | None:
        """Court and time slot together, as one label (``"Court 2 · 19:30"``)."""
        parts = [p for p in (self.court, self.slot) if p]
        return " · ".join(parts) if parts else None


@dataclass(frozen=True, slots=True)
class MixingInfo:
    """What the schedule engine promised about mixing (checked again by ``fairness``).

    Two rounds *mix perfectly* when their games together form one cycle through every team
    (a perfect one-factorization has this for every pair of rounds; ``docs/one-factorizations.md``).

    Parameters
    ----------
    method : str
        The construction of the rounds, for example ``"circle GK_n"`` or ``"starter in Z_15"``.
    source : str
        The publication the construction comes from.
    perfect : bool
        True when every pair of rounds mixes perfectly.
    perfect_pairs : int
        Pairs of rounds of one leg that mix perfectly.
    pairs : int
        All pairs of rounds of one leg, ``R(R-1)/2`` for ``R`` rounds.

    Examples
    --------
    >>> info = MixingInfo("starter in Z_7", "a published construction", True, 21, 21)
    >>> info.perfect_pairs == info.pairs
    True
    """

    method: str
    source: str
    perfect: bool
    perfect_pairs: int
    pairs: int


@dataclass(frozen=True, slots=True)
class Revision:
    """One published version of a season: the first plan or a re-plan.

    Parameters
    ----------
    revision : str
        The version's id (12 hexadecimal digits of the league configuration and seed).
    played_through : datetime.date or None, optional
        The last day of history when the version was made; None for the first plan.
    changed : int, optional
        The number of future games whose date, start, court or home side changed against the
        version before.
    note : str, optional
        A one-line summary for people.
    postponed : tuple of tuple of (str, str, datetime.date), optional
        The games this version re-placed after a postponement, as ``(home, away, planned
        date)``, so that a later re-plan with the same events file knows them as already
        applied.
    """

    revision: str
    played_through: date | None = None
    changed: int = 0
    note: str = ""
    postponed: tuple[tuple[str, str, date], ...] = ()


@dataclass(frozen=True, slots=True)
class PlanOptionFigures:
    """One option the planner weighed, as the outputs show it: its plain label, its figures
    (pairs of rounds that mix perfectly out of ``pairs``, breaks with their lower bound, the
    carry-over value; ``None`` where the option found no timetable that keeps every rule),
    whether it was chosen, and whether no other option is at least as good in every figure
    and better in one (``not_dominated``).

    Parameters
    ----------
    label : str
        The option in plain words.
    perfect_pairs : int
        Pairs of rounds of one leg that mix perfectly.
    pairs : int
        All pairs of rounds of one leg.
    breaks : int or None
        Total breaks of the option's timetable; None when it found no timetable.
    break_bound : int
        The proven lower bound on the breaks (``scheduler.leg_schemes.break_lower_bound``).
    carry_over : int or None
        The carry-over effects value (``scheduler.carry_over``); None when it found no
        timetable.
    chosen : bool
        True for the option the season uses.
    not_dominated : bool
        True when no other option is at least as good in every figure and better in one.
    season : Season or None, optional
        The option's complete season (see below).
    detail : str, optional
        The long description beside the short label (which factorization, from which source,
        in which round order); empty when there is nothing to add.
    """

    label: str
    perfect_pairs: int
    pairs: int
    breaks: int | None
    break_bound: int
    carry_over: int | None
    chosen: bool
    not_dominated: bool
    season: Season | None = field(default=None, compare=False, repr=False)
    """The option's complete season as the outputs would publish it (its own options empty),
    kept so that another option can be chosen without solving again; ``None`` for an option
    without a timetable and for options read back from ``season.json`` (the timetables are in
    the season folder's options file, ``docs/options.md``)."""
    detail: str = ""
    """The option's long description; the label stays short (``docs/options.md``)."""


@dataclass(frozen=True)
class Season:
    """A complete season.

    The fields after ``notes`` are what the outputs show, filled by the planner from the league
    file; their defaults fit a schedule read from elsewhere, whose league file is unknown.

    Parameters
    ----------
    league : str
        The league's name.
    season_id : str
        The season's label from the league file (for example ``"2026/27"``); may be empty.
    teams : tuple of str
        The team names, in the league file's order.
    fixtures : tuple of Fixture
        Every game.
    byes : dict of int to tuple of str, optional
        Round number to the teams that sit out in it (empty for an even league).
    legs : int, optional
        Number of legs (1 = single round robin).
    scheme : str, optional
        How later legs repeat leg 1 (``scheduler.leg_schemes.SCHEMES``).
    timezone : str or None, optional
        The IANA name of the league's time zone; None when not known.
    venues : tuple of str, optional
        The venue names.
    mixing : MixingInfo or None, optional
        What the engine promised about mixing; None for a schedule read from elsewhere.
    seed : int, optional
        The seed the season was planned with.
    notes : tuple of str, optional
        Human-readable remarks from the planner (trade-offs, relaxed priorities).
    revision : str, optional
        The plan revision id; empty for a schedule this program did not plan.
    home_meaning : str, optional
        ``"venue"`` (the home team hosts) or ``"side"`` ("home" is a side or colour, for
        example White).
    side_labels : tuple of (str, str), optional
        The names of the home and the away side (``("Home", "Away")`` unless sides are meant).
    venue_addresses : dict of str to str, optional
        Venue name to postal address, for calendar entries.
    venue_coordinates : dict of str to (float, float), optional
        Venue name to (latitude, longitude) in degrees, for calendar entries.
    calendar_end : datetime.date or None, optional
        The last date the league file allows; None when open or unknown.
    revisions : tuple of Revision, optional
        Earlier versions, oldest first, then this one (empty for a season never re-planned).
    options : tuple of PlanOptionFigures, optional
        The options the planner weighed (empty for a schedule read from elsewhere).

    See Also
    --------
    scheduler.plan.plan_season : Plans a season from a league file.

    Examples
    --------
    >>> season = Season(
    ...     league="Riverside Cup", season_id="2026", teams=("Ashby", "Brook", "Cole"),
    ...     fixtures=(Fixture(1, "Ashby", "Brook"), Fixture(2, "Brook", "Cole"),
    ...               Fixture(3, "Cole", "Ashby")),
    ...     byes={1: ("Cole",), 2: ("Ashby",), 3: ("Brook",)})
    >>> season.rounds, season.planned
    (3, False)
    >>> [game.round for game in season.fixtures_of("Ashby")]
    [1, 3]
    """

    league: str
    season_id: str
    teams: tuple[str, ...]
    fixtures: tuple[Fixture, ...]
    byes: dict[int, tuple[str, ...]] = field(default_factory=dict)
    legs: int = 1
    scheme: str = "mirrored"
    timezone: str | None = None
    venues: tuple[str, ...] = ()
    mixing: MixingInfo | None = None
    seed: int = 0
    notes: tuple[str, ...] = ()
    revision: str = ""
    home_meaning: str = "venue"
    side_labels: tuple[str, str] = ("Home", "Away")
    venue_addresses: dict[str, str] = field(default_factory=dict)
    venue_coordinates: dict[str, tuple[float, float]] = field(default_factory=dict)
    calendar_end: date | None = None
    revisions: tuple[Revision, ...] = ()
    """Earlier versions, oldest first, then this one (empty for a season never re-planned)."""
    options: tuple[PlanOptionFigures, ...] = ()
    """The options the planner weighed (empty for a schedule read from elsewhere)."""

    @property
    def planned(self) -> bool:
        """True for a season planned by this program (it has a plan revision)."""
        return bool(self.revision)

    @property
    def rounds(self) -> int:
        """Number of rounds (the largest round number of any fixture or bye)."""
        numbers = [f.round for f in self.fixtures] + list(self.byes)
        return max(numbers, default=0)

    def fixtures_in_round(self, number: int) -> tuple[Fixture, ...]:
        """The games of one round, in the season's order.

        Parameters
        ----------
        number : int
            The round, 1-based over the whole season.

        Returns
        -------
        tuple of Fixture
            The round's games; empty for a round without games.
        """
        return tuple(f for f in self.fixtures if f.round == number)

    def fixtures_of(self, team: str) -> tuple[Fixture, ...]:
        """The team's fixtures in round order.

        Parameters
        ----------
        team : str
            A team name, as in :attr:`teams`.

        Returns
        -------
        tuple of Fixture
            Every game the team plays, home or away; empty for an unknown name.
        """
        return tuple(
            sorted((f for f in self.fixtures if team in (f.home, f.away)), key=lambda f: f.round)
        )
