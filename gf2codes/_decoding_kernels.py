"""Compiled kernels for :mod:`gf2codes.decoding`, with their plain-Python twins.

Every kernel is declared with :func:`gf2codes._jit.kernel` (an explicit signature,
``cache=True``, compiled on first call) and ``nogil=True``; it takes arrays and
integers only and reads no module globals. Each has a twin of the same name with the
suffix ``_py``, written in plain Python for the tests, which run the same inputs
through both.

Syndromes are integers: bit ``i`` of the syndrome of column ``j`` is ``H[i, j]``, so
a code of redundancy ``r = n - k`` has ``2^r`` syndromes ``0 .. 2^r - 1``.
"""

from __future__ import annotations

import numpy as np

from ._jit import kernel
from ._kernels import popcount64

__all__ = [
    "UNREACHED",
    "coset_levels",
    "coset_levels_py",
    "info_set_search",
    "info_set_search_py",
]

#: Value of ``level[s]`` for a syndrome not (yet) reached by the search.
UNREACHED = 255

@kernel("int64[::1](uint64[::1], int64, uint8[::1], int32[::1])", nogil=True)
def coset_levels(cols, r, level, parent):  # pragma: no cover - compiled
    """Breadth-first search over the ``2^r`` syndromes, one column of ``H`` at a time.

    Parameters
    ----------
    cols : uint64[n]
        The columns of ``H`` as syndromes (bit ``i`` is row ``i``).
    r : int
        Number of rows of ``H`` (it must have rank ``r`` for every syndrome to be reached).
    level : uint8[2^r]
        Output: ``level[s]`` = weight of a coset leader of syndrome ``s`` (the least number
        of columns that sum to ``s``), ``UNREACHED`` (255) when no sum of columns gives ``s``.
    parent : int32[2^r] or int32[0]
        Output unless empty: ``parent[s]`` = a column ``j`` such that ``s ^ cols[j]`` is on
        the previous level (``-1`` for ``s = 0`` and unreached syndromes). Following it
        from ``s`` spells out a coset leader.

    Returns
    -------
    int64[r + 2]
        ``counts[w]`` = number of syndromes whose coset leaders have weight ``w``.
    """
    size = np.int64(1) << r
    keep_parent = parent.shape[0] == size
    for s in range(size):
        level[s] = 255
    if keep_parent:
        for s in range(size):
            parent[s] = -1
    counts = np.zeros(r + 2, dtype=np.int64)
    level[0] = 0
    counts[0] = 1
    reached = np.int64(1)
    n = cols.shape[0]
    w = 0
    while reached < size and w <= r:
        found = np.int64(0)
        nxt = np.uint8(w + 1)
        for s in range(size):
            if level[s] != w:
                continue
            for j in range(n):
                t = np.int64(np.uint64(s) ^ cols[j])
                if level[t] == 255:
                    level[t] = nxt
                    if keep_parent:
                        parent[t] = j
                    found += 1
        if found == 0:
            break
        counts[w + 1] = found
        reached += found
        w += 1
    return counts


def coset_levels_py(cols, r, level, parent):
    """Plain-Python twin of :func:`coset_levels` (same arguments, same results)."""
    size = 1 << r
    keep_parent = len(parent) == size
    cols = [int(c) for c in cols]
    for s in range(size):
        level[s] = UNREACHED
        if keep_parent:
            parent[s] = -1
    counts = np.zeros(r + 2, dtype=np.int64)
    level[0] = 0
    counts[0] = 1
    frontier = [0]
    w = 0
    while frontier:
        nxt = []
        for s in frontier:
            for j, c in enumerate(cols):
                t = s ^ c
                if level[t] == UNREACHED:
                    level[t] = w + 1
                    if keep_parent:
                        parent[t] = j
                    nxt.append(t)
        if nxt:
            counts[w + 1] = len(nxt)
        frontier = nxt
        w += 1
    return counts


@kernel("void(uint64[:, ::1], uint64[:, ::1], int64, int64[::1], int64[:, ::1])", nogil=True)
def info_set_search(base, rows, order, best_weight, best_flips):  # pragma: no cover - compiled
    """Least-weight error patterns of one information set, flipping up to ``order`` bits.

    For received word ``y`` and a systematic form ``[I | A]`` on an information set, the
    error pattern that flips the information bits in the set ``F`` is
    ``[e_F | base ^ sum_{i in F} A_i]`` with ``base = y_redundant ^ y_info A``; its weight is
    ``|F| + wt(base ^ sum A_i)``. Every ``F`` with ``|F| <= order`` (at most 2) is tried.

    Parameters
    ----------
    base : uint64[T, W]
        Packed ``base`` vectors, one per received word.
    rows : uint64[k, W]
        Packed rows ``A_i`` of the redundant part of the systematic generator.
    order : int
        0, 1 or 2.
    best_weight : int64[T]
        In/out: the least weight found so far per word; updated only on strict improvement.
    best_flips : int64[T, 2]
        Out: for each word whose weight improved, the flipped information positions
        (``-1`` for unused slots); left alone otherwise.
    """
    T, W = base.shape
    k = rows.shape[0]
    for t in range(T):
        wt = np.int64(0)
        for w in range(W):
            wt += np.int64(popcount64(base[t, w]))
        if wt < best_weight[t]:
            best_weight[t] = wt
            best_flips[t, 0] = -1
            best_flips[t, 1] = -1
        if order >= 1:
            for i in range(k):
                wi = np.int64(1)
                for w in range(W):
                    wi += np.int64(popcount64(base[t, w] ^ rows[i, w]))
                if wi < best_weight[t]:
                    best_weight[t] = wi
                    best_flips[t, 0] = i
                    best_flips[t, 1] = -1
                if order >= 2:
                    for j in range(i + 1, k):
                        wij = np.int64(2)
                        for w in range(W):
                            wij += np.int64(popcount64(base[t, w] ^ rows[i, w] ^ rows[j, w]))
                        if wij < best_weight[t]:
                            best_weight[t] = wij
                            best_flips[t, 0] = i
                            best_flips[t, 1] = j


def info_set_search_py(base, rows, order, best_weight, best_flips):
    """Plain-Python twin of :func:`info_set_search`."""
    def wt(words):
        return sum(bin(int(x)).count("1") for x in words)

    k = rows.shape[0]
    for t in range(base.shape[0]):
        b = [int(x) for x in base[t]]
        candidates = [((), wt(b))]
        if order >= 1:
            for i in range(k):
                single = [x ^ int(y) for x, y in zip(b, rows[i], strict=True)]
                candidates.append(((i,), 1 + wt(single)))
                if order >= 2:
                    for j in range(i + 1, k):
                        v = [x ^ int(y) ^ int(z)
                             for x, y, z in zip(b, rows[i], rows[j], strict=True)]
                        candidates.append(((i, j), 2 + wt(v)))
        for flips, weight in candidates:
            if weight < best_weight[t]:
                best_weight[t] = weight
                best_flips[t] = (list(flips) + [-1, -1])[:2]
