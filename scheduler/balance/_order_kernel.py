"""Numba kernels of the round-order search (:mod:`scheduler.balance.orders`).

Kept in their own module so that importing the balancer never imports numba: only the search
imports this module, when it runs (numba's import and compile time are paid by searches only).
"""

from __future__ import annotations

import numba as nb
import numpy as np


@nb.njit(cache=True)
def _popcount(x: int) -> int:
    c = 0
    while x:
        x &= x - 1
        c += 1
    return c


@nb.njit(cache=True)
def _exact_value(masks, order, flips, keep):
    """Value of :func:`_exact_path` without the back pointers (a plain min, which vectorises)."""
    R, S = masks.shape
    f = np.zeros(S, np.int64)
    g = np.empty(S, np.int64)
    for q in range(1, R):
        a = masks[order[q - 1]]
        b = masks[order[q]]
        fl = flips[q - 1] ^ flips[q]
        for y in range(S):
            best = 1 << 40
            by = (b[y] ^ fl) & keep
            for x in range(S):
                v = f[x] + _popcount((a[x] & keep) ^ by)
                best = min(best, v)
            g[y] = best
        f[:] = g
    return f.min()


@nb.njit(cache=True)
def _exact_path(masks, order, flips, keep, back):
    """Shortest path through the colouring layers ``masks[order[q]]``; ``back[q, y]`` gets the
    best predecessor of state ``y`` at position ``q``. A step costs the Hamming distance of the
    colourings xor ``flips`` (the byes, see :class:`BreakPaths`) on the bits of ``keep``.
    Returns (value, last state)."""
    R, S = masks.shape
    f = np.zeros(S, np.int64)
    g = np.empty(S, np.int64)
    for q in range(1, R):
        a = masks[order[q - 1]]
        b = masks[order[q]]
        fl = flips[q - 1] ^ flips[q]
        for y in range(S):
            best = 1 << 40
            arg = 0
            by = (b[y] ^ fl) & keep
            for x in range(S):
                v = f[x] + _popcount((a[x] & keep) ^ by)
                if v < best:
                    best = v
                    arg = x
            g[y] = best
            back[q, y] = arg
        f[:] = g
    last = 0
    for y in range(S):
        if f[y] < f[last]:
            last = y
    return f[last], last


@nb.njit(cache=True)
def _free(u, w, ea, eb, r):
    """Best colouring of round ``r`` between the colourings ``u`` and ``w``: (cost, mask)."""
    c = 0
    mask = 0
    for i in range(ea.shape[1]):
        a = ea[r, i]
        b = eb[r, i]
        ua = (u >> a) & 1
        wa = (w >> a) & 1
        ub = (u >> b) & 1
        wb = (w >> b) & 1
        c1 = (ua != 1) + (wa != 1) + (ub != 0) + (wb != 0)
        c2 = (ua != 0) + (wa != 0) + (ub != 1) + (wb != 1)
        if c1 <= c2:
            c += c1
            mask |= 1 << a
        else:
            c += c2
            mask |= 1 << b
    return c, mask


@nb.njit(cache=True)
def _candidate_path(cand, order, ea, eb, F, back, kind):
    """Shortest path over candidate colourings, a single free round allowed between two
    candidate rounds. ``kind[q, y]`` is 1 (from ``q - 1``) or 2 (from ``q - 2`` through a free
    round); ``back[q, y]`` the predecessor state. Returns (value, last state)."""
    R, S = cand.shape
    INF = 1 << 40
    for y in range(S):
        F[0, y] = 0
    for q in range(1, R):
        b = cand[order[q]]
        a = cand[order[q - 1]]
        for y in range(S):
            best = INF
            arg = 0
            kd = 1
            for x in range(S):
                v = F[q - 1, x] + _popcount(a[x] ^ b[y])
                if v < best:
                    best = v
                    arg = x
            if q >= 2:
                a2 = cand[order[q - 2]]
                for x in range(S):
                    if F[q - 2, x] >= best:
                        continue
                    c, _m = _free(a2[x], b[y], ea, eb, order[q - 1])
                    v = F[q - 2, x] + c
                    if v < best:
                        best = v
                        arg = x
                        kd = 2
            F[q, y] = best
            back[q, y] = arg
            kind[q, y] = kd
    last = 0
    for y in range(S):
        if F[R - 1, y] < F[R - 1, last]:
            last = y
    return F[R - 1, last], last


