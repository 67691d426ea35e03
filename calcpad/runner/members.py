"""Member tables: one row per member in a CSV or Excel sheet, feeding one calc of a job.

::

    [[calcs]]
    template = "leg_bending"
    table = "legs.csv"             # beside the job file; .csv, .xlsx (sheet: table_sheet = "Legs")
    title = "Stand legs"
    [calcs.inputs]                 # values shared by every row (a cell, when given, wins)
    F_y = "35 ksi"

The header names the columns: ``mark`` (the member mark) and template parameters, each with an
optional unit in brackets (``L [in]``); a cell with a plain number takes the header's unit, a
cell may also carry its own (``30 in``). Every cell goes through the template parameter's own
checks (``Parameter.coerce``: the value parser of ``core/value_text.py``, kind, dimension;
``check_range``). A parameter whose default is a catalog section must name a catalog section or a
row of the job's shop table (``[job] shop_sections``).
Every problem is collected with its row number (as a spreadsheet shows it: the header is row 1)
and column into one :class:`~calcpad.runner.job.JobError`.

The table is read once; the job keeps its header and cells as text (:class:`MemberTable`) so
the record can hold them and ``calcpad verify`` re-runs from the record alone.
"""

from __future__ import annotations

import csv
import datetime as dt
import hashlib
import io
import math
import re
from dataclasses import dataclass
from pathlib import Path
from typing import TYPE_CHECKING, Any

from calcpad.core.errors import InputError
from calcpad.core.units import parse_quantity

if TYPE_CHECKING:
    import pandas as pd

    from calcpad.runner.execute import CalcOutcome
    from calcpad.runner.template import Template

__all__ = [
    "MARK_COLUMNS",
    "MemberRow",
    "MemberTable",
    "read_member_table",
    "results_excel",
    "results_files",
    "results_frame",
    "results_stems",
    "run_table",
    "table_rows",
]

#: Header names that hold the member mark (case-insensitive). Not "member": cross_member has a
#: parameter of that name (the beam section).
MARK_COLUMNS = ("mark",)
TABLE_SUFFIXES = (".csv", ".xlsx", ".xlsm")
MAX_ROWS = 100_000
_HEADER = re.compile(r"^\s*([A-Za-z_][A-Za-z0-9_]*)\s*(?:\[\s*([^\]]*?)\s*\])?\s*$")
_MARK = re.compile(r"^[A-Za-z0-9][A-Za-z0-9 ._/-]{0,31}$")


@dataclass(frozen=True)
class MemberTable:
    """A member table as read: where it came from, its header and its cells as text."""

    name: str  # the path as written in the job file
    header: tuple[str, ...]
    rows: tuple[tuple[str, ...], ...]
    sha256: str  # of the file's bytes (or of the recorded cells when rebuilt from a record)

    def as_record(self) -> dict[str, Any]:
        """Plain dictionary for the job record."""
        return {"name": self.name, "sha256": self.sha256, "header": list(self.header), "rows": [list(r) for r in self.rows]}

    @classmethod
    def from_record(cls, data: dict[str, Any]) -> MemberTable:
        """The table as a record holds it (raises InputError when damaged)."""
        try:
            return cls(str(data["name"]), tuple(str(h) for h in data["header"]), tuple(tuple(str(c) for c in r) for r in data["rows"]),
                       str(data["sha256"]))
        except (KeyError, TypeError) as exc:
            raise InputError(f"member table in the record: damaged ({exc})") from None


@dataclass
class MemberRow:
    """One row of a member table, checked against a template."""

    row: int  # spreadsheet row number (header = 1)
    mark: str
    inputs: dict[str, str | float]  # values as they go into the template (table cells over [calcs.inputs])
    typed: dict[str, Any]  # as written: the cell text (with the header's unit), or the job value


