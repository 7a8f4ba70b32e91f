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
from fractions import Fraction
from typing import Any

import numpy as np

from .. import _kernels, linalg
from .._util import memo
from ..code import Code
from ..exceptions import ParameterError
from ..parallel import Executor
from ..typing import StopReason
from ._result import CHUNK, Best, ProofClock, Settled, round_up, settled, stop_reason
from ._symmetry import Symmetry

__all__ = ["RATE_BZ", "InfoSetMatrix", "information_sets", "ARGUMENTS", "Plan", "make_plans",
           "choose_plan", "level_plan", "plan_work", "estimate_work", "Task", "level_tasks",
           "Shared", "run_task", "enumerate_level", "bz_search"]

#: Measured rate (codewords per second, one core) used only to choose the route and to
#: phrase estimates; see scripts/bench_distance.py.
RATE_BZ = 1.5e9
_TAIL_MAX = 20  # rows tabulated in the split enumeration (tables of C(20, w) sums)
_BLOCK = 1 << 16  # entries per table block


class InfoSetMatrix:
    """A generator matrix systematic on an information set, ``rank`` of whose positions
    are new (not in an earlier set), for a code of dimension ``k``.

    ``rows`` are the rows enumerated; ``base`` (default zero) is XORed into every
    combination (the cyclic-window plan enumerates the combinations that contain one
    fixed row: ``base`` is that row and ``rows`` the others). ``positions`` is the
    whole information set (the pivot columns of the systematic matrix).
    """

    def __init__(self, rows: np.ndarray, rank: int, k: int, *,
                 base: np.ndarray | None = None,
                 positions: np.ndarray | None = None) -> None:
        self.rows = np.ascontiguousarray(rows)
        self.rank = rank
        self.k = k
        self.nrows = int(self.rows.shape[0])
        self.base = (np.zeros(self.rows.shape[1], dtype=np.uint64) if base is None
                     else np.ascontiguousarray(base, dtype=np.uint64))
        self.positions = (np.zeros(0, dtype=np.int64) if positions is None
                          else np.asarray(positions, dtype=np.int64))
        self.b = min(_TAIL_MAX, self.nrows - 1)
        self.a = self.nrows - self.b
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


#: Column orders tried by :func:`information_sets` beyond the plain one (seeded, so every
#: process builds the same sets), when the code is small enough for it to be cheap.
_SET_TRIALS = 4
_SET_TRIAL_MAX_ENTRIES = 1 << 18  # k * n above which only the plain order is tried


def _greedy_sets(G: np.ndarray, n: int, k: int, first: np.ndarray
                 ) -> list[tuple[np.ndarray, np.ndarray, int]]:
    """Successive information sets, each taking the unused columns first in the order
    ``first``: (systematic rows, pivots, number of new positions) per set."""
    used = np.zeros(n, dtype=bool)
    out: list[tuple[np.ndarray, np.ndarray, int]] = []
    while True:
        order = np.concatenate([first[~used[first]], first[used[first]]])
        e = linalg.rref(G, n=n, column_order=order)
        new = e.pivots[~used[e.pivots]]
        if new.size == 0:
            break
        out.append((e.rows, e.pivots, int(new.size)))
        used[new] = True
    return out


def _set_quality(ranks: list[int]) -> tuple[int, ...]:
    """How good a list of set ranks is: the ranks in decreasing order, compared
    lexicographically. For disjoint sets the ranks sum to the number of nonzero columns
    whatever the order, so what can be improved is how they are distributed; a larger
    largest rank (then second largest, ...) makes the Zimmermann bound
    ``sum_j max(0, w + 1 - (k - r_j))`` positive at a lower level ``w``."""
    return tuple(sorted(ranks, reverse=True))


