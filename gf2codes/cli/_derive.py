"""``gf2codes derive FILE OP...``: apply derivations to a code read from a file.

What a file states about d is a claim. The bounds written as ``d_lower`` / ``d_upper``
are only those the derivation rules prove from proved inputs: the bounds of the file's
family recipe when rebuilding it gives the same code, else none. A stated d is carried
through the derivation as a claim (printed as such and written under ``claim``).
"""

from __future__ import annotations

import argparse
from pathlib import Path
from typing import Any

from ..code import Code
from ..derive import UNARY_OPERATIONS, apply_operations, parse_operations
from ..exceptions import Gf2CodesError, ParseError
from ._common import add_output_flags, check_output_path, emit
from ._text import describe_distance

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


def _stated(rec: Any, source: str) -> tuple[int | None, int | None]:
    """The interval the file states (its ``d`` fields, else a carried ``claim``)."""
    d = _claimed(rec.d, "d", source)
    lo = _claimed(rec.d_lower, "d_lower", source)
    hi = _claimed(rec.d_upper, "d_upper", source)
    claim = rec.extra.get("claim")
    if d is None and lo is None and hi is None and isinstance(claim, dict):
        lo = _claimed(claim.get("d_lower"), "claim.d_lower", source)
        hi = _claimed(claim.get("d_upper"), "claim.d_upper", source)
    return (d, d) if d is not None else (lo, hi)


def _proved_by_recipe(code: Code) -> Code | None:
    """The code rebuilt from its recipe, when that gives the same code: the bounds its
    construction proves here (the file's own d fields are only claims)."""
    from ..derive import rebuild

    if not code.recipe or code.recipe[0].get("family") in (None, "matrix"):
        return None
    try:
        built = rebuild(code.recipe)
    except Gf2CodesError:
        return None
    return built if built == code else None


def _interval_text(lo: int | None, hi: int | None) -> str:
    if lo is not None and lo == hi:
        return f"d = {lo}"
    if lo is not None and hi is not None:
        return f"{lo} <= d <= {hi}"
    return f"d >= {lo}" if lo is not None else f"d <= {hi}"


def run(args: argparse.Namespace) -> int:
    from .. import formats

    check_output_path(args.output)
    rec = formats.read_code(args.file, parity_check=args.parity_check)
    steps = parse_operations(args.operations, rec.code.n)
    lo, hi = _stated(rec, args.file)
    built = _proved_by_recipe(rec.code)
    code = rec.code.with_info(
        name=rec.code.name or Path(args.file).name,
        d_lower=None if built is None else built.d_lower,
        d_upper=None if built is None else built.d_upper,
    )
    claim: Code | None = None
    notes = []
    if lo is not None or hi is not None:
        stated = _interval_text(lo, hi)
        plo, phi = code.d_lower, code.d_upper
        if (plo is not None and hi is not None and hi < plo) or (
                phi is not None and lo is not None and lo > phi):
            notes.append(f"  the file states {stated}, which the construction of its recipe "
                         "disproves; the claim is ignored")
        elif (lo is None or (plo is not None and lo <= plo)) and (
                hi is None or (phi is not None and hi >= phi)):
            pass  # the claim says no more than what is proved here
        else:
            claim = code.with_info(d_lower=lo, d_upper=hi)
            notes.append(f"  the file states {stated}: a claim, not proved here")
    lines = [f"from {args.file}: [{code.n}, {code.k}], {describe_distance(code)}", *notes]
    for step in steps:
        code = apply_operations(code, [step])
        if claim is not None:
            claim = apply_operations(claim, [step])
        label = step["op"] + (f" ({len(step['coords'])} coordinates)" if "coords" in step
                              else "")
        lines.append(f"  {label}: [{code.n}, {code.k}]")
    lines += [f"result: [n, k] = [{code.n}, {code.k}]", f"  {describe_distance(code)}"]
    extra: dict[str, Any] = {}
    if claim is not None and (claim.d_lower is not None or claim.d_upper is not None):
        lines.append(f"  if the file's claim holds: {_interval_text(claim.d_lower, claim.d_upper)}"
                     " (a claim carried through the derivation, not proved; --verify "
                     "proves d)")
        extra["claim"] = {"d_lower": claim.d_lower, "d_upper": claim.d_upper,
                          "source": str(args.file),
                          "note": "stated by the input file and carried through the "
                                  "derivation; not proved"}
    return emit(code, args, lines, record_fields=extra)