def _cell_text(value: Any) -> str:
    """An Excel cell as text: integral floats without ``.0``, others by their shortest repr."""
    if value is None:
        return ""
    if isinstance(value, bool):
        return str(value)
    if isinstance(value, float):
        if math.isnan(value):
            return ""
        return str(int(value)) if value.is_integer() and abs(value) < 1e15 else repr(value)
    return str(value).strip()


def read_member_table(path: Path, name: str, sheet: str | None = None) -> MemberTable:
    """Read a CSV or Excel member table. Raises InputError (unreadable, wrong kind, too large)."""
    suffix = path.suffix.lower()
    if suffix not in TABLE_SUFFIXES:
        raise InputError(f"member table {name!r}: a {suffix or 'file without suffix'}; expected a .csv or .xlsx file")
    try:
        data = path.read_bytes()
    except OSError as exc:
        raise InputError(f"member table {name!r}: cannot read it ({exc.strerror or exc})") from None
    if suffix == ".csv":
        if sheet is not None:
            raise InputError(f"member table {name!r}: table_sheet = {sheet!r} is for Excel files; a CSV file has one sheet")
        try:
            text = data.decode("utf-8-sig")
        except UnicodeDecodeError:
            raise InputError(f"member table {name!r}: not UTF-8 text; save the sheet as CSV UTF-8") from None
        raw = [[c.strip() for c in r] for r in csv.reader(io.StringIO(text))]
    else:
        import pandas as pd

        try:
            frame = pd.read_excel(io.BytesIO(data), sheet_name=sheet or 0, header=None, dtype=object)
        except ValueError as exc:
            raise InputError(f"member table {name!r}: {exc}") from None
        except Exception as exc:  # openpyxl raises many kinds on a damaged file
            raise InputError(f"member table {name!r}: not a readable Excel workbook ({type(exc).__name__}: {exc})") from None
        raw = [[_cell_text(c) for c in r] for r in frame.itertuples(index=False, name=None)]
    while raw and not any(raw[-1]):
        raw.pop()  # trailing empty rows
    if not raw:
        raise InputError(f"member table {name!r}: empty; expected a header row (mark, parameters) and one row per member")
    if len(raw) - 1 > MAX_ROWS:
        raise InputError(f"member table {name!r}: {len(raw) - 1} rows; at most {MAX_ROWS} members per table (split it)")
    width = max(len(r) for r in raw)
    header = raw[0] + [""] * (width - len(raw[0]))
    while header and not header[-1]:
        header.pop()
    rows = tuple(tuple((r + [""] * (len(header) - len(r)))[: len(header)]) for r in raw[1:])
    return MemberTable(name, tuple(header), rows, hashlib.sha256(data).hexdigest())


