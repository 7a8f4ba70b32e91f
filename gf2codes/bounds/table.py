"""The best upper bound: formula bounds propagated through a table of neighbours.

:func:`best_upper` combines the cheap bounds of the registry (Singleton, Hamming,
Plotkin, Griesmer) over a table of all smaller parameters with the neighbour relations
that puncturing, shortening, taking subcodes, adding a parity bit and the residual code
give, with the shipped exhaustive non-existence results (:data:`NONEXISTENCE_FILE`) and
with the shipped certified Delsarte LP values (:data:`LP_BOUNDS_FILE`, [3]_, [4]_) and
with the shipped non-existence facts the LP proves once the weights that residual codes
rule out are forced to zero (:data:`LP_RESIDUAL_FILE`); then
takes the minimum with the other bounds *at the queried point only*. Each row of the
table depends only on smaller lengths and on the bounds one length further, so a value
does not depend on what was asked before.
The table and every value derived from it are memos (:func:`gf2codes._util.memo`):
:func:`gf2codes._util.clear_caches` (or :func:`reset_tables`) forgets them.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1 §9 (puncturing, shortening, extending).
.. [2] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*,
   Cambridge University Press, 2003, §1.5 and Thm 2.7.1 (the residual code).
.. [3] P. Delsarte, "An algebraic approach to the association schemes of coding
   theory", *Philips Research Reports Supplements* 10, 1973.
.. [4] MacWilliams & Sloane 1977 (as [1]), ch. 17 §4 (the linear programming bound;
   section numbers from memory).
"""

from __future__ import annotations

from pathlib import Path

from .._diskcache import Memo
from .._util import clear_caches, memo
from ..exceptions import ParseError
from .formulas import check_kd, check_nd, check_nk, kmax_hamming
from .lp import lp_value
from .registry import LP_LENGTH_LIMIT
from .results import DimensionBound, LengthBound, UpperBound
from .upper import cheap_profiles, individual

__all__ = [
    "TABLE_LENGTH", "NONEXISTENCE_FILE", "LP_BOUNDS_FILE", "LP_RESIDUAL_FILE",
    "proved_nonexistence", "shipped_lp_bounds", "shipped_lp_residual", "bound_chain",
    "best_upper", "least_length", "max_dimension", "reset_tables",
]

#: The shipped exhaustive non-existence results (written by
#: ``scripts/build_nonexistence.py``; installed with the package).
NONEXISTENCE_FILE = Path(__file__).resolve().parent.parent / "_nonexistence.jsonl"

#: The shipped certified Delsarte LP values (written by ``scripts/build_lp_bounds.py``;
#: installed with the package): only the cells where the LP beats the cheap bounds.
LP_BOUNDS_FILE = Path(__file__).resolve().parent.parent / "_lp_bounds.jsonl"

#: The shipped non-existence facts of the LP with residual exclusions (written by
#: ``scripts/build_lp_residual.py``; installed with the package).
LP_RESIDUAL_FILE = Path(__file__).resolve().parent.parent / "_lp_residual.jsonl"

#: Lengths covered by the fixed-point table (rows beyond are extended one at a time).
TABLE_LENGTH = 128

#: ``(rule, source cell or None, extra)`` for each cell of the fixed-point table.
_Why = tuple[str, tuple[int, int] | None, int]


@memo(1)
def proved_nonexistence() -> tuple[tuple[int, int, int, int], ...]:
    """The shipped exhaustive non-existence results ``(n, k, d, nodes)``.

    Each says "no binary linear ``[n, k, d]`` code exists", decided by
    :func:`gf2codes.existence.decide_existence` (an exhaustive search of ``nodes``
    nodes). The file :data:`NONEXISTENCE_FILE` (``gf2codes/_nonexistence.jsonl``) is written by
    ``scripts/build_nonexistence.py``; the tests decide every entry again.
    """
    import json

    out = []
    if NONEXISTENCE_FILE.exists():
        for line in NONEXISTENCE_FILE.read_text().splitlines():
            if line.strip():
                rec = json.loads(line)
                out.append((int(rec["n"]), int(rec["k"]), int(rec["d"]), int(rec["nodes"])))
    return tuple(out)


