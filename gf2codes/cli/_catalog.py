"""``gf2codes catalog ...``: the local catalog of proved codes.

Sub-commands: ``add FILE``, ``list``, ``show ID``, ``pick``, ``table``, ``export``,
``import FILE``, ``prove [ID...]``, ``remove ID``, ``info``. Every one takes ``--catalog
PATH`` (default: ``GF2CODES_CATALOG``, else ``$XDG_DATA_HOME/gf2codes/catalog.sqlite``)
and ``--json``.

Every distance shown says how it is known: "proved" only for a proof made by this
installation; what a file or the shipped seed states is "claimed" (``prove`` proves it).
The reading actions never create anything: without a catalog file they answer from the
shipped seed in memory, and say so (``info`` says the catalog does not exist). A catalog
file the user may not write is read normally; the writing actions say why they cannot.

Exit status: 0 on success; 1 when ``pick`` finds nothing, ``import`` rejected a line or
``prove`` left a claim unproved; 2 for errors (one line on standard error).
"""

from __future__ import annotations

import argparse
import json
import sys
from typing import Any

from ..exceptions import CatalogError, ParameterError, TooExpensiveError, check_int
from ._common import (
    check_output_path,
    clean,
    count_arg,
    parse_range,
    print_json,
    say,
    seconds_arg,
    seconds_or_zero_arg,
    seed_arg,
    text_console,
    write_output,
)
from ._text import length_grid, matrix_block, triple_text, weight_text

# Plain text: codes print as [n, k, d], which rich would take for markup.
console = text_console

__all__ = ["register", "run"]


def _common_options(parser: argparse.ArgumentParser, *, suppress: bool) -> None:
    default = argparse.SUPPRESS if suppress else None
    parser.add_argument("--catalog", metavar="PATH", default=default,
                        help="the catalog file (default: $GF2CODES_CATALOG, else "
                             "$XDG_DATA_HOME/gf2codes/catalog.sqlite)")
    parser.add_argument("--json", action="store_true",
                        default=argparse.SUPPRESS if suppress else False,
                        help="print JSON instead of text")


def _filters(parser: argparse.ArgumentParser) -> None:
    for name in ("n", "k", "d"):
        parser.add_argument(f"--{name}", metavar="R", help=f"{name}, a value or a range like 1-32"
                            + (" (the proved lower bound)" if name == "d" else ""))


