"""Compiled kernel of the parity-check column decision (:mod:`gf2codes._columns`).

Declared with :func:`gf2codes._jit.kernel` (compiled or loaded from numba's cache on
first call). One resumable depth-first search, the compiled twin of
``gf2codes._columns._ColumnSearch`` (the plain-Python version, which the tests run on
the same inputs and demand the same answer, node count and witness from). All state
lives in arrays owned by the caller, so the search runs in chunks of nodes and the
caller can check the clock, report progress and honour Ctrl-C between chunks.

Columns of the parity-check matrix are integers of ``r`` bits, bit ``r - 1 - i`` being
coordinate (row) ``i``.
"""

from __future__ import annotations

import numpy as np

from ._jit import kernel
from ._kernels import popcount64

__all__ = ["column_dfs"]


@kernel("int64(uint64[:, ::1], int64[::1], int64[::1], uint64[::1], uint64[::1], uint64[::1], "
        "int64[::1], int64[:, ::1], int64[:, ::1], int64[::1], int64[::1], int64[::1], "
        "int64, int64, int64, int64, int64)", nogil=True)
def column_dfs(cand, cand_len, pos, tied, cols, sums, offs, sums_len, ones, mark, work, state,
               free, dist, r, lmin, max_nodes):  # pragma: no cover - compiled
    """Run the column backtrack until it finishes or ``state[1]`` reaches ``max_nodes``.

    ``cand[L, :cand_len[L]]`` are the candidates at depth ``L`` (``L`` free columns
    chosen; ``pos[L]`` the next to try), ``tied[L]`` the tied row pairs,
    ``sums[offs[t] : offs[t] + sums_len[L, t]]`` the XORs of the ``t``-sets of the chosen
    columns (frame included, ``t <= dist - 3``), ``ones[L, h]`` the number of chosen
    columns ``c`` with ``h . c = 1`` (only when ``lmin > 0``), ``mark`` and ``work``
    scratch arrays of ``2^r`` entries, ``state = [depth, nodes, stamp]``.
    Returns 1 (all ``free`` columns chosen: ``cols`` is a witness), 2 (search finished:
    no code) or 0 (budget reached; call again to continue).
    """
    one = np.uint64(1)
    rmask = (one << np.uint64(r)) - one
    size = 1 << r
    top = dist - 2
    L = state[0]
    nodes = state[1]
    stamp = state[2]
    while True:
        if L == free:
            state[0] = L
            state[1] = nodes
            state[2] = stamp
            return 1
        need = free - L
        pushed = False
        while pos[L] < cand_len[L]:
            if nodes >= max_nodes:
                state[0] = L
                state[1] = nodes
                state[2] = stamp
                return 0
            idx = pos[L]
            pos[L] += 1
            if cand_len[L] - idx < need:  # counting rule
                pos[L] = cand_len[L]
                break
            y = cand[L, idx]
            if y & ~(y << one) & tied[L] & rmask:  # lex rule on rows within a block
                continue
            # x stays a candidate unless x = y + (a sum of at most dist - 3 chosen columns)
            stamp += 1
            for t in range(top):
                base = offs[t]
                for p in range(sums_len[L, t]):
                    mark[np.int64(y ^ sums[base + p])] = stamp
            cnt = 0
            for q in range(idx + 1, cand_len[L]):
                x = cand[L, q]
                if mark[np.int64(x)] != stamp:
                    cand[L + 1, cnt] = x
                    cnt += 1
            if cnt < need - 1:  # counting rule for the columns after y
                continue
            if lmin > 0:
                # hyperplane rule: every h != 0 needs lmin columns with h . c = 1; first
                # with the columns still to choose as the only help (cheap; it can only
                # fail once fewer than lmin are left), then, once fewer than 2^(r-2)
                # candidates are left, with their counts (a Walsh-Hadamard transform)
                rest = need - 1
                ok = True
                filled = False
                if rest < lmin or 4 * cnt < size:
                    filled = True
                    for h in range(1, size):
                        s1 = ones[L, h] + np.int64(popcount64(np.uint64(h) & y) & one)
                        ones[L + 1, h] = s1
                        if s1 + rest < lmin:
                            ok = False
                            break
                if ok and 4 * cnt < size:
                    for h in range(size):
                        work[h] = 0
                    for q in range(cnt):
                        work[np.int64(cand[L + 1, q])] = 1
                    half = 1
                    while half < size:
                        for b in range(0, size, 2 * half):
                            for j in range(b, b + half):
                                u = work[j]
                                v = work[j + half]
                                work[j] = u + v
                                work[j + half] = u - v
                        half *= 2
                    for h in range(1, size):
                        if ones[L + 1, h] + (cnt - work[h]) // 2 < lmin:
                            ok = False
                            break
                if not ok:
                    continue
                if not filled:
                    for h in range(1, size):
                        ones[L + 1, h] = ones[L, h] + np.int64(popcount64(np.uint64(h) & y)
                                                               & one)
            # push y: sets of size t + 1 containing y are y ^ (sets of size t)
            sums_len[L + 1, 0] = 1
            for t in range(top - 1, 0, -1):
                src = offs[t - 1]
                dst = offs[t] + sums_len[L, t]
                m = sums_len[L, t - 1]
                for p in range(m):
                    sums[dst + p] = y ^ sums[src + p]
                sums_len[L + 1, t] = sums_len[L, t] + m
            cols[L] = y
            tied[L + 1] = tied[L] & ~(y ^ (y << one))
            cand_len[L + 1] = cnt
            pos[L + 1] = 0
            L += 1
            nodes += 1
            pushed = True
            break
        if pushed:
            continue
        if L == 0:
            state[0] = 0
            state[1] = nodes
            state[2] = stamp
            return 2
        L -= 1
