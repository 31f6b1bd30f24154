"""``factorize``: the one-factorization a league of ``teams`` teams should use.

Order of preference (the result carries no claims of its own: ``Factorization.certificate()``
runs the independent verifier, and the test suite checks every path through it):

1. ``n - 1`` prime: the circle GK_n, perfect (Kotzig 1964; Wallis 1997).
2. ``n / 2`` prime: Anderson's GA_n, perfect (Anderson 1973).
3. The shipped catalogue (:mod:`scheduler.factorization.catalogue`): perfect starters, then
   other structured entries (K_40: a starter in the non-abelian group Z_13 ⋊ Z_3).
4. For orders where a perfect one-factorization is known to exist but none is at hand:
   a perfect-starter search with half of the budget.
5. Otherwise the best available one (:func:`~scheduler.factorization.improve.best_available`):
   as many perfect pairs as found within the budget.

An odd number of teams uses ``n = teams + 1``; vertex ``n - 1`` is the bye. ``details``
records whether the order is known to have a perfect one-factorization (with the reason) and
what was tried. The cheap paths (formula or catalogue, every ``n <= 62`` except the orders
searched) import no numba.
"""

from __future__ import annotations

import math
import numbers
import time

from scheduler.errors import InputError
from scheduler.factorization.anderson import anderson_factorization
from scheduler.factorization.catalogue import catalogue_factorization
from scheduler.factorization.circle import circle_factorization
from scheduler.factorization.improve import (
    NODES_PER_SECOND,
    best_available,
    clock_cap,
    near_perfect_starter,
)
from scheduler.factorization.model import Factorization
from scheduler.progress import Progress

MAX_TEAMS = 1000
"""Largest league ``factorize`` accepts (``K_1000``: about 500 000 pairs of rounds to verify)."""

SPORADIC_P1F = {
    16: "Anderson 1973 (from memory)",
    28: "starter/field construction (attribution from memory)",
    36: "E. Seah & D. R. Stinson, Discrete Math. 70 (1988) (from memory)",
    40: "E. Seah & D. R. Stinson, Congr. Numer. (c. 1988) (from memory)",
    50: "E. Ihrig, E. Seah & D. R. Stinson, JCMCC 1 (1987) (from memory)",
    52: "A. J. Wolfe, J. Combin. Des. 17 (2009) (from memory)",
    56: "D. A. Pike, J. Combin. Des. 27 (2019) (from memory)",
    **{
        n: "listed on the WEGA encyclopedia page '1-Factorization of K_2n'"
        for n in (126, 170, 244, 344, 730)
    },
}
"""Orders with a perfect one-factorization outside the two prime families (docs/
one-factorizations.md §1; the WEGA list is verified, the attributions mostly from memory)."""

PERFECT_SEARCH_SHARE = 0.5


def is_prime(k: int) -> bool:
    """Trial division (``k`` is at most about 1000 here).

    Parameters
    ----------
    k : int
        The number to test.

    Returns
    -------
    bool
        True for a prime; False for ``k < 2``.

    Examples
    --------
    >>> [k for k in range(20) if is_prime(k)]
    [2, 3, 5, 7, 11, 13, 17, 19]
    """
    if k < 2:
        return False
    return all(k % d for d in range(2, math.isqrt(k) + 1))


