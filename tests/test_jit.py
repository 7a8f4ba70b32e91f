"""Lazy kernels and their NumPy twins (issue 11).

Every twin must give exactly what its compiled kernel gives: the same inputs go through
both (the compiled one through ``Kernel.dispatcher``, which never uses the twin).
"""

from __future__ import annotations

import numpy as np
from hypothesis import given
from hypothesis import strategies as st

from gf2codes import _kernels as K
from gf2codes._jit import SMALL_CALLS, Kernel, kernel


def _packed(rng: np.random.Generator, rows: int, n: int) -> np.ndarray:
    bits = rng.integers(0, 2, (rows, n), dtype=np.uint8)
    out = np.zeros((rows, (n + 63) // 64), dtype=np.uint64)
    for j in range(n):
        out[:, j >> 6] |= bits[:, j].astype(np.uint64) << np.uint64(j & 63)
    return out


@given(st.integers(0, 2**32 - 1), st.integers(1, 12), st.integers(1, 140))
def test_rref_twin_equals_kernel(seed, rows, n):
    rng = np.random.default_rng(seed)
    M = _packed(rng, rows, n)
    order = rng.permutation(n).astype(np.int64)[: int(rng.integers(1, n + 1))]
    A, B = M.copy(), M.copy()
    pa = K.rref_inplace.dispatcher(A, order)
    pb = K._rref_small(B, order)
    assert np.array_equal(pa, pb) and np.array_equal(A, B)


def _gray_inputs(seed: int, k: int, n: int):
    from gf2codes._kernels import gray_layout as _gray_layout

    rng = np.random.default_rng(seed)
    rows = _packed(rng, k, n)
    return rng, _gray_layout(rows)


@given(st.integers(0, 2**32 - 1), st.integers(1, 16), st.integers(2, 130), st.integers(0, 9))
def test_gray_twins_equal_kernels(seed, k, n, stop_at):
    rng, (OT, TT, _) = _gray_inputs(seed, k, n)
    outer = 1 << OT.shape[1]
    g0 = int(rng.integers(0, outer))
    g1 = int(rng.integers(g0, outer + 1))
    assert K.gray_min_weight.dispatcher(OT, TT, g0, g1, stop_at) == \
        K._gray_min_weight_small(OT, TT, g0, g1, stop_at)
    assert np.array_equal(K.gray_weight_histogram.dispatcher(OT, TT, g0, g1, n),
                          K._gray_weight_histogram_small(OT, TT, g0, g1, n))


@given(st.integers(0, 2**32 - 1), st.integers(1, 20), st.integers(2, 130), st.integers(1, 2),
       st.integers(0, 6), st.integers(1, 400), st.booleans())
def test_combination_twin_equals_kernel_with_stops_and_resumes(seed, k, n, w, stop_at,
                                                               budget, with_base):
    rng = np.random.default_rng(seed)
    if w > k:
        return
    GT = np.ascontiguousarray(_packed(rng, k, n).T)
    base = (_packed(rng, 1, n)[0] if with_base else np.zeros(GT.shape[0], np.uint64))
    state_a = np.arange(2, dtype=np.int64)
    if w == 2 and k > 2:
        state_a[0] = int(rng.integers(0, k - 1))
    state_b = state_a.copy()
    combo_a, combo_b = np.zeros(2, np.int64), np.zeros(2, np.int64)
    for _ in range(4):  # resume a few times from where each call stopped
        ra = K.combination_min_weight.dispatcher(GT, w, state_a, budget, stop_at, combo_a, base)
        rb = K._combination_min_weight_small(GT, w, state_b, budget, stop_at, combo_b, base)
        assert tuple(ra) == tuple(rb)
        assert np.array_equal(state_a[: w - 1], state_b[: w - 1])
        assert np.array_equal(combo_a[:w], combo_b[:w])
        if ra[2]:
            break


def test_a_kernel_compiles_on_first_call_and_calls_other_kernels():
    @kernel("int64(uint64[::1])", cache=False)
    def total_weight(a):  # pragma: no cover - compiled
        s = np.uint64(0)
        for i in range(a.size):
            s += K.popcount64(a[i])
        return np.int64(s)

    assert isinstance(total_weight, Kernel) and not total_weight.compiled
    a = np.arange(1000, dtype=np.uint64)
    # sum of the binary weights of 0..999, counted here in plain Python
    assert total_weight(a) == sum(bin(x).count("1") for x in range(1000))
    assert total_weight.compiled


def test_the_twin_serves_a_bounded_number_of_calls_then_the_kernel_compiles():
    calls = []

    @kernel("int64(int64)", cache=False)
    def double(x):  # pragma: no cover - compiled
        return 2 * x

    double.small = lambda x: calls.append(x) or 2 * x
    for i in range(SMALL_CALLS + 5):
        assert double(i) == 2 * i
    assert len(calls) == SMALL_CALLS and double.compiled


def test_the_twin_passes_a_large_call_to_the_kernel():
    @kernel("int64(int64)", cache=False)
    def triple(x):  # pragma: no cover - compiled
        return 3 * x

    triple.small = lambda x: None  # "too large for me"
    assert triple(5) == 15 and triple.compiled


@given(st.integers(1, 9), st.data())
def test_next_combination_walks_every_subset_in_lexicographic_order(m, data):
    # The one copy of the combination step (inlined into the enumeration kernels),
    # compiled and as plain Python, against itertools.combinations (computed here).
    import itertools

    from gf2codes._kernels import next_combination

    p = data.draw(st.integers(1, m))
    first = data.draw(st.integers(0, p - 1))
    head = sorted(data.draw(st.sets(st.integers(0, m - p + first - 1), min_size=first,
                                    max_size=first))) if first else []
    lo = head[-1] + 1 if head else 0
    expected = [head + list(t) for t in itertools.combinations(range(lo, m), p - first)]
    for step in (next_combination, next_combination.py_func):
        c = np.array(expected[0], dtype=np.int64)
        seen = [c.tolist()]
        while (i := step(c, first, p, m)) >= 0:
            assert c[:i].tolist() == seen[-1][:i]  # entries before the one returned stay
            seen.append(c.tolist())
        assert seen == expected
