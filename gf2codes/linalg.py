"""Linear algebra over GF(2) on bit-packed rows.

A *packed* matrix is a C-contiguous ``uint64`` array of shape ``(rows, words)``
with ``words = ceil(n / 64)``; coordinate ``j`` is bit ``j % 64`` of word
``j // 64`` (see :mod:`gf2codes._kernels`). The number of columns ``n`` travels
beside the array. Unpacked matrices are ``uint8`` arrays of 0s and 1s; functions
that take a matrix accept anything :func:`as_bits` accepts (nested lists, numpy
integer or boolean arrays, ``galois.GF2`` arrays).

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977, ch. 1 section 2 (generator and parity-check
   matrices, systematic form).
"""

from __future__ import annotations

from typing import Any, cast

import numpy as np
import numpy.typing as npt

from . import _kernels
from .exceptions import ParameterError

__all__ = [
    "as_bits",
    "pack",
    "unpack",
    "bit_string",
    "words_for",
    "rref",
    "rank",
    "null_space",
    "systematic_form",
    "independent_rows",
    "in_row_space",
    "to_galois",
    "RowEchelon",
    "Systematic",
]

BitMatrixLike = npt.ArrayLike


def words_for(n: int) -> int:
    """Number of 64-bit words that hold ``n`` bits."""
    return (n + 63) >> 6


def as_bits(matrix: BitMatrixLike, name: str = "matrix", ndim: int = 2) -> np.ndarray:
    """Return ``matrix`` as a C-contiguous ``uint8`` array of 0s and 1s.

    Raises
    ------
    ParameterError
        If an entry is not 0 or 1, or the array has the wrong number of axes.
    """
    arr = np.asarray(matrix.view(np.ndarray) if hasattr(matrix, "view") else matrix)
    if arr.dtype == bool:
        arr = arr.astype(np.uint8)
    if arr.ndim != ndim:
        if ndim == 2 and arr.ndim == 1:
            arr = arr.reshape(1, -1)
        else:
            raise ParameterError(
                f"Argument {name!r} must have {ndim} axes, not {arr.ndim} (shape {arr.shape})."
            )
    if arr.dtype.kind not in "iub":
        raise ParameterError(
            f"Argument {name!r} must hold the integers 0 and 1, not values of type {arr.dtype}."
        )
    if arr.size and (arr.min() < 0 or arr.max() > 1):
        bad = arr[(arr < 0) | (arr > 1)].flat[0]
        raise ParameterError(f"Argument {name!r} must hold only 0 and 1, not {bad}.")
    return np.ascontiguousarray(arr, dtype=np.uint8)


def pack(bits: BitMatrixLike) -> np.ndarray:
    """Pack a 0/1 matrix of shape ``(r, n)`` into ``uint64`` words of shape ``(r, ceil(n/64))``.

    >>> pack([[1, 0, 1]]).tolist()
    [[5]]
    """
    b = as_bits(bits)
    r, n = b.shape
    W = words_for(n)
    padded = np.zeros((r, W * 64), dtype=np.uint8)
    padded[:, :n] = b
    by = np.packbits(padded, axis=1, bitorder="little")
    return np.ascontiguousarray(by).view("<u8").astype(np.uint64, copy=False).reshape(r, W)


def bit_string(row: npt.ArrayLike) -> str:
    """A 0/1 row as a string of ``0`` and ``1`` (any non-zero entry is a 1).

    >>> bit_string([1, 0, 0, 1])
    '1001'
    """
    return (np.asarray(row).astype(bool).astype(np.uint8) + ord("0")).tobytes().decode("ascii")


def unpack(packed: np.ndarray, n: int) -> np.ndarray:
    """Inverse of :func:`pack`: ``uint64`` words back to a ``uint8`` matrix with ``n`` columns."""
    p = np.ascontiguousarray(packed, dtype=np.uint64)
    if p.ndim == 1:
        p = p.reshape(1, -1)
    r = p.shape[0]
    by = p.astype("<u8", copy=False).view(np.uint8).reshape(r, p.shape[1] * 8)
    return np.ascontiguousarray(np.unpackbits(by, axis=1, bitorder="little")[:, :n])


class RowEchelon:
    """Reduced row echelon form of a GF(2) matrix.

    Attributes
    ----------
    rows : numpy.ndarray
        Packed basis rows, shape ``(rank, words)``; row ``i`` has its pivot in
        ``pivots[i]`` and that column is zero in every other row.
    pivots : numpy.ndarray
        Pivot columns (``int64``), one per row.
    n : int
        Number of columns.
    """

    __slots__ = ("rows", "pivots", "n")

    def __init__(self, rows: np.ndarray, pivots: np.ndarray, n: int) -> None:
        self.rows = rows
        self.pivots = pivots
        self.n = n

    @property
    def rank(self) -> int:
        return int(self.pivots.shape[0])

    def sorted(self) -> RowEchelon:
        """The same basis with rows ordered by increasing pivot (the canonical RREF)."""
        order = np.argsort(self.pivots, kind="stable")
        return RowEchelon(np.ascontiguousarray(self.rows[order]), self.pivots[order], self.n)

    def bits(self) -> np.ndarray:
        return unpack(self.rows, self.n)


def _packed_input(matrix: BitMatrixLike | np.ndarray, n: int | None) -> tuple[np.ndarray, int]:
    arr = np.asarray(matrix)
    if arr.dtype == np.uint64 and n is not None:
        return np.array(arr, dtype=np.uint64, order="C", ndmin=2), n
    bits = as_bits(matrix)
    return pack(bits), bits.shape[1]