def table_rows(
    table: MemberTable, tpl: Template, shared: dict[str, str | float], loc: str, problems: list[tuple[str, str]],
    shop: Any = None,
) -> list[MemberRow]:
    """Check a table against ``tpl``; one :class:`MemberRow` per row. Problems are appended, each
    with ``loc``, the table name, the row number and the column. Section cells must name a
    catalog section or a row of ``shop`` (the job's shop table)."""
    from calcpad.runner.job import CONTEXT_PARAMETERS, _suggest, section_problem

    where = f"{loc}.table {table.name}"
    params = {n: p for n, p in tpl.parameters.items() if n not in CONTEXT_PARAMETERS}
    columns: dict[int, tuple[str, str]] = {}  # column index -> (parameter, header unit)
    mark_col = None
    bad_header = False
    for j, head in enumerate(table.header):
        letter = _column_letter(j)
        m = _HEADER.match(head)
        if not head:
            problems.append((f"{where} row 1, column {letter}", "empty header; name the column (mark or a template parameter, e.g. 'L [in]')"))
            bad_header = True
            continue
        if m is None:
            problems.append((f"{where} row 1, column {letter}", f"header {head!r}; expected a parameter name with an optional unit, e.g. 'L [in]'"))
            bad_header = True
            continue
        pname, unit = m.group(1), m.group(2) or ""
        if pname.lower() in MARK_COLUMNS:
            if mark_col is not None:
                problems.append((f"{where} row 1, column {letter}", f"a second mark column {head!r}"))
                bad_header = True
            mark_col = j
            continue
        if pname not in params:
            why = "is filled in by the runner" if pname in CONTEXT_PARAMETERS else f"is not a parameter of template {tpl.name!r}"
            problems.append((f"{where} row 1, column {letter}", f"{pname!r} {why}{_suggest(pname, list(params))}"))
            bad_header = True
            continue
        if any(p == pname for p, _u in columns.values()):
            problems.append((f"{where} row 1, column {letter}", f"parameter {pname!r} has two columns"))
            bad_header = True
            continue
        if unit:
            p = params[pname]
            if p.kind != "quantity":
                problems.append((f"{where} row 1, column {letter}", f"{head!r}: {pname!r} is a {p.kind}, it takes no unit"))
                bad_header = True
                continue
            try:
                parse_quantity(f"1 {unit}", f"{where} row 1, column {letter} unit")
            except InputError as exc:
                problems.append((f"{where} row 1, column {letter}", str(exc)))
                bad_header = True
                continue
        columns[j] = (pname, unit)
    if mark_col is None:
        problems.append((f"{where} row 1", "no 'mark' column; the member marks go in a column headed mark"))
        bad_header = True
    given = {p for p, _u in columns.values()}
    missing = [n for n in params if n not in given and n not in shared]
    if missing:
        problems.append((where, f"missing column{'s' if len(missing) > 1 else ''} {', '.join(repr(m) for m in missing)}: "
                                f"each parameter of template {tpl.name!r} needs a column or a value in [calcs.inputs]"))
        bad_header = True
    if not table.rows:
        problems.append((where, "no member rows below the header"))
    if mark_col is None:
        return []
    out: list[MemberRow] = []
    marks: dict[str, int] = {}
    coerced: dict[tuple[str, str], str | float | bool] = {}  # (parameter, cell text) -> value
    quantities: dict[Any, Any] = {}  # value -> quantity
    in_range: dict[tuple[Any, ...], str | None] = {}  # (parameter, value, values its bounds name) -> problem
    refs = {n: sorted({b.ref for b in (p.lower, p.upper) if b is not None and b.ref}) for n, p in params.items()}
    for i, cells in enumerate(table.rows, start=2):
        if not any(cells):
            continue  # a blank line between groups of members
        row_ok = True
        mark = cells[mark_col]
        at = f"{where} row {i}"
        if not _MARK.match(mark):
            problems.append((f"{at}, column {_column_letter(mark_col)} (mark)",
                             f"{mark!r}; expected a member mark such as 'L1' or 'CM-2' (letters, digits, . _ / -; up to 32)"))
            row_ok = False
        elif mark in marks:
            problems.append((f"{at}, column {_column_letter(mark_col)} (mark)", f"duplicate member mark {mark!r} (also in row {marks[mark]})"))
            row_ok = False
        else:
            marks[mark] = i
        values: dict[str, str | float] = {}
        typed: dict[str, Any] = {}
        for j, (pname, unit) in columns.items():
            text = cells[j]
            cell_at = f"{at}, column {_column_letter(j)} ({pname})"
            if not text:
                if pname in shared:
                    continue
                problems.append((cell_at, "empty cell; give a value (or a value for all rows in [calcs.inputs])"))
                row_ok = False
                continue
            if unit and _plain_number(text):
                text = f"{text} {unit}"
            p = params[pname]
            try:
                if (pname, text) not in coerced:  # rows repeat values: each text is read once
                    coerced[pname, text] = p.coerce(text, cell_at)
                values[pname] = coerced[pname, text]
            except InputError as exc:
                problems.append((cell_at, str(exc).removeprefix(f"{cell_at}: ")))
                row_ok = False
                continue
            unknown = section_problem(tpl, pname, values[pname], shop)
            if unknown is not None:
                problems.append((cell_at, unknown))
                row_ok = False
                continue
            typed[pname] = text
        if not row_ok:
            continue
        if bad_header:
            continue  # cells checked one by one; the whole-row range check needs every column
        full = {n: params[n].default for n in params}
        full.update({n: v for n, v in shared.items() if n in params})
        full.update(values)
        # the range check of a value depends on it and the parameters its bounds name: each
        # combination is checked once (a large table repeats lengths, loads and sizes)
        todo = []
        for n, v in values.items():
            cell_at = f"{at}, column {_column_letter(next(j for j, (p, _u) in columns.items() if p == n))} ({n})"
            key = (n, v, tuple(full.get(r) for r in refs[n]))
            if key not in in_range:
                todo.append((n, v, cell_at, key))
            elif in_range[key] is not None:
                problems.append((cell_at, in_range[key]))
                row_ok = False
        if todo:
            try:
                qs = {n: _quantity(quantities, v, n) for n, v in full.items() if params[n].kind != "text"}
            except InputError as exc:
                problems.append((at, str(exc)))
                continue
            for n, v, cell_at, key in todo:
                try:
                    params[n].check_range(v, qs, cell_at)
                    in_range[key] = None
                except InputError as exc:
                    in_range[key] = str(exc).removeprefix(f"{cell_at}: ")
                    problems.append((cell_at, in_range[key]))
                    row_ok = False
        if row_ok and not bad_header:
            out.append(MemberRow(i, mark, {n: full[n] for n in params}, typed))
    return out  # every cell is checked even when the header has problems (all of them reported at once)


