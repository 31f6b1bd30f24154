"""Isomorphism of one-factorizations through networkx graph isomorphism.

Two one-factorizations of K_n are isomorphic when a relabelling of the vertices maps the set of
rounds of one onto the set of rounds of the other. Encode a factorization as a graph with three
kinds of node: the n vertices, the n - 1 rounds, and one node per game adjacent to its two
vertices and to its round. A kind-preserving isomorphism of these graphs maps vertices to
vertices and games to games (a game node is determined by its two vertices), hence rounds to
rounds consistently: it is exactly an isomorphism of factorizations. Conversely every
isomorphism of factorizations induces one. Graph isomorphism: networkx VF2 (L. P. Cordella,
P. Foggia, C. Sansone, M. Vento, IEEE TPAMI 26 (2004)). Used here only for automorphism
counts of small factorizations (VF2 is far too slow to separate non-isomorphic ones of K_14).
"""

from __future__ import annotations

import networkx as nx
from networkx.algorithms.isomorphism import GraphMatcher, categorical_node_match


def incidence_graph(n, rounds) -> nx.Graph:
    g = nx.Graph()
    g.add_nodes_from((("v", v) for v in range(n)), kind="vertex")
    for r, games in enumerate(rounds):
        g.add_node(("r", r), kind="round")
        for a, b in games:
            node = ("g", min(a, b), max(a, b))
            g.add_node(node, kind="game")
            g.add_edges_from([(node, ("v", a)), (node, ("v", b)), (node, ("r", r))])
    return g


_MATCH = categorical_node_match("kind", None)


def automorphism_count(n, rounds) -> int:
    """Number of vertex permutations mapping the set of rounds onto itself."""
    g = incidence_graph(n, rounds)
    return sum(1 for _ in GraphMatcher(g, g, node_match=_MATCH).isomorphisms_iter())
