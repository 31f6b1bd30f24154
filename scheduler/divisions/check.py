"""An independent check of the rules across divisions, from the fixtures alone.

It reads the planned seasons and the federation file's values and nothing of the planner (not
its shares of venues, not the rules it added), and reports every broken rule:

- a team listed in two divisions' seasons;
- two games at one venue, on one court, at overlapping times (whatever their divisions), with
  each game lasting its division's ``game_minutes``;
- two teams of one shared ground, of different divisions, both at home on one day;
- two teams of one player group playing at overlapping times.

It also measures the complementary pattern: for each ``complementary`` pair, on how many of the
days both played exactly one of them was at home; where the plan promised the pattern (units
planned by the joint model) a day that misses it is a problem.
"""

from __future__ import annotations

import itertools
from collections.abc import Collection, Mapping
from dataclasses import dataclass
from datetime import date, datetime, timedelta

from scheduler.config.federation import Federation
from scheduler.season import Season


@dataclass(frozen=True, slots=True)
class ComplementFigure:
    """For one complementary pair: days with exactly one of the two at home and the other away,
    out of the days on which both played.

    Parameters
    ----------
    ground : str
        The shared ground.
    teams : tuple of str
        The pair, in file order.
    complementary_days : int
        Days both played with exactly one of them at home.
    common_days : int
        Days both played.
    enforced : bool
        Whether the plan promised the pattern (joint model).
    """

    ground: str
    teams: tuple[str, str]
    complementary_days: int
    common_days: int
    enforced: bool = False
    """Whether the plan promised the pattern (then every missed day is a problem)."""


@dataclass(frozen=True)
class CrossCheck:
    """The outcome of :func:`check_federation`.

    Parameters
    ----------
    problems : tuple of str
        Every broken rule in plain words (empty when every rule holds).
    complement : tuple of ComplementFigure
        The figures of the complementary pairs.

    Examples
    --------
    >>> CrossCheck((), ()).valid
    True
    >>> CrossCheck(("a broken rule",), ()).valid
    False
    """

    problems: tuple[str, ...]
    complement: tuple[ComplementFigure, ...]

    @property
    def valid(self) -> bool:
        """Whether every rule across divisions holds.

        Returns
        -------
        bool
        """
        return not self.problems


def _interval(start: datetime | None, day: date | None, minutes: int):
    if start is not None:
        return (start, start + timedelta(minutes=minutes))
    if day is not None:
        first = datetime(day.year, day.month, day.day)
        return (first, first + timedelta(days=1))
    return None


def _overlap(a, b) -> bool:
    if (a[0].tzinfo is None) != (b[0].tzinfo is None):
        return a[0].date() == b[0].date()
    return a[0] < b[1] and b[0] < a[1]