def _quantity(cache: dict[Any, Any], value: Any, name: str) -> Any:
    """``parse_quantity(value)``, read once per value (the quantities are only read, never changed)."""
    key = (type(value), value)
    if key not in cache:
        cache[key] = parse_quantity(value, name)
    return cache[key]


def _plain_number(text: str) -> bool:
    try:
        float(text)
    except ValueError:
        return False
    return True


def _column_letter(j: int) -> str:
    """Spreadsheet column letter of a 0-based index (A, B, ..., Z, AA, ...)."""
    out = ""
    j += 1
    while j:
        j, r = divmod(j - 1, 26)
        out = chr(ord("A") + r) + out
    return out


def _candidate_text(c: dict[str, Any] | None) -> str:
    if not c:
        return ""
    return c["designation"] if not c.get("grade") else f"{c['designation']} {c['grade']}"


def results_frame(outcomes: list[CalcOutcome]) -> pd.DataFrame:
    """One row per member: every check ratio (a column per check), the governing check, its
    ratio, the sheet it is on and the member's status; for a design search the chosen size, its
    weight and the runner-up. Calcs that failed show the error."""
    import pandas as pd

    rows: list[dict[str, Any]] = []
    check_cols: list[str] = []
    extra: list[str] = []
    for o in outcomes:
        checks = [(s.title, ch) for s in o.sheets for ch in s.checks]
        names = [ch["title"] for _t, ch in checks]
        row: dict[str, Any] = {"mark": o.calc.member, "template": o.calc.template.name}
        for (sheet, ch), name in zip(checks, names, strict=True):
            col = name if names.count(name) == 1 else f"{name} ({sheet})"
            if col not in check_cols:
                check_cols.append(col)
            row[col] = ch["ratio"]
        gov = max(checks, key=lambda sc: -1.0 if sc[1]["ratio"] is None else sc[1]["ratio"], default=None)
        row["governing check"] = gov[1]["title"] if gov else ""
        row["governing ratio"] = gov[1]["ratio"] if gov else None
        row["governing sheet"] = gov[0] if gov else ""
        row["status"] = o.status
        row["error"] = o.error["message"] if o.error else ""
        design = (o.calc.design or {}).get("result")
        if design is not None:
            chosen, runner = design.get("chosen"), design.get("runner_up")
            row["design: chosen size"] = _candidate_text(chosen)
            row["design: weight [lb/ft]"] = chosen["weight_plf"] if chosen else None
            row["design: runner-up"] = _candidate_text(runner)
            row["design: runner-up ratio"] = design.get("runner_up_ratio")
            if "design: chosen size" not in extra:
                extra.extend(["design: chosen size", "design: weight [lb/ft]", "design: runner-up", "design: runner-up ratio"])
        rows.append(row)
    cols = ["mark", "template", *extra, *check_cols, "governing check", "governing ratio", "governing sheet", "status", "error"]
    return pd.DataFrame(rows, columns=cols)


