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

    ``round`` is 1-based over the whole season (leg 2 continues the numbering of leg 1).
    ``home`` and ``away`` are team names; where "home" means a side or colour (one shared venue),
    ``home`` is the first-named side. ``court`` is the court or field inside the venue,
    ``slot`` the time-slot label (for example ``"19:30"``). ``start`` is timezone-aware.
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
        return (self.home, self.away)

    @property
    def pair(self) -> frozenset[str]:
        return frozenset((self.home, self.away))

    @property
    def place_label(self) -> str | None:
        """Court and time slot together, as one label (``"Court 2 · 19:30"``)."""
        parts = [p for p in (self.court, self.slot) if p]
        return " · ".join(parts) if parts else None


@dataclass(frozen=True, slots=True)
class MixingInfo:
    """What the schedule engine promised about mixing (checked again by ``fairness``)."""

    method: str
    source: str
    perfect: bool
    perfect_pairs: int
    pairs: int


@dataclass(frozen=True, slots=True)
class Revision:
    """One published version of a season: the first plan or a re-plan.

    ``played_through`` is the last day of history when the version was made (``None`` for the
    first plan), ``changed`` the number of future games whose date, start, court or home side
    changed against the version before, ``note`` a one-line summary for people.
    """

    revision: str
    played_through: date | None = None
    changed: int = 0
    note: str = ""


@dataclass(frozen=True, slots=True)
class PlanOptionFigures:
    """One option the planner weighed, as the outputs show it: its plain label, its figures
    (pairs of rounds that mix perfectly out of ``pairs``, breaks with their lower bound, the
    carry-over value; ``None`` where the option found no timetable that keeps every rule),
    whether it was chosen, and whether no other option is at least as good in every figure
    and better in one (``not_dominated``).

    Parameters
    ----------
    label
        The option's name, in plain text.
    perfect_pairs, pairs
        Pairs of rounds that mix perfectly, out of all pairs of rounds.
    breaks, break_bound
        Breaks of its timetable (``None``: no timetable keeps every rule) and their lower bound.
    carry_over
        Russell's carry-over value of leg 1 (``None`` when not measured).
    chosen
        Whether this option is the season's.
    not_dominated
        Whether no other option is at least as good in every figure and better in one.
    season
        The option's complete season (see below).
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


@dataclass(frozen=True)
class Season:
    """A complete season.

    ``byes`` maps a round to the teams that sit out in it (empty for an even league).
    ``legs`` is the number of legs (1 = single round robin). ``timezone`` is an IANA name.
    ``notes`` are human-readable remarks from the planner (trade-offs, relaxed priorities).

    What the outputs show, filled by the planner from the league file (the defaults fit a
    schedule read from elsewhere, whose league file is unknown): ``home_meaning`` is
    ``"venue"`` (the home team hosts) or ``"side"`` ("home" is a side or colour, for example
    White); ``side_labels`` name the home and the away side in that case (``("Home", "Away")``
    otherwise); ``venue_addresses`` maps a venue to its postal address and
    ``venue_coordinates`` to its (latitude, longitude) in degrees, for calendar entries.
    ``calendar_end`` is the last date the league file allows (``None`` when open or unknown).
    ``revisions`` is the revision history of a re-planned season (see :class:`Revision`).
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
        return tuple(f for f in self.fixtures if f.round == number)

    def fixtures_of(self, team: str) -> tuple[Fixture, ...]:
        """The team's fixtures in round order."""
        return tuple(
            sorted((f for f in self.fixtures if team in (f.home, f.away)), key=lambda f: f.round)
        )
