"""The one shared pint unit registry, with the trade units pint does not define.

Import it as :data:`calcpad.core.units.ureg` (re-exported there); no second registry is ever made.
"""

from __future__ import annotations

import pint

__all__ = ["Q_", "Quantity", "ureg"]

ureg: pint.UnitRegistry = pint.UnitRegistry(
    autoconvert_offset_to_baseunit=True,
    cache_folder=":auto:",  # parsed definitions cached on disk: ~0.3 s faster start-up
)
ureg.formatter.default_sort_func = None  # keep kip·ft, not ft·kip
# Trade units that pint does not define (common practice).
ureg.define("psf = pound_force / foot ** 2")
ureg.define("ksf = kip / foot ** 2")
ureg.define("plf = pound_force / foot")
ureg.define("klf = kip / foot")
ureg.define("pcf = pound / foot ** 3")
ureg.define("kipf = kip")  # alias some engineers type

Q_ = ureg.Quantity
Quantity = pint.Quantity
