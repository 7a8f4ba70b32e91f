"""New codes from old: puncture, shorten, extend, augment, expurgate, lengthen,
appending zero coordinates, direct sum, Plotkin sum ``(u | u+v)``, Construction X,
Construction Y1, product, dual.

Every function returns a new :class:`~gf2codes.code.Code` whose ``recipe`` is the
input's recipe plus one step (``{"op": "shorten", "coords": [0, 1]}``); a binary
operation stores the other operand's recipe inside its step. A code without a
recipe (read from a plain matrix file) starts with a ``{"family": "matrix", ...}``
step holding its generator rows, so every recipe can be replayed by
:func:`rebuild`.

``d_lower`` and ``d_upper`` of the result are what the rule proves from the
inputs' ``d_lower`` / ``d_upper`` (``None`` when an input bound the rule needs is
unknown). Coordinates are 0-based and refer to the code the operation is applied
to.

Operation lists for the command line (:func:`parse_operations`) are words, some
followed by one argument: ``shorten 0-55``, ``puncture 5,7,10-12``, ``extend``,
``augment``, ``expurgate``, ``lengthen``, ``dual``. A coordinate list is a
comma-separated list of coordinates ``c`` and inclusive ranges ``a-b``.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting
   Codes*, North-Holland, 1977: ch. 1 section 9 (puncturing, extending,
   shortening, augmenting, expurgating, lengthening), ch. 2 section 9 (the
   ``|u|u+v|`` construction), ch. 18 section 2 (direct product), ch. 18
   section 7 (Construction X), ch. 18 section 7.1 (Construction Y1; section number
   from memory).
.. [2] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*,
   Cambridge University Press, 2003, sections 1.5 (puncturing, extending,
   shortening), 2.9 (``(u | u+v)``, direct sum, product).
"""

from __future__ import annotations

import re
from collections.abc import Callable, Iterable, Mapping, Sequence
from typing import Any

import numpy as np

from . import linalg
from .code import Code
from .exceptions import ParameterError, ParseError, check_int

__all__ = [
    "dual",
    "puncture",
    "shorten",
    "extend",
    "augment",
    "expurgate",
    "lengthen",
    "direct_sum",
    "plotkin_sum",
    "juxtapose",
    "append_zeros",
    "construction_x",
    "construction_y1",
    "product",
    "recipe_of",
    "rebuild",
    "parse_coordinates",
    "parse_operations",
    "apply_operations",
    "UNARY_OPERATIONS",
]

#: Codes with more generator bits than this are not embedded in a recipe.
_MAX_EMBEDDED_BITS = 1 << 22


# ----------------------------------------------------------------- helpers
def recipe_of(code: Code) -> list[dict[str, Any]]:
    """The recipe of ``code``, or a ``matrix`` step with its generator rows if it has none.

    >>> recipe_of(Code([[1, 1, 0]]))
    [{'family': 'matrix', 'n': 3, 'generator': ['110']}]
    """
    if code.recipe:
        return [dict(s) for s in code.recipe]
    if code.n * code.k > _MAX_EMBEDDED_BITS:
        return [{"family": "matrix", "n": code.n, "k": code.k, "generator": None}]
    return [{"family": "matrix", "n": code.n,
             "generator": [linalg.bit_string(r) for r in code.rref_generator]}]


def _name(code: Code, what: str) -> str | None:
    return f"{code.name}, {what}" if code.name else None


def _result(G: np.ndarray, code: Code, step: dict[str, Any], what: str,
            lo: int | None, hi: int | None) -> Code:
    if lo is not None and hi is not None and lo > hi:  # pragma: no cover - a rule is wrong
        raise AssertionError(f"derivation {step['op']} gives d_lower {lo} > d_upper {hi}")
    if lo is not None:
        lo = max(lo, 1)
    try:
        return Code(G, name=_name(code, what), recipe=recipe_of(code) + [step],
                    d_lower=lo, d_upper=hi)
    except ParameterError:
        raise ParameterError(f"The {step['op']} operation leaves only the zero word.") from None


