"""Shared fixtures: small codes built directly, so these tests do not depend on
:mod:`gf2codes.families` (which has tests of its own)."""

from __future__ import annotations

import os
import tempfile

import numpy as np
import pytest
from hypothesis import HealthCheck, settings

from gf2codes.code import Code

from helpers import cyclic_generator

# Memos of proved results (the certified LP values, gf2codes._diskcache) live in a
# folder of this test session, never in the user's cache; subprocesses inherit it.
os.environ["GF2CODES_CACHE_DIR"] = tempfile.mkdtemp(prefix="gf2codes-test-cache-")

settings.register_profile(
    "default", deadline=None, suppress_health_check=[HealthCheck.too_slow], derandomize=True
)
settings.load_profile("default")


@pytest.fixture(autouse=True)
def _private_catalog(tmp_path_factory, monkeypatch):
    """No test reads or writes the user's own catalog."""
    monkeypatch.setenv("GF2CODES_CATALOG", str(tmp_path_factory.mktemp("cat") / "c.sqlite"))
    monkeypatch.setenv("XDG_DATA_HOME", str(tmp_path_factory.mktemp("xdg")))


@pytest.fixture(scope="session")
def hamming74() -> Code:
    # Systematic [7,4,3] Hamming code: MacWilliams & Sloane (1977), ch. 1 section 2.
    return Code([[1, 0, 0, 0, 0, 1, 1], [0, 1, 0, 0, 1, 0, 1],
                 [0, 0, 1, 0, 1, 1, 0], [0, 0, 0, 1, 1, 1, 1]])


@pytest.fixture(scope="session")
def golay23() -> Code:
    # g(x) = x^11 + x^9 + x^7 + x^6 + x^5 + x + 1 generates the [23,12,7] Golay code:
    # MacWilliams & Sloane (1977), ch. 2 section 6 (the polynomial g_1(x)).
    return Code(cyclic_generator(23, "101011100011"))


@pytest.fixture(scope="session")
def golay24(golay23: Code) -> Code:
    G = golay23.G
    return Code(np.hstack([G, G.sum(axis=1, keepdims=True) % 2]).astype(np.uint8))
