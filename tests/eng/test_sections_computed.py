"""Computed geometry of every family against the AISC Shapes Database v16.0 (Build item 2 of issue 14).

The properties a shop size gets (the shape classes with fillets and toe radii, computed from the
dimensions) are compared with the published values of a sample of every family (every
``STEP[family]``-th row, every row of C and MC, of the data files the catalog ships, which hold the
AISC Shapes Database v16.0 values; independent of calcpad's code). A property agrees when it is within 1 % plus half a
unit of the table's third figure. C_w of I-shapes and C_w, x_o of channels are compared as the
checks compute them for a computed section (``_warping``). Models:

* W, M, HP: :class:`RolledIShape`, parallel flanges; fillet r = k_des - t_f for W, one measured
  radius per series for M and HP (``SERIES_FILLET``); J by El Darwish and Johnston with the
  T-junction alpha (:func:`~calcpad.eng.sections.rolled.tee_junction`).
* WT, MT: :class:`RolledTee`, fillet r as the parent W, M; J likewise (one junction). Tees of
  all three families take the depth their own and their parent's printed d both allow (``_tee_depth``).
* S, ST: :class:`SlopedIShape`, :class:`SlopedTee`: 2:12 flange slope, one measured root fillet r1
  per rolling (``S_ROLLING_FILLET``), toe radius r1/2; J with the sloped-flange junction term
  (:func:`~calcpad.eng.sections.rolled_sloped.sloped_junction`).
* C, MC: :func:`~calcpad.eng.sections.channel_series.series_channel`: the inner-flange slope and
  radii measured for each series (C 1:6; MC by series). The radii were fitted to these rows, so
  for C and MC this is a check that the fit holds for every row, not an independent one; J of the
  outline is checked against sectionproperties in ``test_sections_rolled.py``.
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
from calcpad.eng.sections.channel_series import series_channel
from calcpad.eng.sections.rolled import RolledAngle, RolledIShape, RolledTee
from calcpad.eng.sections.rolled_sloped import SlopedIShape, SlopedTee
from calcpad.eng.sections.shapes import RectTube, RoundTube

TOL = 0.01
STEP = {"w": 12, "m": 2, "s": 3, "hp": 3, "wt": 12, "mt": 2, "st": 3, "c": 1, "mc": 1, "l": 5, "2l": 25,
        "hss_rect": 20, "hss_round": 8, "pipe": 4}
I_PROPS = ("A", "Ix", "Iy", "Sx", "Sy", "Zx", "Zy", "rx", "ry", "J")
PROPS = {"w": I_PROPS, "m": I_PROPS, "s": I_PROPS, "hp": I_PROPS, "wt": I_PROPS, "mt": I_PROPS, "st": I_PROPS,
         "c": I_PROPS, "mc": I_PROPS, "l": ("A", "Ix", "Iy", "Sx", "Sy", "Zx", "Zy", "rx", "ry", "Iz", "rz", "J"),
         "2l": ("A", "Ix", "Sx", "Zx", "rx", "Iy", "ry"), "hss_rect": I_PROPS + ("C",),
         "hss_round": ("A", "Ix", "Sx", "Zx", "rx", "J"), "pipe": ("A", "Ix", "Sx", "Zx", "rx", "J")}
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


#: Fillet radius (in) of each M and HP series. The tables do not print it and k_des - t_f is larger
#: (k_des is rounded up for detailing) for all but HP18/HP16; measured on this branch as the radius
#: at which the El Darwish and Johnston J of the parallel-flange outline equals the tabulated J
#: (J is the property most sensitive to the fillet). The rows of a series gave the same radius to
#: +-0.01 in (every row of the M and HP files, not only the sample), so one number per series;
#: A, I, S, Z, r, C_w are then independent checks of the outline. An MT is half its parent M.
SERIES_FILLET = {"M12.5": 0.24, "M12": 0.24, "M10": 0.21, "M8": 0.18, "M6": 0.15, "M5": 0.31, "M4": 0.31,
                 "M3": 0.31, "HP18": 1.18, "HP16": 1.18, "HP14": 0.60, "HP12": 0.60, "HP10": 0.50, "HP8": 0.40}


#: Root fillet r1 (in) of each S rolling (series and flange thickness t_f; heavier weights of a
#: rolling only spread the web, b_f - t_w stays), toe radius r1/2. Measured on this branch: the r1 at
#: which the J of the outline (:class:`SlopedIShape`, :class:`SlopedTee`) equals the tabulated J;
#: the S rows and their ST halves of a rolling gave the same r1 to +-0.01 in (sectionproperties'
#: finite-element J gave the same radii), but for S12x50 / S12x40.8 (0.50 / 0.45, mean taken).
#: k_des less the flange thickness at the web face is 0.1 in larger for S24 to S18 and smaller for
#: S12 to S8. A toe radius of 0.75 r1 or r1 puts I_y, Z_y of most rows 1-4 % below the table.
S_ROLLING_FILLET = {("S24", 1.09): 0.61, ("S24", 0.87): 0.605, ("S20", 0.92): 0.61, ("S20", 0.795): 0.595,
                    ("S18", 0.691): 0.505, ("S15", 0.622): 0.505, ("S12", 0.659): 0.475, ("S12", 0.544): 0.38,
                    ("S10", 0.491): 0.41, ("S8", 0.425): 0.37, ("S6", 0.359): 0.315, ("S5", 0.326): 0.31,
                    ("S4", 0.293): 0.29, ("S3", 0.26): 0.25}


def _series(designation: str) -> str:
    """Parent series of an M, MT, HP, S or ST designation: 'MT6.25x6.2' -> 'M12.5', 'ST1.5x2.85' -> 'S3'."""
    kind, depth = re.match(r"(MT|M|HP|ST|S)([\d.]+)x", designation).groups()
    return f"{kind[0]}{float(depth) * 2:g}" if kind in ("MT", "ST") else f"{kind}{float(depth):g}"


def _third_figure(x: float) -> float:
    return 0.5 * 10.0 ** (math.floor(math.log10(abs(x))) - 2)


def _tee_depth(family: str, r: dict[str, str]) -> float:
    """Depth of a WT, MT or ST: the middle of the depths both printings allow, the tee's d +- half a
    unit of its third figure and half its parent's d +- the same (WT12x47: 12.2 and 24.3/2 leave
    12.15 to 12.175; with 12.2 the table's I_x is missed by 1.3 %). The parent is the row of the
    I-shape file with twice the weight and the same b_f, t_f, t_w; without one, the tee's own d."""
    d = float(r["d"])
    parent = [p for p in _rows({"wt": "w", "mt": "m", "st": "s"}[family])
              if abs(float(p["weight"]) - 2.0 * float(r["weight"])) < 0.06
              and all(p[k] == r[k] for k in ("bf", "tf", "tw"))]
    if len(parent) != 1:
        return d
    d_p = float(parent[0]["d"])
    low = max((d_p - _third_figure(d_p)) / 2.0, d - _third_figure(d))
    high = min((d_p + _third_figure(d_p)) / 2.0, d + _third_figure(d))
    return (low + high) / 2.0 if low <= high else d


