"""Plan one unit of work: jointly (one CP-SAT model), or one division after another.

A unit of two or more divisions is first given to the joint model
(:mod:`scheduler.divisions.joint`): all its timetables in one CP-SAT model with the rules across
divisions stated once. Only when that model cannot be built (too large, several rounds on one
day) or finds nothing within its limits is the unit planned one division after another, as
described below; :attr:`UnitResult.method` says which method planned it and why.

One after another: the divisions of a unit are planned in file order with
:func:`scheduler.plan.plan_season`, unchanged. Before a division is planned, the
couplings to the divisions already planned become ordinary rules of its own league:

- shared venue: the division gets its share of the venue's courts or slots
  (:func:`scheduler.divisions.grouping.venue_shares`), for every division of the unit alike;
- shared ground (``apart`` and ``complementary``): each of its teams gets ``no_home_games`` on
  the dates another team of the ground (already planned) is at home. The second half of the
  complementary pattern (at home when the partner is away) is not a rule a league can state; it
  is measured afterwards (:mod:`scheduler.divisions.check`) and reported;
- player group: each of its teams is ``unavailable`` on the dates a team of the group already
  planned plays at a time that overlaps a kick-off the division could give it.

This is a sequential (greedy) method: an earlier division never waits for a later one, so a
unit that could be planned jointly may fail here; the error then names the division and the
couplings that added rules to it. ``docs/divisions.md`` discusses the limits.
"""

from __future__ import annotations

import time as clock
from collections.abc import Iterable
from dataclasses import dataclass, field, replace
from datetime import date, datetime
from typing import TYPE_CHECKING

from scheduler.config.federation import Federation
from scheduler.config.model import League, TeamDates
from scheduler.divisions.grouping import (
    Coupling,
    Unit,
    couplings_of,
    possible_windows,
    venue_shares,
    windows_overlap,
)
from scheduler.errors import InfeasibleError, SchedulerError
from scheduler.season import Season

if TYPE_CHECKING:
    from scheduler.fairness.model import FairnessReport


JOINT = "joint"
"""The unit's divisions were planned in one CP-SAT model (:mod:`scheduler.divisions.joint`)."""
SEQUENTIAL = "one after another"
"""The unit's divisions were planned in file order, earlier plans becoming rules of later ones."""
SINGLE = "single division"
"""A unit of one division, planned by the single-league planner."""
METHODS = ("auto", "joint", "sequential")
"""What :func:`plan_unit` may be asked for: ``auto`` (joint, else one after another), ``joint``
only, or ``sequential`` only."""


@dataclass(frozen=True)
class DivisionPlan:
    """A planned division: its league as planned (with the coupling rules added), the season,
    the fairness figures, the planner's notes and the couplings that added rules.

    Parameters
    ----------
    name : str
        The division.
    league : League
        Its league as planned (one after another: with the rules the couplings added).
    season : Season
        The planned season.
    fairness : FairnessReport
        Its fairness figures.
    notes : tuple of str
        The planner's notes.
    added : tuple of str
        The couplings that bound it (in the words of :meth:`Coupling.describe`).
    seconds : float
        Its share of the unit's planning time.

    Examples
    --------
    >>> from scheduler.config.federation import parse_federation
    >>> def division(name, teams):
    ...     return {"name": name, "teams": [{"name": t, "home_venue": f"{t} Ground"}
    ...                                      for t in teams]}
    >>> fed = parse_federation({
    ...     "federation": {"name": "Example", "season": "2031", "timezone": "Europe/London",
    ...                    "solve_seconds": 1},
    ...     "calendar": {"start": "2031-09-06", "end": "2031-12-20", "weekdays": ["sat"]},
    ...     "venues": [{"name": f"{t} Ground"} for t in "ABCDEFGH"],
    ...     "divisions": [division("First", "ABCD"), division("Reserves", "EF"),
    ...                   division("Other", "GH")],
    ...     "shared_grounds": [{"teams": ["A", "E"], "pattern": "complementary"}]})
    >>> from scheduler.divisions.grouping import units_of
    >>> first = plan_unit(fed, units_of(fed)[0]).plans[0]
    >>> first.name, len(first.season.fixtures), first.added
    ('First', 6, ("shared ground 'A / E' (A, E): complementary home/away",))
    """

    name: str
    league: League
    season: Season
    fairness: FairnessReport
    notes: tuple[str, ...]
    added: tuple[str, ...]
    seconds: float