@memo(1)
def shipped_lp_bounds() -> tuple[tuple[int, int, int], ...]:
    """The shipped certified Delsarte LP values ``(n, k, d)``.

    Each says "the certified LP proves ``d(C) <= d`` for every binary linear ``[n, k]``
    code ``C``" ([3], [4]; :func:`gf2codes.bounds.lp.lp_value`, whose certificates are
    checked in exact integer arithmetic). The file :data:`LP_BOUNDS_FILE`
    (``gf2codes/_lp_bounds.jsonl``) is written by ``scripts/build_lp_bounds.py``, which
    solves every cell again with the LP memo switched off and keeps only the cells where
    the LP is below the cheap bounds; the tests solve a sample of the lines again (all
    of them behind ``-m slow``). An absent file gives no values (a weaker, still valid,
    table).

    Raises
    ------
    ParseError
        A line that is not ``{"n": N, "k": K, "d": D}`` with ``1 <= K <= N`` and
        ``1 <= D <= N`` (the file and line are named).
    """
    import json

    if not LP_BOUNDS_FILE.exists():
        return ()
    lines = LP_BOUNDS_FILE.read_text().splitlines()
    try:  # one parse of the whole file: a third of the time of a parse per line
        recs = json.loads("[" + ",".join(line for line in lines if line.strip()) + "]")
    except ValueError:
        recs = None
    out: list[tuple[int, int, int]] = []
    if isinstance(recs, list):
        for rec in recs:
            cell = _lp_cell(rec)
            if cell is None:
                break
            out.append(cell)
        else:
            return tuple(out)
    for no, line in enumerate(lines, start=1):  # name the first bad line
        try:
            bad = bool(line.strip()) and _lp_cell(json.loads(line)) is None
        except ValueError:
            bad = True
        if bad:
            raise ParseError(f"{LP_BOUNDS_FILE}, line {no}: not an LP value "
                             f'{{"n": N, "k": K, "d": D}} with 1 <= K, D <= N.')
    raise AssertionError("unreachable: a record failed but no line did")  # pragma: no cover


@memo(1)
def shipped_lp_residual() -> tuple[tuple[int, int, int, tuple[int, ...], int], ...]:
    """The shipped facts of the LP with residual exclusions ``(n, k, d, excluded, size)``.

    Each says "no binary linear ``[n, k, d]`` code exists": the even-code Delsarte LP,
    with the weights ``excluded`` forced to zero because the table rules out their
    residual codes, has an exactly checked certificate ``|C| <= size < 2^k``
    (:func:`gf2codes.bounds.lp.lp_residual_rules_out`). A fact at dimension ``k`` reads
    the table only at dimension ``k - 1``, and a fact lowers values only at dimensions
    ``>= k`` (every rule of :func:`_compute_fixed_table` bounds a cell by cells of
    smaller or equal dimension), so the facts rest on each other without a cycle. The
    file :data:`LP_RESIDUAL_FILE` (``gf2codes/_lp_residual.jsonl``) is written by
    ``scripts/build_lp_residual.py``; the tests prove every line again from the table.

    Raises
    ------
    ParseError
        A line that is not such a record (the file and line are named).
    """
    import json

    if not LP_RESIDUAL_FILE.exists():
        return ()
    out = []
    for no, line in enumerate(LP_RESIDUAL_FILE.read_text().splitlines(), start=1):
        if not line.strip():
            continue
        try:
            rec = json.loads(line)
        except ValueError:
            rec = None
        fact = _residual_fact(rec)
        if fact is None:
            raise ParseError(f"{LP_RESIDUAL_FILE}, line {no}: not an LP fact "
                             '{"n": N, "k": K, "d": D, "excluded": [W, ...], "size": S} '
                             "with 1 <= K, D <= N and 1 <= S < 2^K.")
        out.append(fact)
    return tuple(out)


