"""gf2codes: construct, verify and search binary linear block codes over GF(2).

The public API is re-exported here from the topic modules:

* :mod:`gf2codes.code` — :class:`Code`
* :mod:`gf2codes.linalg` — GF(2) linear algebra on bit-packed rows
* :mod:`gf2codes.distance` — proved minimum distance, target tests, fast upper bounds
* :mod:`gf2codes.weights` — weight distributions, MacWilliams identities
* :mod:`gf2codes.bounds` — upper and lower bounds on d, k and n
* :mod:`gf2codes.families` — named constructions (Hamming, Reed–Muller, Golay, BCH, ...)
* :mod:`gf2codes.derive` — new codes from old (puncture, shorten, extend, ...)
* :mod:`gf2codes.formats` — matrix files and code records
* :mod:`gf2codes.parallel` — executors: in-process, process pool, Dask
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
# use, in the topic modules below (in this order, lower layers first), and the module
# that defines it is imported then. ``import gf2codes`` therefore costs no NumPy, no
# numba and no compiled kernel; ``from gf2codes import Code`` costs only what Code
# needs. A test checks that every name of every module's ``__all__`` is reachable here.
_MODULES = ("code", "linalg", "distance", "weights", "exceptions", "formats", "bounds",
            "families", "derive", "equivalence", "parallel", "search", "decoding", "export",
            "catalog", "report")


def _public_names() -> list[str]:
    names = ["__version__"]
    for module in _MODULES:
        names += importlib.import_module(f".{module}", __name__).__all__
    return names


def __getattr__(name: str) -> Any:
    if name == "__all__":
        value: Any = _public_names()
    elif name in _MODULES or name == "plots":
        value = importlib.import_module(f".{name}", __name__)
    else:
        for module_name in _MODULES:
            module = importlib.import_module(f".{module_name}", __name__)
            if name in module.__all__:
                value = getattr(module, name)
                break
        else:
            raise AttributeError(f"module 'gf2codes' has no attribute {name!r}")
    globals()[name] = value
    return value


def __dir__() -> list[str]:
    return sorted(set(globals()) | set(_public_names()) | set(_MODULES))
