"""Rest days: at least ``min_rest_days`` whole days without a game between two games of a team.

Tuesday then Friday gives 2 rest days (:func:`rest_days_between`, the one home of that count).
In any two consecutive rounds of a league of three or more teams some team plays in both (at most
one bye per round), so the rule is exactly a gap of ``value + 1`` days between the match days of
consecutive rounds, and two rounds on one match day break it (``scheduler/balance/dates.py``).
``min_rest_days = 0`` with one round a match day holds by construction: the rule is then off.

Before any solving, :func:`calendar_clash` finds the calendars on which the rule cannot hold
whatever the pairings: the longest chain of candidate match days whose gaps are all at least
``value + 1`` days (taken greedily, which is optimal for a chain with minimum gaps: an exchange
argument, common practice) is shorter than the season.
"""

from __future__ import annotations

import itertools
from collections.abc import Sequence
from dataclasses import dataclass
from datetime import date
from typing import TYPE_CHECKING

from scheduler.config.model import League
from scheduler.rules.base import (
    DateModelView,
    HardRule,
    TimetableView,
    Violation,
    plural,
    team_games,
)

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Season

WEEKDAY_NAMES = ("Mondays", "Tuesdays", "Wednesdays", "Thursdays", "Fridays", "Saturdays",
                 "Sundays")


@dataclass(frozen=True)
class RestDays(HardRule):
    key = "rest_days"
    title = "rest days between games"
    config_fields = ("rules.min_rest_days", "calendar.rounds_per_day")
    date_constraints = True

    def is_on(self, league: League) -> bool:
        value = league.rules.min_rest_days
        if value is None:
            return False
        return value > 0 or league.calendar.rounds_per_day > 1

    def statement(self, league: League) -> str:
        value = league.rules.min_rest_days or 0
        return f"at least {plural(value, 'rest day')} between two games of a team"

    def add_constraints(self, model: TimetableView) -> None:
        value = model.league.rules.min_rest_days
        if value is None or model.days is None:
            return
        text = f"min_rest_days = {value}"
        if model.rounds_per_day > 1:
            model.impossible(f"{text} (with {model.rounds_per_day} rounds on each match day)")
            return
        if value == 0:
            return  # consecutive rounds are on different days: nothing to require
        clash = calendar_clash(value, model.days.days, len(model.day_groups))
        if clash is not None:
            model.impossible(f"{text}: {clash}")
            return
        literal = model.switch(text)
        ordinal = model.days.ordinal
        for g in range(len(model.day_groups) - 1):
            model.cp.add(ordinal[g + 1] - ordinal[g] >= value + 1).only_enforce_if(literal)

    def add_date_constraints(self, model: DateModelView) -> None:
        """In the re-plan's date model: no team plays in two sittings fewer than ``value``
        rest days apart (two games on one day have -1, so they break any value), nor in a
        sitting too soon after its last game in history.

        Parameters
        ----------
        model
            The re-plan model's interface for rules.
        """
        value = model.league.rules.min_rest_days
        if value is None:
            return
        literal = model.switch(f"at least {plural(value, 'rest day')} between two games of a "
                               "team (min_rest_days)")
        days = model.days
        for i, first in enumerate(days):
            for j in range(i + 1, len(days)):
                if rest_days_between(first, days[j]) >= value:
                    break
                for team in model.teams:
                    model.cp.add(model.plays(team, i) + model.plays(team, j) <= 1
                                 ).only_enforce_if(literal)
        for team in model.teams:
            last = model.last_played.get(team)
            if last is None:
                continue
            for j, day in enumerate(days):
                if rest_days_between(last, day) >= value:
                    break
                model.cp.add(model.plays(team, j) == 0).only_enforce_if(literal)

    def check(self, league: League, season: Season) -> tuple[Violation, ...]:
        value = league.rules.min_rest_days
        if value is None:
            return ()
        out = []
        for team in season.teams:
            # rest is felt in date order (a re-planned game keeps its round but not its date)
            games = sorted(team_games(season, team), key=lambda f: f.date or date.min)
            for prev, cur in itertools.pairwise(games):
                if prev.date is None or cur.date is None:
                    continue
                rest = rest_days_between(prev.date, cur.date)
                if rest < value:
                    out.append(Violation(team, cur.round, cur.date,
                                         f"{plural(max(rest, 0), 'rest day')} since "
                                         f"{prev.date.isoformat()} (at least {value})"
                                         if rest >= 0 else
                                         f"a second game on {cur.date.isoformat()} "
                                         f"(at least {plural(value, 'rest day')})"))
        return tuple(out)

    def lowered(self, league: League) -> tuple[tuple[str, int], ...]:
        value = league.rules.min_rest_days
        return (("min_rest_days", value - 1),) if value else ()


