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

And one fast upper bound, **information-set decoding** in the style of
Lee–Brickell: random information sets, and the sums of at most two rows of each
systematic generator.

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
"""

from __future__ import annotations

import math
import os
import threading
import time
from collections.abc import Callable
from concurrent.futures import ThreadPoolExecutor, wait
from dataclasses import dataclass, field

import numpy as np

from . import _kernels, linalg
from .code import Code
from .exceptions import ClaimError, ParameterError, TooExpensiveError, check_int
from .parallel import Executor

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

#: ``progress(done, total, info)``: codewords examined so far, the current estimate
#: of the total, and a dict with the current ``lower`` and ``upper`` bounds.
ProgressCallback = Callable[[int, int, dict], None]

#: Without a time limit, :func:`minimum_distance` refuses work estimated above this
#: many codewords (about an hour on one core) and says so instead of hanging.
DEFAULT_MAX_WORK = 4 * 10**12

_INF = 1 << 62
_TAIL_MAX = 20  # rows tabulated in the split enumeration (tables of C(20, w) sums)
_GRAY_TAIL = 12  # rows tabulated in Gray-code enumeration (2^12 entries)
_BLOCK = 1 << 16  # entries per table block
_CHUNK = 1 << 24  # codewords per kernel call between checks of the clock
# Measured rates (codewords per second, one core) used only to choose the engine and
# to phrase estimates; see scripts/bench_distance.py.
_RATE_GRAY = 5e9
_RATE_BZ = 1.5e9


@dataclass(frozen=True)
class DistanceResult:
    """What is known about the minimum distance ``d`` of a code.

    Attributes
    ----------
    lower : int
        A proved lower bound: no nonzero codeword is lighter.
    upper : int
        The weight of :attr:`witness`, a codeword that was found; so ``d <= upper``.
    witness : numpy.ndarray
        A nonzero codeword (``uint8``) of weight ``upper``.
    exact : bool
        True only when ``lower == upper``, that is, d is proved.
    method : str
        The route: ``"gray"``, ``"brouwer-zimmermann"``, ``"dual-columns"`` (fewest
        parity-check columns summing to zero) or ``"isd"`` (upper bound only), or a
        ``+``-joined combination.
    codewords : int
        Codewords examined.
    seconds : float
        Wall-clock time spent.
    stopped : str or None
        Why the computation ended before proving d: ``"time limit"``,
        ``"interrupted"``, ``"target met"`` (d >= target proved), ``"below target"``
        (a codeword lighter than the target was found), ``"upper bound only"``.
    reason : str
        Why this route was taken (for ``"auto"``: the estimates compared).
    estimates : dict
        Estimated seconds (one core) of each route that was considered.
    information_sets : tuple of dict
        Brouwer–Zimmermann only: per information set its ``rank``, ``levels_done`` and
        the lower-bound ``contribution`` it proved (their sum, rounded up to the
        weight divisor, is the proved lower bound).
    """

    lower: int
    upper: int
    witness: np.ndarray = field(repr=False)
    exact: bool
    method: str
    codewords: int = 0
    seconds: float = 0.0
    stopped: str | None = None
    reason: str = ""
    estimates: dict[str, float] = field(default_factory=dict, compare=False)
    information_sets: tuple[dict, ...] = field(default=(), compare=False)

    @property
    def d(self) -> int | None:
        """The minimum distance when proved, else ``None``."""
        return self.upper if self.exact else None

    def at_least(self, target: int) -> bool | None:
        """Whether ``d >= target`` is proved (True), refuted (False), or open (None)."""
        if self.lower >= target:
            return True
        if self.upper < target:
            return False
        return None

    def describe(self) -> str:
        """A one-line statement of what is proved, safe to read aloud in a review."""
        if self.exact:
            return f"d = {self.upper} (proved)"
        return (f"{self.lower} <= d <= {self.upper} (not proved: only the interval is; "
                f"{self.upper} is the weight of a codeword found)")


# --------------------------------------------------------------------------- helpers
def _round_up(x: int, divisor: int) -> int:
    return -(-x // divisor) * divisor


def _unpack_word(packed: np.ndarray, n: int) -> np.ndarray:
    return linalg.unpack(packed.reshape(1, -1), n)[0]


class _Clock:
    """Time limit, interrupt and progress bookkeeping shared by the engines."""

    def __init__(self, time_limit: float | None, progress: ProgressCallback | None) -> None:
        if time_limit is not None and not time_limit > 0:
            raise ParameterError(f"Argument 'time_limit' must be positive, not {time_limit}.")
        self.start = time.perf_counter()
        self.deadline = None if time_limit is None else self.start + float(time_limit)
        self.progress = progress
        self.done = 0
        self.total = 1
        self._last_report = self.start

    def expired(self) -> bool:
        return self.deadline is not None and time.perf_counter() >= self.deadline

    def tick(self, visited: int, lower: int, upper: int) -> None:
        self.done += int(visited)
        if self.progress is not None:
            now = time.perf_counter()
            if now - self._last_report >= 0.1:
                self._last_report = now
                self.progress(self.done, max(self.total, self.done),
                              {"lower": lower, "upper": upper})

    def elapsed(self) -> float:
        return time.perf_counter() - self.start


class _Best:
    """The lightest codeword found so far."""

    def __init__(self, n: int) -> None:
        self.n = n
        self.weight = _INF
        self.word: np.ndarray | None = None  # packed

    def offer(self, weight: int, packed_word: np.ndarray) -> None:
        if weight < self.weight:
            self.weight = int(weight)
            self.word = np.array(packed_word, dtype=np.uint64)

    def witness(self) -> np.ndarray:
        assert self.word is not None
        return _unpack_word(self.word, self.n)


def _settled(best_weight: int, lower: int, target: int | None) -> str | None:
    """Why an enumeration may stop now (the proved lower bound and the lightest word
    found settle the question), or None."""
    if best_weight <= lower:
        return "exact"
    if target is not None and lower >= target:
        return "target met"
    if target is not None and best_weight < target:
        return "below target"
    return None


# ------------------------------------------------------------------ Gray-code engine
def _gray_layout(rows: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Split basis rows into outer rows (transposed) and a table of tail sums."""
    k = rows.shape[0]
    b = min(_GRAY_TAIL, k)
    tail = rows[k - b:]
    table = np.zeros((1 << b, rows.shape[1]), dtype=np.uint64)
    for j in range(b):
        table[1 << j: 2 << j] = table[: 1 << j] ^ tail[j]
    OT = np.ascontiguousarray(rows[: k - b].T)
    TT = np.ascontiguousarray(table.T)
    return OT, TT, tail


