"""Reading and writing matrix files and code records."""

from __future__ import annotations

import json

import numpy as np
import pytest

from gf2codes.exceptions import ParseError
from gf2codes.formats import (
    code_to_record,
    parse_text_matrix,
    read_code,
    record_to_code,
    write_code,
)


def test_text_matrix_with_separators_and_comments():
    text = "# header\n\n1 0 1 1   # trailing\n0,1,1,0\n\t1101\n"
    assert parse_text_matrix(text).tolist() == [[1, 0, 1, 1], [0, 1, 1, 0], [1, 1, 0, 1]]


@pytest.mark.parametrize("text, message", [
    ("101\n1x1\n", r"line 2, column 2: expected only 0 and 1 .* found 'x'"),
    ("101\n10\n", r"line 2: this row has 2 entries but the row on line 1 has 3"),
    ("# nothing\n\n", r"no matrix rows found"),
    ("1 2 1\n", r"line 1, column 3"),
])
def test_text_matrix_errors_name_the_line(text, message):
    with pytest.raises(ParseError, match=message):
        parse_text_matrix(text, source="m.txt")


def test_read_files_of_every_kind(tmp_path, hamming74):
    txt = tmp_path / "h.txt"
    write_code(hamming74, txt)
    npy = tmp_path / "h.npy"
    write_code(hamming74, npy)
    js = tmp_path / "h.json"
    write_code(hamming74, js, d=3)
    for p in (txt, npy, js):
        assert read_code(p).code == hamming74
    assert read_code(js).d == 3
    H = tmp_path / "H.txt"
    H.write_text("\n".join("".join(map(str, r)) for r in hamming74.H))
    assert read_code(H, parity_check=True).code == hamming74


def test_record_round_trip(hamming74):
    code = hamming74.with_info(name="h", recipe=[{"family": "hamming", "m": 3}])
    rec = json.loads(json.dumps(code_to_record(code, d=3, found_by="test")))
    back = record_to_code(rec)
    assert back.code == code and back.code.recipe == code.recipe and back.d == 3
    assert back.extra == {"found_by": "test"}


@pytest.mark.parametrize("content, message", [
    ("", "the file is empty"),
    ("{not json", "not valid JSON"),
    ('{"generator": ["101", "11"]}', "row 2: this row has 2 entries"),
    ('{"generator": ["101"], "n": 4}', "the record says n = 4 but its matrix gives n = 3"),
    ('{"record": "gf2codes/code", "version": 99, "generator": ["1"]}', "newer"),
    ('{"n": 3}', "neither 'generator' nor 'parity_check'"),
    ('{"generator": ["000"]}', "rank 0"),
])
def test_bad_files(tmp_path, content, message):
    p = tmp_path / "bad.json"
    p.write_text(content)
    with pytest.raises(ParseError, match=message):
        read_code(p)


def test_missing_file_and_bad_npy(tmp_path):
    with pytest.raises(ParseError, match="no such file"):
        read_code(tmp_path / "nope.txt")
    p = tmp_path / "x.npy"
    np.save(p, np.array([[0, 3]]))
    with pytest.raises(ParseError, match="only 0 and 1"):
        read_code(p)
    with pytest.raises(ParseError, match="not a text matrix"):
        (tmp_path / "b.bin").write_bytes(b"\xff\xfe\x00\x01")
        read_code(tmp_path / "b.bin")


def test_entry_and_code_records_share_their_field_checks():
    """One parser: an entry record's d fields and 0/1 rows get the code record's checks
    (messages written in this test from formats._distance_field and _strings_to_rows)."""
    from gf2codes.formats import parse_entry_record, record_to_code

    entry = {"record": "gf2codes/catalog-entry", "n": 3, "k": 1, "generator": ["111"],
             "d": 4}
    code = {"record": "gf2codes/code", "generator": ["111"], "d": 4}
    for obj in (entry, code):
        with pytest.raises(ParseError, match="'d' must be from 1 to n = 3, not 4"):
            parse_entry_record(obj, "r")
    with pytest.raises(ParseError, match="'d' must be from 1 to n = 3, not 4"):
        record_to_code(code, "r")
    bad_row = {**entry, "d": 3, "generator": ["1x1"]}
    with pytest.raises(ParseError, match=r"r \(generator\), row 1"):
        parse_entry_record(bad_row, "r")
    assert parse_entry_record({**entry, "d": 3}, "r").d_lower == 3
