"""Checks that need the whole league file: names that refer to each other, dates inside the
season, valid time zone and holiday region.

Each check returns problems as ``"<field path>: <what is wrong>"`` and never raises, so one run
reports as many problems as it can. Contradictions that need the match days (too short a season,
a team unavailable on every match day, ...) are in :mod:`scheduler.config.contradictions`.
"""

from __future__ import annotations

import datetime as dt
import itertools
import re
import zoneinfo
from collections.abc import Iterable
from functools import lru_cache

import holidays as holidays_lib

from scheduler.config.limits import MAX_SEASON_DAYS
from scheduler.config.names import name_key
from scheduler.config.schema import LeagueFile, show, suggestion

CODE_RE = re.compile(r"^[A-Za-z0-9][A-Za-z0-9._-]{0,7}$")


@lru_cache(maxsize=1)
def _all_zones() -> tuple[str, ...]:
    return tuple(sorted(zoneinfo.available_timezones()))


def timezone_problems(name: str) -> list[str]:
    """``league.timezone`` must be an IANA zone :mod:`zoneinfo` knows (PEP 615).

    Parameters
    ----------
    name : str
        The ``league.timezone`` text.

    Returns
    -------
    list of str
        Empty when the zone is known; else one located problem, with the nearest known name
        when one is close.

    Examples
    --------
    >>> timezone_problems("Europe/Berlin")
    []
    >>> timezone_problems("Europe/Berln")
    ["league.timezone: 'Europe/Berln' is not a time zone; did you mean 'Europe/Berlin'?"]
    """
    try:
        zoneinfo.ZoneInfo(name)
    except (zoneinfo.ZoneInfoNotFoundError, ValueError, OSError):
        hint = suggestion(name, _all_zones())
        return [
            f"league.timezone: {show(name)} is not a time zone{hint}"
            + ("" if hint else " (use an IANA name such as 'Europe/Berlin' or 'America/Chicago')")
        ]
    return []


def resolve_holidays(
    country: str, subdivision: str | None
) -> tuple[str | None, str | None, list[str]]:
    """The holiday region in the spelling the ``holidays`` package uses, or problems.

    Parameters
    ----------
    country : str
        The country as written in ``calendar.holidays.country`` (any case).
    subdivision : str or None
        The region as written in ``calendar.holidays.subdivision`` (any case, aliases accepted);
        None for the national holidays only.

    Returns
    -------
    country : str or None
        The country code as the ``holidays`` package spells it; None when unknown.
    subdivision : str or None
        The subdivision code as the package spells it; None when not given or unknown.
    problems : list of str
        Located problems; empty when both are known.

    Examples
    --------
    >>> resolve_holidays("gb", "eng")
    ('GB', 'ENG', [])
    """
    supported = holidays_lib.list_supported_countries(include_aliases=True)
    by_upper = {c.upper(): c for c in supported}
    code = by_upper.get(country.strip().upper())
    if code is None:
        hint = suggestion(country.upper(), list(by_upper))
        return (
            None,
            None,
            [
                f"calendar.holidays.country: {show(country)} is not a country the holidays package "
                f"knows{hint} (use a two-letter ISO 3166 code such as 'DE' or 'GB')"
            ],
        )
    if subdivision is None:
        return code, None, []
    entity = holidays_lib.country_holidays(code)
    names = list(getattr(entity, "subdivisions", ()) or supported.get(code, ()))
    aliases = dict(getattr(entity, "subdivisions_aliases", {}) or {})
    lookup = {s.upper(): s for s in names}
    lookup.update({a.upper(): s for a, s in aliases.items()})
    sub = lookup.get(subdivision.strip().upper())
    if sub is None:
        if not names:
            return (
                code,
                None,
                [
                    f"calendar.holidays.subdivision: the holidays package has no subdivisions for "
                    f"{code}; remove this option"
                ],
            )
        hint = suggestion(subdivision, names + list(aliases))
        listed = ", ".join(names[:40]) + (", ..." if len(names) > 40 else "")
        return (
            code,
            None,
            [
                f"calendar.holidays.subdivision: {show(subdivision)} is not a subdivision of "
                f"{code}{hint} (known: {listed})"
            ],
        )
    return code, sub, []


def season_window(doc: LeagueFile) -> tuple[dt.date | None, dt.date | None]:
    """First and last possible match day (``None`` where open or unknown).

    Parameters
    ----------
    doc : LeagueFile
        The shape-valid league file.

    Returns
    -------
    first : datetime.date or None
        ``calendar.start``, or the first listed date when it is not given; None when unknown.
    last : datetime.date or None
        ``calendar.end``, or the last listed date when it is not given; None where open.
    """
    cal = doc.calendar
    dates = [d for group in cal.dates for d in group]
    first = cal.start or (min(dates) if dates else None)
    last = cal.end or (max(dates) if dates else None)
    return first, last


