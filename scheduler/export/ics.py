"""iCalendar feeds of a season (RFC 5545, Desruisseaux 2009; publishing per RFC 5546 iTIP).

One feed for the league (every game) and one per team (its games and, as all-day "free"
events, its byes). Written with the ``icalendar`` package, which does the content-line work of
RFC 5545 §3.1 (CRLF line ends, folding at 75 octets without splitting a UTF-8 character) and the
TEXT escaping of §3.3.11 (backslash, semicolon, comma, newline).

Stable identity and updates (RFC 5545 §3.8.4.7 UID, §3.8.7.2 DTSTAMP, §3.8.7.4 SEQUENCE; RFC 5546
§2.1.5 on how a calendar program orders revisions of one event by SEQUENCE, then DTSTAMP):

* **UID** = a SHA-256 digest of (league, season id, leg, the unordered pair of teams, and which
  meeting of that pair inside the leg it is) ``@roundrobin-scheduler.invalid``. The round number
  is not part of it, so a fixture moved to another round or date keeps its UID and calendar
  programs update it instead of adding a copy. (``.invalid`` is reserved by RFC 2606 and can
  never be somebody else's domain.)
* **DTSTAMP** is never the clock (outputs must be byte-identical for the same input). A first
  publication stamps every event with a fixed UTC time derived from the season (league, season
  id, plan revision). When a later plan changes an event, its DTSTAMP becomes a new time derived
  from the new revision and always later than the event's previous DTSTAMP.
* **SEQUENCE** starts at 0 and goes up by one each time the event changes (time, date, venue,
  court, slot, home/away, round). It never goes down: the numbers published last time are kept
  in a small state file beside the feeds (:class:`CalendarState`, ``calendars/.sequence.json``
  when :mod:`scheduler.export.bundle` writes them). Without that file the previous
  ``season.json`` alone is used, as if it had been a first publication.
* A game (or bye) that the previous plan had and the new one has not is published once more
  with ``STATUS:CANCELLED`` and a higher SEQUENCE, so subscribed calendars remove it. Cancelled
  events stay in the feed (and in the state file) from then on.

Times: a kick-off in an IANA zone is written with ``TZID=`` and the feed gets a matching
VTIMEZONE from ``Calendar.add_missing_timezones`` (RFC 5545 §3.2.19, §3.6.5), limited to the years
the season spans. A fixture with a date but no kick-off time becomes an all-day event; a fixture
without any date is left out of the feeds (there is nothing to put in a calendar).
"""

from __future__ import annotations

import hashlib
import json
import re
from collections import Counter
from collections.abc import Iterable, Mapping
from dataclasses import dataclass, field, replace
from datetime import UTC, date, datetime, timedelta
from typing import SupportsInt, cast
from zoneinfo import ZoneInfo

from icalendar import Calendar, Event, vText

from scheduler.errors import InputError
from scheduler.export.csv_out import league_zone, local_start
from scheduler.export.safety import name_digest, safe_filenames
from scheduler.season import Fixture, Season

PRODID = "-//roundrobin-scheduler//Season calendars 1.0//EN"
"""Our product identifier (RFC 5545 §3.7.3)."""

UID_DOMAIN = "roundrobin-scheduler.invalid"
STATE_FORMAT = "roundrobin-scheduler calendar state"
STATE_VERSION = 1
DEFAULT_GAME_MINUTES = 90

_STAMP_EPOCH = datetime(2000, 1, 1, tzinfo=UTC)
_STAMP_SPAN = 20 * 365 * 86400  # 2000-2019: never a future time


# --------------------------------------------------------------------------- state


@dataclass(frozen=True, slots=True)
class EventState:
    """What was last published for one UID.

    Parameters
    ----------
    sequence
        Its SEQUENCE (RFC 5545 §3.8.7.4), 0 at first publication, raised on each change.
    dtstamp
        Its DTSTAMP (UTC), derived from the plan revision, never from the clock.
    digest
        SHA-256 of its content, to tell a changed event from an unchanged one.
    status
        ``"CONFIRMED"`` or ``"CANCELLED"``.
    record
        The event data, kept so that a removed event can be published as cancelled.
    """

    sequence: int
    dtstamp: datetime
    digest: str
    status: str
    record: Mapping[str, object]


