"""Re-planning the rest of a season with as few changes as possible (OR-Tools CP-SAT).

After ``played_through`` the season changes: games are postponed, venues close, teams become
unavailable or withdraw. History (every game on or before ``played_through`` that took place)
is fixed and is not even a variable here. Every *future* game (postponed ones included) gets a
match day after ``played_through``, a place (venue, court, time slot) and a home side, so that
every hard rule of the league holds: one game per team and day, ``min_rest_days`` (also
against the last game played), runs of home/away games (``max_home_run``/``max_away_run``,
continued from history), ``no_breaks_first``/``no_breaks_last``, shared grounds, each place
once per day (venue capacity), unavailability and closures, and ``min_separation`` counted in
the season's match days between two meetings of a pair. In a home-and-away season each pair
keeps its number of home games per team (a swap of home and away is possible only as a swap of
both meetings). Every league rule a re-plan can break (runs, break-free ends, separation, rest
days, the league's unavailable and no-home days, shared grounds) states its constraints in its
own rule module (``add_date_constraints`` through the interface
:class:`scheduler.rules.base.DateModelView`, which this model provides, history's state
included); this model states only what a re-plan is (one game per team and sitting, each place
once a sitting, which also keeps venue capacity, the events' unavailability and closures, the
hand-moved games, each pair's home games). Fixed games are kept like any game that need not
move, not bound (``docs/rules.md``, "Left open").

This is the *minimal perturbation problem* of timetabling (Barták, Müller & Rudová, "A new
approach to modeling and solving minimal perturbation problems", CSCLP 2003, LNCS 3010, 2004;
from memory): among the valid re-plans, find one that differs least from the previous plan. A
Boolean "differs from the old plan" per future game (date, start, court or home side) is
minimised first and CP-SAT proves the minimum (status OPTIMAL) or reports its bound. The second
stage keeps that minimum and improves, one goal after another (lexicographically), the reserve
dates for the games that must move, the home sides kept, the least rest, the league's own
priorities in the order of their weights (breaks, court balance, kick-off time balance) and last
the earliest dates (:meth:`RepairModel.goals`). The previous plan is the search hint.

When the rules cannot hold, the clash is named (a game with no possible day left, a team with
more games than free days, or the rules found by the assumption core of
:mod:`scheduler.balance.explain`), and candidate relaxations (a later end by k weeks, another
weekday, one rule lowered by one) are tested by re-solving; the ones that work are suggested.

Determinism: one worker, a fixed seed, a deterministic time limit (wall clock only as a safety
net), options and variables built in sorted order.

With several rounds on one match day (``calendar.rounds_per_day > 1``) games are placed on
*sittings*: a match day and a kick-off time (the venues' time slots, or ``kickoff + j *
game_minutes`` for a venue without slots, as the first plan does). A team plays at most once a
sitting, at most ``rounds_per_day`` times a day and never in two games that overlap; runs and
breaks follow the sittings in time order, and two games on one day count 0 rest days.
"""

from __future__ import annotations

import itertools
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field, replace
from datetime import date, datetime, time, timedelta
from typing import Any

from ortools.sat.python import cp_model

from scheduler.balance.explain import RuleBook, explain
from scheduler.balance.solver import SolveLimits, configure
from scheduler.calendar import days_needed, kickoff, match_days
from scheduler.config.model import League
from scheduler.errors import InfeasibleError, InputError
from scheduler.interrupt import solve_interruptibly
from scheduler.rules import RULES
from scheduler.rules.rest_days import rest_days_between
from scheduler.season import Fixture

WEEKDAY_NAMES = ("Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday", "Sunday")


@dataclass(frozen=True, slots=True)
class Place:
    """A venue, court and time slot where a game can be played.

    Parameters
    ----------
    venue
        The venue's name (``None`` in a league without venues).
    court
        The court, pitch or table of the venue.
    slot_time
        The kick-off time (``None``: the league's kick-off time).
    slot_label
        The slot's label as the season writes it (``"19:30"``), ``None`` without slots.
    """

    venue: str | None
    court: str | None
    slot_time: time | None
    slot_label: str | None


@dataclass(frozen=True, slots=True)
class ForcedGame:
    """A game the organizer already moved by hand: kept exactly as given.

    Parameters
    ----------
    date
        Its new match day.
    home, away
        The teams, home side first.
    start
        The local kick-off time.
    court
        The court, when the organizer named one.
    """

    date: date
    home: str
    away: str
    start: time
    court: str | None = None


@dataclass(frozen=True)
class RepairProblem:
    """What the repair model needs.

    Parameters
    ----------
    league
        The league; its rules and calendar hold for the re-plan.
    played_through
        The last day of history.
    history
        The games played (fixed; the starting state of every rule).
    future
        The previous plan's entry of every game still to be placed (a postponed game keeps its
        planned, past date here).
    postponed
        Indices into ``future`` of the postponed games.
    forced
        Index into ``future`` -> its hand-moved placement.
    unavailable
        ``(team, date)`` pairs added to the league's rules from now on.
    closed
        ``(venue, court, date)`` closures (court ``None``: every court).
    """

    league: League
    played_through: date
    history: tuple[Fixture, ...]
    future: tuple[Fixture, ...]
    postponed: frozenset[int] = frozenset()
    forced: Mapping[int, ForcedGame] = field(default_factory=dict)
    unavailable: tuple[tuple[str, date], ...] = ()
    closed: tuple[tuple[str, str | None, date], ...] = ()


