"""Read engineering inputs at the boundary: quantities or strings with units, or plain numbers
taken in a stated unit. Inside the analysis everything is a float in consistent units."""

from __future__ import annotations

import math
from typing import Any

import numpy as np
import pint

from calcpad.core.errors import InputError
from calcpad.core.units import parse_quantity

__all__ = ["require_positive", "to_array", "to_float"]


def to_float(value: Any, unit: str, field: str) -> float:
    """Return ``value`` as a float in ``unit``.

    Args:
        value: A pint quantity, a string such as ``"12 ft"`` or a plain number (taken in ``unit``).
        unit: The unit the float is wanted in.
        field: Name of the input, used in error messages.

    Raises:
        InputError: The value is not a finite number or has the wrong dimension.
    """
    if isinstance(value, bool) or value is None:
        raise InputError(f"{field}: got {value!r}; expected a number or a value with a unit like '1 {unit}'")
    if isinstance(value, (str, pint.Quantity)):
        q = parse_quantity(value, field, expected=unit)
        out = q.to(unit).magnitude
    elif isinstance(value, (int, float, np.integer, np.floating)):
        out = value
    else:
        raise InputError(
            f"{field}: got {value!r} ({type(value).__name__}); expected a number or a value with a unit like '1 {unit}'"
        )
    try:
        out = float(out)
    except TypeError:
        raise InputError(f"{field}: got {value!r}; expected a single value, not an array") from None
    if not math.isfinite(out):
        raise InputError(f"{field}: got {value!r}; expected a finite number")
    return out


def to_array(value: Any, unit: str, field: str) -> np.ndarray:
    """Like :func:`to_float` but keeps arrays (numbers or a quantity wrapping an array)."""
    if isinstance(value, pint.Quantity):
        try:
            arr = np.asarray(value.to(unit).magnitude, dtype=float)
        except pint.DimensionalityError:
            raise InputError(f"{field}: got {value!r}; expected a value in units like '{unit}'") from None
    elif isinstance(value, str):
        arr = np.asarray(to_float(value, unit, field), dtype=float)
    else:
        try:
            arr = np.asarray(value, dtype=float)
        except (TypeError, ValueError):
            raise InputError(f"{field}: got {value!r}; expected numbers or values with a unit like '{unit}'") from None
    if not np.all(np.isfinite(arr)):
        raise InputError(f"{field}: got {value!r}; expected finite numbers")
    return arr


def require_positive(x: float, field: str, raw: Any = None, *, allow_zero: bool = False) -> float:
    """Raise :class:`InputError` unless ``x`` > 0 (or >= 0 with ``allow_zero``)."""
    if x < 0 or (x == 0 and not allow_zero):
        shown = raw if raw is not None else x
        want = "zero or more" if allow_zero else "greater than zero"
        raise InputError(f"{field}: got {shown!r}; expected a value {want}")
    return x
