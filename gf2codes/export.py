"""Hand-off to implementers: the systematic encoder and syndrome as C, text, JSON, GraphML.

Every export describes one systematic encoder of the code, built from
:meth:`gf2codes.code.Code.systematic`: the data bits are copied into an information
set of ``k`` codeword positions and each of the ``r = n - k`` parity bits is the XOR
of the data bits selected by its mask. The matching parity-check matrix
``H_sys`` has one row per parity bit: that parity position plus the information
positions of its mask, so the syndrome is zero exactly on codewords and syndrome
bit ``j`` is "recomputed parity ``j`` XOR received parity ``j``".

Bit order (the package's packing convention): bit ``i`` of a data word, codeword or
syndrome is bit ``i % 64`` (least significant first) of 64-bit word ``i // 64``.
Codeword positions are the code's own coordinates ``0 .. n-1``; data bit ``i`` goes
to position ``information_positions[i]`` and parity bit ``j`` to
``parity_positions[j]``.

The encoder's cost is given as its **XOR count**: the number of two-input XOR gates
of the straightforward mask encoder, ``sum_j max(wt(mask_j) - 1, 0)``, so that
designers can compare codes with equal ``[n, k, d]``.

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1, section 2 (systematic generator and parity-check
   matrices).
.. [2] R. M. Tanner, "A recursive approach to low complexity codes", *IEEE Trans.
   Inform. Theory* 27(5), 1981, pp. 533-547, doi:10.1109/TIT.1981.1056404 (the
   bipartite graph of a parity-check matrix).
"""

from __future__ import annotations

import io
import json
import re
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import numpy as np

from ._version import __version__
from .code import Code
from .exceptions import ParameterError
from .formats import code_to_record, one_line, rows_to_strings

__all__ = [
    "FORMATS",
    "C_MAX_LENGTH",
    "SystematicEncoder",
    "systematic_encoder",
    "c_header",
    "text_description",
    "json_description",
    "tanner_graph",
    "export_code",
    "write_export",
]

#: The export formats, in the order the command line lists them.
FORMATS = ("c", "text", "npy", "json", "graphml")
#: Longest code the C header supports (positions are ``uint16_t``).
C_MAX_LENGTH = 65535


@dataclass(frozen=True)
class SystematicEncoder:
    """A systematic encoder of an ``[n, k]`` code, in the code's coordinates.

    Attributes
    ----------
    n, k : int
    information_positions : numpy.ndarray
        ``int64[k]``: codeword position of data bit ``i``.
    parity_positions : numpy.ndarray
        ``int64[n - k]``: codeword position of parity bit ``j``.
    parity_masks : numpy.ndarray
        ``uint8[n - k, k]``: row ``j`` selects the data bits whose XOR is parity bit ``j``.
    generator : numpy.ndarray
        ``uint8[k, n]``: the systematic generator; ``data @ generator`` is the codeword.
    parity_check : numpy.ndarray
        ``uint8[n - k, n]``: the matching parity-check matrix ``H_sys``.
    """

    n: int
    k: int
    information_positions: np.ndarray
    parity_positions: np.ndarray
    parity_masks: np.ndarray
    generator: np.ndarray
    parity_check: np.ndarray

    @property
    def xor_count(self) -> int:
        """Two-input XORs of the mask encoder: ``sum_j max(wt(mask_j) - 1, 0)``."""
        w = self.parity_masks.sum(axis=1, dtype=np.int64)
        return int(np.maximum(w - 1, 0).sum())

    @property
    def syndrome_xor_count(self) -> int:
        """Two-input XORs of the syndrome: ``sum_j (wt(row j of H_sys) - 1)``."""
        w = self.parity_check.sum(axis=1, dtype=np.int64)
        return int(np.maximum(w - 1, 0).sum())

    @property
    def xor_depth(self) -> int:
        """Depth of a balanced XOR tree for the heaviest parity bit: ``ceil(log2 wt)``."""
        w = int(self.parity_masks.sum(axis=1).max(initial=0))
        return max(w - 1, 0).bit_length()

    def encode(self, data: np.ndarray) -> np.ndarray:
        """Codeword(s) of 0/1 data word(s) (``k`` bits each)."""
        u = np.asarray(data, dtype=np.int64)
        return ((u @ self.generator.astype(np.int64)) & 1).astype(np.uint8)

    def syndrome(self, words: np.ndarray) -> np.ndarray:
        """``H_sys`` syndrome(s) of 0/1 word(s) (``n`` bits each)."""
        w = np.asarray(words, dtype=np.int64)
        return ((w @ self.parity_check.T.astype(np.int64)) & 1).astype(np.uint8)

    def summary(self) -> dict[str, Any]:
        """The figures a designer compares (JSON-ready)."""
        return {"n": self.n, "k": self.k, "parity_bits": self.n - self.k,
                "encoder_xors": self.xor_count, "encoder_xor_depth": self.xor_depth,
                "syndrome_xors": self.syndrome_xor_count,
                "information_positions": [int(x) for x in self.information_positions],
                "parity_positions": [int(x) for x in self.parity_positions]}


