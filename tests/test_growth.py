"""The growth job (gf2codes.growth) and its commands ``grow`` and ``gaps``."""

from __future__ import annotations

import itertools
import json
import os
import signal
import subprocess
import sys
import time
from pathlib import Path

import numpy as np
import pytest

from gf2codes import families as F
from gf2codes import growth
from gf2codes.bounds import best_upper
from gf2codes.catalog import open_catalog
from gf2codes.exceptions import ParameterError
from gf2codes.parallel import InProcess, ProcessPool

ROOT = Path(__file__).resolve().parent.parent


def _brute_d(code) -> int:
    """Minimum distance by enumerating every nonzero codeword (computed by brute force
    in this test)."""
    G = code.G.astype(np.int64)
    best = code.n
    for coeffs in itertools.product((0, 1), repeat=code.k):
        if any(coeffs):
            best = min(best, int((np.array(coeffs) @ G % 2).sum()))
    return best


@pytest.fixture
def cli(monkeypatch, tmp_path):
    """``gf2codes.cli.main`` with a private catalog."""
    from gf2codes import cli as cli_module

    monkeypatch.setenv("GF2CODES_CATALOG", str(tmp_path / "cli.sqlite"))
    return cli_module.main


def _empty(tmp_path, name="c.sqlite"):
    return open_catalog(tmp_path / name, shipped=False)


# ------------------------------------------------------------------ regions
def test_region_cells():
    assert growth.region_cells(lengths=range(3, 5)) == [(3, 1), (3, 2), (3, 3), (4, 1),
                                                      (4, 2), (4, 3), (4, 4)]
    assert growth.region_cells(lengths=[5, 6], dimensions=[2, 6]) == [(5, 2), (6, 2), (6, 6)]
    with pytest.raises(ParameterError, match="Argument 'n' must be at least 1, not 0"):
        growth.region_cells(lengths=[0])
    with pytest.raises(ParameterError, match="needs lengths"):
        growth.region_cells(dimensions=[3])


def test_region_of_a_target_is_the_cells_shorter_than_the_catalog(tmp_path):
    with _empty(tmp_path) as cat:
        cat.add(F.extended_golay(), d=8)  # [24, 12, 8]
        cat.add(F.repetition(20), d=20)
        # (k, d) = (8, 8): the bounds allow n >= 20 (Griesmer: 8 + 4 + 2 + 1 + 1 + 1 + 1 + 1);
        # the Golay code shortened by 4 gives [20, 8, 8] already: no cell is shorter.
        assert growth.region_cells(targets=[(8, 8)], catalog=cat) == []
        cells = growth.region_cells(targets=[(12, 9)], catalog=cat)
    assert cells and all(k == 12 for _, k in cells)
    assert min(n for n, _ in cells) == 12 + 9 - 1 or min(n for n, _ in cells) >= 12


# ------------------------------------------------------------------ the job
def _check_saved_codes(cat):
    for entry in cat.entries():
        assert entry.d_lower <= _brute_d(entry.code), entry
        if entry.proved:
            assert entry.d == _brute_d(entry.code), entry


def test_grow_saves_proved_improvements_and_closes_cells(tmp_path):
    cells = growth.region_cells(lengths=range(6, 10))
    seen = []
    with _empty(tmp_path) as cat:
        summary = growth.grow(cat, cells, max_steps=30, seed=3, on_cell=seen.append)
        assert summary.stopped == "finished"
        assert summary.cells == len(cells)  # an empty catalog: every cell is open
        assert summary.done == len(seen) == summary.cells
        assert summary.improved >= 1
        for res in seen:
            assert res.d_found <= res.bound == best_upper(res.n, res.k).d
            got = cat.pick(n=res.n, k=res.k)
            assert got is not None and got.d >= res.d_found
            if res.outcome == "improved":
                assert res.entry is not None and res.d_found > res.d_before
        _check_saved_codes(cat)
        status = growth.job_status(cat, summary.job)
        assert status["done"] == status["cells"] == len(cells)
        # the same command again: the job is finished, nothing is searched
        again = growth.grow(cat, cells, max_steps=30, seed=3)
        assert (again.job, again.resumed, again.results) == (summary.job, len(cells), [])


