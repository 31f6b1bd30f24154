"""How big are the search spaces of K_52 and K_56? Knuth's random-probe estimates of the search
trees (``scheduler.factorization.tree_size``), calibrated in the same run against complete
searches of smaller spaces (one per kernel, the prescribed-orbit kernel included).

    nice -n 15 python benchmarks/space_sizes.py --probes 20000
    python benchmarks/space_sizes.py --probes 2000 --only calibration

First the calibration: spaces small enough to search completely, with the estimate, the exact
node count of the complete search and their ratio (the estimator is unbiased, so the ratios
should lie within a few standard errors of 1). Then each kernel's node rate on a plain space of
the two orders.
Then one line per space of the two orders: the estimated nodes of one complete search with its
relative standard error (for the cyclic spaces also the search up to units, the sum over the
subtrees of ``unit_class_subtrees`` with a tenth of the probes each), the estimated number of
perfect starters it holds (0 when no probe reached one, which for rare leaves says little), and
the core-days a complete search would take at that node rate of the same kernel. Recorded
figures: docs/factorization-search.md, "How big the spaces are" and "Settling up to units".
"""

from __future__ import annotations

import argparse
import time

from scheduler.factorization.groups import cyclic
from scheduler.factorization.nonabelian_starters import search_perfect_group_starter, semidirect
from scheduler.factorization.orbit_factorizations import search_perfect_orbit_factorization
from scheduler.factorization.search import search_perfect_starter, settle_subtree_task
from scheduler.factorization.tree_size import (
    TreeSizeEstimate,
    estimate_group_starter_search,
    estimate_orbit_search,
    estimate_starter_search,
    estimate_twin_search,
)
from scheduler.factorization.twin_point_starters import (
    missing_representatives,
    search_perfect_twin_starter,
)
from scheduler.factorization.unit_classes import unit_class_subtrees

# plain spaces: GF(q) and Z_p^d are the same group with the same codes
TWIN_BASES = {52: ["Z_25", "Z_5 x Z_5"], 56: ["Z_27", "Z_3 x Z_9", "Z_3 x Z_3 x Z_3"]}
# prescribed Z_k with r cycles and a fixed point, r k + 1 = order (r = 1: the cyclic starters)
ORBIT_SPACES = {52: [(3, 17), (17, 3)], 56: [(5, 11), (11, 5)]}
DAY = 86_400.0


def up_to_units(m: int, u: int, probes: int) -> TreeSizeEstimate:
    """The tree of a settling search of ``Z_m`` (multiplier ``u``) up to units: the sum of the
    estimates of the subtrees of ``unit_class_subtrees(m)``, errors added in quadrature."""
    parts = [estimate_starter_search(cyclic(m), multiplier=u, probes=probes, subtree=t,
                                     up_to_units=True) for t in unit_class_subtrees(m)]
    nodes = sum(p.nodes for p in parts)
    error = sum(p.nodes_error**2 for p in parts) ** 0.5
    space = parts[0].space.split(", subtree")[0]
    return TreeSizeEstimate(space, probes * len(parts), nodes, error, 0.0, 0.0, 0)


class _Settled:
    """The node count of the subtree tasks of a search up to units, as one result."""

    def __init__(self, m: int, u: int) -> None:
        runs = [settle_subtree_task(f"Z_{m}", u, t, True) for t in unit_class_subtrees(m)]
        self.exhausted = all(r["exhausted"] for r in runs)
        self.nodes = sum(r["nodes"] for r in runs)


def calibration(probes: int) -> None:
    """Print estimate against complete search for small spaces of each kernel."""
    print("calibration: estimate against one complete search")
    print(f"{'space':44s} {'estimate':>12s} {'exact':>12s} {'ratio':>6s} {'rel.err':>7s}")
    big = 10**13
    cases = [
        (estimate_starter_search(cyclic(39), multiplier=16, probes=probes),
         lambda: search_perfect_starter(cyclic(39), multiplier=16, exhaustive=True,
                                        base_nodes=big, budget=1)),
        (up_to_units(39, 16, probes), lambda: _Settled(39, 16)),
        (estimate_starter_search(cyclic(51), multiplier=4, probes=probes),
         lambda: search_perfect_starter(cyclic(51), multiplier=4, exhaustive=True,
                                        base_nodes=big, budget=1)),
        (estimate_group_starter_search(semidirect(11, 5), automorphism=(1, 1), probes=probes),
         lambda: search_perfect_group_starter(semidirect(11, 5), automorphism=(1, 1),
                                              exhaustive=True, base_nodes=big, budget=1)),
        (estimate_twin_search("Z_13", 3, merged=True, probes=probes),
         lambda: search_perfect_twin_starter("Z_13", 3, merged=True, exhaustive=True,
                                             base_nodes=big, budget=1)),
        (estimate_twin_search("Z_3 x Z_3", 7, probes=probes),
         lambda: search_perfect_twin_starter("Z_3 x Z_3", 7, exhaustive=True,
                                             base_nodes=big, budget=1)),
        (estimate_orbit_search(3, 3, probes=probes),
         lambda: search_perfect_orbit_factorization(3, 3, base_nodes=big, max_run_nodes=big,
                                                    budget=1)),
    ]
    for estimate, run in cases:
        result = run()
        if not result.exhausted:
            raise SystemExit(f"calibration space not exhausted: {result}")
        print(f"{estimate.space:44s} {estimate.nodes:12.4g} {result.nodes:12d} "
              f"{estimate.nodes / result.nodes:6.3f} {estimate.relative_error:7.2%}")