def check_federation(fed: Federation, seasons: Mapping[str, Season],
                     complementary_required: Collection[str] = ()) -> CrossCheck:
    """Check the rules across divisions in the planned ``seasons`` (division name -> season).

    Parameters
    ----------
    fed
        The federation (for its grounds, player groups and each division's game length).
    seasons
        The planned season of every division.
    complementary_required
        Names of ``complementary`` shared grounds whose pattern the plan promised (planned by
        the joint model): a common match day without exactly one of the pair at home is then
        a problem; for the others it is only measured.

    Returns
    -------
    CrossCheck
        Every broken rule in plain words, and the complementary figures.

    Examples
    --------
    >>> from scheduler.config.federation import parse_federation
    >>> def division(name, teams):
    ...     return {"name": name, "teams": [{"name": t, "home_venue": f"{t} Ground"}
    ...                                      for t in teams]}
    >>> fed = parse_federation({
    ...     "federation": {"name": "Example", "season": "2031", "timezone": "Europe/London",
    ...                    "solve_seconds": 1},
    ...     "calendar": {"start": "2031-09-06", "end": "2031-12-20", "weekdays": ["sat"]},
    ...     "venues": [{"name": f"{t} Ground"} for t in "ABCDEFGH"],
    ...     "divisions": [division("First", "ABCD"), division("Reserves", "EF"),
    ...                   division("Other", "GH")],
    ...     "shared_grounds": [{"teams": ["A", "E"], "pattern": "complementary"}]})
    >>> from scheduler.divisions import plan_unit, units_of
    >>> plans = [p for unit in units_of(fed) for p in plan_unit(fed, unit).plans]
    >>> check = check_federation(fed, {p.name: p.season for p in plans}, ["A / E"])
    >>> check.valid, check.complement[0].complementary_days == check.complement[0].common_days
    (True, True)

    References
    ----------
    ``docs/divisions.md``, "The independent check" (the rules are common practice).
    """
    problems: list[str] = []
    owner: dict[str, str] = {}
    for name, season in seasons.items():
        for team in season.teams:
            if team in owner and owner[team] != name:
                problems.append(f"team {team!r} plays in two divisions: {owner[team]!r}, {name!r}")
            owner.setdefault(team, name)
    minutes = {d.name: d.league.calendar.game_minutes for d in fed.divisions}
    games = []  # (division, fixture, interval)
    for name, season in seasons.items():
        for f in season.fixtures:
            span = _interval(f.start, f.date, minutes.get(name, 90))
            if span is not None:
                games.append((name, f, span))
    by_place: dict[tuple, list] = {}
    for g in games:
        f = g[1]
        if f.venue is not None:
            by_place.setdefault((f.venue, f.court, g[2][0].date()), []).append(g)
    for (venue, court, day), items in sorted(by_place.items(), key=lambda kv: str(kv[0])):
        for a, b in itertools.combinations(items, 2):
            if _overlap(a[2], b[2]):
                problems.append(
                    f"{venue}, {court or 'the ground'}, {day}: {a[1].home} v {a[1].away} "
                    f"({a[0]}) and {b[1].home} v {b[1].away} ({b[0]}) overlap")
    home_days: dict[str, set[date]] = {}
    away_days: dict[str, set[date]] = {}
    for _, f, span in games:
        home_days.setdefault(f.home, set()).add(span[0].date())
        away_days.setdefault(f.away, set()).add(span[0].date())
    figures = []
    for ground in fed.shared_grounds:
        for a, b in itertools.combinations(ground.teams, 2):
            if owner.get(a) == owner.get(b):
                continue
            for day in sorted(home_days.get(a, set()) & home_days.get(b, set())):
                problems.append(f"shared ground {ground.name!r}: {a} and {b} both at home on {day}")
        if ground.pattern == "complementary" and len(ground.teams) == 2:
            a, b = ground.teams
            played_a = home_days.get(a, set()) | away_days.get(a, set())
            played_b = home_days.get(b, set()) | away_days.get(b, set())
            common = played_a & played_b
            missed = sorted(day for day in common
                            if (day in home_days.get(a, set())) == (day in home_days.get(b, set())))
            required = ground.name in complementary_required
            figures.append(ComplementFigure(ground.name, (a, b), len(common) - len(missed),
                                            len(common), required))
            if required:
                problems.extend(f"shared ground {ground.name!r} (complementary): {a} and {b} are "
                                f"not one at home and one away on {day}" for day in missed)
    spans: dict[str, list] = {}
    for name, f, span in games:
        for team in f.teams:
            spans.setdefault(team, []).append((name, f, span))
    for group in fed.player_groups:
        for a, b in itertools.combinations(group.teams, 2):
            for x in spans.get(a, []):
                for y in spans.get(b, []):
                    if x[1] is not y[1] and _overlap(x[2], y[2]):
                        problems.append(
                            f"player group {group.name!r}: {a} ({x[1].home} v {x[1].away}) and "
                            f"{b} ({y[1].home} v {y[1].away}) play at the same time on "
                            f"{x[2][0].date()}")
    return CrossCheck(tuple(problems), tuple(figures))
