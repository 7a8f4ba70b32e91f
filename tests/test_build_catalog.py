"""scripts/build_catalog.py: the same budget and seed write the same bytes.

The shipped records themselves are checked in tests/test_catalog.py
(``test_shipped_catalog_is_verified``: every record parses and its d is proved again).
"""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest

from gf2codes import families as F
from gf2codes._reference import brute_distance
from gf2codes.catalog import parse_entry_record
from gf2codes.distance import minimum_distance
from gf2codes.exceptions import ParameterError

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
        keys.append((rec.code.n, rec.code.k))
    assert keys == sorted(keys)  # base records only, sorted by (n, k)


def test_quick_refuses_to_overwrite_the_shipped_seed():
    proc = subprocess.run([sys.executable, str(SCRIPT), "--quick"], capture_output=True,
                          text=True, timeout=120, cwd=ROOT)
    assert proc.returncode == 2 and "--output" in proc.stderr


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
