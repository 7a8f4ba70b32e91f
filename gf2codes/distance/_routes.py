"""The choice of route: each exact route's estimated time, and the cheapest one in words."""

from __future__ import annotations

from typing import cast

from ..code import Code
from ..typing import DistanceMethod
from ._bz import RATE_BZ, estimate_work
from ._dual import dual_columns_seconds
from ._gray import gray_seconds
from ._symmetry import Symmetry

__all__ = ["ROUTE_TITLES", "route_estimates", "choose_engine", "human_seconds"]

#: Each exact route in words (the reason of an ``auto`` choice names the others).
ROUTE_TITLES: dict[DistanceMethod, str] = {
    "gray": "Gray-code enumeration of all 2^k codewords",
    "brouwer-zimmermann": "Brouwer–Zimmermann on information sets",
    "dual-columns": "fewest parity-check columns summing to zero",
}


def route_estimates(code: Code, upper_guess: int, target: int | None = None, *,
                    symmetry: Symmetry | None = None) -> dict[str, float]:
    """Estimated seconds (one core) of each exact route to prove d (or settle
    ``d >= target``) when a codeword of weight ``upper_guess`` is known.

    Routes that do not apply (the dual-side route needs ``n - k <= 64``) are absent.
    ``symmetry`` (checked automorphisms) lets the Brouwer–Zimmermann estimate use the
    cheapest plan the group allows, and the dual-side one its search through one column
    per orbit.
    """
    goal = upper_guess if target is None else min(upper_guess, target)
    out: dict[str, float] = {}
    out["gray"] = gray_seconds(code.k)
    if code.k > 22:
        out["brouwer-zimmermann"] = estimate_work(code, upper_guess, target=target,
                                                      symmetry=symmetry) / RATE_BZ
    if code.n - code.k <= 64:
        div = code.weight_divisor
        out["dual-columns"] = dual_columns_seconds(code.n, code.k, goal, divisor=div,
                                                   start_lower=div, symmetry=symmetry)
    return out


def choose_engine(code: Code, upper_guess: int, target: int | None, *,
                  symmetry: Symmetry | None = None
                  ) -> tuple[DistanceMethod, dict[str, float], str]:
    """The cheapest route by estimated time, all estimates, and the reason in words."""
    est = route_estimates(code, upper_guess, target, symmetry=symmetry)
    if code.k <= 22:  # microseconds: not worth a parity-check matrix (the search hot path)
        return "gray", est, f"2^{code.k} codewords take about {human_seconds(est['gray'])}"
    engine = cast(DistanceMethod, min(est, key=lambda e: (est[e], e != "gray")))
    others = ", ".join(f"{ROUTE_TITLES[cast(DistanceMethod, e)]} ~{_fmt_seconds(est[e])}"
                       for e in sorted(est, key=est.__getitem__) if e != engine)
    return engine, est, f"cheapest estimate, ~{_fmt_seconds(est[engine])} (against {others})"


def _fmt_seconds(s: float) -> str:
    if s < 1e-3:
        return "<1 ms"
    if s < 120:
        return f"{s:.2g} s"
    return human_seconds(s)


def human_seconds(s: float) -> str:
    """A duration in the largest sensible unit, e.g. ``"66 days"``."""
    if s < 120:
        return f"{s:.0f} s"
    if s < 7200:
        return f"{s / 60:.0f} min"
    if s < 172800:
        return f"{s / 3600:.0f} h"
    if s < 3.15e8:
        return f"{s / 86400:.0f} days"
    return f"{s / 3.15e7:.2g} years"
