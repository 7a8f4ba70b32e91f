"""Minimum distance: exact proofs, target tests, time-limited intervals, fast upper bounds.

Everything here returns a :class:`DistanceResult` that never claims more than was
proved: ``lower`` is a proved lower bound on d, ``upper`` the weight of a codeword
that was actually found (the ``witness``), and ``exact`` is true only when the two
meet.

Two exact engines:

* **Gray-code enumeration** of all ``2^k`` codewords — one XOR and one popcount
  per codeword (the last ``b`` basis rows are tabulated so that the innermost loop
  is a long, vectorised scan). Chosen when ``2^k`` is cheaper than the alternative.
* **Brouwer–Zimmermann** — generator matrices in systematic form on successive
  information sets (disjoint where the code allows it, with the rank ``r_j`` of each
  new set); after all combinations of at most ``w`` rows of every matrix have been
  enumerated, every codeword not yet seen has weight at least
  ``sum_j max(0, w + 1 - (k - r_j))`` (Zimmermann's refinement), and the search
  stops as soon as that lower bound meets the lightest codeword seen. Weights of
  even (doubly even) codes are multiples of 2 (4), which rounds the bound up.
  With automorphisms — cyclic or quasi-cyclic structure, detected and checked, or
  permutations given by the user and checked — one enumeration is credited to every
  image of its information set under the group (the group average, and for cyclic
  codes of rate at most about 1/2 the windows of ``k`` consecutive positions that
  start at a one, after Grassl [4]_); the plan with the least work is taken and its
  argument named in the result (``_bz.make_plans`` proves each bound).

And a third for high rate, the **dual-side route** (``n - k <= 64``): the fewest
columns of a parity-check matrix that sum to zero. One fast upper bound,
**information-set decoding** in the style of Lee–Brickell: random information sets, and
the sums of at most two rows of each systematic generator.

The package's rooms: ``_result`` (the result, the clock, the best word), ``_gray``,
``_bz`` (the plans, their proved bounds, and the level tasks sent to other processes),
``_symmetry`` (automorphisms: detection, checking, orbits), ``_dual``, ``_routes`` (the
estimates and the choice) and ``_isd``; :func:`minimum_distance` runs the steps
(arguments, ISD pre-pass, route, work limit, the route itself, the result).

References
----------
.. [1] A. E. Brouwer, "Bounds on the size of linear codes", in *Handbook of Coding
   Theory*, V. S. Pless and W. C. Huffman (eds.), Elsevier, 1998, pp. 295-461,
   section on computing the minimum distance.
.. [2] K.-H. Zimmermann, "Integral Hecke modules, integral generalized Reed-Muller
   codes, and linear codes", Technical Report 3-96, Technische Universität
   Hamburg-Harburg, 1996.
.. [3] P. J. Lee and E. F. Brickell, "An observation on the security of
   McEliece's public-key cryptosystem", EUROCRYPT 1988, LNCS 330, pp. 275-280.
.. [4] M. Grassl, "Searching for linear codes with large minimum distance", in
   W. Bosma and J. Cannon (eds.), *Discovering Mathematics with Magma*, Springer,
   2006, pp. 287-313.
"""

from __future__ import annotations

import os
import time
from collections.abc import Sequence

import numpy as np

from .._util import past, rng
from ..code import Code
from ..exceptions import ClaimError, ParameterError, TooExpensiveError, check_int
from ..parallel import Executor
from ..typing import DISTANCE_METHODS, DistanceMethod, SeedLike, StopReason
from ._bz import RATE_BZ, Plan, bz_search, estimate_work
from ._dual import dual_columns_seconds, dual_search
from ._gray import gray_search, gray_seconds
from ._isd import distance_upper_bound, isd_pass, quick_distance
from ._result import INF, Best, DistanceResult, ProgressCallback, ProofClock
from ._routes import choose_engine, human_seconds, route_estimates
from ._symmetry import Symmetry, code_symmetry

