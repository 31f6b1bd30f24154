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
from datetime import date, time
from typing import TYPE_CHECKING, Any, ClassVar, Protocol

from scheduler.config.model import League

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Fixture, Season


@dataclass(frozen=True, slots=True)
class Violation:
    """One place where a rule is broken: by whom (``team``; empty for the league as a whole),
    where (``round`` 1-based and/or ``date``) and what happened, in plain words.

    Parameters
    ----------
    team : str
        The team that breaks the rule; empty when the league as a whole does.
    round : int or None
        The round, 1-based over the season; None when only the date is known.
    date : datetime.date or None
        The day; None for a season without dates.
    what : str
        What happened, in plain words.

    Examples
    --------
    >>> from datetime import date
    >>> Violation("Ashby", 2, date(2026, 9, 12), "3 home games in a row").to_dict()
    {'team': 'Ashby', 'round': 2, 'date': '2026-09-12', 'what': '3 home games in a row'}
    """

    team: str
    round: int | None
    date: date | None
    what: str

    def to_dict(self) -> dict:
        """The violation as JSON-ready values (the date as ISO text).

        Returns
        -------
        dict
            The keys ``team``, ``round``, ``date`` and ``what``.
        """
        return {"team": self.team, "round": self.round,
                "date": self.date.isoformat() if self.date else None, "what": self.what}


@dataclass(frozen=True, slots=True)
class RuleCheck:
    """The result of checking one of the league's hard rules on a season.

    Parameters
    ----------
    rule : str
        The rule's key (:attr:`HardRule.key`).
    statement : str
        The rule as the league states it.
    kept : bool
        True when the season has no violation of the rule.
    violations : tuple of Violation
        Every violation found, in the rule's order (empty when kept).

    Examples
    --------
    >>> from scheduler.config.model import League, Rules, Team
    >>> from scheduler.season import Fixture, Season
    >>> league = League("Weald Cup", "2026", "UTC", (Team("Ashby", "ASH"), Team("Brook", "BRO")),
    ...                 (), rules=Rules(max_home_run=1))
    >>> season = Season("Weald Cup", "2026", ("Ashby", "Brook"),
    ...                 (Fixture(1, "Ashby", "Brook"), Fixture(2, "Ashby", "Brook")))
    >>> from scheduler.rules import check_rules
    >>> result = check_rules(league, season)[0]
    >>> result.kept, result.to_dict()["violations"][0]["round"]
    (False, 2)
    """

    rule: str
    statement: str
    kept: bool
    violations: tuple[Violation, ...]

    def to_dict(self) -> dict:
        """The check as JSON-ready values.

        Returns
        -------
        dict
            The keys ``rule``, ``statement``, ``kept`` and ``violations`` (a list of
            :meth:`Violation.to_dict`).
        """
        return {"rule": self.rule, "statement": self.statement, "kept": self.kept,
                "violations": [v.to_dict() for v in self.violations]}


