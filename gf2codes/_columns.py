"""Second exhaustive existence decision: grow the parity-check matrix one column at a time.

Used by :func:`gf2codes.existence.decide_existence` (``method="columns"``); it shares no
search code with the generator-row method of :mod:`gf2codes.existence` (nor with the
distance engine, the search strategies or the bounds), so the two are independent checks
of each other.

The method
----------
A binary linear ``[n, k]`` code with ``r = n - k`` is the null space of an ``r x n``
parity-check matrix ``H`` of rank ``r``; it has minimum distance ``>= D`` (``D >= 3``)
exactly when no ``D - 1`` or fewer columns of ``H`` sum to zero ([1] Thm 1.4.13; [2]
ch. 1 §3). So the columns are ``n`` distinct non-zero vectors of ``F_2^r`` such that no
new column is a sum of ``D - 2`` or fewer others. The group ``GL(r, 2)`` acts on ``H``
(a change of basis of the rows: the same code) and coordinate permutations permute the
columns; both preserve the condition.

*The frame.* If an ``[n, k, >= D]`` code exists, one with minimum distance exactly ``D``
does (puncture ``d - D`` coordinates of a word of weight ``d`` and append as many zero
coordinates). Its word of weight ``D`` is a minimal set of ``D`` columns summing to
zero, so any ``D - 1`` of them are independent; extend those to a basis with other
columns of ``H`` (rank ``r``) and map the basis to ``e_0, ..., e_{r-1}`` by ``GL(r, 2)``,
the ``D - 1`` to ``e_0, ..., e_{D-2}``. So without loss of generality ``H`` contains the
``r + 1`` *frame* columns ``e_0, ..., e_{r-1}`` and ``u = e_0 + ... + e_{D-2}``, and the
other ``k - 1`` (*free*) columns are chosen in increasing order (they form a set).

*Row order.* Permuting the rows inside the block ``{0, ..., D - 2}`` or inside
``{D - 1, ..., r - 1}`` maps the frame onto itself. With the free columns as a matrix
``M`` (columns in increasing order, row ``0`` the most significant bit), the least
``M`` of its orbit under these row permutations and all column permutations, read row
by row, has its columns increasing (an out-of-order pair could be swapped to give a
smaller matrix) and the rows of each block increasing ([3], the double-lex argument).
The search keeps only such matrices: while two adjacent rows of a block agree on the
columns so far, a new column may not have ``1`` in the first and ``0`` in the second.

Pruning:

* *distance*: a candidate is removed once it is a sum of ``D - 2`` or fewer chosen
  columns (kept as the XORs of the chosen ``t``-sets, ``t <= D - 3``);
* *counting*: fewer candidates than columns still to choose ends the branch;
* *hyperplanes*: the columns of ``H`` in a hyperplane ``W`` of ``F_2^r`` form the
  parity-check columns of a code of redundancy ``<= r - 1`` with distance ``>= D``,
  so there are at most ``N(r - 1, D)`` of them, an upper bound this module proves for
  itself (:func:`column_cap`: the sphere-packing bound [1] Thm 1.12.1, lowered by its
  own exhaustive decisions, valid by shortening). Hence every ``h != 0`` has at least
  ``n - N(r - 1, D)`` columns with ``h . c = 1`` (the dual code has no word of lower
  weight). A branch is cut when for some ``h`` the chosen columns with ``h . c = 1``
  plus the candidates with ``h . c = 1`` (at most the number still to choose) fall
  short. The counts over all ``h`` are one Walsh-Hadamard transform.

References
----------
.. [1] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*, Cambridge
   University Press, 2003, Thm 1.4.13 (distance from the columns of ``H``), Thm 1.12.1
   (sphere packing), Thm 1.5.7 (shortening).
.. [2] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1 §3.
.. [3] P. Flener, A. M. Frisch, B. Hnich, Z. Kiziltan, I. Miguel, J. Pearson and
   T. Walsh, "Breaking row and column symmetries in matrix models", CP 2002, LNCS 2470.
.. [4] P. Kaski and P. R. J. Östergård, *Classification Algorithms for Codes and
   Designs*, Springer, 2006, ch. 7 (codes built column by column from parity-check
   matrices, with isomorph rejection and pruning by counting).
"""

