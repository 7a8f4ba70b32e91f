"""Start-up guard: a command imports only what it uses (issue 11).

These tests look at ``sys.modules`` and at which kernels were compiled in a fresh
interpreter; they never time anything (timings are in ``scripts/bench_startup.py``).
"""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]

#: Heavy packages that no ``--help`` may import.
HEAVY = ("numba", "llvmlite", "scipy", "galois", "networkx", "matplotlib", "dask")

#: Every kernel module, so a probe can report which kernels a command compiled or loaded.
KERNEL_MODULES = ("gf2codes._kernels", "gf2codes.search._kernels", "gf2codes._decoding_kernels",
                  "gf2codes._dual_kernels")

_PROBE = """
import contextlib, io, json, sys
from gf2codes.cli import main
out = io.StringIO()
with contextlib.redirect_stdout(out), contextlib.redirect_stderr(io.StringIO()):
    try:
        status = main(sys.argv[1:])
    except SystemExit as exc:  # --help exits through argparse
        status = exc.code
from gf2codes._jit import Kernel
loaded = []
for name in KERNEL_MODULES:
    module = sys.modules.get(name)
    for attr, value in (vars(module) if module else {}).items():
        if isinstance(value, Kernel) and value.compiled:
            loaded.append(name + "." + attr)
print(json.dumps({"status": status, "modules": sorted(m for m in sys.modules
                  if m.split(".")[0] in HEAVY + ("numpy", "rich")), "kernels": loaded}))
"""
_PROBE = f"KERNEL_MODULES = {KERNEL_MODULES!r}\nHEAVY = {HEAVY!r}\n" + _PROBE


def _probe(*argv: str, tmp_path: Path) -> dict:
    env = dict(os.environ, PYTHONPATH=str(ROOT),
               GF2CODES_CATALOG=str(tmp_path / "catalog.sqlite"))
    proc = subprocess.run([sys.executable, "-c", _PROBE, *argv], capture_output=True,
                          text=True, env=env, timeout=300, cwd=tmp_path)
    assert proc.returncode == 0, proc.stderr
    return json.loads(proc.stdout.strip().splitlines()[-1])


def _top(modules: list[str]) -> set[str]:
    return {m.split(".")[0] for m in modules}


def test_top_level_help_imports_nothing_heavy_not_even_numpy(tmp_path):
    seen = _probe("--help", tmp_path=tmp_path)
    assert seen["status"] == 0
    assert not _top(seen["modules"]) & set(HEAVY + ("numpy", "rich")), seen["modules"]


def test_import_gf2codes_imports_no_numpy():
    proc = subprocess.run([sys.executable, "-c", "import sys, gf2codes; "
                           "print(sorted(m for m in sys.modules if m in ('numpy', 'numba')))"],
                          capture_output=True, text=True, env=dict(os.environ,
                                                                   PYTHONPATH=str(ROOT)))
    assert proc.stdout.strip() == "[]", proc.stderr


@pytest.mark.parametrize("command", ["verify", "bounds", "build", "derive", "search",
                                     "channel", "export", "catalog", "equivalent", "grow",
                                     "gaps"])
def test_command_help_imports_no_heavy_package(command, tmp_path):
    seen = _probe(command, "--help", tmp_path=tmp_path)
    assert seen["status"] == 0
    assert not _top(seen["modules"]) & set(HEAVY), seen["modules"]
    assert seen["kernels"] == []


def test_verify_of_a_small_code_loads_no_kernel_at_all(tmp_path):
    """The demo's [22,16] code is served by the kernels' NumPy twins: numba stays out."""
    seen = _probe("verify", str(ROOT / "examples" / "orchard-valve-link.txt"), tmp_path=tmp_path)
    assert seen["status"] == 0
    assert seen["kernels"] == [] and "numba" not in _top(seen["modules"]), seen


def test_verify_loads_only_distance_and_weight_kernels(tmp_path):
    import numpy as np

    rng = np.random.default_rng(11)
    rows = np.hstack([np.eye(24, dtype=np.uint8), rng.integers(0, 2, (24, 24), dtype=np.uint8)])
    f = tmp_path / "r48.txt"
    f.write_text("".join("".join(map(str, r)) + "\n" for r in rows))
    seen = _probe("verify", str(f), tmp_path=tmp_path)
    assert seen["status"] == 0
    assert seen["kernels"], "a [48,24] code is too large for the twins"
    assert all(name.startswith("gf2codes._kernels.") for name in seen["kernels"]), seen
    assert not _top(seen["modules"]) & {"galois", "networkx", "matplotlib", "dask"}


def test_bounds_loads_no_numba(tmp_path):
    seen = _probe("bounds", "--k", "12", "--d", "8", tmp_path=tmp_path)
    assert seen["status"] == 0
    assert "numba" not in _top(seen["modules"]), seen["modules"]


def test_catalog_list_touches_no_kernel(tmp_path):
    # an existing catalog (reading actions create none; answering from the shipped seed
    # alone imports it, which proves its records' weight distributions with the kernels)
    from gf2codes.catalog import open_catalog

    open_catalog(tmp_path / "catalog.sqlite").close()
    seen = _probe("catalog", "list", tmp_path=tmp_path)
    assert seen["status"] == 0
    assert not _top(seen["modules"]) & {"numba", "scipy", "galois", "networkx", "dask"}, \
        seen["modules"]


def test_every_command_summary_matches_its_module():
    """``--help`` prints the summaries without importing the commands; they must agree."""
    import argparse
    import importlib

    from gf2codes import cli

    for name, module_name in cli.COMMANDS.items():
        parser = argparse.ArgumentParser()
        sub = parser.add_subparsers()
        importlib.import_module(module_name, cli.__name__).register(sub)
        action = next(a for a in sub._choices_actions if a.dest == name)
        assert cli.SUMMARIES[name] == action.help, name
