"""An independent checker of a re-planned season. It imports nothing from the planner.

It reads the previous and the new ``season.json`` (plain JSON), the league file and the events
file (plain TOML, :mod:`tomllib`) and lists every broken promise:

- with several rounds on one match day (``calendar.rounds_per_day``) a team plays at most that
  many games a day and never two that overlap (kick-offs less than ``game_minutes`` apart);
- history unchanged: every game dated on or before ``played_through`` that was not postponed
  (and not removed with a ``void_all`` withdrawal) is in the new file with the same JSON object;
  the events file may have grown since an earlier re-plan: a game dated on or before that
  re-plan's ``played_through`` (the old file's ``revisions``) counts as played, even when an
  old ``[[postponed]]`` entry still names its pair;
- every other game is dated after ``played_through``;
- the same games as before (each pair meets as often as planned, minus withdrawn teams);
- one game per team and day; ``min_rest_days`` between a team's consecutive games; runs of home
  and away games in date order no longer than ``max_home_run``/``max_away_run`` (a run lying
  wholly in history is not the re-plan's doing); teams sharing a one-pitch ground never both at
  home on one day; each venue court and kick-off used once a day; unavailable teams and closed
  venues not used; no home game on a team's ``no_home_games`` day; hand-moved games exactly
  as given; in a home-and-away season each team hosts each opponent as often as before.

The rules are read from the league file as its documentation (``templates/league.toml``)
describes them; the date arithmetic is Python's :mod:`datetime` (proleptic Gregorian).
"""

from __future__ import annotations

import datetime as dt
import itertools
import json
import tomllib
from collections import Counter, defaultdict
from pathlib import Path


def _dates(entries) -> set[dt.date]:
    out: set[dt.date] = set()
    for item in entries:
        if isinstance(item, str) and ".." in item:
            a, b = (dt.date.fromisoformat(x) for x in item.split(".."))
            while a <= b:
                out.add(a)
                a += dt.timedelta(days=1)
        elif isinstance(item, str):
            out.add(dt.date.fromisoformat(item))
        else:
            out.add(item)
    return out


def _day(f) -> dt.date:
    return dt.date.fromisoformat(f["date"])


