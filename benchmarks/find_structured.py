"""Offline searches for perfect one-factorizations in the structured spaces beyond plain
cyclic starters (even starters, starters in non-abelian groups, prescribed ``Z_k``) and the
systematic multiplier sweep of cyclic starters. Spaces with a multiplier or an automorphism
are settled by exhaustive runs (run limits doubling without a cap). Prints one ``#`` line per
space with the work done (runs, nodes, seconds, exhausted = proved empty) and one JSON line per
find:

    nice -n 19 python benchmarks/find_structured.py even 38 --seconds 600
    nice -n 19 python benchmarks/find_structured.py group 13 3 --seconds 600
    nice -n 19 python benchmarks/find_structured.py orbit 3 13 --seconds 600
    nice -n 19 python benchmarks/find_structured.py multipliers 39 --seconds 20
    nice -n 19 python benchmarks/find_structured.py rate
    nice -n 10 python benchmarks/find_structured.py settle 55 21 --workers 2
    nice -n 10 python benchmarks/find_structured.py settle-group 11 5 10 0 --partners 2-20
    python benchmarks/find_structured.py settle 55 21 --engine dask --cluster tcp://192.0.2.10:8786

``settle M U`` (cyclic starters of ``Z_M`` invariant under the multiplier ``U``) and
``settle-group P Q S C`` (starters of ``Z_P x| Z_Q`` invariant under the automorphism ``(S, C)``)
settle a space by complete searches of the subtrees below the first choice (element 1 paired
with each partner ``2 .. order - 1``), one independent task per subtree on a local process pool
or Dask distributed; ``--partners A-B`` runs only those subtrees, so a large space can be
settled over several runs, and a list such as ``--partners 21,5-20,22-54`` runs them in that
order (the largest subtree first, so that it does not run alone at the end). One ``#`` line
per subtree, then the nodes in all (they add up to those of one complete search) and whether
every subtree run was exhausted.

``rate`` prints the node rate of each kernel on K_40-sized spaces and the ratio against the
cyclic-starter kernel (the reference implementation).

Recorded runs (seed 0, 2 shared cores, ``nice -n 19``; "empty" = space exhausted). Every
multiplier or automorphism space below that fixes a non-zero element (all of them but u = -1)
is empty a priori by the fixed-round lemma (``scheduler/factorization/fixed_rounds.py``), found
after these runs; the runs agree with it.

* K_40: ``group 13 3`` found the catalogue entry (4094 runs, 393,191,148 nodes, 119 s).
  ``multipliers 39``: every multiplier space of Z_39 (orders 2, 3, 4, 6, 12) is empty.
  Z_13 x| Z_3 with an automorphism of order 2, 3, 4, 6, 12 or 13: empty.
* K_52: ``multipliers 51``: orders 4, 8, 16 and u = 50 empty; u = 16 (9.0e8 nodes, 180 s)
  and u = 35 (1.0e9 nodes, 180 s) found nothing with capped runs; exhaustive runs later settled
  both (empty: u = 35 after 2.0e9 nodes, u = 16 in one complete search of 2.86e9 nodes).
* K_56: ``multipliers 55``: orders 4, 5, 10, 20 and u = 54 empty; u = 21 (4.9e8 nodes) and
  u = 34 (5.5e8 nodes), 180 s each, found nothing with capped runs; later u = 34 was settled
  empty by one complete search (8.84e9 nodes); u = 21 was settled in part (``settle 55 21``,
  partners 2-5 empty) and then whole by ``settle 55 21 --up-to-units --workers 2``: empty,
  21 subtrees, 5,910,885,512 nodes, 1,233 s wall. ``group 11 5``: 1.58e9 nodes (600 s)
  nothing; automorphisms of order 5, 10, 11 empty; ``group 11 5 10 0`` (order 2): 1.0e9
  nodes (240 s) nothing, later settled empty by ``settle-group 11 5 10 0`` (2.29e10 nodes).
  ``group 11 5 --seed S`` (plain space, 240 s each, nothing):
  seed 1 5.27e8 nodes, seed 2 5.52e8, seed 3 5.41e8, seed 4 5.41e8, seed 5 5.68e8,
  seed 6 5.55e8 (3.28e9 nodes, 1440 s in all).
* Even starters: Z_30 (K_32) found after 4.0e7 nodes; Z_34 (K_36) nothing in 2.2e8 nodes
  (60 s).
* Prescribed Z_k (``orbit R K --seconds 90``, seed 0, 3 December): K_16 found by (3, 5) after
  1.6e6 nodes and by (5, 3) after 1.2e8; nothing from (3, 7), (7, 3) (K_22), (3, 9), (9, 3)
  (K_28), (3, 11), (11, 3) (K_34), (3, 13), (13, 3) (K_40) in 6e7 to 1.5e8 nodes each, where
  cyclic starters find K_22 and K_28 in 3e4 and 4e5 nodes. ``orbit 3 17 --seconds 3000 --seed
  1`` (K_52): 1,750,817,787 nodes, nothing; ``orbit 5 11 --seconds 3000 --seed 1`` (K_56):
  1,423,734,521 nodes, nothing. Sizes of these spaces: ``benchmarks/space_sizes.py``.
"""

