"""Planning on Dask distributed: an embedded local cluster of 2 worker processes, the same work
with 1 worker (byte-identical outputs), a Dask scheduler and worker started as separate
processes on the loopback address, and an address that does not answer.

Outputs are read back with libraries this project did not write: openpyxl (the workbook),
icalendar (the club calendars, RFC 5545) and the standard library's HTML parser (the index).
"""

from __future__ import annotations

import json
import os
import shutil
import socket
import subprocess
import sys
import time
import tomllib
from html.parser import HTMLParser
from pathlib import Path

import pytest
from icalendar import Calendar
from openpyxl import load_workbook
from typer.testing import CliRunner

from scheduler.cli import app
from scheduler.config.federation import parse_federation
from scheduler.divisions.execute import plan_federation
from scheduler.divisions.grouping import units_of
from scheduler.divisions.plan import plan_unit

ROOT = Path(__file__).resolve().parents[2]
runner = CliRunner()


def _files(folder: Path) -> dict[str, bytes]:
    return {str(p.relative_to(folder)): p.read_bytes()
            for p in sorted(folder.rglob("*")) if p.is_file()}


class _Links(HTMLParser):
    def __init__(self) -> None:
        super().__init__()
        self.links: list[str] = []

    def handle_starttag(self, tag, attrs):
        if tag == "a":
            self.links.extend(v for k, v in attrs if k == "href" and v)


def test_two_workers_and_one_worker_give_identical_outputs(small_federation_file, tmp_path):
    outs = {}
    for workers in (2, 1):
        out = tmp_path / f"out{workers}"
        # `plan` recognises a file of several divisions and does the same as `plan-divisions`
        command = "plan-divisions" if workers == 2 else "plan"
        result = runner.invoke(app, [command, str(small_federation_file), "--out",
                                     str(out), "--workers", str(workers), "--quiet"])
        assert result.exit_code == 0, result.output
        outs[workers] = _files(out)
    assert outs[1].keys() == outs[2].keys()
    assert outs[1] == outs[2]
    out = tmp_path / "out2"
    # one folder per division with the existing outputs, linked from the index page
    parser = _Links()
    parser.feed((out / "index.html").read_text(encoding="utf-8"))
    for link in parser.links:
        assert (out / link).is_file(), link
    workbook = load_workbook(out / "divisions.xlsx")
    assert workbook.sheetnames == ["North", "Reserves", "Hall A", "Hall B", "Lone"]
    north = workbook["North"]
    assert north.max_row - 1 == 15  # 6 teams, one leg: C(6, 2) games
    # the club calendar holds every game of all four Oxlow teams, once
    (club_file,) = [p for p in (out / "clubs").iterdir() if p.name.startswith("oxlow")]
    cal = Calendar.from_ical(club_file.read_bytes())
    summaries = [str(e.get("summary")) for e in cal.walk("VEVENT")]
    games = [s for s in summaries if " v " in s]
    uids = [str(e.get("uid")) for e in cal.walk("VEVENT")]
    assert len(uids) == len(set(uids))
    # North: 5 games, Reserves (4 teams, 2 legs): 6, Minis and Kids (4 teams): 3 each
    assert len(games) == 5 + 6 + 3 + 3


def test_address_that_does_not_answer(small_federation_file, tmp_path):
    with socket.socket() as probe:
        probe.bind(("127.0.0.1", 0))
        port = probe.getsockname()[1]
    out = tmp_path / "out"
    began = time.monotonic()
    result = runner.invoke(app, ["plan-divisions", str(small_federation_file), "--out", str(out),
                                 "--cluster", f"tcp://127.0.0.1:{port}", "--quiet"])
    assert time.monotonic() - began < 10
    assert result.exit_code == 2, result.output
    assert "no Dask scheduler answers" in result.output
    assert not out.exists()


def _free_port() -> int:
    with socket.socket() as probe:
        probe.bind(("127.0.0.1", 0))
        return probe.getsockname()[1]


