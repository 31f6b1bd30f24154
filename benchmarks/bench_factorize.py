"""Time to a certified perfect one-factorization for every covered even n <= 62.

    python benchmarks/bench_factorize.py [--budget 60] [--long]

Two columns: ``factorize`` (formula or shipped catalogue, then the verifier's certificate) and
``from scratch``: the perfect-starter search alone (groups of order n - 1, multiplier spaces and
the plain space, seed 0), without the catalogue or the formulas. The reference for the search
column is the plain exhaustive count of starters (OEIS A006204 growth, notes §3): it is what a
search without pruning would face. Targets: from scratch n = 16 under 1 s, n = 28 under 30 s.
``--long`` also runs n = 36 (about 500 million nodes, minutes) from scratch.
"""

from __future__ import annotations

import argparse
import math
import time

from scheduler.factorization.catalogue import catalogue_orders
from scheduler.factorization.improve import NODES_PER_SECOND, near_perfect_starter
from scheduler.factorization.policy import factorize


def _is_prime(k: int) -> bool:
    return k >= 2 and all(k % d for d in range(2, math.isqrt(k) + 1))


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--budget", type=float, default=60.0, help="nominal seconds per search")
    parser.add_argument("--long", action="store_true", help="also search n = 36 from scratch")
    args = parser.parse_args()
    covered = sorted({n for n in range(4, 63, 2) if _is_prime(n - 1) or _is_prime(n // 2)}
                     | set(catalogue_orders()))
    near_perfect_starter(16, work=10**5)  # load the numba kernel outside the timings
    print(f"{'n':>3} {'factorize s':>11} {'perfect':>7}  {'method':<32} {'scratch s':>9} "
          f"{'nodes':>11}  result")
    for n in covered:
        start = time.perf_counter()
        f = factorize(n)
        cert = f.certificate()
        quick = time.perf_counter() - start
        m = n - 1
        classes = (m - 1) // 2
        if n == 36 and not args.long:
            scratch = "skipped (--long)"
            seconds, nodes = float("nan"), 0
        else:
            budget = args.budget * (4 if n == 36 else 1)
            start = time.perf_counter()
            g, rec = near_perfect_starter(n, seed=0, work=int(budget * NODES_PER_SECOND),
                                          beat=m * classes - 1, prune=False)
            seconds = time.perf_counter() - start
            nodes = rec["nodes"]
            if g is None:
                scratch = "none found" + (" (Z_9: none exists)" if n == 10 else "")
            else:
                ok = g.certificate().perfect
                scratch = f"{'perfect' if ok else 'NOT PERFECT'} starter in {g.details['group']}"
        print(f"{n:>3} {quick:>11.4f} {cert.perfect!s:>7}  {f.method:<32} {seconds:>9.2f} "
              f"{nodes:>11}  {scratch}", flush=True)


if __name__ == "__main__":
    main()
