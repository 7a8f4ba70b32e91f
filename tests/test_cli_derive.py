"""`gf2codes derive` end to end (moved from test_derive.py, bodies unchanged)."""

from __future__ import annotations

import json

from gf2codes import derive as D
from gf2codes import families as F
from gf2codes._reference import brute_distance
from gf2codes.cli import main
from gf2codes.formats import read_code, write_code


def test_cli_derive_72_64_4(tmp_path, capsys):
    """Shortening the [128, 120, 4] extended Hamming code at 56 coordinates gives
    [72, 64, 4] (d >= 4 by the rule; d <= 4 by the sphere-packing bound, since
    1 + 72 + C(72, 2) > 2^8, so d = 4; checked with minimum_distance if present)."""
    src = tmp_path / "h128.json"
    out = tmp_path / "c72.json"
    assert main(["build", "extended-hamming", "7", "-o", str(src)]) == 0
    assert main(["derive", str(src), "shorten", "0-55", "-o", str(out)]) == 0
    text = capsys.readouterr().out
    assert "[n, k] = [72, 64]" in text and "d ≥ 4" in text
    rec = read_code(out)
    assert (rec.code.n, rec.code.k, rec.d_lower) == (72, 64, 4)
    assert D.rebuild(rec.code.recipe) == rec.code
    from gf2codes import distance

    res = distance.minimum_distance(rec.code, time_limit=20)
    assert res.lower <= 4 <= res.upper  # exact or not, the interval must contain 4
    if res.exact:
        assert res.upper == 4


def test_cli_derive_22_16_4_from_text_matrix(tmp_path, capsys):
    """[32, 26, 4] shortened at 10 coordinates: [22, 16, 4] (d by brute force). The input
    is a plain text matrix without a recipe or distance."""
    src = tmp_path / "h32.txt"
    write_code(F.extended_hamming(5), src, "text")
    out = tmp_path / "c22.txt"
    assert main(["derive", str(src), "shorten", "0-9", "-o", str(out)]) == 0
    assert "d unknown" in capsys.readouterr().out  # the text file claims nothing
    C = read_code(out).code
    assert (C.n, C.k) == (22, 16)
    assert brute_distance(C.G) == 4
    assert main(["derive", str(src), "shorten", "0-9", "--json"]) == 0
    obj = json.loads(capsys.readouterr().out)
    assert (obj["n"], obj["k"]) == (22, 16)
    assert obj["recipe"][0]["family"] == "matrix"
    assert D.rebuild(obj["recipe"]) == C


def test_cli_derive_parity_check_and_errors(tmp_path, capsys):
    src = tmp_path / "h.txt"
    src.write_text("1010101\n0110011\n0001111\n")
    assert main(["derive", str(src), "--parity-check", "extend"]) == 0
    assert "[n, k] = [8, 4]" in capsys.readouterr().out
    for ops, match in [(["shorten", "7"], "from 0 to 6"), (["spin"], "unknown operation"),
                       (["shorten", "0-6"], "Cannot shorten all 7")]:
        assert main(["derive", str(src), "--parity-check", *ops]) == 2
        err = capsys.readouterr().err.strip()
        assert len(err.splitlines()) == 1 and match in err
    assert main(["derive", str(tmp_path / "missing.txt"), "extend"]) == 2
    assert "no such file" in capsys.readouterr().err
