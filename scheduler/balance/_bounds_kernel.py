"""Numba kernels of the break lower bounds (:mod:`scheduler.balance.break_bounds`).

Kept in their own module so that importing the balancer never imports numba: only the bound
computation imports this module, when it runs. Notation of the module docstring of
:mod:`scheduler.balance.break_bounds`: a *class* ``x`` of round ``r`` is a 2-colouring in which
every game of ``r`` joins two colours (bit ``i`` of ``x``: the first team of game ``i`` has
colour 1), ``mono[b, a, x]`` the number of games of round ``a`` with both teams in one colour
under class ``x`` of round ``b``.
"""

from __future__ import annotations

import numba as nb
import numpy as np

BIG = 1 << 20
"""Stands for 'no such window' in the integer tables."""


@nb.njit(cache=True)
def class_masks(first, second, classes):
    """``masks[r, x]``: vertex bit mask of colour 1 under class ``x`` of round ``r``."""
    rounds, half = first.shape
    masks = np.zeros((rounds, classes), np.int64)
    for r in range(rounds):
        for x in range(classes):
            m = 0
            for i in range(half):
                if (x >> i) & 1:
                    m |= np.int64(1) << first[r, i]
                else:
                    m |= np.int64(1) << second[r, i]
            masks[r, x] = m
    return masks


@nb.njit(cache=True)
def mono_table(first, second, masks):
    """``mono[b, a, x]``: games of round ``a`` inside one colour of class ``x`` of round ``b``."""
    rounds, half = first.shape
    classes = masks.shape[1]
    mono = np.zeros((rounds, rounds, classes), np.int16)
    for b in range(rounds):
        for a in range(rounds):
            if a == b:
                continue
            for x in range(classes):
                t = masks[b, x]
                k = 0
                for i in range(half):
                    if ((t >> first[a, i]) & 1) == ((t >> second[a, i]) & 1):
                        k += 1
                mono[b, a, x] = k
    return mono


@nb.njit(cache=True)
def pair_windows(mono):
    """``w2[a, b, c] = min_x mono[b, a, x] + mono[b, c, x]`` for distinct ``a, b, c``."""
    rounds = mono.shape[0]
    classes = mono.shape[2]
    w2 = np.full((rounds, rounds, rounds), BIG, np.int64)
    for b in range(rounds):
        for a in range(rounds):
            if a == b:
                continue
            for c in range(a + 1, rounds):
                if c == b:
                    continue
                best = BIG
                for x in range(classes):
                    v = mono[b, a, x] + mono[b, c, x]
                    if v < best:
                        best = v
                w2[a, b, c] = best
                w2[c, b, a] = best
    return w2


@nb.njit(cache=True)
def _cycle_walk(first, second, game_of, side_of, a, b, games, edge_parity, starts):
    """The cycles of rounds ``a`` and ``b`` together, as a walk over the games of ``b``:
    ``games[k]`` the ``k``-th game, ``edge_parity[k]`` the parity of the game of ``a`` from it
    to the next game of its cycle (its two teams share a colour exactly when the xor of the
    orientation bits of the two games equals this parity), ``starts[k]`` whether a cycle starts
    at ``k``."""
    half = first.shape[1]
    partner = np.zeros(2 * half, np.int64)
    for i in range(half):
        partner[first[a, i]] = second[a, i]
        partner[second[a, i]] = first[a, i]
    seen = np.zeros(half, np.bool_)
    k = 0
    for g0 in range(half):
        if seen[g0]:
            continue
        g = g0
        entry = first[b, g]
        starts[k] = True
        while True:
            seen[g] = True
            out = second[b, g] if entry == first[b, g] else first[b, g]
            nxt = partner[out]
            h = game_of[b, nxt]
            games[k] = g
            edge_parity[k] = side_of[b, out] ^ side_of[b, nxt]
            k += 1
            if h == g0 and nxt == first[b, g0]:
                break
            if k < half:
                starts[k] = False
            g = h
            entry = nxt
    return k


