"""Compiled kernels on bit-packed GF(2) rows.

Every kernel here is declared with :func:`gf2codes._jit.kernel`: an explicit numba
signature and ``cache=True``, compiled (or loaded from numba's cache) on its first
call, so importing this module loads neither numba nor any machine code. A kernel
takes arrays and integers only, reads no module globals but other kernels and
intrinsics, and does no I/O. The public modules (:mod:`gf2codes.linalg`,
:mod:`gf2codes.distance`, :mod:`gf2codes.weights`) call them;
:mod:`gf2codes._reference` holds plain-Python twins that the tests run against the
same inputs.

Packing convention (used throughout gf2codes): coordinate ``j`` of a row lives in
word ``j >> 6`` at bit ``j & 63`` (least significant bit first). A matrix of ``r``
rows and ``n`` columns is a C-contiguous ``uint64`` array of shape
``(r, (n + 63) // 64)``; bits past ``n`` are zero.

Several kernels take the *transposed* packed layout ``GT`` of shape ``(W, k)``:
word ``w`` of every row is contiguous, so the innermost loops (one XOR and one
popcount per codeword) vectorise.
"""

from __future__ import annotations

import numpy as np

from ._jit import intrinsic, kernel

__all__ = [
    "popcount64",
    "ctz64",
    "rref_inplace",
    "GRAY_TAIL",
    "gray_layout",
    "gray_min_weight",
    "gray_weight_histogram",
    "next_combination",
    "combination_min_weight",
    "combination_table_min_weight",
    "combination_ext_min_weight",
    "subset_sums",
]

def _unary_u64_intrinsic(numba, name, llvm_name, extra_false_arg):
    """An intrinsic calling the LLVM bit operation ``llvm_name`` on one uint64."""
    from llvmlite import ir  # type: ignore[import-untyped]
    from numba.core import cgutils

    u64 = numba.types.uint64

    def typer(typingctx, x):  # pragma: no cover - compiled
        if x != u64:
            return None

        def codegen(context, builder, signature, args):
            i64 = ir.IntType(64)
            params = [i64, ir.IntType(1)] if extra_false_arg else [i64]
            fn = cgutils.get_or_insert_function(
                builder.module, ir.FunctionType(i64, params), llvm_name)
            call_args = [args[0], ir.Constant(ir.IntType(1), 0)] if extra_false_arg else args
            return builder.call(fn, call_args)

        return u64(u64), codegen

    typer.__name__ = name
    return numba.extending.intrinsic(typer)


@intrinsic
def _llvm_ctpop(numba):
    """LLVM's ``ctpop`` on a uint64 (one POPCNT instruction where the CPU has it)."""
    return _unary_u64_intrinsic(numba, "_llvm_ctpop", "llvm.ctpop.i64", False)


@intrinsic
def _llvm_cttz(numba):
    """LLVM's ``cttz`` on a uint64 (count of trailing zero bits; 64 for zero)."""
    return _unary_u64_intrinsic(numba, "_llvm_cttz", "llvm.cttz.i64", True)


@kernel("uint64(uint64)", inline="always")
def popcount64(x):  # pragma: no cover - compiled
    """Number of set bits of a 64-bit word."""
    return _llvm_ctpop(x)


@kernel("uint64(uint64)", inline="always")
def ctz64(x):  # pragma: no cover - compiled
    """Number of trailing zero bits of a 64-bit word (64 for zero)."""
    return _llvm_cttz(x)


