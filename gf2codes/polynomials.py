"""Polynomials over GF(2) and the small finite-field tools the cyclic families use.

Parsing and printing polynomials (``x^3+x+1``, octal ``0o13``, binary ``0b1011``; see
:mod:`gf2codes.families` for the notations), Berlekamp's deterministic factorisation and
the factorisation of ``x^n - 1``, exponent/logarithm tables of GF(2^m) from a table of
primitive polynomials, cyclotomic cosets and the order of 2 modulo ``n``. Polynomials
are ``galois.Poly`` objects (``galois`` is imported on first use) or integers with bit
``i`` the coefficient of ``x^i`` (:func:`berlekamp_factors`).

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977: ch. 3 and 4 (finite fields, primitive polynomials,
   cyclotomic cosets), ch. 7 (factors of x^n - 1).
.. [2] E. R. Berlekamp, "Factoring polynomials over finite fields", Bell System
   Technical Journal 46 (1967) 1853-1859.
"""

from __future__ import annotations

import math
import re
from collections.abc import Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any

import numpy as np
import numpy.typing as npt

from .exceptions import ParameterError, ParseError, check_int

if TYPE_CHECKING:
    from .code import Code


class _LazyModule:
    """``galois`` imported on first use: it takes most of a second, and most commands
    that import this module never build a polynomial."""

    def __init__(self, name: str) -> None:
        self._name = name

    def __getattr__(self, attr: str) -> Any:
        import importlib

        return getattr(importlib.import_module(self._name), attr)


if TYPE_CHECKING:  # pragma: no cover
    import galois
else:
    galois = _LazyModule("galois")


__all__ = [
    "galois", "parse_polynomial", "polynomial_to_octal", "berlekamp_factors",
    "factor_x_n_minus_1", "x_n_minus_1", "ascending", "PRIMITIVE_POLYNOMIALS", "FieldTables",
    "cyclotomic_coset", "order_of_two", "defining_set_of", "bch_bound",
    "MAX_ROOT_FIELD_DEGREE", "GeneratorPolynomial", "generator_polynomials", "is_prime",
    "gf2_mod", "gf2_gcd", "gf2_div",
]


def x_n_minus_1(n: int) -> galois.Poly:
    """The polynomial ``x^n - 1`` (``= x^n + 1``) over GF(2)."""
    return galois.Poly.Degrees([n, 0])


def ascending(poly: galois.Poly, n: int) -> np.ndarray:
    """Coefficients ``c_0 .. c_{n-1}`` of ``poly`` (degree below ``n``)."""
    out = np.zeros(n, dtype=np.uint8)
    c = np.asarray(poly.coeffs, dtype=np.uint8)[::-1]
    out[: c.size] = c
    return out


def is_prime(p: int) -> bool:
    """True when ``p`` is a prime (trial division)."""
    if p < 2:
        return False
    return all(p % q for q in range(2, math.isqrt(p) + 1))


def order_of_two(n: int) -> int:
    """Multiplicative order of 2 modulo odd ``n > 1``."""
    m, x = 1, 2 % n
    while x != 1:
        x = (2 * x) % n
        m += 1
    return m


def cyclotomic_coset(s: int, n: int) -> list[int]:
    """The 2-cyclotomic coset ``{s, 2s, 4s, ...} mod n``, in that order."""
    coset, x = [], s % n
    while x not in coset:
        coset.append(x)
        x = (2 * x) % n
    return coset


_TERM = re.compile(r"^(?:(1)|x(?:(?:\^|\*\*)(\d+))?)$")


