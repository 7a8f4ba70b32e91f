"""The verify report: everything ``gf2codes verify`` states about one code, as an object.

:func:`verify` proves the minimum distance (by the cheapest route of
:func:`gf2codes.distance.minimum_distance`, or a quick interval), counts the weight
distribution and the dual distance when they are affordable within the time limit,
checks what the input stated about d, and compares the code with the bounds. It
returns a :class:`VerifyReport`; :meth:`VerifyReport.to_dict` is exactly the JSON
object that ``gf2codes verify --json`` prints, and the command's table is rendered
from the same object. Nothing here prints or draws.

Never more is claimed than was proved: ``d`` is set only when the proved lower bound
meets the weight of a codeword found (``d_exact``); otherwise the report holds the
proved interval ``d_lower <= d <= d_upper`` and says why it stopped.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 5, section 2 (the MacWilliams identity, by which the weight
   distribution of a code follows from that of its dual).
"""

from __future__ import annotations

import dataclasses
import os
from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass
from typing import Any, cast

from ._util import Clock
from .code import Code
from .distance import DistanceResult, human_seconds, minimum_distance, quick_distance
from .exceptions import ParameterError, TooExpensiveError
from .formats import rows_to_strings
from .typing import VERIFY_METHODS, WEIGHTS_POLICIES, StopReason, VerifyMethod, WeightsPolicy
from .weights import (
    DEFAULT_MAX_ENUMERATION,
    dual_distance,
    macwilliams_transform,
    minimum_weight_from_distribution,
    weight_distribution,
    weight_enumeration_cost,
)

__all__ = ["VerifyReport", "UpperBound", "LeastLength", "verify", "VERDICT_MAX_N",
           "VERDICT_MAX_N_TIMED", "WEIGHTS_AUTO_SECONDS", "weight_seconds"]

#: ``progress(done, total, info)``; ``info["stage"]`` names the step ("proving d",
#: "counting weights"), and each step starts with a call ``progress(0, 0, {"stage": ...})``.
Progress = Callable[[int, int, dict], None]

#: Codewords per second and core when counting weights, by words per row: measured with
#: ``gray_weight_histogram`` on the 2-core AVX2 machine (AMD EPYC, no AVX-512): 9.0e8,
#: 5.5e8, 2.7e8 and 2.2e8 for 1 to 4 words, 9.9e7 for 8 and 4.9e7 for 16 (about
#: 8.5e8 / words beyond two). An AVX-512 host is faster, so the estimate errs long.
_WEIGHT_RATES = (9.0e8, 5.5e8)
_WEIGHT_RATE_PER_WORD = 8.5e8
#: ``weights="auto"`` counts the weight distribution when it is estimated to take at most
#: this many seconds of wall time on the threads available.
WEIGHTS_AUTO_SECONDS = 30.0