def _residual_fact(rec: object) -> tuple[int, int, int, tuple[int, ...], int] | None:
    """``(n, k, d, excluded, size)`` of one LP-residual record, or None when not one."""
    if not isinstance(rec, dict) or set(rec) != {"n", "k", "d", "excluded", "size"}:
        return None
    n, k, d, ex, size = (rec[key] for key in ("n", "k", "d", "excluded", "size"))
    if not all(type(v) is int for v in (n, k, d, size)) or not isinstance(ex, list):
        return None
    if not all(type(w) is int for w in ex):
        return None
    if not (1 <= k <= n and 1 <= d <= n and 1 <= size < 1 << k):
        return None
    return n, k, d, tuple(ex), size


def _lp_cell(rec: object) -> tuple[int, int, int] | None:
    """``(n, k, d)`` of one LP record, or None when it is not one."""
    if not isinstance(rec, dict) or set(rec) != {"n", "k", "d"}:
        return None
    n, k, d = rec["n"], rec["k"], rec["d"]
    if not all(type(v) is int for v in (n, k, d)) or not (1 <= k <= n and 1 <= d <= n):
        return None
    return n, k, d


def _describe(n: int, k: int, value: int, why: _Why) -> str:
    rule, src, extra = why
    if src is None:
        if rule == "exhaustive":
            return f"exhaustive search: no [{n},{k},{value + 1}] code ({extra:,} nodes)"
        if rule == "lp":
            return "lp (certified Delsarte LP)"
        if rule == "lp-residual":
            return (f"lp-residual: no [{n},{k},{value + 1}] code (certified Delsarte LP, "
                    "weights that residual codes rule out set to zero)")
        return rule
    cell = f"[{src[0]},{src[1]}]"
    if rule == "residual":
        return (f"residual: an [{n},{k},{extra}] code would give a "
                f"{cell[:-1]},{-(-extra // 2)}] code")
    return f"{rule} {cell}"


@memo(1)
def _fixed_table() -> tuple[list[list[int]], list[list[_Why]]]:
    """:func:`_compute_fixed_table`, remembered on disk under the digest of its inputs
    (:func:`_inputs_digest`): computing it costs about 0.25 s a process (every verdict,
    bound and table view pays it), reading it a few milliseconds. A remembered table of
    the wrong shape is computed again."""
    memo_ = _rows_memo()
    known = memo_.get("fixed-table")
    table = _table_from_json(known)
    if table is not None:
        return table
    val, why = _compute_fixed_table()
    memo_.put("fixed-table", [val, [[[r, list(s) if s else None, e] for r, s, e in row]
                                    for row in why]])
    return val, why


def _table_from_json(obj: object) -> tuple[list[list[int]], list[list[_Why]]] | None:
    """The table stored by :func:`_fixed_table`, or None when ``obj`` is not one."""
    T = TABLE_LENGTH + 1
    if not (isinstance(obj, list) and len(obj) == 2):
        return None
    vals, whys = obj
    if not (isinstance(vals, list) and isinstance(whys, list)
            and len(vals) == len(whys) == T + 1):
        return None
    val: list[list[int]] = []
    why: list[list[_Why]] = []
    for n in range(T + 1):
        vrow, wrow = vals[n], whys[n]
        if not (isinstance(vrow, list) and isinstance(wrow, list)
                and len(vrow) == len(wrow) == n + 1):
            return None
        try:
            val.append([int(v) for v in vrow])
            why.append([(str(r), (int(src[0]), int(src[1])) if src else None, int(e))
                        for r, src, e in wrow])
        except (TypeError, ValueError, IndexError):
            return None
    return val, why


