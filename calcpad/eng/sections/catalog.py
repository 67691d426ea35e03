"""Catalog of standard shapes by trade designation, with forgiving lookup, listing and search.

Data files in ``calcpad/eng/sections/data`` hold dimensions only (each names its source in its
header); properties are computed from the dimensions by :mod:`calcpad.eng.sections.shapes`.

Wall thickness used for properties (``wall="design"``, the default):

* HSS (ASTM A500, electric-resistance welded): design wall = 0.93 x nominal, AISC 360-16 B4.2.
  Use ``wall="nominal"`` for A1085 (or submerged-arc welded) HSS, where B4.2 lets t = nominal.
* Pipe (ASTM A53, which may be ERW): design wall = 0.93 x nominal as for ERW HSS, the practice
  of the AISC Manual 15th ed. pipe table; ``wall="nominal"`` gives the classic nominal-wall values.
* EMT: the nominal wall is always used.

Weights per foot always use the nominal wall and 490 lb/ft^3 steel.

WT-shapes are not a data file of their own: each is derived from a W row by cutting the W at
mid-depth (``W8x18`` -> ``WT4x9``: depth d/2, the same bf, tf, tw, fillet r = k_des - tf) and
built as a :class:`~calcpad.eng.sections.shapes.Tee` (flange at the top, stem down).
"""

from __future__ import annotations

import csv
import difflib
import functools
import re
from collections.abc import Callable, Iterable
from dataclasses import dataclass
from fractions import Fraction
from importlib import resources
from typing import Any

import pandas as pd

from calcpad.core.errors import InputError
from calcpad.core.units import Q_, parse_quantity
from calcpad.eng.sections.props import UNITS
from calcpad.eng.sections.shapes import Angle, Channel, IShape, RectBar, RectTube, RoundTube, Shape, Tee

__all__ = [
    "ERW_DESIGN_WALL_FACTOR",
    "FAMILIES",
    "CatalogEntry",
    "designations",
    "find_sections",
    "get_entry",
    "get_section",
    "section_table",
]

#: AISC 360-16 B4.2: design wall of ERW HSS = 0.93 x nominal wall.
ERW_DESIGN_WALL_FACTOR = 0.93

#: Family names and what they hold.
FAMILIES: dict[str, str] = {
    "pipe": "steel pipe Std/XS/XXS (ASME B36.10M)",
    "hss_round": "round HSS",
    "hss_square": "square HSS",
    "hss_rect": "rectangular HSS (not square)",
    "angle": "equal and unequal leg angles",
    "channel": "C and MC channels",
    "w": "W-shapes",
    "wt": "WT-shapes (each W-shape cut at mid-depth)",
    "flat_bar": "flat bar",
    "emt": "EMT conduit (ANSI C80.3)",
}

_WALLS = ("design", "nominal")


@dataclass(frozen=True)
class CatalogEntry:
    """One catalog size: canonical designation, family, key numbers and data source."""

    designation: str
    family: str
    key: tuple[float, ...]
    data: dict[str, float]
    source: str
    build: Callable[[CatalogEntry, str], Shape]

    def shape(self, wall: str = "design") -> Shape:
        """Build the shape (see module docstring for ``wall``)."""
        return self.build(self, wall)


# --------------------------------------------------------------------------- number text


def _num(text: str) -> float:
    """Read '1-1/2', '1 1/2', '3/16', '1.5', '.25' as a float; raise ValueError otherwise."""
    t = text.strip()
    m = re.fullmatch(r"(\d+)\s*[- ]\s*(\d+)\s*/\s*(\d+)", t)
    if m:
        return int(m.group(1)) + int(m.group(2)) / int(m.group(3))
    m = re.fullmatch(r"(\d+)\s*/\s*(\d+)", t)
    if m:
        if int(m.group(2)) == 0:
            raise ValueError(text)
        return int(m.group(1)) / int(m.group(2))
    m = re.fullmatch(r"\d+(?:\.\d*)?|\.\d+", t)
    if m:
        return float(t)
    raise ValueError(text)


def _frac_text(x: float) -> str:
    """1.5 -> '1-1/2', 0.25 -> '1/4', 4.0 -> '4' (sixteenths)."""
    f = Fraction(x).limit_denominator(16)
    whole, rest = divmod(f, 1)
    if rest == 0:
        return str(int(whole))
    if whole == 0:
        return f"{rest.numerator}/{rest.denominator}"
    return f"{int(whole)}-{rest.numerator}/{rest.denominator}"


def _dec3(x: float) -> str:
    return f"{x:.3f}"


