"""The dual-side route: the fewest columns of a parity-check matrix that sum to zero.

For ``n - k <= 64`` the columns of ``H`` fit one ``uint64`` each; ``d >= w + 1`` is
proved by showing that no ``w`` columns sum to zero, for ``w = 1, 2, ...``, meeting in
the middle (the sums of ``floor(w/2)`` columns in a bitmap indexed by the syndrome, those
of ``ceil(w/2)`` looked up; see :mod:`gf2codes._dual_kernels`).
"""

from __future__ import annotations

import math
from typing import NamedTuple

import numpy as np

from .. import _kernels, linalg
from ..code import Code
from ..typing import StopReason
from ._result import CHUNK, Best, ProofClock, Settled, round_up, settled, stop_reason
from ._symmetry import Symmetry

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


class _Pass(NamedTuple):
    """One meet-in-the-middle pass of a level: mark the sums of the ``mark``-subsets of
    ``cols`` (offset 0), then look up the sums of the ``probe``-subsets XOR ``offset``
    (no lookup when ``probe`` is None: a collision of two marks is the hit).

    ``coords`` maps positions in ``cols`` to coordinates of the code; ``rep`` is the
    fixed coordinate of an orbit pass (-1 for none)."""

    cols: np.ndarray
    coords: np.ndarray
    mark: int
    probe: int | None
    offset: int
    rep: int


def _orbit_runs(n: int, symmetry: Symmetry | None) -> list[tuple[int, np.ndarray]]:
    """Per orbit of the group, largest first: (its representative, the coordinates a
    codeword whose first orbit met is this one may use besides the representative).

    Empty when there is no group or it moves nothing."""
    if symmetry is None or len(symmetry.orbits) >= n:
        return []
    allowed = set(range(n))
    runs = []
    for orb in sorted(symmetry.orbits, key=lambda o: (-len(o), o[0])):
        rep = orb[0]
        runs.append((rep, np.array(sorted(allowed - {rep}), dtype=np.int64)))
        allowed -= set(orb)
    return runs


def _passes(w: int, cols: np.ndarray, runs: list[tuple[int, np.ndarray]] | None
            ) -> list[_Pass]:
    """The passes that settle "is there a codeword of weight ``w``?" once every lighter
    weight is excluded: all ``w``-subsets of columns (``runs`` None), or, per orbit,
    the ``(w - 1)``-subsets of its allowed columns summing to its representative's."""
    if runs is None:
        j = w // 2
        every = np.arange(cols.shape[0], dtype=np.int64)
        return [_Pass(cols, every, j, None if w - j == j else w - j, 0, -1)]
    a = (w - 1) // 2
    return [_Pass(np.ascontiguousarray(cols[idx]), idx, a, w - 1 - a, int(cols[rep]), rep)
            for rep, idx in runs]


def _pass_sizes(n: int, runs_sizes: list[int] | None, w: int) -> list[tuple[int, int]]:
    """(subsets marked, subsets looked up) of each pass of level ``w``, for ``n`` columns
    or for runs over ``runs_sizes`` allowed columns (as :func:`_passes`)."""
    if runs_sizes is None:
        j = w // 2
        return [(math.comb(n, j), math.comb(n, w - j) if w - j != j else 0)]
    a = (w - 1) // 2
    return [(math.comb(m, a), math.comb(m, w - 1 - a)) for m in runs_sizes]


