"""Benchmark of the proofs of "shortest": open cells, exhaustive decisions, the LP.

Prints (figures only, no assertions), with the load average and the CPU's vector
features:

* open cells: (n, k) with n <= 32 and n <= 64 where the shipped catalog's best proved
  code is below the best proved upper bound (measured through the Python API:
  ``Catalog.table`` against ``bounds.best_upper``), each open cell for n <= 32;
* exhaustive decisions: time and nodes for the issue's targets;
* the LP bound at [128,64] and [256,128] beside the Hamming bound, with the time.

    PYTHONPATH=. python scripts/bench_bounds.py [--skip-lp]
"""

from __future__ import annotations

import argparse
import os
import tempfile
import time

from gf2codes import bounds as B
from gf2codes.catalog import open_catalog
from gf2codes.existence import decide_existence

DECISIONS = [(12, 5, 5), (13, 6, 5), (14, 7, 5), (16, 8, 6), (18, 10, 5), (26, 13, 8)]


def cpu_features() -> str:
    try:
        flags = next(line for line in open("/proc/cpuinfo") if line.startswith("flags"))
    except (OSError, StopIteration):
        return "unknown"
    have = [f for f in ("avx2", "avx512f", "avx512vpopcntdq") if f" {f}" in flags]
    name = os.environ.get("NUMBA_CPU_NAME", "host")
    return f"{', '.join(have)}; NUMBA_CPU_NAME={name}"


LP_POINTS = [(30, 15), (64, 32), (100, 50), (128, 64), (200, 100), (256, 128), (256, 200)]


def lp_section() -> None:
    """Certified LP at a few points, each in a fresh process with an empty disk memo
    (first call) and again with the memo it wrote (second call)."""
    import subprocess
    import sys

    print(f"\nLP bound (certified) against the Hamming bound; load {os.getloadavg()}")
    code = ("import sys, time; t = time.perf_counter(); from gf2codes import bounds as B; "
            "n, k = map(int, sys.argv[1:]); lp = B.lp_bound(n, k); "
            "print(lp, B.hamming_bound(n, k), f'{time.perf_counter() - t:.2f}')")
    for n, k in LP_POINTS:
        with tempfile.TemporaryDirectory() as td:
            env = {**os.environ, "GF2CODES_CACHE_DIR": td}
            out = []
            for _ in range(2):
                r = subprocess.run([sys.executable, "-c", code, str(n), str(k)], env=env,
                                   capture_output=True, text=True, check=True)
                out.append(r.stdout.split())
            (lp, ham, t1), (_, _, t2) = out
            print(f"  [{n},{k}]: LP d <= {lp}, Hamming d <= {ham}; first call {t1} s, "
                  f"second (disk memo) {t2} s; load {os.getloadavg()[0]:.2f}", flush=True)


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--skip-lp", action="store_true")
    args = ap.parse_args()
    print(f"load average {os.getloadavg()}, CPU {cpu_features()}")
    t0 = time.perf_counter()
    B.best_upper(1, 1)
    print(f"bound table (fixed point over n <= {B.TABLE_LENGTH + 1}): "
          f"{time.perf_counter() - t0:.2f} s")
    with tempfile.TemporaryDirectory() as td:
        cat = open_catalog(os.path.join(td, "catalog.db"))
        for top in (32, 64):
            rows = cat.distance_table(range(1, top + 1))
            op = [r for r in rows if r["d"] < r["bound"]]
            gaps = {}
            for r in op:
                gaps[r["bound"] - r["d"]] = gaps.get(r["bound"] - r["d"], 0) + 1
            print(f"n <= {top}: {len(op)} open cells of {len(rows)} "
                  f"(by gap: {dict(sorted(gaps.items()))})")
            if top == 32:
                for r in op:
                    print(f"  ({r['n']},{r['k']}): code d = {r['d']}, bound d <= "
                          f"{r['bound']} ({r['bound_by']})")
    print("\nexhaustive decisions")
    for n, k, d in DECISIONS:
        t0 = time.perf_counter()
        dec = decide_existence(n, k, d, max_nodes=None, time_limit=120)
        print(f"  [{n},{k},{d}]: {dec.status}, {dec.nodes:,} nodes, "
              f"{time.perf_counter() - t0:.2f} s ({dec.stopped})", flush=True)
    if not args.skip_lp:
        lp_section()
    print(f"load average {os.getloadavg()}")


if __name__ == "__main__":
    main()
