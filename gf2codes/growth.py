"""Grow a catalog as a long-running, resumable job.

A *region* is a set of cells ``(n, k)``. The job works through the region's *open*
cells -- those where the catalog's proved ``d`` (stored or derived by the catalog's
propagation rules) is below the best proved upper bound of :mod:`gf2codes.bounds` --
most promising first: the largest gap, then the cheapest search (smaller ``n``, then
smaller ``k``). On each cell it runs the search portfolio of :mod:`gf2codes.search`
with a per-cell budget (a step limit, so that the same seed gives the same codes on
any machine, and optionally a time limit), starting from the catalog's best code for
the cell, and saves every proved improvement at once. Propagation is the catalog's
closed-form rule (shorten, subcode, puncture, extend, append zeros;
:mod:`gf2codes.catalog.propagation`): a stored code fills its
neighbours the moment it is stored, and before each batch the pending cells that
propagation has closed are marked so without a search.

Plan and progress
-----------------
The plan lives in the catalog's SQLite file (tables ``growth_job`` and
``growth_cell``, schema version 4, written through :mod:`gf2codes.catalog.plan`): a job is
identified by a digest of its specification (cells, budget, seed, strategies), so running
the same command again continues the same job. A cell is marked done only after its code,
if any, has been committed; a process killed at any moment (even with ``SIGKILL``) loses
at most the unfinished searches of the cells under way, never a proved code.

Cells are searched in batches of fixed size (``batch``, independent of the number of
workers): every search of a batch starts from the catalog as it was when the batch
was formed, and each result is saved when it beats its own starting value. The codes
saved, and so the catalog, therefore do not depend on the number of workers or on the
order in which their results arrive.

Only the coordinating process writes to SQLite. A task (:func:`search_cell`) takes
plain data -- parameters, budget, seed, the packed rows of its starting code -- and
returns plain data, so it runs unchanged in another process or on a Dask worker; a
worker lost mid-cell loses only that cell's unfinished search.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1 section 9 (the propagation rules).
"""

from __future__ import annotations

import hashlib
import json
from collections.abc import Callable, Iterable, Sequence
from dataclasses import dataclass, field
from typing import Any

import numpy as np

from ._util import Clock
from .bounds import best_upper, least_length
from .catalog import Catalog, plan
from .catalog.propagation import reach_distance
from .code import Code
from .exceptions import ParameterError, check_int
from .search import resolve_strategies, search_distance
from .typing import Outcome

__all__ = [
    "GROWTH_STRATEGIES",
    "CellResult",
    "GrowthSummary",
    "region_cells",
    "search_cell",
    "grow",
    "job_status",
    "CellStanding",
    "RegionStanding",
    "region_standing",
]

#: The portfolio a growth job runs by default: every strategy but the named families
#: (whose codes the shipped seed already holds) and the lexicode (whose cost grows
#: exponentially with ``k``).
GROWTH_STRATEGIES: tuple[str, ...] = ("greedy", "anneal", "circulant", "cyclic", "random")

#: ``progress(summary)`` after every finished cell.
GrowthProgress = Callable[["GrowthSummary"], None]
#: ``on_cell(result)`` for every finished cell.
OnCell = Callable[["CellResult"], None]


@dataclass(frozen=True)
class CellResult:
    """What the search of one cell gave.

    Attributes
    ----------
    n, k : int
    d_before : int
        The catalog's proved ``d`` when the cell's batch was formed (0: nothing known).
    d_found : int
        The proved distance of the code the search found (at least a proved lower
        bound); ``d_before`` when it found nothing better.
    bound : int
        The best proved upper bound on ``d`` (:func:`gf2codes.bounds.best_upper`).
    bound_by : str
    outcome : str
        ``"improved"`` (a better code was saved), ``"unchanged"``, or ``"closed"``
        (already at the bound when its turn came, by propagation from another cell).
    entry : int or None
        The catalog entry the improvement was stored in.
    strategy : str or None
        Who found the code.
    seconds : float
    stopped : str
        Why the search stopped (``"step limit"``, ``"bound attained"``, ...), or
        ``"propagation"`` for a closed cell.
    """

    n: int
    k: int
    d_before: int
    d_found: int
    bound: int
    bound_by: str
    outcome: Outcome
    entry: int | None = None
    strategy: str | None = None
    seconds: float = 0.0
    stopped: str = ""

    @property
    def at_bound(self) -> bool:
        """Whether the cell's proved ``d`` now meets its upper bound."""
        return max(self.d_found, self.d_before) >= self.bound

    def to_dict(self) -> dict[str, Any]:
        """A JSON-ready dict (one line of ``--json``)."""
        return {"n": self.n, "k": self.k, "d_before": self.d_before, "d": self.d_found,
                "bound": self.bound, "bound_by": self.bound_by, "outcome": self.outcome,
                "at_bound": self.at_bound, "entry": self.entry, "strategy": self.strategy,
                "seconds": round(self.seconds, 3), "stopped": self.stopped}


