"""Write ``gf2codes/_nonexistence.jsonl``: exhaustive non-existence results for the table.

For every open cell ``(n, k)`` with ``n <= --max-n`` (the shipped catalog's best proved
``d`` is below the best upper bound ``U`` of :func:`gf2codes.bounds.best_upper`), decide
by exhaustive search (:func:`gf2codes.existence.decide_existence`) whether an
``[n, k, U]`` code exists, within a node budget. A "none" is recorded and the table is
recomputed (the propagation rules carry it to other cells), and the sweep repeats until
no open cell is decided. An "exists" means the catalog lacks a code the search found;
it is printed (the witness generator), not recorded. Prints the open-cell counts for
n <= 32 and n <= 64 before and after, with the load average.

    python scripts/build_nonexistence.py --max-n 32 --budget 300000
"""

from __future__ import annotations

import argparse
import json
import os
import tempfile
import time
from pathlib import Path

from gf2codes import bounds as B
from gf2codes.catalog import open_catalog
from gf2codes.existence import decide_existence

OUT = Path(B.NONEXISTENCE_FILE)


def open_cells(cat, max_n: int) -> list[dict]:
    return [r for r in cat.distance_table(range(1, max_n + 1)) if r["d"] < r["bound"]]


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--max-n", type=int, default=32)
    ap.add_argument("--budget", type=int, default=300_000, help="nodes per decision")
    ap.add_argument("--time-limit", type=float, default=120.0, help="seconds per decision")
    args = ap.parse_args()
    print("load average:", os.getloadavg())
    facts = {(r[0], r[1], r[2]): r[3] for r in B.proved_nonexistence()}
    tried: set[tuple[int, int, int]] = set()
    with tempfile.TemporaryDirectory() as td:
        cat = open_catalog(os.path.join(td, "catalog.db"))
        before = {m: len(open_cells(cat, m)) for m in (32, 64)}
        print("open cells before:", before)
        progress = True
        while progress:
            progress = False
            for row in open_cells(cat, args.max_n):
                n, k, d = row["n"], row["k"], row["bound"]
                if (n, k, d) in tried:
                    continue
                tried.add((n, k, d))
                t0 = time.perf_counter()
                dec = decide_existence(n, k, d, max_nodes=args.budget,
                                       time_limit=args.time_limit)
                print(f"[{n},{k},{d}] {dec.status:9s} {dec.nodes:>10,} nodes "
                      f"{time.perf_counter() - t0:7.2f} s  {dec.stopped}", flush=True)
                if dec.status == "none":
                    facts[(n, k, d)] = dec.nodes
                    lines = [json.dumps({"n": a, "k": b, "d": c, "nodes": v})
                             for (a, b, c), v in sorted(facts.items())]
                    OUT.write_text("\n".join(lines) + "\n")
                    B.reset_tables()
                    progress = True
                    break
                if dec.status == "exists":
                    print("   catalog lacks this code; generator [I | A]:", dec.generator())
        after = {m: len(open_cells(cat, m)) for m in (32, 64)}
        print("open cells after:", after)
        for row in open_cells(cat, 32):
            print(f"  open ({row['n']},{row['k']}): catalog d = {row['d']}, "
                  f"bound {row['bound']} ({row['bound_by']})")
    print("load average:", os.getloadavg())


if __name__ == "__main__":
    main()