def systematic_encoder(code: Code) -> SystematicEncoder:
    """The systematic encoder of ``code`` on its first information set.

    Examples
    --------
    >>> from gf2codes.families import hamming
    >>> enc = systematic_encoder(hamming(3))
    >>> enc.xor_count, enc.parity_masks.shape
    (6, (3, 4))
    """
    s = code.systematic()
    n, k = code.n, code.k
    perm = np.asarray(s.permutation, dtype=np.int64)
    A = np.ascontiguousarray(s.matrix[:, k:], dtype=np.uint8)  # k x r
    G = np.zeros((k, n), dtype=np.uint8)
    G[:, perm] = s.matrix
    H = np.zeros((n - k, n), dtype=np.uint8)
    H[:, perm[:k]] = A.T
    H[np.arange(n - k), perm[k:]] = 1
    for a in (perm, A, G, H):
        a.setflags(write=False)
    masks = np.ascontiguousarray(A.T)
    masks.setflags(write=False)
    return SystematicEncoder(n, k, perm[:k], perm[k:], masks, G, H)


# -------------------------------------------------------------------------------- C


def _identifier(prefix: str) -> str:
    if not re.fullmatch(r"[A-Za-z_][A-Za-z0-9_]*", prefix or ""):
        raise ParameterError(
            f"Argument 'prefix' must be a C identifier (letters, digits, _), not {prefix!r}.")
    return prefix


def _packed_rows(bits: np.ndarray, words: int) -> list[list[int]]:
    out = []
    for row in bits:
        ws = [0] * words
        for i in np.flatnonzero(row):
            ws[int(i) >> 6] |= 1 << (int(i) & 63)
        out.append(ws)
    return out


def _c_array(rows: list[list[int]], indent: str = "    ") -> str:
    lines = []
    for row in rows:
        lines.append(indent + "{" + ", ".join(f"UINT64_C(0x{w:016x})" for w in row) + "},")
    return "\n".join(lines)


def _c_list(values: np.ndarray, per_line: int = 12) -> str:
    vals = [str(int(v)) for v in values]
    return "\n".join("    " + ", ".join(vals[i:i + per_line]) + ","
                     for i in range(0, len(vals), per_line))


def c_header(code: Code, *, prefix: str = "gf2code") -> str:
    """A C99 header (``stdint.h`` only) with the systematic encoder and the syndrome.

    It defines ``PREFIX_N``, ``PREFIX_K``, ``PREFIX_R``, the word counts
    ``PREFIX_DATA_WORDS``, ``PREFIX_CODE_WORDS``, ``PREFIX_SYNDROME_WORDS``, the
    tables ``PREFIX_PARITY_MASK`` (``r`` masks over the data words),
    ``PREFIX_CHECK_MASK`` (``r`` rows of ``H_sys`` over the codeword words),
    ``PREFIX_INFO_POS`` and ``PREFIX_PARITY_POS``, and the functions (``prefix`` in
    lower case) ``prefix_parity(data, parity)``, ``prefix_encode(data, codeword)``
    and ``prefix_syndrome(word, syndrome)``. The bit order is the module's.

    Raises
    ------
    ParameterError
        If ``prefix`` is not a C identifier, the code has no parity bits (``k = n``),
        or ``n > C_MAX_LENGTH``.
    """
    enc = systematic_encoder(code)
    name = _identifier(prefix)
    lo, up = name.lower(), name.upper()
    n, k, r = enc.n, enc.k, enc.n - enc.k
    if r == 0:
        raise ParameterError(
            f"Argument 'code' must have at least one parity bit for a C encoder, not k = n = {n}.")
    if n > C_MAX_LENGTH:
        raise ParameterError(f"Argument 'code' must have n at most {C_MAX_LENGTH} for the C "
                             f"header, not {n}.")
    guard = f"{up}_H"
    label = f" ({one_line(code.name)})" if code.name else ""  # data, never code
    identity = (np.array_equal(enc.information_positions, np.arange(k))
                and np.array_equal(enc.parity_positions, np.arange(k, n)))
    layout = ("The codeword is [data | parity]:\n * data bit i at position i, parity bit j at "
              "position K + j." if identity else
              "Data bit i goes to\n * codeword position INFO_POS[i], parity bit j to "
              "PARITY_POS[j].")
    return (_c_comment(enc, up, label, layout) + f"#ifndef {guard}\n#define {guard}\n\n"
            + _c_tables(enc, up) + _c_functions(lo, up, r) + f"#endif /* {guard} */\n")


