"""The calendar's own input: which days games may be played on and when they start.

:class:`CalendarSpec` is the ``calendar`` section of a league file once validated (the league
configuration re-exports it as ``scheduler.config.model.CalendarSpec``). :class:`CalendarLeague`
is what the calendar reads of a whole league: any object with these attributes, such as
``scheduler.config.model.League``. The calendar therefore depends on no other package of the
project but ``scheduler.errors``, and the configuration may use it to check a league's dates.
"""

from __future__ import annotations

from collections.abc import Sized
from dataclasses import dataclass
from datetime import date, time
from typing import Protocol

__all__ = ["CalendarLeague", "CalendarSpec", "LegCount"]


@dataclass(frozen=True, slots=True)
class CalendarSpec:
    """Which days games may be played and when they start.

    Match days are the dates from ``start`` (up to ``end`` when given) whose weekday is in
    ``weekdays`` (0 = Monday), minus ``excluded`` and the public holidays of
    ``holidays_country``/``holidays_subdivision``; or exactly ``dates`` when that is given.
    ``rounds_per_day`` rounds share one match day. ``reserve_dates`` are kept free by the first
    plan (never match days) and offered first to games a re-plan must move.

    Parameters
    ----------
    start : datetime.date
        The first day games may be played on.
    end : datetime.date or None, optional
        The last day games may be played on; None for an open end (the calendar then takes as
        many match days as the season needs).
    weekdays : tuple of int, optional
        The weekdays of match days, 0 = Monday to 6 = Sunday (default Saturday).
    excluded : tuple of datetime.date, optional
        Days that are never match days (school holidays, a cup final).
    dates : tuple of datetime.date, optional
        The match days, listed; when given, ``start``/``end``/``weekdays`` and the holidays
        do not choose the days.
    holidays_country : str or None, optional
        ISO 3166-1 country code whose public holidays are left out (None: none are).
    holidays_subdivision : str or None, optional
        Region of that country (for example a state code), as the ``holidays`` package names
        it; None for the national holidays only.
    rounds_per_day : int, optional
        Rounds played on one match day (1 or more).
    kickoff : datetime.time, optional
        The default kick-off, on the league's clock.
    game_minutes : int, optional
        Length of a game in minutes, kick-off to end (calendar entries and clash checks).
    reserve_dates : tuple of datetime.date, optional
        Days kept free for games a re-plan must move.

    Examples
    --------
    >>> from datetime import date
    >>> spec = CalendarSpec(start=date(2026, 9, 5), end=date(2026, 9, 30), weekdays=(5,),
    ...                     excluded=(date(2026, 9, 12),))
    >>> from scheduler.calendar import match_days
    >>> [day.day for day in match_days(spec)]
    [5, 19, 26]
    """

    start: date
    end: date | None = None
    weekdays: tuple[int, ...] = (5,)
    excluded: tuple[date, ...] = ()
    dates: tuple[date, ...] = ()
    holidays_country: str | None = None
    holidays_subdivision: str | None = None
    rounds_per_day: int = 1
    kickoff: time = time(15, 0)
    game_minutes: int = 90
    reserve_dates: tuple[date, ...] = ()


# A protocol is never instantiated: its (*args, **kwargs) signature is typing's, not ours.
class LegCount(Protocol):  # numpydoc ignore=PR01
    """The part of a league's format the calendar reads."""

    @property
    def legs(self) -> int:
        """How many times each pair meets."""
        ...


# A protocol is never instantiated: its (*args, **kwargs) signature is typing's, not ours.
class CalendarLeague(Protocol):  # numpydoc ignore=PR01
    """What the calendar reads of a league (``scheduler.config.model.League`` has it all).

    A structural type: any object with these five attributes will do, so the calendar needs
    nothing of the league configuration package.

    Examples
    --------
    >>> from datetime import date
    >>> from types import SimpleNamespace
    >>> league = SimpleNamespace(
    ...     teams=("Ashby", "Brook", "Cole", "Dale", "Eston"), format=SimpleNamespace(legs=2),
    ...     calendar=CalendarSpec(start=date(2026, 9, 5), weekdays=(5,)),
    ...     timezone="Europe/Berlin", source=None)
    >>> from scheduler.calendar import rounds_needed
    >>> rounds_needed(league)
    10
    """

    @property
    def teams(self) -> Sized:
        """The teams (only their number is read)."""
        ...

    @property
    def format(self) -> LegCount:
        """The format (only ``legs`` is read)."""
        ...

    @property
    def calendar(self) -> CalendarSpec:
        """The calendar section."""
        ...

    @property
    def timezone(self) -> str:
        """The IANA time zone of the league's clock."""
        ...

    @property
    def source(self) -> str | None:
        """The league file, for messages."""
        ...