@dataclass(frozen=True)
class UnitResult:
    """The outcome of one unit: its division plans, or ``error`` (a message) when it failed;
    ``seconds`` is its wall time, ``cpu_seconds`` the processor time it used (its cost on an
    otherwise idle core).

    Parameters
    ----------
    key : str
        The unit.
    plans : tuple of DivisionPlan
        Its division plans (those planned before a failure, when it failed).
    error : str or None
        Why it failed.
    conflicts : tuple of str
        The rules found in conflict.
    seconds : float
        Wall time.
    cpu_seconds : float
        Processor time.
    method : str
        Which method planned it (:data:`JOINT`, :data:`SEQUENTIAL`, :data:`SINGLE`).
    fallback : str
        Why the joint model was not used.

    Examples
    --------
    >>> UnitResult("unit-01", error="no plan").method
    'one after another'
    """

    key: str
    plans: tuple[DivisionPlan, ...] = ()
    error: str | None = None
    conflicts: tuple[str, ...] = field(default_factory=tuple)
    seconds: float = 0.0
    cpu_seconds: float = 0.0
    method: str = SEQUENTIAL
    """:data:`JOINT`, :data:`SEQUENTIAL` or :data:`SINGLE` (a unit of one division)."""
    fallback: str = ""
    """Why the joint model was not used (empty when it was, or was not tried)."""


def _merge(entries: Iterable[TeamDates], extra: dict[str, set[date]]) -> tuple[TeamDates, ...]:
    dates: dict[str, set[date]] = {}
    for e in entries:
        dates.setdefault(e.team, set()).update(e.dates)
    for team, days in extra.items():
        dates.setdefault(team, set()).update(days)
    return tuple(TeamDates(team, tuple(sorted(days))) for team, days in dates.items() if days)


def _busy(start: datetime | None, day: date | None, minutes: int) -> tuple[date, int, int] | None:
    if start is not None:
        local = start
        first = local.hour * 60 + local.minute
        return (local.date(), first, first + minutes)
    if day is not None:
        return (day, 0, 24 * 60)
    return None


