"""One re-plan per event kind, end to end through the ``replan`` command.

Every result is checked by the independent checker (``checker.py``, which imports nothing from
the planner) against the previous season.json, the league file and the events file.
"""

from __future__ import annotations

import csv
import io
import itertools
import json
import shutil

from typer.testing import CliRunner

from scheduler.cli import app
from tests.replan.checker import check
from tests.replan.conftest import LEAGUE, folder_digest, write_events

runner = CliRunner()


def run_replan(season_dir, events):
    return runner.invoke(app, ["replan", str(LEAGUE), "--season", str(season_dir),
                               "--events", str(events)], catch_exceptions=False)


def fixtures(season_dir):
    return json.loads((season_dir / "season.json").read_text(encoding="utf-8"))["fixtures"]


def replan_and_check(season_dir, tmp_path, body, **kw):
    old = tmp_path / "old.json"
    shutil.copy(season_dir / "season.json", old)
    events = write_events(tmp_path, body, **kw)
    result = run_replan(season_dir, events)
    assert result.exit_code == 0, result.output
    problems = check(old, season_dir / "season.json", LEAGUE, events)
    assert problems == []
    # history byte-identical: each history fixture's JSON text (RFC 8259, as written with
    # indent 2 inside the fixtures list) appears unchanged in the new file
    new_text = (season_dir / "season.json").read_text(encoding="utf-8")
    pt = str(events.read_text(encoding="utf-8").split("played_through = ")[1].split()[0])
    for f in json.loads(old.read_text(encoding="utf-8"))["fixtures"]:
        if f["date"] <= pt and f in fixtures(season_dir):
            block = "\n".join("    " + line for line in
                              json.dumps(f, ensure_ascii=False, indent=2).splitlines())
            assert block in new_text
    return json.loads(old.read_text(encoding="utf-8"))["fixtures"], fixtures(season_dir), result


def changes_rows(season_dir):
    text = (season_dir / "changes.csv").read_bytes().decode("utf-8")
    games, _, teams = text.partition("\r\n\r\n")
    return list(csv.DictReader(io.StringIO(games))), list(csv.DictReader(io.StringIO(teams)))


def round_games(fx, number):
    return [f for f in fx if f["round"] == number]


def test_postponed_game_gets_a_reserve_date_and_nothing_else_moves(season_dir, tmp_path):
    game = round_games(fixtures(season_dir), 4)[0]
    body = f'[[postponed]]\nhome = "{game["home"]}"\naway = "{game["away"]}"\n'
    old, new, result = replan_and_check(season_dir, tmp_path, body)
    moved = [f for f in new if (f["home"], f["away"]) == (game["home"], game["away"])
             and f["round"] == 4]
    assert len(moved) == 1 and moved[0]["date"] > "2031-03-22"
    rows, teams = changes_rows(season_dir)
    # reserve dates of the league file come first (templates/league.toml: reserve_dates); the
    # first free Saturday after the season (2031-05-10) is not a reserve date
    assert {r["new_date"] for r in rows} & {"2031-05-24", "2031-05-31"}
    assert "2031-05-10" not in {r["new_date"] for r in rows}
    assert len(rows) == len([f for f in new if f not in old])
    assert {r["home"] for r in rows} >= {game["home"]}
    assert sum(int(t["changed_games"]) for t in teams) == 2 * len(rows)
    data = json.loads((season_dir / "season.json").read_text(encoding="utf-8"))
    assert data["revisions"][0]["note"] == "first plan"
    assert data["revisions"][-1]["played_through"] == "2031-03-22"
    assert data["revisions"][-1]["revision"] == data["revision"]
    assert "proven" in result.output


def test_team_unavailable(season_dir, tmp_path):
    fx = fixtures(season_dir)
    game = round_games(fx, 6)[0]
    team = game["home"]
    body = f'[[unavailable]]\nteam = "{team}"\ndates = [{game["date"]}]\n'
    _, new, _ = replan_and_check(season_dir, tmp_path, body)
    assert all(f["date"] != game["date"] for f in new if team in (f["home"], f["away"]))


def test_venue_closed(season_dir, tmp_path):
    body = '[[closed]]\nvenue = "Gull Lane"\ndates = ["2031-03-29..2031-04-12"]\n'
    _, new, _ = replan_and_check(season_dir, tmp_path, body)
    assert not [f for f in new if f["venue"] == "Gull Lane"
                and "2031-03-29" <= f["date"] <= "2031-04-12"]


