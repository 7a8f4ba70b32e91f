"""`gf2codes channel` end to end (moved from test_decoding.py, bodies unchanged), and the
channel report object behind it."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest

from gf2codes import decoding as D
from gf2codes.cli import main
from gf2codes.families import extended_golay, hamming, reed_muller
from gf2codes.formats import write_code

ROOT = Path(__file__).resolve().parents[1]


def run_cli(capsys, *argv):
    status = main([str(a) for a in argv])
    out, err = capsys.readouterr()
    return status, out, err


# ----------------------------------------------------------------------- CLI


@pytest.fixture(scope="module")
def files(tmp_path_factory):
    d = tmp_path_factory.mktemp("channel")
    write_code(hamming(3), d / "hamming.txt")
    write_code(extended_golay(), d / "golay.json", d=8)
    write_code(reed_muller(2, 6), d / "rm26.txt")  # [64, 22]: n - k = 42
    return d


def test_channel_table(capsys, files):
    status, out, _ = run_cli(capsys, "channel", files / "hamming.txt", files / "golay.json",
                             "--p", "1e-4", "1e-3", "1e-2")
    assert status == 0
    lines = out.splitlines()
    assert f"{files / 'hamming.txt'}  BSC  n=7 k=4 d=3 t=1" in lines
    assert any(ln.startswith(f"{files / 'golay.json'}  BSC  n=24 k=12 d=8 t=3") for ln in lines)
    assert "2.093e-05" in out  # Hamming, p = 1e-3: 1 - q^7 - 7pq^6 = 2.0930e-05
    # Golay coset leaders: C(24, i) for i <= 3, then 2^12 - 2325 = 1771 of weight 4
    assert "L0=1 L1=24 L2=276 L3=2024 L4=1771" in out
    assert "weight distribution: A0=1 A8=759 A12=2576 A16=759 A24=1" in out  # M&S ch. 2 §6


def test_channel_json_agrees_with_closed_form(capsys, files):
    status, out, _ = run_cli(capsys, "channel", files / "hamming.txt", "--p", "1e-3:1e-1:3",
                             "--json")
    assert status == 0
    rep = json.loads(out)["codes"][0]
    assert rep["coset_leaders"] == [1, 7] and rep["d"] == 3 and rep["t"] == 1
    assert [pt["p"] for pt in rep["points"]] == [1e-3, 1e-2, 1e-1]
    for pt in rep["points"]:
        p = pt["p"]
        assert pt["block_error"] == pytest.approx(1 - (1 - p)**7 - 7 * p * (1 - p)**6,
                                                  rel=1e-10)


def test_channel_simulate_json(capsys, files):
    status, out, _ = run_cli(capsys, "channel", files / "golay.json", "--p", "0.1",
                             "--simulate", "4000", "--seed", "3", "--json")
    assert status == 0
    pt = json.loads(out)["codes"][0]["points"][0]
    sim = pt["simulation"]
    assert sim["trials"] == 4000 and sim["seed"] == [3, 0, 0]
    assert sim["block_error"]["lower"] <= pt["block_error"] <= sim["block_error"]["upper"]


@pytest.mark.parametrize("argv, message", [
    (["--p", "2"], "Argument '--p' must be between 0 and 1, not 2."),
    (["--p=-1e-3"], "Argument '--p' must be between 0 and 1"),
    (["--p", "abc"], "Argument '--p' must be a number or a range"),
    (["--p", "0:0.1:5"], "log-spaced range must start above 0"),
    (["--p", "1e-1:1e-3:4"], "increasing range"),
])
def test_channel_bad_p(capsys, files, argv, message):
    status, _, err = run_cli(capsys, "channel", files / "hamming.txt", *argv)
    assert status == 2
    assert err.startswith("gf2codes channel: error: ") and message in err
    assert err.count("\n") == 1


def test_channel_too_large_points_to_simulate(capsys, files):
    status, _, err = run_cli(capsys, "channel", files / "rm26.txt", "--p", "1e-3")
    assert status == 2
    assert "2^42" in err and "n - k = 42 > 26" in err and "--simulate N" in err
    assert err.count("\n") == 1


def test_channel_large_code_simulates(capsys, files):
    status, out, _ = run_cli(capsys, "channel", files / "rm26.txt", "--p", "0.05",
                             "--simulate", "500", "--json")
    assert status == 0
    rep = json.loads(out)["codes"][0]
    pt = rep["points"][0]
    assert pt["block_error"] is None and rep["d"] == 16
    assert "information-set" in pt["simulation"]["decoder"]
    assert pt["bounded_distance_failure"] is not None


def test_channel_subprocess(files):
    proc = subprocess.run(
        [sys.executable, "-m", "gf2codes", "channel", str(files / "hamming.txt"),
         "--p", "0.01", "--json"],
        capture_output=True, text=True, cwd=ROOT, env={"PYTHONPATH": str(ROOT), "PATH": ""},
        timeout=120)
    assert proc.returncode == 0, proc.stderr
    assert json.loads(proc.stdout)["codes"][0]["points"][0]["block_error"] == pytest.approx(
        1 - 0.99**7 - 7 * 0.01 * 0.99**6)


# ------------------------------------------------------------------- the report object


def test_channel_report_to_dict_is_the_json_entry(capsys, files, monkeypatch):
    import gf2codes.cli._channel as channel_cli

    seen = []

    def recording(*args, **kwargs):
        rep = D.channel_report(*args, **kwargs)
        seen.append(rep)
        return rep

    monkeypatch.setattr(channel_cli, "channel_report", recording)
    status, out, _ = run_cli(capsys, "channel", files / "hamming.txt", files / "golay.json",
                             "--p", "0.01", "--simulate", "500", "--json")
    assert status == 0
    printed = json.loads(out)["codes"]
    assert [rep.to_dict() for rep in seen] == printed
    # the same figures as bsc_performance (which the report reuses)
    exact = D.bsc_performance(hamming(3), [0.01])[0]
    assert seen[0].points[0].block_error == exact.block_error
    assert seen[0].points[0].undetected_error == exact.undetected_error
