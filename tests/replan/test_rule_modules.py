"""The rules whose date-model constraints live in their rule modules (docs/rules.md): rest days,
unavailable days, no-home days and shared grounds, as the re-plan model uses them.

Each re-plan is judged by the rules' own independent checks (``check_rules``, fixtures only) and
by the independent checker of this folder (``checker.py``, which imports nothing from the
planner). A clash caused by a rule is named in the rule module's own words.
"""

from __future__ import annotations

import json
import tomllib
from datetime import date

import pytest

from scheduler.config import parse_league
from scheduler.config.events import parse_events
from scheduler.errors import InfeasibleError
from scheduler.plan import plan_season
from scheduler.replan import replan_season
from scheduler.rules import RULES, check_rules
from tests.replan.conftest import LEAGUE

RESERVE = date(2031, 5, 24)


def league_with(**rules):
    data = json.loads(json.dumps(tomllib.loads(LEAGUE.read_text(encoding="utf-8")), default=str))
    data["rules"].update(rules)
    return parse_league(data)


def postpone(league, previous, game, **more):
    events = parse_events({"league": league.name, "season": league.season,
                           "played_through": "2031-03-22",
                           "postponed": [{"home": game.home, "away": game.away}], **more},
                          league)
    return replan_season(league, previous, events, time_limit=3)


def test_the_moved_rules_say_so():
    moved = {rule.key for rule in RULES if rule.date_constraints}
    assert moved == {"rest_days", "unavailable_days", "no_home_days", "shared_grounds"}


def test_unavailable_and_no_home_days_of_the_league_hold_in_a_replan():
    """The league keeps a reserve date from one team and one team's ground: without those
    rules the re-plan uses the reserve date for them; with them it does not, and every rule's
    own check passes."""
    strict = league_with(unavailable=[{"team": "Old Sluice", "dates": [str(RESERVE)]}],
                         no_home_games=[{"team": "Reedway Swifts", "dates": [str(RESERVE)]}])
    plain = league_with()
    previous = plan_season(strict).season
    game = next(f for f in previous.fixtures if f.round == 4 and "Old Sluice" in f.teams)

    def uses_reserve(season):
        return [f for f in season.fixtures if f.date == RESERVE
                and ("Old Sluice" in f.teams or f.home == "Reedway Swifts")]

    assert uses_reserve(postpone(plain, previous, game).season)  # the rules bite
    result = postpone(strict, previous, game)
    assert not uses_reserve(result.season)
    assert [c.rule for c in check_rules(strict, result.season) if not c.kept] == []
    assert result.repair.changed >= 1


def test_a_clash_is_named_by_the_rule_module():
    """A team unavailable on every date after the season cannot catch up a postponed game:
    the clash lists the rule module's statements."""
    after = "2031-05-10..2031-06-28"
    league = league_with(unavailable=[{"team": "Old Sluice", "dates": [after]}])
    previous = plan_season(league).season
    game = next(f for f in previous.fixtures if f.round == 4 and "Old Sluice" in f.teams)
    with pytest.raises(InfeasibleError) as caught:
        postpone(league, previous, game)
    lines = caught.value.conflicts
    assert "Old Sluice is unavailable on 2031-05-24" in lines
    assert any(line.startswith("possible fix: extend the season by") for line in lines)


def test_rest_is_checked_in_date_order_after_a_replan():
    """A re-placed game keeps its round number; the rest rule's own check reads the games in
    date order, so a re-planned season that keeps the rule passes it."""
    league = league_with()
    previous = plan_season(league).season
    game = next(f for f in previous.fixtures if f.round == 4)
    # the home team cannot play the next Saturday: the game goes after round 5
    result = postpone(league, previous, game,
                      unavailable=[{"team": game.home, "dates": ["2031-03-29"]}])
    moved = next(f for f in result.season.fixtures
                 if (f.pair, f.round) == (game.pair, game.round))
    assert moved.date > date(2031, 3, 29)
    rest = next(c for c in check_rules(league, result.season) if c.rule == "rest_days")
    assert rest.kept, rest.violations
    # the court balance goal (Gull Lane has two courts) reports the fairness figure's value
    shown = {goal.name: goal.value for goal in result.repair.goals}
    assert shown["venue_balance"] == result.fairness.court_spread_max
