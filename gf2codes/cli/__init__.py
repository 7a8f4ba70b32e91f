"""The ``gf2codes`` command line.

A thin layer: each sub-command lives in its own module of this package with two
functions, ``register(subparsers)`` that adds its parser and ``run(args) -> int``.
:func:`main` parses the arguments, runs the command, and turns every
:class:`~gf2codes.exceptions.Gf2CodesError` into one line on standard error and
exit status 2. Ctrl-C gives exit status 130, after the command has had the chance
to report what it found. Any other exception is a bug: it is reported as one line
with exit status 3 (``GF2CODES_DEBUG=1`` shows the traceback instead).

Broken pipes, one rule for every command: when the reader of standard output goes
away early (``gf2codes catalog list | head -1``), the command stops writing,
prints nothing more and exits with status 0, as if the output had been read.
Whatever a message echoes from the input (file names, code names) is printed
with control characters made visible (:func:`~gf2codes.cli._common.clean`).

Exit statuses: 0 success; 1 ``equivalent``: the codes are not equivalent, and
``catalog import``: some lines were rejected (each is named on standard error);
2 bad input or an impossible request; 3 an internal error; 4 ``equivalent``:
undecided within the limits; 130 interrupted (Ctrl-C).
"""

from __future__ import annotations

import argparse
import importlib
import os
import sys
from collections.abc import Sequence
from typing import Any

from .._version import __version__
from ..exceptions import Gf2CodesError

__all__ = ["main", "entry_point", "COMMANDS", "SUMMARIES"]

#: Sub-command name -> module (inside this package) that implements it.
COMMANDS: dict[str, str] = {
    "verify": "._verify",
    "bounds": "._bounds",
    "build": "._build",
    "derive": "._derive",
    "search": "._search",
    "channel": "._channel",
    "export": "._export",
    "catalog": "._catalog",
    "equivalent": "._equivalent",
    "grow": "._grow",
    "gaps": "._gaps",
}

#: Sub-command name -> its one-line help, as its module registers it. ``gf2codes --help``
#: prints these without importing any command module (and so without numpy, numba or
#: rich); a test checks that they equal what each module registers.
SUMMARIES: dict[str, str] = {
    "verify": "prove n, k, d of a code, its weight distribution and properties",
    "bounds": "upper and existence bounds for binary linear [n, k, d] codes",
    "build": "construct a code from a named family",
    "derive": "apply derivations (shorten, puncture, extend, ...) to a code",
    "search": "search for the shortest code for (k, d), or the best d or k",
    "channel": "error probabilities of a code on a binary symmetric channel",
    "export": "write the systematic encoder and syndrome as C, text, npy, JSON or GraphML",
    "catalog": "the local catalog of proved codes: add, list, pick, table, ...",
    "equivalent": "decide whether two codes are equal up to a coordinate permutation",
    "grow": "grow the catalog on a region of (n, k) cells: a resumable job",
    "gaps": "where the catalog stands on a region: cells at the bound, the gaps",
}


class _Parser(argparse.ArgumentParser):
    """An argument parser whose errors are one line and exit status 2."""

    def error(self, message: str) -> None:  # type: ignore[override]
        from ._common import clean

        self.exit(2, f"{self.prog}: error: {clean(message)}\n")


def _chosen_command(argv: Sequence[str]) -> str | None:
    """The sub-command named in ``argv`` (the first word that is not an option), if any."""
    for word in argv:
        if not word.startswith("-"):
            return word if word in COMMANDS else None
    return None


def _load_command(name: str) -> Any:
    return importlib.import_module(COMMANDS[name], __name__)


def _build_parser(chosen: str | None) -> tuple[argparse.ArgumentParser, Any]:
    """The parser, with the chosen command fully registered and the others as summaries.

    Only the chosen command's module is imported, so ``gf2codes --help`` imports none
    and ``gf2codes verify ...`` imports only what ``verify`` needs.
    """
    parser = _Parser(
        prog="gf2codes",
        description="Construct, verify and search binary linear block codes over GF(2).",
    )
    parser.add_argument("--version", action="version", version=f"gf2codes {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    module = None
    for name in COMMANDS:
        if name == chosen:
            module = _load_command(name)
            module.register(sub)
        else:
            sub.add_parser(name, help=SUMMARIES.get(name), add_help=False)
    return parser, module


def main(argv: Sequence[str] | None = None) -> int:
    """Run the command line with ``argv`` (default: ``sys.argv[1:]``); return the exit status."""
    words = list(sys.argv[1:] if argv is None else argv)
    parser, module = _build_parser(_chosen_command(words))
    args = parser.parse_args(words)
    if not args.command or module is None:
        parser.print_help()
        return 2
    try:
        return int(module.run(args))  # type: ignore[attr-defined]
    except Gf2CodesError as exc:
        print(f"gf2codes {args.command}: error: {_clean(exc)}", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        print(f"gf2codes {args.command}: interrupted", file=sys.stderr)
        return 130
    except BrokenPipeError:  # output piped into `head` and closed early: see above
        _silence_stdout()
        return 0
    except RecursionError:  # a hostile, deeply nested input that no check caught
        print(f"gf2codes {args.command}: error: the input is nested too deeply to be "
              "read.", file=sys.stderr)
        return 2
    except MemoryError:
        print(f"gf2codes {args.command}: error: not enough memory for this input; "
              "try a smaller one.", file=sys.stderr)
        return 2
    except Exception as exc:  # a bug: one line for the user, the traceback on request
        if os.environ.get("GF2CODES_DEBUG"):
            raise
        print(f"gf2codes {args.command}: internal error ({type(exc).__name__}: "
              f"{_clean(exc)}); please report it. Run with GF2CODES_DEBUG=1 to see the "
              "traceback.", file=sys.stderr)
        return 3


def _clean(text: object) -> str:
    from ._common import clean

    return clean(text)


def _silence_stdout() -> None:
    """Point standard output at the null device, so that the interpreter's final
    flush does not report the closed pipe a second time."""
    try:
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
    except (OSError, ValueError, AttributeError):  # no real stdout (tests capture it)
        pass


def entry_point() -> None:
    """Console-script entry point.

    Before the interpreter shuts down, every object still alive is moved out of the
    garbage collector's reach (:func:`gc.freeze`): the process is ending, and the final
    collections over numba's many objects cost about 0.25 s of every command that used
    a kernel (2-core AVX2 machine). Exit handlers (the on-disk memos) still run.
    """
    import gc

    status = main()
    gc.freeze()
    sys.exit(status)
