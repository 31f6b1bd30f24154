"""The shape of a league file, as pydantic v2 models (one model per section).

These models check the *shape* of the file: known option names only (``extra="forbid"``), the
right kind of value (strict types: ``legs = "2"`` is refused, not guessed), simple ranges. Names
that must refer to other parts of the file (a team's home venue, the teams of a fixed fixture),
dates that must fall inside the season and rules that contradict each other are checked
afterwards by :mod:`scheduler.config.checks`, which knows the whole league.

A few friendly spellings are accepted and converted here, before the strict check:

- dates as TOML/YAML dates (``2027-04-17``) or ISO text (``"2027-04-17"``); in lists of dates also a
  range ``"2027-07-01..2027-08-31"`` (both ends included);
- times of day as TOML times (``19:30:00``) or text ``"19:30"`` / ``"19:30:00"``;
- weekdays by name (``"sat"``, ``"Saturday"``) or number (0 = Monday ... 6 = Sunday, as Python's
  :meth:`datetime.date.weekday`), and a single weekday instead of a list;
- ``league.season`` as a number (``2027``), kept as the text ``"2027"``.

The option names are the project's own (see ``templates/league.toml`` for every option explained).
"""

from __future__ import annotations

import datetime as dt
import re
from difflib import get_close_matches
from typing import Annotated, Any

from pydantic import (
    AfterValidator,
    BaseModel,
    BeforeValidator,
    ConfigDict,
    Field,
    model_validator,
)
from pydantic_core import PydanticCustomError

from scheduler.config.limits import MAX_ADDRESS_CHARS, MAX_NAME_CHARS, MAX_YEAR, MIN_YEAR
from scheduler.config.names import character_problem, normal_form

SCHEMES = ("mirrored", "french", "english", "inverted", "free")
HOME_MEANINGS = ("venue", "side")
GOALS = ("mixing", "breaks", "venue_balance", "slot_balance", "carry_over")

WEEKDAY_NAMES = {
    "mon": 0, "monday": 0,
    "tue": 1, "tues": 1, "tuesday": 1,
    "wed": 2, "wednesday": 2,
    "thu": 3, "thur": 3, "thurs": 3, "thursday": 3,
    "fri": 4, "friday": 4,
    "sat": 5, "saturday": 5,
    "sun": 6, "sunday": 6,
}  # fmt: skip

MAX_RANGE_DAYS = 3660
"""Longest date range accepted in one ``"A..B"`` entry (about ten years)."""


def _fail(text: str) -> PydanticCustomError:
    """A validation error whose message is exactly ``text`` (no template formatting)."""
    return PydanticCustomError("config", "{text}", {"text": text})


def show(value: Any) -> str:
    """A short, readable rendering of a value from the file, for error messages.

    Parameters
    ----------
    value : Any
        A value as parsed from the file.

    Returns
    -------
    str
        Text quoted with long text cut at 60 characters, ``true``/``false``, ISO dates and times,
        or a word for a section, a list or null.

    Examples
    --------
    >>> show("North Hal"), show(True), show([1, 2])
    ("'North Hal'", 'true', 'a list [...]')
    """
    if isinstance(value, str):
        text = repr(value) if len(value) <= 60 else repr(value[:57] + "...")
    elif isinstance(value, bool):
        text = "true" if value else "false"
    elif isinstance(value, dt.date | dt.time):
        text = value.isoformat()
    elif isinstance(value, dict):
        text = "a section {...}"
    elif isinstance(value, list | tuple):
        text = "a list [...]"
    elif value is None:
        text = "nothing (null)"
    else:
        text = str(value)
        if len(text) > 60:
            text = text[:57] + "..."
    return text


