"""Tests of gf2codes.questions: the three questions with two of n, k, d given.

Check values and their sources:

* bounds and statements of (k=4, d=3), (n=15, k=7), (n=12, d=4): what
  ``gf2codes search`` printed for them before the question objects existed
  (``scripts/cli_snapshot.py`` outputs of main at 5afd3ae); the values themselves are
  the Hamming code [7,4,3] (Griesmer bound), BCH [15,7,5] and the shortened Hamming
  [12,7,4] (MacWilliams & Sloane 1977, ch. 1 section 7, ch. 7 section 6, ch. 1 section 9);
* error messages: those of ``Catalog.pick``, ``gf2codes search`` and
  ``check_int`` before the change (read from the code at 5afd3ae);
* non-optimal statements: the templates of ``SearchResult.statement`` at 5afd3ae.
"""

from __future__ import annotations

import pickle

import pytest

from gf2codes.exceptions import ParameterError
from gf2codes.questions import (
    QUESTION_TYPES,
    GreatestDimension,
    GreatestDistance,
    Limit,
    ShortestLength,
    question,
    question_type,
)
from gf2codes.typing import QUESTIONS


# ------------------------------------------------------------------------- making one
@pytest.mark.parametrize("given,cls", [
    ({"k": 4, "d": 3}, ShortestLength),
    ({"n": 15, "k": 7}, GreatestDistance),
    ({"n": 12, "d": 4}, GreatestDimension),
])
def test_question_from_two_values(given, cls):
    q = question(**given)
    assert type(q) is cls and q.fixed == given
    assert question_type(**given) is cls
    assert q == cls(**given) and pickle.loads(pickle.dumps(q)) == q


@pytest.mark.parametrize("given,plain,options", [
    ({}, "not none.", "not none."),
    ({"k": 4}, "not k.", "not --k."),
    ({"n": 7, "k": 4, "d": 3}, "not d, k, n.", "not --d, --k, --n."),
])
def test_not_exactly_two_given(given, plain, options):
    with pytest.raises(ParameterError) as e:
        question(**given)
    assert str(e.value) == "Give exactly two of 'n', 'k' and 'd', " + plain
    with pytest.raises(ParameterError) as e:
        question(**given, options=True)
    assert str(e.value) == "Arguments must be exactly two of --n, --k, --d, " + options


@pytest.mark.parametrize("given,message", [
    ({"k": 0, "d": 3}, "Argument 'k' must be at least 1, not 0."),
    ({"k": 4, "d": 0}, "Argument 'd' must be at least 1, not 0."),
    ({"n": 0, "k": 1}, "Argument 'n' must be at least 1, not 0."),
    ({"n": 5, "k": 6}, "Argument 'k' must be at most 5, not 6."),
    ({"n": 5, "d": 6}, "Argument 'd' must be at most 5, not 6."),
    ({"n": 5, "k": True}, "Argument 'k' must be an integer, not True."),
    ({"n": "5", "d": 2}, "Argument 'n' must be an integer, not '5'."),
])
def test_bad_values(given, message):
    with pytest.raises(ParameterError) as e:
        question(**given)
    assert str(e.value) == message


def test_registry_follows_the_typing_aliases():
    assert tuple(QUESTION_TYPES) == QUESTIONS
    assert [(c.quantity, c.flag_key, c.bound_key) for c in QUESTION_TYPES.values()] == [
        ("n", "proven_shortest", "n_lower_bound"),
        ("d", "proven_optimal", "d_upper_bound"),
        ("k", "proven_optimal", "k_upper_bound"),
    ]


# ------------------------------------------------------------------ what each knows
def test_shortest_length():
    q = ShortestLength(4, 3)
    assert q.mode == "length" and q.given == (None, 4, 3)
    assert q.bound() == Limit(7, "griesmer")
    assert q.target(7) == (7, 4, 3) and q.trivial() == (12, 4, 3)
    assert q.better(7, 8) and not q.better(8, 7) and not q.better(7, 7) and q.better(9, None)
    assert q.step_better(8) == 7 and q.step_worse(8) == 9
    assert q.beyond(6, 7) and not q.beyond(7, 7)
    assert q.value_of(7, 4, 3) == 7
    assert q.statement(7, 4, 3, 3, optimal=True, bound=7, bound_by="griesmer") == \
        "[7,4,3] is proved shortest: no [6,4,3] code exists (griesmer)."
    assert q.statement(9, 4, None, 3, optimal=False, bound=7, bound_by="griesmer") == (
        "[9,4,>=3] is the shortest found; n = 9 is only an upper bound on the shortest "
        "length, which the bounds put at >= 7 (griesmer).")


def test_greatest_distance():
    q = GreatestDistance(15, 7)
    assert q.mode == "distance" and q.given == (15, 7, None)
    assert q.bound() == Limit(5, "shortening [14,6]")
    assert q.target(5) == (15, 7, 5) and q.trivial() == (15, 7, 2)
    assert q.better(5, 4) and not q.better(4, 5) and not q.better(5, 5)
    assert q.step_better(4) == 5 and q.step_worse(4) == 3
    assert q.beyond(6, 5) and not q.beyond(5, 5)
    assert q.value_of(15, 7, 5) == 5
    assert q.statement(15, 7, 5, 5, optimal=True, bound=5, bound_by="shortening [14,6]") == \
        "[15,7,5] has the greatest possible distance (shortening [14,6])."
    assert q.statement(15, 7, None, 4, optimal=False, bound=5, bound_by="griesmer") == (
        "d = 4 is the best found, only a lower bound on the best possible; the bounds "
        "allow d <= 5 (griesmer).")


def test_greatest_dimension():
    q = GreatestDimension(12, 4)
    assert q.mode == "dimension" and q.given == (12, None, 4)
    assert q.bound() == Limit(7, "hamming")
    assert q.target(7) == (12, 7, 4) and q.trivial() == (12, 3, 4)
    assert q.better(7, 6) and not q.better(6, 7)
    assert q.step_better(6) == 7 and q.step_worse(6) == 5
    assert q.value_of(12, 7, 4) == 7
    assert q.statement(12, 7, 4, 4, optimal=True, bound=7, bound_by="hamming") == \
        "[12,7,4] has the greatest possible dimension (hamming)."
    assert q.statement(12, 6, 4, 4, optimal=False, bound=7, bound_by="hamming") == (
        "k = 6 is the best found, only a lower bound on the best possible; the bounds "
        "allow k <= 7 (hamming).")


def test_the_search_result_states_through_its_question():
    from gf2codes import search as S

    r = S.search_length(4, 3, max_steps=5, seed=1)
    assert r.question == ShortestLength(4, 3) and r.mode == "length"
    assert r.target == (None, 4, 3) and r.value == r.n == 7
    assert r.statement() == "[7,4,3] is proved shortest: no [6,4,3] code exists (griesmer)."
    assert S.MODES["length"] == ("n", "proven_shortest", "n_lower_bound")
