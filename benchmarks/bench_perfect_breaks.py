"""Break-aware choice among perfect one-factorizations (not run by pytest).

For 16 and 28 teams, every perfect one-factorization of the family
(:func:`scheduler.factorization.perfect_family.perfect_family`) is ranked by the fewest breaks of
a single round robin on it (:func:`scheduler.balance.perfect_breaks.best_perfect_for_breaks`),
a proven lower bound beside each:

* 16 teams: the exact programme (Held-Karp over every round order and home/away), so each
  lower bound is proven and the first value is the least over the family;
* 28 teams: the order search and a CP-SAT lower bound.

Targets: at most 16 breaks for 16 teams and at most 32 for 28, or a proof that fewer is
impossible for the factorizations searched. Reference measured in the same run: the engine's
perfect factorization (``factorize``) under the existing order search
(:func:`scheduler.balance.orders.search_order`), and the lower bound n - 2 (de Werra 1981).

Run: ``python benchmarks/bench_perfect_breaks.py [--quick]``. With ``--store`` only the
16-team ranking runs and its best schedule is written to
``scheduler/factorization/data/perfect_breaks.json`` (read by
:func:`scheduler.balance.perfect_breaks.stored_best_perfect`).
"""

from __future__ import annotations

import json
import sys
import time
from importlib import resources
from pathlib import Path

from scheduler.balance.orders import search_order
from scheduler.balance.perfect_breaks import best_perfect_for_breaks
from scheduler.factorization import factorize
from scheduler.factorization.perfect_family import perfect_family
from scheduler.factorization.verify import verify_rounds

TARGETS = {16: 16, 28: 32}


def run(n: int, tries: int, budget: float, bound_seconds: float):
    t0 = time.perf_counter()
    today = factorize(n, seed=0, budget=10.0)
    before = search_order(today.rounds, n, seed=0, work=2e8)
    t_before = time.perf_counter() - t0
    t1 = time.perf_counter()
    family = perfect_family(n, seed=0, search_tries=tries)
    t_family = time.perf_counter() - t1
    t2 = time.perf_counter()
    ranked = best_perfect_for_breaks(n, seed=0, budget=budget, family=family,
                                     bound_seconds=bound_seconds)
    t_rank = time.perf_counter() - t2
    print(f"{n} teams: before ({today.method}, order search) {before.breaks} breaks "
          f"[{t_before:.1f} s]; family of {len(family)} perfect factorizations "
          f"[{t_family:.1f} s]; ranking [{t_rank:.1f} s]")
    print(f"  {'factorization':<72} {'breaks':>6} {'bound':>6}  how")
    for c in ranked:
        assert verify_rounds(n, c.factorization.rounds).perfect
        print(f"  {c.origin[:72]:<72} {c.breaks:>6} {c.lower_bound:>6}  {c.method}")
    best = ranked[0]
    least_bound = min(c.lower_bound for c in ranked)
    target = TARGETS.get(n, n)
    verdict = ("target met" if best.breaks <= target else
               f"target missed; fewer than {least_bound} proven impossible for the "
               f"factorizations searched" if least_bound > target else "target missed, unproven")
    print(f"  best {best.breaks} (ratio to n-2 = {n - 2}: {best.breaks / (n - 2):.2f}; before "
          f"{before.breaks / (n - 2):.2f}); target <= {target}: {verdict}")
    return ranked


def store(ranked, n: int) -> None:
    best = ranked[0]
    fact = best.factorization
    entry = {
        "n": n,
        "origin": best.origin,
        "method": fact.method,
        "source": fact.source,
        "details": fact.details,
        "rounds": [[list(g) for g in r] for r in fact.rounds],
        "order": list(best.order),
        "home_first": [[a, b] if best.home[(a, b)] else [b, a]
                       for k in best.order for a, b in fact.rounds[k]],
        "breaks": best.breaks,
        "proof": (f"exact over every round order and home/away (Held-Karp); the least over the "
                  f"{len(ranked)} classes of the family searched, every other class has at least "
                  f"{min(c.lower_bound for c in ranked[1:]) if len(ranked) > 1 else best.breaks}"),
    }
    data = {"format": 1, "description": "Perfect single round robins with the fewest breaks "
            "found; produced by benchmarks/bench_perfect_breaks.py --store", "entries": [entry]}
    target = Path(str(resources.files("scheduler.factorization"))) / "data" / "perfect_breaks.json"
    target.write_text(json.dumps(data, separators=(",", ":")) + "\n", encoding="utf-8")
    print("written", target.name)


if __name__ == "__main__":
    if "--store" in sys.argv:
        store(run(16, tries=24, budget=5, bound_seconds=5), 16)
        sys.exit(0)
    quick = "--quick" in sys.argv
    run(16, tries=6 if quick else 24, budget=5, bound_seconds=5)
    run(28, tries=2 if quick else 6, budget=5 if quick else 30, bound_seconds=5 if quick else 20)
