"""Plan the divisions of one unit jointly: one CP-SAT model for all their timetables.

Every division keeps its own timetable model (:class:`scheduler.balance.timetable_model.
TimetableModel`: its factorization fixed, the round order, the teams on vertices, home/away and
the match days as variables, its own hard rules), but all of them are built into one shared
``CpModel`` (variable names prefixed ``div{j}_``) and the rules across divisions are stated once,
on dates:

- shared ground ``apart``: no two of its teams of different divisions at home on one date;
- shared ground ``complementary``: in addition, on every date both teams play, exactly one of
  them is at home (enforced, not only measured);
- shared venue: on every date, the games the divisions can put there (home games of the teams
  homed there, all games of a division whose only venue it is) fit its courts times its slots;
- player group: two of its teams (of different divisions) never play on the same date when
  every kick-off one division could give overlaps every kick-off of the other.

"Team X at home on date d" is a literal: the OR over the day groups ``g`` that may fall on ``d``
and the rounds ``s`` of ``g`` of ``day_g_d AND team_home(X, s)``; with the first match days
fixed (no rule names a date) it is simply ``team_home(X, s)`` of the round on ``d``.

Courts and time slots are then chosen by a second CP-SAT model, again for all the divisions of
the unit that share a venue or a player group together: every court of a venue holds at most one
game at a time on a date (each game lasting its division's ``game_minutes``, whatever its
division) and two teams of a player group never play at overlapping times. It replaces the
static split of venues of the one-after-another method. Divisions that share neither keep the
single-league placement.

The joint model is used when it can be built within :data:`MAX_JOINT_TEAMS` teams and solved
within its limits (deterministic time: the divisions' timetable and placement shares added up;
one search worker; the federation's seed); otherwise the unit falls back to the one-after-another
method (:mod:`scheduler.divisions.plan`) and the result says why. See ``docs/divisions.md``.
"""

from __future__ import annotations

import itertools
from collections.abc import Iterable
from dataclasses import dataclass, field
from datetime import date

from ortools.sat.python import cp_model

from scheduler.balance.places import Place, Placement, assign_places
from scheduler.balance.solver import SolveLimits, configure
from scheduler.balance.timetable_model import Timetable, TimetableModel
from scheduler.config.federation import Federation
from scheduler.config.model import League
from scheduler.divisions.grouping import Coupling, Unit, possible_windows, windows_overlap
from scheduler.errors import InfeasibleError, SchedulerError
from scheduler.factorization.model import Factorization
from scheduler.interrupt import solve_interruptibly

__all__ = ["MAX_JOINT_TEAMS", "JointOutcome", "plan_jointly"]

MAX_JOINT_TEAMS = 120
"""Largest unit (teams over all its divisions) planned by the joint model; larger units are
planned one division after another."""

TIMETABLE_SHARE = 0.45
"""Share of each division's solve seconds given to the joint timetable model (as the
single-league planner gives its timetable stage)."""

PLACEMENT_SHARE = 0.25
"""Share of each division's solve seconds given to the joint placement model."""

WALL_FACTOR = 10
"""Wall-clock safety net of the joint timetable solves: this many times their deterministic
limit, plus 30 s. Only a net (the deterministic limit decides); wide, because the model with
open days runs several wall seconds per deterministic second and a loaded machine more."""

BoolLike = cp_model.IntVar | cp_model.BoolVarT


@dataclass(frozen=True)
class JointOutcome:
    """What the joint model found for a unit.

    ``timetables`` and ``placements`` by division name (empty when it failed), ``factorizations``
    the round pairings used, ``reason`` why it failed (empty on success), ``status`` "optimal"
    when the timetable model proved its optimum, else "feasible".

    Parameters
    ----------
    timetables : dict
        Division name -> :class:`~scheduler.balance.timetable_model.Timetable`.
    placements : dict
        Division name -> :class:`~scheduler.balance.places.Placement`.
    factorizations : dict
        Division name -> the :class:`~scheduler.factorization.model.Factorization` used.
    reason : str
        Why the joint models could not be used (empty on success).
    status : str
        "optimal" or "feasible".
    """

    timetables: dict[str, Timetable] = field(default_factory=dict)
    placements: dict[str, Placement] = field(default_factory=dict)
    factorizations: dict[str, Factorization] = field(default_factory=dict)
    reason: str = ""
    status: str = ""

    @property
    def solved(self) -> bool:
        """Whether every division of the unit got a timetable and places."""
        return not self.reason


