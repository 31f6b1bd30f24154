"""Best available one-factorization when no perfect one is at hand: maximise perfect pairs.

Used for orders such as 64, 66, 70 where no perfect one-factorization is known
(docs/one-factorizations.md §1) or none is in reach of the budget. Three phases, every result
re-counted by the independent verifier:

1. **Baselines**: the circle GK_n (Kotzig 1964) and, for ``n = 2p`` with ``p`` odd, Anderson's
   GA_n (Anderson 1973; imperfect for composite ``p`` but often better than GK_n).
2. **Near-perfect starters**: the starter search of :mod:`scheduler.factorization.search`
   with an allowance of bad differences (a difference class ``g`` is bad when ``F_0 ∪ F_g``
   is not Hamiltonian). A starter with ``b`` bad classes in a group of order ``m`` gives
   exactly ``m * ((m-1)/2 - b)`` perfect pairs (translation invariance,
   docs/one-factorizations.md §3);
   the allowance is lowered each time a better starter is found.
3. **Kempe-chain annealing**: exchanging two rounds' edges along one alternating cycle of
   their union keeps a one-factorization (the Kempe interchange used in edge-colouring
   hill-climbing, J. H. Dinitz and D. R. Stinson, SIAM J. Alg. Disc. Meth. 8 (1987), from
   memory); moves are accepted by simulated annealing on the number of perfect pairs.

Reproducibility: ``budget`` is nominal seconds turned into fixed amounts of work (search nodes,
annealing moves) with :data:`NODES_PER_SECOND` and :data:`MOVES_PER_SECOND`, so a seed gives
the same factorization on every machine. A wall-clock safety cap of
``CLOCK_CAP * budget + CLOCK_SLACK`` seconds per phase also applies; if it ever stops a phase
early this is recorded in ``details["stopped_by_clock"]`` (the result may then depend on the
machine).
"""

from __future__ import annotations

import time
from typing import Any

import numpy as np

from scheduler.errors import InputError
from scheduler.factorization.anderson import anderson_factorization
from scheduler.factorization.circle import circle_factorization
from scheduler.factorization.groups import AbelianGroup, groups_of_order
from scheduler.factorization.model import Factorization, normalise_round
from scheduler.factorization.search import kernel_arrays
from scheduler.factorization.starters import starter_factorization
from scheduler.factorization.verify import partner_table, verify_rounds
from scheduler.progress import Progress

NODES_PER_SECOND = 30_000_000
"""Nominal search speed, in node x difference-class steps per second (conservative)."""

MOVES_PER_SECOND = 200_000_000
"""Nominal annealing speed, in (move x rounds x n) steps per second (conservative)."""

CLOCK_CAP = 3.0
"""Wall-clock safety cap of a phase: ``CLOCK_CAP * its budget + CLOCK_SLACK`` seconds."""

CLOCK_SLACK = 5.0
"""Seconds added to every wall-clock cap (kernel loading, verification of large orders)."""


def clock_cap(budget: float) -> float:
    """The wall-clock safety cap for a phase with ``budget`` nominal seconds.

    The searches stop on a fixed amount of work (so results do not depend on the machine);
    the clock only guards against a machine far slower than the one the work was measured on.

    Parameters
    ----------
    budget : float
        The phase's nominal seconds.

    Returns
    -------
    float
        ``CLOCK_CAP * budget + CLOCK_SLACK`` seconds.
    """
    return CLOCK_CAP * budget + CLOCK_SLACK

STARTER_SHARE = 0.4
"""Share of the budget spent on the near-perfect starter phase."""

_RUN_NODES = 100_000

PROBE_SHARE = 0.3
"""Share of the starter work spread over all candidate spaces before keeping the best few."""

KEEP_SPACES = 3


def _run_seed(seed: int, phase: int, run: int) -> int:
    return (seed * 1_000_003 + phase * 104_729 + run * 7_919 + 4_242) % (2**31 - 1)


def _score(f: Factorization) -> int:
    return verify_rounds(f.n, f.rounds, max_listed=0).perfect_pairs


def baselines(n: int) -> list[Factorization]:
    """GK_n, and GA_n when ``n = 2p`` with ``p`` odd.

    Parameters
    ----------
    n : int
        The even order.

    Returns
    -------
    list of Factorization
        The closed constructions the searches must beat (GK_n first).
    """
    out = [circle_factorization(n)]
    if n % 4 == 2 and n >= 6:
        out.append(anderson_factorization(n))
    return out


