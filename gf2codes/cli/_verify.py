"""``gf2codes verify FILE``: the true parameters of a code handed to you."""

from __future__ import annotations

import argparse
import dataclasses
import os
import time
from typing import Any, cast

from rich.markup import escape
from rich.table import Table

from ..code import Code
from ..distance import DistanceResult, human_seconds, minimum_distance, quick_distance
from ..exceptions import Gf2CodesError, ParameterError, TooExpensiveError, check_int
from ..formats import one_line as inert_text
from ..formats import read_code, rows_to_strings
from ..weights import (
    DEFAULT_MAX_ENUMERATION,
    dual_distance,
    macwilliams_transform,
    minimum_weight_from_distribution,
    weight_distribution,
    weight_enumeration_cost,
)
from ._common import (
    ProgressBar,
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

__all__ = ["register", "run", "report", "analyse"]

_WEIGHT_RATE = 1.5e9  # codewords per second when counting weights (see scripts/)


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
    p.add_argument("--method", choices=("exact", "fast"), default="exact",
                   help="exact: prove d (default); fast: a quick interval, the upper end by "
                        "information-set decoding")
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
    info = analyse(record.code, time_limit=args.time_limit, method=args.method,
                   target_d=args.target_d, seed=args.seed, workers=args.workers,
                   stated=stated, executor=executor)
    status = _print(info, record.code, path, as_json=args.json, one_line=one_line)
    if args.plot:
        _plot(info, record.code, path, args.plot)
    return status


def _plot(info: dict[str, Any], code: Code, source: str, path: str) -> None:
    """``verify --plot FILE``: the weight distribution just computed, drawn as bars."""
    from ..plots import save_weight_distribution_plot

    if info["weight_distribution"] is None:
        raise TooExpensiveError(f"--plot: the weight distribution of this [{code.n},{code.k}] "
                                "code was not computed, so there is nothing to draw.")
    out = save_weight_distribution_plot(
        info["weight_distribution"], path,
        # a title is data: one line, and no '$' that would start matplotlib's math mode
        title=f"How many codewords has each weight? "
              f"{inert_text(_shown_source(source), extra='$')}: n={code.n} k={code.k}")
    err_console.print(f"wrote {escape(str(out))}")


def _distance(code: Code, method: str, time_limit: float | None, target_d: int | None,
              seed: int, workers: int | None, executor=None) -> DistanceResult:
    if method == "fast":
        return quick_distance(code, time_limit=time_limit or 2.0, seed=seed)
    with ProgressBar("proving d") as bar:
        try:
            return minimum_distance(code, time_limit=time_limit, progress=bar,
                                    target=target_d, seed=seed, workers=workers,
                                    executor=executor)
        except TooExpensiveError as exc:
            raise TooExpensiveError(
                f"proving d of this [{code.n},{code.k}] code needs about {exc.work:.2g} "
                f"codewords, roughly {human_seconds(cast(float, exc.seconds))} on one core. Use "
                "--time-limit S for the interval proved within S seconds, or --method fast "
                "for a quick interval.", work=exc.work, seconds=exc.seconds,
            ) from None


def analyse(code: Code, *, time_limit: float | None = None, method: str = "exact",
            target_d: int | None = None, seed: int = 0, workers: int | None = None,
            stated: dict[str, int] | None = None, executor=None) -> dict[str, Any]:
    """Everything ``verify`` reports, as a JSON-ready dict.

    ``stated`` holds what the input file said about d (keys ``d``, ``d_lower``,
    ``d_upper``); a statement that the proof contradicts is reported, not trusted.
    """
    start = time.perf_counter()
    deadline = None if time_limit is None else time.monotonic() + time_limit
    res = _distance(code, method, time_limit, target_d, seed, workers, executor)
    notes: list[str] = []
    not_computed: list[str] = []

    def left() -> float | None:
        return None if deadline is None else max(0.0, deadline - time.monotonic())

    # Weight distribution: only when it is affordable within what is left.
    cost = weight_enumeration_cost(code)
    dist = dual_dist = None
    if res.stopped == "interrupted":
        notes.append("interrupted (Ctrl-C): the proved interval so far is reported; the "
                     "weight distribution was skipped")
        not_computed += ["weight distribution", "dual distance"]
    elif code.k < code.n and (cost > DEFAULT_MAX_ENUMERATION or
                              (left() is not None and cost / _WEIGHT_RATE > (left() or 0))):
        notes.append(
            f"weight distribution not computed: it needs 2^{min(code.k, code.n - code.k)} "
            "codewords" + ("" if left() is None else " and the time limit is too short")
        )
        not_computed.append("weight distribution")
    else:
        try:
            with ProgressBar("counting weights") as bar:
                dist, dual_dist = _distributions(code, _bounded(bar, deadline), deadline)
        except TimeoutError:
            notes.append("weight distribution not computed: the time limit ran out")
            not_computed.append("weight distribution")
    if dist is not None and not res.exact and target_d is None:
        # The distribution is exact, so it proves d as well.
        d_from_dist = next(i for i, a in enumerate(dist) if i and a)
        notes.append("d proved from the exact weight distribution")
        res = _exact_from_distribution(code, res, d_from_dist, seed)
    dual_d = None
    if dual_dist is not None:
        dual_d = minimum_weight_from_distribution(dual_dist)
    elif dist is not None:
        try:
            dual_d = dual_distance(code, dist, deadline=deadline)
        except TimeoutError:
            notes.append("dual distance not computed: the time limit ran out")
            not_computed.append("dual distance")
    elif code.k < code.n and "dual distance" not in not_computed:
        not_computed.append("dual distance")
    d = res.d
    lower = res.lower
    out: dict[str, Any] = {
        "n": code.n,
        "k": code.k,
        "d": d,
        "d_lower": res.lower,
        "d_upper": res.upper,
        "d_exact": res.exact,
        "d_method": res.method,
        "d_route_reason": res.reason,
        "d_route_estimates_s": {e: float(f"{v:.3g}") for e, v in res.estimates.items()},
        "d_information_sets": [dict(x) for x in res.information_sets],
        "codewords_examined": res.codewords,
        "seconds": round(time.perf_counter() - start, 4),
        "stopped": res.stopped,
        "corrects": (d - 1) // 2 if d is not None else (lower - 1) // 2,
        "detects": d - 1 if d is not None else lower - 1,
        "weight_distribution": dist,
        "dual_distance": dual_d,
        "witness": rows_to_strings(res.witness.reshape(1, -1))[0],
        "witness_weight": int(res.upper),
        "properties": code.properties(),
        "dropped_rows": code.dropped_rows,
        "notes": notes,
        "not_computed": not_computed,
    }
    out["stated_wrong"] = _contradicted(stated or {}, res)
    if out["stated_wrong"]:
        notes.append("the input file states " + ", ".join(out["stated_wrong"]) +
                     ", which the proof contradicts: the statement is wrong")
    if target_d is not None:
        out["target_d"] = target_d
        out["meets_target"] = res.at_least(target_d)
    verdict_limit = _VERDICT_MAX_N if deadline is None else _VERDICT_MAX_N_TIMED
    if code.n <= verdict_limit:
        verdict = _verdict(code, res)
    else:
        notes.append(f"bounds not computed: for n > {verdict_limit} they take too long "
                     + ("within a time limit" if deadline is not None else "in a report")
                     + f"; run gf2codes bounds --n {code.n} --k {code.k} for them")
        not_computed.append("bounds")
        verdict = {"upper_bound": None, "optimal": None, "least_length": None}
    out.update(verdict)
    out["seconds"] = round(time.perf_counter() - start, 4)
    return out


def _distributions(code: Code, progress, deadline: float | None
                   ) -> tuple[list[int], list[int] | None]:
    """The weight distribution, and the dual's when it was the one enumerated.

    Counting the smaller side: the code itself (the dual distance then comes from
    the first nonzero MacWilliams entry), or the dual, whose distribution gives the
    dual distance directly and the code's by the MacWilliams transform.
    """
    if code.k == code.n or code.k <= code.n - code.k:
        return weight_distribution(code, progress=progress, deadline=deadline), None
    dual = weight_distribution(code.dual(), progress=progress, deadline=deadline)
    return macwilliams_transform(dual, code.n, deadline=deadline), dual


#: The verdict's bounds (best upper bound at (n, k), least length for (k, d)) are
#: computed up to this length (after issue 14's table-driven bounds: 0.5 s at
#: n = 1023, 4.6 s at n = 4095, load 3 on 2 cores), and up to the second length under
#: a time limit. Raise them as the bounds get faster.
_VERDICT_MAX_N = 2048
_VERDICT_MAX_N_TIMED = 256


def _bounded(progress: ProgressBar, deadline: float | None):
    """A progress callback that also stops the work (TimeoutError) after ``deadline``."""

    def call(done: int, total: int, info: dict) -> None:
        progress(done, total, info)
        if deadline is not None and time.monotonic() > deadline:
            raise TimeoutError("the time limit ran out")

    return call


def _contradicted(stated: dict[str, int], res: DistanceResult) -> list[str]:
    """The statements about d that the proved interval refutes, as text."""
    wrong = []
    d, lo, hi = stated.get("d"), stated.get("d_lower"), stated.get("d_upper")
    if d is not None and not res.lower <= d <= res.upper:
        wrong.append(f"d = {d}")
    if lo is not None and lo > res.upper:
        wrong.append(f"d >= {lo}")
    if hi is not None and hi < res.lower:
        wrong.append(f"d <= {hi}")
    return wrong


def _exact_from_distribution(code: Code, res: DistanceResult, d: int, seed: int
                             ) -> DistanceResult:
    """Turn an interval into a proof using the exact weight distribution: find a
    codeword of weight ``d`` (a target run stops at once when one exists)."""
    if res.upper == d:
        return dataclasses.replace(res, lower=d, exact=True, method=res.method + "+weights",
                                   stopped=None)
    r = minimum_distance(code, target=d + 1, max_work=None, seed=seed)
    assert r.upper == d, "weight distribution and enumeration disagree"
    return dataclasses.replace(res, lower=d, upper=d, witness=r.witness, exact=True,
                               method=res.method + "+weights",
                               codewords=res.codewords + r.codewords,
                               seconds=res.seconds + r.seconds, stopped=None)


def _verdict(code: Code, res: DistanceResult) -> dict[str, Any]:
    """Best upper bound at (n, k), optimality, and least possible length for (k, d)."""
    from .. import bounds

    ub = bounds.best_upper(code.n, code.k)
    optimal = None
    if res.exact:
        optimal = res.upper >= ub.d
    elif res.lower >= ub.d:
        optimal = True
    d_for_length = res.d if res.exact else None
    least = None
    if d_for_length is not None:
        ll = bounds.least_length(code.k, d_for_length)
        least = {"n": ll.n, "by": ll.by}
    return {"upper_bound": {"d": ub.d, "by": ub.by}, "optimal": optimal,
            "least_length": least}


def report(code: Code, *, as_json: bool = False, time_limit: float | None = None,
           method: str = "exact", target_d: int | None = None, source: str | None = None,
           seed: int = 0, workers: int | None = None,
           stated: dict[str, int] | None = None, executor=None) -> int:
    """Verify ``code`` and print the report (table or JSON). Returns the exit status."""
    info = analyse(code, time_limit=time_limit, method=method, target_d=target_d, seed=seed,
                   workers=workers, stated=stated, executor=executor)
    return _print(info, code, source, as_json=as_json)


def _shown_source(source: str) -> str:
    return "standard input" if source == "-" else source


def _print(info: dict[str, Any], code: Code, source: str | None, *, as_json: bool,
           one_line: bool = False) -> int:
    """Print a report (table or JSON); the exit status is 130 after a Ctrl-C."""
    status = 130 if info["stopped"] == "interrupted" else 0
    if as_json:
        print_json({"source": source, **info} if source else info, one_line=one_line)
    else:
        _print_report(info, code, source)
    return status


_METHOD_WORDS = {
    "gray": "Gray-code enumeration of every codeword",
    "brouwer-zimmermann": "Brouwer–Zimmermann enumeration",
    "isd": "information-set decoding",
    "dual-columns": "search for the fewest parity-check columns summing to zero",
}


def _method_words(method: str) -> str:
    return " + ".join(_METHOD_WORDS.get(part, part) for part in method.split("+"))


def _first_line(info: dict[str, Any], code: Code, source: str | None) -> str:
    """What the user asked first: the file, the verdict on d, the parameters."""
    n, k = info["n"], info["k"]
    if info["d_exact"]:
        verdict, d_text = "PROVED", f"d={info['d']}"
    else:
        verdict = "NOT PROVED"
        if info.get("meets_target") is not None:
            verdict = "TARGET MET" if info["meets_target"] else "TARGET MISSED"
        d_text = f" {info['d_lower']} ≤ d ≤ {info['d_upper']}"
    return f"{source or code.name or 'code'}  {verdict}  n={n} k={k} {d_text}"


def _unit(info: dict[str, Any]) -> str:
    """What ``codewords_examined`` counts: column subsets on the dual-side route."""
    return "column subsets" if info["d_method"].startswith("dual-columns") else "codewords"


def _print_report(info: dict[str, Any], code: Code, source: str | None) -> None:
    n, k = info["n"], info["k"]
    if info["dropped_rows"]:
        err_console.print(
            f"note: {info['dropped_rows']} row(s) of the matrix were linearly dependent on the "
            f"others and were dropped; the code has dimension k = {k}."
        )
    shown = _shown_source(source) if source else source
    console.print(escape(clean(_first_line(info, code, shown))), style="bold", soft_wrap=True)
    t = Table(show_header=False, box=None, pad_edge=False)
    t.add_column(style="bold")
    t.add_column(overflow="fold")
    t.add_row("length n", str(n))
    t.add_row("dimension k", f"{k}   (rate {k / n:.4f}, {n - k} parity bits)")
    if info["d_exact"]:
        count = f"{info['codewords_examined']:,} {_unit(info)}"
        if info["d_method"] == "gray":  # the total includes the randomised pre-pass
            count = (f"all 2^{k} = {1 << k:,} codewords, {info['codewords_examined']:,} "
                     "examined in all with the randomised pre-pass")
        t.add_row("minimum distance d",
                  f"{info['d']}   proved by {_method_words(info['d_method'])} "
                  f"({count}, {info['seconds']:.2f} s)")
    else:
        t.add_row("minimum distance d",
                  f"[bold red]NOT PROVED[/]: {info['d_lower']} ≤ d ≤ {info['d_upper']} "
                  f"({info['stopped']}; {info['codewords_examined']:,} {_unit(info)}, "
                  f"{info['seconds']:.2f} s)")
    if info.get("d_route_reason"):
        t.add_row("route", escape(f"{info['d_method'].split('+')[0]}: "
                                  f"{info['d_route_reason']}"))
    if "target_d" in info:
        verdict = {True: "yes, proved", False: "no: a lighter codeword exists",
                   None: "undecided within the time limit"}[info["meets_target"]]
        t.add_row(f"d ≥ {info['target_d']}?", verdict)
    exact = info["d_exact"]
    t.add_row("corrects", f"{'' if exact else 'at least '}{info['corrects']} error(s)"
              "   ⌊(d−1)/2⌋")
    t.add_row("detects", f"{'' if exact else 'at least '}{info['detects']} error(s)   d−1")
    dist = info["weight_distribution"]
    t.add_row("weight distribution", weight_text(dist) if dist else "not computed")
    dd = info["dual_distance"]
    t.add_row("dual distance", str(dd) if dd is not None else
              "not computed" if "dual distance" in info["not_computed"] else
              "— (the dual is the zero code)")
    t.add_row("lightest codeword found", f"{info['witness']}   (weight {info['witness_weight']})")
    props = [name.replace("_", "-") for name, v in info["properties"].items() if v]
    t.add_row("properties", ", ".join(props) if props else "none of even, self-orthogonal, "
              "dual-containing")
    ub = info["upper_bound"]
    if ub is None:
        verdict = "not computed (see the note below)"
    elif info["optimal"] is True:
        verdict = escape(f"optimal: no [{n}, {k}] code has d > {ub['d']} ({ub['by']})")
    elif info["optimal"] is False:
        verdict = f"not known optimal: bounds allow d ≤ {ub['d']} ({ub['by']})"
    else:
        verdict = f"bounds allow d ≤ {ub['d']} ({ub['by']}); d not proved"
    t.add_row("verdict", verdict)
    if info["least_length"]:
        ll = info["least_length"]
        t.add_row("shortest possible", escape(f"no [n, {k}, {info['d']}] code has n < {ll['n']} "
                  f"({ll['by']})"))
    console.print(t)
    for note in info["notes"]:
        console.print(f"note: {note}")
    if not exact:
        console.print(
            "[bold red]warning:[/] the minimum distance is not proved. Only "
            f"d ≥ {info['d_lower']} is guaranteed; {info['d_upper']} is the weight of a codeword "
            "found, an upper bound. Do not design to the upper value."
        )