def factorization_for(league: League, time_limit: float | None) -> Factorization:
    """The round pairings a division is planned with in the joint model.

    The factorization engine's choice for the single-league planner's first option (its best
    mixing, same seed and budget), or the circle schedule GK_n when the league weighs breaks
    above mixing (GK_n reaches the fewest breaks, de Werra 1981).

    Parameters
    ----------
    league : League
        The division.
    time_limit : float or None
        Its solve seconds (default: the league's own).

    Returns
    -------
    Factorization
    """
    from scheduler.factorization import factorize
    from scheduler.factorization.circle import circle_factorization

    total = float(time_limit if time_limit is not None else league.solve_seconds)
    found = factorize(len(league.teams), seed=league.seed, budget=max(0.5, 0.2 * total))
    if league.priorities.breaks > league.priorities.mixing:
        return circle_factorization(found.n)
    return found


@dataclass
class _Part:
    """One division inside the joint model."""

    name: str
    league: League
    fact: Factorization
    model: TimetableModel
    variables: range = range(0)
    """Indices of the variables its timetable model created in the shared model."""
    seconds: float = 0.0
    """Its solve seconds."""


class _DateLiterals:
    """Literals "team plays / is at home on date d" of one division's part of the model."""

    def __init__(self, cp: cp_model.CpModel, part: _Part, prefix: str) -> None:
        self.cp = cp
        self.part = part
        self.prefix = prefix
        model = part.model
        self.by_date: dict[date, list[tuple[BoolLike | None, int]]] = {}
        """date -> (literal "day group g on this date" or None when certain, group g)."""
        if model.days is None:
            return
        for (g, d), literal in sorted(model.days.on.items()):
            day = model.candidate_days[d]
            if model.days_fixed:
                if g == d:
                    self.by_date.setdefault(day, []).append((None, g))
            else:
                self.by_date.setdefault(day, []).append((literal, g))
        self._home: dict[tuple[str, date], BoolLike | None] = {}
        self._plays: dict[tuple[str, date], BoolLike | bool | None] = {}

    def dates(self) -> set[date]:
        return set(self.by_date)

    def _and(self, first: BoolLike | None, second: BoolLike, name: str) -> BoolLike:
        if first is None:
            return second
        both = self.cp.new_bool_var(name)
        self.cp.add_implication(both, first)
        self.cp.add_implication(both, second)
        self.cp.add_bool_or([first.negated(), second.negated(), both])
        return both

    def _or(self, literals: list[BoolLike], name: str) -> BoolLike:
        if len(literals) == 1:
            return literals[0]
        either = self.cp.new_bool_var(name)
        self.cp.add_max_equality(either, literals)
        return either

    def home_terms(self, team: str, day: date) -> list[BoolLike]:
        """One literal per round that may fall on ``day``: the team is at home in it there."""
        t = self.part.model.team_index[team]
        model = self.part.model
        terms = []
        for on, g in self.by_date.get(day, []):
            for s in model.day_groups[g]:
                terms.append(self._and(on, model.team_home(t, s),
                                       f"{self.prefix}team{t}_home_in_round{s}_on_{day:%Y%m%d}"))
        return terms

    def home(self, team: str, day: date) -> BoolLike | None:
        """Literal: ``team`` plays at home on ``day`` (None: it cannot play that day)."""
        key = (team, day)
        if key not in self._home:
            terms = self.home_terms(team, day)
            t = self.part.model.team_index[team]
            self._home[key] = (self._or(terms, f"{self.prefix}team{t}_home_on_{day:%Y%m%d}")
                               if terms else None)
        return self._home[key]

    def plays(self, team: str, day: date) -> BoolLike | bool | None:
        """``team`` plays on ``day``: a literal, True when certain, None when it cannot."""
        key = (team, day)
        if key in self._plays:
            return self._plays[key]
        t = self.part.model.team_index[team]
        model = self.part.model
        terms: list[BoolLike] = []
        certain = False
        for on, g in self.by_date.get(day, []):
            for s in model.day_groups[g]:
                if not model.odd:
                    if on is None:
                        certain = True
                    else:
                        terms.append(on)
                else:
                    playing = model.team_bye(t, s).negated()
                    terms.append(self._and(on, playing,
                                           f"{self.prefix}team{t}_plays_round{s}_on_{day:%Y%m%d}"))
        result: BoolLike | bool | None
        if certain:
            result = True
        elif not terms:
            result = None
        else:
            result = self._or(terms, f"{self.prefix}team{t}_plays_on_{day:%Y%m%d}")
        self._plays[key] = result
        return result

    def games_on(self, day: date) -> list[tuple[int, BoolLike | None]]:
        """(number of games, literal or None when certain) of the rounds that may fall on
        ``day``, all the division's games of those rounds."""
        model = self.part.model
        per_round = model.teams // 2
        return [(per_round * len(model.day_groups[g]), on) for on, g in self.by_date.get(day, [])]


