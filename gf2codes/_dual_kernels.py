"""Compiled kernels of the dual-side (parity-check) distance route.

The columns of a parity-check matrix ``H`` with ``r = n - k <= 64`` rows are packed
one per ``uint64`` (bit ``i`` of column ``j`` is ``H[i, j]``). A codeword of weight
``w`` is a set of ``w`` columns summing to zero; split into its first ``floor(w/2)``
and its last ``ceil(w/2)`` columns, it is a pair of distinct column subsets with
equal sums. These kernels enumerate the sums of every ``j``-subset of the columns
(lexicographic order, one XOR per subset in the innermost loop) and look each sum up
in a bitmap indexed by the syndrome itself — exact, with no hashing: when ``2^r``
bits do not fit, the syndromes are processed in buckets of equal top bits, one pass
per bucket, the bitmap indexed by the remaining low bits.

Declared like the kernels of :mod:`gf2codes._kernels`: explicit signatures,
``cache=True``, ``nogil=True``, arrays and integers only, no globals.
"""

from __future__ import annotations

import numpy as np

from ._jit import kernel

__all__ = ["syndrome_scan", "syndrome_unmark", "subsets_with_sum", "filter_mark",
           "filtered_probe"]

@kernel(
    "Tuple((int64, boolean, uint64))(uint64[::1], int64, int64, int64, uint64, uint64, "
    "uint64, uint64[::1], boolean, uint64)",
    nogil=True,
)
def syndrome_scan(cols, j, f_lo, f_hi, hi_mask, bucket, low_mask, bitmap,
                  probe, offset):  # pragma: no cover - compiled
    """Sums of the ``j``-subsets of ``cols`` whose smallest index ``f`` is in
    ``[f_lo, f_hi)``, each XORed with ``offset``, looked up in ``bitmap``.

    Only sums ``s`` with ``s & hi_mask == bucket`` are considered; bit ``s & low_mask``
    of ``bitmap`` stands for ``s``. With ``probe`` false every such sum is marked and
    the scan stops at the first sum already marked (two distinct subsets, or a subset
    and one marked earlier, with equal sums); with ``probe`` true nothing is marked
    and the scan stops at the first sum that is marked. ``j == 0`` is the empty set
    (sum ``offset``), visited when ``f_lo == 0``. ``offset`` is 0 except for the
    searches through one fixed column (its syndrome), see :mod:`gf2codes.distance._dual`.

    Returns ``(subsets visited, hit, syndrome of the hit)`` (the syndrome with the
    offset applied).
    """
    n = cols.shape[0]
    zero = np.uint64(0)
    if j == 0:
        if f_lo > 0:
            return 0, False, zero
        if (offset & hi_mask) != bucket:
            return 1, False, zero
        idx0 = offset & low_mask
        wd0 = idx0 >> np.uint64(6)
        bit0 = np.uint64(1) << (idx0 & np.uint64(63))
        if bitmap[wd0] & bit0:
            return 1, True, offset
        if not probe:
            bitmap[wd0] |= bit0
        return 1, False, zero
    visited = np.int64(0)
    c = np.zeros(max(j, 1), dtype=np.int64)
    part = np.zeros(j + 1, dtype=np.uint64)
    for f in range(f_lo, min(f_hi, n - j + 1)):
        if j == 1:
            visited += 1
            s = cols[f] ^ offset
            if (s & hi_mask) == bucket:
                idx = s & low_mask
                wd = idx >> np.uint64(6)
                bit = np.uint64(1) << (idx & np.uint64(63))
                if bitmap[wd] & bit:
                    return visited, True, s
                if not probe:
                    bitmap[wd] |= bit
            continue
        p = j - 1  # prefix c[0..p-1], c[0] = f; the last index runs in the inner loop
        c[0] = f
        part[1] = cols[f] ^ offset  # the offset rides on the first index
        for q in range(1, p):
            c[q] = f + q
            part[q + 1] = part[q] ^ cols[c[q]]
        while True:
            base = part[p]
            start = c[p - 1] + 1
            # The innermost loop, written out in two passes: first whether any sum is
            # marked (no early exit, so the loads overlap and the loop vectorises),
            # then, when marking, check-and-set one by one.
            any_hit = np.uint64(0)
            for i in range(start, n):
                s = base ^ cols[i]
                idx = s & low_mask
                inb = np.uint64((s & hi_mask) == bucket)
                any_hit |= (bitmap[idx >> np.uint64(6)] >> (idx & np.uint64(63))) & inb
            hit = -1
            if any_hit or not probe:
                for i in range(start, n):
                    s = base ^ cols[i]
                    if (s & hi_mask) == bucket:
                        idx = s & low_mask
                        wd = idx >> np.uint64(6)
                        bit = np.uint64(1) << (idx & np.uint64(63))
                        old = bitmap[wd]
                        if old & bit:
                            hit = i
                            break
                        if not probe:
                            bitmap[wd] = old | bit
            if hit >= 0:
                return visited + (hit - start + 1), True, base ^ cols[hit]
            visited += n - start
            q = p - 1
            while q >= 1 and c[q] == n - j + q:
                q -= 1
            if q < 1:
                break
            c[q] += 1
            part[q + 1] = part[q] ^ cols[c[q]]
            for t in range(q + 1, p):
                c[t] = c[t - 1] + 1
                part[t + 1] = part[t] ^ cols[c[t]]
    return visited, False, zero