def _window_text(first: dt.date | None, last: dt.date | None) -> str:
    if first and last:
        return f"{first.isoformat()} to {last.isoformat()}"
    if first:
        return f"from {first.isoformat()}"
    return "unknown"


def _outside(day: dt.date, first: dt.date | None, last: dt.date | None) -> bool:
    return (first is not None and day < first) or (last is not None and day > last)


def date_list_problems(
    path: str,
    groups: Iterable[tuple[dt.date, ...]],
    first: dt.date | None,
    last: dt.date | None,
) -> list[str]:
    """Single dates outside the season, and ranges that miss the season entirely, are problems.

    A range that overlaps the season only in part is fine (the days outside are ignored).

    Parameters
    ----------
    path : str
        The field path for the messages, for example ``"calendar.excluded"``.
    groups : iterable of tuple of datetime.date
        The listed entries: a single date, or the days of a ``"first..last"`` range.
    first, last : datetime.date or None
        The season's first and last possible match day (:func:`season_window`); None where
        open.

    Returns
    -------
    list of str
        One located problem per entry outside the season (``path[index]: ...``).
    """
    problems = []
    for i, group in enumerate(groups):
        if all(_outside(d, first, last) for d in group):
            what = (
                group[0].isoformat()
                if len(group) == 1
                else (f"the range {group[0].isoformat()}..{group[-1].isoformat()}")
            )
            problems.append(
                f"{path}[{i}]: {what} is outside the season ({_window_text(first, last)})"
            )
    return problems


def _duplicates(path: str, items: list[str], what: str, field: str = "") -> list[str]:
    """Repeated names, compared by their canonical caseless form (:func:`name_key`: Unicode
    normalisation and case folding, so "Café" typed two ways and "CAFÉ" are one name)."""
    problems = []
    seen: dict[str, int] = {}
    for i, item in enumerate(items):
        key = name_key(item)
        if key in seen:
            problems.append(
                f"{path}[{i}]{field}: {show(item)} is listed twice (already at "
                f"{path}[{seen[key]}]); {what} must be unique"
            )
        else:
            seen[key] = i
    return problems


def _team_ref(path: str, name: str, teams: list[str]) -> list[str]:
    if name in teams:
        return []
    return [f"{path}: {show(name)} is not a team{suggestion(name, teams)}"]


