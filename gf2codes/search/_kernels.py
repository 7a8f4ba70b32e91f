"""Compiled kernels of the search strategies.

Like :mod:`gf2codes._kernels`: declared with :func:`gf2codes._jit.kernel` (explicit
numba signatures, ``cache=True``, compiled on first call), ``nogil=True``, arrays
and integers only, no module globals, no I/O. Randomness inside a kernel comes from
numba's own generator, seeded by an argument (it is separate from NumPy's global
state, which is never touched). Plain-Python twins live in the tests
(``tests/test_search.py``).

Two families of kernels:

* **Syndrome reachability** (:func:`greedy_columns`): the parity-check columns
  ``h_1, h_2, ...`` are chosen one at a time, each outside the set of syndromes
  that are sums of at most ``d - 2`` columns already chosen. ``level[s]`` holds the
  least number of chosen columns summing to ``s`` (255 when more than ``d - 2``),
  updated in one pass over the ``2^r`` syndromes per added column.
* **Light codewords of a generator in echelon form** (:func:`count_light`,
  :func:`anneal_redundancy`): when ``G`` has an identity on ``k`` pivot columns, a
  codeword of message ``m`` has weight at least ``wt(m)``, so the codewords lighter
  than ``D`` all come from messages of weight at most ``D - 1``; enumerating those
  (depth first, one XOR of a row per step) settles ``d >= D`` exactly.
"""

from __future__ import annotations

import numpy as np

from .._jit import kernel
from .._kernels import popcount64

__all__ = ["greedy_columns", "count_light", "anneal_redundancy", "UNREACHED"]

#: ``level`` value of a syndrome that is not a sum of at most ``d - 2`` chosen columns.
UNREACHED = 255

@kernel("int64(int64, int64, int64, uint64[:], uint64[:], int64)", nogil=True)
def greedy_columns(r, reach, n_max, prio, cols, n_fixed):  # pragma: no cover - compiled
    """Choose up to ``n_max`` columns of ``r`` bits, no ``reach + 1`` of them summing to 0.

    ``cols[:n_fixed]`` are given first (and must be admissible; ``-1`` is returned
    otherwise); every further column is the syndrome of least ``prio`` among those
    not reachable as a sum of at most ``reach`` chosen columns. Returns the number
    of columns in ``cols`` (fewer than ``n_max`` when every syndrome became
    reachable). With ``reach = d - 2`` the columns are a parity-check matrix of a
    code of minimum distance at least ``d``.
    """
    size = np.int64(1) << r
    level = np.full(size, 255, dtype=np.uint8)
    level[0] = 0
    count = 0
    while count < n_max:
        if count < n_fixed:
            c = np.int64(cols[count])
            if c <= 0 or c >= size or level[c] <= reach:
                return -1
        else:
            c = -1
            best = np.uint64(0)
            for s in range(1, size):
                if level[s] > reach and (c < 0 or prio[s] < best):
                    c = s
                    best = prio[s]
            if c < 0:
                return count
            cols[count] = np.uint64(c)
        count += 1
        if reach >= 1:
            for s in range(size):
                t = s ^ c
                if s < t:
                    a = level[s]
                    b = level[t]
                    if b < reach and b + 1 < a:
                        level[s] = b + 1
                    if a < reach and a + 1 < b:
                        level[t] = a + 1
    return count


@kernel("int64(uint64[:, :], int64, int64, int64, int64[:])", nogil=True)
def count_light(rows, t, D, limit, out):  # pragma: no cover - compiled
    """Codewords lighter than ``D`` among the sums of 1..``t`` rows of ``rows``.

    ``rows`` is packed ``(k, W)``. Enumeration stops once ``limit`` light codewords
    are counted (``limit <= 0``: never). ``out`` receives ``[visited, deficit,
    first_light_mask_low]``: the sums examined, ``sum(D - weight)`` over the light
    codewords counted, and (for ``k <= 63``) the row set of the first light one as a
    bit mask. Returns the number of light codewords counted.
    """
    k, W = rows.shape
    acc = np.zeros((t + 1, W), dtype=np.uint64)
    idx = np.zeros(t + 1, dtype=np.int64)
    count = 0
    deficit = 0
    visited = 0
    first = -1
    if k == 0 or t <= 0:
        out[0] = 0
        out[1] = 0
        out[2] = -1
        return 0
    depth = 0
    idx[0] = 0
    while True:
        if idx[depth] >= k:
            if depth == 0:
                break
            depth -= 1
            idx[depth] += 1
            continue
        i = idx[depth]
        wt = 0
        for w in range(W):
            x = acc[depth, w] ^ rows[i, w]
            acc[depth + 1, w] = x
            wt += popcount64(x)
        visited += 1
        if wt < D:
            count += 1
            deficit += D - wt
            if first < 0 and k <= 63:
                m = 0
                for j in range(depth + 1):
                    m |= np.int64(1) << idx[j]
                first = m
            if limit > 0 and count >= limit:
                break
        if depth + 1 < t and i + 1 < k:
            depth += 1
            idx[depth] = i + 1
        else:
            idx[depth] += 1
    out[0] = visited
    out[1] = deficit
    out[2] = first
    return count


@kernel(
    "int64(uint64[:, :], int64, int64, int64, int64, int64, float64, int64, uint64[:, :])",
    nogil=True,
)
def anneal_redundancy(rows, lo, hi, t, D, iters, temperature, seed, best):  # pragma: no cover
    """Simulated annealing on the bits ``lo..hi-1`` of the rows of a systematic generator.

    The objective is the *deficit* ``sum(D - weight)`` over the codewords lighter
    than ``D`` that are sums of at most ``t`` rows (with ``t = D - 1`` and an
    identity outside ``lo..hi-1``, these are all the light codewords). Each step
    flips one bit and keeps it when the deficit does not grow, or with probability
    ``exp(-increase / temperature)``. ``rows`` is updated in place to the current
    state, ``best`` receives the best state seen; stops early at deficit 0. Returns
    the best deficit.
    """
    np.random.seed(seed)
    k = rows.shape[0]
    out = np.zeros(3, dtype=np.int64)
    count_light(rows, t, D, 0, out)
    cur = out[1]
    best[:, :] = rows
    best_val = cur
    span = hi - lo
    for _ in range(iters):
        if best_val == 0:
            break
        i = np.random.randint(0, k)
        c = lo + np.random.randint(0, span)
        w = c >> 6
        bit = np.uint64(1) << np.uint64(c & 63)
        rows[i, w] ^= bit
        count_light(rows, t, D, 0, out)
        new = out[1]
        if new <= cur or (temperature > 0.0
                          and np.random.random() < np.exp(-(new - cur) / temperature)):
            cur = new
            if cur < best_val:
                best_val = cur
                best[:, :] = rows
        else:
            rows[i, w] ^= bit
    return best_val
