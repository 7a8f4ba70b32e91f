"""Existence decisions by classifying residual codes and extending them.

A third exhaustive method for "does a binary linear ``[n, k, >= d]`` code exist?",
independent of the row and column searches of :mod:`gf2codes.existence` and of every
other code path (it checks distances itself, on plain integers). It works best at low
rates, where those searches meet the most redundancy.

The method
----------
Suppose an ``[n, k, >= d]`` code ``C`` exists. Removing its zero coordinates and then
repeating a coordinate gives one of the same length and dimension with no zero
coordinate, so we may assume *full support*. Let ``w >= d`` be its minimum weight and
``c`` a codeword of weight ``w``, placed on the first ``w`` coordinates. The *residual*
code ``R`` (``C`` restricted to the other ``n - w`` coordinates) has dimension ``k - 1``
and minimum distance at least ``ceil(w / 2)``, because ``w < 2w`` ([1] §2.7, [2]
Theorem 2.7.1 for the general statement; the residual of a minimum-weight word), and
full support. Write ``C = <c> + C'`` with ``C'`` mapped onto ``R`` by the restriction;
a basis of ``R`` (any one: a change of basis of ``C'`` is a change of basis of ``C``)
then gives the generator matrix

    ``[ 1 ... 1 | 0 ... 0 ]``
    ``[    X    |    R    ]``      (``X`` a ``(k-1) x w`` matrix, columns ``x_1..x_w``)

For a message ``u != 0`` of ``R`` the words ``u (X|R)`` and ``c + u (X|R)`` have weights
``|uX| + |uR|`` and ``w - |uX| + |uR|``, so ``C`` has minimum weight ``w`` exactly when

    ``w - |uR| <= #{ j : u . x_j = 1 } <= |uR|``   for every ``u != 0``       (*)

Permuting the first ``w`` coordinates permutes the columns of ``X``, so ``X`` is a
multiset of vectors; adding ``c`` to a row of ``C'`` adds a fixed vector to every
``x_j``, which maps solutions of (*) to solutions (the interval is symmetric about
``w / 2``), so one ``x_j`` may be taken to be ``0``. Hence:

*An* ``[n, k, >= d]`` *code exists if and only if, for some* ``w`` *with* ``d <= w``
*(and the Griesmer bound allowing* ``[n, k, w]`` *), some full-support*
``[n - w, k - 1, >= ceil(w/2)]`` *code* ``R`` *(one of each equivalence class is enough)
admits a multiset* ``{0, x_2, ..., x_w}`` *satisfying* (*).

The classes of residual codes come from the same construction one dimension lower,
recursively (dimension 0: the empty code, of length 0), with the codes found at each
level reduced to one per equivalence class by a canonical form (below). This is the
classical classification of codes through their residuals ([3] ch. 7).

Isomorph rejection, and why it never loses a class
--------------------------------------------------
A code's *form* is the reduced row-echelon basis of the code after a relabelling of its
coordinates chosen from the code alone: coordinates are coloured by invariants
(for each weight, how many codewords of that weight contain the coordinate), the
colouring is refined (a coordinate's new colour records, for the codewords that
contain it, the colours those codewords meet) until it is stable, and ties are broken
by individualising each coordinate of the first non-trivial cell in turn; the form is
the least echelon basis over the leaves (at most ``_MAX_LEAVES`` of them). Whatever
the relabelling, the form is a code *equivalent* to the one it came from, so two codes
with the same form are equivalent and keeping one of them loses nothing. (If the leaf
cap is reached the form may differ between equivalent codes; that only keeps more
codes than needed, it never merges inequivalent ones.) Colours are combined by
hashing; a collision can only make the colouring coarser, which costs leaves, not
correctness.

References
----------
.. [1] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*, Cambridge
   University Press, 2003, §2.7 (residual codes, the Griesmer bound).
.. [2] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 17 §6 (residual codes and the Griesmer bound; section
   number from memory).
.. [3] P. Kaski and P. R. J. Östergård, *Classification Algorithms for Codes and
   Designs*, Springer, 2006, ch. 4 (canonical forms by refinement and
   individualisation) and ch. 7 (classification of linear codes).
"""

from __future__ import annotations

import time
from collections.abc import Callable
from dataclasses import dataclass, field

__all__ = ["ResidualSearch", "Stop", "canonical_form", "extensions", "griesmer_length",
           "min_distance", "systematic_rows"]

