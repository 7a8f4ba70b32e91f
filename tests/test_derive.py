"""Tests of gf2codes.derive and of ``gf2codes derive``.

Each derivation's rule for d is checked against the exact distance, computed by
brute force in this test (gf2codes._reference), on small random codes drawn by
hypothesis (derandomized in conftest.py).
"""

from __future__ import annotations

import json

import numpy as np
import pytest
from hypothesis import assume, given
from hypothesis import strategies as st

from gf2codes import derive as D
from gf2codes import families as F
from gf2codes._reference import brute_distance
from gf2codes.code import Code
from gf2codes.exceptions import ParameterError, ParseError


def _exact(code: Code) -> Code:
    """The code with d_lower = d_upper = its brute-force distance."""
    d = brute_distance(code.G)
    return code.with_info(d_lower=d, d_upper=d)


def _check(code: Code) -> int:
    d = brute_distance(code.G)
    if code.d_lower is not None:
        assert code.d_lower <= d, (code.recipe, code.d_lower, d)
    if code.d_upper is not None:
        assert d <= code.d_upper, (code.recipe, code.d_upper, d)
    return d


@st.composite
def small_codes(draw, n_min=3, n_max=10, k_max=5):
    n = draw(st.integers(n_min, n_max))
    k = draw(st.integers(1, min(k_max, n)))
    seed = draw(st.integers(0, 2**32 - 1))
    rng = np.random.default_rng(seed)
    G = (rng.random((k, n)) < 0.5).astype(np.uint8)
    if not G.any():
        G[0, 0] = 1
    return _exact(Code(G))


def _coords(draw, n):
    t = draw(st.integers(1, n - 1))
    return sorted(draw(st.permutations(range(n)))[:t])


# ---------------------------------------------------------------- unary rules
@given(small_codes(), st.data())
def test_puncture_rule(code, data):
    """d' >= d - t; d' <= d when no codeword is lost (M&S ch. 1 section 9)."""
    cs = _coords(data.draw, code.n)
    try:
        P = D.puncture(code, cs)
    except ParameterError as exc:
        assert "zero word" in str(exc)
        return
    assert P.n == code.n - len(cs)
    keep = [i for i in range(code.n) if i not in cs]
    assert P == Code(code.G[:, keep])
    _check(P)
    assert P.d_lower == max(1, code.d_lower - len(cs))


@given(small_codes(), st.data())
def test_shorten_rule(code, data):
    """k' = k - rank(G on coords) exactly; d' >= d (M&S ch. 1 section 9)."""
    from gf2codes.linalg import rank

    cs = _coords(data.draw, code.n)
    drop = rank(code.G[:, cs])
    if drop == code.k:
        with pytest.raises(ParameterError, match="zero word"):
            D.shorten(code, cs)
        return
    S = D.shorten(code, cs)
    assert (S.n, S.k) == (code.n - len(cs), code.k - drop)
    # every codeword of S, padded with zeros on cs, is in the code
    padded = np.zeros((S.k, code.n), dtype=np.uint8)
    padded[:, [i for i in range(code.n) if i not in cs]] = S.G
    assert np.all(code.contains(padded))
    _check(S)
    assert S.d_lower == code.d_lower


@given(small_codes())
def test_extend_expurgate_augment_lengthen_rules(code):
    X = D.extend(code)
    assert X.is_even and X.k == code.k
    d = _check(X)
    assert X.d_lower == X.d_upper == d  # exact from exact: d rounded up to even
    if not code.is_even and code.k == 1:
        with pytest.raises(ParameterError, match="zero word"):
            D.expurgate(code)
    elif not code.is_even:
        E = D.expurgate(code)
        assert E.is_even and E.k == code.k - 1
        _check(E)
    else:
        with pytest.raises(ParameterError, match="already has even weight"):
            D.expurgate(code)
    ones = np.ones(code.n, dtype=np.uint8)
    if code.contains(ones):
        with pytest.raises(ParameterError, match="all-ones"):
            D.augment(code)
        return
    A = D.augment(code)
    assert A.k == code.k + 1 and A.contains(ones)
    _check(A)
    L = D.lengthen(code)
    assert (L.n, L.k) == (code.n + 1, code.k + 1) and L.is_even
    assert L == D.extend(D.augment(code)).with_info()
    _check(L)


