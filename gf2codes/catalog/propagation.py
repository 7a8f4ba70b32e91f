"""The propagation rules in closed form: what every stored code gives without computing.

From a stored ``[n0, k0, d0]`` entry the standard rules [1]_ give proved codes: shorten
``[n-1, k-1, >= d]``, subcode ``[n, k-1, >= d]``, puncture ``[n-1, k, >= d-1]`` (at most
``d-1`` times, so the dimension stays), extend ``[n+1, k, d+1]`` for odd ``d``, append a
zero coordinate ``[n+1, k, d]``. Composed, they reach every ``[n, k]`` with ``k <= k0``
in one step each way; the functions below evaluate the best reach of every entry at
once, on the columns of :class:`EntryArrays`. :func:`derivation_steps` writes the
recipe (:func:`gf2codes.derive.rebuild` understands it) that builds the derived code.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1 section 9 (puncturing, shortening, extending).
"""

from __future__ import annotations

from typing import Any, NamedTuple

import numpy as np

from ..code import Code

__all__ = ["EntryArrays", "reach_distance", "reach_length", "reach_dimension",
           "derivation_steps", "NO_LENGTH"]

#: What :func:`reach_length` gives where an entry reaches no code.
NO_LENGTH = int(np.iinfo(np.int64).max)


class EntryArrays(NamedTuple):
    """The stored entries as columns (one item per entry), for the closed-form rules."""

    ids: np.ndarray
    n: np.ndarray
    k: np.ndarray
    d_lower: np.ndarray
    d_upper: np.ndarray
    proved: np.ndarray

    def only_proved(self) -> EntryArrays:
        """The entries whose interval was proved here (claims never feed a proof)."""
        return EntryArrays(*(a[self.proved] for a in self))


def reach_distance(N0: np.ndarray, K0: np.ndarray, L0: np.ndarray, n: int, k: int
                   ) -> np.ndarray:
    """Proved d of the best derived ``[n, k]`` code from each entry (0 where none).

    ``N0``, ``K0``, ``L0``: the entries' lengths, dimensions and proved lower bounds on d.

    >>> reach_distance(np.array([7]), np.array([4]), np.array([3]), 8, 4).tolist()
    [4]
    """
    s = K0 - k
    m = n - (N0 - s)
    d = np.where(m <= 0, L0 + m, L0 + (L0 % 2))
    ok = (s >= 0) & (d >= 1) & (k >= 1) & (k <= n)
    return np.where(ok, d, 0)


def reach_length(N0: np.ndarray, K0: np.ndarray, L0: np.ndarray, k: int, d: int
                 ) -> np.ndarray:
    """Least length of a derived ``[., k, >= d]`` code from each entry (:data:`NO_LENGTH`
    where none).

    >>> reach_length(np.array([7]), np.array([4]), np.array([3]), 3, 4).tolist()
    [7]
    """
    s = K0 - k
    big = NO_LENGTH
    n = np.where(L0 >= d, N0 - s - (L0 - d), np.where((L0 % 2 == 1) & (L0 + 1 == d),
                                                      N0 - s + 1, big))
    return np.where(s >= 0, n, big)


def reach_dimension(N0: np.ndarray, K0: np.ndarray, L0: np.ndarray, n: int, d: int
                    ) -> np.ndarray:
    """Greatest dimension of a derived ``[n, ., >= d]`` code from each entry (0 where none).

    >>> reach_dimension(np.array([7]), np.array([4]), np.array([3]), 6, 2).tolist()
    [4]
    """
    r = N0 - n
    p = np.minimum(np.maximum(r, 0), np.maximum(L0 - d, 0))
    kk = np.where(r <= 0, K0, K0 - (r - p))
    ok = (L0 >= d) | ((L0 % 2 == 1) & (L0 + 1 == d) & (r < 0))
    return np.where(ok & (kk >= 1), kk, 0)


def derivation_steps(code: Code, *, n: int, k: int, d_lower: int) -> list[dict[str, Any]]:
    """The steps that take a stored ``[n0, k0, >= d_lower]`` code to ``[n, k]``.

    Shorten at the last ``k0 - k`` pivot columns of the reduced echelon generator
    (:attr:`gf2codes.code.Code.pivots`), then puncture the last coordinates, or extend
    (odd ``d_lower``) and append zero coordinates (the ``append-zeros`` step of
    :func:`gf2codes.derive.rebuild`), as :meth:`gf2codes.catalog.Catalog.pick` computed.

    >>> from gf2codes.families import hamming
    >>> derivation_steps(hamming(3), n=9, k=4, d_lower=3)
    [{'op': 'extend'}, {'op': 'append-zeros', 'count': 1}]
    """
    steps: list[dict[str, Any]] = []
    s = code.k - k
    n_mid = code.n
    if s > 0:
        steps.append({"op": "shorten", "coords": sorted(code.pivots[-s:])})
        n_mid -= s
    m = n - n_mid
    if m < 0:
        steps.append({"op": "puncture", "coords": list(range(n_mid + m, n_mid))})
    elif m > 0:
        if d_lower % 2:
            steps.append({"op": "extend"})
            m -= 1
        if m:
            steps.append({"op": "append-zeros", "count": m})
    return steps
