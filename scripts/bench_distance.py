#!/usr/bin/env python
"""Benchmark of the minimum-distance engine: figures, never assertions.

Prints, in one run:

(a) enumeration throughput in codewords per second of CPU time (process time, in
    the C programs as in Python, so that other work on a shared machine moves the
    figures less than it moves wall time), for n <= 64, 64 < n <= 128 and n = 256
    (the multi-word path), for both exact engines (Gray-code enumeration of every codeword;
    the Brouwer–Zimmermann split enumeration of weight-w combinations), beside a naive
    numpy baseline on the same code (every codeword as a matrix product, weights by
    summing) and the ratio between them;
    and two scalar C programs compiled on the spot with ``cc`` (no vector
    instructions), so that the ratios hold on any machine: the plain loop (the last
    row of each combination in the inner loop) and the split enumeration of the
    kernels (the same head combinations and tail tables, so the ratio to it is the
    gain of the vectorised scan alone);
(b) the time to prove d for a fixed list of codes, with 1 worker and with all workers;
(c) high-rate codes (the issue-15 targets), whose proofs take the dual-side route;
(d) codes with automorphisms (issue 15, point 2): the proof with the detected cyclic or
    quasi-cyclic structure beside the plain engine (``use_symmetry=False``) on the same
    machine in the same run, and their ratio;
(e) whole processes: ``gf2codes verify`` of the high-rate codes of (c), read from matrix
    files, wall time from start to exit (median of 3 after a warm-up run), with
    ``--weights never`` (n, k, d and the verdict) and with the default ``auto``.

The CPU's vector features, numba's target (``NUMBA_CPU_NAME``/``NUMBA_CPU_FEATURES``;
``NUMBA_CPU_NAME=haswell NUMBA_CPU_FEATURES=""`` gives AVX2-only code) and the load
average are printed first: on a shared machine the figures move with the load.

Run ``python scripts/bench_distance.py`` (about 12 minutes on 2 cores, most of it the
plain BCH [127,64] proof) or ``--quick`` to skip that code. Numba's cache is warmed
before anything is timed.
"""

from __future__ import annotations

import argparse
import json
import os
import platform
import shutil
import subprocess
import tempfile
import time
from pathlib import Path

import numpy as np

from gf2codes import _kernels, families
from gf2codes._kernels import gray_layout as _gray_layout
from gf2codes.code import Code
from gf2codes.distance import minimum_distance
from gf2codes.distance._bz import _TAIL_MAX
from gf2codes.distance._bz import InfoSetMatrix as _InfoSetMatrix
from gf2codes.distance._bz import Shared as _Shared
from gf2codes.distance._bz import level_tasks as _level_tasks
from gf2codes.distance._bz import run_task as _run_task
from gf2codes.distance._result import Best as _Best
from gf2codes.distance._result import ProofClock as _Clock


def naive_rate(code: Code, k_used: int = 18) -> float:
    """Codewords per second of the obvious numpy method: messages @ G mod 2, row sums."""
    G = code.G[:k_used].astype(np.int64)
    msgs = ((np.arange(1 << k_used)[:, None] >> np.arange(k_used)) & 1).astype(np.int64)
    t = time.process_time()
    words = (msgs @ G) & 1
    w = words.sum(axis=1)
    int(w[1:].min())
    return (1 << k_used) / (time.process_time() - t)


#: Timed repetitions of each throughput figure; the best is printed (on a shared
#: machine the slower ones measure the neighbours).
REPEAT = 3


def gray_rate(code: Code) -> float:
    """Codewords per second of Gray-code enumeration over all 2^k codewords (no early exit)."""
    rows = np.array(code.packed_generator, dtype=np.uint64, order="C")
    OT, TT, _ = _gray_layout(rows)
    kern = _kernels.gray_min_weight.dispatcher  # compiled (a small call would use the twin)
    kern(OT, TT, 0, 2, -1)
    best = 0.0
    for _ in range(REPEAT):
        t = time.process_time()
        kern(OT, TT, 0, 1 << OT.shape[1], -1)
        best = max(best, (1 << code.k) / (time.process_time() - t))
    return best


