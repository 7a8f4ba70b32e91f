"""Decoders for the BSC simulation: a syndrome table and an information-set decoder.

Both decide from the coset of the received word only (adding a codeword to the input
adds it to the output) [1]_.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1, section 4 (syndrome decoding).
.. [2] M. P. C. Fossorier and S. Lin, "Soft-decision decoding of linear block codes
   based on ordered statistics", *IEEE Trans. Inform. Theory* 41(5), 1995,
   pp. 1379-1396, doi:10.1109/18.412683.
"""

from __future__ import annotations

import numpy as np

from .. import _decoding_kernels as _dk
from .. import linalg
from .._util import rng as make_rng
from ..code import Code
from ..exceptions import check_int
from ..typing import SeedLike
from .leaders import (
    TABLE_MAX_REDUNDANCY,
    CosetLeaders,
    check_redundancy,
    leader_search,
    leaders_from_counts,
)

__all__ = ["SyndromeDecoder", "InformationSetDecoder"]

class SyndromeDecoder:
    """Complete minimum-distance decoding by a table of coset leaders.

    The table holds, for every syndrome, one column of ``H`` that leads one step
    back towards the zero syndrome in the breadth-first search; following it spells
    out a coset leader in at most ``rho`` steps. Ties between leaders of equal weight
    are broken by the search order (the first column that reaches a syndrome).

    Parameters
    ----------
    code : Code
    max_redundancy : int
        Refuse codes with more parity bits (the table has ``2^(n-k)`` entries).

    Raises
    ------
    TooExpensiveError

    References
    ----------
    MacWilliams & Sloane (1977), ch. 1, section 4 (syndrome decoding).
    """

    name = "syndrome"

    def __init__(self, code: Code, *, max_redundancy: int = TABLE_MAX_REDUNDANCY) -> None:
        check_redundancy(code, max_redundancy, "a syndrome-table decoder")
        self.code = code
        if code.k == code.n:
            self._cols = np.zeros(code.n, dtype=np.uint64)
            self._parent = np.full(1, -1, dtype=np.int32)
            self.leaders = CosetLeaders(code.n, code.k, (1,))
        else:
            self._cols, counts, self._parent = leader_search(code, keep_parent=True)
            self.leaders = leaders_from_counts(code, counts)

    def syndromes(self, words: np.ndarray) -> np.ndarray:
        """Integer syndromes (bit ``i`` = row ``i`` of ``H``) of 0/1 words ``(T, n)``."""
        W = np.asarray(words, dtype=bool)
        return np.bitwise_xor.reduce(np.where(W, self._cols, np.uint64(0)), axis=1)

    def error_patterns(self, received: np.ndarray) -> np.ndarray:
        """The coset leader chosen for each received word (``uint8``, ``(T, n)``)."""
        Y = np.atleast_2d(np.asarray(received, dtype=np.uint8))
        s = self.syndromes(Y)
        out = np.zeros(Y.shape, dtype=np.uint8)
        rows = np.arange(Y.shape[0])
        for _ in range(self.leaders.covering_radius):
            live = s != 0
            if not live.any():
                break
            j = self._parent[s[live].astype(np.int64)]
            out[rows[live], j] ^= 1
            s[live] ^= self._cols[j]
        return out

    def decode(self, received: np.ndarray) -> np.ndarray:
        """The codeword nearest to each received word (one nearest, ties broken as above)."""
        Y = np.atleast_2d(np.asarray(received, dtype=np.uint8))
        return Y ^ self.error_patterns(Y)


