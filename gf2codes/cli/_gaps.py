"""``gf2codes gaps``: where the catalog stands on a region of (n, k) cells.

Counts the cells whose proved d meets the best proved upper bound and those within 1,
then lists the open cells, largest gap first, each with both sides' best evidence: the
code (stored entry, or the entry it is derived from and how) and its recipe; the bound
and the rule that proves it.

Exit status: 0; 2 for errors.
"""

from __future__ import annotations

import json
from typing import Any

from ..exceptions import ParameterError
from ._common import console, parse_range, say

__all__ = ["register", "run"]


def register(subparsers: Any) -> None:
    p = subparsers.add_parser(
        "gaps", help="where the catalog stands on a region: cells at the bound, the gaps",
        description="Summarise a region of (n, k) cells: how many have a proved code "
                    "meeting the best proved upper bound on d, how many are within 1, and "
                    "for each open cell the best code (with its recipe) against the best "
                    "bound (with its rule).")
    p.add_argument("--catalog", metavar="PATH",
                   help="the catalog file (default: $GF2CODES_CATALOG, else "
                        "$XDG_DATA_HOME/gf2codes/catalog.sqlite)")
    p.add_argument("--n", metavar="R", required=True, help="lengths, a value or a range like 1-64")
    p.add_argument("--k", metavar="R", help="dimensions (default: every k <= n)")
    p.add_argument("--show", type=int, default=15, metavar="N",
                   help="open cells to list (default 15; 0 for none, -1 for all)")
    p.add_argument("--json", action="store_true", help="print one JSON object")


def _pct(part: int, whole: int) -> str:
    return f"{100 * part / whole:.1f} %" if whole else "-"


def run(args: Any) -> int:
    from ..catalog import open_catalog
    from ..growth import region_cells, region_standing

    lengths = parse_range("n", args.n)
    if lengths.start < 1:
        raise ParameterError(f"Argument 'n' must be at least 1, not {lengths.start}.")
    if args.show < -1:
        raise ParameterError(f"Argument 'show' must be at least -1, not {args.show}.")
    dims = parse_range("k", args.k) if args.k else None
    limit = None if args.show == -1 else args.show
    with open_catalog(args.catalog) as cat:
        cells = region_cells(lengths=lengths, dimensions=dims)
        st = region_standing(cat, cells)
    if args.json:
        console.plain(json.dumps(st.to_dict(limit)) + "\n")
        return 0
    region = f"n {args.n}" + (f", k {args.k}" if args.k else "")
    say(f"region        {region}: {st.cells} cells")
    say(f"at the bound  {st.at_bound} ({_pct(st.at_bound, st.cells)}): the proved d meets "
          "the best proved upper bound")
    say(f"within 1      {st.within_one} ({_pct(st.within_one, st.cells)})")
    say(f"open          {len(st.open)}; largest gap {st.open[0].gap if st.open else 0}"
          + (f"; {st.unknown} cells with no code" if st.unknown else ""))
    shown = st.open if limit is None else st.open[:limit]
    if shown:
        say()
        say("In an open cell, d is only a lower bound on the best possible distance and the "
              "bound only an upper one: the truth lies between.")
        say(f"{'n':>4} {'k':>4} {'d':>4} {'bound':>5} {'gap':>4}  bound by / code / recipe")
        for c in shown:
            say(f"{c.n:>4} {c.k:>4} {c.d:>4} {c.bound:>5} {c.gap:>4}  {c.bound_by}")
            say(f"{'':>25}{c.code}")
            say(f"{'':>25}{c.recipe}")
        if len(shown) < len(st.open):
            say(f"... {len(st.open) - len(shown)} more open cells (--show -1 lists all)")
    return 0
