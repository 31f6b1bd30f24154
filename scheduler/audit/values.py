"""Cell values of schedule files: whole numbers, text, dates and times of day.

Rounds and legs are the first whole number in the cell (``"Round 3"`` -> 3). Dates are ISO
``YYYY-MM-DD``, ``YYYY/MM/DD``, ``DD.MM.YYYY`` or ``DD/MM/YYYY`` (slashes are read day first
unless some value of the column only makes sense month first), or spreadsheet dates. A column of
dates is parsed at once with :func:`pandas.to_datetime` (one explicit format at a time, in the
order of :data:`DATE_FORMATS_DAY_FIRST`, so each text gets the first format that reads it), at
microsecond resolution so that every year 1-9999 fits; what pandas cannot read falls back to
:func:`as_date` cell by cell (``datetime.strptime`` with the same formats, then ISO date-times),
which also writes the message for a cell that is no date. Times are ``HH:MM[:SS]`` (also ``HH.MM``,
``19h30``, ``7:30 pm``) or spreadsheet times; a full ISO date-time with a UTC offset gives the
kick-off directly. A text cell that the project's exporters made inert against formula
injection (a leading ``'``, :func:`scheduler.export.safety.neutralise_cell`) is restored.
"""

from __future__ import annotations

import re
from collections.abc import Iterable
from datetime import date, datetime, time

import pandas as pd

from scheduler.config.names import character_problem, normal_form
from scheduler.export.safety import restore_cell

_INT = re.compile(r"\d+")


class BadCell(ValueError):
    """A cell value that cannot be used; the caller adds the location."""


def as_int(value: object, what: str) -> int:
    """The first whole number of a cell (``"Round 3"`` -> 3).

    Parameters
    ----------
    value
        The cell: text, a whole number, or a float with no fractional part (spreadsheets).
    what
        What the cell holds, for the message (``"the round"``).

    Returns
    -------
    int
        The number.

    Raises
    ------
    BadCell
        A boolean, a fractional number, or text without digits; the caller adds the location.

    Examples
    --------
    >>> as_int("3. Spieltag", "the round"), as_int(4.0, "the round")
    (3, 4)
    """
    if type(value) is str and value.isdigit():
        return int(value)
    if isinstance(value, bool):
        raise BadCell(f"{what} must be a whole number, got {value!r}")
    if isinstance(value, int):
        return value
    if isinstance(value, float):
        if value.is_integer():
            return int(value)
        raise BadCell(f"{what} must be a whole number, got {value!r}")
    m = _INT.search(str(value))
    if not m:
        raise BadCell(f"{what} must be a number, got {str(value)!r}")
    return int(m.group())


def cell_text(value: object) -> str:
    """The cell as text with runs of white space collapsed ("" for an empty cell).

    Parameters
    ----------
    value
        The cell: text, ``None`` (empty) or a number; text our exporters made inert against
        formula injection (a leading ``'``) is restored.

    Returns
    -------
    str
        The text, stripped; a whole float is written without ``.0``.

    Examples
    --------
    >>> cell_text("  Harbour   Rovers "), cell_text(None), cell_text(3.0), cell_text("'=Pier")
    ('Harbour Rovers', '', '3', '=Pier')
    """
    if type(value) is str:
        stripped = value.strip()
        if stripped.startswith("'"):
            # A cell our exporters made inert against formula injection (scheduler.export.safety).
            stripped = (restore_cell(stripped) or "").strip()
        if "  " not in stripped and "\t" not in stripped and "\n" not in stripped:
            return stripped
        return " ".join(stripped.split())
    if value is None:
        return ""
    if isinstance(value, float) and value.is_integer():
        value = int(value)
    return " ".join(str(value).split())


DATE_FORMATS_DAY_FIRST = ("%Y-%m-%d", "%Y/%m/%d", "%d.%m.%Y", "%d/%m/%Y", "%d-%m-%Y",
                           "%d.%m.%y", "%d/%m/%y")
