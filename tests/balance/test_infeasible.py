"""Rules that cannot hold together are named in the league's words (InfeasibleError.conflicts).

The contradictions are theorems: de Werra 1981 (Annals of Discrete Math. 11:381-395): an even
single round robin needs n-2 breaks, so runs of at most one home and one away game (no break at
all) cannot hold; "no break in rounds 2..n-1" is the same demand. The others are counting facts
(one team, one game per round; a shared ground hosts one of its teams a day)."""

from __future__ import annotations

from datetime import date

import pytest

from scheduler.config.model import CalendarSpec, FixedFixture, Rules, TeamDates
from scheduler.errors import InfeasibleError
from scheduler.plan import plan_season

from .helpers import league


def _conflicts(lg) -> list[str]:
    with pytest.raises(InfeasibleError) as info:
        plan_season(lg, time_limit=4)
    return info.value.conflicts


def test_runs_of_one_contradict_de_werra():
    # Even one of the two suffices: with no two away games in a row, the n/2 teams away in a
    # round are all at home in the next, so every team alternates (0 breaks) - against de Werra.
    # The reported set is minimal (deletion filter), so it names one of them.
    conflicts = _conflicts(league(6, rules=Rules(max_home_run=1, max_away_run=1)))
    assert len(conflicts) == 1
    assert conflicts[0] in {"max_home_run = 1 for every team", "max_away_run = 1 for every team"}


def test_home_run_of_one_alone_is_named():
    conflicts = _conflicts(league(8, rules=Rules(max_home_run=1, max_away_run=3)))
    assert conflicts == ["max_home_run = 1 for every team"]


def test_no_breaks_anywhere_contradicts_de_werra():
    # SRR of 6 teams has rounds 1..5: no break in rounds 2..5 means no break at all
    lg = league(6, rules=Rules(no_breaks_first=4, max_home_run=3))
    conflicts = _conflicts(lg)
    assert conflicts == ["no_breaks_first = 4 (no break in rounds 2..5)"]


def test_two_fixed_games_of_one_team_in_one_round():
    lg = league(6, rules=Rules(fixed=(
        FixedFixture("Alder Vale", "Brook Farm", round=2),
        FixedFixture("Cobble Hill", "Alder Vale", round=2),
        FixedFixture("Dunmere", "Elm Quay", round=3))))
    conflicts = _conflicts(lg)
    assert set(conflicts) == {"fixed: Alder Vale v Brook Farm in round 2",
                              "fixed: Cobble Hill v Alder Vale in round 2"}


def test_shared_ground_with_two_fixed_home_games_on_one_day():
    lg = league(8, rules=Rules(
        shared_grounds=(("Alder Vale", "Brook Farm"),),
        fixed=(FixedFixture("Alder Vale", "Cobble Hill", round=3),
               FixedFixture("Brook Farm", "Dunmere", round=3),
               FixedFixture("Elm Quay", "Fernwick", round=5))))
    conflicts = _conflicts(lg)
    assert set(conflicts) == {
        "shared ground: at most one of Alder Vale, Brook Farm at home on a match day",
        "fixed: Alder Vale v Cobble Hill in round 3",
        "fixed: Brook Farm v Dunmere in round 3"}


def test_no_home_date_against_a_fixed_home_date():
    day = date(2027, 1, 16)
    lg = league(6, calendar=CalendarSpec(start=date(2027, 1, 2), end=date(2027, 3, 31)),
                rules=Rules(no_home_games=(TeamDates("Harbour Town", (day,)),)))
    lg = league(8, calendar=lg.calendar, rules=Rules(
        no_home_games=(TeamDates("Harbour Town", (day,)),),
        fixed=(FixedFixture("Harbour Town", "Alder Vale", date=day),)))
    conflicts = _conflicts(lg)
    assert set(conflicts) == {"Harbour Town cannot play at home on 2027-01-16",
                              "fixed: Harbour Town v Alder Vale on 2027-01-16"}


def test_too_many_unavailable_dates_for_the_calendar():
    # 6 teams, 5 rounds, 6 Saturdays offered, two of them blocked for an even league
    cal = CalendarSpec(start=date(2027, 1, 2), end=date(2027, 2, 6))
    lg = league(6, calendar=cal, rules=Rules(unavailable=(
        TeamDates("Alder Vale", (date(2027, 1, 9),)),
        TeamDates("Brook Farm", (date(2027, 1, 23),)))))
    conflicts = _conflicts(lg)
    assert set(conflicts) == {"Alder Vale is unavailable on 2027-01-09",
                              "Brook Farm is unavailable on 2027-01-23"}


def test_min_separation_against_english_scheme():
    # docs/leg-schemes.md: the English scheme plays the pairs of round n-1 again in round n
    conflicts = _conflicts(league(6, legs=2, scheme="english", rules=Rules(min_separation=1)))
    assert len(conflicts) == 1 and conflicts[0].startswith("min_separation = 1")


def test_message_is_plain_words():
    with pytest.raises(InfeasibleError) as info:
        plan_season(league(6, rules=Rules(max_home_run=1, max_away_run=1)), time_limit=4)
    text = str(info.value)
    assert "for every team" in text and "Traceback" not in text
    assert "round pairings of" in text