def register(subparsers: Any) -> None:
    parser = subparsers.add_parser(
        "catalog", help="the local catalog of proved codes: add, list, pick, table, ...",
        description="A local SQLite catalog of codes with proved parameters and the recipes "
                    "that made them. A new catalog starts from the shipped seed records.",
    )
    _common_options(parser, suppress=False)
    sub = parser.add_subparsers(dest="action", metavar="ACTION", required=True,
                                parser_class=type(parser))

    p = sub.add_parser("add", help="prove d of a code in a file and store it")
    p.add_argument("file", metavar="FILE", help="text matrix, .npy or JSON code record")
    p.add_argument("--parity-check", action="store_true",
                   help="read a matrix file as a parity-check matrix")
    p.add_argument("--time-limit", type=seconds_arg, metavar="S",
                   help="seconds for proving d (default: no limit, refuse if too costly)")
    p.add_argument("--allow-interval", action="store_true",
                   help="store the proved interval when d cannot be proved in time")
    p.add_argument("--source", default="file",
                   help="what produced the code: file (default), family, search, ...")
    p.add_argument("--seed", type=seed_arg, help="the seed of the search that found it")
    _common_options(p, suppress=True)

    p = sub.add_parser("list", help="list stored entries")
    _filters(p)
    p.add_argument("--origin", choices=("user", "shipped"), help="only entries of this origin")
    _common_options(p, suppress=True)

    p = sub.add_parser("show", help="an entry: its code, recipes and proof")
    p.add_argument("id", type=int, metavar="ID")
    _common_options(p, suppress=True)

    p = sub.add_parser(
        "pick", help="take the code on file that answers two of n, k, d",
        description="Give two of --n, --k, --d. --k --d: the shortest code on file with k "
                    "data bits and distance at least d; --n --k: the one with the largest "
                    "distance; --n --d: the one with the most data bits. Codes made from "
                    "stored ones (shortened, punctured, extended, with zero coordinates "
                    "appended, subcodes) count, and say so.")
    p.add_argument("--n", type=count_arg(1, 1 << 20))
    p.add_argument("--k", type=count_arg(1, 1 << 20))
    p.add_argument("--d", type=count_arg(1, 1 << 20))
    p.add_argument("--rows", action="store_true",
                   help="also print the generator rows, as a matrix file")
    p.add_argument("--prove-time", type=seconds_or_zero_arg, default=2.0, metavar="S",
                   help="seconds for proving the exact d of a derived answer (0: do not)")
    _common_options(p, suppress=True)

    p = sub.add_parser(
        "table", help="shortest length on file for k data bits and distance d",
        description="A grid with a row per k (data bits) and a column per d (distance): "
                    "each cell is the shortest length n of a code on file beside the least "
                    "length the bounds allow. --open lists the open cells instead.")
    p.add_argument("--k", default="1-16", metavar="R", help="data bits, e.g. 1-16 (default)")
    p.add_argument("--d", default="1-12", metavar="R", help="distances, e.g. 1-12 (default)")
    p.add_argument("--open", action="store_true",
                   help="list only the open cells, with what would close each one")
    _common_options(p, suppress=True)

    p = sub.add_parser("export", help="write entries as JSON lines")
    p.add_argument("-o", "--output", metavar="FILE", help="file to write (default: stdout)")
    _filters(p)
    p.add_argument("--no-stamps", action="store_true",
                   help="leave out dates and versions (the format of the shipped catalog)")
    _common_options(p, suppress=True)

    p = sub.add_parser("import", help="read JSON-lines records (idempotent)",
                       description="Read JSON-lines records into the catalog. Exit status 0 "
                                   "when every line was taken, 1 when some lines were "
                                   "rejected (each is named on standard error), 2 on bad "
                                   "input.")
    p.add_argument("file", metavar="FILE", help="JSON lines; '-' for standard input")
    p.add_argument("--trust", action="store_true",
                   help="do not re-prove the records: check them cheaply (a contradiction "
                        "is refused) and keep what is not proved as a claim")
    p.add_argument("--time-limit", type=seconds_arg, default=10.0, metavar="S",
                   help="seconds per record for re-proving d when the weights are too costly")
    _common_options(p, suppress=True)

    p = sub.add_parser(
        "prove", help="prove the d of claimed entries here (upgrading them to proved)",
        description="Prove the minimum distance of entries whose d is only claimed (trusted "
                    "imports, the shipped seed, entries stored before provenance was "
                    "recorded). A proof replaces the claim; a claim found false is corrected.")
    p.add_argument("ids", metavar="ID", nargs="*", type=int,
                   help="entries to prove (default: every entry not proved here)")
    p.add_argument("--time-limit", type=seconds_arg, default=10.0, metavar="S",
                   help="seconds per entry (default 10)")
    _common_options(p, suppress=True)

    p = sub.add_parser("remove", help="delete an entry and its recipes")
    p.add_argument("id", type=int, metavar="ID")
    _common_options(p, suppress=True)

    p = sub.add_parser("info", help="where the catalog is and what it holds")
    _common_options(p, suppress=True)


def _range(name: str, text: str | None) -> range | None:
    return None if text is None else parse_range(name, text)


def _label(entry) -> str:
    return triple_text(entry.n, entry.k, entry.d_lower, entry.d_upper)


def _status(entry) -> str:
    """``d proved``, ``interval proved``, ``d claimed``...: how d is known."""
    kind = entry.provenance.kind
    if kind == "proved":
        return "d proved" if entry.closed else (
            "lower bound proved" if entry.d_upper is None else "interval proved")
    return "d claimed, checked only" if kind == "checked" else "d claimed"


#: Actions that change the catalog (they may create it); the others only read.
_WRITING = {"add", "import", "remove", "prove"}


