"""Reading and writing matrices and code records.

Three input formats, chosen by content and file name:

* **text matrix** — one row per line, made of the characters ``0`` and ``1``;
  spaces, tabs and commas may separate the entries; ``#`` starts a comment that
  runs to the end of the line; blank lines are ignored.
* **numpy** ``.npy`` — a two-axis integer or boolean array of 0s and 1s.
* **code record** (JSON, ``.json``) — the project's own record of a code::

      {"record": "gf2codes/code", "version": 1, "n": 7, "k": 4,
       "generator": ["1000011", "0100101", "0010110", "0001111"],
       "d": 3, "d_lower": 3, "d_upper": 3, "name": "...", "recipe": [...]}

  ``generator`` (or ``parity_check``) rows are strings of 0/1 characters, one
  character per coordinate. ``d`` is present and not null only when it was
  proved. Unknown keys are kept by the reader in :attr:`CodeRecord.extra`.

Every parse error is a :class:`~gf2codes.exceptions.ParseError` whose message
names the file and, for text, the line.
"""

from __future__ import annotations

import json
import os
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import numpy as np

from .code import Code
from .exceptions import ParameterError, ParseError

__all__ = [
    "RECORD_KIND",
    "RECORD_VERSION",
    "CodeRecord",
    "parse_text_matrix",
    "read_matrix_file",
    "read_code",
    "code_to_record",
    "record_to_code",
    "write_code",
    "rows_to_strings",
]

RECORD_KIND = "gf2codes/code"
RECORD_VERSION = 1
_SEPARATORS = str.maketrans("", "", " \t,;")


def parse_text_matrix(text: str, source: str = "<string>") -> np.ndarray:
    """Parse the text matrix format into a ``uint8`` array.

    Raises
    ------
    ParseError
        Naming ``source`` and the line, for a character other than 0/1, rows of
        different lengths, or no rows at all.

    >>> parse_text_matrix("# a comment\\n1 0 1\\n0,1,1\\n").tolist()
    [[1, 0, 1], [0, 1, 1]]
    """
    rows: list[str] = []
    first_line = 0
    for lineno, raw in enumerate(text.splitlines(), start=1):
        line = raw.split("#", 1)[0].translate(_SEPARATORS).strip()
        if not line:
            continue
        bad = next((ch for ch in line if ch not in "01"), None)
        if bad is not None:
            col = raw.index(bad) + 1
            raise ParseError(
                f"{source}, line {lineno}, column {col}: expected only 0 and 1 "
                f"(with spaces or commas between), found {bad!r}."
            )
        if rows and len(line) != len(rows[0]):
            raise ParseError(
                f"{source}, line {lineno}: this row has {len(line)} entries but the row on "
                f"line {first_line} has {len(rows[0])}; every row must have the same length."
            )
        if not rows:
            first_line = lineno
        rows.append(line)
    if not rows:
        raise ParseError(f"{source}: no matrix rows found (the file is empty or all comments).")
    arr = np.frombuffer("".join(rows).encode("ascii"), dtype=np.uint8) - ord("0")
    return arr.reshape(len(rows), len(rows[0])).astype(np.uint8)


@dataclass
class CodeRecord:
    """A code read from a file, with what the file said about it."""

    code: Code
    d: int | None = None
    d_lower: int | None = None
    d_upper: int | None = None
    extra: dict[str, Any] = field(default_factory=dict)


def rows_to_strings(bits: np.ndarray) -> list[str]:
    """Rows of a 0/1 matrix as strings of ``0`` and ``1``."""
    b = np.asarray(bits, dtype=np.uint8)
    return [(row + ord("0")).tobytes().decode("ascii") for row in b]