def suggestion(word: str, options: list[str] | tuple[str, ...]) -> str:
    """``"; did you mean 'x'?"`` for the closest option (difflib), or ``""``.

    Parameters
    ----------
    word : str
        The unknown name as written.
    options : list or tuple of str
        The known names.

    Returns
    -------
    str
        ``"; did you mean '<name>'?"`` for the closest known name (a case-only difference first,
        then the closest by :func:`difflib.get_close_matches` with cutoff 0.6), or ``""``.

    Examples
    --------
    >>> suggestion("North Hal", ["North Hall", "South Hall"])
    "; did you mean 'North Hall'?"
    >>> suggestion("Zzz", ["North Hall"])
    ''
    """
    if not isinstance(word, str) or not options:
        return ""
    lowered = {o.lower(): o for o in options}
    if word.lower() in lowered and lowered[word.lower()] != word:
        return f"; did you mean {lowered[word.lower()]!r}?"
    close = get_close_matches(word, list(options), n=1, cutoff=0.6)
    if not close:
        close = get_close_matches(word.lower(), list(lowered), n=1, cutoff=0.6)
        close = [lowered[c] for c in close]
    return f"; did you mean {close[0]!r}?" if close else ""


# ---- converters (run before the strict type check) -------------------------------------------


def _as_list(value: Any) -> Any:
    return list(value) if isinstance(value, tuple) else value


def _scalar_or_list(value: Any) -> Any:
    if isinstance(value, str | int) and not isinstance(value, bool):
        return [value]
    return _as_list(value)


def _in_range(day: dt.date) -> dt.date:
    if not MIN_YEAR <= day.year <= MAX_YEAR:
        raise _fail(
            f"{day.isoformat()} is outside the supported years {MIN_YEAR} to {MAX_YEAR}"
        )
    return day


def _parse_date(value: Any) -> dt.date:
    if isinstance(value, dt.datetime):
        raise _fail(f"expected a date without a time of day, got {show(value)}")
    if isinstance(value, dt.date):
        return _in_range(value)
    if isinstance(value, str):
        try:
            day = dt.date.fromisoformat(value.strip())
        except ValueError:
            pass
        else:
            return _in_range(day)
        raise _fail(f"expected a date like 2027-04-17, got {show(value)}")
    raise _fail(f"expected a date like 2027-04-17, got {show(value)}")


def _date(value: Any) -> dt.date:
    return _parse_date(value)


def _date_or_range(value: Any) -> tuple[dt.date, ...]:
    if isinstance(value, str) and ".." in value:
        first, _, last = value.partition("..")
        try:
            a, b = dt.date.fromisoformat(first.strip()), dt.date.fromisoformat(last.strip())
        except ValueError:
            raise _fail(
                f'expected a date range like "2027-07-01..2027-08-31", got {show(value)}'
            ) from None
        _in_range(a), _in_range(b)
        if b < a:
            raise _fail(f"the range {show(value)} ends before it starts")
        days = (b - a).days + 1
        if days > MAX_RANGE_DAYS:
            raise _fail(f"the range {show(value)} is longer than {MAX_RANGE_DAYS} days")
        return tuple(a + dt.timedelta(days=i) for i in range(days))
    return (_parse_date(value),)


_TIME_RE = re.compile(r"^\s*(\d{1,2}):(\d{2})(?::(\d{2}))?\s*$")


def _time(value: Any) -> dt.time:
    if isinstance(value, dt.time):
        if value.tzinfo is not None:
            raise _fail(
                f"give the time without a UTC offset ({show(value)}); "
                "league.timezone says which clock is meant"
            )
        return value
    if isinstance(value, str):
        m = _TIME_RE.match(value)
        if m:
            h, mi, s = int(m.group(1)), int(m.group(2)), int(m.group(3) or 0)
            if h < 24 and mi < 60 and s < 60:
                return dt.time(h, mi, s)
    raise _fail(f'expected a time of day like "19:30", got {show(value)}')


def _weekday(value: Any) -> int:
    if isinstance(value, int) and not isinstance(value, bool):
        if 0 <= value <= 6:
            return value
        raise _fail(f"weekday numbers go from 0 (Monday) to 6 (Sunday), got {value}")
    if isinstance(value, str):
        key = value.strip().lower()
        if key in WEEKDAY_NAMES:
            return WEEKDAY_NAMES[key]
        names = ["mon", "tue", "wed", "thu", "fri", "sat", "sun"]
        hint = suggestion(key, list(WEEKDAY_NAMES)) or f"; use one of {', '.join(names)}"
        raise _fail(f"{show(value)} is not a weekday{hint}")
    raise _fail(f'expected a weekday like "sat" or a number 0-6, got {show(value)}')


