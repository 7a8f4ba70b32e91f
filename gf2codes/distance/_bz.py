"""The Brouwer–Zimmermann route: information sets, levels of combinations, level tasks.

Generator matrices in systematic form on successive information sets (disjoint where
the code allows it, with the rank ``r_j`` of each new set); after all combinations of
at most ``w`` rows of every matrix have been enumerated, every codeword not yet seen
has weight at least ``sum_j max(0, w + 1 - (k - r_j))`` (Zimmermann's refinement), and
the search stops as soon as that lower bound meets the lightest codeword seen. Weights
of even (doubly even) codes are multiples of 2 (4), which rounds the bound up.

A level is cut into independent tasks, run on threads here or, for large levels, on
an executor (other processes, a Dask cluster): :func:`_remote_level_task` is sent by
reference and rebuilds the matrices from the generator in the worker.

References
----------
.. [1] A. E. Brouwer, "Bounds on the size of linear codes", in *Handbook of Coding
   Theory*, V. S. Pless and W. C. Huffman (eds.), Elsevier, 1998, pp. 295-461,
   section on computing the minimum distance.
.. [2] K.-H. Zimmermann, "Integral Hecke modules, integral generalized Reed-Muller
   codes, and linear codes", Technical Report 3-96, Technische Universität
   Hamburg-Harburg, 1996.
"""

from __future__ import annotations

import math
import threading
import time
from collections.abc import Iterator
from concurrent.futures import ThreadPoolExecutor, wait

import numpy as np

from .. import _kernels, linalg
from .._util import memo
from ..code import Code
from ..parallel import Executor
from ..typing import StopReason
from ._result import CHUNK, Best, ProofClock, Settled, round_up, settled, stop_reason

__all__ = ["RATE_BZ", "InfoSetMatrix", "information_sets", "level_plan", "plan_work",
           "estimate_work", "Task", "level_tasks", "Shared", "run_task", "enumerate_level",
           "bz_search"]

#: Measured rate (codewords per second, one core) used only to choose the route and to
#: phrase estimates; see scripts/bench_distance.py.
RATE_BZ = 1.5e9
_TAIL_MAX = 20  # rows tabulated in the split enumeration (tables of C(20, w) sums)
_BLOCK = 1 << 16  # entries per table block


class InfoSetMatrix:
    """A generator matrix systematic on a set of ``rank`` new information positions."""

    def __init__(self, rows: np.ndarray, rank: int, k: int) -> None:
        self.rows = np.ascontiguousarray(rows)
        self.rank = rank
        self.k = k
        self.b = min(_TAIL_MAX, k - 1)
        self.a = k - self.b
        self.AT = np.ascontiguousarray(self.rows[: self.a].T)
        self._tables: dict[int, list[tuple[np.ndarray, np.ndarray]]] = {}

    def contribution(self, w: int) -> int:
        """Proved weight on this matrix's new positions of any codeword that needs more
        than ``w`` of its rows."""
        return max(0, w + 1 - (self.k - self.rank))

    def tables(self, w2: int) -> list[tuple[np.ndarray, np.ndarray]]:
        """Blocks of (transposed sums, combinations) of the ``w2``-subsets of the tail."""
        if w2 not in self._tables:
            sums, subsets = _kernels.subset_sums(self.rows[self.a:], w2)
            self._tables[w2] = [
                (np.ascontiguousarray(sums[t: t + _BLOCK].T), subsets[t: t + _BLOCK, :w2])
                for t in range(0, sums.shape[0], _BLOCK)
            ]
        return self._tables[w2]


def information_sets(code: Code) -> list[InfoSetMatrix]:
    """Systematic generators on successive, as far as possible disjoint, information sets."""
    n, k = code.n, code.k
    G = code.packed_generator
    used = np.zeros(n, dtype=bool)
    mats: list[InfoSetMatrix] = []
    while True:
        order = np.concatenate([np.flatnonzero(~used), np.flatnonzero(used)])
        e = linalg.rref(G, n=n, column_order=order)
        new = e.pivots[~used[e.pivots]]
        if new.size == 0:
            break
        mats.append(InfoSetMatrix(e.rows, int(new.size), k))
        used[new] = True
    return mats


def level_plan(mats: list[InfoSetMatrix], start_lower: int, divisor: int
               ) -> Iterator[tuple[int, int, int]]:
    """Yield ``(w, j, lower_after)``: the order of work and the bound each step proves."""
    k = mats[0].k
    for w in range(1, k + 1):
        for j, m in enumerate(mats):
            if m.contribution(w) == 0:
                continue
            lower = sum(mm.contribution(w if i <= j else w - 1) for i, mm in enumerate(mats))
            yield w, j, max(start_lower, round_up(max(lower, 1), divisor))


def plan_work(mats: list[InfoSetMatrix], goal: int, start_lower: int, divisor: int) -> int:
    """Codewords enumerated until the lower bound reaches ``goal``."""
    total = 0
    for w, _j, lower in level_plan(mats, start_lower, divisor):
        total += math.comb(mats[0].k, w)
        if lower >= goal:
            break
    return total


