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


# ---------------------------------------------------------------- NumPy twins (small work)
# A high-rate code whose proof needs only a few million column subsets (BCH [255,231]: 3
# million) is settled by NumPy in a few tens of milliseconds, while importing numba and
# loading these kernels from its cache costs about a second on the 2-core AVX2 machine.
# The twins below give exactly the kernels' results (scalars as Python ints and bools, as
# numba returns them) and serve calls while the kernel is not loaded, up to a budget of
# subsets per process counted in work, not time, so the same command takes the same path
# on any machine; tests/test_distance_dual.py runs the same inputs through both.

#: Column subsets (summed and looked up) the twins may serve in one process: about 0.3 s
#: of NumPy (BCH [511,484] needs 22 million), against about 1 s to load numba.
SMALL_SUBSETS = 1 << 25
#: The twins hold the sums of the smaller part of a subset in memory: at most 2 columns.
_SMALL_DEPTH = 2
_small_left = [SMALL_SUBSETS]
#: Decline once numba is loaded (False only in the tests that compare twin and kernel).
DECLINE_WHEN_LOADED = True


def _take(work: int) -> bool:
    """Whether ``work`` subsets still fit the twins' budget (and book them if so). Once
    numba is loaded anyway (another kernel needed it), loading a dual kernel costs
    milliseconds and runs several times faster than its twin, so the twins decline."""
    import sys

    if work > _small_left[0] or (DECLINE_WHEN_LOADED and "numba" in sys.modules):
        return False
    _small_left[0] -= work
    return True


def _lex_sums(cols: np.ndarray, t: int) -> tuple[np.ndarray, np.ndarray]:
    """The sums of all ``t``-subsets of ``cols`` (``t >= 1``) in lexicographic order, and
    ``start`` with ``start[f]`` the position of the first subset whose smallest index is
    ``f`` (``start[n]`` the total): the subsets with smallest index at least ``f`` are the
    tail from ``start[f]``."""
    n = cols.shape[0]
    sums = cols.copy()
    start = np.arange(n + 1, dtype=np.int64)
    for _ in range(t - 1):
        blocks = [cols[f] ^ sums[start[f + 1]:] for f in range(n)]
        sizes = np.array([b.shape[0] for b in blocks], dtype=np.int64)
        start = np.concatenate(([0], np.cumsum(sizes)))
        sums = (np.concatenate(blocks) if blocks else np.zeros(0, dtype=np.uint64))
    return sums, start


def _count_subsets(n: int, j: int, f_lo: int, f_hi: int) -> int:
    import math

    return sum(math.comb(n - 1 - f, j - 1) for f in range(f_lo, min(f_hi, n - j + 1)))


def _blocks(cols: np.ndarray, j: int, f_lo: int, f_hi: int):
    """The sums of the ``j``-subsets (``j >= 1``) whose smallest index is in
    ``[f_lo, f_hi)``, one array per smallest index in the kernels' order (an iterator);
    None when that is over the twins' budget."""
    import math

    n = cols.shape[0]
    top = min(f_hi, n - j + 1)
    if top <= f_lo:
        return iter(())
    if j - 1 > _SMALL_DEPTH or not _take(_count_subsets(n, j, f_lo, f_hi)
                                          + math.comb(n, j - 1)):
        return None
    if j == 1:
        return (cols[f:f + 1].copy() for f in range(f_lo, top))
    sums, start = _lex_sums(cols, j - 1)
    return (cols[f] ^ sums[start[f + 1]:] for f in range(f_lo, top))


def _all_sums(cols: np.ndarray, j: int) -> np.ndarray | None:
    """The sums of every ``j``-subset (``j >= 1``) in the kernels' order, or None."""
    blocks = _blocks(cols, j, 0, cols.shape[0])
    if blocks is None:
        return None
    parts = list(blocks)
    return np.concatenate(parts) if parts else np.zeros(0, dtype=np.uint64)


def _bits(s: np.ndarray, mask: np.uint64) -> tuple[np.ndarray, np.ndarray]:
    idx = s & mask
    return (idx >> np.uint64(6)).astype(np.int64), np.uint64(1) << (idx & np.uint64(63))