def adapt(league: League, name: str, fed: Federation, couplings: list[Coupling],
          shares: dict, planned: dict[str, DivisionPlan]) -> tuple[League, tuple[str, ...]]:
    """``league`` with the couplings to the ``planned`` divisions turned into its own rules.

    Parameters
    ----------
    league : League
        The division's league.
    name : str
        The division.
    fed : Federation
        The federation.
    couplings : list of Coupling
        The federation's couplings.
    shares : dict
        ``(division, venue)`` -> the division's share of a shared venue.
    planned : dict of str to DivisionPlan
        The divisions of the unit already planned.

    Returns
    -------
    tuple
        The league with the rules added, and the descriptions of the couplings that added
        something.
    """
    added: list[str] = []
    venues = tuple(shares.get((name, v.name), v) for v in league.venues)
    if venues != league.venues:
        added.extend(c.describe() for c in couplings
                     if c.kind == "venue" and name in c.divisions)
        league = replace(league, venues=venues)
    mine = set(league.team_names)
    no_home: dict[str, set[date]] = {}
    unavailable: dict[str, set[date]] = {}
    home_dates: dict[str, set[date]] = {}
    games: dict[str, list[tuple[date, int, int]]] = {}
    for plan in planned.values():
        minutes = plan.league.calendar.game_minutes
        for f in plan.season.fixtures:
            if f.date is not None:
                home_dates.setdefault(f.home, set()).add(f.date)
            busy = _busy(f.start, f.date, minutes)
            if busy is not None:
                games.setdefault(f.home, []).append(busy)
                games.setdefault(f.away, []).append(busy)
    windows = possible_windows(league)
    for c in couplings:
        if name not in c.divisions:
            continue
        ours = [t for t in c.teams if t in mine]
        theirs = [t for t in c.teams if t not in mine and fed.division_of(t) in planned]
        if not ours or not theirs:
            continue
        before = sum(len(v) for v in no_home.values()) + sum(len(v) for v in unavailable.values())
        if c.kind == "ground":
            days = set().union(*(home_dates.get(t, set()) for t in theirs))
            for t in ours:
                no_home.setdefault(t, set()).update(days)
        elif c.kind == "players":
            days = {day for t in theirs for day, a, b in games.get(t, [])
                    if any(windows_overlap(w, (a, b)) for w in windows)}
            for t in ours:
                unavailable.setdefault(t, set()).update(days)
        after = sum(len(v) for v in no_home.values()) + sum(len(v) for v in unavailable.values())
        if after > before:
            added.append(c.describe())
    if no_home or unavailable:
        rules = replace(
            league.rules,
            no_home_games=_merge(league.rules.no_home_games, no_home),
            unavailable=_merge(league.rules.unavailable, unavailable),
        )
        league = replace(league, rules=rules)
    return league, tuple(added)


def plan_unit(fed: Federation, unit: Unit, time_limit: float | None = None,
              method: str = "auto") -> UnitResult:
    """Plan the divisions of ``unit`` (see the module docstring).

    Parameters
    ----------
    fed
        The federation.
    unit
        The unit of work (from :func:`scheduler.divisions.grouping.units_of`).
    time_limit
        Solver seconds per division (default: each division's ``solve_seconds``).
    method
        One of :data:`METHODS`: ``auto`` tries the joint model and falls back to one division
        after another; ``joint`` and ``sequential`` use only that method.

    Returns
    -------
    UnitResult
        The plans, or the error message and conflicts of the first division that failed. Never
        raises for rules that cannot hold, so the result travels back from a worker intact.

    Raises
    ------
    ValueError
        For a ``method`` not in :data:`METHODS`.

    Examples
    --------
    >>> from scheduler.config.federation import parse_federation
    >>> from scheduler.divisions.grouping import units_of
    >>> def division(name, teams):
    ...     return {"name": name, "teams": [{"name": t, "home_venue": f"{t} Ground"}
    ...                                      for t in teams]}
    >>> fed = parse_federation({
    ...     "federation": {"name": "Example", "season": "2031", "timezone": "Europe/London",
    ...                    "solve_seconds": 1},
    ...     "calendar": {"start": "2031-09-06", "end": "2031-12-20", "weekdays": ["sat"]},
    ...     "venues": [{"name": f"{t} Ground"} for t in "ABCDEF"],
    ...     "divisions": [division("First", "ABCD"), division("Reserves", "EF")],
    ...     "shared_grounds": [{"teams": ["A", "E"], "pattern": "complementary"}]})
    >>> result = plan_unit(fed, units_of(fed)[0])
    >>> result.method, result.error, [p.name for p in result.plans]
    ('joint', None, ['First', 'Reserves'])
    """
    if method not in METHODS:
        raise ValueError(f"method must be one of {', '.join(METHODS)}, got {method!r}")
    began = clock.perf_counter()
    cpu_began = clock.process_time()
    couplings = couplings_of(fed)
    fallback = ""
    if len(unit.divisions) > 1 and method in ("auto", "joint"):
        from scheduler.divisions.joint import plan_jointly

        mine = [c for c in couplings if set(c.divisions) <= set(unit.divisions)]
        outcome = plan_jointly(fed, unit, mine, time_limit)
        if outcome.solved:
            plans = _joint_plans(fed, unit, mine, outcome, clock.perf_counter() - began)
            return UnitResult(unit.key, plans, None, (), clock.perf_counter() - began,
                              clock.process_time() - cpu_began, JOINT)
        fallback = outcome.reason
        if method == "joint":
            return UnitResult(unit.key, (), f"the joint model cannot plan {unit.key}: {fallback}",
                              (), clock.perf_counter() - began, clock.process_time() - cpu_began,
                              JOINT, fallback)
    result = _plan_sequentially(fed, unit, couplings, time_limit)
    return replace(result, seconds=clock.perf_counter() - began,
                   cpu_seconds=clock.process_time() - cpu_began,
                   method=SINGLE if len(unit.divisions) == 1 else SEQUENTIAL, fallback=fallback)


