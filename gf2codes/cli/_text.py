"""Text notations shared by the sub-commands: weight counts, the proved interval of d,
a matrix block that can be pasted back in, and the (k, d) grid of shortest lengths.

Everything here is plain text, written as it is by the callers (``console.plain`` of
:mod:`gf2codes.cli._common`, or :func:`sys.stdout.write`), so nothing is elided or
wrapped when the output goes to a pipe or a narrow terminal.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping, Sequence
from typing import TYPE_CHECKING

if TYPE_CHECKING:  # pragma: no cover
    from ..code import Code

__all__ = ["weight_text", "triple_text", "matrix_block", "length_grid", "describe_distance"]


def weight_text(counts: Sequence[int], letter: str = "A") -> str:
    """Nonzero counts in the notation ``A0=1 A8=759 A12=2576`` (``A_i`` codewords of
    weight ``i``; another ``letter`` for other counts by weight, e.g. ``L`` for coset
    leaders).

    >>> weight_text([1, 0, 0, 7, 7, 0, 0, 1])
    'A0=1 A3=7 A4=7 A7=1'
    >>> weight_text([1, 7], letter="L")
    'L0=1 L1=7'
    """
    items = [f"{letter}{i}={a}" for i, a in enumerate(counts) if a]
    if len(items) > _MAX_SHOWN:  # a [4095,4083] code has 4000: rich took 20 s to wrap them
        half = _MAX_SHOWN // 2
        items = items[:half] + [f"... ({len(items) - 2 * half} more; --json lists all) ..."] \
            + items[-half:]
    return " ".join(items)


#: :func:`weight_text` shows at most this many counts (the first and last halves).
_MAX_SHOWN = 48


def triple_text(n: int, k: int, d_lower: int, d_upper: int | None) -> str:
    """``[n, k, d]`` when d is proved, else ``[n, k]`` and the proved interval beside it.

    >>> triple_text(24, 12, 8, 8)
    '[24, 12, 8]'
    >>> triple_text(127, 64, 14, 21)
    '[127, 64], 14 ≤ d ≤ 21'
    >>> triple_text(20, 10, 5, None)
    '[20, 10], d ≥ 5'
    """
    if d_upper is not None and d_lower == d_upper:
        return f"[{n}, {k}, {d_lower}]"
    if d_upper is None:
        return f"[{n}, {k}], d ≥ {d_lower}"
    return f"[{n}, {k}], {d_lower} ≤ d ≤ {d_upper}"


def matrix_block(rows: Iterable[str], comment: str) -> list[str]:
    """A gf2codes text matrix file: ``# comment`` then one 0/1 row per line.

    The lines can be saved as they are and read back by ``gf2codes verify``.

    >>> matrix_block(["101", "011"], "generator matrix, 2 x 3")
    ['# generator matrix, 2 x 3', '101', '011']
    """
    return [f"# {comment}", *rows]


def length_grid(cells: Mapping[tuple[int, int], tuple[int, int | None]],
                dimensions: Sequence[int], distances: Sequence[int]) -> list[str]:
    """The (k, d) grid of shortest lengths as text lines: one row per ``k``, one column
    per ``d``, every row and column labelled (``k=``, ``d=``), no cell ever elided.

    ``cells[k, d]`` is ``(low, high)``: the bounds rule out lengths below ``low``, and a
    code of length ``high`` is known (None: none known). The cell reads ``low`` when
    ``high == low``, ``low+g`` with ``g = high - low`` otherwise, and ``low+?`` when
    ``high`` is None.

    >>> print("\\n".join(length_grid({(4, 3): (7, 7), (4, 4): (8, 8), (10, 6): (19, 20),
    ...                                (10, 3): (14, None), (4, 6): (11, 11),
    ...                                (10, 4): (15, 15)}, [4, 10], [3, 4, 6])))
           d=3   d=4   d=6
    k=4      7     8    11
    k=10  14+?    15  19+1
    """
    def text(k: int, d: int) -> str:
        low, high = cells[k, d]
        if high is None:
            return f"{low}+?"
        return str(low) if high == low else f"{low}+{high - low}"

    body = {(k, d): text(k, d) for k in dimensions for d in distances}
    heads = {d: f"d={d}" for d in distances}
    width = max([len(t) for t in body.values()] + [len(h) for h in heads.values()]) + 2
    label = max(len(f"k={k}") for k in dimensions)
    lines = [" " * label + "".join(f"{heads[d]:>{width}}" for d in distances)]
    for k in dimensions:
        lines.append(f"{'k=' + str(k):<{label}}" + "".join(f"{body[k, d]:>{width}}"
                                                          for d in distances))
    return lines


def describe_distance(code: Code) -> str:
    """What the construction proves about d, in words; never more than it proves."""
    lo, hi = code.d_lower, code.d_upper
    if lo is not None and lo == hi:
        return f"d = {lo} (lower and upper bounds of the construction agree)"
    if lo is not None and hi is not None:
        return f"{lo} ≤ d ≤ {hi} (bounds from the construction; d not computed)"
    if lo is not None:
        return f"d ≥ {lo} (lower bound from the construction; d not computed)"
    if hi is not None:
        return f"d ≤ {hi} (upper bound from the construction; d not computed)"
    return "d unknown (not computed)"
