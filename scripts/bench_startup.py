#!/usr/bin/env python
"""Start-up benchmark of the ``gf2codes`` command: whole-process times, never assertions.

Prints the median wall time over several runs (after one warm-up run, so numba's
cache is warm) of:

* ``gf2codes --help``
* ``gf2codes verify`` on the extended Golay [24,12] code (text file)
* ``gf2codes verify`` on a random [64,32] code (its full weight distribution included)
* ``gf2codes bounds --k 12 --d 8``
* ``gf2codes catalog list`` (a catalog made beforehand from the shipped seed)
* ``gf2codes verify DIR`` on a directory of 50 small codes, in one call

and, with ``--cold``, the first run of the README's demo command
(``gf2codes verify examples/orchard-valve-link.txt``) in a fresh virtual environment
right after ``pip install .`` — nothing compiled yet (this takes a few minutes: the
install downloads or builds the dependencies).

Each figure is printed with the CPU's vector features and the load average, since both
change what it means. Run ``python scripts/bench_startup.py [--runs 5] [--cold]``.
"""

from __future__ import annotations

import argparse
import os
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parent.parent
VECTOR_FLAGS = ("sse4_2", "popcnt", "avx", "avx2", "bmi2", "avx512f", "avx512bw", "avx512vl",
                "avx512_vpopcntdq")


def cpu_features() -> str:
    """The CPU model and its vector features (from /proc/cpuinfo where there is one)."""
    try:
        text = Path("/proc/cpuinfo").read_text()
    except OSError:
        import platform

        return platform.processor() or "unknown CPU"
    model, flags = "unknown CPU", set()
    for line in text.splitlines():
        if line.startswith("model name") and model == "unknown CPU":
            model = line.split(":", 1)[1].strip()
        if line.startswith("flags"):
            flags = set(line.split(":", 1)[1].split())
            break
    present = [f for f in VECTOR_FLAGS if f in flags]
    numba_cpu = os.environ.get("NUMBA_CPU_NAME")
    note = f"; numba code generated for {numba_cpu}" if numba_cpu else ""
    return f"{model}, {os.cpu_count()} cores; vector features: {' '.join(present)}{note}"


def load() -> str:
    one, five, _ = os.getloadavg()
    return f"load average {one:.2f} (1 min), {five:.2f} (5 min)"


def command(bindir: Path | None = None) -> list[str]:
    """How to start ``gf2codes``: the console script beside this Python, if installed."""
    script = (bindir or Path(sys.executable).parent) / "gf2codes"
    return [str(script)] if script.exists() else [sys.executable, "-m", "gf2codes"]


def timed(argv: list[str], env: dict[str, str] | None = None, cwd: Path | None = None) -> float:
    start = time.perf_counter()
    proc = subprocess.run(argv, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, env=env,
                          cwd=cwd)
    seconds = time.perf_counter() - start
    if proc.returncode != 0:
        raise SystemExit(f"{' '.join(argv)} failed ({proc.returncode}): "
                         f"{proc.stderr.decode(errors='replace').strip()}")
    return seconds


def median_time(argv: list[str], runs: int, env: dict[str, str]) -> float:
    timed(argv, env)  # warm-up: numba's cache, the page cache, a catalog made on first use
    return statistics.median(timed(argv, env) for _ in range(runs))


def write_matrix(path: Path, rows: np.ndarray) -> None:
    path.write_text("".join("".join(map(str, row)) + "\n" for row in rows))


