"""Minimality against exhaustive enumeration on a tiny league.

CP-SAT's OPTIMAL claim (the fewest changed games) is checked by trying every placement of the
future games (each on any remaining Saturday, either side at home) with plain Python, keeping the
valid ones (one game per team and day, runs of at most two home or away games in date order
continued from history, the unavailable day) and taking the fewest games that differ from the
old plan in date or home side. The definition of a change is the minimal perturbation one
(Barták, Müller & Rudová 2004, from memory; docs/replanning.md).
"""

from __future__ import annotations

import itertools
from datetime import date

from scheduler.config import parse_league
from scheduler.config.events import parse_events
from scheduler.plan import plan_season
from scheduler.replan import replan_season

TEAMS = ["Ashwick", "Brindle", "Cobham Vale", "Dunlin"]


def tiny_league():
    return parse_league({
        "league": {"name": "Tiny Test League", "season": "2031", "timezone": "Europe/London",
                   "seed": 1, "solve_seconds": 2},
        "format": {"legs": 1},
        "calendar": {"start": date(2031, 3, 1), "end": date(2031, 3, 29), "weekdays": ["sat"],
                     "kickoff": "14:00"},
        "venues": [{"name": f"{t} Ground"} for t in TEAMS],
        "teams": [{"name": t, "home_venue": f"{t} Ground"} for t in TEAMS],
        "rules": {"max_home_run": 2, "max_away_run": 2},
    })


def brute_force_minimum(previous, pt, postponed, unavailable) -> int:
    history = [f for f in previous.fixtures if f.date <= pt and f is not postponed]
    future = [f for f in previous.fixtures if f.date > pt or f is postponed]
    days = [date(2031, 3, d) for d in (8, 15, 22, 29)]
    best = None
    choices = [(day, swap) for day in days for swap in (False, True)]
    for combo in itertools.product(choices, repeat=len(future)):
        placed = []
        ok = True
        busy = set()
        for f, (day, swap) in zip(future, combo, strict=True):
            home, away = (f.away, f.home) if swap else (f.home, f.away)
            if (home, day) in busy or (away, day) in busy or {(home, day), (away, day)} & \
                    unavailable:
                ok = False
                break
            busy |= {(home, day), (away, day)}
            placed.append((day, home, away))
        if not ok:
            continue
        for team in TEAMS:
            sides = [h == team for d, h, a in sorted(
                [(f.date, f.home, f.away) for f in history] + placed) if team in (h, a)]
            if any(sides[i] == sides[i + 1] == sides[i + 2] for i in range(len(sides) - 2)):
                ok = False
                break
        if not ok:
            continue
        changed = sum((day, home) != (f.date, f.home)
                      for f, (day, home, _) in zip(future, placed, strict=True))
        best = changed if best is None else min(best, changed)
    return best


def test_fewest_changes_equal_exhaustive_search():
    league = tiny_league()
    previous = plan_season(league).season
    pt = date(2031, 3, 1)
    postponed = next(f for f in previous.fixtures if f.date == pt)
    other = next(t for t in TEAMS if t not in postponed.teams)
    unavailable = {(other, date(2031, 3, 8))}
    events = parse_events({
        "league": league.name, "season": league.season, "played_through": pt,
        "postponed": [{"home": postponed.home, "away": postponed.away}],
        "unavailable": [{"team": other, "dates": [date(2031, 3, 8)]}],
    }, league)
    result = replan_season(league, previous, events, time_limit=5)
    expected = brute_force_minimum(previous, pt, postponed, unavailable)
    assert result.repair.proven
    assert result.repair.changed == expected
    assert expected >= 2  # the postponed game and the game of the unavailable team
