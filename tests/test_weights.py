"""Weight distributions and the MacWilliams identities."""

from __future__ import annotations

import json
import math
from pathlib import Path

import numpy as np
import pytest
from hypothesis import assume, given
from hypothesis import strategies as st

from gf2codes._reference import brute_weight_distribution
from gf2codes.code import Code
from gf2codes.exceptions import ParameterError, TooExpensiveError
from gf2codes.weights import (
    dual_distance,
    krawtchouk,
    macwilliams_transform,
    weight_distribution,
)

from helpers import random_code_matrix

REFERENCE = json.loads((Path(__file__).parent / "reference" / "weight_distributions.json")
                       .read_text())


def _random_code(seed: int) -> Code:
    rng = np.random.default_rng(seed)
    n = int(rng.integers(1, 17))
    k = int(rng.integers(1, n + 1))
    M = random_code_matrix(rng, n, k, density=float(rng.uniform(0.1, 0.8)))
    assume(M.any())
    return Code(M)


@given(st.integers(0, 2**32 - 1))
def test_equals_brute_force(seed):
    C = _random_code(seed)
    assert weight_distribution(C) == brute_weight_distribution(C.G)


@given(st.integers(0, 2**32 - 1))
def test_macwilliams_identity_between_code_and_dual(seed):
    C = _random_code(seed)
    assume(C.k < C.n)
    A = brute_weight_distribution(C.G)
    B = brute_weight_distribution(C.dual().G)
    assert macwilliams_transform(A) == B
    assert macwilliams_transform(B) == A
    assert dual_distance(C, A) == next(i for i, b in enumerate(B) if i and b)
    assert dual_distance(C) == dual_distance(C, A)


def test_large_dimension_goes_through_the_dual():
    # k = 40 > n - k = 8: counted on the 2^8 words of the dual, then transformed.
    rng = np.random.default_rng(3)
    H = random_code_matrix(rng, 48, 8)
    C = Code.from_parity_check(H)
    A = weight_distribution(C)
    assert sum(A) == 2**C.k and A[0] == 1
    assert macwilliams_transform(A) == weight_distribution(C.dual())


def test_published_distributions(hamming74, golay23, golay24):
    codes = {"[7,4,3] Hamming": hamming74, "[24,12,8] extended Golay": golay24,
             "[23,12,7] Golay": golay23}
    for entry in REFERENCE:
        assert weight_distribution(codes[entry["code"]]) == entry["distribution"], entry["source"]


def test_krawtchouk_orthogonality():
    # sum_i C(n,i) K_r(i) K_s(i) = 2^n C(n,r) delta_rs (MacWilliams & Sloane, ch. 5 section 7;
    # theorem number from memory)
    n = 9
    for r in range(n + 1):
        for s in range(n + 1):
            total = sum(math.comb(n, i) * krawtchouk(r, i, n) * krawtchouk(s, i, n)
                        for i in range(n + 1))
            assert total == (2**n * math.comb(n, r) if r == s else 0)


def test_bad_distribution_is_refused():
    with pytest.raises(ParameterError, match="power of two"):
        macwilliams_transform([1, 1, 1])
    with pytest.raises(ParameterError, match="not the weight distribution of a linear code"):
        macwilliams_transform([1, 3, 0, 0])


def test_too_expensive_is_refused():
    rng = np.random.default_rng(0)
    C = Code(random_code_matrix(rng, 90, 45))
    with pytest.raises(TooExpensiveError, match="2\\^45"):
        weight_distribution(C)


def test_full_space_has_no_dual_distance():
    C = Code(np.eye(4, dtype=np.uint8))
    assert dual_distance(C) is None
    assert weight_distribution(C) == [1, 4, 6, 4, 1]
