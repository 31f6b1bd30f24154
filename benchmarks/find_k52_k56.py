"""Search for perfect one-factorizations of K_52 and K_56 as independent restarts.

Spaces (``scheduler.factorization.twin_point_starters``): even starters over ``Z_2 x H`` with
``|H| = 25`` (K_52: ``Z_25``, ``Z_5 x Z_5``, ``GF(25)``) or ``|H| = 27`` (K_56: ``Z_27``,
``Z_3 x Z_9``, ``Z_3 x Z_3 x Z_3``, ``GF(27)``), for every admissible missing element and
multiplier; with ``--merged`` only the merged class (two starters of ``H`` merged); with
``--linear`` the spaces of every automorphism of ``H`` as a matrix (one per conjugacy class of
cyclic subgroups; ``GL(d, p)`` for ``Z_5 x Z_5`` and ``Z_3 x Z_3 x Z_3``) instead of the ring's
multipliers; with ``--flip`` those of the flips ``x -> a x + m`` (``a`` an involution of ``H``
negating ``m``, the two points at infinity exchanged). Symmetric spaces run first, to
exhaustion (plain depth-first runs with doubling node limits; capped random restarts could
never settle a space larger than their cap); the multiplier and matrix spaces keep the missing
element and the points at infinity, so they are empty by the fixed-round lemma
(``scheduler/factorization/fixed_rounds.py``) and their runs only check the kernel against it:
``--skip-small`` loses no chance of a find; the plain spaces then get seeded restarts until
the stop time (a stop time earlier than now is tomorrow's). Each task is
``twin_point_starters.search_task(order, space, seed, budget)``, a plain top-level function with
plain arguments and a JSON-ready result, run on a local process pool or Dask distributed
(``scheduler.divisions.execute.task_engine``).

    nice -n 15 python benchmarks/find_k52_k56.py --orders 52 56 --task-seconds 120 \\
        --stop 17:55 --workers 1
    nice -n 15 python benchmarks/find_k52_k56.py --rate
    python benchmarks/find_k52_k56.py --engine dask --workers 2 --stop 18:30
    python benchmarks/find_k52_k56.py --merged --skip-small --orders 56 --stop 00:25
    nice -n 15 python benchmarks/find_k52_k56.py --merged --skip-small --orders 52 \\
        --first-seed 50000 --task-seconds 300 --workers 2 --stop 16:45
    nice -n 15 python benchmarks/find_k52_k56.py --linear --merged
    nice -n 15 python benchmarks/find_k52_k56.py --flip
    python benchmarks/find_k52_k56.py --engine dask --cluster tcp://192.0.2.10:8786

Prints one ``#`` line per task (space, seed, found, exhausted, nodes, seconds, nodes/s), then
per order the nodes searched, the node rate and the time to the first find (or the nodes
searched without one); finds as JSON lines. ``--rate`` prints the node rate of the new kernel on
a K_52 space against the cyclic-starter kernel on ``Z_51`` (the reference) in the same run.
Recorded runs: docs/factorization-search.md.
"""

from __future__ import annotations

import argparse
import datetime as dt
import json
import sys
import time

from scheduler.divisions.execute import task_engine
from scheduler.factorization import twin_point_starters as tw

BASES = {52: ["GF(25)", "Z_25", "Z_5 x Z_5"],
         56: ["GF(27)", "Z_27", "Z_3 x Z_9", "Z_3 x Z_3 x Z_3"]}
# GF(q) and Z_p^d are the same group with the same codes, so their symmetric spaces coincide
SYMMETRY_BASES = {52: ["Z_25", "Z_5 x Z_5"], 56: ["Z_27", "Z_3 x Z_9", "Z_3 x Z_3 x Z_3"]}


