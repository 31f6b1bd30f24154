"""Calendars after a re-plan, read back by two general-purpose iCalendar libraries.

RFC 5545 §3.8.4.7 (UID identifies an event across versions), §3.8.7.4 (SEQUENCE goes up when
an event changes), §3.8.1.11 (STATUS:CANCELLED), §3.8.7.2 (DTSTAMP). Parsers: ``icalendar``
(Calendar.from_ical) and ``ical`` (IcsCalendarStream, a stricter pydantic-based reader).
"""

from __future__ import annotations

import json
import re
import shutil

from ical.calendar_stream import IcsCalendarStream
from icalendar import Calendar
from typer.testing import CliRunner

from scheduler.cli import app
from tests.replan.conftest import LEAGUE, write_events

runner = CliRunner()


def raw_events(data: bytes) -> dict[str, bytes]:
    """UID -> the exact bytes of its VEVENT block (unfolded only to find the UID)."""
    out = {}
    for block in data.split(b"BEGIN:VEVENT")[1:]:
        block = block.split(b"END:VEVENT")[0]
        unfolded = block.replace(b"\r\n ", b"")
        uid = re.search(rb"\r\nUID:([^\r\n]+)", unfolded).group(1).decode()
        out[uid] = block
    return out


def key_of(event) -> tuple[str, str]:
    description = str(event["description"])
    return str(event["summary"]), description.split("\n")[1]


def test_replanned_calendars(season_dir, tmp_path):
    old_feed = (season_dir / "calendars" / "league.ics").read_bytes()
    old_json = json.loads((season_dir / "season.json").read_text(encoding="utf-8"))
    shutil.copy(season_dir / "season.json", tmp_path / "old.json")
    game = next(f for f in old_json["fixtures"] if f["round"] == 4)
    events = write_events(tmp_path, (
        f'[[postponed]]\nhome = "{game["home"]}"\naway = "{game["away"]}"\n'
        '[[withdrawn]]\nteam = "Marram Athletic"\npolicy = "keep_played"\n'))
    result = runner.invoke(app, ["replan", str(LEAGUE), "--season", str(season_dir),
                                 "--events", str(events)], catch_exceptions=False)
    assert result.exit_code == 0, result.output
    new_feed = (season_dir / "calendars" / "league.ics").read_bytes()
    new_json = json.loads((season_dir / "season.json").read_text(encoding="utf-8"))

    old_cal = {str(e["uid"]): e for e in Calendar.from_ical(old_feed).walk("VEVENT")}
    new_cal = {str(e["uid"]): e for e in Calendar.from_ical(new_feed).walk("VEVENT")}
    assert set(old_cal) <= set(new_cal)  # no UID lost: moved games keep their identity
    old_raw, new_raw = raw_events(old_feed), raw_events(new_feed)
    unchanged = {(f["home"], f["away"], f["round"]) for f in new_json["fixtures"]
                 if f in old_json["fixtures"]}
    counts = {"same": 0, "moved": 0, "cancelled": 0}
    for uid, old in old_cal.items():
        new = new_cal[uid]
        summary, where = key_of(old)
        home, away = summary.split(" v ")
        number = int(where.split(",")[0].removeprefix("Round "))
        if "Marram Athletic" in (home, away) and old["dtstart"].dt.date().isoformat() > \
                "2031-03-22":
            assert str(new["status"]) == "CANCELLED"
            assert int(new["sequence"]) == int(old["sequence"]) + 1
            assert new["dtstamp"].dt > old["dtstamp"].dt
            counts["cancelled"] += 1
        elif (home, away, number) in unchanged:
            assert new_raw[uid] == old_raw[uid]  # same bytes, same SEQUENCE and DTSTAMP
            counts["same"] += 1
        else:
            assert int(new["sequence"]) == int(old["sequence"]) + 1
            assert str(new["status"]) == "CONFIRMED"
            assert new["dtstamp"].dt > old["dtstamp"].dt
            counts["moved"] += 1
    assert counts["same"] > 0 and counts["moved"] >= 1 and counts["cancelled"] >= 1
    # the stricter reader accepts the updated feeds too
    for path in sorted((season_dir / "calendars").glob("*.ics")):
        calendar = IcsCalendarStream.calendar_from_ics(path.read_text(encoding="utf-8"))
        assert calendar.events
    parsed = IcsCalendarStream.calendar_from_ics(new_feed.decode("utf-8"))
    assert len(parsed.events) == len(new_cal)