def test_grow_resumes_where_it_stopped_with_the_same_codes(tmp_path):
    cells = growth.region_cells(lengths=range(7, 11), dimensions=range(2, 6))
    with _empty(tmp_path, "a.sqlite") as a:
        whole = growth.grow(a, cells, max_steps=20, seed=5, batch=3)
        rows_a = a.distance_table(range(7, 11))
    with _empty(tmp_path, "b.sqlite") as b:
        first = growth.grow(b, cells, max_steps=20, seed=5, batch=3, max_cells=4)
        assert first.stopped == "cell limit" and first.done == 4
        second = growth.grow(b, cells, max_steps=20, seed=5, batch=3)
        assert second.job == first.job and second.resumed == 4
        assert second.done == second.cells == whole.cells
        rows_b = b.distance_table(range(7, 11))
    assert [r["d"] for r in rows_a] == [r["d"] for r in rows_b]


def test_a_different_budget_is_a_different_job(tmp_path):
    cells = [(8, 3), (8, 4)]
    with _empty(tmp_path) as cat:
        one = growth.grow(cat, cells, max_steps=5, seed=1)
        two = growth.grow(cat, cells, max_steps=6, seed=1)
        assert one.job != two.job


def test_cells_closed_by_propagation_are_not_searched(tmp_path):
    with _empty(tmp_path) as cat:
        cat.add(F.extended_golay(), d=8)
        # [24, 12, 8] meets the bound; shortening gives [23, 11, 8], [22, 10, 8] ...
        summary = growth.grow(cat, [(23, 11), (22, 10), (24, 12)], max_steps=5, seed=0)
        assert summary.cells == 0 and summary.stopped == "finished"


def test_results_do_not_depend_on_the_number_of_workers(tmp_path):
    cells = growth.region_cells(lengths=range(9, 13), dimensions=range(3, 6))

    def run(name, executor):
        with _empty(tmp_path, name) as cat:
            s = growth.grow(cat, cells, max_steps=15, seed=9, batch=4, executor=executor)
            return (sorted((r.n, r.k, r.d_before, r.d_found, r.outcome) for r in s.results),
                    [r["d"] for r in cat.distance_table(range(9, 13))])

    with ProcessPool(2) as pool:
        two = run("two.sqlite", pool)
    assert run("one.sqlite", InProcess()) == two
    assert run("none.sqlite", None) == two


def test_grow_validates_its_budget(tmp_path):
    with _empty(tmp_path) as cat:
        with pytest.raises(ParameterError, match="per-cell budget"):
            growth.grow(cat, [(5, 2)], max_steps=None)
        with pytest.raises(ParameterError, match="Argument 'batch' must be at least 1, not 0"):
            growth.grow(cat, [(5, 2)], batch=0)
        with pytest.raises(ParameterError, match="Argument 'strategy'"):
            growth.grow(cat, [(5, 2)], strategies=["no-such"])


# ------------------------------------------------------------------ kill -9
def _grow_command(path):
    return [sys.executable, "-m", "gf2codes", "grow", "--catalog", str(path), "--n", "8-16",
            "--k", "2-8", "--max-steps", "25", "--seed", "4", "--batch", "1", "--json"]


