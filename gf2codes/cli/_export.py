"""``gf2codes export FILE --format c|text|npy|json|graphml``: the code for implementers.

Writes the systematic encoder and syndrome of a code (see :mod:`gf2codes.export`) to
``-o OUT`` or, for the text formats, to standard output, and reports the encoder's
XOR count so that codes with equal ``[n, k, d]`` can be compared.
"""

from __future__ import annotations

import argparse

from rich.markup import escape

from ..exceptions import ParameterError
from ..export import FORMATS, export_code, systematic_encoder, write_export
from ..formats import read_code
from ._common import add_json_flag, console, err_console, print_json

__all__ = ["register", "run"]


def register(sub: argparse._SubParsersAction) -> None:
    p = sub.add_parser(
        "export",
        help="write the systematic encoder and syndrome as C, text, npy, JSON or GraphML",
        description=(
            "Export the systematic encoder of a code for implementers: c (a C99 header with "
            "the parity masks, encoder and syndrome), text (parity equations, then the "
            "systematic generator matrix), npy (the systematic generator), json (a code "
            "record with an 'encoder' section) or graphml (the Tanner graph). The encoder's "
            "XOR count is reported."
        ),
    )
    p.add_argument("file", help="code file (text rows of 0/1, .npy, or JSON code record)")
    p.add_argument("--format", required=True, metavar="FORMAT",
                   help=f"one of {', '.join(FORMATS)}")
    p.add_argument("-o", "--output", metavar="OUT",
                   help="output file (default: standard output; required for npy)")
    p.add_argument("--prefix", default="gf2code",
                   help="prefix of the C identifiers (default gf2code)")
    p.add_argument("--parity-check", action="store_true",
                   help="the file holds a parity-check matrix, not a generator matrix")
    add_json_flag(p)


def run(args: argparse.Namespace) -> int:
    fmt = args.format.lower()
    if fmt not in FORMATS:
        raise ParameterError(f"Argument '--format' must be one of {', '.join(FORMATS)}, "
                             f"not {args.format!r}.")
    if fmt == "npy" and not args.output:
        raise ParameterError("Argument '--output' must be given for --format npy "
                             "(it is a binary file).")
    if args.json and not args.output:
        raise ParameterError("Argument '--output' must be given with --json (standard output "
                             "carries the summary).")
    code = read_code(args.file, parity_check=args.parity_check).code
    data = export_code(code, fmt, prefix=args.prefix)
    enc = systematic_encoder(code)
    summary = {"source": args.file, "format": fmt, "output": args.output, **enc.summary()}
    if args.output:
        write_export(data, args.output)
    else:
        console.binary(data)
    if args.json:
        print_json(summary)
        return 0
    out = console if args.output else err_console
    where = escape(args.output) if args.output else "standard output"
    out.print(f"wrote the [{enc.n}, {enc.k}] systematic encoder as {fmt} to {where}")
    out.print(f"encoder: {enc.xor_count} two-input XORs for {enc.n - enc.k} parity bits "
              f"(XOR-tree depth {enc.xor_depth}); syndrome: {enc.syndrome_xor_count} XORs")
    return 0