@memo(4)
def information_sets(code: Code) -> list[InfoSetMatrix]:
    """Systematic generators on successive, as far as possible disjoint, information
    sets, with the distribution of ranks that proves the most at the lowest levels.

    Each set takes the columns not used by earlier sets first (Zimmermann's
    construction): its ``rank`` is the number of its new positions. The greedy choice
    of the first sets can leave a later one a small rank when another choice would not,
    so besides the natural column order a few seeded random orders are tried (when
    ``k * n`` is small enough for that to be cheap) and the sets kept are those with the
    best distribution of ranks (:func:`_set_quality`). Deterministic: every process
    builds the same sets; the last few are memoised (they depend only on the subspace,
    which is what codes compare equal by).
    """
    n, k = code.n, code.k
    G = code.packed_generator
    orders = [np.arange(n, dtype=np.int64)]
    if k * n <= _SET_TRIAL_MAX_ENTRIES:
        gen = np.random.default_rng(0x5E75)
        orders += [gen.permutation(n).astype(np.int64) for _ in range(_SET_TRIALS)]
    best: list[tuple[np.ndarray, np.ndarray, int]] | None = None
    best_q: tuple[int, ...] = ()
    for order in orders:
        sets = _greedy_sets(G, n, k, order)
        q = _set_quality([r for _rows, _piv, r in sets])
        if best is None or q > best_q:
            best, best_q = sets, q
    assert best is not None
    return [InfoSetMatrix(rows, r, k, positions=piv) for rows, piv, r in best]


# ------------------------------------------------------------------- plans of enumeration
#: The arguments a plan's lower bound rests on (``DistanceResult.argument``).
ARGUMENTS = {
    "zimmermann": "disjoint information sets, Zimmermann's sum of contributions",
    "cyclic-window": "cyclic shifts: windows of k consecutive positions starting at a one",
    "orbit-average": "automorphism group: average over the images of one information set",
    "orbit-average+zimmermann": "the larger of Zimmermann's sum and the group average",
    # The dual-side route's argument (gf2codes.distance._dual.dual_search).
    "orbit-columns": "automorphism group: every codeword has an image through one "
                     "representative column per orbit, avoiding the earlier orbits",
}


class Plan:
    """Which matrices are enumerated, in which order, and the lower bound each step
    proves. Built by :func:`make_plans`; every bound is proved in that function's
    docstring.

    ``steps(start_lower, divisor)`` yields ``(w, j, lower_after)``: enumerate every
    combination of ``w`` rows of ``mats[j]`` (``w - 1`` rows of ``mats[j].rows`` with
    its ``base`` for the cyclic-window plan); once it is complete every codeword
    lighter than the lightest one seen has weight at least ``lower_after``.
    """

    def __init__(self, argument: str, mats: list[InfoSetMatrix],
                 symmetry: Symmetry | None = None) -> None:
        self.argument = argument
        self.mats = mats
        self.symmetry = symmetry
        self._orbit_counts = ([_orbit_counts(m.positions, symmetry) for m in mats]
                              if symmetry is not None else [])

    def rows_in_step(self, w: int) -> int:
        """Rows chosen from ``mats[j].rows`` at level ``w``."""
        return w - 1 if self.argument == "cyclic-window" else w

    def step_work(self, w: int, j: int) -> int:
        """Codewords enumerated by the step ``(w, j)``."""
        return math.comb(self.mats[j].nrows, self.rows_in_step(w))

    def set_bound(self, j: int, levels: int) -> int:
        """The bound that set ``j`` alone proves after ``levels`` complete levels
        (before rounding to the weight divisor)."""
        if levels <= 0:
            return 0
        if self.argument == "cyclic-window":
            return 2 * levels + 1
        if self.argument == "zimmermann":
            return self.mats[j].contribution(levels)
        return _orbit_bound(self._orbit_counts[j], levels + 1)

    def bound(self, levels: list[int]) -> int:
        """The proved bound (before rounding) when set ``j`` has ``levels[j]`` levels."""
        zim = sum(self.contribution(j, lv) for j, lv in enumerate(levels))
        if self.argument == "zimmermann":
            return zim
        best = max(self.set_bound(j, lv) for j, lv in enumerate(levels))
        return max(best, zim) if self.argument == "orbit-average+zimmermann" else best

    def steps(self, start_lower: int, divisor: int) -> Iterator[tuple[int, int, int]]:
        """Yield ``(w, j, lower_after)``: the order of work and the bound each step
        proves."""
        levels = [0] * len(self.mats)
        top = self.mats[0].nrows + (1 if self.argument == "cyclic-window" else 0)
        for w in range(1, top + 1):
            for j, m in enumerate(self.mats):
                if self.argument in ("zimmermann", "orbit-average+zimmermann") and \
                        m.contribution(w) == 0 and j > 0:
                    continue  # this set proves nothing more at this level
                levels[j] = w
                yield w, j, max(start_lower, round_up(max(self.bound(levels), 1), divisor))

    def work_to(self, goal: int, start_lower: int, divisor: int) -> int:
        """Codewords enumerated until the lower bound reaches ``goal``."""
        total = 0
        for w, j, lower in self.steps(start_lower, divisor):
            total += self.step_work(w, j)
            if lower >= goal:
                break
        return total

    def contribution(self, j: int, levels: int) -> int:
        """Zimmermann's contribution of set ``j`` after ``levels`` levels: 0 for the
        cyclic-window plan, which does not enumerate every combination of a level and
        so proves nothing by that argument."""
        if self.argument == "cyclic-window":
            return 0
        return self.mats[j].contribution(levels)

    def describe_set(self, j: int) -> dict[str, Any]:
        """The per-set record of ``verify --json`` at the start (no level done)."""
        m = self.mats[j]
        out: dict[str, Any] = {"rank": m.rank, "levels_done": 0,
                               "contribution": self.contribution(j, 0),
                               "argument": self.argument}
        if self.symmetry is not None:
            out["bound"] = 0
            out["images"] = _images_text(self.symmetry, self.argument)
        return out


