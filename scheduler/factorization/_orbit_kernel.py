"""Numba kernel of the search for perfect one-factorizations with a prescribed ``Z_k``
(see :mod:`scheduler.factorization.orbit_factorizations`; imported lazily from there).

Vertices ``i k + x`` (block ``i < r``, ``x`` in ``Z_k``) and ``∞ = r k``. The unknowns are the
base rounds ``B_0..B_{r-1}`` (``B_i ∋ {∞, i k}``). Path system ``t`` holds a partial union
``B_i ∪ (B_j + d)``; ``ent_sys[f, :]`` / ``ent_shift[f, :]`` list, for base round ``f``, the
systems an edge of ``B_f`` goes into and the translation applied to it there. An edge is refused
as soon as it closes a cycle shorter than ``n`` in any system. Path-system helpers: those of the
starter kernel (``_search_kernel.py``).
"""

from __future__ import annotations

import numba
import numpy as np

from scheduler.factorization._search_kernel import (
    _add_edge,
    _path_state,
    _shuffle_row,
    _undo,
)


@numba.njit(cache=True)
def _shift(v, s, k, inf):
    if v == inf:
        return v
    return (v // k) * k + (v % k + s) % k


@numba.njit(cache=True, inline="always")
def _enter_pair(f, x, y, k, inf, ent_sys, ent_shift, n_ent, end, size, trail_t, trail_v,
                trail_e, trail_s, top):
    """Add the pair ``{x, y}`` of base round ``B_f`` to every union it enters (shifted there);
    False as soon as one of them closes a short cycle (the caller undoes to its mark)."""
    n = inf + 1
    for e in range(n_ent[f]):
        s = ent_shift[f, e]
        if not _add_edge(ent_sys[f, e], _shift(x, s, k, inf), _shift(y, s, k, inf), n, end,
                         size, trail_t, trail_v, trail_e, trail_s, top):
            return False
    return True


@numba.njit(cache=True)
def _start_bases(r, k, ent_sys, ent_shift, n_ent, partner, count, end, size, trail_t, trail_v,
                 trail_e, trail_s, top):
    """Put the edge ``{∞, f k}`` into every base round ``B_f`` and the unions it enters; False
    when that already closes a short cycle (the space is empty)."""
    inf = r * k
    alive = True
    for f in range(r):
        a = inf
        b = f * k
        partner[f, a] = b
        partner[f, b] = a
        count[f] = 1
        if not _enter_pair(f, a, b, k, inf, ent_sys, ent_shift, n_ent, end, size, trail_t,
                           trail_v, trail_e, trail_s, top):
            alive = False
    top[0] = 0
    return alive


@numba.njit(cache=True)
def orbit_search_kernel(r, k, orb, n_orb, ent_sys, ent_shift, n_ent, T, seed, node_limit,
                        out_partner):
    """Returns ``(status, nodes)``: 1 found (``out_partner[f, v]`` = partner of ``v`` in
    ``B_f``), 0 node limit hit, -1 the space holds no perfect one-factorization."""
    np.random.seed(seed)
    inf = r * k
    n = inf + 1
    end, size, trail_t, trail_v, trail_e, trail_s, top = _path_state(T, n)
    partner = np.full((r, n), -1, np.int32)
    count = np.zeros(r, np.int32)
    if not _start_bases(r, k, ent_sys, ent_shift, n_ent, partner, count, end, size, trail_t,
                        trail_v, trail_e, trail_s, top):
        return -1, 0
    used = np.zeros(n_orb, np.bool_)
    half = n // 2
    maxd = r * half + 1
    cand = np.empty((maxd, n), np.int32)
    ncand = np.zeros(maxd, np.int32)
    ci = np.zeros(maxd, np.int32)
    cf = np.zeros(maxd, np.int32)
    cx = np.zeros(maxd, np.int32)
    cy = np.zeros(maxd, np.int32)
    mark = np.zeros(maxd, np.int64)
    depth = 0
    nodes = 0
    need_gen = True
    while True:
        if need_gen:
            f = 0
            for g in range(1, r):
                if count[g] < count[f]:
                    f = g
            if count[f] == half:
                for g in range(r):
                    for v in range(n):
                        out_partner[g, v] = partner[g, v]
                return 1, nodes
            x = 0
            while partner[f, x] >= 0:
                x += 1
            c = 0
            for y in range(x + 1, inf):
                if partner[f, y] < 0 and not used[orb[x, y]]:
                    cand[depth, c] = y
                    c += 1
            _shuffle_row(cand, depth, c)
            cf[depth] = f
            cx[depth] = x
            ncand[depth] = c
            ci[depth] = 0
            need_gen = False
        if ci[depth] >= ncand[depth]:
            if depth == 0:
                return -1, nodes
            depth -= 1
            _undo(mark[depth], end, size, trail_t, trail_v, trail_e, trail_s, top)
            f = cf[depth]
            a = cx[depth]
            b = cy[depth]
            partner[f, a] = -1
            partner[f, b] = -1
            count[f] -= 1
            used[orb[a, b]] = False
            continue
        f = cf[depth]
        x = cx[depth]
        y = cand[depth, ci[depth]]
        ci[depth] += 1
        nodes += 1
        if nodes > node_limit:
            return 0, nodes
        mark[depth] = top[0]
        if not _enter_pair(f, x, y, k, inf, ent_sys, ent_shift, n_ent, end, size, trail_t,
                           trail_v, trail_e, trail_s, top):
            _undo(mark[depth], end, size, trail_t, trail_v, trail_e, trail_s, top)
            continue
        partner[f, x] = y
        partner[f, y] = x
        count[f] += 1
        used[orb[x, y]] = True
        cy[depth] = y
        depth += 1
        need_gen = True


@numba.njit(cache=True)
def orbit_probe_kernel(r, k, orb, n_orb, ent_sys, ent_shift, n_ent, T, seed, probes,
                       out_nodes, out_leaves):
    """Knuth's random probes of the tree that :func:`orbit_search_kernel` walks.

    Each probe goes down from the root as the search does (least-filled base round, its smallest
    free vertex), tries every candidate partner (each one a node of the search), keeps the ``f``
    accepted ones and goes on with one of them chosen uniformly; the product of the ``f`` met is
    the probe's weight. ``out_nodes[p]`` is the sum of weight times candidates over the probe's
    partial bases, ``out_leaves[p]`` the weight when the probe ends in a whole perfect base (0
    otherwise): unbiased estimates of the nodes of one complete search and of the perfect bases.
    """
    np.random.seed(seed)
    inf = r * k
    n = inf + 1
    half = n // 2
    feasible = np.empty(n, np.int32)
    for p in range(probes):
        end, size, trail_t, trail_v, trail_e, trail_s, top = _path_state(T, n)
        partner = np.full((r, n), -1, np.int32)
        count = np.zeros(r, np.int32)
        used = np.zeros(n_orb, np.bool_)
        alive = _start_bases(r, k, ent_sys, ent_shift, n_ent, partner, count, end, size,
                             trail_t, trail_v, trail_e, trail_s, top)
        weight = 1.0
        total = 0.0
        out_leaves[p] = 0.0
        while alive:
            f = 0
            for g in range(1, r):
                if count[g] < count[f]:
                    f = g
            if count[f] == half:
                out_leaves[p] = weight
                break
            x = 0
            while partner[f, x] >= 0:
                x += 1
            c = 0
            n_feasible = 0
            for y in range(x + 1, inf):
                if partner[f, y] >= 0 or used[orb[x, y]]:
                    continue
                c += 1
                mark = top[0]
                ok = _enter_pair(f, x, y, k, inf, ent_sys, ent_shift, n_ent, end, size,
                                 trail_t, trail_v, trail_e, trail_s, top)
                _undo(mark, end, size, trail_t, trail_v, trail_e, trail_s, top)
                if ok:
                    feasible[n_feasible] = y
                    n_feasible += 1
            total += weight * c
            if n_feasible == 0:
                break
            y = feasible[np.random.randint(0, n_feasible)]
            _enter_pair(f, x, y, k, inf, ent_sys, ent_shift, n_ent, end, size, trail_t, trail_v,
                        trail_e, trail_s, top)
            top[0] = 0
            partner[f, x] = y
            partner[f, y] = x
            count[f] += 1
            used[orb[x, y]] = True
            weight *= n_feasible
        out_nodes[p] = total
