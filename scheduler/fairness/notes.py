"""Notes on silent effects: what the league file asked for and the season quietly did otherwise.

A planned season can be valid and still surprise its organizer. :func:`silent_effects` compares
a :class:`~scheduler.config.model.League` with the :class:`~scheduler.season.Season` planned
from it and names, in plain words:

* **empty match days**: a match day of the calendar, between the first and the last game, on
  which no game is played, with the reasons the league file gives (a team unavailable that day,
  a team that may not play at home, the least rest between two games);
* **rules with no effect**: an unavailability or no-home-games date outside the days the season
  is played (after its last game, before its first, or not a match day at all);
* **an early end**: the last game falls two weeks or more before the last date the calendar
  allows (``calendar.end`` or the last of ``calendar.dates``);
* **a kick-off moved by a clock change**: a slot time that does not exist on that day (the
  clocks go forward: the time is skipped, and the game starts one gap later on the clock) or
  that happens twice (the clocks go back: the first occurrence is used). Detected with
  :mod:`zoneinfo` as PEP 495 describes: a wall time whose UTC offset differs between ``fold=0``
  and ``fold=1`` is in a gap when it does not survive a round trip through UTC, else in a fold.

The function is pure (no clock, no files) and deterministic: notes come sorted by date.

References
----------
P. Ganssle, "PEP 495 - Local Time Disambiguation" and "PEP 615 - Support for the IANA Time Zone
Database in the Standard Library", python.org (verified: the fold/gap semantics used here).
"""

from __future__ import annotations

from collections import defaultdict
from dataclasses import dataclass
from datetime import UTC, date, datetime, time
from zoneinfo import ZoneInfo, ZoneInfoNotFoundError

from scheduler.calendar import match_days
from scheduler.config.model import League
from scheduler.errors import SchedulerError
from scheduler.rules.rest_days import rest_days_between
from scheduler.season import Season

EARLY_END_DAYS = 14
"""An end this many days or more before the calendar's last date is noted."""

_MAX_DAYS = 20_000


@dataclass(frozen=True, slots=True)
class SilentEffect:
    """One note on an effect of the calendar that the organizer might not see.

    Parameters
    ----------
    kind
        ``"empty-day"``, ``"no-effect"``, ``"early-end"`` or ``"clock-change"``.
    day
        The date it is about.
    text
        The sentence shown.
    """

    kind: str
    day: date
    text: str


def _zone(name: str | None) -> ZoneInfo | None:
    if not name:
        return None
    try:
        return ZoneInfo(name)
    except (ZoneInfoNotFoundError, ValueError):
        return None


def _calendar_days(league: League, last: date) -> list[date]:
    """The calendar's match days, at least up to ``last`` (every day when the end is fixed)."""
    spec = league.calendar
    if spec.dates or spec.end is not None:
        return match_days(spec, 0)
    needed = 64
    days: list[date] = []
    while True:
        try:
            more = match_days(spec, needed)
        except SchedulerError:  # the calendar ran out of days before `needed`: keep what we have
            return days
        days = more
        if not days or days[-1] >= last or len(days) < needed or needed > _MAX_DAYS:
            return days
        needed *= 2


def _names(items: list[str]) -> str:
    items = sorted(items)
    if len(items) <= 1:
        return "".join(items)
    return ", ".join(items[:-1]) + " and " + items[-1]


def _long(day: date) -> str:
    return f"{day.strftime('%a')} {day.isoformat()}"


def clock_change(day: date, clock: time, zone: ZoneInfo) -> tuple[str, datetime] | None:
    """``("skipped", actual)`` when ``clock`` does not exist on ``day`` in ``zone`` (a gap),
    ``("repeated", first)`` when it happens twice (a fold), else ``None``.

    ``actual`` is the valid wall time of the same instant as PEP 495's ``fold=0`` reading;
    ``first`` the first of the two occurrences.

    Parameters
    ----------
    day
        The match day.
    clock
        The kick-off's wall time (any ``tzinfo`` or ``fold`` is ignored).
    zone
        The league's time zone.

    Returns
    -------
    tuple of (str, datetime.datetime) or None
        ``("skipped", actual)``, ``("repeated", first)`` or ``None`` when the wall time
        exists exactly once.

    References
    ----------
    PEP 495 (local time disambiguation); the IANA time zone database.

    Examples
    --------
    >>> from zoneinfo import ZoneInfo
    >>> kind, at = clock_change(date(2031, 3, 30), time(1, 30), ZoneInfo("Europe/London"))
    >>> kind, at.strftime("%H:%M")
    ('skipped', '02:30')
    """
    naive = datetime.combine(day, clock.replace(tzinfo=None, fold=0))
    first = naive.replace(tzinfo=zone, fold=0)
    second = naive.replace(tzinfo=zone, fold=1)
    if first.utcoffset() == second.utcoffset():
        return None
    actual = first.astimezone(UTC).astimezone(zone)
    if actual.replace(tzinfo=None) != naive:
        return "skipped", actual
    return "repeated", first


def _slot_time(label: str | None, default: time) -> time:
    if label:
        try:
            return time.fromisoformat(label.strip())
        except ValueError:
            pass
    return default