def _coupled_teams(couplings: Iterable[Coupling], unit: Unit, fed: Federation) -> dict[str, set]:
    """Division -> its teams that a coupling speaks of (placed on vertices explicitly)."""
    out: dict[str, set[str]] = {name: set() for name in unit.divisions}
    for c in couplings:
        if c.kind == "venue" and not c.teams:
            continue
        for team in c.teams:
            division = fed.division_of(team)
            if division in out:
                out[division].add(team)
    return out


def _always_overlap(a: League, b: League) -> bool:
    """Whether every kick-off of ``a`` overlaps every kick-off of ``b`` (then two of their
    teams can never both play on one date without a clash)."""
    windows_b = possible_windows(b)
    return all(windows_overlap(x, y) for x in possible_windows(a) for y in windows_b)


def _build(fed: Federation, unit: Unit, couplings: list[Coupling], time_limit: float | None,
           facts: dict[str, Factorization], free_days: bool
           ) -> tuple[cp_model.CpModel, list[_Part], float]:
    cp = cp_model.CpModel()
    named = _coupled_teams(couplings, unit, fed)
    parts: list[_Part] = []
    budget = 0.0
    for j, name in enumerate(unit.divisions):
        league = fed.division(name).league
        total = float(time_limit if time_limit is not None else league.solve_seconds)
        budget += total
        fact = facts[name]
        before = len(cp.proto.variables)
        order = tuple(t for t in league.team_names if t in named[name])
        model = TimetableModel(league, fact, minimise_breaks=league.priorities.breaks > 0,
                               effort=max(1.0, TIMETABLE_SHARE * total), cp=cp,
                               extra_named=order, free_days=free_days)
        for index in range(before, len(cp.proto.variables)):
            variable = cp.proto.variables[index]
            variable.name = f"div{j}_{variable.name}"
        parts.append(_Part(name, league, fact, model, range(before, len(cp.proto.variables)),
                           total))
    # every rule of every division holds (their assumption literals are fixed, not assumed)
    cp.add_bool_and([lit for p in parts for lit in p.model.book.literals])
    cp.clear_assumptions()
    _cross_rules(cp, fed, parts, couplings)
    cp.minimize(sum(p.model.objective for p in parts))
    return cp, parts, budget


def _cross_rules(cp: cp_model.CpModel, fed: Federation, parts: list[_Part],
                 couplings: list[Coupling]) -> None:
    by_name = {p.name: p for p in parts}
    literals = {p.name: _DateLiterals(cp, p, f"div{j}_") for j, p in enumerate(parts)}

    def of(team: str) -> _DateLiterals:
        return literals[fed.division_of(team)]

    for c in couplings:
        if c.kind == "ground":
            for a, b in itertools.combinations(c.teams, 2):
                if fed.division_of(a) == fed.division_of(b):
                    continue
                for day in sorted(of(a).dates() & of(b).dates()):
                    home_a, home_b = of(a).home(a, day), of(b).home(b, day)
                    if home_a is None or home_b is None:
                        continue
                    cp.add_bool_or([home_a.negated(), home_b.negated()])
                    if c.pattern != "complementary" or len(c.teams) != 2:
                        continue
                    plays_a, plays_b = of(a).plays(a, day), of(b).plays(b, day)
                    if plays_a is None or plays_b is None:
                        continue
                    both = [x for x in (plays_a, plays_b) if not isinstance(x, bool)]
                    # exactly one at home on every date both play
                    cp.add_bool_or([home_a, home_b]).only_enforce_if(both)
        elif c.kind == "venue":
            _venue_capacity(cp, fed, by_name, literals, c)
        elif c.kind == "players":
            for a, b in itertools.combinations(c.teams, 2):
                da, db = fed.division_of(a), fed.division_of(b)
                if da == db or not _always_overlap(by_name[da].league, by_name[db].league):
                    continue  # kick-offs that may not overlap: left to the placement model
                for day in sorted(of(a).dates() & of(b).dates()):
                    plays_a, plays_b = of(a).plays(a, day), of(b).plays(b, day)
                    if plays_a is None or plays_b is None:
                        continue
                    clause = [x.negated() for x in (plays_a, plays_b) if not isinstance(x, bool)]
                    cp.add_bool_or(clause)