def test_one_court_closed(season_dir, tmp_path):
    body = ('[[closed]]\nvenue = "Gull Lane"\ncourts = ["East"]\n'
            'dates = ["2031-03-29..2031-05-10"]\n')
    _, new, _ = replan_and_check(season_dir, tmp_path, body)
    assert not [f for f in new if (f["venue"], f["court"]) == ("Gull Lane", "East")
                and "2031-03-29" <= f["date"] <= "2031-05-10"]


def test_withdrawn_keep_played(season_dir, tmp_path):
    body = '[[withdrawn]]\nteam = "Marram Athletic"\npolicy = "keep_played"\n'
    _, new, _ = replan_and_check(season_dir, tmp_path, body)
    mine = [f for f in new if "Marram Athletic" in (f["home"], f["away"])]
    assert mine and all(f["date"] <= "2031-03-22" for f in mine)
    rows, _ = changes_rows(season_dir)
    assert {r["change"] for r in rows} == {"cancelled"}
    # RFC 5545 §3.8.1.11: the cancelled games are published with STATUS:CANCELLED
    feed = (season_dir / "calendars" / "league.ics").read_text(encoding="utf-8")
    assert feed.count("STATUS:CANCELLED") == len(rows)


def test_withdrawn_void_all(season_dir, tmp_path):
    body = '[[withdrawn]]\nteam = "Old Sluice"\npolicy = "void_all"\n'
    _, new, _ = replan_and_check(season_dir, tmp_path, body)
    assert not [f for f in new if "Old Sluice" in (f["home"], f["away"])]
    # its own feed is published again with every game cancelled (RFC 5545 §3.8.1.11)
    (path,) = (season_dir / "calendars").glob("old-sluice*.ics")
    feed = path.read_text(encoding="utf-8")
    assert feed.count("BEGIN:VEVENT") == feed.count("STATUS:CANCELLED") == 10


def test_replan_is_deterministic(planned_small, tmp_path):
    """Same inputs, byte-identical folders (project rule: determinism)."""
    game = round_games(fixtures(planned_small), 4)[0]
    events = write_events(tmp_path, f'[[postponed]]\nhome = "{game["home"]}"\n'
                                    f'away = "{game["away"]}"\n')
    digests = []
    for copy in ("a", "b"):
        target = tmp_path / copy
        shutil.copytree(planned_small, target)
        assert run_replan(target, events).exit_code == 0
        digests.append(folder_digest(target))
    assert digests[0] == digests[1]


def test_moved_by_hand_is_kept_as_given(season_dir, tmp_path):
    game = round_games(fixtures(season_dir), 7)[1]
    body = (f'[[moved]]\nhome = "{game["home"]}"\naway = "{game["away"]}"\n'
            'date = 2031-06-07\nstart = "18:30"\n')
    _, new, _ = replan_and_check(season_dir, tmp_path, body)
    hit = [f for f in new if (f["home"], f["away"]) == (game["home"], game["away"])
           and f["date"] == "2031-06-07"]
    assert hit and hit[0]["time"] == "18:30"


def test_nothing_happened_changes_nothing(season_dir, tmp_path):
    before = fixtures(season_dir)
    digest = folder_digest(season_dir)
    _, new, result = replan_and_check(season_dir, tmp_path, "")
    assert new == before
    assert "nothing to change" in result.output
    assert folder_digest(season_dir) == digest


# --- bad input: located message, exit 2, folder untouched -----------------------------------


def refused(season_dir, tmp_path, body, expected, **kw):
    before = folder_digest(season_dir)
    events = write_events(tmp_path, body, **kw)
    result = run_replan(season_dir, events)
    assert result.exit_code == 2, result.output
    assert expected in " ".join(result.output.split())
    assert folder_digest(season_dir) == before


def test_unknown_team_gets_a_suggestion(season_dir, tmp_path):
    refused(season_dir, tmp_path, '[[unavailable]]\nteam = "Old Sluise"\ndates = [2031-04-05]\n',
            "unavailable[0].team: 'Old Sluise' is not a team; did you mean 'Old Sluice'?")


def test_unknown_venue_gets_a_suggestion(season_dir, tmp_path):
    refused(season_dir, tmp_path, '[[closed]]\nvenue = "Gul Lane"\ndates = [2031-04-05]\n',
            "did you mean 'Gull Lane'?")


def test_postponed_game_not_in_plan(season_dir, tmp_path):
    game = round_games(fixtures(season_dir), 2)[0]
    body = (f'[[postponed]]\nhome = "{game["away"]}"\naway = "{game["home"]}"\n'
            f'date = {game["date"]}\n')
    refused(season_dir, tmp_path, body, "is not a game of the plan")


def test_postponed_game_after_played_through(season_dir, tmp_path):
    game = round_games(fixtures(season_dir), 8)[0]
    body = (f'[[postponed]]\nhome = "{game["home"]}"\naway = "{game["away"]}"\n'
            f'date = {game["date"]}\n')
    refused(season_dir, tmp_path, body, "is after played_through")