def silent_effects(league: League, season: Season) -> tuple[SilentEffect, ...]:
    """Every silent effect of ``season`` planned from ``league`` (see the module docstring).

    Parameters
    ----------
    league : League
        The league file the season was planned from.
    season : Season
        The planned season (its fixtures' dates and kick-offs are read).

    Returns
    -------
    tuple of SilentEffect
        Sorted by date, then kind; empty when the fixtures carry no dates.

    Examples
    --------
    >>> silent_effects(league, season)  # doctest: +SKIP
    (SilentEffect(kind='empty-day', day=datetime.date(2031, 3, 8), text='...'),)
    """
    used = sorted({f.date for f in season.fixtures if f.date is not None})
    if not used:
        return ()
    first, last = used[0], used[-1]
    days = _calendar_days(league, last)
    calendar_days = set(days)
    used_set = set(used)
    effects: list[SilentEffect] = []
    rules = league.rules

    unavailable: dict[date, list[str]] = defaultdict(list)
    for entry in rules.unavailable:
        for day in entry.dates:
            unavailable[day].append(entry.team)
    no_home: dict[date, list[str]] = defaultdict(list)
    for entry in rules.no_home_games:
        for day in entry.dates:
            no_home[day].append(entry.team)

    # Empty match days between the first and the last game.
    previous = first
    for day in days:
        if day in used_set:
            previous = day
            continue
        if not first < day < last:
            continue
        reasons = []
        if unavailable.get(day):
            who = unavailable[day]
            verb = "is" if len(who) == 1 else "are"
            reasons.append(f"{_names(who)} {verb} unavailable that day")
        if no_home.get(day):
            reasons.append(f"{_names(no_home[day])} may not play at home that day")
        rest = rules.min_rest_days
        if rest is not None and rest_days_between(previous, day) < rest:
            reasons.append(
                f"the least rest between two games (min_rest_days = {rest}) needs {rest + 1} "
                f"days between match days, and the last games were on {previous.isoformat()}"
            )
        why = "; ".join(reasons) if reasons else "no single rule names this date (several "
        if not reasons:
            why += "rules together, or fixed fixtures, may leave it free)"
        effects.append(
            SilentEffect("empty-day", day, f"No games on match day {_long(day)}: {why}.")
        )

    # Rules whose dates the season never reaches.
    for label, table in (("unavailable", unavailable), ("no home games", no_home)):
        for day, teams in sorted(table.items()):
            if first <= day <= last and day in calendar_days:
                continue
            if day > last:
                where = f"after the season's last game ({last.isoformat()})"
            elif day < first:
                where = f"before the season's first game ({first.isoformat()})"
            else:
                where = "not a match day of the calendar"
            effects.append(
                SilentEffect(
                    "no-effect",
                    day,
                    f"The rule '{label}' for {_names(teams)} on {day.isoformat()} has no effect: "
                    f"that date is {where}.",
                )
            )

    # An early end.
    end = league.calendar.end or (max(league.calendar.dates) if league.calendar.dates else None)
    if end is not None and (end - last).days >= EARLY_END_DAYS:
        weeks = (end - last).days // 7
        left = sum(1 for d in days if d > last)
        effects.append(
            SilentEffect(
                "early-end",
                last,
                f"The season ends on {last.isoformat()}, {weeks} weeks before the calendar's last "
                f"date {end.isoformat()}: {left} later match days stay free (they can serve as "
                "reserve dates for postponed games).",
            )
        )

    # Kick-offs moved by a clock change.
    zone = _zone(season.timezone)
    if zone is not None:
        seen: dict[tuple[date, time], list[int]] = defaultdict(list)
        for f in season.fixtures:
            if f.date is None or f.start is None:
                continue
            clock = _slot_time(f.slot, league.calendar.kickoff)
            seen[(f.date, clock)].append(f.round)
        for (day, clock), rounds in sorted(seen.items()):
            change = clock_change(day, clock, zone)
            if change is None:
                continue
            kind, at = change
            games = len(rounds)
            which = f"{games} game{'s' if games != 1 else ''} of round {min(rounds)}"
            if kind == "skipped":
                text = (
                    f"Kick-off {clock.strftime('%H:%M')} on {day.isoformat()} does not exist in "
                    f"{zone.key}: the clocks go forward that night. {which} start at "
                    f"{at.strftime('%H:%M')} on the clock instead."
                )
            else:
                text = (
                    f"Kick-off {clock.strftime('%H:%M')} on {day.isoformat()} happens twice in "
                    f"{zone.key}: the clocks go back that night. {which} start at the first "
                    f"{clock.strftime('%H:%M')} (UTC offset {at.strftime('%z')})."
                )
            effects.append(SilentEffect("clock-change", day, text[0].upper() + text[1:]))

    order = {"clock-change": 0, "empty-day": 1, "no-effect": 2, "early-end": 3}
    effects.sort(key=lambda e: (e.day, order[e.kind], e.text))
    return tuple(effects)


def silent_effect_notes(league: League, season: Season) -> tuple[str, ...]:
    """The sentences of :func:`silent_effects`, in order (what the season's notes carry).

    Parameters
    ----------
    league
        The league the season was planned for (its calendar and time zone).
    season
        The planned season.

    Returns
    -------
    tuple of str
        One sentence per effect, by date.
    """
    return tuple(effect.text for effect in silent_effects(league, season))