#: The date written into a results workbook's properties when the job has none (a fixed value, so
#: two runs of the same job give the same bytes).
_NO_DATE = dt.datetime(2000, 1, 1)
#: Zip entry time of the results workbook's parts (the earliest a zip file can hold).
_ZIP_TIME = (1980, 1, 1, 0, 0, 0)
_UNSAFE = re.compile(r"[^A-Za-z0-9._-]+")


def results_stems(names: list[str] | tuple[str, ...] | Any) -> dict[str, str]:
    """The results file stem (``results-<stem>``; ``.csv`` and ``.xlsx`` are added) of each
    member table named in a job, by its name as written.

    A table's file name without its suffix when no other table of the job has that name (the
    usual case: ``legs.csv`` → ``results-legs``); otherwise its path as written without the
    suffix, each run of characters other than letters, digits, ``.``, ``_`` and ``-`` (the
    folder separators) made one ``_`` (``north/legs.csv`` and ``south/legs.csv`` →
    ``results-north_legs`` and ``results-south_legs``). The names depend on the job's tables
    only, never on the order calcs ran. Raises InputError naming both tables when two would
    still write the same files (``legs.csv`` and ``legs.xlsx`` in one folder).
    """
    names = list(names)
    stems = {n: Path(n).stem for n in names}
    out: dict[str, str] = {}
    for n in names:
        clash = [m for m in names if m != n and stems[m].lower() == stems[n].lower()]
        stem = stems[n] if not clash else str(Path(n.replace("\\", "/")).with_suffix("")).strip("/")
        out[n] = "results-" + _UNSAFE.sub("_", stem).strip("_.")
    seen: dict[str, str] = {}
    for n, stem in out.items():
        other = seen.get(stem.lower())
        if other is not None:
            raise InputError(f"member tables {other!r} and {n!r} would both write {stem}.csv and .xlsx; "
                             "rename one of the files (the results are named after the table file)")
        seen[stem.lower()] = n
    return out


def _job_datetime(date: Any) -> dt.datetime:
    if isinstance(date, dt.datetime):
        return date.replace(tzinfo=None, microsecond=0)
    if isinstance(date, dt.date):
        return dt.datetime(date.year, date.month, date.day)
    try:
        return dt.datetime.fromisoformat(str(date)[:10])
    except ValueError:
        return _NO_DATE


def results_excel(frame: pd.DataFrame, date: Any = None) -> bytes:
    """``frame`` as an Excel workbook (sheet ``results``), the same bytes for the same frame and
    ``date``: the workbook's created/modified properties are ``date`` (the job's date; a fixed
    date without one) and every zip entry carries the same fixed time. Rows are streamed
    (openpyxl's write-only mode), so a large table is never held as cell objects."""
    import zipfile

    from openpyxl import Workbook
    from openpyxl.xml.functions import tostring

    wb = Workbook(write_only=True)
    when = _job_datetime(date)
    wb.properties.created = when
    wb.properties.modified = when
    wb.properties.creator = "calcpad"
    ws = wb.create_sheet("results")
    ws.append([str(c) for c in frame.columns])
    for row in frame.itertuples(index=False, name=None):
        ws.append([None if v is None or (isinstance(v, float) and math.isnan(v)) else v for v in row])
    raw = io.BytesIO()
    wb.save(raw)  # stamps "modified" with the clock: the properties part is written again below
    wb.properties.modified = when
    core = tostring(wb.properties.to_tree())
    out = io.BytesIO()
    with zipfile.ZipFile(io.BytesIO(raw.getvalue())) as src, zipfile.ZipFile(out, "w", zipfile.ZIP_DEFLATED) as dst:
        for info in src.infolist():
            entry = zipfile.ZipInfo(info.filename, date_time=_ZIP_TIME)
            entry.compress_type = zipfile.ZIP_DEFLATED
            entry.external_attr = info.external_attr
            dst.writestr(entry, core if info.filename == "docProps/core.xml" else src.read(info.filename))
    return out.getvalue()