def _strings_to_rows(rows: Any, source: str, key: str) -> np.ndarray:
    if not isinstance(rows, list) or not rows:
        raise ParseError(f"{source}: {key!r} must be a non-empty list of 0/1 strings.")
    text = []
    for i, r in enumerate(rows):
        if not isinstance(r, str):
            raise ParseError(
                f"{source}: {key}[{i}] must be a string of 0/1, not {type(r).__name__}."
            )
        text.append(r)
    try:
        return parse_text_matrix("\n".join(text), source=f"{source} ({key})")
    except ParseError as exc:
        # line numbers of the joined text are row numbers (1-based)
        raise ParseError(str(exc).replace(", line ", ", row ")) from None


def record_to_code(obj: Any, source: str = "<record>") -> CodeRecord:
    """Turn a parsed JSON code record into a :class:`CodeRecord`."""
    if not isinstance(obj, dict):
        raise ParseError(f"{source}: a code record must be a JSON object.")
    kind = obj.get("record", RECORD_KIND)
    if kind != RECORD_KIND:
        raise ParseError(f"{source}: 'record' must be {RECORD_KIND!r}, not {kind!r}.")
    version = obj.get("version", RECORD_VERSION)
    if not isinstance(version, int) or version > RECORD_VERSION:
        raise ParseError(
            f"{source}: record version {version!r} is newer than this gf2codes understands "
            f"({RECORD_VERSION}); upgrade gf2codes."
        )
    recipe = obj.get("recipe") or []
    if not isinstance(recipe, list) or not all(isinstance(s, dict) for s in recipe):
        raise ParseError(f"{source}: 'recipe' must be a list of objects.")
    meta = {"name": obj.get("name"), "recipe": recipe}
    try:
        if "generator" in obj:
            code = Code(_strings_to_rows(obj["generator"], source, "generator"), **meta)
        elif "parity_check" in obj:
            code = Code.from_parity_check(
                _strings_to_rows(obj["parity_check"], source, "parity_check"), **meta)
        else:
            raise ParseError(f"{source}: the record has neither 'generator' nor 'parity_check'.")
    except ParameterError as exc:
        raise ParseError(f"{source}: {exc}") from None
    for key in ("n", "k"):
        if key in obj and obj[key] != getattr(code, key):
            raise ParseError(
                f"{source}: the record says {key} = {obj[key]} but its matrix gives "
                f"{key} = {getattr(code, key)}."
            )
    known = {"record", "version", "n", "k", "generator", "parity_check", "d", "d_lower",
             "d_upper", "name", "recipe"}
    return CodeRecord(
        code=code,
        d=obj.get("d"),
        d_lower=obj.get("d_lower"),
        d_upper=obj.get("d_upper"),
        extra={k: v for k, v in obj.items() if k not in known},
    )


def read_matrix_file(path: str | os.PathLike[str]) -> np.ndarray:
    """Read a text or ``.npy`` matrix file into a ``uint8`` 0/1 array.

    Raises
    ------
    ParseError
        Naming the file: missing, a folder, empty, unreadable (permission denied...) or
        not a 0/1 matrix.
    """
    p = Path(path)
    try:
        return _read_matrix_file(p)
    except OSError as exc:
        raise _cannot_read(p, exc) from None


def _read_matrix_file(p: Path) -> np.ndarray:
    if not p.exists():
        raise ParseError(f"{p}: no such file.")
    if p.is_dir():
        raise ParseError(f"{p}: is a folder, not a matrix file.")
    if p.stat().st_size == 0:
        raise ParseError(f"{p}: the file is empty.")
    with open(p, "rb") as fh:
        head = fh.read(6)
    if head == b"\x93NUMPY":
        try:
            arr = np.load(p, allow_pickle=False)
        except (ValueError, OSError) as exc:
            raise ParseError(f"{p}: not a readable .npy file ({exc}).") from None
        if arr.ndim != 2:
            raise ParseError(f"{p}: the array must have 2 axes, not {arr.ndim}.")
        if arr.dtype.kind not in "iub" or (arr.size and (arr.min() < 0 or arr.max() > 1)):
            raise ParseError(f"{p}: the array must hold only 0 and 1.")
        if 0 in arr.shape:
            raise ParseError(f"{p}: the array is empty (shape {arr.shape}).")
        return np.ascontiguousarray(arr, dtype=np.uint8)
    try:
        text = p.read_text(encoding="utf-8")
    except UnicodeDecodeError:
        raise ParseError(f"{p}: not a text matrix, .npy file or JSON code record.") from None
    return parse_text_matrix(text, source=str(p))