@nb.njit(cache=True)
def _beam_step(states, vals, cand_s, ea, eb, s, width, out_m, out_v, out_p):
    """One layer of the beam path: the children of every state in round ``s`` (each best
    response, all of them when at most four games are monochromatic, and every candidate
    colouring of ``s``), the ``width`` best distinct ones kept. Returns their number."""
    half = ea.shape[1]
    K = states.shape[0]
    cap = out_m.shape[0]
    cnt = 0
    mono = np.empty(half, np.int64)
    for i in range(K):
        t = states[i]
        base = 0
        nm = 0
        for e in range(half):
            a = ea[s, e]
            b = eb[s, e]
            ta = (t >> a) & 1
            tb = (t >> b) & 1
            if ta != tb:
                base |= t & ((1 << a) | (1 << b))
            else:
                mono[nm] = e
                nm += 1
        combos = 1 << nm if nm <= 4 else 2
        for c in range(combos):
            m = base
            for j in range(nm):
                e = mono[j]
                bit = (c >> j) & 1 if nm <= 4 else (c + j) & 1
                m |= (1 << ea[s, e]) if bit else (1 << eb[s, e])
            if cnt < cap:
                out_m[cnt] = m
                out_v[cnt] = vals[i] + nm
                out_p[cnt] = i
                cnt += 1
    for j in range(cand_s.shape[0]):
        best = 1 << 40
        arg = 0
        for i in range(K):
            v = vals[i] + _popcount(states[i] ^ cand_s[j])
            if v < best:
                best = v
                arg = i
        if cnt < cap:
            out_m[cnt] = cand_s[j]
            out_v[cnt] = best
            out_p[cnt] = arg
            cnt += 1
    # distinct masks, the lowest value (then lowest mask) first; keep ``width``
    vm = out_v[:cnt]
    mm = out_m[:cnt]
    idx = np.argsort(mm, kind="mergesort")
    idx = idx[np.argsort(vm[idx], kind="mergesort")]
    kept = 0
    sel_m = np.empty(width, np.int64)
    sel_v = np.empty(width, np.int64)
    sel_p = np.empty(width, np.int64)
    for r in range(cnt):
        i = idx[r]
        dup = False
        for j in range(kept):
            if sel_m[j] == mm[i]:
                dup = True
                break
        if dup:
            continue
        sel_m[kept] = mm[i]
        sel_v[kept] = vm[i]
        sel_p[kept] = out_p[i]
        kept += 1
        if kept == width:
            break
    out_m[:kept] = sel_m[:kept]
    out_v[:kept] = sel_v[:kept]
    out_p[:kept] = sel_p[:kept]
    return kept


@nb.njit(cache=True)
def _beam_path(cand, order, ea, eb, width, M, V, P, N):
    """Beam path over the layers: ``M[q, :N[q]]`` the kept colourings of position ``q``,
    ``V`` their values, ``P`` their parents. Returns (value, index of the best last state)."""
    R, S = cand.shape
    cap = M.shape[1]
    r0 = order[0]
    for j in range(S):
        M[0, j] = cand[r0, j]
        V[0, j] = 0
        P[0, j] = 0
    N[0] = S
    om = np.empty(cap, np.int64)
    ov = np.empty(cap, np.int64)
    op = np.empty(cap, np.int64)
    for q in range(1, R):
        k = _beam_step(M[q - 1, :N[q - 1]], V[q - 1, :N[q - 1]], cand[order[q]], ea, eb,
                       order[q], width, om, ov, op)
        M[q, :k] = om[:k]
        V[q, :k] = ov[:k]
        P[q, :k] = op[:k]
        N[q] = k
    best = 0
    for j in range(N[R - 1]):
        if V[R - 1, j] < V[R - 1, best]:
            best = j
    return V[R - 1, best], best