__all__ = [
    "DistanceResult",
    "ProgressCallback",
    "minimum_distance",
    "has_distance_at_least",
    "distance_upper_bound",
    "quick_distance",
    "human_seconds",
    "estimate_work",
    "DEFAULT_MAX_WORK",
    "route_estimates",
    "dual_columns_seconds",
]

#: Without a time limit, :func:`minimum_distance` refuses work estimated above this
#: many codewords (about an hour on one core) and says so instead of hanging.
DEFAULT_MAX_WORK = 4 * 10**12


def minimum_distance(
    code: Code,
    *,
    time_limit: float | None = None,
    progress: ProgressCallback | None = None,
    target: int | None = None,
    method: DistanceMethod = "auto",
    max_work: int | None = DEFAULT_MAX_WORK,
    seed: SeedLike = 0,
    workers: int | None = 1,
    executor: Executor | None = None,
    automorphisms: Sequence[Sequence[int]] = (),
    use_symmetry: bool = True,
) -> DistanceResult:
    """Prove the minimum distance of ``code`` (or as much as the time limit allows).

    Parameters
    ----------
    code : Code
    time_limit : float, optional
        Seconds. When it runs out the proved interval is returned (``exact`` false).
    progress : callable, optional
        ``progress(done, total, info)``, called at most ten times a second.
    target : int, optional
        Only settle whether ``d >= target``: stop at the first codeword lighter than
        ``target`` or when the lower bound reaches it.
    method : {"auto", "gray", "brouwer-zimmermann", "dual-columns"}
        The exact route; ``"auto"`` estimates the time of each and takes the cheapest
        (the result names it and says why). ``"dual-columns"`` (for ``n - k <= 64``)
        searches for the fewest columns of a parity-check matrix that sum to zero.
    max_work : int or None
        Without a time limit, refuse (raise :class:`TooExpensiveError`) when the
        estimated number of codewords exceeds this. ``None`` never refuses.
    seed : int or numpy.random.Generator
        For the short information-set-decoding pass that finds a good first upper
        bound (it only speeds up the proof and sharpens the work estimate).
    workers : int or None
        Threads for the Brouwer–Zimmermann enumeration (the kernels release the GIL);
        ``None`` means one per core. The proved result does not depend on it; which
        of several lightest codewords becomes the witness may.
    executor : gf2codes.parallel.Executor, optional
        Runs the large Brouwer–Zimmermann levels as independent tasks on other
        processes or a Dask cluster (small levels stay here, on ``workers`` threads).
        A level's lower bound is credited only when every one of its tasks completed,
        so the proved result is the one a serial run proves; once a task finds a
        codeword that settles the question the tasks not yet started are cancelled.
    automorphisms : sequence of permutations, optional
        Generators of a group of coordinate permutations (``i -> p[i]``, each a
        permutation of ``range(n)``) that map the code to itself. Each is checked (a
        wrong one raises :class:`ParameterError`, it never weakens the proof); the
        Brouwer–Zimmermann route then credits one enumeration to every image of its
        information set under the group.
    use_symmetry : bool
        Detect cyclic and quasi-cyclic structure (checked, like ``automorphisms``) for
        the Brouwer–Zimmermann route. ``False`` with no ``automorphisms`` runs the plain
        engine. The result's ``argument`` names the argument the bound rests on and
        ``symmetry`` the group used.

    Returns
    -------
    DistanceResult

    Raises
    ------
    TooExpensiveError
        If no time limit is given and the estimated work exceeds ``max_work``.

    References
    ----------
    .. [1] A. E. Brouwer, "Bounds on the size of linear codes", in *Handbook of Coding
       Theory*, V. S. Pless and W. C. Huffman (eds.), Elsevier, 1998, pp. 295-461.
    .. [2] K.-H. Zimmermann, "Integral Hecke modules, integral generalized Reed-Muller
       codes, and linear codes", Technical Report 3-96, Technische Universität
       Hamburg-Harburg, 1996.
    .. [3] M. Grassl, "Searching for linear codes with large minimum distance", in
       *Discovering Mathematics with Magma*, Springer, 2006, pp. 287-313.

    Examples
    --------
    >>> from gf2codes.code import Code
    >>> C = Code([[1, 0, 0, 0, 0, 1, 1], [0, 1, 0, 0, 1, 0, 1],
    ...           [0, 0, 1, 0, 1, 1, 0], [0, 0, 0, 1, 1, 1, 1]])
    >>> minimum_distance(C).describe()
    'd = 3 (proved)'
    """
    target, workers = _validate(code, target, method, workers)
    clock = ProofClock(time_limit, progress)
    best = Best(code.n)
    start_lower = code.weight_divisor  # every nonzero weight is a positive multiple of it
    symmetry = _symmetry(code, method, automorphisms, use_symmetry)
    weight, word, codewords_pre = _pre_pass(code, method, target, time_limit, rng(seed),
                                            symmetry)
    best.offer(weight, word)
    engine, estimates, reason = _route(code, method, best.weight, target, symmetry)
    clock.total = _affordable(code, engine, estimates[engine], time_limit, max_work)
    info_sets: list[dict] = []
    plan: list[Plan] = []
    dual_argument: list[str] = []
    lower, stopped = _run_route(code, engine, clock, best, target, start_lower, workers,
                                executor, info_sets, symmetry, plan, dual_argument)
    lower = min(lower, best.weight)
    _check_claims(code, lower, best.weight)
    return DistanceResult(
        lower=int(lower), upper=int(best.weight), witness=best.witness(),
        exact=lower == best.weight, method=engine, codewords=clock.done + codewords_pre,
        seconds=clock.elapsed(), stopped=None if lower == best.weight else stopped,
        reason=reason, estimates={e: float(v) for e, v in estimates.items()},
        information_sets=tuple(dict(x) for x in info_sets),
        argument=plan[0].argument if plan else (dual_argument[0] if dual_argument else ""),
        symmetry=(plan[0].symmetry.to_dict() if plan and plan[0].symmetry is not None
                  and plan[0].argument != "zimmermann" else
                  symmetry.to_dict() if dual_argument and symmetry is not None else None),
    )


