"""Job files: a TOML title block plus a list of calcs (template, member marks, inputs).

::

    [job]
    number = "HRM-2417"
    title = "Rooftop condenser stand CS-2"
    client = "..."; site = "..."; engineer = "..."; checker = "..."
    revision = "A"
    date = 2025-03-14            # a TOML date or a string
    codes = ["AISC 360-16", "ASCE 7-16"]
    units = "US"                 # "US" or "SI": display units of sheets that do not fix their own
    paper = "letter"             # optional: "letter" (default) or "a4", the submittal's page size
    print = "full"               # optional: "full", "summary" or "calc:MARK" (what the submittal prints)
    shop_sections = "shop.csv"   # optional: the shop's own sections (CSV beside the job file)

    [[job.revisions]]            # optional revision log, oldest first; must include `revision`
    rev = "A"
    date = 2025-03-14
    description = "Issued for review"
    by = "D. Okafor"

    [[calcs]]
    template = "leg_bending"     # a name from `calcpad templates` (never a path: templates are code)
    members = ["L1", "L3"]       # or member = "L1", or table = "legs.csv" (runner.members: one row per member)
    title = "Legs L1 and L3"     # optional
    note = "Why these legs differ from the others"   # optional, printed on the calc's sheets
    [calcs.inputs]
    P = "85 lbf"                 # "value unit", { value = 85, unit = "lbf" }, a number or a text
    ...
    [calcs.design]               # optional design search (runner.search): lightest passing size per member
    family = "pipe"

Every parameter of the template must be given (the job file is the complete record of what was
assumed; `calcpad new` writes them all). Template parameters named ``member_mark``,
``calc_title`` and ``calc_note`` are filled by the runner with the member mark, the calc's
``title`` and its ``note`` (an engineer's note printed on the sheets of templates that declare it). ``[job]``
may carry ``basis``: a text or a list of texts stating the design basis (load sources, the
owner's criteria), printed in the submittal's design criteria, and ``shop_sections``: a CSV file
(relative to the job file) of the shop's own sections, validated row by row
(:mod:`calcpad.eng.sections.shop`); its problems are the job's problems. The job file is data only:
nothing in it is executed, and a template is named, never pointed at: it is looked up in the
template library folders (:func:`~calcpad.runner.template.find_template`), and names that are
paths are refused. Validation
collects every problem, each with its location (``calcs[3].inputs.L``; calcs count from 1 in
file order) and raises one :class:`JobError`.
"""

from __future__ import annotations

import datetime as dt
import difflib
import hashlib
import json
import re
import tomllib
from collections.abc import Sequence
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import pint

from calcpad.core.errors import InputError, ProblemListError
from calcpad.core.units import parse_quantity, unit_symbol
from calcpad.eng.sections.shop import ShopTable, ShopTableError, load_shop_table
from calcpad.runner.template import Template, TemplateError, find_template, library_template, load_template

__all__ = [
    "PAPERS",
    "Calc",
    "Job",
    "JobError",
    "JobInfo",
    "check_print_mark",
    "input_record",
    "load_job",
    "parse_job",
    "print_mode",
    "section_parameters",
    "section_problem",
    "single_template_job",
]

JOB_KEYS = ("number", "title", "client", "site", "engineer", "checker", "revision", "date", "codes", "units", "paper", "print", "revisions",
            "basis", "shop_sections")
PAPERS = ("letter", "a4")
REVISION_KEYS = ("rev", "date", "description", "by")
REQUIRED_JOB_KEYS = ("number", "title", "client", "site", "engineer", "revision", "date")
CALC_KEYS = ("template", "member", "members", "table", "table_sheet", "title", "note", "inputs", "design")
#: Template parameters the runner fills from the job: the member mark and the calc's title.
CONTEXT_PARAMETERS = ("member_mark", "calc_title", "calc_note")
_OTHER_JOB_KEYS = ("codes", "units", "paper", "print", "revisions", "basis", "shop_sections")
_MARK = re.compile(r"^[A-Za-z0-9][A-Za-z0-9 ._/-]{0,31}$")
_TOML_POS = re.compile(r"\(at line (\d+), column (\d+)\)")


class JobError(ProblemListError):
    """A job file with problems; ``problems`` lists ``(location, message)`` pairs."""


