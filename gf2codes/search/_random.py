"""Random systematic generator matrices ``[I | A]``.

Each row of ``A`` is drawn uniformly among the rows of weight at least ``D - 1`` (a
row of ``[I | A]`` is itself a codeword), so the cheapest failures never reach the
target test. The driver's target test stops at the first light codeword.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977, ch. 17 section 7 (random linear codes meet the
   Gilbert-Varshamov bound).
"""

from __future__ import annotations

from collections.abc import Iterator

import numpy as np

from ..code import Code
from ._base import Strategy, systematic_code

__all__ = ["RandomSystematic", "random_redundancy"]


def random_redundancy(k: int, r: int, min_row_weight: int,
                      rng: np.random.Generator) -> np.ndarray:
    """A random ``k x r`` 0/1 matrix whose rows weigh at least ``min_row_weight``."""
    A = rng.integers(0, 2, size=(k, r), dtype=np.uint8)
    if min_row_weight > r:
        return A
    for _ in range(64):
        bad = A.sum(axis=1) < min_row_weight
        if not bad.any():
            break
        A[bad] = rng.integers(0, 2, size=(int(bad.sum()), r), dtype=np.uint8)
    return A


class RandomSystematic(Strategy):
    """Uniformly random ``[I | A]`` with heavy enough rows."""

    name = "random"
    summary = "random systematic generator matrices [I | A]"

    def candidates(self, n: int, k: int, D: int,
                   rng: np.random.Generator) -> Iterator[Code | None]:
        r = n - k
        if r < 1 or r < D - 1:
            return
        while True:
            yield systematic_code(random_redundancy(k, r, D - 1, rng),
                                  name=f"random [{n},{k}]")