def _images_text(sym: Symmetry, argument: str) -> str:
    """Which images of the set the plan credits, in words."""
    if argument == "cyclic-window":
        return (f"all {len(sym.orbits[0])} cyclic shifts of the window, each started at "
                "a one of the codeword")
    return f"every image under the group of {sym.describe()}"


def _orbit_counts(positions: np.ndarray, sym: Symmetry | None
                  ) -> list[tuple[int, int]]:
    """Per orbit ``O``: ``(|I ∩ O|, |O|)`` for the information set ``I``."""
    if sym is None:
        return []
    inside = np.zeros(max((max(o) for o in sym.orbits), default=-1) + 1, dtype=bool)
    inside[positions] = True
    return [(int(inside[list(o)].sum()), len(o)) for o in sym.orbits]


def _orbit_bound(counts: list[tuple[int, int]], t: int) -> int:
    """The least weight ``W = sum_O c_O`` with ``sum_O c_O |I ∩ O| / |O| >= t`` and
    ``0 <= c_O <= |O|`` (a fractional knapsack, solved exactly by filling the orbits in
    decreasing order of ``|I ∩ O| / |O|``; the optimum of the relaxation, rounded up, is
    a valid lower bound for integer ``c_O``)."""
    need = Fraction(t)
    total = Fraction(0)
    for a, s in sorted(counts, key=lambda x: Fraction(x[0], x[1]), reverse=True):
        if a == 0 or need <= 0:
            break
        if need <= a:
            total += need * s / a
            need = Fraction(0)
            break
        total += s
        need -= a
    if need > 0:  # more than k ones on an information set: no such codeword
        return _NO_WORD
    return math.ceil(total)


_NO_WORD = 1 << 40  # a bound above every weight (the condition cannot be met)


def _window_matrix(code: Code) -> InfoSetMatrix | None:
    """The systematic generator on the window ``0 .. k-1`` with the row of pivot 0 as
    ``base`` and the other ``k - 1`` rows to choose from, or None when the window is
    not an information set (it always is for a cyclic code; checked anyway)."""
    n, k = code.n, code.k
    e = linalg.rref(code.packed_generator, n=n, column_order=np.arange(n, dtype=np.int64))
    if not np.array_equal(np.sort(e.pivots), np.arange(k)):
        return None
    zero_row = int(np.flatnonzero(e.pivots == 0)[0])
    others = np.delete(np.arange(k), zero_row)
    return InfoSetMatrix(e.rows[others], k, k, base=e.rows[zero_row],
                         positions=np.arange(k, dtype=np.int64))


