"""Re-plan a season folder after what happened (postponements, closures, withdrawals, ...).

``replan_season`` reads the league file, the season folder's ``season.json`` and the events file
(:mod:`scheduler.config.events`), splits the planned games into history (on or before
``played_through``, never changed) and future (after it, plus the postponed games), applies the
withdrawals, hands the future to the minimal-change repair model
(:mod:`scheduler.balance.repair`) and builds the new :class:`~scheduler.season.Season` with its
revision history. ``write_replan`` writes the folder through the ordinary season writer plus
``changes.csv``. Fairness is measured over the season as it will now be played and compared with
the previous plan's figures. See docs/replanning.md.
"""

from __future__ import annotations

import hashlib
from collections import Counter
from dataclasses import dataclass, replace
from datetime import date, time
from pathlib import Path

from scheduler.balance.repair import (
    ForcedGame,
    RepairProblem,
    RepairResult,
    is_feasible,
    repair_season,
)
from scheduler.balance.solver import SolveLimits
from scheduler.config import League, load_league
from scheduler.config.events import Events, load_events
from scheduler.config.schema import suggestion
from scheduler.errors import InfeasibleError, InputError
from scheduler.export.changes import GameChange, team_counts
from scheduler.fairness import compute_fairness
from scheduler.fairness.model import FairnessReport
from scheduler.rules.rest_days import rest_days_between
from scheduler.season import Fixture, Revision, Season

SEASON_FILE = "season.json"

WATCHED = (
    # (figure, label, larger is worse)
    ("breaks_total", "breaks", True),
    ("home_run_max", "longest run of home games", True),
    ("away_run_max", "longest run of away games", True),
    ("rest_days_min", "fewest rest days", False),
    ("rest_mismatches", "games with unequal rest", True),
    ("home_gap_max", "largest home-count gap", True),
    ("separation_min", "fewest rounds between meetings", False),
    ("court_spread_max", "court spread", True),
    ("slot_spread_max", "slot spread", True),
    ("carry_over_value", "carry-over value", True),
)


@dataclass(frozen=True, slots=True)
class Worsened:
    """A fairness figure the change made worse.

    Parameters
    ----------
    label
        The figure in plain words (``"fewest rest days"``).
    before, after
        Its value in the previous plan and in the re-plan.
    team
        The team, or ``None`` for a league figure.
    """

    label: str
    before: float | int
    after: float | int
    team: str | None = None

    def __str__(self) -> str:
        who = f"{self.team}: " if self.team else ""
        return f"{who}{self.label} {self.before} -> {self.after}"


@dataclass(frozen=True)
class ReplanResult:
    """A re-planned season with what changed and how fair it is now.

    Parameters
    ----------
    season
        The new season (``previous`` itself when there was nothing to change).
    previous
        The season as last published.
    changes
        Each changed or cancelled game, in date order.
    repair
        The repair model's result (fewest changes, proof, second-stage goals).
    fairness
        Figures over the new season (written to season.json and the report).
    previous_fairness
        Figures over the previous plan.
    worsened
        Figures that got worse: breaks, runs, rest and balance in date order, carry-over and
        separation by round.
    events
        The events applied.
    played
        The figures in date order (:func:`played_order`): what the teams will live through.
    league
        The league re-planned.
    """

    season: Season
    previous: Season
    changes: tuple[GameChange, ...]
    repair: RepairResult
    fairness: FairnessReport
    previous_fairness: FairnessReport
    worsened: tuple[Worsened, ...]
    events: Events
    played: FairnessReport | None = None
    league: League | None = None

    @property
    def team_counts(self) -> list[tuple[str, int]]:
        """Changed games per team, most first (as in ``changes.csv``).

        Returns
        -------
        list of (str, int)
            Team name and its number of changed games.
        """
        return team_counts(self.changes)

    @property
    def nothing_to_change(self) -> bool:
        """Whether the events change no game: the season stands and nothing is written.

        Returns
        -------
        bool
            ``True`` when :attr:`changes` is empty (``season`` is then ``previous``).
        """
        return not self.changes


