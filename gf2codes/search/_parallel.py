"""The portfolio as independent tasks on an executor (processes or a Dask cluster).

Each strategy of the portfolio runs as its own task: a complete single-strategy search
with the same target, limits and seed. The results are merged by a fixed rule — the
best value, ties to the strategy earlier in the portfolio — so a run with a step limit
(``max_steps``) gives the same winner whatever the number of workers or their speed.
As soon as some task attains the bound and every task before it in the portfolio has
returned, nothing else can win: the tasks not yet started are cancelled. Tasks already
running finish their own limits.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Sequence

import numpy as np

from .._util import Clock
from ..code import Code
from ..questions import SearchQuestion
from ._driver import SearchResult, check_limits, run_search

__all__ = ["run_portfolio_parallel"]


def _task(payload: tuple) -> SearchResult:
    """One strategy's search (runs in a worker process)."""
    from . import STRATEGIES

    question, name, time_limit, max_steps, seed, start = payload
    codes = [Code.from_packed(np.frombuffer(rows, dtype=np.uint64).reshape(kk, -1), nn)
             for rows, nn, kk in start]
    return run_search(question, strategies=[STRATEGIES[name]],
                      time_limit=time_limit, max_steps=max_steps, seed=seed, start=codes)


def run_portfolio_parallel(question: SearchQuestion, *, strategy_names: Sequence[str],
                           executor, time_limit: float | None, max_steps: int | None,
                           seed: int, start: Sequence[Code] = ()) -> SearchResult:
    """Run every strategy as a task on ``executor`` and merge (see the module docstring)."""
    check_limits(time_limit, max_steps, seed)
    clock = Clock(None)
    packed = [(np.ascontiguousarray(c.packed_generator).tobytes(), c.n, c.k) for c in start]
    payloads = [(question, name, time_limit, max_steps, int(seed), packed)
                for name in strategy_names]
    results: dict[int, SearchResult] = {}
    stream = executor.run_unordered(_task, payloads)
    try:
        for i, res in stream:
            results[i] = res
            winner = _merge(question, results, len(payloads), final=False)
            if winner is not None:
                break
    finally:
        stream.close()
    best = _merge(question, results, len(payloads), final=True)
    assert best is not None
    stats = {}
    for i in sorted(results):
        stats.update(results[i].stats)
    return dataclasses.replace(best, seconds=clock.elapsed(),
                               candidates=sum(r.candidates for r in results.values()),
                               stats=stats)


def _merge(question: SearchQuestion, results: dict[int, SearchResult], total: int, *,
           final: bool) -> SearchResult | None:
    """The winner by the fixed rule, or None while it could still change (final=False)."""
    best = None
    for i in range(total):
        if i not in results:
            if final:
                continue
            return None  # an earlier strategy could still attain the bound or tie
        r = results[i]
        if question.better(r.value, None if best is None else best.value):
            best = r
        if best is not None and best.optimal and not final:
            return best
    return best