def estimate_work(code: Code, upper: int, *, target: int | None = None) -> int:
    """Codewords the Brouwer–Zimmermann search examines, at most, to prove d when
    ``d <= upper`` (or to settle ``d >= target``)."""
    goal = upper if target is None else min(upper, target)
    return plan_work(information_sets(code), goal, 1, code.weight_divisor)


class Task:
    """One independent piece of a level: ``base`` XOR (``w1``-subsets of ``head``) XOR
    (entries of ``table``, or nothing when ``table`` is None)."""

    __slots__ = ("head", "head_index", "w1", "base", "base_rows", "table", "subsets")

    def __init__(self, head, head_index, w1, base, base_rows, table, subsets) -> None:
        self.head = head  # transposed head rows, shape (W, a')
        self.head_index = head_index  # row index (in the matrix) of each head column
        self.w1 = w1
        self.base = base
        self.base_rows = base_rows
        self.table = table
        self.subsets = subsets


_MAX_SPLIT_ROWS = 512  # see level_tasks


def level_tasks(m: InfoSetMatrix, w: int, split: bool) -> list[Task]:
    """Cut the weight-``w`` combinations of ``m`` into tasks (by the first head row when
    ``split``, so that several threads can share a level)."""
    W = m.rows.shape[1]
    # Splitting copies the head once per task (quadratic in the rows): for very tall
    # matrices (Hamming [4095,4083]) that copying alone took a minute, so do not split.
    split = split and m.a <= _MAX_SPLIT_ROWS
    zero = np.zeros(W, dtype=np.uint64)
    index = np.arange(m.a, dtype=np.int64)
    tasks: list[Task] = []
    for w2 in range(0, min(w, m.b) + 1):
        w1 = w - w2
        if w1 > m.a:
            continue
        blocks = [(None, None)] if w2 == 0 else m.tables(w2)
        for TT, subsets in blocks:
            # w2 == 0 needs at least one head row left after fixing the first.
            if split and w1 >= (2 if w2 == 0 else 1):
                for f in range(m.a - w1 + 1):
                    tasks.append(Task(np.ascontiguousarray(m.AT[:, f + 1:]), index[f + 1:],
                                      w1 - 1, m.rows[f].copy(), [f], TT, subsets))
            else:
                tasks.append(Task(m.AT, index, w1, zero, [], TT, subsets))
    return tasks


class Shared:
    """State shared by the threads of one search."""

    def __init__(self, clock: ProofClock, best: Best) -> None:
        self.clock = clock
        self.best = best
        self.lock = threading.Lock()
        self.stop = False


def run_task(task: Task, m: InfoSetMatrix, sh: Shared, stop_at: int, lower: int) -> bool:
    """Enumerate one task; True when it was completed."""
    combo = np.zeros(max(task.w1, 1), dtype=np.int64)
    state = np.arange(max(task.w1, 1), dtype=np.int64)
    while True:
        if sh.stop:
            return False
        if task.table is None:
            visited, wt, finished = _kernels.combination_min_weight(
                task.head, task.w1, state, CHUNK, stop_at, combo, task.base)
            t = -1
        else:
            visited, wt, t, finished = _kernels.combination_table_min_weight(
                task.head, task.w1, state, task.table, CHUNK, stop_at, combo, task.base)
        with sh.lock:
            if wt < sh.best.weight:
                used = list(task.base_rows) + task.head_index[combo[: task.w1]].tolist()
                if t >= 0:
                    used += (m.a + task.subsets[t].astype(np.int64)).tolist()
                sh.best.offer(wt, np.bitwise_xor.reduce(m.rows[used], axis=0))
            sh.clock.tick(visited, lower, sh.best.weight)
            if sh.best.weight <= stop_at:
                sh.stop = True
                return False
        if finished:
            return True
        if sh.clock.expired():
            sh.stop = True
            return False


def enumerate_level(m: InfoSetMatrix, w: int, sh: Shared, stop_at: int, lower: int,
                    pool: ThreadPoolExecutor | None) -> bool:
    """All sums of ``w`` rows of ``m``; True when complete (False: stopped early)."""
    tasks = level_tasks(m, w, split=pool is not None)
    if pool is None:
        return all(run_task(t, m, sh, stop_at, lower) for t in tasks)
    futures = [pool.submit(run_task, t, m, sh, stop_at, lower) for t in tasks]
    try:
        while True:
            done, pending = wait(futures, timeout=0.2)
            if not pending:
                break
    except KeyboardInterrupt:
        sh.stop = True
        wait(futures)
        raise
    return all(f.result() for f in futures)


# ------------------------------------------- the same levels on other processes or machines
#: A level is sent to the executor (other processes, a Dask cluster) only when it has at
#: least this many codewords; smaller ones are cheaper to do here.
_REMOTE_MIN_WORK = 2 * 10**9

# Per worker process: the information-set matrices and the level tasks of the last few
# codes and levels (rebuilt deterministically from the generator, so every process
# agrees), bounded and emptied by gf2codes._util.clear_caches().
@memo(2)
def _worker_matrices(key: bytes, rows_bytes: bytes, n: int, k: int) -> list[InfoSetMatrix]:
    rows = np.frombuffer(rows_bytes, dtype=np.uint64).reshape(k, -1)
    return information_sets(Code.from_packed(rows, n))


