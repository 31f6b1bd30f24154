"""The output folder writer (scheduler.export.bundle): layout, refusals, atomicity, determinism,
and the calendar updates driven by the previous season.json in the folder (RFC 5545 §3.8.7.4)."""

from __future__ import annotations

import json

import pytest
from icalendar import Calendar

from scheduler.errors import OutputError
from scheduler.export.bundle import output_paths, team_feed_names, write_season_outputs
from scheduler.fairness import compute_fairness
from tests.export.samples import FORMULA, TRICKY, drop_fixture, make_season, move_fixture

TEAMS = ("Ashford Rovers", TRICKY, FORMULA, "league")


@pytest.fixture
def season():
    return make_season(TEAMS)


def write(season, out, **kw):
    return write_season_outputs(season, compute_fairness(season), out, **kw)


def snapshot(folder):
    return {
        p.relative_to(folder).as_posix(): p.read_bytes() for p in folder.rglob("*") if p.is_file()
    }


def test_layout_and_no_temp_files(season, tmp_path):
    out = tmp_path / "out" / "nested"
    written = write(season, out)
    assert written == output_paths(season, out)
    names = sorted(p.relative_to(out).as_posix() for p in out.rglob("*") if p.is_file())
    feeds = sorted(f"calendars/{n}" for n in team_feed_names(season).values())
    pages = sorted(f"site/teams/{n[:-4]}.html" for n in team_feed_names(season).values())
    assert names == sorted(
        ["season.json", "fixtures.csv", "fixtures.xlsx", "report.html", "calendars/league.ics",
         "calendars/.sequence.json", *feeds, "site/index.html", *pages]
    )  # fmt: skip
    # A team called "league" does not overwrite the league feed.
    assert "calendars/league.ics" not in feeds
    assert not [p for p in out.rglob("*.tmp")]
    data = json.loads((out / "season.json").read_text(encoding="utf-8"))
    assert data["league"] == season.league


def test_two_runs_byte_identical(season, tmp_path):
    write(season, tmp_path / "a")
    write(make_season(TEAMS), tmp_path / "b")
    a, b = snapshot(tmp_path / "a"), snapshot(tmp_path / "b")
    assert a == b  # season.json, CSV, .ics, and also xlsx and report.html
    # Re-writing the same plan into the same folder changes nothing either.
    write(season, tmp_path / "a")
    assert snapshot(tmp_path / "a") == a


def test_refuses_config_inside_or_equal(season, tmp_path):
    config = tmp_path / "league.toml"
    config.write_text("name = 'x'\n")
    with pytest.raises(OutputError, match="league file"):
        write(season, tmp_path, config_path=config)
    out = tmp_path / "out"
    out.mkdir()
    inside = out / "season.json"
    inside.write_text("{}")
    with pytest.raises(OutputError, match="league file"):
        write(season, out, config_path=inside)
    assert inside.read_text() == "{}" and config.read_text() == "name = 'x'\n"
    # A league file elsewhere is fine.
    write(season, tmp_path / "elsewhere", config_path=config)


def test_refuses_config_through_symlink(season, tmp_path):
    config = tmp_path / "cfg" / "league.toml"
    config.parent.mkdir()
    config.write_text("x")
    out = tmp_path / "out"
    out.mkdir()
    (out / "fixtures.csv").symlink_to(config)
    with pytest.raises(OutputError):
        write(season, out, config_path=config)
    assert config.read_text() == "x"


def test_refuses_other_league_unless_forced(season, tmp_path):
    write(season, tmp_path)
    other = make_season(("North", "South", "East", "West"))
    other = type(other)(**{**other.__dict__, "league": "Hill Cup"})
    before = snapshot(tmp_path)
    with pytest.raises(OutputError, match="another league"):
        write(other, tmp_path)
    assert snapshot(tmp_path) == before
    write(other, tmp_path, force=True)
    assert json.loads((tmp_path / "season.json").read_text())["league"] == "Hill Cup"
    # Forced over another league: no cancellations of that league's games.
    feed = Calendar.from_ical((tmp_path / "calendars" / "league.ics").read_bytes())
    assert {str(e["status"]) for e in feed.walk("VEVENT")} == {"CONFIRMED"}


def test_refuses_unreadable_season_file(season, tmp_path):
    (tmp_path / "season.json").write_text("not json")
    with pytest.raises(OutputError, match="not a season file"):
        write(season, tmp_path)
    write(season, tmp_path, force=True)


def test_refuses_a_file_as_folder(season, tmp_path):
    target = tmp_path / "plain"
    target.write_text("x")
    with pytest.raises(OutputError, match="not a folder"):
        write(season, target)


def events(path):
    return {str(e["uid"]): e for e in Calendar.from_ical(path.read_bytes()).walk("VEVENT")}


def test_replan_in_folder_updates_calendars(season, tmp_path):
    write(season, tmp_path)
    feed = tmp_path / "calendars" / "league.ics"
    first = events(feed)
    moved = move_fixture(season, 0, 2, revision="r2")
    write(moved, tmp_path)
    second = events(feed)
    bumped = [u for u in second if int(second[u]["sequence"]) == 1]
    assert len(bumped) == 1 and set(second) == set(first)
    assert second[bumped[0]].decoded("dtstamp") > first[bumped[0]].decoded("dtstamp")
    # Third plan: the same game moves back and another is dropped; sequences keep rising.
    dropped = drop_fixture(move_fixture(moved, 0, -2, revision="r3"), 5, revision="r3")
    write(dropped, tmp_path)
    third = events(feed)
    assert int(third[bumped[0]]["sequence"]) == 2
    cancelled = [u for u, e in third.items() if str(e["status"]) == "CANCELLED"]
    assert len(cancelled) == 1
    for uid, ev in third.items():
        assert int(ev["sequence"]) >= int(second[uid]["sequence"])
    # The team feeds of the cancelled game's teams carry it too.
    f = season.fixtures[5]
    names = team_feed_names(season)
    for team in f.teams:
        team_feed = events(tmp_path / "calendars" / names[team])
        assert str(team_feed[cancelled[0]]["status"]) == "CANCELLED"


def test_lost_state_file_falls_back_to_season_json(season, tmp_path):
    write(season, tmp_path)
    feed = tmp_path / "calendars" / "league.ics"
    first = feed.read_bytes()
    (tmp_path / "calendars" / ".sequence.json").unlink()
    write(season, tmp_path)  # same plan, state rebuilt from season.json alone
    assert feed.read_bytes() == first
    (tmp_path / "calendars" / ".sequence.json").unlink()
    write(move_fixture(season, 1, 3, revision="r2"), tmp_path)
    sequences = sorted(int(e["sequence"]) for e in events(feed).values())
    assert sequences == [0] * (len(season.fixtures) - 1) + [1]


def test_damaged_state_file_is_refused(season, tmp_path):
    write(season, tmp_path)
    (tmp_path / "calendars" / ".sequence.json").write_text("{broken")
    with pytest.raises(OutputError, match="damaged"):
        write(season, tmp_path)
    write(season, tmp_path, force=True)
