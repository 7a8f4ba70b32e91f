"""Each upper bound on ``d`` by itself, and turned around for ``n`` and ``k``.

The bounds are those of :mod:`gf2codes.bounds.registry`, evaluated at a point
``(n, k)`` (:func:`upper_bounds`), per bound for the least length (:func:`length_bounds`)
or the greatest dimension (:func:`dimension_bounds`), and which of them rule out a
given ``[n, k, d]`` (:func:`ruling_out`). Their combination with the propagation rules
is :func:`gf2codes.bounds.best_upper`.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1, 2 and 17.
.. [2] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*,
   Cambridge University Press, 2003, ch. 2.
"""

from __future__ import annotations

from typing import cast

from .._util import memo
from ..exceptions import TooExpensiveError, check_int
from .formulas import Kmax, check_kd, check_nd, check_nk, profile, search_d
from .registry import LP_LENGTH_LIMIT, registered, upper_names

__all__ = [
    "singleton_bound", "hamming_bound", "plotkin_bound", "griesmer_bound", "elias_bound",
    "lp_bound", "upper_bounds", "skipped_bounds", "ruling_out", "length_bounds",
    "dimension_bounds", "individual", "cheap_profiles",
]


def skipped_bounds(n: int) -> dict[str, str]:
    """The bounds not evaluated at length ``n``, each with the reason.

    Below :data:`LP_LENGTH_LIMIT` nothing is skipped. Above it the LP bound and the
    table rules are not used; above :data:`EXACT_LENGTH_LIMIT` neither are the Hamming,
    Elias, Gilbert-Varshamov and Varshamov bounds (each bound's ``max_length`` in the
    registry). Skipping a bound only weakens the answer; every bound that is reported is
    still proved.

    Examples
    --------
    >>> sorted(skipped_bounds(1000))
    ['lp', 'table']
    """
    n = check_int("n", n, minimum=1)
    out: dict[str, str] = {}
    limited = sorted((b for b in registered() if b.max_length is not None),
                     key=lambda b: b.max_length or 0)
    for b in limited:  # by limit: the LP's skip first, then the table, then the others
        if n > LP_LENGTH_LIMIT and (b.max_length or 0) > LP_LENGTH_LIMIT:
            out.setdefault("table", _TABLE_WHY.format(n=n, limit=LP_LENGTH_LIMIT))
        if b.skipped_at(n):
            out[b.name] = b.skip_reason.format(n=n, limit=b.max_length)
    if n > LP_LENGTH_LIMIT:
        out.setdefault("table", _TABLE_WHY.format(n=n, limit=LP_LENGTH_LIMIT))
    return out


_TABLE_WHY = ("n = {n} is above {limit}: only formula bounds at the point, no propagation "
              "through the table")


@memo(1024)
def cheap_profiles(n: int) -> dict[str, tuple[int, ...]]:
    """``D_name[k]`` for every cheap bound at length ``n`` (exact: max d not ruled out)."""
    out = {}
    for b in registered("upper"):
        if b.cheap:
            kmax = cast(Kmax, b.kmax)
            out[b.name] = tuple(profile([0] + [kmax(n, d) for d in range(1, n + 1)], n))
    return out


@memo(4096)
def individual(n: int, k: int) -> dict[str, int]:
    """Every upper bound of the registry not skipped at ``n``, at ``(n, k)`` (unchecked)."""
    prof = cheap_profiles(n) if n <= 2 * LP_LENGTH_LIMIT else None
    out: dict[str, int] = {}
    for b in registered("upper"):
        if b.skipped_at(n):
            continue
        if b.value is not None:
            out[b.name] = b.value(n, k)
        elif b.cheap and prof is not None:
            out[b.name] = prof[b.name][k]
        else:
            out[b.name] = search_d(cast(Kmax, b.kmax), n, k)
    return out


def _point(name: str, n: int, k: int) -> int:
    """One named bound at ``(n, k)``; :class:`TooExpensiveError` if it is skipped there."""
    value = individual(n, k).get(name)
    if value is None:
        raise TooExpensiveError(f"The {name} bound is not evaluated at n = {n}: "
                                f"{skipped_bounds(n)[name]}.")
    return value


