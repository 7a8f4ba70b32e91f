"""Decoding on a binary symmetric channel: coset leaders, exact error probabilities, simulation.

A binary symmetric channel (BSC) flips each transmitted bit independently with
crossover probability ``p``. For a binary linear ``[n, k]`` code this module gives

* the **coset-leader weight distribution** ``alpha_0, ..., alpha_rho`` (``alpha_i`` =
  number of cosets whose lightest word has weight ``i``) and the **covering radius**
  ``rho``, by breadth-first search over the ``2^(n-k)`` syndromes [1]_;
* three **exact probabilities** per ``p``, with ``q = 1 - p``:

  - block error of complete syndrome (minimum-distance) decoding [1]_ ::

        P_block = 1 - sum_i alpha_i p^i q^(n-i) = sum_i (C(n, i) - alpha_i) p^i q^(n-i)

  - undetected error when the code is used for error detection only [2]_ ::

        P_undetected = sum_{i >= 1} A_i p^i q^(n-i)        (A_i: weight distribution)

  - failure of a bounded-distance decoder of radius ``t = (d - 1) // 2`` (it corrects
    every pattern of at most ``t`` errors and nothing else) ::

        P_bdd = sum_{i > t} C(n, i) p^i q^(n-i)

  Every sum is taken over the complement directly (never as ``1 - ...``) with
  :func:`math.fsum`, so tiny probabilities keep their relative precision; with ``p``
  a :class:`fractions.Fraction` the result is an exact ``Fraction``;
* **Monte Carlo estimates** of the same three probabilities for codes too large for
  the exact sums, with a seeded generator and a confidence interval on every
  estimate. Two decoders: a syndrome table (complete minimum-distance decoding, for
  ``n - k`` up to :data:`TABLE_MAX_REDUNDANCY`) and an information-set decoder in the
  manner of ordered-statistics decoding [3]_, adapted to hard decisions.

The decoders decide from the coset of the received word only (adding a codeword to
the input adds it to the output), and the channel acts the same on every codeword,
so the probability of a decoding error does not depend on the codeword sent [1]_:
the simulation sends the all-zero codeword and draws the error patterns only.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1, sections 3-5 (cosets, syndrome decoding, coset
   leaders, the probability of a decoding error).
.. [2] S. Lin and D. J. Costello, *Error Control Coding*, 2nd ed., Pearson, 2004,
   ch. 3, section 3.6 (probability of an undetected error for linear codes).
.. [3] M. P. C. Fossorier and S. Lin, "Soft-decision decoding of linear block codes
   based on ordered statistics", *IEEE Trans. Inform. Theory* 41(5), 1995,
   pp. 1379-1396, doi:10.1109/18.412683.
.. [4] C. J. Clopper and E. S. Pearson, "The use of confidence or fiducial limits
   illustrated in the case of the binomial", *Biometrika* 26(4), 1934, pp. 404-413;
   E. B. Wilson, "Probable inference, the law of succession, and statistical
   inference", *J. Amer. Statist. Assoc.* 22(158), 1927, pp. 209-212.
"""

from __future__ import annotations

import math
import numbers
import time
from collections.abc import Callable, Sequence
from dataclasses import asdict, dataclass, field
from fractions import Fraction
from functools import lru_cache
from typing import Any, overload

import numpy as np

from . import _decoding_kernels as _dk
from . import linalg
from .code import Code
from .exceptions import ParameterError, TooExpensiveError, check_int

__all__ = [
    "DEFAULT_MAX_REDUNDANCY",
    "TABLE_MAX_REDUNDANCY",
    "CosetLeaders",
    "coset_leader_distribution",
    "covering_radius",
    "check_probability",
    "block_error_probability",
    "undetected_error_probability",
    "bounded_distance_failure_probability",
    "BSCPoint",
    "bsc_performance",
    "SyndromeDecoder",
    "InformationSetDecoder",
    "Estimate",
    "SimulationResult",
    "simulate_bsc",
    "clopper_pearson_interval",
    "wilson_interval",
]

