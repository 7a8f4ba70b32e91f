"""Search for good binary linear codes: the shortest for ``(k, d)``, the best ``d`` for
``(n, k)``, the largest ``k`` for ``(n, d)``.

A portfolio of strategies, each behind the small interface of
:class:`~gf2codes.search._base.Strategy` (``candidates(n, k, D, rng)`` yields codes),
is run by a driver (:mod:`gf2codes.search._driver`) that owns the time limit, the
schedule and the target test, and proves the winner's distance exactly.

================  =============================================================
``families``      named families shortened / punctured / extended
``lexicode``      the greedy lexicographic code (Conway & Sloane 1986)
``greedy``        column-greedy parity-check matrices (constructive Varshamov)
``anneal``        simulated annealing on the redundancy matrix of ``[I | A]``
``circulant``     double-circulant and quasi-cyclic codes, hill-climbed
``cyclic``        cyclic and shortened cyclic codes
``orbits``        unions of orbits of a matrix group chosen by an integer program
                  (Braun, Kohnert & Wassermann 2005)
``random``        random systematic generator matrices
================  =============================================================

Examples
--------
>>> r = search_length(4, 3, time_limit=10, seed=1)
>>> (r.n, r.k, r.d, r.optimal)
(7, 4, 3, True)

The same through the question object (:mod:`gf2codes.questions`), as the command line
does it:

>>> from gf2codes.questions import question
>>> r = search_for(question(n=16, k=5), time_limit=10, seed=1)
>>> (r.n, r.k, r.d, r.optimal, r.statement())
(16, 5, 8, True, '[16,5,8] has the greatest possible distance (griesmer).')
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence

from ..code import Code
from ..exceptions import ParameterError, check_int
from ..questions import GreatestDimension, GreatestDistance, SearchQuestion, ShortestLength
from ._anneal import Annealing
from ._base import Strategy, screen, target_test
from ._circulant import Circulant
from ._cyclic import Cyclic
from ._driver import MODES, OnWinner, Progress, SearchResult, WinnerInfo, check_limits, run_search
from ._families import FamilyDerivation
from ._greedy import ColumnGreedy
from ._lexicode import Lexicode
from ._orbits import OrbitProgram
from ._random import RandomSystematic

__all__ = [
    "STRATEGIES",
    "Strategy",
    "SearchResult",
    "search_length",
    "search_distance",
    "search_dimension",
    "search_for",
    "check_limits",
    "WinnerInfo",
    "resolve_strategies",
    "screen",
    "target_test",
    "MODES",
]

#: Strategy name -> instance, in portfolio order (which is also the tie-break order
#: of the schedule).
STRATEGIES: dict[str, Strategy] = {
    s.name: s
    for s in (FamilyDerivation(), Lexicode(), ColumnGreedy(), Annealing(), Circulant(),
              Cyclic(), OrbitProgram(), RandomSystematic())
}


def resolve_strategies(names: Iterable[str | Strategy] | None) -> list[Strategy]:
    """The strategies named (default: the whole portfolio), in portfolio order.

    Strategy objects are accepted too (a custom strategy, or one for a test).

    Raises
    ------
    ParameterError
        For an unknown name, or an empty selection.
    """
    if names is None:
        return list(STRATEGIES.values())
    chosen: list[Strategy] = []
    for item in names:
        if isinstance(item, Strategy):
            s = item
        elif item in STRATEGIES:
            s = STRATEGIES[item]
        else:
            raise ParameterError(
                f"Argument 'strategy' must be one of {', '.join(STRATEGIES)}, not {item!r}."
            )
        if s not in chosen:
            chosen.append(s)
    if not chosen:
        raise ParameterError("Argument 'strategy' must name at least one strategy.")
    order = list(STRATEGIES.values())
    chosen.sort(key=lambda s: order.index(s) if s in order else len(order))
    return chosen


_DOC_COMMON = """
    time_limit : float or None
        Seconds (default 60); the clock only cuts the run short.
    max_steps : int, optional
        Stop after this many steps of the schedule (each one bounded unit of a
        strategy's work): a limit on work, so that the same seed gives the same
        result whatever the machine's speed.
    seed : int
        Seeds every strategy (per strategy and target, independent of the schedule).
    strategies : iterable of str or Strategy, optional
        Names from :data:`STRATEGIES` (default: all).
    start : sequence of Code
        Known codes to start from (for example the best catalog entry).
    progress : callable, optional
        ``progress(done_ms, total_ms, info)``; ``info["note"]`` is a status line.
    on_winner : callable, optional
        ``on_winner(code, d, info)`` for every new proved best code (with an executor:
        for the final winner).
    executor : gf2codes.parallel.Executor, optional
        Run each strategy of the portfolio as an independent task there (other
        processes, a Dask cluster) and merge by a fixed rule: the best value, ties to
        the strategy earlier in the portfolio. With ``max_steps`` the result does not
        depend on the number of workers. ``progress`` is not called.
    exhaustive_nodes : int
        Node budget of each exhaustive existence decision
        (:func:`gf2codes.existence.decide_existence`) for the target one step better
        than the incumbent: "none" proves the incumbent optimal and stops the search at
        once, "exists" gives a code. 0 turns the decisions off (the strategies alone);
        not used with an executor.

    Returns
    -------
    SearchResult

    Raises
    ------
    ParameterError
        For parameters out of range, a time limit <= 0, a negative seed, an unknown
        strategy.
"""


def _run(question: SearchQuestion, time_limit, max_steps, seed, strategies, start, progress,
         on_winner, executor=None, exhaustive_nodes: int = 200_000) -> SearchResult:
    chosen = resolve_strategies(strategies)
    start = [c for c in start if isinstance(c, Code)]
    if executor is not None:
        from ._parallel import run_portfolio_parallel

        unknown = [s for s in chosen if STRATEGIES.get(s.name) is not s]
        if unknown:
            raise ParameterError("Argument 'executor' needs the strategies of the portfolio "
                                 f"(by name), not a custom {unknown[0].name!r}.")
        result = run_portfolio_parallel(question, strategy_names=[s.name for s in chosen],
                                        executor=executor, time_limit=time_limit,
                                        max_steps=max_steps, seed=seed, start=start)
        if on_winner is not None and result.d is not None:
            on_winner(result.code, result.d, {"strategy": result.strategy,
                                              "seed": result.seed, "exact": True,
                                              "mode": question.mode})
        return result
    return run_search(question, strategies=chosen, time_limit=time_limit,
                      max_steps=max_steps, seed=seed, start=start,
                      progress=progress, on_winner=on_winner,
                      exhaustive_nodes=check_int("exhaustive_nodes", exhaustive_nodes, minimum=0))


def search_for(question: SearchQuestion, *, time_limit: float | None = 60.0,
               max_steps: int | None = None, seed: int = 0,
               strategies: Iterable[str | Strategy] | None = None,
               start: Sequence[Code] = (), progress: Progress | None = None,
               on_winner: OnWinner | None = None, executor=None,
               exhaustive_nodes: int = 200_000) -> SearchResult:
    """The best code found for ``question`` (from :func:`gf2codes.questions.question`).

    :func:`search_length`, :func:`search_distance` and :func:`search_dimension` are this
    with the question made from their two values.

    Parameters
    ----------
    question : gf2codes.questions.SearchQuestion
        The shortest length, greatest distance or greatest dimension, with its two
        given values.
    """
    check_limits(time_limit, max_steps, seed)
    return _run(question, time_limit, max_steps, seed, strategies, start, progress,
                on_winner, executor, exhaustive_nodes)


def search_length(k: int, d: int, *, time_limit: float | None = 60.0,
                  max_steps: int | None = None, seed: int = 0,
                  strategies: Iterable[str | Strategy] | None = None,
                  start: Sequence[Code] = (), progress: Progress | None = None,
                  on_winner: OnWinner | None = None, executor=None,
                  exhaustive_nodes: int = 200_000) -> SearchResult:
    """The shortest binary linear code of dimension ``k`` and distance at least ``d`` found.

    ``result.optimal`` (``proven_shortest``) is true when its length equals the least
    length the bounds allow (:func:`gf2codes.bounds.least_length`).

    Parameters
    ----------
    k, d : int
        Dimension and required distance, both at least 1.
    """
    check_limits(time_limit, max_steps, seed)
    return _run(ShortestLength(k, d), time_limit, max_steps, seed, strategies, start,
                progress, on_winner, executor, exhaustive_nodes)


def search_distance(n: int, k: int, *, time_limit: float | None = 60.0,
                    max_steps: int | None = None, seed: int = 0,
                    strategies: Iterable[str | Strategy] | None = None,
                    start: Sequence[Code] = (), progress: Progress | None = None,
                    on_winner: OnWinner | None = None, executor=None,
                  exhaustive_nodes: int = 200_000) -> SearchResult:
    """The ``[n, k]`` code of greatest proved distance found.

    ``result.optimal`` is true when it meets :func:`gf2codes.bounds.best_upper`.

    Parameters
    ----------
    n, k : int
        Length and dimension, ``1 <= k <= n``.
    """
    check_limits(time_limit, max_steps, seed)
    return _run(GreatestDistance(n, k), time_limit, max_steps, seed, strategies, start,
                progress, on_winner, executor, exhaustive_nodes)


def search_dimension(n: int, d: int, *, time_limit: float | None = 60.0,
                     max_steps: int | None = None, seed: int = 0,
                     strategies: Iterable[str | Strategy] | None = None,
                     start: Sequence[Code] = (), progress: Progress | None = None,
                     on_winner: OnWinner | None = None, executor=None,
                  exhaustive_nodes: int = 200_000) -> SearchResult:
    """The code of length ``n`` and distance at least ``d`` of greatest dimension found.

    ``result.optimal`` is true when it meets :func:`gf2codes.bounds.max_dimension`.

    Parameters
    ----------
    n, d : int
        Length and required distance, ``1 <= d <= n``.
    """
    check_limits(time_limit, max_steps, seed)
    return _run(GreatestDimension(n, d), time_limit, max_steps, seed, strategies, start,
                progress, on_winner, executor, exhaustive_nodes)


for _f in (search_for, search_length, search_distance, search_dimension):
    assert _f.__doc__ is not None
    _f.__doc__ = _f.__doc__.rstrip() + "\n" + _DOC_COMMON
del _f