# --------------------------------------------------------------------------- builders


def _wall(entry: CatalogEntry, wall: str) -> tuple[float, float]:
    tn = entry.data["t_nom"]
    if wall not in _WALLS:
        raise InputError(f"wall: {wall!r}; expected 'design' (0.93 x nominal for ERW, AISC 360-16 B4.2) or 'nominal'")
    if entry.family == "emt" or wall == "nominal":
        return tn, tn
    return ERW_DESIGN_WALL_FACTOR * tn, tn


def _build_round(entry: CatalogEntry, wall: str) -> Shape:
    t, tn = _wall(entry, wall)
    return RoundTube(entry.data["od"], t, t_nominal=tn, name=entry.designation)


def _build_rect(entry: CatalogEntry, wall: str) -> Shape:
    t, tn = _wall(entry, wall)
    return RectTube(entry.data["h"], entry.data["b"], t, t_nominal=tn, name=entry.designation)


def _build_angle(entry: CatalogEntry, _wall: str) -> Shape:
    d = entry.data
    return Angle(d["d"], d["b"], d["t"], name=entry.designation)


def _build_channel(entry: CatalogEntry, _wall: str) -> Shape:
    d = entry.data
    return Channel(d["d"], d["bf"], d["tf"], d["tw"], slope=d["slope"], name=entry.designation)


def _build_w(entry: CatalogEntry, _wall: str) -> Shape:
    d = entry.data
    return IShape(d["d"], d["bf"], d["tf"], d["tw"], max(d["k_des"] - d["tf"], 0.0), name=entry.designation)


def _build_wt(entry: CatalogEntry, _wall: str) -> Shape:
    d = entry.data
    return Tee(d["d"], d["bf"], d["tf"], d["tw"], max(d["k_des"] - d["tf"], 0.0), name=entry.designation)


def _wt_from_w(w: CatalogEntry) -> CatalogEntry:
    """The WT cut from a W at mid-depth: WT{nominal depth/2}x{weight/2}, depth d/2, same bf, tf, tw, k_des."""
    depth, weight = w.key
    key = (depth / 2.0, weight / 2.0)
    data = dict(w.data, d=w.data["d"] / 2.0)
    source = f"cut from {w.designation} at mid-depth (d/2; bf, tf, tw, k_des as the W); {w.source}"
    return CatalogEntry(f"WT{key[0]:g}x{key[1]:g}", "wt", key, data, source, _build_wt)


def _build_flat(entry: CatalogEntry, _wall: str) -> Shape:
    d = entry.data
    return RectBar(d["t"], d["w"], name=entry.designation)


# --------------------------------------------------------------------------- loading


def _read(name: str) -> tuple[list[dict[str, str]], str]:
    text = resources.files("calcpad.eng.sections").joinpath("data").joinpath(name).read_text(encoding="utf-8")
    lines = text.splitlines()
    comments = [ln[1:].strip() for ln in lines if ln.startswith("#")]
    source = next((c.split(":", 1)[1].strip() for c in comments if c.lower().startswith("source:")), "; ".join(comments))
    rows = list(csv.DictReader(ln for ln in lines if ln.strip() and not ln.startswith("#")))
    return rows, source