def played_order(season: Season) -> Season:
    """The season as it will be played: one round per match date, in date order (one round
    per kick-off when a team plays more than once on a day).

    A postponed game keeps its round number in the season (its identity in calendars and
    exports), but breaks, runs and rest are felt in date order; this view numbers the rounds
    by date so that :func:`scheduler.fairness.compute_fairness` measures them that way.

    Parameters
    ----------
    season
        Any dated season.

    Returns
    -------
    Season
        The same games (undated ones left out) with rounds numbered in date order, no byes.
    """
    dated = [f for f in season.fixtures if f.date is not None]
    per_day = Counter((team, f.date) for f in dated for team in f.teams)
    if per_day and max(per_day.values()) > 1:
        # several rounds on one match day: one round per kick-off
        keys = [(f.date, f.start.timestamp() if f.start else 0.0) for f in dated]
    else:
        keys = [(f.date, 0.0) for f in dated]
    rank = {key: i + 1 for i, key in enumerate(sorted(set(keys)))}
    fixtures = tuple(replace(f, round=rank[key]) for f, key in zip(dated, keys, strict=True))
    return replace(season, fixtures=fixtures, byes={})


def worsened_figures(before: FairnessReport, after: FairnessReport, *,
                     skip: tuple[str, ...] = (), teams: bool = True) -> tuple[Worsened, ...]:
    """The figures that got worse from ``before`` to ``after``.

    Parameters
    ----------
    before, after
        Fairness figures of the previous plan and of the re-plan.
    skip
        Names of league figures not to compare.
    teams
        Also compare each team's least rest and breaks.

    Returns
    -------
    tuple of Worsened
        League figures first, then per-team figures.
    """
    out: list[Worsened] = []
    for name, label, larger_is_worse in WATCHED:
        if name in skip:
            continue
        a, b = getattr(before, name), getattr(after, name)
        if a is None or b is None:
            continue
        if (b > a) if larger_is_worse else (b < a):
            out.append(Worsened(label, a, b))
    old_teams = {t.name: t for t in before.team_figures}
    for team in after.team_figures if teams else ():
        old = old_teams.get(team.name)
        if old is None:
            continue
        for name, label, larger_is_worse in (("breaks", "breaks", True),
                                             ("rest_days_min", "fewest rest days", False)):
            a, b = getattr(old, name, None), getattr(team, name, None)
            if a is None or b is None:
                continue
            if (b > a) if larger_is_worse else (b < a):
                out.append(Worsened(label, a, b, team.name))
    return tuple(out)


def _located(events: Events, where: str, message: str) -> InputError:
    return InputError(message, location=f"{events.source}: {where}" if events.source else where)


def _game(f: Fixture) -> str:
    return f"{f.home} v {f.away}" + (f" on {f.date.isoformat()}" if f.date else "")


def last_played_through(previous: Season) -> date | None:
    """The latest ``played_through`` of the season's earlier re-plans.

    Parameters
    ----------
    previous
        The season as last published.

    Returns
    -------
    date or None
        History up to it was published as played; ``None`` for a season never re-planned.
    """
    days = [r.played_through for r in previous.revisions if r.played_through is not None]
    return max(days) if days else None


def _applied_postponements(previous: Season, events: Events) -> set[int]:
    """Indices into ``events.postponed`` of entries an earlier re-plan already applied.

    Each re-plan records the games it re-placed (:attr:`Revision.postponed`). An entry with a
    date matches the record of that game on that planned date; an entry without a date then
    matches the earliest unused record of the same home and away team. Each record is used once.
    """
    records = [game for r in previous.revisions for game in r.postponed]
    used: set[int] = set()
    applied: set[int] = set()
    for dated in (True, False):
        for i, p in enumerate(events.postponed):
            if (p.date is not None) != dated:
                continue
            for k, (home, away, planned) in enumerate(records):
                if k not in used and (home, away) == (p.home, p.away) and (
                        p.date is None or p.date == planned):
                    used.add(k)
                    applied.add(i)
                    break
    return applied


