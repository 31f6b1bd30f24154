"""Lower bounds on the breaks of a single round robin over every round order and home/away.

For a fixed one-factorization of ``K_n`` (rounds ``0..R-1``, ``R = n - 1``) the fewest breaks
over every round order and home/away assignment is a shortest Hamiltonian path over the rounds
in which every round also picks a 2-colouring (the colouring view of
:mod:`scheduler.balance.orders`: ``t_q(v)`` = "``v`` at home at position ``q``" xor "``q`` odd";
every game of the round at ``q`` joins the two colours; a step from ``t`` to ``t'`` costs
``D(t, t') = min(d, n - d)``, ``d`` the Hamming distance). The exact programme
(:func:`scheduler.balance.perfect_breaks.exact_min_breaks`) stops at 16 teams; this module gives
lower bounds that are computable for 28 teams. Everything below is derived here (see
``docs/perfect-breaks.md``, section "Lower bounds for large n").

*One step, one side free.* For a colouring ``t`` of round ``b`` and another round ``a``, let
``mono_a(t)`` be the number of games of ``a`` whose two teams have the same colour under ``t``.
Then ``min over colourings t' of a of D(t', t) = mono_a(t)``: a game of ``a`` with two colours
under ``t`` costs 0 or 2 by its orientation in ``t'``, a game with one colour costs 1 either
way, so ``d`` takes the values ``mono + 2j`` up to ``n - mono`` and ``min(d, n - d)`` is at
least ``mono`` and reaches it. Since ``a`` and ``b`` together are a union of even cycles, some
colouring of ``b`` has ``mono_a = 0``.

*Windows.* Let ``W_L(r_0, ..., r_L)`` be the fewest breaks of the ``L`` steps through the rounds
``r_0..r_L`` in this order, every colouring free (the ends included). Along a path
``p_0..p_{R-1}`` with colourings ``t_q`` cut the steps into the windows
``[j, j + L]``, ``j = 1 - L, ..., R - 2``, clipped to the path: every step lies in exactly ``L``
of them, so the breaks ``C`` satisfy ``L C >= sum over windows of W(clipped window)``.

- ``W_1 = 0`` (the bipartition of the cycle of two rounds is proper for both);
- ``W_2(a, b, c) = min over t_b of mono_a(t_b) + mono_c(t_b)`` (both ends free);
- ``W_3(a, b, c, d) = min over t_c of G_ab(t_c) + mono_d(t_c)`` with ``G_ab(t_c) = min over
  every colouring t_b of b of mono_a(t_b) + |t_b xor t_c|``: the minimum over both colourings
  of a class gives ``D``; for a fixed ``t_c`` it is a binary problem on the orientations of the
  games of ``b`` whose pair terms (games of ``a``) form the cycles of ``a`` and ``b`` together,
  solved exactly by a dynamic programme round each cycle.

*Relaxation.* The least sum of window values over Hamiltonian paths is bounded below by a
Lagrangian relaxation (Held & Karp's penalties on the nodes, M. Held & R. M. Karp, Oper. Res.
18 (1970) 1138-1162): walks of ``R`` positions whose ``L + 1`` consecutive rounds are distinct,
every visit of round ``r`` charged a penalty ``mu_r``, the sum of penalties subtracted. For every
``mu`` the least walk value is a lower bound (a Hamiltonian path is such a walk and pays every
penalty once); the penalties are improved by subgradient steps (Polyak's rule) and rounded to
multiples of ``1/1024``, so the final value is computed exactly in floating point and turned
into a bound with exact fractions.

*Degree bound* (:func:`degree_lower_bound`): every round of a path has at most two neighbours,
the two ends one; ``C >= (1/2) sum over interior rounds b of min over a != c of W_2(a, b, c)``,
i.e. half the sum of the per-round minima ``A_b`` less the two largest of them (the ends, whose
one-sided minimum is ``W_1 = 0``).

*Rounding.* Breaks are integers; on a perfect one-factorization every step has an even number
of breaks (:mod:`scheduler.balance.orders`), so the bound is rounded up to even, and it is at
least de Werra's ``n - 2`` (D. de Werra, Annals of Discrete Math. 11 (1981) 381-395).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from fractions import Fraction

import numpy as np

from scheduler.balance.orders import OrderResult
from scheduler.errors import InputError
from scheduler.factorization.verify import verify_rounds

MAX_N = 62
"""Colourings are bit masks in an int64."""

PENALTY_GRID = 1024
"""Penalties are rounded to multiples of ``1 / PENALTY_GRID`` before the final, exact walk."""


@dataclass(frozen=True)
class BreakLowerBound:
    """A proven lower bound on the breaks of a single round robin on one factorization.

    Parameters
    ----------
    bound
        The bound after rounding: an integer, at least ``n - 2``, even when ``perfect``.
    relaxation
        The exact value of the relaxation before rounding.
    window
        Steps per window (0 for the degree bound).
    penalties
        The Lagrangian penalty of every round (per break) that gives the bound.
    perfect
        Whether every two rounds form one Hamiltonian cycle (the parity argument applies).
    method
        A short description.

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> degree_lower_bound(circle_rounds(8), 8).window
    0

    References
    ----------
    Module docstring.
    """

    bound: int
    relaxation: Fraction
    window: int
    penalties: tuple[Fraction, ...]
    perfect: bool
    method: str


@dataclass(frozen=True)
class WindowTables:
    """The window values of one factorization (large values where rounds repeat).

    Parameters
    ----------
    n
        The even order.
    pairs
        ``pairs[a, b, c] = W_2(a, b, c)``.
    triples
        ``triples[a, b, c, d] = W_3(a, b, c, d)``, or ``None`` when not computed.
    perfect
        Whether every two rounds form one Hamiltonian cycle.
    quads
        ``quads[a, b, c, d, e] = W_4(a, b, c, d, e)``, or ``None`` when not computed.

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> window_tables(circle_rounds(8), 8).pairs.shape
    (7, 7, 7)

    References
    ----------
    Module docstring.
    """

    n: int
    pairs: np.ndarray
    triples: np.ndarray | None
    perfect: bool
    quads: np.ndarray | None = None


def _kernel():
    from scheduler.balance import _bounds_kernel

    return _bounds_kernel


def _games(rounds: Sequence[Sequence[tuple[int, int]]], n: int
           ) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    if n % 2 or n < 4 or n > MAX_N:
        raise InputError(f"break bounds need an even n in 4..{MAX_N}, got {n}", location="n")
    if len(rounds) != n - 1:
        raise InputError(f"K_{n} needs {n - 1} rounds, got {len(rounds)}", location="rounds")
    half = n // 2
    first = np.zeros((n - 1, half), np.int64)
    second = np.zeros((n - 1, half), np.int64)
    game_of = np.full((n - 1, n), -1, np.int64)
    side_of = np.zeros((n - 1, n), np.int64)
    for r, games in enumerate(rounds):
        ordered = sorted((min(a, b), max(a, b)) for a, b in games)
        if len(ordered) != half:
            raise InputError(f"round {r} has {len(ordered)} games, not {half}",
                             location=f"rounds[{r}]")
        for i, (a, b) in enumerate(ordered):
            first[r, i], second[r, i] = a, b
            game_of[r, a], game_of[r, b] = i, i
            side_of[r, b] = 1
        if (game_of[r] < 0).any():
            raise InputError(f"round {r} is not a perfect matching of 0..{n - 1}",
                             location=f"rounds[{r}]")
    return first, second, game_of, side_of


def is_perfect(rounds: Sequence[Sequence[tuple[int, int]]], n: int) -> bool:
    """Whether every two rounds together form one Hamiltonian cycle.

    Parameters
    ----------
    rounds
        The ``n - 1`` rounds of a one-factorization of ``K_n``.
    n
        The even order.

    Returns
    -------
    bool
        True for a perfect one-factorization.

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> is_perfect(circle_rounds(8), 8), is_perfect(circle_rounds(10), 10)
    (True, False)

    References
    ----------
    A perfect one-factorization (every union of two one-factors is a Hamiltonian cycle):
    E. Mendelsohn & A. Rosa, Ars Combin. 20 (1985) 43-52 (survey, from memory).
    """
    return verify_rounds(n, rounds).perfect


def window_tables(rounds: Sequence[Sequence[tuple[int, int]]], n: int, *,
                  triples: bool = True, quads: bool = False) -> WindowTables:
    """The window values ``W_2`` (and ``W_3``) of a one-factorization (module docstring).

    Parameters
    ----------
    rounds
        The ``n - 1`` rounds of a one-factorization of ``K_n`` (vertices ``0..n-1``).
    n
        The even order, at most :data:`MAX_N` (the ``W_3`` table costs about
        ``R^3 2^(n/2) n`` operations: seconds for 28 teams).
    triples
        Also compute ``W_3``.
    quads
        Also compute ``W_4`` (``R^5 2^(n/2 - 1)`` more operations: minutes for 28 teams).

    Returns
    -------
    WindowTables
        ``pairs[a, b, c]``: the fewest breaks of the two steps ``a -> b -> c``;
        ``triples[a, b, c, d]``: of the three steps ``a -> b -> c -> d``; ``quads`` likewise
        for four steps.

    Raises
    ------
    InputError
        When ``n`` is odd or out of range, or the rounds are not a one-factorization.

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> tables = window_tables(circle_rounds(6), 6)
    >>> int(tables.pairs[0, 1, 2]) >= 0
    True

    References
    ----------
    Module docstring; ``docs/perfect-breaks.md``.
    """
    first, second, game_of, side_of = _games(rounds, n)
    kern = _kernel()
    classes = 1 << (n // 2 - 1)
    masks = kern.class_masks(first, second, classes)
    mono = kern.mono_table(first, second, masks)
    pairs = kern.pair_windows(mono)
    table = (kern.triple_windows(first, second, game_of, side_of, masks, mono)
             if (triples or quads) and n >= 6 else None)
    four = kern.quad_windows(first, second, game_of, side_of, masks) if quads and n >= 6 else None
    return WindowTables(n, pairs, table, is_perfect(rounds, n), four)


def window_sum(tables: WindowTables, order: Sequence[int]) -> int:
    """The sum of the three-step window values along a round order (clipped windows included).

    Three times the breaks of any schedule playing the rounds in ``order`` are at least this
    sum (module docstring): a check of the tables against any schedule found.

    Parameters
    ----------
    tables
        Window values with ``triples`` (:func:`window_tables`).
    order
        A round order (every round once, at least three rounds).

    Returns
    -------
    int
        ``W_2(first three) + sum of W_3(four consecutive) + W_2(last three)``.

    Raises
    ------
    InputError
        When the tables have no three-step windows or the order is not a permutation.

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> tables = window_tables(circle_rounds(8), 8)
    >>> window_sum(tables, range(7)) >= 0
    True

    References
    ----------
    Module docstring.
    """
    order = [int(r) for r in order]
    if tables.triples is None:
        raise InputError("the tables have no three-step windows", location="tables")
    if sorted(order) != list(range(tables.pairs.shape[0])) or len(order) < 3:
        raise InputError("the order must play every round once", location="order")
    total = int(tables.pairs[order[0], order[1], order[2]])
    total += int(tables.pairs[order[-3], order[-2], order[-1]])
    for j in range(len(order) - 3):
        total += int(tables.triples[order[j], order[j + 1], order[j + 2], order[j + 3]])
    return total


def _round_up(value: Fraction, n: int, perfect: bool) -> int:
    bound = max(-((-value.numerator) // value.denominator), n - 2)
    if perfect:
        bound += bound % 2
    return bound


def degree_lower_bound(rounds: Sequence[Sequence[tuple[int, int]]], n: int, *,
                       tables: WindowTables | None = None) -> BreakLowerBound:
    """The degree bound: every round has at most two neighbours in the order.

    Parameters
    ----------
    rounds
        The ``n - 1`` rounds of a one-factorization of ``K_n``.
    n
        The even order.
    tables
        Window values already computed by :func:`window_tables` (computed when omitted).

    Returns
    -------
    BreakLowerBound
        ``relaxation = (sum of A_b - two largest A_b) / 2`` with ``A_b`` the least ``W_2``
        with ``b`` in the middle (module docstring).

    Raises
    ------
    InputError
        When the rounds are not a one-factorization of ``K_n``.

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> degree_lower_bound(circle_rounds(8), 8).bound
    6

    References
    ----------
    Module docstring; de Werra (1981) for the floor ``n - 2``.
    """
    if tables is None:
        tables = window_tables(rounds, n, triples=False)
    pairs = tables.pairs
    rounds_count = pairs.shape[0]
    least = sorted(int(pairs[:, b, :].min()) for b in range(rounds_count))
    value = Fraction(sum(least[:-2]) if rounds_count > 2 else 0, 2)
    return BreakLowerBound(_round_up(value, n, tables.perfect), value, 0,
                           (Fraction(0),) * rounds_count, tables.perfect,
                           "degree bound on the two-step windows")


def _walk(tables: WindowTables, window: int, penalty: np.ndarray) -> tuple[float, np.ndarray]:
    kern = _kernel()
    if window == 2:
        return kern.pair_walk(tables.pairs, penalty)
    assert tables.triples is not None
    if window == 3:
        return kern.triple_walk(tables.triples, tables.pairs, penalty)
    assert tables.quads is not None
    return kern.quad_walk(tables.quads, tables.triples, tables.pairs, penalty)


def window_lower_bound(rounds: Sequence[Sequence[tuple[int, int]]], n: int, *,
                       window: int = 3, iterations: int = 300, target: float | None = None,
                       tables: WindowTables | None = None,
                       start: Sequence[Fraction] | None = None) -> BreakLowerBound:
    """A lower bound from the windows of ``window`` steps and Lagrangian penalties on rounds.

    Parameters
    ----------
    rounds
        The ``n - 1`` rounds of a one-factorization of ``K_n``.
    n
        The even order (``window >= 3`` needs ``n >= 6``).
    window
        Steps per window: 2, 3 or 4 (four: a walk over ``R^4`` states, minutes for 28
        teams).
    iterations
        Subgradient steps on the penalties (a fixed count: the answer is deterministic).
    target
        An upper bound on the breaks (a schedule found), for Polyak's step length; default
        twice the relaxation without penalties plus ``n``.
    tables
        Window values already computed by :func:`window_tables`.
    start
        Penalties per break to start from (e.g. the ``penalties`` of a bound with smaller
        windows); zero when omitted.

    Returns
    -------
    BreakLowerBound
        The best bound over the penalties tried, recomputed exactly with penalties rounded to
        multiples of ``1 / PENALTY_GRID``.

    Raises
    ------
    InputError
        For a window other than 2, 3 or 4, or rounds that are not a one-factorization.

    Examples
    --------
    >>> from scheduler.factorization.anderson import anderson_rounds
    >>> window_lower_bound(anderson_rounds(10), 10, iterations=50).bound <= 10
    True

    References
    ----------
    Module docstring (Held & Karp 1970; B. T. Polyak, USSR Comput. Math. Math. Phys. 9 (1969)
    14-29, from memory, for the step length).
    """
    if window not in (2, 3, 4):
        raise InputError(f"windows of 2, 3 or 4 steps, got {window}", location="window")
    if (tables is None or (window >= 3 and tables.triples is None)
            or (window == 4 and tables.quads is None)):
        tables = window_tables(rounds, n, triples=window >= 3, quads=window == 4)
    if (window >= 3 and tables.triples is None) or (window == 4 and tables.quads is None):
        raise InputError("windows of three or four steps need n >= 6", location="window")
    rounds_count = tables.pairs.shape[0]
    penalty = np.zeros(rounds_count)
    if start is not None:
        penalty = np.array([float(p) * window for p in start])
    best_value = -np.inf
    best_penalty = penalty.copy()
    goal: float | None = None if target is None else target * window
    theta = 1.0
    stall = 0
    for _ in range(iterations):
        value, visits = _walk(tables, window, penalty)
        bound = value - penalty.sum()
        if goal is None:
            goal = float(2 * bound + n * window)
        if bound > best_value + 1e-9:
            best_value, best_penalty, stall = bound, penalty.copy(), 0
        else:
            stall += 1
            if stall >= 20:
                theta, stall = theta / 2, 0
        gradient = visits - 1.0
        norm = float(gradient @ gradient)
        if norm == 0 or theta < 1e-4:
            break
        penalty = penalty + theta * max(goal - bound, 1.0) / norm * gradient
    grid = np.round(best_penalty * PENALTY_GRID) / PENALTY_GRID
    value, _visits = _walk(tables, window, grid)
    exact = [Fraction(float(p)) for p in grid]
    relaxation = (Fraction(float(value)) - sum(exact, Fraction(0))) / window
    return BreakLowerBound(_round_up(relaxation, n, tables.perfect), relaxation, window,
                           tuple(p / window for p in exact), tables.perfect,
                           f"windows of {window} steps, Lagrangian penalties on rounds")


def break_lower_bound(rounds: Sequence[Sequence[tuple[int, int]]], n: int, *,
                      iterations: int = 300, target: float | None = None,
                      largest_window: int = 3) -> BreakLowerBound:
    """The strongest bound of this module up to windows of ``largest_window`` steps.

    Parameters
    ----------
    rounds
        The ``n - 1`` rounds of a one-factorization of ``K_n``.
    n
        The even order.
    iterations
        Subgradient steps (see :func:`window_lower_bound`); half as many for the four-step
        windows, which start from the penalties of the three-step ones.
    target
        A known number of breaks, for the step length.
    largest_window
        2, 3 (default: seconds for 28 teams) or 4 (a few minutes for 28 teams).

    Returns
    -------
    BreakLowerBound
        The strongest of the degree bound and the window bounds computed.

    Raises
    ------
    InputError
        When the rounds are not a one-factorization of ``K_n`` or ``largest_window`` is not 2,
        3 or 4.

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> break_lower_bound(circle_rounds(12), 12, iterations=20).bound
    10

    References
    ----------
    Module docstring.
    """
    if largest_window not in (2, 3, 4):
        raise InputError(f"windows of 2, 3 or 4 steps, got {largest_window}",
                         location="largest_window")
    tables = window_tables(rounds, n, triples=n >= 6 and largest_window >= 3,
                           quads=n >= 6 and largest_window == 4)
    candidates = [degree_lower_bound(rounds, n, tables=tables)]
    candidates.append(window_lower_bound(rounds, n, window=2, iterations=iterations,
                                         target=target, tables=tables))
    if tables.triples is not None:
        candidates.append(window_lower_bound(rounds, n, window=3, iterations=iterations,
                                             target=target, tables=tables))
    if tables.quads is not None:
        candidates.append(window_lower_bound(rounds, n, window=4, iterations=iterations // 2,
                                             target=target, tables=tables,
                                             start=candidates[-1].penalties))
    return max(candidates, key=lambda b: (b.relaxation, b.window))


def best_home_away(rounds: Sequence[Sequence[tuple[int, int]]], n: int,
                   order: Sequence[int]) -> OrderResult:
    """The fewest breaks of a fixed round order over every home/away assignment, exactly.

    A shortest path through the colouring classes of the rounds in ``order`` (module docstring
    of :mod:`scheduler.balance.perfect_breaks`): ``2^(n/2 - 1)`` classes per round, every step
    ``(n - 2) 4^(n/2 - 1)`` distance evaluations (about ``1.7 x 10^9`` for 28 teams, seconds in
    numba). An upper bound for the factorization, to polish an order found by a heuristic path.

    Parameters
    ----------
    rounds
        The ``n - 1`` rounds of a one-factorization of ``K_n``.
    n
        The even order, at most 32 (the table of classes grows as ``2^(n/2)``).
    order
        The order in which the rounds are played (every round once).

    Returns
    -------
    OrderResult
        ``order``, the venue of every game (``(a, b)``, ``a < b``: is ``a`` at home) and its
        breaks, re-counted by :func:`scheduler.balance.perfect_breaks.count_breaks`.

    Raises
    ------
    InputError
        When ``n`` is above 32, the rounds are not a one-factorization or ``order`` is not a
        permutation of the rounds.

    Examples
    --------
    >>> from scheduler.factorization.circle import circle_rounds
    >>> best_home_away(circle_rounds(8), 8, [0, 4, 1, 5, 2, 6, 3]).breaks >= 6
    True

    References
    ----------
    D. de Werra (1981) for the floor ``n - 2``; module docstring of
    :mod:`scheduler.balance.orders` for the colouring view.
    """
    from scheduler.balance.perfect_breaks import count_breaks, home_away_from_classes

    if n > 32:
        raise InputError(f"the exact home/away path stops at 32 teams, got {n}", location="n")
    first, second, _game_of, _side_of = _games(rounds, n)
    order = [int(r) for r in order]
    if sorted(order) != list(range(n - 1)):
        raise InputError("the order must play every round once", location="order")
    kern = _kernel()
    masks = kern.class_masks(first, second, 1 << (n // 2 - 1))
    value, classes = kern.order_path(masks, np.array(order, dtype=np.int64), n)
    path = [(r, int(x)) for r, x in zip(order, classes, strict=True)]
    got_order, home, total = home_away_from_classes(rounds, n, path, masks)
    if total != int(value) or count_breaks(rounds, got_order, home, n) != total:
        raise AssertionError("the class path disagrees with the break count")  # pragma: no cover
    return OrderResult(got_order, home, total)


def polish_order(rounds: Sequence[Sequence[tuple[int, int]]], n: int, order: Sequence[int], *,
                 longest_segment: int = 3, max_passes: int = 2) -> OrderResult:
    """Local search over round orders scored by their exact home/away (:func:`best_home_away`).

    Reverses every segment of at most ``longest_segment`` consecutive rounds (two: a swap of
    neighbours) and keeps the first reversal that lowers the breaks, until a full pass finds
    none or after ``max_passes`` passes. The steps before and after a segment are kept in
    forward and backward tables, so a trial costs ``longest_segment + 1`` steps of the exact
    path. Deterministic (no random choice).

    Parameters
    ----------
    rounds
        The ``n - 1`` rounds of a one-factorization of ``K_n``.
    n
        The even order, at most 32.
    order
        The order to start from (every round once).
    longest_segment
        Longest segment reversed (at least 2).
    max_passes
        Largest number of passes over every segment.

    Returns
    -------
    OrderResult
        The best order met with its exact home/away; never more breaks than ``order`` with
        its exact home/away.

    Raises
    ------
    InputError
        As :func:`best_home_away`, or ``longest_segment < 2``.

    Examples
    --------
    >>> from scheduler.factorization.anderson import anderson_rounds
    >>> polish_order(anderson_rounds(10), 10, range(9)).breaks >= 10
    True

    References
    ----------
    Segment reversal is the move of the 2-opt local search (S. Lin, Bell System Tech. J. 44
    (1965) 2245-2269; from memory).
    """
    if longest_segment < 2:
        raise InputError(f"segments of at least 2 rounds, got {longest_segment}",
                         location="longest_segment")
    current = best_home_away(rounds, n, order)
    first, second, _game_of, _side_of = _games(rounds, n)
    kern = _kernel()
    masks = kern.class_masks(first, second, 1 << (n // 2 - 1))
    work = np.array(current.order, dtype=np.int64)
    value = current.breaks
    for _ in range(max_passes):
        forward, backward = kern.path_tables(masks, work, n)
        improved = False
        for length in range(2, longest_segment + 1):
            for i in range(len(work) - length + 1):
                j = i + length - 1
                trial = int(kern.reversed_value(masks, work, i, j, forward, backward, n))
                if trial < value:
                    work[i:j + 1] = work[i:j + 1][::-1].copy()
                    value = trial
                    improved = True
                    forward, backward = kern.path_tables(masks, work, n)
        if not improved:
            break
    if value < current.breaks:
        current = best_home_away(rounds, n, [int(r) for r in work])
    return current
