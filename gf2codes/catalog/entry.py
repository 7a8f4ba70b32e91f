"""Catalog entries: how their distance is known (provenance), the entry object, reports.

An :class:`Entry` is a stored code or one derived from a stored code by the propagation
rules (:mod:`gf2codes.catalog.propagation`); its :class:`Provenance` says whether its
interval was proved here, checked, or only claimed. :func:`entry_record` writes the
JSON-lines record of an entry (read back by :func:`gf2codes.formats.parse_entry_record`).
"""

from __future__ import annotations

import json
from collections.abc import Mapping
from dataclasses import dataclass, field
from datetime import datetime, timezone
from typing import Any, Literal

import numpy as np

from .._version import __version__
from ..code import Code
from ..derive import rebuild, recipe_of
from ..formats import ENTRY_RECORD_KIND, ENTRY_RECORD_VERSION, row_to_hex, rows_to_strings
from ..typing import ProvenanceKind

__all__ = ["Provenance", "ProvenanceKind", "Entry", "ImportReport", "ProofOutcome",
           "StoreStatus", "entry_record", "read_provenance", "now", "dumps"]

#: What storing a code did: a new entry, merged into an equivalent one, or nothing new.
StoreStatus = Literal["added", "merged", "unchanged"]


def now() -> str:
    """The current time, ISO 8601 UTC to the second (``2026-01-02T03:04:05Z``)."""
    return datetime.now(timezone.utc).replace(microsecond=0).isoformat().replace("+00:00", "Z")


def dumps(obj: Any) -> str:
    """Compact JSON with sorted keys (what the catalog stores)."""
    return json.dumps(obj, sort_keys=True, separators=(",", ":"))


# ------------------------------------------------------------------ provenance
_KINDS: tuple[str, ...] = ("proved", "checked", "claimed")


@dataclass(frozen=True)
class Provenance:
    """How the distance interval ``d_lower .. d_upper`` of a catalog entry is known.

    Only ``kind == "proved"`` is a proof made by this installation; the other two are
    claims, shown as such everywhere and never used to prove anything else (a derived
    answer from a claimed entry is a claim too).

    Attributes
    ----------
    kind : {"proved", "checked", "claimed"}
    route : str or None
        ``proved``: how (``"weight distribution"``, ``"bz"``, ``"gray"``...);
        ``checked``: which checks passed.
    at : str or None
        When (ISO 8601 UTC).
    by : str or None
        The gf2codes version that proved or checked it.
    seconds : float or None
        Time the proof took.
    source : str or None
        Who states a claim (a file name, ``"shipped seed"``...).

    >>> Provenance.from_dict({"kind": "claimed", "source": "lie.jsonl"}).describe()
    'claimed by lie.jsonl, not checked'
    """

    kind: ProvenanceKind
    route: str | None = None
    at: str | None = None
    by: str | None = None
    seconds: float | None = None
    source: str | None = None

    @property
    def proved(self) -> bool:
        """True when the interval was proved by this installation."""
        return self.kind == "proved"

    @classmethod
    def proved_here(cls, route: str, seconds: float | None = None) -> Provenance:
        """A proof made now, by this gf2codes."""
        return cls("proved", route=route, at=now(), by=__version__,
                   seconds=None if seconds is None else round(float(seconds), 3))

    def to_dict(self) -> dict[str, Any]:
        """The JSON form (keys with no value left out)."""
        return {k: v for k, v in (("kind", self.kind), ("route", self.route), ("at", self.at),
                                  ("by", self.by), ("seconds", self.seconds),
                                  ("source", self.source)) if v is not None}

    @classmethod
    def from_dict(cls, obj: Mapping[str, Any]) -> Provenance:
        """Read :meth:`to_dict`; anything unreadable is a claim, never a proof."""
        kind = obj.get("kind")
        if kind not in _KINDS:
            return cls("claimed", source=str(obj.get("source") or "unknown"))
        seconds = obj.get("seconds")
        return cls(kind, route=obj.get("route"), at=obj.get("at"), by=obj.get("by"),  # type: ignore[arg-type]
                   seconds=seconds if isinstance(seconds, (int, float)) else None,
                   source=obj.get("source"))

    def describe(self) -> str:
        """One phrase: ``proved here (bz, 0.12 s, 2026-...)`` or ``claimed by FILE...``."""
        if self.kind == "proved":
            parts = [p for p in (self.route, None if self.seconds is None else
                                 f"{self.seconds:g} s", self.at) if p]
            return "proved here" + (f" ({', '.join(parts)})" if parts else "")
        who = f"claimed by {self.source}" if self.source else "claimed"
        if self.kind == "checked":
            return f"{who}; cheap checks passed here ({self.route})"
        return f"{who}, not checked"