@dataclass(frozen=True)
class CalendarState:
    """Per-UID publication state of one season's feeds.

    Parameters
    ----------
    league
        The league's name.
    season_id
        The season's id.
    events
        UID -> what was last published for it.

    See Also
    --------
    plan_calendar

    Examples
    --------
    >>> from datetime import date
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"),
    ...                 (Fixture(1, "Ash", "Elm", date=date(2031, 3, 4)),))
    >>> state = plan_calendar(season)
    >>> [event.sequence for event in state.events.values()]
    [0]
    >>> CalendarState.from_json(state.to_json()) == state
    True
    """

    league: str
    season_id: str
    events: Mapping[str, EventState] = field(default_factory=dict)

    def to_json(self) -> str:
        """Stable JSON text (sorted keys, UTF-8 safe, newline at the end).

        Returns
        -------
        str
            The state file's text, read back by :meth:`from_json`.
        """
        data = {
            "format": STATE_FORMAT,
            "version": STATE_VERSION,
            "league": self.league,
            "season_id": self.season_id,
            "events": {
                uid: {
                    "sequence": e.sequence,
                    "dtstamp": e.dtstamp.strftime("%Y-%m-%dT%H:%M:%SZ"),
                    "digest": e.digest,
                    "status": e.status,
                    "record": dict(e.record),
                }
                for uid, e in sorted(self.events.items())
            },
        }
        return json.dumps(data, ensure_ascii=False, sort_keys=True, indent=1) + "\n"

    @classmethod
    def from_json(cls, text: str, *, location: str | None = None) -> CalendarState:
        """Read :meth:`to_json` text back.

        Parameters
        ----------
        text
            The state file's text.
        location
            The file, for the message.

        Returns
        -------
        CalendarState
            The state it holds.

        Raises
        ------
        InputError
            Text that is not a calendar state file of this program.
        """
        try:
            data = json.loads(text)
            if data.get("format") != STATE_FORMAT or data.get("version") != STATE_VERSION:
                raise ValueError("not a calendar state file of this program")
            events = {}
            for uid, e in data["events"].items():
                stamp = datetime.strptime(e["dtstamp"], "%Y-%m-%dT%H:%M:%SZ").replace(tzinfo=UTC)
                sequence = int(e["sequence"])
                if sequence < 0 or e["status"] not in ("CONFIRMED", "CANCELLED"):
                    raise ValueError(f"bad entry for {uid}")
                events[str(uid)] = EventState(
                    sequence, stamp, str(e["digest"]), e["status"], dict(e["record"])
                )
            return cls(str(data["league"]), str(data["season_id"]), events)
        except (ValueError, KeyError, TypeError, AttributeError) as exc:
            raise InputError(f"unreadable calendar state: {exc}", location=location) from exc


# --------------------------------------------------------------------------- events


def _hash(*parts: object) -> str:
    text = "\x1f".join(str(p) for p in parts)
    return hashlib.sha256(text.encode("utf-8")).hexdigest()


def plan_stamp(season: Season) -> datetime:
    """The fixed DTSTAMP of a first publication of ``season``: a UTC second derived from the
    league, season id and plan revision (never the clock).

    Parameters
    ----------
    season
        The season.

    Returns
    -------
    datetime.datetime
        An aware UTC datetime; the same for the same league, season id and revision.

    References
    ----------
    RFC 5545 §3.8.7.2 (DTSTAMP); ``docs/outputs.md``.

    Examples
    --------
    >>> from scheduler.season import Season
    >>> stamp = plan_stamp(Season("Demo", "2031", (), (), revision="abc"))
    >>> stamp == plan_stamp(Season("Demo", "2031", (), (), revision="abc")), stamp.tzname()
    (True, 'UTC')
    """
    offset = int(_hash(season.league, season.season_id, season.revision)[:12], 16) % _STAMP_SPAN
    return _STAMP_EPOCH + timedelta(seconds=offset)