@dataclass
class JobInfo:
    """The title block of a job."""

    number: str
    title: str
    client: str = ""
    site: str = ""
    engineer: str = ""
    checker: str = ""
    revision: str = ""
    date: str = ""
    codes: list[str] = field(default_factory=list)
    units: str = "US"
    paper: str = "letter"  # "letter" or "a4"
    print: str = "full"  # "full", "summary" or "calc:MARK"
    revisions: list[dict[str, str]] = field(default_factory=list)  # {"rev", "date", "description", "by"}
    basis: list[str] = field(default_factory=list)  # design basis notes: load sources, owner's criteria

    def as_dict(self) -> dict[str, Any]:
        """Plain dictionary (for the record)."""
        return {k: ([dict(x) if isinstance(x, dict) else x for x in v] if isinstance(v, list) else v) for k, v in self.__dict__.items()}


@dataclass
class Calc:
    """One calc to run: a template for one member with its validated inputs."""

    number: int  # 1-based, in run order
    location: str  # "calcs[2]" — where it came from in the job file
    template: Template
    member: str
    inputs: dict[str, str | float]  # values as they go into the template
    title: str = ""
    typed: dict[str, Any] = field(default_factory=dict)  # inputs as written in the job (TOML value or --set text)
    note: str = ""  # the job's note for this calc (printed by templates that declare calc_note)
    table: str | None = None  # the member table the calc's row came from (its name as written in the job)
    row: int | None = None  # that row's number (header = row 1)
    design: dict[str, Any] | None = None  # design search settings ([calcs.design]); the result once searched

    @property
    def input_digest(self) -> str:
        """SHA-256 over template name, member and inputs (canonical JSON)."""
        payload = json.dumps({"template": self.template.name, "member": self.member, "inputs": self.inputs}, sort_keys=True)
        return hashlib.sha256(payload.encode()).hexdigest()


@dataclass
class Job:
    """A validated job: title block and the calcs expanded per member."""

    info: JobInfo
    calcs: list[Calc]
    source: str = ""
    text: str | None = None  # the job file text as read (None for a one-template --set run)
    library: tuple[str, ...] = ()  # extra template library folders (--templates) the job was read with
    shop_table: ShopTable | None = None  # [job] shop_sections: the shop's own validated section table
    shop_file: str = ""  # the shop_sections value as written in the job file
    shop_path: str = ""  # its absolute path ("" when the table came from a record)
    tables: dict[str, Any] = field(default_factory=dict)  # member tables by name as written (runner.members.MemberTable)

    def table_calcs(self, name: str) -> list[Calc]:
        """The calcs made from the rows of member table ``name``."""
        return [c for c in self.calcs if c.table == name]


def input_record(value: str | float, kind: str | None = None) -> dict[str, Any]:
    """``{"value": 84.0, "unit": "in"}`` for a quantity, ``{"value": "A36", "unit": None}`` for text.

    ``kind`` is the template parameter's kind ("quantity", "number" or "text"); a text is kept as
    typed (``"C"`` is an exposure category, not a coulomb). Without a kind, a string that does
    not read as a quantity is kept as text.
    """
    if kind == "text" or isinstance(value, bool):
        return {"value": value, "unit": None}
    if isinstance(value, (int, float)):
        return {"value": float(value), "unit": ""}
    try:
        q = parse_quantity(value, "input")
    except InputError:
        return {"value": value, "unit": None}
    return {"value": float(q.magnitude), "unit": unit_symbol(q.units, "ascii")}


def _suggest(word: str, pool: list[str] | tuple[str, ...]) -> str:
    close = difflib.get_close_matches(word, list(pool), n=3, cutoff=0.5)
    return f"; did you mean {', '.join(repr(c) for c in close)}?" if close else ""


def _str_field(table: dict[str, Any], key: str, loc: str, problems: list[tuple[str, str]], required: bool) -> str:
    if key not in table:
        if required:
            problems.append((loc, f"missing {key!r} (text)"))
        return ""
    v = table[key]
    if isinstance(v, (dt.date, dt.datetime)) and key == "date":
        return v.isoformat()
    if isinstance(v, (int, float)) and not isinstance(v, bool) and key in ("number", "revision"):
        return str(v)
    if isinstance(v, str) and not v.strip() and not required:
        return ""
    if not isinstance(v, str) or not v.strip():
        problems.append((f"{loc}.{key}", f"{v!r}; expected a non-empty text"))
        return ""
    return v.strip()