def _c_comment(enc: SystematicEncoder, up: str, label: str, layout: str) -> str:
    """The header's opening comment: what the code is, the bit order, the XOR counts."""
    n, k = enc.n, enc.k
    return f"""\
/* Systematic encoder and syndrome of a binary linear [{n}, {k}] code{label}.
 * Generated by gf2codes {__version__} (`gf2codes export --format c`). C99, needs only <stdint.h>.
 *
 * Bit order: bit i of a data word, codeword or syndrome is bit i % 64 (least significant
 * first) of the 64-bit word i / 64. Data words have {up}_DATA_WORDS words, codewords
 * {up}_CODE_WORDS, syndromes {up}_SYNDROME_WORDS; unused high bits of the last word are
 * ignored on input and written as 0.
 * Codeword positions are the coordinates of the code as given. {layout}
 *
 * Parity bit j is the XOR of the data bits selected by {up}_PARITY_MASK[j]; the
 * straightforward encoder needs {enc.xor_count} two-input XORs ({up}_ENCODER_XORS), the
 * syndrome {enc.syndrome_xor_count}. Syndrome bit j is the XOR of the codeword bits selected
 * by {up}_CHECK_MASK[j] (recomputed parity j XOR received parity j): it is 0 for every
 * codeword.
 */
"""


