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

The list ``"structured"`` of the same file holds perfect one-factorizations of other kinds
(:class:`StructuredEntry`), also found by this project's own search
(``benchmarks/find_structured.py``): ``"group_starter"``, a starter in a non-abelian group
``Z_p ⋊_r Z_q`` (:mod:`scheduler.factorization.nonabelian_starters`), and ``"even_starter"``,
an even starter in ``Z_{n-2}`` (:mod:`scheduler.factorization.even_starters`), and
``"twin_starter"``, an even starter over ``Z_2 × H`` (``base`` names ``H``; points at infinity
kept; :mod:`scheduler.factorization.twin_point_starters`, found by
``benchmarks/find_k52_k56.py``). They serve the orders without a plain starter entry.
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
    """One perfect starter: ``n = |group| + 1``.

    Parameters
    ----------
    n : int
        The order of ``K_n``.
    group : str
        The group's name, as :func:`~scheduler.factorization.groups.group_from_name` reads it.
    starter : tuple of (int, int)
        The starter's pairs of group codes.
    multiplier : int
        The unit the starter is invariant under (1: none).
    seed, runs, nodes : int
        The search that found it: its seed, restarts and nodes, so that it can be found again.
    found_by : str
        Who or what found it.
    note : str, optional
        Anything else worth knowing.

    Examples
    --------
    >>> entry = next(e for e in catalogue_entries() if e.n == 16)
    >>> entry.group, len(entry.starter)
    ('Z_15', 7)
    """

    n: int
    group: str
    starter: tuple[tuple[int, int], ...]
    multiplier: int
    seed: int
    runs: int
    nodes: int
    found_by: str
    note: str = ""


@dataclass(frozen=True)
class StructuredEntry:
    """A perfect one-factorization of ``K_n`` of kind ``"group_starter"`` (``group`` is
    ``(p, q, r)`` for ``Z_p ⋊_r Z_q``; ``automorphism`` the ``(s, c)`` it is invariant under),
    ``"even_starter"`` (in ``Z_{n-2}``; ``group`` and ``automorphism`` empty) or
    ``"twin_starter"`` (over ``Z_2 × H``, ``H`` named by ``base``, invariant under the
    ``multiplier``).

    Parameters
    ----------
    n : int
        The order of ``K_n``.
    kind : {"group_starter", "even_starter", "twin_starter"}
        The construction.
    group : tuple of int
        ``(p, q, r)`` of ``Z_p ⋊_r Z_q`` for a group starter; empty otherwise.
    automorphism : tuple of int
        ``(s, c)`` of the automorphism a group starter is invariant under; empty otherwise.
    starter : tuple of (int, int)
        The starter's pairs of codes.
    seed, runs, nodes : int
        The search that found it: its seed, restarts and nodes.
    found_by : str
        Who or what found it.
    base : str, optional
        For a twin starter: the name of ``H``.
    multiplier : int, optional
        For a twin starter: the unit it is invariant under (1: none).
    """

    n: int
    kind: str
    group: tuple[int, ...]
    automorphism: tuple[int, ...]
    starter: tuple[tuple[int, int], ...]
    seed: int
    runs: int
    nodes: int
    found_by: str
    base: str = ""
    multiplier: int = 1


def _read() -> dict:
    text = resources.files("scheduler.factorization").joinpath("data/catalogue.json").read_text(
        encoding="utf-8"
    )
    return json.loads(text)


@cache
def structured_entries() -> tuple[StructuredEntry, ...]:
    """The entries of the ``"structured"`` list of the shipped catalogue, in file order."""
    return tuple(
        StructuredEntry(
            n=int(item["n"]),
            kind=str(item["kind"]),
            group=tuple(int(v) for v in item.get("group", ())),
            automorphism=tuple(int(v) for v in item.get("automorphism", ())),
            starter=tuple((int(a), int(b)) for a, b in item["starter"]),
            seed=int(item["seed"]),
            runs=int(item["runs"]),
            nodes=int(item["nodes"]),
            found_by=str(item["found_by"]),
            base=str(item.get("base", "")),
            multiplier=int(item.get("multiplier", 1)),
        )
        for item in _read().get("structured", [])
    )