@dataclass
class GrowthSummary:
    """Where a growth job stands.

    Attributes
    ----------
    job : int
        The job's id in the catalog.
    cells : int
        Cells in the plan (the open cells of the region when the job was planned).
    done, improved, closed : int
        Finished cells; those where a better code was saved; those that meet their
        upper bound now (by a search or by propagation).
    resumed : int
        Cells already finished by an earlier run of the same job.
    seconds : float
        Time of this run.
    eta : float or None
        Estimated seconds left (from this run's pace).
    stopped : str
        ``"finished"``, ``"cell limit"``, ``"time limit"`` or ``"interrupted"``
        (empty while running).
    results : list of CellResult
        The cells finished in this run, in the order they finished.
    """

    job: int
    cells: int
    done: int = 0
    improved: int = 0
    closed: int = 0
    resumed: int = 0
    seconds: float = 0.0
    eta: float | None = None
    stopped: str = ""
    results: list[CellResult] = field(default_factory=list)

    def to_dict(self) -> dict[str, Any]:
        return {"job": self.job, "cells": self.cells, "done": self.done,
                "improved": self.improved, "closed": self.closed, "resumed": self.resumed,
                "seconds": round(self.seconds, 3), "stopped": self.stopped}


# ------------------------------------------------------------------ the region
def region_cells(*, lengths: Iterable[int] | None = None,
                 dimensions: Iterable[int] | None = None,
                 targets: Iterable[tuple[int, int]] = (),
                 catalog: Catalog | None = None) -> list[tuple[int, int]]:
    """The cells ``(n, k)`` of a region, sorted.

    Parameters
    ----------
    lengths, dimensions : iterable of int, optional
        Every ``(n, k)`` with ``n`` in ``lengths`` and ``k`` in ``dimensions``
        (default: ``1 <= k <= n``) and ``k <= n``.
    targets : iterable of (k, d)
        For each target, the cells ``(n, k)`` from the least length the bounds allow
        (:func:`gf2codes.bounds.least_length`) up to one below the catalog's shortest
        known length for ``(k, d)``: a code of distance ``d`` in any of them is a
        shorter code for the target.
    catalog : Catalog, optional
        Needed with ``targets``.
    """
    cells: set[tuple[int, int]] = set()
    if lengths is not None:
        dims = None if dimensions is None else sorted(set(dimensions))
        for n in lengths:
            n = check_int("n", n, minimum=1)
            for k in (range(1, n + 1) if dims is None else dims):
                k = check_int("k", k, minimum=1)
                if k <= n:
                    cells.add((n, k))
    elif dimensions is not None:
        raise ParameterError("Argument 'k' needs lengths ('n') beside it.")
    for k, d in targets:
        k = check_int("k", k, minimum=1)
        d = check_int("d", d, minimum=1)
        lo = least_length(k, d).n
        known = catalog.pick(k=k, d=d, claims=False) if catalog is not None else None
        hi = known.n - 1 if known is not None else lo + 2 * d + k
        cells.update((n, k) for n in range(lo, hi + 1))
    return sorted(cells)


