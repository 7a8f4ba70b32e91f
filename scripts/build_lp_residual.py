"""Write ``gf2codes/_lp_residual.jsonl``: non-existence facts of the LP with residual
exclusions, for the bound table.

A codeword of weight ``w`` (``d <= w <= 2d - 2``) of an even ``[N, k, >= d]`` code
gives an ``[N - w, k - 1, >= d - w/2]`` residual code
(:func:`gf2codes.bounds.lp.residual_exclusions`). Where the bound table rules that
residual code out, the weight is absent, and the even-code Delsarte LP without it can
prove fewer than ``2^k`` words: "no ``[n, k, d]`` code"
(:func:`gf2codes.bounds.lp.lp_residual_rules_out`, certificate checked in exact
integers). Each fact lowers the table, which can exclude more weights elsewhere, so
this script works in rounds: compute the table with the facts so far, test every cell
``2 <= k <= n <= --n-max`` at the table's bound ``d``, write what is proved, and repeat
until a round proves nothing. The file is written after every round (the table reads
it), one JSON object per line, sorted::

    {"n": N, "k": K, "d": D, "excluded": [W, ...], "size": S}

A fact at dimension ``k`` reads the table only at dimension ``k - 1``; the tests prove
every line again from the shipped table (``tests/test_bounds_lp_residual.py``). The
build starts from an empty file, so it is reproducible (HiGHS is deterministic).

The on-disk memos are switched off (``GF2CODES_CACHE_DIR=off``), so every certificate
is solved by this run.

    python scripts/build_lp_residual.py              # --n-max 129, the table's rows
    python scripts/build_lp_residual.py --n-max 64   # 56 facts in about 35 s

Measured on the 2-core AVX2 development machine: ``--n-max 129`` proved 215 facts in
the first round, 8 in the second and none in the third, 223 in all, in 555 s (load
about 2: another job on the other core); ``--n-max 64`` 56 facts in 32 s (load 0.3).

A test of the consistency of the build: a cell where the catalog has a proved code of
distance ``d`` must never be ruled out at ``d``; the script stops with an error if that
happens (``--check-catalog``, on by default, uses a fresh catalog from the seed).
"""

from __future__ import annotations

import os

os.environ["GF2CODES_CACHE_DIR"] = "off"  # before any gf2codes import: solve everything

import argparse  # noqa: E402  (the environment must be set before the package loads)
import json  # noqa: E402
import tempfile  # noqa: E402
import time  # noqa: E402
from pathlib import Path  # noqa: E402

from gf2codes._util import clear_caches  # noqa: E402
from gf2codes.bounds import table as T  # noqa: E402
from gf2codes.bounds.lp import lp_residual_rules_out  # noqa: E402

OUT = Path(T.LP_RESIDUAL_FILE)


def _write(facts: dict[tuple[int, int], dict[str, object]]) -> None:
    text = "".join(json.dumps(facts[cell]) + "\n" for cell in sorted(facts))
    fd, tmp = tempfile.mkstemp(dir=OUT.parent, prefix=".lp_residual.")
    with os.fdopen(fd, "w") as fh:
        fh.write(text)
    os.chmod(tmp, 0o644)  # mkstemp makes it private; the shipped file is read by all
    os.replace(tmp, OUT)


def _catalog_d(n_max: int) -> dict[tuple[int, int], int]:
    from gf2codes.catalog import open_catalog

    with tempfile.TemporaryDirectory() as tmp, open_catalog(Path(tmp) / "c.db") as cat:
        return {(r["n"], r["k"]): r["d"] for r in cat.distance_table(range(1, n_max + 1))}


def _record(n: int, k: int, d: int, val: list[list[int]]) -> dict[str, object] | None:
    proof = lp_residual_rules_out(n, k, d, lambda m, j: val[m][j])
    if proof is None:
        return None
    return {"n": n, "k": k, "d": d, "excluded": list(proof.excluded), "size": proof.size}


def build(n_max: int, check_catalog: bool) -> dict[tuple[int, int], dict[str, object]]:
    """The rounds; then every fact proved again from the final table (so each line's
    weights and size are those the shipped table gives, which the tests check)."""
    facts: dict[tuple[int, int], dict[str, object]] = {}  # one per cell: the least d
    _write(facts)
    have = _catalog_d(n_max) if check_catalog else {}
    t0 = time.perf_counter()
    rounds = 0
    while True:
        rounds += 1
        clear_caches()
        val, _ = T._fixed_table()
        new = 0
        for n in range(2, n_max + 1):
            for k in range(2, n + 1):
                d = val[n][k]
                rec = _record(n, k, d, val)
                if rec is None:
                    continue
                if have.get((n, k), 0) >= d:
                    raise SystemExit(f"BUG: [{n},{k},{d}] ruled out, but the catalog has a "
                                     f"proved [{n},{k},{have[n, k]}] code")
                facts[n, k] = rec
                new += 1
        _write(facts)
        print(f"round {rounds}: {new:4d} new facts, {len(facts):5d} cells, "
              f"{time.perf_counter() - t0:7.1f} s  load {os.getloadavg()[0]:.1f}", flush=True)
        if not new:
            break
    clear_caches()
    val, _ = T._fixed_table()
    for (n, k), rec in facts.items():
        again = _record(n, k, int(rec["d"]), val)  # type: ignore[call-overload]
        if again is None:
            raise SystemExit(f"[{n},{k},{rec['d']}] is not proved again from the final table")
        facts[n, k] = again
    _write(facts)
    return facts


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--n-max", type=int, default=T.TABLE_LENGTH + 1,
                    help="largest length tested (default %(default)s; at most "
                         f"{T.TABLE_LENGTH + 1})")
    ap.add_argument("--no-check-catalog", dest="check_catalog", action="store_false",
                    help="do not compare with the codes of a fresh catalog")
    args = ap.parse_args()
    if not 2 <= args.n_max <= T.TABLE_LENGTH + 1:
        raise SystemExit(f"--n-max must be in 2..{T.TABLE_LENGTH + 1}")
    print("load average:", os.getloadavg())
    t0 = time.perf_counter()
    facts = build(args.n_max, args.check_catalog)
    print(f"{len(facts)} facts written to {OUT} in {time.perf_counter() - t0:.1f} s")
    print("load average:", os.getloadavg())


if __name__ == "__main__":
    main()
