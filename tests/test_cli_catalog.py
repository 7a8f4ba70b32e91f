"""The ``catalog`` command (moved from test_catalog.py; bodies unchanged)."""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest

from gf2codes import families as F
from gf2codes.bounds import least_length
from gf2codes.code import Code

ROOT = Path(__file__).resolve().parent.parent


def _env():
    return {**os.environ, "PYTHONPATH": str(ROOT), "GF2CODES_SHIPPED_CATALOG": "none"}


@pytest.fixture
def cli(monkeypatch, tmp_path):
    """Run ``gf2codes.cli.main`` with the catalog commands registered and a private catalog."""
    from gf2codes import cli as cli_module

    monkeypatch.setitem(cli_module.COMMANDS, "catalog", "._catalog")
    monkeypatch.setitem(cli_module.COMMANDS, "equivalent", "._equivalent")
    monkeypatch.setenv("GF2CODES_CATALOG", str(tmp_path / "cli.sqlite"))
    return cli_module.main


def _write(tmp_path, name, rows):
    p = tmp_path / name
    p.write_text("\n".join(rows) + "\n")
    return str(p)


def test_cli_add_list_show_pick_remove(cli, tmp_path, capsys):
    from gf2codes.formats import parse_text_matrix, rows_to_strings

    f = _write(tmp_path, "h.txt", rows_to_strings(F.hamming(3).G))
    assert cli(["catalog", "--catalog", str(tmp_path / "a.sqlite"), "add", f]) == 0
    assert "entry" in capsys.readouterr().out  # added, or merged into a shipped entry
    cat_path = str(tmp_path / "a.sqlite")
    assert cli(["catalog", "add", f, "--catalog", cat_path, "--json"]) == 0
    added = json.loads(capsys.readouterr().out)
    assert added["status"] == "unchanged" and added["d"] == 3
    eid = added["id"]
    assert cli(["catalog", "list", "--catalog", cat_path, "--n", "7", "--k", "4", "--json"]) == 0
    listed = json.loads(capsys.readouterr().out)
    assert [e["id"] for e in listed] == [eid] and "file" in listed[0]["recipes"]
    assert cli(["catalog", "show", str(eid), "--catalog", cat_path]) == 0
    shown = capsys.readouterr().out
    assert "weight distribution: A0=1 A3=7 A4=7 A7=1" in shown
    # the generator block is a matrix file that reads back as the same code
    block = shown[shown.index("# entry"):]
    assert Code(parse_text_matrix(block)) == F.hamming(3)
    assert cli(["catalog", "pick", "--k", "4", "--d", "3", "--catalog", cat_path, "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["n"] == 7
    assert cli(["catalog", "remove", str(eid), "--catalog", cat_path]) == 0
    assert cli(["catalog", "show", str(eid), "--catalog", cat_path]) == 2
    assert "no entry" in capsys.readouterr().err


def test_cli_add_refuses_what_it_cannot_prove(cli, tmp_path, capsys):
    rng = np.random.default_rng(3)
    G = np.hstack([np.eye(60, dtype=np.uint8), rng.integers(0, 2, (60, 140))])
    f = _write(tmp_path, "big.txt", ["".join(map(str, r)) for r in G])
    common = ["--catalog", str(tmp_path / "b.sqlite")]
    assert cli(["catalog", "add", f, "--time-limit", "0.2", *common]) == 2
    err = capsys.readouterr().err
    assert "not proved" in err and err.count("\n") == 1
    assert cli(["catalog", "add", f, "--time-limit", "0.2", "--allow-interval", *common]) == 0
    out = capsys.readouterr().out
    assert "not proved" in out and "added as entry" in out


def _grid_cells(text):
    """The (k, d) -> cell text of a printed grid (every label must be there)."""
    lines = text.splitlines()
    head = next(i for i, line in enumerate(lines) if line.lstrip().startswith("d="))
    ds = [int(h[2:]) for h in lines[head].split()]
    cells = {}
    for line in lines[head + 1:]:
        if not line.startswith("k="):
            break
        label, *values = line.split()
        assert len(values) == len(ds), line
        for d, v in zip(ds, values, strict=True):
            cells[int(label[2:]), d] = v
    return cells


def test_cli_table_piped_at_80_columns_shows_every_cell(tmp_path):
    """Through a real pipe with COLUMNS=80 and a grid wider than 80 columns: every row and
    column label and every cell is printed, nothing elided or wrapped."""
    env = {**_env(), "GF2CODES_CATALOG": str(tmp_path / "p.sqlite"), "COLUMNS": "80"}
    env.pop("GF2CODES_SHIPPED_CATALOG")
    run = subprocess.run([sys.executable, "-m", "gf2codes", "catalog", "table", "--k", "1-20",
                          "--d", "1-16"], env=env, capture_output=True, text=True, timeout=120)
    assert run.returncode == 0, run.stderr
    assert "…" not in run.stdout and "..." not in run.stdout
    cells = _grid_cells(run.stdout)
    assert set(cells) == {(k, d) for k in range(1, 21) for d in range(1, 17)}
    assert max(len(line) for line in run.stdout.splitlines()) > 80  # wider than the terminal
    assert cells[12, 8] == "24"  # extended Golay [24, 12, 8] is shipped; Hamming bound 24
    assert cells[4, 3] == "7" and cells[1, 16] == "16"
    # an open cell: n on file above the bounds ((10, 6) was one until the bound table of
    # issue 14 proved n >= 20; (8, 9): [25,8,9] on file, d(24,8) <= 9 not yet excluded)
    low, gap = cells[8, 9].split("+")
    assert int(low) == least_length(8, 9).n and (gap == "?" or int(gap) >= 1)


def test_cli_table_open_cells_and_json(cli, tmp_path, capsys):
    cat_path = ["--catalog", str(tmp_path / "o.sqlite")]
    assert cli(["catalog", "table", "--k", "8-12", "--d", "5-6", "--json", *cat_path]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["k"] == [8, 12] and out["d"] == [5, 6] and len(out["cells"]) == 10
    open_cells = [c for c in out["cells"] if c["gap"] != 0]
    assert cli(["catalog", "table", "--k", "8-12", "--d", "5-6", "--open", *cat_path]) == 0
    lines = capsys.readouterr().out.splitlines()
    assert len(lines) == len(open_cells) + 1
    for c, line in zip(open_cells, lines, strict=False):
        assert line.startswith(f"k={c['k']} d={c['d']}: ")
        assert f"bounds rule out n < {c['n_least']}" in line and "to close:" in line
    assert lines[-1].startswith(f"{10 - len(open_cells)} of 10 cells proved shortest")
    assert cli(["catalog", "table", "--k", "0-3", *cat_path]) == 2


def test_cli_table_export_import(cli, tmp_path, capsys):
    cat_path = ["--catalog", str(tmp_path / "t.sqlite")]
    assert cli(["catalog", "table", "--k", "1-8", "--d", "1-6", *cat_path]) == 0
    out = capsys.readouterr().out
    assert "d=6" in out and "k=8" in out and "cells proved shortest" in out
    exported = tmp_path / "all.jsonl"
    assert cli(["catalog", "export", "-o", str(exported), *cat_path]) == 0
    capsys.readouterr()
    assert cli(["catalog", "import", str(exported), "--trust", *cat_path]) == 0
    assert " 0 added" in " " + capsys.readouterr().out
    bad = tmp_path / "bad.jsonl"
    bad.write_text("{}\n")
    assert cli(["catalog", "import", str(bad), *cat_path]) == 1
    assert "line 1" in capsys.readouterr().err


def test_cli_errors_are_one_line(cli, tmp_path, capsys):
    text = tmp_path / "x.sqlite"
    text.write_text("not a database")
    assert cli(["catalog", "list", "--catalog", str(text)]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "not a gf2codes catalog" in err


def test_cli_through_a_subprocess(tmp_path):
    script = ("import sys; from gf2codes import cli; "
              "cli.COMMANDS.setdefault('catalog', '._catalog'); sys.exit(cli.main(sys.argv[1:]))")
    env = {**_env(), "GF2CODES_CATALOG": str(tmp_path / "s.sqlite")}
    env.pop("GF2CODES_SHIPPED_CATALOG")
    run = subprocess.run([sys.executable, "-c", script, "catalog", "pick", "--k", "12", "--d",
                          "8", "--json"], env=env, capture_output=True, text=True, timeout=120)
    assert run.returncode == 0, run.stderr
    out = json.loads(run.stdout)
    assert (out["n"], out["k"], out["d_lower"]) == (24, 12, 8)
