"""calcpad: traceable, unit-safe engineering calc sheets for Jupyter.

Build a :class:`~calcpad.core.sheet.Sheet` of givens, steps, branches and checks; show it in a
notebook (LaTeX), print it (text, Markdown), export it (self-contained HTML with MathML) or
record it (JSON). Heavy modules (pandas, widgets, plotting, notebook tooling) load lazily.
"""

from __future__ import annotations

from calcpad.core.errors import CalcpadError
from calcpad.core.sheet import Sheet, calc_heading
from calcpad.core.units import Q_, parse_quantity, ureg

__all__ = ["Q_", "CalcpadError", "Sheet", "__version__", "calc_heading", "parse_quantity", "ureg"]

__version__ = "0.1.0"
