"""The Delsarte LP with the weights residual codes rule out (bounds/lp.py, issue 14/16).

``gf2codes/_lp_residual.jsonl`` (``scripts/build_lp_residual.py``) holds facts "no
[n, k, d] code": a weight ``w`` with ``d <= w <= 2d - 2`` in an even code would give an
``[n - w, k - 1, >= d - w/2]`` residual code, and where the table rules that out the
weight is absent. Here: the residual statement itself on random codes, the exclusions
never drop a weight a real code has, the LP never rules out a real code's parameters,
every shipped fact is proved again from the shipped table, and a damaged file is refused.
(No fact is at a cell where the shipped catalog has a code: the table, facts included, is
never below a catalog code; ``tests/test_bounds_lp_table.py`` checks every n <= 64.)
"""

from __future__ import annotations

import itertools

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from gf2codes import bounds as B
from gf2codes._reference import all_codewords, brute_distance, brute_rref_rank
from gf2codes._util import clear_caches
from gf2codes.bounds import table as T
from gf2codes.bounds.lp import lp_residual_rules_out, residual_exclusions
from gf2codes.exceptions import ParseError


def _table():
    val, _ = T._fixed_table()
    return lambda m, j: val[m][j]


def _even_extension(G: np.ndarray) -> np.ndarray:
    parity = G.sum(axis=1, keepdims=True) % 2
    return np.hstack([G, parity]).astype(np.uint8)


@st.composite
def _codes(draw, n_max=13, k_max=6):
    n = draw(st.integers(4, n_max))
    k = draw(st.integers(2, min(k_max, n - 1)))
    seed = draw(st.integers(0, 2**32 - 1))
    rng = np.random.default_rng(seed)
    G = (rng.random((k, n)) < 0.5).astype(np.uint8)
    if brute_rref_rank(G) < k:
        G = np.hstack([np.eye(k, dtype=np.uint8), G[:, k:]])  # force full rank
    return G


@settings(max_examples=60, deadline=None)
@given(_codes())
def test_the_residual_of_any_word_of_weight_below_2d_is_a_code_of_dimension_k_1(G):
    # the theorem of residual_exclusions, checked word by word on the even extension
    E = _even_extension(G)
    k = E.shape[0]
    D = brute_distance(E)
    words = all_codewords(E)
    for c in words:
        w = int(c.sum())
        if not D <= w <= 2 * D - 2:
            continue
        R = E[:, c == 0]
        assert brute_rref_rank(R) == k - 1
        rest = [x for x in words if x.any() and (x != c).any()]
        assert min(int(x[c == 0].sum()) for x in rest) >= D - w // 2


@settings(max_examples=60, deadline=None)
@given(_codes(n_max=15))
def test_exclusions_never_drop_a_weight_a_code_has_and_the_lp_never_rules_it_out(G):
    E = _even_extension(G)
    N, k = E.shape[1], E.shape[0]
    D = brute_distance(E)
    if D <= 2:
        return
    weights = {int(c.sum()) for c in all_codewords(E)}
    assert not residual_exclusions(N, k, D, _table()) & weights
    n, d = G.shape[1], brute_distance(G)
    assert lp_residual_rules_out(n, k, d, _table()) is None
    assert lp_residual_rules_out(N, k, D, _table()) is None


def test_every_shipped_fact_is_proved_again_from_the_shipped_table():
    facts = T.shipped_lp_residual()
    assert len(facts) >= 50
    cells = [(n, k) for n, k, *_ in facts]
    assert cells == sorted(set(cells))  # one fact per cell, in order
    bound = _table()
    val, why = T._fixed_table()
    for n, k, d, excluded, size in facts:
        proof = lp_residual_rules_out(n, k, d, bound)
        assert proof is not None, (n, k, d)
        assert proof.excluded == excluded, (n, k, d)  # integer logic: the same weights
        assert proof.size < 2**k and size < 2**k
        assert val[n][k] <= d - 1


def test_the_facts_lower_the_table_and_name_their_rule(monkeypatch, tmp_path):
    val, _ = T._fixed_table()
    monkeypatch.setattr(T, "LP_RESIDUAL_FILE", tmp_path / "absent.jsonl")
    clear_caches()
    try:
        assert T.shipped_lp_residual() == ()
        without = [row[:] for row in T._fixed_table()[0]]
    finally:
        monkeypatch.undo()
        clear_caches()
    lowered = [(n, k) for n in range(1, T.TABLE_LENGTH + 2) for k in range(1, n + 1)
               if val[n][k] < without[n][k]]
    assert all(val[n][k] <= without[n][k] for n in range(1, T.TABLE_LENGTH + 2)
               for k in range(1, n + 1))
    assert len(lowered) >= len(T.shipped_lp_residual())
    # [34,7]: weights 18..30 of an even [34,7,16] code would give [34-w, 6, >= 16-w/2]
    # residual codes, all ruled out; the LP on weights 16, 32, 34 allows 67 < 128 words
    assert without[34][7] == 16 and val[34][7] == 15
    chain = B.bound_chain(34, 7)
    assert chain[0].startswith("[34,7] d <= 15: lp-residual: no [34,7,16] code")