@functools.lru_cache(maxsize=1)
def _entries() -> tuple[CatalogEntry, ...]:
    out: list[CatalogEntry] = []
    rows, src = _read("pipe.csv")
    for r in rows:
        nps, od, tn = _num(r["nps"]), float(r["od"]), float(r["t_nom"])
        out.append(CatalogEntry(f"Pipe {r['nps']} {r['weight_class']}", "pipe", (nps, {"Std": 1, "XS": 2, "XXS": 3}[r["weight_class"]]),
                                {"od": od, "t_nom": tn}, src, _build_round))
    rows, src = _read("hss_round.csv")
    for r in rows:
        od, tn = float(r["od"]), float(r["t_nom"])
        out.append(CatalogEntry(f"HSS{_dec3(od)}x{_dec3(tn)}", "hss_round", (od, tn), {"od": od, "t_nom": tn}, src, _build_round))
    rows, src = _read("hss_rect.csv")
    for r in rows:
        h, b, tn = _num(r["h"]), _num(r["b"]), _num(r["t_nom"])
        fam = "hss_square" if h == b else "hss_rect"
        out.append(CatalogEntry(f"HSS{r['h']}x{r['b']}x{r['t_nom']}", fam, (h, b, tn), {"h": h, "b": b, "t_nom": tn}, src, _build_rect))
    rows, src = _read("angles.csv")
    for r in rows:
        d, b, t = _num(r["d"]), _num(r["b"]), _num(r["t"])
        out.append(CatalogEntry(f"L{r['d']}x{r['b']}x{r['t']}", "angle", (d, b, t), {"d": d, "b": b, "t": t}, src, _build_angle))
    rows, src = _read("channels.csv")
    for r in rows:
        data = {k: (_num(r[k]) if k == "slope" else float(r[k])) for k in ("d", "bf", "tw", "tf", "slope")}
        nums = tuple(float(x) for x in re.findall(r"\d+(?:\.\d+)?", r["designation"]))
        fam_prefix = 1.0 if r["designation"].startswith("MC") else 0.0
        out.append(CatalogEntry(r["designation"], "channel", (fam_prefix, *nums), data, src, _build_channel))
    rows, src = _read("w_shapes.csv")
    w_entries = []
    for r in rows:
        data = {k: float(r[k]) for k in ("d", "bf", "tf", "tw", "k_des")}
        nums = tuple(float(x) for x in re.findall(r"\d+(?:\.\d+)?", r["designation"]))
        w_entries.append(CatalogEntry(r["designation"], "w", nums, data, src, _build_w))
    out += w_entries
    out += [_wt_from_w(w) for w in w_entries]
    rows, src = _read("flat_bar.csv")
    for r in rows:
        w, t = _num(r["w"]), _num(r["t"])
        out.append(CatalogEntry(f"FB{r['w']}x{r['t']}", "flat_bar", (w, t), {"w": w, "t": t}, src, _build_flat))
    rows, src = _read("emt.csv")
    for r in rows:
        ts, od, tn = _num(r["trade_size"]), float(r["od"]), float(r["t_nom"])
        out.append(CatalogEntry(f"EMT {r['trade_size']}", "emt", (ts,), {"od": od, "t_nom": tn}, src, _build_round))
    return tuple(out)


@functools.lru_cache(maxsize=1)
def _by_norm() -> dict[str, CatalogEntry]:
    return {_norm(e.designation): e for e in _entries()}


def _norm(text: str) -> str:
    return re.sub(r"\s+", "", text.lower().replace("×", "x").replace("*", "x"))


# --------------------------------------------------------------------------- parsing

_CLASS_WORDS = {
    "std": 1, "standard": 1, "s40": 1, "sch40": 1, "schedule40": 1, "40": 1,
    "xs": 2, "xstrong": 2, "extrastrong": 2, "s80": 2, "sch80": 2, "schedule80": 2, "80": 2, "xh": 2,
    "xxs": 3, "xxstrong": 3, "doubleextrastrong": 3, "xxh": 3,
}


def _parse(text: str) -> tuple[str, tuple[float, ...]] | None:
    """Family and key numbers of a designation, or None when it cannot be read."""
    s = text.strip().lower().replace("×", "x").replace("*", "x").replace('"', "")
    s = re.sub(r"\s+", " ", s)
    s = re.sub(r"\bin\.?(?=\s|x|$)", "", s).strip()
    try:
        m = re.fullmatch(r"(?:pipe|nps)\s*(.+?)", s) or re.fullmatch(r"(.+?)\s*pipe", s)
        if m:
            body = m.group(1)
            m2 = re.fullmatch(r"([\d./ -]+?)\s*(?:nps)?\s*(std|standard|s40|sch\.?\s*40|schedule\s*40|xs|x-?strong|extra\s*strong|"
                              r"s80|sch\.?\s*80|schedule\s*80|xh|xxs|xx-?strong|double\s*extra\s*strong|xxh)", body)
            if not m2:
                return ("pipe", (_num(body), 0.0))
            cls = _CLASS_WORDS.get(re.sub(r"[\s.\-]", "", m2.group(2)), 0)
            return ("pipe", (_num(m2.group(1)), float(cls)))
        m = re.fullmatch(r"emt\s*(.+)|(.+?)\s*emt", s)
        if m:
            return ("emt", (_num(m.group(1) or m.group(2)),))
        m = re.fullmatch(r"hss\s*(.+)", s)
        if m:
            parts = [p for p in re.split(r"\s*x\s*", m.group(1).strip()) if p]
            nums = tuple(_num(p) for p in parts)
            if len(nums) == 2:
                return ("hss_round", nums)
            if len(nums) == 3:
                return ("hss_square" if nums[0] == nums[1] else "hss_rect", nums)
            return None
        m = re.fullmatch(r"(l|angle)\s*(.+)", s)
        if m:
            nums = tuple(_num(p) for p in re.split(r"\s*x\s*", m.group(2).strip()) if p)
            if len(nums) == 3:
                d, b = max(nums[0], nums[1]), min(nums[0], nums[1])
                return ("angle", (d, b, nums[2]))
            return None
        m = re.fullmatch(r"(mc|c)\s*(.+)", s)
        if m:
            nums = tuple(_num(p) for p in re.split(r"\s*x\s*", m.group(2).strip()) if p)
            return ("channel", (1.0 if m.group(1) == "mc" else 0.0, *nums))
        m = re.fullmatch(r"wt\s*(.+)", s)
        if m:
            return ("wt", tuple(_num(p) for p in re.split(r"\s*x\s*", m.group(1).strip()) if p))
        m = re.fullmatch(r"w\s*(.+)", s)
        if m:
            return ("w", tuple(_num(p) for p in re.split(r"\s*x\s*", m.group(1).strip()) if p))
        m = re.fullmatch(r"(?:fb|flat\s*bar|flat|bar|pl|plate)\s*(.+)", s)
        if m:
            nums = tuple(_num(p) for p in re.split(r"\s*x\s*", m.group(1).strip()) if p)
            if len(nums) == 2:
                return ("flat_bar", (max(nums), min(nums)))
            return None
    except ValueError:
        return None
    return None


