"""``gf2codes channel FILE... --p ...``: how often a code fails on a binary symmetric channel.

For each code and crossover probability ``p`` it prints three exact probabilities
(see :mod:`gf2codes.decoding`): block error of complete syndrome decoding, failure of
bounded-distance decoding, and undetected error when the code only detects errors.
``--simulate N`` adds Monte Carlo estimates with confidence intervals (and is the
only way for codes with more than 26 parity bits); ``--plot FILE.png`` draws the
curves of every code given.

Crossover probabilities (``--p``) are numbers, or ranges ``LO:HI:COUNT`` of COUNT
values spaced evenly on a log scale from LO to HI inclusive (``LO:HI:COUNT:lin`` for
even spacing on a linear scale); several may be given and are merged and sorted.
"""

from __future__ import annotations

import argparse
from pathlib import Path

from rich import box
from rich.markup import escape
from rich.table import Table

from ..decoding import DEFAULT_MAX_REDUNDANCY, ChannelReport, channel_report, check_probability
from ..exceptions import ParameterError, check_int
from ..formats import one_line, read_code
from ._common import (
    StagedProgress,
    add_json_flag,
    clean,
    console,
    count_arg,
    err_console,
    print_json,
    probability_arg,
    seed_arg,
)
from ._text import weight_text

__all__ = ["register", "run", "parse_p"]

DEFAULT_P = ["1e-6:1e-1:11"]
_MAX_POINTS = 1000
_PLOT_POINTS = 80


def register(sub: argparse._SubParsersAction) -> None:
    p = sub.add_parser(
        "channel",
        help="error probabilities of a code on a binary symmetric channel",
        description=(
            "For each crossover probability p of a binary symmetric channel, print the exact "
            "block-error probability of complete syndrome decoding, the failure probability "
            "of bounded-distance decoding (t = (d-1)/2) and the probability of an undetected "
            "error when the code only detects errors. The exact method needs n - k <= "
            f"{DEFAULT_MAX_REDUNDANCY}; --simulate N estimates the probabilities by Monte "
            "Carlo for any code."
        ),
        epilog=(
            "P values: numbers (1e-4 0.01), or LO:HI:COUNT for COUNT values log-spaced from "
            "LO to HI inclusive (1e-6:1e-1:11), or LO:HI:COUNT:lin for linear spacing. "
            f"Default: {' '.join(DEFAULT_P)}."
        ),
    )
    p.add_argument("files", nargs="+", metavar="FILE",
                   help="code files (text rows of 0/1, .npy, or JSON code record)")
    p.add_argument("--parity-check", action="store_true",
                   help="the files hold parity-check matrices, not generator matrices")
    p.add_argument("--p", nargs="+", metavar="P", default=None,
                   help="crossover probabilities: numbers or ranges LO:HI:COUNT (log-spaced)")
    p.add_argument("--simulate", type=count_arg(1, 10**12), metavar="N",
                   help="also estimate by Monte Carlo with N codewords per p")
    p.add_argument("--seed", type=seed_arg, default=0, help="seed of the simulation (default 0)")
    p.add_argument("--confidence", type=probability_arg, default=0.99,
                   help="confidence level of the simulation intervals (default 0.99)")
    p.add_argument("--plot", metavar="FILE.png",
                   help="draw the block-error curves of every code into an image file")
    add_json_flag(p)


# ----------------------------------------------------------------------------- --p


def _number(token: str, text: str) -> float:
    try:
        value = float(text)
    except ValueError:
        raise ParameterError(
            f"Argument '--p' must be a number or a range LO:HI:COUNT, not {token!r}.") from None
    if not 0 <= value <= 1:
        raise ParameterError(f"Argument '--p' must be between 0 and 1, not {text}.")
    return value


def parse_p(tokens: list[str] | None) -> list[float]:
    """Crossover probabilities from the ``--p`` tokens, merged and sorted.

    >>> parse_p(['1e-3:1e-1:3', '0.5'])
    [0.001, 0.01, 0.1, 0.5]
    >>> parse_p(['0:0.5:3:lin'])
    [0.0, 0.25, 0.5]
    """
    values: list[float] = []
    for token in tokens or DEFAULT_P:
        parts = token.split(":")
        if len(parts) == 1:
            values.append(_number(token, parts[0]))
            continue
        if len(parts) not in (3, 4) or (len(parts) == 4 and parts[3] not in ("lin", "log")):
            raise ParameterError(
                f"Argument '--p' must be a number or a range LO:HI:COUNT[:lin], not {token!r}.")
        lo, hi = _number(token, parts[0]), _number(token, parts[1])
        try:
            count = int(parts[2])
        except ValueError:
            raise ParameterError(
                f"Argument '--p' range count must be an integer, not {parts[2]!r}.") from None
        count = check_int("--p range count", count, minimum=1, maximum=_MAX_POINTS)
        if lo > hi:
            raise ParameterError(f"Argument '--p' must be an increasing range, not {token!r}.")
        linear = len(parts) == 4 and parts[3] == "lin"
        if not linear and lo == 0:
            raise ParameterError(
                f"Argument '--p' log-spaced range must start above 0, not {token!r} "
                "(use LO:HI:COUNT:lin for a linear range from 0).")
        if count == 1:
            values.append(lo)
        elif linear:
            values += [lo + (hi - lo) * i / (count - 1) for i in range(count)]
        else:
            values += [float(f"{lo * (hi / lo) ** (i / (count - 1)):.12g}")
                       for i in range(count)]
    out = sorted(set(values))
    if len(out) > _MAX_POINTS:
        raise ParameterError(f"Argument '--p' must give at most {_MAX_POINTS} values, "
                             f"not {len(out)}.")
    return out


