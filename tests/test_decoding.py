"""Tests of gf2codes.decoding and its kernels (the ``channel`` command: test_cli_channel.py)."""

from __future__ import annotations

import itertools
import math
from fractions import Fraction
from pathlib import Path

import numpy as np
import pytest

from gf2codes import _decoding_kernels as dk
from gf2codes import decoding as D
from gf2codes.code import Code
from gf2codes.decoding.leaders import syndrome_columns
from gf2codes.exceptions import ParameterError, TooExpensiveError
from gf2codes.families import reed_muller, repetition

ROOT = Path(__file__).resolve().parents[1]


def brute_force_leaders(code: Code) -> list[int]:
    """Coset-leader weights by listing every word of GF(2)^n (computed by brute force
    in this test)."""
    n = code.n
    H = code.H.astype(np.int64)
    best: dict[bytes, int] = {}
    for bits in itertools.product((0, 1), repeat=n):
        s = (H @ np.array(bits)) & 1
        key = s.tobytes()
        w = sum(bits)
        if key not in best or w < best[key]:
            best[key] = w
    counts = [0] * (max(best.values()) + 1)
    for w in best.values():
        counts[w] += 1
    return counts


# ------------------------------------------------------------------ coset leaders


def test_hamming_is_perfect(hamming74):
    assert D.coset_leader_distribution(hamming74).counts == (1, 7)


def test_extended_golay_coset_leaders(golay24):
    # alpha = 1, 24, 276, 2024, 1771: MacWilliams & Sloane (1977), ch. 2 section 6 and
    # ch. 20 (from memory); it is also forced: C(24, i) for i <= 3, then 4096 - 2577.
    leaders = D.coset_leader_distribution(golay24)
    assert leaders.counts == (1, 24, 276, 2024, 1771)
    assert leaders.covering_radius == 4 == D.covering_radius(golay24)


def test_golay23_is_perfect(golay23):
    # the [23,12,7] Golay code is perfect: all C(23, i), i <= 3 (M&S ch. 1 section 5).
    assert D.coset_leader_distribution(golay23).counts == tuple(
        math.comb(23, i) for i in range(4))


@pytest.mark.parametrize("seed", range(6))
def test_leaders_match_brute_force_and_twin(seed):
    rng = np.random.default_rng(seed)
    n, k = int(rng.integers(4, 12)), None
    k = int(rng.integers(1, n))
    code = Code((rng.random((k, n)) < 0.5).astype(np.uint8) | np.eye(k, n, dtype=np.uint8))
    r = code.n - code.k
    expected = brute_force_leaders(code)
    assert list(D.coset_leader_distribution(code).counts) == expected
    cols = syndrome_columns(code)
    lev_a = np.empty(1 << r, np.uint8)
    lev_b = np.empty(1 << r, np.uint8)
    par_a = np.empty(1 << r, np.int32)
    par_b = np.empty(1 << r, np.int32)
    ca = dk.coset_levels(cols, np.int64(r), lev_a, par_a)
    cb = dk.coset_levels_py(cols, r, lev_b, par_b)
    assert np.array_equal(ca, cb) and np.array_equal(lev_a, lev_b)
    # the parent pointers may differ in order of discovery only through ties; both
    # must lead one level down
    for par, lev in ((par_a, lev_a), (par_b, lev_b)):
        for s in range(1, 1 << r):
            assert lev[s ^ int(cols[par[s]])] == lev[s] - 1


def test_redundancy_limit_message():
    code = reed_muller(1, 5)  # n - k = 26
    with pytest.raises(TooExpensiveError, match=r"2\^26 .*n - k = 26 > 20.*simulat"):
        D.coset_leader_distribution(code, max_redundancy=20)


# --------------------------------------------------------------- exact formulas


def test_repetition_majority():
    # majority decoding of the 3-bit repetition code fails with probability 3p^2 - 2p^3:
    # a fact of the trade (common practice, no source beyond that).
    for p in (Fraction(1, 10), Fraction(1, 3), Fraction(1, 1000)):
        pt = D.bsc_performance(repetition(3), [p])[0]
        assert pt.block_error == 3 * p**2 - 2 * p**3
        assert pt.bounded_distance_failure == 3 * p**2 - 2 * p**3
        assert pt.undetected_error == p**3


def test_hamming_closed_form(hamming74):
    # complete decoding of [7,4] Hamming fails with 1 - (1-p)^7 - 7p(1-p)^6 (perfect code;
    # MacWilliams & Sloane ch. 1 section 5); undetected: A = 1,0,0,7,7,0,0,1.
    for p in (Fraction(1, 100), Fraction(1, 7), Fraction(1, 2)):
        q = 1 - p
        pt = D.bsc_performance(hamming74, [p])[0]
        assert pt.block_error == 1 - q**7 - 7 * p * q**6
        assert pt.undetected_error == 7 * p**3 * q**4 + 7 * p**4 * q**3 + p**7
    for p in (1e-3, 0.05, 0.3):
        pt = D.bsc_performance(hamming74, [p])[0]
        assert pt.block_error == pytest.approx(1 - (1 - p)**7 - 7 * p * (1 - p)**6, rel=1e-12)


def test_golay_closed_form(golay24):
    # complete decoding of the extended Golay code is right on the coset leaders:
    # P = 1 - sum_{i<=3} C(24,i) p^i q^(24-i) - 1771 p^4 q^20 (alpha as above).
    p = Fraction(1, 50)
    q = 1 - p
    exact = 1 - sum(math.comb(24, i) * p**i * q**(24 - i) for i in range(4)) - 1771 * p**4 * q**20
    pt = D.bsc_performance(golay24, [p])[0]
    assert pt.block_error == exact
    assert pt.bounded_distance_failure == 1 - sum(
        math.comb(24, i) * p**i * q**(24 - i) for i in range(4))
    assert D.bsc_performance(golay24, [float(p)])[0].block_error == pytest.approx(
        float(exact), rel=1e-12)


