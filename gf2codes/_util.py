"""Small helpers every long computation shares: seeds, deadlines, time-limit checks.

One copy of each, so that a seed is validated the same way everywhere and every time
limit means the same thing (seconds of wall time from the start of the call).
"""

from __future__ import annotations

import functools
import time
from collections.abc import Callable
from typing import TYPE_CHECKING, Any, TypeVar

from .exceptions import ParameterError, check_int

if TYPE_CHECKING:
    import numpy as np

    from .typing import SeedLike

__all__ = ["rng", "Clock", "deadline_after", "past", "memo", "clear_caches"]

F = TypeVar("F", bound=Callable[..., Any])
_CACHES: list[Any] = []


def memo(maxsize: int) -> Callable[[F], F]:
    """A bounded memo (``functools.lru_cache(maxsize)``) that :func:`clear_caches` empties.

    Every module-level memo of the package is declared with this, so no cache grows
    without limit and one call frees them all.

    >>> @memo(4)
    ... def square(x): return x * x
    >>> square(3), square.cache_info().currsize
    (9, 1)
    >>> clear_caches(); square.cache_info().currsize
    0
    """
    if not isinstance(maxsize, int) or maxsize < 1:
        raise ValueError("memo needs a positive maxsize")

    def wrap(func: F) -> F:
        cached = functools.lru_cache(maxsize=maxsize)(func)
        _CACHES.append(cached)
        return cached  # type: ignore[return-value]

    return wrap


def clear_caches() -> None:
    """Empty every memo declared with :func:`memo` (bounds tables, LP values in memory,
    family constructions...). The on-disk memo of proved values is not touched."""
    for cached in _CACHES:
        cached.cache_clear()


def rng(seed: SeedLike, name: str = "seed") -> np.random.Generator:
    """A numpy Generator from ``seed``: an int >= 0, a Generator (returned as it is), or
    None (fresh entropy). Negative or non-integer seeds raise :class:`ParameterError`.

    >>> int(rng(7).integers(100)) == int(rng(7).integers(100))
    True
    """
    import numpy as np

    if isinstance(seed, np.random.Generator):
        return seed
    if seed is not None:
        seed = check_int(name, seed, minimum=0)
    return np.random.default_rng(seed)


def deadline_after(seconds: float | None, name: str = "time_limit") -> float | None:
    """The ``time.perf_counter()`` value ``seconds`` from now (None: no limit).

    >>> deadline_after(None) is None
    True
    """
    if seconds is None:
        return None
    if not seconds > 0:  # also rejects NaN
        raise ParameterError(f"Argument {name!r} must be positive, not {seconds}.")
    return time.perf_counter() + float(seconds)


def past(deadline: float | None) -> bool:
    """True when ``deadline`` (from :func:`deadline_after`) has passed."""
    return deadline is not None and time.perf_counter() >= deadline


class Clock:
    """A time limit measured from construction: ``expired()``, ``left()``, ``elapsed()``.

    >>> c = Clock(None); c.expired(), c.left()
    (False, None)
    """

    __slots__ = ("start", "deadline")

    def __init__(self, time_limit: float | None, name: str = "time_limit") -> None:
        self.start = time.perf_counter()
        self.deadline = deadline_after(time_limit, name)
        if self.deadline is not None:  # measured from the same instant as start
            self.deadline = self.start + float(time_limit)  # type: ignore[arg-type]

    def expired(self) -> bool:
        return past(self.deadline)

    def left(self) -> float | None:
        """Seconds left (never negative), or None without a limit."""
        return None if self.deadline is None else max(0.0, self.deadline - time.perf_counter())

    def elapsed(self) -> float:
        return time.perf_counter() - self.start
