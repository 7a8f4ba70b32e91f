"""The catalog's SQLite schema: version, migrations, and opening the file safely.

The file is marked with an SQLite ``application_id`` and carries its schema version in
``user_version``; :data:`MIGRATIONS` lists the steps from one version to the next, and
:func:`migrate` applies the missing ones inside the caller's transaction.
"""

from __future__ import annotations

import os
import sqlite3
import time
from pathlib import Path
from urllib.parse import quote

from ..exceptions import CatalogError

__all__ = ["SCHEMA_VERSION", "APPLICATION_ID", "MIGRATIONS", "BUSY_SECONDS", "set_wal",
           "connect", "connect_readonly", "migrate"]

#: Version of the database schema this gf2codes writes (``PRAGMA user_version``).
SCHEMA_VERSION = 4
#: ``PRAGMA application_id`` of a gf2codes catalog (the bytes ``g2cc``).
APPLICATION_ID = 0x67326363
#: Seconds a writer waits for another process's lock.
BUSY_SECONDS = 60.0

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


def set_wal(con: sqlite3.Connection) -> None:
    """Switch to write-ahead logging, waiting while another process holds the lock.

    SQLite answers "database is locked" at once, without its busy handler, when two
    processes open a new catalog file at the same moment and both ask for WAL; so the
    request is repeated for up to ``BUSY_SECONDS``.
    """
    deadline = time.monotonic() + BUSY_SECONDS
    while True:
        try:
            con.execute("PRAGMA journal_mode = WAL")
            return
        except sqlite3.OperationalError as exc:
            if "locked" not in str(exc) or time.monotonic() > deadline:
                raise
            time.sleep(0.02)


def connect(p: Path) -> tuple[sqlite3.Connection, bool]:
    """Open (creating its folder if needed) the catalog file ``p`` for writing, or
    read-only when this process may not write it; return ``(connection, readonly)``.

    Raises
    ------
    CatalogError
        If ``p`` is a folder, not an SQLite file, or cannot be opened.
    """
    if str(p) == ":memory:":
        return sqlite3.connect(":memory:", isolation_level=None), False
    if p.is_dir():
        raise CatalogError(f"{p}: is a folder, not a catalog file.")
    if p.exists() and p.stat().st_size:
        with open(p, "rb") as fh:
            head = fh.read(16)
        if head != b"SQLite format 3\x00":
            raise CatalogError(f"{p}: not a gf2codes catalog (not an SQLite database).")
        if not (os.access(p, os.W_OK) and os.access(p.parent, os.W_OK | os.X_OK)):
            return connect_readonly(p), True
    else:
        try:
            p.parent.mkdir(parents=True, exist_ok=True)
        except OSError as exc:
            raise CatalogError(f"{p}: cannot create the catalog's folder ({exc}).") from None
    try:
        con = sqlite3.connect(str(p), timeout=BUSY_SECONDS, isolation_level=None)
        con.execute(f"PRAGMA busy_timeout = {int(BUSY_SECONDS * 1000)}")
        set_wal(con)
        con.execute("PRAGMA synchronous = FULL")
        con.execute("PRAGMA foreign_keys = ON")
    except sqlite3.OperationalError as exc:
        if "readonly" in str(exc) and p.exists():
            return connect_readonly(p), True
        raise CatalogError(f"{p}: cannot open the catalog ({exc}).") from None
    except sqlite3.DatabaseError as exc:
        raise CatalogError(f"{p}: not a usable gf2codes catalog ({exc}).") from None
    return con, False


def connect_readonly(path: Path) -> sqlite3.Connection:
    """Open a catalog this process may not write: read-only and immutable (no -shm or
    -wal file is needed, so a read-only folder works too)."""
    uri = f"file:{quote(str(path.resolve()))}?mode=ro&immutable=1"
    try:
        return sqlite3.connect(uri, uri=True, isolation_level=None)
    except sqlite3.DatabaseError as exc:
        raise CatalogError(f"{path}: cannot open the catalog ({exc}).") from None


def migrate(cur: sqlite3.Cursor, version: int) -> None:
    """Take the schema from ``version`` to :data:`SCHEMA_VERSION` inside the open
    transaction of ``cur`` and mark the file as a catalog of that version."""
    for v in range(version, SCHEMA_VERSION):
        for statement in MIGRATIONS[v]:
            cur.execute(statement)
    cur.execute(f"PRAGMA application_id = {APPLICATION_ID}")
    cur.execute(f"PRAGMA user_version = {SCHEMA_VERSION}")
