"""A shop's own verified table of sections: read, validated row by row, looked up by name.

A fabricator keeps sizes the catalog does not list (a mill's odd angle, a stock channel, an
old rolling kept in the yard). Their table is a CSV file, one section per row::

    # source: Harbor Ridge Metal Works yard stock, measured and weighed 2026-10-12
    designation,family,d [in],b [in],t [in],r1 [in],r2 [in],A [in^2],weight [lb/ft]
    L3x3x5/16 HRMW,angle,3,3,0.3125,0.1875,0.0938,1.78,6.1

* ``designation`` and ``family`` are required; the other columns carry their unit in brackets
  in the header (read by the value parser, ``core/value_text.py``). A cell is a number in
  that unit (``0.3125``, ``5/16``) or a value with its own unit of the same kind (``8 mm``).
* Families and the columns each needs (others in the row must be empty):

  ========== ========================================== ==========================
  family     required                                   optional
  ========== ========================================== ==========================
  angle      d, b, t (long leg d)                       r1 (root fillet), r2 (toe)
  channel    d, bf, tf, tw                              slope (no unit), r1, r2 (none
                                                        given: a C/MC series' own, else 0)
  w          d, bf, tf, tw, k_des                       —
  hss_rect   h, b, t_nom (ERW: design wall 0.93 t_nom)  —
  hss_round  od, t_nom (ERW: design wall 0.93 t_nom)    —
  flat_bar   w, t                                       —
  ========== ========================================== ==========================

  Every row also states ``A`` (area) and ``weight`` (per length), as the shop verified them.
* A row may state section properties in extra columns (``J [in^4]``, ``Cw [in^6]``, ``x_bar [in]``
  ...; which ones per family: :data:`~calcpad.eng.sections.shop_props.FAMILY_PROPERTIES`). They
  must be positive (``H_flex`` at most 1), in a unit of their kind, and agree with the value
  computed from the dimensions within the tolerances of :mod:`calcpad.eng.sections.shop_props`
  (5 %; positions 5 % or 0.02 in; J of open shapes 30 %); the checks then use them, and the
  sheet note names them.
* Properties used by the checks are computed from the row's dimensions with the rolled
  outline (:mod:`calcpad.eng.sections.rolled`: fillets and toe radii) or the closed-form
  shapes; ``A`` must lie within :data:`AREA_TOLERANCE` of the modelled area and ``weight``
  within :data:`WEIGHT_TOLERANCE` of the modelled weight (490 lb/ft³, nominal wall for HSS),
  which ties the stated area, the weight and the dimensions together.
* Designations must be unique (compared as the catalog compares them: case, spaces and
  ``x``/``×`` ignored) and must not name a catalog section (a shop row never shadows the
  published table).

Any problem rejects the whole table: :class:`ShopTableError` lists every problem with its row
number (the line of the file, header and comment lines counted, as a spreadsheet shows it).

:func:`use_shop_table` makes a table the one :func:`~calcpad.eng.sections.catalog.get_section`
consults; the job runner also passes it to a kernel through :data:`ENV_PATH` and
:data:`ENV_SHA256` (the kernel re-reads the file and refuses it when the digest differs).
"""

from __future__ import annotations

import contextlib
import csv
import difflib
import hashlib
import math
import os
import re
from collections.abc import Callable, Iterator
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

from calcpad.core.errors import InputError, ProblemListError
from calcpad.core.units import Q_, parse_quantity, parse_unit
from calcpad.eng.sections.channel_series import channel_series, series_channel
from calcpad.eng.sections.props import STEEL_DENSITY_PCF
from calcpad.eng.sections.rolled import RolledAngle, RolledChannel, RolledIShape
from calcpad.eng.sections.shapes import RectBar, RectTube, RoundTube, Shape
from calcpad.eng.sections.shop_props import FAMILY_PROPERTIES, PROPERTY_COLUMNS, mismatch, reference, stated_props

__all__ = [
    "AREA_TOLERANCE",
    "ENV_PATH",
    "ENV_SHA256",
    "WEIGHT_TOLERANCE",
    "ShopRow",
    "ShopTable",
    "ShopTableError",
    "active_shop_table",
    "load_shop_table",
    "note_shop_section",
    "read_shop_table",
    "shop_note",
    "shop_section",
    "shop_table_in_use",
    "use_shop_table",
]

