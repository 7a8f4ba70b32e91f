"""Fast upper bounds: information-set decoding in the style of Lee–Brickell.

Random information sets, and the sums of at most two rows of each systematic
generator. A codeword found is a proved upper bound on d; nothing here proves a lower
bound beyond the trivial one.

References
----------
.. [1] P. J. Lee and E. F. Brickell, "An observation on the security of
   McEliece's public-key cryptosystem", EUROCRYPT 1988, LNCS 330, pp. 275-280.
"""

from __future__ import annotations

import numpy as np

from .. import _kernels, linalg
from .._util import Clock, past, rng
from ..code import Code
from ..typing import SeedLike
from ._result import INF, DistanceResult, unpack_word

__all__ = ["isd_pass", "distance_upper_bound", "quick_distance"]


def isd_pass(code: Code, gen: np.random.Generator, iterations: int | None,
             deadline: float | None) -> tuple[int, np.ndarray, int]:
    """Lee–Brickell with p <= 2 on ``iterations`` random information sets (or until the
    ``time.perf_counter()`` ``deadline``): returns (weight, packed word, codewords
    examined). ``iterations=0`` only looks at the generator rows."""
    n, k = code.n, code.k
    G = code.packed_generator
    best_w, best_word = INF, None
    for r in range(G.shape[0]):
        wt = sum(int(x).bit_count() for x in G[r])
        if wt < best_w:
            best_w, best_word = wt, G[r].copy()
    examined = k
    combo = np.zeros(2, dtype=np.int64)
    it = 0
    while True:
        if iterations is not None and it >= iterations:
            break
        if past(deadline):
            break
        it += 1
        e = linalg.rref(G, n=n, column_order=gen.permutation(n))
        GT = np.ascontiguousarray(e.rows.T)
        for w in (1, 2):
            if w > k:
                break
            state = np.arange(2, dtype=np.int64)
            visited, wt, _ = _kernels.combination_min_weight(GT, w, state, INF, 0, combo,
                                                             np.zeros(GT.shape[0], np.uint64))
            examined += visited
            if wt < best_w:
                best_w = int(wt)
                best_word = np.bitwise_xor.reduce(e.rows[combo[:w]], axis=0)
    assert best_word is not None  # k >= 1: the first generator row set it
    return best_w, best_word, examined


def distance_upper_bound(
    code: Code,
    *,
    time_limit: float = 1.0,
    iterations: int | None = None,
    seed: SeedLike = 0,
) -> DistanceResult:
    """A fast **upper bound** on d by information-set decoding (Lee–Brickell, p <= 2).

    The result is a codeword that was found, so ``d <= upper`` is certain, but
    nothing says a lighter codeword does not exist: ``lower`` is the trivial bound
    (the weight divisor) and ``exact`` is false unless that meets ``upper``.

    Parameters
    ----------
    time_limit : float
        Seconds to spend (ignored when ``iterations`` is given).
    iterations : int, optional
        Number of random information sets.
    seed : int or numpy.random.Generator

    References
    ----------
    .. [1] P. J. Lee and E. F. Brickell, "An observation on the security of
       McEliece's public-key cryptosystem", EUROCRYPT 1988, LNCS 330, pp. 275-280.
    """
    clock = Clock(None if iterations is not None else time_limit)
    w, word, examined = isd_pass(code, rng(seed), iterations, clock.deadline)
    lower = code.weight_divisor
    exact = lower >= w
    return DistanceResult(
        lower=min(lower, w), upper=w, witness=unpack_word(word, code.n), exact=exact,
        method="isd", codewords=examined, seconds=clock.elapsed(),
        stopped=None if exact else "upper bound only",
    )


def quick_distance(code: Code, *, time_limit: float = 2.0,
                   seed: SeedLike = 0) -> DistanceResult:
    """A fast interval for d: a short exact run for the lower bound, then
    information-set decoding for the upper bound, within ``time_limit`` seconds.

    The interval is proved at both ends (the upper end by a codeword found);
    ``exact`` is true when they happen to meet.
    """
    from . import minimum_distance

    clock = Clock(time_limit)
    proof = minimum_distance(code, time_limit=0.3 * time_limit, max_work=None, seed=seed)
    if proof.exact:
        return proof
    isd = distance_upper_bound(code, time_limit=max(1e-3, time_limit - proof.seconds),
                               seed=seed)
    best = isd if isd.upper < proof.upper else proof
    lower = proof.lower
    exact = lower >= best.upper
    return DistanceResult(
        lower=min(lower, best.upper), upper=best.upper, witness=best.witness, exact=exact,
        method=f"{proof.method}+isd", codewords=proof.codewords + isd.codewords,
        seconds=clock.elapsed(), stopped=None if exact else "upper bound only",
    )
