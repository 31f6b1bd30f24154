"""Numba kernel of the perfect-starter search (imported lazily by ``search.py``).

Iterative randomised backtracking over starters that are invariant under a multiplier
automorphism ``x -> u x`` (``u = 1`` gives plain starters). For each difference representative
``g`` the partial union ``F_0 ∪ F_g`` is kept as a set of paths (endpoint pointers and path
sizes, undone through a trail); a pair is refused as soon as it closes a cycle shorter than
``m + 1`` in any of these unions.

``probe_kernel`` walks random paths of the same tree for Knuth's estimate of its size
(:mod:`scheduler.factorization.tree_size`). Its steps (``_place_orbit``, ``_release_orbit``) are
those of the search's inner loop, which ``search_kernel`` keeps written out inline: calling the
helpers there made the search 1.4-2 times slower (measured on ``Z_39`` and ``Z_51``), and the
tests hold the two together (the estimates must meet the node counts of complete searches).
"""

from __future__ import annotations

import numba
import numpy as np


@numba.njit(cache=True)
def _add_edge(t, a, b, n, end, size, trail_t, trail_v, trail_e, trail_s, top):
    """Add edge {a, b} to the path system ``t``; False if it closes a short cycle."""
    ea = end[t, a]
    eb = end[t, b]
    if ea == b:
        return size[t, a] == n
    s = size[t, a] + size[t, b]
    k = top[0]
    trail_t[k] = t
    trail_v[k] = ea
    trail_e[k] = end[t, ea]
    trail_s[k] = size[t, ea]
    trail_t[k + 1] = t
    trail_v[k + 1] = eb
    trail_e[k + 1] = end[t, eb]
    trail_s[k + 1] = size[t, eb]
    top[0] = k + 2
    end[t, ea] = eb
    end[t, eb] = ea
    size[t, ea] = s
    size[t, eb] = s
    return True


@numba.njit(cache=True)
def _undo(mark, end, size, trail_t, trail_v, trail_e, trail_s, top):
    k = top[0]
    while k > mark:
        k -= 1
        end[trail_t[k], trail_v[k]] = trail_e[k]
        size[trail_t[k], trail_v[k]] = trail_s[k]
    top[0] = mark


@numba.njit(cache=True)
def _path_state(T, n):
    """Fresh union-find-like path state for ``T`` partial unions on ``n`` vertices: each
    vertex is the end of its own path of size 1; empty undo trails."""
    end = np.empty((T, n), np.int32)
    size = np.ones((T, n), np.int32)
    for t in range(T):
        for v in range(n):
            end[t, v] = v
    cap = 4 * T * n + 16
    trail_t = np.empty(cap, np.int32)
    trail_v = np.empty(cap, np.int32)
    trail_e = np.empty(cap, np.int32)
    trail_s = np.empty(cap, np.int32)
    top = np.zeros(1, np.int64)
    return end, size, trail_t, trail_v, trail_e, trail_s, top


@numba.njit(cache=True)
def _shuffle_row(cand, depth, c):
    """Fisher-Yates shuffle of ``cand[depth, :c]`` with numba's seeded generator."""
    for i in range(c - 1, 0, -1):
        j = np.random.randint(0, i + 1)
        tmp = cand[depth, i]
        cand[depth, i] = cand[depth, j]
        cand[depth, j] = tmp


