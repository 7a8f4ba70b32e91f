"""Reading and writing matrices and code records.

Three input formats, chosen by content and file name:

* **text matrix** — one row per line, made of the characters ``0`` and ``1``;
  spaces, tabs and commas may separate the entries; ``#`` starts a comment that
  runs to the end of the line; blank lines are ignored.
* **numpy** ``.npy`` — a two-axis integer, boolean or float array of 0s and 1s
  (a float array must hold exactly 0.0 and 1.0).
* **code record** (JSON, ``.json``) — the project's own record of a code::

      {"record": "gf2codes/code", "version": 1, "n": 7, "k": 4,
       "generator": ["1000011", "0100101", "0010110", "0001111"],
       "d": 3, "d_lower": 3, "d_upper": 3, "name": "...", "recipe": [...]}

  ``generator`` (or ``parity_check``) rows are strings of 0/1 characters, one
  character per coordinate. ``d`` is present and not null only when it was
  proved. Unknown keys are kept by the reader in :attr:`CodeRecord.extra`.

* **catalog entry record** (JSON lines, ``gf2codes/catalog-entry``) — one stored
  catalog entry per line, read by :func:`parse_entry_record` (which accepts plain code
  records too, through :func:`record_to_code`); generator rows may be hexadecimal
  (:func:`row_to_hex`). The keys are described in :mod:`gf2codes.catalog`.

Every parse error is a :class:`~gf2codes.exceptions.ParseError` whose message
names the file and, for text, the line. The file name ``-`` means standard input;
pipes and devices are read like files. A matrix of more than
:data:`MAX_ENTRIES` entries (rows times columns) is refused before it is expanded
in memory; the environment variable ``GF2CODES_MAX_ENTRIES`` raises the limit.
"""

from __future__ import annotations

import io
import json
import math
import os
import sys
from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import numpy as np

from . import linalg
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
    "MAX_ENTRIES",
    "max_entries",
    "read_input_bytes",
    "one_line",
    "ENTRY_RECORD_KIND",
    "ENTRY_RECORD_VERSION",
    "EntryRecord",
    "parse_entry_record",
    "row_to_hex",
    "hex_to_row",
]

RECORD_KIND = "gf2codes/code"
RECORD_VERSION = 1
#: ``record`` value of an exported catalog entry.
ENTRY_RECORD_KIND = "gf2codes/catalog-entry"
ENTRY_RECORD_VERSION = 1
_SEPARATORS = str.maketrans("", "", " \t,;")

#: Default limit on the entries (rows times columns) of a matrix read from a file:
#: 2^25, about 33 million bits (a 5792 x 5792 matrix); see :func:`max_entries`.
MAX_ENTRIES = 1 << 25
_ENV_LIMIT = "GF2CODES_MAX_ENTRIES"
#: A record nested deeper than this is refused (no code record nests beyond 4).
_MAX_NESTING = 64


def max_entries() -> int:
    """The limit on matrix entries in force: ``GF2CODES_MAX_ENTRIES`` or :data:`MAX_ENTRIES`.

    Raises
    ------
    ParameterError
        If the environment variable is set but is not a positive integer.
    """
    text = os.environ.get(_ENV_LIMIT)
    if text is None or not text.strip():
        return MAX_ENTRIES
    try:
        value = int(text.strip(), 10)
    except ValueError:
        value = 0
    if value < 1:
        raise ParameterError(f"Environment variable {_ENV_LIMIT} must be a positive integer, "
                             f"not {text!r}.")
    return value


def _max_bytes(limit: int) -> int:
    """Bytes a file may have for a matrix of ``limit`` entries (separators, a header)."""
    return 8 * limit + (1 << 20)


def _too_large(source: str, what: str, limit: int) -> ParseError:
    return ParseError(
        f"{source}: {what}, more than the limit of {limit:,} matrix entries; set the "
        f"environment variable {_ENV_LIMIT} to allow more."
    )


