"""``gf2codes verify FILE``: the true parameters of a code handed to you."""

from __future__ import annotations

import argparse
import os
from typing import Any

from rich.markup import escape
from rich.table import Table

from ..exceptions import Gf2CodesError, ParameterError, TooExpensiveError, check_int
from ..formats import one_line as inert_text
from ..formats import read_code
from ..report import WEIGHTS_AUTO_SECONDS, VerifyReport, verify
from ..typing import VERIFY_METHODS, WEIGHTS_POLICIES
from ._common import (
    StagedProgress,
    add_executor_options,
    add_json_flag,
    check_output_path,
    clean,
    console,
    count_arg,
    err_console,
    executor_from_args,
    print_json,
    seconds_arg,
    seed_arg,
)
from ._text import weight_text

__all__ = ["register", "run", "render"]


def register(sub: argparse._SubParsersAction) -> None:
    p = sub.add_parser(
        "verify",
        help="prove n, k, d of a code, its weight distribution and properties",
        description=(
            "Read a generator matrix (or, with --parity-check, a parity-check matrix) from a "
            "text file of 0/1 rows, a .npy file or a gf2codes JSON code record, and report its "
            "[n, k, d] with d proved, the weight distribution, the dual distance, a "
            "minimum-weight codeword and the code's properties."
        ),
    )
    p.add_argument("files", nargs="+", metavar="FILE",
                   help="matrix files (text rows of 0/1, .npy, or JSON code records), or "
                        "directories: every .txt, .npy and .json file in them")
    p.add_argument("--parity-check", action="store_true",
                   help="the file holds a parity-check matrix H, not a generator matrix")
    p.add_argument("--target-d", type=count_arg(1, 1 << 40), metavar="D",
                   help="only settle whether d >= D (stops as soon as it is known)")
    p.add_argument("--time-limit", type=seconds_arg, metavar="S",
                   help="seconds for the whole report; on expiry the proved interval of d "
                        "is reported and the parts not finished are marked not computed")
    p.add_argument("--method", choices=VERIFY_METHODS, default="exact",
                   help="exact: prove d (default); fast: a quick interval, the upper end by "
                        "information-set decoding")
    p.add_argument("--weights", choices=WEIGHTS_POLICIES, default="auto",
                   help="count the weight distribution and the dual distance: auto (when "
                        f"estimated to take at most {WEIGHTS_AUTO_SECONDS:.0f} s), always, "
                        "or never (prove n, k, d only)")
    p.add_argument("--seed", type=seed_arg, default=0, help="seed for the randomised parts")
    p.add_argument("--workers", type=count_arg(1, 4096), metavar="N",
                   help="threads for the exact enumeration (default: one per core)")
    add_executor_options(p, "the large enumeration levels")
    p.add_argument("--plot", metavar="FILE.png",
                   help="also draw the weight distribution as bars into an image file")
    add_json_flag(p)


def run(args: argparse.Namespace) -> int:
    if args.time_limit is not None and not args.time_limit > 0:
        raise ParameterError(f"Argument '--time-limit' must be positive, not {args.time_limit}.")
    if args.target_d is not None:
        check_int("--target-d", args.target_d, minimum=1)
    if args.workers is not None:
        check_int("--workers", args.workers, minimum=1)
    if args.plot:
        from ..plots import require_matplotlib

        require_matplotlib()  # before the work, not after it
        check_output_path(args.plot, "--plot")
    inputs = _expand_inputs(args.files)
    if args.plot and len(inputs) != 1:
        raise ParameterError(f"Argument '--plot' draws one code, but {len(inputs)} input "
                             "files were given.")
    executor = executor_from_args(args)
    failed: list[str] = []
    try:
        for number, path in enumerate(inputs):
            if number and not args.json:
                console.print()
            try:
                status = _verify_one(path, args, executor, one_line=len(inputs) > 1)
            except Gf2CodesError as exc:
                if len(inputs) == 1:
                    raise
                err_console.print(f"gf2codes verify: error: {escape(clean(exc))}",
                                  soft_wrap=True)
                failed.append(path)
                continue
            if status:  # interrupted: what was proved is printed; stop here
                return status
    finally:
        if executor is not None:
            executor.close()
    if failed:
        err_console.print(f"gf2codes verify: {len(failed)} of {len(inputs)} files failed: "
                          + escape(clean(", ".join(failed))), soft_wrap=True)
        return 2
    return 0


#: File name endings that ``verify DIRECTORY`` reads.
MATRIX_SUFFIXES = (".txt", ".npy", ".json")


