"""A first solution (hint) for the timetable model: round order and leg-1 venues.

For GK_n (the circle schedule as built by ``circle_rounds``) the canonical round order with de
Werra's orientation, which has exactly ``n - 2`` breaks (D. de Werra, "Scheduling in sports",
Annals of Discrete Mathematics 11 (1981) 381-395), its order rotated to suit the leg scheme (the
rotation by one gives the English scheme 2n-4; the free scheme starts from the inverted order).
For other factorizations the round-order search on colouring paths
(:mod:`scheduler.balance.orders`; the CP-SAT limit is halved to pay for it) followed by the
venue-flip annealing of :mod:`scheduler.balance.anneal` over the whole season (kept only where
it is no worse); the annealing alone for odd leagues above 16 vertices.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from functools import lru_cache

from scheduler import leg_schemes
from scheduler.balance.anneal import anneal, breaks_of
from scheduler.balance.orders import EXACT_HALF, MAX_N, OrderResult, search_order
from scheduler.factorization.circle import circle_rounds
from scheduler.factorization.model import Factorization, Round

SEARCH_WORK = 7.5e8
"""Order-search work units per second of deterministic solve limit (about half a second of one
core); the CP-SAT limit is halved when the search runs, so the total stays about the same."""

Orientation = dict[tuple[int, int], bool]
"""``(a, b) -> a is at home`` in leg 1, for every game ``a < b`` of the factorization."""


@dataclass(frozen=True)
class StartingPoint:
    """The leg-1 round order and venues to start from.

    Parameters
    ----------
    order
        Factorization round indexes in leg-1 playing order.
    home
        ``{(a, b): a is at home in leg 1}`` for every game.
    searched
        ``True`` when the order search ran (the solver then gets half the deterministic
        limit).
    """

    order: list[int]
    home: Orientation
    searched: bool


def canonical_hint(n: int) -> tuple[list[int], Orientation]:
    """For GK_n as built by ``circle_rounds``: the canonical round order and de Werra's
    orientation (``docs/leg-schemes.md``): round k = 1..n-1 contains {∞, k}; ∞ is home when k is
    odd; in {k+i, k-i} the vertex k+i is home when i is odd.

    Parameters
    ----------
    n
        Number of vertices, even (at least 4).

    Returns
    -------
    tuple
        (round order as indexes into ``circle_rounds(n)``, ``{(a, b): a is at home}`` with
        ``a < b``); ``n - 2`` breaks, the fewest possible.

    References
    ----------
    D. de Werra, "Scheduling in sports", Annals of Discrete Mathematics 11 (1981) 381-395;
    ``docs/leg-schemes.md``.

    Examples
    --------
    >>> from scheduler.balance.anneal import breaks_of
    >>> from scheduler.factorization import circle_factorization
    >>> order, home = canonical_hint(6)
    >>> breaks_of(circle_factorization(6).rounds, home, [order], None)
    4
    """
    m = n - 1
    rounds = circle_rounds(n)
    index = {r: i for i, r in enumerate(rounds)}
    order: list[int] = []
    home: Orientation = {}
    for k in range(1, n):
        games = [(m, k % m)] + [((k + i) % m, (k - i) % m) for i in range(1, n // 2)]
        key = tuple(sorted((min(g), max(g)) for g in games))
        order.append(index[key])
        home_first = [k % 2 == 1] + [i % 2 == 1 for i in range(1, n // 2)]
        for (a, b), first in zip(games, home_first, strict=True):
            lo, hi = min(a, b), max(a, b)
            home[(lo, hi)] = first if a == lo else not first
    return order, home


@lru_cache(maxsize=8)
def _order_search(rounds, n: int, seed: int, work: float, bye: int | None) -> OrderResult:
    """Cached :func:`scheduler.balance.orders.search_order` (a model may be built twice)."""
    return search_order(rounds, n, seed=seed, work=work, bye=bye)


def greedy_orientation(rounds: Sequence[Round], order: Sequence[int]) -> Orientation:
    """A start orientation for other factorizations: alternate each vertex where possible.

    Parameters
    ----------
    rounds
        The rounds of the factorization.
    order
        Round indexes in playing order.

    Returns
    -------
    dict
        ``{(a, b): a is at home}`` for every game as the factorization writes it.
    """
    last: dict[int, bool] = {}
    home: Orientation = {}
    for k in order:
        for a, b in rounds[k]:
            want_a = not last.get(a, False)
            want_b = not last.get(b, True)
            a_home = want_a if (a in last or b not in last) else not want_b
            home[(a, b)] = a_home
            last[a], last[b] = a_home, not a_home
    return home


def best_rotation(fact: Factorization, order: list[int], home: Orientation, scheme: str,
                  legs: int, bye: int | None) -> list[int]:
    """The rotation of ``order`` with the fewest season breaks under the scheme (for the English
    scheme the rotation by one reaches 2n-4 [computed for n = 4..20]).

    Parameters
    ----------
    fact
        The factorization.
    order
        Leg-1 round order (factorization round indexes).
    home
        ``{(a, b): a is at home in leg 1}`` for every game.
    scheme
        The leg scheme (``docs/leg-schemes.md``).
    legs
        Number of legs.
    bye
        The bye vertex of an odd league, or ``None``.

    Returns
    -------
    list of int
        The best rotation of ``order`` (the first such on ties).
    """
    rounds_per_leg = len(order)
    maps = leg_schemes.leg_maps(scheme, legs, rounds_per_leg) or tuple(
        tuple(range(rounds_per_leg)) for _ in range(legs))
    best = None
    for r in range(rounds_per_leg):
        rotated = order[r:] + order[:r]
        value = breaks_of(fact.rounds, home,
                          [[rotated[mp[q]] for q in range(rounds_per_leg)] for mp in maps], bye)
        if best is None or value < best[0]:
            best = (value, rotated)
    assert best is not None
    return best[1]


def starting_point(fact: Factorization, *, scheme: str, legs: int, bye: int | None,
                   seed: int, effort: float, fixed_order: tuple[int, ...] | None,
                   start_home: Orientation | None) -> StartingPoint:
    """The hint for the timetable model (see the module docstring).

    Parameters
    ----------
    fact
        The factorization.
    scheme
        The leg scheme.
    legs
        Number of legs.
    bye
        The bye vertex of an odd league, or ``None``.
    seed
        Seed of the searches.
    effort
        Scales the search work (1 is the default effort).
    fixed_order
        A leg-1 round order the league fixes (then only the venues are chosen), or ``None``.
    start_home
        Venues to start from with ``fixed_order``, or ``None``.

    Returns
    -------
    StartingPoint
        De Werra's canonical schedule for the circle factorization; otherwise the result of
        the order search and annealing (deterministic for a seed).
    """
    n = fact.n
    rounds_per_leg = n - 1
    if fact.rounds == circle_rounds(n):
        order, home = canonical_hint(n)
        if legs > 1 and fixed_order is None:
            order = best_rotation(fact, order, home, scheme, legs, bye)
        return StartingPoint(order if fixed_order is None else list(fixed_order), home, False)
    if fixed_order is not None:
        order = list(fixed_order)
        return StartingPoint(order, start_home or greedy_orientation(fact.rounds, order), False)
    maps = (leg_schemes.leg_maps(scheme, legs, rounds_per_leg)
            or leg_schemes.leg_maps("inverted", legs, rounds_per_leg))
    assert maps is not None  # the inverted scheme always has maps
    moves = int(min(1_500_000, 60_000 + 30_000 * effort))
    searched = False
    if n > MAX_N or (bye is not None and n > 2 * EXACT_HALF):
        # two independent runs (seeds fixed), the better one wins
        runs = [anneal(fact.rounds, n, maps, bye, seed=seed * 2 + i, moves=moves // 2)
                for i in range(2)]
    else:
        # order search on the colouring paths, then the venue-flip annealing from it for the
        # whole season (never worse than its start)
        found = _order_search(fact.rounds, n, seed, SEARCH_WORK * effort, bye)
        searched = True
        runs = [anneal(fact.rounds, n, maps, bye, seed=seed * 2, moves=moves // 4,
                       start=(found.order, found.home))]
    order, home, _ = min(runs, key=lambda run: run[2])
    return StartingPoint(order, home, searched)
