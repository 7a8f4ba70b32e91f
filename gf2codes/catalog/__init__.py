"""The local catalog: an SQLite store of proved codes, their recipes and equivalences.

A catalog answers "what is the shortest known code for (k, d)?" (and the (n, k) and
(n, d) variants) in milliseconds, remembers every recipe that produced each code, and
never loses an entry.

Store
-----
One SQLite file (standard-library :mod:`sqlite3`, write-ahead log, ``synchronous =
FULL``, a busy timeout, every write in one ``BEGIN IMMEDIATE`` transaction). Its
location is, in order of precedence: the ``path`` argument (``--catalog PATH`` on the
command line), the environment variable ``GF2CODES_CATALOG``, and
``$XDG_DATA_HOME/gf2codes/catalog.sqlite`` (``~/.local/share/gf2codes/catalog.sqlite``
when ``XDG_DATA_HOME`` is unset). The file is marked with an SQLite ``application_id``
and carries its schema version in ``user_version``; :data:`MIGRATIONS` lists the steps
from one version to the next and opening an older catalog applies the missing ones in
one transaction. A file that is not a catalog, or a catalog of a newer schema, raises
:class:`~gf2codes.exceptions.CatalogError`.

Tables: ``entry`` (one row per equivalence class of codes: ``n``, ``k``, the proved
interval ``d_lower .. d_upper`` -- equal when d is proved --, the generator as packed
reduced-echelon rows, the weight distribution, the equivalence invariant, the proof,
when and by which gf2codes version it was added, its origin: ``user`` or
``shipped``, and its provenance), ``recipe`` (every way the code was obtained: source,
steps, seed and the coordinate permutation from the recipe's code to the stored
generator), ``meta``, and the plan and progress of growth jobs (``growth_job``,
``growth_cell``; written through :mod:`gf2codes.catalog.plan` by :mod:`gf2codes.growth`).

The package: :mod:`~gf2codes.catalog.store` (the :class:`Catalog` and
:func:`open_catalog`), :mod:`~gf2codes.catalog.schema` (schema version, migrations,
opening the file), :mod:`~gf2codes.catalog.locations`, :mod:`~gf2codes.catalog.entry`
(:class:`Entry`, :class:`Provenance`, reports, :func:`entry_record`),
:mod:`~gf2codes.catalog.propagation` (the rules in closed form),
:mod:`~gf2codes.catalog.tables`, :mod:`~gf2codes.catalog.checks` (what an import
checks) and :mod:`~gf2codes.catalog.plan` (the growth tables). Equivalence is
:mod:`gf2codes.equivalence` and the record format :mod:`gf2codes.formats`; their names are
re-exported here.

Provenance: proved here, or claimed
-----------------------------------
What a file states is a claim. Each entry's interval carries a :class:`Provenance`:
``proved`` (by this installation: the route, the time, the version), ``checked`` (a
record's claim passed the cheap checks of a trusted import, which prove nothing) or
``claimed`` (stated by its source and not checked -- also every entry stored before
schema 3, which cannot tell a trusted import from a proof). Only ``proved`` reads
"proved" anywhere (:attr:`Entry.proved`); claims are never used to prove anything: a
derived answer from a claimed entry is a claim, :meth:`Catalog.length_table` and
:meth:`Catalog.distance_table` count only proofs (the better claim stands beside),
:meth:`Catalog.pick` prefers a proof to a claim of the same d, and a claimed
entry's :attr:`Entry.code` carries no distance bounds (so a search re-proves it).
:meth:`Catalog.prove_claims` proves claims on request and corrects false ones. When a
proof meets an equivalent claimed entry it replaces the claim; a claim that contradicts
a proved entry is refused.

The shipped seed catalog
------------------------
The repository's ``catalog/*.jsonl`` files (written by ``scripts/build_catalog.py``)
are **imported on first use**: the transaction that creates a new catalog file also
imports them, marked ``origin = 'shipped'``. One store means one set of ids, merging
by equivalence across shipped and user entries, and ``remove`` working on everything.
The records' invariants are trusted at that import (the test suite re-proves every
shipped record), but their distances are not: each record's weight distribution is
computed when ``2^min(k, n-k)`` is small (a proof made here, a few milliseconds in all
for the current seed), and the others are stored as checked claims, so creating a
catalog still takes a fraction of a second. ``open_catalog(path, shipped=False)``
creates an empty catalog instead. A catalog that took the shipped seed keeps its
digest; when a newer gf2codes ships a different seed, the next writable open imports the
missing records once (idempotent: nothing is stored twice; a catalog created empty is
never filled), and :meth:`Catalog.import_shipped` does the same on request.

Equivalence (:mod:`gf2codes.equivalence`)
-----------------------------------------
Two codes are (permutation-)equivalent when a permutation of coordinates maps one onto
the other. The invariant (:func:`equivalence_invariant`) combines the weight
distribution with a Weisfeiler-Lehman hash [2]_ of the bipartite graph whose nodes are
the coordinates and the *spanning light words* -- all nonzero codewords of weight at
most ``w*``, where ``w*`` is the least weight such that those words span the code. That
set is defined by the code alone, so a permutation of coordinates maps it onto the set
of the permuted code, and since it spans, a graph isomorphism that maps coordinates to
coordinates gives a permutation mapping one code onto the other: the exact test
(:func:`are_equivalent`) is a labelled graph isomorphism test (VF2++, [3]_), followed
by a check that the permutation found really maps the code. The graph is built on the
side of smaller dimension, the code or its dual (a permutation maps ``C`` to ``C'``
exactly when it maps the duals), so that every code of length at most 44 can be
enumerated. Codes whose smaller side has dimension above 20, or more than
:data:`MAX_GRAPH_WORDS` spanning light words, get a coarse invariant and are merged
only when they are the same subspace: a missed merge stores a code twice, never wrongly
joins two.

Propagation (:mod:`gf2codes.catalog.propagation`)
-------------------------------------------------
From a stored ``[n, k, d]`` entry the standard rules [1]_ give proved codes without
any computation: shorten ``[n-1, k-1, >= d]``, subcode ``[n, k-1, >= d]``, puncture
``[n-1, k, >= d-1]`` (at most ``d-1`` times, so the dimension stays), extend ``[n+1, k,
d+1]`` for odd ``d``, append a zero coordinate ``[n+1, k, d]``. :meth:`Catalog.pick`
and :meth:`Catalog.length_table` answer with the best such derived code when it beats
every stored one; a derived answer says so (``Entry.derived_from``) and is rebuilt on
request from its recipe (:func:`gf2codes.derive.rebuild`): the stored generator,
shortened at its last pivot columns, punctured at its last coordinates, then extended
and given zero coordinates (the ``append-zeros`` step, :func:`gf2codes.derive.append_zeros`).
The distance of a derived answer is the proved lower bound the rules give
(:func:`~gf2codes.catalog.propagation.reach_distance`, ``reach_length``,
``reach_dimension``).

Records (``export`` / ``import`` and ``catalog/*.jsonl``; :mod:`gf2codes.formats`)
-------------------------------------------------------------------------------
JSON lines, one entry per line::

    {"record": "gf2codes/catalog-entry", "version": 1, "n": 7, "k": 4,
     "d": 3, "d_lower": 3, "d_upper": 3, "generator": ["hex:8b", ...],
     "weights": [1, 0, 0, 7, 7, 0, 0, 1], "invariant": "wl1:code:...",
     "proof": {"method": "weight distribution"},
     "recipes": [{"source": "family", "recipe": [{"family": "hamming", "m": 3}]}]}

``d`` is null unless proved (by the installation that wrote the record; whoever reads
it treats it as a claim, see ``import``). A generator row is either a string of ``0``/``1``
characters, one per coordinate, or ``"hex:"`` followed by ``ceil(n/4)`` lower-case
hexadecimal digits: coordinate 0 is the most significant bit of the first digit,
coordinate 4 that of the second, and so on; the unused low bits of the last digit are
zero (so the row ``1101001`` is ``hex:d2``). Optional keys: ``added`` (ISO 8601 UTC),
``gf2codes`` (the version that added it), ``origin``, ``provenance`` (how the writer knew
the interval; informative only, never trusted on import); recipe items may carry ``seed``,
``permutation``, ``added`` and ``gf2codes``. Plain ``gf2codes/code`` records
(:mod:`gf2codes.formats`) are accepted by ``import`` too.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1 section 9 (puncturing, shortening, extending).
.. [2] N. Shervashidze, P. Schweitzer, E. J. van Leeuwen, K. Mehlhorn and K. M.
   Borgwardt, "Weisfeiler-Lehman graph kernels", *J. Mach. Learn. Res.* 12 (2011)
   2539-2561.
.. [3] A. Jüttner and P. Madarasi, "VF2++ -- An improved subgraph isomorphism
   algorithm", *Discrete Applied Mathematics* 242 (2018) 69-81.
.. [4] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*, Cambridge
   University Press, 2003, section 1.6 (permutation equivalence).
"""

