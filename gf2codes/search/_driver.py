"""The search driver: a portfolio of strategies under a time limit.

The three questions (least ``n`` for ``(k, d)``, greatest ``d`` for ``(n, k)``,
greatest ``k`` for ``(n, d)``; one object each, :mod:`gf2codes.questions`) are one
problem seen three ways: find a binary linear ``[n, k, >= D]`` code for a sequence of
ever better targets. The driver (:class:`Driver`, one method per step)

1. takes the bound (least length, or greatest distance or dimension, that the upper
   bounds of :mod:`gf2codes.bounds` allow) and an incumbent: the best of the
   starting codes, of a trivial code that always exists (disjoint repetition
   blocks), and of a *warm start* — the strategies that declare themselves
   ``warm`` (cheap, deterministic, finite: ``families``, ``lexicode``) tried from the
   bound towards the incumbent;
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

from collections.abc import Callable, Iterator, Sequence
from dataclasses import dataclass, field
from typing import Any, TypedDict

import numpy as np

from .. import families, formats
from .._util import Clock
from ..code import Code
from ..distance import minimum_distance
from ..exceptions import ParameterError, check_int
from ..questions import QUESTION_TYPES, SearchQuestion
from ..typing import Question, StopReason
from ._base import Strategy, pad_to, repetition_blocks, shorten_to, subcode, target_test

__all__ = ["SearchResult", "Driver", "run_search", "check_limits", "MODES", "WinnerInfo"]

#: mode -> (quantity optimised, JSON key of the optimality flag, JSON key of the bound)
MODES: dict[Question, tuple[str, str, str]] = {
    mode: (cls.quantity, cls.flag_key, cls.bound_key) for mode, cls in QUESTION_TYPES.items()
}


class WinnerInfo(TypedDict):
    """What ``on_winner`` is told about the winner beside the code and its distance."""

    strategy: str
    seed: int
    #: True when the distance given is the exact minimum distance (False: a lower bound).
    exact: bool
    mode: Question


#: ``progress(done, total, info)`` with ``done`` and ``total`` in milliseconds and
#: ``info["note"]`` a one-line status (target, best, candidates per second).
Progress = Callable[[int, int, dict], None]

#: ``on_winner(code, d, info)``: called with every new proved best code.
OnWinner = Callable[[Code, int, WinnerInfo], None]

_WARM_VALUES = 48  # values of the optimised quantity tried by the warm start
_WIN_CREDIT = 3  # extra credit per target won


@dataclass(frozen=True)
class SearchResult:
    """The outcome of a search.

    Attributes
    ----------
    question : gf2codes.questions.SearchQuestion
        The question answered; ``mode`` is its name (``"length"``, ``"distance"`` or
        ``"dimension"``) and ``target`` its given values.
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
    target : tuple of int or None
        The ``(n, k, d)`` asked for (``None`` for the optimised one).
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

    question: SearchQuestion
    code: Code
    d: int | None
    d_lower: int
    optimal: bool
    bound: int
    bound_by: str
    strategy: str
    seed: int
    seconds: float
    candidates: int
    stopped: StopReason
    open_target: tuple[int, int, int] | None = None
    stats: dict[str, dict[str, int]] = field(default_factory=dict)

    @property
    def n(self) -> int:
        return self.code.n

    @property
    def k(self) -> int:
        return self.code.k

    @property
    def mode(self) -> Question:
        return self.question.mode

    @property
    def target(self) -> tuple[int | None, int | None, int | None]:
        return self.question.given

    @property
    def value(self) -> int:
        """The optimised quantity (``n``, ``d`` or ``k``) of the code found."""
        return self.question.value_of(self.n, self.k, self.d_lower)

    def statement(self) -> str:
        """One plain sentence on what is proved about optimality."""
        return self.question.statement(self.n, self.k, self.d, self.d_lower,
                                       optimal=self.optimal, bound=self.bound,
                                       bound_by=self.bound_by)

    def to_dict(self) -> dict[str, Any]:
        """JSON-ready summary; keys as in :data:`MODES` for the flag and the bound."""
        flag, bound_key = self.question.flag_key, self.question.bound_key
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


# ----------------------------------------------------------------------------- limits
def check_limits(time_limit: object, max_steps: object, seed: object = 0) -> None:
    """Check a search's limits and seed; raise :class:`ParameterError`.

    ``time_limit`` is None or positive seconds, ``max_steps`` None or an integer >= 1,
    ``seed`` an integer >= 0 (the rule of :func:`gf2codes._util.rng`).
    """
    if time_limit is not None and (isinstance(time_limit, bool)
                                   or not isinstance(time_limit, (int, float))
                                   or not time_limit > 0):
        raise ParameterError(f"Argument 'time_limit' must be positive, not {time_limit!r}.")
    if max_steps is not None:
        check_int("max_steps", max_steps, minimum=1)
    check_int("seed", seed, minimum=0)


