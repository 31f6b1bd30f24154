"""Value types of the schedule engine: a one-factorization of K_n and its certificate.

Vertices are ``0..n-1``; ``n`` is even. When a league has an odd number of teams the engine works
on ``n = teams + 1`` and vertex ``n - 1`` is the bye: the team paired with it sits out.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass, field
from typing import SupportsInt

# The verifier's result types live with the verifier; they are re-exported here so the value
# types of the engine stay importable from one module.
from scheduler.factorization.verify import Certificate, ImperfectPair, verify_rounds

__all__ = ["Certificate", "Factorization", "Game", "ImperfectPair", "Round", "normalise_round"]

Game = tuple[int, int]
"""A game between two vertices, stored with the smaller vertex first."""

Round = tuple[Game, ...]
"""A perfect matching of K_n: n/2 games, sorted."""


@dataclass(frozen=True)
class Factorization:
    """A one-factorization of K_n: ``n - 1`` rounds, each a perfect matching on ``0..n-1``.

    ``method`` names the construction (``"circle GK_n"``, ``"starter in Z_15"``, ...),
    ``source`` the publication it comes from, ``details`` anything needed to rebuild it
    (for a starter: the group and the starter pairs).

    Parameters
    ----------
    n : int
        The order: the number of vertices, even and at least 2.
    rounds : tuple of Round
        The ``n - 1`` rounds, each ``n / 2`` games ``(a, b)`` with ``a < b``, sorted
        (:func:`normalise_round`).
    method : str
        The construction, for example ``"circle GK_n"`` or ``"starter in Z_15"``.
    source : str
        The publication the construction comes from.
    details : dict, optional
        What is needed to rebuild it (for a starter: the group and the starter pairs); not
        compared.

    Raises
    ------
    ValueError
        For an odd order or an order below 2 (the rounds themselves are checked by
        :meth:`certificate`, not here).

    See Also
    --------
    scheduler.factorization.verify.verify_rounds : The independent verifier.

    References
    ----------
    ``docs/one-factorizations.md``; W. D. Wallis, *One-Factorizations*, Kluwer 1997.

    Examples
    --------
    >>> from scheduler.factorization import circle_factorization
    >>> gk6 = circle_factorization(6)
    >>> gk6.n, len(gk6.rounds), gk6.rounds[0]
    (6, 5, ((0, 5), (1, 4), (2, 3)))
    >>> gk6.certificate().perfect  # 5 is prime (Kotzig 1964)
    True
    """

    n: int
    rounds: tuple[Round, ...]
    method: str
    source: str
    details: dict = field(default_factory=dict, compare=False, hash=False)

    def __post_init__(self) -> None:
        if self.n < 2 or self.n % 2:
            raise ValueError(f"a one-factorization needs an even order n >= 2, got {self.n}")

    @property
    def bye_vertex(self) -> int:
        """The vertex that stands for the bye when the league is odd (by convention ``n - 1``)."""
        return self.n - 1

    def partner_table(self) -> list[list[int]]:
        """``table[r][v]`` is the vertex that ``v`` meets in round ``r``.

        Returns
        -------
        list of list of int
            ``(n - 1)`` rows of ``n`` vertices.

        Examples
        --------
        >>> from scheduler.factorization import circle_factorization
        >>> circle_factorization(6).partner_table()[0]
        [5, 4, 3, 2, 1, 0]
        """
        table = []
        for games in self.rounds:
            row = [-1] * self.n
            for a, b in games:
                row[a] = b
                row[b] = a
            table.append(row)
        return table

    def certificate(self, *, max_listed: int = 50) -> Certificate:
        """Run the independent verifier (``scheduler.factorization.verify``).

        Parameters
        ----------
        max_listed : int, optional
            At most this many imperfect pairs of rounds are listed (all are counted).

        Returns
        -------
        Certificate
            Validity, the number of pairs of rounds that mix perfectly, and the imperfect pairs.
        """
        return verify_rounds(self.n, self.rounds, max_listed=max_listed)

    def relabel(self, mapping: list[int] | tuple[int, ...]) -> Factorization:
        """The same factorization with vertex ``v`` renamed ``mapping[v]``.

        Parameters
        ----------
        mapping : list or tuple of int
            A permutation of ``0..n-1``: ``mapping[v]`` is the new name of vertex ``v``.

        Returns
        -------
        Factorization
            An isomorphic factorization, same method, source and details.

        Examples
        --------
        >>> from scheduler.factorization import circle_factorization
        >>> circle_factorization(6).relabel([1, 0, 2, 3, 4, 5]).rounds[0]
        ((0, 4), (1, 5), (2, 3))
        """
        rounds = tuple(
            tuple(sorted(_game(mapping[a], mapping[b]) for a, b in games))
            for games in self.rounds
        )
        return Factorization(self.n, rounds, self.method, self.source, dict(self.details))

    def reorder(self, order: list[int] | tuple[int, ...]) -> Factorization:
        """The same factorization with its rounds put in ``order``.

        Parameters
        ----------
        order : list or tuple of int
            A permutation of the round indices: new round ``i`` is old round ``order[i]``.

        Returns
        -------
        Factorization
            The same rounds in the new order (mixing is unchanged; breaks and carry-over
            may not be).
        """
        rounds = tuple(self.rounds[i] for i in order)
        return Factorization(self.n, rounds, self.method, self.source, dict(self.details))


def _game(first: int, second: int) -> Game:
    """The game of two vertices with the smaller vertex first."""
    return (first, second) if first <= second else (second, first)


def normalise_round(games: Iterable[Iterable[SupportsInt]]) -> Round:
    """Sort a matching into the canonical form used by :class:`Factorization`.

    Parameters
    ----------
    games : iterable of pairs of int
        The games of a round, in any order and orientation.

    Returns
    -------
    Round
        The games with the smaller vertex first, sorted.

    Examples
    --------
    >>> normalise_round([(3, 0), (2, 1)])
    ((0, 3), (1, 2))
    """
    return tuple(sorted(_game(int(a), int(b)) for a, b in games))
