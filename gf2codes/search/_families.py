"""Derivation from the named families: shorten, puncture and extend known codes.

Every base code ``[N, K]`` of the families (Hamming, extended Hamming, simplex,
Reed-Muller, Golay, BCH, quadratic residue, repetition, even weight) carries a proved
lower bound ``delta`` on its distance (its designed distance). For a target
``[n, k, >= D]`` it is turned into a code of length ``n``: extended first when
``delta`` is odd and that helps, then punctured on ``p <= delta - D`` coordinates
(distance ``>= delta - p``) and shortened on ``s`` (distance kept, dimension down by
at most ``s``), with ``p + s`` the excess length and ``K - s >= k``. Parameters are
checked before anything is built; candidates come out with the smallest excess
first.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977, ch. 1 section 9 (puncturing, extending, shortening).
"""

from __future__ import annotations

from collections.abc import Iterator
from dataclasses import dataclass
from functools import lru_cache
from math import comb

import numpy as np

from .. import derive, families
from ..code import Code
from ..exceptions import ParameterError
from ._base import Strategy

__all__ = ["FamilyDerivation", "base_codes", "derivation_plans"]

_MAX_BASE_LENGTH = 1024
_MAX_PLANS = 64


@dataclass(frozen=True)
class _Base:
    n: int
    k: int
    delta: int
    family: str
    kwargs: tuple

    def build(self) -> Code:
        return _build(self.family, self.kwargs)


@lru_cache(maxsize=512)
def _build(family: str, kwargs: tuple) -> Code:
    return families.FAMILIES[family].build(**dict(kwargs))


@lru_cache(maxsize=1)
def base_codes() -> tuple[_Base, ...]:
    """The base codes with their proved distance bounds (built once, lazily for BCH)."""
    out: list[_Base] = []

    def add(family: str, length: int, dim: int, delta: int, **kw) -> None:
        if 1 <= dim <= length <= _MAX_BASE_LENGTH and delta >= 1:
            out.append(_Base(length, dim, delta, family, tuple(sorted(kw.items()))))

    for m in range(2, 11):
        add("hamming", 2**m - 1, 2**m - 1 - m, 3, m=m)
        add("extended-hamming", 2**m, 2**m - 1 - m, 4, m=m)
        add("simplex", 2**m - 1, m, 2 ** (m - 1), m=m)
    for m in range(1, 11):
        for r in range(0, m + 1):
            add("reed-muller", 2**m, sum(comb(m, i) for i in range(r + 1)), 2 ** (m - r),
                r=r, m=m)
    add("golay", 23, 12, 7)
    add("extended-golay", 24, 12, 8)
    for p in (7, 17, 23, 31, 41, 47, 71, 73, 79, 89, 97, 103, 113, 127):
        try:
            c = _build("qr", (("p", p),))
        except ParameterError:
            continue
        add("qr", c.n, c.k, c.d_lower or 1, p=p)
    for m in range(4, 9):
        N = 2**m - 1
        seen = set()
        for designed in range(3, N // 2 + 2, 2):
            try:
                c = _build("bch", (("b", 1), ("designed", designed), ("n", N)))
            except ParameterError:
                continue
            if c.k in seen:
                continue
            seen.add(c.k)
            add("bch", N, c.k, c.d_lower or designed, n=N, designed=designed, b=1)
    return tuple(out)


@dataclass(frozen=True)
class _Plan:
    base: _Base
    extend: bool
    puncture: int
    shorten: int


def derivation_plans(n: int, k: int, D: int) -> list[_Plan]:
    """Ways of reaching ``[n, >= k, >= D]`` from a base code, least excess first."""
    plans = []
    for b in base_codes():
        options = [(False, b.n, b.delta)]
        if b.delta % 2 == 1:
            options.append((True, b.n + 1, b.delta + 1))
        for ext, N, delta in options:
            excess = N - n
            if excess < 0 or delta < D:
                continue
            p_lo = max(0, excess - (b.k - k))
            p_hi = min(excess, delta - D)
            if p_lo > p_hi or N - p_lo <= 0:
                continue
            plans.append((excess, ext, _Plan(b, ext, p_lo, excess - p_lo)))
    plans.sort(key=lambda t: (t[0], t[1]))
    return [p for _, _, p in plans[:_MAX_PLANS]]


def _apply(plan: _Plan) -> Code:
    code = plan.base.build()
    if plan.extend:
        code = derive.extend(code)
    if plan.puncture:
        code = derive.puncture(code, list(range(code.n - plan.puncture, code.n)))
    if plan.shorten:
        # shorten on information-set coordinates so that k drops by exactly s
        pivots = _pivots(code)
        coords = pivots[: plan.shorten] if len(pivots) >= plan.shorten \
            else list(range(plan.shorten))
        code = derive.shorten(code, sorted(coords))
    return code


def _pivots(code: Code) -> list[int]:
    R = code.rref_generator
    return [int(np.flatnonzero(row)[0]) for row in R]


class FamilyDerivation(Strategy):
    """Shortened / punctured / extended family codes (see the module docstring)."""

    name = "families"
    summary = "named families (Hamming, Reed-Muller, Golay, BCH, QR) shortened/punctured/extended"
    exhaustible = True
    warm = True

    def candidates(self, n: int, k: int, D: int,
                   rng: np.random.Generator) -> Iterator[Code | None]:
        for plan in derivation_plans(n, k, D):
            try:
                code = _apply(plan)
            except ParameterError:
                yield None
                continue
            if code.n == n and code.k >= k:
                yield code
            else:
                yield None
