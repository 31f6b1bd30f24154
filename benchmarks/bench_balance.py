"""Balancer benchmarks (not run by pytest): figures and the ratio to the proven lower bound.

1. 20 teams, mirrored double round robin, two shared halls, ten hard rules: a complete season;
   breaks against de Werra's 3n-6 bound (de Werra 1981, Annals of Discrete Math. 11:381-395).
   Target: proven-optimal breaks in under 10 s on 2 cores.
2. 16 teams on a perfect one-factorization (the engine's): fewest breaks found in 30 s against
   the n-2 lower bound of a single round robin (de Werra 1981); GK_16 (not perfect, 15 not
   prime) reaches n-2 (the mixing/breaks trade-off of docs/one-factorizations.md §7).
3. The same for 28 teams on the catalogue's perfect starter-induced factorization (Z_27) and for
   10 teams on Anderson's GA_10 (Anderson 1973), against n-2 and against GK_n.

Before the colouring-path order search (scheduler.balance.orders), 30 s each: 16 teams 26
breaks, 28 teams 104, 10 teams 10. After it: 16 teams 22, 28 teams 80, 10 teams 10 (the exact
optimum of GA_10 over all orders, computed by Held-Karp in tests/balance/test_orders.py).

Run: ``python benchmarks/bench_balance.py``.
"""

from __future__ import annotations

import time
from datetime import date
from datetime import time as clock

from scheduler.balance.timetable import SolveLimits, solve_timetable
from scheduler.config.model import (
    CalendarSpec,
    FixedFixture,
    Format,
    League,
    Priorities,
    Rules,
    Team,
    TeamDates,
    Venue,
)
from scheduler.factorization.circle import circle_factorization
from scheduler.factorization.verify import verify_rounds
from scheduler.plan import plan_season

NAMES = [f"Club {c}" for c in "ABCDEFGHIJKLMNOPQRST"]


def league_20() -> League:
    teams = tuple(Team(n, n[-1] * 3) for n in NAMES)
    halls = (Venue("North Hall", ("N1", "N2", "N3"), (clock(18, 30), clock(20, 0))),
             Venue("South Hall", ("S1", "S2"), (clock(18, 30), clock(20, 0))))
    rules = Rules(
        unavailable=(TeamDates("Club C", (date(2027, 10, 2),)),
                     TeamDates("Club K", (date(2028, 1, 15),))),
        no_home_games=(TeamDates("Club A", (date(2027, 9, 11), date(2027, 9, 18))),
                       TeamDates("Club B", (date(2028, 3, 4),))),
        shared_grounds=(("Club D", "Club E"),),
        fixed=(FixedFixture("Club F", "Club G", round=1),
               FixedFixture("Club H", "Club J", round=20)),
        max_home_run=2, max_away_run=2, no_breaks_first=1, min_rest_days=3)
    return League(
        name="Benchmark League", season="2027-28", timezone="Europe/London", teams=teams,
        venues=halls, format=Format(legs=2, scheme="mirrored", home_meaning="side"),
        calendar=CalendarSpec(start=date(2027, 9, 4), end=date(2028, 6, 30), weekdays=(5,)),
        rules=rules, priorities=Priorities(mixing=2, breaks=4, venue_balance=2, slot_balance=2,
                                           carry_over=0),
        solve_seconds=8.0)


def bench_20() -> None:
    lg = league_20()
    t0 = time.perf_counter()
    result = plan_season(lg)
    wall = time.perf_counter() - t0
    chosen = next(o for o in result.options if o.chosen)
    n = 20
    print(f"20 teams, mirrored DRR, 2 halls, 10 rules: {wall:.2f} s, status {result.status}")
    print(f"  breaks {chosen.breaks}, lower bound 3n-6 = {3 * n - 6}, "
          f"ratio {chosen.breaks / (3 * n - 6):.3f}; fixtures {len(result.season.fixtures)}")
    for note in result.notes:
        print("  note:", note)


def _side_league(n: int) -> League:
    teams = tuple(Team(f"Club {i + 1}", f"C{i + 1:02d}") for i in range(n))
    return League(name=f"{n} teams", season="2027", timezone="Europe/London", teams=teams,
                  venues=(Venue("Hall", tuple(f"C{i}" for i in range(n // 2))),),
                  format=Format(home_meaning="side"), calendar=CalendarSpec(start=date(2027, 1, 2)))


def bench_perfect(n: int, fact, seconds: float = 30.0) -> None:
    """Breaks of a single round robin on a perfect factorization against n-2 and GK_n."""
    lg = _side_league(n)
    cert = verify_rounds(n, fact.rounds)
    t0 = time.perf_counter()
    tt = solve_timetable(lg, fact, SolveLimits(seconds, 3 * seconds, 0))
    wall = time.perf_counter() - t0
    gk = solve_timetable(lg, circle_factorization(n), SolveLimits(5, 20, 0))
    print(f"{n} teams, {fact.method} ({cert.perfect_pairs}/{cert.pairs} perfect pairs): "
          f"{tt.breaks} breaks in {wall:.1f} s ({tt.status}); lower bound n-2 = {n - 2}, "
          f"ratio {tt.breaks / (n - 2):.3f}")
    gk_pairs = verify_rounds(n, circle_factorization(n).rounds).perfect_pairs
    print(f"  reference: circle GK_{n} ({gk_pairs}/{cert.pairs} perfect pairs) {gk.breaks} breaks")


def bench_16(seconds: float = 30.0) -> None:
    from scheduler.factorization import factorize

    bench_perfect(16, factorize(16, seed=0, budget=10.0), seconds)


def bench_28_and_10(seconds: float = 30.0) -> None:
    from scheduler.factorization import anderson_factorization, catalogue_factorization

    bench_perfect(28, catalogue_factorization(28), seconds)
    bench_perfect(10, anderson_factorization(10), seconds)


if __name__ == "__main__":
    bench_20()
    bench_16()
    bench_28_and_10()
