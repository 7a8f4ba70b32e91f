"""Regression tests of issue 17: every bad input refused in one line, no hangs on
absurd sizes, no injected text in exports. Each test is named after its point."""

from __future__ import annotations

import io
import json
import math
import os
import shutil
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from gf2codes.cli import main
from gf2codes.code import Code
from gf2codes.exceptions import Gf2CodesError, ParameterError, ParseError
from gf2codes.families import hamming
from gf2codes.formats import code_to_record, read_code, write_code

ROOT = Path(__file__).resolve().parents[1]
HAMMING74 = ["1000011", "0100101", "0010110", "0001111"]


def _record(**changes) -> dict:
    rec = {"record": "gf2codes/code", "version": 1, "n": 7, "k": 4, "d": 3,
           "generator": HAMMING74}
    rec.update(changes)
    return rec


def _write_json(path: Path, obj) -> Path:
    path.write_text(json.dumps(obj))
    return path


def _fails_in_one_line(capsys, argv, *needles: str) -> str:
    try:
        status = main(argv)
    except SystemExit as exc:  # argparse's errors (one line, status 2: see cli._Parser)
        status = exc.code
    err = capsys.readouterr().err
    assert status == 2, err
    assert len(err.strip().splitlines()) == 1 and "internal error" not in err, err
    for needle in needles:
        assert needle in err, err
    return err


def _cli(*args: str, stdin: bytes | None = None) -> subprocess.CompletedProcess:
    env = {**os.environ, "PYTHONPATH": str(ROOT)}
    return subprocess.run([sys.executable, "-m", "gf2codes", *args], input=stdin,
                          capture_output=True, env=env, timeout=300)


# ------------------------------------------------------------ internal errors -> exit 2


@pytest.mark.parametrize("key, value, needle", [
    ("d", "two", "'d' must be an integer or null"),
    ("d_lower", "x", "'d_lower' must be an integer or null"),
    ("d", [3], "'d' must be an integer or null"),
    ("d", True, "not bool"),
    ("d", 3.5, "not float"),
    ("d", -2, "'d' must be from 1 to n = 7"),
    ("d_upper", 99, "'d_upper' must be from 1 to n = 7"),
    ("n", "7", "'n' must be an integer"),
])
def test_record_distance_fields_of_the_wrong_type_are_refused(tmp_path, capsys, key, value,
                                                              needle):
    f = _write_json(tmp_path / "r.json", _record(**{key: value}))
    _fails_in_one_line(capsys, ["verify", str(f)], needle)


def test_record_with_contradictory_bounds_is_refused(tmp_path, capsys):
    f = _write_json(tmp_path / "r.json", _record(d=None, d_lower=4, d_upper=3))
    _fails_in_one_line(capsys, ["verify", str(f)], "greater than 'd_upper'")