def _venue_capacity(cp: cp_model.CpModel, fed: Federation, by_name: dict[str, _Part],
                    literals: dict[str, _DateLiterals], coupling: Coupling) -> None:
    """On every date, the games the divisions may put at the venue fit its places."""
    venue = next(v for v in fed.venues if v.name == coupling.venue)
    capacity = len(venue.courts) * max(1, len(venue.slots))
    loads: dict[date, list] = {}
    for name in coupling.divisions:
        part = by_name[name]
        league = part.league
        dates = literals[name]
        if league.format.home_meaning == "side":
            if len(league.venues) != 1:
                continue  # games may go elsewhere: left to the placement model
            for day in dates.dates():
                for count, on in dates.games_on(day):
                    loads.setdefault(day, []).append(count if on is None else count * on)
        else:
            for team in league.teams:
                if team.home_venue != venue.name:
                    continue
                for day in dates.dates():
                    loads.setdefault(day, []).extend(dates.home_terms(team.name, day))
    for terms in loads.values():
        if len(terms) > 1:
            cp.add(sum(terms) <= capacity)


def _timetables(fed: Federation, unit: Unit, couplings: list[Coupling],
                time_limit: float | None) -> tuple[list[_Part], dict[str, Timetable], str, str]:
    """Solve the joint timetable model twice: on each division's own earliest days, then with
    the days open; keep the solution of the lower objective (breaks first, then lateness) and
    improve it; returns the parts, timetables, status and the reason of a failure.

    The second attempt is skipped when the first reached every division's lower bound on
    breaks (nothing left to gain). Open days matter: with the first days fixed, a shared
    ground makes the two teams' home/away patterns meet on every common date, which forces
    many breaks when the divisions' round-robin structures differ (``docs/divisions.md``);
    with open days the model can shift a division's dates.
    """
    reason = ""
    best: tuple[float, cp_model.CpModel, list[_Part], cp_model.CpSolver, bool, bool] | None = None
    facts = {name: factorization_for(fed.division(name).league, time_limit)
             for name in unit.divisions}
    for free_days in (False, True):
        if best is not None and _at_bounds(best[2], best[3]):
            break
        cp, parts, budget = _build(fed, unit, couplings, time_limit, facts, free_days)
        deterministic = max(1.0, TIMETABLE_SHARE * budget)
        limits = SolveLimits(deterministic, WALL_FACTOR * deterministic + 30, fed_seed(fed, unit))
        solver = cp_model.CpSolver()
        configure(solver, limits)
        status = solve_interruptibly(solver, cp)
        if status in (cp_model.OPTIMAL, cp_model.FEASIBLE):
            optimal = status == cp_model.OPTIMAL
            hit = not optimal and solver.wall_time >= limits.wall * 0.98
            if best is None or solver.objective_value < best[0]:
                best = (solver.objective_value, cp, parts, solver, optimal, hit)
            continue
        if best is None:
            reason = ("the joint timetable model is infeasible" if status == cp_model.INFEASIBLE
                      else "the joint timetable model found no timetable within its limits")
    if best is None:
        return [], {}, "", reason
    _, cp, parts, solver, optimal, hit = best
    if not optimal:
        solver, hit = _polish(cp, parts, solver, fed_seed(fed, unit), hit)
    found = {p.name: p.model.read_timetable(solver, optimal, hit) for p in parts}
    return parts, found, "optimal" if optimal else "feasible", ""


