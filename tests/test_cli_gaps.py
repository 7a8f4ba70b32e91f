"""The ``gaps`` command (moved from test_growth.py; bodies unchanged)."""

from __future__ import annotations

import pytest


@pytest.fixture
def cli(monkeypatch, tmp_path):
    """``gf2codes.cli.main`` with a private catalog."""
    from gf2codes import cli as cli_module

    monkeypatch.setenv("GF2CODES_CATALOG", str(tmp_path / "cli.sqlite"))
    return cli_module.main


# gaps on a grown catalog is checked by test_cli_grow.py::test_cli_grow_and_gaps
@pytest.mark.parametrize("argv, message", [
    (["gaps", "--n", "3", "--show", "-2"], "Argument 'show' must be at least -1, not -2."),
])
def test_cli_bad_input_is_one_line_and_status_2(cli, capsys, argv, message):
    assert cli(argv) == 2
    err = capsys.readouterr().err
    assert message in err and err.count("\n") == 1
