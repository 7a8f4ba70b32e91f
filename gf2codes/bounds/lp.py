"""Delsarte's linear programming bound, solved in floating point, certified exactly.

The LP is solved with HiGHS (SciPy), but the answer is *certified* in exact arithmetic:
the float solution is rounded to dyadic rationals and checked (and rescaled) exactly, so
the bound proved is the one the certificate proves, never a rounding artefact. When
HiGHS fails or the certificate does not verify, the LP proves nothing at that point (a
weaker, still valid, bound). Certified values are remembered on disk
(:mod:`gf2codes._diskcache`), so a later process neither imports SciPy nor solves.

The Krawtchouk values are those of :func:`gf2codes.weights.krawtchouk_column` (the
package's one copy), exact integers.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977: ch. 5 (MacWilliams identities, Krawtchouk polynomials), ch. 17
   §4 (the linear programming bound; section numbers from memory).
.. [2] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*,
   Cambridge University Press, 2003, §1.5.2 (extending by a parity bit).
.. [3] P. Delsarte, "An algebraic approach to the association schemes of coding
   theory", *Philips Research Reports Supplements* 10, 1973.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass
from fractions import Fraction
from typing import TYPE_CHECKING

from .._diskcache import Memo
from .._util import memo
from .formulas import floor_log2, kmax_griesmer, kmax_hamming, kmax_singleton, search_d

if TYPE_CHECKING:
    import numpy as np

__all__ = ["krawtchouk_table", "kmax_lp", "lp_value", "ResidualLP", "residual_exclusions",
           "lp_residual_rules_out"]


@memo(8)
def krawtchouk_table(n: int) -> tuple[tuple[int, ...], ...]:
    """Exact Krawtchouk values ``K[j][i] = K_j(i)`` for ``j <= n/2`` and *even* ``i``.

    Only these are needed (the LPs here are for even codes, where ``K_(n-j)(i) = K_j(i)``);
    entries at odd ``i`` are 0 placeholders. Each column is
    :func:`gf2codes.weights.krawtchouk_column` (the three-term recurrence of [1] ch. 5 §7,
    exact in integers).
    """
    from ..weights import krawtchouk_column  # numpy only when an LP is actually solved

    half = n // 2
    rows = [[0] * (n + 1) for _ in range(half + 1)]
    for i in range(0, n + 1, 2):
        for j, value in enumerate(krawtchouk_column(i, n, half)):
            rows[j][i] = value
    return tuple(tuple(r) for r in rows)


@memo(8)
def _krawtchouk_normalised(n: int) -> np.ndarray:
    """``Q[j, i] = K_j(i) / C(n, j)`` as floats in [-1, 1], same index range as above."""
    import numpy as np

    K = krawtchouk_table(n)
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

    Solves, for ``y >= 0``, min ``sum_j y_j C(n, j)`` subject to ``sum_j y_j K_j(i) <= -1``
    for every even ``i`` in ``[d, n]``; any such ``y`` gives, for every code with distance
    distribution ``A`` (``A_i >= 0``, zero for odd ``i`` and for ``0 < i < d``, and
    ``sum_i A_i K_j(i) >= 0`` for all ``j`` by MacWilliams/Delsarte),
    ``|C| <= 1 + (sum_j y_j C(n, j)) / c`` with ``c = min_i (-sum_j y_j K_j(i)) > 0``.
    First the well-scaled refined solve of :mod:`gf2codes.bounds._lp_certify` (exact
    check); if it proves nothing, the plain solve on normalised Krawtchouk values with
    dyadic rounding (the route that works for small ``n``). Returns the integer bound, or
    ``None`` if nothing was proved.
    """
    weights = list(range(d + (d % 2), n + 1, 2))
    if not weights:
        return 1
    from ._lp_certify import solve_refined

    cert = solve_refined(n, d, krawtchouk_table(n))
    if cert is not None:
        return cert.size
    return _lp_size_primal_plain(n, d)


