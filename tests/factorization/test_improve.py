"""Best available factorizations for orders without a known perfect one.

Baselines from docs/one-factorizations.md §2 ([computed], re-derived in test_constructions): GK_64
has 1134/1953 perfect pairs, GA_70 1656/2346. The local search must stay a valid
one-factorization (Kempe interchanges keep one) and report the verifier's own count.
"""

from __future__ import annotations

from scheduler.factorization.circle import circle_factorization
from scheduler.factorization.improve import baselines, best_available, kempe_anneal
from scheduler.factorization.verify import verify_rounds


def test_best_available_beats_gk_at_64_and_is_honest():
    f = best_available(64, seed=0, budget=1.0)
    cert = verify_rounds(64, f.rounds)
    assert cert.valid
    assert cert.perfect_pairs == f.details["perfect_pairs"] > 1134
    assert f.details["baselines"] == {"circle GK_64": 1134}


def test_best_available_deterministic():
    a = best_available(66, seed=5, budget=0.5)
    b = best_available(66, seed=5, budget=0.5)
    assert a.rounds == b.rounds


def test_best_available_not_worse_than_ga_at_70():
    f = best_available(70, seed=0, budget=0.5)
    assert {b.method for b in baselines(70)} == {"circle GK_70", "Anderson GA_70"}
    assert f.certificate().perfect_pairs >= 1656


def test_kempe_annealing_keeps_a_one_factorization():
    start = circle_factorization(16)
    f, record = kempe_anneal(start, seed=1, work=2_000_000)
    cert = f.certificate()
    assert cert.valid
    assert record["moves"] > 0
    assert cert.perfect_pairs == record["best_score"] >= start.certificate().perfect_pairs
