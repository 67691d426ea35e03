"""The one shared pint unit registry, with the trade units pint does not define.

Import it as :data:`calcpad.core.units.ureg` (re-exported there); no second registry is ever made.
"""

from __future__ import annotations

import copy
import functools
import hashlib
import os
import pickle
from pathlib import Path
from typing import Any

import pint

__all__ = ["Q_", "Quantity", "base_factor", "conversion_factor", "copy_quantity", "ureg"]


def _cache_folder() -> Path:
    """pint's on-disk cache of parsed definitions, one folder per pint installation.

    pint keys a cached file by its content, and the cached ``default_en.txt`` names the absolute
    path of the ``constants_en.txt`` it imports: one cache shared by two virtual environments
    makes the second read the first's files, and fails once that environment is gone.
    """
    base = Path(os.environ.get("XDG_CACHE_HOME") or Path.home() / ".cache")
    where = f"{Path(pint.__file__).resolve().parent}|{pint.__version__}".encode()
    return base / "calcpad" / "pint" / hashlib.sha256(where).hexdigest()[:16]


def _make_registry() -> pint.UnitRegistry:
    try:  # parsed definitions cached on disk: ~0.3 s faster start-up
        return pint.UnitRegistry(autoconvert_offset_to_baseunit=True, cache_folder=_cache_folder())
    except (OSError, EOFError, ValueError, pickle.UnpicklingError):  # an unwritable or damaged cache: parse the files
        return pint.UnitRegistry(autoconvert_offset_to_baseunit=True)


ureg: pint.UnitRegistry = _make_registry()
ureg.formatter.default_sort_func = None  # keep kip·ft, not ft·kip
# Trade units that pint does not define (common practice).
ureg.define("psf = pound_force / foot ** 2")
ureg.define("ksf = kip / foot ** 2")
ureg.define("plf = pound_force / foot")
ureg.define("klf = kip / foot")
ureg.define("pcf = pound / foot ** 3")
ureg.define("kipf = kip")  # alias some engineers type
# A quantity unpickled (a template sent to a Dask worker holds some in its parameter bounds) joins
# pint's application registry: left unset, that is a second registry, parsed from pint's files
# without the cache (0.1-0.7 s per process, measured on a worker's first chunk), whose quantities
# cannot be compared with ours.
pint.set_application_registry(ureg)

Q_ = ureg.Quantity
Quantity = pint.Quantity


def copy_quantity(q: pint.Quantity) -> pint.Quantity:
    """A copy of ``q`` that changing in place (``ito``) leaves ``q`` alone: a new Quantity object
    with the same units and a copy of an array magnitude (a scalar is immutable, shared). The
    same object ``copy.copy`` makes, without pint's constructor checks (a value is copied on
    every read of a sheet)."""
    new = object.__new__(type(q))
    new.__dict__.update(q.__dict__)
    mag = q._magnitude
    if not isinstance(mag, (float, int)):
        new._magnitude = copy.copy(mag)
    return new


@functools.lru_cache(maxsize=4096)
def conversion_factor(src: Any, dst: Any) -> float | None:
    """What pint multiplies a magnitude by to convert from the units container ``src`` to
    ``dst`` (its ``convert`` is ``value * factor`` for multiplicative units), None when the two
    are equal (pint leaves the value as it is). Raises pint's DimensionalityError, and
    ValueError for offset units (their conversion is not a factor)."""
    if src == dst:
        return None
    for units in (src, dst):
        if Q_(1.0, units)._get_non_multiplicative_units():
            raise ValueError(f"{units} is an offset unit: no conversion factor")
    return float(ureg.convert(1.0, src, dst))


@functools.lru_cache(maxsize=4096)
def base_factor(src: Any) -> float | None:
    """:func:`conversion_factor` from ``src`` to its base units (``to_base_units``); None for
    units already in base units. Raises ValueError for offset units."""
    return conversion_factor(src, Q_(1.0, src).to_base_units()._units)
