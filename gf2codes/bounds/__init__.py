"""Bounds on the parameters of binary linear codes.

``D(n, k)`` below is the largest minimum distance of a binary linear ``[n, k]`` code.
Every *upper* bound here is a theorem about ``D(n, k)``: a value that is too small
would be a wrong answer, so every rule applied is stated, with its source, where it
is used. Every *lower* (existence) bound is a construction that always succeeds.

How each bound is evaluated
---------------------------
Each upper bound is a test "can a binary linear ``[n, k, >= d]`` code exist?". For all
of them except the LP bound the test is exact integer arithmetic (Python ints and
:func:`math.comb`); the Elias bound, usually quoted with real numbers, is evaluated
exactly too, as an inequality between integers. The bound on ``d`` is the largest
``d`` that the test does not rule out. Because a ``[n, k, d]`` code with ``d >= 2``
gives a ``[n, k, d - 1]`` code (puncture one coordinate, then append a zero one), a
single proof that ``d`` is impossible rules out every larger ``d``; a binary search
over ``d`` is therefore sound even where a test is not monotone.

The LP bound is solved in floating point with HiGHS, but the answer is *certified*
in exact arithmetic: the float solution of the dual LP is rounded to rationals and
checked (and rescaled) exactly, so the bound proved is the one the certificate proves,
never a rounding artefact. When HiGHS fails or the certificate does not verify, the
LP simply proves nothing at that point (a weaker, still valid, bound).

The best bound
--------------
:func:`best_upper` combines the cheap bounds (Singleton, Hamming, Plotkin, Griesmer)
over a table of all smaller parameters with the neighbour relations that puncturing,
shortening, taking subcodes and adding a parity bit give, then takes the minimum with
the Elias and LP bounds *at the queried point only* (the LP over the whole table would
take minutes for ``n`` near 256). Each row of the table depends only on smaller
lengths and on the cheap bounds one length further, so a value does not depend on
what was asked before.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977: ch. 1 (Hamming bound, Gilbert-Varshamov), ch. 2 §2 (Plotkin
   bound), ch. 5 (Krawtchouk polynomials), ch. 17 (bounds on the size of codes,
   including the linear programming bound and the Elias bound).
.. [2] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*,
   Cambridge University Press, 2003, ch. 2 (bounds on the size of codes).
.. [3] P. Delsarte, "An algebraic approach to the association schemes of coding
   theory", *Philips Research Reports Supplements* 10, 1973.
.. [4] J. H. Griesmer, "A bound for error-correcting codes", *IBM Journal of Research
   and Development* 4 (1960) 532-542.
.. [5] R. R. Varshamov, "Estimate of the number of signals in error correcting codes",
   *Doklady Akad. Nauk SSSR* 117 (1957) 739-741.

The chapter, section and theorem numbers cited in this module for [1] and [2] are from
memory and have not been re-checked against the books (none was at hand); each is
marked "from memory" where it is most likely to be off. The bounds themselves do not
rest on those numbers: the tests check every bound against brute force on all small
codes and against codes whose distance the tests compute.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from fractions import Fraction
from functools import cache, lru_cache

from ._diskcache import Memo
from .exceptions import ParameterError, TooExpensiveError, check_int

__all__ = [
    "UpperBound",
    "LengthBound",
    "DimensionBound",
    "UPPER_BOUND_NAMES",
    "LOWER_BOUND_NAMES",
    "singleton_bound",
    "hamming_bound",
    "plotkin_bound",
    "griesmer_bound",
    "elias_bound",
    "lp_bound",
    "upper_bounds",
    "best_upper",
    "bound_chain",
    "proved_nonexistence",
    "TABLE_LENGTH",
    "LP_LENGTH_LIMIT",
    "EXACT_LENGTH_LIMIT",
    "skipped_bounds",
    "least_length",
    "max_dimension",
    "length_bounds",
    "dimension_bounds",
    "ruling_out",
    "gilbert_varshamov",
    "varshamov",
    "lower_bounds",
    "existence_length",
    "existence_dimension",
]

#: Names of the upper bounds, in the order in which ties are credited.
UPPER_BOUND_NAMES = ("singleton", "griesmer", "hamming", "plotkin", "elias", "lp")
#: Names of the existence bounds.
LOWER_BOUND_NAMES = ("gilbert_varshamov", "varshamov")

_CHEAP = ("singleton", "griesmer", "hamming", "plotkin")


@dataclass(frozen=True)
class UpperBound:
    """An upper bound ``d`` on the minimum distance, and the bound (or chain) ``by``."""

    d: int
    by: str


@dataclass(frozen=True)
class LengthBound:
    """A length ``n`` and the bound ``by`` that determines it."""

    n: int
    by: str


@dataclass(frozen=True)
class DimensionBound:
    """A dimension ``k`` and the bound ``by`` that determines it."""

    k: int
    by: str


# ----------------------------------------------------------------------------- validation


def _check_nk(n: object, k: object) -> tuple[int, int]:
    n = check_int("n", n, minimum=1)
    k = check_int("k", k, minimum=1, maximum=n)
    return n, k


def _check_nd(n: object, d: object) -> tuple[int, int]:
    n = check_int("n", n, minimum=1)
    d = check_int("d", d, minimum=1, maximum=n)
    return n, d


def _check_kd(k: object, d: object) -> tuple[int, int]:
    return check_int("k", k, minimum=1), check_int("d", d, minimum=1)


# ----------------------------------------------------------------------------- helpers


@lru_cache(maxsize=64)
def _volumes(n: int) -> tuple[int, ...]:
    """``V(n, t) = sum_{i<=t} C(n, i)`` for ``t = 0..n`` (size of a Hamming ball)."""
    out, acc = [], 0
    for i in range(n + 1):
        acc += math.comb(n, i)
        out.append(acc)
    return tuple(out)


def _volume(n: int, t: int) -> int:
    if t < 0:
        return 0
    return _volumes(n)[min(t, n)]


def _floor_log2(x: int) -> int:
    """``floor(log2(x))`` for an integer ``x >= 1``; ``-1`` for ``x <= 0`` (no code at all)."""
    return x.bit_length() - 1 if x >= 1 else -1


def _profile(kmax: list[int], n: int) -> list[int]:
    """Turn ``kmax[d]`` (largest k a bound allows for distance d) into ``D[k]``.

    ``D[k]`` is the largest ``d`` with ``kmax[d] >= k`` -- the largest distance the bound
    does not rule out -- for ``k = 0..n`` (entry 0 unused). No monotonicity is assumed.
    """
    best_at = [0] * (n + 2)
    for d in range(1, n + 1):
        kk = min(kmax[d], n)
        if kk >= 1:
            best_at[kk] = max(best_at[kk], d)
    out = [0] * (n + 1)
    run = 0
    for kk in range(n, 0, -1):
        run = max(run, best_at[kk])
        out[kk] = run
    return out


# ------------------------------------------------ per-(n, d) tests: the largest k allowed


def _kmax_singleton(n: int, d: int) -> int:
    # Singleton bound: k <= n - d + 1 ([1] ch. 1 §11, Thm 11; [2] Thm 2.4.1).
    return n - d + 1


def _kmax_hamming(n: int, d: int) -> int:
    # Sphere-packing bound 2^k V(n, t) <= 2^n with t = floor((d-1)/2) ([1] ch. 1 §5, Thm 6).
    # For even d = 2t + 2 it is applied to the punctured [n-1, k, 2t+1] code, which exists
    # whenever the [n, k, 2t+2] code does (puncture a coordinate; d >= 2 keeps k).
    if d % 2:
        return n - (_volume(n, (d - 1) // 2) - 1).bit_length()
    if n - 1 < 1:
        return 0
    return n - 1 - (_volume(n - 1, (d - 2) // 2) - 1).bit_length()


def _kmax_griesmer(n: int, d: int) -> int:
    # Griesmer bound: n >= sum_{i<k} ceil(d / 2^i) ([4]; [1] ch. 17 §6, Thm 24; [2] §2.7).
    total, k, i = 0, 0, 0
    while True:
        term = -(-d // (1 << i))
        if term == 1:
            # every further term is 1
            return k + max(n - total, 0) if total <= n else k
        if total + term > n:
            return k
        total += term
        k += 1
        i += 1


def _plotkin_size(n: int, d: int) -> int | None:
    """Plotkin's bound on the size ``A(n, d)`` of any binary code, where it applies.

    Valid for ``d <= n <= 2d`` (``d`` even) or ``d <= n <= 2d + 1`` (``d`` odd); ``None``
    outside that range ([1] ch. 2 §2, Thm 1 and its corollary for odd ``d`` via
    ``A(n, d) = A(n + 1, d + 1)``; from memory of the statement, checked in the tests).
    """
    if n < d:
        return None
    if d % 2 == 0:
        if n < 2 * d:
            return 2 * (d // (2 * d - n))
        if n == 2 * d:
            return 4 * d
        return None
    if n < 2 * d + 1:
        return 2 * ((d + 1) // (2 * d + 1 - n))
    if n == 2 * d + 1:
        return 4 * d + 4
    return None


_PLOTKIN_WINDOW = 8


def _kmax_plotkin(n: int, d: int) -> int:
    # Both Plotkin-type inequalities, applied after shortening to a length n' where they
    # hold. Shortening: A(n, d) <= 2^(n - n') A(n', d) for any code ([1] ch. 17, Thm 1 (iii)
    # A(n, d) <= 2 A(n-1, d), from memory), and a linear [n, k, d] code shortened on
    # n - n' < k coordinates is a linear [n', k - n + n', >= d] code ([2] Thm 1.5.7).
    # (a) classical Plotkin on A(n', d), see _plotkin_size;
    # (b) linear, average weight: sum of the weights of the 2^k' codewords is at most
    #     n' 2^(k'-1), so d (2^k' - 1) <= n' 2^(k'-1), i.e. 2^(k'-1) (2d - n') <= d
    #     (the averaging step of the proof of the Plotkin bound, [2] §2.2, derived here: a
    #     coordinate that is not always 0 is 1 in half the codewords; valid for every n').
    # Only the few longest n' are tried (the best is among them in every case we looked
    # at); trying fewer shortenings can only weaken the bound, never make it wrong.
    top = min(n, 2 * d + 1)
    best = n  # k <= n trivially
    for n2 in range(top, max(d, top - _PLOTKIN_WINDOW) - 1, -1):
        m = n - n2
        size = _plotkin_size(n2, d)
        if size is not None:
            best = min(best, m + _floor_log2(size))
        if 2 * d > n2:
            best = min(best, m + 1 + _floor_log2(d // (2 * d - n2)))
    return best


def _kmax_elias(n: int, d: int) -> int:
    # Elias-Bassalygo bound ([2] §2.11, [1] ch. 17 §4; section numbers from memory):
    # for 0 <= w <= n/2 with w^2 - n w + n d / 2 > 0,
    #     A(n, d) <= (n d / 2) / (w^2 - n w + n d / 2) * 2^n / V(n, w).
    # Multiplying out by 2: 2^k (2w^2 - 2nw + nd) V(n, w) <= n d 2^n, all integers, so the
    # bound is evaluated exactly; no rounding can make it claim more than it proves.
    num = n * d << n
    best = n
    for w in range(0, n // 2 + 1):
        den = 2 * w * w - 2 * n * w + n * d
        if den <= 0:
            continue
        best = min(best, _floor_log2(num // (den * _volume(n, w))))
    return best


_KMAX = {
    "singleton": _kmax_singleton,
    "hamming": _kmax_hamming,
    "plotkin": _kmax_plotkin,
    "griesmer": _kmax_griesmer,
    "elias": _kmax_elias,
}


# ------------------------------------------------------------------ Delsarte's LP bound


@lru_cache(maxsize=8)
def _krawtchouk(n: int) -> tuple[tuple[int, ...], ...]:
    """Exact Krawtchouk values ``K[j][i] = K_j(i)`` for ``j <= n/2`` and *even* ``i``.

    Only these are needed (the LPs here are for even codes, where ``K_(n-j)(i) = K_j(i)``);
    entries at odd ``i`` are 0 placeholders. Recurrence ([1] ch. 5 §7), exact in ints:
    ``(j+1) K_{j+1}(i) = (n - 2i) K_j(i) - (n - j + 1) K_{j-1}(i)``.
    """
    ev = range(0, n + 1, 2)
    rows = [[1 if i % 2 == 0 else 0 for i in range(n + 1)]]
    rows.append([n - 2 * i if i % 2 == 0 else 0 for i in range(n + 1)])
    for j in range(1, n // 2):
        a, b = rows[j], rows[j - 1]
        r = [0] * (n + 1)
        for i in ev:
            r[i] = ((n - 2 * i) * a[i] - (n - j + 1) * b[i]) // (j + 1)
        rows.append(r)
    return tuple(tuple(r) for r in rows[: n // 2 + 1])


@lru_cache(maxsize=8)
def _krawtchouk_normalised(n: int):
    """``Q[j, i] = K_j(i) / C(n, j)`` as floats in [-1, 1], same index range as above."""
    import numpy as np

    K = _krawtchouk(n)
    Q = np.zeros((len(K), n + 1))
    for j, row in enumerate(K):
        c = math.comb(n, j)
        for i in range(0, n + 1, 2):
            Q[j, i] = row[i] / c
    return Q


def _dyadic(x: float, scale: int) -> int:
    """``floor(x * 2**scale)`` computed exactly from the binary value of ``x``."""
    p, q = float(x).as_integer_ratio()
    return (p << scale) // q


def _lp_size_primal_side(n: int, d: int) -> int | None:
    """Certified LP bound on the size of an even binary code of length n, distance >= d.

    Solves, for ``z >= 0`` (``z_j = y_j C(n, j)``), min sum z_j subject to
    ``sum_j z_j K_j(i)/C(n, j) <= -1`` for every even ``i`` in ``[d, n]``; any such ``z``
    gives, for every code with distance distribution ``A`` (``A_i >= 0``, zero for odd
    ``i`` and for ``0 < i < d``, and ``sum_i A_i K_j(i) >= 0`` for all ``j`` by
    MacWilliams/Delsarte), ``|C| <= 1 + (sum_j y_j C(n, j)) / c`` with
    ``c = min_i (-sum_j y_j K_j(i)) > 0``. The float ``z`` is rounded to dyadic
    rationals ``y`` and ``c`` is computed exactly, so the result is a proof.
    Returns the integer bound, or ``None`` if nothing was proved.
    """
    import numpy as np
    from scipy.optimize import linprog  # type: ignore[import-untyped]  # no stubs installed

    weights = list(range(d + (d % 2), n + 1, 2))
    if not weights:
        return 1
    Q = _krawtchouk_normalised(n)
    js = list(range(1, n // 2 + 1))  # for even weights K_{n-j} = K_j: half the columns
    A_ub = np.array([[Q[j, i] for j in js] for i in weights])
    res = linprog(np.ones(len(js)), A_ub=A_ub, b_ub=-np.ones(len(weights)),
                  bounds=(0, None), method="highs")
    if res.status != 0 or res.x is None:
        return None
    K = _krawtchouk(n)
    scale = n + 80
    Y = [max(_dyadic(z, scale) // math.comb(n, j), 0) for z, j in zip(res.x, js, strict=True)]
    c = min(-sum(y * K[j][i] for y, j in zip(Y, js, strict=True) if y) for i in weights)
    if c <= 0:
        return None
    S = sum(y * math.comb(n, j) for y, j in zip(Y, js, strict=True))
    return 1 + S // c


def _lp_size_dual_side(n: int, d: int) -> Fraction | None:
    """Certified LP lower bound on the size ``2^(n-k)`` of the dual of an even code.

    Works with the dual weight distribution ``B``. The dual of an even code contains the
    all-one word, so ``B_0 = B_n = 1`` and ``B_j = B_(n-j)``; then
    ``A_i = 2^(k-n) sum_j B_j K_i(j)`` vanishes for odd ``i`` automatically, must vanish
    for even ``0 < i < d`` and be ``>= 0`` for even ``i >= d`` (MacWilliams identities,
    [1] ch. 5). With ``Q_j(i) = K_j(i)/C(n, j) = K_i(j)/C(n, i)`` and ``P`` the indices
    ``1 <= j <= n/2``, row ``i`` reads ``2 + sum_{j in P} m_j B_j Q_j(i)`` (``m_j = 2``,
    except ``m_{n/2} = 1``). Multipliers ``l_i`` over even ``i`` (free for ``i < d``,
    ``>= 0`` for ``i >= d``) with ``g = max_{j in P} sum_i l_i Q_j(i) > 0`` prove
    ``sum_j B_j >= 2 + 2 (-sum_i l_i) / g`` (weak duality). The float multipliers are
    rounded to dyadic rationals and ``g`` is computed exactly, so the result is a proof.
    Returns the proved lower bound on ``2^(n-k)``, or ``None``.
    """
    import numpy as np
    from scipy.optimize import linprog  # type: ignore[import-untyped]  # no stubs installed

    Q = _krawtchouk_normalised(n)
    P = list(range(1, n // 2 + 1))
    rows = list(range(2, n + 1, 2))
    if not P or not rows:
        return None
    A_ub = np.array([[Q[j, i] for i in rows] for j in P])
    bounds = [(0, None) if i >= d else (None, None) for i in rows]
    res = linprog(np.ones(len(rows)), A_ub=A_ub, b_ub=np.ones(len(P)), bounds=bounds,
                  method="highs")
    if res.status != 0 or res.x is None:
        return None
    K = _krawtchouk(n)
    scale = 80
    L = [_dyadic(x, scale) for x in res.x]
    for idx, i in enumerate(rows):  # rounding must not break the sign constraints
        if i >= d and L[idx] < 0:
            L[idx] = 0
    total = sum(L)
    if total >= 0:
        return None
    pairs = [(li, i) for li, i in zip(L, rows, strict=True) if li]
    gmax = max(Fraction(sum(li * K[j][i] for li, i in pairs), math.comb(n, j)) for j in P)
    if gmax <= 0:
        return None
    return 2 + 2 * Fraction(-total) / gmax


@cache
def _kmax_lp_even(n: int, d: int) -> int:
    """Largest k the LP allows for an even ``[n, k, >= d]`` code (certified; d even).

    Also uses the certificates one step away, which apply because an even ``[n, k, >= d]``
    code gives an even ``[n + 1, k, >= d]`` code (append a zero coordinate) and is itself
    an even ``[n, k, >= d - 2]`` code; this smooths over points where HiGHS' float
    solution does not verify.
    """
    if d > n:
        return 0
    best = min(_kmax_lp_even_at(n, d), _kmax_lp_even_at(n + 1, d))
    if d - 2 >= 2:
        best = min(best, _kmax_lp_even_at(n, d - 2))
    return best


#: Certified LP values already proved by this installation (see :mod:`gf2codes._diskcache`):
#: ``"n,d"`` -> the bound of :func:`_kmax_lp_even_at`. Bump the version whenever the LP or
#: its certificate changes, so old values are not reused.
_LP_MEMO = Memo("lp-even", version="1")


@cache
def _kmax_lp_even_at(n: int, d: int) -> int:
    """Certified LP bound on k from the LP at exactly ``(n, d)``; ``n`` if unproved.

    The value is remembered on disk, so later processes neither import SciPy nor solve.
    """
    key = f"{n},{d}"
    known = _LP_MEMO.get(key)
    if isinstance(known, int) and 0 <= known <= n:
        return known
    best = _kmax_lp_even_at_solved(n, d)
    _LP_MEMO.put(key, best)
    return best


def _kmax_lp_even_at_solved(n: int, d: int) -> int:
    # Pick the side on which the LP optimum is small (better conditioned), falling back
    # to the other side; keep the best certified value. A failure proves nothing (k <= n).
    guess = min(_kmax_hamming(n, d), _kmax_griesmer(n, d), _kmax_singleton(n, d))
    order = ("primal", "dual") if guess <= n // 2 else ("dual", "primal")
    best = n
    for side in order:
        if side == "primal":
            size = _lp_size_primal_side(n, d)
            if size is not None:
                best = min(best, _floor_log2(size))
        else:
            dual = _lp_size_dual_side(n, d)
            if dual is not None:
                # 2^(n-k) >= dual  =>  k <= n - ceil(log2(dual))
                need = math.ceil(dual)
                best = min(best, n - (need - 1).bit_length())
        if best < n:
            break
    return best


def _kmax_lp(n: int, d: int) -> int:
    # d even: a binary linear [n, k, d] code exists iff an even one does (puncture a
    # coordinate, then add an overall parity bit; [1] ch. 1 §9, [2] §1.5.2).
    # d odd: an [n, k, d] code exists iff an [n + 1, k, d + 1] code does (add a parity
    # bit / puncture), so the even-weight LP of length n + 1 applies.
    if d % 2:
        return _kmax_lp_even(n + 1, d + 1)
    return _kmax_lp_even(n, d)


# ------------------------------------------------------------------ bounds on d for (n, k)


@cache
def _cheap_profiles(n: int) -> dict[str, tuple[int, ...]]:
    """``D_name[k]`` for every cheap bound at length ``n`` (exact: max d not ruled out)."""
    out = {}
    for name in _CHEAP:
        f = _KMAX[name]
        out[name] = tuple(_profile([0] + [f(n, d) for d in range(1, n + 1)], n))
    return out


def _point(name: str, n: int, k: int) -> int:
    """One named bound at ``(n, k)``; :class:`TooExpensiveError` if it is skipped there."""
    value = _individual(n, k).get(name)
    if value is None:
        raise TooExpensiveError(f"The {name} bound is not evaluated at n = {n}: "
                                f"{skipped_bounds(n)[name]}.")
    return value


def _search_d(kmax, n: int, k: int, top: int | None = None) -> int:
    # Largest d in [1, n] that is not ruled out, by bisection. Sound without monotonicity:
    # the answer d* has d* + 1 ruled out (or d* = n), and one impossible distance rules out
    # all larger ones (puncture + append a zero coordinate). d = 1 is never ruled out.
    lo, hi = 1, (n if top is None else top) + 1
    while hi - lo > 1:
        mid = (lo + hi) // 2
        if kmax(n, mid) >= k:
            lo = mid
        else:
            hi = mid
    return lo


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
    n, k = _check_nk(n, k)
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
    n, k = _check_nk(n, k)
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
    n, k = _check_nk(n, k)
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
    n, k = _check_nk(n, k)
    return _point("griesmer", n, k)


@lru_cache(maxsize=4096)
def _elias(n: int, k: int) -> int:
    return _search_d(_kmax_elias, n, k)


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
    n, k = _check_nk(n, k)
    return _point("elias", n, k)


@lru_cache(maxsize=4096)
def _lp(n: int, k: int) -> int:
    # The search is capped by the Singleton bound (a theorem), so that the bisection does
    # not wander into lengths/rates where the float LP cannot be certified.
    return min(_search_d(_kmax_lp, n, k, n - k + 1), n - k + 1)


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
    n, k = _check_nk(n, k)
    return _point("lp", n, k)


#: Largest length at which the certified LP bound and the propagation table are used.
LP_LENGTH_LIMIT = 256
#: Largest length at which the Hamming, Elias and existence bounds are evaluated (they
#: need exact sums of binomial coefficients, whose cost grows like n^2 bits).
EXACT_LENGTH_LIMIT = 4096


def skipped_bounds(n: int) -> dict[str, str]:
    """The bounds not evaluated at length ``n``, each with the reason.

    Below :data:`LP_LENGTH_LIMIT` nothing is skipped. Above it the LP bound and the
    table rules are not used; above :data:`EXACT_LENGTH_LIMIT` neither are the Hamming,
    Elias, Gilbert-Varshamov and Varshamov bounds. Skipping a bound only weakens the
    answer; every bound that is reported is still proved.

    Examples
    --------
    >>> sorted(skipped_bounds(1000))
    ['lp', 'table']
    """
    n = check_int("n", n, minimum=1)
    out: dict[str, str] = {}
    if n > LP_LENGTH_LIMIT:
        out["lp"] = f"n = {n} is above {LP_LENGTH_LIMIT}, the range of the certified LP"
        out["table"] = (f"n = {n} is above {LP_LENGTH_LIMIT}: only formula bounds at the "
                        "point, no propagation through the table")
    if n > EXACT_LENGTH_LIMIT:
        why = (f"n = {n} is above {EXACT_LENGTH_LIMIT}; its exact binomial sums would take "
               "too long")
        for name in ("hamming", "elias", "gilbert_varshamov", "varshamov"):
            out[name] = why
    return out


@lru_cache(maxsize=4096)
def _individual(n: int, k: int) -> dict[str, int]:
    if n <= 2 * LP_LENGTH_LIMIT:
        prof = _cheap_profiles(n)
        out = {name: prof[name][k] for name in ("singleton", "hamming", "plotkin", "griesmer")}
    else:
        skip = skipped_bounds(n)
        out = {name: _search_d(_KMAX[name], n, k) for name in _CHEAP if name not in skip}
    if n <= EXACT_LENGTH_LIMIT:
        out["elias"] = _elias(n, k)
    if n <= LP_LENGTH_LIMIT:
        out["lp"] = _lp(n, k)
    return {name: out[name] for name in UPPER_BOUND_NAMES if name in out}


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
    n, k = _check_nk(n, k)
    return _individual(n, k)


# -------------------------------------------------- the table with neighbour relations

#: Lengths covered by the fixed-point table (rows beyond are extended one at a time).
TABLE_LENGTH = 128

#: ``(rule, source cell or None, extra)`` for each cell of the fixed-point table.
_Why = tuple[str, tuple[int, int] | None, int]


@cache
def proved_nonexistence() -> tuple[tuple[int, int, int, int], ...]:
    """The shipped exhaustive non-existence results ``(n, k, d, nodes)``.

    Each says "no binary linear ``[n, k, d]`` code exists", decided by
    :func:`gf2codes.existence.decide_existence` (an exhaustive search of ``nodes``
    nodes). The file ``_nonexistence.jsonl`` beside this module is written by
    ``scripts/build_nonexistence.py``; the tests decide every entry again.
    """
    import json
    from pathlib import Path

    path = Path(__file__).with_name("_nonexistence.jsonl")
    out = []
    if path.exists():
        for line in path.read_text().splitlines():
            if line.strip():
                rec = json.loads(line)
                out.append((int(rec["n"]), int(rec["k"]), int(rec["d"]), int(rec["nodes"])))
    return tuple(out)


def _describe(n: int, k: int, value: int, why: _Why) -> str:
    rule, src, extra = why
    if src is None:
        if rule == "exhaustive":
            return f"exhaustive search: no [{n},{k},{value + 1}] code ({extra:,} nodes)"
        return rule
    cell = f"[{src[0]},{src[1]}]"
    if rule == "residual":
        return (f"residual: an [{n},{k},{extra}] code would give a "
                f"{cell[:-1]},{-(-extra // 2)}] code")
    return f"{rule} {cell}"


@cache
def _fixed_table() -> tuple[list[list[int]], list[list[_Why]]]:
    """The fixed point of the propagation rules over ``n <= TABLE_LENGTH + 1``.

    Start: for every cell the least of the cheap formula bounds and the shipped
    exhaustive non-existence results. Then apply, in sweeps until nothing changes
    (each rule is a theorem about ``D(n, k)``, the largest distance of an ``[n, k]``
    code; a value only ever decreases, so the sweeps terminate):

    * shortening: ``D(n, k) <= D(n - 1, k - 1)`` ([2] Thm 1.5.7);
    * puncturing: ``D(n, k) <= D(n - 1, k) + 1`` ([1] ch. 1 §9; [2] Thm 1.5.1);
    * subcode: ``D(n, k) <= D(n, k - 1)``;
    * parity: an upper bound ``e`` on ``D(n + 1, k)`` gives ``D(n, k) <= 2 floor(e/2)``
      (append a zero coordinate, or for odd ``d`` an overall parity bit);
    * residual code: if an ``[n, k]`` code with minimum distance exactly ``d`` exists
      (``k >= 2``), the residual code with respect to a word of weight ``d`` is an
      ``[n - d, k - 1, >= ceil(d / 2)]`` code ([2] Thm 2.7.1; proof: for ``x`` outside
      ``{0, c}``, ``wt(x) + wt(x + c) >= 2d`` gives ``2 wt(x outside c) >= d``, which is
      also why the map has kernel ``{0, c}``). So if the table rules that code out, no
      ``[n, k]`` code has distance exactly ``d``, hence none has distance ``>= d``
      (puncture and append zero coordinates to bring any larger distance down to
      ``d``), and ``D(n, k) <= d - 1``.

    The last row (``TABLE_LENGTH + 1``) takes its parity step from the cheap bounds one
    length further. Returns the values and, per cell, the rule and source cell.
    """
    T = TABLE_LENGTH + 1
    val: list[list[int]] = [[0]]
    why: list[list[_Why]] = [[("", None, 0)]]
    for n in range(1, T + 1):
        vrow: list[int] = [0]
        wrow: list[_Why] = [("", None, 0)]
        for k in range(1, n + 1):
            v, name = _base(n, k)
            vrow.append(v)
            wrow.append((name, None, 0))
        val.append(vrow)
        why.append(wrow)
    for n, k, d, nodes in proved_nonexistence():
        if n <= T and k <= n and d - 1 < val[n][k]:
            val[n][k] = d - 1
            why[n][k] = ("exhaustive", None, nodes)
    above = [0] + [_base(T + 1, k)[0] for k in range(1, T + 2)]
    changed = True
    while changed:
        changed = False
        for n in range(1, T + 1):
            row, wrow = val[n], why[n]
            for k in range(1, n + 1):
                v = row[k]
                best: int = v
                reason: _Why = wrow[k]
                if k >= 2:
                    e = val[n - 1][k - 1]
                    if e < best:
                        best, reason = e, ("shortening", (n - 1, k - 1), 0)
                    e = row[k - 1]
                    if e < best:
                        best, reason = e, ("subcode", (n, k - 1), 0)
                if k <= n - 1:
                    e = val[n - 1][k] + 1
                    if e < best:
                        best, reason = e, ("puncturing", (n - 1, k), 0)
                e = 2 * ((val[n + 1][k] if n < T else above[k]) // 2)
                if e < best:
                    best, reason = e, ("parity", (n + 1, k), 0)
                if k >= 2:
                    dd = best
                    while dd >= 1:
                        m = n - dd
                        if m >= k - 1 and val[m][k - 1] >= -(-dd // 2):
                            break
                        dd -= 1
                    if dd < best:
                        m = n - (dd + 1)
                        best, reason = dd, ("residual", (max(m, 0), k - 1), dd + 1)
                if best < v:
                    if best < 1:  # pragma: no cover - would mean a rule below a real code
                        raise AssertionError(f"bound table broken at [{n},{k}]")
                    row[k], wrow[k] = best, reason
                    changed = True
    return val, why


def _reset_tables() -> None:
    """Forget every cached table value (after ``_nonexistence.jsonl`` changed)."""
    for f in (proved_nonexistence, _fixed_table, _best, _least_length, _max_dimension):
        f.cache_clear()
    _rows.clear()


def bound_chain(n: int, k: int) -> list[str]:
    """How the table's bound at ``(n, k)`` was obtained, one step per line.

    Follows the source cells of :func:`best_upper`'s table back to a formula bound or an
    exhaustive search, e.g. ``["[16,8] d <= 5: parity [17,8]", ..., "[18,8] d <= 6:
    griesmer"]``. Only for ``n <= TABLE_LENGTH`` (otherwise one line from the bound).

    Raises
    ------
    ParameterError
    """
    n, k = _check_nk(n, k)
    if n > TABLE_LENGTH:
        ub = _best(n, k)
        return [f"[{n},{k}] d <= {ub.d}: {ub.by}"]
    val, why = _fixed_table()
    out: list[str] = []
    cell: tuple[int, int] | None = (n, k)
    seen: set[tuple[int, int]] = set()
    while cell is not None and cell not in seen and cell[0] <= TABLE_LENGTH + 1:
        seen.add(cell)
        a, b = cell
        w = why[a][b]
        out.append(f"[{a},{b}] d <= {val[a][b]}: {_describe(a, b, val[a][b], w)}")
        cell = w[1]
    return out


_rows: list[list[tuple[int, str]]] = []  # _rows[n][k] = (bound on D(n, k), label)


def _base(n: int, k: int) -> tuple[int, str]:
    prof = _cheap_profiles(n)
    return min(((prof[name][k], name) for name in _CHEAP), key=lambda t: t[0])


def _extend_table(n_max: int) -> None:
    if not _rows:
        val, why = _fixed_table()
        for n in range(TABLE_LENGTH + 2):
            _rows.append([(val[n][k], _describe(n, k, val[n][k], why[n][k])) for k in range(n + 1)])
    while len(_rows) <= n_max:
        n = len(_rows)
        row: list[tuple[int, str]] = [(0, "")]
        for k in range(1, n + 1):
            cands = [_base(n, k)]
            # Beyond the fixed-point table, rows are built one at a time from the rules
            # of _fixed_table that look at shorter lengths, plus the parity step with the
            # cheap bounds at (n+1, k) -- computed directly, so there is no circularity --
            # and with (n, k-1) >= D(n+1, k), which holds by shortening [n+1, k] -> [n, k-1].
            e, name = _base(n + 1, k)
            cands.append((2 * (e // 2), f"{name} at [{n + 1},{k}], parity"))
            if k >= 2:
                e, lab = row[k - 1]
                cands.append((2 * (e // 2), f"[{n},{k - 1}] by shortening [{n + 1},{k}], "
                                            "parity"))
            if k <= n - 1:
                e, lab = _rows[n - 1][k]
                cands.append((e + 1, f"[{n - 1},{k}] ({lab}), puncturing"))
            if k >= 2:
                e, lab = _rows[n - 1][k - 1]
                cands.append((e, f"[{n - 1},{k - 1}] ({lab}), shortening"))
                e, lab = row[k - 1]
                cands.append((e, f"[{n},{k - 1}] ({lab}), subcode"))
            value = min(c[0] for c in cands)
            label = next(c[1] for c in cands if c[0] == value)
            if value < 1:  # pragma: no cover - would mean a bound below a real code
                raise AssertionError(f"bound table broken at [{n},{k}]")
            row.append((value, _short_label(label)))
        _rows.append(row)


def _short_label(label: str) -> str:
    # Nested labels would grow without limit; keep the originating bound and the last step.
    if label.count("(") > 1:
        inner = label[label.find("(") + 1:]
        origin = inner.split(" at ")[0].split(" (")[0].split(",")[0].strip("()")
        last = label.rsplit(", ", 1)[-1]
        return f"{origin}, then neighbour relations ({last} last)"
    return label


@lru_cache(maxsize=65536)
def _best(n: int, k: int) -> UpperBound:
    if n > LP_LENGTH_LIMIT:
        # Formula bounds at the point only (see skipped_bounds): fast for any n.
        ind = _individual(n, k)
        value = min(ind.values())
        return UpperBound(value, next(nm for nm, v in ind.items() if v == value))
    _extend_table(n)
    table_d, table_by = _rows[n][k]
    cands = [(table_d, table_by)]
    ind = _individual(n, k)
    # Prefer crediting a single named bound when it gives the same value.
    for name, v in ind.items():
        cands.insert(0 if v <= table_d else len(cands), (v, name))
    # Zero coordinate and parity with the LP one length further (see _extend_table):
    # D(n, k) <= 2 floor(lp(n+1, k) / 2).
    if n + 1 <= LP_LENGTH_LIMIT:
        e = _lp(n + 1, k)
        cands.append((2 * (e // 2), f"lp at [{n + 1},{k}], parity"))
    value = min(c[0] for c in cands)
    named = [name for name in ind if ind[name] == value]
    if named:
        return UpperBound(value, named[0])
    return UpperBound(value, next(c[1] for c in cands if c[0] == value))


def best_upper(n: int, k: int) -> UpperBound:
    """The best upper bound on ``d`` for a binary linear ``[n, k]`` code, with its source.

    The minimum of the individual bounds at ``(n, k)`` and of a table over all smaller
    lengths in which the cheap bounds (Singleton, Hamming, Plotkin, Griesmer) are
    propagated by theorems relating neighbouring parameters:

    * puncturing: ``D(n, k) <= D(n - 1, k) + 1``;
    * shortening: ``D(n, k) <= D(n - 1, k - 1)``;
    * subcodes: ``D(n, k) <= D(n, k - 1)``;
    * zero coordinate and parity: ``D(n, k) <= 2 floor(e / 2)`` for any upper bound
      ``e`` on ``D(n + 1, k)`` (an ``[n, k, d]`` code with odd ``d`` extends to
      ``[n + 1, k, d + 1]``).

    The Elias and LP bounds are applied at ``(n, k)`` only, and the LP also at
    ``(n + 1, k)`` through the last rule (the LP for every smaller pair would be far too
    slow); the table is computed once and cached.

    Parameters
    ----------
    n, k : int
        Length and dimension, ``1 <= k <= n``.

    Returns
    -------
    UpperBound
        ``d`` and ``by``: a bound name from :data:`UPPER_BOUND_NAMES` when one bound
        gives the value by itself, otherwise a description of the chain of relations.

    Raises
    ------
    ParameterError

    References
    ----------
    .. [1] MacWilliams & Sloane 1977, ch. 1 §9 (puncturing, shortening, extending).
    .. [2] Huffman & Pless 2003, §1.5.

    Examples
    --------
    >>> best_upper(24, 12)
    UpperBound(d=8, by='griesmer')
    """
    n, k = _check_nk(n, k)
    return _best(n, k)


def ruling_out(n: int, k: int, d: int) -> list[str]:
    """Names of the individual upper bounds that by themselves rule out ``[n, k, d]``.

    Returns
    -------
    list of str
        Names from :data:`UPPER_BOUND_NAMES`, in that order; empty if none does (the
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
    ind = _individual(n, k)
    return [name for name in ind if ind[name] < d]


@lru_cache(maxsize=4096)
def _least_length(k: int, d: int) -> LengthBound:
    # Shortest n with best_upper(n, k) >= d. Start at the Singleton length and scan up;
    # the answer n* has best_upper(n* - 1, k) < d, a proof that no [n* - 1, k, d] code
    # exists, and then no shorter one either (append zero coordinates).
    n = k + d - 1
    while n <= LP_LENGTH_LIMIT and _best(n, k).d < d:
        n += 1
    if n > LP_LENGTH_LIMIT and _best(n, k).d < d:
        # Beyond the table: bisection between a ruled-out length and k d, where k
        # disjoint repetition blocks of length d give a code. Sound for the same reason:
        # the answer n* has n* - 1 ruled out, hence every shorter length too.
        lo, hi = n, k * d
        while hi - lo > 1:
            mid = (lo + hi) // 2
            if _best(mid, k).d >= d:
                hi = mid
            else:
                lo = mid
        n = hi
    if n == k + d - 1 and n == max(k, d):
        return LengthBound(n, "trivial (k <= n and d <= n)")
    if n == k + d - 1:
        return LengthBound(n, "singleton")
    return LengthBound(n, _best(n - 1, k).by)


def least_length(k: int, d: int) -> LengthBound:
    """The least ``n`` that the upper bounds allow for a binary linear code with ``(k, d)``.

    Parameters
    ----------
    k, d : int
        Dimension and minimum distance, both at least 1.

    Returns
    -------
    LengthBound
        ``n`` (no binary linear ``[n - 1, k, d]`` code exists) and ``by``, the bound that
        rules out ``n - 1`` (as in :func:`best_upper`).

    Raises
    ------
    ParameterError

    Examples
    --------
    >>> least_length(12, 8).n, least_length(5, 8).n
    (24, 16)
    """
    k, d = _check_kd(k, d)
    return _least_length(k, d)


@lru_cache(maxsize=4096)
def _max_dimension(n: int, d: int) -> DimensionBound:
    # Greatest k with best_upper(n, k) >= d, by bisection: sound because an impossible
    # [n, k, d] rules out every larger k (a code of dimension k' > k has subcodes of
    # dimension k with distance >= d). k = 1 is always possible (repetition code, d <= n).
    lo, hi = 1, n + 1
    while hi - lo > 1:
        mid = (lo + hi) // 2
        if _best(n, mid).d >= d:
            lo = mid
        else:
            hi = mid
    by = "trivial (k <= n)" if lo == n else _best(n, lo + 1).by
    return DimensionBound(lo, by)


def max_dimension(n: int, d: int) -> DimensionBound:
    """The greatest ``k`` that the upper bounds allow for a binary linear ``[n, k, d]``.

    Always at least 1 (the repetition code ``[n, 1, n]`` has ``d >= `` any ``d <= n``).

    Parameters
    ----------
    n, d : int
        Length and minimum distance, ``1 <= d <= n``.

    Returns
    -------
    DimensionBound
        ``k`` and ``by``, the bound that rules out ``k + 1``.

    Raises
    ------
    ParameterError

    Examples
    --------
    >>> max_dimension(24, 8).k, max_dimension(23, 7).k
    (12, 12)
    """
    n, d = _check_nd(n, d)
    return _max_dimension(n, d)


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
    k, d = _check_kd(k, d)
    # k disjoint repetition blocks of length d form a [k d, k, d] code, so every valid
    # bound allows n = k d. A bound skipped at a length (see skipped_bounds) proves
    # nothing there, so it counts as allowing it; a bound skipped already at the least
    # length max(k, d) is left out.
    hi = k * d
    out = {}
    for name in UPPER_BOUND_NAMES:
        if name in skipped_bounds(max(k, d)):
            continue
        # Bisection over n: sound because ruling out [n, k, d] rules out every shorter
        # length (append zero coordinates). Lengths below max(k, d) are impossible.
        lo = max(k, d) - 1
        h = hi
        while h - lo > 1:
            mid = (lo + h) // 2
            if _individual(mid, k).get(name, d) >= d:
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
    n, d = _check_nd(n, d)
    out = {}
    for name in _individual(n, 1):
        lo, hi = 1, n + 1  # bisection, sound by the subcode argument in max_dimension
        while hi - lo > 1:
            mid = (lo + hi) // 2
            if _individual(n, mid)[name] >= d:
                lo = mid
            else:
                hi = mid
        out[name] = lo
    return out


# ------------------------------------------------------------------------ existence bounds


def _gv_ok(n: int, k: int, d: int) -> bool:
    # Gilbert-Varshamov for linear codes, greedy form: if V(n, d-1) < 2^(n-k+1) a linear
    # [n, k, >= d] code exists. Proof: build the code one generator at a time; with a
    # code C of dimension j < k and 2^j V(n, d-1) < 2^n there is a vector x at distance
    # >= d from all of C, and C + {0, x} keeps distance >= d. ([2] §2.8, from memory of
    # the numbering; [1] ch. 1 §10.)
    return _volume(n, d - 1) < 1 << (n - k + 1)


def _varshamov_ok(n: int, k: int, d: int) -> bool:
    # Varshamov: if V(n-1, d-2) < 2^(n-k) a linear [n, k, >= d] code exists (choose n
    # columns of a parity-check matrix one by one, none the sum of <= d-2 earlier ones).
    # ([5]; [1] ch. 1 §10, Theorem 12, from memory of the numbering.)
    return _volume(n - 1, d - 2) < 1 << (n - k)


def _largest_d(ok, n: int, k: int) -> int:
    d = 1
    while d < n and ok(n, k, d + 1):
        d += 1
    return d


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
    n, k = _check_nk(n, k)
    return _largest_d(_gv_ok, n, k)


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
    n, k = _check_nk(n, k)
    return _largest_d(_varshamov_ok, n, k)


def lower_bounds(n: int, k: int) -> dict[str, int]:
    """Both existence bounds: keys ``"gilbert_varshamov"`` and ``"varshamov"``.

    Raises
    ------
    ParameterError
    """
    n, k = _check_nk(n, k)
    if n > EXACT_LENGTH_LIMIT:
        return {}  # skipped, see skipped_bounds
    return {"gilbert_varshamov": _largest_d(_gv_ok, n, k),
            "varshamov": _largest_d(_varshamov_ok, n, k)}


@lru_cache(maxsize=4096)
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


@lru_cache(maxsize=4096)
def _existence_lengths(k: int, d: int) -> dict[str, int | None]:
    """The least length each existence bound guarantees (``None``: not within the lengths
    where it is evaluated, up to ``min(k d, EXACT_LENGTH_LIMIT)``)."""
    out: dict[str, int | None] = {}
    top = min(k * d, EXACT_LENGTH_LIMIT)
    for name, ok in (("gilbert_varshamov", _gv_ok), ("varshamov", _varshamov_ok)):
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
    k, d = _check_kd(k, d)
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
    n, d = _check_nd(n, d)
    # floor(n / d) disjoint repetition blocks of length >= d: always a code.
    best = DimensionBound(n // d, "repetition blocks")
    if n > EXACT_LENGTH_LIMIT:
        return best
    for name, ok in (("varshamov", _varshamov_ok), ("gilbert_varshamov", _gv_ok)):
        k = 0
        while k < n and ok(n, k + 1, d):
            k += 1
        if k > best.k:
            best = DimensionBound(k, name)
    if best.k < 1:  # pragma: no cover - Varshamov always allows k = 1 when d <= n
        raise ParameterError(f"Argument 'd' must be at most {n}, not {d}.")
    return best
