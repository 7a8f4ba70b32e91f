"""The one registry of bounds: name, title, reference, cost and the test of each.

Everything that lists or titles bounds reads this registry: the individual bounds of
:func:`gf2codes.bounds.upper_bounds` and :func:`gf2codes.bounds.lower_bounds`, the
propagation table (the ``cheap`` upper bounds), the lengths above which a bound is
skipped, the ``gf2codes bounds`` tables and the plot legends.

Adding a bound is one :class:`Bound` entry in :data:`_BUILTIN` below plus its test
function (``kmax(n, d)`` for an upper bound, ``ok(n, k, d)`` for an existence bound);
:func:`register` adds one at run time (the tests register a toy bound this way).

References
----------
See :mod:`gf2codes.bounds` (each entry's ``reference`` names its source).
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

from .._util import clear_caches
from ..exceptions import ParameterError
from ..typing import BoundKind
from . import formulas as f
from . import lp

__all__ = [
    "Bound", "register", "unregister", "registered", "upper_names", "lower_names", "title",
    "LP_LENGTH_LIMIT", "EXACT_LENGTH_LIMIT",
]

#: Largest length at which the certified LP bound and the propagation table are used.
LP_LENGTH_LIMIT = 256
#: Largest length at which the Hamming, Elias and existence bounds are evaluated (they
#: need exact sums of binomial coefficients, whose cost grows like n^2 bits).
EXACT_LENGTH_LIMIT = 4096

_EXACT_WHY = "n = {n} is above {limit}; its exact binomial sums would take too long"


@dataclass(frozen=True)
class Bound:
    """One bound on binary linear ``[n, k, d]`` codes.

    Attributes
    ----------
    name : str
        The key of the bound in every result (``upper_bounds(n, k)[name]``).
    title : str
        How the command line and the plots call it.
    kind : {"upper", "existence"}
        An upper bound (a theorem: no code beyond it) or an existence bound (a
        construction: a code at least this good).
    reference : str
        Where the bound comes from.
    kmax : callable, optional
        Upper bounds: ``kmax(n, d)``, the largest ``k`` the bound allows.
    guarantees : callable, optional
        Existence bounds: ``ok(n, k, d)``, true when a ``[n, k, >= d]`` code is guaranteed.
    cheap : bool
        Upper bounds cheap enough to evaluate over the whole table of smaller lengths;
        they seed the propagation table of :func:`gf2codes.bounds.best_upper`.
    max_length : int or None
        The bound is skipped (reported by :func:`gf2codes.bounds.skipped_bounds`) above
        this length; None: evaluated at every length.
    skip_reason : str
        Why, with ``{n}`` and ``{limit}`` filled in.
    value : callable, optional
        Upper bounds: ``value(n, k)``, the bound on ``d`` at ``(n, k)``, when it is not the
        plain bisection over ``kmax`` (the LP caps its search).
    """

    name: str
    title: str
    kind: BoundKind
    reference: str
    kmax: f.Kmax | None = None
    guarantees: f.Guarantee | None = None
    cheap: bool = False
    max_length: int | None = None
    skip_reason: str = ""
    value: Callable[[int, int], int] | None = None

    def skipped_at(self, n: int) -> bool:
        """True when the bound is not evaluated at length ``n``."""
        return self.max_length is not None and n > self.max_length


# In the order in which ties are credited (upper bounds), then the existence bounds.
_BUILTIN = (
    Bound("singleton", "Singleton", "upper", "MacWilliams & Sloane 1977, ch. 1 §11, Thm 11",
          kmax=f.kmax_singleton, cheap=True),
    Bound("griesmer", "Griesmer", "upper", "Griesmer 1960; MacWilliams & Sloane 1977, "
          "ch. 17 §6", kmax=f.kmax_griesmer, cheap=True),
    Bound("hamming", "Hamming (sphere packing)", "upper",
          "MacWilliams & Sloane 1977, ch. 1 §5, Thm 6", kmax=f.kmax_hamming, cheap=True,
          max_length=EXACT_LENGTH_LIMIT, skip_reason=_EXACT_WHY),
    Bound("plotkin", "Plotkin (with shortening)", "upper",
          "MacWilliams & Sloane 1977, ch. 2 §2; Huffman & Pless 2003, §2.2",
          kmax=f.kmax_plotkin, cheap=True),
    Bound("elias", "Elias-Bassalygo", "upper",
          "Huffman & Pless 2003, §2.11; MacWilliams & Sloane 1977, ch. 17 §4",
          kmax=f.kmax_elias, max_length=EXACT_LENGTH_LIMIT, skip_reason=_EXACT_WHY),
    Bound("lp", "Delsarte LP (certified)", "upper",
          "Delsarte 1973; MacWilliams & Sloane 1977, ch. 17 §4", kmax=lp.kmax_lp,
          max_length=LP_LENGTH_LIMIT,
          skip_reason="n = {n} is above {limit}, the range of the certified LP",
          value=lp.lp_value),
    Bound("gilbert_varshamov", "Gilbert-Varshamov", "existence",
          "Huffman & Pless 2003, §2.8; MacWilliams & Sloane 1977, ch. 1 §10",
          guarantees=f.gv_ok, max_length=EXACT_LENGTH_LIMIT, skip_reason=_EXACT_WHY),
    Bound("varshamov", "Varshamov", "existence",
          "Varshamov 1957; MacWilliams & Sloane 1977, ch. 1 §10, Theorem 12",
          guarantees=f.varshamov_ok, max_length=EXACT_LENGTH_LIMIT, skip_reason=_EXACT_WHY),
)

_REGISTRY: dict[str, Bound] = {b.name: b for b in _BUILTIN}

#: Titles of what else a result may be credited to (not a bound of the registry).
_OTHER_TITLES = {"repetition blocks": "k repetition blocks of length d"}


def register(bound: Bound) -> Bound:
    """Add ``bound`` to the registry (after the others of its kind) and forget every
    cached bound value, so that the next query uses it.

    Raises
    ------
    ParameterError
        If a bound of that name is registered, or the test for its kind is missing.
    """
    if bound.name in _REGISTRY or bound.name in _OTHER_TITLES or bound.name == "table":
        raise ParameterError(f"A bound named {bound.name!r} is already registered.")
    if (bound.kmax if bound.kind == "upper" else bound.guarantees) is None:
        raise ParameterError(f"Bound {bound.name!r} needs its test "
                             f"({'kmax' if bound.kind == 'upper' else 'guarantees'}).")
    _REGISTRY[bound.name] = bound
    clear_caches()
    return bound


def unregister(name: str) -> None:
    """Remove a bound added with :func:`register` (the built-in ones stay)."""
    if name in {b.name for b in _BUILTIN}:
        raise ParameterError(f"Bound {name!r} is built in and cannot be removed.")
    if _REGISTRY.pop(name, None) is not None:
        clear_caches()


def registered(kind: BoundKind | None = None) -> tuple[Bound, ...]:
    """The bounds of the registry (of one ``kind``), upper bounds in credit order."""
    return tuple(b for b in _REGISTRY.values() if kind is None or b.kind == kind)


def upper_names() -> tuple[str, ...]:
    """Names of the upper bounds, in the order in which ties are credited."""
    return tuple(b.name for b in registered("upper"))


def lower_names() -> tuple[str, ...]:
    """Names of the existence bounds."""
    return tuple(b.name for b in registered("existence"))


def title(name: str) -> str:
    """The title of a bound (or of another credited construction); else ``name`` itself."""
    bound = _REGISTRY.get(name)
    if bound is not None:
        return bound.title
    return _OTHER_TITLES.get(name, name)
