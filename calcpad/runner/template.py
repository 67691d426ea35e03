"""Inspect a template: its cells, and the parameters cell → names, defaults, units, ranges.

A template is ``notebooks/NAME.py`` (jupytext percent format) or ``NAME.ipynb``. The cell tagged
``parameters`` holds one assignment per line::

    L = "42 in"  # leg length from base to load; 6 in to 30 ft
    exposure = "C"  # terrain exposure category; B, C or D
    FS_req = 1.67  # required factor of safety against yield; 1.0 to 5.0

The parameters cell is read with :mod:`ast` (literals only, ``ast.literal_eval``) and
:mod:`tokenize` (comments); it is never executed here. The comment is "description; range".
Ranges: ``A to B``, ``A up to B``, ``> A``, ``>= A``, ``< B``, ``A < name <= B``; bounds are a
value with a unit (a unitless bound borrows the other bound's unit, else the default's), or
another parameter (``D_o/2``, ``weld_pitch``). Choices: ``B, C or D``. Anything else after
the ``;`` is kept as a note and not enforced.
"""

from __future__ import annotations

import ast
import difflib
import io
import json
import os
import re
import tokenize
from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import pint

from calcpad.core.errors import InputError, UnitInputError
from calcpad.core.units import Q_, kind_of, parse_quantity, unit_symbol

__all__ = [
    "Bound",
    "Cell",
    "Parameter",
    "Template",
    "TemplateError",
    "find_template",
    "is_what_if_cell",
    "library_template",
    "list_templates",
    "load_template",
    "template_dirs",
]

ROOT = Path(__file__).resolve().parent.parent.parent
#: Extra template folders (``os.pathsep``-separated) searched before the repository's notebooks/.
ENV_VAR = "CALCPAD_TEMPLATES"

_MARKER = re.compile(r"^# %%(.*)$")
_TAGS = re.compile(r"tags\s*=\s*(\[[^\]]*\])")
_NUMERIC = re.compile(r"^\s*[-+]?(\d|\.\d)")
_NAME = re.compile(r"^[A-Za-z0-9][A-Za-z0-9_-]{0,63}$")
_REF = re.compile(r"^(?:(?P<k1>\d+(?:\.\d+)?)\s*\*\s*)?(?P<name>[A-Za-z_]\w*)(?:\s*(?P<op>[*/])\s*(?P<k2>\d+(?:\.\d+)?))?$")


class TemplateError(InputError):
    """A template file cannot be read or its parameters cell breaks the template contract."""


@dataclass
class Cell:
    """One notebook cell: ``index`` is 1-based over all cells, as in the stored ``.ipynb``."""

    index: int
    kind: str  # "code" | "markdown"
    source: str
    tags: list[str] = field(default_factory=list)


@dataclass
class Bound:
    """A range bound: a quantity, or a reference ``factor * other_parameter``."""

    text: str
    inclusive: bool
    value: pint.Quantity | None = None
    ref: str | None = None
    factor: float = 1.0

    def resolve(self, values: dict[str, pint.Quantity]) -> pint.Quantity | None:
        """The bound's quantity (references are looked up in ``values``; None if unknown)."""
        if self.ref is None:
            return self.value
        other = values.get(self.ref)
        return None if other is None else other * self.factor