def _at_bounds(parts: list[_Part], solver: cp_model.CpSolver) -> bool:
    """Whether every division's breaks in the solution equal its lower bound on breaks."""
    return all(not p.model.minimise_breaks
               or solver.value(p.model.total_breaks) <= p.model.bound.value for p in parts)


def _polish(cp: cp_model.CpModel, parts: list[_Part], solver: cp_model.CpSolver, seed: int,
            hit: bool) -> tuple[cp_model.CpSolver, bool]:
    """Improve a joint solution division by division (a large-neighbourhood step, common
    practice): the other divisions' timetable variables are fixed at their values, the whole
    model is solved again from the current solution for this division alone (its own share of
    the time), and the solution is kept when the objective went down. Deterministic: fixed
    order, seed and deterministic limits."""
    if len(parts) < 2:
        return solver, hit
    best = solver
    values = list(solver.response_proto.solution)
    objective = solver.objective_value
    for part in parts:
        model = cp.clone()
        model.clear_hints()
        for index in range(len(values)):
            model.add_hint(model.get_int_var_from_proto_index(index), values[index])
        for other in parts:
            if other is part:
                continue
            for index in other.variables:
                model.add(model.get_int_var_from_proto_index(index) == values[index])
        deterministic = max(1.0, TIMETABLE_SHARE * part.seconds)
        limits = SolveLimits(deterministic, WALL_FACTOR * deterministic + 30, seed)
        attempt = cp_model.CpSolver()
        configure(attempt, limits)
        status = solve_interruptibly(attempt, model)
        if status in (cp_model.OPTIMAL, cp_model.FEASIBLE) and attempt.objective_value < objective:
            best, objective = attempt, attempt.objective_value
            values = list(attempt.response_proto.solution)
            hit = hit or (status != cp_model.OPTIMAL and attempt.wall_time >= limits.wall * 0.98)
    return best, hit


def fed_seed(fed: Federation, unit: Unit) -> int:
    """The seed of a unit's joint solves: its first division's seed.

    Parameters
    ----------
    fed : Federation
        The federation.
    unit : Unit
        The unit.

    Returns
    -------
    int
    """
    return fed.division(unit.divisions[0]).league.seed


@dataclass(frozen=True)
class _Game:
    division: str
    round: int
    index: int
    home: str
    away: str
    day: date
    options: tuple[int, ...]


