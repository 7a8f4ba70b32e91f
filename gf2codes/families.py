"""Named constructions of binary linear codes.

Every builder returns a :class:`~gf2codes.code.Code` with a ``name``, a one-step
``recipe`` (``[{"family": "bch", "n": 63, "designed": 11, "b": 1}]``; the keys
other than ``family`` are the builder's keyword arguments, so
:func:`gf2codes.derive.rebuild` can run it again) and ``d_lower`` / ``d_upper``
set only to what the construction proves. A designed distance is a lower bound,
never a claim that d equals it.

Cyclic codes use the textbook correspondence: the word ``(c_0, ..., c_{n-1})`` is
the polynomial ``c_0 + c_1 x + ... + c_{n-1} x^{n-1}``, and the generator matrix
has the rows ``x^i g(x)``, ``i = 0 .. k-1``.

Polynomials (for :func:`cyclic`) are given as a ``galois.Poly`` over GF(2) or as
text in one of three notations:

* ``"x^11+x^10+x^6+x^5+x^4+x^2+1"`` (also ``x**3``; spaces ignored; ``-`` is the
  same as ``+`` over GF(2));
* ``"0o5343"``: octal, the notation of the published tables of cyclic codes,
  most significant bit = highest degree (``0o5343`` is
  ``x^11+x^9+x^7+x^6+x^5+x+1``). The ``0o`` prefix is required so that an octal
  string is never mistaken for a binary or decimal number;
* ``"0b1011"``: binary, highest degree first (``x^3+x+1``).

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977: ch. 1 (repetition, even-weight, Hamming, simplex
   codes), ch. 7 and 9 (cyclic and BCH codes, the BCH bound), ch. 13 (Reed-Muller
   codes), ch. 16 (quadratic-residue codes, their idempotents and the square-root
   bound), ch. 16 section 6 and ch. 20 (the Golay codes).
.. [2] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*,
   Cambridge University Press, 2003: ch. 1 (Hamming, Reed-Muller, Golay),
   ch. 4 and 5 (cyclic and BCH codes), section 6.6 (quadratic-residue codes,
   the square-root bound, odd minimum weight).
.. [3] M. J. E. Golay, "Notes on digital coding", *Proc. IRE* 37 (1949) 657.
.. [4] I. S. Reed, "A class of multiple-error-correcting codes and the decoding
   scheme", *IRE Trans. Inform. Theory* 4 (1954) 38-49; D. E. Muller,
   "Application of Boolean algebra to switching circuit design and to error
   detection", *IRE Trans. Electron. Comput.* 3 (1954) 6-12.
.. [5] R. C. Bose and D. K. Ray-Chaudhuri, "On a class of error correcting binary
   group codes", *Inform. Control* 3 (1960) 68-79; A. Hocquenghem, "Codes
   correcteurs d'erreurs", *Chiffres* 2 (1959) 147-156.
.. [6] J. H. Conway and N. J. A. Sloane, *Sphere Packings, Lattices and Groups*,
   Springer, 1988, ch. 3 section 2 (quadratic-residue and Golay codes).
"""

from __future__ import annotations

import math
import re
from collections.abc import Callable, Container, Iterable, Iterator, Sequence
from dataclasses import dataclass, field
from itertools import combinations
from typing import Any, cast

import numpy as np
import numpy.typing as npt

from . import linalg
from .code import Code
from .exceptions import ParameterError, check_int
from .polynomials import (
    PRIMITIVE_POLYNOMIALS,
    FieldTables,
    GeneratorPolynomial,
    ascending,
    bch_bound,
    berlekamp_factors,
    cyclotomic_coset,
    defining_set_of,
    galois,
    generator_polynomials,
    is_prime,
    parse_polynomial,
    polynomial_to_octal,
    x_n_minus_1,
)

__all__ = [
    "MAX_LENGTH", "berlekamp_factors", "repetition", "even_weight", "hamming",
    "extended_hamming", "simplex", "reed_muller", "golay", "extended_golay", "bch",
    "quadratic_residue", "cyclic", "generator_polynomials", "GeneratorPolynomial",
    "quasi_cyclic", "double_circulant", "from_rows", "parse_polynomial", "GOLAY_POLYNOMIAL",
    "PRIMITIVE_POLYNOMIALS", "polynomial_to_octal", "bch_bound", "FamilyArgument", "Family",
    "FAMILIES", "construction_note", "anticode",
]

#: Longest code the families build (a generator matrix of at most about 2^24 bits).
MAX_LENGTH = 4096


# ----------------------------------------------------------------- helpers
def _parse_bits(name: str, value: Any) -> np.ndarray:
    """A 0/1 vector from a string (``|``, spaces, commas ignored) or a sequence."""
    if isinstance(value, str):
        text = re.sub(r"[\s|,_]", "", value)
        if not text or set(text) - {"0", "1"}:
            raise ParameterError(
                f"Argument {name!r} must be a string of 0s and 1s, not {value!r}."
            )
        return np.frombuffer(text.encode("ascii"), dtype=np.uint8) - ord("0")
    arr = np.asarray(value)
    if arr.ndim != 1 or arr.size == 0 or arr.dtype.kind not in "biu":
        raise ParameterError(f"Argument {name!r} must be a non-empty 0/1 vector, not {value!r}.")
    if ((arr != 0) & (arr != 1)).any():
        raise ParameterError(f"Argument {name!r} must hold only 0 and 1.")
    return arr.astype(np.uint8)


