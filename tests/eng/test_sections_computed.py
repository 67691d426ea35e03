"""Computed geometry of every family against the AISC Shapes Database v16.0 (Build item 2 of issue 14).

The properties a shop size gets (the shape classes with fillets and toe radii, computed from the
dimensions) are compared with the published values of a sample of every family (every
``STEP[family]``-th row of the data files the catalog ships, which hold the AISC Shapes Database
v16.0 values; independent of calcpad's code). A property agrees when it is within 1 % plus half a
unit of the table's third figure. C_w of I-shapes and C_w, x_o of channels are compared as the
checks compute them for a computed section (``_warping``). Models:

* W, M, HP: :class:`RolledIShape`, fillet r = k_des - t_f, parallel flanges; J by El Darwish and
  Johnston with the T-junction alpha (:func:`~calcpad.eng.sections.rolled.tee_junction`).
* WT, MT: :class:`RolledTee`, fillet r = k_des - t_f; J likewise (one junction).
* S, ST: :class:`SlopedIShape`, :class:`SlopedTee`: 2:12 flange slope, r1 = k_des less the flange
  thickness at the web face, toe radius r1/2; J a lower bound (junctions neglected).
* C: :class:`RolledChannel`, 1:6 flange slope, default radii; MC: parallel flanges, default radii.
* L: :class:`RolledAngle` with its default radii: the radii of the AISC series with those legs
  (``angle_series``, inferred from this same v16.0 table: J's root fillet from the tabulated J,
  the outline's root fillet and toe radius from A, I, S, Z, one set per series, so this part is a
  calibration check; J is also checked with the table's own fillet below); dimensions from the
  designation (the tables print t to three figures). The plain rule for other legs is measured
  in ``ANGLE_SPREAD``.
* 2L: two of those angles back to back at the row's spacing (:class:`BuiltUp`).
* rectangular/square HSS: :class:`RectTube`, design wall, outside corner radius 2 t_des.
* round HSS, pipe: :class:`RoundTube`, design wall; OD from the designation for round HSS.

Rows a model does not bring within 1 % are strict xfails naming the measured deviations
(``KNOWN_MISSES``, written from a measurement on this branch), so an improvement shows as XPASS.
"""

from __future__ import annotations

import csv
import importlib.resources
import math
import re
from fractions import Fraction

import pytest

from calcpad.eng.checks._section import channel_warping
from calcpad.eng.sections import BuiltUp
from calcpad.eng.sections.rolled import RolledAngle, RolledChannel, RolledIShape, RolledTee
from calcpad.eng.sections.rolled_sloped import SlopedIShape, SlopedTee
from calcpad.eng.sections.shapes import RectTube, RoundTube

TOL = 0.01
STEP = {"w": 12, "m": 2, "s": 3, "hp": 3, "wt": 12, "mt": 2, "st": 3, "c": 3, "mc": 4, "l": 5, "2l": 25,
        "hss_rect": 20, "hss_round": 8, "pipe": 4}
I_PROPS = ("A", "Ix", "Iy", "Sx", "Sy", "Zx", "Zy", "rx", "ry", "J")
PROPS = {"w": I_PROPS, "m": I_PROPS, "s": I_PROPS, "hp": I_PROPS, "wt": I_PROPS, "mt": I_PROPS, "st": I_PROPS,
         "c": I_PROPS, "mc": I_PROPS, "l": ("A", "Ix", "Iy", "Sx", "Sy", "Zx", "Zy", "rx", "ry", "Iz", "rz", "J"),
         "2l": ("A", "Ix", "Sx", "Zx", "rx", "Iy", "ry"), "hss_rect": I_PROPS + ("C",),
         "hss_round": ("A", "Ix", "Sx", "Zx", "rx", "J"), "pipe": ("A", "Ix", "Sx", "Zx", "rx", "J")}
