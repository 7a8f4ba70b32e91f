"""``gf2codes bounds``: what the bounds say about binary linear codes with given parameters.

Four modes, chosen by which options are given:

* ``--n N --k K``: every upper bound on ``d``, the best one, and the existence bounds;
* ``--n N --d D``: the greatest dimension each bound allows;
* ``--k K --d D``: the least length each bound allows (and which bounds force it);
* ``--table [--k A-B] [--d C-D]``: for every (k, d), the least length the upper bounds
  allow and the length at which an existence bound guarantees a code.
* ``--n N --k K --d D``: is there an ``[N, K, D]`` code? The bounds, then an exhaustive
  search within a node budget (``--nodes``) when they leave the question open.
"""

from __future__ import annotations

from typing import Any

from rich.table import Table

from .. import bounds as B
from ..exceptions import ParameterError
from ..questions import question_type
from ._common import add_json_flag, console, parse_int, parse_range, print_json
from ._text import length_grid

__all__ = ["register", "run"]

_NODES = 2_000_000  # default node budget of the exhaustive decision
_TABLE_LIMIT = 128  # largest k and d accepted in --table mode (each cell may solve LPs)


def register(subparsers) -> None:
    p = subparsers.add_parser(
        "bounds",
        help="upper and existence bounds for binary linear [n, k, d] codes",
        description="Bounds for binary linear codes. Give two of --n, --k, --d, "
                    "or --table with ranges of --k and --d.",
    )
    p.add_argument("--n", metavar="N", help="length")
    p.add_argument("--k", metavar="K",
                   help="dimension (data bits); a range like 1-16 with --table (the default)")
    p.add_argument("--d", metavar="D",
                   help="minimum distance; a range like 1-10 with --table (the default)")
    p.add_argument("--nodes", metavar="N", default=None,
                   help="node budget of the exhaustive search with --n --k --d "
                        f"(default {_NODES:,})")
    p.add_argument("--time-limit", metavar="SECONDS", default=None,
                   help="time limit of the exhaustive search with --n --k --d (default 60)")
    p.add_argument("--method", choices=("auto", "rows", "columns", "residual"),
                   default="auto",
                   help="exhaustive search with --n --k --d: generator rows, parity-check "
                        "columns, classified residual codes (best at low rates), or rows/"
                        "columns, whichever is estimated cheaper (default auto)")
    p.add_argument("--table", action="store_true",
                   help="for every k and d in the ranges: the least length the bounds allow "
                        "and the length at which a code is guaranteed to exist")
    p.add_argument("--plot", metavar="FILE.png",
                   help="also draw the bounds on d against n for the given k into an image file")
    add_json_flag(p)


def run(args) -> int:
    if getattr(args, "plot", None):
        return _run_and_plot(args)
    given = {name for name in ("n", "k", "d") if getattr(args, name) is not None}
    if args.table:
        if "n" in given:
            raise ParameterError("Argument 'n' must not be given with --table (its rows are "
                                 "k and its columns d; each cell is a length).")
        return _run_table(args)
    if given == {"n", "k", "d"}:
        return _run_nkd(parse_int("n", args.n), parse_int("k", args.k), parse_int("d", args.d),
                        args)
    if len(given) == 2:
        asked = question_type(args.n, args.k, args.d, options=True)
        runner = {"distance": _run_nk, "dimension": _run_nd, "length": _run_kd}[asked.mode]
        first, second = (parse_int(name, getattr(args, name)) for name in asked.given_names)
        return runner(first, second, args.json)
    raise ParameterError(
        "Arguments must be two or three of --n, --k, --d (or --table), not "
        + (", ".join(f"--{g}" for g in sorted(given)) or "none") + "."
    )


def _run_and_plot(args) -> int:
    """``bounds --plot FILE``: the report, then the bounds on d against n for the given k."""
    from ..plots import require_matplotlib, save_bounds_plot

    require_matplotlib()
    if args.k is None or "-" in args.k:
        raise ParameterError("Argument '--plot' needs a single dimension --k.")
    path, args.plot = args.plot, None
    status = run(args)
    n = parse_int("n", args.n) if args.n is not None and "-" not in args.n else None
    d = parse_int("d", args.d) if args.d is not None else None
    out = save_bounds_plot(path, k=parse_int("k", args.k), n=n, d=d)
    from ._common import err_console

    err_console.print(f"wrote {out}")
    return status


def _mark(values: dict[str, int], best: int) -> dict[str, bool]:
    return {name: value == best for name, value in values.items()}


