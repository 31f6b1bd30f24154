"""``scheduler audit --league``: an audited schedule gets the checklist of that league's hard
rules; a broken rule makes it invalid (exit 1) and says where and by whom."""

from __future__ import annotations

import json
from pathlib import Path

import pytest
from typer.testing import CliRunner

from scheduler.cli import app
from scheduler.config import sample_path

runner = CliRunner()


PLAN_OUTPUT: list[str] = []


@pytest.fixture(scope="module")
def planned(tmp_path_factory) -> tuple[Path, Path]:
    tmp = tmp_path_factory.mktemp("audit-league")
    config = Path(sample_path("evening_hall"))
    out = tmp / "season"
    result = runner.invoke(app, ["plan", str(config), "--out", str(out)],
                           catch_exceptions=False)
    assert result.exit_code == 0, result.output
    PLAN_OUTPUT.append(result.stdout)
    return config, out / "season.json"


def test_plan_prints_the_checklist_and_no_missing_figure(planned):
    text = PLAN_OUTPUT[0]
    assert "rules of this league:" in text
    assert "kept: at least 5 rest days between two games of a team" in text
    assert "None" not in text
    _, season_json = planned
    report = (season_json.parent / "report.html").read_text(encoding="utf-8")
    assert "Rules this schedule keeps" in report
    assert "at least 5 rest days between two games of a team" in report


def test_the_planned_schedule_keeps_its_league_rules(planned):
    config, season_json = planned
    result = runner.invoke(app, ["audit", str(season_json), "--json", "--league", str(config)],
                           catch_exceptions=False)
    assert result.exit_code == 0, result.output
    rules = json.loads(result.stdout)["rules"]
    assert rules and all(check["kept"] for check in rules)
    assert any(check["rule"] == "rest_days" for check in rules)


def test_a_stricter_league_finds_the_broken_rule(planned, tmp_path):
    config, season_json = planned
    text = config.read_text(encoding="utf-8")
    assert "min_rest_days = 5" in text
    strict = tmp_path / "strict.toml"
    # weekly Tuesday games leave 6 rest days, so 12 cannot be kept
    strict.write_text(text.replace("min_rest_days = 5", "min_rest_days = 12"), encoding="utf-8")
    result = runner.invoke(app, ["audit", str(season_json), "--json", "--league", str(strict)],
                           catch_exceptions=False)
    assert result.exit_code == 1, result.output
    rules = {check["rule"]: check for check in json.loads(result.stdout)["rules"]}
    assert not rules["rest_days"]["kept"]
    first = rules["rest_days"]["violations"][0]
    assert first["team"] and first["round"] and "6 rest days" in first["what"]
    plain = runner.invoke(app, ["audit", str(season_json), "--league", str(strict)],
                          catch_exceptions=False)
    assert "BROKEN" in plain.stdout and "rules of this league" in plain.stdout


def test_without_league_there_is_no_checklist(planned):
    _, season_json = planned
    result = runner.invoke(app, ["audit", str(season_json), "--json"], catch_exceptions=False)
    assert result.exit_code == 0
    assert "rules" not in json.loads(result.stdout)


def test_a_league_of_other_teams_is_noted():
    from scheduler.audit import audit_season
    from scheduler.config.model import League, Rules, Team
    from scheduler.season import Fixture, Season

    league = League("L", "2027", "UTC", (Team("Alder Vale", "ALD"), Team("Cobble Hill", "COB")),
                    (), rules=Rules(max_home_run=1))
    season = Season("L", "2027", ("Alder Vale", "Brook Farm"),
                    (Fixture(1, "Alder Vale", "Brook Farm"),))
    result = audit_season(season, league=league)
    assert "Cobble Hill" in result.fairness_note
