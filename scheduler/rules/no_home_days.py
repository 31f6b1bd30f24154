"""No-home days: a team does not play at home on the dates listed in ``rules.no_home_games``
(its ground is taken, e.g. by another event)."""

from __future__ import annotations

from dataclasses import dataclass
from datetime import date
from typing import TYPE_CHECKING

from scheduler.config.model import League
from scheduler.rules.base import DateModelView, HardRule, TimetableView, Violation

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Season


@dataclass(frozen=True)
class NoHomeDays(HardRule):
    key = "no_home_days"
    title = "days a team cannot play at home"
    config_fields = ("rules.no_home_games",)
    date_constraints = True

    def is_on(self, league: League) -> bool:
        return any(entry.dates for entry in league.rules.no_home_games)

    def statement(self, league: League) -> str:
        return "; ".join(f"{entry.team} is not at home on "
                         + ", ".join(d.isoformat() for d in entry.dates)
                         for entry in league.rules.no_home_games if entry.dates)

    def named_teams(self, league: League) -> set[str]:
        return {entry.team for entry in league.rules.no_home_games}

    def add_constraints(self, model: TimetableView) -> None:
        for entry in model.league.rules.no_home_games:
            t = model.team_index[entry.team]
            for d in entry.dates:
                _no_home(model, t, entry.team, d)

    def add_date_constraints(self, model: DateModelView) -> None:
        """The team is at home in no sitting on the dates (the re-plan's date model).

        Parameters
        ----------
        model
            The re-plan model's interface for rules.
        """
        for entry in model.league.rules.no_home_games:
            for d in entry.dates:
                sittings = model.sittings_on(d)
                if not sittings:
                    continue
                literal = model.switch(f"{entry.team} cannot play at home on {d.isoformat()}")
                for s in sittings:
                    model.cp.add(model.home(entry.team, s) == 0).only_enforce_if(literal)

    def check(self, league: League, season: Season) -> tuple[Violation, ...]:
        out = []
        for entry in league.rules.no_home_games:
            for f in season.fixtures:
                if f.home == entry.team and f.date in entry.dates:
                    out.append(Violation(entry.team, f.round, f.date,
                                         f"hosts {f.away} on {f.date.isoformat()}, a day it "
                                         "cannot play at home"))
        return tuple(out)


def _no_home(model: TimetableView, t: int, name: str, d: date) -> None:
    if model.days is None or d not in model.day_index:
        return
    literal = model.switch(f"{name} cannot play at home on {d.isoformat()}")
    for g, on in model.days.groups_on(model.day_index[d]):
        for s in model.day_groups[g]:
            model.cp.add_bool_or([literal.negated(), on.negated(), model.team_home(t, s).negated()])