@kernel("int64[:](uint64[:, ::1], int64[::1])", nogil=True)
def rref_inplace(M, order):  # pragma: no cover - compiled
    """Reduce packed rows ``M`` to reduced row echelon form, in place.

    Columns are tried as pivots in the sequence ``order`` (a permutation of a
    subset of column indices). On return the first ``rank`` rows of ``M`` are the
    reduced basis, row ``i`` having its pivot in column ``pivots[i]`` and that
    column zero in every other row; the remaining rows are zero.

    Returns the pivot columns, in the order the pivots were found.
    """
    r, W = M.shape
    pivots = np.empty(min(r, order.shape[0]), dtype=np.int64)
    rank = 0
    for t in range(order.shape[0]):
        if rank == r:
            break
        col = order[t]
        wd = col >> 6
        bit = np.uint64(1) << np.uint64(col & 63)
        sel = -1
        for i in range(rank, r):
            if M[i, wd] & bit:
                sel = i
                break
        if sel < 0:
            continue
        if sel != rank:
            for w in range(W):
                tmp = M[sel, w]
                M[sel, w] = M[rank, w]
                M[rank, w] = tmp
        for i in range(r):
            if i != rank and (M[i, wd] & bit):
                for w in range(W):
                    M[i, w] ^= M[rank, w]
        pivots[rank] = col
        rank += 1
    return pivots[:rank].copy()


@kernel(inline="always")
def next_combination(c, first, p, m):  # pragma: no cover - compiled
    """Advance ``c[:p]``, a ``p``-subset of ``{0, ..., m - 1}`` in increasing order, to the
    next one in lexicographic order, leaving ``c[:first]`` as it is.

    Bumps the last entry that can still grow and resets the tail after it to
    consecutive values; returns that entry's position (the entries from there on
    changed, so partial sums from there on need recomputing), or -1 when ``c[first:p]``
    was the last subset. The one copy of this step, inlined into every enumeration
    kernel (:mod:`gf2codes._kernels`, :mod:`gf2codes._dual_kernels`).

    >>> import numpy as np
    >>> c = np.array([0, 3, 4]); next_combination.py_func(c, 0, 3, 5), c.tolist()
    (0, [1, 2, 3])
    >>> next_combination.py_func(np.array([2, 3, 4]), 0, 3, 5)
    -1
    """
    i = p - 1
    while i >= first and c[i] == m - p + i:
        i -= 1
    if i < first:
        return -1
    c[i] += 1
    for j in range(i + 1, p):
        c[j] = c[j - 1] + 1
    return i


#: Codewords per block of the multi-word scans (``W > 2``): their weights are summed
#: word by word into a scratch array of this length, so every pass is a contiguous,
#: vectorised loop over one word of the table.
SCAN_BLOCK = 256


@kernel(inline="always")
def _scan_min(P, r, T, lo, hi, W, acc):  # pragma: no cover - compiled
    """Least weight of ``P[r] ^ T[:, i]`` over ``lo <= i < hi`` (``2**62`` when empty).

    ``P`` holds the words of the fixed part as row ``r`` of a 2-D array and ``T`` is a
    transposed table (``W`` contiguous rows), so no array view is made here: a view
    costs reference counting, which in a hot loop over short tables took longer than
    the scan itself. For ``W <= 2`` the loop is one XOR and one popcount per word and
    codeword and vectorises; for larger ``W`` the weights of a block of ``SCAN_BLOCK``
    codewords are summed word by word into ``acc``, each pass a contiguous loop over
    one word of the table (the loop over the words inside the loop over the codewords
    does not vectorise: its loads are strided).
    """
    m = np.int64(1 << 62)
    if W == 1:
        s0 = P[r, 0]
        for i in range(lo, hi):
            wt = np.int64(popcount64(s0 ^ T[0, i]))
            if wt < m:
                m = wt
    elif W == 2:
        s0 = P[r, 0]
        s1 = P[r, 1]
        for i in range(lo, hi):
            wt = np.int64(popcount64(s0 ^ T[0, i]) + popcount64(s1 ^ T[1, i]))
            if wt < m:
                m = wt
    else:
        B = acc.shape[0]
        for i0 in range(lo, hi, B):
            nb = min(hi - i0, B)
            s = P[r, 0]
            for i in range(nb):
                acc[i] = np.int64(popcount64(s ^ T[0, i0 + i]))
            for w in range(1, W):
                s = P[r, w]
                for i in range(nb):
                    acc[i] += np.int64(popcount64(s ^ T[w, i0 + i]))
            for i in range(nb):
                if acc[i] < m:
                    m = acc[i]
    return m