def rest_days_between(earlier: date, later: date) -> int:
    """Whole days without a game between a team's games on ``earlier`` and ``later``.

    The one home of the count behind ``min_rest_days``: the rule's constraints and check, the
    calendar clash, the re-plan's checks and priorities and the report's notes. Tuesday then
    Friday gives 2, consecutive days 0, two games on one day -1 (callers that show rest clamp
    that to 0). The report's rest figures count the same over numpy day numbers
    (``scheduler/fairness/rest.py``, tested against pandas).

    Parameters
    ----------
    earlier : datetime.date
        The date of the first game.
    later : datetime.date
        The date of the next game.

    Returns
    -------
    int
        ``(later - earlier).days - 1``.

    Examples
    --------
    >>> from datetime import date
    >>> rest_days_between(date(2026, 9, 1), date(2026, 9, 4))  # Tuesday, then Friday
    2
    >>> rest_days_between(date(2026, 9, 5), date(2026, 9, 5))
    -1
    """
    return (later - earlier).days - 1


def longest_rested_chain(value: int, days: Sequence[date]) -> int:
    """How many of ``days`` (sorted) can be used in order with at least ``value`` free days
    between consecutive ones (greedy from the first day).

    Parameters
    ----------
    value : int
        The least number of free days between two used days.
    days : sequence of datetime.date
        Match days in date order.

    Returns
    -------
    int
        The length of the greedy chain, which is the longest possible (taking the earliest day
        that fits never shortens the chain).

    Examples
    --------
    >>> from datetime import date, timedelta
    >>> saturdays = [date(2026, 9, 5) + timedelta(weeks=w) for w in range(10)]
    >>> longest_rested_chain(6, saturdays), longest_rested_chain(8, saturdays)
    (10, 5)
    """
    count, last = 0, None
    for d in days:
        if last is None or rest_days_between(last, d) >= value:
            count, last = count + 1, d
    return count


def calendar_clash(value: int, days: Sequence[date], rounds: int) -> str | None:
    """Why the calendar alone makes ``min_rest_days = value`` impossible for ``rounds`` match
    days, or ``None`` when it does not.

    Parameters
    ----------
    value : int
        ``rules.min_rest_days``.
    days : sequence of datetime.date
        The match days, in date order.
    rounds : int
        How many match days a team needs to play its games.

    Returns
    -------
    str or None
        The reason in the organizer's words, with the fix; None when the calendar leaves room.
    """
    fit = longest_rested_chain(value, days)
    if fit >= rounds or not days:
        return None
    weekdays = sorted({d.weekday() for d in days})
    gaps = [rest_days_between(a, b) for a, b in itertools.pairwise(days)]
    widest = max(gaps, default=0)
    on = (f"match days are {', '.join(WEEKDAY_NAMES[w] for w in weekdays)}"
          if len(weekdays) <= 3 else "the calendar's match days")
    return (f"{on} ({days[0].isoformat()} to {days[-1].isoformat()}), at most "
            f"{plural(widest, 'free day')} apart; with {value} rest days only {fit} of the "
            f"{rounds} match days fit. This is the calendar, not the pairings: add match days "
            f"(a later end, more weekdays) or lower min_rest_days")
