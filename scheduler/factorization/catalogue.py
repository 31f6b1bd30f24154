"""Shipped catalogue of perfect starters for orders no closed formula covers.

Each entry of ``data/catalogue.json`` (package data, read with :mod:`importlib.resources`) is a
group description (``"Z_27"``, ``"GF(49)"``, ...), a perfect starter in it and how it was
found: every starter was found by this project's own search
(:func:`~scheduler.factorization.search.search_perfect_starter`, run offline by
``benchmarks/find_catalogue.py`` with the recorded seed and multiplier); nothing is copied
from a paper. The factorization of ``K_n`` is the starter-induced one
(:func:`~scheduler.factorization.starters.starter_factorization`). The test suite re-verifies
every entry with the independent verifier.

That these orders have perfect one-factorizations is known from the literature (reference
notes §1; e.g. K_16 and K_28 since the 1970s-80s, K_50: E. Ihrig, E. Seah, D. R. Stinson 1987,
from memory); the catalogue just supplies a concrete one.
"""

from __future__ import annotations

import json
from dataclasses import dataclass
from functools import cache
from importlib import resources

from scheduler.factorization.groups import group_from_name
from scheduler.factorization.model import Factorization
from scheduler.factorization.starters import SOURCE as STARTER_SOURCE
from scheduler.factorization.starters import starter_factorization


@dataclass(frozen=True)
class CatalogueEntry:
    """One perfect starter: ``n = |group| + 1``."""

    n: int
    group: str
    starter: tuple[tuple[int, int], ...]
    multiplier: int
    seed: int
    runs: int
    nodes: int
    found_by: str
    note: str = ""


@cache
def catalogue_entries() -> tuple[CatalogueEntry, ...]:
    """All entries of the shipped catalogue, in file order."""
    text = resources.files("scheduler.factorization").joinpath("data/catalogue.json").read_text(
        encoding="utf-8"
    )
    data = json.loads(text)
    out = []
    for item in data["entries"]:
        out.append(
            CatalogueEntry(
                n=int(item["n"]),
                group=str(item["group"]),
                starter=tuple((int(a), int(b)) for a, b in item["starter"]),
                multiplier=int(item.get("multiplier", 1)),
                seed=int(item["seed"]),
                runs=int(item["runs"]),
                nodes=int(item["nodes"]),
                found_by=str(item["found_by"]),
                note=str(item.get("note", "")),
            )
        )
    return tuple(out)


def catalogue_orders() -> tuple[int, ...]:
    """Orders ``n`` of ``K_n`` with at least one catalogue entry, ascending."""
    return tuple(sorted({e.n for e in catalogue_entries()}))


def catalogue_entry(n: int) -> CatalogueEntry | None:
    """The first catalogue entry for ``K_n``, or ``None``."""
    return next((e for e in catalogue_entries() if e.n == n), None)


def entry_factorization(entry: CatalogueEntry) -> Factorization:
    """The starter-induced factorization of one catalogue entry."""
    group = group_from_name(entry.group)
    mult = f", multiplier {entry.multiplier}" if entry.multiplier != 1 else ""
    return starter_factorization(
        group,
        entry.starter,
        method=f"starter in {entry.group} (catalogue)",
        source=(
            f"{STARTER_SOURCE}; perfect starter found by {entry.found_by}, "
            f"seed {entry.seed}{mult}"
        ),
        details={
            "catalogue": True,
            "multiplier": entry.multiplier,
            "seed": entry.seed,
            "runs": entry.runs,
            "nodes": entry.nodes,
        },
    )


def catalogue_factorization(n: int) -> Factorization | None:
    """A perfect one-factorization of ``K_n`` from the catalogue, or ``None``."""
    entry = catalogue_entry(n)
    return entry_factorization(entry) if entry else None