def _plan_seconds(n: int, r: int, goal: int, divisor: int, start_lower: int,
                  runs_sizes: list[int] | None) -> float:
    low, buckets = _dual_layout(r)
    nbytes = max(8, (1 << low) // 8)
    total = 0.0
    for w in _dual_levels(divisor, start_lower, goal):
        for marks, probes in _pass_sizes(n, runs_sizes, w):
            clear = min(nbytes, marks * _UNMARK_COST) / _RATE_CLEAR  # see unmark
            total += buckets * ((marks + probes) / _dual_rate(low) + clear)
    return total


def _choose_runs(n: int, r: int, goal: int, divisor: int, start_lower: int,
                 symmetry: Symmetry | None
                 ) -> tuple[list[tuple[int, np.ndarray]] | None, float]:
    """The cheaper of the plain search and the search through orbit representatives
    (when a group is known): (runs or None for plain, estimated seconds)."""
    plain = _plan_seconds(n, r, goal, divisor, start_lower, None)
    runs = _orbit_runs(n, symmetry)
    if not runs:
        return None, plain
    orbit = _plan_seconds(n, r, goal, divisor, start_lower, [len(i) for _, i in runs])
    return (runs, orbit) if orbit < plain else (None, plain)


#: A level's look-ups go through a filter of this many bits per marked sum (false
#: positive rate about 1/32) when that is at most a quarter of the bitmap ...
_FILTER_BITS_PER_MARK = 32
#: ... and at most this size (2^26 bits, 8 MiB), so that it stays in the caches.
_FILTER_MAX_LOG = 26


def _filter_bits(marks: int, low: int) -> int:
    """Bits of the look-up filter of a pass with ``marks`` marked sums and a bitmap of
    ``2^low`` bits; 0 for none (the bitmap is small enough, or the filter would be
    too full to help)."""
    log = max(12, (marks * _FILTER_BITS_PER_MARK - 1).bit_length())
    if log > _FILTER_MAX_LOG or log > low - 2:
        return 0
    return 1 << log


def dual_columns_seconds(n: int, k: int, goal: int, *, divisor: int = 1,
                         start_lower: int = 1, symmetry: Symmetry | None = None) -> float:
    """Estimated seconds (one core) for the dual-side route to prove ``d >= goal`` on an
    ``[n, k]`` code; ``inf`` when the route does not apply (``n - k > 64``). With a
    checked automorphism group, the search through one column per orbit when cheaper."""
    r = n - k
    if r > 64:
        return math.inf
    goal = min(goal, n + 1)  # no weight exceeds n (and "no codeword yet" is 2^62)
    return _choose_runs(n, r, goal, divisor, start_lower, symmetry)[1]


def _subset_of(cols: np.ndarray, j: int, syndrome: int) -> list[np.ndarray]:
    from .. import _dual_kernels

    out = np.zeros((2, max(j, 1)), dtype=np.int64)
    got = _dual_kernels.subsets_with_sum(cols, j, np.uint64(syndrome), out)
    return [out[i, :j].copy() for i in range(got)]


def _dual_witness(n: int, all_cols: np.ndarray, p: _Pass, syndrome: int, probed: bool
                  ) -> np.ndarray:
    """The codeword (packed) behind a hit of pass ``p``: the symmetric difference of two
    distinct column subsets with equal sums (with the representative's column for an
    orbit pass), a nonempty zero-sum set of columns."""
    if probed:
        assert p.probe is not None
        first = _subset_of(p.cols, p.mark, syndrome)
        second = _subset_of(p.cols, p.probe, syndrome ^ p.offset)
        assert first and second, "the dual-side scan reported a hit that is not there"
        a, b = first[0], second[0]
    else:
        found = _subset_of(p.cols, p.mark, syndrome)
        assert len(found) == 2, "the dual-side scan reported a collision that is not there"
        a, b = found
    word = np.zeros(n, dtype=np.uint8)
    word[p.coords[a]] ^= 1
    word[p.coords[b]] ^= 1
    if probed and p.rep >= 0:
        word[p.rep] ^= 1
    support = word.astype(bool)
    assert support.any() and int(np.bitwise_xor.reduce(all_cols[support])) == 0, \
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
                start_lower: int, symmetry: Symmetry | None = None,
                argument_out: list[str] | None = None, orbits: bool | None = None
                ) -> tuple[int, StopReason | None]:
    """The dual-side route: prove ``d >= w + 1`` by showing that no ``w`` columns of a
    parity-check matrix sum to zero, for ``w = 1, 2, ...`` (meet in the middle: the sums
    of ``floor(w/2)`` columns in a bitmap, those of ``ceil(w/2)`` looked up).

    With a checked automorphism group ``G`` (``symmetry``), when cheaper, only the
    codewords through one representative coordinate per orbit are searched. Soundness:
    let ``c`` be a codeword of weight ``w`` and ``O`` the first orbit (in the run order)
    that meets its support, at ``i``; some ``g`` in ``G`` maps ``i`` to the
    representative ``o`` of ``O``, and ``g(c)`` is a codeword of weight ``w`` through
    ``o`` whose support avoids the earlier orbits (orbits are invariant under ``G``). So
    level ``w`` looks, per orbit, for ``w - 1`` allowed columns summing to the column of
    ``o``; the earlier levels having excluded every lighter weight, a hit is a codeword
    of weight exactly ``w`` (the sets cannot overlap). For a cyclic code (one orbit)
    this is the search for ``w - 1`` of the other ``n - 1`` columns summing to column 0:
    the larger half of each level shrinks from ``C(n, ceil(w/2))`` subsets to
    ``C(n - 1, ceil((w-1)/2))``, and the bitmap holds the smaller half only. The
    argument used is appended to ``argument_out`` (``"orbit-columns"``) when given.
    ``orbits`` True forces the search through orbit representatives (when there is a
    group), False the plain search; None takes the cheaper estimate (the tests compare
    the two).

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
    goal0 = best.weight if target is None else min(best.weight, target)
    runs, _ = _choose_runs(n, r, min(goal0, n + 1), divisor, start_lower, symmetry)
    if orbits is not None:
        runs = (_orbit_runs(n, symmetry) or None) if orbits else None
    if runs is not None and argument_out is not None:
        argument_out.append("orbit-columns")
    runs_sizes = None if runs is None else [len(i) for _, i in runs]

    filt = np.zeros(0, dtype=np.uint64)
    filt_mask = np.uint64(0)

    def scan(p: _Pass, j: int, bucket: np.uint64, probe: bool) -> tuple[int, bool]:
        """(syndrome of a hit or -1, time ran out)."""
        m = p.cols.shape[0]
        if j > m:
            return -1, False
        off = np.uint64(p.offset if probe else 0)
        for f_lo, f_hi in _dual_chunks(m, j):
            if probe and filt.size:
                visited, hit, s = _dual_kernels.filtered_probe(
                    p.cols, j, f_lo, f_hi, hi_mask, bucket, low_mask, bitmap, filt_mask,
                    filt, off)
            else:
                visited, hit, s = _dual_kernels.syndrome_scan(
                    p.cols, j, f_lo, f_hi, hi_mask, bucket, low_mask, bitmap, probe, off)
            clock.tick(visited, lower, best.weight)
            if hit:
                return int(s), False
            if clock.expired():
                return -1, True
        return -1, False

    def unmark(p: _Pass, bucket: np.uint64) -> None:
        """Leave the bitmap zero for the next pass: zero the words the marks of the
        pass can have touched when they are few (a level of small ``j`` in a bitmap
        of 512 MiB), else clear it all."""
        m = p.cols.shape[0]
        if p.mark > m:
            return
        if math.comb(m, p.mark) * _UNMARK_COST < bitmap.nbytes:
            _dual_kernels.syndrome_unmark(p.cols, p.mark, hi_mask, bucket, low_mask, bitmap)
        else:
            bitmap[:] = 0

    def level(w: int) -> tuple[np.ndarray | None, bool]:
        """(the codeword of weight w found, or None; time ran out)."""
        nonlocal filt, filt_mask
        for p in _passes(w, cols, runs):
            bits = _filter_bits(math.comb(p.cols.shape[0], p.mark), low) if p.probe else 0
            filt = np.zeros(max(1, bits // 64) if bits else 0, dtype=np.uint64)
            filt_mask = np.uint64(max(bits - 1, 0))
            if bits:
                clock.tick(_dual_kernels.filter_mark(p.cols, p.mark, filt_mask, filt),
                           lower, best.weight)
            for b in range(buckets):
                bucket = np.uint64(b << low)
                try:
                    s, late = scan(p, p.mark, bucket, False)
                    if late:
                        return None, True
                    if s >= 0:
                        return _dual_witness(n, cols, p, s, probed=False), False
                    if p.probe is not None:
                        s, late = scan(p, p.probe, bucket, True)
                        if late:
                            return None, True
                        if s >= 0:
                            return _dual_witness(n, cols, p, s, probed=True), False
                finally:
                    unmark(p, bucket)
        return None, False

    try:
        for w in range(1, n + 1):
            if settled(best.weight, lower, target):
                break
            if w % divisor or w < start_lower:
                continue
            goal = best.weight if target is None else min(best.weight, target)
            clock.total = max(clock.done, int(_dual_rate(low) * _plan_seconds(
                n, r, min(goal, n + 1), divisor, lower, runs_sizes)) + clock.done)
            hit_word, late = level(w)
            if late:
                return lower, "time limit"
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
