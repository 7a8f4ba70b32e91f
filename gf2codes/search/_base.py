"""The strategy interface and the helpers the strategies share.

A strategy proposes codes for one target ``[n, k, >= D]`` at a time::

    class MyStrategy(Strategy):
        name = "my-strategy"

        def candidates(self, n, k, D, rng):
            while True:
                ...          # a bounded piece of work
                yield code   # a Code of length n and dimension >= k, or None

Each ``next()`` on the iterator should be a small, bounded unit of work (about a
millisecond to a few tens of milliseconds): yield ``None`` after a unit that produced
no candidate, so that the driver keeps control of time and of the schedule. An
iterator that ends has nothing more to offer for that target. Strategies never test
a candidate themselves beyond their own screening: the driver applies the target
test to every candidate it receives, and proves the winner.
"""

from __future__ import annotations

import math
from collections.abc import Iterator

import numpy as np

from .. import derive, families, linalg
from ..code import Code
from ..distance import minimum_distance
from . import _kernels

__all__ = [
    "Strategy",
    "code_from_columns",
    "repetition_blocks",
    "pad_to",
    "shorten_to",
    "subcode",
    "systematic_code",
    "echelon_rows",
    "light_budget",
    "screen",
    "target_test",
    "SCREEN_LIMIT",
]

#: Largest number of message sums the exact screen (:func:`screen`) enumerates
#: before the driver hands a candidate to :func:`gf2codes.distance.minimum_distance`.
SCREEN_LIMIT = 20_000_000


class Strategy:
    """A way of proposing candidate codes for a target ``[n, k, >= D]``.

    Attributes
    ----------
    name : str
        The name used by ``--strategy`` and in results.
    summary : str
        One line for ``--help`` and reports.
    exhaustible : bool
        True when the strategy proposes a finite list for each target (so that the
        driver may conclude it has nothing more to offer).
    warm : bool
        True when the strategy proposes a few deterministic candidates per target,
        cheaply: the driver's warm start tries it at every value from the bound towards
        the incumbent before the portfolio starts (implies ``exhaustible``).
    """

    name: str = ""
    summary: str = ""
    exhaustible: bool = False
    warm: bool = False

    def candidates(self, n: int, k: int, D: int,
                   rng: np.random.Generator) -> Iterator[Code | None]:
        """Yield candidate codes of length ``n``, dimension at least ``k`` (or ``None``)."""
        raise NotImplementedError

    def __repr__(self) -> str:
        return f"<Strategy {self.name}>"


# ----------------------------------------------------------------------------- helpers
def code_from_columns(cols: np.ndarray, r: int, *, name: str | None = None) -> Code:
    """The code whose parity-check matrix has the given ``r``-bit columns (ints)."""
    cols = np.asarray(cols, dtype=np.uint64)
    H = ((cols[None, :] >> np.arange(r, dtype=np.uint64)[:, None]) & np.uint64(1))
    return Code.from_parity_check(H.astype(np.uint8), name=name)


def repetition_blocks(n: int, k: int) -> Code:
    """``k`` disjoint repetition blocks covering ``n`` coordinates: ``d = floor(n / k)``."""
    G = np.zeros((k, n), dtype=np.uint8)
    sizes = [n // k + (1 if i < n % k else 0) for i in range(k)]
    start = 0
    for i, s in enumerate(sizes):
        G[i, start:start + s] = 1
        start += s
    return families.from_rows(G).with_info(name=f"repetition blocks [{n},{k}]")


def pad_to(code: Code, n: int) -> Code:
    """Append ``n - code.n`` zero coordinates (length fixed, distance unchanged)."""
    G = np.hstack([code.G, np.zeros((code.k, n - code.n), dtype=np.uint8)])
    return families.from_rows(G).with_info(name=code.name)


def shorten_to(code: Code, k: int) -> Code:
    """Shorten on ``code.k - k`` information-set coordinates (:attr:`Code.pivots`):
    ``[n - (k' - k), k]``, distance kept."""
    extra = code.k - k
    if extra <= 0:
        return code
    return derive.shorten(code, list(code.pivots[:extra]))


def subcode(code: Code, k: int) -> Code:
    """The first ``k`` rows of the reduced echelon generator (distance can only grow)."""
    if code.k <= k:
        return code
    sub = families.from_rows(code.rref_generator[:k])
    return sub.with_info(name=code.name)


def systematic_code(A: np.ndarray, *, name: str | None = None) -> Code:
    """The code with generator ``[I | A]`` (``A`` a ``k x r`` 0/1 matrix)."""
    A = np.asarray(A, dtype=np.uint8)
    k = A.shape[0]
    return Code(np.hstack([np.eye(k, dtype=np.uint8), A]), name=name)


def echelon_rows(code: Code) -> np.ndarray:
    """The reduced echelon generator, packed: every codeword of message ``m`` weighs >= wt(m)."""
    return np.ascontiguousarray(linalg.pack(code.rref_generator))


def light_budget(k: int, D: int) -> int:
    """Number of sums of 1..D-1 of ``k`` rows: the work of the exact screen."""
    return sum(math.comb(k, i) for i in range(1, min(D - 1, k) + 1))


def screen(code: Code, D: int) -> bool | None:
    """Exact and fast: is every nonzero codeword at least ``D`` heavy?

    Enumerates the sums of at most ``D - 1`` rows of the reduced echelon generator
    (each sum of ``i`` rows weighs at least ``i``, so no lighter codeword is missed),
    stopping at the first one lighter than ``D`` — an explicit codeword, so a
    ``False`` is a proof. Returns ``None`` when that enumeration would exceed
    :data:`SCREEN_LIMIT` sums.
    """
    if D <= 1:
        return True
    if light_budget(code.k, D) > SCREEN_LIMIT:
        return None
    out = np.zeros(3, dtype=np.int64)
    return _kernels.count_light(echelon_rows(code), D - 1, D, 1, out) == 0


def target_test(code: Code, D: int, *, time_limit: float | None = None) -> bool | None:
    """The driver's test of ``d >= D``: the screen, then :func:`minimum_distance`.

    A candidate the screen refutes is rejected (a lighter codeword was found). One
    that passes (or is too large to screen) goes through
    ``minimum_distance(code, target=D)``; its answer is returned (``None`` when the
    time limit left it open).
    """
    s = screen(code, D)
    if s is False:
        return False
    r = minimum_distance(code, target=D, time_limit=time_limit, max_work=None, workers=1)
    return r.at_least(D)
