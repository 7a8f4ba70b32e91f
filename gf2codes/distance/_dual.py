"""The dual-side route: the fewest columns of a parity-check matrix that sum to zero.

For ``n - k <= 64`` the columns of ``H`` fit one ``uint64`` each; ``d >= w + 1`` is
proved by showing that no ``w`` columns sum to zero, for ``w = 1, 2, ...``, meeting in
the middle (the sums of ``floor(w/2)`` columns in a bitmap indexed by the syndrome, those
of ``ceil(w/2)`` looked up; see :mod:`gf2codes._dual_kernels`).
"""

from __future__ import annotations

import math

import numpy as np

from .. import _kernels, linalg
from ..code import Code
from ..typing import StopReason
from ._result import CHUNK, Best, ProofClock, Settled, round_up, settled, stop_reason

__all__ = ["RATE_DUAL", "dual_columns_seconds", "dual_search"]

_BITMAP_BITS = 32  # a bitmap of 2^32 bits (512 MiB) at most; beyond, buckets of top bits
# Measured rates (one core) of the dual-side scan, see scripts/bench_distance.py:
# subsets enumerated and looked up per second, and bitmap bytes cleared per second.
# The lookups are random accesses to the bitmap, so the rate falls with its size:
# (largest bitmap in bytes, subsets per second), measured on 2-core AVX2 code with
# 255 columns (a bitmap beyond the caches is bound by memory latency, ~20 ns per sum).
_DUAL_RATES = ((1 << 18, 6e8), (1 << 21, 4e8), (1 << 24, 1e8))
_RATE_DUAL_MEMORY = 4e7
RATE_DUAL = _DUAL_RATES[0][1]  # the in-cache rate (kept for the callers that phrase work)
_RATE_CLEAR = 1e10
# Bytes of clearing that cost about as much as zeroing the word of one sum (a random
# write) instead: below, a pass zeroes the words its sums marked (syndrome_unmark).
_UNMARK_COST = 64


def _parity_columns(code: Code) -> np.ndarray | None:
    """The columns of a parity-check matrix, one ``uint64`` each (None when n - k > 64)."""
    r = code.n - code.k
    if r > 64:
        return None
    if r == 0:
        return np.zeros(code.n, dtype=np.uint64)
    H = np.asarray(code.H, dtype=np.uint64)
    shifted = H << np.arange(r, dtype=np.uint64)[:, None]
    return np.ascontiguousarray(np.bitwise_or.reduce(shifted, axis=0))


def _dual_levels(divisor: int, start_lower: int, goal: int) -> list[int]:
    """Weights ``w`` to examine (multiples of the divisor) to prove ``d >= goal``."""
    return [w for w in range(1, goal) if w % divisor == 0 and w >= start_lower]


def _dual_layout(r: int) -> tuple[int, int]:
    """(bits indexed by the bitmap, number of buckets of top bits) for ``r`` check bits."""
    low = min(r, _BITMAP_BITS)
    return low, 1 << (r - low)


def _dual_rate(low: int) -> float:
    """Subsets per second (one core) with a bitmap of ``2^low`` bits."""
    nbytes = (1 << low) // 8
    return next((rate for size, rate in _DUAL_RATES if nbytes <= size), _RATE_DUAL_MEMORY)


