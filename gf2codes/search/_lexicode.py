"""Lexicodes: greedy lexicographic codes (Conway & Sloane 1986).

The lexicode of length ``n`` and distance ``d`` is built by scanning the words of
GF(2)^n in lexicographic order and keeping each word at distance at least ``d`` from
all words kept so far. It is linear, and it contains the Hamming codes (``d = 3``)
and the extended Golay code (``n = 24``, ``d = 8``) [1]_.

It is built here through an equivalent greedy on syndromes [2]_: the ``i``-th column
of its parity-check matrix is the least integer (read as a binary column) that is
not a sum of at most ``d - 2`` earlier columns. For ``d = 3`` that gives the columns
1, 2, 3, ...: the Hamming codes; for ``d = 4`` the columns 1, 2, 4, 7, 8, 11, ...:
the extended Hamming codes. One pass over ``2^r`` syndromes per column, no codeword
enumeration. The construction is deterministic: one candidate per target.

References
----------
.. [1] J. H. Conway and N. J. A. Sloane, "Lexicographic codes: error-correcting codes
   from game theory", *IEEE Trans. Inform. Theory* 32 (1986) 337-348.
.. [2] R. A. Brualdi and V. S. Pless, "Greedy codes", *J. Combin. Theory Ser. A* 64
   (1993) 10-30.
"""

from __future__ import annotations

from collections.abc import Iterator

import numpy as np

from ..code import Code
from ._base import Strategy, code_from_columns
from ._greedy import MAX_REDUNDANCY, greedy_parity_columns

__all__ = ["Lexicode", "lexicode_columns"]


def lexicode_columns(r: int, D: int, n_max: int) -> np.ndarray:
    """The first (up to ``n_max``) parity-check columns of the distance-``D`` lexicode
    that fit in ``r`` bits."""
    prio = np.arange(1 << r, dtype=np.uint64)
    return greedy_parity_columns(r, D, n_max, prio)


class Lexicode(Strategy):
    """The lexicode of the target length and distance (one deterministic candidate)."""

    name = "lexicode"
    summary = "the greedy lexicographic code (Conway & Sloane 1986)"
    exhaustible = True
    warm = True

    def candidates(self, n: int, k: int, D: int,
                   rng: np.random.Generator) -> Iterator[Code | None]:
        r = n - k
        if r < 1 or r > MAX_REDUNDANCY or D < 2:
            return
        cols = lexicode_columns(r, D, n)
        if cols.size < n:
            return
        yield code_from_columns(cols, r, name=f"lexicode [{n},d>={D}]")
