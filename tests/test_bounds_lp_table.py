"""The shipped certified LP values inside the bound table (bounds/table.py, issue 14/16).

``gf2codes/_lp_bounds.jsonl`` is written by ``scripts/build_lp_bounds.py``; each line
``{"n", "k", "d"}`` says that the certified Delsarte LP proves ``d <= D`` at ``[n, k]``.
Here the lines are solved again (a seeded sample by default, every cell behind
``-m slow``), the table seeded with them is compared with the table without them, and
both with the codes the shipped catalog proves (no bound below a code that exists).
"""

from __future__ import annotations

import json

import numpy as np
import pytest

from gf2codes import bounds as B
from gf2codes._diskcache import Memo
from gf2codes._util import clear_caches
from gf2codes.bounds import lp
from gf2codes.bounds import table as T
from gf2codes.exceptions import ParseError

# cells quoted in the issue: the LP is below the old table there (table 5, LP 4; 16, 14)
ISSUE_CELLS = [(30, 21), (39, 12)]


def _lines() -> list[tuple[int, int, int]]:
    return list(T.shipped_lp_bounds())


def _solve_fresh(monkeypatch, tmp_path, cells):
    """``lp_value`` at each cell, solved in this test: the LP memo is a new empty one."""
    monkeypatch.setattr(lp, "_LP_MEMO", Memo("lp-even", version="fresh", folder=tmp_path))
    clear_caches()
    try:
        return {(n, k): lp.lp_value(n, k) for n, k in cells}
    finally:
        clear_caches()


def _table_without_lp(monkeypatch, tmp_path) -> list[list[int]]:
    # without the LP values and without the facts of the LP with residual exclusions
    # (tests/test_bounds_lp_residual.py), which are LP certificates too
    real, real_res = T.LP_BOUNDS_FILE, T.LP_RESIDUAL_FILE
    monkeypatch.setattr(T, "LP_BOUNDS_FILE", tmp_path / "absent.jsonl")
    monkeypatch.setattr(T, "LP_RESIDUAL_FILE", tmp_path / "absent-residual.jsonl")
    clear_caches()
    try:
        assert T.shipped_lp_bounds() == () and T.shipped_lp_residual() == ()
        return [row[:] for row in T._fixed_table()[0]]
    finally:
        monkeypatch.setattr(T, "LP_BOUNDS_FILE", real)
        monkeypatch.setattr(T, "LP_RESIDUAL_FILE", real_res)
        clear_caches()


def test_the_file_is_shipped_and_covers_the_table():
    lines = _lines()
    assert len(lines) > 1000
    assert max(n for n, _, _ in lines) >= T.TABLE_LENGTH + 1
    cells = [(n, k) for n, k, _ in lines]
    assert cells == sorted(set(cells))  # one line per cell, in order
    # only cells where the LP beats the cheap bounds the table starts from
    for n, k, d in lines:
        assert d < T._base(n, k)[0], (n, k, d)


def test_a_seeded_sample_of_lines_solves_again(monkeypatch, tmp_path):
    lines = _lines()
    rng = np.random.default_rng(1416)
    # 25 lines spread over the file's range: one from each of 25 equal slices
    edges = np.linspace(0, len(lines), 26).astype(int)
    sample = [lines[int(rng.integers(lo, hi))] for lo, hi in zip(edges, edges[1:], strict=False)]
    shipped = {(n, k): d for n, k, d in lines}
    sample += [(n, k, shipped[n, k]) for n, k in ISSUE_CELLS]
    solved = _solve_fresh(monkeypatch, tmp_path, [(n, k) for n, k, _ in sample])
    assert {(n, k): d for n, k, d in sample} == solved
    assert shipped[30, 21] == 4 and shipped[39, 12] == 14


@pytest.mark.slow
def test_every_line_solves_again_and_none_is_missing(monkeypatch, tmp_path):
    # the whole build again: every cell of the file's range, the LP memo empty
    lines = _lines()
    top = max(n for n, _, _ in lines)
    cells = [(n, k) for n in range(1, top + 1) for k in range(1, n + 1)]
    solved = _solve_fresh(monkeypatch, tmp_path, cells)
    want = [(n, k, d) for (n, k), d in solved.items() if d < T._base(n, k)[0]]
    assert lines == want


