"""The plan and progress of growth jobs, kept in the catalog's SQLite file.

Tables ``growth_job`` (one row per job: the digest of its specification, the
specification, when it was created and finished) and ``growth_cell`` (one row per cell
of a job's plan, in rank order, ``pending`` until done). :mod:`gf2codes.growth` drives
the job through these functions and writes nothing else itself.
"""

from __future__ import annotations

import json
from collections.abc import Sequence
from typing import Any

from .entry import now
from .store import Catalog

__all__ = ["find_job", "create_job", "pending_cells", "finish_cell", "finish_job",
           "cell_count", "done_cells"]


def find_job(catalog: Catalog, key: str) -> tuple[int, int] | None:
    """The job with this key and its number of finished cells, or None."""
    row = catalog.query("SELECT id FROM growth_job WHERE key = ?", (key,))
    if not row:
        return None
    job = int(row[0][0])
    done = catalog.query("SELECT count(*) FROM growth_cell WHERE job_id = ? AND "
                         "state = 'done'", (job,))[0][0]
    return job, int(done)


def create_job(catalog: Catalog, key: str, spec: dict[str, Any],
               cells: Sequence[tuple[int, int, int, int]]) -> int:
    """Store a new job and its plan ``(n, k, d_planned, bound)`` in rank order, in one
    transaction (the plan exists whole or not at all); return the job's id."""
    with catalog.transaction() as cur:
        cur.execute("INSERT INTO growth_job (key, spec, created_at) VALUES (?, ?, ?)",
                    (key, json.dumps(spec, sort_keys=True), now()))
        job = cur.lastrowid
        assert job is not None  # set by the INSERT
        cur.executemany(
            "INSERT INTO growth_cell (job_id, rank, n, k, d_planned, bound) "
            "VALUES (?, ?, ?, ?, ?, ?)",
            [(job, rank, n, k, d, bound) for rank, (n, k, d, bound) in enumerate(cells)])
    return int(job)


def pending_cells(catalog: Catalog, job: int) -> list[tuple[int, int]]:
    """The job's cells not yet done, in rank order."""
    return [(int(n), int(k)) for n, k in catalog.query(
        "SELECT n, k FROM growth_cell WHERE job_id = ? AND state = 'pending' ORDER BY rank",
        (job,))]


def finish_cell(catalog: Catalog, job: int, n: int, k: int, *, outcome: str,
                d_before: int, d_found: int, entry: int | None, strategy: str | None,
                seconds: float, stopped: str) -> None:
    """Mark a cell done with what became of it (after its code, if any, was stored)."""
    with catalog.transaction() as cur:
        cur.execute(
            "UPDATE growth_cell SET state = 'done', outcome = ?, d_before = ?, d_found = ?, "
            "entry_id = ?, strategy = ?, seconds = ?, stopped = ?, finished_at = ? "
            "WHERE job_id = ? AND n = ? AND k = ?",
            (outcome, d_before, d_found, entry, strategy, seconds, stopped, now(), job, n, k))


def finish_job(catalog: Catalog, job: int) -> None:
    """Stamp the job as finished (once)."""
    with catalog.transaction() as cur:
        cur.execute("UPDATE growth_job SET finished_at = ? WHERE id = ? AND "
                    "finished_at IS NULL", (now(), job))


def cell_count(catalog: Catalog, job: int) -> int:
    """Cells in the job's plan."""
    return int(catalog.query("SELECT count(*) FROM growth_cell WHERE job_id = ?",
                             (job,))[0][0])


def done_cells(catalog: Catalog, job: int) -> list[tuple[int, int, int, str]]:
    """``(n, k, bound, outcome)`` of every finished cell of the job."""
    return [(int(n), int(k), int(b), str(o)) for n, k, b, o in catalog.query(
        "SELECT n, k, bound, outcome FROM growth_cell WHERE job_id = ? AND state = 'done'",
        (job,))]
