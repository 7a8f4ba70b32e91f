"""Benchmark of `gf2codes search`: least length found for fixed (k, d) targets.

Prints, for each target, the length found, the least length the bounds allow, the
gap, the strategy that won and the seconds, then the same as a markdown table for
the README. Figures only, no assertions. The "from scratch" rows exclude the
``families`` strategy, so no named code (Golay included) is built.

    PYTHONPATH=. python scripts/bench_search.py [--time-limit S] [--seed S]

The "proved in" column is the time until the answer was *proved* shortest (the
search stops the moment the incumbent meets the proved limit, which now includes
exhaustive non-existence decisions), or "not proved" when the time limit came first.
The targets marked "needs a non-existence proof" are those whose optimum no formula
bound reaches. It ends with the speed-up of 2 worker processes over 1 for the portfolio run as
parallel tasks.
"""

from __future__ import annotations

import argparse
import os
import time

from gf2codes.search import STRATEGIES, search_length

SCRATCH = [name for name in STRATEGIES if name != "families"]

#: (k, d, strategies or None for the whole portfolio, note)
TARGETS = [
    (4, 3, None, "Hamming [7,4,3]"),
    (11, 3, None, "Hamming [15,11,3]"),
    (5, 8, None, "RM(1,4) [16,5,8]"),
    (64, 4, None, "shortened extended Hamming [72,64,4]"),
    (12, 8, SCRATCH, "extended Golay length, from scratch"),
    (64, 4, SCRATCH, "from scratch"),
    (5, 8, SCRATCH, "from scratch"),
    (10, 6, None, ""),
    (16, 6, None, ""),
    (8, 8, None, ""),
    (20, 4, None, ""),
    (32, 6, None, ""),
    (5, 5, None, "needs a non-existence proof: [12,5,5]"),
    (10, 5, None, "needs a non-existence proof: [18,10,5]"),
    (6, 13, None, "needs a non-existence proof: [28,6,13]"),
    (7, 5, None, "needs the residual rule: [14,7,5]"),
]


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--time-limit", type=float, default=60.0, help="seconds per target")
    ap.add_argument("--seed", type=int, default=0)
    args = ap.parse_args()
    load = os.getloadavg()[0] if hasattr(os, "getloadavg") else float("nan")
    print(f"time limit {args.time_limit:g} s per target, seed {args.seed}, "
          f"{os.cpu_count()} cores, load average {load:.2f} at start")
    rows = []
    for k, d, strategies, note in TARGETS:
        t0 = time.perf_counter()
        r = search_length(k, d, time_limit=args.time_limit, seed=args.seed,
                          strategies=strategies)
        wall = time.perf_counter() - t0
        used = "all" if strategies is None else "no families"
        proved = f"{r.seconds:.1f} s" if r.optimal else "not proved"
        row = (k, d, r.n, r.bound, r.n - r.bound, r.d, r.strategy, used, proved, wall,
               r.stopped, note)
        rows.append(row)
        print(f"k={k:3d} d={d:2d}  n={r.n:4d}  bound={r.bound:4d} ({r.bound_by})  "
              f"gap={r.n - r.bound}  d={r.d}  by {r.strategy:10s} [{used}]  "
              f"{r.seconds:6.2f} s search, {wall:6.2f} s with proof  ({r.stopped}; "
              f"proved in: {proved}) {note}",
              flush=True)
    print()
    print("| k | d | n found | least n (bounds) | gap | d proved | found by | strategies "
          "| seconds | proved shortest in | note |")
    print("|---:|---:|---:|---:|---:|---:|---|---|---:|---:|---|")
    for k, d, n, b, gap, dd, who, used, proved, wall, stopped, note in rows:
        print(f"| {k} | {d} | {n} | {b} | {gap} | {dd} | {who} | {used} | {wall:.1f} "
              f"| {proved} | {note or stopped} |")
    speedup(args.seed)
    load = os.getloadavg()[0] if hasattr(os, "getloadavg") else float("nan")
    print(f"\nload average {load:.2f} at the end")


def speedup(seed: int) -> None:
    """The portfolio as parallel tasks: 2 worker processes against 1, same step limit
    (so both runs do the same work and return the same code)."""
    from gf2codes.parallel import ProcessPool

    print("\n## the portfolio as tasks: 2 workers against 1 (same step limit, same result)")
    print("| k | d | n | seconds, 1 worker | seconds, 2 workers | speed-up |")
    print("|---:|---:|---:|---:|---:|---:|")
    for k, d in ((10, 6), (16, 6)):
        times, codes = [], []
        for workers in (1, 2):
            with ProcessPool(workers) as pool:
                search_length(4, 3, executor=pool, max_steps=1, time_limit=None)  # warm
                t0 = time.perf_counter()
                r = search_length(k, d, executor=pool, max_steps=300, time_limit=None,
                                  seed=seed)
                times.append(time.perf_counter() - t0)
                codes.append(r.code)
        same = "" if codes[0] == codes[1] else " (results differ!)"
        print(f"| {k} | {d} | {r.n} | {times[0]:.1f} | {times[1]:.1f} | "
              f"{times[0] / times[1]:.2f}x{same} |", flush=True)


if __name__ == "__main__":
    main()
