"""The second stage follows the documented order of goals, checked by exhaustive enumeration.

With the fewest changed games fixed, several re-plans remain; they differ in how many moved
games land off a reserve date, in how many games get the other team at home, in the least rest
of the re-planned games and in breaks. Plain Python tries every re-plan that changes at most k
games, for k = 0, 1, 2, ... until some are valid: each changed game on any other remaining
Saturday or reserve date, either side at home. Valid means one game per team and day, at least
two days of rest, runs of at most two home or away games in date order. It sorts them by the key
of docs/replanning.md ("The second stage"): changed games, moved games off the reserve dates,
games with the other side at home, least rest (larger is better), breaks (when
``priorities.breaks`` > 0). The re-plan must reach the first key, and its figures, recounted here
from the new season, must be that key. Definitions: a change is the minimal perturbation one
(Barták, Müller & Rudová 2004, from memory); a break is two consecutive games of a team with the
same side (de Werra 1981, from memory); rest is the number of days without a game between two
games of a team (docs/replanning.md).
"""

from __future__ import annotations

import itertools
from datetime import date, timedelta

from scheduler.config import parse_league
from scheduler.config.events import parse_events
from scheduler.plan import plan_season
from scheduler.replan import replan_season

TEAMS = ["Ashwick", "Brindle", "Cobham Vale", "Dunlin", "Elmstead", "Furze Hill"]
CAP = 14  # the rest goal counts up to two weeks (docs/replanning.md)
PLAYED_THROUGH = date(2031, 3, 1)


def league(reserve, breaks_weight=3, end=date(2031, 3, 29)):
    return parse_league({
        "league": {"name": "Tiny Test League", "season": "2031", "timezone": "Europe/London",
                   "seed": 1, "solve_seconds": 2},
        "format": {"legs": 1},
        "calendar": {"start": date(2031, 3, 1), "end": end, "weekdays": ["sat"],
                     "kickoff": "14:00", "reserve_dates": reserve},
        "venues": [{"name": f"{t} Ground"} for t in TEAMS],
        "teams": [{"name": t, "home_venue": f"{t} Ground"} for t in TEAMS],
        "rules": {"max_home_run": 2, "max_away_run": 2, "min_rest_days": 2},
        "priorities": {"breaks": breaks_weight},
    })


def sequences(history, placed):
    """Per team, its games in date order: (date, at home, re-planned part)."""
    out = {}
    for team in TEAMS:
        out[team] = sorted([(f.date, f.home == team, False) for f in history if team in f.teams]
                           + [(day, home == team, True) for _, day, home, away in placed
                              if team in (home, away)])
    return out


def figures(history, placed, reserve):
    """(off reserve, other side at home, least rest, breaks) of ``placed`` = [(old game, day,
    home, away)], counted in date order with history as the start."""
    moved = [(old, day, home) for old, day, home, _ in placed if (day, home) != (old.date,
                                                                                old.home)]
    off_reserve = sum(day != old.date and day not in reserve for old, day, _ in moved)
    swapped = sum(home != old.home for old, _, home in moved)
    least, breaks = CAP, 0
    for games in sequences(history, placed).values():
        for (d1, side1, _), (d2, side2, future) in itertools.pairwise(games):
            if future:
                least = min(least, (d2 - d1).days - 1)
                breaks += side1 == side2
    return off_reserve, swapped, least, breaks


def valid(history, placed) -> bool:
    busy = set()
    for _, day, home, away in placed:
        if day <= PLAYED_THROUGH or {(home, day), (away, day)} & busy:
            return False
        busy |= {(home, day), (away, day)}
    for games in sequences(history, placed).values():
        if any((b[0] - a[0]).days - 1 < 2 for a, b in itertools.pairwise(games)):
            return False
        sides = [side for _, side, _ in games]
        if any(sides[i] == sides[i + 1] == sides[i + 2] for i in range(len(sides) - 2)):
            return False
    return True


def brute_force(previous, postponed, reserve, use_breaks, end):
    """Every key of the valid re-plans with the fewest changes (exhaustive over at most k
    changed games, k growing from 0)."""
    history = [f for f in previous.fixtures if f.date <= PLAYED_THROUGH and f is not postponed]
    future = [f for f in previous.fixtures if f.date > PLAYED_THROUGH or f is postponed]
    saturdays = {PLAYED_THROUGH + timedelta(weeks=w) for w in range(1, 10)}
    days = sorted({d for d in saturdays if d <= end} | set(reserve))
    for k in range(len(future) + 1):
        keys = []
        for chosen in itertools.combinations(range(len(future)), k):
            options = [[(day, swap) for day in days for swap in (False, True)
                        if (day, swap) != (future[g].date, False)] for g in chosen]
            for combo in itertools.product(*options):
                where = dict(zip(chosen, combo, strict=True))
                placed = []
                for g, f in enumerate(future):
                    day, swap = where.get(g, (f.date, False))
                    placed.append((f, day, *((f.away, f.home) if swap else (f.home, f.away))))
                if valid(history, placed):
                    off, swapped, least, breaks = figures(history, placed, reserve)
                    keys.append((k, off, swapped, -least, breaks if use_breaks else 0))
        if keys:
            return keys
    raise AssertionError("no valid re-plan")