class _Stop(Exception):
    """Internal: a limit was reached."""

    def __init__(self, reason: StopReason) -> None:
        super().__init__(reason)
        self.reason: StopReason = reason


#: Work budget of one exhaustive decision inside a search, in candidate-row tests (see
#: :func:`gf2codes.existence.decide_existence`): about 2-4 s of the compiled backtrack on
#: one core. A node budget alone let a step-limited search spend hours on a cell with 15
#: check bits ([33,18,7]: ~30 ms a node near the root, against ~40 us a node for
#: [26,13,8]). A target that needs more is left to the portfolio, and to
#: ``gf2codes bounds --n --k --d``, whose budget the user sets.
EXHAUSTIVE_WORK = 10_000_000_000


# ----------------------------------------------------------------------------- driver
class Driver:
    """One search for one question (see the module docstring); :meth:`run` it once.

    The steps, in order: :meth:`incumbent` (trivial and starting codes),
    :meth:`warm_start`, then :meth:`round` after :meth:`round` (one target each, with
    :meth:`close_by_exhaustion` after every win), and :meth:`prove_winner`.
    """

    def __init__(self, question: SearchQuestion, strategies: Sequence[Strategy], *,
                 time_limit: float | None = 60.0, max_steps: int | None = None,
                 seed: int = 0, progress: Progress | None = None,
                 on_winner: OnWinner | None = None, prove_time: float | None = None,
                 exhaustive_nodes: int = 200_000) -> None:
        self.clock = Clock(time_limit)
        self.q = question
        self.strategies = list(strategies)
        self.time_limit, self.max_steps, self.seed = time_limit, max_steps, int(seed)
        self.progress, self.on_winner = progress, on_winner
        self.prove_time, self.exhaustive_nodes = prove_time, exhaustive_nodes
        self.bound, self.bound_by = question.bound()
        self.stats = {s.name: {"units": 0, "candidates": 0, "wins": 0} for s in strategies}
        self.best: Code | None = None
        self.value: int | None = None  # the optimised quantity of the incumbent
        self.d_exact: int | None = None
        self.d_lower = 0
        self.by = ""
        self.candidates = 0
        self.steps = 0
        self.open: tuple[int, int, int] | None = None
        self.last_report = 0.0

    # ------------------------------------------------------------------ bookkeeping
    def report(self, target: tuple[int, int, int] | None, force: bool = False) -> None:
        """Call ``progress`` (at most every 0.1 s unless forced)."""
        if self.progress is None:
            return
        now = self.clock.elapsed()
        if not force and now - self.last_report < 0.1:
            return
        self.last_report = now
        rate = self.candidates / now if now > 0 else 0.0
        parts = []
        if target is not None:
            parts.append(f"trying [{target[0]},{target[1]},{target[2]}]")
        if self.value is not None:
            parts.append(f"best {self.q.quantity}={self.value}")
        parts.append(f"{rate:,.0f} cand/s")
        total = (int(1000 * self.time_limit) if self.time_limit is not None
                 else int(1000 * now) + 1)
        self.progress(int(1000 * now), total, {"note": " · ".join(parts), "target": target,
                                               "best": self.value, "rate": rate})

    def check_stop(self) -> None:
        """Raise :class:`_Stop` at the time or step limit."""
        if self.clock.expired():
            raise _Stop("time limit")
        if self.max_steps is not None and self.steps >= self.max_steps:
            raise _Stop("step limit")

    def done(self) -> bool:
        """True when the incumbent attains the bound (nothing better can exist)."""
        return self.value is not None and self.q.beyond(self.q.step_better(self.value),
                                                        self.bound)

    def rng_for(self, index: int, target: tuple[int, int, int]) -> np.random.Generator:
        """The generator of strategy ``index`` at ``target``: independent of the schedule."""
        return np.random.default_rng([self.seed, index, *target])

    def prove(self, code: Code, D: int, limit: float) -> tuple[int | None, int]:
        """``(exact d or None, proved lower bound >= D)`` within ``limit`` seconds."""
        r = minimum_distance(code, time_limit=limit, max_work=None, workers=1, seed=self.seed)
        return (r.upper if r.exact else None), max(D, r.lower)

    def fit(self, code: Code) -> Code | None:
        """The candidate fitted to the given length (zero coordinates appended), or None
        when it cannot answer the question (too long, or too small a dimension)."""
        n, k, _ = self.q.given
        if n is not None:
            if code.n < n:
                code = pad_to(code, n)
            if code.n != n:
                return None
        return code if code.k >= (k if k is not None else 1) else None

    def accept(self, code: Code, D: int, who: str) -> bool:
        """Target-test ``code`` against ``d >= D`` (after fitting); keep it if better."""
        fitted = self.fit(code)
        if fitted is None:
            return False
        self.candidates += 1
        if who in self.stats:
            self.stats[who]["candidates"] += 1
        left = self.clock.left()
        if not target_test(fitted, D, time_limit=None if left is None else max(left, 1e-3)):
            return False
        n, k, d = self.q.given
        if k is not None:  # exactly the dimension asked for
            fitted = shorten_to(fitted, k) if n is None else subcode(fitted, k)
        d_exact, d_lower = None, D
        if d is None:  # the distance is optimised: a short proof may show more than D
            d_exact, d_lower = self.prove(fitted, D, 0.5)
        value = self.q.value_of(fitted.n, fitted.k, d_lower)
        if not self.q.better(value, self.value):
            return False
        self.best, self.value, self.d_exact, self.d_lower, self.by = \
            fitted, value, d_exact, d_lower, who
        if who in self.stats:
            self.stats[who]["wins"] += 1
        return True

    # ------------------------------------------------------------------------ steps
    def incumbent(self, start: Sequence[Code]) -> None:
        """Step 1: the trivial code (repetition blocks), then the starting codes."""
        tn, tk, tD = self.q.trivial()
        self.accept(repetition_blocks(tn, tk), tD, "trivial")
        n, k, d = self.q.given
        for code in start:
            self.check_stop()
            if d is not None:
                self.accept(code, d, "start")
            elif code.n == n and k is not None and code.k >= k:
                _, dl = self.prove(code, 1, 2.0)  # the distance is the value: prove it
                if self.q.better(dl, self.value):
                    self.accept(code, dl, "start")

    def warm_start(self) -> None:
        """Step 2: the ``warm`` strategies at each value from the bound outwards, until
        one gives a code better than the incumbent (at most ``_WARM_VALUES`` values)."""
        warm = [(i, s) for i, s in enumerate(self.strategies) if s.warm]
        v, tried = self.bound, 0
        while warm and not self.done() and self.q.better(v, self.value) \
                and tried < _WARM_VALUES:
            tgt = self.q.target(v)
            self.report(tgt, force=True)
            for i, s in warm:
                for cand in s.candidates(*tgt, self.rng_for(i, tgt)):
                    self.check_stop()
                    self.steps += 1
                    self.stats[s.name]["units"] += 1
                    self.report(tgt)
                    if cand is not None and self.accept(cand, tgt[2], s.name):
                        return
            tried += 1
            v = self.q.step_worse(v)

    def close_by_exhaustion(self) -> None:
        """Decide the target one step better than the incumbent by exhaustive search.

        A "none" is a proof that the incumbent is optimal: the bound moves to it and the
        search is done. An "exists" comes with a witness, accepted like any candidate
        (then the next target is decided). Undecided (node budget, clock) leaves the
        question to the portfolio. Uses :mod:`gf2codes.existence`, independent of the
        strategies; a ``[n, k, >= d]`` code for the target exists iff one with that
        exact n and k does (pad or shorten), so the decision is at the target itself.
        """
        from ..existence import MAX_REDUNDANCY, decide_existence

        while self.value is not None and not self.done() and self.exhaustive_nodes > 0:
            tn, tk, td = tgt = self.q.target(self.q.step_better(self.value))
            if not (1 <= tk <= tn) or tn - tk > MAX_REDUNDANCY:
                return
            left = self.clock.left()
            if left is not None and left <= 0:
                return
            self.report(tgt, force=True)
            dec = decide_existence(tn, tk, td, max_nodes=self.exhaustive_nodes,
                                   max_work=EXHAUSTIVE_WORK,
                                   time_limit=None if left is None else max(left, 1e-3))
            self.stats.setdefault("exhaustive", {"units": 0, "candidates": 0, "wins": 0})
            self.stats["exhaustive"]["units"] += dec.nodes
            if dec.stopped == "interrupted":
                raise KeyboardInterrupt
            if dec.status == "none":
                self.bound, self.bound_by = self.value, f"exhaustive search, {dec.nodes:,} nodes"
                return
            if dec.status != "exists":
                return
            witness = families.from_rows(np.array(dec.generator(), dtype=np.uint8))
            if not self.accept(witness.with_info(name=f"exhaustive search [{tn},{tk},{td}]"),
                               td, "exhaustive"):
                return  # pragma: no cover - a witness is always a valid candidate

    def round(self, target: tuple[int, int, int]) -> bool:
        """Step 3, once per target: the whole portfolio on ``target`` until a strategy
        wins (True) or every strategy is exhausted (False).

        Each step gives one unit of work to the live strategy with the fewest units
        relative to its credit (``1 + _WIN_CREDIT * wins``), ties to the earlier one.
        """
        iters: dict[int, Iterator[Code | None]] = {}
        live = list(range(len(self.strategies)))
        units = [0] * len(self.strategies)
        while live:
            self.check_stop()
            credit = [1 + _WIN_CREDIT * self.stats[self.strategies[i].name]["wins"]
                      for i in live]
            i = min(zip(live, credit, strict=True), key=lambda t: units[t[0]] / t[1])[0]
            s = self.strategies[i]
            if i not in iters:
                iters[i] = iter(s.candidates(*target, self.rng_for(i, target)))
            try:
                cand = next(iters[i])
            except StopIteration:
                live.remove(i)
                continue
            units[i] += 1
            self.steps += 1
            self.stats[s.name]["units"] += 1
            self.report(target)
            if cand is not None and self.accept(cand, target[2], s.name):
                return True
        return False

    def rounds(self) -> StopReason:
        """Rounds on ever better targets until the bound is attained or a round fails."""
        while self.value is not None and not self.done():
            tgt = self.q.target(self.q.step_better(self.value))
            self.open = tgt
            self.report(tgt, force=True)
            if not self.round(tgt):
                return "exhausted"
            self.open = None
            self.close_by_exhaustion()
        return "bound attained"

    def prove_winner(self, stopped: StopReason) -> SearchResult:
        """Step 4: the winner's distance, proved exactly (given its own time: short after
        Ctrl-C), ``on_winner`` told, and the result."""
        if self.best is None:  # interrupted before even the trivial code was accepted
            raise KeyboardInterrupt
        if self.done():
            stopped, self.open = "bound attained", None
        best = self.best
        if not best.recipe:  # a searched matrix: its rows are its recipe
            best = families.from_rows(best.G).with_info(name=best.name)
        try:
            limit = self.prove_time if self.prove_time is not None else (
                2.0 if stopped == "interrupted" else 30.0)
            d_exact, d_lower = self.prove(best, self.d_lower, limit)
        except KeyboardInterrupt:
            d_exact, d_lower = self.d_exact, self.d_lower
            stopped = "interrupted"
        if self.on_winner is not None:
            self.on_winner(best, d_exact if d_exact is not None else d_lower,
                           {"strategy": self.by, "seed": self.seed,
                            "exact": d_exact is not None, "mode": self.q.mode})
        return SearchResult(
            question=self.q, code=best, d=d_exact, d_lower=d_lower, optimal=self.done(),
            bound=self.bound, bound_by=self.bound_by, strategy=self.by, seed=self.seed,
            seconds=self.clock.elapsed(), candidates=self.candidates, stopped=stopped,
            open_target=self.open, stats=self.stats,
        )

    def run(self, start: Sequence[Code] = ()) -> SearchResult:
        """All the steps; always returns the best proved result (also after Ctrl-C)."""
        stopped: StopReason = "exhausted"
        try:
            self.incumbent(start)
            self.warm_start()
            self.close_by_exhaustion()
            stopped = self.rounds()
        except _Stop as stop:
            stopped = stop.reason
        except KeyboardInterrupt:
            stopped = "interrupted"
        return self.prove_winner(stopped)


def run_search(question: SearchQuestion, *, strategies: Sequence[Strategy],
               time_limit: float | None = 60.0, max_steps: int | None = None, seed: int = 0,
               start: Sequence[Code] = (), progress: Progress | None = None,
               on_winner: OnWinner | None = None, prove_time: float | None = None,
               exhaustive_nodes: int = 200_000) -> SearchResult:
    """Run the portfolio on ``question`` (see the module docstring and :class:`Driver`).
    The limits are checked by the callers in :mod:`gf2codes.search`
    (:func:`check_limits`)."""
    return Driver(question, strategies, time_limit=time_limit, max_steps=max_steps, seed=seed,
                  progress=progress, on_winner=on_winner, prove_time=prove_time,
                  exhaustive_nodes=exhaustive_nodes).run(start)
