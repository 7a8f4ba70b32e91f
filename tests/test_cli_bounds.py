"""Tests of the ``gf2codes bounds`` command (moved from test_bounds.py and
test_existence.py), and of the bounds registry as the command and the plots read it."""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

import pytest

from gf2codes import bounds as B
from gf2codes._reference import brute_distance

REPO = Path(__file__).resolve().parents[1]


def test_cli_length_json(capsys):
    from gf2codes.cli import main

    assert main(["bounds", "--k", "12", "--d", "8", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["best"]["n"] == 24  # extended Golay [24,12,8]; [23,12,8] impossible
    assert out["best"]["ruled_out_by"] == ["hamming", "lp"]
    assert set(out["upper"]) == {"singleton", "hamming", "plotkin", "griesmer", "elias", "lp"}
    assert set(out["lower"]) == {"gilbert_varshamov", "varshamov"}
    assert out["k"] == 12 and out["d"] == 8


def test_cli_distance_json_and_text(capsys):
    from gf2codes.cli import main

    assert main(["bounds", "--n", "24", "--k", "12", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["best"]["d"] == 8 and out["upper"]["lp"] == 8
    assert main(["bounds", "--n", "24", "--k", "12"]) == 0
    text = capsys.readouterr().out
    assert "d <= 8" in text
    assert main(["bounds", "--n", "24", "--d", "8", "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["best"]["k"] == 12


def test_cli_table(capsys):
    """Rows k, columns d; each cell the least length the upper bounds allow beside the
    length an existence bound guarantees."""
    from gf2codes.cli import main

    assert main(["bounds", "--table", "--k", "1-6", "--d", "1-5", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["k"] == [1, 6] and out["d"] == [1, 5] and len(out["cells"]) == 30
    cells = {(c["k"], c["d"]): c for c in out["cells"]}
    # [6, 4, 3] would need 2^4 (1 + 6) = 112 > 2^6 words (sphere packing): 7 is least,
    # and the Hamming code [7, 4, 3] is guaranteed by Varshamov's bound (computed here).
    assert 2**4 * (1 + 6) > 2**6 and 2**4 * (1 + 7) <= 2**7
    assert cells[4, 3]["n_least"] == 7 == cells[4, 3]["n_exists"]
    assert cells[1, 5]["n_least"] == 5 == cells[1, 5]["n_exists"]  # the repetition code
    for (k, d), c in cells.items():
        assert c["n_least"] == B.least_length(k, d).n
        assert c["n_exists"] == B.existence_length(k, d).n >= c["n_least"]
    assert main(["bounds", "--table", "--k", "4", "--d", "3-4"]) == 0
    text = capsys.readouterr().out
    assert "k=4" in text and "d=3" in text and "d=4" in text and "cells settled" in text


def test_cli_table_piped_at_80_columns_shows_every_cell():
    """A grid wider than 80 columns through a real pipe with COLUMNS=80: every label and
    every cell is printed, nothing elided (0.1 elided cells and row labels into '…')."""
    env = dict(os.environ, PYTHONPATH=str(REPO), COLUMNS="80")
    proc = subprocess.run([sys.executable, "-m", "gf2codes", "bounds", "--table", "--k",
                           "1-20", "--d", "1-14"], capture_output=True, text=True, env=env,
                          timeout=300)
    assert proc.returncode == 0, proc.stderr
    assert "…" not in proc.stdout
    lines = proc.stdout.splitlines()
    head = next(i for i, line in enumerate(lines) if line.lstrip().startswith("d="))
    assert lines[head].split() == [f"d={d}" for d in range(1, 15)]
    assert len(lines[head]) > 80
    rows = lines[head + 1: head + 21]
    assert [r.split()[0] for r in rows] == [f"k={k}" for k in range(1, 21)]
    for k, row in enumerate(rows, start=1):
        for d, cell in enumerate(row.split()[1:], start=1):
            low, _, gap = cell.partition("+")
            assert int(low) == B.least_length(k, d).n
            assert int(low) + int(gap or 0) == B.existence_length(k, d).n


@pytest.mark.parametrize("argv,msg", [
    (["--n", "5", "--k", "7"], "Argument 'k' must be at most 5, not 7."),
    (["--n", "5", "--d", "6"], "Argument 'd' must be at most 5, not 6."),
    (["--n", "x", "--k", "2"], "Argument 'n' must be an integer, not 'x'."),
    (["--n", "5"], "two or three of"),
    (["--table", "--d", "3", "--n", "1-4"], "must not be given with --table"),
    (["--table", "--k", "0-4"], "Argument 'k' must be at least 1, not 0."),
    (["--table", "--d", "1-200"], "Argument 'd' must be at most 128 with --table, not 200."),
])
def test_cli_bad_input(capsys, argv, msg):
    from gf2codes.cli import main

    assert main(["bounds", *argv]) == 2
    err = capsys.readouterr().err
    assert msg in err and err.count("\n") == 1


def test_cli_subprocess_bad_input_exits_2():
    env = dict(os.environ, PYTHONPATH=str(REPO))
    proc = subprocess.run([sys.executable, "-m", "gf2codes", "bounds", "--n", "5", "--k", "9"],
                          capture_output=True, text=True, env=env, timeout=120)
    assert proc.returncode == 2
    lines = proc.stderr.strip().splitlines()
    assert lines == ["gf2codes bounds: error: Argument 'k' must be at most 5, not 9."]
    assert "Traceback" not in proc.stderr


def test_regression_cli_absurd_size_through_a_pipe():
    out = subprocess.run([sys.executable, "-m", "gf2codes", "bounds", "--n", "100000", "--k",
                          "50000", "--json"], capture_output=True, text=True, timeout=120,
                         check=True)
    rec = json.loads(out.stdout)
    assert "lp" in rec["skipped"] and "hamming" in rec["skipped"]


@pytest.mark.parametrize("argv", [["--k", "12", "--d", "100000"],
                                  ["--n", "100000", "--d", "1000"]])
def test_regression_cli_absurd_sizes_name_the_skipped_bounds(argv, capsys):
    from gf2codes.cli import main

    assert main(["bounds", *argv, "--json"]) == 0
    rec = json.loads(capsys.readouterr().out)
    assert "lp" in rec["skipped"] and "hamming" in rec["skipped"]


def test_cli_existence_mode(capsys):
    from gf2codes.cli import main

    out = subprocess.run([sys.executable, "-m", "gf2codes", "bounds", "--n", "12", "--k", "5",
                          "--d", "5", "--json"], capture_output=True, text=True, check=True)
    rec = json.loads(out.stdout)
    assert rec["exists"] is False and "exhaustive search" in rec["statement"]
    assert main(["bounds", "--n", "16", "--k", "8", "--d", "5", "--json"]) == 0
    rec = json.loads(capsys.readouterr().out)
    assert rec["exists"] is True and rec["nodes"] >= 1
    rows = [[int(c) for c in row] for row in rec["generator"]]
    assert brute_distance(rows) >= 5  # computed by brute force in this test


# ------------------------------------------------ the registry: one entry adds a bound


@pytest.fixture
def toy_bound():
    """A trivially valid upper bound, ``k <= n`` (so ``d <= n`` at every k), registered
    for one test and removed after it."""
    bound = B.Bound("toy", "Toy (k <= n)", "upper", "trivial: a code has at most n "
                    "independent coordinates", kmax=lambda n, d: n)
    B.register(bound)
    yield bound
    B.unregister("toy")


def test_a_registered_bound_reaches_the_api_the_cli_and_the_plot(toy_bound, capsys):
    from gf2codes.cli import main

    assert B.upper_bounds(10, 3)["toy"] == 10  # d <= n: the largest d it allows is n
    assert "toy" in B.upper_names() and B.title("toy") == "Toy (k <= n)"
    assert B.best_upper(24, 12).d == 8  # a weaker bound changes nothing else
    assert main(["bounds", "--n", "10", "--k", "3"]) == 0
    text = capsys.readouterr().out
    assert "Toy (k <= n)" in text and "Singleton" in text
    assert main(["bounds", "--n", "10", "--k", "3", "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["upper"]["toy"] == 10
    pytest.importorskip("matplotlib", reason="the plot extra (matplotlib) is not installed")
    from gf2codes import plots

    fig = plots.bounds_figure(3, range(3, 12), known=[])
    labels = fig.axes[0].get_legend_handles_labels()[1]
    assert "Toy (k <= n) bound" in labels and "Singleton bound" in labels


def test_an_unregistered_bound_is_gone():
    B.register(B.Bound("toy2", "Toy 2", "upper", "trivial", kmax=lambda n, d: n))
    assert "toy2" in B.upper_bounds(9, 4)
    B.unregister("toy2")
    assert "toy2" not in B.upper_bounds(9, 4)
    assert set(B.upper_bounds(9, 4)) == set(B.UPPER_BOUND_NAMES)


def test_every_bound_has_a_title_and_a_reference():
    for bound in B.registry.registered():
        assert bound.title and bound.reference, bound.name
        assert B.title(bound.name) == bound.title