def _find_postponed(old: Season, events: Events) -> set[int]:
    """Indices into ``old.fixtures`` of the games newly postponed by ``events``.

    Entries already applied by an earlier re-plan are skipped. A new postponement must name a
    game planned after the last re-plan's ``played_through`` and on or before this one.
    """
    pt = events.played_through
    before = last_played_through(old)
    applied = _applied_postponements(old, events)
    chosen: set[int] = set()
    for index, p in enumerate(events.postponed):
        if index in applied:
            continue
        same = [i for i, f in enumerate(old.fixtures) if (f.home, f.away) == (p.home, p.away)]
        if p.date is not None:
            same = [i for i in same if old.fixtures[i].date == p.date]
        past = [i for i in same if (day := old.fixtures[i].date) is not None and day <= pt]
        if not same:
            reverse = [f for f in old.fixtures if (f.home, f.away) == (p.away, p.home)]
            hint = (f"; did you mean {p.away} v {p.home}"
                    + (f" on {reverse[0].date.isoformat()}" if reverse[0].date else "") + "?"
                    ) if reverse else ""
            when = f" on {p.date.isoformat()}" if p.date else ""
            raise _located(events, p.where,
                           f"{p.home} v {p.away}{when} is not a game of the plan{hint}")
        if not past:
            dates = ", ".join(_game(old.fixtures[i]) for i in same)
            raise _located(events, p.where,
                           f"{p.home} v {p.away} is planned after played_through "
                           f"{pt.isoformat()} ({dates}); only a game that should already have "
                           "been played can be postponed")
        if before is not None:
            played = [i for i in past if old.fixtures[i].date <= before]  # type: ignore[operator]
            past = [i for i in past if i not in played]
            if not past:
                raise _located(events, p.where,
                               f"{_game(old.fixtures[played[0]])} is history: the season "
                               f"folder was re-planned with played_through "
                               f"{before.isoformat()}, so this game was published as played "
                               "and cannot be postponed now")
        if len(past) > 1:
            dates = ", ".join(old.fixtures[i].date.isoformat() for i in past)  # type: ignore[union-attr]
            raise _located(events, p.where,
                           f"{p.home} v {p.away} was planned more than once by then ({dates}); "
                           "give its date")
        if past[0] in chosen:
            raise _located(events, p.where, f"{_game(old.fixtures[past[0]])} is listed twice")
        chosen.add(past[0])
    return chosen


def _check_moved_history(old: Season, events: Events) -> None:
    """A hand-moved game dated on or before ``played_through`` is history: it must be in the
    season as given (a move applied by an earlier re-plan), or lie before the last re-plan's
    ``played_through`` (published as history then; it may have been postponed since)."""
    pt, before = events.played_through, last_played_through(old)
    for m in events.moved:
        if m.date > pt:
            continue
        if any(f.pair == frozenset((m.home, m.away)) and f.date == m.date
               and f.start is not None and f.start.time() == m.start
               and (m.court is None or f.court == m.court) for f in old.fixtures):
            continue
        if before is not None and m.date <= before:
            continue
        raise _located(events, f"{m.where}.date",
                       f"{m.date.isoformat()} is on or before played_through {pt.isoformat()}, "
                       f"but the season has no game {m.home} v {m.away} there at "
                       f"{m.start.strftime('%H:%M')}; history cannot be changed")


