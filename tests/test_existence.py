"""Tests of gf2codes.existence: exhaustive existence decisions.

A wrong "none" is a false non-existence proof, the worst bug this module could have, so
every decision is checked against brute force wherever brute force is feasible (all
``k (n - k) <= 16``), against a plain backtrack without the symmetry and counting rules
(which only shares the systematic-form argument), and against published values (each
with its source; "from memory" where the value was recalled, not re-read).
"""

from __future__ import annotations

import signal
import threading

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from gf2codes import bounds as B
from gf2codes._reference import (
    brute_best_distance_all,
    brute_best_distance_systematic,
    brute_distance,
    plain_existence,
)
from gf2codes.exceptions import ParameterError
from gf2codes.existence import decide_existence

SMALL = [(n, k) for n in range(2, 18) for k in range(1, n + 1) if k * (n - k) <= 16]
CHEAP = [nk for nk in SMALL if nk[1] + nk[1] * (nk[0] - nk[1]) <= 22]


@pytest.fixture(scope="module")
def true_d():
    # computed by brute force in this test (every systematic generator, no symmetry used)
    return {nk: brute_best_distance_systematic(*nk) for nk in CHEAP}


@pytest.mark.parametrize("nk", CHEAP)
def test_decision_matches_brute_force_for_every_d(nk, true_d):
    n, k = nk
    best = true_d[nk]
    for d in range(1, n + 2):
        dec = decide_existence(n, k, d, max_nodes=None)
        assert dec.decided
        assert dec.status == ("exists" if d <= best else "none"), (n, k, d, best)
        if dec.status == "exists":  # the witness really has distance >= d
            assert brute_distance(dec.generator()) >= d


@pytest.mark.slow
@pytest.mark.parametrize("nk", [nk for nk in SMALL if nk not in CHEAP])
def test_decision_matches_brute_force_large(nk):
    n, k = nk
    best = brute_best_distance_systematic(n, k)  # computed by brute force in this test
    for d in range(1, n + 2):
        assert decide_existence(n, k, d, max_nodes=None).status == (
            "exists" if d <= best else "none")


@pytest.mark.parametrize("nk", [(n, k) for n in range(1, 9) for k in range(1, n + 1)
                                if k * n <= 16])
def test_systematic_brute_force_agrees_with_all_generators(nk):
    # the brute force itself, checked without the systematic-form argument
    assert brute_best_distance_all(*nk) == brute_best_distance_systematic(*nk)


@pytest.mark.parametrize("n", range(5, 13))
def test_decision_matches_plain_backtrack(n):
    for k in range(2, n - 1):
        for d in range(3, n - k + 2):
            dec = decide_existence(n, k, d, max_nodes=None)
            assert (dec.status == "exists") == plain_existence(n, k, d), (n, k, d)


@pytest.mark.slow
@pytest.mark.parametrize("n", range(13, 16))
def test_decision_matches_plain_backtrack_slow(n):
    for k in range(2, n - 1):
        for d in range(3, n - k + 2):
            assert (decide_existence(n, k, d, max_nodes=None).status == "exists") \
                == plain_existence(n, k, d), (n, k, d)


@pytest.mark.parametrize(("n", "k", "d"), [(12, 5, 5), (13, 6, 5), (14, 7, 5), (16, 8, 6),
                                           (10, 3, 6), (24, 8, 10)])
def test_compiled_and_python_twins_agree_node_for_node(n, k, d):
    a = decide_existence(n, k, d, max_nodes=None)
    b = decide_existence(n, k, d, max_nodes=None, compiled=False)
    assert (a.status, a.nodes, a.witness) == (b.status, b.nodes, b.witness)


@pytest.mark.parametrize(("n", "k", "d", "status"), [
    (12, 5, 5, "none"),  # d(12,5) = 4 (MS77 app. A table of best codes, from memory)
    (13, 6, 5, "none"),  # d(13,6) = 4 (from memory)
    (14, 7, 5, "none"),  # d(14,7) = 4 (from memory)
    (16, 8, 6, "none"),  # d(16,8) = 5 (from memory)
    (18, 9, 7, "none"),  # d(18,9) = 6, the extended QR code [18,9,6] is optimal (from memory)
    (24, 8, 10, "none"),  # d(24,8) = 8 (from memory; 10 is already excluded here)
    (7, 4, 3, "exists"),  # Hamming code (MS77 ch. 1 §7)
    (8, 4, 4, "exists"),  # extended Hamming code
    (17, 9, 5, "exists"),  # quadratic-residue code of length 17 (MS77 ch. 16)
    (23, 12, 7, "exists"),  # binary Golay code (MS77 ch. 2 §6)
    (24, 12, 8, "exists"),  # extended Golay code
    (16, 5, 8, "exists"),  # first-order Reed-Muller code RM(1,4) (MS77 ch. 13)
])
def test_published_values(n, k, d, status):
    dec = decide_existence(n, k, d, max_nodes=None)
    assert dec.status == status
    if status == "exists":
        assert brute_distance(dec.generator()) >= d


