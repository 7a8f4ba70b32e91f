"""Write ``gf2codes/_nonexistence.jsonl``: exhaustive non-existence results for the table.

For every open cell ``(n, k)`` with ``n <= --max-n`` (the shipped catalog's best proved
``d`` is below the best upper bound ``U`` of :func:`gf2codes.bounds.best_upper`), decide
by exhaustive search (:func:`gf2codes.existence.decide_existence`) whether an
``[n, k, U]`` code exists, within a node budget. A "none" is recorded and the table is
recomputed (the propagation rules carry it to other cells), and the sweep repeats until
no open cell is decided. Each cell is tried with the method
:func:`gf2codes.existence.choose_method` picks, then (if that one stops undecided) with
the other one, each within the budget. An "exists" means the catalog lacks a code the
search found: its generator is kept in ``scripts/existence_found_codes.jsonl`` and every
such code, its distance proved again by the distance engine, is written as a shipped
catalog record to ``catalog/exhaustive.jsonl`` (imported with the seed; regenerate it
alone with ``--records-only``). Prints the open-cell counts for n <= 32 and n <= 64
before and after, with the load average.

    python scripts/build_nonexistence.py --max-n 32 --budget 300000

``--only N,K,D`` (repeatable) decides just the named ``[N, K, D]`` questions, with no
time limit unless one is given, and records each "none"; this is how decisions too long
for the sweep are added, e.g. ``--only 30,7,13`` (48,078 nodes, about 4 minutes on one
AVX2 core).
"""

from __future__ import annotations

import argparse
import json
import os
import tempfile
import time
from pathlib import Path

from gf2codes import bounds as B
from gf2codes._columns import HYPERPLANE_REDUNDANCY
from gf2codes.catalog import open_catalog
from gf2codes.existence import choose_method, decide_existence

OUT = Path(B.NONEXISTENCE_FILE)
ROOT = Path(__file__).resolve().parent.parent
FOUND = ROOT / "scripts" / "existence_found_codes.jsonl"
RECORDS = ROOT / "catalog" / "exhaustive.jsonl"


def _found() -> dict[tuple[int, int, int], dict]:
    out = {}
    for line in FOUND.read_text().splitlines() if FOUND.exists() else []:
        if line.strip():
            rec = json.loads(line)
            out[(rec["n"], rec["k"], rec["d"])] = rec
    return out


def keep_found(n: int, k: int, d: int, by: str, generator: list[list[int]]) -> None:
    """Add a code found by an "exists" decision to ``FOUND`` (sorted, one per cell)."""
    found = _found()
    found[(n, k, d)] = {"n": n, "k": k, "d": d, "by": by,
                        "generator": ["".join(map(str, row)) for row in generator]}
    FOUND.write_text("".join(json.dumps(found[key]) + "\n" for key in sorted(found)))


def write_records() -> int:
    """Write ``RECORDS``: every found code as a catalog record, d proved here again.

    Goes through a private catalog (no shipped records) and its export without stamps
    (the shipped format); timing fields of the proof are dropped, so the same codes give
    the same bytes.
    """
    import shutil

    import numpy as np

    from gf2codes.code import Code
    from gf2codes.distance import minimum_distance

    with tempfile.TemporaryDirectory() as td:
        # the cells the shipped seed already answers as well need no record of their own
        os.makedirs(os.path.join(td, "seed"))
        shutil.copy(ROOT / "catalog" / "seed.jsonl", os.path.join(td, "seed"))
        os.environ["GF2CODES_SHIPPED_CATALOG"] = os.path.join(td, "seed")
        with open_catalog(os.path.join(td, "s.db")) as seeded:
            have = {key: seeded.pick(n=key[0], k=key[1]) for key in _found()}
        answered = {key for key, e in have.items() if e is not None and e.d >= key[2]}
    os.environ["GF2CODES_SHIPPED_CATALOG"] = "none"
    with tempfile.TemporaryDirectory() as td, open_catalog(os.path.join(td, "c.db")) as cat:
        for (n, k, d), rec in sorted(_found().items()):
            if (n, k, d) in answered:
                continue
            rows = np.array([[int(c) for c in row] for row in rec["generator"]], dtype=np.uint8)
            code = Code(rows)
            res = minimum_distance(code)
            if not res.exact or res.d < d:
                raise SystemExit(f"[{n},{k},{d}] in {FOUND.name}: d not proved ({res.d})")
            cat.add(code, d=res.d, source="exhaustive", proof={"method": res.method})
        lines = []
        import io

        buf = io.StringIO()
        cat.export(buf, stamps=False)
        for line in buf.getvalue().splitlines():
            rec = json.loads(line)
            rec.get("proof", {}).pop("seconds", None)
            lines.append(json.dumps(rec))
    RECORDS.write_text("".join(line + "\n" for line in lines))
    return len(lines)


