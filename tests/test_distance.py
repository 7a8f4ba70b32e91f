"""Minimum distance: both exact engines against brute force, target tests,
time-limited intervals and the information-set-decoding upper bound."""

from __future__ import annotations

import functools
import itertools

import galois
import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from gf2codes import _kernels, linalg
from gf2codes._reference import brute_distance
from gf2codes.code import Code
from gf2codes.distance import (
    distance_upper_bound,
    estimate_work,
    has_distance_at_least,
    minimum_distance,
    quick_distance,
)
from gf2codes.exceptions import ParameterError, TooExpensiveError

from helpers import cyclic_generator, random_code_matrix

ENGINES = ("gray", "brouwer-zimmermann")
ALL_WAYS = [dict(method="gray"), dict(method="brouwer-zimmermann"),
            dict(method="brouwer-zimmermann", workers=2)]


#: Designed distances of the narrow-sense BCH codes of length 127 used here.
_BCH127 = {64: 21, 71: 19}


@functools.cache
def bch(n: int, k: int) -> Code:
    """A BCH code from galois, the reference library (built once per test session).

    At length 127 galois takes about 12 s to build one, so the package's own family is
    used there; tests/test_families.py checks it against galois at [127, 64].
    """
    if n == 127:
        from gf2codes.families import bch as own_bch

        code = own_bch(127, _BCH127[k])
        assert code.k == k
        return code
    return Code(np.asarray(galois.BCH(n, k).G).astype(np.uint8))


def _random_code(seed: int, n_max: int = 40, k_max: int = 14) -> Code:
    rng = np.random.default_rng(seed)
    n = int(rng.integers(2, n_max + 1))
    k = int(rng.integers(1, min(n, k_max) + 1))
    M = random_code_matrix(rng, n, k, density=float(rng.uniform(0.15, 0.7)))
    assume(M.any())
    return Code(M)


def _check(C: Code, r, d: int) -> None:
    assert r.exact and r.d == d == r.lower == r.upper
    assert r.witness.sum() == d and C.contains(r.witness)


@given(st.integers(0, 2**32 - 1))
def test_both_engines_equal_brute_force(seed):
    C = _random_code(seed)
    d = brute_distance(C.G)
    for way in ALL_WAYS:
        _check(C, minimum_distance(C, **way), d)


@settings(max_examples=30)
@given(st.integers(0, 2**32 - 1))
def test_engines_agree_beyond_brute_force(seed):
    # k from 21 to 28: the split enumeration has a head of at least one row and
    # tabulated tails; Gray-code enumeration is the independent check.
    rng = np.random.default_rng(seed)
    n = int(rng.integers(40, 140))
    k = int(rng.integers(21, 29))
    C = Code(random_code_matrix(rng, n, k, density=float(rng.uniform(0.1, 0.5))))
    assume(C.k > 20)
    g = minimum_distance(C, method="gray", max_work=None)
    for way in ALL_WAYS[1:]:
        _check(C, minimum_distance(C, max_work=None, **way), g.d)


@given(st.integers(0, 2**32 - 1))
def test_invariant_under_row_operations_and_column_permutations(seed):
    C = _random_code(seed, n_max=50, k_max=16)
    rng = np.random.default_rng(seed + 1)
    d = minimum_distance(C).d
    perm = rng.permutation(C.n)
    permuted = Code(C.G[:, perm])
    mixed = Code(np.vstack([C.G[::-1], C.G[0] ^ C.G[-1]]))
    for other in (permuted, mixed):
        for engine in ENGINES:
            assert minimum_distance(other, method=engine).d == d


@given(st.integers(0, 2**32 - 1), st.integers(1, 12))
def test_target_test_agrees_with_distance(seed, target):
    C = _random_code(seed)
    d = brute_distance(C.G)
    for way in ALL_WAYS:
        r = minimum_distance(C, target=target, **way)
        assert r.at_least(target) == (d >= target)
        assert r.lower <= d <= r.upper and C.contains(r.witness)
        assert r.witness.sum() == r.upper
    assert has_distance_at_least(C, target) == (d >= target)


@given(st.integers(0, 2**32 - 1))
def test_gray_engine_stopping_early_never_claims_completeness(seed):
    # Regression test: a target run that stops at the first light codeword inside the
    # last block must not report the whole code as enumerated (that would turn the
    # weight of an arbitrary light codeword into a "proved" d).
    from gf2codes.distance._gray import gray_search as _gray_search
    from gf2codes.distance._result import Best as _Best
    from gf2codes.distance._result import ProofClock as _Clock

    C = _random_code(seed)
    d = brute_distance(C.G)
    best = _Best(C.n)
    complete = _gray_search(C, _Clock(None, None), best, stop_at=C.n)
    assert not complete and d <= best.weight
    r = minimum_distance(C, method="gray", target=C.n + 1)
    assert r.lower <= d <= r.upper and r.at_least(C.n + 1) is False


