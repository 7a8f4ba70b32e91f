"""The :class:`Code` object: an immutable linear subspace of GF(2)^n.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977, ch. 1 (linear codes, duals, self-orthogonality).
.. [2] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*,
   Cambridge University Press, 2003, sections 1.4 and 1.8 (self-orthogonal,
   even and doubly-even codes).
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from typing import Any, cast

import numpy as np
import numpy.typing as npt

from . import linalg
from .exceptions import ParameterError

__all__ = ["Code"]


def _memoised(method: Any) -> property:
    """A read-only property computed once per code, kept in the code's ``_memo``."""
    key = method.__name__

    def get(self: Code) -> Any:
        memo = self._memo
        if key not in memo:
            memo[key] = method(self)
        return memo[key]

    get.__doc__ = method.__doc__
    return property(get)


def _readonly(a: np.ndarray) -> np.ndarray:
    a.setflags(write=False)
    return a


class Code:
    """A binary linear ``[n, k]`` code.

    Build it from a generator matrix (``Code(G)``) or a parity-check matrix
    (:meth:`Code.from_parity_check`). The matrix may have dependent rows: they are
    dropped, and :attr:`dropped_rows` says how many were.

    Parameters
    ----------
    generator : array_like
        A 0/1 matrix (nested lists, numpy array or ``galois.GF2``) whose rows span
        the code.
    name : str, optional
        A label for reports.
    recipe : sequence of mapping, optional
        How the code was made: a list of JSON-compatible steps, for example
        ``[{"family": "hamming", "m": 3}, {"op": "extend"}]``.
    d_lower, d_upper : int, optional
        Bounds on the minimum distance that follow from the construction (a
        family's designed distance, a derivation's rule). They are claims of the
        construction, not proofs; :func:`gf2codes.distance.minimum_distance`
        proves d and reports a contradiction as an internal error.

    Raises
    ------
    ParameterError
        If the matrix is empty, not 0/1, or has rank 0.

    Examples
    --------
    >>> C = Code([[1, 0, 0, 0, 0, 1, 1], [0, 1, 0, 0, 1, 0, 1],
    ...           [0, 0, 1, 0, 1, 1, 0], [0, 0, 0, 1, 1, 1, 1]])
    >>> C.n, C.k
    (7, 4)
    >>> C.dual().k
    3
    """

    # No __dict__: a Code cannot be changed after it is made (``C.d_lower = 5`` raises
    # AttributeError); :meth:`with_info` returns a new code with other metadata. Derived
    # matrices and properties are computed once into the private ``_memo``.
    __slots__ = ("_n", "_basis", "_echelon", "_dropped", "_name", "_recipe", "_d_lower",
                 "_d_upper", "_memo")

    def __init__(
        self,
        generator: npt.ArrayLike,
        *,
        name: str | None = None,
        recipe: Sequence[Mapping[str, Any]] | None = None,
        d_lower: int | None = None,
        d_upper: int | None = None,
    ) -> None:
        bits = linalg.as_bits(generator, name="generator")
        if bits.shape[1] == 0:
            raise ParameterError("Argument 'generator' must have at least one column, not 0.")
        if bits.shape[0] == 0:
            raise ParameterError("Argument 'generator' must have at least one row, not 0.")
        keep = linalg.independent_rows(bits)
        if keep.size == 0:
            raise ParameterError(
                "Argument 'generator' has rank 0: it spans only the zero word, so k = 0 "
                "and there is no code to examine."
            )
        basis = bits[keep]
        self._init(linalg.pack(basis), bits.shape[1], bits.shape[0] - keep.size,
                   name, recipe, d_lower, d_upper)

    def _init(self, basis_packed, n, dropped, name, recipe, d_lower, d_upper) -> None:
        self._n = int(n)
        self._basis = _readonly(np.ascontiguousarray(basis_packed, dtype=np.uint64))
        self._echelon = linalg.rref(self._basis, n=self._n).sorted()
        self._dropped = int(dropped)
        self._name = name
        self._recipe: tuple[dict[str, Any], ...] = tuple(dict(s) for s in (recipe or ()))
        self._d_lower = None if d_lower is None else int(d_lower)
        self._d_upper = None if d_upper is None else int(d_upper)
        self._memo: dict[str, Any] = {}

    @property
    def name(self) -> str | None:
        """A human-readable name (metadata; change it with :meth:`with_info`)."""
        return self._name

    @property
    def recipe(self) -> tuple[dict[str, Any], ...]:
        """How the code was made: a tuple of steps (see :mod:`gf2codes.derive`)."""
        return self._recipe

    @property
    def d_lower(self) -> int | None:
        """A lower bound on d that the construction proves, or None."""
        return self._d_lower

    @property
    def d_upper(self) -> int | None:
        """An upper bound on d that the construction proves, or None."""
        return self._d_upper

    # ------------------------------------------------------------------ builders
    @classmethod
    def from_parity_check(cls, parity_check: npt.ArrayLike, *, name: str | None = None,
                          recipe: Sequence[Mapping[str, Any]] | None = None,
                          d_lower: int | None = None, d_upper: int | None = None) -> Code:
        """The code ``{c : H c^T = 0}`` of a parity-check matrix ``H`` of any rank.

        :attr:`dropped_rows` counts the dependent rows of ``H``.

        >>> Code.from_parity_check([[1, 1, 1]]).k
        2
        """
        H = linalg.as_bits(parity_check, name="parity_check")
        if H.shape[1] == 0:
            raise ParameterError("Argument 'parity_check' must have at least one column, not 0.")
        r = linalg.rank(H)
        G = linalg.null_space(H)
        if G.shape[0] == 0:
            raise ParameterError(
                f"Argument 'parity_check' has full rank {H.shape[1]} = n: the code it "
                "defines is only the zero word (k = 0)."
            )
        code = cls.from_packed(linalg.pack(G), H.shape[1], name=name, recipe=recipe,
                               d_lower=d_lower, d_upper=d_upper)
        code._dropped = H.shape[0] - r
        return code

    @classmethod
    def from_packed(cls, rows: np.ndarray, n: int, *, name: str | None = None,
                    recipe: Sequence[Mapping[str, Any]] | None = None,
                    d_lower: int | None = None, d_upper: int | None = None) -> Code:
        """Build from packed ``uint64`` rows (``n`` columns); dependent rows are dropped."""
        rows = np.array(rows, dtype=np.uint64, order="C", ndmin=2)
        e = linalg.rref(rows, n=n)
        if e.rank == 0:
            raise ParameterError("The matrix has rank 0: it spans only the zero word (k = 0).")
        if e.rank == rows.shape[0]:
            basis = rows
        else:
            basis = rows[linalg.independent_rows(linalg.unpack(rows, n))]
        self = cls.__new__(cls)
        self._init(basis, n, rows.shape[0] - e.rank, name, recipe, d_lower, d_upper)
        return self

    def with_info(self, **changes: Any) -> Code:
        """A copy of this code with ``name``, ``recipe``, ``d_lower`` or ``d_upper`` changed."""
        allowed = {"name", "recipe", "d_lower", "d_upper"}
        bad = set(changes) - allowed
        if bad:
            raise ParameterError(f"Argument {sorted(bad)[0]!r} is not one of {sorted(allowed)}.")
        new = Code.__new__(Code)
        new._n = self._n
        new._basis = self._basis
        new._echelon = self._echelon
        new._dropped = self._dropped
        new._name = changes.get("name", self._name)
        new._recipe = tuple(dict(s) for s in changes.get("recipe", self._recipe))
        lo, hi = changes.get("d_lower", self._d_lower), changes.get("d_upper", self._d_upper)
        new._d_lower = None if lo is None else int(lo)
        new._d_upper = None if hi is None else int(hi)
        new._memo = self._memo  # the same subspace: the same derived matrices
        return new

    # ---------------------------------------------------------------- parameters
    @property
    def n(self) -> int:
        """Length."""
        return self._n

    @property
    def k(self) -> int:
        """Dimension."""
        return int(self._basis.shape[0])

    @property
    def redundancy(self) -> int:
        """``n - k``, the number of parity bits."""
        return self._n - self.k

    @property
    def rate(self) -> float:
        return self.k / self._n

    @property
    def dropped_rows(self) -> int:
        """How many dependent rows of the input matrix were dropped."""
        return self._dropped

    @property
    def packed_generator(self) -> np.ndarray:
        """The basis rows, packed (read-only ``uint64``, shape ``(k, ceil(n/64))``)."""
        return self._basis

    @property
    def words(self) -> int:
        return int(self._basis.shape[1])

    @_memoised
    def G(self) -> np.ndarray:
        """Generator matrix (``uint8``, ``k x n``): the independent input rows, in order."""
        return _readonly(linalg.unpack(self._basis, self._n))

    @_memoised
    def H(self) -> np.ndarray:
        """Parity-check matrix (``uint8``, ``(n - k) x n``, full rank)."""
        return _readonly(linalg.null_space(self._basis, n=self._n))

    @_memoised
    def rref_generator(self) -> np.ndarray:
        """The canonical generator: reduced row echelon form (unique for the subspace)."""
        return _readonly(self._echelon.bits())

    @_memoised
    def pivots(self) -> tuple[int, ...]:
        """The pivot column of each row of :attr:`rref_generator`, increasing: an
        information set of the code (the one every derivation and search uses).

        >>> from gf2codes.families import hamming
        >>> hamming(3).pivots
        (0, 1, 2, 3)
        """
        return tuple(int(p) for p in np.sort(self._echelon.pivots))

    def systematic(self, column_order: npt.ArrayLike | None = None) -> linalg.Systematic:
        """Systematic form ``[I | A]`` with its column permutation."""
        return linalg.systematic_form(self.G, column_order=column_order)

    def dual(self) -> Code:
        """The dual code ``C^⊥ = {x : x·c = 0 for all c in C}``.

        Raises
        ------
        ParameterError
            If ``k == n`` (the dual is the zero code).
        """
        if self.k == self._n:
            raise ParameterError(
                f"The dual of the full space GF(2)^{self._n} is the zero code (k = 0)."
            )
        recipe = self.recipe + ({"op": "dual"},) if self.recipe else ()
        return Code(self.H, recipe=recipe)

    # ----------------------------------------------------------- linear algebra
    def encode(self, message: npt.ArrayLike) -> np.ndarray:
        """Codeword(s) ``m G`` for a message of ``k`` bits or a matrix of messages."""
        m = np.asarray(message)
        single = m.ndim == 1
        M = linalg.as_bits(m, name="message")
        if M.shape[1] != self.k:
            raise ParameterError(f"Argument 'message' must have {self.k} bits, not {M.shape[1]}.")
        out = (M.astype(np.int64) @ self.G.astype(np.int64) & 1).astype(np.uint8)
        return out[0] if single else out

    def syndrome(self, word: npt.ArrayLike) -> np.ndarray:
        """Syndrome(s) ``H w^T`` (``n - k`` bits each) of a word or a matrix of words."""
        w = np.asarray(word)
        single = w.ndim == 1
        Wm = linalg.as_bits(w, name="word")
        if Wm.shape[1] != self._n:
            raise ParameterError(f"Argument 'word' must have {self._n} bits, not {Wm.shape[1]}.")
        out = (Wm.astype(np.int64) @ self.H.T.astype(np.int64) & 1).astype(np.uint8)
        return out[0] if single else out

    def contains(self, word: npt.ArrayLike) -> bool | np.ndarray:
        """Whether a word (or each row of a matrix) is a codeword."""
        w = np.asarray(word)
        s = self.syndrome(w)
        if w.ndim == 1:
            return not s.any()
        return cast(np.ndarray, ~s.any(axis=1))  # 2-d: an array, one per row

    def __contains__(self, word: object) -> bool:
        return bool(self.contains(np.asarray(word)))

    # ---------------------------------------------------------------- properties
    @_memoised
    def _row_weights(self) -> np.ndarray:
        return self.G.sum(axis=1, dtype=np.int64)

    @_memoised
    def is_self_orthogonal(self) -> bool:
        """``C ⊆ C^⊥``: every two codewords (a codeword with itself included) are orthogonal."""
        if 2 * self.k > self._n:  # C ⊆ C^⊥ needs k <= n - k
            return False
        G = self.G  # uint8: the product wraps modulo 256, which keeps its parity
        return not ((G @ G.T) & 1).any()

    @_memoised
    def is_even(self) -> bool:
        """Every codeword has even weight (equivalently, every basis row does)."""
        return bool((self._row_weights % 2 == 0).all())

    @_memoised
    def is_doubly_even(self) -> bool:
        """Every codeword has weight divisible by 4.

        A binary code is doubly even iff its basis rows have weights divisible by 4
        and are pairwise orthogonal ([2]_, Theorem 1.4.8).
        """
        return bool((self._row_weights % 4 == 0).all()) and self.is_self_orthogonal

    @_memoised
    def is_self_dual(self) -> bool:
        """``C = C^⊥``."""
        return 2 * self.k == self._n and self.is_self_orthogonal

    @_memoised
    def is_dual_containing(self) -> bool:
        """``C^⊥ ⊆ C`` (the condition of the CSS construction of quantum codes)."""
        if self.k == self._n:
            return True
        if 2 * self.k < self._n:  # C^⊥ ⊆ C needs n - k <= k: no parity-check matrix needed
            return False
        H = self.H  # uint8: the product wraps modulo 256, which keeps its parity
        return not ((H @ H.T) & 1).any()

    @property
    def weight_divisor(self) -> int:
        """The largest of 4, 2, 1 that divides every codeword weight, as proved by
        :attr:`is_doubly_even` and :attr:`is_even`."""
        return 4 if self.is_doubly_even else 2 if self.is_even else 1

    def properties(self) -> dict[str, bool]:
        """The structural properties as a dictionary (for reports)."""
        return {
            "even": self.is_even,
            "doubly_even": self.is_doubly_even,
            "self_orthogonal": self.is_self_orthogonal,
            "self_dual": self.is_self_dual,
            "dual_containing": self.is_dual_containing,
        }

    # ------------------------------------------------------------------- dunder
    def __eq__(self, other: object) -> bool:
        """Equal as subspaces (same length and same set of codewords)."""
        if not isinstance(other, Code):
            return NotImplemented
        return (
            self._n == other._n
            and self.k == other.k
            and np.array_equal(self._echelon.rows, other._echelon.rows)
        )

    def __hash__(self) -> int:
        return hash((self._n, self._echelon.rows.tobytes()))

    def __repr__(self) -> str:
        label = f" {self.name!r}" if self.name else ""
        return f"<Code{label} [{self._n}, {self.k}]>"

    def to_galois(self) -> Any:
        """The generator matrix as a ``galois.GF2`` array."""
        return linalg.to_galois(self.G)
