"""``gf2codes search``: look for the best binary linear code with two given parameters.

Three modes, chosen by which two options are given:

* ``--k K --d D``: the shortest code (least ``n``);
* ``--n N --k K``: the greatest proved distance;
* ``--n N --d D``: the greatest dimension.

The result says whether it is optimal (the bounds rule out anything better) or only
the best found. Exit status: 0 when the search ended on its own or at the time limit,
130 when it was interrupted with Ctrl-C (the best proved code found so far is still
printed, and written with ``-o``), 2 for bad input.

With ``gf2codes.catalog`` available, the code on file for the target (``Catalog.pick``) is a
starting point and the winner is saved there (``--catalog PATH``, ``--no-catalog``).
"""

from __future__ import annotations

import sys

from rich.table import Table

from .. import formats
from .. import search as S
from ..exceptions import Gf2CodesError, ParameterError, check_int
from ..questions import question_type
from ._common import (
    MAX_SECONDS,
    MAX_SEED,
    ProgressBar,
    add_executor_options,
    add_json_flag,
    check_output_path,
    console,
    err_console,
    executor_from_args,
    parse_float,
    parse_int,
    print_json,
    write_output,
)
from ._text import matrix_block

try:
    from .. import catalog
except ImportError:  # the catalog module is optional (written separately)
    catalog = None  # type: ignore[assignment]  # optional module: None when absent

__all__ = ["register", "run"]


def register(subparsers) -> None:
    p = subparsers.add_parser(
        "search",
        help="search for the shortest code for (k, d), or the best d or k",
        description="Search for binary linear codes. Give two of --n, --k, --d: --k --d "
                    "finds the shortest length, --n --k the greatest distance, --n --d the "
                    "greatest dimension. Exit 130 after Ctrl-C (the best code found is "
                    "still reported).",
    )
    p.add_argument("--n", metavar="N", help="length")
    p.add_argument("--k", metavar="K", help="dimension (number of data bits)")
    p.add_argument("--d", metavar="D", help="minimum distance required")
    p.add_argument("--time-limit", metavar="S", default="60",
                   help="seconds to search (default 60); the winner's proof comes after")
    p.add_argument("--max-steps", metavar="N", default=None,
                   help="stop after N steps of strategy work (reproducible on any machine)")
    p.add_argument("--seed", metavar="S", default="0", help="random seed (default 0)")
    p.add_argument("--strategy", metavar="NAME", action="append", default=None,
                   help="use this strategy (repeatable; default all: "
                        + ", ".join(S.STRATEGIES) + ")")
    p.add_argument("-o", "--output", metavar="FILE", default=None,
                   help="write the code found: a JSON code record for *.json, "
                        "a generator matrix as text otherwise")
    p.add_argument("--catalog", metavar="PATH", default=None,
                   help="catalog database to start from and save to")
    add_executor_options(p, "the strategies, as parallel tasks")
    p.add_argument("--no-catalog", action="store_true",
                   help="neither read nor write the catalog")
    add_json_flag(p)


def _open_catalog(args):
    if args.no_catalog or catalog is None:
        return None
    try:
        return catalog.open_catalog(args.catalog)
    except Gf2CodesError as exc:
        if args.catalog is not None:  # asked for by name: its errors are the user's
            raise
        # No usable default catalog: search without one, but say so, since the result
        # will not be kept there.
        err_console.print(f"note: searching without the catalog, which cannot be used: "
                          f"{exc} The result will not be saved in it.", markup=False)
        return None


def run(args) -> int:
    time_limit = parse_float("time_limit", args.time_limit)
    if time_limit > MAX_SECONDS:  # (not positive: refused by check_limits() below)
        raise ParameterError(f"Argument 'time_limit' must be at most {MAX_SECONDS:.0e} "
                             f"seconds, not {time_limit:g}.")
    seed = check_int("seed", parse_int("seed", args.seed), minimum=0, maximum=MAX_SEED)
    check_output_path(args.output)
    max_steps = None if args.max_steps is None else parse_int("max_steps",
                                                              args.max_steps)
    strategies = S.resolve_strategies(args.strategy)
    asked = question_type(args.n, args.k, args.d, options=True)
    kw = {name: parse_int(name, getattr(args, name)) for name in asked.given_names}
    # validate before touching the catalog
    S.check_limits(time_limit, max_steps, seed)
    question = asked.from_values(kw)

    cat = _open_catalog(args)
    start = []
    interrupted = False
    try:
        if cat is not None:
            entry = cat.pick(**question.fixed)
            if entry is not None:
                start.append(entry.code)

        readonly = cat is not None and getattr(cat, "readonly", False)
        if readonly:
            err_console.print(f"note: the catalog {cat.path} is read-only for this user; the "
                              "result will not be saved in it.", markup=False)

        def save(code, d, info):
            # a catalog entry is only a starting point: the search re-proves every code
            # it accepts, so a claimed entry never becomes its answer unproved
            if cat is not None and not readonly and info.get("exact"):
                cat.add(code, d=d, proved=True, recipe=list(code.recipe) or None,
                        source="search", seed=info.get("seed"),
                        proof={"method": f"search winner ({info.get('strategy')}), d proved "
                                         "by minimum_distance"})

        label = "search " + " ".join(f"{key}={val}" for key, val in question.fixed.items())
        executor = executor_from_args(args)
        try:
            with ProgressBar(label, delay=1.0) as bar:
                result = S.search_for(question, time_limit=time_limit, max_steps=max_steps,
                                      seed=seed, strategies=strategies, start=start,
                                      progress=bar, on_winner=save, executor=executor)
        finally:
            if executor is not None:
                executor.close()
        interrupted = result.stopped == "interrupted"
    finally:
        if cat is not None:
            cat.close()

    def show() -> None:
        if args.json:
            print_json(result.to_dict())
        else:
            _print(result)

    if args.output:  # a failed write still shows the result, then says what failed
        write_output(lambda: formats.write_code(result.code, args.output, d=result.d,
                                                d_lower=result.d_lower,
                                                strategy=result.strategy, seed=result.seed),
                     args.output, show)
    show()
    if interrupted:
        err_console.print("interrupted: the best code found so far is shown")
        return 130
    return 0


def _print(r: S.SearchResult) -> None:
    flag, bound_key = r.question.flag_key, r.question.bound_key
    d_text = str(r.d) if r.d is not None else f">= {r.d_lower} (exact value not proved)"
    t = Table(show_header=False, box=None)
    t.add_row("code", f"[{r.n}, {r.k}, {r.d if r.d is not None else r.d_lower}]")
    t.add_row("minimum distance", d_text + (" (proved)" if r.d is not None else ""))
    t.add_row(bound_key.replace("_", " "), f"{r.bound} ({r.bound_by})")
    t.add_row(flag.replace("_", " "), "yes" if r.optimal else "no (not proved)")
    t.add_row("found by", f"{r.strategy} (seed {r.seed})")
    t.add_row("stopped", r.stopped + (
        f" while trying [{r.open_target[0]},{r.open_target[1]},{r.open_target[2]}]"
        if r.open_target else ""))
    t.add_row("candidates", f"{r.candidates} in {r.seconds:.2f} s")
    console.print(t)
    console.print(r.statement())
    shown = f"[{r.n}, {r.k}, {r.d}]" if r.d is not None else f"[{r.n}, {r.k}], d ≥ {r.d_lower}"
    block = matrix_block(formats.rows_to_strings(r.code.G),
                         f"generator matrix of the {shown} code found, {r.k} x {r.n}")
    sys.stdout.flush()
    console.plain("\n".join(block) + "\n")
