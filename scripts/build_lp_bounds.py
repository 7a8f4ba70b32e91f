"""Write ``gf2codes/_lp_bounds.jsonl``: certified Delsarte LP values for the bound table.

For every cell ``1 <= k <= n <= --n-max`` this solves the certified LP bound
:func:`gf2codes.bounds.lp.lp_value` (HiGHS through SciPy, each certificate checked in
exact integer arithmetic by :func:`gf2codes.bounds._lp_certify.certify_exact` or the
exact check of the plain solve) and writes one JSON object per line,
``{"n": N, "k": K, "d": D}``: "the certified LP proves ``d <= D`` for every binary
linear ``[N, K]`` code". Only the cells where ``D`` is strictly below the cheap formula
bounds of the table's start (the least of Singleton, Hamming, Plotkin and Griesmer,
``table._base``) are written: elsewhere the LP adds nothing to the table, and the file
stays small. :func:`gf2codes.bounds.table._fixed_table` seeds its cells with these values
(rule ``lp``) and propagates them; the tests solve a sample of the lines again (and every
line behind ``-m slow``).

The on-disk memo of LP values is switched off for the run (``GF2CODES_CACHE_DIR=off`` is
set before the package is imported), so every value written was certified by this run,
never read back from an earlier one.

Measured on one core (load average about 1 during the run, a 2-core machine):
``--n-max 130`` (the default: every row of the fixed-point table, ``n <= TABLE_LENGTH +
1``, and the row one length further that its last row's parity step reads) took 37 s
for all 8,515 cells (about 6 s for ``n <= 66``) and wrote 3,143 lines, 89 KB. Longer
lengths would be cheap enough too, but the fixed-point table does not read them (rows
beyond it use the LP at the queried cell only).

    python scripts/build_lp_bounds.py            # --n-max 130
    python scripts/build_lp_bounds.py --n-max 64 --out /tmp/lp.jsonl

References
----------
.. [1] P. Delsarte, "An algebraic approach to the association schemes of coding
   theory", *Philips Research Reports Supplements* 10, 1973.
.. [2] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 17 §4 (the linear programming bound; from memory).
"""

from __future__ import annotations

import os

os.environ["GF2CODES_CACHE_DIR"] = "off"  # before any gf2codes import: solve everything

import argparse  # noqa: E402  (the environment must be set before the package loads)
import json  # noqa: E402
import tempfile  # noqa: E402
import time  # noqa: E402
from pathlib import Path  # noqa: E402

from gf2codes._diskcache import cache_dir  # noqa: E402
from gf2codes.bounds import table as T  # noqa: E402
from gf2codes.bounds.lp import lp_value  # noqa: E402

OUT = Path(T.LP_BOUNDS_FILE)


def build(n_max: int) -> list[dict[str, int]]:
    """Solve the certified LP at every cell ``n <= n_max``; the lines below the base."""
    if cache_dir() is not None:
        raise SystemExit("the LP memo must be off for this run (GF2CODES_CACHE_DIR=off)")
    lines: list[dict[str, int]] = []
    t0 = time.perf_counter()
    for n in range(1, n_max + 1):
        below = 0
        for k in range(1, n + 1):
            d = lp_value(n, k)
            base, _ = T._base(n, k)
            if d < 1:
                raise SystemExit(f"lp_value({n}, {k}) = {d}: below the repetition code")
            if d < base:
                lines.append({"n": n, "k": k, "d": d})
                below += 1
        print(f"n = {n:3d}: {below:3d} cells below the base, {len(lines):5d} lines, "
              f"{time.perf_counter() - t0:7.1f} s  load {os.getloadavg()[0]:.1f}", flush=True)
    return lines


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--n-max", type=int, default=T.TABLE_LENGTH + 2,
                    help="largest length (default: the table's last row + 1, %(default)s)")
    ap.add_argument("--out", type=Path, default=OUT, help="file to write (default: shipped)")
    args = ap.parse_args()
    print("load average:", os.getloadavg())
    t0 = time.perf_counter()
    lines = build(args.n_max)
    text = "".join(json.dumps(rec) + "\n" for rec in lines)
    fd, tmp = tempfile.mkstemp(dir=args.out.parent, prefix=".lp_bounds.")
    with os.fdopen(fd, "w") as fh:
        fh.write(text)
    os.chmod(tmp, 0o644)  # mkstemp makes it private; the shipped file is read by all
    os.replace(tmp, args.out)
    print(f"{len(lines)} lines, {len(text.encode()):,} bytes written to {args.out} in "
          f"{time.perf_counter() - t0:.1f} s")
    print("load average:", os.getloadavg())


if __name__ == "__main__":
    main()