#: Families whose computed J is a documented lower bound (junctions neglected): J is checked to be
#: not above the table (conservative) instead of within 1 %.
J_LOWER_BOUND = ("s", "st")
#: Table column -> our property name where they differ.
OURS = {"Iz": "I_min", "rz": "r_min"}


def _rows(family: str) -> list[dict[str, str]]:
    text = (importlib.resources.files("calcpad.eng.sections") / "data" / f"aisc_{family}.csv").read_text(encoding="utf-8")
    return list(csv.DictReader(ln for ln in text.splitlines() if ln.strip() and not ln.startswith("#")))


def _frac(text: str) -> float:
    whole, _, part = text.partition("-")
    return float(whole) + float(Fraction(part)) if part else float(Fraction(whole))


def _angle_dims(designation: str) -> tuple[float, float, float]:
    d, b, t = re.sub(r"(LLBB|SLBB)", "", re.sub(r"^2?L", "", designation)).split("x")[:3]
    return _frac(d), _frac(b), _frac(t)


def _model(family: str, r: dict[str, str]):
    f = {k: float(v) for k, v in r.items() if k not in ("designation", "legs") and v.strip()}
    if family in ("s", "st"):
        cls = SlopedIShape if family == "s" else SlopedTee
        t_web = cls(f["d"], f["bf"], f["tf"], f["tw"]).t_web
        return cls(f["d"], f["bf"], f["tf"], f["tw"], max(f["k_des"] - t_web, 0.0))
    if family in ("w", "m", "hp"):
        return RolledIShape(f["d"], f["bf"], f["tf"], f["tw"], max(f["k_des"] - f["tf"], 0.0))
    if family in ("wt", "mt"):
        return RolledTee(f["d"], f["bf"], f["tf"], f["tw"], max(f["k_des"] - f["tf"], 0.0))
    if family == "c":
        return RolledChannel(f["d"], f["bf"], f["tf"], f["tw"], slope=1 / 6)
    if family == "mc":
        return RolledChannel(f["d"], f["bf"], f["tf"], f["tw"])
    if family == "l":
        return RolledAngle(*_angle_dims(r["designation"]))
    if family == "2l":
        d, b, t = _angle_dims(r["designation"])
        v, h = (d, b) if r["legs"] != "SLBB" else (min(d, b), max(d, b))
        s = f["s"]
        return (BuiltUp(r["designation"]).add(RolledAngle(v, h, t), at=(h, 0.0), mirror=True)
                .add(RolledAngle(v, h, t), at=(h + s, 0.0)))
    if family == "hss_rect":
        return RectTube(f["Ht"], f["B"], f["t_des"])
    if family == "hss_round":
        return RoundTube(float(r["designation"][3:].split("x")[0]), f["t_des"])
    return RoundTube(f["OD"], f["t_des"])


def _close(ours: float, printed: float) -> bool:
    half_unit = 0.5 * 10.0 ** (math.floor(math.log10(abs(printed))) - 2)
    return abs(ours - printed) <= half_unit + TOL * abs(printed)


def _warping(family: str, r: dict[str, str], p) -> dict[str, float]:
    """C_w (and x_o of channels) as the checks compute them for a section that does not carry them:
    I-shapes C_w = I_y h_o²/4 with h_o = d - t_f (AISC 360-16 F2 User Note, ``checks/flexure.py``);
    channels the thin-wall C_w and x_o of ``checks/_section.py``, with our I_y and x̄."""
    f = {k: float(r[k]) for k in ("d", "bf", "tf", "tw")}
    if family in ("w", "m", "s", "hp"):
        return {"Cw": p.Iy * (f["d"] - f["tf"]) ** 2 / 4.0}
    cw, xo = channel_warping(f["d"], f["bf"], f["tf"], f["tw"], p.xc)
    return {"Cw": cw, "x_o": xo, "x_o_table": float(r["x_bar"]) + float(r["e_o"])}


