"""The ``grow`` command (moved from test_growth.py; bodies unchanged)."""

from __future__ import annotations

import json

import pytest


@pytest.fixture
def cli(monkeypatch, tmp_path):
    """``gf2codes.cli.main`` with a private catalog."""
    from gf2codes import cli as cli_module

    monkeypatch.setenv("GF2CODES_CATALOG", str(tmp_path / "cli.sqlite"))
    return cli_module.main


def test_cli_grow_and_gaps(cli, tmp_path, capsys, monkeypatch):
    monkeypatch.setenv("GF2CODES_SHIPPED_CATALOG", "none")
    path = str(tmp_path / "g.sqlite")
    assert cli(["grow", "--catalog", path, "--n", "5-7", "--max-steps", "10", "--json"]) == 0
    lines = [json.loads(x) for x in capsys.readouterr().out.splitlines()]
    assert lines[-1]["job"]["stopped"] == "finished"
    assert len(lines) - 1 == lines[-1]["job"]["cells"] == 18
    assert {"n", "k", "d", "bound", "outcome"} <= set(lines[0])
    assert cli(["grow", "--catalog", path, "--n", "5-7", "--max-steps", "10"]) == 0
    assert "18 of 18 open cells done (18 in earlier runs)" in capsys.readouterr().out
    assert cli(["gaps", "--catalog", path, "--n", "1-7", "--json"]) == 0
    st = json.loads(capsys.readouterr().out)
    assert st["cells"] == 28 and st["at_bound"] + st["open"] == 28
    assert cli(["gaps", "--catalog", path, "--n", "1-7"]) == 0
    assert "at the bound" in capsys.readouterr().out


# the bad-input cases of gaps are in test_cli_gaps.py; its output is checked above
@pytest.mark.parametrize("argv, message", [
    (["grow"], "Give a region"),
    (["grow", "--n", "0-3"], "Argument 'n' must be at least 1, not 0."),
    (["grow", "--target", "12"], "Argument 'target' must be K:D"),
    (["grow", "--n", "5", "--max-steps", "0"], "Argument 'max_steps' must be at least 1"),
])
def test_cli_bad_input_is_one_line_and_status_2(cli, capsys, argv, message):
    assert cli(argv) == 2
    err = capsys.readouterr().err
    assert message in err and err.count("\n") == 1
