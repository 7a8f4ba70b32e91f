"""What the catalog checks before it stores an imported record.

What a record states is a claim. A verified import re-proves it here
(:func:`import_facts`); a trusted one (:func:`trusted_facts`) runs the cheap checks --
rank, ``n`` and ``k``, the stated weight distribution against the stated d and the
MacWilliams identities, the code's own weight distribution when ``2^min(k, n-k)`` is
small (a proof), else the distance engine when its estimated work is small (a proof of
d), else a short information-set search -- and stores a checked claim.
"""

from __future__ import annotations

import math

from .._version import __version__
from ..distance import distance_upper_bound, minimum_distance
from ..equivalence import (
    INVARIANT_SCHEME,
    CodeFacts,
    code_facts,
    first_difference,
    subspace_digest,
)
from ..exceptions import ParameterError, ParseError, TooExpensiveError
from ..formats import EntryRecord
from ..weights import macwilliams_transform, weight_distribution
from .entry import Provenance, now

__all__ = ["trusted_facts", "import_facts", "CHEAP_WEIGHT_WORDS", "CHEAP_PROOF_WORK",
           "CHEAP_ISD_ITERATIONS"]

#: A trusted import computes the weight distribution (a proof) up to this many codewords
#: of the smaller side; above it, only a short information-set search checks the claim.
CHEAP_WEIGHT_WORDS = 1 << 20
#: Above :data:`CHEAP_WEIGHT_WORDS`, a trusted import still proves d with the distance
#: engine when the engine estimates at most this many codewords (a fraction of a second;
#: a work figure, not a clock, so the same record is proved or not on any machine).
#: Mid-rate codes of length <= 64 ([64, 32] and the like) are proved this way.
CHEAP_PROOF_WORK = 2 * 10**8
#: Random information sets tried by the short check of a trusted record.
CHEAP_ISD_ITERATIONS = 24


def trusted_facts(rec: EntryRecord, where: str, source: str) -> tuple[CodeFacts, Provenance]:
    """The cheap checks of a trusted record; its facts and how its interval is known.

    Raises :class:`ParseError` (naming ``where``) when the record contradicts itself or a
    check. The weight distribution is computed when cheap, which proves d here; otherwise
    a short information-set search looks for a codeword lighter than the claim, and the
    record is stored as a checked claim. Stated weights that were not recomputed are not
    stored (they are claims too).
    """
    code = rec.code
    n, k = code.n, code.k
    checks = ["rank, n and k"]
    if rec.weights is not None:
        stated_d = next((i for i, a in enumerate(rec.weights) if i and a), None)
        if stated_d is None or not rec.d_lower <= stated_d <= rec.d_upper:
            raise ParseError(f"{where}: the record contradicts itself: its weight distribution "
                             f"gives d = {stated_d}, but it states {rec.d_lower} <= d <= "
                             f"{rec.d_upper}.")
        try:
            macwilliams_transform(rec.weights, n)
        except ParameterError as exc:
            raise ParseError(f"{where}: the stated weight distribution is impossible: "
                             f"{str(exc).removeprefix('Argument ')}") from None
        checks.append("the stated weights against d and the MacWilliams identities")
    trusted = rec.invariant is not None and (rec.invariant.startswith(INVARIANT_SCHEME + ":")
                                             or rec.invariant.startswith("coarse:"))
    weights: list[int] | None = None
    if k == n:
        weights = [math.comb(n, i) for i in range(n + 1)]
    elif (1 << min(k, n - k)) <= CHEAP_WEIGHT_WORDS:
        weights = [int(a) for a in weight_distribution(code, max_codewords=None)]
    if trusted:
        side = "coarse" if rec.invariant.startswith("coarse:") else "trusted"  # type: ignore[union-attr]
        facts = CodeFacts(subspace_digest(code), weights, rec.invariant, side)  # type: ignore[arg-type]
    else:
        facts = code_facts(code)
        weights = facts.weights if weights is None else weights
    if weights is not None:
        if rec.weights is not None and rec.weights != weights:
            raise ParseError(f"{where}: the stated weight distribution is not the code's ("
                             + first_difference(rec.weights, weights) + ").")
        true_d = next(i for i, a in enumerate(weights) if i and a)
        if not rec.d_lower <= true_d <= rec.d_upper:
            raise ParseError(f"{where}: the record states {rec.d_lower} <= d <= "
                             f"{rec.d_upper}, but the code's weight distribution (computed "
                             f"here) gives d = {true_d}.")
        rec.d_lower = rec.d_upper = true_d
        rec.proved = True
        return facts, Provenance.proved_here("weight distribution")
    try:
        result = minimum_distance(code, max_work=CHEAP_PROOF_WORK)
    except TooExpensiveError:
        result = None
    if result is not None and result.exact:
        proved_d = int(result.lower)  # exact: lower == upper == d
        if not rec.d_lower <= proved_d <= rec.d_upper:
            raise ParseError(f"{where}: the record states {rec.d_lower} <= d <= "
                             f"{rec.d_upper}, but the code has d = {proved_d} (proved "
                             "here).")
        rec.d_lower = rec.d_upper = proved_d
        rec.proved = True
        return facts, Provenance.proved_here(result.method)
    isd = distance_upper_bound(code, iterations=CHEAP_ISD_ITERATIONS, seed=0)
    if isd.upper < rec.d_lower:
        raise ParseError(f"{where}: the record states d >= {rec.d_lower}, but the code has a "
                         f"codeword of weight {isd.upper} (found by an information-set "
                         "search here).")
    checks.append(f"no codeword lighter than {rec.d_lower} in {CHEAP_ISD_ITERATIONS} random "
                  "information sets")
    return facts, Provenance("checked", route="; ".join(checks), at=now(), by=__version__,
                             source=source)


def import_facts(rec: EntryRecord, where: str, verify: bool, time_limit: float | None,
                 source: str) -> tuple[CodeFacts, Provenance]:
    """The facts of a record being imported and how its interval is known.

    With ``verify`` the record is re-proved here (weight distribution when affordable,
    else :func:`gf2codes.distance.minimum_distance` within ``time_limit``); without, the
    cheap checks of :func:`trusted_facts` run. ``rec``'s interval is set to what was
    proved. Raises :class:`ParseError` naming ``where`` when the record is refused.
    """
    code = rec.code
    if not verify:
        return trusted_facts(rec, where, source)
    facts = code_facts(code)
    if rec.weights is not None and facts.weights is not None and rec.weights != facts.weights:
        raise ParseError(f"{where}: the stated weight distribution is not the code's ("
                         + first_difference(rec.weights, facts.weights) + ").")
    if facts.d is not None:
        if not rec.d_lower <= facts.d <= rec.d_upper:
            raise ParseError(f"{where}: the record states {rec.d_lower} <= d <= "
                             f"{rec.d_upper}, but the code has d = {facts.d}.")
        rec.d_lower = rec.d_upper = facts.d
        rec.proved = True
        return facts, Provenance.proved_here("weight distribution")
    result = minimum_distance(code, time_limit=time_limit)
    if result.lower > rec.d_upper or result.upper < rec.d_lower:
        raise ParseError(f"{where}: the record states {rec.d_lower} <= d <= "
                         f"{rec.d_upper}, but {result.describe()}.")
    if result.lower < rec.d_lower:
        raise ParseError(f"{where}: could not confirm d >= {rec.d_lower} within "
                         f"{time_limit} s ({result.describe()}).")
    # store what was proved here, not what the record states
    rec.d_lower, rec.d_upper = int(result.lower), int(result.upper)
    rec.proved = result.exact
    return facts, Provenance.proved_here(result.method, result.seconds)