def _with_parity(G: np.ndarray) -> np.ndarray:
    """``G`` with an overall parity column appended."""
    G = np.asarray(G, dtype=np.uint8)
    return np.hstack([G, (G.sum(axis=1) % 2).astype(np.uint8)[:, None]])


def _check_length(name: str, n: int) -> None:
    if n > MAX_LENGTH:
        raise ParameterError(
            f"Argument {name!r} gives length {n}, more than the largest supported "
            f"length {MAX_LENGTH}."
        )


def _cyclic_code(n: int, g: galois.Poly, *, name: str, recipe: dict[str, Any],
                 d_lower: int | None = None, d_upper: int | None = None,
                 defining_set: np.ndarray | None = None) -> Code:
    """The cyclic code generated by ``g`` (which divides ``x^n - 1``)."""
    k = n - g.degree
    coeffs = ascending(g, n)
    G = np.zeros((k, n), dtype=np.uint8)
    for i in range(k):
        G[i] = np.roll(coeffs, i)
    weight = int(coeffs.sum())  # every row is a shift of g: a codeword of this weight
    if defining_set is None:
        defining_set = defining_set_of(n, g)
    lower = bch_bound(n, defining_set) if defining_set is not None else None
    lows = [x for x in (d_lower, lower) if x is not None]
    lo = max(lows) if lows else None
    hi = weight if d_upper is None else min(d_upper, weight)
    return Code(G, name=name, recipe=[recipe], d_lower=lo, d_upper=hi)


# ------------------------------------------------------------------ families
def repetition(n: int) -> Code:
    """The ``[n, 1, n]`` repetition code.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 1 section 2.

    >>> C = repetition(5); (C.n, C.k, C.d_lower, C.d_upper)
    (5, 1, 5, 5)
    """
    n = check_int("n", n, minimum=1)
    return Code(np.ones((1, n), dtype=np.uint8), name=f"repetition [{n},1]",
                recipe=[{"family": "repetition", "n": n}], d_lower=n, d_upper=n)


def even_weight(n: int) -> Code:
    """The ``[n, n-1, 2]`` even-weight (single parity check) code.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 1 section 2.

    >>> C = even_weight(4); (C.n, C.k, C.d_lower, C.d_upper)
    (4, 3, 2, 2)
    """
    n = check_int("n", n, minimum=2, maximum=MAX_LENGTH)
    G = np.hstack([np.eye(n - 1, dtype=np.uint8), np.ones((n - 1, 1), dtype=np.uint8)])
    return Code(G, name=f"even-weight [{n},{n - 1}]",
                recipe=[{"family": "even-weight", "n": n}], d_lower=2, d_upper=2)


def _hamming_columns(m: int) -> np.ndarray:
    """The ``m x (2^m - 1)`` matrix whose column ``j`` is ``j + 1`` in binary (bit i in row i)."""
    j = np.arange(1, 2**m, dtype=np.int64)
    return ((j[None, :] >> np.arange(m)[:, None]) & 1).astype(np.uint8)


def hamming(m: int) -> Code:
    """The ``[2^m - 1, 2^m - 1 - m, 3]`` Hamming code.

    Its parity-check matrix has every nonzero vector of length ``m`` as a column
    (column ``j`` is ``j + 1`` in binary, least significant bit in row 0).

    Parameters
    ----------
    m : int
        Redundancy, ``2 <= m <= 12``.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 1 section 7.
    .. [2] Huffman & Pless (2003), section 1.8.

    >>> C = hamming(3); (C.n, C.k, C.d_lower, C.d_upper)
    (7, 4, 3, 3)
    """
    m = check_int("m", m, minimum=2, maximum=12)
    n = 2**m - 1
    return Code.from_parity_check(_hamming_columns(m), name=f"Hamming [{n},{n - m}]",
                                  recipe=[{"family": "hamming", "m": m}], d_lower=3, d_upper=3)


def extended_hamming(m: int) -> Code:
    """The ``[2^m, 2^m - 1 - m, 4]`` extended Hamming code (:func:`hamming` plus parity).

    Parameters
    ----------
    m : int
        ``2 <= m <= 12``.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 1 section 9.

    >>> C = extended_hamming(3); (C.n, C.k, C.d_lower, C.d_upper)
    (8, 4, 4, 4)
    """
    m = check_int("m", m, minimum=2, maximum=12)
    n = 2**m
    G = _with_parity(hamming(m).G)
    return Code(G, name=f"extended Hamming [{n},{n - 1 - m}]",
                recipe=[{"family": "extended-hamming", "m": m}], d_lower=4, d_upper=4)