@nb.njit(cache=True)
def cycle_tables(first, second, game_of, side_of):
    """:func:`_cycle_walk` for every ordered pair of distinct rounds."""
    rounds, half = first.shape
    cyc_games = np.zeros((rounds, rounds, half), np.int64)
    cyc_parity = np.zeros((rounds, rounds, half), np.int64)
    cyc_start = np.zeros((rounds, rounds, half), np.bool_)
    for a in range(rounds):
        for b in range(rounds):
            if a != b:
                _cycle_walk(first, second, game_of, side_of, a, b, cyc_games[a, b],
                            cyc_parity[a, b], cyc_start[a, b])
    return cyc_games, cyc_parity, cyc_start


@nb.njit(cache=True)
def bridge_table(first, second, masks, cyc_games, cyc_parity, cyc_start, c):
    """``g[a, b, x] = min over every colouring t_b of b of mono_a(t_b) + |t_b xor t_c|`` for
    class ``x`` of round ``c`` (the fewest breaks of the two steps ``a -> b -> c`` ending in
    that class, the first colouring free), by a dynamic programme round each cycle of ``a``
    and ``b`` together (two states per game of ``b``)."""
    rounds, half = first.shape
    classes = masks.shape[1]
    g = np.full((rounds, rounds, classes), BIG, np.int64)
    unary0 = np.zeros(half, np.int64)
    unary1 = np.zeros(half, np.int64)
    for b in range(rounds):
        if b == c:
            continue
        for x in range(classes):
            t = masks[c, x]
            for i in range(half):
                cf = (t >> first[b, i]) & 1
                cs = (t >> second[b, i]) & 1
                # orientation 1: first team colour 1, second colour 0
                unary1[i] = (1 - cf) + cs
                unary0[i] = cf + (1 - cs)
            for a in range(rounds):
                if a in (b, c):
                    continue
                total = 0
                gs = cyc_games[a, b]
                ps = cyc_parity[a, b]
                st = cyc_start[a, b]
                k = 0
                while k < half:
                    # one cycle from k: fix the orientation of its first game
                    end = k + 1
                    while end < half and not st[end]:
                        end += 1
                    best_cycle = BIG
                    for y0 in range(2):
                        v0 = BIG
                        v1 = BIG
                        if y0 == 0:
                            v0 = unary0[gs[k]]
                        else:
                            v1 = unary1[gs[k]]
                        for j in range(k + 1, end):
                            p = ps[j - 1]
                            # a game of a joins the two games; one colour when y ^ y' == p
                            n0 = min(v0 + (1 if p == 0 else 0), v1 + (1 if p == 1 else 0))
                            n1 = min(v0 + (1 if p == 1 else 0), v1 + (1 if p == 0 else 0))
                            v0 = n0 + unary0[gs[j]]
                            v1 = n1 + unary1[gs[j]]
                        p = ps[end - 1]
                        if y0 == 0:
                            close = min(v0 + (1 if p == 0 else 0), v1 + (1 if p == 1 else 0))
                        else:
                            close = min(v0 + (1 if p == 1 else 0), v1 + (1 if p == 0 else 0))
                        best_cycle = min(best_cycle, close)
                    total += best_cycle
                    k = end
                g[a, b, x] = total
    return g


@nb.njit(cache=True)
def triple_windows(first, second, game_of, side_of, masks, mono):
    """``w3[a, b, c, d]``: the fewest breaks of three consecutive steps between rounds ``a, b,
    c, d`` in this order, every colouring free: ``min over t_c of G_ab(t_c) + mono[c, d, t_c]``
    (:func:`bridge_table`)."""
    rounds = first.shape[0]
    classes = masks.shape[1]
    cyc_games, cyc_parity, cyc_start = cycle_tables(first, second, game_of, side_of)
    w3 = np.full((rounds, rounds, rounds, rounds), BIG, np.int64)
    for c in range(rounds):
        g = bridge_table(first, second, masks, cyc_games, cyc_parity, cyc_start, c)
        for b in range(rounds):
            if b == c:
                continue
            for a in range(rounds):
                if a in (b, c):
                    continue
                for d in range(rounds):
                    if d in (a, b, c):
                        continue
                    best = BIG
                    for x in range(classes):
                        v = g[a, b, x] + mono[c, d, x]
                        if v < best:
                            best = v
                    w3[a, b, c, d] = best
    return w3