def _find_moved(future: list[Fixture], events: Events) -> dict[int, ForcedGame]:
    forced: dict[int, ForcedGame] = {}
    for m in events.moved:
        if m.date <= events.played_through:
            continue  # history (checked by _check_moved_history)
        same = [i for i, f in enumerate(future) if f.pair == frozenset((m.home, m.away))]
        there = [i for i in same if future[i].date == m.date and future[i].start is not None
                 and future[i].start.time() == m.start]  # type: ignore[union-attr]
        if len(there) == 1:
            same = there  # moved there by an earlier re-plan of the same events file
        elif m.planned_date is not None:
            same = [i for i in same if future[i].date == m.planned_date]
        if not same:
            names = [_game(f) for f in future]
            hint = suggestion(f"{m.home} v {m.away}", names)
            raise _located(events, m.where,
                           f"{m.home} v {m.away} is not a game still to be played{hint}")
        if len(same) > 1:
            dates = ", ".join(_game(future[i]) for i in same)
            raise _located(events, m.where,
                           f"{m.home} and {m.away} meet more than once after played_through "
                           f"({dates}); give the planned date as `from`")
        if same[0] in forced:
            raise _located(events, m.where, f"{_game(future[same[0]])} is moved twice")
        forced[same[0]] = ForcedGame(m.date, m.home, m.away, m.start, m.court)
    return forced


def _check_moved(league: League, events: Events, history: list[Fixture],
                 future: list[Fixture], forced: dict[int, ForcedGame]) -> None:
    """Hard rules a hand-moved game must keep on its own (the solver checks the rest)."""
    rules = league.rules
    unavailable = {(td.team, d) for td in rules.unavailable for d in td.dates}
    unavailable |= {(u.team, d) for u in events.unavailable for d in u.dates}
    no_home = {(td.team, d) for td in rules.no_home_games for d in td.dates}
    last: dict[str, date] = {}
    for f in history:
        for team in f.teams:
            if f.date is not None and (team not in last or f.date > last[team]):
                last[team] = f.date
    by_where = {m.home + "\x1f" + m.away: m.where for m in events.moved}
    seen: dict[tuple[str, date, time | None], str] = {}
    hosting: dict[tuple[object, ...], str] = {}
    groups = league.shared_ground_groups
    for _i, game in sorted(forced.items()):
        where = by_where.get(game.home + "\x1f" + game.away, "moved")
        venue_of_home = league.team(game.home).home_venue
        place = (venue_of_home, game.court, game.date, game.start)
        if league.format.home_meaning == "venue" and venue_of_home and place in hosting:
            raise _located(events, where, f"{venue_of_home} {game.court or ''} is already used on "
                           f"{game.date.isoformat()} at {game.start.strftime('%H:%M')} by "
                           f"{hosting[place]}")
        hosting[place] = where
        for group in groups:
            if game.home in group:
                key = ("shared", group, game.date)
                if key in hosting:
                    raise _located(events, where, f"shared ground: {game.home} cannot be at "
                                   f"home on {game.date.isoformat()}, another team of "
                                   f"{', '.join(group)} is ({hosting[key]})")
                hosting[key] = where
        for team in (game.home, game.away):
            if (team, game.date) in unavailable:
                raise _located(events, where, f"{team} is unavailable on "
                               f"{game.date.isoformat()}; the hand-moved game breaks that rule")
            sitting = (team, game.date,
                       game.start if league.calendar.rounds_per_day > 1 else None)
            if sitting in seen:
                when = game.date.isoformat() + (
                    f" at {game.start.strftime('%H:%M')}" if sitting[2] is not None else "")
                raise _located(events, where, f"{team} would play twice on {when} (also in "
                               f"{seen[sitting]})")
            seen[sitting] = where
            rest = rules.min_rest_days
            if (rest is not None and team in last
                    and rest_days_between(last[team], game.date) < rest):
                raise _located(events, where, f"{team} last played on {last[team].isoformat()}; "
                               f"{game.date.isoformat()} leaves fewer than {rest} days of rest "
                               "(rules.min_rest_days)")
        if (game.home, game.date) in no_home:
            raise _located(events, where, f"{game.home} cannot play at home on "
                           f"{game.date.isoformat()} (rules.no_home_games)")
        venue = league.team(game.home).home_venue
        for c in events.closed:
            if game.date in c.dates and venue == c.venue and (
                    not c.courts or game.court in c.courts or game.court is None):
                raise _located(events, where, f"{c.venue} is closed on {game.date.isoformat()} "
                               f"({c.where})")