def _job_info(raw: Any, problems: list[tuple[str, str]]) -> JobInfo:
    if not isinstance(raw, dict):
        problems.append(("job", "missing [job] table with number, title, client, site, engineer, revision, date"))
        return JobInfo("", "")
    for key in raw:
        if key not in JOB_KEYS:
            problems.append((f"job.{key}", f"unknown key{_suggest(key, JOB_KEYS)} (allowed: {', '.join(JOB_KEYS)})"))
    vals = {k: _str_field(raw, k, "job", problems, k in REQUIRED_JOB_KEYS) for k in JOB_KEYS if k not in _OTHER_JOB_KEYS}
    codes = raw.get("codes", [])
    if isinstance(codes, str):
        codes = [codes]
    if not isinstance(codes, list) or not all(isinstance(c, str) and c.strip() for c in codes):
        problems.append(("job.codes", f"{codes!r}; expected a list of texts such as [\"AISC 360-16\", \"ASCE 7-16\"]"))
        codes = []
    units = raw.get("units", "US")
    if units not in ("US", "SI"):
        problems.append(("job.units", f"{units!r}; expected 'US' or 'SI'"))
        units = "US"
    paper = raw.get("paper", "letter")
    if paper not in PAPERS:
        problems.append(("job.paper", f"{paper!r}; expected 'letter' or 'a4'"))
        paper = "letter"
    mode = raw.get("print", "full")
    if not isinstance(mode, str) or print_mode(mode) is None:
        problems.append(("job.print", f"{mode!r}; expected 'full', 'summary' or 'calc:MARK' (e.g. 'calc:L1')"))
        mode = "full"
    revisions = _revisions(raw.get("revisions", []), vals["revision"], problems)
    basis = raw.get("basis", [])
    if isinstance(basis, str):
        basis = [basis]
    if not isinstance(basis, list) or not all(isinstance(b, str) and b.strip() for b in basis):
        problems.append(("job.basis", f"{basis!r}; expected a text or a list of non-empty texts, e.g. "
                                      "[\"Wind speed from the building official's letter of 2025-02-03\"]"))
        basis = []
    return JobInfo(**vals, codes=list(codes), units=units, paper=paper, print=mode, revisions=revisions, basis=[b.strip() for b in basis])


def print_mode(text: str) -> tuple[str, str] | None:
    """``("full", "")``, ``("summary", "")`` or ``("calc", MARK)`` for a print setting; None if malformed."""
    text = text.strip()
    if text in ("full", "summary"):
        return text, ""
    kind, colon, mark = text.partition(":")
    if kind == "calc" and colon and _MARK.match(mark.strip()):
        return "calc", mark.strip()
    return None


def check_print_mark(job: Job, text: str, where: str) -> None:
    """Raise JobError when ``calc:MARK`` names no member of the job."""
    mode = print_mode(text)
    if mode is None:
        raise JobError(job.source, [(where, f"{text!r}; expected 'full', 'summary' or 'calc:MARK' (e.g. 'calc:L1')")])
    marks = list(dict.fromkeys(c.member for c in job.calcs))
    if mode[0] == "calc" and mode[1] not in marks:
        raise JobError(job.source, [(where, f"{text!r}: no member {mode[1]!r} in the job{_suggest(mode[1], marks)} (marks: {', '.join(marks)})")])


def _revisions(raw: Any, current: str, problems: list[tuple[str, str]]) -> list[dict[str, str]]:
    """Validate ``[[job.revisions]]``: each with rev, date, description and (optional) by."""
    if raw == []:
        return []
    if not isinstance(raw, list) or not all(isinstance(r, dict) for r in raw):
        problems.append(("job.revisions", f"{raw!r}; expected [[job.revisions]] tables with rev, date, description, by"))
        return []
    out = []
    for i, r in enumerate(raw, start=1):
        loc = f"job.revisions[{i}]"
        for key in r:
            if key not in REVISION_KEYS:
                problems.append((f"{loc}.{key}", f"unknown key{_suggest(key, REVISION_KEYS)} (allowed: {', '.join(REVISION_KEYS)})"))
        rev = _str_field(r, "rev", loc, problems, True) if not isinstance(r.get("rev"), (int, float)) else str(r["rev"])
        entry = {"rev": rev, "date": _str_field(r, "date", loc, problems, True),
                 "description": _str_field(r, "description", loc, problems, True), "by": _str_field(r, "by", loc, problems, False)}
        out.append(entry)
    revs = [e["rev"] for e in out]
    dupes = sorted({x for x in revs if x and revs.count(x) > 1})
    if dupes:
        problems.append(("job.revisions", f"revision {dupes[0]!r} is listed more than once"))
    if current and all(revs) and current not in revs:
        problems.append(("job.revisions", f"the current revision {current!r} (job.revision) is not in the log (revs {', '.join(revs)}); add a row for it"))
    return out