def weight_seconds(code: Code, threads: int | None = None) -> float:
    """Estimated wall seconds of counting the weight distribution of ``code`` (the
    smaller of the code and its dual) on ``threads`` threads (default: one per core)."""
    k = min(code.k, code.n - code.k)
    words = -(-code.n // 64)
    rate = (_WEIGHT_RATES[words - 1] if words <= len(_WEIGHT_RATES)
            else _WEIGHT_RATE_PER_WORD / words)
    threads = threads or os.cpu_count() or 1
    return float(weight_enumeration_cost(code)) / (rate * min(threads, 1 << k))

#: The verdict's bounds (best upper bound at (n, k), least length for (k, d)) are
#: computed up to this length (after issue 14's table-driven bounds: 0.5 s at
#: n = 1023, 4.6 s at n = 4095, load 3 on 2 cores), and up to the second length under
#: a time limit. Raise them as the bounds get faster.
VERDICT_MAX_N = 2048
VERDICT_MAX_N_TIMED = 256


@dataclass(frozen=True)
class UpperBound:
    """The best upper bound on d at (n, k) and the bound that gives it."""

    d: int
    by: str


@dataclass(frozen=True)
class LeastLength:
    """The least length the bounds allow for (k, d) and the bound that gives it."""

    n: int
    by: str


@dataclass(frozen=True)
class VerifyReport:
    """What ``gf2codes verify`` reports about one code (see :func:`verify`).

    The fields are those of the command's JSON object, in its order
    (:meth:`to_dict`), plus ``name`` (the code's own name, shown in the text heading
    when there is no ``source``; not part of the JSON).

    Attributes
    ----------
    source : str or None
        The file the code was read from (``"-"``: standard input).
    n, k : int
    d : int or None
        The minimum distance when proved (``d_exact``), else None.
    d_lower, d_upper : int
        The proved interval; ``d_upper`` is the weight of ``witness``.
    d_exact : bool
    d_method : str
        The route that proved it (``"+weights"`` when the weight distribution did).
    d_route_reason : str
    d_route_estimates_s : mapping of str to float
        Estimated seconds per route (3 significant digits).
    d_information_sets : tuple of mapping
        Brouwer–Zimmermann only: per information set, its rank, levels done, the
        proved contribution and the argument (with a group: the bound it proves alone
        and the images credited).
    d_argument : str
        The argument of the lower bound when it is more than the plain route's:
        Brouwer–Zimmermann (``"zimmermann"``, ``"orbit-average"``,
        ``"orbit-average+zimmermann"``, ``"cyclic-window"``) or the dual-side route
        through one column per orbit (``"orbit-columns"``); empty otherwise.
    d_symmetry : mapping or None
        The automorphism group the proof used (detected cyclic or quasi-cyclic
        structure, or the checked permutations of the input), or None.
    codewords_examined : int
    seconds : float
        Wall time of the whole report.
    stopped : str or None
        Why the proof of d ended early (``"time limit"``, ``"interrupted"``, ...).
    corrects, detects : int
        ``(d - 1) // 2`` and ``d - 1`` (of the proved lower bound when d is not proved).
    weight_distribution : tuple of int or None
    dual_distance : int or None
    witness : str
        A lightest codeword found, as 0/1 text; ``witness_weight`` its weight.
    properties : mapping of str to bool
    dropped_rows : int
    notes, not_computed : tuple of str
    stated_wrong : tuple of str
        What the input stated about d that the proof contradicts.
    target_d : int or None
        Given with a target test; ``meets_target`` then says whether d >= target_d
        (None: undecided).
    upper_bound : UpperBound or None
    optimal : bool or None
    least_length : LeastLength or None
        None when the bounds were not computed (``"bounds"`` in ``not_computed``).
    """

    source: str | None
    n: int
    k: int
    d: int | None
    d_lower: int
    d_upper: int
    d_exact: bool
    d_method: str
    d_route_reason: str
    d_route_estimates_s: Mapping[str, float]
    d_information_sets: tuple[Mapping[str, Any], ...]
    d_argument: str
    d_symmetry: Mapping[str, Any] | None
    codewords_examined: int
    seconds: float
    stopped: StopReason | None
    corrects: int
    detects: int
    weight_distribution: tuple[int, ...] | None
    dual_distance: int | None
    witness: str
    witness_weight: int
    properties: Mapping[str, bool]
    dropped_rows: int
    notes: tuple[str, ...]
    not_computed: tuple[str, ...]
    stated_wrong: tuple[str, ...]
    target_d: int | None
    meets_target: bool | None
    upper_bound: UpperBound | None
    optimal: bool | None
    least_length: LeastLength | None
    name: str | None = None

    @property
    def interrupted(self) -> bool:
        """True when Ctrl-C stopped the proof (the command then exits with 130)."""
        return self.stopped == "interrupted"

    def to_dict(self) -> dict[str, Any]:
        """The JSON object of ``gf2codes verify --json``: the same keys, order and values.

        ``source`` comes first when set; ``target_d`` and ``meets_target`` appear only
        for a target test.

        >>> from gf2codes.families import hamming
        >>> r = verify(hamming(3)).to_dict()
        >>> r["n"], r["k"], r["d"], r["weight_distribution"]
        (7, 4, 3, [1, 0, 0, 7, 7, 0, 0, 1])
        """
        out: dict[str, Any] = {"source": self.source} if self.source else {}
        out.update({
            "n": self.n, "k": self.k, "d": self.d, "d_lower": self.d_lower,
            "d_upper": self.d_upper, "d_exact": self.d_exact, "d_method": self.d_method,
            "d_route_reason": self.d_route_reason,
            "d_route_estimates_s": dict(self.d_route_estimates_s),
            "d_information_sets": [dict(x) for x in self.d_information_sets],
            "d_argument": self.d_argument,
            "d_symmetry": None if self.d_symmetry is None else dict(self.d_symmetry),
            "codewords_examined": self.codewords_examined, "seconds": self.seconds,
            "stopped": self.stopped, "corrects": self.corrects, "detects": self.detects,
            "weight_distribution": _list(self.weight_distribution),
            "dual_distance": self.dual_distance, "witness": self.witness,
            "witness_weight": self.witness_weight, "properties": dict(self.properties),
            "dropped_rows": self.dropped_rows, "notes": list(self.notes),
            "not_computed": list(self.not_computed), "stated_wrong": list(self.stated_wrong),
        })
        if self.target_d is not None:
            out["target_d"] = self.target_d
            out["meets_target"] = self.meets_target
        out["upper_bound"] = (None if self.upper_bound is None else
                              {"d": self.upper_bound.d, "by": self.upper_bound.by})
        out["optimal"] = self.optimal
        out["least_length"] = (None if self.least_length is None else
                               {"n": self.least_length.n, "by": self.least_length.by})
        return out


def _list(values: tuple[int, ...] | None) -> list[int] | None:
    return None if values is None else list(values)


def verify(code: Code, *, time_limit: float | None = None, method: VerifyMethod = "exact",
           target_d: int | None = None, seed: int = 0, workers: int | None = None,
           stated: Mapping[str, int] | None = None, source: str | None = None,
           progress: Progress | None = None, executor: Any = None,
           automorphisms: Sequence[Sequence[int]] = (),
           weights: WeightsPolicy = "auto") -> VerifyReport:
    """Prove the parameters of ``code`` and report them (what ``gf2codes verify`` prints).

    Parameters
    ----------
    code : Code
    time_limit : float, optional
        Seconds for the whole report; on expiry the proved interval of d is reported
        and the parts not finished are listed in ``not_computed``.
    method : {"exact", "fast"}
        ``exact`` proves d; ``fast`` gives a quick interval whose upper end comes from
        information-set decoding (within ``time_limit``, default 2 s).
    target_d : int, optional
        Only settle whether d >= target_d (stops as soon as it is known).
    seed : int
        Seed of the randomised parts.
    workers : int, optional
        Threads for the exact enumeration (default: one per core).
    stated : mapping, optional
        What the input file said about d (keys ``d``, ``d_lower``, ``d_upper``); a
        statement the proof contradicts is reported in ``stated_wrong``, never trusted.
    source : str, optional
        Where the code was read from (reported as ``source``).
    progress : callable, optional
        ``progress(done, total, info)``; ``info["stage"]`` names the step.
    executor : optional
        An executor of :mod:`gf2codes.parallel` for the large enumeration levels.
    automorphisms : sequence of permutations, optional
        Coordinate permutations that map the code to itself (checked), for the proof
        of d (see :func:`gf2codes.distance.minimum_distance`).
    weights : {"auto", "always", "never"}
        Whether to count the weight distribution (and from it the dual distance):
        ``auto`` when it is estimated to take at most :data:`WEIGHTS_AUTO_SECONDS`
        (:func:`weight_seconds`), ``always`` (up to
        :data:`gf2codes.weights.DEFAULT_MAX_ENUMERATION` codewords), ``never`` (d only).
        A distribution not counted is listed in ``not_computed`` with the reason.

    Returns
    -------
    VerifyReport

    Raises
    ------
    TooExpensiveError
        If proving d exactly would take far too long without a time limit.
    ParameterError
        For an unknown ``method`` or a time limit that is not positive.

    Examples
    --------
    >>> from gf2codes.families import extended_golay
    >>> r = verify(extended_golay())
    >>> r.d, r.d_exact, r.optimal, r.dual_distance
    (8, True, True, 8)
    """
    if method not in VERIFY_METHODS:
        raise ParameterError(f"Argument 'method' must be one of {', '.join(VERIFY_METHODS)}, "
                             f"not {method!r}.")
    if weights not in WEIGHTS_POLICIES:
        raise ParameterError("Argument 'weights' must be one of "
                             f"{', '.join(WEIGHTS_POLICIES)}, not {weights!r}.")
    clock = Clock(time_limit)
    res = _distance(code, method, time_limit, target_d, seed, workers, executor,
                    _stage(progress, "proving d"), automorphisms)
    notes: list[str] = []
    not_computed: list[str] = []
    dist, dual_dist = _weights(code, res, clock, _stage(progress, "counting weights"),
                               notes, not_computed, weights, workers)
    if dist is not None and not res.exact and target_d is None:
        # The distribution is exact, so it proves d as well.
        d_from_dist = next(i for i, a in enumerate(dist) if i and a)
        notes.append("d proved from the exact weight distribution")
        res = _exact_from_distribution(code, res, d_from_dist, seed)
    dual_d = _dual_distance(code, dist, dual_dist, clock, notes, not_computed)
    wrong = _contradicted(stated or {}, res)
    if wrong:
        notes.append("the input file states " + ", ".join(wrong) +
                     ", which the proof contradicts: the statement is wrong")
    upper, optimal, least = _verdict_or_note(code, res, clock, notes, not_computed)
    lower = res.lower
    d = res.d
    return VerifyReport(
        source=source, n=code.n, k=code.k, d=d, d_lower=res.lower, d_upper=res.upper,
        d_exact=res.exact, d_method=res.method, d_route_reason=res.reason,
        d_route_estimates_s={e: float(f"{v:.3g}") for e, v in res.estimates.items()},
        d_information_sets=tuple(dict(x) for x in res.information_sets),
        d_argument=res.argument, d_symmetry=res.symmetry,
        codewords_examined=res.codewords, seconds=round(clock.elapsed(), 4),
        stopped=cast("StopReason | None", res.stopped),
        corrects=(d - 1) // 2 if d is not None else (lower - 1) // 2,
        detects=d - 1 if d is not None else lower - 1,
        weight_distribution=None if dist is None else tuple(dist), dual_distance=dual_d,
        witness=rows_to_strings(res.witness.reshape(1, -1))[0],
        witness_weight=int(res.upper), properties=code.properties(),
        dropped_rows=code.dropped_rows, notes=tuple(notes), not_computed=tuple(not_computed),
        stated_wrong=tuple(wrong), target_d=target_d,
        meets_target=None if target_d is None else res.at_least(target_d),
        upper_bound=upper, optimal=optimal, least_length=least, name=code.name,
    )


def _stage(progress: Progress | None, stage: str) -> Progress | None:
    """``progress`` with ``info["stage"] = stage`` added; announces the stage once."""
    if progress is None:
        return None
    progress(0, 0, {"stage": stage})

    def call(done: int, total: int, info: dict) -> None:
        progress(done, total, {**info, "stage": stage})

    return call


def _distance(code: Code, method: str, time_limit: float | None, target_d: int | None,
              seed: int, workers: int | None, executor: Any,
              progress: Progress | None, automorphisms: Sequence[Sequence[int]] = ()
              ) -> DistanceResult:
    if method == "fast":
        return quick_distance(code, time_limit=time_limit or 2.0, seed=seed)
    try:
        return minimum_distance(code, time_limit=time_limit, progress=progress,
                                target=target_d, seed=seed, workers=workers,
                                executor=executor, automorphisms=automorphisms)
    except TooExpensiveError as exc:
        raise TooExpensiveError(
            f"proving d of this [{code.n},{code.k}] code needs about {exc.work:.2g} "
            f"codewords, roughly {human_seconds(cast(float, exc.seconds))} on one core. Use "
            "--time-limit S for the interval proved within S seconds, or --method fast "
            "for a quick interval.", work=exc.work, seconds=exc.seconds,
        ) from None


def _weights(code: Code, res: DistanceResult, clock: Clock, progress: Progress | None,
             notes: list[str], not_computed: list[str], policy: WeightsPolicy = "auto",
             workers: int | None = None) -> tuple[list[int] | None, list[int] | None]:
    """The weight distribution (and the dual's, when that was the one counted), or
    (None, None) with a note when it is not asked for or not affordable."""
    cost = weight_enumeration_cost(code)
    seconds = weight_seconds(code, workers)
    left = clock.left()
    if res.stopped == "interrupted":
        notes.append("interrupted (Ctrl-C): the proved interval so far is reported; the "
                     "weight distribution was skipped")
        not_computed += ["weight distribution", "dual distance"]
    elif code.k < code.n and policy == "never":
        notes.append("weight distribution not computed (not asked for)")
        not_computed += ["weight distribution", "dual distance"]
    elif (code.k < code.n and policy == "auto" and seconds > WEIGHTS_AUTO_SECONDS
          and cost <= DEFAULT_MAX_ENUMERATION):
        notes.append(
            f"weight distribution not computed: it needs 2^{min(code.k, code.n - code.k)} "
            f"codewords, about {human_seconds(seconds)} (over {WEIGHTS_AUTO_SECONDS:.0f} s); "
            "ask for it with weights='always' (gf2codes verify --weights always)"
        )
        not_computed += ["weight distribution", "dual distance"]
    elif code.k < code.n and (cost > DEFAULT_MAX_ENUMERATION or
                              (left is not None and seconds > left)):
        notes.append(
            f"weight distribution not computed: it needs 2^{min(code.k, code.n - code.k)} "
            "codewords" + ("" if left is None else " and the time limit is too short")
        )
        not_computed.append("weight distribution")
    else:
        try:
            return _distributions(code, _bounded(progress, clock), clock.deadline)
        except TimeoutError:
            notes.append("weight distribution not computed: the time limit ran out")
            not_computed.append("weight distribution")
    return None, None


def _dual_distance(code: Code, dist: list[int] | None, dual_dist: list[int] | None,
                   clock: Clock, notes: list[str], not_computed: list[str]) -> int | None:
    """The dual distance from whichever distribution was counted (None, noted, if none)."""
    if dual_dist is not None:
        return minimum_weight_from_distribution(dual_dist)
    if dist is not None:
        try:
            return dual_distance(code, dist, deadline=clock.deadline)
        except TimeoutError:
            notes.append("dual distance not computed: the time limit ran out")
            not_computed.append("dual distance")
    elif code.k < code.n and "dual distance" not in not_computed:
        not_computed.append("dual distance")
    return None


def _distributions(code: Code, progress: Progress, deadline: float | None
                   ) -> tuple[list[int], list[int] | None]:
    """The weight distribution, and the dual's when it was the one enumerated.

    Counting the smaller side: the code itself (the dual distance then comes from
    the first nonzero MacWilliams entry), or the dual, whose distribution gives the
    dual distance directly and the code's by the MacWilliams transform [1]_.
    """
    if code.k == code.n or code.k <= code.n - code.k:
        return weight_distribution(code, progress=progress, deadline=deadline), None
    dual = weight_distribution(code.dual(), progress=progress, deadline=deadline)
    return macwilliams_transform(dual, code.n, deadline=deadline), dual


def _bounded(progress: Progress | None, clock: Clock) -> Progress:
    """A progress callback that also stops the work (TimeoutError) once the time is up."""

    def call(done: int, total: int, info: dict) -> None:
        if progress is not None:
            progress(done, total, info)
        if clock.expired():
            raise TimeoutError("the time limit ran out")

    return call


def _contradicted(stated: Mapping[str, int], res: DistanceResult) -> list[str]:
    """The statements about d that the proved interval refutes, as text."""
    wrong = []
    d, lo, hi = stated.get("d"), stated.get("d_lower"), stated.get("d_upper")
    if d is not None and not res.lower <= d <= res.upper:
        wrong.append(f"d = {d}")
    if lo is not None and lo > res.upper:
        wrong.append(f"d >= {lo}")
    if hi is not None and hi < res.lower:
        wrong.append(f"d <= {hi}")
    return wrong


def _exact_from_distribution(code: Code, res: DistanceResult, d: int, seed: int
                             ) -> DistanceResult:
    """Turn an interval into a proof using the exact weight distribution: find a
    codeword of weight ``d`` (a target run stops at once when one exists)."""
    if res.upper == d:
        return dataclasses.replace(res, lower=d, exact=True, method=res.method + "+weights",
                                   stopped=None)
    r = minimum_distance(code, target=d + 1, max_work=None, seed=seed)
    assert r.upper == d, "weight distribution and enumeration disagree"
    return dataclasses.replace(res, lower=d, upper=d, witness=r.witness, exact=True,
                               method=res.method + "+weights",
                               codewords=res.codewords + r.codewords,
                               seconds=res.seconds + r.seconds, stopped=None)


def _verdict_or_note(code: Code, res: DistanceResult, clock: Clock, notes: list[str],
                     not_computed: list[str]
                     ) -> tuple[UpperBound | None, bool | None, LeastLength | None]:
    """The verdict, or (None, None, None) with a note when n is too long for it."""
    timed = clock.deadline is not None
    limit = VERDICT_MAX_N_TIMED if timed else VERDICT_MAX_N
    if code.n <= limit:
        return _verdict(code, res)
    notes.append(f"bounds not computed: for n > {limit} they take too long "
                 + ("within a time limit" if timed else "in a report")
                 + f"; run gf2codes bounds --n {code.n} --k {code.k} for them")
    not_computed.append("bounds")
    return None, None, None


def _verdict(code: Code, res: DistanceResult
             ) -> tuple[UpperBound, bool | None, LeastLength | None]:
    """Best upper bound at (n, k), optimality, and least possible length for (k, d)."""
    from . import bounds  # the bounds tables load only when a verdict is asked for

    ub = bounds.best_upper(code.n, code.k)
    optimal = None
    if res.exact:
        optimal = res.upper >= ub.d
    elif res.lower >= ub.d:
        optimal = True
    least = None
    if res.exact and res.d is not None:
        ll = bounds.least_length(code.k, res.d)
        least = LeastLength(ll.n, ll.by)
    return UpperBound(ub.d, ub.by), optimal, least
