"""Tests of gf2codes.search (the command `gf2codes search` is tested in test_cli_search.py).

Reference lengths (the least n of a binary linear [n, k, d] code):

* (k=4, d=3) -> 7 and (k=11, d=3) -> 15: the Hamming codes, which are perfect
  (MacWilliams & Sloane 1977, ch. 1 section 7);
* (k=4, d=4) -> 8: the extended Hamming code (ibid., ch. 1 section 9);
* (k=5, d=8) -> 16: the first-order Reed-Muller code RM(1, 4), which meets the
  Griesmer bound (ibid., ch. 13 section 3 and ch. 17 section 6);
* (k=12, d=8) -> 24: the extended Golay code (ibid., ch. 2 section 6).
"""

from __future__ import annotations

import numpy as np
import pytest

from gf2codes import search as S
from gf2codes._reference import brute_distance
from gf2codes.code import Code
from gf2codes.distance import minimum_distance
from gf2codes.search import _kernels as K
from gf2codes.search._base import Strategy, light_budget, screen
from gf2codes.search._lexicode import lexicode_columns

SMALL = [(4, 3), (4, 4), (5, 8)]


def _proved_d(code: Code) -> int:
    """The distance re-proved independently of the search."""
    if code.k <= 14:
        return brute_distance(code.G)
    r = minimum_distance(code)
    assert r.exact
    return r.upper


# ------------------------------------------------------------------ kernels vs twins
def _py_greedy(r, D, n_max, prio, fixed=()):
    """Plain-Python twin of greedy_columns: sets of sums, no tables."""
    cols = list(fixed)
    reach = {0}
    sums = [{0}]  # sums of exactly j chosen columns (subsets), j <= D - 2
    for _ in range(D - 2):
        sums.append(set())

    def add(c):
        for j in range(D - 2, 0, -1):
            sums[j] |= {s ^ c for s in sums[j - 1]}

    for c in cols:
        add(c)
    while len(cols) < n_max:
        reach = set().union(*sums)
        free = [s for s in range(1, 1 << r) if s not in reach]
        if not free:
            break
        c = min(free, key=lambda s: (int(prio[s]), s))
        cols.append(c)
        add(c)
    return cols


@pytest.mark.parametrize("r,D", [(3, 3), (4, 4), (5, 5), (6, 4), (6, 6)])
def test_greedy_kernel_matches_python_twin(r, D):
    rng = np.random.default_rng(r * 10 + D)
    prio = rng.permutation(1 << r).astype(np.uint64)
    from gf2codes.search._greedy import greedy_parity_columns

    fast = greedy_parity_columns(r, D, 40, prio).tolist()
    assert fast == _py_greedy(r, D, 40, prio)


def test_lexicode_columns_are_the_hamming_and_extended_hamming_columns():
    # d = 3: 1, 2, ..., 7 (all nonzero columns); d = 4: the odd-weight columns
    # 1, 2, 4, 7, 8, 11, 13, 14 (computed by hand from the definition).
    assert lexicode_columns(3, 3, 10).tolist() == [1, 2, 3, 4, 5, 6, 7]
    assert lexicode_columns(4, 4, 10).tolist() == [1, 2, 4, 7, 8, 11, 13, 14]


def test_count_light_matches_brute_force():
    rng = np.random.default_rng(5)
    from gf2codes import linalg

    for _ in range(20):
        k, n = int(rng.integers(2, 8)), int(rng.integers(8, 14))
        G = rng.integers(0, 2, size=(k, n), dtype=np.uint8)
        for D in (2, 3, 4, 5):
            t = min(k, D - 1)
            out = np.zeros(3, dtype=np.int64)
            got = K.count_light(np.ascontiguousarray(linalg.pack(G)), t, D, 0, out)
            import itertools

            want, deficit = 0, 0
            for i in range(1, t + 1):
                for rows in itertools.combinations(range(k), i):
                    w = int((G[list(rows)].sum(axis=0) % 2).sum())
                    if w < D:
                        want, deficit = want + 1, deficit + D - w
            assert (got, out[1], out[0]) == (want, deficit, light_budget(k, t + 1))