def dual_columns_seconds(n: int, k: int, goal: int, *, divisor: int = 1,
                         start_lower: int = 1) -> float:
    """Estimated seconds (one core) for the dual-side route to prove ``d >= goal`` on an
    ``[n, k]`` code; ``inf`` when the route does not apply (``n - k > 64``)."""
    r = n - k
    if r > 64:
        return math.inf
    goal = min(goal, n + 1)  # no weight exceeds n (and "no codeword yet" is 2^62)
    low, buckets = _dual_layout(r)
    nbytes = max(8, (1 << low) // 8)
    total = 0.0
    for w in _dual_levels(divisor, start_lower, goal):
        j = w // 2
        scans = math.comb(n, j) + (math.comb(n, w - j) if w - j != j else 0)
        clear = min(nbytes, math.comb(n, j) * _UNMARK_COST) / _RATE_CLEAR  # see unmark
        total += buckets * (scans / _dual_rate(low) + clear)
    return total


def _subset_of(cols: np.ndarray, j: int, syndrome: int) -> list[np.ndarray]:
    from .. import _dual_kernels

    out = np.zeros((2, max(j, 1)), dtype=np.int64)
    got = _dual_kernels.subsets_with_sum(cols, j, np.uint64(syndrome), out)
    return [out[i, :j].copy() for i in range(got)]


def _dual_witness(n: int, cols: np.ndarray, w: int, syndrome: int, probed: bool
                  ) -> np.ndarray:
    """The codeword (packed) behind a hit: the symmetric difference of two distinct
    column subsets with equal sums (a nonempty zero-sum set of at most ``w`` columns)."""
    j = w // 2
    if probed:
        first, second = _subset_of(cols, j, syndrome), _subset_of(cols, w - j, syndrome)
        assert first and second, "the dual-side scan reported a hit that is not there"
        a, b = first[0], second[0]
    else:
        found = _subset_of(cols, j, syndrome)
        assert len(found) == 2, "the dual-side scan reported a collision that is not there"
        a, b = found
    word = np.zeros(n, dtype=np.uint8)
    word[a] ^= 1
    word[b] ^= 1
    support = word.astype(bool)
    assert support.any() and int(np.bitwise_xor.reduce(cols[support])) == 0, \
        "dual-side witness is not a codeword"
    return linalg.pack(word.reshape(1, -1))[0]


def _dual_chunks(n: int, j: int) -> list[tuple[int, int]]:
    """Ranges of the smallest index so that each holds about ``CHUNK`` subsets."""
    if j == 0:
        return [(0, 1)]
    chunks, lo, acc = [], 0, 0
    for f in range(n - j + 1):
        acc += math.comb(n - 1 - f, j - 1)
        if acc >= CHUNK:
            chunks.append((lo, f + 1))
            lo, acc = f + 1, 0
    if lo < n - j + 1:
        chunks.append((lo, n - j + 1))
    return chunks


def dual_search(code: Code, clock: ProofClock, best: Best, target: int | None,
                start_lower: int) -> tuple[int, StopReason | None]:
    """The dual-side route: prove ``d >= w + 1`` by showing that no ``w`` columns of a
    parity-check matrix sum to zero, for ``w = 1, 2, ...`` (meet in the middle: the sums
    of ``floor(w/2)`` columns in a bitmap, those of ``ceil(w/2)`` looked up).

    Returns (proved lower bound, why it stopped before proving d, or None when d is
    proved).
    """
    from .. import _dual_kernels

    n, r = code.n, code.n - code.k
    cols = _parity_columns(code)
    assert cols is not None
    divisor = code.weight_divisor
    low, buckets = _dual_layout(r)
    low_mask = np.uint64((1 << low) - 1)
    hi_mask = np.uint64(((1 << r) - 1) ^ ((1 << low) - 1))
    bitmap = np.zeros(max(1, (1 << low) // 64), dtype=np.uint64)
    lower = start_lower

    def scan(j: int, bucket: np.uint64, probe: bool) -> tuple[bool, int, bool]:
        """(complete, syndrome of a hit or -1, time ran out)."""
        for f_lo, f_hi in _dual_chunks(n, j):
            visited, hit, s = _dual_kernels.syndrome_scan(cols, j, f_lo, f_hi, hi_mask,
                                                          bucket, low_mask, bitmap, probe)
            clock.tick(visited, lower, best.weight)
            if hit:
                return True, int(s), False
            if clock.expired():
                return False, -1, True
        return True, -1, False

    def unmark(j: int, bucket: np.uint64) -> None:
        """Leave the bitmap zero for the next pass: zero the words the marks of the
        ``j``-subsets can have touched when they are few (a level of small ``j`` in a
        bitmap of 512 MiB), else clear it all."""
        if math.comb(n, j) * _UNMARK_COST < bitmap.nbytes:
            _dual_kernels.syndrome_unmark(cols, j, hi_mask, bucket, low_mask, bitmap)
        else:
            bitmap[:] = 0

    try:
        goal = best.weight if target is None else min(best.weight, target)
        for w in range(1, n + 1):
            if settled(best.weight, lower, target):
                break
            if w % divisor or w < start_lower:
                continue
            goal = best.weight if target is None else min(best.weight, target)
            clock.total = max(clock.done, int(_dual_rate(low) * dual_columns_seconds(
                n, code.k, goal, divisor=divisor, start_lower=lower)) + clock.done)
            j = w // 2
            hit_word = None
            for b in range(buckets):
                bucket = np.uint64(b << low)
                try:
                    done, s, late = scan(j, bucket, False)
                    if late:
                        return lower, "time limit"
                    if s >= 0:
                        hit_word = _dual_witness(n, cols, 2 * j, s, probed=False)
                        break
                    if w - j != j:
                        done, s, late = scan(w - j, bucket, True)
                        if late:
                            return lower, "time limit"
                        if s >= 0:
                            hit_word = _dual_witness(n, cols, w, s, probed=True)
                            break
                finally:
                    unmark(j, bucket)
            if hit_word is not None:
                wt = int(sum(_kernels.popcount64(x) for x in hit_word))
                best.offer(wt, hit_word)
                # Every lighter weight was excluded before this level: wt == w.
                assert wt == w, "dual-side route: a lighter codeword than proved possible"
            else:
                lower = max(lower, round_up(w + 1, divisor))
    except KeyboardInterrupt:
        return lower, "interrupted"
    reason: Settled | None = settled(best.weight, lower, target)
    return (best.weight if reason == "exact" else lower), stop_reason(reason)