#: Stated area vs the area of the modelled outline (relative).
AREA_TOLERANCE = 0.02
#: Stated weight per length vs the weight of the modelled outline at 490 lb/ft³ (relative).
WEIGHT_TOLERANCE = 0.02
#: Environment variables that hand the job's table to a kernel: path and SHA-256.
ENV_PATH = "CALCPAD_SHOP_SECTIONS"
ENV_SHA256 = "CALCPAD_SHOP_SECTIONS_SHA256"
#: Bounds on what is read (a table is data a person keeps, not a database).
MAX_BYTES = 2_000_000
MAX_ROWS = 5000

_ERW = 0.93  # AISC 360-16 B4.2 design wall of ERW HSS (as the catalog)

#: Column -> (expected unit kind, unit the shapes take, description).
COLUMNS: dict[str, tuple[str, str, str]] = {
    "d": ("[length]", "in", "depth / long leg"),
    "b": ("[length]", "in", "short leg / width"),
    "t": ("[length]", "in", "thickness"),
    "r1": ("[length]", "in", "root fillet radius"),
    "r2": ("[length]", "in", "toe radius"),
    "bf": ("[length]", "in", "flange width"),
    "tf": ("[length]", "in", "flange thickness"),
    "tw": ("[length]", "in", "web thickness"),
    "k_des": ("[length]", "in", "design k (flange face to web toe of fillet)"),
    "slope": ("", "", "inner flange slope (rise/run)"),
    "h": ("[length]", "in", "outside depth"),
    "od": ("[length]", "in", "outside diameter"),
    "t_nom": ("[length]", "in", "nominal wall"),
    "w": ("[length]", "in", "width"),
    "A": ("[length]**2", "in**2", "area"),
    "weight": ("weight per length", "lbf/ft", "weight per length"),
    **PROPERTY_COLUMNS,  # section properties a row may state (calcpad.eng.sections.shop_props)
}
THICKNESS_COLUMNS = ("t", "tf", "tw", "t_nom")

FAMILY_COLUMNS: dict[str, tuple[tuple[str, ...], tuple[str, ...]]] = {
    "angle": (("d", "b", "t"), ("r1", "r2", *FAMILY_PROPERTIES["angle"])),
    "channel": (("d", "bf", "tf", "tw"), ("slope", "r1", "r2", *FAMILY_PROPERTIES["channel"])),
    "w": (("d", "bf", "tf", "tw", "k_des"), FAMILY_PROPERTIES["w"]),
    "hss_rect": (("h", "b", "t_nom"), FAMILY_PROPERTIES["hss_rect"]),
    "hss_round": (("od", "t_nom"), FAMILY_PROPERTIES["hss_round"]),
    "flat_bar": (("w", "t"), FAMILY_PROPERTIES["flat_bar"]),
}
_ALWAYS = ("A", "weight")
_HEADER = re.compile(r"^\s*([A-Za-z_][A-Za-z0-9_]*)\s*(?:\[(.*)\])?\s*$")


class ShopTableError(ProblemListError):
    """A shop table with problems; ``problems`` lists ``(location, message)`` pairs."""

    heading = "shop table {source}: {count}; nothing loaded"


@dataclass(frozen=True)
class ShopRow:
    """One validated row: designation, family, dimensions (inches), row number, and its shape."""

    designation: str
    family: str
    row: int
    values: dict[str, float]
    build: Callable[[], Shape] = field(repr=False, compare=False)

    def shape(self) -> Shape:
        """A new shape of this row (named with the row's designation)."""
        return self.build()

    @property
    def stated(self) -> tuple[str, ...]:
        """The section properties the row states (used instead of computed ones), in column order."""
        return tuple(k for k in self.values if k in PROPERTY_COLUMNS)


@dataclass(frozen=True)
class ShopTable:
    """A validated shop table: its name, SHA-256 of the bytes read, source line and rows."""

    name: str
    sha256: str
    text: str
    rows: tuple[ShopRow, ...]
    source_note: str = ""

    def get(self, designation: str) -> ShopRow | None:
        """The row of a designation (compared as the catalog compares names), or None."""
        return self._index().get(_norm(designation))

    def _index(self) -> dict[str, ShopRow]:
        cached = self.__dict__.get("_idx")
        if cached is None:
            cached = {_norm(r.designation): r for r in self.rows}
            object.__setattr__(self, "_idx", cached)
        return cached

    def note(self, row: ShopRow) -> str:
        """The note a sheet prints where the row is used: which properties the table states
        and which were computed from the row's dimensions."""
        head = (f"Section {row.designation}: from shop table {self.name}, row {row.row} (sha256 {self.sha256[:12]}); "
                "the shop's own data, not a published table: ")
        if not row.stated:
            return head + "computed from the row's dimensions."
        return head + f"{', '.join(row.stated)} as stated in the table; the other properties computed from the row's dimensions."


