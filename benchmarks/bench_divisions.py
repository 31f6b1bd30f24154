"""Planning many divisions on Dask distributed (not run by pytest).

A generated federation (invented names): 200 divisions of 8-16 teams (single round robin, every
team on its own ground), and 20 grounds each shared by a team of two different divisions, so
180 independent units of work. The divisions plan for perfect mixing only (``LIGHT_PRIORITIES``;
``--default-priorities`` keeps the default goals, several times slower per division).
Measured, side by side:

1. wall time with an embedded local cluster of 1 worker process;
2. wall time with an embedded local cluster of 2 worker processes;
3. wall time through a separately started ``dask scheduler`` with ``dask worker --nworkers 2``
   (loopback address);
4. the sum of the units' own planning times, wall and processor time (what the work costs
   without any overhead; processor time does not grow when other programs share the cores).

Ratios: speed-up = (1) / (2) (target >= 1.7 on 2 cores) and (3) against (2); targets: the whole
federation in under 2 minutes on 2 cores. All three runs must give the same seasons (checked).
The times include starting the cluster, sending the federation and gathering the results, not
writing the output folders. The machine may be shared: compare figures of one run only.

Units of two or more divisions are planned by the joint model (one CP-SAT model per unit,
``scheduler.divisions.joint``) unless ``--method sequential`` asks for one division after
another; the script prints how many units each method planned.

Run: ``python benchmarks/bench_divisions.py`` (``--small``: 20 divisions, 2 shared grounds).
"""

from __future__ import annotations

import argparse
import os
import random
import shutil
import socket
import subprocess
import sys
import time
from collections import Counter
from pathlib import Path

from scheduler.config.federation import Federation, parse_federation
from scheduler.divisions.execute import plan_federation
from scheduler.divisions.grouping import units_of

ROOT = Path(__file__).resolve().parents[1]


LIGHT_PRIORITIES = {"order": ["mixing"]}
"""Priorities of the generated divisions: perfect mixing only (no break minimisation, no
carry-over search, no venue/slot balancing), so one division takes well under a second."""


def federation_data(divisions: int, shared: int, seed: int = 1,
                    priorities: dict | None = LIGHT_PRIORITIES) -> dict:
    """The generated federation as the data a TOML file would give."""
    rng = random.Random(seed)
    venues, division_list = [], []
    for d in range(divisions):
        size = rng.randint(8, 16)
        teams = []
        for t in range(size):
            name = f"Club {d:03d}-{t:02d}"
            ground = f"{name} Ground"
            if t == 0 and d < 2 * shared:
                ground = f"Shared Ground {d // 2:02d}"
                if d % 2 == 0:
                    venues.append({"name": ground})
            else:
                venues.append({"name": ground})
            teams.append({"name": name, "home_venue": ground})
        entry: dict = {"name": f"Division {d:03d}", "teams": teams}
        if priorities is not None:
            entry["priorities"] = priorities
        division_list.append(entry)
    return {
        "federation": {"name": "Generated Federation", "season": "2027-28",
                       "timezone": "Europe/London", "seed": 0, "solve_seconds": 1},
        "calendar": {"start": "2027-09-04", "end": "2028-05-27", "weekdays": ["sat"]},
        "venues": venues,
        "divisions": division_list,
    }


def _free_port() -> int:
    with socket.socket() as probe:
        probe.bind(("127.0.0.1", 0))
        return probe.getsockname()[1]


