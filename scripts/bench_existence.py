"""Benchmark of the exhaustive existence decisions: both methods on the issue's targets.

Prints (figures only, no assertions) the load average, the CPU's vector features and,
for each cell, the answer, nodes and seconds of the generator-row method and of the
parity-check column method (the column method's hyperplane-cap nodes apart), each run
once in the same process (the first call of a method includes loading its kernel from
numba's cache, so a warm-up cell is decided first). Quote AVX2-only figures with
``NUMBA_CPU_NAME=haswell NUMBA_CPU_FEATURES=""``.

    PYTHONPATH=. python scripts/bench_existence.py [--time-limit 120] [--hard]
"""

from __future__ import annotations

import argparse
import os
import time

from gf2codes.existence import choose_method, decide_existence

TARGETS = [(12, 5, 5), (13, 6, 5), (14, 7, 5), (16, 8, 6), (18, 10, 5), (17, 9, 5),
           (23, 14, 5), (26, 13, 8)]
#: Open cells whose decision did not finish in a few minutes (``--hard``).
HARD = [(24, 15, 5), (25, 15, 6), (24, 8, 9)]


def cpu_features() -> str:
    try:
        flags = next(line for line in open("/proc/cpuinfo") if line.startswith("flags"))
    except (OSError, StopIteration):
        return "unknown"
    have = [f for f in ("avx2", "avx512f", "avx512vpopcntdq") if f" {f}" in flags]
    name = os.environ.get("NUMBA_CPU_NAME", "host")
    return f"{', '.join(have)}; NUMBA_CPU_NAME={name}"


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--time-limit", type=float, default=120.0)
    ap.add_argument("--hard", action="store_true", help="also the undecided open cells")
    args = ap.parse_args()
    print(f"load average {os.getloadavg()}, CPU {cpu_features()}")
    for method in ("rows", "columns"):  # warm-up: load the kernels
        decide_existence(9, 4, 4, max_nodes=None, method=method)
    cells = TARGETS + (HARD if args.hard else [])
    for n, k, d in cells:
        line = [f"[{n},{k},{d}] (auto: {choose_method(n, k, d)})"]
        for method in ("rows", "columns"):
            t0 = time.perf_counter()
            dec = decide_existence(n, k, d, max_nodes=None, time_limit=args.time_limit,
                                   method=method)
            extra = f" +{dec.lemma_nodes:,} cap" if dec.lemma_nodes else ""
            line.append(f"{method}: {dec.status} {dec.nodes:,} nodes{extra} "
                        f"{time.perf_counter() - t0:.3f} s ({dec.stopped})")
        print("  " + "; ".join(line) + f"; load {os.getloadavg()[0]:.1f}", flush=True)
    print(f"load average {os.getloadavg()}")


if __name__ == "__main__":
    main()
