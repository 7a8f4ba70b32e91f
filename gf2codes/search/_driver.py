"""The search driver: a portfolio of strategies under a time limit.

The three questions (least ``n`` for ``(k, d)``, greatest ``d`` for ``(n, k)``,
greatest ``k`` for ``(n, d)``) are one problem seen three ways: find a binary
linear ``[n, k, >= D]`` code for a sequence of ever better targets. The driver

1. takes the bound (least length, or greatest distance or dimension, that the upper
   bounds of :mod:`gf2codes.bounds` allow) and an incumbent: the best of the
   starting codes, of a trivial code that always exists (disjoint repetition
   blocks), and of a *warm start* — the deterministic, exhaustible strategies
   (``families``, ``lexicode``) tried from the bound towards the incumbent;
2. then works on the target one step better than the incumbent with the whole
   portfolio: each step of the schedule gives one unit of work (one ``next()``) to
   the strategy with the fewest units relative to its credit, where credit grows
   with the targets the strategy has already won (a deterministic bandit: the
   schedule depends on work counts only, never on the clock);
3. applies the target test to every candidate (:func:`~._base.target_test`:
   an exact screen that stops at the first light codeword, then
   :func:`gf2codes.distance.minimum_distance` with ``target=``), proves each new
   winner's distance exactly, and moves to the next target;
4. stops when the bound is attained (the result is then optimal), when every
   strategy is exhausted at the current target, at the time or candidate limit,
   or on Ctrl-C (``KeyboardInterrupt``) — always returning the best proved result.

The clock only cuts the run short: with a step limit (``max_steps``, units of
strategy work) instead of a time limit, the same seed gives the same result.
"""

from __future__ import annotations

import time
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field
from typing import Any

import numpy as np

from .. import bounds, derive, families, formats
from ..code import Code
from ..distance import minimum_distance
from ..exceptions import ParameterError, check_int
from ._base import Strategy, target_test

__all__ = ["SearchResult", "run_search", "MODES"]

#: mode -> (quantity optimised, JSON key of the optimality flag, JSON key of the bound)
MODES = {
    "length": ("n", "proven_shortest", "n_lower_bound"),
    "distance": ("d", "proven_optimal", "d_upper_bound"),
    "dimension": ("k", "proven_optimal", "k_upper_bound"),
}

#: ``progress(done, total, info)`` with ``done`` and ``total`` in milliseconds and
#: ``info["note"]`` a one-line status (target, best, candidates per second).
Progress = Callable[[int, int, dict], None]

#: ``on_winner(code, d, info)``: called with every new proved best code.
OnWinner = Callable[[Code, int, dict], None]

_WARM_VALUES = 48  # values of the optimised quantity tried by the warm start
_WIN_CREDIT = 3  # extra credit per target won


