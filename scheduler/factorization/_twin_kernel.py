"""Numba kernel of the search for perfect even starters over ``Z_2 × H`` with the two fixed
points kept or swapped (see :mod:`scheduler.factorization.twin_point_starters`; imported lazily
from there).

Vertices are the group codes ``0..M-1``, ``∞1 = M`` and ``∞2 = M + 1``. Path system ``s`` with
``s < len(reps)`` holds the partial union ``F_0 ∪ F_g`` (``g = reps[s]``); the last system holds
``F_0 ∪ E`` (``E`` the fixed round). Pairs are chosen whole orbits at a time under the
multiplier permutation ``mulu``; a pair is refused as soon as it closes a cycle shorter than
``M + 2`` in any system. Path-system helpers: those of the odd-starter kernel
(``_search_kernel.py``). ``twin_probe_kernel`` walks random paths of the same tree for Knuth's
estimate of its size; its steps (``_twin_place``, ``_twin_release``) repeat the search's inner
loop, which stays inline for speed as in the odd-starter kernel.
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
def _kind_taken(par, in_pure, in_mixed, a, b):
    """Would the pair ``{a, b}`` give ``a``'s or ``b``'s element of ``H`` a second pair of its
    kind (equal or mixed parity)?"""
    if par[a] == par[b]:
        return in_pure[a // 2] or in_pure[b // 2]
    return in_mixed[a // 2] or in_mixed[b // 2]


@numba.njit(cache=True)
def _mark_kind(par, in_pure, in_mixed, a, b, value):
    """Record (or, with ``value`` False, forget) the kind of the pair ``{a, b}``."""
    if par[a] == par[b]:
        in_pure[a // 2] = value
        in_pure[b // 2] = value
    else:
        in_mixed[a // 2] = value
        in_mixed[b // 2] = value


@numba.njit(cache=True)
def _twin_state(M, add, par, tinv, mis, twist, reps):
    """The empty even starter missing ``mis``: the path systems of the unions with the edges at
    infinity and the fixed round ``E``, the element, difference and kind marks and the per-depth
    records. ``ok`` is False when the fixed edges alone close a short cycle."""
    n = M + 2
    inf1 = M
    inf2 = M + 1
    R = reps.shape[0]
    T = R + 1
    end, size, trail_t, trail_v, trail_e, trail_s, top = _path_state(T, n)
    ok = True
    for s in range(R):
        g = reps[s]
        ok = ok and _add_edge(s, inf1, 0, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
        ok = ok and _add_edge(s, inf2, mis, n, end, size, trail_t, trail_v, trail_e, trail_s,
                              top)
        a1 = inf1
        a2 = inf2
        if twist and par[g] == 1:
            a1 = inf2
            a2 = inf1
        ok = ok and _add_edge(s, a1, g, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
        ok = ok and _add_edge(s, a2, add[mis, g], n, end, size,
                              trail_t, trail_v, trail_e, trail_s, top)
    e = R
    ok = ok and _add_edge(e, inf1, inf2, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
    ok = ok and _add_edge(e, inf1, 0, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
    ok = ok and _add_edge(e, inf2, mis, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
    for x in range(M):
        y = add[x, tinv]
        if x < y:
            ok = ok and _add_edge(e, x, y, n, end, size, trail_t, trail_v, trail_e, trail_s,
                                  top)
    top[0] = 0

    in_pure = np.zeros(M // 2, np.bool_)
    in_mixed = np.zeros(M // 2, np.bool_)
    used = np.zeros(M, np.bool_)
    used[0] = True
    used[mis] = True
    dused = np.zeros(M, np.bool_)
    dused[0] = True
    dused[tinv] = True
    maxd = M // 2 + 1
    mark = np.zeros(maxd, np.int64)
    op = np.empty((maxd, M, 2), np.int32)
    opn = np.zeros(maxd, np.int32)
    return (ok, used, dused, in_pure, in_mixed, op, opn, mark,
            end, size, trail_t, trail_v, trail_e, trail_s, top)


@numba.njit(cache=True)
def twin_search_kernel(M, add, neg, mulu, par, tinv, mis, twist, merged, reps, seed, shuffle,
                       node_limit, out_pairs):
    """Returns ``(status, nodes)``: 1 found (pairs in ``out_pairs``), 0 node limit hit, -1 the
    space (this missing element, multiplier, twist and class) holds no perfect even starter.

    With ``merged`` every element ``h`` of ``H`` lies in at most one pair of equal parity and at
    most one pair of mixed parity (the merged class: the pairs of each kind project onto a
    starter of ``H`` or one of its translates)."""
    np.random.seed(seed)
    n = M + 2
    (ok, used, dused, in_pure, in_mixed, op, opn, mark,
     end, size, trail_t, trail_v, trail_e, trail_s, top) = _twin_state(M, add, par, tinv, mis,
                                                                      twist, reps)
    if not ok:
        return -1, 0
    R = reps.shape[0]
    e = R
    maxd = M // 2 + 1
    cand = np.empty((maxd, M), np.int32)
    ncand = np.zeros(maxd, np.int32)
    ci = np.zeros(maxd, np.int32)
    cx = np.zeros(maxd, np.int32)
    depth = 0
    nodes = 0
    need_gen = True
    while True:
        if need_gen:
            x = 1
            while x < M and used[x]:
                x += 1
            if x == M:
                k = 0
                for d in range(depth):
                    for j in range(opn[d]):
                        out_pairs[k, 0] = op[d, j, 0]
                        out_pairs[k, 1] = op[d, j, 1]
                        k += 1
                return 1, nodes
            c = 0
            for y in range(1, M):
                if y != x and not used[y] and not dused[add[x, neg[y]]]:
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
            for j in range(opn[depth]):
                a = op[depth, j, 0]
                b = op[depth, j, 1]
                used[a] = False
                used[b] = False
                d1 = add[a, neg[b]]
                dused[d1] = False
                dused[neg[d1]] = False
                if merged:
                    _mark_kind(par, in_pure, in_mixed, a, b, False)
            continue
        x = cx[depth]
        y = cand[depth, ci[depth]]
        ci[depth] += 1
        nodes += 1
        if nodes > node_limit:
            return 0, nodes
        # the orbit of the pair {x, y} under the multiplier
        k = 0
        a = x
        b = y
        ok = True
        while True:
            if a == b or used[a] or used[b]:
                ok = False
                break
            d1 = add[a, neg[b]]
            if dused[d1] or dused[neg[d1]]:
                ok = False
                break
            if merged:
                if _kind_taken(par, in_pure, in_mixed, a, b):
                    ok = False
                    break
                _mark_kind(par, in_pure, in_mixed, a, b, True)
            used[a] = True
            used[b] = True
            dused[d1] = True
            dused[neg[d1]] = True
            op[depth, k, 0] = a
            op[depth, k, 1] = b
            k += 1
            a = mulu[a]
            b = mulu[b]
            if (a == x and b == y) or (a == y and b == x):
                break
        opn[depth] = k
        if ok:
            mark[depth] = top[0]
            for j in range(k):
                pa = op[depth, j, 0]
                pb = op[depth, j, 1]
                if not _add_edge(e, pa, pb, n, end, size, trail_t, trail_v, trail_e, trail_s,
                                 top):
                    ok = False
                    break
                for s in range(R):
                    g = reps[s]
                    if not (
                        _add_edge(s, pa, pb, n, end, size,
                                  trail_t, trail_v, trail_e, trail_s, top)
                        and _add_edge(s, add[pa, g], add[pb, g], n, end, size,
                                      trail_t, trail_v, trail_e, trail_s, top)
                    ):
                        ok = False
                        break
                if not ok:
                    break
            if not ok:
                _undo(mark[depth], end, size, trail_t, trail_v, trail_e, trail_s, top)
        if not ok:
            for j in range(k):
                a = op[depth, j, 0]
                b = op[depth, j, 1]
                used[a] = False
                used[b] = False
                d1 = add[a, neg[b]]
                dused[d1] = False
                dused[neg[d1]] = False
                if merged:
                    _mark_kind(par, in_pure, in_mixed, a, b, False)
            continue
        depth += 1
        need_gen = True


@numba.njit(cache=True)
def _twin_place(depth, x, y, n, add, neg, mulu, par, merged, reps, used, dused, in_pure,
                in_mixed, op, opn, mark, end, size, trail_t, trail_v, trail_e, trail_s, top):
    """Pair ``x`` with ``y`` and the orbit of ``{x, y}`` under the symmetry as the choice made
    at ``depth``, exactly as :func:`twin_search_kernel` does inline; False (everything undone)
    when the choice is refused."""
    R = reps.shape[0]
    e = R
    k = 0
    a = x
    b = y
    ok = True
    while True:
        if a == b or used[a] or used[b]:
            ok = False
            break
        d1 = add[a, neg[b]]
        if dused[d1] or dused[neg[d1]]:
            ok = False
            break
        if merged:
            if _kind_taken(par, in_pure, in_mixed, a, b):
                ok = False
                break
            _mark_kind(par, in_pure, in_mixed, a, b, True)
        used[a] = True
        used[b] = True
        dused[d1] = True
        dused[neg[d1]] = True
        op[depth, k, 0] = a
        op[depth, k, 1] = b
        k += 1
        a = mulu[a]
        b = mulu[b]
        if (a == x and b == y) or (a == y and b == x):
            break
    opn[depth] = k
    mark[depth] = top[0]
    if ok:
        for j in range(k):
            pa = op[depth, j, 0]
            pb = op[depth, j, 1]
            if not _add_edge(e, pa, pb, n, end, size, trail_t, trail_v, trail_e, trail_s, top):
                ok = False
                break
            for s in range(R):
                g = reps[s]
                if not (
                    _add_edge(s, pa, pb, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
                    and _add_edge(s, add[pa, g], add[pb, g], n, end, size,
                                  trail_t, trail_v, trail_e, trail_s, top)
                ):
                    ok = False
                    break
            if not ok:
                break
    if not ok:
        _twin_release(depth, add, neg, par, merged, used, dused, in_pure, in_mixed, op, opn,
                      mark, end, size, trail_t, trail_v, trail_e, trail_s, top)
    return ok


@numba.njit(cache=True)
def _twin_release(depth, add, neg, par, merged, used, dused, in_pure, in_mixed, op, opn, mark,
                  end, size, trail_t, trail_v, trail_e, trail_s, top):
    """Undo the choice made at ``depth`` (:func:`_twin_place`)."""
    _undo(mark[depth], end, size, trail_t, trail_v, trail_e, trail_s, top)
    for j in range(opn[depth]):
        a = op[depth, j, 0]
        b = op[depth, j, 1]
        used[a] = False
        used[b] = False
        d1 = add[a, neg[b]]
        dused[d1] = False
        dused[neg[d1]] = False
        if merged:
            _mark_kind(par, in_pure, in_mixed, a, b, False)
    opn[depth] = 0


@numba.njit(cache=True)
def twin_probe_kernel(M, add, neg, mulu, par, tinv, mis, twist, merged, reps, seed, probes,
                      out_nodes, out_leaves):
    """Knuth's random probes of the tree of :func:`twin_search_kernel` (the same space and
    order of elements): ``out_nodes[p]`` and ``out_leaves[p]`` as in
    :func:`scheduler.factorization._search_kernel.probe_kernel`. Returns False when the fixed
    edges alone already close a short cycle (the space is empty; nothing is probed)."""
    np.random.seed(seed)
    n = M + 2
    (ok, used, dused, in_pure, in_mixed, op, opn, mark,
     end, size, trail_t, trail_v, trail_e, trail_s, top) = _twin_state(M, add, par, tinv, mis,
                                                                      twist, reps)
    if not ok:
        return False
    row = np.empty(M, np.int32)
    accepted = np.empty(M, np.int32)
    for p in range(probes):
        depth = 0
        weight = 1.0
        nodes = 0.0
        leaves = 0.0
        while True:
            x = 1
            while x < M and used[x]:
                x += 1
            if x == M:
                leaves = weight
                break
            c = 0
            for y in range(1, M):
                if y != x and not used[y] and not dused[add[x, neg[y]]]:
                    row[c] = y
                    c += 1
            nodes += weight * c
            f = 0
            for i in range(c):
                if _twin_place(depth, x, row[i], n, add, neg, mulu, par, merged, reps, used,
                               dused, in_pure, in_mixed, op, opn, mark,
                               end, size, trail_t, trail_v, trail_e, trail_s, top):
                    accepted[f] = row[i]
                    f += 1
                    _twin_release(depth, add, neg, par, merged, used, dused, in_pure, in_mixed,
                                  op, opn, mark, end, size, trail_t, trail_v, trail_e, trail_s,
                                  top)
            if f == 0:
                break
            _twin_place(depth, x, accepted[np.random.randint(0, f)], n, add, neg, mulu, par,
                        merged, reps, used, dused, in_pure, in_mixed, op, opn, mark,
                        end, size, trail_t, trail_v, trail_e, trail_s, top)
            weight *= f
            depth += 1
        while depth > 0:
            depth -= 1
            _twin_release(depth, add, neg, par, merged, used, dused, in_pure, in_mixed, op, opn,
                          mark, end, size, trail_t, trail_v, trail_e, trail_s, top)
        out_nodes[p] = nodes
        out_leaves[p] = leaves
    return True