#: :func:`coset_leader_distribution` refuses codes with more parity bits than this
#: (the search keeps one byte per syndrome: 2^26 bytes = 64 MiB).
DEFAULT_MAX_REDUNDANCY = 26
#: :class:`SyndromeDecoder` keeps 5 bytes per syndrome; it refuses more parity bits.
TABLE_MAX_REDUNDANCY = 22

Probability = float | Fraction
SeedLike = int | np.random.Generator | None
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


def _rng(seed: SeedLike) -> np.random.Generator:
    if isinstance(seed, np.random.Generator):
        return seed
    if seed is not None:
        check_int("seed", seed, minimum=0)
    return np.random.default_rng(seed)


# ---------------------------------------------------------------------- coset leaders


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


def _syndrome_columns(code: Code) -> np.ndarray:
    """The columns of ``code.H`` as integers (bit ``i`` = row ``i``); needs ``n - k <= 63``."""
    H = code.H.astype(np.uint64)
    shifts = np.arange(H.shape[0], dtype=np.uint64)[:, None]
    return np.ascontiguousarray(np.bitwise_or.reduce(H << shifts, axis=0), dtype=np.uint64)


def _check_redundancy(code: Code, limit: int, what: str) -> None:
    limit = check_int("max_redundancy", limit, minimum=0, maximum=40)
    r = code.n - code.k
    if r > limit:
        raise TooExpensiveError(
            f"{what} of this [{code.n},{code.k}] code needs a table of all 2^{r} = "
            f"{float(2 ** r):.3g} syndromes (n - k = {r} > {limit}); use simulation "
            "(simulate_bsc, or --simulate N on the command line) instead.",
            work=float(2 ** r),
        )


def _search(code: Code, keep_parent: bool) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    r = code.n - code.k
    cols = _syndrome_columns(code)
    level = np.empty(1 << r, dtype=np.uint8)
    parent = np.empty((1 << r) if keep_parent else 0, dtype=np.int32)
    counts = _dk.coset_levels(cols, np.int64(r), level, parent)
    return cols, counts, parent


def _leaders_from_counts(code: Code, counts: np.ndarray) -> CosetLeaders:
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
    _check_redundancy(code, max_redundancy, "the coset-leader distribution")
    if code.k == code.n:
        return CosetLeaders(code.n, code.k, (1,))
    _, counts, _ = _search(code, keep_parent=False)
    return _leaders_from_counts(code, counts)


def covering_radius(code: Code, *, max_redundancy: int = DEFAULT_MAX_REDUNDANCY) -> int:
    """The covering radius: the greatest distance from any word of GF(2)^n to the code.

    >>> from gf2codes.families import extended_golay
    >>> covering_radius(extended_golay())
    4
    """
    return coset_leader_distribution(code, max_redundancy=max_redundancy).covering_radius


# ----------------------------------------------------------------- exact probabilities


@lru_cache(maxsize=16)
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
    from .weights import minimum_weight_from_distribution, weight_distribution

    ps = [check_probability("p", x) for x in p]
    if leaders is None:
        leaders = coset_leader_distribution(code, max_redundancy=max_redundancy)
    if distribution is None:
        distribution = weight_distribution(code)
    if d is None:
        d = minimum_weight_from_distribution(distribution)
    t = (d - 1) // 2 if d is not None else None
    return [
        BSCPoint(
            x,
            block_error_probability(leaders, x),
            undetected_error_probability(distribution, x),
            None if t is None else bounded_distance_failure_probability(code.n, t, x),
        )
        for x in ps
    ]


# --------------------------------------------------------------------------- decoders


