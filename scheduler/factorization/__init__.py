"""One-factorizations of K_n: constructions, starters, catalogue, verifier and the ``factorize``
policy. Numbers only: nothing here knows about leagues, dates or files."""

from scheduler.factorization.anderson import anderson_factorization, anderson_rounds
from scheduler.factorization.catalogue import (
    CatalogueEntry,
    catalogue_entries,
    catalogue_factorization,
    catalogue_orders,
)
from scheduler.factorization.circle import circle_factorization, circle_rounds
from scheduler.factorization.groups import (
    AbelianGroup,
    cyclic,
    galois_field,
    group_from_name,
    groups_of_order,
    product,
)
from scheduler.factorization.improve import best_available
from scheduler.factorization.model import Certificate, Factorization, ImperfectPair
from scheduler.factorization.policy import MAX_TEAMS, factorize, known_perfect
from scheduler.factorization.search import StarterSearchResult, search_perfect_starter
from scheduler.factorization.starters import (
    count_starters,
    enumerate_starters,
    good_differences,
    is_perfect_starter,
    is_starter,
    starter_factorization,
)
from scheduler.factorization.verify import hamiltonian_pair_matrix, verify_rounds

__all__ = [
    "MAX_TEAMS",
    "AbelianGroup",
    "CatalogueEntry",
    "Certificate",
    "Factorization",
    "ImperfectPair",
    "StarterSearchResult",
    "anderson_factorization",
    "anderson_rounds",
    "best_available",
    "catalogue_entries",
    "catalogue_factorization",
    "catalogue_orders",
    "circle_factorization",
    "circle_rounds",
    "count_starters",
    "cyclic",
    "enumerate_starters",
    "factorize",
    "galois_field",
    "good_differences",
    "group_from_name",
    "groups_of_order",
    "hamiltonian_pair_matrix",
    "is_perfect_starter",
    "is_starter",
    "known_perfect",
    "product",
    "search_perfect_starter",
    "starter_factorization",
    "verify_rounds",
]