def _expand_inputs(paths: list[str]) -> list[str]:
    """The files to verify: each path as given, a directory replaced by its matrix files."""
    out: list[str] = []
    for path in paths:
        if os.path.isdir(path):
            try:
                names = os.listdir(path)
            except OSError as exc:
                raise ParameterError(f"cannot read the directory {path!r} "
                                     f"({exc.strerror}).") from None
            found = sorted(os.path.join(path, name) for name in names
                           if name.lower().endswith(MATRIX_SUFFIXES)
                           and os.path.isfile(os.path.join(path, name)))
            if not found:
                raise ParameterError(f"the directory {path!r} holds no matrix files "
                                     f"({', '.join(MATRIX_SUFFIXES)}).")
            out += found
        else:
            out.append(path)
    return out


def _verify_one(path: str, args: argparse.Namespace, executor: Any, *,
                one_line: bool = False) -> int:
    """Read, prove and print one input file; returns 130 after a Ctrl-C, else 0.

    ``one_line``: with ``--json``, the report is one line of a JSON-lines stream.
    """
    record = read_code(path, parity_check=args.parity_check)
    stated = {key: getattr(record, key) for key in ("d", "d_lower", "d_upper")
              if getattr(record, key) is not None}
    with StagedProgress() as bar:
        rep = verify(record.code, time_limit=args.time_limit, method=args.method,
                     target_d=args.target_d, seed=args.seed, workers=args.workers,
                     stated=stated, source=path, progress=bar, executor=executor,
                     automorphisms=record.automorphisms, weights=args.weights)
    status = render(rep, as_json=args.json, one_line=one_line)
    if args.plot:
        _plot(rep, path, args.plot)
    return status


def _plot(rep: VerifyReport, source: str, path: str) -> None:
    """``verify --plot FILE``: the weight distribution just computed, drawn as bars."""
    from ..plots import save_weight_distribution_plot

    if rep.weight_distribution is None:
        raise TooExpensiveError(f"--plot: the weight distribution of this [{rep.n},{rep.k}] "
                                "code was not computed, so there is nothing to draw.")
    out = save_weight_distribution_plot(
        list(rep.weight_distribution), path,
        # a title is data: one line, and no '$' that would start matplotlib's math mode
        title=f"How many codewords has each weight? "
              f"{inert_text(_shown_source(source), extra='$')}: n={rep.n} k={rep.k}")
    err_console.print(f"wrote {escape(str(out))}")


def _shown_source(source: str) -> str:
    return "standard input" if source == "-" else source


def render(rep: VerifyReport, *, as_json: bool = False, one_line: bool = False) -> int:
    """Print a verify report (table, or JSON: ``rep.to_dict()``); returns the exit
    status, 130 after a Ctrl-C.

    ``one_line``: the JSON object on one line, as one record of a JSON-lines stream.
    """
    if as_json:
        print_json(rep.to_dict(), one_line=one_line)
    else:
        _print_report(rep)
    return 130 if rep.interrupted else 0


_METHOD_WORDS = {
    "gray": "Gray-code enumeration of every codeword",
    "brouwer-zimmermann": "Brouwer–Zimmermann enumeration",
    "isd": "information-set decoding",
    "dual-columns": "search for the fewest parity-check columns summing to zero",
}


def _method_words(method: str) -> str:
    return " + ".join(_METHOD_WORDS.get(part, part) for part in method.split("+"))


def _first_line(rep: VerifyReport, source: str | None) -> str:
    """What the user asked first: the file, the verdict on d, the parameters."""
    if rep.d_exact:
        verdict, d_text = "PROVED", f"d={rep.d}"
    else:
        verdict = "NOT PROVED"
        if rep.meets_target is not None:
            verdict = "TARGET MET" if rep.meets_target else "TARGET MISSED"
        d_text = f" {rep.d_lower} ≤ d ≤ {rep.d_upper}"
    return f"{source or rep.name or 'code'}  {verdict}  n={rep.n} k={rep.k} {d_text}"


def _unit(rep: VerifyReport) -> str:
    """What ``codewords_examined`` counts: column subsets on the dual-side route."""
    return "column subsets" if rep.d_method.startswith("dual-columns") else "codewords"


