"""The verify report as a library object: ``verify(code).to_dict()`` is what the command
prints with ``--json``, and the command's table is rendered from the same object."""

from __future__ import annotations

import json

import numpy as np
import pytest

import gf2codes.cli._verify as verify_cli
from gf2codes._reference import brute_distance, brute_weight_distribution
from gf2codes.cli import main
from gf2codes.code import Code
from gf2codes.exceptions import ParameterError
from gf2codes.formats import write_code
from gf2codes.report import LeastLength, UpperBound, VerifyReport, verify

from helpers import random_code_matrix


def _random_code() -> Code:
    rng = np.random.default_rng(2026)
    return Code(random_code_matrix(rng, 18, 7), name="random [18,7]")


@pytest.fixture
def codes(hamming74, golay24):
    return {"hamming": hamming74, "golay": golay24, "random": _random_code()}


def _captured(monkeypatch) -> list[VerifyReport]:
    """Record every report the command computes (the command still prints it)."""
    seen: list[VerifyReport] = []

    def recording(*args, **kwargs):
        rep = verify(*args, **kwargs)
        seen.append(rep)
        return rep

    monkeypatch.setattr(verify_cli, "verify", recording)
    return seen


@pytest.mark.parametrize("which", ["hamming", "golay", "random"])
def test_to_dict_is_the_json_line(which, codes, tmp_path, capsys, monkeypatch):
    code = codes[which]
    f = tmp_path / f"{which}.txt"
    write_code(code, f)
    seen = _captured(monkeypatch)
    assert main(["verify", str(f), "--json"]) == 0
    printed = json.loads(capsys.readouterr().out)
    assert len(seen) == 1
    assert seen[0].to_dict() == printed
    assert list(seen[0].to_dict()) == list(printed)  # the same key order
    # A direct call gives the same report (only the wall time differs).
    direct = verify(code, source=str(f)).to_dict()
    assert {k: v for k, v in direct.items() if k != "seconds"} == \
        {k: v for k, v in printed.items() if k != "seconds"}


def test_the_text_table_is_rendered_from_the_object(golay24, tmp_path, capsys, monkeypatch):
    f = tmp_path / "g.txt"
    write_code(golay24, f)
    seen = _captured(monkeypatch)
    assert main(["verify", str(f)]) == 0
    printed = capsys.readouterr().out
    assert verify_cli.render(seen[0]) == 0
    assert capsys.readouterr().out == printed


def test_values_and_sources(codes):
    # [7,4,3], weight distribution 1, 7, 7, 1: MacWilliams & Sloane, ch. 1 §2.
    h = verify(codes["hamming"])
    assert (h.n, h.k, h.d, h.d_exact) == (7, 4, 3, True)
    assert h.weight_distribution == (1, 0, 0, 7, 7, 0, 0, 1)
    assert h.dual_distance == 4  # the [7,3,4] simplex code (same section)
    assert h.upper_bound == UpperBound(3, h.upper_bound.by) and h.optimal is True
    assert h.least_length == LeastLength(7, h.least_length.by)
    # [24,12,8] extended Golay: self-dual, weights 0, 8, 12, 16, 24 (M&S ch. 2 §6).
    g = verify(codes["golay"])
    assert (g.d, g.dual_distance, g.properties["self_dual"]) == (8, 8, True)
    # The random code: d and the weight distribution computed by brute force here.
    r = verify(codes["random"])
    assert r.d == brute_distance(codes["random"].G)
    assert list(r.weight_distribution) == list(brute_weight_distribution(codes["random"].G))
    assert "source" not in r.to_dict() and r.name == "random [18,7]"


def test_stated_target_and_progress(hamming74):
    calls = []
    r = verify(hamming74, stated={"d": 4}, target_d=3,
               progress=lambda done, total, info: calls.append(info.get("stage")))
    assert r.stated_wrong == ("d = 4",) and r.meets_target is True
    assert list(r.to_dict())[-5:] == ["target_d", "meets_target", "upper_bound", "optimal",
                                      "least_length"]
    assert {"proving d", "counting weights"} <= set(calls)
    with pytest.raises(ParameterError, match="method"):
        verify(hamming74, method="slow")  # type: ignore[arg-type]


def test_report_is_frozen(hamming74):
    r = verify(hamming74)
    with pytest.raises(AttributeError):
        r.d = 5  # type: ignore[misc]


def test_weights_policy(golay24, monkeypatch):
    """weights="never" proves d only; "auto" skips a distribution estimated to take over
    WEIGHTS_AUTO_SECONDS and says how to ask for it; "always" counts it (issue 15)."""
    import gf2codes.report as report

    r = verify(golay24, weights="never")
    assert r.d == 8 and r.d_exact and r.weight_distribution is None
    assert r.dual_distance is None
    assert {"weight distribution", "dual distance"} <= set(r.not_computed)
    assert any("not asked for" in note for note in r.notes)
    monkeypatch.setattr(report, "WEIGHTS_AUTO_SECONDS", 0.0)
    r = verify(golay24)
    assert r.weight_distribution is None and "weight distribution" in r.not_computed
    assert any("--weights always" in note for note in r.notes)
    r = verify(golay24, weights="always")
    # [24,12,8]: 1, 759, 2576, 759, 1 (MacWilliams & Sloane 1977, ch. 2 §6)
    assert [r.weight_distribution[i] for i in (0, 8, 12, 16, 24)] == [1, 759, 2576, 759, 1]
    assert r.dual_distance == 8
    with pytest.raises(ParameterError, match="Argument 'weights' must be one of"):
        verify(golay24, weights="sometimes")  # type: ignore[arg-type]


def test_weight_seconds_grows_with_the_words_per_row():
    """The estimate uses the measured rate for the row length: per codeword, a code of
    length 200 (4 words) costs more than one of length 60 (1 word) of the same size."""
    from gf2codes.report import weight_seconds

    short, long = Code(np.eye(20, 60, dtype=np.uint8)), Code(np.eye(20, 200, dtype=np.uint8))
    assert weight_seconds(long, 1) > 3 * weight_seconds(short, 1) > 0
    assert weight_seconds(short, 2) == pytest.approx(weight_seconds(short, 1) / 2)
