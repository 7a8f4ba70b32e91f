"""Codes with prescribed automorphism groups for the open cells of small dimension,
whose finds the seed builder carries (``scripts/seed_orbit_records.jsonl``).

Run from the repository root, against a catalog built from the shipped seed::

    nice -n 19 python scripts/search_orbit_targets.py --catalog /tmp/base.sqlite --pool 2

For every open cell ``(n, k)`` with ``n <= --n-max`` and ``k <= gf2codes.search._orbits.MAX_K``
(catalog d below the best proved upper bound), the target is one more than the
catalog's d. Each round draws a random invertible matrix, takes a power of it with a
manageable number of orbits and solves the integer program of
:mod:`gf2codes.search._orbits` (Braun, Kohnert & Wassermann 2005) with its node limit;
a solution is a code, whose distance is then computed exactly. After a hit the target
goes up by one (while below the bound) and the rounds start again. Every cell has its
own generator, seeded with (``--seed``, n, k), and reads only the base catalog, so the
finds depend neither on the order of the cells nor on ``--pool``. The codes that improve
on the catalog are written as catalog records (recipe, seed) for
:func:`build_catalog.carried`, which re-proves every one on import.
"""

from __future__ import annotations

import argparse
import multiprocessing
import os
import sys
import tempfile
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from gf2codes import families as F  # noqa: E402
from gf2codes.catalog import open_catalog  # noqa: E402
from gf2codes.distance import minimum_distance  # noqa: E402
from gf2codes.search._orbits import (  # noqa: E402
    MAX_K,
    orbit_code,
    orbit_system,
    random_invertible,
    solve_orbit_system,
)

SEED = 2027
OUT = ROOT / "scripts" / "seed_orbit_records.jsonl"


def search_cell(task: tuple[int, int, int, int, int, int]) -> list[tuple[list[str], int]]:
    """The improving codes for one cell: ``(generator rows, d)``, best last."""
    n, k, have, bound, rounds, seed = task
    rng = np.random.default_rng([seed, n, k])
    out: list[tuple[list[str], int]] = []
    D = have + 1
    tries = 0
    while D <= bound and tries < rounds:
        tries += 1
        system = orbit_system(k, random_invertible(k, rng), rng)
        if system is None:
            continue
        mult = solve_orbit_system(system, n, D)
        if mult is None:
            continue
        code = orbit_code(system, mult)
        res = minimum_distance(code)
        if code.k != k or not res.exact or res.d < D:  # pragma: no cover - a solver slip
            continue
        out.append((list(code.recipe[0]["generator"]), res.d))  # the echelon rows
        D = res.d + 1
        tries = 0
    return out


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--catalog", required=True, help="a catalog built from the shipped seed")
    ap.add_argument("--output", default=str(OUT))
    ap.add_argument("--rounds", type=int, default=40,
                    help="groups tried per target without a hit (default %(default)s)")
    ap.add_argument("--n-max", type=int, default=64)
    ap.add_argument("--k-max", type=int, default=MAX_K,
                    help=f"largest dimension (default and at most {MAX_K})")
    ap.add_argument("--pool", type=int, default=1, help="processes")
    ap.add_argument("--seed", type=int, default=SEED)
    args = ap.parse_args(argv)
    start = time.perf_counter()

    def log(msg: str) -> None:
        print(f"[{time.perf_counter() - start:7.1f} s] {msg}", flush=True)

    log(f"load average {os.getloadavg()}")
    with open_catalog(args.catalog) as cat:
        rows = cat.distance_table(range(1, args.n_max + 1))
    tasks = [(r["n"], r["k"], r["d"], r["bound"], args.rounds, args.seed) for r in rows
             if r["d"] < r["bound"] and 2 <= r["k"] <= min(args.k_max, MAX_K)]
    tasks.sort(key=lambda t: (t[1], t[0]))
    log(f"{len(tasks)} open cells with k <= {min(args.k_max, MAX_K)}, n <= {args.n_max}")
    found: list[tuple[list[str], int]] = []
    with multiprocessing.get_context("spawn").Pool(args.pool) as pool:
        for task, hits in zip(tasks, pool.imap(search_cell, tasks), strict=True):
            if hits:
                found.append(hits[-1])
                log(f"[{task[0]},{task[1]}] d {task[2]} -> {hits[-1][1]} "
                    f"(bound {task[3]})")
    with tempfile.TemporaryDirectory() as tmp:
        with open_catalog(Path(tmp) / "orbits.sqlite", shipped=False) as out:
            for gen, d in found:
                out.add(F.from_rows(gen), d=d, recipe=[{"strategy": "orbits", "seed": args.seed}],
                        source="search", seed=args.seed,
                        proof={"method": "search", "strategy": "orbits"})
            with open(args.output, "w", encoding="utf-8") as fh:
                count = out.export(fh, stamps=False)
    log(f"wrote {count} records to {args.output}; load average {os.getloadavg()}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
