"""The ``equivalent`` command (moved from test_catalog.py; bodies unchanged)."""

from __future__ import annotations

import json
import subprocess
import sys

import numpy as np
import pytest

from gf2codes.code import Code


def permuted(code: Code, seed: int) -> Code:
    perm = np.random.default_rng(seed).permutation(code.n)
    G = np.zeros_like(code.G)
    G[:, perm] = code.G
    return Code(G)


_A = ["10110001", "01101001", "00000110"]


_B = ["10101100", "01101100", "00011011"]


def _code(rows):
    return Code([[int(c) for c in r] for r in rows])


def _write(tmp_path, name, rows):
    p = tmp_path / name
    p.write_text("\n".join(rows) + "\n")
    return str(p)


@pytest.fixture
def cli(monkeypatch, tmp_path):
    """Run ``gf2codes.cli.main`` with the catalog commands registered and a private catalog."""
    from gf2codes import cli as cli_module

    monkeypatch.setitem(cli_module.COMMANDS, "catalog", "._catalog")
    monkeypatch.setitem(cli_module.COMMANDS, "equivalent", "._equivalent")
    monkeypatch.setenv("GF2CODES_CATALOG", str(tmp_path / "cli.sqlite"))
    return cli_module.main


def test_cli_equivalent(cli, tmp_path, capsys):
    from gf2codes.formats import rows_to_strings

    a = _write(tmp_path, "a.txt", _A)
    b = _write(tmp_path, "b.txt", _B)
    pb = _write(tmp_path, "pb.txt", rows_to_strings(permuted(_code(_B), 2).G))
    assert cli(["equivalent", a, b]) == 1
    assert "not equivalent" in capsys.readouterr().out
    assert cli(["equivalent", b, pb, "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["equivalent"] and sorted(out["permutation"]) == list(range(8))


def test_equivalent_loads_no_sql():
    """``gf2codes equivalent`` runs on gf2codes.equivalence alone: no sqlite3, no catalog."""
    probe = ("import sys, gf2codes.cli._equivalent, gf2codes.equivalence, gf2codes.formats; "
             "print(sorted(m for m in sys.modules if m == 'sqlite3' or m == '_sqlite3' "
             "or m.startswith('gf2codes.catalog')))")
    run = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True,
                         timeout=120)
    assert run.returncode == 0, run.stderr
    assert run.stdout.strip() == "[]"
