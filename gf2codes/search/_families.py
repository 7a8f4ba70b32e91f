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
from itertools import zip_longest

import numpy as np

from .. import derive, families
from .._util import memo
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


@memo(512)
def _build(family: str, kwargs: tuple) -> Code:
    return families.FAMILIES[family].build(**dict(kwargs))


#: The families the bases come from, with the longest base of each, in groups whose
#: members are taken in turn (Hamming, extended Hamming, simplex for each m, ...).
_BASE_FAMILIES: tuple[tuple[tuple[str, ...], int], ...] = (
    (("hamming", "extended-hamming", "simplex"), _MAX_BASE_LENGTH),
    (("reed-muller",), _MAX_BASE_LENGTH),
    (("golay",), _MAX_BASE_LENGTH),
    (("extended-golay",), _MAX_BASE_LENGTH),
    (("qr",), 127),
    (("bch",), 255),
)


def _wanted(family: str, kw: dict) -> bool:
    """The members used as bases: BCH codes of length >= 15 with odd designed distance
    up to (n + 1) / 2 (above it the dimensions are small and the codes no better)."""
    if family == "bch":
        return kw["n"] >= 15 and kw["designed"] % 2 == 1 and kw["designed"] <= kw["n"] // 2 + 1
    return True


def _space(name: str, max_length: int) -> Iterator[tuple[str, dict]]:
    for kw in families.FAMILIES[name].instances(max_length):
        if _wanted(name, kw):
            yield name, kw


def _members(names: tuple[str, ...], max_length: int) -> Iterator[tuple[str, dict]]:
    for group in zip_longest(*(_space(name, max_length) for name in names)):
        yield from (m for m in group if m is not None)


@memo(1)
def base_codes() -> tuple[_Base, ...]:
    """The base codes with their proved distance bounds (built once; the members whose
    parameters a formula gives are not built here).

    The members are those of the families' parameter spaces
    (:meth:`gf2codes.families.Family.instances`), one code per family, length and
    dimension (the first, by designed distance, for BCH).
    """
    out: list[_Base] = []
    seen: set[tuple[str, int, int]] = set()
    for names, max_length in _BASE_FAMILIES:
        for family, kw in _members(names, max_length):
            key = tuple(sorted(kw.items()))
            formula = families.FAMILIES[family].parameters
            if formula is not None:
                length, dim, delta = formula(**kw)
            else:
                try:
                    c = _build(family, key)
                except ParameterError:
                    continue
                length, dim, delta = c.n, c.k, c.d_lower or kw.get("designed", 1)
            if (family, length, dim) in seen:
                continue
            seen.add((family, length, dim))
            if 1 <= dim <= length <= _MAX_BASE_LENGTH and delta >= 1:
                out.append(_Base(length, dim, delta, family, key))
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
