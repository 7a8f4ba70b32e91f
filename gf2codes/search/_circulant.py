"""Double-circulant and quasi-cyclic codes: random first rows and hill climbing.

The generator is ``[I | A]`` where ``A`` is cut from circulant ``k x k`` blocks,
``A = [C(a_1) | C(a_2) | ...]`` truncated to ``r = n - k`` columns (``C(a)`` has the
cyclic shifts of ``a`` as rows). With ``r = k`` this is the pure double circulant
code, with ``r`` a multiple of ``k`` a quasi-cyclic code of index ``1 + r / k``, and
otherwise a punctured one. The defining rows are first drawn at random, then
improved one bit at a time while the deficit of light codewords (as in
:mod:`~gf2codes.search._anneal`) does not grow.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977, ch. 16 section 7 (double circulant and
   quasi-cyclic codes).
.. [2] T. A. Gulliver and V. K. Bhargava, "Some best rate 1/p and rate (p-1)/p
   systematic quasi-cyclic codes", *IEEE Trans. Inform. Theory* 37 (1991) 552-555.
"""

from __future__ import annotations

from collections.abc import Iterator

import numpy as np

from .. import families, linalg
from ..code import Code
from . import _kernels
from ._anneal import objective_depth
from ._base import Strategy

__all__ = ["Circulant", "circulant_redundancy"]

_MOVES_PER_YIELD = 64


def circulant_redundancy(first_rows: np.ndarray, r: int) -> np.ndarray:
    """``[C(a_1) | C(a_2) | ...]`` truncated to ``r`` columns (rows ``a_j`` of length k)."""
    blocks = [np.stack([np.roll(a, s) for s in range(a.size)]) for a in first_rows]
    return np.hstack(blocks)[:, :r]


class Circulant(Strategy):
    """Random and hill-climbed circulant redundancy blocks (see the module docstring)."""

    name = "circulant"
    summary = "double-circulant / quasi-cyclic [I | A], random rows and hill climbing"

    def _build(self, a: np.ndarray, k: int, r: int, n: int) -> Code:
        if r % k == 0:
            eye = np.zeros(k, dtype=np.uint8)
            eye[0] = 1
            if r == k:
                return families.double_circulant(linalg.bit_string(a[0]))
            return families.quasi_cyclic(
                ["".join([linalg.bit_string(eye)] + [linalg.bit_string(x) for x in a])], k)
        A = circulant_redundancy(a, r)
        return families.from_rows(np.hstack([np.eye(k, dtype=np.uint8), A]))

    def candidates(self, n: int, k: int, D: int,
                   rng: np.random.Generator) -> Iterator[Code | None]:
        r = n - k
        if r < 1 or r < D - 1 or D < 2 or k < 2:
            return
        blocks = -(-r // k)
        t = objective_depth(k, D)
        out = np.zeros(3, dtype=np.int64)
        eye = np.eye(k, dtype=np.uint8)

        def deficit(a: np.ndarray) -> int:
            rows = np.ascontiguousarray(linalg.pack(np.hstack([eye, circulant_redundancy(a, r)])))
            _kernels.count_light(rows, t, D, 0, out)
            return int(out[1])

        while True:
            a = rng.integers(0, 2, size=(blocks, k), dtype=np.uint8)
            cur = deficit(a)
            stall = 0
            while cur > 0 and stall < 4 * blocks * k:
                for _ in range(_MOVES_PER_YIELD):
                    b, j = int(rng.integers(blocks)), int(rng.integers(k))
                    a[b, j] ^= 1
                    new = deficit(a)
                    if new <= cur:
                        stall = 0 if new < cur else stall + 1
                        cur = new
                        if cur == 0:
                            break
                    else:
                        a[b, j] ^= 1
                        stall += 1
                if cur > 0:
                    yield None
            if cur == 0:
                code = self._build(a, k, r, n)
                if code.k == k:
                    yield code
                else:
                    yield None
