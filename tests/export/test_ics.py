"""iCalendar feeds checked against RFC 5545 (Desruisseaux 2009) and two independent parsers.

Parsers: ``icalendar`` (Calendar.from_ical) and ``ical`` (IcsCalendarStream, stricter, pydantic
based). Own checks cite the RFC section beside each assertion.
"""

from __future__ import annotations

import itertools
import re
from datetime import date, datetime, timedelta

import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st
from ical.calendar_stream import IcsCalendarStream
from icalendar import Calendar

from scheduler.errors import InputError
from scheduler.export.ics import (
    CalendarState,
    league_calendar,
    plan_calendar,
    team_calendar,
)
from tests.export.samples import FORMULA, TRICKY, drop_fixture, make_season, move_fixture

TEAMS = ("Ashford Rovers", TRICKY, FORMULA, "Dunmore Town")


def unfold(data: bytes) -> list[str]:
    """RFC 5545 §3.1: remove CRLF followed by one space or tab, then split at CRLF."""
    text = data.decode("utf-8")
    return re.sub(r"\r\n[ \t]", "", text).split("\r\n")


def components(lines: list[str], name: str) -> list[list[str]]:
    blocks, current = [], None
    for line in lines:
        if line == f"BEGIN:{name}":
            current = []
        elif line == f"END:{name}":
            blocks.append(current)
            current = None
        elif current is not None:
            current.append(line)
    return blocks


def prop(block: list[str], name: str) -> list[str]:
    return [ln for ln in block if re.match(rf"{name}[;:]", ln)]


def value(block: list[str], name: str) -> str:
    (line,) = prop(block, name)
    return line.split(":", 1)[1]


def check_rfc5545(data: bytes) -> list[list[str]]:
    """Our own structural checks; returns the VEVENT blocks."""
    # §3.1: every line ends with CRLF, no bare LF or CR.
    assert data.endswith(b"\r\n")
    assert b"\n" not in data.replace(b"\r\n", b"")
    assert b"\r" not in data.replace(b"\r\n", b"")
    # §3.1: lines SHOULD NOT be longer than 75 octets, excluding the line break.
    for physical in data.split(b"\r\n"):
        assert len(physical) <= 75, physical
        physical.decode("utf-8")  # folding never splits a UTF-8 sequence
    lines = unfold(data)
    assert lines[0] == "BEGIN:VCALENDAR" and lines[-2] == "END:VCALENDAR" and lines[-1] == ""
    (cal,) = [lines[1:-2]]
    top = [ln for ln in cal if not ln.startswith((" ",))]
    # §3.6: VERSION and PRODID exactly once; METHOD:PUBLISH (RFC 5546 §3.2.1).
    head = top[: top.index(next(ln for ln in top if ln.startswith("BEGIN:")))]
    assert prop(head, "VERSION") == ["VERSION:2.0"]
    assert len(prop(head, "PRODID")) == 1
    assert prop(head, "METHOD") == ["METHOD:PUBLISH"]
    assert prop(head, "CALSCALE") == ["CALSCALE:GREGORIAN"]
    events = components(lines, "VEVENT")
    zones = {value(z, "TZID") for z in components(lines, "VTIMEZONE")}
    for ev in events:
        # §3.6.1: UID, DTSTAMP required, once; DTSTART present; DTEND and DURATION not both.
        for name in ("UID", "DTSTAMP", "DTSTART", "DTEND", "SUMMARY", "SEQUENCE", "STATUS"):
            assert len(prop(ev, name)) == 1, (name, ev)
        assert not prop(ev, "DURATION")
        # §3.8.7.2: DTSTAMP in UTC.
        assert re.fullmatch(r"\d{8}T\d{6}Z", value(ev, "DTSTAMP"))
        # §3.2.19 / §3.6.5: every TZID used is defined by a VTIMEZONE.
        for line in prop(ev, "DTSTART") + prop(ev, "DTEND"):
            m = re.search(r";TZID=([^:;]+)", line)
            if m:
                assert m.group(1) in zones
    uids = [value(ev, "UID") for ev in events]
    assert len(uids) == len(set(uids))  # §3.8.4.7: unique
    return events


def parse_both(data: bytes):
    cal = Calendar.from_ical(data)
    strict = IcsCalendarStream.calendar_from_ics(data.decode("utf-8"))
    assert len(strict.events) == len(cal.walk("VEVENT"))
    return cal, strict


@pytest.fixture(scope="module")
def season():
    return make_season(TEAMS)


