"""Helpers shared by the sub-commands: output, ranges, reading codes from files."""

from __future__ import annotations

import argparse
import json
import math
import os
import unicodedata
from collections.abc import Callable
from pathlib import Path
from typing import TYPE_CHECKING, Any

from rich.console import Console

if TYPE_CHECKING:  # pragma: no cover
    from rich.progress import Progress, TaskID

    from ..code import Code

from ..exceptions import Gf2CodesError, ParameterError
from ._text import describe_distance, matrix_block

__all__ = ["console", "err_console", "print_json", "parse_range", "parse_int", "parse_float",
           "add_json_flag", "add_executor_options", "executor_from_args", "ProgressBar",
           "StagedProgress", "add_output_flags", "emit", "print_lines",
           "clean", "seconds_arg", "seconds_or_zero_arg", "seed_arg", "count_arg",
           "probability_arg", "address_arg",
           "check_output_path", "write_output", "MAX_SECONDS", "MAX_SEED"]

#: The largest time limit accepted (about 31 years): larger values are typing mistakes.
MAX_SECONDS = 1e9
#: Seeds are integers from 0 to 2^63 - 1 (what numpy's generators take).
MAX_SEED = (1 << 63) - 1


def clean(text: object) -> str:
    """``text`` made safe to print on a terminal: one line, no control characters.

    Control characters (escape sequences, newlines, NUL, ...) become visible
    escapes such as ``\\x1b`` and ``\\n``, so that a hostile file or code name can
    neither split an error line nor drive the terminal.

    >>> clean("a\\x1b[31mb\\nc")
    'a\\\\x1b[31mb\\\\nc'
    """
    out = []
    for ch in str(text):
        if ch == "\n":
            out.append("\\n")
        elif ch == "\r":
            out.append("\\r")
        elif ch == "\t":
            out.append("\\t")
        elif unicodedata.category(ch) in ("Cc", "Cf", "Zl", "Zp"):
            code = ord(ch)
            out.append(f"\\x{code:02x}" if code < 0x100 else f"\\u{code:04x}")
        else:
            out.append(ch)
    return "".join(out)


def seconds_arg(text: str) -> float:
    """argparse type of a time limit: a finite number of seconds, > 0 and <= 10^9."""
    try:
        value = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"must be a number of seconds, not {clean(text)!r}"
                                         ) from None
    if not math.isfinite(value) or not 0 < value <= MAX_SECONDS:
        raise argparse.ArgumentTypeError(
            f"must be a number of seconds above 0 and at most {MAX_SECONDS:.0e}, "
            f"not {clean(text)!r}")
    return value


def seconds_or_zero_arg(text: str) -> float:
    """argparse type of a time budget that may be 0 (do not spend any time)."""
    if text.strip() in ("0", "0.0", "0e0"):
        return 0.0
    return seconds_arg(text)


def seed_arg(text: str) -> int:
    """argparse type of a seed: an integer from 0 to 2^63 - 1."""
    try:
        value = int(text, 10)
    except ValueError:
        raise argparse.ArgumentTypeError(f"must be an integer, not {clean(text)!r}") from None
    if not 0 <= value <= MAX_SEED:
        raise argparse.ArgumentTypeError(f"must be from 0 to 2^63 - 1, not {clean(text)!r}")
    return value


def count_arg(minimum: int, maximum: int) -> Callable[[str], int]:
    """argparse type of an integer from ``minimum`` to ``maximum``."""

    def parse(text: str) -> int:
        try:
            value = int(text, 10)
        except ValueError:
            raise argparse.ArgumentTypeError(f"must be an integer, not {clean(text)!r}"
                                             ) from None
        if not minimum <= value <= maximum:
            raise argparse.ArgumentTypeError(
                f"must be from {minimum:,} to {maximum:,}, not {clean(text)!r}")
        return value

    return parse


def probability_arg(text: str) -> float:
    """argparse type of a probability strictly between 0 and 1."""
    try:
        value = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"must be a number, not {clean(text)!r}") from None
    if not 0 < value < 1:  # also false for NaN
        raise argparse.ArgumentTypeError(f"must lie strictly between 0 and 1, not "
                                         f"{clean(text)!r}")
    return value


def address_arg(text: str) -> str:
    """argparse type of a Dask scheduler address: ``[tcp://|tls://]HOST:PORT``."""
    rest = text
    for scheme in ("tcp://", "tls://"):
        if text.startswith(scheme):
            rest = text[len(scheme):]
            break
    else:
        if "://" in text:
            raise argparse.ArgumentTypeError(
                f"must start with tcp:// or tls://, not {clean(text)!r}")
    host, sep, port = rest.rpartition(":")
    if not sep or not host or not port.isdigit() or not 0 < int(port) < 65536:
        raise argparse.ArgumentTypeError(
            f"must be HOST:PORT with a port from 1 to 65535 (e.g. tcp://head:8786), not "
            f"{clean(text)!r}")
    if any(ch.isspace() or unicodedata.category(ch) == "Cc" for ch in host):
        raise argparse.ArgumentTypeError(f"the host name holds spaces or control "
                                         f"characters: {clean(text)!r}")
    return text