def reference_problems(doc: LeagueFile) -> list[str]:
    """Every cross-reference and range problem of a shape-valid league file.

    Parameters
    ----------
    doc : LeagueFile
        The league file, already valid in shape (:mod:`scheduler.config.schema`).

    Returns
    -------
    list of str
        Every problem found, each ``"<field path>: <what is wrong>"``; empty for a usable file.
    """
    problems: list[str] = []
    problems += timezone_problems(doc.league.timezone)

    fmt = doc.format
    if name_key(fmt.side_labels[0]) == name_key(fmt.side_labels[1]):
        problems.append(f"format.side_labels: the two labels must differ, got {fmt.side_labels}")

    # --- calendar ---------------------------------------------------------------------------
    cal = doc.calendar
    given = cal.model_fields_set
    dates = [d for group in cal.dates for d in group]
    if cal.start is None and not dates:
        problems.append(
            "calendar.start: required option is missing (or list the match days in calendar.dates)"
        )
    if cal.start and cal.end and cal.end < cal.start:
        problems.append(
            f"calendar.end: {cal.end.isoformat()} is before calendar.start {cal.start.isoformat()}"
        )
    if cal.start and cal.end and (cal.end - cal.start).days > MAX_SEASON_DAYS:
        problems.append(
            f"calendar.end: the season from {cal.start.isoformat()} to {cal.end.isoformat()} "
            f"is {(cal.end - cal.start).days} days long; at most {MAX_SEASON_DAYS} are planned"
        )
    if len(dates) > MAX_SEASON_DAYS:
        problems.append(
            f"calendar.dates: {len(dates)} match days listed; at most {MAX_SEASON_DAYS} are planned"
        )
    if dates:
        for name in ("weekdays", "excluded", "holidays"):
            if name in given:
                problems.append(
                    f"calendar.{name}: not used when calendar.dates lists the match days; "
                    "remove one of the two"
                )
        seen: set[dt.date] = set()
        for d in dates:
            if d in seen:
                problems.append(f"calendar.dates: {d.isoformat()} is listed twice")
            seen.add(d)
        for i, group in enumerate(cal.dates):
            for d in group:
                if (cal.start and d < cal.start) or (cal.end and d > cal.end):
                    problems.append(
                        f"calendar.dates[{i}]: {d.isoformat()} is outside calendar.start.."
                        "calendar.end"
                    )
                    break
    if len(set(cal.weekdays)) != len(cal.weekdays):
        problems.append("calendar.weekdays: a weekday is listed twice")
    first, last = season_window(doc)
    if not dates:
        problems += date_list_problems("calendar.excluded", cal.excluded, first, last)
    problems += date_list_problems("calendar.reserve_dates", cal.reserve_dates, first, last)
    if cal.holidays is not None:
        problems += resolve_holidays(cal.holidays.country, cal.holidays.subdivision)[2]

    # --- venues -----------------------------------------------------------------------------
    venue_names = [v.name for v in doc.venues]
    problems += _duplicates("venues", venue_names, "venue names", ".name")
    for i, venue in enumerate(doc.venues):
        problems += _duplicates(f"venues[{i}].courts", list(venue.courts), "court names")
        if len(set(venue.slots)) != len(venue.slots):
            problems.append(f"venues[{i}].slots: a time slot is listed twice")
        ordered = sorted(set(venue.slots))
        for a, b in itertools.pairwise(ordered):
            gap = (b.hour * 60 + b.minute) - (a.hour * 60 + a.minute)
            if gap < cal.game_minutes:
                problems.append(
                    f"venues[{i}].slots: {a.strftime('%H:%M')} and {b.strftime('%H:%M')} are "
                    f"{gap} minutes apart but a game lasts {cal.game_minutes} minutes "
                    "(calendar.game_minutes)"
                )
    if fmt.home_meaning == "side" and not doc.venues:
        problems.append(
            'venues: at least one venue is needed when format.home_meaning = "side" '
            "(the hall or ground where the games are played)"
        )

    # --- teams ------------------------------------------------------------------------------
    team_names = [t.name for t in doc.teams]
    problems += _duplicates("teams", team_names, "team names", ".name")
    codes = [(i, t.code) for i, t in enumerate(doc.teams) if t.code is not None]
    seen_codes: dict[str, int] = {}
    for i, code in codes:
        if not CODE_RE.match(code):
            problems.append(
                f"teams[{i}].code: {show(code)} must be 1-8 letters or digits (also . _ -), "
                "starting with a letter or digit"
            )
        key = name_key(code)
        if key in seen_codes:
            problems.append(
                f"teams[{i}].code: {show(code)} is already the code of teams[{seen_codes[key]}]"
            )
        else:
            seen_codes[key] = i
    for i, team in enumerate(doc.teams):
        if team.home_venue is None:
            if fmt.home_meaning == "venue":
                problems.append(
                    f"teams[{i}].home_venue: required option is missing (the venue where "
                    f'{team.name} hosts its home games, since format.home_meaning = "venue")'
                )
        elif team.home_venue not in venue_names:
            hint = suggestion(team.home_venue, venue_names)
            if not venue_names:
                hint = " (no [[venues]] are listed)"
            problems.append(f"teams[{i}].home_venue: {show(team.home_venue)} is not a venue{hint}")

    # --- rules ------------------------------------------------------------------------------
    rules = doc.rules
    for kind in ("unavailable", "no_home_games"):
        for i, entry in enumerate(getattr(rules, kind)):
            path = f"rules.{kind}[{i}]"
            problems += _team_ref(f"{path}.team", entry.team, team_names)
            problems += date_list_problems(f"{path}.dates", entry.dates, first, last)
    if rules.shared_grounds and fmt.home_meaning != "venue":
        problems.append(
            'rules.shared_grounds: only used when format.home_meaning = "venue" '
            "(with sides, every game is at the shared venues anyway)"
        )
    for i, sharing in enumerate(rules.shared_grounds):
        path = f"rules.shared_grounds[{i}]"
        if len(sharing) < 2:
            problems.append(f"{path}: a shared ground needs at least two teams")
        for j, team_name in enumerate(sharing):
            problems += _team_ref(f"{path}[{j}]", team_name, team_names)
        if len({name_key(member) for member in sharing}) != len(sharing):
            problems.append(f"{path}: a team is listed twice")
    for i, fixed in enumerate(rules.fixed):
        path = f"rules.fixed[{i}]"
        problems += _team_ref(f"{path}.home", fixed.home, team_names)
        problems += _team_ref(f"{path}.away", fixed.away, team_names)
        if fixed.home == fixed.away:
            problems.append(f"{path}: a team cannot play itself ({show(fixed.home)} twice)")
        if fixed.round is None and fixed.date is None:
            problems.append(f"{path}: give the round or the date of this game")
        if fixed.round is not None and fixed.date is not None:
            problems.append(f"{path}: give either the round or the date, not both")
        if fixed.date is not None and _outside(fixed.date, first, last):
            problems.append(
                f"{path}.date: {fixed.date.isoformat()} is outside the season "
                f"({_window_text(first, last)})"
            )

    # --- priorities -------------------------------------------------------------------------
    pri = doc.priorities
    weights = [
        g
        for g in ("mixing", "breaks", "venue_balance", "slot_balance", "carry_over")
        if getattr(pri, g) is not None
    ]
    if pri.order is not None:
        if weights:
            problems.append(
                "priorities.order: give either an order or weights "
                f"({', '.join(weights)}), not both"
            )
        if len(set(pri.order)) != len(pri.order):
            problems.append("priorities.order: a goal is listed twice")
    return problems