def simplex(m: int) -> Code:
    """The ``[2^m - 1, m, 2^(m-1)]`` simplex code, the dual of :func:`hamming`.

    Every nonzero codeword has weight ``2^(m-1)``.

    Parameters
    ----------
    m : int
        ``2 <= m <= 12``.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 1 section 9.

    >>> C = simplex(3); (C.n, C.k, C.d_lower, C.d_upper)
    (7, 3, 4, 4)
    """
    m = check_int("m", m, minimum=2, maximum=12)
    d = 2 ** (m - 1)
    return Code(_hamming_columns(m), name=f"simplex [{2**m - 1},{m}]",
                recipe=[{"family": "simplex", "m": m}], d_lower=d, d_upper=d)


def reed_muller(r: int, m: int) -> Code:
    """The Reed-Muller code ``RM(r, m)``: ``[2^m, sum_{i<=r} C(m, i), 2^(m-r)]``.

    The rows are the evaluations of the monomials of degree at most ``r`` in
    ``v_1 .. v_m`` at every point of GF(2)^m (point ``j`` has ``v_i`` = bit ``i-1``
    of ``j``), in order of degree, then lexicographically.

    Parameters
    ----------
    r : int
        Order, ``0 <= r <= m``.
    m : int
        ``1 <= m <= 12``.

    References
    ----------
    .. [1] Reed (1954); Muller (1954).
    .. [2] MacWilliams & Sloane (1977), ch. 13 sections 3-4 (Theorem 3: the
       minimum distance is ``2^(m-r)``).

    >>> C = reed_muller(1, 3); (C.n, C.k, C.d_lower, C.d_upper)
    (8, 4, 4, 4)
    """
    m = check_int("m", m, minimum=1, maximum=12)
    r = check_int("r", r, minimum=0, maximum=m)
    n = 2**m
    points = ((np.arange(n)[None, :] >> np.arange(m)[:, None]) & 1).astype(np.uint8)
    rows = []
    for deg in range(r + 1):
        for subset in combinations(range(m), deg):
            row = np.ones(n, dtype=np.uint8)
            for i in subset:
                row &= points[i]
            rows.append(row)
    d = 2 ** (m - r)
    return Code(np.array(rows), name=f"Reed-Muller RM({r},{m}) [{n},{len(rows)}]",
                recipe=[{"family": "reed-muller", "r": r, "m": m}], d_lower=d, d_upper=d)


#: Generator polynomial of the binary Golay code (MacWilliams & Sloane ch. 16 section 6).
GOLAY_POLYNOMIAL = "x^11+x^10+x^6+x^5+x^4+x^2+1"


def golay() -> Code:
    """The ``[23, 12, 7]`` binary Golay code, cyclic with generator
    ``x^11 + x^10 + x^6 + x^5 + x^4 + x^2 + 1``.

    References
    ----------
    .. [1] Golay (1949).
    .. [2] MacWilliams & Sloane (1977), ch. 16 section 6 and ch. 20 (d = 7).

    >>> C = golay(); (C.n, C.k, C.d_lower, C.d_upper)
    (23, 12, 7, 7)
    """
    g = parse_polynomial(GOLAY_POLYNOMIAL)
    return _cyclic_code(23, g, name="Golay [23,12]", recipe={"family": "golay"},
                        d_lower=7, d_upper=7)


def extended_golay() -> Code:
    """The ``[24, 12, 8]`` extended binary Golay code (:func:`golay` plus parity).

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 2 section 6 and ch. 20.

    >>> C = extended_golay(); (C.n, C.k, C.d_lower, C.d_upper)
    (24, 12, 8, 8)
    """
    return Code(_with_parity(golay().G), name="extended Golay [24,12]",
                recipe=[{"family": "extended-golay"}], d_lower=8, d_upper=8)


def bch(n: int, designed: int, *, b: int = 1) -> Code:
    """The binary primitive BCH code of length ``n = 2^m - 1`` and designed distance ``δ``.

    The generator polynomial is the least common multiple of the minimal
    polynomials of ``α^b, α^(b+1), ..., α^(b+δ-2)``, with ``α`` a root of the
    lexicographically first primitive polynomial of degree ``m`` (for example
    ``x^6 + x + 1`` for ``m = 6``; ``galois.primitive_poly(2, m)``); ``b = 1`` is
    the narrow-sense code. The dimension is ``n`` minus the size of the defining
    set, so it is exact. ``d_lower`` is the BCH bound of the whole
    defining set (at least ``δ``, sometimes more: the *Bose distance*); ``d_upper``
    is the weight of the generator polynomial. The true distance is not claimed.

    Parameters
    ----------
    n : int
        ``2^m - 1`` with ``2 <= m <= 12``.
    designed : int
        Designed distance ``δ``, ``2 <= δ <= n``.
    b : int
        Exponent of the first consecutive root, ``0 <= b < n``.

    Raises
    ------
    ParameterError
        If ``n`` is not ``2^m - 1``, ``δ`` or ``b`` is out of range, or the roots
        cover every exponent (the code would be {0}).

    References
    ----------
    .. [1] Bose & Ray-Chaudhuri (1960); Hocquenghem (1959).
    .. [2] MacWilliams & Sloane (1977), ch. 7 sections 6-7 (definition, Theorem 8
       the BCH bound) and ch. 9.

    >>> C = bch(15, 5); (C.n, C.k, C.d_lower)
    (15, 7, 5)
    """
    n = check_int("n", n, minimum=3, maximum=MAX_LENGTH)
    m = n.bit_length()
    if 2**m - 1 != n:
        raise ParameterError(
            f"Argument 'n' must be of the form 2^m - 1 (3, 7, 15, 31, 63, ..., 4095), not {n}."
        )
    designed = check_int("designed", designed, minimum=2, maximum=n)
    b = check_int("b", b, minimum=0, maximum=n - 1)
    mask = np.zeros(n, dtype=bool)
    for e in range(b, b + designed - 1):
        if not mask[e % n]:
            mask[cyclotomic_coset(e, n)] = True
    k = n - int(mask.sum())
    if k == 0:
        raise ParameterError(
            f"The roots alpha^{b} .. alpha^{b + designed - 2} cover every exponent modulo {n}: "
            f"the BCH code is {{0}}; choose a smaller 'designed' (at most {n - 1})."
        )
    coeffs = FieldTables(m).poly_from_roots(np.flatnonzero(mask).tolist())
    if ((coeffs != 0) & (coeffs != 1)).any():  # pragma: no cover - closed under squaring
        raise AssertionError("BCH generator polynomial has coefficients outside GF(2)")
    g = galois.Poly(coeffs[::-1].astype(np.int64))
    kind = "narrow-sense " if b == 1 else f"b={b} "
    return _cyclic_code(
        n, g, name=f"BCH [{n},{k}] {kind}designed distance {designed}",
        recipe={"family": "bch", "n": n, "designed": designed, "b": b},
        d_lower=designed, defining_set=mask,
    )