def _close(a: tuple[float, ...], b: tuple[float, ...]) -> bool:
    return len(a) == len(b) and all(abs(x - y) <= 2e-3 for x, y in zip(a, b, strict=True))


def get_entry(designation: str) -> CatalogEntry:
    """Catalog entry for a trade designation (forgiving; see :func:`get_section`)."""
    if not isinstance(designation, str) or not designation.strip():
        raise InputError(f"section designation: {designation!r}; expected text such as 'HSS4x4x1/4' or 'Pipe 2 Std'")
    exact = _by_norm().get(_norm(designation))
    if exact is not None:
        return exact
    parsed = _parse(designation)
    if parsed is not None:
        fam, key = parsed
        for e in _entries():
            if e.family == fam and _close(e.key, key):
                return e
    raise InputError(f"section designation: {designation!r} is not in the catalog; {_suggest(designation, parsed)}")


def _suggest(designation: str, parsed: tuple[str, tuple[float, ...]] | None) -> str:
    names: list[str] = []
    if parsed is not None:
        fam, key = parsed
        same = [e for e in _entries() if e.family == fam and len(e.key) == len(key)]
        same.sort(key=lambda e: sum(abs(x - y) for x, y in zip(e.key, key, strict=True)))
        names = [e.designation for e in same[:3]]
    if not names:
        norm = {_norm(e.designation): e.designation for e in _entries()}
        hits = difflib.get_close_matches(_norm(designation), list(norm), n=3, cutoff=0.5)
        names = [norm[h] for h in hits]
    if names:
        return "did you mean " + ", ".join(repr(n) for n in names) + "?"
    return "expected e.g. 'Pipe 1-1/2 Std', 'HSS4x4x1/4', 'HSS6.625x0.280', 'L3x3x1/4', 'C6x8.2', 'W8x31', 'WT4x9', 'FB3x1/4', 'EMT 1-1/4'"


def get_section(designation: str, wall: str = "design") -> Shape:
    """Shape for a trade designation.

    Input is forgiving: case, spaces, ``x``/``X``/``×``, fractions or decimals, ``Sch 40``/``Sch 80``
    for Std/XS (``"pipe 1.5 std"``, ``"HSS 4 x 4 x 0.25"``, ``"l 3x3x.25"``). Flat bar of any size
    is built even when not in the stock list.

    Args:
        designation: e.g. ``"Pipe 1-1/2 Std"``, ``"HSS4x4x1/4"``, ``"L3x3x1/4"``, ``"C6x8.2"``,
            ``"WT4x9"``.
        wall: ``"design"`` or ``"nominal"`` wall for HSS and pipe (see module docstring).

    Raises:
        InputError: unknown designation (with "did you mean" suggestions) or bad ``wall``.
    """
    if wall not in _WALLS:
        raise InputError(f"wall: {wall!r}; expected 'design' (0.93 x nominal for ERW, AISC 360-16 B4.2) or 'nominal'")
    from calcpad.eng.sections.shop import shop_section  # the shop's own table, when one is in use (names never clash)

    own = shop_section(designation)
    if own is not None:
        return own
    try:
        return get_entry(designation).shape(wall)
    except InputError:
        parsed = _parse(designation) if isinstance(designation, str) else None
        if parsed is not None and parsed[0] == "flat_bar":
            w, t = parsed[1]
            return RectBar(t, w, name=f"FB{_frac_text(w)}x{_frac_text(t)}")
        raise