@dataclass
class Parameter:
    """A template parameter read from the parameters cell."""

    name: str
    default: str | int | float | bool
    description: str = ""
    range_text: str = ""
    kind: str = "text"  # "quantity" (value with unit) | "number" | "text"
    lower: Bound | None = None
    upper: Bound | None = None
    choices: list[str] = field(default_factory=list)
    note: str = ""  # range text that could not be read (shown, not enforced)

    @property
    def quantity(self) -> pint.Quantity | None:
        """The default as a quantity (quantity and number kinds)."""
        if self.kind == "text":
            return None
        return parse_quantity(self.default, f"parameter {self.name!r} default")

    @property
    def unit(self) -> str:
        """The default's unit (ASCII abbreviation; "" for numbers and text)."""
        q = self.quantity
        return unit_symbol(q.units, "ascii") if q is not None else ""

    def coerce(self, value: Any, where: str) -> str | float | bool:
        """Check one job value against this parameter's kind and dimension (not its range).

        Returns the value as it goes into the template: a ``"value unit"`` string for a
        quantity, a float for a number, the string for text. Raises InputError.
        """
        if isinstance(value, dict):
            extra = set(value) - {"value", "unit"}
            if "value" not in value or extra:
                raise InputError(f"{where}: {value!r}; expected a table with keys 'value' and 'unit', e.g. {{ value = 84, unit = \"in\" }}")
            v = value["value"]
            if isinstance(v, bool) or not isinstance(v, (int, float)):
                raise InputError(f"{where}.value: {v!r}; expected a number")
            unit = value.get("unit", "")
            if not isinstance(unit, str):
                raise InputError(f"{where}.unit: {unit!r}; expected a unit string such as 'in'")
            value = f"{v!r} {unit}".strip()  # repr keeps every digit ({v:g} kept six)
        if self.kind == "text":
            if not isinstance(value, str) or not value.strip():
                raise InputError(f"{where}: {value!r}; expected a text value like {self.default!r}")
            if self.choices and value not in self.choices:
                close = difflib.get_close_matches(value, self.choices, n=1, cutoff=0.3)
                hint = f"; did you mean {close[0]!r}?" if close else ""
                raise InputError(f"{where}: {value!r} is not one of {', '.join(self.choices)}{hint}")
            return value
        if isinstance(value, bool) or not isinstance(value, (str, int, float)):
            raise InputError(f"{where}: {value!r}; expected a value like {self.default!r}")
        default = self.quantity
        assert default is not None
        try:
            q = parse_quantity(value, where)
        except UnitInputError as exc:
            raise InputError(str(exc)) from None
        if q.dimensionality != default.dimensionality:
            got = "a number without a unit" if q.dimensionless else f"a {kind_of(q.dimensionality)} ({unit_symbol(q.units, 'ascii')})"
            raise UnitInputError(
                f"{where}: {value!r} is {got}; expected a {kind_of(default.dimensionality)} like {self.default!r}"
            )
        if self.kind == "number":  # same Python type as the template's default
            if isinstance(self.default, str):
                return value if isinstance(value, str) else repr(value)
            return float(q.magnitude) if isinstance(value, str) else value
        return value if isinstance(value, str) else f"{value} {self.unit}".strip()

    def check_range(self, value: Any, values: dict[str, pint.Quantity], where: str) -> None:
        """Raise InputError when ``value`` (already coerced) lies outside the stated range."""
        if self.kind == "text":
            return
        q = parse_quantity(value, where)
        for bound, side in ((self.lower, "lower"), (self.upper, "upper")):
            if bound is None:
                continue
            b = bound.resolve(values)
            if b is None or b.dimensionality != q.dimensionality:
                continue
            a, lim = float(q.to_base_units().magnitude), float(b.to_base_units().magnitude)
            tol = 1e-12 * max(abs(a), abs(lim), 1e-300)
            bad = (a < lim - tol if bound.inclusive else a <= lim + tol) if side == "lower" else (a > lim + tol if bound.inclusive else a >= lim - tol)
            if bad:
                raise InputError(f"{where}: {value!r} is outside the stated range '{self.range_text}' (parameter {self.name!r})")


def is_what_if_cell(source: str) -> bool:
    """True for the cell that makes the what-if panel (batch runs and rebuilds stop before it)."""
    return "what_if(" in source


@dataclass
class Template:
    """A template notebook read from disk (nothing executed)."""

    name: str
    path: Path
    title: str
    cells: list[Cell]
    parameters: dict[str, Parameter]
    parameters_cell: int  # 1-based cell index of the parameters cell
    _body: list[tuple[int, Any]] | None = field(default=None, init=False, repr=False, compare=False)

    @property
    def code_cells(self) -> list[Cell]:
        """Code cells in order."""
        return [c for c in self.cells if c.kind == "code"]

    def body(self) -> list[tuple[int, Any]]:
        """The calc: code cells after the parameters cell and before the first what-if cell, as
        ``(cell index, code object)``, compiled once per template. The what-if cells are for the
        notebook reader; a batch run and a what-if rebuild both stop before them."""
        if self._body is None:
            cells = []
            for cell in self.code_cells:
                if cell.index == self.parameters_cell:
                    continue
                if is_what_if_cell(cell.source):
                    break
                cells.append((cell.index, compile(cell.source, f"<template {self.name} cell {cell.index}>", "exec")))
            self._body = cells
        return self._body

    def suggest(self, name: str) -> str:
        """``"; did you mean 'L'?"`` for a misspelt parameter name (or "")."""
        close = difflib.get_close_matches(name, list(self.parameters), n=3, cutoff=0.5)
        return f"; did you mean {', '.join(repr(c) for c in close)}?" if close else ""