def _print_report(rep: VerifyReport) -> None:
    n, k = rep.n, rep.k
    if rep.dropped_rows:
        err_console.print(
            f"note: {rep.dropped_rows} row(s) of the matrix were linearly dependent on the "
            f"others and were dropped; the code has dimension k = {k}."
        )
    shown = _shown_source(rep.source) if rep.source else rep.source
    console.print(escape(clean(_first_line(rep, shown))), style="bold", soft_wrap=True)
    t = Table(show_header=False, box=None, pad_edge=False)
    t.add_column(style="bold")
    t.add_column(overflow="fold")
    t.add_row("length n", str(n))
    t.add_row("dimension k", f"{k}   (rate {k / n:.4f}, {n - k} parity bits)")
    _distance_rows(t, rep)
    exact = rep.d_exact
    t.add_row("corrects", f"{'' if exact else 'at least '}{rep.corrects} error(s)"
              "   ⌊(d−1)/2⌋")
    t.add_row("detects", f"{'' if exact else 'at least '}{rep.detects} error(s)   d−1")
    dist = rep.weight_distribution
    t.add_row("weight distribution", weight_text(dist) if dist else "not computed")
    dd = rep.dual_distance
    t.add_row("dual distance", str(dd) if dd is not None else
              "not computed" if "dual distance" in rep.not_computed else
              "— (the dual is the zero code)")
    t.add_row("lightest codeword found", f"{rep.witness}   (weight {rep.witness_weight})")
    props = [name.replace("_", "-") for name, v in rep.properties.items() if v]
    t.add_row("properties", ", ".join(props) if props else "none of even, self-orthogonal, "
              "dual-containing")
    _verdict_rows(t, rep)
    console.print(t)
    for note in rep.notes:
        console.print(f"note: {note}")
    if not exact:
        console.print(
            "[bold red]warning:[/] the minimum distance is not proved. Only "
            f"d ≥ {rep.d_lower} is guaranteed; {rep.d_upper} is the weight of a codeword "
            "found, an upper bound. Do not design to the upper value."
        )


def _distance_rows(t: Table, rep: VerifyReport) -> None:
    """The rows on d: its value or interval, the route, the target test."""
    k = rep.k
    if rep.d_exact:
        count = f"{rep.codewords_examined:,} {_unit(rep)}"
        if rep.d_method == "gray":  # the total includes the randomised pre-pass
            count = (f"all 2^{k} = {1 << k:,} codewords, {rep.codewords_examined:,} "
                     "examined in all with the randomised pre-pass")
        t.add_row("minimum distance d",
                  f"{rep.d}   proved by {_method_words(rep.d_method)} "
                  f"({count}, {rep.seconds:.2f} s)")
    else:
        t.add_row("minimum distance d",
                  f"[bold red]NOT PROVED[/]: {rep.d_lower} ≤ d ≤ {rep.d_upper} "
                  f"({rep.stopped}; {rep.codewords_examined:,} {_unit(rep)}, "
                  f"{rep.seconds:.2f} s)")
    if rep.d_route_reason:
        t.add_row("route", escape(f"{rep.d_method.split('+')[0]}: {rep.d_route_reason}"))
    if rep.d_argument:
        t.add_row("lower bound by", escape(_argument_text(rep)))
    if rep.target_d is not None:
        verdict = {True: "yes, proved", False: "no: a lighter codeword exists",
                   None: "undecided within the time limit"}[rep.meets_target]
        t.add_row(f"d ≥ {rep.target_d}?", verdict)


def _argument_text(rep: VerifyReport) -> str:
    """The argument of the Brouwer–Zimmermann lower bound, the group and the sets."""
    from ..distance._bz import ARGUMENTS

    text = ARGUMENTS.get(rep.d_argument, rep.d_argument)
    if rep.d_symmetry is not None:
        text += f"; group: {rep.d_symmetry.get('description', '')}"
    sets = ", ".join(f"rank {s.get('rank')} to {s.get('levels_done')} rows"
                     for s in rep.d_information_sets)
    return f"{text}; sets: {sets}" if sets else text


def _verdict_rows(t: Table, rep: VerifyReport) -> None:
    """The rows comparing the code with the bounds."""
    n, k = rep.n, rep.k
    ub = rep.upper_bound
    if ub is None:
        verdict = "not computed (see the note below)"
    elif rep.optimal is True:
        verdict = escape(f"optimal: no [{n}, {k}] code has d > {ub.d} ({ub.by})")
    elif rep.optimal is False:
        verdict = f"not known optimal: bounds allow d ≤ {ub.d} ({ub.by})"
    else:
        verdict = f"bounds allow d ≤ {ub.d} ({ub.by}); d not proved"
    t.add_row("verdict", verdict)
    if rep.least_length:
        ll = rep.least_length
        t.add_row("shortest possible", escape(f"no [n, {k}, {rep.d}] code has n < {ll.n} "
                  f"({ll.by})"))
