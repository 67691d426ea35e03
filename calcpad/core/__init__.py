"""The calc engine: units, formulas, sheets, the result model and compiled evaluation.

Knows nothing of engineering, Jupyter, widgets or files.
"""

from __future__ import annotations

from calcpad.core.errors import CalcpadError, DimensionError, FormulaError, NonFiniteError, SheetError, UnitInputError
from calcpad.core.formula import parse_condition, parse_formula
from calcpad.core.results import NG, OK, SheetResult
from calcpad.core.sheet import Sheet
from calcpad.core.units import Q_, DisplayPrefs, format_number, parse_quantity, parse_unit, ureg

__all__ = [
    "NG",
    "OK",
    "Q_",
    "CalcpadError",
    "DimensionError",
    "DisplayPrefs",
    "FormulaError",
    "NonFiniteError",
    "Sheet",
    "SheetError",
    "SheetResult",
    "UnitInputError",
    "format_number",
    "parse_condition",
    "parse_formula",
    "parse_quantity",
    "parse_unit",
    "ureg",
]
