"""Rounds to match days.

The season's rounds are cut into *day groups* of ``calendar.rounds_per_day`` consecutive rounds;
each group is played on one match day and the days follow the round order. When the calendar
offers more match days than needed, the timetable model chooses which ones (earliest first, as
far as the rules allow), respecting:

- team unavailability: in an even league every team plays every round, so a date on which a team
  is unavailable can host no round; in an odd league it can host the round of that team's bye;
- no home games of a team on a date; fixed-date fixtures;
- ``min_rest_days``: between two consecutive games of a team at least ``value`` rest days
  (:func:`scheduler.rules.rest_days.rest_days_between`).
  In any two consecutive rounds of a league of three or more teams some team plays in both (at
  most one bye per round), so the rule is exactly a gap of ``value + 1`` days between the match
  days of consecutive rounds, and two rounds on one day break it.

The allowed dates themselves come from ``scheduler.calendar`` (``match_days``, ``kickoff``).
"""

from __future__ import annotations

from datetime import date

from ortools.sat.python import cp_model

from scheduler.calendar import days_needed, kickoff, match_days
from scheduler.config.model import League

__all__ = ["DayModel", "candidate_days", "day_groups", "kickoff"]


def day_groups(rounds: int, per_day: int) -> list[list[int]]:
    """Season rounds (0-based) grouped per match day.

    Parameters
    ----------
    rounds
        Number of rounds of the season.
    per_day
        Rounds played on one match day (values below 1 count as 1).

    Returns
    -------
    list of list of int
        Consecutive rounds per day; the last day may hold fewer.

    Examples
    --------
    >>> day_groups(5, 2)
    [[0, 1], [2, 3], [4]]
    """
    per_day = max(1, per_day)
    return [list(range(i, min(rounds, i + per_day))) for i in range(0, rounds, per_day)]


def candidate_days(league: League, rounds: int) -> tuple[date, ...]:
    """The match days the model may use: all allowed days up to ``calendar.end``; without an end,
    enough days for the season plus one spare per date named in a rule, and at least up to the
    latest fixed-fixture date.

    Parameters
    ----------
    league
        The league (its calendar and the dates its rules name).
    rounds
        Number of rounds of the season.

    Returns
    -------
    tuple of datetime.date
        The candidate match days in order.

    Raises
    ------
    ConfigError
        Too few match days in the calendar, located at the calendar's fields.
    """
    per_day = max(1, league.calendar.rounds_per_day)
    groups = max(days_needed(league), -(-rounds // per_day))
    cal = league.calendar
    if cal.end is not None or cal.dates:
        return tuple(match_days(league, groups))
    r = league.rules
    named = {d for td in r.unavailable for d in td.dates}
    named |= {d for td in r.no_home_games for d in td.dates}
    fixed_dates = [f.date for f in r.fixed if f.date is not None]
    named |= set(fixed_dates)
    needed = groups + len(named)
    days = match_days(league, needed)
    if fixed_dates:
        latest = max(fixed_dates)
        while days and days[-1] < latest and len(days) < needed + 520:
            needed += 10
            days = match_days(league, needed)
    return tuple(days)


class DayModel:
    """CP-SAT variables placing day groups on candidate days.

    ``on[(g, d)]`` is true when day group ``g`` is played on candidate day ``d`` (an index into
    ``days``); only ``len(days) - groups + 1`` days are possible for each group, in order.

    Parameters
    ----------
    model
        The CP-SAT model the variables are added to.
    days
        The candidate match days (:func:`candidate_days`).
    groups
        Number of day groups (:func:`day_groups`); at most ``len(days)``.
    hint
        Hint each group onto its earliest possible day.
    """

    def __init__(self, model: cp_model.CpModel, days: tuple[date, ...], groups: int,
                 hint: bool = True) -> None:
        self.days = days
        self.groups = groups
        self.on: dict[tuple[int, int], cp_model.IntVar] = {}
        self.index: list[cp_model.LinearExpr | int] = []
        self.ordinal: list[cp_model.LinearExprT] = []
        slack = len(days) - groups
        base = days[0].toordinal() if days else 0
        for g in range(groups):
            lits = []
            for d in range(g, g + slack + 1):
                lit = model.new_bool_var(f"day_{g}_{d}")
                self.on[(g, d)] = lit
                lits.append((d, lit))
                if hint:
                    model.add_hint(lit, d == g)
            model.add_exactly_one(lit for _, lit in lits)
            self.index.append(sum(d * lit for d, lit in lits))
            self.ordinal.append(sum((days[d].toordinal() - base) * lit for d, lit in lits))
        for g in range(groups - 1):
            model.add(self.index[g + 1] >= self.index[g] + 1)

    def groups_on(self, d: int) -> list[tuple[int, cp_model.IntVar]]:
        """(group, literal) for every group that may be played on candidate day ``d``.

        Parameters
        ----------
        d
            Index of a candidate day in ``days``.

        Returns
        -------
        list of (int, ortools.sat.python.cp_model.IntVar)
            The groups possible on that day, with the literal that places them there.
        """
        return [(g, lit) for (g, dd), lit in self.on.items() if dd == d]

    def lateness(self) -> cp_model.LinearExpr | int:
        """Sum of the chosen day indices (to prefer the earliest days).

        Returns
        -------
        ortools.sat.python.cp_model.LinearExpr or int
            0 when every group is on its earliest possible day; an objective term.
        """
        return sum(self.index) - sum(range(self.groups))