def _balanced_matrix(code: Code, sym: Symmetry) -> InfoSetMatrix:
    """A systematic generator on an information set spread evenly over the orbits
    (columns tried round-robin across the orbits), which makes the group average
    largest."""
    lists = [list(o) for o in sorted(sym.orbits, key=len, reverse=True)]
    order = [o[i] for i in range(max(len(o) for o in lists)) for o in lists if i < len(o)]
    e = linalg.rref(code.packed_generator, n=code.n,
                    column_order=np.asarray(order, dtype=np.int64))
    return InfoSetMatrix(e.rows, code.k, code.k, positions=e.pivots)


@memo(4)
def make_plans(code: Code, symmetry: Symmetry | None) -> list[Plan]:
    """Every plan that applies to ``code`` with the automorphism group ``symmetry``.

    Let ``c`` be a nonzero codeword lighter than the lightest codeword seen so far,
    ``W`` its weight, and ``G`` the (checked) automorphism group. The image ``σ(c)``
    of ``c`` under any ``σ`` in ``G`` is a codeword of the same weight ``W``, so it was
    not seen either.

    * **zimmermann** (no group): with the systematic matrix of set ``j`` complete up to
      ``w_j`` rows, ``c`` is a sum of more than ``w_j`` of its rows, so ``c`` has more
      than ``w_j`` ones on that information set, and at least ``w_j + 1 - (k - r_j)``
      on the ``r_j`` new positions of the set; the new positions of the sets are
      disjoint, so ``W >= sum_j max(0, w_j + 1 - (k - r_j))`` [2]_.
    * **orbit-average** (any group): with set ``I`` (of size ``k``) complete up to
      ``w`` rows, every image ``σ(c)`` has at least ``w + 1`` ones on ``I``. Averaging
      over ``σ`` uniform in ``G``: coordinate ``i`` lands in ``I`` with probability
      ``|I ∩ O(i)| / |O(i)|`` (``σ(i)`` is uniform on the orbit ``O(i)``), so
      ``sum_O c_O |I ∩ O| / |O| >= w + 1`` where ``c_O`` is the number of ones of ``c``
      on the orbit ``O`` and ``0 <= c_O <= |O|``. The least ``sum_O c_O = W`` under
      that constraint (:func:`_orbit_bound`) is a lower bound; for a transitive group
      it is ``ceil((w + 1) n / k)``. Equivalently: a codeword of weight ``W`` has an
      image with at most ``floor(W k / n)`` ones on ``I``, so enumerating ``I`` to that
      level finds every codeword of weight ``W`` up to the group action.
      **orbit-average+zimmermann** takes the larger of this bound (for every set) and
      Zimmermann's sum, both valid for the same enumeration; they are never added.
    * **cyclic-window** (the cyclic shift is an automorphism and ``2k <= n + 1``): the
      ``k`` consecutive positions ``0 .. k-1`` form an information set of a cyclic code
      [3]_; the plan enumerates the combinations of at most ``w`` rows of its
      systematic matrix that contain the row of position 0, i.e. every codeword that
      has a one at position 0 and at most ``w`` ones on ``0 .. k-1``. Let
      ``a_1 .. a_W`` be the support of ``c``; the shift taking ``a_i`` to 0 maps the
      window ``a_i .. a_i + k - 1`` (mod ``n``) onto ``0 .. k-1``, so each window
      ``[a_i, a_i + k)`` holds at least ``w + 1`` ones of ``c``. Summing over ``i``:
      ``W`` (each window holds its own start) plus the ordered pairs ``(i, l)``,
      ``i != l``, with ``a_l - a_i mod n`` in ``1 .. k-1``; a pair and its reverse
      cannot both qualify, since their differences add up to ``n >= 2k - 1``. So
      ``W (w + 1) <= W + W (W - 1) / 2``, that is ``W >= 2w + 1`` — the bound of two
      full disjoint sets at level ``w`` for the price of ``C(k-1, w-1)`` codewords
      instead of ``2 C(k, w)``. The same idea for cyclic codes is the basis of the
      cyclic-code refinement of Brouwer–Zimmermann described by Grassl [1]_.

    The plans of the last few codes are memoised (they depend only on the subspace and
    the group).

    In every plan, after the last level (all combinations of one matrix, or every
    codeword with a one at position 0, which every nonzero codeword of a cyclic code
    has up to a shift) nothing lighter is left and ``d`` is the lightest weight seen.

    References
    ----------
    .. [1] M. Grassl, "Searching for linear codes with large minimum distance", in
       W. Bosma and J. Cannon (eds.), *Discovering Mathematics with Magma*, Springer,
       2006, pp. 287-313.
    .. [2] K.-H. Zimmermann, "Integral Hecke modules, integral generalized Reed-Muller
       codes, and linear codes", Technical Report 3-96, Technische Universität
       Hamburg-Harburg, 1996.
    .. [3] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
       Codes*, North-Holland, 1977, ch. 7 (an information set of a cyclic code: any
       ``k`` consecutive coordinates).
    """
    mats = information_sets(code)
    plans = [Plan("zimmermann", mats)]
    if symmetry is None:
        return plans
    plans.append(Plan("orbit-average+zimmermann", mats, symmetry))
    # for a transitive group every information set meets the one orbit in k positions
    first = mats[0] if symmetry.transitive else _balanced_matrix(code, symmetry)
    plans.append(Plan("orbit-average", [first], symmetry))
    if symmetry.cyclic and 2 * code.k <= code.n + 1 and code.k >= 3:
        wm = _window_matrix(code)
        if wm is not None:
            plans.append(Plan("cyclic-window", [wm], symmetry))
    return plans