def read_input_bytes(path: str | os.PathLike[str], *, limit: int | None = None) -> bytes:
    """The bytes of a file, a pipe, a device or (``-``) standard input, within limits.

    Raises
    ------
    ParseError
        When the file does not exist, is a folder, is empty, cannot be read, holds
        NUL bytes outside a ``.npy`` file, or is larger than a matrix of ``limit``
        entries can be (default: :func:`max_entries`).
    """
    limit = max_entries() if limit is None else limit
    cap = _max_bytes(limit)
    name = str(path)
    if name == "-":
        stream = sys.stdin.buffer
        source = "<standard input>"
        owned = False
    else:
        p = Path(path)
        source = name
        if not p.exists():
            raise ParseError(f"{source}: no such file.")
        if p.is_dir():
            raise ParseError(f"{source}: is a folder, not a matrix file.")
        try:
            stream = open(p, "rb")  # noqa: SIM115 - closed below
        except OSError as exc:
            raise ParseError(f"{source}: cannot read ({exc.strerror or exc}).") from None
        owned = True
    chunks: list[bytes] = []
    size = 0
    try:
        while True:
            chunk = stream.read(1 << 20)
            if not chunk:
                break
            if not chunks and not chunk.startswith(b"\x93NUMPY") and b"\0" in chunk:
                raise ParseError(f"{source}: holds NUL bytes, so it is not a text matrix, "
                                 ".npy file or JSON code record.")
            size += len(chunk)
            if size > cap:
                raise _too_large(source, f"larger than {cap:,} bytes", limit)
            chunks.append(chunk)
    except OSError as exc:
        raise ParseError(f"{source}: cannot read ({exc.strerror or exc}).") from None
    finally:
        if owned:
            stream.close()
    data = b"".join(chunks)
    if not data:
        raise ParseError(f"{source}: the file is empty.")
    return data


def one_line(text: object, *, extra: str = "") -> str:
    """``text`` as inert data for a comment, a title or a header line.

    Control characters (newlines, NUL, escape sequences, line and paragraph
    separators, invisible format characters), the backslash, ``*`` (so ``*/``
    cannot close a C comment) and every character of ``extra`` become visible
    escapes ``\\xHH`` or ``\\uHHHH``; the result is a single line.

    >>> one_line("evil */ int x; /*\\nrest")
    'evil \\\\x2a/ int x; /\\\\x2a\\\\x0arest'
    """
    import unicodedata

    out = []
    for ch in str(text):
        code = ord(ch)
        if ch in "\\*" or ch in extra or unicodedata.category(ch) in ("Cc", "Cf", "Cs", "Zl",
                                                                        "Zp"):
            out.append(f"\\x{code:02x}" if code < 0x100 else f"\\u{code:04x}")
        else:
            out.append(ch)
    return "".join(out)


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
    #: Coordinate permutations (``i -> p[i]``) from the record's ``automorphisms``
    #: field, each checked to be a permutation of ``range(n)`` that maps the code to
    #: itself (the proof of d uses them; an unchecked claim never reaches it).
    automorphisms: tuple[tuple[int, ...], ...] = ()


def rows_to_strings(bits: np.ndarray) -> list[str]:
    """Rows of a 0/1 matrix as strings of ``0`` and ``1``."""
    return [linalg.bit_string(row) for row in np.asarray(bits, dtype=np.uint8)]


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


def _nesting(obj: Any, depth: int = 0) -> int:
    """Depth of nested lists and objects (stops counting past :data:`_MAX_NESTING`)."""
    if depth > _MAX_NESTING or not isinstance(obj, (dict, list)):
        return depth
    items = obj.values() if isinstance(obj, dict) else obj
    return max((_nesting(v, depth + 1) for v in items), default=depth + 1)


def _distance_field(obj: dict[str, Any], key: str, source: str, n: int) -> int | None:
    """A record's ``d``, ``d_lower`` or ``d_upper``: null, or an integer from 1 to n."""
    value = obj.get(key)
    if value is None:
        return None
    if isinstance(value, bool) or not isinstance(value, int):
        raise ParseError(f"{source}: {key!r} must be an integer or null, not "
                         f"{type(value).__name__} {_short(value)}.")
    low = 1
    if not low <= value <= n:
        raise ParseError(f"{source}: {key!r} must be from {low} to n = {n}, not {value}.")
    return value


def _short(value: Any) -> str:
    text = json.dumps(value) if not isinstance(value, str) else repr(value)
    return text if len(text) <= 40 else text[:37] + "..."


def _check_size(obj: dict[str, Any], source: str, limit: int) -> None:
    """Refuse a record whose matrix exceeds ``limit`` entries before parsing it."""
    rows = obj.get("generator", obj.get("parity_check"))
    if isinstance(rows, list):
        entries = sum(len(r) for r in rows if isinstance(r, str))
        if entries > limit:
            raise _too_large(source, f"the record's matrix has {entries:,} entries", limit)