def test_kill_9_mid_run_loses_no_proved_code(tmp_path):
    """A real process killed with SIGKILL mid-run; the same command continues the job."""
    path = tmp_path / "k.sqlite"
    env = dict(os.environ, GF2CODES_SHIPPED_CATALOG="none", PYTHONUNBUFFERED="1")
    proc = subprocess.Popen(_grow_command(path), stdout=subprocess.PIPE, text=True, env=env,
                            cwd=ROOT)
    reported = []
    try:
        deadline = time.monotonic() + 240
        while len(reported) < 6 and time.monotonic() < deadline:
            line = proc.stdout.readline()
            if not line:
                break
            obj = json.loads(line)
            if "job" not in obj:
                reported.append(obj)
    finally:
        os.kill(proc.pid, signal.SIGKILL)
        proc.wait()
        proc.stdout.close()
    assert proc.returncode == -signal.SIGKILL
    assert len(reported) == 6, "the job reported too few cells before the kill"
    improved = [r for r in reported if r["outcome"] == "improved"]
    assert improved
    with open_catalog(path) as cat:
        assert cat.check() == []
        for r in improved:  # every reported code is in the catalog
            assert cat.pick(n=r["n"], k=r["k"]).d >= r["d"]
        done = growth.job_status(cat, 1)["done"]
    assert done >= len(reported)
    out = subprocess.run(_grow_command(path), capture_output=True, text=True, env=env,
                         cwd=ROOT, timeout=600)
    assert out.returncode == 0, out.stderr
    last = json.loads(out.stdout.splitlines()[-1])["job"]
    assert last["stopped"] == "finished" and last["resumed"] == done
    assert last["done"] == last["cells"]
    with open_catalog(path) as cat:
        for r in improved:
            assert cat.pick(n=r["n"], k=r["k"]).d >= r["d"]
        _check_saved_codes(cat)


# ------------------------------------------------------------------ where we stand
def test_region_standing_counts_against_the_table(tmp_path):
    with _empty(tmp_path) as cat:
        cat.add(F.hamming(3), d=3)
        cat.add(F.extended_golay(), d=8)
        cells = growth.region_cells(lengths=range(1, 13))
        st = growth.region_standing(cat, cells)
        rows = cat.distance_table(range(1, 13))
    assert st.cells == len(rows) == 78
    assert st.at_bound == sum(r["d"] >= r["bound"] for r in rows)
    assert st.within_one == sum(r["d"] >= r["bound"] - 1 for r in rows)
    assert st.unknown == sum(r["d"] == 0 for r in rows)
    assert len(st.open) == st.cells - st.at_bound
    gaps = [c.gap for c in st.open]
    assert gaps == sorted(gaps, reverse=True)
    h = next(c for c in st.open if (c.n, c.k) == (8, 4)) if any(
        (c.n, c.k) == (8, 4) for c in st.open) else None
    assert h is None  # [8, 4, 4] from Hamming by extending meets the bound 4




# ------------------------------------------------------------------ the shipped seed
# The lengths the search finds in 60 s per target (README, "search benchmark", measured
# with scripts/bench_search.py); the shipped seed must answer at least as short at once.
_SEARCH_60S = {(10, 6): 20, (16, 6): 27, (32, 6): 45}


def test_the_shipped_seed_answers_the_engineering_targets_at_once(tmp_path):
    with open_catalog(tmp_path / "fresh.sqlite") as cat:
        for (k, d), n in _SEARCH_60S.items():
            start = time.perf_counter()
            entry = cat.pick(k=k, d=d)
            assert time.perf_counter() - start < 5  # a lookup, not a search
            assert entry is not None and entry.n <= n and entry.d >= d, (k, d)
        for k, d in [(64, 6), (64, 8), (48, 8)]:
            entry = cat.pick(k=k, d=d)
            assert entry is not None and entry.d >= d and entry.k == k, (k, d)
            code = entry.code  # rebuilt from its recipe
            assert (code.n, code.k) == (entry.n, k)


def test_the_shipped_seed_covers_every_cell_up_to_64(tmp_path):
    with open_catalog(tmp_path / "fresh.sqlite") as cat:
        st = growth.region_standing(cat, growth.region_cells(lengths=range(1, 65)))
    assert st.cells == 2080 and st.unknown == 0