def _coords(code: Code, coords: Iterable[int] | int | str, op: str) -> list[int]:
    if isinstance(coords, str):
        coords = parse_coordinates(coords)
    elif isinstance(coords, (int, np.integer)):
        coords = [int(coords)]
    out: list[int] = []
    seen: set[int] = set()
    for c in coords:
        if isinstance(c, bool) or not isinstance(c, (int, np.integer)):
            raise ParameterError(f"Argument 'coords' must hold integers, not {c!r}.")
        c = int(c)
        if not 0 <= c < code.n:
            raise ParameterError(
                f"Argument 'coords' must hold coordinates from 0 to {code.n - 1} "
                f"(the length is {code.n}), not {c}."
            )
        if c in seen:
            raise ParameterError(f"Argument 'coords' lists coordinate {c} twice.")
        seen.add(c)
        out.append(c)
    if not out:
        raise ParameterError("Argument 'coords' must hold at least one coordinate.")
    if len(out) >= code.n:
        raise ParameterError(
            f"Cannot {op} all {code.n} coordinates; give at most {code.n - 1}."
        )
    return sorted(out)


def _min_known(*values: int | None) -> int | None:
    vals = [v for v in values if v is not None]
    return min(vals) if vals else None


# ----------------------------------------------------------------- unary ops
def dual(code: Code) -> Code:
    """The dual code ``C^⊥``. Nothing is claimed about its distance.

    >>> from gf2codes.families import hamming
    >>> dual(hamming(3)).k
    3
    """
    if code.k == code.n:
        raise ParameterError(f"The dual of the full space GF(2)^{code.n} is the zero code.")
    return _result(code.H, code, {"op": "dual"}, "dual", None, None)


def puncture(code: Code, coords: Iterable[int] | int | str) -> Code:
    """Delete the coordinates ``coords`` from every codeword.

    With ``t`` coordinates deleted, ``d' >= d - t``. The dimension drops when a
    nonzero codeword lies inside ``coords``; when it does not, the image of a
    minimum-weight word survives and ``d' <= d``.

    Raises
    ------
    ParameterError
        For coordinates outside ``0 .. n-1``, duplicates, all coordinates, or a
        result that is only the zero word.

    >>> from gf2codes.families import extended_hamming
    >>> C = puncture(extended_hamming(3), [7]); (C.n, C.k, C.d_lower, C.d_upper)
    (7, 4, 3, 4)
    """
    cs = _coords(code, coords, "puncture")
    keep = np.setdiff1d(np.arange(code.n), cs)
    G = code.rref_generator[:, keep]
    injective = linalg.rank(G) == code.k
    lo = None if code.d_lower is None else code.d_lower - len(cs)
    hi = code.d_upper if injective else None
    return _result(G, code, {"op": "puncture", "coords": cs},
                   f"punctured at {len(cs)}", lo, hi)


def shorten(code: Code, coords: Iterable[int] | int | str) -> Code:
    """The codewords that are zero on ``coords``, with those coordinates deleted.

    ``k' = k - rank(G restricted to coords)`` exactly (``k`` drops by one for
    each independent constraint; coordinates where every codeword is zero cost
    nothing), and ``d' >= d``.

    Raises
    ------
    ParameterError
        For coordinates outside ``0 .. n-1``, duplicates, all coordinates, or a
        result that is only the zero word.

    >>> from gf2codes.families import extended_hamming
    >>> C = shorten(extended_hamming(7), "0-55"); (C.n, C.k, C.d_lower)
    (72, 64, 4)
    """
    cs = _coords(code, coords, "shorten")
    G = code.rref_generator
    # codewords zero on cs: messages in the left null space of G[:, cs]
    M = linalg.null_space(np.ascontiguousarray(G[:, cs].T))
    if M.shape[0] == 0:
        raise ParameterError(
            f"Shortening at these {len(cs)} coordinates leaves only the zero word."
        )
    sub = (M.astype(np.int64) @ G.astype(np.int64)) & 1
    keep = np.setdiff1d(np.arange(code.n), cs)
    return _result(sub[:, keep].astype(np.uint8), code, {"op": "shorten", "coords": cs},
                   f"shortened at {len(cs)}", code.d_lower, None)


