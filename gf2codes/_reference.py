"""Plain-Python twins of the compiled algorithms, for the tests only.

They are slow and obviously correct: every codeword is formed from its message
with integer arithmetic, nothing is packed. The tests run the same inputs
through these and through the fast paths and demand equal answers.
"""

from __future__ import annotations

import itertools

import numpy as np

__all__ = ["all_codewords", "brute_distance", "brute_weight_distribution", "brute_rref_rank"]


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
