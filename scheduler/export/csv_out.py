"""The fixture list as CSV (RFC 4180: comma separated, double-quote quoting, CRLF line ends).

Columns: ``round, leg, date, time, home, away, venue, court, slot`` with one header row. Dates
are ISO 8601 (``2026-08-15``), times 24-hour local kick-off times (``19:30``) in the league's
time zone. Text is UTF-8 without a byte-order mark. Every cell of user text goes through
:func:`~scheduler.export.safety.neutralise_cell` (formula-injection defence, common practice).
Rows come in a fixed order (round, kick-off, venue, court, slot, teams), so the same season always
gives the same bytes.
"""

from __future__ import annotations

import csv
import io
from dataclasses import dataclass
from datetime import date, datetime, time
from zoneinfo import ZoneInfo, ZoneInfoNotFoundError

from scheduler.export.safety import neutralise_cell
from scheduler.season import Fixture, Season

CSV_COLUMNS = ("round", "leg", "date", "time", "home", "away", "venue", "court", "slot")


@dataclass(frozen=True, slots=True)
class FixtureRow:
    """One fixture with its local date and kick-off time resolved (plain values, not text).

    Parameters
    ----------
    fixture
        The fixture as planned.
    date
        Its match day (from the fixture, else from its kick-off), or ``None``.
    time
        Its local kick-off time, naive, or ``None``.
    start
        Its kick-off in the league's time zone, or ``None``.
    """

    fixture: Fixture
    date: date | None
    time: time | None
    start: datetime | None


def league_zone(season: Season) -> ZoneInfo | None:
    """The season's IANA time zone, or ``None`` when it has none (or an unknown one).

    Parameters
    ----------
    season
        The season.

    Returns
    -------
    zoneinfo.ZoneInfo or None
        The zone of ``season.timezone``.

    Examples
    --------
    >>> from scheduler.season import Season
    >>> league_zone(Season("Demo", "2031", (), (), timezone="Europe/Paris"))
    zoneinfo.ZoneInfo(key='Europe/Paris')
    >>> league_zone(Season("Demo", "2031", (), ())) is None
    True
    """
    if not season.timezone:
        return None
    try:
        return ZoneInfo(season.timezone)
    except (ZoneInfoNotFoundError, ValueError):
        return None


def local_start(fixture: Fixture, zone: ZoneInfo | None) -> datetime | None:
    """The kick-off in the league's zone (``start`` itself when the season has no zone).

    Parameters
    ----------
    fixture
        The fixture.
    zone
        The league's time zone (:func:`league_zone`), or ``None``.

    Returns
    -------
    datetime.datetime or None
        The kick-off, converted to ``zone`` when it is aware; ``None`` without a kick-off.

    Examples
    --------
    >>> from datetime import datetime, timezone
    >>> from zoneinfo import ZoneInfo
    >>> game = Fixture(1, "Ash", "Elm", start=datetime(2031, 7, 1, 18, 0, tzinfo=timezone.utc))
    >>> local_start(game, ZoneInfo("Europe/Paris")).isoformat()
    '2031-07-01T20:00:00+02:00'
    """
    start = fixture.start
    if start is None:
        return None
    if start.tzinfo is not None and zone is not None:
        return start.astimezone(zone)
    return start


def fixture_rows(season: Season) -> list[FixtureRow]:
    """The season's fixtures in the fixed export order, with local date and time.

    Parameters
    ----------
    season
        The season.

    Returns
    -------
    list of FixtureRow
        Ordered by round, date, time, venue, court, slot, home, away and leg, so that every
        export lists the games in the same order.

    Examples
    --------
    >>> season = Season("Demo", "2031", ("Ash", "Elm"),
    ...                 (Fixture(2, "Elm", "Ash"), Fixture(1, "Ash", "Elm")))
    >>> [row.fixture.round for row in fixture_rows(season)]
    [1, 2]
    """
    zone = league_zone(season)
    rows = []
    for fixture in season.fixtures:
        start = local_start(fixture, zone)
        day = fixture.date if fixture.date is not None else (start.date() if start else None)
        kick = start.time().replace(tzinfo=None) if start is not None else None
        rows.append(FixtureRow(fixture, day, kick, start))

    def key(row: FixtureRow):
        f = row.fixture
        return (
            f.round,
            row.date or date.min,
            row.time or time.min,
            f.venue or "",
            f.court or "",
            f.slot or "",
            f.home,
            f.away,
            f.leg,
        )

    rows.sort(key=key)
    return rows


def fixtures_csv(season: Season) -> str:
    """The fixture list as CSV text (CRLF line ends, header row, neutralised user text).

    Parameters
    ----------
    season
        The season.

    Returns
    -------
    str
        The CSV text.

    References
    ----------
    RFC 4180 (CSV); ``docs/outputs.md``.

    Examples
    --------
    >>> from datetime import date, datetime
    >>> from zoneinfo import ZoneInfo
    >>> kick_off = datetime(2031, 3, 4, 19, 30, tzinfo=ZoneInfo("Europe/London"))
    >>> game = Fixture(1, "Ash", "Elm", venue="Ash Park", date=date(2031, 3, 4), start=kick_off)
    >>> season = Season("Demo", "2031", ("Ash", "Elm"), (game,), timezone="Europe/London")
    >>> fixtures_csv(season).splitlines()
    ['round,leg,date,time,home,away,venue,court,slot', '1,1,2031-03-04,19:30,Ash,Elm,Ash Park,,']
    """
    buffer = io.StringIO(newline="")
    writer = csv.writer(buffer, lineterminator="\r\n", quoting=csv.QUOTE_MINIMAL)
    writer.writerow(CSV_COLUMNS)
    for row in fixture_rows(season):
        f = row.fixture
        writer.writerow(
            [
                f.round,
                f.leg,
                row.date.isoformat() if row.date else "",
                row.time.strftime("%H:%M") if row.time else "",
                neutralise_cell(f.home),
                neutralise_cell(f.away),
                neutralise_cell(f.venue) or "",
                neutralise_cell(f.court) or "",
                neutralise_cell(f.slot) or "",
            ]
        )
    return buffer.getvalue()
