"""Weight distributions, the MacWilliams identities and the dual distance.

The weight distribution ``A_0, ..., A_n`` (``A_i`` = number of codewords of
weight ``i``) is counted exactly by Gray-code enumeration of the smaller of the
code and its dual; in the second case the MacWilliams identities give the code's
distribution from the dual's, in exact integer arithmetic:

    B_j = (1 / |C|) * sum_i A_i K_j(i),   K_j(i) = sum_s (-1)^s C(i, s) C(n - i, j - s)

The transform walks the three-term recurrence of the Krawtchouk polynomials in
``j`` (for each weight ``i`` present), so it costs ``n`` steps per nonzero
``A_i`` instead of ``n^2``; the dual distance stops at the first nonzero ``B_j``.
A full-space code (``k = n``) has the binomial distribution, without enumeration.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977, ch. 5 (the MacWilliams identities, Theorem 1 and
   section 2; Krawtchouk polynomials, section 7).
"""

from __future__ import annotations

import math
import os
from collections import deque
from collections.abc import Sequence
from concurrent.futures import Future, ThreadPoolExecutor

import numpy as np

from . import _kernels
from ._util import memo, past
from .code import Code
from .distance import ProgressCallback
from .exceptions import ParameterError, TooExpensiveError

__all__ = [
    "krawtchouk",
    "krawtchouk_column",
    "macwilliams_transform",
    "weight_distribution",
    "weight_enumeration_cost",
    "dual_distance",
    "dual_distance_from_distribution",
    "minimum_weight_from_distribution",
    "DEFAULT_MAX_ENUMERATION",
]

#: :func:`weight_distribution` refuses to enumerate more codewords than this
#: (about half a minute on one core) unless told otherwise.
DEFAULT_MAX_ENUMERATION = 1 << 36


@memo(65536)
def krawtchouk(j: int, i: int, n: int) -> int:
    """The binary Krawtchouk polynomial ``K_j(i)`` of length ``n`` (exact integer).

    >>> [krawtchouk(1, i, 3) for i in range(4)]
    [3, 1, -1, -3]
    """
    return sum((-1) ** s * math.comb(i, s) * math.comb(n - i, j - s) for s in range(j + 1))


