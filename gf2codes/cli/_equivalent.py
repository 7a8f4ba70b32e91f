"""``gf2codes equivalent A B``: are two codes equal up to a permutation of coordinates?

Exit status, as ``cmp`` and ``diff`` do it: 0 equivalent (the permutation is printed:
coordinate ``j`` of A goes to coordinate ``p[j]`` of B), 1 not equivalent (with the
reason), 3 undecided (the codes are too large for the exact test), 2 an error.
"""

from __future__ import annotations

import argparse
from typing import Any

from ._common import add_json_flag, print_json, text_console

# Plain text: "p[j]" and "[n, k]" are not markup.
console = text_console

__all__ = ["register", "run"]


def register(subparsers: Any) -> None:
    p = subparsers.add_parser(
        "equivalent", help="decide whether two codes are equal up to a coordinate permutation",
        description="Read two codes (text matrix, .npy or JSON record) and decide whether a "
                    "permutation of coordinates maps the first onto the second. Exit status "
                    "0: equivalent (the permutation is printed, coordinate j of A -> p[j] of "
                    "B); 1: not equivalent (with the reason); 4: undecided within the limits of "
                    "the test; 2: bad input; 3: internal error.")
    p.add_argument("a", metavar="A", help="the first code")
    p.add_argument("b", metavar="B", help="the second code")
    p.add_argument("--parity-check", action="store_true",
                   help="read matrix files as parity-check matrices")
    add_json_flag(p)


#: Exit status of an undecided test (3 is kept for internal errors, as everywhere).
UNDECIDED = 4


def run(args: argparse.Namespace) -> int:
    from ..equivalence import are_equivalent
    from ..formats import read_code

    a = read_code(args.a, parity_check=args.parity_check).code
    b = read_code(args.b, parity_check=args.parity_check).code
    result = are_equivalent(a, b)
    status = {True: 0, False: 1, None: UNDECIDED}[result.equivalent]
    if args.json:
        print_json({"equivalent": result.equivalent, "permutation": result.permutation,
                    "reason": result.reason, "a": {"n": a.n, "k": a.k},
                    "b": {"n": b.n, "k": b.k}})
        return status
    if result.equivalent:
        assert result.permutation is not None
        console.print(f"equivalent: {result.reason}")
        console.print("permutation (coordinate j of A -> p[j] of B): "
                      + " ".join(str(p) for p in result.permutation), soft_wrap=True)
    elif result.equivalent is False:
        console.print(f"not equivalent: {result.reason}")
    else:
        console.print(f"undecided: {result.reason}")
    return status