# ------------------------------------------------------------------------------ run


def run(args: argparse.Namespace) -> int:
    ps = parse_p(args.p)
    for p in ps:
        check_probability("--p", p)
    if args.simulate is not None:
        check_int("--simulate", args.simulate, minimum=1)
    if not 0 < args.confidence < 1:
        raise ParameterError(
            f"Argument '--confidence' must be between 0 and 1, not {args.confidence}.")
    if args.plot:
        from ..plots import require_matplotlib

        require_matplotlib()
    records = [(f, read_code(f, parity_check=args.parity_check)) for f in args.files]
    reports = []
    for i, (f, rec) in enumerate(records):
        with StagedProgress() as bar:
            reports.append(channel_report(rec.code, ps, simulate=args.simulate, seed=args.seed,
                                          confidence=args.confidence, index=i, source=f,
                                          progress=bar))
    path = _plot(reports, ps, args.plot) if args.plot else None
    if args.json:
        print_json({"codes": [rep.to_dict() for rep in reports]})
    else:
        for rep in reports:
            _print(rep, args)
    if path is not None:
        err_console.print(f"wrote {escape(str(path))}")
    return 0


def _fmt(x: float | None, digits: int = 4) -> str:
    if x is None:
        return "—"
    if x == 0:
        return "0"
    return f"{x:.{digits - 1}e}"


def _print(rep: ChannelReport, args: argparse.Namespace) -> None:
    n, k, d, t = rep.n, rep.k, rep.d, rep.t
    params = f"n={n} k={k} " + (f"d={d} t={t}" if d is not None else "d not proved")
    title = clean(f"{rep.source or rep.name or 'code'}  BSC  {params}")
    if rep.name and rep.source:
        title += clean(f"  ({rep.name})")
    t_text = f"t = {t}" if t is not None else "t unknown"
    console.print(escape(title), style="bold", soft_wrap=True)
    table = Table(box=box.SIMPLE_HEAD, pad_edge=False)
    table.add_column("p", justify="right")
    table.add_column("block error\ncomplete\ndecoding", justify="right")
    table.add_column(f"failure of\nbounded-\ndistance, {t_text}", justify="right")
    table.add_column("undetected\nerror,\ndetection", justify="right")
    if args.simulate:
        conf = f"{args.confidence * 100:g}%"
        table.add_column(f"simulated block error\n[{conf} interval]", justify="left",
                         no_wrap=True)
    for pt in rep.points:
        row = [f"{pt.p:g}", _fmt(pt.block_error), _fmt(pt.bounded_distance_failure),
               _fmt(pt.undetected_error)]
        if pt.simulation is not None:
            be = pt.simulation.block_error
            row.append(f"{_fmt(be.value, 3)} [{_fmt(be.lower, 3)}, {_fmt(be.upper, 3)}]")
        table.add_row(*row)
    console.print(table)
    if rep.leaders is not None:
        console.print("coset leaders by weight: " + weight_text(rep.leaders.counts, "L")
                      + f"   covering radius {rep.leaders.covering_radius}", soft_wrap=True)
    if rep.weight_distribution is not None:
        console.print("weight distribution: " + weight_text(rep.weight_distribution),
                      soft_wrap=True)
    if rep.simulations:
        first = rep.simulations[0]
        console.print(f"simulation: {first.trials:,} codewords per p, "
                      f"{first.decoder}, seed {args.seed}")
    for note in rep.notes:
        console.print(f"note: {escape(note)}")


def _plot(reports: list[ChannelReport], ps: list[float], path: str) -> Path:
    from ..plots import ChannelCurve, block_error_figure, save_figure

    positive = [p for p in ps if p > 0]
    if not positive:
        raise ParameterError("Argument '--plot' needs at least one p above 0 (log axes).")
    lo, hi = min(positive), max(positive)
    if lo == hi:
        lo, hi = lo / 100, min(0.5, hi * 100)
    grid = [lo * (hi / lo) ** (i / (_PLOT_POINTS - 1)) for i in range(_PLOT_POINTS)]
    curves = []
    for rep in reports:
        label = f"[{rep.n},{rep.k}" + (f",{rep.d}]" if rep.d is not None else "]")
        name = one_line((rep.name or "").split("[")[0].strip(), extra="$")  # data
        if name:
            label += f" {name}"
        exact = rep.exact_at(grid)
        curves.append(ChannelCurve(
            label=label, p=grid, k=rep.k,
            block_error=None if rep.leaders is None else [x.block_error for x in exact],
            bounded_distance=None if rep.t is None else
            [x.bounded_distance_failure for x in exact],
            undetected=None if rep.weight_distribution is None else
            [x.undetected_error for x in exact],
            simulated=rep.simulations,
        ))
    fig = block_error_figure(curves)
    return save_figure(fig, path)

