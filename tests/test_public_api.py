"""The public surface: every name in a module's __all__ exists; the top-level namespace
is a curated list whose every name is the module's object, with no internals in it."""

from __future__ import annotations

import importlib

import pytest

import gf2codes

MODULES = ["code", "linalg", "distance", "weights", "bounds", "families", "derive", "formats",
           "parallel", "search", "decoding", "export", "catalog", "exceptions", "equivalence",
           "questions", "report", "typing"]


@pytest.mark.parametrize("name", MODULES)
def test_all_names_exist(name):
    module = importlib.import_module(f"gf2codes.{name}")
    assert module.__all__, f"gf2codes.{name} has an empty __all__"
    for attr in module.__all__:
        assert hasattr(module, attr), f"gf2codes.{name}.{attr} is listed but missing"


def test_top_level_names_are_the_modules_objects():
    for module_name, names in gf2codes._EXPORTS.items():
        module = importlib.import_module(f"gf2codes.{module_name}")
        for attr in names:
            assert attr in module.__all__, f"{attr} is not public in gf2codes.{module_name}"
            assert getattr(gf2codes, attr) is getattr(module, attr)
    everything = [n for names in gf2codes._EXPORTS.values() for n in names]
    assert len(everything) == len(set(everything)), "a top-level name is listed twice"
    assert sorted(gf2codes.__all__) == sorted(["__version__", *everything])


def test_internals_stay_in_their_modules():
    """Issue 13: these were re-exported at the top and are not for users."""
    for internal in ("MIGRATIONS", "SCHEMA_VERSION", "human_seconds", "check_int", "pack",
                     "words_for", "subspace_digest", "INVARIANT_SCHEME", "EntryRecord"):
        assert internal not in gf2codes.__all__
        with pytest.raises(AttributeError):
            getattr(gf2codes, internal)


def test_exceptions_derive_from_builtins():
    from gf2codes.exceptions import (
        CatalogError,
        Gf2CodesError,
        ParameterError,
        ParseError,
        TooExpensiveError,
    )

    assert issubclass(ParseError, ValueError) and issubclass(ParameterError, ValueError)
    assert issubclass(CatalogError, RuntimeError) and issubclass(TooExpensiveError, RuntimeError)
    from gf2codes.exceptions import ClaimError, MissingDependencyError

    for cls in (ParseError, ParameterError, CatalogError, TooExpensiveError, ClaimError,
                MissingDependencyError):
        assert issubclass(cls, Gf2CodesError) and cls.__doc__


def test_version():
    assert gf2codes.__version__.count(".") == 2


def test_no_name_is_exported_twice():
    seen = {}
    for name in [m for m in MODULES if m not in ("report", "typing")]:
        module = importlib.import_module(f"gf2codes.{name}")
        for attr in module.__all__:
            assert attr not in seen, f"{attr} is exported by {seen.get(attr)} and {name}"
            seen[attr] = name