def _multiplier_priority(order: int) -> tuple[int, int]:
    """Multipliers of order 3, then 6, 2, 4, ... and the trivial one last (found best by
    experiment for orders 63 and 65; any order is correct, this only steers the effort)."""
    preferred = {3: 0, 6: 1, 2: 2, 4: 3}
    if order == 1:
        return (9, 0)
    return (preferred.get(order, 4), order)


def starter_candidates(m: int, limit: int = 12) -> list[tuple[AbelianGroup, int, int]]:
    """``(group, multiplier, multiplier order)`` to try for near-perfect starters of order m.

    Parameters
    ----------
    m : int
        The odd group order ``n - 1``.
    limit : int, optional
        At most this many multiplier spaces, the most promising first; the plain space
        (multiplier 1) of every group is always added.

    Returns
    -------
    list of tuple of (AbelianGroup, int, int)
        The spaces to search.
    """
    out = []
    groups = groups_of_order(m)
    for gi, group in enumerate(groups):
        seen: set[frozenset[int]] = set()
        for u in group.units():
            sub, x = set(), u
            while True:
                sub.add(x)
                x = int(group.mul[x, u])
                if x == u:
                    break
            key = frozenset(sub)
            if key in seen:
                continue
            seen.add(key)
            out.append((_multiplier_priority(len(sub)), gi, u, group, len(sub)))
            if len(seen) > 64:
                break
    out.sort(key=lambda t: (t[0], t[1], t[2]))
    chosen = [(group, u, k) for _, _, u, group, k in out[:limit]]
    for group in groups:  # the unrestricted search always takes part
        if not any(g is group and u == 1 for g, u, _ in chosen):
            chosen.append((group, 1, 1))
    return chosen