def _marks(raw: dict[str, Any], loc: str, problems: list[tuple[str, str]]) -> list[tuple[str, str]]:
    """(location, mark) pairs of a calc table."""
    if sum(k in raw for k in ("member", "members", "table")) != 1:
        problems.append((loc, "give one of member = \"L1\", members = [\"L1\", \"L2\"] or table = \"members.csv\""))
        return []
    if "table" in raw:
        return []
    if "member" in raw:
        items = [(f"{loc}.member", raw["member"])]
    else:
        ms = raw["members"]
        if not isinstance(ms, list) or not ms:
            problems.append((f"{loc}.members", f"{ms!r}; expected a non-empty list of member marks"))
            return []
        items = [(f"{loc}.members[{j}]", m) for j, m in enumerate(ms, start=1)]
    out = []
    for where, m in items:
        if not isinstance(m, str) or not _MARK.match(m):
            problems.append((where, f"{m!r}; expected a member mark such as 'L1' or 'CM-2' (letters, digits, . _ / -; up to 32)"))
        else:
            out.append((where, m))
    return out


def section_parameters(tpl: Template) -> dict[str, bool]:
    """The template's section parameters: name -> True when it takes a comma-separated list.

    A text parameter is a section parameter when its default names a catalog section (or is a
    comma-separated list of them, e.g. the sizes of a chart).
    """
    from calcpad.eng.sections.catalog import check_designation

    cached = tpl.__dict__.get("_section_parameters")
    if cached is not None:
        return cached
    out: dict[str, bool] = {}
    for name, p in tpl.parameters.items():
        if p.kind != "text" or not isinstance(p.default, str) or not p.default.strip() or name in CONTEXT_PARAMETERS:
            continue
        items = [x.strip() for x in p.default.split(",")] if "," in p.default else [p.default]
        try:
            for x in items:
                check_designation(x, _NO_SHOP)
        except InputError:
            continue
        out[name] = len(items) > 1
    tpl.__dict__["_section_parameters"] = out
    return out


class _NoShop:
    """Stands for "no shop table" (check_designation's None means "the table in use")."""

    name = ""
    rows: tuple[Any, ...] = ()

    def get(self, _designation: str) -> None:
        return None


_NO_SHOP = _NoShop()
#: The shop table of a job whose ``shop_sections`` file had problems (already reported).
UNREAD_SHOP: Any = _NoShop()


def section_problem(tpl: Template, name: str, value: Any, shop: ShopTable | None) -> str | None:
    """The message for a section parameter's value that names no section, else None.

    ``shop`` is the job's shop table (None: none; :data:`UNREAD_SHOP` when the job names one
    that could not be read, so its names are not reported again as unknown).

    The value must be a catalog designation (US or AISC metric), a flat bar, or a row of the
    job's shop table. A word without digits that the parameter's own description offers (the
    ``custom`` of "..., or custom for D_o and t") is left to the template.
    """
    from calcpad.eng.sections.catalog import UnknownSectionError, check_designation

    listed = section_parameters(tpl).get(name)
    if listed is None or not isinstance(value, str) or shop is UNREAD_SHOP:
        return None
    items = [x.strip() for x in value.split(",")] if listed else [value.strip()]
    for item in items:
        if not re.search(r"\d", item) and re.search(rf"\b{re.escape(item.lower())}\b", tpl.parameters[name].description.lower()):
            continue
        try:
            check_designation(item, shop if shop is not None else _NO_SHOP)
        except UnknownSectionError as exc:
            return _offer_words(str(exc), tpl.parameters[name].description)
        except InputError as exc:
            return str(exc)
    return None


