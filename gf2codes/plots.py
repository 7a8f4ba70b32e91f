"""Figures for design reviews: error probability on a BSC, weight distributions, bounds.

Needs the optional extra ``plot`` (``pip install 'gf2codes[plot]'``, which installs
matplotlib). Figures are built on :class:`matplotlib.figure.Figure` directly, never
through ``pyplot``, so nothing here touches a display, a global figure list or the
global backend: it works headless and in threads. Every function returns the
``Figure``; :func:`save_figure` writes it (PNG by default).

The probabilities plotted come from :mod:`gf2codes.decoding`, the bounds from
:mod:`gf2codes.bounds`.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path
from typing import TYPE_CHECKING, cast

from .exceptions import Gf2CodesError, MissingDependencyError, ParameterError, check_int

if TYPE_CHECKING:  # pragma: no cover
    from matplotlib.figure import Figure
    from matplotlib.ticker import MaxNLocator

    from .decoding import SimulationResult

__all__ = [
    "INSTALL_HINT",
    "require_matplotlib",
    "ChannelCurve",
    "block_error_figure",
    "weight_distribution_figure",
    "bounds_figure",
    "catalog_points",
    "save_figure",
    "bounds_plot_lengths",
    "save_bounds_plot",
    "save_weight_distribution_plot",
]

INSTALL_HINT = "pip install 'gf2codes[plot]'"


def require_matplotlib() -> None:
    """Raise :class:`MissingDependencyError` (with the install command) without matplotlib."""
    try:
        import matplotlib  # noqa: F401
    except ImportError:
        raise MissingDependencyError(
            f"plotting needs matplotlib, which is not installed; install it with "
            f"{INSTALL_HINT}"
        ) from None


def _figure(width: float = 7.0, height: float = 4.8) -> Figure:
    require_matplotlib()
    from matplotlib.figure import Figure

    return Figure(figsize=(width, height), layout="constrained")


def save_figure(fig: Figure, path: str | Path, *, dpi: int = 120) -> Path:
    """Write ``fig`` to ``path``; the suffix picks the format (PNG when there is none)."""
    p = Path(path)
    fmt = p.suffix.lstrip(".").lower() or "png"
    supported = fig.canvas.get_supported_filetypes()
    if fmt not in supported:
        raise ParameterError(
            f"Argument 'plot' must name a file ending in one of "
            f"{', '.join('.' + s for s in sorted(supported))}, not {str(path)!r}.")
    try:
        fig.savefig(p, format=fmt, dpi=dpi)
    except OSError as exc:
        raise ParameterError(f"cannot write the plot to {str(path)!r}: {exc.strerror}.") from None
    return p


# -------------------------------------------------------------------------- channel


@dataclass
class ChannelCurve:
    """One code's curves on a BSC: values at the crossover probabilities ``p``.

    ``block_error`` (complete decoding), ``bounded_distance`` and ``undetected`` may
    hold None where a value is unknown; ``simulated`` holds Monte Carlo results drawn
    as points with their confidence intervals.
    """

    label: str
    p: Sequence[float]
    block_error: Sequence[float | None] | None = None
    bounded_distance: Sequence[float | None] | None = None
    undetected: Sequence[float | None] | None = None
    k: int | None = None
    simulated: Sequence[SimulationResult] = field(default_factory=list)


def _positive(xs: Sequence[float], ys: Sequence[float | None] | None):
    if ys is None:
        return [], []
    pairs = [(float(x), float(y)) for x, y in zip(xs, ys, strict=True)
             if y is not None and x > 0 and y > 0]
    return [a for a, _ in pairs], [b for _, b in pairs]


def block_error_figure(curves: Sequence[ChannelCurve], *, title: str | None = None,
                       show_undetected: bool = True, show_uncoded: bool = True) -> Figure:
    """Error probabilities against the crossover probability, on log–log axes.

    Per code: block error of complete syndrome decoding (solid), failure of
    bounded-distance decoding (dashed), undetected error when used for detection
    only (dotted), simulated block errors (markers with their intervals; a run
    without errors shows its upper limit as a downward triangle). A grey line shows
    an uncoded block of ``k`` bits, ``1 - (1 - p)^k``, for comparison.

    Returns
    -------
    matplotlib.figure.Figure
    """
    if not curves:
        raise ParameterError("Argument 'curves' must hold at least one code, not none.")
    fig = _figure(10.0, 5.4)
    ax = fig.add_subplot()
    colours = [f"C{i % 10}" for i in range(len(curves))]
    floor = math.inf
    all_p: list[float] = []
    for colour, c in zip(colours, curves, strict=True):
        all_p += [float(x) for x in c.p if x > 0]
        x, y = _positive(c.p, c.block_error)
        if x:
            ax.plot(x, y, "-", color=colour, lw=2, label=f"{c.label}: complete decoding")
            floor = min(floor, min(y))
        x, y = _positive(c.p, c.bounded_distance)
        if x:
            ax.plot(x, y, "--", color=colour, lw=1.3,
                    label=f"{c.label}: bounded-distance failure")
            floor = min(floor, min(y))
        if show_undetected:
            x, y = _positive(c.p, c.undetected)
            if x:
                ax.plot(x, y, ":", color=colour, lw=1.3, label=f"{c.label}: undetected error")
        hits = [s for s in c.simulated if s.p > 0 and s.block_error.events > 0]
        if hits:
            est = [s.block_error.value for s in hits]
            ax.errorbar([s.p for s in hits], est,
                        yerr=[[v - s.block_error.lower for v, s in zip(est, hits, strict=True)],
                              [s.block_error.upper - v for v, s in zip(est, hits, strict=True)]],
                        fmt="o", ms=4, color=colour, capsize=3,
                        label=f"{c.label}: simulated ({int(hits[0].block_error.confidence * 100)}%"
                              " interval)")
            floor = min(floor, min(s.block_error.lower for s in hits if s.block_error.lower > 0)
                        if any(s.block_error.lower > 0 for s in hits) else floor)
        misses = [s for s in c.simulated if s.p > 0 and s.block_error.events == 0]
        if misses:
            ax.plot([s.p for s in misses], [s.block_error.upper for s in misses], "v",
                    color=colour, ms=5, label=f"{c.label}: simulated, no errors (upper limit)")
            floor = min(floor, min(s.block_error.upper for s in misses))
    if show_uncoded and all_p:
        lo, hi = min(all_p), max(all_p)
        grid = [lo * (hi / lo) ** (i / 99) for i in range(100)] if hi > lo else [lo]
        styles = ["-", "-.", (0, (5, 2, 1, 2, 1, 2))]
        for i, k in enumerate(sorted({c.k for c in curves if c.k})):
            ax.plot(grid, [-math.expm1(k * math.log1p(-x)) if x < 1 else 1.0 for x in grid],
                    linestyle=styles[i % len(styles)], color="0.55", lw=1,
                    label=f"uncoded, {k} bits")
    ax.set_xscale("log")
    ax.set_yscale("log")
    if math.isfinite(floor):
        ax.set_ylim(bottom=max(floor / 3, 1e-300), top=1.5)
    ax.set_xlabel("crossover probability p")
    ax.set_ylabel("probability per block")
    ax.set_title(title or "How often does each code fail as the channel gets noisier?")
    ax.grid(True, which="major", alpha=0.4)
    ax.grid(True, which="minor", alpha=0.12)
    fig.legend(fontsize="small", loc="outside right upper")
    return fig


# ---------------------------------------------------------------- weight distribution


def weight_distribution_figure(distribution: Sequence[int], *, title: str | None = None,
                               log: bool | None = None) -> Figure:
    """The weight distribution ``A_0..A_n`` as bars, each labelled with its count.

    Parameters
    ----------
    distribution : sequence of int
    title : str, optional
    log : bool, optional
        Logarithmic counts; by default when the nonzero counts span more than a
        factor 100 (as they do for most codes of interest).

    Returns
    -------
    matplotlib.figure.Figure
    """
    A = [int(a) for a in distribution]
    if not A or any(a < 0 for a in A):
        raise ParameterError("Argument 'distribution' must be a nonempty list of counts >= 0.")
    n = len(A) - 1
    fig = _figure(max(6.0, min(14.0, 0.28 * n + 3)), 4.5)
    ax = fig.add_subplot()
    idx = [i for i, a in enumerate(A) if a]
    vals = [A[i] for i in idx]
    if log is None:
        log = max(vals) > 100 * min(vals)
    bars = ax.bar(idx, vals, width=0.8, color="C0")
    if len(idx) <= 40:
        ax.bar_label(bars, labels=[f"{v:,}" if v < 10**6 else f"{v:.2e}" for v in vals],
                     fontsize="x-small", padding=2)
    if log:
        ax.set_yscale("log")
        ax.set_ylim(0.5, max(vals) * 4)
    else:
        ax.set_ylim(0, max(vals) * 1.12)
    ax.set_xlim(-0.8, n + 0.8)
    if n <= 40:
        ax.set_xticks(range(n + 1))
    ax.set_xlabel("weight i")
    ax.set_ylabel("number of codewords A_i")
    d = next((i for i in idx if i), None)
    ax.set_title(title or f"How many codewords has each weight? (n = {n}"
                 + (f", d = {d})" if d else ")"))
    ax.grid(True, axis="y", alpha=0.3)
    return fig


# --------------------------------------------------------------------------- bounds


def catalog_points(k: int, n_values: Sequence[int], *,
                   path: str | Path | None = None) -> list[tuple[int, int, str]]:
    """Codes stored in the catalog with dimension ``k`` and a length in ``n_values``.

    Returns ``(n, d, label)`` triples (``d`` the proved lower bound, the exact distance
    for proved entries), or ``[]`` when :mod:`gf2codes.catalog` is unavailable or the
    catalog file (``path``, by default :func:`gf2codes.catalog.default_catalog_path`)
    does not exist. The catalog is only read: drawing a plot never creates one.
    """
    try:
        from . import catalog
    except ImportError:
        return []
    try:
        p = Path(path) if path is not None else catalog.default_catalog_path()
        if not p.is_file():
            return []
        ns = sorted(int(n) for n in n_values)
        if not ns:
            return []
        with catalog.open_catalog(p, shipped=False) as cat:
            entries = cat.entries(k=int(k), n=(ns[0], ns[-1]))
    except Gf2CodesError:  # an unreadable catalog must not break a plot
        return []
    wanted = set(ns)
    return [(int(e.n), int(e.d), "proved" if e.proved else "d at least")
            for e in entries if e.n in wanted]


def bounds_figure(k: int, n_values: Sequence[int], *, mark: Sequence[tuple[int, int]] = (),
                  mark_label: str = "this code",
                  known: Sequence[tuple[int, int, str]] | None = None,
                  title: str | None = None) -> Figure:
    """Bounds on the minimum distance ``d`` against the length ``n``, for fixed ``k``.

    Draws every upper bound of :func:`gf2codes.bounds.upper_bounds` (thin steps), the
    best upper bound :func:`gf2codes.bounds.best_upper` (thick), the existence bounds
    of :func:`gf2codes.bounds.lower_bounds` (dashed), the open band between the
    existence bounds and the best upper bound shaded, the codes in ``known`` (for example from
    :func:`catalog_points`) as dots and the points in ``mark`` as stars.

    Parameters
    ----------
    k : int
    n_values : sequence of int
        Lengths, each at least ``k``.
    mark : sequence of (n, d)
        Points to highlight (a code being examined), labelled ``mark_label``.
    known : sequence of (n, d, label), optional
        Codes to mark; by default :func:`catalog_points` (empty without a catalog).

    Returns
    -------
    matplotlib.figure.Figure
    """
    from . import bounds as B

    k = check_int("k", k, minimum=1)
    ns = sorted({check_int("n", n, minimum=k) for n in n_values})
    if not ns:
        raise ParameterError("Argument 'n_values' must hold at least one length, not none.")
    uppers = {n: B.upper_bounds(n, k) for n in ns}
    best = [B.best_upper(n, k).d for n in ns]
    lowers = {n: B.lower_bounds(n, k) for n in ns}
    fig = _figure(9.5, 5.2)
    ax = fig.add_subplot()
    names = list(next(iter(uppers.values())))
    for i, name in enumerate(names):
        ax.step(ns, [uppers[n][name] for n in ns], where="mid", lw=1, alpha=0.7,
                color=f"C{(i + 2) % 10}", label=B.title(name) + " bound")
    ax.step(ns, best, where="mid", lw=2.4, color="C3", label="best upper bound")
    for i, name in enumerate(next(iter(lowers.values()))):
        ax.step(ns, [lowers[n][name] for n in ns], where="mid", lw=1.3, ls="--",
                color=["C0", "C9"][i % 2], label=B.title(name) + " (exists)")
    guaranteed = [max(lowers[n].values()) for n in ns]
    ax.fill_between(ns, guaranteed, best, step="mid", color="C3", alpha=0.08,
                    label="open: between existence and upper bounds")
    pts = catalog_points(k, ns) if known is None else list(known)
    if pts:
        ax.plot([p[0] for p in pts], [p[1] for p in pts], "o", color="k", ms=4, zorder=5,
                label="codes in the catalog" if known is None else "known codes")
    if mark:
        ax.plot([m[0] for m in mark], [m[1] for m in mark], "*", color="C1", ms=13,
                mec="k", label=mark_label)
    ax.set_xlabel("length n")
    ax.set_ylabel("minimum distance d")
    ax.set_title(title or f"How large can d be for {k} data bits at each length n?")
    ax.grid(True, alpha=0.3)
    ax.set_xlim(ns[0] - 0.5, ns[-1] + 0.5)
    ax.set_ylim(0, max(max(best), max((m[1] for m in mark), default=0)) + 1)
    # the default locator (AutoLocator) is a MaxNLocator, which takes ``integer``
    cast("MaxNLocator", ax.yaxis.get_major_locator()).set_params(integer=True)
    cast("MaxNLocator", ax.xaxis.get_major_locator()).set_params(integer=True)
    fig.legend(fontsize="small", loc="outside right upper")
    return fig



# ------------------------------------------------------------- one-call helpers (CLI)

_BOUNDS_MAX_N = 128


def bounds_plot_lengths(k: int, n: int | None = None, d: int | None = None) -> range:
    """The lengths :func:`save_bounds_plot` draws: from ``k`` to well past ``n`` (or past the
    least length allowing ``d``), at most ``k + 120`` and at most 128."""
    from . import bounds as B

    k = check_int("k", k, minimum=1, maximum=_BOUNDS_MAX_N)
    if n is not None:
        top = max(n + 12, 2 * n)
    elif d is not None:
        least = B.least_length(k, d).n
        top = max(least + 8, least + least // 2)
    else:
        top = 3 * k + 8
    return range(k, max(k + 1, min(top, k + 120, _BOUNDS_MAX_N)) + 1)


def save_bounds_plot(path: str | Path, *, k: int, n: int | None = None,
                     d: int | None = None) -> Path:
    """Draw :func:`bounds_figure` for dimension ``k`` around ``n`` (or ``d``) into ``path``.

    With ``n`` the best upper bound at ``(n, k)`` is marked; with ``d`` the least length
    the bounds allow for ``(k, d)``.
    """
    from . import bounds as B

    ns = bounds_plot_lengths(k, n, d)
    if n is not None:
        best = B.best_upper(n, k).d
        mark, label = [(n, best)], f"[{n},{k}]: d ≤ {best}"
    elif d is not None:
        least = B.least_length(k, d).n
        mark, label = [(least, d)], f"d = {d} needs n ≥ {least}"
    else:
        mark, label = [], ""
    return save_figure(bounds_figure(k, ns, mark=mark, mark_label=label), path)


def save_weight_distribution_plot(distribution: Sequence[int], path: str | Path, *,
                                  title: str | None = None) -> Path:
    """Draw :func:`weight_distribution_figure` into ``path``."""
    return save_figure(weight_distribution_figure(distribution, title=title), path)
