"""Benchmark of the audit: a 1000-team single round robin (499 500 fixtures) end to end.

Prints, for the large league: the time to read the CSV, check validity, compute every fairness
figure, and the total (target: under 30 s). Then, for a smaller league, it compares the
vectorised figures with a plain-Python reference implementation (loops over teams, rounds and
pairs of rounds) and prints the speed ratio. Both must agree exactly.

The schedule is the circle method with de Werra's home/away rule (de Werra, Annals of Discrete
Mathematics 11 (1981) 381-395), built here directly; its check values (n-2 breaks, carry-over
(n-1)(n^2-6n+12), Lambrechts et al., Math. Programming 172 (2018) 277-302) are asserted.

Run: ``python benchmarks/bench_audit.py [teams] [reference_teams]``.
"""

from __future__ import annotations

import itertools
import sys
import tempfile
import time
from pathlib import Path

from scheduler.audit import audit_file
from scheduler.audit.readers import read_schedule_with_rows
from scheduler.fairness import compute_fairness
from scheduler.fairness.validity import validate_season
from scheduler.season import Fixture, Season


def canonical(n: int) -> list[list[tuple[int, int]]]:
    m = n - 1
    rounds = []
    for k in range(1, n):
        games = [(n, k) if k % 2 else (k, n)]
        for i in range(1, n // 2):
            a, b = (k + i - 1) % m + 1, (k - i - 1) % m + 1
            games.append((a, b) if i % 2 else (b, a))
        rounds.append(games)
    return rounds


def team(t: int) -> str:
    return f"Club {t:04d}"


def write_csv(n: int, path: Path) -> None:
    with path.open("w", encoding="utf-8", newline="") as fh:
        fh.write("Round,Home,Away\n")
        for r, games in enumerate(canonical(n)):
            fh.writelines(f"{r + 1},{team(h)},{team(a)}\n" for h, a in games)


def season_of(n: int) -> Season:
    fixtures = tuple(
        Fixture(r + 1, team(h), team(a)) for r, games in enumerate(canonical(n)) for h, a in games
    )
    return Season("Bench", "1", tuple(team(t) for t in range(1, n + 1)), fixtures)


# ------------------------------------------------------------------ plain-Python reference


def reference(season: Season) -> dict:
    names = list(season.teams)
    n = len(names)
    rounds = season.rounds
    opp = [dict() for _ in range(rounds)]
    venue = [dict() for _ in range(rounds)]
    for f in season.fixtures:
        opp[f.round - 1][f.home] = f.away
        opp[f.round - 1][f.away] = f.home
        venue[f.round - 1][f.home] = "H"
        venue[f.round - 1][f.away] = "A"
    breaks = 0
    for t in names:
        seq = [venue[r][t] for r in range(rounds) if t in venue[r]]
        breaks += sum(1 for a, b in itertools.pairwise(seq) if a == b)
    carry: dict[tuple[str, str], int] = {}
    for t in names:
        for r in range(rounds):
            key = (opp[r][t], opp[(r + 1) % rounds][t])
            carry[key] = carry.get(key, 0) + 1
    coe = sum(v * v for v in carry.values())
    perfect = pairs = 0
    for i in range(rounds):
        for j in range(i + 1, rounds):
            pairs += 1
            start = names[0]
            v, length = start, 0
            while True:
                v = opp[j][opp[i][v]]
                length += 1
                if v == start:
                    break
            perfect += length == n // 2
    home = dict.fromkeys(names, 0)
    gap = 0
    for r in range(rounds):
        for t, side in venue[r].items():
            home[t] += side == "H"
        gap = max(gap, max(home.values()) - min(home.values()))
    return {"breaks_total": breaks, "carry_over_value": coe, "perfect_pairs": perfect,
            "pairs": pairs, "home_gap_max": gap}


def main() -> None:
    n = int(sys.argv[1]) if len(sys.argv) > 1 else 1000
    n_ref = int(sys.argv[2]) if len(sys.argv) > 2 else 300
    with tempfile.TemporaryDirectory() as tmp:
        path = Path(tmp) / "league.csv"
        write_csv(n, path)
        t0 = time.perf_counter()
        source = read_schedule_with_rows(path)
        t1 = time.perf_counter()
        problems = validate_season(source.season, source.rows)
        t2 = time.perf_counter()
        report = compute_fairness(source.season)
        t3 = time.perf_counter()
        assert not problems, problems[:3]
        assert report.breaks_total == n - 2
        assert report.carry_over_value == (n - 1) * (n * n - 6 * n + 12)
        print(f"{n} teams, {len(source.season.fixtures)} fixtures")
        print(f"  read CSV        {t1 - t0:7.2f} s")
        print(f"  validity        {t2 - t1:7.2f} s")
        print(f"  fairness        {t3 - t2:7.2f} s")
        print(f"  total           {t3 - t0:7.2f} s   (target < 30 s)")
        t4 = time.perf_counter()
        result = audit_file(path)
        t5 = time.perf_counter()
        assert result.valid
        print(f"  audit_file      {t5 - t4:7.2f} s   (one call, same work)")
        print(f"  breaks {report.breaks_total}, carry-over {report.carry_over_value}, "
              f"perfect pairs {report.perfect_pairs}/{report.pairs}")

    season = season_of(n_ref)
    t0 = time.perf_counter()
    fast = compute_fairness(season)
    t1 = time.perf_counter()
    ref = reference(season)
    t2 = time.perf_counter()
    for key, value in ref.items():
        assert getattr(fast, key) == value, (key, getattr(fast, key), value)
    print(f"{n_ref} teams: compute_fairness {t1 - t0:.3f} s (all figures), plain-Python "
          f"reference {t2 - t1:.3f} s (5 figures): ratio {(t2 - t1) / (t1 - t0):.1f}x")


if __name__ == "__main__":
    main()
