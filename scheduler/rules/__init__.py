"""The league's hard rules, one module each (``docs/rules.md``).

:data:`RULES` lists them in the order their constraints enter the timetable model;
:func:`check_rules` checks any season against the rules a league switches on, independently of
the balancer (fixtures only). Adding a rule: one module with a :class:`HardRule` subclass, its
entry here, its tests in ``tests/rules/``.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from scheduler.config.model import League
from scheduler.rules.base import HardRule, RuleCheck, TimetableView, Violation
from scheduler.rules.break_free_ends import BreakFreeEnds
from scheduler.rules.fixed_games import FixedGames
from scheduler.rules.no_home_days import NoHomeDays
from scheduler.rules.rest_days import RestDays
from scheduler.rules.runs import RunLimits
from scheduler.rules.separation import Separation
from scheduler.rules.shared_grounds import SharedGrounds
from scheduler.rules.unavailable_days import UnavailableDays
from scheduler.rules.venue_capacity import VenueCapacity

if TYPE_CHECKING:  # the season type only: rules import nothing above config at run time
    from scheduler.season import Season

RULES: tuple[HardRule, ...] = (
    RunLimits(),
    BreakFreeEnds(),
    Separation(),
    RestDays(),
    UnavailableDays(),
    NoHomeDays(),
    SharedGrounds(),
    VenueCapacity(),
    FixedGames(),
)
"""Every hard rule, in the order their constraints are added to the timetable model."""


def check_rules(league: League, season: Season) -> tuple[RuleCheck, ...]:
    """The checklist of the league's own hard rules on ``season``: kept, or broken where and by
    whom. Rules the league does not use are left out.

    Parameters
    ----------
    league : League
        The league whose rules apply.
    season : Season
        Any season (planned or read from a file by ``audit``).

    Returns
    -------
    tuple of RuleCheck
        One entry per rule the league switches on, in :data:`RULES` order.

    References
    ----------
    ``docs/rules.md`` (each rule, its fields, its constraints and its check).

    Examples
    --------
    >>> from datetime import date
    >>> from scheduler.config.model import League, Rules, Team
    >>> from scheduler.season import Fixture, Season
    >>> league = League("L", "2026", "UTC", (Team("A", "A"), Team("B", "B")), (),
    ...                 rules=Rules(max_home_run=1))
    >>> season = Season("L", "2026", ("A", "B"), (Fixture(1, "A", "B"), Fixture(2, "A", "B")))
    >>> [(c.rule, c.kept, c.violations[0].team) for c in check_rules(league, season)]
    [('runs', False, 'A')]
    """
    out = []
    for rule in RULES:
        if not rule.is_on(league):
            continue
        violations = rule.check(league, season)
        out.append(RuleCheck(rule.key, rule.statement(league), not violations, violations))
    return tuple(out)


__all__ = ["RULES", "HardRule", "RuleCheck", "TimetableView", "Violation", "check_rules"]
