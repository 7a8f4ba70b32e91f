"""Exhaustive existence decisions: does a binary linear ``[n, k, >= d]`` code exist?

This module answers the question by an exhaustive, isomorph-reducing backtrack over
systematic generator matrices. It is a *proof of non-existence* when it says "none",
so it is deliberately independent of every other code path of the package (it uses
neither :mod:`gf2codes.distance` nor the search strategies nor the bounds): the
distance condition is checked here from first principles, on plain integers.

The method
----------
Every binary linear ``[n, k]`` code is equivalent (by a permutation of coordinates)
to one with a systematic generator matrix ``G = [I_k | A]`` with ``A`` a ``k x r``
matrix, ``r = n - k`` ([1] §1.6; [2] ch. 1 §2). A codeword is ``sum_{i in S} g_i``
for a set ``S`` of rows; its weight is ``|S| + wt(sum_{i in S} a_i)``. So the code
has minimum distance ``>= d`` exactly when

    for every non-empty set ``S`` of rows with ``|S| <= d - 1``:
    ``wt(sum_{i in S} a_i) >= d - |S|``                                        (*)

(sets with ``|S| >= d`` are fine whatever ``A`` is). The rows ``a_i`` of ``A`` are
chosen one at a time; a row is added only if (*) holds for every set that contains it
and earlier rows, so every partial matrix satisfies (*) on its rows.

Isomorph rejection (each rule keeps at least one matrix of every equivalence class,
so no code is lost):

* *Rows in increasing order.* Permuting the rows of ``A`` together with the same
  columns of ``I_k`` is a coordinate permutation plus a change of basis, so it gives
  an equivalent code; for ``d >= 3`` rows are distinct (two equal rows give a codeword
  of weight 2), so rows may be taken strictly increasing.
* *Columns of ``A`` in increasing lexicographic order.* Permuting the columns of ``A``
  is a coordinate permutation. That rows and columns can be ordered *at the same time*
  is the "double-lex" theorem for matrices with full row and column symmetry [3]: the
  lexicographically least matrix (read row by row) of the orbit under row and column
  permutations has both its rows and its columns in increasing order (an out-of-order
  pair of either kind could be swapped to give a smaller one). With row ``i`` read as
  an integer whose most significant bit is column 0, and each column read top to
  bottom, "increasing" is the same order for both. A partial matrix (the first rows)
  must have columns whose *prefixes* are in (weakly) increasing order, which is the
  check made as each row is added.

Pruning by the distance condition and by counting:

* a row must have weight ``>= d - 1`` (``|S| = 1`` in (*)), so only such vectors are
  candidates;
* after a row is added, the candidates for the later rows are filtered against every
  new set containing it (by (*)); the candidates for the next row are those larger
  than the last row that satisfy (*) with every set of earlier rows;
* if fewer candidates remain than rows still to be chosen, the branch is dead (the
  later rows are distinct members of the candidate list, in increasing order).

The search counts *nodes* (partial matrices visited); it stops undecided when a node
budget or a time limit is reached, or on Ctrl-C -- never "decided" without having
finished. For ``d <= 2`` the answer is immediate (even-weight code, ``k <= n - 1``; any
code, ``k <= n``).

References
----------
.. [1] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*, Cambridge
   University Press, 2003, §1.6 (equivalent codes, systematic form) and §1.4.
.. [2] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1 §2 (generator matrices in standard form).
.. [3] P. Flener, A. M. Frisch, B. Hnich, Z. Kiziltan, I. Miguel, J. Pearson and
   T. Walsh, "Breaking row and column symmetries in matrix models", *Principles and
   Practice of Constraint Programming (CP 2002)*, LNCS 2470, pp. 462-476.
.. [4] P. Kaski and P. R. J. Östergård, *Classification Algorithms for Codes and
   Designs*, Springer, 2006, ch. 4 and 7 (exhaustive generation of codes with isomorph
   rejection; the general method family used here).
"""

from __future__ import annotations

import math
import time
from collections.abc import Callable
from dataclasses import dataclass
from typing import Literal

from ._util import past
from .exceptions import ParameterError, check_int
from .typing import ExistenceStatus

__all__ = ["ExistenceDecision", "decide_existence", "choose_method", "MAX_REDUNDANCY",
           "DEFAULT_NODE_BUDGET", "METHODS"]