# ------------------------------------------------------------------ the task
def search_cell(payload: dict[str, Any]) -> dict[str, Any]:
    """Search one cell (a task: plain data in, plain data out; runs in any process).

    ``payload``: ``n``, ``k``, ``d_before``, ``start`` (``[rows_bytes, n, k]`` or None),
    ``max_steps``, ``time_limit``, ``seed``, ``strategies``. Returns ``n``, ``k``,
    ``d`` (the proved distance found, or a proved lower bound when ``exact`` is false),
    ``exact``, ``rows`` (the generator's packed rows as bytes, or None when nothing
    better than ``d_before`` was found), ``recipe``, ``strategy``, ``seconds``,
    ``stopped``.
    """
    n, k = int(payload["n"]), int(payload["k"])
    start = []
    if payload.get("start") is not None:
        rows, sn, sk = payload["start"]
        start.append(Code.from_packed(np.frombuffer(rows, dtype=np.uint64).reshape(sk, -1),
                                      sn))
    clock = Clock(None)
    result = search_distance(n, k, time_limit=payload.get("time_limit"),
                             max_steps=payload.get("max_steps"), seed=int(payload["seed"]),
                             strategies=payload.get("strategies"), start=start)
    out: dict[str, Any] = {"n": n, "k": k, "d": result.d_lower, "exact": result.d is not None,
                           "rows": None, "recipe": None, "strategy": result.strategy,
                           "seconds": clock.elapsed(), "stopped": result.stopped}
    if result.d_lower > int(payload["d_before"]) and result.strategy != "start":
        code = result.code
        out["rows"] = np.ascontiguousarray(code.packed_generator, dtype=np.uint64).tobytes()
        out["recipe"] = list(code.recipe) or None
    return out


# ------------------------------------------------------------------ the plan in SQLite
def _spec(cells: Sequence[tuple[int, int]], max_steps: int | None, time_limit: float | None,
          seed: int, strategies: Sequence[str]) -> dict[str, Any]:
    return {"cells": [list(c) for c in cells], "max_steps": max_steps,
            "time_limit": time_limit, "seed": seed, "strategies": list(strategies)}


def _job_key(spec: dict[str, Any]) -> str:
    text = json.dumps(spec, sort_keys=True, separators=(",", ":"))
    return hashlib.sha256(text.encode()).hexdigest()[:32]


class _State:
    """The catalog's proved d per cell and the upper bounds (cached per catalog change)."""

    def __init__(self, catalog: Catalog) -> None:
        self.catalog = catalog
        self._bounds: dict[tuple[int, int], tuple[int, str]] = {}

    def bound(self, n: int, k: int) -> tuple[int, str]:
        key = (n, k)
        if key not in self._bounds:
            ub = best_upper(n, k)
            self._bounds[key] = (int(ub.d), str(ub.by))
        return self._bounds[key]

    def d(self, n: int, k: int) -> int:
        arrays = self.catalog.arrays()
        if not arrays.proved.any():
            return 0
        # only distances proved by this installation count (claims never do)
        ids, N0, K0, L0, _, _ = arrays.only_proved()
        return int(reach_distance(N0, K0, L0, n, k).max())


def _plan(catalog: Catalog, state: _State, spec: dict[str, Any]) -> tuple[int, int]:
    """Find or create the job of ``spec``; return (job id, cells already done)."""
    key = _job_key(spec)
    found = plan.find_job(catalog, key)
    if found is not None:
        return found
    ranked = []
    for n, k in spec["cells"]:
        bound, _ = state.bound(n, k)
        d = state.d(n, k)
        if d < bound:
            ranked.append((-(bound - d), n, k, d, bound))
    ranked.sort()
    job = plan.create_job(catalog, key, spec,
                          [(n, k, d, bound) for _, n, k, d, bound in ranked])
    return job, 0


def _finish(catalog: Catalog, job: int, res: CellResult) -> None:
    plan.finish_cell(catalog, job, res.n, res.k, outcome=res.outcome, d_before=res.d_before,
                     d_found=res.d_found, entry=res.entry, strategy=res.strategy,
                     seconds=res.seconds, stopped=res.stopped)


def job_status(catalog: Catalog, job: int) -> dict[str, int]:
    """Counts of a job's cells: ``cells``, ``done``, ``improved``, ``closed`` (now at the
    bound, counting propagation)."""
    cells = plan.cell_count(catalog, job)
    rows = plan.done_cells(catalog, job)
    state = _State(catalog)
    return {"cells": int(cells), "done": len(rows),
            "improved": sum(1 for r in rows if r[3] == "improved"),
            "closed": sum(1 for n, k, bound, _ in rows if state.d(n, k) >= bound)}


# ------------------------------------------------------------------ the job
def _start_payload(catalog: Catalog, n: int, k: int) -> list[Any] | None:
    entry = catalog.pick(n=n, k=k, claims=False)
    if entry is None:
        return None
    code = entry.code
    return [np.ascontiguousarray(code.packed_generator, dtype=np.uint64).tobytes(), code.n,
            code.k]


