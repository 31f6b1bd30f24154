"""Match days of a season: which dates games may be played on, and how many are needed.

Pure functions of the league's :class:`~scheduler.calendar.spec.CalendarSpec`; no pairing
decisions. The match days are

- exactly ``calendar.dates`` when the league lists them; otherwise
- every date from ``calendar.start`` (up to ``calendar.end`` when given) whose weekday is in
  ``calendar.weekdays`` (0 = Monday, as :meth:`datetime.date.weekday`), minus ``calendar.excluded``
  and minus the public holidays of ``holidays_country``/``holidays_subdivision`` for every year
  the season touches, and minus ``calendar.reserve_dates`` (kept free for catch-up games of a
  re-plan). Public holidays come from the ``holidays`` package
  (https://github.com/vacanza/holidays), including the substitute ("observed") days it lists.

Each match day hosts ``rounds_per_day`` rounds. A round robin of ``n`` teams has ``n - 1`` rounds
per leg when ``n`` is even and ``n`` rounds per leg when ``n`` is odd (one team has a bye in each
round). This is the count of the circle method (Walecki's construction as published by Lucas,
"Récréations mathématiques" vol. 2, 1883; from memory), see ``scheduler.factorization.circle``.
"""

from __future__ import annotations

import functools
from datetime import date, timedelta

import holidays as holidays_lib

from scheduler.calendar.spec import CalendarLeague, CalendarSpec
from scheduler.errors import ConfigError, InputError

MAX_SEARCH_YEARS = 30
"""An open-ended season (no ``calendar.end``) searches at most this many years for match days."""


def rounds_needed(league: CalendarLeague) -> int:
    """Rounds of the season: ``legs * (n - 1)`` for even ``n``, ``legs * n`` for odd ``n``.

    Parameters
    ----------
    league : CalendarLeague
        The league (anything with the league's ``teams``, ``format`` and ``calendar``).

    Returns
    -------
    int
        The number of rounds.

    Examples
    --------
    >>> from datetime import date
    >>> from types import SimpleNamespace
    >>> league = SimpleNamespace(
    ...     teams=("Ashby", "Brook", "Cole", "Dale", "Eston"), format=SimpleNamespace(legs=2),
    ...     calendar=CalendarSpec(start=date(2026, 9, 5), weekdays=(5,)),
    ...     timezone="Europe/Berlin", source=None)
    >>> rounds_needed(league)  # 5 teams: 5 rounds per leg, one bye in each
    10
    """
    n = len(league.teams)
    per_leg = n - 1 if n % 2 == 0 else n
    return league.format.legs * per_leg


