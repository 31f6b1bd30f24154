"""The import graph of ``scheduler``: acyclic between modules, and no layer imports a higher one.

Every module's imports are read with :mod:`ast` (also imports inside functions: they are
dependencies all the same), the graph is built and checked with networkx
(``is_directed_acyclic_graph``, ``find_cycle``): the library this project did not write decides
whether there is a loop. The layers, bottom-up, are :data:`LAYERS` (see ``docs/audit-input.md``,
"Where the input side sits").
"""

from __future__ import annotations

import ast
import subprocess
import sys
from pathlib import Path

import networkx as nx
import pytest

ROOT = Path(__file__).resolve().parents[1]
PACKAGE = ROOT / "scheduler"

LAYERS: tuple[tuple[str, ...], ...] = (
    # Plain values and pure arithmetic that every room shares: the errors, the progress
    # convention, the Season value (rules and fairness check *any* season, so the value sits
    # below them), and the one home of the leg schemes, the break count and the carry-over value.
    (
        "scheduler.errors", "scheduler.progress", "scheduler.season", "scheduler",
        "scheduler.leg_schemes", "scheduler.home_away", "scheduler.carry_over",
        "scheduler.interrupt", "scheduler.files",
    ),
    # The calendar reads only its own CalendarSpec (and any league-like object): the league
    # configuration checks a league's dates with it, and the balancer's day model uses it, so it
    # sits below both (the pipeline runs it later, but depends on nothing above errors).
    ("scheduler.calendar",),
    ("scheduler.config", "scheduler.factorization"),
    ("scheduler.rules",),
    ("scheduler.balance",),
    ("scheduler.fairness",),
    ("scheduler.export", "scheduler.audit"),
    # The orchestrators: one season, a re-plan of a season, several divisions.
    ("scheduler.plan", "scheduler.replan", "scheduler.divisions"),
    ("scheduler.cli", "scheduler.__main__"),
)
"""Layers bottom-up: a module may import its own layer (without loops) and lower ones. A module
belongs to the layer of its longest listed prefix (``scheduler`` alone is the package's root,
which re-exports the errors and the Season)."""

KNOWN_UPWARD: dict[tuple[str, str], str] = {
    ("scheduler.balance.plan", "scheduler.season"): (
        "the orchestrator that assembles the Season moves out of balance to scheduler/plan.py"
    ),
}
"""Upward imports that exist today, each with the change that removes it. An entry whose
importing module is gone is ignored; one whose import is gone while the module stays fails, so
the list cannot go stale."""


def module_name(path: Path) -> str:
    parts = list(path.relative_to(ROOT).with_suffix("").parts)
    if parts[-1] == "__init__":
        parts.pop()
    return ".".join(parts)


def all_modules() -> dict[str, Path]:
    return {module_name(p): p for p in sorted(PACKAGE.rglob("*.py"))}


def imported_modules(name: str, path: Path, known: set[str]) -> set[str]:
    """The project's modules that ``name`` imports (``from pkg import sub`` names ``pkg.sub``)."""
    tree = ast.parse(path.read_text(encoding="utf-8"), filename=str(path))
    is_package = path.name == "__init__.py"
    targets: set[str] = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for alias in node.names:
                targets.add(alias.name)
        elif isinstance(node, ast.ImportFrom):
            base = node.module or ""
            if node.level:
                anchor = name.split(".") if is_package else name.split(".")[:-1]
                anchor = anchor[: len(anchor) - (node.level - 1)]
                base = ".".join(anchor + ([base] if base else []))
            for alias in node.names:
                candidate = f"{base}.{alias.name}"
                targets.add(candidate if candidate in known else base)
    found = set()
    for target in targets:
        while target and target not in known:
            target = target.rpartition(".")[0]
        if target and target != name:
            found.add(target)
    return found


def import_graph() -> nx.DiGraph:
    modules = all_modules()
    known = set(modules)
    graph = nx.DiGraph()
    graph.add_nodes_from(known)
    for name, path in modules.items():
        for target in imported_modules(name, path, known):
            graph.add_edge(name, target)
    return graph


def layer_of(module: str) -> int | None:
    best, best_len = None, -1
    for index, prefixes in enumerate(LAYERS):
        for prefix in prefixes:
            if (module == prefix or module.startswith(prefix + ".")) and len(prefix) > best_len:
                best, best_len = index, len(prefix)
    return best


def test_the_graph_sees_known_imports():
    graph = import_graph()
    # Spot checks that the parser follows absolute, "from package import module" and
    # function-level imports.
    assert graph.has_edge("scheduler.audit.readers", "scheduler.audit.season_file")
    assert graph.has_edge("scheduler.cli", "scheduler.audit")
    assert graph.has_edge("scheduler.config.model", "scheduler.calendar.spec")
    assert graph.number_of_nodes() > 60


def test_no_import_loops_between_modules():
    graph = import_graph()
    if not nx.is_directed_acyclic_graph(graph):
        cycle = nx.find_cycle(graph)
        pytest.fail("import loop: " + " -> ".join(a for a, _ in cycle) + f" -> {cycle[0][0]}")


def test_every_module_has_a_layer():
    missing = sorted(m for m in all_modules() if layer_of(m) is None)
    assert not missing, f"add these modules to LAYERS in {Path(__file__).name}: {missing}"


def test_no_layer_imports_a_higher_one():
    graph = import_graph()
    upward = []
    for source, target in graph.edges:
        low, high = layer_of(source), layer_of(target)
        upward_edge = low is not None and high is not None and high > low
        if upward_edge and (source, target) not in KNOWN_UPWARD:
            upward.append(f"{source} (layer {low}) imports {target} (layer {high})")
    assert not upward, "imports from a lower layer to a higher one:\n" + "\n".join(upward)


def test_known_exceptions_are_still_needed():
    graph = import_graph()
    stale = [
        f"{source} -> {target}"
        for (source, target) in KNOWN_UPWARD
        if source in graph and not graph.has_edge(source, target)
    ]
    assert not stale, f"remove from KNOWN_UPWARD (the import is gone): {stale}"


@pytest.mark.parametrize(
    "first", ["scheduler.audit", "scheduler.export.season_json", "scheduler.config",
              "scheduler.factorization.verify", "scheduler.calendar.days"]
)
def test_packages_import_in_any_order(first):
    """A fresh interpreter imports each entry point first without a partially-initialised
    module error (the graph test reads source; this one runs it)."""
    code = f"import {first}; import scheduler.cli; import scheduler.audit; import scheduler.export"
    result = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True,
                            text=True, timeout=120)
    assert result.returncode == 0, result.stderr