def _save(catalog: Catalog, out: dict[str, Any], seed: int) -> int:
    """Store a task's code (proved facts only) and return the entry id."""
    n, k = int(out["n"]), int(out["k"])
    code = Code.from_packed(np.frombuffer(out["rows"], dtype=np.uint64).reshape(k, -1), n)
    proof = {"method": "search", "strategy": out["strategy"]}
    recipe = out["recipe"] or [{"strategy": out["strategy"], "seed": seed}]
    if out["exact"]:
        return catalog.add(code, d=int(out["d"]), proved=True, recipe=recipe, source="search",
                           seed=seed, proof=proof)
    return catalog.add(code, d=int(out["d"]), proved=False, recipe=recipe, source="search",
                       seed=seed)


def grow(catalog: Catalog, cells: Sequence[tuple[int, int]], *, max_steps: int | None = 200,
         time_limit: float | None = None, seed: int = 0,
         strategies: Sequence[str] | None = None, executor: Any = None, batch: int = 8,
         max_cells: int | None = None, job_time_limit: float | None = None,
         progress: GrowthProgress | None = None, on_cell: OnCell | None = None
         ) -> GrowthSummary:
    """Grow ``catalog`` on the open cells among ``cells`` (see the module docstring).

    Parameters
    ----------
    catalog : gf2codes.catalog.Catalog
        Written by this process only.
    cells : sequence of (n, k)
        The region (:func:`region_cells`).
    max_steps : int or None
        Per-cell step limit of the search (units of strategy work): the budget that
        makes the job reproducible.
    time_limit : float or None
        Per-cell seconds (None: none; a time limit makes the result machine-dependent).
    seed : int
        Seeds every cell's search (with the cell's ``(n, k)``).
    strategies : sequence of str, optional
        Strategy names (default :data:`GROWTH_STRATEGIES`).
    executor : gf2codes.parallel.Executor, optional
        Where the cells' searches run (default: in this process, one after another).
    batch : int
        Cells searched at once from the same catalog state (keep it fixed to get the
        same codes with any number of workers).
    max_cells : int, optional
        Stop after this many cells finished in this run.
    job_time_limit : float, optional
        Stop forming new batches after this many seconds.
    progress : callable, optional
        ``progress(summary)`` after every finished cell.
    on_cell : callable, optional
        ``on_cell(result)`` for every finished cell.

    Returns
    -------
    GrowthSummary
        On Ctrl-C (``KeyboardInterrupt``) the proved codes already found are kept and
        the summary says ``stopped = "interrupted"``.
    """
    names = [s.name for s in resolve_strategies(
        list(GROWTH_STRATEGIES if strategies is None else strategies))]
    if max_steps is not None:
        max_steps = check_int("max_steps", max_steps, minimum=1)
    if max_steps is None and time_limit is None:
        raise ParameterError("Give a per-cell budget: 'max_steps', 'time_limit' or both.")
    if time_limit is not None and not (isinstance(time_limit, (int, float))
                                       and time_limit > 0):
        raise ParameterError(f"Argument 'time_limit' must be positive, not {time_limit!r}.")
    batch = check_int("batch", batch, minimum=1)
    if max_cells is not None:
        max_cells = check_int("max_cells", max_cells, minimum=1)
    seed = check_int("seed", seed, minimum=0)
    cells = sorted({(check_int("n", n, minimum=1), check_int("k", k, minimum=1))
                    for n, k in cells})
    spec = _spec(cells, max_steps, time_limit, seed, names)
    run = _Run(catalog, spec, progress=progress, on_cell=on_cell)
    try:
        while not run.stop(max_cells, job_time_limit):
            room = batch if max_cells is None else min(batch, max_cells - run.finished_here)
            chosen = run.next_batch(room, max_cells)
            if chosen is None:
                break
            if chosen:
                _run_batch(catalog, chosen, executor, run.state, seed, run.finish)
    except KeyboardInterrupt:
        run.summary.stopped = "interrupted"
    return run.close()