def split_rate(code: Code, w: int) -> float:
    """Codewords per second of the Brouwer–Zimmermann enumeration of every weight-w
    combination of one systematic generator (one thread, no early exit)."""
    from gf2codes import linalg

    e = linalg.rref(code.packed_generator, n=code.n)
    m = _InfoSetMatrix(e.rows, code.k, code.k)
    for ww in range(1, w):  # warm the tables and the kernels
        for task in _level_tasks(m, ww, split=False):
            _run_task(task, m, _Shared(_Clock(None, None), _Best(code.n)), -1, 0)
    best = 0.0
    for _ in range(REPEAT):
        clock = _Clock(None, None)
        sh = _Shared(clock, _Best(code.n))
        t = time.process_time()
        for task in _level_tasks(m, w, split=False):
            _run_task(task, m, sh, -1, 0)
        best = max(best, clock.done / (time.process_time() - t))
    return best


_C_SCALAR = r"""
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>
/* Least weight over all sums of exactly w of k rows of W = 2 words (n <= 128): the
   prefix of w - 1 rows is advanced lexicographically, the last row runs in the inner
   loop, one XOR and one popcount per codeword -- the enumeration the numba kernel
   does, compiled without vector instructions. */
int main(int argc, char **argv) {
    int k = atoi(argv[1]), w = atoi(argv[2]);
    uint64_t r0[64], r1[64], s = 88172645463325252ULL;
    for (int i = 0; i < k; i++) {
        s ^= s << 13; s ^= s >> 7; s ^= s << 17; r0[i] = s;
        s ^= s << 13; s ^= s >> 7; s ^= s << 17; r1[i] = s;
    }
    int c[64]; uint64_t p0[65], p1[65];
    int p = w - 1;
    for (int i = 0; i < p; i++) c[i] = i;
    p0[0] = p1[0] = 0;
    for (int i = 0; i < p; i++) { p0[i + 1] = p0[i] ^ r0[c[i]]; p1[i + 1] = p1[i] ^ r1[c[i]]; }
    struct timespec t0, t1;
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t0);
    long long visited = 0; int best = 1 << 30;
    for (;;) {
        int lo = p > 0 ? c[p - 1] + 1 : 0;
        uint64_t a = p0[p], b = p1[p];
        for (int i = lo; i < k; i++) {
            int wt = __builtin_popcountll(a ^ r0[i]) + __builtin_popcountll(b ^ r1[i]);
            if (wt < best) best = wt;
        }
        visited += k - lo;
        int i = p - 1;
        while (i >= 0 && c[i] == k - w + i) i--;
        if (i < 0) break;
        c[i]++;
        for (int j = i + 1; j < p; j++) c[j] = c[j - 1] + 1;
        for (int l = i; l < p; l++) { p0[l + 1] = p0[l] ^ r0[c[l]]; p1[l + 1] = p1[l] ^ r1[c[l]]; }
    }
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t1);
    double dt = (t1.tv_sec - t0.tv_sec) + 1e-9 * (t1.tv_nsec - t0.tv_nsec);
    printf("%lld %d %.6f\n", visited, best, dt);
    return 0;
}
"""