# ----------------------------------------------------------------------------- cells


def _strip_blank(lines: list[str]) -> list[str]:
    while lines and not lines[0].strip():
        lines = lines[1:]
    while lines and not lines[-1].strip():
        lines = lines[:-1]
    return lines


def _uncomment(lines: list[str]) -> list[str]:
    out = []
    for line in lines:
        if line.startswith("# "):
            out.append(line[2:])
        elif line.startswith("#"):
            out.append(line[1:])
        else:
            out.append(line)
    return out


def read_percent(text: str) -> list[Cell]:
    """Split a jupytext percent-format script into cells (the subset our templates use)."""
    lines = text.splitlines()
    if lines and lines[0].strip() == "# ---":  # jupytext YAML header
        end = next((i for i in range(1, len(lines)) if lines[i].strip() == "# ---"), 0)
        lines = lines[end + 1 :]
    cells: list[Cell] = []
    header: str | None = None
    body: list[str] = []

    def flush() -> None:
        if header is None:
            if _strip_blank(body):
                cells.append(Cell(len(cells) + 1, "code", "\n".join(_strip_blank(body))))
            return
        kind = "markdown" if re.search(r"\[(markdown|md)\]", header) else "code"
        tags: list[str] = []
        m = _TAGS.search(header)
        if m:
            try:
                tags = [str(t) for t in json.loads(m.group(1))]
            except ValueError:
                tags = []
        src = _strip_blank(body)
        if kind == "markdown":
            src = _uncomment(src)
        cells.append(Cell(len(cells) + 1, kind, "\n".join(src), tags))

    for line in lines:
        m = _MARKER.match(line)
        if m:
            flush()
            header, body = m.group(1), []
        else:
            body.append(line)
    flush()
    return cells


def read_ipynb(path: Path) -> list[Cell]:
    """Cells of a stored notebook (plain JSON; nbformat is not imported)."""
    try:
        nb = json.loads(path.read_text(encoding="utf-8"))
        raw = nb["cells"]
    except (OSError, ValueError, KeyError, TypeError) as exc:
        raise TemplateError(f"template {str(path)!r}: not a readable notebook ({exc})") from None
    cells = []
    for i, c in enumerate(raw, start=1):
        src = c.get("source", "")
        src = "".join(src) if isinstance(src, list) else str(src)
        cells.append(Cell(i, c.get("cell_type", "code"), src, list(c.get("metadata", {}).get("tags", []))))
    return cells


# ----------------------------------------------------------------------------- parameters


def _comments(source: str) -> dict[int, str]:
    out: dict[int, str] = {}
    try:
        for tok in tokenize.generate_tokens(io.StringIO(source).readline):
            if tok.type == tokenize.COMMENT:
                out[tok.start[0]] = tok.string.lstrip("#").strip()
    except (tokenize.TokenError, IndentationError):
        pass
    return out


def _split_comment(comment: str) -> tuple[str, str]:
    if ";" not in comment:
        return comment.strip(), ""
    desc, _, rng = comment.rpartition(";")
    return desc.strip(), rng.strip()


def _bound(text: str, inclusive: bool, names: set[str]) -> Bound | None:
    text = text.strip()
    m = _REF.match(text)
    if m and m.group("name") in names:
        factor = float(m.group("k1") or 1.0)
        if m.group("k2"):
            k2 = float(m.group("k2"))
            factor = factor / k2 if m.group("op") == "/" else factor * k2
        return Bound(text, inclusive, ref=m.group("name"), factor=factor)
    if not _NUMERIC.match(text):
        return None
    try:
        return Bound(text, inclusive, value=parse_quantity(text, "range bound"))
    except InputError:
        return None


def _unit_fix(bounds: list[Bound], default: pint.Quantity | None) -> None:
    """A bound written without a unit borrows the other bound's unit, else the default's."""
    with_unit = [b.value for b in bounds if b.value is not None and not b.value.dimensionless]
    unit = with_unit[0].units if with_unit else (default.units if default is not None else None)
    if unit is None:
        return
    for b in bounds:
        if b.value is not None and b.value.dimensionless and not (default is not None and default.dimensionless):
            b.value = Q_(float(b.value.magnitude), unit)