#: Words a section parameter's description may offer besides designations ("..., or custom for D_o and t").
SECTION_WORDS = ("custom",)


def _offer_words(message: str, description: str) -> str:
    """An unknown-section message that also names the words the parameter itself accepts."""
    words = [w for w in SECTION_WORDS if re.search(rf"\b{w}\b", description.lower())]
    if not words:
        return message
    named = ", ".join(repr(w) for w in words)
    if message.endswith("?"):
        return f"{message[:-1]}, or {named} (this parameter accepts it)?"
    return f"{message}; this parameter also accepts {named}"


def _inputs(tpl: Template, raw: Any, loc: str, problems: list[tuple[str, str]], require_all: bool,
            shop: ShopTable | None = None) -> dict[str, str | float]:
    if raw is None:
        raw = {}
    if not isinstance(raw, dict):
        problems.append((f"{loc}.inputs", f"{raw!r}; expected a table of parameter = \"value unit\""))
        return {}
    values: dict[str, str | float] = {}
    bad = False
    for name, value in raw.items():
        where = f"{loc}.inputs.{name}"
        if name not in tpl.parameters:
            problems.append((where, f"unknown parameter {name!r} of template {tpl.name!r}{tpl.suggest(name)}"))
            bad = True
            continue
        if name in CONTEXT_PARAMETERS:
            problems.append((where, f"{name!r} is filled in by the runner from the calc's member, title or note; remove it from inputs"))
            continue
        try:
            values[name] = tpl.parameters[name].coerce(value, where)
        except InputError as exc:
            problems.append((where, str(exc).removeprefix(f"{where}: ")))
            bad = True
            continue
        unknown = section_problem(tpl, name, values[name], shop)
        if unknown is not None:
            problems.append((where, unknown))
    missing = [n for n in tpl.parameters if n not in raw and n not in CONTEXT_PARAMETERS]
    if missing and require_all:
        problems.append((f"{loc}.inputs", f"missing parameter{'s' if len(missing) > 1 else ''} {', '.join(repr(m) for m in missing)} of template {tpl.name!r}"))
        bad = True
    full = {n: p.default for n, p in tpl.parameters.items()}
    full.update(values)
    if not bad:
        qs: dict[str, pint.Quantity] = {}
        for n, v in full.items():
            if tpl.parameters[n].kind != "text":
                qs[n] = parse_quantity(v, n)
        for n, v in values.items():
            try:
                tpl.parameters[n].check_range(v, qs, f"{loc}.inputs.{n}")
            except InputError as exc:
                problems.append((f"{loc}.inputs.{n}", str(exc).removeprefix(f"{loc}.inputs.{n}: ")))
    return {n: full[n] for n in tpl.parameters if n not in CONTEXT_PARAMETERS}


def _shop_sections(raw: Any, base_dir: Path, preloaded: ShopTable | None, problems: list[tuple[str, str]]) -> tuple[ShopTable | None, str, str]:
    """The ``[job] shop_sections`` table: (table, value as written, absolute path)."""
    where = "job.shop_sections"
    if not isinstance(raw, str) or not raw.strip():
        problems.append((where, f"{raw!r}; expected the path of a CSV file relative to the job file, e.g. \"shop_sections.csv\""))
        return None, "", ""
    value = raw.strip()
    if preloaded is not None:
        return preloaded, value, ""
    path = (base_dir / value).resolve()
    try:
        return load_shop_table(path, value), value, str(path)
    except ShopTableError as exc:
        problems.extend((f"{where} ({value}){': ' + loc if loc else ''}", msg) for loc, msg in exc.problems)
        return None, value, str(path)