def singleton_bound(n: int, k: int) -> int:
    """Singleton bound: ``d <= n - k + 1``.

    Parameters
    ----------
    n, k : int
        Length and dimension, ``1 <= k <= n``.

    Returns
    -------
    int
        Upper bound on the minimum distance of a binary linear ``[n, k]`` code.

    Raises
    ------
    ParameterError
        If ``n`` or ``k`` is not an integer or out of range.

    References
    ----------
    .. [1] MacWilliams & Sloane 1977, ch. 1 §11, Theorem 11.

    Examples
    --------
    >>> singleton_bound(7, 4)
    4
    """
    n, k = check_nk(n, k)
    return n - k + 1


def hamming_bound(n: int, k: int) -> int:
    """Hamming (sphere-packing) bound: the largest d with ``2^k V(n, floor((d-1)/2)) <= 2^n``.

    For even ``d`` the inequality is applied to the punctured ``[n - 1, k, d - 1]`` code,
    which makes the bound odd-even consistent (it returns 3, not 4, for ``[7, 4]``).
    Perfect codes meet it with equality.

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
    .. [1] MacWilliams & Sloane 1977, ch. 1 §5, Theorem 6.

    Examples
    --------
    >>> hamming_bound(7, 4), hamming_bound(23, 12), hamming_bound(24, 12)
    (3, 7, 8)
    """
    n, k = check_nk(n, k)
    return _point("hamming", n, k)


def plotkin_bound(n: int, k: int) -> int:
    """Plotkin bound for binary linear codes, extended to every ``n`` by shortening.

    Two inequalities, each applied to every shortened code ``[n', k - (n - n')]`` for the
    longest lengths ``n'`` where it holds:

    * Plotkin's bound on the size of any binary code, valid only for ``d <= n' <= 2d``
      (``d`` even: ``A(n', d) <= 2 floor(d / (2d - n'))`` for ``n' < 2d``,
      ``A(2d, d) <= 4d``) or ``d <= n' <= 2d + 1`` (``d`` odd, via ``A(n', d) =
      A(n' + 1, d + 1)``); with shortening, ``2^k <= 2^(n - n') A(n', d)``.
    * the average-weight bound for linear codes, valid for every ``n'``:
      ``d (2^k' - 1) <= n' 2^(k' - 1)``; it restricts only where ``2d > n'``.

    So the bound exists (and is valid) for every ``1 <= k <= n``; for ``2d <= n`` it is
    the shortened form, e.g. ``A(n, d) <= d 2^(n - 2d + 2)`` for even ``d``.

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
    .. [1] MacWilliams & Sloane 1977, ch. 2 §2, Theorem 1 and Corollaries (from memory).
    .. [2] Huffman & Pless 2003, §2.2 (Plotkin bound).

    Examples
    --------
    >>> plotkin_bound(15, 4), plotkin_bound(16, 5)
    (8, 8)
    """
    n, k = check_nk(n, k)
    return _point("plotkin", n, k)


def griesmer_bound(n: int, k: int) -> int:
    """Griesmer bound: the largest ``d`` with ``sum_{i<k} ceil(d / 2^i) <= n``.

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
    .. [1] J. H. Griesmer, IBM J. Res. Dev. 4 (1960) 532-542.
    .. [2] MacWilliams & Sloane 1977, ch. 17 §6.

    Examples
    --------
    >>> griesmer_bound(15, 4), griesmer_bound(16, 5)
    (8, 8)
    """
    n, k = check_nk(n, k)
    return _point("griesmer", n, k)


def elias_bound(n: int, k: int) -> int:
    """Elias-Bassalygo bound, evaluated exactly in integers.

    The largest ``d`` such that for every ``0 <= w <= n/2`` with
    ``w^2 - n w + n d / 2 > 0``:
    ``2^k <= (n d / 2) / (w^2 - n w + n d / 2) * 2^n / V(n, w)``.
    The usual statement uses reals; multiplied out it is an inequality between integers,
    so no rounding is involved.

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
    .. [1] Huffman & Pless 2003, §2.11 (Elias bound).
    .. [2] MacWilliams & Sloane 1977, ch. 17 §4.

    Examples
    --------
    >>> elias_bound(24, 12) >= 8
    True
    """
    n, k = check_nk(n, k)
    return _point("elias", n, k)


