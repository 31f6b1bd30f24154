"""No breaks at the start or the end: ``no_breaks_first = k`` forbids a break in rounds
2..k+1, ``no_breaks_last = k`` in the last ``k`` rounds.

A break is two home or two away games in a row, counted in the second (de Werra 1981; byes
skipped, ``scheduler/home_away.py``). Leagues often ask for this so that the table is not
distorted early or late (common practice).
"""

from __future__ import annotations

import itertools
from dataclasses import dataclass
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


def _season_rounds(season: Season) -> int:
    return max((f.round for f in season.fixtures), default=0)


@dataclass(frozen=True)
class BreakFreeEnds(HardRule):
    key = "break_free_ends"
    title = "no breaks at the start or the end"
    config_fields = ("rules.no_breaks_first", "rules.no_breaks_last")
    date_constraints = True

    def is_on(self, league: League) -> bool:
        return bool(league.rules.no_breaks_first or league.rules.no_breaks_last)

    def statement(self, league: League) -> str:
        r = league.rules
        parts = []
        if r.no_breaks_first:
            parts.append("no break in round 2" if r.no_breaks_first == 1
                         else f"no break in rounds 2..{r.no_breaks_first + 1}")
        if r.no_breaks_last:
            parts.append(f"no break in the last {plural(r.no_breaks_last, 'round')}")
        return "; ".join(parts)

    def add_constraints(self, model: TimetableView) -> None:
        r, cp, rounds = model.league.rules, model.cp, model.season_rounds
        if r.no_breaks_first:
            where = ("round 2" if r.no_breaks_first == 1
                     else f"rounds 2..{r.no_breaks_first + 1}")
            literal = model.switch(f"no_breaks_first = {r.no_breaks_first} (no break in {where})")
            for s in range(1, min(rounds, r.no_breaks_first + 1)):
                for v in model.vertices:
                    cp.add_implication(literal, model.break_at(s, v).negated())
        if r.no_breaks_last:
            last = "round" if r.no_breaks_last == 1 else f"{r.no_breaks_last} rounds"
            literal = model.switch(f"no_breaks_last = {r.no_breaks_last} (no break in the last "
                                   f"{last})")
            for s in range(max(1, rounds - r.no_breaks_last), rounds):
                for v in model.vertices:
                    cp.add_implication(literal, model.break_at(s, v).negated())

    def add_date_constraints(self, model: DateModelView) -> None:
        """In the re-plan's date model: a team's break in a sitting needs at least
        ``no_breaks_last`` more games after it, and at least ``no_breaks_first + 1`` games
        before it (history included), so no break falls in the last games or in games
        2..``no_breaks_first + 1`` of a team.

        Parameters
        ----------
        model
            The re-plan model's interface for rules.
        """
        r, cp, sittings = model.league.rules, model.cp, len(model.days)
        if r.no_breaks_last:
            literal = model.switch(f"no break in a team's last {r.no_breaks_last} game(s) "
                                   "(no_breaks_last)")
            for team in model.teams:
                for d in range(sittings):
                    games_after = sum(model.plays(team, later) for later in range(d + 1, sittings))
                    cp.add(games_after >= r.no_breaks_last).only_enforce_if(
                        [literal, model.break_in(team, d)])
        if r.no_breaks_first:
            literal = model.switch(f"no break in a team's games 2..{r.no_breaks_first + 1} "
                                   "(no_breaks_first)")
            for team in model.teams:
                for d in range(sittings):
                    games_before = model.games_played(team) + sum(
                        model.plays(team, earlier) for earlier in range(d))
                    cp.add(games_before >= r.no_breaks_first + 1).only_enforce_if(
                        [literal, model.break_in(team, d)])

    def check(self, league: League, season: Season) -> tuple[Violation, ...]:
        r = league.rules
        last_round = _season_rounds(season)
        out = []
        for team in season.teams:
            for prev, cur in itertools.pairwise(team_games(season, team)):
                if (prev.home == team) != (cur.home == team):
                    continue
                venue = "home" if cur.home == team else "away"
                if r.no_breaks_first and cur.round <= r.no_breaks_first + 1:
                    out.append(Violation(team, cur.round, cur.date,
                                         f"break ({venue} twice in a row) in round {cur.round}, "
                                         f"within the first {r.no_breaks_first + 1} rounds"))
                elif r.no_breaks_last and cur.round > last_round - r.no_breaks_last:
                    out.append(Violation(team, cur.round, cur.date,
                                         f"break ({venue} twice in a row) in round {cur.round}, "
                                         f"within the last {plural(r.no_breaks_last, 'round')}"))
        return tuple(out)

    def lowered(self, league: League) -> tuple[tuple[str, int], ...]:
        r = league.rules
        return tuple((name, value - 1) for name, value in (("no_breaks_first", r.no_breaks_first),
                                                            ("no_breaks_last", r.no_breaks_last))
                     if value)