def check_output_path(path: str | os.PathLike[str] | None, option: str = "--output") -> None:
    """Refuse, before any work, an output path whose folder does not exist.

    Raises
    ------
    ParameterError
        Naming the option and the path.
    """
    if path is None or str(path) == "-":
        return
    p = Path(path)
    if p.is_dir():
        raise ParameterError(f"Argument {option!r} must be a file name, not the folder "
                             f"{clean(p)!r}.")
    parent = p.parent
    if not parent.is_dir():
        raise ParameterError(f"Argument {option!r}: cannot write {clean(p)!r}: "
                             f"{clean(parent)!r} is not an existing folder.")


def write_output(write: Callable[[], Any], path: str | os.PathLike[str],
                 fallback: Callable[[], None] | None = None) -> Any:
    """Call ``write()``; turn a failed write into one line, after ``fallback()``.

    ``fallback`` prints what was computed (so a failed write loses nothing) before
    the error is raised as a :class:`Gf2CodesError`.
    """
    kept = " (the result is printed above)" if fallback is not None else ""
    try:
        return write()
    except OSError as exc:
        if fallback is not None:
            fallback()
        reason = exc.strerror or type(exc).__name__
        raise _WriteError(f"cannot write {clean(path)!r}: {reason}{kept}.") from None
    except Gf2CodesError as exc:  # a writer that already turned its OSError into one line
        if fallback is not None:
            fallback()
        raise _WriteError(f"{str(exc).rstrip('.')}{kept}.") from None


class _WriteError(Gf2CodesError, OSError):
    """Writing an output file failed."""


class _Console(Console):
    """A rich console that leaves a closed pipe to :func:`gf2codes.cli.main`.

    rich's default exits with status 1 when the reader of standard output goes
    away; gf2codes has one rule for every command instead (see ``main``).
    """

    def on_broken_pipe(self) -> None:
        self.quiet = True
        raise BrokenPipeError("standard output was closed by its reader")

    def plain(self, text: str) -> None:
        """Write ``text`` exactly as it is (no markup, wrapping or styles), then flush:
        JSON and matrix files that a pipe must receive whole."""
        self.file.write(text)
        self.file.flush()

    def binary(self, data: bytes) -> None:
        """Write ``data`` as it is to the underlying byte stream (an exported file)."""
        self.file.flush()
        buffer = getattr(self.file, "buffer", None)
        if buffer is None:  # a text-only stream (a test's StringIO): the text formats
            self.file.write(data.decode("utf-8", "replace"))
        else:
            buffer.write(data)
            buffer.flush()
        self.file.flush()


console = _Console(highlight=False)
err_console = _Console(stderr=True, highlight=False)
#: For commands whose text holds "[n, k, d]" and "p[j]", which rich would take for markup.
text_console = _Console(highlight=False, markup=False)


def say(text: str = "", *, err: bool = False) -> None:
    """One plain line (``text`` as it is, then a newline) on standard output or error,
    through the shared consoles (and so the shared broken-pipe rule)."""
    (err_console if err else console).plain(text + "\n")


def add_json_flag(parser) -> None:
    parser.add_argument("--json", action="store_true",
                        help="print one JSON object instead of tables")


def print_json(obj: Any, *, one_line: bool = False) -> None:
    """Write ``obj`` as JSON on standard output (one object, newline-terminated).

    ``one_line`` writes it on a single line, as one record of a JSON-lines stream.
    """
    console.plain(json.dumps(obj, indent=None if one_line else 2, sort_keys=False) + "\n")


def parse_int(name: str, text: str) -> int:
    """An integer option given as text, or a one-line :class:`ParameterError`.

    >>> parse_int('k', '12')
    12
    """
    try:
        return int(text, 10)
    except (TypeError, ValueError):
        raise ParameterError(f"Argument {name!r} must be an integer, not {clean(text)!r}."
                             ) from None


def parse_float(name: str, text: str) -> float:
    """A number option given as text, or a one-line :class:`ParameterError`."""
    try:
        value = float(text)
    except (TypeError, ValueError):
        raise ParameterError(f"Argument {name!r} must be a number, not {clean(text)!r}."
                             ) from None
    if not math.isfinite(value):
        raise ParameterError(f"Argument {name!r} must be a finite number, not {clean(text)!r}.")
    return value


