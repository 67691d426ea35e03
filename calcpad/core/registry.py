"""The one shared pint unit registry, with the trade units pint does not define.

Import it as :data:`calcpad.core.units.ureg` (re-exported there); no second registry is ever made.
"""

from __future__ import annotations

import hashlib
import os
import pickle
from pathlib import Path

import pint

__all__ = ["Q_", "Quantity", "ureg"]


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