@numba.njit(cache=True, inline="always")
def _place_orbit(depth, x, y, n, add, neg, mulu, reps, weights, max_bad, used, dused, op, opn,
                 mark, bad_depth, badw, end, size, trail_t, trail_v, trail_e, trail_s, top):
    """Pair ``x`` with ``y`` together with the orbit of ``{x, y}`` under the multiplier, as the
    choice made at ``depth``. Returns False (with everything undone) when an element or a
    difference is taken twice or the bad weight of the unions would exceed ``max_bad``."""
    mark[depth] = top[0]
    k = 0
    a = x
    b = y
    ok = True
    while True:
        if a == b or used[a] or used[b]:
            ok = False
            break
        d1 = add[a, neg[b]]
        d2 = neg[d1]
        if dused[d1]:
            ok = False
            break
        used[a] = True
        used[b] = True
        dused[d1] = True
        dused[d2] = True
        op[depth, k, 0] = a
        op[depth, k, 1] = b
        k += 1
        a = mulu[a]
        b = mulu[b]
        if (a == x and b == y) or (a == y and b == x):
            break
    opn[depth] = k
    T = reps.shape[0]
    if ok:
        for j in range(k):
            if not ok:
                break
            pa = op[depth, j, 0]
            pb = op[depth, j, 1]
            for t in range(T):
                if bad_depth[t] >= 0:
                    continue
                g = reps[t]
                if not (
                    _add_edge(t, pa, pb, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
                    and _add_edge(t, add[pa, g], add[pb, g], n, end, size,
                                  trail_t, trail_v, trail_e, trail_s, top)
                ):
                    bad_depth[t] = depth
                    badw[0] += weights[t]
                    if badw[0] > max_bad:
                        ok = False
                        break
        if not ok:
            _undo(mark[depth], end, size, trail_t, trail_v, trail_e, trail_s, top)
            for t in range(T):
                if bad_depth[t] == depth:
                    bad_depth[t] = -1
                    badw[0] -= weights[t]
    if not ok:
        _unmark_pairs(depth, add, neg, used, dused, op, opn)
    return ok


@numba.njit(cache=True, inline="always")
def _unmark_pairs(depth, add, neg, used, dused, op, opn):
    """Free the elements and differences of the pairs chosen at ``depth``."""
    for j in range(opn[depth]):
        a = op[depth, j, 0]
        b = op[depth, j, 1]
        used[a] = False
        used[b] = False
        d1 = add[a, neg[b]]
        dused[d1] = False
        dused[neg[d1]] = False
    opn[depth] = 0


@numba.njit(cache=True, inline="always")
def _release_orbit(depth, add, neg, weights, used, dused, op, opn, mark, bad_depth, badw,
                   end, size, trail_t, trail_v, trail_e, trail_s, top):
    """Undo the choice made at ``depth`` (:func:`_place_orbit`)."""
    _undo(mark[depth], end, size, trail_t, trail_v, trail_e, trail_s, top)
    for t in range(bad_depth.shape[0]):
        if bad_depth[t] == depth:
            bad_depth[t] = -1
            badw[0] -= weights[t]
    _unmark_pairs(depth, add, neg, used, dused, op, opn)


@numba.njit(cache=True)
def _search_state(m, reps):
    """The empty partial starter: the path systems of the unions ``F_0 ∪ F_g`` with the edges at
    infinity, the element and difference marks and the per-depth records."""
    n = m + 1
    T = reps.shape[0]
    end, size, trail_t, trail_v, trail_e, trail_s, top = _path_state(T, n)
    for t in range(T):
        _add_edge(t, m, 0, n, end, size, trail_t, trail_v, trail_e, trail_s, top)
        _add_edge(t, m, reps[t], n, end, size, trail_t, trail_v, trail_e, trail_s, top)
    top[0] = 0
    used = np.zeros(m, np.bool_)
    used[0] = True
    dused = np.zeros(m, np.bool_)
    maxd = (m - 1) // 2 + 1
    mark = np.zeros(maxd, np.int64)
    op = np.empty((maxd, m, 2), np.int32)
    opn = np.zeros(maxd, np.int32)
    bad_depth = np.full(T, -1, np.int32)
    badw = np.zeros(1, np.int64)
    return (used, dused, op, opn, mark, bad_depth, badw,
            end, size, trail_t, trail_v, trail_e, trail_s, top)


@numba.njit(cache=True, inline="always")
def _candidates(x, m, add, neg, used, dused, allowed, row):
    """Write the partners ``y`` still open to ``x`` into ``row``; returns how many."""
    c = 0
    for y in range(1, m):
        if y != x and not used[y] and not dused[add[x, neg[y]]] and allowed[x, y]:
            row[c] = y
            c += 1
    return c


@numba.njit(cache=True)
def search_kernel(m, add, neg, mulu, reps, weights, max_bad, seed, node_limit, out_pairs,
                  forced, allowed):
    """Returns ``(status, nodes, bad)``: status 1 found (pairs in ``out_pairs``), 0 node limit
    hit, -1 search space exhausted (no such multiplier-invariant starter exists).

    ``forced[d]`` (for ``d < len(forced)``) is the only partner tried at depth ``d``: the search
    then covers the subtree below that choice, and -1 says the subtree is exhausted.
    ``allowed[x, y]`` False keeps the pair ``{x, y}`` out of every starter searched (the pairs
    ruled out by :mod:`scheduler.factorization.unit_classes`; all True: no restriction); it
    must be invariant under the multiplier, as the pair's orbit is placed with it.

    A representative ``reps[t]`` whose union closes a short cycle becomes *bad* and costs
    ``weights[t]``; a partial starter is refused once the bad weight exceeds ``max_bad``
    (``max_bad = 0``: perfect starters only). ``bad`` is the bad weight of the starter found.
    """
    np.random.seed(seed)
    n = m + 1
    T = reps.shape[0]
    # the bad weight stays a plain local here (the helpers' one-element array is for them)
    (used, dused, op, opn, mark, bad_depth, _,
     end, size, trail_t, trail_v, trail_e, trail_s, top) = _search_state(m, reps)
    maxd = (m - 1) // 2 + 1
    cand = np.empty((maxd, m), np.int32)
    ncand = np.zeros(maxd, np.int32)
    ci = np.zeros(maxd, np.int32)
    cx = np.zeros(maxd, np.int32)
    badw = 0
    depth = 0
    nodes = 0
    need_gen = True
    while True:
        if need_gen:
            x = 1
            while x < m and used[x]:
                x += 1
            if x == m:
                k = 0
                for d in range(depth):
                    for j in range(opn[d]):
                        out_pairs[k, 0] = op[d, j, 0]
                        out_pairs[k, 1] = op[d, j, 1]
                        k += 1
                return 1, nodes, badw
            c = 0
            if depth < forced.shape[0]:
                y = forced[depth]
                if (0 < y < m and y != x and not used[y] and not dused[add[x, neg[y]]]
                        and allowed[x, y]):
                    cand[depth, 0] = y
                    c = 1
            else:
                for y in range(1, m):
                    if y != x and not used[y] and not dused[add[x, neg[y]]] and allowed[x, y]:
                        cand[depth, c] = y
                        c += 1
                _shuffle_row(cand, depth, c)
            cx[depth] = x
            ncand[depth] = c
            ci[depth] = 0
            need_gen = False
        if ci[depth] >= ncand[depth]:
            if depth == 0:
                return -1, nodes, badw
            depth -= 1
            _undo(mark[depth], end, size, trail_t, trail_v, trail_e, trail_s, top)
            for t in range(T):
                if bad_depth[t] == depth:
                    bad_depth[t] = -1
                    badw -= weights[t]
            for j in range(opn[depth]):
                a = op[depth, j, 0]
                b = op[depth, j, 1]
                used[a] = False
                used[b] = False
                d1 = add[a, neg[b]]
                dused[d1] = False
                dused[neg[d1]] = False
            continue
        x = cx[depth]
        y = cand[depth, ci[depth]]
        ci[depth] += 1
        nodes += 1
        if nodes > node_limit:
            return 0, nodes, badw
        # orbit of the pair {x, y} under the multiplier
        k = 0
        a = x
        b = y
        ok = True
        while True:
            if a == b or used[a] or used[b]:
                ok = False
                break
            d1 = add[a, neg[b]]
            d2 = neg[d1]
            if dused[d1]:
                ok = False
                break
            used[a] = True
            used[b] = True
            dused[d1] = True
            dused[d2] = True
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
                if not ok:
                    break
                pa = op[depth, j, 0]
                pb = op[depth, j, 1]
                for t in range(T):
                    if bad_depth[t] >= 0:
                        continue
                    g = reps[t]
                    if not (
                        _add_edge(t, pa, pb, n, end, size,
                                  trail_t, trail_v, trail_e, trail_s, top)
                        and _add_edge(t, add[pa, g], add[pb, g], n, end, size,
                                      trail_t, trail_v, trail_e, trail_s, top)
                    ):
                        bad_depth[t] = depth
                        badw += weights[t]
                        if badw > max_bad:
                            ok = False
                            break
            if not ok:
                _undo(mark[depth], end, size, trail_t, trail_v, trail_e, trail_s, top)
                for t in range(T):
                    if bad_depth[t] == depth:
                        bad_depth[t] = -1
                        badw -= weights[t]
        if not ok:
            for j in range(k):
                a = op[depth, j, 0]
                b = op[depth, j, 1]
                used[a] = False
                used[b] = False
                d1 = add[a, neg[b]]
                dused[d1] = False
                dused[neg[d1]] = False
            continue
        depth += 1
        need_gen = True


@numba.njit(cache=True)
def probe_kernel(m, add, neg, mulu, reps, weights, max_bad, seed, probes, out_nodes, out_leaves,
                 forced, allowed):
    """Knuth's random probes of the tree that :func:`search_kernel` walks.

    Each probe goes down from the root, at every partial starter trying each open partner (as
    the search does), and continues with one of the ``f`` accepted partners chosen uniformly;
    the product of the ``f`` met so far is the probe's weight. ``out_nodes[p]`` is the sum over
    the partial starters of the probe of weight times partners tried, ``out_leaves[p]`` the
    weight when the probe ends in a whole starter (0 otherwise): unbiased estimates of the nodes
    of one complete search and of the number of accepted starters. ``forced`` restricts the
    first choices and ``allowed`` the pairs as in :func:`search_kernel` (the estimate is then
    that of the subtree).
    """
    np.random.seed(seed)
    n = m + 1
    (used, dused, op, opn, mark, bad_depth, badw,
     end, size, trail_t, trail_v, trail_e, trail_s, top) = _search_state(m, reps)
    row = np.empty(m, np.int32)
    accepted = np.empty(m, np.int32)
    for p in range(probes):
        depth = 0
        weight = 1.0
        nodes = 0.0
        leaves = 0.0
        while True:
            x = 1
            while x < m and used[x]:
                x += 1
            if x == m:
                leaves = weight
                break
            if depth < forced.shape[0]:
                y = forced[depth]
                c = 0
                if (0 < y < m and y != x and not used[y] and not dused[add[x, neg[y]]]
                        and allowed[x, y]):
                    row[0] = y
                    c = 1
            else:
                c = _candidates(x, m, add, neg, used, dused, allowed, row)
            nodes += weight * c
            f = 0
            for i in range(c):
                if _place_orbit(depth, x, row[i], n, add, neg, mulu, reps, weights, max_bad,
                                used, dused, op, opn, mark, bad_depth, badw,
                                end, size, trail_t, trail_v, trail_e, trail_s, top):
                    accepted[f] = row[i]
                    f += 1
                    _release_orbit(depth, add, neg, weights, used, dused, op, opn, mark,
                                   bad_depth, badw, end, size, trail_t, trail_v, trail_e,
                                   trail_s, top)
            if f == 0:
                break
            _place_orbit(depth, x, accepted[np.random.randint(0, f)], n, add, neg, mulu, reps,
                         weights, max_bad, used, dused, op, opn, mark, bad_depth, badw,
                         end, size, trail_t, trail_v, trail_e, trail_s, top)
            weight *= f
            depth += 1
        while depth > 0:
            depth -= 1
            _release_orbit(depth, add, neg, weights, used, dused, op, opn, mark, bad_depth, badw,
                           end, size, trail_t, trail_v, trail_e, trail_s, top)
        out_nodes[p] = nodes
        out_leaves[p] = leaves