def deviations(family: str, r: dict[str, str]) -> list[str]:
    """Properties of row ``r`` the model does not reproduce within 1 %, with the numbers."""
    p = _model(family, r).props
    extra = _warping(family, r, p) if family in ("w", "m", "s", "hp", "c", "mc") else {}
    bad = []
    if "x_o" in extra and not _close(extra["x_o"], extra["x_o_table"]):
        bad.append(f"x_o {extra['x_o']:.4g} vs x̄ + e_o = {extra['x_o_table']:g} "
                   f"({(extra['x_o'] / extra['x_o_table'] - 1) * 100:+.1f} %)")
    for col in PROPS[family] + (("Cw",) if extra else ()):
        text = r.get(col, "").strip()
        if not text or float(text) == 0.0:
            continue
        got, printed = float(extra[col] if col in extra else getattr(p, OURS.get(col, col))), float(text)
        if col == "J" and family in J_LOWER_BOUND:
            if got > printed:
                bad.append(f"J {got:.4g} above the table's {printed:g} (documented as a lower bound)")
            continue
        if not _close(got, printed):
            bad.append(f"{col} {got:.4g} vs {printed:g} ({(got / printed - 1) * 100:+.1f} %)")
    return bad


def sample(family: str) -> list[dict[str, str]]:
    return _rows(family)[:: STEP[family]]