def _norm(text: str) -> str:
    return re.sub(r"\s+", "", str(text).lower().replace("×", "x").replace("*", "x"))


# --------------------------------------------------------------------------- reading


def _header(cells: list[str], line: int, problems: list[tuple[str, str]]) -> dict[int, tuple[str, Any]]:
    """Column index -> (name, pint unit or None); problems for unknown, duplicate or unit-less columns."""
    out: dict[int, tuple[str, Any]] = {}
    seen: set[str] = set()
    known = ("designation", "family", *COLUMNS)
    for i, raw in enumerate(cells):
        where = f"row {line}, column {i + 1}"
        m = _HEADER.match(raw)
        if not m:
            problems.append((where, f"header {raw!r}; expected a column name with its unit in brackets, e.g. 't [in]'"))
            continue
        name, unit_text = m.group(1), m.group(2)
        if name not in known:
            close = difflib.get_close_matches(name, known, n=2, cutoff=0.6)
            hint = f"; did you mean {', '.join(repr(c) for c in close)}?" if close else ""
            problems.append((where, f"unknown column {name!r}{hint} (known: {', '.join(known)})"))
            continue
        if name in seen:
            problems.append((where, f"column {name!r} appears twice"))
            continue
        seen.add(name)
        if name in ("designation", "family"):
            if unit_text:
                problems.append((where, f"column {name!r} is text; remove the unit [{unit_text}]"))
            out[i] = (name, None)
            continue
        kind, _, desc = COLUMNS[name]
        if kind == "":
            if unit_text and unit_text.strip() not in ("", "-"):
                problems.append((where, f"column {name!r} ({desc}) is a plain number; remove the unit [{unit_text}]"))
            out[i] = (name, None)
            continue
        if not unit_text or not unit_text.strip():
            problems.append((where, f"column {name!r} ({desc}) has no unit; write it in brackets, e.g. '{name} [{_example_unit(name)}]'"))
            continue
        try:
            unit = parse_unit(unit_text.strip(), f"{where} ({name} unit)")
        except InputError as exc:
            problems.append((where, f"unit of {name!r}: {_short(exc)}"))
            continue
        if not _unit_kind_ok(name, Q_(1.0, unit)):
            problems.append((where, f"unit [{unit_text.strip()}] of {name!r} is not {_a(_kind_word(name))} unit; expected e.g. "
                                    f"[{_example_unit(name)}]"))
            continue
        out[i] = (name, unit)
    for req in ("designation", "family", *_ALWAYS):
        if req not in seen:
            problems.append((f"row {line}", f"missing column {req!r}" + (f" (write '{req} [{_example_unit(req)}]')" if req in COLUMNS else "")))
    return out


def _a(word: str) -> str:
    return f"an {word}" if word[0] in "aeiou" else f"a {word}"


_KIND_WORDS = {"[length]": "length", "[length]**2": "area", "[length]**3": "length^3 (section modulus)",
               "[length]**4": "length^4 (moment of inertia)", "[length]**6": "length^6 (warping constant)",
               "weight per length": "weight per length"}


def _kind_word(name: str) -> str:
    return _KIND_WORDS.get(COLUMNS[name][0], "length") if name in COLUMNS else "length"


def _example_unit(name: str) -> str:
    if name == "weight":
        return "lb/ft"
    return COLUMNS[name][1].replace("**", "^") if name in COLUMNS and COLUMNS[name][1] else "in"


def _unit_kind_ok(name: str, q: Any) -> bool:
    if name == "weight":
        return q.check("[force]/[length]") or q.check("[mass]/[length]")
    return q.check(COLUMNS[name][0])


def _short(exc: Exception) -> str:
    text = str(exc)
    return text.split(" Accepted forms:")[0]