def _compute_fixed_table() -> tuple[list[list[int]], list[list[_Why]]]:
    """The fixed point of the propagation rules over ``n <= TABLE_LENGTH + 1``.

    Start: for every cell the least of the cheap formula bounds, the shipped
    exhaustive non-existence results (:func:`proved_nonexistence`), the shipped
    certified LP values (:func:`shipped_lp_bounds`, rule ``lp``) and the shipped facts of
    the LP with residual exclusions (:func:`shipped_lp_residual`, rule ``lp-residual``).
    Then apply, in sweeps
    until nothing changes (each rule is a theorem about ``D(n, k)``, the largest distance
    of an ``[n, k]`` code; a value only ever decreases, so the sweeps terminate):

    * shortening: ``D(n, k) <= D(n - 1, k - 1)`` ([2] Thm 1.5.7);
    * puncturing: ``D(n, k) <= D(n - 1, k) + 1`` ([1] ch. 1 §9; [2] Thm 1.5.1);
    * subcode: ``D(n, k) <= D(n, k - 1)``;
    * parity: an upper bound ``e`` on ``D(n + 1, k)`` gives ``D(n, k) <= 2 floor(e/2)``
      (append a zero coordinate, or for odd ``d`` an overall parity bit);
    * residual code: if an ``[n, k]`` code with minimum distance exactly ``d`` exists
      (``k >= 2``), the residual code with respect to a word of weight ``d`` is an
      ``[n - d, k - 1, >= ceil(d / 2)]`` code ([2] Thm 2.7.1; proof: for ``x`` outside
      ``{0, c}``, ``wt(x) + wt(x + c) >= 2d`` gives ``2 wt(x outside c) >= d``, which is
      also why the map has kernel ``{0, c}``). So if the table rules that code out, no
      ``[n, k]`` code has distance exactly ``d``, hence none has distance ``>= d``
      (puncture and append zero coordinates to bring any larger distance down to
      ``d``), and ``D(n, k) <= d - 1``.

    The last row (``TABLE_LENGTH + 1``) takes its parity step from the cheap bounds and
    the shipped LP values one length further. Returns the values and, per cell, the rule
    and source cell.
    """
    T = TABLE_LENGTH + 1
    val: list[list[int]] = [[0]]
    why: list[list[_Why]] = [[("", None, 0)]]
    for n in range(1, T + 1):
        vrow: list[int] = [0]
        wrow: list[_Why] = [("", None, 0)]
        for k in range(1, n + 1):
            v, name = _base(n, k)
            vrow.append(v)
            wrow.append((name, None, 0))
        val.append(vrow)
        why.append(wrow)
    above = [0] + [_base(T + 1, k)[0] for k in range(1, T + 2)]
    for n, k, d in shipped_lp_bounds():
        if n <= T and d < val[n][k]:
            val[n][k] = d
            why[n][k] = ("lp", None, 0)
        elif n == T + 1:
            above[k] = min(above[k], d)
    for n, k, d, nodes in proved_nonexistence():
        if n <= T and k <= n and d - 1 < val[n][k]:
            val[n][k] = d - 1
            why[n][k] = ("exhaustive", None, nodes)
    for n, k, d, _, _ in shipped_lp_residual():
        if n <= T and d - 1 < val[n][k]:
            val[n][k] = d - 1
            why[n][k] = ("lp-residual", None, 0)
    changed = True
    while changed:
        changed = False
        for n in range(1, T + 1):
            row, wrow = val[n], why[n]
            for k in range(1, n + 1):
                v = row[k]
                best: int = v
                reason: _Why = wrow[k]
                if k >= 2:
                    e = val[n - 1][k - 1]
                    if e < best:
                        best, reason = e, ("shortening", (n - 1, k - 1), 0)
                    e = row[k - 1]
                    if e < best:
                        best, reason = e, ("subcode", (n, k - 1), 0)
                if k <= n - 1:
                    e = val[n - 1][k] + 1
                    if e < best:
                        best, reason = e, ("puncturing", (n - 1, k), 0)
                e = 2 * ((val[n + 1][k] if n < T else above[k]) // 2)
                if e < best:
                    best, reason = e, ("parity", (n + 1, k), 0)
                if k >= 2:
                    dd = best
                    while dd >= 1:
                        m = n - dd
                        if m >= k - 1 and val[m][k - 1] >= -(-dd // 2):
                            break
                        dd -= 1
                    if dd < best:
                        m = n - (dd + 1)
                        best, reason = dd, ("residual", (max(m, 0), k - 1), dd + 1)
                if best < v:
                    if best < 1:  # pragma: no cover - would mean a rule below a real code
                        raise AssertionError(f"bound table broken at [{n},{k}]")
                    row[k], wrow[k] = best, reason
                    changed = True
    return val, why


def reset_tables() -> None:
    """Forget every cached table value (after ``_nonexistence.jsonl`` or
    ``_lp_bounds.jsonl`` changed).

    The tables are memos of :func:`gf2codes._util.memo`, so this is
    :func:`gf2codes._util.clear_caches` (which empties the other memos too).
    """
    clear_caches()


def bound_chain(n: int, k: int) -> list[str]:
    """How the table's bound at ``(n, k)`` was obtained, one step per line.

    Follows the source cells of :func:`best_upper`'s table back to a formula bound or an
    exhaustive search or a shipped LP value, e.g. ``["[16,8] d <= 5: parity [17,8]", ...,
    "[18,8] d <= 6: griesmer"]`` or ``["[30,21] d <= 4: lp (certified Delsarte LP)"]``.
    Only for ``n <= TABLE_LENGTH`` (otherwise one line from the bound).

    Raises
    ------
    ParameterError
    """
    n, k = check_nk(n, k)
    if n > TABLE_LENGTH:
        ub = _best(n, k)
        return [f"[{n},{k}] d <= {ub.d}: {ub.by}"]
    val, why = _fixed_table()
    out: list[str] = []
    cell: tuple[int, int] | None = (n, k)
    seen: set[tuple[int, int]] = set()
    while cell is not None and cell not in seen and cell[0] <= TABLE_LENGTH + 1:
        seen.add(cell)
        a, b = cell
        w = why[a][b]
        out.append(f"[{a},{b}] d <= {val[a][b]}: {_describe(a, b, val[a][b], w)}")
        cell = w[1]
    return out


@memo(1)
def _extended_rows() -> list[list[tuple[int, str]]]:
    """``rows[n][k] = (bound on D(n, k), label)``, grown by :func:`_extend_table` (a memo,
    so that :func:`gf2codes._util.clear_caches` empties it with the table it extends)."""
    return []


def _base(n: int, k: int) -> tuple[int, str]:
    prof = cheap_profiles(n)
    return min(((prof[name][k], name) for name in prof), key=lambda t: t[0])


def _inputs_digest() -> str:
    """A digest of everything the table is computed from: the source of the bounds
    package, the shipped non-existence facts, LP values and LP-residual facts. A changed
    rule or fact is a new digest, so remembered rows are never reused for a different
    table."""
    import hashlib

    h = hashlib.sha256()
    for path in sorted(Path(__file__).resolve().parent.glob("*.py")):
        h.update(path.name.encode())
        h.update(path.read_bytes())
    for path in (NONEXISTENCE_FILE, LP_BOUNDS_FILE, LP_RESIDUAL_FILE):
        h.update(path.name.encode())
        if path.exists():
            h.update(path.read_bytes())
    return h.hexdigest()[:20]


@memo(1)
def _rows_memo() -> Memo:
    """Rows of the table beyond the fixed point (``n > TABLE_LENGTH + 1``), remembered on
    disk: building them to n = 255 costs about 0.7 s a process (the ``verify`` verdict of a
    [255, 231] code), reading them a few milliseconds."""
    return Memo("bound-rows", version=_inputs_digest())


def _extend_table(n_max: int) -> list[list[tuple[int, str]]]:
    _rows = _extended_rows()
    if not _rows:
        val, why = _fixed_table()
        for n in range(TABLE_LENGTH + 2):
            _rows.append([(val[n][k], _describe(n, k, val[n][k], why[n][k])) for k in range(n + 1)])
    while len(_rows) <= n_max:
        n = len(_rows)
        known = _rows_memo().get(str(n))
        if (isinstance(known, list) and len(known) == n + 1
                and all(isinstance(c, list) and len(c) == 2 for c in known)):
            _rows.append([(int(v), str(lab)) for v, lab in known])
            continue
        row: list[tuple[int, str]] = [(0, "")]
        for k in range(1, n + 1):
            cands = [_base(n, k)]
            # Beyond the fixed-point table, rows are built one at a time from the rules
            # of _fixed_table that look at shorter lengths, plus the parity step with the
            # cheap bounds at (n+1, k) -- computed directly, so there is no circularity --
            # and with (n, k-1) >= D(n+1, k), which holds by shortening [n+1, k] -> [n, k-1].
            e, name = _base(n + 1, k)
            cands.append((2 * (e // 2), f"{name} at [{n + 1},{k}], parity"))
            if k >= 2:
                e, lab = row[k - 1]
                cands.append((2 * (e // 2), f"[{n},{k - 1}] by shortening [{n + 1},{k}], "
                                            "parity"))
            if k <= n - 1:
                e, lab = _rows[n - 1][k]
                cands.append((e + 1, f"[{n - 1},{k}] ({lab}), puncturing"))
            if k >= 2:
                e, lab = _rows[n - 1][k - 1]
                cands.append((e, f"[{n - 1},{k - 1}] ({lab}), shortening"))
                e, lab = row[k - 1]
                cands.append((e, f"[{n},{k - 1}] ({lab}), subcode"))
            value = min(c[0] for c in cands)
            label = next(c[1] for c in cands if c[0] == value)
            if value < 1:  # pragma: no cover - would mean a bound below a real code
                raise AssertionError(f"bound table broken at [{n},{k}]")
            row.append((value, _short_label(label)))
        _rows.append(row)
        _rows_memo().put(str(n), [list(c) for c in row])
    return _rows


def _short_label(label: str) -> str:
    # Nested labels would grow without limit; keep the originating bound and the last step.
    if label.count("(") > 1:
        inner = label[label.find("(") + 1:]
        origin = inner.split(" at ")[0].split(" (")[0].split(",")[0].strip("()")
        last = label.rsplit(", ", 1)[-1]
        return f"{origin}, then neighbour relations ({last} last)"
    return label


@memo(65536)
def _best(n: int, k: int) -> UpperBound:
    if n > LP_LENGTH_LIMIT:
        # Formula bounds at the point only (see skipped_bounds): fast for any n.
        ind = individual(n, k)
        value = min(ind.values())
        return UpperBound(value, next(nm for nm, v in ind.items() if v == value))
    table_d, table_by = _extend_table(n)[n][k]
    cands = [(table_d, table_by)]
    ind = individual(n, k)
    # Prefer crediting a single named bound when it gives the same value.
    for name, v in ind.items():
        cands.insert(0 if v <= table_d else len(cands), (v, name))
    # Zero coordinate and parity with the LP one length further (see _extend_table):
    # D(n, k) <= 2 floor(lp(n+1, k) / 2).
    if n + 1 <= LP_LENGTH_LIMIT:
        e = lp_value(n + 1, k)
        cands.append((2 * (e // 2), f"lp at [{n + 1},{k}], parity"))
    value = min(c[0] for c in cands)
    named = [name for name in ind if ind[name] == value]
    if named:
        return UpperBound(value, named[0])
    return UpperBound(value, next(c[1] for c in cands if c[0] == value))


def best_upper(n: int, k: int) -> UpperBound:
    """The best upper bound on ``d`` for a binary linear ``[n, k]`` code, with its source.

    The minimum of the individual bounds at ``(n, k)`` and of a table over all smaller
    lengths in which the cheap bounds (Singleton, Hamming, Plotkin, Griesmer) are
    propagated by theorems relating neighbouring parameters:

    * puncturing: ``D(n, k) <= D(n - 1, k) + 1``;
    * shortening: ``D(n, k) <= D(n - 1, k - 1)``;
    * subcodes: ``D(n, k) <= D(n, k - 1)``;
    * zero coordinate and parity: ``D(n, k) <= 2 floor(e / 2)`` for any upper bound
      ``e`` on ``D(n + 1, k)`` (an ``[n, k, d]`` code with odd ``d`` extends to
      ``[n + 1, k, d + 1]``).

    The table's cells ``n <= TABLE_LENGTH + 1`` start from the shipped certified LP
    values (:func:`shipped_lp_bounds`, solved once by ``scripts/build_lp_bounds.py``) and
    the shipped exhaustive non-existence results as well. The Elias and LP bounds are
    also applied at ``(n, k)``, and the LP at ``(n + 1, k)`` through the last rule
    (solving the LP for every smaller pair in each process would be far too slow); the
    table is computed once and cached.

    Parameters
    ----------
    n, k : int
        Length and dimension, ``1 <= k <= n``.

    Returns
    -------
    UpperBound
        ``d`` and ``by``: a bound name from :func:`upper_names` when one bound
        gives the value by itself, otherwise a description of the chain of relations.

    Raises
    ------
    ParameterError

    References
    ----------
    .. [1] MacWilliams & Sloane 1977, ch. 1 §9 (puncturing, shortening, extending).
    .. [2] Huffman & Pless 2003, §1.5.

    Examples
    --------
    >>> best_upper(24, 12)
    UpperBound(d=8, by='griesmer')
    """
    n, k = check_nk(n, k)
    return _best(n, k)


@memo(4096)
def _least_length(k: int, d: int) -> LengthBound:
    # Shortest n with best_upper(n, k) >= d. Start at the Singleton length and scan up;
    # the answer n* has best_upper(n* - 1, k) < d, a proof that no [n* - 1, k, d] code
    # exists, and then no shorter one either (append zero coordinates).
    n = k + d - 1
    # Lengths the Hamming bound alone rules out are ruled out by _best too (it is one of
    # the bounds _best takes the least of, and monotone in d): skip them at the cost of a
    # ball volume each (least_length(231, 7): 2 calls of _best instead of 17).
    while n <= LP_LENGTH_LIMIT and kmax_hamming(n, d) < k:
        n += 1
    while n <= LP_LENGTH_LIMIT and _best(n, k).d < d:
        n += 1
    if n > LP_LENGTH_LIMIT and _best(n, k).d < d:
        # Beyond the table: bisection between a ruled-out length and k d, where k
        # disjoint repetition blocks of length d give a code. Sound for the same reason:
        # the answer n* has n* - 1 ruled out, hence every shorter length too.
        lo, hi = n, k * d
        while hi - lo > 1:
            mid = (lo + hi) // 2
            if _best(mid, k).d >= d:
                hi = mid
            else:
                lo = mid
        n = hi
    if n == k + d - 1 and n == max(k, d):
        return LengthBound(n, "trivial (k <= n and d <= n)")
    if n == k + d - 1:
        return LengthBound(n, "singleton")
    return LengthBound(n, _best(n - 1, k).by)


def least_length(k: int, d: int) -> LengthBound:
    """The least ``n`` that the upper bounds allow for a binary linear code with ``(k, d)``.

    Parameters
    ----------
    k, d : int
        Dimension and minimum distance, both at least 1.

    Returns
    -------
    LengthBound
        ``n`` (no binary linear ``[n - 1, k, d]`` code exists) and ``by``, the bound that
        rules out ``n - 1`` (as in :func:`best_upper`).

    Raises
    ------
    ParameterError

    Examples
    --------
    >>> least_length(12, 8).n, least_length(5, 8).n
    (24, 16)
    """
    k, d = check_kd(k, d)
    return _least_length(k, d)


@memo(4096)
def _max_dimension(n: int, d: int) -> DimensionBound:
    # Greatest k with best_upper(n, k) >= d, by bisection: sound because an impossible
    # [n, k, d] rules out every larger k (a code of dimension k' > k has subcodes of
    # dimension k with distance >= d). k = 1 is always possible (repetition code, d <= n).
    lo, hi = 1, n + 1
    while hi - lo > 1:
        mid = (lo + hi) // 2
        if _best(n, mid).d >= d:
            lo = mid
        else:
            hi = mid
    by = "trivial (k <= n)" if lo == n else _best(n, lo + 1).by
    return DimensionBound(lo, by)


def max_dimension(n: int, d: int) -> DimensionBound:
    """The greatest ``k`` that the upper bounds allow for a binary linear ``[n, k, d]``.

    Always at least 1 (the repetition code ``[n, 1, n]`` has ``d >= `` any ``d <= n``).

    Parameters
    ----------
    n, d : int
        Length and minimum distance, ``1 <= d <= n``.

    Returns
    -------
    DimensionBound
        ``k`` and ``by``, the bound that rules out ``k + 1``.

    Raises
    ------
    ParameterError

    Examples
    --------
    >>> max_dimension(24, 8).k, max_dimension(23, 7).k
    (12, 12)
    """
    n, d = check_nd(n, d)
    return _max_dimension(n, d)