@kernel(inline="always")
def _scan_find(P, r, T, lo, hi, W, target):  # pragma: no cover - compiled
    """First ``i`` in ``[lo, hi)`` with weight of ``P[r] ^ T[:, i]`` equal to ``target``
    (-1 when there is none); called once per new least weight, so plain loops."""
    for i in range(lo, hi):
        wt = np.int64(0)
        for w in range(W):
            wt += np.int64(popcount64(P[r, w] ^ T[w, i]))
        if wt == target:
            return i
    return -1


#: Rows tabulated in Gray-code enumeration (a table of 2^12 sums).
GRAY_TAIL = 12


def gray_layout(rows: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The layout of :func:`gray_min_weight` and :func:`gray_weight_histogram` (NumPy, no
    kernel): basis ``rows`` split into the outer rows (transposed, ``OT``), the table of
    the ``2^b`` sums of the last ``b = min(GRAY_TAIL, k)`` rows (transposed, ``TT``), and
    those ``b`` rows."""
    k = rows.shape[0]
    b = min(GRAY_TAIL, k)
    tail = rows[k - b:]
    table = np.zeros((1 << b, rows.shape[1]), dtype=np.uint64)
    for j in range(b):
        table[1 << j: 2 << j] = table[: 1 << j] ^ tail[j]
    OT = np.ascontiguousarray(rows[: k - b].T)
    TT = np.ascontiguousarray(table.T)
    return OT, TT, tail


@kernel(
    "Tuple((int64, int64, int64))(uint64[:, ::1], uint64[:, ::1], int64, int64, int64)",
    nogil=True,
)
def gray_min_weight(OT, TT, g_start, g_stop, stop_at):  # pragma: no cover - compiled
    """Least weight over a Gray-code block of codewords.

    The code is spanned by ``a`` outer rows ``OT`` (transposed, shape ``(W, a)``) and
    ``b`` inner rows whose ``2**b`` combinations are tabulated in ``TT`` (shape
    ``(W, 2**b)``, ``TT[:, 0] == 0``). Outer Gray-code indices ``g_start <= g <
    g_stop`` are visited; for each, all ``2**b`` inner combinations (one XOR and one
    popcount each). The zero codeword (``g == 0``, inner index 0) is skipped.

    Stops early once a weight ``<= stop_at`` is seen.

    Returns ``(best_weight, outer_gray_word, inner_index)``; ``best_weight`` is
    ``2**62`` when the block held no nonzero codeword.
    """
    W = OT.shape[0]
    a = OT.shape[1]
    nt = TT.shape[1]
    s = np.zeros((1, W), dtype=np.uint64)
    acc = np.zeros(SCAN_BLOCK, dtype=np.int64)
    g0 = np.uint64(g_start)
    gray = g0 ^ (g0 >> np.uint64(1))
    for j in range(a):
        if (gray >> np.uint64(j)) & np.uint64(1):
            for w in range(W):
                s[0, w] ^= OT[w, j]
    best = np.int64(1 << 62)
    best_gray = np.int64(-1)
    best_inner = np.int64(-1)
    for g in range(g_start, g_stop):
        if g > g_start:
            j = ctz64(np.uint64(g))
            for w in range(W):
                s[0, w] ^= OT[w, j]
        lo = 1 if g == 0 else 0
        m = _scan_min(s, 0, TT, lo, nt, W, acc)
        if m < best:
            best = m
            gg = np.uint64(g)
            best_gray = np.int64(gg ^ (gg >> np.uint64(1)))
            best_inner = _scan_find(s, 0, TT, lo, nt, W, m)
            if best <= stop_at:
                break
    return best, best_gray, best_inner


@kernel("int64[::1](uint64[:, ::1], uint64[:, ::1], int64, int64, int64)", nogil=True)
def gray_weight_histogram(OT, TT, g_start, g_stop, n):  # pragma: no cover - compiled
    """Histogram of codeword weights over a Gray-code block (layout as in
    :func:`gray_min_weight`); the zero codeword is included when ``g_start == 0``."""
    W = OT.shape[0]
    a = OT.shape[1]
    nt = TT.shape[1]
    hist = np.zeros(n + 1, dtype=np.int64)
    s = np.zeros(W, dtype=np.uint64)
    acc = np.zeros(SCAN_BLOCK, dtype=np.int64)
    g0 = np.uint64(g_start)
    gray = g0 ^ (g0 >> np.uint64(1))
    for j in range(a):
        if (gray >> np.uint64(j)) & np.uint64(1):
            for w in range(W):
                s[w] ^= OT[w, j]
    for g in range(g_start, g_stop):
        if g > g_start:
            j = ctz64(np.uint64(g))
            for w in range(W):
                s[w] ^= OT[w, j]
        if W == 1:
            s0 = s[0]
            for i in range(nt):
                hist[popcount64(s0 ^ TT[0, i])] += 1
        elif W == 2:
            s0 = s[0]
            s1 = s[1]
            for i in range(nt):
                hist[popcount64(s0 ^ TT[0, i]) + popcount64(s1 ^ TT[1, i])] += 1
        elif W <= 4:
            for i in range(nt):
                wt = np.uint64(0)
                for w in range(W):
                    wt += popcount64(s[w] ^ TT[w, i])
                hist[wt] += 1
        else:
            # long rows: the weights of a block are summed word by word (each pass a
            # contiguous loop over one word of the table, which vectorises; the loop
            # over the words inside the loop over the codewords has strided loads),
            # then counted -- 2.5x faster at W = 16, slower at W = 4
            for i0 in range(0, nt, SCAN_BLOCK):
                nb = min(nt - i0, SCAN_BLOCK)
                s0 = s[0]
                for i in range(nb):
                    acc[i] = np.int64(popcount64(s0 ^ TT[0, i0 + i]))
                for w in range(1, W):
                    sw = s[w]
                    for i in range(nb):
                        acc[i] += np.int64(popcount64(sw ^ TT[w, i0 + i]))
                for i in range(nb):
                    hist[acc[i]] += 1
    return hist


@kernel(
    "Tuple((int64, int64, boolean))(uint64[:, ::1], int64, int64[::1], int64, int64, "
    "int64[::1], uint64[::1])",
    nogil=True,
)
def combination_min_weight(GT, w, state, budget, stop_at, best_combo, base):  # pragma: no cover
    """Least weight over ``base`` XOR the sums of exactly ``w >= 1`` of the ``k`` rows of ``GT``.

    ``GT`` is the transposed packed generator, shape ``(W, k)``. Combinations are
    visited in lexicographic order, grouped by their first ``w - 1`` elements (the
    *prefix*, held in ``state[:w-1]``); for each prefix the last element runs over
    every later row, costing one XOR and one popcount per codeword in a loop that
    vectorises. The prefix in ``state`` is where to start and, on return, where to
    resume; ``state`` must be a valid prefix (``state[i] <= k - w + i``) and
    ``state[w-1:]`` is ignored.

    At least ``budget`` codewords are visited unless the enumeration ends or a
    weight ``<= stop_at`` is seen first; a new least weight writes its combination
    into ``best_combo[:w]``.

    Returns ``(visited, best_weight, finished)``; ``best_weight`` is ``2**62`` when
    nothing was visited, ``finished`` is true when every combination is done.
    """
    W = GT.shape[0]
    k = GT.shape[1]
    p = w - 1
    part = np.zeros((max(p, 1) + 1, W), dtype=np.uint64)
    # part[l + 1] = base XOR rows state[0..l]; part[0] = base.
    for q in range(W):
        part[0, q] = base[q]
    for l in range(p):
        for q in range(W):
            part[l + 1, q] = part[l, q] ^ GT[q, state[l]]
    acc = np.zeros(SCAN_BLOCK, dtype=np.int64)
    best = np.int64(1 << 62)
    visited = np.int64(0)
    while True:
        lo = state[p - 1] + 1 if p > 0 else 0
        m = _scan_min(part, p, GT, lo, k, W, acc)
        visited += k - lo
        if m < best:
            best = m
            i = _scan_find(part, p, GT, lo, k, W, m)
            for l in range(p):
                best_combo[l] = state[l]
            best_combo[p] = i
        # advance the prefix (also when stopping, so a resumed call does not repeat it):
        # a (w - 1)-subset of the first k - 1 rows
        i = next_combination(state, 0, p, k - 1)
        if i < 0:
            return visited, best, True
        for l in range(i, p):
            for q in range(W):
                part[l + 1, q] = part[l, q] ^ GT[q, state[l]]
        if best <= stop_at or visited >= budget:
            return visited, best, False


@kernel(
    "Tuple((int64, int64, int64, boolean))(uint64[:, ::1], int64, int64[::1], uint64[:, "
    "::1], int64, int64, int64[::1], uint64[::1])",
    nogil=True,
)
def combination_table_min_weight(AT, w1, state, TT, budget, stop_at, best_combo,
                                 base):  # pragma: no cover
    """Least weight over ``base`` XOR (a ``w1``-subset of the rows ``AT``) XOR (an entry of
    ``TT``).

    This is the split form of the enumeration of weight-``w`` combinations: the
    ``k`` rows are cut into a head ``A`` (``AT``, transposed, shape ``(W, a)``) and a
    tail ``B``; ``TT`` (shape ``(W, L)``) tabulates the sums of every
    ``(w - w1)``-subset of ``B``. For each ``w1``-subset of ``A`` in lexicographic
    order (``state[:w1]`` is where to start and, on return, where to resume) the
    whole table is scanned with one XOR and one popcount per codeword, in a long
    loop that vectorises.

    Stops after the subset in which at least ``budget`` codewords have been visited
    or a weight ``<= stop_at`` was seen; a new least weight writes the subset into
    ``best_combo[:w1]``.

    Returns ``(visited, best_weight, table_index, finished)``.
    """
    W = AT.shape[0]
    a = AT.shape[1]
    L = TT.shape[1]
    part = np.zeros((w1 + 1, W), dtype=np.uint64)
    for q in range(W):
        part[0, q] = base[q]
    for l in range(w1):
        for q in range(W):
            part[l + 1, q] = part[l, q] ^ AT[q, state[l]]
    acc = np.zeros(SCAN_BLOCK, dtype=np.int64)
    best = np.int64(1 << 62)
    best_t = np.int64(-1)
    visited = np.int64(0)
    while True:
        m = _scan_min(part, w1, TT, 0, L, W, acc)
        visited += L
        if m < best:
            best = m
            best_t = _scan_find(part, w1, TT, 0, L, W, m)
            for l in range(w1):
                best_combo[l] = state[l]
        i = next_combination(state, 0, w1, a)
        if i < 0:
            return visited, best, best_t, True
        for l in range(i, w1):
            for q in range(W):
                part[l + 1, q] = part[l, q] ^ AT[q, state[l]]
        if best <= stop_at or visited >= budget:
            return visited, best, best_t, False


@kernel(
    "Tuple((int64, int64, int64, boolean))(uint64[:, ::1], int64, int64, int64[::1], "
    "uint64[:, ::1], int64[::1], int64, int64, int64[::1], uint64[::1])",
    nogil=True,
)
def combination_ext_min_weight(AT, p, m, state, ET, starts, budget, stop_at, best_combo,
                               base):  # pragma: no cover - compiled
    """:func:`combination_table_min_weight` with the last head rows moved into the table.

    ``ET`` (shape ``(W, E)``) holds, for every ``e``-subset of the head rows in
    lexicographic order, its sum XOR every entry of the tail table; ``starts[h]`` is the
    first entry whose head subset starts at row ``h`` or later (``starts[a] = E``). The
    ``p``-subsets of rows ``0 .. m - 1`` of ``AT`` (the prefixes, ``m = a - e``) are
    enumerated in lexicographic order; for each, the entries whose head subset starts
    after the prefix's last row are scanned in one contiguous loop. Every combination of
    ``p + e`` head rows and one tail entry is visited exactly once, as by the plain
    kernel, but a small tail table (20 entries for one tail row of 20) no longer makes
    every scan short (2-core AVX2 machine: such levels ran at 0.6e8-2e8 codewords/s
    against 8e8 for long scans).

    Returns ``(visited, best_weight, entry_index, finished)`` like the plain kernel.
    """
    W = AT.shape[0]
    E = ET.shape[1]
    part = np.zeros((p + 1, W), dtype=np.uint64)
    for q in range(W):
        part[0, q] = base[q]
    for l in range(p):
        for q in range(W):
            part[l + 1, q] = part[l, q] ^ AT[q, state[l]]
    acc = np.zeros(SCAN_BLOCK, dtype=np.int64)
    best = np.int64(1 << 62)
    best_t = np.int64(-1)
    visited = np.int64(0)
    while True:
        lo = starts[state[p - 1] + 1] if p >= 1 else 0
        if lo < E:
            wt = _scan_min(part, p, ET, lo, E, W, acc)
            visited += E - lo
            if wt < best:
                best = wt
                best_t = _scan_find(part, p, ET, lo, E, W, wt)
                for l in range(p):
                    best_combo[l] = state[l]
        i = next_combination(state, 0, p, m)
        if i < 0:
            return visited, best, best_t, True
        for l in range(i, p):
            for q in range(W):
                part[l + 1, q] = part[l, q] ^ AT[q, state[l]]
        if best <= stop_at or visited >= budget:
            return visited, best, best_t, False


@kernel("Tuple((uint64[:, ::1], uint8[:, ::1]))(uint64[:, ::1], int64)", nogil=True)
def subset_sums(rows, w):  # pragma: no cover - compiled
    """Sums of every ``w``-subset of ``rows`` (shape ``(b, W)``), in lexicographic order.

    Returns ``(sums, subsets)``: ``sums[t]`` (``W`` words) is the XOR of the rows
    listed in ``subsets[t]`` (``w`` indices, increasing).
    """
    b, W = rows.shape
    # number of subsets, C(b, w)
    L = 1
    for i in range(w):
        L = L * (b - i) // (i + 1)
    sums = np.zeros((L, W), dtype=np.uint64)
    subsets = np.zeros((L, max(w, 1)), dtype=np.uint8)
    if w == 0 or w > b:
        return sums, subsets
    c = np.arange(w)
    part = np.zeros((w + 1, W), dtype=np.uint64)
    for l in range(w):
        for q in range(W):
            part[l + 1, q] = part[l, q] ^ rows[c[l], q]
    t = 0
    while True:
        for q in range(W):
            sums[t, q] = part[w, q]
        for l in range(w):
            subsets[t, l] = c[l]
        t += 1
        i = next_combination(c, 0, w, b)
        if i < 0:
            break
        for l in range(i, w):
            for q in range(W):
                part[l + 1, q] = part[l, q] ^ rows[c[l], q]
    return sums, subsets


# ---------------------------------------------------------------- NumPy twins for small calls
#
# A process that only ever handles small codes (``verify`` on a [24,12] code, a folder of
# candidate layouts) would spend most of its time importing numba and loading machine code
# from the cache: far longer than the work itself. The kernels below therefore have NumPy
# twins with exactly the same results (scalars as Python ints, as numba returns them),
# used while the kernel is not compiled and the call is small (see ``Kernel.small``);
# tests/test_jit.py runs the same inputs through both.

#: Array-element operations below which a call is served by its NumPy twin (while numba is
#: not loaded): about a millisecond of NumPy, against roughly 0.3–1 s to load numba.
SMALL_WORK = 1 << 20

_BYTE_WEIGHTS = np.array([bin(i).count("1") for i in range(256)], dtype=np.int64)


def popcount_array(a: np.ndarray) -> np.ndarray:
    """Set bits of every uint64 of ``a``, as int64 (NumPy; no kernel)."""
    a = np.ascontiguousarray(a, dtype=np.uint64)
    if hasattr(np, "bitwise_count"):
        return np.bitwise_count(a).astype(np.int64)
    return _BYTE_WEIGHTS[a.view(np.uint8)].reshape(a.shape + (8,)).sum(axis=-1)


def _rref_small(M, order):
    if order.shape[0] * M.shape[0] * M.shape[1] > SMALL_WORK or order.shape[0] > 4096:
        return None
    r = M.shape[0]
    pivots = []
    rank = 0
    for col in order.tolist():
        if rank == r:
            break
        wd, bit = col >> 6, np.uint64(1) << np.uint64(col & 63)
        below = np.flatnonzero(M[rank:, wd] & bit)
        if below.size == 0:
            continue
        sel = rank + int(below[0])
        if sel != rank:
            M[[rank, sel]] = M[[sel, rank]]
        hits = (M[:, wd] & bit) != 0
        hits[rank] = False
        M[hits] ^= M[rank]
        pivots.append(col)
        rank += 1
    return np.array(pivots, dtype=np.int64)


rref_inplace.small = _rref_small


def _gray_weights(OT, TT, g_start, g_stop):
    """Weights of every codeword of a Gray-code block: array ``(g_stop - g_start, 2**b)``."""
    a = OT.shape[1]
    g = np.arange(g_start, g_stop, dtype=np.uint64)
    gray = g ^ (g >> np.uint64(1))
    sums = np.zeros((g.shape[0], OT.shape[0]), dtype=np.uint64)
    for j in range(a):
        hit = ((gray >> np.uint64(j)) & np.uint64(1)).astype(bool)
        sums[hit] ^= OT[:, j]
    words = sums[:, None, :] ^ TT.T[None, :, :]
    return popcount_array(words).sum(axis=-1)


def _gray_block_small(OT, TT, g_start, g_stop):
    return (g_stop - g_start) * TT.shape[1] * max(OT.shape[0], 1) <= SMALL_WORK


def _gray_min_weight_small(OT, TT, g_start, g_stop, stop_at):
    if not _gray_block_small(OT, TT, g_start, g_stop):
        return None
    none = (1 << 62, -1, -1)
    if g_stop <= g_start:
        return none
    weights = _gray_weights(OT, TT, g_start, g_stop)
    if g_start == 0:
        weights[0, 0] = 1 << 62  # the zero codeword
    per_block = weights.min(axis=1)
    early = np.flatnonzero(per_block <= stop_at)
    if early.size:  # the kernel stops at the first block reaching stop_at
        row = int(early[0])
    else:
        row = int(np.argmin(per_block))
    best = int(per_block[row])
    if best >= 1 << 62:
        return none
    g = g_start + row
    return best, g ^ (g >> 1), int(np.argmax(weights[row] == best))


def _gray_weight_histogram_small(OT, TT, g_start, g_stop, n):
    if not _gray_block_small(OT, TT, g_start, g_stop):
        return None
    hist = np.zeros(n + 1, dtype=np.int64)
    if g_stop > g_start:
        np.add.at(hist, _gray_weights(OT, TT, g_start, g_stop).ravel(), 1)
    return hist


gray_min_weight.small = _gray_min_weight_small
gray_weight_histogram.small = _gray_weight_histogram_small


def _combination_min_weight_small(GT, w, state, budget, stop_at, best_combo, base):
    """The twin for ``w <= 2`` (the information-set pass): prefixes in order, each scan
    vectorised, with the kernel's stopping and resuming rules."""
    W, k = GT.shape
    if w > 2 or w > k or k * k * W > SMALL_WORK:
        return None
    p = w - 1
    best, visited = 1 << 62, 0
    while True:
        lo = int(state[0]) + 1 if p else 0
        s = base ^ GT[:, state[0]] if p else base
        if lo < k:
            weights = popcount_array(GT[:, lo:] ^ s[:, None]).sum(axis=0)
            i = int(np.argmin(weights))
            m = int(weights[i])
        else:
            m = 1 << 62
        visited += k - lo
        if m < best:
            best = m
            if p:
                best_combo[0] = state[0]
            best_combo[p] = lo + i
        if not p or state[0] == k - 2:
            return visited, best, True
        state[0] += 1
        if best <= stop_at or visited >= budget:
            return visited, best, False


combination_min_weight.small = _combination_min_weight_small