def record_to_code(obj: Any, source: str = "<record>", *, limit: int | None = None
                   ) -> CodeRecord:
    """Turn a parsed JSON code record into a :class:`CodeRecord`.

    Every field is checked: the matrix (at most ``limit`` entries, default
    :func:`max_entries`), ``n`` and ``k`` against the matrix, and ``d``,
    ``d_lower``, ``d_upper`` (null or integers from 1 to n, in order).
    """
    if not isinstance(obj, dict):
        raise ParseError(f"{source}: a code record must be a JSON object.")
    if _nesting(obj) > _MAX_NESTING:
        raise ParseError(f"{source}: the record is nested too deeply to be a code record.")
    kind = obj.get("record", RECORD_KIND)
    if kind != RECORD_KIND:
        raise ParseError(f"{source}: 'record' must be {RECORD_KIND!r}, not {_short(kind)}.")
    version = obj.get("version", RECORD_VERSION)
    if isinstance(version, bool) or not isinstance(version, int):
        raise ParseError(f"{source}: 'version' must be an integer, not "
                         f"{type(version).__name__} {_short(version)}.")
    if version < 1:
        raise ParseError(f"{source}: 'version' must be at least 1, not {version}.")
    if version > RECORD_VERSION:
        raise ParseError(
            f"{source}: record version {version!r} is newer than this gf2codes understands "
            f"({RECORD_VERSION}); upgrade gf2codes."
        )
    recipe = obj.get("recipe") or []
    if not isinstance(recipe, list) or not all(isinstance(s, dict) for s in recipe):
        raise ParseError(f"{source}: 'recipe' must be a list of objects.")
    name = obj.get("name")
    if name is not None and not isinstance(name, str):
        raise ParseError(f"{source}: 'name' must be a string or null, not "
                         f"{type(name).__name__}.")
    _check_size(obj, source, max_entries() if limit is None else limit)
    meta: dict[str, Any] = {"name": name, "recipe": recipe}
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
        if key in obj and (isinstance(obj[key], bool) or not isinstance(obj[key], int)):
            raise ParseError(f"{source}: {key!r} must be an integer, not "
                             f"{type(obj[key]).__name__} {_short(obj[key])}.")
        if key in obj and obj[key] != getattr(code, key):
            raise ParseError(
                f"{source}: the record says {key} = {obj[key]} but its matrix gives "
                f"{key} = {getattr(code, key)}."
            )
    known = {"record", "version", "n", "k", "generator", "parity_check", "d", "d_lower",
             "d_upper", "name", "recipe", "automorphisms"}
    d, lo, hi = (_distance_field(obj, key, source, code.n) for key in ("d", "d_lower",
                                                                       "d_upper"))
    if lo is not None and hi is not None and lo > hi:
        raise ParseError(f"{source}: 'd_lower' = {lo} is greater than 'd_upper' = {hi}.")
    if d is not None and ((lo is not None and d < lo) or (hi is not None and d > hi)):
        raise ParseError(f"{source}: 'd' = {d} lies outside 'd_lower'..'d_upper' = "
                         f"{lo}..{hi}.")
    return CodeRecord(
        code=code,
        d=d,
        d_lower=lo,
        d_upper=hi,
        extra={k: v for k, v in obj.items() if k not in known},
        automorphisms=_automorphisms_field(obj, code, source),
    )


def _automorphisms_field(obj: dict[str, Any], code: Code, source: str
                         ) -> tuple[tuple[int, ...], ...]:
    """A record's ``automorphisms``: absent, null, or a list of permutations of
    ``range(n)`` (lists of ``n`` integers, ``i -> p[i]``), each checked to map the code
    to itself."""
    from .distance._symmetry import check_permutation, is_automorphism

    value = obj.get("automorphisms")
    if value is None:
        return ()
    if not isinstance(value, list):
        raise ParseError(f"{source}: 'automorphisms' must be a list of permutations "
                         f"(lists of n integers), not {type(value).__name__} "
                         f"{_short(value)}.")
    out = []
    for i, perm in enumerate(value):
        if not isinstance(perm, list):
            raise ParseError(f"{source}: automorphisms[{i}] must be a list of {code.n} "
                             f"integers, not {type(perm).__name__} {_short(perm)}.")
        try:
            p = check_permutation(perm, code.n, name=f"automorphisms[{i}]")
        except ParameterError as exc:
            raise ParseError(f"{source}: {str(exc).removeprefix('Argument ')}") from None
        if not is_automorphism(code, p):
            raise ParseError(f"{source}: automorphisms[{i}] does not map the code to itself "
                             "(it moves a basis row out of the code).")
        out.append(p)
    return tuple(out)