@kernel("int64(uint64[::1], int64, uint64, uint64, uint64, uint64[::1])", nogil=True)
def syndrome_unmark(cols, j, hi_mask, bucket, low_mask, bitmap):  # pragma: no cover
    """Zero the ``bitmap`` words that :func:`syndrome_scan` may have marked for the sums
    of the ``j``-subsets of ``cols`` in ``bucket`` (the whole word of each sum).

    Cheaper than clearing the whole bitmap when the level marked few sums: a bitmap of
    ``2^32`` bits is 512 MiB, cleared in about 50 ms, while a level of ``j = 1`` marks
    ``n`` bits; and the pages it never touched stay unallocated. Every marked bit was
    set by one of these sums, so afterwards the bitmap is zero. Returns the number of
    subsets visited.
    """
    n = cols.shape[0]
    if j == 0:
        if (np.uint64(0) & hi_mask) == bucket:
            bitmap[0] = np.uint64(0)
        return 1
    if j > n:
        return 0
    visited = np.int64(0)
    c = np.arange(j)
    part = np.zeros(j + 1, dtype=np.uint64)
    for q in range(j - 1):
        part[q + 1] = part[q] ^ cols[c[q]]
    while True:
        # the last index runs in the loop; the prefix c[0..j-2] is advanced below
        base = part[j - 1]
        start = c[j - 2] + 1 if j > 1 else 0
        for i in range(start, n):
            s = base ^ cols[i]
            if (s & hi_mask) == bucket:
                bitmap[(s & low_mask) >> np.uint64(6)] = np.uint64(0)
        visited += n - start
        if j == 1:
            return visited
        q = j - 2
        while q >= 0 and c[q] == n - j + q:
            q -= 1
        if q < 0:
            return visited
        c[q] += 1
        part[q + 1] = part[q] ^ cols[c[q]]
        for t in range(q + 1, j - 1):
            c[t] = c[t - 1] + 1
            part[t + 1] = part[t] ^ cols[c[t]]


@kernel("int64(uint64[::1], int64, uint64, int64[:, ::1])", nogil=True)
def subsets_with_sum(cols, j, target, out):  # pragma: no cover - compiled
    """Write into the rows of ``out`` (shape ``(m, max(j, 1))``) up to ``m`` distinct
    ``j``-subsets of ``cols`` whose sum is ``target``; return how many were written."""
    n = cols.shape[0]
    m = out.shape[0]
    if j == 0:
        return 1 if target == 0 and m > 0 else 0
    if j > n:
        return 0
    found = 0
    c = np.arange(j)
    part = np.zeros(j + 1, dtype=np.uint64)
    for q in range(j):
        part[q + 1] = part[q] ^ cols[c[q]]
    while True:
        if part[j] == target:
            for q in range(j):
                out[found, q] = c[q]
            found += 1
            if found == m:
                return found
        q = j - 1
        while q >= 0 and c[q] == n - j + q:
            q -= 1
        if q < 0:
            return found
        c[q] += 1
        part[q + 1] = part[q] ^ cols[c[q]]
        for t in range(q + 1, j):
            c[t] = c[t - 1] + 1
            part[t + 1] = part[t] ^ cols[c[t]]


