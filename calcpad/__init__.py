"""calcpad: traceable, unit-safe engineering calc sheets for Jupyter.

Build a :class:`~calcpad.core.sheet.Sheet` of givens, steps, branches and checks; show it in a
notebook (LaTeX), print it (text, Markdown), export it (self-contained HTML with MathML) or
record it (JSON). Heavy modules (pandas, widgets, plotting, notebook tooling) load lazily.
"""

from __future__ import annotations

import importlib
from typing import TYPE_CHECKING, Any

if TYPE_CHECKING:
    from calcpad.core.errors import CalcpadError
    from calcpad.core.sheet import Sheet, calc_heading
    from calcpad.core.units import Q_, parse_quantity, ureg

__all__ = ["Q_", "CalcpadError", "Sheet", "__version__", "calc_heading", "parse_quantity", "ureg"]

__version__ = "0.1.0"

# Loaded on first use (PEP 562), so `import calcpad.cli` starts fast and the command line can
# report a Ctrl-C during start-up as "interrupted" instead of a traceback.
_LAZY = {"CalcpadError": "calcpad.core.errors", "Sheet": "calcpad.core.sheet", "calc_heading": "calcpad.core.sheet", "Q_": "calcpad.core.units", "parse_quantity": "calcpad.core.units", "ureg": "calcpad.core.units"}


def __getattr__(name: str) -> Any:
    if name in _LAZY:
        value = getattr(importlib.import_module(_LAZY[name]), name)
        globals()[name] = value
        return value
    raise AttributeError(f"module 'calcpad' has no attribute {name!r}")