def near_perfect_starter(
    n: int,
    *,
    seed: int = 0,
    work: int = 10**8,
    beat: int = 0,
    clock_limit: float | None = None,
    prune: bool = True,
) -> tuple[Factorization | None, dict]:
    """Starter in a group of order ``n - 1`` with as many perfect pairs as found within ``work``.

    Multiplier-invariant starters (:func:`starter_candidates`) are tried round-robin, one
    kernel run each, each space raising its own target after every success; after
    ``PROBE_SHARE`` of the work only the ``KEEP_SPACES`` best spaces go on. Only starters with
    more than ``beat`` perfect pairs are kept. ``prune=False`` keeps every space to the end
    (the right choice when only a perfect starter is wanted). Returns the
    best starter-induced factorization (or ``None``) and a record of the search.

    Parameters
    ----------
    n : int
        The even order.
    seed : int, optional
        The search's seed.
    work : int, optional
        The amount of work (kernel nodes times classes) to spend.
    beat : int, optional
        Keep only starters with more perfect pairs than this.
    clock_limit : float or None, optional
        Seconds after which the search stops anyway (:func:`clock_cap`); None: no limit.
    prune : bool, optional
        Drop the weaker spaces after the probing share of the work.

    Returns
    -------
    factorization : Factorization or None
        The best starter-induced factorization found; None when none beat ``beat``.
    record : dict
        The spaces tried, runs, nodes, whether the clock stopped it, and the best space.

    References
    ----------
    ``docs/factorization-search.md``.
    """
    m = n - 1
    from scheduler.factorization._search_kernel import search_kernel  # numba: lazily

    start = time.perf_counter()
    classes = (m - 1) // 2
    cands = [(g, u, k, kernel_arrays(g, u)) for g, u, k in starter_candidates(m)]
    best = None
    need = [beat // m + 1] * len(cands)
    own_best = [0] * len(cands)
    record: dict[str, Any] = {"tried": [f"{g.name} u={u}" for g, u, _, _ in cands], "runs": 0,
                              "nodes": 0, "clock": False}
    out = np.zeros((classes, 2), dtype=np.int32)
    every_pair = np.ones((m, m), dtype=np.bool_)
    run = 0
    spent = 0
    pruned = False
    alive = [c for c in range(len(cands)) if need[c] <= classes]
    while spent < work and alive:
        ci = alive[run % len(alive)]
        group, u, _, (add, neg, mulu, reps, weights) = cands[ci]
        run += 1
        status, nodes, badw = search_kernel(
            m, add, neg, mulu, reps, weights, classes - need[ci],
            _run_seed(seed, 1, run), _RUN_NODES, out, np.zeros(0, dtype=np.int32),
            every_pair,
        )
        spent += int(nodes) * len(reps)
        record["runs"] = run
        record["nodes"] += int(nodes)
        if status == 1:
            starter = tuple(sorted((int(min(a, b)), int(max(a, b))) for a, b in out))
            good = classes - int(badw)
            own_best[ci] = good
            need[ci] = good + 1
            if best is None or good > best[0]:
                best = (good, group, u, starter)
            if good == classes:
                break
        if status == -1 or need[ci] > classes:
            alive.remove(ci)  # this space holds no starter with need[ci] good classes
        if prune and not pruned and spent > PROBE_SHARE * work:
            # keep the most promising spaces for the rest of the work
            pruned = True
            ranked = sorted(alive, key=lambda c: (-own_best[c], c))[:KEEP_SPACES]
            alive = [c for c in alive if c in ranked]
        if clock_limit is not None and time.perf_counter() - start > clock_limit:
            record["clock"] = True
            break
    if best is None:
        return None, record
    good, group, u, starter = best
    record.update({"group": group.name, "multiplier": u, "good_classes": good,
                   "classes": classes})
    mult = f" (multiplier {u})" if u != 1 else ""
    f = starter_factorization(
        group, starter, method=f"near-perfect starter in {group.name}{mult}",
        details={"good_classes": good, "multiplier": u},
    )
    return f, record


def kempe_anneal(
    f: Factorization,
    *,
    seed: int = 0,
    work: int = 10**8,
    clock_limit: float | None = None,
    t_start: float = 1.5,
    t_end: float = 0.05,
    chunks: int = 20,
) -> tuple[Factorization, dict]:
    """Kempe-chain simulated annealing from ``f``; returns the best factorization seen.

    A move exchanges the edges of two rounds along one alternating cycle of their union (a
    Kempe-chain interchange), which keeps a one-factorization; moves are accepted by a
    simulated-annealing rule on the number of pairs of rounds that mix perfectly.

    Parameters
    ----------
    f : Factorization
        The starting factorization.
    seed : int, optional
        The seed of the moves.
    work : int, optional
        The amount of work; the number of moves is ``work / (n (n - 1))``.
    clock_limit : float or None, optional
        Seconds after which the search stops anyway; None: no limit.
    t_start, t_end : float, optional
        The temperature at the start and at the end (geometric cooling).
    chunks : int, optional
        The schedule is run in this many kernel calls (the clock is checked between them).

    Returns
    -------
    factorization : Factorization
        The best factorization seen (same method and source as ``f``).
    record : dict
        Moves made, the best score, and whether the clock stopped it.

    References
    ----------
    S. Kirkpatrick, C. D. Gelatt and M. P. Vecchi, "Optimization by simulated annealing",
    Science 220 (1983) 671-680; ``docs/factorization-search.md``.
    """
    from scheduler.factorization._kempe_kernel import kempe_anneal as kernel  # numba: lazily
    from scheduler.factorization._kempe_kernel import pair_matrix

    start = time.perf_counter()
    n = f.n
    P = partner_table(n, f.rounds).astype(np.int32)
    H = np.zeros((n - 1, n - 1), dtype=np.bool_)
    score = int(pair_matrix(P, H))
    best_P = P.copy()
    chunk_best_P = P.copy()
    iters = max(1, work // max(1, (n - 1) * n))
    per = max(1, iters // chunks)
    best_score = score
    done = 0
    record = {"moves": 0, "clock": False}
    for c in range(chunks):
        ta = t_start * (t_end / t_start) ** (c / chunks)
        tb = t_start * (t_end / t_start) ** ((c + 1) / chunks)
        chunk_best, score = kernel(P, H, score, _run_seed(seed, 2, c), per, ta, tb, chunk_best_P)
        score = int(score)
        done += per
        if chunk_best > best_score:
            best_score = int(chunk_best)
            best_P[:, :] = chunk_best_P
        if clock_limit is not None and time.perf_counter() - start > clock_limit:
            record["clock"] = True
            break
    record["moves"] = done
    record["best_score"] = best_score
    rounds = tuple(
        normalise_round((v, int(row[v])) for v in range(n) if v < row[v]) for row in best_P
    )
    return Factorization(n, rounds, f.method, f.source, dict(f.details)), record


def best_available(
    n: int, *, seed: int = 0, budget: float = 10.0, progress: Progress | None = None
) -> Factorization:
    """The best one-factorization of ``K_n`` found within ``budget`` (nominal seconds).

    ``details`` records the baselines, each phase and the verifier's count
    (``perfect_pairs``, ``pairs``); the rounds are whatever scored best, re-verified.

    Parameters
    ----------
    n
        The even order.
    seed
        Seed of the searches.
    budget
        Nominal seconds, converted to a fixed amount of work.
    progress
        Called as ``progress(message, fraction)``.

    Returns
    -------
    Factorization
        The best factorization found, with its record in ``details``.

    Raises
    ------
    InputError
        For an order that is not an even integer >= 4, or a budget that is not positive.

    References
    ----------
    ``docs/factorization-search.md``.

    Examples
    --------
    The searches compile numba kernels on first use (seconds), so the example is not run as a
    test:

    >>> f = best_available(8, budget=0.01)  # doctest: +SKIP
    >>> f.method, f.details["perfect_pairs"], f.details["pairs"]  # doctest: +SKIP
    ('best found: circle GK_8', 21, 21)
    """
    if isinstance(n, bool) or not isinstance(n, int) or n < 4 or n % 2:
        raise InputError(f"the order must be an even integer >= 4, got {n!r}", location="n")
    if not budget > 0:
        raise InputError(f"the time budget must be positive, got {budget!r}", location="budget")

    def report(fraction: float, message: str) -> None:
        if progress:
            progress(message, min(1.0, fraction))

    candidates = [(f, _score(f)) for f in baselines(n)]  # verifier counts
    base_info = {f.method: s for f, s in candidates}
    best, best_score = max(candidates, key=lambda t: t[1])
    report(0.01, f"baselines: {base_info}")
    phases: list[dict] = []
    stopped_by_clock = False

    work_a = int(budget * STARTER_SHARE * NODES_PER_SECOND)
    f_a, rec_a = near_perfect_starter(
        n, seed=seed, work=work_a, beat=best_score, clock_limit=clock_cap(budget * STARTER_SHARE)
    )
    stopped_by_clock |= rec_a["clock"]
    rec_a["phase"] = "near-perfect starter"
    if f_a is not None:
        score_a = (n - 1) * rec_a["good_classes"]  # m perfect pairs per good class (§3)
        rec_a["perfect_pairs"] = score_a
        if score_a > best_score:
            best, best_score = f_a, score_a
    phases.append(rec_a)
    report(STARTER_SHARE, f"starter phase: {best_score} perfect pairs")

    work_b = int(budget * (1 - STARTER_SHARE) * MOVES_PER_SECOND)
    f_b, rec_b = kempe_anneal(
        best, seed=seed, work=work_b, clock_limit=clock_cap(budget * (1 - STARTER_SHARE))
    )
    stopped_by_clock |= rec_b["clock"]
    score_b = rec_b["best_score"]
    rec_b.update({"phase": "Kempe annealing", "perfect_pairs": score_b, "start": best.method})
    phases.append(rec_b)
    improved = score_b > best_score
    if improved:
        best_score = score_b
    report(1.0, f"annealing: {best_score} perfect pairs")

    final = f_b if improved else best
    cert = verify_rounds(n, final.rounds, max_listed=0)
    if not cert.valid or cert.perfect_pairs != best_score:  # pragma: no cover - kernel guard
        raise AssertionError(
            f"local search claims {best_score} perfect pairs, verifier: {cert.perfect_pairs}, "
            f"problems {cert.problems}"
        )
    start_method = final.method
    method = f"best found: {start_method}" + (" + Kempe annealing" if improved else "")
    source = (
        "this project's local search (near-perfect starters; Kempe-chain simulated annealing), "
        f"seed {seed}; baselines: Kotzig 1964 (GK_n), Anderson 1973 (GA_n)"
    )
    details = dict(final.details)
    details.update(
        {
            "construction": "best available",
            "perfect_pairs": cert.perfect_pairs,
            "pairs": cert.pairs,
            "baselines": base_info,
            "phases": phases,
            "seed": seed,
            "budget": budget,
            "stopped_by_clock": stopped_by_clock,
        }
    )
    return Factorization(n, final.rounds, method, source, details)