def choose_plan(plans: list[Plan], goal: int, start_lower: int, divisor: int) -> Plan:
    """The plan with the least work to reach ``goal`` (the first on ties)."""
    return min(plans, key=lambda p: p.work_to(goal, start_lower, divisor))


def level_plan(mats: list[InfoSetMatrix], start_lower: int, divisor: int
               ) -> Iterator[tuple[int, int, int]]:
    """Yield ``(w, j, lower_after)`` of the plain (Zimmermann) plan on ``mats``."""
    return Plan("zimmermann", mats).steps(start_lower, divisor)


def plan_work(mats: list[InfoSetMatrix], goal: int, start_lower: int, divisor: int) -> int:
    """Codewords the plain (Zimmermann) plan enumerates until the bound reaches ``goal``."""
    return Plan("zimmermann", mats).work_to(goal, start_lower, divisor)


def estimate_work(code: Code, upper: int, *, target: int | None = None,
                  symmetry: Symmetry | None = None) -> int:
    """Codewords the Brouwer–Zimmermann search examines, at most, to prove d when
    ``d <= upper`` (or to settle ``d >= target``), with the cheapest plan that the
    automorphism group ``symmetry`` allows."""
    goal = upper if target is None else min(upper, target)
    div = code.weight_divisor
    return min(p.work_to(goal, 1, div) for p in make_plans(code, symmetry))


class Task:
    """One independent piece of a level: ``base`` XOR (``w1``-subsets of ``head``) XOR
    (entries of ``table``, or nothing when ``table`` is None).

    With ``ext`` (see :func:`_extend`), the last ``e`` head rows of each combination are
    moved into the table: ``ext = (e, heads, L, ET, starts)``, where entry ``i L + t`` of
    ``ET`` is the sum of the head rows ``heads[i]`` (an ``e``-subset) XOR table entry
    ``t`` (``table`` None: the zero word, ``L = 1``)."""

    __slots__ = ("head", "head_index", "w1", "base", "table", "subsets", "ext")

    def __init__(self, head, head_index, w1, base, table, subsets) -> None:
        self.head = head  # transposed head rows, shape (W, a')
        self.head_index = head_index  # row index (in the matrix) of each head column
        self.w1 = w1
        self.base = base  # the matrix's base XOR the rows fixed by the split
        self.table = table
        self.subsets = subsets
        self.ext: tuple | None = None


