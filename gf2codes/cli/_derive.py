"""``gf2codes derive FILE OP...``: apply derivations to a code read from a file."""

from __future__ import annotations

import argparse
from pathlib import Path
from typing import Any

from ..derive import UNARY_OPERATIONS, apply_operations, parse_operations
from ..exceptions import ParseError
from ._build import add_output_flags, describe_distance, emit

__all__ = ["register", "run"]


def register(subparsers: Any) -> None:
    parser = subparsers.add_parser(
        "derive", help="apply derivations (shorten, puncture, extend, ...) to a code",
        description=(
            "Read a code (text matrix, .npy or JSON record) and apply operations in order. "
            f"Operations: {', '.join(UNARY_OPERATIONS)}; puncture and shorten take a "
            "coordinate list (0-based) such as 0-55 or 3,5,10-12. Example: gf2codes derive "
            "hamming7.json shorten 0-55 -o c72.json"
        ),
    )
    parser.add_argument("file", metavar="FILE", help="the code to start from")
    parser.add_argument("operations", metavar="OP", nargs="+",
                        help="operations and their coordinate lists")
    parser.add_argument("--parity-check", action="store_true",
                        help="read a matrix file as a parity-check matrix")
    add_output_flags(parser)


def _claimed(value: Any, key: str, source: str) -> int | None:
    if value is None:
        return None
    if isinstance(value, bool) or not isinstance(value, int) or value < 1:
        raise ParseError(f"{source}: {key!r} must be a positive integer or null, not {value!r}.")
    return value


def run(args: argparse.Namespace) -> int:
    from .. import formats

    steps = parse_operations(args.operations)
    rec = formats.read_code(args.file, parity_check=args.parity_check)
    d = _claimed(rec.d, "d", args.file)
    lo = _claimed(rec.d_lower, "d_lower", args.file)
    hi = _claimed(rec.d_upper, "d_upper", args.file)
    code = rec.code.with_info(
        name=rec.code.name or Path(args.file).name,
        d_lower=d if d is not None else lo,
        d_upper=d if d is not None else hi,
    )
    lines = [f"from {args.file}: [{code.n}, {code.k}], {describe_distance(code)}"]
    for step in steps:
        code = apply_operations(code, [step])
        label = step["op"] + (f" ({len(step['coords'])} coordinates)" if "coords" in step
                              else "")
        lines.append(f"  {label}: [{code.n}, {code.k}]")
    lines += [f"result: [n, k] = [{code.n}, {code.k}]", f"  {describe_distance(code)}"]
    return emit(code, args, lines)