from __future__ import annotations

# Names imported "as" themselves are importable from here (as before the split) but are
# listed in the __all__ of the module that owns them, not here: equivalence
# (gf2codes.equivalence), the record format (gf2codes.formats); and the schema mark and
# the propagation API, which stay in their submodules' namespace.
from ..equivalence import MAX_GRAPH_WORDS as MAX_GRAPH_WORDS
from ..equivalence import CodeFacts as CodeFacts
from ..equivalence import Equivalence as Equivalence
from ..equivalence import are_equivalent as are_equivalent
from ..equivalence import code_facts as code_facts
from ..equivalence import equivalence_invariant as equivalence_invariant
from ..formats import ENTRY_RECORD_KIND as ENTRY_RECORD_KIND
from ..formats import ENTRY_RECORD_VERSION as ENTRY_RECORD_VERSION
from ..formats import EntryRecord as EntryRecord
from ..formats import hex_to_row as hex_to_row
from ..formats import parse_entry_record as parse_entry_record
from ..formats import row_to_hex as row_to_hex
from .entry import Entry, ImportReport, ProofOutcome, Provenance, ProvenanceKind, entry_record
from .locations import default_catalog_path, shipped_catalog_dir
from .propagation import EntryArrays as EntryArrays
from .propagation import derivation_steps
from .propagation import reach_dimension as reach_dimension
from .propagation import reach_distance as reach_distance
from .propagation import reach_length as reach_length
from .schema import APPLICATION_ID as APPLICATION_ID
from .schema import MIGRATIONS, SCHEMA_VERSION
from .store import Catalog, open_catalog

__all__ = [
    "SCHEMA_VERSION",
    "MIGRATIONS",
    "Catalog",
    "Entry",
    "Provenance",
    "ProvenanceKind",
    "ProofOutcome",
    "ImportReport",
    "open_catalog",
    "default_catalog_path",
    "shipped_catalog_dir",
    "derivation_steps",
    "entry_record",
]
