"""Kick-off datetimes against zoneinfo's own offsets (IANA tz database via PEP 615/PEP 495).

The daylight-saving changes are found by scanning zoneinfo's offsets, not typed in, so the
checks hold for whatever tzdata is installed.
"""

from __future__ import annotations

import dataclasses
import datetime as dt
from zoneinfo import ZoneInfo

import pytest

from scheduler.calendar import game_end, kickoff, local_datetime, parse_slot
from scheduler.config import load_league, sample_path
from scheduler.errors import InputError

UTC = dt.UTC


def transitions(zone: str, year: int) -> list[tuple[dt.datetime, dt.timedelta, dt.timedelta]]:
    """(UTC instant, offset before, offset after) of every change of ``zone`` in ``year``."""
    tz = ZoneInfo(zone)
    out = []
    t = dt.datetime(year, 1, 1, tzinfo=UTC)
    before = t.astimezone(tz).utcoffset()
    while t.year == year:
        t2 = t + dt.timedelta(minutes=30)
        after = t2.astimezone(tz).utcoffset()
        if after != before:
            out.append((t2, before, after))
            before = after
        t = t2
    return out


def league(zone: str):
    base = load_league(sample_path("club_day.toml"))
    return dataclasses.replace(base, timezone=zone)


@pytest.mark.parametrize("zone", ["Europe/Berlin", "America/New_York", "Australia/Sydney"])
def test_ordinary_times_use_the_zone_offset(zone):
    lg = league(zone)
    tz = ZoneInfo(zone)
    for day in (dt.date(2027, 1, 15), dt.date(2027, 7, 15)):
        start = kickoff(lg, day, "19:30")
        assert start.tzinfo is not None
        assert (start.date(), start.time()) == (day, dt.time(19, 30))
        assert start.utcoffset() == dt.datetime(2027, day.month, 15, 19, 30, tzinfo=tz).utcoffset()
        assert start.astimezone(UTC).astimezone(tz) == start


@pytest.mark.parametrize("zone", ["Europe/Berlin", "America/New_York", "Australia/Sydney"])
def test_a_time_in_the_spring_gap_moves_forward_by_the_gap(zone):
    tz = ZoneInfo(zone)
    instant, before, after = next(t for t in transitions(zone, 2027) if t[2] > t[1])
    local_change = (instant + before).replace(tzinfo=None)  # wall clock just before the jump
    missing = local_change + (after - before) / 2  # a wall time that never shows
    assert (
        dt.datetime.combine(missing.date(), missing.time(), tzinfo=tz)
        .astimezone(UTC)
        .astimezone(tz)
        .replace(tzinfo=None)
        != missing
    )  # zoneinfo agrees this wall time does not exist
    start = local_datetime(missing.date(), missing.time(), tz)
    assert start.replace(tzinfo=None) == missing + (after - before)
    assert start.utcoffset() == after
    # Same instant as PEP 495's reading of the wall time with fold=0 (the offset before).
    assert start.astimezone(UTC) == (missing - before).replace(tzinfo=UTC)
    assert kickoff(league(zone), missing.date(), missing.time()) == start


@pytest.mark.parametrize("zone", ["Europe/Berlin", "America/New_York", "Australia/Sydney"])
def test_a_time_in_the_autumn_fold_is_the_first_occurrence(zone):
    tz = ZoneInfo(zone)
    instant, before, after = next(t for t in transitions(zone, 2027) if t[2] < t[1])
    local_change = (instant + after).replace(tzinfo=None)  # wall clock after falling back
    repeated = local_change + (before - after) / 2
    first = repeated.replace(tzinfo=tz, fold=0)
    second = repeated.replace(tzinfo=tz, fold=1)
    assert first.utcoffset() == before and second.utcoffset() == after
    start = local_datetime(repeated.date(), repeated.time(), tz)
    assert start.replace(tzinfo=None) == repeated
    assert start.utcoffset() == before
    assert start.astimezone(UTC) == first.astimezone(UTC)
    assert start.astimezone(UTC) < second.astimezone(UTC)


def test_default_slot_is_the_calendar_kickoff():
    lg = load_league(sample_path("county_double.toml"))
    start = kickoff(lg, dt.date(2027, 8, 14))
    assert start.time() == lg.calendar.kickoff
    assert start.tzinfo.key == "Europe/London"
    assert start == kickoff(lg, dt.date(2027, 8, 14), lg.calendar.kickoff)


def test_game_end_counts_elapsed_minutes_across_a_change():
    zone = "Europe/Berlin"
    tz = ZoneInfo(zone)
    instant, _before, after = next(t for t in transitions(zone, 2027) if t[2] < t[1])
    lg = league(zone)
    start = (instant - dt.timedelta(minutes=30)).astimezone(tz)
    end = game_end(lg, start)
    assert end.astimezone(UTC) - start.astimezone(UTC) == dt.timedelta(
        minutes=lg.calendar.game_minutes
    )
    assert end.utcoffset() == after


def test_slot_labels():
    assert parse_slot("19:30") == dt.time(19, 30)
    assert parse_slot(dt.time(9, 5)) == dt.time(9, 5)
    with pytest.raises(InputError):
        parse_slot("half past seven")