#: Sample rows outside 1 % (measured on this branch; see DEVELOPERS.md, "Computed geometry").
KNOWN_MISSES: dict[str, str] = {
    "w:W18x130": "Iy 281.4 vs 278 (+1.2 %); Cw 2.305e+04 vs 22700 (+1.5 %)",
    "m:M12.5x12.4": "A 3.673 vs 3.63 (+1.2 %); Ix 90.36 vs 89.3 (+1.2 %); Sx 14.46 vs 14.2 (+1.8 %); J 0.05481 vs 0.0493 (+11.2 %)",
    "m:M12x11.8": "A 3.524 vs 3.47 (+1.6 %); Ix 73.81 vs 72.2 (+2.2 %); Sx 12.3 vs 12 (+2.5 %); Zx 14.6 vs 14.3 (+2.1 %); Zy 1.167 vs 1.15 (+1.5 %); J 0.05606 vs 0.05 (+12.1 %)",
    "m:M12x10": "A 2.992 vs 2.95 (+1.4 %); Ix 63.36 vs 61.7 (+2.7 %); Sx 10.56 vs 10.3 (+2.5 %); Zx 12.47 vs 12.2 (+2.2 %); J 0.03267 vs 0.0292 (+11.9 %)",
    "m:M10x8": "A 2.455 vs 2.37 (+3.6 %); Ix 36.47 vs 34.6 (+5.4 %); Sx 7.331 vs 6.95 (+5.5 %); Zx 8.608 vs 8.2 (+5.0 %); Zy 0.7255 vs 0.711 (+2.0 %); ry 0.4928 vs 0.5 (-1.4 %); J 0.03077 vs 0.0224 (+37.4 %)",
    "m:M8x6.5": "A 2.011 vs 1.92 (+4.7 %); Ix 19.8 vs 18.5 (+7.0 %); Sx 4.95 vs 4.63 (+6.9 %); Zx 5.774 vs 5.43 (+6.3 %); Zy 0.5441 vs 0.529 (+2.9 %); ry 0.4337 vs 0.443 (-2.1 %); J 0.02712 vs 0.0184 (+47.4 %)",
    "m:M6x4.4": "A 1.31 vs 1.29 (+1.6 %); Ix 7.344 vs 7.23 (+1.6 %); Sx 2.448 vs 2.41 (+1.6 %); Zx 2.846 vs 2.8 (+1.6 %); J 0.01087 vs 0.0099 (+9.8 %)",
    "m:M5x18.9": "J 0.332 vs 0.313 (+6.1 %)",
    "m:M4x4.08": "A 1.318 vs 1.27 (+3.8 %); Ix 3.68 vs 3.53 (+4.3 %); Sx 1.84 vs 1.77 (+4.0 %); Zx 2.081 vs 2 (+4.1 %); Zy 0.4617 vs 0.453 (+1.9 %); ry 0.4978 vs 0.506 (-1.6 %); J 0.01963 vs 0.0147 (+33.6 %)",
    "s:S3x5.7": "Zy 0.6471 vs 0.656 (-1.3 %)",
    "hp:HP14x89": "J 3.695 vs 3.59 (+2.9 %)",
    "hp:HP12x84": "J 4.368 vs 4.24 (+3.0 %)",
    "hp:HP12x53": "J 1.176 vs 1.12 (+5.0 %)",
    "hp:HP8x36": "A 10.84 vs 10.6 (+2.2 %); Ix 122.4 vs 119 (+2.9 %); Sx 30.53 vs 29.8 (+2.5 %); Zx 34.54 vs 33.6 (+2.8 %); J 0.909 vs 0.77 (+18.0 %)",
    "wt:WT12x47": "Ix 188.4 vs 186 (+1.3 %)",
    "mt:MT6.25x6.2": "J 0.02737 vs 0.0246 (+11.3 %)",
    "mt:MT6x5.9": "Zy 0.5834 vs 0.575 (+1.5 %); J 0.02793 vs 0.0249 (+12.2 %)",
    "mt:MT6x5": "J 0.01627 vs 0.0145 (+12.2 %)",
    "mt:MT5x4": "A 1.228 vs 1.19 (+3.2 %); Ix 3.156 vs 3.08 (+2.5 %); Zx 1.635 vs 1.61 (+1.5 %); Zy 0.3628 vs 0.354 (+2.5 %); ry 0.4927 vs 0.502 (-1.9 %); J 0.01535 vs 0.0112 (+37.1 %)",
    "mt:MT4x3.25": "A 1.005 vs 0.959 (+4.8 %); Ix 1.609 vs 1.57 (+2.5 %); Zy 0.2721 vs 0.264 (+3.1 %); rx 1.265 vs 1.29 (-1.9 %); ry 0.4337 vs 0.444 (-2.3 %); J 0.01353 vs 0.00917 (+47.5 %)",
    "mt:MT3x2.2": "A 0.655 vs 0.647 (+1.2 %); ry 0.3693 vs 0.374 (-1.3 %); J 0.005416 vs 0.00494 (+9.6 %)",
    "mt:MT2.5x9.45": "J 0.1649 vs 0.156 (+5.7 %)",
    "st:ST12x60.5": "Ix 262.2 vs 259 (+1.3 %)",
    "st:ST10x43": "Ix 126.2 vs 124 (+1.8 %)",
    "st:ST2x4.75": "Ix 0.4694 vs 0.462 (+1.6 %); Sx 0.3246 vs 0.319 (+1.7 %); Zx 0.5984 vs 0.592 (+1.1 %)",
    "st:ST1.5x2.85": "Ix 0.118 vs 0.114 (+3.5 %); Sx 0.1008 vs 0.097 (+3.9 %); Zx 0.2001 vs 0.196 (+2.1 %); Zy 0.3236 vs 0.328 (-1.3 %); rx 0.3763 vs 0.37 (+1.7 %)",
    "c:C15x50": "J 2.409 vs 2.65 (-9.1 %)",
    "c:C12x30": "J 0.7856 vs 0.861 (-8.8 %)",
    "c:C10x30": "J 1.12 vs 1.22 (-8.2 %)",
    "c:C9x13.4": "J 0.1647 vs 0.168 (-2.0 %)",
    "c:C8x11.5": "J 0.1269 vs 0.13 (-2.4 %)",
    "c:C7x9.8": "J 0.09614 vs 0.0996 (-3.5 %)",
    "c:C6x8.2": "J 0.07166 vs 0.0736 (-2.6 %)",
    "c:C4x7.25": "J 0.06977 vs 0.0817 (-14.6 %); Cw 1.22 vs 1.24 (-1.6 %)",
    "c:C4x4.5": "J 0.03112 vs 0.0306 (+1.7 %); Cw 0.7624 vs 0.778 (-2.0 %)",
    "c:C3x4.1": "Iy 0.1945 vs 0.191 (+1.8 %); Sy 0.1998 vs 0.196 (+2.0 %); ry 0.4038 vs 0.398 (+1.5 %); J 0.02449 vs 0.0269 (-9.0 %); Cw 0.3007 vs 0.307 (-2.1 %)",
    "mc:MC18x58": "Ix 666.6 vs 675 (-1.2 %); Iy 18.33 vs 17.6 (+4.1 %); Sx 74.07 vs 75 (-1.2 %); Sy 5.509 vs 5.28 (+4.3 %); Zx 94.26 vs 95.4 (-1.2 %); ry 1.041 vs 1.02 (+2.0 %); J 2.529 vs 2.81 (-10.0 %)",
    "mc:MC13x50": "x_o 1.852 vs x̄ + e_o = 1.789 (+3.5 %); Iy 19.42 vs 16.4 (+18.4 %); Sy 5.758 vs 4.77 (+20.7 %); Zy 11.06 vs 10.2 (+8.4 %); ry 1.153 vs 1.06 (+8.8 %); J 2.515 vs 2.96 (-15.0 %)",
    "mc:MC12x50": "Sx 44.35 vs 44.9 (-1.2 %); Zx 55.84 vs 56.5 (-1.2 %); J 2.891 vs 3.23 (-10.5 %)",
    "mc:MC12x31": "A 8.994 vs 9.12 (-1.4 %); Ix 198.9 vs 202 (-1.5 %); Sx 33.15 vs 33.7 (-1.6 %); Zx 39.06 vs 39.7 (-1.6 %); J 0.9103 vs 1 (-9.0 %); Cw 262.7 vs 267 (-1.6 %)",
    "mc:MC10x33.6": "A 9.759 vs 9.87 (-1.1 %); Ix 137.1 vs 139 (-1.4 %); Iy 13.69 vs 13.1 (+4.5 %); Sx 27.42 vs 27.8 (-1.4 %); Sy 4.579 vs 4.35 (+5.3 %); Zx 33.27 vs 33.7 (-1.3 %); Zy 8.451 vs 8.28 (+2.1 %); ry 1.184 vs 1.15 (+3.0 %); J 1.034 vs 1.2 (-13.8 %); Cw 221.2 vs 224 (-1.3 %)",
    "mc:MC10x8.4": "x_o 0.6366 vs x̄ + e_o = 0.616 (+3.3 %); Ix 31.52 vs 31.9 (-1.2 %); Iy 0.3805 vs 0.326 (+16.7 %); Sx 6.304 vs 6.39 (-1.4 %); Sy 0.3182 vs 0.268 (+18.7 %); Zx 7.819 vs 7.92 (-1.3 %); Zy 0.5924 vs 0.548 (+8.1 %); ry 0.3954 vs 0.364 (+8.6 %); J 0.03453 vs 0.0413 (-16.4 %)",
    "mc:MC8x22.8": "x_o 2.08 vs x̄ + e_o = 2.05 (+1.5 %); A 6.606 vs 6.7 (-1.4 %); Ix 62.87 vs 63.8 (-1.5 %); Iy 7.311 vs 7.01 (+4.3 %); Sy 2.969 vs 2.81 (+5.6 %); Zx 18.76 vs 19.1 (-1.8 %); Zy 5.488 vs 5.37 (+2.2 %); ry 1.052 vs 1.02 (+3.1 %); J 0.4813 vs 0.572 (-15.9 %); Cw 74.06 vs 75.2 (-1.5 %)",
    "mc:MC8x8.5": "x_o 1.012 vs x̄ + e_o = 0.97 (+4.3 %); Ix 23 vs 23.3 (-1.3 %); Iy 0.7434 vs 0.624 (+19.1 %); Sx 5.751 vs 5.82 (-1.2 %); Sy 0.5316 vs 0.431 (+23.3 %); Zx 6.858 vs 6.95 (-1.3 %); Zy 0.9747 vs 0.875 (+11.4 %); ry 0.5485 vs 0.5 (+9.7 %); J 0.04728 vs 0.0587 (-19.5 %)",
    "mc:MC6x15.3": "x_o 2.265 vs x̄ + e_o = 2.21 (+2.5 %); Iy 5.258 vs 4.91 (+7.1 %); Sy 2.191 vs 2.01 (+9.0 %); Zy 4.042 vs 3.85 (+5.0 %); ry 1.087 vs 1.05 (+3.5 %); J 0.1914 vs 0.223 (-14.2 %)",
    "mc:MC6x7": "x_o 1.111 vs x̄ + e_o = 1.084 (+2.5 %); A 2.053 vs 2.09 (-1.8 %); Ix 11.21 vs 11.4 (-1.7 %); Iy 0.6632 vs 0.603 (+10.0 %); Sx 3.735 vs 3.81 (-2.0 %); Sy 0.4898 vs 0.439 (+11.6 %); Zx 4.405 vs 4.5 (-2.1 %); Zy 0.9042 vs 0.865 (+4.5 %); ry 0.5684 vs 0.537 (+5.9 %); J 0.03786 vs 0.0464 (-18.4 %); Cw 3.945 vs 4 (-1.4 %)",
    "l:L12x12x1-3/8": "Iz 169 vs 165 (+2.4 %); rz 2.337 vs 2.3 (+1.6 %)",
    "l:L10x10x1-1/4": "Iz 87.62 vs 85.4 (+2.6 %); rz 1.94 vs 1.91 (+1.6 %)",
    "l:L4x4x1/4": "Ix 2.952 vs 3 (-1.6 %); Iy 2.952 vs 3 (-1.6 %); Sx 1.011 vs 1.03 (-1.9 %); Sy 1.011 vs 1.03 (-1.9 %); Zx 1.844 vs 1.82 (+1.3 %); Zy 1.844 vs 1.82 (+1.3 %)",
    "l:L3x2-1/2x3/16": "Ix 0.8867 vs 0.899 (-1.4 %); Zy 0.5428 vs 0.536 (+1.3 %)",
    "l:L2-1/2x2-1/2x3/16": "Ix 0.5285 vs 0.535 (-1.2 %); Iy 0.5285 vs 0.535 (-1.2 %); Sx 0.2915 vs 0.295 (-1.2 %); Sy 0.2915 vs 0.295 (-1.2 %); Iz 0.213 vs 0.209 (+1.9 %); rz 0.4887 vs 0.482 (+1.4 %)",
    "2l:2L10x10x7/8x3/4": "A 33.16 vs 33.6 (-1.3 %); Ix 312.1 vs 316 (-1.2 %); Iy 646.1 vs 655 (-1.4 %)",
    "2l:2L8x8x1/2x3/4": "Ix 96.56 vs 97.6 (-1.1 %)",
    "2l:2L6x6x5/16": "Ix 25.65 vs 26 (-1.3 %); Sx 5.834 vs 5.9 (-1.1 %)",
    "2l:2L3x3x3/16": "Ix 1.87 vs 1.9 (-1.6 %); Sx 0.8549 vs 0.866 (-1.3 %); Iy 3.295 vs 3.35 (-1.6 %)",
    "2l:2L7x4x3/4LLBB": "Iy 33.46 vs 34 (-1.6 %)",
    "2l:2L3x2-1/2x3/16LLBB": "Ix 1.773 vs 1.8 (-1.5 %)",
    "2l:2L8x4x7/16SLBB": "Sx 3.766 vs 3.81 (-1.2 %)",
    "2l:2L3-1/2x3x1/4x3/4SLBB": "Ix 2.579 vs 2.61 (-1.2 %)",
    "2l:2L3x2-1/2x1/4SLBB": "A 2.608 vs 2.64 (-1.2 %)",
    "pipe:Pipe 1/2 Std": "Ix 0.01631 vs 0.016 (+1.9 %); J 0.03261 vs 0.032 (+1.9 %)",
    "pipe:Pipe 18 XS": "A 25.62 vs 24.8 (+3.3 %); Ix 985.2 vs 956 (+3.1 %); Sx 109.5 vs 106 (+3.3 %); Zx 143 vs 139 (+2.9 %); J 1970 vs 1910 (+3.2 %)",
}


