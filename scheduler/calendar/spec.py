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


class LegCount(Protocol):
    """The part of a league's format the calendar reads."""

    @property
    def legs(self) -> int:
        """How many times each pair meets."""
        ...


class CalendarLeague(Protocol):
    """What the calendar reads of a league (``scheduler.config.model.League`` has it all)."""

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
