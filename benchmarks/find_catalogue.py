"""One-off offline search that produced the entries of scheduler/factorization/data/catalogue.json.

For each group order ``m`` given on the command line it tries the groups of
``groups_of_order(m)`` and, for each, one multiplier per cyclic subgroup of units (largest
subgroups first, then the trivial multiplier; a multiplier with a power that fixes a non-zero
element is skipped, as no perfect starter is invariant under it:
``scheduler/factorization/fixed_rounds.py``), with the project's own randomised search
(``search_perfect_starter``). The first perfect starter found per order is printed as one JSON
line; paste (or append with ``--append``) into the catalogue.

    python benchmarks/find_catalogue.py 35 39 --per-try 20 --per-order 600

Nothing here is taken from a paper: every entry is found by this search from the given seed.
"""

from __future__ import annotations

import argparse
import json
import sys
import time

from scheduler.factorization.fixed_rounds import keeps_no_perfect_starter
from scheduler.factorization.groups import AbelianGroup, groups_of_order
from scheduler.factorization.search import search_perfect_starter


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
        key = frozenset(sub)
        if key not in seen:
            seen.add(key)
            gens.append((len(sub), u))
    gens.sort(key=lambda t: (-t[0], t[1]))
    return gens


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("orders", type=int, nargs="+", help="group orders m (odd)")
    parser.add_argument("--per-try", type=float, default=10.0, help="seconds per multiplier")
    parser.add_argument("--plain", type=float, default=120.0, help="seconds for u = 1")
    parser.add_argument("--per-order", type=float, default=600.0, help="seconds per order")
    parser.add_argument("--seed", type=int, default=0)
    args = parser.parse_args()
    for m in args.orders:
        start = time.perf_counter()
        found = None
        for group in groups_of_order(m):
            for k, u in cyclic_subgroup_generators(group):
                left = args.per_order - (time.perf_counter() - start)
                if left <= 0 or found:
                    break
                if k > 1 and keeps_no_perfect_starter(group.multiplier(u)):
                    print(f"# {group.name} u={u} (order {k}): skipped, a power of it fixes a "
                          "non-zero element (fixed-round lemma)", file=sys.stderr, flush=True)
                    continue
                budget = min(left, args.plain if k == 1 else args.per_try)
                res = search_perfect_starter(group, seed=args.seed, budget=budget, multiplier=u)
                print(f"# {group.name} u={u} (order {k}): found={res.found} "
                      f"exhausted={res.exhausted} runs={res.runs} nodes={res.nodes} "
                      f"{res.seconds:.1f}s", file=sys.stderr, flush=True)
                if res.found:
                    found = {
                        "n": m + 1,
                        "group": group.name,
                        "multiplier": u,
                        "multiplier_order": k,
                        "seed": args.seed,
                        "runs": res.runs,
                        "nodes": res.nodes,
                        "starter": [list(p) for p in res.starter],
                    }
            if found:
                break
        if found:
            print(json.dumps(found), flush=True)
        else:
            print(f"# order {m}: nothing found", file=sys.stderr, flush=True)


if __name__ == "__main__":
    main()