def test_league_feed_is_valid(season):
    data = league_calendar(season)
    events = check_rfc5545(data)
    assert len(events) == len(season.fixtures)
    cal, strict = parse_both(data)
    by_uid = {e.uid: e for e in strict.events}
    for ev in cal.walk("VEVENT"):
        start, end = ev.decoded("dtstart"), ev.decoded("dtend")
        assert end - start == timedelta(minutes=90)  # DTEND after DTSTART
        assert str(start.tzinfo) == "Europe/Brussels"
        # The strict parser reads the same instant.
        assert by_uid[str(ev["uid"])].dtstart == start
    starts = sorted(ev.decoded("dtstart") for ev in cal.walk("VEVENT"))
    assert starts == sorted(f.start for f in season.fixtures)


def test_text_escaping_round_trips(season):
    # §3.3.11: commas, semicolons, backslashes and newlines are escaped in TEXT values.
    data = league_calendar(season)
    cal, strict = parse_both(data)
    summaries = {str(ev["summary"]) for ev in cal.walk("VEVENT")}
    expected = {f"{f.home} v {f.away}" for f in season.fixtures}
    assert summaries == expected
    assert {e.summary for e in strict.events} == expected
    assert any(TRICKY in s for s in summaries)
    locations = {str(ev["location"]) for ev in cal.walk("VEVENT")}
    assert f"{TRICKY} Ground (Pitch 1)" in locations or f"{TRICKY} Ground (Pitch 2)" in locations


def test_feeds_are_byte_identical_between_runs(season):
    again = make_season(TEAMS)
    assert league_calendar(season) == league_calendar(again)
    for team in TEAMS:
        assert team_calendar(season, team) == team_calendar(again, team)


def uid_map(data: bytes) -> dict[tuple[str, int], str]:
    """(summary, leg) -> UID: the pair and leg identify a game in a double round robin."""
    out = {}
    for ev in Calendar.from_ical(data).walk("VEVENT"):
        leg = int(re.search(r"leg (\d+)", str(ev["description"])).group(1))
        out[(str(ev["summary"]), leg)] = str(ev["uid"])
    return out


def test_uids_stable_and_independent_of_round(season):
    first = uid_map(league_calendar(season))
    assert first == uid_map(league_calendar(make_season(TEAMS, revision="other")))
    # Swap two rounds: every game keeps its UID (UID does not use the round number).
    swapped = []
    for f in season.fixtures:
        number = {1: 2, 2: 1}.get(f.round, f.round)
        swapped.append(type(f)(**{**{k: getattr(f, k) for k in f.__slots__}, "round": number}))
    other = type(season)(**{**season.__dict__, "fixtures": tuple(swapped)})
    assert uid_map(league_calendar(other)) == first


def events_by_uid(data: bytes):
    return {str(ev["uid"]): ev for ev in Calendar.from_ical(data).walk("VEVENT")}


def test_moved_fixture_gets_higher_sequence_and_new_dtstamp(season):
    # RFC 5545 §3.8.7.4: SEQUENCE is incremented when the event is revised; RFC 5546 §2.1.4.
    old = events_by_uid(league_calendar(season))
    moved = move_fixture(season, 3, 1, revision="r2")
    new_data = league_calendar(moved, previous=season)
    check_rfc5545(new_data)
    new = events_by_uid(new_data)
    assert set(new) == set(old)  # the moved game kept its UID, nothing duplicated
    changed = [u for u in new if new[u].decoded("dtstart") != old[u].decoded("dtstart")]
    assert len(changed) == 1
    (uid,) = changed
    assert new[uid].decoded("dtstart") - old[uid].decoded("dtstart") == timedelta(days=1)
    assert int(new[uid]["sequence"]) == int(old[uid]["sequence"]) + 1
    assert new[uid].decoded("dtstamp") > old[uid].decoded("dtstamp")
    for u in new:
        assert int(new[u]["sequence"]) >= int(old[u]["sequence"])
        if u != uid:  # untouched games are republished exactly as before
            assert new[u].to_ical() == old[u].to_ical()


def test_sequence_never_decreases_over_many_replans(season):
    state = plan_calendar(season)
    published = [events_by_uid(league_calendar(season, state=state))]
    current = season
    # Move the same game back and forth: with the state file its SEQUENCE keeps rising.
    for step in range(1, 5):
        nxt = move_fixture(current, 0, 1 if step % 2 else -1, revision=f"r{step + 1}")
        text = state.to_json()
        state = plan_calendar(nxt, current, CalendarState.from_json(text))
        published.append(events_by_uid(league_calendar(nxt, state=state)))
        current = nxt
    for before, after in itertools.pairwise(published):
        for uid, ev in after.items():
            assert int(ev["sequence"]) >= int(before[uid]["sequence"])
            if ev.decoded("dtstart") != before[uid].decoded("dtstart"):
                assert int(ev["sequence"]) > int(before[uid]["sequence"])
                assert ev.decoded("dtstamp") > before[uid].decoded("dtstamp")
    moved_uid = next(u for u in published[-1] if int(published[-1][u]["sequence"]) > 0)
    assert [int(p[moved_uid]["sequence"]) for p in published] == [0, 1, 2, 3, 4]