def _blame_moved(problem: RepairProblem, events: Events, limits: SolveLimits) -> None:
    """When no re-plan exists but one would without the hand-moved games, name the first
    hand-moved game that cannot be kept (an InputError located in the events file)."""
    if not problem.forced:
        return
    small = SolveLimits(min(limits.deterministic, 5.0), min(limits.wall, 30.0), limits.seed)
    if not is_feasible(replace(problem, forced={}), small):
        return
    for index, game in sorted(problem.forced.items()):
        if not is_feasible(replace(problem, forced={index: game}), small):
            where = next((m.where for m in events.moved
                          if (m.home, m.away, m.date) == (game.home, game.away, game.date)),
                         "moved")
            raise _located(events, where,
                           f"{game.home} v {game.away} on {game.date.isoformat()} at "
                           f"{game.start.strftime('%H:%M')} breaks a rule of the league "
                           "(rest, runs of home or away games, shared ground or a court "
                           "already in use); without it the season can be re-planned")
    raise _located(events, "moved", "the hand-moved games together break a rule of the league; "
                   "without them the season can be re-planned")


def new_revision(previous: Season, events: Events) -> str:
    """The id of the revision made from ``previous`` and ``events``.

    Parameters
    ----------
    previous
        The season as last published.
    events
        The events applied.

    Returns
    -------
    str
        12 hex digits of the sha256 of the previous revision and the events' repr.
    """
    text = previous.revision + "|" + repr(replace(events, source=None))
    return hashlib.sha256(text.encode("utf-8")).hexdigest()[:12]


def _sort(league: League, fixtures: list[Fixture]) -> tuple[Fixture, ...]:
    """The planner's order: round, kick-off, venue, court, home team."""
    venue_rank: dict[str | None, int] = {v.name: i for i, v in enumerate(league.venues)}

    def court_rank(f: Fixture) -> int:
        if f.venue is None or f.venue not in venue_rank:
            return 0
        courts = list(league.venue(f.venue).courts)
        return courts.index(f.court) if f.court in courts else len(courts)

    return tuple(sorted(fixtures, key=lambda f: (
        f.round, f.start.timestamp() if f.start else 0, venue_rank.get(f.venue, -1),
        court_rank(f), f.home)))