#: Largest redundancy ``n - k`` handled (rows of ``A`` are held in 64-bit words).
MAX_REDUNDANCY = 62
#: Nodes visited before a decision gives up (undecided) when no budget is given.
DEFAULT_NODE_BUDGET = 2_000_000

#: The answer of a decision (:data:`gf2codes.typing.ExistenceStatus`).
Status = ExistenceStatus

#: The search methods: ``"rows"`` (generator rows, this module), ``"columns"``
#: (parity-check columns, :mod:`gf2codes._columns`) and ``"residual"`` (classified
#: residual codes extended by one weight-``w`` word, :mod:`gf2codes._residual`);
#: ``"auto"`` picks rows or columns per cell (the residual method is asked for by name).
Method = Literal["auto", "rows", "columns", "residual"]
METHODS = ("auto", "rows", "columns", "residual")

#: ``progress(nodes, info)``: called about five times a second during a long decision,
#: with ``info["note"]`` a one-line status.
Progress = Callable[[int, dict], None]


@dataclass(frozen=True)
class ExistenceDecision:
    """The outcome of :func:`decide_existence`.

    Attributes
    ----------
    n, k, d : int
        The parameters asked about: a binary linear code of length ``n``, dimension
        ``k`` and minimum distance at least ``d``.
    status : {"exists", "none", "undecided"}
        ``"none"`` is a proof that no such code exists (the search finished);
        ``"exists"`` comes with a witness; ``"undecided"`` means the search stopped
        early (see ``stopped``) and proves nothing.
    nodes : int
        Partial matrices visited.
    seconds : float
    stopped : str
        ``"finished"``, ``"node budget"``, ``"time limit"``, ``"interrupted"`` or
        ``"immediate"`` (decided without a search: ``d <= 2``, ``k = n`` or ``d > n``).
    witness : tuple of int or None
        For ``"exists"``: the rows of ``A`` in ``G = [I_k | A]``, row ``i`` as an integer
        whose bit ``n - k - 1 - j`` is entry ``(i, j)``.
    method : {"rows", "columns", "trivial"}
        The search that decided (``"trivial"``: no search was needed).
    lemma_nodes : int
        Nodes of the smaller decisions the column method made for its hyperplane cap
        (part of the proof; 0 for the row method).
    """

    n: int
    k: int
    d: int
    status: Status
    nodes: int
    seconds: float
    stopped: str
    witness: tuple[int, ...] | None = None
    method: str = "rows"
    lemma_nodes: int = 0

    @property
    def decided(self) -> bool:
        """True when the answer is a proof (``"exists"`` or ``"none"``)."""
        return self.status != "undecided"

    def generator(self) -> list[list[int]]:
        """The witness as a 0/1 generator matrix ``[I_k | A]`` (``"exists"`` only)."""
        if self.witness is None:
            raise ParameterError(f"Argument 'decision' must have a witness, not status "
                                 f"{self.status!r}.")
        r = self.n - self.k
        rows = []
        for i, a in enumerate(self.witness):
            rows.append([1 if j == i else 0 for j in range(self.k)]
                        + [(a >> (r - 1 - j)) & 1 for j in range(r)])
        return rows

    def statement(self) -> str:
        """One plain sentence: what was decided, and how."""
        what = f"[{self.n},{self.k},{self.d}]"
        how = self.how()
        if self.status == "none":
            return f"no {what} code exists ({how})"
        if self.status == "exists":
            return f"a {what} code exists (found by {how})"
        return (f"existence of a {what} code undecided ({how}, stopped: {self.stopped})")

    def how(self) -> str:
        """The method and its work, e.g. ``"exhaustive search, parity-check columns,
        1,234 nodes (+ 56 for the hyperplane cap)"``."""
        if self.method == "trivial":
            return "trivial bound, no search"
        label = {"rows": "generator rows", "columns": "parity-check columns",
                 "residual": "classified residual codes"}.get(
            self.method, self.method)
        extra = f" (+ {self.lemma_nodes:,} for the hyperplane cap)" if self.lemma_nodes else ""
        return f"exhaustive search, {label}, {self.nodes:,} nodes{extra}"