def _separate_cluster(fed: Federation, method: str):
    dask = shutil.which("dask", path=str(Path(sys.executable).parent)) or shutil.which("dask")
    if dask is None:
        raise SystemExit("the `dask` command is missing (it comes with distributed)")
    port = _free_port()
    address = f"tcp://127.0.0.1:{port}"
    env = dict(os.environ, PYTHONPATH=str(ROOT) + os.pathsep + os.environ.get("PYTHONPATH", ""))
    procs = [
        subprocess.Popen([dask, "scheduler", "--host", "127.0.0.1", "--port", str(port),
                          "--no-dashboard"], env=env, stdout=subprocess.DEVNULL,
                         stderr=subprocess.DEVNULL),
        subprocess.Popen([dask, "worker", address, "--nworkers", "2", "--nthreads", "1",
                          "--no-dashboard", "--host", "127.0.0.1"], env=env,
                         stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL),
    ]
    try:
        from distributed import Client

        deadline = time.monotonic() + 60
        while True:
            try:
                with Client(address, timeout="2s") as client:
                    client.wait_for_workers(2, timeout=max(1, deadline - time.monotonic()))
                break
            except (OSError, TimeoutError):
                if time.monotonic() > deadline:
                    raise
                time.sleep(0.5)
        began = time.perf_counter()
        result = plan_federation(fed, cluster=address, method=method)
        return result, time.perf_counter() - began
    finally:
        for proc in procs[::-1]:
            proc.terminate()
        for proc in procs[::-1]:
            try:
                proc.wait(timeout=15)
            except subprocess.TimeoutExpired:
                proc.kill()
                proc.wait(timeout=15)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--small", action="store_true", help="20 divisions, 2 shared grounds")
    parser.add_argument("--default-priorities", action="store_true",
                        help="plan with the default priorities (breaks, carry-over, balance)")
    parser.add_argument("--method", choices=("auto", "joint", "sequential"), default="auto",
                        help="how units of several divisions are planned (default: auto, the "
                             "joint model with the sequential method as fallback)")
    args = parser.parse_args()
    divisions, shared = (20, 2) if args.small else (200, 20)
    began = time.perf_counter()
    priorities = None if args.default_priorities else LIGHT_PRIORITIES
    fed = parse_federation(federation_data(divisions, shared, priorities=priorities),
                           source="generated")
    units = units_of(fed)
    read = time.perf_counter() - began
    teams = sum(len(d.league.teams) for d in fed.divisions)
    print(f"federation: {divisions} divisions, {teams} teams, {shared} shared grounds, "
          f"{len(units)} units (read and checked in {read:.1f} s)")
    walls, results = {}, {}
    for workers in (1, 2):
        began = time.perf_counter()
        results[workers] = plan_federation(fed, workers=workers, method=args.method)
        walls[workers] = time.perf_counter() - began
        print(f"local cluster, {workers} worker(s): {walls[workers]:7.1f} s wall")
    remote, walls["separate"] = _separate_cluster(fed, args.method)
    print(f"separate scheduler, 2 workers:  {walls['separate']:7.1f} s wall")
    methods = Counter(r.method for r in results[1].results)
    print("units by method: " + ", ".join(f"{m} {n}" for m, n in sorted(methods.items())))
    for method in sorted(methods):
        mine = [r for r in results[1].results if r.method == method]
        print(f"  {method}: {sum(r.seconds for r in mine):7.1f} s wall, "
              f"{sum(r.cpu_seconds for r in mine):7.1f} s processor time, slowest unit "
              f"{max(r.seconds for r in mine):.2f} s")
    solve = results[1].solve_seconds
    cpu = results[1].cpu_seconds
    print(f"sum of the units' own planning times (1-worker run): {solve:7.1f} s wall, "
          f"{cpu:7.1f} s processor time")
    print(f"ideal on 2 idle cores (processor time / 2): {cpu / 2:7.1f} s; "
          f"2-worker wall / ideal: {walls[2] / (cpu / 2):.2f}")
    same = ([p.season for p in results[1].plans] == [p.season for p in results[2].plans]
            == [p.season for p in remote.plans])
    print(f"identical seasons in all three runs: {'yes' if same else 'NO'}")
    print(f"every rule across divisions holds: {'yes' if results[2].check.valid else 'NO'}")
    speedup = walls[1] / walls[2]
    print(f"speed-up 2 workers / 1 worker: {speedup:.2f} (target >= 1.7)")
    print(f"separate scheduler / local cluster (2 workers): "
          f"{walls['separate'] / walls[2]:.2f}")
    print(f"whole federation on 2 workers: {walls[2]:.1f} s (target < 120 s): "
          f"{'met' if walls[2] < 120 else 'missed'}")
    print(f"cores on this machine: {os.cpu_count()} (the machine may be shared with other work)")


if __name__ == "__main__":
    main()
