"""``gf2codes grow``: grow the catalog on a region of cells, as a resumable job.

Exit status: 0 when the job finished or stopped at a limit; 130 on Ctrl-C (after saving
what was proved); 2 for errors.
"""

from __future__ import annotations

import json
import sys
from typing import Any

from ..exceptions import ParameterError
from ._common import (
    add_executor_options,
    console,
    err_console,
    executor_from_args,
    parse_range,
    say,
)

__all__ = ["register", "run"]


def _target(text: str) -> tuple[int, int]:
    try:
        k, d = text.split(":")
        return int(k), int(d)
    except ValueError:
        raise ParameterError(f"Argument 'target' must be K:D (like 32:6), not {text!r}.") from None


def register(subparsers: Any) -> None:
    p = subparsers.add_parser(
        "grow", help="grow the catalog on a region of (n, k) cells: a resumable job",
        description="Search every open cell of a region (the catalog's proved d below the "
                    "best upper bound), largest gap first, with a per-cell step budget; save "
                    "every proved improvement at once. The plan and progress live in the "
                    "catalog: run the same command again to continue after a stop or a kill.")
    p.add_argument("--catalog", metavar="PATH",
                   help="the catalog file (default: $GF2CODES_CATALOG, else "
                        "$XDG_DATA_HOME/gf2codes/catalog.sqlite)")
    p.add_argument("--n", metavar="R", help="lengths, a value or a range like 33-64")
    p.add_argument("--k", metavar="R", help="dimensions (default: every k <= n)")
    p.add_argument("--target", metavar="K:D", action="append", default=[],
                   help="a (k, d) target: the cells that would give a shorter code for it "
                        "(repeatable)")
    p.add_argument("--max-steps", type=int, default=200, metavar="N",
                   help="per-cell step budget of the search (default 200)")
    p.add_argument("--time-limit", type=float, metavar="S",
                   help="per-cell seconds as well (makes the result machine-dependent)")
    p.add_argument("--seed", type=int, default=0, help="seed of every cell's search (default 0)")
    p.add_argument("--strategy", action="append", metavar="NAME",
                   help="a search strategy (repeatable; default: greedy, anneal, circulant, "
                        "cyclic, random)")
    p.add_argument("--batch", type=int, default=8, metavar="N",
                   help="cells searched at once from the same catalog state (default 8; the "
                        "codes found do not depend on the number of workers)")
    p.add_argument("--max-cells", type=int, metavar="N",
                   help="stop after N cells in this run (the job continues next time)")
    p.add_argument("--job-time-limit", type=float, metavar="S",
                   help="start no new cells after S seconds (the job continues next time)")
    p.add_argument("--json", action="store_true",
                   help="print one JSON line per finished cell, then one for the job")
    add_executor_options(p, "the cells' searches")


class _Display:
    """A progress bar on a terminal: cells done / improved / closed and the time left."""

    def __init__(self, total: int) -> None:
        self._bar = None
        if err_console.is_terminal:
            from rich.progress import BarColumn, Progress, TextColumn

            self._bar = Progress(TextColumn("grow"), BarColumn(),
                                 TextColumn("{task.completed}/{task.total} cells"),
                                 TextColumn("{task.fields[note]}"), console=err_console,
                                 transient=True)
            self._bar.start()
            self._task = self._bar.add_task("grow", total=total, note="")

    def __call__(self, s: Any) -> None:
        if self._bar is None:
            return
        left = "" if s.eta is None else f" · about {_duration(s.eta)} left"
        self._bar.update(self._task, completed=s.done, total=s.cells,
                         note=f"{s.improved} improved · {s.closed} at the bound{left}")

    def close(self) -> None:
        if self._bar is not None:
            self._bar.stop()


def _duration(seconds: float) -> str:
    if seconds < 90:
        return f"{seconds:.0f} s"
    if seconds < 5400:
        return f"{seconds / 60:.0f} min"
    return f"{seconds / 3600:.1f} h"


def run(args: Any) -> int:
    from ..catalog import open_catalog
    from ..growth import grow, region_cells

    lengths = parse_range("n", args.n) if args.n else None
    dims = parse_range("k", args.k) if args.k else None
    targets = [_target(t) for t in args.target]
    if lengths is None and not targets:
        raise ParameterError("Give a region: '--n' (with '--k' if wanted) or '--target K:D'.")
    if lengths is not None and lengths.start < 1:
        raise ParameterError(f"Argument 'n' must be at least 1, not {lengths.start}.")
    with open_catalog(args.catalog) as cat:
        cells = region_cells(lengths=lengths, dimensions=dims, targets=targets, catalog=cat)
        executor = executor_from_args(args)
        display: _Display | None = None

        def on_cell(res: Any) -> None:
            if args.json:
                console.plain(json.dumps(res.to_dict()) + "\n")
                sys.stdout.flush()
            elif res.outcome == "improved":
                line = (f"[{res.n}, {res.k}] d {res.d_before} -> {res.d_found} "
                        f"({res.strategy}); bound {res.bound} ({res.bound_by})")
                if display is not None and display._bar is not None:
                    display._bar.console.print(line, highlight=False, markup=False)
                else:
                    say(line)

        def progress(s: Any) -> None:
            nonlocal display
            if display is None:
                display = _Display(s.cells)
            display(s)

        try:
            summary = grow(cat, cells, max_steps=args.max_steps, time_limit=args.time_limit,
                           seed=args.seed, strategies=args.strategy, executor=executor,
                           batch=args.batch, max_cells=args.max_cells,
                           job_time_limit=args.job_time_limit, progress=progress,
                           on_cell=on_cell)
        finally:
            if display is not None:
                display.close()
            if executor is not None:
                executor.close()
    if args.json:
        console.plain(json.dumps({"job": summary.to_dict()}) + "\n")
    else:
        again = "" if summary.stopped == "finished" else " (run the same command to continue)"
        say(f"job {summary.job}: {summary.done} of {summary.cells} open cells done "
              f"({summary.resumed} in earlier runs), {summary.improved} improved, "
              f"{summary.closed} now at the bound; {summary.stopped} after "
              f"{summary.seconds:.1f} s{again}.")
    return 130 if summary.stopped == "interrupted" else 0
