"""Regenerate the shipped seed catalog ``catalog/seed.jsonl`` (every (n, k) with n <= 64).

Run from the repository root (the README says which command made the shipped file)::

    nice -n 10 python scripts/build_catalog.py               # the full budget
    nice -n 10 python scripts/build_catalog.py --pool 2      # same bytes, two processes
    nice -n 10 python scripts/build_catalog.py --max-cells 0 # no growth phase (step 7):
                                                             # how catalog/seed.jsonl was made

The records cover every ``(n, k)`` with ``n <= 64`` (2,080 cells) at the best minimum
distance this toolkit proves within the budget, counting the codes that the catalog's
propagation rules derive from a stored one (shorten, subcode, puncture, extend, append
zero coordinates).
The steps:

1. **Families**: repetition, even-weight, the whole space, Hamming, extended Hamming,
   simplex, Reed-Muller (lengths up to 128), the Golay codes, quadratic-residue codes of
   prime length up to 47, every cyclic code of odd length up to 61 and of length 65,
   and the primitive BCH codes of lengths 63 and 127.
2. **Anticodes** (Solomon-Stiffler / Belov codes meeting the Griesmer bound, k <= 12)
   and **cyclic codes of odd lengths 67..127** with redundancy at most 20 (and, up to
   length 85, dimension at most 20), one per class of defining sets under the
   multipliers; their shortenings and puncturings fill the cells below them.
3. **Derivations**: Construction Y1 (shortening on the support of a dual word) on the
   cyclic and BCH codes of length up to 128 and their extensions, Plotkin sums
   ``(u | u+v)`` of the best codes found so far for every length up to 64,
   Construction X on nested cyclic codes (the tail the shortest code found so far), and
   juxtapositions ``[G1 | G2]`` of codes of one dimension <= 20, kept where they beat
   the propagated value.
4. **Seeded random codes** (seed 2024, fixed numbers of rounds): double circulant
   ``[2l, l]`` and quasi-cyclic ``[3m, m]``, ``[3m, 2m]`` codes, then ``--qc-rounds``
   (200) quasi-cyclic codes of every index ``p`` and co-index ``m`` with one or two
   generating rows and length 33..68, each shape with its own generator.
5. **Records provable at import**: a new catalog proves a record's d only when one of
   its sides has at most 2^20 words (:data:`gf2codes.catalog.checks.CHEAP_WEIGHT_WORDS`)
   or the distance engine estimates its proof within
   :data:`gf2codes.catalog.checks.CHEAP_PROOF_WORK` codewords (each candidate is tried
   with that budget first, which decides it); where the pool's best code of a cell is
   derived from a record that is not proved at import, the derived code is offered as a
   record of its own, and the selection keeps, for every cell, both
   the pool's best and the best among the records proved at import.
6. **Carried search results**: the codes that the growth phase of earlier builds found
   (``scripts/seed_search_records.jsonl``, the search records of the seed at commit
   d6db148), re-proved, so that a build with a smaller growth budget keeps them, and
   the quasi-cyclic codes of ``scripts/search_qc_targets.py`` for the cells with the
   largest gaps (``scripts/seed_qc_records.jsonl``, seed 2026) and the codes with
   prescribed automorphism groups of ``scripts/search_orbit_targets.py`` for the open
   cells with ``k <= 14`` (``scripts/seed_orbit_records.jsonl``, seed 2027).
7. **Growth** (:func:`gf2codes.growth.grow`, the engine of ``gf2codes grow``), seed
   2024: every open cell with ``n <= 32`` with ``--small-steps`` (40) steps each, then
   the first ``--max-cells`` (150) open cells with ``33 <= n <= 64`` that a new catalog
   proves at import (step 5), largest gap first, with ``--max-steps`` (12) steps each.

The records also keep, for every ``k <= 64`` and ``3 <= d <= 8``, the shortest code
found (of any length up to 128), so that a catalog answers those ``(k, d)`` at once.

Every candidate's minimum distance is proved exactly, with no time limit: a candidate
whose proof the engine estimates above its work budget (a fixed number of codewords, not
a time) is refused and listed in the log, so no decision depends on the machine's speed
or load, and the same budget and seed write the same bytes (``--quick``, a tiny budget
with n <= 22, is what the test of that runs). Only the records that propagation does
not already imply are written: the catalog answers the other cells with derived codes.
"""