DATE_FORMATS_MONTH_FIRST = ("%Y-%m-%d", "%Y/%m/%d", "%d.%m.%Y", "%m/%d/%Y", "%d-%m-%Y",
                             "%d.%m.%y", "%m/%d/%y")


def month_first(values: Iterable[object]) -> bool:
    """True when some slash date of the column only makes sense month first (second part > 12).

    Parameters
    ----------
    values
        The cells of a date column; only text cells are looked at.

    Returns
    -------
    bool
        ``True`` when a date such as ``03/25/2031`` shows the column is written month first.

    Examples
    --------
    >>> month_first(["03/04/2031", "03/25/2031"]), month_first(["25/03/2031"])
    (True, False)
    """
    for v in values:
        if isinstance(v, str):
            parts = v.strip().split(" ")[0].split("/")
            if (
                len(parts) == 3
                and len(parts[0]) <= 2
                and parts[1].isdigit()
                and int(parts[1]) > 12
            ):
                return True
    return False


def parse_datetime_text(text: str) -> datetime | None:
    """An ISO 8601 date and time (a space allowed for ``T``), or ``None`` when it is not one.

    Parameters
    ----------
    text
        The cell's text.

    Returns
    -------
    datetime.datetime or None
        Naive or aware, as written.

    References
    ----------
    ISO 8601; Python's :meth:`datetime.datetime.fromisoformat`.
    """
    try:
        return datetime.fromisoformat(text.replace(" ", "T", 1) if "T" not in text else text)
    except ValueError:
        return None


def as_date(value: object, month_first: bool) -> tuple[date | None, datetime | None]:
    """A date cell as (date, full aware datetime when the cell is a spreadsheet date-time with one).

    Parameters
    ----------
    value
        The cell: ``None`` or ``""`` (no date), a :class:`datetime.date` or
        :class:`datetime.datetime` (spreadsheets), or text in one of
        :data:`DATE_FORMATS_DAY_FIRST` or an ISO 8601 date-time.
    month_first
        Read slash dates month first (see the function :func:`month_first`).

    Returns
    -------
    tuple
        (the date or ``None``, the cell itself when it is an aware :class:`datetime.datetime`,
        else ``None``). Text is read by its date part only; the offset of an ISO date-time
        written as text is read by :func:`as_time`.

    Raises
    ------
    BadCell
        Text that is no date in any of the formats; the caller adds the location.

    Examples
    --------
    >>> as_date("01/03/2031", month_first=False)
    (datetime.date(2031, 3, 1), None)
    >>> as_date("2031-03-01T19:30+01:00", month_first=False)
    (datetime.date(2031, 3, 1), None)
    """
    if value is None or value == "":
        return None, None
    if isinstance(value, datetime):
        return value.date(), (value if value.tzinfo else None)
    if isinstance(value, date):
        return value, None
    text = str(value).strip()
    formats = DATE_FORMATS_MONTH_FIRST if month_first else DATE_FORMATS_DAY_FIRST
    head = text.split("T")[0].split(" ")[0]
    for fmt in formats:
        try:
            return datetime.strptime(head, fmt).date(), None
        except ValueError:
            continue
    full = parse_datetime_text(text)
    if full is not None:
        return full.date(), (full if full.tzinfo else None)
    raise BadCell(f"not a date: {text!r} (use YYYY-MM-DD)")


_TIME = re.compile(r"^(\d{1,2})[:.h](\d{2})(?::(\d{2}))?\s*([ap]\.?m\.?)?$", re.IGNORECASE)


