"""The dual-side route (fewest parity-check columns summing to zero) against brute
force and against the primal engines, its kernels against plain Python, and the
route choice."""

from __future__ import annotations

import itertools

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from gf2codes import _dual_kernels, families
from gf2codes._reference import brute_distance
from gf2codes.code import Code
from gf2codes.distance import _dual, minimum_distance, route_estimates
from gf2codes.exceptions import ParameterError

from helpers import random_code_matrix


def _check(C: Code, r, d: int) -> None:
    assert r.exact and r.d == d == r.lower == r.upper
    assert r.witness.sum() == d and C.contains(r.witness)


def _shaped_code(seed: int) -> Code:
    """Random small codes with the awkward shapes mixed in: zero columns, repeated
    columns, k = 1, n - k = 0 or 1, d = 1 or 2."""
    rng = np.random.default_rng(seed)
    n = int(rng.integers(1, 19))
    shape = int(rng.integers(0, 6))
    if shape == 0:
        k = 1
    elif shape == 1:
        k = n  # n - k = 0: the full space, d = 1
    elif shape == 2:
        k = max(1, n - 1)  # n - k = 1
    else:
        k = int(rng.integers(1, n + 1))
    M = random_code_matrix(rng, n, k, density=float(rng.uniform(0.2, 0.8)))
    if shape == 3 and n > 1:
        M[:, int(rng.integers(n))] = 0  # a zero column: d = 1
    if shape == 4 and n > 1:
        a, b = rng.choice(n, size=2, replace=False)
        M[:, b] = M[:, a]  # a repeated column: d <= 2
    assume(M.any())
    return Code(M)


@given(st.integers(0, 2**32 - 1))
def test_dual_route_equals_brute_force(seed):
    C = _shaped_code(seed)
    d = brute_distance(C.G)  # computed by brute force in this test
    _check(C, minimum_distance(C, method="dual-columns"), d)


@settings(max_examples=40)
@given(st.integers(0, 2**32 - 1))
def test_dual_route_equals_primal_engine_beyond_brute_force(seed):
    rng = np.random.default_rng(seed)
    n = int(rng.integers(30, 70))
    r = int(rng.integers(1, 19))
    M = random_code_matrix(rng, n, n - r, density=float(rng.uniform(0.2, 0.6)))
    C = Code(M)
    primal = minimum_distance(C, method="brouwer-zimmermann", max_work=None)
    _check(C, minimum_distance(C, method="dual-columns"), primal.d)


@settings(max_examples=25)
@given(st.integers(0, 2**32 - 1), st.integers(1, 8))
def test_dual_route_target_test(seed, target):
    C = _shaped_code(seed)
    d = brute_distance(C.G)
    r = minimum_distance(C, method="dual-columns", target=target)
    assert r.at_least(target) == (d >= target)
    assert r.lower <= d <= r.upper and C.contains(r.witness) and r.witness.sum() == r.upper


def test_dual_route_with_buckets(monkeypatch):
    """A bitmap smaller than 2^(n-k) bits: the syndromes go in buckets of top bits."""
    monkeypatch.setattr(_dual, "_BITMAP_BITS", 3)
    rng = np.random.default_rng(11)
    for _ in range(20):
        n = int(rng.integers(12, 30))
        C = Code(random_code_matrix(rng, n, n - int(rng.integers(6, 12))))
        _check(C, minimum_distance(C, method="dual-columns"), brute_distance(C.G)
               if C.k <= 16 else minimum_distance(C, method="gray").d)


def test_published_high_rate_codes():
    # Hamming [15,11,3] and [31,26,3]; extended Hamming [32,26,4]; BCH [31,21,5], [63,51,5]
    # (MacWilliams & Sloane 1977, ch. 1 section 7 and ch. 9 section 1, the table of BCH
    # codes, figure 9.1).
    cases = [(families.hamming(4), 3), (families.hamming(5), 3),
             (families.bch(31, 5), 5), (families.bch(63, 5), 5)]
    for C, d in cases:
        _check(C, minimum_distance(C, method="dual-columns"), d)
        r = minimum_distance(C)
        assert r.d == d


def test_auto_takes_the_dual_route_for_high_rate_and_says_why():
    C = families.bch(127, 7)  # [127, 106, 7], MacWilliams & Sloane 1977, figure 9.1
    r = minimum_distance(C)
    assert r.method == "dual-columns" and r.d == 7
    assert "cheapest estimate" in r.reason
    assert set(r.estimates) == {"gray", "brouwer-zimmermann", "dual-columns"}
    assert r.estimates["dual-columns"] == min(r.estimates.values())