def _family(family: str) -> list[str]:
    f = family.strip().lower().replace(" ", "_").replace("-", "_")
    aliases = {"hss": ["hss_square", "hss_rect"], "hss_rectangular": ["hss_rect"], "rect_hss": ["hss_rect"],
               "square_hss": ["hss_square"], "round_hss": ["hss_round"], "angles": ["angle"], "l": ["angle"],
               "channels": ["channel"], "c": ["channel"], "w_shape": ["w"], "w_shapes": ["w"], "wt_shape": ["wt"],
               "wt_shapes": ["wt"], "flat": ["flat_bar"],
               "fb": ["flat_bar"], "conduit": ["emt"], "pipes": ["pipe"]}
    if f in FAMILIES:
        return [f]
    if f in aliases:
        return aliases[f]
    hits = difflib.get_close_matches(f, list(FAMILIES), n=3, cutoff=0.4)
    hint = f"did you mean {', '.join(map(repr, hits))}? " if hits else ""
    raise InputError(f"section family: {family!r} is unknown; {hint}expected one of {', '.join(FAMILIES)}")


def designations(family: str | None = None) -> list[str]:
    """Canonical designations, optionally of one family (see :data:`FAMILIES`)."""
    fams = list(FAMILIES) if family is None else _family(family)
    return [e.designation for e in _entries() if e.family in fams]


_TABLE_COLS = ["weight", "A", "Ix", "Sx", "Zx", "rx", "Iy", "Sy", "Zy", "ry", "r_min", "J", "xc", "yc", "depth", "width"]


@functools.lru_cache(maxsize=32)
def _table(family: str, wall: str) -> pd.DataFrame:
    rows: list[dict[str, Any]] = []
    for e in _entries():
        if e.family != family:
            continue
        p = e.shape(wall).props
        row: dict[str, Any] = {"designation": e.designation, "family": e.family}
        row.update({c: p.value(c) for c in _TABLE_COLS})
        row.update(p.ratios)
        rows.append(row)
    return pd.DataFrame(rows)


def section_table(family: str, wall: str = "design") -> pd.DataFrame:
    """DataFrame of a family: designation and properties (floats; units as in ``props.UNITS``)."""
    if wall not in _WALLS:
        raise InputError(f"wall: {wall!r}; expected 'design' or 'nominal'")
    frames = [_table(f, wall) for f in _family(family)]
    return pd.concat(frames, ignore_index=True).copy()


def _limit_value(name: str, value: Any) -> float:
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        return float(value)
    q = parse_quantity(value, f"limit on {name}")
    unit = UNITS.get(name, "")
    try:
        return float(q.to(unit).magnitude) if unit else float(q.to("").magnitude)
    except Exception:
        raise InputError(f"limit on {name}: {value!r}; expected a value in units of {unit or 'a plain number'}") from None


def find_sections(
    family: str,
    *,
    min: dict[str, Any] | None = None,  # noqa: A002
    max: dict[str, Any] | None = None,  # noqa: A002
    sort_by: str = "weight",
    ascending: bool = True,
    wall: str = "design",
) -> pd.DataFrame:
    """Sizes of a family whose properties fall within limits, sorted (lightest first by default).

    Limits are floats in the table units (in, in^2, in^3, in^4, lb/ft) or strings with units,
    e.g. ``find_sections("hss_square", min={"Ix": "5 in^4"}, max={"b/t": 30})``.
    """
    df = section_table(family, wall)
    for bounds, keep in ((min or {}, lambda s, v: s >= v), (max or {}, lambda s, v: s <= v)):
        for name, value in bounds.items():
            if name not in df.columns:
                raise InputError(f"property {name!r}: not a column of the {family} table; expected one of "
                                 f"{', '.join(c for c in df.columns if c not in ('designation', 'family'))}")
            df = df[keep(df[name], _limit_value(name, value))]
    if sort_by not in df.columns:
        raise InputError(f"sort_by: {sort_by!r}; expected a column such as 'weight', 'A', 'Ix'")
    return df.sort_values(sort_by, ascending=ascending, kind="stable").reset_index(drop=True)


def as_quantities(row: pd.Series | dict[str, Any], names: Iterable[str] | None = None) -> dict[str, Any]:
    """Pint quantities for the property columns of one table row."""
    names = list(names) if names is not None else [k for k in row.keys() if k in UNITS]
    return {n: Q_(float(row[n]), UNITS[n]) for n in names}
