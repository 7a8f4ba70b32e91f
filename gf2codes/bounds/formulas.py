"""The formula bounds: each a test in exact integer arithmetic.

Upper bounds (Singleton, Hamming, Plotkin, Griesmer, Elias) are written as
``kmax(n, d)``: the largest ``k`` that the bound allows for an ``[n, k, d]`` code.
Existence bounds (Gilbert-Varshamov, Varshamov) as ``ok(n, k, d)``: true when the
bound guarantees a linear ``[n, k, >= d]`` code. :mod:`gf2codes.bounds.registry`
names them; this module also holds the helpers every bound shares (argument checks,
ball volumes, the bisection over ``d``).

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977: ch. 1 (Hamming bound, Gilbert-Varshamov), ch. 2 §2 (Plotkin
   bound), ch. 17 (bounds on the size of codes, including the Elias bound).
.. [2] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*,
   Cambridge University Press, 2003, ch. 2 (bounds on the size of codes).
.. [4] J. H. Griesmer, "A bound for error-correcting codes", *IBM Journal of Research
   and Development* 4 (1960) 532-542.
.. [5] R. R. Varshamov, "Estimate of the number of signals in error correcting codes",
   *Doklady Akad. Nauk SSSR* 117 (1957) 739-741.

(The numbering [1], [2], [4], [5] is that of :mod:`gf2codes.bounds`; chapter and
theorem numbers are from memory, see there.)
"""

from __future__ import annotations

from collections.abc import Callable
from functools import lru_cache

from .._util import memo
from ..exceptions import check_int

__all__ = [
    "check_nk", "check_nd", "check_kd", "volume", "floor_log2", "profile", "search_d",
    "largest_d", "plotkin_size", "kmax_singleton", "kmax_hamming", "kmax_griesmer",
    "kmax_plotkin", "kmax_elias", "gv_ok", "varshamov_ok",
]

#: ``kmax(n, d)``: the largest ``k`` an upper bound allows for ``[n, k, d]``.
Kmax = Callable[[int, int], int]
#: ``ok(n, k, d)``: true when an existence bound guarantees ``[n, k, >= d]``.
Guarantee = Callable[[int, int, int], bool]


# ----------------------------------------------------------------------------- validation


def check_nk(n: object, k: object) -> tuple[int, int]:
    """``(n, k)`` checked: ``1 <= k <= n``."""
    n = check_int("n", n, minimum=1)
    k = check_int("k", k, minimum=1, maximum=n)
    return n, k


def check_nd(n: object, d: object) -> tuple[int, int]:
    """``(n, d)`` checked: ``1 <= d <= n``."""
    n = check_int("n", n, minimum=1)
    d = check_int("d", d, minimum=1, maximum=n)
    return n, d


def check_kd(k: object, d: object) -> tuple[int, int]:
    """``(k, d)`` checked: both at least 1."""
    return check_int("k", k, minimum=1), check_int("d", d, minimum=1)


# ----------------------------------------------------------------------------- helpers


@memo(64)
def _volumes(n: int) -> tuple[int, ...]:
    """``V(n, t) = sum_{i<=t} C(n, i)`` for ``t = 0..n`` (size of a Hamming ball)."""
    # C(n, i + 1) = C(n, i) (n - i) / (i + 1), exact: one small multiplication and
    # division per term instead of a full binomial (math.comb costs O(i) products).
    out, acc, term = [], 0, 1
    for i in range(n + 1):
        acc += term
        out.append(acc)
        term = term * (n - i) // (i + 1)
    return tuple(out)


def volume(n: int, t: int) -> int:
    """``V(n, t)``, the size of a Hamming ball of radius ``t`` (0 for ``t < 0``)."""
    if t < 0:
        return 0
    return _volumes(n)[min(t, n)]


def floor_log2(x: int) -> int:
    """``floor(log2(x))`` for an integer ``x >= 1``; ``-1`` for ``x <= 0`` (no code at all)."""
    return x.bit_length() - 1 if x >= 1 else -1


def profile(kmax: list[int], n: int) -> list[int]:
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


def search_d(kmax: Kmax, n: int, k: int, top: int | None = None) -> int:
    """Largest ``d`` in ``[1, top or n]`` that ``kmax`` does not rule out, by bisection.

    Sound without monotonicity: the answer d* has d* + 1 ruled out (or d* = n), and one
    impossible distance rules out all larger ones (puncture + append a zero coordinate).
    d = 1 is never ruled out.
    """
    lo, hi = 1, (n if top is None else top) + 1
    while hi - lo > 1:
        mid = (lo + hi) // 2
        if kmax(n, mid) >= k:
            lo = mid
        else:
            hi = mid
    return lo


def largest_d(ok: Guarantee, n: int, k: int) -> int:
    """Largest ``d`` (at least 1) for which ``ok(n, k, d)`` guarantees a code."""
    d = 1
    while d < n and ok(n, k, d + 1):
        d += 1
    return d


# ------------------------------------------------ per-(n, d) tests: the largest k allowed


