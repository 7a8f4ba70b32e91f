"""Tests of gf2codes.export and the ``export`` command: the C header is compiled with
the system compiler and checked against the Python encoder on random words."""

from __future__ import annotations

import shutil
import subprocess

import numpy as np
import pytest

from gf2codes import export as X
from gf2codes.code import Code
from gf2codes.exceptions import ParameterError
from gf2codes.families import bch, extended_golay, hamming, reed_muller

CC = shutil.which("cc") or shutil.which("gcc") or shutil.which("clang")

TEST_PROGRAM = r"""
#include <stdio.h>
#include <inttypes.h>
#include "code.h"
/* reads lines of hex data words (most significant word first is NOT used: words in
   index order), prints codeword words and the syndrome of (codeword ^ flip) */
int main(void)
{
    uint64_t data[GF2CODE_DATA_WORDS], cw[GF2CODE_CODE_WORDS], syn[GF2CODE_SYNDROME_WORDS];
    uint64_t flip[GF2CODE_CODE_WORDS];
    int w;
    for (;;) {
        for (w = 0; w < GF2CODE_DATA_WORDS; w++)
            if (scanf("%" SCNx64, &data[w]) != 1) return 0;
        for (w = 0; w < GF2CODE_CODE_WORDS; w++)
            if (scanf("%" SCNx64, &flip[w]) != 1) return 1;
        gf2code_encode(data, cw);
        for (w = 0; w < GF2CODE_CODE_WORDS; w++) printf("%016" PRIx64 " ", cw[w]);
        for (w = 0; w < GF2CODE_CODE_WORDS; w++) cw[w] ^= flip[w];
        gf2code_syndrome(cw, syn);
        for (w = 0; w < GF2CODE_SYNDROME_WORDS; w++) printf("%016" PRIx64 " ", syn[w]);
        printf("\n");
    }
}
"""


def pack_row(bits) -> list[int]:
    words = [0] * (-(-len(bits) // 64))
    for i, b in enumerate(bits):
        if b:
            words[i >> 6] |= 1 << (i & 63)
    return words


def unpack_words(words, n) -> np.ndarray:
    return np.array([(words[i >> 6] >> (i & 63)) & 1 for i in range(n)], dtype=np.uint8)


@pytest.mark.skipif(CC is None, reason="no C compiler (cc, gcc or clang) on this machine")
@pytest.mark.parametrize("make", [lambda: hamming(3), extended_golay,
                                  lambda: bch(127, 5),  # [127,113]: 2 words per codeword
                                  lambda: reed_muller(3, 8)],  # [256,93]: 4 words, 3 data
                         ids=["hamming", "golay24", "bch127", "rm38"])
def test_c_header_agrees_with_python(tmp_path, make):
    code = make()
    # a column permutation, so the information set is not the first k positions
    perm = np.random.default_rng(1).permutation(code.n)
    code = Code(code.G[:, perm])
    (tmp_path / "code.h").write_text(X.c_header(code))
    (tmp_path / "t.c").write_text(TEST_PROGRAM)
    exe = tmp_path / "t"
    subprocess.run([CC, "-std=c99", "-Wall", "-Wextra", "-Werror", "-pedantic", "-O1",
                    "-o", str(exe), str(tmp_path / "t.c")], check=True, cwd=tmp_path,
                   capture_output=True, timeout=120)
    enc = X.systematic_encoder(code)
    rng = np.random.default_rng(7)
    U = rng.integers(0, 2, (40, code.k), dtype=np.uint8)
    F = (rng.random((40, code.n)) < 0.05).astype(np.uint8)
    lines = [" ".join(f"{w:x}" for w in pack_row(u) + pack_row(f))
             for u, f in zip(U, F, strict=True)]
    out = subprocess.run([str(exe)], input="\n".join(lines) + "\n", capture_output=True,
                         text=True, check=True, timeout=60).stdout.splitlines()
    expected = Code(enc.generator).encode(U)  # the Python encoder on the systematic generator
    cw_words, s_words = -(-code.n // 64), -(-(code.n - code.k) // 64)
    for line, c, f in zip(out, expected, F, strict=True):
        vals = [int(x, 16) for x in line.split()]
        got = unpack_words(vals[:cw_words], code.n)
        assert np.array_equal(got, c)
        assert code.contains(got)
        syn = unpack_words(vals[cw_words:cw_words + s_words], code.n - code.k)
        assert np.array_equal(syn, enc.syndrome(c ^ f))
    assert len(out) == 40


def test_xor_count_hamming():
    # systematic [7,4] Hamming: three parity bits of weight 3 each -> 3 * 2 XORs
    enc = X.systematic_encoder(hamming(3))
    assert enc.xor_count == 6 and enc.parity_masks.sum(axis=1).tolist() == [3, 3, 3]
    assert enc.syndrome_xor_count == 9


def test_c_header_refuses_no_parity():
    with pytest.raises(ParameterError, match="at least one parity bit"):
        X.c_header(Code(np.eye(4, dtype=np.uint8)))