def quadratic_residue(p: int) -> Code:
    """The binary quadratic-residue code ``[p, (p+1)/2]`` for a prime ``p ≡ ±1 (mod 8)``.

    Let ``Q`` be the nonzero squares modulo ``p``. Because 2 is a square, the
    polynomial ``e(x) = sum_{r in Q} x^r`` is an idempotent; the cyclic code it
    generates has generator ``g(x) = gcd(e(x), x^p - 1)`` and dimension
    ``(p-1)/2 + e(1)`` ([1]_ ch. 16 section 3). For ``p ≡ -1 (mod 8)``, ``e(1) = 1``
    and this is the quadratic-residue code; for ``p ≡ 1 (mod 8)`` it is the
    even-weight subcode, and ``g(x) / (x + 1)`` generates the code. Either way
    the zeros of ``g`` are ``β^r``, ``r`` ranging over the squares or over the
    non-squares, for a primitive p-th root ``β``: one of the two equivalent
    quadratic-residue codes.

    ``d_lower`` is the square-root bound (``d^2 >= p``, and ``d^2 - d + 1 >= p``
    when ``p ≡ -1 (mod 8)``), rounded up to odd because the minimum weight of a
    binary quadratic-residue code is odd; ``d_upper`` is the weight of ``g``.

    Parameters
    ----------
    p : int
        A prime ``≡ ±1 (mod 8)`` (7, 17, 23, 31, 41, 47, 71, 73, ...), at most 4096.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 16 sections 1-3 (definition,
       idempotents) and Theorem 1 (square-root bound).
    .. [2] Huffman & Pless (2003), section 6.6 (square-root bound; the minimum
       weight of a binary QR code is odd, by the Gleason-Prange theorem).
    .. [3] Conway & Sloane (1988), ch. 3 section 2.

    >>> C = quadratic_residue(23); (C.n, C.k, C.d_lower, C.d_upper)
    (23, 12, 7, 7)
    """
    p = check_int("p", p, minimum=7, maximum=MAX_LENGTH)
    if not is_prime(p) or p % 8 not in (1, 7):
        raise ParameterError(
            f"Argument 'p' must be a prime congruent to 1 or 7 modulo 8 (7, 17, 23, 31, 41, 47, "
            f"71, 73, ...), not {p}"
            + (" (it is not prime)." if not is_prime(p) else f" (it is {p % 8} modulo 8).")
        )
    squares = sorted({(i * i) % p for i in range(1, p)})
    e = galois.Poly.Degrees(sorted(squares, reverse=True))
    g = galois.gcd(e, x_n_minus_1(p))
    if p % 8 == 1:
        g = g // galois.Poly([1, 1])
    if g.degree != (p - 1) // 2:  # pragma: no cover - guards the theory above
        raise AssertionError(f"quadratic residue generator of degree {g.degree} for p = {p}")
    d = math.isqrt(p - 1) + 1  # least d with d^2 >= p (p is not a square)
    if p % 8 == 7:  # p ≡ 3 (mod 4): the stronger d^2 - d + 1 >= p
        while d * d - d + 1 < p:
            d += 1
    d += 1 - d % 2
    return _cyclic_code(p, g, name=f"quadratic residue [{p},{(p + 1) // 2}]",
                        recipe={"family": "qr", "p": p}, d_lower=d)