def known_perfect(n: int) -> tuple[bool, str]:
    """Is a perfect one-factorization of ``K_n`` known (docs/one-factorizations.md §1)? And why.

    Parameters
    ----------
    n
        The even order.

    Returns
    -------
    tuple of (bool, str)
        Whether one is known, and the construction or source that says so (or why not).

    References
    ----------
    ``docs/one-factorizations.md`` §1.

    Examples
    --------
    >>> known_perfect(10)
    (True, 'n / 2 = 5 is prime (GA_n, Anderson 1973)')
    >>> known_perfect(64)[0]
    False
    """
    if n <= 2:
        return True, "K_2 has a single round"
    if is_prime(n - 1):
        return True, f"n - 1 = {n - 1} is prime (GK_n, Kotzig 1964)"
    if n % 2 == 0 and is_prime(n // 2):
        return True, f"n / 2 = {n // 2} is prime (GA_n, Anderson 1973)"
    if n in SPORADIC_P1F:
        return True, f"sporadic order: {SPORADIC_P1F[n]}"
    return False, (
        "no perfect one-factorization of this order is known to this program "
        "(64 is believed to be the smallest open order; Kotzig's conjecture says one exists)"
    )


def _check_teams(teams: object) -> int:
    if isinstance(teams, bool) or not isinstance(teams, numbers.Integral):
        raise InputError(
            f"the number of teams must be a whole number, got {teams!r}", location="teams"
        )
    teams = int(teams)
    if teams < 2:
        raise InputError(f"a league needs at least 2 teams, got {teams}", location="teams")
    if teams > MAX_TEAMS:
        raise InputError(
            f"at most {MAX_TEAMS} teams are supported, got {teams}", location="teams"
        )
    return teams


def _check_seed_budget(seed, budget) -> float:
    if isinstance(seed, bool) or not isinstance(seed, numbers.Integral):
        raise InputError(f"the seed must be a whole number, got {seed!r}", location="seed")
    if isinstance(budget, bool) or not isinstance(budget, int | float):
        raise InputError(f"the time budget must be a number of seconds, got {budget!r}",
                         location="budget")
    if not math.isfinite(budget) or budget <= 0:
        raise InputError(f"the time budget must be positive seconds, got {budget!r}",
                         location="budget")
    return float(budget)


def _finish(f: Factorization, teams: int, info: dict) -> Factorization:
    details = dict(f.details)
    details.update(info)
    details["teams"] = teams
    details["bye"] = teams % 2 == 1
    if details["bye"]:
        details["bye_vertex"] = f.n - 1
    return Factorization(f.n, f.rounds, f.method, f.source, details)


def factorize(
    teams: int, *, seed: int = 0, budget: float = 10.0, progress: Progress | None = None
) -> Factorization:
    """A one-factorization for a single round robin of ``teams`` teams (perfect when possible).

    ``budget`` (nominal seconds, converted to fixed work so the result depends only on
    ``teams`` and ``seed``) is used only for orders without a formula or catalogue entry.
    ``progress(message, fraction)`` is called during searches.

    Parameters
    ----------
    teams
        Number of teams, 2 to :data:`MAX_TEAMS`; an odd number adds a bye vertex ``n - 1``.
    seed
        Seed of any search (same ``teams`` and ``seed``: same factorization).
    budget
        Nominal seconds for a search, converted to a fixed amount of work.
    progress
        Called as ``progress(message, fraction)`` during searches.

    Returns
    -------
    Factorization
        A one-factorization of ``K_n`` (``n = teams + teams % 2``); ``details`` records the bye,
        whether a perfect one is known to exist for ``n`` and what was tried.

    Raises
    ------
    InputError
        For a number of teams that is not a whole number in range, or a bad seed or budget.

    References
    ----------
    Module docstring (Kotzig 1964; Anderson 1973; Wallis 1997); ``docs/one-factorizations.md``
    and ``docs/factorization-search.md``.

    Examples
    --------
    Seven teams use ``K_8``, whose circle factorization is perfect (7 is prime):

    >>> from scheduler.factorization import factorize, verify_rounds
    >>> seven = factorize(7)
    >>> seven.n, seven.method, seven.details["bye"]
    (8, 'circle GK_8', True)
    >>> verify_rounds(seven.n, seven.rounds).perfect
    True
    >>> factorize(1)
    Traceback (most recent call last):
    ...
    scheduler.errors.InputError: teams: a league needs at least 2 teams, got 1
    """
    teams = _check_teams(teams)
    budget = _check_seed_budget(seed, budget)
    seed = int(seed)
    n = teams + teams % 2
    known, reason = known_perfect(n)
    info: dict = {"p1f_known": known, "p1f_reason": reason, "tried": []}
    tried = info["tried"]

    if n == 2 or is_prime(n - 1):
        tried.append("circle GK_n")
        return _finish(circle_factorization(n), teams, info)
    if is_prime(n // 2):
        tried.append("Anderson GA_n")
        return _finish(anderson_factorization(n), teams, info)
    tried.append("catalogue")
    f = catalogue_factorization(n)
    if f is not None:
        return _finish(f, teams, info)

    remaining = budget
    if known:
        start = time.perf_counter()
        m = n - 1
        classes = (m - 1) // 2
        share = budget * PERFECT_SEARCH_SHARE
        if progress:
            progress(f"searching for a perfect starter of order {m}", 0.0)
        found, record = near_perfect_starter(
            n, seed=seed, work=int(share * NODES_PER_SECOND), beat=m * classes - 1,
            clock_limit=clock_cap(share), prune=False,
        )
        tried.append(f"perfect-starter search (seed {seed}, {record['nodes']} nodes)")
        info["perfect_search"] = record
        if found is not None:
            group = found.details["group"]
            f = Factorization(
                n, found.rounds, f"perfect starter in {group} (found by search)",
                f"{found.source}; perfect starter found by this project's search, seed {seed}",
                dict(found.details),
            )
            return _finish(f, teams, info)
        remaining = max(budget - share, 0.1 * budget)
        if progress:
            progress(
                f"no perfect starter within {time.perf_counter() - start:.1f}s",
                PERFECT_SEARCH_SHARE,
            )

    tried.append("best available (GK, GA, near-perfect starters, Kempe annealing)")

    def sub_progress(message: str, fraction: float) -> None:
        if progress:
            done = 1.0 - remaining / budget
            progress(message, done + fraction * (remaining / budget))

    f = best_available(n, seed=seed, budget=remaining, progress=sub_progress)
    return _finish(f, teams, info)
