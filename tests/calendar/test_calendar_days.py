"""Match days against outside references: Python's own weekday arithmetic (date.weekday and the
stdlib ``calendar`` module), the ``holidays`` package, and the round count of the project's
circle construction (GK_n: n - 1 rounds for even n, Kotzig 1964 / Wallis 1997)."""

from __future__ import annotations

import calendar as stdlib_calendar
import dataclasses
import datetime as dt

import holidays
import pytest

from scheduler.calendar import days_needed, match_days, public_holidays, round_days, rounds_needed
from scheduler.config import (
    CalendarSpec,
    Format,
    League,
    Team,
    Venue,
    load_league,
    sample_path,
)
from scheduler.errors import ConfigError, InputError
from scheduler.factorization.circle import circle_rounds


def spec(**kw) -> CalendarSpec:
    return CalendarSpec(**{"start": dt.date(2027, 1, 1), **kw})


def league_of(n: int, legs: int = 1, **calendar) -> League:
    return League(
        name="Test",
        season="1",
        timezone="Europe/Berlin",
        teams=tuple(Team(name=f"T{i}", code=f"T{i}") for i in range(n)),
        venues=(Venue(name="Hall"),),
        format=Format(legs=legs),
        calendar=spec(**calendar),
    )


@pytest.mark.parametrize("weekdays", [(5,), (1, 3), (0, 1, 2, 3, 4, 5, 6), (6,)])
def test_weekday_filtering_matches_python(weekdays):
    s = spec(start=dt.date(2027, 1, 1), end=dt.date(2028, 12, 31), weekdays=weekdays)
    days = match_days(s)
    every = [s.start + dt.timedelta(days=k) for k in range((s.end - s.start).days + 1)]
    assert days == [d for d in every if d.weekday() in weekdays]
    # The stdlib calendar module computes weekdays independently (Zeller-free table lookup).
    assert all(stdlib_calendar.weekday(d.year, d.month, d.day) in weekdays for d in days)
    n_months = sum(
        1
        for y in (2027, 2028)
        for m in range(1, 13)
        for week in stdlib_calendar.monthcalendar(y, m)
        for wd in weekdays
        if week[wd]
    )
    assert len(days) == n_months


def test_excluded_dates_are_removed():
    s = spec(start=dt.date(2027, 3, 6), end=dt.date(2027, 6, 26), excluded=(dt.date(2027, 4, 17),))
    days = match_days(s)
    assert dt.date(2027, 4, 17) not in days
    assert dt.date(2027, 4, 10) in days and dt.date(2027, 4, 24) in days
    assert len(days) == len(match_days(dataclasses.replace(s, excluded=()))) - 1


def test_new_years_day_is_excluded_by_the_holidays_package():
    """Every day of a fortnight is a candidate; the holidays package's DE holidays go."""
    s = spec(
        start=dt.date(2027, 12, 20),
        end=dt.date(2028, 1, 10),
        weekdays=tuple(range(7)),
        holidays_country="DE",
    )
    table = holidays.country_holidays("DE", years=[2027, 2028])
    assert dt.date(2028, 1, 1) in table  # Neujahr
    days = match_days(s)
    every = [s.start + dt.timedelta(days=k) for k in range(22)]
    assert days == [d for d in every if d not in table]
    assert dt.date(2028, 1, 1) not in days and dt.date(2027, 12, 25) not in days
    assert public_holidays(s, 2027, 2028) == frozenset(d for d in table if d.year in (2027, 2028))


def test_subdivision_holidays():
    """Epiphany (6 January) is a public holiday in Bavaria but not in Berlin, per the package."""
    by = holidays.country_holidays("DE", subdiv="BY", years=2028)
    be = holidays.country_holidays("DE", subdiv="BE", years=2028)
    epiphany = dt.date(2028, 1, 6)
    assert epiphany in by and epiphany not in be
    base = dict(start=dt.date(2028, 1, 3), end=dt.date(2028, 1, 9), weekdays=tuple(range(7)))
    s_by = spec(holidays_country="DE", holidays_subdivision="BY", **base)
    s_be = spec(holidays_country="DE", holidays_subdivision="BE", **base)
    assert epiphany not in match_days(s_by)
    assert epiphany in match_days(s_be)


def test_open_ended_season_spans_years():
    """With no end, the search runs until enough days are found, with each year's holidays."""
    s = spec(
        start=dt.date(2027, 12, 1),
        weekdays=tuple(range(7)),
        holidays_country="GB",
        holidays_subdivision="ENG",
    )
    days = match_days(s, needed=60)
    table = holidays.country_holidays("GB", subdiv="ENG", years=[2027, 2028])
    assert len(days) == 60
    assert days[-1].year == 2028
    assert not set(days) & set(table)
    every = [s.start + dt.timedelta(days=k) for k in range((days[-1] - s.start).days + 1)]
    assert days == [d for d in every if d not in table]
    with pytest.raises(InputError):
        match_days(s)


def test_explicit_dates_are_used_exactly():
    dates = (dt.date(2027, 5, 16), dt.date(2027, 5, 15))
    s = spec(dates=dates, weekdays=(0,), holidays_country="DE")
    assert match_days(s) == sorted(dates)
    with pytest.raises(ConfigError, match=r"calendar\.dates: the season has 2 match days"):
        match_days(s, needed=3)


def test_too_few_days_is_a_config_error():
    s = spec(start=dt.date(2027, 3, 6), end=dt.date(2027, 3, 27))  # four Saturdays
    assert len(match_days(s)) == 4
    with pytest.raises(ConfigError) as info:
        match_days(s, needed=5)
    assert info.value.problems[0].startswith("calendar: the season has 4 match days but needs 5")


@pytest.mark.parametrize("n", [2, 3, 4, 5, 6, 7, 8, 9, 10, 15, 16])
@pytest.mark.parametrize("legs", [1, 2, 3])
def test_rounds_needed_matches_the_circle_construction(n, legs):
    """GK_m has m - 1 rounds (m even); an odd league plays GK_{n+1} with a bye team."""
    even = n if n % 2 == 0 else n + 1
    per_leg = len(circle_rounds(even))
    assert rounds_needed(league_of(n, legs)) == legs * per_leg
    lg = league_of(n, legs, rounds_per_day=3)
    assert days_needed(lg) == -(-legs * per_leg // 3)


def test_round_days_use_every_match_day_in_order():
    lg = league_of(
        8,
        1,
        start=dt.date(2027, 5, 15),
        dates=(dt.date(2027, 5, 15), dt.date(2027, 5, 16)),
        rounds_per_day=4,
    )
    assert round_days(lg) == [dt.date(2027, 5, 15)] * 4 + [dt.date(2027, 5, 16)] * 3
    lg = league_of(4, 2, start=dt.date(2027, 3, 6))  # Saturdays, no end
    days = round_days(lg)
    assert len(days) == 6 and all(d.weekday() == 5 for d in days)
    assert days == sorted(days) and len(set(days)) == 6


def test_samples_match_days_are_in_season():
    for name in ("evening_hall.toml", "county_double.toml"):
        lg = load_league(sample_path(name))
        days = match_days(lg)
        table = holidays.country_holidays(
            lg.calendar.holidays_country,
            subdiv=lg.calendar.holidays_subdivision,
            years=range(lg.calendar.start.year, lg.calendar.end.year + 1),
        )
        assert all(lg.calendar.start <= d <= lg.calendar.end for d in days)
        assert all(d.weekday() in lg.calendar.weekdays for d in days)
        assert not set(days) & (set(table) | set(lg.calendar.excluded))