from __future__ import annotations

import argparse
import json
import sys
import time

from scheduler.divisions.execute import task_engine
from scheduler.factorization.even_starters import search_perfect_even_starter
from scheduler.factorization.fixed_rounds import keeps_no_perfect_starter
from scheduler.factorization.groups import AbelianGroup, cyclic
from scheduler.factorization.nonabelian_starters import (
    search_perfect_group_starter,
    semidirect,
    settle_group_subtree_task,
)
from scheduler.factorization.orbit_factorizations import search_perfect_orbit_factorization
from scheduler.factorization.search import (
    root_subtrees,
    search_perfect_starter,
    settle_subtree_task,
)
from scheduler.factorization.unit_classes import unit_class_subtrees


def _line(label: str, res) -> None:
    print(f"# {label}: found={res.found} exhausted={res.exhausted} runs={res.runs} "
          f"nodes={res.nodes} {res.seconds:.1f}s", file=sys.stderr, flush=True)


def cyclic_subgroup_generators(group: AbelianGroup) -> list[tuple[int, int]]:
    """``(order, generator)`` for each cyclic subgroup of the unit group, largest first."""
    seen: set[frozenset[int]] = set()
    gens = []
    for u in group.units():
        sub, x = set(), u
        while True:
            sub.add(x)
            x = int(group.mul[x, u])
            if x == u:
                break
        if frozenset(sub) not in seen:
            seen.add(frozenset(sub))
            gens.append((len(sub), u))
    gens.sort(key=lambda t: (-t[0], t[1]))
    return gens


def partner_list(text: str) -> list[int]:
    """Partners from ``A-B,C,D-E`` in the order given (a large subtree can go first)."""
    partners: list[int] = []
    for part in text.split(","):
        low, _, high = part.partition("-")
        for y in range(int(low), int(high or low) + 1):
            if y not in partners:
                partners.append(y)
    return partners