def test_deeply_nested_json_is_a_parse_error(tmp_path, capsys):
    f = tmp_path / "deep.json"
    f.write_text('{"a":' * 100000 + "1" + "}" * 100000)
    _fails_in_one_line(capsys, ["verify", str(f)], "nested too deeply")
    g = _write_json(tmp_path / "deep2.json", _record(extra=[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[
        [[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[1]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]
        ]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]))
    _fails_in_one_line(capsys, ["verify", str(g)], "nested too deeply")


def test_record_version_as_a_string_says_the_type_is_wrong(tmp_path, capsys):
    f = _write_json(tmp_path / "v.json", _record(version="1"))
    err = _fails_in_one_line(capsys, ["verify", str(f)], "'version' must be an integer")
    assert "newer" not in err


@pytest.mark.parametrize("argv, needle", [
    (["verify", "{f}", "--target-d", "99999999999999999999999"], "--target-d"),
    (["verify", "{f}", "--seed", "-1"], "--seed"),
    (["search", "--k", "4", "--d", "3", "--seed", "-1", "--no-catalog"], "seed"),
    (["channel", "{f}", "--seed", "-1"], "--seed"),
    (["verify", "{f}", "--scheduler", "notaurl"], "--scheduler"),
    (["search", "--k", "4", "--d", "3", "--time-limit", "1e309", "--no-catalog"],
     "time_limit"),
    (["search", "--k", "4", "--d", "3", "--time-limit", "nan", "--no-catalog"], "time_limit"),
    (["verify", "{f}", "--time-limit", "1e309"], "--time-limit"),
    (["verify", "{f}", "--time-limit", "nan"], "--time-limit"),
    (["verify", "{f}", "--workers", "0"], "--workers"),
    (["verify", "{f}", "--pool", "-3"], "--pool"),
    (["channel", "{f}", "--confidence", "nan"], "--confidence"),
    (["channel", "{f}", "--simulate", "99999999999999999"], "--simulate"),
    (["channel", "{f}", "--p", "0.1:0.2:999999999999"], "count"),
    (["build", "hamming", "3", "--verify", "--time-limit", "-1"], "--time-limit"),
    (["catalog", "import", "{f}", "--time-limit", "inf"], "--time-limit"),
])
def test_every_numeric_option_rejects_absurd_values_in_one_line(tmp_path, capsys, argv,
                                                                needle):
    f = _write_json(tmp_path / "h.json", _record())
    argv = [a.replace("{f}", str(f)) for a in argv]
    if argv[0] == "catalog":
        argv[2:2] = ["--catalog", str(tmp_path / "c.sqlite")]
    _fails_in_one_line(capsys, argv, needle)


def test_argparse_rejections_are_one_line_exit_2(tmp_path):
    f = _write_json(tmp_path / "h.json", _record())
    for bad in (["--seed", "-1"], ["--time-limit", "inf"], ["--scheduler", "tcp://h:99999"]):
        r = _cli("verify", str(f), *bad)
        assert r.returncode == 2 and len(r.stderr.strip().splitlines()) == 1, r.stderr


@pytest.mark.parametrize("command", ["build", "derive", "search"])
def test_output_into_a_missing_folder_is_one_line_before_the_work(tmp_path, capsys, command):
    out = str(tmp_path / "nonexistent" / "x.json")
    f = _write_json(tmp_path / "h.json", _record())
    argv = {"build": ["build", "hamming", "3", "-o", out],
            "derive": ["derive", str(f), "extend", "-o", out],
            "search": ["search", "--k", "4", "--d", "3", "--no-catalog", "-o", out]}[command]
    _fails_in_one_line(capsys, argv, "--output", "not an existing folder")


def test_a_failed_write_prints_the_result_before_the_error(capsys):
    from gf2codes.cli._common import write_output

    def boom():
        raise OSError(28, "No space left on device")

    shown = []
    with pytest.raises(Gf2CodesError, match="No space left.*printed above"):
        write_output(boom, "out.json", lambda: shown.append("result"))
    assert shown == ["result"]


def test_puncture_range_is_checked_against_n_before_it_is_expanded(tmp_path, capsys):
    f = tmp_path / "h7.json"
    write_code(hamming(7), f, fmt="json")
    _fails_in_one_line(capsys, ["derive", str(f), "puncture", "0-999999999999"],
                       "out of range", "from 0 to 126")


# ----------------------------------------------------------- hangs on absurd sizes


def _verify_json(capsys, path: Path, *extra: str) -> dict:
    status = main(["verify", str(path), *extra, "--json"])
    out, err = capsys.readouterr()
    assert status == 0, err
    return json.loads(out)


def test_verify_of_a_1_by_100000_matrix_answers(tmp_path, capsys):
    row = (np.random.default_rng(1).random(100_000) < 0.5).astype(np.uint8)
    f = tmp_path / "wide.npy"
    np.save(f, row.reshape(1, -1))
    rep = _verify_json(capsys, f, "--time-limit", "30")
    assert rep["d"] == int(row.sum()) and rep["d_exact"]  # a [n, 1] code: d = weight of row
    assert rep["weight_distribution"][int(row.sum())] == 1
    assert rep["dual_distance"] == (1 if row.min() == 0 else 2)  # zero columns give 1
    assert "bounds" in rep["not_computed"]


def test_verify_of_a_1_by_1000_matrix_answers(tmp_path, capsys):
    row = np.ones((1, 1000), dtype=np.uint8)
    f = tmp_path / "rep.npy"
    np.save(f, row)
    rep = _verify_json(capsys, f)
    assert rep["d"] == 1000 and rep["dual_distance"] == 2  # repetition code; dual even-weight


def test_verify_of_the_full_space_does_not_enumerate_2_to_the_n(tmp_path, capsys):
    f = tmp_path / "id40.npy"
    np.save(f, np.eye(40, dtype=np.uint8))
    rep = _verify_json(capsys, f)
    assert rep["d"] == 1 and rep["k"] == 40
    assert rep["weight_distribution"] == [math.comb(40, i) for i in range(41)]
    assert rep["dual_distance"] is None and rep["not_computed"] == []


def test_verify_of_3000_rows_of_rank_40(tmp_path, capsys):
    rng = np.random.default_rng(5)
    M = (rng.integers(0, 2, (3000, 40)) & 1).astype(np.uint8)
    f = tmp_path / "tall.npy"
    np.save(f, M)
    rep = _verify_json(capsys, f)
    assert rep["k"] == 40 and rep["dropped_rows"] == 2960 and rep["d"] == 1


def test_verify_time_limit_covers_the_whole_report(capsys, tmp_path):
    f = tmp_path / "h10.json"
    write_code(hamming(10), f, fmt="json")
    rep = _verify_json(capsys, f, "--time-limit", "1")
    # d of a Hamming code is proved quickly; the parts that did not fit are listed
    assert rep["d_lower"] <= 3 <= rep["d_upper"]
    for part in rep["not_computed"]:
        assert part in ("weight distribution", "dual distance", "bounds")
    if rep["weight_distribution"] is None:
        assert "weight distribution" in rep["not_computed"]
    assert rep["upper_bound"] is None and "bounds" in rep["not_computed"]  # n > 256, timed


@pytest.mark.slow
def test_verify_of_hamming_4095_with_a_time_limit_answers(capsys, tmp_path):
    f = tmp_path / "h12.json"
    write_code(hamming(12), f, fmt="json")
    rep = _verify_json(capsys, f, "--time-limit", "5")
    assert rep["d_lower"] <= 3 <= rep["d_upper"]


@pytest.mark.slow
def test_channel_on_hamming_4095_answers(capsys, tmp_path):
    f = tmp_path / "h12.json"
    write_code(hamming(12), f, fmt="json")
    assert main(["channel", str(f), "--p", "1e-3", "--json"]) == 0
    rep = json.loads(capsys.readouterr().out)["codes"][0]
    assert rep["coset_leaders"] == [1, 4095]  # perfect: MacWilliams & Sloane ch. 1 §3


def test_channel_binomials_match_math_comb():
    from gf2codes.decoding.probability import _binomials

    for n in (0, 1, 7, 64, 300):
        assert list(_binomials(n)) == [math.comb(n, i) for i in range(n + 1)]


def test_export_refuses_a_huge_c_header_before_any_work(monkeypatch):
    from gf2codes import export

    def never(*a, **k):
        raise AssertionError("the systematic form was computed before refusing")

    monkeypatch.setattr(export, "systematic_encoder", never)
    code = Code(np.ones((1, 100_000), dtype=np.uint8))
    with pytest.raises(ParameterError, match="at most 65535"):
        export.export_code(code, "c")


# ---------------------------------------------------------------- unclear, inconsistent


@pytest.mark.parametrize("argv", [["catalog", "list"], ["channel", "{h}"], ["verify", "{h}"],
                                  ["export", "{h}", "--format", "text"],
                                  ["build", "hamming", "5"]])
def test_broken_pipe_is_exit_0_for_every_command(tmp_path, argv):
    h = tmp_path / "h.json"
    write_code(hamming(5), h, fmt="json")
    argv = [a.replace("{h}", str(h)) for a in argv]
    if argv[0] == "catalog":
        argv += ["--catalog", str(tmp_path / "c.sqlite")]
    env = {**os.environ, "PYTHONPATH": str(ROOT), "COLUMNS": "20"}
    proc = subprocess.Popen([sys.executable, "-m", "gf2codes", *argv], stdout=subprocess.PIPE,
                            stderr=subprocess.PIPE, env=env)
    proc.stdout.readline()
    proc.stdout.close()  # the reader goes away, as `| head -1` does
    err = proc.stderr.read().decode()
    proc.stderr.close()
    assert proc.wait(timeout=300) == 0, err
    assert "Traceback" not in err and "Broken pipe" not in err, err


def test_control_characters_in_file_names_are_made_visible(tmp_path, capsys):
    name = str(tmp_path / "evil\x1b[31m\nname.txt")
    err = _fails_in_one_line(capsys, ["verify", name], "no such file")
    assert "\x1b" not in err and "\\x1b" in err and "\\n" in err


def test_control_characters_in_code_names_are_made_visible(tmp_path, capsys):
    f = _write_json(tmp_path / "e.json", _record(name="evil\x1b[2J\nname"))
    assert main(["derive", str(f), "extend"]) == 0
    assert main(["build", "hamming", "3"]) == 0
    out = capsys.readouterr().out
    assert "\x1b" not in out


def test_a_record_after_100_leading_spaces_is_read_as_a_record(tmp_path):
    f = tmp_path / "spaced.json"
    f.write_text(" " * 100 + "\n\t" * 50 + json.dumps(_record()))
    assert read_code(f).d == 3


def test_dev_zero_and_fifos(tmp_path, capsys):
    _fails_in_one_line(capsys, ["verify", "/dev/zero"], "NUL bytes")
    fifo = tmp_path / "fifo"
    os.mkfifo(fifo)
    writer = subprocess.Popen(["sh", "-c", f"cat > '{fifo}'"], stdin=subprocess.PIPE)
    writer.stdin.write(json.dumps(_record()).encode())
    writer.stdin.close()
    rec = read_code(fifo)  # a pipe is read like a file
    writer.wait(timeout=30)
    assert rec.code.n == 7 and rec.d == 3


def test_verify_dash_reads_standard_input():
    r = _cli("verify", "-", "--json", stdin=json.dumps(_record()).encode())
    assert r.returncode == 0, r.stderr
    assert json.loads(r.stdout)["d"] == 3
    r = _cli("verify", "-", stdin=b"")
    err = r.stderr.decode()
    assert r.returncode == 2 and "standard input" in err and "empty" in err


def test_equivalent_undecided_has_its_own_status(tmp_path, capsys, monkeypatch):
    from gf2codes import equivalence
    from gf2codes.cli import _equivalent

    class Undecided:
        equivalent = None
        permutation = None
        reason = "the search budget ran out"

    monkeypatch.setattr(equivalence, "are_equivalent", lambda a, b: Undecided())
    f = _write_json(tmp_path / "h.json", _record())
    assert main(["equivalent", str(f), str(f)]) == _equivalent.UNDECIDED == 4
    assert "undecided" in capsys.readouterr().out


def test_catalog_import_exit_1_is_documented(tmp_path, capsys):
    lines = tmp_path / "lines.jsonl"
    lines.write_text(json.dumps(_record()) + "\n{not json\n")
    status = main(["catalog", "import", str(lines), "--catalog", str(tmp_path / "c.sqlite")])
    assert status == 1
    with pytest.raises(SystemExit):
        main(["catalog", "import", "--help"])
    assert "1 when some lines were rejected" in " ".join(capsys.readouterr().out.split())


def test_gray_count_states_the_codewords_of_the_code(tmp_path, capsys):
    f = _write_json(tmp_path / "h.json", _record())
    assert main(["verify", str(f)]) == 0
    out = " ".join(capsys.readouterr().out.split())
    assert "all 2^4 = 16 codewords" in out


# -------------------------------------------------------------- exports are data


HOSTILE = "evil */ int injected_by_name = 1; /* rest\n#include <stdio.h>\n& <x> \x00 \x1b[31m"


def _hostile_and_benign(tmp_path: Path) -> tuple[Path, Path]:
    return (_write_json(tmp_path / "evil.json", _record(name=HOSTILE)),
            _write_json(tmp_path / "good.json", _record(name="benign")))


@pytest.mark.skipif(shutil.which("cc") is None, reason="needs a C compiler")
def test_exported_c_header_holds_exactly_the_expected_declarations(tmp_path, capsys):
    evil, good = _hostile_and_benign(tmp_path)
    headers = []
    for src in (evil, good):
        out = tmp_path / (src.stem + ".h")
        assert main(["export", str(src), "--format", "c", "-o", str(out)]) == 0
        headers.append(out)
    # 1. it compiles cleanly, and defining the injected name afterwards is no clash
    test_c = tmp_path / "t.c"
    test_c.write_text(f'#include "{headers[0].name}"\nint injected_by_name = 2;\n'
                      "int main(void) { return GF2CODE_N == 7 ? 0 : 1; }\n")
    subprocess.run(["cc", "-std=c99", "-Wall", "-Werror", "-c", str(test_c), "-o",
                    str(tmp_path / "t.o")], check=True, cwd=tmp_path, timeout=120)
    # 2. after preprocessing (comments gone) it is token for token the header of the
    #    same code under a benign name: the name added no declaration at all
    pre = [subprocess.run(["cc", "-std=c99", "-E", "-P", "-dD", "-undef", "-nostdinc",
                           "-D__STDC_VERSION__=199901L", "-DUINT64_C(x)=x", "-x", "c", "-"],
                          input=h.read_text().replace("#include <stdint.h>", ""),
                          capture_output=True, text=True, check=True).stdout for h in headers]
    strip = [
        "\n".join(line for line in p.splitlines() if line.strip()
                  and not line.startswith("#define __") and "UINT64_C" not in line)
        for p in pre]
    assert strip[0] == strip[1]
    assert "injected_by_name" not in strip[0] and "stdio" not in strip[0]


def test_text_exports_of_a_hostile_name_read_back_as_the_same_code(tmp_path, capsys):
    evil, _ = _hostile_and_benign(tmp_path)
    out = tmp_path / "out.txt"
    assert main(["export", str(evil), "--format", "text", "-o", str(out)]) == 0
    assert read_code(out).code.n == 7 and read_code(out).code.k == 4
    derived = tmp_path / "derived.txt"
    assert main(["derive", str(evil), "extend", "-o", str(derived)]) == 0
    lines = derived.read_text().splitlines()
    assert lines[0].startswith("# [8, 4]") and len(lines) == 5  # header + 4 rows
    code = read_code(derived).code
    assert (code.n, code.k) == (8, 4)


def test_graphml_export_of_a_hostile_name_is_valid_xml(tmp_path, capsys):
    import networkx as nx

    evil, _ = _hostile_and_benign(tmp_path)
    out = tmp_path / "g.graphml"
    assert main(["export", str(evil), "--format", "graphml", "-o", str(out)]) == 0
    g = nx.read_graphml(out)
    assert "\n" not in g.graph["name"] and "\x00" not in g.graph["name"]
    assert g.number_of_nodes() == 10


def test_plot_titles_escape_math_mode(tmp_path, capsys):
    from gf2codes.formats import one_line

    assert one_line("a $x^2$ b", extra="$") == "a \\x24x^2\\x24 b"


# ------------------------------------------------------------------ resource limits


def test_a_matrix_over_the_entry_limit_is_refused_before_expansion(tmp_path, capsys,
                                                                    monkeypatch):
    monkeypatch.setenv("GF2CODES_MAX_ENTRIES", "20")
    f = _write_json(tmp_path / "h.json", _record())
    _fails_in_one_line(capsys, ["verify", str(f)], "28 entries", "GF2CODES_MAX_ENTRIES")
    big = tmp_path / "big.npy"
    np.save(big, np.zeros((5, 5), dtype=np.uint8))
    _fails_in_one_line(capsys, ["verify", str(big)], "5 x 5 entries")
    monkeypatch.setenv("GF2CODES_MAX_ENTRIES", "many")
    _fails_in_one_line(capsys, ["verify", str(f)], "GF2CODES_MAX_ENTRIES")


def test_float_npy_of_exact_zeros_and_ones_is_accepted(tmp_path):
    f = tmp_path / "f.npy"
    np.save(f, np.array([[1.0, 0.0, 1.0], [0.0, 1.0, 1.0]]))
    assert read_code(f).code.k == 2
    np.save(f, np.array([[1.0, 0.5, 1.0]]))
    with pytest.raises(ParseError, match="only 0 and 1"):
        read_code(f)
    np.save(f, np.array([[1.0, np.nan]]))
    with pytest.raises(ParseError, match="only 0 and 1"):
        read_code(f)


# --------------------------------------------- the fast transforms against brute force


def _brute_distribution(G: np.ndarray) -> list[int]:
    k, n = G.shape
    out = [0] * (n + 1)
    for m in range(1 << k):
        bits = np.array([(m >> i) & 1 for i in range(k)], dtype=np.uint8)
        out[int(((bits @ G) % 2).sum())] += 1
    return out


@settings(max_examples=60, deadline=None, derandomize=True)
@given(st.integers(1, 10).flatmap(lambda n: st.tuples(
    st.just(n), st.lists(st.lists(st.integers(0, 1), min_size=n, max_size=n), min_size=1,
                         max_size=n))))
def test_macwilliams_and_dual_distance_agree_with_brute_force(case):
    from gf2codes.weights import (
        dual_distance,
        krawtchouk,
        macwilliams_transform,
        weight_distribution,
    )

    n, rows = case
    try:
        code = Code(np.array(rows, dtype=np.uint8))
    except ParameterError:  # rank 0
        return
    A = _brute_distribution(np.asarray(code.G))  # computed by brute force in this test
    assert weight_distribution(code) == A
    if code.k == code.n:
        assert dual_distance(code, A) is None
        return
    B = _brute_distribution(np.asarray(code.dual().G))
    assert macwilliams_transform(A) == B
    # the old, direct definition of the transform (MacWilliams & Sloane ch. 5 §2)
    assert [sum(A[i] * krawtchouk(j, i, n) for i in range(n + 1)) // sum(A)
            for j in range(n + 1)] == B
    assert dual_distance(code, A) == min(j for j in range(1, n + 1) if B[j])


def test_code_to_record_round_trip_keeps_fields(tmp_path):
    rec = code_to_record(hamming(3), d=3)
    f = _write_json(tmp_path / "r.json", rec)
    back = read_code(f)
    assert back.d == 3 and back.code == hamming(3)


def test_read_input_bytes_limits_a_stream(tmp_path, monkeypatch):
    from gf2codes.formats import read_input_bytes

    monkeypatch.setattr(sys, "stdin", io.TextIOWrapper(io.BytesIO(b"1 0 1\n")))
    assert read_input_bytes("-") == b"1 0 1\n"
    with pytest.raises(ParseError, match="bytes"):
        f = tmp_path / "long.txt"
        f.write_bytes(b"1" * (8 * 10 + (1 << 20) + 1))
        read_input_bytes(f, limit=10)


def test_route_estimates_do_not_overflow_for_huge_k():
    """Hamming [2047,2036]: 2.0 ** 2036 overflowed and verify exited 3."""
    from gf2codes.distance import route_estimates

    est = route_estimates(hamming(11), 3)
    assert est["gray"] == math.inf and est["dual-columns"] < math.inf