def _model(family: str, r: dict[str, str]):
    f = {k: float(v) for k, v in r.items() if k not in ("designation", "legs") and v.strip()}
    if family in ("wt", "mt", "st"):
        f["d"] = _tee_depth(family, r)
    if family in ("s", "st"):
        cls = SlopedIShape if family == "s" else SlopedTee
        return cls(f["d"], f["bf"], f["tf"], f["tw"], S_ROLLING_FILLET[(_series(r["designation"]), f["tf"])])
    if family in ("m", "hp", "mt"):
        cls = RolledTee if family == "mt" else RolledIShape
        return cls(f["d"], f["bf"], f["tf"], f["tw"], SERIES_FILLET[_series(r["designation"])])
    if family == "w":
        return RolledIShape(f["d"], f["bf"], f["tf"], f["tw"], max(f["k_des"] - f["tf"], 0.0))
    if family == "wt":
        return RolledTee(f["d"], f["bf"], f["tf"], f["tw"], max(f["k_des"] - f["tf"], 0.0))
    if family in ("c", "mc"):
        return series_channel(f["d"], f["bf"], f["tf"], f["tw"])
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
    return abs(ours - printed) <= _third_figure(printed) + TOL * abs(printed)


def _warping(family: str, r: dict[str, str], p) -> dict[str, float]:
    """C_w (and x_o of channels) as the checks compute them for a section that does not carry them:
    I-shapes C_w = I_y h_o²/4 with h_o = d - t_f (AISC 360-16 F2 User Note, ``checks/flexure.py``);
    channels the thin-wall C_w and x_o of ``checks/_section.py``, with our I_x and x̄."""
    f = {k: float(r[k]) for k in ("d", "bf", "tf", "tw")}
    if family in ("w", "m", "s", "hp"):
        return {"Cw": p.Iy * (f["d"] - f["tf"]) ** 2 / 4.0}
    cw, xo = channel_warping(f["d"], f["bf"], f["tf"], f["tw"], p.xc, p.Ix)
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
        if not _close(got, printed):
            bad.append(f"{col} {got:.4g} vs {printed:g} ({(got / printed - 1) * 100:+.1f} %)")
    return bad


def sample(family: str) -> list[dict[str, str]]:
    return _rows(family)[:: STEP[family]]