def make_inputs(folder: Path) -> dict[str, Path]:
    """The input files: extended Golay, a random [64,32] and 50 small random codes."""
    from gf2codes import families

    golay = families.extended_golay()
    write_matrix(folder / "golay24.txt", golay.G)
    rng = np.random.default_rng(2026)
    write_matrix(folder / "random64x32.txt",
                 np.hstack([np.eye(32, dtype=np.uint8),
                            rng.integers(0, 2, (32, 32), dtype=np.uint8)]))
    small = folder / "fifty"
    small.mkdir()
    for i in range(50):
        k = int(rng.integers(3, 9))
        n = k + int(rng.integers(3, 12))
        rows = np.hstack([np.eye(k, dtype=np.uint8),
                          rng.integers(0, 2, (k, n - k), dtype=np.uint8)])
        write_matrix(small / f"layout-{i:02d}.txt", rows)
    return {"golay": folder / "golay24.txt", "random": folder / "random64x32.txt",
            "fifty": small}


def warm_figures(runs: int) -> None:
    gf = command()
    with tempfile.TemporaryDirectory() as tmp:
        folder = Path(tmp)
        files = make_inputs(folder)
        env = dict(os.environ, GF2CODES_CATALOG=str(folder / "catalog.sqlite"))
        timed([*gf, "catalog", "add", str(files["golay"])], env)  # makes the catalog (+ seed)
        cases = [
            ("gf2codes --help", [*gf, "--help"], 0.3),
            ("gf2codes verify golay24.txt  (extended Golay [24,12])",
             [*gf, "verify", str(files["golay"])], 0.7),
            ("gf2codes verify random64x32.txt  (random [64,32])",
             [*gf, "verify", str(files["random"])], 2.5),
            ("gf2codes bounds --k 12 --d 8", [*gf, "bounds", "--k", "12", "--d", "8"], 0.5),
            ("gf2codes catalog list", [*gf, "catalog", "list"], None),
            ("gf2codes verify fifty/  (50 small codes, one call)",
             [*gf, "verify", str(files["fifty"])], 2.0),
        ]
        print(f"whole-process medians of {runs} runs after a warm-up run (numba cache and the "
          "memo of LP values warm)")
        print(f"{'command':<58} {'seconds':>8}  target")
        for label, argv, target in cases:
            seconds = median_time(argv, runs, env)
            goal = "" if target is None else f"<= {target} s " + (
                "met" if seconds <= target else "MISSED")
            print(f"{label:<58} {seconds:8.3f}  {goal}", flush=True)


def cold_figure() -> None:
    """The README demo command, first run after ``pip install .`` in a new venv."""
    with tempfile.TemporaryDirectory() as tmp:
        venv = Path(tmp) / "venv"
        subprocess.run([sys.executable, "-m", "venv", str(venv)], check=True)
        pip = [str(venv / "bin" / "python"), "-m", "pip", "install", "--quiet"]
        source = Path(tmp) / "src"
        shutil.copytree(ROOT, source, ignore=shutil.ignore_patterns(
            ".git", "__pycache__", "*.egg-info", "build"))
        start = time.perf_counter()
        subprocess.run([*pip, str(source)], check=True)
        install = time.perf_counter() - start
        env = dict(os.environ, GF2CODES_CATALOG=str(Path(tmp) / "catalog.sqlite"),
                   GF2CODES_CACHE_DIR=str(Path(tmp) / "cache"))  # no LP value known yet
        env.pop("PYTHONPATH", None)
        demo = [*command(venv / "bin"), "verify", "examples/orchard-valve-link.txt"]
        first = timed(demo, env, cwd=source)
        second = timed(demo, env, cwd=source)
        print(f"pip install . into a fresh venv: {install:.1f} s")
        print(f"first run of the README demo (compiles what verify needs): {first:.2f} s  "
              f"target <= 10 s {'met' if first <= 10 else 'MISSED'}")
        print(f"second run (cache warm): {second:.2f} s")


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--runs", type=int, default=5, help="timed runs per command")
    parser.add_argument("--cold", action="store_true",
                        help="also time the first run after pip install . in a fresh venv")
    args = parser.parse_args()
    print(cpu_features())
    print(load(), "at the start")
    warm_figures(args.runs)
    if args.cold:
        cold_figure()
    print(load(), "at the end")


if __name__ == "__main__":
    main()