def settle(a: argparse.Namespace) -> None:
    """Settle one symmetric space by its root subtrees as independent tasks."""
    if a.space == "settle":
        m, u = a.args
        order, label = m, f"starters in Z_{m}, multiplier {u}"
        task, fixed = settle_subtree_task, (f"Z_{m}", u)
        if a.up_to_units:
            label += ", up to units"
    else:
        p, q, s, c = a.args
        group = semidirect(p, q)
        order, label = group.order, f"starters in {group.name}, automorphism ({s}, {c})"
        task, fixed = settle_group_subtree_task, (p, q, group.r, (s, c))
    symmetry = (cyclic(order).multiplier(a.args[1]) if a.space == "settle"
                else semidirect(a.args[0], a.args[1]).automorphism(a.args[2], a.args[3]))
    if keeps_no_perfect_starter(symmetry):
        print(f"# {label}: a power of the symmetry fixes a non-zero element, so by the "
              "fixed-round lemma (scheduler/factorization/fixed_rounds.py) the space holds no "
              "perfect starter; the search below checks the kernel against it",
              file=sys.stderr, flush=True)
    if a.up_to_units and a.space != "settle":
        raise SystemExit("--up-to-units: cyclic starters only (settle M U)")
    subtrees = unit_class_subtrees(order) if a.up_to_units else root_subtrees(order)
    if a.partners:
        by_partner = {t[0]: t for t in subtrees}
        subtrees = [by_partner[y] for y in partner_list(a.partners) if y in by_partner]
    start = time.perf_counter()
    nodes, exhausted, found = 0, 0, None
    with task_engine(a.engine, a.workers, a.cluster) as (submit, wait_first):
        extra = (True,) if a.up_to_units else ()
        pending = {submit(task, *fixed, t, *extra) for t in subtrees}
        while pending:
            for future in wait_first(pending):
                pending.discard(future)
                r = future.result()
                nodes += r["nodes"]
                exhausted += r["exhausted"]
                print(f"# {label}, partner {r['subtree'][0]}: exhausted={r['exhausted']} "
                      f"nodes={r['nodes']} {r['seconds']:.1f}s", file=sys.stderr, flush=True)
                if r["starter"] is not None and found is None:
                    found = r
                    print(json.dumps(r), flush=True)
                    for other in pending:
                        other.cancel()
    partners = a.partners or (f"{subtrees[0][0]}-{subtrees[-1][0]}" if subtrees else "none")
    print(f"# {label}, partners {partners}: {len(subtrees)} subtrees, {exhausted} exhausted, "
          f"found={found is not None}, nodes={nodes} "
          f"{time.perf_counter() - start:.1f}s wall, {a.workers} workers ({a.engine})",
          file=sys.stderr, flush=True)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("space", choices=["even", "group", "orbit", "multipliers", "rate",
                                          "settle", "settle-group"])
    parser.add_argument("args", type=int, nargs="*")
    parser.add_argument("--seconds", type=float, default=60.0)
    parser.add_argument("--seed", type=int, default=0)
    parser.add_argument("--max-run-nodes", type=int, default=5_000_000)
    parser.add_argument("--partners", default=None,
                        help="settle: only the subtrees of these partners of element 1, "
                             "A-B or a list A-B,C,D-E run in the order given")
    parser.add_argument("--up-to-units", action="store_true",
                        help="settle: search one starter per class under multiplication by "
                             "units (the subtrees of unit_classes.unit_class_subtrees)")
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--engine", choices=["pool", "dask"], default="pool")
    parser.add_argument("--cluster", default=None,
                        help="address of a running Dask scheduler (with --engine dask)")
    a = parser.parse_args()
    if a.space in ("settle", "settle-group"):
        settle(a)
        return
    kw = {"seed": a.seed, "budget": a.seconds, "max_run_nodes": a.max_run_nodes}
    if a.space == "even":
        (M,) = a.args
        res = search_perfect_even_starter(M, **kw)
        _line(f"even starters Z_{M}", res)
        if res.found:
            print(json.dumps({"kind": "even_starter", "n": M + 2, "group": res.group,
                              "seed": a.seed, "runs": res.runs, "nodes": res.nodes,
                              "starter": [list(p) for p in res.starter]}))
    elif a.space == "group":
        p, q, *rest = a.args
        group = semidirect(p, q)
        auto = (rest[0], rest[1]) if rest else (1, 0)
        # a space with a symmetry is settled by exhaustive runs (no cap on the run length)
        res = search_perfect_group_starter(group, automorphism=auto, exhaustive=auto != (1, 0),
                                           **kw)
        _line(f"starters in {group.name}, automorphism {auto}", res)
        if res.found:
            print(json.dumps({"kind": "group_starter", "n": p * q + 1, "p": p, "q": q,
                              "r": group.r, "automorphism": list(auto), "seed": a.seed,
                              "runs": res.runs, "nodes": res.nodes,
                              "starter": [list(x) for x in res.starter]}))
    elif a.space == "orbit":
        r, k = a.args
        res = search_perfect_orbit_factorization(r, k, **kw)
        _line(f"Z_{k}-invariant, {r} cycles + fixed point", res)
        if res.found:
            print(json.dumps({"kind": "orbit", "n": r * k + 1, "r": r, "k": k,
                              "seed": a.seed, "base": [[list(x) for x in b] for b in res.base]}))
    elif a.space == "multipliers":
        (m,) = a.args
        group = cyclic(m)
        for order, u in cyclic_subgroup_generators(group):
            if order == 1:
                continue
            res = search_perfect_starter(group, multiplier=u, exhaustive=True, **kw)
            _line(f"starters in Z_{m}, multiplier {u} (order {order})", res)
            if res.found:
                print(json.dumps({"n": m + 1, "group": group.name, "multiplier": u,
                                  "seed": a.seed, "runs": res.runs, "nodes": res.nodes,
                                  "starter": [list(x) for x in res.starter]}))
    else:
        work = 3_000_000
        search_perfect_starter(cyclic(15), budget=1)
        search_perfect_even_starter(14, budget=1)
        search_perfect_group_starter(semidirect(7, 3), budget=1)
        search_perfect_orbit_factorization(3, 5, budget=1)
        rates = {}
        for label, run in [
            ("cyclic starters Z_39 (reference)",
             lambda: search_perfect_starter(cyclic(39), max_nodes=work, budget=60)),
            ("even starters Z_38", lambda: search_perfect_even_starter(38, max_nodes=work,
                                                                        budget=60)),
            ("starters in Z_13 x| Z_3", lambda: search_perfect_group_starter(
                semidirect(13, 3), max_nodes=work, budget=60)),
            ("Z_13-invariant, 3 cycles", lambda: search_perfect_orbit_factorization(
                3, 13, max_nodes=work, budget=60)),
        ]:
            t = time.perf_counter()
            res = run()
            rates[label] = res.nodes / (time.perf_counter() - t)
        ref = next(iter(rates.values()))
        for label, rate in rates.items():
            print(f"{label:36s} {rate:12,.0f} nodes/s  ratio {rate / ref:5.2f}")


if __name__ == "__main__":
    main()
