"""Property-based hardening test of the whole command line (issue 17).

Random bytes, random JSON (well-formed records with one field garbled, and
arbitrary documents) and random option values are fed to ``main(argv)`` in this
process. Whatever the input, the command must end with a documented exit status
(0, or 2 for bad input; ``equivalent`` also 1 and 4), never 3 (an internal error)
and never a traceback; and whenever ``verify`` claims a proof on such an input,
the claim is checked by brute force against the matrix the file really holds.

The default run is bounded (a few dozen examples per test); ``-m slow`` runs the
long variant (``GF2CODES_FUZZ_EXAMPLES``, default 20000 examples per command).
"""

from __future__ import annotations

import contextlib
import io
import itertools
import json
import os
import tempfile
from pathlib import Path

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from gf2codes.cli import main
from gf2codes.code import Code
from gf2codes.formats import read_code

DEFAULT_EXAMPLES = 25
SLOW_EXAMPLES = int(os.environ.get("GF2CODES_FUZZ_EXAMPLES", "20000"))
_SETTINGS = dict(deadline=None, derandomize=True, database=None,
                 suppress_health_check=list(HealthCheck))

#: Examples run, by command (printed by the slow test for the report).
COUNTS: dict[str, int] = {}
#: With ``GF2CODES_FUZZ_LOG=FILE``, the running counts are rewritten there every 50
#: examples, so that a long run stopped from outside still tells how far it got.
_LOG = os.environ.get("GF2CODES_FUZZ_LOG")


def _count(command: str) -> None:
    COUNTS[command] = COUNTS.get(command, 0) + 1
    if _LOG and sum(COUNTS.values()) % 50 == 0:
        Path(_LOG).write_text(json.dumps(COUNTS) + "\n")

# ---------------------------------------------------------------------- strategies

_WEIRD_NUMBERS = ["-1", "0", "-0", "nan", "NaN", "inf", "-inf", "1e309", "-1e309", "1e-400",
                  "99999999999999999999999", "-99999999999999999999", "0x10", "1_000", "",
                  " ", "abc", "\x1b[31m", "3\n4", "1.5", "2", "3", "0.5", "0.01", "1e-3",
                  "1-3", "0-999999999999", "3,5", "\x00", "１２"]
_small_int_text = st.integers(min_value=-5, max_value=40).map(str)
_option_value = st.one_of(st.sampled_from(_WEIRD_NUMBERS), _small_int_text,
                          st.text(max_size=12))


def _hamming74_rows() -> list[str]:
    return ["1000011", "0100101", "0010110", "0001111"]


def _record(**changes: object) -> dict:
    rec: dict = {"record": "gf2codes/code", "version": 1, "n": 7, "k": 4, "d": 3,
                 "d_lower": 3, "d_upper": 3, "name": "Hamming [7,4]",
                 "generator": _hamming74_rows(), "recipe": []}
    rec.update(changes)
    return rec


_json_values = st.recursive(
    st.none() | st.booleans() | st.integers(min_value=-(10**30), max_value=10**30)
    | st.floats(allow_nan=False) | st.text(max_size=10),
    lambda inner: st.lists(inner, max_size=4) | st.dictionaries(st.text(max_size=6), inner,
                                                                  max_size=4),
    max_leaves=12,
)
_record_keys = st.sampled_from(["record", "version", "n", "k", "d", "d_lower", "d_upper",
                                "name", "generator", "parity_check", "recipe"])
_bit_rows = st.lists(st.text(alphabet="01", min_size=1, max_size=12), min_size=1,
                     max_size=6)


@st.composite
def _garbled_record(draw) -> bytes:
    """A code record with one or two fields replaced by random JSON values."""
    rec = _record()
    for _ in range(draw(st.integers(1, 2))):
        key = draw(_record_keys)
        choice = draw(st.integers(0, 3))
        if choice == 0:
            rec.pop(key, None)
        elif choice == 1 and key in ("generator", "parity_check"):
            rec[key] = draw(_bit_rows)
        else:
            rec[key] = draw(_json_values)
    lead = " " * draw(st.integers(0, 130))
    return (lead + json.dumps(rec)).encode()


@st.composite
def _text_matrix(draw) -> bytes:
    rows = draw(_bit_rows)
    sep = draw(st.sampled_from(["", " ", ",", "\t"]))
    body = "\n".join(sep.join(r) for r in rows)
    if draw(st.booleans()):  # garble one character
        pos = draw(st.integers(0, max(0, len(body) - 1)))
        body = body[:pos] + draw(st.characters()) + body[pos + 1:]
    return body.encode("utf-8", "surrogatepass")


