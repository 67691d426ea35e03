"""The JSON record of a sheet: every input, result and check ratio, in stated units.

Format (``"format": "calcpad-record/1"``)::

    {"format": ..., "title": ..., "system": "US", "method": "ASD", "digest": sha256-of-givens,
     "meta": {...},
     "inputs":  {name: {"value": float, "unit": "in", "description": ...}},
     "results": {name: {"value": float, "unit": "kip*ft"}},
     "assumptions": [text, ...],   # declared with Sheet.assume, for a design basis section
     "checks":  [{"key", "title", "demand": {value, unit}, "capacity": {value, unit},
                  "demand_signed", "nominal_capacity",
                  "ratio", "status", "fs", "required_fs", "ref"}]}

In a check, ``ratio == demand / capacity``: ``demand`` is the magnitude (``demand_signed`` keeps
the sign), in the capacity's unit; for a factor-of-safety check ``capacity`` is the allowable
value (nominal / required FS) and ``nominal_capacity`` the value before the factor.

Values are in the unit shown on the sheet (unit strings use pint's ASCII abbreviations).
"""

from __future__ import annotations

from typing import Any

import pint

from calcpad.core.results import BranchResult, CheckResult, FormulaResult, GivenResult, SelectResult, SheetResult
from calcpad.core.units import unit_symbol

__all__ = ["RECORD_FORMAT", "quantity_record", "sheet_record"]

RECORD_FORMAT = "calcpad-record/1"


def quantity_record(q: pint.Quantity) -> dict[str, Any]:
    """``{"value": 1.75, "unit": "kip*ft"}``."""
    return {"value": float(q.magnitude), "unit": unit_symbol(q, "ascii")}  # reads q's units (no Unit object made)


def sheet_record(result: SheetResult) -> dict[str, Any]:
    """Build the record dictionary for one evaluated sheet."""
    inputs: dict[str, Any] = {}
    results: dict[str, Any] = {}
    checks: list[dict[str, Any]] = []
    for s in result.steps:
        if isinstance(s, GivenResult):
            inputs[s.name] = {**quantity_record(s.value), "description": s.description}
        elif isinstance(s, (FormulaResult, SelectResult)):
            results[s.name] = quantity_record(s.value)
        elif isinstance(s, BranchResult):
            results[s.name] = {**quantity_record(s.value), "case": s.cases[s.chosen].label}
        elif isinstance(s, CheckResult):
            # ratio = demand / capacity in the record: the demand's magnitude, and for a
            # factor-of-safety check the allowable capacity / required FS
            capacity = s.capacity.to(s.demand.units)
            allowable = capacity / s.required_fs if s.required_fs is not None else capacity
            checks.append(
                {
                    "key": s.key,
                    "title": s.title,
                    "demand": quantity_record(abs(s.demand)),
                    "capacity": quantity_record(allowable),
                    "demand_signed": quantity_record(s.demand),
                    "nominal_capacity": quantity_record(capacity),
                    "ratio": s.ratio,
                    "status": s.status,
                    "fs": s.fs,
                    "required_fs": s.required_fs,
                    "ref": s.ref,
                }
            )
    return {
        "format": RECORD_FORMAT,
        "title": result.title,
        "system": result.system,
        "method": result.method,
        "digest": result.digest,
        "meta": dict(result.meta),
        "inputs": inputs,
        "results": results,
        "checks": checks,
        "assumptions": result.assumptions,
    }