def _cell_value(name: str, unit: Any, text: str, where: str) -> float:
    """A cell as a float in the unit the shapes take; raises ValueError with a message."""
    try:
        q = parse_quantity(text, where)
    except InputError:
        raise ValueError(f"{text!r} is not a number" + (f" (expected a value in {unit:~})" if unit is not None else "")) from None
    if q.dimensionless and unit is not None:
        q = Q_(float(q.magnitude), unit)
    if unit is None:
        if not q.dimensionless:
            raise ValueError(f"{text!r}; expected a plain number")
        return float(q.magnitude)
    if not _unit_kind_ok(name, q):
        raise ValueError(f"{text!r} is not {_a(_kind_word(name))} value")
    if name == "weight" and q.check("[mass]/[length]"):
        q = (q * Q_(1.0, "standard_gravity")).to("lbf/ft")
    return float(q.to(COLUMNS[name][1]).magnitude)


def _builder(family: str, designation: str, v: dict[str, float]) -> Callable[[], Shape]:
    if family == "angle":
        d, b = max(v["d"], v["b"]), min(v["d"], v["b"])
        return lambda: RolledAngle(d, b, v["t"], v.get("r1"), v.get("r2"), name=designation)
    if family == "channel":
        return lambda: _channel(designation, v)
    if family == "w":
        return lambda: RolledIShape(v["d"], v["bf"], v["tf"], v["tw"], max(v["k_des"] - v["tf"], 0.0), name=designation)
    if family == "hss_rect":
        return lambda: RectTube(v["h"], v["b"], _ERW * v["t_nom"], t_nominal=v["t_nom"], name=designation)
    if family == "hss_round":
        return lambda: RoundTube(v["od"], _ERW * v["t_nom"], t_nominal=v["t_nom"], name=designation)
    return lambda: RectBar(v["t"], v["w"], name=designation)


def _channel(designation: str, v: dict[str, float]) -> Shape:
    """A shop channel: the slope and radii the row gives; a row that gives none and has the depth,
    flange thickness and outstand of a C or MC series (another weight of it) takes that series'
    slope and radii (:mod:`calcpad.eng.sections.channel_series`), else parallel flanges."""
    dims = (v["d"], v["bf"], v["tf"], v["tw"])
    if all(v.get(k) is None for k in ("slope", "r1", "r2")) and channel_series(*dims) is not None:
        return series_channel(*dims, name=designation)
    return RolledChannel(*dims, slope=v.get("slope", 0.0), r1=v.get("r1"), r2=v.get("r2"), name=designation)


def _catalog_clash(designation: str) -> str | None:
    from calcpad.eng.sections.catalog import get_entry  # same package; lazy (the catalog hooks into this module)

    try:
        return get_entry(designation).designation
    except InputError:
        return None


def read_shop_table(data: bytes | str, name: str = "shop table") -> ShopTable:
    """Validate a shop table's content (bytes as read, or text); every problem is collected.

    Raises:
        ShopTableError: one or more problems, each with its row number; nothing is returned.
    """
    raw = data.encode("utf-8") if isinstance(data, str) else bytes(data)
    problems: list[tuple[str, str]] = []
    if len(raw) > MAX_BYTES:
        raise ShopTableError(name, [("", f"{len(raw)} bytes; a shop table is limited to {MAX_BYTES} bytes")])
    try:
        text = raw.decode("utf-8")  # kept as read (a BOM too), so the text's digest is the file's
    except UnicodeDecodeError as exc:
        raise ShopTableError(name, [("", f"not UTF-8 text (byte {exc.start}); save the table as CSV UTF-8")]) from None
    lines = text.removeprefix("\ufeff").splitlines()
    source_note = ""
    header: dict[int, tuple[str, Any]] | None = None
    header_line = 0
    rows: list[ShopRow] = []
    seen: dict[str, int] = {}
    for line_no, line in enumerate(lines, start=1):
        if not line.strip():
            continue
        if line.lstrip().startswith("#"):
            c = line.lstrip()[1:].strip()
            if c.lower().startswith("source:") and not source_note:
                source_note = c.split(":", 1)[1].strip()
            continue
        cells = next(csv.reader([line]))
        if not any(c.strip() for c in cells):
            continue  # an empty spreadsheet row (",,,,")
        if header is None:
            header_line = line_no
            header = _header(cells, line_no, problems)
            if problems:
                break  # rows cannot be read against a broken header
            continue
        if len(rows) + 1 > MAX_ROWS:
            problems.append((f"row {line_no}", f"more than {MAX_ROWS} rows"))
            break
        row = _read_row(cells, header, line_no, problems, seen)
        if row is not None:
            rows.append(row)
    if header is None:
        problems.append(("", "no header row (designation,family,... with units in brackets)"))
    elif not rows and not problems:
        problems.append((f"row {header_line}", "the table has a header but no rows"))
    if problems:
        raise ShopTableError(name, problems)
    return ShopTable(name, hashlib.sha256(raw).hexdigest(), text, tuple(rows), source_note)