def _parse_range(p: Parameter, names: set[str]) -> None:
    text = p.range_text
    if not text:
        return
    default = p.quantity
    if p.kind == "text":
        words = [w.strip().strip("'\"") for w in re.split(r",|\bor\b", re.sub(r"^one of\s+", "", text))]
        if len(words) >= 2 and all(w and len(w) <= 24 and " " not in w for w in words):
            p.choices = words
        else:
            p.note = text
        return
    bounds: list[Bound] = []
    lo = hi = None
    m = re.match(r"^(.+?)\s+(?:to|up to|through)\s+(.+)$", text)
    chain = re.match(r"^(.+?)\s*(<=|<)\s*([A-Za-z_]\w*)\s*(<=|<)\s*(.+)$", text)
    one = re.match(r"^(?:([A-Za-z_]\w*)\s*)?(>=|>|<=|<|≥|≤)\s*(.+)$", text)
    if chain:
        lo = _bound(chain.group(1), chain.group(2) == "<=", names)
        hi = _bound(chain.group(5), chain.group(4) == "<=", names)
        ok = lo is not None and hi is not None
    elif m:
        lo, hi = _bound(m.group(1), True, names), _bound(m.group(2), True, names)
        ok = lo is not None and hi is not None
    elif one:
        op = one.group(2).replace("≥", ">=").replace("≤", "<=")
        b = _bound(one.group(3), op.endswith("="), names)
        ok = b is not None
        if op.startswith(">"):
            lo = b
        else:
            hi = b
    else:
        ok = False
    if not ok:
        p.note = text
        return
    bounds = [b for b in (lo, hi) if b is not None]
    _unit_fix(bounds, default)
    for b in bounds:
        if b.value is not None and default is not None and b.value.dimensionality != default.dimensionality:
            p.note = text
            return
    p.lower, p.upper = lo, hi


def parse_parameters(source: str, where: str) -> dict[str, Parameter]:
    """Read the parameters cell: literal assignments only (``ast.literal_eval``), never run."""
    try:
        tree = ast.parse(source)
    except SyntaxError as exc:
        raise TemplateError(f"{where}: the parameters cell is not valid Python (line {exc.lineno}: {exc.msg})") from None
    comments = _comments(source)
    params: dict[str, Parameter] = {}
    for node in tree.body:
        if not (isinstance(node, ast.Assign) and len(node.targets) == 1 and isinstance(node.targets[0], ast.Name)):
            raise TemplateError(f"{where}: parameters cell line {node.lineno}: expected 'name = literal  # description; range'")
        name = node.targets[0].id
        try:
            value = ast.literal_eval(node.value)
        except ValueError:
            raise TemplateError(f"{where}: parameter {name!r} (line {node.lineno}) is not a literal string or number") from None
        if isinstance(value, bool) or not isinstance(value, (str, int, float)):
            raise TemplateError(f"{where}: parameter {name!r} = {value!r}; expected a string ('84 in', 'A36') or a number")
        comment = comments.get(node.end_lineno or node.lineno) or comments.get(node.lineno, "")
        desc, rng = _split_comment(comment)
        if isinstance(value, str):
            kind = "quantity" if _NUMERIC.match(value) else "text"
        else:
            kind = "number"
        p = Parameter(name, value, desc, rng, kind)
        if kind != "text":
            try:
                q = p.quantity
            except InputError:
                p.kind = "text"
            else:
                if kind == "quantity" and q is not None and q.dimensionless:
                    p.kind = "number"
        if name in params:
            raise TemplateError(f"{where}: parameter {name!r} is assigned twice in the parameters cell")
        params[name] = p
    names = set(params)
    for p in params.values():
        _parse_range(p, names)
    return params


# ----------------------------------------------------------------------------- loading


def _title(cells: list[Cell], fallback: str) -> str:
    for c in cells:
        if c.kind == "markdown":
            for line in c.source.splitlines():
                if line.startswith("# "):
                    return line[2:].strip()
    return fallback


_CACHE: dict[tuple[str, float], Template] = {}