def structured_factorization(entry: StructuredEntry) -> Factorization:
    """The factorization of one structured entry (kernels are not imported).

    Parameters
    ----------
    entry : StructuredEntry
        A catalogue entry.

    Returns
    -------
    Factorization
        The induced one-factorization, its method and source naming the catalogue and the
        search that found it.
    """
    found = f"found by {entry.found_by}, seed {entry.seed}"
    details = {"catalogue": True, "seed": entry.seed, "runs": entry.runs, "nodes": entry.nodes}
    if entry.kind == "group_starter":
        from scheduler.factorization.nonabelian_starters import SOURCE as GROUP_SOURCE
        from scheduler.factorization.nonabelian_starters import (
            group_starter_factorization,
            semidirect,
        )

        group = semidirect(*entry.group)
        return group_starter_factorization(
            group, entry.starter, method=f"starter in {group.name} (catalogue)",
            source=f"{GROUP_SOURCE}; perfect starter {found}",
            details={**details, "automorphism": list(entry.automorphism)},
        )
    if entry.kind == "even_starter":
        from scheduler.factorization.even_starters import SOURCE as EVEN_SOURCE
        from scheduler.factorization.even_starters import even_starter_factorization

        return even_starter_factorization(
            entry.n - 2, entry.starter, method=f"even starter in Z_{entry.n - 2} (catalogue)",
            source=f"{EVEN_SOURCE}; perfect even starter {found}", details=details,
        )
    if entry.kind == "twin_starter":
        from scheduler.factorization.twin_point_starters import SOURCE as TWIN_SOURCE
        from scheduler.factorization.twin_point_starters import twin_factorization

        mult = f", multiplier {entry.multiplier}" if entry.multiplier != 1 else ""
        return twin_factorization(
            entry.base, entry.starter, method=f"even starter in Z_2 x {entry.base} (catalogue)",
            source=f"{TWIN_SOURCE}; perfect even starter {found}{mult}",
            details={**details, "multiplier": entry.multiplier},
        )
    raise ValueError(f"unknown catalogue kind {entry.kind!r}")  # pragma: no cover


@cache
def catalogue_entries() -> tuple[CatalogueEntry, ...]:
    """All entries of the shipped catalogue, in file order."""
    data = _read()
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
    """Orders ``n`` of ``K_n`` with at least one catalogue entry (of any kind), ascending.

    Returns
    -------
    tuple of int
        The orders.

    Examples
    --------
    >>> 16 in catalogue_orders()
    True
    """
    return tuple(sorted({e.n for e in catalogue_entries()} | {e.n for e in structured_entries()}))


def catalogue_entry(n: int) -> CatalogueEntry | None:
    """The first catalogue entry for ``K_n``, or ``None``.

    Parameters
    ----------
    n : int
        The order.

    Returns
    -------
    CatalogueEntry or None
        The first plain starter entry of that order; None when there is none.
    """
    return next((e for e in catalogue_entries() if e.n == n), None)


def entry_factorization(entry: CatalogueEntry) -> Factorization:
    """The starter-induced factorization of one catalogue entry.

    Parameters
    ----------
    entry : CatalogueEntry
        A catalogue entry.

    Returns
    -------
    Factorization
        The induced one-factorization, its method and source naming the catalogue and the
        search that found it.
    """
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
    """A perfect one-factorization of ``K_n`` from the catalogue, or ``None`` (a plain starter
    entry first, else the first structured entry).

    Parameters
    ----------
    n
        The order.

    Returns
    -------
    Factorization or None
        The catalogue's factorization of ``K_n``, or ``None`` when it has none.

    Examples
    --------
    >>> f = catalogue_factorization(16)
    >>> f.method, f.certificate().perfect
    ('starter in Z_15 (catalogue)', True)
    >>> catalogue_factorization(6) is None
    True
    """
    entry = catalogue_entry(n)
    if entry:
        return entry_factorization(entry)
    other = next((e for e in structured_entries() if e.n == n), None)
    return structured_factorization(other) if other else None