class SyndromeDecoder:
    """Complete minimum-distance decoding by a table of coset leaders.

    The table holds, for every syndrome, one column of ``H`` that leads one step
    back towards the zero syndrome in the breadth-first search; following it spells
    out a coset leader in at most ``rho`` steps. Ties between leaders of equal weight
    are broken by the search order (the first column that reaches a syndrome).

    Parameters
    ----------
    code : Code
    max_redundancy : int
        Refuse codes with more parity bits (the table has ``2^(n-k)`` entries).

    Raises
    ------
    TooExpensiveError

    References
    ----------
    MacWilliams & Sloane (1977), ch. 1, section 4 (syndrome decoding).
    """

    name = "syndrome"

    def __init__(self, code: Code, *, max_redundancy: int = TABLE_MAX_REDUNDANCY) -> None:
        _check_redundancy(code, max_redundancy, "a syndrome-table decoder")
        self.code = code
        if code.k == code.n:
            self._cols = np.zeros(code.n, dtype=np.uint64)
            self._parent = np.full(1, -1, dtype=np.int32)
            self.leaders = CosetLeaders(code.n, code.k, (1,))
        else:
            self._cols, counts, self._parent = _search(code, keep_parent=True)
            self.leaders = _leaders_from_counts(code, counts)

    def syndromes(self, words: np.ndarray) -> np.ndarray:
        """Integer syndromes (bit ``i`` = row ``i`` of ``H``) of 0/1 words ``(T, n)``."""
        W = np.asarray(words, dtype=bool)
        return np.bitwise_xor.reduce(np.where(W, self._cols, np.uint64(0)), axis=1)

    def error_patterns(self, received: np.ndarray) -> np.ndarray:
        """The coset leader chosen for each received word (``uint8``, ``(T, n)``)."""
        Y = np.atleast_2d(np.asarray(received, dtype=np.uint8))
        s = self.syndromes(Y)
        out = np.zeros(Y.shape, dtype=np.uint8)
        rows = np.arange(Y.shape[0])
        for _ in range(self.leaders.covering_radius):
            live = s != 0
            if not live.any():
                break
            j = self._parent[s[live].astype(np.int64)]
            out[rows[live], j] ^= 1
            s[live] ^= self._cols[j]
        return out

    def decode(self, received: np.ndarray) -> np.ndarray:
        """The codeword nearest to each received word (one nearest, ties broken as above)."""
        Y = np.atleast_2d(np.asarray(received, dtype=np.uint8))
        return Y ^ self.error_patterns(Y)