class InformationSetDecoder:
    """Hard-decision decoding by re-encoding on several information sets.

    Ordered-statistics decoding [1]_ re-encodes the most reliable information set
    of a soft-decision word, flipped in up to ``order`` positions, and keeps the
    candidate nearest to the received word. On a binary symmetric channel every bit
    is equally reliable, so the single ordered information set is replaced by a fixed
    family of ``information_sets`` information sets drawn once from ``seed`` (the
    first is the code's own systematic one). For each received word ``y`` and each
    information set, every flip pattern ``F`` of at most ``order`` information bits
    gives the candidate error ``[e_F | y_R + (y_I + e_F) A]``, which lies in the coset
    of ``y``; the lightest candidate wins (the first found on ties).

    The decoder finds the coset leader whenever some information set holds at most
    ``order`` of its errors, in particular whenever the error has weight at most
    ``order``. Otherwise it may return a heavier word of the coset, never a word of
    another coset, so its block-error rate is an upper estimate of that of complete
    minimum-distance decoding (which is maximum-likelihood for ``p < 1/2``).

    Parameters
    ----------
    code : Code
    information_sets : int
        Number of information sets (default 8).
    order : int
        Flip patterns of up to this many information bits: 0, 1 or 2 (default 2).
    seed : int or numpy.random.Generator, optional
        Chooses the information sets.
    radius : int
        Words whose best candidate weighs at most this much are not searched further
        (pass ``(d - 1) // 2`` when ``d`` is known: such a candidate is the unique
        nearest). Default 0.

    References
    ----------
    .. [1] Fossorier & Lin (1995), section III (order-i reprocessing).
    """

    name = "information-set"

    def __init__(self, code: Code, *, information_sets: int = 8, order: int = 2,
                 seed: SeedLike = None, radius: int = 0) -> None:
        self.code = code
        self.order = check_int("order", order, minimum=0, maximum=2)
        count = check_int("information_sets", information_sets, minimum=1)
        self.radius = check_int("radius", radius, minimum=0)
        rng = make_rng(seed)
        n, k = code.n, code.k
        self._sets = []
        for i in range(count):
            order_i = None if i == 0 else rng.permutation(n)
            s = code.systematic(column_order=order_i)
            A = np.ascontiguousarray(s.matrix[:, k:], dtype=np.uint8)
            self._sets.append((np.asarray(s.permutation, dtype=np.int64), A,
                               linalg.pack(A) if n > k else np.zeros((k, 1), np.uint64)))

    def error_patterns(self, received: np.ndarray) -> np.ndarray:
        """The lightest error pattern found in the coset of each received word."""
        Y = np.atleast_2d(np.asarray(received, dtype=np.uint8))
        T, n = Y.shape
        k = self.code.k
        best_w = np.full(T, np.iinfo(np.int64).max, dtype=np.int64)
        best_e = np.zeros((T, n), dtype=np.uint8)
        live = np.arange(T)
        for perm, A, A_packed in self._sets:
            if live.size == 0:
                break
            Yp = Y[live][:, perm]
            base = (Yp[:, k:].astype(np.int64) + Yp[:, :k].astype(np.int64) @ A) & 1
            base = base.astype(np.uint8)
            base_packed = (linalg.pack(base) if n > k
                           else np.zeros((live.size, 1), np.uint64))
            w = best_w[live].copy()
            flips = np.full((live.size, 2), -1, dtype=np.int64)
            before = w.copy()
            _dk.info_set_search(base_packed, A_packed, np.int64(self.order), w, flips)
            better = np.flatnonzero(w < before)
            if better.size:
                e = np.zeros((better.size, n), dtype=np.uint8)
                red = base[better].copy()
                for slot in range(2):
                    f = flips[better, slot]
                    has = f >= 0
                    e[np.flatnonzero(has), f[has]] = 1
                    red[has] ^= A[f[has]]
                e[:, k:] = red
                target = live[better]
                best_e[target[:, None], perm[None, :]] = e
                best_w[target] = w[better]
            live = live[best_w[live] > self.radius]
        return best_e

    def decode(self, received: np.ndarray) -> np.ndarray:
        """The nearest codeword found for each received word."""
        Y = np.atleast_2d(np.asarray(received, dtype=np.uint8))
        return Y ^ self.error_patterns(Y)