def rref(matrix: BitMatrixLike, *, n: int | None = None,
         column_order: npt.ArrayLike | None = None) -> RowEchelon:
    """Reduced row echelon form.

    Parameters
    ----------
    matrix : array_like
        A 0/1 matrix, or a packed ``uint64`` matrix when ``n`` is given.
    n : int, optional
        Number of columns of a packed input.
    column_order : array_like of int, optional
        The sequence in which columns are tried as pivots (default ``0, 1, ...``).
        Choosing it is how information sets are chosen.

    Returns
    -------
    RowEchelon
        Rows in the order their pivots were found along ``column_order``.

    Examples
    --------
    >>> e = rref([[1, 1, 0], [0, 1, 1], [1, 0, 1]])
    >>> e.rank, e.pivots.tolist()
    (2, [0, 1])
    """
    packed, ncols = _packed_input(matrix, n)
    work = packed.copy()
    if column_order is None:
        order = np.arange(ncols, dtype=np.int64)
    else:
        order = np.ascontiguousarray(column_order, dtype=np.int64)
        if order.size and (order.min() < 0 or order.max() >= ncols):
            raise ParameterError(
                f"Argument 'column_order' must hold columns 0..{ncols - 1}, "
                f"not {order.min() if order.min() < 0 else order.max()}."
            )
    pivots = _kernels.rref_inplace(work, order)
    return RowEchelon(np.ascontiguousarray(work[: pivots.shape[0]]), pivots, ncols)


def rank(matrix: BitMatrixLike) -> int:
    """Rank over GF(2).

    >>> rank([[1, 1], [1, 1]])
    1
    """
    return rref(matrix).rank


def null_space(matrix: BitMatrixLike, *, n: int | None = None) -> np.ndarray:
    """A basis of the right null space ``{x : M x^T = 0}`` as a ``uint8`` matrix.

    The basis has ``n - rank`` rows (possibly zero rows, shape ``(0, n)``).

    >>> null_space([[1, 1, 0], [0, 1, 1]]).tolist()
    [[1, 1, 1]]
    """
    e = rref(matrix, n=n)
    R = e.bits()
    ncols = e.n
    piv = e.pivots
    free = np.setdiff1d(np.arange(ncols), piv, assume_unique=False)
    N = np.zeros((free.size, ncols), dtype=np.uint8)
    N[np.arange(free.size), free] = 1
    if piv.size:
        N[:, piv] = R[:, free].T
    return N


class Systematic:
    """A generator matrix in systematic form ``[I_k | A]`` after a column permutation.

    Attributes
    ----------
    matrix : numpy.ndarray
        ``uint8`` matrix ``[I_k | A]`` whose column ``j`` is column
        ``permutation[j]`` of the original coordinates.
    permutation : numpy.ndarray
        The information set first (``permutation[:k]``), then the other columns.
    """

    __slots__ = ("matrix", "permutation")

    def __init__(self, matrix: np.ndarray, permutation: np.ndarray) -> None:
        self.matrix = matrix
        self.permutation = permutation

    @property
    def information_set(self) -> np.ndarray:
        return self.permutation[: self.matrix.shape[0]]


def systematic_form(matrix: BitMatrixLike, *,
                    column_order: npt.ArrayLike | None = None) -> Systematic:
    """Systematic form ``[I | A]`` of the row space of ``matrix`` with its column permutation.

    >>> s = systematic_form([[0, 1, 1], [1, 1, 0]])
    >>> s.matrix.tolist(), s.permutation.tolist()
    ([[1, 0, 1], [0, 1, 1]], [0, 1, 2])
    """
    e = rref(matrix, column_order=column_order).sorted()
    piv = e.pivots
    rest = np.setdiff1d(np.arange(e.n), piv)
    perm = np.concatenate([piv, rest]).astype(np.int64)
    return Systematic(np.ascontiguousarray(e.bits()[:, perm]), perm)


def independent_rows(matrix: BitMatrixLike) -> np.ndarray:
    """Indices of a maximal set of linearly independent rows, taken greedily from the top.

    >>> independent_rows([[1, 0], [1, 0], [0, 1]]).tolist()
    [0, 2]
    """
    bits = as_bits(matrix)
    # Rank of the leading rows grows exactly at the independent ones: reduce the
    # transposed matrix and read off its pivot columns.
    return rref(np.ascontiguousarray(bits.T)).sorted().pivots.copy()


def in_row_space(matrix: BitMatrixLike, vectors: BitMatrixLike) -> np.ndarray:
    """For each row of ``vectors``, whether it lies in the row space of ``matrix``."""
    M = as_bits(matrix)
    V = as_bits(vectors, name="vectors")
    if V.shape[1] != M.shape[1]:
        raise ParameterError(
            f"Argument 'vectors' must have {M.shape[1]} columns, not {V.shape[1]}."
        )
    H = null_space(M)
    if H.shape[0] == 0:
        return np.ones(V.shape[0], dtype=bool)
    return cast(np.ndarray, ~((V.astype(np.int64) @ H.T.astype(np.int64)) & 1).any(axis=1))


def to_galois(bits: BitMatrixLike) -> Any:
    """Convert a 0/1 matrix to a ``galois.GF2`` array."""
    import galois

    return galois.GF2(as_bits(bits, ndim=np.ndim(bits)))