def replan_season(league: League, previous: Season, events: Events, *,
                  time_limit: float | None = None) -> ReplanResult:
    """Re-plan ``previous`` after ``events`` with the fewest changes.

    Parameters
    ----------
    league
        The league (its rules and calendar hold for the re-plan too).
    previous
        The season as last published (``season.json`` of the folder).
    events
        What happened (:func:`scheduler.config.events.load_events`).
    time_limit
        Deterministic solver time in seconds (default ``league.solve_seconds``).

    Returns
    -------
    ReplanResult
        The new season, the changed games, the proof status and the fairness comparison.

    Raises
    ------
    InputError
        Events that do not fit the season (another season, an unknown or future game
        postponed, a hand-moved game that breaks a rule), located in the events file.
    InfeasibleError
        When no re-plan keeps every rule (the clash and relaxations that would help).

    Examples
    --------
    >>> result = replan_season(league, previous, events)  # doctest: +SKIP
    >>> result.repair.changed, result.repair.proven        # doctest: +SKIP
    (4, True)

    References
    ----------
    docs/replanning.md; RFC 5545 §3.8.7.4 and §3.8.1.11 for the calendars written afterwards.
    """
    where = events.source or "events"
    if (events.league, events.season) != (previous.league, previous.season_id):
        raise InputError(
            f"the events file is for {events.league!r} season {events.season!r}, but the season "
            f"folder holds {previous.league!r} season {previous.season_id!r}",
            location=f"{where}: league")
    if (league.name, league.season) != (previous.league, previous.season_id):
        raise InputError(
            f"the league file is {league.name!r} season {league.season!r}, but the season folder "
            f"holds {previous.league!r} season {previous.season_id!r}", location=league.source)
    dates = [f.date for f in previous.fixtures if f.date is not None]
    if dates and events.played_through >= max(dates):
        raise InputError(
            f"played_through {events.played_through.isoformat()} is on or after the last game "
            f"of the season ({max(dates).isoformat()}); nothing is left to re-plan",
            location=f"{where}: played_through")
    pt = events.played_through
    before = last_played_through(previous)
    if before is not None and pt < before:
        raise InputError(
            f"played_through {pt.isoformat()} is before {before.isoformat()}, the "
            "played_through of the season folder's last re-plan; games published as played "
            "cannot become unplayed (keep played_through or move it forward)",
            location=f"{where}: played_through")
    postponed_at = _find_postponed(previous, events)
    _check_moved_history(previous, events)
    void = {w.team for w in events.withdrawn if w.policy == "void_all"}
    out = {w.team for w in events.withdrawn}
    history: list[Fixture] = []
    future: list[Fixture] = []
    postponed: set[int] = set()
    cancelled: list[Fixture] = []
    for i, f in enumerate(previous.fixtures):
        past = f.date is not None and f.date <= pt and i not in postponed_at
        if past:
            if void & set(f.teams):
                cancelled.append(f)
            else:
                history.append(f)
            continue
        if out & set(f.teams):
            cancelled.append(f)
            continue
        if i in postponed_at:
            postponed.add(len(future))
        future.append(f)
    forced = _find_moved(future, events)
    _check_moved(league, events, history, future, forced)
    problem = RepairProblem(
        league=league, played_through=pt, history=tuple(history), future=tuple(future),
        postponed=frozenset(postponed), forced=forced,
        unavailable=tuple((u.team, d) for u in events.unavailable for d in u.dates),
        closed=tuple((c.venue, court, d) for c in events.closed for d in c.dates
                     for court in (c.courts or (None,))),
    )
    total = float(time_limit if time_limit is not None else league.solve_seconds)
    limits = SolveLimits(max(1.0, total), 4 * max(1.0, total) + 20, league.seed)
    try:
        result = repair_season(problem, limits)
    except InfeasibleError:
        _blame_moved(problem, events, limits)
        raise
    changes = [GameChange(old, new) for old, new in zip(future, result.fixtures, strict=True)
               if old != new]
    changes += [GameChange(f, None) for f in cancelled]
    changes.sort(key=lambda c: ((c.new or c.old).date or date.min, c.old.round, c.old.home))
    before_fairness = compute_fairness(previous)
    if not changes:
        # nothing new in the events (or nothing that needs a change): the published season
        # stands as it is, and nothing is written (docs/replanning.md, "A season lived week
        # by week")
        played_now = compute_fairness(played_order(previous))
        return ReplanResult(previous, previous, (), result, before_fairness, before_fairness,
                            (), events, played_now, league)
    revision = new_revision(previous, events)
    re_placed: tuple[tuple[str, str, date], ...] = tuple(
        (f.home, f.away, f.date) for i in sorted(postponed_at)
        if (f := previous.fixtures[i]).date is not None)
    earlier = previous.revisions or (Revision(previous.revision, None, 0, "first plan"),)
    summary = (f"re-planned after {pt.isoformat()}: {len(changes)} game(s) changed"
               + (" (fewest possible, proven)" if result.proven
                  else f" (at least {result.bound} needed; not proven fewest)"))
    # a withdrawn team stays in the team list, so that its own calendar feed is written once
    # more and shows its games as cancelled
    season = replace(
        previous,
        fixtures=_sort(league, history + list(result.fixtures)),
        revision=revision,
        revisions=(*earlier, Revision(revision, pt, len(changes), summary, re_placed)),
        notes=(*previous.notes, summary, *result.notes),
    )
    fairness = compute_fairness(season)
    played, played_before = (compute_fairness(played_order(s)) for s in (season, previous))
    worse = worsened_figures(played_before, played,
                             skip=("carry_over_value", "separation_min"))
    worse += worsened_figures(before_fairness, fairness, skip=tuple(
        name for name, *_ in WATCHED if name not in ("carry_over_value", "separation_min")),
        teams=False)
    return ReplanResult(season, previous, tuple(changes), result, fairness, before_fairness,
                        worse, events, played, league)


