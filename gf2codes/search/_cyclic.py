"""Cyclic codes and shortened cyclic codes.

For a target ``[n, k, >= D]`` every cyclic code of length ``n`` with dimension at
least ``k`` is proposed (one per divisor of ``x^n - 1``, closest dimension first),
then the cyclic codes of lengths ``n + s`` (``s = 1, 2, ...``) with dimension at
least ``k + s``, shortened on their first ``s`` coordinates. Codes whose BCH bound
already reaches ``D`` come first within each length.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977, ch. 7 (cyclic codes) and ch. 7 section 6 (the BCH
   bound).
"""

from __future__ import annotations

from collections.abc import Iterator

import numpy as np

from .. import derive, families
from ..code import Code
from ..exceptions import ParameterError
from ._base import Strategy

__all__ = ["Cyclic"]

_MAX_EXTRA = 32  # longest excursion n + s beyond the target length
_MAX_PER_LENGTH = 400  # cyclic codes tried per length


class Cyclic(Strategy):
    """Cyclic and shortened cyclic codes (see the module docstring)."""

    name = "cyclic"
    summary = "cyclic codes (divisors of x^n - 1) and shortened cyclic codes"
    exhaustible = True

    def candidates(self, n: int, k: int, D: int,
                   rng: np.random.Generator) -> Iterator[Code | None]:
        for s in range(0, _MAX_EXTRA + 1):
            m = n + s
            if m > families.MAX_LENGTH:
                return
            try:
                codes = families.generator_polynomials(m, limit=20_000)
            except ParameterError:
                yield None
                continue
            fit = [c for c in codes if c.k >= k + s and c.k < m]
            fit.sort(key=lambda c: c.k)
            for c in fit[:_MAX_PER_LENGTH]:
                code = c.build()
                if code.d_lower is not None and code.d_upper is not None \
                        and code.d_upper < D:
                    yield None
                    continue
                if s:
                    try:
                        code = derive.shorten(code, list(range(s)))
                    except ParameterError:
                        yield None
                        continue
                yield code