def _params() -> list:
    out = []
    for fam in STEP:
        for r in sample(fam):
            key = f"{fam}:{r['designation']}"
            marks = [pytest.mark.xfail(strict=True, reason=KNOWN_MISSES[key])] if key in KNOWN_MISSES else []
            out.append(pytest.param(fam, r, id=key, marks=marks))
    return out


@pytest.mark.parametrize(("family", "row"), _params())
def test_computed_properties_match_the_table(family, row):
    assert not deviations(family, row)


def test_every_family_is_sampled():
    for fam in STEP:
        assert len(sample(fam)) >= 5, fam


def test_a_check_sheet_says_how_close_a_computed_section_is():
    from calcpad.core.sheet import Sheet
    from calcpad.eng.checks import check_member
    from calcpad.eng.sections import get_section
    from calcpad.render import sheet_text

    def notes(section) -> list[str]:
        sh = Sheet("angle strut")
        check_member(sh, section, F_y="36 ksi", L="4 ft", P="5 kip", connected_leg="long")
        return [ln for ln in sheet_text(sh.evaluate()).splitlines() if ln.startswith("Note:") and "AISC Shapes" in ln]

    computed = notes(RolledAngle(4, 4, 0.25))
    assert len(computed) == 1 and "above the table (unconservative)" in computed[0]
    assert notes(get_section("L4x4x1/4")) == []  # the catalog row carries the published values


