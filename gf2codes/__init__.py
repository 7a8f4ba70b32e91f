"""gf2codes: construct, verify and search binary linear block codes over GF(2).

What a user needs is re-exported here (the list ``_EXPORTS`` below); everything else
stays in its topic module, reachable as ``gf2codes.<module>.<name>``:

* :mod:`gf2codes.code` — :class:`Code`
* :mod:`gf2codes.linalg` — GF(2) linear algebra on bit-packed rows
* :mod:`gf2codes.distance` — proved minimum distance, target tests, fast upper bounds
* :mod:`gf2codes.weights` — weight distributions, MacWilliams identities
* :mod:`gf2codes.bounds` — upper and lower bounds on d, k and n
* :mod:`gf2codes.families` — named constructions (Hamming, Reed–Muller, Golay, BCH, ...)
* :mod:`gf2codes.derive` — new codes from old (puncture, shorten, extend, ...)
* :mod:`gf2codes.formats` — matrix files and code records
* :mod:`gf2codes.parallel` — executors: in-process, process pool, Dask
* :mod:`gf2codes.questions` — the three search questions as objects
* :mod:`gf2codes.equivalence` — code equivalence (no SQL)
* :mod:`gf2codes.catalog` — the local SQLite catalog of proved codes
* :mod:`gf2codes.search` — the shortest code for (k, d), best d, best k
* :mod:`gf2codes.decoding` — coset leaders, exact BSC error probabilities, simulation
* :mod:`gf2codes.report` — the verify report (what ``gf2codes verify`` prints), as an object
* :mod:`gf2codes.export` — C headers, Tanner graphs and other hand-off formats
* :mod:`gf2codes.plots` — matplotlib figures (optional extra, imported on use)
* :mod:`gf2codes.exceptions` — the error hierarchy
"""

from __future__ import annotations

import importlib
from typing import Any

from ._version import __version__  # noqa: F401 - public, listed by __all__

# Importing the package imports nothing else: each public name is looked up, on first
# use, in the module named beside it below, and that module is imported then.
# ``import gf2codes`` therefore costs no NumPy, no numba and no compiled kernel;
# ``from gf2codes import Code`` costs only what Code needs. The list is curated: what a
# user of the library needs; internals (schema versions, packing helpers, argument
# checks...) stay in their modules. A test checks every name resolves.
_EXPORTS: dict[str, tuple[str, ...]] = {
    "code": ("Code",),
    "exceptions": ("Gf2CodesError", "ParseError", "ParameterError", "CatalogError",
                   "TooExpensiveError", "ClaimError", "MissingDependencyError"),
    "distance": ("DistanceResult", "minimum_distance", "has_distance_at_least",
                 "distance_upper_bound", "quick_distance"),
    "weights": ("weight_distribution", "macwilliams_transform", "dual_distance",
                "krawtchouk"),
    "formats": ("read_code", "write_code", "read_matrix_file", "code_to_record",
                "record_to_code"),
    "bounds": ("UpperBound", "LengthBound", "DimensionBound", "upper_bounds", "best_upper",
               "least_length", "max_dimension", "lower_bounds", "singleton_bound",
               "hamming_bound", "plotkin_bound", "griesmer_bound", "elias_bound", "lp_bound",
               "gilbert_varshamov", "varshamov", "existence_length", "existence_dimension",
               "bound_chain"),
    "families": ("repetition", "even_weight", "hamming", "extended_hamming", "simplex",
                 "reed_muller", "golay", "extended_golay", "bch", "quadratic_residue",
                 "cyclic", "quasi_cyclic", "double_circulant", "from_rows",
                 "generator_polynomials", "berlekamp_factors", "FAMILIES"),
    "derive": ("dual", "puncture", "shorten", "extend", "augment", "expurgate", "lengthen",
               "direct_sum", "plotkin_sum", "append_zeros", "construction_x", "product",
               "rebuild"),
    "equivalence": ("are_equivalent", "Equivalence"),
    "questions": ("question", "ShortestLength", "GreatestDistance", "GreatestDimension"),
    "parallel": ("make_executor",),
    "search": ("search_length", "search_distance", "search_dimension", "search_for",
               "SearchResult", "STRATEGIES"),
    "decoding": ("coset_leader_distribution", "covering_radius", "bsc_performance",
                 "block_error_probability", "undetected_error_probability", "simulate_bsc",
                 "SyndromeDecoder", "channel_report", "ChannelReport"),
    "export": ("export_code", "c_header", "tanner_graph", "systematic_encoder"),
    "catalog": ("Catalog", "Entry", "Provenance", "open_catalog"),
    "report": ("VerifyReport", "verify"),
    "_util": ("clear_caches",),
}
_HOME = {name: module for module, names in _EXPORTS.items() for name in names}
#: The topic modules, reachable as attributes (``gf2codes.bounds``) without an import.
_MODULES = ("code", "linalg", "distance", "weights", "exceptions", "formats", "bounds",
            "families", "derive", "equivalence", "questions", "parallel", "search",
            "decoding", "export", "catalog", "report", "typing", "existence", "polynomials",
            "growth")


def __getattr__(name: str) -> Any:
    if name == "__all__":
        value: Any = ["__version__", *_HOME]
    elif name in _MODULES or name == "plots":
        value = importlib.import_module(f".{name}", __name__)
    elif name in _HOME:
        value = getattr(importlib.import_module(f".{_HOME[name]}", __name__), name)
    else:
        raise AttributeError(f"module 'gf2codes' has no attribute {name!r}")
    globals()[name] = value
    return value


def __dir__() -> list[str]:
    return sorted(set(globals()) | set(_HOME) | set(_MODULES))
