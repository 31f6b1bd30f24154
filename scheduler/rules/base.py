"""What every hard rule is made of, and the interface the timetable model offers to rules.

A hard rule is one small object (see :class:`HardRule`) holding

- the configuration fields it reads (``config_fields``) and whether the league switches it on;
- its CP-SAT constraints, added to the timetable model through :class:`TimetableView` under its
  own assumption literals (one per statement, so that a clash names the statements involved),
  and for some rules also to the re-plan's date model through :class:`DateModelView`;
- an independent check of any :class:`~scheduler.season.Season`, from the fixtures alone (it
  imports nothing from the balancer), returning :class:`Violation` values;
- its statement in the organizer's words, and where cheap the smallest relaxation to try.

Adding a rule means adding one module to ``scheduler/rules/`` and naming it in
:data:`scheduler.rules.RULES`; ``docs/rules.md`` lists the rules with their definitions.
"""

from __future__ import annotations

from dataclasses import dataclass
from datetime import date
from typing import TYPE_CHECKING, Any, ClassVar, Protocol

from scheduler.config.model import League

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Fixture, Season


@dataclass(frozen=True, slots=True)
class Violation:
    """One place where a rule is broken: by whom (``team``; empty for the league as a whole),
    where (``round`` 1-based and/or ``date``) and what happened, in plain words."""

    team: str
    round: int | None
    date: date | None
    what: str

    def to_dict(self) -> dict:
        return {"team": self.team, "round": self.round,
                "date": self.date.isoformat() if self.date else None, "what": self.what}


@dataclass(frozen=True, slots=True)
class RuleCheck:
    """The result of checking one of the league's hard rules on a season."""

    rule: str
    statement: str
    kept: bool
    violations: tuple[Violation, ...]

    def to_dict(self) -> dict:
        return {"rule": self.rule, "statement": self.statement, "kept": self.kept,
                "violations": [v.to_dict() for v in self.violations]}


class TimetableView(Protocol):
    """The small, named interface of the timetable model that rules use to add constraints.

    Rounds ``s`` are 0-based season rounds; ``v`` is a vertex of the factorization; ``t`` a team
    index (``league.teams`` order) among the teams the rules name (:meth:`HardRule.named_teams`).
    Literals are CP-SAT boolean variables.
    """

    cp: Any
    """The ``ortools.sat.python.cp_model.CpModel``."""
    league: League
    odd: bool
    legs: int
    rounds_per_leg: int
    season_rounds: int
    scheme: str
    vertices: list[int]
    rounds_per_day: int
    day_groups: list[list[int]]
    group_of_round: dict[int, int]
    days: Any
    """The :class:`~scheduler.balance.dates.DayModel` of the match days, or ``None`` when the
    calendar is too short (the model then forbids the season outright)."""
    day_index: dict[date, int]
    team_index: dict[str, int]

    def switch(self, statement: str) -> Any:
        """The assumption literal of a statement (one per distinct statement)."""

    def impossible(self, statement: str) -> None:
        """Record a statement that cannot hold at all (its literal is forced false)."""

    def vertex_home(self, s: int, v: int) -> Any:
        """Literal: vertex ``v`` plays at home in round ``s`` (false at its bye)."""

    def vertex_plays(self, s: int, v: int) -> Any:
        """Literal: vertex ``v`` plays in round ``s`` (``None`` in an even league: always)."""

    def break_at(self, s: int, v: int) -> Any:
        """Literal: vertex ``v`` has a break in round ``s`` (``s >= 1``)."""

    def team_home(self, t: int, s: int) -> Any:
        """Literal: named team ``t`` plays at home in round ``s``."""

    def team_bye(self, t: int, s: int) -> Any:
        """Literal: named team ``t`` sits out round ``s`` (odd leagues)."""

    def teams_meet(self, a: int, b: int, s: int, literal: Any) -> None:
        """Under ``literal``: named teams ``a`` and ``b`` meet in round ``s``."""

    def position_in_leg(self, leg: int, k: int) -> Any:
        """Linear expression: the 0-based position of factorization round ``k`` in ``leg``."""

    def home_venue_groups(self) -> list[tuple[str, int, list[int]]]:
        """``(venue, capacity, team indices)`` of venues whose capacity a match day could exceed."""