def _gray_word(rows: np.ndarray, gray: int, inner: int) -> np.ndarray:
    k = rows.shape[0]
    b = min(_GRAY_TAIL, k)
    w = np.zeros(rows.shape[1], dtype=np.uint64)
    for j in range(k - b):
        if (gray >> j) & 1:
            w ^= rows[j]
    for j in range(b):
        if (inner >> j) & 1:
            w ^= rows[k - b + j]
    return w


def _gray_search(code: Code, clock: _Clock, best: _Best, stop_at: int) -> bool:
    """Enumerate all codewords (or until a weight <= stop_at); True when complete."""
    rows = np.array(code.packed_generator, dtype=np.uint64, order="C")
    OT, TT, _ = _gray_layout(rows)
    outer = 1 << OT.shape[1]
    per = max(1, _CHUNK // TT.shape[1])
    g = 0
    while g < outer:
        stop = min(outer, g + per)
        wt, gray, inner = _kernels.gray_min_weight(OT, TT, g, stop, stop_at)
        visited = (stop - g) * TT.shape[1]
        if wt < best.weight:
            best.offer(wt, _gray_word(rows, int(gray), int(inner)))
        g = stop
        clock.tick(visited, 0, best.weight)
        if best.weight <= stop_at:
            # The kernel may have stopped inside the block: never claim completeness.
            return False
        if g < outer and clock.expired():
            return False
    return True


# ------------------------------------------------------------ Brouwer–Zimmermann engine
class _InfoSetMatrix:
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


def _information_sets(code: Code) -> list[_InfoSetMatrix]:
    """Systematic generators on successive, as far as possible disjoint, information sets."""
    n, k = code.n, code.k
    G = code.packed_generator
    used = np.zeros(n, dtype=bool)
    mats: list[_InfoSetMatrix] = []
    while True:
        order = np.concatenate([np.flatnonzero(~used), np.flatnonzero(used)])
        e = linalg.rref(G, n=n, column_order=order)
        new = e.pivots[~used[e.pivots]]
        if new.size == 0:
            break
        mats.append(_InfoSetMatrix(e.rows, int(new.size), k))
        used[new] = True
    return mats


def _level_plan(mats: list[_InfoSetMatrix], start_lower: int, divisor: int):
    """Yield ``(w, j, lower_after)``: the order of work and the bound each step proves."""
    k = mats[0].k
    for w in range(1, k + 1):
        for j, m in enumerate(mats):
            if m.contribution(w) == 0:
                continue
            lower = sum(mm.contribution(w if i <= j else w - 1) for i, mm in enumerate(mats))
            yield w, j, max(start_lower, _round_up(max(lower, 1), divisor))


def _plan_work(mats: list[_InfoSetMatrix], goal: int, start_lower: int, divisor: int) -> int:
    """Codewords enumerated until the lower bound reaches ``goal``."""
    total = 0
    for w, _j, lower in _level_plan(mats, start_lower, divisor):
        total += math.comb(mats[0].k, w)
        if lower >= goal:
            break
    return total


def estimate_work(code: Code, upper: int, *, target: int | None = None) -> int:
    """Codewords the Brouwer–Zimmermann search examines, at most, to prove d when
    ``d <= upper`` (or to settle ``d >= target``)."""
    goal = upper if target is None else min(upper, target)
    return _plan_work(_information_sets(code), goal, 1, code.weight_divisor)


class _Task:
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


_MAX_SPLIT_ROWS = 512  # see _level_tasks


def _level_tasks(m: _InfoSetMatrix, w: int, split: bool) -> list[_Task]:
    """Cut the weight-``w`` combinations of ``m`` into tasks (by the first head row when
    ``split``, so that several threads can share a level)."""
    W = m.rows.shape[1]
    # Splitting copies the head once per task (quadratic in the rows): for very tall
    # matrices (Hamming [4095,4083]) that copying alone took a minute, so do not split.
    split = split and m.a <= _MAX_SPLIT_ROWS
    zero = np.zeros(W, dtype=np.uint64)
    index = np.arange(m.a, dtype=np.int64)
    tasks: list[_Task] = []
    for w2 in range(0, min(w, m.b) + 1):
        w1 = w - w2
        if w1 > m.a:
            continue
        blocks = [(None, None)] if w2 == 0 else m.tables(w2)
        for TT, subsets in blocks:
            # w2 == 0 needs at least one head row left after fixing the first.
            if split and w1 >= (2 if w2 == 0 else 1):
                for f in range(m.a - w1 + 1):
                    tasks.append(_Task(np.ascontiguousarray(m.AT[:, f + 1:]), index[f + 1:],
                                       w1 - 1, m.rows[f].copy(), [f], TT, subsets))
            else:
                tasks.append(_Task(m.AT, index, w1, zero, [], TT, subsets))
    return tasks


class _Shared:
    """State shared by the threads of one search."""

    def __init__(self, clock: _Clock, best: _Best) -> None:
        self.clock = clock
        self.best = best
        self.lock = threading.Lock()
        self.stop = False


def _run_task(task: _Task, m: _InfoSetMatrix, sh: _Shared, stop_at: int, lower: int) -> bool:
    """Enumerate one task; True when it was completed."""
    combo = np.zeros(max(task.w1, 1), dtype=np.int64)
    state = np.arange(max(task.w1, 1), dtype=np.int64)
    while True:
        if sh.stop:
            return False
        if task.table is None:
            visited, wt, finished = _kernels.combination_min_weight(
                task.head, task.w1, state, _CHUNK, stop_at, combo, task.base)
            t = -1
        else:
            visited, wt, t, finished = _kernels.combination_table_min_weight(
                task.head, task.w1, state, task.table, _CHUNK, stop_at, combo, task.base)
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


def _enumerate_level(m: _InfoSetMatrix, w: int, sh: _Shared, stop_at: int, lower: int,
                     pool: ThreadPoolExecutor | None) -> bool:
    """All sums of ``w`` rows of ``m``; True when complete (False: stopped early)."""
    tasks = _level_tasks(m, w, split=pool is not None)
    if pool is None:
        return all(_run_task(t, m, sh, stop_at, lower) for t in tasks)
    futures = [pool.submit(_run_task, t, m, sh, stop_at, lower) for t in tasks]
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

# Per worker process: the information-set matrices and level tasks of the codes seen
# lately (rebuilt deterministically from the generator, so every process agrees).
_WORKER_CACHE: dict[bytes, tuple[list[_InfoSetMatrix], dict[tuple[int, int], list[_Task]]]] = {}


def _remote_level_task(payload: tuple) -> tuple[int, bool, int, int, bytes | None]:
    """Run task ``index`` of level ``w`` of matrix ``j`` of the code in ``payload``.

    Returns ``(index, complete, visited, best_weight, best_word_bytes)``.
    """
    key, rows_bytes, n, k, j, w, index, stop_at, deadline = payload
    if key not in _WORKER_CACHE:
        if len(_WORKER_CACHE) >= 2:
            _WORKER_CACHE.clear()
        rows = np.frombuffer(rows_bytes, dtype=np.uint64).reshape(k, -1)
        _WORKER_CACHE[key] = (_information_sets(Code.from_packed(rows, n)), {})
    mats, tasks = _WORKER_CACHE[key]
    if (j, w) not in tasks:
        tasks.clear()
        tasks[(j, w)] = _level_tasks(mats[j], w, split=True)
    clock = _Clock(None, None)
    if deadline is not None:
        clock.deadline = clock.start + max(0.0, deadline - time.time())
    sh = _Shared(clock, _Best(n))
    complete = _run_task(tasks[(j, w)][index], mats[j], sh, stop_at, 0)
    word = None if sh.best.word is None else sh.best.word.tobytes()
    return index, complete, clock.done, int(sh.best.weight), word


def _enumerate_level_remote(code: Code, mats: list[_InfoSetMatrix], j: int, w: int,
                            sh: _Shared, stop_at: int, lower: int, executor) -> bool:
    """Like :func:`_enumerate_level`, with the tasks run by ``executor``."""
    n_tasks = len(_level_tasks(mats[j], w, split=True))
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


def _bz_search(code: Code, clock: _Clock, best: _Best, target: int | None,
               start_lower: int, workers: int, executor=None,
               sets_out: list[dict] | None = None) -> tuple[int, str | None]:
    """Run Brouwer–Zimmermann; return (proved lower bound, reason for stopping or None).

    ``sets_out`` receives one dict per information set, kept current as levels
    complete: its ``rank`` (new positions), ``levels_done`` (every combination of at most
    that many rows was enumerated) and ``contribution`` (the proved weight that a
    codeword not yet seen has on its new positions).
    """
    mats = _information_sets(code)
    if sets_out is not None:
        sets_out[:] = [{"rank": m.rank, "levels_done": 0, "contribution": m.contribution(0)}
                       for m in mats]
    divisor = code.weight_divisor
    lower = max(start_lower, _round_up(sum(m.contribution(0) for m in mats) or 1, divisor))
    sh = _Shared(clock, best)

    def settled() -> str | None:
        return _settled(best.weight, lower, target)

    def refresh_total() -> None:
        goal = best.weight if target is None else min(best.weight, target)
        clock.total = max(clock.done, _plan_work(mats, goal, start_lower, divisor))

    refresh_total()
    if settled():
        return lower, settled()
    pool = ThreadPoolExecutor(max_workers=workers) if workers > 1 else None
    try:
        current_w = 0
        for w, j, lower_after in _level_plan(mats, start_lower, divisor):
            if w != current_w:
                current_w = w
                refresh_total()
            stop_at = lower if target is None else max(lower, target - 1)
            if executor is not None and math.comb(code.k, w) >= _REMOTE_MIN_WORK:
                complete = _enumerate_level_remote(code, mats, j, w, sh, stop_at, lower,
                                                   executor)
            else:
                complete = _enumerate_level(mats[j], w, sh, stop_at, lower, pool)
            sh.stop = False
            reason = settled()
            if reason:
                return lower, reason
            if not complete:
                return lower, "time limit"
            lower = max(lower, lower_after)
            if sets_out is not None:
                sets_out[j].update(levels_done=w, contribution=mats[j].contribution(w))
            reason = settled()
            if reason:
                return lower, reason
    except KeyboardInterrupt:
        # Keep what is proved: the bound of the last completed level, the best word.
        return lower, "interrupted"
    finally:
        if pool is not None:
            pool.shutdown(wait=True)
    # Every combination of every weight of the first (full-rank) matrix was seen.
    return best.weight, "exact"


# ------------------------------------------------------- dual-side (parity-check) route
_BITMAP_BITS = 32  # a bitmap of 2^32 bits (512 MiB) at most; beyond, buckets of top bits
# Measured rates (one core) of the dual-side scan, see scripts/bench_distance.py:
# subsets enumerated and looked up per second, and bitmap bytes cleared per second.
_RATE_DUAL = 4e8
_RATE_CLEAR = 1e10


def _parity_columns(code: Code) -> np.ndarray | None:
    """The columns of a parity-check matrix, one ``uint64`` each (None when n - k > 64)."""
    r = code.n - code.k
    if r > 64:
        return None
    if r == 0:
        return np.zeros(code.n, dtype=np.uint64)
    H = np.asarray(code.H, dtype=np.uint64)
    shifted = H << np.arange(r, dtype=np.uint64)[:, None]
    return np.ascontiguousarray(np.bitwise_or.reduce(shifted, axis=0))


def _dual_levels(divisor: int, start_lower: int, goal: int):
    """Weights ``w`` to examine (multiples of the divisor) to prove ``d >= goal``."""
    return [w for w in range(1, goal) if w % divisor == 0 and w >= start_lower]


def _dual_layout(r: int) -> tuple[int, int]:
    """(bits indexed by the bitmap, number of buckets of top bits) for ``r`` check bits."""
    low = min(r, _BITMAP_BITS)
    return low, 1 << (r - low)


def dual_columns_seconds(n: int, k: int, goal: int, *, divisor: int = 1,
                         start_lower: int = 1) -> float:
    """Estimated seconds (one core) for the dual-side route to prove ``d >= goal`` on an
    ``[n, k]`` code; ``inf`` when the route does not apply (``n - k > 64``)."""
    r = n - k
    if r > 64:
        return math.inf
    low, buckets = _dual_layout(r)
    clear = buckets * max(8, (1 << low) // 8) / _RATE_CLEAR
    total = 0.0
    for w in _dual_levels(divisor, start_lower, goal):
        j = w // 2
        scans = math.comb(n, j) + (math.comb(n, w - j) if w - j != j else 0)
        total += buckets * scans / _RATE_DUAL + clear
    return total


def _subset_of(cols: np.ndarray, j: int, syndrome: int) -> list[np.ndarray]:
    from . import _dual_kernels

    out = np.zeros((2, max(j, 1)), dtype=np.int64)
    got = _dual_kernels.subsets_with_sum(cols, j, np.uint64(syndrome), out)
    return [out[i, :j].copy() for i in range(got)]


def _dual_witness(n: int, cols: np.ndarray, w: int, syndrome: int, probed: bool
                  ) -> np.ndarray:
    """The codeword (packed) behind a hit: the symmetric difference of two distinct
    column subsets with equal sums (a nonempty zero-sum set of at most ``w`` columns)."""
    j = w // 2
    if probed:
        first, second = _subset_of(cols, j, syndrome), _subset_of(cols, w - j, syndrome)
        assert first and second, "the dual-side scan reported a hit that is not there"
        a, b = first[0], second[0]
    else:
        found = _subset_of(cols, j, syndrome)
        assert len(found) == 2, "the dual-side scan reported a collision that is not there"
        a, b = found
    word = np.zeros(n, dtype=np.uint8)
    word[a] ^= 1
    word[b] ^= 1
    support = word.astype(bool)
    assert support.any() and int(np.bitwise_xor.reduce(cols[support])) == 0, \
        "dual-side witness is not a codeword"
    return linalg.pack(word.reshape(1, -1))[0]


def _dual_chunks(n: int, j: int) -> list[tuple[int, int]]:
    """Ranges of the smallest index so that each holds about ``_CHUNK`` subsets."""
    if j == 0:
        return [(0, 1)]
    chunks, lo, acc = [], 0, 0
    for f in range(n - j + 1):
        acc += math.comb(n - 1 - f, j - 1)
        if acc >= _CHUNK:
            chunks.append((lo, f + 1))
            lo, acc = f + 1, 0
    if lo < n - j + 1:
        chunks.append((lo, n - j + 1))
    return chunks


def _dual_search(code: Code, clock: _Clock, best: _Best, target: int | None,
                 start_lower: int) -> tuple[int, str | None]:
    """The dual-side route: prove ``d >= w + 1`` by showing that no ``w`` columns of a
    parity-check matrix sum to zero, for ``w = 1, 2, ...`` (meet in the middle: the sums
    of ``floor(w/2)`` columns in a bitmap, those of ``ceil(w/2)`` looked up).

    Returns (proved lower bound, reason for stopping or None).
    """
    from . import _dual_kernels

    n, r = code.n, code.n - code.k
    cols = _parity_columns(code)
    assert cols is not None
    divisor = code.weight_divisor
    low, buckets = _dual_layout(r)
    low_mask = np.uint64((1 << low) - 1)
    hi_mask = np.uint64(((1 << r) - 1) ^ ((1 << low) - 1))
    bitmap = np.zeros(max(1, (1 << low) // 64), dtype=np.uint64)
    lower = start_lower

    def settled() -> str | None:
        return _settled(best.weight, lower, target)

    def scan(j: int, bucket: np.uint64, probe: bool) -> tuple[bool, int, bool]:
        """(complete, syndrome of a hit or -1, time ran out)."""
        for f_lo, f_hi in _dual_chunks(n, j):
            visited, hit, s = _dual_kernels.syndrome_scan(cols, j, f_lo, f_hi, hi_mask,
                                                          bucket, low_mask, bitmap, probe)
            clock.tick(visited, lower, best.weight)
            if hit:
                return True, int(s), False
            if clock.expired():
                return False, -1, True
        return True, -1, False

    try:
        goal = best.weight if target is None else min(best.weight, target)
        for w in range(1, n + 1):
            if settled():
                break
            if w % divisor or w < start_lower:
                continue
            goal = best.weight if target is None else min(best.weight, target)
            clock.total = max(clock.done, int(_RATE_DUAL * dual_columns_seconds(
                n, code.k, goal, divisor=divisor, start_lower=lower)) + clock.done)
            j = w // 2
            hit_word = None
            for b in range(buckets):
                bucket = np.uint64(b << low)
                bitmap[:] = 0
                done, s, late = scan(j, bucket, False)
                if late:
                    return lower, "time limit"
                if s >= 0:
                    hit_word = _dual_witness(n, cols, 2 * j, s, probed=False)
                    break
                if w - j != j:
                    done, s, late = scan(w - j, bucket, True)
                    if late:
                        return lower, "time limit"
                    if s >= 0:
                        hit_word = _dual_witness(n, cols, w, s, probed=True)
                        break
            if hit_word is not None:
                wt = int(sum(_kernels.popcount64(x) for x in hit_word))
                best.offer(wt, hit_word)
                # Every lighter weight was excluded before this level: wt == w.
                assert wt == w, "dual-side route: a lighter codeword than proved possible"
            else:
                lower = max(lower, _round_up(w + 1, divisor))
    except KeyboardInterrupt:
        return lower, "interrupted"
    reason = settled()
    return (best.weight if reason == "exact" else lower), reason


# ------------------------------------------------------------------------ public API
_ROUTE_TITLES = {
    "gray": "Gray-code enumeration of all 2^k codewords",
    "brouwer-zimmermann": "Brouwer–Zimmermann on information sets",
    "dual-columns": "fewest parity-check columns summing to zero",
}


def _gray_seconds(k: int) -> float:
    """Seconds to enumerate 2^k codewords; infinite past the float range (k >= 1024,
    where ``2.0 ** k`` overflows: Hamming [4095,4083])."""
    return math.inf if k >= 1000 else (2.0 ** k) / _RATE_GRAY


def route_estimates(code: Code, upper_guess: int, target: int | None = None
                    ) -> dict[str, float]:
    """Estimated seconds (one core) of each exact route to prove d (or settle
    ``d >= target``) when a codeword of weight ``upper_guess`` is known.

    Routes that do not apply (the dual-side route needs ``n - k <= 64``) are absent.
    """
    goal = upper_guess if target is None else min(upper_guess, target)
    out: dict[str, float] = {}
    out["gray"] = _gray_seconds(code.k)
    if code.k > 22:
        out["brouwer-zimmermann"] = estimate_work(code, upper_guess, target=target) / _RATE_BZ
    if code.n - code.k <= 64:
        div = code.weight_divisor
        out["dual-columns"] = dual_columns_seconds(code.n, code.k, goal, divisor=div,
                                                   start_lower=div)
    return out


def _choose_engine(code: Code, upper_guess: int, target: int | None
                   ) -> tuple[str, dict[str, float], str]:
    """The cheapest route by estimated time, all estimates, and the reason in words."""
    est = route_estimates(code, upper_guess, target)
    if code.k <= 22:  # microseconds: not worth a parity-check matrix (the search hot path)
        return "gray", est, f"2^{code.k} codewords take about {human_seconds(est['gray'])}"
    engine = min(est, key=lambda e: (est[e], e != "gray"))
    others = ", ".join(f"{_ROUTE_TITLES[e]} ~{_fmt_seconds(est[e])}"
                       for e in sorted(est, key=est.__getitem__) if e != engine)
    return engine, est, f"cheapest estimate, ~{_fmt_seconds(est[engine])} (against {others})"


def _fmt_seconds(s: float) -> str:
    if s < 1e-3:
        return "<1 ms"
    if s < 120:
        return f"{s:.2g} s"
    return human_seconds(s)


def minimum_distance(
    code: Code,
    *,
    time_limit: float | None = None,
    progress: ProgressCallback | None = None,
    target: int | None = None,
    method: str = "auto",
    max_work: int | None = DEFAULT_MAX_WORK,
    seed: int | np.random.Generator | None = 0,
    workers: int | None = 1,
    executor: Executor | None = None,
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

    Returns
    -------
    DistanceResult

    Raises
    ------
    TooExpensiveError
        If no time limit is given and the estimated work exceeds ``max_work``.

    Examples
    --------
    >>> from gf2codes.code import Code
    >>> C = Code([[1, 0, 0, 0, 0, 1, 1], [0, 1, 0, 0, 1, 0, 1],
    ...           [0, 0, 1, 0, 1, 1, 0], [0, 0, 0, 1, 1, 1, 1]])
    >>> minimum_distance(C).describe()
    'd = 3 (proved)'
    """
    if not isinstance(code, Code):
        raise ParameterError(f"Argument 'code' must be a Code, not {type(code).__name__}.")
    if target is not None:
        target = check_int("target", target, minimum=1)
    if method not in ("auto", "gray", "brouwer-zimmermann", "dual-columns"):
        raise ParameterError(
            "Argument 'method' must be one of auto, gray, brouwer-zimmermann, dual-columns, "
            f"not {method!r}."
        )
    if method == "dual-columns" and code.n - code.k > 64:
        raise ParameterError(
            "Argument 'method' must not be dual-columns for a code with n - k = "
            f"{code.n - code.k} > 64 check bits, not {method!r}."
        )
    workers = (os.cpu_count() or 1) if workers is None else check_int("workers", workers,
                                                                     minimum=1)
    clock = _Clock(time_limit, progress)
    best = _Best(code.n)
    divisor = code.weight_divisor
    start_lower = divisor  # every nonzero weight is a positive multiple of the divisor

    # A quick randomised pass for a light codeword: a good upper bound early, which
    # sharpens the work estimate of an exact proof. A target test (the search calls it
    # for every candidate) needs no estimate of d and finds light words itself at the
    # first levels, so it gets only a token pass.
    passes = 5 if target is not None else min(200, 5 + 40 * code.n // max(code.k, 1))
    if code.k < 62 and (1 << code.k) <= passes * (code.k * (code.k + 1) // 2 + code.n):
        passes = 0  # enumerating every codeword costs less than the passes themselves
    if passes and method == "auto" and code.k > 22 and code.n - code.k <= 64:
        # The lightest generator row is an upper guess already; when the parity-check
        # route proves d from it within milliseconds, the passes would cost more than
        # the proof (Hamming [4095,4083]: 45 passes took 15 s, the proof under 1 ms).
        rows_only = _isd(code, _rng(seed), iterations=0, deadline=None)[0]
        goal = rows_only if target is None else min(rows_only, target)
        if dual_columns_seconds(code.n, code.k, goal, divisor=divisor,
                                start_lower=divisor) < 0.01:
            passes = 0
    # With a time limit, the pre-pass gets at most a quarter of it.
    quick = _isd(code, _rng(seed), iterations=passes,
                 deadline=None if time_limit is None else time.perf_counter() + 0.25 * time_limit)
    best.offer(quick[0], quick[1])
    codewords_pre = quick[2]

    engine = method
    if engine == "auto":
        engine, estimates, reason = _choose_engine(code, best.weight, target)
    else:
        estimates, reason = {}, "asked for"
        if engine == "gray":
            estimates["gray"] = _gray_seconds(code.k)
        elif engine == "brouwer-zimmermann":
            estimates[engine] = estimate_work(code, best.weight, target=target) / _RATE_BZ
        else:
            estimates = {engine: route_estimates(code, best.weight, target)[engine]}
    seconds = estimates[engine]
    # Work in codewords; for the dual-side route, the codewords of the same time.
    if engine == "gray":
        cost = (1 << code.k) if code.k < 62 else _INF
    else:
        cost = int(min(seconds * _RATE_BZ, _INF))
    if time_limit is None and max_work is not None and cost > max_work:
        raise TooExpensiveError(
            f"proving the minimum distance of this [{code.n},{code.k}] code needs about "
            f"{cost:.2g} codewords or their equivalent (roughly {human_seconds(seconds)} on "
            "one core); pass time_limit= for a proved interval, or use quick_distance() for "
            "a fast one.",
            work=cost, seconds=seconds,
        )
    clock.total = cost
    stopped: str | None
    info_sets: list[dict] = []
    if engine == "gray":
        stop_at = start_lower if target is None else max(start_lower, target - 1)
        try:
            complete = _gray_search(code, clock, best, stop_at)
        except KeyboardInterrupt:
            complete, interrupted = False, True
        else:
            interrupted = False
        if complete or best.weight <= start_lower:
            lower, stopped = best.weight, None
        elif target is not None and best.weight < target:
            lower, stopped = start_lower, "below target"
        else:
            lower, stopped = start_lower, "interrupted" if interrupted else "time limit"
    elif engine == "dual-columns":
        lower, why = _dual_search(code, clock, best, target, start_lower)
        stopped = None if why == "exact" else why
    else:
        lower, why = _bz_search(code, clock, best, target, start_lower, workers, executor,
                                sets_out=info_sets)
        stopped = None if why == "exact" else why
    lower = min(lower, best.weight)
    _check_claims(code, lower, best.weight)
    return DistanceResult(
        lower=int(lower), upper=int(best.weight), witness=best.witness(),
        exact=lower == best.weight, method=engine, codewords=clock.done + codewords_pre,
        seconds=clock.elapsed(), stopped=None if lower == best.weight else stopped,
        reason=reason, estimates={e: float(v) for e, v in estimates.items()},
        information_sets=tuple(dict(x) for x in info_sets),
    )


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


def human_seconds(s: float) -> str:
    """A duration in the largest sensible unit, e.g. ``"66 days"``."""
    if s < 120:
        return f"{s:.0f} s"
    if s < 7200:
        return f"{s / 60:.0f} min"
    if s < 172800:
        return f"{s / 3600:.0f} h"
    if s < 3.15e8:
        return f"{s / 86400:.0f} days"
    return f"{s / 3.15e7:.2g} years"


# ------------------------------------------------------------------------------- ISD
def _rng(seed: int | np.random.Generator | None) -> np.random.Generator:
    if isinstance(seed, np.random.Generator):
        return seed
    return np.random.default_rng(seed)


def _isd(code: Code, rng: np.random.Generator, iterations: int | None,
         deadline: float | None) -> tuple[int, np.ndarray, int]:
    """Lee–Brickell with p <= 2: returns (weight, packed word, codewords examined)."""
    n, k = code.n, code.k
    G = code.packed_generator
    best_w, best_word = _INF, None
    for r in range(G.shape[0]):
        wt = sum(int(x).bit_count() for x in G[r])
        if wt < best_w:
            best_w, best_word = wt, G[r].copy()
    examined = k
    combo = np.zeros(2, dtype=np.int64)
    it = 0
    while True:
        if iterations is not None and it >= iterations:
            break
        if deadline is not None and time.perf_counter() >= deadline:
            break
        it += 1
        e = linalg.rref(G, n=n, column_order=rng.permutation(n))
        GT = np.ascontiguousarray(e.rows.T)
        for w in (1, 2):
            if w > k:
                break
            state = np.arange(2, dtype=np.int64)
            visited, wt, _ = _kernels.combination_min_weight(GT, w, state, _INF, 0, combo,
                                                             np.zeros(GT.shape[0], np.uint64))
            examined += visited
            if wt < best_w:
                best_w = int(wt)
                best_word = np.bitwise_xor.reduce(e.rows[combo[:w]], axis=0)
    assert best_word is not None  # k >= 1: the first generator row set it
    return best_w, best_word, examined


def distance_upper_bound(
    code: Code,
    *,
    time_limit: float = 1.0,
    iterations: int | None = None,
    seed: int | np.random.Generator | None = 0,
) -> DistanceResult:
    """A fast **upper bound** on d by information-set decoding (Lee–Brickell, p <= 2).

    The result is a codeword that was found, so ``d <= upper`` is certain, but
    nothing says a lighter codeword does not exist: ``lower`` is the trivial bound
    (the weight divisor) and ``exact`` is false unless that meets ``upper``.

    Parameters
    ----------
    time_limit : float
        Seconds to spend (ignored when ``iterations`` is given).
    iterations : int, optional
        Number of random information sets.
    seed : int or numpy.random.Generator
    """
    if iterations is None and not time_limit > 0:
        raise ParameterError(f"Argument 'time_limit' must be positive, not {time_limit}.")
    start = time.perf_counter()
    deadline = None if iterations is not None else start + time_limit
    w, word, examined = _isd(code, _rng(seed), iterations, deadline)
    lower = code.weight_divisor
    exact = lower >= w
    return DistanceResult(
        lower=min(lower, w), upper=w, witness=_unpack_word(word, code.n), exact=exact,
        method="isd", codewords=examined, seconds=time.perf_counter() - start,
        stopped=None if exact else "upper bound only",
    )


def quick_distance(code: Code, *, time_limit: float = 2.0,
                   seed: int | np.random.Generator | None = 0) -> DistanceResult:
    """A fast interval for d: a short exact run for the lower bound, then
    information-set decoding for the upper bound, within ``time_limit`` seconds.

    The interval is proved at both ends (the upper end by a codeword found);
    ``exact`` is true when they happen to meet.
    """
    if not time_limit > 0:
        raise ParameterError(f"Argument 'time_limit' must be positive, not {time_limit}.")
    start = time.perf_counter()
    proof = minimum_distance(code, time_limit=0.3 * time_limit, max_work=None, seed=seed)
    if proof.exact:
        return proof
    isd = distance_upper_bound(code, time_limit=max(1e-3, time_limit - proof.seconds),
                               seed=seed)
    best = isd if isd.upper < proof.upper else proof
    lower = proof.lower
    exact = lower >= best.upper
    return DistanceResult(
        lower=min(lower, best.upper), upper=best.upper, witness=best.witness, exact=exact,
        method=f"{proof.method}+isd", codewords=proof.codewords + isd.codewords,
        seconds=time.perf_counter() - start, stopped=None if exact else "upper bound only",
    )
