"""Plan one unit of work: its divisions one after another with the single-league planner.

The divisions of a unit are planned in file order with
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
from scheduler.divisions.grouping import Coupling, Unit, couplings_of, venue_shares
from scheduler.errors import InfeasibleError, SchedulerError
from scheduler.season import Season

if TYPE_CHECKING:
    from scheduler.fairness.model import FairnessReport


@dataclass(frozen=True)
class DivisionPlan:
    """A planned division: its league as planned (with the coupling rules added), the season,
    the fairness figures, the planner's notes and the couplings that added rules."""

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
    otherwise idle core)."""

    key: str
    plans: tuple[DivisionPlan, ...] = ()
    error: str | None = None
    conflicts: tuple[str, ...] = field(default_factory=tuple)
    seconds: float = 0.0
    cpu_seconds: float = 0.0


def _merge(entries: Iterable[TeamDates], extra: dict[str, set[date]]) -> tuple[TeamDates, ...]:
    dates: dict[str, set[date]] = {}
    for e in entries:
        dates.setdefault(e.team, set()).update(e.dates)
    for team, days in extra.items():
        dates.setdefault(team, set()).update(days)
    return tuple(TeamDates(team, tuple(sorted(days))) for team, days in dates.items() if days)


def possible_windows(league: League) -> list[tuple[int, int]]:
    """Minute-of-day intervals ``[start, end)`` in which ``league`` may play a game.

    From the slots of its venues (or the calendar's kick-off, and the later rounds of one day
    when several rounds share it) and its ``game_minutes``.
    """
    cal = league.calendar
    minutes = cal.game_minutes
    per_day = max(1, cal.rounds_per_day)
    starts: set[int] = set()
    for venue in league.venues:
        if venue.slots:
            starts.update(s.hour * 60 + s.minute for s in venue.slots)
    base = cal.kickoff.hour * 60 + cal.kickoff.minute
    if not starts or any(not v.slots for v in league.venues) or not league.venues:
        starts.update(base + j * minutes for j in range(per_day))
    return sorted((s, s + minutes) for s in starts)


def _busy(start: datetime | None, day: date | None, minutes: int) -> tuple[date, int, int] | None:
    if start is not None:
        local = start
        first = local.hour * 60 + local.minute
        return (local.date(), first, first + minutes)
    if day is not None:
        return (day, 0, 24 * 60)
    return None


def _overlaps(window: tuple[int, int], busy: tuple[int, int]) -> bool:
    return window[0] < busy[1] and busy[0] < window[1]


def adapt(league: League, name: str, fed: Federation, couplings: list[Coupling],
          shares: dict, planned: dict[str, DivisionPlan]) -> tuple[League, tuple[str, ...]]:
    """``league`` with the couplings to the ``planned`` divisions turned into its own rules.

    Returns the league and the descriptions of the couplings that added something.
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
                    if any(_overlaps(w, (a, b)) for w in windows)}
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


def plan_unit(fed: Federation, unit: Unit, time_limit: float | None = None) -> UnitResult:
    """Plan the divisions of ``unit`` in order (see the module docstring).

    Parameters
    ----------
    fed
        The federation.
    unit
        The unit of work (from :func:`scheduler.divisions.grouping.units_of`).
    time_limit
        Solver seconds per division (default: each division's ``solve_seconds``).

    Returns
    -------
    UnitResult
        The plans, or the error message and conflicts of the first division that failed. Never
        raises for rules that cannot hold, so the result travels back from a worker intact.
    """
    from scheduler.fairness import compute_fairness
    from scheduler.plan import plan_season

    began = clock.perf_counter()
    cpu_began = clock.process_time()
    couplings = couplings_of(fed)
    shares, _ = venue_shares(fed)
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
                              tuple(f"coupling: {a}" for a in added) + tuple(exc.conflicts),
                              clock.perf_counter() - began, clock.process_time() - cpu_began)
        except SchedulerError as exc:
            return UnitResult(unit.key, tuple(planned.values()), f"division {name!r}: {exc}",
                              (), clock.perf_counter() - began, clock.process_time() - cpu_began)
        fairness = compute_fairness(result.season)
        planned[name] = DivisionPlan(name, league, result.season, fairness, result.notes, added,
                                     clock.perf_counter() - start)
    return UnitResult(unit.key, tuple(planned.values()), None, (), clock.perf_counter() - began,
                      clock.process_time() - cpu_began)