def parse_job(
    text: str,
    source: str = "job.toml",
    templates: Sequence[str | Path] = (),
    folder: str | Path | None = None,
    tables: dict[str, Any] | None = None,
    *,
    base_dir: str | Path | None = None,
    shop_table: ShopTable | None = None,
) -> Job:
    """Validate job-file text. Raises JobError listing every problem found.

    ``templates``: extra template library folders (``--templates``), searched first.
    ``folder``: where member tables named in the job are read from (the job file's folder).
    ``tables``: member tables already read (``MemberTable`` or its record form, by name as
    written), used instead of reading files (``calcpad verify`` re-runs from the record).
    ``base_dir``: folder that ``shop_sections`` starts from; default ``folder``, else the folder
    of ``source``. ``shop_table``: an already validated table to use for ``shop_sections``
    instead of reading the file (a re-run from a record).
    """
    from calcpad.runner.members import table_rows
    from calcpad.runner.search import design_settings

    try:
        raw = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        msg = str(exc)
        m = _TOML_POS.search(msg)
        where = f"line {m.group(1)}, column {m.group(2)}" if m else ""
        raise JobError(source, [(where, f"not valid TOML: {_TOML_POS.sub('', msg).strip()}")]) from None
    problems: list[tuple[str, str]] = []
    for key in raw:
        if key not in ("job", "calcs"):
            problems.append((key, f"unknown top-level key{_suggest(key, ('job', 'calcs'))} (allowed: [job] and [[calcs]])"))
    info = _job_info(raw.get("job"), problems)
    shop: tuple[ShopTable | None, str, str] = (None, "", "")
    if isinstance(raw.get("job"), dict) and "shop_sections" in raw["job"]:
        base = Path(base_dir) if base_dir is not None else Path(folder) if folder is not None else Path(source).parent
        shop = _shop_sections(raw["job"]["shop_sections"], base, shop_table, problems)
    named = isinstance(raw.get("job"), dict) and "shop_sections" in raw["job"]
    names_shop = UNREAD_SHOP if named and shop[0] is None else shop[0]
    calcs_raw = raw.get("calcs")
    calcs: list[Calc] = []
    if not isinstance(calcs_raw, list) or not calcs_raw or not all(isinstance(c, dict) for c in calcs_raw):
        problems.append(("calcs", "expected one or more [[calcs]] tables"))
        calcs_raw = []
    seen: dict[tuple[str, str], str] = {}
    read_tables: dict[str, Any] = {}
    for i, c in enumerate(calcs_raw, start=1):
        loc = f"calcs[{i}]"
        for key in c:
            if key not in CALC_KEYS:
                problems.append((f"{loc}.{key}", f"unknown key{_suggest(key, CALC_KEYS)} (allowed: {', '.join(CALC_KEYS)})"))
        marks = _marks(c, loc, problems)
        title = c.get("title", "")
        if not isinstance(title, str):
            problems.append((f"{loc}.title", f"{title!r}; expected a text"))
            title = ""
        note = c.get("note", "")
        if not isinstance(note, str):
            problems.append((f"{loc}.note", f"{note!r}; expected a text"))
            note = ""
        name = c.get("template")
        if not isinstance(name, str) or not name.strip():
            problems.append((f"{loc}.template", f"{name!r}; expected a template name such as 'leg_bending'"))
            continue
        try:
            tpl = load_template(find_template(name, templates))
        except TemplateError as exc:
            problems.append((f"{loc}.template", str(exc)))
            continue
        design = design_settings(c.get("design"), tpl, f"{loc}.design", problems) if "design" in c else None
        if "table" in c:
            shared = _inputs(tpl, c.get("inputs"), loc, problems, require_all=False, shop=names_shop)
            shared = {n: v for n, v in shared.items() if n in (c.get("inputs") or {})}
            table = _member_table(c, loc, folder, tables, problems)
            if table is None:
                continue
            if table.name in read_tables and read_tables[table.name] != table:  # kept by name: record, verify, results
                problems.append((f"{loc}.table", f"{table.name!r} is already read with other rows by an earlier calc (another sheet of "
                                                  "the workbook); a job reads one sheet per table file: save each sheet as its own file"))
                continue
            read_tables[table.name] = table
            for row in table_rows(table, tpl, shared, loc, problems, shop=names_shop):
                key = (tpl.name, row.mark)
                if key in seen:
                    problems.append((f"{loc}.table {table.name} row {row.row}", f"duplicate member mark {row.mark!r}: already checked with template {tpl.name!r} in {seen[key]}"))
                    continue
                seen[key] = f"{loc} ({table.name} row {row.row})"
                typed = {n: v for n, v in (c.get("inputs") or {}).items() if n in row.inputs}
                typed.update(row.typed)
                calcs.append(Calc(len(calcs) + 1, f"{loc}.table row {row.row}", tpl, row.mark, row.inputs, title, typed, note,
                                  table.name, row.row, dict(design) if design else None))
            continue
        if "table_sheet" in c:
            problems.append((f"{loc}.table_sheet", "table_sheet goes with table = \"members.xlsx\""))
        inputs = _inputs(tpl, c.get("inputs"), loc, problems, require_all=True, shop=names_shop)
        for where, mark in marks:
            key = (tpl.name, mark)
            if key in seen:
                problems.append((where, f"duplicate member mark {mark!r}: already checked with template {tpl.name!r} in {seen[key]}"))
                continue
            seen[key] = loc
            typed = {n: v for n, v in (c.get("inputs") or {}).items() if n in inputs}
            calcs.append(Calc(len(calcs) + 1, loc, tpl, mark, dict(inputs), title, typed, note=note,
                              design=dict(design) if design else None))
    mode = print_mode(info.print)
    if calcs and mode is not None and mode[0] == "calc" and mode[1] not in {c.member for c in calcs}:
        marks = list(dict.fromkeys(c.member for c in calcs))
        problems.append(("job.print", f"{info.print!r}: no member {mode[1]!r} in the job{_suggest(mode[1], marks)} (marks: {', '.join(marks)})"))
    if problems:
        raise JobError(source, problems)
    return Job(info, calcs, source, text, tuple(str(Path(d).resolve()) for d in templates), *shop, tables=read_tables)


