"""Exact error probabilities of a binary linear code on a binary symmetric channel.

With ``q = 1 - p``: block error of complete syndrome decoding
``sum_i (C(n, i) - alpha_i) p^i q^(n-i)`` [1]_, undetected error
``sum_{i >= 1} A_i p^i q^(n-i)`` [2]_, and failure of a bounded-distance decoder of
radius ``t``, ``sum_{i > t} C(n, i) p^i q^(n-i)``. Every sum is taken over the
complement directly (never as ``1 - ...``) with :func:`math.fsum`; with ``p`` a
:class:`fractions.Fraction` the result is an exact ``Fraction``.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1, section 5 (the probability of a decoding error).
.. [2] S. Lin and D. J. Costello, *Error Control Coding*, 2nd ed., Pearson, 2004,
   ch. 3, section 3.6 (probability of an undetected error for linear codes).
"""

from __future__ import annotations

import math
import numbers
from collections.abc import Sequence
from dataclasses import dataclass
from fractions import Fraction
from typing import overload

from .._util import memo
from ..code import Code
from ..exceptions import ParameterError, check_int
from .leaders import DEFAULT_MAX_REDUNDANCY, CosetLeaders, coset_leader_distribution

__all__ = ["Probability", "check_probability", "block_error_probability",
           "undetected_error_probability", "bounded_distance_failure_probability",
           "BSCPoint", "bsc_points", "bsc_performance"]

Probability = float | Fraction
_FLOAT_SAFE = 2**1000


# ------------------------------------------------------------------------- validation


def check_probability(name: str, p: object) -> Probability:
    """Validate a probability: a real number in ``[0, 1]`` (a Fraction stays exact).

    Raises
    ------
    ParameterError
        ``Argument 'p' must be between 0 and 1, not 2.``

    >>> check_probability('p', 0.25)
    0.25
    """
    if isinstance(p, bool) or not isinstance(p, numbers.Real):
        raise ParameterError(f"Argument {name!r} must be a number between 0 and 1, not {p!r}.")
    value: Probability = p if isinstance(p, Fraction) else float(p)
    if not 0 <= value <= 1:  # also rejects NaN
        raise ParameterError(f"Argument {name!r} must be between 0 and 1, not {p!r}.")
    return value