@nb.njit(cache=True)
def quad_windows(first, second, game_of, side_of, masks):
    """``w4[a, b, c, d, e] = min over t_c of G_ab(t_c) + G_ed(t_c)``: the fewest breaks of four
    consecutive steps, every colouring free (:func:`bridge_table` on both sides)."""
    rounds = first.shape[0]
    classes = masks.shape[1]
    cyc_games, cyc_parity, cyc_start = cycle_tables(first, second, game_of, side_of)
    w4 = np.full((rounds, rounds, rounds, rounds, rounds), BIG, np.int32)
    for c in range(rounds):
        g = bridge_table(first, second, masks, cyc_games, cyc_parity, cyc_start, c)
        g16 = g.astype(np.int16)
        for a in range(rounds):
            for b in range(rounds):
                if a in (b, c) or b == c:
                    continue
                left = g16[a, b]
                for e in range(rounds):
                    if e in (a, b, c):
                        continue
                    for d in range(rounds):
                        if d in (a, b, c, e):
                            continue
                        if w4[e, d, c, b, a] < BIG:
                            w4[a, b, c, d, e] = w4[e, d, c, b, a]
                            continue
                        right = g16[e, d]
                        best = np.int16(32000)
                        for x in range(classes):
                            v = left[x] + right[x]
                            if v < best:
                                best = v
                        w4[a, b, c, d, e] = best
    return w4


@nb.njit(cache=True)
def pair_walk(w2, penalty):
    """Least ``sum w2(p_{q-1}, p_q, p_{q+1}) + sum penalty[p_q]`` over walks of ``rounds``
    positions whose three consecutive rounds are distinct; returns the value and the visits of
    every round by one least walk."""
    rounds = w2.shape[0]
    inf = 1e300
    value = np.full((rounds, rounds), inf)
    back = np.zeros((rounds, rounds, rounds), np.int64)
    for x in range(rounds):
        for y in range(rounds):
            if x != y:
                value[x, y] = penalty[x] + penalty[y]
    for q in range(2, rounds):
        nxt = np.full((rounds, rounds), inf)
        for x in range(rounds):
            for y in range(rounds):
                v = value[x, y]
                if v >= inf:
                    continue
                for z in range(rounds):
                    if z in (x, y):
                        continue
                    c = v + w2[x, y, z] + penalty[z]
                    if c < nxt[y, z]:
                        nxt[y, z] = c
                        back[q, y, z] = x
        value = nxt
    best = inf
    by = 0
    bz = 0
    for y in range(rounds):
        for z in range(rounds):
            if value[y, z] < best:
                best = value[y, z]
                by = y
                bz = z
    visits = np.zeros(rounds, np.int64)
    visits[bz] += 1
    visits[by] += 1
    for q in range(rounds - 1, 1, -1):
        x = back[q, by, bz]
        visits[x] += 1
        bz = by
        by = x
    return best, visits


@nb.njit(cache=True)
def triple_walk(w3, w2, penalty):
    """Least ``sum w3(four consecutive) + w2(first three) + w2(last three) + sum penalty``
    over walks of ``rounds`` positions whose four consecutive rounds are distinct; returns the
    value and the visits of every round by one least walk."""
    rounds = w3.shape[0]
    inf = 1e300
    value = np.full((rounds, rounds, rounds), inf)
    back = np.zeros((rounds, rounds, rounds, rounds), np.int8)
    for x in range(rounds):
        for y in range(rounds):
            for z in range(rounds):
                if x != y and y != z and x != z:
                    value[x, y, z] = w2[x, y, z] + penalty[x] + penalty[y] + penalty[z]
    for q in range(3, rounds):
        nxt = np.full((rounds, rounds, rounds), inf)
        for x in range(rounds):
            for y in range(rounds):
                for z in range(rounds):
                    v = value[x, y, z]
                    if v >= inf:
                        continue
                    for w in range(rounds):
                        if w in (x, y, z):
                            continue
                        c = v + w3[x, y, z, w] + penalty[w]
                        if c < nxt[y, z, w]:
                            nxt[y, z, w] = c
                            back[q, y, z, w] = x
        value = nxt
    best = inf
    bx = 0
    by = 0
    bz = 0
    for x in range(rounds):
        for y in range(rounds):
            for z in range(rounds):
                v = value[x, y, z]
                if v < inf:
                    v += w2[x, y, z]
                    if v < best:
                        best = v
                        bx = x
                        by = y
                        bz = z
    visits = np.zeros(rounds, np.int64)
    visits[bx] += 1
    visits[by] += 1
    visits[bz] += 1
    for q in range(rounds - 1, 2, -1):
        w = back[q, bx, by, bz]
        visits[w] += 1
        bz = by
        by = bx
        bx = w
    return best, visits