def _parse_npy(data: bytes, source: str, limit: int) -> np.ndarray:
    buf = io.BytesIO(data)
    try:
        version = np.lib.format.read_magic(buf)
        if version == (1, 0):
            shape, _, dtype = np.lib.format.read_array_header_1_0(buf)
        else:
            shape, _, dtype = np.lib.format.read_array_header_2_0(buf)
    except (ValueError, OSError, SyntaxError) as exc:
        raise ParseError(f"{source}: not a readable .npy file ({exc}).") from None
    if len(shape) != 2:
        raise ParseError(f"{source}: the array must have 2 axes, not {len(shape)}.")
    if 0 in shape:
        raise ParseError(f"{source}: the array is empty (shape {tuple(shape)}).")
    if math.prod(shape) > limit:
        raise _too_large(source, f"the array has {shape[0]:,} x {shape[1]:,} entries", limit)
    if dtype.kind not in "iubf":
        raise ParseError(f"{source}: the array must hold only 0 and 1, not {dtype} values.")
    try:
        arr = np.load(io.BytesIO(data), allow_pickle=False)
    except (ValueError, OSError, EOFError) as exc:
        raise ParseError(f"{source}: not a readable .npy file ({exc}).") from None
    if arr.dtype.kind == "f":
        ok = bool(np.all((arr == 0.0) | (arr == 1.0)))
    else:
        ok = arr.dtype.kind == "b" or bool(arr.min() >= 0 and arr.max() <= 1)
    if not ok:
        raise ParseError(f"{source}: the array must hold only 0 and 1.")
    return np.ascontiguousarray(arr, dtype=np.uint8)


def _source_name(path: str | os.PathLike[str]) -> str:
    return "<standard input>" if str(path) == "-" else str(path)


def _parse_matrix_bytes(data: bytes, source: str, limit: int) -> np.ndarray:
    if data.startswith(b"\x93NUMPY"):
        return _parse_npy(data, source, limit)
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError:
        raise ParseError(f"{source}: not a text matrix, .npy file or JSON code record.") from None
    M = parse_text_matrix(text, source=source)
    if M.size > limit:
        raise _too_large(source, f"the matrix has {M.shape[0]:,} x {M.shape[1]:,} entries",
                         limit)
    return M


def read_matrix_file(path: str | os.PathLike[str]) -> np.ndarray:
    """Read a text or ``.npy`` matrix file (``-``: standard input) into a ``uint8`` 0/1 array."""
    limit = max_entries()
    return _parse_matrix_bytes(read_input_bytes(path, limit=limit), _source_name(path), limit)


def read_code(path: str | os.PathLike[str], *, parity_check: bool = False) -> CodeRecord:
    """Read a code from a text matrix, ``.npy`` file or JSON code record.

    Parameters
    ----------
    path : path-like
        A file, a pipe or device, or ``-`` for standard input. The format is told
        by the content: the ``.npy`` magic bytes, a ``{`` after any white space
        (a JSON record), else the text matrix format.
    parity_check : bool
        Read a matrix file as a parity-check matrix ``H`` (ignored for records,
        which say which matrix they hold).
    """
    limit = max_entries()
    source = _source_name(path)
    data = read_input_bytes(path, limit=limit)
    if data.lstrip(b" \t\r\n\f\v").startswith(b"{"):
        try:
            obj = json.loads(data.decode("utf-8"))
        except (json.JSONDecodeError, UnicodeDecodeError) as exc:
            raise ParseError(f"{source}: not valid JSON ({exc}).") from None
        except RecursionError:
            raise ParseError(f"{source}: the JSON is nested too deeply to be a code "
                             "record.") from None
        return record_to_code(obj, source=source, limit=limit)
    M = _parse_matrix_bytes(data, source, limit)
    try:
        code = Code.from_parity_check(M) if parity_check else Code(M)
    except ParameterError as exc:
        raise ParseError(f"{source}: {exc}") from None
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
            header += f": {one_line(code.name)}"  # one line, whatever the name holds
        p.write_text(header + "\n" + "\n".join(rows_to_strings(code.G)) + "\n", encoding="utf-8")
    elif fmt == "npy":
        np.save(p, np.asarray(code.G, dtype=np.uint8))
    elif fmt == "json":
        p.write_text(json.dumps(code_to_record(code, **record_fields), indent=1) + "\n",
                     encoding="utf-8")
    else:
        raise ParameterError(f"Argument 'format' must be one of text, npy, json, not {fmt!r}.")


