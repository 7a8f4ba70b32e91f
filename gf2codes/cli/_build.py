"""``gf2codes build FAMILY ARGS...``: construct a code from a named family.

The output helpers it shares with ``gf2codes derive`` (the statement of what is known
about d, writing / printing / verifying a code) live in ``_text`` and ``_common``.
"""

from __future__ import annotations

import argparse
from typing import Any

from ..code import Code
from ..exceptions import ParameterError
from ..families import FAMILIES, Family, construction_note
from ._common import add_output_flags, check_output_path, emit, print_json
from ._common import print_lines as _print_lines
from ._text import describe_distance

__all__ = ["register", "run"]


def _summary(code: Code, heading: str | None = None) -> list[str]:
    lines = [heading or (code.name or "code"), f"  [n, k] = [{code.n}, {code.k}]",
             f"  {describe_distance(code)}"]
    note = construction_note(code)
    if note:
        lines.append(f"  {note}")
    return lines


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
