"""Killing and interrupting ``scheduler plan``: the season folder holds one whole plan, always.

The planner is run as a real process. ``SCHEDULER_TEST_PAUSE`` (read only by
``scheduler.interrupt.pause_point``, documented in ``docs/season-folder.md``) makes it stop at a
named point and say so on standard error; the test then sends SIGKILL or SIGINT. After each
kill the folder must hold exactly one plan: every file listed in the manifest with its SHA-256
(recomputed here with hashlib, FIPS 180-4), no other file, the manifest's revision equal to
season.json's, and the plan equal, byte for byte, to the folder before the run (killed before the
swap) or complete (killed after it). Exit code 130 for Ctrl-C is the shell convention 128 + 2
(common practice).
"""

from __future__ import annotations

import hashlib
import json
import os
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
TINY = ROOT / "tests" / "data" / "tiny_league.toml"
COUNTY = ROOT / "sample_leagues" / "county_double.toml"

pytestmark = pytest.mark.skipif(os.name != "posix", reason="POSIX signals")


def start_plan(league: Path, out: Path, *args: str, pause: str | None = None, announce=False):
    env = {**os.environ, "PYTHONPATH": str(ROOT)}
    env.pop("SCHEDULER_TEST_PAUSE", None)
    env.pop("SCHEDULER_TEST_ANNOUNCE", None)
    if pause:
        env["SCHEDULER_TEST_PAUSE"] = pause
    if announce:
        env["SCHEDULER_TEST_ANNOUNCE"] = "1"
    return subprocess.Popen(
        [sys.executable, "-m", "scheduler.cli", "plan", str(league), "--out", str(out), "--quiet",
         *args],
        stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, env=env, cwd=out.parent,
    )  # fmt: skip


def wait_for(process, text: str, timeout: float = 60.0) -> None:
    """Read the process's standard error until a line equals ``text``."""
    end = time.monotonic() + timeout
    while time.monotonic() < end:
        line = process.stderr.readline().decode()
        if not line:
            break
        if line.strip() == text:
            return
    process.kill()
    process.wait()
    pytest.fail(f"the planner never reached {text!r}")


def snapshot(folder: Path) -> dict[str, bytes]:
    return {
        p.relative_to(folder).as_posix(): p.read_bytes() for p in folder.rglob("*") if p.is_file()
    }


def one_whole_plan(folder: Path) -> str:
    """Check that ``folder`` holds exactly one plan; return its revision."""
    files = snapshot(folder)
    manifest = json.loads(files.pop(".season-manifest.json"))
    assert set(files) == set(manifest["files"]), "files of no plan, or files missing"
    for name, data in files.items():
        assert hashlib.sha256(data).hexdigest() == manifest["files"][name], name
    season = json.loads(files["season.json"])
    assert season["revision"] == manifest["revision"]
    return manifest["revision"]


def leftovers(folder: Path) -> list[str]:
    return sorted(p.name for p in folder.parent.iterdir() if p.name != folder.name)


def previous_season(out: Path) -> dict[str, bytes]:
    """A season folder written in-process from a hand-built season (no planner run needed)."""
    from scheduler.export.bundle import write_season_outputs
    from scheduler.fairness import compute_fairness
    from tests.export.samples import make_season

    season = make_season()
    write_season_outputs(season, compute_fairness(season), out)
    return snapshot(out)


WRITE_POINTS = [
    "folder:computed",  # everything computed, nothing written yet
    "folder:wrote fixtures.xlsx",  # the temporary folder half full
    "folder:wrote .season-manifest.json",  # the temporary folder full, not yet flushed
    "folder:before-swap",  # flushed, not yet swapped
]


def test_sigkill_at_every_step_of_the_write_leaves_one_whole_plan(tmp_path):
    work = tmp_path / "work"
    work.mkdir()
    out = work / "season"
    before = previous_season(out)
    revision = one_whole_plan(out)
    for seed, point in enumerate(WRITE_POINTS, start=2):
        process = start_plan(TINY, out, "--seed", str(seed), "--force", pause=point)
        wait_for(process, f"paused at {point}")
        process.send_signal(signal.SIGKILL)
        process.wait()
        assert snapshot(out) == before, f"killed at {point}: the old season changed"
        assert one_whole_plan(out) == revision
        # Each run first removed what the killed run before it left: at most one leftover.
        assert len(leftovers(out)) <= 1, leftovers(out)
    # Killed right after the swap: the new plan is whole, the old season is gone.
    process = start_plan(TINY, out, "--seed", "7", "--force", pause="folder:swapped")
    wait_for(process, "paused at folder:swapped")
    process.send_signal(signal.SIGKILL)
    process.wait()
    assert one_whole_plan(out) != revision
    assert json.loads((out / "season.json").read_text(encoding="utf-8"))["league"] == (
        "Quenby Evening Four"
    )
    assert len(leftovers(out)) <= 1


def test_sigint_while_writing_changes_nothing(tmp_path):
    work = tmp_path / "work"
    work.mkdir()
    out = work / "season"
    before = previous_season(out)
    for point in ("folder:temp-created", "folder:before-swap"):
        process = start_plan(TINY, out, "--force", pause=point)
        wait_for(process, f"paused at {point}")
        process.send_signal(signal.SIGINT)
        assert process.wait(30) == 130, point
        assert "interrupted" in process.stderr.read().decode()
        assert snapshot(out) == before, point
        assert leftovers(out) == [], point


def test_sigint_inside_the_solver_stops_it_at_once(tmp_path):
    """CP-SAT catches SIGINT itself unless told not to; the planner must still exit 130 quickly
    (well before the solve's own end) and leave the folder as it was."""
    work = tmp_path / "work"
    work.mkdir()
    out = work / "season"
    before = previous_season(out)
    process = start_plan(COUNTY, out, "--time-limit", "60", "--force", announce=True)
    wait_for(process, "at solve:started", timeout=120)
    time.sleep(0.5)  # inside the first solve, which takes seconds on this league
    sent = time.monotonic()
    process.send_signal(signal.SIGINT)
    code = process.wait(60)
    elapsed = time.monotonic() - sent
    assert code == 130
    assert elapsed < 3.0, f"the solver went on for {elapsed:.1f} s after Ctrl-C"
    assert snapshot(out) == before
    assert leftovers(out) == []
