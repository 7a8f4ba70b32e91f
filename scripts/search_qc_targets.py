"""Seeded random search for quasi-cyclic codes in the open cells with the largest gaps,
whose finds the seed builder carries (``scripts/seed_qc_records.jsonl``).

Run from the repository root, against a catalog built from the shipped seed::

    nice -n 19 python scripts/search_qc_targets.py --catalog /tmp/base.sqlite

For every open cell ``(n, k)`` with ``33 <= n <= 64`` and gap (best upper bound minus
best proved d) at least ``--min-gap``, the shapes tried are the quasi-cyclic codes of
index ``p`` (2..5), co-index ``m`` and ``r`` (1..3) generating rows with ``p m`` from
``n`` to ``n + 2`` and ``r m`` from ``k`` to ``k + 2`` (shortening and puncturing bring
them into the cell). Each shape draws ``--rounds`` random generators from its own
generator seeded with (``--seed``, p, m, r), so the finds do not depend on the order
of the shapes; each candidate is first tested against the best d known for its
``[p m, r m]`` cell (the engine stops at the first lighter word), and only a candidate
that passes is proved in full. The codes that improve on the catalog are written as
catalog records (recipe, seed) for :func:`build_catalog.carried`; the catalog re-proves
every one on import (Huffman & Pless, section 9.8: good codes of rate 1/p and 2/p
are often quasi-cyclic).
"""

from __future__ import annotations

import argparse
import sys
import tempfile
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from gf2codes import families as F  # noqa: E402
from gf2codes.catalog import open_catalog  # noqa: E402
from gf2codes.catalog.checks import CHEAP_PROOF_WORK, CHEAP_WEIGHT_WORDS  # noqa: E402
from gf2codes.catalog.propagation import reach_distance  # noqa: E402
from gf2codes.distance import minimum_distance  # noqa: E402
from gf2codes.exceptions import Gf2CodesError, TooExpensiveError  # noqa: E402

SEED = 2026
OUT = ROOT / "scripts" / "seed_qc_records.jsonl"


def shapes_for(cells: list[tuple[int, int]]) -> list[tuple[int, int, int]]:
    """The (p, m, r) shapes whose ``[p m, r m]`` codes lie at or just above the cells."""
    out = set()
    for n, k in cells:
        for r in (1, 2, 3):
            for p in range(2, 6):
                for m in range(4, 33):
                    if n <= p * m <= min(n + 2, 68) and k <= r * m <= k + 2 and r < p:
                        out.add((p, m, r))
    return sorted(out)


def provable(code, d_work: int = CHEAP_PROOF_WORK) -> bool:
    """Whether a new catalog proves this code's d on import (cheap weights, or the engine
    within :data:`gf2codes.catalog.checks.CHEAP_PROOF_WORK`)."""
    if (1 << min(code.k, code.n - code.k)) <= CHEAP_WEIGHT_WORDS:
        return True
    try:
        return minimum_distance(code, max_work=d_work).exact
    except TooExpensiveError:
        return False


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--catalog", required=True, help="a catalog built from the shipped seed")
    ap.add_argument("--output", default=str(OUT))
    ap.add_argument("--rounds", type=int, default=300, help="random generators per shape")
    ap.add_argument("--min-gap", type=int, default=3)
    ap.add_argument("--seed", type=int, default=SEED)
    args = ap.parse_args(argv)
    start = time.perf_counter()

    def log(msg: str) -> None:
        print(f"[{time.perf_counter() - start:7.1f} s] {msg}", flush=True)

    with open_catalog(args.catalog) as cat:
        rows = cat.distance_table(range(33, 65))
        arrays = cat.arrays().only_proved()
    _, N0, K0, L0, _, _ = arrays
    cells = [(r["n"], r["k"]) for r in rows if r["bound"] - r["d"] >= args.min_gap]
    shapes = shapes_for(cells)
    log(f"{len(cells)} cells with gap >= {args.min_gap}; {len(shapes)} shapes")
    found = []

    def best_at(n: int, k: int) -> int:
        have = int(reach_distance(N0, K0, L0, n, k).max()) if N0.size else 0
        if found:
            fn = np.array([c.n for c, _ in found])
            fk = np.array([c.k for c, _ in found])
            fd = np.array([d for _, d in found])
            have = max(have, int(reach_distance(fn, fk, fd, n, k).max()))
        return have

    for p, m, r in shapes:
        n, k = p * m, r * m
        rng = np.random.default_rng([args.seed, p, m, r])
        hits = 0
        for _ in range(args.rounds):
            bits = rng.integers(0, 2, (r, n))
            if r == 1:
                bits[0, :m] = 0
                bits[0, 0] = 1  # [I | A_2 | ...]: systematic, rank m
            gens = ["".join(map(str, row)) for row in bits]
            try:
                code = F.quasi_cyclic(gens, m)
            except Gf2CodesError:
                continue
            if code.k != k:
                continue
            target = best_at(n, k) + 1
            try:
                quick = minimum_distance(code, target=target, max_work=CHEAP_PROOF_WORK)
            except TooExpensiveError:
                continue
            if quick.upper < target:
                continue
            try:
                res = minimum_distance(code, max_work=4 * CHEAP_PROOF_WORK)
            except TooExpensiveError:
                continue
            if res.exact and res.d >= target and provable(code):
                found.append((code, res.d))
                hits += 1
                log(f"[{n}, {k}, {res.d}] from shape p={p} m={m} r={r} "
                    f"(was {target - 1})")
        if hits:
            log(f"shape p={p} m={m} r={r}: {hits} improvements")
    with tempfile.TemporaryDirectory() as tmp:
        with open_catalog(Path(tmp) / "qc.sqlite", shipped=False) as out:
            for code, d in found:
                out.add(code, d=d, recipe=list(code.recipe), source="search",
                        seed=args.seed, proof={"method": "search"})
            with open(args.output, "w", encoding="utf-8") as fh:
                count = out.export(fh, stamps=False)
    log(f"wrote {count} records to {args.output}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
