"""Permutation equivalence of binary linear codes: code facts, invariants, the exact test.

Pure mathematics on :class:`~gf2codes.code.Code` (no SQL, no catalog): the catalog
stores :func:`code_facts` beside each entry and merges equivalent codes with
:func:`are_equivalent`, and ``gf2codes equivalent`` calls it directly.

Two codes are (permutation-)equivalent when a permutation of coordinates maps one onto
the other [4]_. The invariant (:func:`equivalence_invariant`) combines the weight
distribution with a Weisfeiler-Lehman hash [2]_ of the bipartite graph whose nodes are
the coordinates and the *spanning light words* -- all nonzero codewords of weight at
most ``w*``, where ``w*`` is the least weight such that those words span the code. That
set is defined by the code alone, so a permutation of coordinates maps it onto the set
of the permuted code, and since it spans, a graph isomorphism that maps coordinates to
coordinates gives a permutation mapping one code onto the other: the exact test
(:func:`are_equivalent`) is a labelled graph isomorphism test (in the spirit of VF2++
[3]_: individualisation and colour refinement), followed by a check that the
permutation found really maps the code. The graph is built on the side of smaller
dimension, the code or its dual (a permutation maps ``C`` to ``C'`` exactly when it
maps the duals), so that every code of length at most 44 can be enumerated. Codes whose
smaller side has dimension above 20, or more than :data:`MAX_GRAPH_WORDS` spanning light
words, get a coarse invariant and are merged only when they are the same subspace: a
missed merge stores a code twice, never wrongly joins two.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1 section 9.
.. [2] N. Shervashidze, P. Schweitzer, E. J. van Leeuwen, K. Mehlhorn and K. M.
   Borgwardt, "Weisfeiler-Lehman graph kernels", *J. Mach. Learn. Res.* 12 (2011)
   2539-2561.
.. [3] A. Jüttner and P. Madarasi, "VF2++ -- An improved subgraph isomorphism
   algorithm", *Discrete Applied Mathematics* 242 (2018) 69-81.
.. [4] W. C. Huffman and V. Pless, *Fundamentals of Error-Correcting Codes*, Cambridge
   University Press, 2003, section 1.6 (permutation equivalence).
"""

from __future__ import annotations

import hashlib
import json
import math
from collections.abc import Sequence
from dataclasses import dataclass, field
from typing import Any

import numpy as np

from . import linalg
from .code import Code
from .typing import FactsSide, Side
from .weights import macwilliams_transform, weight_distribution

__all__ = [
    "MAX_GRAPH_WORDS",
    "INVARIANT_SCHEME",
    "CodeFacts",
    "Equivalence",
    "code_facts",
    "subspace_digest",
    "equivalence_invariant",
    "are_equivalent",
    "first_difference",
]

#: Spanning light words above this count make the exact equivalence test too costly.
MAX_GRAPH_WORDS = 6000
#: Largest dimension of the smaller side (code or dual) that is enumerated.
_MAX_SIDE_DIM = 20
#: Weight distributions are computed when ``2^min(k, n-k)`` is at most this.
_MAX_WEIGHT_WORDS = 1 << 30
#: The prefix of an exact invariant (``coarse:`` starts the others).
INVARIANT_SCHEME = "wl1"


def _digest(weights: Any) -> str:
    text = json.dumps(weights, sort_keys=True, separators=(",", ":"))
    return hashlib.sha256(text.encode()).hexdigest()[:16]


@dataclass
class CodeFacts:
    """What the catalog computes about a code before storing it.

    Attributes
    ----------
    subspace : str
        Digest of ``n`` and the reduced echelon generator: equal exactly for equal codes.
    weights : list of int or None
        The weight distribution ``[A_0, ..., A_n]`` when it was affordable.
    invariant : str
        The equivalence invariant; equal for equivalent codes.
    side : {"code", "dual", "full", "coarse", "trusted"}
        ``"code"`` or ``"dual"``: which one the light-word graph was built from
        (``"full"`` for ``GF(2)^n``, ``"coarse"`` when none was built, ``"trusted"``
        when the invariant was read from a record and the graph is not built yet).
    light : numpy.ndarray or None
        The spanning light words of ``side``, packed.
    w_star : int or None
        Their largest weight.
    """

    subspace: str
    weights: list[int] | None
    invariant: str
    side: FactsSide
    light: np.ndarray | None = field(default=None, repr=False)
    w_star: int | None = None
    _graph: Any = field(default=None, repr=False)

    @property
    def d(self) -> int | None:
        """The minimum distance, read off the weight distribution (None if unknown)."""
        if self.weights is None:
            return None
        return next((i for i, a in enumerate(self.weights) if i and a), None)