def _placements(fed: Federation, unit: Unit, couplings: list[Coupling], parts: list[_Part],
                timetables: dict[str, Timetable], time_limit: float | None
                ) -> tuple[dict[str, Placement], str]:
    """Courts and slots: jointly for the divisions tied by a shared venue or a player group,
    with the single-league placement for the others."""
    from scheduler.balance.places import venue_places
    from scheduler.calendar import kickoff

    joined = {d for c in couplings if c.kind in ("venue", "players") for d in c.divisions}
    placements: dict[str, Placement] = {}
    budget = 0.0
    for part in parts:
        league = part.league
        total = float(time_limit if time_limit is not None else league.solve_seconds)
        if part.name not in joined:
            limits = SolveLimits(max(1.0, PLACEMENT_SHARE * total),
                                 4 * max(1.0, PLACEMENT_SHARE * total) + 10, league.seed)
            try:
                placements[part.name] = assign_places(league, timetables[part.name], limits)
            except InfeasibleError as exc:
                return {}, f"division {part.name!r}: {exc}"
            continue
        budget += total
    if not budget:
        return placements, ""
    # the joint placement model
    places: list[Place] = []
    span: list[tuple[int, int]] = []  # minutes of the day a place's game occupies
    owner: list[str] = []  # division whose place list it belongs to
    by_division: dict[str, dict[str, list[int]]] = {}
    for part in parts:
        if part.name not in joined:
            continue
        league = part.league
        first_day = timetables[part.name].days[0] if timetables[part.name].days else None
        if first_day is None:
            return {}, f"division {part.name!r} has no match days"
        venues: dict[str, list[int]] = {}
        for vi, venue in enumerate(league.venues):
            ids = []
            for place in venue_places(league, vi, 1):
                start = kickoff(league, first_day, place.slot)
                minute = start.hour * 60 + start.minute
                ids.append(len(places))
                places.append(place)
                span.append((minute, minute + league.calendar.game_minutes))
                owner.append(part.name)
            venues[venue.name] = ids
        by_division[part.name] = venues
    games: list[_Game] = []
    for part in parts:
        if part.name not in joined:
            continue
        league, tt = part.league, timetables[part.name]
        venues = by_division[part.name]
        everywhere = tuple(i for ids in venues.values() for i in ids)
        names = league.team_names
        for s, round_games in enumerate(tt.games):
            day = tt.days[tt.day[s]]
            for i, (h, a) in enumerate(round_games):
                home_venue = league.teams[h].home_venue
                if league.format.home_meaning == "venue" and home_venue:
                    options = tuple(venues[home_venue])
                else:
                    options = everywhere
                if not options:
                    return {}, f"division {part.name!r}: a game has no place"
                games.append(_Game(part.name, s, i, names[h], names[a], day, options))
    cp = cp_model.CpModel()
    x: dict[tuple[int, int], cp_model.IntVar] = {}
    for g, game in enumerate(games):
        lits = []
        for p in game.options:
            lit = cp.new_bool_var(f"{game.division}_round{game.round}_game{game.index}_place{p}")
            x[(g, p)] = lit
            lits.append(lit)
        cp.add_exactly_one(lits)
    # every court of a venue holds one game at a time on a date (interval cliques: at the start
    # of each game, the games covering it)
    cells: dict[tuple[date, str | None, str | None], list[tuple[int, int]]] = {}
    for (g, p), _lit in x.items():
        cells.setdefault((games[g].day, places[p].venue, places[p].court), []).append((g, p))
    for items in cells.values():
        for point in sorted({span[p][0] for _, p in items}):
            covering = [x[(g, p)] for g, p in items if span[p][0] <= point < span[p][1]]
            if len(covering) > 1:
                cp.add_at_most_one(covering)
    # a team plays one game at a time; player groups across divisions likewise
    by_team_day: dict[tuple[str, date], list[int]] = {}
    days_of_team: dict[str, set[date]] = {}
    for g, game in enumerate(games):
        for team in (game.home, game.away):
            by_team_day.setdefault((team, game.day), []).append(g)
            days_of_team.setdefault(team, set()).add(game.day)
    for c in couplings:
        if c.kind != "players":
            continue
        for first, second in itertools.combinations(c.teams, 2):
            if fed.division_of(first) == fed.division_of(second):
                continue
            for day in sorted(days_of_team.get(first, set())):
                mine = [g for g in by_team_day.get((first, day), [])
                        if second not in (games[g].home, games[g].away)]
                theirs = by_team_day.get((second, day), [])
                if not mine or not theirs:
                    continue
                pairs = [(g, p) for g in mine + theirs for p in games[g].options]
                for point in sorted({span[p][0] for _, p in pairs}):
                    covering = [x[(g, p)] for g, p in pairs if span[p][0] <= point < span[p][1]]
                    if len(covering) > 1:
                        cp.add_at_most_one(covering)
    _balance_objective(cp, parts, games, places, x, joined)
    limits = SolveLimits.with_safety_net(max(1.0, PLACEMENT_SHARE * budget), fed_seed(fed, unit))
    solver = cp_model.CpSolver()
    configure(solver, limits)
    status = solve_interruptibly(solver, cp)
    if status not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
        return {}, ("the joint placement model is infeasible (courts, slots or player groups)"
                    if status == cp_model.INFEASIBLE
                    else "the joint placement model found no placement within its limits")
    hit = status != cp_model.OPTIMAL and solver.wall_time >= limits.wall * 0.98
    chosen: dict[tuple[str, int, int], Place] = {}
    for (g, p), lit in x.items():
        if solver.boolean_value(lit):
            game = games[g]
            chosen[(game.division, game.round, game.index)] = places[p]
    for part in parts:
        if part.name not in joined:
            continue
        tt = timetables[part.name]
        rows = tuple(tuple(chosen[(part.name, s, i)] for i in range(len(tt.games[s])))
                     for s in range(len(tt.games)))
        placements[part.name] = Placement(
            rows, None, None, "optimal" if status == cp_model.OPTIMAL else "feasible", hit)
    return placements, ""