def _event_start(fixture: Fixture, season: Season) -> datetime | date | None:
    """DTSTART value: zone-aware local time, UTC, floating, or a date for an all-day event."""
    zone = league_zone(season)
    start = local_start(fixture, zone)
    if start is None:
        return fixture.date
    if start.tzinfo is None:
        return start.replace(tzinfo=zone) if zone is not None else start
    if isinstance(start.tzinfo, ZoneInfo):
        return start
    return start.astimezone(UTC)


def _start_record(value: datetime | date | None) -> dict[str, str | None]:
    if value is None:
        return {"start": None, "tz": None}
    if isinstance(value, datetime):
        tz = None
        if isinstance(value.tzinfo, ZoneInfo):
            tz = value.tzinfo.key
        elif value.tzinfo is not None:
            tz = "UTC"
        return {"start": value.replace(tzinfo=None).isoformat(), "tz": tz}
    return {"start": value.isoformat(), "tz": "date"}


def _start_from_record(record: Mapping[str, object]) -> datetime | date | None:
    start, tz = record.get("start"), record.get("tz")
    if start is None:
        return None
    if tz == "date":
        return date.fromisoformat(str(start))
    value = datetime.fromisoformat(str(start))
    if tz == "UTC":
        return value.replace(tzinfo=UTC)
    if tz:
        return value.replace(tzinfo=ZoneInfo(str(tz)))
    return value


def _fixture_records(season: Season, minutes: int) -> dict[str, dict[str, object]]:
    """UID -> event record of every game that can go into a calendar."""
    meetings: Counter[tuple[int, str, str]] = Counter()
    records: dict[str, dict[str, object]] = {}
    ordered = sorted(
        season.fixtures, key=lambda f: (f.leg, f.round, f.home, f.away, f.court or "", f.slot or "")
    )
    for f in ordered:
        a, b = sorted((f.home, f.away))
        meetings[(f.leg, a, b)] += 1
        uid = (
            _hash("game", season.league, season.season_id, f.leg, a, b, meetings[(f.leg, a, b)])[
                :32
            ]
            + "@"
            + UID_DOMAIN
        )
        start = _event_start(f, season)
        if start is None:
            continue
        records[uid] = {
            "kind": "game",
            "round": f.round,
            "leg": f.leg,
            "home": f.home,
            "away": f.away,
            "venue": f.venue,
            "court": f.court,
            "slot": f.slot,
            "minutes": minutes if isinstance(start, datetime) else None,
            **_start_record(start),
        }
        # Only when known, so that feeds of leagues without addresses keep their digests.
        if f.venue and season.venue_addresses.get(f.venue):
            records[uid]["address"] = season.venue_addresses[f.venue]
        if f.venue and f.venue in season.venue_coordinates:
            latitude, longitude = season.venue_coordinates[f.venue]
            records[uid]["geo"] = [float(latitude), float(longitude)]
    return records


def _bye_records(season: Season) -> dict[str, dict[str, object]]:
    """UID -> record of every bye on a known match day (the round's earliest game date)."""
    zone = league_zone(season)
    round_day: dict[int, date] = {}
    for f in season.fixtures:
        start = local_start(f, zone)
        day = f.date if f.date is not None else (start.date() if start else None)
        if day is not None and (f.round not in round_day or day < round_day[f.round]):
            round_day[f.round] = day
    count: Counter[str] = Counter()
    records: dict[str, dict[str, object]] = {}
    for number in sorted(season.byes):
        for team in sorted(season.byes[number]):
            count[team] += 1
            day = round_day.get(number)
            if day is None:
                continue
            uid = (
                _hash("bye", season.league, season.season_id, team, count[team])[:32]
                + "@"
                + UID_DOMAIN
            )
            records[uid] = {"kind": "bye", "round": number, "team": team, **_start_record(day)}
    return records