def check(old_path: Path, new_path: Path, league_path: Path, events_path: Path) -> list[str]:
    """Every problem found (an empty list when the re-plan keeps every promise)."""
    old = json.loads(Path(old_path).read_text(encoding="utf-8"))
    new = json.loads(Path(new_path).read_text(encoding="utf-8"))
    league = tomllib.loads(Path(league_path).read_text(encoding="utf-8"))
    events = tomllib.loads(Path(events_path).read_text(encoding="utf-8"))
    pt = events["played_through"]
    problems: list[str] = []
    # the events file grows over the season: history published by an earlier re-plan (the
    # latest played_through in the old file's revisions) is never postponed again, so only
    # games planned after it can be the ones postponed now
    earlier = [dt.date.fromisoformat(r["played_through"]) for r in old.get("revisions", [])
               if r.get("played_through")]
    if earlier and pt < max(earlier):
        problems.append(f"played_through {pt} is before the last re-plan's {max(earlier)}")
    since = max(earlier) if earlier else dt.date.min
    void = {w["team"] for w in events.get("withdrawn", []) if w["policy"] == "void_all"}
    gone = {w["team"] for w in events.get("withdrawn", [])}
    # entries an earlier re-plan already applied: season.json records each re-placed game
    # as {"home", "away", "date"} in its revision; an entry with a date matches that record,
    # an entry without one the earliest unused record of the same home and away team
    records = [g for r in old.get("revisions", []) for g in r.get("postponed", [])]
    entries = events.get("postponed", [])
    done: set[int] = set()
    used: set[int] = set()
    for dated in (True, False):
        for i, p in enumerate(entries):
            if ("date" in p) != dated:
                continue
            for k, g in enumerate(records):
                if k not in used and (g["home"], g["away"]) == (p["home"], p["away"]) and (
                        "date" not in p or p["date"] == dt.date.fromisoformat(g["date"])):
                    used.add(k)
                    done.add(i)
                    break
    postponed = []
    for p in (p for i, p in enumerate(entries) if i not in done):
        for f in old["fixtures"]:
            if (f["home"], f["away"]) == (p["home"], p["away"]) and since < _day(f) <= pt and (
                "date" not in p or _day(f) == p["date"]
            ):
                postponed.append(f)
    history = [f for f in old["fixtures"] if _day(f) <= pt and f not in postponed
               and not void & {f["home"], f["away"]}]
    new_fixtures = new["fixtures"]
    for f in history:
        if f not in new_fixtures:
            problems.append(f"history changed: {f['home']} v {f['away']} on {f['date']}")
    future = [f for f in new_fixtures if f not in history]
    for f in future:
        if _day(f) <= pt:
            problems.append(f"{f['home']} v {f['away']} placed on {f['date']}, not after "
                            f"played_through")
    # the same games
    def pairs(fixtures):
        return Counter(frozenset((f["home"], f["away"])) for f in fixtures)

    expected = Counter({k: v for k, v in pairs(old["fixtures"]).items()
                        if not k & void and not (k & gone)})
    expected.update(pairs(f for f in old["fixtures"] if _day(f) <= pt and f not in postponed
                          and (frozenset((f["home"], f["away"])) & gone)
                          and not (frozenset((f["home"], f["away"])) & void)))
    if pairs(new_fixtures) != expected:
        problems.append("the new season does not hold the same games as before")
    if old.get("legs", 1) > 1:
        hosts_old = Counter((f["home"], f["away"]) for f in old["fixtures"]
                            if not {f["home"], f["away"]} & gone)
        hosts_new = Counter((f["home"], f["away"]) for f in new_fixtures
                            if not {f["home"], f["away"]} & gone)
        if hosts_old != hosts_new:
            problems.append("a team hosts an opponent a different number of times")
    rules = league.get("rules", {})
    calendar = league.get("calendar", {})
    per_day = calendar.get("rounds_per_day", 1)
    length = dt.timedelta(minutes=calendar.get("game_minutes", 90))
    # per team, in time order (the local kick-off "time" orders games of one day)
    games: dict[str, list[tuple[dt.date, str, bool, bool]]] = defaultdict(list)
    for f in new_fixtures:
        is_future = f in future
        games[f["home"]].append((_day(f), f["time"] or "", True, is_future))
        games[f["away"]].append((_day(f), f["time"] or "", False, is_future))
    rest = rules.get("min_rest_days")
    for team, items in games.items():
        items.sort()
        for (d1, t1, _, f1), (d2, t2, _, f2) in itertools.pairwise(items):
            if d1 == d2 and per_day == 1:
                problems.append(f"{team} plays twice on {d1}")
            elif d1 == d2 and (dt.datetime.combine(d2, dt.time.fromisoformat(t2))
                               - dt.datetime.combine(d1, dt.time.fromisoformat(t1))) < length:
                problems.append(f"{team} plays two overlapping games on {d1} ({t1}, {t2})")
            elif rest is not None and (f1 or f2) and (d2 - d1).days - 1 < rest:
                problems.append(f"{team}: only {(d2 - d1).days - 1} rest days before {d2}")
        for day, count in Counter(d for d, *_ in items).items():
            if count > per_day:
                problems.append(f"{team} plays {count} games on {day}")
        for key, side in (("max_home_run", True), ("max_away_run", False)):
            limit = rules.get(key)
            if limit is None:
                continue
            run, touches_future = 0, False
            for _, _, home, is_future in items:
                if home == side:
                    run += 1
                    touches_future = touches_future or is_future
                    if run > limit and touches_future:
                        problems.append(f"{team}: {run} {'home' if side else 'away'} games in "
                                        "a row")
                        break
                else:
                    run, touches_future = 0, False
    # grounds and places
    venues = {v["name"]: v for v in league.get("venues", [])}
    home_venue = {t["name"]: t.get("home_venue") for t in league["teams"]}
    groups = [tuple(g) for g in rules.get("shared_grounds", [])]
    by_venue = defaultdict(list)
    for team, venue in home_venue.items():
        if venue:
            by_venue[venue].append(team)
    for venue, members in by_venue.items():
        spec = venues.get(venue, {})
        if len(members) > 1 and len(spec.get("courts", ["Main"])) * max(
                1, len(spec.get("slots", []))) == 1:
            groups.append(tuple(members))
    for group in groups:
        # one ground: one home game of the group a match day (a kick-off, with several
        # rounds a day)
        at_home = Counter((_day(f), f["time"] if per_day > 1 else None) for f in future
                          if f["home"] in group)
        for day, count in at_home.items():
            if count > 1:
                problems.append(f"shared ground {group}: {count} at home on {day}")
    used = Counter((_day(f), f["venue"], f["court"], f["start"]) for f in future)
    for key, count in used.items():
        if count > 1:
            problems.append(f"{key[1]} {key[2]} used {count} times at {key[3]}")
    for f in future:
        venue = home_venue.get(f["home"])
        mode = league.get("format", {}).get("home_meaning", "venue")
        if mode == "venue" and venue and f["venue"] != venue:
            problems.append(f"{f['home']} v {f['away']} not at {venue}")
    unavailable = [(u["team"], d) for u in events.get("unavailable", [])
                   for d in _dates(u["dates"])]
    unavailable += [(u["team"], d) for u in rules.get("unavailable", []) for d in
                    _dates(u["dates"])]
    for team, day in unavailable:
        for f in future:
            if team in (f["home"], f["away"]) and _day(f) == day:
                problems.append(f"{team} plays on {day} although unavailable")
    for entry in rules.get("no_home_games", []):
        days = _dates(entry["dates"])
        for f in future:
            if f["home"] == entry["team"] and _day(f) in days:
                problems.append(f"{entry['team']} at home on {f['date']}, a day it cannot be")
    for c in events.get("closed", []):
        days = _dates(c["dates"])
        for f in future:
            if f["venue"] == c["venue"] and _day(f) in days and (
                    not c.get("courts") or f["court"] in c["courts"]):
                problems.append(f"{f['home']} v {f['away']} at closed {c['venue']} on "
                                f"{f['date']}")
    for m in events.get("moved", []):
        if m["date"] <= pt:
            continue  # history: kept by the history check above
        hits = [f for f in new_fixtures if (f["home"], f["away"]) == (m["home"], m["away"])
                and _day(f) == m["date"]]
        clock = m["start"] if isinstance(m["start"], str) else m["start"].strftime("%H:%M")
        if not hits or hits[0]["time"] != clock[:5] or (
                "court" in m and hits[0]["court"] != m["court"]):
            problems.append(f"moved game {m['home']} v {m['away']} not kept as given")
    return problems