CLAIMED_BEFORE = Provenance("claimed", source="stored before gf2codes recorded provenance")


def read_provenance(text: str | None) -> Provenance:
    """The provenance stored as JSON text (an unreadable one is an old claim)."""
    try:
        obj = json.loads(text) if text else None
    except json.JSONDecodeError:
        obj = None
    return Provenance.from_dict(obj) if isinstance(obj, dict) else CLAIMED_BEFORE


# ------------------------------------------------------------------ entries
class Entry:
    """A catalog entry, stored or derived from a stored one by the propagation rules.

    Attributes
    ----------
    id : int or None
        The entry's id; None for a derived answer (see :attr:`base_id`).
    n, k : int
    d : int
        A lower bound on the minimum distance (proved here when :attr:`provenance` is
        ``proved``, else only claimed); the minimum distance itself when :attr:`proved`.
    d_lower, d_upper : int or None
        The interval (``d_upper`` is None for a derived answer).
    closed : bool
        True when the interval is one value.
    proved : bool
        True when ``d`` is the exact minimum distance **proved by this installation**
        (closed interval and ``provenance.kind == "proved"``).
    provenance : Provenance
        How the interval is known; a derived answer has its base entry's kind.
    recipes : list of dict
        Each ``{"source", "recipe", "seed", "permutation", "added", "gf2codes"}``.
    derived_from : str or None
        None for a stored entry; for a derived answer, a description such as
        ``"entry 12 [24, 12, 8]: shorten 2, puncture 1"``.
    base_id : int or None
        The stored entry a derived answer comes from (its own id for a stored one).
    steps : list of dict
        The derivation steps applied to the base entry's generator (empty if stored).
    weights, invariant, proof, added_at, added_by, origin
        As stored (None for a derived answer).
    """

    def __init__(self, *, id: int | None, n: int, k: int, d_lower: int,  # noqa: A002
                 d_upper: int | None, recipes: list[dict[str, Any]],
                 generator: np.ndarray | None = None, base: Entry | None = None,
                 steps: list[dict[str, Any]] | None = None, weights: list[int] | None = None,
                 invariant: str | None = None, proof: dict[str, Any] | None = None,
                 added_at: str | None = None, added_by: str | None = None,
                 origin: str | None = None, provenance: Provenance | None = None) -> None:
        self.id = id
        self.n, self.k = n, k
        self.d_lower, self.d_upper = d_lower, d_upper
        self.d = d_lower
        if base is not None:
            kind = base.provenance.kind
            provenance = (Provenance("proved", route=f"propagation rules from entry {base.id}")
                          if kind == "proved" else
                          Provenance(kind, route=base.provenance.route,
                                     source=f"entry {base.id}, "
                                            f"{base.provenance.describe()}"))
        self.provenance: Provenance = provenance or CLAIMED_BEFORE
        self.closed = d_upper is not None and d_lower == d_upper
        self.proved = self.closed and self.provenance.proved
        self.recipes = recipes
        self.weights, self.invariant, self.proof = weights, invariant, proof
        self.added_at, self.added_by, self.origin = added_at, added_by, origin
        self._generator = generator
        self._base = base
        self.steps = list(steps or [])
        self.base_id = base.id if base is not None else id
        self._code: Code | None = None
        if base is None:
            self.derived_from = None
        else:
            ops = ", ".join(_describe_step(s) for s in self.steps) or "unchanged"
            what = (f"[{base.n}, {base.k}, {base.d}]" if base.proved
                    else f"[{base.n}, {base.k}], d ≥ {base.d}")
            self.derived_from = f"entry {base.id} {what}: {ops}"

    @property
    def code(self) -> Code:
        """The code (a derived one is rebuilt from its recipe on first access).

        Its ``d_lower`` / ``d_upper`` (which every later proof trusts as proved) are set
        only when the entry's interval was proved here; a claimed entry's code has none.
        """
        if self._code is None:
            proved = self.provenance.proved
            if self._base is None:
                assert self._generator is not None  # an entry without a base has one
                recipe = next((r["recipe"] for r in self.recipes
                               if r.get("recipe") and r.get("permutation") is None
                               and r["source"] != "search"), None)
                self._code = Code.from_packed(
                    self._generator, self.n, recipe=recipe or None,
                    d_lower=self.d_lower if proved else None,
                    d_upper=self.d_upper if proved else None)
            else:
                base = self._base.code.with_info(recipe=(), name=None, d_lower=None,
                                                 d_upper=None)
                start = recipe_of(base)
                self._code = rebuild(start + self.steps).with_info(
                    d_lower=self.d_lower if proved else None, d_upper=None,
                    name=f"from catalog entry {self._base.id}")
        return self._code

    def to_dict(self) -> dict[str, Any]:
        """A JSON-ready summary (the generator as 0/1 strings)."""
        return {
            "id": self.id, "n": self.n, "k": self.k, "d": self.d if self.proved else None,
            "d_lower": self.d_lower, "d_upper": self.d_upper, "proved": self.proved,
            "status": self.provenance.kind, "provenance": self.provenance.to_dict(),
            "derived_from": self.derived_from, "base_id": self.base_id, "steps": self.steps,
            "generator": rows_to_strings(self.code.rref_generator if self._base is None
                                         else self.code.G),
            "weights": self.weights, "invariant": self.invariant, "proof": self.proof,
            "recipes": self.recipes, "added": self.added_at, "gf2codes": self.added_by,
            "origin": self.origin,
        }

    def __repr__(self) -> str:
        dd = f"{self.d}" if self.closed else f">={self.d}"
        if not self.provenance.proved:
            dd += f" {self.provenance.kind}"
        tag = f" derived from {self.base_id}" if self.derived_from else ""
        return f"<Entry {self.id} [{self.n}, {self.k}, {dd}]{tag}>"