def load_template(path: str | Path) -> Template:
    """Read a template file (``.py`` percent script or ``.ipynb``). Raises TemplateError."""
    path = Path(path)
    try:
        stamp = path.stat().st_mtime
    except OSError:
        raise TemplateError(f"template {str(path)!r}: file not found") from None
    key = (str(path.resolve()), stamp)
    if key in _CACHE:
        return _CACHE[key]
    if path.suffix == ".ipynb":
        cells = read_ipynb(path)
    elif path.suffix == ".py":
        try:
            cells = read_percent(path.read_text(encoding="utf-8"))
        except (OSError, UnicodeDecodeError) as exc:
            raise TemplateError(f"template {str(path)!r}: cannot read it ({exc})") from None
    else:
        raise TemplateError(f"template {str(path)!r}: expected a .py (jupytext percent) or .ipynb file")
    tagged = [c for c in cells if c.kind == "code" and "parameters" in c.tags]
    if len(tagged) != 1:
        raise TemplateError(f"template {path.name!r}: expected exactly one code cell tagged 'parameters', found {len(tagged)}")
    params = parse_parameters(tagged[0].source, f"template {path.stem!r}")
    tpl = Template(path.stem, path, _title(cells, path.stem), cells, params, tagged[0].index)
    _CACHE[key] = tpl
    return tpl


def template_dirs(extra: Sequence[str | Path] = ()) -> list[Path]:
    """The template library, in search order: ``extra`` (``--templates``), ``$CALCPAD_TEMPLATES``, notebooks/.

    Templates are code: only files in these folders are ever run.
    """
    dirs = [Path(p) for p in extra]
    dirs += [Path(p) for p in os.environ.get(ENV_VAR, "").split(os.pathsep) if p]
    dirs.append(ROOT / "notebooks")
    return dirs


def _scan(dirs: Sequence[Path]) -> tuple[dict[str, Path], dict[str, Path]]:
    """(name → file inside the library, name → file whose real path lies outside its folder)."""
    found: dict[str, Path] = {}
    outside: dict[str, Path] = {}
    for d in dirs:
        if not d.is_dir():
            continue
        real_dir = d.resolve()
        here: dict[str, Path] = {}
        for f in sorted(d.iterdir()):
            if f.suffix in (".py", ".ipynb") and _NAME.match(f.stem) and (f.stem not in here or f.suffix == ".py"):
                here[f.stem] = f
        for stem, f in here.items():
            if stem in found:
                continue
            if f.resolve().is_relative_to(real_dir) and f.is_file():
                found[stem] = f
            else:
                outside.setdefault(stem, f)
    return dict(sorted(found.items())), outside


def list_templates(extra: Sequence[str | Path] = ()) -> dict[str, Path]:
    """Template name → file, ``.py`` preferred over ``.ipynb``; first folder wins.

    Files that resolve (through links) outside their library folder are left out.
    """
    return _scan(template_dirs(extra))[0]


def _library_hint() -> str:
    return f"templates are code and run only from the template folders (built-in notebooks/, --templates DIR, ${ENV_VAR})"


def find_template(name: str, extra: Sequence[str | Path] = ()) -> Path:
    """The file of the library template called ``name`` (a bare name). Raises TemplateError.

    Paths (separators, ``..``, absolute), file suffixes and names that resolve outside the
    library folders are refused: a job file names a template, it never points at code.
    """
    if not isinstance(name, str) or not _NAME.match(name):
        if isinstance(name, str) and name.endswith((".py", ".ipynb")) and _NAME.match(Path(name).stem) and "/" not in name and "\\" not in name:
            raise TemplateError(f"template {name!r}: write the name without the file suffix ({Path(name).stem!r})")
        raise TemplateError(
            f"template {name!r}: expected a template name (letters, digits, '_' or '-'), not a path; {_library_hint()}"
        )
    found, outside = _scan(template_dirs(extra))
    if name in found:
        return found[name]
    if name in outside:
        raise TemplateError(f"template {name!r}: {outside[name]} resolves outside its template folder; refused ({_library_hint()})")
    close = difflib.get_close_matches(name, list(found), n=3, cutoff=0.5)
    hint = f"; did you mean {', '.join(repr(c) for c in close)}?" if close else ""
    raise TemplateError(f"unknown template {name!r}{hint} (available: {', '.join(sorted(found)) or 'none'})")


def library_template(path: str | Path, extra: Sequence[str | Path] = ()) -> Path:
    """A template given as a file path (command line): accepted only inside a library folder."""
    p = Path(path)
    real = p.resolve()
    if real.is_file() and real.suffix in (".py", ".ipynb"):
        for d in template_dirs(extra):
            if d.is_dir() and real.parent == d.resolve():
                return p
    raise TemplateError(
        f"template {str(path)!r}: not in a template folder; {_library_hint()}. Register its folder with --templates DIR if it is code you trust"
    )
