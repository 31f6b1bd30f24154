"""Lower bounds on the breaks of perfect single round robins, 16 and 28 teams (not run by pytest).

For every perfect one-factorization of the family
(:func:`scheduler.factorization.perfect_family.perfect_family`) the bounds of
:mod:`scheduler.balance.break_bounds` (degree bound, two- and three-step windows with Lagrangian
penalties; for 28 teams also four-step windows, started from the three-step penalties) are
printed with their timings, beside

* the reference measured in the same run: OR-Tools CP-SAT's proven bound on the order-and-
  colouring model (:func:`scheduler.balance.perfect_breaks.cpsat_lower_bound`, one worker,
  fixed seed, deterministic time), with the ratios bound / CP-SAT bound and time / CP-SAT time;
* an upper bound: 16 teams the exact value (Held-Karp over every order and home/away, with the
  best value so far as a cap, :func:`scheduler.balance.perfect_breaks.best_perfect_for_breaks`);
  28 teams the order search (:func:`scheduler.balance.perfect_breaks.search_breaks`, a few
  seeds), each order then given its exact best home/away
  (:func:`scheduler.balance.break_bounds.best_home_away`), the best one polished by
  :func:`scheduler.balance.break_bounds.polish_order` (reversals of up to 8 rounds); the
  schedule is also checked against the window inequality (three times its breaks are at least
  the sum of its windows).

Target of the issue: at most 32 breaks for 28 teams, or a proof that fewer than 33 is impossible
on the factorizations searched (every lower bound at least 34, totals being even).

Run: ``python benchmarks/bench_break_bounds.py [--quick] [--budget SECONDS] [--seeds K]``
(``--quick``: 28 teams only, two factorizations, short searches).
"""

from __future__ import annotations

import argparse
import time

from scheduler.balance.break_bounds import (
    best_home_away,
    degree_lower_bound,
    polish_order,
    window_lower_bound,
    window_sum,
    window_tables,
)
from scheduler.balance.orders import OrderResult
from scheduler.balance.perfect_breaks import (
    SEARCH_WORK_PER_SECOND,
    best_perfect_for_breaks,
    cpsat_lower_bound,
    search_breaks,
)
from scheduler.factorization.perfect_family import perfect_family
from scheduler.factorization.verify import verify_rounds

TARGETS = {16: 16, 28: 32}


def run(n: int, tries: int, budget: float, cpsat_seconds: float, limit: int | None,
        seeds: int, four: bool = False) -> None:
    t0 = time.perf_counter()
    family = perfect_family(n, seed=0, search_tries=tries)[:limit]
    print(f"{n} teams: family of {len(family)} perfect factorizations "
          f"[{time.perf_counter() - t0:.1f} s]")
    upper: dict[str, tuple[int, str]] = {}
    proven: dict[str, int] = {}
    if n <= 16:
        t1 = time.perf_counter()
        for c in best_perfect_for_breaks(n, seed=0, family=family):
            upper[c.origin] = (c.breaks, "exact" if c.exact else f">= {c.lower_bound}")
            proven[c.origin] = c.lower_bound
        print(f"  exact programme over the family [{time.perf_counter() - t1:.1f} s]")
    print(f"  {'factorization':<50} {'upper':>5} {'(how)':<12} {'CP-SAT':>6} {'deg':>4} "
          f"{'win2':>4} {'win3':>4} (relax.) " + ("win4 (relax.) " if four else "")
          + f"{'ratio':>5}  times: CP-SAT / tables / windows")
    least_bound = None
    best_upper = None
    for k, member in enumerate(family):
        rounds = member.factorization.rounds
        assert verify_rounds(n, rounds).perfect
        found: OrderResult | None = None
        if n > 16:
            t1 = time.perf_counter()
            searched = []
            for s in range(seeds):
                got = search_breaks(member.factorization, seed=10 * k + s,
                                    work=budget * SEARCH_WORK_PER_SECOND)
                searched.append(got.breaks)
                polished = best_home_away(rounds, n, got.order)
                if found is None or polished.breaks < found.breaks:
                    found = polished
            assert found is not None
            found = polish_order(rounds, n, found.order, longest_segment=8, max_passes=3)
            upper[member.origin] = (found.breaks, f"{min(searched)}->{found.breaks} "
                                    f"{time.perf_counter() - t1:.0f}s")
        t1 = time.perf_counter()
        reference, _ = cpsat_lower_bound(rounds, n, seconds=cpsat_seconds, seed=0)
        t_ref = time.perf_counter() - t1
        t1 = time.perf_counter()
        tables = window_tables(rounds, n, quads=four)
        t_tables = time.perf_counter() - t1
        t1 = time.perf_counter()
        target = upper[member.origin][0]
        degree = degree_lower_bound(rounds, n, tables=tables)
        two = window_lower_bound(rounds, n, window=2, tables=tables, target=target)
        three = window_lower_bound(rounds, n, window=3, tables=tables, target=target)
        best_windows = three
        if four:
            best_windows = window_lower_bound(rounds, n, window=4, tables=tables, target=target,
                                              iterations=100, start=three.penalties)
        t_windows = time.perf_counter() - t1
        if found is not None:
            assert window_sum(tables, found.order) <= 3 * found.breaks, "window inequality"
        bound = max(degree.bound, two.bound, three.bound, best_windows.bound)
        assert bound <= target, "lower bound above a schedule found"
        strongest = max(bound, proven.get(member.origin, bound))
        least_bound = strongest if least_bound is None else min(least_bound, strongest)
        best_upper = target if best_upper is None else min(best_upper, target)
        up, how = upper[member.origin]
        print(f"  {member.origin[:50]:<50} {up:>5} {how[:12]:<12} {reference:>6} "
              f"{degree.bound:>4} {two.bound:>4} {three.bound:>4} "
              f"({float(three.relaxation):5.1f}) "
              + (f"{best_windows.bound:>4} ({float(best_windows.relaxation):5.1f}) " if four
                 else "") + f"{bound / reference:5.2f}  "
              f"{t_ref:.1f} / {t_tables:.1f} / {t_windows:.1f} s "
              f"(time ratio {(t_tables + t_windows) / t_ref:.2f})")
    target = TARGETS[n]
    assert least_bound is not None and best_upper is not None
    if best_upper <= target:
        verdict = f"target <= {target} met ({best_upper})"
    elif least_bound > target:
        verdict = (f"target <= {target} impossible on every factorization searched: every "
                   f"lower bound is at least {least_bound}")
    else:
        verdict = f"target <= {target} neither met nor refuted (least bound {least_bound})"
    print(f"  best schedule {best_upper}, least lower bound {least_bound}: {verdict}")


if __name__ == "__main__":
    parser = argparse.ArgumentParser()
    parser.add_argument("--quick", action="store_true")
    parser.add_argument("--budget", type=float, default=10.0,
                        help="nominal seconds of order search per 28-team factorization")
    parser.add_argument("--no-four", action="store_true",
                        help="skip the four-step windows for 28 teams (minutes each)")
    parser.add_argument("--seeds", type=int, default=3,
                        help="order searches per 28-team factorization, each polished by the "
                        "exact home/away of its order")
    args = parser.parse_args()
    if args.quick:
        run(28, tries=2, budget=2.0, cpsat_seconds=2.0, limit=2, seeds=1)
    else:
        run(16, tries=24, budget=args.budget, cpsat_seconds=5.0, limit=None, seeds=1)
        run(28, tries=6, budget=args.budget, cpsat_seconds=5.0, limit=None, seeds=args.seeds,
            four=not args.no_four)
