"""Regenerate the shipped seed catalog ``catalog/seed.jsonl`` (every (n, k) with n <= 64).

Run from the repository root (the figures in the README were made this way)::

    nice -n 10 python scripts/build_catalog.py               # the shipped budget
    nice -n 10 python scripts/build_catalog.py --pool 2      # same bytes, two processes

The records cover every ``(n, k)`` with ``n <= 64`` (2,080 cells) at the best minimum
distance this toolkit proves within the budget, counting the codes that the catalog's
propagation rules derive from a stored one (shorten, subcode, puncture, extend, append
zero coordinates).
The steps:

1. **Families**: repetition, even-weight, the whole space, Hamming, extended Hamming,
   simplex, Reed-Muller (lengths up to 128), the Golay codes, quadratic-residue codes of
   prime length up to 47, every cyclic code of odd length up to 61 and of length 65,
   and the primitive BCH codes of lengths 63 and 127.
2. **Derivations**: Plotkin sums ``(u | u+v)`` of the best codes found so far for every length up to
   32, and Construction X on nested cyclic codes (the tail the shortest code found so
   far), kept where they beat the propagated value.
3. **Seeded random circulant codes** (seed 2024, a fixed number of rounds): double
   circulant ``[2l, l]`` and quasi-cyclic ``[3m, m]``, ``[3m, 2m]`` codes.
4. **Growth** (:func:`gf2codes.growth.grow`, the engine of ``gf2codes grow``), seed
   2024: every open cell with ``n <= 32`` with ``--small-steps`` (40) steps each, then
   the first ``--max-cells`` (150) open cells with ``33 <= n <= 64``, largest gap
   first, with ``--max-steps`` (12) steps each.

The records also keep, for every ``k <= 64`` and ``3 <= d <= 8``, the shortest code
found (of any length up to 128), so that a catalog answers those ``(k, d)`` at once.

Every candidate's minimum distance is proved exactly; nothing is timed except the
proofs' safety limits, so the same budget and seed write the same bytes (as long as
every proof finishes within its limit, which the log reports). Only the records that
propagation does not already imply are written: the catalog answers the other cells
with derived codes.
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
from gf2codes.catalog import derivation_steps, open_catalog  # noqa: E402
from gf2codes.catalog.propagation import reach_distance, reach_length  # noqa: E402
from gf2codes.code import Code  # noqa: E402
from gf2codes.derive import construction_x, plotkin_sum, rebuild, recipe_of  # noqa: E402
from gf2codes.distance import minimum_distance  # noqa: E402

N_MAX = 64
SEED = 2024
#: Keep the shortest code found for every (k, d) with k <= N_MAX and 3 <= d <= this.
TARGET_D_MAX = 8


class Pool:
    """Candidate codes with proved d, their recipes and sources."""

    def __init__(self) -> None:
        self.items: list[dict] = []
        self.seen: set = set()

    def offer(self, code: Code, source: str, *, seed: int | None = None,
              recipe: list | None = None, time_limit: float = 5.0) -> int | None:
        if code in self.seen:
            return None
        self.seen.add(code)
        r = minimum_distance(code, time_limit=time_limit)
        if not r.exact:
            return None
        self.items.append({"code": code, "d": r.d, "source": source, "seed": seed,
                           "recipe": recipe if recipe is not None else list(code.recipe),
                           "method": r.method})
        return r.d

    def arrays(self):
        N0 = np.array([it["code"].n for it in self.items], dtype=np.int64)
        K0 = np.array([it["code"].k for it in self.items], dtype=np.int64)
        L0 = np.array([it["d"] for it in self.items], dtype=np.int64)
        return N0, K0, L0

    def best_table(self):
        N0, K0, L0 = self.arrays()
        D, who = {}, {}
        for n in range(1, N_MAX + 1):
            for k in range(1, n + 1):
                dv = reach_distance(N0, K0, L0, n, k)
                D[n, k] = int(dv.max())
                who[n, k] = int(dv.argmax())
        return D, who

    def materialise(self, index: int, n: int, k: int) -> Code:
        it = self.items[index]
        base = it["code"].with_info(recipe=(), name=None)
        steps = derivation_steps(base, n=n, k=k, d_lower=it["d"])
        return rebuild(recipe_of(base) + steps) if steps else base


def _members(name: str, max_length: int, lengths=None):
    """The codes of one family's parameter space (``Family.instances``), in its order."""
    family = F.FAMILIES[name]
    for kw in family.instances(max_length, lengths):
        yield kw, (lambda kw=kw: family.build(**kw))


