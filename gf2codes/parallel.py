"""One small executor interface with three back ends.

* :class:`InProcess` — runs tasks one after another in this process (tests, debugging);
* :class:`ProcessPool` — a local pool of worker processes (the default of the command
  line, one worker per core); a worker that dies is replaced and its task re-run;
* :class:`DaskCluster` — Dask's distributed scheduler: join a running cluster by its
  address, or start a ``LocalCluster`` of N workers. Dask re-runs the tasks of a worker
  that dies. Needs the optional extra: ``pip install 'gf2codes[dask]'``.

All three offer :meth:`Executor.run_unordered`: submit every task, yield ``(index,
result)`` pairs as they finish, and cancel whatever has not started when the consumer
stops early (closes the generator). Task functions must be importable module-level
functions and their arguments picklable.
"""

from __future__ import annotations

import concurrent.futures as cf
import multiprocessing
import os
from collections.abc import Callable, Generator, Sequence
from typing import Any

from .exceptions import Gf2CodesError, MissingDependencyError, ParameterError, check_int

__all__ = ["Executor", "InProcess", "ProcessPool", "DaskCluster", "make_executor"]


class Executor:
    """Base class: a way to run independent tasks, possibly elsewhere."""

    #: number of tasks that can run at once
    workers: int = 1
    name: str = "executor"

    def run_unordered(self, fn: Callable[[Any], Any], items: Sequence[Any]
                      ) -> Generator[tuple[int, Any], None, None]:
        """Run ``fn(item)`` for every item; yield ``(index, result)`` as each finishes
        (closing the generator cancels the tasks not yet started)."""
        raise NotImplementedError

    def close(self) -> None:
        """Release the workers."""

    def __enter__(self) -> Executor:
        return self

    def __exit__(self, *exc: object) -> None:
        self.close()

    def describe(self) -> str:
        return f"{self.name} ({self.workers} worker{'s' if self.workers != 1 else ''})"


class InProcess(Executor):
    """Run tasks sequentially in the calling process."""

    name = "in-process"

    def run_unordered(self, fn, items):
        for i, item in enumerate(items):
            yield i, fn(item)


class ProcessPool(Executor):
    """A local pool of worker processes (started with ``spawn``, so it is safe beside
    threads). If a worker process dies, the pool is rebuilt and every task that had not
    returned is submitted again, up to ``retries`` times."""

    name = "process pool"

    def __init__(self, workers: int | None = None, *, retries: int = 3) -> None:
        self.workers = (os.cpu_count() or 1) if workers is None else check_int(
            "workers", workers, minimum=1)
        self.retries = retries
        self._ctx = multiprocessing.get_context("spawn")
        self._pool: cf.ProcessPoolExecutor | None = None

    def _ensure(self) -> cf.ProcessPoolExecutor:
        if self._pool is None:
            self._pool = cf.ProcessPoolExecutor(max_workers=self.workers, mp_context=self._ctx)
        return self._pool

    def run_unordered(self, fn, items):
        pending = dict(enumerate(items))
        attempts = 0
        while pending:
            pool = self._ensure()
            futures = {pool.submit(fn, item): i for i, item in pending.items()}
            try:
                for fut in cf.as_completed(futures):
                    i = futures[fut]
                    result = fut.result()
                    del pending[i]
                    yield i, result
            except cf.process.BrokenProcessPool:
                # A worker died (killed, out of memory): start a new pool and re-run
                # every task that has not returned a result.
                attempts += 1
                self._pool.shutdown(wait=False, cancel_futures=True)
                self._pool = None
                if attempts > self.retries:
                    raise Gf2CodesError(
                        f"worker processes died {attempts} times; giving up "
                        f"with {len(pending)} task(s) unfinished."
                    ) from None
            finally:
                for fut in futures:
                    fut.cancel()

    def close(self) -> None:
        if self._pool is not None:
            self._pool.shutdown(wait=True, cancel_futures=True)
            self._pool = None


class DaskCluster(Executor):
    """Tasks on a Dask distributed cluster.

    Parameters
    ----------
    address : str, optional
        Scheduler address of a running cluster (``tcp://host:8786``).
    local_workers : int, optional
        Start a ``LocalCluster`` with this many single-threaded worker processes
        instead (it is shut down by :meth:`close`).
    """

    name = "dask"

    def __init__(self, address: str | None = None, *, local_workers: int | None = None
                 ) -> None:
        try:
            from dask.distributed import Client, LocalCluster
        except ImportError:
            raise MissingDependencyError(
                "Dask is not installed; install the extra with: pip install 'gf2codes[dask]'"
            ) from None
        if (address is None) == (local_workers is None):
            raise ParameterError("Give either a scheduler address or a number of local "
                                 "workers for Dask, not both and not neither.")
        self._cluster = None
        if local_workers is not None:
            check_int("local_workers", local_workers, minimum=1)
            self._cluster = LocalCluster(n_workers=local_workers, threads_per_worker=1,
                                         processes=True, dashboard_address=None)
            self.client = Client(self._cluster)
        else:
            try:
                self.client = Client(address, timeout=10)
            except OSError as exc:
                raise ParameterError(
                    f"Argument 'scheduler' must be the address of a running Dask scheduler; "
                    f"could not connect to {address!r} ({exc})."
                ) from None
        info = self.client.scheduler_info()
        self.workers = max(1, sum(w.get("nthreads", 1) for w in info["workers"].values()))

    def run_unordered(self, fn, items):
        from dask.distributed import as_completed

        futures = [self.client.submit(fn, item, pure=False) for item in items]
        index = {f.key: i for i, f in enumerate(futures)}
        try:
            for fut in as_completed(futures):
                yield index[fut.key], fut.result()
        finally:
            self.client.cancel([f for f in futures if not f.done()])

    def close(self) -> None:
        self.client.close()
        if self._cluster is not None:
            self._cluster.close()


def make_executor(*, pool: int | None = None, scheduler: str | None = None,
                  dask_local: int | None = None) -> Executor | None:
    """The executor asked for by at most one of: a local process pool of ``pool``
    workers, a running Dask cluster at ``scheduler``, or a local Dask cluster of
    ``dask_local`` workers. ``None`` when none is asked for (work in this process)."""
    given = [name for name, v in (("pool", pool), ("scheduler", scheduler),
                                  ("dask_local", dask_local)) if v is not None]
    if not given:
        return None
    if len(given) > 1:
        raise ParameterError(f"Give one of pool, scheduler, dask_local, not "
                             f"{' and '.join(given)}.")
    if pool is not None:
        return ProcessPool(check_int("pool", pool, minimum=1))
    return DaskCluster(scheduler, local_workers=dask_local)