def _digest(record: Mapping[str, object]) -> str:
    return _hash(json.dumps(record, sort_keys=True, ensure_ascii=False))[:16]


def _records(season: Season, minutes: int) -> dict[str, dict[str, object]]:
    return {**_fixture_records(season, minutes), **_bye_records(season)}


def plan_calendar(
    season: Season,
    previous: Season | None = None,
    previous_meta: CalendarState | None = None,
    *,
    game_minutes: int = DEFAULT_GAME_MINUTES,
) -> CalendarState:
    """The publication state of ``season``'s feeds, given what was published before.

    ``previous_meta`` (the state written last time) wins over ``previous`` (the last
    ``season.json``); with neither, this is a first publication. See the module docstring for
    the rules; the result never lowers a SEQUENCE that ``previous_meta`` holds.

    Parameters
    ----------
    season
        The season to publish.
    previous
        The season published before (its ``season.json``), or ``None``.
    previous_meta
        The calendar state written last time, or ``None``.
    game_minutes
        Length of each event.

    Returns
    -------
    CalendarState
        UIDs, SEQUENCE numbers and cancelled games of every event.

    References
    ----------
    RFC 5545 §3.8.4.7 (UID), §3.8.7.4 (SEQUENCE).

    Examples
    --------
    A kick-off moved by an hour raises that game's SEQUENCE only:

    >>> from datetime import date, datetime
    >>> from zoneinfo import ZoneInfo
    >>> from scheduler.season import Fixture, Season
    >>> def demo(minute):
    ...     start = datetime(2031, 3, 4, 19, minute, tzinfo=ZoneInfo("Europe/London"))
    ...     games = (Fixture(1, "Ash", "Elm", date=date(2031, 3, 4)),
    ...              Fixture(2, "Elm", "Ash", date=date(2031, 3, 4), start=start))
    ...     return Season("Demo", "2031", ("Ash", "Elm"), games, revision=str(minute))
    >>> first = plan_calendar(demo(0))
    >>> second = plan_calendar(demo(30), previous_meta=first)
    >>> sorted(event.sequence for event in second.events.values())
    [0, 1]
    """
    base = plan_stamp(season)
    before: dict[str, EventState] = {}
    if previous is not None:
        old_stamp = plan_stamp(previous)
        for uid, rec in _records(previous, game_minutes).items():
            before[uid] = EventState(0, old_stamp, _digest(rec), "CONFIRMED", rec)
    if previous_meta is not None:
        before.update(previous_meta.events)

    def bumped(old: EventState) -> datetime:
        return max(base, old.dtstamp + timedelta(seconds=1))

    events: dict[str, EventState] = {}
    for uid, rec in _records(season, game_minutes).items():
        digest = _digest(rec)
        old = before.get(uid)
        if old is None:
            events[uid] = EventState(0, base, digest, "CONFIRMED", rec)
        elif old.digest == digest and old.status == "CONFIRMED":
            events[uid] = replace(old, record=rec)
        else:
            events[uid] = EventState(old.sequence + 1, bumped(old), digest, "CONFIRMED", rec)
    for uid, old in before.items():
        if uid in events:
            continue
        if old.status == "CANCELLED":
            events[uid] = old
        else:
            events[uid] = EventState(
                old.sequence + 1, bumped(old), old.digest, "CANCELLED", old.record
            )
    return CalendarState(season.league, season.season_id, events)


# --------------------------------------------------------------------------- file names

_STEM_SLUG_MAX = 40
_STEM_TAIL = 14


def _full_slug(name: str) -> str:
    import unicodedata

    ascii_text = unicodedata.normalize("NFKD", name).encode("ascii", "ignore").decode("ascii")
    return re.sub(r"[^a-z0-9]+", "-", ascii_text.lower()).strip("-")