@nb.njit(cache=True)
def _popcount(x):
    x = x - ((x >> 1) & 0x5555555555555555)
    x = (x & 0x3333333333333333) + ((x >> 2) & 0x3333333333333333)
    x = (x + (x >> 4)) & 0x0F0F0F0F0F0F0F0F
    return (x * 0x0101010101010101) >> 56


@nb.njit(cache=True)
def order_path(masks, order, n):
    """Fewest breaks of the fixed round order ``order``: a shortest path through the classes
    of its rounds, a step costing ``min(d, n - d)``; returns the value and the class of every
    position on one shortest path."""
    positions = order.shape[0]
    classes = masks.shape[1]
    value = np.zeros(classes, np.int64)
    nxt = np.zeros(classes, np.int64)
    back = np.zeros((positions, classes), np.int64)
    for q in range(1, positions):
        prev = masks[order[q - 1]]
        cur = masks[order[q]]
        for y in range(classes):
            best = np.int64(1) << 40
            arg = 0
            my = cur[y]
            for x in range(classes):
                d = _popcount(prev[x] ^ my)
                if n - d < d:
                    d = n - d
                v = value[x] + d
                if v < best:
                    best = v
                    arg = x
            nxt[y] = best
            back[q, y] = arg
        value[:] = nxt
    last = 0
    for y in range(classes):
        if value[y] < value[last]:
            last = y
    path = np.zeros(positions, np.int64)
    path[positions - 1] = last
    for q in range(positions - 1, 0, -1):
        path[q - 1] = back[q, path[q]]
    return value[last], path


@nb.njit(cache=True)
def window_anneal(w3, w2, order, evaluations, seed, t_start, t_end):
    """Simulated annealing over round orders (segment reversal, insertion, swap) minimising the
    sum of three-step window values along the order; returns the best order met."""
    np.random.seed(seed)
    rounds = order.shape[0]

    def score(o):
        s = w2[o[0], o[1], o[2]] + w2[o[rounds - 3], o[rounds - 2], o[rounds - 1]]
        for j in range(rounds - 3):
            s += w3[o[j], o[j + 1], o[j + 2], o[j + 3]]
        return s

    cur = order.copy()
    cur_score = score(cur)
    best = cur.copy()
    best_score = cur_score
    cand = cur.copy()
    for it in range(evaluations):
        temp = t_start * (t_end / t_start) ** (it / max(1, evaluations - 1))
        cand[:] = cur
        kind = np.random.randint(3)
        i = np.random.randint(rounds)
        j = np.random.randint(rounds)
        if i > j:
            i, j = j, i
        if i == j:
            continue
        if kind == 0:
            cand[i:j + 1] = cur[i:j + 1][::-1]
        elif kind == 1:
            moved = cur[i]
            cand[i:j] = cur[i + 1:j + 1]
            cand[j] = moved
        else:
            cand[i] = cur[j]
            cand[j] = cur[i]
        s = score(cand)
        if s <= cur_score or np.random.random() < np.exp((cur_score - s) / temp):
            cur[:] = cand
            cur_score = s
            if s < best_score:
                best_score = s
                best[:] = cand
    return best_score, best


