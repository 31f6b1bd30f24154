"""The ``scheduler`` command end to end, through typer's test runner.

The checks on figures go back to the literature through the library's own tests; here the point
is the command's contract: fields, exit codes (0 ok, 1 invalid schedule, 2 unusable input),
one-line errors and no tracebacks.
"""

from __future__ import annotations

import csv
import io
import json
import math
import os
import subprocess
import sys
from pathlib import Path

import networkx as nx
import pytest
from typer.testing import CliRunner

from scheduler.cli import app
from scheduler.config import sample_path

runner = CliRunner()
ROOT = Path(__file__).resolve().parents[1]


def run(*args: str):
    return runner.invoke(app, list(args), catch_exceptions=False)


@pytest.mark.parametrize("teams", [2, 3, 8, 9, 16, 21, 28])
def test_factor_json_fields_and_rounds(teams):
    result = run("factor", str(teams), "--json")
    assert result.exit_code == 0, result.output
    data = json.loads(result.stdout)
    assert data["teams"] == teams
    n = teams + teams % 2
    assert data["pairs"] == math.comb(n - 1, 2)
    # Covered orders are perfect (Kotzig 1964 for n-1 prime, Anderson 1973 for n/2 prime,
    # starters for 16 and 28).
    assert data["perfect"] is True and data["perfect_pairs"] == data["pairs"]
    assert isinstance(data["method"], str) and data["method"]
    rounds = data["rounds"]
    assert len(rounds) == n - 1
    # Independent check with networkx: every pair of real teams meets exactly once, byes left
    # out, and each round is a matching of the real teams.
    graph = nx.MultiGraph()
    for games in rounds:
        seen = [v for game in games for v in game]
        assert len(seen) == len(set(seen))
        assert all(0 <= v < teams for v in seen)
        assert len(games) == teams // 2
        graph.add_edges_from(tuple(g) for g in games)
    simple = nx.Graph(graph)
    assert graph.number_of_edges() == simple.number_of_edges() == math.comb(teams, 2)


def test_factor_odd_league_rounds_have_one_bye_each():
    data = json.loads(run("factor", "9", "--json").stdout)
    for games in data["rounds"]:
        assert 9 - 2 * len(games) == 1


def test_factor_text_output():
    result = run("factor", "6")
    assert result.exit_code == 0
    assert "perfect: yes" in result.stdout
    assert "round   1:" in result.stdout


def test_factor_says_whether_a_perfect_one_is_known_when_it_shows_an_imperfect_one():
    """K_52 has a published perfect one-factorization (A. J. Wolfe 2009, from memory) that the
    tool does not hold; for K_64 none is known (docs/one-factorizations.md)."""
    data = json.loads(run("factor", "52", "--json", "--time-limit", "1").stdout)
    assert data["perfect"] is False
    assert data["perfect_known"] is True and "Wolfe" in data["perfect_known_reason"]
    text = run("factor", "64", "--summary", "--time-limit", "1").stdout
    assert "perfect: no" in text
    assert "no perfect one-factorization of this order is known" in " ".join(text.split())
    perfect = json.loads(run("factor", "8", "--json").stdout)
    assert perfect["perfect"] is True and perfect["perfect_known"] is True


@pytest.mark.parametrize("bad", ["1", "0", "-4", "3.5", "seven", "10000000", "1e3"])
def test_factor_bad_input_is_one_clear_line(bad):
    result = runner.invoke(app, ["factor", bad])
    assert result.exit_code == 2
    text = result.stderr.strip()
    assert text.startswith("error:")
    assert "Traceback" not in result.output + result.stderr
    assert len(text.splitlines()) == 1


def test_new_writes_a_config_that_plans(tmp_path):
    target = tmp_path / "league.toml"
    assert run("new", str(target)).exit_code == 0
    assert target.read_text(encoding="utf-8").startswith("#")
    again = runner.invoke(app, ["new", str(target)])
    assert again.exit_code == 2  # never overwrites


def test_plan_writes_every_output_and_audit_reads_it_back(tmp_path):
    out = tmp_path / "season"
    result = run("plan", str(sample_path("club_day")), "--out", str(out), "--quiet")
    assert result.exit_code == 0, result.output
    for name in ("season.json", "fixtures.csv", "fixtures.xlsx", "report.html"):
        assert (out / name).stat().st_size > 0
    assert (out / "calendars" / "league.ics").is_file()
    season = json.loads((out / "season.json").read_text(encoding="utf-8"))
    for key in ("breaks_total", "carry_over_value", "perfect_pairs", "pairs"):
        assert key in season["fairness"]

    audited = run("audit", str(out / "season.json"), "--json")
    assert audited.exit_code == 0, audited.output
    figures = json.loads(audited.stdout)
    assert figures["valid"] is True
    for key in ("breaks_total", "carry_over_value", "perfect_pairs", "pairs"):
        assert figures[key] == season["fairness"][key]

    csv_audit = run("audit", str(out / "fixtures.csv"), "--json")
    assert csv_audit.exit_code == 0
    assert json.loads(csv_audit.stdout)["breaks_total"] == season["fairness"]["breaks_total"]