@memo(16)
def _binomials(n: int) -> tuple[int, ...]:
    """``C(n, 0), ..., C(n, n)`` by the multiplicative recurrence (one pass, cached:
    ``math.comb`` per entry and per p took most of a minute at n = 4095)."""
    row = [1]
    for i in range(n):
        row.append(row[-1] * (n - i) // (i + 1))
    return tuple(row)


def _binomial_sum(coefficients: Sequence[int], n: int, p: Probability) -> Probability:
    """``sum_i c_i p^i (1-p)^(n-i)`` over ``i = 0 .. len(c) - 1`` (c_i >= 0 integers)."""
    if isinstance(p, Fraction):
        qf = 1 - p
        return sum((Fraction(c) * p**i * qf ** (n - i) for i, c in enumerate(coefficients) if c),
                   Fraction(0))
    if p == 0.0:
        return float(coefficients[0]) if coefficients else 0.0
    if p == 1.0:
        return float(coefficients[n]) if len(coefficients) > n else 0.0
    q = 1.0 - p  # relative error <= 2^-53, so q^m is accurate to about m ulps
    lp, lq = math.log(p), math.log1p(-p)
    terms = []
    for i, c in enumerate(coefficients):
        if c <= 0:
            continue
        direct = float(c) * p**i * q ** (n - i) if c < _FLOAT_SAFE else 0.0
        if direct > 1e-290:
            terms.append(direct)
        else:  # log-space: the coefficient or a power is out of the float range
            terms.append(math.exp(math.log(c) + i * lp + (n - i) * lq))
    return math.fsum(terms)


@overload
def block_error_probability(leaders: CosetLeaders, p: Fraction) -> Fraction: ...
@overload
def block_error_probability(leaders: CosetLeaders, p: float) -> float: ...
def block_error_probability(leaders: CosetLeaders, p: Probability) -> Probability:
    """Block-error probability of complete syndrome decoding on a BSC.

    ``sum_i (C(n, i) - alpha_i) p^i (1 - p)^(n - i)``: the decoder is right exactly
    when the error pattern is the leader of its coset.

    Parameters
    ----------
    leaders : CosetLeaders
        From :func:`coset_leader_distribution`.
    p : float or Fraction
        Crossover probability (a Fraction gives an exact Fraction).

    References
    ----------
    MacWilliams & Sloane (1977), ch. 1, section 5 (Theorem 2 and its proof).

    Examples
    --------
    Majority decoding of the 3-bit repetition code fails with probability
    ``3p^2 - 2p^3``:

    >>> from fractions import Fraction
    >>> block_error_probability(CosetLeaders(3, 1, (1, 3)), Fraction(1, 10))
    Fraction(7, 250)
    """
    p = check_probability("p", p)
    n = leaders.n
    alpha = leaders.padded()
    return _binomial_sum([c - a for c, a in zip(_binomials(n), alpha, strict=False)], n, p)


@overload
def undetected_error_probability(distribution: Sequence[int], p: Fraction) -> Fraction: ...
@overload
def undetected_error_probability(distribution: Sequence[int], p: float) -> float: ...
def undetected_error_probability(distribution: Sequence[int], p: Probability) -> Probability:
    """Probability that the channel turns a codeword into another codeword.

    ``sum_{i >= 1} A_i p^i (1 - p)^(n - i)`` with ``A`` the weight distribution
    (``n = len(distribution) - 1``): an error pattern goes unnoticed by a detector
    exactly when it is a nonzero codeword.

    References
    ----------
    Lin & Costello (2004), ch. 3, section 3.6.

    >>> undetected_error_probability([1, 0, 0, 7, 7, 0, 0, 1], 0.0)
    0.0
    """
    p = check_probability("p", p)
    A = [int(a) for a in distribution]
    return _binomial_sum([0] + A[1:], len(A) - 1, p)


@overload
def bounded_distance_failure_probability(n: int, t: int, p: Fraction) -> Fraction: ...
@overload
def bounded_distance_failure_probability(n: int, t: int, p: float) -> float: ...
def bounded_distance_failure_probability(n: int, t: int, p: Probability) -> Probability:
    """Probability that more than ``t`` of ``n`` bits are flipped.

    The failure (decoding error or detected failure) probability of a decoder that
    corrects exactly the patterns of at most ``t`` errors.

    >>> bounded_distance_failure_probability(3, 1, 0.5)
    0.5
    """
    n = check_int("n", n, minimum=1)
    t = check_int("t", t, minimum=0)
    p = check_probability("p", p)
    return _binomial_sum([c if i > t else 0 for i, c in enumerate(_binomials(n))], n, p)


@dataclass(frozen=True)
class BSCPoint:
    """The three exact probabilities at one crossover probability ``p``.

    A value is None when it was not computed (its input was unavailable).
    """

    p: Probability
    block_error: Probability | None
    undetected_error: Probability | None
    bounded_distance_failure: Probability | None


def bsc_performance(
    code: Code,
    p: Sequence[Probability],
    *,
    d: int | None = None,
    leaders: CosetLeaders | None = None,
    distribution: Sequence[int] | None = None,
    max_redundancy: int = DEFAULT_MAX_REDUNDANCY,
) -> list[BSCPoint]:
    """Exact block-error, undetected-error and bounded-distance failure probabilities.

    Parameters
    ----------
    code : Code
    p : sequence of float or Fraction
        Crossover probabilities.
    d : int, optional
        The minimum distance (taken from the weight distribution when not given).
    leaders, distribution : optional
        Precomputed coset leaders and weight distribution, to save the work.
    max_redundancy : int
        Passed to :func:`coset_leader_distribution`.

    Raises
    ------
    ParameterError
        For a ``p`` outside ``[0, 1]``.
    TooExpensiveError
        If ``n - k > max_redundancy`` (use :func:`simulate_bsc`).

    Examples
    --------
    >>> from fractions import Fraction
    >>> from gf2codes.families import repetition
    >>> bsc_performance(repetition(3), [Fraction(1, 2)])[0].block_error
    Fraction(1, 2)
    """
    from ..weights import minimum_weight_from_distribution, weight_distribution

    ps = [check_probability("p", x) for x in p]
    if leaders is None:
        leaders = coset_leader_distribution(code, max_redundancy=max_redundancy)
    if distribution is None:
        distribution = weight_distribution(code)
    if d is None:
        d = minimum_weight_from_distribution(distribution)
    t = (d - 1) // 2 if d is not None else None
    return bsc_points(code.n, ps, leaders=leaders, distribution=distribution, t=t)


def bsc_points(n: int, p: Sequence[Probability], *, leaders: CosetLeaders | None,
               distribution: Sequence[int] | None, t: int | None) -> list[BSCPoint]:
    """The three exact probabilities at each ``p`` from what is known; a value whose
    input is None (no coset leaders, no weight distribution, no radius ``t``) is None.

    >>> bsc_points(3, [0.5], leaders=CosetLeaders(3, 1, (1, 3)), distribution=None,
    ...            t=1)[0].block_error
    0.5
    """
    return [
        BSCPoint(
            x,
            None if leaders is None else block_error_probability(leaders, x),
            None if distribution is None else undetected_error_probability(distribution, x),
            None if t is None else bounded_distance_failure_probability(n, t, x),
        )
        for x in p
    ]
