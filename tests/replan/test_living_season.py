"""A season lived week by week with ONE events file that grows.

The organizer keeps one events file and adds to it: ``played_through`` moves forward, new
postponements and other events are appended, the old entries stay. Each re-plan must recognise
what an earlier re-plan already applied (season.json records it in ``revisions``), treat a
re-placed game whose new date has passed as history, and refuse a file that contradicts what
was published. Every step is checked by the independent checker (``checker.py``, which imports
nothing from the planner), and across all steps every game published as played stays
byte-for-byte the same JSON object (docs/replanning.md, "A season lived week by week").
"""

from __future__ import annotations

import json
import shutil

from typer.testing import CliRunner

from scheduler.cli import app
from tests.replan.checker import check
from tests.replan.conftest import LEAGUE, folder_digest

runner = CliRunner()
HEAD = 'league = "Fenmarsh Test League"\nseason = "2031"\n'


def fixtures(folder):
    return json.loads((folder / "season.json").read_text(encoding="utf-8"))["fixtures"]


def game_of(fx, number, index=0, avoid=()):
    games = [f for f in fx if f["round"] == number and not {f["home"], f["away"]} & set(avoid)]
    return games[index]


def replan(folder, events):
    return runner.invoke(app, ["replan", str(LEAGUE), "--season", str(folder),
                               "--events", str(events)], catch_exceptions=False)


def step(folder, tmp_path, events, name):
    """One re-plan with the grown file, checked by the independent checker."""
    old = tmp_path / f"{name}.json"
    shutil.copy(folder / "season.json", old)
    result = replan(folder, events)
    assert result.exit_code == 0, result.output
    assert check(old, folder / "season.json", LEAGUE, events) == []
    return result


def write(path, played_through, body):
    path.write_text(f"{HEAD}played_through = {played_through}\n\n{body}", encoding="utf-8")


def test_three_replans_with_one_growing_file(season_dir, tmp_path):
    first = fixtures(season_dir)
    events = tmp_path / "events.toml"
    # week 4: one game postponed (no date given: the pair meets once at this home ground)
    a = game_of(first, 4)
    body = f'[[postponed]]\nhome = "{a["home"]}"\naway = "{a["away"]}"\n\n'
    write(events, "2031-03-22", body)
    step(season_dir, tmp_path, events, "plan0")
    after1 = fixtures(season_dir)
    (a_new,) = [f for f in after1 if (f["home"], f["away"], f["round"]) ==
                (a["home"], a["away"], a["round"])]
    assert a_new["date"] > "2031-03-22"

    # week 6: played_through moves on, a game of round 6 is postponed (with its date) and a
    # game of round 9 was moved by hand; the old postponement stays in the file
    b = game_of(after1, 6, avoid=(a["home"], a["away"]))
    c = game_of(after1, 9, avoid=(b["home"], b["away"]))
    body += (f'[[postponed]]\nhome = "{b["home"]}"\naway = "{b["away"]}"\n'
             f'date = {b["date"]}\n\n'
             f'[[moved]]\nhome = "{c["home"]}"\naway = "{c["away"]}"\n'
             'date = 2031-06-07\nstart = "18:30"\n\n')
    write(events, "2031-04-05", body)
    step(season_dir, tmp_path, events, "plan1")
    after2 = fixtures(season_dir)
    if a_new["date"] <= "2031-04-05":
        # the re-placed game was played on its new date: it is history now, not postponed again
        assert a_new in after2
    moved = [f for f in after2 if (f["home"], f["away"]) == (c["home"], c["away"])
             and f["date"] == "2031-06-07"]
    assert moved and moved[0]["time"] == "18:30"

    # week 8: a team withdraws (its played games stand), a ground closes, one more postponement
    d = game_of(after2, 8, avoid=("Marram Athletic",))
    body += (f'[[postponed]]\nhome = "{d["home"]}"\naway = "{d["away"]}"\n'
             f'date = {d["date"]}\n\n'
             '[[withdrawn]]\nteam = "Marram Athletic"\npolicy = "keep_played"\n\n'
             '[[closed]]\nvenue = "Old Sluice"\ndates = ["2031-04-26..2031-05-03"]\n')
    write(events, "2031-04-19", body)
    step(season_dir, tmp_path, events, "plan2")
    final = fixtures(season_dir)

    # history never moves, across all three re-plans: every game published as played by any
    # version is the same JSON object in the final season
    for published, through in ((first, "2031-03-22"), (after1, "2031-04-05"),
                               (after2, "2031-04-19")):
        played = [f for f in published if f["date"] <= through
                  and (f["home"], f["away"], f["date"]) not in
                  {(a["home"], a["away"], a["date"]), (b["home"], b["away"], b["date"]),
                   (d["home"], d["away"], d["date"])}]
        assert played and all(f in final for f in played)
    assert [f for f in final if f["date"] == "2031-06-07"] == moved
    assert not [f for f in final if "Marram Athletic" in (f["home"], f["away"])
                and f["date"] > "2031-04-19"]
    data = json.loads((season_dir / "season.json").read_text(encoding="utf-8"))
    revisions = data["revisions"]
    assert [r["played_through"] for r in revisions] == [None, "2031-03-22", "2031-04-05",
                                                        "2031-04-19"]
    assert [[(g["home"], g["away"], g["date"]) for g in r.get("postponed", [])]
            for r in revisions] == [[], [(a["home"], a["away"], a["date"])],
                                    [(b["home"], b["away"], b["date"])],
                                    [(d["home"], d["away"], d["date"])]]

    # the same grown file once more: nothing to change, not one byte written
    digest = folder_digest(season_dir)
    again = replan(season_dir, events)
    assert again.exit_code == 0, again.output
    assert "nothing to change" in again.output
    assert folder_digest(season_dir) == digest