def _run_nk(n: int, k: int, as_json: bool) -> int:
    upper = B.upper_bounds(n, k)  # validates n and k
    best = B.best_upper(n, k)
    exist = B.existence_for_distance(n, k)
    lower = exist.per_bound
    skipped = B.skipped_bounds(n)
    guaranteed = exist.value
    chain = B.bound_chain(n, k) if n <= B.TABLE_LENGTH else []
    if as_json:
        print_json({"mode": "distance", "n": n, "k": k, "upper": upper, "lower": lower,
                    "best": {"d": best.d, "by": best.by}, "guaranteed_d": guaranteed,
                    "table_chain": chain, "skipped": skipped})
        return 0
    t = Table(title=f"Upper bounds on d, binary linear [{n},{k}]")
    t.add_column("bound")
    t.add_column("d at most", justify="right")
    t.add_column("")
    tight = _mark(upper, min(upper.values()))
    for name, value in upper.items():
        t.add_row(B.title(name), str(value), "tightest" if tight[name] else "")
    console.print(t)
    console.print(f"Best upper bound: d <= {best.d}  (from {best.by})")
    if len(chain) > 1:
        console.print("  table steps: " + "; ".join(chain), soft_wrap=True)
    _print_skipped(skipped)
    lo = Table(title="Existence bounds")
    lo.add_column("bound")
    lo.add_column("d at least", justify="right")
    for name, low in lower.items():
        lo.add_row(B.title(name), str(low))
    console.print(lo)
    if not lower:
        console.print(f"  (existence bounds skipped; {n // k or 1} = floor(n/k) from "
                      "k repetition blocks)")
    console.print(f"Every binary linear [{n},{k}] code has d <= {best.d}; "
                  f"codes with d >= {guaranteed} are guaranteed to exist.")
    return 0


def _run_nd(n: int, d: int, as_json: bool) -> int:
    dims = B.dimension_bounds(n, d)  # validates n and d
    best = B.max_dimension(n, d)
    exist = B.existence_for_dimension(n, d)
    if as_json:
        print_json({"mode": "dimension", "n": n, "d": d, "upper": dims,
                    "lower": exist.per_bound,
                    "skipped": B.skipped_bounds(n),
                    "best": {"k": best.k, "by": best.by},
                    "guaranteed_k": {"k": exist.value, "by": exist.by}})
        return 0
    t = Table(title=f"Greatest dimension k for a binary linear code, n = {n}, d = {d}")
    t.add_column("bound")
    t.add_column("k at most", justify="right")
    t.add_column("")
    tight = _mark(dims, min(dims.values()))
    for name, value in dims.items():
        t.add_row(B.title(name), str(value), "tightest" if tight[name] else "")
    console.print(t)
    console.print(f"Best: k <= {best.k}  (k = {best.k + 1} ruled out by {best.by})"
                  if best.k < n else f"Best: k <= {best.k}")
    _print_skipped(B.skipped_bounds(n))
    console.print(f"Every binary linear code of length {n} and distance >= {d} has "
                  f"k <= {best.k}; k = {exist.value} is guaranteed to exist "
                  f"({B.title(exist.by)}).")
    return 0


def _run_kd(k: int, d: int, as_json: bool) -> int:
    lengths = B.length_bounds(k, d)  # validates k and d
    best = B.least_length(k, d)
    exist = B.existence_for_length(k, d)
    forced = B.ruling_out(best.n - 1, k, d) if best.n > 1 else []
    if as_json:
        print_json({"mode": "length", "k": k, "d": d, "upper": lengths,
                    "lower": exist.per_bound,
                    "skipped": B.skipped_bounds(max(k, d)),
                    "best": {"n": best.n, "by": best.by, "ruled_out_by": forced},
                    "guaranteed_n": {"n": exist.value, "by": exist.by}})
        return 0
    t = Table(title=f"Least length n for a binary linear code, k = {k}, d = {d}")
    t.add_column("bound")
    t.add_column("n at least", justify="right")
    t.add_column("")
    top = max(lengths.values())
    for name, value in lengths.items():
        t.add_row(B.title(name), str(value), "tightest" if value == top else "")
    console.print(t)
    why = ", ".join(B.title(f) for f in forced) or best.by
    console.print(f"No binary linear code with k = {k}, d = {d} is shorter than {best.n}; "
                  f"length {best.n - 1} is ruled out by: {why}.")
    _print_skipped(B.skipped_bounds(max(k, d)))
    console.print(f"Such a code is guaranteed to exist at length {exist.value} "
                  f"({B.title(exist.by)}).")
    return 0


def _print_skipped(skipped: dict[str, str]) -> None:
    for name, why in skipped.items():
        console.print(f"  skipped: {B.title(name)} ({why})", soft_wrap=True)