from __future__ import annotations

import math
import time
from collections.abc import Callable
from dataclasses import dataclass

from ._util import memo, past

__all__ = ["ColumnOutcome", "column_search", "column_cap", "frame", "CAP_NODES",
           "MAX_COLUMN_REDUNDANCY"]

#: Largest ``r = n - k`` of the column method (candidate arrays of ``2^r`` entries).
MAX_COLUMN_REDUNDANCY = 20
#: Largest ``r`` at which the hyperplane rule is applied (``2^r`` counts per node).
HYPERPLANE_REDUNDANCY = 14
#: Node budget of each decision :func:`column_cap` makes (deterministic: no clock).
CAP_NODES = 100_000

_MAX_CELLS = 1 << 25
_CHUNK = 2048


@dataclass(frozen=True)
class ColumnOutcome:
    """What :func:`column_search` found: status, nodes, stop reason, witness, lemma work.

    ``witness`` is the list of all ``n`` columns of ``H`` (frame first) as integers;
    ``lemma_nodes`` the nodes of the decisions behind the hyperplane cap.
    """

    status: str
    nodes: int
    stopped: str
    witness: tuple[int, ...] | None
    lemma_nodes: int
    cap: int


def frame(r: int, dist: int) -> list[int]:
    """The frame columns ``e_0, ..., e_{r-1}, e_0 + ... + e_{D-2}`` (bit ``r-1-i`` = row i)."""
    basis = [1 << (r - 1 - i) for i in range(r)]
    return basis + [sum(basis[:dist - 1])]


def _sphere_cap(r: int, dist: int) -> int:
    """Largest ``m`` with ``sum_{i <= t} C(m, i) <= 2^r``, ``t = (D - 1) // 2`` (and ``>= r``)."""
    t = (dist - 1) // 2
    m = r
    while sum(math.comb(m + 1, i) for i in range(t + 1)) <= (1 << r):
        m += 1
    return m


@memo(1)
def _cap_store() -> dict[tuple[int, int, bool, int], tuple[int, int]]:
    """The caps computed so far (a memo, so :func:`gf2codes._util.clear_caches` empties it)."""
    return {}


class _CapTimeout(Exception):
    """Internal: the caller's deadline passed while a cap was being computed."""


def column_cap(r: int, dist: int, compiled: bool = True, top: int = 1 << 30,
               deadline: float | None = None) -> tuple[int, int]:
    """An upper bound on the number of columns of ``F_2^r`` with no ``D - 1`` dependent.

    Any such set of ``m > r`` columns is the parity-check matrix of an
    ``[m, >= m - r, >= D]`` code (a subcode of dimension ``m - r`` keeps the distance).
    ``D = 3``: ``2^r - 1``. Even ``D``: one more than the cap for ``(r - 1, D - 1)``
    (puncture one coordinate). Odd ``D``: start from the sphere-packing bound, or from
    ``top`` (the caller needs no larger value) when that is smaller and one decision
    shows it, and lower it while an exhaustive decision of this module (node budget
    :data:`CAP_NODES`, no clock, so the same on any machine) finds no
    ``[m, m - r, D]`` code: by shortening, no longer length is possible either.

    The caller's ``deadline`` stops the work (raising ``_CapTimeout``; nothing is
    stored), so a cap is the same whenever it is returned.

    Returns
    -------
    (cap, nodes) : tuple of int
        The bound and the nodes of the decisions made for it.
    """
    key = (r, dist, compiled, top)
    store = _cap_store()
    if key not in store:
        store[key] = _compute_cap(r, dist, compiled, top, deadline)
    return store[key]