def _member_table(c: dict[str, Any], loc: str, folder: str | Path | None, given: dict[str, Any] | None, problems: list[tuple[str, str]]) -> Any:
    """The member table a calc names: from ``given`` (a record) or read from ``folder``."""
    from calcpad.runner.members import MemberTable, read_member_table

    name, sheet = c["table"], c.get("table_sheet")
    if not isinstance(name, str) or not name.strip():
        problems.append((f"{loc}.table", f"{name!r}; expected the file name of a CSV or Excel member table, e.g. \"legs.csv\""))
        return None
    if sheet is not None and (not isinstance(sheet, str) or not sheet.strip()):
        problems.append((f"{loc}.table_sheet", f"{sheet!r}; expected the name of a sheet of the workbook"))
        return None
    try:
        if given is not None and name in given:
            t = given[name]
            return t if isinstance(t, MemberTable) else MemberTable.from_record(t)
        path = Path(name)
        if not path.is_absolute():
            path = Path(folder or ".") / path
        return read_member_table(path, name, sheet)
    except InputError as exc:
        problems.append((f"{loc}.table", str(exc)))
        return None


def load_job(path: str | Path, templates: Sequence[str | Path] = ()) -> Job:
    """Read and validate a job file. Raises JobError (bad content) or InputError (unreadable)."""
    path = Path(path)
    try:
        text = path.read_text(encoding="utf-8")
    except (OSError, UnicodeDecodeError) as exc:
        raise JobError(str(path), [("", f"cannot read the job file ({exc.__class__.__name__}: {exc})")]) from None
    return parse_job(text, str(path), templates, folder=path.parent)


def single_template_job(template: str | Path, sets: list[str], member: str = "-", templates: Sequence[str | Path] = ()) -> Job:
    """A one-calc job for ``calcpad run TEMPLATE --set name="value unit"`` (defaults fill the rest).

    ``template`` is a library name or the path of a file inside a library folder.
    """
    source = str(template)
    is_path = Path(template).exists() or "/" in source or "\\" in source
    try:
        tpl = load_template(library_template(template, templates) if is_path else find_template(source, templates))
    except TemplateError as exc:
        raise JobError(source, [("template", str(exc))]) from None
    problems: list[tuple[str, str]] = []
    raw: dict[str, str] = {}
    for item in sets:
        name, eq, value = item.partition("=")
        if not eq or not name.strip():
            problems.append(("--set", f"{item!r}; expected name=\"value unit\", e.g. L=\"84 in\""))
            continue
        raw[name.strip()] = value.strip()
    inputs = _inputs(tpl, raw, "--set", problems, require_all=False)
    if problems:
        raise JobError(source, [(loc.replace("--set.inputs.", "--set ").replace("--set.inputs", "--set"), msg) for loc, msg in problems])
    info = JobInfo(number="-", title=tpl.title, units="US")
    return Job(info, [Calc(1, "--set", tpl, member, inputs, typed={n: v for n, v in raw.items() if n in inputs})], source, None, tuple(str(Path(d).resolve()) for d in templates))
