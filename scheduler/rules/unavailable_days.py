"""Unavailable days: a team plays no game on the dates listed in ``rules.unavailable``.

In an even league every team plays every round, so such a date can host no round at all; in an
odd league it can host the round of the team's bye (``scheduler/balance/dates.py``).
"""

from __future__ import annotations

from dataclasses import dataclass
from datetime import date
from typing import TYPE_CHECKING

from scheduler.config.model import League
from scheduler.rules.base import DateModelView, HardRule, TimetableView, Violation

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Season


@dataclass(frozen=True)
class UnavailableDays(HardRule):
    key = "unavailable_days"
    title = "days a team cannot play"
    config_fields = ("rules.unavailable",)
    date_constraints = True

    def is_on(self, league: League) -> bool:
        return any(entry.dates for entry in league.rules.unavailable)

    def statement(self, league: League) -> str:
        return "; ".join(f"{entry.team} does not play on "
                         + ", ".join(d.isoformat() for d in entry.dates)
                         for entry in league.rules.unavailable if entry.dates)

    def named_teams(self, league: League) -> set[str]:
        return {entry.team for entry in league.rules.unavailable}

    def add_constraints(self, model: TimetableView) -> None:
        for entry in model.league.rules.unavailable:
            t = model.team_index[entry.team]
            for d in entry.dates:
                _unavailable(model, t, entry.team, d)

    def add_date_constraints(self, model: DateModelView) -> None:
        """The team plays in no sitting on the dates (the re-plan's date model).

        Parameters
        ----------
        model
            The re-plan model's interface for rules.
        """
        for entry in model.league.rules.unavailable:
            for d in entry.dates:
                sittings = model.sittings_on(d)
                if not sittings:
                    continue
                literal = model.switch(f"{entry.team} is unavailable on {d.isoformat()}")
                for s in sittings:
                    model.cp.add(model.plays(entry.team, s) == 0).only_enforce_if(literal)

    def check(self, league: League, season: Season) -> tuple[Violation, ...]:
        out = []
        for entry in league.rules.unavailable:
            for f in season.fixtures:
                if entry.team in (f.home, f.away) and f.date in entry.dates:
                    other = f.away if f.home == entry.team else f.home
                    out.append(Violation(entry.team, f.round, f.date,
                                         f"plays {other} on {f.date.isoformat()}, a day it "
                                         "is unavailable"))
        return tuple(out)


def _unavailable(model: TimetableView, t: int, name: str, d: date) -> None:
    if model.days is None or d not in model.day_index:
        return
    literal = model.switch(f"{name} is unavailable on {d.isoformat()}")
    for g, on in model.days.groups_on(model.day_index[d]):
        if not model.odd:
            model.cp.add_bool_or([literal.negated(), on.negated()])
        else:
            for s in model.day_groups[g]:
                model.cp.add_bool_or([literal.negated(), on.negated(), model.team_bye(t, s)])