def rates(work: int) -> dict[str, float]:
    """Node rate of each kernel on a plain space of K_52 or K_56 (``work`` nodes each)."""
    runs = {
        "starter": lambda: search_perfect_starter(cyclic(51), max_nodes=work, budget=600),
        "group": lambda: search_perfect_group_starter(semidirect(11, 5), max_nodes=work,
                                                      budget=600),
        "twin": lambda: search_perfect_twin_starter("Z_25", 3, max_nodes=work, budget=600),
        "orbit": lambda: search_perfect_orbit_factorization(3, 17, max_nodes=work, budget=600),
    }
    out = {}
    print("\nnode rates (plain spaces of K_52 and K_56, "
          f"{work:,} nodes each, after compiling)")
    for kernel, run in runs.items():
        start = time.perf_counter()
        result = run()
        out[kernel] = result.nodes / (time.perf_counter() - start)
        print(f"{kernel:8s} {out[kernel]:12,.0f} nodes/s")
    return out


def _row(order: int, estimate: TreeSizeEstimate, rate: float, seconds: float) -> None:
    days = estimate.nodes / rate / DAY
    perfect = (f"{estimate.starters:.3g} +- {estimate.starters_error:.2g}" if estimate.whole
               else "0 (no probe)")
    print(f"K_{order} {estimate.space:44s} {estimate.nodes:10.3g} {estimate.relative_error:7.1%} "
          f"{perfect:>20s} {days:12.3g} {seconds:6.1f}", flush=True)


def spaces(probes: int, node_rates: dict[str, float]) -> None:
    """Print the estimate of each space of K_52 and K_56."""
    print(f"\n{'order':5s} {'space':44s} {'nodes':>10s} {'rel.err':>7s} {'perfect starters':>20s} "
          f"{'core-days':>12s} {'probe s':>6s}")
    for order, m, multipliers in [(52, 51, (1, 16, 35)), (56, 55, (1, 21, 34))]:
        for u in multipliers:
            start = time.perf_counter()
            estimate = estimate_starter_search(cyclic(m), multiplier=u, probes=probes)
            _row(order, estimate, node_rates["starter"], time.perf_counter() - start)
            start = time.perf_counter()
            estimate = up_to_units(m, u, max(1, probes // 10))
            _row(order, estimate, node_rates["starter"], time.perf_counter() - start)
        for r, k in ORBIT_SPACES[order]:
            start = time.perf_counter()
            estimate = estimate_orbit_search(r, k, probes=probes)
            _row(order, estimate, node_rates["orbit"], time.perf_counter() - start)
        if order == 56:
            for automorphism in ((1, 0), (10, 0)):
                start = time.perf_counter()
                estimate = estimate_group_starter_search(semidirect(11, 5),
                                                         automorphism=automorphism, probes=probes)
                _row(order, estimate, node_rates["group"], time.perf_counter() - start)
        for merged in (False, True):
            for base in TWIN_BASES[order]:
                for missing in missing_representatives(base):
                    start = time.perf_counter()
                    estimate = estimate_twin_search(base, missing, merged=merged, probes=probes)
                    _row(order, estimate, node_rates["twin"], time.perf_counter() - start)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--probes", type=int, default=20_000)
    parser.add_argument("--work", type=int, default=20_000_000)
    parser.add_argument("--only", choices=["calibration", "all"], default="all")
    args = parser.parse_args()
    calibration(args.probes)
    if args.only == "all":
        spaces(args.probes, rates(args.work))


if __name__ == "__main__":
    main()