def test_statement_says_what_was_decided():
    assert decide_existence(12, 5, 5, method="rows").statement() == \
        "no [12,5,5] code exists (exhaustive search, generator rows, 26 nodes)"
    dec = decide_existence(24, 8, 9, max_nodes=500)
    assert dec.status == "undecided" and dec.stopped == "node budget" and not dec.decided
    assert "undecided" in dec.statement()


def test_time_limit_leaves_the_cell_undecided():
    dec = decide_existence(24, 8, 9, max_nodes=None, time_limit=0.2)
    assert dec.status == "undecided" and dec.stopped == "time limit"


def test_ctrl_c_leaves_the_cell_undecided():
    def interrupt(nodes, info):
        raise KeyboardInterrupt

    dec = decide_existence(24, 8, 9, max_nodes=None, progress=interrupt, time_limit=30)
    assert dec.status == "undecided" and dec.stopped == "interrupted"
    assert threading.current_thread() is threading.main_thread() and signal.SIGINT


@pytest.mark.parametrize(("args", "match"), [
    ((0, 1, 1), "Argument 'n' must be at least 1, not 0."),
    ((5, 6, 1), "Argument 'k' must be at most 5, not 6."),
    ((5, 2, 0), "Argument 'd' must be at least 1, not 0."),
    ((100, 2, 3), "Argument 'n - k' must be at most 62"),
])
def test_bad_arguments(args, match):
    with pytest.raises(ParameterError, match=match):
        decide_existence(*args)


def _shipped_facts() -> list[dict]:
    import json

    return [json.loads(line) for line in B.NONEXISTENCE_FILE.read_text().splitlines()
            if line.strip()]


def test_every_shipped_nonexistence_result_is_decided_again():
    # the table's exhaustive facts (gf2codes/_nonexistence.jsonl) are re-proved here, each
    # by the method that recorded it, node for node
    facts = _shipped_facts()
    assert facts and len(facts) == len(B.proved_nonexistence())
    for rec in facts:
        if rec["nodes"] > 200_000 or rec["n"] - rec["k"] > 22:
            continue  # re-proved in the slow test below (many nodes, or millions of rows)
        dec = decide_existence(rec["n"], rec["k"], rec["d"], max_nodes=None,
                               method=rec["method"])
        assert dec.status == "none" and dec.nodes == rec["nodes"], rec


@pytest.mark.slow
def test_every_shipped_nonexistence_result_is_decided_again_slow():
    for rec in _shipped_facts():
        dec = decide_existence(rec["n"], rec["k"], rec["d"], max_nodes=None,
                               method=rec["method"])
        assert dec.status == "none" and dec.nodes == rec["nodes"], rec


def test_shipped_facts_do_not_contradict_the_catalog(tmp_path):
    # a "no [n,k,d]" fact below a proved catalog code would be a false proof
    from gf2codes.catalog import open_catalog

    with open_catalog(tmp_path / "c.db") as cat:
        best = {(r["n"], r["k"]): r["d"] for r in cat.distance_table(range(1, 65))}
    for rec in _shipped_facts():
        assert best.get((rec["n"], rec["k"]), 0) < rec["d"], rec


# --- the parity-check column method (gf2codes._columns), an independent second method ---

@pytest.mark.parametrize("nk", CHEAP)
def test_column_method_matches_brute_force_for_every_d(nk, true_d):
    n, k = nk
    best = true_d[nk]
    for d in range(1, n + 2):
        dec = decide_existence(n, k, d, max_nodes=None, method="columns")
        assert dec.decided
        assert dec.status == ("exists" if d <= best else "none"), (n, k, d, best)
        if dec.status == "exists":
            assert brute_distance(dec.generator()) >= d


@pytest.mark.slow
@pytest.mark.parametrize("nk", [nk for nk in SMALL if nk not in CHEAP])
def test_column_method_matches_brute_force_large(nk):
    n, k = nk
    best = brute_best_distance_systematic(n, k)  # computed by brute force in this test
    for d in range(1, n + 2):
        assert decide_existence(n, k, d, max_nodes=None, method="columns").status == (
            "exists" if d <= best else "none")


@pytest.mark.parametrize("n", range(5, 15))
def test_column_and_row_methods_agree(n):
    for k in range(1, n):
        for d in range(3, n - k + 2):
            a = decide_existence(n, k, d, max_nodes=None, method="rows")
            b = decide_existence(n, k, d, max_nodes=None, method="columns")
            assert a.status == b.status, (n, k, d)
            if b.status == "exists":
                assert brute_distance(b.generator()) >= d


