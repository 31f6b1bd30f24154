"""Legs and double-round-robin scheme, read from the fixtures (never from the season's labels).

* The number of legs is the most common number of meetings of a pair of teams.
* The leg of a round is the ``leg`` written on its fixtures when the fixtures name more than
  one leg; otherwise, with k > 1 legs and a number of rounds divisible by k, the rounds are cut
  into k equal consecutive blocks.
* The scheme compares each later round's pairing with the leg-1 rounds (venues swapped in every
  game of legs 2, 4, ...): leg 2 = leg-1 rounds 1, 2, ..., n-1 is *mirrored*; 2, ..., n-1, 1
  *french*; n-1, 1, ..., n-2 *english*; n-1, ..., 1 *inverted*; later legs repeat the step
  (:mod:`scheduler.leg_schemes`, ``docs/leg-schemes.md``); anything else is *free*.

A round's *pairing key* is its row of partners (with the bye vertex for an odd league), so two
rounds have the same key exactly when they pair the same teams.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from scheduler.fairness.table import SeasonTable
from scheduler.leg_schemes import flipped, scheme_of_maps


@dataclass(frozen=True)
class LegStructure:
    """The legs of a season as read from its fixtures (:func:`detect_legs`).

    Parameters
    ----------
    legs
        Number of legs: the most common number of meetings of a pair.
    round_leg
        Leg (1-based) of each round (0 for a round with no fixtures).
    scheme
        ``"single"``, ``"mirrored"``, ``"french"``, ``"english"``, ``"inverted"`` or
        ``"free"`` (``docs/leg-schemes.md``).
    meetings_mode
        The most common number of meetings of a pair of teams.
    """

    legs: int
    round_leg: np.ndarray
    """Leg (1-based) of each round (0 for a round with no fixtures)."""
    scheme: str
    meetings_mode: int


def partner_rows(table: SeasonTable) -> tuple[np.ndarray, int]:
    """``(rounds, N)`` partner table with a bye vertex ``N - 1 = n`` for an odd league.

    For an odd league a team that does not play is paired with the bye vertex, and the bye
    vertex with the (first) team that sits out. Entries stay -1 where no partner exists.

    Parameters
    ----------
    table
        The indexed season.

    Returns
    -------
    tuple of (numpy.ndarray, int)
        The partner table ``rows[r, v]`` and ``N``, the number of vertices (``n``, or
        ``n + 1`` for an odd league).

    Examples
    --------
    >>> from scheduler.fairness.table import build_table
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm", "Oak"), (Fixture(1, "Ash", "Elm"),))
    >>> rows, vertices = partner_rows(build_table(season))
    >>> rows.tolist(), vertices
    ([[1, 0, 3, 2]], 4)
    """
    n = table.n
    if n % 2 == 0:
        return table.opponent.copy(), n
    rows = np.full((table.rounds, n + 1), -1, dtype=np.int64)
    rows[:, :n] = table.opponent
    idle = table.plays == 0
    rows[:, :n][idle] = n
    any_idle = idle.any(axis=1)
    first_idle = np.argmax(idle, axis=1)
    rows[any_idle, n] = first_idle[any_idle]
    return rows, n + 1


def pair_meetings(table: SeasonTable) -> tuple[np.ndarray, np.ndarray]:
    """Unique pair keys ``a * n + b`` (a < b) and how often each pair meets.

    Parameters
    ----------
    table
        The indexed season; games of a team against itself are left out.

    Returns
    -------
    tuple of numpy.ndarray
        (sorted unique keys, meetings of each key).

    Examples
    --------
    >>> from scheduler.fairness.table import build_table
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"),
    ...                 (Fixture(1, "Ash", "Elm"), Fixture(2, "Elm", "Ash")))
    >>> [values.tolist() for values in pair_meetings(build_table(season))]
    [[1], [2]]
    """
    n = max(table.n, 1)
    lo = np.minimum(table.home, table.away)
    hi = np.maximum(table.home, table.away)
    ok = lo != hi
    keys = lo[ok] * n + hi[ok]
    return np.unique(keys, return_counts=True)


def detect_legs(table: SeasonTable) -> LegStructure:
    """The number of legs, the leg of each round and the scheme, read from the fixtures.

    Parameters
    ----------
    table
        The indexed season.

    Returns
    -------
    LegStructure
        Legs, ``round_leg`` and the scheme (``free`` when no scheme fits).

    References
    ----------
    ``docs/leg-schemes.md``.
    """
    _, counts = pair_meetings(table)
    if len(counts):
        values, freq = np.unique(counts, return_counts=True)
        mode = int(values[np.argmax(freq)])
    else:
        mode = 1
    rounds = table.rounds
    round_leg = np.zeros(rounds, dtype=np.int64)
    written = np.unique(table.leg) if len(table.leg) else np.array([1])
    if len(written) > 1 or (len(written) == 1 and written[0] != 1):
        # Legs named on the fixtures: a round's leg is the largest leg of its fixtures.
        np.maximum.at(round_leg, table.round, table.leg)
        legs = int(max(int(written.max()), 1))
    elif mode > 1 and rounds % mode == 0:
        per = rounds // mode
        round_leg = np.arange(rounds, dtype=np.int64) // per + 1
        legs = mode
    else:
        round_leg[:] = 1
        legs = 1
    scheme = _detect_scheme(table, round_leg, legs)
    return LegStructure(legs=legs, round_leg=round_leg, scheme=scheme, meetings_mode=mode)


def _detect_scheme(table: SeasonTable, round_leg: np.ndarray, legs: int) -> str:
    """The fixed scheme every later leg follows (:func:`scheduler.leg_schemes.leg_maps`: the
    pairings of leg 1 in the scheme's order, venues swapped on every other leg), else "free"."""
    if legs == 1:
        return "single"
    leg1 = np.flatnonzero(round_leg == 1)
    if len(leg1) == 0:
        return "free"
    rows, _ = partner_rows(table)
    key1 = {rows[r].tobytes(): i for i, r in enumerate(leg1)}
    sign = table.venue_sign
    maps = []
    for leg in range(2, legs + 1):
        rounds = np.flatnonzero(round_leg == leg)
        if len(rounds) != len(leg1):
            return "free"
        copied = []
        for r in rounds:
            i = key1.get(rows[r].tobytes())
            if i is None:
                return "free"
            copied.append(i)
        # Venues swapped in every game of an even-numbered leg, kept in an odd-numbered one.
        factor = -1 if flipped(leg - 1) else 1
        if not np.array_equal(sign[rounds], factor * sign[leg1[copied]]):
            return "free"
        maps.append(tuple(copied))
    return scheme_of_maps((tuple(range(len(leg1))), *maps))


def separation(table: SeasonTable) -> tuple[int | None, int | None]:
    """Least and largest number of rounds strictly between two consecutive meetings of the
    same pair (over all pairs that meet more than once).

    Parameters
    ----------
    table
        The indexed season.

    Returns
    -------
    tuple of (int or None, int or None)
        (least, largest) separation; ``(None, None)`` when no pair meets twice.

    References
    ----------
    ``docs/leg-schemes.md`` (separation of each leg scheme).

    Examples
    --------
    >>> from scheduler.fairness.table import build_table
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"),
    ...                 (Fixture(1, "Ash", "Elm"), Fixture(4, "Elm", "Ash")))
    >>> separation(build_table(season))
    (2, 2)
    """
    n = max(table.n, 1)
    lo = np.minimum(table.home, table.away)
    hi = np.maximum(table.home, table.away)
    ok = lo != hi
    keys = lo[ok] * n + hi[ok]
    rnd = table.round[ok]
    if len(keys) < 2:
        return None, None
    order = np.lexsort((rnd, keys))
    keys, rnd = keys[order], rnd[order]
    same = keys[1:] == keys[:-1]
    if not same.any():
        return None, None
    between = (rnd[1:] - rnd[:-1] - 1)[same]
    return int(between.min()), int(between.max())