def decide_existence(n: int, k: int, d: int, *, max_nodes: int | None = DEFAULT_NODE_BUDGET,
                     time_limit: float | None = None,
                     progress: Progress | None = None,
                     compiled: bool = True, method: Method = "auto",
                     max_work: int | None = None) -> ExistenceDecision:
    """Decide by exhaustive search whether a binary linear ``[n, k, >= d]`` code exists.

    Parameters
    ----------
    n, k, d : int
        Length, dimension and minimum distance, ``1 <= k <= n``, ``d >= 1``;
        ``n - k`` at most :data:`MAX_REDUNDANCY`.
    max_nodes : int or None
        Node budget; the decision is ``"undecided"`` when it is used up. ``None`` means
        no budget.
    time_limit : float or None
        Seconds; ``"undecided"`` when exceeded.
    progress : callable or None
        ``progress(nodes, info)``, called about five times a second.
    compiled : bool
        Run the compiled kernel (default) or its plain-Python twin (for the tests; the
        same search, node for node).
    method : {"auto", "rows", "columns", "residual"}
        ``"rows"``: generator rows (this module); ``"columns"``: parity-check columns
        (:mod:`gf2codes._columns`, an independent method); ``"residual"``: classified
        residual codes extended by a minimum-weight word (:mod:`gf2codes._residual`,
        a third independent method, strongest at low rates); ``"auto"``: the one
        :func:`choose_method` estimates cheaper for the cell (``"rows"`` when
        ``max_work`` is given).
    max_work : int or None
        A second budget, in candidate-row tests (a candidate tested against the sums of
        the earlier rows counts once per sum): nodes near the root cost far more than deep
        ones, so this bounds the time of a decision where a node budget cannot. Compiled
        row search only; ``"undecided"`` (``stopped="work budget"``) when used up.
        Machine independent, like the node budget.

    Returns
    -------
    ExistenceDecision
        On Ctrl-C the decision is returned ``"undecided"`` (``stopped="interrupted"``).

    Raises
    ------
    ParameterError
        If an argument is out of range.

    References
    ----------
    .. [1] Huffman & Pless 2003, §1.6 (systematic form).
    .. [2] Flener et al., CP 2002 (double-lex ordering of rows and columns).
    .. [3] Kaski & Östergård 2006, ch. 4, 7 (exhaustive generation of codes).

    Examples
    --------
    >>> decide_existence(12, 5, 5).status      # d(12, 5) = 4 (from memory)
    'none'
    >>> decide_existence(7, 4, 3).status       # the Hamming code
    'exists'
    """
    n = check_int("n", n, minimum=1)
    k = check_int("k", k, minimum=1, maximum=n)
    d = check_int("d", d, minimum=1)
    r = n - k
    if r > MAX_REDUNDANCY:
        raise ParameterError(f"Argument 'n - k' must be at most {MAX_REDUNDANCY} for an "
                             f"exhaustive decision, not {r}.")
    if max_nodes is not None:
        max_nodes = check_int("max_nodes", max_nodes, minimum=1)
    if max_work is not None:
        max_work = check_int("max_work", max_work, minimum=1)
        if not compiled or method in ("columns", "residual"):
            raise ParameterError("Argument 'max_work' needs the compiled row search.")
    if time_limit is not None and (isinstance(time_limit, bool)
                                   or not isinstance(time_limit, (int, float))
                                   or not time_limit > 0):
        raise ParameterError(f"Argument 'time_limit' must be positive, not {time_limit!r}.")
    if method not in METHODS:
        raise ParameterError(f"Argument 'method' must be one of {', '.join(METHODS)}, not "
                             f"{method!r}.")
    start = time.perf_counter()

    def immediate(status: Status, witness: tuple[int, ...] | None) -> ExistenceDecision:
        return ExistenceDecision(n, k, d, status, 0, time.perf_counter() - start,
                                 "immediate", witness, "trivial")

    # Trivial cases, each a one-line theorem.
    if d > n:  # a non-zero word has weight <= n
        return immediate("none", None)
    if d == 1:  # the whole space's k-dimensional coordinate subspace: A = 0
        return immediate("exists", (0,) * k)
    if d == 2:  # [I | 1]: every row has weight 2, sums of s rows weight s + (s mod 2)
        return immediate("exists", (1,) * k) if r >= 1 else immediate("none", None)
    if r == 0:  # k = n: the full space has d = 1
        return immediate("none", None)
    if method == "auto":
        chosen = "rows" if max_work is not None else choose_method(n, k, d)
    else:
        chosen = method
    if chosen == "residual":
        return _decide_residual(n, k, d, max_nodes, time_limit, progress, compiled, start)
    if chosen == "columns":
        return _decide_columns(n, k, d, max_nodes, time_limit, progress, compiled, start)
    if compiled:
        return _decide_compiled(n, k, d, max_nodes, time_limit, progress, start, max_work)
    search = _Backtrack(n, k, d, max_nodes, time_limit, progress, start)
    try:
        witness = search.run()
        stopped = "finished"
        status: Status = "exists" if witness is not None else "none"
    except _Stop as stop:
        witness, stopped, status = None, str(stop), "undecided"
    except KeyboardInterrupt:
        witness, stopped, status = None, "interrupted", "undecided"
    return ExistenceDecision(n, k, d, status, search.nodes, time.perf_counter() - start,
                             stopped, None if witness is None else tuple(witness))


