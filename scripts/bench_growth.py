"""The growth job on 1 and on 2 local Dask workers: same step-limited region, same codes.

Run from the repository root::

    python scripts/bench_growth.py                       # n 33-40, 16 cells, 10 steps
    python scripts/bench_growth.py --n 33-48 --cells 24 --max-steps 20

Each run starts from a fresh catalog holding the shipped seed, grows the first
``--cells`` open cells of the region with the same step budget and seed, and prints the
wall time (the cluster's start-up excluded), the speed-up, and whether both runs found
exactly the same codes. Prints the load average and the CPU's vector features beside
the figures (``NUMBA_CPU_NAME=haswell NUMBA_CPU_FEATURES=""`` gives AVX2-only kernels).
"""

from __future__ import annotations

import argparse
import os
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from gf2codes.catalog import open_catalog  # noqa: E402
from gf2codes.growth import grow, region_cells  # noqa: E402
from gf2codes.parallel import DaskCluster  # noqa: E402


def _features() -> str:
    name = os.environ.get("NUMBA_CPU_NAME")
    if name:
        return f"NUMBA_CPU_NAME={name}"
    try:
        flags = next(line for line in open("/proc/cpuinfo") if line.startswith("flags"))
    except (OSError, StopIteration):
        return "unknown"
    have = [f for f in ("avx2", "avx512f", "avx512bw") if f" {f}" in flags]
    return "host (" + ", ".join(have) + ")"


def run(workers: int, cells, args) -> tuple[float, list, list]:
    with tempfile.TemporaryDirectory() as tmp, DaskCluster(local_workers=workers) as ex:
        with open_catalog(Path(tmp) / "c.sqlite") as cat:
            t0 = time.perf_counter()
            s = grow(cat, cells, max_steps=args.max_steps, seed=args.seed, batch=args.batch,
                     max_cells=args.cells, executor=ex)
            seconds = time.perf_counter() - t0
            results = sorted((r.n, r.k, r.d_before, r.d_found, r.outcome) for r in s.results)
            lengths = sorted({n for n, _ in cells})
            table = [(r["n"], r["k"], r["d"]) for r in cat.distance_table(lengths)]
    return seconds, results, table


def main() -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--n", default="33-40")
    ap.add_argument("--cells", type=int, default=16)
    ap.add_argument("--max-steps", type=int, default=10)
    ap.add_argument("--batch", type=int, default=8)
    ap.add_argument("--seed", type=int, default=1)
    args = ap.parse_args()
    lo, hi = (int(x) for x in args.n.split("-"))
    cells = region_cells(lengths=range(lo, hi + 1))
    print(f"load average {os.getloadavg()[0]:.2f} at the start; CPU {_features()}")
    t1, r1, table1 = run(1, cells, args)
    print(f"1 Dask worker:  {t1:7.1f} s for {len(r1)} cells "
          f"({sum(x[4] == 'improved' for x in r1)} improved)")
    t2, r2, table2 = run(2, cells, args)
    print(f"2 Dask workers: {t2:7.1f} s for {len(r2)} cells "
          f"({sum(x[4] == 'improved' for x in r2)} improved)")
    same = r1 == r2 and table1 == table2
    print(f"speed-up {t1 / t2:.2f}x; identical results: {'yes' if same else 'NO'}; "
          f"load average {os.getloadavg()[0]:.2f} at the end")
    return 0 if same else 1


if __name__ == "__main__":
    sys.exit(main())
