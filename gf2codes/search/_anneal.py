"""Local search on the redundancy matrix ``A`` of a systematic generator ``[I | A]``.

The objective is the *deficit*: the sum of ``D - wt(c)`` over the nonzero codewords
``c`` lighter than the target ``D``. In systematic form a codeword of a message of
weight ``i`` weighs at least ``i``, so the light codewords are among the sums of at
most ``D - 1`` rows, and the deficit is computed exactly by enumerating those
(when that is affordable; otherwise over sums of fewer rows, a proxy, and the
driver's target test decides). A move flips one bit of ``A``; moves that do not
increase the deficit are kept, others with probability ``exp(-increase / T)``
(simulated annealing, ``T`` lowered geometrically over each run). A run that stalls
is restarted from a fresh random matrix. The annealing loop is compiled
(:func:`gf2codes.search._kernels.anneal_redundancy`).

References
----------
.. [1] S. Kirkpatrick, C. D. Gelatt and M. P. Vecchi, "Optimization by simulated
   annealing", *Science* 220 (1983) 671-680.
.. [2] A. A. El Gamal, L. A. Hemachandra, I. Shperling and V. K. Wei, "Using
   simulated annealing to design good codes", *IEEE Trans. Inform. Theory* 33
   (1987) 116-123.
"""

from __future__ import annotations

import math
from collections.abc import Iterator

import numpy as np

from .. import linalg
from ..code import Code
from . import _kernels
from ._base import Strategy, light_budget
from ._random import random_redundancy

__all__ = ["Annealing", "objective_depth"]

_EVAL_BUDGET = 200_000  # message sums per evaluation of the objective
_STEP_WORK = 4_000_000  # message sums per yield (about a few milliseconds)


def objective_depth(k: int, D: int, budget: int = _EVAL_BUDGET) -> int:
    """Largest ``t <= D - 1`` with at most ``budget`` sums of 1..t of ``k`` rows."""
    t, total = 0, 0
    while t < min(D - 1, k):
        nxt = total + math.comb(k, t + 1)
        if nxt > budget and t >= 1:
            break
        t, total = t + 1, nxt
    return max(t, 1)


class Annealing(Strategy):
    """Simulated annealing on ``A`` in ``[I | A]`` (see the module docstring)."""

    name = "anneal"
    summary = "simulated annealing on the redundancy matrix (deficit of light codewords)"

    def candidates(self, n: int, k: int, D: int,
                   rng: np.random.Generator) -> Iterator[Code | None]:
        r = n - k
        if r < 1 or r < D - 1 or D < 2:
            return
        t = objective_depth(k, D)
        per_eval = max(1, light_budget(k, t + 1))
        iters = max(1, _STEP_WORK // per_eval)
        eye = np.eye(k, dtype=np.uint8)
        while True:
            A = random_redundancy(k, r, D - 1, rng)
            rows = np.ascontiguousarray(linalg.pack(np.hstack([eye, A])))
            best = np.empty_like(rows)
            temperature, best_seen, stall = 2.0, None, 0
            while stall < 8:
                seed = int(rng.integers(0, 2**31 - 1))
                val = _kernels.anneal_redundancy(rows, k, n, t, D, iters, temperature, seed,
                                                 best)
                if val == 0:
                    yield Code.from_packed(best.copy(), n, name=f"annealed [{n},{k}]")
                    break
                if best_seen is None or val < best_seen:
                    best_seen, stall = val, 0
                    rows[:, :] = best
                else:
                    stall += 1
                temperature *= 0.7
                yield None