def test_plan_is_deterministic(tmp_path):
    outputs = []
    for name in ("a", "b"):
        out = tmp_path / name
        assert (
            run("plan", str(sample_path("evening_hall")), "--out", str(out), "--quiet").exit_code
            == 0
        )
        outputs.append(out)
    for rel in ("season.json", "fixtures.csv", "calendars/league.ics"):
        assert (outputs[0] / rel).read_bytes() == (outputs[1] / rel).read_bytes()


def test_audit_invalid_schedule_exits_1_with_rows(tmp_path):
    out = tmp_path / "season"
    run("plan", str(sample_path("club_day")), "--out", str(out), "--quiet")
    rows = list(csv.reader(io.StringIO((out / "fixtures.csv").read_text(encoding="utf-8"))))
    header, body = rows[0], rows[1:]
    home = header.index("home")
    body[1][home] = body[0][home]  # one team now plays twice in round 1
    broken = tmp_path / "broken.csv"
    with broken.open("w", newline="", encoding="utf-8") as handle:
        csv.writer(handle).writerows([header, *body])
    result = runner.invoke(app, ["audit", str(broken), "--json"])
    assert result.exit_code == 1
    data = json.loads(result.stdout)
    assert data["valid"] is False and data["problems"]


@pytest.mark.parametrize(
    "content",
    [b"", b"just some words\n", b"\xff\xfe\x00\xd8broken", b"round,home\n1,A\n"],
)
def test_audit_unusable_input_exits_2(tmp_path, content):
    path = tmp_path / "schedule.csv"
    path.write_bytes(content)
    result = runner.invoke(app, ["audit", str(path)])
    assert result.exit_code == 2, result.output
    assert "Traceback" not in result.output + result.stderr


def test_audit_missing_file_exits_2(tmp_path):
    result = runner.invoke(app, ["audit", str(tmp_path / "nope.csv")])
    assert result.exit_code == 2


def test_plan_bad_config_exits_2_and_writes_nothing(tmp_path):
    config = tmp_path / "league.toml"
    text = Path(sample_path("club_day")).read_text(encoding="utf-8")
    config.write_text(text.replace("legs = 1", "legz = 1"), encoding="utf-8")
    out = tmp_path / "out"
    result = runner.invoke(app, ["plan", str(config), "--out", str(out)])
    assert result.exit_code == 2
    assert "format.legz" in result.stderr
    assert not out.exists()


def test_version():
    from scheduler import __version__

    result = run("--version")
    assert result.exit_code == 0 and __version__ in result.stdout


# --- new: the ending chooses the format ---------------------------------------------------------


@pytest.mark.parametrize("name", ["league.yaml", "league.yml", "league.toml", "LEAGUE.YAML"])
def test_new_writes_the_format_its_ending_asks_for_and_it_loads(tmp_path, name):
    import tomllib

    import yaml

    from scheduler.config import load_league

    target = tmp_path / name
    assert run("new", str(target)).exit_code == 0
    text = target.read_text(encoding="utf-8")
    # Parsed by the general-purpose readers of each format (PyYAML; tomllib, TOML 1.0).
    data = tomllib.loads(text) if name.lower().endswith(".toml") else yaml.safe_load(text)
    assert data["league"]["time_limit_seconds"] == 10
    league = load_league(target)
    assert league.team_names and league.solve_seconds == 10


def test_toml_and_yaml_starters_describe_the_same_league(tmp_path):
    import dataclasses

    from scheduler.config import load_league

    leagues = []
    for name in ("league.toml", "league.yaml"):
        assert run("new", str(tmp_path / name)).exit_code == 0
        league = load_league(tmp_path / name)
        leagues.append(dataclasses.replace(league, source=None))
    assert leagues[0] == leagues[1]


@pytest.mark.parametrize("name", ["league.txt", "league", "league.json", "league.toml.bak"])
def test_new_refuses_other_endings_and_writes_nothing(tmp_path, name):
    result = runner.invoke(app, ["new", str(tmp_path / name)])
    assert result.exit_code == 2
    assert str(tmp_path / name) in result.stderr and ".toml, .yaml or .yml" in result.stderr
    assert list(tmp_path.iterdir()) == []


# --- plan: the season folder ------------------------------------------------------------------


def test_plan_refuses_a_user_folder_before_solving_and_names_force(tmp_path):
    out = tmp_path / "season"
    out.mkdir()
    (out / "fixtures.csv").write_text("my own\n")
    (out / "report.html").write_text("<p>mine</p>")
    result = runner.invoke(app, ["plan", str(sample_path("club_day")), "--out", str(out)])
    assert result.exit_code == 2
    assert "--force" in result.stderr
    assert (out / "fixtures.csv").read_text() == "my own\n"
    assert sorted(p.name for p in out.iterdir()) == ["fixtures.csv", "report.html"]


