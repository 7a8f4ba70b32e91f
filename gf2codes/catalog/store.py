"""The catalog store: one SQLite file of proved codes, their recipes and equivalences.

See :mod:`gf2codes.catalog` for the store, the provenance rules and the records.
"""

from __future__ import annotations

import contextlib
import hashlib
import json
import os
import sqlite3
from collections.abc import Iterable, Iterator, Mapping, Sequence
from pathlib import Path
from typing import Any

import numpy as np

from .. import linalg
from .._version import __version__
from ..bounds import best_upper
from ..code import Code
from ..distance import minimum_distance
from ..equivalence import CodeFacts, are_equivalent, code_facts
from ..exceptions import CatalogError, ParameterError, ParseError, check_int
from ..formats import EntryRecord, parse_entry_record
from ..questions import question_type
from . import tables
from .checks import import_facts, trusted_facts
from .entry import (
    Entry,
    ImportReport,
    ProofOutcome,
    Provenance,
    StoreStatus,
    dumps,
    entry_record,
    now,
    read_provenance,
)
from .locations import default_catalog_path, shipped_catalog_dir, shipped_digest
from .propagation import (
    NO_LENGTH,
    EntryArrays,
    derivation_steps,
    reach_dimension,
    reach_distance,
    reach_length,
)
from .schema import APPLICATION_ID, SCHEMA_VERSION, connect, migrate

__all__ = ["Catalog", "open_catalog"]

