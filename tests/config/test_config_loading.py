"""The shipped samples and the starter template load; YAML and TOML agree; loading is
deterministic; the starter file is written safely; shipped files are found."""

from __future__ import annotations

import dataclasses
import datetime as dt
import os
import subprocess
import sys
import tomllib
from pathlib import Path

import pytest
import yaml

from scheduler.calendar import days_needed, match_days, rounds_needed
from scheduler.config import (
    League,
    load_league,
    parse_league,
    sample_names,
    sample_path,
    starter_config_text,
    template_path,
    write_starter_config,
)
from scheduler.config.reading import LeagueYamlLoader
from scheduler.errors import InputError, OutputError

REPO = Path(__file__).resolve().parents[2]
DATA = Path(__file__).resolve().parent / "data"


def test_the_three_samples_are_shipped():
    assert set(sample_names()) >= {"evening_hall.toml", "county_double.toml", "club_day.toml"}
    assert sample_path("county_double") == REPO / "sample_leagues" / "county_double.toml"


@pytest.mark.parametrize("name", sample_names())
def test_every_sample_loads_and_fits_its_calendar(name):
    league = load_league(sample_path(name))
    assert isinstance(league, League)
    assert league.source == str(sample_path(name))
    assert len(match_days(league)) >= days_needed(league)
    codes = [t.code.upper() for t in league.teams]
    assert len(set(codes)) == len(codes)


def test_samples_have_the_promised_shapes():
    hall = load_league(sample_path("evening_hall.toml"))
    assert len(hall.teams) % 2 == 1 and hall.format.home_meaning == "side"
    assert hall.format.legs == 1 and hall.venues[0].capacity >= len(hall.teams) // 2
    assert hall.rules.min_rest_days is not None
    county = load_league(sample_path("county_double.toml"))
    assert len(county.teams) == 16 and county.format.legs == 2
    assert county.format.home_meaning == "venue" and county.rules.fixed
    assert county.shared_ground_groups == (("Ashby Vale", "Corvey Albion"),)
    assert county.rules.max_home_run == 2 and county.rules.max_away_run == 2
    assert county.rules.no_breaks_first == 1 and county.rules.no_home_games
    club = load_league(sample_path("club_day.toml"))
    assert len(club.teams) in (6, 8) and club.calendar.rounds_per_day > 1
    assert club.format.side_labels == ("White", "Black")
    assert len(match_days(club)) <= 2


def test_template_loads_and_is_the_starter_text():
    league = load_league(template_path("league.toml"))
    assert league.name
    text = starter_config_text()
    assert text == (REPO / "templates" / "league.toml").read_text(encoding="utf-8")
    again = parse_league(tomllib.loads(text), source=str(template_path("league.toml")))
    assert again == league


def test_template_explains_every_option():
    """Every option name of the schema appears in the template (as a setting or a comment)."""
    from scheduler.config import schema

    text = starter_config_text()
    for model in (
        schema.LeagueSection,
        schema.FormatSection,
        schema.CalendarSection,
        schema.VenueSection,
        schema.TeamSection,
        schema.RulesSection,
        schema.PrioritiesSection,
        schema.FixedSection,
        schema.HolidaysSection,
    ):
        for name in model.model_fields:
            assert name in text, f"{model.__name__}.{name} is not explained in the template"


def test_yaml_and_toml_give_equal_leagues():
    from_toml = load_league(sample_path("evening_hall.toml"))
    from_yaml = load_league(DATA / "evening_hall.yaml")
    assert dataclasses.replace(from_yaml, source=None) == dataclasses.replace(
        from_toml, source=None
    )


def test_yaml_dump_of_parsed_toml_round_trips(tmp_path):
    """Any TOML league, written out by PyYAML and read back, gives the same League."""
    for name in sample_names():
        with sample_path(name).open("rb") as handle:
            data = tomllib.load(handle)
        path = tmp_path / (Path(name).stem + ".yaml")
        path.write_text(yaml.safe_dump(_times_as_text(data), sort_keys=False), encoding="utf-8")
        assert yaml.load(path.read_text(encoding="utf-8"), Loader=LeagueYamlLoader)
        a = dataclasses.replace(load_league(path), source=None)
        b = dataclasses.replace(load_league(sample_path(name)), source=None)
        assert a == b, name


def _times_as_text(value):
    if isinstance(value, dict):
        return {k: _times_as_text(v) for k, v in value.items()}
    if isinstance(value, list):
        return [_times_as_text(v) for v in value]
    if isinstance(value, dt.time):
        return value.isoformat()
    return value


