"""The trust boundary (issue 18): a claim read from a file never becomes "proved", and
permission problems are one-line errors.

Every check value here is computed in the test itself (brute force or
:func:`gf2codes.distance.minimum_distance`), except where a source is named.
"""

from __future__ import annotations

import json
import os
import re
import shutil
import sqlite3
import subprocess
import sys
import tempfile
from pathlib import Path

import numpy as np
import pytest

from gf2codes import catalog as C
from gf2codes import families as F
from gf2codes import linalg
from gf2codes.catalog import Provenance, checks, open_catalog
from gf2codes.code import Code
from gf2codes.distance import distance_upper_bound, minimum_distance
from gf2codes.exceptions import CatalogError, ParseError
from gf2codes.formats import read_code, rows_to_strings

ROOT = Path(__file__).resolve().parent.parent


@pytest.fixture
def cli(monkeypatch, tmp_path):
    from gf2codes import cli as cli_module

    monkeypatch.setenv("GF2CODES_CATALOG", str(tmp_path / "cli.sqlite"))
    return cli_module.main


def says_proved(text: str) -> bool:
    """Whether ``text`` says "proved" anywhere other than in "not proved"."""
    return "proved" in re.sub(r"not proved", "", text.lower())


def _record(code: Code, **fields) -> str:
    return json.dumps({"record": "gf2codes/catalog-entry", "version": 1, "n": code.n,
                       "k": code.k, "generator": rows_to_strings(code.G), **fields})


def _big_code() -> tuple[Code, int, int]:
    """A random [64, 32] code, its true d, and the weight one information set finds.

    2^32 codewords on each side: no cheap weight distribution, so a trusted claim can only
    be checked by the short information-set search.
    """
    rng = np.random.default_rng(0)
    code = Code(np.hstack([np.eye(32, dtype=np.uint8),
                           rng.integers(0, 2, (32, 32)).astype(np.uint8)]))
    true_d = minimum_distance(code, time_limit=60).d
    one = distance_upper_bound(code, iterations=1, seed=0).upper
    return code, true_d, one


# ------------------------------------------------------------------ refused lies
# Like the example: the generator below has the rows 1100000000 (weight 2),
# 0011111100 (6) and 0000001111 (4); its weight distribution (by hand, all 8 words:
# A_0=1, A_2=1, A_4=1, A_6=3, A_8=2) gives d = 2, whatever a record states.
_LIE = {"record": "gf2codes/catalog-entry", "version": 1, "n": 10, "k": 3, "d": 5,
        "generator": ["1100000000", "0011111100", "0000001111"]}


def test_trusted_lie_exposed_by_a_cheap_check_is_refused(cli, tmp_path, capsys):
    lie = tmp_path / "lie.jsonl"
    lie.write_text(json.dumps(_LIE) + "\n")
    cat = ["--catalog", str(tmp_path / "c.sqlite")]
    assert cli(["catalog", "import", "--trust", str(lie), *cat]) == 1
    out, err = capsys.readouterr()
    assert "0 added" in out and "1 rejected" in out
    assert f"{lie}, line 1" in err and "d = 2" in err
    assert cli(["catalog", "list", "--n", "10", "--k", "3", "--json", *cat]) == 0
    listed = json.loads(capsys.readouterr().out)
    assert all(e["d_lower"] != 5 and e["status"] == "proved" for e in listed)
    assert cli(["catalog", "info", "--json", *cat]) == 0
    assert json.loads(capsys.readouterr().out)["problems"] == []


@pytest.mark.parametrize("change, reason", [
    ({"weights": [1, 0, 1, 0, 1, 0, 3, 0, 1, 0, 0]}, "summing to 2^3"),  # 7 words
    ({"d": 2, "weights": [1, 0, 0, 0, 2, 0, 4, 0, 1, 0, 0]}, "contradicts itself"),
    # the distribution of another [10, 3] code (rows 1100000000, 0011000000, 0000111111)
    ({"d": 2, "weights": [1, 0, 2, 0, 1, 0, 1, 0, 2, 0, 1]}, "not the code's"),
    ({"d": None, "d_lower": 3, "d_upper": 4}, "d = 2"),
])
def test_trusted_records_that_contradict_themselves_or_a_check(cat_api, change, reason):
    rec = {**_LIE, **change}
    report = cat_api.import_records([json.dumps(rec)], source="x.jsonl", verify=False)
    assert report.added == 0 and len(report.errors) == 1
    line, message = report.errors[0]
    assert line == 1 and message.startswith("x.jsonl, line 1") and reason in message