def extend(code: Code) -> Code:
    """Append an overall parity bit.

    The extended code is even, so its distance is ``d`` rounded up to even:
    ``d' = d + 1`` for odd ``d`` and ``d`` otherwise; both bounds are rounded up
    to even.

    >>> from gf2codes.families import hamming
    >>> C = extend(hamming(3)); (C.n, C.k, C.d_lower, C.d_upper)
    (8, 4, 4, 4)
    """
    G = code.G
    Gx = np.hstack([G, (G.sum(axis=1) % 2).astype(np.uint8)[:, None]])
    lo = None if code.d_lower is None else code.d_lower + code.d_lower % 2
    hi = None if code.d_upper is None else code.d_upper + code.d_upper % 2
    return _result(Gx, code, {"op": "extend"}, "extended", lo, hi)


def _all_ones_in(code: Code) -> bool:
    return bool(code.contains(np.ones(code.n, dtype=np.uint8)))


def augment(code: Code) -> Code:
    """Add the all-ones word: ``C ∪ (1 + C)``, dimension ``k + 1``.

    ``d' = min(d, n - w_max)`` with ``w_max`` the largest weight in ``C``;
    ``w_max`` is not known, so only ``d' <= d`` is claimed.

    Raises
    ------
    ParameterError
        If the all-ones word is already in the code.
    """
    if _all_ones_in(code):
        raise ParameterError("The code already contains the all-ones word; augmenting "
                             "would not change it.")
    G = np.vstack([code.G, np.ones((1, code.n), dtype=np.uint8)])
    return _result(G, code, {"op": "augment"}, "augmented", None, code.d_upper)


def expurgate(code: Code) -> Code:
    """The even-weight subcode, dimension ``k - 1``; ``d' >= d`` and ``d'`` is even.

    Raises
    ------
    ParameterError
        If every codeword already has even weight.

    >>> from gf2codes.families import hamming
    >>> C = expurgate(hamming(3)); (C.n, C.k, C.d_lower)
    (7, 3, 4)
    """
    if code.is_even:
        raise ParameterError("Every codeword already has even weight; expurgating would "
                             "not change the code.")
    G = code.rref_generator.astype(np.int64)
    odd = G.sum(axis=1) % 2 == 1
    first = int(np.flatnonzero(odd)[0])
    rows = [G[i] ^ (G[first] if odd[i] else 0) for i in range(G.shape[0]) if i != first]
    lo = None if code.d_lower is None else code.d_lower + code.d_lower % 2
    return _result(np.array(rows, dtype=np.uint8).reshape(-1, code.n), code,
                   {"op": "expurgate"}, "expurgated", lo, None)


def lengthen(code: Code) -> Code:
    """Augment by the all-ones word, then extend: ``[n+1, k+1]`` (MacWilliams & Sloane ch. 1 §9).

    Only ``d' <= d`` rounded up to even is claimed.

    Raises
    ------
    ParameterError
        If the all-ones word is already in the code.
    """
    a = augment(code)
    e = extend(a)
    return e.with_info(recipe=recipe_of(code) + [{"op": "lengthen"}],
                       name=_name(code, "lengthened"))


# ---------------------------------------------------------------- binary ops
def direct_sum(a: Code, b: Code) -> Code:
    """``{(x | y) : x in A, y in B}``: ``[n1 + n2, k1 + k2, min(d1, d2)]``.

    >>> from gf2codes.families import repetition
    >>> C = direct_sum(repetition(3), repetition(2)); (C.n, C.k, C.d_lower, C.d_upper)
    (5, 2, 2, 2)
    """
    G = np.zeros((a.k + b.k, a.n + b.n), dtype=np.uint8)
    G[: a.k, : a.n] = a.G
    G[a.k:, a.n:] = b.G
    lo = min(a.d_lower, b.d_lower) if a.d_lower is not None and b.d_lower is not None else None
    return _result(G, a, {"op": "direct-sum", "other": recipe_of(b)}, "direct sum",
                   lo, _min_known(a.d_upper, b.d_upper))


