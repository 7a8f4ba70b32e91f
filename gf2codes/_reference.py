"""Plain-Python twins of the compiled algorithms, for the tests only.

They are slow and obviously correct: every codeword is formed from its message
with integer arithmetic, nothing is packed. The tests run the same inputs
through these and through the fast paths and demand equal answers.
"""

from __future__ import annotations

import itertools

import numpy as np

__all__ = ["all_codewords", "brute_distance", "brute_weight_distribution", "brute_rref_rank",
           "brute_best_distance_systematic", "brute_best_distance_all", "plain_existence"]


def all_codewords(G) -> np.ndarray:
    """Every codeword ``m G`` for all ``2^r`` messages (``r`` = number of rows)."""
    G = np.asarray(G, dtype=np.int64)
    r = G.shape[0]
    msgs = np.array(list(itertools.product((0, 1), repeat=r)), dtype=np.int64).reshape(-1, r)
    return (msgs @ G) & 1


def brute_distance(G) -> int:
    """Least weight of a nonzero codeword (rows of ``G`` may be dependent)."""
    w = all_codewords(G).sum(axis=1)
    nz = w[w > 0]
    return int(nz.min()) if nz.size else 0


def brute_weight_distribution(G) -> list[int]:
    """Number of distinct codewords of each weight 0..n."""
    words = {tuple(c) for c in all_codewords(G).tolist()}
    n = np.asarray(G).shape[1]
    out = [0] * (n + 1)
    for c in words:
        out[sum(c)] += 1
    return out


def brute_rref_rank(M) -> int:
    """Rank over GF(2) by textbook elimination on Python lists."""
    rows = [list(map(int, r)) for r in np.asarray(M)]
    rank = 0
    ncol = len(rows[0]) if rows else 0
    for c in range(ncol):
        piv = next((i for i in range(rank, len(rows)) if rows[i][c]), None)
        if piv is None:
            continue
        rows[rank], rows[piv] = rows[piv], rows[rank]
        for i in range(len(rows)):
            if i != rank and rows[i][c]:
                rows[i] = [a ^ b for a, b in zip(rows[i], rows[rank], strict=True)]
        rank += 1
    return rank


def _popcount(a: np.ndarray) -> np.ndarray:
    return np.bitwise_count(a.astype(np.uint64)).astype(np.int64)


def brute_best_distance_systematic(n: int, k: int) -> int:
    """``D(n, k)``, the largest minimum distance of an ``[n, k]`` code, by brute force.

    Every one of the ``2^(k (n-k))`` systematic generators ``[I | A]`` is tried (every
    code is permutation-equivalent to one of them); the distance of each is the least
    ``|S| + wt(sum_{i in S} a_i)`` over all non-empty row sets ``S``, computed for all
    matrices at once, one row set after another in Gray-code order. No symmetry is used.
    """
    r = n - k
    if r == 0:
        return 1
    N = 1 << (k * r)
    allA = np.arange(N, dtype=np.uint64)
    rowmask = np.uint64((1 << r) - 1)
    rows = [(allA >> np.uint64(i * r)) & rowmask for i in range(k)]
    acc = np.zeros(N, dtype=np.uint64)
    best = np.full(N, n, dtype=np.int64)
    size = 0
    prev = 0
    for m in range(1, 1 << k):
        gray = m ^ (m >> 1)
        bit = (gray ^ prev).bit_length() - 1
        prev = gray
        acc ^= rows[bit]
        size = gray.bit_count()
        np.minimum(best, size + _popcount(acc), out=best)
    return int(best.max())


def brute_best_distance_all(n: int, k: int) -> int:
    """``D(n, k)`` by brute force over *every* ``k x n`` matrix of rank ``k``.

    Independent of the systematic-form argument; feasible for ``k n <= 16``. A matrix of
    rank below ``k`` has a zero combination and is skipped.
    """
    N = 1 << (k * n)
    allG = np.arange(N, dtype=np.uint64)
    rowmask = np.uint64((1 << n) - 1)
    rows = [(allG >> np.uint64(i * n)) & rowmask for i in range(k)]
    acc = np.zeros(N, dtype=np.uint64)
    best = np.full(N, n + 1, dtype=np.int64)
    prev = 0
    for m in range(1, 1 << k):
        gray = m ^ (m >> 1)
        bit = (gray ^ prev).bit_length() - 1
        prev = gray
        acc ^= rows[bit]
        w = _popcount(acc)
        w[w == 0] = -1  # a zero combination: rank < k
        np.minimum(best, np.where(w < 0, -1, w), out=best)
    return int(best.max())


def plain_existence(n: int, k: int, d: int) -> bool:
    """Whether an ``[n, k, >= d]`` code exists, by a plain backtrack (tests only).

    Rows ``a_1 < a_2 < ...`` of ``A`` in ``[I | A]`` are chosen in increasing order (a
    row permutation gives an equivalent code; rows are distinct when ``d >= 3``) and every
    new row is checked against all sets of earlier rows; no other pruning, no column
    symmetry. Much slower than :func:`gf2codes.existence.decide_existence`, but simple.
    """
    r = n - k
    if d <= 1:
        return True
    if d == 2:
        return r >= 1
    if r == 0 or d > n:
        return False
    span: list[int] = [0]  # XOR of every subset of the chosen rows
    sizes: list[int] = [0]

    def ok(x: int) -> bool:
        return all(sz + 1 + (x ^ s).bit_count() >= d for s, sz in zip(span, sizes, strict=True))

    def extend(depth: int, low: int) -> bool:
        if depth == k:
            return True
        for x in range(low, 1 << r):
            if ok(x):
                old = len(span)
                span.extend(x ^ s for s in span[:old])
                sizes.extend(sz + 1 for sz in sizes[:old])
                if extend(depth + 1, x + 1):
                    return True
                del span[old:], sizes[old:]
        return False

    return extend(0, 0)