# ------------------------------------------------------------------ catalog entry records
def row_to_hex(bits: Sequence[int] | np.ndarray) -> str:
    """A 0/1 row as ``"hex:..."``: coordinate 0 is the most significant bit of digit 1.

    >>> row_to_hex([1, 1, 0, 1, 0, 0, 1])
    'hex:d2'
    """
    b = np.asarray(bits, dtype=np.uint8)
    n = b.size
    padded = np.zeros(-(-n // 4) * 4, dtype=np.uint8)
    padded[:n] = b
    digits = padded.reshape(-1, 4) @ np.array([8, 4, 2, 1])
    return "hex:" + "".join("0123456789abcdef"[int(x)] for x in digits)


def hex_to_row(text: str, n: int) -> np.ndarray:
    """Inverse of :func:`row_to_hex` for a row of ``n`` coordinates.

    Raises
    ------
    ParseError
        If the digits are not hexadecimal, their count is not ``ceil(n/4)``, or a
        padding bit is set.

    >>> hex_to_row('hex:d2', 7).tolist()
    [1, 1, 0, 1, 0, 0, 1]
    """
    body = text[4:] if text.startswith("hex:") else text
    if len(body) != -(-n // 4):
        raise ParseError(f"<record>: a hex row of {n} coordinates needs {-(-n // 4)} "
                         f"digits, not {len(body)}.")
    try:
        values = [int(c, 16) for c in body]
    except ValueError:
        raise ParseError(f"<record>: {text!r} is not a hex row.") from None
    bits = np.array([(v >> (3 - i)) & 1 for v in values for i in range(4)], dtype=np.uint8)
    if bits[n:].any():
        raise ParseError(f"<record>: the hex row {text!r} sets padding bits beyond "
                         f"coordinate {n - 1}.")
    return bits[:n]


@dataclass
class EntryRecord:
    """A catalog entry record as read by :func:`parse_entry_record` (not yet trusted:
    what it states about d is a claim until checked or proved)."""

    code: Code
    d_lower: int
    d_upper: int
    proved: bool
    weights: list[int] | None
    invariant: str | None
    proof: dict[str, Any] | None
    recipes: list[dict[str, Any]]
    added: str | None
    added_by: str | None
    origin: str | None


def _rows(obj: Any, n: int | None, source: str) -> np.ndarray:
    rows = obj.get("generator")
    if not isinstance(rows, list) or not rows or not all(isinstance(r, str) for r in rows):
        raise ParseError(f"{source}: 'generator' must be a non-empty list of strings.")
    if all(r.startswith("hex:") for r in rows):
        if not isinstance(n, int) or isinstance(n, bool) or n < 1:
            raise ParseError(f"{source}: hex rows need a positive integer 'n'.")
        try:
            return np.array([hex_to_row(r, n) for r in rows])
        except ParseError as exc:
            raise ParseError(str(exc).replace("<record>", source)) from None
    if any(r.startswith("hex:") for r in rows):
        raise ParseError(f"{source}: mix of hex and 0/1 rows.")
    return _strings_to_rows(rows, source, "generator")  # as in a code record


def _pos_int(obj: Mapping[str, Any], key: str, source: str) -> int:
    v = obj.get(key)
    if isinstance(v, bool) or not isinstance(v, int) or v < 1:
        raise ParseError(f"{source}: {key!r} must be a positive integer, not {v!r}.")
    return v


def parse_entry_record(obj: Any, source: str = "<record>") -> EntryRecord:
    """Check and read one record (a catalog entry or a plain ``gf2codes/code`` record).

    A code record is read by :func:`record_to_code`; an entry record goes through the same
    checks for what the two share (nesting, matrix size, 0/1 rows, ``d``, ``d_lower`` and
    ``d_upper`` from 1 to n), then through its own (hex rows, ``n`` and ``k``, the stated
    weights and recipes).

    Raises
    ------
    ParseError
        Naming ``source`` and what is wrong.
    """
    if not isinstance(obj, dict):
        raise ParseError(f"{source}: a record must be a JSON object.")
    kind = obj.get("record")
    if kind == RECORD_KIND:
        rec = record_to_code(obj, source)  # checks every field, d's included
        d = rec.d
        lo = d if d is not None else rec.d_lower
        hi = d if d is not None else rec.d_upper
        if lo is None:
            raise ParseError(f"{source}: the record states neither 'd' nor 'd_lower'.")
        recipe = list(rec.code.recipe)
        return EntryRecord(rec.code, lo, hi or lo, d is not None or lo == hi, None, None,
                           None, [{"source": "import", "recipe": recipe or None}], None, None,
                           None)
    if kind != ENTRY_RECORD_KIND:
        raise ParseError(f"{source}: 'record' must be {ENTRY_RECORD_KIND!r} or "
                         f"{RECORD_KIND!r}, not {kind!r}.")
    version = obj.get("version", ENTRY_RECORD_VERSION)
    if not isinstance(version, int) or version > ENTRY_RECORD_VERSION:
        raise ParseError(f"{source}: record version {version!r} is newer than this gf2codes "
                         f"understands ({ENTRY_RECORD_VERSION}); upgrade gf2codes.")
    if _nesting(obj) > _MAX_NESTING:  # the checks of a code record (record_to_code)
        raise ParseError(f"{source}: the record is nested too deeply to be a code record.")
    _check_size(obj, source, max_entries())
    n = _pos_int(obj, "n", source)
    k = _pos_int(obj, "k", source)
    try:
        code = Code(_rows(obj, n, source))
    except ParameterError as exc:
        raise ParseError(f"{source}: {exc}") from None
    if (code.n, code.k) != (n, k):
        raise ParseError(f"{source}: the record says [n, k] = [{n}, {k}] but its generator "
                         f"gives [{code.n}, {code.k}].")
    d, lo, hi = (_distance_field(obj, key, source, n) for key in ("d", "d_lower", "d_upper"))
    lo = lo if lo is not None else d
    hi = hi if hi is not None else d
    if lo is None or hi is None:
        raise ParseError(f"{source}: the record must state 'd' or both 'd_lower' and "
                         "'d_upper'.")
    if d is not None and not lo == d == hi:
        raise ParseError(f"{source}: 'd' = {d} disagrees with d_lower = {lo}, d_upper = {hi}.")
    if lo > hi:
        raise ParseError(f"{source}: d_lower = {lo} exceeds d_upper = {hi}.")
    weights = obj.get("weights")
    if weights is not None and (not isinstance(weights, list) or len(weights) != n + 1
                                or not all(isinstance(a, int) and a >= 0 for a in weights)
                                or sum(weights) != 1 << k):
        raise ParseError(f"{source}: 'weights' must be {n + 1} counts summing to 2^{k}.")
    recipes = obj.get("recipes") or []
    if not isinstance(recipes, list) or not all(
            isinstance(r, dict) and isinstance(r.get("source"), str) for r in recipes):
        raise ParseError(f"{source}: 'recipes' must be a list of objects with a 'source'.")
    for r in recipes:
        steps = r.get("recipe")
        if steps is not None and (not isinstance(steps, list)
                                  or not all(isinstance(s, dict) for s in steps)):
            raise ParseError(f"{source}: a recipe must be a list of steps (objects).")
        perm = r.get("permutation")
        if perm is not None and (not isinstance(perm, list) or sorted(perm) != list(range(n))):
            raise ParseError(f"{source}: a recipe's 'permutation' must be a permutation of "
                             f"0..{n - 1}.")
    invariant = obj.get("invariant")
    proof = obj.get("proof")
    return EntryRecord(code, lo, hi, lo == hi, weights,
                   invariant if isinstance(invariant, str) else None,
                   proof if isinstance(proof, dict) else None,
                   [dict(r) for r in recipes] or [{"source": "import", "recipe": None}],
                   obj.get("added"), obj.get("gf2codes"), obj.get("origin"))