def plotkin_sum(u_code: Code, v_code: Code) -> Code:
    """The Plotkin sum, the codewords ``(u | u+v)``: ``[2n, k1 + k2, min(2 d1, d2)]`` (exactly).

    Raises
    ------
    ParameterError
        If the two codes have different lengths.

    >>> from gf2codes.families import even_weight, repetition
    >>> C = plotkin_sum(even_weight(4), repetition(4)); (C.n, C.k, C.d_lower, C.d_upper)
    (8, 4, 4, 4)

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 2 section 9 (the ``|u|u+v|`` construction;
       the name Plotkin sum is that of Huffman & Pless (2003), section 2.9, from memory).
    """
    if u_code.n != v_code.n:
        raise ParameterError(
            f"Argument 'v_code' must have the length of 'u_code', {u_code.n}, not {v_code.n}."
        )
    n = u_code.n
    G = np.zeros((u_code.k + v_code.k, 2 * n), dtype=np.uint8)
    G[: u_code.k, :n] = u_code.G
    G[: u_code.k, n:] = u_code.G
    G[u_code.k:, n:] = v_code.G
    lo = (min(2 * u_code.d_lower, v_code.d_lower)
          if u_code.d_lower is not None and v_code.d_lower is not None else None)
    hi = _min_known(None if u_code.d_upper is None else 2 * u_code.d_upper, v_code.d_upper)
    return _result(G, u_code, {"op": "plotkin-sum", "v": recipe_of(v_code)}, "Plotkin sum",
                   lo, hi)


def juxtapose(a: Code, b: Code) -> Code:
    """Juxtaposition ``[G_a | G_b]`` of two codes of one dimension: the message ``m`` goes to
    ``(m G_a | m G_b)``, an ``[n1 + n2, k, >= d1 + d2]`` code (both halves of a nonzero
    message's codeword are nonzero).

    The rows paired are those of the two codes' reduced row echelon generators, so the
    result depends only on the two codes (and a recipe rebuilds it exactly).

    Raises
    ------
    ParameterError
        If the two codes have different dimensions.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 18 (building codes from old ones; the
       juxtaposition of generator matrices, chapter from memory).

    >>> from gf2codes.families import simplex
    >>> C = juxtapose(simplex(3), simplex(3)); (C.n, C.k, C.d_lower)
    (14, 3, 8)
    """
    if a.k != b.k:
        raise ParameterError(
            f"Argument 'b' must have the dimension of 'a', {a.k}, not {b.k}."
        )
    G = np.concatenate([a.rref_generator, b.rref_generator], axis=1)
    lo = a.d_lower + b.d_lower if a.d_lower is not None and b.d_lower is not None else None
    return _result(G, a, {"op": "juxtapose", "other": recipe_of(b)}, "juxtaposition", lo, None)


def append_zeros(code: Code, count: int = 1) -> Code:
    """Append ``count`` coordinates that are zero in every codeword: ``[n + count, k, d]``.

    The distance and both of its bounds are unchanged. The recipe gets the step
    ``{"op": "append-zeros", "count": count}``.

    >>> from gf2codes.families import hamming
    >>> C = append_zeros(hamming(3), 2); (C.n, C.k, C.d_lower, C.d_upper)
    (9, 4, 3, 3)
    """
    count = check_int("count", count, minimum=1)
    G = np.hstack([code.G, np.zeros((code.k, count), dtype=np.uint8)])
    return _result(G, code, {"op": "append-zeros", "count": count},
                   f"{count} zero coordinate{'s' if count != 1 else ''} appended",
                   code.d_lower, code.d_upper)