def _syndrome_scan_small(cols, j, f_lo, f_hi, hi_mask, bucket, low_mask, bitmap, probe,
                         offset, filt_mask=None, filt=None):
    j, f_lo, f_hi = int(j), int(f_lo), int(f_hi)
    zero = np.uint64(0)
    if j == 0:
        if f_lo > 0:
            return 0, False, zero
        if (offset & hi_mask) != bucket:
            return 1, False, zero
        wd, bit = int((offset & low_mask) >> np.uint64(6)), np.uint64(1) << (
            (offset & low_mask) & np.uint64(63))
        if bitmap[wd] & bit:
            return 1, True, offset
        if not probe:
            bitmap[wd] |= bit
        return 1, False, zero
    blocks = _blocks(cols, j, f_lo, f_hi)
    if blocks is None:
        return None
    visited = 0
    for s in blocks:  # the subsets of one smallest index, in the kernel's order
        s ^= offset
        if probe and filt is not None:  # the filter first: it is small
            fw, fb = _bits(s, filt_mask)
            keep = np.flatnonzero((filt[fw] & fb) != 0)
        else:
            keep = None
        sel = s if keep is None else s[keep]
        inb = (sel & hi_mask) == bucket
        wd, bit = _bits(sel, low_mask)
        cand = inb & ((bitmap[wd] & bit) != 0)
        if not probe:
            where = np.flatnonzero(inb)
            if where.size:
                _, first = np.unique(sel[where], return_index=True)
                repeat = np.ones(where.size, dtype=bool)
                repeat[first] = False
                cand[where[repeat]] = True
        hits = np.flatnonzero(cand)
        end = int(hits[0]) if hits.size else sel.shape[0]
        if not probe:
            mark = np.flatnonzero(inb[:end])
            np.bitwise_or.at(bitmap, wd[mark], bit[mark])
        if hits.size:
            at = end if keep is None else int(keep[end])
            return visited + at + 1, True, s[at]
        visited += int(s.shape[0])
    return visited, False, zero


def _syndrome_unmark_small(cols, j, hi_mask, bucket, low_mask, bitmap):
    n, j = cols.shape[0], int(j)
    if j == 0:
        if (np.uint64(0) & hi_mask) == bucket:
            bitmap[0] = np.uint64(0)
        return 1
    if j > n:
        return 0
    s = _all_sums(cols, j)
    if s is None:
        return None
    wd, _ = _bits(s[(s & hi_mask) == bucket], low_mask)
    bitmap[wd] = np.uint64(0)
    return int(s.shape[0])


def _filter_mark_small(cols, j, filt_mask, filt):
    n, j = cols.shape[0], int(j)
    if j == 0:
        filt[0] |= np.uint64(1)
        return 1
    if j > n:
        return 0
    s = _all_sums(cols, j)
    if s is None:
        return None
    wd, bit = _bits(s, filt_mask)
    np.bitwise_or.at(filt, wd, bit)
    return int(s.shape[0])


def _filtered_probe_small(cols, j, f_lo, f_hi, hi_mask, bucket, low_mask, bitmap,
                          filt_mask, filt, offset):
    if int(j) == 0:  # the kernel looks the empty set up in the bitmap alone
        return _syndrome_scan_small(cols, j, f_lo, f_hi, hi_mask, bucket, low_mask, bitmap,
                                    True, offset)
    return _syndrome_scan_small(cols, j, f_lo, f_hi, hi_mask, bucket, low_mask, bitmap,
                                True, offset, filt_mask, filt)


def _unrank(n: int, j: int, p: int) -> list[int]:
    """The ``p``-th ``j``-subset of ``range(n)`` in lexicographic order."""
    import math

    out, lo = [], 0
    while j:
        for f in range(lo, n):
            count = math.comb(n - 1 - f, j - 1)
            if p < count:
                out.append(f)
                lo, j = f + 1, j - 1
                break
            p -= count
    return out


def _subsets_with_sum_small(cols, j, target, out):
    n, j, m = cols.shape[0], int(j), out.shape[0]
    if j == 0:
        return 1 if target == 0 and m > 0 else 0
    if j > n:
        return 0
    s = _all_sums(cols, j)
    if s is None:
        return None
    found = np.flatnonzero(s == target)[:m]
    for row, p in enumerate(found.tolist()):
        out[row, :j] = _unrank(n, j, p)
    return int(found.shape[0])


syndrome_scan.small = _syndrome_scan_small
syndrome_unmark.small = _syndrome_unmark_small
filter_mark.small = _filter_mark_small
filtered_probe.small = _filtered_probe_small
subsets_with_sum.small = _subsets_with_sum_small