def test_the_table_starts_from_the_lp_values_and_only_gets_lower(monkeypatch, tmp_path):
    without = _table_without_lp(monkeypatch, tmp_path)
    val, _ = T._fixed_table()
    for n in range(1, T.TABLE_LENGTH + 2):
        for k in range(1, n + 1):
            assert val[n][k] <= without[n][k], (n, k)
    for n, k, d in _lines():
        if n <= T.TABLE_LENGTH + 1:
            assert val[n][k] <= d, (n, k)
    assert val[30][21] == 4 and without[30][21] == 5  # the issue's example
    assert val[39][12] == 14 and without[39][12] == 16


def test_an_absent_file_gives_a_valid_weaker_table(monkeypatch, tmp_path):
    without = _table_without_lp(monkeypatch, tmp_path)
    assert without[30][21] == 5  # as before the LP values were shipped
    monkeypatch.setattr(T, "LP_BOUNDS_FILE", tmp_path / "absent.jsonl")
    clear_caches()
    try:
        assert not any("lp (certified" in step for step in B.bound_chain(39, 22))
        assert B.best_upper(30, 21).d == 4  # the LP at the point still applies
    finally:
        monkeypatch.undo()
        clear_caches()


def test_bound_chain_names_the_lp_rule():
    assert B.bound_chain(30, 21) == ["[30,21] d <= 4: lp (certified Delsarte LP)"]
    # propagated: a [39,22,9] code would have a [30,21,5] residual code, and the LP
    # rules that out (checked by hand from the chain's two steps)
    chain = B.bound_chain(39, 22)
    assert chain[0].startswith("[39,22] d <= 8: residual")
    assert chain[-1] == "[30,21] d <= 4: lp (certified Delsarte LP)"


def test_no_table_value_below_a_code_of_the_catalog(tmp_path):
    # every cell n <= 64 against the shipped catalog's proved codes (the seed and what
    # it derives), for the table with the LP values and for the best bound
    from gf2codes.catalog import open_catalog

    with open_catalog(tmp_path / "c.db") as cat:
        rows = cat.distance_table(range(1, 65))
    val, _ = T._fixed_table()
    assert len(rows) == 64 * 65 // 2
    for row in rows:
        n, k, d = row["n"], row["k"], row["d"]
        assert val[n][k] >= d, (n, k, d)
        assert row["bound"] >= d, (n, k, d)


def test_no_lp_value_below_a_seed_code():
    # every code of the shipped seed (catalog/seed.jsonl) is proved; the file may not be
    # below any of them, nor may the table over its whole range
    seed = T.NONEXISTENCE_FILE.parents[1] / "catalog" / "seed.jsonl"
    codes = [json.loads(line) for line in seed.read_text().splitlines() if line.strip()]
    shipped = {(n, k): d for n, k, d in _lines()}
    val, _ = T._fixed_table()
    checked = 0
    for rec in codes:
        n, k, d = rec["n"], rec["k"], rec["d"]
        if (n, k) in shipped:
            assert shipped[n, k] >= d, (n, k, d)
            checked += 1
        if n <= T.TABLE_LENGTH + 1:
            assert val[n][k] >= d, (n, k, d)
    assert checked


@pytest.mark.parametrize("text,line", [
    ('{"n": 5, "k": 2, "d": 3}\n{"n": 5, "k": 6, "d": 3}\n', 2),  # k > n
    ('{"n": 5, "k": 2, "d": 0}\n', 1),  # d below the repetition code
    ('\n{"n": 5, "k": 2}\n', 2),  # no d
    ('{"n": 5, "k": 2, "d": 3}\nnot json\n', 2),
    ('{"n": 5.0, "k": 2, "d": 3}\n', 1),
])
def test_a_damaged_file_is_refused_with_its_line(monkeypatch, tmp_path, text, line):
    path = tmp_path / "_lp_bounds.jsonl"
    path.write_text(text)
    monkeypatch.setattr(T, "LP_BOUNDS_FILE", path)
    clear_caches()
    try:
        with pytest.raises(ParseError, match=rf"_lp_bounds\.jsonl, line {line}: not an LP"):
            T.shipped_lp_bounds()
    finally:
        monkeypatch.undo()
        clear_caches()