def _balance_objective(cp: cp_model.CpModel, parts: list[_Part], games: list[_Game],
                       places: list[Place], x: dict[tuple[int, int], cp_model.IntVar],
                       joined: set[str]) -> None:
    """Per division, as the single-league placement: the most games of one team on one court
    and in one time slot, weighted by the league's priorities; then earlier slots."""
    terms = []
    for part in parts:
        if part.name not in joined:
            continue
        weights = part.league.priorities
        mine = [g for g, game in enumerate(games) if game.division == part.name]
        for label, weight in (("court", weights.venue_balance), ("slot", weights.slot_balance)):
            def key(place: Place, label: str = label) -> object:
                if label == "court":
                    return (place.venue, place.court)
                return -1 if place.slot is None else place.slot.hour * 60 + place.slot.minute

            keys = {key(places[p]) for g in mine for p in games[g].options}
            if weight <= 0 or len(keys) < 2:
                continue
            top = cp.new_int_var(0, len(mine), f"{part.name}_most_games_of_a_team_per_{label}")
            for team in part.league.team_names:
                played = [g for g in mine if team in (games[g].home, games[g].away)]
                counts: dict[object, list] = {}
                for g in played:
                    for p in games[g].options:
                        counts.setdefault(key(places[p]), []).append(x[(g, p)])
                for lits in counts.values():
                    cp.add(sum(lits) <= top)
            terms.append(weight * top)
    cp.minimize(sum(terms) if terms else 0)


def plan_jointly(fed: Federation, unit: Unit, couplings: list[Coupling],
                 time_limit: float | None = None) -> JointOutcome:
    """Timetables and places of every division of ``unit`` from the joint models.

    Parameters
    ----------
    fed : Federation
        The federation.
    unit : Unit
        The unit (two or more divisions).
    couplings : list of Coupling
        The federation's couplings (:func:`scheduler.divisions.grouping.couplings_of`).
    time_limit : float or None
        Solver seconds per division (default: each division's ``solve_seconds``).

    Returns
    -------
    JointOutcome
        The timetables and placements, or the reason the joint models could not be used.

    Examples
    --------
    >>> from scheduler.config.federation import parse_federation
    >>> from scheduler.divisions.grouping import couplings_of, units_of
    >>> def division(name, teams):
    ...     return {"name": name, "teams": [{"name": t, "home_venue": f"{t} Ground"}
    ...                                      for t in teams]}
    >>> fed = parse_federation({
    ...     "federation": {"name": "Example", "season": "2031", "timezone": "Europe/London",
    ...                    "solve_seconds": 1},
    ...     "calendar": {"start": "2031-09-06", "end": "2031-12-20", "weekdays": ["sat"]},
    ...     "venues": [{"name": f"{t} Ground"} for t in "ABCDEFG"],
    ...     "divisions": [division("First", "ABCD"), division("Reserves", "EFG")],
    ...     "shared_grounds": [{"teams": ["A", "E"], "pattern": "complementary"}]})
    >>> unit = units_of(fed)[0]
    >>> outcome = plan_jointly(fed, unit, couplings_of(fed))
    >>> outcome.solved, sorted(outcome.timetables)
    (True, ['First', 'Reserves'])
    """
    teams = sum(len(fed.division(name).league.teams) for name in unit.divisions)
    if teams > MAX_JOINT_TEAMS:
        return JointOutcome(reason=f"{teams} teams, more than the joint model takes "
                                   f"({MAX_JOINT_TEAMS})")
    busy = [n for n in unit.divisions if fed.division(n).league.calendar.rounds_per_day > 1]
    if busy:
        return JointOutcome(reason="several rounds on one day in " + ", ".join(busy)
                                   + " (not handled by the joint model)")
    try:
        parts, timetables, status, reason = _timetables(fed, unit, couplings, time_limit)
    except (SchedulerError, ValueError) as exc:
        return JointOutcome(reason=f"the joint model cannot be built: {exc}")
    if reason:
        return JointOutcome(reason=reason)
    placements, reason = _placements(fed, unit, couplings, parts, timetables, time_limit)
    if reason:
        return JointOutcome(reason=reason)
    return JointOutcome(timetables, placements, {p.name: p.fact for p in parts}, "", status)