def days_needed(league: CalendarLeague) -> int:
    """Match days the season needs: rounds divided by ``rounds_per_day``, rounded up.

    Parameters
    ----------
    league : CalendarLeague
        The league (anything with the league's ``teams``, ``format`` and ``calendar``).

    Returns
    -------
    int
        The number of match days.

    Examples
    --------
    >>> from datetime import date
    >>> from types import SimpleNamespace
    >>> league = SimpleNamespace(
    ...     teams=("Ashby", "Brook", "Cole", "Dale", "Eston"), format=SimpleNamespace(legs=2),
    ...     calendar=CalendarSpec(start=date(2026, 9, 5), weekdays=(5,)),
    ...     timezone="Europe/Berlin", source=None)
    >>> days_needed(league)
    10
    >>> from dataclasses import replace
    >>> league.calendar = replace(league.calendar, rounds_per_day=3)
    >>> days_needed(league)  # 10 rounds, 3 a day
    4
    """
    per_day = league.calendar.rounds_per_day
    return -(-rounds_needed(league) // per_day)


@functools.lru_cache(maxsize=256)
def _holidays_of_year(country: str, subdivision: str | None, year: int) -> frozenset[date]:
    table = holidays_lib.country_holidays(country, subdiv=subdivision, years=year)
    return frozenset(d for d in table if d.year == year)


def public_holidays(spec: CalendarSpec, first_year: int, last_year: int) -> frozenset[date]:
    """The public holidays of the league's country/subdivision in the years given (inclusive).

    Parameters
    ----------
    spec : CalendarSpec
        The calendar section (``holidays`` country and subdivision).
    first_year, last_year : int
        The years covered, both included.

    Returns
    -------
    frozenset of datetime.date
        The holidays (empty when the league names no country).

    References
    ----------
    The ``holidays`` package (python-holidays) supplies the dates.

    Examples
    --------
    >>> from datetime import date
    >>> spec = CalendarSpec(start=date(2026, 9, 5), holidays_country="DE")
    >>> date(2026, 10, 3) in public_holidays(spec, 2026, 2026)  # German Unity Day
    True
    >>> public_holidays(CalendarSpec(start=date(2026, 9, 5)), 2026, 2026)
    frozenset()
    """
    if not spec.holidays_country:
        return frozenset()
    days: set[date] = set()
    for year in range(first_year, last_year + 1):
        days |= _holidays_of_year(spec.holidays_country, spec.holidays_subdivision, year)
    return frozenset(days)


def _spec_of(league_or_spec: CalendarLeague | CalendarSpec) -> CalendarSpec:
    if isinstance(league_or_spec, CalendarSpec):
        return league_or_spec
    spec = getattr(league_or_spec, "calendar", None)
    if isinstance(spec, CalendarSpec):
        return spec
    raise TypeError(f"expected a League or a CalendarSpec, got {type(league_or_spec).__name__}")


def _is_candidate(day: date, spec: CalendarSpec, excluded: frozenset[date]) -> bool:
    return day.weekday() in spec.weekdays and day not in excluded


def match_days(
    league_or_spec: CalendarLeague | CalendarSpec, needed: int | None = None
) -> list[date]:
    """The season's match days in date order.

    ``needed`` is the number of match days the caller must have. With an open end (no
    ``calendar.end`` and no ``calendar.dates``) the search stops after ``needed`` days; passing a
    League uses :func:`days_needed` as the default. With a fixed end, or explicit dates, every
    match day is returned (the balancer may use a subset) and a :class:`ConfigError` says so
    when there are fewer than ``needed``.

    Parameters
    ----------
    league_or_spec : CalendarLeague or CalendarSpec
        A league, or its calendar section alone.
    needed : int or None, optional
        Match days the caller needs (default with a league: :func:`days_needed`; None with a
        calendar section: no minimum, which needs an end date or listed dates).

    Returns
    -------
    list of datetime.date
        The match days in date order.

    Raises
    ------
    ConfigError
        When a fixed calendar has fewer than ``needed`` match days.
    InputError
        With an open end and no ``needed`` (a bare calendar section).

    Examples
    --------
    >>> from datetime import date
    >>> spec = CalendarSpec(start=date(2026, 9, 5), weekdays=(5, 6),
    ...                     reserve_dates=(date(2026, 9, 6),))
    >>> match_days(spec, 3)
    [datetime.date(2026, 9, 5), datetime.date(2026, 9, 12), datetime.date(2026, 9, 13)]
    """
    spec = _spec_of(league_or_spec)
    league = None if isinstance(league_or_spec, CalendarSpec) else league_or_spec
    source = league.source if league is not None else None
    if needed is None and league is not None:
        needed = days_needed(league)
    if spec.dates:
        days = sorted(set(spec.dates) - set(spec.reserve_dates))
    elif spec.end is not None:
        public = public_holidays(spec, spec.start.year, spec.end.year)
        excluded = frozenset(spec.excluded) | public | frozenset(spec.reserve_dates)
        days = []
        day = spec.start
        while day <= spec.end:
            if _is_candidate(day, spec, excluded):
                days.append(day)
            day += timedelta(days=1)
    else:
        if needed is None:
            raise InputError(
                "the calendar has no end date; say how many match days are needed",
                location="calendar.end",
            )
        days = []
        day = spec.start
        year = None
        excluded = frozenset(spec.excluded) | frozenset(spec.reserve_dates)
        limit = spec.start.replace(year=spec.start.year + MAX_SEARCH_YEARS)
        while len(days) < needed and day < limit:
            if day.year != year:
                year = day.year
                excluded = excluded | public_holidays(spec, year, year)
            if _is_candidate(day, spec, excluded):
                days.append(day)
            day += timedelta(days=1)
    if needed is not None and len(days) < needed:
        raise ConfigError([shortage_message(spec, len(days), needed)], path=source)
    return days


def shortage_message(spec: CalendarSpec, have: int, needed: int) -> str:
    """The problem text for a calendar with too few match days.

    Parameters
    ----------
    spec : CalendarSpec
        The calendar section (its listed dates and ``rounds_per_day`` shape the advice).
    have : int
        Match days the calendar gives.
    needed : int
        Match days the season needs.

    Returns
    -------
    str
        One located sentence: what is short and how to fix it.
    """
    per_day = spec.rounds_per_day
    rounds = f"{per_day} rounds" if per_day != 1 else "1 round"
    where = "calendar.dates" if spec.dates else "calendar"
    fix = (
        "list more dates"
        if spec.dates
        else "move calendar.end later, allow more weekdays or exclude fewer dates"
    )
    return (
        f"{where}: the season has {have} match day{'s' if have != 1 else ''} but needs {needed} "
        f"({rounds} per match day); {fix}, or raise calendar.rounds_per_day"
    )


def round_days(league: CalendarLeague) -> list[date]:
    """The date of each round (index 0 = round 1) when the match days are used in order.

    Round ``i`` is on match day ``i // rounds_per_day``. The balancer may instead choose a subset
    of :func:`match_days` when there are more match days than needed.

    Parameters
    ----------
    league : CalendarLeague
        The league (anything with the league's ``teams``, ``format`` and ``calendar``).

    Returns
    -------
    list of datetime.date
        One date per round.

    Raises
    ------
    ConfigError
        When the calendar has fewer match days than the season needs.

    Examples
    --------
    >>> from datetime import date
    >>> from types import SimpleNamespace
    >>> league = SimpleNamespace(
    ...     teams=("Ashby", "Brook", "Cole", "Dale", "Eston"), format=SimpleNamespace(legs=2),
    ...     calendar=CalendarSpec(start=date(2026, 9, 5), weekdays=(5,)),
    ...     timezone="Europe/Berlin", source=None)
    >>> days = round_days(league)
    >>> len(days), days[0], days[-1]
    (10, datetime.date(2026, 9, 5), datetime.date(2026, 11, 7))
    """
    days = match_days(league, days_needed(league))
    per_day = league.calendar.rounds_per_day
    return [days[i // per_day] for i in range(rounds_needed(league))]