def cyclic(n: int, generator_polynomial: str | galois.Poly) -> Code:
    """The cyclic code of length ``n`` generated by a divisor ``g(x)`` of ``x^n - 1``.

    ``d_upper`` is the weight of ``g`` (itself a codeword); ``d_lower`` is the BCH
    bound of the roots of ``g`` (:func:`bch_bound`) when ``n`` is odd and the roots
    lie in a field ``GF(2^m)`` with ``m <= 16``, else unknown.

    Parameters
    ----------
    n : int
        Length, ``1 <= n <= 4096``.
    generator_polynomial : str or galois.Poly
        See the module notes for the text notations (``x^3+x+1``, ``0o13``,
        ``0b1011``).

    Raises
    ------
    ParameterError
        If the polynomial does not divide ``x^n - 1`` or is ``x^n - 1`` itself.
    ParseError
        If the text cannot be read as a polynomial.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 7 sections 2-3.

    >>> C = cyclic(7, "x^3+x+1"); (C.n, C.k, C.d_lower, C.d_upper)
    (7, 4, 3, 3)
    """
    n = check_int("n", n, minimum=1, maximum=MAX_LENGTH)
    g = parse_polynomial(generator_polynomial)
    if g == 0 or x_n_minus_1(n) % g != 0:
        raise ParameterError(
            f"Argument 'generator_polynomial' must divide x^{n} - 1, and {g} does not; "
            f"gf2codes.families.generator_polynomials({n}) lists the divisors."
        )
    if g.degree == n:
        raise ParameterError(
            f"Argument 'generator_polynomial' is x^{n} - 1 itself: the code is {{0}}."
        )
    octal = polynomial_to_octal(g)
    return _cyclic_code(n, g, name=f"cyclic [{n},{n - g.degree}] g = {octal}",
                        recipe={"family": "cyclic", "n": n, "generator_polynomial": octal})


