"""What every route of the proof engine shares: the result, the clock, the best word.

:class:`DistanceResult` is what the public functions return; :class:`ProofClock` (a
time limit with progress bookkeeping), :class:`Best` (the lightest codeword found so
far) and :func:`settled` (may an enumeration stop now?) are shared by the routes.
"""

from __future__ import annotations

import time
from collections.abc import Callable
from dataclasses import dataclass, field
from typing import Literal

import numpy as np

from .. import linalg
from .._util import Clock
from ..typing import StopReason

__all__ = ["DistanceResult", "ProgressCallback", "ProofClock", "Best", "Settled",
           "settled", "stop_reason", "round_up", "unpack_word", "INF", "CHUNK"]

#: ``progress(done, total, info)``: codewords examined so far, the current estimate
#: of the total, and a dict with the current ``lower`` and ``upper`` bounds.
ProgressCallback = Callable[[int, int, dict], None]

#: No codeword found yet (a weight above every real one).
INF = 1 << 62
#: Codewords per kernel call between checks of the clock.
CHUNK = 1 << 24


@dataclass(frozen=True)
class DistanceResult:
    """What is known about the minimum distance ``d`` of a code.

    Attributes
    ----------
    lower : int
        A proved lower bound: no nonzero codeword is lighter.
    upper : int
        The weight of :attr:`witness`, a codeword that was found; so ``d <= upper``.
    witness : numpy.ndarray
        A nonzero codeword (``uint8``) of weight ``upper``.
    exact : bool
        True only when ``lower == upper``, that is, d is proved.
    method : str
        The route: ``"gray"``, ``"brouwer-zimmermann"``, ``"dual-columns"`` (fewest
        parity-check columns summing to zero) or ``"isd"`` (upper bound only), or a
        ``+``-joined combination.
    codewords : int
        Codewords examined.
    seconds : float
        Wall-clock time spent.
    stopped : str or None
        Why the computation ended before proving d: ``"time limit"``,
        ``"interrupted"``, ``"target met"`` (d >= target proved), ``"below target"``
        (a codeword lighter than the target was found), ``"upper bound only"``.
    reason : str
        Why this route was taken (for ``"auto"``: the estimates compared).
    estimates : dict
        Estimated seconds (one core) of each route that was considered.
    information_sets : tuple of dict
        Brouwer–Zimmermann only: per information set its ``rank``, ``levels_done``,
        the lower-bound ``contribution`` it proved on its new positions (for the
        ``"zimmermann"`` argument their sum, rounded up to the weight divisor, is the
        proved lower bound) and the ``argument``; with an automorphism group also the
        ``bound`` the set proves alone with the group and the ``images`` credited.
    argument : str
        Brouwer–Zimmermann: what the lower bound rests on — ``"zimmermann"``
        (disjoint information sets), ``"orbit-average"`` (the images of one
        information set under an automorphism group), ``"orbit-average+zimmermann"``
        (the larger of the two) or ``"cyclic-window"`` (cyclic shifts of a window of
        ``k`` consecutive positions started at a one); see
        :func:`gf2codes.distance._bz.make_plans`. For the dual-side route
        ``"orbit-columns"`` when it searched only the codewords through one column per
        orbit of an automorphism group (:func:`gf2codes.distance._dual.dual_search`),
        else empty.
    symmetry : dict or None
        The automorphism group the bound used (``kind``, number of ``generators``,
        ``orbits``, ``description``), or None.
    """

    lower: int
    upper: int
    witness: np.ndarray = field(repr=False)
    exact: bool
    method: str
    codewords: int = 0
    seconds: float = 0.0
    stopped: StopReason | None = None
    reason: str = ""
    estimates: dict[str, float] = field(default_factory=dict, compare=False)
    information_sets: tuple[dict, ...] = field(default=(), compare=False)
    argument: str = field(default="", compare=False)
    symmetry: dict | None = field(default=None, compare=False)

    @property
    def d(self) -> int | None:
        """The minimum distance when proved, else ``None``."""
        return self.upper if self.exact else None

    def at_least(self, target: int) -> bool | None:
        """Whether ``d >= target`` is proved (True), refuted (False), or open (None)."""
        if self.lower >= target:
            return True
        if self.upper < target:
            return False
        return None

    def describe(self) -> str:
        """A one-line statement of what is proved, safe to read aloud in a review."""
        if self.exact:
            return f"d = {self.upper} (proved)"
        return (f"{self.lower} <= d <= {self.upper} (not proved: only the interval is; "
                f"{self.upper} is the weight of a codeword found)")


def round_up(x: int, divisor: int) -> int:
    """The least multiple of ``divisor`` that is at least ``x``."""
    return -(-x // divisor) * divisor


def unpack_word(packed: np.ndarray, n: int) -> np.ndarray:
    """One packed word as ``n`` bits (``uint8``)."""
    return linalg.unpack(packed.reshape(1, -1), n)[0]


class ProofClock(Clock):
    """A time limit (:class:`gf2codes._util.Clock`) with the progress bookkeeping the
    routes share: codewords ``done``, the estimated ``total``, and the callback, called
    at most ten times a second."""

    __slots__ = ("progress", "done", "total", "_last_report")

    def __init__(self, time_limit: float | None, progress: ProgressCallback | None) -> None:
        super().__init__(time_limit)
        self.progress = progress
        self.done = 0
        self.total = 1
        self._last_report = self.start

    def tick(self, visited: int, lower: int, upper: int) -> None:
        """Count ``visited`` codewords and report progress when it is time to."""
        self.done += int(visited)
        if self.progress is not None:
            now = time.perf_counter()
            if now - self._last_report >= 0.1:
                self._last_report = now
                self.progress(self.done, max(self.total, self.done),
                              {"lower": lower, "upper": upper})


class Best:
    """The lightest codeword found so far."""

    def __init__(self, n: int) -> None:
        self.n = n
        self.weight = INF
        self.word: np.ndarray | None = None  # packed

    def offer(self, weight: int, packed_word: np.ndarray) -> None:
        """Keep ``packed_word`` when it is lighter than the best so far."""
        if weight < self.weight:
            self.weight = int(weight)
            self.word = np.array(packed_word, dtype=np.uint64)

    def witness(self) -> np.ndarray:
        """The best word, unpacked."""
        assert self.word is not None
        return unpack_word(self.word, self.n)


#: Why an enumeration may stop: d is proved (``exact``), or the target question is
#: settled either way.
Settled = Literal["exact", "target met", "below target"]


def settled(best_weight: int, lower: int, target: int | None) -> Settled | None:
    """Why an enumeration may stop now (the proved lower bound and the lightest word
    found settle the question), or None."""
    if best_weight <= lower:
        return "exact"
    if target is not None and lower >= target:
        return "target met"
    if target is not None and best_weight < target:
        return "below target"
    return None


def stop_reason(reason: Settled | StopReason | None) -> StopReason | None:
    """The result's ``stopped`` value: None when d is proved."""
    if reason is None or reason == "exact":
        return None
    return reason