#: A task whose table has fewer than ``_EXT_TABLE`` entries moves head rows into it
#: (:func:`_extend`) until it has ``_EXT_MIN`` entries, at most ``_EXT_MAX`` entries and
#: ``_EXT_ROWS`` rows. Measured on the 2-core AVX2 machine, random [128,48] at weight 7:
#: the levels with tables of 1 and 20 entries went from 0.6e8 and 2.2e8 to about 3.3e8
#: and 4e8 codewords/s; a table of 190 entries stays faster as it is (it fits the first
#: cache level, an extended one would not).
_EXT_MIN = 2048
_EXT_MAX = 1 << 14
_EXT_TABLE = 128  # tables of at least this many entries are left as they are
_EXT_ROWS = 3
#: ... and only in a task of at least this many codewords, so that small proofs (BCH
#: [63,36], 5e5 codewords in all) do not build tables they would scan a few times.
_EXT_WORK = 1 << 20


def _extend(task: Task) -> Task:
    """``task`` with its last head rows moved into the table when its scans are short.

    The same combinations (``w1`` head rows and one table entry) are visited once each:
    a combination is its first ``w1 - e`` head rows (the prefix, all before the others)
    and the entry made of its last ``e`` head rows and its table entry.
    """
    a = task.head.shape[1]
    L = 1 if task.table is None else task.table.shape[1]
    if L >= _EXT_TABLE or task.w1 < 1 or math.comb(a, task.w1) * L < _EXT_WORK:
        return task
    e = 0
    for trial in range(1, min(task.w1, _EXT_ROWS) + 1):
        size = math.comb(a, trial) * L
        if size > _EXT_MAX:
            break
        e = trial
        if size >= _EXT_MIN:
            break
    if e == 0 or (e == 1 and task.table is None):  # no table: one head row is the plain scan
        return task
    sums, heads = _kernels.subset_sums(np.ascontiguousarray(task.head.T), e)
    W = task.head.shape[0]
    tail = (np.zeros((W, 1), dtype=np.uint64) if task.table is None else task.table)
    ET = np.ascontiguousarray((sums.T[:, :, None] ^ tail[:, None, :]).reshape(W, -1))
    firsts = heads[:, 0].astype(np.int64)
    starts = L * np.searchsorted(firsts, np.arange(a + 1), side="left").astype(np.int64)
    task.ext = (e, heads[:, :e].astype(np.int64), L, ET, starts)
    return task


_MAX_SPLIT_ROWS = 512  # see level_tasks