def construction_x(code: Code, subcode: Code, auxiliary: Code) -> Code:
    """Construction X: ``C1 ⊇ C2`` and an auxiliary ``[n_a, k1 - k2, d_a]`` code give
    ``[n + n_a, k1, >= min(d2, d1 + d_a)]``.

    The words are ``(c2 + sum m_i r_i | sum m_i a_i)``, with ``r_i`` the rows of
    the reduced echelon basis of ``C1`` that are not in the span of ``C2`` and the
    rows before them, and ``a_i`` the reduced echelon rows of the auxiliary code.
    The result depends only on the three subspaces. ``d' <= d2`` (a word of
    ``C2`` with a zero tail). The rule holds whether or not ``d2 > d1``; the
    construction pays off when it does.

    Raises
    ------
    ParameterError
        If the lengths differ, ``subcode`` is not contained in ``code``, or the
        auxiliary dimension is not ``k1 - k2``.

    >>> from gf2codes.families import hamming, repetition
    >>> from gf2codes.derive import expurgate
    >>> H = hamming(3)
    >>> C = construction_x(H, expurgate(H), repetition(1)); (C.n, C.k, C.d_lower)
    (8, 4, 4)
    """
    if subcode.n != code.n:
        raise ParameterError(
            f"Argument 'subcode' must have the length of 'code', {code.n}, not {subcode.n}."
        )
    if not bool(np.all(code.contains(subcode.G))):
        raise ParameterError("Argument 'subcode' must be contained in 'code', and it is not.")
    r = code.k - subcode.k
    if r == 0:
        raise ParameterError("Argument 'subcode' equals 'code'; Construction X needs "
                             "a proper subcode.")
    if auxiliary.k != r:
        raise ParameterError(
            f"Argument 'auxiliary' must have dimension k1 - k2 = {r}, not {auxiliary.k}."
        )
    reps: list[np.ndarray] = []
    span = subcode.rref_generator
    for row in code.rref_generator:
        trial = np.vstack([span, row[None, :]])
        if linalg.rank(trial) > span.shape[0]:
            reps.append(row)
            span = trial
    G = np.zeros((code.k, code.n + auxiliary.n), dtype=np.uint8)
    G[: subcode.k, : code.n] = subcode.rref_generator
    G[subcode.k:, : code.n] = np.array(reps)
    G[subcode.k:, code.n:] = auxiliary.rref_generator
    lo = (min(subcode.d_lower, code.d_lower + auxiliary.d_lower)
          if subcode.d_lower is not None and code.d_lower is not None
          and auxiliary.d_lower is not None else None)
    step = {"op": "construction-x", "subcode": recipe_of(subcode),
            "auxiliary": recipe_of(auxiliary)}
    return _result(G, code, step, "construction X", lo, subcode.d_upper)


def construction_y1(code: Code, dual_word: Iterable[int] | np.ndarray) -> Code:
    """Construction Y1: shorten ``code`` on the support of a word of its dual.

    If ``h`` is a word of weight ``w`` of the dual of an ``[n, k, d]`` code, every codeword
    has even weight on the support ``S`` of ``h``, so the projection onto ``S`` has rank at
    most ``w - 1`` and the codewords that vanish on ``S`` form an
    ``[n - w, >= k - w + 1, >= d]`` code (the dimension is exactly ``k - w + 1`` when no
    other dual word lies inside ``S``, for example when ``h`` has minimum weight). Plain
    shortening on ``w`` independent coordinates loses one dimension more.

    The recipe step is ``{"op": "construction-y1", "coords": S}``; :func:`rebuild` checks
    again that ``S`` is the support of a dual word.

    Parameters
    ----------
    code : Code
        The code to shorten.
    dual_word : array_like of 0/1
        A nonzero word of length ``n`` of the dual of ``code``, not the all-ones word.

    Returns
    -------
    Code
        The shortened code, ``d_lower`` that of ``code``.

    Raises
    ------
    ParameterError
        If ``dual_word`` has the wrong length, is zero or all ones, or is not in the dual.

    References
    ----------
    .. [1] MacWilliams & Sloane (1977), ch. 18 section 7.1 (Construction Y1; the section
       number from memory).

    >>> from gf2codes.families import extended_hamming
    >>> C = extended_hamming(4)               # [16, 11, 4]; its dual is RM(1, 4)
    >>> h = C.dual().rref_generator[-1]       # a dual word of weight 8
    >>> Y = construction_y1(C, h); (Y.n, Y.k, Y.d_lower)
    (8, 4, 4)
    """
    h = np.asarray(dual_word).astype(np.uint8).reshape(-1)
    if h.shape[0] != code.n or not np.isin(h, (0, 1)).all():
        raise ParameterError(
            f"Argument 'dual_word' must be a 0/1 word of length {code.n}, "
            f"not one of length {h.shape[0]}."
        )
    support = np.flatnonzero(h).tolist()
    if not 1 <= len(support) < code.n:
        raise ParameterError(
            f"Argument 'dual_word' must have weight from 1 to {code.n - 1}, "
            f"not {len(support)}."
        )
    if bool(((code.G.astype(np.int64) @ h.astype(np.int64)) & 1).any()):
        raise ParameterError("Argument 'dual_word' must be a word of the dual code, and "
                             "it is not.")
    short = shorten(code, support)
    return _result(short.G, code, {"op": "construction-y1", "coords": support},
                   f"construction Y1 on {len(support)}", code.d_lower, None)


