"""Mixing: how well the distinct pairings of a season mix, as a one-factorization of K_n.

The distinct pairings are taken in order of first appearance (normally the n - 1 rounds of
leg 1; later legs repeat them). An odd league adds a bye vertex: the team that sits out is
paired with it. Two pairings mix perfectly when their union is one Hamiltonian cycle (with a
bye: one Hamiltonian path through the real teams); a one-factorization in which every pair of
rounds does is *perfect* (A. Kotzig 1964; W. D. Wallis, *One-Factorizations*, Kluwer 1997,
ch. 16). The count and the list of imperfect pairs come from the project's independent verifier
:func:`scheduler.factorization.verify.verify_rounds`.

The *mixing matrix* for the report's picture gives, for each pair of pairings, the number of
cycles of their union (1 = perfect). The union of two perfect matchings with partner maps
``p``, ``q`` splits into even cycles; each cycle of length 2L is two orbits of length L of the
permutation ``q o p``, so the number of union cycles is half the number of orbits. Orbits are
counted for a block of pairs at once by pointer doubling (after k squarings every vertex knows
the least vertex among its next 2^k images), vectorised with numpy.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from scheduler.factorization.verify import verify_rounds
from scheduler.fairness.legs import partner_rows
from scheduler.fairness.model import ImperfectRoundPair
from scheduler.fairness.table import SeasonTable

MIXING_MATRIX_MAX = 256
"""Largest number of distinct pairings for which the cycle-count matrix is filled in."""

MAX_LISTED = 50
"""How many imperfect pairs are listed by name (all are counted)."""


@dataclass(frozen=True)
class MixingFigures:
    """How well the rounds of a season mix (:func:`mixing_figures`).

    Parameters
    ----------
    valid
        ``True`` when the distinct pairings measured form one single round robin.
    rounds
        The season rounds (1-based) whose pairings were measured, one per distinct pairing.
    perfect_pairs
        Pairs of those rounds whose union is one Hamiltonian cycle.
    pairs
        All pairs of those rounds examined (0 when the rounds are not complete pairings).
    perfect
        ``True`` when every pair is perfect (a perfect one-factorization).
    imperfect
        The first :data:`MAX_LISTED` imperfect pairs, by season round.
    imperfect_total
        How many pairs are imperfect.
    matrix
        Number of cycles of the union of each two measured rounds (0 on the diagonal); empty
        when not computed.
    note
        What was measured and what was left out, in words.
    problems
        Why the pairings are not one single round robin, from the verifier.

    References
    ----------
    ``docs/one-factorizations.md``.
    """

    valid: bool
    rounds: tuple[int, ...]
    perfect_pairs: int
    pairs: int
    perfect: bool
    imperfect: tuple[ImperfectRoundPair, ...]
    imperfect_total: int
    matrix: tuple[tuple[int, ...], ...]
    note: str
    problems: tuple[str, ...]


def distinct_pairings(
    table: SeasonTable, among: np.ndarray | None = None
) -> tuple[list[int], np.ndarray, int]:
    """Rounds (0-based) whose pairing appears for the first time, the partner table and N.

    Parameters
    ----------
    table
        The indexed season.
    among
        A boolean mask over the rounds restricting the rounds looked at; ``None`` for all.

    Returns
    -------
    tuple
        (first rounds of each distinct pairing, partner table of :func:`partner_rows`,
        number of vertices ``N``).

    Examples
    --------
    >>> from scheduler.fairness.table import build_table
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"),
    ...                 (Fixture(1, "Ash", "Elm"), Fixture(2, "Elm", "Ash")))
    >>> distinct_pairings(build_table(season))[0]
    [0]
    """
    rows, big_n = partner_rows(table)
    played = np.zeros(table.rounds, dtype=bool)
    played[table.round] = True
    if among is not None:
        played &= among
    seen: set[bytes] = set()
    first: list[int] = []
    for r in np.flatnonzero(played):
        key = rows[r].tobytes()
        if key not in seen:
            seen.add(key)
            first.append(int(r))
    return first, rows, big_n


def _round_games(table: SeasonTable, chosen: list[int], big_n: int) -> list[np.ndarray]:
    """The games of each chosen round as ``(k, 2)`` arrays, bye edges added for odd leagues."""
    order = np.argsort(table.round, kind="stable")
    rnd_sorted = table.round[order]
    starts = np.searchsorted(rnd_sorted, chosen, side="left")
    stops = np.searchsorted(rnd_sorted, chosen, side="right")
    out = []
    n = table.n
    for r, a, b in zip(chosen, starts, stops, strict=True):
        idx = order[a:b]
        games = np.stack([table.home[idx], table.away[idx]], axis=1)
        if big_n != n:
            idle = np.flatnonzero(table.plays[r] == 0)
            bye = np.stack([idle, np.full(len(idle), big_n - 1)], axis=1)
            games = np.concatenate([games, bye])
        out.append(games)
    return out


def union_cycle_counts(partners: np.ndarray, block: int = 1 << 22) -> np.ndarray:
    """``(R, R)`` matrix of the number of cycles of the union of rounds ``i`` and ``j``.

    The union of two perfect matchings is a set of disjoint even cycles; one cycle means the
    pair of rounds is perfect. Cycles are counted by pointer jumping on the permutation
    ``p_j o p_i`` (each cycle of the union is two of its cycles), vectorised over pairs.

    Parameters
    ----------
    partners
        ``partners[r, v]``: the partner of vertex ``v`` in round ``r``, a fixed-point-free
        involution per round (``(R, N)`` integer array).
    block
        Number of array entries handled at once (memory bound).

    Returns
    -------
    numpy.ndarray
        Symmetric ``(R, R)`` integer matrix of cycle counts, 0 on the diagonal.

    References
    ----------
    ``docs/one-factorizations.md`` (perfect pairs of rounds).

    Examples
    --------
    >>> import numpy as np
    >>> rounds = np.array([[1, 0, 3, 2], [2, 3, 0, 1], [3, 2, 1, 0]])
    >>> union_cycle_counts(rounds).tolist()
    [[0, 1, 1], [1, 0, 1], [1, 1, 0]]
    """
    r_count, n = partners.shape
    first, second = np.triu_indices(r_count, k=1)
    counts = np.zeros(len(first), dtype=np.int64)
    steps = max(1, int(np.ceil(np.log2(max(n, 2)))))
    per = max(1, block // max(n, 1))
    verts = np.arange(n)
    for start in range(0, len(first), per):
        a = first[start : start + per]
        b = second[start : start + per]
        # q = p_b o p_a, one row per pair
        q = np.take_along_axis(partners[b], partners[a], axis=1)
        least = np.broadcast_to(verts, q.shape).copy()
        jump = q
        for _ in range(steps):
            least = np.minimum(least, np.take_along_axis(least, jump, axis=1))
            jump = np.take_along_axis(jump, jump, axis=1)
        counts[start : start + per] = (least == verts).sum(axis=1) // 2
    matrix = np.zeros((r_count, r_count), dtype=np.int64)
    matrix[first, second] = counts
    matrix[second, first] = counts
    return matrix


def mixing_figures(table: SeasonTable, round_leg: np.ndarray | None = None) -> MixingFigures:
    """Mixing of the distinct pairings. When a multi-leg season has more distinct pairings than
    one single round robin (a later leg does not repeat leg 1), only leg 1 is measured.

    Parameters
    ----------
    table
        The indexed season.
    round_leg
        The leg of each round (:func:`scheduler.fairness.legs.detect_legs`); ``None`` when
        unknown (all distinct pairings are measured).

    Returns
    -------
    MixingFigures
        Measured by the independent verifier
        (:func:`scheduler.factorization.verify.verify_rounds`).

    References
    ----------
    ``docs/one-factorizations.md``.

    Examples
    --------
    >>> from scheduler.fairness.table import build_table
    >>> from scheduler.season import Fixture, Season
    >>> games = [(1, "Ash", "Elm"), (1, "Oak", "Yew"), (2, "Elm", "Oak"),
    ...          (2, "Yew", "Ash"), (3, "Ash", "Oak"), (3, "Elm", "Yew")]
    >>> season = Season("Demo", "2031", ("Ash", "Elm", "Oak", "Yew"),
    ...                 tuple(Fixture(*game) for game in games))
    >>> figures = mixing_figures(build_table(season))
    >>> figures.valid, figures.perfect_pairs, figures.pairs, figures.perfect
    (True, 3, 3, True)
    """
    chosen, rows, big_n = distinct_pairings(table)
    extra = ""
    if round_leg is not None and len(chosen) > big_n - 1 and round_leg.max(initial=0) > 1:
        chosen, rows, big_n = distinct_pairings(table, round_leg == 1)
        extra = "; the later legs do not repeat leg 1's pairings, so leg 1 alone is measured"
    season_rounds = tuple(r + 1 for r in chosen)
    if big_n < 2 or not chosen:
        return MixingFigures(False, season_rounds, 0, 0, False, (), 0, (), "no games", ())
    games = _round_games(table, chosen, big_n)
    cert = verify_rounds(big_n, games, max_listed=MAX_LISTED)
    imperfect = tuple(
        ImperfectRoundPair(season_rounds[p.first], season_rounds[p.second], p.label)
        for p in cert.imperfect
        if p.first < len(season_rounds) and p.second < len(season_rounds)
    )
    matrix: tuple[tuple[int, ...], ...] = ()
    if cert.pairs and len(chosen) <= MIXING_MATRIX_MAX:
        m = union_cycle_counts(rows[chosen])
        matrix = tuple(tuple(int(v) for v in row) for row in m)
        note = "cycles of the union of each pair of distinct pairings (1 = perfect)"
    elif cert.pairs:
        note = (
            f"{len(chosen)} distinct pairings: the cycle-count matrix is only filled in up to "
            f"{MIXING_MATRIX_MAX}"
        )
    else:
        note = "not every round is a complete pairing: pairs of rounds were not examined"
    note += extra
    if not cert.valid:
        note += (
            "; the distinct pairings are not one single round robin (in mixing_problems, vertex "
            "k is team k of team_names counted from 0, the last vertex of an odd league the bye, "
            "and round k the (k+1)-th entry of mixing_rounds)"
        )
    return MixingFigures(
        valid=cert.valid,
        rounds=season_rounds,
        perfect_pairs=cert.perfect_pairs,
        pairs=cert.pairs,
        perfect=cert.perfect,
        imperfect=imperfect,
        imperfect_total=cert.imperfect_total,
        matrix=matrix,
        note=note,
        problems=cert.problems,
    )
