"""Perfect pairs, breaks and carry-over side by side, before and after (not run by pytest).

For 10, 16, 22, 28 and 40 teams (single round robin), in one run:

* breaks and their ratio to de Werra's bound n - 2 (Annals of Discrete Math. 11 (1981)):
  *before*: the circle method GK_n and today's perfect choice (``factorize`` + the existing
  order search); *after*: the best perfect factorization found by
  :func:`scheduler.balance.perfect_breaks.best_perfect_for_breaks` (small budget here; see
  ``bench_perfect_breaks.py`` for the full runs);
* the carry-over effects value and its position between Russell's lower bound n(n-1)
  (Biometrika 67 (1980)) and the circle method's maximum (n-1)(n²-6n+12) (Lambrechts et al.,
  Math. Programming 172 (2018)): 0 at the lower bound, 1 at the maximum; *after*: the low
  carry-over search (:mod:`scheduler.balance.low_carry_over`; Russell's schedule for powers of
  two) and the best perfect factorization reordered for low carry-over;
* the frontier (:func:`scheduler.fairness.frontier.frontier`) of these options and its size.

Every budget is work, not time; the whole script is meant to take under 3 minutes on 2 cores.
Run: ``python benchmarks/bench_frontier.py``.
"""

from __future__ import annotations

import time

from scheduler.balance.low_carry_over import (
    best_low_carry_over,
    carry_over_bounds,
    carry_over_value,
    search_low_carry_over,
)
from scheduler.balance.orders import BreakPaths, search_order
from scheduler.balance.perfect_breaks import best_perfect_for_breaks
from scheduler.factorization import factorize
from scheduler.factorization.circle import circle_rounds
from scheduler.factorization.perfect_family import perfect_family
from scheduler.factorization.verify import verify_rounds
from scheduler.fairness.frontier import ScheduleOption, frontier

SIZES = (10, 16, 22, 28, 40)


def _option(label: str, rounds, n: int) -> ScheduleOption:
    """Figures of a schedule whose rounds are in playing order (fewest breaks for that order)."""
    cert = verify_rounds(n, rounds)
    assert cert.valid
    breaks = BreakPaths(rounds, n).assignment(list(range(n - 1))).breaks
    return ScheduleOption(label, cert.perfect_pairs, breaks, carry_over_value(rounds, n))


def row(n: int) -> None:
    t0 = time.perf_counter()
    lower, upper = carry_over_bounds(n)
    pairs = (n - 1) * (n - 2) // 2
    options = [_option("circle GK_n", circle_rounds(n), n)]
    today = factorize(n, seed=0, budget=5.0)
    found = search_order(today.rounds, n, seed=0, work=3e7)
    options.append(_option("today's perfect", [today.rounds[k] for k in found.order], n))
    # exact for n <= 16 on the first two classes of the family (for 16 teams the catalogue's
    # Z_15 starter and the even starter of Z_14, the best of bench_perfect_breaks.py)
    family = perfect_family(n, seed=0, search_tries=1, limit=2 if n <= 16 else 3)
    ranked = best_perfect_for_breaks(n, seed=0, budget=0.5, family=family, bound_seconds=0.5,
                                     exact=n <= 16)
    best = ranked[0]
    best_rounds = [best.factorization.rounds[k] for k in best.order]
    options.append(_option("best perfect for breaks", best_rounds, n))
    low = best_low_carry_over(n, seed=0, moves=4000)
    options.append(_option(f"low carry-over ({low.method.split(',')[0]})", low.rounds, n))
    reordered = search_low_carry_over(best_rounds, n, seed=0, moves=2000, change_pairings=False)
    options.append(_option("best perfect, low carry-over order", reordered.rounds, n))
    front = frontier(options)
    wall = time.perf_counter() - t0

    def pos(v: int) -> str:
        return f"{v} ({(v - lower) / max(1, upper - lower):.2f})"

    print(f"{n} teams [{wall:.1f} s]: n-2 = {n - 2}, carry-over bounds {lower}..{upper}, "
          f"{pairs} pairs of rounds")
    for o in options:
        mark = "*" if o in front else " "
        print(f"  {mark} {o.label:<44} perfect pairs {o.perfect_pairs:>4}/{pairs:<4} breaks "
              f"{o.breaks:>3} (ratio {o.breaks / (n - 2):.2f})  carry-over {pos(o.carry_over)}")
    print(f"  best perfect: lower bound {best.lower_bound} ({best.method}); frontier size "
          f"{len(front)} of {len(options)}")


if __name__ == "__main__":
    start = time.perf_counter()
    for size in SIZES:
        row(size)
    print(f"total {time.perf_counter() - start:.1f} s")