def product(a: Code, b: Code) -> Code:
    """The direct (tensor) product: ``[n1 n2, k1 k2, d1 d2]``.

    Coordinate ``i n2 + j`` is entry ``(i, j)`` of the ``n1 x n2`` array whose
    columns lie in ``A`` and rows in ``B``.

    >>> from gf2codes.families import even_weight
    >>> C = product(even_weight(3), even_weight(3)); (C.n, C.k, C.d_lower, C.d_upper)
    (9, 4, 4, 4)
    """
    G = np.kron(a.G.astype(np.int64), b.G.astype(np.int64)).astype(np.uint8)
    lo = a.d_lower * b.d_lower if a.d_lower is not None and b.d_lower is not None else None
    hi = a.d_upper * b.d_upper if a.d_upper is not None and b.d_upper is not None else None
    return _result(G, a, {"op": "product", "other": recipe_of(b)}, "product", lo, hi)


# --------------------------------------------------------------- replaying
def _rebuild_family(step: Mapping[str, Any]) -> Code:
    from .families import FAMILIES

    name = step.get("family")
    if name not in FAMILIES:
        raise ParseError(
            f"<recipe>: unknown family {name!r}; known: {', '.join(FAMILIES)}."
        )
    if name == "matrix" and step.get("generator") is None:
        raise ParseError("<recipe>: the recipe starts from a matrix too large to have been "
                         "recorded in it.")
    kwargs = {k: v for k, v in step.items() if k != "family"}
    try:
        return FAMILIES[name].build(**kwargs)
    except TypeError as exc:
        raise ParseError(f"<recipe>: bad arguments for family {name!r}: {exc}.") from None


def rebuild(recipe: Sequence[Mapping[str, Any]]) -> Code:
    """Reconstruct a code from its recipe: a family step, then operation steps.

    >>> from gf2codes.families import extended_hamming
    >>> C = shorten(extend(puncture(extended_hamming(4), [3])), [0, 5])
    >>> rebuild(C.recipe) == C
    True

    Raises
    ------
    ParseError
        If a step is not understood.
    """
    steps = list(recipe)
    if not steps or not isinstance(steps[0], Mapping) or "family" not in steps[0]:
        raise ParseError("<recipe>: a recipe must start with a {'family': ...} step.")
    code = _rebuild_family(steps[0])
    for i, step in enumerate(steps[1:], start=1):
        if not isinstance(step, Mapping) or "op" not in step:
            raise ParseError(f"<recipe>: step {i} must be an object with an 'op' key.")
        op = step["op"]
        if op in ("puncture", "shorten"):
            code = UNARY_OPERATIONS[op](code, list(step.get("coords", [])))
        elif op in UNARY_OPERATIONS:
            code = UNARY_OPERATIONS[op](code)
        elif op == "direct-sum":
            code = direct_sum(code, rebuild(step["other"]))
        elif op == "plotkin-sum":
            code = plotkin_sum(code, rebuild(step["v"]))
        elif op == "juxtapose":
            code = juxtapose(code, rebuild(step["other"]))
        elif op == "append-zeros":
            code = append_zeros(code, step.get("count", 1))
        elif op == "product":
            code = product(code, rebuild(step["other"]))
        elif op == "construction-x":
            code = construction_x(code, rebuild(step["subcode"]), rebuild(step["auxiliary"]))
        elif op == "construction-y1":
            cs = list(step.get("coords", []))
            if not all(isinstance(c, int) and 0 <= c < code.n for c in cs):
                raise ParseError(f"<recipe>: step {i} (construction-y1) has coordinates "
                                 f"outside 0..{code.n - 1}.")
            word = np.zeros(code.n, dtype=np.uint8)
            word[cs] = 1
            code = construction_y1(code, word)
        else:
            raise ParseError(f"<recipe>: step {i} has unknown operation {op!r}.")
    return code


