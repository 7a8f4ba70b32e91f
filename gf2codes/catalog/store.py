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
``growth_cell``; written by :mod:`gf2codes.growth`).

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
creates an empty catalog instead. A catalog created before a newer seed was shipped
can take it with :meth:`Catalog.import_shipped` (idempotent: nothing is stored twice).

Equivalence
-----------
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

Propagation
-----------
From a stored ``[n, k, d]`` entry the standard rules [1]_ give proved codes without
any computation: shorten ``[n-1, k-1, >= d]``, subcode ``[n, k-1, >= d]``, puncture
``[n-1, k, >= d-1]`` (at most ``d-1`` times, so the dimension stays), extend ``[n+1, k,
d+1]`` for odd ``d``, append a zero coordinate ``[n+1, k, d]``. :meth:`Catalog.pick`
and :meth:`Catalog.length_table` answer with the best such derived code when it beats
every stored one; a derived answer says so (``Entry.derived_from``) and is rebuilt on
request from its recipe (:func:`gf2codes.derive.rebuild`): the stored generator,
shortened at its last pivot columns, punctured at its last coordinates, then extended
and given zero coordinates (:func:`gf2codes.derive.append_zeros`). The distance of a
derived answer is the proved lower bound the rules give.

Records (``export`` / ``import`` and ``catalog/*.jsonl``)
--------------------------------------------------------
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

import contextlib
import hashlib
import json
import math
import os
import sqlite3
import time
from collections.abc import Iterable, Iterator, Mapping, Sequence
from dataclasses import dataclass, field
from datetime import datetime, timezone
from pathlib import Path
from typing import Any, Literal, overload

import numpy as np

from . import linalg
from ._version import __version__
from .code import Code
from .exceptions import CatalogError, ParameterError, ParseError, check_int

__all__ = [
    "SCHEMA_VERSION",
    "MIGRATIONS",
    "ENTRY_RECORD_KIND",
    "MAX_GRAPH_WORDS",
    "Catalog",
    "Entry",
    "Provenance",
    "ProvenanceKind",
    "ProofOutcome",
    "Equivalence",
    "CodeFacts",
    "ImportReport",
    "open_catalog",
    "default_catalog_path",
    "shipped_catalog_dir",
    "equivalence_invariant",
    "code_facts",
    "are_equivalent",
    "derivation_steps",
    "row_to_hex",
    "hex_to_row",
    "entry_record",
    "parse_entry_record",
]

#: Version of the database schema this gf2codes writes (``PRAGMA user_version``).
SCHEMA_VERSION = 4
#: ``PRAGMA application_id`` of a gf2codes catalog (the bytes ``g2cc``).
APPLICATION_ID = 0x67326363
#: ``record`` value of an exported catalog entry.
ENTRY_RECORD_KIND = "gf2codes/catalog-entry"
ENTRY_RECORD_VERSION = 1
#: Spanning light words above this count make the exact equivalence test too costly.
MAX_GRAPH_WORDS = 6000
#: Largest dimension of the smaller side (code or dual) that is enumerated.
_MAX_SIDE_DIM = 20
#: Weight distributions are computed when ``2^min(k, n-k)`` is at most this.
_MAX_WEIGHT_WORDS = 1 << 30
#: A trusted import computes the weight distribution (a proof) up to this many codewords
#: of the smaller side; above it, only a short information-set search checks the claim.
_CHEAP_WEIGHT_WORDS = 1 << 20
#: Random information sets tried by the short check of a trusted record.
_CHEAP_ISD_ITERATIONS = 24
_BUSY_SECONDS = 60.0
_MAX_SQL_INT = (1 << 63) - 1
_INVARIANT_SCHEME = "wl1"

#: ``MIGRATIONS[v]`` takes a catalog from schema version ``v`` to ``v + 1``.
MIGRATIONS: tuple[tuple[str, ...], ...] = (
    # 0 -> 1: the first schema.
    (
        """CREATE TABLE meta (key TEXT PRIMARY KEY, value TEXT NOT NULL)""",
        """CREATE TABLE entry (
            id INTEGER PRIMARY KEY AUTOINCREMENT,
            n INTEGER NOT NULL CHECK (n >= 1),
            k INTEGER NOT NULL CHECK (k >= 1 AND k <= n),
            d_lower INTEGER NOT NULL CHECK (d_lower >= 1),
            d_upper INTEGER NOT NULL CHECK (d_upper >= d_lower),
            generator BLOB NOT NULL,
            subspace TEXT NOT NULL UNIQUE,
            weights TEXT,
            invariant TEXT NOT NULL,
            proof TEXT,
            added_at TEXT NOT NULL,
            added_by TEXT NOT NULL)""",
        """CREATE TABLE recipe (
            id INTEGER PRIMARY KEY AUTOINCREMENT,
            entry_id INTEGER NOT NULL REFERENCES entry(id) ON DELETE CASCADE,
            source TEXT NOT NULL,
            steps TEXT,
            seed INTEGER,
            permutation TEXT,
            fingerprint TEXT NOT NULL,
            added_at TEXT NOT NULL,
            added_by TEXT NOT NULL,
            UNIQUE (entry_id, fingerprint))""",
    ),
    # 1 -> 2: where an entry came from; indexes for the queries of best and table.
    (
        """ALTER TABLE entry ADD COLUMN origin TEXT NOT NULL DEFAULT 'user'""",
        """CREATE INDEX entry_nk ON entry (n, k)""",
        """CREATE INDEX entry_kd ON entry (k, d_lower)""",
        """CREATE INDEX entry_invariant ON entry (invariant)""",
        """CREATE INDEX recipe_entry ON recipe (entry_id)""",
    ),
    # 2 -> 3: how the distance interval of each entry is known (see Provenance). Entries
    # stored before this step may come from a trusted import: they are claims until
    # `Catalog.prove_claims` proves them here.
    (
        """ALTER TABLE entry ADD COLUMN provenance TEXT NOT NULL DEFAULT
           '{"kind":"claimed","source":"stored before gf2codes recorded provenance"}'""",
    ),
    # 3 -> 4: the plan and progress of growth jobs (gf2codes.growth).
    (
        """CREATE TABLE growth_job (
            id INTEGER PRIMARY KEY AUTOINCREMENT,
            key TEXT NOT NULL UNIQUE,
            spec TEXT NOT NULL,
            created_at TEXT NOT NULL,
            finished_at TEXT)""",
        """CREATE TABLE growth_cell (
            job_id INTEGER NOT NULL REFERENCES growth_job(id) ON DELETE CASCADE,
            rank INTEGER NOT NULL,
            n INTEGER NOT NULL,
            k INTEGER NOT NULL,
            d_planned INTEGER NOT NULL,
            bound INTEGER NOT NULL,
            state TEXT NOT NULL DEFAULT 'pending' CHECK (state IN ('pending', 'done')),
            outcome TEXT,
            d_before INTEGER,
            d_found INTEGER,
            entry_id INTEGER,
            strategy TEXT,
            seconds REAL,
            stopped TEXT,
            finished_at TEXT,
            PRIMARY KEY (job_id, n, k))""",
        """CREATE INDEX growth_cell_rank ON growth_cell (job_id, state, rank)""",
    ),
)
assert len(MIGRATIONS) == SCHEMA_VERSION


def _now() -> str:
    return datetime.now(timezone.utc).replace(microsecond=0).isoformat().replace("+00:00", "Z")


def _dumps(obj: Any) -> str:
    return json.dumps(obj, sort_keys=True, separators=(",", ":"))


# ------------------------------------------------------------------ provenance
#: How the distance interval of an entry is known: ``"proved"`` here (by this
#: installation, with the route and the time), ``"checked"`` here (a record's claim
#: passed the cheap consistency checks, which do not prove it), or ``"claimed"`` (stated by
#: the entry's source and not checked).
ProvenanceKind = Literal["proved", "checked", "claimed"]
_KINDS: tuple[str, ...] = ("proved", "checked", "claimed")


@dataclass(frozen=True)
class Provenance:
    """How the distance interval ``d_lower .. d_upper`` of a catalog entry is known.

    Only ``kind == "proved"`` is a proof made by this installation; the other two are
    claims, shown as such everywhere and never used to prove anything else (a derived
    answer from a claimed entry is a claim too).

    Attributes
    ----------
    kind : {"proved", "checked", "claimed"}
    route : str or None
        ``proved``: how (``"weight distribution"``, ``"bz"``, ``"gray"``...);
        ``checked``: which checks passed.
    at : str or None
        When (ISO 8601 UTC).
    by : str or None
        The gf2codes version that proved or checked it.
    seconds : float or None
        Time the proof took.
    source : str or None
        Who states a claim (a file name, ``"shipped seed"``...).

    >>> Provenance.from_dict({"kind": "claimed", "source": "lie.jsonl"}).describe()
    'claimed by lie.jsonl, not checked'
    """

    kind: ProvenanceKind
    route: str | None = None
    at: str | None = None
    by: str | None = None
    seconds: float | None = None
    source: str | None = None

    @property
    def proved(self) -> bool:
        """True when the interval was proved by this installation."""
        return self.kind == "proved"

    @classmethod
    def proved_here(cls, route: str, seconds: float | None = None) -> Provenance:
        """A proof made now, by this gf2codes."""
        return cls("proved", route=route, at=_now(), by=__version__,
                   seconds=None if seconds is None else round(float(seconds), 3))

    def to_dict(self) -> dict[str, Any]:
        """The JSON form (keys with no value left out)."""
        return {k: v for k, v in (("kind", self.kind), ("route", self.route), ("at", self.at),
                                  ("by", self.by), ("seconds", self.seconds),
                                  ("source", self.source)) if v is not None}

    @classmethod
    def from_dict(cls, obj: Mapping[str, Any]) -> Provenance:
        """Read :meth:`to_dict`; anything unreadable is a claim, never a proof."""
        kind = obj.get("kind")
        if kind not in _KINDS:
            return cls("claimed", source=str(obj.get("source") or "unknown"))
        seconds = obj.get("seconds")
        return cls(kind, route=obj.get("route"), at=obj.get("at"), by=obj.get("by"),  # type: ignore[arg-type]
                   seconds=seconds if isinstance(seconds, (int, float)) else None,
                   source=obj.get("source"))

    def describe(self) -> str:
        """One phrase: ``proved here (bz, 0.12 s, 2026-...)`` or ``claimed by FILE...``."""
        if self.kind == "proved":
            parts = [p for p in (self.route, None if self.seconds is None else
                                 f"{self.seconds:g} s", self.at) if p]
            return "proved here" + (f" ({', '.join(parts)})" if parts else "")
        who = f"claimed by {self.source}" if self.source else "claimed"
        if self.kind == "checked":
            return f"{who}; cheap checks passed here ({self.route})"
        return f"{who}, not checked"


_CLAIMED_BEFORE = Provenance("claimed", source="stored before gf2codes recorded provenance")


def _read_provenance(text: str | None) -> Provenance:
    try:
        obj = json.loads(text) if text else None
    except json.JSONDecodeError:
        obj = None
    return Provenance.from_dict(obj) if isinstance(obj, dict) else _CLAIMED_BEFORE


def _set_wal(con: sqlite3.Connection) -> None:
    """Switch to write-ahead logging, waiting while another process holds the lock.

    SQLite answers "database is locked" at once, without its busy handler, when two
    processes open a new catalog file at the same moment and both ask for WAL; so the
    request is repeated for up to ``_BUSY_SECONDS``.
    """
    deadline = time.monotonic() + _BUSY_SECONDS
    while True:
        try:
            con.execute("PRAGMA journal_mode = WAL")
            return
        except sqlite3.OperationalError as exc:
            if "locked" not in str(exc) or time.monotonic() > deadline:
                raise
            time.sleep(0.02)


# ------------------------------------------------------------------ locations
def default_catalog_path() -> Path:
    """Where the catalog lives unless told otherwise: ``GF2CODES_CATALOG`` or the XDG path."""
    env = os.environ.get("GF2CODES_CATALOG")
    if env:
        return Path(env).expanduser()
    base = os.environ.get("XDG_DATA_HOME") or os.path.join(os.path.expanduser("~"),
                                                           ".local", "share")
    return Path(base) / "gf2codes" / "catalog.sqlite"


def shipped_catalog_dir() -> Path | None:
    """The folder of the shipped seed records, if present.

    ``GF2CODES_SHIPPED_CATALOG`` (a folder, or ``none``) overrides; otherwise the
    repository's ``catalog/`` beside the package (a source checkout), else the copy
    installed with the package as ``gf2codes._seed``.
    """
    env = os.environ.get("GF2CODES_SHIPPED_CATALOG")
    if env:
        return Path(env) if env.lower() != "none" else None
    here = Path(__file__).resolve().parent.parent / "catalog"
    if here.is_dir():
        return here
    installed = Path(__file__).resolve().parent / "_seed"
    return installed if installed.is_dir() else None


# ------------------------------------------------------------------ hex rows
def row_to_hex(bits: Sequence[int] | np.ndarray) -> str:
    """A 0/1 row as ``"hex:..."``: coordinate 0 is the most significant bit of digit 1.

    >>> row_to_hex([1, 1, 0, 1, 0, 0, 1])
    'hex:d2'
    """
    b = np.asarray(bits, dtype=np.uint8)
    n = b.size
    padded = np.zeros(-(-n // 4) * 4, dtype=np.uint8)
    padded[:n] = b
    digits = padded.reshape(-1, 4) @ np.array([8, 4, 2, 1])
    return "hex:" + "".join("0123456789abcdef"[int(x)] for x in digits)


def hex_to_row(text: str, n: int) -> np.ndarray:
    """Inverse of :func:`row_to_hex` for a row of ``n`` coordinates.

    Raises
    ------
    ParseError
        If the digits are not hexadecimal, their count is not ``ceil(n/4)``, or a
        padding bit is set.

    >>> hex_to_row('hex:d2', 7).tolist()
    [1, 1, 0, 1, 0, 0, 1]
    """
    body = text[4:] if text.startswith("hex:") else text
    if len(body) != -(-n // 4):
        raise ParseError(f"<record>: a hex row of {n} coordinates needs {-(-n // 4)} "
                         f"digits, not {len(body)}.")
    try:
        values = [int(c, 16) for c in body]
    except ValueError:
        raise ParseError(f"<record>: {text!r} is not a hex row.") from None
    bits = np.array([(v >> (3 - i)) & 1 for v in values for i in range(4)], dtype=np.uint8)
    if bits[n:].any():
        raise ParseError(f"<record>: the hex row {text!r} sets padding bits beyond "
                         f"coordinate {n - 1}.")
    return bits[:n]


# ------------------------------------------------------------------ invariants
@dataclass
class CodeFacts:
    """What the catalog computes about a code before storing it.

    Attributes
    ----------
    subspace : str
        Digest of ``n`` and the reduced echelon generator: equal exactly for equal codes.
    weights : list of int or None
        The weight distribution ``[A_0, ..., A_n]`` when it was affordable.
    invariant : str
        The equivalence invariant; equal for equivalent codes.
    side : str
        ``"code"`` or ``"dual"``: which one the light-word graph was built from
        (``"full"`` for ``GF(2)^n``, ``"coarse"`` when none was built).
    light : numpy.ndarray or None
        The spanning light words of ``side``, packed.
    w_star : int or None
        Their largest weight.
    """

    subspace: str
    weights: list[int] | None
    invariant: str
    side: str
    light: np.ndarray | None = field(default=None, repr=False)
    w_star: int | None = None
    _graph: Any = field(default=None, repr=False)

    @property
    def d(self) -> int | None:
        """The minimum distance, read off the weight distribution (None if unknown)."""
        if self.weights is None:
            return None
        return next((i for i, a in enumerate(self.weights) if i and a), None)


def _subspace_digest(code: Code) -> str:
    rows = linalg.rref(code.packed_generator, n=code.n).sorted().rows
    h = hashlib.sha256(f"{code.n}:{code.k}:".encode())
    h.update(np.ascontiguousarray(rows, dtype="<u8").tobytes())
    return h.hexdigest()[:32]


def _all_words(basis: np.ndarray) -> np.ndarray:
    words = np.zeros((1, basis.shape[1]), dtype=np.uint64)
    for row in basis:
        words = np.concatenate([words, words ^ row[None, :]])
    return words


def _light_graph(light: np.ndarray, weights: np.ndarray, n: int):
    import networkx as nx  # type: ignore[import-untyped]  # untyped third-party module

    g = nx.Graph()
    g.add_nodes_from((j, {"label": "c"}) for j in range(n))
    g.add_nodes_from((n + i, {"label": f"w{int(w)}"}) for i, w in enumerate(weights))
    rows, cols = np.nonzero(linalg.unpack(light, n))
    g.add_edges_from(zip((n + rows).tolist(), cols.tolist(), strict=True))
    return g


def code_facts(code: Code) -> CodeFacts:
    """Compute the subspace digest, weight distribution and equivalence invariant.

    >>> from gf2codes.families import hamming
    >>> f = code_facts(hamming(3)); f.weights, f.side, f.w_star
    ([1, 0, 0, 7, 7, 0, 0, 1], 'dual', 4)
    """
    from .weights import macwilliams_transform, weight_distribution

    subspace = _subspace_digest(code)
    n, k = code.n, code.k
    if k == n:
        weights: list[int] | None = [math.comb(n, i) for i in range(n + 1)]
        return CodeFacts(subspace, weights, f"{_INVARIANT_SCHEME}:full:{n}", "full")
    side_name, side = ("code", code) if k <= n - k else ("dual", code.dual())
    if side.k > _MAX_SIDE_DIM:
        weights = None
        if (1 << side.k) <= _MAX_WEIGHT_WORDS:
            weights = weight_distribution(code, max_codewords=None)
        digest = "none" if weights is None else hashlib.sha256(
            _dumps(weights).encode()).hexdigest()[:16]
        return CodeFacts(subspace, weights, f"coarse:{n}:{k}:{digest}", "coarse")
    words = _all_words(side.packed_generator)
    wts = np.bitwise_count(words).sum(axis=1).astype(np.int64)
    side_dist = np.bincount(wts, minlength=n + 1).tolist()
    weights = side_dist if side_name == "code" else [
        int(x) for x in macwilliams_transform(side_dist, n)]
    order = np.argsort(wts, kind="stable")
    levels = sorted({int(w) for w in wts if w})
    light = w_star = None
    for w in levels:
        sel = order[(wts[order] > 0) & (wts[order] <= w)]
        if linalg.rref(words[sel], n=n).rank == side.k:
            light, w_star = np.ascontiguousarray(words[sel]), w
            break
    assert light is not None  # all nonzero words span
    wdig = hashlib.sha256(_dumps(weights).encode()).hexdigest()[:16]
    if light.shape[0] > MAX_GRAPH_WORDS:
        return CodeFacts(subspace, weights, f"coarse:{n}:{k}:{wdig}:{light.shape[0]}",
                         "coarse")
    import networkx as nx  # type: ignore[import-untyped]  # untyped third-party module

    graph = _light_graph(light, wts[sel], n)
    wl = nx.weisfeiler_lehman_graph_hash(graph, node_attr="label", iterations=3)
    inv = f"{_INVARIANT_SCHEME}:{side_name}:{n}:{k}:{w_star}:{light.shape[0]}:{wdig}:{wl}"
    return CodeFacts(subspace, weights, inv, side_name, light, w_star, graph)


def equivalence_invariant(code: Code) -> str:
    """The equivalence invariant of ``code`` (equal for permutation-equivalent codes).

    >>> from gf2codes.families import hamming, cyclic
    >>> equivalence_invariant(hamming(3)) == equivalence_invariant(cyclic(7, "x^3+x+1"))
    True
    """
    return code_facts(code).invariant


@dataclass(frozen=True)
class Equivalence:
    """The answer of :func:`are_equivalent`.

    Attributes
    ----------
    equivalent : bool or None
        True (proved, with :attr:`permutation`), False (proved, with :attr:`reason`), or
        None when the codes are too large for the exact test.
    permutation : list of int or None
        ``permutation[j]`` is the coordinate of the second code that coordinate ``j`` of
        the first code goes to.
    reason : str
        Why: a one-line statement.
    """

    equivalent: bool | None
    permutation: list[int] | None
    reason: str

    def __bool__(self) -> bool:
        return bool(self.equivalent)


def _permuted(code: Code, perm: Sequence[int]) -> Code:
    G = np.zeros((code.k, code.n), dtype=np.uint8)
    G[:, np.asarray(perm, dtype=np.int64)] = code.G
    return Code(G)


def _first_difference(a: Sequence[int], b: Sequence[int]) -> str:
    i = next(i for i, (x, y) in enumerate(zip(a, b, strict=True)) if x != y)
    return f"A_{i} = {a[i]} and {b[i]}"


_MATCH_BUDGET = 20000


class _OutOfBudget(Exception):
    pass


def _refine(MA: np.ndarray, MB: np.ndarray, ca: np.ndarray, cb: np.ndarray):
    """Joint colour refinement of two coordinate / light-word incidence matrices.

    Colours are named by their signatures over both graphs at once, so equal colours
    mean equal signatures; returns the stable coordinate colours, or None as soon as
    the two colourings have different class sizes (then no isomorphism respects them).
    """
    m, n = MA.shape
    ra, ja = np.nonzero(MA)
    rb, jb = np.nonzero(MB)
    wa = np.zeros(m, dtype=np.int64)
    wb = np.zeros(m, dtype=np.int64)
    classes = -1
    while True:
        sa = np.sort(np.where(MA, ca[None, :] + 1, 0), axis=1)
        sb = np.sort(np.where(MB, cb[None, :] + 1, 0), axis=1)
        _, inv = np.unique(np.vstack([np.column_stack([wa, sa]), np.column_stack([wb, sb])]),
                           axis=0, return_inverse=True)
        inv = inv.reshape(-1)
        wa, wb = inv[:m], inv[m:]
        nw = int(inv.max()) + 1
        if not np.array_equal(np.bincount(wa, minlength=nw), np.bincount(wb, minlength=nw)):
            return None
        ha = np.zeros((n, nw), dtype=np.int64)
        hb = np.zeros((n, nw), dtype=np.int64)
        np.add.at(ha, (ja, wa[ra]), 1)
        np.add.at(hb, (jb, wb[rb]), 1)
        _, inv = np.unique(np.vstack([np.column_stack([ca, ha]), np.column_stack([cb, hb])]),
                           axis=0, return_inverse=True)
        inv = inv.reshape(-1)
        ca, cb = inv[:n], inv[n:]
        nc = int(inv.max()) + 1
        if not np.array_equal(np.bincount(ca, minlength=nc), np.bincount(cb, minlength=nc)):
            return None
        if nc + nw == classes:
            return ca, cb
        classes = nc + nw


def _match(MA: np.ndarray, MB: np.ndarray, a: Code, b: Code) -> list[int] | None:
    """A coordinate permutation mapping code ``a`` onto ``b``, or None if there is none.

    Individualisation and refinement on the incidence of coordinates and spanning light
    words: fix one coordinate of ``a`` to each candidate of ``b`` in turn, refine, and
    recurse until every coordinate has its own colour; the permutation is then checked
    on the codes. The branch that follows a true equivalence always survives refinement,
    so exhausting the tree proves that there is none.
    """
    n = a.n
    budget = [_MATCH_BUDGET]

    def search(ca: np.ndarray, cb: np.ndarray) -> list[int] | None:
        budget[0] -= 1
        if budget[0] < 0:
            raise _OutOfBudget
        refined = _refine(MA, MB, ca, cb)
        if refined is None:
            return None
        ca, cb = refined
        sizes = np.bincount(ca)
        if sizes.max() == 1:
            where_b = np.empty(sizes.size, dtype=np.int64)
            where_b[cb] = np.arange(n)
            perm = where_b[ca].tolist()
            return perm if _permuted(a, perm) == b else None
        cls = int(np.flatnonzero(sizes == sizes[sizes > 1].min())[0])
        j = int(np.flatnonzero(ca == cls)[0])
        fresh = int(max(ca.max(), cb.max())) + 1
        for t in np.flatnonzero(cb == cls):
            ca2, cb2 = ca.copy(), cb.copy()
            ca2[j] = cb2[t] = fresh
            found = search(ca2, cb2)
            if found is not None:
                return found
        return None

    zero = np.zeros(n, dtype=np.int64)
    return search(zero, zero.copy())


def are_equivalent(a: Code, b: Code, *, facts_a: CodeFacts | None = None,
                   facts_b: CodeFacts | None = None) -> Equivalence:
    """Decide whether a permutation of coordinates maps ``a`` onto ``b``.

    See the module notes: the spanning light words of the smaller side give two
    bipartite graphs that are isomorphic (coordinates to coordinates) exactly when the
    codes are equivalent; the permutation found is checked on the codes themselves.

    >>> from gf2codes.families import hamming, cyclic
    >>> r = are_equivalent(hamming(3), cyclic(7, "x^3+x+1")); r.equivalent
    True
    """
    if a.n != b.n:
        return Equivalence(False, None, f"the lengths differ ({a.n} and {b.n})")
    if a.k != b.k:
        return Equivalence(False, None, f"the dimensions differ ({a.k} and {b.k})")
    if a == b:
        return Equivalence(True, list(range(a.n)), "the codes are the same subspace")
    fa = facts_a or code_facts(a)
    fb = facts_b or code_facts(b)
    if fa.side == "full":
        return Equivalence(True, list(range(a.n)), "both are the whole space")
    if fa.weights is not None and fb.weights is not None and fa.weights != fb.weights:
        return Equivalence(False, None, "the weight distributions differ ("
                           + _first_difference(fa.weights, fb.weights) + ")")
    if fa.side == "coarse" or fb.side == "coarse":
        return Equivalence(None, None, "too large for the exact test (the smaller of the "
                           "code and its dual has too many codewords or light words)")
    side = "code" if fa.side == "code" else "dual code"
    assert fa.light is not None and fb.light is not None  # code_facts sets it past the checks above
    if fa.w_star != fb.w_star or fa.light.shape[0] != fb.light.shape[0]:
        return Equivalence(False, None, f"the light words spanning the {side} differ "
                           f"(weights <= {fa.w_star}: {fa.light.shape[0]} words; weights "
                           f"<= {fb.w_star}: {fb.light.shape[0]} words)")
    if fa.invariant != fb.invariant:
        return Equivalence(False, None, "the Weisfeiler-Lehman hashes of the graphs of "
                           f"coordinates and light words of the {side} differ")
    try:
        perm = _match(linalg.unpack(fa.light, a.n), linalg.unpack(fb.light, b.n), a, b)
    except _OutOfBudget:
        return Equivalence(None, None, "undecided: the exact test gave up after "
                           f"{_MATCH_BUDGET} branches")
    if perm is None:
        return Equivalence(False, None, f"no permutation maps the {fa.light.shape[0]} words "
                           f"of weight <= {fa.w_star} spanning the {side} of one code onto "
                           "those of the other (exact search by colour refinement)")
    if _permuted(a, perm) != b:  # pragma: no cover - would be a bug in the argument
        raise AssertionError("the graph isomorphism does not map the codes")
    return Equivalence(True, perm, f"a permutation maps the {fa.light.shape[0]} words of "
                       f"weight <= {fa.w_star} spanning the {side} onto each other")


# ------------------------------------------------------------------ derivation
def derivation_steps(code: Code, *, n: int, k: int, d_lower: int) -> list[dict[str, Any]]:
    """The steps that take a stored ``[n0, k0, >= d_lower]`` code to ``[n, k]``.

    Shorten at the last ``k0 - k`` pivot columns of the reduced echelon generator, then
    puncture the last coordinates or extend (odd ``d_lower``) and append zero
    coordinates, as :meth:`Catalog.pick` computed.
    """
    steps: list[dict[str, Any]] = []
    s = code.k - k
    n_mid = code.n
    if s > 0:
        pivots = [int(np.flatnonzero(r)[0]) for r in code.rref_generator]
        steps.append({"op": "shorten", "coords": sorted(pivots[-s:])})
        n_mid -= s
    m = n - n_mid
    if m < 0:
        steps.append({"op": "puncture", "coords": list(range(n_mid + m, n_mid))})
    elif m > 0:
        if d_lower % 2:
            steps.append({"op": "extend"})
            m -= 1
        if m:
            steps.append({"op": "append-zeros", "count": m})
    return steps


# ------------------------------------------------------------------ the closed form
def _reach_d(N0, K0, L0, n: int, k: int):
    """Proved d of the best derived ``[n, k]`` code from each entry (0 where none)."""
    s = K0 - k
    m = n - (N0 - s)
    d = np.where(m <= 0, L0 + m, L0 + (L0 % 2))
    ok = (s >= 0) & (d >= 1) & (k >= 1) & (k <= n)
    return np.where(ok, d, 0)


def _reach_n(N0, K0, L0, k: int, d: int):
    """Least length of a derived ``[., k, >= d]`` code from each entry (huge where none)."""
    s = K0 - k
    big = np.iinfo(np.int64).max
    n = np.where(L0 >= d, N0 - s - (L0 - d), np.where((L0 % 2 == 1) & (L0 + 1 == d),
                                                      N0 - s + 1, big))
    return np.where(s >= 0, n, big)


def _reach_k(N0, K0, L0, n: int, d: int):
    """Greatest dimension of a derived ``[n, ., >= d]`` code from each entry (0 where none)."""
    r = N0 - n
    p = np.minimum(np.maximum(r, 0), np.maximum(L0 - d, 0))
    kk = np.where(r <= 0, K0, K0 - (r - p))
    ok = (L0 >= d) | ((L0 % 2 == 1) & (L0 + 1 == d) & (r < 0))
    return np.where(ok & (kk >= 1), kk, 0)


# ------------------------------------------------------------------ entries
class Entry:
    """A catalog entry, stored or derived from a stored one by the propagation rules.

    Attributes
    ----------
    id : int or None
        The entry's id; None for a derived answer (see :attr:`base_id`).
    n, k : int
    d : int
        A lower bound on the minimum distance (proved here when :attr:`provenance` is
        ``proved``, else only claimed); the minimum distance itself when :attr:`proved`.
    d_lower, d_upper : int or None
        The interval (``d_upper`` is None for a derived answer).
    closed : bool
        True when the interval is one value.
    proved : bool
        True when ``d`` is the exact minimum distance **proved by this installation**
        (closed interval and ``provenance.kind == "proved"``).
    provenance : Provenance
        How the interval is known; a derived answer has its base entry's kind.
    recipes : list of dict
        Each ``{"source", "recipe", "seed", "permutation", "added", "gf2codes"}``.
    derived_from : str or None
        None for a stored entry; for a derived answer, a description such as
        ``"entry 12 [24, 12, 8]: shorten 2, puncture 1"``.
    base_id : int or None
        The stored entry a derived answer comes from (its own id for a stored one).
    steps : list of dict
        The derivation steps applied to the base entry's generator (empty if stored).
    weights, invariant, proof, added_at, added_by, origin
        As stored (None for a derived answer).
    """

    def __init__(self, *, id: int | None, n: int, k: int, d_lower: int,  # noqa: A002
                 d_upper: int | None, recipes: list[dict[str, Any]],
                 generator: np.ndarray | None = None, base: Entry | None = None,
                 steps: list[dict[str, Any]] | None = None, weights: list[int] | None = None,
                 invariant: str | None = None, proof: dict[str, Any] | None = None,
                 added_at: str | None = None, added_by: str | None = None,
                 origin: str | None = None, provenance: Provenance | None = None) -> None:
        self.id = id
        self.n, self.k = n, k
        self.d_lower, self.d_upper = d_lower, d_upper
        self.d = d_lower
        if base is not None:
            kind = base.provenance.kind
            provenance = (Provenance("proved", route=f"propagation rules from entry {base.id}")
                          if kind == "proved" else
                          Provenance(kind, route=base.provenance.route,
                                     source=f"entry {base.id}, "
                                            f"{base.provenance.describe()}"))
        self.provenance: Provenance = provenance or _CLAIMED_BEFORE
        self.closed = d_upper is not None and d_lower == d_upper
        self.proved = self.closed and self.provenance.proved
        self.recipes = recipes
        self.weights, self.invariant, self.proof = weights, invariant, proof
        self.added_at, self.added_by, self.origin = added_at, added_by, origin
        self._generator = generator
        self._base = base
        self.steps = list(steps or [])
        self.base_id = base.id if base is not None else id
        self._code: Code | None = None
        if base is None:
            self.derived_from = None
        else:
            ops = ", ".join(_describe_step(s) for s in self.steps) or "unchanged"
            what = (f"[{base.n}, {base.k}, {base.d}]" if base.proved
                    else f"[{base.n}, {base.k}], d ≥ {base.d}")
            self.derived_from = f"entry {base.id} {what}: {ops}"

    @property
    def code(self) -> Code:
        """The code (a derived one is rebuilt from its recipe on first access).

        Its ``d_lower`` / ``d_upper`` (which every later proof trusts as proved) are set
        only when the entry's interval was proved here; a claimed entry's code has none.
        """
        if self._code is None:
            proved = self.provenance.proved
            if self._base is None:
                assert self._generator is not None  # an entry without a base has one
                recipe = next((r["recipe"] for r in self.recipes
                               if r.get("recipe") and r.get("permutation") is None
                               and r["source"] != "search"), None)
                self._code = Code.from_packed(
                    self._generator, self.n, recipe=recipe or None,
                    d_lower=self.d_lower if proved else None,
                    d_upper=self.d_upper if proved else None)
            else:
                from .derive import rebuild, recipe_of

                base = self._base.code.with_info(recipe=(), name=None, d_lower=None,
                                                 d_upper=None)
                start = recipe_of(base)
                self._code = rebuild(start + self.steps).with_info(
                    d_lower=self.d_lower if proved else None, d_upper=None,
                    name=f"from catalog entry {self._base.id}")
        return self._code

    def to_dict(self) -> dict[str, Any]:
        """A JSON-ready summary (the generator as 0/1 strings)."""
        from .formats import rows_to_strings

        return {
            "id": self.id, "n": self.n, "k": self.k, "d": self.d if self.proved else None,
            "d_lower": self.d_lower, "d_upper": self.d_upper, "proved": self.proved,
            "status": self.provenance.kind, "provenance": self.provenance.to_dict(),
            "derived_from": self.derived_from, "base_id": self.base_id, "steps": self.steps,
            "generator": rows_to_strings(self.code.rref_generator if self._base is None
                                         else self.code.G),
            "weights": self.weights, "invariant": self.invariant, "proof": self.proof,
            "recipes": self.recipes, "added": self.added_at, "gf2codes": self.added_by,
            "origin": self.origin,
        }

    def __repr__(self) -> str:
        dd = f"{self.d}" if self.closed else f">={self.d}"
        if not self.provenance.proved:
            dd += f" {self.provenance.kind}"
        tag = f" derived from {self.base_id}" if self.derived_from else ""
        return f"<Entry {self.id} [{self.n}, {self.k}, {dd}]{tag}>"


def _describe_step(step: Mapping[str, Any]) -> str:
    op = step["op"]
    if op in ("shorten", "puncture"):
        return f"{op} {len(step['coords'])}"
    if op == "append-zeros":
        count = step.get("count", 1)
        return f"{count} zero coordinate{'s' if count != 1 else ''} appended"
    return op


@dataclass
class ImportReport:
    """What :meth:`Catalog.import_records` did.

    ``added``: new entries; ``merged``: records that joined an existing entry (new
    recipes or a tighter interval); ``unchanged``: records already present in full;
    ``errors``: ``(line, message)`` for each line that was not imported.
    """

    added: int = 0
    merged: int = 0
    unchanged: int = 0
    errors: list[tuple[int, str]] = field(default_factory=list)
    #: Imported records by provenance: ``{"proved": 3, "checked": 1, "claimed": 0}``.
    status: dict[str, int] = field(default_factory=dict)


@dataclass(frozen=True)
class ProofOutcome:
    """What :meth:`Catalog.prove_claims` did to one entry.

    ``verdict`` is ``"proved"`` (the claim holds and d is proved here), ``"the claim was
    false"`` (the proved interval replaced it), ``"not settled"`` (the time ran out; the
    entry is still a claim) or ``"already proved"``; ``detail`` is the proof's summary.
    """

    id: int | None
    claimed_lower: int
    claimed_upper: int | None
    claimed: Provenance
    d_lower: int
    d_upper: int | None
    verdict: str
    detail: str = ""


# ------------------------------------------------------------------ records
def entry_record(entry: Entry, *, stamps: bool = True) -> dict[str, Any]:
    """The JSON-lines record of a stored entry (``stamps``: include dates, versions and the
    provenance). ``d`` is null unless d was proved here."""
    rec: dict[str, Any] = {
        "record": ENTRY_RECORD_KIND, "version": ENTRY_RECORD_VERSION,
        "n": entry.n, "k": entry.k, "d": entry.d if entry.proved else None,
        "d_lower": entry.d_lower, "d_upper": entry.d_upper,
        "generator": [row_to_hex(r) for r in entry.code.rref_generator],
        "weights": entry.weights, "invariant": entry.invariant, "proof": entry.proof,
    }
    recipes = []
    for r in entry.recipes:
        item = {"source": r["source"], "recipe": r["recipe"]}
        for key in ("seed", "permutation"):
            if r.get(key) is not None:
                item[key] = r[key]
        if stamps:
            item["added"], item["gf2codes"] = r["added"], r["gf2codes"]
        recipes.append(item)
    rec["recipes"] = recipes
    if stamps:
        rec["added"], rec["gf2codes"], rec["origin"] = (entry.added_at, entry.added_by,
                                                        entry.origin)
        # how this installation knew it; whoever imports the record treats it as a claim
        rec["provenance"] = entry.provenance.to_dict()
    return rec


@dataclass
class _Parsed:
    code: Code
    d_lower: int
    d_upper: int
    proved: bool
    weights: list[int] | None
    invariant: str | None
    proof: dict[str, Any] | None
    recipes: list[dict[str, Any]]
    added: str | None
    added_by: str | None
    origin: str | None


def _rows(obj: Any, n: int | None, source: str) -> np.ndarray:
    rows = obj.get("generator")
    if not isinstance(rows, list) or not rows or not all(isinstance(r, str) for r in rows):
        raise ParseError(f"{source}: 'generator' must be a non-empty list of strings.")
    if all(r.startswith("hex:") for r in rows):
        if not isinstance(n, int) or isinstance(n, bool) or n < 1:
            raise ParseError(f"{source}: hex rows need a positive integer 'n'.")
        try:
            return np.array([hex_to_row(r, n) for r in rows])
        except ParseError as exc:
            raise ParseError(str(exc).replace("<record>", source)) from None
    from .formats import parse_text_matrix

    if any(r.startswith("hex:") for r in rows):
        raise ParseError(f"{source}: mix of hex and 0/1 rows.")
    return parse_text_matrix("\n".join(rows), source=f"{source} (generator)")


@overload
def _pos_int(obj: Mapping[str, Any], key: str, source: str, *, null: Literal[False]) -> int: ...
@overload
def _pos_int(obj: Mapping[str, Any], key: str, source: str, *, null: bool = True) -> int | None: ...
def _pos_int(obj: Mapping[str, Any], key: str, source: str, *, null: bool = True) -> int | None:
    v = obj.get(key)
    if v is None and null:
        return None
    if isinstance(v, bool) or not isinstance(v, int) or v < 1:
        raise ParseError(f"{source}: {key!r} must be a positive integer"
                         f"{' or null' if null else ''}, not {v!r}.")
    return v


def parse_entry_record(obj: Any, source: str = "<record>") -> _Parsed:
    """Check and read one record (a catalog entry or a plain ``gf2codes/code`` record).

    Raises
    ------
    ParseError
        Naming ``source`` and what is wrong.
    """
    from .formats import RECORD_KIND, record_to_code

    if not isinstance(obj, dict):
        raise ParseError(f"{source}: a record must be a JSON object.")
    kind = obj.get("record")
    if kind == RECORD_KIND:
        rec = record_to_code(obj, source)
        d = _pos_int(obj, "d", source)
        lo = d if d is not None else _pos_int(obj, "d_lower", source)
        hi = d if d is not None else _pos_int(obj, "d_upper", source)
        if lo is None:
            raise ParseError(f"{source}: the record states neither 'd' nor 'd_lower'.")
        recipe = list(rec.code.recipe)
        return _Parsed(rec.code, lo, hi or lo, d is not None or lo == hi, None, None, None,
                       [{"source": "import", "recipe": recipe or None}], None, None, None)
    if kind != ENTRY_RECORD_KIND:
        raise ParseError(f"{source}: 'record' must be {ENTRY_RECORD_KIND!r} or "
                         f"{RECORD_KIND!r}, not {kind!r}.")
    version = obj.get("version", ENTRY_RECORD_VERSION)
    if not isinstance(version, int) or version > ENTRY_RECORD_VERSION:
        raise ParseError(f"{source}: record version {version!r} is newer than this gf2codes "
                         f"understands ({ENTRY_RECORD_VERSION}); upgrade gf2codes.")
    n = _pos_int(obj, "n", source, null=False)
    k = _pos_int(obj, "k", source, null=False)
    try:
        code = Code(_rows(obj, n, source))
    except ParameterError as exc:
        raise ParseError(f"{source}: {exc}") from None
    if (code.n, code.k) != (n, k):
        raise ParseError(f"{source}: the record says [n, k] = [{n}, {k}] but its generator "
                         f"gives [{code.n}, {code.k}].")
    d = _pos_int(obj, "d", source)
    lo = _pos_int(obj, "d_lower", source)
    hi = _pos_int(obj, "d_upper", source)
    lo = lo if lo is not None else d
    hi = hi if hi is not None else d
    if lo is None or hi is None:
        raise ParseError(f"{source}: the record must state 'd' or both 'd_lower' and "
                         "'d_upper'.")
    if d is not None and not lo == d == hi:
        raise ParseError(f"{source}: 'd' = {d} disagrees with d_lower = {lo}, d_upper = {hi}.")
    if lo > hi:
        raise ParseError(f"{source}: d_lower = {lo} exceeds d_upper = {hi}.")
    weights = obj.get("weights")
    if weights is not None and (not isinstance(weights, list) or len(weights) != n + 1
                                or not all(isinstance(a, int) and a >= 0 for a in weights)
                                or sum(weights) != 1 << k):
        raise ParseError(f"{source}: 'weights' must be {n + 1} counts summing to 2^{k}.")
    recipes = obj.get("recipes") or []
    if not isinstance(recipes, list) or not all(
            isinstance(r, dict) and isinstance(r.get("source"), str) for r in recipes):
        raise ParseError(f"{source}: 'recipes' must be a list of objects with a 'source'.")
    for r in recipes:
        steps = r.get("recipe")
        if steps is not None and (not isinstance(steps, list)
                                  or not all(isinstance(s, dict) for s in steps)):
            raise ParseError(f"{source}: a recipe must be a list of steps (objects).")
        perm = r.get("permutation")
        if perm is not None and (not isinstance(perm, list) or sorted(perm) != list(range(n))):
            raise ParseError(f"{source}: a recipe's 'permutation' must be a permutation of "
                             f"0..{n - 1}.")
    invariant = obj.get("invariant")
    proof = obj.get("proof")
    return _Parsed(code, lo, hi, lo == hi, weights,
                   invariant if isinstance(invariant, str) else None,
                   proof if isinstance(proof, dict) else None,
                   [dict(r) for r in recipes] or [{"source": "import", "recipe": None}],
                   obj.get("added"), obj.get("gf2codes"), obj.get("origin"))


def _trusted_facts(rec: _Parsed, where: str, source: str) -> tuple[CodeFacts, Provenance]:
    """The cheap checks of a trusted record; its facts and how its interval is known.

    Raises :class:`ParseError` (naming ``where``) when the record contradicts itself or a
    check. The weight distribution is computed when cheap, which proves d here; otherwise
    a short information-set search looks for a codeword lighter than the claim, and the
    record is stored as a checked claim. Stated weights that were not recomputed are not
    stored (they are claims too).
    """
    from .weights import macwilliams_transform, weight_distribution

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
    trusted = rec.invariant is not None and (rec.invariant.startswith(_INVARIANT_SCHEME + ":")
                                             or rec.invariant.startswith("coarse:"))
    weights: list[int] | None = None
    if k == n:
        weights = [math.comb(n, i) for i in range(n + 1)]
    elif (1 << min(k, n - k)) <= _CHEAP_WEIGHT_WORDS:
        weights = [int(a) for a in weight_distribution(code, max_codewords=None)]
    if trusted:
        side = "coarse" if rec.invariant.startswith("coarse:") else "trusted"  # type: ignore[union-attr]
        facts = CodeFacts(_subspace_digest(code), weights, rec.invariant, side)  # type: ignore[arg-type]
    else:
        facts = code_facts(code)
        weights = facts.weights if weights is None else weights
    if weights is not None:
        if rec.weights is not None and rec.weights != weights:
            raise ParseError(f"{where}: the stated weight distribution is not the code's ("
                             + _first_difference(rec.weights, weights) + ").")
        true_d = next(i for i, a in enumerate(weights) if i and a)
        if not rec.d_lower <= true_d <= rec.d_upper:
            raise ParseError(f"{where}: the record states {rec.d_lower} <= d <= "
                             f"{rec.d_upper}, but the code's weight distribution (computed "
                             f"here) gives d = {true_d}.")
        rec.d_lower = rec.d_upper = true_d
        rec.proved = True
        return facts, Provenance.proved_here("weight distribution")
    from .distance import distance_upper_bound

    isd = distance_upper_bound(code, iterations=_CHEAP_ISD_ITERATIONS, seed=0)
    if isd.upper < rec.d_lower:
        raise ParseError(f"{where}: the record states d >= {rec.d_lower}, but the code has a "
                         f"codeword of weight {isd.upper} (found by an information-set "
                         "search here).")
    checks.append(f"no codeword lighter than {rec.d_lower} in {_CHEAP_ISD_ITERATIONS} random "
                  "information sets")
    return facts, Provenance("checked", route="; ".join(checks), at=_now(), by=__version__,
                             source=source)


# ------------------------------------------------------------------ the store
def open_catalog(path: str | os.PathLike[str] | None = None, *, shipped: bool = True,
                 create: bool = True) -> Catalog:
    """Open (creating if needed) the catalog at ``path`` or at :func:`default_catalog_path`.

    A catalog file this process may not write is opened read-only: reading works, and
    every write raises :class:`CatalogError` saying why (:attr:`Catalog.readonly`).
    ``path=":memory:"`` opens a private catalog in memory (nothing is written to disk).

    Parameters
    ----------
    path : path-like, optional
    shipped : bool
        When the file is created, import the shipped seed records into it.
    create : bool
        With False, a missing catalog raises :class:`CatalogError` and nothing (no file,
        no folder) is created.

    Raises
    ------
    CatalogError
        If the file is not a catalog, is of a newer schema, cannot be opened, or (with
        ``create=False``) does not exist.
    """
    return Catalog(default_catalog_path() if path is None else Path(path), shipped=shipped,
                   create=create)


class Catalog:
    """An open catalog (use :func:`open_catalog`). Also a context manager.

    Every method that writes does so in one transaction: a crash or a kill leaves the
    catalog as it was before the call or after it, never in between.
    """

    def __init__(self, path: str | os.PathLike[str], *, shipped: bool = True,
                 create: bool = True) -> None:
        self.path = Path(path)
        #: True when this process may not write the catalog file.
        self.readonly = False
        self._memory = str(path) == ":memory:"
        if not create and not self._memory and not self.path.exists():
            raise CatalogError(f"{self.path}: no catalog there (nothing was created).")
        self._con = self._connect()
        self._arrays: tuple[np.ndarray, ...] | None = None
        self._arrays_version: tuple[Any, Any] | None = None
        self._init_schema(shipped)

    # ---------------------------------------------------------------- opening
    def _connect(self) -> sqlite3.Connection:
        p = self.path
        if self._memory:
            return sqlite3.connect(":memory:", isolation_level=None)
        if p.is_dir():
            raise CatalogError(f"{p}: is a folder, not a catalog file.")
        if p.exists() and p.stat().st_size:
            with open(p, "rb") as fh:
                head = fh.read(16)
            if head != b"SQLite format 3\x00":
                raise CatalogError(f"{p}: not a gf2codes catalog (not an SQLite database).")
            if not (os.access(p, os.W_OK) and os.access(p.parent, os.W_OK | os.X_OK)):
                return self._connect_readonly()
        else:
            try:
                p.parent.mkdir(parents=True, exist_ok=True)
            except OSError as exc:
                raise CatalogError(f"{p}: cannot create the catalog's folder ({exc}).") from None
        try:
            con = sqlite3.connect(str(p), timeout=_BUSY_SECONDS, isolation_level=None)
            con.execute(f"PRAGMA busy_timeout = {int(_BUSY_SECONDS * 1000)}")
            _set_wal(con)
            con.execute("PRAGMA synchronous = FULL")
            con.execute("PRAGMA foreign_keys = ON")
        except sqlite3.OperationalError as exc:
            if "readonly" in str(exc) and p.exists():
                return self._connect_readonly()
            raise CatalogError(f"{p}: cannot open the catalog ({exc}).") from None
        except sqlite3.DatabaseError as exc:
            raise CatalogError(f"{p}: not a usable gf2codes catalog ({exc}).") from None
        return con

    def _connect_readonly(self) -> sqlite3.Connection:
        """Open a catalog this process may not write: read-only and immutable (no -shm or
        -wal file is needed, so a read-only folder works too)."""
        from urllib.parse import quote

        self.readonly = True
        uri = f"file:{quote(str(self.path.resolve()))}?mode=ro&immutable=1"
        try:
            return sqlite3.connect(uri, uri=True, isolation_level=None)
        except sqlite3.DatabaseError as exc:
            raise CatalogError(f"{self.path}: cannot open the catalog ({exc}).") from None

    def require_writable(self, what: str = "change it") -> None:
        """Raise :class:`CatalogError` when the catalog is read-only for this process."""
        if self.readonly:
            raise CatalogError(f"{self.path}: the catalog is read-only for this user (no write "
                               f"permission on the file or its folder), so gf2codes cannot "
                               f"{what}. Reading it works.")

    def _init_schema(self, shipped: bool) -> None:
        con = self._con
        try:
            app = con.execute("PRAGMA application_id").fetchone()[0]
            version = con.execute("PRAGMA user_version").fetchone()[0]
        except sqlite3.DatabaseError as exc:
            self._con.close()
            raise CatalogError(f"{self.path}: not a usable gf2codes catalog ({exc}).") from None
        if app == APPLICATION_ID and version == SCHEMA_VERSION:
            return
        if self.readonly and app == APPLICATION_ID and version < SCHEMA_VERSION:
            self._con.close()
            raise CatalogError(f"{self.path}: catalog schema version {version} must be upgraded "
                               f"to {SCHEMA_VERSION} before use, but the file is read-only for "
                               "this user; open it once with write permission.")
        with self._write() as cur:
            app = cur.execute("PRAGMA application_id").fetchone()[0]
            version = cur.execute("PRAGMA user_version").fetchone()[0]
            tables = cur.execute("SELECT count(*) FROM sqlite_master").fetchone()[0]
            fresh = app == 0 and version == 0 and tables == 0
            if not fresh and app != APPLICATION_ID:
                raise CatalogError(f"{self.path}: an SQLite database, but not a gf2codes "
                                   "catalog.")
            if version > SCHEMA_VERSION:
                raise CatalogError(
                    f"{self.path}: catalog schema version {version} is newer than this "
                    f"gf2codes ({__version__}) understands ({SCHEMA_VERSION}); upgrade gf2codes."
                )
            for v in range(version, SCHEMA_VERSION):
                for statement in MIGRATIONS[v]:
                    cur.execute(statement)
            cur.execute(f"PRAGMA application_id = {APPLICATION_ID}")
            cur.execute(f"PRAGMA user_version = {SCHEMA_VERSION}")
            if fresh:
                cur.execute("INSERT INTO meta VALUES ('created', ?), ('created_by', ?)",
                            (_now(), __version__))
                if shipped:
                    self._import_shipped(cur)
            else:
                cur.execute("INSERT OR REPLACE INTO meta VALUES ('migrated', ?)",
                            (f"{version}->{SCHEMA_VERSION} by {__version__} at {_now()}",))

    @contextlib.contextmanager
    def _write(self) -> Iterator[sqlite3.Cursor]:
        self.require_writable("write to it")
        cur = self._con.cursor()
        try:
            cur.execute("BEGIN IMMEDIATE")
        except sqlite3.OperationalError as exc:
            raise CatalogError(f"{self.path}: cannot write ({exc}).") from None
        try:
            yield cur
        except sqlite3.OperationalError as exc:
            cur.execute("ROLLBACK")
            if "readonly" in str(exc):
                self.readonly = True
                self.require_writable("write to it")
            raise CatalogError(f"{self.path}: cannot write ({exc}).") from None
        except BaseException:
            cur.execute("ROLLBACK")
            raise
        else:
            try:
                cur.execute("COMMIT")
            except sqlite3.OperationalError as exc:
                cur.execute("ROLLBACK")
                raise CatalogError(f"{self.path}: cannot write ({exc}).") from None
        finally:
            self._arrays = None

    def close(self) -> None:
        """Close the database connection."""
        if self._con is not None:
            self._con.close()
            self._con = None  # type: ignore[assignment]

    def __enter__(self) -> Catalog:
        return self

    def __exit__(self, *exc: object) -> None:
        self.close()

    # ---------------------------------------------------------------- reading
    def _row_entry(self, row: sqlite3.Row | tuple) -> Entry:
        (eid, n, k, lo, hi, gen, weights, inv, proof, added, by, origin, prov) = row
        words = linalg.words_for(n)
        generator = np.frombuffer(gen, dtype="<u8").astype(np.uint64).reshape(-1, words)
        return Entry(id=eid, n=n, k=k, d_lower=lo, d_upper=hi, recipes=self._recipes(eid),
                     generator=generator, weights=None if weights is None else
                     json.loads(weights), invariant=inv,
                     proof=None if proof is None else json.loads(proof), added_at=added,
                     added_by=by, origin=origin, provenance=_read_provenance(prov))

    _COLUMNS = ("id, n, k, d_lower, d_upper, generator, weights, invariant, proof, added_at, "
                "added_by, origin, provenance")

    def _recipes(self, eid: int) -> list[dict[str, Any]]:
        out = []
        for source, steps, seed, perm, added, by in self._con.execute(
                "SELECT source, steps, seed, permutation, added_at, added_by FROM recipe "
                "WHERE entry_id = ? ORDER BY id", (eid,)):
            out.append({"source": source, "recipe": None if steps is None else json.loads(steps),
                        "seed": seed, "permutation": None if perm is None else json.loads(perm),
                        "added": added, "gf2codes": by})
        return out

    def get(self, entry_id: int) -> Entry:
        """The stored entry with this id.

        Raises
        ------
        CatalogError
            If there is none.
        """
        entry_id = check_int("id", entry_id, minimum=1)
        if entry_id > _MAX_SQL_INT:
            raise CatalogError(f"{self.path}: no entry with id {entry_id}.")
        row = self._con.execute(f"SELECT {self._COLUMNS} FROM entry WHERE id = ?",
                                (entry_id,)).fetchone()
        if row is None:
            raise CatalogError(f"{self.path}: no entry with id {entry_id}.")
        return self._row_entry(row)

    def __len__(self) -> int:
        return self._con.execute("SELECT count(*) FROM entry").fetchone()[0]

    def entries(self, *, n: Any = None, k: Any = None, d: Any = None,
                origin: str | None = None) -> list[Entry]:
        """Stored entries, filtered: each of ``n``, ``k``, ``d`` is an int, a range or a
        ``(low, high)`` pair (inclusive); ``d`` filters on the proved lower bound."""
        where: list[str] = []
        params: list[int | str] = []
        for col, val in (("n", n), ("k", k), ("d_lower", d)):
            if val is None:
                continue
            if isinstance(val, range):
                lo, hi = val.start, val.stop - 1
            elif isinstance(val, tuple):
                lo, hi = val
            else:
                lo = hi = check_int(col, val)
            where.append(f"{col} BETWEEN ? AND ?")
            params += [max(min(lo, _MAX_SQL_INT), -_MAX_SQL_INT),
                       max(min(hi, _MAX_SQL_INT), -_MAX_SQL_INT)]
        if origin is not None:
            where.append("origin = ?")
            params.append(origin)
        sql = f"SELECT {self._COLUMNS} FROM entry"
        if where:
            sql += " WHERE " + " AND ".join(where)
        sql += " ORDER BY n, k, d_lower DESC, id"
        return [self._row_entry(r) for r in self._con.execute(sql, params).fetchall()]

    def _load_arrays(self) -> tuple[np.ndarray, ...]:
        version = self._con.execute("PRAGMA data_version").fetchone()[0]
        total = self._con.execute("SELECT count(*), max(id) FROM entry").fetchone()
        key = (version, total)
        if self._arrays is None or self._arrays_version != key:
            rows = self._con.execute(
                "SELECT id, n, k, d_lower, d_upper, "
                "json_extract(provenance, '$.kind') = 'proved' FROM entry").fetchall()
            a = np.array(rows, dtype=np.int64).reshape(-1, 6)
            self._arrays = (a[:, 0], a[:, 1], a[:, 2], a[:, 3], a[:, 4], a[:, 5].astype(bool))
            self._arrays_version = key
        return self._arrays

    # ---------------------------------------------------------------- queries
    def _choose(self, ids, N0, K0, L0, U0, P0, dvals, n: int, k: int) -> Entry | None:
        mask = dvals > 0
        if not mask.any():
            return None
        best_d = dvals[mask].max()
        cand = np.flatnonzero(dvals == best_d)
        stored = (N0[cand] == n) & (K0[cand] == k)
        cost = np.abs(K0[cand] - k) + np.abs(N0[cand] - n)
        exact = L0[cand] == U0[cand]
        # a proof made here wins over a claim of the same d
        order = np.lexsort((ids[cand], ~exact, cost, ~stored, ~P0[cand]))
        i = int(cand[order[0]])
        base = self.get(int(ids[i]))
        if stored[order[0]]:
            return base
        steps = derivation_steps(base.code, n=n, k=k, d_lower=base.d_lower)
        return Entry(id=None, n=n, k=k, d_lower=int(best_d), d_upper=None,
                     recipes=[], base=base, steps=steps)

    def pick(self, *, n: int | None = None, k: int | None = None,
             d: int | None = None, claims: bool = True) -> Entry | None:
        """The code on file that answers two of ``n``, ``k``, ``d`` (stored or derived).

        * ``k`` and ``d``: the shortest code of dimension ``k`` with distance at least
          ``d`` (among equally short ones, the greatest ``d``);
        * ``n`` and ``k``: the greatest ``d``;
        * ``n`` and ``d``: the greatest ``k`` (then the greatest ``d``).

        A stored entry wins over a derived one of the same parameters, and an entry proved
        here over a claim. With ``claims=False`` only entries proved here count. The
        answer's :attr:`Entry.provenance` says whether its d is proved or only claimed (a
        derived answer inherits its base entry's). Returns None when the catalog has
        nothing that qualifies.
        """
        given = {key for key, v in (("n", n), ("k", k), ("d", d)) if v is not None}
        if len(given) != 2:
            raise ParameterError("Give exactly two of 'n', 'k' and 'd', not "
                                 f"{', '.join(sorted(given)) or 'none'}.")
        ids, N0, K0, L0, U0, P0 = self._load_arrays()
        if not claims:
            ids, N0, K0, L0, U0, P0 = (a[P0] for a in (ids, N0, K0, L0, U0, P0))
        if ids.size == 0:
            return None
        if n is None:
            k = check_int("k", k, minimum=1)
            d = check_int("d", d, minimum=1)
            lengths = _reach_n(N0, K0, L0, k, d)
            n_best = int(lengths.min())
            if n_best == np.iinfo(np.int64).max:
                return None
            n = n_best
        elif k is None:
            n = check_int("n", n, minimum=1)
            d = check_int("d", d, minimum=1)
            dims = _reach_k(N0, K0, L0, n, d)
            if dims.max() < 1:
                return None
            k = int(dims.max())
        n = check_int("n", n, minimum=1)
        k = check_int("k", k, minimum=1, maximum=n)
        return self._choose(ids, N0, K0, L0, U0, P0, _reach_d(N0, K0, L0, n, k), n, k)

    def length_table(self, dimensions: Iterable[int], distances: Iterable[int]
                     ) -> list[dict[str, Any]]:
        """The shortest length on file for every ``k`` in ``dimensions`` and ``d`` in
        ``distances``, beside the least length the bounds allow.

        Each row, in order of ``k`` then ``d``::

            {"k", "d", "n", "entry", "stored", "d_proved", "n_least", "least_by", "gap",
             "claimed_n"}

        ``n`` is the least length of a stored or derived ``[n, k, >= d]`` code (None when
        the catalog has none), ``entry`` the stored entry it is (or is derived from),
        ``stored`` whether it is that entry itself, ``d_proved`` whether that entry's
        distance is proved exactly; ``n_least`` and ``least_by`` are
        :func:`gf2codes.bounds.least_length`; ``gap = n - n_least`` (0: the length on file
        is proved shortest; None when nothing is on file). Only entries proved here count;
        ``claimed_n`` is the shorter length that a claimed (unproved) entry states, or None.
        """
        from .bounds import least_length

        ids_all, N_all, K_all, L_all, _, P_all = self._load_arrays()
        ids, N0, K0, L0, U0, _ = (a[P_all] for a in self._load_arrays())
        big = np.iinfo(np.int64).max
        rows = []
        for k in dimensions:
            k = check_int("k", k, minimum=1)
            for d in distances:
                d = check_int("d", d, minimum=1)
                least = least_length(k, d)
                row: dict[str, Any] = {"k": k, "d": d, "n": None, "entry": None,
                                       "stored": False, "d_proved": False,
                                       "n_least": least.n, "least_by": least.by, "gap": None,
                                       "claimed_n": None}
                lengths = _reach_n(N0, K0, L0, k, d) if ids.size else np.zeros(0, np.int64)
                claimed = (int(_reach_n(N_all, K_all, L_all, k, d).min()) if ids_all.size
                           else big)
                proved_n = int(lengths.min()) if lengths.size else big
                if claimed < proved_n:
                    row["claimed_n"] = claimed
                if lengths.size and int(lengths.min()) != big:
                    n = int(lengths.min())
                    cand = np.flatnonzero(lengths == n)
                    here = cand[(N0[cand] == n) & (K0[cand] == k)]
                    pick = int(here[0] if here.size else cand[0])
                    row.update(n=n, entry=int(ids[pick]), stored=bool(here.size),
                               d_proved=bool(L0[pick] == U0[pick]), gap=n - least.n)
                rows.append(row)
        return rows

    def distance_table(self, lengths: Iterable[int]) -> list[dict[str, Any]]:
        """For every ``n`` in ``lengths`` and ``1 <= k <= n``: the greatest proved ``d`` on
        file (stored or derived, 0 when none), whether it is stored, and the best upper
        bound. (The command line shows :meth:`length_table` instead.)

        Each row: ``{"n", "k", "d", "exact", "stored", "entry", "bound", "bound_by",
        "meets_bound", "claimed_d"}``; ``entry`` is the stored id or the base id of a
        derived value. ``d`` counts only entries proved here; ``claimed_d`` is the greater
        d that a claimed (unproved) entry states, or None.
        """
        from .bounds import best_upper

        ids_all, N_all, K_all, L_all, _, P_all = self._load_arrays()
        ids, N0, K0, L0, U0, _ = (a[P_all] for a in self._load_arrays())
        rows = []
        for n in lengths:
            n = check_int("n", n, minimum=1)
            for k in range(1, n + 1):
                dv = _reach_d(N0, K0, L0, n, k) if ids.size else np.zeros(0, np.int64)
                dc = (_reach_d(N_all, K_all, L_all, n, k) if ids_all.size
                      else np.zeros(0, np.int64))
                ub = best_upper(n, k)
                claimed = int(dc.max()) if dc.size else 0
                row = {"n": n, "k": k, "d": 0, "exact": False, "stored": False,
                       "entry": None, "bound": ub.d, "bound_by": ub.by, "meets_bound": False,
                       "claimed_d": claimed if claimed > (int(dv.max()) if dv.size else 0)
                       else None}
                if dv.size and dv.max() > 0:
                    best = int(dv.max())
                    cand = np.flatnonzero(dv == best)
                    here = cand[(N0[cand] == n) & (K0[cand] == k)]
                    pick = int(here[0] if here.size else cand[0])
                    row.update(d=best, stored=bool(here.size), entry=int(ids[pick]),
                               exact=bool(here.size and L0[pick] == U0[pick]),
                               meets_bound=best >= ub.d)
                rows.append(row)
        return rows

    # ---------------------------------------------------------------- writing
    def add(self, code: Code, *, d: int, proved: bool = True,
            recipe: Sequence[Mapping[str, Any]] | None = None, source: str = "search",
            seed: int | None = None, d_upper: int | None = None,
            proof: Mapping[str, Any] | None = None, claimed_by: str | None = None) -> int:
        """Store ``code`` (or merge it into an equivalent entry) and return the entry id.

        Parameters
        ----------
        code : Code
        d : int
            The proved minimum distance, or (``proved=False``) a proved lower bound.
        proved : bool
            Whether ``d`` is the exact minimum distance.
        recipe : list of dict, optional
            How the code was made (default: ``code.recipe``).
        source : str
            ``"search"``, ``"family"``, ``"derivation"``, ``"file"``, ``"import"``...
        seed : int, optional
            The seed of a search.
        d_upper : int, optional
            With ``proved=False``: the weight of a codeword found (default: the best
            upper bound of :mod:`gf2codes.bounds`).
        proof : dict, optional
            How d was proved (method, seconds...), kept with the entry.
        claimed_by : str, optional
            Store ``d`` (and ``d_upper``) as a claim of this source instead of a proof:
            the entry reads "claimed" until :meth:`prove_claims` proves it. Without it the
            caller asserts that it proved the interval in this installation (a computed
            weight distribution proves d either way).

        Raises
        ------
        ParameterError
            If ``d`` contradicts the code's weight distribution (when computed).
        CatalogError
            If it contradicts what the catalog proved about an equivalent code.
        """
        return self._add(code, d=d, proved=proved, recipe=recipe, source=source, seed=seed,
                         d_upper=d_upper, proof=proof, claimed_by=claimed_by)[0]

    def _add(self, code: Code, *, d: int, proved: bool, recipe, source: str, seed, d_upper,
             proof, claimed_by: str | None = None) -> tuple[int, str]:
        """:meth:`add`, also returning ``"added"``, ``"merged"`` or ``"unchanged"``."""
        if not isinstance(code, Code):
            raise ParameterError(f"Argument 'code' must be a Code, not {type(code).__name__}.")
        d = check_int("d", d, minimum=1, maximum=code.n)
        facts = code_facts(code)
        lo, hi, proof_d, prov = self._interval(code, facts, d, proved, d_upper, proof,
                                               claimed_by)
        steps = list(recipe) if recipe is not None else (list(code.recipe) or None)
        item = {"source": source, "recipe": steps, "seed": seed}
        with self._write() as cur:
            return self._store(cur, code, facts, lo, hi, proof_d, [item], None, None, "user",
                               prov)

    @staticmethod
    def _interval(code: Code, facts: CodeFacts, d: int, proved: bool, d_upper: int | None,
                  proof: Mapping[str, Any] | None, claimed_by: str | None = None
                  ) -> tuple[int, int, dict | None, Provenance]:
        from .bounds import best_upper

        true_d = facts.d
        if true_d is not None:
            if (proved and d != true_d) or d > true_d:
                raise ParameterError(
                    f"Argument 'd' is {d}{'' if proved else ' (a lower bound)'}, but the "
                    f"weight distribution of this [{code.n}, {code.k}] code gives d = {true_d}."
                )
            method = dict(proof) if proof else {}
            method.setdefault("method", "weight distribution")
            return true_d, true_d, method, Provenance.proved_here("weight distribution")
        seconds = proof.get("seconds") if proof else None
        if claimed_by is not None:
            hi = d if proved else (d_upper if d_upper is not None
                                   else best_upper(code.n, code.k).d)
            return (d, check_int("d_upper", hi, minimum=d), dict(proof) if proof else None,
                    Provenance("claimed", source=claimed_by))
        route = str(proof.get("method")) if proof and proof.get("method") else \
            "proved by the caller"
        prov = Provenance.proved_here(route, seconds if isinstance(seconds, (int, float))
                                      else None)
        if proved:
            return d, d, dict(proof) if proof else {"method": route}, prov
        hi = d_upper if d_upper is not None else best_upper(code.n, code.k).d
        hi = check_int("d_upper", hi, minimum=d)
        return d, hi, dict(proof) if proof else None, prov

    def _find(self, cur: sqlite3.Cursor, code: Code, facts: CodeFacts
              ) -> tuple[int | None, list[int] | None]:
        row = cur.execute("SELECT id FROM entry WHERE subspace = ?", (facts.subspace,)).fetchone()
        if row:
            return row[0], None
        if facts.side == "coarse":
            return None, None
        for (eid, gen, n) in cur.execute(
                "SELECT id, generator, n FROM entry WHERE invariant = ? ORDER BY id",
                (facts.invariant,)).fetchall():
            if facts.side == "trusted":  # read from a record: compute the graph now
                facts = code_facts(code)
            other = Code.from_packed(np.frombuffer(gen, dtype="<u8").astype(np.uint64)
                                     .reshape(-1, linalg.words_for(n)), n)
            result = are_equivalent(code, other, facts_a=facts)
            if result.equivalent:
                return eid, result.permutation
        return None, None

    def _store(self, cur: sqlite3.Cursor, code: Code, facts: CodeFacts, lo: int, hi: int,
               proof: dict | None, recipes: list[dict[str, Any]], added: str | None,
               added_by: str | None, origin: str, prov: Provenance) -> tuple[int, str]:
        """Insert or merge inside the open transaction; return (id, "added"/"merged"/...).

        Merging follows the trust boundary: a proof made here replaces a claim (and a
        claim that contradicts it was false); a claim never changes a proved interval
        (one that contradicts it is refused); two proofs, or two claims, intersect.
        """
        eid, perm = self._find(cur, code, facts)
        now = _now()
        status = "unchanged"
        if eid is None:
            rows = linalg.rref(code.packed_generator, n=code.n).sorted().rows
            cur.execute(
                "INSERT INTO entry (n, k, d_lower, d_upper, generator, subspace, weights, "
                "invariant, proof, added_at, added_by, origin, provenance) "
                "VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)",
                (code.n, code.k, lo, hi,
                 np.ascontiguousarray(rows, dtype="<u8").tobytes(), facts.subspace,
                 None if facts.weights is None else _dumps(facts.weights), facts.invariant,
                 None if proof is None else _dumps(proof), added or now,
                 added_by or __version__, origin, _dumps(prov.to_dict())))
            eid = cur.lastrowid
            assert eid is not None  # set by the INSERT
            status = "added"
        else:
            old_lo, old_hi, old_text, old_weights = cur.execute(
                "SELECT d_lower, d_upper, provenance, weights FROM entry WHERE id = ?",
                (eid,)).fetchone()
            old = _read_provenance(old_text)
            if prov.proved and not old.proved:
                new_lo, new_hi, new_prov = lo, hi, prov
            elif old.proved and not prov.proved:
                if max(lo, old_lo) > min(hi, old_hi):
                    raise CatalogError(
                        f"{self.path}: entry {eid} has {old_lo} <= d <= {old_hi} proved here, "
                        f"but the equivalent code being added is claimed to have {lo} <= d "
                        f"<= {hi}: the claim is false.")
                new_lo, new_hi, new_prov = old_lo, old_hi, old
            else:
                new_lo, new_hi = max(lo, old_lo), min(hi, old_hi)
                if new_lo > new_hi:
                    raise CatalogError(
                        f"{self.path}: entry {eid} has {old_lo} <= d <= {old_hi}, but the code "
                        f"being added (equivalent to it) was given {lo} <= d <= {hi}."
                    )
                new_prov = old
                if (new_lo, new_hi) != (old_lo, old_hi) and not prov.proved:
                    kind = "claimed" if "claimed" in (old.kind, prov.kind) else prov.kind
                    new_prov = Provenance(kind, route=prov.route, at=prov.at, by=prov.by,  # type: ignore[arg-type]
                                          source=" and ".join(
                                              x for x in (old.source, prov.source) if x))
                elif (new_lo, new_hi) != (old_lo, old_hi):
                    new_prov = prov
            if (new_lo, new_hi) != (old_lo, old_hi) or new_prov != old:
                cur.execute("UPDATE entry SET d_lower = ?, d_upper = ?, provenance = ? "
                            "WHERE id = ?", (new_lo, new_hi, _dumps(new_prov.to_dict()), eid))
                if new_prov is prov and proof is not None:
                    cur.execute("UPDATE entry SET proof = ? WHERE id = ?", (_dumps(proof), eid))
                status = "merged"
            if old_weights is None and facts.weights is not None:  # computed here
                cur.execute("UPDATE entry SET weights = ? WHERE id = ?",
                            (_dumps(facts.weights), eid))
        for item in recipes:
            p = item.get("permutation")
            if perm is not None:  # compose: recipe code -> this code -> stored generator
                p = [perm[j] for j in p] if p is not None else perm
            key = _dumps([item["source"], item.get("recipe"), item.get("seed"), p])
            fp = hashlib.sha256(key.encode()).hexdigest()[:32]
            cur.execute(
                "INSERT OR IGNORE INTO recipe (entry_id, source, steps, seed, permutation, "
                "fingerprint, added_at, added_by) VALUES (?, ?, ?, ?, ?, ?, ?, ?)",
                (eid, item["source"], None if item.get("recipe") is None
                 else _dumps(item["recipe"]), item.get("seed"),
                 None if p is None else _dumps(p), fp, item.get("added") or now,
                 item.get("gf2codes") or __version__))
            if cur.rowcount and status == "unchanged":
                status = "merged"
        return eid, status

    def remove(self, entry_id: int) -> Entry:
        """Delete a stored entry and its recipes; return what was deleted.

        Raises
        ------
        CatalogError
            If there is no such entry.
        """
        entry = self.get(entry_id)
        with self._write() as cur:
            cur.execute("DELETE FROM entry WHERE id = ?", (entry.id,))
        return entry

    # ---------------------------------------------------------------- import / export
    def export(self, stream, *, stamps: bool = True, **filters: Any) -> int:
        """Write the (filtered) entries as JSON lines to a text stream; return the count."""
        count = 0
        for entry in self.entries(**filters):
            stream.write(json.dumps(entry_record(entry, stamps=stamps)) + "\n")
            count += 1
        return count

    def import_records(self, lines: Iterable[str], *, source: str = "<import>",
                       verify: bool = True, time_limit: float | None = 10.0,
                       origin: str = "user") -> ImportReport:
        """Import JSON-lines records; merges by equivalence, so importing twice adds nothing.

        Every good line is imported in one transaction; each bad line is reported in
        :attr:`ImportReport.errors` with its line number and not imported.

        What a record states is a claim. With ``verify`` it is re-proved here (the entry
        reads "proved"); without, it is *trusted*: it is still checked cheaply and stored
        as a claim (see :meth:`prove_claims`) unless a cheap check happens to prove it.

        Parameters
        ----------
        lines : iterable of str
        source : str
            A name for messages (the file name).
        verify : bool
            Re-prove each record: its weight distribution is recomputed (which proves d)
            when affordable, else d is re-proved by :func:`gf2codes.distance.minimum_distance`
            within ``time_limit`` seconds per record; a record whose claim is not confirmed
            is an error, and the proved interval is stored. With ``verify=False`` every
            cheap check still runs -- rank, ``n`` and ``k``, the stated weight distribution
            against the stated d and the MacWilliams identities, then the code's own weight
            distribution when ``2^min(k, n-k)`` is small (a proof) or else a short
            information-set search for a codeword lighter than the claim -- and a record
            that contradicts itself or a check is refused.
        """
        report = ImportReport()
        ready: list[tuple[int, _Parsed, CodeFacts, Provenance]] = []
        for lineno, line in enumerate(lines, start=1):
            if not line.strip():
                continue
            where = f"{source}, line {lineno}"
            try:
                try:
                    obj = json.loads(line)
                except json.JSONDecodeError as exc:
                    raise ParseError(f"{where}: not valid JSON ({exc.msg}).") from None
                except RecursionError:
                    raise ParseError(f"{where}: the JSON is nested too deeply.") from None
                rec = parse_entry_record(obj, where)
                facts, prov = self._facts_for_import(rec, where, verify, time_limit, source)
            except (ParseError, ParameterError) as exc:
                report.errors.append((lineno, str(exc)))
                continue
            ready.append((lineno, rec, facts, prov))
            report.status[prov.kind] = report.status.get(prov.kind, 0) + 1
        if ready:
            with self._write() as cur:
                self._store_all(cur, ready, report, origin)
        return report

    def _store_all(self, cur, ready, report: ImportReport, origin: str) -> None:
        for lineno, rec, facts, prov in ready:
            # the record's own "proof" is the source's word: kept, labelled, as a claim
            if prov.proved:
                rec.proof = {"method": prov.route, **({"seconds": prov.seconds}
                                                      if prov.seconds is not None else {})}
            elif rec.proof is not None and set(rec.proof) != {"claimed"}:
                rec.proof = {"claimed": rec.proof}
            try:
                _, status = self._store(cur, rec.code, facts, rec.d_lower, rec.d_upper,
                                        rec.proof, rec.recipes, rec.added, rec.added_by,
                                        rec.origin or origin, prov)
            except CatalogError as exc:
                report.errors.append((lineno, str(exc)))
                report.status[prov.kind] -= 1
                continue
            setattr(report, status, getattr(report, status) + 1)

    @staticmethod
    def _facts_for_import(rec: _Parsed, where: str, verify: bool,
                          time_limit: float | None, source: str
                          ) -> tuple[CodeFacts, Provenance]:
        code = rec.code
        if not verify:
            return _trusted_facts(rec, where, source)
        facts = code_facts(code)
        if rec.weights is not None and facts.weights is not None and rec.weights != facts.weights:
            raise ParseError(f"{where}: the stated weight distribution is not the code's ("
                             + _first_difference(rec.weights, facts.weights) + ").")
        if facts.d is not None:
            if not rec.d_lower <= facts.d <= rec.d_upper:
                raise ParseError(f"{where}: the record states {rec.d_lower} <= d <= "
                                 f"{rec.d_upper}, but the code has d = {facts.d}.")
            rec.d_lower = rec.d_upper = facts.d
            rec.proved = True
            return facts, Provenance.proved_here("weight distribution")
        from .distance import minimum_distance

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

    def import_shipped(self) -> ImportReport:
        """Import the shipped seed records (again): only what is missing is added."""
        report = ImportReport()
        with self._write() as cur:
            report = self._import_shipped(cur)
        return report

    def _import_shipped(self, cur: sqlite3.Cursor) -> ImportReport:
        report = ImportReport()
        folder = shipped_catalog_dir()
        if folder is None:
            return report
        for path in sorted(folder.glob("*.jsonl")):
            ready = []
            with open(path, encoding="utf-8") as fh:
                for lineno, line in enumerate(fh, start=1):
                    if not line.strip():
                        continue
                    where = f"{path}, line {lineno}"
                    try:
                        rec = parse_entry_record(json.loads(line), where)
                        facts, prov = _trusted_facts(
                            rec, where, f"the shipped seed of gf2codes {__version__}")
                    except (ParseError, ParameterError, json.JSONDecodeError) as exc:
                        raise CatalogError(f"the shipped catalog is damaged: {exc}") from None
                    ready.append((lineno, rec, facts, prov))
                    report.status[prov.kind] = report.status.get(prov.kind, 0) + 1
            self._store_all(cur, ready, report, "shipped")
        cur.execute("INSERT OR REPLACE INTO meta VALUES ('shipped_imported', ?)",
                    (f"{__version__} at {_now()}",))
        return report

    # ---------------------------------------------------------------- proving claims
    def prove_claims(self, ids: Iterable[int] | None = None, *,
                     time_limit: float | None = 10.0,
                     progress: Any = None) -> list[ProofOutcome]:
        """Prove the distance of claimed (and checked) entries here; upgrade them.

        Each entry gets :func:`gf2codes.distance.minimum_distance` with ``time_limit``
        seconds (None: no limit). What is proved replaces the claim: an exact d makes the
        entry "proved"; a proved interval that contradicts the claim replaces it too (the
        claim was false); an interval that does not settle the claim leaves the entry
        claimed. Each entry is written in its own transaction, so Ctrl-C keeps what was
        proved.

        Parameters
        ----------
        ids : iterable of int, optional
            The entries to prove (default: every entry that is not proved here).
        time_limit : float or None
            Seconds per entry.
        progress : callable, optional
            Called as ``progress(done, total, {"note": ...})`` after each entry.

        Returns
        -------
        list of ProofOutcome
        """
        from .distance import minimum_distance

        if time_limit is not None and not time_limit > 0:
            raise ParameterError(f"Argument 'time_limit' must be positive, not {time_limit}.")
        if ids is None:
            todo = [e for e in self.entries() if not e.provenance.proved]
        else:
            todo = [self.get(i) for i in ids]
        outcomes: list[ProofOutcome] = []
        for done, entry in enumerate(todo, start=1):
            before = (entry.d_lower, entry.d_upper, entry.provenance)
            if entry.provenance.proved:
                outcomes.append(ProofOutcome(entry.id, before[0], before[1], before[2],
                                             entry.d_lower, entry.d_upper, "already proved"))
                continue
            result = minimum_distance(entry.code, time_limit=time_limit, max_work=None)
            lo, hi = int(result.lower), int(result.upper)
            claimed_upper = entry.n if entry.d_upper is None else entry.d_upper
            contradicts = lo > claimed_upper or hi < entry.d_lower
            if result.exact or contradicts:
                prov = Provenance.proved_here(result.method, result.seconds)
                proof = {"method": result.method, "seconds": round(result.seconds, 3),
                         "codewords": int(result.codewords)}
                with self._write() as cur:
                    cur.execute("UPDATE entry SET d_lower = ?, d_upper = ?, provenance = ?, "
                                "proof = ? WHERE id = ?",
                                (lo, hi, _dumps(prov.to_dict()), _dumps(proof), entry.id))
                verdict = ("the claim was false" if contradicts else "proved")
            else:
                prov, verdict = entry.provenance, "not settled"
                lo, hi = entry.d_lower, claimed_upper
            outcomes.append(ProofOutcome(entry.id, before[0], before[1], before[2], lo, hi,
                                         verdict, result.describe()))
            if progress is not None:
                progress(done, len(todo), {"note": f"entry {entry.id}: {verdict}"})
        return outcomes

    # ---------------------------------------------------------------- health
    def check(self) -> list[str]:
        """``PRAGMA integrity_check``, ``foreign_key_check`` and every stored weight
        distribution against its entry's interval: an empty list when healthy."""
        problems = [r[0] for r in self._con.execute("PRAGMA integrity_check") if r[0] != "ok"]
        problems += [f"dangling recipe {r}" for r in self._con.execute("PRAGMA foreign_key_check")]
        for eid, lo, hi, weights in self._con.execute(
                "SELECT id, d_lower, d_upper, weights FROM entry WHERE weights IS NOT NULL"):
            w = json.loads(weights)
            d = next((i for i, a in enumerate(w) if i and a), None)
            if d is None or not lo <= d <= hi:
                problems.append(f"entry {eid}: its stored weight distribution gives d = {d}, "
                                f"but it states {lo} <= d <= {hi}")
        return problems

    def info(self) -> dict[str, Any]:
        """Path, schema version, counts (by origin, and by provenance: how many entries have
        d proved here, checked or only claimed) and meta values."""
        meta = dict(self._con.execute("SELECT key, value FROM meta"))
        by_origin = dict(self._con.execute("SELECT origin, count(*) FROM entry GROUP BY origin"))
        by_status = dict(self._con.execute(
            "SELECT json_extract(provenance, '$.kind'), count(*) FROM entry GROUP BY 1"))
        return {"path": str(self.path), "schema": SCHEMA_VERSION, "entries": len(self),
                "recipes": self._con.execute("SELECT count(*) FROM recipe").fetchone()[0],
                "by_origin": by_origin, "by_status": by_status, "meta": meta}