# A protocol is never instantiated: its (*args, **kwargs) signature is typing's, not ours.
class TimetableView(Protocol):  # numpydoc ignore=PR01
    """The small, named interface of the timetable model that rules use to add constraints.

    Rounds ``s`` are 0-based season rounds; ``v`` is a vertex of the factorization; ``t`` a team
    index (``league.teams`` order) among the teams the rules name (:meth:`HardRule.named_teams`).
    Literals are CP-SAT boolean variables.

    Examples
    --------
    A rule states each constraint under the assumption literal of its statement, so that when
    the rules cannot all hold the solver names the statements involved. A stand-in for one
    vertex and three rounds:

    >>> from ortools.sat.python import cp_model
    >>> class OneVertex:
    ...     def __init__(self):
    ...         self.cp = cp_model.CpModel()
    ...         self.home = [self.cp.new_bool_var(f"home_round_{s}") for s in range(3)]
    ...     def switch(self, statement):
    ...         return self.cp.new_bool_var(statement)
    ...     def vertex_home(self, s, v):
    ...         return self.home[s]
    >>> view = OneVertex()
    >>> rule_on = view.switch("at most 1 home game in a row")
    >>> for s in range(2):
    ...     _ = view.cp.add_bool_or([view.vertex_home(s, 0).negated(),
    ...                              view.vertex_home(s + 1, 0).negated()]).only_enforce_if(rule_on)
    >>> _ = view.cp.add(sum(view.home) == 2)
    >>> view.cp.add_assumptions([rule_on])
    >>> solver = cp_model.CpSolver()
    >>> solver.parameters.num_workers = 1
    >>> solver.status_name(solver.solve(view.cp)), [solver.value(h) for h in view.home]
    ('OPTIMAL', [1, 0, 1])
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
        """The assumption literal of a statement (one per distinct statement).

        Parameters
        ----------
        statement : str
            The statement in the organizer's words; the same text gives the same literal.

        Returns
        -------
        Any
            The literal: the rule's constraints hold when it is true.
        """

    def impossible(self, statement: str) -> None:
        """Record a statement that cannot hold at all (its literal is forced false).

        Parameters
        ----------
        statement : str
            The statement in the organizer's words.
        """

    def vertex_home(self, season_round: int, vertex: int) -> Any:
        """Literal: ``vertex`` plays at home in ``season_round`` (false at its bye).

        Parameters
        ----------
        season_round : int
            The season round, 0-based.
        vertex : int
            The vertex.

        Returns
        -------
        Any
            The literal.
        """

    def vertex_plays(self, season_round: int, vertex: int) -> Any:
        """Literal: ``vertex`` plays in ``season_round`` (``None`` in an even league: always).

        Parameters
        ----------
        season_round : int
            The season round, 0-based.
        vertex : int
            The vertex.

        Returns
        -------
        Any or None
            The literal; None when the vertex plays in every round.
        """

    def break_at(self, season_round: int, vertex: int) -> Any:
        """Literal: ``vertex`` has a break in ``season_round`` (1 or more).

        Parameters
        ----------
        season_round : int
            The season round, 0-based, 1 or more.
        vertex : int
            The vertex.

        Returns
        -------
        Any
            The literal.
        """

    def team_home(self, team: int, season_round: int) -> Any:
        """Literal: named team ``team`` plays at home in ``season_round``.

        Parameters
        ----------
        team : int
            The team's index in ``league.teams``; the team must be named by a rule.
        season_round : int
            The season round, 0-based.

        Returns
        -------
        Any
            The literal.
        """

    def team_bye(self, team: int, season_round: int) -> Any:
        """Literal: named team ``team`` sits out ``season_round`` (odd leagues).

        Parameters
        ----------
        team : int
            The team's index in ``league.teams``; the team must be named by a rule.
        season_round : int
            The season round, 0-based.

        Returns
        -------
        Any
            The literal.
        """

    def teams_meet(self, first_team: int, second_team: int, season_round: int,
                   literal: Any) -> None:
        """Under ``literal``: ``first_team`` and ``second_team`` (named) meet in ``season_round``.

        Parameters
        ----------
        first_team, second_team : int
            The two teams' indices in ``league.teams``; both must be named by a rule.
        season_round : int
            The season round, 0-based.
        literal : Any
            The enforcement literal (usually a statement's :meth:`switch`).
        """

    def position_in_leg(self, leg: int, round_index: int) -> Any:
        """Linear expression: the 0-based position of a factorization round in ``leg``.

        Parameters
        ----------
        leg : int
            The leg, 0-based.
        round_index : int
            The round of the factorization (leg 1's pairings), 0-based.

        Returns
        -------
        Any
            A CP-SAT linear expression with values ``0 .. rounds_per_leg - 1``.
        """

    def home_venue_groups(self) -> list[tuple[str, int, list[int]]]:
        """``(venue, capacity, team indices)`` of venues whose capacity a match day could exceed.

        Returns
        -------
        list of tuple of (str, int, list of int)
            One entry per such venue.
        """


class DateModelView(Protocol):
    """The small, named interface of the re-plan model (:mod:`scheduler.balance.repair`) that
    rules use to add their constraints for games placed on dates.

    Games are placed on *sittings*: a match day (one round a day) or a match day and a kick-off
    time (several rounds a day), ``d`` 0-based in time order. History is fixed and is not a
    variable: it enters through ``last_played``, :meth:`games_played`, :meth:`run_from_history`,
    :meth:`break_in` (which continues from the side of the last game played) and
    :meth:`meetings_on_match_days`.

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

    def away(self, team: str, d: int) -> Any:
        """Whether ``team`` plays away in sitting ``d``.

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

    def games_played(self, team: str) -> int:
        """How many games ``team`` has played in history.

        Parameters
        ----------
        team
            A team of the league.

        Returns
        -------
        int
            Its games on or before the last day of history.
        """

    def run_from_history(self, team: str, home: bool) -> int:
        """The run of home (``home``) or away games that ``team``'s history ends with; a re-plan
        continues it.

        Parameters
        ----------
        team
            A team of the league.
        home
            True for the home run, False for the away run.

        Returns
        -------
        int
            Its length (0 when the last game played was on the other side, or none was).
        """

    def break_in(self, team: str, d: int) -> Any:
        """Whether ``team`` has a break in sitting ``d``: it plays there on the same side as in
        its previous game (history included).

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

    def meetings_on_match_days(self) -> dict[frozenset[str], list[tuple[int, Any]]]:
        """Every meeting of each pair: its leg and its position among the season's match days
        (the dates of history and the candidate dates, 0-based in time order).

        Returns
        -------
        dict of frozenset of str to list of tuple of (int, Any)
            Pair -> ``(leg, position)`` per meeting, history first; the position is an int for
            a game played, a linear expression for a game to place.
        """


class HardRule:
    """Base of every hard rule (subclasses are frozen dataclasses without fields).

    A rule never changes the league; it reads the configuration fields it names
    (:attr:`config_fields`), adds its constraints to the timetable model, and checks any season
    from its fixtures alone. The rules of the package are listed in :data:`scheduler.rules.RULES`;
    ``docs/rules.md`` defines each of them.

    References
    ----------
    ``docs/rules.md``.

    Examples
    --------
    >>> from scheduler.config.model import League, Rules, Team
    >>> from scheduler.season import Fixture, Season
    >>> league = League("Weald Cup", "2026", "UTC", (Team("Ashby", "ASH"), Team("Brook", "BRO")),
    ...                 (), rules=Rules(max_home_run=1))
    >>> season = Season("Weald Cup", "2026", ("Ashby", "Brook"),
    ...                 (Fixture(1, "Ashby", "Brook"), Fixture(2, "Ashby", "Brook")))
    >>> from scheduler.rules import RULES
    >>> runs = next(rule for rule in RULES if rule.key == "runs")
    >>> runs.is_on(league), runs.statement(league)
    (True, 'at most 1 home games in a row')
    >>> [(v.team, v.round) for v in runs.check(league, season)]
    [('Ashby', 2)]
    """

    date_constraints: ClassVar[bool] = False
    """Whether the rule adds its own constraints to the re-plan's date model
    (:meth:`add_date_constraints`), as every rule whose constraints a re-plan can break does;
    see ``docs/rules.md`` for the two that need none."""

    key: ClassVar[str]
    """Short identifier used in reports (``rest_days``, ``runs``...)."""
    title: ClassVar[str]
    """What the rule is about, in the organizer's words."""
    config_fields: ClassVar[tuple[str, ...]]
    """The configuration fields it reads (``rules.min_rest_days``...)."""

    def is_on(self, league: League) -> bool:
        """True when the league uses the rule.

        Parameters
        ----------
        league : League
            The league.

        Returns
        -------
        bool
            Whether any of the rule's configuration fields switches it on.
        """
        raise NotImplementedError

    def statement(self, league: League) -> str:
        """The rule as the league states it, for checklists.

        Parameters
        ----------
        league : League
            The league (only a league that uses the rule is asked).

        Returns
        -------
        str
            The statement, for example ``"at most 2 home games in a row"``.
        """
        raise NotImplementedError

    def named_teams(self, league: League) -> set[str]:
        """Teams the constraints refer to by name (the model places them on vertices).

        Parameters
        ----------
        league : League
            The league.

        Returns
        -------
        set of str
            Team names; empty (the default) for rules that treat every team alike.
        """
        return set()

    def add_constraints(self, model: TimetableView) -> None:
        """Add the rule's constraints, each statement under its own assumption literal.

        Parameters
        ----------
        model : TimetableView
            The timetable model being built; ``model.league`` is the league.
        """
        raise NotImplementedError

    def date_constraints_on(self, league: League) -> bool:
        """Whether the rule adds constraints to the re-plan's date model for ``league``.

        Parameters
        ----------
        league : League
            The league.

        Returns
        -------
        bool
            :meth:`is_on` (the default); a rule overrides it when a re-plan states it in more
            leagues than a first plan does.
        """
        return self.is_on(league)

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
        """Every violation of the rule in ``season`` (empty: kept).

        Independent of the balancer: it reads only the fixtures (rounds, dates, venues) of the
        season, so it checks schedules read from elsewhere too.

        Parameters
        ----------
        league : League
            The league whose rule is checked.
        season : Season
            Any season: planned, or read by ``audit``.

        Returns
        -------
        tuple of Violation
            The violations, in the rule's own order.
        """
        raise NotImplementedError

    def lowered(self, league: League) -> tuple[tuple[str, int], ...]:
        """Each one-step relaxation of the rule's own fields: ``(field, value)`` with the value
        one step more lenient (a run one longer, one rest day or round fewer). The one home of
        these steps: :meth:`relaxation` words them for a clash, and a re-plan that has no
        solution tries them one by one.

        Parameters
        ----------
        league : League
            The league.

        Returns
        -------
        tuple of (str, int)
            The field (without ``rules.``) and its relaxed value; empty (the default) when the
            rule has no such step.
        """
        return ()

    def relaxation(self, league: League, statement: str) -> str | None:
        """The smallest change of the configuration that removes ``statement`` from a clash,
        when there is an obvious one (else ``None``).

        Parameters
        ----------
        league : League
            The league.
        statement : str
            One of the rule's statements (as given to :meth:`TimetableView.switch`).

        Returns
        -------
        str or None
            The change in the organizer's words, for example ``"max_home_run = 3"``: the step of
            :meth:`lowered` for the field the statement names; None when there is none.
        """
        for name, value in self.lowered(league):
            if statement.startswith(f"{name} = "):
                return f"{name} = {value}"
        return None


def team_games(season: Season, team: str) -> list[Fixture]:
    """The team's fixtures in the order it plays them.

    When every game of the team has a date, that order is the date, then the kick-off, then
    the round (a re-planned game keeps its round number but not its date,
    ``docs/replanning.md``); otherwise it is the round order. In a first plan both orders agree.

    Parameters
    ----------
    season : Season
        The season.
    team : str
        A team name.

    Returns
    -------
    list of Fixture
        Every game of the team, home or away, in playing order.
    """
    games = list(season.fixtures_of(team))
    if games and all(f.date is not None for f in games):
        return sorted(games, key=lambda f: (f.date, f.start.time() if f.start else time.min,
                                            f.round))
    return games


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
