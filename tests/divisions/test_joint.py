"""The joint model of a unit: all its divisions' timetables in one CP-SAT model.

Every planned result is confirmed by the independent checker (``check_federation``, which reads
only the fixtures and the file) and, where the test says so, by counts the test computes itself
from the fixtures. The rules across divisions (never both at home, the complementary pattern of
a first team and its reserves, a hall's courts one game at a time, a squad in one place at a
time) are common practice; ``docs/divisions.md`` describes them.
"""

from __future__ import annotations

import dataclasses
import itertools
import json
import textwrap
import tomllib
from collections import Counter
from datetime import date, timedelta

import pytest

import scheduler.divisions.joint as joint
from scheduler.config.federation import parse_federation
from scheduler.divisions.check import check_federation
from scheduler.divisions.execute import FederationPlan
from scheduler.divisions.grouping import units_of, venue_shares
from scheduler.divisions.outputs import summary
from scheduler.divisions.plan import JOINT, SEQUENTIAL, SINGLE, plan_unit
from scheduler.errors import ConfigError


def _fed(text):
    return parse_federation(tomllib.loads(text))


def _plan(fed, method="auto"):
    results = [plan_unit(fed, unit, method=method) for unit in units_of(fed)]
    seasons = {p.name: p.season for r in results for p in r.plans}
    return results, seasons


def _minutes(fixture, length):
    start = fixture.start
    return (start, start + timedelta(minutes=length))


HEADER = textwrap.dedent(
    """
    [federation]
    name = "Joint Test Association"
    season = "2027"
    timezone = "Europe/London"
    seed = 0
    solve_seconds = 1

    [calendar]
    start = 2027-09-04
    end = 2027-12-31
    weekdays = ["sat"]
    kickoff = "10:00"
    game_minutes = 90
    """
)


def _side_division(name, teams, extra=""):
    listed = ", ".join(f'{{ name = "{t}" }}' for t in teams)
    return textwrap.dedent(
        f"""
        [[divisions]]
        name = "{name}"
        format = {{ home_meaning = "side" }}
        venues = ["{name} Park"]
        {extra}
        teams = [{listed}]
        """
    )


def _parks(*names):
    return "".join(f'\n[[venues]]\nname = "{n} Park"\ncourts = ["North", "South"]\n'
                   for n in names)


# Early may use six Saturdays, Late only the first three; one squad plays in both.
SQUAD = (HEADER + _parks("Early", "Late")
         + _side_division("Early", ["Ashby", "Bexley", "Cradle", "Dunholm"],
                          "calendar = { dates = [2027-09-04, 2027-09-11, 2027-09-18, "
                          "2027-09-25, 2027-10-02, 2027-10-09] }")
         + _side_division("Late", ["Ashby Colts", "Ebbing", "Furze", "Gantry"],
                          "calendar = { dates = [2027-09-04, 2027-09-11, 2027-09-18] }")
         + '\n[[player_groups]]\nname = "Ashby squad"\nteams = ["Ashby", "Ashby Colts"]\n')


def test_a_unit_the_sequential_method_cannot_plan_is_planned_jointly():
    fed = _fed(SQUAD)
    (unit,) = units_of(fed)
    # one after another: Early takes the first three Saturdays (its earliest days), so Ashby
    # Colts would be unavailable on every date Late may use
    sequential = plan_unit(fed, unit, method="sequential")
    assert sequential.error is not None and "'Late' cannot be planned" in sequential.error
    result = plan_unit(fed, unit)
    assert result.error is None and result.method == JOINT and result.fallback == ""
    seasons = {p.name: p.season for p in result.plans}
    check = check_federation(fed, seasons)
    assert check.valid, check.problems
    # the test's own count: the squad never plays twice on one date, every game is played
    days = Counter(f.date for s in seasons.values() for f in s.fixtures
                   if {"Ashby", "Ashby Colts"} & set(f.teams))
    assert days and max(days.values()) == 1
    assert [len(seasons[n].fixtures) for n in ("Early", "Late")] == [6, 6]  # 4 choose 2 each
    assert {f.date for f in seasons["Late"].fixtures} <= {
        date(2027, 9, 4), date(2027, 9, 11), date(2027, 9, 18)}


def _overlapping(small_text):
    """Oxlow Minis (hall, slots 09:00-11:00, 50 min) and Zell (Lone, 09:30, three dates) share
    players; on those dates only the hall's later slots avoid a clash."""
    return small_text.replace('teams = ["Oxlow Minis", "Oxlow Kids"]',
                              'teams = ["Oxlow Minis", "Zell"]').replace(
        'calendar = { kickoff = "11:00" }',
        'calendar = { kickoff = "09:30", dates = [2027-09-04, 2027-09-11, 2027-09-18] }')