def test_trusted_lie_the_isd_check_finds_is_refused(cat_api, monkeypatch):
    from gf2codes.catalog import checks

    monkeypatch.setattr(checks, "CHEAP_PROOF_WORK", 1)  # no engine proof: the ISD check
    code, true_d, _ = _big_code()
    report = cat_api.import_records([_record(code, d=true_d + 1)], source="x", verify=False)
    assert report.added == 0 and "information-set search" in report.errors[0][1]


def test_trusted_lie_the_cheap_engine_proof_finds_is_refused(cat_api):
    code, true_d, _ = _big_code()
    report = cat_api.import_records([_record(code, d=true_d + 1)], source="x", verify=False)
    assert report.added == 0
    assert f"the code has d = {true_d} (proved here)" in report.errors[0][1]


def test_trusted_record_of_a_mid_rate_code_is_proved_on_import(cat_api):
    code, true_d, _ = _big_code()
    report = cat_api.import_records([_record(code, d=true_d)], source="x", verify=False)
    assert report.added == 1 and not report.errors
    (entry,) = [e for e in cat_api.entries() if e.code.n == code.n and e.code.k == code.k]
    assert entry.proved and entry.d_lower == true_d


@pytest.fixture
def cat_api(tmp_path):
    with open_catalog(tmp_path / "api.sqlite", shipped=False) as c:
        yield c


def test_cheap_trusted_records_are_proved_at_import(cat_api):
    report = cat_api.import_records([_record(F.hamming(3), d=3)], verify=False)
    assert report.added == 1 and report.status == {"proved": 1}
    entry = cat_api.get(1)
    assert entry.proved and entry.provenance.route == "weight distribution"


# ------------------------------------------------------------------ unexposed claims
def test_unexposed_lie_is_stored_as_a_claim_and_every_answer_says_so(cli, tmp_path, capsys,
                                                                       monkeypatch):
    code, true_d, one = _big_code()
    assert one > true_d  # the lie below is one that a single information set misses
    monkeypatch.setattr(checks, "CHEAP_ISD_ITERATIONS", 1)
    monkeypatch.setattr(checks, "CHEAP_PROOF_WORK", 1)  # the engine would prove it
    # the lie alone: the shipped seed's own checked claims reach [64, 32] too
    monkeypatch.setenv("GF2CODES_SHIPPED_CATALOG", "none")
    lie = tmp_path / "claim.jsonl"
    lie.write_text(_record(code, d=one) + "\n")
    cat = ["--catalog", str(tmp_path / "c.sqlite")]
    assert cli(["catalog", "import", "--trust", str(lie), *cat]) == 0
    out = capsys.readouterr().out
    assert "1 added" in out and "kept as claims" in out
    with open_catalog(tmp_path / "c.sqlite") as c:
        (entry,) = c.entries(n=64, k=32)
        eid = entry.id
        assert not entry.proved and entry.provenance.kind == "checked"
        assert entry.weights is None  # claimed weights are not stored as if computed
        assert c.pick(n=64, k=32).provenance.kind == "checked"
        assert c.pick(n=64, k=32, claims=False) is None or c.pick(
            n=64, k=32, claims=False).d < one
        derived = c.pick(n=63, k=31)
        assert derived.derived_from and not derived.provenance.proved
        row = {(r["n"], r["k"]): r for r in c.distance_table([64])}[64, 32]
        assert row["d"] < one and row["claimed_d"] == one and not row["exact"]
        (cell,) = c.length_table([32], [one])
        assert cell["n"] is None and cell["claimed_n"] == 64 and cell["gap"] is None
        # the record it exports is a claim: d is null
        rec = C.entry_record(entry)
        assert rec["d"] is None and rec["provenance"]["kind"] == "checked"
    texts = []
    for argv in (["list", "--n", "64", "--k", "32"], ["show", str(eid)],
                 ["pick", "--n", "64", "--k", "32"],
                 ["pick", "--n", "63", "--k", "31", "--prove-time", "0"],
                 ["table", "--k", "32", "--d", str(one)]):
        assert cli(["catalog", *argv, *cat]) == 0, argv
        texts.append(capsys.readouterr().out)
    for argv, text in zip(("list", "show", "pick", "derived", "table"), texts, strict=True):
        if argv == "table":
            assert "only claimed" in text
            continue
        assert "claimed" in text, argv
        assert not says_proved(text), (argv, text)
    assert cli(["catalog", "pick", "--n", "64", "--k", "32", "--json", *cat]) == 0
    j = json.loads(capsys.readouterr().out)
    assert j["proved"] is False and j["d"] is None and j["status"] == "checked"
    # a search that starts from the claim re-proves it: its answer is not the claim
    from gf2codes.search import search_distance

    with open_catalog(tmp_path / "c.sqlite") as c:
        start = c.pick(n=64, k=32).code
    result = search_distance(64, 32, start=[start], max_steps=1, time_limit=5,
                             strategies=["random"])
    assert result.d_lower <= minimum_distance(result.code, time_limit=60).d
    # proving on request corrects the false claim
    assert cli(["catalog", "prove", "--time-limit", "30", *cat]) == 0
    out = capsys.readouterr().out
    assert f"the claim d = {one} was false; d = {true_d} proved here" in out
    with open_catalog(tmp_path / "c.sqlite") as c:
        e = c.get(eid)
        assert e.proved and e.d == true_d and e.provenance.kind == "proved"