class InformationSetDecoder:
    """Hard-decision decoding by re-encoding on several information sets.

    Ordered-statistics decoding [1]_ re-encodes the most reliable information set
    of a soft-decision word, flipped in up to ``order`` positions, and keeps the
    candidate nearest to the received word. On a binary symmetric channel every bit
    is equally reliable, so the single ordered information set is replaced by a fixed
    family of ``information_sets`` information sets drawn once from ``seed`` (the
    first is the code's own systematic one). For each received word ``y`` and each
    information set, every flip pattern ``F`` of at most ``order`` information bits
    gives the candidate error ``[e_F | y_R + (y_I + e_F) A]``, which lies in the coset
    of ``y``; the lightest candidate wins (the first found on ties).

    The decoder finds the coset leader whenever some information set holds at most
    ``order`` of its errors, in particular whenever the error has weight at most
    ``order``. Otherwise it may return a heavier word of the coset, never a word of
    another coset, so its block-error rate is an upper estimate of that of complete
    minimum-distance decoding (which is maximum-likelihood for ``p < 1/2``).

    Parameters
    ----------
    code : Code
    information_sets : int
        Number of information sets (default 8).
    order : int
        Flip patterns of up to this many information bits: 0, 1 or 2 (default 2).
    seed : int or numpy.random.Generator, optional
        Chooses the information sets.
    radius : int
        Words whose best candidate weighs at most this much are not searched further
        (pass ``(d - 1) // 2`` when ``d`` is known: such a candidate is the unique
        nearest). Default 0.

    References
    ----------
    .. [1] Fossorier & Lin (1995), section III (order-i reprocessing).
    """

    name = "information-set"

    def __init__(self, code: Code, *, information_sets: int = 8, order: int = 2,
                 seed: SeedLike = None, radius: int = 0) -> None:
        self.code = code
        self.order = check_int("order", order, minimum=0, maximum=2)
        count = check_int("information_sets", information_sets, minimum=1)
        self.radius = check_int("radius", radius, minimum=0)
        rng = _rng(seed)
        n, k = code.n, code.k
        self._sets = []
        for i in range(count):
            order_i = None if i == 0 else rng.permutation(n)
            s = code.systematic(column_order=order_i)
            A = np.ascontiguousarray(s.matrix[:, k:], dtype=np.uint8)
            self._sets.append((np.asarray(s.permutation, dtype=np.int64), A,
                               linalg.pack(A) if n > k else np.zeros((k, 1), np.uint64)))

    def error_patterns(self, received: np.ndarray) -> np.ndarray:
        """The lightest error pattern found in the coset of each received word."""
        Y = np.atleast_2d(np.asarray(received, dtype=np.uint8))
        T, n = Y.shape
        k = self.code.k
        best_w = np.full(T, np.iinfo(np.int64).max, dtype=np.int64)
        best_e = np.zeros((T, n), dtype=np.uint8)
        live = np.arange(T)
        for perm, A, A_packed in self._sets:
            if live.size == 0:
                break
            Yp = Y[live][:, perm]
            base = (Yp[:, k:].astype(np.int64) + Yp[:, :k].astype(np.int64) @ A) & 1
            base = base.astype(np.uint8)
            base_packed = (linalg.pack(base) if n > k
                           else np.zeros((live.size, 1), np.uint64))
            w = best_w[live].copy()
            flips = np.full((live.size, 2), -1, dtype=np.int64)
            before = w.copy()
            _dk.info_set_search(base_packed, A_packed, np.int64(self.order), w, flips)
            better = np.flatnonzero(w < before)
            if better.size:
                e = np.zeros((better.size, n), dtype=np.uint8)
                red = base[better].copy()
                for slot in range(2):
                    f = flips[better, slot]
                    has = f >= 0
                    e[np.flatnonzero(has), f[has]] = 1
                    red[has] ^= A[f[has]]
                e[:, k:] = red
                target = live[better]
                best_e[target[:, None], perm[None, :]] = e
                best_w[target] = w[better]
            live = live[best_w[live] > self.radius]
        return best_e

    def decode(self, received: np.ndarray) -> np.ndarray:
        """The nearest codeword found for each received word."""
        Y = np.atleast_2d(np.asarray(received, dtype=np.uint8))
        return Y ^ self.error_patterns(Y)


# ------------------------------------------------------------------------- simulation


def clopper_pearson_interval(events: int, trials: int,
                             confidence: float = 0.99) -> tuple[float, float]:
    """The exact (Clopper–Pearson) two-sided interval for a binomial proportion.

    Conservative: it covers the true value with probability at least ``confidence``.

    References
    ----------
    Clopper & Pearson (1934).

    >>> lo, hi = clopper_pearson_interval(0, 1000, 0.95)
    >>> lo, round(hi, 5)
    (0.0, 0.00368)
    """
    from scipy.stats import beta  # type: ignore[import-untyped]  # no stubs installed

    events, trials, confidence = _check_interval_args(events, trials, confidence)
    a = 1 - confidence
    lo = 0.0 if events == 0 else float(beta.ppf(a / 2, events, trials - events + 1))
    hi = 1.0 if events == trials else float(beta.ppf(1 - a / 2, events + 1, trials - events))
    return lo, hi


def wilson_interval(events: int, trials: int, confidence: float = 0.99) -> tuple[float, float]:
    """The Wilson score interval for a binomial proportion.

    References
    ----------
    Wilson (1927).

    >>> lo, hi = wilson_interval(50, 100, 0.95)
    >>> round(lo, 4), round(hi, 4)
    (0.4038, 0.5962)
    """
    from statistics import NormalDist

    events, trials, confidence = _check_interval_args(events, trials, confidence)
    z = NormalDist().inv_cdf(1 - (1 - confidence) / 2)
    ph = events / trials
    denom = 1 + z * z / trials
    centre = (ph + z * z / (2 * trials)) / denom
    half = z * math.sqrt(ph * (1 - ph) / trials + z * z / (4 * trials * trials)) / denom
    return max(0.0, centre - half), min(1.0, centre + half)


