"""Re-planning a league with several rounds on one match day (``calendar.rounds_per_day > 1``).

The sample club weekend (``sample_leagues/club_day.toml``: eight squads, four rounds on the
Saturday and three on the Sunday, four tables, four kick-off times) is planned, then the
Saturday is played with one game postponed. Every re-plan is checked by the independent checker
(``checker.py``, which imports nothing from the planner). The fewest changes are confirmed by
exhaustive search over the re-plans that change at most two games (one game per team and
kick-off, each table once per kick-off, at most four games a day, runs of at most two games
with the same colour in time order). Two games on one day count 0 rest days
(docs/replanning.md).
"""

from __future__ import annotations

import itertools
import json
import shutil
from collections import Counter
from pathlib import Path

import pytest
from typer.testing import CliRunner

from scheduler.cli import app
from scheduler.config import load_league
from scheduler.export import write_season_outputs
from scheduler.fairness import compute_fairness
from tests.replan.checker import check
from tests.replan.conftest import folder_digest

LEAGUE = Path(__file__).resolve().parents[2] / "sample_leagues" / "club_day.toml"
runner = CliRunner()


@pytest.fixture(scope="module")
def planned(tmp_path_factory) -> Path:
    from scheduler.plan import plan_season

    league = load_league(LEAGUE)
    season = plan_season(league).season
    out = tmp_path_factory.mktemp("club") / "season"
    write_season_outputs(season, compute_fairness(season), out, config_path=LEAGUE,
                         game_minutes=league.calendar.game_minutes,
                         side_labels=league.format.grid_labels)
    return out


def fixtures(folder):
    return json.loads((folder / "season.json").read_text(encoding="utf-8"))["fixtures"]


def events_file(tmp_path, game) -> Path:
    path = tmp_path / "events.toml"
    path.write_text('league = "Marrowby Chess Club Squad Weekend"\nseason = "2027"\n'
                    "played_through = 2027-05-15\n\n"
                    f'[[postponed]]\nhome = "{game["home"]}"\naway = "{game["away"]}"\n',
                    encoding="utf-8")
    return path


def valid(games) -> bool:
    """The hard rules of the sample, checked on plain tuples (date, time, table, home, away)."""
    if len({(d, t, table) for d, t, table, _, _ in games}) < len(games):
        return False
    per_team = {}
    for d, t, _, home, away in games:
        per_team.setdefault(home, []).append((d, t, True))
        per_team.setdefault(away, []).append((d, t, False))
    for items in per_team.values():
        items.sort()
        if len({(d, t) for d, t, _ in items}) < len(items):
            return False
        if max(Counter(d for d, _, _ in items).values()) > 4:
            return False
        sides = [side for *_, side in items]
        if any(sides[i] == sides[i + 1] == sides[i + 2] for i in range(len(sides) - 2)):
            return False
    return True


SLOTS = ("09:30", "11:00", "13:30", "15:00")
TABLES = ("Table 1", "Table 2", "Table 3", "Table 4")
SUNDAY = "2027-05-16"


def fewest_changes(before, game, most=2):
    """The fewest games a valid re-plan changes when ``game`` (a Saturday game) is postponed,
    by exhaustive search over re-plans changing at most ``most`` games (``None`` if more are
    needed). The postponed game always changes: it must be played on the Sunday."""
    history = [(f["date"], f["time"], f["court"], f["home"], f["away"]) for f in before
               if f["date"] == "2027-05-15" and f is not game]
    sunday = [(f["date"], f["time"], f["court"], f["home"], f["away"]) for f in before
              if f["date"] == SUNDAY]

    def places(home, away):
        for t, table in itertools.product(SLOTS, TABLES):
            yield (SUNDAY, t, table, home, away)
            yield (SUNDAY, t, table, away, home)

    for k in range(1, most + 1):
        for others in itertools.combinations(range(len(sunday)), k - 1):
            kept = [g for j, g in enumerate(sunday) if j not in others]
            choices = [[p for p in places(*sunday[j][3:]) if p != sunday[j]] for j in others]
            for new in itertools.product(*choices):
                for placed in places(game["home"], game["away"]):
                    if valid(history + kept + list(new) + [placed]):
                        return k
    return None


def test_postponed_game_on_the_second_day(planned, tmp_path):
    folder = tmp_path / "season"
    shutil.copytree(planned, folder)
    before = fixtures(folder)
    saturday = [f for f in before if f["date"] == "2027-05-15"]
    game, fewest = next((g, k) for g in saturday if (k := fewest_changes(before, g)))
    events = events_file(tmp_path, game)
    old = tmp_path / "old.json"
    shutil.copy(folder / "season.json", old)
    result = runner.invoke(app, ["replan", str(LEAGUE), "--season", str(folder),
                                 "--events", str(events)], catch_exceptions=False)
    assert result.exit_code == 0, result.output
    assert check(old, folder / "season.json", LEAGUE, events) == []
    after = fixtures(folder)
    (moved,) = [f for f in after if {f["home"], f["away"]} == {game["home"], game["away"]}]
    assert moved["date"] == SUNDAY
    changed = [f for f in after if f not in before]
    assert "(proven)" in result.output
    assert len(changed) == fewest

    # rest: two games on one day count 0 rest days, so the least rest is 0
    from scheduler.replan import load_replan
    again = load_replan(LEAGUE, planned, events)
    assert again.played is not None and again.played.rest_days_min == 0
    assert {g.name: g.value for g in again.repair.goals}["rest"] == 0


def test_same_file_twice_changes_nothing(planned, tmp_path):
    folder = tmp_path / "season"
    shutil.copytree(planned, folder)
    game = next(f for f in fixtures(folder) if f["date"] == "2027-05-15")
    events = events_file(tmp_path, game)
    args = ["replan", str(LEAGUE), "--season", str(folder), "--events", str(events)]
    assert runner.invoke(app, args, catch_exceptions=False).exit_code == 0
    digest = folder_digest(folder)
    result = runner.invoke(app, args, catch_exceptions=False)
    assert result.exit_code == 0 and "nothing to change" in result.output
    assert folder_digest(folder) == digest
