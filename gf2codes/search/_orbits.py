"""Codes with a prescribed automorphism group, chosen by an integer program.

A binary ``[n, k]`` code is a multiset ``X`` of ``n`` nonzero columns in ``F_2^k`` (the
columns of a generator matrix); the codeword of the message ``u`` weighs
``#{x in X : u . x = 1}``, so the code has distance at least ``D`` exactly when every
``u != 0`` meets ``X`` in at least ``D`` columns with ``u . x = 1`` (and then the columns
span ``F_2^k``: the dimension is ``k``). If ``X`` is a union of orbits of a group
``<g>`` of invertible matrices, the weight of ``u`` and of ``g^T u`` agree, so one
inequality per orbit of ``<g^T>`` suffices, and the unknowns are the multiplicities of
the orbits of ``<g>``. This is the method of Braun, Kohnert and Wassermann [1]_: with a
group of order ``e`` the program has about ``(2^k - 1) / e`` unknowns and as many
inequalities, small enough for an exact integer program solver (HiGHS, through
:func:`scipy.optimize.milp`) to find a solution or prove there is none *for that group*.

Each step of :class:`OrbitProgram` draws a random invertible ``k x k`` matrix ``g``,
takes the power of it whose orbits number between :data:`MIN_ORBITS` and
:data:`MAX_ORBITS` (every orbit when the space is that small), and solves

    sum_O |O| x_O = n,   sum_O #{x in O : u . x = 1} x_O >= D  (one u per orbit of g^T),
    x_O in {0, 1, ..., cap}

with a node limit (:data:`NODE_LIMIT`), so that a step is bounded work and the same
seed gives the same codes. A solution is a code; the driver tests and proves it as it
does every candidate. The solver's "infeasible" only rules out codes with that group.

References
----------
.. [1] M. Braun, A. Kohnert and A. Wassermann, "Optimal linear codes from matrix
   groups", *IEEE Transactions on Information Theory* 51(12), 2005, 4247-4251 (from
   memory; the binary case of their construction is the one used here).
.. [2] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1 §2 (a code as the columns of its generator matrix).
"""

from __future__ import annotations

import contextlib
import math
import os
import sys
from collections.abc import Iterator
from dataclasses import dataclass

import numpy as np

from .. import families
from ..code import Code
from ._base import Strategy

__all__ = ["OrbitProgram", "OrbitSystem", "orbit_system", "solve_orbit_system",
           "orbit_code", "random_invertible", "MAX_K", "MIN_ORBITS", "MAX_ORBITS", "NODE_LIMIT"]

#: Largest dimension tried (the columns are all ``2^k - 1`` nonzero vectors). With the
#: orbit counts below, orbits at k >= 12 hold dozens of columns, so short codes there are
#: rarely unions of them (no find at k >= 12, n <= 64 in the seed's targeted run).
MAX_K = 14
#: Number of orbits aimed at (fewer only when the space has fewer points).
MIN_ORBITS = 20
MAX_ORBITS = 120
#: Branch-and-bound nodes per integer program (a work limit, not a time limit).
NODE_LIMIT = 500


def random_invertible(k: int, rng: np.random.Generator) -> list[int]:
    """A uniformly random invertible ``k x k`` matrix over GF(2), as its ``k`` column
    bit masks (column ``i`` is the image of the unit vector ``e_i``)."""
    while True:
        cols = [int(v) for v in rng.integers(1, 1 << k, size=k)]
        basis: list[int] = []
        for v in cols:
            for b in basis:
                v = min(v, v ^ b)
            if v:
                basis.append(v)
        if len(basis) == k:
            return cols


def _images(cols: list[int], k: int) -> np.ndarray:
    """``img[x] = g x`` for every ``x`` in ``F_2^k`` (by linearity: the vectors with top
    bit ``i`` are those below ``2^i`` plus ``e_i``)."""
    img = np.zeros(1 << k, dtype=np.int64)
    for i in range(k):
        img[1 << i: 2 << i] = img[: 1 << i] ^ cols[i]
    return img


def _transpose(cols: list[int], k: int) -> list[int]:
    return [sum(((cols[j] >> i) & 1) << j for j in range(k)) for i in range(k)]


def _cycles(img: np.ndarray) -> list[list[int]]:
    """The cycles of the permutation ``img`` on the nonzero vectors."""
    seen = np.zeros(img.size, dtype=bool)
    out = []
    table = img.tolist()
    for x in range(1, img.size):
        if not seen[x]:
            cyc = []
            y = x
            while not seen[y]:
                seen[y] = True
                cyc.append(y)
                y = table[y]
            out.append(cyc)
    return out


def _power_orbits(cycles: list[list[int]], j: int) -> list[list[int]]:
    """Orbits of ``g^j`` from the cycles of ``g``: a cycle of length ``L`` splits into
    ``gcd(L, j)`` orbits of length ``L / gcd(L, j)``."""
    out: list[list[int]] = []
    for cyc in cycles:
        g = math.gcd(len(cyc), j)
        out.extend(cyc[s::g] for s in range(g))
    return out