def _lemma(m: int, r: int, dist: int, compiled: bool, deadline: float | None) -> ColumnOutcome:
    out = column_search(m, m - r, dist, max_nodes=CAP_NODES, deadline=deadline, progress=None,
                        compiled=compiled)
    if out.stopped in ("time limit", "interrupted"):
        raise _CapTimeout(out.stopped)
    return out


def _compute_cap(r: int, dist: int, compiled: bool, top: int,
                 deadline: float | None) -> tuple[int, int]:
    if r < 1:
        return 0, 0
    if dist - 1 > r:  # r + 1 vectors of F_2^r are dependent
        return r, 0
    if dist == 3:  # distinct non-zero vectors
        return (1 << r) - 1, 0
    if dist % 2 == 0:
        # m columns with no D - 1 dependent give an [m, >= m - r, >= D] code; puncturing
        # one coordinate gives an [m - 1, >= m - r, >= D - 1] code, whose parity-check
        # columns are m - 1 vectors of F_2^(r-1) with no D - 2 dependent.
        below, spent = column_cap(r - 1, dist - 1, compiled, top - 1, deadline)
        return below + 1, spent
    m = sphere = _sphere_cap(r, dist)
    spent = 0
    if r < top < sphere:
        m = top
        out = _lemma(m + 1, r, dist, compiled, deadline)
        spent += out.nodes + out.lemma_nodes
        if out.status != "none":
            return sphere, spent
    while m > r:
        out = _lemma(m, r, dist, compiled, deadline)
        spent += out.nodes + out.lemma_nodes
        if out.status != "none":
            break
        m -= 1
    return m, spent


def _hyper_ok(ones: list[int], cands: list[int], rest: int, lmin: int, r: int) -> bool:
    """The hyperplane rule on plain integers (the twin of the kernel's test).

    Cheap part: ``ones[h] + rest >= lmin`` for every ``h``; then, once fewer than
    ``2^(r-2)`` candidates are left, ``ones[h] + (candidates with h . x = 1) >= lmin``.
    (Together: ``ones[h] + min(rest, count) >= lmin`` when both parts run.)
    """
    size = 1 << r
    if any(ones[h] + rest < lmin for h in range(1, size)):
        return False
    if 4 * len(cands) < size:
        for h in range(1, size):
            c1 = sum((h & x).bit_count() & 1 for x in cands)
            if ones[h] + c1 < lmin:
                return False
    return True


class _Stop(Exception):
    """Internal: a budget was used up (the reason is the message)."""


class _ColumnSearch:
    """The depth-first search of the module docstring, on Python integers."""

    def __init__(self, n: int, k: int, dist: int, lmin: int, max_nodes: int | None,
                 deadline: float | None) -> None:
        self.n, self.k, self.dist, self.r = n, k, dist, n - k
        self.lmin = lmin
        self.max_nodes = max_nodes
        self.deadline = deadline
        self.nodes = 1  # the root
        self.cols: list[int] = []

    def run(self, cands: list[int], sums: list[list[int]], ones: list[int],
            tied: int) -> list[int] | None:
        return self._extend(cands, sums, ones, tied)

    def _extend(self, cands: list[int], sums: list[list[int]], ones: list[int],
                tied: int) -> list[int] | None:
        free = self.k - 1
        depth = len(self.cols)
        if depth == free:
            return list(self.cols)
        need = free - depth
        rmask = (1 << self.r) - 1
        for idx, y in enumerate(cands):
            if self.max_nodes is not None and self.nodes >= self.max_nodes:
                raise _Stop("node budget")
            if len(cands) - idx < need:
                break
            if y & ~(y << 1) & tied & rmask:
                continue
            bad = {y ^ s for group in sums for s in group}
            rest = [x for x in cands[idx + 1:] if x not in bad]
            if len(rest) < need - 1:
                continue
            child_ones = ones
            if self.lmin > 0:
                child_ones = [ones[h] + ((h & y).bit_count() & 1) for h in range(1 << self.r)]
                if not _hyper_ok(child_ones, rest, need - 1, self.lmin, self.r):
                    continue
            child = [sums[0]] + [sums[t] + [y ^ s for s in sums[t - 1]]
                                 for t in range(1, len(sums))]
            self.cols.append(y)
            self.nodes += 1
            if self.nodes & 255 == 0 and past(self.deadline):
                raise _Stop("time limit")
            found = self._extend(rest, child, child_ones, tied & ~(y ^ (y << 1)))
            if found is not None:
                return found
            self.cols.pop()
        return None


