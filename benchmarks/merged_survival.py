"""How often merges of two starters of ``Z_k`` are perfect, against the independence estimate.

Every merged even starter over ``Z_2 x Z_k`` whose equal-parity pairs miss ``0`` (the other case
is the same factorization read backwards, docs/factorization-search.md) is a starter ``A`` of
``Z_k`` (equal-parity pairs), a starter ``B`` of ``Z_k`` moved by ``h`` (mixed pairs, missing
``h``) and the parities forced by the one path from ``0`` to ``h`` that ``A`` and ``B + h``
must form. This script makes every such merge for ``k <= 17`` (all starters from
:func:`scheduler.factorization.starters.enumerate_starters`), or random ones for larger ``k``,
keeps those with a whole path and walks the remaining unions ``F_0 ∪ F_g`` (one ``g`` per
``±`` class, ``g != t``, in increasing order). It prints, per ``k``: the merges, those with a
whole path, the pass rate of each walk on its own (the marginal), the perfect merges actually
found, and the number the product of the marginals predicts (what "the walks are independent"
would give). Each perfect merge is re-checked by the module's own perfection test and by the
independent verifier.

    python benchmarks/merged_survival.py                # k = 9, 11, 13, 15 (seconds)
    python benchmarks/merged_survival.py --all 17       # every merge at 17 (minutes)
    python benchmarks/merged_survival.py --sample 17 21 25 --merges 2000000
    python benchmarks/merged_survival.py --all --spread 21 25   # does the choice of A matter?
    python benchmarks/merged_survival.py --all --perfect 25 27  # pairs of perfect starters

Recorded figures: docs/factorization-search.md ("Are the union walks independent?").
"""

from __future__ import annotations

import argparse
import time

import numba
import numpy as np

from scheduler.factorization import twin_point_starters as tw
from scheduler.factorization.groups import cyclic
from scheduler.factorization.starters import (
    enumerate_starters,
    good_differences,
    is_perfect_starter,
    starter_partner,
)
from scheduler.factorization.verify import verify_rounds

A006204 = {3: 1, 5: 1, 7: 3, 9: 9, 11: 25, 13: 133, 15: 631, 17: 3857, 19: 25905}
"""Starters of ``Z_k`` (OEIS A006204, the terms the test suite also checks)."""


def starter_partners(k: int) -> np.ndarray:
    """Every starter of ``Z_k`` as a row of partners (the package's
    :func:`~scheduler.factorization.starters.starter_partner` without ``∞``; ``row[0]`` is never
    read)."""
    group = cyclic(k)
    return np.array([starter_partner(group, s)[:k] for s in enumerate_starters(group)])


def row_pairs(row: np.ndarray) -> list[tuple[int, int]]:
    """The pairs of the starter whose partner row is ``row``."""
    return [(x, int(row[x])) for x in range(1, len(row)) if x < row[x]]


def random_starter_partners(k: int, count: int, rng: np.random.Generator) -> np.ndarray:
    """``count`` starters of ``Z_k`` drawn by randomised backtracking (not uniform)."""
    rows = np.zeros((count, k), np.int64)
    for i in range(count):
        while not _random_starter(k, rows[i], int(rng.integers(2**31))):
            pass
    return rows