_C_SPLIT = r"""
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>
/* The split Brouwer-Zimmermann enumeration of every sum of exactly w of k rows of
   W = 2 words, scalar: the k rows are cut into a head of a = k - b rows and a tail
   of b rows; for each w2 the sums of every w2-subset of the tail are tabulated
   (contiguous arrays, one per word), and for each (w - w2)-subset of the head the
   whole table is scanned, one XOR and one popcount per word and codeword.  The same
   work as the numba kernel, compiled without vector instructions. */
static long long binom(int n, int r) {
    if (r < 0 || r > n) return 0;
    long long x = 1;
    for (int i = 0; i < r; i++) x = x * (n - i) / (i + 1);
    return x;
}
int main(int argc, char **argv) {
    int k = atoi(argv[1]), w = atoi(argv[2]), b = atoi(argv[3]);
    if (b > k - 1) b = k - 1;
    int a = k - b;
    uint64_t r0[128], r1[128], s = 88172645463325252ULL;
    for (int i = 0; i < k; i++) {
        s ^= s << 13; s ^= s >> 7; s ^= s << 17; r0[i] = s;
        s ^= s << 13; s ^= s >> 7; s ^= s << 17; r1[i] = s;
    }
    struct timespec t0, t1;
    long long visited = 0; int best = 1 << 30;
    long long maxL = binom(b, b / 2) + 1;
    uint64_t *T0 = malloc(8 * maxL), *T1 = malloc(8 * maxL);
    double dt = 0;
    for (int w2 = 0; w2 <= (w < b ? w : b); w2++) {
        int w1 = w - w2;
        if (w1 > a) continue;
        /* the table of the w2-subsets of the tail (not timed, as in the numba figure
           where the tables are built during warm-up) */
        long long L = 0;
        int c[128]; uint64_t p0[129], p1[129];
        if (w2 > 0) {
            for (int i = 0; i < w2; i++) c[i] = i;
            for (;;) {
                uint64_t x0 = 0, x1 = 0;
                for (int i = 0; i < w2; i++) { x0 ^= r0[a + c[i]]; x1 ^= r1[a + c[i]]; }
                T0[L] = x0; T1[L] = x1; L++;
                int i = w2 - 1;
                while (i >= 0 && c[i] == b - w2 + i) i--;
                if (i < 0) break;
                c[i]++;
                for (int j = i + 1; j < w2; j++) c[j] = c[j - 1] + 1;
            }
        }
        clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t0);
        if (w2 == 0) {  /* plain: prefix of w1 - 1 head rows, the last one in the loop */
            int p = w1 - 1;
            for (int i = 0; i < p; i++) c[i] = i;
            p0[0] = p1[0] = 0;
            for (int i = 0; i < p; i++) {
                p0[i + 1] = p0[i] ^ r0[c[i]]; p1[i + 1] = p1[i] ^ r1[c[i]];
            }
            for (;;) {
                int lo = p > 0 ? c[p - 1] + 1 : 0;
                uint64_t x = p0[p], y = p1[p];
                for (int i = lo; i < a; i++) {
                    int wt = __builtin_popcountll(x ^ r0[i]) + __builtin_popcountll(y ^ r1[i]);
                    if (wt < best) best = wt;
                }
                visited += a - lo;
                int i = p - 1;
                while (i >= 0 && c[i] == a - 1 - p + i) i--;
                if (i < 0) break;
                c[i]++;
                for (int j = i + 1; j < p; j++) c[j] = c[j - 1] + 1;
                for (int l = i; l < p; l++) {
                    p0[l + 1] = p0[l] ^ r0[c[l]]; p1[l + 1] = p1[l] ^ r1[c[l]];
                }
            }
        } else {  /* every w1-subset of the head, the whole table for each */
            for (int i = 0; i < w1; i++) c[i] = i;
            p0[0] = p1[0] = 0;
            for (int i = 0; i < w1; i++) {
                p0[i + 1] = p0[i] ^ r0[c[i]]; p1[i + 1] = p1[i] ^ r1[c[i]];
            }
            for (;;) {
                uint64_t x = p0[w1], y = p1[w1];
                for (long long t = 0; t < L; t++) {
                    int wt = __builtin_popcountll(x ^ T0[t]) + __builtin_popcountll(y ^ T1[t]);
                    if (wt < best) best = wt;
                }
                visited += L;
                int i = w1 - 1;
                while (i >= 0 && c[i] == a - w1 + i) i--;
                if (i < 0) break;
                c[i]++;
                for (int j = i + 1; j < w1; j++) c[j] = c[j - 1] + 1;
                for (int l = i; l < w1; l++) {
                    p0[l + 1] = p0[l] ^ r0[c[l]]; p1[l + 1] = p1[l] ^ r1[c[l]];
                }
            }
        }
        clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t1);
        dt += (t1.tv_sec - t0.tv_sec) + 1e-9 * (t1.tv_nsec - t0.tv_nsec);
    }
    printf("%lld %d %.6f\n", visited, best, dt);
    return 0;
}
"""


def _run_c(source: str, *args: int) -> float | None:
    """Codewords per second of a C program printing ``visited best seconds`` (None when
    no C compiler is found); compiled on the spot without vector instructions."""
    cc = shutil.which("cc") or shutil.which("gcc") or shutil.which("clang")
    if cc is None:
        return None
    with tempfile.TemporaryDirectory() as tmp:
        src, exe = Path(tmp) / "scalar.c", Path(tmp) / "scalar"
        src.write_text(source)
        flags = ["-O2", "-fno-tree-vectorize", "-fno-tree-slp-vectorize", "-mpopcnt"]
        subprocess.run([cc, *flags, "-o", str(exe), str(src)], check=True)
        best = 0.0
        for _ in range(REPEAT):
            visited, _best, dt = subprocess.run([str(exe), *map(str, args)], check=True,
                                                capture_output=True, text=True).stdout.split()
            best = max(best, int(visited) / float(dt))
    return best


def scalar_c_rate(k: int, w: int) -> float | None:
    """Codewords per second of the plain scalar C loop (last row in the inner loop)."""
    return _run_c(_C_SCALAR, k, w)


