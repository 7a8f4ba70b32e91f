"""The channel report: what ``gf2codes channel`` states about one code, as an object.

:func:`channel_report` gathers, for one code and a list of crossover probabilities,
the exact figures of :func:`~gf2codes.decoding.bsc_performance` (as far as their
inputs are affordable: coset leaders for ``n - k <= 26``, the weight distribution
when it can be enumerated, d when it can be proved) and, on request, Monte Carlo
estimates by :func:`~gf2codes.decoding.simulate_bsc`. :meth:`ChannelReport.to_dict`
is exactly one entry of the ``codes`` list that ``gf2codes channel --json`` prints.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1, sections 3-5.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import dataclass
from typing import Any

import numpy as np

from ..code import Code
from ..distance import minimum_distance
from ..exceptions import TooExpensiveError
from ..weights import (
    DEFAULT_MAX_ENUMERATION,
    minimum_weight_from_distribution,
    weight_distribution,
    weight_enumeration_cost,
)
from .leaders import DEFAULT_MAX_REDUNDANCY, CosetLeaders, coset_leader_distribution
from .probability import BSCPoint, Probability, bsc_points
from .simulation import SimulationResult, simulate_bsc

__all__ = ["ChannelPoint", "ChannelReport", "channel_report"]

#: ``progress(done, total, info)``; ``info["stage"]`` names the step ("counting weights",
#: "simulating p = 0.01", ...), each announced by a call ``progress(0, 0, {"stage": ...})``.
Progress = Callable[[int, int, dict], None]


@dataclass(frozen=True)
class ChannelPoint:
    """The figures at one crossover probability ``p`` (None: not computed).

    ``simulation`` holds the Monte Carlo estimates when asked for, drawn with
    ``numpy.random.default_rng(simulation_seed)``.
    """

    p: float
    block_error: float | None
    bounded_distance_failure: float | None
    undetected_error: float | None
    simulation: SimulationResult | None = None
    simulation_seed: tuple[int, ...] | None = None

    def to_dict(self) -> dict[str, Any]:
        """The JSON form of ``gf2codes channel --json`` (key ``simulation`` when simulated)."""
        out: dict[str, Any] = {"p": self.p, "block_error": self.block_error,
                               "bounded_distance_failure": self.bounded_distance_failure,
                               "undetected_error": self.undetected_error}
        if self.simulation is not None:
            sim = self.simulation.as_dict()
            sim["seed"] = None if self.simulation_seed is None else list(self.simulation_seed)
            out["simulation"] = sim
        return out


@dataclass(frozen=True)
class ChannelReport:
    """What ``gf2codes channel`` reports about one code on a binary symmetric channel.

    Attributes
    ----------
    source, name : str or None
        The file read, and the code's name.
    n, k : int
    d, t : int or None
        The proved minimum distance and the bounded-distance radius ``(d - 1) // 2``.
    leaders : CosetLeaders or None
        None when ``n - k`` is too large for the exact figures.
    weight_distribution : tuple of int or None
    points : tuple of ChannelPoint
    notes : tuple of str
    """

    source: str | None
    name: str | None
    n: int
    k: int
    d: int | None
    t: int | None
    leaders: CosetLeaders | None
    weight_distribution: tuple[int, ...] | None
    points: tuple[ChannelPoint, ...]
    notes: tuple[str, ...]

    @property
    def simulations(self) -> list[SimulationResult]:
        """The Monte Carlo results, one per ``p`` (empty without simulation)."""
        return [pt.simulation for pt in self.points if pt.simulation is not None]

    def exact_at(self, p: Sequence[float]) -> list[ChannelPoint]:
        """The exact figures at other crossover probabilities (for curves), from the
        same coset leaders, weight distribution and radius."""
        return [_point(x) for x in bsc_points(self.n, p, leaders=self.leaders,
                                              distribution=self.weight_distribution,
                                              t=self.t)]

    def to_dict(self) -> dict[str, Any]:
        """One entry of ``codes`` in ``gf2codes channel --json``: same keys, order, values."""
        leaders = self.leaders
        return {
            "source": self.source, "name": self.name, "n": self.n, "k": self.k,
            "d": self.d, "t": self.t,
            "coset_leaders": None if leaders is None else list(leaders.counts),
            "covering_radius": None if leaders is None else leaders.covering_radius,
            "weight_distribution": (None if self.weight_distribution is None
                                    else list(self.weight_distribution)),
            "points": [pt.to_dict() for pt in self.points],
            "notes": list(self.notes),
        }


def channel_report(code: Code, p: Sequence[float], *, simulate: int | None = None,
                   seed: int = 0, confidence: float = 0.99, index: int = 0,
                   source: str | None = None, progress: Progress | None = None
                   ) -> ChannelReport:
    """Everything ``gf2codes channel`` reports for one code.

    Parameters
    ----------
    code : Code
    p : sequence of float
        Crossover probabilities (validated by the caller with
        :func:`~gf2codes.decoding.check_probability`).
    simulate : int, optional
        Also estimate by Monte Carlo with this many codewords per ``p``. The ``j``-th
        ``p`` of the ``index``-th code uses ``numpy.random.default_rng([seed, index,
        j])``, so each figure is reproducible on its own.
    confidence : float
        Of the simulation intervals.
    source : str, optional
        Where the code was read from (reported, and named in errors).
    progress : callable, optional
        ``progress(done, total, info)``; ``info["stage"]`` names the step.

    Raises
    ------
    TooExpensiveError
        If the exact method does not apply (``n - k > 26``) and ``simulate`` is None.

    Examples
    --------
    >>> from gf2codes.families import hamming
    >>> rep = channel_report(hamming(3), [0.0])
    >>> rep.d, rep.leaders.counts, rep.points[0].block_error
    (3, (1, 7), 0.0)
    """
    n, k = code.n, code.k
    r = n - k
    exact = r <= DEFAULT_MAX_REDUNDANCY
    if not exact and not simulate:
        where = f"{source}: " if source else ""
        raise TooExpensiveError(
            f"{where}the exact block-error probability of this [{n},{k}] code needs the coset "
            f"leaders of all 2^{r} = {float(2 ** r):.3g} syndromes (n - k = {r} > "
            f"{DEFAULT_MAX_REDUNDANCY}); use --simulate N for a Monte Carlo estimate.",
            work=float(2 ** r))
    notes: list[str] = []
    distribution = _distribution(code, progress, notes)
    d = _distance(code, distribution, notes)
    t = None if d is None else (d - 1) // 2
    leaders = coset_leader_distribution(code) if exact else None
    if not exact:
        notes.append(f"n - k = {r} > {DEFAULT_MAX_REDUNDANCY}: no exact block-error figures, "
                     "simulation only")
    points = []
    for j, x in enumerate(bsc_points(n, p, leaders=leaders, distribution=distribution, t=t)):
        pt = _point(x)
        if simulate:
            triple = (seed, index, j)
            res = simulate_bsc(code, float(x.p), simulate, seed=np.random.default_rng(triple),
                               d=d, confidence=confidence,
                               progress=_stage(progress, f"simulating p = {x.p:g}"))
            pt = ChannelPoint(pt.p, pt.block_error, pt.bounded_distance_failure,
                              pt.undetected_error, res, triple)
        points.append(pt)
    return ChannelReport(source=source, name=code.name, n=n, k=k, d=d, t=t, leaders=leaders,
                         weight_distribution=None if distribution is None
                         else tuple(distribution),
                         points=tuple(points), notes=tuple(notes))


def _point(x: BSCPoint) -> ChannelPoint:
    """A point of float figures (the ``p`` given are floats, so are the sums)."""

    def real(v: Probability | None) -> float | None:
        return None if v is None else float(v)

    return ChannelPoint(float(x.p), real(x.block_error), real(x.bounded_distance_failure),
                        real(x.undetected_error))


def _stage(progress: Progress | None, stage: str) -> Progress | None:
    """``progress`` with ``info["stage"] = stage`` added; announces the stage once."""
    if progress is None:
        return None
    progress(0, 0, {"stage": stage})

    def call(done: int, total: int, info: dict) -> None:
        progress(done, total, {**info, "stage": stage})

    return call


def _distribution(code: Code, progress: Progress | None, notes: list[str]
                  ) -> list[int] | None:
    """The weight distribution when it can be enumerated, else None and a note."""
    if weight_enumeration_cost(code) <= DEFAULT_MAX_ENUMERATION:
        return weight_distribution(code, progress=_stage(progress, "counting weights"))
    notes.append(f"weight distribution not computed (2^{min(code.k, code.n - code.k)} "
                 "codewords): the undetected-error figures are simulated only")
    return None


def _distance(code: Code, distribution: list[int] | None, notes: list[str]) -> int | None:
    """d: from the weight distribution, else proved (None, with a note, when too costly)."""
    if distribution is not None:
        return minimum_weight_from_distribution(distribution)
    try:
        res = minimum_distance(code)
    except TooExpensiveError:
        notes.append("d not proved (too expensive): the bounded-distance figures are omitted")
        return None
    return res.d if res.exact else None