def _read_row(cells: list[str], header: dict[int, tuple[str, Any]], line: int, problems: list[tuple[str, str]],
              seen: dict[str, int]) -> ShopRow | None:
    where = f"row {line}"
    n_before = len(problems)
    width = max(header) + 1 if header else 0
    if len(cells) > width and any(c.strip() for c in cells[width:]):
        problems.append((where, f"{len(cells)} cells; the header has {width} columns"))
        return None
    cell = {header[i][0]: cells[i].strip() if i < len(cells) else "" for i in header}
    designation, family = cell.get("designation", ""), cell.get("family", "")
    if not designation:
        problems.append((where, "empty designation"))
    if family not in FAMILY_COLUMNS:
        close = difflib.get_close_matches(family, FAMILY_COLUMNS, n=1, cutoff=0.5)
        hint = f"; did you mean {close[0]!r}?" if close else ""
        problems.append((where, f"family {family!r}{hint} (expected one of {', '.join(FAMILY_COLUMNS)})"))
        return None
    required, optional = FAMILY_COLUMNS[family]
    values: dict[str, float] = {}
    for col in (*required, *_ALWAYS):
        if col not in cell:
            problems.append((where, f"family {family!r} needs column {col!r}, which the header lacks "
                                    f"(add '{col} [{_example_unit(col)}]')"))
        elif not cell[col]:
            problems.append((where, f"{col} ({COLUMNS[col][2]}) is empty; family {family!r} needs it"))
    for col, text in cell.items():
        if col in ("designation", "family") or not text:
            continue
        if col not in required and col not in optional and col not in _ALWAYS:
            problems.append((where, f"{col} = {text!r} is not used for family {family!r} (it uses "
                                    f"{', '.join((*required, *optional, *_ALWAYS))}); leave the cell empty"))
            continue
        unit = header[next(i for i, (n, _) in header.items() if n == col)][1]
        try:
            x = _cell_value(col, unit, text, f"{where}, {col}")
        except ValueError as exc:
            problems.append((where, f"{col}: {exc}"))
            continue
        if not math.isfinite(x):
            problems.append((where, f"{col}: {text!r} is not a finite value"))
            continue
        allow_zero = col in ("r1", "r2", "slope")
        if x < 0 or (x == 0 and not allow_zero):
            what = "thickness" if col in THICKNESS_COLUMNS else COLUMNS[col][2]
            problems.append((where, f"{col}: {text!r} is {'negative' if x < 0 else 'zero'}; expected a positive {what}"))
            continue
        if col == "H_flex" and x > 1.0:
            problems.append((where, f"H_flex: {text!r} is above 1; H = 1 - (x_o^2 + y_o^2)/r_o^2 lies between 0 and 1 "
                                    "(AISC 360-16 Eq. E4-8)"))
            continue
        values[col] = x
    if designation:
        key = _norm(designation)
        if key in seen:
            problems.append((where, f"designation {designation!r} repeats row {seen[key]}"))
        else:
            seen[key] = line
            clash = _catalog_clash(designation)
            if clash is not None:
                problems.append((where, f"designation {designation!r} names the catalog section {clash!r}; a shop row needs a "
                                        f"name of its own (e.g. '{designation} SHOP')"))
    if len(problems) > n_before:
        return None
    build = _builder(family, designation, values)
    try:
        shape = build()
        props = shape.props
    except InputError as exc:
        problems.append((where, f"the dimensions do not make a {family}: {exc}"))
        return None
    a_ratio = values["A"] / props.A - 1.0
    if abs(a_ratio) > AREA_TOLERANCE:
        problems.append((where, f"A = {values['A']:.4g} in^2 differs from the area of the dimensions, {props.A:.4g} in^2, by "
                                f"{a_ratio * 100:+.1f} % (allowed ±{AREA_TOLERANCE * 100:g} %)"))
    w_ratio = values["weight"] / props.weight - 1.0
    if abs(w_ratio) > WEIGHT_TOLERANCE:
        problems.append((where, f"weight = {values['weight']:.4g} lb/ft differs from the weight of the dimensions at "
                                f"{STEEL_DENSITY_PCF:g} lb/ft^3, {props.weight:.4g} lb/ft, by {w_ratio * 100:+.1f} % "
                                f"(allowed ±{WEIGHT_TOLERANCE * 100:g} %)"))
    stated = {k: x for k, x in values.items() if k in PROPERTY_COLUMNS}
    for name, x in stated.items():
        off = mismatch(name, x, reference(family, name, shape, values), family)
        if off is not None:
            problems.append((where, off))
    if len(problems) > n_before:
        return None
    if stated:
        build = _with_stated(build, stated, f"the shop table (row {line})")
    return ShopRow(designation, family, line, values, build)