# --------------------------------------------------------------- binary rules
@given(small_codes(n_max=7, k_max=3), small_codes(n_max=7, k_max=3))
def test_direct_sum_rule(a, b):
    S = D.direct_sum(a, b)
    assert (S.n, S.k) == (a.n + b.n, a.k + b.k)
    d = _check(S)
    assert S.d_lower == S.d_upper == d == min(a.d_lower, b.d_lower)


@given(st.integers(3, 7), st.integers(0, 2**32 - 1))
def test_plotkin_sum_rule(n, seed):
    """d = min(2 d1, d2) exactly (M&S ch. 2 section 9)."""
    rng = np.random.default_rng(seed)
    u = _exact(Code(np.vstack([np.eye(1, n, 0, dtype=np.uint8),
                               (rng.random((2, n)) < 0.5).astype(np.uint8)])))
    v = _exact(Code(np.vstack([np.eye(1, n, n - 1, dtype=np.uint8),
                               (rng.random((2, n)) < 0.5).astype(np.uint8)])))
    W = D.plotkin_sum(u, v)
    assert (W.n, W.k) == (2 * n, u.k + v.k)
    assert brute_distance(W.G) == W.d_lower == W.d_upper == min(2 * u.d_lower, v.d_lower)


@given(small_codes(n_max=7, k_max=4), st.integers(0, 2**32 - 1))
def test_juxtaposition_rule(a, seed):
    """[n1 + n2, k, >= d1 + d2]; brute force on random pairs of one dimension."""
    rng = np.random.default_rng(seed)
    n2 = int(rng.integers(a.k, 8))
    extra = (rng.random((a.k, n2 - a.k)) < 0.5).astype(np.uint8)
    b = _exact(Code(np.hstack([np.eye(a.k, dtype=np.uint8), extra])[:, rng.permutation(n2)]))
    J = D.juxtapose(a, b)
    assert (J.n, J.k) == (a.n + b.n, a.k)
    assert J.d_lower == a.d_lower + b.d_lower <= brute_distance(J.G)


def test_juxtaposition_of_simplex_codes_and_refusal():
    # two simplex codes side by side: every nonzero word has weight 4 + 4 (M&S ch. 1 s. 9)
    J = D.juxtapose(F.simplex(3), F.simplex(3))
    assert brute_distance(J.G) == 8 and J.d_lower == 8
    assert D.rebuild(J.recipe) == J
    # a derived half whose generator is not in echelon form rebuilds to the same code
    J = D.juxtapose(D.shorten(F.extended_hamming(3), [0]), F.simplex(3))
    assert D.rebuild(J.recipe) == J and J.d_lower == 8 == brute_distance(J.G)
    with pytest.raises(ParameterError, match="dimension of 'a', 3, not 4"):
        D.juxtapose(F.simplex(3), F.hamming(3))


@given(small_codes(n_max=5, k_max=2), small_codes(n_max=5, k_max=2))
def test_product_rule(a, b):
    """d = d1 d2 exactly (M&S ch. 18 section 2)."""
    P = D.product(a, b)
    assert (P.n, P.k) == (a.n * b.n, a.k * b.k)
    assert brute_distance(P.G) == P.d_lower == P.d_upper == a.d_lower * b.d_lower


@given(small_codes(n_min=4, n_max=10, k_max=5), st.integers(0, 2**32 - 1))
def test_construction_x_rule(code, seed):
    """[n + n_a, k1, >= min(d2, d1 + d_a)] (M&S ch. 18 section 7)."""
    assume(code.k >= 2)
    rng = np.random.default_rng(seed)
    k2 = int(rng.integers(1, code.k))
    msgs = (rng.random((k2, code.k)) < 0.5).astype(np.uint8)
    sub_rows = (msgs.astype(int) @ code.G.astype(int)) % 2
    assume(sub_rows.any())
    sub = Code(sub_rows)
    assume(sub.k < code.k)
    r = code.k - sub.k
    aux = _exact(Code(np.eye(r, dtype=np.uint8)))  # [r, r, 1]
    sub = _exact(sub)
    X = D.construction_x(code, sub, aux)
    assert (X.n, X.k) == (code.n + r, code.k)
    _check(X)
    assert X.d_lower == min(sub.d_lower, code.d_lower + 1)


