"""Reading federation files: the sample, and located errors for bad input (exit 2, nothing
written). Messages follow the league file's conventions (field path, did-you-mean from difflib)."""

from __future__ import annotations

import datetime as dt
import tomllib
from pathlib import Path

import pytest
from typer.testing import CliRunner

from scheduler.cli import app
from scheduler.config.federation import is_federation_data, load_federation, parse_federation
from scheduler.errors import ConfigError

ROOT = Path(__file__).resolve().parents[2]
runner = CliRunner()


def _problems(text: str) -> list[str]:
    with pytest.raises(ConfigError) as info:
        parse_federation(tomllib.loads(text), source="fed.toml")
    return info.value.problems


def test_sample_federation_meets_the_stated_size():
    fed = load_federation(ROOT / "sample_leagues" / "federation.toml")
    sizes = [len(d.league.teams) for d in fed.divisions]
    assert len(sizes) >= 12 and all(6 <= s <= 16 for s in sizes)
    # grounds that host home teams of more than one division
    homes: dict[str, set[str]] = {}
    for d in fed.divisions:
        for t in d.league.teams:
            if t.home_venue:
                homes.setdefault(t.home_venue, set()).add(d.name)
    assert sum(1 for divs in homes.values() if len(divs) >= 2) >= 6
    # one hall with several courts used by several divisions
    halls = [v for v in fed.venues if len(v.courts) > 1
             and sum(1 for d in fed.divisions if v in d.league.venues) >= 2]
    assert halls


def test_small_federation_reads_into_leagues(small_text):
    fed = parse_federation(tomllib.loads(small_text))
    assert is_federation_data(tomllib.loads(small_text))
    assert fed.division_names == ("North", "Reserves", "Hall A", "Hall B", "Lone")
    reserves = fed.division("Reserves").league
    assert reserves.format.legs == 2 and reserves.season == "2027"
    assert fed.division("Hall A").league.calendar.game_minutes == 50
    assert fed.division("North").league.calendar.game_minutes == 90
    assert fed.division_of("Oxlow Reserves") == "Reserves"


def test_team_in_two_divisions_is_located(small_text):
    text = small_text.replace('{ name = "Zell" }', '{ name = "Oxlow Minis" }')
    problems = _problems(text)
    assert any(p.startswith("divisions[4].teams[0].name") and "Oxlow Minis" in p
               and "another division" in p for p in problems), problems


def test_unknown_division_gets_did_you_mean(small_text):
    text = small_text + '\n[[teams]]\nname = "Dolby"\ndivision = "Nroth"\n'
    problems = _problems(text)
    assert problems == ["teams[0].division: 'Nroth' is not a division; did you mean 'North'?"]


def test_shared_ground_naming_an_unknown_team(small_text):
    text = small_text.replace('teams = ["Oxlow", "Oxlow Reserves"]',
                                    'teams = ["Oxlow", "Oxlow Reserve"]')
    problems = _problems(text)
    assert problems == ["shared_grounds[0].teams[1]: 'Oxlow Reserve' is not a team of any "
                        "division; did you mean 'Oxlow Reserves'?"]


def test_league_problems_are_located_inside_the_division(small_text):
    text = small_text.replace('format = { legs = 2 }', 'format = { legs = 2, sheme = "x" }')
    problems = _problems(text)
    assert any(p.startswith("divisions[1].format.sheme: unknown option; did you mean 'scheme'")
               for p in problems), problems


def test_unknown_top_level_section_did_you_mean(small_text):
    problems = _problems(small_text + '\n[[player_group]]\nname = "x"\nteams = ["Zell"]\n')
    assert problems[0].startswith("player_group: unknown section; did you mean 'player_groups'")


@pytest.mark.parametrize("bad", ["two-divisions", "unknown-division", "unknown-team"])
def test_cli_bad_input_exit_2_nothing_written(tmp_path, bad, small_text):
    text = {
        "two-divisions": small_text.replace('{ name = "Zell" }', '{ name = "Oxlow" }'),
        "unknown-division": small_text + '\n[[teams]]\nname = "D"\ndivision = "Sooth"\n',
        "unknown-team": small_text.replace('"Oxlow", "Oxlow Reserves"]',
                                                 '"Oxlow", "Nobody"]'),
    }[bad]
    config = tmp_path / "fed.toml"
    config.write_text(text, encoding="utf-8")
    out = tmp_path / "out"
    result = runner.invoke(app, ["plan-divisions", str(config), "--out", str(out), "--quiet"])
    assert result.exit_code == 2, result.output
    assert "Traceback" not in result.output
    assert "fed.toml" in result.output
    assert not out.exists()
    assert sorted(p.name for p in tmp_path.iterdir()) == ["fed.toml"]


def test_teams_listed_outside_their_division(small_text):
    text = small_text + ('\n[[teams]]\nname = "Dolby"\ndivision = "Lone"\n'
                         '\n[[teams]]\nname = "Zell"\ndivision = "North"\n'
                         'home_venue = "Oxlow Ground"\n')
    problems = _problems(text)
    assert problems == ["divisions[4].teams[0].name: 'Zell' is already a team of another "
                        "division (teams[1] in division 'North'); a team plays in one division"]
    fed = parse_federation(tomllib.loads(small_text + '\n[[teams]]\nname = "Dolby"\n'
                                        'division = "Lone"\nunavailable = [2027-09-11]\n'))
    lone = fed.division("Lone").league
    assert "Dolby" in lone.team_names
    assert [td.dates for td in lone.rules.unavailable if td.team == "Dolby"] == [
        (dt.date(2027, 9, 11),)]
