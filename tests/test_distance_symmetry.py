"""Automorphisms in Brouwer–Zimmermann (issue 15, points 2 and 3): detection and checking
of cyclic / quasi-cyclic structure and of given permutations, the bounds of every plan
against brute force and the plain engine, and the lemmas the bounds rest on."""

from __future__ import annotations

import functools
import itertools
import math
from fractions import Fraction

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from gf2codes import families
from gf2codes._reference import brute_distance
from gf2codes.code import Code
from gf2codes.distance import minimum_distance
from gf2codes.distance._bz import (
    _orbit_bound,
    bz_search,
    information_sets,
    make_plans,
)
from gf2codes.distance._result import Best, ProofClock
from gf2codes.distance._symmetry import (
    block_shift,
    code_symmetry,
    cyclic_shift,
    detect_symmetry,
    interleaved_shift,
    is_automorphism,
    orbits,
)
from gf2codes.exceptions import ParameterError
from gf2codes.polynomials import generator_polynomials


@functools.cache
def cyclic_codes(max_n: int) -> list[Code]:
    """Every cyclic code of length 3..max_n with k >= 2 (every divisor g of x^n - 1 as
    generator polynomial, from gf2codes.polynomials.generator_polynomials)."""
    return [g.build() for n in range(3, max_n + 1) for g in generator_polynomials(n)
            if n - g.polynomial.degree >= 2]


def run_plan(code: Code, argument: str | None, symmetry=None, upper: int | None = None
             ) -> tuple[int, int]:
    """Run one named plan of the Brouwer–Zimmermann route (None: the cheapest that the
    detected group allows): (proved lower, best weight)."""
    sym = code_symmetry(code) if symmetry is None else symmetry
    best = Best(code.n)
    if upper is not None:  # start from a known codeword, as the ISD pre-pass does
        rows = code.packed_generator
        w = np.bitwise_count(rows).sum(axis=1)
        best.offer(int(w.min()), rows[int(w.argmin())])
    lower, _ = bz_search(code, ProofClock(None, None), best, None, code.weight_divisor, 1,
                         symmetry=sym, argument=argument)
    return min(lower, best.weight), best.weight


