"""Every perfect one-factorization of K_n up to isomorphism (n <= 14), and the fewest breaks of
a single round robin on each, proven.

Not run by pytest (K_14 takes minutes). The result is stored as package data,
``scheduler/factorization/data/perfect_small.json``, which the tests re-verify (every stored
factorization with the independent verifier, canonical forms distinct, the break minimum
re-computed for the smallest orders). Method (also in ``docs/perfect-breaks.md``):

1. *Labelled completions.* In a perfect one-factorization any two rounds form a Hamiltonian
   cycle, so after relabelling two rounds are ``A = {01, 23, ..., (n-2)(n-1)}`` and
   ``B = {12, 34, ..., (n-1)0}``. The other ``n - 3`` rounds are told apart by the partner of
   vertex 0 (``2..n-2``) and built in that order, game by game (the smallest vertex not yet
   playing in the round gets its partner next); a game is refused as soon as it closes, with
   an earlier round, a cycle shorter than ``n``. Every labelled perfect one-factorization
   containing ``A`` and ``B`` is produced exactly once (numba backtracking).
2. *Isomorphism classes* by the canonical form of
   :func:`scheduler.factorization.perfect_family.canonical_form`, which also gives the order
   of the automorphism group. Consistency check (orbit counting, derived here): the number of
   labelled completions equals ``sum over classes of n(n-1)(n-2) / |Aut|``.
3. *Fewest breaks* of each class by the exact subset dynamic programme
   :func:`scheduler.balance.perfect_breaks.exact_min_breaks`.

Run: ``python benchmarks/enumerate_perfect.py [max_n]`` (default 14); prints nodes, time per
order and the table, and rewrites the data file.
"""

from __future__ import annotations

import json
import sys
import time
from importlib import resources
from pathlib import Path

import numba as nb
import numpy as np

from scheduler.balance.perfect_breaks import exact_min_breaks
from scheduler.factorization.perfect_family import canonical_form
from scheduler.factorization.verify import verify_rounds


@nb.njit(cache=True)
def _closes_short_cycle(P, k, M, u, w, n):
    """Would the game (u, w) in the partial round ``M`` close a cycle shorter than ``n`` with
    one of the rounds ``P[0..k-1]``?"""
    for f in range(k):
        x = w
        length = 1
        while True:
            y = P[f, x]
            length += 1
            if y == u:
                if length < n:
                    return True
                break
            z = M[y]
            if z < 0:
                break
            x = z
            length += 1
    return False


@nb.njit(cache=True)
def completions(n, capacity):
    """All labelled completions of the rounds A and B (module docstring): ``(count, nodes,
    table)`` with ``table[c]`` the partner table of completion ``c`` (first ``capacity``)."""
    R = n - 1
    h = n // 2
    P = np.full((R, n), -1, dtype=np.int64)
    used = np.zeros((n, n), dtype=np.bool_)
    for v in range(n):
        P[0, v] = v ^ 1
        P[1, v] = (v + 1) % n if v % 2 == 1 else (v - 1) % n
        used[v, P[0, v]] = True
        used[v, P[1, v]] = True
    out = np.zeros((capacity, R, n), dtype=np.int8)
    count = 0
    nodes = 0
    total = (R - 2) * h
    u_at = np.zeros(total + 1, dtype=np.int64)
    w_at = np.zeros(total + 1, dtype=np.int64)
    p = 0
    w_at[0] = -1
    fresh = True
    while p >= 0:
        k = 2 + p // h
        e = p % h
        if fresh:
            if e == 0:
                u = 0
            else:
                u = 0
                while P[k, u] >= 0:
                    u += 1
            u_at[p] = u
            w_at[p] = u
            fresh = False
        u = u_at[p]
        # undo the game placed at p, if any
        w_prev = w_at[p]
        if w_prev != u and P[k, u] == w_prev:
            P[k, u] = -1
            P[k, w_prev] = -1
            used[u, w_prev] = False
            used[w_prev, u] = False
        placed = False
        w = w_prev + 1 if w_prev >= u else u + 1
        while w < n:
            ok = True
            if (e == 0 and w != k) or P[k, w] >= 0 or used[u, w]:
                ok = False
            if ok:
                nodes += 1
                if not _closes_short_cycle(P, k, P[k], u, w, n):
                    P[k, u] = w
                    P[k, w] = u
                    used[u, w] = True
                    used[w, u] = True
                    w_at[p] = w
                    placed = True
                    break
            if e == 0 and w >= k:
                break
            w += 1
        if not placed:
            w_at[p] = u
            p -= 1
            continue
        if p + 1 == total:
            if count < capacity:
                for f in range(R):
                    for v in range(n):
                        out[count, f, v] = P[f, v]
            count += 1
            continue  # try the next partner at p
        p += 1
        fresh = True
    return count, nodes, out


