"""Kernels compiled on first use: how every numba kernel of gf2codes is declared.

Importing a kernel module costs nothing: neither numba nor any compiled code is
loaded. A kernel is declared with :func:`kernel` (an explicit numba signature, or
none for a small helper that is always inlined into its callers) and becomes a
:class:`Kernel`: a plain Python object that compiles itself — or, far more often,
loads its machine code from numba's on-disk cache (``cache=True``) — the first
time it is called, for exactly its declared signature. A command therefore pays
only for the kernels it uses, and ``gf2codes --help`` pays for none.

Kernels call each other as ordinary globals: numba is taught (once, when it is
first imported here) that a :class:`Kernel` found as a global while compiling
another kernel is typed as its compiled dispatcher. An LLVM intrinsic is declared
with :func:`intrinsic` and bound into the kernel module's namespace when the first
kernel that names it is compiled. Explicit
signatures keep their two jobs: the compiled code is specialised exactly as
declared (unsigned 64-bit words stay unsigned), and a call with other argument
types is converted to the declared ones instead of compiling a new
specialisation.

A kernel may have a NumPy twin for small calls (:attr:`Kernel.small`): a command that
only meets small codes then never imports numba, which costs far more than its work.

Python callers may use ``kernel(...)`` directly (one extra Python call, about
0.1 µs) or take ``kernel.dispatcher`` once before a hot loop.
"""

from __future__ import annotations

import threading
from collections.abc import Callable
from typing import Any

__all__ = ["Kernel", "LazyIntrinsic", "kernel", "intrinsic", "numba_loaded", "SMALL_CALLS"]

_lock = threading.RLock()

#: Calls a kernel's NumPy twin serves (each at most about a millisecond of work) before
#: the kernel is compiled or loaded anyway.
SMALL_CALLS = 256
_registered = False


def _numba() -> Any:
    """Import numba (once) and register the typing of lazy kernels and intrinsics."""
    global _registered
    import numba
    from numba.extending import typeof_impl

    if not _registered:
        with _lock:
            if not _registered:

                @typeof_impl.register(Kernel)
                def _typeof_kernel(val: Kernel, c: Any) -> Any:
                    return numba.types.Dispatcher(val.dispatcher)

                _registered = True
    return numba


def numba_loaded() -> bool:
    """Whether numba has been imported in this process (a start-up guard for tests)."""
    import sys

    return "numba" in sys.modules


class Kernel:
    """A numba kernel compiled, or loaded from numba's cache, on its first call.

    Parameters
    ----------
    func : callable
        The plain-Python body (numba's subset of Python).
    signature : str or None
        The explicit numba signature, as a string (for example
        ``"int64[::1](uint64[:, ::1], int64)"``), or None for a helper that is only
        called from other kernels and typed by them.
    options : dict
        Further options for ``numba.njit``; ``cache=True`` unless given (only code
        that numba cannot cache, such as a doctest, turns it off).
    """

    def __init__(self, func: Callable[..., Any], signature: str | None,
                 options: dict[str, Any]) -> None:
        self.py_func = func
        self.signature = signature
        self.options = {"cache": True, **options}
        self._dispatcher: Any = None
        #: An optional NumPy twin for small calls, set by the kernel module: called with
        #: the kernel's arguments, it returns the kernel's result, or None when the call
        #: is too large for it. It serves at most ``SMALL_CALLS`` calls, and only while
        #: the kernel is not compiled, so a hot loop soon gets the compiled code.
        self.small: Callable[..., Any] | None = None
        self._small_calls = 0
        self.__name__ = func.__name__
        self.__qualname__ = func.__qualname__
        self.__doc__ = func.__doc__
        self.__module__ = func.__module__
        self.__wrapped__ = func

    @property
    def dispatcher(self) -> Any:
        """The compiled numba dispatcher (compiled or loaded from the cache on first use)."""
        d = self._dispatcher
        if d is None:
            with _lock:
                d = self._dispatcher
                if d is None:
                    numba = _numba()
                    _bind_intrinsics(self.py_func)
                    jit = numba.njit(**self.options)
                    if self.signature is not None:
                        jit = numba.njit(self.signature, **self.options)
                    d = jit(self.py_func)
                    self._dispatcher = d
        return d

    @property
    def targetoptions(self) -> dict[str, Any]:
        """The options as numba reads them from a dispatcher: a kernel declared with
        ``inline="always"`` is inlined into the numba IR of every kernel that calls it
        (numba looks for ``targetoptions`` on the global it calls), so its loop and its
        array arguments cost no call."""
        return self.options

    @property
    def compiled(self) -> bool:
        """Whether this kernel has been compiled or loaded in this process."""
        return self._dispatcher is not None

    def __call__(self, *args: Any) -> Any:
        d = self._dispatcher
        if d is None:
            if self.small is not None and self._small_calls < SMALL_CALLS:
                self._small_calls += 1
                out = self.small(*args)
                if out is not None:
                    return out
            d = self.dispatcher
        return d(*args)

    def __repr__(self) -> str:
        state = "loaded" if self.compiled else "not loaded"
        return f"<gf2codes kernel {self.__module__}.{self.__name__} ({state})>"


def _bind_intrinsics(func: Callable[..., Any]) -> None:
    """Replace each :class:`LazyIntrinsic` that ``func`` names by the built intrinsic.

    numba looks a kernel's globals up in its module's namespace while compiling it,
    so the binding is made there, once; from then on the module holds the intrinsic
    itself.
    """
    namespace = func.__globals__
    for name in func.__code__.co_names:
        value = namespace.get(name)
        if isinstance(value, LazyIntrinsic):
            namespace[name] = value.resolve()
        elif (isinstance(value, Kernel) and value.options.get("inline") == "always"
              and value.py_func is not func):
            _bind_intrinsics(value.py_func)  # its body is inlined: its names are read too


def kernel(signature: str | None = None, **options: Any) -> Callable[[Callable[..., Any]], Kernel]:
    """Declare a numba kernel compiled on first use (see the module docstring).

    >>> @kernel("int64(int64)", cache=False)  # a doctest has no file to cache in
    ... def twice(x):
    ...     return 2 * x
    >>> twice.compiled
    False
    >>> twice(21)
    42
    """

    def wrap(func: Callable[..., Any]) -> Kernel:
        return Kernel(func, signature, options)

    return wrap


class LazyIntrinsic:
    """An LLVM intrinsic for kernels, built with ``numba.extending.intrinsic`` on first use.

    ``make`` receives the numba module and returns the intrinsic object.
    """

    def __init__(self, make: Callable[[Any], Any]) -> None:
        self._make = make
        self._value: Any = None
        self.__name__ = make.__name__

    def resolve(self) -> Any:
        """The numba intrinsic (built on first use)."""
        if self._value is None:
            with _lock:
                if self._value is None:
                    self._value = self._make(_numba())
        return self._value


def intrinsic(make: Callable[[Any], Any]) -> LazyIntrinsic:
    """Declare an intrinsic whose numba definition is built on first use."""
    return LazyIntrinsic(make)