@dataclass(frozen=True)
class SearchResult:
    """The outcome of a search.

    Attributes
    ----------
    mode : str
        ``"length"``, ``"distance"`` or ``"dimension"``.
    code : Code
        The best code found; its distance is proved (at least ``d_lower``).
    n, k : int
        Parameters of :attr:`code`.
    d : int or None
        The proved minimum distance of :attr:`code` (``None`` if only ``d_lower`` was
        proved within the time given to the proof).
    d_lower : int
        A proved lower bound on the distance (``d`` when that is proved).
    optimal : bool
        True when the bound is attained: no shorter code (``length``), none with a
        larger distance (``distance``) or dimension (``dimension``) exists. When
        false, the value found is only an upper (lower) bound on the optimum.
    bound : int
        The least length / greatest distance / greatest dimension the bounds allow.
    bound_by : str
        The bound that gives it.
    target : tuple of int
        The ``(n, k, d)`` asked for (the optimised one is the value found).
    strategy : str
        Who found the code: a strategy name, ``"start"`` or ``"trivial"``.
    seed : int
    seconds : float
    candidates : int
        Candidates given the target test.
    stopped : str
        ``"bound attained"``, ``"time limit"``, ``"step limit"``,
        ``"exhausted"`` (every strategy had nothing more for ``open_target``) or
        ``"interrupted"``.
    open_target : tuple of int or None
        The ``(n, k, d)`` under work when the search stopped (not found).
    stats : dict
        Per strategy: ``units`` of work, ``candidates``, ``wins``.
    """

    mode: str
    code: Code
    d: int | None
    d_lower: int
    optimal: bool
    bound: int
    bound_by: str
    target: tuple[int, int, int]
    strategy: str
    seed: int
    seconds: float
    candidates: int
    stopped: str
    open_target: tuple[int, int, int] | None = None
    stats: dict[str, dict[str, int]] = field(default_factory=dict)

    @property
    def n(self) -> int:
        return self.code.n

    @property
    def k(self) -> int:
        return self.code.k

    @property
    def value(self) -> int:
        """The optimised quantity (``n``, ``d`` or ``k``) of the code found."""
        return {"length": self.n, "distance": self.d_lower, "dimension": self.k}[self.mode]

    def statement(self) -> str:
        """One plain sentence on what is proved about optimality."""
        n, k, d = self.n, self.k, self.d if self.d is not None else self.d_lower
        what = f"[{n},{k},{d}]" if self.d is not None else f"[{n},{k},>={d}]"
        if self.mode == "length":
            if self.optimal:
                return (f"{what} is proved shortest: no [{n - 1},{k},{self.target[2]}] code "
                        f"exists ({self.bound_by}).")
            return (f"{what} is the shortest found; n = {n} is only an upper bound on the "
                    f"shortest length, which the bounds put at >= {self.bound} "
                    f"({self.bound_by}).")
        if self.mode == "distance":
            if self.optimal:
                return f"{what} has the greatest possible distance ({self.bound_by})."
            return (f"d = {self.d_lower} is the best found, only a lower bound on the best "
                    f"possible; the bounds allow d <= {self.bound} ({self.bound_by}).")
        if self.optimal:
            return f"{what} has the greatest possible dimension ({self.bound_by})."
        return (f"k = {k} is the best found, only a lower bound on the best possible; the "
                f"bounds allow k <= {self.bound} ({self.bound_by}).")

    def to_dict(self) -> dict[str, Any]:
        """JSON-ready summary; keys as in :data:`MODES` for the flag and the bound."""
        _, flag, bound_key = MODES[self.mode]
        out: dict[str, Any] = {
            "mode": self.mode, "n": self.n, "k": self.k, "d": self.d, "d_lower": self.d_lower,
            "generator": formats.rows_to_strings(self.code.G),
            flag: self.optimal, bound_key: self.bound, f"{bound_key}_by": self.bound_by,
            "target": {"n": self.target[0], "k": self.target[1], "d": self.target[2]},
            "strategy": self.strategy, "seed": self.seed,
            "seconds": round(self.seconds, 3), "candidates": self.candidates,
            "stopped": self.stopped,
            "open_target": None if self.open_target is None else
            {"n": self.open_target[0], "k": self.open_target[1], "d": self.open_target[2]},
            "recipe": [dict(s) for s in self.code.recipe], "statement": self.statement(),
            "strategies": self.stats,
        }
        return out


