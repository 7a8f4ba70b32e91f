"""``gf2codes build FAMILY ARGS...``: construct a code from a named family.

Also holds the output helpers that ``gf2codes derive`` shares: the one-line
statement of what is known about d, and writing / printing / verifying a code.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path
from typing import Any

from ..code import Code
from ..exceptions import ParameterError
from ..families import FAMILIES, Family
from ._common import (
    StagedProgress,
    add_json_flag,
    check_output_path,
    clean,
    print_json,
    seconds_arg,
    write_output,
)
from ._text import matrix_block

__all__ = ["register", "run", "describe_distance", "add_output_flags", "emit"]

#: Largest generator matrix (in bits) printed to the terminal.
_MAX_PRINTED_BITS = 1 << 20


def describe_distance(code: Code) -> str:
    """What the construction proves about d, in words; never more than it proves."""
    lo, hi = code.d_lower, code.d_upper
    if lo is not None and lo == hi:
        return f"d = {lo} (lower and upper bounds of the construction agree)"
    if lo is not None and hi is not None:
        return f"{lo} ≤ d ≤ {hi} (bounds from the construction; d not computed)"
    if lo is not None:
        return f"d ≥ {lo} (lower bound from the construction; d not computed)"
    if hi is not None:
        return f"d ≤ {hi} (upper bound from the construction; d not computed)"
    return "d unknown (not computed)"


def _designed_note(code: Code) -> str | None:
    first = code.recipe[0] if code.recipe else {}
    if first.get("family") == "bch" and len(code.recipe) == 1:
        return (f"designed distance δ = {first['designed']}; the lower bound is the BCH "
                "bound (d ≥ δ, or more when the roots run on), the upper bound the weight "
                "of the generator polynomial")
    return None


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


def _summary(code: Code, heading: str | None = None) -> list[str]:
    lines = [heading or (code.name or "code"), f"  [n, k] = [{code.n}, {code.k}]",
             f"  {describe_distance(code)}"]
    note = _designed_note(code)
    if note:
        lines.append(f"  {note}")
    return lines


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
            _print_lines(lines + [f"generator matrix ({code.k} x {code.n}):"]
                         + formats.rows_to_strings(code.G))

        written = str(write_output(
            lambda: formats.write_code(code, args.output, fmt,
                                       **(extra if fmt == "json" else {})),
            args.output, fallback))
    if args.verify:
        from ..report import verify  # imported only when --verify asks for it
        from ._verify import render

        if not args.json:
            _print_lines(lines + ([f"  wrote {written}"] if written else []))
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
    _print_lines(lines)
    return 0


def _print_lines(lines: list[str]) -> None:
    # names and file names come from the input: no control characters reach the terminal
    sys.stdout.write("\n".join(clean(line) for line in lines) + "\n")
    sys.stdout.flush()


def _argument_usage(family: Family) -> str:
    parts = []
    for a in family.arguments:
        meta = a.name.upper() + ("..." if a.kind == "bits-list" else "")
        if a.option:
            item = f"--{a.name.replace('_', '-')} {meta}"
            parts.append(item if a.required else f"[{item}]")
        else:
            parts.append(meta)
    return " ".join(parts)


def register(subparsers: Any) -> None:
    parser = subparsers.add_parser(
        "build", help="construct a code from a named family",
        description="Construct a code from a named family (see --list) and print it, "
                    "write it (-o) or verify it (--verify).",
    )
    parser.add_argument("--list", action="store_true", help="describe every family")
    parser.add_argument("--json", dest="list_json", action="store_true",
                        help="with --list: print JSON")
    families = parser.add_subparsers(dest="family", metavar="FAMILY", parser_class=type(parser))
    for family in FAMILIES.values():
        sp = families.add_parser(family.name, help=family.description,
                                 description=f"{family.description}. Example: gf2codes build "
                                             f"{family.example}")
        for a in family.arguments:
            kwargs: dict[str, Any] = {"help": a.help}
            if a.kind == "int":
                kwargs["type"] = int
            if a.kind == "bits-list":
                kwargs["nargs"] = "+"
            if a.option:
                sp.add_argument(f"--{a.name.replace('_', '-')}", dest=a.name,
                                metavar=a.name.upper(), required=a.required,
                                default=a.default, **kwargs)
            else:
                sp.add_argument(a.name, metavar=a.name.upper(), **kwargs)
        add_output_flags(sp)


def _list(as_json: bool) -> int:
    if as_json:
        print_json([
            {"family": f.name, "description": f.description, "usage": _argument_usage(f),
             "arguments": [{"name": a.name, "kind": a.kind, "help": a.help,
                            "option": a.option, "required": a.required,
                            "default": a.default} for a in f.arguments],
             "example": f"gf2codes build {f.example}"}
            for f in FAMILIES.values()
        ])
        return 0
    lines = ["gf2codes build FAMILY ARGS... [-o FILE] [--format text|npy|json] [--verify] "
             "[--json]", ""]
    for f in FAMILIES.values():
        lines.append(f"{f.name} {_argument_usage(f)}".rstrip())
        lines.append(f"    {f.description}")
        for a in f.arguments:
            lines.append(f"    {a.name}: {a.help}"
                         + (f" (default {a.default})" if not a.required else ""))
        lines.append(f"    example: gf2codes build {f.example}")
    _print_lines(lines)
    return 0


def run(args: argparse.Namespace) -> int:
    if args.list or args.family is None:
        if args.family is None and not args.list:
            raise ParameterError("Name a FAMILY to build, or use --list to see them.")
        return _list(args.list_json or bool(getattr(args, "json", False)))
    family = FAMILIES[args.family]
    check_output_path(args.output)
    kwargs = {a.name: getattr(args, a.name) for a in family.arguments}
    code = family.build(**kwargs)
    return emit(code, args, _summary(code))