# ------------------------------------------------------- command-line syntax
#: Operation name -> function of one code (puncture and shorten take coordinates).
UNARY_OPERATIONS: dict[str, Callable[..., Code]] = {
    "dual": dual,
    "puncture": puncture,
    "shorten": shorten,
    "extend": extend,
    "augment": augment,
    "expurgate": expurgate,
    "lengthen": lengthen,
}
_TAKES_COORDS = {"puncture", "shorten"}
_ITEM = re.compile(r"^(\d+)(?:-(\d+))?$")


def parse_coordinates(text: str, n: int | None = None) -> list[int]:
    """Parse ``"0-7,12,20-21"`` into ``[0, 1, ..., 7, 12, 20, 21]`` (order kept).

    With the length ``n`` given, every coordinate is checked to lie below ``n``
    before any range is expanded (so ``0-999999999999`` is refused at once).

    >>> parse_coordinates("0-3,7")
    [0, 1, 2, 3, 7]
    """
    limit = (1 << 24) if n is None else n
    out: list[int] = []
    for item in str(text).replace(" ", "").split(","):
        m = _ITEM.match(item)
        if not m:
            raise ParseError(
                f"<coordinates>: cannot read {item!r} in {text!r}; write coordinates "
                "like 5 or ranges like 0-7, separated by commas."
            )
        lo = int(m.group(1))
        hi = int(m.group(2)) if m.group(2) else lo
        if hi < lo:
            raise ParseError(f"<coordinates>: the range {item!r} must be increasing.")
        if hi >= limit:
            where = (f"the length is {n}, so coordinates run from 0 to {n - 1}"
                     if n is not None else f"coordinates must be below {limit:,}")
            raise ParseError(f"<coordinates>: {item!r} is out of range; {where}.")
        if len(out) + hi - lo + 1 > limit:
            raise ParseError(f"<coordinates>: {text!r} lists more than {limit:,} "
                             "coordinates.")
        out.extend(range(lo, hi + 1))
    return out


def parse_operations(tokens: Sequence[str], n: int | None = None) -> list[dict[str, Any]]:
    """Parse command-line words into recipe steps.

    ``puncture`` and ``shorten`` take the next word as a coordinate list; the
    other operations take no argument. ``n``, the length of the code the first
    operation applies to, bounds the coordinates of that first list (later lists
    are checked when applied, since the length changes on the way).

    >>> parse_operations(["shorten", "0-2", "puncture", "5,7", "extend"])
    [{'op': 'shorten', 'coords': [0, 1, 2]}, {'op': 'puncture', 'coords': [5, 7]}, \
{'op': 'extend'}]

    Raises
    ------
    ParseError
        For an unknown operation or a missing or malformed coordinate list.
    """
    steps: list[dict[str, Any]] = []
    i = 0
    tokens = list(tokens)
    while i < len(tokens):
        word = tokens[i].lower()
        if word not in UNARY_OPERATIONS:
            raise ParseError(
                f"<operations>: unknown operation {tokens[i]!r}; choose from "
                f"{', '.join(UNARY_OPERATIONS)}."
            )
        if word in _TAKES_COORDS:
            if i + 1 >= len(tokens):
                raise ParseError(
                    f"<operations>: {word!r} needs a coordinate list such as 0-7 or 3,5."
                )
            steps.append({"op": word, "coords": parse_coordinates(
                tokens[i + 1], n if not steps else None)})
            i += 2
        else:
            steps.append({"op": word})
            i += 1
    if not steps:
        raise ParseError("<operations>: give at least one operation.")
    return steps


def apply_operations(code: Code, steps: Iterable[Mapping[str, Any]]) -> Code:
    """Apply unary operation steps (from :func:`parse_operations`) in order.

    >>> from gf2codes.families import extended_hamming
    >>> C = apply_operations(extended_hamming(5), parse_operations(["shorten", "0-9"]))
    >>> (C.n, C.k, C.d_lower)
    (22, 16, 4)
    """
    for step in steps:
        op = step["op"]
        if op in _TAKES_COORDS:
            code = UNARY_OPERATIONS[op](code, step["coords"])
        else:
            code = UNARY_OPERATIONS[op](code)
    return code