# ----------------------------------------------------------------------------- helpers
def _blocks(n: int, k: int) -> Code:
    """``k`` disjoint repetition blocks covering ``n`` coordinates: ``d = floor(n / k)``."""
    G = np.zeros((k, n), dtype=np.uint8)
    sizes = [n // k + (1 if i < n % k else 0) for i in range(k)]
    start = 0
    for i, s in enumerate(sizes):
        G[i, start:start + s] = 1
        start += s
    return families.from_rows(G).with_info(name=f"repetition blocks [{n},{k}]")


def _pad(code: Code, n: int) -> Code:
    """Append ``n - code.n`` zero coordinates (length fixed, distance unchanged)."""
    G = np.hstack([code.G, np.zeros((code.k, n - code.n), dtype=np.uint8)])
    return families.from_rows(G).with_info(name=code.name)


def _pivots(code: Code) -> list[int]:
    return [int(np.flatnonzero(row)[0]) for row in code.rref_generator]


def _shorten_to(code: Code, k: int) -> Code:
    """Shorten on ``code.k - k`` information-set coordinates: ``[n - (k' - k), k]``."""
    extra = code.k - k
    if extra <= 0:
        return code
    return derive.shorten(code, sorted(_pivots(code)[:extra]))


def _subcode(code: Code, k: int) -> Code:
    """The first ``k`` rows of the reduced echelon generator (distance can only grow)."""
    if code.k <= k:
        return code
    sub = families.from_rows(code.rref_generator[:k])
    return sub.with_info(name=code.name)


class _Clock:
    def __init__(self, time_limit: float | None) -> None:
        self.start = time.perf_counter()
        self.deadline = None if time_limit is None else self.start + time_limit

    def expired(self) -> bool:
        return self.deadline is not None and time.perf_counter() >= self.deadline

    def left(self) -> float | None:
        return None if self.deadline is None else max(0.0, self.deadline - time.perf_counter())

    def elapsed(self) -> float:
        return time.perf_counter() - self.start


class _Stop(Exception):
    """Internal: a limit was reached (the reason is the message)."""


# ----------------------------------------------------------------------------- driver
def run_search(
    mode: str,
    *,
    n: int | None = None,
    k: int | None = None,
    d: int | None = None,
    strategies: Sequence[Strategy],
    time_limit: float | None = 60.0,
    max_steps: int | None = None,
    seed: int = 0,
    start: Sequence[Code] = (),
    progress: Progress | None = None,
    on_winner: OnWinner | None = None,
    prove_time: float | None = None,
    exhaustive_nodes: int = 200_000,
) -> SearchResult:
    """Run the portfolio (see the module docstring). Arguments are validated by the callers
    in :mod:`gf2codes.search`; ``n``, ``k``, ``d`` are the two fixed parameters."""
    clock = _Clock(time_limit)
    seed = int(seed)
    fixed = {"n": n, "k": k, "d": d}
    if mode == "length":
        lb = bounds.least_length(k, d)
        bound, bound_by = lb.n, lb.by
    elif mode == "distance":
        ub = bounds.best_upper(n, k)
        bound, bound_by = ub.d, ub.by
    else:
        db = bounds.max_dimension(n, d)
        bound, bound_by = db.k, db.by
    smaller_better = mode == "length"
    bound_state: dict[str, Any] = {"bound": bound, "by": bound_by}

    def target_of(v: int) -> tuple[int, int, int]:
        if mode == "length":
            return v, k, d
        if mode == "distance":
            return n, k, v
        return n, v, d

    def better(a: int, b: int | None) -> bool:
        return b is None or (a < b if smaller_better else a > b)

    def step_better(v: int) -> int:
        return v - 1 if smaller_better else v + 1

    def beyond_bound(v: int) -> bool:
        b = bound_state["bound"]
        return v < b if smaller_better else v > b

    stats = {s.name: {"units": 0, "candidates": 0, "wins": 0} for s in strategies}
    state: dict[str, Any] = {"best": None, "value": None, "d": None, "d_lower": 0, "by": "",
                             "candidates": 0, "steps": 0, "open": None, "last_report": 0.0}

    def report(note_target: tuple[int, int, int] | None, force: bool = False) -> None:
        if progress is None:
            return
        now = clock.elapsed()
        if not force and now - state["last_report"] < 0.1:
            return
        state["last_report"] = now
        rate = state["candidates"] / now if now > 0 else 0.0
        q = MODES[mode][0]
        parts = []
        if note_target is not None:
            parts.append(f"trying [{note_target[0]},{note_target[1]},{note_target[2]}]")
        if state["value"] is not None:
            parts.append(f"best {q}={state['value']}")
        parts.append(f"{rate:,.0f} cand/s")
        total = int(1000 * time_limit) if time_limit is not None else int(1000 * now) + 1
        progress(int(1000 * now), total, {"note": " · ".join(parts), "target": note_target,
                                          "best": state["value"], "rate": rate})

    def check_limits() -> None:
        if clock.expired():
            raise _Stop("time limit")
        if max_steps is not None and state["steps"] >= max_steps:
            raise _Stop("step limit")

    def prove(code: Code, D: int, limit: float) -> tuple[int | None, int]:
        r = minimum_distance(code, time_limit=limit, max_work=None, workers=1, seed=seed)
        lower = max(D, r.lower)
        return (r.upper if r.exact else None), lower

    def accept(code: Code, D: int, who: str) -> bool:
        """Target-test ``code`` against ``[n, k, >= D]`` (after fitting); keep it if better."""
        if mode == "length":
            if code.k < k:
                return False
        else:
            if code.n < n:
                code = _pad(code, n)
            if code.n != n or code.k < (k if mode == "distance" else 1):
                return False
        state["candidates"] += 1
        if who in stats:
            stats[who]["candidates"] += 1
        left = clock.left()
        ok = target_test(code, D, time_limit=None if left is None else max(left, 1e-3))
        if not ok:
            return False
        if mode == "length":
            code = _shorten_to(code, k)
        elif mode == "distance":
            code = _subcode(code, k)
        d_exact, d_lower = None, D
        if mode == "distance":  # a short proof may show more than the target
            d_exact, d_lower = prove(code, D, 0.5)
        value = {"length": code.n, "distance": d_lower, "dimension": code.k}[mode]
        if not better(value, state["value"]):
            return False
        state.update(best=code, value=value, d=d_exact, d_lower=d_lower, by=who)
        if who in stats:
            stats[who]["wins"] += 1
        return True

    def done() -> bool:
        return state["value"] is not None and beyond_bound(step_better(state["value"]))

    def close_by_exhaustion() -> None:
        """Decide the target one step better than the incumbent by exhaustive search.

        A "none" is a proof that the incumbent is optimal: the bound moves to it and the
        search is done. An "exists" comes with a witness, accepted like any candidate
        (then the next target is decided). Undecided (node budget, clock) leaves the
        question to the portfolio. Uses :mod:`gf2codes.existence`, independent of the
        strategies; a ``[n, k, >= d]`` code for the target exists iff one with that
        exact n and k does (pad or shorten), so the decision is at the target itself.
        """
        from ..existence import MAX_REDUNDANCY, decide_existence

        while state["value"] is not None and not done() and exhaustive_nodes > 0:
            tgt = target_of(step_better(state["value"]))
            tn, tk, td = tgt
            if not (1 <= tk <= tn) or tn - tk > MAX_REDUNDANCY:
                return
            left = clock.left()
            if left is not None and left <= 0:
                return
            report(tgt, force=True)
            dec = decide_existence(tn, tk, td, max_nodes=exhaustive_nodes,
                                   time_limit=None if left is None else max(left, 1e-3))
            stats.setdefault("exhaustive", {"units": 0, "candidates": 0, "wins": 0})
            stats["exhaustive"]["units"] += dec.nodes
            if dec.stopped == "interrupted":
                raise KeyboardInterrupt
            if dec.status == "none":
                bound_state["bound"] = state["value"]
                bound_state["by"] = f"exhaustive search, {dec.nodes:,} nodes"
                return
            if dec.status != "exists":
                return
            if not accept(families.from_rows(np.array(dec.generator(), dtype=np.uint8))
                          .with_info(name=f"exhaustive search [{tn},{tk},{td}]"),
                          td, "exhaustive"):
                return  # pragma: no cover - a witness is always a valid candidate

    def rng_for(index: int, target: tuple[int, int, int]) -> np.random.Generator:
        return np.random.default_rng([seed, index, *target])

    stopped = "exhausted"
    try:
        # 1. incumbent: the trivial code, then the starting codes
        if mode == "length":
            accept(_blocks(k * d, k), d, "trivial")
        elif mode == "distance":
            accept(_blocks(n, k), max(1, n // k), "trivial")
        else:
            accept(_blocks(n, max(1, n // d)), d, "trivial")
        for code in start:
            check_limits()
            if mode == "distance":
                if code.n == n and code.k >= k:
                    _, dl = prove(code, 1, 2.0)
                    if better(dl, state["value"]):
                        accept(code, dl, "start")
            else:
                accept(code, fixed["d"], "start")
        # 2. warm start: exhaustible deterministic strategies, from the bound outwards
        warm = [(i, s) for i, s in enumerate(strategies) if s.name in ("families", "lexicode")]
        v = bound
        tried = 0
        while warm and not done() and better(v, state["value"]) and tried < _WARM_VALUES:
            tgt = target_of(v)
            report(tgt, force=True)
            found = False
            for i, s in warm:
                for cand in s.candidates(*tgt, rng_for(i, tgt)):
                    check_limits()
                    state["steps"] += 1
                    stats[s.name]["units"] += 1
                    report(tgt)
                    if cand is not None and accept(cand, tgt[2], s.name):
                        found = True
                        break
                if found:
                    break
            if found:
                break
            tried += 1
            v = v + 1 if smaller_better else v - 1
        close_by_exhaustion()
        # 3. the portfolio, one target at a time
        while not done():
            tgt = target_of(step_better(state["value"]))
            state["open"] = tgt
            report(tgt, force=True)
            iters: dict[int, Any] = {}
            live = list(range(len(strategies)))
            units = [0] * len(strategies)
            won = False
            while live and not won:
                check_limits()
                credit = [1 + _WIN_CREDIT * stats[strategies[i].name]["wins"] for i in live]
                i = min(zip(live, credit, strict=True), key=lambda t: units[t[0]] / t[1])[0]
                s = strategies[i]
                if i not in iters:
                    iters[i] = iter(s.candidates(*tgt, rng_for(i, tgt)))
                try:
                    cand = next(iters[i])
                except StopIteration:
                    live.remove(i)
                    continue
                units[i] += 1
                state["steps"] += 1
                stats[s.name]["units"] += 1
                report(tgt)
                if cand is not None and accept(cand, tgt[2], s.name):
                    won = True
            if not won:
                stopped = "exhausted"
                break
            state["open"] = None
            close_by_exhaustion()
        else:
            stopped = "bound attained"
    except _Stop as stop:
        stopped = str(stop)
    except KeyboardInterrupt:
        stopped = "interrupted"
    if state["best"] is None:  # interrupted before even the trivial code was accepted
        raise KeyboardInterrupt
    if done():
        stopped, state["open"] = "bound attained", None
    best: Code = state["best"]
    if not best.recipe:  # a searched matrix: its rows are its recipe
        best = families.from_rows(best.G).with_info(name=best.name)
    # the winner's distance, proved exactly (given its own time: short after Ctrl-C)
    try:
        limit = prove_time if prove_time is not None else (
            2.0 if stopped == "interrupted" else 30.0)
        d_exact, d_lower = prove(best, state["d_lower"], limit)
    except KeyboardInterrupt:
        d_exact, d_lower = state["d"], state["d_lower"]
        stopped = "interrupted"
    if on_winner is not None:
        on_winner(best, d_exact if d_exact is not None else d_lower,
                  {"strategy": state["by"], "seed": seed, "exact": d_exact is not None,
                   "mode": mode})
    return SearchResult(
        mode=mode, code=best, d=d_exact, d_lower=d_lower, optimal=done(),
        bound=bound_state["bound"], bound_by=bound_state["by"], target=(n, k, d),
        strategy=state["by"], seed=seed, seconds=clock.elapsed(),
        candidates=state["candidates"], stopped=stopped, open_target=state["open"],
        stats=stats,
    )


def validate(mode: str, n: object, k: object, d: object, time_limit: object,
             max_steps: object) -> tuple[int | None, int | None, int | None]:
    """Check the two fixed parameters and the limits; raise :class:`ParameterError`."""
    if time_limit is not None and (isinstance(time_limit, bool)
                                   or not isinstance(time_limit, (int, float))
                                   or not time_limit > 0):
        raise ParameterError(f"Argument 'time_limit' must be positive, not {time_limit!r}.")
    if max_steps is not None:
        check_int("max_steps", max_steps, minimum=1)
    if mode == "length":
        return None, check_int("k", k, minimum=1), check_int("d", d, minimum=1)
    n = check_int("n", n, minimum=1)
    if mode == "distance":
        return n, check_int("k", k, minimum=1, maximum=n), None
    return n, None, check_int("d", d, minimum=1, maximum=n)
