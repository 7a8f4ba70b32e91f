"""Helpers shared by the sub-commands: output, ranges, reading codes from files."""

from __future__ import annotations

import json
import sys
from typing import Any

from rich.console import Console

from ..exceptions import ParameterError

__all__ = ["console", "err_console", "print_json", "parse_range", "parse_int", "parse_float",
           "add_json_flag", "add_executor_options", "executor_from_args", "ProgressBar"]

console = Console(highlight=False)
err_console = Console(stderr=True, highlight=False)


def add_json_flag(parser) -> None:
    parser.add_argument("--json", action="store_true",
                        help="print one JSON object instead of tables")


def print_json(obj: Any, *, one_line: bool = False) -> None:
    """Write ``obj`` as JSON on standard output (one object, newline-terminated).

    ``one_line`` writes it on a single line, as one record of a JSON-lines stream.
    """
    sys.stdout.write(json.dumps(obj, indent=None if one_line else 2, sort_keys=False) + "\n")
    sys.stdout.flush()


def parse_int(name: str, text: str) -> int:
    """An integer option given as text, or a one-line :class:`ParameterError`.

    >>> parse_int('k', '12')
    12
    """
    try:
        return int(text, 10)
    except (TypeError, ValueError):
        raise ParameterError(f"Argument {name!r} must be an integer, not {text!r}.") from None


def parse_float(name: str, text: str) -> float:
    """A number option given as text, or a one-line :class:`ParameterError`."""
    try:
        return float(text)
    except (TypeError, ValueError):
        raise ParameterError(f"Argument {name!r} must be a number, not {text!r}.") from None


def add_executor_options(parser, what: str) -> None:
    """``--pool N``, ``--scheduler ADDRESS`` and ``--dask-local N``: where ``what`` runs."""
    parser.add_argument("--pool", type=int, metavar="N",
                        help=f"run {what} on a local pool of N processes")
    parser.add_argument("--scheduler", metavar="ADDRESS",
                        help=f"run {what} on a running Dask cluster (e.g. tcp://head:8786; "
                             "needs gf2codes[dask])")
    parser.add_argument("--dask-local", type=int, metavar="N",
                        help=f"start a local Dask cluster of N worker processes for {what}")


def executor_from_args(args):
    """The executor that :func:`add_executor_options` asked for, or None (work here)."""
    from ..parallel import make_executor

    return make_executor(pool=args.pool, scheduler=args.scheduler, dask_local=args.dask_local)


def parse_range(name: str, text: str) -> range:
    """Parse ``"7"`` or ``"1-40"`` into an inclusive integer range.

    >>> list(parse_range('n', '3-5'))
    [3, 4, 5]
    """
    try:
        if "-" in text:
            lo, hi = text.split("-", 1)
            lo_i, hi_i = int(lo), int(hi)
        else:
            lo_i = hi_i = int(text)
    except ValueError:
        raise ParameterError(
            f"Argument {name!r} must be an integer or a range like 1-40, not {text!r}."
        ) from None
    if lo_i > hi_i:
        raise ParameterError(f"Argument {name!r} must be an increasing range, not {text!r}.")
    return range(lo_i, hi_i + 1)


class ProgressBar:
    """A progress callback that shows a rich bar on a terminal once a run passes 2 s.

    Use as a context manager; call the instance as ``progress(done, total, info)``.
    """

    def __init__(self, label: str, delay: float = 2.0) -> None:
        import time

        self._time = time.perf_counter
        self._start = self._time()
        self._delay = delay
        self._label = label
        self._bar = None
        self._task = None

    def __enter__(self) -> ProgressBar:
        return self

    def __exit__(self, *exc: object) -> None:
        if self._bar is not None:
            self._bar.stop()

    def __call__(self, done: int, total: int, info: dict) -> None:
        if self._bar is None:
            if not err_console.is_terminal or self._time() - self._start < self._delay:
                return
            from rich.progress import (
                BarColumn,
                Progress,
                TaskProgressColumn,
                TextColumn,
                TimeRemainingColumn,
            )

            self._bar = Progress(TextColumn("{task.description}"), BarColumn(),
                                 TaskProgressColumn(), TimeRemainingColumn(),
                                 TextColumn("{task.fields[note]}"), console=err_console,
                                 transient=True)
            self._bar.start()
            self._task = self._bar.add_task(self._label, total=total, note="")
        note = ""
        if "lower" in info and "upper" in info and info["upper"] < (1 << 60):
            note = f"{info['lower']} <= d <= {info['upper']}"
        elif "note" in info:
            note = str(info["note"])
        self._bar.update(self._task, completed=done, total=max(total, done), note=note)
