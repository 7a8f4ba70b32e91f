"""Small helpers shared by the tests (imported as ``helpers``)."""

from __future__ import annotations

import numpy as np


def cyclic_generator(n: int, poly_bits: str) -> np.ndarray:
    """Generator matrix of the cyclic code with generator polynomial ``poly_bits``
    (coefficients from the highest degree down), rows = shifts of g(x)."""
    g = [int(c) for c in poly_bits][::-1]  # g[0] = constant term
    r = len(g) - 1
    G = np.zeros((n - r, n), dtype=np.uint8)
    for i in range(n - r):
        G[i, i: i + r + 1] = g
    return G


def random_code_matrix(rng: np.random.Generator, n: int, k: int, density: float = 0.5):
    return (rng.random((k, n)) < density).astype(np.uint8)
