"""Monte Carlo estimates of the BSC error probabilities, with confidence intervals.

The decoders decide from the coset of the received word only, and the channel acts
the same on every codeword, so the probability of a decoding error does not depend
on the codeword sent [1]_: the simulation sends the all-zero codeword and draws the
error patterns only.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1, section 5.
.. [2] C. J. Clopper and E. S. Pearson, "The use of confidence or fiducial limits
   illustrated in the case of the binomial", *Biometrika* 26(4), 1934, pp. 404-413;
   E. B. Wilson, "Probable inference, the law of succession, and statistical
   inference", *J. Amer. Statist. Assoc.* 22(158), 1927, pp. 209-212.
"""

from __future__ import annotations

import math
import numbers
from collections.abc import Callable
from dataclasses import asdict, dataclass, field
from typing import Any, get_args

import numpy as np

from .._util import Clock
from .._util import rng as make_rng
from ..code import Code
from ..exceptions import ParameterError, check_int
from ..typing import DecoderName, IntervalName, SeedLike, StopReason
from .decoders import InformationSetDecoder, SyndromeDecoder
from .leaders import TABLE_MAX_REDUNDANCY
from .probability import check_probability

__all__ = ["clopper_pearson_interval", "wilson_interval", "Estimate", "SimulationResult",
           "simulate_bsc"]

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
    stopped: StopReason | None = None
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
    decoder: DecoderName = "auto",
    d: int | None = None,
    confidence: float = 0.99,
    interval: IntervalName = "clopper-pearson",
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
    _check_choices(interval, decoder, confidence, time_limit)
    seed_value = seed if isinstance(seed, int) else None
    rng = make_rng(seed)
    t = None if d is None else (check_int("d", d, minimum=1) - 1) // 2
    dec, label = _decoder(code, decoder, rng, t, information_sets, order)
    clock = Clock(time_limit)
    done, block, undetected, beyond, stopped = _run(code, dec, rng, p, trials, batch, t,
                                                    clock, progress)
    ci = _INTERVALS[interval]

    def est(events: int) -> Estimate:
        lo, hi = ci(events, done, confidence)
        return Estimate(events, done, events / done, lo, hi, confidence, interval)

    return SimulationResult(
        p=p, trials=done, decoder=label, block_error=est(block),
        undetected_error=est(undetected),
        bounded_distance_failure=None if t is None else est(beyond),
        seed=seed_value, seconds=round(clock.elapsed(), 4), stopped=stopped,
    )


def _check_choices(interval: str, decoder: str, confidence: float,
                   time_limit: float | None) -> None:
    """The arguments of :func:`simulate_bsc` that are names or limits."""
    if interval not in _INTERVALS:
        raise ParameterError(
            f"Argument 'interval' must be one of {', '.join(_INTERVALS)}, not {interval!r}.")
    _check_interval_args(0, 1, confidence)
    if time_limit is not None and not time_limit > 0:
        raise ParameterError(f"Argument 'time_limit' must be positive, not {time_limit!r}.")
    if decoder not in _DECODERS:
        raise ParameterError("Argument 'decoder' must be one of auto, syndrome, "
                             f"information-set, not {decoder!r}.")


_DECODERS: tuple[DecoderName, ...] = get_args(DecoderName)


def _decoder(code: Code, decoder: str, rng: np.random.Generator, t: int | None,
             information_sets: int, order: int
             ) -> tuple[SyndromeDecoder | InformationSetDecoder, str]:
    """The decoder ``decoder`` names (``auto``: by the number of parity bits), and its label."""
    if decoder == "auto":
        decoder = ("syndrome" if code.n - code.k <= TABLE_MAX_REDUNDANCY
                   else "information-set")
    if decoder == "syndrome":
        return (SyndromeDecoder(code),
                "syndrome-table decoder (complete minimum-distance decoding)")
    return (InformationSetDecoder(code, information_sets=information_sets, order=order,
                                  seed=rng, radius=t or 0),
            f"information-set decoder ({information_sets} sets, order {order})")


def _run(code: Code, dec: SyndromeDecoder | InformationSetDecoder, rng: np.random.Generator,
         p: float, trials: int, batch: int, t: int | None, clock: Clock,
         progress: Callable[[int, int, dict], None] | None
         ) -> tuple[int, int, int, int, StopReason | None]:
    """Send batches of the zero codeword; (trials done, block errors, undetected errors,
    patterns beyond ``t``, why it stopped early)."""
    r = code.n - code.k
    H = code.H.astype(np.int64)
    done = block = undetected = beyond = 0
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
        if clock.expired() and done < trials:
            return done, block, undetected, beyond, "time limit"
    return done, block, undetected, beyond, None