# --------------------------------------------------------------------------- angles: every row

#: Spread over all 137 rows of the v16.0 angle table (measured on this branch, fraction of the table
#: value, low and high): the model as a catalog twin gets it (series radii), and the plain rule
#: r1 = t/2, r2 = t/4 that legs of no AISC series get. ``RolledAngle`` states both (``series_agreement``,
#: ``table_agreement``). The series radii were inferred from this table (``angle_series``), so the
#: first is a calibration check (25 series x 3 radii against 137 rows x 12 properties).
ANGLE_SPREAD = {
    "series": {"A": (-0.016, 0.003), "Ix": (-0.026, 0.002), "Iy": (-0.026, 0.004), "Sx": (-0.027, 0.003),
               "Sy": (-0.027, 0.003), "Zx": (-0.014, 0.015), "Zy": (-0.014, 0.0165), "rx": (-0.010, 0.0055),
               "ry": (-0.010, 0.0055), "Iz": (-0.019, 0.027), "rz": (-0.005, 0.017), "J": (-0.011, 0.013)},
    "rule": {"A": (-0.016, 0.006), "Ix": (-0.009, 0.020), "Iy": (-0.009, 0.020), "Sx": (-0.007, 0.023),
             "Sy": (-0.011, 0.023), "Zx": (-0.009, 0.033), "Zy": (-0.007, 0.033), "rx": (-0.006, 0.009),
             "ry": (-0.008, 0.010), "Iz": (-0.012, 0.058), "rz": (-0.006, 0.027), "J": (-0.138, 0.008)},
}


