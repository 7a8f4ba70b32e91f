"""`gf2codes verify` end to end: called in-process and through a real subprocess."""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest

from gf2codes.cli import main
from gf2codes.formats import write_code

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "examples" / "orchard-valve-link.txt"


def _run(*args: str) -> subprocess.CompletedProcess:
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    return subprocess.run([sys.executable, "-m", "gf2codes", *args], capture_output=True,
                          text=True, env=env, timeout=300)


def _json(capsys, *args: str) -> dict:
    assert main(["verify", *args, "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def test_json_keys_and_values_for_extended_golay(tmp_path, capsys, golay24):
    f = tmp_path / "g24.txt"
    write_code(golay24, f)
    out = _json(capsys, str(f))
    # [24,12,8], weight distribution 1, 759, 2576, 759, 1: MacWilliams & Sloane, ch. 2 §6.
    assert (out["n"], out["k"], out["d"], out["d_lower"], out["d_upper"]) == (24, 12, 8, 8, 8)
    assert out["d_exact"] is True
    wd = out["weight_distribution"]
    assert len(wd) == 25 and [wd[i] for i in (0, 8, 12, 16, 24)] == [1, 759, 2576, 759, 1]
    assert len(out["witness"]) == 24 and out["witness"].count("1") == 8
    assert out["corrects"] == 3 and out["detects"] == 7 and out["dual_distance"] == 8
    assert out["properties"]["self_dual"] and out["properties"]["doubly_even"]
    # The extended Golay code is optimal: no [24,12,9] binary linear code exists.
    assert out["optimal"] is True and out["upper_bound"]["d"] == 8
    assert out["least_length"]["n"] == 24


def test_demo_file_and_table_output(capsys):
    assert main(["verify", str(DEMO)]) == 0
    out = capsys.readouterr().out
    # the first line leads with the file, the verdict and the parameters
    assert out.splitlines()[0] == f"{DEMO}  PROVED  n=22 k=16 d=4"
    assert "A0=1 A4=255 A6=2264" in out and "4:255" not in out


def test_first_line_of_an_unproved_code(tmp_path, capsys):
    rng = np.random.default_rng(12)
    G = np.hstack([np.eye(60, dtype=np.uint8), rng.integers(0, 2, (60, 140))])
    f = tmp_path / "big.txt"
    f.write_text("\n".join("".join(map(str, r)) for r in G) + "\n")
    assert main(["verify", str(f), "--time-limit", "0.3"]) == 0
    first = capsys.readouterr().out.splitlines()[0]
    assert first.startswith(f"{f}  NOT PROVED  n=200 k=60  ") and " ≤ d ≤ " in first


def test_parity_check_input(tmp_path, capsys, hamming74):
    f = tmp_path / "H.txt"
    f.write_text("\n".join("".join(map(str, r)) for r in hamming74.H) + "\n")
    out = _json(capsys, str(f), "--parity-check")
    assert (out["n"], out["k"], out["d"]) == (7, 4, 3)
    assert out["weight_distribution"] == [1, 0, 0, 7, 7, 0, 0, 1]


def test_dependent_rows_are_reported(tmp_path, capsys, hamming74):
    f = tmp_path / "dup.txt"
    write_code(hamming74, f)
    f.write_text(f.read_text() + "1000011\n")
    assert main(["verify", str(f)]) == 0
    captured = capsys.readouterr()
    assert "1 row(s)" in captured.err and "dropped" in captured.err


def test_target_and_time_limit(tmp_path, capsys):
    from gf2codes.families import bch

    # our own builder (galois.BCH(127, 64) takes 11 s; the two agree in test_families)
    code = bch(127, 21)
    assert (code.n, code.k) == (127, 64)
    C = code.G
    f = tmp_path / "bch.npy"
    np.save(f, C)
    out = _json(capsys, str(f), "--time-limit", "0.5")
    # BCH [127,64] has d = 21 (MacWilliams & Sloane, appendix A, from memory; proved by
    # scripts/bench_distance.py): not provable in 0.5 s.
    assert out["d"] is None and out["d_exact"] is False
    assert out["d_lower"] <= 21 <= out["d_upper"]
    assert out["weight_distribution"] is None
    out = _json(capsys, str(f), "--target-d", "5")
    assert out["meets_target"] is True
    assert main(["verify", str(f), "--time-limit", "0.5"]) == 0
    assert "NOT PROVED" in capsys.readouterr().out


def test_fast_method(tmp_path, capsys, golay24):
    f = tmp_path / "g.json"
    write_code(golay24, f)
    out = _json(capsys, str(f), "--method", "fast")
    assert out["d_lower"] <= 8 <= out["d_upper"]


@pytest.mark.parametrize("content, message", [
    ("101\n10\n", "line 2: this row has 2 entries"),
    ("1a1\n", "line 1, column 2"),
    ("", "the file is empty"),
    ("000\n000\n", "k = 0"),
])
def test_bad_input_is_one_line_without_traceback(tmp_path, content, message):
    f = tmp_path / "bad.txt"
    f.write_text(content)
    r = _run("verify", str(f))
    assert r.returncode == 2
    assert message in r.stderr and "Traceback" not in r.stderr
    assert len(r.stderr.strip().splitlines()) == 1


def test_too_expensive_points_to_the_options(tmp_path):
    from gf2codes.families import bch

    f = tmp_path / "big.npy"
    # BCH [127,71] with its columns scrambled: not cyclic as written (the cyclic shifts
    # bring the proof of the code itself within reach, about 5e11 codewords)
    code = bch(127, 17)
    assert (code.n, code.k) == (127, 71)
    G = code.G
    np.save(f, G[:, np.random.default_rng(127).permutation(127)])
    r = _run("verify", str(f))
    assert r.returncode == 2 and "Traceback" not in r.stderr
    assert "--time-limit" in r.stderr and "--method fast" in r.stderr and "codewords" in r.stderr


def test_bad_options(tmp_path):
    r = _run("verify", str(DEMO), "--time-limit", "0")
    assert r.returncode == 2 and "above 0" in r.stderr
    r = _run("verify", str(tmp_path / "missing.txt"))
    assert r.returncode == 2 and "no such file" in r.stderr


def test_module_entry_point_runs_the_demo():
    r = _run("verify", str(DEMO), "--json")
    assert r.returncode == 0, r.stderr
    assert json.loads(r.stdout)["d"] == 4


def test_a_wrong_statement_in_the_file_is_reported(tmp_path, capsys, hamming74):
    f = tmp_path / "claims.json"
    write_code(hamming74, f, d=4)  # the [7,4] Hamming code has d = 3, not 4
    out = _json(capsys, str(f))
    assert out["d"] == 3 and "d = 4" in out["stated_wrong"]
    assert any("contradicts" in note for note in out["notes"])


def test_an_internal_error_is_one_line_with_status_3(monkeypatch, capsys, tmp_path):
    import gf2codes.cli._verify as verify_cli

    def broken(*args, **kwargs):
        raise ZeroDivisionError("simulated bug")

    monkeypatch.setattr(verify_cli, "verify", broken)
    monkeypatch.delenv("GF2CODES_DEBUG", raising=False)
    assert main(["verify", str(DEMO)]) == 3
    err = capsys.readouterr().err
    assert "internal error (ZeroDivisionError: simulated bug)" in err
    assert len(err.strip().splitlines()) == 1
    monkeypatch.setenv("GF2CODES_DEBUG", "1")
    with pytest.raises(ZeroDivisionError):
        main(["verify", str(DEMO)])


def test_many_files_and_a_directory_with_a_bad_file_among_good_ones(tmp_path, capsys,
                                                                      hamming74, golay24):
    """Issue 11: one call proves every file; a bad one is named and does not stop the rest."""
    folder = tmp_path / "layouts"
    folder.mkdir()
    write_code(hamming74, folder / "a-hamming.txt")
    (folder / "b-broken.txt").write_text("0102\n1100\n")
    write_code(golay24, folder / "c-golay.json")
    (folder / "notes.md").write_text("not a matrix, and not read: wrong ending\n")
    assert main(["verify", str(folder), "--json"]) == 2
    captured = capsys.readouterr()
    reports = [json.loads(line) for line in captured.out.splitlines()]
    assert [(r["source"].rsplit("/", 1)[-1], r["n"], r["k"], r["d"]) for r in reports] == [
        ("a-hamming.txt", 7, 4, 3), ("c-golay.json", 24, 12, 8)]
    assert "b-broken.txt" in captured.err and "1 of 3 files failed" in captured.err
    assert "Traceback" not in captured.err


def test_many_files_as_arguments_text_reports(tmp_path, capsys, hamming74):
    files = []
    for i in range(3):
        f = tmp_path / f"h{i}.txt"
        write_code(hamming74, f)
        files.append(str(f))
    assert main(["verify", *files]) == 0
    out = capsys.readouterr().out
    lines = out.splitlines()
    assert all(f"{f}  PROVED  n=7 k=4 d=3" in lines for f in files)


def test_a_directory_without_matrix_files_is_one_error_line(tmp_path):
    (tmp_path / "readme.md").write_text("nothing here\n")
    proc = _run("verify", str(tmp_path))
    assert proc.returncode == 2 and "holds no matrix files" in proc.stderr
    assert len(proc.stderr.strip().splitlines()) == 1


def test_plot_takes_one_input(tmp_path, hamming74):
    for i in range(2):
        write_code(hamming74, tmp_path / f"h{i}.txt")
    proc = _run("verify", str(tmp_path), "--plot", str(tmp_path / "w.png"))
    assert proc.returncode == 2 and "--plot" in proc.stderr


def test_the_route_and_its_reason_are_named(tmp_path, capsys):
    from gf2codes import families

    f = tmp_path / "bch127_106.txt"
    write_code(families.bch(127, 7), f)  # [127, 106, 7]: MacWilliams & Sloane, fig. 9.1
    out = _json(capsys, str(f), "--time-limit", "60")
    assert out["d"] == 7 and out["d_method"].startswith("dual-columns")
    assert out["d_route_reason"].startswith("cheapest estimate")
    est = out["d_route_estimates_s"]
    assert set(est) == {"gray", "brouwer-zimmermann", "dual-columns"}
    assert est["dual-columns"] == min(est.values())
    assert out["d_information_sets"] == []  # none: the dual-side route used no sets
    assert main(["verify", str(f), "--time-limit", "60"]) == 0
    text = capsys.readouterr().out
    assert "route" in text and "dual-columns: cheapest estimate" in text
    assert "column subsets" in text


def test_information_sets_in_json(tmp_path, capsys, golay24):
    f = tmp_path / "g24.txt"
    write_code(golay24, f)
    out = _json(capsys, str(f))
    if out["d_method"].startswith("brouwer-zimmermann"):
        sets = out["d_information_sets"]
        assert sets and sets[0]["rank"] == 12
        assert all({"rank", "levels_done", "contribution", "argument"} <= set(s)
                   for s in sets)
        assert out["d_argument"] == sets[0]["argument"]
    else:  # Gray code: no information sets
        assert out["d_information_sets"] == []


def test_an_unreadable_directory_is_one_error_line(tmp_path, monkeypatch, capsys):
    """Simulated (the tests may run as root, whom chmod does not stop)."""
    folder = tmp_path / "locked"
    folder.mkdir()

    def denied(path):
        raise PermissionError(13, "Permission denied", str(path))

    monkeypatch.setattr(os, "listdir", denied)
    assert main(["verify", str(folder)]) == 2
    err = capsys.readouterr().err
    assert "cannot read the directory" in err and "Permission denied" in err
    assert err.count("\n") == 1


def _record(code, **fields) -> dict:
    from gf2codes.formats import code_to_record

    return code_to_record(code, **fields)


def test_cyclic_structure_is_detected_in_a_plain_matrix_file(tmp_path, capsys):
    """QR [47,24,11] (MacWilliams & Sloane ch. 16) written as a bare matrix: verify finds
    the cyclic shifts by itself and names the argument and the group."""
    from gf2codes import families

    f = tmp_path / "qr47.txt"
    write_code(families.quadratic_residue(47), f)
    out = _json(capsys, str(f))
    assert out["d"] == 11
    if out["d_method"].startswith("brouwer-zimmermann"):
        assert out["d_argument"] == "cyclic-window"
        assert out["d_symmetry"]["kind"] == "cyclic" and out["d_symmetry"]["orbits"] == 1
        s = out["d_information_sets"][0]
        assert s["argument"] == "cyclic-window" and s["bound"] >= 11 and "images" in s
    assert main(["verify", str(f)]) == 0
    text = capsys.readouterr().out
    assert "lower bound by" in text and "cyclic shifts" in text


def test_automorphisms_in_a_record_are_checked_and_used(tmp_path, capsys):
    """A scrambled QR [47,24,11] is not cyclic as written; the record gives the
    conjugated shift, which is checked and credited."""
    from gf2codes import families
    from gf2codes.code import Code

    C = families.quadratic_residue(47)
    perm = np.random.default_rng(3).permutation(47)
    D = Code(C.G[:, perm])
    inv = np.argsort(perm)
    conj = [int(inv[(int(perm[j]) + 1) % 47]) for j in range(47)]
    f = tmp_path / "scrambled.json"
    f.write_text(json.dumps(_record(D, automorphisms=[conj])))
    out = _json(capsys, str(f))
    assert out["d"] == 11
    if out["d_method"].startswith("brouwer-zimmermann"):
        assert out["d_argument"].startswith("orbit-average")
        assert out["d_symmetry"]["kind"] in ("given", "cyclic+given", "quasi-cyclic+given")


@pytest.mark.parametrize("bad, message", [
    ("swap", "does not map the code to itself"),
    ("short", "permutations of range(47)"),
    ("repeat", "appears twice"),
    ("text", "must be a list of permutations"),
    ("floats", "must hold integers"),
])
def test_a_wrong_automorphism_is_one_error_line(tmp_path, bad, message):
    from gf2codes import families

    C = families.quadratic_residue(47)
    swap = list(range(47))
    swap[0], swap[1] = 1, 0
    value = {"swap": [swap], "short": [list(range(46))], "repeat": [[0] * 47],
             "text": "cyclic", "floats": [[float(i) for i in range(47)]]}[bad]
    f = tmp_path / "bad.json"
    f.write_text(json.dumps(_record(C, automorphisms=value)))
    proc = _run("verify", str(f))
    assert proc.returncode == 2
    assert message in proc.stderr and "bad.json" in proc.stderr
    assert len(proc.stderr.strip().splitlines()) == 1


def test_weights_never_proves_d_only(tmp_path, capsys, golay24):
    f = tmp_path / "g24.txt"
    write_code(golay24, f)
    out = _json(capsys, str(f), "--weights", "never")
    assert out["d"] == 8 and out["d_exact"] is True and out["weight_distribution"] is None
    assert "weight distribution" in out["not_computed"]
    assert main(["verify", str(f), "--weights", "never"]) == 0
    text = capsys.readouterr().out
    assert "not asked for" in text and "PROVED" in text


def test_bad_weights_value_is_one_line_and_status_2(tmp_path, golay24):
    f = tmp_path / "g24.txt"
    write_code(golay24, f)
    p = _run("verify", str(f), "--weights", "sometimes")
    assert p.returncode == 2 and "Traceback" not in p.stderr
    assert "--weights" in p.stderr