def _season(value: Any) -> Any:
    if isinstance(value, int) and not isinstance(value, bool):
        return str(value)
    return value


def _choice(options: tuple[str, ...], what: str):
    def check(value: Any) -> str:
        if isinstance(value, str) and value in options:
            return value
        if isinstance(value, str):
            hint = suggestion(value, options)
            raise _fail(f"{show(value)} is not a {what}{hint} (choose from {', '.join(options)})")
        raise _fail(f"expected one of {', '.join(options)}, got {show(value)}")

    return check


def _clean_text(value: str, limit: int) -> str:
    text = value.strip()
    if not text:
        raise ValueError("must not be empty")
    problem = character_problem(text)
    if problem:
        raise _fail(f"{show(text)} {problem}")
    text = normal_form(text)
    if len(text) > limit:
        raise _fail(f"{show(text)} is {len(text)} characters long; at most {limit} are allowed")
    return text


def _strip_nonempty(value: str) -> str:
    """Names: stripped, not empty, no control or unassigned characters, NFC, short."""
    return _clean_text(value, MAX_NAME_CHARS)


def _address(value: str) -> str:
    return _clean_text(value, MAX_ADDRESS_CHARS)


# ---- reusable field types --------------------------------------------------------------------

Text = Annotated[str, AfterValidator(_strip_nonempty)]
AddressText = Annotated[str, AfterValidator(_address)]
Date = Annotated[dt.date, BeforeValidator(_date)]
DateList = Annotated[
    list[Annotated[tuple[dt.date, ...], BeforeValidator(_date_or_range)]],
    BeforeValidator(_as_list),
]
"""A list of dates; each entry is kept as a tuple (one date, or every date of a range)."""
Clock = Annotated[dt.time, BeforeValidator(_time)]
Weekday = Annotated[int, BeforeValidator(_weekday)]
TextList = Annotated[list[Text], BeforeValidator(_as_list)]
Count = Annotated[int, Field(ge=1)]
NonNegative = Annotated[int, Field(ge=0)]


class Section(BaseModel):
    """Base of every section: unknown options are errors, types are strict, values frozen."""

    model_config = ConfigDict(extra="forbid", strict=True, frozen=True)


class LeagueSection(Section):
    """The ``[league]`` section (shape only; ``templates/league.toml`` explains every option).

    Parameters
    ----------
    name : str
        The league's name (not empty).
    season : str
        The season's label; a number such as ``2027`` is kept as the text ``"2027"``.
    timezone : str
        The IANA time zone name (checked against :mod:`zoneinfo` later).
    seed : int, optional
        The planner's seed, 0 or more.
    time_limit_seconds : float or None, optional
        How long the planner may search, in seconds (more than 0, at most a day).
    solve_seconds : float or None, optional
        The old name of ``time_limit_seconds``, still read.
    """

    name: Text
    season: Annotated[Text, BeforeValidator(_season)]
    timezone: Text
    seed: NonNegative = 0
    time_limit_seconds: Annotated[float, Field(gt=0, le=86400)] | None = None
    solve_seconds: Annotated[float, Field(gt=0, le=86400)] | None = None
    """Old name of ``time_limit_seconds``, still read."""


class FormatSection(Section):
    """The ``[format]`` section (shape only).

    Parameters
    ----------
    legs : int, optional
        How many times every pair meets, 1 to 12.
    scheme : str, optional
        ``mirrored``, ``french``, ``english``, ``inverted`` or ``free``.
    home_meaning : str, optional
        ``venue`` (the home team hosts) or ``side`` (home names a side or colour).
    side_labels : list of str, optional
        The names of the home and the away side (two entries).
    """

    legs: Annotated[int, Field(ge=1, le=12)] = 1
    scheme: Annotated[str, BeforeValidator(_choice(SCHEMES, "scheme"))] = "mirrored"
    home_meaning: Annotated[str, BeforeValidator(_choice(HOME_MEANINGS, "meaning of home"))] = (
        "venue"
    )
    side_labels: Annotated[
        list[Text], BeforeValidator(_as_list), Field(min_length=2, max_length=2)
    ] = ["Home", "Away"]


