"""The output folder writer (scheduler.export.bundle): layout, refusals, atomicity, determinism,
and the calendar updates driven by the previous season.json in the folder (RFC 5545 §3.8.7.4)."""

from __future__ import annotations

import hashlib
import json
import os

import pytest
from icalendar import Calendar

from scheduler.errors import OutputError
from scheduler.export import bundle
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
         "calendars/.sequence.json", ".season-manifest.json", *feeds, "site/index.html", *pages]
    )  # fmt: skip
    # A team called "league" does not overwrite the league feed.
    assert "calendars/league.ics" not in feeds
    assert not [p for p in out.rglob("*.tmp")]
    assert sorted(p.name for p in out.parent.iterdir()) == ["nested"]  # no temporary folder
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
    with pytest.raises(OutputError, match=r"no season manifest.*--force"):
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
    with pytest.raises(OutputError, match=r"changed since.*calendars/\.sequence\.json.*--force"):
        write(season, tmp_path)
    write(season, tmp_path, force=True)


# --- the folder as a whole: manifest, user files, temporary folders, failures -------------------


def siblings(folder):
    """Entries beside ``folder`` other than itself (temporary folders would show here)."""
    return sorted(p.name for p in folder.parent.iterdir() if p.name != folder.name)


def test_manifest_lists_every_file_with_its_sha256(season, tmp_path):
    out = tmp_path / "out"
    write(season, out)
    manifest = json.loads((out / ".season-manifest.json").read_text(encoding="utf-8"))
    files = {p.relative_to(out).as_posix() for p in out.rglob("*") if p.is_file()}
    assert set(manifest["files"]) == files - {".season-manifest.json"}
    for name, digest in manifest["files"].items():
        # SHA-256 (FIPS 180-4) recomputed with hashlib, independently of the writer.
        assert hashlib.sha256((out / name).read_bytes()).hexdigest() == digest
    data = json.loads((out / "season.json").read_text(encoding="utf-8"))
    assert manifest["revision"] == data["revision"] == season.revision
    assert (manifest["league"], manifest["season"]) == (season.league, season.season_id)


def test_user_files_without_manifest_are_refused(season, tmp_path):
    out = tmp_path / "mine"
    out.mkdir()
    (out / "fixtures.csv").write_text("my own fixtures\n")
    (out / "report.html").write_text("<p>my report</p>")
    before = snapshot(out)
    with pytest.raises(OutputError, match="--force"):
        write(season, out)
    assert snapshot(out) == before
    assert siblings(out) == []


def test_changed_or_added_file_is_refused_without_force(season, tmp_path):
    out = tmp_path / "out"
    write(season, out)
    (out / "notes.txt").write_text("keep me")
    before = snapshot(out)
    with pytest.raises(OutputError, match=r"notes\.txt.*--force"):
        write(season, out)
    assert snapshot(out) == before
    (out / "notes.txt").unlink()
    (out / "fixtures.csv").write_text("edited by hand")
    with pytest.raises(OutputError, match=r"fixtures\.csv"):
        write(season, out)
    # Files a file browser drops into any folder are no reason to refuse, and are kept.
    write(season, out, force=True)
    (out / ".DS_Store").write_bytes(b"\0\1")
    write(season, out)
    assert (out / ".DS_Store").read_bytes() == b"\0\1"


def test_force_removes_stale_plan_files_and_keeps_user_files(season, tmp_path):
    out = tmp_path / "out"
    write(season, out)
    old_feeds = set(team_feed_names(season).values())
    (out / "notes.txt").write_text("keep me")
    (out / "mine").mkdir()
    (out / "mine" / "photo.bin").write_bytes(b"\x89PNG")
    (out / "calendars" / "extra.ics").write_text("my own feed")
    smaller = make_season(("Ashford Rovers", "Brookvale", "Cedar Hill", "Dunmore Town"))
    write(smaller, out, force=True)
    feeds = {p.name for p in (out / "calendars").iterdir()}
    new_feeds = set(team_feed_names(smaller).values())
    gone = old_feeds - new_feeds
    assert gone and not gone & feeds  # calendars of teams no longer in the league are removed
    assert new_feeds <= feeds and "extra.ics" in feeds
    assert (out / "notes.txt").read_text() == "keep me"
    assert (out / "mine" / "photo.bin").read_bytes() == b"\x89PNG"
    assert (out / "calendars" / "extra.ics").read_text() == "my own feed"
    manifest = json.loads((out / ".season-manifest.json").read_text(encoding="utf-8"))
    assert "notes.txt" not in manifest["files"]
    assert siblings(out) == []


def test_user_folder_where_a_file_goes_is_refused_even_with_force(season, tmp_path):
    out = tmp_path / "out"
    (out / "report.html").mkdir(parents=True)
    (out / "report.html" / "index.html").write_text("mine")
    with pytest.raises(OutputError, match="is a folder where"):
        write(season, out, force=True)
    assert (out / "report.html" / "index.html").read_text() == "mine"


