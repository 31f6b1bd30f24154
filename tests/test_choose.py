"""``scheduler choose``: another option of a planned season, without solving again.

Outside checks: the re-written folder is compared byte for byte with the folder ``plan`` writes
when the league's priorities pick that option (the planner's own output, produced by a
different path: a full solve); the stored timetables are read back with the standard library's
``json`` and the manifest's digests recomputed with ``hashlib`` (FIPS 180-4 SHA-256); solving
is made impossible by replacing OR-Tools' own ``CpSolver.Solve`` (and the project's solver and
search entry points) with functions that raise.
"""

from __future__ import annotations

import hashlib
import json
from pathlib import Path

import pytest
from typer.testing import CliRunner

from scheduler.cli import app

runner = CliRunner()

TOWNS = ("Brackwater", "Ossington Vale", "Quillmere", "Tandry Cross", "Hobbe's Reach",
         "Saltcombe", "Yarrowfield", "Denhollow", "Pinmarsh")


def league_text(mixing: int, breaks: int, teams: int = 9, *, name: str = "") -> str:
    """An invented one-hall league of ``teams`` teams; priorities mixing/breaks as given."""
    lines = [
        "[league]",
        f'name = "{name or "Brackwater Thursday League"}"',
        'season = "2031"',
        'timezone = "Europe/London"',
        "seed = 0",
        "time_limit_seconds = 4",
        "[format]",
        "legs = 1",
        'home_meaning = "side"',
        "[calendar]",
        "start = 2031-01-09",
        'weekdays = ["thu"]',
        'kickoff = "19:30"',
        "[[venues]]",
        'name = "Brackwater Hall"',
        'courts = ["Court 1", "Court 2", "Court 3", "Court 4"]',
    ]
    for town in TOWNS[:teams]:
        lines += ["[[teams]]", f'name = "{town}"']
    lines += ["[priorities]", f"mixing = {mixing}", f"breaks = {breaks}", "venue_balance = 2",
              "slot_balance = 2", "carry_over = 1"]
    return "\n".join(lines) + "\n"


def files_of(folder: Path) -> dict[str, bytes]:
    return {p.relative_to(folder).as_posix(): p.read_bytes()
            for p in sorted(folder.rglob("*")) if p.is_file()}


def plan(config: Path, out: Path) -> str:
    result = runner.invoke(app, ["plan", str(config), "--out", str(out), "--progress", "none"],
                           catch_exceptions=False)
    assert result.exit_code == 0, result.output
    return result.output


@pytest.fixture(scope="module")
def planned(tmp_path_factory) -> dict:
    """One plan (mixing first) and one whose priorities pick the fewest-breaks option."""
    root = tmp_path_factory.mktemp("choose")
    mixing_first, breaks_first = root / "mixing.toml", root / "breaks.toml"
    mixing_first.write_text(league_text(4, 3), encoding="utf-8")
    breaks_first.write_text(league_text(3, 4), encoding="utf-8")
    first = root / "first"
    output = plan(mixing_first, first)
    return {"root": root, "mixing": mixing_first, "breaks": breaks_first, "first": first,
            "text": output}


def options_of(folder: Path) -> list[dict]:
    return json.loads((folder / "season.json").read_text(encoding="utf-8"))["options"]


def copy(folder: Path, to: Path) -> Path:
    import shutil

    shutil.copytree(folder, to, symlinks=True)
    return to


def test_plan_lists_numbered_options_and_how_to_choose(planned):
    text = planned["text"]
    assert "  1. chosen" in text and "  2. considered" in text
    assert "scheduler choose" in text and "--option NUMBER" in text
    assert "None" not in text
    options = options_of(planned["first"])
    assert 3 <= sum(o["not_dominated"] for o in options) <= 5
    # season.json keeps the option figures of earlier versions, key for key (older readers,
    # which ignore keys they do not know), plus the long description beside the short label
    earlier = {"label", "perfect_pairs", "pairs", "breaks", "break_bound", "carry_over",
               "chosen", "not_dominated"}
    assert all(set(o) - {"detail"} == earlier for o in options)
    # every option has a short label, unique, and its construction as a separate detail
    labels = [o["label"] for o in options]
    assert len(set(labels)) == len(labels) and all(len(label) <= 28 for label in labels)
    assert all(":" not in o["label"] and o.get("detail") for o in options)
    stored = json.loads((planned["first"] / "options.json").read_text(encoding="utf-8"))
    assert len(stored["options"]) == len(options)
    manifest = json.loads((planned["first"] / ".season-manifest.json").read_text("utf-8"))
    digest = hashlib.sha256((planned["first"] / "options.json").read_bytes()).hexdigest()
    assert digest in json.dumps(manifest)