def _with_stated(build: Callable[[], Shape], stated: dict[str, float], source: str) -> Callable[[], Shape]:
    """A builder whose shapes carry the stated properties in place of the computed ones."""

    def shape() -> Shape:
        s = build()
        # Shape.props is a functools.cached_property: presetting it makes the stated values the
        # shape's properties (as the catalog does with its published ones)
        vars(s)["props"] = stated_props(s.props, stated, source)
        return s

    return shape


def load_shop_table(path: str | Path, name: str | None = None) -> ShopTable:
    """Read and validate a shop table file (see the module docstring).

    Raises:
        ShopTableError: unreadable file or any problem in it (all listed, with row numbers).
    """
    p = Path(path)
    label = name or p.name
    try:
        data = p.read_bytes()
    except OSError as exc:
        raise ShopTableError(label, [("", f"cannot read {str(p)!r} ({exc.__class__.__name__}: {exc.strerror or exc})")]) from None
    return read_shop_table(data, label)


# --------------------------------------------------------------------------- the table in use

_ACTIVE: ShopTable | None = None
_FROM_ENV: dict[tuple[str, str], ShopTable] = {}


def use_shop_table(table: ShopTable | None) -> ShopTable | None:
    """Make ``table`` the shop table section lookups consult (None: none); returns the previous one."""
    global _ACTIVE
    previous, _ACTIVE = _ACTIVE, table
    return previous


@contextlib.contextmanager
def shop_table_in_use(table: ShopTable | None) -> Iterator[ShopTable | None]:
    """``with shop_table_in_use(table): ...`` — the table is consulted inside the block only."""
    previous = use_shop_table(table)
    try:
        yield table
    finally:
        use_shop_table(previous)


def active_shop_table() -> ShopTable | None:
    """The table in use: set by :func:`use_shop_table`, else named by :data:`ENV_PATH` (a kernel run)."""
    if _ACTIVE is not None:
        return _ACTIVE
    path = os.environ.get(ENV_PATH)
    if not path:
        return None
    want = os.environ.get(ENV_SHA256, "")
    key = (path, want)
    if key not in _FROM_ENV:
        table = load_shop_table(path)
        if want and table.sha256 != want:
            raise ShopTableError(table.name, [("", f"the file changed since the job was read (sha256 {table.sha256[:12]}, "
                                                   f"expected {want[:12]}); run the job again")])
        _FROM_ENV[key] = table
    return _FROM_ENV[key]


def shop_section(designation: Any) -> Shape | None:
    """The shape of a designation from the shop table in use, or None."""
    table = active_shop_table()
    if table is None or not isinstance(designation, str):
        return None
    row = table.get(designation)
    return row.shape() if row is not None else None


def shop_note(label: Any) -> str | None:
    """The sheet note for a section label that names a row of the shop table in use, or None."""
    table = active_shop_table()
    if table is None or not isinstance(label, str):
        return None
    row = table.get(label)
    return table.note(row) if row is not None else None


def note_shop_section(sheet: Any, label: Any) -> None:
    """Write the shop-table note on ``sheet`` (once) when ``label`` names a row of the table in use."""
    note = shop_note(label)
    if note is None:
        return
    if any(getattr(s, "kind", None) == "note" and getattr(s, "text", None) == note for s in sheet.steps):
        return
    sheet.note(note)