class HolidaysSection(Section):
    """The ``calendar.holidays`` table (shape only).

    Parameters
    ----------
    country : str
        The country code, for example ``"GB"`` (checked against the ``holidays`` package later).
    subdivision : str or None, optional
        A region of the country, for example ``"ENG"``; None for the national holidays.
    """

    country: Text
    subdivision: Text | None = None


class CalendarSection(Section):
    """The ``[calendar]`` section (shape only; dates inside the season are checked later).

    Parameters
    ----------
    start, end : datetime.date or None, optional
        The first and the last day games may be played on.
    weekdays : list of int, optional
        Match weekdays, 0 = Monday; names such as ``"sat"`` and a single weekday are accepted.
    rounds_per_day : int, optional
        Rounds on one match day, 1 to 64.
    kickoff : datetime.time, optional
        The kick-off when a venue lists no slots; ``"19:30"`` text is accepted.
    game_minutes : int, optional
        Length of a game in minutes, 1 to 1440.
    excluded : list of tuple of datetime.date, optional
        Days with no games; each entry one date or the days of a ``"first..last"`` range.
    reserve_dates : list of tuple of datetime.date, optional
        Days kept free for re-planned games; same forms as ``excluded``.
    dates : list of tuple of datetime.date, optional
        The match days, listed, instead of start, end and weekdays.
    holidays : HolidaysSection or None, optional
        Whose public holidays are left out; None for none.
    """

    start: Date | None = None
    end: Date | None = None
    weekdays: Annotated[list[Weekday], BeforeValidator(_scalar_or_list), Field(min_length=1)] = [5]
    rounds_per_day: Annotated[int, Field(ge=1, le=64)] = 1
    kickoff: Clock = dt.time(15, 0)
    game_minutes: Annotated[int, Field(ge=1, le=24 * 60)] = 90
    excluded: DateList = []
    reserve_dates: DateList = []
    dates: DateList = []
    holidays: HolidaysSection | None = None


class VenueSection(Section):
    """One ``[[venues]]`` entry (shape only).

    Parameters
    ----------
    name : str
        The venue's name.
    courts : list of str, optional
        Its courts, pitches or tables (at least one).
    slots : list of datetime.time, optional
        Its kick-off times; empty to use ``calendar.kickoff``.
    address : str or None, optional
        Postal address for calendar entries.
    latitude : float or None, optional
        Degrees north, -90 to 90; give both coordinates or neither.
    longitude : float or None, optional
        Degrees east, -180 to 180.
    """

    name: Text
    courts: Annotated[TextList, Field(min_length=1)] = ["Main"]
    slots: Annotated[list[Clock], BeforeValidator(_as_list)] = []
    address: AddressText | None = None
    latitude: Annotated[float, Field(ge=-90, le=90)] | None = None
    longitude: Annotated[float, Field(ge=-180, le=180)] | None = None

    @model_validator(mode="after")
    def _both_coordinates(self) -> VenueSection:
        if (self.latitude is None) != (self.longitude is None):
            raise PydanticCustomError(
                "coordinates", "give both latitude and longitude, or neither"
            )
        return self


class TeamSection(Section):
    """One ``[[teams]]`` entry (shape only).

    Parameters
    ----------
    name : str
        The team's name.
    code : str or None, optional
        A short code of up to 8 letters or digits; made from the name when left out.
    home_venue : str or None, optional
        The name of its home venue (needed when home means a venue).
    """

    name: Text
    code: Text | None = None
    home_venue: Text | None = None


class TeamDatesSection(Section):
    """One ``[[rules.unavailable]]`` or ``[[rules.no_home_games]]`` entry (shape only).

    Parameters
    ----------
    team : str
        The team's name.
    dates : list of tuple of datetime.date
        One or more dates or ``"first..last"`` ranges.
    """

    team: Text
    dates: Annotated[DateList, Field(min_length=1)]