def krawtchouk_column(i: int, n: int, stop: int | None = None) -> list[int]:
    """``[K_0(i), K_1(i), ..., K_stop(i)]`` for length ``n`` (default ``stop = n``).

    By the three-term recurrence ``(j + 1) K_{j+1}(i) = (n - 2i) K_j(i) -
    (n - j + 1) K_{j-1}(i)`` (MacWilliams & Sloane ch. 5 section 7), in exact
    integer arithmetic (the division is exact).

    >>> krawtchouk_column(1, 3)
    [1, 1, -1, -1]
    >>> krawtchouk_column(1, 3) == [krawtchouk(j, 1, 3) for j in range(4)]
    True
    """
    stop = n if stop is None else stop
    col = [1]
    if stop >= 1:
        col.append(n - 2 * i)
    for j in range(1, stop):
        col.append(((n - 2 * i) * col[j] - (n - j + 1) * col[j - 1]) // (j + 1))
    return col


def _transform_sums(A: Sequence[int], n: int, stop: int,
                    deadline: float | None = None) -> list[int]:
    """``sum_i A_i K_j(i)`` for ``j = 0..stop``, one recurrence per nonzero ``A_i``."""
    sums = [0] * (stop + 1)
    for i, a in enumerate(A):
        if not a:
            continue
        if past(deadline):
            raise TimeoutError("the MacWilliams transform did not finish in time")
        for j, kj in enumerate(krawtchouk_column(i, n, stop)):
            sums[j] += a * kj
    return sums


def macwilliams_transform(distribution: Sequence[int], n: int | None = None, *,
                          deadline: float | None = None) -> list[int]:
    """Weight distribution of the dual code from that of the code.

    Parameters
    ----------
    distribution : sequence of int
        ``A_0..A_n`` of a linear code (``A_0 = 1``, total a power of two).
    n : int, optional
        Length; defaults to ``len(distribution) - 1``.

    Raises
    ------
    ParameterError
        If the input cannot be the distribution of a linear code (the transform
        is then not integral or has negative entries).

    Examples
    --------
    The [7,4] Hamming code and its dual, the [7,3] simplex code (MacWilliams &
    Sloane ch. 1 section 3: the simplex code has 7 words of weight 4):

    >>> macwilliams_transform([1, 0, 0, 7, 7, 0, 0, 1])
    [1, 0, 0, 0, 7, 0, 0, 0]
    """
    A = [int(a) for a in distribution]
    n = len(A) - 1 if n is None else n
    if len(A) != n + 1:
        raise ParameterError(f"Argument 'distribution' must have n + 1 = {n + 1} entries, "
                             f"not {len(A)}.")
    size = sum(A)
    if size <= 0 or size & (size - 1):
        raise ParameterError(f"Argument 'distribution' must sum to a power of two, not {size}.")
    if any(a < 0 for a in A):
        raise ParameterError("Argument 'distribution' must not hold negative counts.")
    out = []
    for j, s in enumerate(_transform_sums(A, n, n, deadline)):
        if s % size or s < 0:
            raise ParameterError(
                "Argument 'distribution' is not the weight distribution of a linear code: "
                f"the MacWilliams transform gives {s}/{size} at weight {j}."
            )
        out.append(s // size)
    return out


def weight_enumeration_cost(code: Code) -> int:
    """Codewords :func:`weight_distribution` enumerates: ``2^min(k, n - k)``."""
    return 1 << min(code.k, code.n - code.k)


def _count(code: Code, progress: ProgressCallback | None) -> list[int]:
    """Histogram of the weights of every codeword, in blocks of about 2^24 codewords.

    Blocks run on one thread per core when there are several (the kernel releases the
    GIL); the histogram is a sum, so the result does not depend on the order.
    """
    rows = np.array(code.packed_generator, dtype=np.uint64, order="C")
    OT, TT, _ = _kernels.gray_layout(rows)
    outer = 1 << OT.shape[1]
    per = max(1, (1 << 24) // TT.shape[1])
    blocks = [(g, min(outer, g + per)) for g in range(0, outer, per)]
    hist = np.zeros(code.n + 1, dtype=np.int64)
    total = outer * TT.shape[1]

    def block(bounds: tuple[int, int]) -> np.ndarray:
        return _kernels.gray_weight_histogram(OT, TT, bounds[0], bounds[1], code.n)

    threads = min(os.cpu_count() or 1, len(blocks))
    if threads <= 1:
        done = 0
        for bounds in blocks:
            hist += block(bounds)
            done = bounds[1] * TT.shape[1]
            if progress is not None:
                progress(done, total, {})
        return [int(x) for x in hist]
    _ = _kernels.gray_weight_histogram.dispatcher  # compile or load once, before the threads
    done = 0
    pool = ThreadPoolExecutor(max_workers=threads)
    pending: deque[tuple[tuple[int, int], Future[np.ndarray]]] = deque()
    todo = iter(blocks)
    try:
        while True:
            while len(pending) < 2 * threads:  # a short queue, so Ctrl-C stops soon
                nxt = next(todo, None)
                if nxt is None:
                    break
                pending.append((nxt, pool.submit(block, nxt)))
            if not pending:
                break
            bounds, future = pending.popleft()
            hist += future.result()
            done += (bounds[1] - bounds[0]) * TT.shape[1]
            if progress is not None:
                progress(done, total, {})
    finally:
        pool.shutdown(wait=True, cancel_futures=True)
    return [int(x) for x in hist]


def weight_distribution(code: Code, *, progress: ProgressCallback | None = None,
                        max_codewords: int | None = DEFAULT_MAX_ENUMERATION,
                        deadline: float | None = None) -> list[int]:
    """Exact weight distribution ``[A_0, ..., A_n]`` of ``code``.

    Enumerates the code when ``k <= n - k``, else the dual code followed by the
    MacWilliams transform.

    ``deadline`` (a :func:`time.perf_counter` value, as made by
    :func:`gf2codes._util.deadline_after`) bounds the MacWilliams step;
    a ``progress`` callback may stop the enumeration by raising.

    Raises
    ------
    TooExpensiveError
        If ``2^min(k, n-k)`` exceeds ``max_codewords``.
    TimeoutError
        If the ``deadline`` passes during the MacWilliams transform.

    Examples
    --------
    >>> from gf2codes.code import Code
    >>> weight_distribution(Code([[1, 1, 0], [0, 1, 1]]))
    [1, 0, 3, 0]
    """
    cost = weight_enumeration_cost(code)
    if max_codewords is not None and cost > max_codewords:
        raise TooExpensiveError(
            f"the weight distribution of this [{code.n},{code.k}] code needs 2^"
            f"{min(code.k, code.n - code.k)} = {cost:.3g} codewords, more than the limit of "
            f"{max_codewords:.3g}."
        )
    if code.k == code.n:  # the full space: every word, C(n, i) of weight i
        return [math.comb(code.n, i) for i in range(code.n + 1)]
    if code.k <= code.n - code.k:
        return _count(code, progress)
    return macwilliams_transform(_count(code.dual(), progress), code.n, deadline=deadline)


def minimum_weight_from_distribution(distribution: Sequence[int]) -> int | None:
    """Least positive weight with a nonzero count (None for the zero code)."""
    return next((i for i, a in enumerate(distribution) if i and a), None)


def dual_distance_from_distribution(distribution: Sequence[int], *,
                                    deadline: float | None = None) -> int | None:
    """Least ``j > 0`` with ``B_j != 0`` in the MacWilliams transform of ``distribution``.

    Only the transform's first entries are computed: the recurrences stop at the
    first nonzero ``B_j`` (``deadline``, a :func:`time.perf_counter` value, stops the
    work with :class:`TimeoutError`). None when the dual is the zero code.

    >>> dual_distance_from_distribution([1, 0, 0, 7, 7, 0, 0, 1])  # Hamming [7,4]
    4
    """
    A = [int(a) for a in distribution]
    n = len(A) - 1
    columns = {i: [1, n - 2 * i] for i, a in enumerate(A) if a}  # K_0, K_1 at each i
    for j in range(1, n + 1):
        if past(deadline):
            raise TimeoutError("the dual distance did not finish in time")
        if j >= 2:
            for i, col in columns.items():
                col[0], col[1] = col[1], ((n - 2 * i) * col[1] - (n - j + 2) * col[0]) // j
        if sum(A[i] * col[1] for i, col in columns.items()):
            return j
    return None


def dual_distance(code: Code, distribution: Sequence[int] | None = None, *,
                  deadline: float | None = None) -> int | None:
    """Minimum distance of the dual code (None when the dual is the zero code, k = n).

    With the code's weight distribution given, it comes from the MacWilliams
    transform (only up to its first nonzero entry); otherwise by proving the
    dual's distance.
    """
    if code.k == code.n:
        return None
    if distribution is not None:
        return dual_distance_from_distribution(distribution, deadline=deadline)
    from .distance import minimum_distance

    return minimum_distance(code.dual(), max_work=None).d