def _parity(a: np.ndarray) -> np.ndarray:
    a = a.copy()
    for sh in (32, 16, 8, 4, 2, 1):
        a ^= a >> sh
    return a & 1


@dataclass(frozen=True)
class OrbitSystem:
    """The integer program of one group: the orbits of ``<g^j>`` on the columns and,
    per orbit of ``<(g^T)^j>`` on the messages, how many columns of each orbit the
    message's codeword is 1 on (``A[row, orbit]``). The group is generated by
    ``g^power``; ``order`` is its order."""

    k: int
    orbits: tuple[tuple[int, ...], ...]
    A: np.ndarray
    power: int
    order: int

    @property
    def sizes(self) -> np.ndarray:
        return np.array([len(o) for o in self.orbits], dtype=float)


def orbit_system(k: int, cols: list[int], rng: np.random.Generator | None = None,
                 min_orbits: int = MIN_ORBITS, max_orbits: int = MAX_ORBITS
                 ) -> OrbitSystem | None:
    """The program for the group generated by a power of ``g`` (columns ``cols``)
    whose orbit count lies in ``[min(min_orbits, 2^k - 1), max_orbits]``; a random one of
    those powers (the first without ``rng``), or None if no power qualifies."""
    cyc = _cycles(_images(cols, k))
    order = math.lcm(*[len(c) for c in cyc])
    lo = min(min_orbits, (1 << k) - 1)
    powers = [order // e for e in range(1, order + 1) if order % e == 0
              if lo <= sum(math.gcd(len(c), order // e) for c in cyc) <= max_orbits]
    if not powers:
        return None
    j = powers[int(rng.integers(len(powers)))] if rng is not None else powers[0]
    orbits = _power_orbits(cyc, j)
    reps = [o[0] for o in _power_orbits(_cycles(_images(_transpose(cols, k), k)), j)]
    oid = np.zeros(1 << k, dtype=np.int64)
    for i, o in enumerate(orbits):
        oid[o] = i
    pts = np.arange(1, 1 << k, dtype=np.int64)
    A = np.vstack([np.bincount(oid[1:], weights=_parity(pts & u), minlength=len(orbits))
                   for u in reps])
    return OrbitSystem(k, tuple(tuple(o) for o in orbits), A, j, order // j)


@contextlib.contextmanager
def _native_stdout_silenced() -> Iterator[None]:
    """Send file descriptor 1 to the null device for the duration (some HiGHS builds
    print a debugging line from C++ whatever the display option, which would corrupt a
    ``--json`` output on stdout). Python's own ``sys.stdout`` is flushed first."""
    sys.stdout.flush()
    try:
        saved = os.dup(1)
    except OSError:  # pragma: no cover - no descriptor 1 (an embedded interpreter)
        yield
        return
    try:
        with open(os.devnull, "w") as null:
            os.dup2(null.fileno(), 1)
        yield
    finally:
        os.dup2(saved, 1)
        os.close(saved)


def solve_orbit_system(system: OrbitSystem, n: int, D: int,
                       node_limit: int = NODE_LIMIT) -> list[int] | None:
    """Multiplicities ``x_O`` of a length-``n`` union of orbits meeting every message
    orbit's row in at least ``D`` (so a code of distance >= ``D``), or None (none found
    within the node limit, or none exists for this group)."""
    from scipy.optimize import Bounds, LinearConstraint, milp  # type: ignore[import-untyped]

    P = (1 << system.k) - 1
    cap = max(1, -(-2 * n // P))
    m = len(system.orbits)
    with _native_stdout_silenced():
        res = milp(c=np.zeros(m),
                   constraints=[LinearConstraint(system.A, D, np.inf),
                                LinearConstraint(system.sizes[None, :], n, n)],
                   integrality=np.ones(m), bounds=Bounds(0, cap),
                   options={"node_limit": node_limit, "presolve": True})
    if res.x is None or res.status != 0:
        return None
    return [int(v) for v in np.round(res.x)]


def orbit_code(system: OrbitSystem, mult: list[int]) -> Code:
    """The code whose generator columns are the orbits taken ``mult`` times each."""
    cols = [x for o, t in zip(system.orbits, mult, strict=True) for x in o for _ in range(t)]
    c = np.array(cols, dtype=np.int64)
    G = ((c[None, :] >> np.arange(system.k, dtype=np.int64)[:, None]) & 1).astype(np.uint8)
    code = families.from_rows(G)
    return code.with_info(name=f"orbit code [{code.n},{code.k}] "
                               f"(a group of order {system.order})")


class OrbitProgram(Strategy):
    """Unions of orbits of random matrix groups, chosen by an integer program."""

    name = "orbits"
    summary = ("unions of orbits of a random matrix group, chosen by an integer program "
               "(Braun-Kohnert-Wassermann)")

    def candidates(self, n: int, k: int, D: int,
                   rng: np.random.Generator) -> Iterator[Code | None]:
        if not 1 <= k <= MAX_K or D > n:
            return
        while True:
            system = orbit_system(k, random_invertible(k, rng), rng)
            if system is None:
                yield None
                continue
            mult = solve_orbit_system(system, n, D)
            yield None if mult is None else orbit_code(system, mult)