def _symmetry(code: Code, method: DistanceMethod, automorphisms: Sequence[Sequence[int]],
              use_symmetry: bool) -> Symmetry | None:
    """The checked automorphism group the Brouwer–Zimmermann route may use (None when
    that route cannot be taken or there is none). Given generators are always checked,
    so a wrong one is an error whichever route is taken."""
    if isinstance(automorphisms, (str, bytes)) or not isinstance(automorphisms, Sequence):
        raise ParameterError("Argument 'automorphisms' must be a list of permutations, not "
                             f"{type(automorphisms).__name__}.")
    may_use = method in ("auto", "brouwer-zimmermann", "dual-columns") and (
        code.k > 22 or method != "auto")
    detect = use_symmetry and may_use
    if not automorphisms and not detect:
        return None
    sym = code_symmetry(code, automorphisms, detect=detect)
    return sym if may_use else None


def _validate(code: Code, target: int | None, method: str, workers: int | None
              ) -> tuple[int | None, int]:
    """The arguments of :func:`minimum_distance` checked: (target, number of workers)."""
    if not isinstance(code, Code):
        raise ParameterError(f"Argument 'code' must be a Code, not {type(code).__name__}.")
    if target is not None:
        target = check_int("target", target, minimum=1)
    if method not in DISTANCE_METHODS:
        raise ParameterError(
            "Argument 'method' must be one of auto, gray, brouwer-zimmermann, dual-columns, "
            f"not {method!r}."
        )
    if method == "dual-columns" and code.n - code.k > 64:
        raise ParameterError(
            "Argument 'method' must not be dual-columns for a code with n - k = "
            f"{code.n - code.k} > 64 check bits, not {method!r}."
        )
    n_workers = (os.cpu_count() or 1) if workers is None else check_int("workers", workers,
                                                                       minimum=1)
    return target, n_workers


