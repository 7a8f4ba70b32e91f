"""The public surface: every name in a module's __all__ exists and is re-exported."""

from __future__ import annotations

import importlib

import pytest

import gf2codes

MODULES = ["code", "linalg", "distance", "weights", "bounds", "families", "derive", "formats",
           "parallel", "search", "decoding", "export", "catalog", "exceptions"]


@pytest.mark.parametrize("name", MODULES)
def test_all_names_exist_and_are_reexported(name):
    module = importlib.import_module(f"gf2codes.{name}")
    assert module.__all__, f"gf2codes.{name} has an empty __all__"
    for attr in module.__all__:
        assert hasattr(module, attr), f"gf2codes.{name}.{attr} is listed but missing"
        assert getattr(gf2codes, attr) is getattr(module, attr)


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
    for name in MODULES:
        module = importlib.import_module(f"gf2codes.{name}")
        for attr in module.__all__:
            assert attr not in seen, f"{attr} is exported by {seen.get(attr)} and {name}"
            seen[attr] = name