class _Run:
    """One run of a growth job: its plan, its summary, and the steps of its loop."""

    def __init__(self, catalog: Catalog, spec: dict[str, Any], *,
                 progress: GrowthProgress | None, on_cell: OnCell | None) -> None:
        self.catalog, self.spec = catalog, spec
        self.state = _State(catalog)
        self.job, already = _plan(catalog, self.state, spec)
        self.summary = GrowthSummary(job=self.job, cells=plan.cell_count(catalog, self.job),
                                     resumed=already, done=already)
        self._count()
        self.progress, self.on_cell = progress, on_cell
        self.clock = Clock(None)
        self.finished_here = 0

    def _count(self) -> None:
        status = job_status(self.catalog, self.job)  # counts propagation from codes found
        self.summary.improved, self.summary.closed = status["improved"], status["closed"]

    def stop(self, max_cells: int | None, job_time_limit: float | None) -> bool:
        """Whether a limit of this run is reached (and the summary says which)."""
        if max_cells is not None and self.finished_here >= max_cells:
            self.summary.stopped = "cell limit"
        elif job_time_limit is not None and self.clock.elapsed() > job_time_limit:
            self.summary.stopped = "time limit"
        return bool(self.summary.stopped)

    def finish(self, res: CellResult) -> None:
        """Record a finished cell (in the plan and the summary) and report it."""
        _finish(self.catalog, self.job, res)
        self.finished_here += 1
        summary = self.summary
        summary.done += 1
        summary.improved += res.outcome == "improved"
        summary.closed += res.at_bound
        summary.results.append(res)
        summary.seconds = self.clock.elapsed()
        left = summary.cells - summary.done
        summary.eta = summary.seconds / self.finished_here * left if left else 0.0
        if self.on_cell is not None:
            self.on_cell(res)
        if self.progress is not None:
            self.progress(summary)

    def next_batch(self, room: int, max_cells: int | None) -> list[dict[str, Any]] | None:
        """Up to ``room`` task payloads of pending open cells, in rank order; pending cells
        that propagation has closed are finished on the way. None when the job is done."""
        chosen: list[dict[str, Any]] = []
        spec, state = self.spec, self.state
        for n, k in plan.pending_cells(self.catalog, self.job):
            bound, by = state.bound(n, k)
            d = state.d(n, k)
            if d >= bound:  # closed by propagation from a code stored since planning
                self.finish(CellResult(n, k, d, d, bound, by, "closed", stopped="propagation"))
                if max_cells is not None and self.finished_here >= max_cells:
                    break
                continue
            chosen.append({"n": n, "k": k, "d_before": d,
                           "start": _start_payload(self.catalog, n, k),
                           "max_steps": spec["max_steps"], "time_limit": spec["time_limit"],
                           "seed": spec["seed"] * 1_000_003 + n * 1009 + k,
                           "strategies": spec["strategies"]})
            if len(chosen) >= room:
                break
        if not chosen and not plan.pending_cells(self.catalog, self.job):
            self.summary.stopped = "finished"
            plan.finish_job(self.catalog, self.job)
            return None
        return chosen

    def close(self) -> GrowthSummary:
        self._count()
        self.summary.seconds = self.clock.elapsed()
        return self.summary


def _run_batch(catalog: Catalog, chosen: list[dict[str, Any]], executor: Any, state: _State,
               seed: int, finish: Callable[[CellResult], None]) -> None:
    """Search the batch; save and finish each cell as its result arrives."""
    if executor is None:
        stream: Iterable[tuple[int, dict[str, Any]]] = (
            (i, search_cell(p)) for i, p in enumerate(chosen))
    else:
        stream = executor.run_unordered(search_cell, chosen)
    try:
        for i, out in stream:
            p = chosen[i]
            n, k, before = p["n"], p["k"], p["d_before"]
            bound, by = state.bound(n, k)
            entry = None
            if out["rows"] is not None and int(out["d"]) > before:
                entry = _save(catalog, out, p["seed"])  # committed before the cell is done
            if out["stopped"] == "interrupted":
                raise KeyboardInterrupt
            found = max(int(out["d"]), before)
            finish(CellResult(n, k, before, found, bound, by,
                              "improved" if entry is not None else "unchanged", entry=entry,
                              strategy=out["strategy"] if entry is not None else None,
                              seconds=float(out["seconds"]), stopped=str(out["stopped"])))
    finally:
        close = getattr(stream, "close", None)
        if close is not None:
            close()