def _check_interval_args(events: int, trials: int, confidence: float) -> tuple[int, int, float]:
    trials = check_int("trials", trials, minimum=1)
    events = check_int("events", events, minimum=0, maximum=trials)
    if isinstance(confidence, bool) or not isinstance(confidence, numbers.Real) or not (
            0 < confidence < 1):
        raise ParameterError(
            f"Argument 'confidence' must be between 0 and 1 (exclusive), not {confidence!r}.")
    return events, trials, float(confidence)


_INTERVALS: dict[str, Callable[[int, int, float], tuple[float, float]]] = {
    "clopper-pearson": clopper_pearson_interval,
    "wilson": wilson_interval,
}


@dataclass(frozen=True)
class Estimate:
    """A Monte Carlo estimate of a probability: ``events / trials`` and its interval."""

    events: int
    trials: int
    value: float
    lower: float
    upper: float
    confidence: float
    interval: str

    def contains(self, x: float) -> bool:
        """Whether ``x`` lies in the confidence interval."""
        return self.lower <= float(x) <= self.upper


@dataclass(frozen=True)
class SimulationResult:
    """Monte Carlo estimates at one crossover probability.

    Attributes
    ----------
    p : float
    trials : int
        Codewords sent (fewer than asked when a time limit stopped the run).
    decoder : str
        ``"syndrome"`` or ``"information-set"`` (with its settings).
    block_error, undetected_error : Estimate
    bounded_distance_failure : Estimate or None
        None when the minimum distance was not known.
    seed : int or None
    seconds : float
    stopped : str or None
        ``"time limit"`` when the run was cut short.
    """

    p: float
    trials: int
    decoder: str
    block_error: Estimate
    undetected_error: Estimate
    bounded_distance_failure: Estimate | None
    seed: int | None
    seconds: float
    stopped: str | None = None
    notes: tuple[str, ...] = field(default=())

    def as_dict(self) -> dict[str, Any]:
        """JSON-ready form."""
        out = asdict(self)
        out["notes"] = list(self.notes)
        return out


def _error_patterns(rng: np.random.Generator, count: int, n: int, p: float
                    ) -> tuple[np.ndarray, np.ndarray]:
    """Draw ``count`` BSC error patterns; return (weights of all, patterns of nonzero ones).

    The number of flips of each word is binomial; the flipped positions are a uniform
    subset of that size (the ranks of uniform keys), so the patterns are exactly those
    of a BSC while words without errors cost nothing.
    """
    w = rng.binomial(n, p, size=count)
    nz = np.flatnonzero(w)
    if nz.size == 0:
        return w, np.zeros((0, n), dtype=np.uint8)
    keys = rng.random((nz.size, n))
    ranks = np.argsort(np.argsort(keys, axis=1), axis=1)
    return w, (ranks < w[nz, None]).astype(np.uint8)


