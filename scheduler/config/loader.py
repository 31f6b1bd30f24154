"""Load a league file into a validated, frozen :class:`~scheduler.config.model.League`.

Four stages, each collecting every problem it can before stopping:

1. read the file (:mod:`scheduler.config.reading`): missing file, not UTF-8, empty, syntax errors
   with line numbers;
2. check its shape (:mod:`scheduler.config.schema`, pydantic): unknown options with
   did-you-mean suggestions, wrong kinds of value, numbers out of range;
3. check references and ranges (:mod:`scheduler.config.checks`): names of teams and venues, dates
   inside the season, time zone, holiday region, repeated names and codes;
4. check for certain contradictions (:mod:`scheduler.config.contradictions`): a season with fewer
   match days than it needs, a team unavailable on too many match days, and the like.

Every failure is a :class:`scheduler.errors.ConfigError` whose problems name the field path
(``teams[3].home_venue: 'North Hal' is not a venue; did you mean 'North Hall'?``).
"""

from __future__ import annotations

import datetime as dt
from collections.abc import Iterable, Mapping
from pathlib import Path
from typing import Any

from pydantic import ValidationError

from scheduler.config.checks import reference_problems, resolve_holidays, season_window
from scheduler.config.codes import make_codes
from scheduler.config.contradictions import season_problems
from scheduler.config.limits import count_problems
from scheduler.config.messages import problems_from
from scheduler.config.model import (
    CalendarSpec,
    FixedFixture,
    Format,
    League,
    Priorities,
    Rules,
    Team,
    TeamDates,
    Venue,
)
from scheduler.config.reading import read_file
from scheduler.config.schema import GOALS, LeagueFile
from scheduler.errors import ConfigError


def read_config_data(path: str | Path) -> Any:
    """The parsed data of a config file (league or federation), every failure a ConfigError
    naming the file: never a traceback for a league organizer.

    Parameters
    ----------
    path : str or pathlib.Path
        A TOML or YAML file.

    Returns
    -------
    Any
        The parsed document (a dict for a usable file).

    Raises
    ------
    ConfigError
        When the file cannot be read or parsed; the message names the file and, for syntax
        errors, the line.
    """
    try:
        return read_file(path)
    except ConfigError:
        raise
    except Exception as exc:
        raise ConfigError(
            [f"the file could not be read ({type(exc).__name__}: {exc})"], path=str(path)
        ) from exc


def load_league(path: str | Path) -> League:
    """Read, check and build the league in ``path`` (``.toml``, ``.yaml`` or ``.yml``).

    Parameters
    ----------
    path
        The league file.

    Returns
    -------
    League
        Frozen, checked values.

    Raises
    ------
    ConfigError
        Every problem found (unreadable file, syntax, unknown options, wrong values, references,
        contradictions), each located by line or field path.

    References
    ----------
    TOML v1.0.0 (toml.io); YAML 1.2; ``docs/limits.md`` for the size limits of the input.

    Examples
    --------
    >>> league = load_league("sample_leagues/club_day.toml")  # doctest: +SKIP
    >>> league.name  # doctest: +SKIP
    'Marrowby Chess Club Squad Weekend'
    """
    return parse_league(read_config_data(path), source=str(path))


def parse_league(data: Mapping[str, Any], source: str = "<config>") -> League:
    """Check and build a league from already-parsed data (the dict a TOML/YAML file gives).

    Parameters
    ----------
    data
        The parsed sections (``league``, ``calendar``, ``venues``, ``teams``, ...).
    source
        Name of the input in messages (the file's path when it came from a file).

    Returns
    -------
    League
        Frozen, checked values.

    Raises
    ------
    ConfigError
        Every problem found, each located by its field path.

    References
    ----------
    ``docs/limits.md`` (limits of the input); ``docs/rules.md`` (the rules a league switches on).

    Examples
    --------
    >>> clubs = ["Quenby", "Larkholt", "Ebbside", "Morrow"]
    >>> league = parse_league({
    ...     "league": {"name": "Quenby Four", "season": "2031", "timezone": "Europe/London"},
    ...     "calendar": {"start": "2031-01-07", "end": "2031-04-29", "weekdays": ["tue"]},
    ...     "venues": [{"name": f"{club} Hall"} for club in clubs],
    ...     "teams": [{"name": club, "home_venue": f"{club} Hall"} for club in clubs]})
    >>> league.name, [team.name for team in league.teams]
    ('Quenby Four', ['Quenby', 'Larkholt', 'Ebbside', 'Morrow'])
    >>> parse_league({
    ...     "league": {"name": "Quenby Two", "season": "2031", "timezone": "Europe/London"},
    ...     "calendar": {"start": "2031-01-07", "end": "2031-04-29", "weekdays": ["tue"]},
    ...     "venues": [{"name": "Quenby Hall"}],
    ...     "teams": [{"name": "Quenby", "home_venue": "Quenby Hal"},
    ...               {"name": "Larkholt", "home_venue": "Quenby Hall"}]})
    Traceback (most recent call last):
    ...
    scheduler.errors.ConfigError: <config>: teams[0].home_venue: 'Quenby Hal' is not a venue; \
did you mean 'Quenby Hall'?
    """
    try:
        return _parse(data, source)
    except ConfigError:
        raise
    except Exception as exc:  # never a traceback for a league organizer
        raise ConfigError(
            [f"the league could not be read ({type(exc).__name__}: {exc})"], path=source
        ) from exc