# ------------------------------------------------------------------ where we stand
@dataclass(frozen=True)
class CellStanding:
    """One cell of a region summary: the best proved code against the best proved bound.

    Attributes
    ----------
    n, k : int
    d : int
        The catalog's proved ``d`` (stored or derived; 0 when nothing is known). Only a
        lower bound on the best possible ``d`` unless it meets :attr:`bound`.
    bound : int
        The best proved upper bound on ``d`` for any ``[n, k]`` code.
    bound_by : str
        The rule that gives it.
    code : str
        The evidence for ``d``: the stored entry, or the entry it is derived from and how.
    recipe : str
        How the stored code was made (source and recipe of its first recipe).
    """

    n: int
    k: int
    d: int
    bound: int
    bound_by: str
    code: str
    recipe: str

    @property
    def gap(self) -> int:
        return self.bound - self.d

    def to_dict(self) -> dict[str, Any]:
        return {"n": self.n, "k": self.k, "d": self.d, "bound": self.bound,
                "bound_by": self.bound_by, "gap": self.gap, "code": self.code,
                "recipe": self.recipe}


@dataclass(frozen=True)
class RegionStanding:
    """A region summary (:func:`region_standing`).

    Attributes
    ----------
    cells : int
    at_bound : int
        Cells whose proved ``d`` meets the best proved upper bound (settled).
    within_one : int
        Cells within 1 of it (the settled ones included).
    unknown : int
        Cells for which the catalog has no code at all.
    open : list of CellStanding
        The cells below their bound, largest gap first (then by ``n``, ``k``).
    """

    cells: int
    at_bound: int
    within_one: int
    unknown: int
    open: list[CellStanding]

    def to_dict(self, limit: int | None = None) -> dict[str, Any]:
        shown = self.open if limit is None else self.open[:limit]
        return {"cells": self.cells, "at_bound": self.at_bound, "within_one": self.within_one,
                "unknown": self.unknown, "open": len(self.open),
                "largest_gap": self.open[0].gap if self.open else 0,
                "open_cells": [c.to_dict() for c in shown]}


def _recipe_text(recipes: Sequence[dict[str, Any]]) -> str:
    if not recipes:
        return "-"
    item = recipes[0]
    parts = []
    for step in item.get("recipe") or []:
        if "family" in step:
            fam = step["family"]
            args = ", ".join(f"{key}={val}" for key, val in step.items()
                             if key not in ("family", "generator", "rows", "n"))
            parts.append(f"{fam}({args})" if args else
                         ("matrix" if fam == "matrix" else fam))
        elif "op" in step:
            parts.append(str(step["op"]))
        elif "strategy" in step:
            parts.append(f"strategy {step['strategy']}")
    text = " -> ".join(parts) or "-"
    extra = f", seed {item['seed']}" if item.get("seed") is not None else ""
    return f"{item['source']}: {text}{extra}"


def region_standing(catalog: Catalog, cells: Sequence[tuple[int, int]]) -> RegionStanding:
    """Summarise a region: cells at the best proved upper bound, within 1, and for
    every open cell each side's best evidence (code and recipe; bound and its rule).

    Only proved facts count: the catalog's proved lower bounds on ``d`` against the
    proved upper bounds of :mod:`gf2codes.bounds`.
    """
    state = _State(catalog)
    at = near = unknown = 0
    open_cells: list[tuple[int, int, int, int, str]] = []
    for n, k in sorted(set(cells)):
        bound, by = state.bound(n, k)
        d = state.d(n, k)
        unknown += d == 0
        at += d >= bound
        near += d >= bound - 1
        if d < bound:
            open_cells.append((bound - d, n, k, d, by))
    open_cells.sort(key=lambda t: (-t[0], t[1], t[2]))
    out = []
    for _, n, k, d, by in open_cells:
        entry = catalog.pick(n=n, k=k, claims=False) if d else None
        if entry is None:
            code, recipe = "none", "-"
        else:
            if entry.derived_from is None:
                base = entry
            else:
                assert entry.base_id is not None  # a derived answer names its base entry
                base = catalog.get(entry.base_id)
            code = (f"entry {entry.id}" if entry.derived_from is None
                    else entry.derived_from)
            recipe = _recipe_text(base.recipes)
        out.append(CellStanding(n, k, d, state.bound(n, k)[0], by, code, recipe))
    return RegionStanding(cells=len(set(cells)), at_bound=at, within_one=near,
                          unknown=unknown, open=out)
