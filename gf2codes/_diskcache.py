"""A small on-disk memo for results this installation computed and may reuse at once.

Used for the certified LP bounds: each one is a proof (checked in exact arithmetic
when it was made), costs SciPy's import and a solve to make, and never changes for the
same algorithm. A memo is one JSON file ``<name>.json`` in the cache folder:
``GF2CODES_CACHE_DIR`` if set (``off`` disables every memo), else
``$XDG_CACHE_HOME/gf2codes``, else ``~/.cache/gf2codes``. The file names the version of
the algorithm that wrote it; a file of another version, or one that cannot be read, is
ignored (and replaced on the next write). New values are written once, when the process
ends, merged with what other processes wrote meanwhile, by an atomic rename; a folder
that cannot be written is skipped silently — the memo only saves time.

Like the catalog, the memo is this installation's own store of what it proved: delete
the folder to have everything recomputed.
"""

from __future__ import annotations

import atexit
import json
import os
import tempfile
import threading
from pathlib import Path
from typing import Any

__all__ = ["Memo", "cache_dir"]


def cache_dir() -> Path | None:
    """The cache folder, or None when memos are switched off (``GF2CODES_CACHE_DIR=off``)."""
    env = os.environ.get("GF2CODES_CACHE_DIR")
    if env is not None:
        return None if env.strip().lower() in ("", "off") else Path(env)
    base = os.environ.get("XDG_CACHE_HOME") or str(Path.home() / ".cache")
    return Path(base) / "gf2codes"


class Memo:
    """A persistent map from text keys to JSON values, for one algorithm version.

    >>> import tempfile
    >>> m = Memo("example", version="1", folder=Path(tempfile.mkdtemp()))
    >>> m.get("12,8") is None
    True
    >>> m.put("12,8", 5); m.get("12,8")
    5
    """

    def __init__(self, name: str, *, version: str, folder: Path | None = None) -> None:
        self.name, self.version = name, version
        self._given_folder = folder
        self._lock = threading.Lock()
        self._values: dict[str, Any] | None = None
        self._new: dict[str, Any] = {}
        self._folder: Path | None = None

    def _path(self) -> Path | None:
        return None if self._folder is None else self._folder / f"{self.name}.json"

    def _read(self, path: Path | None) -> dict[str, Any]:
        if path is None:
            return {}
        try:
            obj = json.loads(path.read_text(encoding="utf-8"))
        except (OSError, ValueError):
            return {}
        if not isinstance(obj, dict) or obj.get("version") != self.version:
            return {}
        values = obj.get("values")
        return values if isinstance(values, dict) else {}

    def _load(self) -> dict[str, Any]:
        if self._values is None:
            self._folder = self._given_folder or cache_dir()
            self._values = self._read(self._path())
            atexit.register(self.flush)
        return self._values

    def get(self, key: str) -> Any:
        """The stored value of ``key``, or None."""
        with self._lock:
            return self._load().get(key)

    def put(self, key: str, value: Any) -> None:
        """Store ``value`` (written to disk when the process ends, or on :meth:`flush`)."""
        with self._lock:
            self._load()[key] = value
            self._new[key] = value

    def flush(self) -> None:
        """Write the new values now (merged with the file's current content)."""
        with self._lock:
            path = self._path()
            if not self._new or path is None:
                return
            try:
                path.parent.mkdir(parents=True, exist_ok=True)
                merged = {**self._read(path), **self._new}
                fd, tmp = tempfile.mkstemp(prefix=f".{self.name}.", dir=path.parent)
                with os.fdopen(fd, "w", encoding="utf-8") as fh:
                    json.dump({"version": self.version, "values": merged}, fh,
                              sort_keys=True, separators=(",", ":"))
                os.replace(tmp, path)
            except OSError:
                if "tmp" in locals() and os.path.exists(tmp):
                    os.unlink(tmp)
                return  # an unwritable cache only costs time
            self._new.clear()