def test_removed_fixture_is_cancelled(season):
    removed = season.fixtures[2]
    later = drop_fixture(season, 2, revision="r2")
    data = league_calendar(later, previous=season)
    check_rfc5545(data)
    cal, strict = parse_both(data)
    cancelled = [ev for ev in cal.walk("VEVENT") if str(ev["status"]) == "CANCELLED"]
    assert len(cancelled) == 1
    assert str(cancelled[0]["summary"]) == f"{removed.home} v {removed.away}"
    assert int(cancelled[0]["sequence"]) == 1
    assert cancelled[0].decoded("dtstart") == removed.start
    assert [e.status for e in strict.events].count("CANCELLED") == 1
    # The team feeds of both teams carry the cancellation, the others do not.
    for team in TEAMS:
        team_cal = Calendar.from_ical(team_calendar(later, team, previous=season))
        statuses = [str(e["status"]) for e in team_cal.walk("VEVENT")]
        assert statuses.count("CANCELLED") == (1 if team in removed.teams else 0)


def test_team_feed_with_byes():
    odd = make_season(("North", "South", "East", "West", "Centre"))
    for team in odd.teams:
        data = team_calendar(odd, team)
        events = check_rfc5545(data)
        cal, _ = parse_both(data)
        games = [e for e in cal.walk("VEVENT") if " v " in str(e["summary"])]
        byes = [e for e in cal.walk("VEVENT") if "bye" in str(e["summary"])]
        assert len(games) == len(odd.fixtures_of(team))
        assert len(byes) == sum(team in t for t in odd.byes.values())
        for bye in byes:  # all-day (VALUE=DATE) and shown as free time
            assert isinstance(bye.decoded("dtstart"), date)
            assert not isinstance(bye.decoded("dtstart"), datetime)
            assert str(bye["transp"]) == "TRANSPARENT"
        assert len(events) == len(games) + len(byes)
        for ev in games:
            assert team in str(ev["summary"]).split(" v ")
    # A team feed shares UIDs with the league feed.
    league_uids = set(events_by_uid(league_calendar(odd)))
    team_game_uids = {
        u
        for u, e in events_by_uid(team_calendar(odd, "North")).items()
        if " v " in str(e["summary"])
    }
    assert team_game_uids <= league_uids


def test_unknown_team_is_a_clear_error(season):
    with pytest.raises(InputError, match="no team called"):
        team_calendar(season, "Nobody FC")


def test_state_file_round_trip_and_bad_file(season):
    state = plan_calendar(season)
    assert CalendarState.from_json(state.to_json()) == state
    with pytest.raises(InputError, match="calendar state"):
        CalendarState.from_json('{"format": "something else"}', location="x.json")


def test_fixed_offset_and_dateless_fixtures():
    # A start with a fixed UTC offset and no league zone is written in UTC (RFC 5545 §3.3.5
    # form 2); a fixture with a date but no kick-off is an all-day event (§3.6.1 VALUE=DATE);
    # a fixture without any date is left out.
    from dataclasses import replace
    from datetime import timezone

    base = make_season(("North", "South", "East", "West"), timezone=None)
    offset = timezone(timedelta(hours=2))
    fixtures = list(base.fixtures)
    fixtures[0] = replace(fixtures[0], start=fixtures[0].start.replace(tzinfo=offset))
    fixtures[1] = replace(fixtures[1], start=None)
    fixtures[2] = replace(fixtures[2], start=None, date=None)
    season = replace(base, fixtures=tuple(fixtures))
    data = league_calendar(season)
    events = check_rfc5545(data)
    assert len(events) == len(fixtures) - 1
    cal, _ = parse_both(data)
    summary = f"{fixtures[0].home} v {fixtures[0].away}"
    (first,) = [
        e
        for e in cal.walk("VEVENT")
        if str(e["summary"]) == summary and "leg 1" in str(e["description"])
    ]
    assert first.decoded("dtstart").utcoffset() == timedelta(0)
    assert first.decoded("dtstart") == fixtures[0].start
    all_day = [e for e in cal.walk("VEVENT") if not isinstance(e.decoded("dtstart"), datetime)]
    assert [e.decoded("dtstart") for e in all_day] == [fixtures[1].date]
    assert all_day[0].decoded("dtend") == fixtures[1].date + timedelta(days=1)


