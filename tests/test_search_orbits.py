"""Codes with a prescribed automorphism group (search/_orbits.py).

The orbit program of Braun, Kohnert & Wassermann (IEEE Trans. IT 51, 2005, from memory):
the orbits partition the nonzero vectors and are invariant; every message of one dual
orbit has the same row (so one inequality per dual orbit is enough); a solution is a
code of length n, dimension k and distance >= D (brute force); the code is invariant
under the group; published optimal codes are reached.
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from gf2codes import search as S
from gf2codes._reference import brute_distance
from gf2codes.search._orbits import (
    _images,
    _parity,
    _transpose,
    orbit_code,
    orbit_system,
    random_invertible,
    solve_orbit_system,
)


def _power(img: np.ndarray, j: int) -> np.ndarray:
    out = np.arange(img.size)
    for _ in range(j):
        out = img[out]
    return out


@settings(max_examples=40, deadline=None)
@given(st.integers(2, 7), st.integers(0, 2**32 - 1))
def test_orbits_partition_the_space_and_each_dual_orbit_has_one_row(k, seed):
    rng = np.random.default_rng(seed)
    cols = random_invertible(k, rng)
    system = orbit_system(k, cols, rng, min_orbits=1, max_orbits=1 << k)
    assert system is not None
    points = sorted(x for o in system.orbits for x in o)
    assert points == list(range(1, 1 << k))  # a partition of the nonzero vectors
    img = _images(cols, k)
    j = system.power
    assert all(system.order % len(o) == 0 for o in system.orbits)
    h = _power(img, j)
    for o in system.orbits:  # invariant, and one orbit (h cycles through it)
        assert sorted(h[list(o)].tolist()) == sorted(o)
        seen, x = set(), o[0]
        while x not in seen:
            seen.add(x)
            x = int(h[x])
        assert seen == set(o)  # a single orbit of h
    assert _power(img, system.power * system.order)[1:].tolist() == list(range(1, 1 << k))
    # every message gives the row of its dual orbit's representative
    timg = _power(_images(_transpose(cols, k), k), j)
    pts = np.arange(1, 1 << k, dtype=np.int64)
    oid = np.zeros(1 << k, dtype=np.int64)
    for i, o in enumerate(system.orbits):
        oid[list(o)] = i
    rows = {tuple(r) for r in system.A.tolist()}
    for u in range(1, 1 << k):
        row = np.bincount(oid[1:], weights=_parity(pts & u), minlength=len(system.orbits))
        assert tuple(row.tolist()) in rows
        v = int(timg[u])
        row_v = np.bincount(oid[1:], weights=_parity(pts & v), minlength=len(system.orbits))
        assert (row == row_v).all()  # the weight of u and of (g^T)^j u agree


@settings(max_examples=30, deadline=None)
@given(st.integers(2, 6), st.integers(0, 2**32 - 1), st.data())
def test_a_solution_is_a_code_with_the_parameters_and_the_group(k, seed, data):
    rng = np.random.default_rng(seed)
    n = data.draw(st.integers(k + 1, 3 * (1 << k) // 2))
    D = data.draw(st.integers(1, max(1, n // 2)))
    cols = random_invertible(k, rng)
    system = orbit_system(k, cols, rng, min_orbits=1, max_orbits=1 << k)
    assert system is not None
    mult = solve_orbit_system(system, n, D)
    if mult is None:
        return
    code = orbit_code(system, mult)
    assert (code.n, code.k) == (n, k)
    assert brute_distance(code.G) >= D
    # the columns form a union of orbits, taken mult times each
    colvals = sorted(int("".join(map(str, code.G[::-1, j])), 2) for j in range(n))
    want = sorted(x for o, t in zip(system.orbits, mult, strict=True) for x in o
                  for _ in range(t))
    assert colvals == want


@pytest.mark.parametrize(("k", "d", "n"), [
    (4, 3, 7),    # Hamming [7,4,3] (MacWilliams & Sloane ch. 1 §2)
    (4, 8, 15),   # simplex [15,4,8] (M&S ch. 1 §9)
    (5, 8, 16),   # first-order Reed-Muller [16,5,8] (M&S ch. 13 §3)
    (6, 16, 32),  # first-order Reed-Muller [32,6,16] (M&S ch. 13 §3)
])
def test_published_optimal_codes_are_reached(k, d, n):
    r = S.search_length(k, d, time_limit=60, seed=5, strategies=["orbits"],
                        exhaustive_nodes=0)
    assert (r.n, r.k) == (n, k) and r.d >= d and r.optimal
    assert brute_distance(r.code.G) == r.d


def test_the_same_seed_gives_the_same_candidates():
    def first(seed):
        it = S.STRATEGIES["orbits"].candidates(20, 6, 8, np.random.default_rng(seed))
        out = []
        for _ in range(6):
            c = next(it)
            out.append(None if c is None else c.G.tobytes())
        return out

    assert first(11) == first(11)


def test_no_candidates_beyond_the_dimension_limit():
    it = S.STRATEGIES["orbits"].candidates(40, 15, 8, np.random.default_rng(0))
    assert list(it) == []


def test_search_json_on_stdout_is_clean_at_the_descriptor_level(capfd):
    # HiGHS may print from C++ straight to descriptor 1; the program is run with it
    # silenced, so --json stays one parseable object
    import json

    from gf2codes.cli import main

    assert main(["search", "--k", "7", "--d", "16", "--strategy", "orbits", "--json",
                 "--max-steps", "40", "--no-catalog", "--seed", "1"]) == 0
    rec = json.loads(capfd.readouterr().out)  # the whole of descriptor 1 is the object
    assert rec["k"] == 7 and rec["d"] >= 16


def test_the_silencer_restores_the_descriptor(capfd):
    import os

    from gf2codes.search._orbits import _native_stdout_silenced

    with _native_stdout_silenced():
        os.write(1, b"hidden\n")
    os.write(1, b"shown\n")
    assert capfd.readouterr().out == "shown\n"