def test_choose_writes_what_plan_writes_when_the_priorities_pick_that_option(planned, tmp_path):
    options = options_of(planned["first"])
    fewest = min((k for k, o in enumerate(options, 1) if o["breaks"] is not None),
                 key=lambda k: (options[k - 1]["breaks"], k))
    assert not options[fewest - 1]["chosen"]
    chosen = copy(planned["first"], tmp_path / "chosen")
    replanned = copy(planned["first"], tmp_path / "replanned")
    result = runner.invoke(app, ["choose", str(planned["mixing"]), "--season", str(chosen),
                                 "--option", str(fewest)], catch_exceptions=False)
    assert result.exit_code == 0, result.output
    assert f"chose option {fewest}" in result.output and "None" not in result.output
    plan(planned["breaks"], replanned)
    assert options_of(replanned)[fewest - 1]["chosen"]
    after, direct = files_of(chosen), files_of(replanned)
    assert sorted(after) == sorted(direct)
    different = [name for name in after if after[name] != direct[name]]
    assert different == []
    # the report says which option is chosen and how to choose another
    report = (chosen / "report.html").read_text(encoding="utf-8")
    assert f"Chosen: option {fewest}." in report and "scheduler choose" in report


def test_choose_never_solves_nor_searches(planned, tmp_path, monkeypatch):
    from ortools.sat.python import cp_model

    import scheduler.balance.low_carry_over as low
    import scheduler.factorization as factorization
    import scheduler.plan as plan_module

    def forbidden(*args, **kwargs):
        raise AssertionError("choose must not solve or search")

    monkeypatch.setattr(cp_model.CpSolver, "Solve", forbidden)
    monkeypatch.setattr(cp_model.CpSolver, "solve", forbidden, raising=False)
    for name in ("solve_timetable", "assign_places", "best_low_carry_over",
                 "search_low_carry_over", "_factorize"):
        monkeypatch.setattr(plan_module, name, forbidden)
    monkeypatch.setattr(low, "search_low_carry_over", forbidden)
    monkeypatch.setattr(factorization, "factorize", forbidden)
    folder = copy(planned["first"], tmp_path / "season")
    options = options_of(folder)
    last = len(options)
    label = options[last - 1]["label"]
    result = runner.invoke(app, ["choose", str(planned["mixing"]), "--season", str(folder),
                                 "--option", label], catch_exceptions=False)
    assert result.exit_code == 0, result.output
    assert options_of(folder)[last - 1]["chosen"]
    # choosing the first option again gives back the first plan's files, byte for byte
    back = runner.invoke(app, ["choose", str(planned["mixing"]), "--season", str(folder),
                               "--option", "1"], catch_exceptions=False)
    assert back.exit_code == 0, back.output
    first, now = files_of(planned["first"]), files_of(folder)
    # calendar sequence numbers rise with each published change (RFC 5545 §3.8.7.4), so only
    # the calendars (and the manifest, which lists their digests) may differ from the first
    # plan; every other file is the first plan's
    assert {k for k in first if first[k] != now.get(k)} <= {
        k for k in first if k.startswith("calendars/")} | {".season-manifest.json"}
    assert (folder / "season.json").read_bytes() == first["season.json"]


def expect_refusal(args: list[str], folder: Path | None, *needles: str) -> str:
    before = files_of(folder) if folder is not None and folder.is_dir() else None
    result = runner.invoke(app, args)
    assert result.exit_code == 2, result.output
    message = result.output
    for needle in needles:
        assert needle in message, message
    if before is not None:
        assert files_of(folder) == before  # nothing written
    return message


def test_unknown_option_is_refused_with_the_list(planned, tmp_path):
    folder = copy(planned["first"], tmp_path / "season")
    base = ["choose", str(planned["mixing"]), "--season", str(folder), "--option"]
    expect_refusal([*base, "9"], folder, "--option", "there is no option 9", "1 = ")
    expect_refusal([*base, "moonlight"], folder, "--option", "names no option")
    expect_refusal([*base, "0"], folder, "there is no option 0")


