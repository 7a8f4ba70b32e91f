"""Existence bounds: constructions that always succeed, turned around for ``n`` and ``k``.

Each existence bound of :mod:`gf2codes.bounds.registry` is a test ``ok(n, k, d)``
(Gilbert-Varshamov, Varshamov); a ``[k d, k, d]`` code (``k`` repetition blocks) always
exists. :func:`existence_for_distance`, :func:`existence_for_dimension` and
:func:`existence_for_length` return what every existence bound guarantees for two given
parameters, with the best of them (an :class:`Existence`), as the ``gf2codes bounds``
command prints it.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1 §10.
.. [2] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*,
   Cambridge University Press, 2003, §2.8.
.. [5] R. R. Varshamov, "Estimate of the number of signals in error correcting codes",
   *Doklady Akad. Nauk SSSR* 117 (1957) 739-741.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import cast

from .._util import memo
from ..exceptions import ParameterError
from ..typing import Question
from .formulas import Guarantee, check_kd, check_nd, check_nk, gv_ok, largest_d, varshamov_ok
from .registry import EXACT_LENGTH_LIMIT, Bound, registered
from .results import DimensionBound, LengthBound

__all__ = [
    "gilbert_varshamov", "varshamov", "lower_bounds", "existence_length", "existence_lengths",
    "existence_dimension", "existence_dimensions", "Existence", "existence_for_distance",
    "existence_for_dimension", "existence_for_length",
]


def gilbert_varshamov(n: int, k: int) -> int:
    """The largest ``d`` that the Gilbert-Varshamov bound guarantees for ``[n, k]``.

    A binary linear ``[n, k, >= d]`` code exists whenever
    ``sum_{i=0}^{d-1} C(n, i) < 2^(n-k+1)`` (the greedy construction).

    Parameters
    ----------
    n, k : int
        Length and dimension, ``1 <= k <= n``.

    Returns
    -------
    int

    Raises
    ------
    ParameterError

    References
    ----------
    .. [1] Huffman & Pless 2003, §2.8 (Gilbert-Varshamov bound).
    .. [2] MacWilliams & Sloane 1977, ch. 1 §10.

    Examples
    --------
    >>> gilbert_varshamov(24, 12)
    4
    """
    n, k = check_nk(n, k)
    return largest_d(gv_ok, n, k)


def varshamov(n: int, k: int) -> int:
    """The largest ``d`` that Varshamov's bound guarantees for ``[n, k]``.

    A binary linear ``[n, k, >= d]`` code exists whenever
    ``sum_{i=0}^{d-2} C(n - 1, i) < 2^(n-k)``.

    Parameters
    ----------
    n, k : int
        Length and dimension, ``1 <= k <= n``.

    Returns
    -------
    int

    Raises
    ------
    ParameterError

    References
    ----------
    .. [1] R. R. Varshamov, Dokl. Akad. Nauk SSSR 117 (1957) 739-741.
    .. [2] MacWilliams & Sloane 1977, ch. 1 §10, Theorem 12.

    Examples
    --------
    >>> varshamov(24, 12)
    5
    """
    n, k = check_nk(n, k)
    return largest_d(varshamov_ok, n, k)


def lower_bounds(n: int, k: int) -> dict[str, int]:
    """Every existence bound of the registry: keys ``"gilbert_varshamov"`` and
    ``"varshamov"`` (none above :data:`EXACT_LENGTH_LIMIT`, see ``skipped_bounds``).

    Raises
    ------
    ParameterError
    """
    n, k = check_nk(n, k)
    return {b.name: largest_d(_test(b), n, k) for b in registered("existence")
            if not b.skipped_at(n)}


def _test(bound: Bound) -> Guarantee:
    return cast(Guarantee, bound.guarantees)


@memo(4096)
def _existence_length(k: int, d: int) -> LengthBound:
    # k disjoint repetition blocks of length d: a [k d, k, d] code, always. Below that,
    # each test holds at every length from the least one on (if V(n, t) < 2^(n-k+c) then
    # V(n+1, t) <= 2 V(n, t) < 2^(n+1-k+c)), so the least length is found by bisection,
    # among the lengths where the tests are evaluated (see skipped_bounds).
    best = LengthBound(k * d, "repetition blocks")
    for name, n in _existence_lengths(k, d).items():
        if n is not None and (n < best.n or (n == best.n and best.by == "repetition blocks")):
            best = LengthBound(n, name)
    return best


@memo(4096)
def _existence_lengths(k: int, d: int) -> dict[str, int | None]:
    """The least length each existence bound guarantees (``None``: not within the lengths
    where it is evaluated, up to ``min(k d, EXACT_LENGTH_LIMIT)``)."""
    out: dict[str, int | None] = {}
    top = min(k * d, EXACT_LENGTH_LIMIT)
    for b in registered("existence"):
        name, ok = b.name, _test(b)
        lo = max(k, d) - 1
        out[name] = None
        if lo + 1 > top or not ok(top, k, d):
            continue
        hi = top
        while hi - lo > 1:
            mid = (lo + hi) // 2
            if ok(mid, k, d):
                hi = mid
            else:
                lo = mid
        out[name] = hi
    return out


def existence_length(k: int, d: int) -> LengthBound:
    """The least ``n`` for which an existence bound guarantees a linear ``[n, k, >= d]``.

    Parameters
    ----------
    k, d : int
        Dimension and minimum distance, both at least 1.

    Returns
    -------
    LengthBound
        ``n`` and ``by`` (``"varshamov"`` or ``"gilbert_varshamov"``, the bound that
        guarantees it, or ``"repetition blocks"``: ``k`` blocks of length ``d``).

    Raises
    ------
    ParameterError

    Examples
    --------
    >>> existence_length(12, 8).n >= 24
    True
    """
    k, d = check_kd(k, d)
    return _existence_length(k, d)


def existence_dimension(n: int, d: int) -> DimensionBound:
    """The greatest ``k`` for which an existence bound guarantees ``[n, k, >= d]``.

    At least 1 for every ``d <= n`` (Varshamov guarantees the repetition code).

    Parameters
    ----------
    n, d : int
        Length and minimum distance, ``1 <= d <= n``.

    Returns
    -------
    DimensionBound

    Raises
    ------
    ParameterError

    Examples
    --------
    >>> existence_dimension(24, 8).k
    6
    """
    n, d = check_nd(n, d)
    # floor(n / d) disjoint repetition blocks of length >= d: always a code.
    best = DimensionBound(n // d, "repetition blocks")
    # The later bounds of the registry are credited first on ties (Varshamov before GV).
    for b in reversed(registered("existence")):
        if b.skipped_at(n):
            continue
        name, ok = b.name, _test(b)
        k = 0
        while k < n and ok(n, k + 1, d):
            k += 1
        if k > best.k:
            best = DimensionBound(k, name)
    if best.k < 1:  # pragma: no cover - Varshamov always allows k = 1 when d <= n
        raise ParameterError(f"Argument 'd' must be at most {n}, not {d}.")
    return best


def existence_lengths(k: int, d: int) -> dict[str, int | None]:
    """The least length each existence bound guarantees for ``(k, d)``.

    Returns
    -------
    dict of str to int or None
        Keyed by the existence bounds of the registry; ``None`` where the bound
        guarantees nothing up to ``min(k d, EXACT_LENGTH_LIMIT)``.

    Raises
    ------
    ParameterError

    Examples
    --------
    >>> existence_lengths(4, 3)
    {'gilbert_varshamov': 9, 'varshamov': 7}
    """
    k, d = check_kd(k, d)
    return dict(_existence_lengths(k, d))


def existence_dimensions(n: int, d: int) -> dict[str, int]:
    """The greatest ``k`` each existence bound not skipped at ``n`` guarantees for ``(n, d)``.

    Raises
    ------
    ParameterError

    Examples
    --------
    >>> existence_dimensions(7, 3)
    {'gilbert_varshamov': 3, 'varshamov': 4}
    """
    n, d = check_nd(n, d)
    out = {}
    for b in registered("existence"):
        if b.skipped_at(n):
            continue
        k = 0
        while k < n and lower_bounds(n, k + 1)[b.name] >= d:
            k += 1
        out[b.name] = k
    return out


@dataclass(frozen=True)
class Existence:
    """What the existence bounds guarantee for two given parameters.

    Attributes
    ----------
    question : {"length", "distance", "dimension"}
        The parameter guaranteed: the least ``length`` for ``(k, d)``, the greatest
        ``distance`` for ``(n, k)`` or the greatest ``dimension`` for ``(n, d)``.
    per_bound : dict of str to int or None
        The value each existence bound guarantees (None: nothing in its range).
    value : int
        The best value guaranteed (by a bound, or by repetition blocks).
    by : str
        What guarantees it: a bound name or ``"repetition blocks"``.
    """

    question: Question
    per_bound: dict[str, int | None]
    value: int
    by: str


def existence_for_distance(n: int, k: int) -> Existence:
    """The distance every existence bound guarantees for ``[n, k]``, and the best one.

    Beyond the lengths where the bounds are evaluated, ``floor(n / k)`` (``k``
    repetition blocks), at least 1.

    Examples
    --------
    >>> existence_for_distance(24, 12)
    Existence(question='distance', per_bound={'gilbert_varshamov': 4, 'varshamov': 5}, \
value=5, by='varshamov')
    """
    per: dict[str, int | None] = dict(lower_bounds(n, k))  # validates n and k
    values = {name: v for name, v in per.items() if v is not None}
    if not values:
        return Existence("distance", per, max(1, n // k), "repetition blocks")
    best = max(values.values())
    return Existence("distance", per, best, next(nm for nm, v in values.items() if v == best))


def existence_for_dimension(n: int, d: int) -> Existence:
    """The dimension every existence bound guarantees for ``(n, d)``, and the best one
    (:func:`existence_dimension`).

    Examples
    --------
    >>> existence_for_dimension(7, 3).value
    4
    """
    per: dict[str, int | None] = dict(existence_dimensions(n, d))  # validates n and d
    best = existence_dimension(n, d)
    return Existence("dimension", per, best.k, best.by)


def existence_for_length(k: int, d: int) -> Existence:
    """The length every existence bound guarantees for ``(k, d)``, and the best one
    (:func:`existence_length`).

    Examples
    --------
    >>> existence_for_length(4, 3).value
    7
    """
    per = existence_lengths(k, d)  # validates k and d
    best = existence_length(k, d)
    return Existence("length", per, best.n, best.by)
