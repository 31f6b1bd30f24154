"""Fixed games: a pair plays in a given round and/or on a given date, with the named home team
unless ``any_venue``."""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

from scheduler.config.model import FixedFixture, League
from scheduler.rules.base import HardRule, TimetableView, Violation

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Season


def _where(fixture: FixedFixture) -> str:
    return " ".join(x for x in (
        f"in round {fixture.round}" if fixture.round is not None else "",
        f"on {fixture.date.isoformat()}" if fixture.date is not None else "") if x)


@dataclass(frozen=True)
class FixedGames(HardRule):
    key = "fixed_games"
    title = "games fixed to a round or a date"
    config_fields = ("rules.fixed",)

    def is_on(self, league: League) -> bool:
        return bool(league.rules.fixed)

    def statement(self, league: League) -> str:
        return "; ".join(f"{f.home} v {f.away} {_where(f)}"
                         + (" (either venue)" if f.any_venue else "")
                         for f in league.rules.fixed)

    def named_teams(self, league: League) -> set[str]:
        return {name for f in league.rules.fixed for name in (f.home, f.away)}

    def add_constraints(self, model: TimetableView) -> None:
        for fixture in model.league.rules.fixed:
            _fixed(model, fixture)

    def check(self, league: League, season: Season) -> tuple[Violation, ...]:
        out = []
        for fx in league.rules.fixed:
            found = any(
                {f.home, f.away} == {fx.home, fx.away}
                and (fx.round is None or f.round == fx.round)
                and (fx.date is None or f.date == fx.date)
                and (fx.any_venue or f.home == fx.home)
                for f in season.fixtures)
            if not found:
                venue = "" if fx.any_venue else f" with {fx.home} at home"
                out.append(Violation(f"{fx.home}, {fx.away}", fx.round, fx.date,
                                     f"{fx.home} v {fx.away} is not played {_where(fx)}{venue}"))
        return tuple(out)


def _fixed(model: TimetableView, f: FixedFixture) -> None:
    cp = model.cp
    a, b = model.team_index[f.home], model.team_index[f.away]
    venue = " (either venue)" if f.any_venue else ""
    literal = model.switch(f"fixed: {f.home} v {f.away} {_where(f)}{venue}")
    if f.round is not None:
        s = f.round - 1
        if not 0 <= s < model.season_rounds:
            cp.add_bool_or([literal.negated()])
            return
        model.teams_meet(a, b, s, literal)
        if not f.any_venue:
            cp.add_implication(literal, model.team_home(a, s))
        if f.date is not None:  # both a round and a date: that round on that date
            on = None
            if model.days is not None and f.date in model.day_index:
                on = model.days.on.get((model.group_of_round[s], model.day_index[f.date]))
            if on is None:
                cp.add_bool_or([literal.negated()])
            else:
                cp.add_implication(literal, on)
        return
    if model.days is None or f.date not in model.day_index:
        cp.add_bool_or([literal.negated()])
        return
    d = model.day_index[f.date]
    options = []
    for g, on in model.days.groups_on(d):
        for s in model.day_groups[g]:
            meets_here = cp.new_bool_var(f"fixed_{a}_v_{b}_in_round{s}")
            cp.add_implication(meets_here, on)
            model.teams_meet(a, b, s, meets_here)
            if not f.any_venue:
                cp.add_implication(meets_here, model.team_home(a, s))
            options.append(meets_here)
    cp.add_bool_or([literal.negated(), *options])
