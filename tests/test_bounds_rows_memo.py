"""The bound table's rows beyond the fixed point, remembered on disk (bounds/table.py).

A remembered row must give exactly what computing it gives, and a change of the
inputs (the bounds' source, the shipped non-existence facts and LP values) must not
reuse old rows.
"""

from __future__ import annotations

import json

from gf2codes._util import clear_caches
from gf2codes.bounds import best_upper
from gf2codes.bounds import table as T


def _fresh(tmp_path, monkeypatch, name: str) -> None:
    monkeypatch.setenv("GF2CODES_CACHE_DIR", str(tmp_path / name))
    clear_caches()


def test_remembered_rows_give_the_computed_bounds(tmp_path, monkeypatch):
    _fresh(tmp_path, monkeypatch, "a")
    cells = [(150, 75), (255, 231), (160, 7), (131, 130)]
    computed = [best_upper(n, k) for n, k in cells]
    T._rows_memo().flush()
    saved = json.loads((tmp_path / "a" / "bound-rows.json").read_text())
    assert str(255) in saved["values"]
    clear_caches()  # the same cache folder: the rows are read, not built
    calls = []
    real = T._base
    monkeypatch.setattr(T, "_base", lambda n, k: calls.append((n, k)) or real(n, k))
    again = [best_upper(n, k) for n, k in cells]
    assert again == computed
    assert not [c for c in calls if c[0] > T.TABLE_LENGTH + 2]  # no row beyond was rebuilt


def test_a_damaged_or_foreign_row_is_rebuilt(tmp_path, monkeypatch):
    _fresh(tmp_path, monkeypatch, "b")
    want = best_upper(140, 70)
    T._rows_memo().flush()
    path = tmp_path / "b" / "bound-rows.json"
    obj = json.loads(path.read_text())
    obj["values"]["140"] = [[0, "wrong"]]  # wrong length: ignored
    path.write_text(json.dumps(obj))
    clear_caches()
    assert best_upper(140, 70) == want
    obj["version"] = "another table"
    obj["values"]["140"] = [[1, "wrong"]] * 141  # right shape, other version: ignored
    path.write_text(json.dumps(obj))
    clear_caches()
    assert best_upper(140, 70) == want


def test_the_digest_follows_the_nonexistence_facts(tmp_path, monkeypatch):
    before = T._inputs_digest()
    fake = tmp_path / "facts.jsonl"
    fake.write_text('{"n": 12, "k": 5, "d": 5, "nodes": 26}\n')
    monkeypatch.setattr(T, "NONEXISTENCE_FILE", fake)
    assert T._inputs_digest() != before


def test_the_digest_follows_the_lp_values(tmp_path, monkeypatch):
    # a changed (or removed) LP file is a new table: remembered rows must not be reused
    before = T._inputs_digest()
    fake = tmp_path / "lp.jsonl"
    fake.write_text('{"n": 30, "k": 21, "d": 4}\n')
    monkeypatch.setattr(T, "LP_BOUNDS_FILE", fake)
    changed = T._inputs_digest()
    assert changed != before
    monkeypatch.setattr(T, "LP_BOUNDS_FILE", tmp_path / "absent.jsonl")
    assert T._inputs_digest() not in (before, changed)
