"""Tests of gf2codes.families and gf2codes.polynomials (the ``build`` command: test_cli_build.py).

Sources of the check values are given beside them; "brute force" means every
codeword is enumerated in this test with gf2codes._reference.
"""

from __future__ import annotations

import json
import math
import os
import sys
from math import comb

import galois
import numpy as np
import pytest

from gf2codes import families as F
from gf2codes._reference import brute_distance
from gf2codes.cli import main
from gf2codes.code import Code
from gf2codes.derive import rebuild
from gf2codes.exceptions import ParameterError, ParseError


def _check_claims(code: Code, d: int) -> None:
    """The construction's bounds must contain the true distance."""
    if code.d_lower is not None:
        assert code.d_lower <= d, (code, code.d_lower, d)
    if code.d_upper is not None:
        assert d <= code.d_upper, (code, code.d_upper, d)


# ------------------------------------------------------------ parameter formulas
@pytest.mark.parametrize("m", [2, 3, 4, 5])
def test_hamming_simplex_parameters(m):
    """[2^m-1, 2^m-1-m, 3] and [2^m-1, m, 2^(m-1)]: MacWilliams & Sloane ch. 1 sections 7, 9;
    d computed by brute force for the small ones."""
    n = 2**m - 1
    H, S, X = F.hamming(m), F.simplex(m), F.extended_hamming(m)
    assert (H.n, H.k, H.d_lower, H.d_upper) == (n, n - m, 3, 3)
    assert (S.n, S.k, S.d_lower, S.d_upper) == (n, m, 2 ** (m - 1), 2 ** (m - 1))
    assert (X.n, X.k, X.d_lower, X.d_upper) == (n + 1, n - m, 4, 4)
    assert S == H.dual()
    assert brute_distance(S.G) == 2 ** (m - 1)
    if H.k <= 16:
        assert brute_distance(H.G) == 3
        assert brute_distance(X.G) == 4
    # every nonzero simplex codeword has weight 2^(m-1) (M&S ch. 1 section 9)
    msgs = np.array([[(i >> j) & 1 for j in range(m)] for i in range(1, 2**m)])
    assert set(((msgs @ S.G) % 2).sum(axis=1).tolist()) == {2 ** (m - 1)}


@pytest.mark.parametrize("m", range(1, 6))
def test_reed_muller_parameters(m):
    """RM(r, m) = [2^m, sum_{i<=r} C(m, i), 2^(m-r)]: MacWilliams & Sloane ch. 13 Theorem 3;
    d by brute force where k <= 16."""
    for r in range(m + 1):
        C = F.reed_muller(r, m)
        k = sum(comb(m, i) for i in range(r + 1))
        assert (C.n, C.k, C.d_lower, C.d_upper) == (2**m, k, 2 ** (m - r), 2 ** (m - r))
        if k <= 16:
            assert brute_distance(C.G) == 2 ** (m - r)


@pytest.mark.parametrize("m", range(2, 8))
def test_reed_muller_duality(m):
    """RM(r, m)^⊥ = RM(m-r-1, m): MacWilliams & Sloane ch. 13 Theorem 4."""
    for r in range(m):
        assert F.reed_muller(r, m).dual() == F.reed_muller(m - r - 1, m)


def test_extended_hamming_is_rm():
    """RM(m-2, m) is the extended Hamming code: MacWilliams & Sloane ch. 13 section 3.
    Hamming column j is the point j + 1 and the parity bit the point 0, so moving the
    parity coordinate to the front lines the coordinates up."""
    for m in range(3, 7):
        X = F.extended_hamming(m)
        assert Code(np.roll(X.G, 1, axis=1)) == F.reed_muller(m - 2, m)


def test_repetition_and_even_weight():
    for n in range(2, 9):
        R, E = F.repetition(n), F.even_weight(n)
        assert (R.k, R.d_lower, R.d_upper) == (1, n, n)
        assert (E.k, E.d_lower, E.d_upper) == (n - 1, 2, 2)
        assert R.dual() == E
        assert brute_distance(E.G) == 2


