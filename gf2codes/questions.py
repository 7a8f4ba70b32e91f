"""The three questions about binary linear codes with two of ``n``, ``k``, ``d`` given.

* :class:`ShortestLength` — the least ``n`` of an ``[n, k, >= d]`` code, ``k`` and ``d``
  given;
* :class:`GreatestDistance` — the greatest ``d`` of an ``[n, k]`` code, ``n`` and ``k``
  given;
* :class:`GreatestDimension` — the greatest ``k`` of a code of length ``n`` and
  distance at least ``d``, ``n`` and ``d`` given.

Each question knows its two given values (checked when it is made), the proved limit
on the answer and the rule that gives it (:meth:`SearchQuestion.bound`), the
``[n, k, d]`` target for a value of the optimised quantity, which of two values is
better, and how to state a result. :func:`question` turns the two values a user gave
into the question, so that the search, the bounds and the catalog read the same
choice the same way.

This module sits above :mod:`gf2codes.bounds` (imported only inside
:meth:`SearchQuestion.bound`, so that making a question costs no NumPy) and below
:mod:`gf2codes.search` and :mod:`gf2codes.catalog`.

>>> q = question(k=4, d=3)
>>> q.mode, q.given, q.target(7)
('length', (None, 4, 3), (7, 4, 3))
>>> q.better(7, 8), q.better(8, 7)
(True, False)
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any, ClassVar, NamedTuple

from .exceptions import ParameterError, check_int
from .typing import Question

__all__ = [
    "SearchQuestion",
    "ShortestLength",
    "GreatestDistance",
    "GreatestDimension",
    "Limit",
    "QUESTION_TYPES",
    "question",
    "question_type",
]


class Limit(NamedTuple):
    """The proved limit on the optimised quantity and the rule (bound) that gives it."""

    value: int
    by: str


class SearchQuestion:
    """One of the three questions (see the module docstring); made by :func:`question`
    or by a subclass with its two given values.

    Attributes
    ----------
    mode : {"length", "distance", "dimension"}
        The question's name (:data:`gf2codes.typing.Question`).
    quantity : {"n", "d", "k"}
        The quantity optimised.
    flag_key, bound_key : str
        The keys of the optimality flag and of the bound in JSON results
        (``proven_shortest`` / ``n_lower_bound`` for the length, ``proven_optimal`` and
        ``d_upper_bound`` / ``k_upper_bound`` otherwise).
    smaller_is_better : bool
        True for the length (the least is sought), false for the distance and dimension.
    """

    mode: ClassVar[Question]
    quantity: ClassVar[str]
    flag_key: ClassVar[str]
    bound_key: ClassVar[str]
    smaller_is_better: ClassVar[bool] = False
    #: The names of the two given values, in the order n, k, d.
    given_names: ClassVar[tuple[str, str]]

    @property
    def given(self) -> tuple[int | None, int | None, int | None]:
        """``(n, k, d)`` with ``None`` for the optimised quantity."""
        values = self.fixed
        return values.get("n"), values.get("k"), values.get("d")

    @property
    def fixed(self) -> dict[str, int]:
        """The two given values by name, in the order n, k, d."""
        return {name: getattr(self, name) for name in self.given_names}

    def target(self, value: int) -> tuple[int, int, int]:
        """The ``(n, k, d)`` of a code whose optimised quantity is ``value``."""
        raise NotImplementedError

    def bound(self) -> Limit:
        """The proved limit on the optimised quantity (least length, greatest distance
        or dimension the bounds of :mod:`gf2codes.bounds` allow) and its rule."""
        raise NotImplementedError

    def trivial(self) -> tuple[int, int, int]:
        """``(n, k, D)`` of the code that always exists: ``k`` disjoint repetition blocks
        covering ``n`` coordinates, of distance at least ``D = floor(n / k)``."""
        raise NotImplementedError

    def value_of(self, n: int, k: int, d: int) -> int:
        """The optimised quantity of an ``[n, k, d]`` code."""
        return {"n": n, "k": k, "d": d}[self.quantity]

    def better(self, a: int, b: int | None) -> bool:
        """True when the value ``a`` is strictly better than ``b`` (any value beats None)."""
        return b is None or (a < b if self.smaller_is_better else a > b)

    def step_better(self, value: int) -> int:
        """The value one step better than ``value``."""
        return value - 1 if self.smaller_is_better else value + 1

    def step_worse(self, value: int) -> int:
        """The value one step worse than ``value``."""
        return value + 1 if self.smaller_is_better else value - 1

    def beyond(self, value: int, bound: int) -> bool:
        """True when ``value`` is better than the proved limit ``bound`` allows."""
        return value < bound if self.smaller_is_better else value > bound

    def statement(self, n: int, k: int, d: int | None, d_lower: int, *, optimal: bool,
                  bound: int, bound_by: str) -> str:
        """One plain sentence on what is proved about the optimality of an ``[n, k, d]``
        code found (``d`` None when only ``d >= d_lower`` is proved)."""
        raise NotImplementedError

    @classmethod
    def from_values(cls, values: Mapping[str, object]) -> SearchQuestion:
        """The question of this class with its two given values taken from ``values``
        (checked; other keys are ignored)."""
        make: Any = cls  # each question has its own two arguments
        made: SearchQuestion = make(**{name: values[name] for name in cls.given_names})
        return made

    def __repr__(self) -> str:
        args = ", ".join(f"{name}={value}" for name, value in self.fixed.items())
        return f"{type(self).__name__}({args})"


def _shown(n: int, k: int, d: int | None, d_lower: int) -> str:
    return f"[{n},{k},{d}]" if d is not None else f"[{n},{k},>={d_lower}]"


@dataclass(frozen=True, repr=False)
class ShortestLength(SearchQuestion):
    """The least ``n`` of a binary linear ``[n, k, >= d]`` code (``k, d >= 1``).

    >>> q = ShortestLength(4, 3)
    >>> q.bound()
    Limit(value=7, by='griesmer')
    >>> q.statement(7, 4, 3, 3, optimal=True, bound=7, bound_by="griesmer")
    '[7,4,3] is proved shortest: no [6,4,3] code exists (griesmer).'
    """

    k: int
    d: int

    mode: ClassVar[Question] = "length"
    quantity: ClassVar[str] = "n"
    flag_key: ClassVar[str] = "proven_shortest"
    bound_key: ClassVar[str] = "n_lower_bound"
    smaller_is_better: ClassVar[bool] = True
    given_names: ClassVar[tuple[str, str]] = ("k", "d")

    def __post_init__(self) -> None:
        object.__setattr__(self, "k", check_int("k", self.k, minimum=1))
        object.__setattr__(self, "d", check_int("d", self.d, minimum=1))

    def target(self, value: int) -> tuple[int, int, int]:
        return value, self.k, self.d

    def bound(self) -> Limit:
        from . import bounds

        lb = bounds.least_length(self.k, self.d)
        return Limit(lb.n, lb.by)

    def trivial(self) -> tuple[int, int, int]:
        return self.k * self.d, self.k, self.d

    def statement(self, n: int, k: int, d: int | None, d_lower: int, *, optimal: bool,
                  bound: int, bound_by: str) -> str:
        what = _shown(n, k, d, d_lower)
        if optimal:
            return f"{what} is proved shortest: no [{n - 1},{k},{self.d}] code exists ({bound_by})."
        return (f"{what} is the shortest found; n = {n} is only an upper bound on the "
                f"shortest length, which the bounds put at >= {bound} ({bound_by}).")


@dataclass(frozen=True, repr=False)
class GreatestDistance(SearchQuestion):
    """The greatest ``d`` of a binary linear ``[n, k]`` code (``1 <= k <= n``).

    >>> q = GreatestDistance(16, 5)
    >>> q.bound()
    Limit(value=8, by='griesmer')
    >>> q.statement(16, 5, 8, 8, optimal=True, bound=8, bound_by="griesmer")
    '[16,5,8] has the greatest possible distance (griesmer).'
    """

    n: int
    k: int

    mode: ClassVar[Question] = "distance"
    quantity: ClassVar[str] = "d"
    flag_key: ClassVar[str] = "proven_optimal"
    bound_key: ClassVar[str] = "d_upper_bound"
    given_names: ClassVar[tuple[str, str]] = ("n", "k")

    def __post_init__(self) -> None:
        object.__setattr__(self, "n", check_int("n", self.n, minimum=1))
        object.__setattr__(self, "k", check_int("k", self.k, minimum=1, maximum=self.n))

    def target(self, value: int) -> tuple[int, int, int]:
        return self.n, self.k, value

    def bound(self) -> Limit:
        from . import bounds

        ub = bounds.best_upper(self.n, self.k)
        return Limit(ub.d, ub.by)

    def trivial(self) -> tuple[int, int, int]:
        return self.n, self.k, max(1, self.n // self.k)

    def statement(self, n: int, k: int, d: int | None, d_lower: int, *, optimal: bool,
                  bound: int, bound_by: str) -> str:
        if optimal:
            return f"{_shown(n, k, d, d_lower)} has the greatest possible distance ({bound_by})."
        return (f"d = {d_lower} is the best found, only a lower bound on the best "
                f"possible; the bounds allow d <= {bound} ({bound_by}).")


@dataclass(frozen=True, repr=False)
class GreatestDimension(SearchQuestion):
    """The greatest ``k`` of a binary linear code of length ``n`` and distance at least
    ``d`` (``1 <= d <= n``).

    >>> q = GreatestDimension(12, 4)
    >>> q.bound()
    Limit(value=7, by='hamming')
    >>> q.statement(12, 6, 4, 4, optimal=False, bound=7, bound_by="hamming")[:32]
    'k = 6 is the best found, only a '
    """

    n: int
    d: int

    mode: ClassVar[Question] = "dimension"
    quantity: ClassVar[str] = "k"
    flag_key: ClassVar[str] = "proven_optimal"
    bound_key: ClassVar[str] = "k_upper_bound"
    given_names: ClassVar[tuple[str, str]] = ("n", "d")

    def __post_init__(self) -> None:
        object.__setattr__(self, "n", check_int("n", self.n, minimum=1))
        object.__setattr__(self, "d", check_int("d", self.d, minimum=1, maximum=self.n))

    def target(self, value: int) -> tuple[int, int, int]:
        return self.n, value, self.d

    def bound(self) -> Limit:
        from . import bounds

        db = bounds.max_dimension(self.n, self.d)
        return Limit(db.k, db.by)

    def trivial(self) -> tuple[int, int, int]:
        return self.n, max(1, self.n // self.d), self.d

    def statement(self, n: int, k: int, d: int | None, d_lower: int, *, optimal: bool,
                  bound: int, bound_by: str) -> str:
        if optimal:
            return f"{_shown(n, k, d, d_lower)} has the greatest possible dimension ({bound_by})."
        return (f"k = {k} is the best found, only a lower bound on the best possible; the "
                f"bounds allow k <= {bound} ({bound_by}).")


#: Question name -> its class, in the order of :data:`gf2codes.typing.QUESTIONS`.
QUESTION_TYPES: dict[Question, type[SearchQuestion]] = {
    cls.mode: cls for cls in (ShortestLength, GreatestDistance, GreatestDimension)
}
_BY_GIVEN = {frozenset(cls.given_names): cls for cls in QUESTION_TYPES.values()}


def question_type(n: object = None, k: object = None, d: object = None, *,
                  options: bool = False) -> type[SearchQuestion]:
    """The class of the question that the given (not None) values among ``n``, ``k``,
    ``d`` ask; the values themselves are not checked (see :func:`question`).

    Parameters
    ----------
    n, k, d : object
        Exactly two are given (not None).
    options : bool
        Name them as command-line options (``--n``) in the error message.

    Raises
    ------
    ParameterError
        Unless exactly two are given.

    >>> question_type(n=7, d=3).__name__
    'GreatestDimension'
    """
    given = sorted(name for name, value in (("n", n), ("k", k), ("d", d)) if value is not None)
    cls = _BY_GIVEN.get(frozenset(given)) if len(given) == 2 else None
    if cls is not None:
        return cls
    if options:
        raise ParameterError("Arguments must be exactly two of --n, --k, --d, not "
                             + (", ".join(f"--{g}" for g in given) or "none") + ".")
    raise ParameterError(f"Give exactly two of 'n', 'k' and 'd', not {', '.join(given) or 'none'}.")


def question(n: object = None, k: object = None, d: object = None, *,
             options: bool = False) -> SearchQuestion:
    """The question asked by the two given values among ``n``, ``k``, ``d``.

    ``k`` and ``d``: the shortest length; ``n`` and ``k``: the greatest distance;
    ``n`` and ``d``: the greatest dimension.

    Parameters
    ----------
    n, k, d : int or None
        Exactly two are given: ``k, d >= 1``; ``1 <= k <= n``; ``1 <= d <= n``.
    options : bool
        Name the arguments as command-line options (``--n``) when not exactly two are given.

    Returns
    -------
    SearchQuestion
        A :class:`ShortestLength`, :class:`GreatestDistance` or :class:`GreatestDimension`.

    Raises
    ------
    ParameterError
        Unless exactly two are given, or for a value out of range.

    >>> question(n=15, k=7)
    GreatestDistance(n=15, k=7)
    """
    return question_type(n, k, d, options=options).from_values({"n": n, "k": k, "d": d})