def test_loading_is_deterministic():
    first = [repr(load_league(sample_path(n))) for n in sample_names()]
    second = [repr(load_league(sample_path(n))) for n in sample_names()]
    assert first == second


def test_loading_is_deterministic_across_processes():
    """Codes and orderings do not depend on hash seeds (PYTHONHASHSEED differs per process)."""
    code = (
        "from scheduler.config import load_league, sample_path, sample_names;"
        "print([repr(load_league(sample_path(n))) for n in sample_names()])"
    )
    outputs = set()
    for seed in ("1", "2"):
        env = dict(os.environ, PYTHONHASHSEED=seed)
        run = subprocess.run(
            [sys.executable, "-c", code],
            capture_output=True,
            text=True,
            env=env,
            check=True,
            timeout=120,
        )
        outputs.add(run.stdout)
    assert len(outputs) == 1


def test_priorities_order_becomes_weights():
    league = load_league(sample_path("club_day.toml"))
    with sample_path("club_day.toml").open("rb") as handle:
        order = tomllib.load(handle)["priorities"]["order"]
    weights = dataclasses.asdict(league.priorities)
    assert [weights[g] for g in order] == list(range(len(order), 0, -1))
    assert all(weights[g] == 0 for g in weights if g not in order)


def test_excluded_ranges_are_expanded_and_clipped():
    league = load_league(sample_path("county_double.toml"))
    ex = league.calendar.excluded
    assert dt.date(2027, 12, 24) in ex and dt.date(2028, 1, 2) in ex and dt.date(2028, 3, 25) in ex
    assert all(league.calendar.start <= d <= league.calendar.end for d in ex)
    assert list(ex) == sorted(set(ex))


def test_rounds_of_the_samples():
    """legs * (n - 1) rounds for even n, legs * n for odd n (one bye per round)."""
    assert rounds_needed(load_league(sample_path("county_double.toml"))) == 2 * 15
    assert rounds_needed(load_league(sample_path("evening_hall.toml"))) == 9
    assert rounds_needed(load_league(sample_path("club_day.toml"))) == 7


# --- starter file ---------------------------------------------------------------------------


def test_write_starter_config(tmp_path):
    target = write_starter_config(tmp_path / "my_league.toml")
    assert target.read_text(encoding="utf-8") == starter_config_text()
    assert load_league(target).name
    assert sorted(p.name for p in tmp_path.iterdir()) == ["my_league.toml"]  # no temp files


def test_write_starter_config_never_overwrites(tmp_path):
    target = tmp_path / "league.toml"
    target.write_text("mine", encoding="utf-8")
    with pytest.raises(OutputError, match="already exists"):
        write_starter_config(target)
    assert target.read_text(encoding="utf-8") == "mine"
    with pytest.raises(OutputError, match="does not exist"):
        write_starter_config(tmp_path / "no" / "such" / "league.toml")


def test_shipped_file_lookup_errors():
    with pytest.raises(InputError, match=r"did you mean 'league\.toml'"):
        template_path("leage.toml")
    with pytest.raises(InputError, match=r"did you mean 'club_day\.toml'"):
        sample_path("club_dya.toml")


def test_installed_layout_is_preferred(tmp_path, monkeypatch):
    """In a wheel, shipped files sit in scheduler/_templates and scheduler/_samples (see the
    force-include table in pyproject.toml); those win over the checkout folders."""
    from scheduler.config import resources

    with (REPO / "pyproject.toml").open("rb") as handle:
        include = tomllib.load(handle)["tool"]["hatch"]["build"]["targets"]["wheel"][
            "force-include"
        ]
    assert include == {"templates": "scheduler/_templates", "sample_leagues": "scheduler/_samples"}
    package = tmp_path / "scheduler"
    (package / "_templates").mkdir(parents=True)
    (package / "_samples").mkdir()
    (package / "_templates" / "league.toml").write_text(starter_config_text(), encoding="utf-8")
    (package / "_samples" / "club_day.toml").write_bytes(sample_path("club_day.toml").read_bytes())
    monkeypatch.setattr(resources.resources, "files", lambda name: package)
    assert resources.template_path("league.toml") == package / "_templates" / "league.toml"
    assert resources.sample_path("club_day") == package / "_samples" / "club_day.toml"
    assert resources.sample_names() == ("club_day.toml",)
    assert load_league(resources.sample_path("club_day")).name