def run(args: argparse.Namespace) -> int:
    from ..catalog import default_catalog_path, open_catalog

    handler = _HANDLERS[args.action]
    if args.action in _WRITING:
        with open_catalog(args.catalog) as cat:
            cat.require_writable(f"{args.action} entries")
            return handler(cat, args)
    path = default_catalog_path() if args.catalog is None else args.catalog
    try:
        cat = open_catalog(path, create=False)
    except CatalogError:
        from pathlib import Path

        if Path(path).exists():
            raise
        if args.action == "info":
            raise CatalogError(f"{path}: no catalog there; nothing was created (the first "
                               "'catalog add', 'catalog import' or 'search' creates it with "
                               "the shipped seed).") from None
        say(f"note: no catalog at {path} (nothing was created); answering from the "
            "shipped seed.", err=True)
        cat = open_catalog(":memory:")
    with cat:
        return handler(cat, args)


# ------------------------------------------------------------------ handlers
def _add(cat, args) -> int:
    from ..distance import minimum_distance
    from ..formats import read_code
    from ._common import ProgressBar

    if args.time_limit is not None and not args.time_limit > 0:
        raise ParameterError(f"Argument '--time-limit' must be positive, not {args.time_limit}.")
    rec = read_code(args.file, parity_check=args.parity_check)
    code = rec.code  # what the file states about d is ignored: d is proved here
    with ProgressBar("proving d") as bar:
        try:
            result = minimum_distance(code, time_limit=args.time_limit, progress=bar)
        except TooExpensiveError as exc:
            raise CatalogError(f"{args.file}: not added: {exc}; pass --time-limit S "
                               "--allow-interval to store a proved interval.") from None
    if not result.exact and not args.allow_interval:
        raise CatalogError(f"{args.file}: not added: d is not proved ({result.describe()}); "
                           "pass --allow-interval to store the interval.")
    proof = {"method": result.method, "seconds": round(result.seconds, 3),
             "codewords": int(result.codewords)}
    eid, status = cat.add_or_merge(code, d=result.lower, proved=result.exact, recipe=None,
                                   source=args.source, seed=args.seed, d_upper=result.upper,
                                   proof=proof)
    entry = cat.get(eid)
    if args.json:
        print_json({"id": eid, "status": status, "n": entry.n, "k": entry.k,
                    "d": entry.d if entry.proved else None, "d_lower": entry.d_lower,
                    "d_upper": entry.d_upper, "proof": proof,
                    "provenance": entry.provenance.to_dict()})
        return 0
    what = {"added": "added as entry", "merged": "merged into equivalent entry",
            "unchanged": "already stored as entry"}[status]
    console.print(f"{args.file}: [{code.n}, {code.k}], {result.describe()} "
                  f"({result.method}, {result.seconds:.2f} s)")
    console.print(f"{what} {eid}: {_label(entry)}, {len(entry.recipes)} recipe(s)")
    return 0


def _list(cat, args) -> int:
    entries = cat.entries(n=_range("n", args.n), k=_range("k", args.k), d=_range("d", args.d),
                          origin=args.origin)
    if args.json:
        print_json([{"id": e.id, "n": e.n, "k": e.k, "d": e.d if e.proved else None,
                     "d_lower": e.d_lower, "d_upper": e.d_upper, "origin": e.origin,
                     "status": e.provenance.kind,
                     "recipes": [r["source"] for r in e.recipes]} for e in entries])
        return 0
    rows = [("id", "code", "d is", "origin", "recipes", "first recipe")]
    for e in entries:
        first = e.recipes[0] if e.recipes else None
        rows.append((str(e.id), _label(e), _status(e).removeprefix("d "), e.origin or "",
                     str(len(e.recipes)), _recipe_text(first) if first else ""))
    widths = [max(len(r[i]) for r in rows) for i in range(5)]
    for r in rows:
        line = "  ".join(f"{r[i]:<{widths[i]}}" for i in range(5)) + "  " + r[5]
        console.print(line.rstrip(), soft_wrap=True)
    claims = sum(1 for e in entries if not e.provenance.proved)
    console.print(f"{len(entries)} entr{'y' if len(entries) == 1 else 'ies'}"
                  + (f"; {claims} with d only claimed ('gf2codes catalog prove' proves them)"
                     if claims else ""))
    return 0


