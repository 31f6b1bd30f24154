"""The rules whose date-model constraints live in their rule modules (docs/rules.md): runs,
break-free ends, separation, rest days, unavailable days, no-home days and shared grounds, as
the re-plan model uses them.

Each re-plan is judged by the rules' own independent checks (``check_rules``, fixtures only) and
by the independent checker of this folder (``checker.py``, which imports nothing from the
planner). A clash caused by a rule is named in the rule module's own words.
"""

from __future__ import annotations

import itertools
import json
import tomllib
from datetime import date, time, timedelta

import pytest

from scheduler.balance.repair import ForcedGame, RepairProblem, repair_season
from scheduler.balance.solver import SolveLimits
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
    assert moved == {"runs", "break_free_ends", "separation", "rest_days", "unavailable_days",
                     "no_home_days", "shared_grounds"}


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


# --- runs, break-free ends and separation -----------------------------------------------------
# A re-placed game keeps its round number, so these rules are judged here in date order, the
# order the re-plan model places games in; the definitions are docs/rules.md's (a run: games
# of one side in a row; a break: a game on the same side as the team's previous one, de Werra
# 1981, from memory; separation: match days of the season strictly between two meetings).


def league_without(*names, **rules):
    data = json.loads(json.dumps(tomllib.loads(LEAGUE.read_text(encoding="utf-8")), default=str))
    for name in names:
        data["rules"].pop(name, None)
    data["rules"].update(rules)
    return parse_league(data)


def games_in_date_order(season, team):
    return sorted((f for f in season.fixtures if team in f.teams), key=lambda f: f.date)


def longest_run_by_date(season, home):
    longest = 0
    for team in season.teams:
        run = 0
        for f in games_in_date_order(season, team):
            run = run + 1 if (f.home == team) is home else 0
            longest = max(longest, run)
    return longest


def breaks_in_last_games_by_date(season, last):
    found = []
    for team in season.teams:
        games = games_in_date_order(season, team)
        for position, (prev, cur) in enumerate(itertools.pairwise(games), start=1):
            if (prev.home == team) == (cur.home == team) and position >= len(games) - last:
                found.append((team, cur.date))
    return found


def least_match_days_between_meetings(season):
    """Match days of the calendar (every Saturday from 1 March to 28 June 2031, the test
    league's file) strictly between two meetings of a pair, the least over all pairs."""
    days = [date(2031, 3, 1) + timedelta(weeks=week) for week in range(18)]
    assert days[-1] == date(2031, 6, 28)
    where = {day: i for i, day in enumerate(days)}
    meetings = {}
    for f in season.fixtures:
        meetings.setdefault(f.pair, []).append(f)
    return min(where[later.date] - where[earlier.date] - 1
               for games in meetings.values()
               for earlier, later in itertools.pairwise(sorted(games, key=lambda f: f.leg)))


def test_the_runs_rule_bites_in_a_replan():
    """Without run limits the postponed game simply goes to the end of the season and some
    team plays 3 home (or away) games in a row in date order; the rule's own date constraints
    forbid that, at the price of more changed games."""
    strict = league_with()
    plain = league_without("max_home_run", "max_away_run")
    previous = plan_season(strict).season
    for game in [f for f in previous.fixtures if f.round == 4]:
        loose = postpone(plain, previous, game)
        if max(longest_run_by_date(loose.season, True),
               longest_run_by_date(loose.season, False)) > 2:
            break
    else:
        pytest.fail("no postponed game of round 4 makes a run too long without the rule")
    kept = postpone(strict, previous, game)
    assert longest_run_by_date(kept.season, True) <= 2
    assert longest_run_by_date(kept.season, False) <= 2
    assert kept.repair.changed > loose.repair.changed


def test_the_break_free_end_bites_in_a_replan():
    """Without ``no_breaks_last`` a postponed game put at the end gives a team a break in its
    last game (date order); with it, the re-plan avoids that."""
    strict = league_with(no_breaks_last=1)
    plain = league_with()
    previous = plan_season(strict).season
    for game in [f for f in previous.fixtures if f.round == 4]:
        loose = postpone(plain, previous, game)
        if breaks_in_last_games_by_date(loose.season, 1):
            break
    else:
        pytest.fail("no postponed game of round 4 ends a team's season with a break")
    kept = postpone(strict, previous, game)
    assert breaks_in_last_games_by_date(kept.season, 1) == []


