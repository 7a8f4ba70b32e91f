"""Tests of gf2codes.bounds and the ``gf2codes bounds`` command.

Every reference value carries its source in a comment. "MS77" is MacWilliams & Sloane,
The Theory of Error-Correcting Codes (1977); "from memory" marks values recalled from its
table of the best codes (MS77 appendix A) rather than re-read. Where a value is an
optimum, the code that attains it is built and its distance computed in the test, so only
the "no better code" half rests on the book.
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from gf2codes import bounds as B
from gf2codes.bounds.formulas import plotkin_size
from gf2codes.bounds.lp import krawtchouk_table
from gf2codes.exceptions import ParameterError

REPO = Path(__file__).resolve().parents[1]


# ------------------------------------------------------------ brute force for small n


def _true_distance(n: int, k: int) -> int:
    """D(n, k) by exhaustive search over systematic generators [I | A].

    Every binary linear code is permutation-equivalent to one with a systematic generator
    matrix, and permutations keep the minimum distance, so the maximum over all A is D(n, k).
    """
    r = n - k
    best = 1
    for bits in range(1 << (k * r)):
        rows = [(1 << (n - 1 - i)) | ((bits >> (i * r)) & ((1 << r) - 1)) for i in range(k)]
        d = n
        for mask in range(1, 1 << k):
            w = 0
            for i in range(k):
                if mask >> i & 1:
                    w ^= rows[i]
            d = min(d, bin(w).count("1"))
            if d <= best:
                break
        best = max(best, d)
    return best


SMALL = [(n, k) for n in range(1, 9) for k in range(1, n + 1) if k * (n - k) <= 16]
TRUE_D = {nk: _true_distance(*nk) for nk in SMALL}  # computed by brute force in this test


def test_brute_force_sanity():
    # computed by brute force in this test; cross-checked with known codes:
    assert TRUE_D[(7, 4)] == 3  # Hamming [7,4,3]
    assert TRUE_D[(8, 4)] == 4  # extended Hamming [8,4,4]
    assert TRUE_D[(6, 3)] == 3  # shortened Hamming [6,3,3], optimal (MS77 app. A, from memory)


@pytest.mark.parametrize("nk", SMALL)
def test_bounds_bracket_the_true_distance(nk):
    n, k = nk
    d = TRUE_D[nk]  # computed by brute force in this test
    assert B.best_upper(n, k).d >= d
    for name, value in B.upper_bounds(n, k).items():
        assert value >= d, name
    for name, value in B.lower_bounds(n, k).items():
        assert value <= d, name


# ---------------------------------------------------------------------- perfect codes


@pytest.mark.parametrize("m", range(2, 8))
def test_hamming_codes_meet_sphere_packing_with_equality(m):
    # Hamming code [2^m - 1, 2^m - 1 - m, 3] is perfect (MS77 ch. 1 §7).
    n, k = 2**m - 1, 2**m - 1 - m
    assert (1 << k) * (1 + n) == 1 << n
    assert B.hamming_bound(n, k) == 3
    assert B.best_upper(n, k).d == 3


def test_golay_meets_sphere_packing_with_equality():
    # binary Golay code [23,12,7] is perfect (MS77 ch. 2 §6 / ch. 20).
    assert (1 << 12) * sum(math.comb(23, i) for i in range(4)) == 1 << 23
    assert B.hamming_bound(23, 12) == 7
    assert B.lp_bound(23, 12) == 7
    assert B.best_upper(23, 12) == B.UpperBound(7, "hamming")


# --------------------------------------------------------------------------- Griesmer


@pytest.mark.parametrize("m", range(2, 9))
def test_simplex_meets_griesmer(m):
    # simplex [2^m - 1, m, 2^(m-1)] meets the Griesmer bound (MS77 ch. 17 §6).
    n, k, d = 2**m - 1, m, 2 ** (m - 1)
    assert sum(-(-d // 2**i) for i in range(k)) == n
    assert B.griesmer_bound(n, k) == d
    assert B.best_upper(n, k).d == d


@pytest.mark.parametrize("m", range(2, 9))
def test_first_order_reed_muller_meets_griesmer(m):
    # RM(1, m) = [2^m, m + 1, 2^(m-1)] meets the Griesmer bound (MS77 ch. 13, ch. 17 §6).
    n, k, d = 2**m, m + 1, 2 ** (m - 1)
    assert sum(-(-d // 2**i) for i in range(k)) == n
    assert B.griesmer_bound(n, k) == d
    assert B.best_upper(n, k).d == d


# --------------------------------------------------------------------------- LP bound

KNOWN_CODES = [
    (24, 12, 8),  # extended Golay (MS77 ch. 2 §6)
    (23, 12, 7),  # Golay
    (7, 4, 3),  # Hamming
    (8, 4, 4),  # extended Hamming = RM(1,3)
    (16, 5, 8),  # RM(1,4)
    (16, 11, 4),  # RM(2,4) = extended Hamming
    (32, 16, 8),  # RM(2,5) (MS77 ch. 13)
    (32, 6, 16),  # RM(1,5)
    (15, 7, 5),  # BCH (MS77 ch. 9)
    (15, 5, 7),  # BCH
    (31, 16, 7),  # BCH / QR (MS77 ch. 9, ch. 16)
    (31, 21, 5),  # BCH
    (63, 51, 5),  # BCH
    (18, 9, 6),  # extended QR [18,9,6] (MS77 ch. 16)
    (72, 64, 4),  # shortened extended Hamming [128,120,4] -> [72,64,4]
]


@pytest.mark.parametrize("n,k,d", KNOWN_CODES)
def test_no_bound_below_a_known_code(n, k, d):
    ub = B.upper_bounds(n, k)
    assert all(value >= d for value in ub.values()), ub
    assert B.best_upper(n, k).d >= d


@pytest.mark.parametrize("n,k,expected", [
    (24, 12, 8),  # d(24,12) = 8, extended Golay is optimal (MS77 app. A, from memory)
    (23, 12, 7),  # d(23,12) = 7 (MS77 app. A, from memory)
    (16, 5, 8),  # d(16,5) = 8, RM(1,4) (MS77 app. A, from memory)
    (72, 64, 4),  # Hamming bound on [71,64] gives 3, so 4 by puncturing; [72,64,4] exists
    (71, 64, 3),  # sphere packing: 1 + 70 > 2^6 rules out [71,64,4] via the punctured code
    (8, 4, 4),  # extended Hamming is optimal (brute force above)
    (32, 6, 16),  # RM(1,5) meets Griesmer
])
def test_best_upper_equals_known_optimum(n, k, expected):
    assert B.best_upper(n, k).d == expected


@pytest.mark.parametrize("build,n,k,d", [
    ("extended_golay", 24, 12, 8), ("golay", 23, 12, 7), ("rm_1_4", 16, 5, 8),
    ("rm_1_5", 32, 6, 16),
])
def test_known_optima_are_attained(build, n, k, d):
    """The codes behind test_best_upper_equals_known_optimum, built and proved here: the
    bound equals the distance of a real code, so it is attained (computed in this test)."""
    from gf2codes import families as F
    from gf2codes.distance import minimum_distance

    code = {"extended_golay": F.extended_golay, "golay": F.golay,
            "rm_1_4": lambda: F.reed_muller(1, 4), "rm_1_5": lambda: F.reed_muller(1, 5)}[build]()
    assert (code.n, code.k, minimum_distance(code).d) == (n, k, d)
    assert B.best_upper(n, k).d == d


def test_best_upper_15_7_is_tight_by_a_linear_code_rule():
    # d(15,7) = 5 for linear codes (BCH [15,7,5] optimal; MS77 app. A, from memory), but a
    # nonlinear (15, 128, 6) code exists (shortened Nordstrom-Robinson, MS77 ch. 2 §8), so
    # no bound that also holds for nonlinear codes (LP, Hamming, Elias) can reach 5, and
    # Griesmer allows 6 (6+3+2+1+1+1+1 = 15). The table's residual-code rule, which holds
    # for linear codes only, closes the gap (checked by hand: a [15,7,6] code would give a
    # [9,6,3] residual code, and the Hamming bound allows only d <= 2 at [9,6]).
    assert B.lp_bound(15, 7) == 6
    assert B.best_upper(15, 7).d == 5


def test_lp_and_hamming_beat_griesmer_at_31_16():
    # checked by hand: d = 9 needs V(31, 4) = 36457 <= 2^15 = 32768, false (Hamming rules
    # it out); d = 8 needs, for the punctured [30,16,7], V(30, 3) = 4526 <= 2^14, true.
    # Griesmer allows 9: 9 + 5 + 3 + 2 + 1 * 12 = 31.
    ub = B.upper_bounds(31, 16)
    assert ub["lp"] == 8 and ub["griesmer"] == 9


def test_krawtchouk_exact():
    # definition K_j(i) = sum_s (-1)^s C(i, s) C(n-i, j-s) (MS77 ch. 5 §7)
    for n in (1, 2, 7, 24, 25):
        K = krawtchouk_table(n)
        for j in range(n // 2 + 1):
            for i in range(0, n + 1, 2):
                ref = sum((-1) ** s * math.comb(i, s) * math.comb(n - i, j - s)
                          for s in range(j + 1))
                assert K[j][i] == ref


# ------------------------------------------------------------ lengths and dimensions


@pytest.mark.parametrize("k,d,n,why", [
    (12, 8, 24, "hamming"),  # [23,12,8] ruled out by sphere packing; Golay [24,12,8] exists
    (64, 4, 72, "hamming"),  # [71,64,4]: punctured [70,64,3] needs 1 + 70 <= 64, false
    (5, 8, 16, "griesmer"),  # Griesmer: 8 + 4 + 2 + 1 + 1 = 16; RM(1,4) attains it
    (4, 3, 7, "hamming"),  # Hamming [7,4,3]
])
def test_least_length(k, d, n, why):
    lb = B.least_length(k, d)
    assert lb.n == n
    assert why in B.ruling_out(n - 1, k, d)
    assert B.best_upper(n - 1, k).d < d


def test_least_length_12_8_forced_by():
    assert B.ruling_out(23, 12, 8) == ["hamming", "lp"]  # computed; Griesmer allows 23


def test_max_dimension():
    assert B.max_dimension(24, 8).k == 12  # Golay (MS77 app. A, from memory)
    assert B.max_dimension(23, 7).k == 12  # Golay
    assert B.max_dimension(7, 3).k == 4  # Hamming
    assert B.max_dimension(10, 10).k == 1  # repetition code only
    assert B.max_dimension(72, 4).k == 64  # see test_least_length


def test_existence_bounds_values():
    # computed by hand in this test: V(23, 3) = 2048 < 2^12 = 2^(24-12) -> Varshamov gives 5
    assert B.varshamov(24, 12) == 5
    # V(24, 3) = 2325 < 2^13 and V(24, 4) = 12951 >= 2^13 -> Gilbert-Varshamov gives 4
    assert B.gilbert_varshamov(24, 12) == 4
    ex = B.existence_length(12, 8)
    assert ex.n >= 24 and B.lower_bounds(ex.n, 12)[ex.by] >= 8
    assert B.lower_bounds(ex.n - 1, 12)["varshamov"] < 8
    assert B.existence_dimension(24, 8).k <= B.max_dimension(24, 8).k


# ------------------------------------------------------------------------ Plotkin range


def test_plotkin_range_of_validity():
    for d in range(1, 30):
        top = 2 * d if d % 2 == 0 else 2 * d + 1
        for n in range(1, 70):
            size = plotkin_size(n, d)
            assert (size is None) == (n < d or n > top), (n, d)
    # A(8,4) = 16, A(11,6) = 12, A(16,8) = 32: Plotkin is attained by Hadamard-type codes
    # (MS77 ch. 2 §3, table of A(n,d) in MS77 app. A; from memory)
    assert plotkin_size(8, 4) == 16
    assert plotkin_size(11, 6) == 12
    assert plotkin_size(16, 8) == 32
    # beyond 2d the bound exists through shortening and stays valid:
    assert B.plotkin_bound(32, 6) >= 16  # RM(1,5)
    assert B.plotkin_bound(72, 64) >= 4


# ------------------------------------------------------------------------- properties


@settings(max_examples=40, deadline=None)
@given(st.integers(1, 59).flatmap(lambda n: st.tuples(st.just(n), st.integers(1, n))))
def test_properties(nk):
    n, k = nk
    ub = B.upper_bounds(n, k)
    lb = B.lower_bounds(n, k)
    best = B.best_upper(n, k)
    assert min(ub.values()) >= max(lb.values())
    assert all(best.d <= v for v in ub.values())
    assert best.d >= max(lb.values())
    if k < n:
        assert best.d >= B.best_upper(n, k + 1).d
    assert B.best_upper(n + 1, k).d >= best.d


def test_table_is_monotone_up_to_40():
    for n in range(1, 41):
        for k in range(1, n + 1):
            d = B.best_upper(n, k).d
            if k < n:
                assert d >= B.best_upper(n, k + 1).d
            assert B.best_upper(n + 1, k).d >= d


# ------------------------------------------------------------------------- validation


@pytest.mark.parametrize("func", [B.singleton_bound, B.hamming_bound, B.plotkin_bound,
                                  B.griesmer_bound, B.elias_bound, B.lp_bound, B.best_upper,
                                  B.upper_bounds, B.lower_bounds, B.gilbert_varshamov,
                                  B.varshamov])
def test_bad_nk(func):
    with pytest.raises(ParameterError, match=r"Argument 'k' must be at most 5, not 7\."):
        func(5, 7)
    with pytest.raises(ParameterError, match=r"Argument 'k' must be at least 1, not 0\."):
        func(5, 0)
    with pytest.raises(ParameterError, match=r"Argument 'n' must be at least 1, not 0\."):
        func(0, 1)
    with pytest.raises(ParameterError, match=r"Argument 'n' must be an integer, not 5\.0\."):
        func(5.0, 1)
    with pytest.raises(ParameterError, match=r"Argument 'k' must be an integer, not True\."):
        func(5, True)
    with pytest.raises(ParameterError, match=r"Argument 'n' must be an integer, not '5'\."):
        func("5", 1)


def test_bad_d():
    with pytest.raises(ParameterError, match=r"Argument 'd' must be at least 1, not 0\."):
        B.least_length(3, 0)
    with pytest.raises(ParameterError, match=r"Argument 'd' must be at most 5, not 6\."):
        B.max_dimension(5, 6)
    with pytest.raises(ParameterError, match=r"Argument 'd' must be at most 5, not 6\."):
        B.existence_dimension(5, 6)
    with pytest.raises(ParameterError, match=r"Argument 'k' must be an integer, not 1\.5\."):
        B.existence_length(1.5, 2)


def test_public_surface():
    for name in B.__all__:
        assert hasattr(B, name), name
    assert set(B.upper_bounds(10, 3)) == {"singleton", "hamming", "plotkin", "griesmer",
                                          "elias", "lp"}
    assert set(B.lower_bounds(10, 3)) == {"gilbert_varshamov", "varshamov"}


# ------------------------------------------- absurd sizes answer at once (issue 14)


def test_regression_bounds_n100000_k50000_answers_with_formula_bounds():
    # used to hang (binomial sums over every d); now formula bounds at the point only.
    # Griesmer checked by hand: sum_{i<50000} ceil(25004 / 2^i) <= 100000 < that for 25005.
    ub = B.upper_bounds(100000, 50000)
    assert set(ub) == {"singleton", "griesmer", "plotkin"}
    assert B.best_upper(100000, 50000) == B.UpperBound(ub["griesmer"], "griesmer")
    assert sum(-(-ub["griesmer"] // (1 << i)) for i in range(50000)) <= 100000
    assert sum(-(-(ub["griesmer"] + 1) // (1 << i)) for i in range(50000)) > 100000
    assert {"lp", "hamming", "elias", "table"} <= set(B.skipped_bounds(100000))
    assert B.lower_bounds(100000, 50000) == {}


def test_regression_bounds_k12_d100000_answers_with_formula_bounds():
    # used to hang scanning n upwards; Griesmer length sum_{i<12} ceil(100000 / 2^i)
    lb = B.least_length(12, 100000)
    assert lb.n == sum(-(-100000 // (1 << i)) for i in range(12))
    assert B.existence_length(12, 100000) == B.LengthBound(1200000, "repetition blocks")


def test_table_bounds_never_below_brute_force():
    # every cell n <= 17 with k (n - k) <= 16 against D(n, k) by brute force
    from gf2codes._reference import brute_best_distance_systematic

    for n in range(2, 18):
        for k in range(1, n + 1):
            if k * (n - k) <= 16 and k + k * (n - k) <= 22:
                assert B.best_upper(n, k).d >= brute_best_distance_systematic(n, k), (n, k)


def test_no_bound_below_a_code_in_the_catalog(tmp_path):
    # every bound, every cell n <= 32, against the shipped catalog's proved codes
    from gf2codes.catalog import open_catalog

    with open_catalog(tmp_path / "c.db") as cat:
        rows = cat.distance_table(range(1, 33))
    for row in rows:
        n, k, d = row["n"], row["k"], row["d"]
        if d == 0:
            continue
        assert B.best_upper(n, k).d >= d, (n, k)
        for name, value in B.upper_bounds(n, k).items():
            assert value >= d, (n, k, name)
        assert B.least_length(k, d).n <= n and B.max_dimension(n, d).k >= k


def test_bound_chain_names_rule_and_source_cell():
    chain = B.bound_chain(16, 8)
    assert chain[0].startswith("[16,8] d <= 5: ")
    assert any("exhaustive search" in step or "residual" in step for step in chain)
    assert all(" d <= " in step for step in chain)


def test_residual_rule_by_hand():
    # [13,6,5] would have a [8,5,3] residual code; Hamming: 2^5 (1 + 8) > 2^8, so d(8,5) <= 2
    assert B.best_upper(13, 6).d == 4
