"""Leg schemes of a multi-leg round robin: index maps, separations and break lower bounds.

One pure module (no imports from the rest of the package) shared by the config checks, the
balancer and the fairness figures, so that all three agree. The derivations are written out in
``docs/leg-schemes.md``.

Leg 1 is a single round robin of ``R`` rounds (``R = n - 1`` for ``n`` even; an odd league of
``n`` teams plays ``R = n`` rounds on ``n + 1`` vertices, the extra one being the bye). Every later
leg repeats the pairings of the previous leg, venues swapped, in the order given by the scheme.
With ``σ(s)`` the previous-leg position copied into position ``s`` (0-based):

- mirrored ``σ(s) = s``; French ``σ(s) = s + 1 (mod R)`` (leg 2 = rounds 2..R, 1);
  English ``σ(s) = s - 1 (mod R)`` (leg 2 = rounds R, 1..R-1); inverted ``σ(s) = R - 1 - s``;
  free: every leg has an order of its own.

More than two legs repeat the scheme leg after leg and alternate the venues, so leg ``l``
(0-based) copies leg-1 position ``σ^l(s)``, venues swapped when ``l`` is odd.

References
----------
D. Goossens and F. Spieksma, "Soccer schedules in Europe: an overview", J. Scheduling 15 (2012)
641-651 (the schemes; from memory). D. de Werra, "Scheduling in sports", Annals of Discrete
Mathematics 11 (1981) 381-395 (the single round robin bound n - 2).
"""

from __future__ import annotations

from dataclasses import dataclass

FIXED_SCHEMES = ("mirrored", "french", "english", "inverted")
"""Schemes whose later legs follow from leg 1."""

SCHEMES = (*FIXED_SCHEMES, "free")
"""Every scheme a league may name."""


def sigma(scheme: str, rounds: int) -> tuple[int, ...]:
    """The index map of a fixed scheme: position ``s`` of a leg copies position ``σ[s]`` of the
    leg before.

    Parameters
    ----------
    scheme : str
        One of :data:`FIXED_SCHEMES`.
    rounds : int
        Rounds per leg.

    Returns
    -------
    tuple of int
        ``σ[s]`` for every position ``s`` of a leg.

    Raises
    ------
    ValueError
        For a scheme without a fixed order (a programming error: config validates schemes).

    Examples
    --------
    >>> sigma("french", 4)
    (1, 2, 3, 0)
    >>> sigma("inverted", 4)
    (3, 2, 1, 0)
    """
    r = rounds
    if scheme == "mirrored":
        return tuple(range(r))
    if scheme == "french":
        return tuple((s + 1) % r for s in range(r))
    if scheme == "english":
        return tuple((s - 1) % r for s in range(r))
    if scheme == "inverted":
        return tuple(r - 1 - s for s in range(r))
    raise ValueError(f"no fixed order for scheme {scheme!r}")


def leg_maps(scheme: str, legs: int, rounds: int) -> tuple[tuple[int, ...], ...] | None:
    """For a fixed scheme, ``maps[l][s]``: the leg-1 position that leg ``l`` plays at position
    ``s``; ``None`` for the free scheme with more than one leg.

    Parameters
    ----------
    scheme : str
        One of :data:`SCHEMES`.
    legs : int
        Number of single round robins (1 or more).
    rounds : int
        Rounds per leg (``R``).

    Returns
    -------
    tuple of tuple of int or None
        One map per leg, leg 1 the identity; None when the scheme leaves later legs free.

    References
    ----------
    ``docs/leg-schemes.md`` (the index maps of the schemes).

    Examples
    --------
    >>> leg_maps("english", 3, 3)
    ((0, 1, 2), (2, 0, 1), (1, 2, 0))
    >>> leg_maps("free", 2, 3) is None
    True
    """
    if scheme == "free" and legs > 1:
        return None
    if scheme == "free":
        return (tuple(range(rounds)),)
    step = sigma(scheme, rounds)
    maps = [tuple(range(rounds))]
    for _ in range(1, legs):
        prev = maps[-1]
        maps.append(tuple(prev[step[s]] for s in range(rounds)))
    return tuple(maps)


def flipped(leg: int) -> bool:
    """Legs alternate venues: leg ``l`` (0-based) swaps the venues of leg 1 when ``l`` is odd.

    Parameters
    ----------
    leg : int
        The leg, 0-based.

    Returns
    -------
    bool
        True when the leg plays every pairing of leg 1 with home and away swapped.

    Examples
    --------
    >>> [flipped(leg) for leg in range(3)]
    [False, True, False]
    """
    return leg % 2 == 1


def scheme_of_maps(maps: tuple[tuple[int, ...], ...]) -> str:
    """The fixed scheme whose index maps are ``maps`` (all legs), else ``"free"``.

    Parameters
    ----------
    maps : tuple of tuple of int
        The index maps of every leg, as :func:`leg_maps` makes them (read back from a planned
        or audited season).

    Returns
    -------
    str
        The first of :data:`FIXED_SCHEMES` that gives exactly these maps, or ``"free"``. With
        one leg every fixed scheme matches, and ``"mirrored"`` is returned.

    Examples
    --------
    >>> scheme_of_maps(leg_maps("french", 3, 5))
    'french'
    >>> scheme_of_maps(((0, 1, 2), (1, 0, 2)))
    'free'
    """
    legs, rounds = len(maps), len(maps[0]) if maps else 0
    for scheme in FIXED_SCHEMES:
        if leg_maps(scheme, legs, rounds) == tuple(tuple(m) for m in maps):
            return scheme
    return "free"