def test_same_file_twice_is_a_no_op(season_dir, tmp_path):
    """The second run with the very same file writes nothing: every file, the calendars and
    their SEQUENCE numbers (RFC 5545 §3.8.7.4) included, stays byte-identical."""
    import icalendar

    game = game_of(fixtures(season_dir), 4)
    events = tmp_path / "events.toml"
    write(events, "2031-03-22", f'[[postponed]]\nhome = "{game["home"]}"\n'
                                f'away = "{game["away"]}"\n')
    step(season_dir, tmp_path, events, "plan0")
    feed = season_dir / "calendars" / "league.ics"

    def sequences():
        calendar = icalendar.Calendar.from_ical(feed.read_bytes())
        return {str(e["UID"]): int(e.get("SEQUENCE", 0)) for e in calendar.walk("VEVENT")}

    seq = sequences()
    assert max(seq.values()) == 1  # the first re-plan moved games (SEQUENCE 0 -> 1)
    digest = folder_digest(season_dir)
    result = replan(season_dir, events)
    assert result.exit_code == 0, result.output
    assert "nothing to change" in result.output and "nothing written" in result.output
    assert folder_digest(season_dir) == digest
    assert sequences() == seq


# --- a grown file that contradicts what was published: located, exit 2, nothing written -----


def refused_after_first_replan(season_dir, tmp_path, played_through, extra, expected):
    game = game_of(fixtures(season_dir), 4)
    events = tmp_path / "events.toml"
    body = f'[[postponed]]\nhome = "{game["home"]}"\naway = "{game["away"]}"\n\n'
    write(events, "2031-03-22", body)
    step(season_dir, tmp_path, events, "plan0")
    digest = folder_digest(season_dir)
    write(events, played_through, body + extra(fixtures(season_dir)))
    result = replan(season_dir, events)
    assert result.exit_code == 2, result.output
    text = " ".join(result.output.split())
    assert all(part in text for part in expected), text
    assert folder_digest(season_dir) == digest


def test_played_through_moved_backwards(season_dir, tmp_path):
    refused_after_first_replan(
        season_dir, tmp_path, "2031-03-15", lambda fx: "",
        ("played_through 2031-03-15 is before 2031-03-22, the played_through of the season "
         "folder's last re-plan",))


def test_postponing_a_game_published_as_played(season_dir, tmp_path):
    def extra(fx):
        g = game_of(fx, 2)
        return f'[[postponed]]\nhome = "{g["home"]}"\naway = "{g["away"]}"\ndate = {g["date"]}\n'

    refused_after_first_replan(season_dir, tmp_path, "2031-04-05", extra, (
        "postponed[1]: ", "was published as played and cannot be postponed now"))


def test_postponed_game_that_was_never_planned(season_dir, tmp_path):
    def extra(fx):
        g = game_of(fx, 6)
        return (f'[[postponed]]\nhome = "{g["home"]}"\naway = "{g["away"]}"\n'
                "date = 2031-03-29\n")

    refused_after_first_replan(season_dir, tmp_path, "2031-04-05", extra, (
        "postponed[1]: ", "on 2031-03-29 is not a game of the plan"))


def test_hand_moved_game_in_history_that_did_not_happen(season_dir, tmp_path):
    def extra(fx):
        g = game_of(fx, 6)
        return (f'[[moved]]\nhome = "{g["home"]}"\naway = "{g["away"]}"\n'
                'date = 2031-04-05\nstart = "11:00"\n')

    refused_after_first_replan(season_dir, tmp_path, "2031-04-12", extra, (
        "moved[0].date: 2031-04-05 is on or before played_through 2031-04-12, but the season "
        "has no game",))


def test_withdrawal_and_hand_move_repeated_in_a_grown_file(season_dir, tmp_path):
    """A ``void_all`` withdrawal and a game moved by hand (with its planned date as ``from``)
    stay in the file; the next re-plan neither cancels nor moves anything twice."""
    first = fixtures(season_dir)
    c = game_of(first, 9, avoid=("Old Sluice",))
    events = tmp_path / "events.toml"
    body = ('[[withdrawn]]\nteam = "Old Sluice"\npolicy = "void_all"\n\n'
            f'[[moved]]\nhome = "{c["home"]}"\naway = "{c["away"]}"\nfrom = {c["date"]}\n'
            'date = 2031-06-07\nstart = "18:30"\n\n')
    write(events, "2031-03-22", body)
    step(season_dir, tmp_path, events, "plan0")
    after1 = fixtures(season_dir)
    assert not [f for f in after1 if "Old Sluice" in (f["home"], f["away"])]
    d = game_of(after1, 6)
    body += (f'[[postponed]]\nhome = "{d["home"]}"\naway = "{d["away"]}"\n'
             f'date = {d["date"]}\n')
    write(events, "2031-04-05", body)
    result = step(season_dir, tmp_path, events, "plan1")
    after2 = fixtures(season_dir)
    moved = [f for f in after2 if (f["home"], f["away"]) == (c["home"], c["away"])]
    assert [(f["date"], f["time"]) for f in moved] == [("2031-06-07", "18:30")]
    assert not [f for f in after2 if "Old Sluice" in (f["home"], f["away"])]
    # only the new postponement (and what it forces) changed: nothing was cancelled again
    assert "cancelled" not in result.output
    assert [f for f in after1 if f["date"] <= "2031-04-05" and f is not d
            and (f["home"], f["away"], f["date"]) != (d["home"], d["away"], d["date"])] == [
        f for f in after2 if f["date"] <= "2031-04-05"]