def spaces(order: int, merged: bool = False, linear: bool = False, flip: bool = False
           ) -> tuple[list[str], list[str]]:
    """``(symmetric spaces, plain spaces)`` for ``K_order``; ``merged``: the merged class;
    ``linear``: the symmetric spaces are those of every automorphism of ``H`` as a matrix (one
    per conjugacy class of cyclic subgroups) instead of the ring's multipliers; ``flip``: those
    of the flips ``x -> α x + m`` (``α`` an involution negating ``m``)."""
    if linear or flip:
        linear_spaces = [name for base in SYMMETRY_BASES[order] if linear
                         for name in tw.linear_symmetry_spaces(base, merged=merged)]
        flip_spaces = [name for base in SYMMETRY_BASES[order] if flip
                       for name in tw.flip_symmetry_spaces(base, merged=merged)]
        return linear_spaces + flip_spaces, []
    small, plain = [], []
    for base in BASES[order]:
        for missing in tw.missing_representatives(base):
            for size, u in tw.multiplier_choices(base, missing):
                name = tw.space_name(base, swapped=False, missing=missing,
                                     multiplier=1 if size == 1 else u, merged=merged)
                (plain if size == 1 else small).append(name)
    return small, plain


def _stop_time(text: str | None) -> float | None:
    if not text:
        return None
    now = dt.datetime.now(dt.UTC)
    hour, minute = (int(v) for v in text.split(":"))
    stop = now.replace(hour=hour, minute=minute, second=0, microsecond=0)
    if stop <= now:  # a stop after midnight
        stop += dt.timedelta(days=1)
    return time.time() + (stop - now).total_seconds()


def _rate_text(nodes: int, seconds: float) -> str:
    """``"N nodes/s"``, or ``"rate not measured"`` for a task too short to time (a tiny space
    exhausted in milliseconds would otherwise print an absurd rate)."""
    if seconds < 0.05:
        return "rate not measured"
    return f"{nodes / seconds:,.0f} nodes/s"