def _lp_size_primal_plain(n: int, d: int) -> int | None:
    """The plain float solve of :func:`_lp_size_primal_side`, rounded and checked exactly."""
    import numpy as np
    from scipy.optimize import linprog  # type: ignore[import-untyped]  # no stubs installed

    weights = list(range(d + (d % 2), n + 1, 2))
    Q = _krawtchouk_normalised(n)
    js = list(range(1, n // 2 + 1))  # for even weights K_{n-j} = K_j: half the columns
    A_ub = np.array([[Q[j, i] for j in js] for i in weights])
    res = linprog(np.ones(len(js)), A_ub=A_ub, b_ub=-np.ones(len(weights)),
                  bounds=(0, None), method="highs")
    if res.status != 0 or res.x is None:
        return None
    K = krawtchouk_table(n)
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
    K = krawtchouk_table(n)
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


@memo(65536)
def _kmax_lp_even(n: int, d: int) -> int:
    """Largest k the LP allows for an even ``[n, k, >= d]`` code (certified; d even).

    Also uses the certificates one step away, which apply because an even ``[n, k, >= d]``
    code gives an even ``[n + 1, k, >= d]`` code (append a zero coordinate) and is itself
    an even ``[n, k, >= d - 2]`` code; this smooths over points where HiGHS' float
    solution does not verify.
    """
    if d > n:
        return 0
    if d <= 2:
        # an even code lies in the even-weight code, of dimension n - 1 (also the LP's
        # optimum 2^(n-1) at d = 2, which a float certificate cannot reach for large n)
        return max(n - 1, 0)
    best = min(_kmax_lp_even_at(n, d), _kmax_lp_even_at(n + 1, d))
    if d - 2 >= 2:
        best = min(best, _kmax_lp_even_at(n, d - 2))
    return best


#: Certified LP values already proved by this installation (see :mod:`gf2codes._diskcache`):
#: ``"n,d"`` -> the bound of :func:`_kmax_lp_even_at`. Bump the version whenever the LP or
#: its certificate changes, so old values are not reused.
_LP_MEMO = Memo("lp-even", version="2")


@memo(65536)
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
    guess = min(kmax_hamming(n, d), kmax_griesmer(n, d), kmax_singleton(n, d))
    order = ("primal", "dual") if guess <= n // 2 else ("dual", "primal")
    best = n
    for side in order:
        if side == "primal":
            size = _lp_size_primal_side(n, d)
            if size is not None:
                best = min(best, floor_log2(size))
        else:
            dual = _lp_size_dual_side(n, d)
            if dual is not None:
                # 2^(n-k) >= dual  =>  k <= n - ceil(log2(dual))
                need = math.ceil(dual)
                best = min(best, n - (need - 1).bit_length())
        if best < n:
            break
    return best


def kmax_lp(n: int, d: int) -> int:
    """Largest k the certified LP allows for a binary linear ``[n, k, d]`` code."""
    # d even: a binary linear [n, k, d] code exists iff an even one does (puncture a
    # coordinate, then add an overall parity bit; [1] ch. 1 §9, [2] §1.5.2).
    # d odd: an [n, k, d] code exists iff an [n + 1, k, d + 1] code does (add a parity
    # bit / puncture), so the even-weight LP of length n + 1 applies.
    if d % 2:
        return _kmax_lp_even(n + 1, d + 1)
    return _kmax_lp_even(n, d)


@memo(4096)
def lp_value(n: int, k: int) -> int:
    """The certified LP bound on ``d`` at ``(n, k)`` (arguments not checked).

    The search is capped by the Singleton bound (a theorem), so that the bisection does
    not wander into lengths/rates where the float LP cannot be certified.
    """
    return min(search_d(kmax_lp, n, k, n - k + 1), n - k + 1)


def residual_exclusions(N: int, k: int, D: int, bound: Callable[[int, int], int]
                        ) -> frozenset[int]:
    """Weights an even ``[N, k, >= D]`` code (``D`` even) cannot contain.

    For a codeword ``c`` of weight ``w`` with ``D <= w <= 2D - 2`` and any codeword
    ``x`` outside ``{0, c}``, ``wt(x) + wt(x + c) = w + 2 wt(x outside c) >= 2D``, so the
    restriction to the ``N - w`` coordinates outside ``c`` has kernel ``{0, c}`` and
    gives an ``[N - w, k - 1, >= D - w/2]`` code (the residual code; Huffman & Pless
    2003, Thm 2.7.1, there for ``w = d``; the same two lines prove it for every ``w`` in
    the range). So if ``bound(N - w, k - 1)``, a proved upper bound on the distance of
    every ``[N - w, k - 1]`` code, is below ``D - w/2`` (or ``N - w < k - 1``), no
    codeword has weight ``w``.
    """
    out = set()
    if k < 2:
        return frozenset()
    for w in range(D, min(2 * D - 2, N) + 1, 2):
        m = N - w
        if m < k - 1 or bound(m, k - 1) < D - w // 2:
            out.add(w)
    return frozenset(out)


@dataclass(frozen=True)
class ResidualLP:
    """A proof that no binary linear ``[n, k, d]`` code exists.

    The even-code Delsarte LP at length ``N`` and distance ``D`` (``N, D = n, d`` for
    even ``d``, ``n + 1, d + 1`` for odd ``d``: add a parity bit) with the weights
    ``excluded`` forced to zero (:func:`residual_exclusions`) has a certificate, checked in
    exact integers, of ``|C| <= size < 2^k``.
    """

    n: int
    k: int
    d: int
    N: int
    D: int
    excluded: tuple[int, ...]
    size: int


def lp_residual_rules_out(n: int, k: int, d: int, bound: Callable[[int, int], int]
                          ) -> ResidualLP | None:
    """Try to prove "no binary linear ``[n, k, d]`` code" by the Delsarte LP with the
    weights the residual codes rule out forced to zero.

    ``bound(m, j)`` must be a proved upper bound on the distance of every ``[m, j]``
    code for ``j = k - 1`` (the shipped bound table). Combining Delsarte's inequalities
    with weights known to be absent is common practice in the construction of code
    tables; each excluded weight here is a theorem (:func:`residual_exclusions`), and the
    LP certificate is checked exactly (:func:`gf2codes.bounds._lp_certify.certify_exact`),
    so a returned proof never rests on floating point. Returns ``None`` when nothing is
    proved (the LP allows ``2^k`` words, or HiGHS gave no certificate).
    """
    if not (1 <= k <= n and 1 <= d <= n):
        return None
    N, D = (n, d) if d % 2 == 0 else (n + 1, d + 1)
    if D <= 2:
        return None
    excluded = residual_exclusions(N, k, D, bound)
    if not any(w not in excluded for w in range(D, N + 1, 2)):
        size = 1  # only the zero word is left
    else:
        from ._lp_certify import solve_refined

        cert = solve_refined(N, D, krawtchouk_table(N), stop_below=1 << k, excluded=excluded)
        if cert is None:
            return None
        size = cert.size
    if size >= 1 << k:
        return None
    return ResidualLP(n, k, d, N, D, tuple(sorted(excluded)), size)
