"""The on-disk memo of proved values (used for the certified LP bounds)."""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

from gf2codes._diskcache import Memo, cache_dir

ROOT = Path(__file__).resolve().parents[1]


def test_values_survive_the_process_and_merge_with_other_writers(tmp_path):
    a = Memo("m", version="1", folder=tmp_path)
    a.put("x", 1)
    b = Memo("m", version="1", folder=tmp_path)
    b.put("y", 2)
    a.flush()
    b.flush()
    c = Memo("m", version="1", folder=tmp_path)
    assert (c.get("x"), c.get("y")) == (1, 2)


def test_another_version_or_a_garbled_file_is_ignored(tmp_path):
    (tmp_path / "m.json").write_text(json.dumps({"version": "0", "values": {"x": 5}}))
    assert Memo("m", version="1", folder=tmp_path).get("x") is None
    (tmp_path / "m.json").write_text("{not json")
    memo = Memo("m", version="1", folder=tmp_path)
    assert memo.get("x") is None
    memo.put("x", 3)
    memo.flush()
    assert Memo("m", version="1", folder=tmp_path).get("x") == 3


def test_an_unwritable_folder_only_costs_time(tmp_path):
    blocker = tmp_path / "file"
    blocker.write_text("a file where the folder should be")
    memo = Memo("m", version="1", folder=blocker / "sub")
    memo.put("x", 1)
    memo.flush()  # no error
    assert memo.get("x") == 1


def test_switched_off_and_default_locations(monkeypatch, tmp_path):
    monkeypatch.setenv("GF2CODES_CACHE_DIR", "off")
    assert cache_dir() is None
    monkeypatch.delenv("GF2CODES_CACHE_DIR")
    monkeypatch.setenv("XDG_CACHE_HOME", str(tmp_path))
    assert cache_dir() == tmp_path / "gf2codes"


def test_a_second_bounds_run_reuses_the_lp_and_imports_no_scipy(tmp_path):
    """The LP values proved by one process are reused by the next (issue 11: start-up)."""
    env = dict(os.environ, PYTHONPATH=str(ROOT), GF2CODES_CACHE_DIR=str(tmp_path))
    probe = ("import sys\nfrom gf2codes import bounds\n"
             "print(bounds.least_length(12, 8).n, 'scipy' in sys.modules)")
    first = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True,
                           env=env, timeout=300)
    second = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True,
                            env=env, timeout=300)
    # [24,12,8] extended Golay code is the shortest for k = 12, d = 8 (MacWilliams &
    # Sloane 1977, ch. 2 section 6, and the bounds' own tests)
    assert first.stdout.split()[0] == second.stdout.split()[0] == "24", first.stderr
    assert (tmp_path / "lp-even.json").exists()
    assert second.stdout.split()[1] == "False", second.stdout
