"""The timetable model (OR-Tools CP-SAT): round order, teams on vertices, home/away, match days.

Given a one-factorization of K_n (``n`` even; an odd league plays on ``n = teams + 1`` with the
bye vertex ``n - 1``) the model decides

- the order of the factorization's rounds in every leg (one order for the fixed schemes, see
  :mod:`scheduler.leg_schemes`; one per leg for "free");
- which vertex each team named in a team-specific rule sits on (the others fill the free vertices
  in order afterwards);
- the venue of every game of leg 1 (later legs swap it leg by leg);
- the match day of every group of ``rounds_per_day`` rounds (:mod:`scheduler.balance.dates`);

subject to the league's hard rules (:mod:`scheduler.rules`, one module each, added through the
small interface :class:`scheduler.rules.TimetableView` that this class implements), each
statement under its own assumption literal (:mod:`scheduler.balance.explain`), and minimises the
total number of breaks (then the lateness of the match days). Breaks are counted over the games
actually played: a bye is skipped.

The lower bound of :func:`scheduler.leg_schemes.break_lower_bound` (``docs/leg-schemes.md``) is
added as a constraint so that CP-SAT can prove optimality as soon as it reaches it. The search
starts from the hint of :mod:`scheduler.balance.starting_point`.

Variable names say what they mean: ``leg1_position{q}_plays_round{k}``, ``round{k}_{a}v{b}_first_
vertex_home``, ``vertex{v}_home_in_round{s}``, ``vertex{v}_break_in_round{s}``,
``team{t}_on_vertex{v}``, ``day_{g}_{d}``...
"""

from __future__ import annotations

from dataclasses import dataclass
from datetime import date

from ortools.sat.python import cp_model

from scheduler import leg_schemes
from scheduler.balance.dates import DayModel, candidate_days, day_groups
from scheduler.balance.explain import RuleBook, explain
from scheduler.balance.solver import SolveLimits, configure
from scheduler.balance.starting_point import starting_point
from scheduler.config.model import League
from scheduler.errors import InfeasibleError
from scheduler.factorization.circle import circle_rounds
from scheduler.factorization.model import Factorization
from scheduler.home_away import total_breaks
from scheduler.interrupt import solve_interruptibly
from scheduler.rules import RULES
from scheduler.rules.venue_capacity import capacity_groups


@dataclass(frozen=True)
class Timetable:
    """A solved timetable, by team index (``league.teams`` order).

    Parameters
    ----------
    n
        Number of vertices of the factorization (teams, plus the bye vertex of an odd league).
    vertex_of_team
        The factorization vertex each team was placed on.
    order
        ``order[l]``: the factorization's round index at every position of leg ``l``.
    games
        ``games[s]``: the (home, away) team indexes of season round ``s`` (0-based).
    byes
        ``byes[s]``: the teams sitting out season round ``s``.
    day
        ``day[s]``: index into ``days`` of the match day of season round ``s``.
    days
        The candidate match days.
    breaks
        Total breaks (byes skipped).
    break_bound
        The proven lower bound on breaks for the league's size and leg scheme.
    break_bound_reason
        The argument the bound rests on, in words.
    status
        ``"optimal"`` when CP-SAT proved its objective best, else ``"feasible"``.
    wall_cap_hit
        ``True`` when the solve stopped at the wall-clock safety net (the result may then
        depend on the machine).
    orientation
        Leg-1 venue of every factorization game ``(a, b, a_is_home)`` (vertices, a < b).

    References
    ----------
    ``docs/leg-schemes.md`` (break bounds); ``docs/rules.md``.

    Examples
    --------
    >>> from scheduler.balance import SolveLimits, solve_timetable
    >>> from scheduler.config import parse_league
    >>> from scheduler.factorization import circle_factorization
    >>> clubs = ["Quenby", "Larkholt", "Ebbside", "Morrow"]
    >>> league = parse_league({
    ...     "league": {"name": "Quenby Four", "season": "2031", "timezone": "Europe/London"},
    ...     "calendar": {"start": "2031-01-07", "end": "2031-04-29", "weekdays": ["tue"]},
    ...     "venues": [{"name": f"{club} Hall"} for club in clubs],
    ...     "teams": [{"name": club, "home_venue": f"{club} Hall"} for club in clubs]})
    >>> timetable = solve_timetable(league, circle_factorization(4), SolveLimits(5.0, 60.0, 0))
    >>> len(timetable.games), timetable.breaks, timetable.break_bound, timetable.status
    (3, 2, 2, 'optimal')
    >>> timetable.days[timetable.day[0]]
    datetime.date(2031, 1, 7)
    """

    n: int
    vertex_of_team: tuple[int, ...]
    order: tuple[tuple[int, ...], ...]
    games: tuple[tuple[tuple[int, int], ...], ...]
    byes: tuple[tuple[int, ...], ...]
    day: tuple[int, ...]
    days: tuple[date, ...]
    breaks: int
    break_bound: int
    break_bound_reason: str
    status: str
    wall_cap_hit: bool
    orientation: tuple[tuple[int, int, bool], ...] = ()
    """Leg-1 venue of every factorization game ``(a, b, a_is_home)`` (vertices, a < b)."""