#: Sample rows outside 1 % (measured on this branch; see DEVELOPERS.md, "Computed geometry").
KNOWN_MISSES: dict[str, str] = {
    "w:W18x130": "Iy 281.4 vs 278 (+1.2 %); Cw 2.305e+04 vs 22700 (+1.5 %): the printed b_f = 11.2 is rounded; the table's I_y is that of b_f = 11.154 (11.15 gives 277.7, 11.2 gives 281.4), as are its own S_y (49.9 x 11.154/2 = 278.3) and C_w (I_y h_o^2/4)",
    "s:S4x9.5": "Iy 0.8969 vs 0.887 (+1.1 %): the 2:12 outline with the rolling's r1 (from J) and r2 = r1/2 puts I_y of the S rows 0.2 % to 1.2 % above the table (ST to 1.4 %); r2 = 0.75 r1 takes it 1 % to 2 % below",
    "s:S3x5.7": "Zy 0.6481 vs 0.656 (-1.2 %): no flange slope (0 to 3:12) with any r1 (0 to 0.4 in) and r2 brings every property within 1 % (the best pair scanned leaves 1.08 % on Z_y and I_x)",
    "st:ST2x4.75": "Ix 0.4698 vs 0.462 (+1.7 %); Sx 0.3248 vs 0.319 (+1.8 %): the tee's I_x is the small difference I_S/2 - A_T (d_T - y_bar)^2 = 3.38 - 2.92 of its parent S4x9.5, whose I_x the outline gives +0.25 % (within 1 %); matching it needs t_w = 0.318 for the printed 0.326 or d = 1.989 for 2.0",
    "st:ST1.5x2.85": "Ix 0.118 vs 0.114 (+3.5 %); Sx 0.1008 vs 0.097 (+3.9 %); Zx 0.1993 vs 0.196 (+1.7 %); Zy 0.324 vs 0.328 (-1.2 %); rx 0.377 vs 0.37 (+1.9 %): I_x of the tee is I_S/2 - A_T (d_T - y_bar)^2 = 1.25 - 1.14 of its parent S3x5.7, whose I_x the outline gives +0.4 % (within 1 %), so the tee's I_x moves 8 times as much; matching it needs t_w = 0.163 for the printed 0.17 or d = 1.483 for 1.5; Z_y as S3x5.7",
    # C/MC: no profile of these series reaches 1 % on every weight: a minimax search over slope, r1
    # and r2 (largest excess over the tolerance, all properties of all weights) leaves C3 1.05 %,
    # C4 1.07 %, MC6 (x6.5, x7) 1.33 % and MC10x6.5 0.99 % (with I_y and J 1.3-1.4 % above the
    # table there; we keep the profile whose miss is Z_y below the table, conservative).
    "c:C4x7.25": "J 0.08082 vs 0.0817 (-1.1 %)",
    "c:C4x5.4": "Cw 0.9097 vs 0.921 (-1.2 %)",
    "c:C3x4.1": "Zy 0.3939 vs 0.399 (-1.3 %)",
    "c:C3x3.5": "Cw 0.2718 vs 0.276 (-1.5 %)",
    "mc:MC10x6.5": "Zy 0.2796 vs 0.284 (-1.6 %)",
    "mc:MC6x7": "Zy 0.853 vs 0.865 (-1.4 %)",
    "mc:MC6x6.5": "Zy 0.8225 vs 0.836 (-1.6 %)",
    "l:L12x12x1-3/8": "Iz 169 vs 165 (+2.4 %); rz 2.337 vs 2.3 (+1.6 %)",
    "l:L10x10x1-1/4": "Iz 87.62 vs 85.4 (+2.6 %); rz 1.94 vs 1.91 (+1.6 %)",
    "l:L4x4x1/4": "Ix 2.952 vs 3 (-1.6 %); Iy 2.952 vs 3 (-1.6 %); Sx 1.011 vs 1.03 (-1.9 %); Sy 1.011 vs 1.03 (-1.9 %); Zx 1.844 vs 1.82 (+1.3 %); Zy 1.844 vs 1.82 (+1.3 %)",
    "l:L3x2-1/2x3/16": "Ix 0.8867 vs 0.899 (-1.4 %); Zy 0.5428 vs 0.536 (+1.3 %)",
    "l:L2-1/2x2-1/2x3/16": "Ix 0.5263 vs 0.535 (-1.6 %); Iy 0.5263 vs 0.535 (-1.6 %); Sx 0.2895 vs 0.295 (-1.9 %); Sy 0.2895 vs 0.295 (-1.9 %); Iz 0.2145 vs 0.209 (+2.6 %); rz 0.489 vs 0.482 (+1.4 %)",
    "2l:2L10x10x7/8x3/4": "A 33.16 vs 33.6 (-1.3 %); Ix 312.1 vs 316 (-1.2 %); Iy 646.1 vs 655 (-1.4 %)",
    "2l:2L8x8x1/2x3/4": "Ix 96.56 vs 97.6 (-1.1 %)",
    "2l:2L6x6x5/16": "Ix 25.65 vs 26 (-1.3 %); Sx 5.834 vs 5.9 (-1.1 %)",
    "2l:2L3x3x3/16": "Ix 1.87 vs 1.9 (-1.6 %); Sx 0.8549 vs 0.866 (-1.3 %); Iy 3.295 vs 3.35 (-1.6 %)",
    "2l:2L7x4x3/4LLBB": "Iy 33.46 vs 34 (-1.6 %)",
    "2l:2L3x2-1/2x3/16LLBB": "Ix 1.773 vs 1.8 (-1.5 %)",
    "2l:2L8x4x7/16SLBB": "Sx 3.766 vs 3.81 (-1.2 %)",
    "2l:2L3-1/2x3x1/4x3/4SLBB": "Ix 2.579 vs 2.61 (-1.2 %)",
    "2l:2L3x2-1/2x1/4SLBB": "A 2.608 vs 2.64 (-1.2 %)",
    "pipe:Pipe 1/2 Std": "Ix 0.01631 vs 0.016 (+1.9 %); J 0.03261 vs 0.032 (+1.9 %): pi/64 (0.84^4 - 0.638^4) = 0.01631, as the table's own S_x (0.0388 x 0.42 = 0.0163) and r_x (0.234 x 0.264^2 = 0.0163) say; I_x is printed to three decimals (0.016) and J = 2 x 0.016 = 0.032 from that rounded value",
    "pipe:Pipe 18 XS": "A 25.62 vs 24.8 (+3.3 %); Ix 985.2 vs 956 (+3.1 %); Sx 109.5 vs 106 (+3.3 %); Zx 143 vs 139 (+2.9 %); J 1970 vs 1910 (+3.2 %): the table's values are those of a 0.450 in wall, (OD - ID)/2 = (18 - 17.1)/2, not of its printed t_des = 0.465 (0.93 x 0.500): pi (18 - 0.45) 0.45 = 24.81, pi (18 - 0.465) 0.465 = 25.62; pi/64 (18^4 - 17.1^4) = 955.8 (XS 14 to 26 in alike)",
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


def test_a_tee_takes_the_depth_both_it_and_its_parent_allow():
    rows = {r["designation"]: r for fam in ("wt", "st") for r in _rows(fam)}
    assert _tee_depth("wt", rows["WT12x47"]) == pytest.approx(12.1625)  # 12.2 and 24.3/2: 12.15 to 12.175
    assert _tee_depth("st", rows["ST10x43"]) == pytest.approx(10.1625)  # 10.2 and 20.3/2
    assert _tee_depth("wt", rows["WT9x65"]) == pytest.approx(9.63)  # 9.63 and 19.3/2: 9.625 to 9.635


def test_large_xs_pipe_values_are_those_of_the_printed_id_not_the_design_wall():
    # AISC Shapes Database v16.0, Pipe 14 to 26 XS: A, I_x follow t = (OD - ID)/2 = 0.450 in, while
    # the printed t_des is 0.465 (0.93 t_nom); the reason Pipe 18 XS is a known miss above
    for r in _rows("pipe"):
        od, i_d, t_des, area = (float(r[k]) for k in ("OD", "ID", "t_des", "A"))
        if not (r["designation"].endswith(" XS") and od >= 14.0):
            continue
        t_id = (od - i_d) / 2.0
        assert math.pi * (od - t_id) * t_id == pytest.approx(area, rel=0.005), r["designation"]
        assert math.pi / 64.0 * (od**4 - i_d**4) == pytest.approx(float(r["Ix"]), rel=0.005), r["designation"]
        assert math.pi * (od - t_des) * t_des / area > 1.025, r["designation"]


@pytest.mark.parametrize("family", ["m", "mt", "hp", "s", "st"])
def test_one_fillet_per_series_gives_the_j_of_every_row(family):
    # every row of the family, not only the sample: one radius per series (M, HP) or rolling (S)
    # reproduces the tabulated J (AISC Shapes Database v16.0); measured worst 0.4 % (M, MT, HP),
    # 0.8 % (S12x50, S12x40.8, whose J ask for 0.50 and 0.45 in)
    off = []
    for r in _rows(family):
        got, printed = _model(family, r).props.J, float(r["J"])
        if not _close(got, printed):
            off.append(f"{r['designation']}: J {got:.4g} vs {printed:g}")
    assert not off


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
        assert n_within == 118 and "118 of its 137" in RolledAngle.series_agreement
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
