#!/usr/bin/env python
"""Benchmark of the minimum-distance engine: figures, never assertions.

Prints, in one run:

(a) enumeration throughput in codewords per second per core, for n <= 64 and for
    64 < n <= 128, for both exact engines (Gray-code enumeration of every codeword;
    the Brouwer–Zimmermann split enumeration of weight-w combinations), beside a naive
    numpy baseline on the same code (every codeword as a matrix product, weights by
    summing) and the ratio between them;
(b) the time to prove d for a fixed list of codes, with 1 worker and with all workers.

Run ``python scripts/bench_distance.py`` (about 8 minutes on 2 cores, most of it the
BCH [127,64] proof twice) or ``--quick`` to skip that code. Numba's cache is warmed
before anything is timed.
"""

from __future__ import annotations

import argparse
import os
import platform
import time

import numpy as np

from gf2codes import _kernels, families
from gf2codes.code import Code
from gf2codes.distance import (
    _Best,
    _Clock,
    _InfoSetMatrix,
    _level_tasks,
    _run_task,
    _Shared,
    minimum_distance,
)


def naive_rate(code: Code, k_used: int = 18) -> float:
    """Codewords per second of the obvious numpy method: messages @ G mod 2, row sums."""
    G = code.G[:k_used].astype(np.int64)
    msgs = ((np.arange(1 << k_used)[:, None] >> np.arange(k_used)) & 1).astype(np.int64)
    t = time.perf_counter()
    words = (msgs @ G) & 1
    w = words.sum(axis=1)
    int(w[1:].min())
    return (1 << k_used) / (time.perf_counter() - t)


def gray_rate(code: Code) -> float:
    """Codewords per second of Gray-code enumeration over all 2^k codewords (no early exit)."""
    from gf2codes.distance import _gray_layout

    rows = np.array(code.packed_generator, dtype=np.uint64, order="C")
    OT, TT, _ = _gray_layout(rows)
    _kernels.gray_min_weight(OT, TT, 0, 2, -1)
    t = time.perf_counter()
    _kernels.gray_min_weight(OT, TT, 0, 1 << OT.shape[1], -1)
    return (1 << code.k) / (time.perf_counter() - t)


def split_rate(code: Code, w: int) -> float:
    """Codewords per second of the Brouwer–Zimmermann enumeration of every weight-w
    combination of one systematic generator (one thread, no early exit)."""
    from gf2codes import linalg

    e = linalg.rref(code.packed_generator, n=code.n)
    m = _InfoSetMatrix(e.rows, code.k, code.k)
    for ww in range(1, w):  # warm the tables and the kernels
        for task in _level_tasks(m, ww, split=False):
            _run_task(task, m, _Shared(_Clock(None, None), _Best(code.n)), -1, 0)
    clock = _Clock(None, None)
    sh = _Shared(clock, _Best(code.n))
    t = time.perf_counter()
    for task in _level_tasks(m, w, split=False):
        _run_task(task, m, sh, -1, 0)
    return clock.done / (time.perf_counter() - t)


def random_code(n: int, k: int, seed: int) -> Code:
    rng = np.random.default_rng(seed)
    return Code(rng.integers(0, 2, size=(k, n), dtype=np.uint8))


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--quick", action="store_true", help="skip the BCH [127,64] proof")
    args = ap.parse_args()
    cores = os.cpu_count() or 1
    print(f"# gf2codes distance benchmark — {platform.processor() or platform.machine()}, "
          f"{cores} cores, numpy {np.__version__}")
    minimum_distance(families.hamming(3))  # warm numba's cache

    print("\n## (a) enumeration throughput, one core")
    print("| code | engine | codewords/s | naive numpy codewords/s | ratio |")
    print("|---|---|---|---|---|")
    for n, k, w in ((64, 32, 6), (128, 32, 6)):
        C = random_code(n, k, seed=2026)
        base = naive_rate(C)
        g = gray_rate(C)
        s = split_rate(random_code(n, 48, seed=7), w + 1)
        print(f"| random [{n},{k}] | Gray code, all 2^{k} | {g:.3g} | {base:.3g} | "
              f"{g / base:.0f}x |")
        print(f"| random [{n},48] | Brouwer–Zimmermann, all C(48,{w + 1}) | {s:.3g} | "
              f"{base:.3g} | {s / base:.0f}x |")

    print("\n## (b) time to prove d")
    print("| code | d | engine | workers | codewords | seconds |")
    print("|---|---|---|---|---|---|")
    cases = [
        ("extended Golay [24,12]", families.extended_golay()),
        ("random [64,32], seed 2026", random_code(64, 32, 2026)),
        ("quadratic residue [47,24]", families.quadratic_residue(47)),
        ("BCH [63,36]", families.bch(63, 11)),
        ("Reed–Muller RM(2,6) [64,22]", families.reed_muller(2, 6)),
    ]
    if not args.quick:
        cases.append(("BCH [127,64]", families.bch(127, 21)))
    for label, C in cases:
        for workers in sorted({1, cores}):
            t = time.perf_counter()
            r = minimum_distance(C, workers=workers, max_work=None)
            dt = time.perf_counter() - t
            print(f"| {label} | {r.d} | {r.method} | {workers} | {r.codewords:.3g} | "
                  f"{dt:.3f} |", flush=True)


if __name__ == "__main__":
    main()