def test_a_folder_that_is_not_a_season_is_refused(planned, tmp_path):
    empty = tmp_path / "empty"
    empty.mkdir()
    (empty / "notes.txt").write_text("mine", encoding="utf-8")
    expect_refusal(["choose", str(planned["mixing"]), "--season", str(empty), "--option", "1"],
                   empty, "not a season folder", str(empty))
    expect_refusal(["choose", str(planned["mixing"]), "--season", str(tmp_path / "nowhere"),
                    "--option", "1"], None, "no such folder")


def test_a_re_planned_season_is_refused(planned, tmp_path):
    folder = copy(planned["first"], tmp_path / "season")
    data = json.loads((folder / "season.json").read_text(encoding="utf-8"))
    data["revisions"] = [{"revision": data["revision"], "played_through": None, "changed": 0,
                          "note": "first plan"},
                         {"revision": "0123456789ab", "played_through": "2031-02-06",
                          "changed": 3, "note": "re-planned"}]
    data["revision"] = "0123456789ab"
    raw = (json.dumps(data, ensure_ascii=False, indent=2) + "\n").encode("utf-8")
    (folder / "season.json").write_bytes(raw)
    manifest_path = folder / ".season-manifest.json"
    manifest = json.loads(manifest_path.read_text(encoding="utf-8"))
    manifest["files"]["season.json"] = hashlib.sha256(raw).hexdigest()
    manifest_path.write_text(json.dumps(manifest), encoding="utf-8")
    expect_refusal(["choose", str(planned["mixing"]), "--season", str(folder), "--option", "2"],
                   folder, "re-planned", "revisions")


def test_another_league_file_or_a_changed_options_file_is_refused(planned, tmp_path):
    folder = copy(planned["first"], tmp_path / "season")
    other = tmp_path / "other.toml"
    other.write_text(league_text(4, 3).replace("19:30", "20:00"), encoding="utf-8")
    expect_refusal(["choose", str(other), "--season", str(folder), "--option", "2"], folder,
                   "not the one the season was planned from", str(other))
    options = folder / "options.json"
    options.write_bytes(options.read_bytes().replace(b'"Court 1"', b'"Court 9"', 1))
    expect_refusal(["choose", str(planned["mixing"]), "--season", str(folder), "--option", "2"],
                   folder, "options.json was changed")


def test_an_option_is_chosen_by_the_unique_start_of_its_short_label(planned, tmp_path):
    folder = copy(planned["first"], tmp_path / "season")
    options = options_of(folder)
    target = next(k for k, o in enumerate(options) if not o["chosen"])
    label = options[target]["label"]
    # the shortest start of the label that no other label shares
    start = next(label[:end] for end in range(1, len(label) + 1)
                 if sum(o["label"].casefold().startswith(label[:end].casefold())
                        for o in options) == 1)
    result = runner.invoke(app, ["choose", str(planned["mixing"]), "--season", str(folder),
                                 "--option", start.upper()], catch_exceptions=False)
    assert result.exit_code == 0, result.output
    assert f"chose option {target + 1} ({label})" in result.output
    assert options_of(folder)[target]["chosen"]


def test_labels_stored_before_short_labels_are_still_read_and_chosen(planned, tmp_path):
    """A season.json written when an option's label held its construction too ("kind:
    construction", no "detail" key) reads as short label and detail, and `choose` finds it."""
    from scheduler.export.season_json import load_season_json

    folder = copy(planned["first"], tmp_path / "season")
    path = folder / "season.json"
    data = json.loads(path.read_text(encoding="utf-8"))
    for option in data["options"]:
        option["label"] = f"{option['label']}: {option.pop('detail')}"
    raw = (json.dumps(data, ensure_ascii=False, indent=2) + "\n").encode("utf-8")
    path.write_bytes(raw)
    manifest_path = folder / ".season-manifest.json"
    manifest = json.loads(manifest_path.read_text(encoding="utf-8"))
    manifest["files"]["season.json"] = hashlib.sha256(raw).hexdigest()
    manifest_path.write_text(json.dumps(manifest), encoding="utf-8")
    fresh = options_of(planned["first"])
    read = load_season_json(path).options
    assert [(o.label, o.detail) for o in read] == [(o["label"], o["detail"]) for o in fresh]
    target = next(k for k, o in enumerate(fresh) if not o["chosen"])
    result = runner.invoke(app, ["choose", str(planned["mixing"]), "--season", str(folder),
                                 "--option", fresh[target]["label"]], catch_exceptions=False)
    assert result.exit_code == 0, result.output
    assert options_of(folder)[target]["chosen"]
