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
from typing import Any

import numpy as np
from rich import box
from rich.markup import escape
from rich.table import Table

from ..code import Code
from ..decoding import (
    DEFAULT_MAX_REDUNDANCY,
    block_error_probability,
    bounded_distance_failure_probability,
    check_probability,
    coset_leader_distribution,
    simulate_bsc,
    undetected_error_probability,
)
from ..exceptions import ParameterError, TooExpensiveError, check_int
from ..formats import one_line, read_code
from ..weights import (
    DEFAULT_MAX_ENUMERATION,
    minimum_weight_from_distribution,
    weight_distribution,
    weight_enumeration_cost,
)
from ._common import (
    ProgressBar,
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

__all__ = ["register", "run", "parse_p", "analyse"]

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


# ------------------------------------------------------------------------- analysis


def _distance(code: Code, distribution: list[int] | None, notes: list[str]) -> int | None:
    if distribution is not None:
        return minimum_weight_from_distribution(distribution)
    from ..distance import minimum_distance

    try:
        res = minimum_distance(code)
    except TooExpensiveError:
        notes.append("d not proved (too expensive): the bounded-distance figures are omitted")
        return None
    return res.d if res.exact else None


def analyse(code: Code, ps: list[float], *, simulate: int | None = None, seed: int = 0,
            confidence: float = 0.99, index: int = 0, source: str | None = None
            ) -> dict[str, Any]:
    """Everything ``channel`` reports for one code, as a JSON-ready dict.

    The simulation at the ``j``-th ``p`` of the ``index``-th code uses the generator
    ``numpy.random.default_rng([seed, index, j])``, so each figure is reproducible on
    its own.

    Raises
    ------
    TooExpensiveError
        If the exact method does not apply (``n - k > 26``) and ``simulate`` is None.
    """
    n, k = code.n, code.k
    r = n - k
    where = f"{source}: " if source else ""
    exact = r <= DEFAULT_MAX_REDUNDANCY
    if not exact and not simulate:
        raise TooExpensiveError(
            f"{where}the exact block-error probability of this [{n},{k}] code needs the coset "
            f"leaders of all 2^{r} = {float(2 ** r):.3g} syndromes (n - k = {r} > "
            f"{DEFAULT_MAX_REDUNDANCY}); use --simulate N for a Monte Carlo estimate.",
            work=float(2 ** r))
    notes: list[str] = []
    distribution = None
    if weight_enumeration_cost(code) <= DEFAULT_MAX_ENUMERATION:
        with ProgressBar("counting weights") as bar:
            distribution = weight_distribution(code, progress=bar)
    else:
        notes.append(f"weight distribution not computed (2^{min(k, r)} codewords): the "
                     "undetected-error figures are simulated only")
    d = _distance(code, distribution, notes)
    t = None if d is None else (d - 1) // 2
    leaders = coset_leader_distribution(code) if exact else None
    if not exact:
        notes.append(f"n - k = {r} > {DEFAULT_MAX_REDUNDANCY}: no exact block-error figures, "
                     "simulation only")
    points = []
    simulations = []
    for j, p in enumerate(ps):
        pt: dict[str, Any] = {
            "p": p,
            "block_error": None if leaders is None else block_error_probability(leaders, p),
            "bounded_distance_failure": (None if t is None else
                                         bounded_distance_failure_probability(n, t, p)),
            "undetected_error": (None if distribution is None else
                                 undetected_error_probability(distribution, p)),
        }
        if simulate:
            with ProgressBar(f"simulating p = {p:g}") as bar:
                res = simulate_bsc(code, p, simulate, seed=np.random.default_rng([seed, index, j]),
                                   d=d, confidence=confidence, progress=bar)
            simulations.append(res)
            sim = res.as_dict()
            sim["seed"] = [seed, index, j]
            pt["simulation"] = sim
        points.append(pt)
    return {
        "source": source,
        "name": code.name,
        "n": n,
        "k": k,
        "d": d,
        "t": t,
        "coset_leaders": None if leaders is None else list(leaders.counts),
        "covering_radius": None if leaders is None else leaders.covering_radius,
        "weight_distribution": distribution,
        "points": points,
        "notes": notes,
        "_leaders": leaders,
        "_simulations": simulations,
    }


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
    reports = [analyse(rec.code, ps, simulate=args.simulate, seed=args.seed,
                       confidence=args.confidence, index=i, source=f)
               for i, (f, rec) in enumerate(records)]
    path = _plot(reports, ps, args.plot) if args.plot else None
    if args.json:
        print_json({"codes": [{key: v for key, v in rep.items() if not key.startswith("_")}
                              for rep in reports]})
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


def _print(rep: dict[str, Any], args: argparse.Namespace) -> None:
    n, k, d, t = rep["n"], rep["k"], rep["d"], rep["t"]
    params = f"n={n} k={k} " + (f"d={d} t={t}" if d is not None else "d not proved")
    title = clean(f"{rep['source'] or rep['name'] or 'code'}  BSC  {params}")
    if rep["name"] and rep["source"]:
        title += clean(f"  ({rep['name']})")
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
    for pt in rep["points"]:
        row = [f"{pt['p']:g}", _fmt(pt["block_error"]), _fmt(pt["bounded_distance_failure"]),
               _fmt(pt["undetected_error"])]
        if args.simulate:
            be = pt["simulation"]["block_error"]
            row.append(f"{_fmt(be['value'], 3)} [{_fmt(be['lower'], 3)}, "
                       f"{_fmt(be['upper'], 3)}]")
        table.add_row(*row)
    console.print(table)
    if rep["coset_leaders"] is not None:
        console.print("coset leaders by weight: " + weight_text(rep["coset_leaders"], "L")
                      + f"   covering radius {rep['covering_radius']}", soft_wrap=True)
    if rep["weight_distribution"] is not None:
        console.print("weight distribution: " + weight_text(rep["weight_distribution"]),
                      soft_wrap=True)
    if args.simulate and rep["points"]:
        first = rep["points"][0]["simulation"]
        console.print(f"simulation: {first['trials']:,} codewords per p, "
                      f"{first['decoder']}, seed {args.seed}")
    for note in rep["notes"]:
        console.print(f"note: {escape(note)}")


def _plot(reports: list[dict[str, Any]], ps: list[float], path: str):
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
        n, leaders, dist, t = rep["n"], rep["_leaders"], rep["weight_distribution"], rep["t"]
        label = f"[{n},{rep['k']}" + (f",{rep['d']}]" if rep["d"] is not None else "]")
        name = one_line((rep["name"] or "").split("[")[0].strip(), extra="$")  # data
        if name:
            label += f" {name}"
        curves.append(ChannelCurve(
            label=label, p=grid, k=rep["k"],
            block_error=None if leaders is None else
            [block_error_probability(leaders, p) for p in grid],
            bounded_distance=None if t is None else
            [bounded_distance_failure_probability(n, t, p) for p in grid],
            undetected=None if dist is None else
            [undetected_error_probability(dist, p) for p in grid],
            simulated=rep["_simulations"],
        ))
    fig = block_error_figure(curves)
    return save_figure(fig, path)