@kernel("int64(uint64[::1], int64, uint64, uint64[::1])", nogil=True)
def filter_mark(cols, j, filt_mask, filt):  # pragma: no cover - compiled
    """Set bit ``s & filt_mask`` of ``filt`` for the sum ``s`` of every ``j``-subset of
    ``cols`` (a superset filter of what :func:`syndrome_scan` marks, whatever the
    bucket). Returns the number of subsets visited."""
    n = cols.shape[0]
    if j == 0:
        filt[0] |= np.uint64(1)
        return 1
    if j > n:
        return 0
    visited = np.int64(0)
    c = np.arange(j)
    part = np.zeros(j + 1, dtype=np.uint64)
    for q in range(j - 1):
        part[q + 1] = part[q] ^ cols[c[q]]
    while True:
        base = part[j - 1]
        start = c[j - 2] + 1 if j > 1 else 0
        for i in range(start, n):
            idx = (base ^ cols[i]) & filt_mask
            filt[idx >> np.uint64(6)] |= np.uint64(1) << (idx & np.uint64(63))
        visited += n - start
        if j == 1:
            return visited
        q = j - 2
        while q >= 0 and c[q] == n - j + q:
            q -= 1
        if q < 0:
            return visited
        c[q] += 1
        part[q + 1] = part[q] ^ cols[c[q]]
        for t in range(q + 1, j - 1):
            c[t] = c[t - 1] + 1
            part[t + 1] = part[t] ^ cols[c[t]]


@kernel(
    "Tuple((int64, boolean, uint64))(uint64[::1], int64, int64, int64, uint64, uint64, "
    "uint64, uint64[::1], uint64, uint64[::1], uint64)",
    nogil=True,
)
def filtered_probe(cols, j, f_lo, f_hi, hi_mask, bucket, low_mask, bitmap, filt_mask,
                   filt, offset):  # pragma: no cover - compiled
    """:func:`syndrome_scan` with ``probe`` true, looking each sum up first in ``filt``
    (bit ``s & filt_mask``, set by :func:`filter_mark` for every marked sum) and in
    ``bitmap`` only when that bit is set.

    The filter is small enough to stay in the caches while the bitmap is not (a level of
    few marks in a bitmap of ``2^r`` bits), so most lookups cost a cache hit instead of
    a miss. The filter holds every marked sum, so a sum it rules out is not marked: the
    scan visits and reports exactly what :func:`syndrome_scan` would.

    Returns ``(subsets visited, hit, syndrome of the hit)``.
    """
    n = cols.shape[0]
    zero = np.uint64(0)
    one = np.uint64(1)
    if j == 0:
        if f_lo > 0:
            return 0, False, zero
        if (offset & hi_mask) != bucket:
            return 1, False, zero
        idx0 = offset & low_mask
        if (bitmap[idx0 >> np.uint64(6)] >> (idx0 & np.uint64(63))) & one:
            return 1, True, offset
        return 1, False, zero
    visited = np.int64(0)
    c = np.zeros(max(j, 1), dtype=np.int64)
    part = np.zeros(j + 1, dtype=np.uint64)
    for f in range(f_lo, min(f_hi, n - j + 1)):
        if j == 1:
            visited += 1
            s = cols[f] ^ offset
            fi = s & filt_mask
            if (filt[fi >> np.uint64(6)] >> (fi & np.uint64(63))) & one:
                if (s & hi_mask) == bucket:
                    idx = s & low_mask
                    if (bitmap[idx >> np.uint64(6)] >> (idx & np.uint64(63))) & one:
                        return visited, True, s
            continue
        p = j - 1  # prefix c[0..p-1], c[0] = f; the last index runs in the inner loop
        c[0] = f
        part[1] = cols[f] ^ offset
        for q in range(1, p):
            c[q] = f + q
            part[q + 1] = part[q] ^ cols[c[q]]
        while True:
            base = part[p]
            start = c[p - 1] + 1
            hit = -1
            for i in range(start, n):
                s = base ^ cols[i]
                fi = s & filt_mask
                if (filt[fi >> np.uint64(6)] >> (fi & np.uint64(63))) & one:
                    if (s & hi_mask) == bucket:
                        idx = s & low_mask
                        if (bitmap[idx >> np.uint64(6)] >> (idx & np.uint64(63))) & one:
                            hit = i
                            break
            if hit >= 0:
                return visited + (hit - start + 1), True, base ^ cols[hit]
            visited += n - start
            q = p - 1
            while q >= 1 and c[q] == n - j + q:
                q -= 1
            if q < 1:
                break
            c[q] += 1
            part[q + 1] = part[q] ^ cols[c[q]]
            for t in range(q + 1, p):
                c[t] = c[t - 1] + 1
                part[t + 1] = part[t] ^ cols[c[t]]
    return visited, False, zero