def test_interrupt_keeps_the_proved_interval():
    C = bch(127, 64)

    def interrupt(done, total, info):
        if done > 2 * 10**7:
            raise KeyboardInterrupt

    r = minimum_distance(C, progress=interrupt, max_work=None)
    # BCH [127,64] has d = 21 (MacWilliams & Sloane, appendix A, from memory; proved by
    # scripts/bench_distance.py).
    assert r.stopped == "interrupted" and not r.exact
    assert 1 < r.lower <= 21 <= r.upper and C.contains(r.witness)


def test_published_values(golay23, golay24, hamming74):
    # [7,4,3] Hamming, [23,12,7] and [24,12,8] Golay: MacWilliams & Sloane (1977),
    # ch. 1 section 2 and ch. 2 section 6.
    for code, d in ((hamming74, 3), (golay23, 7), (golay24, 8)):
        for engine in ENGINES:
            _check(code, minimum_distance(code, method=engine), d)


@pytest.mark.parametrize("n, k, d", [
    # True minimum distances of narrow-sense BCH codes: MacWilliams & Sloane (1977),
    # appendix A, fig. A.1 (from memory; for these codes the true d equals the designed
    # distance, which galois also reports).
    (31, 16, 7), (31, 11, 11), (63, 45, 7), (63, 36, 11), (63, 30, 13),
])
def test_bch_codes_from_galois(n, k, d):
    C = bch(n, k)
    for workers in (1, 2):
        _check(C, minimum_distance(C, method="brouwer-zimmermann", workers=workers), d)


def test_reed_muller_2_6():
    # RM(2,6) is a [64,22,16] code (MacWilliams & Sloane, ch. 13, from memory); built here
    # from evaluations of the monomials of degree <= 2 in 6 variables.
    pts = np.array(list(itertools.product((0, 1), repeat=6)), dtype=np.uint8)
    rows = [np.ones(64, dtype=np.uint8)] + [pts[:, i] for i in range(6)]
    rows += [pts[:, i] & pts[:, j] for i, j in itertools.combinations(range(6), 2)]
    C = Code(np.array(rows))
    assert C.k == 22
    _check(C, minimum_distance(C), 16)