def _joint_plans(fed: Federation, unit: Unit, couplings: list[Coupling], outcome,
                 seconds: float) -> tuple[DivisionPlan, ...]:
    """The division plans of a unit the joint model solved."""
    from scheduler.fairness import compute_fairness
    from scheduler.fairness.notes import silent_effect_notes
    from scheduler.plan import season_from_timetable

    plans = []
    for name in unit.divisions:
        league = fed.division(name).league
        fact = outcome.factorizations[name]
        timetable = outcome.timetables[name]
        placement = outcome.placements[name]
        others = [d for d in unit.divisions if d != name]
        notes = [f"planned jointly with {', '.join(others)}: one model for the timetables of "
                 "the unit, the rules across divisions stated once"]
        if timetable.wall_cap_hit or placement.wall_cap_hit:
            notes.append("the wall-clock safety limit was hit while solving the joint model; the "
                         "result may depend on machine load (allow more time: solve_seconds)")
        if timetable.breaks > timetable.break_bound and timetable.status != "optimal":
            notes.append(f"breaks: {timetable.breaks} (lower bound {timetable.break_bound}: "
                         f"{timetable.break_bound_reason}); not proven optimal within the time "
                         "limit of the joint model")
        season = season_from_timetable(league, fact, timetable, placement, tuple(notes))
        season = replace(season, notes=season.notes + silent_effect_notes(league, season))
        added = tuple(c.describe() for c in couplings if name in c.divisions)
        plans.append(DivisionPlan(name, league, season, compute_fairness(season), season.notes,
                                  added, seconds / len(unit.divisions)))
    return tuple(plans)


def _plan_sequentially(fed: Federation, unit: Unit, couplings: list[Coupling],
                       time_limit: float | None) -> UnitResult:
    """One division after another (the module docstring); :func:`plan_unit` sets the times."""
    from scheduler.errors import ConfigError
    from scheduler.fairness import compute_fairness
    from scheduler.plan import plan_season

    try:
        shares, _ = venue_shares(fed)
    except ConfigError as exc:
        return UnitResult(unit.key, (), f"{unit.key} cannot be planned one division after "
                          f"another: {exc}")
    planned: dict[str, DivisionPlan] = {}
    for name in unit.divisions:
        start = clock.perf_counter()
        league, added = adapt(fed.division(name).league, name, fed, couplings, shares, planned)
        try:
            result = plan_season(league, time_limit=time_limit)
        except InfeasibleError as exc:
            head = f"division {name!r} cannot be planned"
            if added:
                head += (" once the rules across divisions already planned in this unit ("
                         + ", ".join(planned) + ") are added")
            return UnitResult(unit.key, tuple(planned.values()), f"{head}: {exc}",
                              tuple(f"coupling: {a}" for a in added) + tuple(exc.conflicts))
        except SchedulerError as exc:
            return UnitResult(unit.key, tuple(planned.values()), f"division {name!r}: {exc}")
        fairness = compute_fairness(result.season)
        planned[name] = DivisionPlan(name, league, result.season, fairness, result.notes, added,
                                     clock.perf_counter() - start)
    return UnitResult(unit.key, tuple(planned.values()))