def families(pool: Pool, log) -> None:
    for n in range(1, N_MAX + 1):
        for name in ("repetition", "even-weight"):
            for _, build in _members(name, N_MAX, {n}):
                pool.offer(build(), "family")
        pool.offer(F.from_rows(np.eye(n, dtype=np.uint8)), "family")
    trio = [list(_members(name, N_MAX)) for name in ("hamming", "extended-hamming", "simplex")]
    for group in zip(*trio, strict=True):  # for each m: Hamming, extended Hamming, simplex
        for _, build in group:
            pool.offer(build(), "family")
    for _, build in _members("reed-muller", 2 * N_MAX, range(4, 2 * N_MAX + 1)):
        pool.offer(build(), "family")  # m = 2 .. 7
    for name in ("golay", "extended-golay"):
        for _, build in _members(name, N_MAX):
            pool.offer(build(), "family")
    for _, build in _members("qr", 47):
        pool.offer(build(), "family")
    log(f"named families: {len(pool.items)} candidates")
    for kw, build in _members("cyclic", 65, {*range(3, 62, 2), 65}):
        if kw["generator_polynomial"] != "0o1":  # g = 1: the whole space, offered above
            pool.offer(build(), "family", time_limit=3.0)
    log(f"cyclic codes: {len(pool.items)} candidates")
    seen_k: dict[int, set[int]] = {63: set(), 127: set()}
    for kw, build in _members("bch", 127, {63, 127}):
        n, delta = kw["n"], kw["designed"]
        if not 3 <= delta < (n // 2 if n == 127 else n):
            continue
        try:
            code = build()
        except Exception:  # noqa: BLE001 - the roots cover everything: no code
            continue
        if code.k in seen_k[n] or code.k < 1:
            continue
        seen_k[n].add(code.k)
        if n == 127 and code.n - code.k > 36:  # only the high-rate ones pay here
            continue
        pool.offer(code, "family", time_limit=10.0)
    log(f"BCH codes: {len(pool.items)} candidates")


def plotkin_sums(pool: Pool, log) -> None:
    D, who = pool.best_table()
    added = 0
    for n in range(2, N_MAX // 2 + 1):
        cache: dict[int, Code] = {}
        for k1 in range(1, n + 1):
            for k2 in range(1, n + 1):
                if k1 + k2 > 2 * n:
                    continue
                claim = min(2 * D[n, k1], D[n, k2])
                if claim <= D[2 * n, k1 + k2]:
                    continue
                for kk in (k1, k2):
                    if kk not in cache:
                        c = pool.materialise(who[n, kk], n, kk)
                        cache[kk] = c.with_info(recipe=recipe_of(c))
                code = plotkin_sum(cache[k1], cache[k2])
                d = pool.offer(code, "derivation")
                if d is not None and d > D[2 * n, k1 + k2]:
                    D[2 * n, k1 + k2] = d
                    added += 1
    log(f"Plotkin sums: {added} cells improved")


def _cyclic_groups(pool: Pool) -> dict[int, list[int]]:
    groups: dict[int, list[int]] = {}
    for i, it in enumerate(pool.items):
        recipe = it["recipe"] or []
        if recipe and recipe[0].get("family") in ("cyclic", "bch") and len(recipe) == 1:
            groups.setdefault(it["code"].n, []).append(i)
    return groups


def construction_x_phase(pool: Pool, log) -> None:
    """Construction X on nested cyclic codes ``C1 > C2`` with ``d2 > d1``, the tail the
    shortest code of dimension ``k1 - k2`` and distance ``d2 - d1`` found so far."""
    D, who = pool.best_table()
    added = 0
    for n, members in sorted(_cyclic_groups(pool).items()):
        if len(members) > 140:
            continue
        for i1 in members:
            c1, d1 = pool.items[i1]["code"], pool.items[i1]["d"]
            for i2 in members:
                c2, d2 = pool.items[i2]["code"], pool.items[i2]["d"]
                r = c1.k - c2.k
                if not 1 <= r <= 12 or d2 <= d1:
                    continue
                a = next((a for a in range(r, N_MAX - n + 1) if D[a, r] >= d2 - d1), None)
                if a is None or n + a > N_MAX:
                    continue
                if min(d2, d1 + D[a, r]) <= D[n + a, c1.k]:
                    continue
                if not bool(np.all(c1.contains(c2.G))):
                    continue
                aux = pool.materialise(who[a, r], a, r)
                aux = aux.with_info(recipe=recipe_of(aux))
                d = pool.offer(construction_x(c1, c2, aux), "derivation", time_limit=5.0)
                if d is not None and d > D[n + a, c1.k]:
                    D[n + a, c1.k] = d
                    added += 1
    log(f"construction X: {added} cells improved, {len(pool.items)} candidates")


def circulants(pool: Pool, log, rounds: int) -> None:
    rng = np.random.default_rng(SEED)
    for _ in range(rounds):
        ell = int(rng.integers(3, N_MAX // 2 + 1))
        row = "".join(map(str, rng.integers(0, 2, ell)))
        if "1" in row:
            pool.offer(F.double_circulant(row), "search", seed=SEED)
        m = int(rng.integers(3, N_MAX // 3 + 1))
        count = int(rng.integers(1, 3))
        rows = ["".join(map(str, rng.integers(0, 2, 3 * m))) for _ in range(count)]
        try:
            pool.offer(F.quasi_cyclic(rows, m), "search", seed=SEED)
        except Exception:  # noqa: BLE001 - a zero row set; just skip it
            pass
    log(f"random circulant codes: {rounds} rounds, {len(pool.items)} candidates")


def select(pool: Pool) -> list[int]:
    """Indices of the candidates that propagation does not make redundant."""
    N0, K0, L0 = pool.arrays()
    cells = [(n, k) for n in range(1, N_MAX + 1) for k in range(1, n + 1)]
    reach = np.array([reach_distance(N0, K0, L0, n, k) for n, k in cells]).T  # (items, cells)
    best = reach.max(axis=0)
    attains = reach == best[None, :]
    # and, for the short-message targets k <= 64, 3 <= d <= TARGET_D_MAX, the shortest
    # code of any length (up to 128): a catalog answers "(k, d) -> n" at once
    lengths = np.array([reach_length(N0, K0, L0, k, d) for k in range(1, N_MAX + 1)
                        for d in range(3, TARGET_D_MAX + 1)]).T  # (items, targets)
    shortest = lengths.min(axis=0)
    reached = shortest < np.iinfo(np.int64).max
    attains = np.hstack([attains, (lengths == shortest[None, :])[:, reached]])
    count = attains.sum(axis=0)
    rank = {"family": 0, "derivation": 1, "search": 2}

    def badness(i: int):
        it = pool.items[i]
        cyclic = it["recipe"] and it["recipe"][0].get("family") == "cyclic"
        return (rank[it["source"]] + cyclic, it["code"].n > N_MAX, it["code"].n, i)

    keep = set(range(len(pool.items)))
    for i in sorted(keep, key=badness, reverse=True):
        row = attains[i]
        if not row.any() or (count[row] >= 2).all():
            keep.discard(i)
            count -= row
    return sorted(keep, key=lambda i: (pool.items[i]["code"].n, pool.items[i]["code"].k))


def write_records(pool: Pool, keep: list[int], path: Path) -> None:
    with open_catalog(path, shipped=False) as cat:
        for i in keep:
            it = pool.items[i]
            cat.add(it["code"], d=it["d"], recipe=it["recipe"] or None,
                    source=it["source"], seed=it["seed"], proof={"method": it["method"]})


def grow_phase(db: Path, args, log) -> None:
    """Two growth jobs: every open cell with n <= 32, then the first ``--max-cells``
    open cells with 33 <= n <= 64 (largest gap first)."""
    from gf2codes.growth import grow
    from gf2codes.parallel import make_executor

    executor = make_executor(pool=args.pool)
    jobs = [("n <= 32", [(n, k) for n in range(1, 33) for k in range(1, n + 1)],
             args.small_steps, None),
            ("33 <= n <= 64", [(n, k) for n in range(33, N_MAX + 1) for k in range(1, n + 1)],
             args.max_steps, args.max_cells)]
    try:
        for label, cells, steps, most in jobs:
            def progress(s, label=label) -> None:
                if s.done % 25 == 0 or s.done == s.cells:
                    log(f"growth {label}: {s.done}/{s.cells} cells, {s.improved} improved")

            with open_catalog(db, shipped=False) as cat:
                summary = grow(cat, cells, max_steps=steps, seed=SEED, batch=8,
                               max_cells=most, executor=executor, progress=progress)
            log(f"growth {label}: {summary.done} of {summary.cells} open cells searched "
                f"with {steps} steps each, {summary.improved} improved ({summary.stopped})")
    finally:
        if executor is not None:
            executor.close()


def main() -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--output", default=str(ROOT / "catalog" / "seed.jsonl"))
    ap.add_argument("--circulant-rounds", type=int, default=400)
    ap.add_argument("--small-steps", type=int, default=40,
                    help="per-cell step budget of the growth job on n <= 32 (default 40)")
    ap.add_argument("--max-steps", type=int, default=12,
                    help="per-cell step budget of the growth job on 33 <= n <= 64 "
                         "(default 12)")
    ap.add_argument("--max-cells", type=int, default=150,
                    help="cells searched by the growth job on 33 <= n <= 64 (default 150)")
    ap.add_argument("--pool", type=int, help="run the growth phase on N processes "
                    "(the same records as one)")
    args = ap.parse_args()
    start = time.perf_counter()

    def log(msg: str) -> None:
        print(f"[{time.perf_counter() - start:7.1f} s] {msg}", flush=True)

    pool = Pool()
    families(pool, log)
    plotkin_sums(pool, log)
    circulants(pool, log, args.circulant_rounds)
    plotkin_sums(pool, log)
    construction_x_phase(pool, log)
    keep = select(pool)
    log(f"{len(keep)} records kept of {len(pool.items)} candidates")

    with tempfile.TemporaryDirectory() as tmp:
        db = Path(tmp) / "build.sqlite"
        write_records(pool, keep, db)
        log("records stored; growth phase")
        with open_catalog(db, shipped=False) as cat:
            first_new = int(cat.query("SELECT max(id) FROM entry")[0][0]) + 1
        if args.max_cells > 0:
            grow_phase(db, args, log)
        with open_catalog(db, shipped=False) as cat:
            grown = [e for e in cat.entries() if e.id >= first_new]
        for e in grown:
            recipe = next((r["recipe"] for r in e.recipes if r.get("recipe")), None)
            pool.items.append({"code": e.code.with_info(recipe=recipe or ()), "d": e.d_lower,
                               "source": "search", "seed": SEED,
                               "recipe": recipe or list(recipe_of(e.code)),
                               "method": "search"})
        keep = select(pool)
        log(f"{len(keep)} records kept of {len(pool.items)} candidates")
        final = Path(tmp) / "final.sqlite"
        write_records(pool, keep, final)
        with open_catalog(final, shipped=False) as cat:
            rows = cat.distance_table(range(1, N_MAX + 1))
            D, _ = pool.best_table()
            assert all(r["d"] == D[r["n"], r["k"]] for r in rows), "coverage lost"
            out = Path(args.output)
            out.parent.mkdir(parents=True, exist_ok=True)
            with open(out, "w", encoding="utf-8") as fh:
                count = cat.export(fh, stamps=False)
    for limit in (32, 64):
        part = [r for r in rows if r["n"] <= limit]
        at = sum(r["meets_bound"] for r in part)
        near = sum(r["d"] >= r["bound"] - 1 for r in part)
        log(f"n <= {limit}: {len(part)} cells, {at} ({100 * at / len(part):.1f} %) at the "
            f"best upper bound, {near} ({100 * near / len(part):.1f} %) within 1")
    log(f"wrote {count} records to {args.output}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