@st.composite
def _npy(draw) -> bytes:
    shape = (draw(st.integers(0, 5)), draw(st.integers(0, 9)))
    dtype = draw(st.sampled_from(["uint8", "int64", "bool", "float64", "float32", "int8"]))
    values = draw(st.lists(st.sampled_from([0, 1, 0, 1, 2, -1, 0.5]),
                           min_size=shape[0] * shape[1], max_size=shape[0] * shape[1]))
    arr = np.array(values, dtype=np.float64).reshape(shape).astype(dtype)
    buf = io.BytesIO()
    np.save(buf, arr)
    data = buf.getvalue()
    if draw(st.booleans()):  # truncate or corrupt the file
        cut = draw(st.integers(0, len(data)))
        data = data[:cut]
    return data


_contents = st.one_of(
    st.binary(max_size=200),
    _garbled_record(),
    _json_values.map(lambda v: json.dumps(v).encode()),
    _text_matrix(),
    _npy(),
)

_file_names = st.sampled_from(["code.txt", "code.json", "code.npy", "a b.txt",
                               "evil\x1b[31m.txt", "new\nline.json", "x"])


# ----------------------------------------------------------------------- the runner


def _run(argv: list[str]) -> tuple[int, str, str]:
    out_bytes, err_bytes = io.BytesIO(), io.BytesIO()
    out = io.TextIOWrapper(out_bytes, encoding="utf-8", errors="replace", write_through=True)
    err = io.TextIOWrapper(err_bytes, encoding="utf-8", errors="replace", write_through=True)
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        try:
            status = main(argv)
        except SystemExit as exc:  # argparse errors and --help
            status = exc.code if isinstance(exc.code, int) else 2
    out.flush()
    err.flush()
    return (status, out_bytes.getvalue().decode("utf-8", "replace"),
            err_bytes.getvalue().decode("utf-8", "replace"))


def _brute_force_distance(code: Code) -> int:
    """Minimum weight over all 2^k - 1 nonzero codewords (computed here, by brute force)."""
    G = np.asarray(code.G, dtype=np.uint8)
    best = code.n
    for bits in itertools.product((0, 1), repeat=code.k):
        if any(bits):
            w = int(((np.array(bits, dtype=np.uint8) @ G) % 2).sum())
            best = min(best, w)
    return best


def _check(command: str, status: int, err: str, allowed: frozenset[int]) -> None:
    assert "Traceback" not in err, err
    assert "internal error" not in err, err
    assert status in allowed, (status, err)
    if status == 2:  # one clear line
        assert err.strip() and len(err.strip().splitlines()) == 1, err
        assert "\x1b" not in err, err


def _verify_claims(path: Path, argv: list[str], out: str) -> None:
    """A proof claimed by ``verify --json`` must be true of the matrix in the file."""
    report = json.loads(out)
    rec = read_code(path, parity_check="--parity-check" in argv)
    assert report["n"] == rec.code.n and report["k"] == rec.code.k
    if rec.code.k <= 12:
        d = _brute_force_distance(rec.code)
        assert report["d_lower"] <= d <= report["d_upper"], (report, d)
        if report["d_exact"]:
            assert report["d"] == d, (report, d)
        if report["weight_distribution"] is not None:
            assert sum(report["weight_distribution"]) == 2 ** rec.code.k
            assert min(i for i, a in enumerate(report["weight_distribution"]) if i and a) == d


_verify_options = st.lists(st.sampled_from([
    ("--time-limit",), ("--seed",), ("--target-d",), ("--workers",), ("--method", "fast"),
    ("--method",), ("--parity-check", None), ("--pool",), ("--scheduler",),
]), max_size=3)


@st.composite
def _options(draw, table) -> list[str]:
    argv: list[str] = []
    for opt in draw(table):
        argv.append(opt[0])
        if len(opt) == 1:
            argv.append(draw(_option_value))
        elif opt[1] is not None:
            argv.append(opt[1])
    return argv


def _write(tmp: str, name: str, data: bytes) -> Path:
    path = Path(tmp) / name
    path.write_bytes(data)
    return path


