"""Column-greedy parity-check construction (Varshamov's argument made constructive).

The columns of a parity-check matrix ``H`` (``r = n - k`` rows) are chosen one at a
time, each outside the set of syndromes that are sums of at most ``d - 2`` columns
already chosen; then no ``d - 1`` columns of ``H`` are dependent and the code has
minimum distance at least ``d``. Varshamov's bound is the count that guarantees a
free syndrome while ``sum_{i <= d-2} C(n-1, i) < 2^r``; the greedy usually goes much
further. The reachable set is a table of ``2^r`` entries, so ``r`` is limited to
:data:`MAX_REDUNDANCY`.

Restarts vary the choice among the free syndromes: the first ``r`` columns are the
unit vectors (so ``H`` has full rank and the encoder is systematic), and each later
column is the free syndrome of least priority, the priorities drawn afresh for each
restart under one of two rules that alternate: *light first* (column weight, ties
broken at random; light columns make cheap encoders) and *uniform* (a random order).

References
----------
.. [1] R. R. Varshamov, "Estimate of the number of signals in error correcting
   codes", *Dokl. Akad. Nauk SSSR* 117 (1957) 739-741.
.. [2] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977, ch. 1 section 10 (the Gilbert-Varshamov bound).
"""

from __future__ import annotations

from collections.abc import Iterator

import numpy as np

from .. import bounds
from ..code import Code
from . import _kernels
from ._base import Strategy, code_from_columns

__all__ = ["ColumnGreedy", "MAX_REDUNDANCY", "greedy_parity_columns"]

#: Largest ``r = n - k`` for which the syndrome table (``2^r`` bytes) is built.
MAX_REDUNDANCY = 24


def _popcounts(r: int) -> np.ndarray:
    s = np.arange(1 << r, dtype=np.uint64)
    w = np.zeros(s.size, dtype=np.uint64)
    for b in range(r):
        w += (s >> np.uint64(b)) & np.uint64(1)
    return w


def greedy_parity_columns(r: int, D: int, n_max: int, prio: np.ndarray,
                          fixed: np.ndarray | None = None) -> np.ndarray:
    """Columns (as ints) of a parity-check matrix with no ``D - 1`` of them dependent.

    Parameters
    ----------
    r : int
        Bits per column.
    D : int
        The distance the code must reach (``D >= 2``).
    n_max : int
        Stop after this many columns.
    prio : numpy.ndarray
        ``uint64`` priority of each syndrome ``0 .. 2^r - 1`` (least first).
    fixed : numpy.ndarray, optional
        Columns taken first, in order.

    Returns
    -------
    numpy.ndarray
        The columns chosen (fewer than ``n_max`` when no free syndrome was left).
    """
    cols = np.zeros(max(n_max, 1), dtype=np.uint64)
    nf = 0 if fixed is None else len(fixed)
    if nf:
        assert fixed is not None
        cols[:nf] = fixed
    got = _kernels.greedy_columns(r, D - 2, n_max, np.ascontiguousarray(prio, np.uint64),
                                  cols, nf)
    if got < 0:
        raise ValueError("the fixed columns are not admissible")
    return cols[:got]


class ColumnGreedy(Strategy):
    """Randomised column-greedy parity-check matrices (see the module docstring)."""

    name = "greedy"
    summary = "column-greedy parity-check matrix (constructive Varshamov), random restarts"

    def candidates(self, n: int, k: int, D: int,
                   rng: np.random.Generator) -> Iterator[Code | None]:
        # With more redundancy than the table allows, build the shorter code
        # [k + MAX_REDUNDANCY, k]: the driver accepts it (appending zero coordinates
        # gives length n when the length is fixed).
        # Beyond the Varshamov length the greedy always succeeds, so more is pointless.
        r = min(n - k, MAX_REDUNDANCY, bounds.existence_length(k, D).n - k)
        n = k + r
        if r < 1 or D < 2 or r < D - 1:
            return
        weights = _popcounts(r)
        units = (np.uint64(1) << np.arange(r, dtype=np.uint64))
        restart = 0
        while True:
            noise = rng.integers(0, 1 << 40, size=1 << r, dtype=np.uint64)
            prio = (weights << np.uint64(40)) | noise if restart % 2 == 0 else noise
            restart += 1
            cols = greedy_parity_columns(r, D, n, prio, units)
            if cols.size < n:
                yield None
                continue
            yield code_from_columns(cols, r, name=f"greedy [{n},{k}]")