def _describe_step(step: Mapping[str, Any]) -> str:
    op = step["op"]
    if op in ("shorten", "puncture"):
        return f"{op} {len(step['coords'])}"
    if op == "append-zeros":
        count = step.get("count", 1)
        return f"{count} zero coordinate{'s' if count != 1 else ''} appended"
    return op


@dataclass
class ImportReport:
    """What :meth:`Catalog.import_records` did.

    ``added``: new entries; ``merged``: records that joined an existing entry (new
    recipes or a tighter interval); ``unchanged``: records already present in full;
    ``errors``: ``(line, message)`` for each line that was not imported.
    """

    added: int = 0
    merged: int = 0
    unchanged: int = 0
    errors: list[tuple[int, str]] = field(default_factory=list)
    #: Imported records by provenance: ``{"proved": 3, "checked": 1, "claimed": 0}``.
    status: dict[str, int] = field(default_factory=dict)


@dataclass(frozen=True)
class ProofOutcome:
    """What :meth:`Catalog.prove_claims` did to one entry.

    ``verdict`` is ``"proved"`` (the claim holds and d is proved here), ``"the claim was
    false"`` (the proved interval replaced it), ``"not settled"`` (the time ran out; the
    entry is still a claim) or ``"already proved"``; ``detail`` is the proof's summary.
    """

    id: int | None
    claimed_lower: int
    claimed_upper: int | None
    claimed: Provenance
    d_lower: int
    d_upper: int | None
    verdict: str
    detail: str = ""



# ------------------------------------------------------------------ records
def entry_record(entry: Entry, *, stamps: bool = True) -> dict[str, Any]:
    """The JSON-lines record of a stored entry (``stamps``: include dates, versions and the
    provenance). ``d`` is null unless d was proved here."""
    rec: dict[str, Any] = {
        "record": ENTRY_RECORD_KIND, "version": ENTRY_RECORD_VERSION,
        "n": entry.n, "k": entry.k, "d": entry.d if entry.proved else None,
        "d_lower": entry.d_lower, "d_upper": entry.d_upper,
        "generator": [row_to_hex(r) for r in entry.code.rref_generator],
        "weights": entry.weights, "invariant": entry.invariant, "proof": entry.proof,
    }
    recipes = []
    for r in entry.recipes:
        item = {"source": r["source"], "recipe": r["recipe"]}
        for key in ("seed", "permutation"):
            if r.get(key) is not None:
                item[key] = r[key]
        if stamps:
            item["added"], item["gf2codes"] = r["added"], r["gf2codes"]
        recipes.append(item)
    rec["recipes"] = recipes
    if stamps:
        rec["added"], rec["gf2codes"], rec["origin"] = (entry.added_at, entry.added_by,
                                                        entry.origin)
        # how this installation knew it; whoever imports the record treats it as a claim
        rec["provenance"] = entry.provenance.to_dict()
    return rec

