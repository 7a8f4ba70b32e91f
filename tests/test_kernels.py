"""The enumeration kernels of gf2codes._kernels against brute force (issue 15, point 4).

The scans take three shapes: one word (n <= 64), two words (n <= 128) and the
multi-word path, blocked by ``SCAN_BLOCK`` codewords (n > 128); every test draws
lengths on both sides of 64 and 128 and table lengths on both sides of the block, and
compares with plain Python over every combination (``itertools``), the expected values
computed by brute force in this test.
"""

from __future__ import annotations

import itertools
import math

import numpy as np
from hypothesis import given
from hypothesis import strategies as st

from gf2codes import _kernels as K
from gf2codes._reference import all_codewords

#: Lengths around the word boundaries (1, 2 and 3+ words per row).
LENGTHS = st.sampled_from([1, 7, 63, 64, 65, 66, 100, 127, 128, 129, 130, 191, 192, 193, 300])


def _packed(rng: np.random.Generator, rows: int, n: int) -> tuple[np.ndarray, np.ndarray]:
    """(bits as uint8 rows, the same rows packed)."""
    bits = rng.integers(0, 2, (rows, n), dtype=np.uint8)
    out = np.zeros((rows, (n + 63) // 64), dtype=np.uint64)
    for j in range(n):
        out[:, j >> 6] |= bits[:, j].astype(np.uint64) << np.uint64(j & 63)
    return bits, out


def _weight(words: np.ndarray) -> int:
    return sum(bin(int(x)).count("1") for x in np.ravel(words))


def _sum_rows(rows: np.ndarray, idx) -> np.ndarray:
    out = np.zeros(rows.shape[1], dtype=np.uint64)
    for i in idx:
        out ^= rows[i]
    return out


@given(st.integers(0, 2**32 - 1), LENGTHS, st.integers(1, 14), st.integers(1, 6),
       st.booleans())
def test_combination_min_weight_equals_brute_force(seed, n, k, w, with_base):
    rng = np.random.default_rng(seed)
    w = min(w, k)
    _, rows = _packed(rng, k, n)
    base = _packed(rng, 1, n)[1][0] if with_base else np.zeros(rows.shape[1], np.uint64)
    combos = list(itertools.combinations(range(k), w))
    expect = min(_weight(base ^ _sum_rows(rows, c)) for c in combos)
    combo = np.zeros(w, dtype=np.int64)
    state = np.arange(w, dtype=np.int64)
    visited, best, finished = K.combination_min_weight(
        np.ascontiguousarray(rows.T), w, state, 1 << 60, -1, combo, base)
    assert finished and best == expect and visited == len(combos)
    assert list(combo) == sorted(set(combo.tolist()))  # a w-subset ...
    assert _weight(base ^ _sum_rows(rows, combo)) == expect  # ... of that weight


@given(st.integers(0, 2**32 - 1), LENGTHS, st.integers(2, 12), st.integers(2, 5),
       st.integers(1, 60), st.integers(-1, 40))
def test_combination_min_weight_resumes_without_gaps(seed, n, k, w, budget, stop_at):
    """Calls with a small budget, each resuming where the last stopped, visit every
    combination exactly once, and stop at the first prefix reaching ``stop_at``."""
    rng = np.random.default_rng(seed)
    w = min(w, k)
    _, rows = _packed(rng, k, n)
    GT = np.ascontiguousarray(rows.T)
    base = np.zeros(rows.shape[1], np.uint64)
    weights = [_weight(_sum_rows(rows, c)) for c in itertools.combinations(range(k), w)]
    state = np.arange(w, dtype=np.int64)
    combo = np.zeros(w, dtype=np.int64)
    total, best = 0, 1 << 62
    while True:
        visited, wt, finished = K.combination_min_weight(GT, w, state, budget, stop_at,
                                                         combo, base)
        total += visited
        best = min(best, wt)
        if finished or wt <= stop_at:
            break
    assert best == min(weights[:total])
    if best > stop_at:
        assert total == len(weights)
    else:  # stopped within the prefix of the first weight <= stop_at
        first = next(i for i, x in enumerate(weights) if x <= stop_at)
        assert first < total <= first + k


@given(st.integers(0, 2**32 - 1), LENGTHS, st.integers(0, 9), st.integers(0, 3),
       st.integers(1, 700), st.booleans())
def test_combination_table_min_weight_equals_brute_force(seed, n, a, w1, L, with_base):
    """Tables of lengths around ``SCAN_BLOCK`` (256) and 1 entry, heads of 0 to 9 rows."""
    rng = np.random.default_rng(seed)
    w1 = min(w1, a)
    _, head = _packed(rng, max(a, 1), n)
    head = head[:a]
    _, table = _packed(rng, L, n)
    base = _packed(rng, 1, n)[1][0] if with_base else np.zeros(table.shape[1], np.uint64)
    AT = np.ascontiguousarray(head.T) if a else np.zeros((table.shape[1], 0), np.uint64)
    TT = np.ascontiguousarray(table.T)
    combos = list(itertools.combinations(range(a), w1))
    expect = min(_weight(base ^ _sum_rows(head, c) ^ table[t])
                 for c in combos for t in range(L))
    state = np.arange(max(w1, 1), dtype=np.int64)
    combo = np.zeros(max(w1, 1), dtype=np.int64)
    visited, best, t, finished = K.combination_table_min_weight(
        AT, w1, state, TT, 1 << 60, -1, combo, base)
    assert finished and best == expect and visited == len(combos) * L
    assert _weight(base ^ _sum_rows(head, combo[:w1]) ^ table[t]) == expect


@given(st.integers(0, 2**32 - 1), LENGTHS, st.integers(1, 10), st.integers(1, 4),
       st.integers(0, 40), st.booleans(), st.integers(1, 50))
def test_extended_tasks_visit_the_same_combinations(seed, n, a, w1, L, with_base, budget):
    """A level task with head rows moved into its table (distance._bz._extend, the
    combination_ext_min_weight kernel) visits every combination of w1 head rows and one
    table entry once (L = 0: no table), finds the brute-force least weight, names a
    combination of that weight, and resumes from its state after any budget."""
    from gf2codes.distance import _bz

    rng = np.random.default_rng(seed)
    w1 = min(w1, a)
    _, head = _packed(rng, a, n)
    W = head.shape[1]
    table = _packed(rng, L, n)[1] if L else None
    base = _packed(rng, 1, n)[1][0] if with_base else np.zeros(W, np.uint64)
    AT = np.ascontiguousarray(head.T)
    TT = None if table is None else np.ascontiguousarray(table.T)
    subsets = None if table is None else np.arange(L, dtype=np.uint8).reshape(L, 1)
    task = _bz.Task(AT, np.arange(a, dtype=np.int64), w1, base, TT, subsets)
    old = (_bz._EXT_MIN, _bz._EXT_MAX, _bz._EXT_TABLE, _bz._EXT_WORK)
    # extend small cases too
    _bz._EXT_MIN, _bz._EXT_MAX, _bz._EXT_TABLE, _bz._EXT_WORK = 16, 1 << 12, 64, 1
    try:
        task = _bz._extend(task)
    finally:
        _bz._EXT_MIN, _bz._EXT_MAX, _bz._EXT_TABLE, _bz._EXT_WORK = old
    rows = [(t,) for t in range(L)] if L else [()]
    combos = list(itertools.combinations(range(a), w1))
    expect = min(_weight(base ^ _sum_rows(head, c) ^ (table[t[0]] if t else 0))
                 for c in combos for t in rows)
    if task.ext is None:
        assert L == 0  # with a table, one head row always fits these limits
        return  # nothing to extend here (the plain kernels are tested above)
    e, heads, LL, ET, starts = task.ext
    p = w1 - e
    state = np.arange(max(p, 1), dtype=np.int64)
    combo = np.zeros(max(p, 1), dtype=np.int64)
    total, best, found = 0, 1 << 62, None
    while True:
        visited, wt, t, finished = K.combination_ext_min_weight(
            AT, p, a - e, state, ET, starts, budget, -1, combo, base)
        total += visited
        if wt < best:
            used = combo[:p].tolist() + heads[t // LL].tolist()
            word = base ^ _sum_rows(head, used) ^ (table[t % LL] if L else 0)
            best, found = wt, _weight(word)
            assert len(set(used)) == w1
        if finished:
            break
    assert total == len(combos) * len(rows)
    assert best == expect == found


@given(st.integers(0, 2**32 - 1), LENGTHS, st.integers(1, 14), st.integers(0, 8))
def test_gray_kernels_equal_brute_force(seed, n, k, stop_at):
    rng = np.random.default_rng(seed)
    bits, rows = _packed(rng, k, n)
    OT, TT, _ = K.gray_layout(rows)
    words = all_codewords(bits)  # with multiplicity, as the kernels count them
    weights = words.sum(axis=1)
    hist = K.gray_weight_histogram(OT, TT, 0, 1 << OT.shape[1], n)
    assert hist.tolist() == np.bincount(weights, minlength=n + 1).tolist()
    best, gray, inner = K.gray_min_weight(OT, TT, 0, 1 << OT.shape[1], -1)
    nonzero = [int(x) for x in weights[1:]]  # message 0 is the zero codeword
    assert best == min(nonzero)
    from gf2codes.distance._gray import gray_word

    assert _weight(gray_word(rows, int(gray), int(inner))) == best
    # stopping early: the weight reported is at most stop_at once one is seen
    best2, _, _ = K.gray_min_weight(OT, TT, 0, 1 << OT.shape[1], stop_at)
    assert (best2 <= stop_at) == (min(nonzero) <= stop_at)
    assert best2 >= min(nonzero)


@given(st.integers(0, 2**32 - 1), st.sampled_from([129, 192, 200, 257]), st.integers(1, 5))
def test_multiword_paths_agree_with_each_other(seed, n, w):
    """The same level through the plain and the table kernel (multi-word rows)."""
    rng = np.random.default_rng(seed)
    k = 12
    _, rows = _packed(rng, k, n)
    expect = min(_weight(_sum_rows(rows, c)) for c in itertools.combinations(range(k), w))
    got = 1 << 62
    a = 5
    for w2 in range(0, min(w, k - a) + 1):
        w1 = w - w2
        if w1 > a:
            continue
        sums, _ = K.subset_sums(np.ascontiguousarray(rows[a:]), w2)
        assert sums.shape[0] == math.comb(k - a, w2)
        if w2 == 0:
            sums = np.zeros((1, rows.shape[1]), np.uint64)
        state = np.arange(max(w1, 1), dtype=np.int64)
        combo = np.zeros(max(w1, 1), dtype=np.int64)
        _, best, _, _ = K.combination_table_min_weight(
            np.ascontiguousarray(rows[:a].T), w1, state, np.ascontiguousarray(sums.T),
            1 << 60, -1, combo, np.zeros(rows.shape[1], np.uint64))
        got = min(got, best)
    assert got == expect