@numba.njit(cache=True)
def _is_perfect_cyclic(k, row):
    """Is the starter with partners ``row`` perfect: ``F_0 ∪ F_g`` Hamiltonian in ``K_{k+1}``
    (``∞ = k``, ``F_g = {∞, g} ∪ (S + g)``) for ``g = 1..(k-1)/2``?"""
    for g in range(1, k // 2 + 1):
        v = 0
        length = 0
        while True:
            w = k if v == 0 else (0 if v == k else row[v])  # a step in F_0
            v = g if w == k else (k if w == g else (row[(w - g) % k] + g) % k)  # in F_g
            length += 2
            if v == 0:
                break
        if length != k + 1:
            return False
    return True


@numba.njit(cache=True)
def _cyclic_starters(k, perfect_rows):
    """Exhaustive depth-first run over the starters of ``Z_k`` (smallest free element first).
    Returns ``(starters, perfect starters)``; the first perfect ones go to ``perfect_rows``
    (partner rows) when it has rows."""
    used = np.zeros(k, np.bool_)
    dused = np.zeros(k // 2 + 1, np.bool_)
    used[0] = True
    row = np.zeros(k, np.int64)
    xs = np.zeros(k, np.int64)
    ys = np.zeros(k, np.int64)
    nxt = np.zeros(k, np.int64)
    depth = 0
    count = 0
    perfect = 0
    xs[0] = 1
    nxt[0] = 1
    while depth >= 0:
        x = xs[depth]
        placed = False
        while nxt[depth] < k:
            y = nxt[depth]
            nxt[depth] += 1
            cls = min(y - x, k - (y - x)) if y > x else 0
            if y <= x or used[y] or dused[cls]:
                continue
            used[x] = used[y] = True
            dused[cls] = True
            ys[depth] = y
            row[x] = y
            row[y] = x
            placed = True
            break
        if placed:
            z = x + 1
            while z < k and used[z]:
                z += 1
            if z == k:
                count += 1
                if perfect_rows.shape[0] > 0 and _is_perfect_cyclic(k, row):
                    if perfect < perfect_rows.shape[0]:
                        perfect_rows[perfect, :] = row
                    perfect += 1
                used[x] = used[y] = False
                dused[cls] = False
                continue
            depth += 1
            xs[depth] = z
            nxt[depth] = z + 1
            continue
        depth -= 1
        if depth >= 0:
            x = xs[depth]
            y = ys[depth]
            used[x] = used[y] = False
            d = y - x
            dused[min(d, k - d)] = False
    return count, perfect


def count_cyclic_starters(k: int) -> int:
    """The number of starters of ``Z_k`` (OEIS A006204 for the orders it lists)."""
    return int(_cyclic_starters(k, np.zeros((0, k), np.int64))[0])


def perfect_cyclic_starters(k: int, capacity: int = 1_000_000) -> tuple[int, np.ndarray]:
    """``(number of starters of Z_k, every perfect one as a partner row)`` (up to
    ``capacity`` rows)."""
    rows = np.zeros((capacity, k), np.int64)
    count, perfect = _cyclic_starters(k, rows)
    return int(count), rows[:min(perfect, capacity)]


@numba.njit(cache=True)
def _random_starter(k, row, seed):
    """Fill ``row`` with the partners of a starter of ``Z_k`` (smallest free element first,
    random partner order, a node limit); False when the limit is hit."""
    np.random.seed(seed)
    used = np.zeros(k, np.bool_)
    dused = np.zeros(k // 2 + 1, np.bool_)
    used[0] = True
    row[0] = 0
    stack_x = np.zeros(k, np.int64)
    stack_y = np.zeros(k, np.int64)
    order = np.zeros((k, k - 1), np.int64)
    pos = np.zeros(k, np.int64)
    depth = 0
    nodes = 0
    fresh = True
    while True:
        if fresh:
            x = 1
            while x < k and used[x]:
                x += 1
            if x == k:
                return True
            stack_x[depth] = x
            order[depth, :] = np.random.permutation(np.arange(1, k))
            pos[depth] = 0
        x = stack_x[depth]
        placed = False
        while pos[depth] < k - 1:
            d = order[depth, pos[depth]]
            pos[depth] += 1
            y = (x + d) % k
            cls = min(d, k - d)
            if used[y] or dused[cls]:
                continue
            used[x] = used[y] = True
            dused[cls] = True
            row[x], row[y] = y, x
            stack_y[depth] = y
            placed = True
            break
        nodes += 1
        if nodes > 200 * k * k:
            return False
        if placed:
            depth += 1
            fresh = True
            continue
        if depth == 0:
            return False
        depth -= 1
        x = stack_x[depth]
        y = stack_y[depth]
        used[x] = used[y] = False
        dused[min((y - x) % k, (x - y) % k)] = False
        fresh = False


@numba.njit(cache=True)
def _merge(k, a, b, h, pairs):
    """Merge ``A`` (partners ``a``) and ``B + h`` into ``pairs`` (codes ``2 x + parity``);
    returns the missing element's code, or -1 when the path from 0 is not whole."""
    seen = np.zeros(k, np.bool_)
    x = 0
    seen[0] = True
    par = 1  # (1, 0) starts the path: (0, 0) is the starter's missing zero
    count = 0
    for _ in range((k - 1) // 2):
        y = (b[(x - h) % k] + h) % k  # the mixed pair through x
        if seen[y]:
            return -1
        seen[y] = True
        pairs[count, 0] = 2 * x + par
        pairs[count, 1] = 2 * y + 1 - par
        count += 1
        z = a[y]  # the equal-parity pair through y, on its other copy
        if seen[z] or z == 0:
            return -1
        seen[z] = True
        pairs[count, 0] = 2 * y + par
        pairs[count, 1] = 2 * z + par
        count += 1
        x = z
        par = 1 - par
    if x != h:
        return -1
    return 2 * h + par  # the copy of h not yet used


@numba.njit(cache=True)
def _walks(k, add, pairs, mis, reps, passed, survived):
    """Walk ``F_0 ∪ F_g`` for every ``g`` in ``reps``; ``passed[j] += 1`` for each that is
    Hamiltonian, ``survived[j] += 1`` when walks ``0..j`` all were. Returns whether all were."""
    M = 2 * k
    n = M + 2
    p0 = np.empty(n, np.int64)
    for i in range(pairs.shape[0]):
        p0[pairs[i, 0]] = pairs[i, 1]
        p0[pairs[i, 1]] = pairs[i, 0]
    p0[M], p0[0] = 0, M
    p0[M + 1], p0[mis] = mis, M + 1
    pg = np.empty(n, np.int64)
    every = True
    for j in range(reps.shape[0]):
        g = reps[j]
        for x in range(M):
            pg[add[x, g]] = add[p0[x], g] if p0[x] < M else p0[x]
        pg[M] = g
        pg[M + 1] = add[mis, g]
        v = 0
        length = 0
        while True:
            v = pg[p0[v]]
            length += 2
            if v == 0:
                break
        if length == n:
            passed[j] += 1
        else:
            every = False
        if every:
            survived[j] += 1
    return every


@numba.njit(cache=True)
def _survey(k, add, a_rows, b_rows, reps, samples, seed, passed, survived, found, found_mis):
    """Merge every ``(A, B, h)`` (``samples == 0``) or ``samples`` random ones; returns
    ``(merges, whole paths, perfect merges)`` and keeps the first perfect ones in ``found``."""
    np.random.seed(seed)
    pairs = np.zeros((k - 1, 2), np.int64)
    made = 0
    whole = 0
    perfect = 0
    total = samples if samples > 0 else a_rows.shape[0] * b_rows.shape[0] * (k - 1)
    for job in range(total):
        if samples > 0:
            ia = np.random.randint(a_rows.shape[0])
            ib = np.random.randint(b_rows.shape[0])
            h = np.random.randint(1, k)
        else:
            ia = job // (b_rows.shape[0] * (k - 1))
            ib = (job // (k - 1)) % b_rows.shape[0]
            h = job % (k - 1) + 1
        made += 1
        mis = _merge(k, a_rows[ia], b_rows[ib], h, pairs)
        if mis < 0:
            continue
        whole += 1
        if _walks(k, add, pairs, mis, reps, passed, survived):
            if perfect < found.shape[0]:
                found[perfect, :, :] = pairs
                found_mis[perfect] = mis
            perfect += 1
    return made, whole, perfect


def survey(k: int, a_rows: np.ndarray, b_rows: np.ndarray, samples: int, seed: int,
           count: bool = True) -> None:
    """Print the figures of one order (all merges when ``samples`` is 0); ``count``: also count
    the starters of ``Z_k`` (minutes at ``k = 27``) and extrapolate to the whole class."""
    base = f"Z_{k}"
    group = tw.twin_group(base)
    reps = np.array([g for g in tw.check_representatives(base) if g != 1], np.int64)
    passed = np.zeros(len(reps), np.int64)
    survived = np.zeros(len(reps), np.int64)
    found = np.zeros((20, k - 1, 2), np.int64)
    found_mis = np.zeros(20, np.int64)
    start = time.perf_counter()
    made, whole, perfect = _survey(k, group.add, a_rows, b_rows, reps, samples, seed, passed,
                                   survived, found, found_mis)
    seconds = time.perf_counter() - start
    for i in range(min(perfect, len(found))):  # outside checks of the finds
        starter = [(int(x), int(y)) for x, y in found[i]]
        assert tw.is_merged_starter(base, starter)
        assert tw.is_perfect_twin_starter(base, starter)
        assert verify_rounds(2 * k + 2, tw.twin_factorization(base, starter).rounds).perfect
    marginal = passed / max(whole, 1)
    predicted = whole * float(np.prod(marginal))
    print(f"k = {k}: {made:,} merges{' (random)' if samples else ''}, {whole:,} with a whole "
          f"path ({whole / made:.3f}), {len(reps)} further walks, {seconds:.1f}s")
    print("  pass rate of each walk on its own: " + " ".join(f"{r:.3f}" for r in marginal))
    print("  passing the first j walks, found / predicted by independence: " + " ".join(
        f"{survived[j]:,}/{whole * float(np.prod(marginal[:j + 1])):.3g}"
        for j in range(len(reps))))
    ratio = f" (ratio {perfect / predicted:.3g})" if predicted else ""
    print(f"  perfect merges found {perfect}, predicted by independent walks "
          f"{predicted:.3g}{ratio}", flush=True)
    if not count:
        return
    starters = count_cyclic_starters(k)
    assert starters == A006204.get(k, starters), "the count disagrees with OEIS A006204"
    every = starters ** 2 * (k - 1)
    expected = every * (whole / made) * float(np.prod(marginal))
    units = sum(1 for u in range(1, k) if np.gcd(u, k) == 1)
    print(f"  whole class: {starters:,} starters of Z_{k}, {every:.3g} merges; perfect ones "
          f"expected by independent walks {expected:.3g} (about {expected / units:.3g} up to "
          f"the {units} multipliers)", flush=True)


@numba.njit(cache=True)
def _merges_of_one(k, add, a, b_rows, reps, samples, seed, passed, survived):
    """Merge the starter ``a`` with ``samples`` random ``(B, h)``; returns the whole paths."""
    np.random.seed(seed)
    pairs = np.zeros((k - 1, 2), np.int64)
    whole = 0
    for _ in range(samples):
        ib = np.random.randint(b_rows.shape[0])
        h = np.random.randint(1, k)
        mis = _merge(k, a, b_rows[ib], h, pairs)
        if mis >= 0:
            whole += 1
            _walks(k, add, pairs, mis, reps, passed, survived)
    return whole


def starter_spread(k: int, count: int, samples: int, rng: np.random.Generator) -> None:
    """Does the choice of ``A`` matter? The walk pass rate of ``count`` random starters ``A``
    (each merged with ``samples`` random ``(B, h)``), its spread against the binomial noise,
    and its correlation with the number of good differences of ``A`` as a starter of ``Z_k``
    (``F_0 ∪ F_g`` Hamiltonian in its own starter factorization)."""
    base = f"Z_{k}"
    group = tw.twin_group(base)
    reps = np.array([g for g in tw.check_representatives(base) if g != 1], np.int64)
    b_rows = random_starter_partners(k, 2000, rng)
    a_rows = random_starter_partners(k, count, rng)
    rates, good, paths = [], [], []
    for i, a in enumerate(a_rows):
        passed = np.zeros(len(reps), np.int64)
        whole = _merges_of_one(k, group.add, a, b_rows, reps, samples, i, passed,
                               np.zeros(len(reps), np.int64))
        rates.append(passed.sum() / max(whole * len(reps), 1))
        paths.append(whole)
        good.append(len(good_differences(cyclic(k), row_pairs(a))))
    r, g = np.array(rates), np.array(good)
    noise = np.sqrt(r.mean() * (1 - r.mean()) / (np.mean(paths) * len(reps)))
    print(f"k = {k}: {count} starters A, {samples:,} merges each: walk pass rate "
          f"{r.mean():.4f}, spread (sd) {r.std():.4f} against {noise:.4f} of binomial noise, "
          f"range {r.min():.4f}-{r.max():.4f}")
    print(f"  correlation with the good differences of A ({g.min()}-{g.max()} of "
          f"{(k - 1) // 2}): {np.corrcoef(g, r)[0, 1]:.2f}; mean rate by good differences: "
          + ", ".join(f"{v}: {r[g == v].mean():.4f}" for v in sorted(set(g.tolist()))))
    print(f"  the best starter's rate over {len(reps)} walks is worth a factor "
          f"{(r.max() / r.mean()) ** len(reps):.1f} on the chance of a perfect merge", flush=True)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__,
                                     formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("--all", type=int, nargs="*", default=[9, 11, 13, 15],
                        help="orders k whose merges are all made (17 takes minutes)")
    parser.add_argument("--sample", type=int, nargs="*", default=[],
                        help="orders k whose merges are drawn at random")
    parser.add_argument("--merges", type=int, default=1_000_000)
    parser.add_argument("--starters", type=int, default=2000,
                        help="random starters drawn per sampled order")
    parser.add_argument("--perfect", type=int, nargs="*", default=[],
                        help="orders k whose perfect starters are merged in every pair")
    parser.add_argument("--spread", type=int, nargs="*", default=[],
                        help="orders k at which to measure how much the choice of A matters")
    parser.add_argument("--spread-starters", type=int, default=200)
    parser.add_argument("--spread-merges", type=int, default=50_000)
    parser.add_argument("--seed", type=int, default=0)
    parser.add_argument("--no-count", action="store_true",
                        help="do not count the starters of Z_k (the count takes minutes at 27)")
    args = parser.parse_args()
    rng = np.random.default_rng(args.seed)
    for k in args.all:
        rows = starter_partners(k)
        print(f"Z_{k}: {len(rows)} starters")
        survey(k, rows, rows, 0, args.seed, not args.no_count)
    for k in args.sample:
        rows = random_starter_partners(k, args.starters, rng)
        survey(k, rows, rows, args.merges, args.seed, not args.no_count)
    for k in args.perfect:
        count, rows = perfect_cyclic_starters(k)
        assert count == A006204.get(k, count), "the count disagrees with OEIS A006204"
        for row in rows[:: max(1, len(rows) // 20)]:  # the package's own test, on a sample
            assert is_perfect_starter(cyclic(k), row_pairs(row))
        print(f"Z_{k}: {count:,} starters, {len(rows)} perfect; every pair of perfect ones merged")
        survey(k, rows, rows, 0, args.seed, count=False)
    for k in args.spread:
        starter_spread(k, args.spread_starters, args.spread_merges, rng)


if __name__ == "__main__":
    main()