@memo(2)
def _worker_tasks(key: bytes, rows_bytes: bytes, n: int, k: int, j: int, w: int
                  ) -> list[Task]:
    return level_tasks(_worker_matrices(key, rows_bytes, n, k)[j], w, split=True)


def _remote_level_task(payload: tuple) -> tuple[int, bool, int, int, bytes | None]:
    """Run task ``index`` of level ``w`` of matrix ``j`` of the code in ``payload``.

    Returns ``(index, complete, visited, best_weight, best_word_bytes)``.
    """
    key, rows_bytes, n, k, j, w, index, stop_at, deadline = payload
    mats = _worker_matrices(key, rows_bytes, n, k)
    tasks = _worker_tasks(key, rows_bytes, n, k, j, w)
    clock = ProofClock(None, None)
    if deadline is not None:  # wall time (time.time) is what two machines share
        clock.deadline = clock.start + max(0.0, deadline - time.time())
    sh = Shared(clock, Best(n))
    complete = run_task(tasks[index], mats[j], sh, stop_at, 0)
    word = None if sh.best.word is None else sh.best.word.tobytes()
    return index, complete, clock.done, int(sh.best.weight), word


def _enumerate_level_remote(code: Code, mats: list[InfoSetMatrix], j: int, w: int,
                            sh: Shared, stop_at: int, lower: int,
                            executor: Executor) -> bool:
    """Like :func:`enumerate_level`, with the tasks run by ``executor``."""
    n_tasks = len(level_tasks(mats[j], w, split=True))
    rows = np.ascontiguousarray(code.packed_generator)
    key = rows.tobytes() + n_tasks.to_bytes(8, "little")
    deadline = None
    if sh.clock.deadline is not None:
        deadline = time.time() + (sh.clock.deadline - time.perf_counter())
    payloads = [(key, rows.tobytes(), code.n, code.k, j, w, i, stop_at, deadline)
                for i in range(n_tasks)]
    complete = True
    results = executor.run_unordered(_remote_level_task, payloads)
    try:
        for _i, (_idx, done, visited, wt, word) in results:
            if wt < sh.best.weight and word is not None:
                sh.best.offer(wt, np.frombuffer(word, dtype=np.uint64))
            sh.clock.tick(visited, lower, sh.best.weight)
            complete = complete and done
            if sh.best.weight <= stop_at or sh.clock.expired():
                return False
    finally:
        results.close()  # cancels what has not started
    return complete


def bz_search(code: Code, clock: ProofClock, best: Best, target: int | None,
              start_lower: int, workers: int, executor: Executor | None = None,
              sets_out: list[dict] | None = None) -> tuple[int, StopReason | None]:
    """Run Brouwer–Zimmermann; return (proved lower bound, why it stopped before proving
    d, or None when d is proved).

    ``sets_out`` receives one dict per information set, kept current as levels
    complete: its ``rank`` (new positions), ``levels_done`` (every combination of at most
    that many rows was enumerated) and ``contribution`` (the proved weight that a
    codeword not yet seen has on its new positions).
    """
    mats = information_sets(code)
    if sets_out is not None:
        sets_out[:] = [{"rank": m.rank, "levels_done": 0, "contribution": m.contribution(0)}
                       for m in mats]
    divisor = code.weight_divisor
    lower = max(start_lower, round_up(sum(m.contribution(0) for m in mats) or 1, divisor))
    sh = Shared(clock, best)

    def refresh_total() -> None:
        goal = best.weight if target is None else min(best.weight, target)
        clock.total = max(clock.done, plan_work(mats, goal, start_lower, divisor))

    refresh_total()
    reason: Settled | None = settled(best.weight, lower, target)
    if reason:
        return lower, stop_reason(reason)
    pool = ThreadPoolExecutor(max_workers=workers) if workers > 1 else None
    try:
        current_w = 0
        for w, j, lower_after in level_plan(mats, start_lower, divisor):
            if w != current_w:
                current_w = w
                refresh_total()
            stop_at = lower if target is None else max(lower, target - 1)
            if executor is not None and math.comb(code.k, w) >= _REMOTE_MIN_WORK:
                complete = _enumerate_level_remote(code, mats, j, w, sh, stop_at, lower,
                                                   executor)
            else:
                complete = enumerate_level(mats[j], w, sh, stop_at, lower, pool)
            sh.stop = False
            reason = settled(best.weight, lower, target)
            if reason:
                return lower, stop_reason(reason)
            if not complete:
                return lower, "time limit"
            lower = max(lower, lower_after)
            if sets_out is not None:
                sets_out[j].update(levels_done=w, contribution=mats[j].contribution(w))
            reason = settled(best.weight, lower, target)
            if reason:
                return lower, stop_reason(reason)
    except KeyboardInterrupt:
        # Keep what is proved: the bound of the last completed level, the best word.
        return lower, "interrupted"
    finally:
        if pool is not None:
            pool.shutdown(wait=True)
    # Every combination of every weight of the first (full-rank) matrix was seen.
    return best.weight, None
