"""The catalog's tables: shortest lengths and greatest distances on file beside the bounds.

Both are computed from the entries as columns (:class:`~gf2codes.catalog.propagation.
EntryArrays`) by the closed-form propagation rules; only entries proved here count, and
the better claim stands beside. :meth:`gf2codes.catalog.Catalog.length_table` and
:meth:`~gf2codes.catalog.Catalog.distance_table` call these.
"""

from __future__ import annotations

from collections.abc import Iterable
from typing import Any

import numpy as np

from ..bounds import best_upper, least_length
from ..exceptions import check_int
from .propagation import NO_LENGTH, EntryArrays, reach_distance, reach_length

__all__ = ["length_table", "distance_table"]


def length_table(arrays: EntryArrays, dimensions: Iterable[int], distances: Iterable[int]
                 ) -> list[dict[str, Any]]:
    """The shortest length on file for every ``k`` in ``dimensions`` and ``d`` in
    ``distances``, beside the least length the bounds allow.

    Each row, in order of ``k`` then ``d``::

        {"k", "d", "n", "entry", "stored", "d_proved", "n_least", "least_by", "gap",
         "claimed_n"}

    ``n`` is the least length of a stored or derived ``[n, k, >= d]`` code (None when
    the catalog has none), ``entry`` the stored entry it is (or is derived from),
    ``stored`` whether it is that entry itself, ``d_proved`` whether that entry's
    distance is proved exactly; ``n_least`` and ``least_by`` are
    :func:`gf2codes.bounds.least_length`; ``gap = n - n_least`` (0: the length on file
    is proved shortest; None when nothing is on file). Only entries proved here count;
    ``claimed_n`` is the shorter length that a claimed (unproved) entry states, or None.
    """
    ids_all, N_all, K_all, L_all, _, P_all = arrays
    ids, N0, K0, L0, U0, _ = arrays.only_proved()
    big = NO_LENGTH
    rows = []
    for k in dimensions:
        k = check_int("k", k, minimum=1)
        for d in distances:
            d = check_int("d", d, minimum=1)
            least = least_length(k, d)
            row: dict[str, Any] = {"k": k, "d": d, "n": None, "entry": None,
                                   "stored": False, "d_proved": False,
                                   "n_least": least.n, "least_by": least.by, "gap": None,
                                   "claimed_n": None}
            lengths = reach_length(N0, K0, L0, k, d) if ids.size else np.zeros(0, np.int64)
            claimed = (int(reach_length(N_all, K_all, L_all, k, d).min()) if ids_all.size
                       else big)
            proved_n = int(lengths.min()) if lengths.size else big
            if claimed < proved_n:
                row["claimed_n"] = claimed
            if lengths.size and int(lengths.min()) != big:
                n = int(lengths.min())
                cand = np.flatnonzero(lengths == n)
                here = cand[(N0[cand] == n) & (K0[cand] == k)]
                pick = int(here[0] if here.size else cand[0])
                row.update(n=n, entry=int(ids[pick]), stored=bool(here.size),
                           d_proved=bool(L0[pick] == U0[pick]), gap=n - least.n)
            rows.append(row)
    return rows


def distance_table(arrays: EntryArrays, lengths: Iterable[int]) -> list[dict[str, Any]]:
    """For every ``n`` in ``lengths`` and ``1 <= k <= n``: the greatest proved ``d`` on
    file (stored or derived, 0 when none), whether it is stored, and the best upper
    bound. (The command line shows :meth:`length_table` instead.)

    Each row: ``{"n", "k", "d", "exact", "stored", "entry", "bound", "bound_by",
    "meets_bound", "claimed_d"}``; ``entry`` is the stored id or the base id of a
    derived value. ``d`` counts only entries proved here; ``claimed_d`` is the greater
    d that a claimed (unproved) entry states, or None.
    """
    ids_all, N_all, K_all, L_all, _, P_all = arrays
    ids, N0, K0, L0, U0, _ = arrays.only_proved()
    rows = []
    for n in lengths:
        n = check_int("n", n, minimum=1)
        for k in range(1, n + 1):
            dv = reach_distance(N0, K0, L0, n, k) if ids.size else np.zeros(0, np.int64)
            dc = (reach_distance(N_all, K_all, L_all, n, k) if ids_all.size
                  else np.zeros(0, np.int64))
            ub = best_upper(n, k)
            claimed = int(dc.max()) if dc.size else 0
            row = {"n": n, "k": k, "d": 0, "exact": False, "stored": False,
                   "entry": None, "bound": ub.d, "bound_by": ub.by, "meets_bound": False,
                   "claimed_d": claimed if claimed > (int(dv.max()) if dv.size else 0)
                   else None}
            if dv.size and dv.max() > 0:
                best = int(dv.max())
                cand = np.flatnonzero(dv == best)
                here = cand[(N0[cand] == n) & (K0[cand] == k)]
                pick = int(here[0] if here.size else cand[0])
                row.update(d=best, stored=bool(here.size), entry=int(ids[pick]),
                           exact=bool(here.size and L0[pick] == U0[pick]),
                           meets_bound=best >= ub.d)
            rows.append(row)
    return rows