def team_file_stems(names: Iterable[str]) -> dict[str, str]:
    """File-name stems of team feeds that keep the distinguishing end of long names.

    The stems are those of :func:`scheduler.export.safety.safe_filenames` (unique, safe on
    every file system, a hash of the name added whenever the stem is not the name itself);
    where that cut a long name short at its end, the middle of the name gives way instead, so
    "Marlwick and District Saturday League Girls A" and "... Girls B" give
    ``marlwick-and-district-sa--league-girls-a-<hash>`` and ``...-girls-b-<hash>``.

    Parameters
    ----------
    names
        The team names (distinct).

    Returns
    -------
    dict
        Name -> file-name stem (without ``.ics``).

    Examples
    --------
    >>> stems = team_file_stems(["Marlwick and District Saturday League Girls A"])
    >>> stems["Marlwick and District Saturday League Girls A"][:-9]
    'marlwick-and-district-sa--league-girls-a'
    """
    stems = safe_filenames(names)
    out: dict[str, str] = {}
    for name, stem in stems.items():
        slug = _full_slug(name)
        if len(slug) > _STEM_SLUG_MAX and "-" in stem:
            digest = stem.rsplit("-", 1)[1]
            head = slug[: _STEM_SLUG_MAX - _STEM_TAIL - 2].rstrip("-")
            tail = slug[-_STEM_TAIL:].lstrip("-")
            stem = f"{head}--{tail}-{digest}"
        out[name] = stem
    return out


# --------------------------------------------------------------------------- feeds


_CONTROLS = re.compile(r"[\x00-\x08\x0b-\x1f\x7f]")


def ical_text(value: object) -> str:
    """A TEXT value RFC 5545 §3.3.11 allows: line breaks become LF (escaped as ``\\n`` by
    icalendar) and other control characters, which TEXT may not hold, become U+FFFD.

    Parameters
    ----------
    value
        Any value; written with :class:`str`.

    Returns
    -------
    str
        The text, safe for a TEXT property.

    References
    ----------
    RFC 5545 §3.3.11 (TEXT).

    Examples
    --------
    >>> ical_text("Hall\\r\\nCourt 2\\x07")
    'Hall\\nCourt 2\\ufffd'
    """
    text = str(value).replace("\r\n", "\n").replace("\r", "\n")
    return _CONTROLS.sub("\ufffd", text)


def _location(record: Mapping[str, object]) -> str | None:
    """LOCATION (RFC 5545 §3.8.1.7): venue, court in brackets, then the postal address, so a
    calendar program can offer directions: ``"Harrowfen Fields (North Pitch), Ferncombe Lane,
    Marlwick"``."""
    venue, court, address = record.get("venue"), record.get("court"), record.get("address")
    place = str(venue) if venue else ""
    if court:
        place = f"{place} ({court})" if place else str(court)
    parts = [p for p in (place, str(address) if address else "") if p]
    return ical_text(", ".join(parts)) if parts else None


def _sides(season: Season) -> tuple[str, str] | None:
    """The league's side labels when "home" is a side or colour (``None`` otherwise)."""
    return season.side_labels if season.home_meaning == "side" else None


def game_summary(record: Mapping[str, object], season: Season) -> str:
    """SUMMARY of a game: ``"Home v Away"`` (the home team first, the trade's convention), or
    with the sides named when "home" is a side: ``"Upper Foxley (White) v Sorrel Street
    (Black)"``.

    Parameters
    ----------
    record
        The event data of a game (``home`` and ``away`` at least).
    season
        The season (what "home" means, its side labels).

    Returns
    -------
    str
        The SUMMARY text (RFC 5545 §3.8.1.12).

    Examples
    --------
    >>> from scheduler.season import Season
    >>> game_summary({"home": "Ash", "away": "Elm"}, Season("Demo", "2031", (), ()))
    'Ash v Elm'
    """
    sides = _sides(season)
    if sides is None:
        return f"{record['home']} v {record['away']}"
    return f"{record['home']} ({sides[0]}) v {record['away']} ({sides[1]})"