def _run_nkd(n: int, k: int, d: int, args) -> int:
    """``--n --k --d``: the bounds' verdict, then an exhaustive decision when it is open."""
    from ..existence import decide_existence
    from ._common import err_console, parse_float

    ub = B.best_upper(n, k)  # validates n and k
    nodes = _NODES if args.nodes is None else parse_int("nodes", args.nodes)
    limit = 60.0 if args.time_limit is None else parse_float("time_limit", args.time_limit)
    if nodes < 1:
        raise ParameterError(f"Argument 'nodes' must be at least 1, not {nodes}.")
    if not limit > 0:
        raise ParameterError(f"Argument 'time_limit' must be positive, not {limit}.")
    if d < 1:
        raise ParameterError(f"Argument 'd' must be at least 1, not {d}.")
    out: dict = {"mode": "existence", "n": n, "k": k, "d": d, "d_upper_bound": ub.d,
                 "d_upper_bound_by": ub.by}
    if d > ub.d:
        out.update(exists=False, by=ub.by,
                   statement=f"no [{n},{k},{d}] code exists: d <= {ub.d} ({ub.by})")
    elif n - k > 62:
        out.update(exists=None, by=None, statement=f"the bounds allow [{n},{k},{d}] "
                   f"(d <= {ub.d}); n - k = {n - k} is too large for an exhaustive search")
    else:
        def progress(done: int, info: dict) -> None:
            err_console.print(f"  {info['note']}", end="\r")

        dec = decide_existence(n, k, d, max_nodes=nodes, time_limit=limit,
                               progress=None if args.json else progress,
                               method=getattr(args, "method", None) or "auto")
        out.update(exists={"exists": True, "none": False}.get(dec.status),
                   by=dec.how(), method=dec.method, nodes=dec.nodes,
                   lemma_nodes=dec.lemma_nodes,
                   node_budget=nodes, seconds=round(dec.seconds, 3), stopped=dec.stopped,
                   statement=dec.statement())
        if dec.status == "exists":
            out["generator"] = ["".join(map(str, row)) for row in dec.generator()]
    if args.json:
        print_json(out)
        return 0
    console.print(f"Bounds: every binary linear [{n},{k}] code has d <= {ub.d} ({ub.by}).")
    if "nodes" in out:
        console.print(f"Exhaustive search, method {out['method']} (budget {nodes:,} nodes, "
                      f"{limit:g} s): {out['nodes']:,} nodes in {out['seconds']:.2f} s, "
                      f"{out['stopped']}.")
    console.print(out["statement"][0].upper() + out["statement"][1:] + ".")
    if out.get("generator"):
        console.print("generator [I | A]:")
        for row in out["generator"]:
            console.print("  " + row)
    return 0


def _run_table(args) -> int:
    ks = parse_range("k", args.k if args.k is not None else "1-16")
    ds = parse_range("d", args.d if args.d is not None else "1-10")
    for name, values in (("k", ks), ("d", ds)):
        if values[0] < 1:
            raise ParameterError(f"Argument '{name}' must be at least 1, not {values[0]}.")
        if values[-1] > _TABLE_LIMIT:
            raise ParameterError(f"Argument '{name}' must be at most {_TABLE_LIMIT} with "
                                 f"--table, not {values[-1]}.")
    cells: list[dict[str, Any]] = []
    for k in ks:
        for d in ds:
            least, exist = B.least_length(k, d), B.existence_length(k, d)
            cells.append({"k": k, "d": d, "n_least": least.n, "least_by": least.by,
                          "n_exists": exist.n, "exists_by": exist.by})
    if args.json:
        print_json({"mode": "table", "k": [ks[0], ks[-1]], "d": [ds[0], ds[-1]],
                    "cells": cells})
        return 0
    lines = ["shortest length n the bounds allow: k data bits (rows), distance at least d "
             "(columns)"]
    lines += length_grid({(c["k"], c["d"]): (c["n_least"], c["n_exists"]) for c in cells},
                         ks, ds)
    lines += ["N     no shorter code exists, and one of length N is guaranteed: settled",
              "N+g   no code is shorter than N; an existence bound (Gilbert-Varshamov or",
              "      Varshamov) guarantees one of length N+g; lengths N .. N+g-1 are open",
              "      here (bounds --k K --d D names the bounds of a cell)"]
    settled = sum(c["n_least"] == c["n_exists"] for c in cells)
    lines.append(f"{settled} of {len(cells)} cells settled by the bounds alone")
    console.plain("\n".join(lines) + "\n")
    return 0