def test_quadratic_residue_47():
    # QR code of length 47: [47,24,11] (MacWilliams & Sloane, ch. 16, fig. 16.2,
    # from memory). g(x) is the product of the x - a^i over the quadratic residues i,
    # a a primitive 47th root of unity in GF(2^23): computed here with galois.
    F = galois.GF(2**23)
    a = F.primitive_element ** ((2**23 - 1) // 47)
    residues = sorted({(i * i) % 47 for i in range(1, 47)})
    g = galois.Poly([1], field=F)
    for i in residues:
        g *= galois.Poly([1, a**i], field=F)
    bits = "".join(str(int(c)) for c in g.coeffs)
    C = Code(cyclic_generator(47, bits))
    assert (C.n, C.k) == (47, 24)
    _check(C, minimum_distance(C), 11)


def test_time_limit_gives_a_valid_interval():
    # BCH [127,64] has d = 21 (MacWilliams & Sloane, appendix A, from memory; proved by
    # scripts/bench_distance.py); half a second
    # cannot prove it, so an interval that contains 21 must come back.
    C = bch(127, 64)
    r = minimum_distance(C, time_limit=0.5)
    assert not r.exact and r.d is None and r.stopped == "time limit"
    assert r.lower <= 21 <= r.upper
    assert r.witness.sum() == r.upper and C.contains(r.witness)
    assert "not proved" in r.describe()


def test_too_expensive_without_time_limit():
    C = bch(127, 71)
    with pytest.raises(TooExpensiveError, match="codewords") as info:
        minimum_distance(C, use_symmetry=False)
    assert info.value.work > 1e12
    # the cyclic shifts bring it down to about 5e11 codewords, which the estimate knows
    with pytest.raises(TooExpensiveError, match="codewords") as info:
        minimum_distance(C, max_work=10**11)
    assert 1e11 < info.value.work < 1e12


def test_progress_callback_is_called():
    C = bch(63, 30)
    seen = []
    minimum_distance(C, progress=lambda done, total, info: seen.append((done, total, info)))
    # a fast proof may finish before the first report; a slow one must report sanely
    for done, total, info in seen:
        assert 0 < done <= total and info["lower"] <= info["upper"]


@given(st.integers(0, 2**32 - 1))
def test_isd_is_an_upper_bound(seed):
    C = _random_code(seed, n_max=60, k_max=16)
    d = minimum_distance(C).d
    r = distance_upper_bound(C, iterations=20, seed=seed)
    assert r.upper >= d and r.witness.sum() == r.upper and C.contains(r.witness)
    assert r.exact == (r.lower == r.upper)
    q = quick_distance(C, time_limit=0.2, seed=seed)
    assert q.lower <= d <= q.upper


def test_isd_finds_light_words_of_a_large_code():
    # An upper bound only, and labelled so.
    C = bch(127, 64)
    r = distance_upper_bound(C, time_limit=0.5, seed=1)
    assert not r.exact and r.stopped == "upper bound only"
    # BCH [127,64] has d = 21 (MacWilliams & Sloane, appendix A, from memory; proved by
    # scripts/bench_distance.py): no codeword is lighter,
    # and a few hundred information sets find one of weight 21 (observed, seed 1).
    assert r.upper >= 21 and r.witness.sum() == r.upper


def test_seeded_results_repeat():
    C = bch(127, 64)
    a = distance_upper_bound(C, iterations=30, seed=7)
    b = distance_upper_bound(C, iterations=30, seed=7)
    assert a.upper == b.upper and np.array_equal(a.witness, b.witness)


def test_global_random_state_untouched():
    state = np.random.get_state()[1].copy()
    C = bch(63, 36)
    distance_upper_bound(C, iterations=5, seed=None)
    minimum_distance(C)
    assert np.array_equal(np.random.get_state()[1], state)


def test_estimate_work_matches_theory():
    # [24,12] extended Golay: two disjoint information sets of rank 12 give a lower
    # bound 2(w+1) after level w, rounded up to a multiple of 4 (doubly even): d = 8
    # is proved after level 2 of the first matrix (3 + 2 + ... counted below).
    from helpers import cyclic_generator as cg

    G = cg(23, "101011100011")
    C = Code(np.hstack([G, G.sum(axis=1, keepdims=True) % 2]).astype(np.uint8))
    assert estimate_work(C, 8) <= sum(2 * (12 if w == 1 else 66) for w in (1, 2)) + 220 * 2


def test_bad_arguments(hamming74):
    with pytest.raises(ParameterError, match="'time_limit' must be positive"):
        minimum_distance(hamming74, time_limit=0)
    with pytest.raises(ParameterError, match="'target' must be at least 1"):
        minimum_distance(hamming74, target=0)
    with pytest.raises(ParameterError, match="'method' must be one of"):
        minimum_distance(hamming74, method="guess")
    with pytest.raises(ParameterError, match="must be a Code"):
        minimum_distance([[1, 0]])


# ----------------------------------------------------- kernels against plain Python
@given(st.integers(0, 2**32 - 1), st.integers(1, 5))
def test_combination_kernel_against_python(seed, w):
    rng = np.random.default_rng(seed)
    k, n = int(rng.integers(w, 12)), int(rng.integers(1, 140))
    rows = linalg.pack(random_code_matrix(rng, n, k))
    expect = min(int(sum(bin(int(x)).count("1")
                         for x in np.bitwise_xor.reduce(rows[list(c)], axis=0)))
                 for c in itertools.combinations(range(k), w))
    combo = np.zeros(w, dtype=np.int64)
    state = np.arange(w, dtype=np.int64)
    visited, best, finished = _kernels.combination_min_weight(
        np.ascontiguousarray(rows.T), w, state, 1 << 60, -1, combo,
        np.zeros(rows.shape[1], dtype=np.uint64))
    assert finished and best == expect
    assert visited == len(list(itertools.combinations(range(k), w)))
    word = np.bitwise_xor.reduce(rows[combo], axis=0)
    assert sum(bin(int(x)).count("1") for x in word) == expect


@given(st.integers(0, 2**32 - 1), st.integers(0, 6))
def test_subset_sums_against_itertools(seed, w):
    rng = np.random.default_rng(seed)
    b = int(rng.integers(max(w, 1), 10))
    rows = linalg.pack(random_code_matrix(rng, 70, b))
    sums, subsets = _kernels.subset_sums(rows, w)
    combos = list(itertools.combinations(range(b), w))
    assert sums.shape[0] == len(combos)
    for t, c in enumerate(combos):
        assert tuple(subsets[t, :w]) == c
        expect = np.bitwise_xor.reduce(rows[list(c)], axis=0) if c else np.zeros(2, np.uint64)
        assert np.array_equal(sums[t], expect)


def test_popcount_kernel():
    for x in (0, 1, 2**63, 2**64 - 1, 0x5555_5555_5555_5555):
        assert _kernels.popcount64(np.uint64(x)) == bin(x).count("1")
    assert _kernels.ctz64(np.uint64(8)) == 3


def test_time_limit_is_read_between_small_tasks(monkeypatch):
    # Regression: a level of many small tasks, each done in one kernel chunk, never read
    # the clock and ran to its end past the limit. Here the clock expires as soon as any
    # codeword has been counted, so the enumeration must stop after the chunk that
    # counted it (no wall-clock assertion: the count of codewords decides).
    from gf2codes.distance._result import CHUNK, ProofClock

    monkeypatch.setattr(ProofClock, "expired", lambda self: self.done > 0)
    rng = np.random.default_rng(12)
    G = np.hstack([np.eye(60, dtype=np.uint8), rng.integers(0, 2, (60, 140))])
    r = minimum_distance(Code(G), time_limit=0.4, workers=1)
    assert not r.exact and r.method == "brouwer-zimmermann"
    assert r.codewords <= 2 * CHUNK  # before the fix: a whole level, 1.4e9 here
