"""An independent checker of a Season against its League: the round-robin structure and places
here, the league's hard rules through their own checks (:func:`scheduler.rules.check_rules`,
which read the fixtures only and import nothing from ``scheduler.balance``). Those checks are
cross-checked against the rules' definitions in ``tests/rules/test_cross_check.py``.

What is checked (the hard rules as ``docs/rules.md`` defines them):

- round robin: every pair meets once per leg, nobody plays twice in a round, byes complete;
- unavailable: no game of the team on that date;
- no_home_games: the team is not at home on that date;
- shared grounds: at most one team of a group at home on a match day;
- fixed: the pair plays in that round / on that date, with that home team unless any_venue;
- max_home_run / max_away_run: longest run of consecutive home / away games over the games
  actually played (a bye is skipped);
- no_breaks_first = k: no break in rounds 2..k+1; no_breaks_last = k: none in the last k rounds
  (a break is counted in the second of two consecutive games with the same venue);
- min_rest_days: (d2 - d1).days - 1 >= value between consecutive games of a team;
- min_separation: at least that many rounds strictly between two consecutive meetings;
- places: venue mode plays at the home team's home_venue; courts and slots belong to the venue;
  one game per (venue, court, kick-off); no team in two games at once; kick-offs are aware.
"""

from __future__ import annotations

import itertools
from collections import Counter, defaultdict

from scheduler.config.model import League
from scheduler.rules import check_rules
from scheduler.season import Season


def _sequence(season: Season, team: str):
    return sorted((f for f in season.fixtures if team in (f.home, f.away)), key=lambda f: f.round)


def check_season(league: League, season: Season) -> list[str]:
    """All violations found (empty list: every hard rule holds)."""
    bad: list[str] = []
    names = list(league.team_names)
    legs = max(1, league.format.legs)
    if tuple(season.teams) != tuple(names):
        bad.append("season teams differ from the league")
    rounds = max(f.round for f in season.fixtures)
    odd = len(names) % 2 == 1
    expected_rounds = legs * (len(names) - 1 + (1 if odd else 0))
    if rounds != expected_rounds:
        bad.append(f"{rounds} rounds, expected {expected_rounds}")
    meetings = Counter(frozenset((f.home, f.away)) for f in season.fixtures)
    for i, a in enumerate(names):
        for b in names[i + 1:]:
            if meetings[frozenset((a, b))] != legs:
                bad.append(f"{a} and {b} meet {meetings[frozenset((a, b))]} times")
    per_round: dict[int, list[str]] = defaultdict(list)
    for f in season.fixtures:
        per_round[f.round] += [f.home, f.away]
    for r in range(1, rounds + 1):
        c = Counter(per_round[r])
        if any(v > 1 for v in c.values()):
            bad.append(f"round {r}: a team plays twice")
        missing = set(names) - set(c)
        if missing != set(season.byes.get(r, ())):
            bad.append(f"round {r}: byes {sorted(missing)} vs {season.byes.get(r)}")
    # each leg is a single round robin
    R = expected_rounds // legs
    for f in season.fixtures:
        if f.leg != (f.round - 1) // R + 1:
            bad.append(f"round {f.round} labelled leg {f.leg}")
    # the league's hard rules: their own independent checks (scheduler.rules, fixtures only),
    # cross-checked against a from-the-definition computation in tests/rules/test_cross_check.py
    for check in check_rules(league, season):
        bad += [f"{check.rule}: {v.team} round {v.round} {v.date}: {v.what}"
                for v in check.violations]
    for t in names:
        for prev, cur in itertools.pairwise(_sequence(season, t)):
            if (prev.start and cur.start and prev.date == cur.date
                    and not prev.start < cur.start):
                bad.append(f"{t}: round {cur.round} does not start after round {prev.round}")
    # places and times
    venues = {v.name: v for v in league.venues}
    used = Counter()
    busy = Counter()
    for f in season.fixtures:
        if f.start is None or f.start.tzinfo is None or f.date is None:
            bad.append(f"round {f.round} {f.home}-{f.away}: no aware kick-off")
            continue
        if f.start.date() != f.date:
            bad.append(f"{f}: start not on its date")
        if venues:
            if f.venue not in venues:
                bad.append(f"{f}: unknown venue")
                continue
            home_venue = league.team(f.home).home_venue
            if league.format.home_meaning == "venue" and home_venue and f.venue != home_venue:
                bad.append(f"{f}: not at {home_venue}")
            if f.court not in venues[f.venue].courts:
                bad.append(f"{f}: court {f.court} not at {f.venue}")
            slots = [s.strftime("%H:%M") for s in venues[f.venue].slots]
            if slots and f.slot not in slots:
                bad.append(f"{f}: slot {f.slot} not at {f.venue}")
            used[(f.venue, f.court, f.start)] += 1
        busy[(f.home, f.start)] += 1
        busy[(f.away, f.start)] += 1
    bad += [f"two games at {k}" for k, v in used.items() if v > 1]
    bad += [f"{k[0]} plays twice at {k[1]}" for k, v in busy.items() if v > 1]
    dates = [f.date for f in sorted(season.fixtures, key=lambda f: f.round)]
    if any(b < a for a, b in itertools.pairwise(dates)):
        bad.append("match days do not follow the round order")
    return bad


def count_breaks(season: Season) -> int:
    """Total breaks over the games played (byes skipped), counted in the second game (plain
    code from the definition, de Werra 1981)."""
    total = 0
    for t in season.teams:
        seq = _sequence(season, t)
        total += sum((a.home == t) == (b.home == t) for a, b in itertools.pairwise(seq))
    return total
