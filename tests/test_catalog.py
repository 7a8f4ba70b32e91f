"""The local catalog: store, equivalence, propagation, records, reliability, CLI."""

from __future__ import annotations

import io
import itertools
import json
import os
import signal
import sqlite3
import subprocess
import sys
import textwrap
import time
from pathlib import Path

import numpy as np
import pytest

from gf2codes import catalog as C
from gf2codes import derive as D
from gf2codes import equivalence as E
from gf2codes import families as F
from gf2codes.bounds import least_length
from gf2codes.catalog import are_equivalent, code_facts, open_catalog
from gf2codes.code import Code
from gf2codes.derive import extend, puncture, shorten
from gf2codes.distance import minimum_distance
from gf2codes.exceptions import CatalogError, ParameterError

ROOT = Path(__file__).resolve().parent.parent


def permuted(code: Code, seed: int) -> Code:
    perm = np.random.default_rng(seed).permutation(code.n)
    G = np.zeros_like(code.G)
    G[:, perm] = code.G
    return Code(G)


@pytest.fixture
def cat(tmp_path):
    with open_catalog(tmp_path / "c.sqlite", shipped=False) as c:
        yield c


# ------------------------------------------------------------------ hex rows
def test_hex_rows_round_trip_and_padding():
    rng = np.random.default_rng(1)
    for n in (1, 3, 4, 5, 31, 64, 65):
        row = rng.integers(0, 2, n).astype(np.uint8)
        text = C.row_to_hex(row)
        assert len(text) == 4 + -(-n // 4)
        assert C.hex_to_row(text, n).tolist() == row.tolist()
    assert C.row_to_hex([1, 0, 0, 0, 0, 0, 0, 1]) == "hex:81"  # coordinate 0 = MSB
    with pytest.raises(Exception, match="padding bits"):
        C.hex_to_row("hex:d3", 7)


# ------------------------------------------------------------------ equivalence
def test_permuted_copies_are_stored_once_with_all_recipes(cat):
    golay = F.extended_golay()
    first = cat.add(golay, d=8, source="family")
    again = cat.add(permuted(golay, 3), d=8, recipe=[{"strategy": "test"}], seed=3)
    assert again == first and len(cat) == 1
    entry = cat.get(first)
    assert len(entry.recipes) == 2
    perm = entry.recipes[1]["permutation"]
    assert perm is not None and sorted(perm) == list(range(24))
    # the stored permutation maps the recipe's code onto the stored generator
    G = np.zeros_like(golay.G)
    G[:, perm] = permuted(golay, 3).G
    assert Code(G) == entry.code
    # the cyclic Hamming code is equivalent to the systematic one (MacWilliams & Sloane
    # 1977, ch. 7 section 1); a third recipe, still one entry
    h = cat.add(F.hamming(3), d=3, source="family")
    assert cat.add(F.cyclic(7, "x^3+x+1"), d=3, source="family") == h
    assert len(cat) == 2
    # adding the same again adds nothing
    assert cat.add(F.hamming(3), d=3, source="family") == h
    assert len(cat.get(h).recipes) == 2


# Found by a seeded random search over [8, 3] codes (numpy seed 11); the pair is proved
# inequivalent below by trying all 8! permutations.
_A = ["10110001", "01101001", "00000110"]
_B = ["10101100", "01101100", "00011011"]


def _code(rows):
    return Code([[int(c) for c in r] for r in rows])


def test_inequivalent_codes_with_equal_weight_distributions_stay_apart(cat):
    a, b = _code(_A), _code(_B)
    fa, fb = code_facts(a), code_facts(b)
    assert fa.weights == fb.weights == [1, 0, 1, 0, 3, 0, 3, 0, 0]
    # brute force: no permutation of the 8 coordinates maps a into b
    perms = np.array(list(itertools.permutations(range(8))))
    images = np.transpose(a.G.astype(np.int64)[:, perms], (1, 0, 2))
    assert ((images @ b.H.T.astype(np.int64)) & 1).any(axis=(1, 2)).all()
    result = are_equivalent(a, b)
    assert result.equivalent is False and "differ" in result.reason
    # the exact search alone (without the hash shortcut) proves it too
    assert E._match(E.linalg.unpack(fa.light, 8), E.linalg.unpack(fb.light, 8), a, b) is None
    # and a permuted copy is found equivalent by the same search
    pb = permuted(b, 5)
    r = are_equivalent(b, pb)
    assert r.equivalent and E._permuted(b, r.permutation) == pb
    ia, ib = cat.add(a, d=2), cat.add(b, d=2)
    assert ia != ib and len(cat) == 2


# ------------------------------------------------------------------ propagation
def test_rules_reproved_by_exact_distance():
    g = F.golay()  # [23, 12, 7]
    assert minimum_distance(puncture(g, [22])).d == 6
    assert minimum_distance(shorten(g, [0])).d >= 7
    assert minimum_distance(extend(g)).d == 8
    assert minimum_distance(D.append_zeros(g, 2)).d == 7 and D.append_zeros(g, 2).n == 25
    sub = Code(g.G[:-1])
    assert minimum_distance(sub).d >= 7


@pytest.mark.parametrize("query", [
    {"n": 20, "k": 8}, {"n": 22, "k": 12}, {"n": 30, "k": 5}, {"n": 25, "k": 12},
    {"k": 11, "d": 8}, {"k": 5, "d": 8}, {"n": 18, "d": 6}, {"n": 9, "k": 4},
])
def test_derived_answers_are_rebuilt_and_reproved(cat, query):
    for code, d in ((F.golay(), 7), (F.extended_golay(), 8), (F.hamming(3), 3),
                    (F.reed_muller(1, 4), 8)):
        cat.add(code, d=d, source="family")
    entry = cat.pick(**query)
    assert entry is not None
    for key, value in query.items():
        if key != "d":
            assert getattr(entry, key) == value
    code = entry.code
    assert (code.n, code.k) == (entry.n, entry.k)
    proved = minimum_distance(code).d
    assert proved >= entry.d and proved >= query.get("d", 1)
    if entry.derived_from:
        assert entry.id is None and "entry" in entry.derived_from
        assert D.rebuild(code.recipe) == code  # the recipe rebuilds it


def test_best_modes_prefer_stored_and_report_none(cat):
    assert cat.pick(k=4, d=3) is None
    h = cat.add(F.hamming(3), d=3, source="family")
    assert cat.pick(k=4, d=3).id == h
    e = cat.pick(k=4, d=4)
    assert (e.n, e.k, e.d) == (8, 4, 4) and e.derived_from
    assert cat.pick(k=5, d=3) is None
    assert cat.pick(n=7, d=3).k == 4
    with pytest.raises(ParameterError, match="exactly two"):
        cat.pick(k=4)


def test_table_marks_cells_below_the_bound(cat):
    cat.add(F.hamming(3), d=3, source="family")
    rows = {(r["n"], r["k"]): r for r in cat.distance_table(range(1, 9))}
    assert rows[7, 4]["d"] == 3 and rows[7, 4]["stored"] and rows[7, 4]["meets_bound"]
    assert rows[8, 4]["d"] == 4 and not rows[8, 4]["stored"] and rows[8, 4]["meets_bound"]
    assert rows[8, 8]["d"] == 0 and not rows[8, 8]["meets_bound"]


def test_interval_entries_and_contradictions(cat):
    g = F.golay()
    with pytest.raises(ParameterError, match="weight distribution"):
        cat.add(g, d=8)
    eid = cat.add(g, d=5, proved=False, d_upper=9)
    entry = cat.get(eid)
    assert entry.proved and entry.d == 7  # the weight distribution proved it on the way


# ------------------------------------------------------------------ records
def test_export_import_round_trip_is_lossless(cat, tmp_path):
    cat.add(F.extended_golay(), d=8, source="family")
    cat.add(permuted(F.extended_golay(), 1), d=8, recipe=[{"strategy": "x"}], seed=4)
    cat.add(F.reed_muller(1, 4), d=8, source="family")
    cat.add(F.hamming(3), d=3, proved=True, source="family")
    out = io.StringIO()
    assert cat.export(out) == 3
    text = out.getvalue()
    with open_catalog(tmp_path / "other.sqlite", shipped=False) as other:
        report = other.import_records(text.splitlines())
        assert (report.added, report.errors) == (3, [])
        again = io.StringIO()
        other.export(again)
        # everything is kept but the provenance: the importer proved it again, later
        def facts(t):
            recs = [json.loads(x) for x in t.splitlines()]
            kinds = [r.pop("provenance")["kind"] for r in recs]
            return recs, kinds

        assert facts(again.getvalue()) == facts(text)
        # importing twice imports nothing twice
        report = other.import_records(text.splitlines())
        assert (report.added, report.merged, report.unchanged) == (0, 0, 3)
        assert len(other) == 3


def test_import_reports_malformed_lines_by_number(cat):
    good = json.dumps(C.entry_record(_stored(cat, F.hamming(3), 3)))
    cat.remove(1)
    bad_d = json.loads(good)
    bad_d.update(d=4, d_lower=4, d_upper=4)
    lines = [good, "{not json", json.dumps({"record": "other"}), "", json.dumps(bad_d),
             json.dumps({**json.loads(good), "generator": ["hex:zz"]}), good]
    report = cat.import_records(lines, source="x.jsonl")
    assert report.added == 1 and report.unchanged == 1
    assert [ln for ln, _ in report.errors] == [2, 3, 5, 6]
    assert all(m.startswith(f"x.jsonl, line {ln}") for ln, m in report.errors)
    assert "d = 3" in dict(report.errors)[5]


def _stored(cat, code, d):
    return cat.get(cat.add(code, d=d, source="family"))


def test_plain_code_records_are_accepted(cat):
    from gf2codes.formats import code_to_record

    rec = code_to_record(F.hamming(3), d=3)
    report = cat.import_records([json.dumps(rec)])
    assert report.added == 1 and cat.get(1).d == 3


# ------------------------------------------------------------------ the store
_V1 = [
    "CREATE TABLE meta (key TEXT PRIMARY KEY, value TEXT NOT NULL)",
    """CREATE TABLE entry (id INTEGER PRIMARY KEY AUTOINCREMENT, n INTEGER NOT NULL,
       k INTEGER NOT NULL, d_lower INTEGER NOT NULL, d_upper INTEGER NOT NULL,
       generator BLOB NOT NULL, subspace TEXT NOT NULL UNIQUE, weights TEXT,
       invariant TEXT NOT NULL, proof TEXT, added_at TEXT NOT NULL, added_by TEXT NOT NULL)""",
    """CREATE TABLE recipe (id INTEGER PRIMARY KEY AUTOINCREMENT, entry_id INTEGER NOT NULL
       REFERENCES entry(id) ON DELETE CASCADE, source TEXT NOT NULL, steps TEXT, seed INTEGER,
       permutation TEXT, fingerprint TEXT NOT NULL, added_at TEXT NOT NULL,
       added_by TEXT NOT NULL, UNIQUE (entry_id, fingerprint))""",
]


def test_migration_from_schema_1(tmp_path):
    path = tmp_path / "old.sqlite"
    con = sqlite3.connect(path)
    for statement in _V1:  # written by hand: the schema of version 1
        con.execute(statement)
    h = F.hamming(3)
    f = code_facts(h)
    rows = E.linalg.rref(h.packed_generator, n=7).sorted().rows
    con.execute("INSERT INTO entry (n, k, d_lower, d_upper, generator, subspace, weights, "
                "invariant, added_at, added_by) VALUES (7, 4, 3, 3, ?, ?, ?, ?, 'then', '0.0.1')",
                (rows.astype("<u8").tobytes(), f.subspace, json.dumps(f.weights), f.invariant))
    con.execute(f"PRAGMA application_id = {C.APPLICATION_ID}")
    con.execute("PRAGMA user_version = 1")
    con.commit()
    con.close()
    with open_catalog(path) as cat:
        entry = cat.get(1)
        assert (entry.n, entry.k, entry.d, entry.origin) == (7, 4, 3, "user")
        assert cat.pick(k=4, d=4).n == 8
        assert "migrated" in cat.info()["meta"]
        assert cat.add(F.cyclic(7, "x^3+x+1"), d=3) == 1
    con = sqlite3.connect(path)
    assert con.execute("PRAGMA user_version").fetchone()[0] == C.SCHEMA_VERSION
    con.close()


def test_files_that_are_not_catalogs(tmp_path):
    text = tmp_path / "notes.txt"
    text.write_text("hello\n")
    with pytest.raises(CatalogError, match="not an SQLite database"):
        open_catalog(text)
    other = tmp_path / "other.sqlite"
    con = sqlite3.connect(other)
    con.execute("CREATE TABLE t (x)")
    con.commit()
    con.close()
    with pytest.raises(CatalogError, match="not a gf2codes catalog"):
        open_catalog(other)
    newer = tmp_path / "newer.sqlite"
    open_catalog(newer, shipped=False).close()
    con = sqlite3.connect(newer)
    con.execute(f"PRAGMA user_version = {C.SCHEMA_VERSION + 1}")
    con.commit()
    con.close()
    with pytest.raises(CatalogError, match="newer"):
        open_catalog(newer)


def test_default_location_follows_xdg(monkeypatch, tmp_path):
    monkeypatch.delenv("GF2CODES_CATALOG", raising=False)
    monkeypatch.setenv("XDG_DATA_HOME", str(tmp_path))
    assert C.default_catalog_path() == tmp_path / "gf2codes" / "catalog.sqlite"
    monkeypatch.setenv("GF2CODES_CATALOG", str(tmp_path / "x.sqlite"))
    assert C.default_catalog_path() == tmp_path / "x.sqlite"


def test_remove(cat):
    eid = cat.add(F.hamming(3), d=3)
    assert cat.remove(eid).n == 7 and len(cat) == 0
    with pytest.raises(CatalogError, match="no entry"):
        cat.remove(eid)
    assert cat._con.execute("SELECT count(*) FROM recipe").fetchone()[0] == 0


# ------------------------------------------------------------------ reliability
_WRITER = textwrap.dedent("""
    import sys
    import numpy as np
    from gf2codes.catalog import open_catalog
    from gf2codes.code import Code
    path, who, count = sys.argv[1], int(sys.argv[2]), int(sys.argv[3])
    rng = np.random.default_rng(who)
    with open_catalog(path, shipped=False) as cat:
        done = 0
        while done < count:
            G = np.hstack([np.eye(6, dtype=np.uint8), rng.integers(0, 2, (6, 10))])
            code = Code(G)
            from gf2codes.distance import minimum_distance
            before = len(cat)
            cat.add(code, d=minimum_distance(code).d, source="test", seed=who)
            done += 1
    """)


def _env():
    return {**os.environ, "PYTHONPATH": str(ROOT), "GF2CODES_SHIPPED_CATALOG": "none"}


def test_two_processes_adding_at_once_lose_nothing(tmp_path):
    path = tmp_path / "shared.sqlite"
    procs = [subprocess.Popen([sys.executable, "-c", _WRITER, str(path), str(w), "12"],
                              env=_env()) for w in (1, 2)]
    assert [p.wait(timeout=120) for p in procs] == [0, 0]
    with open_catalog(path) as cat:
        assert cat.check() == []
        recipes = cat._con.execute("SELECT seed, count(*) FROM recipe GROUP BY seed").fetchall()
        assert dict(recipes) == {1: 12, 2: 12}  # every add is there (some may share entries)


_KILLED = textwrap.dedent("""
    import sys, time
    from gf2codes import families as F
    from gf2codes.catalog import open_catalog, code_facts, Provenance
    with open_catalog(sys.argv[1], shipped=False) as cat:
        for m in (2, 3, 4):
            cat.add(F.hamming(m), d=3, source="family")
        golay = F.golay()
        facts = code_facts(golay)
        with cat.transaction() as cur:
            cat._store(cur, golay, facts, 7, 7, None, [{"source": "family"}], None, None, "user",
                       Provenance.proved_here("weight distribution"))
            print("in transaction", flush=True)
            time.sleep(60)
    """)


def test_killed_writer_leaves_catalog_consistent(tmp_path):
    path = tmp_path / "killed.sqlite"
    proc = subprocess.Popen([sys.executable, "-c", _KILLED, str(path)], env=_env(),
                            stdout=subprocess.PIPE, text=True)
    assert proc.stdout.readline().strip() == "in transaction"
    os.kill(proc.pid, signal.SIGKILL)
    proc.wait(timeout=30)
    with open_catalog(path) as cat:
        assert cat.check() == []
        assert sorted(e.n for e in cat.entries()) == [3, 7, 15]  # the Golay code never was
        cat.add(F.golay(), d=7)  # and the catalog takes writes again
        assert len(cat) == 4


# ------------------------------------------------------------------ the shipped catalog
def _shipped_records():
    folder = ROOT / "catalog"
    for path in sorted(folder.glob("*.jsonl")):
        for lineno, line in enumerate(path.read_text().splitlines(), start=1):
            if line.strip():
                yield f"{path.name}:{lineno}", json.loads(line)


#: Records whose smaller side (code or dual) has a dimension above this are re-proved by
#: the slow test only (their weight distribution has up to 2^32 words).
_QUICK_SIDE = 20


def _check_shipped(where, obj):
    rec = C.parse_entry_record(obj, where)
    if rec.weights is None:  # too many words to enumerate: d proved here again
        from gf2codes.distance import minimum_distance

        result = minimum_distance(rec.code, time_limit=600)
        assert result.exact and result.d == rec.d_lower == rec.d_upper, where
        return
    facts = code_facts(rec.code)
    assert facts.weights == rec.weights, where
    assert facts.d == rec.d_lower == rec.d_upper, where  # d proved by the distribution
    assert facts.invariant == rec.invariant, where
    for item in rec.recipes:
        steps = item.get("recipe")
        if not steps or "family" not in steps[0]:
            continue  # a search recipe (strategy and seed): not replayable here
        built = D.rebuild(steps)
        perm = item.get("permutation")
        if perm is not None:
            built = E._permuted(built, perm)
        assert built == rec.code, where


def _small_side(obj) -> bool:
    return min(obj["k"], obj["n"] - obj["k"]) <= _QUICK_SIDE


def test_shipped_catalog_is_verified():
    records = list(_shipped_records())
    assert records, "catalog/*.jsonl is missing: run scripts/build_catalog.py"
    assert sum(_small_side(obj) for _, obj in records) >= 0.8 * len(records)
    for where, obj in records:
        if _small_side(obj):
            _check_shipped(where, obj)


@pytest.mark.slow
def test_shipped_catalog_is_verified_in_full():
    for where, obj in _shipped_records():
        if not _small_side(obj):
            _check_shipped(where, obj)


def test_new_catalog_starts_from_the_shipped_records(tmp_path):
    count = sum(1 for _ in _shipped_records())
    start = time.perf_counter()
    with open_catalog(tmp_path / "fresh.sqlite") as cat:
        assert time.perf_counter() - start < 10
        assert len(cat) == count and cat.entries(origin="user") == []
        rows = cat.distance_table(range(1, 65))
        assert all(r["d"] >= 1 for r in rows)  # every (n, k) with n <= 64 is covered
        golay = cat.pick(k=12, d=8)
        assert (golay.n, golay.d) == (24, 8)
        assert cat.import_shipped().added == 0  # idempotent


def test_an_existing_catalog_takes_a_newer_shipped_seed(tmp_path, monkeypatch):
    lines = (ROOT / "catalog" / "seed.jsonl").read_text().splitlines()
    shipped = tmp_path / "shipped"
    shipped.mkdir()
    monkeypatch.setenv("GF2CODES_SHIPPED_CATALOG", str(shipped))
    (shipped / "seed.jsonl").write_text("\n".join(lines[:20]) + "\n")
    with open_catalog(tmp_path / "old.sqlite") as cat:
        first = len(cat)
        gone = cat.entries()[0].id
        cat.remove(gone)
    with open_catalog(tmp_path / "empty.sqlite", shipped=False) as cat:
        assert len(cat) == 0
    with open_catalog(tmp_path / "old.sqlite") as cat:  # same seed: the removal stays
        assert len(cat) == first - 1
    (shipped / "seed.jsonl").write_text("\n".join(lines[:40]) + "\n")  # a newer seed
    with open_catalog(tmp_path / "new.sqlite") as cat:
        want = len(cat)
    assert want > first
    with open_catalog(tmp_path / "old.sqlite") as cat:
        assert len(cat) == want  # the missing records, the removed one with them
        assert cat.import_shipped().added == 0
    with open_catalog(tmp_path / "empty.sqlite", shipped=False) as cat:
        assert len(cat) == 0  # created empty: never filled behind the user's back




def test_length_table_rows(cat):
    """Rows k, columns d: the least length on file beside the least length the bounds allow.
    Hamming [7, 4, 3] on file gives [7, 4, 3] itself (Hamming bound: 7 is least, MacWilliams
    & Sloane ch. 1 Theorem 6), [8, 4, 4] by extending it, [6, 3, 3] by shortening."""
    cat.add(F.hamming(3), d=3, source="family")
    rows = {(r["k"], r["d"]): r for r in cat.length_table(range(1, 5), range(1, 6))}
    assert (rows[4, 3]["n"], rows[4, 3]["n_least"], rows[4, 3]["gap"]) == (7, 7, 0)
    assert rows[4, 3]["stored"] and rows[4, 3]["d_proved"]
    assert (rows[4, 4]["n"], rows[4, 4]["gap"], rows[4, 4]["stored"]) == (8, 0, False)
    assert (rows[3, 3]["n"], rows[3, 3]["gap"]) == (6, 0)
    assert rows[4, 5]["n"] is None and rows[4, 5]["gap"] is None  # nothing reaches d = 5
    assert list(rows) == [(k, d) for k in range(1, 5) for d in range(1, 6)]
    for r in rows.values():
        assert r["n_least"] == least_length(r["k"], r["d"]).n
        if r["n"] is not None:
            assert r["gap"] == r["n"] - r["n_least"] >= 0
            code = cat.pick(k=r["k"], d=r["d"])
            assert (code.n, code.k) == (r["n"], r["k"]) and code.d >= r["d"]


