"""The ``gf2codes`` command line.

A thin layer: each sub-command lives in its own module of this package with two
functions, ``register(subparsers)`` that adds its parser and ``run(args) -> int``.
:func:`main` parses the arguments, runs the command, and turns every
:class:`~gf2codes.exceptions.Gf2CodesError` into one line on standard error and
exit status 2. Ctrl-C gives exit status 130, after the command has had the chance
to report what it found. Any other exception is a bug: it is reported as one line
with exit status 3 (``GF2CODES_DEBUG=1`` shows the traceback instead).
"""

from __future__ import annotations

import argparse
import importlib
import os
import sys
from collections.abc import Sequence

from .._version import __version__
from ..exceptions import Gf2CodesError

__all__ = ["main", "entry_point", "COMMANDS"]

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
}


class _Parser(argparse.ArgumentParser):
    """An argument parser whose errors are one line and exit status 2."""

    def error(self, message: str) -> None:  # type: ignore[override]
        self.exit(2, f"{self.prog}: error: {message}\n")


def _build_parser(available: dict[str, object]) -> argparse.ArgumentParser:
    parser = _Parser(
        prog="gf2codes",
        description="Construct, verify and search binary linear block codes over GF(2).",
    )
    parser.add_argument("--version", action="version", version=f"gf2codes {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    for module in available.values():
        module.register(sub)  # type: ignore[attr-defined]
    return parser


def _available_commands() -> dict[str, object]:
    found = {}
    for name, modname in COMMANDS.items():
        try:
            found[name] = importlib.import_module(modname, __name__)
        except ModuleNotFoundError as exc:  # a command whose module is not written yet
            if exc.name and exc.name.endswith(modname.lstrip(".")):
                continue
            raise
    return found


def main(argv: Sequence[str] | None = None) -> int:
    """Run the command line with ``argv`` (default: ``sys.argv[1:]``); return the exit status."""
    available = _available_commands()
    parser = _build_parser(available)
    args = parser.parse_args(list(sys.argv[1:] if argv is None else argv))
    if not args.command:
        parser.print_help()
        return 2
    module = available[args.command]
    try:
        return int(module.run(args))  # type: ignore[attr-defined]
    except Gf2CodesError as exc:
        print(f"gf2codes {args.command}: error: {exc}", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        print(f"gf2codes {args.command}: interrupted", file=sys.stderr)
        return 130
    except BrokenPipeError:  # output piped into `head` and closed early
        return 0
    except Exception as exc:  # a bug: one line for the user, the traceback on request
        if os.environ.get("GF2CODES_DEBUG"):
            raise
        print(f"gf2codes {args.command}: internal error ({type(exc).__name__}: {exc}); "
              "please report it. Run with GF2CODES_DEBUG=1 to see the traceback.",
              file=sys.stderr)
        return 3


def entry_point() -> None:
    """Console-script entry point."""
    sys.exit(main())