def parse_polynomial(text: str | galois.Poly) -> galois.Poly:
    """A polynomial over GF(2) from a ``galois.Poly`` or text (see the module notes).

    Raises
    ------
    ParseError
        If the text is in none of the three notations, or a term appears twice.

    Examples
    --------
    >>> str(parse_polynomial("x^3 + x + 1"))
    'x^3 + x + 1'
    >>> str(parse_polynomial("0o13"))
    'x^3 + x + 1'
    >>> str(parse_polynomial("0b1011"))
    'x^3 + x + 1'
    """
    if isinstance(text, galois.Poly):
        if text.field is not galois.GF(2):
            raise ParseError(f"<polynomial>: the polynomial must be over GF(2), not {text.field}.")
        return text
    if not isinstance(text, str):
        raise ParseError(f"<polynomial>: expected a string or galois.Poly, not {text!r}.")
    s = re.sub(r"\s", "", text)
    low = s.lower()
    try:
        if low.startswith("0o"):
            return galois.Poly.Int(int(low[2:], 8))
        if low.startswith("0b"):
            return galois.Poly.Int(int(low[2:], 2))
    except ValueError:
        raise ParseError(
            f"<polynomial>: {text!r} is not a valid {'octal' if low[1] == 'o' else 'binary'} "
            "number."
        ) from None
    if not s:
        raise ParseError("<polynomial>: the polynomial is empty.")
    degrees: set[int] = set()
    for term in re.split(r"[+-]", s):
        m = _TERM.match(term)
        if not m:
            raise ParseError(
                f"<polynomial>: cannot read the term {term!r} of {text!r}; write terms like "
                "x^5, x or 1 joined by +, or use octal 0o... or binary 0b..."
            )
        deg = 0 if m.group(1) else int(m.group(2) or 1)
        if deg in degrees:
            raise ParseError(f"<polynomial>: the term of degree {deg} appears twice in {text!r}.")
        degrees.add(deg)
    return galois.Poly.Degrees(sorted(degrees, reverse=True))


def polynomial_to_octal(poly: galois.Poly) -> str:
    """The octal notation ``0o...`` of a GF(2) polynomial (highest degree first).

    >>> polynomial_to_octal(parse_polynomial("x^11+x^9+x^7+x^6+x^5+x+1"))
    '0o5343'
    """
    return "0o" + format(int(poly), "o")


#: The lexicographically first primitive polynomial of each degree m, as an integer
#: (bit i = coefficient of x^i); computed with ``galois.primitive_poly(2, m)`` and
#: checked against it by tests/test_families.py.
PRIMITIVE_POLYNOMIALS = {
    2: 7, 3: 11, 4: 19, 5: 37, 6: 67, 7: 131, 8: 285, 9: 529, 10: 1033, 11: 2053,
    12: 4179, 13: 8219, 14: 16427, 15: 32771, 16: 65581,
}


class FieldTables:
    """GF(2^m) by exponent and logarithm tables; ``alpha`` (the element 2) is primitive."""

    def __init__(self, m: int) -> None:
        q = 1 << m
        poly = PRIMITIVE_POLYNOMIALS[m]
        self.m, self.order = m, q - 1
        exp = np.zeros(2 * (q - 1), dtype=np.int64)
        log = np.zeros(q, dtype=np.int64)
        x = 1
        for i in range(q - 1):
            exp[i] = x
            log[x] = i
            x <<= 1
            if x & q:
                x ^= poly
        exp[q - 1:] = exp[: q - 1]
        self.exp, self.log = exp, log

    def mul(self, a: np.ndarray, b: np.ndarray) -> np.ndarray:
        out = self.exp[self.log[a] + self.log[b]]
        return np.where((a == 0) | (b == 0), 0, out)

    def power(self, e: npt.ArrayLike) -> np.ndarray:
        """``alpha^e`` for integer exponents."""
        return self.exp[np.asarray(e, dtype=np.int64) % self.order]

    def poly_from_roots(self, exponents: Sequence[int]) -> np.ndarray:
        """Ascending coefficients of ``prod (x - alpha^e)``."""
        c = np.array([1], dtype=np.int64)
        for e in exponents:
            root = int(self.power(e))
            shifted = np.concatenate([[0], c])
            scaled = np.concatenate([self.mul(c, np.full(c.size, root)), [0]])
            c = shifted ^ scaled
        return c

    def evaluate(self, ascending: np.ndarray, points: np.ndarray) -> np.ndarray:
        """Values of a GF(2) polynomial (ascending 0/1 coefficients) at field elements."""
        val = np.zeros(points.size, dtype=np.int64)
        for coeff in ascending[::-1]:
            val = self.mul(val, points) ^ int(coeff)
        return val


def gf2_mod(a: int, f: int) -> int:
    """``a mod f`` for polynomials over GF(2) held as integers (bit i = coefficient of x^i)."""
    df = f.bit_length()
    while a.bit_length() >= df:
        a ^= f << (a.bit_length() - df)
    return a


