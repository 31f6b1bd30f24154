"""Fewest breaks of a single round robin on a perfect one-factorization, over every round order.

Relabelling teams never changes the breaks of a schedule, but the choice of one-factorization
and the round order do. This module measures, for each candidate perfect one-factorization
(:mod:`scheduler.factorization.perfect_family`), the fewest breaks of a single round robin over
all round orders and home/away assignments, with a proven lower bound beside it.

*Colourings* (the reformulation of :mod:`scheduler.balance.orders`): with ``s_q(v) = 1`` when
team ``v`` is at home at position ``q`` and ``t_q = s_q xor (q mod 2)``, team ``v`` has a break
at ``q`` exactly when ``t_{q-1}(v) != t_q(v)``; each ``t_q`` is a 2-colouring in which every
game of the round at ``q`` joins the two colours. Swapping both colours from position ``q`` on
keeps every step but the one into ``q``, whose cost turns from ``d`` into ``n - d``; so a
colouring only matters up to swapping its colours (a *class*, ``2^(n/2 - 1)`` per round), and a
step between classes costs ``min(d, n - d)`` with ``d`` the Hamming distance of representatives
(derived here).

*Exact value* (:func:`exact_min_breaks`, ``n <= 16``): Held and Karp's subset dynamic programme
(M. Held & R. M. Karp, J. SIAM 10 (1962) 196-210) over (rounds used, last round, its class).
Values at or above a cap (a known upper bound) are dropped, which keeps ``n = 16`` to seconds;
when nothing below the cap survives, the cap itself is proven to be a lower bound. The kernel is
numba (imported lazily, only when an exact value is asked for).

*Large n* (:func:`search_breaks`): the simulated-annealing order search of
:func:`scheduler.balance.orders.search_order` (beam path) started from structured orders
(translation orders of a starter-induced factorization, see :func:`translation_orders`), the best
kept. *Lower bound* (:func:`cpsat_lower_bound`): OR-Tools CP-SAT on the order-and-colouring
model with one worker, a fixed seed and a deterministic time limit; its best bound, raised to
de Werra's ``n - 2`` (D. de Werra, Annals of Discrete Math. 11 (1981) 381-395) and rounded up to
even (for a perfect one-factorization every step has an even number of breaks, see
:mod:`scheduler.balance.orders`, so the total is even).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import TYPE_CHECKING

import numpy as np

from scheduler.balance.orders import OrderResult, search_order
from scheduler.balance.solver import SolveLimits, configure
from scheduler.errors import InputError
from scheduler.factorization.model import Factorization
from scheduler.home_away import total_breaks
from scheduler.interrupt import solve_interruptibly

if TYPE_CHECKING:  # imported lazily at run time (perfect_family imports this package)
    from scheduler.factorization.perfect_family import FamilyMember

EXACT_MAX_N = 16
"""Largest order with the exact subset dynamic programme (2^15 subsets x 15 rounds x 128)."""

CAP_INFINITY = 127
"""Values are int8 in the kernel; this stands for 'at or above the cap'."""


@dataclass(frozen=True)
class BreakMinimum:
    """Fewest breaks of a single round robin on one factorization.

    Parameters
    ----------
    breaks
        The fewest breaks found.
    lower_bound
        A proven lower bound on the breaks of any order and home/away on this factorization.
    order
        A round order reaching ``breaks`` (factorization round indexes).
    home
        ``{(a, b): a is at home}`` for every game, reaching ``breaks`` with ``order``.
    method
        How each figure was obtained, in words.

    References
    ----------
    ``docs/perfect-breaks.md``.
    """

    breaks: int
    lower_bound: int
    order: tuple[int, ...]
    home: dict[tuple[int, int], bool] = field(compare=False, hash=False)
    method: str = ""

    @property
    def exact(self) -> bool:
        """Whether the fewest breaks found is proven fewest (it meets the lower bound)."""
        return self.breaks == self.lower_bound


def _classes(rounds: Sequence[Sequence[tuple[int, int]]], n: int) -> np.ndarray:
    """``masks[r, x]``: one colouring of each class ``x`` of round ``r`` (bit ``v`` = colour of
    ``v``); the last game of each round always puts its second vertex in colour 1."""
    half = n // 2
    size = 1 << (half - 1)
    masks = np.zeros((len(rounds), size), dtype=np.int64)
    for r, games in enumerate(rounds):
        ordered = sorted((min(a, b), max(a, b)) for a, b in games)
        for x in range(size):
            mask = 1 << ordered[-1][1]
            for i in range(half - 1):
                a, b = ordered[i]
                mask |= 1 << (a if (x >> i) & 1 else b)
            masks[r, x] = mask
    return masks


def _step_costs(masks: np.ndarray, n: int) -> np.ndarray:
    """``cost[r, s, x, y] = min(d, n - d)``, ``d`` the Hamming distance of the classes."""
    xor = masks[:, None, :, None] ^ masks[None, :, None, :]
    bits = np.zeros(xor.shape, dtype=np.int64)
    for v in range(n):
        bits += (xor >> v) & 1
    return np.minimum(bits, n - bits).astype(np.int8)


def _kernel():
    import numba as nb

    @nb.njit(cache=True)
    def held_karp(cost, cap, first):
        R = cost.shape[0]
        S = cost.shape[2]
        full = (1 << R) - 1
        f = np.full((1 << R, R, S), CAP_INFINITY, dtype=np.int8)
        for r in range(R):
            if first < 0 or r == first:
                for x in range(S):
                    f[1 << r, r, x] = 0
        for sub in range(1, full + 1):
            for r in range(R):
                if not (sub >> r) & 1:
                    continue
                row = f[sub, r]
                live = False
                for x in range(S):
                    if row[x] < cap:
                        live = True
                        break
                if not live:
                    continue
                for s in range(R):
                    if (sub >> s) & 1:
                        continue
                    out = f[sub | (1 << s), s]
                    c = cost[r, s]
                    for x in range(S):
                        fx = row[x]
                        if fx >= cap:
                            continue
                        for y in range(S):
                            v = fx + c[x, y]
                            if v < out[y]:
                                out[y] = v
        return f

    return held_karp


_HELD_KARP = None


def _held_karp(cost: np.ndarray, cap: int, first: int) -> np.ndarray:
    global _HELD_KARP
    if _HELD_KARP is None:
        _HELD_KARP = _kernel()
    return _HELD_KARP(cost, np.int8(cap), first)


def _walk_back(f: np.ndarray, cost: np.ndarray, last: int, cls: int) -> list[tuple[int, int]]:
    """Rounds and classes of an optimal path ending in ``(last, cls)``, first position first."""
    R = f.shape[1]
    sub = (1 << R) - 1
    path = [(last, cls)]
    value = int(f[sub, last, cls])
    while sub & (sub - 1):
        prev = sub & ~(1 << last)
        found = False
        for r in range(R):
            if not (prev >> r) & 1:
                continue
            row = f[prev, r].astype(np.int64) + cost[r, last, :, cls]
            hit = np.flatnonzero((f[prev, r] < CAP_INFINITY) & (row == value))
            if len(hit):
                x = int(hit[0])
                value = int(f[prev, r, x])
                sub, last, cls = prev, r, x
                path.append((r, x))
                found = True
                break
        if not found:  # pragma: no cover - the table always holds a predecessor
            raise AssertionError("no predecessor in the dynamic programme")
    return path[::-1]


def home_away_from_classes(rounds: Sequence[Sequence[tuple[int, int]]], n: int,
                           path: Sequence[tuple[int, int]],
                           masks: np.ndarray
                           ) -> tuple[tuple[int, ...], dict[tuple[int, int], bool], int]:
    """Order, home/away and breaks of a path of (round, class): each step takes the
    representative (colouring or its swap) nearer to the previous colouring.

    Parameters
    ----------
    rounds
        The rounds of a one-factorization of ``K_n`` (games of vertices ``0..n-1``).
    n
        The even order.
    path
        The ``(round, class)`` steps, in playing order.
    masks
        ``masks[round, class]``: the colouring (bit ``v`` set: vertex ``v`` at home).

    Returns
    -------
    tuple
        The order of the rounds, ``home[(a, b)]`` (``a < b``: is ``a`` at home) and the number of
        breaks.
    """
    full = (1 << n) - 1
    t_prev = int(masks[path[0][0], path[0][1]])
    colourings = [t_prev]
    total = 0
    for r, x in path[1:]:
        t = int(masks[r, x])
        d = bin(t ^ t_prev).count("1")
        if n - d < d:
            t ^= full
            d = n - d
        total += d
        colourings.append(t)
        t_prev = t
    home: dict[tuple[int, int], bool] = {}
    for q, (r, _x) in enumerate(path):
        s = colourings[q] if q % 2 == 0 else ~colourings[q]
        for a, b in rounds[r]:
            home[(min(a, b), max(a, b))] = bool((s >> min(a, b)) & 1)
    return tuple(r for r, _ in path), home, total


def count_breaks(rounds: Sequence[Sequence[tuple[int, int]]], order: Sequence[int],
                 home: dict[tuple[int, int], bool], n: int) -> int:
    """Breaks of the single round robin ``order`` with venues ``home`` (``home[(a, b)]``, a < b:
    is ``a`` at home), counted by the project's one break count
    (:func:`scheduler.home_away.total_breaks`; de Werra 1981).

    Parameters
    ----------
    rounds
        The rounds of a one-factorization of ``K_n`` (games of vertices ``0..n-1``).
    order
        The order in which the rounds are played.
    home
        The venue of every game.
    n
        The even order.

    Returns
    -------
    int
        The total number of breaks.
    """
    games = [
        [(min(a, b), max(a, b)) if home[(min(a, b), max(a, b))] else (max(a, b), min(a, b))
         for a, b in rounds[r]]
        for r in order
    ]
    return total_breaks(games, n)


def exact_min_breaks(rounds: Sequence[Sequence[tuple[int, int]]], n: int, *,
                     cap: int | None = None, first: int | None = None,
                     known: OrderResult | None = None) -> BreakMinimum:
    """Fewest breaks of a single round robin on ``rounds`` over every order and home/away.

    Parameters
    ----------
    rounds
        The ``n - 1`` rounds of a one-factorization of ``K_n`` (games of vertices ``0..n-1``).
    n
        Even order, at most :data:`EXACT_MAX_N`.
    cap
        Optional known upper bound: partial paths at or above it are not followed, which
        makes the programme much faster. When no schedule below ``cap`` exists: if ``known``
        is given the result is ``known`` with the proven lower bound ``cap`` (exact when
        ``known.breaks == cap``), else the programme is run again without the cap.
    first
        Fix the first round (valid when the factorization's automorphisms move every round to
        this one, e.g. a starter-induced factorization, whose translations do).
    known
        A schedule already found (order, home/away, breaks), used with ``cap``.

    Returns
    -------
    BreakMinimum
        ``breaks == lower_bound`` (exact) with an order and home/away reaching it, except when
        ``known`` is returned with the lower bound ``cap``.

    Raises
    ------
    InputError
        When ``n`` is odd or above :data:`EXACT_MAX_N`, or the rounds are not ``n - 1``.

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> exact_min_breaks(circle_rounds(8), 8).breaks
    6

    References
    ----------
    M. Held & R. M. Karp, J. SIAM 10 (1962) 196-210; D. de Werra, Annals of Discrete Math. 11
    (1981) 381-395 (the bound n - 2 it meets on GK_n).
    """
    if n % 2 or n < 4 or n > EXACT_MAX_N:
        raise InputError(f"the exact break minimum needs an even n in 4..{EXACT_MAX_N}, got {n}",
                         location="n")
    if len(rounds) != n - 1:
        raise InputError(f"K_{n} needs {n - 1} rounds, got {len(rounds)}", location="rounds")
    masks = _classes(rounds, n)
    cost = _step_costs(masks, n)
    limit = min(CAP_INFINITY, cap if cap is not None else CAP_INFINITY)
    start = -1 if first is None else int(first)
    f = _held_karp(cost, limit, start)
    final = f[(1 << (n - 1)) - 1]
    if int(final.min()) >= limit:
        if known is not None:
            return BreakMinimum(known.breaks, limit, known.order, known.home,
                                f"search; lower bound {limit} proven by Held-Karp with a cap")
        if limit == CAP_INFINITY:  # pragma: no cover - breaks never reach 127 for n <= 16
            raise AssertionError("break values above the kernel's range")
        f = _held_karp(cost, CAP_INFINITY, start)
        final = f[(1 << (n - 1)) - 1]
    last, cls = np.unravel_index(int(np.argmin(final)), final.shape)
    path = _walk_back(f, cost, int(last), int(cls))
    order, home, total = home_away_from_classes(rounds, n, path, masks)
    if total != int(final.min()):  # pragma: no cover - defensive
        raise AssertionError("path reconstruction disagrees with the dynamic programme")
    return BreakMinimum(total, total, order, home, "exact: Held-Karp over orders and classes")


def translation_orders(fact: Factorization) -> list[tuple[int, ...]]:
    """Structured starting orders for a starter-induced factorization of a cyclic group
    ``Z_m`` (round ``g`` is ``F_g``): ``0, k, 2k, ...`` for every unit step ``k``, and the
    paired orders ``0, j, u, u + j, 2u, 2u + j, ...`` with ``j = (m - 1)/2 * u`` (the shape of
    the canonical circle schedule). Empty for other factorizations.

    Parameters
    ----------
    fact
        The factorization (its ``details`` name the group and construction).

    Returns
    -------
    list of tuple of int
        Round orders (factorization round indexes), two per unit step.
    """
    group = str(fact.details.get("group", ""))
    if not group.startswith("Z_") or " x " in group or fact.details.get("construction") not in (
            "starter", None):
        return []
    m = fact.n - 1
    if len(fact.rounds) != m:
        return []
    out: list[tuple[int, ...]] = []
    from math import gcd

    for step in range(1, m):
        if gcd(step, m) != 1:
            continue
        out.append(tuple((q * step) % m for q in range(m)))
        half = (m - 1) // 2
        paired = []
        for k in range(half):
            paired += [(k * step) % m, ((k + half) * step) % m]
        paired.append(((m - 1) * step) % m)
        out.append(tuple(paired))
    return out


def search_breaks(fact: Factorization, *, seed: int = 0, work: float = 2e8,
                  starts: int = 4) -> OrderResult:
    """Few breaks for a large ``n``: :func:`~scheduler.balance.orders.search_order` from the
    natural order and from up to ``starts`` structured orders (:func:`translation_orders`,
    those with the fewest breaks at the start first), the best kept. Deterministic.

    Parameters
    ----------
    fact
        The factorization (even ``n``, no bye).
    seed
        Seed of the first search; later starts use the following seeds.
    work
        Total budget in inner-loop steps, shared equally among the starts.
    starts
        Most structured starting orders tried beside the natural one.

    Returns
    -------
    OrderResult
        The order and home/away with the fewest breaks found.
    """
    n = fact.n
    rounds = fact.rounds
    tries: list[Sequence[int] | None] = [None]
    structured = translation_orders(fact)
    if structured:
        from scheduler.balance.orders import BreakPaths

        paths = BreakPaths(rounds, n)
        scored = sorted(structured, key=lambda o: (paths.beam(o), o))
        tries += scored[:starts]
    best: OrderResult | None = None
    share = work / len(tries)
    for k, start in enumerate(tries):
        got = search_order(rounds, n, seed=seed + k, work=share, start=start)
        if best is None or got.breaks < best.breaks:
            best = got
    assert best is not None
    return best


def cpsat_lower_bound(rounds: Sequence[Sequence[tuple[int, int]]], n: int, *,
                      seconds: float = 10.0, seed: int = 0, first: int | None = None,
                      hint: OrderResult | None = None) -> tuple[int, OrderResult | None]:
    """A proven lower bound on the breaks over every order and home/away, by CP-SAT.

    Model: ``at[q, r]`` round ``r`` at position ``q`` (an assignment), ``colour[q, v]`` the
    colouring ``t_q`` (every game of the round at ``q`` joins two colours), ``brk[q, v]`` =
    ``colour[q-1, v] xor colour[q, v]``; the number of breaks into each position is even (the
    factorization is assumed perfect; see the module docstring) and the total at least
    ``n - 2``. Returns ``(bound, best schedule found or None)``; the bound is even and at
    least ``n - 2``. One worker, fixed seed, deterministic time limit (the wall-clock limit is
    only a far safety net).

    Parameters
    ----------
    rounds
        The rounds of a perfect one-factorization, each a list of games ``(a, b)``.
    n
        Number of vertices, even.
    seconds
        Deterministic time limit of the solve.
    seed
        CP-SAT's random seed.
    first
        Fix this round at the first position (a symmetry cut for round-transitive
        factorizations), or ``None``.
    hint
        A known schedule to start from, or ``None``.

    Returns
    -------
    tuple of (int, OrderResult or None)
        The proven lower bound (at most the breaks of the schedule found) and the best
        schedule found, or ``None`` when none was found in time.

    References
    ----------
    ``docs/perfect-breaks.md``.
    """
    from ortools.sat.python import cp_model

    R = len(rounds)
    model = cp_model.CpModel()
    at = [[model.new_bool_var(f"round_{r}_at_position_{q}") for r in range(R)] for q in range(R)]
    for q in range(R):
        model.add_exactly_one(at[q])
    for r in range(R):
        model.add_exactly_one(at[q][r] for q in range(R))
    colour = [[model.new_bool_var(f"colour_of_{v}_at_position_{q}") for v in range(n)]
              for q in range(R)]
    for q in range(R):
        for r, games in enumerate(rounds):
            for a, b in games:
                model.add(colour[q][a] != colour[q][b]).only_enforce_if(at[q][r])
    model.add(colour[0][0] == 0)  # swapping every colour keeps every break
    if first is not None:
        model.add(at[0][first] == 1)
    breaks = []
    for q in range(1, R):
        step = []
        for v in range(n):
            brk = model.new_bool_var(f"break_of_{v}_at_position_{q}")
            model.add_bool_xor([colour[q - 1][v], colour[q][v], brk.negated()])
            step.append(brk)
        half_steps = model.new_int_var(0, n // 2, f"half_breaks_at_position_{q}")
        model.add(sum(step) == 2 * half_steps)
        breaks += step
    total = sum(breaks)
    model.add(total >= n - 2)
    model.minimize(total)
    if hint is not None:
        pos = {r: q for q, r in enumerate(hint.order)}
        for r in range(R):
            for q in range(R):
                model.add_hint(at[q][r], pos[r] == q)
    solver = cp_model.CpSolver()
    configure(solver, SolveLimits(deterministic=seconds, wall=200 * seconds, seed=seed))
    status = solve_interruptibly(solver, model)
    bound = int(np.ceil(solver.best_objective_bound - 1e-6))
    bound = max(bound, n - 2)
    bound += bound % 2
    if status not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
        return bound, None
    order = tuple(next(r for r in range(R) if solver.value(at[q][r])) for q in range(R))
    home: dict[tuple[int, int], bool] = {}
    for q, r in enumerate(order):
        for a, b in rounds[r]:
            lo, hi = min(a, b), max(a, b)
            home[(lo, hi)] = bool(solver.value(colour[q][lo])) != (q % 2 == 1)
    found = OrderResult(order, home, count_breaks(rounds, order, home, n))
    return min(bound, found.breaks), found


@dataclass(frozen=True)
class Candidate:
    """One perfect one-factorization with the fewest breaks found for a single round robin on
    it and a proven lower bound.

    Parameters
    ----------
    factorization
        The perfect one-factorization.
    origin
        Where it came from (a construction, the catalogue, a search).
    breaks
        The fewest breaks found on it.
    lower_bound
        No schedule on this factorization has fewer breaks.
    order
        A round order reaching ``breaks``.
    home
        ``{(a, b): a is at home}`` (vertices as in ``factorization``), reaching ``breaks``.
    method
        How both figures were obtained, in words.

    References
    ----------
    ``docs/perfect-breaks.md``.
    """

    factorization: Factorization
    origin: str
    breaks: int
    lower_bound: int
    order: tuple[int, ...]
    home: dict[tuple[int, int], bool] = field(compare=False, hash=False, repr=False)
    method: str = ""

    @property
    def exact(self) -> bool:
        """Whether the fewest breaks found is proven fewest (it meets the lower bound)."""
        return self.breaks == self.lower_bound


SEARCH_WORK_PER_SECOND = 2e7
"""Work units (:attr:`scheduler.balance.orders.BreakPaths.beam_work`) per nominal second: the
budget is turned into a fixed amount of work, so results do not depend on the machine."""


def _round_transitive(fact: Factorization) -> bool:
    return fact.details.get("construction") == "starter"


def best_perfect_for_breaks(n: int, *, seed: int = 0, budget: float = 30.0,
                            family: (Sequence[FamilyMember | tuple[Factorization, str]]
                                     | None) = None,
                            bound_seconds: float = 5.0,
                            exact: bool = True) -> list[Candidate]:
    """Perfect one-factorizations of ``K_n`` ranked by the fewest breaks of a single round robin.

    Parameters
    ----------
    n
        Even order (for an odd league, ``teams + 1``), at least 4.
    seed
        Seed of the family's searches and of the order searches.
    budget
        Nominal seconds of order search per factorization for ``n > 16``, turned into fixed
        work (:data:`SEARCH_WORK_PER_SECOND`), so the answer depends only on the arguments.
    family
        The factorizations to rank (``FamilyMember`` objects or ``(factorization, origin)``
        pairs); default :func:`scheduler.factorization.perfect_family.perfect_family`.
    bound_seconds
        Deterministic CP-SAT time for the lower bound of each factorization when ``n > 16``
        (or when ``exact`` is false).
    exact
        Use the exact programme for ``n <= 16`` (seconds to a minute for 16 teams); false
        treats every order like a large one (search and CP-SAT bound), for quick answers.

    Returns
    -------
    list of Candidate
        Sorted by breaks, then lower bound, then origin. For ``n <= 16`` every lower bound is
        proven by the exact programme: the first candidate's breaks are the least over all
        factorizations of the family, and every later candidate's lower bound is at least the
        first's breaks (branch and bound with the best value so far as the cap).

    Raises
    ------
    InputError
        For an odd or too small ``n``.

    Examples
    --------
    >>> best_perfect_for_breaks(10)[0].breaks
    10

    References
    ----------
    Module docstring (Held & Karp 1962; de Werra 1981; CP-SAT).
    """
    from scheduler.factorization.perfect_family import FamilyMember, perfect_family

    if isinstance(n, bool) or not isinstance(n, int) or n < 4 or n % 2:
        raise InputError(f"a perfect single round robin needs an even n >= 4, got {n!r}",
                         location="n")
    members = family if family is not None else perfect_family(n, seed=seed)
    pairs: list[tuple[Factorization, str]] = [
        (m.factorization, m.origin) if isinstance(m, FamilyMember) else (m[0], m[1])
        for m in members]
    out: list[Candidate] = []
    if n <= EXACT_MAX_N and exact:
        incumbent: int | None = None
        for k, (fact, origin) in enumerate(pairs):
            first = 0 if _round_transitive(fact) else None
            quick = search_order(fact.rounds, n, seed=seed + k, work=2e7)
            cap = quick.breaks if incumbent is None else min(quick.breaks, incumbent)
            got = exact_min_breaks(fact.rounds, n, cap=cap, first=first, known=quick)
            if got.lower_bound == got.breaks or got.breaks < cap:
                method = "exact (Held-Karp over every order and home/away)"
            else:
                method = (f"search {got.breaks}; fewer than {got.lower_bound} impossible "
                          "(Held-Karp with that cap)")
            if incumbent is None or got.breaks < incumbent:
                incumbent = got.breaks
            out.append(Candidate(fact, origin, got.breaks, got.lower_bound, got.order, got.home,
                                 method))
    else:
        for k, (fact, origin) in enumerate(pairs):
            found = search_breaks(fact, seed=seed + k, work=budget * SEARCH_WORK_PER_SECOND)
            bound, solved = cpsat_lower_bound(fact.rounds, n, seconds=bound_seconds,
                                              seed=seed, first=0 if _round_transitive(fact)
                                              else None, hint=found)
            method = "order search (simulated annealing, beam path); CP-SAT lower bound"
            if solved is not None and solved.breaks < found.breaks:
                found = solved
                method = "CP-SAT schedule and lower bound (order search hint)"
            breaks, order, home = found.breaks, found.order, found.home
            out.append(Candidate(fact, origin, breaks, min(bound, breaks), order, home, method))
    out.sort(key=lambda c: (c.breaks, c.lower_bound, c.origin))
    return out


def stored_best_perfect(n: int) -> Candidate | None:
    """The perfect single round robin with the fewest breaks stored for ``n`` teams, or ``None``.

    The shipped file ``scheduler/factorization/data/perfect_breaks.json`` is written by
    ``benchmarks/bench_perfect_breaks.py --store`` (for 16 teams: the exact least over the
    family searched, see ``docs/perfect-breaks.md``); the tests re-verify it. Instant, so the
    planner can use it instead of ranking the family again.

    Parameters
    ----------
    n
        Even order.

    Returns
    -------
    Candidate or None
        ``lower_bound`` equals ``breaks`` (exact for that factorization).

    Examples
    --------
    >>> stored_best_perfect(16).breaks
    20

    References
    ----------
    ``docs/perfect-breaks.md``.
    """
    import json
    from importlib import resources

    try:
        text = resources.files("scheduler.factorization").joinpath(
            "data/perfect_breaks.json").read_text(encoding="utf-8")
    except FileNotFoundError:  # pragma: no cover - the file ships with the package
        return None
    for entry in json.loads(text)["entries"]:
        if int(entry["n"]) != n:
            continue
        rounds = tuple(tuple((int(a), int(b)) for a, b in r) for r in entry["rounds"])
        fact = Factorization(n, rounds, str(entry["method"]), str(entry["source"]),
                             dict(entry["details"]))
        home = {(min(a, b), max(a, b)): a < b for a, b in entry["home_first"]}
        return Candidate(fact, str(entry["origin"]), int(entry["breaks"]), int(entry["breaks"]),
                         tuple(int(k) for k in entry["order"]), home, str(entry["proof"]))
    return None