def results_files(tables: list[str] | tuple[str, ...] | Any, outcomes: list[CalcOutcome], date: Any = None) -> dict[str, bytes]:
    """Each member table's results (:func:`results_frame`) as CSV and Excel (:func:`results_excel`),
    by file name (:func:`results_stems`)."""
    files: dict[str, bytes] = {}
    for name, stem in results_stems(tables).items():
        frame = results_frame([o for o in outcomes if o.calc.table == name])
        files[f"{stem}.csv"] = frame.to_csv(index=False).encode("utf-8")
        files[f"{stem}.xlsx"] = results_excel(frame, date)
    return files


def run_table(
    template: str | Template, table: str | Path, inputs: dict[str, Any] | None = None, sheet: str | None = None, client: Any = None,
) -> pd.DataFrame:
    """Run ``template`` for every row of a member table and return :func:`results_frame`.

    ``template``: a library name or a loaded template; ``inputs``: values every row shares (a cell
    wins); parameters in neither take the template's defaults (a job file must give them all). Raises :class:`~calcpad.runner.job.JobError` listing every problem of the table with its
    row. With a Dask ``client`` the calcs run on the cluster.
    """
    from calcpad.runner.execute import run_job
    from calcpad.runner.job import CONTEXT_PARAMETERS, Calc, Job, JobError, JobInfo
    from calcpad.runner.progress import notebook_progress
    from calcpad.runner.template import Template as _Template
    from calcpad.runner.template import find_template, load_template

    tpl = template if isinstance(template, _Template) else load_template(find_template(str(template)))
    path = Path(table)
    data = read_member_table(path, path.name, sheet)
    problems: list[tuple[str, str]] = []
    shared: dict[str, str | float] = {n: p.default for n, p in tpl.parameters.items() if n not in CONTEXT_PARAMETERS}
    for n, v in (inputs or {}).items():
        if n not in tpl.parameters:
            problems.append((f"inputs.{n}", f"not a parameter of template {tpl.name!r}{tpl.suggest(n)}"))
            continue
        try:
            shared[n] = tpl.parameters[n].coerce(v, f"inputs.{n}")
        except InputError as exc:
            problems.append((f"inputs.{n}", str(exc)))
    from calcpad.eng.sections.shop import active_shop_table

    rows = table_rows(data, tpl, shared, "calc", problems, shop=active_shop_table())
    if problems:
        raise JobError(str(path), problems)
    calcs = [Calc(i, f"table row {r.row}", tpl, r.mark, r.inputs, "", r.typed, table=data.name, row=r.row) for i, r in enumerate(rows, start=1)]
    job = Job(JobInfo("-", tpl.title), calcs, str(path), None, (), tables={data.name: data})
    with notebook_progress(len(calcs), f"member table {data.name}") as bar:  # in a notebook, after 2 s

        def done(o: Any) -> None:
            if client is None:
                o.slim()
            if bar is not None:
                bar.advance(f"{data.name}: {o.calc.member}")

        if client is None:  # no HTML, and each outcome slimmed as it finishes: memory flat in the number of rows
            outcomes = run_job(job, progress=done, html=False)
        else:
            from calcpad.runner.scale import run_calcs_on_cluster

            outcomes = run_calcs_on_cluster(job, client, progress=done)
    return results_frame(outcomes)