from __future__ import annotations

import argparse
import math
import sys
import tempfile
import time
from itertools import combinations
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from gf2codes import families as F  # noqa: E402
from gf2codes.catalog import derivation_steps, open_catalog  # noqa: E402
from gf2codes.catalog.checks import CHEAP_PROOF_WORK, CHEAP_WEIGHT_WORDS  # noqa: E402
from gf2codes.catalog.propagation import reach_distance, reach_length  # noqa: E402
from gf2codes.code import Code  # noqa: E402
from gf2codes.derive import (  # noqa: E402
    construction_x,
    construction_y1,
    extend,
    juxtapose,
    plotkin_sum,
    rebuild,
    recipe_of,
    shorten,
)
from gf2codes.distance import minimum_distance  # noqa: E402
from gf2codes.exceptions import ParameterError, TooExpensiveError  # noqa: E402

N_MAX = 64
SEED = 2024
#: Keep the shortest code found for every (k, d) with k <= N_MAX and 3 <= d <= this.
TARGET_D_MAX = 8
#: Codewords (or their equivalent in the engine's estimate) per nominal second of a
#: candidate's budget: a fixed figure, so that which proofs are tried never depends on
#: the machine (about one core's Brouwer-Zimmermann rate in the engine's estimate).
WORK_PER_SECOND = 1_500_000_000
#: Random quasi-cyclic codes tried per shape (index, co-index, rows).
QC_ROUNDS = 200


class Pool:
    """Candidate codes with proved d, their recipes and sources."""

    def __init__(self) -> None:
        self.items: list[dict] = []
        self.seen: set = set()
        #: candidates whose estimated proof work exceeded their budget (not offered)
        self.refused: list[str] = []

    def offer(self, code: Code, source: str, *, seed: int | None = None,
              recipe: list | None = None, time_limit: float = 5.0) -> int | None:
        if code in self.seen:
            return None
        self.seen.add(code)
        # ``time_limit`` is a nominal budget turned into a work limit by the engine's own
        # estimate, which does not depend on the machine: a proof is refused, never cut
        # A record is proved by a new catalog on import when its weight distribution is
        # cheap or the distance engine's estimate is within CHEAP_PROOF_WORK (the rule of
        # gf2codes.catalog.checks.trusted_facts); try that budget first.
        provable = provable_at_import(code.n, code.k)
        try:
            r = minimum_distance(code, max_work=CHEAP_PROOF_WORK)
            provable = True
        except TooExpensiveError:  # proved with the candidate's own, larger budget
            try:
                r = minimum_distance(code, max_work=int(time_limit * WORK_PER_SECOND))
            except TooExpensiveError:
                self.refused.append(f"[{code.n}, {code.k}] {code.name}")
                return None
        if not r.exact:  # pragma: no cover - without a time limit every proof is exact
            raise AssertionError(f"no exact distance for {code.name}")
        self.items.append({"code": code, "d": r.d, "source": source, "seed": seed,
                           "recipe": recipe if recipe is not None else list(code.recipe),
                           "method": r.method, "provable": provable})
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


def families(pool: Pool, log, max_length: int | None = None) -> None:
    """The named families; ``max_length`` (for a quick build) caps every length, None
    keeps the shipped set (lengths up to 128)."""
    def cap(length: int) -> int:
        return length if max_length is None else min(length, max_length)

    for n in range(1, N_MAX + 1):
        for name in ("repetition", "even-weight"):
            for _, build in _members(name, N_MAX, {n}):
                pool.offer(build(), "family")
        pool.offer(F.from_rows(np.eye(n, dtype=np.uint8)), "family")
    trio = [list(_members(name, cap(N_MAX))) for name in ("hamming", "extended-hamming", "simplex")]
    for group in zip(*trio, strict=True):  # for each m: Hamming, extended Hamming, simplex
        for _, build in group:
            pool.offer(build(), "family")
    for _, build in _members("reed-muller", cap(2 * N_MAX), range(4, 2 * N_MAX + 1)):
        pool.offer(build(), "family")  # m = 2 .. 7
    for name in ("golay", "extended-golay"):
        for _, build in _members(name, cap(N_MAX)):
            pool.offer(build(), "family")
    for _, build in _members("qr", cap(47)):
        pool.offer(build(), "family")
    log(f"named families: {len(pool.items)} candidates")
    for kw, build in _members("cyclic", cap(65), {*range(3, 62, 2), 65}):
        if kw["generator_polynomial"] != "0o1":  # g = 1: the whole space, offered above
            pool.offer(build(), "family", time_limit=3.0)
    log(f"cyclic codes: {len(pool.items)} candidates")
    seen_k: dict[int, set[int]] = {63: set(), 127: set()}
    for kw, build in _members("bch", cap(127), {63, 127}):
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


