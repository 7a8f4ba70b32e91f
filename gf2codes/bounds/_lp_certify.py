"""The even-code Delsarte LP solved by iterative refinement and certified exactly.

Problem (the "polynomial side" of Delsarte's LP for an even binary code of length ``n``
and distance at least ``d``; :math:`W` the even weights in ``[d, n]``,
:math:`P = \\{1, ..., \\lfloor n/2 \\rfloor\\}`)::

    minimise  sum_{j in P} C(n, j) y_j
    subject   sum_{j in P} K_j(i) y_j <= -1     for every i in W,   y >= 0.

Any feasible ``y`` proves ``|C| <= 1 + sum_j C(n, j) y_j / c`` with
``c = min_{i in W} (-sum_j y_j K_j(i)) > 0`` (weak duality against the distance
distribution, [1]_ ch. 17 §4 Thm 20, [2]_); only columns ``j <= n/2`` are needed because
``K_(n-j)(i) = K_j(i)`` at even ``i``. The certificate is checked here in exact integer
arithmetic, so what is proved never depends on floating point.

Why refinement: the optimum is about ``2^k`` and the multipliers ``y`` span dozens of
orders of magnitude, so a double-precision solve cannot give a certificate by itself
(HiGHS also drops matrix entries below ``1e-9``). Two steps fix it:

* *scaling*: row ``i`` is multiplied by ``2^(rho_i)`` and column ``j`` by ``2^(sigma_j)``,
  powers of two close to ``sqrt(C(n, i))`` and ``1 / sqrt(2^n C(n, j))``; the scaled
  matrix is close to the orthogonal matrix ``K_j(i) sqrt(C(n, i) / (2^n C(n, j)))``
  (orthogonality of the Krawtchouk polynomials, [1]_ ch. 5 §7), whose entries lie in
  ``[-1, 1]``;
* *iterative refinement* ([3]_): the exact primal and dual residuals of the current
  solution are computed in integers, scaled up by a power of two and handed to HiGHS as
  a correction LP with the same matrix; each round gains about 20-30 bits, until the
  certified bound and the (approximate) dual value agree on ``floor(log2)``.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 5 §7 (Krawtchouk polynomials) and ch. 17 §4 (the linear
   programming bound; section and theorem numbers from memory).
.. [2] P. Delsarte, "An algebraic approach to the association schemes of coding
   theory", *Philips Research Reports Supplements* 10, 1973.
.. [3] A. M. Gleixner, D. E. Steffy and K. Wolter, "Iterative refinement for linear
   programming", *INFORMS Journal on Computing* 28(3), 2016, 449-464.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from fractions import Fraction

__all__ = ["Certificate", "certify_exact", "solve_refined"]

#: Largest growth of a scaling factor per refinement round (bits).
_STEP_BITS = 40
#: Refinement rounds at most (each is one HiGHS solve).
_MAX_ROUNDS = 12
#: Coefficients and bounds beyond this are clipped (they only restrict a correction).
_BIG = 1e6


@dataclass(frozen=True)
class Certificate:
    """A checked LP certificate: ``|C| <= size`` for every even code with distance >= d.

    ``size`` is an exact integer (``floor`` of the certified rational bound);
    ``rounds`` is the number of HiGHS solves used.
    """

    size: int
    rounds: int


def certify_exact(K: tuple[tuple[int, ...], ...], n: int, weights: list[int],
                  num: list[int], den: int) -> int | None:
    """Check ``y_j = num[j-1] / den`` (``j = 1..n/2``) exactly; the integer size bound.

    Negative entries are set to 0 first (a certificate needs ``y >= 0``). Returns
    ``floor(1 + S / c)`` with ``S = sum_j C(n, j) y_j`` and
    ``c = min_{i in weights} (-sum_j y_j K_j(i))``, or None when ``c <= 0``
    (nothing is proved). Everything is computed in integers (``den`` cancels).
    """
    Y = [max(v, 0) for v in num]
    pairs = [(v, j) for j, v in enumerate(Y, start=1) if v]
    if not pairs:
        return None
    c = min(-sum(v * K[j][i] for v, j in pairs) for i in weights)
    if c <= 0:
        return None
    S = sum(v * math.comb(n, j) for v, j in pairs)
    return 1 + S // c


def _to_fixed(values: list[Fraction], bits: int) -> tuple[list[int], int]:
    """Numerators over the common denominator ``2^bits`` (floor; exact for dyadics)."""
    return [(v.numerator << bits) // v.denominator for v in values], 1 << bits


def solve_refined(n: int, d: int, K: tuple[tuple[int, ...], ...],
                  stop_below: int | None = None,
                  excluded: frozenset[int] = frozenset()) -> Certificate | None:
    """Solve the even-code LP at ``(n, d)`` by scaled iterative refinement; certify.

    Parameters
    ----------
    n, d : int
        Length and (even) distance; ``d <= n``.
    K : tuple of tuple of int
        ``K[j][i] = K_j(i)`` for ``j <= n/2`` and even ``i`` (exact integers).
    stop_below : int, optional
        Stop as soon as the certified size is below this (the caller only needs that).
    excluded : frozenset of int, optional
        Weights known to be absent from the code (their rows are dropped: ``A_i = 0``
        there, so the certificate needs no inequality at ``i``). The caller must have
        proved the absence; :func:`gf2codes.bounds.lp.residual_exclusions` does.

    Returns
    -------
    Certificate or None
        The best certified size bound found, or None if no round gave a certificate.
    """
    import numpy as np
    from scipy.optimize import linprog  # type: ignore[import-untyped]  # no stubs installed

    W = [i for i in range(d + (d % 2), n + 1, 2) if i not in excluded]
    P = list(range(1, n // 2 + 1))
    if not W or not P:
        return None
    half_log = [0.5 * math.log2(math.comb(n, t)) for t in range(n + 1)]
    rho = [round(half_log[i]) for i in W]
    top = max(rho)
    rho = [r - top for r in rho]  # rows scaled by 2^rho_i <= 1
    sigma = [round(top - n / 2 - half_log[j]) for j in P]  # y_j = 2^sigma_j w_j
    A = np.array([[math.ldexp(float(K[j][i]), r + s) if K[j][i] else 0.0
                   for j, s in zip(P, sigma, strict=True)]
                  for i, r in zip(W, rho, strict=True)])
    cost = [math.comb(n, j) for j in P]  # exact objective in y-space
    nP, nW = len(P), len(W)
    A_eq = np.hstack([A, np.eye(nW)])  # scaled rows with their slacks: A w + u = b
    c_hat = [math.ldexp(float(cst), sg - top) for cst, sg in zip(cost, sigma, strict=True)]
    obj = np.array(c_hat + [0.0] * nW)
    y = [Fraction(0)] * nP  # y-space primal (dyadic, exact)
    dual = 0.0  # the float solver's dual value (the LP optimum, approximately)
    dp = 0  # log2 of the primal scaling factor
    best: int | None = None
    rounds = 0
    while rounds < _MAX_ROUNDS:
        # exact residuals of the current point (then scaled, as floats, for HiGHS)
        Y, yden = _to_fixed(y, max(v.denominator.bit_length() for v in y))
        g = [sum(Y[t] * K[j][i] for t, j in enumerate(P) if Y[t]) for i in W]
        if rounds:
            size = certify_exact(K, n, W, Y, yden)
            if size is not None and (best is None or size < best):
                best = size
            if best is not None and (
                    (stop_below is not None and best < stop_below)
                    or best.bit_length() == (math.floor(dual) + 1).bit_length()):
                break  # enough, or the dual says no smaller power of two is provable
        # slack s_i = -1 - g_i / yden (want >= 0), scaled by 2^rho_i; w = y / 2^sigma
        s_hat = [math.ldexp(float(Fraction(-yden - gi, yden)), ri)
                 for gi, ri in zip(g, rho, strict=True)]
        w_hat = [math.ldexp(float(v), -sg) for v, sg in zip(y, sigma, strict=True)]
        viol = max([-v for v in s_hat] + [-v for v in w_hat] + [0.0])
        if rounds:
            dp = min(dp + _STEP_BITS, -math.frexp(viol)[1] if viol > 0 else dp + _STEP_BITS)
        rounds += 1
        # correction LP, the same LP shifted to the current point and scaled by 2^dp:
        # min c.x  s.t.  A x + u = 0,  x >= -2^dp w,  u >= -2^dp s.  Clipping a very low
        # bound only restricts the correction (the certificate is checked exactly).
        low = [max(math.ldexp(-v, dp), -_BIG) for v in w_hat + s_hat]
        res = linprog(obj, A_eq=A_eq, b_eq=np.zeros(nW),
                      bounds=[(lo, None) for lo in low], method="highs-ds")
        if res.status != 0 or res.x is None:
            break
        y = [v + Fraction(float(xv)) * Fraction(2) ** (sg - dp)
             for v, xv, sg in zip(y, res.x[:nP], sigma, strict=True)]
        # the duals of the rows are the distance distribution (up to the scalings)
        dual = float(-sum(math.ldexp(float(p), r + top) for p, r in
                          zip(res.eqlin.marginals, rho, strict=True)))
    else:
        Y, yden = _to_fixed(y, max(v.denominator.bit_length() for v in y))
        size = certify_exact(K, n, W, Y, yden)
        if size is not None and (best is None or size < best):
            best = size
    return None if best is None else Certificate(best, rounds)