def choose_method(n: int, k: int, d: int) -> str:
    """The method :func:`decide_existence` uses for ``"auto"``: ``"rows"`` or ``"columns"``.

    Both methods choose ``k`` (rows) or ``k - 1`` (columns) vectors of ``F_2^{n-k}``
    from the same candidates. The estimate is the work per node, which the nodes do not
    make up for: a column node also carries the sums of the ``n - k + 1`` frame
    columns (``sum_{t <= d-3} C(n, t)`` of them against ``C(k, t)`` for a row node) and,
    with the hyperplane rule on, up to ``(n - k) 2^(n-k)`` counting steps. On every cell
    of ``scripts/bench_existence.py`` the column method visits 4 to 30 times fewer
    nodes but takes longer, so it is chosen only where this per-node estimate is at
    most twice the row method's (very high rates: few check bits, small ``d``). It
    stays the independent second method (``method="columns"``) and the cross-check of
    the first. A tree-size estimate (random probes) would choose better; not done yet.
    """
    r = n - k
    if d < 3:
        return "rows"
    top = d - 2
    row_work = sum(math.comb(k, t) for t in range(top)) * max(1, k)
    col_work = (sum(math.comb(n, t) for t in range(top)) + (r << r if r <= 14 else 0)) \
        * max(1, k - 1)
    return "columns" if col_work <= 2 * row_work else "rows"


def _decide_columns(n: int, k: int, d: int, max_nodes: int | None, time_limit: float | None,
                    progress: Progress | None, compiled: bool,
                    start: float) -> ExistenceDecision:
    """:func:`gf2codes._columns.column_search`, its answer as an :class:`ExistenceDecision`."""
    from ._columns import MAX_COLUMN_REDUNDANCY, column_search

    if n - k > MAX_COLUMN_REDUNDANCY:
        return ExistenceDecision(n, k, d, "undecided", 0, time.perf_counter() - start,
                                 f"too large for the column method (n - k = {n - k})",
                                 None, "columns")
    deadline = None if time_limit is None else start + time_limit
    out = column_search(n, k, d, max_nodes=max_nodes, deadline=deadline, progress=progress,
                        compiled=compiled)
    witness = None
    if out.status == "exists" and out.witness is not None:
        # H = [I_r | u, free columns]: the code is the row space of [B^T | I_k] with B the
        # last k columns, i.e. up to the order of coordinates [I_k | A] with A = B^T,
        # whose row i is column r + i of H.
        witness = tuple(out.witness[n - k:])
    status: Status = "exists" if out.status == "exists" else (
        "none" if out.status == "none" else "undecided")
    return ExistenceDecision(n, k, d, status, out.nodes, time.perf_counter() - start,
                             out.stopped, witness, "columns", out.lemma_nodes)