def _recipe_text(item: dict[str, Any]) -> str:
    steps = item.get("recipe") or []
    parts = []
    for s in steps:
        if "family" in s:
            args = ", ".join(f"{k}={v}" for k, v in s.items()
                             if k != "family" and k != "generator")
            parts.append(f"{s['family']}({args})")
        else:
            extra = f" {len(s['coords'])}" if "coords" in s else (
                f" {s['count']}" if "count" in s else "")
            parts.append(f"{s.get('op')}{extra}")
    text = " -> ".join(parts) if parts else "(no recipe)"
    tail = f" seed={item['seed']}" if item.get("seed") is not None else ""
    return f"{item['source']}: {text}{tail}"


def _show(cat, args) -> int:
    from ..formats import rows_to_strings

    entry = cat.get(args.id)
    if args.json:
        print_json(entry.to_dict())
        return 0
    console.print(f"entry {entry.id}: {_label(entry)}  ({entry.origin}; added {entry.added_at} "
                  f"by gf2codes {entry.added_by})", soft_wrap=True)
    prov = entry.provenance
    what = f"d = {entry.d}" if entry.closed else f"{entry.d_lower} ≤ d ≤ {entry.d_upper}"
    if prov.proved:
        tail = "" if entry.closed else " (only the interval is proved)"
        console.print(f"  {what} {prov.describe()}{tail}", soft_wrap=True)
    else:
        console.print(f"  {what}: {prov.describe()}. Not proved here; 'gf2codes catalog "
                      f"prove {entry.id}' proves it.", soft_wrap=True)
    if entry.weights:
        label = "weight distribution" if prov.proved else \
            "weight distribution (as stored, not computed here)"
        console.print(f"  {label}: {weight_text(entry.weights)}", soft_wrap=True)
    console.print(f"  invariant: {entry.invariant}", soft_wrap=True)
    console.print(f"  recipes ({len(entry.recipes)}):")
    for r in entry.recipes:
        perm = " (rebuilds a permuted copy; permutation kept)" if r.get("permutation") else ""
        console.print(f"    - {_recipe_text(r)}{perm}  [{r['added']}]", soft_wrap=True)
    block = matrix_block(rows_to_strings(entry.code.rref_generator),
                         f"entry {entry.id}: generator matrix in reduced echelon form, "
                         f"{entry.k} x {entry.n}")
    console.plain("\n".join(block) + "\n")
    return 0


def _pick(cat, args) -> int:
    from ..distance import minimum_distance
    from ..formats import rows_to_strings

    for name in ("n", "k", "d"):
        if getattr(args, name) is not None:
            check_int(f"--{name}", getattr(args, name), minimum=1)
    entry = cat.pick(n=args.n, k=args.k, d=args.d)
    asked = ", ".join(f"{x} = {getattr(args, x)}" for x in ("n", "k", "d")
                      if getattr(args, x) is not None)
    if entry is None:
        if args.json:
            print_json({"found": False})
        else:
            console.print(f"nothing in the catalog for {asked}")
        return 1
    exact = entry.d if entry.proved else None
    proof_note = None
    if entry.derived_from and args.prove_time > 0:
        result = minimum_distance(entry.code, time_limit=args.prove_time)
        if result.exact:
            exact = result.d
            proof_note = f"rebuilt; d = {result.d} proved ({result.method}, " \
                         f"{result.seconds:.2f} s)"
        else:
            proof_note = f"rebuilt; {result.describe()}"
    if args.json:
        out = entry.to_dict()
        out.update(found=True, d_proved=exact, note=proof_note)
        print_json(out)
        return 0
    label = _label(entry)
    if entry.derived_from is None:
        console.print(f"{label}: entry {entry.id} ({entry.origin}), {_status(entry)}")
        if not entry.provenance.proved:
            console.print(f"  {entry.provenance.describe()}; not proved here ('gf2codes "
                          f"catalog prove {entry.id}' proves it)", soft_wrap=True)
        first = entry.recipes[0] if entry.recipes else None
        if first:
            console.print(f"  recipe: {_recipe_text(first)}", soft_wrap=True)
    else:
        console.print(f"{label}: derived from {entry.derived_from}", soft_wrap=True)
        if not entry.provenance.proved:
            console.print(f"  d ≥ {entry.d} is a claim: the base entry's d is claimed, not "
                          "proved here", soft_wrap=True)
        if proof_note:
            console.print(f"  {proof_note}")
    if args.rows:
        shown = label if exact is None else f"[{entry.n}, {entry.k}, {exact}]"
        block = matrix_block(rows_to_strings(entry.code.G),
                             f"generator matrix of {shown}, {entry.k} x {entry.n}")
        console.plain("\n".join(block) + "\n")
    return 0