def test_player_group_is_kept_by_slots_where_whole_days_cannot(small_text):
    fed = _fed(_overlapping(small_text))
    unit = next(u for u in units_of(fed) if "Lone" in u.divisions)
    assert plan_unit(fed, unit, method="sequential").error is not None
    result = plan_unit(fed, unit)
    assert result.error is None and result.method == JOINT
    seasons = {p.name: p.season for p in result.plans}
    assert check_federation(fed, seasons).valid
    minis = [_minutes(f, 50) for f in seasons["Hall A"].fixtures if "Oxlow Minis" in f.teams]
    zell = [_minutes(f, 90) for f in seasons["Lone"].fixtures if "Zell" in f.teams]
    common = {a[0].date() for a in minis} & {b[0].date() for b in zell}
    assert common  # they do play on the same dates, at times that do not overlap
    assert all(not (a[0] < b[1] and b[0] < a[1]) for a in minis for b in zell)


def test_complementary_pattern_holds_on_every_common_date(small_text):
    fed = _fed(small_text)
    unit = next(u for u in units_of(fed) if "North" in u.divisions)
    result = plan_unit(fed, unit)
    assert result.method == JOINT, result.fallback
    seasons = {p.name: p.season for p in result.plans}
    check = check_federation(fed, seasons,
                             complementary_required=[fed.shared_grounds[0].name])
    assert check.valid, check.problems
    (figure,) = check.complement
    assert figure.enforced and figure.common_days > 0
    assert figure.complementary_days == figure.common_days
    # the test's own reading of the fixtures: on every date both play, one home, one away
    home = {team: {f.date for s in seasons.values() for f in s.fixtures if f.home == team}
            for team in ("Oxlow", "Oxlow Reserves")}
    plays = {team: {f.date for s in seasons.values() for f in s.fixtures if team in f.teams}
             for team in ("Oxlow", "Oxlow Reserves")}
    both = plays["Oxlow"] & plays["Oxlow Reserves"]
    assert len(both) == figure.common_days
    assert all((d in home["Oxlow"]) != (d in home["Oxlow Reserves"]) for d in both)


def test_checker_reports_a_promised_pattern_that_is_missed(small_text):
    fed = _fed(small_text)
    _, seasons = _plan(fed)
    name = fed.shared_grounds[0].name
    north = seasons["North"]
    # swap home and away of every Oxlow game: the pair is then at home together or away together
    flipped = tuple(dataclasses.replace(f, home=f.away, away=f.home)
                    if "Oxlow" in f.teams else f for f in north.fixtures)
    bad = dict(seasons, North=dataclasses.replace(north, fixtures=flipped))
    measured = check_federation(fed, bad)
    promised = check_federation(fed, bad, complementary_required=[name])
    assert not any("complementary" in p for p in measured.problems)
    assert any("complementary" in p for p in promised.problems)


HALL = (HEADER + textwrap.dedent(
    """
    [[venues]]
    name = "Quarry Hall"
    courts = ["Court 1", "Court 2"]
    """)
    + "".join(textwrap.dedent(
        f"""
        [[divisions]]
        name = "{name}"
        format = {{ home_meaning = "side" }}
        venues = ["Quarry Hall"]
        calendar = {{ game_minutes = 60 }}
        teams = [{", ".join(f'{{ name = "{name} {t}" }}' for t in "ABCD")}]
        """) for name in ("Red", "Green", "Blue")))


def test_hall_shared_date_by_date_beyond_a_static_split():
    fed = _fed(HALL)
    # each division needs both courts on its match days: no static split exists
    with pytest.raises(ConfigError):
        venue_shares(fed)
    (unit,) = units_of(fed)
    assert "Quarry Hall" in plan_unit(fed, unit, method="sequential").error
    result = plan_unit(fed, unit)
    assert result.error is None and result.method == JOINT
    seasons = {p.name: p.season for p in result.plans}
    assert check_federation(fed, seasons).valid
    # the test's own count: on every date at most one game per court at one time
    use = Counter((f.date, f.court, f.start) for s in seasons.values() for f in s.fixtures)
    assert max(use.values()) == 1
    per_day = Counter(f.date for s in seasons.values() for f in s.fixtures)
    assert max(per_day.values()) <= 2 and sum(per_day.values()) == 3 * 6


