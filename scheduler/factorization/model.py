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
        """``table[r][v]`` is the vertex that ``v`` meets in round ``r``."""
        table = []
        for games in self.rounds:
            row = [-1] * self.n
            for a, b in games:
                row[a] = b
                row[b] = a
            table.append(row)
        return table

    def certificate(self, *, max_listed: int = 50) -> Certificate:
        """Run the independent verifier (``scheduler.factorization.verify``)."""
        return verify_rounds(self.n, self.rounds, max_listed=max_listed)

    def relabel(self, mapping: list[int] | tuple[int, ...]) -> Factorization:
        """The same factorization with vertex ``v`` renamed ``mapping[v]``."""
        rounds = tuple(
            tuple(sorted(_game(mapping[a], mapping[b]) for a, b in games))
            for games in self.rounds
        )
        return Factorization(self.n, rounds, self.method, self.source, dict(self.details))

    def reorder(self, order: list[int] | tuple[int, ...]) -> Factorization:
        """The same factorization with its rounds put in ``order``."""
        rounds = tuple(self.rounds[i] for i in order)
        return Factorization(self.n, rounds, self.method, self.source, dict(self.details))


def _game(first: int, second: int) -> Game:
    """The game of two vertices with the smaller vertex first."""
    return (first, second) if first <= second else (second, first)


def normalise_round(games: Iterable[Iterable[SupportsInt]]) -> Round:
    """Sort a matching into the canonical form used by :class:`Factorization`."""
    return tuple(sorted(_game(int(a), int(b)) for a, b in games))