def test_the_34_7_16_exclusions_by_hand():
    # residual codes of an even [34,7,16] code: [18,6,>=8] for w=16 is the only one the
    # table allows (the [16,5,8] Reed-Muller code plus two coordinates); w=18 needs a
    # [16,6,>=7] code (table: d <= 6), ..., w=30 a [4,6] code (length below k)
    bound = _table()
    assert bound(16, 6) == 6 and bound(18, 6) >= 8
    assert residual_exclusions(34, 7, 16, bound) == frozenset(range(18, 31, 2))


@pytest.mark.slow
def test_no_cell_of_the_catalog_is_ruled_out_at_its_distance(tmp_path):
    from gf2codes.catalog import open_catalog

    with open_catalog(tmp_path / "c.db") as cat:
        rows = cat.distance_table(range(1, 65))
    bound = _table()
    for row in rows:
        n, k, d = row["n"], row["k"], row["d"]
        assert lp_residual_rules_out(n, k, d, bound) is None, (n, k, d)


@pytest.mark.parametrize(("text", "line"), [
    ('{"n": 34, "k": 7, "d": 16, "excluded": [18], "size": 67}\n'
     '{"n": 34, "k": 7, "d": 16, "excluded": [18], "size": 128}\n', 2),  # size >= 2^k
    ('\n{"n": 34, "k": 7, "d": 16, "size": 67}\n', 2),  # no weights
    ('{"n": 34, "k": 7, "d": 16, "excluded": [18.0], "size": 67}\n', 1),
    ('not json\n', 1),
    ('{"n": 7, "k": 34, "d": 16, "excluded": [], "size": 67}\n', 1),  # k > n
])
def test_a_damaged_file_is_refused_with_its_line(monkeypatch, tmp_path, text, line):
    path = tmp_path / "_lp_residual.jsonl"
    path.write_text(text)
    monkeypatch.setattr(T, "LP_RESIDUAL_FILE", path)
    clear_caches()
    try:
        with pytest.raises(ParseError, match=rf"_lp_residual\.jsonl, line {line}: not an LP"):
            T.shipped_lp_residual()
    finally:
        monkeypatch.undo()
        clear_caches()


def test_small_cells_agree_with_brute_force_optimum():
    # for every [n, k] with n <= 9 the true best distance (brute force over all
    # generator matrices' systematic forms) is never ruled out, and one more is the
    # table's business, not a contradiction
    from gf2codes._reference import brute_best_distance_systematic

    bound = _table()
    for n, k in itertools.product(range(3, 10), range(2, 6)):
        if k >= n:
            continue
        best = brute_best_distance_systematic(n, k)
        assert lp_residual_rules_out(n, k, best, bound) is None, (n, k, best)


def _true_table(n_max: int) -> dict[tuple[int, int], int]:
    """``D(n, k)`` for every ``k <= n <= n_max`` by the exhaustive row method (itself
    checked against brute force in tests/test_existence.py)."""
    from gf2codes.existence import decide_existence

    out = {}
    for n in range(1, n_max + 1):
        for k in range(1, n + 1):
            d = 1
            while d < n - k + 1 and decide_existence(n, k, d + 1, max_nodes=None,
                                                     method="rows").status == "exists":
                d += 1
            out[n, k] = d
    return out


def test_with_the_true_small_table_the_lp_never_rules_out_the_truth():
    # a sharper check than with the shipped table: the true D(m, j) for m <= 12 exclude
    # every weight they can, and still the truth at every cell n <= 13 stays allowed;
    # one above the truth is ruled out in most cells, so the check has teeth
    true = _true_table(13)

    def bound(m, j):
        return true[m, j] if m <= 12 else _table()(m, j)

    teeth = 0
    for n in range(3, 14):
        for k in range(2, n):
            best = true[n, k]
            assert lp_residual_rules_out(n, k, best, bound) is None, (n, k, best)
            teeth += lp_residual_rules_out(n, k, best + 1, bound) is not None
    assert teeth >= 50  # of the 66 cells (measured: 64)