def _cannot_read(p: Path, exc: OSError) -> ParseError:
    return ParseError(f"{p}: cannot read ({exc.strerror or exc}).")


def read_code(path: str | os.PathLike[str], *, parity_check: bool = False) -> CodeRecord:
    """Read a code from a text matrix, ``.npy`` file or JSON code record.

    Parameters
    ----------
    path : path-like
    parity_check : bool
        Read a matrix file as a parity-check matrix ``H`` (ignored for records,
        which say which matrix they hold).
    """
    p = Path(path)
    try:
        if p.exists() and p.is_file() and p.stat().st_size:
            with open(p, "rb") as fh:
                start = fh.read(64).lstrip()
            if start.startswith(b"{"):
                try:
                    obj = json.loads(p.read_text(encoding="utf-8"))
                except (json.JSONDecodeError, UnicodeDecodeError) as exc:
                    raise ParseError(f"{p}: not valid JSON ({exc}).") from None
                return record_to_code(obj, source=str(p))
    except OSError as exc:  # permission denied, a device error...
        raise _cannot_read(p, exc) from None
    M = read_matrix_file(p)
    try:
        code = Code.from_parity_check(M) if parity_check else Code(M)
    except ParameterError as exc:
        raise ParseError(f"{p}: {exc}") from None
    return CodeRecord(code=code)


def code_to_record(code: Code, *, d: int | None = None, d_lower: int | None = None,
                   d_upper: int | None = None, **extra: Any) -> dict[str, Any]:
    """The JSON code record of ``code`` (a dict ready for :func:`json.dumps`)."""
    rec: dict[str, Any] = {"record": RECORD_KIND, "version": RECORD_VERSION,
                           "n": code.n, "k": code.k}
    if code.name:
        rec["name"] = code.name
    rec["d"] = d
    rec["d_lower"] = d_lower if d_lower is not None else (d if d is not None else code.d_lower)
    rec["d_upper"] = d_upper if d_upper is not None else (d if d is not None else code.d_upper)
    rec["generator"] = rows_to_strings(code.G)
    rec["recipe"] = [dict(s) for s in code.recipe]
    rec.update(extra)
    return rec


def write_code(code: Code, path: str | os.PathLike[str], fmt: str | None = None,
               **record_fields: Any) -> Path:
    """Write ``code`` as ``text``, ``npy`` or ``json`` (default: from the file name).

    Raises
    ------
    ParameterError
        For an unknown format, or a file that cannot be written (``cannot write 'x':
        Permission denied.``).
    """
    p = Path(path)
    if fmt is None:
        fmt = {".npy": "npy", ".json": "json"}.get(p.suffix.lower(), "text")
    try:
        _write_code(code, p, fmt, record_fields)
    except OSError as exc:
        raise ParameterError(f"cannot write {str(p)!r}: {exc.strerror or exc}.") from None
    return p


def _write_code(code: Code, p: Path, fmt: str, record_fields: dict[str, Any]) -> None:
    if fmt == "text":
        header = f"# [{code.n}, {code.k}] generator matrix"
        if code.name:
            header += f": {code.name}"
        p.write_text(header + "\n" + "\n".join(rows_to_strings(code.G)) + "\n", encoding="utf-8")
    elif fmt == "npy":
        np.save(p, np.asarray(code.G, dtype=np.uint8))
    elif fmt == "json":
        p.write_text(json.dumps(code_to_record(code, **record_fields), indent=1) + "\n",
                     encoding="utf-8")
    else:
        raise ParameterError(f"Argument 'format' must be one of text, npy, json, not {fmt!r}.")
