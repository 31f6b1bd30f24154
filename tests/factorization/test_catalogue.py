"""Every shipped catalogue entry is re-verified and, where cheap, re-found by the search.

Each entry must give a perfect one-factorization according to the independent verifier
(definition: Kotzig 1964; Wallis 1997). That these orders have perfect one-factorizations is
known from the literature (docs/one-factorizations.md §1: K_16, K_28, K_36 Seah & Stinson 1988, K_50
Ihrig, Seah & Stinson 1987; attributions from memory).
"""

from __future__ import annotations

from importlib import resources

import pytest

from scheduler.factorization.catalogue import (
    catalogue_entries,
    catalogue_factorization,
    catalogue_orders,
    entry_factorization,
)
from scheduler.factorization.groups import group_from_name
from scheduler.factorization.search import search_perfect_starter

ENTRIES = catalogue_entries()


def test_data_file_is_package_data():
    files = resources.files("scheduler.factorization").joinpath("data")
    assert files.joinpath("catalogue.json").is_file()


def test_required_orders_are_covered():
    assert {16, 28} <= set(catalogue_orders())


@pytest.mark.parametrize("entry", ENTRIES, ids=[f"K_{e.n}-{e.group}" for e in ENTRIES])
def test_entry_is_perfect(entry):
    f = entry_factorization(entry)
    assert f.n == entry.n == group_from_name(entry.group).order + 1
    cert = f.certificate()
    assert cert.valid and cert.perfect, cert.problems
    assert "catalogue" in f.method and entry.group in f.method
    assert f"seed {entry.seed}" in f.source


@pytest.mark.parametrize(
    "entry", [e for e in ENTRIES if e.nodes <= 5_000_000],
    ids=[f"K_{e.n}" for e in ENTRIES if e.nodes <= 5_000_000],
)
def test_entry_is_reproduced_by_the_search(entry):
    """The recorded seed and multiplier make the search find exactly this starter again."""
    res = search_perfect_starter(group_from_name(entry.group), seed=entry.seed, budget=60,
                                 multiplier=entry.multiplier, max_nodes=entry.nodes + 1)
    assert res.found and res.starter == entry.starter
    assert (res.runs, res.nodes) == (entry.runs, entry.nodes)


def test_unknown_order_gives_none():
    assert catalogue_factorization(64) is None