def test_fallback_to_the_sequential_method_is_said(small_text, monkeypatch):
    fed = _fed(small_text)
    monkeypatch.setattr(joint, "MAX_JOINT_TEAMS", 5)
    results, seasons = _plan(fed)
    methods = {r.key: (r.method, r.fallback) for r in results}
    assert [m for m, _ in methods.values()].count(SINGLE) == 1
    assert all(m == SEQUENTIAL and "more than the joint model takes" in why
               for m, why in methods.values() if m != SINGLE)
    assert check_federation(fed, seasons).valid
    plan = FederationPlan(fed, units_of(fed), tuple(results),
                          tuple(p for r in results for p in r.plans),
                          check_federation(fed, seasons), 0.0)
    text = json.dumps(summary(plan, {n: n for n in fed.division_names}))
    assert '"method": "one after another"' in text and "joint_model_not_used_because" in text


def test_joint_plans_are_reproducible(small_text):
    fed = _fed(small_text)
    unit = next(u for u in units_of(fed) if "Hall A" in u.divisions)
    first = plan_unit(fed, unit)
    second = plan_unit(fed, unit)
    assert first.method == JOINT
    assert [p.season for p in first.plans] == [p.season for p in second.plans]


def _ground_division(name, teams, legs):
    listed = ", ".join(f'{{ name = "{t}", home_venue = "{t} Ground" }}' for t in teams)
    return f'\n[[divisions]]\nname = "{name}"\nformat = {{ legs = {legs} }}\nteams = [{listed}]\n'


def _breaks_from_fixtures(season, team):
    """The test's own count: consecutive games of ``team`` on the same side (home or away)."""
    sides = [f.home == team for f in sorted(season.fixtures, key=lambda f: f.start)
             if team in f.teams]
    return sum(1 for first, second in itertools.pairwise(sides) if first == second)


def _pair_federation(reserves, legs, pairs):
    """Firsts (6 teams) and Seconds (``reserves`` teams), ``pairs`` first teams sharing their
    ground with their reserves in the complementary pattern."""
    first = ["Arlow", "Brinton", "Calder", "Denby", "Eskham", "Frome"]
    second = ([f"{t} Reserves" for t in first[:pairs]]
              + ["Gresby", "Hexham", "Ilbury", "Jarrow", "Kelby", "Lonsdale"])[:reserves]
    own = first + [t for t in second if not t.endswith("Reserves")]
    text = (HEADER + "".join(f'\n[[venues]]\nname = "{t} Ground"\n' for t in own)
            + _ground_division("Firsts", first, legs)
            + _ground_division("Seconds", second, legs)
            + "".join(f'\n[[shared_grounds]]\nname = "{t} Ground"\nteams = ["{t}", '
                      f'"{t} Reserves"]\npattern = "complementary"\n' for t in first[:pairs]))
    for t in first[:pairs]:
        text = text.replace(f'"{t} Reserves Ground"', f'"{t} Ground"')
    return _fed(text), first, second


@pytest.mark.parametrize(("reserves", "legs", "pairs"), [(6, 1, 2), (4, 2, 3)])
def test_complementary_pair_keeps_the_breaks_each_division_has_alone(reserves, legs, pairs):
    # Lower bound on breaks of a round robin of n teams, n even: n - 2 per single round robin
    # (de Werra 1981, Theorem A of docs/leg-schemes.md), (n - 2)(2L - 1) for L mirrored legs
    # (Theorem C there); each division alone reaches it (de Werra's canonical schedule).
    # Planned jointly, each division must still reach it: with equal sizes on the same dates
    # (the reserves' patterns the complements of the first teams'); with unequal sizes and
    # mirrored legs, the patterns cannot be complements on every common date without many
    # breaks (docs/divisions.md), so a division's dates move (the model with open days).
    fed, first, second = _pair_federation(reserves, legs, pairs)
    (unit,) = units_of(fed)
    result = plan_unit(fed, unit)
    assert result.error is None and result.method == JOINT, result.fallback
    seasons = {p.name: p.season for p in result.plans}
    check = check_federation(fed, seasons,
                             complementary_required=[g.name for g in fed.shared_grounds])
    assert check.valid, check.problems
    assert all(f.complementary_days == f.common_days for f in check.complement)
    for name, teams in (("Firsts", first), ("Seconds", second)):
        counted = sum(_breaks_from_fixtures(seasons[name], t) for t in teams)
        assert counted == (len(teams) - 2) * (2 * legs - 1), (name, counted)