def test_failed_write_leaves_previous_season_and_no_temporary_folder(season, tmp_path, monkeypatch):
    out = tmp_path / "out"
    write(season, out)
    before = snapshot(out)
    calls = []
    real = bundle._write_file

    def failing(path, data):
        calls.append(path)
        if len(calls) == 3:
            raise OSError(28, "No space left on device")
        real(path, data)

    monkeypatch.setattr(bundle, "_write_file", failing)
    with pytest.raises(OutputError, match="No space left"):
        write(move_fixture(season, 0, 2, revision="r2"), out)
    assert snapshot(out) == before and siblings(out) == []
    # An interrupt half-way: the same.
    calls.clear()

    def interrupted(path, data):
        calls.append(path)
        if len(calls) == 4:
            raise KeyboardInterrupt
        real(path, data)

    monkeypatch.setattr(bundle, "_write_file", interrupted)
    with pytest.raises(KeyboardInterrupt):
        write(move_fixture(season, 0, 2, revision="r2"), out)
    assert snapshot(out) == before and siblings(out) == []


def test_error_while_computing_writes_nothing(season, tmp_path, monkeypatch):
    out = tmp_path / "out"
    write(season, out)
    before = snapshot(out)

    def broken(*args, **kwargs):
        raise ValueError("year 10000 is out of range")

    monkeypatch.setattr(bundle, "team_calendar", broken)
    with pytest.raises(ValueError):
        write(move_fixture(season, 0, 2, revision="r2"), out)
    assert snapshot(out) == before and siblings(out) == []
    monkeypatch.setattr(bundle, "_write_file", lambda *a: pytest.fail("nothing may be written"))
    with pytest.raises(ValueError):
        write(season, tmp_path / "fresh")
    assert not (tmp_path / "fresh").exists()


def test_two_rename_swap_where_exchange_is_missing(season, tmp_path, monkeypatch):
    monkeypatch.setattr(bundle, "_exchange", lambda first, second: False)
    out = tmp_path / "out"
    write(season, out)
    moved = move_fixture(season, 0, 2, revision="r2")
    write(moved, out)
    assert json.loads((out / "season.json").read_text())["revision"] == "r2"
    assert siblings(out) == []


def test_leftovers_of_a_killed_run_are_cleaned(season, tmp_path):
    out = tmp_path / "out"
    write(season, out)
    before = snapshot(out)
    # A run killed while building its temporary folder.
    half = tmp_path / ".out.season-tmp-1234abcd"
    (half / "calendars").mkdir(parents=True)
    (half / "fixtures.csv").write_text("half a plan")
    # A run killed between the two renames of the fallback swap: the season folder is missing.
    os.rename(out, tmp_path / ".out.season-old-99aa")
    write(season, out)  # the same plan again: the old season is put back, then rewritten
    assert snapshot(out) == before
    assert siblings(out) == []
    # Folders of other names are never touched.
    (tmp_path / ".other.season-tmp-12").mkdir()
    (tmp_path / ".out.season-tmp-notes").mkdir()
    write(season, out)
    assert siblings(out) == [".other.season-tmp-12", ".out.season-tmp-notes"]


def test_symlinked_output_folder_stays_a_link(season, tmp_path):
    real = tmp_path / "real"
    write(season, real)
    link = tmp_path / "link"
    link.symlink_to(real, target_is_directory=True)
    write(move_fixture(season, 0, 2, revision="r2"), link)
    assert link.is_symlink()
    assert json.loads((real / "season.json").read_text())["revision"] == "r2"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["link", "real"]


@pytest.mark.skipif(os.name != "posix", reason="POSIX permission bits")
def test_read_only_subfolder_of_the_user_does_not_leave_a_temporary_folder(season, tmp_path):
    out = tmp_path / "out"
    write(season, out)
    (out / "mine").mkdir()
    (out / "mine" / "a.txt").write_text("a")
    os.chmod(out / "mine", 0o555)
    try:
        write(move_fixture(season, 0, 2, revision="r2"), out, force=True)
        assert (out / "mine" / "a.txt").read_text() == "a"
        assert siblings(out) == []
    finally:
        os.chmod(out / "mine", 0o755)


@pytest.mark.parametrize("exchange", [True, False])
def test_file_saved_while_the_plan_is_written_is_kept(season, tmp_path, monkeypatch, exchange):
    out = tmp_path / "out"
    write(season, out)
    real_swap = bundle._swap_in
    if not exchange:
        monkeypatch.setattr(bundle, "_exchange", lambda first, second: False)

    def user_saves_then_swap(new, target):
        (target / "late.txt").write_text("saved during the run")
        return real_swap(new, target)

    monkeypatch.setattr(bundle, "_swap_in", user_saves_then_swap)
    write(move_fixture(season, 0, 2, revision="r2"), out)
    assert (out / "late.txt").read_text() == "saved during the run"
    assert siblings(out) == []