def scalar_c_split_rate(k: int, w: int, b: int) -> float | None:
    """Codewords per second of the scalar C split enumeration: the same head
    combinations and tail tables (``b`` rows) as the Brouwer–Zimmermann kernels, so the
    ratio to the numba figure is the gain of the vectorised scan alone."""
    return _run_c(_C_SPLIT, k, w, b)


def cpu_report() -> str:
    """The CPU's vector features, numba's target and the load average, in one line."""
    flags: set[str] = set()
    try:
        for line in Path("/proc/cpuinfo").read_text().splitlines():
            if line.startswith("flags"):
                flags = set(line.split(":", 1)[1].split())
                break
    except OSError:
        pass
    vec = sorted(f for f in flags if f.startswith(("avx", "sse4", "popcnt")))
    target = os.environ.get("NUMBA_CPU_NAME", "host")
    feats = os.environ.get("NUMBA_CPU_FEATURES")
    load = os.getloadavg() if hasattr(os, "getloadavg") else ("?",) * 3
    return (f"CPU vector features: {' '.join(vec) or 'unknown'}\n"
            f"numba target: NUMBA_CPU_NAME={target} NUMBA_CPU_FEATURES="
            f"{'(host)' if feats is None else repr(feats)}\n"
            f"load average: {' '.join(f'{x:.2f}' for x in load)} on {os.cpu_count()} cores")


def random_code(n: int, k: int, seed: int) -> Code:
    rng = np.random.default_rng(seed)
    return Code(rng.integers(0, 2, size=(k, n), dtype=np.uint8))


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--quick", action="store_true", help="skip the BCH [127,64] proof")
    ap.add_argument("--only", choices=("a", "b", "c", "d", "e"), help="run only one section")
    args = ap.parse_args()
    cores = os.cpu_count() or 1
    print(f"# gf2codes distance benchmark — {platform.processor() or platform.machine()}, "
          f"{cores} cores, numpy {np.__version__}")
    print(cpu_report())
    minimum_distance(families.hamming(3))  # warm numba's cache
    minimum_distance(families.hamming(4), method="dual-columns")

    if args.only in (None, "a"):
        print("\n## (a) enumeration throughput, one core")
        print("| code | engine | codewords/s | naive numpy codewords/s | ratio |")
        print("|---|---|---|---|---|")
        ratios = ""
        # the last row is the multi-word path (4 words per row)
        for n, k, w in ((64, 32, 6), (128, 32, 6), (256, 28, 5)):
            C = random_code(n, k, seed=2026)
            base = naive_rate(C)
            g = gray_rate(C)
            s = split_rate(random_code(n, 48, seed=7), w + 1)
            print(f"| random [{n},{k}] | Gray code, all 2^{k} | {g:.3g} | {base:.3g} | "
                  f"{g / base:.0f}x |")
            print(f"| random [{n},48] | Brouwer–Zimmermann, all C(48,{w + 1}) | {s:.3g} | "
                  f"{base:.3g} | {s / base:.0f}x |")
            if n == 128:
                c = scalar_c_rate(48, w + 1)
                c2 = scalar_c_split_rate(48, w + 1, _TAIL_MAX)
                if c is not None and c2 is not None:
                    print(f"| random 2-word rows, k = 48 | scalar C loop, all C(48,{w + 1}) | "
                          f"{c:.3g} | {base:.3g} | {c / base:.0f}x |")
                    print(f"| random 2-word rows, k = 48 | scalar C split enumeration "
                          f"(tables of {_TAIL_MAX} rows), all C(48,{w + 1}) | {c2:.3g} | "
                          f"{base:.3g} | {c2 / base:.0f}x |")
                    ratios = (f"\nBrouwer–Zimmermann 2-word kernel / scalar C loop: {s / c:.2f}x; "
                              f"/ scalar C split enumeration (the same work): {s / c2:.2f}x")
        if ratios:
            print(ratios)

    if args.only in (None, "b"):
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

    if args.only in (None, "c"):
        print("\n## (c) high-rate codes: time to prove d (route chosen by estimated work)")
        print("| code | d | route | subsets or codewords | seconds |")
        print("|---|---|---|---|---|")
        high = [
            ("BCH [255,231] (designed 7)", families.bch(255, 7)),
            ("BCH [511,484] (designed 7)", families.bch(511, 7)),
            ("random [1024,994], seed 1024", random_code(1024, 994, 1024)),
            ("BCH [255,223] (designed 9)", families.bch(255, 9)),
        ]
        for label, C in high:
            t = time.perf_counter()
            r = minimum_distance(C, time_limit=120)
            dt = time.perf_counter() - t
            print(f"| {label} | {r.d if r.exact else f'{r.lower}..{r.upper}'} | {r.method} | "
                  f"{r.codewords:.3g} | {dt:.3f} |", flush=True)

    if args.only in (None, "d"):
        symmetry_rows(cores, quick=args.quick)

    if args.only in (None, "e"):
        whole_process_rows()


