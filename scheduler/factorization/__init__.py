"""One-factorizations of K_n: constructions, starters, catalogue, verifier and the ``factorize``
policy. Numbers only: nothing here knows about leagues, dates or files."""

from scheduler.factorization.circle import circle_factorization, circle_rounds
from scheduler.factorization.model import Certificate, Factorization, ImperfectPair

__all__ = [
    "Certificate",
    "Factorization",
    "ImperfectPair",
    "circle_factorization",
    "circle_rounds",
]