def subspace_digest(code: Code) -> str:
    rows = linalg.rref(code.packed_generator, n=code.n).sorted().rows
    h = hashlib.sha256(f"{code.n}:{code.k}:".encode())
    h.update(np.ascontiguousarray(rows, dtype="<u8").tobytes())
    return h.hexdigest()[:32]


def _all_words(basis: np.ndarray) -> np.ndarray:
    words = np.zeros((1, basis.shape[1]), dtype=np.uint64)
    for row in basis:
        words = np.concatenate([words, words ^ row[None, :]])
    return words


def _light_graph(light: np.ndarray, weights: np.ndarray, n: int):
    import networkx as nx  # type: ignore[import-untyped]  # untyped third-party module

    g = nx.Graph()
    g.add_nodes_from((j, {"label": "c"}) for j in range(n))
    g.add_nodes_from((n + i, {"label": f"w{int(w)}"}) for i, w in enumerate(weights))
    rows, cols = np.nonzero(linalg.unpack(light, n))
    g.add_edges_from(zip((n + rows).tolist(), cols.tolist(), strict=True))
    return g


def code_facts(code: Code) -> CodeFacts:
    """Compute the subspace digest, weight distribution and equivalence invariant.

    >>> from gf2codes.families import hamming
    >>> f = code_facts(hamming(3)); f.weights, f.side, f.w_star
    ([1, 0, 0, 7, 7, 0, 0, 1], 'dual', 4)
    """
    subspace = subspace_digest(code)
    n, k = code.n, code.k
    if k == n:
        weights: list[int] | None = [math.comb(n, i) for i in range(n + 1)]
        return CodeFacts(subspace, weights, f"{INVARIANT_SCHEME}:full:{n}", "full")
    side_name: Side = "code" if k <= n - k else "dual"
    side = code if side_name == "code" else code.dual()
    if side.k > _MAX_SIDE_DIM:
        weights = None
        if (1 << side.k) <= _MAX_WEIGHT_WORDS:
            weights = weight_distribution(code, max_codewords=None)
        digest = "none" if weights is None else _digest(weights)
        return CodeFacts(subspace, weights, f"coarse:{n}:{k}:{digest}", "coarse")
    words = _all_words(side.packed_generator)
    wts = np.bitwise_count(words).sum(axis=1).astype(np.int64)
    side_dist = np.bincount(wts, minlength=n + 1).tolist()
    weights = side_dist if side_name == "code" else [
        int(x) for x in macwilliams_transform(side_dist, n)]
    order = np.argsort(wts, kind="stable")
    levels = sorted({int(w) for w in wts if w})
    light = w_star = None
    for w in levels:
        sel = order[(wts[order] > 0) & (wts[order] <= w)]
        if linalg.rref(words[sel], n=n).rank == side.k:
            light, w_star = np.ascontiguousarray(words[sel]), w
            break
    assert light is not None  # all nonzero words span
    wdig = _digest(weights)
    if light.shape[0] > MAX_GRAPH_WORDS:
        return CodeFacts(subspace, weights, f"coarse:{n}:{k}:{wdig}:{light.shape[0]}",
                         "coarse")
    import networkx as nx  # type: ignore[import-untyped]  # untyped third-party module

    graph = _light_graph(light, wts[sel], n)
    wl = nx.weisfeiler_lehman_graph_hash(graph, node_attr="label", iterations=3)
    inv = f"{INVARIANT_SCHEME}:{side_name}:{n}:{k}:{w_star}:{light.shape[0]}:{wdig}:{wl}"
    return CodeFacts(subspace, weights, inv, side_name, light, w_star, graph)