def _fuzz_verify(data: bytes, name: str, options: list[str]) -> None:
    _count("verify")
    with tempfile.TemporaryDirectory() as tmp:
        path = _write(tmp, name, data)
        argv = ["verify", str(path), *options, "--json"]
        status, out, err = _run(argv)
        _check("verify", status, err, frozenset({0, 2}))
        if status == 0:
            _verify_claims(path, argv, out)


_derive_ops = st.lists(st.sampled_from(["puncture", "shorten", "extend", "augment",
                                        "expurgate", "lengthen", "0", "0-2", "1,3",
                                        "0-999999999999", "7", "-1", "x", "dual"]),
                       min_size=1, max_size=4)


def _fuzz_others(data: bytes, name: str, command: str, extra: list[str]) -> None:
    _count(command)
    with tempfile.TemporaryDirectory() as tmp:
        path = _write(tmp, name, data)
        if command == "export":
            argv = ["export", str(path), "-o", str(Path(tmp) / "out"), *extra]
        elif command == "derive":
            argv = ["derive", str(path), *extra, "-o", str(Path(tmp) / "out.json")]
        elif command == "channel":
            argv = ["channel", str(path), *extra]
        else:  # equivalent, against the [7,4] Hamming code
            other = _write(tmp, "h.json", json.dumps(_record()).encode())
            argv = ["equivalent", str(path), str(other)]
        status, out, err = _run(argv)
        allowed = frozenset({0, 1, 2, 4}) if command == "equivalent" else frozenset({0, 2})
        _check(command, status, err, allowed)


_export_extra = st.tuples(st.sampled_from(["c", "text", "npy", "json", "graphml", "C", "xml",
                                           ""]),
                          st.sampled_from(["gf2code", "p", "1bad", "a b", "*/", ""])).map(
    lambda t: ["--format", t[0], "--prefix", t[1]])
_channel_extra = st.lists(st.sampled_from([
    ["--p", "0.01"], ["--p", "1e-3:1e-1:3"], ["--p", "nan"], ["--p", "0:1:99999999999"],
    ["--p", "2"], ["--p", "0.1:0.01:3"], ["--simulate", "20"], ["--simulate", "-5"],
    ["--simulate", "1e9"], ["--confidence", "1"], ["--confidence", "nan"], ["--seed", "-1"],
    ["--seed", "7"], ["--parity-check"],
]), max_size=3).map(lambda parts: [w for part in parts for w in part])


def _command_and_extra():
    return st.one_of(
        st.tuples(st.just("export"), _export_extra),
        st.tuples(st.just("derive"), _derive_ops),
        st.tuples(st.just("channel"), _channel_extra),
        st.tuples(st.just("equivalent"), st.just([])),
    )


# --------------------------------------------------------------------------- tests


@settings(max_examples=DEFAULT_EXAMPLES, **_SETTINGS)
@given(data=_contents, name=_file_names, options=_options(_verify_options))
def test_fuzz_verify(data, name, options):
    _fuzz_verify(data, name, options)


@settings(max_examples=DEFAULT_EXAMPLES, **_SETTINGS)
@given(data=_contents, name=_file_names, command=_command_and_extra())
def test_fuzz_other_commands(data, name, command):
    _fuzz_others(data, name, command[0], list(command[1]))


_search_options = st.lists(st.sampled_from([("--n",), ("--k",), ("--d",), ("--seed",),
                                            ("--time-limit",), ("--max-steps",)]),
                           min_size=1, max_size=4)


@settings(max_examples=DEFAULT_EXAMPLES, **_SETTINGS)
@given(options=_options(_search_options))
def test_fuzz_search_options(options):
    _count("search")
    if "--time-limit" not in options:
        options += ["--time-limit", "0.5"]
    status, _, err = _run(["search", *options, "--no-catalog", "--json"])
    _check("search", status, err, frozenset({0, 2}))


@pytest.mark.slow
@settings(max_examples=SLOW_EXAMPLES, **{**_SETTINGS, "derandomize": False})
@given(data=_contents, name=_file_names, options=_options(_verify_options),
       command=_command_and_extra(), which=st.integers(0, 1))
def test_fuzz_long(data, name, options, command, which):
    """The long run: verify and the other commands, interleaved."""
    if which == 0:
        _fuzz_verify(data, name, options)
    else:
        _fuzz_others(data, name, command[0], list(command[1]))


@pytest.mark.slow
def test_fuzz_report_counts():
    """Prints how many examples the long runs above tried (run with ``-s``)."""
    print(f"\nfuzz examples run: {COUNTS}")
