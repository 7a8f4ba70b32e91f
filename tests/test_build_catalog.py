"""scripts/build_catalog.py: the same budget and seed write the same bytes.

The shipped records themselves are checked in tests/test_catalog.py
(``test_shipped_catalog_is_verified``: every record parses and its d is proved again).
"""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

from gf2codes.catalog import parse_entry_record
from gf2codes.derive import rebuild
from gf2codes.distance import minimum_distance

ROOT = Path(__file__).resolve().parents[1]
SCRIPT = ROOT / "scripts" / "build_catalog.py"


def _build(out: Path) -> str:
    proc = subprocess.run([sys.executable, str(SCRIPT), "--quick", "--output", str(out)],
                          capture_output=True, text=True, timeout=600, cwd=ROOT)
    assert proc.returncode == 0, proc.stderr
    return proc.stdout


def test_quick_build_is_byte_reproducible(tmp_path):
    first, second = tmp_path / "a.jsonl", tmp_path / "b.jsonl"
    log = _build(first)
    _build(second)
    assert first.read_bytes() == second.read_bytes()
    assert "candidates refused" in log  # by the work estimate, never by a clock
    lines = first.read_text(encoding="utf-8").splitlines()
    assert lines, log
    keys = []
    for lineno, line in enumerate(lines, start=1):
        obj = json.loads(line)
        rec = parse_entry_record(obj, f"line {lineno}")
        result = minimum_distance(rec.code)  # proved again here, from the matrix alone
        assert result.exact and result.d == rec.d_lower == rec.d_upper, lineno
        for item in rec.recipes:  # every recipe rebuilds the stored code
            steps = item.get("recipe")
            if steps and "family" in steps[0] and item.get("permutation") is None:
                assert rebuild(steps) == rec.code, lineno
        keys.append((rec.code.n, rec.code.k))
    assert keys == sorted(keys)  # base records only, sorted by (n, k)


def test_quick_refuses_to_overwrite_the_shipped_seed():
    proc = subprocess.run([sys.executable, str(SCRIPT), "--quick"], capture_output=True,
                          text=True, timeout=120, cwd=ROOT)
    assert proc.returncode == 2 and "--output" in proc.stderr


def _builder():
    import importlib.util

    spec = importlib.util.spec_from_file_location("build_catalog_under_test", SCRIPT)
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def test_dual_words_of_the_y1_phase():
    """The dual words the Construction Y1 phase uses lie in the dual, one per weight (all
    weights of the dual when it is enumerated: [15, 7] BCH, dual weights by brute force
    here), and shortening on a pair support keeps two more dimensions than its size."""
    import numpy as np

    from gf2codes import families as F
    from gf2codes.derive import shorten

    B = _builder()
    for code in (F.bch(15, 5), F.golay(), F.repetition(30)):  # the last: dual dim 29
        duals = B._DualWords(code)
        G = code.G.astype(np.int64)
        words = duals.by_weight()
        for w, h in words.items():
            assert int(h.sum()) == w
            assert not ((G @ h.astype(np.int64)) & 1).any()
        if code.n - code.k <= B.Y1_FULL_DUAL:
            H = code.dual().G.astype(np.int64)
            every = {int(((np.array(m) @ H) % 2).sum())
                     for m in np.ndindex(*([2] * H.shape[0]))} - {0}
            assert set(words) == every
        for size, coords in duals.pair_supports(50).items():
            assert len(coords) == size
            if size < code.n and code.k - size + 2 >= 1:
                assert shorten(code, coords).k >= code.k - size + 2