def test_tiny_p_keeps_relative_precision(hamming74):
    # the closed form 1 - (1-p)^7 - 7p(1-p)^6 cancels catastrophically at p = 1e-9; the
    # complement sum must agree with the exact rational value to 12 digits.
    for p in (1e-9, 1e-15, 1e-100):
        exact = D.block_error_probability(D.coset_leader_distribution(hamming74),
                                          Fraction(p))
        approx = D.bsc_performance(hamming74, [p])[0].block_error
        assert approx == pytest.approx(float(exact), rel=1e-12)
        assert approx > 0


def test_endpoints(golay24):
    p0, p1 = D.bsc_performance(golay24, [0.0, 1.0])
    assert (p0.block_error, p0.undetected_error, p0.bounded_distance_failure) == (0, 0, 0)
    # p = 1 flips every bit: the all-ones word is a codeword, so the error is undetected
    assert p1.undetected_error == 1.0 and p1.bounded_distance_failure == 1.0


@pytest.mark.parametrize("bad", [2, -0.1, float("nan"), "x", True])
def test_bad_p(hamming74, bad):
    with pytest.raises(ParameterError, match="Argument 'p' must be"):
        D.bsc_performance(hamming74, [bad])


def test_bad_p_message():
    with pytest.raises(ParameterError, match=r"^Argument 'p' must be between 0 and 1, not 2\.$"):
        D.check_probability("p", 2)


# ------------------------------------------------------------------ simulation


@pytest.mark.parametrize("code_name, p", [("hamming", 0.05), ("hamming", 0.2),
                                           ("golay", 0.06), ("golay", 0.12)])
def test_simulation_agrees_with_exact(hamming74, golay24, code_name, p):
    code = hamming74 if code_name == "hamming" else golay24
    d = 3 if code_name == "hamming" else 8
    exact = D.bsc_performance(code, [p])[0]
    sim = D.simulate_bsc(code, p, 20000, seed=11, d=d)
    assert sim.block_error.contains(exact.block_error)
    assert sim.bounded_distance_failure.contains(exact.bounded_distance_failure)
    assert sim.undetected_error.contains(exact.undetected_error)
    assert sim.block_error.confidence == 0.99 and sim.trials == 20000


def test_information_set_decoder_agrees_with_exact(golay24):
    # the information-set decoder finds every error of weight <= 2 and most others; on
    # the extended Golay code its block error must match complete decoding closely.
    p = 0.08
    exact = D.bsc_performance(golay24, [p])[0].block_error
    sim = D.simulate_bsc(golay24, p, 20000, seed=5, decoder="information-set", d=8)
    assert sim.block_error.contains(exact)
    assert "information-set" in sim.decoder


def test_information_set_decoder_corrects_up_to_order(golay24):
    rng = np.random.default_rng(3)
    dec = D.InformationSetDecoder(golay24, information_sets=1, order=2, seed=rng)
    errs = []
    for w in (1, 2):
        for pos in itertools.combinations(range(24), w):
            e = np.zeros(24, np.uint8)
            e[list(pos)] = 1
            errs.append(e)
    E = np.array(errs)
    msgs = rng.integers(0, 2, (E.shape[0], 12))
    Y = golay24.encode(msgs) ^ E
    assert np.array_equal(dec.decode(Y), golay24.encode(msgs))


def test_info_set_kernel_twin():
    rng = np.random.default_rng(8)
    base = rng.integers(0, 2**63, (20, 2), dtype=np.uint64)
    rows = rng.integers(0, 2**63, (9, 2), dtype=np.uint64)
    for order in (0, 1, 2):
        wa = np.full(20, 10**9, np.int64)
        wb = wa.copy()
        fa = np.full((20, 2), -1, np.int64)
        fb = fa.copy()
        dk.info_set_search(base, rows, np.int64(order), wa, fa)
        dk.info_set_search_py(base, rows, order, wb, fb)
        assert np.array_equal(wa, wb) and np.array_equal(fa, fb)


def test_syndrome_decoder_returns_nearest(hamming74):
    dec = D.SyndromeDecoder(hamming74)
    words = np.array(list(itertools.product((0, 1), repeat=7)), dtype=np.uint8)
    out = dec.decode(words)
    assert hamming74.contains(out).all()
    assert ((out ^ words).sum(axis=1) <= 1).all()


def test_simulation_is_seeded_and_leaves_global_state(golay24):
    state = np.random.get_state()[1].copy()
    a = D.simulate_bsc(golay24, 0.1, 3000, seed=42)
    b = D.simulate_bsc(golay24, 0.1, 3000, seed=42)
    assert a.block_error == b.block_error and a.undetected_error == b.undetected_error
    assert np.array_equal(state, np.random.get_state()[1])


def test_intervals():
    # Clopper-Pearson upper limit with no events: 1 - (alpha/2)^(1/n) (exact formula).
    lo, hi = D.clopper_pearson_interval(0, 1000, 0.99)
    assert lo == 0 and hi == pytest.approx(1 - 0.005 ** (1 / 1000), rel=1e-9)
    lo, hi = D.wilson_interval(10, 100, 0.95)
    assert lo < 0.1 < hi
    with pytest.raises(ParameterError, match="confidence"):
        D.wilson_interval(1, 10, 1.5)
    with pytest.raises(ParameterError, match="trials"):
        D.simulate_bsc(repetition(3), 0.1, 0)