def _rounds(table: np.ndarray) -> tuple[tuple[tuple[int, int], ...], ...]:
    return tuple(
        tuple(sorted((v, int(row[v])) for v in range(len(row)) if v < int(row[v])))
        for row in table
    )


def enumerate_order(n: int) -> dict:
    t0 = time.perf_counter()
    capacity = 1 << 16
    count, nodes, tables = completions(n, capacity)
    if count > capacity:
        capacity = count
        count, nodes, tables = completions(n, capacity)
    t_search = time.perf_counter() - t0
    classes: dict[bytes, dict] = {}
    for c in range(count):
        rounds = _rounds(tables[c])
        form, aut = canonical_form(rounds, n)
        if form not in classes:
            classes[form] = {"rounds": rounds, "automorphisms": aut}
    t_canon = time.perf_counter() - t0 - t_search
    orbit_total = sum(n * (n - 1) * (n - 2) // c["automorphisms"] for c in classes.values())
    results = []
    for form in sorted(classes):
        item = classes[form]
        rounds = item["rounds"]
        cert = verify_rounds(n, rounds)
        assert cert.perfect, "an enumerated factorization is not perfect"
        t1 = time.perf_counter()
        best = exact_min_breaks(rounds, n)
        results.append({
            "rounds": [[list(g) for g in r] for r in rounds],
            "automorphisms": item["automorphisms"],
            "min_breaks": best.breaks,
            "order": list(best.order),
            "home_first": [[a, b] if best.home[(a, b)] else [b, a]
                           for r in (rounds[k] for k in best.order) for a, b in r],
            "seconds": round(time.perf_counter() - t1, 2),
        })
    t_total = time.perf_counter() - t0
    print(f"K_{n}: {count} labelled completions, {nodes} nodes, {len(classes)} classes "
          f"(orbit count {orbit_total}), search {t_search:.1f} s, canonical forms "
          f"{t_canon:.1f} s, total {t_total:.1f} s")
    print("  breaks per class:", [r["min_breaks"] for r in results],
          "automorphisms:", [r["automorphisms"] for r in results])
    return {"n": n, "completions": count, "nodes": nodes, "classes": results,
            "orbit_count": orbit_total}


def main(max_n: int = 14) -> None:
    out = {
        "format": 1,
        "description": (
            "Every perfect one-factorization of K_n up to isomorphism, with the fewest breaks "
            "of a single round robin on each (exact: Held-Karp over all round orders and "
            "home/away). Produced by benchmarks/enumerate_perfect.py; see docs/perfect-breaks.md."
        ),
        "orders": [],
    }
    for n in range(4, max_n + 1, 2):
        out["orders"].append(enumerate_order(n))
    print()
    print("| n | classes | min breaks per class | least | n - 2 |")
    for item in out["orders"]:
        values = sorted(c["min_breaks"] for c in item["classes"])
        print(f"| {item['n']} | {len(values)} | {values} | {min(values)} | {item['n'] - 2} |")
    target = Path(str(resources.files("scheduler.factorization"))) / "data" / "perfect_small.json"
    target.write_text(json.dumps(out, separators=(",", ":")) + "\n", encoding="utf-8")
    print("written", target.name)


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 14)