@nb.njit(cache=True)
def quad_walk(w4, w3, w2, penalty):
    """Least ``w2 + w3 (clipped windows at both ends) + sum w4(five consecutive) + sum
    penalty`` over walks of ``rounds`` positions whose five consecutive rounds are distinct;
    returns the value and the visits of every round by one least walk."""
    rounds = w4.shape[0]
    inf = 1e300
    value = np.full((rounds, rounds, rounds, rounds), inf)
    back = np.zeros((rounds, rounds, rounds, rounds, rounds), np.int8)
    for a in range(rounds):
        for b in range(rounds):
            for c in range(rounds):
                for d in range(rounds):
                    if a in (b, c, d) or b in (c, d) or c == d:
                        continue
                    value[a, b, c, d] = (w2[a, b, c] + w3[a, b, c, d] + penalty[a] + penalty[b]
                                         + penalty[c] + penalty[d])
    for q in range(4, rounds):
        nxt = np.full((rounds, rounds, rounds, rounds), inf)
        for a in range(rounds):
            for b in range(rounds):
                for c in range(rounds):
                    for d in range(rounds):
                        v = value[a, b, c, d]
                        if v >= inf:
                            continue
                        for e in range(rounds):
                            if e in (a, b, c, d):
                                continue
                            cost = v + w4[a, b, c, d, e] + penalty[e]
                            if cost < nxt[b, c, d, e]:
                                nxt[b, c, d, e] = cost
                                back[q, b, c, d, e] = a
        value = nxt
    best = inf
    ba = 0
    bb = 0
    bc = 0
    bd = 0
    for a in range(rounds):
        for b in range(rounds):
            for c in range(rounds):
                for d in range(rounds):
                    v = value[a, b, c, d]
                    if v < inf:
                        v += w3[a, b, c, d] + w2[b, c, d]
                        if v < best:
                            best = v
                            ba = a
                            bb = b
                            bc = c
                            bd = d
    visits = np.zeros(rounds, np.int64)
    visits[ba] += 1
    visits[bb] += 1
    visits[bc] += 1
    visits[bd] += 1
    for q in range(rounds - 1, 3, -1):
        a = back[q, ba, bb, bc, bd]
        visits[a] += 1
        bd = bc
        bc = bb
        bb = ba
        ba = a
    return best, visits


@nb.njit(cache=True)
def _step(masks, prev_round, cur_round, value, out, n):
    """``out[y] = min over x of value[x] + min(d, n - d)`` between class ``x`` of
    ``prev_round`` and class ``y`` of ``cur_round``."""
    classes = masks.shape[1]
    prev = masks[prev_round]
    cur = masks[cur_round]
    for y in range(classes):
        best = np.int64(1) << 40
        my = cur[y]
        for x in range(classes):
            d = _popcount(prev[x] ^ my)
            if n - d < d:
                d = n - d
            v = value[x] + d
            if v < best:
                best = v
        out[y] = best


@nb.njit(cache=True)
def path_tables(masks, order, n):
    """``forward[q, y]``: fewest breaks of positions ``0..q`` ending in class ``y``;
    ``backward[q, y]``: of positions ``q..end`` starting in class ``y``."""
    positions = order.shape[0]
    classes = masks.shape[1]
    forward = np.zeros((positions, classes), np.int64)
    backward = np.zeros((positions, classes), np.int64)
    for q in range(1, positions):
        _step(masks, order[q - 1], order[q], forward[q - 1], forward[q], n)
    for q in range(positions - 2, -1, -1):
        _step(masks, order[q + 1], order[q], backward[q + 1], backward[q], n)
    return forward, backward


@nb.njit(cache=True)
def reversed_value(masks, order, i, j, forward, backward, n):
    """Fewest breaks of ``order`` with the positions ``i..j`` reversed, from the tables of
    :func:`path_tables` (only the steps into and through the segment are recomputed)."""
    positions = order.shape[0]
    classes = masks.shape[1]
    value = np.zeros(classes, np.int64)
    out = np.zeros(classes, np.int64)
    prev = -1
    if i > 0:
        value[:] = forward[i - 1]
        prev = order[i - 1]
    for k in range(j, i - 1, -1):
        if prev >= 0:
            _step(masks, prev, order[k], value, out, n)
            value[:] = out
        prev = order[k]
    if j + 1 < positions:
        _step(masks, prev, order[j + 1], value, out, n)
        best = np.int64(1) << 40
        for y in range(classes):
            v = out[y] + backward[j + 1, y]
            if v < best:
                best = v
        return best
    return value.min()
