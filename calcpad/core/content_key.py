"""A digest of what a value holds, for caches keyed by content (drawings, scratch sheets).

Two values get the same key only when their exact, complete descriptions are equal: numbers by
their exact ``repr``, numpy arrays by dtype, shape and bytes (their ``repr`` elides), mappings,
sequences and dataclasses item by item, other objects by their type and attributes. A value that
cannot be described exactly (an object that prints only its address, a cycle, a very deep
nesting) has no key: :func:`content_key` returns ``None`` and the caller does not cache.
"""

from __future__ import annotations

import dataclasses
import hashlib
from typing import Any

import numpy as np

__all__ = ["content_key"]

_PLAIN = (str, bytes, int, float, complex, bool, type(None))
_DEPTH = 12


class _NoKeyError(Exception):
    pass


def _describe(v: Any, depth: int) -> Any:
    if depth > _DEPTH:
        raise _NoKeyError
    if isinstance(v, _PLAIN):
        return v
    if isinstance(v, np.ndarray):
        return ("ndarray", v.dtype.str, v.shape, v.tobytes())
    if isinstance(v, np.generic):
        return ("numpy", v.dtype.str, v.tobytes())
    if isinstance(v, dict):
        return ("dict", tuple((_describe(k, depth + 1), _describe(x, depth + 1)) for k, x in v.items()))
    if isinstance(v, (list, tuple, set, frozenset)):
        items = sorted(v, key=repr) if isinstance(v, (set, frozenset)) else v
        return (type(v).__name__, tuple(_describe(x, depth + 1) for x in items))
    if type(v).__name__ in ("Quantity", "Unit") and hasattr(v, "_units"):  # pint: not its registry
        return (type(v).__name__, _describe(getattr(v, "_magnitude", None), depth + 1), repr(v._units))
    if isinstance(v, type):
        return ("type", v.__module__, v.__qualname__)
    if dataclasses.is_dataclass(v):
        return (type(v).__qualname__, tuple((f.name, _describe(getattr(v, f.name), depth + 1)) for f in dataclasses.fields(v)))
    text = repr(v)
    if " at 0x" not in text and not text.startswith("<"):
        return (type(v).__qualname__, text)  # e.g. a pint quantity or unit: its repr is exact
    attrs = getattr(v, "__dict__", None)
    if attrs is None:
        raise _NoKeyError
    return (type(v).__module__, type(v).__qualname__, _describe(attrs, depth + 1))


def content_key(*parts: Any) -> str | None:
    """SHA-256 of the exact description of ``parts``, or ``None`` when some part has none."""
    try:
        described = _describe(parts, 0)
    except (_NoKeyError, RecursionError):
        return None
    return hashlib.sha256(repr(described).encode()).hexdigest()