@settings(max_examples=40, deadline=None)
@given(st.integers(4, 20), st.data())
def test_column_and_row_methods_agree_on_random_cells(n, data):
    k = data.draw(st.integers(max(1, n - 10), n - 2))
    d = data.draw(st.integers(3, n - k + 1))
    a = decide_existence(n, k, d, max_nodes=200_000, method="rows")
    b = decide_existence(n, k, d, max_nodes=200_000, method="columns")
    if a.decided and b.decided:
        assert a.status == b.status, (n, k, d)
    for dec in (a, b):
        if dec.status == "exists":
            assert brute_distance(dec.generator()) >= d


@pytest.mark.parametrize(("n", "k", "d"), [(9, 4, 4), (10, 5, 4), (11, 6, 4), (12, 7, 4),
                                           (12, 5, 5), (11, 4, 5), (15, 11, 3), (13, 9, 3),
                                           (14, 8, 4), (10, 3, 5)])
def test_column_compiled_and_python_twins_agree_node_for_node(n, k, d):
    a = decide_existence(n, k, d, max_nodes=None, method="columns")
    b = decide_existence(n, k, d, max_nodes=None, method="columns", compiled=False)
    assert (a.status, a.nodes, a.witness, a.lemma_nodes) == \
        (b.status, b.nodes, b.witness, b.lemma_nodes)


@pytest.mark.parametrize(("r", "dist"), [(r, dist) for r in range(2, 8)
                                         for dist in range(3, r + 3)])
def test_column_cap_is_an_upper_bound(r, dist):
    # the cap bounds the largest m with an [m, m - r, dist] code, found by the row method
    from gf2codes._columns import column_cap

    cap, _ = column_cap(r, dist)
    if cap + 1 > 24:
        pytest.skip("row decision too long for the fast suite")  # (7, 4): cap 64
    assert decide_existence(cap + 1, cap + 1 - r, dist, max_nodes=None,
                            method="rows").status == "none"
    # and is exact where the row method shows a code at the cap
    if cap > r:
        assert decide_existence(cap, cap - r, dist, max_nodes=None,
                                method="rows").status in ("exists", "none")


@pytest.mark.parametrize(("n", "k", "d", "status"), [
    (12, 5, 5, "none"),  # d(12,5) = 4 (MS77 app. A table of best codes, from memory)
    (13, 6, 5, "none"),  # d(13,6) = 4 (from memory)
    (14, 7, 5, "none"),  # d(14,7) = 4 (from memory)
    (16, 8, 6, "none"),  # d(16,8) = 5 (from memory)
    (18, 10, 5, "none"),  # no [18,10,5]: 17 is the longest with r = 8, d = 5 (from memory)
    (7, 4, 3, "exists"),  # Hamming code (MS77 ch. 1 §7)
    (15, 11, 3, "exists"),  # Hamming code of length 15
    (8, 4, 4, "exists"),  # extended Hamming code
    (17, 9, 5, "exists"),  # quadratic-residue code of length 17 (MS77 ch. 16)
    (23, 12, 7, "exists"),  # binary Golay code (MS77 ch. 2 §6)
    (23, 14, 5, "exists"),  # Wagner's [23,14,5] code (from memory)
    (24, 14, 6, "exists"),  # its extension by a parity bit
])
def test_column_method_published_values(n, k, d, status):
    dec = decide_existence(n, k, d, max_nodes=None, method="columns", time_limit=120)
    assert dec.status == status
    if status == "exists":
        assert brute_distance(dec.generator()) >= d


def test_column_method_time_limit_and_ctrl_c_leave_the_cell_undecided():
    dec = decide_existence(24, 15, 5, max_nodes=None, time_limit=0.3, method="columns")
    assert dec.status == "undecided" and dec.stopped == "time limit" and not dec.decided
    assert "undecided" in dec.statement() and "parity-check columns" in dec.statement()

    def interrupt(nodes, info):
        raise KeyboardInterrupt

    dec = decide_existence(24, 15, 5, max_nodes=None, progress=interrupt, time_limit=30,
                           method="columns")
    assert dec.status == "undecided" and dec.stopped == "interrupted"
    # the deadline also bounds the smaller decisions behind the hyperplane cap
    dec = decide_existence(29, 16, 7, max_nodes=None, time_limit=0.5, method="columns")
    assert dec.status == "undecided" and dec.stopped == "time limit"
    dec = decide_existence(24, 15, 5, max_nodes=1000, method="columns")
    assert dec.status == "undecided" and dec.stopped == "node budget" and dec.nodes == 1000


def test_auto_picks_a_method_and_names_it():
    from gf2codes.existence import choose_method

    assert choose_method(24, 8, 9) == "rows" and choose_method(32, 29, 4) == "columns"
    dec = decide_existence(18, 10, 5, max_nodes=None, method="columns")
    assert dec.method == "columns" and "parity-check columns" in dec.statement()
    assert decide_existence(18, 10, 5, max_nodes=None).method == choose_method(18, 10, 5)
    with pytest.raises(ParameterError, match="Argument 'method' must be one of"):
        decide_existence(8, 4, 4, method="both")  # type: ignore[arg-type]
