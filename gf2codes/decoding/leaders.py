"""Coset leaders of a binary linear code: their weight distribution and the covering radius.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1, sections 3-4 (cosets, standard array, coset leaders).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .. import _decoding_kernels as _dk
from ..code import Code
from ..exceptions import TooExpensiveError, check_int

__all__ = ["DEFAULT_MAX_REDUNDANCY", "TABLE_MAX_REDUNDANCY", "CosetLeaders",
           "coset_leader_distribution", "covering_radius", "syndrome_columns",
           "check_redundancy", "leader_search", "leaders_from_counts"]

#: :func:`coset_leader_distribution` refuses codes with more parity bits than this
#: (the search keeps one byte per syndrome: 2^26 bytes = 64 MiB).
DEFAULT_MAX_REDUNDANCY = 26
#: :class:`SyndromeDecoder` keeps 5 bytes per syndrome; it refuses more parity bits.
TABLE_MAX_REDUNDANCY = 22

@dataclass(frozen=True)
class CosetLeaders:
    """The coset-leader weight distribution of an ``[n, k]`` code.

    Attributes
    ----------
    n, k : int
    counts : tuple of int
        ``counts[i]`` = number of cosets whose leaders (lightest words) have weight
        ``i``, for ``i = 0 .. covering_radius``; the counts add up to ``2^(n-k)``.
    """

    n: int
    k: int
    counts: tuple[int, ...]

    @property
    def covering_radius(self) -> int:
        """The largest weight of a coset leader: every word is within it of the code."""
        return len(self.counts) - 1

    def padded(self) -> list[int]:
        """``counts`` extended with zeros to length ``n + 1``."""
        return list(self.counts) + [0] * (self.n + 1 - len(self.counts))


def syndrome_columns(code: Code) -> np.ndarray:
    """The columns of ``code.H`` as integers (bit ``i`` = row ``i``); needs ``n - k <= 63``."""
    H = code.H.astype(np.uint64)
    shifts = np.arange(H.shape[0], dtype=np.uint64)[:, None]
    return np.ascontiguousarray(np.bitwise_or.reduce(H << shifts, axis=0), dtype=np.uint64)


def check_redundancy(code: Code, limit: int, what: str) -> None:
    """Refuse (:class:`TooExpensiveError`) a code with more than ``limit`` parity bits."""
    limit = check_int("max_redundancy", limit, minimum=0, maximum=40)
    r = code.n - code.k
    if r > limit:
        raise TooExpensiveError(
            f"{what} of this [{code.n},{code.k}] code needs a table of all 2^{r} = "
            f"{float(2 ** r):.3g} syndromes (n - k = {r} > {limit}); use simulation "
            "(simulate_bsc, or --simulate N on the command line) instead.",
            work=float(2 ** r),
        )


def leader_search(code: Code, keep_parent: bool
                  ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The breadth-first search over the syndromes: (columns of H as integers, leaders
    per weight, and with ``keep_parent`` the column that reached each syndrome)."""
    r = code.n - code.k
    cols = syndrome_columns(code)
    level = np.empty(1 << r, dtype=np.uint8)
    parent = np.empty((1 << r) if keep_parent else 0, dtype=np.int32)
    counts = _dk.coset_levels(cols, np.int64(r), level, parent)
    return cols, counts, parent


def leaders_from_counts(code: Code, counts: np.ndarray) -> CosetLeaders:
    """The :class:`CosetLeaders` of the counts per weight of :func:`leader_search`."""
    c = [int(x) for x in counts]
    while len(c) > 1 and c[-1] == 0:
        c.pop()
    assert sum(c) == 1 << (code.n - code.k), "H must have full rank"
    return CosetLeaders(code.n, code.k, tuple(c))


def coset_leader_distribution(code: Code, *,
                              max_redundancy: int = DEFAULT_MAX_REDUNDANCY) -> CosetLeaders:
    """The coset-leader weight distribution and covering radius of ``code``.

    A breadth-first search over the ``2^(n-k)`` syndromes: level ``w`` holds the
    syndromes of the cosets whose leaders have weight ``w``, and level ``w + 1`` is
    found by adding each column of ``H`` in turn to every syndrome of level ``w``.
    Time ``O((n + rho) 2^(n-k))``, memory one byte per syndrome.

    Parameters
    ----------
    code : Code
    max_redundancy : int
        Refuse codes with more than this many parity bits.

    Raises
    ------
    TooExpensiveError
        If ``n - k > max_redundancy``.

    References
    ----------
    MacWilliams & Sloane (1977), ch. 1, section 3 (standard array, coset leaders).

    Examples
    --------
    The [7,4] Hamming code is perfect: one coset of weight 0, seven of weight 1.

    >>> from gf2codes.families import hamming
    >>> coset_leader_distribution(hamming(3)).counts
    (1, 7)
    """
    check_redundancy(code, max_redundancy, "the coset-leader distribution")
    if code.k == code.n:
        return CosetLeaders(code.n, code.k, (1,))
    _, counts, _ = leader_search(code, keep_parent=False)
    return leaders_from_counts(code, counts)


def covering_radius(code: Code, *, max_redundancy: int = DEFAULT_MAX_REDUNDANCY) -> int:
    """The covering radius: the greatest distance from any word of GF(2)^n to the code.

    >>> from gf2codes.families import extended_golay
    >>> covering_radius(extended_golay())
    4
    """
    return coset_leader_distribution(code, max_redundancy=max_redundancy).covering_radius
