"""Compiled kernel of the exhaustive existence decision (:mod:`gf2codes.existence`).

Declared with :func:`gf2codes._jit.kernel` (compiled or loaded from numba's cache on
first call). One resumable depth-first search, the compiled twin of
``gf2codes.existence._Backtrack`` (the plain-Python version, which the tests run on
the same inputs and demand the same answer, node count and witness from). All state
lives in arrays owned by the caller, so the search runs in chunks of nodes and the
caller can check the clock, report progress and honour Ctrl-C between chunks.

Rows of ``A`` are integers of ``r = n - k`` bits, bit ``r - 1 - j`` being column ``j``.
"""

from __future__ import annotations

import numpy as np

from ._jit import kernel
from ._kernels import popcount64

__all__ = ["existence_dfs"]


@kernel("int64(uint64[:, ::1], int64[::1], int64[::1], uint64[::1], uint64[::1], uint64[::1], "
        "int64[::1], int64[:, ::1], int64[::1], int64, int64, int64, int64)", nogil=True)
def existence_dfs(cand, cand_len, pos, tied, rows, sums, offs, sums_len, state,
                  k, d, r, max_nodes):  # pragma: no cover - compiled
    """Run the backtrack until it finishes or ``state[1]`` reaches ``max_nodes``.

    ``cand[L, :cand_len[L]]`` are the candidates at depth ``L`` (``pos[L]`` the next to
    try), ``tied[L]`` the tied column pairs, ``sums[offs[t] : offs[t] + sums_len[L, t]]``
    the XORs of the ``t``-sets of the first ``L`` rows (``t < d - 2``: larger sets never
    enter the test), ``state = [depth, nodes]`` or ``[depth, nodes, work, max_work]``:
    with four entries the kernel also counts its work (candidate rows tested times the
    sums they are tested against) and stops when it reaches ``max_work`` (if > 0).
    Returns 1 (all ``k`` rows chosen: ``rows`` is a witness), 2 (search finished: no
    code) or 0 (budget reached; call again to continue).
    """
    one = np.uint64(1)
    rmask = (one << np.uint64(r)) - one
    top = d - 2
    L = state[0]
    nodes = state[1]
    counted = state.shape[0] >= 4
    work = state[2] if counted else 0
    max_work = state[3] if counted else 0
    while True:
        if L == k:
            state[0] = L
            state[1] = nodes
            if counted:
                state[2] = work
            return 1
        need = k - L
        pushed = False
        while pos[L] < cand_len[L]:
            if nodes >= max_nodes or (max_work > 0 and work >= max_work):
                state[0] = L
                state[1] = nodes
                if counted:
                    state[2] = work
                return 0
            idx = pos[L]
            pos[L] += 1
            if cand_len[L] - idx < need:  # counting rule
                pos[L] = cand_len[L]
                break
            y = cand[L, idx]
            if y & ~(y << one) & tied[L] & rmask:  # double-lex column rule
                continue
            cnt = 0
            if counted:
                tests = 0
                for t in range(top):
                    tests += sums_len[L, t]
                work += (cand_len[L] - idx - 1) * tests
            for q in range(idx + 1, cand_len[L]):
                x = cand[L, q] ^ y
                ok = True
                for t in range(top):
                    lim = d - 2 - t
                    base = offs[t]
                    for p in range(sums_len[L, t]):
                        if popcount64(x ^ sums[base + p]) < lim:
                            ok = False
                            break
                    if not ok:
                        break
                if ok:
                    cand[L + 1, cnt] = cand[L, q]
                    cnt += 1
            if cnt < need - 1:  # counting rule for the rows after y
                continue
            # push y: sets of size t + 1 containing y are y ^ (sets of size t)
            sums_len[L + 1, 0] = 1
            for t in range(top - 1, 0, -1):
                src = offs[t - 1]
                dst = offs[t] + sums_len[L, t]
                m = sums_len[L, t - 1]
                for p in range(m):
                    sums[dst + p] = y ^ sums[src + p]
                sums_len[L + 1, t] = sums_len[L, t] + m
            rows[L] = y
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
            if counted:
                state[2] = work
            return 2
        L -= 1