def as_time(value: object) -> tuple[time | None, datetime | None]:
    """A time cell as (time of day, full aware datetime when the cell holds one with an offset).

    Parameters
    ----------
    value
        The cell: ``None`` or ``""`` (no time), a :class:`datetime.time` or
        :class:`datetime.datetime` (spreadsheets), or text such as ``19:30``, ``19.30``,
        ``19h30``, ``7:30 pm`` or an ISO 8601 date-time.

    Returns
    -------
    tuple
        (the naive time of day or ``None``, the full datetime when it carries a UTC offset,
        else ``None``).

    Raises
    ------
    BadCell
        Text that is no time of day; the caller adds the location.

    Examples
    --------
    >>> as_time("7:30 pm"), as_time("19h30")[0]
    ((datetime.time(19, 30), None), datetime.time(19, 30))
    """
    if value is None or value == "":
        return None, None
    if isinstance(value, datetime):
        return value.time().replace(tzinfo=None), (value if value.tzinfo else None)
    if isinstance(value, time):
        return value.replace(tzinfo=None), None
    text = str(value).strip()
    m = _TIME.match(text)
    if m:
        hour, minute = int(m.group(1)), int(m.group(2))
        second = int(m.group(3) or 0)
        ampm = (m.group(4) or "").lower().replace(".", "")
        if ampm == "pm" and hour < 12:
            hour += 12
        elif ampm == "am" and hour == 12:
            hour = 0
        try:
            return time(hour, minute, second), None
        except ValueError:
            pass
    full = parse_datetime_text(text)
    if full is not None:
        return full.time(), (full if full.tzinfo else None)
    raise BadCell(f"not a time of day: {text!r} (use HH:MM)")



def parse_date_texts(texts: Iterable[str], month_first: bool) -> dict[str, date]:
    """The dates of the distinct text cells of a date column, parsed at once with pandas.

    Parameters
    ----------
    texts
        Text cells of the column (repeats are parsed once).
    month_first
        Read slash dates month first (see :func:`month_first`).

    Returns
    -------
    dict
        Text -> date for every text one of the formats reads (the date part of a date and
        time included); the others are left to :func:`as_date` (ISO date-times in other
        forms, cells that are no date).

    References
    ----------
    ``docs/audit-input.md``; pandas, :func:`pandas.to_datetime`.

    Examples
    --------
    >>> parse_date_texts(["01.03.2031", "2031-03-08", "soon"], month_first=False)
    {'01.03.2031': datetime.date(2031, 3, 1), '2031-03-08': datetime.date(2031, 3, 8)}
    """
    distinct = pd.Series(sorted({t.strip() for t in texts if t.strip()}), dtype=object)
    if distinct.empty:
        return {}
    heads = distinct.str.split("T", n=1).str[0].str.split(" ", n=1).str[0]
    # Microseconds, not pandas' nanoseconds: every year 1..9999 fits (pandas 3 parses to
    # microseconds; a nanosecond column would refuse a date after 2262 with an exception).
    parsed = pd.Series(pd.NaT, index=distinct.index, dtype="datetime64[us]")
    formats = DATE_FORMATS_MONTH_FIRST if month_first else DATE_FORMATS_DAY_FIRST
    for fmt in formats:
        todo = parsed.isna()
        if not todo.any():
            break
        parsed[todo] = pd.to_datetime(heads[todo], format=fmt, errors="coerce")
    found = parsed.notna()
    return {
        text: stamp.date()
        for text, stamp in zip(distinct[found], parsed[found], strict=True)
    }


def team_name(text: str, seen: dict[str, str]) -> str:
    """A team name of a schedule cell: refused (:class:`BadCell`) when it holds a control,
    text-direction or unassigned character, else in Normalization Form C. ``seen`` caches the
    names already checked.

    Parameters
    ----------
    text
        The cell's text.
    seen
        Cache of names already checked (text as written -> name in NFC); updated in place.

    Returns
    -------
    str
        The name in Unicode Normalization Form C.

    Raises
    ------
    BadCell
        A control, text-direction or unassigned character; the caller adds the location.

    Examples
    --------
    >>> team_name("Cafe\u0301", {}) == "Caf\u00e9"
    True
    """
    known = seen.get(text)
    if known is not None:
        return known
    problem = character_problem(text)
    if problem:
        raise BadCell(f"the team name {text!r} {problem}")
    seen[text] = normal_form(text)
    return seen[text]
