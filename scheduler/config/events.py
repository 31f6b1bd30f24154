"""The season-events file: what happened since the season was planned.

The league file is the agreement; the events file, kept by the organizer beside it (TOML or
YAML, read like the league file by :mod:`scheduler.config.reading`), is what happened::

    league = "Wealdshire County League"      # must match the season folder
    season = "2027-28"
    played_through = 2027-10-23              # every game dated on or before it is history

    [[postponed]]                            # did not take place; re-placed after played_through
    home = "Hollin Town"
    away = "Weirside Mariners"
    # date = 2027-10-16                      # needed when the pair meets more than once

    [[unavailable]]                          # from now on
    team = "Orchardleigh"
    dates = [2027-11-13]

    [[closed]]                               # a venue (or some of its courts) closed
    venue = "Saltmarsh Lane"
    # courts = ["Pitch 2"]
    dates = ["2027-11-06..2027-11-20"]

    [[withdrawn]]
    team = "Durley Chase"
    policy = "void_all"                      # or "keep_played"

    [[moved]]                                # already moved by hand: kept as given
    home = "Pinfold Celtic"
    away = "Westermoor"
    # from = 2027-11-27                      # its planned date, when the pair meets twice
    date = 2027-12-01
    start = "19:30"
    # court = "Pitch"

Withdrawal policies (both common practice in league rules): ``void_all`` removes every game of
the team from the table, played ones included; ``keep_played`` lets its played games stand and
cancels the rest.

The file grows over the season: ``played_through`` moves forward and new entries are appended
while the old ones stay. What an earlier re-plan already applied is recognised by
:mod:`scheduler.replan` from the season folder's revision history (docs/replanning.md, section
8), so a ``[[moved]]`` entry may also lie on or before ``played_through`` (it is then history).

This module checks the file's shape and its names against the league (unknown team, venue or
court with a did-you-mean suggestion, dates outside the season). Whether a postponed or moved
game is in the plan, and whether the file belongs to the season folder, needs the planned season
and is checked by :mod:`scheduler.replan`.
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass
from pathlib import Path
from typing import Annotated, Any, Literal

from pydantic import BaseModel, BeforeValidator, Field, ValidationError

from scheduler.config.messages import describe, field_path
from scheduler.config.model import League
from scheduler.config.reading import read_file
from scheduler.config.schema import (
    Clock,
    Date,
    DateList,
    Section,
    Text,
    TextList,
    _as_list,
    _season,
    show,
    suggestion,
)
from scheduler.errors import ConfigError

WithdrawalPolicy = Literal["void_all", "keep_played"]
"""``void_all``: every game of the team leaves the table, played ones included;
``keep_played``: its played games stand, the rest are cancelled."""

POLICIES: tuple[str, ...] = ("void_all", "keep_played")


# ---- shape (pydantic) ------------------------------------------------------------------------


class _GameSection(Section):
    home: Text
    away: Text
    date: Date | None = None


class _TeamDates(Section):
    team: Text
    dates: Annotated[DateList, Field(min_length=1)]


class _Closed(Section):
    venue: Text
    courts: TextList = Field(default_factory=list)
    dates: Annotated[DateList, Field(min_length=1)]


class _Withdrawn(Section):
    team: Text
    policy: Text


class _Moved(Section):
    home: Text
    away: Text
    from_: Date | None = Field(default=None, alias="from")
    date: Date
    start: Clock
    court: Text | None = None




class EventsFile(Section):
    """A whole events file (shape only).

    The options are those of the module docstring; list entries are checked by their own models.

    Parameters
    ----------
    league : str
        The league's name; must match the season folder.
    season : str
        The season's label; a number is kept as text.
    played_through : datetime.date
        Every game dated on or before it is history.
    postponed, unavailable, closed, withdrawn, moved : list
        The ``[[postponed]]``, ``[[unavailable]]``, ``[[closed]]``, ``[[withdrawn]]`` and
        ``[[moved]]`` entries (a single table is read as a list of one).
    """

    league: Text
    season: Annotated[Text, BeforeValidator(_season)]
    played_through: Date
    postponed: Annotated[list[_GameSection], BeforeValidator(_as_list)] = Field(
        default_factory=list)
    unavailable: Annotated[list[_TeamDates], BeforeValidator(_as_list)] = Field(
        default_factory=list)
    closed: Annotated[list[_Closed], BeforeValidator(_as_list)] = Field(
        default_factory=list)
    withdrawn: Annotated[list[_Withdrawn], BeforeValidator(_as_list)] = Field(
        default_factory=list)
    moved: Annotated[list[_Moved], BeforeValidator(_as_list)] = Field(
        default_factory=list)


_SECTIONS: dict[str, type[BaseModel]] = {
    "postponed": _GameSection,
    "unavailable": _TeamDates,
    "closed": _Closed,
    "withdrawn": _Withdrawn,
    "moved": _Moved,
}


# ---- frozen values ---------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class Postponed:
    """A game that did not take place. ``date`` is its planned date when given.

    Parameters
    ----------
    home, away : str
        The two teams, as planned.
    date : datetime.date or None, optional
        The planned date; needed when the pair meets more than once.
    where : str, optional
        The entry's location in the events file (for example ``"postponed[1]"``), for messages.
    """

    home: str
    away: str
    date: dt.date | None = None
    where: str = ""


@dataclass(frozen=True, slots=True)
class TeamUnavailable:
    """Days a team cannot play, reported after the plan was made.

    Parameters
    ----------
    team : str
        The team's name.
    dates : tuple of datetime.date
        The days, ranges expanded.
    where : str, optional
        The entry's location in the events file (for example ``"postponed[1]"``), for messages.
    """

    team: str
    dates: tuple[dt.date, ...]
    where: str = ""


@dataclass(frozen=True, slots=True)
class Closure:
    """A venue closed on ``dates``; only ``courts`` when given, else every court.

    Parameters
    ----------
    venue : str
        The venue's name.
    courts : tuple of str
        The closed courts; empty for the whole venue.
    dates : tuple of datetime.date
        The days it is closed, ranges expanded.
    where : str, optional
        The entry's location in the events file (for example ``"postponed[1]"``), for messages.
    """

    venue: str
    courts: tuple[str, ...]
    dates: tuple[dt.date, ...]
    where: str = ""


@dataclass(frozen=True, slots=True)
class Withdrawal:
    """A team that left the league, and what happens to its games.

    Parameters
    ----------
    team : str
        The team's name.
    policy : {"void_all", "keep_played"}
        ``void_all``: every game of the team leaves the table, played ones included;
        ``keep_played``: its played games stand, the rest are cancelled.
    where : str, optional
        The entry's location in the events file (for example ``"postponed[1]"``), for messages.
    """

    team: str
    policy: WithdrawalPolicy
    where: str = ""


@dataclass(frozen=True, slots=True)
class MovedGame:
    """A game the organizer already moved by hand to ``date`` at ``start`` (local clock), on
    ``court`` when given. ``planned_date`` picks the meeting when the pair meets more than once.

    Parameters
    ----------
    home, away : str
        The two teams, as planned.
    date : datetime.date
        The new day.
    start : datetime.time
        The new kick-off, on the league's clock.
    court : str or None, optional
        The court; None to keep the planned one.
    planned_date : datetime.date or None, optional
        The planned date, to pick the meeting when the pair meets more than once.
    where : str, optional
        The entry's location in the events file (for example ``"postponed[1]"``), for messages.
    """

    home: str
    away: str
    date: dt.date
    start: dt.time
    court: str | None = None
    planned_date: dt.date | None = None
    where: str = ""


@dataclass(frozen=True)
class Events:
    """Everything that happened since the plan, checked against the league.

    ``where`` fields hold the entry's location in the file (``postponed[1]``) for messages.

    Parameters
    ----------
    league : str
        The league's name, as in the events file.
    season : str
        The season's label.
    played_through : datetime.date
        Every game dated on or before it is history.
    postponed : tuple of Postponed, optional
        Games that did not take place.
    unavailable : tuple of TeamUnavailable, optional
        Days teams cannot play from now on.
    closed : tuple of Closure, optional
        Venues or courts closed on some days.
    withdrawn : tuple of Withdrawal, optional
        Teams that left the league.
    moved : tuple of MovedGame, optional
        Games already moved by hand.
    source : str or None, optional
        The events file, for messages.
    """

    league: str
    season: str
    played_through: dt.date
    postponed: tuple[Postponed, ...] = ()
    unavailable: tuple[TeamUnavailable, ...] = ()
    closed: tuple[Closure, ...] = ()
    withdrawn: tuple[Withdrawal, ...] = ()
    moved: tuple[MovedGame, ...] = ()
    source: str | None = None

    def withdrawn_teams(self) -> frozenset[str]:
        """The names of the teams that withdrew.

        Returns
        -------
        frozenset of str
            The team names of :attr:`withdrawn`.
        """
        return frozenset(w.team for w in self.withdrawn)


# ---- loading ---------------------------------------------------------------------------------


def _describe(error: dict[str, Any]) -> str:
    loc = tuple(error.get("loc", ()))
    if error.get("type") == "extra_forbidden":
        name = str(loc[-1]) if loc else ""
        if len(loc) == 1:
            options = list(EventsFile.model_fields)
            what = "option or section"
        else:
            model = _SECTIONS.get(str(loc[0]))
            options = [
                (f.alias or key) for key, f in model.model_fields.items()
            ] if model else []
            what = "option"
        hint = suggestion(name, options) or (f" (known: {', '.join(options)})" if options else "")
        return f"{field_path(loc)}: unknown {what}{hint}"
    return describe(error)


def load_events(path: str | Path, league: League) -> Events:
    """Read and check the events file at ``path`` against ``league``.

    Parameters
    ----------
    path
        A ``.toml``, ``.yaml`` or ``.yml`` events file.
    league
        The league it belongs to (names, venues and the season's dates are checked against it).

    Returns
    -------
    Events
        The frozen, checked events.

    Raises
    ------
    ConfigError
        With every located problem (``postponed[0].home: 'Holin Town' is not a team; did you
        mean 'Hollin Town'?``).

    References
    ----------
    ``docs/replanning.md`` (the events file and how each event is checked).

    Examples
    --------
    >>> from scheduler.config import load_league                    # doctest: +SKIP
    >>> league = load_league("sample_leagues/county_double.toml")    # doctest: +SKIP
    >>> load_events("sample_leagues/county_double.events.toml", league).played_through
    ... # doctest: +SKIP
    datetime.date(2027, 10, 23)
    """
    data = read_file(path)
    return parse_events(data, league, source=str(path))


def parse_events(data: dict[str, Any], league: League, *, source: str = "<events>") -> Events:
    """Check already-parsed events data (see :func:`load_events`).

    Parameters
    ----------
    data : dict
        The parsed events file (TOML or YAML tables).
    league : League
        The league the events belong to: names and dates are checked against it.
    source : str, optional
        The file name for messages.

    Returns
    -------
    Events
        The checked events, ranges of dates expanded.

    Raises
    ------
    ConfigError
        Every problem of shape or reference found, each located by its field path.
    """
    try:
        doc = EventsFile.model_validate(dict(data))
    except ValidationError as exc:
        problems: list[str] = []
        for error in exc.errors(include_url=False):
            text = _describe(dict(error))
            if text not in problems:
                problems.append(text)
        raise ConfigError(problems, path=source) from None
    problems = _reference_problems(doc, league)
    if problems:
        raise ConfigError(problems, path=source)
    return _build(doc, source)


def season_window(league: League) -> tuple[dt.date, dt.date | None]:
    """First and last day of the league's season (the last is ``None`` when open-ended).

    Parameters
    ----------
    league : League
        The league.

    Returns
    -------
    first : datetime.date
        The earliest of ``calendar.start`` and the listed dates.
    last : datetime.date or None
        The latest of ``calendar.end``, the listed dates and the reserve dates; None when the
        calendar has an open end.
    """
    cal = league.calendar
    first = min([cal.start, *cal.dates]) if cal.dates else cal.start
    last = cal.end
    if cal.dates:
        last = max([*cal.dates, *([cal.end] if cal.end else [])])
    if cal.reserve_dates and last is not None:
        last = max(last, *cal.reserve_dates)
    return first, last


def _flat(groups) -> tuple[dt.date, ...]:
    return tuple(sorted({d for group in groups for d in group}))


def _reference_problems(doc: EventsFile, league: League) -> list[str]:
    problems: list[str] = []
    teams = list(league.team_names)
    venues = {v.name: v for v in league.venues}
    first, last = season_window(league)

    def team(path: str, name: str) -> None:
        if name not in teams:
            problems.append(f"{path}: {show(name)} is not a team{suggestion(name, teams)}")

    def dates_inside(path: str, days) -> None:
        for d in days:
            if d < first or (last is not None and d > last):
                end = last.isoformat() if last else "open"
                problems.append(
                    f"{path}: {d.isoformat()} is outside the season ({first.isoformat()} to {end})"
                )
                return

    pt = doc.played_through
    if pt < first - dt.timedelta(days=1) or (last is not None and pt > last):
        end = last.isoformat() if last else "open"
        problems.append(
            f"played_through: {pt.isoformat()} is outside the season ({first.isoformat()} to "
            f"{end})"
        )
    for i, p in enumerate(doc.postponed):
        team(f"postponed[{i}].home", p.home)
        team(f"postponed[{i}].away", p.away)
        if p.home == p.away:
            problems.append(f"postponed[{i}]: a team cannot play itself ({show(p.home)})")
        if p.date is not None and p.date > pt:
            problems.append(
                f"postponed[{i}].date: {p.date.isoformat()} is after played_through "
                f"{pt.isoformat()}; only games that should already have been played can be "
                "postponed (a later game is simply re-planned)"
            )
    for i, u in enumerate(doc.unavailable):
        team(f"unavailable[{i}].team", u.team)
        dates_inside(f"unavailable[{i}].dates", _flat(u.dates))
    for i, c in enumerate(doc.closed):
        path = f"closed[{i}].venue"
        if c.venue not in venues:
            hint = suggestion(c.venue, list(venues))
            problems.append(f"{path}: {show(c.venue)} is not a venue{hint}")
        else:
            courts = list(venues[c.venue].courts)
            for j, court in enumerate(c.courts):
                if court not in courts:
                    problems.append(
                        f"closed[{i}].courts[{j}]: {show(court)} is not a court of {c.venue}"
                        f"{suggestion(court, courts)}"
                    )
        dates_inside(f"closed[{i}].dates", _flat(c.dates))
    seen: set[str] = set()
    for i, w in enumerate(doc.withdrawn):
        team(f"withdrawn[{i}].team", w.team)
        if w.policy not in POLICIES:
            problems.append(
                f"withdrawn[{i}].policy: {show(w.policy)} is not a policy"
                f"{suggestion(w.policy, POLICIES)} (choose from {', '.join(POLICIES)})"
            )
        if w.team in seen:
            problems.append(f"withdrawn[{i}].team: {show(w.team)} is listed twice")
        seen.add(w.team)
    for i, m in enumerate(doc.moved):
        team(f"moved[{i}].home", m.home)
        team(f"moved[{i}].away", m.away)
        dates_inside(f"moved[{i}].date", (m.date,))
        if m.court is not None and m.home in teams:
            courts = _courts_for(league, m.home)
            if m.court not in courts:
                problems.append(
                    f"moved[{i}].court: {show(m.court)} is not a court where {m.home} can host"
                    f"{suggestion(m.court, courts)}"
                )
    return problems


def _courts_for(league: League, home: str) -> list[str]:
    venue = league.team(home).home_venue
    if league.format.home_meaning == "venue" and venue:
        return list(league.venue(venue).courts)
    return sorted({c for v in league.venues for c in v.courts})


def _build(doc: EventsFile, source: str) -> Events:
    return Events(
        league=doc.league,
        season=doc.season,
        played_through=doc.played_through,
        postponed=tuple(
            Postponed(p.home, p.away, p.date, f"postponed[{i}]")
            for i, p in enumerate(doc.postponed)
        ),
        unavailable=tuple(
            TeamUnavailable(u.team, _flat(u.dates), f"unavailable[{i}]")
            for i, u in enumerate(doc.unavailable)
        ),
        closed=tuple(
            Closure(c.venue, tuple(c.courts), _flat(c.dates), f"closed[{i}]")
            for i, c in enumerate(doc.closed)
        ),
        withdrawn=tuple(
            Withdrawal(w.team, w.policy, f"withdrawn[{i}]")  # type: ignore[arg-type]
            for i, w in enumerate(doc.withdrawn)
        ),
        moved=tuple(
            MovedGame(m.home, m.away, m.date, m.start, m.court, m.from_, f"moved[{i}]")
            for i, m in enumerate(doc.moved)
        ),
        source=source,
    )