# ------------------------------------------------------------------------ Golay
def test_golay():
    """[23,12,7] and [24,12,8]: Golay (1949); MacWilliams & Sloane ch. 20. d by brute force."""
    g = F.parse_polynomial(F.GOLAY_POLYNOMIAL)
    assert galois.Poly.Degrees([23, 0]) % g == 0
    G23, G24 = F.golay(), F.extended_golay()
    assert (G23.n, G23.k, G23.d_lower, G23.d_upper) == (23, 12, 7, 7)
    assert (G24.n, G24.k, G24.d_lower, G24.d_upper) == (24, 12, 8, 8)
    assert brute_distance(G23.G) == 7
    assert brute_distance(G24.G) == 8
    assert G24.is_self_dual and G24.is_doubly_even  # M&S ch. 2 section 6
    # the other Golay polynomial (its reciprocal) also divides x^23 - 1
    assert galois.Poly.Degrees([23, 0]) % F.parse_polynomial("0o5343") == 0


# -------------------------------------------------------------------------- BCH
def test_primitive_polynomial_table():
    """The table is the lexicographically first primitive polynomial, as galois computes."""
    for m, value in F.PRIMITIVE_POLYNOMIALS.items():
        if m <= 12:
            assert int(galois.primitive_poly(2, m)) == value


@pytest.mark.parametrize("n,k", [(15, 5), (31, 16), (63, 36),
                                 (127, 64)])
def test_bch_matches_galois(n, k):
    """Same code as galois.BCH(n, k) with the same primitive polynomial. galois writes a
    codeword with the highest-degree coefficient first, so its columns are reversed here."""
    m = n.bit_length()
    field = galois.GF(2**m, irreducible_poly=galois.primitive_poly(2, m))
    ref = galois.BCH(n, k, extension_field=field)
    C = F.bch(n, ref.d)
    assert C.k == k
    assert C == Code(np.fliplr(np.asarray(ref.G)))
    assert C.d_lower >= ref.d


@pytest.mark.parametrize("n,delta,k,d", [
    # narrow-sense primitive BCH codes; k from MacWilliams & Sloane Appendix A
    # (from memory — the standard table of BCH codes); d by brute force where k <= 16
    (15, 3, 11, 3), (15, 5, 7, 5), (15, 7, 5, 7), (31, 5, 21, 5), (31, 7, 16, 7),
    (31, 11, 11, 11), (63, 11, 36, None), (127, 21, 64, None), (255, 37, 131, None),
])
def test_bch_dimensions_and_bounds(n, delta, k, d):
    C = F.bch(n, delta)
    assert (C.n, C.k) == (n, k)
    assert C.d_lower >= delta
    assert C.recipe == ({"family": "bch", "n": n, "designed": delta, "b": 1},)
    if d is not None and C.k <= 16:
        assert brute_distance(C.G) == d
        _check_claims(C, d)


def test_bch_non_narrow_sense():
    """b = 0 adds the root 1: the even-weight subcode of the narrow-sense code of designed
    distance δ - 1 (MacWilliams & Sloane ch. 7 section 6; brute force)."""
    C0 = F.bch(15, 6, b=0)
    assert C0.is_even and C0.k == 6
    d = brute_distance(C0.G)
    assert d == 6
    _check_claims(C0, d)


def test_bose_distance_beats_designed():
    """Designed 10 at n = 63: the cyclotomic coset of 5 contains 10, so the BCH bound
    gives 11 (MacWilliams & Sloane ch. 9 section 3, the Bose distance)."""
    assert F.bch(63, 10).d_lower == 11 and F.bch(63, 10) == F.bch(63, 11)


@pytest.mark.parametrize("args,match", [
    ((64, 3), "2\\^m - 1"),
    ((63, 1), "'designed' must be at least 2, not 1"),
    ((63, 64), "'designed' must be at most 63, not 64"),
    ((7, 7, 0), "cover every exponent"),
    ((7, 3, 9), "'b' must be at most 6, not 9"),
])
def test_bch_errors(args, match):
    n, delta, *b = args
    with pytest.raises(ParameterError, match=match):
        F.bch(n, delta, **({"b": b[0]} if b else {}))


# ---------------------------------------------------------- quadratic residue
# d from MacWilliams & Sloane ch. 16, Fig. 16.2 (from memory — the table of QR codes)
QR_DISTANCES = {7: 3, 17: 5, 23: 7, 31: 7, 41: 9, 47: 11}


