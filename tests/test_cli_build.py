"""Tests of the ``gf2codes build`` command (moved from test_families.py)."""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

import pytest

from gf2codes import families as F
from gf2codes.cli import main
from gf2codes.code import Code
from gf2codes.formats import read_code

REPO = Path(__file__).resolve().parents[1]


def test_cli_build_prints_summary_and_matrix(capsys):
    assert main(["build", "hamming", "3"]) == 0
    out = capsys.readouterr().out
    assert "[n, k] = [7, 4]" in out and "d = 3" in out
    rows = [ln for ln in out.splitlines() if set(ln) <= {"0", "1"} and ln]
    assert Code([[int(c) for c in r] for r in rows]) == F.hamming(3)
    # the whole output is a gf2codes matrix file: the summary lines are comments
    from gf2codes.formats import parse_text_matrix

    assert all(ln.startswith("#") for ln in out.splitlines() if ln not in rows)
    assert Code(parse_text_matrix(out)) == F.hamming(3)


def test_cli_bch_never_calls_designed_distance_exact(capsys):
    assert main(["build", "bch", "127", "--designed", "21"]) == 0
    out = capsys.readouterr().out
    assert "[n, k] = [127, 64]" in out
    assert "d ≥ 21" in out or "21 ≤ d ≤" in out
    assert "d = 21" not in out


def test_cli_build_list(capsys):
    assert main(["build", "--list"]) == 0
    out = capsys.readouterr().out
    for name in F.FAMILIES:
        assert f"\n{name}" in out
    assert main(["build", "--list", "--json"]) == 0
    listed = json.loads(capsys.readouterr().out)
    assert [f["family"] for f in listed] == list(F.FAMILIES)


def test_cli_build_json_and_file(tmp_path, capsys):
    out = tmp_path / "rm.json"
    assert main(["build", "reed-muller", "2", "6", "-o", str(out)]) == 0
    assert "wrote" in capsys.readouterr().out
    rec = read_code(out)
    assert rec.code == F.reed_muller(2, 6) and rec.code.recipe == F.reed_muller(2, 6).recipe
    assert (rec.d_lower, rec.d_upper) == (16, 16)
    assert main(["build", "golay", "--json"]) == 0
    obj = json.loads(capsys.readouterr().out)
    assert (obj["n"], obj["k"], obj["d_lower"], obj["d_upper"]) == (23, 12, 7, 7)


def test_cli_build_verify(capsys):
    assert main(["build", "golay", "--verify", "--json"]) == 0
    obj = json.loads(capsys.readouterr().out)
    assert "7" in json.dumps(obj)


@pytest.mark.parametrize("argv,match", [
    (["build", "cyclic", "23", "x^11+x+1"], "must divide x^23 - 1"),
    (["build", "qr", "13"], "congruent to 1 or 7 modulo 8"),
    (["build", "bch", "64", "--designed", "3"], "2^m - 1"),
    (["build"], "--list"),
])
def test_cli_build_bad_input(argv, match, capsys):
    assert main(argv) == 2
    err = capsys.readouterr().err.strip()
    assert len(err.splitlines()) == 1 and match in err


def test_cli_subprocess_bad_input_exits_2_with_one_line():
    env = {**os.environ, "PYTHONPATH": str(REPO)}
    proc = subprocess.run([sys.executable, "-m", "gf2codes", "build", "reed-muller", "5", "3"],
                          capture_output=True, text=True, env=env, timeout=120)
    assert proc.returncode == 2
    assert proc.stdout == ""
    lines = proc.stderr.strip().splitlines()
    assert lines == ["gf2codes build: error: Argument 'r' must be at most 3, not 5."]
    assert "Traceback" not in proc.stderr