def _anticode_plan(k: int, d: int) -> tuple[int, list[list[int]]]:
    """Belov's choice for :func:`anticode`: ``s`` copies and, per copy, the dimensions
    of the coordinate subspaces removed from it (first-fit, largest first)."""
    s = -(-d // 2 ** (k - 1))
    excess = s * 2 ** (k - 1) - d  # < 2^(k-1): its binary digits are the subspace sizes
    dims = [u + 1 for u in range(k - 1, -1, -1) if excess >> u & 1]
    copies: list[list[int]] = [[] for _ in range(s)]
    for u in dims:
        room = [c for c in copies if sum(c) + u <= k]
        if not room:
            raise ParameterError(
                f"Argument 'd' = {d} has no anticode construction for k = {k}: the removed "
                f"subspaces of dimensions {dims} do not fit disjointly into {s} "
                f"cop{'y' if s == 1 else 'ies'} of the simplex code."
            )
        room[0].append(u)
    return s, copies


def anticode(k: int, d: int) -> Code:
    """The Solomon-Stiffler / Belov code of dimension ``k`` and distance ``d``.

    Its columns are ``s = ceil(d / 2^(k-1))`` copies of every nonzero vector of GF(2)^k
    (``s`` simplex codes side by side) with the points of subspaces of dimensions
    ``u_1 > u_2 > ...`` removed, where ``s 2^(k-1) - d = sum 2^(u_i - 1)`` (the binary
    digits of the excess). The subspaces removed from one copy are spanned by disjoint
    sets of unit vectors. A codeword ``x G`` then has weight ``s 2^(k-1) - sum over the
    removed subspaces not inside x^perp of 2^(u_i - 1)``, at least ``d`` and equal to
    ``d`` for ``x`` the all-ones vector, so ``d`` is exact, and the length
    ``s (2^k - 1) - sum (2^(u_i) - 1)`` meets the Griesmer bound.

    Parameters
    ----------
    k : int
        Dimension, ``2 <= k <= 12``.
    d : int
        Minimum distance, ``1 <= d``, with a length of at most 4096.

    Raises
    ------
    ParameterError
        If the subspaces do not fit (Belov's condition fails for this greedy packing).

    References
    ----------
    .. [1] G. Solomon and J. J. Stiffler, "Algebraically punctured cyclic codes",
       *Inform. Control* 8 (1965) 170-179.
    .. [2] B. I. Belov, "A conjecture on the Griesmer bound", in *Optimization Methods
       and Their Applications*, Sibirsk. Energet. Inst., Irkutsk, 1974, 100-106.
    .. [3] MacWilliams & Sloane (1977), ch. 17 section 6 (anticodes; section from
       memory); Huffman & Pless (2003), section 2.7 (the Griesmer bound).

    >>> C = anticode(3, 3); (C.n, C.k, C.d_lower, C.d_upper)   # the simplex minus a line
    (6, 3, 3, 3)
    """
    k = check_int("k", k, minimum=2, maximum=12)
    d = check_int("d", d, minimum=1)
    s, copies = _anticode_plan(k, d)
    points = _hamming_columns(k)  # column j is j + 1 in binary
    value = np.arange(1, 2**k, dtype=np.int64)
    blocks = []
    for removed in copies:
        keep = np.ones(value.size, dtype=bool)
        start = 0
        for u in removed:  # the subspace spanned by unit vectors start .. start+u-1
            mask = ((1 << u) - 1) << start
            keep &= (value & ~mask) != 0
            start += u
        blocks.append(points[:, keep])
    G = np.concatenate(blocks, axis=1)
    _check_length("d", G.shape[1])
    return Code(G, name=f"anticode [{G.shape[1]},{k},{d}]",
                recipe=[{"family": "anticode", "k": k, "d": d}], d_lower=d, d_upper=d)


def quasi_cyclic(rows: Sequence[str] | npt.ArrayLike, m: int) -> Code:
    """A quasi-cyclic code of co-index ``m``: each row with all its block-wise shifts.

    Each given row has length ``ℓ m`` and is cut into ``ℓ`` blocks of ``m``; the
    code is spanned by the rows obtained by shifting every block cyclically by
    the same amount ``s = 0 .. m-1``. With one row, the generator matrix is
    ``[C_1 | C_2 | ... | C_ℓ]`` with ``C_j`` the circulant whose first row is block
    ``j``. ``d_upper`` is the least weight of a given nonzero row.

    Parameters
    ----------
    rows : sequence of str or 2-D array_like
        The first rows, as 0/1 strings (``|``, spaces and commas are ignored,
        so ``"1101000|1110010"`` is fine) or a 0/1 matrix.
    m : int
        Size of the circulants, ``m >= 1``.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 16 section 7 (quasi-cyclic and double
       circulant codes).
    .. [2] Huffman & Pless (2003), section 9.8.

    >>> quasi_cyclic(["1101000|1110010"], 7).k   # both circulants have rank 4
    4
    >>> quasi_cyclic(["1000000|1101000"], 7).k   # [I | A]
    7
    """
    m = check_int("m", m, minimum=1, maximum=MAX_LENGTH)
    if isinstance(rows, str):
        rows = [rows]
    vecs = [_parse_bits("rows", r) for r in (cast("Sequence[Any]", rows)
                                              if not isinstance(rows, np.ndarray) else
                                              list(rows))]
    if not vecs:
        raise ParameterError("Argument 'rows' must hold at least one row.")
    n = vecs[0].size
    for v in vecs:
        if v.size != n:
            raise ParameterError(
                f"Argument 'rows' must hold rows of one length, not {n} and {v.size}."
            )
    if n % m:
        raise ParameterError(
            f"Argument 'rows' must have a length divisible by m = {m}, not {n}."
        )
    _check_length("rows", n)
    ell = n // m
    G = []
    for v in vecs:
        blocks = v.reshape(ell, m)
        for s in range(m):
            G.append(np.roll(blocks, s, axis=1).reshape(-1))
    weights = [int(v.sum()) for v in vecs if v.any()]
    code = Code(np.array(G), name=None,
                recipe=[{"family": "quasi-cyclic", "rows": [linalg.bit_string(v) for v in vecs],
                         "m": m}],
                d_upper=min(weights) if weights else None)
    return code.with_info(name=f"quasi-cyclic [{code.n},{code.k}] index {ell}")


def double_circulant(first_row: str | npt.ArrayLike) -> Code:
    """The pure double circulant code ``[I | A]``, ``A`` the circulant with ``first_row``.

    An ``[2ℓ, ℓ]`` code; ``d_upper`` is ``1 +`` the weight of ``first_row`` (a row's
    weight).

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 16 section 7.

    >>> C = double_circulant("0111"); (C.n, C.k, C.d_upper)
    (8, 4, 4)
    """
    a = _parse_bits("first_row", first_row)
    ell = a.size
    _check_length("first_row", 2 * ell)
    eye = np.zeros(ell, dtype=np.uint8)
    eye[0] = 1
    base = quasi_cyclic([np.concatenate([eye, a])], ell)
    return base.with_info(
        name=f"double circulant [{2 * ell},{ell}]",
        recipe=[{"family": "double-circulant", "first_row": linalg.bit_string(a)}],
    )


def from_rows(generator: Sequence[str] | npt.ArrayLike, n: int | None = None) -> Code:
    """A code given by its generator rows (0/1 strings or a matrix), with no known distance.

    This is the first step of the recipe of a code that was read from a file
    without a recipe. ``n``, when given, must equal the row length.

    >>> from_rows(["110", "011"]).k
    2
    """
    if isinstance(generator, str):
        generator = [generator]
    seq = cast("Sequence[Any]", generator)  # used only where it is not an ndarray
    if isinstance(generator, np.ndarray) or (
            len(seq) and not isinstance(seq[0], str)):
        bits = np.asarray(generator, dtype=np.int64)
    else:
        vecs = [_parse_bits("generator", r) for r in seq]
        if not vecs or len({v.size for v in vecs}) != 1:
            raise ParameterError("Argument 'generator' must hold rows of one length.")
        bits = np.array(vecs)
    code = Code(bits)
    if n is not None and check_int("n", n, minimum=1) != code.n:
        raise ParameterError(f"Argument 'n' is {n} but the generator rows have length {code.n}.")
    return code.with_info(
        name=f"matrix [{code.n},{code.k}]",
        recipe=[{"family": "matrix", "n": code.n,
                 "generator": [linalg.bit_string(r) for r in code.rref_generator]}],
    )


# ------------------------------------------------------------------ registry
@dataclass(frozen=True)
class FamilyArgument:
    """One argument of a family builder, as the command line presents it.

    ``kind`` is ``"int"``, ``"polynomial"``, ``"bits"`` (one 0/1 string) or
    ``"bits-list"`` (one or more); ``option`` arguments are given as ``--name``.
    """

    name: str
    kind: str
    help: str
    option: bool = False
    required: bool = True
    default: Any = None


#: ``space(max_length, wanted)``: the argument dicts of a family's members of length at
#: most ``max_length`` whose length passes ``wanted``, in the family's order.
Space = Callable[[int, Callable[[int], bool]], Iterator[dict[str, Any]]]


@dataclass(frozen=True)
class Family:
    """A named construction: what it is, its arguments, and the function that builds it.

    ``space`` declares the family's parameter space once (see :meth:`instances`);
    ``parameters(**kwargs)`` gives the proved ``(n, k, d_lower)`` of a member without
    building it, where a formula does; ``describe(step)`` explains what a one-step
    recipe of the family proves about d (shown by ``gf2codes build``).
    """

    name: str
    description: str
    builder: Callable[..., Code]
    arguments: tuple[FamilyArgument, ...] = field(default=())
    example: str = ""
    space: Space | None = None
    parameters: Callable[..., tuple[int, int, int]] | None = None
    describe: Callable[[dict[str, Any]], str] | None = None

    def build(self, **kwargs: Any) -> Code:
        return self.builder(**kwargs)

    def instances(self, max_length: int,
                  lengths: Container[int] | None = None) -> Iterator[dict[str, Any]]:
        """The keyword arguments of every member of length at most ``max_length`` (and in
        ``lengths``, if given), in the family's order; nothing for a family without a
        parameter space (``matrix``, ``double-circulant``, ``quasi-cyclic``).

        >>> list(FAMILIES["hamming"].instances(15))
        [{'m': 2}, {'m': 3}, {'m': 4}]
        """
        if self.space is None:
            return iter(())
        return self.space(max_length, (lambda n: True) if lengths is None
                          else (lambda n: n in lengths))


def construction_note(code: Code) -> str | None:
    """What the family of a one-step recipe says about d beyond the claimed bounds (the
    BCH designed distance), or None."""
    first = code.recipe[0] if len(code.recipe) == 1 else {}
    family = FAMILIES.get(str(first.get("family")))
    return family.describe(first) if family is not None and family.describe else None


# ------------------------------------------------------------ parameter spaces
def _by_length(lengths: Iterable[int], max_length: int, wanted: Callable[[int], bool],
               args: Callable[[int], Iterable[dict[str, Any]]]) -> Iterator[dict[str, Any]]:
    for n in lengths:
        if n > max_length:
            return
        if wanted(n):
            yield from args(n)


def _m_space(length: Callable[[int], int], first_m: int = 2) -> Space:
    """Members ``{"m": m}`` for ``m = first_m .. 12`` of length ``length(m)``."""
    def space(max_length: int, wanted: Callable[[int], bool]) -> Iterator[dict[str, Any]]:
        for m in range(first_m, 13):
            if length(m) > max_length:
                return
            if wanted(length(m)):
                yield {"m": m}
    return space


def _reed_muller_space(max_length: int, wanted: Callable[[int], bool]
                       ) -> Iterator[dict[str, Any]]:
    for m in range(1, 13):
        if 2**m > max_length:
            return
        if wanted(2**m):
            yield from ({"r": r, "m": m} for r in range(m + 1))


def _fixed(n: int) -> Space:
    def space(max_length: int, wanted: Callable[[int], bool]) -> Iterator[dict[str, Any]]:
        if n <= max_length and wanted(n):
            yield {}
    return space


def _bch_space(max_length: int, wanted: Callable[[int], bool]) -> Iterator[dict[str, Any]]:
    yield from _by_length((2**m - 1 for m in range(2, 13)), max_length, wanted,
                          lambda n: ({"n": n, "designed": e, "b": 1} for e in range(2, n + 1)))


def _cyclic_space(max_length: int, wanted: Callable[[int], bool]) -> Iterator[dict[str, Any]]:
    yield from _by_length(range(1, MAX_LENGTH + 1), max_length, wanted, lambda n: (
        {"n": n, "generator_polynomial": g.octal} for g in generator_polynomials(n)))


def _length_space(first: int) -> Space:
    def space(max_length: int, wanted: Callable[[int], bool]) -> Iterator[dict[str, Any]]:
        yield from _by_length(range(first, MAX_LENGTH + 1), max_length, wanted,
                              lambda n: ({"n": n},))
    return space


def _qr_space(max_length: int, wanted: Callable[[int], bool]) -> Iterator[dict[str, Any]]:
    yield from _by_length(range(7, MAX_LENGTH + 1), max_length, wanted,
                          lambda p: ({"p": p},) if is_prime(p) and p % 8 in (1, 7) else ())


def _anticode_parameters(k: int, d: int) -> tuple[int, int, int]:
    s, copies = _anticode_plan(k, d)
    return s * (2**k - 1) - sum(2**u - 1 for c in copies for u in c), k, d


def _anticode_space(max_length: int, wanted: Callable[[int], bool]
                    ) -> Iterator[dict[str, Any]]:
    """Every ``(k, d)`` with ``2 <= k <= 12`` whose anticode exists and fits, by k then d."""
    for k in range(2, 13):
        for d in range(1, max_length + 1):
            try:
                n = _anticode_parameters(k, d)[0]
            except ParameterError:
                continue
            if n <= max_length and wanted(n):
                yield {"k": k, "d": d}


def _rm_parameters(r: int, m: int) -> tuple[int, int, int]:
    return 2**m, sum(math.comb(m, i) for i in range(r + 1)), 2 ** (m - r)


def _bch_note(step: dict[str, Any]) -> str:
    return (f"designed distance δ = {step['designed']}; the lower bound is the BCH "
            "bound (d ≥ δ, or more when the roots run on), the upper bound the weight "
            "of the generator polynomial")


def _int(name: str, help_: str, **kw: Any) -> FamilyArgument:
    return FamilyArgument(name, "int", help_, **kw)


#: Family name -> :class:`Family`, in the order ``gf2codes build --list`` shows them.
FAMILIES: dict[str, Family] = {
    f.name: f
    for f in [
        Family("repetition", "[n, 1, n] repetition code", repetition,
               (_int("n", "length"),), "repetition 5", _length_space(1),
               lambda n: (n, 1, n)),
        Family("even-weight", "[n, n-1, 2] single parity check code", even_weight,
               (_int("n", "length, 2..4096"),), "even-weight 8", _length_space(2),
               lambda n: (n, n - 1, 2)),
        Family("hamming", "[2^m-1, 2^m-1-m, 3] Hamming code", hamming,
               (_int("m", "redundancy, 2..12"),), "hamming 3", _m_space(lambda m: 2**m - 1),
               lambda m: (2**m - 1, 2**m - 1 - m, 3)),
        Family("extended-hamming", "[2^m, 2^m-1-m, 4] extended Hamming code",
               extended_hamming, (_int("m", "2..12"),), "extended-hamming 7",
               _m_space(lambda m: 2**m), lambda m: (2**m, 2**m - 1 - m, 4)),
        Family("simplex", "[2^m-1, m, 2^(m-1)] simplex code (dual of Hamming)", simplex,
               (_int("m", "2..12"),), "simplex 4", _m_space(lambda m: 2**m - 1),
               lambda m: (2**m - 1, m, 2 ** (m - 1))),
        Family("reed-muller", "[2^m, sum_{i<=r} C(m,i), 2^(m-r)] Reed-Muller code RM(r, m)",
               reed_muller, (_int("r", "order, 0..m"), _int("m", "1..12")),
               "reed-muller 2 6", _reed_muller_space, _rm_parameters),
        Family("golay", "[23, 12, 7] binary Golay code", golay, (), "golay", _fixed(23),
               lambda: (23, 12, 7)),
        Family("extended-golay", "[24, 12, 8] extended binary Golay code", extended_golay,
               (), "extended-golay", _fixed(24), lambda: (24, 12, 8)),
        Family("bch", "primitive BCH code, length 2^m-1, designed distance δ (d ≥ δ)", bch,
               (_int("n", "length 2^m-1, 3..4095"),
                _int("designed", "designed distance δ, 2..n", option=True),
                _int("b", "first root exponent (1 = narrow sense), 0..n-1", option=True,
                     required=False, default=1)),
               "bch 63 --designed 11", _bch_space, describe=_bch_note),
        Family("qr", "[p, (p+1)/2] quadratic-residue code, p prime ≡ ±1 mod 8",
               quadratic_residue, (_int("p", "prime ≡ ±1 mod 8, 7..4096"),), "qr 47",
               _qr_space),
        Family("cyclic", "cyclic code from a generator polynomial dividing x^n - 1", cyclic,
               (_int("n", "length, 1..4096"),
                FamilyArgument("generator_polynomial", "polynomial",
                               "g(x): 'x^3+x+1', octal '0o13' or binary '0b1011'")),
               'cyclic 23 "x^11+x^9+x^7+x^6+x^5+x+1"', _cyclic_space),
        Family("double-circulant", "[2l, l] double circulant code [I | A], A circulant",
               double_circulant,
               (FamilyArgument("first_row", "bits", "first row of A, a 0/1 string"),),
               "double-circulant 01110100111"),
        Family("anticode", "[n, k, d] Solomon-Stiffler/Belov code meeting the Griesmer "
               "bound: simplex copies minus subspaces", anticode,
               (_int("k", "dimension, 2..12"), _int("d", "minimum distance", option=True)),
               "anticode 4 --d 6", _anticode_space, _anticode_parameters),
        Family("quasi-cyclic", "quasi-cyclic code: rows of l blocks of m, with block-wise "
               "cyclic shifts", quasi_cyclic,
               (_int("m", "circulant size"),
                FamilyArgument("rows", "bits-list",
                               "first rows, 0/1 strings of length l*m ('|' may separate "
                               "blocks)")),
               "quasi-cyclic 7 1000000|1101000"),
        Family("matrix", "a code given by its generator rows (0/1 strings)", from_rows,
               (FamilyArgument("generator", "bits-list", "generator rows, 0/1 strings"),),
               "matrix 1100 0011"),
    ]
}