@settings(max_examples=40, deadline=None)
@given(st.text(st.characters(exclude_categories=("Cs",)), min_size=1, max_size=30))
@example("a\r\nb;c,d\\e")
@example("\x07bell")
@example("é" * 30)
def test_any_team_name_gives_a_valid_feed(name):
    # Property check of RFC 5545 §3.1 / §3.3.11 over arbitrary names: the feed stays valid for
    # both parsers and the name comes back exactly, except that line breaks become LF and other
    # control characters (not allowed in TEXT) become U+FFFD.
    others = [t for t in ("North", "South", "East") if t != name]
    teams = (name, *others[:3]) if len(others) >= 3 else (name, "Alpha", "Beta", "Gamma")
    if len(set(teams)) < 4:
        return
    season = make_season(teams, legs=1)
    data = team_calendar(season, name)
    check_rfc5545(data)
    cal, strict = parse_both(data)
    expected = re.sub(r"[\x00-\x08\x0b-\x1f\x7f]", "\ufffd",
                      name.replace("\r\n", "\n").replace("\r", "\n"))  # fmt: skip
    opponents = {t for t in teams if t != name}
    for ev in cal.walk("VEVENT"):
        summary = str(ev["summary"])
        assert summary in {f"{expected} v {o}" for o in opponents} | {
            f"{o} v {expected}" for o in opponents
        }
    assert {e.summary for e in strict.events} == {str(e["summary"]) for e in cal.walk("VEVENT")}


# --------------------------------------------------------------------------- address, sides


def _with_places(season, *, side: bool):
    from dataclasses import replace as _replace

    venue = next(f.venue for f in season.fixtures if f.venue)
    return (
        _replace(
            season,
            venue_addresses={venue: "12 Ferncombe Lane, Marlwick"},
            venue_coordinates={venue: (51.4875, -0.1234)},
            home_meaning="side" if side else "venue",
            side_labels=("White", "Black") if side else ("Home", "Away"),
        ),
        venue,
    )


@pytest.mark.parametrize("side", [False, True])
def test_address_geo_and_sides_read_back_by_two_parsers(season, side):
    # RFC 5545 §3.8.1.7 LOCATION (text), §3.8.1.6 GEO (latitude;longitude as floats),
    # §3.8.1.12 SUMMARY; read back by icalendar and by the stricter ical package.
    placed, venue = _with_places(season, side=side)
    data = league_calendar(placed)
    events = Calendar.from_ical(data).walk("VEVENT")
    at_venue = [ev for ev in events if str(ev["location"]).startswith(venue)]
    assert at_venue and all(
        str(ev["location"]).endswith(", 12 Ferncombe Lane, Marlwick") for ev in at_venue
    )
    for ev in at_venue:
        geo = ev["geo"]
        assert (geo.latitude, geo.longitude) == (51.4875, -0.1234)
        assert "Address: 12 Ferncombe Lane, Marlwick" in str(ev["description"])
    elsewhere = [ev for ev in events if ev not in at_venue]
    assert all("geo" not in ev and "Ferncombe" not in str(ev["location"]) for ev in elsewhere)
    strict = IcsCalendarStream.calendar_from_ics(data.decode("utf-8"))
    by_uid = {e.uid: e for e in strict.events}
    for ev in events:
        other = by_uid[str(ev["uid"])]
        assert other.summary == str(ev["summary"])
        assert other.location == str(ev["location"])
        if "geo" in ev:
            assert (other.geo.lat, other.geo.lng) == (51.4875, -0.1234)
    for f in placed.fixtures:
        summary = (
            f"{f.home} (White) v {f.away} (Black)" if side else f"{f.home} v {f.away}"
        )
        assert any(str(ev["summary"]) == summary for ev in events), summary
    first = events[0]
    description = str(first["description"])
    if side:
        assert "White: " in description and "Black: " in description
    else:
        assert "Home: " in description and "(hosts)" in description


def test_feeds_without_addresses_keep_their_event_digests(season):
    # A league with no address gives the same calendar state as before addresses existed:
    # a re-plan of an unchanged league must not bump any SEQUENCE (RFC 5546 §2.1.5).
    first = plan_calendar(season)
    placed, _ = _with_places(season, side=False)
    moved = plan_calendar(placed, season, first)
    changed = {u for u, e in moved.events.items() if e.sequence > first.events[u].sequence}
    assert changed and all("address" in moved.events[u].record for u in changed)
    again = plan_calendar(season, season, first)
    assert all(e.sequence == first.events[u].sequence for u, e in again.events.items())