def test_plan_refuses_another_league_before_solving(planned, tmp_path):
    import shutil

    out = tmp_path / "season"
    shutil.copytree(planned, out)
    before = {p: p.read_bytes() for p in out.rglob("*") if p.is_file()}
    started = runner.invoke(app, ["plan", str(sample_path("evening_hall")), "--out", str(out)])
    assert started.exit_code == 2
    assert "another league" in started.stderr and "--force" in started.stderr
    assert {p: p.read_bytes() for p in out.rglob("*") if p.is_file()} == before


def test_old_option_and_key_names_of_the_time_limit_still_work(tmp_path):
    result = runner.invoke(app, ["factor", "8", "--budget", "2", "--json"])
    assert result.exit_code == 0
    assert "--time-limit" in result.stderr
    assert run("factor", "8", "--time-limit", "2", "--json").exit_code == 0
    bad = runner.invoke(app, ["factor", "8", "--time-limit", "0"])
    assert bad.exit_code == 2 and "--time-limit" in bad.stderr
    text = sample_path("club_day").read_text(encoding="utf-8")
    old = tmp_path / "old.toml"
    old.write_text(text.replace("time_limit_seconds", "solve_seconds"), encoding="utf-8")
    from scheduler.config import load_league

    assert load_league(old).solve_seconds == 5
    both = tmp_path / "both.toml"
    both.write_text(
        text.replace("time_limit_seconds = 5", "time_limit_seconds = 5\nsolve_seconds = 5"),
        encoding="utf-8",
    )
    result = runner.invoke(app, ["plan", str(both), "--out", str(tmp_path / "s")])
    assert result.exit_code == 2 and "solve_seconds" in result.stderr
    assert not (tmp_path / "s").exists()


# --- audit: --report places and closed pipes ---------------------------------------------------


@pytest.fixture(scope="module")
def planned(tmp_path_factory):
    out = tmp_path_factory.mktemp("planned") / "season"
    assert run("plan", str(sample_path("club_day")), "--out", str(out), "--quiet").exit_code == 0
    return out


def test_audit_report_problems_exit_2(planned, tmp_path):
    schedule = planned / "fixtures.csv"
    not_a_folder = tmp_path / "file.txt"
    not_a_folder.write_text("x")
    for place, words in [
        (tmp_path, "is a folder"),
        (tmp_path / "missing" / "r.html", "does not exist"),
        (not_a_folder / "r.html", "is not a folder"),
        (schedule, "overwrite the audited file"),
    ]:
        result = runner.invoke(app, ["audit", str(schedule), "--report", str(place)])
        assert result.exit_code == 2, (place, result.stderr)
        assert "--report" in result.stderr and words in result.stderr


@pytest.mark.skipif(os.name != "posix", reason="POSIX pipes")
@pytest.mark.parametrize("args", [["audit", "fixtures.csv"], ["audit", "fixtures.csv", "--json"],
                                  ["factor", "10"]])  # fmt: skip
def test_closed_stdout_is_not_an_error(planned, args):
    """``scheduler audit f.csv | head -1``: the reader closes the pipe; a valid schedule still
    exits 0 (EPIPE, POSIX write(2); Python raises BrokenPipeError)."""
    reader, writer = os.pipe()
    os.close(reader)  # closed before the first write: every write fails with EPIPE
    try:
        done = subprocess.run(
            [sys.executable, "-m", "scheduler.cli", *args], cwd=planned, stdout=writer,
            stderr=subprocess.PIPE, env={**os.environ, "PYTHONPATH": str(ROOT)}, timeout=120,
        )  # fmt: skip
    finally:
        os.close(writer)
    assert done.returncode == 0, done.stderr.decode()
    assert b"Traceback" not in done.stderr


@pytest.mark.skipif(os.name != "posix", reason="POSIX pipes")
def test_closed_stdout_keeps_the_invalid_verdict(tmp_path):
    bad = tmp_path / "bad.csv"
    bad.write_text("round,home,away\n1,A,B\n1,A,C\n", encoding="utf-8")
    reader, writer = os.pipe()
    os.close(reader)
    try:
        done = subprocess.run(
            [sys.executable, "-m", "scheduler.cli", "audit", str(bad)], stdout=writer,
            stderr=subprocess.PIPE, env={**os.environ, "PYTHONPATH": str(ROOT)}, timeout=120,
        )  # fmt: skip
    finally:
        os.close(writer)
    assert done.returncode in (1, 2), done.stderr.decode()


def test_command_list_shows_one_plain_summary_per_command():
    # The command list of ``scheduler --help`` is read by organizers: one summary each, taken
    # from the command's docstring, without the contributor notes (numpydoc sections, RST
    # markup) that follow it.
    result = runner.invoke(app, ["--help"], env={"COLUMNS": "200", "NO_COLOR": "1"})
    assert result.exit_code == 0, result.output
    listing = result.stdout.split("Commands")[1]
    for command in ("new", "factor", "plan", "choose", "plan-divisions", "replan", "audit"):
        assert f" {command} " in listing
    for contributor_text in ("Parameters", "----------", "``", ":data:", "Raises"):
        assert contributor_text not in listing
    # Each summary sits on one line at this width (its line breaks in the source are dropped).
    assert "Re-plan a season after postponements, closures and withdrawals, changing as few " \
           "games as possible; history never moves." in " ".join(listing.split())
