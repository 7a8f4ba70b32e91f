"""The exception hierarchy of gf2codes.

Every error that gf2codes raises on purpose derives from :class:`Gf2CodesError`
and from the built-in exception it most resembles, so callers may catch either.
The command line catches :class:`Gf2CodesError` and prints its message as one
line, then exits with status 2.

Messages follow one template: the argument's name, the rule, the value received,
for example ``Argument 'd' must be at least 1, not 0.``
"""

from __future__ import annotations

__all__ = [
    "Gf2CodesError",
    "ParseError",
    "ParameterError",
    "CatalogError",
    "TooExpensiveError",
    "ClaimError",
    "MissingDependencyError",
    "check_int",
]


class Gf2CodesError(Exception):
    """Base class of every error raised on purpose by gf2codes."""


class ParseError(Gf2CodesError, ValueError):
    """A file or string could not be read as a matrix, polynomial or code record.

    The message names the file (or ``<string>``) and, where it applies, the line.
    """


class ParameterError(Gf2CodesError, ValueError):
    """An argument is out of range, of the wrong kind, or impossible to satisfy."""


class CatalogError(Gf2CodesError, RuntimeError):
    """The catalog database is missing, corrupt, locked, or of a newer schema."""


class TooExpensiveError(Gf2CodesError, RuntimeError):
    """A computation would take far longer than is reasonable without a time limit.

    The message states the estimated work and what to do instead; ``work`` (the
    estimated number of codewords) and ``seconds`` (the estimated time on one core)
    are kept as attributes when known.
    """

    def __init__(self, message: str, *, work: float | None = None,
                 seconds: float | None = None) -> None:
        super().__init__(message)
        self.work = work
        self.seconds = seconds


class ClaimError(Gf2CodesError, ValueError):
    """A stated bound on a code's minimum distance is contradicted by proof.

    The bound came from the code's construction or from the file it was read from;
    the message says which value was claimed and what was proved.
    """


class MissingDependencyError(Gf2CodesError, ImportError):
    """An optional dependency (matplotlib, dask) is not installed; the message gives
    the command that installs it."""


def check_int(name: str, value: object, *, minimum: int | None = None,
              maximum: int | None = None) -> int:
    """Validate an integer argument and return it as ``int``.

    Raises :class:`ParameterError` with the project's message template.
    """
    import numbers

    if isinstance(value, bool) or not isinstance(value, numbers.Integral):
        raise ParameterError(f"Argument {name!r} must be an integer, not {value!r}.")
    value = int(value)
    if minimum is not None and value < minimum:
        raise ParameterError(f"Argument {name!r} must be at least {minimum}, not {value}.")
    if maximum is not None and value > maximum:
        raise ParameterError(f"Argument {name!r} must be at most {maximum}, not {value}.")
    return value