# ------------------------------------------------------------------------- the lemmas
@settings(max_examples=300, deadline=None)
@given(st.integers(3, 40).flatmap(lambda n: st.tuples(
    st.just(n), st.integers(2, (n + 1) // 2),
    st.sets(st.integers(0, n - 1), min_size=1, max_size=n))))
def test_window_lemma(case):
    """make_plans, cyclic-window: when 2k <= n + 1, some window [a, a + k) (mod n) that
    starts at a one of S holds at most floor((|S| + 1) / 2) ones of S (checked by brute
    force over the windows in this test)."""
    n, k, S = case
    least = min(sum(((a + t) % n) in S for t in range(k)) for a in S)
    assert least <= (len(S) + 1) // 2


@settings(max_examples=200, deadline=None)
@given(st.lists(st.tuples(st.integers(0, 4), st.integers(1, 5)), min_size=1, max_size=4),
       st.integers(1, 12))
def test_orbit_bound_is_a_lower_bound(orbit_shapes, t):
    """_orbit_bound never exceeds the least integer weight (by brute force over every
    c_O in 0..|O| in this test) with sum_O c_O |I∩O|/|O| >= t."""
    counts = [(min(a, s), s) for a, s in orbit_shapes]
    best = None
    for cs in itertools.product(*[range(s + 1) for _a, s in counts]):
        if sum(Fraction(c * a, s) for c, (a, s) in zip(cs, counts, strict=True)) >= t:
            best = sum(cs) if best is None else min(best, sum(cs))
    bound = _orbit_bound(counts, t)
    if best is None:
        assert bound > sum(s for _a, s in counts)  # no such weight: nothing lighter left
    else:
        assert bound <= best


def test_orbit_bound_transitive():
    """One orbit of n with k of I in it: ceil(t n / k) (make_plans, orbit-average)."""
    for n, k, t in [(127, 64, 11), (31, 16, 4), (24, 12, 5), (7, 4, 1)]:
        assert _orbit_bound([(k, n)], t) == math.ceil(t * n / k)


def test_orbits():
    assert orbits(6, [block_shift(6, 3)]) == ((0, 1, 2), (3, 4, 5))
    assert orbits(6, [interleaved_shift(6, 3)]) == ((0, 2, 4), (1, 3, 5))
    assert orbits(5, [cyclic_shift(5)]) == ((0, 1, 2, 3, 4),)


# ------------------------------------------------------------------- detection, checks
def test_detects_cyclic_codes():
    C = families.bch(31, 5)
    sym = detect_symmetry(C)
    assert sym is not None and sym.kind == "cyclic" and sym.cyclic and sym.transitive
    assert sym.to_dict()["orbits"] == 1
    # a plain matrix with the coordinates scrambled is no longer cyclic
    perm = np.random.default_rng(5).permutation(31)
    scrambled = Code(C.G[:, perm])
    assert detect_symmetry(scrambled) is None or not detect_symmetry(scrambled).cyclic


def test_detects_quasi_cyclic_codes_in_both_layouts():
    rng = np.random.default_rng(11)
    C = families.quasi_cyclic(["".join(map(str, rng.integers(0, 2, 21)))], 7)
    sym = detect_symmetry(C)
    assert sym is not None and sym.block == 7 and len(sym.orbits) == 3
    # the same code with coordinates interleaved (position b*i + j -> 3*j + b)
    inter = np.empty(21, dtype=np.int64)
    for i in range(21):
        inter[(i % 7) * 3 + i // 7] = i
    D = Code(C.G[:, inter])
    sym2 = detect_symmetry(D)
    assert sym2 is not None and len(sym2.orbits) == 3
    assert minimum_distance(D, method="brouwer-zimmermann").d == brute_distance(C.G)


def test_wrong_permutations_are_rejected():
    C = families.bch(31, 5)
    with pytest.raises(ParameterError, match="permutations of range"):
        minimum_distance(C, automorphisms=[[0] * 31])
    with pytest.raises(ParameterError, match="31 entries"):
        minimum_distance(C, automorphisms=[list(range(30))])
    with pytest.raises(ParameterError, match="from 0 to 30"):
        minimum_distance(C, automorphisms=[list(range(1, 32))])
    swap = list(range(31))
    swap[0], swap[1] = 1, 0
    assert not is_automorphism(C, swap)
    with pytest.raises(ParameterError, match="map the code to itself"):
        minimum_distance(C, automorphisms=[swap])
    # also when the route would not use it (a gray-route code): a claim is checked
    with pytest.raises(ParameterError, match="map the code to itself"):
        minimum_distance(families.hamming(3), automorphisms=[[1, 0, 2, 3, 4, 5, 6]])


def test_given_group_on_a_scrambled_cyclic_code():
    """The conjugate of the cyclic shift is an automorphism of a scrambled cyclic code;
    given as a generator it is checked and used (orbit-average; not cyclic-window, whose
    window argument needs the shift itself)."""
    C = families.quadratic_residue(47)  # [47,24,11], MacWilliams & Sloane ch. 16
    perm = np.random.default_rng(3).permutation(47)
    D = Code(C.G[:, perm])  # column j of D is column perm[j] of C
    inv = np.argsort(perm)
    shift = cyclic_shift(47)
    conj = [int(inv[shift[perm[j]]]) for j in range(47)]
    r = minimum_distance(D, method="brouwer-zimmermann", automorphisms=[conj],
                         use_symmetry=False)
    plain = minimum_distance(D, method="brouwer-zimmermann", use_symmetry=False)
    assert r.d == plain.d == 11
    assert r.argument.startswith("orbit-average")
    assert r.symmetry is not None and r.symmetry["kind"] == "given"


# ------------------------------------------------------------- answers of every plan
def test_every_cyclic_code_up_to_31_equals_the_plain_engine():
    """Every cyclic code of length <= 31 (867 codes): the Brouwer–Zimmermann route with
    the detected group (the plan it would choose) proves the d that the plain route
    (Zimmermann's disjoint sets, no group) proves, starting from the lightest generator
    row as the pre-pass would."""
    seen = set()
    for C in cyclic_codes(31):
        plans = make_plans(C, code_symmetry(C))
        rows = C.packed_generator
        goal = int(np.bitwise_count(rows).sum(axis=1).min())
        arg = min(plans, key=lambda p: p.work_to(goal, 1, C.weight_divisor)).argument
        lower, found = run_plan(C, arg, upper=1)
        ref_lower, ref_found = run_plan(C, "zimmermann", upper=1)
        assert lower == found == ref_lower == ref_found, (C.n, C.k, arg)
        seen.add(arg)
    assert {"cyclic-window", "orbit-average", "orbit-average+zimmermann"} <= seen


def test_engine_with_symmetry_on_cyclic_codes_of_length_31():
    """Through minimum_distance (pre-pass, route choice): every cyclic code of length
    31 with k > 10, against the plain engine."""
    for C in cyclic_codes(31):
        if C.n != 31 or C.k <= 10:
            continue
        r = minimum_distance(C, method="brouwer-zimmermann")
        p = minimum_distance(C, method="brouwer-zimmermann", use_symmetry=False)
        assert r.exact and p.exact and r.d == p.d, (C.n, C.k)
        assert r.argument and p.argument == "zimmermann" and p.symmetry is None


def test_every_plan_on_small_cyclic_codes_against_brute_force():
    """Each plan on its own (not only the cheapest) on every cyclic code of length
    <= 15, with and without a known first codeword, against brute force."""
    for C in cyclic_codes(15):
        d = brute_distance(C.G)
        for plan in make_plans(C, code_symmetry(C)):
            for upper in (None, 1):
                lower, found = run_plan(C, plan.argument, upper=upper)
                assert lower == found == d, (C.n, C.k, plan.argument)


def test_every_plan_on_every_cyclic_code_up_to_31():
    """Each plan on its own on every cyclic code of length <= 31, against the plain
    engine (a few seconds)."""
    for C in cyclic_codes(31):
        d = minimum_distance(C, method="brouwer-zimmermann", use_symmetry=False).d
        for plan in make_plans(C, code_symmetry(C)):
            lower, found = run_plan(C, plan.argument, upper=1)
            assert lower == found == d, (C.n, C.k, plan.argument)


@settings(max_examples=25, deadline=None)
@given(st.integers(3, 9), st.integers(2, 4), st.integers(1, 2), st.integers(0, 2**32 - 1))
def test_random_quasi_cyclic_codes(m, ell, rows, seed):
    """Random quasi-cyclic codes (gf2codes.families.quasi_cyclic): every plan against
    brute force, and the automatic choice against the plain engine."""
    rng = np.random.default_rng(seed)
    gens = ["".join(map(str, rng.integers(0, 2, m * ell))) for _ in range(rows)]
    C = families.quasi_cyclic(gens, m)
    if C.k < 2 or C.k == C.n:
        return
    sym = code_symmetry(C)
    assert sym is not None  # the block shift at least
    d = brute_distance(C.G)
    for plan in make_plans(C, sym):
        lower, found = run_plan(C, plan.argument, upper=1)
        assert lower == found == d
    assert minimum_distance(C, method="brouwer-zimmermann").d == d


def test_bch_63_with_symmetry_is_cheaper_and_equal():
    """BCH [63,36,11] (d from MacWilliams & Sloane, ch. 9, table of primitive BCH
    codes, from memory; the plain engine agrees in this test)."""
    C = families.bch(63, 11)
    r = minimum_distance(C, method="brouwer-zimmermann")
    p = minimum_distance(C, method="brouwer-zimmermann", use_symmetry=False)
    assert r.d == p.d == 11
    # 2k = 72 > n + 1: no window argument, the group average over the 63 shifts
    assert r.argument.startswith("orbit-average") and p.argument == "zimmermann"
    assert r.codewords < p.codewords
    assert r.symmetry is not None and r.symmetry["kind"] == "cyclic"
    assert r.information_sets and r.information_sets[0]["argument"] == r.argument
    assert max(s["bound"] for s in r.information_sets) >= 11


def test_window_plan_named_on_a_half_rate_cyclic_code():
    """QR [47,24,11] (MacWilliams & Sloane ch. 16; the plain engine agrees here):
    2k = 48 <= n + 1, so the cyclic-window plan applies and is the cheapest."""
    C = families.quadratic_residue(47)
    r = minimum_distance(C, method="brouwer-zimmermann")
    p = minimum_distance(C, method="brouwer-zimmermann", use_symmetry=False)
    assert r.d == p.d == 11
    assert r.argument == "cyclic-window"
    assert r.information_sets[0]["images"].startswith("all 47 cyclic shifts")
    # not every combination of a level is enumerated: no Zimmermann contribution claimed
    assert r.information_sets[0]["contribution"] == 0
    assert r.information_sets[0]["bound"] >= 11


def test_time_limit_keeps_a_valid_interval():
    C = families.bch(127, 21)  # [127,64,21]: a proof takes tens of seconds
    r = minimum_distance(C, time_limit=0.5)
    assert r.lower <= 21 <= r.upper
    assert not r.exact or r.d == 21


# ---------------------------------------------------------------- information sets
def test_information_sets_are_disjoint_and_systematic():
    for C in (families.bch(63, 11), families.reed_muller(2, 6), families.golay()):
        mats = information_sets(C)
        assert mats[0].rank == C.k
        new_positions: set[int] = set()
        for m in mats:
            assert len(set(m.positions.tolist())) == C.k
            bits = np.unpackbits(m.rows.view(np.uint8), axis=1, bitorder="little")[:, :C.n]
            assert (bits[:, m.positions] == np.eye(C.k, dtype=np.uint8)).all()
        # the new positions of successive sets are disjoint and cover every column
        for m in mats:
            fresh = set(m.positions.tolist()) - new_positions
            assert len(fresh) == m.rank
            new_positions |= fresh
        assert len(new_positions) == C.n