def _start(n: int, k: int, dist: int) -> tuple[list[int], list[list[int]], list[int], int]:
    """Candidates, ``t``-set sums (``t <= D - 3``), hyperplane counts and tied rows after
    the frame. Candidates are the non-zero vectors that are not sums of ``<= D - 2``
    frame columns, in increasing order."""
    r = n - k
    fr = frame(r, dist)
    sums: list[list[int]] = [[0]] + [[] for _ in range(dist - 3)]
    forbidden = {0}
    layer: dict[tuple[int, ...], int] = {(): 0}
    for t in range(1, dist - 1):  # XORs of t-subsets of the frame, t <= D - 2
        nxt: dict[tuple[int, ...], int] = {}
        for key, val in layer.items():
            last = key[-1] if key else -1
            for j in range(last + 1, len(fr)):
                nxt[key + (j,)] = val ^ fr[j]
        layer = nxt
        forbidden.update(layer.values())
        if t <= dist - 3:
            sums[t] = [layer[key] for key in sorted(layer)]
    cands = [x for x in range(1, 1 << r) if x not in forbidden]
    ones = [sum((h & c).bit_count() & 1 for c in fr) for h in range(1 << r)]
    # adjacent rows (i, i + 1) in the same block: bit r - 1 - i marks the pair
    tied = 0
    for i in range(r - 1):
        if i != dist - 2:
            tied |= 1 << (r - 1 - i)
    return cands, sums, ones, tied


Progress = Callable[[int, dict], None]


def column_search(n: int, k: int, dist: int, *, max_nodes: int | None, deadline: float | None,
                  progress: Progress | None, compiled: bool = True) -> ColumnOutcome:
    """Decide ``[n, k, >= D]`` by the column method (``3 <= D``, ``1 <= k``, ``D <= n - k + 1``
    checked by the caller or here).

    Returns a :class:`ColumnOutcome`; ``"undecided"`` on a budget, the deadline or Ctrl-C
    (``stopped="interrupted"``), never ``"none"`` unless the search finished.
    """
    r = n - k
    if dist > r + 1:  # Singleton bound d <= n - k + 1 (Huffman & Pless Thm 2.4.1)
        return ColumnOutcome("none", 0, "immediate", None, 0, 0)
    lemma = 0
    lmin = 0
    cap = 0
    if r <= HYPERPLANE_REDUNDANCY and r >= 2:
        try:
            cap, lemma = column_cap(r - 1, dist, compiled, n - 1, deadline)
        except KeyboardInterrupt:
            return ColumnOutcome("undecided", 0, "interrupted", None, 0, 0)
        except _CapTimeout as stop:
            return ColumnOutcome("undecided", 0, str(stop), None, 0, 0)
        lmin = max(0, n - cap)
    cands, sums, ones, tied = _start(n, k, dist)
    fr = frame(r, dist)
    free = k - 1
    if len(cands) < free or (lmin > 0 and not _hyper_ok(ones, cands, free, lmin, r)):
        return ColumnOutcome("none", 1, "finished", None, lemma, cap)
    if free == 0:
        return ColumnOutcome("exists", 1, "finished", tuple(fr), lemma, cap)
    if not compiled:
        search = _ColumnSearch(n, k, dist, lmin, max_nodes, deadline)
        try:
            found = search.run(cands, sums, ones, tied)
        except _Stop as stop:
            return ColumnOutcome("undecided", search.nodes, str(stop), None, lemma, cap)
        except KeyboardInterrupt:
            return ColumnOutcome("undecided", search.nodes, "interrupted", None, lemma, cap)
        if found is None:
            return ColumnOutcome("none", search.nodes, "finished", None, lemma, cap)
        return ColumnOutcome("exists", search.nodes, "finished", tuple(fr + found), lemma, cap)
    return _run_compiled(n, k, dist, cands, sums, ones, tied, lmin, cap, lemma, max_nodes,
                         deadline, progress)