def rate() -> None:
    from scheduler.factorization.groups import cyclic
    from scheduler.factorization.search import search_perfect_starter

    work = 3_000_000
    search_perfect_starter(cyclic(15), budget=1)
    tw.search_perfect_twin_starter("Z_5", 3, budget=1)
    figures = {}
    for label, call in [
        ("cyclic starters Z_51 (reference)",
         lambda: search_perfect_starter(cyclic(51), max_nodes=work, budget=60)),
        ("even starters Z_2 x GF(25), m=3",
         lambda: tw.search_perfect_twin_starter("GF(25)", 3, max_nodes=work, budget=60)),
        ("even starters Z_2 x Z_27, m=2",
         lambda: tw.search_perfect_twin_starter("Z_27", 2, max_nodes=work, budget=60)),
    ]:
        start = time.perf_counter()
        res = call()
        figures[label] = res.nodes / (time.perf_counter() - start)
    ref = next(iter(figures.values()))
    for label, value in figures.items():
        print(f"{label:36s} {value:12,.0f} nodes/s  ratio {value / ref:5.2f}")


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__,
                                     formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("--orders", type=int, nargs="+", default=[52, 56], choices=[52, 56])
    parser.add_argument("--task-seconds", type=float, default=120.0)
    parser.add_argument("--small-seconds", type=float, default=600.0,
                        help="budget of one symmetric-space task (searched to exhaustion)")
    parser.add_argument("--seeds", type=int, default=1000, help="restarts per plain space")
    parser.add_argument("--first-seed", type=int, default=0,
                        help="seed of the first restart (the same seed repeats the same run, so "
                        "a new session starts where the recorded ones stopped)")
    parser.add_argument("--stop", help="UTC time HH:MM after which no task starts")
    parser.add_argument("--workers", type=int, default=1)
    parser.add_argument("--engine", choices=["pool", "dask"], default="pool",
                        help="pool: a local process pool; dask: Dask distributed, an embedded "
                        "local cluster of --workers processes, or --cluster ADDRESS")
    parser.add_argument("--cluster",
                        help="address of a running Dask scheduler (with --engine dask)")
    parser.add_argument("--skip-small", action="store_true")
    parser.add_argument("--merged", action="store_true",
                        help="search the merged class (two starters of H merged, the class of "
                        "the published finds)")
    parser.add_argument("--linear", action="store_true",
                        help="the symmetric spaces of every automorphism of H as a matrix (one "
                        "per conjugacy class of cyclic subgroups), searched to exhaustion; no "
                        "plain restarts")
    parser.add_argument("--flip", action="store_true",
                        help="the symmetric spaces of every flip x -> a x + m (a an involution "
                        "of H negating m, the points at infinity exchanged), searched to "
                        "exhaustion; no plain restarts")
    parser.add_argument("--space", action="append", default=[],
                        help="search only this space (repeatable; seeds round-robin)")
    parser.add_argument("--rate", action="store_true")
    args = parser.parse_args()
    if args.rate:
        rate()
        return
    stop = _stop_time(args.stop)
    seeds = range(args.first_seed, args.first_seed + args.seeds)
    tasks: list[tuple[int, str, int, float]] = []
    plain_tasks: list[tuple[int, str, int, float]] = []
    for name in args.space:
        base = tw.parse_space(name)[0]
        order = tw.twin_group(base).order + 2
        plain_tasks += [(order, name, seed, args.task_seconds) for seed in seeds]
    for order in [] if args.space else args.orders:
        small, plain = spaces(order, args.merged, args.linear, args.flip)
        if not args.skip_small:
            tasks += [(order, name, 0, args.small_seconds) for name in small]
        plain_tasks += [(order, name, seed, args.task_seconds)
                        for seed in seeds for name in plain]
    # interleave the orders' plain restarts so both get time
    tasks += sorted(plain_tasks, key=lambda t: (t[2], t[0]))
    totals = {order: {"nodes": 0, "seconds": 0.0, "tasks": 0, "first": None}
              for order in sorted({t[0] for t in tasks})}
    start = time.perf_counter()
    # each restart is an independent task of the package's picklable search_task, so workers
    # on other machines need only the installed package
    with task_engine(args.engine, args.workers, args.cluster) as (submit_task, wait_first):
        pending: set = set()
        queue = iter(tasks)
        done_orders: set[int] = set()

        def submit() -> bool:
            for order, name, seed, budget in queue:
                if order in done_orders:
                    continue
                if stop is not None:
                    left = stop - time.time()
                    if left < 5:
                        return False
                    budget = min(budget, left)
                pending.add(submit_task(tw.search_task, order, name, seed, budget))
                return True
            return False

        for _ in range(args.workers):
            submit()
        while pending:
            finished = wait_first(pending)
            for fut in finished:
                pending.discard(fut)
                res = fut.result()
                tot = totals[res["order"]]
                tot["nodes"] += res["nodes"]
                tot["seconds"] += res["seconds"]
                tot["tasks"] += 1
                print(f"# K_{res['order']} {res['space']} seed {res['seed']}: "
                      f"found={res['found']} exhausted={res['exhausted']} "
                      f"nodes={res['nodes']} {res['seconds']:.1f}s "
                      f"{_rate_text(res['nodes'], res['seconds'])}",
                      file=sys.stderr, flush=True)
                if res["found"]:
                    if tot["first"] is None:
                        tot["first"] = time.perf_counter() - start
                    done_orders.add(res["order"])
                    print(json.dumps(res), flush=True)
                submit()
    for order, tot in totals.items():
        first = (f"first find after {tot['first']:.1f}s" if tot["first"] is not None
                 else f"no find in {tot['nodes']:,} nodes")
        print(f"K_{order}: {tot['tasks']} tasks, {tot['nodes']:,} nodes, "
              f"{tot['seconds']:.0f}s of search, {_rate_text(tot['nodes'], tot['seconds'])}, "
              f"{first}", flush=True)


if __name__ == "__main__":
    main()