_MAX_SQL_INT = (1 << 63) - 1


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
        self._con, self.readonly = connect(self.path)
        self._arrays: EntryArrays | None = None
        self._arrays_version: tuple[Any, Any] | None = None
        self._init_schema(shipped)
        self._take_newer_shipped()

    # ---------------------------------------------------------------- opening
    def _take_newer_shipped(self) -> None:
        """Import a newer shipped seed into a catalog that took an older one.

        A catalog that imported the shipped records records their digest; when the
        shipped files differ (a newer gf2codes, a regenerated seed), the missing records
        are imported once (idempotent: nothing is stored twice), so an existing catalog
        answers what a new one would. Catalogs created empty, read-only ones and
        catalogs already at the current digest are left alone. Shipped entries the user
        removed come back only when the seed itself changes.
        """
        if self.readonly or self._memory:
            return
        meta = dict(self._con.execute(
            "SELECT key, value FROM meta WHERE key IN ('shipped_imported', 'shipped_digest')"))
        if "shipped_imported" not in meta:
            return
        digest = shipped_digest()
        if digest is None or meta.get("shipped_digest") == digest:
            return
        with self.transaction() as cur:
            self._import_shipped(cur)

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
        with self.transaction() as cur:
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
            migrate(cur, version)
            if fresh:
                cur.execute("INSERT INTO meta VALUES ('created', ?), ('created_by', ?)",
                            (now(), __version__))
                if shipped:
                    self._import_shipped(cur)
            else:
                cur.execute("INSERT OR REPLACE INTO meta VALUES ('migrated', ?)",
                            (f"{version}->{SCHEMA_VERSION} by {__version__} at {now()}",))

    @contextlib.contextmanager
    def transaction(self) -> Iterator[sqlite3.Cursor]:
        """A write transaction (``BEGIN IMMEDIATE``): the cursor's statements are
        committed together when the block ends, or rolled back when it raises.

        Raises
        ------
        CatalogError
            If the catalog is read-only or the write fails.
        """
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
                     added_by=by, origin=origin, provenance=read_provenance(prov))

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

    def query(self, sql: str, params: Sequence[Any] = ()) -> list[tuple[Any, ...]]:
        """The rows of one read-only SQL statement (for the catalog's own modules, such
        as the growth plan, and for inspection)."""
        return self._con.execute(sql, params).fetchall()

    def arrays(self) -> EntryArrays:
        """Every stored entry as columns ``ids, n, k, d_lower, d_upper, proved`` (cached
        until the file changes), the input of the propagation rules."""
        version = self._con.execute("PRAGMA data_version").fetchone()[0]
        total = self._con.execute("SELECT count(*), max(id) FROM entry").fetchone()
        key = (version, total)
        if self._arrays is None or self._arrays_version != key:
            rows = self._con.execute(
                "SELECT id, n, k, d_lower, d_upper, "
                "json_extract(provenance, '$.kind') = 'proved' FROM entry").fetchall()
            a = np.array(rows, dtype=np.int64).reshape(-1, 6)
            self._arrays = EntryArrays(a[:, 0], a[:, 1], a[:, 2], a[:, 3], a[:, 4],
                                       a[:, 5].astype(bool))
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
        asked = question_type(n, k, d)  # exactly two given, or ParameterError
        ids, N0, K0, L0, U0, P0 = self.arrays()
        if not claims:
            ids, N0, K0, L0, U0, P0 = (a[P0] for a in (ids, N0, K0, L0, U0, P0))
        if ids.size == 0:
            return None
        if asked.mode == "length":
            k = check_int("k", k, minimum=1)
            d = check_int("d", d, minimum=1)
            lengths = reach_length(N0, K0, L0, k, d)
            n_best = int(lengths.min())
            if n_best == NO_LENGTH:
                return None
            n = n_best
        elif asked.mode == "dimension":
            n = check_int("n", n, minimum=1)
            d = check_int("d", d, minimum=1)
            dims = reach_dimension(N0, K0, L0, n, d)
            if dims.max() < 1:
                return None
            k = int(dims.max())
        n = check_int("n", n, minimum=1)
        k = check_int("k", k, minimum=1, maximum=n)
        return self._choose(ids, N0, K0, L0, U0, P0, reach_distance(N0, K0, L0, n, k), n, k)

    def length_table(self, dimensions: Iterable[int], distances: Iterable[int]
                     ) -> list[dict[str, Any]]:
        """:func:`gf2codes.catalog.tables.length_table` of the entries proved here (see
        there for the rows and their keys)."""
        return tables.length_table(self.arrays(), dimensions, distances)

    def distance_table(self, lengths: Iterable[int]) -> list[dict[str, Any]]:
        """:func:`gf2codes.catalog.tables.distance_table` of the entries proved here (see
        there for the rows and their keys)."""
        return tables.distance_table(self.arrays(), lengths)

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
        return self.add_or_merge(code, d=d, proved=proved, recipe=recipe, source=source,
                                 seed=seed, d_upper=d_upper, proof=proof,
                                 claimed_by=claimed_by)[0]

    def add_or_merge(self, code: Code, *, d: int, proved: bool = True,
                     recipe: Sequence[Mapping[str, Any]] | None = None,
                     source: str = "search", seed: int | None = None,
                     d_upper: int | None = None, proof: Mapping[str, Any] | None = None,
                     claimed_by: str | None = None) -> tuple[int, StoreStatus]:
        """:meth:`add` (same parameters), also saying what happened: ``"added"`` (a new
        entry), ``"merged"`` (into an equivalent entry) or ``"unchanged"``."""
        if not isinstance(code, Code):
            raise ParameterError(f"Argument 'code' must be a Code, not {type(code).__name__}.")
        d = check_int("d", d, minimum=1, maximum=code.n)
        facts = code_facts(code)
        lo, hi, proof_d, prov = self._interval(code, facts, d, proved, d_upper, proof,
                                               claimed_by)
        steps = list(recipe) if recipe is not None else (list(code.recipe) or None)
        item = {"source": source, "recipe": steps, "seed": seed}
        with self.transaction() as cur:
            return self._store(cur, code, facts, lo, hi, proof_d, [item], None, None, "user",
                               prov)

    @staticmethod
    def _interval(code: Code, facts: CodeFacts, d: int, proved: bool, d_upper: int | None,
                  proof: Mapping[str, Any] | None, claimed_by: str | None = None
                  ) -> tuple[int, int, dict | None, Provenance]:
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
               added_by: str | None, origin: str, prov: Provenance) -> tuple[int, StoreStatus]:
        """Insert or merge inside the open transaction; return (id, "added"/"merged"/...).

        Merging follows the trust boundary: a proof made here replaces a claim (and a
        claim that contradicts it was false); a claim never changes a proved interval
        (one that contradicts it is refused); two proofs, or two claims, intersect.
        """
        eid, perm = self._find(cur, code, facts)
        stamp = now()
        status: StoreStatus = "unchanged"
        if eid is None:
            rows = linalg.rref(code.packed_generator, n=code.n).sorted().rows
            cur.execute(
                "INSERT INTO entry (n, k, d_lower, d_upper, generator, subspace, weights, "
                "invariant, proof, added_at, added_by, origin, provenance) "
                "VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)",
                (code.n, code.k, lo, hi,
                 np.ascontiguousarray(rows, dtype="<u8").tobytes(), facts.subspace,
                 None if facts.weights is None else dumps(facts.weights), facts.invariant,
                 None if proof is None else dumps(proof), added or stamp,
                 added_by or __version__, origin, dumps(prov.to_dict())))
            eid = cur.lastrowid
            assert eid is not None  # set by the INSERT
            status = "added"
        else:
            old_lo, old_hi, old_text, old_weights = cur.execute(
                "SELECT d_lower, d_upper, provenance, weights FROM entry WHERE id = ?",
                (eid,)).fetchone()
            old = read_provenance(old_text)
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
                            "WHERE id = ?", (new_lo, new_hi, dumps(new_prov.to_dict()), eid))
                if new_prov is prov and proof is not None:
                    cur.execute("UPDATE entry SET proof = ? WHERE id = ?", (dumps(proof), eid))
                status = "merged"
            if old_weights is None and facts.weights is not None:  # computed here
                cur.execute("UPDATE entry SET weights = ? WHERE id = ?",
                            (dumps(facts.weights), eid))
        for item in recipes:
            p = item.get("permutation")
            if perm is not None:  # compose: recipe code -> this code -> stored generator
                p = [perm[j] for j in p] if p is not None else perm
            key = dumps([item["source"], item.get("recipe"), item.get("seed"), p])
            fp = hashlib.sha256(key.encode()).hexdigest()[:32]
            cur.execute(
                "INSERT OR IGNORE INTO recipe (entry_id, source, steps, seed, permutation, "
                "fingerprint, added_at, added_by) VALUES (?, ?, ?, ?, ?, ?, ?, ?)",
                (eid, item["source"], None if item.get("recipe") is None
                 else dumps(item["recipe"]), item.get("seed"),
                 None if p is None else dumps(p), fp, item.get("added") or stamp,
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
        with self.transaction() as cur:
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
        ready: list[tuple[int, EntryRecord, CodeFacts, Provenance]] = []
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
                facts, prov = import_facts(rec, where, verify, time_limit, source)
            except (ParseError, ParameterError) as exc:
                report.errors.append((lineno, str(exc)))
                continue
            ready.append((lineno, rec, facts, prov))
            report.status[prov.kind] = report.status.get(prov.kind, 0) + 1
        if ready:
            with self.transaction() as cur:
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

    def import_shipped(self) -> ImportReport:
        """Import the shipped seed records (again): only what is missing is added."""
        report = ImportReport()
        with self.transaction() as cur:
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
                        facts, prov = trusted_facts(
                            rec, where, f"the shipped seed of gf2codes {__version__}")
                    except (ParseError, ParameterError, json.JSONDecodeError) as exc:
                        raise CatalogError(f"the shipped catalog is damaged: {exc}") from None
                    ready.append((lineno, rec, facts, prov))
                    report.status[prov.kind] = report.status.get(prov.kind, 0) + 1
            self._store_all(cur, ready, report, "shipped")
        cur.execute("INSERT OR REPLACE INTO meta VALUES ('shipped_imported', ?)",
                    (f"{__version__} at {now()}",))
        cur.execute("INSERT OR REPLACE INTO meta VALUES ('shipped_digest', ?)",
                    (shipped_digest(),))
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
                with self.transaction() as cur:
                    cur.execute("UPDATE entry SET d_lower = ?, d_upper = ?, provenance = ?, "
                                "proof = ? WHERE id = ?",
                                (lo, hi, dumps(prov.to_dict()), dumps(proof), entry.id))
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