GOAL_LABELS: dict[str, str] = {
    "reserve": "moved games off the reserve dates",
    "home_side": "games with the other team at home",
    "rest": "least rest of the re-planned games (days)",
    "breaks": "breaks",
    "venue_balance": "largest court spread of a team",
    "slot_balance": "largest kick-off time spread of a team",
    "earliest": "lateness of the moved games",
}
"""Plain labels of the second stage's goals (:meth:`RepairModel.goals`)."""


@dataclass(frozen=True, slots=True)
class GoalFigure:
    """The value a goal of the second stage reached, and whether CP-SAT proved it best.

    Parameters
    ----------
    name
        A key of :data:`GOAL_LABELS`.
    value
        The figure (rest in days; the others are counts).
    proven
        Whether no re-plan with the same values of the goals before it does better.
    """

    name: str
    value: int
    proven: bool

    def __str__(self) -> str:
        return f"{GOAL_LABELS[self.name]} {self.value}" + ("" if self.proven else " (not proven)")


@dataclass(frozen=True)
class RepairResult:
    """The re-planned future games and how good they are.

    Parameters
    ----------
    fixtures
        The future games, in the order of ``problem.future``.
    changed
        Games whose date, start, court or home side differ from the old plan.
    proven
        Whether CP-SAT proved that no valid re-plan changes fewer.
    bound
        CP-SAT's proven lower bound on ``changed``.
    on_reserve
        Moved games placed on reserve dates.
    breaks
        Breaks of the future part (date order, history as the starting state).
    seconds
        The solvers' wall time (for benchmarks only).
    notes
        Remarks for people (a second-stage goal that ran out of time).
    proof_seconds
        Wall time of the first stage, which proves the fewest changes (benchmarks only).
    goals
        The second stage's goals in order and the values reached (:class:`GoalFigure`).
    """

    fixtures: tuple[Fixture, ...]
    changed: int
    proven: bool
    bound: int
    on_reserve: int
    breaks: int
    seconds: float
    notes: tuple[str, ...] = ()
    proof_seconds: float = 0.0
    goals: tuple[GoalFigure, ...] = ()


def _places(league: League, per_day: int = 1) -> tuple[list[Place], dict[str, list[int]]]:
    """Every (venue, court, time) of the league. With several rounds on one match day a venue
    without time slots gets one time per round, ``kickoff + j * game_minutes``, labelled like
    the planner's places (:mod:`scheduler.balance.places`); a league without venues has one
    place without a venue."""
    places: list[Place] = []
    by_venue: dict[str, list[int]] = {}
    cal = league.calendar
    virtual: list[time | None] = [None]
    if per_day > 1:
        base = datetime.combine(date(2000, 1, 1), cal.kickoff)
        virtual = [(base + timedelta(minutes=j * cal.game_minutes)).time()
                   for j in range(per_day)]
    for venue in league.venues:
        times: list[time | None] = list(venue.slots) or virtual
        labelled = bool(venue.slots) or per_day > 1
        ids = []
        for court in venue.courts:
            for clock in times:
                label = clock.strftime("%H:%M") if (labelled and clock is not None) else None
                ids.append(len(places))
                places.append(Place(venue.name, court, clock, label))
        by_venue[venue.name] = ids
    if not league.venues:
        for clock in virtual:
            label = clock.strftime("%H:%M") if clock is not None else None
            places.append(Place(None, None, clock, label))
    return places, by_venue


def candidate_days(league: League, played_through: date, extra: Sequence[date] = ()) -> list[date]:
    """Match days after ``played_through`` on which a re-plan may put games.

    Parameters
    ----------
    league
        The league (its calendar and reserve dates).
    played_through
        The last day of history.
    extra
        Dates of games already planned or moved there.

    Returns
    -------
    list of date
        The calendar's match days, the reserve dates and ``extra``, after ``played_through``,
        in order.
    """
    cal = league.calendar
    needed = 0
    if cal.end is None and not cal.dates:
        needed = days_needed(league) + len(league.teams) * 4
    try:
        days = set(match_days(league, needed))
    except InputError:
        days = set()
    days |= set(cal.reserve_dates)
    days |= set(extra)
    return sorted(d for d in days if d > played_through)


