"""Progress for non-terminals (scheduler.progress and the CLI's --progress option).

JSON Lines output is read back with the standard library's json parser (RFC 8259); plain lines
are checked for phase and rate. Clocks are injected, so nothing here depends on timing.
"""

from __future__ import annotations

import io
import json
import subprocess
import sys
from pathlib import Path

from scheduler.progress import JsonProgress, PlainProgress, phase_of

ROOT = Path(__file__).resolve().parent.parent


class FakeClock:
    def __init__(self) -> None:
        self.now = 0.0

    def __call__(self) -> float:
        return self.now


def test_plain_lines_at_each_phase_and_at_most_every_interval():
    clock = FakeClock()
    out = io.StringIO()
    show = PlainProgress(out, interval=5, clock=clock, heartbeat=False)
    for step in range(40):  # 20 s of calls every 0.5 s in one phase
        clock.now = step * 0.5
        show(f"timetable: best {100 - step} breaks", step / 40)
    clock.now = 20.0
    show("places", 0.75)
    lines = out.getvalue().splitlines()
    assert [line.split("] ", 1)[1].split(":")[0].split(" (")[0] for line in lines] == [
        "timetable", "timetable", "timetable", "timetable", "places",
    ]  # fmt: skip
    assert "best 90 breaks" in lines[1]  # the best so far as the phase reported it


def test_heartbeat_keeps_a_silent_phase_visible():
    out = io.StringIO()
    with PlainProgress(out, interval=0.05) as show:
        show("timetable: solving", 0.2)
        import time

        time.sleep(0.4)  # no callback: a solver at work
    lines = out.getvalue().splitlines()
    assert any("(still working)" in line for line in lines)
    assert lines[-1].endswith("done")


def test_json_lines_parse_and_carry_phase_and_fraction():
    clock = FakeClock()
    out = io.StringIO()
    with JsonProgress(out, clock=clock, heartbeat=False) as show:
        show("factorize: searching", 0.1)
        clock.now = 1.5
        show("timetable", 0.2)
    events = [json.loads(line) for line in out.getvalue().splitlines()]
    assert [e["event"] for e in events] == ["progress", "progress", "done"]
    assert [e["phase"] for e in events[:2]] == ["factorize", "timetable"]
    assert events[1] == {
        "event": "progress", "elapsed": 1.5, "phase": "timetable", "message": "timetable",
        "fraction": 0.2,
    }  # fmt: skip


def test_phase_of():
    assert phase_of("factorize: x: y") == "factorize"
    assert phase_of("") == "working"


def test_cli_plan_progress_json_on_a_pipe(tmp_path):
    # A real run with stderr a pipe (not a terminal): JSON Lines on stderr, results on stdout.
    proc = subprocess.run(
        [sys.executable, "-m", "scheduler.cli", "plan", str(ROOT / "sample_leagues" /
         "club_day.toml"), "--out", str(tmp_path / "out"), "--quiet", "--progress", "json"],
        capture_output=True, text=True, cwd=ROOT, check=False, timeout=300,
    )  # fmt: skip
    assert proc.returncode == 0, proc.stderr
    events = [json.loads(line) for line in proc.stderr.splitlines() if line.strip()]
    phases = [e["phase"] for e in events]
    assert phases[0] == "factorize" and "timetable" in phases and events[-1]["event"] == "done"
    assert proc.stdout.strip() == str(tmp_path / "out")


def test_cli_plan_plain_progress_by_default_on_a_pipe(tmp_path):
    proc = subprocess.run(
        [sys.executable, "-m", "scheduler.cli", "plan", str(ROOT / "sample_leagues" /
         "club_day.toml"), "--out", str(tmp_path / "out")],
        capture_output=True, text=True, cwd=ROOT, check=False, timeout=300,
    )  # fmt: skip
    assert proc.returncode == 0, proc.stderr
    lines = proc.stderr.splitlines()
    assert any("] factorize" in line for line in lines)
    assert any("] timetable" in line for line in lines)