def test_construction_x_classic():
    """BCH [15, 7, 5] ⊃ BCH [15, 5, 7] with the [2, 2, 1] auxiliary code gives
    [17, 7, >= min(7, 5 + 1)] = [17, 7, 6]; d = 6 by brute force."""
    C1, C2 = _exact(F.bch(15, 5)), _exact(F.bch(15, 7))
    X = D.construction_x(C1, C2, _exact(Code(np.eye(2, dtype=np.uint8))))
    assert (X.n, X.k, X.d_lower, X.d_upper) == (17, 7, 6, 7)
    assert brute_distance(X.G) == 6


@given(small_codes(n_min=4, n_max=11, k_max=7), st.integers(0, 2**32 - 1))
def test_construction_y1_rule(code, seed):
    """A dual word of weight w gives [n - w, >= k - w + 1, >= d], and exactly k - w + 1
    when the word has minimum weight in the dual (M&S ch. 18 section 7.1, from memory);
    n, k and d checked by brute force here."""
    assume(code.k < code.n)
    H = code.dual().rref_generator.astype(np.int64)
    rng = np.random.default_rng(seed)
    msg = (rng.random(H.shape[0]) < 0.5).astype(np.int64)
    assume(msg.any())
    h = (msg @ H) % 2
    w = int(h.sum())
    assume(1 <= w < code.n and code.k - w + 1 >= 1)
    Y = D.construction_y1(code, h)
    assert Y.n == code.n - w
    assert Y.k >= code.k - w + 1
    assert Y.d_lower == code.d_lower
    assert brute_distance(Y.G) >= code.d_lower
    _check(Y)
    dual_d = brute_distance(code.dual().G)
    if w == dual_d:
        assert Y.k == code.k - w + 1
    again = D.rebuild(Y.recipe)
    assert again == Y and again.recipe == Y.recipe


def test_construction_y1_on_a_bch_code():
    """BCH [15, 7, 5]: its dual [15, 8] has words of weight 4 (brute force here), and
    Y1 on one gives [11, 4, >= 5], one dimension more than shortening on 4 coordinates
    of an information set."""
    C = _exact(F.bch(15, 5))
    H = C.dual().G.astype(np.int64)
    words = [(np.array(m) @ H) % 2 for m in np.ndindex(*([2] * H.shape[0]))]
    h = min((w for w in words if w.any()), key=lambda w: (int(w.sum()), tuple(w)))
    assert int(h.sum()) == 4
    Y = D.construction_y1(C, h)
    assert (Y.n, Y.k, Y.d_lower) == (11, 4, 5)
    assert brute_distance(Y.G) >= 5
    assert Y.recipe[-1] == {"op": "construction-y1",
                            "coords": np.flatnonzero(h).tolist()}


def test_construction_y1_refusals():
    C = F.hamming(3)
    with pytest.raises(ParameterError, match="word of the dual"):
        D.construction_y1(C, [1, 0, 0, 0, 0, 0, 0])
    with pytest.raises(ParameterError, match="length 7, not one of length 3"):
        D.construction_y1(C, [1, 1, 0])
    with pytest.raises(ParameterError, match="weight from 1 to 6, not 0"):
        D.construction_y1(C, [0] * 7)
    with pytest.raises(ParseError, match="coordinates outside"):
        D.rebuild([{"family": "hamming", "m": 3}, {"op": "construction-y1", "coords": [9]}])