def test_the_separation_bites_in_a_replan():
    """A first-leg game postponed past the second meeting of its pair: without
    ``min_separation`` the re-plan may put the two meetings next to each other (or in the
    wrong order); with it, at least 3 match days lie between any two meetings."""
    strict = league_with(min_separation=3)
    plain = league_with()
    previous = plan_season(strict).season
    for game in [f for f in previous.fixtures if f.round == 4]:
        loose = postpone(plain, previous, game)
        if least_match_days_between_meetings(loose.season) < 3:
            break
    else:
        pytest.fail("no postponed game of round 4 brings two meetings close without the rule")
    kept = postpone(strict, previous, game)
    assert least_match_days_between_meetings(kept.season) >= 3
    assert kept.repair.changed > loose.repair.changed


def hand_moved(league, previous, moves):
    """The re-plan after round 4 with ``moves`` (planned game -> date) already made by hand:
    a hand-moved game is kept exactly as given, so a rule it breaks cannot hold."""
    played_through = date(2031, 3, 22)
    history = tuple(f for f in previous.fixtures if f.date <= played_through)
    future = tuple(f for f in previous.fixtures if f.date > played_through)
    forced = {future.index(game): ForcedGame(day, game.home, game.away, time(14, 0))
              for game, day in moves.items()}
    problem = RepairProblem(league, played_through, history, future, forced=forced)
    return repair_season(problem, SolveLimits(3.0, 60.0, league.seed))


def saturdays_from(first, count):
    return [first + timedelta(weeks=week) for week in range(count)]


def test_a_run_made_by_hand_is_named_by_the_runs_rule():
    league = league_with()
    previous = plan_season(league).season
    team = "Old Sluice"
    home_games = [f for f in previous.fixtures if f.date > date(2031, 3, 22) and f.home == team]
    assert len(home_games) >= 3
    moves = dict(zip(home_games[:3], saturdays_from(date(2031, 5, 10), 3), strict=True))
    with pytest.raises(InfeasibleError) as caught:
        hand_moved(league, previous, moves)
    assert "at most 2 home games in a row (max_home_run)" in caught.value.conflicts
    loose = league_without("max_home_run", "max_away_run")
    assert hand_moved(loose, previous, moves).changed >= 3  # without the rule it fits


@pytest.mark.parametrize(("rules", "first", "statement"), [
    ({"no_breaks_last": 1}, date(2031, 6, 21),
     "no break in a team's last 1 game(s) (no_breaks_last)"),
    ({"no_breaks_first": 5}, date(2031, 3, 29),
     "no break in a team's games 2..6 (no_breaks_first)"),
])
def test_a_break_made_by_hand_is_named_by_the_break_free_ends(rules, first, statement):
    """Two home games of one team moved by hand to two Saturdays in a row make a break: in
    the team's last game (the calendar ends on 28 June) or in its games 5 and 6."""
    plain = league_with()
    previous = plan_season(plain).season
    team = "Old Sluice"
    home_games = [f for f in previous.fixtures if f.date > date(2031, 3, 22) and f.home == team]
    moves = dict(zip(home_games[:2], saturdays_from(first, 2), strict=True))
    with pytest.raises(InfeasibleError) as caught:
        hand_moved(league_with(**rules), previous, moves)
    assert statement in caught.value.conflicts
    assert hand_moved(plain, previous, moves).changed >= 2  # without the rule it fits


def test_meetings_moved_by_hand_close_together_are_named_by_the_separation():
    """Both meetings of a pair still to play, moved by hand to two Saturdays in a row: no
    match day between them."""
    league = league_with(min_separation=3)
    previous = plan_season(league).season
    future = [f for f in previous.fixtures if f.date > date(2031, 3, 22)]
    pair = next(f.pair for f in future if sum(g.pair == f.pair for g in future) == 2)
    meetings = sorted((f for f in future if f.pair == pair), key=lambda f: f.leg)
    moves = dict(zip(meetings, saturdays_from(date(2031, 5, 10), 2), strict=True))
    with pytest.raises(InfeasibleError) as caught:
        hand_moved(league, previous, moves)
    assert "at least 3 match days between two meetings of a pair (min_separation)" in (
        caught.value.conflicts)
    assert hand_moved(league_with(), previous, moves).changed >= 2  # without the rule it fits
