"""Compiled kernel of the residual-extension search (:mod:`gf2codes._residual`).

One resumable depth-first search over multisets of vectors of ``F_2^m``, the compiled
twin of ``gf2codes._residual._extend_python`` (the tests demand the same solutions and
node count from both). All state lives in arrays owned by the caller, so the search runs
in chunks of nodes between which the caller checks the clock, reports progress and
honours Ctrl-C.

The problem: given bounds ``low[u] <= high[u]`` for every non-zero ``u`` of ``F_2^m``,
choose ``s`` vectors ``x_1 <= x_2 <= ... <= x_s`` (a multiset, as integers) such that
for every ``u`` the number ``count[u]`` of chosen vectors with ``u . x_i = 1`` lies in
``[low[u], high[u]]``.
"""

from __future__ import annotations

from ._jit import kernel

__all__ = ["extension_dfs"]


@kernel("int64(int64)", inline="always")
def odd(v):  # pragma: no cover - compiled
    """1 if the word ``v`` (at most 64 bits) has an odd number of set bits, else 0."""
    v ^= v >> 32
    v ^= v >> 16
    v ^= v >> 8
    v ^= v >> 4
    v ^= v >> 2
    v ^= v >> 1
    return v & 1


@kernel("void(int64[::1], int64, int64, int64)", inline="always")
def tally(count, x, size, delta):  # pragma: no cover - compiled
    """Add ``delta`` to ``count[u]`` for every ``u`` with ``u . x = 1``."""
    for u in range(1, size):
        if odd(u & x):
            count[u] += delta


@kernel("int64(int64[::1], int64[::1], int64[::1], int64[::1], int64[::1], int64[:, ::1], "
        "int64[::1], int64, int64, int64, int64)", nogil=True)
def extension_dfs(low, high, count, chosen, nxt, sols, state, m, s, max_nodes,
                  first_only):  # pragma: no cover - compiled
    """Run the search until it finishes, fills ``sols`` or ``state[1]`` reaches ``max_nodes``.

    ``state = [depth, nodes, solutions found, finished flag]``; ``chosen[:depth]`` are the
    vectors chosen so far, ``nxt[depth]`` the next candidate at ``depth``, ``count`` the
    counts of the chosen vectors. Solutions are written to ``sols[state[2]]``.
    Returns 2 (finished), 1 (``sols`` is full, or a solution was found and
    ``first_only``) or 0 (node budget reached; call again to continue).
    """
    size = 1 << m
    cap = sols.shape[0]
    depth = state[0]
    while True:
        if state[1] >= max_nodes:
            state[0] = depth
            return 0
        if depth == s:
            if state[2] >= cap:
                state[0] = depth
                return 1
            for i in range(s):
                sols[state[2], i] = chosen[i]
            state[2] += 1
            # backtrack from the leaf
            depth -= 1
            if depth < 0:
                state[3] = 1
                state[0] = 0
                return 2
            tally(count, chosen[depth], size, -1)
            if first_only:
                state[0] = depth
                return 1
            continue
        left = s - depth - 1  # vectors still to choose after this one
        placed = False
        x = nxt[depth]
        while x < size:
            ok = True
            for u in range(1, size):
                c = count[u] + odd(u & x)
                if c > high[u] or c + left < low[u]:
                    ok = False
                    break
            if ok:
                tally(count, x, size, 1)
                chosen[depth] = x
                nxt[depth] = x + 1
                depth += 1
                if depth < s:
                    nxt[depth] = x  # a multiset: the next vector may repeat this one
                state[1] += 1
                placed = True
                break
            x += 1
        if placed:
            continue
        # no candidate left at this depth: backtrack
        depth -= 1
        if depth < 0:
            state[3] = 1
            state[0] = 0
            return 2
        tally(count, chosen[depth], size, -1)
