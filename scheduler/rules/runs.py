"""Runs: at most ``max_home_run`` home games and ``max_away_run`` away games in a row.

Runs are counted over the games a team actually plays (a bye is skipped, as for breaks; see
``scheduler/home_away.py``). A limit on such runs is a classic constraint, e.g. at most 3 in the
traveling tournament problem (Easton, Nemhauser & Trick, CP 2001, LNCS 2239, from memory).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING, Any

from scheduler.config.model import League
from scheduler.rules.base import DateModelView, HardRule, TimetableView, Violation, team_games

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Season


def _limits(league: League) -> list[tuple[int, bool, str]]:
    r = league.rules
    return [(value, home, word) for value, home, word in
            ((r.max_home_run, True, "home"), (r.max_away_run, False, "away")) if value is not None]


@dataclass(frozen=True)
class RunLimits(HardRule):
    key = "runs"
    title = "runs of home or away games"
    config_fields = ("rules.max_home_run", "rules.max_away_run")
    date_constraints = True

    def is_on(self, league: League) -> bool:
        return bool(_limits(league))

    def statement(self, league: League) -> str:
        return "; ".join(f"at most {value} {word} games in a row"
                         for value, _, word in _limits(league))

    def add_constraints(self, model: TimetableView) -> None:
        for value, home, word in _limits(model.league):
            literal = model.switch(f"max_{word}_run = {value} for every team")
            if value < 1:
                model.cp.add_bool_or([literal.negated()])
                continue
            for v in model.vertices:
                _run_limit(model, v, value, home, literal)

    def add_date_constraints(self, model: DateModelView) -> None:
        """In the re-plan's date model: no team plays more than ``max_home_run`` home (or
        ``max_away_run`` away) games in a row, in the order of the sittings, continuing the
        run its history ends with.

        Parameters
        ----------
        model
            The re-plan model's interface for rules.
        """
        for value, home, word in _limits(model.league):
            literal = model.switch(f"at most {value} {word} games in a row (max_{word}_run)")
            for team in model.teams:
                _date_run_limit(model, team, value, home, literal)

    def check(self, league: League, season: Season) -> tuple[Violation, ...]:
        out = []
        for team in season.teams:
            games = team_games(season, team)
            for value, home, word in _limits(league):
                run = 0
                for f in games:
                    run = run + 1 if (f.home == team) is home else 0
                    if run == value + 1:
                        out.append(Violation(team, f.round, f.date,
                                             f"{value + 1} {word} games in a row "
                                             f"(at most {value})"))
        return tuple(out)

    def lowered(self, league: League) -> tuple[tuple[str, int], ...]:
        return tuple((f"max_{word}_run", value + 1) for value, _, word in _limits(league))


def _run_limit(model: TimetableView, v: int, value: int, home: bool, literal) -> None:
    """At most ``value`` consecutive home (or away) games of vertex ``v`` under ``literal``."""
    cp, rounds = model.cp, model.season_rounds
    if not model.odd:
        # every vertex plays every round: any value + 1 consecutive rounds hold both venues
        for s in range(rounds - value):
            window = [model.vertex_home(u, v) for u in range(s, s + value + 1)]
            if home:
                cp.add(sum(window) <= value).only_enforce_if(literal)
            else:
                cp.add(sum(window) >= 1).only_enforce_if(literal)
        return
    # odd league: a counter of the current run that a bye leaves unchanged
    previous = None
    for s in range(rounds):
        run = cp.new_int_var(0, value, f"{'home' if home else 'away'}_run_of_vertex{v}_round{s}")
        plays = model.vertex_plays(s, v)
        at_home = model.vertex_home(s, v)
        same = at_home if home else at_home.negated()
        if previous is None:
            cp.add(run == 1).only_enforce_if([literal, plays, same])
            cp.add(run == 0).only_enforce_if([literal, plays, same.negated()])
            cp.add(run == 0).only_enforce_if([literal, plays.negated()])
        else:
            cp.add(run == previous + 1).only_enforce_if([literal, plays, same])
            cp.add(run == 0).only_enforce_if([literal, plays, same.negated()])
            cp.add(run == previous).only_enforce_if([literal, plays.negated()])
        previous = run


def _date_run_limit(model: DateModelView, team: str, value: int, home: bool, literal) -> None:
    """Under ``literal``: at most ``value`` home (or away) games of ``team`` in a row over the
    sittings, a counter of the current run that a sitting without a game leaves unchanged."""
    cp = model.cp
    start = model.run_from_history(team, home)
    top = max(value, start)
    previous: Any = start
    side = "home" if home else "away"
    for d in range(len(model.days)):
        same = model.home(team, d) if home else model.away(team, d)
        other = model.away(team, d) if home else model.home(team, d)
        run = cp.new_int_var(0, top, f"{team}_{side}_run_day{d}")
        cp.add(run == previous + 1).only_enforce_if([literal, same])
        cp.add(run <= value).only_enforce_if([literal, same])
        cp.add(run == 0).only_enforce_if([literal, other])
        cp.add(run == previous).only_enforce_if([literal, same.negated(), other.negated()])
        previous = run