class TimetableModel:
    """Builds and solves the CP-SAT model for one factorization and one league.

    Every hard rule adds its constraints through the small interface below (``switch``,
    ``team_home``, ``break_at``, ...; :class:`scheduler.rules.base.TimetableView`), each
    statement under its own assumption literal, so that a clash can be explained.

    Parameters
    ----------
    league
        The league and its rules.
    fact
        The round pairings (K_n, n even; an odd league's bye is vertex n - 1).
    minimise_breaks
        Minimise the breaks (else only the lateness of the match days).
    fixed_order
        A leg-1 round order to keep (factorization round indexes), or ``None``.
    earliest_days
        Play the day groups on the earliest candidate days only (a smaller model, tried
        first).
    effort
        Scales the search for a starting point (the deterministic seconds of the solve).
    start_home
        Leg-1 venues to start from (``{(a, b): a is at home}``), or ``None``.
    cp
        Build into this CP-SAT model instead of a new one (several divisions in one model,
        :mod:`scheduler.divisions.joint`); ``None`` for a model of its own.
    extra_named
        Teams placed on vertices explicitly even without a team-specific rule, so that
        :meth:`team_home` can speak of them.
    free_days
        Let the model choose the match days even when no rule names a date.

    Raises
    ------
    ConfigError
        Too few match days in the calendar.

    References
    ----------
    ``docs/rules.md``; ``docs/leg-schemes.md``.
    """

    def __init__(self, league: League, fact: Factorization, *, minimise_breaks: bool = True,
                 fixed_order: tuple[int, ...] | None = None, earliest_days: bool = False,
                 effort: float = 2.0,
                 start_home: dict[tuple[int, int], bool] | None = None,
                 cp: cp_model.CpModel | None = None, extra_named: tuple[str, ...] = (),
                 free_days: bool = False) -> None:
        self.earliest_days = earliest_days
        self.start_home = start_home
        self.effort = effort
        self.league = league
        self.fact = fact
        self.extra_named = extra_named
        self.free_days = free_days
        self.cp = cp if cp is not None else cp_model.CpModel()
        self.book = RuleBook(self.cp)
        self.teams = len(league.teams)
        self.odd = self.teams % 2 == 1
        n = fact.n
        if n != self.teams + (1 if self.odd else 0):
            raise ValueError(f"factorization of K_{n} does not fit {self.teams} teams")
        self.n = n
        self.rounds_per_leg = n - 1
        self.legs = max(1, league.format.legs)
        self.season_rounds = self.legs * self.rounds_per_leg
        self.scheme: str = league.format.scheme if self.legs > 1 else "mirrored"
        self.bye = n - 1 if self.odd else None
        self.vertices = list(range(n - 1)) if self.odd else list(range(n))
        self.partner = fact.partner_table()
        self.rounds_per_day = max(1, league.calendar.rounds_per_day)
        self.day_groups = day_groups(self.season_rounds, self.rounds_per_day)
        self.group_of_round = {s: g for g, rounds in enumerate(self.day_groups) for s in rounds}
        self._team_home: dict[tuple[int, int], cp_model.IntVar] = {}
        self._team_bye: dict[tuple[int, int], cp_model.IntVar] = {}
        self.minimise_breaks = minimise_breaks
        self._build_round_order(fixed_order)
        self._build_venues()
        self._build_team_placement()
        self._build_breaks()
        self._build_days()
        for rule in RULES:
            rule.add_constraints(self)
        self._build_objective()

    # --- the interface offered to the rules (scheduler.rules.TimetableView) -----------------
    def switch(self, statement: str) -> cp_model.IntVar:
        """The assumption literal of ``statement`` (one per distinct statement).

        Parameters
        ----------
        statement
            A hard rule's statement in the organizer's words.

        Returns
        -------
        ortools.sat.python.cp_model.IntVar
            The literal under which the statement's constraints are enforced.
        """
        return self.book.rule(statement)

    def impossible(self, statement: str) -> None:
        """A statement that cannot hold at all (found before solving): its literal is false.

        Parameters
        ----------
        statement
            The statement in the organizer's words.
        """
        self.book.forbid(statement)

    def vertex_home(self, season_round: int, vertex: int) -> cp_model.IntVar:
        """Literal: ``vertex`` plays at home in ``season_round`` (false at its bye).

        Parameters
        ----------
        season_round
            Season round, 0-based.
        vertex
            Factorization vertex.

        Returns
        -------
        ortools.sat.python.cp_model.IntVar
            The literal.
        """
        return self.home_in_round[season_round][vertex]

    def vertex_plays(self, season_round: int, vertex: int) -> cp_model.BoolVarT | None:
        """Literal: ``vertex`` plays in ``season_round`` (None = always).

        Parameters
        ----------
        season_round
            Season round, 0-based.
        vertex
            Factorization vertex.

        Returns
        -------
        ortools.sat.python.cp_model.IntVar or None
            The literal; ``None`` in an even league, where every vertex always plays.
        """
        if not self.odd:
            return None
        return self.round_holds[season_round][self.bye_round[vertex]].negated()

    def break_at(self, season_round: int, vertex: int) -> cp_model.IntVar:
        """Literal: ``vertex`` has a break in ``season_round`` (1 or more).

        Parameters
        ----------
        season_round
            Season round, 0-based, at least 1 (a break is counted in its second round).
        vertex
            Factorization vertex.

        Returns
        -------
        ortools.sat.python.cp_model.IntVar
            The literal.
        """
        return self.break_in_round[season_round][vertex]

    def team_home(self, team: int, season_round: int) -> cp_model.IntVar:
        """Literal: ``team`` (named by a rule) plays at home in ``season_round``.

        Parameters
        ----------
        team
            Team index in ``league.teams`` (a team a rule names, placed on a vertex by the
            model).
        season_round
            Season round, 0-based.

        Returns
        -------
        ortools.sat.python.cp_model.IntVar
            The literal (made once per team and round).
        """
        key = (team, season_round)
        if key not in self._team_home:
            literal = self.cp.new_bool_var(f"team{team}_home_in_round{season_round}")
            for vertex, on_vertex in self.team_on_vertex[team].items():
                self.cp.add(literal == self.home_in_round[season_round][vertex]
                            ).only_enforce_if(on_vertex)
            self._team_home[key] = literal
        return self._team_home[key]

    def team_bye(self, team: int, season_round: int) -> cp_model.IntVar:
        """Literal: ``team`` (named by a rule) has its bye in ``season_round``.

        Parameters
        ----------
        team
            Team index in ``league.teams``.
        season_round
            Season round, 0-based.

        Returns
        -------
        ortools.sat.python.cp_model.IntVar
            The literal (made once per team and round).
        """
        key = (team, season_round)
        if key not in self._team_bye:
            literal = self.cp.new_bool_var(f"team{team}_bye_in_round{season_round}")
            for vertex, on_vertex in self.team_on_vertex[team].items():
                self.cp.add(literal == self.round_holds[season_round][self.bye_round[vertex]]
                            ).only_enforce_if(on_vertex)
            self._team_bye[key] = literal
        return self._team_bye[key]

    def teams_meet(self, first_team: int, second_team: int, season_round: int,
                   literal: cp_model.IntVar) -> None:
        """Under ``literal``: ``first_team`` and ``second_team`` (named) meet in ``season_round``.

        Parameters
        ----------
        first_team, second_team
            Team indexes in ``league.teams``.
        season_round
            Season round, 0-based.
        literal
            The constraint holds only when this literal is true.
        """
        for vertex in self.vertices:
            for round_index in range(self.rounds_per_leg):
                partner_vertex = self.partner[round_index][vertex]
                clause = [literal.negated(), self.team_on_vertex[first_team][vertex].negated(),
                          self.round_holds[season_round][round_index].negated()]
                if partner_vertex != self.bye:
                    clause.append(self.team_on_vertex[second_team][partner_vertex])
                self.cp.add_bool_or(clause)

    def position_in_leg(self, leg: int, round_index: int) -> cp_model.LinearExpr | int:
        """Linear expression: the 0-based position of a factorization round in ``leg``.

        Parameters
        ----------
        leg
            Leg index, 0-based.
        round_index
            Factorization round index.

        Returns
        -------
        ortools.sat.python.cp_model.LinearExpr or int
            The position, as an expression of the model's variables.
        """
        return sum(q * self.leg_order[leg][q][round_index] for q in range(self.rounds_per_leg))

    def home_venue_groups(self) -> list[tuple[str, int, list[int]]]:
        """Venues whose capacity a match day could exceed, with their home teams.

        Returns
        -------
        list of (str, int, list of int)
            (venue, games it can hold on one match day, indexes of its home teams), from
            :func:`scheduler.rules.venue_capacity.capacity_groups`.
        """
        return self.capacity_groups

    # --- structure -----------------------------------------------------------------------------
    def _permutation(self, leg_name: str) -> list[list[cp_model.IntVar]]:
        """``x[q][k]``: position ``q`` of the leg plays factorization round ``k``."""
        cp, rounds = self.cp, self.rounds_per_leg
        x = [[cp.new_bool_var(f"{leg_name}_position{q}_plays_round{k}") for k in range(rounds)]
             for q in range(rounds)]
        for q in range(rounds):
            cp.add_exactly_one(x[q])
        for k in range(rounds):
            cp.add_exactly_one(x[q][k] for q in range(rounds))
        return x

    def _build_round_order(self, fixed_order) -> None:
        rounds, cp = self.rounds_per_leg, self.cp
        self.leg1_order = self._permutation("leg1")
        self.is_canonical = self.fact.rounds == circle_rounds(self.n)
        start = starting_point(self.fact, scheme=self.scheme, legs=self.legs, bye=self.bye,
                               seed=self.league.seed, effort=self.effort,
                               fixed_order=fixed_order, start_home=self.start_home)
        self.searched = start.searched
        hint_order, hint_home = start.order, start.home
        if fixed_order is not None:
            for q, k in enumerate(fixed_order):
                cp.add(self.leg1_order[q][k] == 1)
        self.hint_order, self.hint_home = hint_order, hint_home
        for q in range(rounds):
            for k in range(rounds):
                cp.add_hint(self.leg1_order[q][k], hint_order[q] == k)
        maps = leg_schemes.leg_maps(self.scheme, self.legs, rounds)
        self.leg_order: list[list[list[cp_model.IntVar]]] = []
        if maps is None:
            # free scheme: start from the inverted order, which reaches 2n-4 breaks with the
            # canonical schedule (docs/leg-schemes.md)
            inverted = leg_schemes.leg_maps("inverted", self.legs, rounds)
            assert inverted is not None
            self.leg_order.append(self.leg1_order)
            for leg in range(1, self.legs):
                x = self._permutation(f"leg{leg + 1}")
                for q in range(rounds):
                    for k in range(rounds):
                        cp.add_hint(x[q][k], hint_order[inverted[leg][q]] == k)
                self.leg_order.append(x)
        else:
            for leg_map in maps:
                self.leg_order.append([self.leg1_order[leg_map[q]] for q in range(rounds)])
        # round_holds[s][k]: season round s plays factorization round k
        self.round_holds = [self.leg_order[s // rounds][s % rounds]
                            for s in range(self.season_rounds)]

    def _build_venues(self) -> None:
        cp = self.cp
        self.first_vertex_home: dict[tuple[int, int], cp_model.IntVar] = {}
        for k, games in enumerate(self.fact.rounds):
            for a, b in games:
                if self.bye in (a, b):
                    continue
                var = cp.new_bool_var(f"round{k}_{a}v{b}_vertex{a}_home_in_leg1")
                self.first_vertex_home[(a, b)] = var
                cp.add_hint(var, bool(self.hint_home.get((a, b), True)))
        # home_in_round[s][v]: vertex v plays at home in season round s (false at its bye)
        self.home_in_round: list[dict[int, cp_model.IntVar]] = []
        self.bye_round: dict[int, int] = {}
        if self.odd:
            for k, games in enumerate(self.fact.rounds):
                for a, b in games:
                    if b == self.bye:
                        self.bye_round[a] = k
        for s in range(self.season_rounds):
            swapped = leg_schemes.flipped(s // self.rounds_per_leg)
            row = {}
            for v in self.vertices:
                at_home = cp.new_bool_var(f"vertex{v}_home_in_round{s}")
                for k in range(self.rounds_per_leg):
                    holds = self.round_holds[s][k]
                    w = self.partner[k][v]
                    if w == self.bye:
                        cp.add(at_home == 0).only_enforce_if(holds)
                        continue
                    a, b = (v, w) if v < w else (w, v)
                    var = self.first_vertex_home[(a, b)]
                    if (v == a) != swapped:
                        cp.add(at_home == var).only_enforce_if(holds)
                    else:
                        cp.add(at_home + var == 1).only_enforce_if(holds)
                row[v] = at_home
            self.home_in_round.append(row)

    def _build_team_placement(self) -> None:
        self.team_index = {t.name: i for i, t in enumerate(self.league.teams)}
        named: set[int] = set()
        for rule in RULES:
            named |= {self.team_index[name] for name in rule.named_teams(self.league)}
        named |= {self.team_index[name] for name in self.extra_named}
        self.capacity_groups = capacity_groups(self.league)
        self.named = sorted(named)
        cp = self.cp
        self.team_on_vertex: dict[int, dict[int, cp_model.IntVar]] = {}
        for t in self.named:
            self.team_on_vertex[t] = {v: cp.new_bool_var(f"team{t}_on_vertex{v}")
                                      for v in self.vertices}
            cp.add_exactly_one(self.team_on_vertex[t].values())
            for v in self.vertices:
                cp.add_hint(self.team_on_vertex[t][v], v == t)
        for v in self.vertices:
            cp.add_at_most_one(self.team_on_vertex[t][v] for t in self.named)

    def _build_breaks(self) -> None:
        cp = self.cp
        self.break_in_round: list[dict[int, cp_model.IntVar]] = [{}]
        # odd league: last_venue[s][v] = venue of v's last game up to round s (byes skipped)
        self.last_venue: list[dict[int, cp_model.IntVar]] = []
        if self.odd:
            for s in range(self.season_rounds):
                row = {}
                for v in self.vertices:
                    last = cp.new_bool_var(f"vertex{v}_last_game_home_by_round{s}")
                    plays = self.vertex_plays(s, v)
                    assert plays is not None  # odd league
                    cp.add(last == self.home_in_round[s][v]).only_enforce_if(plays)
                    if s > 0:
                        cp.add(last == self.last_venue[s - 1][v]).only_enforce_if(plays.negated())
                    row[v] = last
                self.last_venue.append(row)
        for s in range(1, self.season_rounds):
            row = {}
            for v in self.vertices:
                brk = cp.new_bool_var(f"vertex{v}_break_in_round{s}")
                x = self.home_in_round[s][v]
                if not self.odd:
                    y = self.home_in_round[s - 1][v]
                    cp.add_bool_or([brk, x, y])
                    cp.add_bool_or([brk, x.negated(), y.negated()])
                    cp.add_bool_or([brk.negated(), x, y.negated()])
                    cp.add_bool_or([brk.negated(), x.negated(), y])
                else:
                    y = self.last_venue[s - 1][v]
                    plays = self.vertex_plays(s, v)
                    assert plays is not None  # odd league
                    cp.add_bool_or([brk.negated(), plays])
                    cp.add_bool_or([brk.negated(), x, y.negated()])
                    cp.add_bool_or([brk.negated(), x.negated(), y])
                    cp.add_bool_or([brk, plays.negated(), x, y])
                    cp.add_bool_or([brk, plays.negated(), x.negated(), y.negated()])
                row[v] = brk
            self.break_in_round.append(row)
        self.total_breaks = sum(b for row in self.break_in_round for b in row.values())
        self.bound = leg_schemes.break_lower_bound(self.teams, self.legs, self.scheme)
        if self.season_rounds > 1:
            cp.add(self.total_breaks >= self.bound.value)
            per_leg = leg_schemes.leg_break_bound(self.n, self.odd)
            if per_leg:
                for leg in range(self.legs):
                    inside = [self.break_in_round[s][v]
                              for s in range(leg * self.rounds_per_leg + 1,
                                             (leg + 1) * self.rounds_per_leg)
                              for v in self.vertices]
                    cp.add(sum(inside) >= per_leg)

    def _build_days(self) -> None:
        self.candidate_days = candidate_days(self.league, self.season_rounds)
        groups = len(self.day_groups)
        self.day_index: dict[date, int] = {}
        self.days_fixed = True
        """Day group g is played on candidate day g (the first days), decided before solving."""
        if len(self.candidate_days) < groups:
            self.book.forbid(f"the calendar offers {len(self.candidate_days)} match days but the "
                             f"season needs {groups}")
            self.days = None
            return
        self.days = DayModel(self.cp, self.candidate_days, groups)
        self.day_index = {d: i for i, d in enumerate(self.candidate_days)}
        r = self.league.rules
        dated = r.unavailable or r.no_home_games or any(f.date is not None for f in r.fixed)
        if self.earliest_days or (not dated and r.min_rest_days is None and not self.free_days):
            # nothing depends on the choice of days: use the first ones
            for g in range(groups):
                self.cp.add(self.days.on[(g, g)] == 1)
        else:
            self.days_fixed = len(self.candidate_days) == groups

    def _build_objective(self) -> None:
        late = self.days.lateness() if self.days is not None else 0
        if self.minimise_breaks:
            span = len(self.day_groups) * max(1, len(self.candidate_days)) + 1
            self.objective = span * self.total_breaks + late
        else:
            self.objective = late
        self.cp.minimize(self.objective)

    # --- solving -------------------------------------------------------------------------------
    def solve(self, limits: SolveLimits, *, explain_failure: bool = True) -> Timetable:
        """Solve the model.

        Parameters
        ----------
        limits
            Deterministic and wall-clock limits, seed (half the deterministic limit when an
            order search already ran).
        explain_failure
            Explain an infeasible model by a minimal set of clashing rules (re-solves); when
            ``False`` a short error is raised instead.

        Returns
        -------
        Timetable
            The solved timetable.

        Raises
        ------
        InfeasibleError
            When the rules cannot all hold (naming a minimal set of them), or no timetable
            was found within the time limit.
        """
        self.book.assume_all()
        solver = cp_model.CpSolver()
        if self.searched:  # the order search took half of the deterministic budget
            limits = SolveLimits(max(0.5, limits.deterministic / 2), limits.wall, limits.seed)
        configure(solver, limits)
        status = solve_interruptibly(solver, self.cp)
        if status == cp_model.INFEASIBLE and not explain_failure:
            raise InfeasibleError("infeasible on the earliest match days", [])
        if status == cp_model.INFEASIBLE:
            raise explain(self.book, solver, lambda idx: self._still_infeasible(idx, limits),
                          what="the league's rules cannot all hold with the round pairings of "
                               f"{self.fact.method}", league=self.league,
                          checks=min(40, max(12, 2 * int(limits.deterministic))))
        if status not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
            raise InfeasibleError(
                "no timetable was found within the time limit; allow more solve_seconds or relax "
                "the rules", [])
        hit = status != cp_model.OPTIMAL and solver.wall_time >= limits.wall * 0.98
        return self.read_timetable(solver, status == cp_model.OPTIMAL, hit)

    def read_timetable(self, solver: cp_model.CpSolver, optimal: bool,
                       wall_cap_hit: bool = False) -> Timetable:
        """The :class:`Timetable` of a solution ``solver`` found for a model holding this one
        (this league's part of a larger model, see ``scheduler.divisions.joint``).

        Parameters
        ----------
        solver : ortools.sat.python.cp_model.CpSolver
            A solver that found a solution of the model this timetable model was built into.
        optimal : bool
            Whether that solution was proven optimal (the timetable's ``status``).
        wall_cap_hit : bool
            Whether the wall-clock safety limit stopped the search.

        Returns
        -------
        Timetable
        """
        found = self._extract(solver)
        return Timetable(
            n=self.n, breaks=total_breaks(found["games"], self.teams),
            break_bound=self.bound.value, break_bound_reason=self.bound.reason,
            status="optimal" if optimal else "feasible", wall_cap_hit=wall_cap_hit,
            days=self.candidate_days, **found)

    def _still_infeasible(self, indices: list[int], limits: SolveLimits) -> bool:
        self.cp.clear_assumptions()
        self.cp.add_assumptions([self.book.literals[i] for i in indices])
        solver = cp_model.CpSolver()
        # the deterministic limit decides (reproducible answers); the wall clock is only a
        # generous safety net, so that a loaded machine does not change the explanation
        configure(solver, SolveLimits(min(limits.deterministic, 2.0), max(limits.wall, 30.0),
                                      limits.seed))
        return solve_interruptibly(solver, self.cp) == cp_model.INFEASIBLE

    def _extract(self, solver: cp_model.CpSolver) -> dict:
        rounds = self.rounds_per_leg
        value = solver.BooleanValue
        order = []
        for leg in range(self.legs):
            order.append(tuple(next(k for k in range(rounds) if value(self.leg_order[leg][q][k]))
                               for q in range(rounds)))
        vertex_of_team = [-1] * self.teams
        used = set()
        for t in self.named:
            v = next(v for v in self.vertices if value(self.team_on_vertex[t][v]))
            vertex_of_team[t] = v
            used.add(v)
        free = iter(v for v in self.vertices if v not in used)
        for t in range(self.teams):
            if vertex_of_team[t] < 0:
                vertex_of_team[t] = next(free)
        team_at = {v: t for t, v in enumerate(vertex_of_team)}
        games, byes = [], []
        for s in range(self.season_rounds):
            leg, q = divmod(s, rounds)
            k = order[leg][q]
            swapped = leg_schemes.flipped(leg)
            played, sitting_out = [], []
            for a, b in self.fact.rounds[k]:
                if self.bye in (a, b):
                    sitting_out.append(team_at[a if b == self.bye else b])
                    continue
                a_home = value(self.first_vertex_home[(a, b)]) != swapped
                home, away = (a, b) if a_home else (b, a)
                played.append((team_at[home], team_at[away]))
            games.append(tuple(sorted(played)))
            byes.append(tuple(sorted(sitting_out)))
        if self.days is not None:
            group_day = [next(d for (gg, d), lit in self.days.on.items() if gg == g and value(lit))
                         for g in range(len(self.day_groups))]
        else:
            group_day = list(range(len(self.day_groups)))
        day = tuple(group_day[self.group_of_round[s]] for s in range(self.season_rounds))
        orientation = tuple((a, b, value(var))
                            for (a, b), var in sorted(self.first_vertex_home.items()))
        return {"vertex_of_team": tuple(vertex_of_team), "order": tuple(order),
                "games": tuple(games), "byes": tuple(byes), "day": day,
                "orientation": orientation}
