"""Speed of the independent verifier against a networkx reference, in the same run.

    python benchmarks/bench_verify.py [--sample 400]

For each n the input is GK_n with its vertices relabelled at random (n - 1 composite, so
imperfect pairs occur) and, as the worst case where every walk runs its full length, a perfect
GK_{n'} with n' - 1 prime nearby. The reference builds every union graph with networkx and
asks ``is_connected`` (A. Hagberg, D. Schult, P. Swart, SciPy 2008). At n >= 1000 the
reference is timed on a random sample of pairs and extrapolated to all C(n-1, 2) pairs.
Target: >= 50x faster than the reference at n = 1024, and under 5 s.
"""

from __future__ import annotations

import argparse
import random
import time

import networkx as nx

from scheduler.factorization.circle import circle_factorization
from scheduler.factorization.verify import verify_rounds


def reference_pair(a, b) -> bool:
    g = nx.MultiGraph()
    g.add_edges_from(a)
    g.add_edges_from(b)
    return nx.is_connected(g)


def reference_seconds(rounds, sample: int | None, rng: random.Random) -> tuple[float, int]:
    r = len(rounds)
    pairs = [(i, j) for i in range(r) for j in range(i + 1, r)]
    chosen = pairs if sample is None or sample >= len(pairs) else rng.sample(pairs, sample)
    start = time.perf_counter()
    good = sum(reference_pair(rounds[i], rounds[j]) for i, j in chosen)
    seconds = (time.perf_counter() - start) * len(pairs) / len(chosen)
    return seconds, good if len(chosen) == len(pairs) else -1


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--sample", type=int, default=400, help="pairs timed at n >= 1000")
    args = parser.parse_args()
    rng = random.Random(0)
    print(f"{'n':>5} {'pairs':>7} {'perfect':>7} {'verify s':>9} {'networkx s':>11} "
          f"{'ratio':>7}  input")
    for n, label in [(64, "GK_64 relabelled"), (62, "GK_62 (perfect) relabelled"),
                     (256, "GK_256 relabelled"), (258, "GK_258 (perfect) relabelled"),
                     (1024, "GK_1024 relabelled"), (1020, "GK_1020 (perfect) relabelled")]:
        perm = list(range(n))
        rng.shuffle(perm)
        rounds = circle_factorization(n).relabel(perm).rounds
        start = time.perf_counter()
        cert = verify_rounds(n, rounds)
        ours = time.perf_counter() - start
        sample = args.sample if n >= 1000 else None
        ref, ref_good = reference_seconds(rounds, sample, rng)
        if ref_good >= 0:
            assert ref_good == cert.perfect_pairs, (n, ref_good, cert.perfect_pairs)
        note = " (extrapolated)" if sample else ""
        print(f"{n:>5} {cert.pairs:>7} {cert.perfect_pairs:>7} {ours:>9.3f} {ref:>11.2f} "
              f"{ref / ours:>6.0f}x  {label}{note}", flush=True)


if __name__ == "__main__":
    main()
