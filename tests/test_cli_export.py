"""`gf2codes export` end to end (moved from test_export.py, bodies unchanged)."""

from __future__ import annotations

import json

import networkx as nx
import pytest

from gf2codes import export as X
from gf2codes.cli import main
from gf2codes.exceptions import ParameterError
from gf2codes.families import extended_golay, hamming
from gf2codes.formats import read_code, write_code


def test_text_and_json_round_trip(tmp_path, capsys):
    code = extended_golay()
    write_code(code, tmp_path / "g.txt")
    for fmt in ("text", "json", "npy"):
        out = tmp_path / f"g-export.{ 'txt' if fmt == 'text' else fmt}"
        assert main(["export", str(tmp_path / "g.txt"), "--format", fmt, "-o", str(out)]) == 0
        assert read_code(out).code == code
    printed = capsys.readouterr().out
    assert "two-input XORs" in printed
    rec = json.loads((tmp_path / "g-export.json").read_text())
    assert rec["encoder"]["encoder_xors"] == X.systematic_encoder(code).xor_count
    assert len(rec["encoder"]["parity_masks"]) == 12


def test_graphml_tanner_graph(tmp_path):
    write_code(hamming(3), tmp_path / "h.txt")
    assert main(["export", str(tmp_path / "h.txt"), "--format", "graphml", "-o",
                 str(tmp_path / "h.graphml")]) == 0
    g = nx.read_graphml(tmp_path / "h.graphml")
    kinds = nx.get_node_attributes(g, "kind")
    assert sorted(kinds.values()).count("variable") == 7
    assert sorted(kinds.values()).count("check") == 3
    assert g.number_of_edges() == int(X.systematic_encoder(hamming(3)).parity_check.sum())
    assert nx.is_bipartite(g)


def test_export_stdout_and_json_summary(tmp_path, capsys):
    write_code(hamming(3), tmp_path / "h.txt")
    assert main(["export", str(tmp_path / "h.txt"), "--format", "c"]) == 0
    cap = capsys.readouterr()
    assert "#include <stdint.h>" in cap.out and "two-input XORs" in cap.err
    assert main(["export", str(tmp_path / "h.txt"), "--format", "c", "-o",
                 str(tmp_path / "h.h"), "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["encoder_xors"] == 6


@pytest.mark.parametrize("argv, message", [
    (["--format", "xml"], "Argument '--format' must be one of c, text, npy, json, graphml"),
    (["--format", "npy"], "Argument '--output' must be given for --format npy"),
    (["--format", "c", "--prefix", "9bad"], "must be a C identifier"),
])
def test_export_bad_input(tmp_path, capsys, argv, message):
    write_code(hamming(3), tmp_path / "h.txt")
    assert main(["export", str(tmp_path / "h.txt"), *argv]) == 2
    err = capsys.readouterr().err
    assert err.startswith("gf2codes export: error: ") and message in err
    assert err.count("\n") == 1


def test_write_export_is_one_line_on_failure(tmp_path):
    data = X.export_code(hamming(3), "text")
    assert X.write_export(data, tmp_path / "h.txt").read_bytes() == data
    with pytest.raises(ParameterError, match="cannot write"):
        X.write_export(data, tmp_path / "missing" / "h.txt")