#: Largest k and d that ``table`` accepts: each cell computes the least length the bounds
#: allow (LP included). Measured on a loaded 2-core machine (load average 8): the grid
#: 1-32 x 1-32 in 6.6 s, 1-64 x 1-64 in 66 s (the one cell k = d = 64 alone 13.5 s).
_TABLE_LIMIT = 32


def _table(cat, args) -> int:
    ks, ds = parse_range("k", args.k), parse_range("d", args.d)
    check_int("k", ks.start, minimum=1)
    check_int("d", ds.start, minimum=1)
    for name, r in (("k", ks), ("d", ds)):
        if r.stop - 1 > _TABLE_LIMIT:
            raise ParameterError(f"Argument '{name}' must be at most {_TABLE_LIMIT} in catalog "
                                 f"table, not {r.stop - 1} (use 'catalog pick' for one cell).")
    rows = cat.length_table(ks, ds)
    if args.json:
        print_json({"k": [ks[0], ks[-1]], "d": [ds[0], ds[-1]], "cells": rows})
        return 0
    settled = [r for r in rows if r["gap"] == 0]
    missing = [r for r in rows if r["n"] is None]
    out: list[str] = []
    if args.open:
        for r in rows:
            if r["gap"] == 0:
                continue
            k, d, low = r["k"], r["d"], r["n_least"]
            bound = f"bounds rule out n < {low} ({r['least_by']})"
            if r["n"] is None:
                out.append(f"k={k} d={d}: nothing on file; {bound}; to close: find a "
                           f"[{low}, {k}, ≥{d}] code, or rule out length {low}")
                continue
            made = "stored" if r["stored"] else "derived from entry"
            need = (f"a [{low}, {k}, ≥{d}] code, or a proof that none exists" if r["gap"] == 1
                    else f"a code of length {low} to {r['n'] - 1}, or proofs that none exist")
            out.append(f"k={k} d={d}: on file n = {r['n']} ({made} {r['entry']}); {bound}; "
                       f"to close: {need}")
    else:
        out.append("shortest length n on file: k data bits (rows), distance at least d "
                   "(columns)")
        out += length_grid({(r["k"], r["d"]): (r["n_least"], r["n"]) for r in rows}, ks, ds)
        out += ["N     a code of length N is on file and the bounds rule out N-1: proved "
                "shortest",
                "N+g   the bounds rule out lengths below N; the shortest code on file has "
                "length N+g",
                "N+?   the bounds rule out lengths below N; nothing on file",
                "catalog pick --k K --d D gives the code of a cell; catalog table --open",
                "lists what would close each open cell"]
    out.append(f"{len(settled)} of {len(rows)} cells proved shortest, "
               f"{len(rows) - len(settled) - len(missing)} open, {len(missing)} with nothing "
               "on file")
    claims = [r for r in rows if r.get("claimed_n") is not None]
    if claims:
        out.append(f"{len(claims)} cell(s) have a shorter length only claimed by unproved "
                   "entries (not counted; 'gf2codes catalog prove' proves them)")
    console.plain("\n".join(out) + "\n")
    return 0


def _export(cat, args) -> int:
    filters = {"n": _range("n", args.n), "k": _range("k", args.k), "d": _range("d", args.d)}
    if args.output:
        check_output_path(args.output)

        def write() -> int:
            with open(args.output, "w", encoding="utf-8") as fh:
                return int(cat.export(fh, stamps=not args.no_stamps, **filters))

        count = write_output(write, args.output)
        msg = {"exported": count, "file": args.output}
        if args.json:
            print_json(msg)
        else:
            console.print(f"exported {count} entries to {args.output}")
    else:
        cat.export(sys.stdout, stamps=not args.no_stamps, **filters)
    return 0


