"""GF(2) linear algebra on packed rows, against plain-Python twins and galois."""

from __future__ import annotations

import galois
import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st
from hypothesis.extra.numpy import arrays

from gf2codes import linalg
from gf2codes._reference import brute_rref_rank
from gf2codes.exceptions import ParameterError

matrices = st.integers(1, 12).flatmap(
    lambda r: st.integers(1, 150).flatmap(
        lambda n: arrays(np.uint8, (r, n), elements=st.integers(0, 1))
    )
)


@given(matrices)
def test_pack_unpack_round_trip(M):
    P = linalg.pack(M)
    assert P.dtype == np.uint64 and P.shape == (M.shape[0], (M.shape[1] + 63) // 64)
    assert np.array_equal(linalg.unpack(P, M.shape[1]), M)


def test_pack_bit_order():
    # coordinate j is bit j % 64 of word j // 64 (the documented convention)
    M = np.zeros((1, 130), dtype=np.uint8)
    M[0, [0, 63, 64, 129]] = 1
    assert linalg.pack(M).tolist() == [[1 | (1 << 63), 1, 2]]


@given(matrices)
def test_rank_matches_reference_and_galois(M):
    r = linalg.rank(M)
    assert r == brute_rref_rank(M)
    assert r == int(np.linalg.matrix_rank(galois.GF2(M)))


@given(matrices)
def test_rref_is_reduced(M):
    e = linalg.rref(M).sorted()
    R = e.bits()
    for i, p in enumerate(e.pivots):
        col = R[:, p]
        assert col[i] == 1 and col.sum() == 1
    # same row space: stacking does not raise the rank
    assert linalg.rank(np.vstack([M, R])) == e.rank == linalg.rank(M)


@given(matrices)
def test_null_space(M):
    N = linalg.null_space(M)
    n = M.shape[1]
    assert N.shape == (n - linalg.rank(M), n)
    assert not ((M.astype(int) @ N.T.astype(int)) % 2).any()
    if N.shape[0]:
        assert linalg.rank(N) == N.shape[0]


@given(matrices)
def test_systematic_form(M):
    s = linalg.systematic_form(M)
    k = linalg.rank(M)
    assert np.array_equal(s.matrix[:, :k], np.eye(k, dtype=np.uint8))
    assert sorted(s.permutation.tolist()) == list(range(M.shape[1]))
    # undo the permutation: same row space as M
    back = np.zeros_like(s.matrix)
    back[:, s.permutation] = s.matrix
    assert linalg.rank(np.vstack([M, back])) == k


def test_systematic_form_with_column_order():
    M = np.array([[1, 1, 0, 1], [0, 1, 1, 1]], dtype=np.uint8)
    s = linalg.systematic_form(M, column_order=[3, 2, 1, 0])
    assert set(s.information_set.tolist()) == {2, 3}


def test_independent_rows_and_membership():
    M = [[1, 0, 1], [1, 0, 1], [0, 1, 1], [1, 1, 0]]
    assert linalg.independent_rows(M).tolist() == [0, 2]
    assert linalg.in_row_space(M, [[1, 1, 0], [1, 0, 0]]).tolist() == [True, False]


def test_accepts_galois_and_bool_and_converts_back():
    M = galois.GF2([[1, 0, 1], [0, 1, 1]])
    assert linalg.rank(M) == 2
    assert linalg.rank(np.array([[True, False]])) == 1
    g = linalg.to_galois(np.array([[1, 0], [0, 1]]))
    assert isinstance(g, galois.FieldArray) and g.tolist() == [[1, 0], [0, 1]]


@pytest.mark.parametrize("bad, message", [
    ([[0, 2]], "only 0 and 1, not 2"),
    ([[0.5, 1]], "integers 0 and 1"),
    (np.zeros((2, 2, 2)), "2 axes, not 3"),
])
def test_bad_matrices(bad, message):
    with pytest.raises(ParameterError, match=message):
        linalg.rank(bad)