class DateModelView(Protocol):
    """The small, named interface of the re-plan model (:mod:`scheduler.balance.repair`) that
    rules use to add their constraints for games placed on dates.

    Games are placed on *sittings*: a match day (one round a day) or a match day and a kick-off
    time (several rounds a day), ``d`` 0-based in time order. History is fixed and is not a
    variable: it enters through ``last_played``.

    Parameters
    ----------
    *args, **kwargs
        Not used: the re-plan model (:class:`scheduler.balance.repair.RepairModel`) provides
        this interface; the protocol itself is never built.
    """

    cp: Any
    """The ``ortools.sat.python.cp_model.CpModel``."""
    league: League
    days: list[date]
    """The date of each sitting."""
    teams: list[str]
    last_played: dict[str, date | None]
    """Each team's last game in history (``None``: it has played none)."""

    def switch(self, statement: str) -> Any:
        """The literal that enforces a statement (an assumption when explaining a clash).

        Parameters
        ----------
        statement
            The rule in the organizer's words.

        Returns
        -------
        Any
            A CP-SAT Boolean.
        """

    def plays(self, team: str, d: int) -> Any:
        """Whether ``team`` plays in sitting ``d``.

        Parameters
        ----------
        team
            A team of the league.
        d
            Index of a sitting.

        Returns
        -------
        Any
            A linear expression, 1 when it plays, else 0.
        """

    def home(self, team: str, d: int) -> Any:
        """Whether ``team`` plays at home in sitting ``d``.

        Parameters
        ----------
        team
            A team of the league.
        d
            Index of a sitting.

        Returns
        -------
        Any
            A CP-SAT Boolean.
        """

    def sittings_on(self, day: date) -> list[int]:
        """The sittings on ``day``.

        Parameters
        ----------
        day
            A date.

        Returns
        -------
        list of int
            Their indices (empty when no game can be placed on ``day``).
        """


class HardRule:
    """Base of every hard rule (subclasses are frozen dataclasses without fields)."""

    date_constraints: ClassVar[bool] = False
    """Whether the rule adds its own constraints to the re-plan's date model
    (:meth:`add_date_constraints`); the re-plan model states the others itself."""

    key: ClassVar[str]
    """Short identifier used in reports (``rest_days``, ``runs``...)."""
    title: ClassVar[str]
    """What the rule is about, in the organizer's words."""
    config_fields: ClassVar[tuple[str, ...]]
    """The configuration fields it reads (``rules.min_rest_days``...)."""

    def is_on(self, league: League) -> bool:
        """True when the league uses the rule."""
        raise NotImplementedError

    def statement(self, league: League) -> str:
        """The rule as the league states it, for checklists."""
        raise NotImplementedError

    def named_teams(self, league: League) -> set[str]:
        """Teams the constraints refer to by name (the model places them on vertices)."""
        return set()

    def add_constraints(self, model: TimetableView) -> None:
        """Add the rule's constraints, each statement under its own assumption literal."""
        raise NotImplementedError

    def add_date_constraints(self, model: DateModelView) -> None:
        """Add the rule's constraints to the re-plan model, where games are placed on dates
        (only rules with :attr:`date_constraints`), each statement under its own literal.

        Parameters
        ----------
        model
            The re-plan model's interface for rules.
        """
        raise NotImplementedError

    def check(self, league: League, season: Season) -> tuple[Violation, ...]:
        """Every violation of the rule in ``season`` (empty: kept)."""
        raise NotImplementedError

    def relaxation(self, league: League, statement: str) -> str | None:
        """The smallest change of the configuration that removes ``statement`` from a clash,
        when there is an obvious one (else ``None``)."""
        return None


def team_games(season: Season, team: str) -> list[Fixture]:
    """The team's fixtures in round order (the order its games are played)."""
    return sorted((f for f in season.fixtures if team in (f.home, f.away)),
                  key=lambda f: f.round)


def plural(count: int, word: str) -> str:
    """``count`` followed by ``word``, with an ``s`` unless ``count`` is 1.

    Parameters
    ----------
    count
        The number.
    word
        The singular noun.

    Returns
    -------
    str
        For example ``"1 day"`` or ``"3 days"``.
    """
    return f"{count} {word}" if count == 1 else f"{count} {word}s"
