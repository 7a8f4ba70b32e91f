"""The Code object: construction, duality, equality and structural properties."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import assume, given
from hypothesis import strategies as st

from gf2codes.code import Code
from gf2codes.exceptions import ParameterError

from helpers import random_code_matrix


def test_dependent_rows_are_dropped_and_counted(hamming74):
    G = np.vstack([hamming74.G, hamming74.G[0] ^ hamming74.G[1]])
    C = Code(G)
    assert (C.n, C.k, C.dropped_rows) == (7, 4, 1)
    assert C == hamming74


def test_from_parity_check(hamming74):
    C = Code.from_parity_check(np.vstack([hamming74.H, hamming74.H[0]]))
    assert C == hamming74 and C.dropped_rows == 1
    assert not ((hamming74.G.astype(int) @ hamming74.H.T.astype(int)) % 2).any()


@given(st.integers(0, 2**32 - 1))
def test_generator_times_parity_check_is_zero(seed):
    rng = np.random.default_rng(seed)
    n = int(rng.integers(2, 90))
    k = int(rng.integers(1, n))
    M = random_code_matrix(rng, n, k)
    assume(M.any())
    C = Code(M)
    assert not ((C.G.astype(int) @ C.H.T.astype(int)) % 2).any()
    assert C.H.shape == (n - C.k, n)
    if C.k < n:
        assert C.dual().dual() == C
        assert C.dual().k == n - C.k


@given(st.integers(0, 2**32 - 1))
def test_equality_is_subspace_equality(seed):
    rng = np.random.default_rng(seed)
    n = int(rng.integers(3, 40))
    C = Code(random_code_matrix(rng, n, int(rng.integers(1, n + 1))) | np.eye(1, n, dtype=np.uint8))
    T = rng.integers(0, 2, size=(C.k, C.k))
    while round(abs(np.linalg.det(T))) % 2 == 0:  # need an invertible mixing matrix
        T = rng.integers(0, 2, size=(C.k, C.k))
    mixed = Code((T @ C.G.astype(int)) % 2)
    assert mixed == C and hash(mixed) == hash(C)


def test_encode_syndrome_contains(hamming74):
    m = np.array([1, 0, 1, 1], dtype=np.uint8)
    c = hamming74.encode(m)
    assert c.tolist() == [1, 0, 1, 1, 0, 1, 0]
    assert hamming74.contains(c) and not hamming74.syndrome(c).any()
    e = c.copy()
    e[2] ^= 1
    assert not hamming74.contains(e)
    assert hamming74.encode(np.eye(4, dtype=np.uint8)).tolist() == hamming74.G.tolist()
    with pytest.raises(ParameterError, match="must have 4 bits, not 3"):
        hamming74.encode([1, 0, 1])


def test_properties_of_golay(golay24, golay23):
    # The extended Golay code is self-dual and doubly even; the [23,12] code contains
    # its dual: MacWilliams & Sloane (1977), ch. 2 section 6 and ch. 20.
    assert golay24.is_self_dual and golay24.is_doubly_even and golay24.is_even
    assert golay24.weight_divisor == 4
    assert golay23.is_dual_containing and not golay23.is_even
    assert golay23.dual().is_self_orthogonal


def test_properties_of_hamming(hamming74):
    # The dual of the [7,4] Hamming code is the [7,3] simplex code, contained in it
    # (MacWilliams & Sloane, ch. 1 section 3).
    assert hamming74.is_dual_containing and not hamming74.is_self_orthogonal
    assert hamming74.dual().is_self_orthogonal and hamming74.dual().is_even
    assert hamming74.weight_divisor == 1


def test_immutable(hamming74):
    with pytest.raises(ValueError):
        hamming74.G[0, 0] = 0
    with pytest.raises(ValueError):
        hamming74.packed_generator[0, 0] = 0


@pytest.mark.parametrize("make, message", [
    (lambda: Code([[0, 0, 0]]), "rank 0"),
    (lambda: Code(np.zeros((0, 3), dtype=np.uint8)), "at least one row"),
    (lambda: Code.from_parity_check(np.eye(3, dtype=np.uint8)), "k = 0"),
    (lambda: Code([[1, 0, 1]]).with_info(colour="red"), "'colour'"),
])
def test_bad_construction(make, message):
    with pytest.raises(ParameterError, match=message):
        make()


def test_dual_of_full_space():
    with pytest.raises(ParameterError, match="zero code"):
        Code(np.eye(3, dtype=np.uint8)).dual()


def test_with_info_keeps_matrices(hamming74):
    C = hamming74.with_info(name="h", recipe=[{"family": "hamming", "m": 3}], d_lower=3)
    assert C == hamming74 and C.name == "h" and C.recipe == ({"family": "hamming", "m": 3},)


def test_a_code_cannot_be_changed_after_it_is_made(hamming74):
    """Issue 13, point 5: ``C.d_lower = 5`` silently changed a claimed distance."""
    import pytest

    C = hamming74.with_info(d_lower=3, d_upper=3)
    for attr, value in (("d_lower", 5), ("d_upper", 9), ("name", "x"), ("recipe", ())):
        with pytest.raises(AttributeError):
            setattr(C, attr, value)
    with pytest.raises(AttributeError):
        C.anything = 1  # no __dict__
    assert (C.d_lower, C.d_upper) == (3, 3)
    D = C.with_info(d_lower=None)
    assert D.d_lower is None and C.d_lower == 3 and D.k == C.k


def test_builders_refuse_misspelled_keywords(hamming74):
    import pytest

    from gf2codes.code import Code

    with pytest.raises(TypeError, match="d_lowr"):
        Code.from_packed(hamming74.packed_generator, 7, d_lowr=3)
    with pytest.raises(TypeError, match="nmae"):
        Code.from_parity_check(hamming74.H, nmae="h")


@given(st.integers(0, 2**32 - 1))
def test_pivots_are_an_information_set(seed):
    """Code.pivots: the first 1 of each canonical row, increasing, and G restricted to
    them has full rank (checked here by brute force over all non-zero messages)."""
    rng = np.random.default_rng(seed)
    n = int(rng.integers(1, 13))
    M = random_code_matrix(rng, n, int(rng.integers(1, n + 1)))
    assume(M.any())
    C = Code(M)
    piv = list(C.pivots)
    assert piv == sorted(int(np.flatnonzero(r)[0]) for r in C.rref_generator)
    sub = C.G[:, piv].astype(int)
    for m in range(1, 1 << C.k):
        msg = np.array([(m >> i) & 1 for i in range(C.k)])
        assert ((msg @ sub) % 2).any()