def _decide_residual(n: int, k: int, d: int, max_nodes: int | None,
                     time_limit: float | None, progress: Progress | None, compiled: bool,
                     start: float) -> ExistenceDecision:
    """:class:`gf2codes._residual.ResidualSearch`, its answer as an :class:`ExistenceDecision`.

    The nodes are the vectors placed by every extension search, at every level of the
    classification of the residual codes (all of it is part of the proof).
    """
    from ._residual import ResidualSearch, Stop, systematic_rows

    deadline = None if time_limit is None else time.monotonic() + time_limit - (
        time.perf_counter() - start)
    search = ResidualSearch(max_nodes=max_nodes, deadline=deadline, progress=progress,
                            compiled=compiled)
    try:
        rows = search.find(n, k, d)
    except Stop as stop:
        return ExistenceDecision(n, k, d, "undecided", search.nodes,
                                 time.perf_counter() - start, str(stop), None, "residual")
    except KeyboardInterrupt:
        return ExistenceDecision(n, k, d, "undecided", search.nodes,
                                 time.perf_counter() - start, "interrupted", None, "residual")
    if rows is None:
        return ExistenceDecision(n, k, d, "none", search.nodes, time.perf_counter() - start,
                                 "finished", None, "residual")
    return ExistenceDecision(n, k, d, "exists", search.nodes, time.perf_counter() - start,
                             "finished", systematic_rows(rows, n), "residual")


#: Limits on the arrays of the compiled search (entries of 8 bytes).
_MAX_CANDIDATES = 1 << 22
_MAX_CELLS = 1 << 25
#: Rows of more bits are refused before 2^r candidates are listed (2^24 words: 128 MiB;
#: the limit on cells below caps the candidate table itself).
_MAX_ROW_BITS = 24
_CHUNK = 4096  # nodes per call of the kernel between clock checks


def _decide_compiled(n: int, k: int, d: int, max_nodes: int | None, time_limit: float | None,
                     progress: Progress | None, start: float,
                     max_work: int | None = None) -> ExistenceDecision:
    """The same search as :class:`_Backtrack`, run by the compiled kernel in chunks."""
    import numpy as np

    from ._existence_kernels import existence_dfs

    r = n - k
    top = d - 2

    def undecided(why: str, nodes: int) -> ExistenceDecision:
        return ExistenceDecision(n, k, d, "undecided", nodes, time.perf_counter() - start, why)

    if r > _MAX_ROW_BITS:
        return undecided(f"too large (n - k = {r}: 2^{r} candidate rows)", 0)
    allx = np.arange(1 << r, dtype=np.uint64)
    cands0 = allx[np.bitwise_count(allx) >= d - 1]
    cap = [math.comb(k, t) for t in range(top)]
    if cands0.size > _MAX_CANDIDATES or cands0.size * (k + 1) > _MAX_CELLS \
            or sum(cap) > _MAX_CELLS:
        return undecided(f"too large ({cands0.size:,} candidate rows, {sum(cap):,} sums)", 0)
    cand = np.zeros((k + 1, max(cands0.size, 1)), dtype=np.uint64)
    cand[0, :cands0.size] = cands0
    cand_len = np.zeros(k + 1, dtype=np.int64)
    cand_len[0] = cands0.size
    pos = np.zeros(k + 1, dtype=np.int64)
    tied = np.zeros(k + 1, dtype=np.uint64)
    tied[0] = ((1 << r) - 1) & ~1
    rows = np.zeros(k, dtype=np.uint64)
    offs = np.zeros(max(top, 1), dtype=np.int64)
    offs[:top] = np.cumsum([0] + cap[:-1]) if top else []
    sums = np.zeros(max(sum(cap), 1), dtype=np.uint64)  # sums[offs[0]] = 0: the empty set
    sums_len = np.zeros((k + 1, max(top, 1)), dtype=np.int64)
    sums_len[0, 0] = 1
    # depth, nodes (the root counts as one), work, work budget (0: none)
    state = np.array([0, 1, 0, max_work or 0], dtype=np.int64)
    deadline = None if time_limit is None else start + time_limit
    next_report = start + 0.2
    budget = max_nodes if max_nodes is not None else 1 << 62
    try:
        while True:
            limit = min(budget, int(state[1]) + _CHUNK)
            code = existence_dfs(cand, cand_len, pos, tied, rows, sums, offs, sums_len,
                                 state, k, d, r, limit)
            nodes = int(state[1])
            if code == 1:
                return ExistenceDecision(n, k, d, "exists", nodes,
                                         time.perf_counter() - start, "finished",
                                         tuple(int(x) for x in rows))
            if code == 2:
                return ExistenceDecision(n, k, d, "none", nodes,
                                         time.perf_counter() - start, "finished")
            if nodes >= budget:
                return undecided("node budget", nodes)
            if max_work is not None and int(state[2]) >= max_work:
                return undecided("work budget", nodes)
            if past(deadline):
                return undecided("time limit", nodes)
            now = time.perf_counter()
            if progress is not None and now >= next_report:
                next_report = now + 0.2
                progress(nodes, {"note": f"[{n},{k},{d}]: {nodes:,} nodes, depth "
                                         f"{int(state[0])}/{k}, first row {int(pos[0])}/"
                                         f"{int(cand_len[0])}", "depth": int(state[0])})
    except KeyboardInterrupt:
        return undecided("interrupted", int(state[1]))