def lp_bound(n: int, k: int) -> int:
    """Delsarte's linear programming bound, certified in exact arithmetic.

    ``d`` is ruled out when no distance distribution can exist: ``A_0 = 1``,
    ``A_i >= 0``, ``A_1 = ... = A_{d-1} = 0``, ``sum A_i = 2^k`` and
    ``sum_i A_i K_j(i) >= 0`` for every ``j``. Because a binary ``[n, k, d]`` code with
    ``d`` even exists iff an even one does, and one with ``d`` odd iff an
    ``[n + 1, k, d + 1]`` one does, only the even-weight LP is used (length ``n`` for
    even ``d``, ``n + 1`` for odd ``d``). Infeasibility is declared only on an exact
    rational certificate (a dual solution of the LP, rounded and checked exactly); when
    HiGHS fails or the check fails, ``d`` is treated as possible -- a weaker bound,
    never a wrong one. The bisection over ``d`` is sound because one impossible ``d``
    rules out all larger ones.

    In double precision the certificate is reliable when either ``k`` or ``n - k`` is
    below about 40; in between (long codes of middling rate) it may fail, and the bound
    is then no better than the Singleton bound, which caps the search.

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
    .. [1] P. Delsarte, Philips Res. Rep. Suppl. 10, 1973.
    .. [2] MacWilliams & Sloane 1977, ch. 17 §4 (linear programming bound).

    Examples
    --------
    >>> lp_bound(24, 12), lp_bound(23, 12)
    (8, 7)
    """
    n, k = check_nk(n, k)
    return _point("lp", n, k)


def upper_bounds(n: int, k: int) -> dict[str, int]:
    """Every individual upper bound on ``d`` for a binary linear ``[n, k]`` code.

    Returns
    -------
    dict of str to int
        Keys ``"singleton", "hamming", "plotkin", "griesmer", "elias", "lp"``, less the
        bounds that :func:`skipped_bounds` skips at length ``n`` (none for
        ``n <= LP_LENGTH_LIMIT``; the Plotkin bound is defined everywhere through
        shortening, see :func:`plotkin_bound`).

    Raises
    ------
    ParameterError

    Examples
    --------
    >>> upper_bounds(24, 12)["lp"]
    8
    """
    n, k = check_nk(n, k)
    return individual(n, k)


def ruling_out(n: int, k: int, d: int) -> list[str]:
    """Names of the individual upper bounds that by themselves rule out ``[n, k, d]``.

    Returns
    -------
    list of str
        Names from :func:`upper_names`, in that order; empty if none does (the
        combination in :func:`best_upper` may still rule it out).

    Raises
    ------
    ParameterError
        If ``n``, ``k`` or ``d`` is not a positive integer.

    Examples
    --------
    >>> ruling_out(23, 12, 8)
    ['hamming', 'lp']
    """
    n = check_int("n", n, minimum=1)
    k = check_int("k", k, minimum=1)
    d = check_int("d", d, minimum=1)
    if k > n or d > n:
        return ["trivial (k <= n and d <= n)"]
    ind = individual(n, k)
    return [name for name in ind if ind[name] < d]


def length_bounds(k: int, d: int) -> dict[str, int]:
    """The least ``n`` that each individual upper bound allows for ``(k, d)``.

    Returns
    -------
    dict of str to int
        Same keys as :func:`upper_bounds` (the bounds skipped at length ``max(k, d)``
        are left out, see :func:`skipped_bounds`).

    Raises
    ------
    ParameterError
    """
    k, d = check_kd(k, d)
    # k disjoint repetition blocks of length d form a [k d, k, d] code, so every valid
    # bound allows n = k d. A bound skipped at a length (see skipped_bounds) proves
    # nothing there, so it counts as allowing it; a bound skipped already at the least
    # length max(k, d) is left out.
    hi = k * d
    out = {}
    for name in upper_names():
        if name in skipped_bounds(max(k, d)):
            continue
        # Bisection over n: sound because ruling out [n, k, d] rules out every shorter
        # length (append zero coordinates). Lengths below max(k, d) are impossible.
        lo = max(k, d) - 1
        h = hi
        while h - lo > 1:
            mid = (lo + h) // 2
            if individual(mid, k).get(name, d) >= d:
                h = mid
            else:
                lo = mid
        out[name] = h
    return out


def dimension_bounds(n: int, d: int) -> dict[str, int]:
    """The greatest ``k`` that each individual upper bound allows for ``(n, d)``.

    Returns
    -------
    dict of str to int
        Same keys as :func:`upper_bounds`.

    Raises
    ------
    ParameterError
    """
    n, d = check_nd(n, d)
    out = {}
    for name in individual(n, 1):
        lo, hi = 1, n + 1  # bisection, sound by the subcode argument in max_dimension
        while hi - lo > 1:
            mid = (lo + hi) // 2
            if individual(n, mid)[name] >= d:
                lo = mid
            else:
                hi = mid
        out[name] = lo
    return out