def test_screen_agrees_with_brute_force():
    rng = np.random.default_rng(11)
    for _ in range(30):
        G = rng.integers(0, 2, size=(5, 12), dtype=np.uint8)
        if not G.any(axis=1).all():
            continue
        code = Code(G)
        d = brute_distance(code.G)
        for D in (d, d + 1):
            assert screen(code, D) is (d >= D)


# ----------------------------------------------------------------------- strategies
@pytest.mark.parametrize("name", list(S.STRATEGIES))
def test_every_strategy_reaches_small_targets(name):
    """Each strategy alone, on targets at their least length; d re-proved by brute force."""
    limits = {"cyclic": [(4, 3)], "random": [(4, 3), (4, 4)]}
    for k, d in limits.get(name, SMALL):
        r = S.search_length(k, d, time_limit=20, seed=3, strategies=[name],
                            exhaustive_nodes=0)
        assert r.code.k == k and _proved_d(r.code) >= d
        assert r.d == _proved_d(r.code)
        assert r.strategy in (name, "trivial")
        if name not in ("random", "cyclic"):
            assert r.optimal and r.strategy == name, (name, k, d, r.n)


@pytest.mark.parametrize("k,d,n", [(4, 3, 7), (11, 3, 15), (5, 8, 16), (4, 4, 8), (12, 8, 24)])
def test_driver_reaches_known_shortest_length(k, d, n):
    r = S.search_length(k, d, time_limit=30, seed=0)
    assert (r.n, r.k) == (n, k) and r.optimal and r.bound == n
    assert _proved_d(r.code) >= d


def test_golay_length_from_scratch_without_families():
    r = S.search_length(12, 8, time_limit=30, seed=0,
                        strategies=["lexicode", "greedy", "anneal", "random"])
    assert (r.n, r.k, r.d, r.optimal) == (24, 12, 8, True)
    assert brute_distance(r.code.G) == 8


def test_distance_and_dimension_modes():
    r = S.search_distance(16, 5, time_limit=20, seed=0)  # RM(1,4) [16,5,8]: M&S ch. 13 §3
    assert (r.n, r.k, r.d) == (16, 5, 8) and r.optimal and r.bound == 8
    # BCH [15,7,5] (M&S ch. 7 §6); Griesmer allows 6, the table's residual rule 5
    # (see test_bounds.py), so it is proved optimal
    r = S.search_distance(15, 7, max_steps=60, seed=0)
    assert (r.n, r.k, r.d, r.bound) == (15, 7, 5, 5) and r.optimal
    # [15,7,6] not ruled out by the formula bounds alone: without the table, the
    # statement says plainly that d = 5 is only a lower bound
    r = S.search_distance(15, 8, max_steps=30, seed=0, strategies=["greedy"],
                          exhaustive_nodes=0)
    assert r.optimal or "only a lower bound" in r.statement()
    r = S.search_dimension(8, 4, time_limit=20, seed=0)  # extended Hamming [8,4,4]
    assert (r.n, r.k, r.d) == (8, 4, 4) and r.optimal
    assert brute_distance(r.code.G) == 4


def test_not_optimal_is_said_plainly():
    # (k=16, d=6): the bounds give n >= 26; the greedy alone (30 steps, no exhaustive
    # decision) stops at a longer length and must not claim optimality.
    r = S.search_length(16, 6, max_steps=30, seed=0, strategies=["greedy"],
                        exhaustive_nodes=0)
    assert not r.optimal and r.n > r.bound
    assert "only an upper bound" in r.statement()
    assert r.to_dict()["proven_shortest"] is False


