"""Carry-over effects of a round order, and a local search that lowers them.

Russell's carry-over matrix (K. G. Russell, "Balancing carry-over effects in round robin
tournaments", Biometrika 67(1):127-131, 1980): ``c[i][j]`` counts the teams ``t`` that meet ``i``
in some round and ``j`` in the next, with the last round of the single round robin followed by
the first (the cyclic convention of the later literature). The carry-over effects value is
``COE = Σ c[i][j]²``; for ``n`` teams (``n`` even) ``n(n-1) <= COE <= (n-1)(n² - 6n + 12)``,
the upper value being the circle method's (Lambrechts, Ficker, Goossens & Spieksma 2018,
Math. Programming 172:277-302, from memory); the one definition is :mod:`scheduler.carry_over`.
It is measured on leg 1 over the ``n`` vertices of the factorization (an odd league's bye counts
as a dummy team).

The local search swaps two rounds of leg 1 (first improvement, pairs in a fixed order, a fixed
number of passes: deterministic) and keeps a swap only when the carry-over value falls and the
breaks of the current home/away assignment do not rise. The caller re-solves the timetable with
the new order so that every hard rule is checked again by the model.
"""

from __future__ import annotations

from collections.abc import Sequence

from scheduler import leg_schemes
from scheduler.balance.anneal import breaks_of
from scheduler.carry_over import carry_over_of_rounds
from scheduler.factorization.model import Round


def improve_order(
    fact_rounds: Sequence[Round],
    n: int,
    order: Sequence[int],
    home_first: dict[tuple[int, int], bool],
    scheme: str,
    legs: int,
    other_orders: Sequence[Sequence[int]] | None,
    bye: int | None,
    *,
    passes: int = 3,
    keep_breaks: bool = True,
) -> tuple[int, ...]:
    """A leg-1 order with lower carry-over and, when ``keep_breaks``, no more breaks (see the
    module docstring; ``keep_breaks=False`` when carry-over weighs more than breaks).

    Parameters
    ----------
    fact_rounds
        The rounds of the factorization (vertex games).
    n
        Number of vertices (a bye counts as a dummy team).
    order
        The current leg-1 order of the rounds.
    home_first
        ``home_first[(a, b)]``, ``a < b``: is ``a`` at home in the first meeting.
    scheme, legs
        The leg scheme (:mod:`scheduler.leg_schemes`) and number of legs.
    other_orders
        The orders of the later legs for the free scheme (``None`` otherwise).
    bye
        The bye vertex, or ``None``.
    passes
        Passes over all pairs of rounds.
    keep_breaks
        Refuse swaps that add breaks.

    Returns
    -------
    tuple of int
        The improved leg-1 order (``order`` itself when no swap helps).

    References
    ----------
    K. G. Russell, Biometrika 67 (1980) 127-131; ``docs/carry-over.md``.
    """
    R = len(order)
    maps = leg_schemes.leg_maps(scheme, legs, R)

    def all_orders(o):
        if maps is None:
            return [list(o), *[list(x) for x in (other_orders or [])]]
        return [[o[mp[q]] for q in range(R)] for mp in maps]

    cur = list(order)
    cur_coe = carry_over_of_rounds([fact_rounds[k] for k in cur], n)
    cur_br = breaks_of(fact_rounds, home_first, all_orders(cur), bye)
    for _ in range(passes):
        improved = False
        for i in range(R):
            for j in range(i + 1, R):
                trial = list(cur)
                trial[i], trial[j] = trial[j], trial[i]
                coe = carry_over_of_rounds([fact_rounds[k] for k in trial], n)
                if coe >= cur_coe:
                    continue
                br = breaks_of(fact_rounds, home_first, all_orders(trial), bye)
                if keep_breaks and br > cur_br:
                    continue
                cur, cur_coe, cur_br = trial, coe, br
                improved = True
        if not improved:
            break
    return tuple(cur)
