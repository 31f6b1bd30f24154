"""Couplings, units of work, planning a unit, and the independent cross-division checker.

Outside checks: the units are compared with networkx's connected components of a graph this
test builds itself from the file (edges: teams of a shared ground or player group, divisions on
one venue), and the checker is tested on hand-made violations as well as on planned seasons.
"""

from __future__ import annotations

import dataclasses
import itertools
import tomllib
from datetime import date, datetime, timedelta
from zoneinfo import ZoneInfo

import networkx as nx

from scheduler.config.federation import parse_federation
from scheduler.divisions.check import check_federation
from scheduler.divisions.grouping import couplings_of, units_of, venue_shares
from scheduler.divisions.plan import plan_unit
from scheduler.season import Fixture


def _fed(text):
    return parse_federation(tomllib.loads(text))


def _plan_all(fed, method="auto"):
    seasons, results = {}, []
    for unit in units_of(fed):
        result = plan_unit(fed, unit, method=method)
        assert result.error is None, result.error
        results.append(result)
        for p in result.plans:
            seasons[p.name] = p.season
    return seasons, results


def test_units_are_the_connected_components(small_text):
    fed = _fed(small_text)
    graph = nx.Graph()
    graph.add_nodes_from(fed.division_names)
    data = tomllib.loads(small_text)
    for entry in data["shared_grounds"] + data["player_groups"]:
        divs = [fed.division_of(t) for t in entry["teams"]]
        graph.add_edges_from(itertools.combinations(divs, 2))
    for venue in fed.venues:  # all divisions play on Saturdays here
        users = [d.name for d in fed.divisions
                 if venue.name in {v.name for v in d.league.venues}]
        graph.add_edges_from(itertools.combinations(users, 2))
    expected = sorted(sorted(c) for c in nx.connected_components(graph))
    got = sorted(sorted(u.divisions) for u in units_of(fed))
    assert got == expected == [["Hall A", "Hall B"], ["Lone"], ["North", "Reserves"]]


def test_divisions_on_different_weekdays_are_not_coupled(small_text):
    text = small_text.replace('calendar = { game_minutes = 50 }\nteams = [{ name = "Oxlow Kids" }',
                              'calendar = { game_minutes = 50, weekdays = ["sun"] }\n'
                              'teams = [{ name = "Oxlow Kids" }')
    fed = _fed(text)
    assert ("Hall B",) in [u.divisions for u in units_of(fed)]
    assert not any(c.kind == "venue" for c in couplings_of(fed))


def test_hall_is_split_by_slots(small_text):
    fed = _fed(small_text)
    shares, _ = venue_shares(fed)
    a = shares[("Hall A", "Vexby Hall")]
    b = shares[("Hall B", "Vexby Hall")]
    assert set(a.slots).isdisjoint(b.slots) and a.courts == b.courts


def test_planned_units_keep_every_rule_across_divisions(small_text):
    fed = _fed(small_text)
    seasons, _ = _plan_all(fed)
    check = check_federation(fed, seasons)
    assert check.valid, check.problems
    (figure,) = check.complement
    assert figure.teams == ("Oxlow", "Oxlow Reserves")
    assert 0 <= figure.complementary_days <= figure.common_days


def _overlapping(small_text, lone_calendar='calendar = { kickoff = "09:30" }'):
    """Oxlow Minis (hall, 09:00 for 50 min) and Zell (Lone, kick-off 09:30) share players."""
    return small_text.replace('teams = ["Oxlow Minis", "Oxlow Kids"]',
                              'teams = ["Oxlow Minis", "Zell"]').replace(
        'calendar = { kickoff = "11:00" }', lone_calendar)


def test_player_group_with_overlapping_times_becomes_unavailable_dates(small_text):
    # the one-after-another method turns the group into unavailable dates of the later division
    fed = _fed(_overlapping(small_text))
    seasons, results = _plan_all(fed, "sequential")
    lone = next(p for r in results for p in r.plans if p.name == "Lone")
    assert any("player group 'Oxlow juniors'" in a for a in lone.added)
    assert check_federation(fed, seasons).valid
    minis = {f.date for f in seasons["Hall A"].fixtures if "Oxlow Minis" in f.teams}
    zell = {f.date for f in seasons["Lone"].fixtures if "Zell" in f.teams}
    assert minis and zell and minis.isdisjoint(zell)


def test_a_clash_names_the_coupling(small_text):
    # Lone may only use the three dates on which Oxlow Minis play at overlapping times.
    fed = _fed(_overlapping(small_text, 'calendar = { kickoff = "09:30", '
                                        'dates = [2027-09-04, 2027-09-11, 2027-09-18] }'))
    unit = next(u for u in units_of(fed) if "Lone" in u.divisions)
    result = plan_unit(fed, unit, method="sequential")
    assert result.error is not None and "'Lone' cannot be planned" in result.error
    assert any("player group 'Oxlow juniors'" in c for c in result.conflicts)


def _game(home, away, day, hour, venue, court="Main"):
    start = datetime(day.year, day.month, day.day, hour, tzinfo=ZoneInfo("Europe/London"))
    return Fixture(round=1, home=home, away=away, venue=venue, court=court, date=day, start=start)


def test_checker_finds_hand_made_violations(small_text):
    fed = _fed(small_text)
    seasons, _ = _plan_all(fed)
    day = date(2027, 9, 4)
    bad = dict(seasons)
    north = seasons["North"]
    reserves = seasons["Reserves"]
    # Oxlow and Oxlow Reserves both at home on one day, on the same ground at the same time
    bad["North"] = dataclasses.replace(north, fixtures=(
        _game("Oxlow", "Pimbury", day, 14, "Oxlow Ground"),))
    bad["Reserves"] = dataclasses.replace(reserves, fixtures=(
        _game("Oxlow Reserves", "Quenby Reserves", day, 15, "Oxlow Ground"),))
    # two juniors of one player group at overlapping times on different courts
    bad["Hall A"] = dataclasses.replace(seasons["Hall A"], fixtures=(
        _game("Oxlow Minis", "Wend Minis", day, 9, "Vexby Hall", "Court 1"),))
    bad["Hall B"] = dataclasses.replace(seasons["Hall B"], fixtures=(
        _game("Oxlow Kids", "Wend Kids", day, 9, "Vexby Hall", "Court 2"),))
    check = check_federation(fed, bad)
    text = "\n".join(check.problems)
    assert "Oxlow and Oxlow Reserves both at home on 2027-09-04" in text
    assert "Oxlow Ground, Main, 2027-09-04" in text  # 14:00-15:30 overlaps 15:00
    assert "player group 'Oxlow juniors'" in text
    # one hour apart at 50 minutes each: no overlap, nothing reported for the hall
    later = _game("Oxlow Kids", "Wend Kids", day, 10, "Vexby Hall", "Court 1")
    bad["Hall B"] = dataclasses.replace(seasons["Hall B"], fixtures=(later,))
    assert not any("Vexby Hall" in p or "juniors" in p
                   for p in check_federation(fed, bad).problems)
    assert timedelta(minutes=50) < timedelta(hours=1)