class _Stop(Exception):
    """Internal: a budget was used up (the reason is the message)."""


class _Backtrack:
    """The depth-first search of the module docstring, on Python integers."""

    def __init__(self, n: int, k: int, d: int, max_nodes: int | None,
                 time_limit: float | None, progress: Progress | None, start: float) -> None:
        self.n, self.k, self.d, self.r = n, k, d, n - k
        self.max_nodes = max_nodes
        self.deadline = None if time_limit is None else start + time_limit
        self.progress = progress
        self.start = start
        self.nodes = 0
        self.next_report = start + 0.2
        self.rows: list[int] = []

    def _tick(self) -> None:
        self.nodes += 1
        if self.max_nodes is not None and self.nodes > self.max_nodes:
            self.nodes = self.max_nodes
            raise _Stop("node budget")
        if self.nodes & 255 == 0:
            if past(self.deadline):
                raise _Stop("time limit")
            now = time.perf_counter()
            if self.progress is not None and now >= self.next_report:
                self.next_report = now + 0.2
                self.progress(self.nodes, {
                    "note": f"[{self.n},{self.k},{self.d}]: {self.nodes:,} nodes, "
                            f"depth {len(self.rows)}/{self.k}",
                    "depth": len(self.rows)})

    def run(self) -> list[int] | None:
        r, d = self.r, self.d
        # Rule "weight >= d - 1": the candidates for every row.
        cands = [x for x in range(1 << r) if x.bit_count() >= d - 1]
        # sums[s] = XORs of the s-element sets of chosen rows, s = 0 .. d - 2 (only those
        # enter (*) for a set that also contains a new row).
        sums: list[list[int]] = [[0]] + [[] for _ in range(d - 2)]
        tied = ((1 << r) - 1) & ~1  # column pairs (j, j + 1) whose prefixes are equal
        return self._extend(cands, sums, tied)

    def _extend(self, cands: list[int], sums: list[list[int]], tied: int) -> list[int] | None:
        """Choose the remaining rows from ``cands`` (all valid as the next row)."""
        self._tick()
        depth = len(self.rows)
        if depth == self.k:
            return list(self.rows)
        need = self.k - depth
        d = self.d
        top = len(sums) - 1  # = d - 2
        for idx, y in enumerate(cands):
            if len(cands) - idx < need:  # counting rule: too few candidates left
                break
            # Column rule (double lex): a tied pair (j, j + 1) may not get 1 then 0.
            # Bit p of y is column r - 1 - p; (y << 1) has column j + 1's bit at column j's.
            if y & ~(y << 1) & tied:
                continue
            # New sets containing y: y ^ s for s in sums[t], size t + 1. Candidates x for
            # later rows must satisfy (*) for the sets {x} + (y + set of size t), i.e.
            # wt(x ^ y ^ s) >= d - 2 - t for t = 0 .. d - 3.
            new_sums = [[y ^ s for s in sums[t]] for t in range(top)]
            rest = []
            for x in cands[idx + 1:]:
                ok = True
                for t in range(top):
                    lim = d - 2 - t
                    for s in new_sums[t]:
                        if (x ^ s).bit_count() < lim:
                            ok = False
                            break
                    if not ok:
                        break
                if ok:
                    rest.append(x)
            if len(rest) < need - 1:  # counting rule for the rows after y
                continue
            child = [sums[0]] + [sums[t + 1] + new_sums[t] for t in range(top)]
            self.rows.append(y)
            found = self._extend(rest, child, tied & ~(y ^ (y << 1)))
            if found is not None:
                return found
            self.rows.pop()
        return None