def _import(cat, args) -> int:
    from ..formats import read_input_bytes

    # The same reader as matrix files: standard input, pipes, size limits, NUL bytes.
    data = read_input_bytes(args.file)
    source = "<stdin>" if args.file == "-" else args.file
    try:
        lines = data.decode("utf-8").splitlines()
    except UnicodeDecodeError:
        raise CatalogError(f"{clean(args.file)}: not a text file of JSON lines.") from None
    report = cat.import_records(lines, source=source, verify=not args.trust,
                                time_limit=args.time_limit)
    if args.json:
        print_json({"added": report.added, "merged": report.merged,
                    "unchanged": report.unchanged,
                    "errors": [{"line": ln, "message": m} for ln, m in report.errors]})
    else:
        for _, message in report.errors:
            say(message, err=True)
        console.print(f"{report.added} added, {report.merged} merged into existing entries, "
                      f"{report.unchanged} already present, {len(report.errors)} rejected")
        claims = report.status.get("checked", 0) + report.status.get("claimed", 0)
        if claims:
            console.print(f"{claims} record(s) kept as claims: their d is not proved here "
                          "(cheap checks passed); 'gf2codes catalog prove' proves them",
                          soft_wrap=True)
    return 1 if report.errors else 0


def _prove(cat, args) -> int:
    from ._common import ProgressBar

    if not args.time_limit > 0:
        raise ParameterError(f"Argument '--time-limit' must be positive, not {args.time_limit}.")
    with ProgressBar("proving claims") as bar:
        outcomes = cat.prove_claims(args.ids or None, time_limit=args.time_limit, progress=bar)
    if args.json:
        print_json([{"id": o.id, "verdict": o.verdict, "d_lower": o.d_lower,
                     "d_upper": o.d_upper, "claimed_lower": o.claimed_lower,
                     "claimed_upper": o.claimed_upper, "detail": o.detail} for o in outcomes])
    else:
        for o in outcomes:
            claim = (f"{o.claimed_lower}" if o.claimed_lower == o.claimed_upper
                     else f"{o.claimed_lower}..{o.claimed_upper}")
            if o.verdict == "already proved":
                console.print(f"entry {o.id}: already proved here")
            elif o.verdict == "not settled":
                console.print(f"entry {o.id}: still claimed (d = {claim}); within "
                              f"{args.time_limit:g} s only {o.detail}", soft_wrap=True)
            else:
                got = (f"d = {o.d_lower}" if o.d_lower == o.d_upper
                       else f"{o.d_lower} ≤ d ≤ {o.d_upper}")
                if o.verdict == "the claim was false":
                    console.print(f"entry {o.id}: the claim d = {claim} was false; {got} "
                                  "proved here (the entry is corrected)", soft_wrap=True)
                else:
                    console.print(f"entry {o.id}: {got} proved here (the claim held)")
        unsettled = sum(1 for o in outcomes if o.verdict == "not settled")
        console.print(f"{len(outcomes)} entr{'y' if len(outcomes) == 1 else 'ies'} looked at, "
                      f"{unsettled} still claimed")
    return 1 if any(o.verdict == "not settled" for o in outcomes) else 0


def _remove(cat, args) -> int:
    entry = cat.remove(args.id)
    if args.json:
        print_json({"removed": entry.id, "n": entry.n, "k": entry.k, "d_lower": entry.d_lower,
                    "d_upper": entry.d_upper})
    else:
        console.print(f"removed entry {entry.id}: {_label(entry)} and its "
                      f"{len(entry.recipes)} recipe(s)")
    return 0


def _info(cat, args) -> int:
    info = cat.info()
    info["exists"] = True
    info["readonly"] = cat.readonly
    info["problems"] = cat.check()
    if args.json:
        print_json(info)
    else:
        console.print(json.dumps(info, indent=1))
    return 0


_HANDLERS = {"add": _add, "list": _list, "show": _show, "pick": _pick, "table": _table,
             "export": _export, "import": _import, "prove": _prove, "remove": _remove,
             "info": _info}
