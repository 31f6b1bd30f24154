"""Numba kernel of the Kempe-chain local search (imported lazily by ``improve.py``).

State: partner table ``P`` (rounds x vertices). A move picks two rounds ``i``, ``j`` and a
vertex ``v`` and exchanges the edges of ``i`` and ``j`` along the alternating cycle of
``F_i ∪ F_j`` through ``v`` (a Kempe-chain interchange: the result is again a one-factorization).
Only pairs involving ``i`` or ``j`` change; they are re-walked. Moves are accepted by a
simulated-annealing rule on the number of perfect pairs (S. Kirkpatrick, C. D. Gelatt,
M. P. Vecchi, "Optimization by simulated annealing", Science 220 (1983)).
"""

from __future__ import annotations

import numba
import numpy as np


@numba.njit(cache=True)
def _is_ham(P, i, j, n):
    v = 0
    steps = 0
    while True:
        v = P[j, P[i, v]]
        steps += 1
        if v == 0:
            return steps == n // 2


@numba.njit(cache=True)
def pair_matrix(P, H):
    """Fill ``H[i, j]`` (is ``F_i ∪ F_j`` Hamiltonian?) and return the number of such pairs."""
    R = P.shape[0]
    n = P.shape[1]
    score = 0
    for i in range(R):
        H[i, i] = False
        for j in range(i + 1, R):
            h = _is_ham(P, i, j, n)
            H[i, j] = h
            H[j, i] = h
            if h:
                score += 1
    return score


@numba.njit(cache=True)
def kempe_anneal(P, H, score, seed, iters, t_start, t_end, best_P):
    """Anneal in place on ``P`` and its pair matrix ``H`` (current count ``score``).

    The best table seen in this call is copied to ``best_P``. Returns
    ``(best_score, final_score)``, scores being numbers of perfect pairs.
    """
    np.random.seed(seed)
    R = P.shape[0]
    n = P.shape[1]
    best = score
    best_P[:, :] = P
    cyc = np.empty(n, np.int32)
    new_i = np.empty(R, np.bool_)
    new_j = np.empty(R, np.bool_)
    for it in range(iters):
        i = np.random.randint(0, R)
        j = np.random.randint(0, R - 1)
        if j >= i:
            j += 1
        if H[i, j]:
            continue  # swapping along a Hamiltonian cycle only exchanges the two rounds
        v = np.random.randint(0, n)
        # alternating cycle through v
        length = 0
        x = v
        while True:
            cyc[length] = x
            length += 1
            y = P[i, x]
            cyc[length] = y
            length += 1
            x = P[j, y]
            if x == v:
                break
        # swap: edges (cyc[2k], cyc[2k+1]) were in i, (cyc[2k+1], cyc[2k+2]) in j
        for k in range(0, length, 2):
            a = cyc[k]
            b = cyc[k + 1]
            c = cyc[(k + 2) % length]
            # after: (a,b) in j, (b,c) in i
            P[j, a] = b
            P[j, b] = a
            P[i, b] = c
            P[i, c] = b
        delta = 0
        for k in range(R):
            if k == i or k == j:  # noqa: SIM109 (numba)
                continue
            hi = _is_ham(P, i, k, n)
            hj = _is_ham(P, j, k, n)
            new_i[k] = hi
            new_j[k] = hj
            delta += (1 if hi else 0) - (1 if H[i, k] else 0)
            delta += (1 if hj else 0) - (1 if H[j, k] else 0)
        hij = _is_ham(P, i, j, n)
        delta += (1 if hij else 0) - (1 if H[i, j] else 0)
        temp = t_start * (t_end / t_start) ** (it / max(1, iters - 1))
        accept = delta >= 0 or np.random.random() < np.exp(delta / temp)
        if accept:
            for k in range(R):
                if k == i or k == j:  # noqa: SIM109 (numba)
                    continue
                H[i, k] = new_i[k]
                H[k, i] = new_i[k]
                H[j, k] = new_j[k]
                H[k, j] = new_j[k]
            H[i, j] = hij
            H[j, i] = hij
            score += delta
            if score > best:
                best = score
                best_P[:, :] = P
        else:
            # undo: swap back (same cycle, now edges (a,b) in j and (b,c) in i)
            for k in range(0, length, 2):
                a = cyc[k]
                b = cyc[k + 1]
                c = cyc[(k + 2) % length]
                P[i, a] = b
                P[i, b] = a
                P[j, b] = c
                P[j, c] = b
    return best, score