def test_route_estimates_skip_what_does_not_apply():
    rng = np.random.default_rng(5)
    C = Code(random_code_matrix(rng, 100, 30))  # n - k = 70 > 64
    assert "dual-columns" not in route_estimates(C, 20)
    with pytest.raises(ParameterError, match="Argument 'method' must not be dual-columns"):
        minimum_distance(C, method="dual-columns")


def test_dual_time_limit_gives_a_valid_interval():
    C = families.bch(255, 9)  # [255, 223]: levels of 10^8 subsets and more
    r = minimum_distance(C, method="dual-columns", time_limit=0.3)
    assert r.lower <= r.upper and C.contains(r.witness) and r.witness.sum() == r.upper
    assert r.exact or r.stopped == "time limit"


@given(st.integers(0, 2**32 - 1), st.integers(0, 4), st.booleans())
def test_syndrome_scan_against_python(seed, j, probe):
    rng = np.random.default_rng(seed)
    n = int(rng.integers(1, 12))
    r = int(rng.integers(1, 8))
    cols = rng.integers(0, 1 << r, size=n, dtype=np.uint64)
    marked = set(int(x) for x in rng.integers(0, 1 << r, size=3))
    bitmap = np.zeros(4, dtype=np.uint64)
    for s in marked:
        bitmap[s >> 6] |= np.uint64(1) << np.uint64(s & 63)
    low = np.uint64((1 << r) - 1)
    visited, hit, s = _dual_kernels.syndrome_scan(cols, j, 0, n, np.uint64(0), np.uint64(0),
                                                  low, bitmap, probe, np.uint64(0))
    # plain Python: the same subsets in lexicographic order
    seen = set(marked)
    expect = None
    count = 0
    for sub in itertools.combinations(range(n), j):
        count += 1
        v = 0
        for i in sub:
            v ^= int(cols[i])
        if v in seen:
            expect = v
            break
        if not probe:
            seen.add(v)
    assert hit == (expect is not None)
    if hit:
        assert int(s) == expect and visited == count
    else:
        assert visited == count


def test_subsets_with_sum_against_itertools():
    rng = np.random.default_rng(3)
    cols = rng.integers(0, 16, size=9, dtype=np.uint64)
    for j in range(0, 5):
        for target in range(16):
            out = np.zeros((200, max(j, 1)), dtype=np.int64)
            got = _dual_kernels.subsets_with_sum(cols, j, np.uint64(target), out)
            expect = [sub for sub in itertools.combinations(range(9), j)
                      if np.bitwise_xor.reduce(cols[list(sub)], initial=np.uint64(0)) == target]
            assert [tuple(out[i, :j]) for i in range(got)] == expect