def _event(uid: str, state: EventState, season: Season) -> Event:
    rec = state.record
    start = _start_from_record(rec)
    assert start is not None, "every calendar record has a start (undated games are left out)"
    event = Event()
    event.add("uid", uid)
    event.add("dtstamp", state.dtstamp)
    event.add("sequence", state.sequence)
    event.add("status", state.status)
    if rec.get("kind") == "bye":
        event.add("summary", ical_text(f"{rec['team']}: bye (round {rec['round']})"))
        event.add("dtstart", start)
        event.add("dtend", start + timedelta(days=1))
        event.add("transp", "TRANSPARENT")
        event.add(
            "description",
            ical_text(f"{season.league} {season.season_id}\nRound {rec['round']}: no game"),
        )
        return event
    event.add("summary", ical_text(game_summary(rec, season)))
    event.add("dtstart", start)
    if isinstance(start, datetime):
        minutes = cast(SupportsInt, rec.get("minutes") or 0)
        event.add("dtend", start + timedelta(minutes=int(minutes)))
    else:
        event.add("dtend", start + timedelta(days=1))
    location = _location(rec)
    if location:
        event.add("location", location)
    geo = rec.get("geo")
    if isinstance(geo, list | tuple) and len(geo) == 2:
        # GEO (RFC 5545 §3.8.1.6): latitude;longitude in decimal degrees.
        event.add("geo", (float(geo[0]), float(geo[1])))
    lines = [f"{season.league} {season.season_id}", f"Round {rec['round']}, leg {rec['leg']}"]
    sides = _sides(season)
    if sides is not None:
        lines.append(f"{sides[0]}: {rec['home']}")
        lines.append(f"{sides[1]}: {rec['away']}")
    else:
        lines.append(f"Home: {rec['home']} (hosts)")
        lines.append(f"Away: {rec['away']}")
    if rec.get("venue"):
        lines.append(f"Venue: {rec['venue']}")
    if rec.get("address"):
        lines.append(f"Address: {rec['address']}")
    if rec.get("slot"):
        lines.append(f"Slot: {rec['slot']}")
    if rec.get("court"):
        lines.append(f"Court: {rec['court']}")
    event.add("description", ical_text("\n".join(lines)))
    return event


def _sort_key(item: tuple[str, EventState]):
    uid, state = item
    start = _start_from_record(state.record)
    if isinstance(start, datetime):
        moment = start.astimezone(UTC) if start.tzinfo else start.replace(tzinfo=UTC)
    elif isinstance(start, date):
        moment = datetime(start.year, start.month, start.day, tzinfo=UTC)
    else:
        moment = datetime.min.replace(tzinfo=UTC)
    return (moment, state.status != "CONFIRMED", uid)


def _calendar(name: str, season: Season, items: Iterable[tuple[str, EventState]]) -> bytes:
    cal = Calendar()
    cal.add("prodid", PRODID)
    cal.add("version", "2.0")
    cal.add("calscale", "GREGORIAN")
    cal.add("method", "PUBLISH")
    # A calendar's display name (a common extension, not in RFC 5545) is one line of TEXT.
    cal.add("x-wr-calname", vText(" ".join(ical_text(name).split())))
    years: list[int] = []
    for uid, state in sorted(items, key=_sort_key):
        cal.add_component(_event(uid, state, season))
        start = _start_from_record(state.record)
        if isinstance(start, date):
            years.append(start.year)
    if years:
        cal.add_missing_timezones(
            first_date=date(min(years), 1, 1), last_date=date(max(years) + 1, 1, 1)
        )
    return cal.to_ical()


def _resolve_state(season, previous, previous_meta, game_minutes, state) -> CalendarState:
    if state is not None:
        return state
    return plan_calendar(season, previous, previous_meta, game_minutes=game_minutes)


