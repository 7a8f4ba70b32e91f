"""Bounds on the parameters of binary linear codes.

``D(n, k)`` below is the largest minimum distance of a binary linear ``[n, k]`` code.
Every *upper* bound here is a theorem about ``D(n, k)``: a value that is too small
would be a wrong answer, so every rule applied is stated, with its source, where it
is used. Every *lower* (existence) bound is a construction that always succeeds.

How each bound is evaluated
---------------------------
Each upper bound is a test "can a binary linear ``[n, k, >= d]`` code exist?". For all
of them except the LP bound the test is exact integer arithmetic (Python ints and
:func:`math.comb`); the Elias bound, usually quoted with real numbers, is evaluated
exactly too, as an inequality between integers. The bound on ``d`` is the largest
``d`` that the test does not rule out. Because a ``[n, k, d]`` code with ``d >= 2``
gives a ``[n, k, d - 1]`` code (puncture one coordinate, then append a zero one), a
single proof that ``d`` is impossible rules out every larger ``d``; a binary search
over ``d`` is therefore sound even where a test is not monotone.

The LP bound is solved in floating point with HiGHS, but the answer is *certified*
in exact arithmetic: the float solution of the dual LP is rounded to rationals and
checked (and rescaled) exactly, so the bound proved is the one the certificate proves,
never a rounding artefact. When HiGHS fails or the certificate does not verify, the
LP simply proves nothing at that point (a weaker, still valid, bound).

Where things are
----------------
:mod:`~gf2codes.bounds.registry` (the one list of bounds: name, title, reference, cost,
test), :mod:`~gf2codes.bounds.formulas` (the formula bounds in integers),
:mod:`~gf2codes.bounds.lp` (the certified LP), :mod:`~gf2codes.bounds.upper` (each bound
at a point and turned around for ``n`` and ``k``), :mod:`~gf2codes.bounds.table` (the
propagation table and the best bound), :mod:`~gf2codes.bounds.lower` (existence bounds).
A new bound is one :class:`~gf2codes.bounds.registry.Bound` entry plus its test.

The best bound
--------------
:func:`best_upper` combines the cheap bounds (Singleton, Hamming, Plotkin, Griesmer)
over a table of all smaller parameters with the neighbour relations that puncturing,
shortening, taking subcodes and adding a parity bit give, then takes the minimum with
the Elias and LP bounds *at the queried point* (solving the LP over the whole table in
every process would take minutes for ``n`` near 256). The table's rows ``n <= 129`` also
start from shipped certified LP values (``gf2codes/_lp_bounds.jsonl``, written once by
``scripts/build_lp_bounds.py``) and shipped exhaustive non-existence results. Each row
of the table depends only on smaller lengths and on the bounds one length further, so a
value does not depend on what was asked before.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977: ch. 1 (Hamming bound, Gilbert-Varshamov), ch. 2 §2 (Plotkin
   bound), ch. 5 (Krawtchouk polynomials), ch. 17 (bounds on the size of codes,
   including the linear programming bound and the Elias bound).
.. [2] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*,
   Cambridge University Press, 2003, ch. 2 (bounds on the size of codes).
.. [3] P. Delsarte, "An algebraic approach to the association schemes of coding
   theory", *Philips Research Reports Supplements* 10, 1973.
.. [4] J. H. Griesmer, "A bound for error-correcting codes", *IBM Journal of Research
   and Development* 4 (1960) 532-542.
.. [5] R. R. Varshamov, "Estimate of the number of signals in error correcting codes",
   *Doklady Akad. Nauk SSSR* 117 (1957) 739-741.

The chapter, section and theorem numbers cited in this module for [1] and [2] are from
memory and have not been re-checked against the books (none was at hand); each is
marked "from memory" where it is most likely to be off. The bounds themselves do not
rest on those numbers: the tests check every bound against brute force on all small
codes and against codes whose distance the tests compute.
"""

from __future__ import annotations

from .lower import (
    Existence,
    existence_dimension,
    existence_dimensions,
    existence_for_dimension,
    existence_for_distance,
    existence_for_length,
    existence_length,
    existence_lengths,
    gilbert_varshamov,
    lower_bounds,
    varshamov,
)
from .registry import EXACT_LENGTH_LIMIT, LP_LENGTH_LIMIT, lower_names, upper_names
from .registry import Bound as Bound
from .registry import register as register
from .registry import title as title
from .registry import unregister as unregister
from .results import DimensionBound, LengthBound, UpperBound
from .table import NONEXISTENCE_FILE as NONEXISTENCE_FILE
from .table import (
    TABLE_LENGTH,
    best_upper,
    bound_chain,
    least_length,
    max_dimension,
    proved_nonexistence,
    reset_tables,
)
from .upper import (
    dimension_bounds,
    elias_bound,
    griesmer_bound,
    hamming_bound,
    length_bounds,
    lp_bound,
    plotkin_bound,
    ruling_out,
    singleton_bound,
    skipped_bounds,
    upper_bounds,
)

# The registry (Bound, register, unregister, upper_names, lower_names, title) and
# reset_tables / NONEXISTENCE_FILE are importable from here but not listed: the top-level
# namespace re-exports __all__, and names like ``register`` or ``title`` would mean
# nothing there.
__all__ = [
    "UpperBound",
    "LengthBound",
    "DimensionBound",
    "UPPER_BOUND_NAMES",
    "LOWER_BOUND_NAMES",
    "singleton_bound",
    "hamming_bound",
    "plotkin_bound",
    "griesmer_bound",
    "elias_bound",
    "lp_bound",
    "upper_bounds",
    "best_upper",
    "bound_chain",
    "proved_nonexistence",
    "TABLE_LENGTH",
    "LP_LENGTH_LIMIT",
    "EXACT_LENGTH_LIMIT",
    "skipped_bounds",
    "least_length",
    "max_dimension",
    "length_bounds",
    "dimension_bounds",
    "ruling_out",
    "gilbert_varshamov",
    "varshamov",
    "lower_bounds",
    "existence_length",
    "existence_lengths",
    "existence_dimension",
    "existence_dimensions",
    "Existence",
    "existence_for_distance",
    "existence_for_dimension",
    "existence_for_length",
]

#: Names of the built-in upper bounds, in the order in which ties are credited
#: (:func:`upper_names` includes bounds registered later).
UPPER_BOUND_NAMES = upper_names()
#: Names of the built-in existence bounds (:func:`lower_names` includes later ones).
LOWER_BOUND_NAMES = lower_names()

#: Old private name of :func:`reset_tables`, kept for ``scripts/build_nonexistence.py``.
_reset_tables = reset_tables