def equivalence_invariant(code: Code) -> str:
    """The equivalence invariant of ``code`` (equal for permutation-equivalent codes).

    >>> from gf2codes.families import hamming, cyclic
    >>> equivalence_invariant(hamming(3)) == equivalence_invariant(cyclic(7, "x^3+x+1"))
    True
    """
    return code_facts(code).invariant


@dataclass(frozen=True)
class Equivalence:
    """The answer of :func:`are_equivalent`.

    Attributes
    ----------
    equivalent : bool or None
        True (proved, with :attr:`permutation`), False (proved, with :attr:`reason`), or
        None when the codes are too large for the exact test.
    permutation : list of int or None
        ``permutation[j]`` is the coordinate of the second code that coordinate ``j`` of
        the first code goes to.
    reason : str
        Why: a one-line statement.
    """

    equivalent: bool | None
    permutation: list[int] | None
    reason: str

    def __bool__(self) -> bool:
        return bool(self.equivalent)


def _permuted(code: Code, perm: Sequence[int]) -> Code:
    G = np.zeros((code.k, code.n), dtype=np.uint8)
    G[:, np.asarray(perm, dtype=np.int64)] = code.G
    return Code(G)


def first_difference(a: Sequence[int], b: Sequence[int]) -> str:
    i = next(i for i, (x, y) in enumerate(zip(a, b, strict=True)) if x != y)
    return f"A_{i} = {a[i]} and {b[i]}"


_MATCH_BUDGET = 20000


class _OutOfBudget(Exception):
    pass


def _refine(MA: np.ndarray, MB: np.ndarray, ca: np.ndarray, cb: np.ndarray):
    """Joint colour refinement of two coordinate / light-word incidence matrices.

    Colours are named by their signatures over both graphs at once, so equal colours
    mean equal signatures; returns the stable coordinate colours, or None as soon as
    the two colourings have different class sizes (then no isomorphism respects them).
    """
    m, n = MA.shape
    ra, ja = np.nonzero(MA)
    rb, jb = np.nonzero(MB)
    wa = np.zeros(m, dtype=np.int64)
    wb = np.zeros(m, dtype=np.int64)
    classes = -1
    while True:
        sa = np.sort(np.where(MA, ca[None, :] + 1, 0), axis=1)
        sb = np.sort(np.where(MB, cb[None, :] + 1, 0), axis=1)
        _, inv = np.unique(np.vstack([np.column_stack([wa, sa]), np.column_stack([wb, sb])]),
                           axis=0, return_inverse=True)
        inv = inv.reshape(-1)
        wa, wb = inv[:m], inv[m:]
        nw = int(inv.max()) + 1
        if not np.array_equal(np.bincount(wa, minlength=nw), np.bincount(wb, minlength=nw)):
            return None
        ha = np.zeros((n, nw), dtype=np.int64)
        hb = np.zeros((n, nw), dtype=np.int64)
        np.add.at(ha, (ja, wa[ra]), 1)
        np.add.at(hb, (jb, wb[rb]), 1)
        _, inv = np.unique(np.vstack([np.column_stack([ca, ha]), np.column_stack([cb, hb])]),
                           axis=0, return_inverse=True)
        inv = inv.reshape(-1)
        ca, cb = inv[:n], inv[n:]
        nc = int(inv.max()) + 1
        if not np.array_equal(np.bincount(ca, minlength=nc), np.bincount(cb, minlength=nc)):
            return None
        if nc + nw == classes:
            return ca, cb
        classes = nc + nw