def open_cells(cat, max_n: int) -> list[dict]:
    return [r for r in cat.distance_table(range(1, max_n + 1)) if r["d"] < r["bound"]]


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--max-n", type=int, default=32)
    ap.add_argument("--budget", type=int, default=300_000, help="nodes per decision")
    ap.add_argument("--time-limit", type=float, default=None,
                    help="seconds per decision (default 60; none with --only)")
    ap.add_argument("--only", action="append", default=[], metavar="N,K,D",
                    help="decide only these [N,K,D] questions (no time limit unless "
                         "--time-limit is given)")
    ap.add_argument("--records-only", action="store_true",
                    help=f"only rewrite {RECORDS.name} from {FOUND.name}")
    args = ap.parse_args()
    if args.records_only:
        print(f"{write_records()} records written to {RECORDS}")
        return
    print("load average:", os.getloadavg())
    if args.time_limit is None and not args.only:
        args.time_limit = 60.0
    facts = {}
    for line in OUT.read_text().splitlines() if OUT.exists() else []:
        if line.strip():
            rec = json.loads(line)
            facts[(rec["n"], rec["k"], rec["d"])] = (rec["nodes"], rec.get("method", "rows"))
    tried: set[tuple[int, int, int]] = set()
    with tempfile.TemporaryDirectory() as td:
        cat = open_catalog(os.path.join(td, "catalog.db"))
        before = {m: len(open_cells(cat, m)) for m in (32, 64)}
        print("open cells before:", before)
        only = []
        for spec in args.only:
            try:
                n, k, d = (int(x) for x in spec.split(","))
            except ValueError:
                raise SystemExit(f"--only {spec!r}: expected N,K,D") from None
            only.append({"n": n, "k": k, "bound": d})
        progress = True
        while progress:
            progress = False
            for row in only or open_cells(cat, args.max_n):
                n, k, d = row["n"], row["k"], row["bound"]
                if (n, k, d) in tried:
                    continue
                tried.add((n, k, d))
                first = choose_method(n, k, d)
                methods = [first, "rows" if first == "columns" else "columns"]
                if n - k > HYPERPLANE_REDUNDANCY:  # columns without the hyperplane rule:
                    methods = ["rows"]               # the row method is always faster there
                for method in methods:
                    t0 = time.perf_counter()
                    dec = decide_existence(n, k, d, max_nodes=args.budget,
                                           time_limit=args.time_limit, method=method)
                    print(f"[{n},{k},{d}] {method:7s} {dec.status:9s} {dec.nodes:>12,} nodes "
                          f"(+{dec.lemma_nodes:,}) {time.perf_counter() - t0:7.2f} s  "
                          f"{dec.stopped}  load {os.getloadavg()[0]:.1f}", flush=True)
                    if dec.decided:
                        break
                if dec.status == "none":
                    facts[(n, k, d)] = (dec.nodes, dec.method)
                    lines = [json.dumps({"n": a, "k": b, "d": c, "nodes": v, "method": m})
                             for (a, b, c), (v, m) in sorted(facts.items())]
                    OUT.write_text("\n".join(lines) + "\n")
                    B.reset_tables()
                    progress = True
                    break
                if dec.status == "exists":
                    print("   catalog lacks this code; generator [I | A]:", dec.generator())
                    keep_found(n, k, d, dec.how(), dec.generator())
                    print(f"   {write_records()} records in {RECORDS}")
        after = {m: len(open_cells(cat, m)) for m in (32, 64)}
        print("open cells after:", after)
        for row in open_cells(cat, 32):
            print(f"  open ({row['n']},{row['k']}): catalog d = {row['d']}, "
                  f"bound {row['bound']} ({row['bound_by']})")
    print("load average:", os.getloadavg())


if __name__ == "__main__":
    main()
