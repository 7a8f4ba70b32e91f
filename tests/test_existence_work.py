"""The work budget of the exhaustive decision (``max_work``), and its use by the search.

A node budget alone does not bound a decision's time: near the root of a cell with many
check bits one node tests tens of thousands of candidate rows ([33,18,7]), deep in a
small cell a handful. The work budget counts candidate-row tests, so a step-limited
search stays bounded (it ran for hours on [33,18,7] before) and reproducible.
"""

from __future__ import annotations

import pytest

from gf2codes.exceptions import ParameterError
from gf2codes.existence import decide_existence
from gf2codes.search import _driver, search_distance


def test_work_budget_leaves_an_expensive_cell_undecided():
    dec = decide_existence(33, 18, 7, max_nodes=None, max_work=10**8)
    assert dec.status == "undecided"
    assert dec.stopped == "work budget"
    assert dec.nodes >= 1


@pytest.mark.parametrize("n, k, d, status", [
    (12, 5, 5, "none"),    # d(12, 5) = 4 (from memory; also decided by brute force in tests)
    (7, 4, 3, "exists"),   # the Hamming code
    (18, 10, 5, "none"),   # one of gf2codes/_nonexistence.jsonl's facts
])
def test_a_generous_work_budget_changes_no_decision(n, k, d, status):
    plain = decide_existence(n, k, d, max_nodes=None)
    budgeted = decide_existence(n, k, d, max_nodes=None, max_work=10**12)
    assert plain.status == budgeted.status == status
    assert plain.nodes == budgeted.nodes
    assert plain.witness == budgeted.witness


def test_work_budget_is_a_hard_stop_independent_of_the_node_budget():
    small = decide_existence(26, 13, 8, max_nodes=None, max_work=10**6)
    larger = decide_existence(26, 13, 8, max_nodes=None, max_work=10**7)
    assert small.status == larger.status == "undecided"
    assert small.nodes <= larger.nodes


def test_work_budget_needs_the_compiled_search():
    with pytest.raises(ParameterError, match="max_work"):
        decide_existence(12, 5, 5, max_work=10, compiled=False)


def test_a_step_limited_search_spends_only_its_work_budget_on_exhaustion(monkeypatch):
    # [33,18]: the incumbent is far below the bound, and deciding the next target
    # ([33,18,7], 15 check bits) exhaustively would take hours with only a node budget.
    calls = []
    real = _driver.Driver.close_by_exhaustion

    def spy(self):
        before = self.stats.get("exhaustive", {}).get("units", 0)
        real(self)
        calls.append(self.stats.get("exhaustive", {}).get("units", 0) - before)

    monkeypatch.setattr(_driver, "EXHAUSTIVE_WORK", 10**7)
    monkeypatch.setattr(_driver.Driver, "close_by_exhaustion", spy)
    res = search_distance(33, 18, time_limit=None, max_steps=3, seed=1,
                          strategies=["random"])
    assert res.d >= 1
    assert calls, "the driver tried no exhaustive decision"
    assert all(units < 200_000 for units in calls)  # stopped by work, not by the nodes