def _match(MA: np.ndarray, MB: np.ndarray, a: Code, b: Code) -> list[int] | None:
    """A coordinate permutation mapping code ``a`` onto ``b``, or None if there is none.

    Individualisation and refinement on the incidence of coordinates and spanning light
    words: fix one coordinate of ``a`` to each candidate of ``b`` in turn, refine, and
    recurse until every coordinate has its own colour; the permutation is then checked
    on the codes. The branch that follows a true equivalence always survives refinement,
    so exhausting the tree proves that there is none.
    """
    n = a.n
    budget = [_MATCH_BUDGET]

    def search(ca: np.ndarray, cb: np.ndarray) -> list[int] | None:
        budget[0] -= 1
        if budget[0] < 0:
            raise _OutOfBudget
        refined = _refine(MA, MB, ca, cb)
        if refined is None:
            return None
        ca, cb = refined
        sizes = np.bincount(ca)
        if sizes.max() == 1:
            where_b = np.empty(sizes.size, dtype=np.int64)
            where_b[cb] = np.arange(n)
            perm = where_b[ca].tolist()
            return perm if _permuted(a, perm) == b else None
        cls = int(np.flatnonzero(sizes == sizes[sizes > 1].min())[0])
        j = int(np.flatnonzero(ca == cls)[0])
        fresh = int(max(ca.max(), cb.max())) + 1
        for t in np.flatnonzero(cb == cls):
            ca2, cb2 = ca.copy(), cb.copy()
            ca2[j] = cb2[t] = fresh
            found = search(ca2, cb2)
            if found is not None:
                return found
        return None

    zero = np.zeros(n, dtype=np.int64)
    return search(zero, zero.copy())


def are_equivalent(a: Code, b: Code, *, facts_a: CodeFacts | None = None,
                   facts_b: CodeFacts | None = None) -> Equivalence:
    """Decide whether a permutation of coordinates maps ``a`` onto ``b``.

    See the module notes: the spanning light words of the smaller side give two
    bipartite graphs that are isomorphic (coordinates to coordinates) exactly when the
    codes are equivalent; the permutation found is checked on the codes themselves.

    >>> from gf2codes.families import hamming, cyclic
    >>> r = are_equivalent(hamming(3), cyclic(7, "x^3+x+1")); r.equivalent
    True
    """
    if a.n != b.n:
        return Equivalence(False, None, f"the lengths differ ({a.n} and {b.n})")
    if a.k != b.k:
        return Equivalence(False, None, f"the dimensions differ ({a.k} and {b.k})")
    if a == b:
        return Equivalence(True, list(range(a.n)), "the codes are the same subspace")
    fa = facts_a or code_facts(a)
    fb = facts_b or code_facts(b)
    if fa.side == "full":
        return Equivalence(True, list(range(a.n)), "both are the whole space")
    if fa.weights is not None and fb.weights is not None and fa.weights != fb.weights:
        return Equivalence(False, None, "the weight distributions differ ("
                           + first_difference(fa.weights, fb.weights) + ")")
    if fa.side == "coarse" or fb.side == "coarse":
        return Equivalence(None, None, "too large for the exact test (the smaller of the "
                           "code and its dual has too many codewords or light words)")
    side = "code" if fa.side == "code" else "dual code"
    assert fa.light is not None and fb.light is not None  # code_facts sets it past the checks above
    if fa.w_star != fb.w_star or fa.light.shape[0] != fb.light.shape[0]:
        return Equivalence(False, None, f"the light words spanning the {side} differ "
                           f"(weights <= {fa.w_star}: {fa.light.shape[0]} words; weights "
                           f"<= {fb.w_star}: {fb.light.shape[0]} words)")
    if fa.invariant != fb.invariant:
        return Equivalence(False, None, "the Weisfeiler-Lehman hashes of the graphs of "
                           f"coordinates and light words of the {side} differ")
    try:
        perm = _match(linalg.unpack(fa.light, a.n), linalg.unpack(fb.light, b.n), a, b)
    except _OutOfBudget:
        return Equivalence(None, None, "undecided: the exact test gave up after "
                           f"{_MATCH_BUDGET} branches")
    if perm is None:
        return Equivalence(False, None, f"no permutation maps the {fa.light.shape[0]} words "
                           f"of weight <= {fa.w_star} spanning the {side} of one code onto "
                           "those of the other (exact search by colour refinement)")
    if _permuted(a, perm) != b:  # pragma: no cover - would be a bug in the argument
        raise AssertionError("the graph isomorphism does not map the codes")
    return Equivalence(True, perm, f"a permutation maps the {fa.light.shape[0]} words of "
                       f"weight <= {fa.w_star} spanning the {side} onto each other")