def test_merging_a_proof_replaces_a_claim_and_a_false_claim_is_refused(cat_api):
    code, true_d, one = _big_code()
    eid = cat_api.add(code, d=one, claimed_by="a friend")
    assert cat_api.get(eid).provenance == Provenance("claimed", source="a friend")
    # a proof made here replaces the (false) claim
    assert cat_api.add(code, d=true_d, proof={"method": "bz"}) == eid
    e = cat_api.get(eid)
    assert e.proved and e.d == true_d and e.provenance.route == "bz"
    # a claim never changes a proved entry; one that contradicts it is refused
    with pytest.raises(CatalogError, match="the claim is false"):
        cat_api.add(code, d=one, claimed_by="another friend")
    assert cat_api.get(eid).d == true_d


# ------------------------------------------------------------------ schema 2 -> 3
def test_migration_from_schema_2_marks_old_entries_as_claims(tmp_path):
    path = tmp_path / "v2.sqlite"
    con = sqlite3.connect(path)
    for step in C.MIGRATIONS[:2]:  # the schema of version 2
        for statement in step:
            con.execute(statement)
    h = F.hamming(3)
    f = C.code_facts(h)
    rows = linalg.rref(h.packed_generator, n=7).sorted().rows
    con.execute("INSERT INTO entry (n, k, d_lower, d_upper, generator, subspace, weights, "
                "invariant, added_at, added_by, origin) VALUES (7, 4, 3, 3, ?, ?, ?, ?, "
                "'then', '0.1.0', 'user')",
                (rows.astype("<u8").tobytes(), f.subspace, json.dumps(f.weights), f.invariant))
    con.execute(f"PRAGMA application_id = {C.APPLICATION_ID}")
    con.execute("PRAGMA user_version = 2")
    con.commit()
    con.close()
    with open_catalog(path) as cat:
        entry = cat.get(1)
        assert (entry.n, entry.k, entry.d) == (7, 4, 3)
        assert not entry.proved and entry.provenance.kind == "claimed"  # maybe a trusted one
        assert f"2->{C.SCHEMA_VERSION}" in cat.info()["meta"]["migrated"]
        (outcome,) = cat.prove_claims(time_limit=10)
        assert outcome.verdict == "proved" and cat.get(1).proved
    con = sqlite3.connect(path)
    assert con.execute("PRAGMA user_version").fetchone()[0] == C.SCHEMA_VERSION
    con.close()


# ------------------------------------------------------------------ derive
def _hamming_record(tmp_path, name, *, recipe: bool, d: int) -> Path:
    from gf2codes.formats import code_to_record

    rec = code_to_record(F.hamming(3), d=d, d_lower=d, d_upper=d)
    if not recipe:
        rec.pop("recipe")
    p = tmp_path / name
    p.write_text(json.dumps(rec))
    return p


def test_derive_carries_a_stated_d_as_a_claim(cli, tmp_path, capsys):
    src = _hamming_record(tmp_path, "claim.json", recipe=False, d=5)
    out = tmp_path / "out.json"
    assert cli(["derive", str(src), "extend", "-o", str(out)]) == 0
    text = capsys.readouterr().out
    assert "agree" not in text and "d = 6" in text and "claim" in text
    rec = read_code(out)
    assert rec.d is None and rec.d_lower is None and rec.d_upper is None
    assert rec.extra["claim"]["d_lower"] == 6  # carried as a claim, labelled
    # the true d of the extended [7,4,3] Hamming code is 4 (MacWilliams & Sloane, ch. 1
    # section 9); the brute force agrees
    assert minimum_distance(rec.code).d == 4
    # a derived file read again keeps the claim a claim
    assert cli(["derive", str(out), "puncture", "0"]) == 0
    again = capsys.readouterr().out
    assert "a claim, not proved here" in again


