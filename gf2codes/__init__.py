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
* :mod:`gf2codes.export` — C headers, Tanner graphs and other hand-off formats
* :mod:`gf2codes.plots` — matplotlib figures (optional extra, imported on use)
* :mod:`gf2codes.exceptions` — the error hierarchy
"""

from __future__ import annotations

from . import (
    bounds,
    decoding,
    derive,
    distance,
    exceptions,
    export,
    families,
    formats,
    linalg,
    parallel,
    search,
    weights,
)
from ._version import __version__
from .bounds import *  # noqa: F403
from .catalog import *  # noqa: F403
from .code import *  # noqa: F403
from .decoding import *  # noqa: F403
from .derive import *  # noqa: F403
from .distance import *  # noqa: F403
from .exceptions import *  # noqa: F403
from .export import *  # noqa: F403
from .families import *  # noqa: F403
from .formats import *  # noqa: F403
from .linalg import *  # noqa: F403
from .parallel import *  # noqa: F403
from .search import *  # noqa: F403
from .weights import *  # noqa: F403

__all__ = ["__version__"]
for _module in (bounds, catalog, decoding, derive, distance, exceptions, export, families,  # noqa: F405
                formats, linalg, parallel, search, weights):
    __all__ += list(_module.__all__)
__all__ += ["Code"]  # noqa: F405 - from .code
del _module