def _run_compiled(n: int, k: int, dist: int, cands: list[int], sums: list[list[int]],
                  ones: list[int], tied: int, lmin: int, cap: int, lemma: int,
                  max_nodes: int | None, deadline: float | None,
                  progress: Progress | None) -> ColumnOutcome:
    import numpy as np

    from ._column_kernels import column_dfs

    r = n - k
    free = k - 1
    top = dist - 2
    caps = [math.comb(n, t) for t in range(top)]
    if len(cands) * (free + 1) > _MAX_CELLS or sum(caps) > _MAX_CELLS:
        return ColumnOutcome("undecided", 0, f"too large ({len(cands):,} candidates)", None,
                             lemma, cap)
    cand = np.zeros((free + 1, max(len(cands), 1)), dtype=np.uint64)
    cand[0, :len(cands)] = cands
    cand_len = np.zeros(free + 1, dtype=np.int64)
    cand_len[0] = len(cands)
    pos = np.zeros(free + 1, dtype=np.int64)
    tied_a = np.zeros(free + 1, dtype=np.uint64)
    tied_a[0] = tied
    cols = np.zeros(max(free, 1), dtype=np.uint64)
    offs = np.zeros(max(top, 1), dtype=np.int64)
    if top:
        offs[:top] = np.cumsum([0] + caps[:-1])
    sums_a = np.zeros(max(sum(caps), 1), dtype=np.uint64)
    sums_len = np.zeros((free + 1, max(top, 1)), dtype=np.int64)
    for t in range(top):
        sums_a[offs[t]:offs[t] + len(sums[t])] = sums[t]
        sums_len[0, t] = len(sums[t])
    size = 1 << r
    width = size if lmin > 0 else 1
    ones_a = np.zeros((free + 1, width), dtype=np.int64)
    if lmin > 0:
        ones_a[0, :] = ones
    mark = np.zeros(size, dtype=np.int64)
    work = np.zeros(width, dtype=np.int64)
    state = np.array([0, 1, 0], dtype=np.int64)
    budget = max_nodes if max_nodes is not None else 1 << 62
    chunk = max(8, _CHUNK >> max(0, r - 10))  # a node costs about 2^r: keep chunks short
    next_report = time.perf_counter() + 0.2
    try:
        while True:
            limit = min(budget, int(state[1]) + chunk)
            code = column_dfs(cand, cand_len, pos, tied_a, cols, sums_a, offs, sums_len,
                              ones_a, mark, work, state, free, dist, r, lmin, limit)
            nodes = int(state[1])
            if code == 1:
                wit = tuple(frame(r, dist) + [int(x) for x in cols[:free]])
                return ColumnOutcome("exists", nodes, "finished", wit, lemma, cap)
            if code == 2:
                return ColumnOutcome("none", nodes, "finished", None, lemma, cap)
            if nodes >= budget:
                return ColumnOutcome("undecided", nodes, "node budget", None, lemma, cap)
            if past(deadline):
                return ColumnOutcome("undecided", nodes, "time limit", None, lemma, cap)
            now = time.perf_counter()
            if progress is not None and now >= next_report:
                next_report = now + 0.2
                progress(nodes, {"note": f"[{n},{k},{dist}] columns: {nodes:,} nodes, depth "
                                         f"{int(state[0])}/{free}, first column "
                                         f"{int(pos[0])}/{int(cand_len[0])}",
                                 "depth": int(state[0])})
    except KeyboardInterrupt:
        return ColumnOutcome("undecided", int(state[1]), "interrupted", None, lemma, cap)