def _c_tables(enc: SystematicEncoder, up: str) -> str:
    """The sizes and the tables: parity masks, rows of H_sys, positions."""
    n, k, r = enc.n, enc.k, enc.n - enc.k
    dw, cw, sw = -(-k // 64), -(-n // 64), -(-r // 64)
    return f"""\
#include <stdint.h>

#define {up}_N {n}
#define {up}_K {k}
#define {up}_R {r}
#define {up}_DATA_WORDS {dw}
#define {up}_CODE_WORDS {cw}
#define {up}_SYNDROME_WORDS {sw}
#define {up}_ENCODER_XORS {enc.xor_count}
#define {up}_SYNDROME_XORS {enc.syndrome_xor_count}

static const uint64_t {up}_PARITY_MASK[{up}_R][{up}_DATA_WORDS] = {{
{_c_array(_packed_rows(enc.parity_masks, dw))}
}};

static const uint64_t {up}_CHECK_MASK[{up}_R][{up}_CODE_WORDS] = {{
{_c_array(_packed_rows(enc.parity_check, cw))}
}};

static const uint16_t {up}_INFO_POS[{up}_K] = {{
{_c_list(enc.information_positions)}
}};

static const uint16_t {up}_PARITY_POS[{up}_R] = {{
{_c_list(enc.parity_positions)}
}};

"""


def _c_functions(lo: str, up: str, r: int) -> str:
    """The encoder and syndrome functions (they read only the tables)."""
    return f"""\
static inline unsigned {lo}_parity64(uint64_t x)
{{
    x ^= x >> 32;
    x ^= x >> 16;
    x ^= x >> 8;
    x ^= x >> 4;
    x ^= x >> 2;
    x ^= x >> 1;
    return (unsigned)(x & 1u);
}}

/* parity[0 .. {up}_SYNDROME_WORDS-1] = the {r} parity bits of data. */
static inline void {lo}_parity(const uint64_t data[{up}_DATA_WORDS],
                               uint64_t parity[{up}_SYNDROME_WORDS])
{{
    int j, w;
    for (w = 0; w < {up}_SYNDROME_WORDS; w++)
        parity[w] = 0;
    for (j = 0; j < {up}_R; j++) {{
        uint64_t acc = 0;
        for (w = 0; w < {up}_DATA_WORDS; w++)
            acc ^= data[w] & {up}_PARITY_MASK[j][w];
        parity[j >> 6] |= (uint64_t){lo}_parity64(acc) << (j & 63);
    }}
}}

/* codeword = the codeword of data, in the code's coordinates. */
static inline void {lo}_encode(const uint64_t data[{up}_DATA_WORDS],
                               uint64_t codeword[{up}_CODE_WORDS])
{{
    uint64_t parity[{up}_SYNDROME_WORDS];
    int i, w;
    {lo}_parity(data, parity);
    for (w = 0; w < {up}_CODE_WORDS; w++)
        codeword[w] = 0;
    for (i = 0; i < {up}_K; i++) {{
        uint64_t bit = (data[i >> 6] >> (i & 63)) & 1u;
        codeword[{up}_INFO_POS[i] >> 6] |= bit << ({up}_INFO_POS[i] & 63);
    }}
    for (i = 0; i < {up}_R; i++) {{
        uint64_t bit = (parity[i >> 6] >> (i & 63)) & 1u;
        codeword[{up}_PARITY_POS[i] >> 6] |= bit << ({up}_PARITY_POS[i] & 63);
    }}
}}

/* syndrome = H_sys word^T: all zero exactly when word is a codeword. */
static inline void {lo}_syndrome(const uint64_t word[{up}_CODE_WORDS],
                                 uint64_t syndrome[{up}_SYNDROME_WORDS])
{{
    int j, w;
    for (w = 0; w < {up}_SYNDROME_WORDS; w++)
        syndrome[w] = 0;
    for (j = 0; j < {up}_R; j++) {{
        uint64_t acc = 0;
        for (w = 0; w < {up}_CODE_WORDS; w++)
            acc ^= word[w] & {up}_CHECK_MASK[j][w];
        syndrome[j >> 6] |= (uint64_t){lo}_parity64(acc) << (j & 63);
    }}
}}

"""


# ------------------------------------------------------------------------ text, JSON


def _equation(target: str, sources: list[str]) -> str:
    return f"{target} = " + (" ^ ".join(sources) if sources else "0")


def text_description(code: Code) -> str:
    """Parity equations and syndrome as ``#`` comments, then the systematic generator.

    The result is also a matrix file that :func:`gf2codes.formats.read_code` reads
    back (the same code).
    """
    enc = systematic_encoder(code)
    info = enc.information_positions
    label = f": {one_line(code.name)}" if code.name else ""  # keeps the header one line
    lines = [
        f"# [{enc.n}, {enc.k}] binary linear code{label} - systematic encoder "
        f"(gf2codes {__version__} export)",
        f"# codeword bits c[0..{enc.n - 1}] in the code's coordinates; data bit d[i] is "
        "c[information position i]",
        "# information positions: " + " ".join(str(int(i)) for i in info),
        "# parity positions: " + " ".join(str(int(i)) for i in enc.parity_positions),
        f"# parity equations ({enc.xor_count} two-input XORs):",
    ]
    for j, pos in enumerate(enc.parity_positions):
        src = [f"c[{int(info[i])}]" for i in np.flatnonzero(enc.parity_masks[j])]
        lines.append("#   " + _equation(f"c[{int(pos)}]", src))
    lines.append(f"# syndrome, zero exactly on codewords ({enc.syndrome_xor_count} XORs):")
    for j, row in enumerate(enc.parity_check):
        lines.append("#   " + _equation(f"s[{j}]", [f"c[{int(i)}]" for i in np.flatnonzero(row)]))
    lines.append("# systematic generator matrix (one codeword per row):")
    lines += rows_to_strings(enc.generator)
    return "\n".join(lines) + "\n"


def json_description(code: Code) -> dict[str, Any]:
    """A gf2codes code record of the systematic generator, with an ``encoder`` section.

    ``encoder`` holds the bit order, positions, parity masks (as lists of data-bit
    indices), the rows of ``H_sys`` and the XOR counts; the record itself stays
    readable by :func:`gf2codes.formats.read_code`.
    """
    enc = systematic_encoder(code)
    sys_code = Code(enc.generator, name=code.name, recipe=code.recipe,
                    d_lower=code.d_lower, d_upper=code.d_upper)
    rec = code_to_record(sys_code)
    rec["encoder"] = {
        "bit_order": "bit i of a vector is bit i % 64 (LSB first) of 64-bit word i // 64",
        **enc.summary(),
        "parity_masks": [[int(i) for i in np.flatnonzero(row)] for row in enc.parity_masks],
        "parity_check": rows_to_strings(enc.parity_check),
    }
    return rec


# ---------------------------------------------------------------------------- Tanner


def tanner_graph(code: Code, parity_check: np.ndarray | None = None):
    """The Tanner graph of ``H_sys`` (or of a given parity-check matrix) as networkx.

    Variable nodes ``"v0" .. "v{n-1}"`` and check nodes ``"c0" .. "c{r-1}"`` carry the
    attributes ``kind`` (``"variable"`` / ``"check"``) and ``index``; an edge joins
    ``c_j`` and ``v_i`` when ``H[j, i] = 1``. The graph records ``n`` and ``k``.

    >>> from gf2codes.families import hamming
    >>> g = tanner_graph(hamming(3))
    >>> g.number_of_nodes(), g.number_of_edges()
    (10, 12)
    """
    import networkx as nx  # type: ignore[import-untyped]  # untyped third-party module

    H = systematic_encoder(code).parity_check if parity_check is None else np.asarray(
        parity_check, dtype=np.uint8)
    if H.ndim != 2 or H.shape[1] != code.n:
        raise ParameterError(
            f"Argument 'parity_check' must have {code.n} columns, not {H.shape[-1]}.")
    # XML escapes < and &, but control characters would make the file unreadable.
    g = nx.Graph(n=code.n, k=code.k,
                 name=one_line(code.name) if code.name else f"[{code.n},{code.k}] code")
    for i in range(code.n):
        g.add_node(f"v{i}", kind="variable", index=i)
    for j in range(H.shape[0]):
        g.add_node(f"c{j}", kind="check", index=j)
    for j, i in zip(*np.nonzero(H), strict=True):
        g.add_edge(f"c{int(j)}", f"v{int(i)}")
    return g


# ---------------------------------------------------------------------------- export


def export_code(code: Code, fmt: str, *, prefix: str = "gf2code") -> bytes:
    """The export of ``code`` in format ``fmt`` (one of :data:`FORMATS`) as bytes.

    Raises
    ------
    ParameterError
        For an unknown format (and see :func:`c_header`).
    """
    if fmt not in FORMATS:
        raise ParameterError(f"Argument 'format' must be one of {', '.join(FORMATS)}, "
                             f"not {fmt!r}.")
    if fmt == "c":  # refuse before the (long, for huge n) systematic form
        _identifier(prefix)
        if code.k == code.n:
            raise ParameterError("Argument 'code' must have at least one parity bit for a C "
                                 f"encoder, not k = n = {code.n}.")
        if code.n > C_MAX_LENGTH:
            raise ParameterError(f"Argument 'code' must have n at most {C_MAX_LENGTH} for the "
                                 f"C header, not {code.n}.")
    if fmt == "c":
        return c_header(code, prefix=prefix).encode()
    if fmt == "text":
        return text_description(code).encode()
    if fmt == "json":
        return (json.dumps(json_description(code), indent=1) + "\n").encode()
    if fmt == "npy":
        buf = io.BytesIO()
        np.save(buf, systematic_encoder(code).generator)
        return buf.getvalue()
    import networkx as nx  # type: ignore[import-untyped]  # untyped third-party module

    buf = io.BytesIO()
    nx.write_graphml(tanner_graph(code), buf)
    return buf.getvalue()


def write_export(data: bytes, path: str | Path) -> Path:
    """Write an export (from :func:`export_code`) to ``path``; returns the path.

    Raises
    ------
    ParameterError
        In one line, naming the file and the reason, when the write fails.
    """
    p = Path(path)
    try:
        p.write_bytes(data)
    except OSError as exc:
        raise ParameterError(f"cannot write {str(path)!r}: {exc.strerror}.") from None
    return p
