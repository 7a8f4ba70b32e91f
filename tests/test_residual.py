"""The residual-extension method (gf2codes._residual): a third exhaustive existence method.

Every answer is checked against brute force where brute force is feasible (all
generator matrices, no symmetry used: gf2codes._reference), against the row method on
random cells, against published values (source beside each), and the compiled search
against its plain-Python twin. The classification's class counts are checked against
an exact count over every coordinate permutation for tiny lengths.
"""

from __future__ import annotations

import itertools

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from gf2codes._reference import brute_best_distance_systematic, brute_distance
from gf2codes._residual import (
    ResidualSearch,
    _bounds,
    _echelon,
    _extend_compiled,
    _extend_python,
    canonical_form,
    min_distance,
    systematic_rows,
)
from gf2codes.existence import decide_existence

SMALL = [(n, k) for n in range(2, 15) for k in range(1, n + 1) if k * (n - k) <= 16
         and k + k * (n - k) <= 22]


@pytest.mark.parametrize("nk", SMALL)
def test_residual_method_matches_brute_force_for_every_d(nk):
    n, k = nk
    best = brute_best_distance_systematic(n, k)  # computed by brute force in this test
    for d in range(1, n + 2):
        dec = decide_existence(n, k, d, max_nodes=None, method="residual")
        assert dec.decided and dec.method in ("residual", "trivial")
        assert dec.status == ("exists" if d <= best else "none"), (n, k, d, best)
        if dec.status == "exists":  # the witness, as [I | A], really has distance >= d
            assert brute_distance(dec.generator()) >= d


@settings(max_examples=25, deadline=None)
@given(st.integers(5, 13), st.data())
def test_residual_and_row_methods_agree_on_random_cells(n, data):
    k = data.draw(st.integers(1, min(5, n - 2)))
    d = data.draw(st.integers(3, n - k + 1))
    a = decide_existence(n, k, d, max_nodes=100_000, method="rows")
    b = decide_existence(n, k, d, max_nodes=100_000, method="residual")
    if a.decided and b.decided:
        assert a.status == b.status, (n, k, d)
    if b.status == "exists":
        assert brute_distance(b.generator()) >= d


def _exact_classes(n: int, k: int, d: int) -> int:
    """Classes of full-support [n, k, >= d] codes: every subspace, every permutation."""
    forms = set()
    spaces = {_echelon(list(rows), n) for rows in itertools.combinations(range(1, 1 << n), k)}
    full = (1 << n) - 1
    for e in spaces:
        if len(e) != k or min_distance(e) < d:
            continue
        support = 0
        for g in e:
            support |= g
        if support != full:
            continue
        forms.add(min(_echelon([sum(1 << p[j] for j in range(n) if g >> j & 1) for g in e], n)
                      for p in itertools.permutations(range(n))))
    return len(forms)


@pytest.mark.parametrize(("n", "k", "d"), [(4, 2, 1), (5, 2, 2), (5, 3, 1), (6, 2, 3),
                                           (6, 3, 2), (6, 3, 3), (5, 4, 1), (6, 2, 2)])
def test_classification_counts_every_class_once(n, k, d):
    assert len(ResidualSearch().classify(n, k, d)) == _exact_classes(n, k, d)


@pytest.mark.slow
def test_classified_codes_have_the_parameters():
    search = ResidualSearch()
    for code in search.classify(15, 7, 5):  # [15,7,5] classes, e.g. the BCH code
        assert len(_echelon(list(code), 15)) == 7 and min_distance(code) >= 5
        support = 0
        for g in code:
            support |= g
        assert support == (1 << 15) - 1


def test_canonical_form_is_the_same_for_a_permuted_code():
    # the [7,4,3] Hamming code under a few coordinate permutations: one form
    rows = (0b1000110, 0b0100101, 0b0010011, 0b0001111)
    base = canonical_form(rows, 7)
    for perm in [(6, 5, 4, 3, 2, 1, 0), (1, 3, 5, 0, 2, 4, 6), (2, 0, 1, 6, 5, 3, 4)]:
        moved = tuple(sum(1 << perm[j] for j in range(7) if g >> j & 1) for g in rows)
        assert canonical_form(moved, 7) == base
    # and the form spans a code equivalent to it (same weight distribution here)
    assert min_distance(base) == 3 and len(base) == 4


@pytest.mark.parametrize(("m", "s", "w", "rows", "nres"),
                         [(3, 4, 5, (0b0111, 0b1011, 0b1101), 4),
                          (4, 4, 5, (0b10011, 0b01011, 0b00111, 0b11110), 5),
                          (2, 5, 6, (0b111, 0b011), 3)])
def test_compiled_and_python_extension_searches_agree(m, s, w, rows, nres):
    low, high = _bounds(rows, w)
    ticks = []
    a = _extend_python(low, high, m, s, lambda: ticks.append(1))
    b = _extend_compiled(low, high, m, s, False, None)
    assert a == b and len(ticks) >= len(a)


def test_systematic_rows_give_the_same_code():
    rows = (0b1000110, 0b0100101, 0b0010011, 0b0001111)
    dec_rows = systematic_rows(rows, 7)
    gen = [[1 if j == i else 0 for j in range(4)] + [(a >> (2 - j)) & 1 for j in range(3)]
           for i, a in enumerate(dec_rows)]
    assert brute_distance(gen) == 3


@pytest.mark.parametrize(("n", "k", "d", "status"), [
    (12, 5, 5, "none"),   # d(12,5) = 4: also this package's row method, and from memory
    (15, 7, 5, "exists"),  # the BCH [15,7,5] code (MacWilliams & Sloane ch. 7 §6)
    pytest.param(18, 9, 6, "exists", marks=pytest.mark.slow),  # extended QR code
    pytest.param(17, 9, 5, "exists", marks=pytest.mark.slow),  # QR code (Huffman & Pless §6.6)
    (14, 7, 5, "none"),   # this package's row method; d(14,7) = 4 (from memory)
])
def test_residual_method_published_values(n, k, d, status):
    assert decide_existence(n, k, d, max_nodes=None, method="residual").status == status


def test_budget_time_limit_leave_the_cell_undecided():
    dec = decide_existence(20, 7, 8, max_nodes=50, method="residual")
    assert dec.status == "undecided" and dec.stopped == "node budget"
    dec = decide_existence(24, 8, 9, max_nodes=None, time_limit=0.5, method="residual")
    assert dec.status == "undecided" and dec.stopped == "time limit"
    assert "classified residual codes" in dec.statement()
