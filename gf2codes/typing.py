"""Names for the small sets of values the API passes around.

Each alias is a :data:`typing.Literal`, so a type checker catches a misspelt value and
the documentation lists the choices. They are plain strings at run time (JSON output and
stored records keep their spelling).

>>> from gf2codes.typing import QUESTIONS
>>> QUESTIONS
('length', 'distance', 'dimension')
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Literal, Union, get_args

if TYPE_CHECKING:  # numpy is not imported at run time: `gf2codes --help` needs no numpy
    import numpy as np

__all__ = [
    "Question", "QUESTIONS", "DistanceMethod", "DISTANCE_METHODS", "StopReason",
    "ProvenanceKind", "ExistenceStatus", "Outcome", "Side", "FactsSide", "SeedLike",
    "BoundKind", "VerifyMethod", "VERIFY_METHODS", "WeightsPolicy", "WEIGHTS_POLICIES",
    "DecoderName", "IntervalName",
]

#: What a search optimises with the other two of n, k, d fixed: the shortest ``length``
#: for (k, d), the greatest ``distance`` for (n, k), the greatest ``dimension`` for (n, d).
Question = Literal["length", "distance", "dimension"]
QUESTIONS: tuple[Question, ...] = get_args(Question)

#: The proof routes of :func:`gf2codes.distance.minimum_distance` (``auto`` picks one).
DistanceMethod = Literal["auto", "gray", "brouwer-zimmermann", "dual-columns"]
DISTANCE_METHODS: tuple[DistanceMethod, ...] = get_args(DistanceMethod)

#: How ``verify`` settles d: ``exact`` proves it, ``fast`` gives a quick interval whose
#: upper end comes from information-set decoding.
VerifyMethod = Literal["exact", "fast"]
VERIFY_METHODS: tuple[VerifyMethod, ...] = get_args(VerifyMethod)
#: When ``verify`` counts the weight distribution: ``auto`` when it is estimated to take
#: at most :data:`gf2codes.report.WEIGHTS_AUTO_SECONDS`, ``always``, or ``never``.
WeightsPolicy = Literal["auto", "always", "never"]
WEIGHTS_POLICIES: tuple[WeightsPolicy, ...] = get_args(WeightsPolicy)

#: The decoders of the BSC simulation (``auto`` picks one by the number of parity bits).
DecoderName = Literal["auto", "syndrome", "information-set"]

#: The confidence intervals of a Monte Carlo estimate.
IntervalName = Literal["clopper-pearson", "wilson"]

#: Why a long computation ended before it finished (``None`` where it finished;
#: ``exhausted``: a search whose every strategy had nothing more to offer).
StopReason = Literal["time limit", "interrupted", "node budget", "step limit", "cell limit",
                     "upper bound only", "propagation", "target met", "bound attained",
                     "below target", "finished", "stopped", "undecided", "exhausted"]

#: How far a catalog entry is trusted: proved here, checked (re-proved from a record),
#: or only claimed by its source.
ProvenanceKind = Literal["proved", "checked", "claimed"]

#: The answer of an exhaustive existence decision for an [n, k, d] code.
ExistenceStatus = Literal["exists", "none", "undecided"]

#: What the growth job did to one cell.
Outcome = Literal["improved", "unchanged", "closed"]

#: Which side of a code a computation used: the code itself or its dual.
Side = Literal["code", "dual"]

#: Where the equivalence facts of a code come from (:class:`gf2codes.equivalence.CodeFacts`):
#: the light-word graph of one :data:`Side`, the whole space ``full``, ``coarse`` (no graph:
#: too large), or ``trusted`` (the invariant read from a record, the graph not built yet).
FactsSide = Side | Literal["full", "coarse", "trusted"]

#: A seed for the random functions: an int >= 0, a numpy Generator, or None (fresh).
SeedLike = Union[int, "np.random.Generator", None]

#: Whether a bound is a theorem (``upper``: no code beyond it) or a construction
#: (``existence``: a code at least this good).
BoundKind = Literal["upper", "existence"]