@settings(max_examples=30)
@given(st.integers(0, 2**32 - 1))
def test_information_sets_are_reported_and_consistent(seed):
    rng = np.random.default_rng(seed)
    n = int(rng.integers(10, 40))
    k = int(rng.integers(2, min(n, 14) + 1))
    M = random_code_matrix(rng, n, k)
    assume(M.any())
    C = Code(M)
    r = minimum_distance(C, method="brouwer-zimmermann")
    assert r.d == brute_distance(C.G)  # computed by brute force in this test
    sets = r.information_sets
    assert sets and sets[0]["rank"] == C.k and sum(s["rank"] for s in sets) <= C.n
    for s in sets:
        assert s["contribution"] == max(0, s["levels_done"] + 1 - (C.k - s["rank"]))
    # the proof: the sum of contributions reaches the distance unless every
    # combination of the first (full-rank) matrix was enumerated
    div = C.weight_divisor
    total = -(-sum(s["contribution"] for s in sets) // div) * div
    assert total >= r.d or sets[0]["levels_done"] >= C.k - 1 or r.d <= div


@given(st.integers(0, 2**32 - 1), st.integers(0, 5), st.integers(0, 3))
def test_syndrome_unmark_leaves_the_bitmap_zero(seed, j, top):
    """Marks of a full scan (in one bucket of top bits), then unmark: nothing is left,
    and words of other buckets' marks stay zero (issue 15)."""
    rng = np.random.default_rng(seed)
    n = int(rng.integers(1, 14))
    r = int(rng.integers(2, 11))
    low_bits = max(1, r - top)
    cols = rng.integers(0, 1 << r, size=n, dtype=np.uint64)
    low = np.uint64((1 << low_bits) - 1)
    hi = np.uint64(((1 << r) - 1) ^ ((1 << low_bits) - 1))
    bucket = np.uint64(int(rng.integers(0, 1 << (r - low_bits))) << low_bits)
    bitmap = np.zeros(max(1, (1 << low_bits) // 64), dtype=np.uint64)
    _dual_kernels.syndrome_scan(cols, j, 0, n, hi, bucket, low, bitmap, False, np.uint64(0))
    visited = _dual_kernels.syndrome_unmark(cols, j, hi, bucket, low, bitmap)
    assert not bitmap.any()
    assert visited == (len(list(itertools.combinations(range(n), j))) if j <= n else 0)


def test_dual_route_unmarking_instead_of_clearing(monkeypatch):
    """The route with every pass unmarked rather than cleared (and with buckets)
    proves the same distances as brute force."""
    monkeypatch.setattr(_dual, "_UNMARK_COST", 0)
    rng = np.random.default_rng(12)
    for bits in (3, 32):
        monkeypatch.setattr(_dual, "_BITMAP_BITS", bits)
        for _ in range(15):
            n = int(rng.integers(10, 26))
            C = Code(random_code_matrix(rng, n, n - int(rng.integers(4, 11))))
            _check(C, minimum_distance(C, method="dual-columns"), brute_distance(C.G)
                   if C.k <= 16 else minimum_distance(C, method="gray").d)


def test_dual_estimate_without_a_codeword_yet():
    """No codeword known (weight 2^62): the estimate stops at weight n, it does not
    list 2^62 levels (which took all memory when the route ran without a first word)."""
    s = _dual.dual_columns_seconds(30, 20, 1 << 62)
    assert s == _dual.dual_columns_seconds(30, 20, 31) and 0 < s < 1e6


# ------------------------------------------- the search through one column per orbit
def _dual_route(C: Code, symmetry, orbits: bool | None) -> tuple[int, int, list[str]]:
    """The dual-side route alone: (proved lower bound, best weight, argument)."""
    from gf2codes.distance._result import Best, ProofClock

    best = Best(C.n)
    arg: list[str] = []
    lower, _ = _dual.dual_search(C, ProofClock(None, None), best, None, C.weight_divisor,
                                 symmetry, arg, orbits=orbits)
    return min(lower, best.weight), best.weight, arg


def test_orbit_route_on_every_cyclic_code_up_to_23():
    """Every cyclic code of length <= 23 (every divisor of x^n - 1 as generator,
    gf2codes.polynomials): the search through column 0 alone proves the d that brute
    force gives (issue 15)."""
    from gf2codes.distance._symmetry import code_symmetry
    from gf2codes.polynomials import generator_polynomials

    count = 0
    for n in range(3, 24):
        for g in generator_polynomials(n):
            C = g.build()
            if C.k < 1 or C.k == C.n:
                continue
            sym = code_symmetry(C)
            assert sym is not None and sym.transitive
            d = brute_distance(C.G) if C.k <= 14 else minimum_distance(C, method="gray").d
            lower, found, arg = _dual_route(C, sym, True)
            assert lower == found == d and arg == ["orbit-columns"], (n, C.k)
            count += 1
    assert count > 200


@settings(max_examples=40, deadline=None)
@given(st.integers(3, 9), st.integers(2, 4), st.integers(1, 3), st.integers(0, 2**32 - 1))
def test_orbit_route_on_random_quasi_cyclic_codes(m, ell, rows, seed):
    """Random quasi-cyclic codes (several orbits, so runs that exclude earlier orbits):
    the orbit search, the plain search and brute force agree."""
    from gf2codes.distance._symmetry import code_symmetry

    rng = np.random.default_rng(seed)
    gens = ["".join(map(str, rng.integers(0, 2, m * ell))) for _ in range(rows)]
    C = families.quasi_cyclic(gens, m)
    assume(1 <= C.k < C.n)
    sym = code_symmetry(C)
    # brute force holds every codeword: up to 2^16 of them
    d = brute_distance(C.G) if C.k <= 16 else minimum_distance(C, method="gray").d
    for orbits in (True, False):
        lower, found, arg = _dual_route(C, sym, orbits)
        assert lower == found == d
        assert arg == (["orbit-columns"] if orbits and len(sym.orbits) < C.n else [])


def test_bch_255_231_takes_the_orbit_route_and_says_so():
    """BCH [255,231] (designed 7; d = 7, MacWilliams & Sloane 1977 ch. 9): the cyclic
    group is detected, the dual-side route runs through column 0 only, and the result
    names the argument and the group."""
    C = families.bch(255, 7)
    r = minimum_distance(C)
    assert r.method == "dual-columns" and r.d == 7 and r.argument == "orbit-columns"
    assert r.symmetry is not None and r.symmetry["cyclic"]
    plain = minimum_distance(C, use_symmetry=False)
    assert plain.d == 7 and plain.argument == "" and plain.codewords > r.codewords


@settings(max_examples=150, deadline=None)
@given(st.integers(0, 2**32 - 1), st.integers(0, 4))
def test_filtered_probe_equals_the_plain_probe(seed, j):
    """The filtered look-up visits and reports exactly what syndrome_scan's probe does,
    with a filter built by filter_mark from the marked subsets, whatever the bucket,
    offset and filter size."""
    rng = np.random.default_rng(seed)
    n = int(rng.integers(1, 13))
    r = int(rng.integers(2, 12))
    low_bits = max(1, r - int(rng.integers(0, 3)))
    cols = rng.integers(0, 1 << r, size=n, dtype=np.uint64)
    low = np.uint64((1 << low_bits) - 1)
    hi = np.uint64(((1 << r) - 1) ^ ((1 << low_bits) - 1))
    bucket = np.uint64(int(rng.integers(0, 1 << (r - low_bits))) << low_bits)
    offset = np.uint64(int(rng.integers(0, 1 << r)))
    jm = int(rng.integers(0, 3))
    bitmap = np.zeros(max(1, (1 << low_bits) // 64), dtype=np.uint64)
    _dual_kernels.syndrome_scan(cols, jm, 0, n, hi, bucket, low, bitmap, False, np.uint64(0))
    fbits = 1 << int(rng.integers(6, 10))
    filt = np.zeros(fbits // 64, dtype=np.uint64)
    _dual_kernels.filter_mark(cols, jm, np.uint64(fbits - 1), filt)
    plain = _dual_kernels.syndrome_scan(cols, j, 0, n, hi, bucket, low, bitmap, True, offset)
    fast = _dual_kernels.filtered_probe(cols, j, 0, n, hi, bucket, low, bitmap,
                                        np.uint64(fbits - 1), filt, offset)
    assert tuple(plain) == tuple(fast)


def test_syndrome_scan_offset_against_python():
    """The offset is XORed into every sum (the empty set's sum is the offset)."""
    rng = np.random.default_rng(3)
    for _ in range(60):
        n = int(rng.integers(1, 10))
        r = int(rng.integers(2, 9))
        j = int(rng.integers(0, 4))
        cols = rng.integers(0, 1 << r, size=n, dtype=np.uint64)
        offset = int(rng.integers(0, 1 << r))
        target = int(rng.integers(0, 1 << r))
        bitmap = np.zeros(max(1, (1 << r) // 64), dtype=np.uint64)
        bitmap[target >> 6] |= np.uint64(1) << np.uint64(target & 63)
        visited, hit, s = _dual_kernels.syndrome_scan(
            cols, j, 0, n, np.uint64(0), np.uint64(0), np.uint64((1 << r) - 1), bitmap,
            True, np.uint64(offset))
        expect = None
        count = 0
        for sub in itertools.combinations(range(n), j):
            count += 1
            v = offset
            for i in sub:
                v ^= int(cols[i])
            if v == target:
                expect = v
                break
        assert hit == (expect is not None) and visited == count
        if hit:
            assert int(s) == expect


# ------------------------------------------------- the NumPy twins of the dual kernels
@settings(max_examples=200, deadline=None)
@given(st.integers(0, 2**32 - 1), st.integers(0, 3), st.booleans())
def test_numpy_twins_equal_the_kernels(seed, j, probe):
    """Each dual kernel and its NumPy twin (used while numba is not loaded) give the same
    result and leave the same bitmap, on random columns, buckets, offsets, chunks and
    pre-marked bitmaps (issue 15: BCH [255,231] is then proved without numba)."""
    rng = np.random.default_rng(seed)
    n = int(rng.integers(1, 13))
    r = int(rng.integers(2, 12))
    low_bits = max(1, r - int(rng.integers(0, 3)))
    cols = rng.integers(0, 1 << r, size=n, dtype=np.uint64)
    low = np.uint64((1 << low_bits) - 1)
    hi = np.uint64(((1 << r) - 1) ^ ((1 << low_bits) - 1))
    bucket = np.uint64(int(rng.integers(0, 1 << (r - low_bits))) << low_bits)
    offset = np.uint64(int(rng.integers(0, 1 << r)))
    f_lo = int(rng.integers(0, n + 1))
    f_hi = int(rng.integers(f_lo, n + 2))
    words = max(1, (1 << low_bits) // 64)
    start = np.zeros(words, dtype=np.uint64)
    for s in rng.integers(0, 1 << low_bits, size=int(rng.integers(0, 4))):
        start[int(s) >> 6] |= np.uint64(1) << np.uint64(int(s) & 63)
    fbits = 1 << int(rng.integers(6, 9))
    filt = rng.integers(0, 2**63, size=fbits // 64, dtype=np.uint64)
    K = _dual_kernels
    K.DECLINE_WHEN_LOADED = False  # numba is loaded here: compare anyway
    try:
        _compare_twins(K, rng, cols, j, f_lo, f_hi, hi, bucket, low, start, probe, offset,
                       fbits, filt, r)
    finally:
        K.DECLINE_WHEN_LOADED = True


def _compare_twins(K, rng, cols, j, f_lo, f_hi, hi, bucket, low, start, probe, offset,
                   fbits, filt, r):

    def both(kern, *args, bitmap_pos=None):
        a, b = [list(args), list(args)]
        if bitmap_pos is not None:
            a[bitmap_pos], b[bitmap_pos] = args[bitmap_pos].copy(), args[bitmap_pos].copy()
        got_k = kern.dispatcher(*a)
        got_s = kern.small(*b)
        assert got_s is not None
        if bitmap_pos is not None:
            assert np.array_equal(a[bitmap_pos], b[bitmap_pos])
        return got_k, got_s

    # (the twins hold sums of at most 2 columns, so they serve j <= 3; see the next test)
    k, s = both(K.syndrome_scan, cols, j, f_lo, f_hi, hi, bucket, low, start, probe, offset,
                bitmap_pos=7)
    assert tuple(k) == tuple(s)
    k, s = both(K.filtered_probe, cols, j, f_lo, f_hi, hi, bucket, low, start,
                np.uint64(fbits - 1), filt, offset, bitmap_pos=7)
    assert tuple(k) == tuple(s)
    k, s = both(K.syndrome_unmark, cols, j, hi, bucket, low, start, bitmap_pos=5)
    assert k == s
    k, s = both(K.filter_mark, cols, j, np.uint64(fbits - 1), np.zeros_like(filt),
                bitmap_pos=3)
    assert k == s
    target = np.uint64(int(rng.integers(0, 1 << r)))
    out_k, out_s = np.zeros((2, max(j, 1)), np.int64), np.zeros((2, max(j, 1)), np.int64)
    assert K.subsets_with_sum.dispatcher(cols, j, target, out_k) == \
        K.subsets_with_sum.small(cols, j, target, out_s)
    assert np.array_equal(out_k, out_s)


def test_numpy_twins_decline_deep_or_large_calls(monkeypatch):
    """A call beyond the twins' reach (sums of 3 or more columns held, or past the work
    budget) is declined (None), so the compiled kernel takes it."""
    cols = np.arange(1, 20, dtype=np.uint64)
    bitmap = np.zeros(4, dtype=np.uint64)
    args = (np.uint64(0), np.uint64(0), np.uint64(255), bitmap, True, np.uint64(0))
    monkeypatch.setattr(_dual_kernels, "DECLINE_WHEN_LOADED", False)
    assert _dual_kernels.syndrome_scan.small(cols, 4, 0, 19, *args) is None
    monkeypatch.setattr(_dual_kernels, "_small_left", [10])
    assert _dual_kernels.syndrome_scan.small(cols, 2, 0, 19, *args) is None
    assert _dual_kernels.syndrome_scan.small(cols, 1, 0, 5, *args) is not None
    monkeypatch.setattr(_dual_kernels, "DECLINE_WHEN_LOADED", True)
    import numba  # noqa: F401  (loaded: the compiled kernels are cheap now)
    assert _dual_kernels.syndrome_scan.small(cols, 1, 0, 5, *args) is None


def test_bch_255_231_is_proved_without_numba(tmp_path):
    """In a fresh process, reading BCH [255,231] (designed 7) from a matrix file and
    proving d = 7 goes through the NumPy twins and never imports numba (the reason to
    have them: about 1 s on the 2-core AVX2 machine). The construction itself uses
    galois, which imports numba, so it is built here and written to the file."""
    import subprocess
    import sys

    from gf2codes.formats import write_code

    path = tmp_path / "bch255.txt"
    write_code(families.bch(255, 7), path)
    code = ("import sys\n"
            "from gf2codes.formats import read_code\n"
            "from gf2codes.distance import minimum_distance\n"
            f"r = minimum_distance(read_code({str(path)!r}).code)\n"
            "print(r.d, r.exact, r.argument, 'numba' in sys.modules)\n")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True).stdout.split()
    assert out == ["7", "True", "orbit-columns", "False"]
