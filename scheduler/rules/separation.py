"""Separation: at least ``min_separation`` rounds strictly between two meetings of a pair.

The separation constraint of the sports-timetabling literature (e.g. the timetabling
competition benchmark of Van Bulck, Goossens, Beliën & Davari, PATAT 2021, from memory). In a
fixed leg scheme the separation follows from the scheme alone (``scheduler/leg_schemes.py``,
``docs/leg-schemes.md``); only the free scheme leaves it to the solver.
"""

from __future__ import annotations

import itertools
from collections import defaultdict
from dataclasses import dataclass
from typing import TYPE_CHECKING

from scheduler import leg_schemes
from scheduler.config.model import League
from scheduler.rules.base import DateModelView, HardRule, TimetableView, Violation, plural

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Season


@dataclass(frozen=True)
class Separation(HardRule):
    key = "separation"
    title = "rounds between two meetings of the same teams"
    config_fields = ("rules.min_separation", "format.legs", "format.scheme")
    date_constraints = True

    def is_on(self, league: League) -> bool:
        value = league.rules.min_separation
        return value is not None and value > 0 and league.format.legs > 1

    def statement(self, league: League) -> str:
        value = league.rules.min_separation or 0
        return f"at least {plural(value, 'round')} between two meetings of the same teams"

    def add_constraints(self, model: TimetableView) -> None:
        value = model.league.rules.min_separation
        if value is None or model.legs <= 1:
            return
        text = f"min_separation = {value}"
        if model.scheme in leg_schemes.FIXED_SCHEMES:
            least = leg_schemes.least_separation(model.scheme, model.legs, model.rounds_per_leg)
            if least is not None and least < value:
                model.impossible(f"{text} (the {model.scheme} scheme keeps some pairs only "
                                 f"{least} rounds apart)")
            return
        literal = model.switch(text)
        rounds = model.rounds_per_leg
        for leg in range(model.legs - 1):
            for k in range(rounds):
                gap = rounds + model.position_in_leg(leg + 1, k) - model.position_in_leg(leg, k) - 1
                model.cp.add(gap >= value).only_enforce_if(literal)

    def date_constraints_on(self, league: League) -> bool:
        """Whether a re-plan states the rule: for any ``min_separation`` (0 included, which
        still keeps the meetings of a pair in the order of their legs) of a league with more
        than one leg.

        Parameters
        ----------
        league : League
            The league.

        Returns
        -------
        bool
            True when ``min_separation`` is set and the league has more than one leg.
        """
        return league.rules.min_separation is not None and league.format.legs > 1

    def add_date_constraints(self, model: DateModelView) -> None:
        """In the re-plan's date model: two meetings of a pair, in the order of their legs,
        have at least ``min_separation`` of the season's match days (history's included)
        strictly between them.

        Parameters
        ----------
        model
            The re-plan model's interface for rules.
        """
        value = model.league.rules.min_separation
        if value is None:
            return
        literal = model.switch(f"at least {value} match days between two meetings of a pair "
                               "(min_separation)")
        meetings = model.meetings_on_match_days()
        for pair in sorted(meetings, key=sorted):
            in_leg_order = sorted(meetings[pair], key=lambda meeting: meeting[0])
            for (_, earlier), (_, later) in itertools.pairwise(in_leg_order):
                if isinstance(earlier, int) and isinstance(later, int):
                    continue  # both played: history is not re-planned
                model.cp.add(later - earlier - 1 >= value).only_enforce_if(literal)

    def check(self, league: League, season: Season) -> tuple[Violation, ...]:
        value = league.rules.min_separation
        if value is None:
            return ()
        when = defaultdict(list)
        for f in season.fixtures:
            when[tuple(sorted((f.home, f.away)))].append(f)
        # A re-planned game keeps its round number but not its date, and a re-plan counts the
        # separation in the season's match days (docs/replanning.md): in a re-planned season
        # with one round a day and every game dated, the match days with games between two
        # meetings are counted; a first plan is judged in rounds, as it was planned.
        replanned = any(r.played_through is not None for r in season.revisions)
        dated = (replanned and league.calendar.rounds_per_day == 1
                 and all(f.date is not None for f in season.fixtures))
        match_days = sorted({f.date for f in season.fixtures if f.date is not None})
        index = {day: position for position, day in enumerate(match_days)} if dated else {}
        out = []
        for (a, b), games in sorted(when.items()):
            if dated:
                games.sort(key=lambda f: (f.date, f.round))
            else:
                games.sort(key=lambda f: f.round)
            for x, y in itertools.pairwise(games):
                if dated and x.date is not None and y.date is not None:
                    between = index[y.date] - index[x.date] - 1
                    where = f"on {x.date.isoformat()} and {y.date.isoformat()}"
                    unit = "match day"
                else:
                    between = y.round - x.round - 1
                    where = f"in rounds {x.round} and {y.round}"
                    unit = "round"
                if between < value:
                    out.append(Violation(f"{a}, {b}", y.round, y.date,
                                         f"meet {where}, {plural(between, unit)} apart "
                                         f"(at least {value})"))
        return tuple(out)

    def lowered(self, league: League) -> tuple[tuple[str, int], ...]:
        value = league.rules.min_separation
        return (("min_separation", value - 1),) if value else ()

    def relaxation(self, league: League, statement: str) -> str | None:
        if (statement.startswith("min_separation = ") and "scheme" in statement
                and league.format.scheme in leg_schemes.FIXED_SCHEMES):
            return 'scheme = "free" or a lower min_separation'
        return super().relaxation(league, statement)