@pytest.mark.parametrize("radii", ["series", "rule"])
def test_every_angle_row_within_the_stated_spread(radii):
    rows = _rows("l")
    assert len(rows) == 137
    out, n_within = [], 0
    for r in rows:
        d, b, t = _angle_dims(r["designation"])
        shape = RolledAngle(d, b, t) if radii == "series" else RolledAngle(d, b, t, t / 2.0, t / 4.0)
        assert shape.radii_source == ("series" if radii == "series" else "given")
        p = shape.props
        n_within += all(_close(float(getattr(p, OURS.get(c, c))), float(r[c])) for c in PROPS["l"])
        for col, (low, high) in ANGLE_SPREAD[radii].items():
            dev = float(getattr(p, OURS.get(col, col))) / float(r[col]) - 1.0
            if not low <= dev <= high:
                out.append(f"{r['designation']} {col} {dev * 100:+.2f} %")
    assert not out
    if radii == "series":
        assert n_within == 120 and "120 of its 137" in RolledAngle.series_agreement
        assert "2.6 %" in RolledAngle.series_agreement and "1.6 %" in RolledAngle.series_agreement
    else:
        assert n_within < 137 // 2
        assert "5.8 %" in RolledAngle.table_agreement and "14 %" in RolledAngle.table_agreement


