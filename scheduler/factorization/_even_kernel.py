"""Numba kernel of the perfect even-starter search (imported lazily by ``even_starters.py``).

Randomised iterative backtracking over even starters of the cyclic group ``Z_M`` with a fixed
missing element ``mis`` (see :mod:`scheduler.factorization.even_starters`). Vertices are
``0..M-1``, ``∞1 = M`` and ``∞2 = M + 1``. Path system ``t < h`` (``h = M / 2``) holds the
partial union ``F_0 ∪ F_{t+1}``; system ``h`` holds ``F_0 ∪ E`` (``E`` the fixed round). A pair
is refused as soon as it closes a cycle shorter than ``M + 2`` in any of them. The path-system
helpers are those of the odd-starter kernel (``_search_kernel.py``).
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
def even_search_kernel(M, mis, seed, shuffle, node_limit, out_pairs):
    """Returns ``(status, nodes)``: 1 found (pairs in ``out_pairs``), 0 node limit hit, -1 the
    space of even starters missing ``mis`` holds no perfect one. ``shuffle = False`` tries
    partners in increasing order (deterministic exhaustive order)."""
    np.random.seed(seed)
    h = M // 2
    n = M + 2
    inf1 = M
    inf2 = M + 1
    T = h + 1
    end, size, trail_t, trail_v, trail_e, trail_s, top = _path_state(T, n)
    ok = True
    for t in range(h):
        g = t + 1
        ok = ok and _add_edge(t, inf1, 0, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
        ok = ok and _add_edge(t, inf2, mis, n, end, size, trail_t, trail_v, trail_e, trail_s,
                              top)
        ok = ok and _add_edge(t, inf1, g, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
        ok = ok and _add_edge(t, inf2, (mis + g) % M, n, end, size,
                              trail_t, trail_v, trail_e, trail_s, top)
    ok = ok and _add_edge(h, inf1, inf2, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
    ok = ok and _add_edge(h, inf1, 0, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
    ok = ok and _add_edge(h, inf2, mis, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
    for x in range(h):
        ok = ok and _add_edge(h, x, x + h, n, end, size, trail_t, trail_v, trail_e, trail_s,
                              top)
    if not ok:
        return -1, 0
    top[0] = 0

    used = np.zeros(M, np.bool_)
    used[0] = True
    used[mis] = True
    dused = np.zeros(M, np.bool_)
    dused[0] = True
    dused[h] = True
    maxd = h + 1
    cand = np.empty((maxd, M), np.int32)
    ncand = np.zeros(maxd, np.int32)
    ci = np.zeros(maxd, np.int32)
    cx = np.zeros(maxd, np.int32)
    cy = np.zeros(maxd, np.int32)
    mark = np.zeros(maxd, np.int64)
    depth = 0
    nodes = 0
    need_gen = True
    while True:
        if need_gen:
            x = 1
            while x < M and used[x]:
                x += 1
            if x == M:
                for d in range(depth):
                    out_pairs[d, 0] = cx[d]
                    out_pairs[d, 1] = cy[d]
                return 1, nodes
            c = 0
            for y in range(1, M):
                if y != x and not used[y] and not dused[(x - y) % M]:
                    cand[depth, c] = y
                    c += 1
            if shuffle:
                _shuffle_row(cand, depth, c)
            cx[depth] = x
            ncand[depth] = c
            ci[depth] = 0
            need_gen = False
        if ci[depth] >= ncand[depth]:
            if depth == 0:
                return -1, nodes
            depth -= 1
            _undo(mark[depth], end, size, trail_t, trail_v, trail_e, trail_s, top)
            a = cx[depth]
            b = cy[depth]
            used[a] = False
            used[b] = False
            dused[(a - b) % M] = False
            dused[(b - a) % M] = False
            continue
        x = cx[depth]
        y = cand[depth, ci[depth]]
        ci[depth] += 1
        nodes += 1
        if nodes > node_limit:
            return 0, nodes
        mark[depth] = top[0]
        ok = _add_edge(h, x, y, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
        t = 0
        while ok and t < h:
            g = t + 1
            ok = _add_edge(t, x, y, n, end, size, trail_t, trail_v, trail_e, trail_s, top) and \
                _add_edge(t, (x + g) % M, (y + g) % M, n, end, size,
                          trail_t, trail_v, trail_e, trail_s, top)
            t += 1
        if not ok:
            _undo(mark[depth], end, size, trail_t, trail_v, trail_e, trail_s, top)
            continue
        used[x] = True
        used[y] = True
        dused[(x - y) % M] = True
        dused[(y - x) % M] = True
        cy[depth] = y
        depth += 1
        need_gen = True