def gf2_gcd(a: int, b: int) -> int:
    """Greatest common divisor of two GF(2) polynomials held as integers."""
    while b:
        a, b = b, gf2_mod(a, b)
    return a


def berlekamp_factors(f: int) -> list[int]:
    """The irreducible factors of a squarefree polynomial ``f`` over GF(2), deterministically.

    Polynomials are integers (bit i = coefficient of x^i). Berlekamp's algorithm: the
    polynomials ``v`` with ``v^2 = v (mod f)`` form a GF(2)-space whose dimension is the
    number of irreducible factors, and gcds of ``f`` with ``v`` and ``v + 1`` separate
    every pair of factors.

    References
    ----------
    .. [1] E. R. Berlekamp, "Factoring polynomials over finite fields", Bell System
       Technical Journal 46 (1967) 1853-1859.

    >>> sorted(berlekamp_factors(0b10000001))  # x^7 + 1 = (x + 1)(x^3 + x + 1)(x^3 + x^2 + 1)
    [3, 11, 13]
    """
    from .linalg import null_space  # numpy and linalg only when factoring

    deg = f.bit_length() - 1
    if deg <= 1:
        return [f]
    # Row i of Q - I: the coefficients of x^(2i) mod f, minus x^i.
    M = np.zeros((deg, deg), dtype=np.uint8)
    cur = 1
    for i in range(deg):
        row = cur ^ (1 << i)
        M[i] = [(row >> j) & 1 for j in range(deg)]
        cur = gf2_mod(cur << 2, f)
    basis = null_space(np.ascontiguousarray(M.T))  # v with v (Q - I) = 0
    count = basis.shape[0]
    factors = [f]
    for vec in basis:
        if len(factors) == count:
            break
        v = sum(1 << j for j in np.flatnonzero(vec).tolist())
        if v <= 1:
            continue
        split = []
        for h in factors:
            a = gf2_gcd(h, gf2_mod(v, h))
            if a > 1 and a.bit_length() < h.bit_length():  # a proper factor
                split += [a, gf2_div(h, a)]
            else:
                split.append(h)
        factors = split
    return factors


def gf2_div(a: int, b: int) -> int:
    """Exact quotient ``a / b`` over GF(2)."""
    q, db = 0, b.bit_length()
    while a.bit_length() >= db:
        shift = a.bit_length() - db
        q ^= 1 << shift
        a ^= b << shift
    if a:  # pragma: no cover - callers divide by true factors only
        raise AssertionError("polynomial division left a remainder")
    return q


def factor_x_n_minus_1(n: int) -> tuple[list[galois.Poly], list[int]]:
    """Irreducible factors of ``x^n - 1`` over GF(2) with their multiplicities.

    ``x^n - 1 = (x^m - 1)^(2^a)`` for ``n = 2^a m`` with ``m`` odd, and ``x^m - 1`` is
    squarefree; it is factored by :func:`berlekamp_factors` (deterministic; a
    randomised factoring routine was seen to give up on some lengths, e.g. 75 and 117).
    """
    a = (n & -n).bit_length() - 1
    m = n >> a
    irreducible = sorted(berlekamp_factors((1 << m) | 1))
    return ([galois.Poly.Int(f) for f in irreducible], [1 << a] * len(irreducible))


#: Largest extension degree used to find the roots of a cyclic code for the BCH bound.
MAX_ROOT_FIELD_DEGREE = 16


def _longest_cyclic_run(mask: np.ndarray) -> int:
    """Longest run of ``True`` in a cyclic boolean sequence that is not all ``True``."""
    if not mask.any():
        return 0
    start = int(np.flatnonzero(~mask)[0])
    seq = np.concatenate([[False], np.roll(mask, -start), [False]]).astype(np.int8)
    d = np.diff(seq)
    return int((np.flatnonzero(d == -1) - np.flatnonzero(d == 1)).max())


