"""Permutation equivalence (gf2codes.equivalence; moved from test_catalog.py)."""

from __future__ import annotations

import time

import numpy as np

from gf2codes import families as F
from gf2codes.code import Code
from gf2codes.equivalence import are_equivalent


def permuted(code: Code, seed: int) -> Code:
    perm = np.random.default_rng(seed).permutation(code.n)
    G = np.zeros_like(code.G)
    G[:, perm] = code.G
    return Code(G)


def test_equivalence_of_symmetric_codes_is_fast():
    # codes with large automorphism groups are the hard case for a plain backtracking
    # isomorphism test: each must take well under a second
    for code in (F.extended_golay(), F.reed_muller(2, 5), F.bch(31, 5)):
        start = time.perf_counter()
        r = are_equivalent(code, permuted(code, 9))
        assert r.equivalent and time.perf_counter() - start < 5