def whole_process_rows() -> None:
    """Section (e): ``gf2codes verify FILE`` as a user runs it, one process per run."""
    import statistics
    import sys

    from gf2codes.formats import write_code

    print("\n## (e) whole process: gf2codes verify FILE (median of 3, warm caches)")
    print("| code | --weights | seconds | d |")
    print("|---|---|---|---|")
    codes = [
        ("BCH [255,231] (designed 7)", families.bch(255, 7)),
        ("BCH [511,484] (designed 7)", families.bch(511, 7)),
        ("random [1024,994], seed 1024", random_code(1024, 994, 1024)),
        ("BCH [255,223] (designed 9)", families.bch(255, 9)),
    ]
    with tempfile.TemporaryDirectory() as tmp:
        for label, C in codes:
            path = Path(tmp) / "code.txt"
            write_code(C, path)
            for weights in ("never", "auto"):
                cmd = [sys.executable, "-m", "gf2codes", "verify", str(path), "--weights",
                       weights, "--json"]
                times, d = [], None
                for run in range(4):  # the first run warms numba's and the memos' caches
                    t = time.perf_counter()
                    out = subprocess.run(cmd, capture_output=True, text=True, check=True)
                    if run:
                        times.append(time.perf_counter() - t)
                    d = json.loads(out.stdout)["d"]
                print(f"| {label} | {weights} | {statistics.median(times):.2f} | {d} |",
                      flush=True)


def quasi_cyclic_example(m: int, blocks: int) -> Code:
    """A seeded (seed ``m``) random quasi-cyclic code of ``blocks`` circulants of size
    ``m`` (one generating row): ``[blocks * m, m]`` when the first circulant has full
    rank."""
    rng = np.random.default_rng(m)
    row = "".join(map(str, rng.integers(0, 2, m * blocks)))
    return families.quasi_cyclic([row], m)


def symmetry_rows(cores: int, *, quick: bool) -> None:
    """(d): the automorphism plans against the plain engine, same run, same load."""
    print("\n## (d) automorphisms: the plan with the detected group beside the plain engine")
    print("| code | d | argument | workers | codewords | seconds | load | plain codewords | "
          "plain seconds | load | ratio |")
    print("|---|---|---|---|---|---|---|---|---|---|---|")
    cases = [("QR [47,24]", families.quadratic_residue(47), (1,)),
             ("BCH [63,36]", families.bch(63, 11), (1,)),
             ("quasi-cyclic [122,61], seed 61", quasi_cyclic_example(61, 2), (1, cores)),
             ("quasi-cyclic [123,41], seed 41", quasi_cyclic_example(41, 3), (1,))]
    if not quick:
        cases.append(("BCH [127,64]", families.bch(127, 21), tuple(sorted({1, cores}))))
    for use in (True, False):  # load every kernel either plan calls before timing
        for workers in sorted({1, cores}):
            minimum_distance(families.quadratic_residue(47), workers=workers,
                             method="brouwer-zimmermann", use_symmetry=use)
    for label, C, worker_counts in cases:
        for workers in worker_counts:
            row = []
            for use in (True, False):
                if not use and label.startswith("BCH [127") and workers == 1:
                    row += [None, None, None, None]  # the plain 1-worker run: ~7 min
                    continue
                load = os.getloadavg()[0] if hasattr(os, "getloadavg") else float("nan")
                t = time.perf_counter()
                r = minimum_distance(C, workers=workers, max_work=None,
                                     method="brouwer-zimmermann", use_symmetry=use)
                row += [r, time.perf_counter() - t, load, r.argument]
            r, dt, load, arg, p, pdt, pload, _parg = row
            plain = (f"{p.codewords:.3g} | {pdt:.2f} | {pload:.2f} | {pdt / dt:.1f}x"
                     if p is not None else "— | — | — | —")
            print(f"| {label} | {r.d} | {arg} | {workers} | {r.codewords:.3g} | {dt:.2f} | "
                  f"{load:.2f} | {plain} |", flush=True)


if __name__ == "__main__":
    main()
