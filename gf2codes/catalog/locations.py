"""Where the catalog lives: the user's catalog file and the shipped seed folder."""

from __future__ import annotations

import os
from pathlib import Path

__all__ = ["default_catalog_path", "shipped_catalog_dir", "shipped_digest"]

#: The package folder (``gf2codes/``): the seed is ``../catalog`` in a source checkout,
#: ``_seed`` in an installed package.
_PACKAGE = Path(__file__).resolve().parent.parent


def default_catalog_path() -> Path:
    """Where the catalog lives unless told otherwise: ``GF2CODES_CATALOG`` or the XDG path."""
    env = os.environ.get("GF2CODES_CATALOG")
    if env:
        return Path(env).expanduser()
    base = os.environ.get("XDG_DATA_HOME") or os.path.join(os.path.expanduser("~"),
                                                           ".local", "share")
    return Path(base) / "gf2codes" / "catalog.sqlite"


def shipped_catalog_dir() -> Path | None:
    """The folder of the shipped seed records, if present.

    ``GF2CODES_SHIPPED_CATALOG`` (a folder, or ``none``) overrides; otherwise the
    repository's ``catalog/`` beside the package (a source checkout), else the copy
    installed with the package as ``gf2codes._seed``.
    """
    env = os.environ.get("GF2CODES_SHIPPED_CATALOG")
    if env:
        return Path(env) if env.lower() != "none" else None
    here = _PACKAGE.parent / "catalog"
    if here.is_dir():
        return here
    installed = _PACKAGE / "_seed"
    return installed if installed.is_dir() else None


def shipped_digest() -> str | None:
    """SHA-256 of the shipped seed files (names and contents), or None if there are none."""
    import hashlib

    folder = shipped_catalog_dir()
    if folder is None:
        return None
    h = hashlib.sha256()
    for path in sorted(folder.glob("*.jsonl")):
        h.update(path.name.encode() + b"\0" + path.read_bytes() + b"\0")
    return h.hexdigest()