def defining_set_of(n: int, g: galois.Poly) -> np.ndarray | None:
    """Mask of the exponents ``i`` with ``g(beta^i) = 0`` for a primitive n-th root beta.

    None when ``n`` is even (repeated roots) or the splitting field is too large.
    """
    if n % 2 == 0:
        return None
    if n == 1:
        return np.array([g.degree > 0])
    m = order_of_two(n)
    if m > MAX_ROOT_FIELD_DEGREE:
        return None
    field_ = FieldTables(m)
    beta_powers = field_.power(np.arange(n) * (field_.order // n))
    values = field_.evaluate(ascending(g, n), beta_powers)
    return values == 0


def bch_bound(n: int, defining_set: npt.ArrayLike) -> int:
    """The BCH bound of a cyclic code from its defining set.

    If ``g(beta^(b + i s)) = 0`` for ``i = 0 .. delta-2``, with ``beta`` a primitive
    n-th root of unity and ``gcd(s, n) = 1``, then ``d >= delta`` (MacWilliams &
    Sloane 1977, ch. 7 Theorem 8; Huffman & Pless 2003, Theorem 5.1.1). This returns
    the largest such ``delta`` over all starts ``b`` and strides ``s``.

    Parameters
    ----------
    n : int
        Length (odd).
    defining_set : array_like
        The exponents ``i`` (``0 <= i < n``) with ``g(beta^i) = 0``, or a boolean
        mask of length ``n``.

    Examples
    --------
    >>> bch_bound(7, [1, 2, 4])       # the [7, 4] Hamming code
    3
    """
    mask = np.zeros(n, dtype=bool)
    arr = np.asarray(defining_set)
    if arr.dtype == bool:
        mask[:] = arr
    else:
        mask[arr.astype(np.int64) % n] = True
    if mask.all():
        raise ParameterError("The defining set holds every exponent: the code is {0}.")
    best = 0
    idx = np.arange(n)
    for s in range(1, n if n > 1 else 2):
        if math.gcd(s, n) != 1:
            continue
        best = max(best, _longest_cyclic_run(mask[(idx * s) % n]))
    return best + 1


#: Longest length of :func:`generator_polynomials` (``gf2codes.families.MAX_LENGTH``).
_MAX_LENGTH = 4096


@dataclass(frozen=True)
class GeneratorPolynomial:
    """A divisor ``g`` of ``x^n - 1``: the generator polynomial of a cyclic code of length
    ``n`` and dimension ``k = n - deg g``."""

    polynomial: galois.Poly
    n: int
    k: int

    @property
    def octal(self) -> str:
        """``g`` in octal notation (see :func:`polynomial_to_octal`)."""
        return polynomial_to_octal(self.polynomial)

    def build(self) -> Code:
        """The cyclic code that ``g`` generates (see :func:`gf2codes.families.cyclic`)."""
        from .families import cyclic  # the construction lives with the other families

        return cyclic(self.n, self.polynomial)


def generator_polynomials(n: int, *, limit: int = 65536) -> list[GeneratorPolynomial]:
    """The generator polynomial of every nonzero cyclic code of length ``n``: every
    divisor of ``x^n - 1`` except itself.

    The divisors are the products of the irreducible factors of ``x^n - 1``
    (with multiplicity when ``n`` is even); ``g = x^n - 1`` (the zero code) is
    left out and ``g = 1`` (the whole space) included. Sorted by dimension
    (largest first), then by the integer value of the polynomial.

    Parameters
    ----------
    n : int
        Length, ``1 <= n <= 4096``.
    limit : int
        Refuse (``ParameterError``) when there would be more codes than this.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 7 section 5.

    >>> [(g.octal, g.k) for g in generator_polynomials(7)]
    [('0o1', 7), ('0o3', 6), ('0o13', 4), ('0o15', 4), ('0o27', 3), ('0o35', 3), ('0o177', 1)]
    """
    n = check_int("n", n, minimum=1, maximum=_MAX_LENGTH)
    factors, mults = factor_x_n_minus_1(n)
    count = math.prod(e + 1 for e in mults) - 1
    if count > limit:
        raise ParameterError(
            f"x^{n} - 1 has {count} proper divisors, more than the limit {limit}; "
            "raise 'limit' to list them all."
        )
    divisors = [galois.Poly.One()]
    for f, e in zip(factors, mults, strict=True):
        powers = [galois.Poly.One()]
        for _ in range(e):
            powers.append(powers[-1] * f)
        divisors = [d * q for d in divisors for q in powers]
    out = [GeneratorPolynomial(d, n, n - d.degree) for d in divisors if d.degree < n]
    out.sort(key=lambda g: (-g.k, int(g.polynomial)))
    return out