def _parse(data: Mapping[str, Any], source: str) -> League:
    if not isinstance(data, Mapping):
        raise ConfigError(
            [f"expected sections such as league and teams, got {type(data).__name__}"],
            path=source,
        )
    problems = count_problems(data)
    if problems:
        raise ConfigError(problems, path=source)
    try:
        doc = LeagueFile.model_validate(dict(data))
    except ValidationError as exc:
        raise ConfigError(problems_from(exc), path=source) from None
    problems = reference_problems(doc)
    if problems:
        raise ConfigError(problems, path=source)
    league = build_league(doc, source)
    problems = season_problems(league)
    if problems:
        raise ConfigError(problems, path=source)
    return league


DEFAULT_TIME_LIMIT_SECONDS = 10.0


def _time_limit(doc: LeagueFile, source: str | None) -> float:
    """``league.time_limit_seconds``, or its old name ``solve_seconds``, or the default."""
    new, old = doc.league.time_limit_seconds, doc.league.solve_seconds
    if new is not None and old is not None:
        raise ConfigError(
            ["league.solve_seconds: the old name of league.time_limit_seconds; give only "
             "time_limit_seconds"],
            path=source,
        )
    chosen = new if new is not None else old
    return float(chosen) if chosen is not None else DEFAULT_TIME_LIMIT_SECONDS


def _within(days: Iterable[dt.date], first: dt.date | None, last: dt.date | None) -> tuple:
    return tuple(
        sorted({d for d in days if (first is None or d >= first) and (last is None or d <= last)})
    )


def _flat(groups: Iterable[tuple[dt.date, ...]]) -> list[dt.date]:
    return [d for group in groups for d in group]


def priorities_of(doc: LeagueFile) -> Priorities:
    """Weights from ``[priorities]``: given weights, or an ``order`` turned into weights.

    ``order = [a, b, c]`` gives ``a`` the weight 3, ``b`` 2, ``c`` 1 (the first is the most
    important) and every goal left out 0 (not pursued).

    Parameters
    ----------
    doc : LeagueFile
        The shape-valid league file.

    Returns
    -------
    Priorities
        The weights; goals the file does not mention keep their defaults (without ``order``).
    """
    pri = doc.priorities
    if pri.order is not None:
        top = len(pri.order)
        weights = {goal: top - i for i, goal in enumerate(pri.order)}
        return Priorities(**{goal: weights.get(goal, 0) for goal in GOALS})
    defaults = Priorities()
    return Priorities(
        **{
            goal: getattr(pri, goal) if getattr(pri, goal) is not None else getattr(defaults, goal)
            for goal in GOALS
        }
    )


def build_league(doc: LeagueFile, source: str | None = None) -> League:
    """The frozen League of a checked league file (no further checks).

    Parameters
    ----------
    doc : LeagueFile
        A league file that passed every check (shape, references and contradictions).
    source : str or None, optional
        The file it was read from, kept for messages.

    Returns
    -------
    League
        The frozen league: codes made for teams without one, date ranges expanded and clipped
        to the season, the holiday region in the ``holidays`` package's spelling.
    """
    cal = doc.calendar
    first, last = season_window(doc)
    country = subdivision = None
    if cal.holidays is not None:
        country, subdivision, _ = resolve_holidays(cal.holidays.country, cal.holidays.subdivision)
    dates = tuple(sorted(set(_flat(cal.dates))))
    calendar = CalendarSpec(
        start=cal.start or dates[0],
        end=cal.end,
        weekdays=tuple(sorted(set(cal.weekdays))),
        excluded=_within(_flat(cal.excluded), first, last),
        dates=dates,
        holidays_country=country,
        holidays_subdivision=subdivision,
        rounds_per_day=cal.rounds_per_day,
        kickoff=cal.kickoff,
        game_minutes=cal.game_minutes,
        reserve_dates=_within(_flat(cal.reserve_dates), first, last),
    )
    codes = make_codes((t.name for t in doc.teams), (t.code for t in doc.teams))
    teams = tuple(
        Team(name=t.name, code=code, home_venue=t.home_venue)
        for t, code in zip(doc.teams, codes, strict=True)
    )
    venues = tuple(
        Venue(
            name=v.name,
            courts=tuple(v.courts),
            slots=tuple(v.slots),
            address=v.address,
            latitude=v.latitude,
            longitude=v.longitude,
        )
        for v in doc.venues
    )
    r = doc.rules
    rules = Rules(
        unavailable=tuple(
            TeamDates(team=e.team, dates=_within(_flat(e.dates), first, last))
            for e in r.unavailable
        ),
        no_home_games=tuple(
            TeamDates(team=e.team, dates=_within(_flat(e.dates), first, last))
            for e in r.no_home_games
        ),
        shared_grounds=tuple(tuple(g) for g in r.shared_grounds),
        fixed=tuple(
            FixedFixture(
                home=f.home, away=f.away, round=f.round, date=f.date, any_venue=f.any_venue
            )
            for f in r.fixed
        ),
        max_home_run=r.max_home_run,
        max_away_run=r.max_away_run,
        no_breaks_first=r.no_breaks_first,
        no_breaks_last=r.no_breaks_last,
        min_rest_days=r.min_rest_days,
        min_separation=r.min_separation,
    )
    fmt = doc.format
    return League(
        name=doc.league.name,
        season=doc.league.season,
        timezone=doc.league.timezone,
        teams=teams,
        venues=venues,
        format=Format(
            legs=fmt.legs,
            scheme=fmt.scheme,  # type: ignore[arg-type]
            home_meaning=fmt.home_meaning,  # type: ignore[arg-type]
            side_labels=(fmt.side_labels[0], fmt.side_labels[1]),
        ),
        calendar=calendar,
        rules=rules,
        priorities=priorities_of(doc),
        seed=doc.league.seed,
        solve_seconds=_time_limit(doc, source),
        source=source,
    )