def test_played_through_outside_the_season(season_dir, tmp_path):
    refused(season_dir, tmp_path, "", "played_through: 2032-01-10 is outside the season",
            played_through="2032-01-10")


def test_events_of_another_season(season_dir, tmp_path):
    refused(season_dir, tmp_path, "", "the events file is for 'Fenmarsh Test League' season "
            "'2030'", season="2030")


def test_hand_moved_game_that_breaks_a_rule(season_dir, tmp_path):
    game = round_games(fixtures(season_dir), 7)[1]
    body = (f'[[moved]]\nhome = "{game["home"]}"\naway = "{game["away"]}"\n'
            'date = 2031-06-07\nstart = "18:30"\n'
            f'[[unavailable]]\nteam = "{game["away"]}"\ndates = [2031-06-07]\n')
    refused(season_dir, tmp_path, body, "is unavailable on 2031-06-07")


def test_unknown_policy_and_option(season_dir, tmp_path):
    refused(season_dir, tmp_path,
            '[[withdrawn]]\nteam = "Old Sluice"\npolicy = "void"\n', "did you mean 'void_all'?")
    refused(season_dir, tmp_path, '[[postponed]]\nhome = "Old Sluice"\naway = "Marram Athletic"'
            '\ndat = 2031-03-01\n', "postponed[0].dat: unknown option; did you mean 'date'?")


def test_worsened_rest_matches_an_independent_count(planned_small):
    """Per-team least rest (days without a game between two games, date order) computed here
    with plain datetime arithmetic, before and after; the re-plan must report exactly the
    teams whose least rest fell."""
    from scheduler.config import load_league
    from scheduler.config.events import parse_events
    from scheduler.export.season_json import load_season_json
    from scheduler.replan import replan_season

    league = load_league(LEAGUE)
    previous = load_season_json(planned_small / "season.json")
    game = next(f for f in previous.fixtures if f.round == 4)
    events = parse_events({"league": league.name, "season": league.season,
                           "played_through": "2031-03-22",
                           "postponed": [{"home": game.home, "away": game.away}]}, league)
    result = replan_season(league, previous, events, time_limit=3)

    def least_rest(season):
        out = {}
        for team in season.teams:
            days = sorted(f.date for f in season.fixtures if team in f.teams)
            out[team] = min((b - a).days - 1 for a, b in itertools.pairwise(days))
        return out

    def breaks(season):
        out = {}
        for team in season.teams:
            sides = [f.home == team for f in sorted(
                (f for f in season.fixtures if team in f.teams), key=lambda f: f.date)]
            out[team] = sum(a == b for a, b in itertools.pairwise(sides))
        return out

    before, after = least_rest(previous), least_rest(result.season)
    fell = {team for team in before if after[team] < before[team]}
    reported = {w.team for w in result.worsened if w.label == "fewest rest days" and w.team}
    assert reported == fell
    before, after = breaks(previous), breaks(result.season)
    rose = {team for team in before if after[team] > before[team]}
    reported = {w.team for w in result.worsened if w.label == "breaks" and w.team}
    assert reported == rose
    assert fell or rose  # the scenario does worsen something
    assert result.played is not None
    assert result.played.rest_days_min == min(least_rest(result.season).values())


def test_hand_moved_game_too_close_to_the_last_game(season_dir, tmp_path):
    game = round_games(fixtures(season_dir), 7)[0]
    body = (f'[[moved]]\nhome = "{game["home"]}"\naway = "{game["away"]}"\n'
            'date = 2031-03-25\nstart = "19:00"\n')
    refused(season_dir, tmp_path, body, "fewer than 5 days of rest (rules.min_rest_days)")


def test_hand_moved_game_that_makes_the_rest_impossible(season_dir, tmp_path):
    """Two hand-moved games on the one-pitch ground on the same day: the shared-ground rule
    cannot hold, and the message names the moved game (located in the events file)."""
    fx = [f for f in fixtures(season_dir) if f["date"] > "2031-03-22"]
    home_games = [f for f in fx if f["venue"] == "Reedway"]
    first, second = next((a, b) for a, b in itertools.combinations(home_games, 2)
                         if not {a["home"], a["away"]} & {b["home"], b["away"]})
    body = "".join(f'[[moved]]\nhome = "{g["home"]}"\naway = "{g["away"]}"\n'
                   f'date = 2031-06-07\nstart = "{clock}"\n'
                   for g, clock in ((first, "14:00"), (second, "14:00")))
    refused(season_dir, tmp_path, body, "moved[")
