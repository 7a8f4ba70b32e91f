"""What the bounds return: a value and the bound (or chain of rules) that gives it."""

from __future__ import annotations

from dataclasses import dataclass

__all__ = ["UpperBound", "LengthBound", "DimensionBound"]


@dataclass(frozen=True)
class UpperBound:
    """An upper bound ``d`` on the minimum distance, and the bound (or chain) ``by``."""

    d: int
    by: str


@dataclass(frozen=True)
class LengthBound:
    """A length ``n`` and the bound ``by`` that determines it."""

    n: int
    by: str


@dataclass(frozen=True)
class DimensionBound:
    """A dimension ``k`` and the bound ``by`` that determines it."""

    k: int
    by: str