#: Passes of the high-rate pre-pass between two looks at the parity-check route's estimate.
_PASS_CHUNK = 5
#: Modelled seconds of one Lee-Brickell pass per generator row (9 ms for the 231 rows of
#: BCH [255,231] on one core of the development machine, AVX-512 host, load about 1).
_PASS_SECONDS_PER_ROW = 4e-5
#: Chunks of passes that a proof may cost for the pre-pass to stop after a chunk that
#: found no lighter word.
_STALE_CHUNKS = 4


def _pre_pass(code: Code, method: DistanceMethod, target: int | None,
              time_limit: float | None, gen: np.random.Generator,
              symmetry: Symmetry | None = None) -> tuple[int, np.ndarray, int]:
    """A quick randomised pass for a light codeword: (weight, packed word, codewords).

    A good upper bound early sharpens the work estimate of an exact proof. A target
    test (the search calls it for every candidate) needs no estimate of d and finds
    light words itself at the first levels, so it gets only a token pass.
    """
    divisor = code.weight_divisor
    passes = 5 if target is not None else min(200, 5 + 40 * code.n // max(code.k, 1))
    if code.k < 62 and (1 << code.k) <= passes * (code.k * (code.k + 1) // 2 + code.n):
        passes = 0  # enumerating every codeword costs less than the passes themselves
    # With a time limit, the pre-pass gets at most a quarter of it.
    deadline = None if time_limit is None else time.perf_counter() + 0.25 * time_limit
    if not (passes and method == "auto" and code.k > 22 and code.n - code.k <= 64):
        return isd_pass(code, gen, iterations=passes, deadline=deadline)
    # High rate: the parity-check route may prove d from the best word so far faster
    # than the remaining passes run (Hamming [4095,4083]: 45 passes took 15 s, the proof
    # under 1 ms; BCH [255,231]: 10 passes find the weight-7 word, the other 39 cost
    # 0.35 s, the proof 0.02 s). So the passes run in chunks, and stop once the route's
    # estimate from the best word is below the modelled cost of the next chunk. The
    # model (seconds per pass per generator row, measured on BCH [255,231]) is a
    # formula, not a clock, so the passes run are the same on any machine.
    best = isd_pass(code, gen, iterations=0, deadline=None)
    done = 0
    stale = False  # the last chunk found nothing lighter
    while done < passes and not past(deadline):
        goal = best[0] if target is None else min(best[0], target)
        chunk = min(_PASS_CHUNK, passes - done)
        proof = dual_columns_seconds(code.n, code.k, goal, divisor=divisor,
                                     start_lower=divisor, symmetry=symmetry)
        cost = chunk * _PASS_SECONDS_PER_ROW * code.k
        # Stop when the proof costs less than the next chunk, or costs only a few chunks
        # and the last chunk found nothing lighter (BCH [511,484]: the weight-7 word is
        # found early; the other passes cost half the proof and cannot find a lighter one).
        if proof < cost or (stale and proof < _STALE_CHUNKS * cost):
            break
        w, word, examined = isd_pass(code, gen, iterations=chunk, deadline=deadline)
        stale = w >= best[0]
        best = (w, word, best[2] + examined) if w < best[0] else (best[0], best[1],
                                                                  best[2] + examined)
        done += chunk
    return best


def _route(code: Code, method: DistanceMethod, upper: int, target: int | None,
           symmetry: Symmetry | None = None
           ) -> tuple[DistanceMethod, dict[str, float], str]:
    """The route to run, the estimated seconds of the routes considered, and why."""
    if method == "auto":
        return choose_engine(code, upper, target, symmetry=symmetry)
    estimates: dict[str, float] = {}
    if method == "gray":
        estimates["gray"] = gray_seconds(code.k)
    elif method == "brouwer-zimmermann":
        estimates[method] = estimate_work(code, upper, target=target,
                                          symmetry=symmetry) / RATE_BZ
    else:
        estimates = {method: route_estimates(code, upper, target)[method]}
    return method, estimates, "asked for"


def _affordable(code: Code, engine: DistanceMethod, seconds: float,
                time_limit: float | None, max_work: int | None) -> int:
    """The work of the route in codewords (for the dual-side route, the codewords of the
    same time); raises :class:`TooExpensiveError` above ``max_work`` without a time limit."""
    if engine == "gray":
        cost = (1 << code.k) if code.k < 62 else INF
    else:
        cost = int(min(seconds * RATE_BZ, INF))
    if time_limit is None and max_work is not None and cost > max_work:
        raise TooExpensiveError(
            f"proving the minimum distance of this [{code.n},{code.k}] code needs about "
            f"{cost:.2g} codewords or their equivalent (roughly {human_seconds(seconds)} on "
            "one core); pass time_limit= for a proved interval, or use quick_distance() for "
            "a fast one.",
            work=cost, seconds=seconds,
        )
    return cost


def _run_route(code: Code, engine: DistanceMethod, clock: ProofClock, best: Best,
               target: int | None, start_lower: int, workers: int,
               executor: Executor | None, info_sets: list[dict],
               symmetry: Symmetry | None = None, plan: list[Plan] | None = None,
               dual_argument: list[str] | None = None) -> tuple[int, StopReason | None]:
    """Run the chosen route: (proved lower bound, why it stopped before proving d)."""
    if engine == "gray":
        return _gray_route(code, clock, best, target, start_lower)
    if engine == "dual-columns":
        return dual_search(code, clock, best, target, start_lower, symmetry, dual_argument)
    return bz_search(code, clock, best, target, start_lower, workers, executor,
                     sets_out=info_sets, symmetry=symmetry, plan_out=plan)


def _gray_route(code: Code, clock: ProofClock, best: Best, target: int | None,
                start_lower: int) -> tuple[int, StopReason | None]:
    """Gray-code enumeration of every codeword (stopping early for a target test)."""
    stop_at = start_lower if target is None else max(start_lower, target - 1)
    interrupted = False
    try:
        complete = gray_search(code, clock, best, stop_at)
    except KeyboardInterrupt:
        complete, interrupted = False, True
    if complete or best.weight <= start_lower:
        return best.weight, None
    if target is not None and best.weight < target:
        return start_lower, "below target"
    return start_lower, "interrupted" if interrupted else "time limit"


def has_distance_at_least(code: Code, target: int, *, time_limit: float | None = None,
                          progress: ProgressCallback | None = None) -> bool | None:
    """Settle ``d >= target`` as fast as possible: True, False, or None (time ran out).

    >>> from gf2codes.code import Code
    >>> has_distance_at_least(Code([[1, 1, 1, 1]]), 4)
    True
    """
    r = minimum_distance(code, time_limit=time_limit, progress=progress, target=target,
                         max_work=None)
    return r.at_least(target)


def _check_claims(code: Code, lower: int, upper: int) -> None:
    """Bounds stated for the code (by its construction or its file) must agree with proof."""
    label = f"{code.name!r} " if code.name else ""
    if code.d_lower is not None and upper < code.d_lower:
        raise ClaimError(
            f"the code {label}[{code.n},{code.k}] is stated to have d >= "
            f"{code.d_lower}, but it has a codeword of weight {upper}: the statement is wrong."
        )
    if code.d_upper is not None and lower > code.d_upper:
        raise ClaimError(
            f"the code {label}[{code.n},{code.k}] is stated to have d <= "
            f"{code.d_upper}, but d >= {lower} is proved: the statement is wrong."
        )
