"""The league's hard rules computed from their definitions, as plain code on the fixtures.

Written independently of ``scheduler.rules`` (the balancer's brief and ``docs/rules.md`` define
each rule; this code reads them literally and is kept deliberately naive). ``broken(league,
season)`` returns, per rule key of ``scheduler.rules``, the set of teams (or pairs, venues)
that break it, so that ``tests/rules/test_cross_check.py`` can compare the two.
"""

from __future__ import annotations

import itertools
from collections import Counter, defaultdict

from scheduler.config.model import League
from scheduler.season import Season


def _sequence(season: Season, team: str):
    return sorted((f for f in season.fixtures if team in (f.home, f.away)), key=lambda f: f.round)


def broken(league: League, season: Season) -> dict[str, set[str]]:
    """Who breaks each rule (empty set: kept)."""
    r = league.rules
    out: dict[str, set[str]] = defaultdict(set)
    rounds = max(f.round for f in season.fixtures)
    for td in r.unavailable:
        for f in season.fixtures:
            if td.team in (f.home, f.away) and f.date in td.dates:
                out["unavailable_days"].add(td.team)
    for td in r.no_home_games:
        for f in season.fixtures:
            if f.home == td.team and f.date in td.dates:
                out["no_home_days"].add(td.team)
    for grp in league.shared_ground_groups:
        by_day: dict = defaultdict(set)
        for f in season.fixtures:
            if f.home in grp:
                by_day[f.date].add(f.home)
        for hosts in by_day.values():
            if len(hosts) > 1:
                out["shared_grounds"].add(", ".join(sorted(hosts)))
    for fx in r.fixed:
        ok = any({f.home, f.away} == {fx.home, fx.away}
                 and (fx.round is None or f.round == fx.round)
                 and (fx.date is None or f.date == fx.date)
                 and (fx.any_venue or f.home == fx.home) for f in season.fixtures)
        if not ok:
            out["fixed_games"].add(f"{fx.home}, {fx.away}")
    for t in season.teams:
        seq = _sequence(season, t)
        venues = [f.home == t for f in seq]
        for limit, want in ((r.max_home_run, True), (r.max_away_run, False)):
            if limit is None:
                continue
            run = best = 0
            for v in venues:
                run = run + 1 if v is want else 0
                best = max(best, run)
            if best > limit:
                out["runs"].add(t)
        for prev, cur in itertools.pairwise(seq):
            is_break = (prev.home == t) == (cur.home == t)
            if is_break and r.no_breaks_first and cur.round <= r.no_breaks_first + 1:
                out["break_free_ends"].add(t)
            if is_break and r.no_breaks_last and cur.round > rounds - r.no_breaks_last:
                out["break_free_ends"].add(t)
            if r.min_rest_days is not None and (cur.date - prev.date).days - 1 < r.min_rest_days:
                out["rest_days"].add(t)
    if r.min_separation is not None and league.format.legs > 1:
        when: dict = defaultdict(list)
        for f in season.fixtures:
            when[frozenset((f.home, f.away))].append(f.round)
        for pair, rs in when.items():
            rs.sort()
            for x, y in itertools.pairwise(rs):
                if y - x - 1 < r.min_separation:
                    out["separation"].add(", ".join(sorted(pair)))
    if league.format.home_meaning == "venue":
        per_day = Counter((f.venue, f.date) for f in season.fixtures)
        for (venue, _day), count in per_day.items():
            if venue is not None and count > league.venue(venue).capacity:
                out["venue_capacity"].add(venue)
    return dict(out)