# ----------------------------------------------------------------- the recipes
def test_rebuild_round_trips():
    H = F.extended_hamming(4)
    chain = D.extend(D.shorten(D.puncture(H, [15]), "0-2"))
    assert chain.recipe == (
        {"family": "extended-hamming", "m": 4},
        {"op": "puncture", "coords": [15]},
        {"op": "shorten", "coords": [0, 1, 2]},
        {"op": "extend"},
    )
    binary = D.construction_x(
        D.plotkin_sum(F.reed_muller(1, 3), F.repetition(8)),
        D.plotkin_sum(F.repetition(8), F.repetition(8)),
        D.direct_sum(F.repetition(2), F.even_weight(3)),
    )
    prod = D.product(F.even_weight(3), D.dual(F.golay()))
    nameless = D.expurgate(Code([[1, 1, 0, 1], [0, 1, 1, 1]]))
    for code in (chain, binary, prod, nameless, D.lengthen(F.simplex(4)),
                 D.augment(D.shorten(F.quadratic_residue(17), [0, 1]))):
        json.dumps(list(code.recipe))  # machine-readable
        again = D.rebuild(code.recipe)
        assert again == code
        assert again.recipe == code.recipe
        assert (again.d_lower, again.d_upper) == (code.d_lower, code.d_upper)
    assert nameless.recipe[0]["family"] == "matrix"


def test_rebuild_errors():
    with pytest.raises(ParseError, match="must start with"):
        D.rebuild([{"op": "extend"}])
    with pytest.raises(ParseError, match="unknown family"):
        D.rebuild([{"family": "nope"}])
    with pytest.raises(ParseError, match="unknown operation"):
        D.rebuild([{"family": "golay"}, {"op": "twist"}])


# --------------------------------------------------------------- bad arguments
@pytest.mark.parametrize("call,match", [
    (lambda C: D.shorten(C, [7]), "from 0 to 6 \\(the length is 7\\), not 7"),
    (lambda C: D.puncture(C, [-1]), "from 0 to 6"),
    (lambda C: D.shorten(C, [1, 1]), "coordinate 1 twice"),
    (lambda C: D.puncture(C, range(7)), "Cannot puncture all 7"),
    (lambda C: D.shorten(C, []), "at least one"),
    (lambda C: D.shorten(C, "0-5"), "zero word"),
    (lambda C: D.plotkin_sum(C, F.repetition(8)), "length of 'u_code', 7, not 8"),
    (lambda C: D.construction_x(C, F.repetition(7).dual(), F.repetition(1)),
     "must be contained"),
    (lambda C: D.construction_x(C, D.expurgate(C), F.even_weight(3)),
     "dimension k1 - k2 = 1, not 2"),
    (lambda C: D.augment(C), "already contains the all-ones"),
])
def test_bad_arguments(call, match):
    with pytest.raises(ParameterError, match=match):
        call(F.hamming(3))


def test_parse_operations():
    steps = D.parse_operations(["shorten", "0-2,9", "Puncture", "5", "extend", "dual"])
    assert steps == [{"op": "shorten", "coords": [0, 1, 2, 9]},
                     {"op": "puncture", "coords": [5]}, {"op": "extend"}, {"op": "dual"}]
    for tokens, match in [(["shorten"], "needs a coordinate list"),
                          (["shorten", "a-b"], "cannot read"),
                          (["shorten", "5-2"], "increasing"),
                          (["frobnicate"], "unknown operation"), ([], "at least one")]:
        with pytest.raises(ParseError, match=match):
            D.parse_operations(tokens)


def test_append_zeros_rebuilds_inside_a_recipe():
    """Zero coordinates then a shortening: the recipe replays to the same subspace; the
    distance is unchanged by the zeros (a zero coordinate adds weight to no codeword)."""
    H = F.hamming(3)
    C = D.shorten(D.append_zeros(H, 2), [0])
    assert (C.n, C.k) == (8, 3)
    assert C.recipe[-2] == {"op": "append-zeros", "count": 2}
    assert D.rebuild(C.recipe) == C
    assert not np.any(D.append_zeros(H, 2).G[:, 7:])
    with pytest.raises(ParameterError, match="Argument 'count' must be at least 1, not 0"):
        D.append_zeros(H, 0)