def level_tasks(m: InfoSetMatrix, w: int, split: bool) -> list[Task]:
    """Cut the weight-``w`` combinations of the rows of ``m`` (each XORed with
    ``m.base``) into tasks (by the first head row when ``split``, so that several
    threads can share a level). ``w >= 1``."""
    # Splitting copies the head once per task (quadratic in the rows): for very tall
    # matrices (Hamming [4095,4083]) that copying alone took a minute, so do not split.
    split = split and m.a <= _MAX_SPLIT_ROWS
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
                                      w1 - 1, m.rows[f] ^ m.base, TT, subsets))
            else:
                tasks.append(Task(m.AT, index, w1, m.base.copy(), TT, subsets))
    return [_extend(t) for t in tasks]


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
        # The clock is read before every chunk, the first included: a level of thousands
        # of small tasks, each done in one chunk, would otherwise run to its end past the
        # time limit (9.8 s under --time-limit 0.3 for a [200,60] code).
        if sh.stop:
            return False
        if sh.clock.expired():
            sh.stop = True
            return False
        if task.ext is not None:
            e, heads, L, ET, starts = task.ext
            visited, wt, t, finished = _kernels.combination_ext_min_weight(
                task.head, task.w1 - e, task.head.shape[1] - e, state, ET, starts, CHUNK,
                stop_at, combo, task.base)
        elif task.table is None:
            visited, wt, finished = _kernels.combination_min_weight(
                task.head, task.w1, state, CHUNK, stop_at, combo, task.base)
            t = -1
        else:
            visited, wt, t, finished = _kernels.combination_table_min_weight(
                task.head, task.w1, state, task.table, CHUNK, stop_at, combo, task.base)
        with sh.lock:
            if wt < sh.best.weight:
                if task.ext is not None:
                    e, heads, L, _, _ = task.ext
                    used = task.head_index[combo[: task.w1 - e]].tolist()
                    used += task.head_index[heads[t // L]].tolist()
                    if task.table is not None:
                        used += (m.a + task.subsets[t % L].astype(np.int64)).tolist()
                else:
                    used = task.head_index[combo[: task.w1]].tolist()
                    if t >= 0:
                        used += (m.a + task.subsets[t].astype(np.int64)).tolist()
                word = task.base ^ np.bitwise_xor.reduce(m.rows[used], axis=0)
                sh.best.offer(wt, word)
            sh.clock.tick(visited, lower, sh.best.weight)
            if sh.best.weight <= stop_at:
                sh.stop = True
                return False
        if finished:
            return True


def _base_only(m: InfoSetMatrix, sh: Shared, stop_at: int, lower: int) -> bool:
    """The level of no rows beyond the base: the base word itself."""
    wt = int(np.bitwise_count(m.base).sum())
    with sh.lock:
        if 0 < wt < sh.best.weight:
            sh.best.offer(wt, m.base)
        sh.clock.tick(1, lower, sh.best.weight)
        if sh.best.weight <= stop_at:
            return False
    return True


def enumerate_level(m: InfoSetMatrix, w: int, sh: Shared, stop_at: int, lower: int,
                    pool: ThreadPoolExecutor | None) -> bool:
    """All sums of ``w`` rows of ``m`` (with its base); True when complete (False:
    stopped early)."""
    if w == 0:
        return _base_only(m, sh, stop_at, lower)
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

# Per worker process: the matrix and the level tasks of the last few matrices and levels
# (rebuilt deterministically from the rows sent, so every process agrees), bounded and
# emptied by gf2codes._util.clear_caches().
@memo(2)
def _worker_matrix(key: bytes, rows_bytes: bytes, base_bytes: bytes, n_rows: int
                   ) -> InfoSetMatrix:
    # frombuffer gives read-only views; the kernels take writable arrays
    rows = np.frombuffer(rows_bytes, dtype=np.uint64).reshape(n_rows, -1).copy()
    base = np.frombuffer(base_bytes, dtype=np.uint64).copy()
    return InfoSetMatrix(rows, n_rows, n_rows, base=base)


@memo(2)
def _worker_tasks(key: bytes, rows_bytes: bytes, base_bytes: bytes, n_rows: int, w: int
                  ) -> list[Task]:
    return level_tasks(_worker_matrix(key, rows_bytes, base_bytes, n_rows), w, split=True)


def _remote_level_task(payload: tuple) -> tuple[int, bool, int, int, bytes | None]:
    """Run task ``index`` of level ``w`` (rows chosen) of the matrix in ``payload``.

    Returns ``(index, complete, visited, best_weight, best_word_bytes)``.
    """
    key, rows_bytes, base_bytes, n_rows, n, w, index, stop_at, deadline = payload
    m = _worker_matrix(key, rows_bytes, base_bytes, n_rows)
    tasks = _worker_tasks(key, rows_bytes, base_bytes, n_rows, w)
    clock = ProofClock(None, None)
    if deadline is not None:  # wall time (time.time) is what two machines share
        clock.deadline = clock.start + max(0.0, deadline - time.time())
    sh = Shared(clock, Best(n))
    complete = run_task(tasks[index], m, sh, stop_at, 0)
    word = None if sh.best.word is None else sh.best.word.tobytes()
    return index, complete, clock.done, int(sh.best.weight), word


def _enumerate_level_remote(code: Code, m: InfoSetMatrix, w: int, sh: Shared, stop_at: int,
                            lower: int, executor: Executor) -> bool:
    """Like :func:`enumerate_level` (``w >= 1``), with the tasks run by ``executor``."""
    n_tasks = len(level_tasks(m, w, split=True))
    rows = np.ascontiguousarray(m.rows)
    base = np.ascontiguousarray(m.base)
    key = rows.tobytes() + base.tobytes() + n_tasks.to_bytes(8, "little")
    deadline = None
    if sh.clock.deadline is not None:
        deadline = time.time() + (sh.clock.deadline - time.perf_counter())
    payloads = [(key, rows.tobytes(), base.tobytes(), m.nrows, code.n, w, i, stop_at,
                 deadline) for i in range(n_tasks)]
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
              sets_out: list[dict] | None = None, symmetry: Symmetry | None = None,
              plan_out: list[Plan] | None = None, argument: str | None = None
              ) -> tuple[int, StopReason | None]:
    """Run Brouwer–Zimmermann; return (proved lower bound, why it stopped before proving
    d, or None when d is proved).

    With ``symmetry`` (a group of checked automorphisms) the cheapest of the plans of
    :func:`make_plans` is run (its bounds are proved there), or the one whose argument
    is ``argument`` (the tests run every plan this way); ``plan_out`` receives it.

    ``sets_out`` receives one dict per information set, kept current as levels
    complete: its ``rank`` (new positions), ``levels_done`` (every combination of at
    most that many rows was enumerated; for the cyclic-window plan, of rows besides the
    one of position 0, plus that row), ``contribution`` (the proved weight that a
    codeword not yet seen has on its new positions: the Zimmermann argument) and the
    plan's ``argument``; with a group also ``bound`` (what this set proves alone with
    the group) and ``images`` (which images of the set are credited).
    """
    divisor = code.weight_divisor
    goal0 = best.weight if target is None else min(best.weight, target)
    plans = make_plans(code, symmetry)
    if argument is not None:
        plans = [p for p in plans if p.argument == argument]
        if not plans:
            raise ParameterError(f"Argument 'argument' must name a plan that applies to "
                                 f"this code, not {argument!r}.")
    plan = choose_plan(plans, goal0, start_lower, divisor)
    if plan_out is not None:
        plan_out[:] = [plan]
    mats = plan.mats
    if sets_out is not None:
        sets_out[:] = [plan.describe_set(j) for j in range(len(mats))]
    lower = max(start_lower, round_up(plan.bound([0] * len(mats)) or 1, divisor))
    sh = Shared(clock, best)

    def refresh_total() -> None:
        goal = best.weight if target is None else min(best.weight, target)
        clock.total = max(clock.done, plan.work_to(goal, start_lower, divisor))

    refresh_total()
    reason: Settled | None = settled(best.weight, lower, target)
    if reason:
        return lower, stop_reason(reason)
    pool = ThreadPoolExecutor(max_workers=workers) if workers > 1 else None
    try:
        current_w = 0
        for w, j, lower_after in plan.steps(start_lower, divisor):
            if w != current_w:
                current_w = w
                refresh_total()
            stop_at = lower if target is None else max(lower, target - 1)
            rows_w = plan.rows_in_step(w)
            if executor is not None and rows_w >= 1 and \
                    plan.step_work(w, j) >= _REMOTE_MIN_WORK:
                complete = _enumerate_level_remote(code, mats[j], rows_w, sh, stop_at,
                                                   lower, executor)
            else:
                complete = enumerate_level(mats[j], rows_w, sh, stop_at, lower, pool)
            sh.stop = False
            reason = settled(best.weight, lower, target)
            if reason:
                return lower, stop_reason(reason)
            if not complete:
                return lower, "time limit"
            lower = max(lower, lower_after)
            if sets_out is not None:
                sets_out[j].update(levels_done=w, contribution=plan.contribution(j, w))
                if plan.symmetry is not None:
                    sets_out[j]["bound"] = min(plan.set_bound(j, w), code.n)
            reason = settled(best.weight, lower, target)
            if reason:
                return lower, stop_reason(reason)
    except KeyboardInterrupt:
        # Keep what is proved: the bound of the last completed level, the best word.
        return lower, "interrupted"
    finally:
        if pool is not None:
            pool.shutdown(wait=True)
    # Every combination of every weight of the first (full-rank) matrix was seen (for
    # the cyclic-window plan: every codeword with a one at position 0, which every
    # nonzero codeword of a cyclic code has after some shift).
    return best.weight, None