def run(reserve, breaks_weight=3, end=date(2031, 3, 29)):
    lg = league(reserve, breaks_weight, end)
    previous = plan_season(lg).season
    postponed = next(f for f in previous.fixtures if f.date == PLAYED_THROUGH)
    events = parse_events({"league": lg.name, "season": lg.season,
                           "played_through": PLAYED_THROUGH,
                           "postponed": [{"home": postponed.home, "away": postponed.away}]}, lg)
    result = replan_season(lg, previous, events, time_limit=5)
    keys = brute_force(previous, postponed, set(reserve), breaks_weight > 0, end)
    history = [f for f in previous.fixtures if f.date <= PLAYED_THROUGH and f is not postponed]
    old_of = {(f.pair, f.round): f for f in previous.fixtures}
    placed = [(old_of[(f.pair, f.round)], f.date, f.home, f.away)
              for f in result.season.fixtures if f not in history]
    return result, keys, figures(history, placed, set(reserve))


def check_lexicographic(result, keys, found):
    off, swapped, least, breaks = found
    best = min(keys)
    assert result.repair.proven and result.repair.changed == best[0]
    assert (off, swapped, -least, breaks if best[4] else 0) == best[1:]
    shown = {goal.name: goal.value for goal in result.repair.goals}
    assert (shown["reserve"], shown["home_side"], shown["rest"]) == (off, swapped, least)
    return best, {key for key in keys if key[0] == best[0]}


def test_rest_decides_between_two_reserve_dates():
    """A midweek reserve date (two or three days of rest) and a Saturday after the season
    (six or more): the same number of changes and reserve dates; the longer rest wins."""
    result, keys, found = run([date(2031, 3, 12), date(2031, 4, 5)], end=date(2031, 4, 5))
    best, tied = check_lexicographic(result, keys, found)
    assert any(key[:3] == best[:3] and key[3] > best[3] for key in tied)  # shorter rest lost
    assert found[2] >= 6


def test_breaks_decide_between_two_midweek_reserve_dates():
    """Two midweek reserve dates with the same rest: the one with fewer breaks wins."""
    result, keys, found = run([date(2031, 3, 5), date(2031, 3, 19)])
    best, tied = check_lexicographic(result, keys, found)
    assert {goal.name: goal.value for goal in result.repair.goals}["breaks"] >= 0
    assert any(key[:4] == best[:4] and key[4] > best[4] for key in tied)  # more breaks lost


def test_breaks_left_out_when_the_league_gives_them_no_weight():
    result, keys, found = run([date(2031, 3, 5), date(2031, 3, 19)], breaks_weight=0)
    best = min(keys)
    assert (result.repair.changed, found[0], found[1], -found[2]) == best[:4]
    assert "breaks" not in {goal.name for goal in result.repair.goals}


def test_kick_off_time_balance_decides_the_slot():
    """One court, three kick-off times, every Tuesday full: a postponed game can only go to the
    reserve Tuesday, at one of three times. Each team's kick-off time spread (its most-used
    minus its least-used time over the season; the fairness figures' definition) is counted here
    for every choice; the re-plan must take the choice with the smallest largest spread, and
    the choices must differ in it."""
    names = TEAMS
    lg = parse_league({
        "league": {"name": "Evening Test League", "season": "2031",
                   "timezone": "Europe/London", "seed": 1, "solve_seconds": 2},
        "format": {"legs": 1, "home_meaning": "side"},
        "calendar": {"start": date(2031, 3, 4), "end": date(2031, 4, 8), "weekdays": ["tue"],
                     "kickoff": "18:00", "game_minutes": 70,
                     "reserve_dates": [date(2031, 4, 8)]},
        "venues": [{"name": "Fen Hall", "courts": ["Court"],
                    "slots": ["18:00", "19:15", "20:30"]}],
        "teams": [{"name": t} for t in names],
        "priorities": {"slot_balance": 2, "breaks": 3},
    })
    previous = plan_season(lg).season
    first = date(2031, 3, 4)
    postponed = next(f for f in previous.fixtures if f.date == first)
    events = parse_events({"league": lg.name, "season": lg.season, "played_through": first,
                           "postponed": [{"home": postponed.home, "away": postponed.away}]},
                          lg)
    result = replan_season(lg, previous, events, time_limit=5)

    def largest_spread(games):
        counts = {t: {clock: 0 for clock in ("18:00", "19:15", "20:30")} for t in names}
        for _, clock, home, away in games:
            counts[home][clock] += 1
            counts[away][clock] += 1
        return max(max(c.values()) - min(c.values()) for c in counts.values())

    others = [(f.date, f.start.strftime("%H:%M"), f.home, f.away) for f in previous.fixtures
              if f is not postponed]
    spreads = {clock: largest_spread([*others, (date(2031, 4, 8), clock, postponed.home,
                                                postponed.away)])
               for clock in ("18:00", "19:15", "20:30")}
    moved = next(f for f in result.season.fixtures if f.pair == postponed.pair)
    assert moved.date == date(2031, 4, 8) and moved.home == postponed.home
    assert result.repair.changed == 1
    assert spreads[moved.start.strftime("%H:%M")] == min(spreads.values())
    assert len(set(spreads.values())) > 1  # the kick-off time mattered
    shown = {goal.name: goal.value for goal in result.repair.goals}
    assert shown["slot_balance"] == min(spreads.values())
    # the same figure as the fairness module's kick-off time spread of the new season
    assert result.fairness.slot_spread_max == shown["slot_balance"]