def load_replan(league_path: str | Path, season_dir: str | Path, events_path: str | Path, *,
                time_limit: float | None = None) -> ReplanResult:
    """Read the three inputs and :func:`replan_season` (nothing is written).

    Parameters
    ----------
    league_path
        The league file.
    season_dir
        The season folder written by the first plan (its ``season.json`` is read).
    events_path
        The events file (results played, postponements, hand-moved games).
    time_limit
        Overrides the league's solver seconds.

    Returns
    -------
    ReplanResult
        As :func:`replan_season`.

    Raises
    ------
    ConfigError
        For a league or events file with problems (each located).
    InputError
        When the folder holds no ``season.json``, or for an unreadable one, or events that do
        not fit the season.
    InfeasibleError
        When no re-plan keeps every rule.

    References
    ----------
    ``docs/replanning.md``.

    Examples
    --------
    >>> result = load_replan("sample_leagues/county_double.toml", "out/county",
    ...                      "sample_leagues/county_double.events.toml")  # doctest: +SKIP
    >>> len(result.changes) > 0  # doctest: +SKIP
    True
    """
    from scheduler.export.season_json import load_season_json

    league = load_league(league_path)
    season_file = Path(season_dir) / SEASON_FILE
    if not season_file.is_file():
        raise InputError(f"no {SEASON_FILE} in the season folder; plan the season first",
                         location=str(season_dir))
    previous = load_season_json(season_file)
    events = load_events(events_path, league)
    return replan_season(league, previous, events, time_limit=time_limit)


def write_replan(result: ReplanResult, season_dir: str | Path, *, league: League,
                 config_path: str | Path | None = None) -> list[Path]:
    """Write the re-planned season into ``season_dir`` (the folder it came from), its
    ``changes.csv`` and the report's list of changes included, as one unit (the previous
    season stays whole until the new one is swapped in). Returns the paths written; when the
    events change nothing (:attr:`ReplanResult.nothing_to_change`) nothing is written and the
    folder stays byte-identical.

    Parameters
    ----------
    result
        The re-plan (:func:`replan_season` or :func:`load_replan`).
    season_dir
        The season folder the previous season came from.
    league
        The league (length of the games in the calendars, labels of the sides).
    config_path
        The user's league file, which is never overwritten.

    Returns
    -------
    list of Path
        The paths written (:func:`scheduler.export.write_season_outputs`); empty when there
        was nothing to change.

    Raises
    ------
    OutputError
        For a folder that may not be written or a write that failed; the previous season is
        then left as it was.

    References
    ----------
    ``docs/replanning.md``; ``docs/season-folder.md``.

    Examples
    --------
    >>> write_replan(result, "out/county", league=result.league)  # doctest: +SKIP
    [...]
    """
    from scheduler.export import write_season_outputs

    if result.nothing_to_change:
        return []
    return write_season_outputs(
        result.season, result.fairness, season_dir, config_path=config_path,
        game_minutes=league.calendar.game_minutes, side_labels=league.format.grid_labels,
        changes=tuple(result.changes))