@pytest.fixture
def dask_processes():
    """A ``dask scheduler`` and a ``dask worker`` as separate processes on 127.0.0.1."""
    dask = shutil.which("dask", path=str(Path(sys.executable).parent)) or shutil.which("dask")
    if dask is None:
        pytest.fail("the `dask` command is not installed (it comes with distributed)")
    port = _free_port()
    address = f"tcp://127.0.0.1:{port}"
    env = dict(os.environ, PYTHONPATH=str(ROOT) + os.pathsep + os.environ.get("PYTHONPATH", ""))
    procs = []
    try:
        procs.append(subprocess.Popen(
            [dask, "scheduler", "--host", "127.0.0.1", "--port", str(port), "--no-dashboard"],
            env=env, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL))
        procs.append(subprocess.Popen(
            [dask, "worker", address, "--nworkers", "1", "--nthreads", "1", "--no-dashboard",
             "--host", "127.0.0.1"],
            env=env, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL))
        from distributed import Client

        deadline = time.monotonic() + 30
        while True:
            try:
                with Client(address, timeout="2s") as client:
                    client.wait_for_workers(1, timeout=max(1, deadline - time.monotonic()))
                break
            except (OSError, TimeoutError):
                if time.monotonic() > deadline:
                    raise
                time.sleep(0.5)
        yield address
    finally:
        for proc in reversed(procs):
            proc.terminate()
        for proc in reversed(procs):
            try:
                proc.wait(timeout=4)
            except subprocess.TimeoutExpired:
                proc.kill()
                proc.wait(timeout=10)


def test_plan_through_separate_scheduler_and_worker(dask_processes, small_text):
    fed = parse_federation(tomllib.loads(small_text))
    remote = plan_federation(fed, cluster=dask_processes)
    assert remote.check.valid
    here = {p.name: p.season for u in units_of(fed) for p in plan_unit(fed, u).plans}
    assert [p.season for p in remote.plans] == [here[name] for name in fed.division_names]


def test_factorization_restarts_run_as_tasks_on_a_local_cluster():
    """Independent restarts of a perfect-factorization search are units of work for Dask too:
    each task's result equals the same task run here, whichever worker ran it, and every find
    is certified by the independent verifier."""
    from scheduler.divisions.execute import dask_client
    from scheduler.factorization import twin_point_starters as tw
    from scheduler.factorization.verify import verify_rounds

    space = tw.space_name("Z_13", swapped=False, missing=3)
    tasks = [(28, space, seed, 30.0) for seed in range(3)]
    with dask_client(2) as client:
        futures = [client.submit(tw.search_task, *task, pure=False) for task in tasks]
        remote = client.gather(futures)
    for task, got in zip(tasks, remote, strict=True):
        here = tw.search_task(*task)
        assert got["found"] == here["found"] and got.get("starter") == here.get("starter")
        assert got["nodes"] == here["nodes"]
        if got["found"]:
            assert verify_rounds(28, tw.twin_rounds("Z_13", got["starter"])).perfect


def test_method_option(small_federation_file, tmp_path):
    """``--method sequential`` plans every unit one division after another (as federation.json
    records it); an unknown method is refused with exit 2 and nothing written."""
    out = tmp_path / "out"
    result = runner.invoke(app, ["plan-divisions", str(small_federation_file), "--out", str(out),
                                 "--quiet", "--workers", "1", "--method", "sequential"])
    assert result.exit_code == 0, result.output
    units = json.loads((out / "federation.json").read_text(encoding="utf-8"))["units"]
    methods = {u["method"] for u in units if len(u["divisions"]) > 1}
    assert methods == {"one after another"}
    bad = tmp_path / "bad"
    result = runner.invoke(app, ["plan-divisions", str(small_federation_file), "--out", str(bad),
                                 "--quiet", "--method", "together"])
    assert result.exit_code == 2, result.output
    assert "--method must be one of auto, joint, sequential" in result.output
    assert not bad.exists()
