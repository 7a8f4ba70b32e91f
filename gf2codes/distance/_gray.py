"""The Gray-code route: every one of the ``2^k`` codewords, one XOR and one popcount each.

The last ``b`` basis rows are tabulated (:func:`gf2codes._kernels.gray_layout`) so that
the innermost loop is a long, vectorised scan.
"""

from __future__ import annotations

import math

import numpy as np

from .. import _kernels
from ..code import Code
from ._result import CHUNK, Best, ProofClock

__all__ = ["RATE_GRAY", "gray_seconds", "gray_word", "gray_search"]

#: Measured rate (codewords per second, one core) used only to choose the route and to
#: phrase estimates; see scripts/bench_distance.py.
RATE_GRAY = 5e9


def gray_seconds(k: int) -> float:
    """Seconds to enumerate 2^k codewords; infinite past the float range (k >= 1024,
    where ``2.0 ** k`` overflows: Hamming [4095,4083])."""
    return math.inf if k >= 1000 else (2.0 ** k) / RATE_GRAY


def gray_word(rows: np.ndarray, gray: int, inner: int) -> np.ndarray:
    """The packed codeword at outer Gray index ``gray`` and inner table index ``inner``."""
    k = rows.shape[0]
    b = min(_kernels.GRAY_TAIL, k)
    w = np.zeros(rows.shape[1], dtype=np.uint64)
    for j in range(k - b):
        if (gray >> j) & 1:
            w ^= rows[j]
    for j in range(b):
        if (inner >> j) & 1:
            w ^= rows[k - b + j]
    return w


def gray_search(code: Code, clock: ProofClock, best: Best, stop_at: int) -> bool:
    """Enumerate all codewords (or until a weight <= stop_at); True when complete."""
    rows = np.array(code.packed_generator, dtype=np.uint64, order="C")
    OT, TT, _ = _kernels.gray_layout(rows)
    outer = 1 << OT.shape[1]
    per = max(1, CHUNK // TT.shape[1])
    g = 0
    while g < outer:
        stop = min(outer, g + per)
        wt, gray, inner = _kernels.gray_min_weight(OT, TT, g, stop, stop_at)
        visited = (stop - g) * TT.shape[1]
        if wt < best.weight:
            best.offer(wt, gray_word(rows, int(gray), int(inner)))
        g = stop
        clock.tick(visited, 0, best.weight)
        if best.weight <= stop_at:
            # The kernel may have stopped inside the block: never claim completeness.
            return False
        if g < outer and clock.expired():
            return False
    return True