# ----------------------------------------------------------------- determinism, limits
def test_same_seed_same_result():
    kw = dict(max_steps=40, time_limit=60, strategies=["random", "anneal", "greedy"])
    a = S.search_length(10, 5, seed=7, **kw)
    b = S.search_length(10, 5, seed=7, **kw)
    assert a.n == b.n and np.array_equal(a.code.G, b.code.G) and a.strategy == b.strategy
    state = np.random.get_state()[1].copy()
    S.search_length(6, 4, seed=1, max_steps=10)
    assert np.array_equal(np.random.get_state()[1], state)  # global state untouched


class _Interrupting(Strategy):
    """Proposes a [10,4,4] code, then raises KeyboardInterrupt (a simulated Ctrl-C)."""

    name = "interrupting"

    def candidates(self, n, k, D, rng):
        if n < 10:
            raise KeyboardInterrupt
        from gf2codes import families

        G = families.extended_hamming(3).G
        yield Code(np.hstack([G, np.zeros((4, 2), dtype=np.uint8)]))


def test_interrupt_keeps_the_best_proved_code():
    seen = []
    r = S.search_length(4, 4, time_limit=30, seed=0, strategies=[_Interrupting()],
                        exhaustive_nodes=0,
                        on_winner=lambda code, d, info: seen.append((code.n, d)))
    assert r.stopped == "interrupted" and not r.optimal
    assert r.n == 10 and r.d == brute_distance(r.code.G) == 4 and r.open_target == (9, 4, 4)
    assert seen == [(r.n, r.d)]


def test_interrupt_from_progress_callback():
    calls = []

    def progress(done, total, info):
        calls.append(info["note"])
        if len(calls) >= 3:
            raise KeyboardInterrupt

    r = S.search_length(10, 6, time_limit=30, seed=0, strategies=["random"],
                        progress=progress)
    assert r.stopped == "interrupted" and r.k == 10 and _proved_d(r.code) >= 6
    assert any("trying" in c for c in calls)


@pytest.mark.slow
def test_slow_larger_targets():
    r = S.search_length(64, 4, time_limit=60, seed=0, strategies=["greedy", "lexicode"])
    assert r.n == 72 and r.optimal


def test_search_closes_the_question_by_exhaustive_search(monkeypatch):
    # With the bound weakened to the Singleton length (9 for k = 5, d = 5), the driver
    # must itself decide that no [12,5,5] code exists (exhaustive search) once it holds a
    # [13,5,5] code, and stop at once: proved shortest. d(12,5) = 4, d(13,5) = 5 (from
    # memory; [12,5,5] non-existence is also checked against brute force-free plain
    # backtracking in test_existence.py).
    from gf2codes import bounds

    monkeypatch.setattr(bounds, "least_length",
                        lambda k, d: bounds.LengthBound(9, "singleton"))
    r = S.search_length(5, 5, time_limit=60, seed=0)
    assert r.n == 13 and r.optimal and r.stopped == "bound attained"
    assert r.bound == 13 and r.bound_by.startswith("exhaustive search")
    assert "proved shortest" in r.statement()
    assert brute_distance(r.code.G) == 5


def test_search_takes_an_exhaustive_witness(monkeypatch):
    # Distance mode at [16,8]: with a weak bound the exhaustive decision finds a [16,8,5]
    # code (a witness, checked by brute force) and proves [16,8,6] impossible.
    from gf2codes import bounds

    monkeypatch.setattr(bounds, "best_upper",
                        lambda n, k: bounds.UpperBound(9, "singleton"))
    r = S.search_distance(16, 8, time_limit=60, seed=0, strategies=["random"])
    assert r.d == 5 and r.optimal and r.bound == 5
    assert brute_distance(r.code.G) == 5  # computed by brute force in this test


def test_warm_start_strategies_are_declared_not_named():
    # the warm start takes the strategies declaring `warm` (cheap, deterministic,
    # finite), which must also be exhaustible; before issue 13 it named these two
    warm = [s.name for s in S.STRATEGIES.values() if s.warm]
    assert warm == ["families", "lexicode"]
    assert all(s.exhaustible for s in S.STRATEGIES.values() if s.warm)