@pytest.mark.parametrize("p", [7, 17, 23, 31])
def test_qr_distance_brute_force(p):
    C = F.quadratic_residue(p)
    assert (C.n, C.k) == (p, (p + 1) // 2)
    d = brute_distance(C.G)
    assert d == QR_DISTANCES[p]
    _check_claims(C, d)


@pytest.mark.parametrize("p", [41, 47])
def test_qr_distance_large(p):
    from gf2codes import distance

    C = F.quadratic_residue(p)
    res = distance.minimum_distance(C, time_limit=20)
    if not res.exact:
        pytest.skip(f"minimum_distance did not finish within 20 s for QR({p})")
    assert res.upper == QR_DISTANCES[p]
    _check_claims(C, res.upper)


@pytest.mark.parametrize("p", [17, 23])
def test_qr_roots_are_residues(p):
    """The zeros of g are beta^r, r over the squares (or over the non-squares), for a
    primitive p-th root beta (MacWilliams & Sloane ch. 16 section 1)."""
    m = 1
    while pow(2, m, p) != 1:
        m += 1
    GF = galois.GF(2**m)
    beta = GF.primitive_element ** ((2**m - 1) // p)
    C = F.quadratic_residue(p)
    g = galois.Poly(np.asarray(C.G[0][: p - C.k + 1][::-1], dtype=int), field=GF)
    zeros = {i for i in range(1, p) if g(beta**i) == 0}
    squares = {(i * i) % p for i in range(1, p)}
    assert zeros in (squares, set(range(1, p)) - squares)


def test_qr_23_has_the_golay_weight_distribution():
    """QR(23) is the Golay code up to equivalence: same weight count (brute force)."""
    from gf2codes._reference import brute_weight_distribution

    assert brute_weight_distribution(F.quadratic_residue(23).G) == \
        brute_weight_distribution(F.golay().G)


@pytest.mark.parametrize("p,match", [(13, "5 modulo 8"), (15, "not prime"), (5, "at least 7")])
def test_qr_errors(p, match):
    with pytest.raises(ParameterError, match=match):
        F.quadratic_residue(p)


# --------------------------------------------------------------------- cyclic
@pytest.mark.parametrize("n", [7, 9, 15, 6, 21])
def test_generator_polynomials_give_cyclic_codes(n):
    """Every code from the factorisation of x^n - 1 is invariant under the cyclic shift;
    the number of codes is prod(e_i + 1) - 1 (MacWilliams & Sloane ch. 7 section 5)."""
    codes = F.generator_polynomials(n)
    _, mults = galois.Poly.Degrees([n, 0]).factors()
    assert len(codes) == math.prod(e + 1 for e in mults) - 1
    seen = set()
    for info in codes:
        C = info.build()
        assert C.k == info.k
        assert np.all(C.contains(np.roll(C.G, 1, axis=1)))
        seen.add(C)
        if C.k <= 12:
            _check_claims(C, brute_distance(C.G))
    assert len(seen) == len(codes)  # distinct divisors give distinct codes


def test_cyclic_notations_agree():
    a = F.cyclic(23, "x^11+x^9+x^7+x^6+x^5+x+1")
    b = F.cyclic(23, "0o5343")
    c = F.cyclic(23, "0b101011100011")
    d = F.cyclic(23, galois.Poly.Str("x^11 + x^9 + x^7 + x^6 + x^5 + x + 1"))
    assert a == b == c == d
    assert a.recipe == ({"family": "cyclic", "n": 23, "generator_polynomial": "0o5343"},)
    assert brute_distance(a.G) == 7 and a.d_upper == 7


def test_bch_bound_of_cyclic_code():
    """The defining set of x^3 + x + 1 is {1, 2, 4}: BCH bound 3 (M&S ch. 7 Theorem 8)."""
    assert F.cyclic(7, "x^3+x+1").d_lower == 3
    assert F.bch_bound(7, [1, 2, 4]) == 3
    assert F.bch_bound(15, [1, 2, 3, 4, 6, 8, 9, 12]) == 5


@pytest.mark.parametrize("text,match", [
    ("x^3+x^3+1", "appears twice"), ("y+1", "cannot read the term"), ("0o9", "octal"),
    ("", "empty"),
])
def test_parse_polynomial_errors(text, match):
    with pytest.raises(ParseError, match=match):
        F.parse_polynomial(text)


def test_cyclic_errors():
    with pytest.raises(ParameterError, match="must divide x\\^23 - 1"):
        F.cyclic(23, "x^11+x+1")
    with pytest.raises(ParameterError, match="the code is \\{0\\}"):
        F.cyclic(7, "x^7+1")


# ------------------------------------------------------------ quasi-cyclic
def test_double_circulant_and_quasi_cyclic():
    """A [22, 11] pure double circulant code (A from the squares mod 11): parameters,
    and the construction's bound against brute force."""
    squares = {(i * i) % 11 for i in range(1, 11)}
    row = "".join("1" if i in squares else "0" for i in range(11))
    C = F.double_circulant(row)
    assert (C.n, C.k, C.d_upper) == (22, 11, 1 + len(squares))
    d = brute_distance(C.G)
    _check_claims(C, d)
    # quasi-cyclic: invariant under the simultaneous shift of each block
    Q = F.quasi_cyclic(["1101000|1011100|1110010"], 7)
    assert Q.n == 21
    shifted = np.roll(Q.G.reshape(Q.k, 3, 7), 1, axis=2).reshape(Q.k, 21)
    assert np.all(Q.contains(shifted))
    _check_claims(Q, brute_distance(Q.G))
    with pytest.raises(ParameterError, match="divisible by m = 7"):
        F.quasi_cyclic(["10110"], 7)


# ------------------------------------------------------------------ registry
@pytest.mark.parametrize("name", list(F.FAMILIES))
def test_every_family_example_builds_and_rebuilds(name):
    fam = F.FAMILIES[name]
    assert fam.description and fam.example.startswith(name)
    assert main(["build", *_split(fam.example), "-o", os.devnull, "--format", "text"]) == 0
    built = _build_from_example(fam)
    assert rebuild(built.recipe) == built
    assert rebuild(built.recipe).recipe == built.recipe
    if built.k <= 16:
        _check_claims(built, brute_distance(built.G))


def _split(example: str) -> list[str]:
    import shlex

    return shlex.split(example)


def _build_from_example(fam: F.Family) -> Code:
    import argparse

    from gf2codes.cli import _build

    parser = argparse.ArgumentParser()
    sub = parser.add_subparsers(dest="command")
    _build.register(sub)
    args = parser.parse_args(["build", *_split(fam.example)])
    return fam.build(**{a.name: getattr(args, a.name) for a in fam.arguments})


def test_deterministic():
    assert F.bch(63, 11).G.tobytes() == F.bch(63, 11).G.tobytes()
    assert F.quadratic_residue(47).G.tobytes() == F.quadratic_residue(47).G.tobytes()


@pytest.mark.parametrize("call,match", [
    (lambda: F.hamming(1), "'m' must be at least 2, not 1"),
    (lambda: F.hamming(13), "'m' must be at most 12, not 13"),
    (lambda: F.reed_muller(4, 3), "'r' must be at most 3, not 4"),
    (lambda: F.reed_muller(-1, 3), "'r' must be at least 0, not -1"),
    (lambda: F.repetition(0), "'n' must be at least 1, not 0"),
    (lambda: F.double_circulant("01a"), "0s and 1s"),
])
def test_parameter_errors(call, match):
    with pytest.raises(ParameterError, match=match):
        call()


@pytest.mark.parametrize("n", [7, 15, 21, 23, 31, 45, 63, 75, 117, 100])
def test_factorisation_of_x_n_minus_1(n):
    # Regression: galois' randomised factoring gave up on x^75 - 1 and x^117 - 1
    # ("Failed to find a non-trivial factor"), crashing the search at those lengths.
    # The deterministic Berlekamp factorisation must give irreducible factors whose
    # product (with multiplicities) is x^n - 1; galois checks both (reference library).
    import galois

    from gf2codes.polynomials import factor_x_n_minus_1 as _factor_x_n_minus_1

    factors, mults = _factor_x_n_minus_1(n)
    product = galois.Poly.One()
    for f, e in zip(factors, mults, strict=True):
        assert f.is_irreducible()
        product *= f**e
    assert product == galois.Poly.Degrees([n, 0])
    assert len(F.generator_polynomials(n)) == math.prod(e + 1 for e in mults) - 1


# ------------------------------------------------------- parameter spaces (issue 13)
def test_base_codes_are_those_of_the_old_hand_written_list():
    """search._families.base_codes iterates the families' parameter spaces now; it must
    give the same bases in the same order as the hand-written ranges it replaced. The
    digest was computed once with the old code (commit 5afd3ae) in this way."""
    import hashlib

    from gf2codes.search._families import base_codes

    bases = base_codes()
    text = repr([(b.n, b.k, b.delta, b.family, b.kwargs) for b in bases])
    assert len(bases) == 177
    assert hashlib.sha256(text.encode()).hexdigest() == (
        "315a812db52ca026bbff5482dcfec47b4b884ae2870df4ed4afe615e3cb6af9a")


@pytest.mark.slow  # 8 s; the quick seed build stays in the fast suite
def test_seed_script_offers_the_old_family_candidates():
    """scripts/build_catalog.families iterates the parameter spaces: the same 1418
    candidates in the same order as its old hand-written loops (digest computed once
    with the old code, commit 5afd3ae, by recording every offer as below)."""
    import hashlib
    from pathlib import Path

    sys.path.insert(0, str(Path(__file__).resolve().parents[1] / "scripts"))
    try:
        import build_catalog
    finally:
        sys.path.pop(0)

    class Recorder:
        def __init__(self):
            self.log = []
            self.items = self.log  # the script logs len(pool.items)

        def offer(self, code, source, *, seed=None, recipe=None, time_limit=5.0):
            self.log.append((code.name, code.n, code.k,
                             json.dumps(code.recipe, sort_keys=True, default=str), source,
                             time_limit))

    pool = Recorder()
    build_catalog.families(pool, lambda message: None)
    assert len(pool.log) == 1418
    assert hashlib.sha256(repr(pool.log).encode()).hexdigest() == (
        "d2321196e63fa1fc00113167a28a31998778fc806d1349f8673d4b0dbeed65b8")


@pytest.mark.parametrize("name", list(F.FAMILIES))
def test_instances_build_codes_within_the_length(name):
    fam = F.FAMILIES[name]
    members = list(fam.instances(24))
    if name in ("double-circulant", "quasi-cyclic", "matrix"):
        assert members == []
        return
    assert members, name
    for kw in members[:40]:
        code = fam.build(**kw)
        assert code.n <= 24
        if fam.parameters is not None:
            n, k, d = fam.parameters(**kw)
            assert (code.n, code.k) == (n, k) and code.d_lower is not None
            assert code.d_lower >= d
    assert list(fam.instances(24, lengths={7})) == [
        kw for kw in members if fam.build(**kw).n == 7]


def test_instances_spaces_by_hand():
    # read off the definitions: Hamming m = 2..12, RM(r, m) for r <= m, primes = +-1 mod 8
    assert list(F.FAMILIES["hamming"].instances(63)) == [{"m": m} for m in range(2, 7)]
    assert list(F.FAMILIES["reed-muller"].instances(4)) == [
        {"r": 0, "m": 1}, {"r": 1, "m": 1}, {"r": 0, "m": 2}, {"r": 1, "m": 2},
        {"r": 2, "m": 2}]
    assert [kw["p"] for kw in F.FAMILIES["qr"].instances(50)] == [7, 17, 23, 31, 41, 47]
    assert list(F.FAMILIES["golay"].instances(22)) == []


def test_construction_note_names_the_designed_distance():
    assert "designed distance δ = 5" in F.construction_note(F.bch(31, 5))
    assert F.construction_note(F.hamming(3)) is None


# ------------------------------------------------------------------ anticodes
def _griesmer(k: int, d: int) -> int:
    """The Griesmer bound n >= sum_{i<k} ceil(d / 2^i) (Huffman & Pless, section 2.7)."""
    return sum(-(-d // 2**i) for i in range(k))


@pytest.mark.parametrize("k", range(2, 7))
def test_anticodes_meet_the_griesmer_bound_and_their_distance(k):
    found = 0
    for kw in F.FAMILIES["anticode"].instances(70):
        if kw["k"] != k:
            continue
        code = F.anticode(**kw)
        assert (code.k, code.n) == (k, _griesmer(k, kw["d"]))
        assert F.FAMILIES["anticode"].parameters(**kw) == (code.n, k, kw["d"])
        assert brute_distance(code.G) == kw["d"] == code.d_lower == code.d_upper
        found += 1
    assert found >= 10


def test_anticode_known_members_and_refusal():
    # d = 2^(k-1): the simplex code itself (MacWilliams & Sloane, ch. 1 section 9)
    assert F.anticode(4, 8) == F.simplex(4)
    # k = 3, d = 3: excess 4 - 3 = 1 removes one point of the [7, 3, 4] simplex code,
    # leaving a [6, 3, 3] code (computed by hand)
    assert (F.anticode(3, 3).n, F.anticode(3, 3).k) == (6, 3)
    # k = 3, d = 5: two copies (14 points); the excess 8 - 5 = 3 = 2 + 1 removes a line
    # and a point: [10, 3, 5], the Griesmer length 5 + 3 + 2 (computed by hand)
    assert F.anticode(3, 5).n == 10
    # k = 4, d = 1: excess 7 = 4 + 2 + 1 needs dimensions 3 + 2 + 1 = 6 > 4 in one copy
    with pytest.raises(ParameterError, match="no anticode construction"):
        F.anticode(4, 1)