#: Angle series whose tabulated J (v16.0) follows a root fillet other than k_des - t: one radius
#: for every thickness of the series (the rolls' radius; read off the table's J by solving our
#: closed form for r, one value per series, not per row). Every other row follows r = k_des - t.
ANGLE_SERIES_FILLET = {"L3x3x": 1 / 4, "L3x2-1/2x": 5 / 16, "L3-1/2x2-1/2x": 5 / 16, "L5x3x": 3 / 8,
                       "L5x3-1/2x": 3 / 8, "L6x4x": 3 / 8, "L6x3-1/2x": 3 / 8}
ANGLE_J_MISSES = {"L10x10x3/4": "J 2.834 vs 2.8 (+1.2 %) with r1 = k_des - t"}


def _angle_j_params() -> list:
    return [pytest.param(r, id=r["designation"], marks=[pytest.mark.xfail(strict=True, reason=ANGLE_J_MISSES[r["designation"]])]
                         if r["designation"] in ANGLE_J_MISSES else []) for r in _rows("l")]


@pytest.mark.parametrize("row", _angle_j_params())
def test_angle_j_closed_form_with_the_mill_fillet_matches_the_table(row):
    # the El Darwish and Johnston L-junction J (rolled.angle_junction), given the fillet the table
    # was computed with, reproduces the published J: the closed form, not the outline, is checked here
    d, b, t = _angle_dims(row["designation"])
    r1 = next((r for s, r in ANGLE_SERIES_FILLET.items() if row["designation"].startswith(s)), float(row["k_des"]) - t)
    j = RolledAngle(d, b, t, r1, 0.0).props.J
    assert _close(j, float(row["J"])), f"J {j:.4g} vs {row['J']}"


@pytest.mark.parametrize("key", [k for k in KNOWN_MISSES if k.startswith("l:")])
def test_the_angle_misses_fit_no_outline_of_legs_fillet_and_toe_radii(key):
    # the sampled angles still outside 1 % are a property of the table, not of our radii: no
    # root fillet r1 (0 to 1.5 max(k_des - t, t)) and toe radius r2 (0 to t) on a 16 x 11 grid
    # brings all of A, I, S, Z, r, I_z within 1 % (J left out: it follows its own fillet)
    row = next(r for r in sample("l") if f"l:{r['designation']}" == key)
    d, b, t = _angle_dims(row["designation"])
    top = 1.5 * max(float(row["k_des"]) - t, t)
    for r1 in [top * i / 15 for i in range(16)]:
        for r2 in [t * j / 10 for j in range(11)]:
            if t + r1 + r2 > min(d, b):
                continue
            p = RolledAngle(d, b, t, r1, r2).props
            assert not all(_close(float(getattr(p, OURS.get(c, c))), float(row[c])) for c in PROPS["l"] if c != "J"), (r1, r2)