class RepairModel:
    """The CP-SAT model of one re-plan (see the module docstring).

    Parameters
    ----------
    problem
        What to re-plan.
    explainable
        Put every rule under an assumption literal (to name the clash when no re-plan
        exists) instead of enforcing it.
    """

    def __init__(self, problem: RepairProblem, *, explainable: bool = False) -> None:
        self.problem = problem
        league = problem.league
        self.league = league
        self.per_day = max(1, league.calendar.rounds_per_day)
        self.model = cp_model.CpModel()
        self.cp = self.model  # the name rules use (scheduler.rules.base.DateModelView)
        self.book = RuleBook(self.model)
        self.explainable = explainable
        pt = problem.played_through
        old_dates = [f.date for f in problem.future if f.date is not None and f.date > pt]
        forced_dates = [g.date for g in problem.forced.values()]
        days = candidate_days(league, pt, old_dates + forced_dates)
        self.reserve = frozenset(league.calendar.reserve_dates)
        self.places, self.by_venue = _places(league, self.per_day)
        # a sitting is a match day (one round a day) or a match day and a kick-off time
        # (several rounds a day); the model's "days" are the sittings in time order, and
        # self.days[s] is the date of sitting s
        if self.per_day == 1:
            self.sittings: list[tuple[date, time | None]] = [(d, None) for d in days]
        else:
            times = {p.slot_time for p in self.places if p.slot_time is not None}
            self.sittings = sorted({(d, t) for d in days for t in times}
                                   | {(g.date, g.start) for g in problem.forced.values()})
        self.days = [d for d, _ in self.sittings]
        self.sitting_index = {sitting: i for i, sitting in enumerate(self.sittings)}
        self.sittings_by_day: dict[date, list[int]] = {}
        for s, (day, _) in enumerate(self.sittings):
            self.sittings_by_day.setdefault(day, []).append(s)
        self.teams = list(league.team_names)
        self._history_state()
        self._build_options()
        self._build_team_days()
        self._build_rules()

    # --- history --------------------------------------------------------------------------
    def _history_state(self) -> None:
        games: dict[str, list[tuple[date, float, bool]]] = {t: [] for t in self.teams}
        for f in self.problem.history:
            if f.date is None:
                continue
            clock = f.start.timestamp() if f.start is not None else 0.0  # several a day
            if f.home in games:
                games[f.home].append((f.date, clock, True))
            if f.away in games:
                games[f.away].append((f.date, clock, False))
        self.last_played: dict[str, date | None] = {}
        self.history_count: dict[str, int] = {}
        self.trailing: dict[str, tuple[int, int]] = {}
        self.last_home: dict[str, bool | None] = {}
        for team, items in games.items():
            items.sort()
            self.history_count[team] = len(items)
            self.last_played[team] = items[-1][0] if items else None
            self.last_home[team] = items[-1][2] if items else None
            run = 0
            for *_, home in reversed(items):
                if home != items[-1][2]:
                    break
                run += 1
            self.trailing[team] = (run, 0) if items and items[-1][2] else (0, run)

    # --- options --------------------------------------------------------------------------
    def _blocked(self) -> tuple[set[tuple[str, date]], set]:
        """The events' unavailable days and closures (the league's own unavailable and
        no-home days are constraints of their rule modules)."""
        return set(self.problem.unavailable), set(self.problem.closed)

    def _place_closed(self, place: Place, day: date, closed: set) -> bool:
        return (place.venue, None, day) in closed or (place.venue, place.court, day) in closed

    def _home_places(self, home: str) -> list[int]:
        venue = self.league.team(home).home_venue
        if self.league.format.home_meaning == "venue" and venue:
            return self.by_venue[venue]
        return list(range(len(self.places)))

    def _build_options(self) -> None:
        """x[(g, d, swapped, p)] for every allowed day, side and place of every future game."""
        m = self.model
        away_blocked, closed = self._blocked()
        self.options: list[list[tuple[int, bool, int, cp_model.IntVar]]] = []
        self.same: list[cp_model.IntVar | None] = []
        self.forced_place: dict[int, Place] = {}
        self.empty: list[int] = []
        self.extra_places: dict[tuple[str | None, str | None, time | None], int] = {}
        for g, old in enumerate(self.problem.future):
            opts: list[tuple[int, bool, int, cp_model.IntVar]] = []
            same_lit = None
            forced = self.problem.forced.get(g)
            if forced is not None:
                swapped = forced.home != old.home
                place = self._forced_place(forced)
                self.forced_place[g] = place
                lit = m.new_bool_var(f"game{g}_moved_by_hand")
                m.add(lit == 1)
                sitting = (forced.date, forced.start if self.per_day > 1 else None)
                opts.append((self.sitting_index[sitting], swapped, -1 - g, lit))
                self.options.append(opts)
                self.same.append(None)
                continue
            for d, day in enumerate(self.days):
                for swapped in (False, True):
                    home, away = (old.away, old.home) if swapped else (old.home, old.away)
                    if (home, day) in away_blocked or (away, day) in away_blocked:
                        continue
                    for p in self._home_places(home):
                        place = self.places[p]
                        if self._place_closed(place, day, closed):
                            continue
                        if self.per_day > 1 and place.slot_time != self.sittings[d][1]:
                            continue
                        is_same = (
                            not swapped
                            and day == old.date
                            and place.venue == old.venue
                            and place.court == old.court
                            and place.slot_label == old.slot
                        )
                        name = f"game{g}_day{d}_{'swapped' if swapped else 'kept'}_place{p}"
                        lit = m.new_bool_var(name)
                        opts.append((d, swapped, p, lit))
                        if is_same:
                            same_lit = lit
            if not opts:
                self.empty.append(g)
            else:
                m.add_exactly_one(lit for *_, lit in opts)
            self.options.append(opts)
            self.same.append(same_lit)
            if same_lit is not None:
                for *_, lit in opts:
                    m.add_hint(lit, lit is same_lit)
        # each place at most once per day
        use: dict[tuple[int, int], list[cp_model.IntVar]] = {}
        for g, opts in enumerate(self.options):
            for d, _, p, lit in opts:
                key = (d, p) if p >= 0 else (d, self._place_key(self.forced_place[g]))
                use.setdefault(key, []).append(lit)
        for key in sorted(use):
            if len(use[key]) > 1 and self.league.venues:
                m.add_at_most_one(use[key])
        self.changed = []
        for g, same_lit in enumerate(self.same):
            flag = m.new_bool_var(f"game{g}_differs_from_old_plan")
            if same_lit is None:
                forced_same = g in self.problem.forced and self._forced_same(g)
                m.add(flag == (0 if forced_same else 1))
            else:
                m.add(flag == 1 - same_lit)
            self.changed.append(flag)

    def _place_key(self, place: Place) -> int:
        """The index of a known place, or a new index (in order of first use) for a place
        only a hand-moved game uses (a court at a time that is not one of the slots)."""
        key = (place.venue, place.court, place.slot_time)
        for p, known in enumerate(self.places):
            if (known.venue, known.court, known.slot_time) == key:
                return p
        return self.extra_places.setdefault(key, len(self.places) + len(self.extra_places))

    def _forced_place(self, forced: ForcedGame) -> Place:
        home_places = [self.places[p] for p in self._home_places(forced.home)]
        for place in home_places:
            if (forced.court is None or place.court == forced.court) and (
                place.slot_time == forced.start
            ):
                return place
        for place in home_places:
            if forced.court is None or place.court == forced.court:
                label = forced.start.strftime("%H:%M") if place.slot_label else None
                return Place(place.venue, place.court, forced.start, label)
        return Place(None, forced.court, forced.start, None)

    def _forced_same(self, g: int) -> bool:
        old = self.problem.future[g]
        forced = self.problem.forced[g]
        start = self._start(forced.date, self.forced_place[g], forced)
        return (old.date, old.start, old.court, old.home) == (
            forced.date, start, self.forced_place[g].court, forced.home
        )

    def _start(self, day: date, place: Place, forced: ForcedGame | None = None):
        clock = forced.start if forced is not None else place.slot_time
        return kickoff(self.league, day, clock)

    # --- teams and days -------------------------------------------------------------------
    def _build_team_days(self) -> None:
        m = self.model
        home_lits: dict[tuple[str, int], list] = {}
        away_lits: dict[tuple[str, int], list] = {}
        for g, opts in enumerate(self.options):
            old = self.problem.future[g]
            for d, swapped, _, lit in opts:
                home, away = (old.away, old.home) if swapped else (old.home, old.away)
                home_lits.setdefault((home, d), []).append(lit)
                away_lits.setdefault((away, d), []).append(lit)
        self.home_on: dict[str, list] = {}
        self.away_on: dict[str, list] = {}
        for team in self.teams:
            hs, aws = [], []
            for d in range(len(self.days)):
                h = m.new_bool_var(f"{team}_home_day{d}")
                a = m.new_bool_var(f"{team}_away_day{d}")
                m.add(h == sum(home_lits.get((team, d), [])))
                m.add(a == sum(away_lits.get((team, d), [])))
                m.add_bool_or([h.negated(), a.negated()])
                hs.append(h)
                aws.append(a)
            self.home_on[team] = hs
            self.away_on[team] = aws
        if self.per_day > 1:
            self._same_day_limits()

    def _same_day_limits(self) -> None:
        """Several rounds on one match day: a team plays at most ``rounds_per_day`` games a
        day, and never two whose kick-offs are less than ``game_minutes`` apart."""
        m = self.model
        length = self.league.calendar.game_minutes
        for day in sorted(self.sittings_by_day):
            sittings = self.sittings_by_day[day]
            for team in self.teams:
                if len(sittings) > self.per_day:
                    m.add(sum(self.plays(team, s) for s in sittings) <= self.per_day)
                for s1, s2 in itertools.combinations(sittings, 2):
                    t1, t2 = self.sittings[s1][1], self.sittings[s2][1]
                    if t1 is None or t2 is None:
                        continue
                    apart = abs((datetime.combine(day, t2) - datetime.combine(day, t1))
                                .total_seconds()) / 60
                    if apart < length:
                        m.add(self.plays(team, s1) + self.plays(team, s2) <= 1)

    def plays(self, team: str, d: int) -> cp_model.LinearExpr:
        """Whether ``team`` plays in sitting ``d``.

        Parameters
        ----------
        team
            A team of the league.
        d
            Index of a sitting (a match day, or a match day and kick-off time).

        Returns
        -------
        LinearExpr
            Its home plus away indicator (0 or 1).
        """
        return self.home_on[team][d] + self.away_on[team][d]

    # --- rules ----------------------------------------------------------------------------
    def _rule(self, text: str):
        lit = self.book.rule(text)
        if not self.explainable:
            self.model.add(lit == 1)
        return lit

    # the interface rules use (scheduler.rules.base.DateModelView)
    def switch(self, statement: str) -> cp_model.IntVar:
        """The literal that enforces ``statement``.

        Parameters
        ----------
        statement
            The rule in the organizer's words (it names the rule in a clash).

        Returns
        -------
        IntVar
            A Boolean, fixed true unless the model is built to explain a clash.
        """
        return self._rule(statement)

    def home(self, team: str, d: int) -> cp_model.IntVar:
        """Whether ``team`` plays at home in sitting ``d``.

        Parameters
        ----------
        team
            A team of the league.
        d
            Index of a sitting.

        Returns
        -------
        IntVar
            The Boolean.
        """
        return self.home_on[team][d]

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
        return list(self.sittings_by_day.get(day, ()))

    def _build_rules(self) -> None:
        """The breaks (a goal, and what the break-free ends rule reads) and, in a season of
        several legs, each pair's home games per team; then every hard rule of the league
        states its own constraints (its module's ``add_date_constraints``, docs/rules.md)."""
        self._build_breaks()
        if self.league.format.legs > 1:
            self._pair_home_counts()
        for rule in RULES:
            if rule.date_constraints and rule.date_constraints_on(self.league):
                rule.add_date_constraints(self)

    def away(self, team: str, d: int) -> cp_model.IntVar:
        """Whether ``team`` plays away in sitting ``d``.

        Parameters
        ----------
        team
            A team of the league.
        d
            Index of a sitting.

        Returns
        -------
        IntVar
            The Boolean.
        """
        return self.away_on[team][d]

    def games_played(self, team: str) -> int:
        """How many games ``team`` has played in history.

        Parameters
        ----------
        team
            A team of the league.

        Returns
        -------
        int
            Its games with a date on or before ``played_through``.
        """
        return self.history_count[team]

    def run_from_history(self, team: str, home: bool) -> int:
        """The run of home (``home``) or away games that ``team``'s history ends with.

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
        return self.trailing[team][0 if home else 1]

    def break_in(self, team: str, d: int) -> cp_model.IntVar:
        """Whether ``team`` has a break in sitting ``d`` (the same side as in its previous
        game, history included).

        Parameters
        ----------
        team
            A team of the league.
        d
            Index of a sitting.

        Returns
        -------
        IntVar
            The Boolean.
        """
        return self.brk[team][d]

    def meetings_on_match_days(self) -> dict[frozenset[str], list[tuple[int, Any]]]:
        """Every meeting of each pair: its leg and its position among the season's match days
        (history's dates and the candidate dates, 0-based in time order).

        Returns
        -------
        dict of frozenset of str to list of tuple of (int, Any)
            Pair -> ``(leg, position)`` per meeting, history first: an int for a game played,
            a linear expression for a game to place.
        """
        axis = sorted({f.date for f in self.problem.history if f.date} | set(self.days))
        position = {day: i for i, day in enumerate(axis)}
        meetings: dict[frozenset[str], list[tuple[int, Any]]] = {}
        for f in self.problem.history:
            if f.date is not None:
                meetings.setdefault(f.pair, []).append((f.leg, position[f.date]))
        for g, old in enumerate(self.problem.future):
            where = sum(position[self.days[d]] * lit for d, _, _, lit in self.options[g])
            meetings.setdefault(old.pair, []).append((old.leg, where))
        return meetings

    def _build_breaks(self) -> None:
        """brk[team][d]: team plays on day d with the same side as in its previous game."""
        m = self.model
        self.brk: dict[str, list] = {}
        total = []
        for team in self.teams:
            last = self.last_home[team]
            prev_home: cp_model.LinearExprT | None = None if last is None else int(last)
            started: cp_model.LinearExprT = 0 if last is None else 1
            row = []
            for d in range(len(self.days)):
                h, a = self.home_on[team][d], self.away_on[team][d]
                b = m.new_bool_var(f"{team}_break_day{d}")
                if prev_home is not None:
                    m.add(b >= h + prev_home + started - 2)
                    m.add(b >= a + (1 - prev_home) + started - 2)
                row.append(b)
                total.append(b)
                now_home = m.new_bool_var(f"{team}_last_side_home_day{d}")
                m.add(now_home == 1).only_enforce_if(h)
                m.add(now_home == 0).only_enforce_if(a)
                if prev_home is None:
                    m.add(now_home == 0).only_enforce_if([h.negated(), a.negated()])
                else:
                    m.add(now_home == prev_home).only_enforce_if([h.negated(), a.negated()])
                now_started = m.new_bool_var(f"{team}_has_played_day{d}")
                m.add(now_started >= started)
                m.add(now_started >= h + a)
                m.add(now_started <= started + h + a)
                prev_home, started = now_home, now_started
            self.brk[team] = row
        self.total_breaks = sum(total)

    def _pair_home_counts(self) -> None:
        m = self.model
        by_pair: dict[frozenset[str], list[int]] = {}
        for g, old in enumerate(self.problem.future):
            by_pair.setdefault(old.pair, []).append(g)
        for pair in sorted(by_pair, key=sorted):
            games = by_pair[pair]
            first = sorted(pair)[0]
            planned = sum(1 for g in games if self.problem.future[g].home == first)
            terms = []
            for g in games:
                old = self.problem.future[g]
                for _, swapped, _, lit in self.options[g]:
                    if (old.home == first) != swapped:
                        terms.append(lit)
            m.add(sum(terms) == planned)

    # --- soft goals (second stage) --------------------------------------------------------
    def _off_reserve(self) -> cp_model.LinearExprT:
        """Moved games not on a reserve date (hand-moved games do not count)."""
        lits = [lit for g, opts in enumerate(self.options) if g not in self.problem.forced
                for d, _, _, lit in opts
                if self.days[d] not in self.reserve and lit is not self.same[g]]
        return sum(lits)

    def _least_rest(self) -> tuple[cp_model.LinearExprT, list[tuple[int, cp_model.IntVar]]]:
        """Maximise the least rest (days without a game between two games of a team) over the
        games of the re-planned part, the boundary with history included.

        ``at_least[v]`` (one per rest value ``v`` that can occur below two weeks, and one for
        two weeks) forbids every pair of games of one team closer than ``v`` rest days; the
        flags are chained (``at_least[v]`` implies the one below), so the largest true flag is
        the least rest (14 meaning 14 or more). Returns the expression to minimise (minus the
        number of true flags) and the flags.
        """
        m = self.model
        cap = 14
        floor = self.league.rules.min_rest_days or 0
        pairs: list[tuple[int, int, int]] = []  # (rest, day i, day j), i = -1: last game played
        for i, d1 in enumerate(self.days):
            for j in range(i + 1, len(self.days)):
                gap = max(0, rest_days_between(d1, self.days[j]))  # one day: 0 rest
                if gap >= cap:
                    break
                if gap >= floor:
                    pairs.append((gap, i, j))
        boundary: list[tuple[int, str, int]] = []
        for team in self.teams:
            last = self.last_played.get(team)
            if last is None:
                continue
            for j, day in enumerate(self.days):
                gap = rest_days_between(last, day)
                if gap >= cap:
                    break
                if gap >= floor:
                    boundary.append((gap, team, j))
        if not pairs and not boundary:
            return 0, []
        values = sorted({gap for gap, *_ in pairs} | {gap for gap, *_ in boundary} | {cap})
        flags: list[tuple[int, cp_model.IntVar]] = []
        for v in values:
            flag = m.new_bool_var(f"least_rest_at_least_{v}_days")
            if flags:
                m.add_implication(flag, flags[-1][1])
            flags.append((v, flag))
        flag_of = dict(flags)

        def guard(gap: int) -> cp_model.IntVar:
            return flag_of[min(v for v in values if v > gap)]

        for gap, i, j in pairs:
            for team in self.teams:
                m.add(self.plays(team, i) + self.plays(team, j) <= 1).only_enforce_if(guard(gap))
        for gap, team, j in boundary:
            m.add(self.plays(team, j) == 0).only_enforce_if(guard(gap))
        return -sum(flag for _, flag in flags), flags

    def _spread(self, label: str, key_of) -> tuple[cp_model.LinearExprT, cp_model.IntVar] | None:
        """The spread of a team's games over the courts of each venue with several courts
        (``label`` "court", ``key_of`` giving ``(venue, court)``) or over the kick-off times of
        the venues with time slots ("slot"): its most-used minus its least-used court of one
        venue, or kick-off time, over the season, history included (the fairness figures'
        court and kick-off time spread). ``key_of`` gives ``None`` for a place outside the
        balance.

        Returns the expression to minimise (the largest spread of a team first, then the sum
        of the spreads) and the largest spread; ``None`` when there are fewer than two such
        courts or times (nothing to balance).
        """
        m = self.model
        keys = sorted({key_of(p) for p in self.places if key_of(p) is not None}, key=str)
        if len(keys) < 2:
            return None
        counts: dict[tuple[str, object], list] = {}
        where = {(p.venue, p.court, p.slot_label): p for p in self.places}
        for f in self.problem.history:
            place = where.get((f.venue, f.court, f.slot))
            key = key_of(place) if place is not None else None
            for team in f.teams:
                counts.setdefault((team, key), []).append(1)
        for g, opts in enumerate(self.options):
            old = self.problem.future[g]
            for _, _, p, lit in opts:
                place = self.places[p] if p >= 0 else self.forced_place[g]
                key = key_of(place)
                for team in old.teams:
                    counts.setdefault((team, key), []).append(lit)
        games = len(self.problem.history) + len(self.options)
        top = m.new_int_var(0, games, f"largest_{label}_spread_of_a_team")
        # courts are compared within their venue (as the fairness figures do), kick-off
        # times across the league
        groups: dict[object, list[object]] = {}
        for key in keys:
            groups.setdefault(key[0] if label == "court" else None, []).append(key)
        spreads = []
        for team in self.teams:
            for g, members in enumerate(groups.values()):
                if len(members) < 2:
                    continue
                most = m.new_int_var(0, games, f"{team}_most_games_on_one_{label}_group{g}")
                least = m.new_int_var(0, games, f"{team}_fewest_games_on_one_{label}_group{g}")
                for key in members:
                    used = sum(counts.get((team, key), []))
                    m.add(most >= used)
                    m.add(least <= used)
                spread = m.new_int_var(0, games, f"{team}_{label}_spread_group{g}")
                m.add(spread == most - least)
                m.add(top >= spread)
                spreads.append(spread)
        return (len(spreads) * games + 1) * top + sum(spreads), top

    def goals(self) -> list[tuple[str, cp_model.LinearExprT]]:
        """The second stage's goals, most important first, each to be minimised.

        Reserve dates for the games that must move (the league keeps them for that), then
        the fewest games with the other team at home (a moved game keeps its host where it
        can: who hosts whom is part of the agreement), then the least rest (player welfare;
        the league file has no weight for it, ``min_rest_days`` is its hard floor), then the
        league's own priorities that a date placement can change, in the order of their
        weights (``priorities.breaks``, ``venue_balance``, ``slot_balance``; weight 0 leaves a
        goal out, equal weights keep this order), and last the earliest dates for the moved
        games. ``mixing`` and ``carry_over`` are about the
        order of rounds, which a re-plan does not choose.

        Returns
        -------
        list of (str, LinearExpr)
            Goal name and the expression to minimise.
        """
        swapped = [lit for g, opts in enumerate(self.options) if g not in self.problem.forced
                   for _, side_swapped, _, lit in opts if side_swapped]
        out: list[tuple[str, cp_model.LinearExprT]] = [("reserve", self._off_reserve()),
                                                       ("home_side", sum(swapped))]
        rest, self.rest_flags = self._least_rest()
        if self.rest_flags:
            out.append(("rest", rest))
        weights = self.league.priorities
        weighted: list[tuple[int, int, str, cp_model.LinearExprT]] = []
        if weights.breaks > 0:
            weighted.append((weights.breaks, 0, "breaks", self.total_breaks))
        shared = {v.name for v in self.league.venues if len(v.courts) > 1}
        self.spread_top: dict[str, cp_model.IntVar] = {}
        court = self._spread("court", lambda p: (p.venue, p.court) if p.venue in shared
                             else None)
        if court is not None and weights.venue_balance > 0:
            weighted.append((weights.venue_balance, 1, "venue_balance", court[0]))
            self.spread_top["venue_balance"] = court[1]
        slot = self._spread("slot", lambda p: p.slot_time)
        if slot is not None and weights.slot_balance > 0:
            weighted.append((weights.slot_balance, 2, "slot_balance", slot[0]))
            self.spread_top["slot_balance"] = slot[1]
        out += [(name, expr) for _, _, name, expr in sorted(weighted, key=lambda w: (-w[0], w[1]))]
        late = [d * lit for g, opts in enumerate(self.options) if g not in self.problem.forced
                for d, _, _, lit in opts if lit is not self.same[g] and d]
        out.append(("earliest", sum(late)))
        return out

    def _figure(self, name: str, solver: cp_model.CpSolver, expr) -> int:
        """A goal's value in the league's terms (rest in days, the others as counted)."""
        if name == "rest":
            held = [v for v, flag in self.rest_flags if solver.value(flag)]
            return held[-1] if held else (self.league.rules.min_rest_days or 0)
        if name in self.spread_top:
            return int(solver.value(self.spread_top[name]))
        return int(solver.value(expr))

    # --- solving --------------------------------------------------------------------------
    def solve(self, limits: SolveLimits) -> RepairResult:
        """Fewest changed games (proven when CP-SAT says OPTIMAL), then the second stage.

        Parameters
        ----------
        limits
            CP-SAT limits of the first stage; each goal of the second stage gets a quarter of
            its deterministic time, between 1 and 5 seconds.

        Returns
        -------
        RepairResult
            The re-planned games and their figures.

        Raises
        ------
        InfeasibleError
            When no re-plan keeps every rule, or none was found in the time.
        """
        self.precheck()
        m = self.model
        goals = self.goals()
        changed = sum(self.changed)
        m.minimize(changed)
        solver = cp_model.CpSolver()
        configure(solver, limits)
        status = solve_interruptibly(solver, m)
        seconds = proof_seconds = solver.wall_time
        if status == cp_model.INFEASIBLE:
            raise InfeasibleError("no re-plan keeps every rule", [])
        if status not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
            raise InfeasibleError(
                "no re-plan was found within the time limit; allow more solve_seconds", [])
        best = round(solver.objective_value)
        bound = round(solver.best_objective_bound)
        proven = status == cp_model.OPTIMAL
        # second stage, lexicographic: keep the change count, then each goal in turn at its
        # best value (or the value reached when its time ran out)
        m.add(changed <= best)
        use = solver
        figures: list[GoalFigure] = []
        notes: list[str] = []
        stage_limits = SolveLimits(max(1.0, min(5.0, limits.deterministic / 4)), limits.wall,
                                   limits.seed)
        for name, expr in goals:
            m.clear_hints()
            for opts in self.options:
                for *_, lit in opts:
                    m.add_hint(lit, use.value(lit))
            m.minimize(expr)
            stage = cp_model.CpSolver()
            configure(stage, stage_limits)
            stage_status = solve_interruptibly(stage, m)
            seconds += stage.wall_time
            if stage_status in (cp_model.OPTIMAL, cp_model.FEASIBLE):
                use = stage
            else:
                notes.append(f"the {GOAL_LABELS[name]} stage found nothing in its time")
            m.add(expr <= int(use.value(expr)))
            if name != "earliest":
                figures.append(GoalFigure(name, self._figure(name, use, expr),
                                          use is stage and stage_status == cp_model.OPTIMAL))
        fixtures, on_reserve = self._extract(use)
        breaks = int(sum(use.value(b) for row in self.brk.values() for b in row))
        return RepairResult(tuple(fixtures), best, proven, bound, on_reserve, breaks, seconds,
                            tuple(notes), proof_seconds, tuple(figures))

    def _extract(self, solver: cp_model.CpSolver) -> tuple[list[Fixture], int]:
        out = []
        on_reserve = 0
        for g, old in enumerate(self.problem.future):
            chosen = [(d, s, p) for d, s, p, lit in self.options[g] if solver.value(lit)]
            d, swapped, p = chosen[0]
            same_lit = self.same[g]
            if same_lit is not None and solver.value(same_lit):
                out.append(old)
                continue
            day = self.days[d]
            if day in self.reserve:
                on_reserve += 1
            home, away = (old.away, old.home) if swapped else (old.home, old.away)
            forced = self.problem.forced.get(g)
            place = self.forced_place[g] if forced is not None else self.places[p]
            start = self._start(day, place, forced)
            if forced is not None and self._forced_same(g):
                out.append(old)
                continue
            out.append(replace(old, home=home, away=away, venue=place.venue, court=place.court,
                               slot=place.slot_label, date=day, start=start))
        return out, on_reserve

    # --- explaining -----------------------------------------------------------------------
    def precheck(self) -> None:
        """Clashes that need no solver: a game with no day left, a team short of days."""
        conflicts = []
        for g in self.empty:
            old = self.problem.future[g]
            conflicts.append(
                f"{old.home} v {old.away} (round {old.round}) has no possible date left after "
                f"{self.problem.played_through.isoformat()}: every remaining match day is "
                "excluded, closed, too close to a game played or a day one of the teams is "
                "unavailable")
        days_of: dict[str, set[int]] = {team: set() for team in self.teams}
        games_of: dict[str, int] = {team: 0 for team in self.teams}
        for g, opts in enumerate(self.options):
            for team in self.problem.future[g].teams:
                games_of[team] = games_of.get(team, 0) + 1
                days_of.setdefault(team, set()).update(d for d, *_ in opts)
        for team in self.teams:
            games, free = games_of[team], len(days_of[team])
            if games > free:
                conflicts.append(f"{team} has {games} games left but only {free} match days "
                                 "on which it can play")
        if conflicts:
            raise InfeasibleError("the remaining games cannot all be placed", conflicts)

    def explain_infeasible(self, limits: SolveLimits) -> InfeasibleError:
        """Name the rules that cannot hold together (an explainable model must be built).

        Parameters
        ----------
        limits
            CP-SAT limits of the solve under assumptions.

        Returns
        -------
        InfeasibleError
            The error to raise, listing the rules of the shrunk core.
        """
        self.book.assume_all()
        solver = cp_model.CpSolver()
        configure(solver, limits)
        status = solve_interruptibly(solver, self.model)
        if status != cp_model.INFEASIBLE:
            return InfeasibleError("no re-plan was found within the time limit", [])

        def still(indices: list[int]) -> bool:
            self.model.clear_assumptions()
            self.model.add_assumptions([self.book.literals[i] for i in indices])
            trial = cp_model.CpSolver()
            configure(trial, SolveLimits(min(limits.deterministic, 2.0), min(limits.wall, 10.0),
                                         limits.seed))
            return solve_interruptibly(trial, self.model) == cp_model.INFEASIBLE

        error = explain(self.book, solver, still,
                        what="the remaining games cannot be placed after "
                             f"{self.problem.played_through.isoformat()}")
        if not error.conflicts:
            return InfeasibleError(
                "the remaining games do not fit into the remaining match days with the "
                "closures and unavailabilities (one game per team and day, each place once a "
                "day)", [])
        return error


# --- public API ------------------------------------------------------------------------------


def is_feasible(problem: RepairProblem, limits: SolveLimits) -> bool:
    """Whether some re-plan keeps every rule (a feasibility solve, no objective).

    Parameters
    ----------
    problem
        What to re-plan.
    limits
        CP-SAT limits.

    Returns
    -------
    bool
        ``True`` when CP-SAT found a re-plan within the limits.
    """
    try:
        model = RepairModel(problem)
        model.precheck()
    except InfeasibleError:
        return False
    solver = cp_model.CpSolver()
    configure(solver, limits)
    return solve_interruptibly(solver, model.model) in (cp_model.OPTIMAL, cp_model.FEASIBLE)


def relaxations(problem: RepairProblem, limits: SolveLimits) -> list[str]:
    """The single relaxations, smallest first, under which a re-plan exists.

    Parameters
    ----------
    problem
        A re-plan that has no solution.
    limits
        CP-SAT limits (each trial gets at most 5 deterministic seconds).

    Returns
    -------
    list of str
        Each relaxation that works, tested by re-solving: a later end by 1-4 weeks (the
        smallest), one more weekday, or one step of a rule
        (:meth:`~scheduler.rules.base.HardRule.lowered`).
    """
    league = problem.league
    cal, rules = league.calendar, league.rules
    found: list[str] = []
    small = SolveLimits(min(limits.deterministic, 5.0), min(limits.wall, 30.0), limits.seed)
    if cal.end is not None and not cal.dates:
        for weeks in range(1, 5):
            end = cal.end + timedelta(weeks=weeks)
            trial = replace(problem, league=replace(league, calendar=replace(cal, end=end)))
            if is_feasible(trial, small):
                found.append(f"extend the season by {weeks} week{'s' if weeks > 1 else ''} "
                             f"(calendar.end = {end.isoformat()})")
                break
    if not cal.dates:
        for weekday in range(7):
            if weekday in cal.weekdays:
                continue
            spec = replace(cal, weekdays=tuple(sorted((*cal.weekdays, weekday))))
            trial = replace(problem, league=replace(league, calendar=spec))
            if is_feasible(trial, small):
                found.append(f"allow games on {WEEKDAY_NAMES[weekday]}s "
                             "(add it to calendar.weekdays)")
                break
    for name, value in (step for rule in RULES for step in rule.lowered(league)):
        lowered_rule: dict[str, Any] = {name: value}
        trial = replace(problem, league=replace(league, rules=replace(rules, **lowered_rule)))
        if is_feasible(trial, small):
            found.append(f"relax rules.{name} to {value}")
    return found


def repair_season(problem: RepairProblem, limits: SolveLimits) -> RepairResult:
    """Re-plan the future games of ``problem`` with the fewest changes.

    Parameters
    ----------
    problem
        History, the previous plan's future games and the new constraints.
    limits
        CP-SAT limits (one worker; the deterministic time decides, the wall clock is a cap).

    Returns
    -------
    RepairResult
        The new future games, the number changed, whether that minimum is proven.

    Raises
    ------
    InfeasibleError
        When no re-plan keeps every rule: the clash in the league's words and, as further
        conflict lines, the relaxations that would make a re-plan possible.

    References
    ----------
    R. Barták, T. Müller, H. Rudová, "A new approach to modeling and solving minimal
    perturbation problems", CSCLP 2003, LNCS 3010 (2004) (from memory); docs/replanning.md.
    """
    model = RepairModel(problem)
    try:
        return model.solve(limits)
    except InfeasibleError as exc:
        if exc.conflicts:
            error = exc
        else:
            error = RepairModel(problem, explainable=True).explain_infeasible(limits)
        hints = relaxations(problem, limits)
        lines = list(error.conflicts)
        if hints:
            lines += [f"possible fix: {h}" for h in hints]
        else:
            lines.append("no single relaxation tried (a later end by up to 4 weeks, another "
                         "weekday, one rule lowered by one) makes a re-plan possible")
        message = str(error).split("\n")[0]
        raise InfeasibleError(message, lines) from None