class FixedSection(Section):
    """One ``[[rules.fixed]]`` entry (shape only).

    Parameters
    ----------
    home, away : str
        The two teams; ``home`` hosts unless ``any_venue``.
    round : int or None, optional
        The round, 1 or more; give a round or a date.
    date : datetime.date or None, optional
        The date; give a round or a date.
    any_venue : bool, optional
        Let the planner choose who is at home.
    """

    home: Text
    away: Text
    round: Annotated[int, Field(ge=1)] | None = None
    date: Date | None = None
    any_venue: bool = False


class RulesSection(Section):
    """The ``[rules]`` section (shape only; ``docs/rules.md`` describes each rule).

    Parameters
    ----------
    max_home_run, max_away_run : int or None, optional
        At most this many home (away) games in a row, 1 or more; None: no limit.
    no_breaks_first, no_breaks_last : int, optional
        Rounds at the start (end) of the season without breaks, 0 or more.
    min_rest_days : int or None, optional
        Days without a game between two games of a team, 0 or more.
    min_separation : int or None, optional
        Rounds between two meetings of a pair, 0 or more.
    shared_grounds : list of list of str, optional
        Groups of teams never at home on the same day.
    unavailable : list of TeamDatesSection, optional
        Days teams cannot play.
    no_home_games : list of TeamDatesSection, optional
        Days teams cannot play at home.
    fixed : list of FixedSection, optional
        Games fixed to a round or a date.
    """

    max_home_run: Count | None = None
    max_away_run: Count | None = None
    no_breaks_first: NonNegative = 0
    no_breaks_last: NonNegative = 0
    min_rest_days: NonNegative | None = None
    min_separation: NonNegative | None = None
    shared_grounds: Annotated[list[TextList], BeforeValidator(_as_list)] = []
    unavailable: Annotated[list[TeamDatesSection], BeforeValidator(_as_list)] = []
    no_home_games: Annotated[list[TeamDatesSection], BeforeValidator(_as_list)] = []
    fixed: Annotated[list[FixedSection], BeforeValidator(_as_list)] = []


class PrioritiesSection(Section):
    """The ``[priorities]`` section (shape only): weights, or an order of the goals.

    Parameters
    ----------
    mixing, breaks, venue_balance, slot_balance, carry_over : int or None, optional
        The weight of each soft goal, 0 or more; None to keep the default.
    order : list of str or None, optional
        The goals from most to least important, instead of weights.
    """

    mixing: NonNegative | None = None
    breaks: NonNegative | None = None
    venue_balance: NonNegative | None = None
    slot_balance: NonNegative | None = None
    carry_over: NonNegative | None = None
    order: (
        Annotated[
            list[Annotated[str, BeforeValidator(_choice(GOALS, "goal"))]],
            BeforeValidator(_as_list),
            Field(min_length=1),
        ]
        | None
    ) = None


class LeagueFile(Section):
    """A whole league file.

    Every option is explained in ``templates/league.toml``.

    Parameters
    ----------
    league : LeagueSection
        The ``[league]`` section: name, season, time zone, seed, planning time.
    format : FormatSection, optional
        The ``[format]`` section.
    calendar : CalendarSection
        The ``[calendar]`` section.
    venues : list of VenueSection, optional
        The ``[[venues]]`` entries.
    teams : list of TeamSection
        The ``[[teams]]`` entries (at least two).
    rules : RulesSection, optional
        The ``[rules]`` section.
    priorities : PrioritiesSection, optional
        The ``[priorities]`` section.
    """

    league: LeagueSection
    format: FormatSection = FormatSection()
    calendar: CalendarSection
    venues: Annotated[list[VenueSection], BeforeValidator(_as_list)] = []
    teams: Annotated[list[TeamSection], BeforeValidator(_as_list), Field(min_length=2)]
    rules: RulesSection = RulesSection()
    priorities: PrioritiesSection = PrioritiesSection()