def add_executor_options(parser, what: str) -> None:
    """``--pool N``, ``--scheduler ADDRESS`` and ``--dask-local N``: where ``what`` runs."""
    parser.add_argument("--pool", type=count_arg(1, 4096), metavar="N",
                        help=f"run {what} on a local pool of N processes")
    parser.add_argument("--scheduler", metavar="ADDRESS", type=address_arg,
                        help=f"run {what} on a running Dask cluster (e.g. tcp://head:8786; "
                             "needs gf2codes[dask])")
    parser.add_argument("--dask-local", type=count_arg(1, 4096), metavar="N",
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
            f"Argument {name!r} must be an integer or a range like 1-40, not {clean(text)!r}."
        ) from None
    if lo_i > hi_i:
        raise ParameterError(f"Argument {name!r} must be an increasing range, not "
                             f"{clean(text)!r}.")
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
        self._bar: Progress | None = None
        self._task: TaskID | None = None

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
        assert self._task is not None
        self._bar.update(self._task, completed=done, total=max(total, done), note=note)


class StagedProgress:
    """The progress callback the CLI hands to a staged library report: one
    :class:`ProgressBar` per stage, labelled with ``info["stage"]``.

    The library announces each stage with ``progress(0, 0, {"stage": name})``; a bar
    appears (after its delay) only for a stage that then reports work.
    """

    def __init__(self) -> None:
        self._stage: str | None = None
        self._bar: ProgressBar | None = None

    def __enter__(self) -> StagedProgress:
        return self

    def __exit__(self, *exc: object) -> None:
        if self._bar is not None:
            self._bar.__exit__()
            self._bar = None

    def __call__(self, done: int, total: int, info: dict) -> None:
        stage = str(info.get("stage", ""))
        if self._bar is None or stage != self._stage:
            self.__exit__()
            self._stage = stage
            self._bar = ProgressBar(stage)
        if done or total:  # not the announcement of the stage
            self._bar(done, total, info)


# ------------------------------------------------- writing a code (build, derive)

#: Largest generator matrix (in bits) printed to the terminal.
_MAX_PRINTED_BITS = 1 << 20


def add_output_flags(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("-o", "--output", metavar="FILE", help="write the code to FILE")
    parser.add_argument("--format", choices=("text", "npy", "json"), default=None,
                        help="file format (default: from the file name; .npy, .json, "
                             "else text)")
    parser.add_argument("--verify", action="store_true",
                        help="compute the minimum distance and print the full verification")
    parser.add_argument("--time-limit", type=seconds_arg, default=None, metavar="SECONDS",
                        help="time limit for --verify")
    add_json_flag(parser)


def emit(code: Code, args: argparse.Namespace, lines: list[str],
         record_fields: dict[str, Any] | None = None) -> int:
    """Write (``-o``), then verify (``--verify``) or print the code; return the exit status.

    ``record_fields`` are extra keys of a JSON record (written or printed)."""
    from .. import formats

    extra = dict(record_fields or {})
    written = None
    if args.output:
        fmt = args.format or {".npy": "npy", ".json": "json"}.get(
            Path(args.output).suffix.lower(), "text")

        def fallback() -> None:  # the write failed: print the code, so nothing is lost
            print_lines(lines + [f"generator matrix ({code.k} x {code.n}):"]
                        + formats.rows_to_strings(code.G))

        written = str(write_output(
            lambda: formats.write_code(code, args.output, fmt,
                                       **(extra if fmt == "json" else {})),
            args.output, fallback))
    if args.verify:
        from ..report import verify  # imported only when --verify asks for it
        from ._verify import render

        if not args.json:
            print_lines(lines + ([f"  wrote {written}"] if written else []))
        with StagedProgress() as bar:
            rep = verify(code, time_limit=args.time_limit, progress=bar)
        return render(rep, as_json=args.json)
    if args.json:
        record = formats.code_to_record(code, **extra)
        record["distance"] = describe_distance(code)
        if written:
            record["written"] = written
        print_json(record)
        return 0
    if written:
        lines = lines + [f"  wrote {written}"]
    elif code.n * code.k <= _MAX_PRINTED_BITS:
        # The whole output is a matrix file: the summary as comments, then the rows.
        lines = [f"# {line.strip()}" for line in lines]
        lines += matrix_block(formats.rows_to_strings(code.G),
                              f"generator matrix, {code.k} x {code.n} (this output is a "
                              "gf2codes matrix file)")
    else:
        lines = lines + ["  (generator matrix too large to print; use -o FILE)"]
    print_lines(lines)
    return 0


def print_lines(lines: list[str]) -> None:
    """Print plain text lines on standard output (through :data:`console`), each made
    safe by :func:`clean`: names and file names come from the input."""
    console.plain("\n".join(clean(line) for line in lines) + "\n")
