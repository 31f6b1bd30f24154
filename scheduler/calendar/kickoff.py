"""Kick-off datetimes: a match day plus a time of day on the league's clock.

Times are wall-clock times of ``league.timezone`` (an IANA time zone name, resolved with
:mod:`zoneinfo`, PEP 615). The result is always a timezone-aware :class:`datetime.datetime`.

Daylight-saving changes (PEP 495 semantics, which :mod:`zoneinfo` follows):

- **Gap** (the clock jumps forward, e.g. 02:00 -> 03:00): a kick-off inside the skipped hour does
  not exist. It is moved forward by the length of the gap (02:30 becomes 03:30 summer time). This
  is the instant PEP 495 gives the time with ``fold=0`` (the offset before the change), shown on
  the clock that is valid then.
- **Fold** (the clock goes back, e.g. 03:00 -> 02:00): a kick-off inside the repeated hour happens
  twice on the clock. The first occurrence is used (``fold=0``, still summer time).

Every other time is unambiguous and kept as given.
"""

from __future__ import annotations

import functools
from datetime import UTC, date, datetime, time, timedelta
from zoneinfo import ZoneInfo

from scheduler.calendar.spec import CalendarLeague
from scheduler.errors import InputError


@functools.lru_cache(maxsize=64)
def zone(name: str) -> ZoneInfo:
    """The :class:`ZoneInfo` of an IANA name (cached).

    Parameters
    ----------
    name : str
        An IANA time zone name such as ``"Europe/Berlin"``.

    Returns
    -------
    zoneinfo.ZoneInfo
        The time zone.
    """
    return ZoneInfo(name)


def parse_slot(slot: time | str) -> time:
    """A time-slot label such as ``"19:30"`` (or a :class:`time`) as a :class:`time`.

    Parameters
    ----------
    slot : datetime.time or str
        ``"HH:MM"`` text or a time.

    Returns
    -------
    datetime.time
        The time of day.

    Raises
    ------
    InputError
        For text that is not a time of day.

    Examples
    --------
    >>> parse_slot("19:30")
    datetime.time(19, 30)
    """
    if isinstance(slot, time):
        return slot
    text = str(slot).strip()
    try:
        return time.fromisoformat(text)
    except ValueError:
        raise InputError(f"{slot!r} is not a time of day like 19:30", location="slot") from None


def local_datetime(day: date, clock: time, tz: ZoneInfo) -> datetime:
    """``day`` at wall-clock ``clock`` in ``tz``, aware; gaps move forward, folds take the first.

    See the module docstring for the daylight-saving rules.

    Parameters
    ----------
    day : datetime.date
        The date.
    clock : datetime.time
        The wall-clock time (any ``tzinfo`` or ``fold`` it has is ignored).
    tz : zoneinfo.ZoneInfo
        The time zone.

    Returns
    -------
    datetime.datetime
        Aware local date and time.

    References
    ----------
    PEP 495 (local time disambiguation, ``fold``).

    Examples
    --------
    >>> berlin = ZoneInfo("Europe/Berlin")
    >>> local_datetime(date(2026, 3, 29), time(2, 30), berlin).isoformat()  # in the gap
    '2026-03-29T03:30:00+02:00'
    >>> local_datetime(date(2026, 10, 25), time(2, 30), berlin).isoformat()  # in the fold
    '2026-10-25T02:30:00+02:00'
    """
    naive = datetime.combine(day, clock.replace(tzinfo=None, fold=0))
    first = naive.replace(tzinfo=tz, fold=0)
    # A time in a gap does not survive the round trip through UTC: normalise it to the valid
    # wall-clock time of the same instant (PEP 495: fold=0 uses the offset before the change).
    return first.astimezone(UTC).astimezone(tz)


def kickoff(league: CalendarLeague, day: date, slot: time | str | None = None) -> datetime:
    """When a game of ``league`` on ``day`` in time slot ``slot`` starts (aware datetime).

    ``slot`` ``None`` means the league's ``calendar.kickoff``.

    Parameters
    ----------
    league : CalendarLeague
        The league (its ``calendar`` and ``timezone`` are read).
    day : datetime.date
        The match day.
    slot : datetime.time or str or None, optional
        The time slot, a time or ``"HH:MM"`` text (``None``: the league's kick-off).

    Returns
    -------
    datetime.datetime
        Aware kick-off time in the league's time zone.

    Raises
    ------
    InputError
        For a slot that is not a time of day.

    Examples
    --------
    >>> from types import SimpleNamespace
    >>> from scheduler.calendar import CalendarSpec
    >>> league = SimpleNamespace(
    ...     calendar=CalendarSpec(start=date(2026, 9, 5), game_minutes=90),
    ...     timezone="Europe/Berlin")
    >>> kickoff(league, date(2026, 10, 24)).isoformat()
    '2026-10-24T15:00:00+02:00'
    >>> kickoff(league, date(2026, 10, 31), "19:30").isoformat()
    '2026-10-31T19:30:00+01:00'
    """
    clock = league.calendar.kickoff if slot is None else parse_slot(slot)
    return local_datetime(day, clock, zone(league.timezone))


def game_end(league: CalendarLeague, start: datetime) -> datetime:
    """When a game that starts at ``start`` ends (``calendar.game_minutes`` of elapsed time).

    Parameters
    ----------
    league : CalendarLeague
        The league (its ``calendar.game_minutes`` is read).
    start : datetime.datetime
        The aware kick-off time.

    Returns
    -------
    datetime.datetime
        ``start`` plus the game's length in elapsed time, on the clock of ``start``.

    Examples
    --------
    >>> from types import SimpleNamespace
    >>> from scheduler.calendar import CalendarSpec
    >>> league = SimpleNamespace(
    ...     calendar=CalendarSpec(start=date(2026, 9, 5), game_minutes=90),
    ...     timezone="Europe/Berlin")
    >>> start = kickoff(league, date(2026, 10, 25), "01:30")  # clocks go back at 03:00
    >>> game_end(league, start).isoformat()  # 90 minutes later, 02:00 winter time
    '2026-10-25T02:00:00+01:00'
    """
    ends = start.astimezone(UTC) + timedelta(minutes=league.calendar.game_minutes)
    return ends.astimezone(start.tzinfo)
