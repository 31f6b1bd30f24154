"""Shared grounds: at most one team of a group is at home on a match day.

The groups are ``rules.shared_grounds`` plus, when home means a venue, the teams sharing a home
venue with room for one game a day (``League.shared_ground_groups``).
"""

from __future__ import annotations

from collections import defaultdict
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any

from scheduler.config.model import League
from scheduler.rules.base import DateModelView, HardRule, TimetableView, Violation

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Season


@dataclass(frozen=True)
class SharedGrounds(HardRule):
    key = "shared_grounds"
    title = "teams sharing a ground"
    config_fields = ("rules.shared_grounds", "teams.home_venue", "venues")
    date_constraints = True

    def is_on(self, league: League) -> bool:
        return bool(league.shared_ground_groups)

    def statement(self, league: League) -> str:
        return "; ".join("at most one of " + ", ".join(group) + " at home on a match day"
                         for group in league.shared_ground_groups)

    def named_teams(self, league: League) -> set[str]:
        return {name for group in league.shared_ground_groups for name in group}

    def add_constraints(self, model: TimetableView) -> None:
        for group in model.league.shared_ground_groups:
            members = [model.team_index[name] for name in group]
            literal = model.switch("shared ground: at most one of " + ", ".join(group)
                                   + " at home on a match day")
            home_days_at_most(model, members, 1, literal, per_team=True)

    def add_date_constraints(self, model: DateModelView) -> None:
        """At most one team of a group at home in a sitting (a match day; a kick-off when
        several rounds share a day) in the re-plan's date model.

        Parameters
        ----------
        model
            The re-plan model's interface for rules.
        """
        for group in model.league.shared_ground_groups:
            literal = model.switch("shared ground: at most one of " + ", ".join(group)
                                   + " at home on a match day")
            for d in range(len(model.days)):
                model.cp.add(sum(model.home(name, d) for name in group) <= 1
                             ).only_enforce_if(literal)

    def check(self, league: League, season: Season) -> tuple[Violation, ...]:
        out = []
        for group in league.shared_ground_groups:
            hosts: dict = defaultdict(dict)
            for f in season.fixtures:
                if f.home in group:
                    hosts[f.date if f.date is not None else f.round].setdefault(f.home, f)
            for day, by_team in hosts.items():
                if len(by_team) > 1:
                    first = min(by_team.values(), key=lambda f: f.round)
                    where = day.isoformat() if hasattr(day, "isoformat") else f"round {day}"
                    out.append(Violation(", ".join(sorted(by_team)), first.round, first.date,
                                         f"{len(by_team)} teams of one ground at home on "
                                         f"{where}"))
        return tuple(out)


def home_days_at_most(model: TimetableView, members: list[int], cap: int, literal: Any, *,
                      per_team: bool) -> None:
    """Under ``literal``: on every match day at most ``cap`` of ``members`` at home
    (``per_team``: counting teams) or at most ``cap`` home games of theirs (counting games).

    Parameters
    ----------
    model
        The timetable model the constraints are added to.
    members
        Team indices of the group.
    cap
        The most that may be at home on one match day.
    literal
        The rule's assumption literal (the constraints hold only under it).
    per_team
        Count teams at home (True) or home games (False).

    References
    ----------
    ``docs/rules.md``.
    """
    cp = model.cp
    for rounds in model.day_groups:
        if per_team and len(rounds) > 1:
            home_that_day = []
            for t in members:
                at_home = cp.new_bool_var(f"team{t}_at_home_on_day_of_round{rounds[0]}")
                for s in rounds:
                    cp.add_implication(model.team_home(t, s), at_home)
                home_that_day.append(at_home)
            cp.add(sum(home_that_day) <= cap).only_enforce_if(literal)
        else:
            cp.add(sum(model.team_home(t, s) for t in members for s in rounds) <= cap
                   ).only_enforce_if(literal)