#: Leaves of the individualisation tree explored per canonical form.
_MAX_LEAVES = 256
#: Solutions copied out of the compiled search per call.
_SOLUTION_BLOCK = 4096
#: Nodes per call of the compiled search between clock checks.
_CHUNK = 1 << 16

Progress = Callable[[int, dict], None]


def griesmer_length(k: int, d: int) -> int:
    """``sum_{i < k} ceil(d / 2^i)``: no binary ``[n, k, d]`` code is shorter ([1] §2.7)."""
    return sum(-(-d // (1 << i)) for i in range(k))


class Stop(Exception):
    """Internal: a budget was used up (the reason is the message)."""


# --------------------------------------------------------------------------- codes


def _codewords(rows: tuple[int, ...]) -> list[int]:
    words = [0]
    for g in rows:
        words += [x ^ g for x in words]
    return words


def _echelon(rows: list[int], n: int) -> tuple[int, ...]:
    """Reduced row-echelon basis of the span of ``rows`` (pivot = highest bit), sorted."""
    basis: list[int] = []
    for v in rows:
        for b in basis:
            v = min(v, v ^ b)
        if v:
            basis = [min(b, b ^ v) for b in basis]
            basis.append(v)
    return tuple(sorted(basis, reverse=True))


_MIX1 = 0x9E3779B97F4A7C15
_MIX2 = 0xBF58476D1CE4E5B9
_MASK = (1 << 64) - 1


def canonical_form(rows: tuple[int, ...], n: int) -> tuple[int, ...]:
    """The form of the code spanned by ``rows`` (bit ``j`` = coordinate ``j``).

    An echelon basis of a code equivalent to it, chosen from the code alone (see the
    module docstring); equal forms imply equivalent codes.
    """
    import numpy as np

    words = np.array(_codewords(rows), dtype=np.uint64)
    bits = ((words[:, None] >> np.arange(n, dtype=np.uint64)[None, :]) & np.uint64(1))
    weight = bits.sum(axis=1)
    # colour 0: per coordinate, the weights of the codewords containing it
    key0 = [tuple(np.bincount(weight[bits[:, j] == 1].astype(np.int64), minlength=n + 1))
            for j in range(n)]
    colours = _ranks([(k,) for k in key0])
    rng = np.random.default_rng(12345)
    salt = rng.integers(1, 1 << 62, size=n + 2, dtype=np.int64).astype(np.uint64)
    wsalt = rng.integers(1, 1 << 62, size=n + 2, dtype=np.uint64)
    bits_u = bits.astype(np.uint64)
    best: list[tuple[int, ...] | None] = [None]
    leaves = [0]

    def refine(col: list[int]) -> list[int]:
        while True:
            c = np.array(col, dtype=np.int64)
            ncol = max(col) + 1
            onehot = (c[:, None] == np.arange(ncol)[None, :]).astype(np.uint64)
            meet = bits_u @ onehot  # per codeword, how many coordinates of each colour
            with np.errstate(over="ignore"):
                h = (meet * salt[:ncol][None, :]).sum(axis=1) + wsalt[weight % (n + 2)]
                h = (h ^ (h >> np.uint64(31))) * np.uint64(_MIX2)
                per = bits_u.T @ h  # per coordinate, over the codewords containing it
            new = _ranks([(col[j], int(per[j])) for j in range(n)])
            if max(new) == max(col):
                return new
            col = new

    def leaf(col: list[int]) -> None:
        leaves[0] += 1
        perm = col  # coordinate j goes to position col[j]
        mapped = []
        for g in rows:
            v = 0
            for j in range(n):
                if (g >> j) & 1:
                    v |= 1 << perm[j]
            mapped.append(v)
        form = _echelon(mapped, n)
        if best[0] is None or form < best[0]:
            best[0] = form

    def search(col: list[int]) -> None:
        col = refine(col)
        if max(col) == n - 1:
            leaf(col)
            return
        sizes = [0] * n
        for x in col:
            sizes[x] += 1
        cell = min(x for x in range(n) if sizes[x] > 1)
        for v in [j for j in range(n) if col[j] == cell]:
            if leaves[0] >= _MAX_LEAVES:
                return
            search(_ranks([(col[j], 0 if j == v else 1) for j in range(n)]))

    search(colours)
    assert best[0] is not None
    return best[0]


def _ranks(keys: list[tuple]) -> list[int]:
    order = sorted(set(keys))
    index = {key: i for i, key in enumerate(order)}
    return [index[key] for key in keys]


# ---------------------------------------------------------------------- extensions


def _bounds(residual: tuple[int, ...], w: int) -> tuple[list[int], list[int]]:
    """``low[u], high[u]`` of (*) for every message ``u`` of the residual (index 0 unused)."""
    m = len(residual)
    high = [0] * (1 << m)
    for u in range(1, 1 << m):
        v = 0
        for i in range(m):
            if (u >> i) & 1:
                v ^= residual[i]
        high[u] = v.bit_count()
    low = [w - h for h in high]
    low[0] = high[0] = 0
    return low, high


def _extend_python(low: list[int], high: list[int], m: int, s: int,
                   tick: Callable[[], None]) -> list[tuple[int, ...]]:
    """All multisets ``x_1 <= ... <= x_s`` of ``F_2^m`` whose counts lie in the bounds.

    The plain-Python twin of :func:`gf2codes._residual_kernels.extension_dfs` (same
    order, same node count: one node per vector placed).
    """
    size = 1 << m
    count = [0] * size
    out: list[tuple[int, ...]] = []
    chosen: list[int] = []

    def go(start: int) -> None:
        if len(chosen) == s:
            out.append(tuple(chosen))
            return
        left = s - len(chosen) - 1
        for x in range(start, size):
            ok = True
            for u in range(1, size):
                c = count[u] + ((u & x).bit_count() & 1)
                if c > high[u] or c + left < low[u]:
                    ok = False
                    break
            if not ok:
                continue
            for u in range(1, size):
                count[u] += (u & x).bit_count() & 1
            chosen.append(x)
            tick()
            go(x)
            chosen.pop()
            for u in range(1, size):
                count[u] -= (u & x).bit_count() & 1

    go(0)
    return out


def _build(residual: tuple[int, ...], w: int, xs: tuple[int, ...]) -> tuple[int, ...]:
    """Rows of ``C`` (bit ``j`` = coordinate ``j``): ``c`` on coordinates ``0..w-1``, then
    row ``i`` of ``X | R``; ``X``'s columns are ``0, xs[0], xs[1], ...``."""
    cols = (0,) + tuple(xs)
    rows = [(1 << w) - 1]
    for i, r in enumerate(residual):
        v = 0
        for j, x in enumerate(cols):
            if (x >> i) & 1:
                v |= 1 << j
        rows.append(v | (r << w))
    return tuple(rows)


def extensions(residual: tuple[int, ...], n_res: int, w: int, *, compiled: bool = True,
               first_only: bool = False,
               tick: Callable[[int], None] | None = None) -> list[tuple[int, ...]]:
    """The codes (rows) ``[[1^w, 0], [X, R]]`` with minimum weight ``w`` over one residual.

    ``residual`` is a basis of ``R`` (length ``n_res``); the result holds one code per
    solution of (*) with ``x_1 = 0``. ``tick(nodes)`` is called with the nodes visited
    since the last call (it may raise to stop the search).
    """
    m = len(residual)
    low, high = _bounds(residual, w)
    s = w - 1
    if s == 0:
        sols: list[tuple[int, ...]] = [()]
        if tick is not None:
            tick(0)
    elif not compiled:
        def one() -> None:
            if tick is not None:
                tick(1)
        sols = _extend_python(low, high, m, s, one)
        if first_only:
            sols = sols[:1]
    else:
        sols = _extend_compiled(low, high, m, s, first_only, tick)
    return [_build(residual, w, xs) for xs in sols]


def _extend_compiled(low: list[int], high: list[int], m: int, s: int, first_only: bool,
                     tick: Callable[[int], None] | None) -> list[tuple[int, ...]]:
    import numpy as np

    from ._residual_kernels import extension_dfs

    lo = np.array(low, dtype=np.int64)
    hi = np.array(high, dtype=np.int64)
    count = np.zeros(1 << m, dtype=np.int64)
    chosen = np.zeros(s, dtype=np.int64)
    nxt = np.zeros(s + 1, dtype=np.int64)
    sols = np.zeros((_SOLUTION_BLOCK, s), dtype=np.int64)
    state = np.zeros(4, dtype=np.int64)
    out: list[tuple[int, ...]] = []
    seen = 0
    while True:
        code = extension_dfs(lo, hi, count, chosen, nxt, sols, state, m, s,
                             int(state[1]) + _CHUNK, 1 if first_only else 0)
        out += [tuple(int(v) for v in row) for row in sols[:int(state[2])]]
        state[2] = 0
        if tick is not None:
            tick(int(state[1]) - seen)
        seen = int(state[1])
        if code == 2 or (first_only and out):
            return out[:1] if first_only else out


# ------------------------------------------------------------------ classification


@dataclass
class ResidualSearch:
    """Classification of full-support codes by residuals, and decisions built on it.

    One instance keeps the classes it has computed (``classes[(n, k, d)]``), the nodes
    visited (``nodes``: vectors placed by the extension searches, at every level) and
    the budgets; :meth:`decide` answers an existence question.
    """

    max_nodes: int | None = None
    deadline: float | None = None
    progress: Progress | None = None
    compiled: bool = True
    nodes: int = 0
    classes: dict[tuple[int, int, int], list[tuple[int, ...]]] = field(default_factory=dict)
    codes_seen: int = 0
    _next_report: float = 0.0
    _note: str = ""

    def _tick(self, add: int) -> None:
        self.nodes += add
        if self.max_nodes is not None and self.nodes > self.max_nodes:
            raise Stop("node budget")
        now = time.monotonic()
        if self.deadline is not None and now > self.deadline:
            raise Stop("time limit")
        if self.progress is not None and now >= self._next_report:
            self._next_report = now + 0.2
            self.progress(self.nodes, {"note": self._note})

    def classify(self, n: int, k: int, d: int) -> list[tuple[int, ...]]:
        """One code (echelon rows) of each class of full-support ``[n, k, >= d]`` codes."""
        d = max(d, 1)
        key = (n, k, d)
        if key in self.classes:
            return self.classes[key]
        found: list[tuple[int, ...]]
        if k == 0:
            found = [()] if n == 0 else []
        elif n < k or griesmer_length(k, d) > n:
            found = []
        else:
            forms: dict[tuple[int, ...], None] = {}
            for w in range(d, n + 1):
                if griesmer_length(k, w) > n:
                    break
                for res in self.classify(n - w, k - 1, -(-w // 2)):
                    self._note = f"classifying [{n},{k},>={d}]: weight {w}, " \
                                 f"{len(forms):,} classes so far"
                    for code in extensions(res, n - w, w, compiled=self.compiled,
                                           tick=self._tick):
                        self.codes_seen += 1
                        forms.setdefault(canonical_form(code, n), None)
            found = list(forms)
        self.classes[key] = found
        return found

    def find(self, n: int, k: int, d: int) -> tuple[int, ...] | None:
        """A full-support ``[n, k, >= d]`` code (its rows), or ``None`` if there is none.

        Classifies the residuals it needs but stops at the first extension found.
        """
        if k == 0 or n < k or griesmer_length(k, max(d, 1)) > n:
            return None
        for w in range(max(d, 1), n + 1):
            if griesmer_length(k, w) > n:
                break
            residuals = self.classify(n - w, k - 1, -(-w // 2))
            for i, res in enumerate(residuals, 1):
                self._note = (f"[{n},{k},{d}]: weight {w}, extending residual {i} of "
                              f"{len(residuals)}")
                found = extensions(res, n - w, w, compiled=self.compiled, first_only=True,
                                   tick=self._tick)
                if found:
                    return found[0]
        return None


def min_distance(rows: tuple[int, ...]) -> int:
    """Minimum weight of the span of ``rows`` (brute force; for checks and witnesses)."""
    words = _codewords(rows)
    return min((x.bit_count() for x in words if x), default=0)


def systematic_rows(rows: tuple[int, ...], n: int) -> tuple[int, ...]:
    """The rows of ``A`` in a systematic generator ``[I_k | A]`` of the code, up to the order
    of coordinates (the witness format of :mod:`gf2codes.existence`).

    Row ``i`` of ``A`` is an integer whose bit ``n - k - 1 - j`` is entry ``(i, j)``.
    """
    basis = _echelon(list(rows), n)  # pivot = highest bit, reduced
    pivots = [b.bit_length() - 1 for b in basis]
    others = [j for j in range(n - 1, -1, -1) if j not in pivots]
    r = len(others)
    out = []
    for b in basis:
        a = 0
        for pos, j in enumerate(others):
            if (b >> j) & 1:
                a |= 1 << (r - 1 - pos)
        out.append(a)
    return tuple(out)