def league_calendar(
    season: Season,
    previous: Season | None = None,
    previous_meta: CalendarState | None = None,
    *,
    game_minutes: int = DEFAULT_GAME_MINUTES,
    state: CalendarState | None = None,
) -> bytes:
    """The league feed: every game (and every cancelled game) as RFC 5545 bytes.

    ``state`` (from :func:`plan_calendar`) may be passed to share one plan among many feeds.

    Parameters
    ----------
    season
        The season.
    previous, previous_meta
        As for :func:`plan_calendar` (ignored when ``state`` is given).
    game_minutes
        Length of each event.
    state
        A state from :func:`plan_calendar`.

    Returns
    -------
    bytes
        The iCalendar stream.

    References
    ----------
    RFC 5545 (iCalendar).

    Examples
    --------
    >>> from datetime import date
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"),
    ...                 (Fixture(1, "Ash", "Elm", date=date(2031, 3, 4)),
    ...                  Fixture(2, "Elm", "Ash", date=date(2031, 3, 11))))
    >>> feed = league_calendar(season)
    >>> feed.startswith(b"BEGIN:VCALENDAR\\r\\n"), feed.count(b"BEGIN:VEVENT")
    (True, 2)
    """
    st = _resolve_state(season, previous, previous_meta, game_minutes, state)
    items = [(u, e) for u, e in st.events.items() if e.record.get("kind") == "game"]
    return _calendar(f"{season.league} {season.season_id}", season, items)


def team_calendar(
    season: Season,
    team: str,
    previous: Season | None = None,
    previous_meta: CalendarState | None = None,
    *,
    game_minutes: int = DEFAULT_GAME_MINUTES,
    include_byes: bool = True,
    state: CalendarState | None = None,
) -> bytes:
    """One team's feed: its games and (all-day, shown as free time) its byes.

    Events keep the UIDs and content of the league feed, so a calendar subscribed to both shows
    each game once.

    Parameters
    ----------
    season
        The season.
    team
        The team's name.
    previous, previous_meta
        As for :func:`plan_calendar` (ignored when ``state`` is given).
    game_minutes
        Length of each event.
    include_byes
        Add the team's byes as all-day free events.
    state
        A state from :func:`plan_calendar`.

    Returns
    -------
    bytes
        The iCalendar stream.

    Raises
    ------
    InputError
        When ``team`` is not a team of the season.

    References
    ----------
    RFC 5545 (iCalendar).

    Examples
    --------
    >>> from datetime import date
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm", "Oak"),
    ...                 (Fixture(1, "Ash", "Elm", date=date(2031, 3, 4)),
    ...                  Fixture(2, "Elm", "Oak", date=date(2031, 3, 11))),
    ...                 byes={1: ("Oak",), 2: ("Ash",)})
    >>> feed = team_calendar(season, "Ash")
    >>> feed.count(b"BEGIN:VEVENT"), b"Ash v Elm" in feed
    (2, True)
    """
    if team not in season.teams:
        raise InputError(f"no team called {team!r} in {season.league} {season.season_id}")
    st = _resolve_state(season, previous, previous_meta, game_minutes, state)

    def mine(rec: Mapping[str, object]) -> bool:
        if rec.get("kind") == "bye":
            return include_byes and rec.get("team") == team
        return team in (rec.get("home"), rec.get("away"))

    items = [(u, e) for u, e in st.events.items() if mine(e.record)]
    return _calendar(f"{team} – {season.league} {season.season_id}", season, items)


_RESERVED_STEMS = {"league"}
"""Feed stems a team's feed may not take (the league feed is ``league.ics``)."""


def team_feed_names(season: Season) -> dict[str, str]:
    """Team -> file name of its feed inside ``calendars/`` (unique, never ``league.ics``).

    Parameters
    ----------
    season
        The season (its teams).

    Returns
    -------
    dict
        Team -> file name ending in ``.ics``.

    Examples
    --------
    >>> from scheduler.season import Season
    >>> names = team_feed_names(Season("Demo", "2031", ("Ash", "League"), ()))
    >>> names["Ash"].startswith("ash-"), names["League"] != "league.ics"
    (True, True)
    """
    stems = team_file_stems(season.teams)
    names = {}
    for team, stem in stems.items():
        if stem.lower() in _RESERVED_STEMS:
            stem = f"{stem}-{name_digest(team)}"
        names[team] = f"{stem}.ics"
    return names