def kmax_singleton(n: int, d: int) -> int:
    """Singleton bound: k <= n - d + 1 ([1] ch. 1 §11, Thm 11; [2] Thm 2.4.1)."""
    return n - d + 1


def kmax_hamming(n: int, d: int) -> int:
    """Sphere-packing bound ``2^k V(n, t) <= 2^n`` with ``t = floor((d-1)/2)``.

    [1] ch. 1 §5, Thm 6. For even d = 2t + 2 it is applied to the punctured
    [n-1, k, 2t+1] code, which exists whenever the [n, k, 2t+2] code does (puncture a
    coordinate; d >= 2 keeps k).
    """
    if d % 2:
        return n - (volume(n, (d - 1) // 2) - 1).bit_length()
    if n - 1 < 1:
        return 0
    return n - 1 - (volume(n - 1, (d - 2) // 2) - 1).bit_length()


def kmax_griesmer(n: int, d: int) -> int:
    """Griesmer bound: n >= sum_{i<k} ceil(d / 2^i) ([4]; [1] ch. 17 §6, Thm 24; [2] §2.7)."""
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


def plotkin_size(n: int, d: int) -> int | None:
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


def kmax_plotkin(n: int, d: int) -> int:
    """Both Plotkin-type inequalities, after shortening to a length n' where they hold.

    Shortening: A(n, d) <= 2^(n - n') A(n', d) for any code ([1] ch. 17, Thm 1 (iii)
    A(n, d) <= 2 A(n-1, d), from memory), and a linear [n, k, d] code shortened on
    n - n' < k coordinates is a linear [n', k - n + n', >= d] code ([2] Thm 1.5.7).
    (a) classical Plotkin on A(n', d), see :func:`plotkin_size`;
    (b) linear, average weight: sum of the weights of the 2^k' codewords is at most
    n' 2^(k'-1), so d (2^k' - 1) <= n' 2^(k'-1), i.e. 2^(k'-1) (2d - n') <= d
    (the averaging step of the proof of the Plotkin bound, [2] §2.2, derived here: a
    coordinate that is not always 0 is 1 in half the codewords; valid for every n').
    Only the few longest n' are tried (the best is among them in every case we looked
    at); trying fewer shortenings can only weaken the bound, never make it wrong.
    """
    top = min(n, 2 * d + 1)
    if n > top:
        # Every length tried is at most top, and each term carries n - n2: the value is
        # (n - top) plus the value at length top (the same minimum, shifted).
        return (n - top) + _kmax_plotkin_at(top, d)
    return _kmax_plotkin_at(n, d)


@lru_cache(maxsize=4096)
def _kmax_plotkin_at(n: int, d: int) -> int:
    """:func:`kmax_plotkin` for ``n <= 2 d + 1``."""
    top = min(n, 2 * d + 1)
    best = n  # k <= n trivially
    for n2 in range(top, max(d, top - _PLOTKIN_WINDOW) - 1, -1):
        m = n - n2
        size = plotkin_size(n2, d)
        if size is not None:
            best = min(best, m + floor_log2(size))
        if 2 * d > n2:
            best = min(best, m + 1 + floor_log2(d // (2 * d - n2)))
    return best


def kmax_elias(n: int, d: int) -> int:
    """Elias-Bassalygo bound, exact in integers ([2] §2.11, [1] ch. 17 §4; from memory).

    For 0 <= w <= n/2 with w^2 - n w + n d / 2 > 0,
    A(n, d) <= (n d / 2) / (w^2 - n w + n d / 2) * 2^n / V(n, w).
    Multiplying out by 2: 2^k (2w^2 - 2nw + nd) V(n, w) <= n d 2^n, all integers, so the
    bound is evaluated exactly; no rounding can make it claim more than it proves.
    """
    num = n * d << n
    best = n
    for w in range(0, n // 2 + 1):
        den = 2 * w * w - 2 * n * w + n * d
        if den <= 0:
            continue
        best = min(best, floor_log2(num // (den * volume(n, w))))
    return best


# ------------------------------------------------------------------------ existence bounds


def gv_ok(n: int, k: int, d: int) -> bool:
    """Gilbert-Varshamov for linear codes, greedy form: ``V(n, d-1) < 2^(n-k+1)``.

    Proof: build the code one generator at a time; with a code C of dimension j < k and
    2^j V(n, d-1) < 2^n there is a vector x at distance >= d from all of C, and
    C + {0, x} keeps distance >= d. ([2] §2.8, from memory of the numbering; [1] ch. 1 §10.)
    """
    return volume(n, d - 1) < 1 << (n - k + 1)


def varshamov_ok(n: int, k: int, d: int) -> bool:
    """Varshamov: if ``V(n-1, d-2) < 2^(n-k)`` a linear ``[n, k, >= d]`` code exists.

    Choose n columns of a parity-check matrix one by one, none the sum of <= d-2 earlier
    ones. ([5]; [1] ch. 1 §10, Theorem 12, from memory of the numbering.)
    """
    return volume(n - 1, d - 2) < 1 << (n - k)