def test_derive_ignores_a_claim_its_recipe_disproves(cli, tmp_path, capsys):
    src = _hamming_record(tmp_path, "fam.json", recipe=True, d=5)
    assert cli(["derive", str(src), "extend", "--json"]) == 0
    rec = json.loads(capsys.readouterr().out)
    assert (rec["d_lower"], rec["d_upper"]) == (4, 4)  # proved by rebuilding hamming(3)
    assert "claim" not in rec


# ------------------------------------------------------------------ errors
def test_show_and_table_on_absurd_values(cli, tmp_path, capsys):
    open_catalog(tmp_path / "c.sqlite", shipped=False).close()
    cat = ["--catalog", str(tmp_path / "c.sqlite")]
    assert cli(["catalog", "show", "99999999999999999999999", *cat]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "no entry with id 99999999999999999999999" in err
    for argv in (["--k", "1-100000"], ["--d", "1-100000"]):
        assert cli(["catalog", "table", *argv, *cat]) == 2
        err = capsys.readouterr().err
        assert err.count("\n") == 1 and "at most 32" in err
    assert cli(["catalog", "list", "--n", "99999999999999999999999", *cat]) == 0


def test_a_missing_catalog_is_not_created_by_reading(cli, tmp_path, capsys):
    missing = tmp_path / "no" / "dir" / "c.sqlite"
    assert cli(["catalog", "--catalog", str(missing), "info"]) == 2
    err = capsys.readouterr().err
    assert "no catalog there" in err and err.count("\n") == 1
    assert cli(["catalog", "--catalog", str(missing), "pick", "--k", "4", "--d", "3"]) == 0
    out, err = capsys.readouterr()
    assert "[7, 4, 3]" in out and "shipped seed" in err
    assert not (tmp_path / "no").exists()


def _readonly_catalog(tmp_path: Path) -> Path:
    path = tmp_path / "ro.sqlite"
    with open_catalog(path) as cat:
        cat.add(F.extended_golay(), d=8, source="family")
    return path


def test_read_only_catalog_simulated(cli, tmp_path, capsys, monkeypatch):
    """As root chmod does not stop writes, so the permission check itself is simulated."""
    path = _readonly_catalog(tmp_path)
    real = os.access
    monkeypatch.setattr(os, "access", lambda p, mode: False if mode & os.W_OK
                        else real(p, mode))
    cat = ["--catalog", str(path)]
    for argv in (["list"], ["show", "1"], ["pick", "--k", "12", "--d", "8"], ["info"],
                 ["export"], ["table", "--k", "1-8", "--d", "1-8"]):
        assert cli(["catalog", *argv, *cat]) == 0, argv
    capsys.readouterr()
    h = tmp_path / "h.txt"
    h.write_text("\n".join(rows_to_strings(F.hamming(3).G)) + "\n")
    for argv in (["add", str(h)], ["remove", "1"], ["prove"]):
        assert cli(["catalog", *argv, *cat]) == 2
        err = capsys.readouterr().err
        assert err.count("\n") == 1 and "read-only" in err, argv
    with open_catalog(path) as c:
        assert c.readonly
        with pytest.raises(CatalogError, match="read-only"):
            c.add(F.hamming(3), d=3)


def test_unreadable_and_unwritable_files_simulated(cli, tmp_path, capsys, monkeypatch):
    from gf2codes import formats

    h = tmp_path / "h.txt"
    h.write_text("\n".join(rows_to_strings(F.hamming(3).G)) + "\n")
    j = tmp_path / "h.json"
    formats.write_code(F.hamming(3), j)

    def denied(*args, **kwargs):
        raise PermissionError(13, "Permission denied")

    monkeypatch.setattr(formats, "open", denied, raising=False)
    for f in (h, j):
        with pytest.raises(ParseError, match="cannot read \\(Permission denied\\)"):
            read_code(f)
        assert cli(["verify", str(f)]) == 2
        err = capsys.readouterr().err
        assert err.count("\n") == 1 and "Permission denied" in err
    monkeypatch.undo()
    # a folder that is a file: refused by the system even for root
    assert cli(["build", "hamming", "3", "-o", str(h / "x.txt")]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "cannot write" in err
    monkeypatch.setattr(Path, "write_text", denied)
    assert cli(["build", "hamming", "3", "-o", str(tmp_path / "y.txt")]) == 2
    assert "cannot write" in capsys.readouterr().err


def _as_nobody() -> list[str] | None:
    """A command prefix that runs a process as the user nobody, or None."""
    if os.geteuid() != 0 or shutil.which("setpriv") is None:
        return None
    try:
        import pwd

        pw = pwd.getpwnam("nobody")
    except KeyError:
        return None
    return ["setpriv", f"--reuid={pw.pw_uid}", f"--regid={pw.pw_gid}", "--clear-groups"]


@pytest.fixture
def nobody_dir():
    prefix = _as_nobody()
    if prefix is None:
        pytest.skip("needs root and setpriv to run a process as another user")
    # Import what the commands below load (their third-party modules too): a venv in a
    # folder only root may enter lets nobody import the checkout but not rich or numba.
    probe = subprocess.run([*prefix, sys.executable, "-c",
                            "import gf2codes.cli._verify, gf2codes.cli._catalog, "
                            "gf2codes.cli._build, numba, rich"],
                           env={"PATH": os.environ.get("PATH", ""), "PYTHONPATH": str(ROOT)},
                           capture_output=True, text=True, timeout=120, cwd="/")
    if probe.returncode != 0:  # e.g. a checkout or venv in a folder only root may enter
        pytest.skip("the user nobody cannot import this checkout: "
                    + (probe.stderr.strip().splitlines() or ["?"])[-1])
    d = Path(tempfile.mkdtemp(prefix="gf2codes-perm-"))
    d.chmod(0o755)
    yield prefix, d
    for p in d.rglob("*"):
        p.chmod(0o755 if p.is_dir() else 0o644)
    shutil.rmtree(d)


def _numba_cache_for_others(cache: Path) -> None:
    """Copy the kernels compiled in the source tree where numba looks for them when the
    tree is not writable (``NUMBA_CACHE_DIR``), so the other user need not recompile."""
    import hashlib

    cache.mkdir(mode=0o777, exist_ok=True)
    cache.chmod(0o777)
    for folder in (ROOT / "gf2codes", *[p for p in (ROOT / "gf2codes").iterdir() if p.is_dir()]):
        pyc = folder / "__pycache__"
        if not pyc.is_dir():
            continue
        sub = "_".join([folder.name, hashlib.sha1(str(folder).encode()).hexdigest()])
        target = cache / sub
        target.mkdir(mode=0o777, exist_ok=True)
        target.chmod(0o777)
        for f in (*pyc.glob("*.nbi"), *pyc.glob("*.nbc")):
            shutil.copy2(f, target / f.name)
            (target / f.name).chmod(0o666)


def _run(prefix: list[str], *argv: str, cwd: Path) -> subprocess.CompletedProcess:
    _numba_cache_for_others(cwd / "numba")
    env = {"PATH": os.environ.get("PATH", ""), "PYTHONPATH": str(ROOT), "HOME": str(cwd),
           "NUMBA_CACHE_DIR": str(cwd / "numba"), "GF2CODES_CATALOG": str(cwd / "none.sqlite")}
    return subprocess.run([*prefix, sys.executable, "-m", "gf2codes", *argv], cwd=cwd,
                          env=env, capture_output=True, text=True, timeout=300)


def test_permissions_as_a_user_without_them(nobody_dir):
    """Run as the user nobody: an unreadable input, a read-only catalog in a read-only
    folder (reading works; writing says why it cannot), and build -o into that folder."""
    prefix, d = nobody_dir
    secret = d / "secret.txt"
    secret.write_text("1101\n0111\n")
    secret_json = d / "secret.json"
    secret_json.write_text(json.dumps({"record": "gf2codes/code", "generator": ["1101"]}))
    for f in (secret, secret_json):
        f.chmod(0)
        run = _run(prefix, "verify", str(f), cwd=d)
        assert run.returncode == 2, run.stderr
        assert run.stderr.count("\n") == 1 and "Permission denied" in run.stderr
    folder = d / "ro"
    folder.mkdir()
    path = _readonly_catalog(folder)
    path.chmod(0o444)
    for extra in folder.iterdir():
        extra.chmod(0o444)
    folder.chmod(0o555)
    cat = ["--catalog", str(path)]
    for argv in (["list", "--n", "24"], ["pick", "--k", "12", "--d", "8"]):
        run = _run(prefix, "catalog", *argv, *cat, cwd=d)
        assert run.returncode == 0, (argv, run.stderr)
        assert "[24, 12, 8]" in run.stdout
    h = d / "h.txt"
    h.write_text("1101\n0111\n")
    h.chmod(0o644)
    run = _run(prefix, "catalog", "add", str(h), *cat, cwd=d)
    assert run.returncode == 2 and "read-only" in run.stderr and run.stderr.count("\n") == 1
    run = _run(prefix, "build", "hamming", "3", "-o", str(folder / "h.txt"), cwd=d)
    assert run.returncode == 2, run.stderr
    assert run.stderr.count("\n") == 1 and "cannot write" in run.stderr
    assert "Permission denied" in run.stderr
