"""Limits of league files and of the text they hold, checked before any heavy work.

The numbers are stated in the README and in ``docs/limits.md``. Every check is linear in the
file's size and runs before parsing (file size, nesting depth) or right after it (counts of
teams, venues and dates, read from the parsed data before validation), so an oversized league is
refused with a located :class:`~scheduler.errors.ConfigError` in well under a second, and the
CLI answers with exit code 2.
"""

from __future__ import annotations

import re
from collections.abc import Mapping
from datetime import date
from typing import Any

import numpy as np

MAX_LEAGUE_FILE_BYTES = 1024 * 1024
"""Largest league file read (1 MB; a league of 1000 teams with rules needs a few hundred kB)."""

MAX_TEAMS = 1000
"""Most teams in one league."""

MAX_VENUES = 1000
"""Most venues in one league."""

MAX_LIST_ENTRIES = 10_000
"""Most entries of any other list of a league file (dates, rules, courts, slots)."""

MAX_NAME_CHARS = 80
"""Longest name (league, season, team, code, venue, court, side label, time zone)."""

MAX_ADDRESS_CHARS = 200
"""Longest venue address."""

MAX_SEASON_DAYS = 3660
"""Longest season from ``calendar.start`` to ``calendar.end`` (about ten years); also the most
match days listed in ``calendar.dates``."""

MAX_DATES = 100_000
"""Most dates a league file may name in all its lists together, ranges counted day by day."""

MIN_YEAR = 1900
"""Earliest year of any date in a league file."""

MAX_YEAR = 2200
"""Latest year of any date in a league file (an open-ended season is searched at most 30 years
ahead, which stays far inside the years Python's dates can hold)."""

MAX_NESTING_DEPTH = 64
"""Deepest nesting of brackets in a league or season file."""

_ISO_DATE = re.compile(r"\s*\d{4}-\d{2}-\d{2}\s*$")
_QUOTED = re.compile(r'"(?:[^"\\\n]|\\.)*"|\'[^\'\n]*\'')
_COMMENT = re.compile(r"#[^\n]*")


def nesting_depth(text: str, *, comments: bool = False) -> int:
    """The deepest nesting of ``[``/``{`` in ``text``, outside quoted strings.

    ``comments`` also skips ``#`` comments (TOML, YAML). Vectorised with numpy: strings are
    removed with one regular expression, then the depth is a cumulative sum over the brackets.

    Parameters
    ----------
    text
        JSON, TOML or YAML text.
    comments
        Whether ``#`` starts a comment.

    Returns
    -------
    int
        The deepest nesting (0 for text without brackets).

    Examples
    --------
    >>> nesting_depth('{"a": [[1], {"b": "[[["}]}')
    3
    >>> nesting_depth("a = [1, 2]  # [[[", comments=True)
    1
    """
    stripped = _QUOTED.sub("", text)
    if comments:
        stripped = _COMMENT.sub("", stripped)
    data = np.frombuffer(stripped.encode("utf-8", "replace"), dtype=np.uint8)
    if not data.size:
        return 0
    steps = np.zeros(data.shape, dtype=np.int64)
    steps[(data == ord("[")) | (data == ord("{"))] = 1
    steps[(data == ord("]")) | (data == ord("}"))] = -1
    return int(max(np.cumsum(steps).max(), 0))


def count_problems(data: Mapping[str, Any]) -> list[str]:
    """Lists of a parsed league file that are longer than the limits (checked before the
    pydantic validation, which would otherwise look at every entry first).

    Parameters
    ----------
    data
        The parsed file.

    Returns
    -------
    list of str
        ``"<field path>: <problem>"`` for each list over its limit.

    Examples
    --------
    >>> count_problems({"teams": [{"name": str(i)} for i in range(1001)]})
    ['teams: 1001 teams; a league has at most 1000 (split it into divisions)']
    """
    problems = []
    teams = data.get("teams")
    if isinstance(teams, list) and len(teams) > MAX_TEAMS:
        problems.append(
            f"teams: {len(teams)} teams; a league has at most {MAX_TEAMS} "
            "(split it into divisions)"
        )
    venues = data.get("venues")
    if isinstance(venues, list) and len(venues) > MAX_VENUES:
        problems.append(f"venues: {len(venues)} venues; a league has at most {MAX_VENUES}")
    if problems:
        return problems
    days = [0]
    problems += _long_lists(data, "", 0, days)
    if days[0] > MAX_DATES:
        problems.append(
            f"the file names {days[0]} dates (ranges counted day by day); at most {MAX_DATES} "
            "are read"
        )
    return problems


def _range_days(text: str) -> int:
    first, _, last = text.partition("..")
    try:
        return max((date.fromisoformat(last.strip()) - date.fromisoformat(first.strip())).days, 0)
    except ValueError:
        return 0


def _long_lists(value: Any, path: str, depth: int, days: list[int]) -> list[str]:
    if depth > MAX_NESTING_DEPTH:
        return []
    problems = []
    if isinstance(value, Mapping):
        for key, item in value.items():
            problems += _long_lists(item, f"{path}.{key}" if path else str(key), depth + 1, days)
    elif isinstance(value, list):
        if len(value) > MAX_LIST_ENTRIES:
            return [f"{path}: {len(value)} entries; at most {MAX_LIST_ENTRIES} are read"]
        for i, item in enumerate(value):
            if isinstance(item, Mapping | list):
                problems += _long_lists(item, f"{path}[{i}]", depth + 1, days)
            elif isinstance(item, str) and ".." in item:
                days[0] += _range_days(item)
            elif isinstance(item, date) or (isinstance(item, str) and _ISO_DATE.match(item)):
                days[0] += 1
    return problems