def separations(scheme: str, legs: int, rounds: int) -> tuple[int, ...]:
    """Fixed scheme: for every leg-1 position, the fewest rounds strictly between two
    consecutive meetings of the pair that plays there. Empty for one leg or the free scheme.

    Parameters
    ----------
    scheme : str
        One of :data:`SCHEMES`.
    legs : int
        Number of single round robins (1 or more).
    rounds : int
        Rounds per leg (``R``).

    Returns
    -------
    tuple of int
        One separation (rounds strictly between, ``>= 0``) per leg-1 position, the least over
        every pair of consecutive legs.

    References
    ----------
    ``docs/leg-schemes.md``.

    Examples
    --------
    >>> separations("french", 2, 5)
    (8, 3, 3, 3, 3)
    """
    maps = leg_maps(scheme, legs, rounds)
    if maps is None or legs < 2:
        return ()
    where = [{p: s for s, p in enumerate(m)} for m in maps]
    out = []
    for p in range(rounds):
        seps = [rounds + where[i + 1][p] - where[i][p] - 1 for i in range(legs - 1)]
        out.append(min(seps))
    return tuple(out)


def least_separation(scheme: str, legs: int, rounds: int) -> int | None:
    """The fewest rounds strictly between two meetings of a pair that the scheme allows at all
    (``None`` for one leg or the free scheme, which fixes nothing).

    Parameters
    ----------
    scheme : str
        One of :data:`SCHEMES`.
    legs : int
        Number of single round robins (1 or more).
    rounds : int
        Rounds per leg (``R``).

    Returns
    -------
    int or None
        The least of :func:`separations`; None when the scheme fixes no separation.

    Examples
    --------
    >>> least_separation("mirrored", 2, 9), least_separation("english", 2, 9)
    (8, 0)
    """
    seps = separations(scheme, legs, rounds)
    return min(seps) if seps else None


@dataclass(frozen=True)
class BreakBound:
    """A lower bound on the total number of breaks and the argument it rests on.

    Parameters
    ----------
    value : int
        The bound: no timetable of the league has fewer breaks in total (byes skipped).
    reason : str
        The argument in words, naming its source (shown beside the break figures).

    Examples
    --------
    >>> BreakBound(4, "de Werra 1981").value
    4
    """

    value: int
    reason: str


def leg_break_bound(n: int, odd: bool) -> int:
    """Breaks inside one single-round-robin leg on ``n`` (even) vertices: at least ``n - 2`` for
    an even league (de Werra 1981), 0 for an odd league (a break-free leg exists).

    Parameters
    ----------
    n : int
        Number of vertices of the leg (even: the teams, plus the bye vertex for an odd league).
    odd : bool
        True when the league has an odd number of teams (one vertex is the bye).

    Returns
    -------
    int
        The least number of breaks one leg can have.

    References
    ----------
    D. de Werra, "Scheduling in sports", Annals of Discrete Mathematics 11 (1981) 381-395.

    Examples
    --------
    >>> leg_break_bound(10, False), leg_break_bound(10, True)
    (8, 0)
    """
    return 0 if odd else n - 2


def break_lower_bound(teams: int, legs: int, scheme: str) -> BreakBound:
    """The best proven lower bound on a season's total breaks (byes skipped).

    Derivations in ``docs/leg-schemes.md``; every value is checked against an exhaustive search
    over all timetables of 3 to 6 teams in ``tests/balance/test_leg_schemes.py``.

    Parameters
    ----------
    teams : int
        Number of teams (``n``).
    legs : int
        Number of single round robins.
    scheme : str
        ``single``, ``free`` or one of :data:`FIXED_SCHEMES` (``single`` and any scheme with
        one leg give the single round robin bound).

    Returns
    -------
    BreakBound
        The bound and the argument it rests on.

    References
    ----------
    D. de Werra, "Scheduling in sports", Annals of Discrete Mathematics 11 (1981) 381-395.

    Examples
    --------
    >>> break_lower_bound(6, 1, "single").value
    4
    >>> break_lower_bound(6, 3, "mirrored").value
    20
    >>> break_lower_bound(5, 2, "mirrored").value
    5
    """
    if teams < 2 or legs < 1:
        return BreakBound(0, "no games")
    n = teams
    if n % 2 == 1:
        if scheme == "mirrored" and legs >= 2:
            return BreakBound(
                n * (legs - 1),
                "odd league, mirrored: every team with a break-free leg breaks at each leg "
                "junction (derived in docs/leg-schemes.md; checked by exhaustive search)",
            )
        return BreakBound(0, "odd league: a break-free single round robin exists (de Werra 1981)")
    if legs == 1 or scheme == "single":
        return BreakBound(n - 2, "de Werra 1981: a single round robin has at least n-2 breaks")
    if scheme == "mirrored":
        return BreakBound(
            (n - 2) * (2 * legs - 1),
            f"mirrored, {legs} legs: at least (n-2)(2L-1) breaks (de Werra 1981 per leg, plus "
            "a break at every leg junction for each team with one break per leg; derived in "
            "docs/leg-schemes.md)",
        )
    if scheme == "french" and legs == 2:
        return BreakBound(
            2 * n,
            "French scheme: every team has at least 2 breaks (derived in docs/leg-schemes.md; "
            "checked by exhaustive search)",
        )
    if scheme in ("english", "inverted") and legs == 2:
        return BreakBound(
            2 * n - 4,
            f"{scheme} scheme: 2n-4 breaks (de Werra 1981 per leg; derived in "
            "docs/leg-schemes.md; checked by exhaustive search)",
        )
    return BreakBound(
        legs * (n - 2), f"de Werra 1981 applied to each of the {legs} legs: legs x (n-2)")