def juxtapositions(pool: Pool, log, k_max: int = 20) -> None:
    """Juxtapositions ``[G1 | G2]`` of the best codes of one dimension ``k <= k_max``
    (``d >= d1 + d2``), for every length 33..N_MAX in increasing order, so that a new
    code can be a half of a longer one (MacWilliams & Sloane, ch. 18, from memory)."""
    D, who = pool.best_table()
    added = 0
    for n in range(min(33, N_MAX // 2), N_MAX + 1):
        for k in range(2, min(k_max, n // 2) + 1):
            best = max(range(k, n - k + 1), key=lambda a: (D[a, k] + D[n - a, k], -a))
            if D[best, k] + D[n - best, k] <= D[n, k]:
                continue
            halves = []
            for length in (best, n - best):
                c = pool.materialise(who[length, k], length, k)
                halves.append(c.with_info(recipe=recipe_of(c)))
            d = pool.offer(juxtapose(*halves), "derivation", time_limit=3.0)
            if d is not None and d > D[n, k]:
                D[n, k], who[n, k] = d, len(pool.items) - 1
                added += 1
    log(f"juxtapositions: {added} cells improved, {len(pool.items)} candidates")


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


#: Dual codes of at most this dimension are enumerated in full by :func:`_dual_words`.
Y1_FULL_DUAL = 20
#: The lightest dual words whose supports are joined in pairs by the Y1 phase.
Y1_PAIR_WORDS = 200


class _DualWords:
    """Words of the dual of a code: every nonzero word when the dual has dimension at most
    :data:`Y1_FULL_DUAL` (in the order of the reduced echelon basis), else the basis rows,
    their sums in pairs and the lightest word the engine finds within a small work
    budget. Deterministic."""

    def __init__(self, code: Code) -> None:
        H = code.dual().rref_generator.astype(np.uint8)
        r, n = H.shape
        self.n = n
        if r <= Y1_FULL_DUAL:
            words = np.zeros((1, 2), dtype=np.uint64)
            packed = np.zeros((r, 2), dtype=np.uint64)
            for j in range(n):
                packed[:, j // 64] |= H[:, j].astype(np.uint64) << np.uint64(j % 64)
            for row in packed:
                words = np.vstack([words, words ^ row[None, :]])
            self.packed = words[1:]
            self.weights = np.bitwise_count(self.packed).sum(axis=1).astype(np.int64)
            return
        rows = [H[i] for i in range(r)]
        rows += [H[i] ^ H[j] for i in range(r) for j in range(i + 1, r)]
        try:
            rows.append(minimum_distance(code.dual(), max_work=CHEAP_PROOF_WORK).witness)
        except TooExpensiveError:
            pass
        mat = np.array(rows, dtype=np.uint8)
        self.packed = np.zeros((mat.shape[0], 2), dtype=np.uint64)
        for j in range(n):
            self.packed[:, j // 64] |= mat[:, j].astype(np.uint64) << np.uint64(j % 64)
        self.weights = mat.sum(axis=1).astype(np.int64)

    def bits(self, index: np.ndarray) -> np.ndarray:
        """The words ``index`` as 0/1 rows."""
        cols = np.arange(self.n)
        return ((self.packed[index][:, cols // 64] >> (cols % 64).astype(np.uint64))
                & np.uint64(1)).astype(np.uint8)

    def by_weight(self) -> dict[int, np.ndarray]:
        """One word for each weight (the first of that weight)."""
        ws, first = np.unique(self.weights, return_index=True)
        rows = self.bits(first)
        return {int(w): rows[i] for i, w in enumerate(ws.tolist())}

    def pair_supports(self, limit: int) -> dict[int, list[int]]:
        """For each size ``s`` found, the union of the supports of two of the ``limit``
        lightest words (the first pair of that size in their order)."""
        order = np.argsort(self.weights, kind="stable")[:limit]
        words = self.bits(order).astype(np.int64)
        union = self.n - (1 - words) @ (1 - words).T  # |supp a ∪ supp b|
        found: dict[int, list[int]] = {}
        iu, ju = np.triu_indices(words.shape[0], 1)
        sizes = union[iu, ju]
        ss, first = np.unique(sizes, return_index=True)
        for size, f in zip(ss.tolist(), first.tolist(), strict=True):
            found[int(size)] = np.flatnonzero(words[iu[f]] | words[ju[f]]).tolist()
        return found


def construction_y1_phase(pool: Pool, log, slack: int = 0,
                          kinds: tuple[str, ...] | None = ("cyclic", "bch"),
                          pairs: bool = True) -> None:
    """Construction Y1 (:func:`gf2codes.derive.construction_y1`) on the cyclic and BCH
    codes of the pool of length up to 2 N_MAX and on their extensions: for each weight
    ``w`` of a word of the dual (:func:`_dual_words`) with ``n - w <= N_MAX``, the
    ``[n - w, k - w + 1, >= d]`` code is offered where ``d + slack`` beats the pool's
    best (its proved d may exceed the base's) (MacWilliams & Sloane, ch. 18 section 7.1,
    from memory). With ``pairs``, the same for the union ``S`` of the supports of two of
    the :data:`Y1_PAIR_WORDS` lightest dual words: shortening on ``S`` gives
    ``[n - |S|, >= k - |S| + 2, >= d]`` (two independent dual words inside ``S``), stored
    as a plain ``shorten`` step."""
    D, _ = pool.best_table()
    tried = added = 0
    bases = []
    for it in pool.items:
        recipe = it["recipe"] or []
        if (len(recipe) == 1 and (kinds is None or recipe[0].get("family") in kinds)
                and it["code"].n <= 2 * N_MAX and it["code"].k > 1):
            bases.append((it["code"].with_info(d_lower=it["d"]), it["d"]))
            if it["d"] % 2 == 1 and it["code"].n < 2 * N_MAX:
                bases.append((extend(it["code"].with_info(d_lower=it["d"])), it["d"] + 1))
    for base, d in bases:
        n, k = base.n, base.k
        weights = range(max(2, n - N_MAX), min(k, n - 1) + 1)  # n - w <= N_MAX, k' >= 1
        if n - k < 2 or not any(d + slack > D[n - w, k - w + 1] for w in weights):
            continue  # no dual word weight could give a better code: skip enumerating
        duals = _DualWords(base)
        for w, word in sorted(duals.by_weight().items()):
            if w not in weights or d + slack <= D[n - w, k - w + 1]:
                continue
            m = n - w
            code = construction_y1(base, word)
            if d + slack <= D[m, code.k]:
                continue
            tried += 1
            got = pool.offer(code, "derivation", time_limit=5.0)
            if got is not None and got > D[m, code.k]:
                D[m, code.k] = got
                added += 1
        if not pairs:
            continue
        for size, coords in sorted(duals.pair_supports(Y1_PAIR_WORDS).items()):
            m, kk = n - size, k - size + 2
            if not 1 <= m <= N_MAX or kk < 1 or d + slack <= D[m, min(kk, m)]:
                continue
            try:
                code = shorten(base, coords)
            except ParameterError:
                continue
            if code.k > m or d + slack <= D[m, code.k]:
                continue
            tried += 1
            got = pool.offer(code, "derivation", time_limit=5.0)
            if got is not None and got > D[m, code.k]:
                D[m, code.k] = got
                added += 1
    log(f"construction Y1: {len(bases)} base codes, {tried} offered, {added} cells "
        f"improved, {len(pool.items)} candidates")


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


#: Codes found by the growth phase of earlier builds (the ``search`` records of the seed
#: at commit d6db148), offered again as candidates and re-proved like every other one.
CARRIED = ROOT / "scripts" / "seed_search_records.jsonl"
#: Quasi-cyclic codes that ``scripts/search_qc_targets.py`` (seed 2026) found for open
#: cells of 33 <= n <= 64 with the largest gaps, offered and re-proved the same way.
CARRIED_QC = ROOT / "scripts" / "seed_qc_records.jsonl"
#: Codes with prescribed automorphism groups that ``scripts/search_orbit_targets.py``
#: (seed 2027) found for open cells with k <= 14, offered and re-proved the same way.
CARRIED_ORBITS = ROOT / "scripts" / "seed_orbit_records.jsonl"


def carried(pool: Pool, log, path: Path = CARRIED) -> None:
    """Offer the codes of an earlier build's search records (their d proved again here)."""
    import json

    from gf2codes.catalog import parse_entry_record

    before = len(pool.items)
    with open(path, encoding="utf-8") as fh:
        for lineno, line in enumerate(fh, start=1):
            if not line.strip():
                continue
            rec = parse_entry_record(json.loads(line), f"{path}, line {lineno}")
            if rec.code.n > N_MAX:
                continue
            item = next(r for r in rec.recipes if r.get("source") == "search")
            pool.offer(rec.code.with_info(recipe=item["recipe"]), "search",
                       seed=item.get("seed"), recipe=item["recipe"])
    log(f"carried search records ({path.name}): {len(pool.items) - before} candidates")


def anticodes(pool: Pool, log) -> None:
    """The Solomon-Stiffler / Belov codes (:func:`gf2codes.families.anticode`) of length
    up to ``N_MAX + 8`` (puncturing the longer ones fills the cells just below them)."""
    before = len(pool.items)
    for _, build in _members("anticode", N_MAX + 8):
        pool.offer(build(), "family")
    log(f"anticodes: {len(pool.items) - before} candidates")


def _cyclic_class(n: int, zeros: frozenset[int]) -> tuple[int, ...]:
    """A canonical form of a defining set under the multipliers ``i -> a i`` (a unit
    mod n): codes in one class are equivalent (MacWilliams & Sloane, ch. 8 section 5)."""
    return min(tuple(sorted(a * z % n for z in zeros))
               for a in range(1, n) if math.gcd(a, n) == 1)


def long_cyclic(pool: Pool, log, *, lengths=range(67, 128, 2), max_side: int = 20,
                low_rate_up_to: int = 99) -> None:
    """Cyclic codes of odd lengths 67..127 whose redundancy is at most ``max_side`` (their
    shortenings are high-rate codes of every length <= N_MAX) and, for lengths up to
    ``low_rate_up_to``, whose dimension is at most ``max_side`` plus the excess of the
    length over N_MAX (shortened to length N_MAX, at most ``max_side``): one code per class of
    defining sets under the multipliers, the generator a product of the irreducible
    factors of x^n - 1 (MacWilliams & Sloane, ch. 7 sections 5 and 8)."""
    from gf2codes.polynomials import defining_set_of, factor_x_n_minus_1

    before = len(pool.items)
    for n in lengths:
        if n % 2 == 0 or n > 2 * N_MAX:
            continue
        factors, _ = factor_x_n_minus_1(n)
        by_degree = sorted(factors, key=lambda f: (f.degree, int(f)))
        zero_sets = []
        for f in by_degree:
            mask = defining_set_of(n, f)
            zero_sets.append(None if mask is None else frozenset(np.flatnonzero(mask).tolist()))
        total = sum(f.degree for f in by_degree)
        chosen: dict[tuple[int, ...], tuple[int, ...]] = {}
        for size in range(1, len(by_degree) + 1):
            for combo in combinations(range(len(by_degree)), size):
                deg = sum(by_degree[i].degree for i in combo)
                low = total - deg <= max_side + max(0, n - N_MAX)  # shortened into range
                if not (deg <= max_side or (n <= low_rate_up_to and low)):
                    continue
                if deg >= n:
                    continue
                if any(zero_sets[i] is None for i in combo):  # roots in too large a field
                    key = (-1, *combo)
                else:
                    key = _cyclic_class(n, frozenset().union(*(zero_sets[i] for i in combo)))
                chosen.setdefault(key, combo)
        for key in sorted(chosen):
            combo = chosen[key]
            g = by_degree[combo[0]]
            for i in combo[1:]:
                g = g * by_degree[i]
            pool.offer(F.cyclic(n, g), "family", time_limit=3.0)
    log(f"cyclic codes of lengths {lengths.start}..{lengths.stop - 1}: "
        f"{len(pool.items) - before} candidates")


def quasi_cyclic_phase(pool: Pool, log, rounds: int) -> None:
    """Seeded random quasi-cyclic codes of index ``p`` and co-index ``m`` (rate 1/p from
    one row, 2/p from two) for lengths 33..N_MAX + 4, ``rounds`` tries per shape, each
    shape with its own generator seeded from (SEED, m, p, rows) (Huffman & Pless, section
    9.8; the best rate-1/p codes of small dimension are often quasi-cyclic)."""
    before = len(pool.items)
    for count in (1, 2):
        for m in range(4, 22 // count + 1):
            for p in range(2, (N_MAX + 4) // m + 1):
                if p * m < min(33, N_MAX // 2) or p * m > N_MAX + 4:
                    continue
                rng = np.random.default_rng([SEED, m, p, count])
                for _ in range(rounds):
                    rows = ["".join(map(str, rng.integers(0, 2, p * m))) for _ in range(count)]
                    if count == 1:  # [I | A_2 | ... ]: systematic, rank m
                        rows[0] = "1" + "0" * (m - 1) + rows[0][m:]
                    try:
                        code = F.quasi_cyclic(rows, m)
                    except Exception:  # noqa: BLE001 - a zero row set; just skip it
                        continue
                    pool.offer(code, "search", seed=SEED, time_limit=3.0)
    log(f"random quasi-cyclic codes: {rounds} rounds per shape, "
        f"{len(pool.items) - before} candidates")


def proved_on_import(code: Code) -> bool:
    """Whether a new catalog proves ``code``'s d on import (the rule of
    :func:`gf2codes.catalog.checks.trusted_facts`): cheap weights, or the distance engine
    within :data:`gf2codes.catalog.checks.CHEAP_PROOF_WORK`."""
    if provable_at_import(code.n, code.k):
        return True
    try:
        return minimum_distance(code, max_work=CHEAP_PROOF_WORK).exact
    except TooExpensiveError:
        return False


def provable_at_import(n: int, k: int) -> bool:
    """Whether a new catalog proves the d of an ``[n, k]`` record when it imports the seed
    (its weight distribution is cheap: :data:`gf2codes.catalog.checks.CHEAP_WEIGHT_WORDS`);
    a larger record stays a checked claim until ``catalog prove``."""
    return k == n or (1 << min(k, n - k)) <= CHEAP_WEIGHT_WORDS


def _cells() -> tuple[np.ndarray, np.ndarray]:
    cells = [(n, k) for n in range(1, N_MAX + 1) for k in range(1, n + 1)]
    return (np.array([c[0] for c in cells], dtype=np.int64),
            np.array([c[1] for c in cells], dtype=np.int64))


def _reach(N0: np.ndarray, K0: np.ndarray, L0: np.ndarray, nn: np.ndarray,
           kk: np.ndarray) -> np.ndarray:
    """``reach_distance`` of every item (rows) at every cell (columns)."""
    return reach_distance(N0[:, None], K0[:, None], L0[:, None], nn[None, :], kk[None, :])


def provable_records(pool: Pool, log) -> None:
    """For every cell whose best code is derived from a record a new catalog would only
    hold as a claim (both of its sides above 2^20 words) while the derived code itself is
    small enough to be proved at import, offer the derived code as a record of its own:
    the shortened [54, 20] code of a [55, 21] one is then proved in every new catalog.
    Cells are taken largest smaller side first, so one derived record covers many."""
    N0, K0, L0 = pool.arrays()
    nn, kk = _cells()
    reach = _reach(N0, K0, L0, nn, kk)
    prov = np.array([it["provable"] for it in pool.items], dtype=bool)
    best, who = reach.max(axis=0), reach.argmax(axis=0)
    have = np.where(prov[:, None], reach, 0).max(axis=0)
    cell_ok = np.ones(nn.shape, dtype=bool)  # a derived code of n <= 64 may be (offer says)
    order = sorted(np.flatnonzero(cell_ok & (best > have)).tolist(),
                   key=lambda c: (-min(kk[c], nn[c] - kk[c]), -nn[c], kk[c]))
    added = 0
    for c in order:
        if best[c] <= have[c]:
            continue
        code = pool.materialise(int(who[c]), int(nn[c]), int(kk[c]))
        d = pool.offer(code.with_info(recipe=recipe_of(code)), "derivation")
        if d is None or not pool.items[-1]["provable"]:
            continue
        one = np.array([d], dtype=np.int64)
        new = _reach(np.array([code.n]), np.array([code.k]), one, nn, kk)[0]
        have = np.maximum(have, new)
        added += 1
    log(f"records provable at import: {added} derived codes offered; "
        f"{int((cell_ok & (best > have)).sum())} provable-size cells still below the pool")


def select(pool: Pool) -> list[int]:
    """Indices of the candidates that propagation does not make redundant: for every cell
    the best code of the pool, and the best among the records a new catalog proves at
    import (:func:`provable_at_import`), so that its proved figures are as good as the
    pool allows."""
    N0, K0, L0 = pool.arrays()
    nn, kk = _cells()
    reach = _reach(N0, K0, L0, nn, kk)  # (items, cells)
    prov = np.array([it["provable"] for it in pool.items], dtype=bool)
    best = reach.max(axis=0)
    attains = reach == best[None, :]
    proved = np.where(prov[:, None], reach, 0)
    top = proved.max(axis=0)
    attains = np.hstack([attains, (proved == top[None, :]) & (top > 0)[None, :]])
    # and, for the short-message targets k <= 64, 3 <= d <= TARGET_D_MAX, the shortest
    # code of any length (up to 128): a catalog answers "(k, d) -> n" at once
    lengths = np.array([reach_length(N0, K0, L0, k, d) for k in range(1, N_MAX + 1)
                        for d in range(3, TARGET_D_MAX + 1)]).T  # (items, targets)
    big = np.iinfo(np.int64).max
    for table in (lengths, np.where(prov[:, None], lengths, big)):
        shortest = table.min(axis=0)
        reached = shortest < big
        attains = np.hstack([attains, (table == shortest[None, :])[:, reached]])
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
    small = min(32, N_MAX)
    jobs = [(f"n <= {small}", [(n, k) for n in range(1, small + 1) for k in range(1, n + 1)],
             args.small_steps, args.small_cells),
            (f"{small + 1} <= n <= {N_MAX}",
             [(n, k) for n in range(small + 1, N_MAX + 1) for k in range(1, n + 1)],
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


def main(argv: list[str] | None = None) -> int:
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
    ap.add_argument("--qc-rounds", type=int, default=QC_ROUNDS,
                    help=f"random quasi-cyclic codes per shape (default {QC_ROUNDS})")
    ap.add_argument("--pool", type=int, help="run the growth phase on N processes "
                    "(the same records as one)")
    ap.add_argument("--quick", action="store_true",
                    help="a tiny budget for tests: n <= 22, few rounds and steps "
                         "(needs --output)")
    args = ap.parse_args(argv)
    args.small_cells = None  # every open cell with n <= 32
    global N_MAX
    N_MAX = 64
    if args.quick:
        if Path(args.output).resolve() == (ROOT / "catalog" / "seed.jsonl").resolve():
            ap.error("--quick needs --output (it must not overwrite the shipped seed)")
        N_MAX = 22
        args.circulant_rounds, args.qc_rounds = 20, 3
        args.small_steps, args.max_steps, args.max_cells, args.small_cells = 1, 1, 1, 2
    start = time.perf_counter()

    def log(msg: str) -> None:
        print(f"[{time.perf_counter() - start:7.1f} s] {msg}", flush=True)

    pool = Pool()
    families(pool, log, max_length=N_MAX if args.quick else None)
    if not args.quick:
        carried(pool, log)
        carried(pool, log, CARRIED_QC)
        carried(pool, log, CARRIED_ORBITS)
    anticodes(pool, log)
    long_cyclic(pool, log)
    construction_y1_phase(pool, log)
    plotkin_sums(pool, log)
    circulants(pool, log, args.circulant_rounds)
    quasi_cyclic_phase(pool, log, args.qc_rounds)
    plotkin_sums(pool, log)
    construction_x_phase(pool, log)
    juxtapositions(pool, log)
    plotkin_sums(pool, log)
    provable_records(pool, log)
    log(f"{len(pool.refused)} candidates refused: proof estimated above its work budget"
        + "".join(f"\n    {what}" for what in pool.refused[:20]))
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
                               "method": "search", "provable": proved_on_import(e.code)})
        provable_records(pool, log)
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
    for limit in sorted({min(32, N_MAX), N_MAX}):
        part = [r for r in rows if r["n"] <= limit]
        at = sum(r["meets_bound"] for r in part)
        near = sum(r["d"] >= r["bound"] - 1 for r in part)
        log(f"n <= {limit}: {len(part)} cells, {at} ({100 * at / len(part):.1f} %) at the "
            f"best upper bound, {near} ({100 * near / len(part):.1f} %) within 1")
    log(f"wrote {count} records to {args.output}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