def simulate_bsc(
    code: Code,
    p: float,
    trials: int,
    *,
    seed: SeedLike = None,
    decoder: str = "auto",
    d: int | None = None,
    confidence: float = 0.99,
    interval: str = "clopper-pearson",
    information_sets: int = 8,
    order: int = 2,
    batch: int = 1 << 16,
    time_limit: float | None = None,
    progress: Callable[[int, int, dict], None] | None = None,
) -> SimulationResult:
    """Monte Carlo estimates of the three BSC probabilities of :func:`bsc_performance`.

    Each trial draws an error pattern ``e`` of the channel and counts

    * a **block error** when the decoder's error pattern differs from ``e`` (it then
      returns a wrong codeword);
    * an **undetected error** when ``e`` is a nonzero codeword;
    * a **bounded-distance failure** when ``wt(e) > (d - 1) // 2``.

    Parameters
    ----------
    code : Code
    p : float
        Crossover probability in ``[0, 1]``.
    trials : int
        Number of codewords sent.
    seed : int or numpy.random.Generator, optional
        The only source of randomness (the global state is never touched).
    decoder : {"auto", "syndrome", "information-set"}
        ``auto``: the syndrome table when ``n - k <= TABLE_MAX_REDUNDANCY``, else the
        information-set decoder (see :class:`InformationSetDecoder`).
    d : int, optional
        Minimum distance, for the bounded-distance estimate (skipped when None) and
        to stop the information-set search early.
    confidence : float
        Of every interval (default 0.99).
    interval : {"clopper-pearson", "wilson"}
    information_sets, order : int
        Settings of the information-set decoder.
    batch : int
        Trials drawn at a time.
    time_limit : float, optional
        Stop after the batch that passes this many seconds.
    progress : callable, optional
        ``progress(done, total, info)`` after every batch.

    Returns
    -------
    SimulationResult

    Raises
    ------
    ParameterError
        For ``p`` outside ``[0, 1]``, a non-positive ``trials``, an unknown decoder
        or interval.

    Examples
    --------
    >>> from gf2codes.families import hamming
    >>> r = simulate_bsc(hamming(3), 0.1, 2000, seed=1)
    >>> r.block_error.contains(1 - 0.9**7 - 7 * 0.1 * 0.9**6)
    True
    """
    p = float(check_probability("p", p))
    trials = check_int("trials", trials, minimum=1)
    batch = check_int("batch", batch, minimum=1)
    if interval not in _INTERVALS:
        raise ParameterError(
            f"Argument 'interval' must be one of {', '.join(_INTERVALS)}, not {interval!r}.")
    _check_interval_args(0, 1, confidence)
    if time_limit is not None and not time_limit > 0:
        raise ParameterError(f"Argument 'time_limit' must be positive, not {time_limit!r}.")
    if decoder not in ("auto", "syndrome", "information-set"):
        raise ParameterError("Argument 'decoder' must be one of auto, syndrome, "
                             f"information-set, not {decoder!r}.")
    seed_value = seed if isinstance(seed, int) else None
    rng = _rng(seed)
    t = None if d is None else (check_int("d", d, minimum=1) - 1) // 2
    r = code.n - code.k
    if decoder == "auto":
        decoder = "syndrome" if r <= TABLE_MAX_REDUNDANCY else "information-set"
    dec: SyndromeDecoder | InformationSetDecoder
    if decoder == "syndrome":
        dec = SyndromeDecoder(code)
        label = "syndrome-table decoder (complete minimum-distance decoding)"
    else:
        dec = InformationSetDecoder(code, information_sets=information_sets, order=order,
                                    seed=rng, radius=t or 0)
        label = f"information-set decoder ({information_sets} sets, order {order})"
    H = code.H.astype(np.int64)
    start = time.perf_counter()
    done = block = undetected = beyond = 0
    stopped = None
    while done < trials:
        m = min(batch, trials - done)
        weights, E = _error_patterns(rng, m, code.n, p)
        if E.shape[0]:
            block += int(np.any(dec.error_patterns(E) != E, axis=1).sum())
            if r:
                undetected += int((~((E.astype(np.int64) @ H.T) & 1).any(axis=1)).sum())
            else:
                undetected += E.shape[0]
        if t is not None:
            beyond += int((weights > t).sum())
        done += m
        if progress is not None:
            progress(done, trials, {"note": f"{block} block errors"})
        if time_limit is not None and time.perf_counter() - start > time_limit and done < trials:
            stopped = "time limit"
            break
    ci = _INTERVALS[interval]

    def est(events: int) -> Estimate:
        lo, hi = ci(events, done, confidence)
        return Estimate(events, done, events / done, lo, hi, confidence, interval)

    return SimulationResult(
        p=p, trials=done, decoder=label, block_error=est(block),
        undetected_error=est(undetected),
        bounded_distance_failure=None if t is None else est(beyond),
        seed=seed_value, seconds=round(time.perf_counter() - start, 4), stopped=stopped,
    )
