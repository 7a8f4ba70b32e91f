"""Tests of `gf2codes search` (the command line; the library is tested in test_search.py).

Reference values: (k=4, d=3) -> [7,4,3] and [8,4,4] from the Hamming and extended Hamming
codes (MacWilliams & Sloane 1977, ch. 1 sections 7 and 9); (k=5, d=8) -> 16, RM(1, 4)
(ibid., ch. 13 section 3); (k=12, d=8) -> 24, the extended Golay code (ibid., ch. 2
section 6).
"""

from __future__ import annotations

import json
import os
import subprocess
import sys

import pytest

from gf2codes.cli import main
from gf2codes.code import Code
from gf2codes.distance import minimum_distance


class _FakeEntry:
    def __init__(self, code, d):
        self.id, self.n, self.k, self.d, self.proved, self.code = 1, code.n, code.k, d, True, code


class _FakeCatalog:
    def __init__(self, codes=()):
        self.entries = [_FakeEntry(c, d) for c, d in codes]
        self.added, self.closed = [], False

    def pick(self, *, n=None, k=None, d=None):
        fit = [e for e in self.entries if (k is None or e.k == k) and (d is None or e.d >= d)]
        return min(fit, key=lambda e: e.n) if fit else None

    def add(self, code, *, d, proved=True, recipe=None, source="search", seed=None, **extra):
        self.added.append((code.n, code.k, d, source, seed))
        return len(self.added)

    def close(self):
        self.closed = True


def test_cli_uses_and_feeds_the_catalog(monkeypatch, capsys):
    from gf2codes import families
    from gf2codes.cli import _search

    golay = families.extended_golay()
    fake = _FakeCatalog([(golay, 8)])

    class _Module:
        @staticmethod
        def open_catalog(path=None):
            return fake

    monkeypatch.setattr(_search, "catalog", _Module)
    assert main(["search", "--k", "12", "--d", "8", "--strategy", "random", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["strategy"] == "start" and out["n"] == 24 and out["proven_shortest"]
    assert fake.added == [(24, 12, 8, "search", 0)] and fake.closed
    fake2 = _FakeCatalog()
    monkeypatch.setattr(_Module, "open_catalog", staticmethod(lambda path=None: fake2))
    assert main(["search", "--k", "4", "--d", "3", "--no-catalog", "--json"]) == 0
    assert fake2.added == []


@pytest.mark.parametrize("argv,needle", [
    (["--n", "5", "--d", "6"], "'d' must be at most 5"),
    (["--n", "5", "--k", "0"], "'k' must be at least 1"),
    (["--n", "5", "--k", "6"], "'k' must be at most 5"),
    (["--k", "0", "--d", "3"], "'k' must be at least 1"),
    (["--k", "4", "--d", "3", "--time-limit", "0"], "'time_limit' must be positive"),
    (["--k", "4", "--d", "3", "--strategy", "nonsense"], "'strategy' must be one of"),
    (["--k", "4"], "exactly two of"),
])
def test_cli_bad_input_is_one_line_exit_2(argv, needle, capsys):
    assert main(["search", "--no-catalog", *argv]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and err.startswith("gf2codes search: error: ") and needle in err


def test_cli_text_json_and_output_file(tmp_path, capsys):
    path = tmp_path / "code.json"
    assert main(["search", "--no-catalog", "--n", "7", "--k", "4", "--json",
                 "-o", str(path)]) == 0
    out = json.loads(capsys.readouterr().out)
    assert (out["n"], out["k"], out["d"], out["proven_optimal"], out["d_upper_bound"]) == \
        (7, 4, 3, True, 3)
    rec = json.loads(path.read_text())
    assert rec["d"] == 3 and len(rec["generator"]) == 4
    assert main(["search", "--no-catalog", "--k", "4", "--d", "4"]) == 0
    text = capsys.readouterr().out
    assert "no [7,4,4] code exists" in text
    # the generator block is a matrix file (a '#' header, then rows) of the code found
    block = text[text.index("# generator matrix of the [8, 4, 4] code found, 4 x 8"):]
    from gf2codes.formats import parse_text_matrix

    found = Code(parse_text_matrix(block))
    assert (found.n, found.k, minimum_distance(found).d) == (8, 4, 4)


def test_cli_subprocess():
    env = dict(os.environ, PYTHONPATH="/work/main")
    p = subprocess.run([sys.executable, "-m", "gf2codes", "search", "--no-catalog", "--k", "5",
                        "--d", "8", "--json"], capture_output=True, text=True, env=env,
                       timeout=120)
    assert p.returncode == 0, p.stderr
    out = json.loads(p.stdout)
    assert (out["n"], out["k"], out["d"], out["proven_shortest"], out["n_lower_bound"]) == \
        (16, 5, 8, True, 16)
    assert len(out["generator"]) == 5 and all(len(g) == 16 for g in out["generator"])


def test_unusable_default_catalog_is_reported_not_silently_skipped(tmp_path, monkeypatch,
                                                                    capsys):
    from gf2codes.cli import main

    bad = tmp_path / "garbage.sqlite"
    bad.write_text("not a database")
    monkeypatch.setenv("GF2CODES_CATALOG", str(bad))
    assert main(["search", "--k", "4", "--d", "3", "--max-steps", "5"]) == 0
    err = capsys.readouterr().err
    assert "cannot be used" in err and "will not be saved" in err
